"""The check --format json document against its published schema (schemas/check-output.schema.json)."""

import json
import math

import jsonschema
import pytest

from helpers import ROOT, minimal, run_cli, write_spec
from specgen.checks.status import Check

SCHEMA = json.loads((ROOT / "schemas" / "check-output.schema.json").read_text(encoding="utf-8"))
DEMOS = ["reed_harvester", "log_deck", "yard_loader"]


def validate(doc) -> None:
    jsonschema.Draft202012Validator.check_schema(SCHEMA)
    jsonschema.Draft202012Validator(SCHEMA).validate(doc)


@pytest.mark.parametrize("name", DEMOS)
def test_demo_json_validates_against_the_published_schema(name):
    code, out, err = run_cli("check", "--format", "json", ROOT / "example_specs" / f"{name}.yaml")
    assert err == "" and code in (0, 1)
    doc = json.loads(out)
    validate(doc)
    assert all("margin" in c for c in doc["checks"])


def test_several_specs_validate_as_one_document_with_a_list():
    specs = [ROOT / "example_specs" / f"{n}.yaml" for n in DEMOS]
    code, out, err = run_cli("check", "--format", "json", *specs)
    doc = json.loads(out)
    validate(doc)
    assert [d["machine"]["id"] for d in doc["specs"]] == [json.loads(run_cli("check", "--format", "json", s)[1])
                                                          ["machine"]["id"] for s in specs]


def test_the_schema_refuses_a_check_without_its_margin():
    code, out, err = run_cli("check", "--format", "json", ROOT / "example_specs" / "log_deck.yaml")
    doc = json.loads(out)
    del doc["checks"][0]["margin"]
    with pytest.raises(jsonschema.ValidationError):
        validate(doc)


def test_margin_is_the_signed_fraction_of_the_relief_setting(tmp_path):
    # minimal(): inlet 205.0147 bar against relief 250 bar: margin (250 - 205.0147)/250 = 0.17994 (hand calc)
    code, out, err = run_cli("check", "--format", "json", write_spec(tmp_path, minimal()))
    doc = json.loads(out)
    validate(doc)
    (c,) = [c for c in doc["checks"] if c["id"] == "pressure_margin"]
    assert c["margin"] == pytest.approx(0.17994, abs=1e-5) and c["status"] == "pass"
    ratings = [c for c in doc["checks"] if c["id"] == "peak_pressure"]
    assert ratings[0]["margin"] == pytest.approx((350 - 250) / 350)  # relief 250 bar against peak 350 bar


def test_series_values_of_each_drive_sit_under_its_id(tmp_path):
    doc = json.loads(run_cli("check", "--format", "json", ROOT / "example_specs" / "log_deck.yaml")[1])
    series = [s for s in doc["supply_modes"] if s["per_drive"]]
    assert series, "the log deck's deck supply runs its drives in series"
    for s in series:
        assert set(s["per_drive"]) <= {c["drive"] for c in s["contributions"]}
        for values in s["per_drive"].values():
            assert {"outlet_pressure", "inlet_pressure", "relief_torque"} <= set(values) <= {
                "outlet_pressure", "inlet_pressure", "relief_torque", "start_outlet_pressure", "breakaway_torque"}
        assert not any("[" in k for k in s["values"])


def test_an_infinite_margin_is_written_as_null():
    from specgen.present.json_out import _margin

    assert _margin(float("inf")) is None and _margin(None) is None and _margin(-0.04) == -0.04
    assert math.isinf(Check("x", "t", "pass", 1.0, 0.0, "torque", "m", margin=float("inf")).margin)


def test_duty_cycles_in_json_and_text():
    spec = ROOT / "tests" / "specs" / "harbour_crane.yaml"
    code, out, err = run_cli("check", "--format", "json", spec)
    assert code == 0 and err == ""
    doc = json.loads(out)
    validate(doc)
    (cycle,) = doc["duty_cycles"]
    assert cycle["cycle"] == "container_moves" and cycle["settled"] and cycle["missing"] == ""
    assert cycle["oil_temperature_series"][0] == [0.0, pytest.approx(30.0)]  # from ambient, in degC
    assert cycle["share_above_continuous_pressure"] == {"hoist": 0.0}
    assert cycle["mean_prime_mover_power"]["main"]["unit"] == "kW"
    oil = next(c for c in doc["checks"] if c["id"] == "oil_temperature")
    assert oil["where"]["cycle"] == "container_moves" and oil["limit"] == {"value": pytest.approx(70.0), "unit": "degC"}
    assert all("cycle" not in c["where"] for c in doc["checks"] if c["id"] not in ("oil_temperature", "heat_load"))
    code, out, _ = run_cli("check", spec)
    assert "Duty cycles and oil temperature" in out and "duty cycle container_moves" in out


def test_specs_without_duty_cycles_have_no_cycle_keys():
    code, out, _ = run_cli("check", "--format", "json", ROOT / "example_specs" / "log_deck.yaml")
    doc = json.loads(out)
    assert "duty_cycles" not in doc and all("cycle" not in c["where"] for c in doc["checks"])
