"""Numbers as the report shows them, and formulas with the numbers put in.

``show`` formats one value with its unit in the machine's display units (units.format_si);
``substitute`` writes a trace's formula with each input's value in place of its symbol;
``trace_row`` is one line of a calculation trace as the template shows it.

Units are typeset here, at the report's edge, as engineers write them (cm\u00b3, \u00b0C, N\u00b7m,
mm\u00b2/s); the text and JSON outputs keep the ASCII spellings of units.DISPLAY.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from specgen.units import convert, format_si, significant
from specgen.trace import Input, Value

STATUS_WORD = {"pass": "PASS", "warn": "WARN", "fail": "FAIL"}

# ASCII unit spellings (units.DISPLAY) as a printed document writes them. One table: every number
# the report shows passes through ``show`` and every sentence with units through ``typeset``.
TYPESET = {
    "cm^3/rev": "cm\u00b3/rev", "in^3/rev": "in\u00b3/rev", "degC": "\u00b0C", "degF": "\u00b0F",
    "N*m": "N\u00b7m", "lbf*in": "lbf\u00b7in", "mm^2/s": "mm\u00b2/s", "m/s^2": "m/s\u00b2",
    "ft/s^2": "ft/s\u00b2", "kg/m^3": "kg/m\u00b3", "lb/ft^3": "lb/ft\u00b3", "kg*m^2": "kg\u00b7m\u00b2",
    "lb*ft^2": "lb\u00b7ft\u00b2", "m^2": "m\u00b2", "ft^2": "ft\u00b2", "W/(m^2*K)": "W/(m\u00b2\u00b7K)",
    "kJ/(kg*K)": "kJ/(kg\u00b7K)", "cm^3": "cm\u00b3", "m^3": "m\u00b3", "mm^2": "mm\u00b2", "kN*m": "kN\u00b7m",
}
# A spelling counts only as a whole word after a number or a space: "N*m" in "2*N*m" of a formula is
# never reached, since formulas are not typeset.
_TYPESET_RE = re.compile(r"(?<![\w^*/])(" + "|".join(map(re.escape, sorted(TYPESET, key=len, reverse=True)))
                         + r")(?![\w^*])")


def typeset(text: str) -> str:
    """Units in a sentence or a shown value as engineers write them.

    Example: typeset("820.0 cm^3/rev at 40 degC, 1200 N*m") -> "820.0 cm\u00b3/rev at 40 \u00b0C, 1200 N\u00b7m"."""
    return _TYPESET_RE.sub(lambda m: TYPESET[m.group(1)], text) if text else text


def unit_text(kind: str, system: str) -> str:
    """The display unit of ``kind`` as the report prints it: unit_text("torque", "SI") -> "N\u00b7m"."""
    return typeset(convert(0.0, kind, system)[1])


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
    return typeset(format_si(value, kind, system))


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
        "key": value.key, "label": typeset(value.label), "symbol": value.symbol, "formula": value.formula,
        "words": typeset(value.words), "substituted": substitute(value, system),
        "inputs": [{"symbol": i.symbol, "label": i.label, "text": _input_text(i, system) if i.kind != "ratio"
                    else show(i.value, i.kind, system, i.symbol, i.label), "assumed": i.assumed}
                   for i in value.inputs],
        "result": show(value.value, value.kind, system, value.symbol, value.label),
        "source": typeset(value.source), "note": typeset(value.note), "assumed": value.assumed, "given": not value.formula,
        "entered": entered,
    }
