import math

import pytest
from fluids.core import Reynolds
from fluids.friction import Blasius, Colebrook, friction_factor, friction_laminar
from hypothesis import given
from hypothesis import strategies as st

from specgen.calc import lines


def test_line_velocity():
    # Hand calculation: A = pi*0.02^2/4 = 3.14159e-4 m^2; v = 1e-3 / 3.14159e-4 = 3.18310 m/s.
    assert lines.line_velocity(1e-3, 0.020) == pytest.approx(3.18310, rel=1e-5)


@pytest.mark.parametrize(("v", "d", "nu"), [(3.183, 0.02, 32e-6), (0.8, 0.05, 46e-6), (5.5, 0.012, 10e-6)])
def test_reynolds_matches_reference_library(v, d, nu):
    # Reference library: fluids.core.Reynolds.
    assert lines.reynolds_number(v, d, nu) == pytest.approx(Reynolds(V=v, D=d, nu=nu), rel=1e-12)


@pytest.mark.parametrize("re", [10.0, 500.0, 2299.0])
def test_laminar_matches_reference_library(re):
    # Reference library: fluids.friction.friction_laminar.
    assert lines.friction_factor_laminar(re) == pytest.approx(friction_laminar(re), rel=1e-12)


@pytest.mark.parametrize("re", [4000.0, 2e4, 1e5])
def test_blasius_matches_reference_library(re):
    # Reference library: fluids.friction.Blasius (0.3164*Re^-0.25).
    assert lines.friction_factor_blasius(re) == pytest.approx(Blasius(re), rel=1e-12)


@pytest.mark.parametrize("re", [2300.0, 4000.0, 1e4, 1e5, 1e6, 1e7])
@pytest.mark.parametrize("rr", [0.0, 1e-5, 1e-4, 1e-3, 0.01, 0.05])
def test_colebrook_matches_reference_library(re, rr):
    # Reference library: fluids.friction.Colebrook (exact solution of Colebrook 1939).
    assert lines.friction_factor_colebrook(re, rr) == pytest.approx(Colebrook(re, rr), rel=1e-9)


@pytest.mark.parametrize(("re", "rr"), [(5e3, 0.0), (5e4, 2e-4), (2e5, 1e-3)])
def test_turbulent_policy_matches_reference_solver(re, rr):
    # Reference library: fluids.friction.friction_factor (Clamond solution of Colebrook).
    result = lines.darcy_friction_factor(re, rr)
    assert result.regime == "turbulent"
    assert result.value == pytest.approx(friction_factor(re, rr), rel=1e-9)


def test_regime_policy_boundaries():
    # Hagen-Poiseuille: 64/2000 = 0.032 below Re 2300.
    low = lines.darcy_friction_factor(2000.0)
    assert (low.regime, low.value) == ("laminar", pytest.approx(0.032))
    # Policy of the module: 2300 <= Re < 4000 uses the turbulent correlation.
    mid = lines.darcy_friction_factor(3000.0)
    assert mid.regime == "transitional"
    assert mid.value == pytest.approx(Colebrook(3000.0, 0.0), rel=1e-9)  # reference: fluids
    assert lines.darcy_friction_factor(4000.0).regime == "turbulent"


@given(re=st.floats(min_value=2300.0, max_value=3999.0), rr=st.floats(min_value=0.0, max_value=0.05))
def test_transitional_value_never_below_laminar(re, rr):
    # Conservative policy: in the transition band the chosen factor bounds 64/Re from above.
    assert lines.darcy_friction_factor(re, rr).value >= 64.0 / re


def test_blasius_option_and_rough_blasius_rejected():
    # Reference library: fluids.friction.Blasius.
    assert lines.darcy_friction_factor(1e4, turbulent="blasius").value == pytest.approx(Blasius(1e4))
    with pytest.raises(ValueError, match="smooth tubes"):
        lines.darcy_friction_factor(1e4, 1e-4, turbulent="blasius")


def test_laminar_pressure_drop_equals_hagen_poiseuille():
    # Hagen-Poiseuille: dp = 128*mu*L*q/(pi*d^4), mu = rho*nu = 870*32e-6 = 0.02784 Pa*s;
    # 128*0.02784*5*1e-3/(pi*0.02^4) = 35 447 Pa.
    result = lines.line_pressure_drop(1e-3, 0.020, 5.0, 870.0, 32e-6)
    assert result.regime == "laminar"
    expected = 128 * 870.0 * 32e-6 * 5.0 * 1e-3 / (math.pi * 0.020**4)
    assert result.pressure_drop == pytest.approx(expected, rel=1e-12)
    assert result.pressure_drop == pytest.approx(35_447.0, rel=1e-4)


def test_turbulent_pressure_drop_with_fittings():
    # Hand calculation with the reference friction factor (fluids Colebrook):
    # q = 2e-3 m^3/s, d = 16 mm: v = 9.9472 m/s, Re = 9.9472*0.016/10e-6 = 15 915;
    # dp = f*((3 + 1.2)/0.016)*870*v^2/2.
    result = lines.line_pressure_drop(2e-3, 0.016, 3.0, 870.0, 10e-6, equivalent_length=1.2)
    v = 2e-3 / (math.pi * 0.016**2 / 4)
    re = v * 0.016 / 10e-6
    f = Colebrook(re, 0.0)
    assert result.regime == "turbulent"
    assert result.pressure_drop == pytest.approx(f * (4.2 / 0.016) * 870.0 * v * v / 2, rel=1e-9)


def test_darcy_weisbach_hand_calculation():
    # Hand calculation: 0.0322 * (5/0.02) * 870 * 3.183^2 / 2 = 35 477.94 Pa.
    assert lines.darcy_weisbach_pressure_drop(0.0322, 5.0, 0.02, 870.0, 3.183) == pytest.approx(35_477.94, rel=1e-6)


def test_fitting_equivalent_length():
    # Hand calculation: L_eq = K*d/f = 0.9*0.02/0.03 = 0.6 m.
    assert lines.fitting_equivalent_length(0.9, 0.03, 0.02) == pytest.approx(0.6)


def test_zero_flow_gives_zero_drop():
    # Physics: no flow, no friction loss.
    result = lines.line_pressure_drop(0.0, 0.02, 5.0, 870.0, 32e-6)
    assert result.pressure_drop == 0.0


@pytest.mark.parametrize("d", [0.0, -0.01])
def test_non_physical_diameter_rejected(d):
    with pytest.raises(ValueError, match="inner diameter"):
        lines.line_velocity(1e-3, d)


def test_velocity_limits_data():
    # Common practice, no source: suction 0.5-1.2, return 1.5-3, pressure 2-6 m/s.
    assert lines.line_velocity_limits("suction") == lines.VelocityRange(0.5, 1.2)
    assert lines.line_velocity_limits("return") == lines.VelocityRange(1.5, 3.0)
    assert lines.line_velocity_limits("pressure") == lines.VelocityRange(2.0, 6.0)
    with pytest.raises(ValueError, match="unknown line kind"):
        lines.line_velocity_limits("drain")
