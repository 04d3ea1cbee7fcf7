"""Review records: content fingerprint, append-only record file, review state in check."""

import json

import pytest
import yaml

from helpers import minimal, run_cli, write_spec
from specgen.review import content_fingerprint, read_reviews, review_date, reviews_for_report, reviews_path
from specgen.intake.read import load_file

REVIEW = ("--by", "A. Checker", "--role", "checking engineer", "--verdict", "approved", "--date", "2025-03-14")


def fp(data) -> str:
    return content_fingerprint(data)


def test_fingerprint_ignores_layout_order_and_unit_spelling(tmp_path):
    base = minimal()
    block = write_spec(tmp_path, base, "block.yaml")
    flow = tmp_path / "flow.yaml"  # same data: flow style, keys reversed, a comment, other quoting
    flow.write_text("# reformatted\n" + yaml.safe_dump(dict(reversed(list(base.items()))), default_flow_style=True,
                                                        default_style='"'), encoding="utf-8")
    assert fp(load_file(block).data) == fp(load_file(flow).data)
    respelled = minimal()
    s = respelled["supplies"]["main"]
    s["relief_setting"] = "25 MPa"  # = 250 bar (1 bar = 1e5 Pa, SI definition)
    s["return_pressure"] = "0.5 MPa"
    s["prime_mover_power"] = "30000 W"
    s["pump"]["volumetric_efficiency"] = "95 %"
    s["pump"]["shaft_speed"] = "25 rev/s"  # = 1500 rpm
    respelled["drives"]["hoist"]["motor"]["displacement"] = "0.1 L"  # = 100 cm^3
    assert fp(respelled) == fp(base)


@pytest.mark.parametrize("change", [
    lambda d: d["supplies"]["main"].update(relief_setting="251 bar"),
    lambda d: d["supplies"]["main"].update(relief_setting="3626 psi"),  # 250.004 bar (pint): not the same value
    lambda d: d["machine"].update(title="Test rig, revised"),
    lambda d: d["drives"]["hoist"]["duty_points"]["lift"].update(starting_torque="300 N*m"),
    lambda d: d["drives"]["hoist"]["motor"]["efficiency"].update(volumetric=0.951),
])
def test_any_value_change_changes_the_fingerprint(change):
    d = minimal()
    change(d)
    assert fp(d) != fp(minimal())


def test_review_date_sources():
    assert review_date("2025-03-14") == "2025-03-14"
    assert review_date(None, {"SOURCE_DATE_EPOCH": "1700000000"}) == "2023-11-14"  # 2023-11-14T22:13:20Z


def test_review_then_require_review(tmp_path):
    spec = write_spec(tmp_path, minimal())
    code, out, err = run_cli("check", "--quiet", "--require-review", spec)
    assert code == 1 and "Review: no review recorded" in out and "review required" in err
    code, out, _ = run_cli("review", spec, *REVIEW, "--remarks", "margins: fine | ok")
    assert code == 0 and "approved by A. Checker (checking engineer) on 2025-03-14" in out
    code, out, _ = run_cli("check", "--quiet", "--require-review", spec)
    assert code == 0 and "Review: reviewed: approved by A. Checker" in out
    # reformatting keeps the review; a value change does not
    spec.write_text("# tidied\n" + yaml.safe_dump(minimal(), default_flow_style=True), encoding="utf-8")
    assert run_cli("check", "--require-review", spec)[0] == 0
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "290 N*m"
    write_spec(tmp_path, d)
    code, out, err = run_cli("check", "--require-review", spec)
    assert code == 1 and "changed since the last review" in out and "review required" in err
    assert run_cli("check", spec)[0] == 0  # without the flag the state is told but does not fail
    doc = json.loads(run_cli("check", "--format", "json", spec)[1])
    assert doc["review"]["state"] == "changed" and doc["review"]["last"]["remarks"] == "margins: fine | ok"


def test_rejected_review_does_not_cover(tmp_path):
    spec = write_spec(tmp_path, minimal())
    run_cli("review", spec, "--by", "B. Lead", "--role", "approver", "--verdict", "rejected", "--date", "2025-03-15")
    code, out, _ = run_cli("check", "--require-review", spec)
    assert code == 1 and "Review: rejected by B. Lead (approver)" in out


def test_failing_checks_still_fail_when_reviewed(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    spec = write_spec(tmp_path, d)
    run_cli("review", spec, *REVIEW)
    assert run_cli("check", "--require-review", spec)[0] == 1


def test_append_never_rewrites_earlier_records(tmp_path, monkeypatch):
    spec = write_spec(tmp_path, minimal())
    run_cli("review", spec, *REVIEW, "--remarks", "first: 'quoted' # not a comment\nsecond line")
    first = reviews_path(spec).read_bytes()
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1700000000")
    d = minimal()
    d["machine"]["revision"] = "B"
    write_spec(tmp_path, d)
    assert run_cli("review", spec, "--by", "B. Lead", "--role", "approver", "--verdict", "approved_with_remarks")[0] == 0
    second = reviews_path(spec).read_bytes()
    assert second.startswith(first) and len(second) > len(first)
    records = read_reviews(reviews_path(spec))
    assert [(r.name, r.date, r.machine_revision) for r in records] == [
        ("A. Checker", "2025-03-14", "A"), ("B. Lead", "2023-11-14", "B")]
    assert records[0].remarks == "first: 'quoted' # not a comment\nsecond line"
    report = reviews_for_report(spec, load_file(spec))
    assert [r["matches_current"] for r in report] == [False, True]
    assert set(report[0]) == {"name", "role", "date", "verdict", "remarks", "fingerprint", "matches_current"}


def test_reviews_file_name_and_folder_check(tmp_path):
    spec = write_spec(tmp_path, minimal(), "loader.yaml")
    run_cli("review", spec, *REVIEW)
    assert reviews_path(spec) == tmp_path / "loader.reviews.yaml" and reviews_path(spec).is_file()
    code, out, err = run_cli("check", "--quiet", tmp_path)  # the record file is not taken for a spec
    assert code == 0, err
    assert "loader.reviews.yaml:" not in out and out.count("PASS") == 1


@pytest.mark.parametrize("args, message", [
    (("--by", " ", "--role", "x", "--verdict", "approved"), "--by: give one line"),
    (("--by", "A\nB", "--role", "x", "--verdict", "approved"), "--by: give one line"),
    (("--by", "A", "--role", "x", "--verdict", "approved", "--date", "14/03/2025"), "--date: '14/03/2025' is not a date"),
])
def test_bad_review_arguments_exit_2_and_write_nothing(tmp_path, args, message):
    spec = write_spec(tmp_path, minimal())
    code, _, err = run_cli("review", spec, *args)
    assert code == 2 and message in err and not reviews_path(spec).exists()


def test_corrupt_reviews_file_is_reported_and_kept(tmp_path):
    spec = write_spec(tmp_path, minimal())
    target = reviews_path(spec)
    target.write_text("review_format: 1\nreviews:\n- name: A\n  verdict: fine\n", encoding="utf-8")
    before = target.read_bytes()
    code, _, err = run_cli("review", spec, *REVIEW)
    assert code == 2 and f"{target}:4:" in err and "'fine' is not one of" in err
    assert target.read_bytes() == before
    assert run_cli("check", spec)[0] == 2


def test_review_of_an_invalid_spec_is_refused(tmp_path):
    d = minimal()
    d["supplies"]["main"]["relief_setting"] = "250 kg"
    spec = write_spec(tmp_path, d)
    assert run_cli("review", spec, *REVIEW)[0] == 2 and not reviews_path(spec).exists()


def test_report_lists_reviews_and_marks_stale_ones(tmp_path):
    spec = write_spec(tmp_path, minimal())
    assert run_cli("review", spec, *REVIEW)[0] == 0
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "290 N*m"
    write_spec(tmp_path, d)
    assert run_cli("review", spec, "--by", "B. Approver", "--role", "approver", "--verdict", "approved",
                   "--date", "2025-04-01")[0] == 0
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "295 N*m"
    write_spec(tmp_path, d)
    out = tmp_path / "rep"
    assert run_cli("report", spec, "-o", out)[0] == 0
    html = (out / "index.html").read_text(encoding="utf-8")
    section = html[html.index('id="reviews"'):html.index('id="signoff"')]
    assert "A. Checker" in section and "B. Approver" in section
    assert section.count("NO LONGER MATCHES") == 2
    # the sign-off block keeps its empty lines for ink
    assert "signature" in html[html.index('id="signoff"'):].lower()


def test_a_change_to_the_named_parts_file_needs_a_new_review(tmp_path):
    import shutil

    from helpers import ROOT

    for name in ("log_deck.yaml", "shop_motors.parts.yaml"):
        shutil.copy(ROOT / "example_specs" / name, tmp_path / name)
    spec = tmp_path / "log_deck.yaml"
    assert run_cli("review", spec, *REVIEW)[0] == 0
    assert run_cli("check", "--quiet", "--require-review", spec)[0] == 0
    parts = tmp_path / "shop_motors.parts.yaml"
    parts.write_text(parts.read_text(encoding="utf-8") + "\n# restocked\n", encoding="utf-8")
    assert run_cli("check", "--quiet", "--require-review", spec)[0] == 0  # a comment is no change
    data = yaml.safe_load(parts.read_text(encoding="utf-8"))
    kind = next(iter(data["motors"]))
    data["motors"][kind] = data["motors"][kind][:-1]  # the largest stocked size is gone
    parts.write_text(yaml.safe_dump(data, sort_keys=False), encoding="utf-8")
    code, out, _ = run_cli("check", "--quiet", "--require-review", spec)
    assert code == 1 and "changed since the last review" in out


def _warning_spec(tmp_path, torque="322 N*m"):
    """The rig with a heavier lift: dp = 2*pi*322 N*m / (100 cm^3 * 0.9) = 224.8 bar, inlet 229.8 bar
    against the 250 bar relief: margin (250 - 229.8) / 250 = 8.1 %, inside the 10 % warning band
    (hand calculation, motor torque relation)."""
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = torque
    return write_spec(tmp_path, d), d


ACCEPT = ("--by", "A. Checker", "--role", "checking engineer", "--date", "2025-03-14",
          "--accept-warning", "pressure_margin", "--reason", "lift is short and rare")


def test_a_warning_is_accepted_with_a_reason_and_shown_beside_it(tmp_path):
    spec, _ = _warning_spec(tmp_path)
    doc = json.loads(run_cli("check", "--format", "json", spec)[1])
    warn = [c for c in doc["checks"] if c["id"] == "pressure_margin"][0]
    assert warn["status"] == "warn"
    code, out, err = run_cli("review", spec, *ACCEPT)
    assert code == 0, err
    assert "warning pressure_margin (drive hoist, duty point lift) accepted by A. Checker" in out
    record = read_reviews(reviews_path(spec))[0]
    assert record.verdict == "accepted_warning" and record.warning["where"] == "drive hoist, duty point lift"
    assert record.warning["reason"] == "lift is short and rare"
    # the outputs keep the warning and say it was accepted; the review state is untouched by it
    code, out, _ = run_cli("check", spec)
    assert code == 0 and "WARN  pressure_margin" in out
    assert "Accepted: warning pressure_margin (drive hoist, duty point lift) accepted by A. Checker" in out
    assert "Review: no review recorded" in out
    doc = json.loads(run_cli("check", "--format", "json", spec)[1])
    assert [c["status"] for c in doc["checks"] if c["id"] == "pressure_margin"] == ["warn"]
    (d,) = doc["review"]["dispositions"]
    assert d["accepted"] and d["stale"] == "" and d["reason"] == "lift is short and rare"
    assert d["fingerprint"] == doc["review"]["fingerprint"]
    out_dir = tmp_path / "rep"
    assert run_cli("report", spec, "-o", out_dir)[0] == 0
    html = (out_dir / "index.html").read_text(encoding="utf-8")
    assert "Accepted</span>" not in html  # the word sits inside the note with who and why
    assert ('class="disposition">Accepted by A. Checker (checking engineer), 2025-03-14: lift is short and rare'
            in html)
    assert "warnings accepted: 1 of" in html


def test_an_acceptance_goes_stale_when_the_value_or_the_content_changes(tmp_path):
    spec, d = _warning_spec(tmp_path)
    assert run_cli("review", spec, *ACCEPT)[0] == 0
    # another value of the spec changes: the content fingerprint moves, the check's value does not
    d["supplies"]["main"]["prime_mover_power"] = "31 kW"
    write_spec(tmp_path, d)
    (disp,) = json.loads(run_cli("check", "--format", "json", spec)[1])["review"]["dispositions"]
    assert not disp["accepted"] and "content changed" in disp["stale"] and "value moved" not in disp["stale"]
    # the lift gets heavier: the value behind the warning moves too
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "325 N*m"
    write_spec(tmp_path, d)
    code, out, _ = run_cli("check", spec)
    assert "STALE" in out and "the check's value moved" in out
    out_dir = tmp_path / "rep"
    assert run_cli("report", spec, "-o", out_dir)[0] == 0
    html = (out_dir / "index.html").read_text(encoding="utf-8")
    assert 'class="disposition stale">Accepted earlier, NOW STALE' in html and "1 stale" in html


def test_a_failing_check_cannot_be_accepted(tmp_path):
    # 400 N*m: dp = 2*pi*400 / (100 cm^3 * 0.9) = 279.3 bar, inlet 284.3 bar above the 250 bar relief
    spec, _ = _warning_spec(tmp_path, "400 N*m")
    code, _, err = run_cli("review", spec, *ACCEPT)
    assert code == 2 and "a failing check cannot be accepted" in err
    assert len(err.strip().splitlines()) == 1 and not reviews_path(spec).exists()


@pytest.mark.parametrize("args, message", [
    (("--accept-warning", "max_speed", "--reason", "x"), "passes there: there is no warning to accept"),
    (("--accept-warning", "no_such_check", "--reason", "x"), "no check 'no_such_check'"),
    (("--accept-warning", "pressure_margin", "--reason", " "), "--reason: give one line"),
    (("--accept-warning", "pressure_margin", "--where", "drive crane", "--reason", "x"), "does not apply at"),
    (("--accept-warning", "pressure_margin", "--verdict", "approved", "--reason", "x"), "not both"),
])
def test_bad_acceptances_exit_2_and_write_nothing(tmp_path, args, message):
    spec, _ = _warning_spec(tmp_path)
    code, _, err = run_cli("review", spec, "--by", "A", "--role", "x", *args)
    assert code == 2 and message in err and not reviews_path(spec).exists()


def test_acceptances_do_not_count_as_reviews_and_old_records_stay_valid(tmp_path):
    spec, _ = _warning_spec(tmp_path)
    assert run_cli("review", spec, *REVIEW)[0] == 0  # a record in the old form, no warning key
    before = reviews_path(spec).read_bytes()
    assert b"warning" not in before
    assert run_cli("review", spec, *ACCEPT)[0] == 0
    assert reviews_path(spec).read_bytes().startswith(before)
    code, out, _ = run_cli("check", "--require-review", spec)
    assert code == 0 and "Review: reviewed: approved by A. Checker" in out
    assert [r["verdict"] for r in reviews_for_report(spec, load_file(spec))] == ["approved"]
