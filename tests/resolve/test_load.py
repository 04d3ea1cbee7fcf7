"""Load models wired into the spec: a rope pull, a grade, a belt pull or a fan curve gives the motor
torque, pressure and speed, and the load's sign decides which way it runs. Each figure is checked
against a hand calculation written beside it."""

import math

import pytest

from helpers import minimal
from specgen.errors import SpecError
from specgen.pipeline import evaluate
from specgen.intake.model import BeltLoad, DutyPoint, WheelLoad, WinchLoad
from specgen.intake.read import Source
from specgen.resolve.load import decide_directions, duty_direction

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


def duty(load, direction=None):
    return DutyPoint(id="u", title="u", torque=None, speed=None, direction=direction, starting_torque=None, load=load)


def wheel(grade_percent):
    return WheelLoad(vehicle_mass=12000.0, rolling_resistance=0.05, grade=math.atan(grade_percent / 100),
                     rolling_radius=0.6, driven_wheels=4, travel_speed=2.0)


def test_the_load_sign_decides_the_direction_and_refuses_a_contradiction():
    # F = m*g*(c_rr*cos(theta) + sin(theta)): -20 %: 12000*9.80665*(0.05*0.98058 - 0.19612) = -17 310 N < 0;
    # +10 %: 12000*9.80665*(0.05*0.99504 + 0.09950) = 17 564 N > 0 (vehicle dynamics textbook relation)
    assert duty_direction(duty(wheel(-20))) == ("overrunning", None)
    assert duty_direction(duty(wheel(-20), "overrunning")) == ("overrunning", None)
    direction, refused = duty_direction(duty(wheel(-20), "driving"))
    assert direction == "overrunning" and refused.startswith("the load model gives a negative torque here")
    assert duty_direction(duty(wheel(10))) == ("driving", None)
    direction, refused = duty_direction(duty(wheel(10), "overrunning"))
    assert refused == ("the load model gives a driving torque here; an overrunning wheel load needs a negative "
                       "force (downhill, braking)")
    # a belt carries its sign in the pull; a winch and a duty point without a load keep what was written
    assert duty_direction(duty(BeltLoad(-3000.0, 0.5, 1.5)))[0] == "overrunning"
    assert duty_direction(duty(BeltLoad(3000.0, 0.5, 1.5), "overrunning"))[1] is not None
    assert duty_direction(duty(WinchLoad(20e3, 0.5, 0.4, 0.016, 3), "overrunning")) == ("overrunning", None)
    assert duty_direction(duty(None)) == ("driving", None)


def test_decided_directions_reach_the_model_and_contradictions_name_their_place():
    data = wheel_spec("-20 %", direction="driving")
    from specgen.intake.validate import build

    with pytest.raises(SpecError) as e:
        build(Source("mem.yaml", data, b""), decide_directions)
    assert [p.path for p in e.value.problems] == ["drives.hoist.duty_points.lift.direction"]
    machine = build(Source("mem.yaml", wheel_spec("-20 %"), b""), decide_directions)
    assert machine.drive("hoist").duty("lift").direction == "overrunning"
    # without the decision the model keeps what the spec wrote: nothing
    undecided = build(Source("mem.yaml", wheel_spec("-20 %"), b""), lambda m: (m, []))
    assert undecided.drive("hoist").duty("lift").direction is None


# ---------------------------------------------------------------- track_turn (skid steering)
# Hand calculations in tests/vehicles.py (Wong, Theory of Ground Vehicles, skid-steer chapter):
# W 80 kN, L 2.0 m, B 1.6 m, mu_t 0.6, f_r 0.08, r 0.25 m.

def test_pivot_turn_gives_both_track_motors_the_outer_thrust():
    from vehicles import carrier
    o = outcome(carrier())
    for drive in ("track_left", "track_right"):
        r = o.results.duty(drive, "pivot")
        assert r.direction == "driving"
        assert r["turning_moment"] == pytest.approx(24000.0, rel=1e-6)  # 0.6*80 000*2.0/4
        assert r["outer_track_thrust"] == pytest.approx(18200.0, rel=1e-6)  # 3200 + 15 000
        assert r["load_torque"] == pytest.approx(4550.0, rel=1e-6)  # 18 200 * 0.25
        assert r["load_speed"] == pytest.approx(0.3 / (2 * math.pi * 0.25))


def test_steady_turn_inner_track_overruns():
    from vehicles import carrier
    o = outcome(carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "4 m",
                                                                 "speed": "0.5 m/s"}}}}))
    inner = o.results.duty("track_right", "turn")
    assert inner.direction == "overrunning"
    assert inner["inner_track_thrust"] == pytest.approx(-11800.0, rel=1e-6)  # 3200 - 15 000: brakes
    assert inner["load_torque"] == pytest.approx(2950.0, rel=1e-6)  # 11 800 * 0.25
    assert inner["track_speed"] == pytest.approx(0.4)  # 0.5 * (4 - 0.8) / 4
    outer = o.results.duty("track_left", "turn")
    assert outer.direction == "driving" and outer["track_speed"] == pytest.approx(0.6)  # 0.5 * 4.8 / 4


def test_writing_driving_for_a_braking_inner_track_is_refused():
    from vehicles import carrier
    d = carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "4 m", "speed": "0.5 m/s"}}}})
    d["drives"]["track_right"]["duty_points"]["turn"]["direction"] = "driving"
    with pytest.raises(SpecError, match="negative torque"):
        outcome(d)


def test_the_turn_is_needed_from_rest_too():
    from vehicles import carrier
    r = outcome(carrier()).results.duty("track_left", "pivot")
    assert r["static_load_torque"] == pytest.approx(4550.0, rel=1e-6)
