"""Starting-from-rest relations against hand calculations (winch drum, tractive force, gear stage
power balance, motor torque relation; fluid-power and vehicle-dynamics textbooks)."""

import math

import pytest

from specgen.calc import starting


def test_winch_example():
    # 30 kN on a 400 mm effective drum: 6000 N*m; through 5:1 at 0.95: 6000 / 4.75 = 1263.158 N*m
    t = starting.winch_static_torque(30e3, 0.4)
    assert t == pytest.approx(6000.0)
    need = starting.motor_start_torque(t, 5.0, 0.95)
    assert need == pytest.approx(1263.158, abs=0.001)
    # 400 cm^3 from rest at eta_start 0.80 needs 2*pi*1263.158/(400e-6*0.8) = 248.02 bar (> 245 bar)
    assert starting.starting_differential(need, 400e-6, 0.8) / 1e5 == pytest.approx(248.020, abs=0.001)


def test_wheel_at_rest():
    # 8000*9.80665*(0.08*cos(atan 0.18) + sin(atan 0.18)) = 20075.21 N
    theta = math.atan(0.18)
    assert starting.wheel_static_force(8000, 0.08, theta) == pytest.approx(20075.21, abs=0.01)
    # downhill steeper than the rolling resistance: nothing to overcome at rest
    assert starting.wheel_static_force(8000, 0.02, math.atan(-0.10)) == 0.0
