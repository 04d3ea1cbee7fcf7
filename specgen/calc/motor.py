"""Relations of a positive-displacement hydraulic motor (any construction).

SI units throughout: displacement Vg in m^3/rev, pressure in Pa, flow in m^3/s, speed in rev/s,
torque in N*m, power in W. Efficiencies are fractions in (0, 1].
Source for every relation here: the ideal positive-displacement machine relations of fluid-power
textbooks (torque = displacement x pressure / 2 pi; speed = flow / displacement), corrected by
volumetric and hydro-mechanical efficiency.
"""

from __future__ import annotations

import math

TWO_PI = 2.0 * math.pi


def torque(displacement: float, dp: float, eta_hm: float) -> float:
    """Effective shaft torque  T = Vg * dp * eta_hm / (2 pi).

    displacement: Vg, m^3/rev; dp: pressure differential, Pa; eta_hm: hydro-mechanical efficiency.
    Returns N*m. Example: 160 cm^3/rev at 200 bar, eta_hm 0.9:
    160e-6 * 200e5 * 0.9 / (2 pi) = 458.4 N*m  (practical form 160 * 200 * 0.9 / 62.83).
    """
    return displacement * dp * eta_hm / TWO_PI


def pressure_for_torque(shaft_torque: float, displacement: float, eta_hm: float) -> float:
    """Pressure differential a driving motor needs for a torque  dp = 2 pi T / (Vg * eta_hm).

    shaft_torque: N*m; displacement: m^3/rev; returns Pa.
    Example: 458.4 N*m on 160 cm^3/rev at eta_hm 0.9 -> 200 bar.
    """
    return TWO_PI * shaft_torque / (displacement * eta_hm)


def braking_pressure(shaft_torque: float, displacement: float, eta_hm: float) -> float:
    """Pressure differential an overrunning motor builds while the load drives it as a pump.

    dp = 2 pi T * eta_hm / Vg : friction now helps hold the load, so less pressure is needed
    than when driving. shaft_torque: N*m; displacement: m^3/rev; returns Pa.
    Example: 458.4 N*m on 160 cm^3/rev at eta_hm 0.9 -> 162 bar.
    """
    return TWO_PI * shaft_torque * eta_hm / displacement


def speed(flow: float, displacement: float, eta_v: float) -> float:
    """Shaft speed from the flow supplied  n = q * eta_v / Vg.

    flow: m^3/s; displacement: m^3/rev; returns rev/s.
    Example: 45 L/min into 160 cm^3/rev at eta_v 0.95: 45 * 1000 * 0.95 / 160 = 267.2 rpm.
    """
    return flow * eta_v / displacement


def flow_for_speed(shaft_speed: float, displacement: float, eta_v: float) -> float:
    """Flow a motor needs to turn at a speed  q = Vg * n / eta_v.

    shaft_speed: rev/s; displacement: m^3/rev; returns m^3/s.
    Example: 267.2 rpm on 160 cm^3/rev at eta_v 0.95 -> 45 L/min.
    """
    return displacement * shaft_speed / eta_v


def shaft_power(shaft_torque: float, shaft_speed: float) -> float:
    """Mechanical power  P = 2 pi n T.  shaft_torque: N*m; shaft_speed: rev/s; returns W.

    Example: 458.4 N*m at 267.2 rpm -> 12.83 kW.
    """
    return TWO_PI * shaft_speed * shaft_torque


def hydraulic_power(flow: float, dp: float) -> float:
    """Hydraulic power  P_h = q * dp.  flow: m^3/s; dp: Pa; returns W.

    Example (practical form P[kW] = q[L/min] * dp[bar] / 600): 45 L/min at 200 bar -> 15 kW.
    """
    return flow * dp
