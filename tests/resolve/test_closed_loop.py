"""A closed-loop supply in one mode (specgen/resolve/closed_loop.py), computed by hand.

Relations: primer section 15 and the textbook hydrostatic transmission relations; the rig is
helpers.closed_loop() (100 cm^3 pump at 2000 rpm, 100 cm^3 motor at 902.5 rpm, 25 bar charge).
"""

import math

import pytest

from helpers import closed_loop
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.resolve.limits import peak_limit

LPM = 1 / 60000
BAR = 1e5


def _results(data):
    return evaluate(Source("mem.yaml", data, b"")).results


def test_driving_stroke_high_side_torque_and_power():
    sm = _results(closed_loop()).supply_mode("loop", "driving")
    # hand calculation: motor flow 100 cm^3 * 902.5 rpm / 0.95 = 95 L/min; full stroke 100*2000*0.95 = 190 L/min
    assert sm["flow_demand"] / LPM == pytest.approx(95.0, rel=1e-9)
    assert sm["pump_delivery"] / LPM == pytest.approx(190.0, rel=1e-9)
    assert sm["pump_displacement_setting"] == pytest.approx(0.5, rel=1e-9)
    # dp = 2*pi*407.04 / (100e-6 * 0.93) = 275.00 bar above the 25 bar charge pressure
    assert sm["low_side_pressure"] / BAR == pytest.approx(25.0)
    assert sm["working_pressure"] / BAR == pytest.approx(300.0, abs=0.01)
    assert sm["pump_hydromechanical_efficiency"] == pytest.approx(0.874 / 0.95)  # 0.92
    # T_loop = 0.5 * 100e-6 * 275e5 / (2*pi*0.92) = 237.87 N*m (the worked example)
    assert sm["pump_loop_torque"] == pytest.approx(237.87, abs=0.02)
    # P_loop = q * dp / eta_t = 1.58333e-3 * 275e5 / 0.874 = 49 819 W
    assert sm["pump_loop_power"] == pytest.approx(49819, rel=2e-4)
    # charge 20 cm^3 * 2000 rpm * 0.9 = 36 L/min; 6e-4 m^3/s * 25e5 Pa / 0.8 = 1875 W
    assert sm["charge_flow"] / LPM == pytest.approx(36.0, rel=1e-9)
    assert sm["charge_power"] == pytest.approx(1875.0, rel=1e-9)
    # P_in = 49 819 + 1875 = 51 694 W; T_p = P_in / (2*pi*33.333 rev/s) = 246.82 N*m
    assert sm["pump_input_power"] == pytest.approx(51694, rel=2e-4)
    assert sm["pump_input_torque"] == pytest.approx(51694 / (2 * math.pi * 2000 / 60), rel=2e-4)
    assert sm.values["pump_input_power"].formula == "P_in = P_loop + P_c"


def test_charge_need_counts_pump_and_motor_leakage_and_flushing():
    sm = _results(closed_loop()).supply_mode("loop", "driving")
    # hand calculation: pump 100*2000*0.05 = 10 L/min, motor 100*902.5*0.05 = 4.5125 L/min, flushing 10 L/min
    assert sm.drive_value("wheel", "motor_leakage").value / LPM == pytest.approx(4.5125, rel=1e-9)
    assert sm["charge_flow_needed"] / LPM == pytest.approx(24.5125, rel=1e-9)
    assert sm["charge_relief_flow"] / LPM == pytest.approx(36 - 24.5125, rel=1e-9)
    assert sm["charge_displacement_share"] == pytest.approx(0.2)  # 20 cm^3 beside 100 cm^3


def test_driving_heat_is_power_in_less_shaft_power():
    sm = _results(closed_loop()).supply_mode("loop", "driving")
    # hand calculation: shaft = q * dp * eta_v,m * eta_hm,m = 1.58333e-3 * 275e5 * 0.95 * 0.93 = 38 468 W;
    # heat = 51 694 - 38 468 = 13 226 W, split into pump, motors and charge
    assert sm["useful_shaft_power"] == pytest.approx(38468, rel=2e-4)
    assert sm["heat_load"] == pytest.approx(13226, rel=5e-4)
    parts = sm["heat_pump_loss"] + sm["heat_drive_loss"] + sm["heat_charge"]
    assert parts == pytest.approx(sm["heat_load"], rel=1e-12)
    assert sm["transmission_efficiency"] == pytest.approx(38468 / 51694, rel=5e-4)


def test_overrunning_load_drives_the_prime_mover_and_no_valve_heat():
    sm = _results(closed_loop()).supply_mode("loop", "braking")
    # hand calculation: the motor pumps 100 * 902.5 * 0.95 = 85.7375 L/min; the pump swallows it at
    # x = 85.7375 * 0.95 / 200 = 0.407253125
    assert sm["flow_demand"] / LPM == pytest.approx(85.7375, rel=1e-9)
    assert sm["pump_displacement_setting"] == pytest.approx(0.407253125, rel=1e-9)
    # absorbed P_m = 2*pi*15.0417 rev/s*407.04 N*m = 38 469 W; back = P_m * 0.95*0.93 (motor) * 0.874 (pump)
    # = 29 706 W; less the charge pump's 1875 W: P_in = -27 831 W
    p_m = 2 * math.pi * 902.5 / 60 * 407.04
    back = p_m * 0.95 * 0.93 * 0.874
    assert sm["braking_power"] == pytest.approx(p_m, rel=1e-9)
    assert sm["pump_input_power"] == pytest.approx(-back + 1875, rel=1e-6)
    assert sm["pump_input_power"] == pytest.approx(-27831, abs=2)
    assert sm["pump_input_torque"] == pytest.approx((-back + 1875) / (2 * math.pi * 2000 / 60), rel=1e-6)
    assert sm["transmission_efficiency"] == pytest.approx(0.95 * 0.93 * 0.874, rel=1e-6)
    # heat: motor and pump losses and the charge circuit only, P_m*(1 - 0.7722) + 1875 = 10 638 W; an open
    # circuit would throttle all 38 469 W in its counterbalance valve
    assert sm["heat_load"] == pytest.approx(p_m - back + 1875, rel=1e-6)
    assert sm["heat_load"] < p_m


def test_high_pressure_reliefs_per_side_set_the_drive_limit_and_the_peak():
    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["high_pressure_reliefs"] = {"side_b": "380 bar"}
    outcome = evaluate(Source("mem.yaml", data, b""))
    limit = outcome.results.drive_result("wheel").values["pressure_limit"]
    assert limit.value / BAR == pytest.approx(380.0)  # the lower side governs torque at the limit and breakaway
    assert limit.note == "governed by the high-pressure relief, side B"
    m = outcome.machine
    assert peak_limit(m.drive("wheel"), m.supply("loop")) / BAR == pytest.approx(420.0)  # side A: relief setting


def test_low_side_is_the_charge_pressure_at_every_motor_outlet():
    r = _results(closed_loop())
    # the back pressure and the torque at the limit use the charge pressure: 100e-6*(420-25)e5*0.93/(2*pi)
    assert r.duty("wheel", "drive")["back_pressure"] / BAR == pytest.approx(25.0)
    assert r.duty("wheel", "drive")["relief_torque"] == pytest.approx(100e-6 * 395e5 * 0.93 / (2 * math.pi))


def test_a_worn_corner_that_lifts_the_pump_ratio_past_one_holds_it_at_one():
    # Nominal eta_v 0.95 and eta_t 0.93 (ratio 0.979); a worn corner lowers the volumetric efficiency by 3
    # points to 0.92, where 0.93 / 0.92 = 1.011 would be a hydro-mechanical efficiency above 1: held at 1,
    # with a note (hand calculation).
    data = closed_loop()
    data["supplies"]["loop"]["pump"]["overall_efficiency"] = 0.93
    data["corners"] = {"worn": {"scale": {"pumps.volumetric_efficiency": "-3 %"}}}
    o = evaluate(Source("mem.yaml", data, b""))  # the whole run at the corner, no error
    assert [k.id for k in o.results.corners] == ["worn"]
    nominal = _results(data)
    r = next(x for x in nominal.supply_modes if x.mode == "driving")
    assert r["pump_hydromechanical_efficiency"] == pytest.approx(0.93 / 0.95)
    from specgen.corners import apply
    from specgen.intake.validate import build_with_corners
    from specgen.resolve.load import decide_directions
    from specgen.resolve.machine import resolve
    machine, corners = build_with_corners(Source("mem.yaml", data, b""), decide_directions)
    moved = resolve(apply(machine, corners[0]))
    v = next(x for x in moved.supply_modes if x.mode == "driving").values["pump_hydromechanical_efficiency"]
    assert v.value == 1.0 and "held at 1" in v.note
