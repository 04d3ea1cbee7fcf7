"""Circuits, pumps, prime mover, variable motors, makeup flow and heat load at the spec level,
each against a hand calculation from the positive-displacement machine relations and the energy
balance (first law) written beside it."""

import math

import pytest

from helpers import minimal
from specgen.errors import SpecError
from specgen.pipeline import evaluate
from specgen.intake.read import Source


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def checks(o, cid):
    return [c for c in o.results.checks if c.id == cid]


def two_drives(circuit):
    d = minimal()
    d["supplies"]["main"]["circuit"] = circuit
    d["drives"]["feed"] = {"supply": "main", "motor": {
        "kind": "axial_piston", "displacement": "80 cm^3",
        "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.85},
        "rating": {"continuous_pressure": "280 bar", "peak_pressure": "350 bar", "max_speed": "3000 rpm",
                   "max_outlet_pressure": "150 bar"}},
        "duty_points": {"run": {"torque": "100 N*m", "speed": "600 rpm"}}}
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "150 N*m"
    d["modes"]["work"]["drives"]["feed"] = "run"
    return d


def test_series_circuit_pressure_differentials_add():
    o = outcome(two_drives("series"))
    a, b = o.results.duty("hoist", "lift"), o.results.duty("feed", "run")
    s = o.results.supply_mode("main", "work")
    dp_a = 2 * math.pi * 150 / (100e-6 * 0.9)  # 104.7 bar
    dp_b = 2 * math.pi * 100 / (80e-6 * 0.9)  # 87.3 bar
    assert a["pressure_differential"] == pytest.approx(dp_a) and b["pressure_differential"] == pytest.approx(dp_b)
    # spec order hoist -> feed: feed's outlet is the return (5 bar), its inlet is hoist's outlet
    assert s.per_drive["feed"]["outlet_pressure"].value == pytest.approx(5e5)
    assert s.per_drive["hoist"]["outlet_pressure"].value == pytest.approx(5e5 + dp_b)
    assert s.per_drive["hoist"]["inlet_pressure"].value == pytest.approx(5e5 + dp_b + dp_a)
    assert s["working_pressure"] == pytest.approx(5e5 + dp_a + dp_b)  # 197.0 bar
    # one flow through both: the larger demand, 80*600/0.95 = 50.5 vs 100*500/0.95 = 52.6 L/min
    assert s["flow_demand"] == pytest.approx(max(a["flow_demand"], b["flow_demand"]))
    assert {c.status for c in checks(o, "supply_pressure")} == {"pass"}  # (250 - 197)/250 = 21 %
    outlet = [c for c in checks(o, "outlet_pressure") if c.mode == "work" and c.drive == "hoist"]
    assert outlet == []  # hoist has no outlet rating in the fixture
    assert [c.status for c in checks(o, "outlet_pressure") if c.mode == "work"] == ["pass"]  # feed: 5 bar <= 150


def test_parallel_circuit_keeps_the_highest_pressure():
    o = outcome(two_drives("parallel"))
    a, b = o.results.duty("hoist", "lift"), o.results.duty("feed", "run")
    s = o.results.supply_mode("main", "work")
    assert s["working_pressure"] == pytest.approx(max(a["inlet_pressure"], b["inlet_pressure"]))
    assert s["flow_demand"] == pytest.approx(a["flow_demand"] + b["flow_demand"])


def test_series_supply_refuses_a_drive_back_pressure():
    d = two_drives("series")
    d["drives"]["feed"]["back_pressure"] = "10 bar"
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "drives.feed.back_pressure: on a series supply" in str(e.value)


def heat_fixture(**supply):
    d = minimal()
    d["supplies"]["main"].update(supply)
    return outcome(d)


def test_fixed_and_compensated_pump_heat():
    # hoist: q = 52.63 L/min, dp = 200.0 bar, p_in = 205.0 bar; shaft P = 2*pi*(500/60)*286.5 = 15.00 kW
    # pump: 57 L/min, eta_t 0.85, relief 250 bar
    fixed = heat_fixture().results
    r = fixed.duty("hoist", "lift")
    q_p, p_s, shaft = 57e-3 / 60, r["inlet_pressure"], r["shaft_power"]
    s = fixed.supply_mode("main", "work")
    assert s["pump_input_power"] == pytest.approx(q_p * p_s / 0.85)  # surplus bypassed at the working pressure
    assert s["heat_load"] == pytest.approx(q_p * p_s / 0.85 - shaft)
    relief = heat_fixture(surplus_to="relief").results.supply_mode("main", "work")
    # surplus over the relief valve: the pump outlet sits at 250 bar
    assert relief["pump_pressure"] == pytest.approx(250e5)
    assert relief["heat_load"] == pytest.approx(q_p * 250e5 / 0.85 - shaft)
    assert relief["heat_surplus_loss"] == pytest.approx((q_p - r["flow_demand"]) * 250e5)
    comp = heat_fixture(pump={"displacement": "40 cm^3", "shaft_speed": "1500 rpm", "volumetric_efficiency": 0.95,
                              "overall_efficiency": 0.85, "control": "pressure_compensated",
                              "compensator_setting": "230 bar"}).results.supply_mode("main", "work")
    # compensated: only the demanded 52.63 L/min, at 230 bar: P_in = q*p_comp/eta_t
    assert comp["pump_input_power"] == pytest.approx(r["flow_demand"] * 230e5 / 0.85)
    assert comp["heat_load"] == pytest.approx(r["flow_demand"] * 230e5 / 0.85 - shaft)
    assert comp["heat_load"] < relief["heat_load"]


def test_compensator_needs_a_setting_below_relief():
    d = minimal()
    d["supplies"]["main"]["pump"].update({"control": "pressure_compensated", "compensator_setting": "260 bar"})
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "supplies.main.pump.compensator_setting: the compensator setting must be below the relief" in str(e.value)


def test_prime_mover_speed_turns_the_pump_and_gives_its_torque():
    d = minimal()
    del d["supplies"]["main"]["pump"]["shaft_speed"]
    d["supplies"]["main"].update({"prime_mover_speed": "1000 rpm", "drive_ratio": 1.5})
    o = outcome(d)
    sup = o.results.supply_result("main")
    assert sup["pump_shaft_speed"] * 60 == pytest.approx(1500.0)  # 1000 rpm * 1.5
    s = o.results.supply_mode("main", "work")
    assert s["pump_delivery"] * 60e3 == pytest.approx(57.0)
    assert s["pump_input_torque"] == pytest.approx(s["pump_input_power"] / (2 * math.pi * 25.0))
    assert s["prime_mover_torque"] == pytest.approx(s["pump_input_power"] / (2 * math.pi * 1000 / 60))
    assert sup.worst_power_mode == "work"


def variable(min_cc="40 cm^3", available=None):
    d = minimal()
    d["drives"]["hoist"]["motor"]["displacement"] = {"min": min_cc, "max": "160 cm^3"}
    d["drives"]["hoist"]["duty_points"]["lift"] = {"torque": "100 N*m", "speed": "1200 rpm"}
    if available:
        d["drives"]["hoist"]["available_flow"] = available
    return outcome(d)


def test_variable_motor_control_sets_the_largest_displacement_that_reaches_speed():
    o = variable(available="100 L/min")
    r = o.results.duty("hoist", "lift")
    # Vg = q*eta_v/n = (100/60000)*0.95/20 = 79.17 cm^3, inside 40 to 160
    assert r["displacement"] == pytest.approx(100 / 60000 * 0.95 / 20)
    assert r["flow_demand"] == pytest.approx(100 / 60000)
    # at 40 cm^3 the 100 L/min turn the motor 100000*0.95/40 = 2375 rpm, within its 3000 rpm rating
    dr = o.results.drive_result("hoist")
    assert dr["min_displacement_speed"] * 60 == pytest.approx(2375.0)
    assert [c.status for c in checks(o, "min_displacement_speed")] == ["pass"]
    assert len(dr.envelope) == 11 and dr.envelope[0].displacement == pytest.approx(40e-6)
    # envelope at the relief setting: T = Vg*(p_relief - p_out)*eta_hm/(2*pi) at 160 cm^3
    assert dr.envelope[-1].torque == pytest.approx(160e-6 * 245e5 * 0.9 / (2 * math.pi))


def test_speed_check_uses_the_minimum_displacement():
    # with the whole 57 L/min pump delivery and a 15 cm^3 stop: 57000*0.95/15 = 3610 rpm > 3000 rpm
    o = variable(min_cc="15 cm^3")
    assert o.results.drive_result("hoist")["min_displacement_speed"] * 60 == pytest.approx(3610.0)
    assert [c.status for c in checks(o, "min_displacement_speed")] == ["fail"]
    assert [c.status for c in checks(o, "max_speed")] == ["pass"]  # the duty speed itself is fine


def overrun_with_neighbour(load_holding):
    d = minimal()
    d["drives"]["hoist"]["load_holding"] = load_holding
    d["drives"]["hoist"]["duty_points"]["lift"]["direction"] = "overrunning"
    d["drives"]["fan"] = {"supply": "main", "motor": {
        "kind": "external_gear", "displacement": "20 cm^3",
        "efficiency": {"volumetric": 0.9, "hydromechanical": 0.85},
        "rating": {"continuous_pressure": "200 bar", "peak_pressure": "250 bar", "max_speed": "4000 rpm"}},
        "duty_points": {"run": {"torque": "20 N*m", "speed": "1000 rpm"}}}
    d["modes"]["work"]["drives"]["fan"] = "run"
    return outcome(d)


def test_makeup_flow_for_an_overrunning_motor():
    # Lowered through a counterbalance valve the pump fills the inlet: pump 57 L/min; the fan takes
    # 20*1000/0.9 = 22.2 L/min, leaving 34.8 L/min for the lowering motor, which needs
    # 100*500/0.95 = 52.6 L/min at its inlet: short, a warning (the valve throttles the load down)
    c = checks(overrun_with_neighbour("counterbalance_valve"), "makeup_flow")[0]
    assert c.value * 60e3 == pytest.approx(57.0 - 20 * 1000 / 0.9 / 1000)
    assert c.status == "warn"
    # Without one the inlet fills through makeup valves from the return line (deliberately no
    # longer charged to the pump): the fan's return 22.2 L/min plus the fixed pump's surplus
    # 57 - 22.2 = 34.8 L/min reach tank, 57.0 L/min against 52.6 L/min needed: 8.3 %, pass
    o = overrun_with_neighbour("none")
    c = [c for c in checks(o, "makeup_flow") if c.kind == "flow"][0]
    assert c.value * 60e3 == pytest.approx(57.0)
    assert c.status == "pass"
    s = o.results.supply_mode("main", "work")
    assert s["flow_demand"] * 60e3 == pytest.approx(20 * 1000 / 0.9 / 1000)  # the fan alone


def test_overrunning_power_counts_as_heat():
    o = overrun_with_neighbour("counterbalance_valve")
    s = o.results.supply_mode("main", "work")
    lower = o.results.duty("hoist", "lift")
    assert s["braking_power"] == pytest.approx(lower["shaft_power"] * min(1.0, s["pump_delivery"] / s["flow_demand"]))
    assert s["heat_load"] == pytest.approx(s["pump_input_power"] - s["useful_shaft_power"] + s["braking_power"])


def test_heat_load_against_the_cooler():
    d = minimal()
    d["cooler"] = {"capacity": "8 kW"}
    o = outcome(d)
    heat = o.results.mode_result("work")["heat_load"]
    # P_in = 57 L/min * 205.0 bar / 600 / 0.85 = 22.91 kW; shaft 15.00 kW: heat 7.91 kW, 1.1 % under 8 kW
    assert heat / 1e3 == pytest.approx(22.913 - 15.000, abs=0.01)
    assert [c.status for c in checks(o, "heat_load")] == ["warn"]
    d["cooler"] = {"capacity": "7 kW"}
    assert [c.status for c in checks(outcome(d), "heat_load")] == ["fail"]
