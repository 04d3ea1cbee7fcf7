"""Efficiency from the maker's table: bilinear interpolation and the pressure differential solved with it.

Bilinear interpolation on a rectangular grid (numerical-methods textbook); the motor torque relation
T = Vg * dp * eta_hm / (2*pi) (fluid-power textbook). Every expected value is a hand calculation.
"""

import math

import pytest

from specgen.calc import efficiency_table as et

P = (100e5, 200e5)  # Pa
N = (10.0, 20.0)  # rev/s
VOL = ((0.96, 0.98), (0.92, 0.95))
HM = ((0.80, 0.90), (0.84, 0.94))


def test_bilinear_at_the_centre_is_the_mean_of_the_corners():
    p = et.lookup(P, N, VOL, HM, 150e5, 15.0)
    # (0.80 + 0.90 + 0.84 + 0.94) / 4 = 0.87; (0.96 + 0.98 + 0.92 + 0.95) / 4 = 0.9525
    assert p.inside and p.hydromechanical == pytest.approx(0.87) and p.volumetric == pytest.approx(0.9525)


def test_bilinear_off_centre():
    # at 125 bar (a quarter up), 17.5 rev/s (three quarters across):
    # row 100 bar: 0.80 + 0.75 * 0.10 = 0.875; row 200 bar: 0.84 + 0.75 * 0.10 = 0.915;
    # 0.875 + 0.25 * (0.915 - 0.875) = 0.885
    assert et.lookup(P, N, VOL, HM, 125e5, 17.5).hydromechanical == pytest.approx(0.885)


def test_grid_points_and_edges_are_inside_and_beyond_is_not():
    assert et.lookup(P, N, VOL, HM, 200e5, 20.0).hydromechanical == pytest.approx(0.94)
    for dp, n in ((99e5, 15.0), (201e5, 15.0), (150e5, 9.9), (150e5, 20.1)):
        p = et.lookup(P, N, VOL, HM, dp, n)
        assert not p.inside and p.hydromechanical is None and p.volumetric is None


def test_starting_row_linear_in_pressure():
    # 0.80 + 0.75 * (0.84 - 0.80) = 0.83 at 175 bar
    assert et.starting(P, (0.80, 0.84), 175e5) == pytest.approx(0.83)
    assert et.starting(P, (0.80, 0.84), 250e5) is None


def test_fixed_point_differential_driving():
    # Vg 100 cm^3/rev, T 250 N*m at 15 rev/s: lossless dp = 2*pi*250 / 1e-4 = 157.08 bar.
    # At 15 rev/s the rows give 0.85 (100 bar) and 0.89 (200 bar): eta_hm(y) = 0.81 + 0.0004 y, y in bar.
    # y * (0.81 + 0.0004 y) = 157.08 -> 0.0004 y^2 + 0.81 y - 157.08 = 0
    # y = (-0.81 + sqrt(0.6561 + 4 * 0.0004 * 157.08)) / 0.0008 = (-0.81 + 0.952590) / 0.0008 = 178.24 bar
    # (hand calculation; check: eta_hm = 0.81 + 0.0713 = 0.8813, 157.08 / 0.8813 = 178.24)
    s = et.solve_differential(P, N, VOL, HM, 250.0, 1e-4, 15.0)
    ideal = 2 * math.pi * 250 / 1e-4 / 1e5
    y = (-0.81 + math.sqrt(0.81 ** 2 + 4 * 0.0004 * ideal)) / 0.0008
    assert s.converged and s.point.inside
    assert s.point.dp == pytest.approx(y * 1e5, rel=1e-7)
    assert s.point.dp == pytest.approx(178.24e5, rel=1e-4)
    assert s.point.hydromechanical == pytest.approx(0.8813, abs=1e-4)
    assert s.iterations < 10


def test_fixed_point_differential_overrunning():
    # braking: dp = 2*pi*T*eta_hm/Vg; with a flat eta_hm 0.9: 2*pi*250*0.9 / 1e-4 = 141.37 bar
    flat = ((0.9, 0.9), (0.9, 0.9))
    s = et.solve_differential(P, N, VOL, flat, 250.0, 1e-4, 15.0, overrunning=True)
    assert s.converged and s.point.dp == pytest.approx(141.37e5, rel=1e-4)


def test_outside_the_grid_gives_no_efficiency():
    # 400 N*m needs at least 2*pi*400 / 1e-4 = 251 bar: beyond the 200 bar row
    s = et.solve_differential(P, N, VOL, HM, 400.0, 1e-4, 15.0)
    assert not s.point.inside and not s.converged and s.point.hydromechanical is None
