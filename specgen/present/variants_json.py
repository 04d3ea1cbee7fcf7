"""Design variants in the JSON output: each variant in full (as the base design is written) and the
side-by-side comparison (specgen/variants.py), numbers in the display units with SI beside them."""

from __future__ import annotations

import math

from specgen.pipeline import Outcome
from specgen.present.json_out import results_part
from specgen.units import KINDS, convert
from specgen.variants import compare


def variants_document(o: Outcome) -> dict:
    system = o.machine.display_units
    c = compare(o.machine.title, o.results, o.variants)
    return {
        "overall_verdict": c.verdict,
        "variants": [{"id": v.id, "title": v.title,
                      "overrides": [{"path": path, "value": value} for path, value in v.overrides],
                      "verdict": v.results.verdict, "counts": v.results.counts(), **results_part(v.results, system, v.machine)}
                     for v in o.variants],
        "variant_comparison": {
            "columns": list(c.columns), "verdicts": list(c.verdicts),
            "rows": [{"key": r.key, "label": r.label, "unit": _unit(r.kind, system),
                      "si_unit": KINDS[r.kind].si_unit.replace("**", "^"),
                      "values": [_number(x, r.kind, system) for x in r.values],
                      "si_values": [x if x is not None and math.isfinite(x) else None for x in r.values]}
                     for r in c.rows],
            "differing_checks": [{"check": d.name, "statuses": list(d.statuses)} for d in c.differing],
        },
    }


def _unit(kind: str, system: str) -> str:
    return "" if kind == "ratio" else convert(1.0, kind, system)[1]


def _number(x: float | None, kind: str, system: str) -> float | None:
    if x is None or not math.isfinite(x):
        return None
    return x if kind == "ratio" else convert(x, kind, system)[0]
