"""Validate a loaded spec in one place and build the SI model from it.

Order: JSON Schema (structure, names, enums) -> quantities (units, dimension, sign) ->
references (supply, drive and duty point ids). Every problem in a stage is reported together.
"""

from __future__ import annotations

import json
import math
import re
from functools import lru_cache

from specgen import units
from specgen.errors import Problem, SpecError
from specgen.resources import data_dir
from specgen.intake import build_depth, defaults
from specgen.intake.read import Source, problem
from specgen.intake.model import (
    Drive, DutyPoint, Fluid, GearStage, Machine, Mode, Motor, Pump, Rating, Ratio, Supply, Thresholds,
)

SCHEMA_FILE = "machine-spec.schema.json"

# How many of each a spec may hold. A real machine has a few supplies, tens of drives and modes;
# the limits keep the computation (modes x supplies x running drives) and the report bounded.
# A plant-sized spec of 1,000 drives must still check in seconds (python -m specgen.bench).
MAX_COUNT = {"supplies": 50, "drives": 1000, "modes": 200}
MAX_DUTY_POINTS = 50  # per drive

# Every SI value a quantity may take (Pa, m^3/rev, rev/s, N*m, W, K, kg/m^3): wide enough for any
# machine, narrow enough that products and quotients of a few of them stay finite floats.
SI_RANGE = (1e-12, 1e12)
MIN_EFFICIENCY = 0.01  # below 1 % no motor, pump or gear stage does useful work: a typing slip
GEAR_RANGE = (1e-3, 1e6)

# A unit power must sit on a unit name and be a small number: pint evaluates the text as
# arithmetic, and "9**9**9 bar" or "((9^9)^9)^9 bar" would run for hours.
_POWER = re.compile(r"(\*\*|\^)")
_LEADING_NUMBER = re.compile(r"\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*")
_POWER_OK = re.compile(r"[A-Za-z_%]\s*(?:\*\*|\^)\s*[-+]?\d(?:\.\d+)?(?![\d.]|\s*(?:\*\*|\^))")


@lru_cache(maxsize=1)
def schema() -> dict:
    return json.loads((data_dir("schemas") / SCHEMA_FILE).read_text(encoding="utf-8"))


@lru_cache(maxsize=1)
def _validator():
    import jsonschema

    from specgen.intake.schema_refs import inline_local_refs

    # Same verdicts and messages as the schema as written, without a reference lookup per value.
    return jsonschema.Draft202012Validator(inline_local_refs(schema()))


def dotted(path) -> str:
    return ".".join(str(p) for p in path)


def _schema_message(error) -> tuple[tuple, str]:
    """A plain sentence for one schema error, and the path it belongs to."""
    path = tuple(error.absolute_path)
    v = error.validator
    if v == "additionalProperties":
        extra = sorted(set(error.instance) - set(error.schema.get("properties", {})))
        known = ", ".join(sorted(error.schema.get("properties", {}))) or "none"
        if extra:
            return path + (extra[0],), f"unknown key '{extra[0]}' (allowed here: {known})"
    if v == "required":
        return path, error.message.replace("is a required property", "is required here")
    if v == "enum":
        allowed = ", ".join(str(x) for x in error.validator_value)
        return path, f"{error.instance!r} is not one of: {allowed}"
    if v == "oneOf" or v == "anyOf":
        desc = error.schema.get("description", "")
        return path, f"{_short(error.instance)} does not fit. {desc}".strip()
    if v == "type":
        example = _example(error.schema_path)
        if example and isinstance(error.instance, (int, float)) and not isinstance(error.instance, bool):
            return path, f"'{error.instance}' has no unit; write it with its unit, e.g. '{example}'"
        return path, f"{_short(error.instance)} should be {_type_words(error.validator_value)}"
    if v == "pattern" and len(path) >= 1 and error.validator_value.startswith("^[A-Za-z]"):
        if "propertyNames" in error.schema_path:  # an id used as a key: point at the key itself
            path = path + (error.instance,)
        return path, f"'{error.instance}' is not a valid id (letters, digits, '-' and '_', starting with a letter)"
    if v == "propertyNames":  # point at the offending key itself
        return path + (error.instance,), f"'{error.instance}' is not a valid id (letters, digits, '-' and '_', starting with a letter)"
    if v == "maxLength":
        return path, f"text of {len(error.instance)} characters is longer than the {error.validator_value} allowed here"
    if v in ("minLength", "minProperties"):
        return path, "is empty; at least one entry is needed here" if v == "minProperties" else "must not be empty"
    if v == "const":
        return path, f"{_short(error.instance)} is not supported; this version of specgen reads format {error.validator_value}"
    return path, error.message


def _example(schema_path) -> str | None:
    """The nearest 'examples' entry on the way to a schema error: set on every quantity field."""
    node, found = _validator().schema, None  # the schema the path was taken in (refs inlined)
    for part in schema_path:
        if isinstance(node, dict) and "examples" in node:
            found = node["examples"][0]
        try:
            node = node[part]
        except (KeyError, IndexError, TypeError):
            return found
        while isinstance(node, dict) and "$ref" in node and part != "$ref":
            if "examples" in node:
                found = node["examples"][0]
            node = _resolve(node["$ref"])
    return found


def _resolve(ref: str) -> dict:
    node = _validator().schema
    for part in ref.lstrip("#/").split("/"):
        node = node[part]
    return node


def _type_words(expected) -> str:
    words = {"string": "text", "object": "a mapping of keys", "array": "a list", "number": "a number",
             "integer": "a whole number", "boolean": "true or false"}
    names = expected if isinstance(expected, list) else [expected]
    return " or ".join(words.get(n, n) for n in names)


def _short(value) -> str:
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


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


def screen_quantity(text: object) -> str | None:
    """Why quantity text is refused before pint evaluates it, or None when it is safe to read."""
    if not isinstance(text, str):
        return None
    number = _LEADING_NUMBER.match(text)
    if number and text[number.end():number.end() + 1] in tuple("0123456789."):
        return f"'{text}' holds more than one number; write one number and its unit, e.g. '250 bar'"
    powers = len(_POWER.findall(text))
    if powers and len(_POWER_OK.findall(text)) != powers:
        return (f"'{text}' uses a power specgen does not read; put a small whole power straight on a unit, "
                "e.g. 'cm^3' or 'm/s^2'")
    return None


def check_schema(source: Source) -> list[Problem]:
    problems = []
    for error in _validator().iter_errors(source.data):
        path, message = _schema_message(error)
        problems.append(problem(source.location(path), dotted(path), message))
    return sorted(problems, key=lambda p: (p.location.line, p.location.column, p.path, p.message))


class _Builder:
    """Reads quantities out of schema-valid data, collecting every problem instead of stopping."""

    def __init__(self, source: Source):
        self.source = source
        self.problems: list[Problem] = []

    def fail(self, path: tuple, message: str) -> None:
        self.problems.append(problem(self.source.location(path), dotted(path), message))

    def quantity(self, data: dict, key: str, path: tuple, kind: str, sign: str = "positive",
                 default: float | None = None) -> float | None:
        """Parse data[key] as ``kind``; sign is 'positive', 'nonnegative' or 'any'."""
        if key not in data:
            return default
        here = path + (key,)
        value = self._parse(data[key], kind, here)
        if value is None:
            return default if default is not None else math.nan
        if sign == "positive" and value <= 0:
            self.fail(here, f"'{data[key]}' must be greater than zero")
        elif sign == "nonnegative" and value < 0:
            self.fail(here, f"'{data[key]}' must not be negative")
        elif value != 0 and not SI_RANGE[0] <= abs(value) <= SI_RANGE[1]:
            unit = units.KINDS[kind].si_unit.replace("**", "^")
            self.fail(here, f"'{data[key]}' is outside the range specgen computes with "
                            f"({SI_RANGE[0]:g} to {SI_RANGE[1]:g} {unit}); check the number and its unit")
        return value

    def _parse(self, text: object, kind: str, here: tuple) -> float | None:
        refused = screen_quantity(text)
        if refused:
            self.fail(here, refused)
            return None
        try:
            return units.parse(text, kind)
        except units.UnitProblem as exc:
            self.fail(here, str(exc))
        except ArithmeticError:  # pint turns long digit strings into ints too large for a float
            self.fail(here, f"'{text}' is too large a number to compute with")
        return None

    def ratio(self, data: dict, key: str, path: tuple, default: float, basis: str = "",
              efficiency: bool = True) -> Ratio:
        if key not in data:
            return Ratio(default, assumed=bool(basis), basis=basis)
        here = path + (key,)
        value = self._parse(data[key], "ratio", here)
        if value is None:
            return Ratio(default)
        if efficiency and not 0 < value <= 1:
            self.fail(here, f"efficiency {data[key]!r} must lie in (0, 1], e.g. 0.92 or '92 %'")
        elif efficiency and value < MIN_EFFICIENCY:
            self.fail(here, f"efficiency {data[key]!r} is below {MIN_EFFICIENCY * 100:g} %; no working motor, pump "
                            "or gear stage is that poor: check the figure")
        elif not efficiency and not 0 <= value < 1:
            self.fail(here, f"{data[key]!r} must lie in [0, 1), e.g. 0.1 or '10 %'")
        return Ratio(value)


def build(source: Source, allow_outside_files: bool = False) -> Machine:
    """Validate ``source`` completely and return its model. Raises SpecError listing every problem.

    Files the spec names (a sizing parts file) must lie in the spec's folder tree unless
    ``allow_outside_files``."""
    problems = check_counts(source) or sorted(check_schema(source) + check_text(source), key=_order)
    if problems:
        raise SpecError(problems)
    b = _Builder(source)
    d = source.data
    machine = d["machine"]
    fluid = _fluid(b, d.get("fluid"))
    supplies = tuple(_supply(b, sid, s) for sid, s in d["supplies"].items())
    drives = tuple(_drive(b, did, dr) for did, dr in d["drives"].items())
    modes = tuple(_mode(b, mid, m) for mid, m in d["modes"].items())
    t = d.get("thresholds", {})
    thresholds = Thresholds(**{
        k: b.ratio(t, k, ("thresholds",), v, efficiency=False) for k, v in defaults.THRESHOLDS.items()
    })
    fluid, supplies, drives, extras = build_depth.extend(b, d, fluid, supplies, drives, allow_outside_files)
    _references(b, d)
    if b.problems:
        raise SpecError(sorted(b.problems, key=lambda p: (p.location.line, p.location.column, p.path)))
    return Machine(
        id=machine["id"], title=machine["title"], revision=str(machine["revision"]),
        description=machine.get("description", ""), display_units=machine.get("display_units", "SI"),
        page_size=machine.get("page_size", "A4"), signoff=dict(machine.get("signoff", {})),
        fluid=fluid, supplies=supplies, drives=drives, modes=modes, thresholds=thresholds, **extras,
    )


def _fluid(b: _Builder, f: dict | None) -> Fluid | None:
    if f is None:
        return None
    path = ("fluid",)
    temperature = b.quantity(f, "temperature", path, "temperature", sign="any")
    if "density" in f:
        density = Ratio(b.quantity(f, "density", path, "density"))
    else:
        density = Ratio(defaults.OIL_DENSITY, assumed=True, basis=defaults.OIL_BASIS)
    return Fluid(iso_vg=f["iso_vg"], temperature=temperature, density=density)


def _supply(b: _Builder, sid: str, s: dict) -> Supply:
    path = ("supplies", sid)
    p, ppath = s["pump"], path + ("pump",)
    pump = Pump(
        displacement=b.quantity(p, "displacement", ppath, "displacement"),
        shaft_speed=b.quantity(p, "shaft_speed", ppath, "speed"),
        delivery=b.quantity(p, "delivery", ppath, "flow"),
        volumetric_efficiency=b.ratio(p, "volumetric_efficiency", ppath, defaults.PUMP_VOLUMETRIC, defaults.PUMP_BASIS),
        overall_efficiency=b.ratio(p, "overall_efficiency", ppath, defaults.PUMP_OVERALL, defaults.PUMP_BASIS),
    )
    if "delivery" in p and "volumetric_efficiency" not in p:
        # a delivered flow already includes leakage; no assumption is made about it
        pump = Pump(pump.displacement, pump.shaft_speed, pump.delivery, Ratio(1.0), pump.overall_efficiency)
    relief = b.quantity(s, "relief_setting", path, "pressure")
    ret = b.quantity(s, "return_pressure", path, "pressure", sign="nonnegative", default=0.0)
    if relief is not None and relief > 0 and ret is not None and ret >= relief:  # relief <= 0 is reported already
        b.fail(path + ("return_pressure",), "return pressure must be below the relief setting")
    return Supply(
        id=sid, title=s.get("title", sid), pump=pump, relief_setting=relief, return_pressure=ret,
        prime_mover_power=b.quantity(s, "prime_mover_power", path, "power"),
    )


def _motor(b: _Builder, m: dict, path: tuple) -> Motor:
    kind = m["kind"]
    ev, ehm, est = defaults.MOTOR_EFFICIENCY[kind]
    basis = defaults.MOTOR_BASIS.format(kind=kind.replace("_", " "))
    eff, epath = m.get("efficiency", {}), path + ("efficiency",)
    disp = m.get("displacement", {})  # left out: build_depth proposes one from target_pressure
    if isinstance(disp, dict):
        lo = b.quantity(disp, "min", path + ("displacement",), "displacement")
        hi = b.quantity(disp, "max", path + ("displacement",), "displacement")
        if lo is not None and hi is not None and lo > hi:
            b.fail(path + ("displacement", "min"), "minimum displacement is larger than the maximum")
        over = bool(disp.get("over_centre", False))
    else:
        lo = hi = b.quantity(m, "displacement", path, "displacement")
        over = False
    r, rpath = m.get("rating", {}), path + ("rating",)
    rating = Rating(**{
        key: b.quantity(r, key, rpath, "speed" if key.endswith("speed") else "pressure")
        for key in ("continuous_pressure", "peak_pressure", "min_speed", "max_speed",
                    "max_outlet_pressure", "max_case_pressure")
    })
    if rating.min_speed and rating.max_speed and rating.min_speed >= rating.max_speed:
        b.fail(rpath + ("min_speed",), "minimum speed rating must be below the maximum")
    return Motor(
        kind=kind, model=m.get("model", ""), displacement_min=lo, displacement_max=hi, over_centre=over,
        volumetric_efficiency=b.ratio(eff, "volumetric", epath, ev, basis),
        hydromechanical_efficiency=b.ratio(eff, "hydromechanical", epath, ehm, basis),
        starting_efficiency=b.ratio(eff, "starting", epath, est, basis),
        rating=rating, case_drain=bool(m.get("case_drain", False)),
    )


def _drive(b: _Builder, did: str, dr: dict) -> Drive:
    path = ("drives", did)
    gear = None
    if "gear_stage" in dr:
        g, gpath = dr["gear_stage"], path + ("gear_stage",)
        if not GEAR_RANGE[0] <= g["ratio"] <= GEAR_RANGE[1]:  # also refuses NaN
            b.fail(gpath + ("ratio",), f"gear ratio {g['ratio']!r} must be a number from {GEAR_RANGE[0]:g} "
                                       f"to {GEAR_RANGE[1]:g} (motor speed / load speed)")
        gear = GearStage(ratio=float(g["ratio"]),
                         efficiency=b.ratio(g, "efficiency", gpath, defaults.GEAR_EFFICIENCY, defaults.GEAR_BASIS))
    duties = []
    for uid, u in dr["duty_points"].items():
        upath = path + ("duty_points", uid)
        duties.append(DutyPoint(
            id=uid, title=u.get("title", uid),
            torque=b.quantity(u, "torque", upath, "torque", sign="nonnegative"),
            speed=b.quantity(u, "speed", upath, "speed"),
            direction=u.get("direction", "driving"),
            starting_torque=b.quantity(u, "starting_torque", upath, "torque", sign="nonnegative"),
        ))
    return Drive(
        id=did, title=dr.get("title", did), supply=dr["supply"], motor=_motor(b, dr["motor"], path + ("motor",)),
        gear=gear, back_pressure=b.quantity(dr, "back_pressure", path, "pressure", sign="nonnegative"),
        case_pressure=b.quantity(dr, "case_pressure", path, "pressure", sign="nonnegative"),
        load_holding=dr.get("load_holding"), duty_points=tuple(duties), notes=dr.get("notes", ""),
    )


def _mode(b: _Builder, mid: str, m: dict) -> Mode:
    return Mode(id=mid, title=m.get("title", mid), running=tuple(m["drives"].items()))


def _references(b: _Builder, d: dict) -> None:
    supplies, drives = d["supplies"], d["drives"]
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
