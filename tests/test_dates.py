"""One date rule for every command that takes --date (specgen/dates.py).

Source: ISO 8601-1:2019 calendar dates, extended form YYYY-MM-DD and basic form YYYYMMDD; the
Gregorian calendar's leap years (2024 is one, 2025 and 1900 are not; 2000 is). SOURCE_DATE_EPOCH
is the reproducible-builds convention: whole seconds since 1970-01-01T00:00:00Z.
"""

from __future__ import annotations

import pytest

from helpers import minimal, run_cli, write_spec
from specgen.dates import NOT_A_DATE, date_or_today, epoch_date, given_date, parse_date
from specgen.errors import SpecError
from specgen.review import reviews_path

GOOD = [("2025-03-14", "2025-03-14"), ("20250314", "2025-03-14"), ("2024-02-29", "2024-02-29"),
        ("20000229", "2000-02-29"), (" 2025-03-14 ", "2025-03-14")]
BAD = ["2025-02-29", "19000229", "2025-13-01", "2025-00-10", "2025-03-32", "14/03/2025", "2025-3-14", "2025/03/14",
       "2025-W11-5", "2025-073", "2025-03-14T10:00", "250314", "2025-0314", "yesterday", "２０２５-03-14"]


@pytest.mark.parametrize("text, iso", GOOD)
def test_calendar_dates_in_either_form_are_written_extended(text, iso):
    assert parse_date(text) == iso


@pytest.mark.parametrize("text", BAD)
def test_other_spellings_and_impossible_days_are_refused_with_one_message(text):
    with pytest.raises(SpecError) as exc:
        parse_date(text)
    (problem,) = exc.value.problems
    assert str(problem) == f"--date: {NOT_A_DATE.format(text=text)}"


def test_source_date_epoch_is_a_utc_day():
    assert epoch_date("1700000000") == "2023-11-14"  # 2023-11-14T22:13:20Z (1700000000 / 86400 = 19675.9 days)
    assert epoch_date("0") == "1970-01-01"
    assert epoch_date("86399\n") == "1970-01-01" and epoch_date("86400") == "1970-01-02"
    for bad in ("yesterday", "1.5e9", ""):
        with pytest.raises(SpecError, match="SOURCE_DATE_EPOCH"):
            epoch_date(bad)


def test_option_wins_over_the_environment_and_only_review_falls_back_on_today():
    env = {"SOURCE_DATE_EPOCH": "1700000000"}
    assert given_date("20250131", env) == "2025-01-31"
    assert given_date(None, env) == "2023-11-14"
    assert given_date(None, {}) is None  # a report without a date prints none
    import datetime

    assert date_or_today(None, {}) == datetime.date.today().isoformat()


def _report(tmp_path, spec, date):
    out = tmp_path / f"report-{abs(hash(date))}"
    code, _, err = run_cli("report", spec, "-o", out, "--date", date)
    page = (out / "index.html").read_text() if out.exists() else ""
    return code, err, page


def _review(spec, date):
    code, _, err = run_cli("review", spec, "--by", "A. Checker", "--role", "checking engineer",
                           "--verdict", "approved", "--date", date)
    return code, err


@pytest.mark.parametrize("text, iso", [("2025-03-14", "2025-03-14"), ("20250314", "2025-03-14")])
def test_report_and_review_accept_the_same_dates(tmp_path, monkeypatch, text, iso):
    monkeypatch.delenv("SOURCE_DATE_EPOCH", raising=False)
    spec = write_spec(tmp_path, minimal())
    code, err, page = _report(tmp_path, spec, text)
    assert code == 0, err
    assert f'Report date</th><td>{iso}</td>' in page
    code, err = _review(spec, text)
    assert code == 0, err
    assert f"date: '{iso}'" in reviews_path(spec).read_text()


@pytest.mark.parametrize("text", ["2025-02-29", "14/03/2025", "2025-W11-5", "2025-073"])
def test_report_and_review_refuse_the_same_dates_with_the_same_line(tmp_path, monkeypatch, text):
    monkeypatch.delenv("SOURCE_DATE_EPOCH", raising=False)
    spec = write_spec(tmp_path, minimal())
    report_code, report_err, _ = _report(tmp_path, spec, text)
    review_code, review_err = _review(spec, text)
    assert report_code == review_code == 2
    assert report_err == review_err == f"error: --date: {NOT_A_DATE.format(text=text)}\n"
    assert not reviews_path(spec).exists()
