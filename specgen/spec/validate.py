"""Validate a loaded spec in one place and build the SI model from it.

Order: JSON Schema (structure, names, enums) -> quantities (units, dimension, sign) ->
references (supply, drive and duty point ids). Every problem in a stage is reported together.
"""

from __future__ import annotations

import json
import math
from functools import lru_cache

from specgen import units
from specgen.errors import Problem, SpecError
from specgen.resources import data_dir
from specgen.spec import defaults
from specgen.spec.load import Source
from specgen.spec.model import (
    Drive, DutyPoint, Fluid, GearStage, Machine, Mode, Motor, Pump, Rating, Ratio, Supply, Thresholds,
)

SCHEMA_FILE = "machine-spec.schema.json"


@lru_cache(maxsize=1)
def schema() -> dict:
    return json.loads((data_dir("schemas") / SCHEMA_FILE).read_text(encoding="utf-8"))


@lru_cache(maxsize=1)
def _validator():
    import jsonschema

    return jsonschema.Draft202012Validator(schema())


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
        return path, f"{_short(error.instance)} should be {error.validator_value}"
    if v == "pattern" and len(path) >= 1 and error.validator_value.startswith("^[A-Za-z]"):
        return path, f"'{error.instance}' is not a valid id (letters, digits, '-' and '_', starting with a letter)"
    if v == "propertyNames":
        return path, f"'{error.instance}' is not a valid id (letters, digits, '-' and '_', starting with a letter)"
    if v == "const":
        return path, f"{_short(error.instance)} is not supported; this version of specgen reads format {error.validator_value}"
    return path, error.message


def _short(value) -> str:
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def check_schema(source: Source) -> list[Problem]:
    problems = []
    for error in _validator().iter_errors(source.data):
        path, message = _schema_message(error)
        problems.append(Problem(source.location(path), dotted(path), message))
    return sorted(problems, key=lambda p: (p.location.line, p.location.column, p.path, p.message))


class _Builder:
    """Reads quantities out of schema-valid data, collecting every problem instead of stopping."""

    def __init__(self, source: Source):
        self.source = source
        self.problems: list[Problem] = []

    def fail(self, path: tuple, message: str) -> None:
        self.problems.append(Problem(self.source.location(path), dotted(path), message))

    def quantity(self, data: dict, key: str, path: tuple, kind: str, sign: str = "positive",
                 default: float | None = None) -> float | None:
        """Parse data[key] as ``kind``; sign is 'positive', 'nonnegative' or 'any'."""
        if key not in data:
            return default
        here = path + (key,)
        try:
            value = units.parse(data[key], kind)
        except units.UnitProblem as exc:
            self.fail(here, str(exc))
            return default if default is not None else math.nan
        if sign == "positive" and value <= 0:
            self.fail(here, f"'{data[key]}' must be greater than zero")
        elif sign == "nonnegative" and value < 0:
            self.fail(here, f"'{data[key]}' must not be negative")
        return value

    def ratio(self, data: dict, key: str, path: tuple, default: float, basis: str = "",
              efficiency: bool = True) -> Ratio:
        if key not in data:
            return Ratio(default, assumed=bool(basis), basis=basis)
        here = path + (key,)
        try:
            value = units.parse(data[key], "ratio")
        except units.UnitProblem as exc:
            self.fail(here, str(exc))
            return Ratio(default)
        if efficiency and not 0 < value <= 1:
            self.fail(here, f"efficiency {data[key]!r} must lie in (0, 1], e.g. 0.92 or '92 %'")
        elif not efficiency and not 0 <= value < 1:
            self.fail(here, f"{data[key]!r} must lie in [0, 1), e.g. 0.1 or '10 %'")
        return Ratio(value)


def build(source: Source) -> Machine:
    """Validate ``source`` completely and return its model. Raises SpecError listing every problem."""
    problems = check_schema(source)
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
    _references(b, d)
    if b.problems:
        raise SpecError(sorted(b.problems, key=lambda p: (p.location.line, p.location.column, p.path)))
    return Machine(
        id=machine["id"], title=machine["title"], revision=str(machine["revision"]),
        description=machine.get("description", ""), display_units=machine.get("display_units", "SI"),
        page_size=machine.get("page_size", "A4"), signoff=dict(machine.get("signoff", {})),
        fluid=fluid, supplies=supplies, drives=drives, modes=modes, thresholds=thresholds,
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
    if relief is not None and ret is not None and ret >= relief:
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
    disp = m["displacement"]
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
        if g["ratio"] <= 0 or not math.isfinite(g["ratio"]):
            b.fail(gpath + ("ratio",), f"gear ratio {g['ratio']!r} must be a finite number above zero")
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
