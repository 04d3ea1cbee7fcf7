"""Valve relations against hand calculations (fluid-power textbook relations named in each)."""

import math

import pytest

from specgen.calc import valves


def test_orifice_drop_follows_the_square_of_flow():
    # orifice law dp = dp_rated * (q/q_rated)^2: 8 bar at 60 L/min -> 8 * (45/60)^2 = 4.5 bar at 45 L/min
    assert valves.orifice_drop(8e5, 60 / 60e3, 45 / 60e3) == pytest.approx(4.5e5)
    assert valves.orifice_drop(8e5, 60 / 60e3, 120 / 60e3) == pytest.approx(32e5)  # double flow, four times the drop
    with pytest.raises(ValueError):
        valves.orifice_drop(8e5, 0.0, 1.0)


def test_port_relief_braking_torque_and_its_inverse():
    # T = Vg*(p_cross - p_low)/(2*pi*eta_hm): 200e-6 * 230e5 / (2*pi*0.9) = 813.459 N*m (hand calculation)
    t = valves.port_relief_braking_torque(200e-6, 240e5, 10e5, 0.9)
    assert t == pytest.approx(813.459, abs=0.001)
    # inverse dp = 2*pi*T*eta_hm/Vg gives back the 230 bar
    assert valves.braking_differential(t, 200e-6, 0.9) == pytest.approx(230e5)
    # practical form: Vg [cm^3] * dp [bar] / (62.83 * eta_hm) = 200 * 230 / (62.832 * 0.9) = 813.46
    assert t == pytest.approx(200 * 230 / (20 * math.pi * 0.9), rel=1e-9)


def test_counterbalance_pilot_pressure():
    # p_in = (p_set - dp_brake)/(1 + k): (210 - 60)/(1 + 4) = 30 bar (valve force balance, hand calculation)
    assert valves.counterbalance_pilot_pressure(210e5, 60e5, 4.0) == pytest.approx(30e5)
    # a load that alone opens the valve needs no pilot pressure
    assert valves.counterbalance_pilot_pressure(100e5, 120e5, 3.0) == 0.0
    with pytest.raises(ValueError):
        valves.counterbalance_pilot_pressure(100e5, 10e5, 0.0)
