"""The efficiency_table check: a duty point inside the maker's grid passes, outside it fails (nothing is
extrapolated), a breakaway differential outside the starting row warns.

Motor relation dp = 2*pi*T/(Vg*eta_hm) (fluid-power textbook); hand calculations beside each check.
"""

import pytest

from helpers import EFFICIENCY_TABLE, hoist_lift, spec_check, with_efficiency_table



def test_outside_the_table_fails_and_uses_the_constant_efficiencies():
    d = with_efficiency_table(speed="1500 rpm")  # beyond the 1000 rpm column
    c = spec_check(d, "efficiency_table", drive="hoist", duty="lift")
    assert c.status == "fail" and "outside the maker's table at" in c.message and "1500 rpm" in c.message
    r = hoist_lift(d)
    # constant eta_hm 0.9: dp = 2*pi*286.5 / (1e-4 * 0.9) = 200.02 bar
    assert r["pressure_differential"] == pytest.approx(2 * 3.141592653589793 * 286.5 / 0.9e-4)


def test_inside_the_table_passes():
    assert spec_check(with_efficiency_table(), "efficiency_table", drive="hoist", duty="lift").status == "pass"


def test_breakaway_outside_the_starting_row_warns():
    t = dict(EFFICIENCY_TABLE, pressure_differential=["100 bar", "200 bar", "240 bar"])  # relief less back pressure is 245 bar
    c = spec_check(with_efficiency_table(t), "efficiency_table", drive="hoist", duty="lift")
    assert c.status == "warn" and "starting row at 245 bar" in c.message
