"""Building the pressure-budget keys: a supply with no drives is named (or listed when it says what
it feeds), and the new keys become SI values in the model."""

import pytest

from helpers import minimal, run_cli, write_spec


def model(data):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).machine


def with_spare_supply(feeds: str | None = None) -> dict:
    d = minimal()
    d["supplies"]["charge"] = {"pump": {"displacement": "10 cm^3", "shaft_speed": "1500 rpm"},
                               "relief_setting": "25 bar"}
    if feeds:
        d["supplies"]["charge"]["feeds"] = feeds
    return d


def test_supply_with_no_drives_is_an_error_at_the_supply(tmp_path):
    path = write_spec(tmp_path, with_spare_supply())
    code, out, err = run_cli("check", path)
    assert code == 2 and "Traceback" not in err
    line = next(n for n, t in enumerate(path.read_text().splitlines(), 1) if t.strip().startswith("charge:"))
    assert f":{line}:" in err and "supply 'charge' feeds no drive" in err


def test_supply_that_feeds_something_else_is_listed_and_skipped(tmp_path):
    path = write_spec(tmp_path, with_spare_supply("charge circuit of the travel transmission"))
    code, out, err = run_cli("check", path)
    assert code in (0, 1), err
    m = model(with_spare_supply("charge circuit of the travel transmission"))
    assert m.supply("charge").feeds == "charge circuit of the travel transmission"


def test_new_keys_in_si():
    d = minimal()
    h = d["drives"]["hoist"]
    h["port_relief"] = "230 bar"
    h["directional_valve"] = {"rated_flow": "60 L/min", "drop_to_motor": "8 bar"}
    h["counterbalance"] = {"setting": "210 bar", "pilot_ratio": 4}
    h["gear_stage"] = {"ratio": 5, "efficiency": 0.95, "starting_efficiency": 0.85}
    h["motor"]["rating"].update({"intermittent_pressure": "300 bar", "intermittent_share": "10 %"})
    h["duty_points"]["lift"]["duration"] = "intermittent"
    d["supplies"]["main"]["suction"] = {"head": "-0.3 m", "strainer_drop": "0.05 bar"}
    d["supplies"]["main"]["pump"]["min_inlet_pressure"] = "0.85 bar"
    m = model(d)
    dr, s = m.drive("hoist"), m.supply("main")
    assert dr.port_relief == pytest.approx(230e5)
    assert dr.directional_valve.rated_flow == pytest.approx(1e-3) and dr.directional_valve.drop_to_tank == 0.0
    assert dr.counterbalance.pilot_ratio == 4.0 and dr.pump_fed_overrun
    assert dr.gear.starting_efficiency.value == 0.85
    assert dr.motor.rating.intermittent_pressure == pytest.approx(300e5)
    assert dr.motor.rating.intermittent_share == pytest.approx(0.10)
    assert dr.duty("lift").duration == "intermittent"
    assert s.suction_head == pytest.approx(-0.3) and s.strainer_drop == pytest.approx(5e3)
    assert s.pump.min_inlet_pressure.value == pytest.approx(0.85e5) and not s.pump.min_inlet_pressure.assumed


def test_bad_pilot_ratio_is_refused(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["counterbalance"] = {"setting": "210 bar", "pilot_ratio": 0}
    code, out, err = run_cli("check", write_spec(tmp_path, d))
    assert code == 2 and "pilot_ratio" in err


def test_supply_that_feeds_something_else_is_named_in_the_text(tmp_path):
    code, out, err = run_cli("check", write_spec(tmp_path, with_spare_supply("charge circuit")))
    assert "Supply charge feeds no drive in this spec (charge circuit): not computed" in out
