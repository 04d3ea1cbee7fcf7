"""Build a duty point's load block (winch, wheel, belt, speed-squared or track turn) from a schema-valid spec.

Quantities become SI floats (N, m, m/s, m/s^2, kg, N*m, rev/s); a grade becomes an angle in rad,
positive uphill. A track turn takes its vehicle from the travel block (intake/build_travel.py).
Which way the load turns the motor (a downhill wheel, a regenerating belt, an inner track braking) is
decided from the load's sign when the spec is resolved, not here.
"""

from __future__ import annotations

import math
from dataclasses import replace

from specgen.intake.model import BeltLoad, SpeedSquaredLoad, TrackTurnLoad, WheelLoad, WinchLoad
from specgen.intake.quantities import Builder

LOAD_MODELS = ("winch", "wheel", "belt", "speed_squared", "track_turn")

_GRADE_HINT = "; write the grade as a percentage ('8 %') or an angle ('4 deg')"


def build_load(b: Builder, name: str, raw: dict, path: tuple):
    """The load model ``name`` (one of LOAD_MODELS) from its block ``raw`` at ``path``."""
    return _BUILDERS[name](b, raw, path)


def _winch(b: Builder, w: dict, path: tuple) -> WinchLoad:
    return WinchLoad(
        line_pull=b.quantity(w, "line_pull", path, "force"),
        line_speed=b.quantity(w, "line_speed", path, "velocity"),
        drum_diameter=b.quantity(w, "drum_diameter", path, "length"),
        rope_diameter=b.quantity(w, "rope_diameter", path, "length"),
        layer=int(w.get("layer", 1)),
    )


def _wheel(b: Builder, w: dict, path: tuple) -> WheelLoad:
    c_rr = b.ratio(w, "rolling_resistance", path, 0.0, efficiency=False)
    return WheelLoad(
        vehicle_mass=b.quantity(w, "vehicle_mass", path, "mass"),
        rolling_resistance=c_rr.value,
        grade=_grade(b, w, path),
        rolling_radius=b.quantity(w, "rolling_radius", path, "length"),
        driven_wheels=int(w["driven_wheels"]),
        travel_speed=b.quantity(w, "travel_speed", path, "velocity"),
        acceleration=b.quantity(w, "acceleration", path, "acceleration", sign="any", default=0.0),
        grade_text=str(w.get("grade", "")),
    )


def _grade(b: Builder, w: dict, path: tuple) -> float:
    """A grade in percent ('8 %') or as an angle ('4 deg') -> angle in rad, positive uphill."""
    text, here = w["grade"], path + ("grade",)
    if not isinstance(text, str):
        b.fail(here, f"{text!r} has no unit" + _GRADE_HINT)
        return 0.0
    percent = "%" in text
    value = b.parse(text, "ratio" if percent else "angle", here)
    if value is None:
        last = b.problems[-1]
        b.problems[-1] = replace(last, message=last.message.split("; write it as")[0] + _GRADE_HINT)
        return 0.0
    try:
        return grade_angle(value, percent)
    except ValueError as exc:
        b.fail(here, str(exc))
    return 0.0


def grade_angle(value: float, percent: bool) -> float:
    """Grade angle (rad) from a slope read as a ratio (rise over run, ``percent``) or an angle (rad).

    Formula: theta = atan(rise / run) for a slope; an angle must lie strictly between -90 and 90 degrees.
    Source: trigonometry of a slope. Example: 10 % (0.1) -> atan(0.1) = 0.09967 rad.
    """
    if percent:
        grade_percent = value * 100.0
        if not math.isfinite(grade_percent):
            raise ValueError(f"grade percent must be a finite number, got {grade_percent}.")
        return math.atan(grade_percent / 100.0)
    degrees = math.degrees(value)
    if not math.isfinite(degrees):
        raise ValueError(f"grade angle must be a finite number, got {degrees}.")
    if not -90.0 < degrees < 90.0:
        raise ValueError(f"grade angle must lie strictly between -90 and 90 degrees, got {degrees}.")
    return math.radians(degrees)


def _belt(b: Builder, w: dict, path: tuple) -> BeltLoad:
    pull = b.quantity(w, "belt_pull", path, "force", sign="any")
    if pull == 0:
        b.fail(path + ("belt_pull",), "a belt pull of zero gives no torque; give the effective pull")
    return BeltLoad(belt_pull=pull, pulley_diameter=b.quantity(w, "pulley_diameter", path, "length"),
                    belt_speed=b.quantity(w, "belt_speed", path, "velocity"))


def _speed_squared(b: Builder, w: dict, path: tuple) -> SpeedSquaredLoad:
    return SpeedSquaredLoad(reference_torque=b.quantity(w, "reference_torque", path, "torque"),
                            reference_speed=b.quantity(w, "reference_speed", path, "speed"),
                            speed=b.quantity(w, "speed", path, "speed"))


def _track_turn(b: Builder, w: dict, path: tuple) -> TrackTurnLoad:
    """The turn as written; the vehicle's figures are filled in from the travel block."""
    return TrackTurnLoad(track=w["track"], speed=b.quantity(w, "speed", path, "velocity", sign="nonnegative"),
                         turn_radius=b.quantity(w, "turn_radius", path, "length"))


_BUILDERS = {"winch": _winch, "wheel": _wheel, "belt": _belt, "speed_squared": _speed_squared,
             "track_turn": _track_turn}
