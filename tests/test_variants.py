"""Design variants: a variant's numbers equal the spec edited by hand, the exit status is the worst of
all that ran, the text and JSON say which variant fails, and diff compares variants."""

from __future__ import annotations

import json

import pytest

from helpers import EXAMPLE, example_data, minimal, run_cli, write_spec
from specgen.present.json_out import results_part
from specgen.pipeline import run_file
from specgen.variants import compare


def _doc(outcome, results=None) -> str:
    """The JSON of every computed value, check and assumed input of one design."""
    return json.dumps(results_part(results or outcome.results, outcome.machine.display_units, outcome.machine),
                      sort_keys=True)


def _variant(data: dict, vid: str, moves: dict, title: str = "") -> dict:
    data.setdefault("variants", {})[vid] = {"title": title or vid, "set": moves}
    return data


def test_a_variant_equals_the_demo_edited_by_hand(tmp_path):
    # The same edits made once as a variant and once in the spec itself: displacement, gear ratio,
    # relief setting, a load (the duty point's direction is decided again), a motor rating.
    moves = {"drives.cutter_reel.motor.displacement": "250 cm^3",
             "drives.bale_winch.gear_stage.ratio": 25,
             "supplies.main.relief_setting": "290 bar",
             "drives.track_left.duty_points.climb.load.wheel.grade": "-12 %",
             "drives.cooler_fan.motor.rating.max_speed": "3200 rpm"}
    varied = _variant({k: v for k, v in example_data().items() if k != "variants"}, "edit", moves)
    by_hand = {k: v for k, v in example_data().items() if k != "variants"}
    by_hand["drives"]["cutter_reel"]["motor"]["displacement"] = "250 cm^3"
    by_hand["drives"]["bale_winch"]["gear_stage"]["ratio"] = 25
    by_hand["supplies"]["main"]["relief_setting"] = "290 bar"
    by_hand["drives"]["track_left"]["duty_points"]["climb"]["load"]["wheel"]["grade"] = "-12 %"
    by_hand["drives"]["cooler_fan"]["motor"]["rating"]["max_speed"] = "3200 rpm"
    o = run_file(write_spec(tmp_path, varied, "varied.yaml"))
    hand = run_file(write_spec(tmp_path, by_hand, "hand.yaml"))
    (v,) = o.variants
    assert _doc(o, v.results) == _doc(hand)
    assert _doc(o) != _doc(hand)  # the base design is left as it was
    # downhill now: 0.08*cos(theta) + sin(theta) = 0.0794 - 0.1191 < 0 at -12 % (hand calculation)
    assert v.results.duty("track_left", "climb").direction == "overrunning"


def test_a_variable_motor_range_and_a_group_equal_the_hand_edit(tmp_path):
    moves = {"drives.hoist.motor.displacement": {"min": "40 cm^3", "max": "110 cm^3"},
             "motors.volumetric_efficiency": 0.93, "drives.hoist.motor.model": "VX-110"}
    o = run_file(write_spec(tmp_path, _variant(minimal(), "var", moves), "v.yaml"))
    hand = minimal()
    m = hand["drives"]["hoist"]["motor"]
    m["displacement"], m["model"] = {"min": "40 cm^3", "max": "110 cm^3"}, "VX-110"
    m["efficiency"]["volumetric"] = 0.93
    assert _doc(o, o.variants[0].results) == _doc(run_file(write_spec(tmp_path, hand, "h.yaml")))
    assert o.variants[0].machine.drive("hoist").motor.model == "VX-110"


def _failing_variant(tmp_path):
    # minimal(): inlet 205 bar at relief 250 bar (pressure margin 18 %); relief 200 bar puts the
    # inlet above the relief setting: the variant's pressure margin fails (hand calculation).
    return write_spec(tmp_path, _variant(minimal(), "low_relief", {"supplies.main.relief_setting": "200 bar"},
                                         "Relief at 200 bar"))


def test_a_failing_variant_sets_the_exit_status_and_is_named(tmp_path):
    path = _failing_variant(tmp_path)
    code, out, err = run_cli("check", "--quiet", path)
    assert code == 1 and err == ""
    assert out.splitlines()[0].split(": ")[1].startswith("PASS")  # the base design passes
    assert "variant low_relief: FAIL  Relief at 200 bar" in out
    assert "FAIL  pressure_margin" in out.split("Variant low_relief")[1]
    code, out, _ = run_cli("check", "--format", "json", path)
    doc = json.loads(out)
    assert (doc["verdict"], doc["overall_verdict"]) == ("pass", "fail")
    assert doc["variants"][0]["verdict"] == "fail"
    assert doc["variant_comparison"]["differing_checks"][0]["statuses"] == ["pass", "fail"]
    code, out, _ = run_cli("check", "--format", "github", path)
    assert "[variant low_relief]" in out and "::error" in out


def test_only_the_named_variants_run(tmp_path):
    data = _variant(_variant(minimal(), "low_relief", {"supplies.main.relief_setting": "200 bar"}),
                    "high_relief", {"supplies.main.relief_setting": "260 bar"})
    path = write_spec(tmp_path, data)
    code, out, _ = run_cli("check", "--quiet", "--variant", "high_relief", path)
    assert code == 0 and "high_relief" in out and "low_relief" not in out
    code, out, err = run_cli("check", "--variant", "nope", path)
    assert code == 2 and "no variant 'nope'" in err and "high_relief, low_relief" in err


def test_the_comparison_rows_hold_each_columns_numbers(tmp_path):
    o = run_file(_failing_variant(tmp_path))
    c = compare(o.machine.title, o.results, o.variants)
    row = next(r for r in c.rows if r.key == "margin.pressure_margin")
    # margin = (p_limit - p_in) / p_limit with p_in = 205.0147 bar (the minimal rig, hand calculation)
    assert row.values[0] == pytest.approx((250 - 205.0147) / 250, abs=1e-5)
    assert row.values[1] == pytest.approx((200 - 205.0147) / 200, abs=1e-5)
    assert c.verdicts == ("pass", "fail") and c.verdict == "fail"


def test_a_spec_without_variants_writes_no_variant_keys(tmp_path):
    code, out, _ = run_cli("check", "--format", "json", write_spec(tmp_path, minimal()))
    assert not {"variants", "overall_verdict", "variant_comparison", "sensitivity"} & set(json.loads(out))


def test_the_demo_variants_all_pass_so_ci_exits_0():
    code, out, _ = run_cli("check", "--quiet", EXAMPLE)
    assert code == 0
    assert [line.split(":")[0].strip() for line in out.splitlines() if line.startswith("  variant ")] == [
        "variant larger_reel", "variant winch_gear_25", "variant bigger_aux"]


def test_diff_between_two_variants_names_the_replaced_inputs(tmp_path):
    data = _variant(_variant(minimal(), "low_relief", {"supplies.main.relief_setting": "200 bar"}),
                    "high_relief", {"supplies.main.relief_setting": "260 bar"})
    path = write_spec(tmp_path, data)
    code, out, err = run_cli("diff", f"{path}#high_relief", f"{path}#low_relief")
    assert code == 1, err  # the pressure margin fails at 200 bar: a regression
    assert "supplies.main.relief_setting" in out and "260 bar" in out and "200 bar" in out
    assert "pressure_margin" in out
    code, out, _ = run_cli("diff", path, f"{path}#high_relief")
    assert code == 0 and "variants" not in out.split("Inputs changed")[1].split("\n\n")[0]


def test_report_shows_the_variants_side_by_side(tmp_path):
    code, out, err = run_cli("report", _failing_variant(tmp_path), "-o", tmp_path / "rep")
    html = (tmp_path / "rep" / "index.html").read_text(encoding="utf-8")
    assert code == 1 and "variant low_relief: FAIL" in out
    assert 'id="variants"' in html and "Relief at 200 bar" in html and "FAIL pressure_margin" in html
    summary = html.split('id="summary"')[1].split('id="cautions"')[0]  # page 1 says a variant fails
    assert "Design variants:" in summary and "FAIL</span> <a href=\"#variants\">low_relief" in summary


def test_a_variant_is_named_after_a_hash_unless_the_file_itself_holds_one(tmp_path):
    from specgen.gitsource import split_variant

    assert split_variant("HEAD~1:specs/loader.yaml#big_motor") == ("HEAD~1:specs/loader.yaml", "big_motor")
    assert split_variant("loader.yaml") == ("loader.yaml", None)
    odd = write_spec(tmp_path, minimal(), "rig#2.yaml")
    assert split_variant(str(odd)) == (str(odd), None)
