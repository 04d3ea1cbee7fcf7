"""JUnit XML for CI test-report pages (present/junit.py): one testsuite per spec, one testcase
per check, a failure element for each failing check. Parsed back with xml.etree to prove it is
well-formed XML."""

import json
import xml.etree.ElementTree as ET

from helpers import EXAMPLE, ROOT, minimal, run_cli, write_spec
from specgen.present import junit


def test_every_check_is_a_testcase_and_warnings_say_so():
    code, out, _ = run_cli("check", "--format", "junit", EXAMPLE, ROOT / "example_specs" / "log_deck.yaml")
    assert code == 0
    root = ET.fromstring(out.encode("utf-8"))
    suites = root.findall("testsuite")
    # each design variant of the harvester is a suite of its own, after the base design
    assert [s.get("name") for s in suites] == [str(EXAMPLE)] + [
        f"{EXAMPLE}#{v}" for v in ("larger_reel", "winch_gear_25", "bigger_aux")] + [
        str(ROOT / "example_specs" / "log_deck.yaml")]
    harvester = suites[0]
    cases = harvester.findall("testcase")
    # the same counts as the JSON output of the same spec
    _, doc, _ = run_cli("check", "--format", "json", EXAMPLE)
    statuses = [c["status"] for c in json.loads(doc)["checks"]]
    assert harvester.get("tests") == str(len(cases)) == str(len(statuses))
    assert harvester.get("failures") == "0" and "fail" not in statuses
    warned = [c for c in cases if c.find("properties/property[@name='status']").get("value") == "warn"]
    assert len(warned) == statuses.count("warn") >= 1
    assert any("[at corner " in c.get("name") for c in warned)  # a warning found at a corner says which
    assert all(c.find("system-out").text.startswith("warning: ") for c in warned)
    assert harvester.find("system-err").text.startswith("Design aid only")


def test_a_failing_check_carries_a_failure(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "600 N*m"  # about 419 bar on a 250 bar relief
    code, out, _ = run_cli("check", "--format", "junit", write_spec(tmp_path, d))
    assert code == 1
    suite = ET.fromstring(out.encode("utf-8")).find("testsuite")
    failed = [c for c in suite.findall("testcase") if c.find("failure") is not None]
    assert failed and suite.get("failures") == str(len(failed))
    assert all(c.find("failure").get("message") for c in failed)


def test_markup_and_control_characters_from_the_spec_stay_text():
    class C:
        id, status, value, limit, kind = "x", "fail", None, None, ""
        where = "drive <a>&\"b\""
        name = "x (drive <a>&\"b\")"
        message = "bad \x07 ]]> <tag>"

    class R:
        checks = (C(),)
        verdict = "fail"

        def counts(self):
            return {"pass": 0, "warn": 0, "fail": 1}

    class M:
        id, title, revision, display_units = "m", "T & <T>", "A", "SI"

    class S:
        name = "s.yaml"

    class O:
        results, machine, source = R(), M(), S()

    text = junit.render([O()])
    root = ET.fromstring(text.encode("utf-8"))  # well-formed despite the bell character and markup
    case = root.find("testsuite/testcase")
    assert case.get("name") == 'x (drive <a>&"b")'
    assert case.find("failure").text == "bad \\x07 ]]> <tag>"
