"""Tractive effort relations of a travel transmission, each checked against a hand calculation."""

import math

import pytest

from specgen.calc import traction
from specgen.calc.traction import ADHESION, FLOW, POWER, RELIEF, Transmission

G = 9.80665  # standard gravity, CGPM 1901


def test_adhesion_limit_is_mu_times_the_driven_weight():
    # hand calculation: mu 0.7 on W_driven = 60 kN -> 0.7 * 60 000 = 42 000 N
    assert traction.adhesion_limit(0.7, 60000 / G) == pytest.approx(42000.0, rel=1e-12)


def test_adhesion_limit_on_a_grade_takes_the_normal_force():
    # hand calculation: 10 % grade, theta = atan(0.1), cos = 0.995037; 42 000 * 0.995037 = 41 791.6 N
    assert traction.adhesion_limit(0.7, 60000 / G, math.atan(0.1)) == pytest.approx(41791.6, abs=0.1)


def test_power_line_at_two_metres_a_second():
    # hand calculation: eta_total 0.75 * P_engine 50 kW / v 2 m/s = 18 750 N
    assert traction.power_limited_effort(0.75, 50e3, 2.0) == pytest.approx(18750.0)
    assert traction.power_limited_effort(0.75, 50e3, 0.0) == math.inf


def test_effort_at_the_pressure_limit_through_a_gear_stage():
    # hand calculation: T = 110e-6 * 345e5 * 0.92 / (2*pi) = 3491.4 / 6.28319 = 555.67 N*m;
    # F = 555.67 * 8 * 0.96 / 0.4 = 10 668.9 N
    assert traction.effort_at_pressure(110e-6, 345e5, 0.92, 8.0, 0.96, 0.4) == pytest.approx(10668.9, abs=0.1)


def test_relief_line_falls_as_one_over_speed_past_full_displacement_only_for_a_variable_motor():
    t = Transmission(30e3, 1.0, 3.0, True)
    # hand calculation: 30 kN * 1.0 / 2.0 = 15 kN at 2 m/s; flat below 1 m/s; nothing above 3 m/s
    assert traction.relief_effort_at(t, 0.5) == 30e3
    assert traction.relief_effort_at(t, 2.0) == pytest.approx(15e3)
    assert traction.relief_effort_at(t, 3.01) == 0.0
    assert traction.relief_effort_at(Transmission(30e3, 1.0, 3.0, False), 2.0) == 30e3


def test_effort_limit_names_the_line_that_sets_it():
    t = Transmission(30e3, 1.0, 3.0, False)
    # 0.5 m/s: relief 30 kN < adhesion 42 kN < power 0.75*50e3/0.5 = 75 kN
    assert traction.effort_limit(t, 0.5, 42e3, 0.75, 50e3) == (30e3, RELIEF)
    # adhesion 25 kN below the relief line
    assert traction.effort_limit(t, 0.5, 25e3, 0.75, 50e3) == (25e3, ADHESION)
    # 2 m/s: power 18.75 kN (hand calculation above) below relief 30 kN
    assert traction.effort_limit(t, 2.0, 42e3, 0.75, 50e3) == (pytest.approx(18750.0), POWER)
    # above the top speed the flow limits: nothing is left
    assert traction.effort_limit(t, 3.5, 42e3, 0.75, 50e3) == (0.0, FLOW)
    # no engine power given: no power line
    assert traction.effort_limit(t, 2.0, None, 0.75, None) == (30e3, RELIEF)


def test_envelope_runs_to_the_top_speed_and_takes_its_corners():
    t = Transmission(30e3, 1.0, 3.0, True)
    env = traction.envelope(t, 42e3, 0.75, 50e3, points=4)
    speeds = [p.speed for p in env]
    assert speeds[0] == 0.0 and speeds[-1] == 3.0
    # corners: end of full displacement (1.0 m/s) and where the power line meets the relief line:
    # 0.75 * 50e3 / 30e3 = 1.25 m/s (hand calculation)
    assert 1.0 in speeds and pytest.approx(1.25) in speeds
    at_2 = next(p for p in env if p.speed == pytest.approx(1.5))
    # 1.5 m/s: relief 30e3 * 1/1.5 = 20 kN, power 37.5e3/1.5 = 25 kN -> the relief line (falling) sets 20 kN
    assert (at_2.effort, at_2.limit) == (pytest.approx(20e3), RELIEF)
    assert all(p.effort <= 42e3 for p in env)
    assert env[0].power is None and env[-1].power == pytest.approx(12500.0)  # 37.5 kW / 3 m/s


def test_corner_power_and_its_ratio():
    # hand calculation: 42 kN * 3 m/s = 126 kW; over a 50 kW engine: 2.52
    assert traction.corner_power(42e3, 3.0) == pytest.approx(126e3)
    assert traction.corner_power(42e3, 3.0) / 50e3 == pytest.approx(2.52)


def test_ground_speed_from_shaft_speed():
    # hand calculation: 2*pi*0.3*0.5 = 0.94248 m/s
    assert traction.ground_speed(0.5, 0.3) == pytest.approx(0.942478, rel=1e-6)


@pytest.mark.parametrize("call", [lambda: traction.adhesion_limit(0.0, 1000.0),
                                  lambda: traction.power_limited_effort(1.2, 1e3, 1.0),
                                  lambda: traction.effort_at_pressure(1e-4, 1e7, 0.9, 1.0, 0.9, 0.0)])
def test_non_physical_inputs_are_refused(call):
    with pytest.raises(ValueError):
        call()
