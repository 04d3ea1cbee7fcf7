"""Build each drive from a schema-valid spec: its motor (displacement or target pressure, rating,
efficiencies), gear stage, back and case pressures, lines, available flow and duty points (torque
and speed or a load block, inertia, a variable motor's setting).

Quantities become SI floats (m^3/rev, Pa, rev/s, N*m, kg*m^2, s, m^3/s); every refused value or
contradiction is a problem in the builder, located at its field. A duty point keeps the direction
the spec wrote (None when it wrote none); the load's sign decides it when the spec is resolved.
"""

from __future__ import annotations

import math

from specgen.intake import defaults
from specgen.intake.build_fluid import build_lines
from specgen.intake.build_loads import LOAD_MODELS, build_load
from specgen.intake.model import (Counterbalance, DirectionalValve, Drive, DutyPoint, EfficiencyTable, Fluid, GearStage,
                                  Inertia, Motor, Rating)
from specgen.intake.quantities import Builder

GEAR_RANGE = (1e-3, 1e6)


def build_drive(b: Builder, did: str, dr: dict, on_series: bool, fluid: Fluid | None) -> Drive:
    """``on_series``: the drive's supply feeds its drives in series."""
    path = ("drives", did)
    gear = _gear(b, dr, path) if "gear_stage" in dr else None
    back_pressure = b.quantity(dr, "back_pressure", path, "pressure", sign="nonnegative")
    if on_series and "back_pressure" in dr:
        b.fail(path + ("back_pressure",), "on a series supply the drives downstream set the back pressure; "
                                          "remove back_pressure (or give the supply's return_pressure)")
    motor = _motor(b, dr["motor"], path + ("motor",), back_pressure)
    duties = tuple(_duty(b, uid, u, path + ("duty_points", uid), motor) for uid, u in dr["duty_points"].items())
    return Drive(
        id=did, title=dr.get("title", did), supply=dr["supply"], motor=motor, gear=gear,
        back_pressure=back_pressure,
        case_pressure=b.quantity(dr, "case_pressure", path, "pressure", sign="nonnegative"),
        load_holding=dr.get("load_holding"), duty_points=duties, notes=dr.get("notes", ""),
        lines=build_lines(b, dr["lines"], path + ("lines",), fluid) if "lines" in dr else None,
        available_flow=b.quantity(dr, "available_flow", path, "flow"),
        port_relief=b.quantity(dr, "port_relief", path, "pressure"),
        directional_valve=_valve(b, dr, path), counterbalance=_counterbalance(b, dr, path),
    )


def _valve(b: Builder, dr: dict, path: tuple) -> DirectionalValve | None:
    if "directional_valve" not in dr:
        return None
    v, vpath = dr["directional_valve"], path + ("directional_valve",)
    return DirectionalValve(
        rated_flow=b.quantity(v, "rated_flow", vpath, "flow"),
        drop_to_motor=b.quantity(v, "drop_to_motor", vpath, "pressure", sign="nonnegative", default=0.0),
        drop_to_tank=b.quantity(v, "drop_to_tank", vpath, "pressure", sign="nonnegative", default=0.0))


def _counterbalance(b: Builder, dr: dict, path: tuple) -> Counterbalance | None:
    if "counterbalance" not in dr:
        return None
    c, cpath = dr["counterbalance"], path + ("counterbalance",)
    k = c["pilot_ratio"]
    if not 0 < k <= 100:  # also refuses NaN
        b.fail(cpath + ("pilot_ratio",), f"pilot ratio {k!r} must be a number above 0 and at most 100 (e.g. 3 for 3:1)")
    return Counterbalance(setting=b.quantity(c, "setting", cpath, "pressure"), pilot_ratio=float(k))


def check_targets(b: Builder, drives: tuple[Drive, ...]) -> None:
    """A target pressure sizes the motor for its driving duty points: a drive needs one.
    Run once every duty point's direction is decided."""
    for drive in drives:
        if drive.motor.target_pressure is not None and all(u.direction == "overrunning" for u in drive.duty_points):
            b.fail(("drives", drive.id, "motor", "target_pressure"),
                   "target_pressure sizes the motor for its driving duty points, and this drive has none; "
                   "give the displacement")


def _gear(b: Builder, dr: dict, path: tuple) -> GearStage:
    g, gpath = dr["gear_stage"], path + ("gear_stage",)
    if not GEAR_RANGE[0] <= g["ratio"] <= GEAR_RANGE[1]:  # also refuses NaN
        b.fail(gpath + ("ratio",), f"gear ratio {g['ratio']!r} must be a number from {GEAR_RANGE[0]:g} "
                                   f"to {GEAR_RANGE[1]:g} (motor speed / load speed)")
    running = b.ratio(g, "efficiency", gpath, defaults.GEAR_EFFICIENCY, defaults.GEAR_BASIS)
    starting = b.ratio(g, "starting_efficiency", gpath, 1.0) if "starting_efficiency" in g else None
    return GearStage(ratio=float(g["ratio"]), efficiency=running, starting_efficiency=starting)


def _motor(b: Builder, m: dict, path: tuple, back_pressure: float | None) -> Motor:
    kind = m["kind"]
    ev, ehm, est = defaults.MOTOR_EFFICIENCY[kind]
    basis = defaults.MOTOR_BASIS.format(kind=kind.replace("_", " "))
    eff, epath = m.get("efficiency", {}), path + ("efficiency",)
    disp = m.get("displacement", {})  # left out: one is proposed from target_pressure
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
                    "max_outlet_pressure", "max_case_pressure", "intermittent_pressure")
    }, intermittent_share=b.ratio(r, "intermittent_share", rpath, 0.0, efficiency=True).value
        if "intermittent_share" in r else None)
    if rating.min_speed and rating.max_speed and rating.min_speed >= rating.max_speed:
        b.fail(rpath + ("min_speed",), "minimum speed rating must be below the maximum")
    target = b.quantity(m, "target_pressure", path, "pressure")
    if "displacement" not in m and target is None:
        b.fail(path, "give the motor's displacement, or target_pressure to have one proposed")
    if target is not None and math.isfinite(target) and back_pressure is not None and target <= back_pressure:
        b.fail(path + ("target_pressure",), "the target pressure must exceed the drive's back pressure")
    return Motor(
        kind=kind, model=m.get("model", ""), displacement_min=lo, displacement_max=hi, over_centre=over,
        volumetric_efficiency=b.ratio(eff, "volumetric", epath, ev, basis),
        hydromechanical_efficiency=b.ratio(eff, "hydromechanical", epath, ehm, basis),
        starting_efficiency=b.ratio(eff, "starting", epath, est, basis),
        rating=rating, case_drain=bool(m.get("case_drain", False)), target_pressure=target,
        efficiency_table=build_table(b, m.get("efficiency_table"), path + ("efficiency_table",)),
    )


def build_table(b: Builder, t: dict | str | None, path: tuple) -> EfficiencyTable | None:
    """The maker's efficiency grid; axes must rise and every row must hold one value per speed.
    A name (a table in the sizing parts file) is looked up once the parts file is read (validate.py)."""
    if t is None or isinstance(t, str):
        return None
    axes = {}
    for key, kind in (("pressure_differential", "pressure"), ("speed", "speed")):
        axes[key] = tuple(b.quantity({i: x for i, x in enumerate(t[key])}, i, path + (key,), kind)
                          for i in range(len(t[key])))
        if any(not a < c for a, c in zip(axes[key], axes[key][1:])):
            b.fail(path + (key,), f"the {key.replace('_', ' ')} values must rise from one to the next")
    n_p, n_s = len(axes["pressure_differential"]), len(axes["speed"])
    grids = {}
    for key in ("volumetric", "hydromechanical"):
        rows = t[key]
        if len(rows) != n_p or any(len(r) != n_s for r in rows):
            b.fail(path + (key,), f"give {n_p} rows (one per pressure differential) of {n_s} values (one per speed)")
        grids[key] = tuple(tuple(b.ratio({j: x for j, x in enumerate(r)}, j, path + (key, i), 1.0).value
                                 for j in range(len(r))) for i, r in enumerate(rows))
    starting = None
    if "starting" in t:
        if len(t["starting"]) != n_p:
            b.fail(path + ("starting",), f"give {n_p} values, one per pressure differential")
        starting = tuple(b.ratio({i: x for i, x in enumerate(t["starting"])}, i, path + ("starting",), 1.0).value
                         for i in range(len(t["starting"])))
    return EfficiencyTable(axes["pressure_differential"], axes["speed"], grids["volumetric"],
                           grids["hydromechanical"], starting)


def _duty(b: Builder, uid: str, u: dict, path: tuple, motor: Motor) -> DutyPoint:
    torque = b.quantity(u, "torque", path, "torque", sign="nonnegative")
    speed = b.quantity(u, "speed", path, "speed")
    starting_torque = b.quantity(u, "starting_torque", path, "torque", sign="nonnegative")
    load = None
    if "load" in u:
        given = [k for k in ("torque", "speed") if k in u]
        if given:
            b.fail(path + (given[0],), "give torque and speed, or a load block, not both")
        models = list(u["load"])
        if len(models) != 1:
            b.fail(path + ("load",), "give exactly one load model: " + ", ".join(LOAD_MODELS)
                   + (f" (found {', '.join(models)})" if models else ""))
        else:
            load = build_load(b, models[0], u["load"][models[0]], path + ("load", models[0]))
    inertia = None
    if "inertia" in u:
        i, ipath = u["inertia"], path + ("inertia",)
        inertia = Inertia(
            load_inertia=b.quantity(i, "load_inertia", ipath, "inertia", sign="nonnegative"),
            ramp_time=b.quantity(i, "ramp_time", ipath, "time"),
            motor_inertia=b.quantity(i, "motor_inertia", ipath, "inertia", sign="nonnegative", default=0.0),
        )
    stated = b.quantity(u, "displacement", path, "displacement")
    if stated is not None and math.isfinite(stated):
        lo, hi = motor.displacement_min, motor.displacement_max
        if lo is None or hi is None or lo == hi:
            b.fail(path + ("displacement",), "only a variable motor's displacement can be set per duty point; "
                                             "remove it or give the motor a {min, max} range")
        elif not lo * (1 - 1e-9) <= stated <= hi * (1 + 1e-9):
            b.fail(path + ("displacement",), "the displacement lies outside the motor's min to max range")
    return DutyPoint(
        id=uid, title=u.get("title", uid), torque=torque, speed=speed, direction=u.get("direction"),
        starting_torque=starting_torque, load=load, inertia=inertia, displacement=stated,
        duration=u.get("duration", "continuous"),
    )
