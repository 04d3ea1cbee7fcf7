"""Skid steering of a tracked vehicle against the relations of Wong, Theory of Ground Vehicles,
skid-steer chapter, worked by hand for a carrier W = 80 kN, L = 2.0 m, B = 1.6 m, mu_t = 0.6, f_r = 0.08."""

import pytest

from specgen.calc import skid_steer


def test_turning_resistance_moment():
    # M_r = mu_t * W * L / 4 = 0.6 * 80 000 * 2.0 / 4 = 24 000 N*m (hand calculation)
    assert skid_steer.turning_moment(0.6, 80000.0, 2.0) == pytest.approx(24000.0)


def test_steady_turn_thrusts_inner_track_brakes():
    t = skid_steer.track_thrusts(80000.0, 0.08, 0.6, 2.0, 1.6)
    # F_outer = 0.08*40 000 + 24 000/1.6 = 3200 + 15 000 = 18 200 N; F_inner = 3200 - 15 000 = -11 800 N
    assert t.moment == pytest.approx(24000.0)
    assert t.outer == pytest.approx(18200.0)
    assert t.inner == pytest.approx(-11800.0)


def test_pivot_turn_both_tracks_need_the_outer_thrust():
    t = skid_steer.track_thrusts(80000.0, 0.08, 0.6, 2.0, 1.6, pivot=True)
    assert t.outer == pytest.approx(18200.0) and t.inner == pytest.approx(18200.0)


def test_gentle_turn_on_a_wide_tread_keeps_the_inner_track_driving():
    # B = 10 m: M_r/B = 24 000/10 = 2400 N < f_r*W/2 = 3200 N, so F_inner = 3200 - 2400 = 800 N (hand calculation)
    assert skid_steer.track_thrusts(80000.0, 0.08, 0.6, 2.0, 10.0).inner == pytest.approx(800.0)


def test_track_speeds_in_a_turn_and_a_pivot():
    # v 1 m/s, R 4 m, B 1.6 m: outer 1*(4.8)/4 = 1.2 m/s, inner 1*(3.2)/4 = 0.8 m/s (hand calculation)
    outer, inner = skid_steer.track_speeds(1.0, 4.0, 1.6)
    assert (outer, inner) == (pytest.approx(1.2), pytest.approx(0.8))
    assert skid_steer.track_speeds(0.3, None, 1.6) == (0.3, 0.3)
    assert skid_steer.track_speeds(1.0, 0.8, 1.6)[1] == 0.0  # R = B/2: the inner track stands still


def test_turn_radius_under_half_the_tread_is_refused():
    with pytest.raises(ValueError, match="pivot"):
        skid_steer.track_speeds(1.0, 0.7, 1.6)
