"""Check results as JUnit XML, so a CI test-report page lists every check of every spec.

Shape: ``<testsuites>`` holding one ``<testsuite>`` per spec (name: the spec file; its machine id,
title, revision and verdict as properties) with one ``<testcase>`` per check (classname: the
machine id and the check id; name: the check id and where it applies). A failing check carries a
``<failure>`` with the check's message; a warning carries the property ``status=warn`` and its
message in ``<system-out>``; every testcase carries its status, value and limit as properties.
The caution line is the suite's ``<system-err>`` so it is never lost.

Built with the standard library's xml.etree, which escapes ``& < > "``; text from the spec is made
printable first (``safe_text.escape``) because XML 1.0 cannot hold control characters at all.
"""

from __future__ import annotations

import xml.etree.ElementTree as ET

from specgen.cautions import SHORT
from specgen.pipeline import Outcome
from specgen.units import format_si
from specgen.safe_text import escape


def _props(parent: ET.Element, items: dict) -> None:
    props = ET.SubElement(parent, "properties")
    for name, value in items.items():
        ET.SubElement(props, "property", name=name, value=escape(value))


def suite(o: Outcome) -> ET.Element:
    """One spec's checks as a testsuite element."""
    checks = o.results.checks
    counts = o.results.counts()
    system = o.machine.display_units
    s = ET.Element("testsuite", name=escape(o.source.name), tests=str(len(checks)),
                   failures=str(counts["fail"]), errors="0", skipped="0")
    _props(s, {"machine": o.machine.id, "title": o.machine.title, "revision": o.machine.revision,
               "verdict": o.results.verdict, "warnings": counts["warn"]})
    for c in checks:
        name = c.name
        case = ET.SubElement(s, "testcase", classname=escape(f"{o.machine.id}.{c.id}"), name=escape(name))
        shown = {"status": c.status}
        if c.value is not None:
            shown["value"] = format_si(c.value, c.kind, system) if c.kind else f"{c.value:g}"
        if c.limit is not None:
            shown["limit"] = format_si(c.limit, c.kind, system) if c.kind else f"{c.limit:g}"
        _props(case, shown)
        if c.status == "fail":
            f = ET.SubElement(case, "failure", message=escape(c.message), type="fail")
            f.text = escape(c.message)
        elif c.status == "warn":
            ET.SubElement(case, "system-out").text = "warning: " + escape(c.message)
    ET.SubElement(s, "system-err").text = SHORT
    return s


def render(outcomes: list[Outcome]) -> str:
    root = ET.Element("testsuites", name="specgen check")
    from specgen.variants import views

    for o in outcomes:
        root.append(suite(o))
        for view in views(o):  # each design variant as a suite of its own, named spec.yaml#id
            root.append(suite(view))
    ET.indent(root)
    return '<?xml version="1.0" encoding="utf-8"?>\n' + ET.tostring(root, encoding="unicode") + "\n"
