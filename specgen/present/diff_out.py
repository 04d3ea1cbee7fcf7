"""Show a revision diff: terminal text, a markdown review comment, JSON, or a static HTML page.

Text, markdown and HTML render one view (``view``): the same sections, headers and cells, so they
cannot disagree; JSON (``document``) carries the same facts as numbers, described by
schemas/diff-output.schema.json. Every value is shown in the new spec's display units.
Checks failing unchanged on both sides are listed too, and the caution line closes every format.
"""

from __future__ import annotations

import json
import re

from specgen import __version__
from specgen.cautions import SHORT
from specgen.diff import INPUT_TOLERANCE, RESULT_TOLERANCE, Diff, InputChange, Side
from specgen.present.text import table
from specgen.present.values import convert, format_si, significant
from specgen.safe_text import escape
from specgen.units import KINDS

DIFF_FORMAT = 1
FORMATS = ("text", "markdown", "json", "html")
TEMPLATE = "diff.html.j2"
CHECK_HEADER = ["status", "check", "where", "value before", "value now", "limit"]
RESULT_HEADER = ["where", "quantity", "before", "now", "change", "%"]
INPUT_HEADER = ["change", "field", "before", "now", "difference"]


def _quantity(x: float | None, kind: str, system: str) -> dict | None:
    if x is None:
        return None
    if not kind:
        return {"value": x, "unit": "", "si_value": x}
    number, unit = convert(x, kind, system)
    return {"value": number, "unit": unit, "si_value": x}


def _delta(old: float | None, new: float | None, kind: str, system: str) -> dict | None:
    """new - old in display units; offsets (degC) cancel because both ends are converted."""
    if old is None or new is None or not kind:
        return None
    (a, unit), (b, _) = convert(old, kind, system), convert(new, kind, system)
    return {"value": b - a, "unit": unit}


def _signed(d: dict | None) -> str:
    if d is None:
        return "-"
    text = significant(float(f"{d['value']:.12g}"))  # 9.9999999999 bar of float noise shows as 10.00
    return f"{'+' if d['value'] > 0 else ''}{text} {d['unit']}".strip()


def _shown(x: float | None, kind: str, system: str) -> str:
    if x is None:
        return "-"
    return format_si(x, kind, system) if kind else significant(x)


def _raw(value) -> str:
    if value is None:
        return "-"
    text = value if isinstance(value, str) else json.dumps(value, ensure_ascii=False, sort_keys=False)
    text = " ".join(str(text).split())
    return text if len(text) <= 80 else text[:77] + "..."


def _where(first: dict) -> dict:
    return {k: first.get(k) for k in ("drive", "duty", "supply", "mode")}


def _side(s: Side) -> dict:
    return {"source": s.name, "machine": {"id": s.machine_id, "title": s.title, "revision": s.revision},
            "verdict": s.verdict, "counts": s.counts}


def document(d: Diff) -> dict:
    """The diff as plain JSON data (schemas/diff-output.schema.json)."""
    system = d.display_units
    checks = lambda items: [  # noqa: E731 - one shape for both lists below
        {"id": c.id, "title": c.title, "where": _where(c.where), "change": c.change,
         "old_status": c.old_status, "new_status": c.new_status, "regression": c.regression,
         "old_value": _quantity(c.old_value, c.kind, system), "new_value": _quantity(c.new_value, c.kind, system),
         "limit": _quantity(c.limit, c.kind, system), "message": c.message}
        for c in items]
    regressions = d.regressions("warn")
    return {
        "specgen": __version__,
        "diff_format": DIFF_FORMAT,
        "old": _side(d.old),
        "new": _side(d.new),
        "display_units": system,
        "tolerance": {"input_relative": INPUT_TOLERANCE, "result_relative": RESULT_TOLERANCE},
        "summary": {
            "regressions": len(regressions),
            "to_fail": sum(c.regression == "fail" for c in regressions),
            "to_warn": sum(c.regression == "warn" for c in regressions),
            "checks_changed": len(d.checks),
            "results_changed": len(d.values) + len(d.owners),
            "inputs_changed": len(d.input_changes),
        },
        "checks": checks(d.checks),
        "still_failing": checks(d.still_failing),
        "results": {
            "items": [{"scope": o.scope, "where": _where(o.where()), "change": ch} for o, ch in d.owners],
            "values": [
                {"scope": v.owner.scope, "where": _where(v.owner.where()), "key": v.key, "label": v.label,
                 "kind": v.kind, "change": v.change, "old": _quantity(v.old, v.kind, system),
                 "new": _quantity(v.new, v.kind, system), "delta": _delta(v.old, v.new, v.kind, system),
                 "percent": v.percent}
                for v in d.values],
        },
        "inputs": [
            {"path": c.dotted, "change": c.change, "noun": c.noun, "kind": c.kind if c.kind in KINDS else None,
             "old": c.old, "new": c.new, "old_si": c.old_si, "new_si": c.new_si}
            for c in d.inputs],
        "caution": SHORT,
    }


def _input_row(c: InputChange, system: str) -> dict:
    if c.noun and c.change in ("added", "removed"):
        field = f"{c.noun} '{c.path[-1]}' ({c.dotted})"
    else:
        field = c.dotted
    if c.kind and c.old_si is not None and c.new_si is not None:
        diff = _signed(_delta(c.old_si, c.new_si, c.kind, system))
    else:
        diff = ""
    def shown(v):
        return "-" if v is None or (c.noun and c.change in ("added", "removed")) else _raw(v)

    return {"cells": [c.change, field, shown(c.old), shown(c.new), diff], "cls": c.change}


def _summary(d: Diff) -> str:
    r = d.regressions("warn")
    if not r:
        return "No check got worse."
    to_fail = sum(c.regression == "fail" for c in r)
    return (f"{len(r)} check{'s' if len(r) != 1 else ''} got worse: {to_fail} now fail, "
            f"{len(r) - to_fail} now warn.")


def view(d: Diff) -> dict:
    """Sections with headers and cells, shared by the text, markdown and HTML renderers."""
    system = d.display_units

    def check_row(c):
        status = {"added": f"new: {c.new_status}", "removed": f"{c.old_status}: removed",
                  "moved": c.new_status, "unchanged": c.new_status}.get(c.change, f"{c.old_status} -> {c.new_status}")
        return {"cells": [status, c.id, c.where_text or "-", _shown(c.old_value, c.kind, system),
                          _shown(c.new_value, c.kind, system), _shown(c.limit, c.kind, system)],
                "cls": c.regression or ("better" if c.change == "better" else c.change),
                "message": c.message}

    # A check that appears or disappears (an item or a kind of check added or removed) is news only
    # at warn or fail; the passing ones are counted in a note so a renamed drive does not bury the
    # regressions. JSON lists them all.
    quiet = [c for c in d.checks if c.change in ("added", "removed") and (c.new_status or c.old_status) == "pass"]
    status_changes = [c for c in d.checks if c.change != "moved" and c not in quiet]
    moved = [c for c in d.checks if c.change == "moved"]
    came = sum(c.change == "added" for c in quiet)
    went = len(quiet) - came
    sections = [
        {"id": "checks", "title": "Checks whose status changed (regressions first)", "header": CHECK_HEADER,
         "rows": [check_row(c) for c in status_changes], "empty": "No check changed its status.",
         "note": (f"Not listed: {came} new check{'s' if came != 1 else ''} that pass{'es' if came == 1 else ''} "
                  f"and {went} passing check{'s' if went != 1 else ''} now gone (items or kinds of check "
                  "added or removed)." if quiet else "")},
        {"id": "margins", "title": "Check values that moved (status unchanged)", "header": CHECK_HEADER,
         "rows": [check_row(c) for c in moved], "empty": "No check value moved."},
        {"id": "still-failing", "title": "Still failing (unchanged)", "header": CHECK_HEADER,
         "rows": [check_row(c) for c in d.still_failing], "empty": "No check fails in both revisions."},
        {"id": "results", "title": f"Results changed (beyond {RESULT_TOLERANCE:.2%})", "header": RESULT_HEADER,
         "rows": [{"cells": [o.text, f"{ch} {o.scope.replace('_', ' ')}", "-", "-", ch, "-"], "cls": ch}
                  for o, ch in d.owners]
         + [{"cells": [v.owner.text, v.label, _shown(v.old, v.kind, system), _shown(v.new, v.kind, system),
                       _signed(_delta(v.old, v.new, v.kind, system)) if v.change == "changed" else v.change,
                       f"{v.percent:+.2f} %" if v.percent is not None else "-"], "cls": v.change}
            for v in d.values],
         "empty": "No computed value moved."},
        {"id": "inputs", "title": "Inputs changed (compared by physical value)", "header": INPUT_HEADER,
         "rows": [_input_row(c, system) for c in d.input_changes], "empty": "No input changed."},
    ]
    for sec in sections:
        sec.setdefault("note", "")
        for row in sec["rows"]:
            row.setdefault("message", "")
    said = [f"{c.id}, {c.where_text}: {c.message}" if c.where_text else f"{c.id}: {c.message}"
            for c in d.regressions("warn")]
    respelled = [f"{c.dotted}: '{_raw(c.old)}' -> '{_raw(c.new)}'" for c in d.respelled]
    side = lambda s: f"{s.name}: {s.title} rev {s.revision}, {s.verdict.upper()} ({s.counts['pass']} pass, {s.counts['warn']} warn, {s.counts['fail']} fail)"  # noqa: E731
    return {"title": f"specgen diff: {d.old.name} -> {d.new.name}", "before": side(d.old), "now": side(d.new),
            "summary": _summary(d), "regressed": bool(d.regressions("warn")), "sections": sections,
            "respelled": respelled, "said": said, "caution": SHORT, "units": system,
            "tolerance": f"{INPUT_TOLERANCE:.2%}"}


def render_text(d: Diff) -> str:
    v = view(d)
    out = [v["title"], f"  before: {v['before']}", f"  now:    {v['now']}", v["summary"]]
    for s in v["sections"]:
        if not s["rows"] and s["id"] in ("margins", "still-failing"):
            continue
        out += ["", s["title"]]
        out += table(s["header"], [r["cells"] for r in s["rows"]]) if s["rows"] else [f"  {s['empty']}"]
        out += [f"  {s['note']}"] if s["note"] else []
        if s["id"] == "checks" and v["said"]:
            out += ["", "What the checks that got worse say now:"] + [f"  {x}" for x in v["said"]]
    if v["respelled"]:
        out += ["", f"Same value written differently (within {v['tolerance']}), not a change:"]
        out += [f"  {x}" for x in v["respelled"]]
    out += ["", v["caution"]]
    return "\n".join(out) + "\n"


# Markdown a cell must not render from spec text: emphasis and strikethrough (* _ ~), code (`),
# links and images ([ ]), math ($), table pipes (|), HTML and autolinks (< &), and, on the
# site that shows the comment, @mentions, #123 references and bare URLs (a zero-width space, as an
# entity, splits them without changing what a reader sees).
_MD_ESCAPED = "\\`*_~[]$|"  # ( ) and ! form nothing once [ and ] are escaped
_ZWSP = "&#8203;"


def _md_cell(text: str) -> str:
    """Cell text that cannot break a GitHub table or inject markup, mentions or links."""
    text = " ".join(escape(" ".join(str(text).split())).split(" "))
    text = "".join("\\" + c if c in _MD_ESCAPED else c for c in text)
    text = text.replace("&", "&amp;").replace("<", "&lt;")
    text = re.sub(r"(?<!&)#(?=[0-9])", "#" + _ZWSP, text)
    text = re.sub(r"@(?=\w)", "@" + _ZWSP, text)
    text = re.sub(r"(?i)(?<=[a-z]):(?=//)", ":" + _ZWSP, text)
    text = re.sub(r"(?i)\b(www)\.", r"\1" + _ZWSP + ".", text)
    if text[:1] in ("#", ">", "-", "+", "="):
        text = "\\" + text  # a block marker where a line starts: heading, quote, list, rule
    text = re.sub(r"^([0-9]{1,9})([.)])(?= |$)", r"\1\\\2", text)  # an ordered list item
    return text


def render_markdown(d: Diff) -> str:
    v = view(d)
    out = [f"### {_md_cell(v['title'])}", "", f"- before: {_md_cell(v['before'])}", f"- now: {_md_cell(v['now'])}",
           "", f"**{_md_cell(v['summary'])}**"]
    for s in v["sections"]:
        if not s["rows"] and s["id"] in ("margins", "still-failing"):
            continue
        out += ["", f"#### {s['title']}", ""]
        if not s["rows"]:
            out += [s["empty"]] + (["", _md_cell(s["note"])] if s["note"] else [])
            continue
        out.append("| " + " | ".join(s["header"]) + " |")
        out.append("|" + "|".join("---" for _ in s["header"]) + "|")
        for r in s["rows"]:
            cells = [_md_cell(c) for c in r["cells"]]
            if r["cls"] in ("fail", "warn"):
                cells[0] = f"**{cells[0]}**"
            out.append("| " + " | ".join(cells) + " |")
        out += ["", _md_cell(s["note"])] if s["note"] else []
        if s["id"] == "checks" and v["said"]:
            out += ["", "What the checks that got worse say now:", ""] + [f"- {_md_cell(x)}" for x in v["said"]]
    if v["respelled"]:
        out += ["", f"Same value written differently (within {v['tolerance']}), not a change: "
                + "; ".join(_md_cell(x) for x in v["respelled"])]
    out += ["", f"_{_md_cell(v['caution'])}_"]
    return "\n".join(out) + "\n"


def render_json(d: Diff) -> str:
    return json.dumps(document(d), indent=2, ensure_ascii=False) + "\n"


def render_html(d: Diff) -> str:
    import jinja2

    from specgen.resources import data_dir

    env = jinja2.Environment(loader=jinja2.FileSystemLoader(str(data_dir("report_templates"))),
                             autoescape=True, undefined=jinja2.StrictUndefined, keep_trailing_newline=True,
                             trim_blocks=True, lstrip_blocks=True)
    return env.get_template(TEMPLATE).render(v=view(d), version=__version__)


RENDERERS = {"text": render_text, "markdown": render_markdown, "json": render_json, "html": render_html}


def render(d: Diff, fmt: str = "text") -> str:
    return RENDERERS[fmt](d)
