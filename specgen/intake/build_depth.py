"""Validate and build the engineering-depth parts of a spec: load models, inertia, variable-motor
settings, sizing and parts files, circuits, pump control, prime mover speed, lines, fluid and cooler.

Called by validate.build after the spine's supplies and drives are built; it reads the same
schema-valid data, reports problems through the same builder (so every message keeps the
``file:line:col: dotted.path: sentence`` form) and returns the model objects with their new
fields filled in. Quantities are SI floats; every one is checked by kind and sign here.
"""

from __future__ import annotations

import math
import os
from dataclasses import replace
from pathlib import Path

from specgen.calc import fluid as fluid_calc
from specgen.calc import loads
from specgen.errors import Problem, SpecError
from specgen.intake import defaults
from specgen.intake.model import (
    BeltLoad, Cooler, Drive, DutyPoint, Fluid, Inertia, Line, Lines, Sizing, SpeedSquaredLoad, Supply,
    WheelLoad, WinchLoad,
)

PARTS_SCHEMA_FILE = "motor-parts.schema.json"
LOAD_MODELS = ("winch", "wheel", "belt", "speed_squared")


def extend(b, d: dict, fluid: Fluid | None, supplies: tuple[Supply, ...], drives: tuple[Drive, ...],
           allow_outside_files: bool = False) -> tuple[Fluid | None, tuple, tuple, dict]:
    """Fill in the depth fields of ``fluid``, ``supplies`` and ``drives``; return them with the
    machine-level extras (``sizing``, ``cooler``) as keyword arguments for Machine."""
    fluid = _fluid(b, d.get("fluid"), fluid)
    raw_supplies = d["supplies"]
    supplies = tuple(_supply(b, s, raw_supplies[s.id]) for s in supplies)
    viscosity_known = fluid is not None and _viscosity_known(fluid)
    series = {s.id for s in supplies if s.circuit == "series"}
    for s in supplies:
        if s.suction_line is not None and not viscosity_known:
            b.fail(("supplies", s.id, "suction_line"), _NEEDS_FLUID)
    built = []
    for drive in drives:
        raw = d["drives"][drive.id]
        built.append(_drive(b, drive, raw, raw["supply"] in series, viscosity_known))
    extras = {"sizing": _sizing(b, d.get("sizing"), allow_outside_files, built),
              "cooler": _cooler(b, d.get("cooler"))}
    return fluid, supplies, tuple(built), extras


_NEEDS_FLUID = ("lines need the fluid's viscosity and density: give the fluid block (iso_vg and temperature; "
                "for ISO VG 2, 3 and 5 also viscosity_100c)")


# --- fluid ------------------------------------------------------------------------------------


def _viscosity_known(f: Fluid) -> bool:
    if f.temperature is None or not math.isfinite(f.temperature):
        return False
    return f.viscosity_100c is not None or f.iso_vg in fluid_calc._TYPICAL_NU100_VI100_MM2S


def _fluid(b, raw: dict | None, f: Fluid | None) -> Fluid | None:
    if raw is None or f is None:
        return f
    path = ("fluid",)
    nu100 = b.quantity(raw, "viscosity_100c", path, "viscosity")
    if nu100 is not None and math.isfinite(nu100):
        nu40 = fluid_calc.iso_vg_midpoint_m2s(f.iso_vg)
        if nu100 >= nu40:
            b.fail(path + ("viscosity_100c",),
                   f"'{raw['viscosity_100c']}' is not below the grade's 40 degC viscosity ({nu40 * 1e6:g} mm^2/s); "
                   "oil thins as it warms")
            nu100 = None
        elif nu100 * 1e6 + fluid_calc.WALTHER_CONSTANT_MM2S <= 1.0:
            b.fail(path + ("viscosity_100c",), f"'{raw['viscosity_100c']}' is too thin for the ASTM D341 relation "
                                               "(needs more than 0.3 mm^2/s)")
            nu100 = None
    return replace(f, viscosity_100c=nu100)


# --- supplies ---------------------------------------------------------------------------------


def _supply(b, s: Supply, raw: dict) -> Supply:
    path = ("supplies", s.id)
    p, ppath = raw["pump"], path + ("pump",)
    control = p.get("control", "fixed")
    comp = b.quantity(p, "compensator_setting", ppath, "pressure")
    if control == "pressure_compensated":
        if comp is None:
            b.fail(ppath + ("control",), "a pressure-compensated pump needs compensator_setting")
        elif s.relief_setting is not None and comp >= s.relief_setting:
            b.fail(ppath + ("compensator_setting",),
                   "the compensator setting must be below the relief setting, or the relief valve dumps the flow")
        if "surplus_to" in raw:
            b.fail(path + ("surplus_to",), "a pressure-compensated pump delivers no surplus flow; remove surplus_to")
    elif comp is not None:
        b.fail(ppath + ("compensator_setting",), "compensator_setting applies only with control: pressure_compensated")
    pm_speed = b.quantity(raw, "prime_mover_speed", path, "speed")
    ratio = raw.get("drive_ratio")
    if ratio is not None and not math.isfinite(ratio):
        b.fail(path + ("drive_ratio",), f"drive ratio {ratio!r} must be a finite number above zero")
        ratio = None
    shaft = s.pump.shaft_speed
    if "displacement" in p and shaft is None and pm_speed is None:
        b.fail(ppath, "give the pump's shaft_speed, or the supply's prime_mover_speed (the pump then turns at "
                      "prime_mover_speed times drive_ratio)")
    if shaft is not None and pm_speed is not None and math.isfinite(shaft) and math.isfinite(pm_speed):
        implied = shaft / pm_speed
        if ratio is not None and abs(implied - ratio) > 1e-6 * ratio:
            b.fail(path + ("drive_ratio",),
                   f"pump shaft speed / prime mover speed is {implied:.4g}, not the drive ratio {ratio:g}; "
                   "give two of the three")
        ratio = implied if ratio is None else ratio
    surplus = raw.get("surplus_to", "working_pressure")
    oc = b.quantity(raw, "open_centre_pressure", path, "pressure")
    if surplus == "open_centre" and oc is None:
        b.fail(path + ("surplus_to",), "surplus_to: open_centre needs open_centre_pressure")
    elif surplus != "open_centre" and oc is not None:
        b.fail(path + ("open_centre_pressure",), "open_centre_pressure applies only with surplus_to: open_centre")
    elif oc is not None and s.relief_setting is not None and oc >= s.relief_setting:
        b.fail(path + ("open_centre_pressure",), "the open-centre pressure must be below the relief setting")
    return replace(
        s, pump=replace(s.pump, control=control, compensator_setting=comp),
        prime_mover_speed=pm_speed, drive_ratio=float(ratio) if ratio is not None else 1.0,
        circuit=raw.get("circuit", "parallel"), surplus_to=surplus, open_centre_pressure=oc,
        suction_line=_line(b, raw.get("suction_line"), path + ("suction_line",)),
    )


def _line(b, raw: dict | None, path: tuple) -> Line | None:
    if raw is None:
        return None
    return Line(
        inner_diameter=b.quantity(raw, "inner_diameter", path, "length"),
        length=b.quantity(raw, "length", path, "length", sign="nonnegative"),
        equivalent_length=b.quantity(raw, "equivalent_length", path, "length", sign="nonnegative", default=0.0),
        roughness=b.quantity(raw, "roughness", path, "length", sign="nonnegative", default=0.0),
    )


# --- drives -----------------------------------------------------------------------------------


def _drive(b, drive: Drive, raw: dict, on_series: bool, viscosity_known: bool) -> Drive:
    path = ("drives", drive.id)
    mraw, mpath = raw["motor"], path + ("motor",)
    motor = drive.motor
    target = b.quantity(mraw, "target_pressure", mpath, "pressure")
    if "displacement" not in mraw and target is None:
        b.fail(mpath, "give the motor's displacement, or target_pressure to have one proposed")
    if target is not None and math.isfinite(target):
        p_out = drive.back_pressure if drive.back_pressure is not None else None
        if p_out is not None and target <= p_out:
            b.fail(mpath + ("target_pressure",), "the target pressure must exceed the drive's back pressure")
    motor = replace(motor, target_pressure=target)
    if on_series and "back_pressure" in raw:
        b.fail(path + ("back_pressure",), "on a series supply the drives downstream set the back pressure; "
                                          "remove back_pressure (or give the supply's return_pressure)")
    lines = None
    if "lines" in raw:
        lpath = path + ("lines",)
        lines = Lines(pressure=_line(b, raw["lines"].get("pressure"), lpath + ("pressure",)),
                      ret=_line(b, raw["lines"].get("return"), lpath + ("return",)))
        if not viscosity_known:
            b.fail(lpath, _NEEDS_FLUID)
    duties = tuple(_duty(b, drive, u, raw["duty_points"][u.id], path + ("duty_points", u.id), motor)
                   for u in drive.duty_points)
    if target is not None and all(u.direction == "overrunning" for u in duties):
        b.fail(mpath + ("target_pressure",), "target_pressure sizes the motor for its driving duty points, "
                                             "and this drive has none; give the displacement")
    return replace(drive, motor=motor, duty_points=duties, lines=lines,
                   available_flow=b.quantity(raw, "available_flow", path, "flow"))


def _duty(b, drive: Drive, u: DutyPoint, raw: dict, path: tuple, motor) -> DutyPoint:
    load = None
    direction = u.direction
    if "load" in raw:
        given = [k for k in ("torque", "speed") if k in raw]
        if given:
            b.fail(path + (given[0],), "give torque and speed, or a load block, not both")
        models = list(raw["load"])
        if len(models) != 1:
            b.fail(path + ("load",), "give exactly one load model: " + ", ".join(LOAD_MODELS)
                   + (f" (found {', '.join(models)})" if models else ""))
        else:
            name = models[0]
            lpath = path + ("load", name)
            load = _LOAD_BUILDERS[name](b, raw["load"][name], lpath)
            direction = _direction(b, load, raw, path, direction)
    inertia = None
    if "inertia" in raw:
        i, ipath = raw["inertia"], path + ("inertia",)
        inertia = Inertia(
            load_inertia=b.quantity(i, "load_inertia", ipath, "inertia", sign="nonnegative"),
            ramp_time=b.quantity(i, "ramp_time", ipath, "time"),
            motor_inertia=b.quantity(i, "motor_inertia", ipath, "inertia", sign="nonnegative", default=0.0),
        )
    stated = b.quantity(raw, "displacement", path, "displacement")
    if stated is not None and math.isfinite(stated):
        lo, hi = motor.displacement_min, motor.displacement_max
        if lo is None or hi is None or lo == hi:
            b.fail(path + ("displacement",), "only a variable motor's displacement can be set per duty point; "
                                             "remove it or give the motor a {min, max} range")
        elif not lo * (1 - 1e-9) <= stated <= hi * (1 + 1e-9):
            b.fail(path + ("displacement",), "the displacement lies outside the motor's min to max range")
    return replace(u, load=load, inertia=inertia, displacement=stated, direction=direction)


def _direction(b, load, raw: dict, path: tuple, direction: str) -> str:
    """Wheel and belt loads carry their sign: a negative torque means the load drives the motor."""
    sign = _load_sign(load)
    if sign is None:
        return direction
    explicit = raw.get("direction")
    if sign < 0:
        if explicit == "driving":
            b.fail(path + ("direction",), "the load model gives a negative torque here (the load drives the "
                                          "motor, e.g. downhill); write direction: overrunning or leave it out")
        return "overrunning"
    if explicit == "overrunning":
        b.fail(path + ("direction",), "the load model gives a driving torque here; an overrunning "
                                      f"{load.model} load needs a negative force (downhill, braking)")
    return direction


def _load_sign(load) -> float | None:
    try:
        if isinstance(load, WheelLoad):
            return loads.tractive_force(load.vehicle_mass, load.rolling_resistance, load.grade, load.acceleration)
        if isinstance(load, BeltLoad):
            return load.belt_pull
    except (ValueError, TypeError):  # a bad input already has its own message
        return None
    return None


def _winch(b, w: dict, path: tuple) -> WinchLoad:
    return WinchLoad(
        line_pull=b.quantity(w, "line_pull", path, "force"),
        line_speed=b.quantity(w, "line_speed", path, "velocity"),
        drum_diameter=b.quantity(w, "drum_diameter", path, "length"),
        rope_diameter=b.quantity(w, "rope_diameter", path, "length"),
        layer=int(w.get("layer", 1)),
    )


def _wheel(b, w: dict, path: tuple) -> WheelLoad:
    c_rr = b.ratio(w, "rolling_resistance", path, 0.0, efficiency=False)
    return WheelLoad(
        vehicle_mass=b.quantity(w, "vehicle_mass", path, "mass"),
        rolling_resistance=c_rr.value,
        grade=_grade(b, w, path),
        rolling_radius=b.quantity(w, "rolling_radius", path, "length"),
        driven_wheels=int(w["driven_wheels"]),
        travel_speed=b.quantity(w, "travel_speed", path, "velocity"),
        acceleration=b.quantity(w, "acceleration", path, "acceleration", sign="any", default=0.0),
        grade_text=str(w.get("grade", "")),
    )


def _grade(b, w: dict, path: tuple) -> float:
    """A grade in percent ('8 %') or as an angle ('4 deg') -> angle in rad, positive uphill."""
    text, here = w["grade"], path + ("grade",)
    if not isinstance(text, str):
        b.fail(here, f"{text!r} has no unit; write the grade as a percentage ('8 %') or an angle ('4 deg')")
        return 0.0
    percent = "%" in text
    value = b._parse(text, "ratio" if percent else "angle", here)  # the builder's screened parse
    if value is None:
        last = b.problems[-1]
        b.problems[-1] = replace(last, message=last.message.split("; write it as")[0]
                                 + "; write the grade as a percentage ('8 %') or an angle ('4 deg')")
        return 0.0
    try:
        if percent:
            return loads.grade_angle_from_percent(value * 100.0)
        return loads.grade_angle_from_degrees(math.degrees(value))
    except ValueError as exc:
        b.fail(here, str(exc))
    return 0.0


def _belt(b, w: dict, path: tuple) -> BeltLoad:
    pull = b.quantity(w, "belt_pull", path, "force", sign="any")
    if pull == 0:
        b.fail(path + ("belt_pull",), "a belt pull of zero gives no torque; give the effective pull")
    return BeltLoad(belt_pull=pull, pulley_diameter=b.quantity(w, "pulley_diameter", path, "length"),
                    belt_speed=b.quantity(w, "belt_speed", path, "velocity"))


def _speed_squared(b, w: dict, path: tuple) -> SpeedSquaredLoad:
    return SpeedSquaredLoad(reference_torque=b.quantity(w, "reference_torque", path, "torque"),
                            reference_speed=b.quantity(w, "reference_speed", path, "speed"),
                            speed=b.quantity(w, "speed", path, "speed"))


_LOAD_BUILDERS = {"winch": _winch, "wheel": _wheel, "belt": _belt, "speed_squared": _speed_squared}


# --- sizing and parts files -------------------------------------------------------------------


def _sizing(b, raw: dict | None, allow_outside: bool, drives: list[Drive]) -> Sizing:
    raw = raw or {}
    path = ("sizing",)
    if "series" in raw and "parts_file" in raw:
        b.fail(path + ("parts_file",), "give series or parts_file, not both")
    if "parts_file" not in raw:
        return Sizing(series=raw.get("series", defaults.SIZING_SERIES))
    stock = _parts_file(b, raw["parts_file"], path + ("parts_file",), allow_outside)
    if stock is None:
        return Sizing(parts_file=raw["parts_file"])
    for drive in drives:
        m = drive.motor
        if m.target_pressure is not None and m.kind not in stock:
            b.fail(("drives", drive.id, "motor", "kind"),
                   f"parts file '{raw['parts_file']}' lists no {m.kind} motors (it lists: {', '.join(stock)})")
    return Sizing(series="", stock=stock, parts_file=raw["parts_file"])


def resolve_inside(spec_name: str, relative: str, allow_outside: bool) -> tuple[Path, str | None]:
    """The real path of a file named in a spec, and why it is refused (None when it is not).

    Relative names are taken from the spec's folder. Symbolic links are followed before the test,
    so a link inside the folder tree that points out of it is refused too.
    """
    base = Path(os.path.realpath(Path(spec_name).parent))
    target = Path(os.path.realpath(base / relative))
    if allow_outside or target == base or base in target.parents:
        return target, None
    return target, (f"'{relative}' resolves to {target}, outside the spec's folder {base}; move the file into "
                    "that folder tree or run specgen with --allow-outside-files")


def _parts_file(b, name: str, here: tuple, allow_outside: bool) -> dict | None:
    from specgen.intake.read import load_file

    target, refused = resolve_inside(b.source.name, name, allow_outside)
    if refused:
        b.fail(here, refused)
        return None
    if not target.is_file():
        b.fail(here, f"parts file '{name}' not found (looked for {target})")
        return None
    try:
        parts = load_file(target)
    except SpecError as exc:
        b.problems.extend(exc.problems)
        return None
    problems = _parts_schema_problems(parts)
    if problems:
        b.problems.extend(problems)
        return None
    pb = type(b)(parts)  # a builder whose messages point into the parts file, at the list item
    stock = {}
    for kind, sizes in parts.data["motors"].items():
        items = dict(enumerate(sizes))
        values = [pb.quantity(items, k, ("motors", kind), "displacement") for k in items]
        stock[kind] = tuple(sorted(v for v in values if v is not None and math.isfinite(v) and v > 0))
    if pb.problems:
        b.problems.extend(pb.problems)
        return None
    return stock


def _parts_schema_problems(parts) -> list[Problem]:
    import json

    import jsonschema

    from specgen.resources import data_dir
    from specgen.intake import validate

    schema = json.loads((data_dir("schemas") / PARTS_SCHEMA_FILE).read_text(encoding="utf-8"))
    out = []
    for error in jsonschema.Draft202012Validator(schema).iter_errors(parts.data):
        path, message = validate._schema_message(error)
        out.append(Problem(parts.location(path), validate.dotted(path), message))
    return sorted(out, key=lambda p: (p.location.line, p.location.column, p.path))


def _cooler(b, raw: dict | None) -> Cooler | None:
    if raw is None:
        return None
    return Cooler(capacity=b.quantity(raw, "capacity", ("cooler",), "power"))


__all__ = ["extend", "resolve_inside", "LOAD_MODELS"]
