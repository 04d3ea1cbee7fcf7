"""The sensitivity table (specgen/sensitivity.py) as terminal text and as JSON.

Text: for each of the weakest margins, the inputs that move it most, with the change of the margin
in percentage points for a step up and a step down. JSON: the whole table: every input moved (its
SI value and step), those left out and why, and for every margin each input that moves it, ranked.
"""

from __future__ import annotations

from specgen.safe_text import escape
from specgen.sensitivity import SHOWN_INPUTS, Sensitivity


def points(change: float | None) -> str:
    """A change of a margin (a fraction) in signed percentage points: 0.0093 -> '+0.93'."""
    return "-" if change is None else f"{change * 100:+.3g}"


def text_lines(s: Sensitivity) -> list[str]:
    pct = f"{s.step * 100:g} %"
    out = ["", f"Sensitivity of the weakest margins: change in percentage points when each input moves by "
               f"+{pct} / -{pct} of its value ({len(s.inputs)} inputs moved; full table with --format json)"]
    for m in s.weakest:
        out.append(escape(f"  {m.name}: margin {m.margin * 100:.2f} %"))
        for e in m.effects[:SHOWN_INPUTS]:
            out.append(escape(f"    {points(e.up):>8} / {points(e.down):>8}  {e.input}"))
        if not m.effects:
            out.append("    no input moves it")
    return out


def document(s: Sensitivity) -> dict:
    return {
        "step": s.step,
        "inputs": [{"path": k.path, "si_value": k.value, "si_step": k.value * s.step} for k in s.inputs],
        "skipped": [{"path": p, "why": why} for p, why in s.skipped],
        "margins": [{"check": m.name, "id": m.check, "margin": m.margin,
                     "effects": [{"input": e.input, "per_step": e.up, "per_minus_step": e.down} for e in m.effects]}
                    for m in s.margins],
    }
