"""Operating corners: each check judged at its worst corner, with the corner named (specgen/corners.py)."""

from __future__ import annotations

import json
import math

import pytest
from helpers import minimal, run_cli, write_spec

from specgen.checks.status import Check
from specgen.corners import apply, worst
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.resolve.machine import resolve


def _spec(**corners) -> dict:
    """The minimal rig with a fluid at 40 degC and a 16 mm, 10 m pressure line on the hoist."""
    d = minimal()
    d["fluid"] = {"iso_vg": 46, "temperature": "40 degC", "density": "870 kg/m^3", "viscosity_100c": "6.8 mm^2/s"}
    d["drives"]["hoist"]["lines"] = {"pressure": {"inner_diameter": "16 mm", "length": "10 m"}}
    if corners:
        d["corners"] = corners
    return d


def _outcome(d: dict):
    return evaluate(Source("rig.yaml", d, b""))


def _at(outcome, corner_id: str):
    """The machine moved to a corner and its resolved results."""
    o = outcome
    from specgen.intake.validate import build_with_corners
    from specgen.resolve.load import decide_directions

    machine, corners = build_with_corners(o.source, decide_directions)
    moved = apply(machine, next(c for c in corners if c.id == corner_id))
    return moved, resolve(moved)


def _check(results, check_id: str):
    found = [c for c in results.checks if c.id == check_id]
    assert len(found) == 1
    return found[0]


def test_cold_corner_raises_viscosity_and_line_loss_by_hand():
    o = _outcome(_spec(cold={"set": {"fluid.temperature": "-20 degC"}}))
    _, r = _at(o, "cold")
    # ASTM D341 (Walther) through the two known points, hand calculation:
    #   Z(nu) = log10(log10(nu + 0.7)), nu in mm^2/s; Z(46) = log10(1.669317) = 0.222539,
    #   Z(6.8) = log10(0.875061) = -0.057962; B = (0.222539 + 0.057962) / (log10 373.15 - log10 313.15)
    #   = 0.280501 / 0.076131 = 3.68444; A = 0.222539 + 3.68444 * 2.495752 = 9.417993;
    #   at 253.15 K: Z = 9.417993 - 3.68444 * 2.403378 = 0.562887,
    #   nu = 10^(10^0.562887) - 0.7 = 10^3.654998 - 0.7 = 4517.8 mm^2/s.
    z = lambda nu: math.log10(math.log10(nu + 0.7))  # noqa: E731
    b = (z(46.0) - z(6.8)) / (math.log10(373.15) - math.log10(313.15))
    a = z(46.0) + b * math.log10(313.15)
    nu_cold = (10 ** (10 ** (a - b * math.log10(253.15))) - 0.7) * 1e-6
    assert nu_cold == pytest.approx(4.5178e-3, rel=1e-4)
    assert r.fluid["kinematic_viscosity"] == pytest.approx(nu_cold, rel=1e-6)
    assert o.results.fluid["kinematic_viscosity"] == pytest.approx(46e-6, rel=1e-9)  # nominal untouched
    # Laminar line loss (Hagen-Poiseuille, the Darcy-Weisbach form with f = 64/Re):
    #   dp = 128 * rho * nu * L * q / (pi * d^4); q = 100 cm^3 * 500 rpm / 0.95 = 8.7719e-4 m^3/s,
    #   Re = v d / nu = 4.3628 * 0.016 / 4.5178e-3 = 15.5 (laminar);
    #   dp = 128 * 870 * 4.5178e-3 * 10 * 8.7719e-4 / (pi * 0.016^4) = 4.4132 / 2.0589e-7 = 214.35 bar.
    q = 100e-6 * (500 / 60) / 0.95
    dp = 128 * 870 * nu_cold * 10 * q / (math.pi * 0.016 ** 4)
    assert dp == pytest.approx(214.35e5, rel=1e-4)
    assert r.duty("hoist", "lift")["pressure_line_loss"] == pytest.approx(dp, rel=1e-6)
    nominal_loss = o.results.duty("hoist", "lift")["pressure_line_loss"]
    assert nominal_loss == pytest.approx(dp * 46e-6 / nu_cold, rel=1e-6)  # laminar at 40 degC too: Re = 1517


def test_cold_corner_turns_a_pass_into_a_fail_reported_at_the_corner():
    nominal = _check(_outcome(_spec()).results, "pressure_margin")
    assert nominal.status == "pass" and nominal.corner is None
    o = _outcome(_spec(cold={"set": {"fluid.temperature": "-20 degC"}}))
    c = _check(o.results, "pressure_margin")
    # Hand calculation: inlet 205.01 bar (200.01 bar across the motor + 5 bar back) + 214.35 bar line
    # loss = 419.4 bar against the 250 bar relief: margin (250 - 419.4) / 250 = -67.7 %, a failure.
    assert (c.status, c.corner) == ("fail", "cold")
    assert c.margin == pytest.approx((250 - 205.0147 - 214.35) / 250, abs=2e-4)
    at_corner = next(k for k in o.results.corners if k.id == "cold")
    assert _check(at_corner, "pressure_margin").margin == c.margin
    assert o.results.duty("hoist", "lift")["inlet_pressure"] == pytest.approx(205.0147e5, rel=1e-5)  # nominal


def test_worn_corner_lowers_pump_delivery_and_raises_flow_demand_by_hand():
    o = _outcome(_spec(worn={"scale": {"motors.volumetric_efficiency": "-3 %",
                                        "pumps.volumetric_efficiency": "-3 %"}}))
    _, r = _at(o, "worn")
    # Hand calculation: motor 0.95 -> 0.92: q = 100 cm^3 * 500/60 rev/s / 0.92 = 9.0580e-4 m^3/s;
    # pump 0.95 -> 0.92: Q = 40 cm^3 * 25 rev/s * 0.92 = 9.2000e-4 m^3/s (nominal 9.5000e-4).
    assert r.duty("hoist", "lift")["flow_demand"] == pytest.approx(100e-6 * 500 / 60 / 0.92, rel=1e-9)
    assert r.supply_mode("main", "work")["pump_delivery"] == pytest.approx(40e-6 * 25 * 0.92, rel=1e-9)
    c = _check(o.results, "pump_flow")
    # margin (9.2000 - 9.0580) / 9.2000 = 1.54 %: under the 5 % band, a warning at "worn"
    # (nominal: (9.5 - 8.7719) / 9.5 = 7.7 %, a pass)
    assert (c.status, c.corner) == ("warn", "worn")
    assert c.margin == pytest.approx((9.2e-4 - 9.0580e-4) / 9.2e-4, abs=1e-4)


def test_relief_corner_raises_the_relief_torque_by_the_hand_amount():
    o = _outcome(_spec(relief={"scale": {"supplies.relief_setting": "+5 %"}}))
    _, r = _at(o, "relief")
    # Hand calculation: the relief setting rises 5 % of 250 bar = 12.5 bar; the torque at relief rises
    # by dp * V * eta_hm / (2 pi) = 12.5e5 Pa * 100e-6 m^3 * 0.9 / (2 pi) = 17.905 N*m.
    before = o.results.duty("hoist", "lift")["relief_torque"]
    after = r.duty("hoist", "lift")["relief_torque"]
    assert after - before == pytest.approx(12.5e5 * 100e-6 * 0.9 / (2 * math.pi), rel=1e-6)
    peak = next(c for c in next(k for k in o.results.corners if k.id == "relief").checks if c.id == "peak_pressure")
    assert peak.value == pytest.approx(262.5e5)  # 250 bar * 1.05


def _c(status: str, corner: str | None = None, check_id: str = "max_speed", drive: str = "a") -> Check:
    return Check(check_id, "t", status, None, None, "", "m", drive=drive, corner=corner)


def test_worst_status_wins_and_the_nominal_point_wins_a_tie():
    nominal = (_c("warn"), _c("pass", drive="b"), _c("pass", drive="c"))
    at_hot = (_c("warn", "hot"), _c("warn", "hot", drive="b"), _c("fail", "hot", drive="c"))
    at_cold = (_c("warn", "cold"), _c("warn", "cold", drive="b"), _c("fail", "cold", drive="c"))
    picked = worst(nominal, [at_hot, at_cold])
    assert [(c.drive, c.status, c.corner) for c in picked] == [
        ("a", "warn", None),  # same status everywhere: nominal
        ("b", "warn", "hot"),  # tie between corners: the first in the spec
        ("c", "fail", "hot"),
    ]


def test_a_check_found_only_at_a_corner_is_kept_when_it_warns_or_fails():
    picked = worst((_c("pass"),), [(_c("pass", "hot"), _c("pass", "hot", "makeup_flow")),
                                   (_c("pass", "cold"), _c("fail", "cold", "line_velocity"))])
    assert [(c.id, c.status, c.corner) for c in picked] == [("max_speed", "pass", None),
                                                           ("line_velocity", "fail", "cold")]


def test_a_corner_limited_to_modes_judges_only_what_runs_in_them(tmp_path):
    d = _spec(cold={"modes": ["idle"], "set": {"fluid.temperature": "-20 degC"}})
    d["drives"]["hoist"]["duty_points"]["creep"] = {"torque": "50 N*m", "speed": "10 rpm"}
    d["modes"]["idle"] = {"drives": {"hoist": "creep"}}
    o = _outcome(d)
    lift = [c for c in o.results.checks if c.id == "pressure_margin" and c.duty == "lift"][0]
    assert (lift.status, lift.corner) == ("pass", None)  # the lift duty does not run in mode idle
    cold = o.results.corners[0]
    assert {c.duty for c in cold.checks if c.duty} == {"creep"}
    assert all(c.mode in (None, "idle") for c in cold.checks)


def test_typical_corners_switch_on_in_one_line():
    d = _spec()
    d["typical_corners"] = True
    o = _outcome(d)
    ids = [k.id for k in o.results.corners]
    assert ids == ["cold_start", "hot_oil", "worn", "relief_high"]  # no idle without an idle speed
    assert all(k.assumed and "from memory" in k.basis for k in o.results.corners)
    _, cold = _at(o, "cold_start")
    _, hot = _at(o, "hot_oil")
    assert cold.fluid["kinematic_viscosity"] > 46e-6 > hot.fluid["kinematic_viscosity"]
    worn, _ = _at(o, "worn")
    assert worn.drives[0].motor.volumetric_efficiency.value == pytest.approx(0.92)  # 0.95 - 3 points
    assert worn.supplies[0].pump.volumetric_efficiency.value == pytest.approx(0.92)
    high, _ = _at(o, "relief_high")
    assert high.supplies[0].relief_setting == pytest.approx(262.5e5)  # 250 bar + 5 %


def test_idle_corner_turns_the_pump_at_idle_speed_times_the_drive_ratio():
    d = _spec()
    d["supplies"]["main"]["prime_mover_speed"] = "1500 rpm"  # with shaft speed 1500 rpm: drive ratio 1
    d["typical_corners"] = {"idle_speed": "900 rpm"}
    o = _outcome(d)
    idle, r = _at(o, "idle")
    assert not o.results.corners[-1].assumed  # the idle speed is the spec's own figure
    assert idle.supplies[0].pump.shaft_speed == pytest.approx(15.0)  # 900 rpm
    # pump delivery at idle: 40 cm^3 * 15 rev/s * 0.95 = 5.70e-4 m^3/s, short of the 8.77e-4 demanded
    assert r.supply_mode("main", "work")["pump_delivery"] == pytest.approx(40e-6 * 15 * 0.95)
    c = _check(o.results, "pump_flow")
    assert (c.status, c.corner) == ("fail", "idle")


def test_text_and_json_name_the_corner_and_a_spec_without_corners_writes_no_corner_key(tmp_path):
    path = write_spec(tmp_path, _spec(cold={"set": {"fluid.temperature": "-20 degC"}}))
    code, out, _ = run_cli("check", path)
    assert code == 1  # fails at the cold corner
    assert "FAIL  pressure_margin      drive hoist, duty point lift [at corner cold]:" in out
    assert "  cold: cold: fluid.temperature -20 degC -> fail" in out
    code, out, _ = run_cli("check", "--format", "json", path)
    doc = json.loads(out)
    assert doc["checks"][0]["corner"] == "cold"
    assert [k["id"] for k in doc["corners"]] == ["cold"]
    assert doc["corners"][0]["checks"][0]["margin"] == pytest.approx(doc["checks"][0]["margin"])
    plain = write_spec(tmp_path, _spec(), "plain.yaml")
    doc = json.loads(run_cli("check", "--format", "json", plain)[1])
    assert "corners" not in doc and all("corner" not in c for c in doc["checks"])


def test_cold_corner_starves_the_pump_through_a_narrow_suction_line():
    d = minimal()
    d["fluid"] = {"iso_vg": 46, "temperature": "40 degC", "density": "870 kg/m^3", "viscosity_100c": "6.8 mm^2/s"}
    d["supplies"]["main"]["suction_line"] = {"inner_diameter": "40 mm", "length": "1 m"}
    nominal = _check(_outcome(d).results, "pump_inlet_pressure")
    d["corners"] = {"cold": {"set": {"fluid.temperature": "-20 degC"}}}
    c = _check(_outcome(d).results, "pump_inlet_pressure")
    # Hand calculation. The pump draws its geometric flow q = 40 cm^3 * 1500 rpm = 1.0e-3 m^3/s through
    # 40 mm: v = 1e-3 / (pi * 0.02^2) = 0.7958 m/s.
    # Viscosity: ASTM D341 (Walther) through 46 mm^2/s at 40 degC and 6.8 mm^2/s at 100 degC gives
    #   4517.8 mm^2/s at -20 degC (worked in test_cold_corner_raises_viscosity_and_line_loss_by_hand).
    # Line loss, laminar (Darcy-Weisbach with f = 64/Re, i.e. Hagen-Poiseuille; fluid-power textbook):
    #   dp = 128 * rho * nu * L * q / (pi * d^4), pi * 0.04^4 = 8.0425e-6 m^4
    #   40 degC: Re = 0.7958 * 0.04 / 46e-6 = 692 (laminar); dp = 128 * 870 * 46e-6 * 1 * 1e-3 / 8.0425e-6
    #            = 636.9 Pa
    #   -20 degC: Re = 7.0 (laminar); dp = 636.9 * 4517.8 / 46 = 62 556 Pa
    # Inlet (standard atmosphere 101 325 Pa, ISO 2533; no head, no strainer):
    #   40 degC: 101 325 - 636.9 = 100 688 Pa, margin (100 688 - 80 000) / 80 000 = +0.2586: pass
    #   -20 degC: 101 325 - 62 556 = 38 769 Pa, margin (38 769 - 80 000) / 80 000 = -0.5154: fail
    # (0.8 bar abs: the assumed minimum inlet pressure, catalogue practice, from memory)
    assert nominal.status == "pass" and nominal.corner is None
    assert nominal.value == pytest.approx(100688.06, abs=0.5)
    assert nominal.margin == pytest.approx(0.25860, abs=1e-4)
    assert (c.status, c.corner) == ("fail", "cold")
    assert c.value == pytest.approx(38768.8, abs=5.0)
    assert c.limit == pytest.approx(80000.0)
    assert c.margin == pytest.approx(-0.51539, abs=1e-4)
