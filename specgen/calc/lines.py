"""Hydraulic lines: velocity, Reynolds number, Darcy friction factor, pressure drop.

Units: flow m^3/s, diameter and length m, velocity m/s, kinematic viscosity
m^2/s, density kg/m^3, pressure Pa.

Friction-factor regime policy (see :func:`darcy_friction_factor`):
    Re < 2300            laminar, f = 64/Re
    2300 <= Re < 4000    transitional: treated as turbulent (the turbulent
                         correlation evaluated at the actual Re), because in
                         this band it lies above 64/Re, so the pressure drop
                         is never understated whichever regime the flow takes
    Re >= 4000           turbulent (Colebrook by default, Blasius on request)
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from specgen.calc.guards import positive as _positive, non_negative as _non_negative

RE_LAMINAR_LIMIT = 2300.0
RE_TURBULENT_LIMIT = 4000.0


@dataclass(frozen=True)
class VelocityRange:
    """Recommended mean flow velocity range in m/s."""

    low: float
    high: float


# Rule-of-thumb mean velocities per line kind: common practice, no source.
# Suction lines are kept slow against cavitation at the pump inlet; pressure
# lines tolerate more (the upper end suits the higher pressures).
LINE_VELOCITY_LIMITS: dict[str, VelocityRange] = {
    "suction": VelocityRange(0.5, 1.2),
    "return": VelocityRange(1.5, 3.0),
    "pressure": VelocityRange(2.0, 6.0),
}


def line_velocity_limits(kind: str) -> VelocityRange:
    """Rule-of-thumb velocity range (m/s) for 'suction', 'return' or 'pressure' (common practice, no source)."""
    try:
        return LINE_VELOCITY_LIMITS[kind]
    except KeyError:
        raise ValueError(f"unknown line kind {kind!r}; expected one of {', '.join(LINE_VELOCITY_LIMITS)}.") from None


def flow_area(inner_diameter: float) -> float:
    """Bore area (m^2) of a round line: ``A = pi*d^2/4``.

    Example: d = 20 mm -> 3.1416e-4 m^2.
    """
    d = _positive("inner diameter", inner_diameter)
    return math.pi * d * d / 4.0


def line_velocity(flow: float, inner_diameter: float) -> float:
    """Mean flow velocity (m/s): ``v = q / A``, ``A = pi*d^2/4``.

    Parameters: flow q (m^3/s, >= 0; direction is not modelled), inner_diameter d (m).

    Source: continuity (volume flow = mean velocity * area).

    Example: 60 L/min (1e-3 m^3/s) in a 20 mm bore -> 1e-3 / 3.1416e-4 = 3.183 m/s.

    >>> round(line_velocity(1e-3, 0.020), 3)
    3.183
    """
    return _non_negative("flow", flow) / flow_area(inner_diameter)


def reynolds_number(velocity: float, inner_diameter: float, kinematic_viscosity: float) -> float:
    """Reynolds number ``Re = v*d/nu`` (dimensionless).

    Parameters: velocity v (m/s, >= 0), inner_diameter d (m), kinematic_viscosity nu (m^2/s).

    Source: Reynolds (1883); pipe flow based on bore diameter.

    Example: 3.183 m/s, 20 mm, 32e-6 m^2/s -> 1989 (laminar).

    >>> round(reynolds_number(3.183, 0.020, 32e-6))
    1989
    """
    return _non_negative("velocity", velocity) * _positive("inner diameter", inner_diameter) / _positive(
        "kinematic viscosity", kinematic_viscosity
    )


def friction_factor_laminar(re: float) -> float:
    """Darcy friction factor of fully developed laminar pipe flow: ``f = 64/Re``.

    Source: Hagen-Poiseuille solution.

    Example: Re = 1000 -> 0.064.
    """
    return 64.0 / _positive("Reynolds number", re)


def friction_factor_blasius(re: float) -> float:
    """Darcy friction factor, smooth tube, turbulent: ``f = 0.3164 * Re^-0.25``.

    The constant is Blasius' 0.3164 (often quoted rounded as 0.316).

    Source: Blasius (1913); intended for about 4000 <= Re <= 1e5.

    Example: Re = 1e4 -> 0.03164.
    """
    return 0.3164 * _positive("Reynolds number", re) ** -0.25


def friction_factor_colebrook(re: float, relative_roughness: float = 0.0, tolerance: float = 1e-12) -> float:
    """Darcy friction factor from the Colebrook equation, solved iteratively.

    Formula: ``1/sqrt(f) = -2*log10(eps/(3.7*d) + 2.51/(Re*sqrt(f)))``.

    Solved as a fixed point in ``x = 1/sqrt(f)``; the map is a contraction
    (slope below 0.2 for turbulent Re), so it converges in a few steps from
    a smooth-pipe starting guess.

    Parameters: re (> 0), relative_roughness eps/d (>= 0, 0 for a smooth tube).

    Source: Colebrook (1939).

    Example: Re = 1e5, smooth -> 0.01799.

    >>> round(friction_factor_colebrook(1e5), 5)
    0.01799
    """
    re = _positive("Reynolds number", re)
    rr = _non_negative("relative roughness", relative_roughness)
    x = 1.8 * math.log10(re / 6.9)  # smooth-pipe estimate (Haaland form without roughness)
    x = max(x, 1.0)
    for _ in range(200):
        x_next = -2.0 * math.log10(rr / 3.7 + 2.51 * x / re)
        if abs(x_next - x) <= tolerance * x_next:
            return 1.0 / (x_next * x_next)
        x = x_next
    raise ValueError(f"Colebrook iteration did not converge for Re = {re}, relative roughness = {rr}.")


@dataclass(frozen=True)
class FrictionFactor:
    """Darcy friction factor with the regime that produced it."""

    value: float
    regime: str  # "laminar", "transitional" or "turbulent"


def darcy_friction_factor(re: float, relative_roughness: float = 0.0, turbulent: str = "colebrook") -> FrictionFactor:
    """Darcy friction factor with the module's regime policy.

    Policy: Re < 2300 laminar ``64/Re``; 2300 <= Re < 4000 transitional,
    computed with the turbulent correlation (upper bound, conservative);
    Re >= 4000 turbulent. ``turbulent`` is "colebrook" (default, accepts
    roughness) or "blasius" (smooth tube only).

    Parameters: re (> 0), relative_roughness eps/d (>= 0), turbulent (str).

    Sources: Hagen-Poiseuille, Colebrook (1939), Blasius (1913).

    Example: Re = 3000 smooth -> transitional, Colebrook 0.0435 (laminar would be 0.0213).
    """
    re = _positive("Reynolds number", re)
    rr = _non_negative("relative roughness", relative_roughness)
    if turbulent not in ("colebrook", "blasius"):
        raise ValueError(f"turbulent correlation must be 'colebrook' or 'blasius', got {turbulent!r}.")
    if turbulent == "blasius" and rr > 0.0:
        raise ValueError("the Blasius relation is for smooth tubes; use 'colebrook' with a roughness.")
    if re < RE_LAMINAR_LIMIT:
        return FrictionFactor(friction_factor_laminar(re), "laminar")
    value = friction_factor_blasius(re) if turbulent == "blasius" else friction_factor_colebrook(re, rr)
    return FrictionFactor(value, "transitional" if re < RE_TURBULENT_LIMIT else "turbulent")


def darcy_weisbach_pressure_drop(
    friction_factor: float, length: float, inner_diameter: float, density: float, velocity: float
) -> float:
    """Pressure drop (Pa): ``dp = f * (L/d) * rho * v^2 / 2``.

    Parameters: friction_factor f (Darcy, > 0), length L (m, >= 0, straight
    line plus fitting equivalent length), inner_diameter d (m), density rho
    (kg/m^3), velocity v (m/s, >= 0).

    Source: Darcy-Weisbach equation.

    Example: f = 0.0322, L = 5 m, d = 20 mm, rho = 870, v = 3.183 m/s
    -> 0.0322 * 250 * 870 * 3.183^2 / 2 = 35 478 Pa (0.355 bar).
    """
    f = _positive("friction factor", friction_factor)
    length = _non_negative("length", length)
    d = _positive("inner diameter", inner_diameter)
    rho = _positive("density", density)
    v = _non_negative("velocity", velocity)
    return f * (length / d) * rho * v * v / 2.0


def fitting_equivalent_length(loss_coefficient: float, friction_factor: float, inner_diameter: float) -> float:
    """Straight-line length (m) with the same loss as a fitting: ``L_eq = K * d / f``.

    Parameters: loss_coefficient K (>= 0, from the fitting maker or a loss
    table), friction_factor f (Darcy, > 0), inner_diameter d (m).

    Source: equating ``K*rho*v^2/2`` with Darcy-Weisbach.

    Example: K = 0.9 elbow, f = 0.03, d = 20 mm -> 0.6 m.
    """
    k = _non_negative("loss coefficient", loss_coefficient)
    return k * _positive("inner diameter", inner_diameter) / _positive("friction factor", friction_factor)


@dataclass(frozen=True)
class LinePressureDrop:
    """Result of :func:`line_pressure_drop` (SI)."""

    velocity: float  # m/s
    reynolds: float
    friction_factor: float  # Darcy
    regime: str
    pressure_drop: float  # Pa


def line_pressure_drop(
    flow: float,
    inner_diameter: float,
    length: float,
    density: float,
    kinematic_viscosity: float,
    equivalent_length: float = 0.0,
    roughness: float = 0.0,
    turbulent: str = "colebrook",
) -> LinePressureDrop:
    """Velocity, Reynolds number, friction factor and pressure drop of a round line.

    Formula: ``dp = f * ((L + L_eq)/d) * rho * v^2 / 2``, ``v = q/A``,
    ``Re = v*d/nu``, f from :func:`darcy_friction_factor`.

    Parameters: flow q (m^3/s, >= 0), inner_diameter d (m), length L (m),
    density rho (kg/m^3), kinematic_viscosity nu (m^2/s), equivalent_length
    L_eq of the fittings (m, >= 0), roughness (absolute, m, >= 0), turbulent
    correlation name.

    Source: Darcy-Weisbach with the regime policy of this module.

    Example: 60 L/min, 20 mm bore, 5 m, 870 kg/m^3, 32 mm^2/s
    -> v = 3.183 m/s, Re = 1989 laminar, f = 0.03217, dp = 35 450 Pa.
    Zero flow gives zero drop (regime "none").
    """
    v = line_velocity(flow, inner_diameter)
    length = _non_negative("length", length)
    equivalent_length = _non_negative("equivalent length", equivalent_length)
    rho = _positive("density", density)
    re = reynolds_number(v, inner_diameter, kinematic_viscosity)
    rr = _non_negative("roughness", roughness) / inner_diameter
    if re == 0.0:
        return LinePressureDrop(velocity=0.0, reynolds=0.0, friction_factor=0.0, regime="none", pressure_drop=0.0)
    ff = darcy_friction_factor(re, rr, turbulent)
    dp = darcy_weisbach_pressure_drop(ff.value, length + equivalent_length, inner_diameter, rho, v)
    return LinePressureDrop(velocity=v, reynolds=re, friction_factor=ff.value, regime=ff.regime, pressure_drop=dp)
