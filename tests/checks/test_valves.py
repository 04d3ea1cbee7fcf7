"""Valve and suction checks at their boundaries: port_relief_braking, counterbalance_setting,
pump_inlet_pressure. Fixture helpers.minimal(): a 100 cm^3 motor, eta_hm 0.9, 286.5 N*m at the
load (no gear stage), return 5 bar. All ratings: pass/fail, fail at the limit (checks/status.py)."""

import pytest

from helpers import minimal, spec_check, spec_checks


def lowering(**drive) -> dict:
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["direction"] = "overrunning"
    d["drives"]["hoist"].update(drive)
    return d


@pytest.mark.parametrize("port, status", [
    # allowed T = 100e-6 * (p_port - 5 bar) / (2*pi*0.9); needed 286.5 N*m (the overrunning torque);
    # boundary p_port = 286.5*2*pi*0.9/100e-6 + 5e5 = 167.01 bar (hand calculation)
    ("170 bar", "pass"),   # 100e-6*165e5/(2*pi*0.9) = 291.78 N*m, +1.84 %
    ("167.02 bar", "pass"),  # 286.52 N*m
    ("167 bar", "fail"),   # 286.48 N*m: the relief opens first, the load slips
    ("150 bar", "fail"),
])
def test_port_relief_braking_boundaries(port, status):
    c = spec_check(lowering(port_relief=port), "port_relief_braking", drive="hoist")
    assert c.status == status
    assert c.limit == pytest.approx(286.5)
    p = float(port.split()[0]) * 1e5
    assert c.value == pytest.approx(100e-6 * (p - 5e5) / (2 * 3.141592653589793 * 0.9))


def test_port_relief_braking_stops_an_inertia():
    # driving duty with an inertia block: stopping 2 kg*m^2 from 500 rpm in 0.5 s at the motor:
    # 2 * 2*pi*(500/60) / 0.5 = 209.44 N*m; a 150 bar port relief allows 100e-6*145e5/(2*pi*0.9) = 256.43 N*m
    d = minimal()
    d["drives"]["hoist"]["port_relief"] = "150 bar"
    d["drives"]["hoist"]["duty_points"]["lift"]["inertia"] = {"load_inertia": "2 kg*m^2", "ramp_time": "0.5 s"}
    c = spec_check(d, "port_relief_braking", drive="hoist")
    assert c.limit == pytest.approx(209.440, abs=0.001) and c.status == "pass"
    assert spec_checks(minimal(), "port_relief_braking") == []  # no port relief, nothing to judge


@pytest.mark.parametrize("setting, status", [
    # load-induced pressure 2*pi*286.5/100e-6 = 180.013 bar; 1.3 x = 234.02 bar (common practice factor)
    ("240 bar", "pass"),
    ("234.05 bar", "pass"),
    ("234 bar", "fail"),   # the valve can open under the load alone
])
def test_counterbalance_setting_covers_the_load(setting, status):
    d = lowering(counterbalance={"setting": setting, "pilot_ratio": 4})
    found = [c for c in spec_checks(d, "counterbalance_setting", drive="hoist") if c.duty == "lift"]
    assert [c.status for c in found] == [status]
    assert found[0].limit / 1e5 == pytest.approx(1.3 * 180.0127, abs=1e-3)


@pytest.mark.parametrize("setting, status", [("349 bar", "pass"), ("350 bar", "fail"), ("360 bar", "fail")])
def test_counterbalance_setting_within_peak(setting, status):
    d = lowering(counterbalance={"setting": setting, "pilot_ratio": 4})
    c = spec_check(d, "counterbalance_setting", drive="hoist", duty=None)
    assert c.status == status and c.limit == pytest.approx(350e5)


def test_counterbalance_factor_threshold():
    d = lowering(counterbalance={"setting": "240 bar", "pilot_ratio": 4})
    d["thresholds"] = {"counterbalance_factor": 1.4}   # 1.4 * 180.013 = 252.02 bar > 240
    found = [c for c in spec_checks(d, "counterbalance_setting", drive="hoist") if c.duty == "lift"]
    assert [c.status for c in found] == ["fail"]


def test_counterbalance_pilot_pressure_and_heat():
    # braking dp = 2*pi*286.5*0.9/100e-6 = 162.011 bar; p_in = (240 - 162.011)/(1 + 4) = 15.598 bar;
    # the pump now feeds the inlet: the supply works at that pilot pressure
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    d = lowering(counterbalance={"setting": "240 bar", "pilot_ratio": 4})
    r = evaluate(Source("mem.yaml", d, b"")).results
    u = r.duty("hoist", "lift")
    assert u["inlet_pressure"] / 1e5 == pytest.approx((240 - 162.0114) / 5, abs=1e-3)
    assert u["counterbalance_heat"] == pytest.approx(u["shaft_power"] + u["inlet_pressure"] * u["flow_demand"])
    assert r.supply_mode("main", "work")["working_pressure"] == pytest.approx(u["inlet_pressure"])
    # the load port sits at the pilot pressure plus the braking differential: 15.598 + 162.011 = 177.609 bar
    assert u["braking_pressure"] / 1e5 == pytest.approx(177.609, abs=1e-3)


@pytest.mark.parametrize("head, status", [
    # p = 101325 + 870*9.80665*h (no fluid block: density 870 kg/m^3 assumed); minimum 0.8 bar abs assumed
    ("-2.4 m", "pass"),    # 101325 - 20476.3 = 80848.7 Pa
    ("-2.5 m", "fail"),    # 101325 - 21329.5 = 79995.5 Pa: cavitates
])
def test_pump_inlet_pressure_head(head, status):
    d = minimal()
    d["supplies"]["main"]["suction"] = {"head": head}
    c = spec_check(d, "pump_inlet_pressure", supply="main")
    assert c.status == status and c.limit == pytest.approx(0.8e5)
    h = float(head.split()[0])
    assert c.value == pytest.approx(101325 + 870 * 9.80665 * h)


@pytest.mark.parametrize("strainer, status", [
    # 1.01325 bar - strainer drop against a 0.9 bar minimum (maker's data)
    ("0.11 bar", "pass"),   # 0.90325 bar
    ("0.11325 bar", "fail"),  # exactly 0.9 bar: at the limit
    ("0.2 bar", "fail"),
])
def test_pump_inlet_pressure_strainer(strainer, status):
    d = minimal()
    d["supplies"]["main"]["suction"] = {"strainer_drop": strainer}
    d["supplies"]["main"]["pump"]["min_inlet_pressure"] = "0.9 bar"
    assert spec_check(d, "pump_inlet_pressure", supply="main").status == status


def test_no_suction_side_no_inlet_check():
    assert spec_checks(minimal(), "pump_inlet_pressure") == []
