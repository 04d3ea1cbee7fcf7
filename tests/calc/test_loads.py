import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from specgen.calc import loads


# --- winch -------------------------------------------------------------------


def test_winch_first_layer_radius_is_drum_plus_half_rope():
    # Hand calculation: rope centreline on layer 1 sits d_rope/2 above the drum:
    # d_eff = 0.300 + 0.012 = 0.312 m.
    assert loads.winch_effective_diameter(0.300, 0.012, 1) == pytest.approx(0.312)


def test_winch_torque_and_speed_on_third_layer():
    # Hand calculation: d_eff = 0.4 + (2*3 - 1)*0.016 = 0.48 m;
    # T = 50e3 * 0.24 = 12 000 N*m; n = 0.5 / (pi*0.48) = 0.331573 rev/s.
    load = loads.winch_load(50e3, 0.5, 0.4, 0.016, 3)
    assert load.torque == pytest.approx(12_000.0)
    assert load.speed == pytest.approx(0.331573, rel=1e-6)
    # Hand calculation: P = F*v = 50e3*0.5 = 25 kW must equal 2*pi*n*T.
    assert load.power == pytest.approx(25_000.0)


@given(
    layer=st.integers(min_value=1, max_value=12),
    pull=st.floats(min_value=1.0, max_value=1e6),
    drum=st.floats(min_value=0.05, max_value=3.0),
    rope=st.floats(min_value=0.002, max_value=0.08),
)
def test_winch_torque_grows_and_speed_falls_with_layer(layer, pull, drum, rope):
    # Rope-drum geometry: each layer adds one rope diameter to d_eff, so torque
    # rises and drum speed falls for the same pull and line speed.
    inner = loads.winch_load(pull, 1.0, drum, rope, layer)
    outer = loads.winch_load(pull, 1.0, drum, rope, layer + 1)
    assert outer.torque > inner.torque
    assert outer.speed < inner.speed
    # Hand calculation: the torque step per layer is exactly F*d_rope.
    assert outer.torque - inner.torque == pytest.approx(pull * rope, rel=1e-9)


@pytest.mark.parametrize("layer", [0, -1, 1.5, True])
def test_winch_rejects_bad_layer(layer):
    with pytest.raises(ValueError, match="layer"):
        loads.winch_effective_diameter(0.4, 0.016, layer)


@pytest.mark.parametrize("args", [(-0.4, 0.016), (0.4, 0.0), (0.4, -0.01)])
def test_winch_rejects_non_physical_diameters(args):
    with pytest.raises(ValueError, match="diameter"):
        loads.winch_effective_diameter(*args, 1)


def test_winch_rejects_negative_pull():
    with pytest.raises(ValueError, match="line pull"):
        loads.winch_drum_torque(-1.0, 0.4, 0.016)


# --- wheel or track ----------------------------------------------------------


def test_grade_helpers():
    # Trigonometry: 100 % grade is 45 degrees; 0 % is level.
    assert loads.grade_angle_from_percent(100.0) == pytest.approx(math.pi / 4)
    assert loads.grade_angle_from_percent(0.0) == 0.0
    assert loads.grade_angle_from_degrees(30.0) == pytest.approx(math.pi / 6)
    assert loads.grade_angle_from_percent(-10.0) == pytest.approx(-math.atan(0.1))


@pytest.mark.parametrize("degrees", [90.0, -90.0, 120.0, float("nan")])
def test_grade_degrees_out_of_range(degrees):
    with pytest.raises(ValueError):
        loads.grade_angle_from_degrees(degrees)


def test_tractive_force_level_ground_is_rolling_resistance():
    # Hand calculation: F = m*g*c_rr = 8000 * 9.80665 * 0.03 = 2353.596 N.
    assert loads.tractive_force(8000, 0.03, 0.0) == pytest.approx(2353.596)


def test_tractive_force_frictionless_30_degree_slope():
    # Hand calculation: F = m*g*sin(30 deg) = 1000 * 9.80665 * 0.5 = 4903.325 N.
    assert loads.tractive_force(1000, 0.0, math.radians(30)) == pytest.approx(4903.325)


def test_tractive_force_grade_rolling_and_acceleration():
    # Hand calculation, 12 t, c_rr 0.05, 10 % grade, 0.2 m/s^2:
    # cos = 1/sqrt(1.01) = 0.995037, sin = 0.1/sqrt(1.01) = 0.0995037;
    # 12000*9.80665*(0.05*0.995037 + 0.0995037) = 17 564.4; + 12000*0.2 = 19 964.4 N.
    force = loads.tractive_force(12000, 0.05, loads.grade_angle_from_percent(10.0), 0.2)
    assert force == pytest.approx(19_964.4, rel=1e-5)


def test_tractive_force_downhill_can_overrun():
    # Hand calculation: 20 % downhill, c_rr 0.02: 0.02*0.98058 - 0.19612 < 0, the load pushes.
    assert loads.tractive_force(5000, 0.02, loads.grade_angle_from_percent(-20.0)) < 0.0


def test_wheel_load_per_wheel():
    # Hand calculation: T = 19 964 * 0.6 / 4 = 2994.6 N*m; n = 2 / (2*pi*0.6) = 0.530516 rev/s.
    wheel = loads.wheel_load(19_964.0, 0.6, 4, 2.0)
    assert wheel.torque == pytest.approx(2994.6)
    assert wheel.speed == pytest.approx(0.530516, rel=1e-6)


@pytest.mark.parametrize("count", [0, 2.5, -1])
def test_wheel_count_must_be_whole(count):
    with pytest.raises(ValueError, match="wheel count"):
        loads.wheel_load(1000.0, 0.5, count, 1.0)


def test_tractive_force_rejects_zero_mass():
    with pytest.raises(ValueError, match="mass"):
        loads.tractive_force(0.0, 0.02, 0.0)


# --- belt, speed-squared -----------------------------------------------------


def test_belt_load():
    # Hand calculation: T = 8000 * 0.25 = 2000 N*m; n = 1.5 / (pi*0.5) = 0.954930 rev/s.
    belt = loads.belt_load(8000.0, 0.5, 1.5)
    assert belt.torque == pytest.approx(2000.0)
    assert belt.speed == pytest.approx(0.954930, rel=1e-6)
    # Hand calculation: power = F*v = 12 kW.
    assert belt.power == pytest.approx(12_000.0)


def test_speed_squared_torque():
    # Affinity laws: torque ~ n^2; 400 N*m at 20 rev/s -> 400*(15/20)^2 = 225 N*m.
    assert loads.speed_squared_torque(400.0, 20.0, 15.0) == pytest.approx(225.0)
    # Hand calculation: doubling the speed quadruples the torque.
    assert loads.speed_squared_torque(10.0, 5.0, 10.0) == pytest.approx(40.0)


def test_speed_squared_rejects_zero_reference_speed():
    with pytest.raises(ValueError, match="reference speed"):
        loads.speed_squared_torque(10.0, 0.0, 1.0)


# --- inertia -----------------------------------------------------------------


def test_acceleration_torque():
    # Hand calculation: alpha = 2*pi*0.5/2 = 1.570796 rad/s^2; T = 40 * 1.570796 = 62.8319 N*m.
    assert loads.acceleration_torque(40.0, 0.5, 2.0) == pytest.approx(62.8319, rel=1e-6)


def test_refer_inertia():
    # Kinetic-energy equality across an ideal gear: 40 / 20^2 = 0.1 kg*m^2.
    assert loads.refer_inertia(40.0, 20.0) == pytest.approx(0.1)


def test_motor_acceleration_torque_matches_energy_balance():
    # Hand calculation by power balance at the end of the ramp:
    # omega_m = 2*pi*10 = 62.832 rad/s, alpha_m = 31.416 rad/s^2,
    # omega_l = 2*pi*0.5 = 3.1416 rad/s, alpha_l = 1.5708 rad/s^2.
    # T_m*omega_m = J_m*alpha_m*omega_m + J_l*alpha_l*omega_l/eta
    # T_m = 0.02*31.416 + 40*1.5708*3.1416/(0.9*62.832) = 0.62832 + 3.49066 = 4.11898 N*m.
    torque = loads.motor_acceleration_torque(40.0, 20.0, 0.5, 2.0, motor_side_inertia=0.02, gear_efficiency=0.9)
    assert torque == pytest.approx(4.11898, rel=1e-5)


def test_motor_acceleration_torque_without_gear_losses():
    # Hand calculation: (0.02 + 0.1) * 2*pi*10/2 = 3.769911 N*m.
    assert loads.motor_acceleration_torque(40.0, 20.0, 0.5, 2.0, 0.02) == pytest.approx(3.769911, rel=1e-6)


@pytest.mark.parametrize("ramp", [0.0, -1.0])
def test_zero_or_negative_ramp_time_rejected(ramp):
    with pytest.raises(ValueError, match="ramp time"):
        loads.acceleration_torque(1.0, 1.0, ramp)


def test_gear_efficiency_above_one_rejected():
    with pytest.raises(ValueError, match="gear efficiency"):
        loads.motor_acceleration_torque(1.0, 2.0, 1.0, 1.0, gear_efficiency=1.1)
