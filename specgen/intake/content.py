"""A spec's content by meaning: each field's value in SI, for the revision diff and the review fingerprint.

The kind of each field comes from the machine-spec JSON Schema (``schema.fields``), not a list
kept by hand, so a field added to the schema later is compared by physical value with no change here.

The normalised form is what the review fingerprint hashes: every quantity converted to its SI float
(``units.parse``) and every plain number made a float, both rounded to ``SIG_FIGS`` significant
figures so that conversion noise (160 cm^3 read as 1.6e-4 or 1.6000000000000001e-4 m^3) vanishes;
strings, booleans and the mapping structure are kept as loaded. A quantity field of no single kind
(a grade, '8 %' or '4 deg') becomes [kind it first reads as, SI value].

Example: in ``{"supplies": {"main": {"relief_setting": "250 bar"}}}`` the field
``("supplies", "main", "relief_setting")`` has kind "pressure" and normalises to 25000000.0,
exactly as "25 MPa" does.
"""

from __future__ import annotations

import math
from functools import lru_cache

from specgen import units
from specgen.intake.schema import fields

SIG_FIGS = 12


def si_value(value, kind: str | None) -> float | None:
    """The SI float of a quantity leaf, or None when it has no kind or does not parse."""
    if kind is None:
        return None
    try:
        return units.parse(value, kind)
    except (units.UnitProblem, TypeError):
        return None


@lru_cache(maxsize=65536)
def common_kind(a, b) -> tuple[str, float, float] | None:
    """For a quantity field of no single kind (a grade: '8 %' or '4 deg'): the first kind both
    values read as, with both SI values; None when they share none."""
    for kind in units.KINDS:
        sa, sb = si_value(a, kind), si_value(b, kind)
        if sa is not None and sb is not None:
            return kind, sa, sb
    return None


def _round(x: float) -> float:
    return float(f"{x:.{SIG_FIGS}g}") if math.isfinite(x) else x


def normalised(data: dict) -> dict:
    """``data`` with quantities as rounded SI floats and plain numbers as rounded floats."""
    info = fields(data)
    memo: dict[tuple, float | None] = {}  # a spec repeats its values; parse each (text, kind) once

    def si(value, kind):
        key = (type(value), value, kind)
        if key not in memo:
            memo[key] = si_value(value, kind)
        return memo[key]

    def walk(value, path):
        if isinstance(value, dict):
            return {str(k): walk(v, path + (k,)) for k, v in value.items()}
        if isinstance(value, list):
            return [walk(v, path + (i,)) for i, v in enumerate(value)]
        x = si(value, info[path].kind)
        if x is not None:
            return _round(x)
        shared = common_kind(value, value) if info[path].quantity else None
        if shared:  # a quantity of no single kind keeps the kind it was read as: "8 %" and "8%" agree
            return [shared[0], _round(shared[1])]
        if isinstance(value, (int, float)) and not isinstance(value, bool):
            return _round(float(value))
        return value

    return walk(data, ())
