"""Accepted warnings against the current checks: held while the content and the value are those
accepted, stale (and saying why) when either moved; never for a check that no longer warns."""

from __future__ import annotations

from specgen.dispositions import dispositions
from specgen.results import Check
from specgen.review import Review


def _record(value, fingerprint="a" * 64, where="drive hoist, duty point lift"):
    return Review("A. Checker", "checking engineer", "2025-03-14", "accepted_warning", fingerprint, "A", "",
                  {"check": "pressure_margin", "where": where, "value": value, "reason": "short lift"})


def _check(value, status="warn"):
    return Check("pressure_margin", "Pressure margin to relief", status, value, 0.1, "ratio", "m",
                 drive="hoist", duty="lift", margin=value)


def test_an_acceptance_holds_while_content_and_value_are_unchanged():
    (d,) = dispositions([_record(0.0808)], "a" * 64, [_check(0.0808)])
    assert d.stale == "" and d.as_dict()["accepted"] and "accepted by A. Checker" in d.text


def test_stale_when_the_content_or_the_value_moved():
    (d,) = dispositions([_record(0.0808)], "b" * 64, [_check(0.0808)])
    assert "content changed" in d.stale and "value moved" not in d.stale and "STALE" in d.text
    (d,) = dispositions([_record(0.0808)], "a" * 64, [_check(0.0700)])
    assert d.stale == "the check's value moved"
    # a difference in the last of 16 digits is the same value (relative tolerance 1e-9)
    assert dispositions([_record(0.0808)], "a" * 64, [_check(0.0808 * (1 + 1e-12))])[0].stale == ""


def test_nothing_to_show_for_a_check_that_passes_now_or_applies_elsewhere():
    assert dispositions([_record(0.0808)], "a" * 64, [_check(0.2, "pass")]) == []
    assert dispositions([_record(0.0808, where="drive crane, duty point lift")], "a" * 64, [_check(0.0808)]) == []


def test_the_latest_acceptance_of_a_warning_counts():
    older, newer = _record(0.05, "c" * 64), _record(0.0808)
    (d,) = dispositions([older, newer], "a" * 64, [_check(0.0808)])
    assert d.fingerprint == "a" * 64 and d.stale == ""
