"""Motor sizing from a duty point and rounding to preferred or stocked sizes.

Units: torque N*m, pressure Pa, displacement m^3/rev, speed rev/s, flow m^3/s.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from dataclasses import dataclass

from specgen.calc.guards import positive as _positive, efficiency as _efficiency

# ISO 3 preferred numbers, rounded values of the basic series (one decade).
R5: tuple[float, ...] = (1.00, 1.60, 2.50, 4.00, 6.30)
R10: tuple[float, ...] = (1.00, 1.25, 1.60, 2.00, 2.50, 3.15, 4.00, 5.00, 6.30, 8.00)
R20: tuple[float, ...] = (
    1.00, 1.12, 1.25, 1.40, 1.60, 1.80, 2.00, 2.24, 2.50, 2.80,
    3.15, 3.55, 4.00, 4.50, 5.00, 5.60, 6.30, 7.10, 8.00, 9.00,
)  # fmt: skip
R40: tuple[float, ...] = (
    1.00, 1.06, 1.12, 1.18, 1.25, 1.32, 1.40, 1.50, 1.60, 1.70,
    1.80, 1.90, 2.00, 2.12, 2.24, 2.36, 2.50, 2.65, 2.80, 3.00,
    3.15, 3.35, 3.55, 3.75, 4.00, 4.25, 4.50, 4.75, 5.00, 5.30,
    5.60, 6.00, 6.30, 6.70, 7.10, 7.50, 8.00, 8.50, 9.00, 9.50,
)  # fmt: skip
PREFERRED_SERIES: dict[str, tuple[float, ...]] = {"R5": R5, "R10": R10, "R20": R20, "R40": R40}

# A value within this relative distance of a series member counts as equal to
# it, so 160 cm^3 (1.6e-4 m^3, not exact in binary) maps to 160 and not 200.
_REL_TOL = 1e-9


def minimum_displacement(torque: float, target_pressure: float, outlet_pressure: float, eta_hm: float) -> float:
    """Smallest displacement (m^3/rev) that gives ``torque`` at a target working pressure.

    Formula: ``Vg_min = 2*pi*T / (dp_target * eta_hm)``, ``dp_target = p_target - p_out``.

    Parameters: torque T (N*m, > 0, at the motor shaft), target_pressure
    p_target (Pa, inlet), outlet_pressure p_out (Pa, back pressure, >= 0,
    same reference as p_target), eta_hm (hydro-mechanical efficiency, (0, 1]).

    Source: torque of a positive-displacement motor, ``T = Vg*dp*eta_hm/(2*pi)``.

    Example: 1500 N*m at 250 bar with 10 bar back pressure, eta_hm = 0.92
    -> 2*pi*1500 / (240e5*0.92) = 4.268e-4 m^3/rev (426.8 cm^3).

    >>> round(minimum_displacement(1500, 250e5, 10e5, 0.92) * 1e6, 1)
    426.8
    """
    torque = _positive("torque", torque)
    p_target = _positive("target pressure", target_pressure)
    p_out = float(outlet_pressure)
    if not math.isfinite(p_out) or p_out < 0.0:
        raise ValueError(f"outlet pressure must not be negative, got {p_out}.")
    if p_out >= p_target:
        raise ValueError("target pressure must exceed the outlet pressure to give any torque.")
    return 2.0 * math.pi * torque / ((p_target - p_out) * _efficiency("hydro-mechanical efficiency", eta_hm))


def flow_demand(displacement: float, speed: float, eta_v: float) -> float:
    """Flow (m^3/s) a motor needs for a speed: ``q = Vg * n / eta_v``.

    Parameters: displacement Vg (m^3/rev, > 0), speed n (rev/s, >= 0),
    eta_v (volumetric efficiency, (0, 1]).

    Source: positive-displacement motor flow relation.

    Example: 426.8 cm^3 at 2 rev/s, eta_v = 0.95 -> 8.985e-4 m^3/s (53.9 L/min).
    """
    vg = _positive("displacement", displacement)
    n = float(speed)
    if not math.isfinite(n) or n < 0.0:
        raise ValueError(f"speed must not be negative, got {n}.")
    return vg * n / _efficiency("volumetric efficiency", eta_v)


def maximum_displacement_for_flow(flow: float, speed: float, eta_v: float) -> float:
    """Largest displacement (m^3/rev) that the available flow still turns at ``speed``.

    Formula: ``Vg_max = q * eta_v / n``.

    Parameters: flow q (m^3/s, > 0), speed n (rev/s, > 0), eta_v ((0, 1]).

    Example: 60 L/min (1e-3 m^3/s), 2 rev/s, eta_v = 0.95 -> 4.75e-4 m^3/rev.
    """
    return _positive("flow", flow) * _efficiency("volumetric efficiency", eta_v) / _positive("speed", speed)


@dataclass(frozen=True)
class DisplacementWindow:
    """Displacements that satisfy a duty point.

    ``minimum`` meets the torque at the target pressure; ``maximum`` (None when
    no flow is given) still reaches the speed with the available flow.
    ``feasible`` is True when minimum <= maximum (or no flow was given).
    """

    minimum: float  # m^3/rev
    maximum: float | None  # m^3/rev
    flow_at_minimum: float  # m^3/s needed by the minimum displacement at the duty speed

    @property
    def feasible(self) -> bool:
        return self.maximum is None or self.minimum <= self.maximum * (1.0 + _REL_TOL)


def displacement_window(
    torque: float,
    speed: float,
    target_pressure: float,
    outlet_pressure: float,
    eta_hm: float,
    eta_v: float,
    available_flow: float | None = None,
) -> DisplacementWindow:
    """Torque side and flow side of a duty point together (see the functions above).

    Example: 1500 N*m at 2 rev/s, 250 bar, 10 bar out, eta_hm 0.92, eta_v 0.95,
    60 L/min available -> minimum 4.268e-4, maximum 4.75e-4 m^3/rev: feasible.
    """
    vg_min = minimum_displacement(torque, target_pressure, outlet_pressure, eta_hm)
    vg_max = None if available_flow is None else maximum_displacement_for_flow(available_flow, speed, eta_v)
    return DisplacementWindow(minimum=vg_min, maximum=vg_max, flow_at_minimum=flow_demand(vg_min, speed, eta_v))


def _series(series: str | Sequence[float]) -> tuple[float, ...]:
    if isinstance(series, str):
        try:
            return PREFERRED_SERIES[series.upper()]
        except KeyError:
            raise ValueError(f"unknown preferred-number series {series!r}; use R5, R10, R20 or R40.") from None
    mantissas = tuple(sorted(float(m) for m in series))
    if not mantissas or any(not (1.0 <= m < 10.0) for m in mantissas):
        raise ValueError("a custom series must list one decade of values from 1 up to (not including) 10.")
    return mantissas


def next_size_up(value: float, series: str | Sequence[float] = "R10") -> float:
    """Smallest preferred number that is at least ``value``, across decades.

    The series repeats every decade (ISO 3): the R10 values 1.00 ... 8.00
    times 10^k for any integer k. A value equal to a series member (within a
    relative 1e-9) returns that member. Works for any positive value in any
    unit; pass displacement in m^3/rev and get m^3/rev back.

    Parameters: value (> 0); series "R5", "R10", "R20", "R40" or one decade
    of mantissas in [1, 10).

    Source: ISO 3 (preferred numbers, series of preferred numbers).

    Example: 426.8e-6 m^3/rev on R10 -> 500e-6; on R20 -> 450e-6; 160e-6 -> 160e-6.

    >>> next_size_up(426.8e-6, "R10")
    0.0005
    """
    value = _positive("value", value)
    mantissas = _series(series)
    exponent = math.floor(math.log10(value))
    for k in (exponent - 1, exponent, exponent + 1):
        scale = 10.0**k
        for m in mantissas:
            candidate = float(f"{m * scale:.12g}")  # drop binary noise from m * 10^k
            if candidate >= value * (1.0 - _REL_TOL):
                return candidate
    raise AssertionError("unreachable: the next decade always holds a larger member")


def next_stocked_size(value: float, sizes: Iterable[float]) -> float | None:
    """Smallest stocked size that is at least ``value``, or None when none is.

    None (not an exception) because "nothing in stock is large enough" is a
    design finding a check reports, not an input error. A size equal to the
    value (within a relative 1e-9) is accepted.

    Parameters: value (> 0, same unit as sizes); sizes (positive numbers, any order).

    Example: 426.8e-6 among (250e-6, 400e-6, 500e-6) -> 500e-6; 600e-6 -> None.

    >>> next_stocked_size(426.8e-6, [250e-6, 400e-6, 500e-6])
    0.0005
    """
    value = _positive("value", value)
    stock = sorted(_positive("stocked size", s) for s in sizes)
    if not stock:
        raise ValueError("the list of stocked sizes is empty.")
    for size in stock:
        if size >= value * (1.0 - _REL_TOL):
            return size
    return None
