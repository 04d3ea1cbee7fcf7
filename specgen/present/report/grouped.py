"""A calculation trace of several cases at once: each relation stated once, its values in one column a case.

The modes of a supply, the duty points of a drive and the modes of the machine run the same
relations with other numbers. Printed one trace a case, the same relation, words and source repeat
on page after page; grouped, a row holds the quantity, its relation and source once, and one result
a case (a result the same in every case is written once across the columns). The inputs of each
relation are rows of the same table or values entered in the spec, so every number stays traceable.

Example: the main supply in six modes is one table of 14 rows and six value columns, where the
single-mode traces were six tables of 14 rows each.
"""

from __future__ import annotations

from dataclasses import dataclass

from specgen.present.report.values import show, trace_row, typeset
from specgen.trace import Value


@dataclass
class Case:
    """One column of a grouped trace: a mode or a duty point, with its anchor and its values."""

    name: str
    anchor: str
    values: dict[str, Value]
    title: str = ""


def _cell(v: Value, system: str) -> str:
    return show(v.value, v.kind, system, v.symbol, v.label)


def _common_unit(cells: list[dict | None]) -> str:
    """The unit every filled cell ends with ("L/min" of "67.67 L/min"), or "" when they differ."""
    units = {c["text"].rsplit(" ", 1)[1] if " " in c["text"] else "" for c in cells if c}
    return units.pop() if len(units) == 1 else ""


def grouped(anchor: str, title: str, cases: list[Case], system: str, checks: list[dict],
            whole: dict[str, Value] | None = None) -> dict:
    """The grouped trace of ``cases``: rows by (quantity, relation) in first-seen order.

    A quantity whose relation differs between cases (another branch of the model) gets one row a
    relation, with its cells left blank in the cases that use the other. ``whole``: values of the
    drive or supply as a whole (one for all cases), set first, across every column."""
    head = []
    for v in (whole or {}).values():
        row = trace_row(v, system)
        row.update(unit="", cells=[None] * len(cases), span={"text": _cell(v, system), "assumed": v.assumed})
        head.append(row)
    order: list[tuple[str, str]] = []
    first: dict[tuple[str, str], Value] = {}
    cells: dict[tuple[str, str], list[dict | None]] = {}
    notes: dict[tuple[str, str], dict[str, str]] = {}
    for k, case in enumerate(cases):
        for key, v in case.values.items():
            row_key = (key, v.formula)
            if row_key not in first:
                order.append(row_key)
                first[row_key] = v
                cells[row_key] = [None] * len(cases)
            cells[row_key][k] = {"text": _cell(v, system), "assumed": v.assumed}
            if v.note:
                notes.setdefault(row_key, {})[case.name] = v.note
    rows = []
    for row_key in order:
        v = first[row_key]
        row = trace_row(v, system)
        row_cells = cells[row_key]
        case_notes = notes.get(row_key, {})
        # A note the same in every case is said once; otherwise each case's own, named.
        row["note"] = typeset(next(iter(case_notes.values()))) if len(set(case_notes.values())) == 1 \
            and len(case_notes) == len(cases) else "; ".join(f"{n}: {typeset(x)}" for n, x in case_notes.items())
        row["unit"] = _common_unit(row_cells)
        if row["unit"]:  # the unit once, in the row's own column; the cells hold the numbers
            for c in row_cells:
                if c:
                    c["text"] = c["text"][:-len(row["unit"]) - 1]
        texts = {(c["text"], c["assumed"]) if c else None for c in row_cells}
        row["span"] = row_cells[0] if len(cases) > 1 and len(texts) == 1 and row_cells[0] else None
        row["cells"] = row_cells
        row["assumed"] = any(c and c["assumed"] for c in row_cells)
        rows.append(row)
    anchors = {c.anchor for c in cases} | {anchor}
    own = [c for c in checks if c["target"] in anchors]
    return {"anchor": anchor, "title": title, "grouped": True,
            "cases": [{"name": c.name, "anchor": c.anchor, "title": c.title} for c in cases],
            "rows": head + rows, "problems": [c for c in own if c["status"] != "pass"],
            "passing": [c for c in own if c["status"] == "pass"]}


def number_relations(blocks: list[dict]) -> list[dict]:
    """Give every relation of the trace blocks a number, in the order they first appear, and return
    the list of them: the relation, its words and its source, each stated once for the whole report.

    Each row of a block gains ``ref`` (the number; None for a value given in the spec), so a trace
    row shows its relation and values, and the words and source are one look-up away."""
    numbers: dict[tuple[str, str, str], int] = {}
    out: list[dict] = []
    for block in blocks:
        for row in block["rows"]:
            if row["given"]:
                row["ref"] = None
                continue
            key = (row["formula"], row["words"], row["source"])
            if key not in numbers:
                numbers[key] = len(out) + 1
                out.append({"n": numbers[key], "formula": row["formula"], "words": row["words"],
                            "source": row["source"], "symbol": row["symbol"], "label": row["label"]})
            row["ref"] = numbers[key]
    return out


def by_source(relations: list[dict]) -> list[dict]:
    """The numbered relations under their sources, each source stated once, in the order of the
    first relation that cites it; relations with no source stated last."""
    groups: dict[str, list[dict]] = {}
    for x in relations:
        groups.setdefault(x["source"], []).append(x)
    named = [{"source": k, "relations": v} for k, v in groups.items() if k]
    return named + ([{"source": "", "relations": groups[""]}] if "" in groups else [])
