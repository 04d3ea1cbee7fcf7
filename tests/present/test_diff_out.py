"""The revision diff's presentation (present/diff_out.py): cause first, one line for one cause
across modes, added items with their values, the unchanged-revision flag, and a markdown comment
cut to fit (tests/present/test_diff_markdown.py)."""

import json

import yaml

from helpers import minimal
from specgen.diff import compare
from specgen.intake.read import load_text
from specgen.pipeline import evaluate
from specgen.present import diff_out


def outcome(data: dict, name: str = "spec.yaml"):
    return evaluate(load_text(yaml.safe_dump(data, sort_keys=False).encode(), name))


def two_modes() -> dict:
    d = minimal()
    d["modes"]["idle_lift"] = {"drives": {"hoist": "lift"}}
    return d


def weak_engine() -> tuple:
    old, new = two_modes(), two_modes()
    # the pump takes 40 cm^3 * 1500 rpm = 1 L/s at about 250 bar: some kW; 1 kW cannot drive it in either mode
    new["supplies"]["main"]["prime_mover_power"] = "1 kW"
    new["machine"]["revision"] = "B"
    return old, new


def test_one_cause_in_two_modes_is_one_line_naming_both():
    old, new = weak_engine()
    d = compare(outcome(old), outcome(new))
    power = [c for c in d.checks if c.id == "prime_mover_power"]
    assert len(power) == 2 and {c.where["mode"] for c in power} == {"work", "idle_lift"}
    md = diff_out.render(d, "markdown")
    rows = [line for line in md.splitlines() if "prime\\_mover\\_power" in line and line.startswith("| **")]
    assert len(rows) == 1
    assert "supply main, 2 modes: work, idle\\_lift" in rows[0] or "supply main, 2 modes: idle\\_lift, work" in rows[0]
    # JSON keeps every check apart (one record per check and mode)
    assert sum(c["id"] == "prime_mover_power" for c in json.loads(diff_out.render(d, "json"))["checks"]) == 2


def test_the_cause_leads_inputs_then_status_changes_then_moved_values():
    old, new = weak_engine()
    d = compare(outcome(old), outcome(new))
    for fmt in ("text", "markdown"):
        out = diff_out.render(d, fmt)
        at = [out.index(t) for t in ("Inputs changed", "Checks whose status changed", "Results changed")]
        assert at == sorted(at), fmt


def test_an_added_duty_point_shows_its_values():
    old, new = minimal(), minimal()
    new["drives"]["hoist"]["duty_points"]["creep"] = {"torque": "120 N*m", "speed": "40 rpm"}
    new["machine"]["revision"] = "B"
    text = diff_out.render(compare(outcome(old), outcome(new)), "text")
    row = next(line for line in text.splitlines() if "duty point 'creep'" in line)
    assert "torque 120 N*m; speed 40 rpm" in row


def test_content_changed_under_the_same_revision_is_flagged():
    old, new = weak_engine()
    new["machine"]["revision"] = "A"  # minimal() is rev A too
    same = compare(outcome(old), outcome(new))
    assert json.loads(diff_out.render(same, "json"))["summary"]["revision_unchanged"] is True
    text = diff_out.render(same, "text").splitlines()
    assert text[4].startswith("Note: The content changed but machine.revision is still 'A'")
    assert "machine.revision is still" in diff_out.render(same, "html")
    renamed = compare(outcome(old), outcome(weak_engine()[1]))  # rev B
    assert json.loads(diff_out.render(renamed, "json"))["summary"]["revision_unchanged"] is False
    assert "machine.revision is still" not in diff_out.render(renamed, "markdown")
