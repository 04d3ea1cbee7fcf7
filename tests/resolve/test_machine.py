"""The whole computation on small machines, checked by hand calculation."""

import math

import pytest

from helpers import EXAMPLE, minimal
from specgen.pipeline import run_file
from specgen.intake.read import Source
from specgen.pipeline import evaluate


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def test_minimal_machine_by_hand():
    o = outcome(minimal())
    r = o.results.duty("hoist", "lift")
    # dp = 2*pi*T/(Vg*eta_hm) = 2*pi*286.5/(100e-6*0.9) = 200.0 bar (hand calc)
    assert r["pressure_differential"] == pytest.approx(2 * math.pi * 286.5 / (100e-6 * 0.9))
    assert r["pressure_differential"] / 1e5 == pytest.approx(200.02, abs=0.01)
    assert r["inlet_pressure"] / 1e5 == pytest.approx(205.0147, abs=1e-4)  # p_in = dp + p_out = 200.0147 + 5 bar
    # q = Vg*n/eta_v = 100 cm^3 * 500 rpm / 0.95 = 52.63 L/min
    assert r["flow_demand"] * 60e3 == pytest.approx(100 * 500 / 0.95 / 1000, rel=1e-9)
    # torque at relief: 100e-6*(250-5)e5*0.9/(2*pi) = 350.9 N*m
    assert r["relief_torque"] == pytest.approx(100e-6 * 245e5 * 0.9 / (2 * math.pi))
    s = o.results.supply_mode("main", "work")
    # pump: 40 cm^3 * 1500 rpm * 0.95 = 57.0 L/min
    assert s["pump_delivery"] * 60e3 == pytest.approx(57.0)
    # surplus = 57.0 - 52.6316 = 4.3684 L/min (hand calc)
    assert s["flow_surplus"] * 60e3 == pytest.approx(4.3684, abs=1e-4)
    # input power = 57 L/min * 205.0147 bar / 600 / 0.85 = 22.9134 kW (hand calc)
    assert s["pump_input_power"] / 1e3 == pytest.approx(22.9134, abs=1e-4)
    statuses = {c.id: c.status for c in o.results.checks}
    assert statuses["pressure_margin"] == "pass"  # (250-205)/250 = 18 %
    assert statuses["prime_mover_power"] == "pass"


def test_gear_stage_and_overrun():
    d = minimal()
    d["drives"]["hoist"]["gear_stage"] = {"ratio": 20, "efficiency": 0.95}
    d["drives"]["hoist"]["load_holding"] = "counterbalance_valve"
    d["drives"]["hoist"]["duty_points"] = {
        "lift": {"torque": "5 kN*m", "speed": "25 rpm"},
        "lower": {"torque": "5 kN*m", "speed": "25 rpm", "direction": "overrunning"},
    }
    o = outcome(d)
    up, down = o.results.duty("hoist", "lift"), o.results.duty("hoist", "lower")
    assert up["motor_speed"] * 60 == pytest.approx(500.0)
    assert up["motor_torque"] == pytest.approx(5000 / (20 * 0.95))
    assert down["motor_torque"] == pytest.approx(5000 * 0.95 / 20)
    # overrunning: braking differential dp = 2*pi*T*eta_hm/Vg held at the outlet
    assert down["pressure_differential"] == pytest.approx(2 * math.pi * down["motor_torque"] * 0.9 / 100e-6)
    assert down["braking_pressure"] == pytest.approx(down["pressure_differential"] + 5e5)
    holding = [c for c in o.results.checks if c.id == "load_holding"]
    assert [c.status for c in holding] == ["pass"]


def test_overrun_without_load_holding_fails():
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["direction"] = "overrunning"
    o = outcome(d)
    assert [c.status for c in o.results.checks if c.id == "load_holding"] == ["fail"]
    assert o.results.verdict == "fail"


def test_parallel_supply_sums_flow_and_takes_highest_pressure():
    d = minimal()
    d["drives"]["fan"] = {"supply": "main", "motor": {"kind": "external_gear", "displacement": "10 cm^3",
                          "rating": {"max_speed": "4000 rpm", "continuous_pressure": "200 bar", "peak_pressure": "250 bar"}},
                          "duty_points": {"run": {"torque": "10 N*m", "speed": "1000 rpm"}}}
    d["modes"]["work"]["drives"]["fan"] = "run"
    o = outcome(d)
    s = o.results.supply_mode("main", "work")
    a, b = o.results.duty("hoist", "lift"), o.results.duty("fan", "run")
    assert s["flow_demand"] == pytest.approx(a["flow_demand"] + b["flow_demand"])
    assert s["working_pressure"] == pytest.approx(max(a["inlet_pressure"], b["inlet_pressure"]))


def test_shortfall_and_relief_fail():
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"] = {"torque": "400 N*m", "speed": "700 rpm"}
    o = outcome(d)
    st = {c.id: c.status for c in o.results.checks}
    assert st["pressure_margin"] == "fail"  # needs 279 + 5 bar > 250 bar
    assert st["pump_flow"] == "fail"  # 73.7 L/min > 57 L/min


def test_assumed_efficiencies_are_marked():
    d = minimal()
    del d["drives"]["hoist"]["motor"]["efficiency"]
    o = outcome(d)
    m = o.machine.drive("hoist").motor
    assert m.hydromechanical_efficiency.assumed and m.hydromechanical_efficiency.value == 0.92
    assert o.results.duty("hoist", "lift").values["pressure_differential"].assumed


def test_example_machine_figures():
    o = run_file(EXAMPLE)
    r = o.results.duty("track_left", "climb")
    # wheel load (hand calc): F = 8000*9.80665*(0.08*cos(atan 0.18) + sin(atan 0.18)) = 20075 N,
    # T = 20075*0.3/2 = 3011 N*m; 2*pi*3011/(820e-6*0.94) = 245.5 bar; + 8 bar back pressure
    assert r["inlet_pressure"] / 1e5 == pytest.approx(253.46, abs=0.01)
    assert o.results.verdict == "warn"
    warned = sorted((c.id, c.drive or c.supply) for c in o.results.checks if c.status == "warn")
    assert ("pressure_margin", "track_left") in warned
    assert all(c.status != "fail" for c in o.results.checks)
