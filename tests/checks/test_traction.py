"""Traction checks at their pass / warn / fail boundaries: adhesion, tractive_envelope, wheel_spin.

The vehicle is the tracked carrier of tests/vehicles.py (hand calculations there): in a pivot turn each
track needs 18 200 N (Wong, Theory of Ground Vehicles, skid-steer chapter), so the vehicle's effort is
2 * 18 200 = 36 400 N; the weight on the tracks is 80 kN, so the adhesion limit is mu * 80 000 N
(Coulomb friction). Default traction warn margin 10 % (specgen/intake/defaults.py).
"""

import pytest

from helpers import spec_check, spec_checks
from vehicles import carrier, straight


# ---------------------------------------------------------------- adhesion

@pytest.mark.parametrize("mu, status", [
    # margin = (mu * 80 000 - 36 400) / (mu * 80 000) (hand calculation)
    (0.75, "pass"),   # (60 000 - 36 400)/60 000 = 39.3 %
    (0.51, "pass"),   # (40 800 - 36 400)/40 800 = 10.8 %
    (0.50, "warn"),   # (40 000 - 36 400)/40 000 = 9.0 %
    (0.46, "warn"),   # (36 800 - 36 400)/36 800 = 1.1 %
    (0.45, "fail"),   # (36 000 - 36 400)/36 000 = -1.1 %: the tracks slip
])
def test_adhesion_boundaries(mu, status):
    c = spec_check(carrier(adhesion=mu), "adhesion", drive="track_left", duty="pivot")
    assert c.status == status
    assert c.value == pytest.approx(36400.0, rel=1e-6) and c.limit == pytest.approx(mu * 80000.0, rel=1e-9)
    assert c.margin == pytest.approx((mu * 80000 - 36400) / (mu * 80000), abs=1e-6)


def test_adhesion_checks_a_braking_inner_track_too():
    # steady turn: the inner track brakes with 11 800 N, as a vehicle 23 600 N; mu 0.3: 24 000 N,
    # margin (24 000 - 23 600)/24 000 = 1.7 % -> warn
    d = carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "4 m", "speed": "0.5 m/s"}}}},
                adhesion=0.3)
    c = spec_check(d, "adhesion", drive="track_right", duty="turn")
    assert c.status == "warn" and "braking effort" in c.message
    assert c.margin == pytest.approx(400 / 24000, abs=1e-6)


# ---------------------------------------------------------------- tractive_envelope

@pytest.mark.parametrize("torque, status", [
    # both sprockets at 1 m/s (38.1972 rpm on r 0.25 m); effort = T_L / 0.25 * 2; the engine power line there:
    # 0.722 * 50 000 / 1 = 36 100 N; margin = (36 100 - F) / 36 100 (hand calculation)
    ("4000 N*m", "pass"),  # F 32 000 N: 11.4 %
    ("4100 N*m", "warn"),  # F 32 800 N: 9.1 %
    ("4500 N*m", "warn"),  # F 36 000 N: 0.28 %
    ("4520 N*m", "fail"),  # F 36 160 N: -0.17 %
])
def test_envelope_boundaries_under_the_engine_power_line(torque, status):
    c = spec_check(carrier(straight(torque, "38.1972 rpm")), "tractive_envelope", drive="track_left", duty="go")
    assert c.status == status
    assert c.limit == pytest.approx(36100.0, rel=1e-5)
    assert "the engine's power" in c.message


def test_envelope_under_the_pressure_limit():
    # pivot at 0.3 m/s: F 36 400 N against the effort at the pressure limit 44 451.98 N:
    # margin (44 451.98 - 36 400)/44 451.98 = 18.1 % -> pass, named the drives' pressure limit
    c = spec_check(carrier(), "tractive_envelope", drive="track_left", duty="pivot")
    assert c.status == "pass" and "pressure limit" in c.message
    assert c.margin == pytest.approx((44451.98 - 36400) / 44451.98, abs=1e-6)


def test_envelope_above_the_top_speed_fails_on_flow():
    # 1.1 m/s (42.0169 rpm) against the top speed 1.06323 m/s: margin (1.06323 - 1.1)/1.06323 = -3.5 %
    c = spec_check(carrier(straight("1 kN*m", "42.0169 rpm")), "tractive_envelope", drive="track_left", duty="go")
    assert c.status == "fail" and c.kind == "velocity"
    assert c.margin == pytest.approx((1.06323 - 1.1) / 1.06323, abs=1e-4)
    assert "top travel speed" in c.message


def test_braking_duty_point_is_not_judged_against_the_envelope():
    d = carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "4 m", "speed": "0.5 m/s"}}}})
    assert spec_checks(d, "tractive_envelope", drive="track_right", duty="turn") == []
    assert len(spec_checks(d, "tractive_envelope", drive="track_left", duty="turn")) == 1


# ---------------------------------------------------------------- wheel_spin (informative)

@pytest.mark.parametrize("mu, can_spin", [
    # effort at the pressure limit 44 451.98 N against mu * 80 000 N (hand calculation)
    (0.55, True),    # 44 000 N: the tracks can be spun
    (0.56, False),   # 44 800 N: 0.8 % of the grip out of reach
])
def test_wheel_spin_says_whether_the_tracks_can_be_spun(mu, can_spin):
    c = spec_check(carrier(adhesion=mu), "wheel_spin")
    assert c.status == "pass" and c.margin is None
    assert c.value == pytest.approx(44451.98, abs=0.01) and c.limit == pytest.approx(mu * 80000)
    assert ("can be spun" in c.message) is can_spin
    assert ("cannot be spun, and 1% of the grip" in c.message) is not can_spin


def test_no_travel_block_no_traction_checks():
    from helpers import minimal
    checks = [c.id for c in spec_checks(minimal(), "adhesion") + spec_checks(minimal(), "wheel_spin")]
    assert checks == []
