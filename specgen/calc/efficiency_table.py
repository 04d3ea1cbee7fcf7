"""A motor's efficiencies from the maker's table, and the pressure differential that depends on them.

Units: pressure differential Pa, speed rev/s, torque N*m, displacement m^3/rev; efficiencies are
fractions. The table is a rectangular grid (rows: pressure differential, columns: speed); values
between grid points are interpolated bilinearly with scipy.interpolate.RegularGridInterpolator
(method "linear"), the usual reading of a maker's table (common practice, no source). A point outside
the grid is never extrapolated: the lookup says so and gives no value.
scipy is imported only when a table is read, so specs without tables do not pay for it.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

MAX_ITERATIONS = 50
TOLERANCE = 1e-9  # relative change of the pressure differential between iterations


@dataclass(frozen=True)
class TablePoint:
    """Efficiencies read at (dp, n); ``inside`` False: the point lies outside the grid (no values)."""

    dp: float  # Pa
    speed: float  # rev/s
    volumetric: float | None
    hydromechanical: float | None
    inside: bool


@dataclass(frozen=True)
class Solved:
    """The pressure differential consistent with the table's hydro-mechanical efficiency at it."""

    point: TablePoint
    iterations: int
    converged: bool


def inside(axis, x: float) -> bool:
    return axis[0] <= x <= axis[-1]


def lookup(pressures, speeds, volumetric, hydromechanical, dp: float, n: float) -> TablePoint:
    """Bilinear interpolation of both grids at (dp, n); no values outside the grid.

    Example (hand calculation): grid dp (100, 200) bar, n (10, 20) rev/s, eta_hm rows (0.80, 0.90) and
    (0.84, 0.94): at 150 bar, 15 rev/s -> mean of the four corners = (0.80 + 0.90 + 0.84 + 0.94) / 4 = 0.87.
    """
    if not (inside(pressures, dp) and inside(speeds, n)):
        return TablePoint(dp, n, None, None, False)
    from scipy.interpolate import RegularGridInterpolator

    axes = (tuple(pressures), tuple(speeds))
    out = []
    for grid in (volumetric, hydromechanical):
        f = RegularGridInterpolator(axes, [list(r) for r in grid], method="linear", bounds_error=True)
        out.append(float(f([[dp, n]])[0]))
    return TablePoint(dp, n, out[0], out[1], True)


def starting(pressures, values, dp: float) -> float | None:
    """Starting efficiency at ``dp``, linear between the grid pressures; None outside them.
    Example: (0.80 at 100 bar, 0.84 at 200 bar) at 175 bar -> 0.80 + 0.75 * 0.04 = 0.83."""
    if not inside(pressures, dp):
        return None
    for (p0, v0), (p1, v1) in zip(zip(pressures, values), zip(pressures[1:], values[1:])):
        if p0 <= dp <= p1:
            return v0 + (v1 - v0) * (dp - p0) / (p1 - p0)
    return values[-1]


def solve_differential(pressures, speeds, volumetric, hydromechanical, torque: float, displacement: float,
                       n: float, overrunning: bool = False) -> Solved:
    """Fixed-point iteration of dp = 2*pi*T / (Vg * eta_hm(dp, n)) (overrunning: dp = 2*pi*T*eta_hm / Vg).

    Starts from the lossless differential 2*pi*T/Vg (brought inside the grid's pressures); eta_hm
    changes slowly with dp, so a few steps settle it. Stops after MAX_ITERATIONS (``converged`` False) or when the point leaves the grid
    (``point.inside`` False, at the differential that left it). Source: motor torque relation
    T = Vg*dp*eta_hm/(2*pi) (fluid-power textbook). Example: Vg 100 cm^3/rev, T 300 N*m, a table with
    eta_hm 0.9 everywhere -> dp = 2*pi*300 / (1e-4 * 0.9) = 209.4 bar after two steps.
    """
    ideal = 2 * math.pi * torque / displacement
    # The first guess only starts the iteration inside the grid; the answer must lie inside on its own.
    dp = min(max(ideal, pressures[0]), pressures[-1])
    point = lookup(pressures, speeds, volumetric, hydromechanical, dp, n)
    for k in range(1, MAX_ITERATIONS + 1):
        if not point.inside:
            return Solved(point, k, False)
        new = ideal * point.hydromechanical if overrunning else ideal / point.hydromechanical
        converged = abs(new - dp) <= TOLERANCE * max(abs(new), 1.0)
        dp = new
        point = lookup(pressures, speeds, volumetric, hydromechanical, dp, n)
        if converged:
            return Solved(point, k, point.inside)
    return Solved(point, MAX_ITERATIONS, False)
