"""The two invented vehicles in tests/specs/, end to end: the tracked carrier whose pivot turn, not its
bank climb, sizes the track motors, and the wheeled tug that works near its adhesion limit."""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from specgen.pipeline import run_file

SPECS = Path(__file__).resolve().parent / "specs"
G = 9.80665  # standard gravity, CGPM 1901


def test_the_pivot_turn_sizes_the_carrier_track_motors():
    o = run_file(SPECS / "swamp_carrier.yaml")
    r = o.results
    # pivot (Wong, Theory of Ground Vehicles, skid-steer chapter): W = 8000 * 9.80665 = 78 453 N,
    # M_r = 0.6 * 78 453 * 2 / 4 = 23 536 N*m, F = 0.08 * 78 453 / 2 + 23 536 / 1.6 = 3138.1 + 14 709.9 = 17 848 N,
    # sprocket torque 17 848 * 0.25 = 4462 N*m
    w = 8000 * G
    f_pivot = 0.08 * w / 2 + 0.6 * w * 2 / 4 / 1.6
    assert r.duty("track_left", "pivot")["load_torque"] == pytest.approx(f_pivot * 0.25, rel=1e-9)
    assert f_pivot * 0.25 == pytest.approx(4462.0, abs=1.0)
    # the 30 % bank: F = m*g*(0.08*cos + sin) = 78 453 * (0.08 * 0.95783 + 0.28735) = 28 555 N, per track
    # 14 277 N, sprocket torque 3569 N*m: less than the turn
    theta = math.atan(0.30)
    climb = w * (0.08 * math.cos(theta) + math.sin(theta)) / 2 * 0.25
    assert r.duty("track_left", "climb")["load_torque"] == pytest.approx(climb, rel=1e-9)
    assert climb < f_pivot * 0.25
    sizing = r.drive_result("track_left").values["minimum_displacement"]
    assert sizing.note == "governing duty point: pivot"
    # the steady turn brakes the inner track: overrunning, held by the brake valve
    assert r.duty("track_right", "turn").direction == "overrunning"
    assert r.verdict != "fail"


def test_the_tug_pushes_near_its_adhesion_limit_and_can_spin_its_wheels():
    o = run_file(SPECS / "yard_tug.yaml")
    by = {(c.id, c.drive, c.duty): c for c in o.results.checks}
    # adhesion 0.45 * 4000 kg * 9.80665 = 17 652 N; pushing 3.2 kN*m / 0.4 m * 2 wheels = 16 000 N:
    # margin (17 652 - 16 000) / 17 652 = 9.4 % -> warn (hand calculation)
    push = by[("adhesion", "wheel_left", "push")]
    assert push.status == "warn" and push.margin == pytest.approx((17652.0 - 16000.0) / 17652.0, abs=1e-4)
    # at the relief: 2 * 110e-6 * 345e5 * 0.92 / (2*pi) * 8 * 0.96 / 0.4 = 21 338 N > 17 652 N: the wheels spin
    spin = by[("wheel_spin", None, None)]
    assert spin.value == pytest.approx(21337.9, abs=0.5) and "can be spun" in spin.message
    # along the road the engine's power limits: 0.87 * 0.95 * 0.92 * 0.96 * 75 kW / v
    road = by[("tractive_envelope", "wheel_left", "road")]
    assert road.status == "warn" and "engine's power" in road.message
