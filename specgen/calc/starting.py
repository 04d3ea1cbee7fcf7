"""Starting from rest: the load that acts at standstill and the motor differential it needs.

SI units: force N, length m, mass kg, angle rad, torque N*m, displacement m^3/rev, pressure Pa.
"""

from __future__ import annotations

import math

G = 9.80665  # m/s^2, standard gravity (ISO 80000-3)
TWO_PI = 2.0 * math.pi


def winch_static_torque(line_pull: float, effective_diameter: float) -> float:
    """A hanging line load at rest: T = F * d_eff / 2 (the drum relation, no speed needed).

    Example: 30 kN on a 400 mm effective drum: 30000 * 0.2 = 6000 N*m.
    """
    return line_pull * effective_diameter / 2.0


def wheel_static_force(mass: float, rolling_resistance: float, grade: float) -> float:
    """Tractive force to move a vehicle from rest on a grade, no acceleration term:
    F = m*g*(c_rr*cos(theta) + sin(theta)), 0 when the vehicle would roll by itself
    (tractive-force relation, vehicle-dynamics textbook).

    Example: 8000 kg, c_rr 0.08, 18 % grade (theta = atan 0.18 = 0.1781 rad):
    8000 * 9.80665 * (0.08 * 0.98418 + 0.17715) = 20075 N.
    """
    return max(mass * G * (rolling_resistance * math.cos(grade) + math.sin(grade)), 0.0)


def motor_start_torque(static_load_torque: float, ratio: float, eta_start: float) -> float:
    """Torque the motor must give from rest: T = T_static / (i * eta_gear,start) (gear-stage
    power balance with the starting efficiency).

    Example: 6000 N*m through 5:1 at 0.95: 6000 / (5 * 0.95) = 1263.2 N*m.
    """
    return static_load_torque / (ratio * eta_start)


def starting_differential(start_torque: float, displacement: float, eta_start: float) -> float:
    """Differential a motor needs to start: dp = 2*pi*T_start / (Vg * eta_start) (motor torque
    relation with the starting efficiency).

    Example: 1263.2 N*m on 400 cm^3 at 0.80: 2 pi * 1263.16 / (400e-6 * 0.8) = 248.02 bar.
    """
    return TWO_PI * start_torque / (displacement * eta_start)
