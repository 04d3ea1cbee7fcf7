import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from specgen.calc import variable

Q100 = 100 / 60_000  # 100 L/min in m^3/s


def test_choose_displacement_inside_range():
    # Hand calculation: Vg = q*eta_v/n = 1.66667e-3*0.95/20 = 7.91667e-5 m^3/rev.
    s = variable.choose_displacement(40e-6, 160e-6, Q100, 0.95, 20.0)
    assert s.displacement == pytest.approx(7.91667e-5, rel=1e-5)
    assert s.reaches_speed and s.speed == 20.0
    assert s.flow == pytest.approx(Q100)


def test_choose_displacement_clipped_at_maximum():
    # Hand calculation: ideal 1.583e-4 at 10 rev/s exceeds 1.2e-4 -> Vg_max, taking
    # 1.2e-4*10/0.95 = 1.26316e-3 m^3/s of the 1.6667e-3 available.
    s = variable.choose_displacement(40e-6, 120e-6, Q100, 0.95, 10.0)
    assert s.displacement == 120e-6
    assert s.reaches_speed
    assert s.flow == pytest.approx(1.26316e-3, rel=1e-5)


def test_choose_displacement_flags_speed_out_of_reach():
    # Hand calculation: at 50 rev/s ideal Vg = 3.1667e-5 < Vg_min 4e-5; at Vg_min the
    # motor reaches 1.66667e-3*0.95/4e-5 = 39.583 rev/s only.
    s = variable.choose_displacement(40e-6, 160e-6, Q100, 0.95, 50.0)
    assert s.displacement == 40e-6
    assert not s.reaches_speed
    assert s.speed == pytest.approx(39.583, rel=1e-4)


def test_choose_displacement_standstill_sets_maximum():
    # Definition: the largest displacement reaching zero speed is Vg_max.
    s = variable.choose_displacement(40e-6, 160e-6, Q100, 0.95, 0.0)
    assert (s.displacement, s.speed, s.reaches_speed) == (160e-6, 0.0, True)


@given(
    vg_min=st.floats(min_value=0.0, max_value=200e-6),
    span=st.floats(min_value=1e-6, max_value=400e-6),
    flow=st.floats(min_value=0.0, max_value=1e-2),
    speed=st.floats(min_value=0.01, max_value=100.0),
)
def test_choose_displacement_properties(vg_min, span, flow, speed):
    # Speed-flow relation n = q*eta_v/Vg: the setting lies in the range, never needs
    # more flow than available, and is the largest that does (or the flag is set).
    vg_max = vg_min + span
    s = variable.choose_displacement(vg_min, vg_max, flow, 0.9, speed)
    assert vg_min <= s.displacement <= vg_max
    assert s.flow <= flow * (1 + 1e-9)
    if s.reaches_speed:
        assert s.displacement == vg_max or s.displacement * speed / 0.9 == pytest.approx(flow, rel=1e-9)
    else:
        assert s.displacement == vg_min and s.speed < speed


def test_choose_displacement_rejects_inverted_range():
    with pytest.raises(ValueError, match="must not exceed"):
        variable.choose_displacement(200e-6, 100e-6, Q100, 0.95, 10.0)


def test_torque_at_relief_practical_units():
    # Textbook practical form T[N*m] = Vg[cm^3]*dp[bar]*eta_hm/62.83: 160*330*0.93/62.83 = 781.5 N*m.
    torque = variable.torque_at_relief(160e-6, 350e5, 20e5, 0.93)
    assert torque == pytest.approx(160 * 330 * 0.93 / 62.83, rel=1e-4)


def test_max_speed_at_min_displacement():
    # Textbook practical form n[rpm] = q[L/min]*1000*eta_v/Vg[cm^3] = 100*1000*0.95/40 = 2375 rpm.
    assert variable.max_speed_at_min_displacement(40e-6, Q100, 0.95) * 60 == pytest.approx(2375.0)
    # Hand: the speed rating caps it.
    assert variable.max_speed_at_min_displacement(40e-6, Q100, 0.95, speed_rating=35.0) == 35.0
    with pytest.raises(ValueError, match="unbounded speed"):
        variable.max_speed_at_min_displacement(0.0, Q100, 0.95)


def test_envelope_three_points():
    # Hand calculation at 40, 100, 160 cm^3, 100 L/min, eta_v 0.95, eta_hm 0.93, dp 330 bar:
    # speed 39.583, 15.833, 9.896 rev/s; torque 195.38, 488.45, 781.51 N*m.
    env = variable.torque_speed_envelope(40e-6, 160e-6, Q100, 0.95, 0.93, 350e5, 20e5, points=3)
    assert [p.displacement for p in env] == pytest.approx([40e-6, 100e-6, 160e-6])
    assert [p.speed for p in env] == pytest.approx([39.583, 15.833, 9.896], rel=1e-4)
    assert [p.torque for p in env] == pytest.approx([195.38, 488.45, 781.51], rel=1e-4)


def test_envelope_caps_speed_and_trades_torque_for_speed():
    # Motor relations: torque rises and speed falls with displacement; the rating caps speed.
    env = variable.torque_speed_envelope(0.0, 160e-6, Q100, 0.95, 0.93, 350e5, 20e5, speed_rating=50.0, points=9)
    speeds = [p.speed for p in env]
    torques = [p.torque for p in env]
    assert max(speeds) == 50.0 and env[0].speed_capped
    assert all(a >= b for a, b in zip(speeds, speeds[1:]))
    assert all(a < b for a, b in zip(torques, torques[1:]))
    assert env[0].torque == 0.0


def test_envelope_argument_checks():
    with pytest.raises(ValueError, match="unbounded speed"):
        variable.torque_speed_envelope(0.0, 160e-6, Q100, 0.95, 0.93, 350e5, 20e5)
    with pytest.raises(ValueError, match="points"):
        variable.torque_speed_envelope(40e-6, 160e-6, Q100, 0.95, 0.93, 350e5, 20e5, points=1)
    with pytest.raises(ValueError, match="relief pressure must exceed"):
        variable.torque_speed_envelope(40e-6, 160e-6, Q100, 0.95, 0.93, 20e5, 20e5)


def test_fixed_displacement_envelope_single_point():
    # Hand: Vg_min == Vg_max reduces to one point, speed 1.66667e-3*0.95/1e-4 = 15.833 rev/s.
    (point,) = variable.torque_speed_envelope(100e-6, 100e-6, Q100, 0.95, 0.93, 350e5, 20e5, points=1)
    assert point.speed == pytest.approx(15.8333, rel=1e-5)
    assert not math.isinf(point.speed)
