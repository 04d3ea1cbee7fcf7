"""A spec's content by meaning: which kind of quantity each field holds, and its normalised form.

The kind of a field is read from the machine-spec JSON Schema, not listed by hand: a field whose
schema is (or ``$ref``s, through any chain) a ``$defs`` entry named like a kind in
``units.KINDS`` ("pressure", "torque", "ratio" ...) holds that kind. ``efficiency`` refs
``ratio``, so efficiencies are ratios. A field may offer several shapes (``oneOf``/``anyOf``, e.g.
a fixed displacement string or a ``{min, max}`` mapping); the shape that fits the value decides.
So a field added to the schema later is compared by physical value with no change here.

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
from dataclasses import dataclass
from functools import lru_cache

from specgen import units
from specgen.intake.validate import schema

SIG_FIGS = 12


@dataclass(frozen=True)
class Field:
    """What the schema says of one place in a spec.

    ``kind``: the units kind of a quantity leaf, else None. ``noun``: for a mapping or item, the
    name of the schema definition it follows ("drive", "duty point", "supply"), else None.
    """

    kind: str | None = None
    noun: str | None = None
    quantity: bool = False  # a number-with-unit string, even where the schema names no single kind


def _resolve(node: dict, root: dict) -> tuple[dict, list[str]]:
    """Follow a chain of local ``$ref``s; return the final node and every definition name passed."""
    names: list[str] = []
    seen = set()
    while isinstance(node, dict) and "$ref" in node and node["$ref"].startswith("#/") and node["$ref"] not in seen:
        ref = node["$ref"]
        seen.add(ref)
        names.append(ref.rsplit("/", 1)[-1])
        target = root
        for part in ref[2:].split("/"):
            target = target.get(part, {}) if isinstance(target, dict) else {}
        node = target
    return node, names


_BRANCHES: dict[int, tuple[dict, list]] = {}  # id(schema node) -> (node, its branches); the schema is loaded once


def _branches(node: dict, root: dict) -> list[tuple[dict, list[str]]]:
    """The node and every alternative it offers (oneOf, anyOf, allOf, then, else), resolved."""
    hit = _BRANCHES.get(id(node))
    if hit is not None and hit[0] is node:
        return hit[1]
    out = _expand(node, root)
    _BRANCHES[id(node)] = (node, out)
    return out


def _expand(node: dict, root: dict) -> list[tuple[dict, list[str]]]:
    out, todo = [], [(node, [])]
    while todo:
        n, carried = todo.pop(0)
        n, names = _resolve(n, root)
        if not isinstance(n, dict):
            continue
        names = carried + names
        out.append((n, names))
        for key in ("allOf", "oneOf", "anyOf"):
            todo += [(b, names) for b in n.get(key, []) if isinstance(b, dict)]
        todo += [(n[key], names) for key in ("then", "else") if isinstance(n.get(key), dict)]
    return out


def _kind(names: list[str]) -> str | None:
    return next((n for n in names if n in units.KINDS), None)


def _fits(node: dict, value) -> bool:
    """Could ``value`` take this shape? Only the type is asked: enough to choose among branches."""
    t = node.get("type")
    if t is None:
        return True
    types = t if isinstance(t, list) else [t]
    checks = {"object": isinstance(value, dict), "array": isinstance(value, list),
              "string": isinstance(value, str), "boolean": isinstance(value, bool),
              "number": isinstance(value, (int, float)) and not isinstance(value, bool),
              "integer": isinstance(value, int) and not isinstance(value, bool), "null": value is None}
    return any(checks.get(x, False) for x in types)


def _child_nodes(candidates: list[tuple[dict, list[str]]], key) -> list[dict]:
    out = []
    for node, _ in candidates:
        if isinstance(key, int):
            if isinstance(node.get("items"), dict):
                out.append(node["items"])
            continue
        props = node.get("properties", {})
        if key in props:
            out.append(props[key])
        elif isinstance(node.get("additionalProperties"), dict):
            out.append(node["additionalProperties"])
    return out


def _describe(nodes: list[dict], value, path: tuple, root: dict, out: dict) -> None:
    candidates = [(n, names) for node in nodes for n, names in _branches(node, root) if _fits(n, value)]
    names = [name for _, ns in candidates for name in ns]
    if isinstance(value, dict):
        noun = next((n for n in names if n not in units.KINDS), None)
        out[path] = Field(noun=noun.replace("_", " ") if noun else None)
        for k, v in value.items():
            _describe(_child_nodes(candidates, k), v, path + (k,), root, out)
    elif isinstance(value, list):
        out[path] = Field()
        for i, v in enumerate(value):
            _describe(_child_nodes(candidates, i), v, path + (i,), root, out)
    else:
        out[path] = Field(kind=_kind(names), quantity=_kind(names) is not None or "quantity" in names)


def fields(data: dict) -> dict[tuple, Field]:
    """Every place in ``data`` (mappings, items and leaves) with what the schema says of it."""
    root = schema()
    out: dict[tuple, Field] = {}
    _describe([root], data, (), root, out)
    return out


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
