"""Variable-displacement and over-centre motors: displacement setting and envelope.

Units: displacement m^3/rev, flow m^3/s, speed rev/s, pressure Pa, torque N*m.

Displacements here are magnitudes. For an over-centre motor (-Vg_max to
+Vg_max) the sign only selects the direction of rotation; pass the magnitude
of the minimum stop (0 when the motor may swing through zero, in which case a
speed rating must bound the speed).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from specgen.calc.guards import positive as _positive, non_negative as _non_negative, efficiency as _efficiency


def _range(vg_min: float, vg_max: float) -> tuple[float, float]:
    vg_min = _non_negative("minimum displacement", vg_min)
    vg_max = _positive("maximum displacement", vg_max)
    if vg_min > vg_max:
        raise ValueError("minimum displacement must not exceed the maximum displacement.")
    return vg_min, vg_max


@dataclass(frozen=True)
class DisplacementSetting:
    """Displacement the control sets for a speed demand, and what it achieves."""

    displacement: float  # m^3/rev
    speed: float  # rev/s actually reached (the demand, or less when flow runs short)
    flow: float  # m^3/s taken by the motor at that displacement and speed
    reaches_speed: bool  # False: even the minimum displacement is too large for the flow


def choose_displacement(vg_min: float, vg_max: float, flow: float, eta_v: float, speed: float) -> DisplacementSetting:
    """Largest displacement in [Vg_min, Vg_max] that reaches ``speed`` with ``flow``.

    Formula: ``Vg = q * eta_v / n`` clipped to [Vg_min, Vg_max]. The largest
    such displacement is chosen because it gives the most torque per bar.
    Clipped at Vg_max the motor takes only ``Vg_max*n/eta_v`` (the rest of the
    flow is the supply's concern); clipped at Vg_min it reaches only
    ``q*eta_v/Vg_min`` and ``reaches_speed`` is False. A speed of zero sets Vg_max.

    Parameters: vg_min, vg_max (m^3/rev, 0 <= vg_min <= vg_max, vg_max > 0),
    flow q (m^3/s, >= 0), eta_v (volumetric efficiency, (0, 1]), speed n (rev/s, >= 0).

    Source: motor speed-flow relation ``n = q*eta_v/Vg``.

    Example: 40-160 cm^3, 100 L/min (1.6667e-3 m^3/s), eta_v = 0.95, 20 rev/s
    -> Vg = 1.6667e-3*0.95/20 = 79.17 cm^3, speed reached.

    >>> s = choose_displacement(40e-6, 160e-6, 100/60000, 0.95, 20.0)
    >>> round(s.displacement * 1e6, 2), s.reaches_speed
    (79.17, True)
    """
    vg_min, vg_max = _range(vg_min, vg_max)
    q = _non_negative("flow", flow)
    eta_v = _efficiency("volumetric efficiency", eta_v)
    n = _non_negative("speed", speed)
    if n == 0.0:
        return DisplacementSetting(displacement=vg_max, speed=0.0, flow=0.0, reaches_speed=True)
    ideal = q * eta_v / n
    if ideal >= vg_max:
        return DisplacementSetting(displacement=vg_max, speed=n, flow=vg_max * n / eta_v, reaches_speed=True)
    if ideal >= vg_min:
        return DisplacementSetting(displacement=ideal, speed=n, flow=q, reaches_speed=True)
    if vg_min == 0.0:  # only when q == 0: nothing turns the motor
        return DisplacementSetting(displacement=0.0, speed=0.0, flow=0.0, reaches_speed=False)
    return DisplacementSetting(displacement=vg_min, speed=q * eta_v / vg_min, flow=q, reaches_speed=False)


def torque_at_relief(displacement: float, relief_pressure: float, outlet_pressure: float, eta_hm: float) -> float:
    """Torque (N*m) at the relief setting: ``T = Vg*(p_relief - p_out)*eta_hm/(2*pi)``.

    Parameters: displacement Vg (m^3/rev, >= 0), relief_pressure (Pa),
    outlet_pressure (Pa, >= 0, below relief), eta_hm ((0, 1]).

    Source: positive-displacement motor torque relation.

    Example: 160 cm^3, 350 bar relief, 20 bar back pressure, eta_hm 0.93
    -> 160e-6*330e5*0.93/(2*pi) = 781.5 N*m.
    """
    vg = _non_negative("displacement", displacement)
    p_relief = _positive("relief pressure", relief_pressure)
    p_out = _non_negative("outlet pressure", outlet_pressure)
    if p_out >= p_relief:
        raise ValueError("relief pressure must exceed the outlet pressure.")
    return vg * (p_relief - p_out) * _efficiency("hydro-mechanical efficiency", eta_hm) / (2.0 * math.pi)


def max_speed_at_min_displacement(vg_min: float, flow: float, eta_v: float, speed_rating: float | None = None) -> float:
    """Highest speed (rev/s) the flow drives the motor to at its minimum stop.

    Formula: ``n_max = q*eta_v/Vg_min``, capped at ``speed_rating`` when given.

    A zero minimum stop gives unbounded speed; then a speed rating is required.

    Example: 40 cm^3, 100 L/min, eta_v 0.95 -> 39.58 rev/s (2375 rpm);
    with a 35 rev/s rating -> 35 rev/s.
    """
    vg_min = _non_negative("minimum displacement", vg_min)
    q = _non_negative("flow", flow)
    eta_v = _efficiency("volumetric efficiency", eta_v)
    rating = None if speed_rating is None else _positive("speed rating", speed_rating)
    if vg_min == 0.0:
        if rating is None:
            raise ValueError("a zero minimum displacement gives unbounded speed; give the motor's speed rating.")
        return rating if q > 0.0 else 0.0
    speed = q * eta_v / vg_min
    return speed if rating is None else min(speed, rating)


@dataclass(frozen=True)
class EnvelopePoint:
    """One displacement of the torque/speed envelope at the relief setting."""

    displacement: float  # m^3/rev
    speed: float  # rev/s, flow-limited and capped at the speed rating
    torque: float  # N*m at the relief setting
    speed_capped: bool  # True when the speed rating, not the flow, sets the speed


def torque_speed_envelope(
    vg_min: float,
    vg_max: float,
    flow: float,
    eta_v: float,
    eta_hm: float,
    relief_pressure: float,
    outlet_pressure: float,
    speed_rating: float | None = None,
    points: int = 11,
) -> tuple[EnvelopePoint, ...]:
    """(speed, maximum torque) pairs across the displacement range, smallest displacement first.

    Formulas, per displacement Vg (evenly spaced from Vg_min to Vg_max):
    torque ``Vg*(p_relief - p_out)*eta_hm/(2*pi)``; speed ``q*eta_v/Vg``
    capped at ``speed_rating``.

    Parameters: vg_min, vg_max (m^3/rev), flow q (m^3/s, >= 0), eta_v, eta_hm
    ((0, 1]), relief_pressure and outlet_pressure (Pa), speed_rating (rev/s,
    required when vg_min is 0), points (>= 2, or 1 when vg_min == vg_max).

    Source: motor torque and speed-flow relations at constant relief setting.

    Example: 40-160 cm^3, 100 L/min, eta_v 0.95, eta_hm 0.93, 350 bar relief,
    20 bar out, 3 points -> (39.58 rev/s, 195.4 N*m), (15.83, 488.4),
    (9.90, 781.5) at 40, 100, 160 cm^3.
    """
    vg_min, vg_max = _range(vg_min, vg_max)
    q = _non_negative("flow", flow)
    eta_v = _efficiency("volumetric efficiency", eta_v)
    rating = None if speed_rating is None else _positive("speed rating", speed_rating)
    if vg_min == 0.0 and rating is None:
        raise ValueError("a zero minimum displacement gives unbounded speed; give the motor's speed rating.")
    if isinstance(points, bool) or int(points) != points or points < 1 or (points == 1 and vg_min != vg_max):
        raise ValueError("points must be a whole number of at least 2 (1 only for a fixed displacement).")
    points = int(points)
    result = []
    for k in range(points):
        vg = vg_min if points == 1 else vg_min + (vg_max - vg_min) * k / (points - 1)
        flow_speed = math.inf if vg == 0.0 else q * eta_v / vg
        if vg == 0.0 and q == 0.0:
            flow_speed = 0.0
        capped = rating is not None and flow_speed > rating
        result.append(
            EnvelopePoint(
                displacement=vg,
                speed=rating if capped else flow_speed,
                torque=torque_at_relief(vg, relief_pressure, outlet_pressure, eta_hm),
                speed_capped=capped,
            )
        )
    return tuple(result)
