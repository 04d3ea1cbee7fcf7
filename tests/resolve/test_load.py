"""Load models wired into the spec: a rope pull, a grade, a belt pull or a fan curve gives the motor
torque, pressure and speed. Each figure is checked against a hand calculation written beside it."""

import math

import pytest

from helpers import minimal
from specgen.errors import SpecError
from specgen.pipeline import evaluate
from specgen.intake.read import Source

G = 9.80665  # standard gravity, CGPM 1901


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def winch_spec(direction=None, inertia=None):
    d = minimal()
    hoist = d["drives"]["hoist"]
    hoist["gear_stage"] = {"ratio": 25, "efficiency": 0.95}
    hoist["load_holding"] = "counterbalance_valve"
    duty = {"load": {"winch": {"line_pull": "20 kN", "line_speed": "0.5 m/s", "drum_diameter": "400 mm",
                               "rope_diameter": "16 mm", "layer": 3}}}
    if direction:
        duty["direction"] = direction
    if inertia:
        duty["inertia"] = inertia
    hoist["duty_points"] = {"lift": duty}
    return d


def test_rope_pull_gives_the_motor_pressure_an_engineer_expects():
    o = outcome(winch_spec())
    r = o.results.duty("hoist", "lift")
    # Hand calc (winch drum: lever arm to the rope centreline on layer 3):
    # d_eff = 0.400 + (2*3 - 1)*0.016 = 0.480 m; T_drum = 20 kN * 0.240 m = 4800 N*m
    # n_drum = 0.5 / (pi*0.48) = 0.33157 rev/s = 19.894 rpm; motor n = 25 * 19.894 = 497.4 rpm
    # T_motor = 4800 / (25*0.95) = 202.11 N*m; dp = 2*pi*202.11 / (100e-6*0.9) = 141.10 bar; + 5 bar back
    assert r["rope_pitch_diameter"] == pytest.approx(0.480)
    assert r["load_torque"] == pytest.approx(4800.0)
    assert r["motor_speed"] * 60 == pytest.approx(25 * 0.5 / (math.pi * 0.48) * 60, rel=1e-9)
    assert r["motor_torque"] == pytest.approx(4800 / 23.75)
    assert r["inlet_pressure"] / 1e5 == pytest.approx(141.10 + 5.0, abs=0.01)
    # the load torque's trace carries the model's inputs
    symbols = {i.symbol for i in r.values["load_torque"].inputs}
    assert symbols == {"F", "d_drum", "d_rope", "layer"}
    assert "winch" in r.values["load_torque"].source


def test_lowering_is_overrunning_and_brakes_with_the_gear_efficiency():
    o = outcome(winch_spec(direction="overrunning"))
    r = o.results.duty("hoist", "lift")
    assert r.direction == "overrunning"
    # overrunning: T_motor = T_L * eta_g / i = 4800*0.95/25 = 182.4 N*m
    assert r["motor_torque"] == pytest.approx(182.4)
    assert [c.status for c in o.results.checks if c.id == "load_holding"] == ["pass"]


def test_inertia_adds_acceleration_torque_referred_through_the_gear():
    o = outcome(winch_spec(inertia={"load_inertia": "40 kg*m^2", "motor_inertia": "0.02 kg*m^2", "ramp_time": "2 s"}))
    r = o.results.duty("hoist", "lift")
    n_m = 25 * 0.5 / (math.pi * 0.48)  # rev/s
    # T_acc = (J_m + J_L/(i^2*eta_g)) * 2*pi*n_m / t = (0.02 + 40/(625*0.95)) * 2*pi*8.289/2 (Newton, rotation)
    t_acc = (0.02 + 40 / (625 * 0.95)) * 2 * math.pi * n_m / 2
    assert r["acceleration_torque"] == pytest.approx(t_acc)
    assert r["motor_torque"] == pytest.approx(4800 / 23.75 + t_acc)


def wheel_spec(grade, direction=None):
    d = minimal()
    duty = {"load": {"wheel": {"vehicle_mass": "12 t", "rolling_resistance": 0.05, "grade": grade,
                               "acceleration": "0.2 m/s^2", "rolling_radius": "0.6 m", "driven_wheels": 4,
                               "travel_speed": "2 m/s"}}}
    if direction:
        duty["direction"] = direction
    d["drives"]["hoist"]["gear_stage"] = {"ratio": 40, "efficiency": 0.96}
    d["drives"]["hoist"]["load_holding"] = "brake_valve"
    d["drives"]["hoist"]["duty_points"] = {"lift": duty}
    return d


def test_wheel_on_a_grade_in_percent_and_in_degrees():
    # F = m*g*(c_rr*cos(theta) + sin(theta)) + m*a, theta = atan(0.10):
    # 12000*9.80665*(0.05*0.99504 + 0.09950) + 12000*0.2 = 19 964 N; per wheel T = F*0.6/4 = 2994.6 N*m;
    # n = 2/(2*pi*0.6) = 0.5305 rev/s (vehicle dynamics textbook relations)
    theta = math.atan(0.10)
    force = 12000 * G * (0.05 * math.cos(theta) + math.sin(theta)) + 12000 * 0.2
    r = outcome(wheel_spec("10 %")).results.duty("hoist", "lift")
    assert r["tractive_force"] == pytest.approx(force) and round(force) == 19964
    assert r["load_torque"] == pytest.approx(force * 0.6 / 4)
    assert r["load_speed"] == pytest.approx(2 / (2 * math.pi * 0.6))
    r_deg = outcome(wheel_spec(f"{math.degrees(theta)} deg")).results.duty("hoist", "lift")
    assert r_deg["load_torque"] == pytest.approx(force * 0.6 / 4, rel=1e-9)


def test_downhill_turns_overrunning_by_itself_and_refuses_a_contradiction():
    # -20 % grade: sin term dominates, F < 0, so the vehicle drives the motors
    o = outcome(wheel_spec("-20 %"))
    r = o.results.duty("hoist", "lift")
    assert r.direction == "overrunning" and r.values["tractive_force"].value < 0
    assert r["load_torque"] > 0  # the magnitude is carried, the direction says who drives
    with pytest.raises(SpecError) as e:
        outcome(wheel_spec("-20 %", direction="driving"))
    assert "direction" in str(e.value) and "overrunning" in str(e.value)


def test_belt_and_speed_squared_loads():
    d = minimal()
    d["drives"]["hoist"]["duty_points"] = {
        "belt": {"load": {"belt": {"belt_pull": "8 kN", "pulley_diameter": "0.5 m", "belt_speed": "1.5 m/s"}}},
        "fan": {"load": {"speed_squared": {"reference_torque": "400 N*m", "reference_speed": "1200 rpm",
                                           "speed": "900 rpm"}}},
    }
    d["modes"]["work"]["drives"]["hoist"] = "belt"
    o = outcome(d)
    b, f = o.results.duty("hoist", "belt"), o.results.duty("hoist", "fan")
    # belt: T = 8000*0.25 = 2000 N*m; n = 1.5/(pi*0.5) = 0.9549 rev/s (conveyor pulley relations)
    assert b["load_torque"] == pytest.approx(2000.0) and b["load_speed"] == pytest.approx(1.5 / (math.pi * 0.5))
    # affinity law: T = 400*(900/1200)^2 = 225 N*m
    assert f["load_torque"] == pytest.approx(225.0)


def test_torque_and_load_together_is_refused_with_its_location():
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["load"] = {"belt": {"belt_pull": "8 kN", "pulley_diameter": "0.5 m",
                                                                    "belt_speed": "1.5 m/s"}}
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "drives.hoist.duty_points.lift.torque: give torque and speed, or a load block, not both" in str(e.value)


def test_two_load_models_and_a_grade_without_unit_are_refused():
    d = wheel_spec("8 %")
    d["drives"]["hoist"]["duty_points"]["lift"]["load"]["belt"] = {"belt_pull": "8 kN", "pulley_diameter": "0.5 m",
                                                                   "belt_speed": "1.5 m/s"}
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "exactly one load model" in str(e.value)
    with pytest.raises(SpecError) as e:
        outcome(wheel_spec(8))
    assert "load.wheel.grade" in str(e.value)
    with pytest.raises(SpecError) as e:
        outcome(wheel_spec("8"))
    assert "load.wheel.grade" in str(e.value) and "'8 %'" in str(e.value)


def test_a_wrong_unit_in_a_load_model_names_the_field():
    d = winch_spec()
    d["drives"]["hoist"]["duty_points"]["lift"]["load"]["winch"]["line_pull"] = "20 kN*m"
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "duty_points.lift.load.winch.line_pull" in str(e.value) and "force" in str(e.value)
