"""Show a revision diff: terminal text, a markdown review comment, JSON, or a static HTML page.

Text, markdown and HTML render one view (``view``): the same sections, headers and cells, so they
cannot disagree; JSON (``document``) carries the same facts as numbers, described by
schemas/diff-output.schema.json. Every value is shown in the new spec's display units.
Checks failing unchanged on both sides are listed too, and the caution line closes every format.
"""

from __future__ import annotations

import json

from specgen import __version__
from specgen.cautions import SHORT
from specgen.diff import INPUT_TOLERANCE, RESULT_TOLERANCE, CheckChange, Diff, InputChange, Side
from specgen.present import diff_markdown
from specgen.present.diff_markdown import MAX_CHARS
from specgen.present.text import table
from specgen.units import convert, format_si, significant
from specgen.units import KINDS

DIFF_FORMAT = 1
FORMATS = ("text", "markdown", "json", "html")
TEMPLATE = "diff.html.j2"
CHECK_HEADER = ["status", "check", "where", "value before", "value now", "limit"]
RESULT_HEADER = ["where", "quantity", "before", "now", "change", "%"]
INPUT_HEADER = ["change", "field", "before", "now", "difference"]
ITEM_LIMIT = 240  # characters of an added or removed item's values in one cell


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
    out = {k: first.get(k) for k in ("drive", "duty", "supply", "mode")}
    if first.get("prime_mover"):  # only where a shared prime mover is judged: other diffs keep their shape
        out["prime_mover"] = first["prime_mover"]
    return out


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
            "revision_unchanged": revision_unchanged(d),
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


def revision_unchanged(d: Diff) -> bool:
    """The content changed but ``machine.revision`` did not: two different specs share one name."""
    return bool(d.input_changes) and d.old.revision == d.new.revision


def _flat(value, prefix: str = "") -> list[str]:
    """An added or removed item's values as ``key value`` pairs, nested keys dotted."""
    if isinstance(value, dict):
        out = []
        for k, v in value.items():
            out += _flat(v, f"{prefix}{k}.")
        return out
    if isinstance(value, list):
        return [f"{prefix[:-1]} {_raw(value)}"]
    return [f"{prefix[:-1]} {value}" if prefix else str(value)]


def _item_values(value) -> str:
    text = "; ".join(_flat(value))
    text = " ".join(text.split())
    return text if len(text) <= ITEM_LIMIT else text[:ITEM_LIMIT - 3] + "..."


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
        if v is None:
            return "-"
        return _item_values(v) if c.noun and c.change in ("added", "removed") else _raw(v)

    return {"cells": [c.change, field, shown(c.old), shown(c.new), diff], "cls": c.change}


def _summary(d: Diff) -> str:
    r = d.regressions("warn")
    if not r:
        return "No check got worse."
    to_fail = sum(c.regression == "fail" for c in r)
    return (f"{len(r)} check{'s' if len(r) != 1 else ''} got worse: {to_fail} now fail, "
            f"{len(r) - to_fail} now warn.")


def _span(texts: list[str]) -> str:
    """One cell for the values of a group: the value when all agree, else each distinct one."""
    distinct = list(dict.fromkeys(texts))
    if len(distinct) <= 3:
        return ", ".join(distinct)
    return f"{distinct[0]} ... {distinct[-1]} ({len(distinct)} values)"


def grouped(changes) -> list[list[CheckChange]]:
    """Check changes that share a cause: same check id, same place but the mode, same status change.

    A relief setting lowered on a supply that runs in six modes regresses its check in all six;
    that is one line naming the six modes, not six lines. Order: each group where its first member
    stood (regressions first, worst first, as ``diff_checks`` sorts them).
    """
    groups: dict[tuple, list] = {}
    for c in changes:
        place = tuple((k, v) for k, v in c.where.items() if k != "mode")
        key = (c.id, place, c.change, c.old_status, c.new_status, c.where.get("mode") is None)
        if c.where.get("mode") is None:
            key += (id(c),)  # nothing to gather: each stands alone
        groups.setdefault(key, []).append(c)
    return list(groups.values())


def _group_where(g: list[CheckChange]) -> str:
    first = g[0]
    if len(g) == 1:
        return first.where_text or "-"
    names = {"drive": "drive", "duty": "duty point", "supply": "supply", "prime_mover": "prime mover"}
    place = ", ".join(f"{names[k]} {v}" for k, v in first.where.items() if v and k != "mode")
    modes = f"{len(g)} modes: " + ", ".join(str(c.where.get("mode")) for c in g)
    return f"{place}, {modes}" if place else modes


def view(d: Diff) -> dict:
    """Sections with headers and cells, shared by the text, markdown and HTML renderers.

    The cause leads: the inputs that changed, then the checks whose status changed (grouped by
    ``grouped``), then the check values and results that moved.
    """
    system = d.display_units

    def check_row(g):
        c = g[0]
        status = {"added": f"new: {c.new_status}", "removed": f"{c.old_status}: removed",
                  "moved": c.new_status, "unchanged": c.new_status}.get(c.change, f"{c.old_status} -> {c.new_status}")
        return {"cells": [status, c.id, _group_where(g),
                          _span([_shown(x.old_value, x.kind, system) for x in g]),
                          _span([_shown(x.new_value, x.kind, system) for x in g]),
                          _span([_shown(x.limit, x.kind, system) for x in g])],
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
        {"id": "inputs", "title": "Inputs changed (compared by physical value)", "header": INPUT_HEADER,
         "rows": [_input_row(c, system) for c in d.input_changes], "empty": "No input changed."},
        {"id": "checks", "title": "Checks whose status changed (regressions first)", "header": CHECK_HEADER,
         "rows": [check_row(g) for g in grouped(status_changes)], "empty": "No check changed its status.",
         "note": (f"Not listed: {came} new check{'s' if came != 1 else ''} that pass{'es' if came == 1 else ''} "
                  f"and {went} passing check{'s' if went != 1 else ''} now gone (items or kinds of check "
                  "added or removed)." if quiet else "")},
        {"id": "margins", "title": "Check values that moved (status unchanged)", "header": CHECK_HEADER,
         "rows": [check_row(g) for g in grouped(moved)], "empty": "No check value moved."},
        {"id": "still-failing", "title": "Still failing (unchanged)", "header": CHECK_HEADER,
         "rows": [check_row(g) for g in grouped(d.still_failing)], "empty": "No check fails in both revisions."},
        {"id": "results", "title": f"Results changed (beyond {RESULT_TOLERANCE:.2%})", "header": RESULT_HEADER,
         "rows": [{"cells": [o.text, f"{ch} {o.scope.replace('_', ' ')}", "-", "-", ch, "-"], "cls": ch}
                  for o, ch in d.owners]
         + [{"cells": [v.owner.text, v.label, _shown(v.old, v.kind, system), _shown(v.new, v.kind, system),
                       _signed(_delta(v.old, v.new, v.kind, system)) if v.change == "changed" else v.change,
                       f"{v.percent:+.2f} %" if v.percent is not None else "-"], "cls": v.change}
            for v in d.values],
         "empty": "No computed value moved."},
    ]
    for sec in sections:
        sec.setdefault("note", "")
        for row in sec["rows"]:
            row.setdefault("message", "")
    said = []
    for g in grouped(d.regressions("warn")):
        where = _group_where(g)
        said.append(f"{g[0].id}, {where}: {g[0].message}" if where != "-" else f"{g[0].id}: {g[0].message}")
    respelled = [f"{c.dotted}: '{_raw(c.old)}' -> '{_raw(c.new)}'" for c in d.respelled]
    side = lambda s: f"{s.name}: {s.title} rev {s.revision}, {s.verdict.upper()} ({s.counts['pass']} pass, {s.counts['warn']} warn, {s.counts['fail']} fail)"  # noqa: E731
    revision = (f"The content changed but machine.revision is still '{d.new.revision}': give this revision "
                "its own name so reports and reviews can tell the two apart." if revision_unchanged(d) else "")
    return {"title": f"specgen diff: {d.old.name} -> {d.new.name}", "before": side(d.old), "now": side(d.new),
            "summary": _summary(d), "regressed": bool(d.regressions("warn")), "sections": sections,
            "respelled": respelled, "said": said, "caution": SHORT, "units": system,
            "tolerance": f"{INPUT_TOLERANCE:.2%}", "revision": revision, "cut": ""}


def render_text(d: Diff) -> str:
    v = view(d)
    out = [v["title"], f"  before: {v['before']}", f"  now:    {v['now']}", v["summary"]]
    out += [f"Note: {v['revision']}"] if v["revision"] else []
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


def render_markdown(d: Diff, max_chars: int | None = MAX_CHARS) -> str:
    """The diff as a pull-request comment of at most ``max_chars`` characters (None or 0: no limit);
    see ``diff_markdown.render``."""
    return diff_markdown.render(view(d), max_chars)


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


def render(d: Diff, fmt: str = "text", max_chars: int | None = MAX_CHARS) -> str:
    """``max_chars`` bounds the markdown comment only; the other formats are always whole."""
    return render_markdown(d, max_chars) if fmt == "markdown" else RENDERERS[fmt](d)
