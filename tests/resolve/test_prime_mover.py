"""A prime mover shared by two pumps, checked by hand (tests/engine_spec.py states the machine).

Relations (power balance on a shaft, pump relations of a fluid-power textbook): each pump turns at the
engine's speed times its drive ratio; the pumps' input powers add at the engine; each pump's input
torque reaches the engine shaft times its drive ratio.
"""

import math

import pytest

from engine_spec import shared_engine
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.resolve.prime_mover import prime_mover_power_at, resolve_prime_movers
from specgen.results import SupplyModeResult
from specgen.trace import given

RPM = 1 / 60


def outcome(data=None):
    return evaluate(Source("mem.yaml", data or shared_engine(), b""))


def test_pump_speeds_follow_the_engine_in_each_mode():
    r = outcome().results
    # hand calculation: rated 2200 rpm: A 2200 * 1.0 = 2200 rpm, B 2200 * 1.2 = 2640 rpm;
    # idle 1000 rpm: A 1000 rpm, B 1200 rpm
    assert r.supply_mode("front", "dig")["pump_shaft_speed"] * 60 == pytest.approx(2200)
    assert r.supply_mode("rear", "dig")["pump_shaft_speed"] * 60 == pytest.approx(2640)
    assert r.supply_mode("front", "travel_idle")["pump_shaft_speed"] * 60 == pytest.approx(1000)
    assert r.supply_mode("rear", "travel_idle")["pump_shaft_speed"] * 60 == pytest.approx(1200)
    # full delivery per mode: B at idle 28 cm^3 * 1200 rpm * 1.0 = 33.6 L/min
    assert r.supply_mode("rear", "travel_idle")["pump_delivery"] * 60e3 == pytest.approx(33.6)
    trace = r.supply_mode("rear", "travel_idle").values["pump_shaft_speed"]
    assert trace.formula == "n_p = n_pm * i_pd" and [i.value for i in trace.inputs] == pytest.approx([1000 / 60, 1.2])


def test_powers_add_at_rated_speed():
    x = outcome().results.prime_mover_mode("diesel", "dig")
    # hand calculation (tests/engine_spec.py): A 1650e-6 m^3/s * 19.0e6 Pa / 0.825 = 38 000 W;
    # B 1232e-6 * 18.75e6 / 0.77 = 30 000 W; sum 68 000 W against 75 000 W at rated speed
    assert x.per_supply["front"]["pump_input_power"].value == pytest.approx(38e3)
    assert x.per_supply["rear"]["pump_input_power"].value == pytest.approx(30e3)
    assert x["power_used"] == pytest.approx(68e3)
    assert x["power_available"] == pytest.approx(75e3)
    assert (x["power_available"] - x["power_used"]) / x["power_available"] == pytest.approx(0.0933, abs=5e-5)
    assert [i.symbol for i in x.values["power_used"].inputs] == ["P_in[front]", "P_in[rear]"]
    assert x.speed_name == "rated" and x["prime_mover_speed"] * 60 == pytest.approx(2200)


def test_torques_add_at_the_engine_shaft():
    x = outcome().results.prime_mover_mode("diesel", "dig")
    # hand calculation: 68 000 W / (2*pi*36.667 rev/s) = 295.16 N*m, the same as summing each pump's torque
    # times its ratio: 38000/(2*pi*36.667)*1.0 + 30000/(2*pi*44.0)*1.2 = 164.94 + 130.22
    assert x.per_supply["rear"]["prime_mover_torque"].value == pytest.approx(130.218, abs=1e-3)
    assert x["torque_used"] == pytest.approx(68e3 / (2 * math.pi * 2200 * RPM))
    assert x["torque_available"] == pytest.approx(75e3 / (2 * math.pi * 2200 * RPM))  # 325.54 N*m
    assert "torque_returned" not in x.values


def test_idle_reads_the_power_curve():
    x = outcome().results.prime_mover_mode("diesel", "travel_idle")
    # hand calculation at 1000 rpm: A 750e-6 * 19.0e6 / 0.825 = 17 272.7 W; B 560e-6 * 18.75e6 / 0.77 = 13 636.4 W
    assert x["power_used"] == pytest.approx(17272.73 + 13636.36, abs=0.05)
    assert x["power_available"] == pytest.approx(40e3)  # the curve's point at 1000 rpm


def test_power_between_curve_points_in_a_mode():
    d = shared_engine()
    d["prime_movers"]["diesel"]["speeds"]["work"] = "1600 rpm"
    d["modes"]["travel_idle"]["prime_mover_speeds"]["diesel"] = "work"
    x = outcome(d).results.prime_mover_mode("diesel", "travel_idle")
    # hand calculation: 40 + 35 * 600 / 1200 = 57.5 kW
    assert x["power_available"] == pytest.approx(57.5e3)
    assert x.values["power_available"].formula.startswith("P_avail = P_a + (P_b - P_a)")


def test_prime_mover_power_at_for_shared_and_own_prime_movers():
    o = outcome()
    assert prime_mover_power_at(o.machine, "rear", "travel_idle") == pytest.approx(40e3)
    assert prime_mover_power_at(o.machine, "front", "dig") == pytest.approx(75e3)
    from helpers import minimal
    m = evaluate(Source("mem.yaml", minimal(), b"")).machine
    assert prime_mover_power_at(m, "main", "work") == pytest.approx(30e3)  # its own prime_mover_power
    d = minimal()
    del d["supplies"]["main"]["prime_mover_power"]
    assert prime_mover_power_at(evaluate(Source("mem.yaml", d, b"")).machine, "main", "work") is None


def test_one_pump_on_a_shared_engine_matches_its_own_prime_mover_speed():
    # migration: the same pump described either way gives the same pump values
    from helpers import minimal
    own = minimal()
    own["supplies"]["main"]["pump"].pop("shaft_speed")
    own["supplies"]["main"].update(prime_mover_speed="1500 rpm", drive_ratio=1.25)
    shared = minimal()
    shared["supplies"]["main"]["pump"].pop("shaft_speed")
    del shared["supplies"]["main"]["prime_mover_power"]
    shared["supplies"]["main"].update(prime_mover="motor", drive_ratio=1.25)
    shared["prime_movers"] = {"motor": {"kind": "electric_motor", "power": "30 kW", "speeds": {"rated": "1500 rpm"}}}
    a = evaluate(Source("a.yaml", own, b"")).results.supply_mode("main", "work")
    b = evaluate(Source("b.yaml", shared, b"")).results.supply_mode("main", "work")
    for key in ("pump_delivery", "pump_input_power", "pump_input_torque", "heat_load"):
        assert a[key] == pytest.approx(b[key]), key


def _fake(supply: str, mode: str, power: float, n_p: float) -> SupplyModeResult:
    t = power / (2 * math.pi * n_p)
    return SupplyModeResult(supply, mode, (), {
        "pump_shaft_speed": given("pump_shaft_speed", "Pump shaft speed", "n_p", n_p, "speed"),
        "pump_input_power": given("pump_input_power", "Pump input power", "P_in", power, "power"),
        "pump_input_torque": given("pump_input_torque", "Pump input torque", "T_p", t, "torque")})


def test_pumps_returning_power_drive_the_engine():
    # a closed loop braking an overrunning load gives a negative pump input power: -50 kW on B at 2640 rpm,
    # +20 kW on A at 2200 rpm. Hand calculation at the engine (2200 rpm = 36.667 rev/s):
    # T_sum = 20000/(2*pi*36.667) + (-50000/(2*pi*44)) * 1.2 = 86.81 - 217.03 = -130.22 N*m; returned 130.22 N*m
    m = outcome().machine
    (x,) = resolve_prime_movers(m, (_fake("front", "dig", 20e3, 2200 * RPM), _fake("rear", "dig", -50e3, 2640 * RPM)))
    assert x["power_used"] == pytest.approx(-30e3)
    assert x["torque_used"] == pytest.approx(-130.218, abs=1e-3)
    assert x["torque_returned"] == pytest.approx(130.218, abs=1e-3)


def test_a_mode_running_no_pump_on_the_engine_gives_no_record():
    m = outcome().machine
    assert resolve_prime_movers(m, ()) == ()


def test_a_corner_derating_the_engine_scales_its_whole_curve():
    # rated power -10 %: the curve follows it, k = 67.5 / 75 = 0.9; at rated speed 75 * 0.9 = 67.5 kW, and the
    # 68 kW the pumps take no longer fits (hand calculation)
    d = shared_engine()
    d["corners"] = {"hot_day": {"title": "Derated engine", "scale": {"prime_movers.diesel.power": "-10 %"}}}
    (c,) = [c for c in outcome(d).results.checks if c.id == "prime_mover_load" and c.mode == "dig"]
    assert c.corner == "hot_day" and c.status == "fail"
    assert c.limit == pytest.approx(67.5e3) and c.margin == pytest.approx((67.5 - 68) / 67.5)


def test_nominal_curve_trace_has_no_corner_factor():
    x = outcome().results.prime_mover_mode("diesel", "dig")
    assert "k" not in [i.symbol for i in x.values["power_available"].inputs]


def test_mode_independent_values_use_the_fastest_speed_a_mode_runs():
    # a mode naming a speed above rated: the supply's own values (suction, pump inlet) are judged there,
    # the pump's worst: A at 2400 rpm delivers 45 cm^3 * 2400 rpm = 108 L/min (hand calculation)
    d = shared_engine()
    d["prime_movers"]["diesel"]["speeds"]["high"] = "2400 rpm"
    d["prime_movers"]["diesel"]["power_curve"].append({"speed": "2400 rpm", "power": "74 kW"})
    d["modes"]["travel_idle"]["prime_mover_speeds"]["diesel"] = "high"
    r = outcome(d).results
    assert r.supply_result("front")["pump_delivery"] * 60e3 == pytest.approx(108.0)
    assert r.supply_mode("front", "dig")["pump_delivery"] * 60e3 == pytest.approx(99.0)  # rated: 45 * 2200
    assert r.supply_mode("front", "travel_idle")["pump_delivery"] * 60e3 == pytest.approx(108.0)


def test_without_a_faster_mode_the_supply_values_sit_at_the_default_speed():
    r = outcome().results  # modes at rated and idle: rated is the fastest
    assert r.supply_result("rear")["pump_shaft_speed"] * 60 == pytest.approx(2640)


def test_a_supply_giving_power_and_speed_only_gets_its_torque_from_them():
    # hand calculation: 30 kW at 2640 rpm = 30000 / (2*pi*44) = 108.51 N*m; at the engine * 1.2 = 130.22 N*m
    m = outcome().machine
    r = _fake("rear", "dig", 30e3, 2640 * RPM)
    del r.values["pump_input_torque"]
    (x,) = resolve_prime_movers(m, (r,))
    assert x.per_supply["rear"]["pump_input_torque"].value == pytest.approx(108.515, abs=1e-3)
    assert x["torque_used"] == pytest.approx(130.218, abs=1e-3)
