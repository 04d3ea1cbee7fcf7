"""Hydraulic fluid properties: ISO VG grades, viscosity versus temperature, density.

SI at the interface: kinematic viscosity in m^2/s (functions say ``_m2s``),
temperature in K, density in kg/m^3. The Walther relation is evaluated in
mm^2/s internally because its 0.7 constant belongs to that unit.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from specgen.iso_vg import ISO_VG_GRADES, ISO_VG_TOLERANCE, WALTHER_CONSTANT_MM2S
from specgen.iso_vg import ISO_VG_MIDPOINT_MM2S as _ISO_VG_MIDPOINT_MM2S
from specgen.iso_vg import TYPICAL_NU100_VI100_MM2S as _TYPICAL_NU100_VI100_MM2S

MM2S = 1e-6  # m^2/s per mm^2/s (cSt)
KELVIN_AT_0C = 273.15
T_40C = 313.15  # K
T_100C = 373.15  # K

DENSITY_EXPANSION_PER_K = 6.5e-4  # mineral oil, common practice, no source


def _check_grade(grade: int) -> int:
    if grade not in _ISO_VG_MIDPOINT_MM2S:
        raise ValueError(f"ISO VG {grade} is not an ISO 3448 grade; grades are {', '.join(map(str, ISO_VG_GRADES))}.")
    return grade


def _check_temperature(name: str, temperature: float) -> float:
    temperature = float(temperature)
    if not math.isfinite(temperature) or temperature <= 0.0:
        raise ValueError(f"{name} must be a positive absolute temperature in kelvin, got {temperature}.")
    return temperature


def _check_viscosity(name: str, viscosity: float) -> float:
    viscosity = float(viscosity)
    if not math.isfinite(viscosity) or viscosity <= 0.0:
        raise ValueError(f"{name} must be a positive kinematic viscosity in m^2/s, got {viscosity}.")
    return viscosity


def iso_vg_midpoint_m2s(grade: int) -> float:
    """ISO 3448 mid-point kinematic viscosity at 40 degC, in m^2/s.

    Source: ISO 3448 (industrial liquid lubricants, ISO viscosity classification).

    Example: ISO VG 46 -> 46 mm^2/s = 4.6e-5 m^2/s; VG 5 -> 4.6 mm^2/s.

    >>> iso_vg_midpoint_m2s(46)
    4.6e-05
    """
    return _ISO_VG_MIDPOINT_MM2S[_check_grade(grade)] * MM2S


def iso_vg_limits_m2s(grade: int) -> tuple[float, float]:
    """ISO 3448 (minimum, maximum) kinematic viscosity at 40 degC, in m^2/s.

    Formula: mid-point * (1 -/+ 0.10).

    Example: ISO VG 32 -> (28.8, 35.2) mm^2/s.
    """
    mid = _ISO_VG_MIDPOINT_MM2S[_check_grade(grade)]
    return (mid * (1.0 - ISO_VG_TOLERANCE) * MM2S, mid * (1.0 + ISO_VG_TOLERANCE) * MM2S)


def typical_viscosity_100c_m2s(grade: int) -> float:
    """Kinematic viscosity at 100 degC (m^2/s) of a VI-100 oil at the grade's mid-point.

    The value makes the ISO 2909 viscosity index exactly 100 with the ISO 3448
    40 degC mid-point (see the table note in this module). Real oils differ;
    a measured data-sheet value should replace it whenever one is known.

    Source: ISO 2909 (viscosity index), ISO 3448 (grades).

    Raises ValueError for VG 2, 3 and 5, whose 100 degC viscosity is below the
    2 mm^2/s where ISO 2909 defines a viscosity index.

    Example: ISO VG 46 -> 6.76 mm^2/s.

    >>> round(typical_viscosity_100c_m2s(46) / 1e-6, 2)
    6.76
    """
    _check_grade(grade)
    if grade not in _TYPICAL_NU100_VI100_MM2S:
        raise ValueError(
            f"ISO VG {grade} has no typical 100 degC viscosity: it lies below 2 mm^2/s, "
            "where no viscosity index is defined; give two measured viscosities instead."
        )
    return _TYPICAL_NU100_VI100_MM2S[grade] * MM2S


@dataclass(frozen=True)
class WaltherFit:
    """Constants of ``log10(log10(nu + 0.7)) = a - b*log10(T)`` (nu in mm^2/s, T in K)."""

    a: float
    b: float

    def kinematic_viscosity_m2s(self, temperature: float) -> float:
        """Kinematic viscosity (m^2/s) at an absolute temperature (K)."""
        temperature = _check_temperature("temperature", temperature)
        z = 10.0 ** (10.0 ** (self.a - self.b * math.log10(temperature)))
        return (z - WALTHER_CONSTANT_MM2S) * MM2S


def _walther_w(viscosity_m2s: float) -> float:
    nu_mm2s = viscosity_m2s / MM2S
    if nu_mm2s + WALTHER_CONSTANT_MM2S <= 1.0:
        raise ValueError("kinematic viscosity is too low for the Walther relation (needs nu + 0.7 mm^2/s above 1).")
    return math.log10(math.log10(nu_mm2s + WALTHER_CONSTANT_MM2S))


def walther_fit(
    viscosity_1_m2s: float, temperature_1: float, viscosity_2_m2s: float, temperature_2: float
) -> WaltherFit:
    """Fit the ASTM D341 (Walther) viscosity-temperature line through two points.

    Formula: ``log10(log10(nu + 0.7)) = A - B*log10(T)``, nu in mm^2/s, T in K;
    ``B = (W1 - W2) / (log10 T2 - log10 T1)``, ``A = W1 + B*log10 T1``.

    Parameters: two (kinematic viscosity in m^2/s, temperature in K) points at
    different temperatures; viscosity must fall as temperature rises.

    Source: ASTM D341 (viscosity-temperature charts for liquid petroleum
    products), simple form with the 0.7 constant; good above about 2 mm^2/s.

    Example: 46 mm^2/s at 313.15 K and 6.76 mm^2/s at 373.15 K gives
    B = 3.700, A = 9.456 (rounded); at 333.15 K (60 degC) -> 20.56 mm^2/s.

    >>> fit = walther_fit(46e-6, 313.15, 6.76e-6, 373.15)
    >>> round(fit.kinematic_viscosity_m2s(333.15) * 1e6, 2)
    20.56
    """
    viscosity_1_m2s = _check_viscosity("first viscosity", viscosity_1_m2s)
    viscosity_2_m2s = _check_viscosity("second viscosity", viscosity_2_m2s)
    t1 = _check_temperature("first temperature", temperature_1)
    t2 = _check_temperature("second temperature", temperature_2)
    if t1 == t2:
        raise ValueError("the two viscosity points must be at different temperatures.")
    w1, w2 = _walther_w(viscosity_1_m2s), _walther_w(viscosity_2_m2s)
    b = (w1 - w2) / (math.log10(t2) - math.log10(t1))
    if b <= 0.0:
        raise ValueError("viscosity must fall as temperature rises; check the two points.")
    return WaltherFit(a=w1 + b * math.log10(t1), b=b)


def walther_viscosity_m2s(
    viscosity_1_m2s: float,
    temperature_1: float,
    viscosity_2_m2s: float,
    temperature_2: float,
    temperature: float,
) -> float:
    """Kinematic viscosity (m^2/s) at ``temperature`` (K) from two known points (ASTM D341).

    See :func:`walther_fit` for the formula and parameters.
    """
    fit = walther_fit(viscosity_1_m2s, temperature_1, viscosity_2_m2s, temperature_2)
    return fit.kinematic_viscosity_m2s(temperature)


def iso_vg_viscosity_m2s(grade: int, temperature: float) -> float:
    """Typical kinematic viscosity (m^2/s) of an ISO VG grade at ``temperature`` (K).

    Walther line (ASTM D341) through the ISO 3448 40 degC mid-point and the
    VI-100 100 degC value of :func:`typical_viscosity_100c_m2s`. An estimate
    for a mineral oil of viscosity index about 100; prefer measured points.

    Example: ISO VG 46 at 333.15 K (60 degC) -> 2.056e-5 m^2/s (20.56 mm^2/s).
    """
    return walther_viscosity_m2s(
        iso_vg_midpoint_m2s(grade), T_40C, typical_viscosity_100c_m2s(grade), T_100C, temperature
    )


def celsius_to_kelvin(celsius: float) -> float:
    """Temperature in K from degC: ``T = t + 273.15`` (ISO 80000-5)."""
    return _check_temperature("temperature", float(celsius) + KELVIN_AT_0C)


def density_at_temperature(
    reference_density: float,
    reference_temperature: float,
    temperature: float,
    expansion_coefficient: float = DENSITY_EXPANSION_PER_K,
) -> float:
    """Density (kg/m^3) at ``temperature`` from a reference density.

    Formula: ``rho = rho_ref / (1 + beta*(T - T_ref))`` (constant volumetric
    expansion coefficient beta, per K).

    The default beta = 6.5e-4 /K for mineral oil is common practice, no source;
    use the fluid data sheet where it gives one.

    Parameters: reference_density (kg/m^3, > 0) at reference_temperature (K),
    temperature (K), expansion_coefficient beta (1/K, >= 0).

    Source: definition of the volumetric thermal expansion coefficient.

    Example: 870 kg/m^3 at 288.15 K -> at 323.15 K: 870 / (1 + 6.5e-4*35) = 850.6 kg/m^3.

    >>> round(density_at_temperature(870.0, 288.15, 323.15), 1)
    850.6
    """
    reference_density = float(reference_density)
    if not math.isfinite(reference_density) or reference_density <= 0.0:
        raise ValueError(f"reference density must be positive, got {reference_density}.")
    t_ref = _check_temperature("reference temperature", reference_temperature)
    t = _check_temperature("temperature", temperature)
    beta = float(expansion_coefficient)
    if not math.isfinite(beta) or beta < 0.0:
        raise ValueError(f"expansion coefficient must not be negative, got {beta}.")
    factor = 1.0 + beta * (t - t_ref)
    if factor <= 0.0:
        raise ValueError("temperature is too far below the reference for a linear expansion model.")
    return reference_density / factor
