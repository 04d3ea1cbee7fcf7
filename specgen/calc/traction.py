"""Tractive effort of a vehicle's hydrostatic travel drive: the limits it works under, against ground speed.

Units: force N, speed m/s (ground) or rev/s (shaft), power W, pressure Pa, displacement m^3/rev,
flow m^3/s, mass kg, length m, torque N*m.

A travel transmission gives at most, at a ground speed v (fluid-power and vehicle textbooks; the
envelope is the lowest of these lines):

    F_relief(v)  = sum over driven motors of Vg(v) * dp_limit * eta_hm / (2*pi) * i * eta_g / r
                   (Vg(v): the maximum displacement while the flow can fill it, then the displacement
                   the flow fills at that speed down to the minimum stop)
    F_adhesion   = mu * W_driven
    F_power(v)   = eta_total * P_engine / v
    v <= v_max   (the flow through the minimum displacement, or the motor's speed rating)
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from specgen.calc.guards import efficiency as _efficiency, non_negative as _non_negative, positive as _positive
from specgen.calc.loads import STANDARD_GRAVITY

# The limiting lines of the envelope, as named in the output.
RELIEF, ADHESION, POWER, FLOW = "relief", "adhesion", "engine power", "flow"


def adhesion_limit(mu: float, driven_mass: float, grade_angle: float = 0.0, gravity: float = STANDARD_GRAVITY) -> float:
    """Most tractive effort (N) the ground takes before the driven wheels or tracks slip.

    Formula: ``F_adh = mu * m_driven * g * cos(theta)`` (the normal force on the driven wheels on a
    grade theta; ``theta = 0`` on level ground).

    Parameters: mu (adhesion coefficient, > 0), driven_mass (kg, > 0, on the driven wheels or tracks),
    grade_angle (rad), gravity (m/s^2).

    Source: Coulomb friction at the tyre or track contact (vehicle dynamics textbooks).

    Example: mu 0.7 on 60 kN driven weight -> 42 kN (hand calculation).

    >>> round(adhesion_limit(0.7, 60000 / STANDARD_GRAVITY))
    42000
    """
    _positive("adhesion coefficient", mu)
    _positive("driven mass", driven_mass)
    return mu * driven_mass * gravity * math.cos(grade_angle)


def effort_at_pressure(displacement: float, dp: float, eta_hm: float, ratio: float, eta_gear: float,
                       radius: float) -> float:
    """Tractive effort (N) one motor gives at its wheel or sprocket at a pressure differential.

    Formula: ``F = Vg * dp * eta_hm / (2*pi) * i * eta_g / r`` (motor torque through the gear stage,
    over the rolling radius).

    Parameters: displacement Vg (m^3/rev, >= 0), dp (Pa, >= 0), eta_hm, eta_gear ((0, 1]), ratio i
    (motor speed / wheel speed, > 0), radius r (m, rolling or sprocket pitch radius, > 0).

    Source: motor torque relation T = Vg*dp*eta_hm/(2*pi) and the gear-stage power balance.

    Example: 820 cm^3 at 290 bar, eta_hm 0.94, no gear stage, r 0.3 m:
    820e-6*290e5*0.94/(2*pi)/0.3 = 11 859 N.

    >>> round(effort_at_pressure(820e-6, 290e5, 0.94, 1.0, 1.0, 0.3))
    11859
    """
    _non_negative("displacement", displacement)
    _non_negative("pressure differential", dp)
    _positive("gear ratio", ratio)
    _positive("radius", radius)
    torque = displacement * dp * _efficiency("hydro-mechanical efficiency", eta_hm) / (2.0 * math.pi)
    return torque * ratio * _efficiency("gear efficiency", eta_gear) / radius


def power_limited_effort(eta_total: float, power: float, speed: float) -> float:
    """Tractive effort (N) the engine's power allows at a ground speed.

    Formula: ``F = eta_total * P_engine / v`` (infinite at v = 0).

    Parameters: eta_total ((0, 1], engine to ground), power (W, >= 0), speed v (m/s, >= 0).

    Source: power balance of the transmission.

    Example: 50 kW, eta_total 0.75, 2 m/s -> 0.75*50 000/2 = 18 750 N (hand calculation).

    >>> power_limited_effort(0.75, 50e3, 2.0)
    18750.0
    """
    _efficiency("overall efficiency", eta_total)
    _non_negative("power", power)
    _non_negative("speed", speed)
    return math.inf if speed == 0.0 else eta_total * power / speed


def ground_speed(shaft_speed: float, radius: float) -> float:
    """Ground speed (m/s) of a wheel or sprocket turning at ``shaft_speed`` (rev/s): ``v = 2*pi*r*n``.

    Example: 0.5 rev/s on r 0.3 m -> 0.9425 m/s.

    >>> round(ground_speed(0.5, 0.3), 4)
    0.9425
    """
    _non_negative("shaft speed", shaft_speed)
    return 2.0 * math.pi * _positive("radius", radius) * shaft_speed


@dataclass(frozen=True)
class Transmission:
    """What the envelope needs of the driven motors taken together (all alike, each with its share of flow).

    ``relief_effort``: summed effort at the pressure limit at the maximum displacement (N);
    ``full_speed``: ground speed (m/s) at which the flow fills the maximum displacement;
    ``top_speed``: ground speed (m/s) at the minimum displacement or the speed rating, the lower;
    ``variable``: the displacement can fall below its maximum (the relief line falls as 1/v past full_speed).
    """

    relief_effort: float
    full_speed: float
    top_speed: float
    variable: bool


def relief_effort_at(t: Transmission, speed: float) -> float:
    """Effort at the pressure limit at ``speed`` (m/s): flat up to ``full_speed``, then (a variable motor
    whose control lowers the displacement to let the flow reach the speed) ``F_relief * full_speed / v``;
    zero past ``top_speed``.

    Example: 30 kN to 1 m/s, variable to 3 m/s: at 2 m/s 15 kN.

    >>> relief_effort_at(Transmission(30e3, 1.0, 3.0, True), 2.0)
    15000.0
    """
    if speed > t.top_speed:
        return 0.0
    if speed <= t.full_speed or not t.variable:
        return t.relief_effort
    return t.relief_effort * t.full_speed / speed


@dataclass(frozen=True)
class EnvelopePoint:
    """The envelope at one ground speed: the effort allowed, the line that sets it, and the relief and
    engine power lines there (for a chart; ``power`` None at standstill or without an engine power)."""

    speed: float  # m/s
    effort: float  # N
    limit: str  # RELIEF, ADHESION or POWER
    relief: float  # N
    power: float | None  # N


def effort_limit(t: Transmission, speed: float, adhesion: float | None, eta_total: float,
                 power: float | None) -> tuple[float, str]:
    """The tractive effort allowed at ``speed`` and the line that sets it (``adhesion`` None: leave it out;
    ``power`` None: no engine power line). Past the top speed: (0, FLOW).

    Example: relief 30 kN, adhesion 42 kN, 50 kW at 0.75, 2 m/s -> (18 750 N, engine power).

    >>> effort_limit(Transmission(30e3, 1.0, 3.0, False), 2.0, 42e3, 0.75, 50e3)
    (18750.0, 'engine power')
    """
    if speed > t.top_speed:
        return 0.0, FLOW
    lines = [(relief_effort_at(t, speed), RELIEF)]
    if adhesion is not None:
        lines.append((adhesion, ADHESION))
    if power is not None:
        lines.append((power_limited_effort(eta_total, power, speed), POWER))
    return min(lines, key=lambda x: x[0])


def envelope(t: Transmission, adhesion: float | None, eta_total: float, power: float | None,
             points: int = 40) -> tuple[EnvelopePoint, ...]:
    """The envelope from standstill to the top speed, at ``points`` even steps and at every corner
    (the end of full displacement, where the engine power line crosses the others).

    Example: a fixed motor, relief 30 kN to 3 m/s, no adhesion, no power line, 2 steps:
    (0, 30 kN), (1.5, 30 kN), (3, 30 kN), each set by the relief.
    """
    top = _non_negative("top speed", t.top_speed)
    if isinstance(points, bool) or int(points) != points or points < 1:
        raise ValueError(f"points must be a whole number of at least 1, got {points}.")
    speeds = {top * k / points for k in range(points + 1)}
    if 0 < t.full_speed < top:
        speeds.add(t.full_speed)
    if power is not None and power > 0:
        for cap in (t.relief_effort, adhesion):
            if cap:  # where the power hyperbola meets a flat line
                crossing = eta_total * power / cap
                if 0 < crossing < top:
                    speeds.add(crossing)
    out = []
    for v in sorted(speeds):
        effort, line = effort_limit(t, v, adhesion, eta_total, power)
        by_power = power_limited_effort(eta_total, power, v) if power is not None and v > 0 else None
        out.append(EnvelopePoint(v, effort, line, relief_effort_at(t, v), by_power))
    return tuple(out)


def corner_power(max_effort: float, top_speed: float) -> float:
    """Corner power (W) of a travel transmission: ``F_max * v_max``; its ratio to the engine's power
    says how much of the speed range can run at full engine power.

    Example: 42 kN and 3 m/s -> 126 kW; against a 50 kW engine, ratio 2.52.

    >>> corner_power(42e3, 3.0)
    126000.0
    """
    return _non_negative("effort", max_effort) * _non_negative("top speed", top_speed)
