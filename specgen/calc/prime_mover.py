"""A prime mover shared by several pumps: the power it gives at a speed, and pump torques referred to it.

Relations (power balance on a shaft, fluid-power textbook; pump relations in calc/supply.py):
  power at speed     P(n) = P_a + (P_b - P_a) * (n - n_a) / (n_b - n_a) between the curve points a, b
                     with n_a <= n <= n_b (linear interpolation); no curve: the rated power at every speed.
                     Outside the curve nothing is extrapolated: a ValueError.
  pump speed         n_p = n_pm * i_pd (i_pd: pump shaft speed / prime mover speed)
  referred torque    T_pm = T_p * i_pd: the same power P = 2*pi*n_p*T_p = 2*pi*n_pm*T_pm passes the
                     drive (gearbox losses neglected), so torque scales with the speed ratio.
  powers add         P_pm = sum(P_in,i) over the pumps on the prime mover; torques add at its shaft.

Units: speed rev/s, power W, torque N*m.

Worked example (hand calculation): an engine 40 kW at 1000 rpm and 75 kW at 2200 rpm, linear between,
gives at 1600 rpm 40 + 35 * 600/1200 = 57.5 kW. A pump taking 160 N*m on a drive ratio of 1.2 loads
the engine shaft with 160 * 1.2 = 192 N*m.
"""

from __future__ import annotations

from typing import Sequence

from specgen.calc.guards import finite, positive


def power_at(speed: float, rated_power: float, curve: Sequence[tuple[float, float]] = ()) -> float:
    """Power available at ``speed`` (rev/s): linear on ``curve`` ((speed, power) pairs, speeds rising),
    or ``rated_power`` (W) when there is no curve.

    Example: power_at(1600/60, 75e3, ((1000/60, 40e3), (2200/60, 75e3))) == 57500.0 (within rounding).
    """
    speed = positive("prime mover speed", speed)
    if not curve:
        return positive("rated power", rated_power)
    lo, hi = curve[0][0], curve[-1][0]
    # a hair of tolerance: a named speed equal to an end point may differ from it in the last bit
    tol = 1e-9 * hi
    if not lo - tol <= speed <= hi + tol:
        raise ValueError(f"speed {speed * 60:.6g} rpm lies outside the power curve ({lo * 60:.6g} to "
                         f"{hi * 60:.6g} rpm); the curve is not extrapolated.")
    speed = min(max(speed, lo), hi)
    for (n_a, p_a), (n_b, p_b) in zip(curve, curve[1:]):
        if n_a <= speed <= n_b:
            return p_a + (p_b - p_a) * (speed - n_a) / (n_b - n_a)
    return curve[-1][1]  # unreachable for a rising curve; kept for a one-point span


def pump_speed(prime_mover_speed: float, drive_ratio: float) -> float:
    """n_p = n_pm * i_pd. Example: 2200 rpm on a ratio of 1.2 turns the pump at 2640 rpm."""
    return positive("prime mover speed", prime_mover_speed) * positive("drive ratio", drive_ratio)


def referred_torque(pump_torque: float, drive_ratio: float) -> float:
    """T_pm = T_p * i_pd: a pump's input torque as the prime mover's shaft feels it (signed: negative
    when the pump drives the prime mover). Example: 160 N*m at a ratio of 1.2 is 192 N*m."""
    return finite("pump input torque", pump_torque) * positive("drive ratio", drive_ratio)
