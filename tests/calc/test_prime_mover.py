"""Prime mover relations: power read off a curve, pump speed through a drive ratio, torque referred to it."""

import math

import pytest

from specgen.calc import prime_mover as pm
from specgen.calc.supply import input_torque

RPM = 1 / 60
CURVE = ((1000 * RPM, 40e3), (2200 * RPM, 75e3))  # engine of the worked example: 40 kW idle, 75 kW rated


def test_power_between_curve_points_is_linear():
    # hand calculation: 40 + (75 - 40) * (1600 - 1000) / (2200 - 1000) = 57.5 kW
    assert pm.power_at(1600 * RPM, 75e3, CURVE) == pytest.approx(57.5e3)


def test_power_at_the_curve_ends_is_the_points_own():
    assert pm.power_at(1000 * RPM, 75e3, CURVE) == pytest.approx(40e3)
    assert pm.power_at(2200 * RPM, 75e3, CURVE) == pytest.approx(75e3)


def test_three_point_curve_uses_the_neighbouring_points():
    # hand calculation: between (1500 rpm, 60 kW) and (2200 rpm, 70 kW): 60 + 10 * 350 / 700 = 65 kW
    curve = ((1000 * RPM, 40e3), (1500 * RPM, 60e3), (2200 * RPM, 70e3))
    assert pm.power_at(1850 * RPM, 80e3, curve) == pytest.approx(65e3)
    assert pm.power_at(1250 * RPM, 80e3, curve) == pytest.approx(50e3)  # 40 + 20 * 250/500


def test_without_a_curve_the_rated_power_holds_at_every_speed():
    assert pm.power_at(900 * RPM, 75e3) == 75e3


@pytest.mark.parametrize("rpm", [999.0, 2201.0])
def test_the_curve_is_never_extrapolated(rpm):
    with pytest.raises(ValueError, match="outside the power curve"):
        pm.power_at(rpm * RPM, 75e3, CURVE)


def test_pump_speed_is_engine_speed_times_drive_ratio():
    # hand calculation: 2200 rpm * 1.2 = 2640 rpm
    assert pm.pump_speed(2200 * RPM, 1.2) * 60 == pytest.approx(2640)


def test_referred_torque_keeps_the_power():
    # hand calculation: a pump taking 30 kW at 2640 rpm takes 30000 / (2*pi*44) = 108.51 N*m; at the engine
    # (2200 rpm) the same 30 kW is 30000 / (2*pi*36.667) = 130.22 N*m = 108.51 * 1.2
    t_p = input_torque(30e3, 2640 * RPM)
    assert t_p == pytest.approx(108.515, abs=1e-3)
    t_pm = pm.referred_torque(t_p, 1.2)
    assert t_pm == pytest.approx(130.218, abs=1e-3)
    assert t_pm * 2 * math.pi * 2200 * RPM == pytest.approx(30e3)


def test_referred_torque_keeps_the_sign_of_a_driving_pump():
    assert pm.referred_torque(-100.0, 1.5) == pytest.approx(-150.0)
