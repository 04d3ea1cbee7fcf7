"""Terminal text for design variants: the side-by-side table, the checks whose status differs, a verdict
line per variant, and every failing or warning check of each variant (never hidden, quiet or not)."""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present.text import table
from specgen.safe_text import escape
from specgen.units import format_si
from specgen.variants import compare, own_problems


def variant_lines(o: Outcome, quiet: bool = False) -> list[str]:
    """Nothing when no variant ran."""
    if not o.variants:
        return []
    system = o.machine.display_units
    c = compare(o.machine.title, o.results, o.variants)
    out = ["", f"Design variants (base design and {len(o.variants)} variant{'s' if len(o.variants) != 1 else ''}): "
               f"worst verdict {c.verdict.upper()}"]
    out += [escape(f"  variant {v.id}: {v.results.verdict.upper()}  {v.title}: "
                   + "; ".join(f"{k} = {x}" for k, x in v.overrides)) for v in o.variants]
    if not quiet:
        out += ["", "Variants side by side"]
        rows = [[r.label] + [_cell(x, r.kind, system) for x in r.values] for r in c.rows]
        rows.append(["Verdict"] + [s.upper() for s in c.verdicts])
        out += table(["quantity"] + list(c.columns), rows)
        if c.differing:
            out += ["", "Checks whose status differs between the variants"]
            out += table(["check"] + list(c.columns), [[d.name] + [s or "-" for s in d.statuses] for d in c.differing])
    for v in o.variants:
        problems = own_problems(o.results, v.results)
        if problems:
            out += ["", f"Variant {escape(v.id)}: failures, and warnings the base design does not have"]
            out += [f"{x.status.upper():4}  {x.id:20} {escape(x.where)}"
                    f"{f' [at corner {x.corner}]' if x.corner else ''}: {escape(x.message)}" for x in problems]
    return out


def _cell(x: float | None, kind: str, system: str) -> str:
    if x is None:
        return "-"
    if kind == "ratio":
        return f"{x * 100:.1f} %"
    return format_si(x, kind, system)
