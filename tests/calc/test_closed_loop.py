"""Closed-loop transmission relations (specgen/calc/closed_loop.py) against hand calculations.

Relations: primer section 15 (pump flow q = x*Vp*n_p*eta_v, pump torque T = x*Vp*dp/(2*pi*eta_hm),
charge flow covers sum(V*n*(1 - eta_v)) plus flushing), textbook hydrostatic transmission relations.
"""

import math

import pytest

from specgen.calc import closed_loop as hst

LPM = 1 / 60000  # m^3/s per L/min
RPM = 1 / 60  # rev/s per rpm
CC = 1e-6  # m^3 per cm^3
BAR = 1e5


def test_stroke_is_the_flow_over_the_full_stroke_delivery():
    # hand calculation: 100 cm^3 * 2000 rpm * 0.95 = 190 L/min at full stroke; 95 L/min -> x = 0.5
    assert hst.stroke_driving(95 * LPM, 100 * CC, 2000 * RPM, 0.95) == pytest.approx(0.5, rel=1e-12)
    # beyond full stroke: 228 L/min -> x = 1.2 (the pump cannot give it)
    assert hst.stroke_driving(228 * LPM, 100 * CC, 2000 * RPM, 0.95) == pytest.approx(1.2, rel=1e-12)


def test_pump_torque_at_half_stroke():
    # hand calculation: 0.5 * 100e-6 * 275e5 / (2*pi*0.92) = 1375 / 5.78053 = 237.87 N*m
    t = hst.pump_torque_driving(0.5, 100 * CC, (300 - 25) * BAR, 0.92)
    assert t == pytest.approx(237.87, abs=0.01)
    assert t == pytest.approx(0.5 * 100e-6 * 275e5 / (2 * math.pi * 0.92), rel=1e-12)


def test_overrunning_the_pump_swallows_the_flow_and_gives_torque_back():
    # hand calculation: the pump as a motor leaks on the way in: x = 95 * 0.95 / (100 * 2000 / 1000) = 0.45125
    x = hst.stroke_overrunning(95 * LPM, 100 * CC, 2000 * RPM, 0.95)
    assert x == pytest.approx(0.45125, rel=1e-12)
    # -0.45125 * 100e-6 * 275e5 * 0.92 / (2*pi) = -181.70 N*m: negative, it drives the shaft
    t = hst.pump_torque_overrunning(x, 100 * CC, 275 * BAR, 0.92)
    assert t == pytest.approx(-181.70, abs=0.01)
    # power back = hydraulic power * eta_v * eta_hm of the pump: 95 L/min * 275 bar = 43.542 kW -> 38.057 kW
    assert 2 * math.pi * 2000 * RPM * t == pytest.approx(-(95 * LPM) * 275 * BAR * 0.95 * 0.92, rel=1e-12)


def test_charge_need_of_the_worked_example():
    # hand calculation: pump 100 cm^3 at 2000 rpm, eta_v 0.95 leaks 100*2000*0.05 = 10 L/min; motor 160 cm^3
    # at 1100 rpm, eta_v 0.96 leaks 160*1100*0.04 = 7.04 L/min; flushing 10 L/min -> 27.04 L/min needed
    pump = hst.leakage(100 * CC, 2000 * RPM, 0.95)
    motor = hst.leakage(160 * CC, 1100 * RPM, 0.96)
    assert pump / LPM == pytest.approx(10.0, rel=1e-12)
    assert motor / LPM == pytest.approx(7.04, rel=1e-12)
    assert (pump + motor + 10 * LPM) / LPM == pytest.approx(27.04, rel=1e-12)


def test_charge_power():
    # hand calculation: 30 L/min * 25 bar / 0.8 = 5e-4 m^3/s * 25e5 Pa / 0.8 = 1562.5 W
    assert hst.charge_power(30 * LPM, 25 * BAR, 0.8) == pytest.approx(1562.5, rel=1e-12)


@pytest.mark.parametrize("args", [(-1e-3, 1e-4, 30.0, 0.95), (1e-3, 0.0, 30.0, 0.95), (1e-3, 1e-4, 30.0, 1.2)])
def test_non_physical_inputs_are_refused(args):
    with pytest.raises(ValueError):
        hst.stroke_driving(*args)
