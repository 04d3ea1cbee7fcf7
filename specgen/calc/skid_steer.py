"""Skid steering of a tracked vehicle: the moment that resists a turn and the thrust of each track.

Units: force N, moment N*m, length m, speed m/s, mass kg.

Steady turn at low speed on level ground, uniform ground pressure along the track contact length
(Wong, Theory of Ground Vehicles, skid-steer chapter):

    M_r     = mu_t * W * L / 4                  turning resistance moment
    F_outer = f_r * W / 2 + M_r / B             thrust of the outer track
    F_inner = f_r * W / 2 - M_r / B             negative: the inner track brakes (the vehicle overruns it)
    pivot turn (about the vehicle's centre): both tracks f_r * W / 2 + M_r / B, in opposite directions

Track speeds in a turn of radius R (to the vehicle's centre line) at the vehicle's speed v:
``v_outer = v * (R + B/2) / R``, ``v_inner = v * (R - B/2) / R`` (rigid-body kinematics, no slip).
"""

from __future__ import annotations

from dataclasses import dataclass

from specgen.calc.guards import non_negative as _non_negative, positive as _positive
from specgen.calc.loads import STANDARD_GRAVITY

OUTER, INNER = "outer", "inner"


def turning_moment(mu_t: float, weight: float, contact_length: float) -> float:
    """Turning resistance moment (N*m): ``M_r = mu_t * W * L / 4``.

    Parameters: mu_t (lateral resistance coefficient, > 0), weight W (N, > 0, the whole vehicle),
    contact_length L (m, > 0, of each track on the ground).

    Source: Wong, Theory of Ground Vehicles, skid-steer chapter (uniform pressure along the track).

    Example: mu_t 0.6, W 80 kN, L 2.0 m -> 0.6*80 000*2.0/4 = 24 000 N*m (hand calculation).

    >>> turning_moment(0.6, 80000.0, 2.0)
    24000.0
    """
    _positive("lateral resistance coefficient", mu_t)
    _positive("vehicle weight", weight)
    _positive("track contact length", contact_length)
    return mu_t * weight * contact_length / 4.0


@dataclass(frozen=True)
class TrackThrusts:
    """Thrust of each track (N) in a turn; a negative inner thrust brakes."""

    moment: float  # N*m, turning resistance moment
    outer: float
    inner: float


def track_thrusts(weight: float, rolling_resistance: float, mu_t: float, contact_length: float,
                  tread: float, pivot: bool = False) -> TrackThrusts:
    """Both track thrusts in a steady turn, or in a pivot turn (``pivot``: both the outer thrust, the
    inner one in reverse, given here as positive: each motor drives its own track).

    Formulas: ``F_outer = f_r*W/2 + M_r/B``, ``F_inner = f_r*W/2 - M_r/B`` (pivot: ``F_inner = F_outer``).

    Parameters: weight W (N), rolling_resistance f_r (>= 0), mu_t (> 0), contact_length L (m),
    tread B (m, > 0, centre to centre of the tracks).

    Source: Wong, Theory of Ground Vehicles, skid-steer chapter.

    Example: W 80 kN, L 2.0 m, B 1.6 m, mu_t 0.6, f_r 0.08: M_r 24 000 N*m,
    F_outer = 3200 + 15 000 = 18 200 N, F_inner = 3200 - 15 000 = -11 800 N (the inner track brakes).

    >>> t = track_thrusts(80000.0, 0.08, 0.6, 2.0, 1.6)
    >>> round(t.outer), round(t.inner)
    (18200, -11800)
    """
    _non_negative("rolling resistance coefficient", rolling_resistance)
    m_r = turning_moment(mu_t, weight, contact_length)
    half = rolling_resistance * weight / 2.0
    steer = m_r / _positive("tread", tread)
    outer = half + steer
    return TrackThrusts(m_r, outer, outer if pivot else half - steer)


def track_speeds(speed: float, turn_radius: float | None, tread: float) -> tuple[float, float]:
    """(outer, inner) track speed (m/s) in a turn of radius R at the vehicle's speed v; a pivot turn
    (``turn_radius`` None) turns both tracks at ``speed``, in opposite directions.

    Formulas: ``v_outer = v*(R + B/2)/R``, ``v_inner = v*(R - B/2)/R``; R must be at least B/2 (at B/2
    the inner track stands still; nearer the centre it would run backwards: a pivot-like turn).

    Source: rigid-body kinematics of the vehicle turning about a point on its axle line, no slip.

    Example: v 1 m/s, R 4 m, B 1.6 m -> (1.2, 0.8) m/s.

    >>> track_speeds(1.0, 4.0, 1.6)
    (1.2, 0.8)
    """
    _non_negative("speed", speed)
    _positive("tread", tread)
    if turn_radius is None:
        return speed, speed
    _positive("turn radius", turn_radius)
    if turn_radius < tread / 2.0:
        raise ValueError(f"turn radius {turn_radius} m is less than half the tread ({tread / 2.0} m); "
                         "give a pivot turn instead.")
    return speed * (turn_radius + tread / 2.0) / turn_radius, speed * (turn_radius - tread / 2.0) / turn_radius


def vehicle_weight(mass: float, gravity: float = STANDARD_GRAVITY) -> float:
    """Weight (N) of a mass (kg): ``W = m * g``. Example: 8155 kg -> 79 972 N."""
    return _positive("vehicle mass", mass) * gravity
