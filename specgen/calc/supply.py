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


def input_torque(displacement: float, pressure: float, eta_hm: float) -> float:
    """Shaft torque the pump takes  T = Vp * p / (2 pi * eta_hm)  (N*m).

    Example: 45 cm^3/rev at 200 bar, eta_hm 0.914: 45 * 200 / (62.83 * 0.914) = 156.7 N*m.
    """
    return displacement * pressure / (2.0 * math.pi * eta_hm)
