"""Shared prime movers in the text, JSON, diff and CI outputs."""

from __future__ import annotations

import json

import jsonschema
import pytest

from engine_spec import shared_engine
from helpers import ROOT, minimal, run_cli, write_spec

CHECK_SCHEMA = json.loads((ROOT / "schemas" / "check-output.schema.json").read_text(encoding="utf-8"))
DIFF_SCHEMA = json.loads((ROOT / "schemas" / "diff-output.schema.json").read_text(encoding="utf-8"))


def test_json_carries_each_prime_mover_mode_and_validates(tmp_path):
    code, out, err = run_cli("check", "--format", "json", write_spec(tmp_path, shared_engine()))
    doc = json.loads(out)
    jsonschema.Draft202012Validator(CHECK_SCHEMA).validate(doc)
    dig = next(x for x in doc["prime_movers"] if x["mode"] == "dig")
    assert dig["speed_name"] == "rated"
    assert dig["values"]["power_used"]["si_value"] == pytest.approx(68e3)  # 38 + 30 kW (tests/engine_spec.py)
    assert dig["per_supply"]["rear"]["pump_shaft_speed"]["value"] == pytest.approx(2640)  # rpm: 2200 * 1.2
    load = next(c for c in doc["checks"] if c["id"] == "prime_mover_load" and c["where"]["mode"] == "dig")
    assert load["where"]["prime_mover"] == "diesel" and load["status"] == "warn"


def test_json_without_prime_movers_has_no_such_keys(tmp_path):
    _, out, _ = run_cli("check", "--format", "json", write_spec(tmp_path, minimal()))
    doc = json.loads(out)
    assert "prime_movers" not in doc
    assert all("prime_mover" not in c["where"] for c in doc["checks"])


def test_text_lists_each_prime_mover_mode(tmp_path):
    _, out, _ = run_cli("check", write_spec(tmp_path, shared_engine()))
    assert "Shared prime movers in each mode" in out
    line = next(x for x in out.splitlines() if x.startswith("diesel") and " dig " in x)
    for text in ("rated 2200 rpm", "75.00 kW", "front 38.00 kW, rear 30.00 kW", "68.00 kW"):
        assert text in line, text
    assert "prime_mover_load     prime mover diesel, mode dig:" in out


def test_diff_shows_the_summed_power_and_the_check_value_moving(tmp_path):
    old = write_spec(tmp_path, shared_engine(), "old.yaml")
    d = shared_engine()
    d["supplies"]["rear"]["drive_ratio"] = 1.3  # B at 2860 rpm: 30 kW * 1.3/1.2 = 32.5 kW; sum 70.5 kW
    d["machine"]["revision"] = "B"
    new = write_spec(tmp_path, d, "new.yaml")
    code, out, err = run_cli("diff", "--format", "json", old, new)
    doc = json.loads(out)
    jsonschema.Draft202012Validator(DIFF_SCHEMA).validate(doc)
    moved = [c for c in doc["checks"] if c["id"] == "prime_mover_load" and c["where"]["mode"] == "dig"]
    assert moved and moved[0]["where"]["prime_mover"] == "diesel"
    assert moved[0]["new_value"]["si_value"] == pytest.approx(70.5e3)
    values = [v for v in doc["results"]["values"] if v["scope"] == "prime_mover_mode" and v["key"] == "power_used"]
    assert {v["where"]["mode"] for v in values} == {"dig", "travel_idle"}
    _, text, _ = run_cli("diff", old, new)
    assert "prime mover diesel, mode dig" in text


def test_ci_annotation_points_at_the_prime_mover(tmp_path):
    spec = write_spec(tmp_path, shared_engine())
    _, out, _ = run_cli("check", "--format", "github", spec)
    (line,) = [x for x in out.splitlines() if "prime_mover_load" in x or "Shared prime mover" in x]
    lines = spec.read_text(encoding="utf-8").splitlines()
    at = next(i for i, x in enumerate(lines) if x.strip() == "diesel:") + 1
    assert f"line={at}," in line
