"""Building a closed-loop supply (specgen/intake/build_closed_loop.py): the charge pump and reliefs
become SI values, the low side takes the charge pressure, and open-circuit keys are refused at
their line with exit status 2."""

import pytest

from helpers import closed_loop, minimal, run_cli, write_spec


def model(data):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).machine


def test_charge_and_reliefs_in_si():
    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["high_pressure_reliefs"] = {"side_a": "450 bar"}
    s = model(data).supply("loop")
    c = s.closed_loop
    assert c.charge.pressure == pytest.approx(25e5)
    assert c.charge.displacement == pytest.approx(20e-6)
    assert c.flushing_flow == pytest.approx(10 / 60000)
    assert s.return_pressure == pytest.approx(25e5)  # the low side replaces the return pressure
    assert s.high_pressure_reliefs == (("A", pytest.approx(450e5)), ("B", pytest.approx(420e5)))


def test_charge_efficiencies_left_out_are_assumed():
    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["charge"] = {"displacement": "20 cm^3", "pressure": "25 bar"}
    c = model(data).supply("loop").closed_loop.charge
    # typical gear charge pump, from memory
    assert (c.volumetric_efficiency.value, c.overall_efficiency.value) == (0.9, 0.8)
    assert c.volumetric_efficiency.assumed and c.overall_efficiency.assumed


def _error(tmp_path, data, key: str):
    path = write_spec(tmp_path, data)
    code, out, err = run_cli("check", path)
    assert code == 2 and "Traceback" not in err, err
    line = next(n for n, t in enumerate(path.read_text().splitlines(), 1) if t.strip().startswith(key + ":"))
    return line, err


@pytest.mark.parametrize("key, value, words", [
    ("return_pressure", "5 bar", "remove return_pressure"),
    ("surplus_to", "relief", "remove surplus_to"),
])
def test_open_circuit_keys_are_refused(tmp_path, key, value, words):
    data = closed_loop()
    data["supplies"]["loop"][key] = value
    line, err = _error(tmp_path, data, key)
    assert f":{line}:" in err and words in err


def test_a_delivery_pump_is_refused(tmp_path):
    data = closed_loop()
    pump = data["supplies"]["loop"]["pump"]
    del pump["displacement"], pump["shaft_speed"]
    pump["delivery"] = "190 L/min"
    line, err = _error(tmp_path, data, "delivery")
    assert f":{line}:" in err and "give pump.displacement" in err


def test_closed_loop_circuit_needs_its_block(tmp_path):
    data = closed_loop()
    del data["supplies"]["loop"]["closed_loop"]
    line, err = _error(tmp_path, data, "circuit")
    assert f":{line}:" in err and "needs a closed_loop block" in err


def test_closed_loop_block_needs_the_circuit(tmp_path):
    data = minimal()
    data["supplies"]["main"]["closed_loop"] = {"charge": {"displacement": "10 cm^3", "pressure": "20 bar"}}
    line, err = _error(tmp_path, data, "closed_loop")
    assert f":{line}:" in err and "only with circuit: closed_loop" in err


def test_a_relief_side_at_the_charge_pressure_is_refused(tmp_path):
    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["high_pressure_reliefs"] = {"side_b": "25 bar"}
    line, err = _error(tmp_path, data, "high_pressure_reliefs")
    assert "side B must be above the charge pressure" in err and f":{line + 1}:" in err


def test_charge_needs_a_displacement_or_a_flow(tmp_path):
    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["charge"] = {"pressure": "25 bar"}
    path = write_spec(tmp_path, data)
    code, out, err = run_cli("check", path)
    assert code == 2 and "Traceback" not in err and "charge" in err


def test_a_copy_with_another_charge_pressure_keeps_the_low_side_with_it():
    from dataclasses import replace

    s = model(closed_loop()).supply("loop")
    moved = replace(s, closed_loop=replace(s.closed_loop, charge=replace(s.closed_loop.charge, pressure=30e5)))
    assert moved.return_pressure == 30e5


def test_a_corner_on_the_charge_pressure_moves_every_motor_outlet():
    from helpers import spec_check

    data = closed_loop()
    # hand calculation: inlet 275 bar + 150 bar charge = 425 bar against the 420 bar relief: fails at the corner
    data["corners"] = {"high_charge": {"set": {"supplies.loop.closed_loop.charge.pressure": "150 bar"}}}
    c = spec_check(data, "pressure_margin", drive="wheel", duty="drive")
    assert c.status == "fail" and c.corner == "high_charge"
    assert c.margin == pytest.approx((420 - 425) / 420, abs=1e-4)


def test_a_corner_scales_a_relief_side_given_in_the_spec():
    from helpers import spec_check

    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["high_pressure_reliefs"] = {"side_b": "400 bar"}
    # side B 400 bar -> 320 bar at the corner: inlet 300 bar leaves (320 - 300)/320 = 6.25 %, inside the 10 % band
    data["corners"] = {"low_b": {"scale": {"supplies.loop.closed_loop.high_pressure_reliefs.side_b": "-20 %"}}}
    c = spec_check(data, "pressure_margin", drive="wheel", duty="drive")
    assert c.status == "warn" and c.corner == "low_b"
    assert c.margin == pytest.approx(20 / 320, abs=1e-4)


def test_pump_overall_efficiency_above_its_volumetric_is_refused(tmp_path):
    # eta_hm,p = eta_t / eta_v must stay at or under 1 (primer section 15 relations): 0.96 over 0.95 cannot be.
    data = closed_loop()
    data["supplies"]["loop"]["pump"]["overall_efficiency"] = 0.96
    code, out, err = run_cli("check", str(write_spec(tmp_path, data)))
    assert code == 2 and "supplies.loop.pump.overall_efficiency" in err and "cannot exceed" in err
