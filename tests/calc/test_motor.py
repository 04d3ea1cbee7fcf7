"""Motor relations against published forms and worked examples."""

import math

import pytest

from specgen.calc import motor
from specgen import units


def test_practical_si_torque_form():
    # Textbook practical form T[N*m] = Vg[cm^3] * dp[bar] * eta_hm / 62.83 (62.83 = 20*pi)
    vg, dp, eta = 160.0, 200.0, 0.9
    expected = vg * dp * eta / 62.83
    assert motor.torque(vg * 1e-6, dp * 1e5, eta) == pytest.approx(expected, rel=1e-4)


def test_practical_si_speed_form():
    # Textbook practical form n[rpm] = q[L/min] * 1000 * eta_v / Vg[cm^3]
    q, vg, eta = 45.0, 160.0, 0.95
    n_rev_s = motor.speed(q / 60e3, vg * 1e-6, eta)
    assert n_rev_s * 60 == pytest.approx(q * 1000 * eta / vg, rel=1e-12)


def test_practical_si_power_form():
    # Textbook practical form P[kW] = q[L/min] * dp[bar] / 600
    assert motor.hydraulic_power(60 / 60e3, 200e5) / 1e3 == pytest.approx(60 * 200 / 600, rel=1e-12)


def test_us_worked_example_motor():
    # Worked example in US units (fluid-power textbook, from memory): a 10 in^3/rev motor at 2000 psi
    # and 20 gpm: T = D*p/(2*pi) = 3183 lbf*in; n = 231*Q/D = 462 rpm; HP = T*n/63025 = 23.3 hp;
    # hydraulic HP = p*Q/1714 = 23.3 hp.
    D = units.parse("10 in^3", "displacement")
    p = units.parse("2000 psi", "pressure")
    Q = units.parse("20 gpm", "flow")
    T = motor.torque(D, p, 1.0)
    n = motor.speed(Q, D, 1.0)
    T_lbf_in = units.convert(T, "torque", "US")[0]
    assert T_lbf_in == pytest.approx(10 * 2000 / (2 * math.pi), rel=1e-6)
    assert n * 60 == pytest.approx(231 * 20 / 10, rel=1e-6)
    hp_shaft = units.convert(motor.shaft_power(T, n), "power", "US")[0]
    assert hp_shaft == pytest.approx(T_lbf_in * 462 / 63025, rel=1e-3)
    assert units.convert(motor.hydraulic_power(Q, p), "power", "US")[0] == pytest.approx(2000 * 20 / 1714, rel=1e-3)


def test_si_worked_example_motor():
    # Worked example in SI (fluid-power textbook, from memory): 100 cm^3/rev, 60 L/min, 200 bar,
    # ideal motor: n = 600 rpm, T = 100*200/62.83 = 318.3 N*m, P = 60*200/600 = 20 kW.
    vg, q, dp = 100e-6, 60 / 60e3, 200e5
    n = motor.speed(q, vg, 1.0)
    T = motor.torque(vg, dp, 1.0)
    assert n * 60 == pytest.approx(600.0)
    assert T == pytest.approx(318.31, rel=1e-4)
    assert motor.shaft_power(T, n) == pytest.approx(20e3, rel=1e-9)


def test_inverse_relations_round_trip():
    vg, eta_hm, eta_v = 80e-6, 0.88, 0.93
    assert motor.pressure_for_torque(motor.torque(vg, 150e5, eta_hm), vg, eta_hm) == pytest.approx(150e5)
    assert motor.speed(motor.flow_for_speed(7.5, vg, eta_v), vg, eta_v) == pytest.approx(7.5)


def test_braking_needs_less_pressure_than_driving():
    # An overrunning motor is a pump: friction helps hold the load (common practice, no source)
    vg, eta = 100e-6, 0.9
    # driving dp = 2*pi*T/(Vg*eta_hm) = 2*pi*300/(100e-6*0.9) = 209.440 bar; braking dp = 2*pi*T*eta_hm/Vg
    # = 2*pi*300*0.9/100e-6 = 169.646 bar (motor relations, fluid-power textbook; hand calculation)
    assert motor.pressure_for_torque(300.0, vg, eta) / 1e5 == pytest.approx(209.440, abs=1e-3)
    assert motor.braking_pressure(300.0, vg, eta) / 1e5 == pytest.approx(169.646, abs=1e-3)

