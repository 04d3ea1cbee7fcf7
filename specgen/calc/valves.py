"""Valves in a drive's pressure budget: orifice-law drops of a directional valve, the braking
torque a port (crossover) relief allows, and the pilot pressure that opens a counterbalance valve.

SI units: pressure Pa, flow m^3/s, displacement m^3/rev, torque N*m. Efficiencies in (0, 1].
"""

from __future__ import annotations

import math

TWO_PI = 2.0 * math.pi


def orifice_drop(rated_drop: float, rated_flow: float, flow: float) -> float:
    """Pressure drop across a fixed restriction at ``flow``, from its drop at a rated flow.

    dp = dp_rated * (q / q_rated)^2  (turbulent flow through an orifice: the drop follows the
    square of the flow; fluid-power textbook orifice equation).
    rated_drop: Pa at rated_flow (m^3/s); flow: m^3/s (its sign is ignored). Returns Pa.
    Example: 8 bar at 60 L/min, at 45 L/min: 8 * (45/60)^2 = 4.5 bar.
    """
    if rated_flow <= 0:
        raise ValueError("rated flow must be positive")
    return rated_drop * (abs(flow) / rated_flow) ** 2


def port_relief_braking_torque(displacement: float, relief_setting: float, low_side: float, eta_hm: float) -> float:
    """Braking torque a port (crossover) relief lets the motor exert as a pump.

    T = Vg * (p_cross - p_low) / (2*pi * eta_hm): driven by the load the motor's friction adds to
    the braking, so the shaft torque is the hydraulic torque over eta_hm (motor relations, the
    power flowing back). displacement: m^3/rev; pressures Pa; returns N*m.
    Example: 200 cm^3 at 240 bar over 10 bar, eta_hm 0.9: 200e-6 * 230e5 / (2 pi * 0.9) = 813.5 N*m (813.46).
    """
    return displacement * (relief_setting - low_side) / (TWO_PI * eta_hm)


def braking_differential(shaft_torque: float, displacement: float, eta_hm: float) -> float:
    """The inverse: differential a motor builds braking ``shaft_torque``  dp = 2*pi*T*eta_hm / Vg.

    Example: 813.5 N*m on 200 cm^3 at eta_hm 0.9: 2 pi * 813.5 * 0.9 / 200e-6 = 230 bar.
    """
    return TWO_PI * shaft_torque * eta_hm / displacement


def counterbalance_pilot_pressure(setting: float, braking_dp: float, pilot_ratio: float) -> float:
    """Inlet (pilot) pressure that holds a counterbalance valve open while a motor lowers a load.

    The valve opens when p_load + k * p_pilot >= p_set; on a motor the load port sees the inlet
    pressure plus the braking differential, so p_in + dp_brake + k * p_in = p_set and
    p_in = (p_set - dp_brake) / (1 + k)  (force balance on the valve poppet; the valve maker's
    opening relation). Returns Pa, 0 when the load alone opens the valve.
    Example: setting 210 bar, braking differential 60 bar, k = 4: (210 - 60) / 5 = 30 bar.
    """
    if pilot_ratio <= 0:
        raise ValueError("pilot ratio must be positive")
    return max((setting - braking_dp) / (1.0 + pilot_ratio), 0.0)
