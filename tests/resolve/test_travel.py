"""The machine as a vehicle, resolved from a spec: each figure against the hand calculations in
tests/vehicles.py (motor torque relation, gear-stage balance, Coulomb adhesion, power balance; Wong,
Theory of Ground Vehicles, for the turn)."""

import pytest

from specgen.intake.read import Source
from specgen.pipeline import evaluate
from vehicles import carrier, straight


def travel_of(data):
    return evaluate(Source("mem.yaml", data, b"")).results.travel


def test_no_travel_block_no_travel_result():
    d = carrier()
    del d["travel"]
    d["drives"]["track_left"]["duty_points"] = d["drives"]["track_right"]["duty_points"] = straight(
        "1 kN*m", "10 rpm")
    d["modes"] = {"go": {"drives": {"track_left": "go", "track_right": "go"}}}
    assert travel_of(d) is None


def test_vehicle_values_by_hand():
    tr = travel_of(carrier())
    # per track 1500e-6 * 245e5 * 0.95 / (2*pi) / 0.25 = 22 225.99 N; both 44 451.98 N
    assert tr.per_drive["track_left"]["relief_effort"].value == pytest.approx(22225.99, abs=0.01)
    assert tr["relief_effort"] == pytest.approx(44451.98, abs=0.01)
    # adhesion 0.75 * 80 000 N = 60 000 N
    assert tr["adhesion_limit"] == pytest.approx(60000.0)
    # eta_total = pump 0.8 * motor 0.95 * 0.95 (no gear stage) = 0.722
    assert tr["transmission_efficiency"] == pytest.approx(0.722)
    assert tr["engine_power"] == 50e3
    # flow per track: 75e-6 m^3 * 30 rev/s * 0.95 / 2 = 1.06875e-3 m^3/s; the flow fills 1500 cm^3 (fixed):
    # top speed 2*pi*0.25 * 1.06875e-3 * 0.95 / 1.5e-3 = 1.06323 m/s
    assert tr.per_drive["track_left"]["travel_flow"].value == pytest.approx(1.06875e-3)
    assert tr["top_speed"] == pytest.approx(1.06323, abs=1e-5)
    # F_max = min(44 451.98, 60 000); corner power 44 451.98 * 1.06323 = 47 263 W; ratio 47 263 / 50 000 = 0.9453
    assert tr["max_effort"] == pytest.approx(44451.98, abs=0.01)
    assert tr["corner_power"] == pytest.approx(47263.0, abs=1.0)
    assert tr["corner_power_ratio"] == pytest.approx(0.9453, abs=1e-4)


def test_pivot_duty_point_on_the_envelope():
    tr = travel_of(carrier())
    u = tr.duties[("track_left", "pivot")]
    # ground speed 0.3 m/s (the track speed of the pivot), effort 18 200 N * 2 tracks = 36 400 N
    assert u["ground_speed"].value == pytest.approx(0.3)
    assert u["tractive_effort"].value == pytest.approx(36400.0, rel=1e-6)
    # at 0.3 m/s: relief 44 451.98 N < power 0.722 * 50 000 / 0.3 = 120 333 N
    assert u["envelope_effort"].value == pytest.approx(44451.98, abs=0.01)
    assert tr.lines[("track_left", "pivot")] == "relief"


def test_engine_power_sets_the_envelope_at_speed():
    # both sprockets at 1 m/s: n = 1/(2*pi*0.25) = 0.63662 rev/s = 38.1972 rpm
    tr = travel_of(carrier(straight("4 kN*m", "38.1972 rpm")))
    u = tr.duties[("track_left", "go")]
    assert u["ground_speed"].value == pytest.approx(1.0, abs=1e-5)
    # effort 4000 / 0.25 * 2 = 32 000 N; envelope 0.722 * 50 000 / 1.0 = 36 100 N, set by the engine power
    assert u["tractive_effort"].value == pytest.approx(32000.0)
    assert u["envelope_effort"].value == pytest.approx(36100.0, rel=1e-5)
    assert tr.lines[("track_left", "go")] == "engine power"


def test_inner_track_braking_has_no_envelope_and_counts_for_adhesion():
    d = carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "4 m", "speed": "0.5 m/s"}}}})
    tr = travel_of(d)
    inner = tr.duties[("track_right", "turn")]
    # |F_inner| 11 800 N * 2 = 23 600 N braking; inner track speed 0.5 * 3.2 / 4 = 0.4 m/s
    assert inner["tractive_effort"].value == pytest.approx(23600.0, rel=1e-6)
    assert inner["ground_speed"].value == pytest.approx(0.4)
    assert "envelope_effort" not in inner and tr.lines[("track_right", "turn")] is None


def test_driven_mass_and_assumed_adhesion():
    tr = travel_of(carrier(adhesion=None, running_gear="tracks", driven_mass=f"{60000 / 9.80665} kg"))
    # tracks assumed at 0.7 (low end of 0.7-0.9, from memory): 0.7 * 60 000 N = 42 000 N, marked assumed
    assert tr["adhesion_limit"] == pytest.approx(42000.0)
    assert tr.values["adhesion_limit"].assumed


def test_mode_given_is_the_one_named():
    d = carrier()
    d["travel"]["mode"] = "pivot"
    assert travel_of(d)["engine_power"] == 50e3


def test_assumed_adhesion_is_listed_with_the_assumed_values():
    o = evaluate(Source("mem.yaml", carrier(adhesion=None), b""))
    assert ("travel", "adhesion") in [i.where for i in o.results.assumed()]
