"""The pump's suction side: absolute pressure at the pump inlet.

SI units: pressure Pa (absolute where said), density kg/m^3, length m.
"""

from __future__ import annotations

STANDARD_ATMOSPHERE = 101325.0  # Pa, ISO 2533 standard atmosphere at sea level
G = 9.80665  # m/s^2, standard gravity (ISO 80000-3)


def pump_inlet_pressure(head: float, density: float, line_loss: float = 0.0, strainer_drop: float = 0.0,
                        atmosphere: float = STANDARD_ATMOSPHERE) -> float:
    """Absolute pressure at the pump inlet.

    p_in,abs = p_atm + rho * g * h - dp_suction_line - dp_strainer  (hydrostatics plus the losses
    on the way in; fluid-power textbook). head: oil level above the inlet, m (negative: the pump
    sits above the oil); density: kg/m^3; losses Pa. Returns Pa absolute.
    Example: 0.5 m head, 870 kg/m^3, 0.05 bar line loss, 0.1 bar strainer:
    101325 + 870 * 9.80665 * 0.5 - 5000 - 10000 = 90591 Pa = 0.906 bar abs.
    """
    return atmosphere + density * G * head - line_loss - strainer_drop
