"""The key reference (specgen/keyref.py) and its committed copy, schemas/keys.md."""

import json

from helpers import ROOT, run_cli
from specgen import keyref
from specgen.intake.schema import schema

KEYS = ROOT / "schemas" / "keys.md"
REGENERATE = "python -m specgen.keyref -o schemas/keys.md"


def _property_names(node, out: set) -> set:
    if isinstance(node, dict):
        for k, v in node.get("properties", {}).items() if isinstance(node.get("properties"), dict) else ():
            out.add(k)
        for v in node.values():
            _property_names(v, out)
    elif isinstance(node, list):
        for v in node:
            _property_names(v, out)
    return out


def test_committed_reference_is_up_to_date():
    assert KEYS.read_text(encoding="utf-8") == keyref.render(), (
        f"schemas/keys.md is out of date with the schema; regenerate it: {REGENERATE}")


def test_every_key_of_the_schema_is_listed():
    text = keyref.render()
    rows = {line.split("`")[1] for line in text.splitlines() if line.startswith("| `")}
    leaves = {r.rsplit(".", 1)[-1].removesuffix("[]") for r in rows}
    missing = _property_names(schema(), set()) - leaves
    assert not missing, missing
    for key in ("drives.<id>.load_holding", "drives.<id>.motor.rating.peak_pressure",
                "drives.<id>.motor.case_drain", "machine.signoff.checked_by"):
        assert key in rows, key


def test_a_row_says_meaning_kind_and_example():
    line = next(x for x in keyref.render().splitlines() if x.startswith("| `supplies.<id>.relief_setting` |"))
    assert "Main relief valve setting" in line and "pressure (Pa in SI)" in line and "`250 bar`" in line


def test_cli_prints_the_same_reference():
    code, out, _ = run_cli("schema", "--keys")
    assert code == 0 and out == keyref.render()
    code, out, _ = run_cli("schema")
    assert code == 0 and json.loads(out) == schema()
