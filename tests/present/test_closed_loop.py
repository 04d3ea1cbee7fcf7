"""Closed-loop figures in every output: the text table, the JSON document (against its schema),
the report's table and the revision diff. Numbers are the hand-checked rig of helpers.closed_loop()
(tests/resolve/test_closed_loop.py shows the arithmetic)."""

import json

import jsonschema
import pytest
import yaml

from helpers import ROOT, closed_loop, minimal, run_cli, write_spec
from specgen.diff import compare
from specgen.intake.read import load_text
from specgen.pipeline import evaluate

SCHEMA = json.loads((ROOT / "schemas" / "check-output.schema.json").read_text(encoding="utf-8"))


def _outcome(data):
    return evaluate(load_text(yaml.safe_dump(data, sort_keys=False).encode(), "spec.yaml"))


def test_text_table_row_per_mode(tmp_path):
    code, out, err = run_cli("check", write_spec(tmp_path, closed_loop()))
    assert code == 0, out
    section = out.split("Closed-loop transmissions")[1].split("\n\n")[0]
    driving = next(line for line in section.splitlines() if line.startswith("loop    driving"))
    # x = 0.5, p_H 300 bar, p_L 25 bar, q 95 L/min, P_in 51.69 kW, charge 36 L/min against 24.51 L/min
    for text in ("50.00 %", "300.0 bar", "25.00 bar", "95.00 L/min", "51.69 kW", "36.00 L/min", "24.51 L/min"):
        assert text in driving, text
    braking = next(line for line in section.splitlines() if line.startswith("loop    braking"))
    assert "-27.83 kW" in braking  # the load drives the prime mover


def test_open_circuit_text_has_no_closed_loop_table(tmp_path):
    assert "Closed-loop" not in run_cli("check", write_spec(tmp_path, minimal()))[1]


def test_json_marks_the_loop_and_carries_its_values(tmp_path):
    code, out, err = run_cli("check", "--format", "json", write_spec(tmp_path, closed_loop()))
    doc = json.loads(out)
    jsonschema.Draft202012Validator(SCHEMA).validate(doc)
    assert [s.get("circuit") for s in doc["supplies"]] == ["closed_loop"]
    braking = next(s for s in doc["supply_modes"] if s["mode"] == "braking")
    assert braking["values"]["pump_input_power"]["si_value"] < 0
    assert braking["per_drive"]["wheel"]["loop_flow"]["unit"] == "L/min"
    open_doc = json.loads(run_cli("check", "--format", "json", write_spec(tmp_path, minimal(), "open.yaml"))[1])
    assert "circuit" not in open_doc["supplies"][0]


def test_diff_shows_the_loop_values_that_move_with_the_charge_pressure():
    old = closed_loop()
    new = closed_loop()
    new["supplies"]["loop"]["closed_loop"]["charge"]["pressure"] = "30 bar"
    d = compare(_outcome(old), _outcome(new))
    moved = {(v.owner.ids, v.key) for v in d.values}
    # charge power 36 L/min * 25 -> 30 bar / 0.8: 1875 -> 2250 W; the low side and the loop differential move
    # driving, the motor's differential stays 275 bar: the high side rises from 300 to 305 bar
    for key in ("low_side_pressure", "working_pressure", "charge_power", "pump_input_power"):
        assert (("loop", "driving"), key) in moved, key
    power = next(v for v in d.values if v.owner.ids == ("loop", "driving") and v.key == "charge_power")
    assert power.old == pytest.approx(1875.0) and power.new == pytest.approx(2250.0)
    assert any(c.dotted == "supplies.loop.closed_loop.charge.pressure" for c in d.input_changes)
