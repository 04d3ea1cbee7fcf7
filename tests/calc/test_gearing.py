"""Gear-stage relations: speed and torque through a gear stage, power flowing either way."""

import math

import pytest

from specgen.calc import gearing


def test_gear_stage_power_balance():
    # Driving: motor power = load power / eta; overrunning: motor power = load power * eta (hand calc)
    T_L, n_L, i, eta = 10e3, 0.2, 25.0, 0.95
    n_m = gearing.motor_speed(n_L, i)
    assert 2 * math.pi * n_m * gearing.motor_torque_driving(T_L, i, eta) == pytest.approx(2 * math.pi * n_L * T_L / eta)
    assert 2 * math.pi * n_m * gearing.motor_torque_overrunning(T_L, i, eta) == pytest.approx(2 * math.pi * n_L * T_L * eta)
