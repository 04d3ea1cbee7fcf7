"""A load-sensing supply in the JSON output: valid against schemas/check-output.schema.json, the
throttling loss per drive and the reached-speed checks with where they apply."""

import json

import jsonschema
import pytest

from helpers import ROOT, run_cli


def test_timber_crane_json():
    code, out, err = run_cli("check", "--format", "json", ROOT / "tests" / "specs" / "timber_crane.yaml")
    doc = json.loads(out)
    schema = json.loads((ROOT / "schemas" / "check-output.schema.json").read_text(encoding="utf-8"))
    jsonschema.validate(doc, schema)
    mode = next(m for m in doc["supply_modes"] if m["mode"] == "hoist_and_slew")
    # hoist sets the pump: its throttling loss is the margin times its flow, 20 bar * 50.63 L/min = 1.688 kW
    hoist = mode["per_drive"]["hoist"]
    assert hoist["throttling_loss"]["unit"] == "kW"
    assert hoist["throttling_loss"]["si_value"] == pytest.approx(20e5 * hoist["reached_flow"]["si_value"], rel=1e-9)
    assert mode["values"]["pump_pressure"]["value"] == pytest.approx(242.5, abs=0.05)
    checks = [c for c in doc["checks"] if c["id"] == "reached_speed"]
    assert {c["where"]["mode"] for c in checks} == {"hoist_and_slew", "fast_hoist_and_slew", "slew_only"}
    slow = [c for c in checks if c["status"] == "fail"]
    assert {(c["where"]["drive"], c["where"]["mode"]) for c in slow} == {("hoist", "fast_hoist_and_slew"),
                                                                         ("slew", "fast_hoist_and_slew")}
