"""Properties of the relations and independence from the units a spec is written in."""

import copy

import pytest
from hypothesis import given, settings, strategies as st

from helpers import EXAMPLE, example_data, minimal
from specgen import units
from specgen.calc import motor
from specgen.pipeline import evaluate
from specgen.intake.read import Source

pos = st.floats(min_value=1e-3, max_value=1e3, allow_nan=False, allow_infinity=False)
eff = st.floats(min_value=0.5, max_value=1.0)
k = st.floats(min_value=0.1, max_value=10.0)


@given(vg=pos, dp=pos, eta=eff, factor=k)
def test_torque_proportional_to_pressure_and_displacement(vg, dp, eta, factor):
    base = motor.torque(vg * 1e-6, dp * 1e5, eta)
    assert motor.torque(vg * 1e-6, dp * 1e5 * factor, eta) == pytest.approx(base * factor, rel=1e-9)
    assert motor.torque(vg * 1e-6 * factor, dp * 1e5, eta) == pytest.approx(base * factor, rel=1e-9)


@given(q=pos, vg=pos, eta=eff, factor=k)
def test_speed_proportional_to_flow_inverse_to_displacement(q, vg, eta, factor):
    base = motor.speed(q / 60e3, vg * 1e-6, eta)
    assert motor.speed(q / 60e3 * factor, vg * 1e-6, eta) == pytest.approx(base * factor, rel=1e-9)
    assert motor.speed(q / 60e3, vg * 1e-6 * factor, eta) == pytest.approx(base / factor, rel=1e-9)


US_UNIT = {"pressure": "psi", "displacement": "in**3", "flow": "gpm", "torque": "lbf*in",
           "speed": "rpm", "power": "hp", "density": "lb/ft**3"}


def respell(data, system_units, path=()):
    """Rewrite every quantity string in other units, using pint (source: pint) for the numbers."""
    ureg = units.registry()
    if isinstance(data, dict):
        return {k: respell(v, system_units, path + (k,)) for k, v in data.items()}
    if isinstance(data, str) and data[:1].isdigit():
        for kind, unit in system_units.items():
            try:
                si = units.parse(data, kind)
            except units.UnitProblem:
                continue
            si_unit = units.KINDS[kind].si_unit
            value = ureg.Quantity(si, si_unit).to(unit.replace("in**3", "inch**3/revolution")
                                                  if kind == "displacement" else unit).magnitude
            return f"{value!r} {unit}"
    return data


def results_of(data):
    o = evaluate(Source("mem.yaml", data, b""))
    return o, {(r.drive, r.duty, k): v.value for r in o.results.duties for k, v in r.values.items()} | {
        (s.supply, s.mode, k): v.value for s in o.results.supply_modes for k, v in s.values.items()}


@pytest.mark.parametrize("make", [example_data, minimal])
def test_same_machine_in_us_units_gives_same_results(make):
    si_data = make()
    us_data = respell(copy.deepcopy(si_data), US_UNIT)
    assert us_data != si_data
    o1, a = results_of(si_data)
    o2, b = results_of(us_data)
    assert a.keys() == b.keys()
    for key in a:
        assert b[key] == pytest.approx(a[key], rel=1e-9, abs=1e-12), key
    assert [c.status for c in o1.results.checks] == [c.status for c in o2.results.checks]


@settings(max_examples=30, deadline=None)
@given(scale=st.floats(min_value=0.2, max_value=1.0))
def test_inlet_pressure_grows_linearly_with_torque(scale):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = f"{286.5 * scale} N*m"
    o = evaluate(Source("mem.yaml", d, b""))
    dp = o.results.duty("hoist", "lift")["pressure_differential"]
    # dp = 2*pi*T/(Vg*eta_hm) = 2*pi*286.5/(100e-6*0.9) = 200.0147 bar at scale 1 (hand calc), linear in T
    assert dp / 1e5 == pytest.approx(200.0147 * scale, rel=1e-6)
