"""Revision diff: inputs by physical value, results, check status changes, output formats, git sides."""

import json
import math
import re

import jsonschema
import pytest

from revisions import commit, example_revision, git, make_repo
from helpers import EXAMPLE, ROOT, markdown_tables, minimal, run_cli
from specgen import exits
from specgen.diff import compare, diff_inputs
from specgen.intake.read import load_text
from specgen.pipeline import evaluate
from specgen.present import diff_out
from specgen.intake.content import fields

import yaml

HEAVIER = {("track_left", "harvest"): "5 kN*m", ("track_right", "harvest"): "3.17 kN*m"}


def evaluate_text(raw: bytes, name: str):
    return evaluate(load_text(raw, name))


def outcome(data: dict, name: str = "spec.yaml"):
    return evaluate_text(yaml.safe_dump(data, sort_keys=False).encode(), name)


def track_inputs() -> tuple[float, float, float]:
    """Displacement (m^3), hydro-mechanical efficiency and back pressure (Pa) of the left track, from the example."""
    from helpers import example_data
    from specgen.units import parse

    d = example_data()
    motor = d["drives"]["track_left"]["motor"]
    back = d["drives"]["track_left"].get("back_pressure") or d["supplies"][d["drives"]["track_left"]["supply"]]["return_pressure"]
    return parse(motor["displacement"], "displacement"), parse(motor["efficiency"]["hydromechanical"], "ratio"), \
        parse(back, "pressure")


# --- inputs --------------------------------------------------------------------------------------

def test_kinds_come_from_the_schema():
    d = minimal()
    d["drives"]["hoist"]["motor"]["displacement"] = {"min": "20 cm^3", "max": "100 cm^3"}
    f = fields(d)
    assert f[("supplies", "main", "relief_setting")].kind == "pressure"
    assert f[("drives", "hoist", "duty_points", "lift", "torque")].kind == "torque"
    assert f[("drives", "hoist", "motor", "efficiency", "volumetric")].kind == "ratio"  # efficiency -> ratio
    assert f[("drives", "hoist", "motor", "displacement", "max")].kind == "displacement"  # oneOf branch
    assert f[("machine", "title")].kind is None
    assert f[("drives", "hoist")].noun == "drive" and f[("drives", "hoist", "duty_points", "lift")].noun == "duty point"


def test_quantity_of_no_single_kind_is_compared_in_a_kind_both_read_as():
    from specgen.intake.content import common_kind

    assert common_kind("18 %", "18%") == ("ratio", pytest.approx(0.18), pytest.approx(0.18))
    assert common_kind("250 bar", "3626 psi")[0] == "pressure"
    assert common_kind("250 bar", "12 rpm") is None


def test_equal_physical_values_are_not_changes():
    # 1 psi = 6894.757 Pa (pint, the reference library for units): 3626 psi = 250.004 bar, within 0.01 %.
    old, new = minimal(), minimal()
    new["supplies"]["main"]["relief_setting"] = "3626 psi"
    new["supplies"]["main"]["pump"]["volumetric_efficiency"] = "95 %"  # 0.95 written as a percentage
    new["drives"]["hoist"]["motor"]["displacement"] = "0.1 L"  # 100 cm^3
    changes = diff_inputs(old, new)
    assert [c.change for c in changes] == ["respelled"] * 3
    d = compare(outcome(old), outcome(new))
    assert d.input_changes == () and d.values == () and d.checks == ()
    assert "No input changed." in diff_out.render(d, "text")
    assert "supplies.main.relief_setting: '250 bar' -> '3626 psi'" in diff_out.render(d, "text")


def test_a_real_change_is_reported_with_its_difference():
    old, new = minimal(), minimal()
    new["supplies"]["main"]["relief_setting"] = "260 bar"
    new["machine"]["title"] = "Test rig B"
    d = compare(outcome(old), outcome(new))
    by_path = {c.dotted: c for c in d.input_changes}
    relief = by_path["supplies.main.relief_setting"]
    assert relief.change == "changed" and relief.old_si == pytest.approx(25e6) and relief.new_si == pytest.approx(26e6)
    assert by_path["machine.title"].old == "Test rig" and by_path["machine.title"].new == "Test rig B"
    text = diff_out.render(d, "text")
    assert re.search(r"changed\s+supplies\.main\.relief_setting\s+250 bar\s+260 bar\s+\+10\.00 bar", text)
    # torque at relief T = Vg*(p_relief - p_out)*eta_hm/(2*pi) (motor torque relation) rises by 10/245
    v = next(v for v in d.values if v.key == "relief_torque")
    assert v.percent == pytest.approx(10 / 245 * 100, rel=1e-6)


def test_renamed_drive_is_added_and_removed_never_paired():
    old, new = minimal(), minimal()
    new["drives"] = {"winch": new["drives"].pop("hoist")}
    new["modes"]["work"]["drives"] = {"winch": "lift"}
    d = compare(outcome(old), outcome(new))
    items = {(c.change, c.noun, c.path[-1]) for c in d.input_changes if c.noun}
    assert items == {("added", "drive", "winch"), ("removed", "drive", "hoist")}
    assert {(o.first, ch) for o, ch in d.owners} == {("winch", "added"), ("hoist", "removed")}
    assert all(v.owner.first not in ("winch", "hoist") for v in d.values)  # nothing compared across them
    text = diff_out.render(d, "text")
    assert "drive 'winch' (drives.winch)" in text and "drive 'hoist' (drives.hoist)" in text
    assert exits.diff_status(d, "warn") == 0  # the renamed drive passes as before


# --- results and checks between two git revisions -------------------------------------------------

@pytest.fixture
def repo(tmp_path):
    """Revision 1: the example as written. Revision 2: reformatted, left track harvest torque 5 kN*m
    (far beyond the relief setting), right track 3.17 kN*m (inside the 10 % pressure margin)."""
    r = make_repo(tmp_path / "repo")
    commit(r, {"specs/harvester.yaml": EXAMPLE.read_text(encoding="utf-8")}, "as issued")
    commit(r, {"specs/harvester.yaml": example_revision(HEAVIER, relief_in_psi="main")}, "heavier harvest duty")
    return r


def test_result_and_status_diff_between_revisions(repo, monkeypatch):
    monkeypatch.chdir(repo)
    before = (repo / "specs/harvester.yaml").stat().st_mtime_ns
    code, out, err = run_cli("diff", "HEAD~1:specs/harvester.yaml", "HEAD:specs/harvester.yaml", "--format", "json")
    assert code == 1, err  # a check went to fail
    doc = json.loads(out)
    # the reformatting is no change; the two torques are
    assert [(i["path"], i["old"], i["new"]) for i in doc["inputs"] if i["change"] != "respelled"] == [
        ("drives.track_left.duty_points.harvest.torque", "2.6 kN*m", "5 kN*m"),
        ("drives.track_right.duty_points.harvest.torque", "2.6 kN*m", "3.17 kN*m")]
    assert [i["path"] for i in doc["inputs"] if i["change"] == "respelled"] == ["supplies.main.relief_setting"]
    worse = {(c["id"], c["where"]["drive"], c["where"]["duty"]): (c["old_status"], c["new_status"])
             for c in doc["checks"] if c["change"] == "worse"}
    assert worse[("pressure_margin", "track_left", "harvest")] == ("pass", "fail")
    assert worse[("continuous_pressure", "track_left", "harvest")] == ("pass", "fail")
    assert worse[("pressure_margin", "track_right", "harvest")] == ("pass", "warn")
    assert not any(d in ("track_left", "track_right") and u != "harvest" for _, d, u in worse)  # other duties as before
    ranks = [{"fail": 0, "warn": 1, None: 2}[c["regression"]] for c in doc["checks"]]
    assert ranks == sorted(ranks) and ranks[0] == 0  # regressions first, fail before warn
    values = {(v["where"]["drive"], v["where"]["duty"], v["key"]): v for v in doc["results"]["values"]}
    assert values[("track_left", "harvest", "motor_torque")]["percent"] == pytest.approx((5 / 2.6 - 1) * 100)
    # p_in = 2*pi*T/(Vg*eta_hm) + p_back (motor torque relation T = Vg*dp*eta_hm/(2*pi), solved for dp)
    vg, eta_hm, back = track_inputs()
    p_in = values[("track_left", "harvest", "inlet_pressure")]
    assert p_in["new"]["si_value"] == pytest.approx(2 * math.pi * 5000 / (vg * eta_hm) + back)
    assert p_in["new"]["unit"] == "bar"
    assert p_in["delta"]["value"] == pytest.approx(2 * math.pi * 2400 / (vg * eta_hm) / 1e5)
    assert ("track_left", "transit", "motor_torque") not in values
    # the work tree and the index were not touched
    assert (repo / "specs/harvester.yaml").stat().st_mtime_ns == before
    assert git(repo, "status", "--porcelain") == ""


def test_fail_on_decides_the_exit_status(tmp_path, monkeypatch):
    r = make_repo(tmp_path / "repo")
    commit(r, {"m.yaml": yaml.safe_dump(minimal())}, "A")
    warned = minimal()
    # p_in = 2*pi*T/(Vg*eta_hm) + p_out = 2*pi*322/(100e-6*0.9) Pa + 5 bar = 229.80 bar: margin (250 - 229.80)/250
    # = 8.081 % (under 10 %); before, 286.5 N*m gave 205.02 bar, margin 17.99 %
    warned["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "322 N*m"
    commit(r, {"m.yaml": yaml.safe_dump(warned)}, "B: pass -> warn")
    monkeypatch.chdir(r)
    assert run_cli("diff", "HEAD~1:m.yaml", "HEAD:m.yaml")[0] == 0  # default --fail-on fail: a warning is no failure
    code, out, _ = run_cli("diff", "HEAD~1:m.yaml", "HEAD:m.yaml", "--fail-on", "warn")
    assert code == 1 and re.search(r"pass -> warn\s+pressure_margin\s+drive hoist, duty point lift\s+17\.99 %\s+8\.081 %", out)
    assert run_cli("diff", "HEAD:m.yaml", "HEAD~1:m.yaml", "--fail-on", "warn")[0] == 0  # the way back improves


def test_work_tree_file_against_a_revision(repo, monkeypatch):
    monkeypatch.chdir(repo / "specs")
    code, out, _ = run_cli("diff", "HEAD~1:./harvester.yaml", "harvester.yaml")
    assert code == 1 and "pass -> fail" in out


@pytest.mark.parametrize("old, message", [
    ("nosuchrev:specs/harvester.yaml", "unknown revision 'nosuchrev'"),
    ("HEAD~7:specs/harvester.yaml", "unknown revision 'HEAD~7'"),
    ("HEAD:specs/missing.yaml", "'specs/missing.yaml' does not exist in revision 'HEAD'"),
    ("HEAD:specs", "is a tree in revision 'HEAD'"),
])
def test_invalid_old_revision_is_a_clean_error(repo, monkeypatch, old, message):
    monkeypatch.chdir(repo)
    code, out, err = run_cli("diff", old, "specs/harvester.yaml")
    assert code == 2 and out == ""
    assert err.startswith(f"error: {old}: ") and message in err and "Traceback" not in err
    assert len(err.strip().splitlines()) == 1


def test_revision_outside_a_repository(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    code, _, err = run_cli("diff", "HEAD:x.yaml", EXAMPLE)
    assert code == 2 and "not in a git repository" in err


def test_invalid_spec_in_a_revision_names_it(repo, monkeypatch):
    broken = yaml.safe_load(example_revision())
    broken["supplies"]["main"]["relief_setting"] = "280 kg"
    commit(repo, {"specs/harvester.yaml": yaml.safe_dump(broken)}, "broken")
    monkeypatch.chdir(repo)
    code, _, err = run_cli("diff", "HEAD~1:specs/harvester.yaml", "HEAD:specs/harvester.yaml")
    assert code == 2 and re.match(r"error: HEAD:specs/harvester\.yaml:\d+:\d+: supplies\.main\.relief_setting", err)


# --- output formats -------------------------------------------------------------------------------

@pytest.fixture(scope="module")
def regression():
    return compare(evaluate_text(EXAMPLE.read_bytes(), "old.yaml"), evaluate_text(example_revision(HEAVIER).encode(), "new.yaml"))


def test_markdown_tables_are_well_formed(regression):
    md = diff_out.render(regression, "markdown")
    tables = markdown_tables(md)
    assert tables == 4  # status changes, values moved, results, inputs
    assert "| status | check | where | value before | value now | limit |" in md
    assert "| **pass -> fail** | pressure\\_margin | drive track\\_left, duty point harvest | " in md
    s = regression.regressions("warn")
    to_fail = sum(c.regression == "fail" for c in s)
    assert f"**{len(s)} checks got worse: {to_fail} now fail, {len(s) - to_fail} now warn.**" in md
    assert to_fail >= 2 and len(s) > to_fail


def test_json_output_matches_its_schema(regression):
    schema = json.loads((ROOT / "schemas" / "diff-output.schema.json").read_text(encoding="utf-8"))
    jsonschema.Draft202012Validator.check_schema(schema)
    doc = json.loads(diff_out.render(regression, "json"))
    jsonschema.Draft202012Validator(schema).validate(doc)
    regressions = [c for c in doc["checks"] if c["regression"]]
    assert doc["summary"] == {
        "regressions": len(regressions), "to_fail": sum(c["regression"] == "fail" for c in regressions),
        "to_warn": sum(c["regression"] == "warn" for c in regressions), "checks_changed": len(doc["checks"]),
        "results_changed": len(doc["results"]["values"]) + len(doc["results"]["items"]), "inputs_changed": 2,
        "revision_unchanged": True}  # example_revision changes torques and keeps rev C
    assert doc["new"]["verdict"] == "fail"


def test_html_is_escaped_and_carries_the_caution(regression):
    old, new = minimal(), minimal()
    new["machine"]["title"] = "<b>rig</b> & co"
    page = diff_out.render(compare(outcome(old), outcome(new)), "html")
    assert "&lt;b&gt;rig&lt;/b&gt; &amp; co" in page and "<b>rig" not in page
    full = diff_out.render(regression, "html")
    assert full.startswith("<!DOCTYPE html>") and 'class="fail"' in full and "Design aid only" in full


def test_failing_checks_unchanged_are_still_listed():
    old = minimal()
    old["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"  # fails the pressure margin
    new = minimal()
    new["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    new["machine"]["title"] = "Renamed rig"
    d = compare(outcome(old), outcome(new))
    assert d.checks == () and {c.id for c in d.still_failing} >= {"pressure_margin"}
    assert "Still failing (unchanged)" in diff_out.render(d, "text")


def test_output_file_is_written(tmp_path, regression):
    old, new = tmp_path / "old.yaml", tmp_path / "new.yaml"
    old.write_bytes(EXAMPLE.read_bytes())
    new.write_text(example_revision(HEAVIER), encoding="utf-8")
    target = tmp_path / "out" / "diff.md"
    code, out, _ = run_cli("diff", old, new, "--format", "markdown", "-o", target)
    assert code == 1 and out == "" and target.read_text(encoding="utf-8").startswith("### specgen diff")


def test_values_of_one_drive_in_a_series_supply_are_compared_under_its_id():
    def series(feed_torque: str) -> dict:
        d = minimal()
        d["supplies"]["main"]["circuit"] = "series"
        d["drives"]["feed"] = {"supply": "main", "motor": {
            "kind": "axial_piston", "displacement": "80 cm^3",
            "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.85}},
            "duty_points": {"run": {"torque": feed_torque, "speed": "600 rpm"}}}
        d["modes"]["work"]["drives"]["feed"] = "run"
        return d

    d = compare(outcome(series("100 N*m")), outcome(series("120 N*m")))
    moved = {(v.owner.scope, v.owner.ids, v.key): v for v in d.values}
    # feed is last along the line: hoist's outlet is feed's inlet, 5 bar + 2*pi*T/(80e-6*0.9) (hand calc)
    inlet = moved[("supply_mode_drive", ("main", "work", "feed"), "inlet_pressure")]
    assert inlet.delta == pytest.approx(2 * math.pi * 20 / (80e-6 * 0.9))
    assert moved[("supply_mode_drive", ("main", "work", "hoist"), "outlet_pressure")].delta == pytest.approx(inlet.delta)
    assert ("supply_mode_drive", ("main", "work", "feed"), "outlet_pressure") not in moved  # the return: unchanged
    assert all("[" not in v.key for v in d.values)


def test_a_check_whose_worst_corner_changed_is_a_change():
    """Same failing status, now found at another operating corner: listed as moved, naming both."""
    old, new = minimal(), minimal()
    # Hand calculation: relief 250 bar + 5 % = 262.5 bar and + 10 % = 275 bar, both above the 260 bar
    # peak rating: peak_pressure fails at each corner, at "tolerance" before and at "spike" now.
    for d, corner in ((old, "tolerance"), (new, "spike")):
        d["drives"]["hoist"]["motor"]["rating"]["peak_pressure"] = "260 bar"
        d["corners"] = {corner: {"scale": {"supplies.relief_setting": "+5 %" if corner == "tolerance" else 1.10}}}
    d = compare(outcome(old), outcome(new))
    moved = [c for c in d.checks if c.id == "peak_pressure"]
    assert len(moved) == 1 and moved[0].change == "moved"
    assert (moved[0].old_corner, moved[0].new_corner) == ("tolerance", "spike")
    assert moved[0].message.startswith("Worst at corner spike (was corner tolerance): ")
    assert moved[0].new_value == pytest.approx(275e5)
