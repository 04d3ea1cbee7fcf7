"""Validate a loaded spec and build its SI model, topic by topic.

Order: counts, JSON Schema (structure, names, enums) and text -> quantities (units, dimension,
sign) and the relations between them, built by topic (fluid, supplies, drives with their loads,
modes, thresholds, sizing, cooler) -> references (supply, drive and duty point ids) -> the
directions the loads decide. Every problem in a stage is reported together.
"""

from __future__ import annotations

import re
from dataclasses import replace
from typing import Callable

from specgen.errors import Problem, SpecError
from specgen.intake import defaults, schema
from specgen.intake.build_corners import Corner, build_corners
from specgen.intake.build_drives import build_drive, check_targets
from specgen.intake.build_cycles import build_cycles, build_max_oil_temperature
from specgen.intake.build_fluid import build_cooler, build_fluid, build_reservoir
from specgen.intake.build_prime_movers import build_prime_movers, check_prime_mover_references
from specgen.intake.build_sizing import build_sizing
from specgen.intake.build_supplies import build_supply, ls_references
from specgen.intake.build_travel import build_travel
from specgen.intake.build_variants import Variant, build_variants, written_out
from specgen.intake.model import Machine, Mode, Ratio, Thresholds
from specgen.intake.quantities import Builder
from specgen.intake.read import Source, problem
from specgen.intake.schema import dotted

# How many of each a spec may hold. A real machine has a few supplies, tens of drives and modes;
# the limits keep the computation (modes x supplies x running drives) and the report bounded.
# A plant-sized spec of 1,000 drives must still check in seconds (python -m specgen.bench).
MAX_COUNT = {"supplies": 50, "drives": 1000, "modes": 200}
MAX_DUTY_POINTS = 50  # per drive

# Decides each duty point's direction from its load's sign: returns the machine with every
# direction decided and the contradictions found, as (path in the spec, sentence).
Directions = Callable[[Machine], "tuple[Machine, list[tuple[tuple, str]]]"]


def check_counts(source: Source) -> list[Problem]:
    """Refuse more supplies, drives, modes or duty points than MAX_COUNT / MAX_DUTY_POINTS allow."""
    problems = []
    d = source.data
    for key, limit in MAX_COUNT.items():
        if isinstance(d.get(key), dict) and len(d[key]) > limit:
            problems.append(problem(source.location((key,)), key,
                                    f"{len(d[key])} {key} given; a spec may hold at most {limit}"))
    drives = d.get("drives")
    for did, dr in (drives.items() if isinstance(drives, dict) and len(drives) <= MAX_COUNT["drives"] else ()):
        duties = dr.get("duty_points") if isinstance(dr, dict) else None
        if isinstance(duties, dict) and len(duties) > MAX_DUTY_POINTS:
            path = ("drives", did, "duty_points")
            problems.append(problem(source.location(path), dotted(path),
                                    f"{len(duties)} duty points given; a drive may hold at most {MAX_DUTY_POINTS}"))
    return problems


def _order(p: Problem) -> tuple:
    return (p.location.line, p.location.column, p.path, p.message)


# Characters no spec text needs that a terminal or an editor obeys: C0/C1 controls (ANSI escape
# sequences start with ESC) and the bidirectional overrides that make text read other than it runs.
_HIDDEN = re.compile("[\x00-\x08\x0b-\x1f\x7f-\x9f\u202a-\u202e\u2066-\u2069]")


def check_text(source: Source) -> list[Problem]:
    """Refuse control characters in any key or text of the spec (line breaks and tabs excepted)."""
    problems = []

    def walk(node, path):
        items = node.items() if isinstance(node, dict) else enumerate(node) if isinstance(node, list) else ()
        for key, value in items:
            here = path + (key,)
            for text in (key, value):
                found = _HIDDEN.search(text) if isinstance(text, str) else None
                if found:
                    problems.append(problem(source.location(here), dotted(here),
                                            f"contains control character U+{ord(found.group()):04X}; "
                                            "text in a spec must be printable"))
                    break
            walk(value, here)

    walk(source.data, ())
    return problems


def check_schema(source: Source) -> list[Problem]:
    problems = []
    for error in schema.validator().iter_errors(source.data):
        path, message = schema.message(error)
        problems.append(problem(source.location(path), dotted(path), message))
    return sorted(problems, key=lambda p: (p.location.line, p.location.column, p.path, p.message))


def build(source: Source, directions: Directions, allow_outside_files: bool = False) -> Machine:
    """Validate ``source`` completely and return its model. Raises SpecError listing every problem."""
    return build_with_corners(source, directions, allow_outside_files)[0]


def build_with_corners(source: Source, directions: Directions,
                       allow_outside_files: bool = False) -> tuple[Machine, tuple[Corner, ...]]:
    """The model and its operating corners (build_design without the variants)."""
    return build_design(source, directions, allow_outside_files)[:2]


def build_design(source: Source, directions: Directions, allow_outside_files: bool = False,
                 screened: bool = False) -> tuple[Machine, tuple[Corner, ...], tuple[Variant, ...]]:
    """Validate ``source`` completely and return its model and its operating corners (each override
    parsed once, against the model). Raises SpecError listing every problem.

    ``directions`` decides each duty point's direction from its load (the load's sign is a relation
    of the trade, computed where the spec is resolved). Files the spec names (a sizing parts file)
    must lie in the spec's folder tree unless ``allow_outside_files``. Design variants
    (build_variants.py) come last, each replacement read once against the built model."""
    # ``screened``: data already counted, schema-checked and screened, changed since only at leaves of the
    # same type (a variant's numbers and quantities written in): the builders' rules still run in full
    problems = [] if screened else \
        check_counts(source) or sorted(check_schema(source) + check_text(source), key=_order)
    if problems:
        raise SpecError(problems)
    b = Builder(source)
    d = source.data
    machine = d["machine"]
    fluid = build_fluid(b, d.get("fluid"))
    supplies = tuple(build_supply(b, sid, s, fluid) for sid, s in d["supplies"].items())
    series = {s.id for s in supplies if s.circuit == "series"}
    drives = tuple(build_drive(b, did, dr, dr["supply"] in series, fluid) for did, dr in d["drives"].items())
    modes = tuple(Mode(id=mid, title=m.get("title", mid), running=tuple(m["drives"].items()),
                       continuous=m.get("continuous", False),
                       prime_mover_speeds=tuple((m.get("prime_mover_speeds") or {}).items()))
                  for mid, m in d["modes"].items())
    travel, drives = build_travel(b, d.get("travel"), drives, modes)
    t = d.get("thresholds", {})
    thresholds = Thresholds(**{
        k: b.ratio(t, k, ("thresholds",), v, efficiency=False) for k, v in defaults.THRESHOLDS.items()
    }, counterbalance_factor=_counterbalance_factor(b, t))
    model = Machine(
        id=machine["id"], title=machine["title"], revision=str(machine["revision"]),
        description=machine.get("description", ""), display_units=machine.get("display_units", "SI"),
        page_size=machine.get("page_size", "A4"), signoff=dict(machine.get("signoff", {})),
        document_number=machine.get("document_number", ""),
        fluid=fluid, supplies=supplies, drives=drives, modes=modes, thresholds=thresholds,
        sizing=build_sizing(b, d.get("sizing"), allow_outside_files, drives), cooler=build_cooler(b, d.get("cooler")),
        reservoir=build_reservoir(b, d.get("reservoir"), fluid), duty_cycles=build_cycles(b, d.get("duty_cycles")),
        ambient_temperature=b.quantity(d, "ambient_temperature", (), "temperature", sign="any"),
        max_oil_temperature=build_max_oil_temperature(b, d),
        prime_movers=build_prime_movers(b, d), travel=travel,
    )
    _references(b, d)
    ls_references(b, d)
    check_prime_mover_references(b, d)
    model = _named_tables(b, d, model)
    model, contradictions = directions(model)
    for path, message in contradictions:
        b.fail(path, message)
    check_targets(b, model.drives)
    corners = build_corners(b, d, model) if "corners" in d or d.get("typical_corners") else ()
    variants = build_variants(b, d, model, directions) if "variants" in d and not b.problems else ()
    for v in variants:
        _variant_keeps_the_rules(b, source, v.id, directions, allow_outside_files)
    if b.problems:
        raise SpecError(sorted(b.problems, key=lambda p: (p.location.line, p.location.column, p.path)))
    return model, corners, variants


def _variant_keeps_the_rules(b: Builder, source: Source, vid: str, directions: Directions,
                             allow_outside_files: bool) -> None:
    """A variant is a design of its own: written out as a spec (its replacements in place), it must keep
    every rule the base spec keeps (a load-sensing pump needs its margin, a supply names a prime mover
    that exists, a charge pressure stays under the reliefs...), or the variant is refused at its key."""
    data = written_out(source.data, vid)
    written = Source(source.name, data, b"")
    base = {k: v for k, v in source.data.items() if k != "variants"}
    try:
        build_design(written, directions, allow_outside_files, screened=_same_shape(base, data))
    except SpecError as e:
        first = e.problems[0]
        b.fail(("variants", vid, "set"), f"with this variant the spec breaks a rule at {first.path}: {first.message}")


def _same_shape(a, b) -> bool:
    """Do ``a`` and ``b`` hold the same keys throughout, with leaves of the same type (text for text,
    number for number)? Then the schema's verdict on ``a`` holds for ``b`` but for the leaves' own
    values, which a variant reads by their kind and choices."""
    if isinstance(a, dict) and isinstance(b, dict):
        return a.keys() == b.keys() and all(_same_shape(a[k], b[k]) for k in a)
    if isinstance(a, list) and isinstance(b, list):
        return len(a) == len(b) and all(_same_shape(x, y) for x, y in zip(a, b))
    if isinstance(a, bool) or isinstance(b, bool):
        return isinstance(a, bool) and isinstance(b, bool)
    if isinstance(a, (int, float)) and isinstance(b, (int, float)):
        return True
    return type(a) is type(b) and isinstance(a, str)


def _named_tables(b: Builder, d: dict, model: Machine) -> Machine:
    """Motors that name an efficiency table get it from the sizing parts file's efficiency_tables."""
    tables = model.sizing.tables or {}
    drives = []
    for drive in model.drives:
        name = d["drives"][drive.id]["motor"].get("efficiency_table")
        if isinstance(name, str):
            if name in tables:
                drive = replace(drive, motor=replace(drive.motor, efficiency_table=tables[name]))
            elif model.sizing.parts_file and model.sizing.stock is not None:
                b.fail(("drives", drive.id, "motor", "efficiency_table"),
                       f"parts file '{model.sizing.parts_file}' has no efficiency table '{name}'"
                       + (f" (it has: {', '.join(tables)})" if tables else ""))
            elif not model.sizing.parts_file:
                b.fail(("drives", drive.id, "motor", "efficiency_table"),
                       f"efficiency table '{name}' is named, but the spec gives no sizing.parts_file to find it in")
        drives.append(drive)
    return replace(model, drives=tuple(drives))


def _counterbalance_factor(b: Builder, t: dict) -> Ratio:
    if "counterbalance_factor" not in t:
        return Ratio(defaults.COUNTERBALANCE_FACTOR)
    here = ("thresholds", "counterbalance_factor")
    value = b.parse(t["counterbalance_factor"], "ratio", here)
    if value is None:
        return Ratio(defaults.COUNTERBALANCE_FACTOR)
    if not 1 <= value <= 10:
        b.fail(here, f"{t['counterbalance_factor']!r} must lie from 1 to 10, e.g. 1.3")
    return Ratio(value)


def _references(b: Builder, d: dict) -> None:
    supplies, drives = d["supplies"], d["drives"]
    fed = {dr["supply"] for dr in drives.values()}
    # a drive naming an unknown supply is reported on its own: the supply it meant may be the one left bare
    named = all(dr["supply"] in supplies for dr in drives.values())
    for sid, s in supplies.items():
        if named and sid not in fed and "feeds" not in s:
            b.fail(("supplies", sid), f"supply '{sid}' feeds no drive; give it a drive, remove it, or say what it "
                                      "supplies outside the spec with feeds: <text> (e.g. a charge circuit)")
    for did, dr in drives.items():
        if dr["supply"] not in supplies:
            b.fail(("drives", did, "supply"),
                   f"drive '{did}' names supply '{dr['supply']}', which is not defined (supplies: {', '.join(supplies)})")
    for mid, m in d["modes"].items():
        for did, uid in m["drives"].items():
            here = ("modes", mid, "drives", did)
            if did not in drives:
                b.fail(here, f"mode '{mid}' names drive '{did}', which is not defined (drives: {', '.join(drives)})")
            elif uid not in drives[did]["duty_points"]:
                known = ", ".join(drives[did]["duty_points"])
                b.fail(here, f"mode '{mid}' runs drive '{did}' at duty point '{uid}', which drive '{did}' does not define (its duty points: {known})")
    for cid, c in (d.get("duty_cycles") or {}).items():
        for i, step in enumerate(c["steps"]):
            if step["mode"] not in d["modes"]:
                b.fail(("duty_cycles", cid, "steps", i, "mode"),
                       f"duty cycle '{cid}' names mode '{step['mode']}', which is not defined "
                       f"(modes: {', '.join(d['modes'])})")
