"""Numbers as the report shows them, and formulas with the numbers put in.

``show`` formats one value with its unit in the machine's display units (units.format_si);
``substitute`` writes a trace's formula with each input's value in place of its symbol;
``trace_row`` is one line of a calculation trace as the template shows it.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from specgen.units import convert, format_si, significant
from specgen.trace import Input, Value

STATUS_WORD = {"pass": "PASS", "warn": "WARN", "fail": "FAIL"}


def slug(text: str) -> str:
    """An HTML id fragment: ids in specs are already plain, this keeps anything else safe."""
    return re.sub(r"[^A-Za-z0-9_-]+", "-", str(text)).strip("-") or "x"


def _is_efficiency(symbol: str, label: str) -> bool:
    return symbol.startswith("eta") or "efficiency" in label


def show(value: float | None, kind: str, system: str, symbol: str = "", label: str = "") -> str:
    """A number with its unit in the display system. Gear ratios and other plain ratios stay plain
    numbers; efficiencies and margins are shown in percent."""
    if value is None:
        return "-"
    if not kind:
        return significant(value)
    if kind == "ratio" and symbol and not _is_efficiency(symbol, label):
        return significant(value)
    return format_si(value, kind, system)


def plain(value: float, kind: str, system: str) -> float:
    """The number alone in the display unit, for a chart axis: 25e6 Pa in "SI" -> 250.0 (bar), in "US" -> 3625.9 (psi)."""
    return convert(value, kind, system)[0]


@dataclass
class Segment:
    """A piece of a substituted formula; ``assumed`` marks an input a default filled in."""

    text: str
    assumed: bool = False


def _input_text(i: Input, system: str) -> str:
    if i.kind == "ratio":
        return significant(i.value)  # substituted as a plain factor: 0.9400, not 94.00 %
    return show(i.value, i.kind, system, i.symbol, i.label)


def substitute(value: Value, system: str) -> list[Segment]:
    """The formula with each input's value and unit put in place of its symbol.

    Example: "T = T_L / (i * eta_g)" -> "T = (1200 N*m) / (30.00 * 0.9400)". Sums and maxima over
    many inputs are written out in full; the segments flag assumed inputs so the page can mark them.
    """
    formula = value.formula
    if " = " not in formula or not value.inputs:
        return []
    lhs, rhs = formula.split(" = ", 1)
    by_symbol = {i.symbol: i for i in value.inputs}
    names = sorted(by_symbol, key=len, reverse=True)
    pattern = re.compile(r"(?<![\w\[\],.])(" + "|".join(map(re.escape, names)) + r")(?![\w\[\],])")
    out = [Segment(f"{lhs} = ")]
    pos, hits = 0, 0
    for m in pattern.finditer(rhs):
        out.append(Segment(rhs[pos:m.start()]))
        i = by_symbol[m.group(1)]
        text = _input_text(i, system)
        out.append(Segment(f"({text})" if " " in text else text, i.assumed))
        pos, hits = m.end(), hits + 1
    out.append(Segment(rhs[pos:]))
    if hits:
        return [s for s in out if s.text]
    fn = rhs.split("(", 1)[0].strip()
    if fn in ("sum", "max", "min"):  # e.g. "q_sum = sum(q_i)": write every term out
        terms = [Segment(_input_text(i, system), i.assumed) for i in value.inputs]
        joined: list[Segment] = [Segment(f"{lhs} = " + ("" if fn == "sum" else f"{fn}("))]
        for k, t in enumerate(terms):
            if k:
                joined.append(Segment(" + " if fn == "sum" else ", "))
            joined.append(t)
        if fn != "sum":
            joined.append(Segment(")"))
        return joined
    return []


def trace_row(value: Value, system: str, entered: str | None = None) -> dict:
    """One line of a calculation trace as the template shows it: formula, substitution, result, source."""
    return {
        "key": value.key, "label": value.label, "symbol": value.symbol, "formula": value.formula,
        "words": value.words, "substituted": substitute(value, system),
        "inputs": [{"symbol": i.symbol, "label": i.label, "text": _input_text(i, system) if i.kind != "ratio"
                    else show(i.value, i.kind, system, i.symbol, i.label), "assumed": i.assumed}
                   for i in value.inputs],
        "result": show(value.value, value.kind, system, value.symbol, value.label),
        "source": value.source, "note": value.note, "assumed": value.assumed, "given": not value.formula,
        "entered": entered,
    }
