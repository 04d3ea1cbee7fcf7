"""Hints for a quantity specgen cannot read: its dimension in words, and the nearest spelling.

``dimension_words`` turns pint's dimensionality into words: ``[length] / [mass]`` reads "length per
mass", ``[mass] * [length] ** 3 / [time] ** 2`` reads "mass times length cubed per time squared".

``suggestion`` finds what the writer most likely meant, for the field's kind, first of:
  1. a common informal spelling specgen knows (``INFORMAL``: "kNm" -> "kN*m", "lpm" -> "L/min");
  2. the unit with a '*' put inside a run of letters, when that reads as the kind ("kNm" ->
     "kN*m", "lbfft" -> "lbf*ft");
  3. the same letters in another case ("kw" -> "kW", "degc" -> "degC");
  4. the nearest spelling by ``difflib`` among specgen's display units and the examples of its
     kinds, then among pint's unit names, symbols and aliases ("barr" -> "bar").
A candidate counts only when it reads as the field's kind, so "lpm" in a flow field is never told
to be "rpm". Worked example: '9 kNm' in a torque field -> "did you mean '9 kN*m'?".
"""

from __future__ import annotations

import difflib
import re
from functools import lru_cache

# Spellings seen in data sheets and hand-written specs, and what specgen reads for them.
INFORMAL = {
    "Nm": "N*m", "kNm": "kN*m", "daNm": "daN*m", "ftlb": "lbf*ft", "ftlbs": "lbf*ft", "lbft": "lbf*ft",
    "inlb": "lbf*in", "inlbs": "lbf*in", "lbin": "lbf*in", "lb-ft": "lbf*ft", "lb-in": "lbf*in",
    "lpm": "L/min", "l/m": "L/min", "lmin": "L/min", "gal/min": "gpm", "cc": "cm^3", "ccm": "cm^3",
    "cc/rev": "cm^3/rev", "cuin": "in^3", "cid": "in^3", "bars": "bar", "psig": "psi", "Bar": "bar",
    "RPM": "rpm", "Rpm": "rpm", "KW": "kW", "Kw": "kW", "HP": "hp", "Hp": "hp", "C": "degC", "F": "degF",
    "kmh": "km/h", "kph": "km/h", "mps": "m/s", "cst": "cSt",
}

_POWERS = {2: "squared", 3: "cubed"}


def dimension_words(dimensionality) -> str:
    """pint dimensionality (a mapping of '[base]' to exponent) in words; "a plain number" if none."""
    def term(name: str, power: int) -> str:
        word = name.strip("[]")
        return word if power == 1 else f"{word} {_POWERS.get(power, f'to the power {power}')}"

    items = dict(dimensionality).items()
    up = [term(n, p) for n, p in items if p > 0]
    down = [term(n, -p) for n, p in items if p < 0]
    if not up and not down:
        return "a plain number"
    text = " times ".join(up) if up else "one"
    return text + (" per " + " per ".join(down) if down else "")


def _reads_as(unit: str, kind_name: str) -> bool:
    from specgen.unit_kinds import KINDS, _PINT_SPELLING, registry

    kind = KINDS[kind_name]
    if not kind.dimensionality:
        return False  # ratios, angles and counts: no spelling to suggest
    ureg = registry()
    spelled = _PINT_SPELLING.get(unit, unit).replace("^", "**")
    try:
        q = ureg.Quantity(1.0, spelled)
        return q.dimensionality == ureg.get_dimensionality(kind.dimensionality)
    except Exception:  # pint raises several unrelated types for unreadable text
        return False


def _own_spellings() -> list[str]:
    from specgen.unit_kinds import DISPLAY, KINDS

    out = [u for system in DISPLAY.values() for u in system.values() if u]
    out += [k.example.split(" ", 1)[1] for k in KINDS.values() if " " in k.example]
    out += ["bar", "mbar", "kPa", "MPa", "psi", "L/min", "gpm", "rpm", "rev/s", "N*m", "kN*m", "lbf*ft",
            "lbf*in", "W", "kW", "hp", "cm^3", "in^3", "mL", "L", "mm", "cm", "m", "in", "ft", "kg", "t", "lb",
            "N", "kN", "lbf", "s", "min", "h", "degC", "degF", "K", "m/s", "km/h", "mm^2/s", "cSt"]
    return list(dict.fromkeys(out))


@lru_cache(maxsize=1)
def _pint_spellings() -> tuple[str, ...]:
    from specgen.unit_kinds import registry

    names = set()
    for name, definition in registry()._units.items():
        names.add(name)
        names.update(s for s in (getattr(definition, "symbol", None),) if s)
        names.update(a for a in getattr(definition, "aliases", ()) if a)
    return tuple(sorted(names))


@lru_cache(maxsize=1024)
def suggestion(unit: str, kind_name: str) -> str | None:
    """The unit spelling the writer most likely meant for a ``kind_name`` field, or None."""
    unit = unit.strip()
    if not unit:
        return None
    if unit in INFORMAL and _reads_as(INFORMAL[unit], kind_name):
        return INFORMAL[unit]
    for m in re.finditer(r"[A-Za-z]{2,}", unit):  # "kNm": try "k*Nm", "kN*m"
        word = m.group()
        for i in range(1, len(word)):
            candidate = unit[:m.start() + i] + "*" + unit[m.start() + i:]
            if _reads_as(candidate, kind_name):
                return candidate
    for pool in (_own_spellings(), _pint_spellings()):  # "kw" -> "kW", "degc" -> "degC"
        for candidate in pool:
            if candidate.lower() == unit.lower() and candidate != unit and _reads_as(candidate, kind_name):
                return candidate
    for pool, cutoff in ((_own_spellings(), 0.6), (list(_pint_spellings()), 0.75)):
        for candidate in difflib.get_close_matches(unit, pool, n=8, cutoff=cutoff):
            if candidate != unit and _reads_as(candidate, kind_name):
                return candidate
    return None


def did_you_mean(text: str, unit: str, kind_name: str) -> str:
    """"; did you mean '9 kN*m'?" for ``text`` "9 kNm", or "" when nothing near fits."""
    better = suggestion(unit, kind_name)
    if not better:
        return ""
    stripped = text.strip()
    number = stripped[: len(stripped) - len(unit)].strip() if stripped.endswith(unit) else stripped.split()[0]
    return f"; did you mean '{number} {better}'?"
