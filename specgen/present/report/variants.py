"""The report's design-variant section: the base design and each variant side by side (specgen/variants.py),
what each variant replaces, the checks whose status differs, and every failing check of a variant."""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present.report.values import STATUS_WORD, typeset
from specgen.units import format_si
from specgen.variants import compare


def variants_context(o: Outcome) -> dict | None:
    """None when no variant ran (the report then has no such section)."""
    if not getattr(o, "variants", ()):
        return None
    system = o.machine.display_units
    c = compare(o.machine.title, o.results, o.variants)
    return {
        "columns": list(c.columns),
        "verdicts": [{"status": v, "word": STATUS_WORD[v]} for v in c.verdicts],
        "worst": {"status": c.verdict, "word": STATUS_WORD[c.verdict]},
        "rows": [{"label": r.label, "cells": [_cell(x, r.kind, system) for x in r.values]} for r in c.rows],
        "differing": [{"name": typeset(d.name), "statuses": [s or "-" for s in d.statuses]} for d in c.differing],
        "variants": [{"id": v.id, "title": typeset(v.title), "verdict": v.results.verdict,
                      "verdict_word": STATUS_WORD[v.results.verdict],
                      "overrides": [f"{path} = {value}" for path, value in v.overrides],
                      "failing": [typeset(f"{x.id} ({x.where}){f' at corner {x.corner}' if x.corner else ''}: {x.message}")
                                  for x in v.results.checks if x.status == "fail"]}
                     for v in o.variants],
    }


def _cell(x: float | None, kind: str, system: str) -> str:
    if x is None:
        return "-"
    return f"{x * 100:.1f} %" if kind == "ratio" else typeset(format_si(x, kind, system))
