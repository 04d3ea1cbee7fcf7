"""Small vehicles to compute by hand: a tracked carrier and its duty points, as spec data.

The carrier: W = 80 kN (m = 80 000 / 9.80665 = 8157.66 kg), track contact length L = 2.0 m, tread
B = 1.6 m, mu_t = 0.6, f_r = 0.08, sprocket pitch radius r = 0.25 m, one 1500 cm^3 motor per track
(eta_v = eta_hm = 0.95, no gear stage), relief 250 bar, return 5 bar; pump 75 cm^3 at 1800 rpm,
eta_v 0.95, overall 0.8; prime mover 50 kW.

Hand calculations used across the tests (Wong, Theory of Ground Vehicles, skid-steer chapter, for the turn):
    M_r = 0.6 * 80 000 * 2.0 / 4 = 24 000 N*m
    pivot: F_track = 0.08 * 40 000 + 24 000 / 1.6 = 3200 + 15 000 = 18 200 N each, T_L = 18 200 * 0.25 = 4550 N*m
    steady turn: F_inner = 3200 - 15 000 = -11 800 N (brakes), T_L = 2950 N*m
    effort at the pressure limit, per track: 1500e-6 * 245e5 * 0.95 / (2*pi) / 0.25 = 22 225.99 N; both 44 451.98 N
    eta_total = 0.8 * 0.95 * 0.95 = 0.722; engine power line at 1 m/s: 0.722 * 50 000 / 1 = 36 100 N
    flow per track 75e-6 * 30 * 0.95 / 2 = 1.06875e-3 m^3/s; top speed 2*pi*0.25 * 1.06875e-3*0.95/1.5e-3
    = 1.5708 * 0.676875 = 1.06323 m/s
"""

from __future__ import annotations

import copy

G = 9.80665
MASS_80KN = 80000 / G  # kg


def _track(duties: dict) -> dict:
    return {"supply": "main", "load_holding": "brake_valve",
            "motor": {"kind": "radial_piston", "displacement": "1500 cm^3",
                      "efficiency": {"volumetric": 0.95, "hydromechanical": 0.95, "starting": 0.9},
                      "rating": {"continuous_pressure": "280 bar", "peak_pressure": "350 bar", "max_speed": "60 rpm"}},
            "duty_points": copy.deepcopy(duties)}


def carrier(duties: dict | None = None, **travel) -> dict:
    """The tracked carrier; ``duties`` for both tracks (default: a pivot turn at 0.3 m/s), ``travel``
    overrides keys of the travel block (None removes one)."""
    if duties is None:
        duties = {"pivot": {"load": {"track_turn": {"track": "outer", "speed": "0.3 m/s"}}}}
    right = copy.deepcopy(duties)
    for u in right.values():  # the right track is the inner one of a turn to the right
        turn = u.get("load", {}).get("track_turn")
        if turn:
            turn["track"] = "inner"
    block = {"drives": ["track_left", "track_right"], "running_gear": "tracks", "vehicle_mass": f"{MASS_80KN} kg",
             "rolling_radius": "250 mm", "adhesion": 0.75, "rolling_resistance": 0.08, "tread": "1.6 m",
             "track_length": "2 m", "lateral_resistance": 0.6}
    for k, v in travel.items():
        if v is None:
            block.pop(k, None)
        else:
            block[k] = v
    first = next(iter(duties))
    return {
        "format": 1,
        "machine": {"id": "carrier", "title": "Test carrier", "revision": "A"},
        "supplies": {"main": {"pump": {"displacement": "75 cm^3", "shaft_speed": "1800 rpm",
                                       "volumetric_efficiency": 0.95, "overall_efficiency": 0.8},
                              "relief_setting": "250 bar", "return_pressure": "5 bar",
                              "prime_mover_power": "50 kW"}},
        "drives": {"track_left": _track(duties), "track_right": _track(right)},
        "modes": {u: {"drives": {"track_left": u, "track_right": u}} for u in duties} or
        {"go": {"drives": {"track_left": first, "track_right": first}}},
        "travel": block,
    }


def straight(torque: str, speed: str) -> dict:
    """Both tracks at one sprocket torque and speed, as entered."""
    return {"go": {"torque": torque, "speed": speed}}
