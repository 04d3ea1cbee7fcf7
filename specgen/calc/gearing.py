"""A gear stage between motor and load. Ratio i = motor speed / load speed (> 0).

Source: power balance across a gear stage with efficiency eta (machine-design textbooks):
driving, the motor supplies the losses; overrunning, the load does.
"""

from __future__ import annotations


def motor_speed(load_speed: float, ratio: float) -> float:
    """n_motor = n_load * i.  Speeds in rev/s. Example: 12 rpm load, i = 25 -> 300 rpm."""
    return load_speed * ratio


def motor_torque_driving(load_torque: float, ratio: float, eta: float) -> float:
    """T_motor = T_load / (i * eta) when the motor drives the load.

    Torques N*m. Example: 10 kN*m, i = 25, eta = 0.95 -> 421.1 N*m.
    """
    return load_torque / (ratio * eta)


def motor_torque_overrunning(load_torque: float, ratio: float, eta: float) -> float:
    """T_motor = T_load * eta / i when the load drives the motor (lowering, downhill).

    Torques N*m. Example: 10 kN*m, i = 25, eta = 0.95 -> 380 N*m.
    """
    return load_torque * eta / ratio


def load_torque(motor_torque: float, ratio: float, eta: float) -> float:
    """Torque a driving motor gives at the load shaft: T_load = T_motor * i * eta (N*m)."""
    return motor_torque * ratio * eta
