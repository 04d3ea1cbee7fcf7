"""Shared prime movers at intake: what is built, and every refusal as one located line with exit status 2."""

from __future__ import annotations

import re

import pytest
import yaml

from engine_spec import shared_engine
from helpers import run_cli, write_spec

ERROR = re.compile(r"^error: (?P<file>[^:]+):(?P<line>\d+):(?P<col>\d+): (?P<path>[^:]+): (?P<message>.+)$")


def build(data: dict):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).machine


def refused(tmp_path, data: dict) -> list[re.Match]:
    """Run ``check`` on the spec and return its error lines, each matched for file, line and field."""
    code, out, err = run_cli("check", write_spec(tmp_path, data))
    assert code == 2, out + err
    lines = [ERROR.match(x) for x in err.strip().splitlines() if x.startswith("error: ")]
    assert lines and all(lines), err
    return lines


def line_of(tmp_path, key: str, after: str = "") -> int:
    """The 1-based line of the spec file where ``key:`` is written (after the line holding ``after``)."""
    text = (tmp_path / "spec.yaml").read_text(encoding="utf-8").splitlines()
    start = next(i for i, x in enumerate(text) if after in x) if after else 0
    return next(i for i, x in enumerate(text) if i >= start and x.strip().startswith(key + ":")) + 1


def test_prime_mover_built_in_si_with_its_default_speed():
    m = build(shared_engine())
    (pm,) = m.prime_movers
    assert pm.kind == "engine" and pm.power == pytest.approx(75e3)
    assert pm.speeds == {"idle": pytest.approx(1000 / 60), "rated": pytest.approx(2200 / 60)}
    assert pm.default_speed == "rated"  # the one named rated
    assert [(p.speed * 60, p.power) for p in pm.power_curve] == [pytest.approx((1000, 40e3)),
                                                                 pytest.approx((2200, 75e3))]
    assert m.supply("rear").prime_mover == "diesel" and m.supply("rear").drive_ratio == 1.2
    assert m.modes[1].speed_name("diesel") == "idle" and m.modes[0].speed_name("diesel") is None


def test_the_only_speed_is_the_default():
    d = shared_engine()
    d["prime_movers"]["diesel"]["speeds"] = {"governed": "1800 rpm"}
    d["prime_movers"]["diesel"].pop("power_curve")
    d["modes"]["travel_idle"].pop("prime_mover_speeds")
    assert build(d).prime_movers[0].default_speed == "governed"


def test_several_speeds_and_none_rated_is_refused(tmp_path):
    d = shared_engine()
    d["prime_movers"]["diesel"]["speeds"] = {"idle": "1000 rpm", "full": "2200 rpm"}
    (e,) = refused(tmp_path, d)
    assert e["path"] == "prime_movers.diesel.speeds" and "none named 'rated'" in e["message"]
    assert int(e["line"]) == line_of(tmp_path, "speeds", "diesel")


def test_unknown_prime_mover_named_by_a_supply(tmp_path):
    d = shared_engine()
    d["supplies"]["rear"]["prime_mover"] = "petrol"
    (e,) = refused(tmp_path, d)
    assert e["path"] == "supplies.rear.prime_mover"
    assert "'petrol', which is not defined" in e["message"] and "diesel" in e["message"]
    assert int(e["line"]) == line_of(tmp_path, "prime_mover", "rear:")


@pytest.mark.parametrize("key, value", [("prime_mover_power", "30 kW"), ("prime_mover_speed", "2200 rpm")])
def test_both_forms_given_is_refused(tmp_path, key, value):
    d = shared_engine()
    d["supplies"]["front"][key] = value
    (e,) = refused(tmp_path, d)
    assert e["path"] == f"supplies.front.{key}" and f"remove {key}" in e["message"]
    assert int(e["line"]) == line_of(tmp_path, key)


def test_pump_shaft_speed_with_a_prime_mover_is_refused(tmp_path):
    d = shared_engine()
    d["supplies"]["front"]["pump"]["shaft_speed"] = "2200 rpm"
    (e,) = refused(tmp_path, d)
    assert e["path"] == "supplies.front.pump.shaft_speed" and "remove shaft_speed" in e["message"]
    assert int(e["line"]) == line_of(tmp_path, "shaft_speed")


def test_unknown_speed_name_in_a_mode(tmp_path):
    d = shared_engine()
    d["modes"]["travel_idle"]["prime_mover_speeds"] = {"diesel": "high_idle"}
    (e,) = refused(tmp_path, d)
    assert e["path"] == "modes.travel_idle.prime_mover_speeds.diesel"
    assert "'high_idle', which it does not define (its speeds: idle, rated)" in e["message"]
    assert int(e["line"]) == line_of(tmp_path, "diesel", "prime_mover_speeds")


def test_unknown_prime_mover_in_a_mode(tmp_path):
    d = shared_engine()
    d["modes"]["travel_idle"]["prime_mover_speeds"] = {"petrol": "idle"}
    (e,) = refused(tmp_path, d)
    assert e["path"] == "modes.travel_idle.prime_mover_speeds.petrol" and "'petrol'" in e["message"]


def test_a_named_speed_outside_the_power_curve_is_refused(tmp_path):
    # nothing is extrapolated: 800 rpm lies below the curve's first point at 1000 rpm
    d = shared_engine()
    d["prime_movers"]["diesel"]["speeds"]["idle"] = "800 rpm"
    (e,) = refused(tmp_path, d)
    assert e["path"] == "prime_movers.diesel.speeds.idle"
    assert "outside the power curve (1000 to 2200 rpm)" in e["message"]


def test_power_curve_speeds_must_rise(tmp_path):
    d = shared_engine()
    d["prime_movers"]["diesel"]["power_curve"][1]["speed"] = "1000 rpm"
    errors = refused(tmp_path, d)
    assert errors[0]["path"] == "prime_movers.diesel.power_curve.1.speed" and "rise" in errors[0]["message"]


def test_prime_mover_driving_no_supply_is_refused(tmp_path):
    d = shared_engine()
    d["prime_movers"]["spare"] = {"kind": "electric_motor", "power": "15 kW", "speeds": {"rated": "1480 rpm"}}
    (e,) = refused(tmp_path, d)
    assert e["path"] == "prime_movers.spare" and "drives no supply" in e["message"]


def test_schema_refuses_an_unknown_kind(tmp_path):
    d = shared_engine()
    d["prime_movers"]["diesel"]["kind"] = "turbine"
    (e,) = refused(tmp_path, d)
    assert e["path"] == "prime_movers.diesel.kind"


def test_a_spec_with_per_supply_prime_mover_keys_still_builds(tmp_path):
    # migration: the per-supply keys keep working beside a shared prime mover in the same spec
    d = shared_engine()
    d["supplies"]["aux"] = {"pump": {"displacement": "10 cm^3"}, "relief_setting": "150 bar",
                            "prime_mover_power": "5 kW", "prime_mover_speed": "1500 rpm"}
    d["drives"]["aux_fan"] = dict(d["drives"]["fan"], supply="aux")
    code, out, err = run_cli("check", write_spec(tmp_path, yaml.safe_dump(d, sort_keys=False)))
    assert code in (0, 1), err


def test_a_corner_cannot_move_a_named_speed(tmp_path):
    d = shared_engine()
    d["corners"] = {"slow": {"set": {"prime_movers.diesel.speeds.idle": "900 rpm"}}}
    (e,) = refused(tmp_path, d)
    assert e["path"] == "corners.slow.set.prime_movers.diesel.speeds.idle"
    assert "is not a field specgen can move" in e["message"]


def test_a_delivered_flow_on_a_prime_mover_is_refused(tmp_path):
    # a delivered flow cannot follow the prime mover's speed from mode to mode: the displacement is needed
    d = shared_engine()
    d["supplies"]["rear"]["pump"] = {"delivery": "60 L/min", "overall_efficiency": 0.8}
    (e,) = refused(tmp_path, d)
    assert e["path"] == "supplies.rear.pump.delivery" and "give the pump's displacement" in e["message"]


@pytest.mark.parametrize("key", ["supplies.front.prime_mover_speed", "supplies.front.pump.shaft_speed"])
def test_a_corner_cannot_give_a_shared_supply_its_own_speed(tmp_path, key):
    # it would be silently outweighed by the prime mover's speed: refused, pointing at the prime mover
    d = shared_engine()
    d["corners"] = {"slow": {"set": {key: "900 rpm"}}}
    errors = refused(tmp_path, d)
    assert errors[0]["path"] == f"corners.slow.set.{key}" and "prime_movers.diesel" in errors[0]["message"]


def test_a_corner_may_still_move_a_shared_supply_pump_efficiency():
    d = shared_engine()
    d["corners"] = {"worn": {"scale": {"supplies.front.pump.volumetric_efficiency": "-3 %"}}}
    assert build(d).supply("front").prime_mover == "diesel"
