"""The revision diff as a markdown pull-request comment, cut to fit one.

Renders the view ``diff_out.view`` builds (the same sections as text and HTML). Every cell is
escaped (``_md_cell``) so spec text cannot break a table or inject markup, mentions or links. A
comment holds 65,536 characters on the common hosting sites; ``render`` keeps to ``MAX_CHARS`` by
keeping whole rows in the order of ``CUT_PRIORITY`` (failures and regressions first) and saying
how many rows of each table are left out, pointing at the full diff.
"""

from __future__ import annotations

import re

from specgen.safe_text import escape

MAX_CHARS = 60_000  # a pull-request comment holds 65,536; room for a heading around each diff


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


def _md_row(r: dict) -> str:
    cells = [_md_cell(c) for c in r["cells"]]
    if r["cls"] in ("fail", "warn"):
        cells[0] = f"**{cells[0]}**"
    return "| " + " | ".join(cells) + " |"


def _markdown(v: dict, keep: dict | None = None) -> str:
    """The markdown comment; ``keep``: rows to show per section id (None: all), plus "said"."""
    def kept(key, items):
        return items if keep is None else items[:keep.get(key, 0)]

    out = [f"### {_md_cell(v['title'])}", "", f"- before: {_md_cell(v['before'])}", f"- now: {_md_cell(v['now'])}",
           "", f"**{_md_cell(v['summary'])}**"]
    out += ["", f"**Note:** {_md_cell(v['revision'])}"] if v["revision"] else []
    out += ["", f"_{_md_cell(v['cut'])}_"] if keep is not None and v["cut"] else []
    for s in v["sections"]:
        if not s["rows"] and s["id"] in ("margins", "still-failing"):
            continue
        out += ["", f"#### {s['title']}", ""]
        if not s["rows"]:
            out += [s["empty"]] + (["", _md_cell(s["note"])] if s["note"] else [])
            continue
        rows = kept(s["id"], s["rows"])
        if rows:
            out.append("| " + " | ".join(s["header"]) + " |")
            out.append("|" + "|".join("---" for _ in s["header"]) + "|")
            out += [_md_row(r) for r in rows]
        if len(rows) < len(s["rows"]):
            left = len(s["rows"]) - len(rows)
            out += ([""] if rows else []) + [f"_{left} more row{'s' if left != 1 else ''} not shown here: "
                                             "see the full diff._"]
        out += ["", _md_cell(s["note"])] if s["note"] else []
        said = kept("said", v["said"]) if s["id"] == "checks" else []
        if said:
            out += ["", "What the checks that got worse say now:", ""] + [f"- {_md_cell(x)}" for x in said]
    if v["respelled"]:
        if keep is None:
            out += ["", f"Same value written differently (within {v['tolerance']}), not a change: "
                    + "; ".join(_md_cell(x) for x in v["respelled"])]
        else:
            out += ["", f"{len(v['respelled'])} values written differently (within {v['tolerance']}), "
                    "not a change: see the full diff."]
    out += ["", f"_{_md_cell(v['caution'])}_"]
    return "\n".join(out) + "\n"


# Which rows a cut comment keeps first: status changes (regressions lead them, worst first) with
# what they say, the checks still failing, the inputs that changed, then the values that moved.
CUT_PRIORITY = ("checks", "still-failing", "inputs", "margins", "results")


def render(v: dict, max_chars: int | None = MAX_CHARS) -> str:
    """The diff as a pull-request comment of at most ``max_chars`` characters (None or 0: no limit).

    A longer diff keeps its heading, summary and caution, and rows by ``CUT_PRIORITY`` while they
    fit; whole rows only, so no table or list is broken. A note under the summary says it was cut.
    """
    full = _markdown(v)
    if not max_chars or len(full) <= max_chars:
        return full
    v["cut"] = (f"This diff is {len(full):,} characters; a comment holds {max_chars:,}. Shown: the summary, "
                "then rows by weight (failures and regressions first). The full diff is in the run's artefact "
                "(specgen diff OLD NEW --format markdown --max-chars 0).")
    sections = {s["id"]: s for s in v["sections"]}
    cost = {sid: [len(_md_row(r)) + 1 for r in sec["rows"]] for sid, sec in sections.items()}
    said_cost = [len(_md_cell(x)) + 3 for x in v["said"]]
    budget = max_chars - len(_markdown(v, keep={})) - 400  # room for the tables' headers and notes
    while True:
        keep, left = {"said": 0}, budget
        for sid in CUT_PRIORITY:
            n = 0
            for i, c in enumerate(cost.get(sid, [])):
                extra = said_cost[i] if sid == "checks" and i < len(said_cost) else 0
                if c + extra > left:
                    break
                left -= c + extra
                n += 1
            keep[sid] = n
            if sid == "checks":
                keep["said"] = min(n, len(v["said"]))
        text = _markdown(v, keep)
        if len(text) <= max_chars or budget <= 0:
            return text
        budget -= len(text) - max_chars + 200
