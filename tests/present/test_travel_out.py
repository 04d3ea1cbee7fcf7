"""The machine as a vehicle in text, JSON (valid against the output schema), the report and the diff."""

from __future__ import annotations

import json
from pathlib import Path

import jsonschema

from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.present import json_out, text
from specgen.present.travel_out import corners
from vehicles import carrier

SCHEMAS = Path(__file__).resolve().parents[2] / "schemas"


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def test_text_shows_the_vehicle_and_the_envelope_corners():
    out = text.render(outcome(carrier()))
    assert "Travel: tractive effort against ground speed" in out
    # hand calculations in tests/vehicles.py: 44 451.98 N at the pressure limit, 60 000 N adhesion
    assert "44.45 kN" in out and "60.00 kN" in out
    assert "Travel envelope (where the limiting line changes)" in out


def test_no_travel_block_nothing_in_text_or_json():
    from helpers import minimal
    o = outcome(minimal())
    assert "Travel" not in text.render(o) and "travel" not in json_out.document(o)


def test_json_travel_is_valid_and_complete():
    o = outcome(carrier())
    doc = json.loads(json_out.render([o]))
    jsonschema.validate(doc, json.loads((SCHEMAS / "check-output.schema.json").read_text()))
    tr = doc["travel"]
    assert tr["values"]["relief_effort"]["si_value"] == tr["values"]["max_effort"]["si_value"]
    assert tr["duty_points"][0] == {**tr["duty_points"][0], "drive": "track_left", "duty": "pivot",
                                    "limit_line": "relief"}
    # from standstill the pressure limit sets it; from 0.722 * 50 000 / 44 451.98 = 0.8121 m/s the engine's power
    assert tr["envelope"][0]["speed"]["value"] == 0 and tr["envelope"][0]["limit"] == "relief"
    assert tr["envelope"][-1]["limit"] == "engine power"
    assert any(abs(p["speed"]["value"] - 0.8121) < 1e-4 for p in tr["envelope"])  # the corner is a row
    first = next(p for p in tr["envelope"] if p["limit"] == "engine power")
    assert first["speed"]["value"] > 0.8121


def test_json_braking_duty_point_has_no_limit_line():
    d = carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "4 m", "speed": "0.5 m/s"}}}})
    doc = json.loads(json_out.render([outcome(d)]))
    jsonschema.validate(doc, json.loads((SCHEMAS / "check-output.schema.json").read_text()))
    lines = {(u["drive"], u["duty"]): u["limit_line"] for u in doc["travel"]["duty_points"]}
    assert lines == {("track_left", "turn"): "relief", ("track_right", "turn"): None}


def test_envelope_corners_keep_the_ends_and_each_change():
    env = outcome(carrier()).results.travel.envelope
    shown = corners(env)
    assert shown[0] is env[0] and shown[-1] is env[-1]
    assert all(a.limit != b.limit for a, b in zip(shown[1:-1], shown[2:-1]))


def test_diff_shows_travel_values_that_moved():
    from specgen.diff import compare
    old, new = outcome(carrier()), outcome(carrier(adhesion=0.6))
    moved = {(v.owner.scope, v.key) for v in compare(old, new).values}
    # adhesion 0.75 -> 0.6: the limit 60 kN -> 48 kN, at the vehicle and at each duty point
    assert ("travel", "adhesion_limit") in moved and ("travel_duty_point", "adhesion_limit") in moved
    assert ("travel", "relief_effort") not in moved

