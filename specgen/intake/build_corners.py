"""Build the spec's operating corners: each override validated and parsed once, against the built model.

A corner is the nominal machine with some inputs moved to the end of their range (primer section 18).
The spec names them under ``corners`` (id -> title, modes, set, scale) and switches the typical set on
with ``typical_corners: true`` (or ``{idle_speed: 900 rpm}`` to add the engine at idle).

Each override names a dotted spec path (``fluid.temperature``, ``supplies.main.relief_setting``,
``drives.winch.motor.efficiency.volumetric``) or a group (GROUPS: the same field of every motor,
pump or supply). The value is read by the kind the machine-spec schema gives that field
(schema.field_at), once, here; the model path it lands on is found here too (``Target``), so a
corner is applied to the built Machine without reading or parsing anything again (specgen/corners.py).

``set``: the value the field takes, written as in the spec ("-20 degC", 0.9, "900 rpm").
``scale``: a factor (1.05), or a signed percentage: an efficiency or other ratio moves by that many
points ("-3 %": 0.94 -> 0.91), any other quantity by that percentage of itself ("+5 %": 280 bar ->
294 bar). Duty points and motor sizes are the design's own cases, not operating conditions: a corner
cannot move them.

Example: ``corners: {cold: {set: {fluid.temperature: -20 degC}}}`` gives one Corner "cold" whose
one Target is (("attr", "fluid"), ("attr", "temperature")) set to 253.15 K.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

from specgen.intake.model import Machine, Ratio
from specgen.intake.quantities import MIN_EFFICIENCY, SI_RANGE, Builder
from specgen.intake.schema import field_at

# Typical corners (from memory, common practice; maker's data and site data always win).
COLD_OIL = "-20 degC"  # lowest ambient of a machine working outdoors in a cold climate; oil at ambient
HOT_OIL = "80 degC"  # upper end of 60-80 degC mineral oil is kept at (primer section 17)
WORN_POINTS = "-3 %"  # volumetric efficiencies a few points lower after wear
RELIEF_DRIFT = "+5 %"  # a relief valve at the top of its setting tolerance
TYPICAL_BASIS = "typical corner (from memory, common practice)"

# Groups: one name for the same field of every motor, pump or supply.
GROUPS = {
    "motors.volumetric_efficiency": ("drives", ("motor", "efficiency", "volumetric")),
    "motors.hydromechanical_efficiency": ("drives", ("motor", "efficiency", "hydromechanical")),
    "motors.starting_efficiency": ("drives", ("motor", "efficiency", "starting")),
    "pumps.volumetric_efficiency": ("supplies", ("pump", "volumetric_efficiency")),
    "pumps.overall_efficiency": ("supplies", ("pump", "overall_efficiency")),
    "supplies.relief_setting": ("supplies", ("relief_setting",)),
    "supplies.prime_mover_speed": ("supplies", ("prime_mover_speed",)),
}

# Spec keys whose model attribute has another name.
_RENAMED = {"gear_stage": "gear", "return": "ret"}
_FIXED = {"duty_points": "duty points are the design's own cases; write another duty point instead",
          "displacement": "a displacement is the design's size, not an operating condition"}
_PERCENT = re.compile(r"^\s*([+-]?\d+(?:\.\d+)?)\s*%\s*$")


@dataclass(frozen=True)
class Target:
    """One model field a corner moves: ``steps`` from the Machine, ``how`` "set" or "scale" or
    "points", ``amount`` the SI value, factor or points; ``spec`` the dotted spec path."""

    spec: str
    steps: tuple[tuple[str, str], ...]  # ("attr", name) or ("id", id in a tuple of records)
    how: str
    amount: float


@dataclass(frozen=True)
class Corner:
    id: str
    title: str
    modes: tuple[str, ...]  # empty: every mode
    targets: tuple[Target, ...]
    overrides: tuple[tuple[str, str], ...]  # (path or group as written, value as written) for output
    assumed: bool = False
    basis: str = ""


def build_corners(b: Builder, d: dict, machine: Machine) -> tuple[Corner, ...]:
    """Every corner the spec names, typical ones first; problems go to ``b`` located at their key."""
    out = []
    typical = d.get("typical_corners")
    if typical:
        out += _typical(b, typical if isinstance(typical, dict) else {}, machine)
    taken = {c.id for c in out}
    for cid, c in (d.get("corners") or {}).items():
        where = ("corners", cid)
        if cid in taken:
            b.fail(where, f"corner '{cid}' is also a typical corner's id; choose another id")
            continue
        modes = tuple(c.get("modes", ()))
        for n, mid in enumerate(modes):
            if not any(m.id == mid for m in machine.modes):
                b.fail(where + ("modes", n), f"corner '{cid}' names mode '{mid}', which is not defined "
                                             f"(modes: {', '.join(m.id for m in machine.modes)})")
        targets, shown = [], []
        for how in ("set", "scale"):
            for key, value in (c.get(how) or {}).items():
                targets += _targets(b, machine, key, value, how, where + (how, key))
                shown.append((key, f"{'x ' if how == 'scale' and not isinstance(value, str) else ''}{value}"))
        out.append(Corner(cid, c.get("title", cid), modes, tuple(targets), tuple(shown)))
    return tuple(out)


def _typical(b: Builder, given: dict, machine: Machine) -> list[Corner]:
    where = ("typical_corners",)
    plan = []
    if machine.fluid is not None:
        plan += [("cold_start", "Cold start: oil at the lowest ambient", "set", "fluid.temperature", COLD_OIL),
                 ("hot_oil", "Hot oil", "set", "fluid.temperature", HOT_OIL)]
    plan += [("worn", "Worn motors and pumps", "scale", "motors.volumetric_efficiency", WORN_POINTS),
             ("worn", "", "scale", "pumps.volumetric_efficiency", WORN_POINTS),
             ("relief_high", "Relief valves at the top of their tolerance", "scale", "supplies.relief_setting",
              RELIEF_DRIFT)]
    if "idle_speed" in given:
        plan.append(("idle", "Engine at idle", "set", "supplies.prime_mover_speed", given["idle_speed"]))
    corners: dict[str, Corner] = {}
    for cid, title, how, key, value in plan:
        here = where + ("idle_speed",) if cid == "idle" else where
        targets = tuple(_targets(b, machine, key, value, how, here))
        old = corners.get(cid)
        if old is None:
            corners[cid] = Corner(cid, title, (), targets, ((key, str(value)),), assumed=cid != "idle",
                                  basis=TYPICAL_BASIS)
        else:
            corners[cid] = Corner(cid, old.title, (), old.targets + targets, old.overrides + ((key, str(value)),),
                                  old.assumed, old.basis)
    return list(corners.values())


def _targets(b: Builder, machine: Machine, key: str, value, how: str, here: tuple, fixed: dict | None = None,
             noun: str = "corner") -> list[Target]:
    """The model fields ``key`` (a dotted path or a group) reaches, each with its parsed amount.
    ``fixed``: spec keys that may not be moved (a design variant may move any); ``noun``: what moves them."""
    if key in GROUPS:
        section, rest = GROUPS[key]
        owners = [x.id for x in getattr(machine, section)]
        paths = [(section, oid) + rest for oid in owners]
        if rest == ("prime_mover_speed",):  # only supplies driven at a stated engine speed
            paths = [p for p in paths if machine.supply(p[1]).prime_mover_speed is not None]
            if not paths:
                b.fail(here, "no supply gives a prime_mover_speed to move")
        if rest == ("relief_setting",) and how == "scale":  # a closed loop's own relief sides drift alike
            for section, sid, *_ in list(paths):
                loop = machine.supply(sid).closed_loop
                paths += [(section, sid, "closed_loop", "high_pressure_reliefs", side) for side in ("side_a", "side_b")
                          if loop is not None and getattr(loop.high_pressure_reliefs, side) is not None]
    else:
        paths = [tuple(key.split("."))]
    out = []
    for path in paths:
        target = _target(b, machine, path, value, how, here, fixed, noun)
        if target is None:
            break  # one message per override is enough
        out.append(target)
    return out


def _target(b: Builder, machine: Machine, path: tuple, value, how: str, here: tuple, fixed: dict | None = None,
            noun: str = "corner") -> Target | None:
    spec = ".".join(path)
    fixed = _FIXED if fixed is None else fixed
    for part in path:
        if part in fixed:
            b.fail(here, f"'{spec}' cannot be moved by a corner: {fixed[part]}")
            return None
    info = field_at(path, value if how == "set" else "1 unit")  # a factor says nothing of the field's shape
    if info is None or (info.kind is None and not info.quantity):
        b.fail(here, f"'{spec}' is not a quantity of the spec a {noun} can move (e.g. fluid.temperature, "
                     f"supplies.<id>.relief_setting, or a group: {', '.join(GROUPS)})")
        return None
    steps, found, problem = _walk(machine, path)
    if problem:
        b.fail(here, problem)
        return None
    base = found.value if isinstance(found, Ratio) else found
    if isinstance(base, float) and not math.isfinite(base):
        return None  # the nominal value was refused, and is reported at its own field
    kind = info.kind or "ratio"
    is_ratio = kind == "ratio"
    if how == "set":
        amount = b.parse(value, kind, here)
        if amount is None:
            return None
        result = amount
    else:
        if found is None:
            b.fail(here, f"'{spec}' is not given in the spec, so there is nothing to scale; use set")
            return None
        if kind == "temperature":
            b.fail(here, "a temperature cannot be scaled; set it (e.g. '-20 degC')")
            return None
        how, amount = _scale(value, is_ratio)
        if amount is None:
            b.fail(here, f"{value!r} is not a factor (e.g. 1.05) or a signed percentage (e.g. '+5 %', '-3 %')")
            return None
        result = base + amount if how == "points" else base * amount
    problem = None if result == base == 0 else _out_of_range(spec, result, is_ratio, kind, noun)
    if problem:
        b.fail(here, problem)
        return None
    return Target(spec, steps, how, amount)


def _scale(value, is_ratio: bool) -> tuple[str, float | None]:
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return "scale", float(value) if math.isfinite(value) and value > 0 else None
    m = _PERCENT.match(value) if isinstance(value, str) else None
    if m is None:
        return "scale", None
    pct = float(m.group(1))
    if is_ratio:
        return "points", pct / 100.0
    return "scale", 1.0 + pct / 100.0 if pct > -100 else None


def _out_of_range(spec: str, result: float, is_ratio: bool, kind: str, noun: str = "corner") -> str | None:
    if is_ratio and "efficiency" in spec and not MIN_EFFICIENCY <= result <= 1.0:
        return f"'{spec}' would become {result:.4g} at this {noun}; an efficiency lies in (0, 1]"
    # a corner's other ratios are thresholds and shares; a variant may move any ratio (a grade may fall)
    if is_ratio and "efficiency" not in spec and noun == "corner" and not 0.0 <= result < 1.0:
        return f"'{spec}' would become {result:.4g} at this {noun}; it must lie in [0, 1)"
    if not is_ratio and kind != "temperature" and not SI_RANGE[0] <= result <= SI_RANGE[1]:
        return (f"'{spec}' would become {result:.4g} (SI) at this {noun}; it must stay above zero and within "
                f"the range specgen computes with ({SI_RANGE[0]:g} to {SI_RANGE[1]:g})")
    return None


def _walk(machine: Machine, path: tuple) -> tuple[tuple, object, str | None]:
    """The model steps of a spec path, the value found there, and a sentence if there is no such place."""
    node, steps, i = machine, [], 0
    while i < len(path):
        part = path[i]
        if isinstance(node, tuple) and not all(hasattr(x, "id") for x in node):
            # pairs (a mode's running drives, its prime-mover speeds): not a value a corner or variant moves
            return (), None, f"'{'.'.join(path)}' cannot be moved here: change it in the spec itself"
        if isinstance(node, tuple):  # a section keyed by id: supplies, drives
            match = next((x for x in node if getattr(x, "id", None) == part), None)
            if match is None:
                known = ", ".join(x.id for x in node)
                return (), None, f"'{'.'.join(path)}' names '{part}', which is not defined (here: {known})"
            steps.append(("id", part))
            node, i = match, i + 1
            continue
        if node is None:
            return (), None, f"'{'.'.join(path[:i])}' is not given in the spec, so '{'.'.join(path)}' cannot be moved"
        if part == getattr(node, "model", None) and not hasattr(node, part) and hasattr(node, "__dataclass_fields__"):
            i += 1  # a load block's model key (load.wheel.grade): the model's fields sit on the load itself
            continue
        if part == "efficiency" and i + 1 < len(path) and hasattr(node, "volumetric_efficiency") \
                and hasattr(node, "starting_efficiency"):
            name, i = f"{path[i + 1]}_efficiency", i + 2  # motor efficiency.volumetric -> volumetric_efficiency
        else:
            name, i = _RENAMED.get(part, part), i + 1
        if not hasattr(node, name):
            return (), None, f"'{'.'.join(path)}' is not a field specgen can move"
        steps.append(("attr", name))
        node = getattr(node, name)
    return tuple(steps), node, None
