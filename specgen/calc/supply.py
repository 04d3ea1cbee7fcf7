"""Pump delivery and input: the supply side of a drive circuit.

SI units: displacement m^3/rev, speed rev/s, flow m^3/s, pressure Pa, power W, torque N*m.
Source: the ideal positive-displacement pump relations of fluid-power textbooks with
volumetric, hydro-mechanical and overall efficiency (eta_t = eta_v * eta_hm).
"""

from __future__ import annotations

import math


def delivery(displacement: float, shaft_speed: float, eta_v: float) -> float:
    """Delivered flow  q = Vp * n * eta_v.

    Example: 45 cm^3/rev at 2200 rpm, eta_v 0.93: 45 * 2200 * 0.93 / 1000 = 92.07 L/min.
    """
    return displacement * shaft_speed * eta_v


def input_power(flow: float, pressure: float, eta_t: float) -> float:
    """Shaft power the pump takes  P = q * p / eta_t  (W).

    Example: 92.07 L/min at 200 bar, eta_t 0.85: 92.07 * 200 / 600 / 0.85 = 36.11 kW.
    """
    return flow * pressure / eta_t


def input_torque(power: float, shaft_speed: float) -> float:
    """Shaft torque that takes ``power`` at ``shaft_speed``  T = P / (2 pi * n)  (N*m); the pump's
    input torque at its shaft speed, or the prime mover's at its own speed.

    Equals Vp * p / (2 pi * eta_hm) for a pump when P = q * p / eta_t and eta_t = eta_v * eta_hm.
    Example: 36.11 kW at 2200 rpm: 36110 / (2 pi * 36.67) = 156.7 N*m.
    """
    return power / (2.0 * math.pi * shaft_speed)
