"""The efficiency_table check: a duty point inside the maker's grid passes, outside it fails (nothing is
extrapolated), a breakaway differential outside the starting row warns.

Motor relation dp = 2*pi*T/(Vg*eta_hm) (fluid-power textbook); hand calculations beside each check.
"""

import pytest

from helpers import minimal, spec_check
from specgen.intake.read import Source
from specgen.pipeline import evaluate

TABLE = {"pressure_differential": ["100 bar", "200 bar", "300 bar"], "speed": ["100 rpm", "1000 rpm"],
         "volumetric": [[0.94, 0.96], [0.92, 0.95], [0.90, 0.94]],
         "hydromechanical": [[0.86, 0.88], [0.89, 0.91], [0.90, 0.92]],
         "starting": [0.78, 0.80, 0.82]}


def with_table(table=TABLE, **duty) -> dict:
    d = minimal()
    d["drives"]["hoist"]["motor"]["efficiency_table"] = table
    d["drives"]["hoist"]["duty_points"]["lift"].update(duty)
    return d


def duty(d):
    return evaluate(Source("mem.yaml", d, b"")).results.duty("hoist", "lift")


def test_outside_the_table_fails_and_uses_the_constant_efficiencies():
    d = with_table(speed="1500 rpm")  # beyond the 1000 rpm column
    c = spec_check(d, "efficiency_table", drive="hoist", duty="lift")
    assert c.status == "fail" and "outside the maker's table at" in c.message and "1500 rpm" in c.message
    r = duty(d)
    # constant eta_hm 0.9: dp = 2*pi*286.5 / (1e-4 * 0.9) = 200.02 bar
    assert r["pressure_differential"] == pytest.approx(2 * 3.141592653589793 * 286.5 / 0.9e-4)


def test_inside_the_table_passes():
    assert spec_check(with_table(), "efficiency_table", drive="hoist", duty="lift").status == "pass"


def test_breakaway_outside_the_starting_row_warns():
    t = dict(TABLE, pressure_differential=["100 bar", "200 bar", "240 bar"])  # relief less back pressure is 245 bar
    c = spec_check(with_table(t), "efficiency_table", drive="hoist", duty="lift")
    assert c.status == "warn" and "starting row at 245 bar" in c.message
