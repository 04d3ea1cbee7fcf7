"""Build the spec's design variants: each replacement read once, by the kind of the field it replaces.

A variant is the base design with some inputs replaced: a larger motor, another gear ratio, relief
setting or prime mover. The spec names them under ``variants`` (id -> title, set); ``set`` maps a
dotted spec path (or a corner group, build_corners.GROUPS) to the value it takes, written as in the
spec. Values are read here exactly as operating corners read theirs (build_corners._targets: the
field's kind from the schema, parsed once, range checked, the model path found), so a variant is
the built Machine with those fields replaced: nothing is read or parsed again when it is checked.

Unlike a corner, a variant may replace the design's own sizes, and fields that are not quantities:

- ``drives.<id>.motor.displacement``: a size ("250 cm^3") sets a fixed motor's displacement (min
  and max alike); ``{min, max}`` or ``...displacement.min`` / ``.max`` a variable motor's range;
- ``drives.<id>.motor.efficiency_table``: the name of a table in the sizing parts file (another motor
  from the parts file: give its displacement, ratings and table together);
- plain numbers (a gear ratio, a drive ratio, a pilot ratio), text (``motor.model``) and choices
  of the schema (``pump.control``, ``load_holding``) as they would be written in the spec.

A motor's ``kind`` cannot be replaced (its assumed efficiencies follow the kind): write another
drive instead. A duty point whose load a variant replaces has its direction decided again from the
new load, as validation decides it for the base design.

Example: ``variants: {big_reel: {set: {drives.cutter_reel.motor.displacement: 250 cm^3}}}`` gives
one Variant whose machine has the reel motor's displacement_min = displacement_max = 2.5e-4 m^3/rev.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Callable

from specgen.corners import apply
from specgen.intake import schema
from specgen.intake.build_corners import GROUPS, Target, _targets, _walk
from specgen.intake.build_loads import grade_angle
from specgen.intake.model import Machine
from specgen.intake.quantities import Builder
from specgen.intake.read import plain_data

NOUN = "variant"
_REFUSED = {"kind": "a motor's kind decides its assumed efficiencies; write another drive instead",
            "id": "ids name the parts of the design; write another drive or supply instead"}


@dataclass(frozen=True)
class Variant:
    """One design variant: ``machine`` is the base Machine with every replacement made (built once);
    ``overrides`` (path as written, value as written) in the spec's order, for output."""

    id: str
    title: str
    targets: tuple[Target, ...]
    overrides: tuple[tuple[str, str], ...]
    machine: Machine


def build_variants(b: Builder, d: dict, machine: Machine, directions: Callable) -> tuple[Variant, ...]:
    """Every variant the spec names; problems go to ``b`` located at the replaced key."""
    out = []
    for vid, v in (d.get("variants") or {}).items():
        targets, shown = [], []
        before = len(b.problems)
        for key, value in v["set"].items():
            here = ("variants", vid, "set", key)
            targets += _variant_targets(b, machine, key, value, here)
            shown.append((key, _as_written(value)))
        if len(b.problems) > before:
            continue
        moved = _decided(b, apply(machine, Moves(tuple(targets))), machine, d, targets, vid, directions)
        out.append(Variant(vid, v.get("title", vid), tuple(targets), tuple(shown), moved))
    return tuple(out)


@dataclass(frozen=True)
class Moves:
    """Fields to move, as corners.apply takes them (a corner without its title and modes)."""

    targets: tuple[Target, ...]


def _as_written(value) -> str:
    if isinstance(value, dict):
        return "{" + ", ".join(f"{k}: {x}" for k, x in value.items()) + "}"
    return str(value).lower() if isinstance(value, bool) else str(value)


def _variant_targets(b: Builder, machine: Machine, key: str, value, here: tuple) -> list[Target]:
    if key in GROUPS:
        return _targets(b, machine, key, value, "set", here, fixed={}, noun=NOUN)
    path = tuple(key.split("."))
    for part in path:
        if part in _REFUSED:
            b.fail(here, f"'{key}' cannot be replaced by a variant: {_REFUSED[part]}")
            return []
    if len(path) >= 2 and path[-2:] == ("motor", "displacement"):
        return _displacement(b, machine, path, value, here)
    if len(path) >= 3 and path[-3:-1] == ("motor", "displacement") and path[-1] in ("min", "max"):
        return _displacement(b, machine, path[:-1], {path[-1]: value}, here)
    if path[-1] == "efficiency_table" and len(path) >= 2 and path[-2] == "motor":
        return _table(b, machine, path, value, here)
    if path[-1] == "grade" and "load" in path:
        return _grade(b, machine, path, value, here)
    info = schema.field_at(path, value)
    if info is None:
        b.fail(here, f"'{key}' is not a field of the spec (e.g. drives.<id>.motor.displacement, "
                     f"supplies.<id>.relief_setting, or a group: {', '.join(GROUPS)})")
        return []
    if info.kind is not None or info.quantity:
        return _targets(b, machine, key, value, "set", here, fixed={}, noun=NOUN)
    return _plain(b, machine, path, value, here)


def _grade(b: Builder, machine: Machine, path: tuple, value, here: tuple) -> list[Target]:
    """A load's grade as build_loads reads it ('8 %' or '4 deg' -> angle in rad), and as written for the trace."""
    steps, _, problem = _walk(machine, path)
    if problem:
        b.fail(here, problem)
        return []
    if not isinstance(value, str):
        b.fail(here, f"{value!r} has no unit; write the grade as a percentage ('8 %') or an angle ('4 deg')")
        return []
    percent = "%" in value
    read = b.parse(value, "ratio" if percent else "angle", here)
    if read is None:
        return []
    try:
        angle = grade_angle(read, percent)
    except ValueError as exc:
        b.fail(here, str(exc))
        return []
    spec = ".".join(path)
    return [Target(spec, steps, "set", angle), Target(spec, steps[:-1] + (("attr", "grade_text"),), "set", value)]


def _displacement(b: Builder, machine: Machine, path: tuple, value, here: tuple) -> list[Target]:
    """A fixed size (min = max) or a variable motor's {min, max}, each parsed as a displacement."""
    steps, motor, problem = _walk(machine, path[:-1])
    if problem:
        b.fail(here, problem)
        return []
    given = value if isinstance(value, dict) else {"min": value, "max": value}
    unknown = [k for k in given if k not in ("min", "max")]
    if unknown:
        b.fail(here, f"a displacement takes a size (e.g. '250 cm^3') or {{min, max}}, not '{unknown[0]}'")
        return []
    sizes = {}
    for end, text in given.items():
        si = b.parse(text, "displacement", here)
        if si is None:
            return []
        if not si > 0:
            b.fail(here, f"'{text}' must be greater than zero")
            return []
        sizes[end] = si
    lo = sizes.get("min", motor.displacement_min)
    hi = sizes.get("max", motor.displacement_max)
    if lo is not None and hi is not None and lo > hi:
        b.fail(here, "the minimum displacement would be larger than the maximum")
        return []
    spec = ".".join(path)
    return [Target(spec, steps + (("attr", f"displacement_{end}"),), "set", si) for end, si in sizes.items()]


def _table(b: Builder, machine: Machine, path: tuple, value, here: tuple) -> list[Target]:
    """Another efficiency table of the sizing parts file, by name (as validate._named_tables finds one)."""
    steps, _, problem = _walk(machine, path)
    if problem:
        b.fail(here, problem)
        return []
    tables = machine.sizing.tables or {}
    if not isinstance(value, str):
        b.fail(here, "give the name of an efficiency table of the sizing parts file")
        return []
    if value not in tables:
        where = f"parts file '{machine.sizing.parts_file}'" if machine.sizing.parts_file else "the spec's sizing"
        have = f" (it has: {', '.join(tables)})" if tables else ""
        b.fail(here, f"{where} has no efficiency table '{value}'{have}")
        return []
    return [Target(".".join(path), steps, "set", tables[value])]


def _plain(b: Builder, machine: Machine, path: tuple, value, here: tuple) -> list[Target]:
    """A number, text or choice of the schema, set as written."""
    spec = ".".join(path)
    steps, found, problem = _walk(machine, path)
    if problem:
        b.fail(here, problem)
        return []
    choices = _choices(path)
    if choices and value not in choices:
        b.fail(here, f"'{spec}' takes one of {', '.join(map(str, choices))}, not {value!r}")
        return []
    if isinstance(found, bool) or isinstance(value, bool):
        ok = isinstance(found, bool) and isinstance(value, bool)
    elif isinstance(found, (int, float)):
        ok = isinstance(value, (int, float)) and math.isfinite(value) and value > 0 and (
            not isinstance(found, int) or float(value).is_integer())  # a count stays a whole number
    else:
        ok = isinstance(value, str) and (found is None or isinstance(found, str))
    if not ok:
        b.fail(here, f"{value!r} does not fit '{spec}' (it holds {found!r} in the base design)")
        return []
    if isinstance(found, (int, float)) and not isinstance(found, bool):
        value = int(value) if isinstance(found, int) else float(value)
    return [Target(spec, steps, "set", value)]


def _choices(path: tuple) -> list:
    """The values the schema allows at ``path`` when it lists them (an enum), else []."""
    root = schema.schema()
    nodes = [root]
    for key in path:
        candidates = [(n, names) for node in nodes for n, names in schema._branches(node, root)
                      if schema._fits(n, {})]
        nodes = schema._child_nodes(candidates, key)
    return [e for node in nodes for n, _ in schema._branches(node, root) for e in n.get("enum", [])]


def _decided(b: Builder, moved: Machine, base: Machine, d: dict, targets: list[Target], vid: str,
             directions: Callable) -> Machine:
    """``moved`` with the direction of every duty point whose load it replaced decided again from
    the direction as written, as validation decides it for the base design."""
    touched = {(t.steps[1][1], t.steps[3][1]) for t in targets
               if len(t.steps) > 3 and t.steps[0] == ("attr", "drives") and t.steps[2] == ("attr", "duty_points")}
    if not touched:
        return moved
    drives = []
    for drive in moved.drives:
        written = d["drives"][drive.id]["duty_points"]
        duties = tuple(replace(u, direction=written[u.id].get("direction")) if (drive.id, u.id) in touched else u
                       for u in drive.duty_points)
        drives.append(replace(drive, duty_points=duties) if duties != drive.duty_points else drive)
    moved, contradictions = directions(replace(moved, drives=tuple(drives)))
    for path, message in contradictions:
        if (path[1], path[3]) in touched:
            b.fail(("variants", vid), f"at this variant, {'.'.join(path)}: {message}")
    return moved


def written_out(data: dict, vid: str) -> dict:
    """The spec's ``data`` with variant ``vid``'s replacements written in and no ``variants`` key: the
    variant as a spec of its own (for the revision diff, and to hold it to every rule of the spec)."""
    out = plain_data(data)  # new dicts and lists throughout: the loaded spec is left as it is
    for key, value in data["variants"][vid]["set"].items():
        if key in GROUPS:
            section, rest = GROUPS[key]
            paths = [(section, owner) + rest for owner in out.get(section, {})]
        else:
            paths = [tuple(key.split("."))]
        for path in paths:
            _put(out, path, plain_data(value))
    del out["variants"]
    return out


def _put(data: dict, path: tuple, value) -> None:
    node = data
    for part in path[:-1]:
        if not isinstance(node.get(part), dict):  # a fixed size given a {min, max} range, say
            node[part] = {}
        node = node[part]
    if isinstance(value, dict) and isinstance(node.get(path[-1]), dict):
        node[path[-1]] = {**node[path[-1]], **value}
    else:
        node[path[-1]] = value
