"""Pump relations: delivery, input power and input torque."""

import math

import pytest

from specgen.calc import supply


def test_pump_relations():
    # q = Vp*n*eta_v: 45 cm^3 at 2200 rpm and 0.93 -> 92.07 L/min (hand calc)
    q = supply.delivery(45e-6, 2200 / 60, 0.93)
    assert q * 60e3 == pytest.approx(92.07, rel=1e-4)
    # P = q*p/eta_t; practical form P[kW] = q[L/min]*p[bar]/(600*eta_t)
    assert supply.input_power(q, 200e5, 0.85) / 1e3 == pytest.approx(92.07 * 200 / 600 / 0.85, rel=1e-4)
    # input torque T = P/(2*pi*n) equals Vp*p/(2*pi*eta_hm) when eta_t = eta_v*eta_hm (hand calc)
    eta_v, eta_hm = 0.93, 0.914
    P = supply.input_power(supply.delivery(45e-6, 2200 / 60, eta_v), 200e5, eta_v * eta_hm)
    T = supply.input_torque(P, 2200 / 60)
    assert T == pytest.approx(45e-6 * 200e5 / (2 * math.pi * eta_hm), rel=1e-9)
    assert T == pytest.approx(156.72, abs=0.01)  # 45e-6 * 200e5 / (2*pi*0.914) = 900/5.7428 (hand calc)
