"""Checks for sizing, variable motors, circuits, lines, makeup flow and heat load.

Same rules as checks.py: each reads computed results and the model, never recomputes a relation,
and yields Check records; "fail" when a limit is crossed, "warn" inside the warning margin.
"""

from __future__ import annotations

from typing import Callable, Iterator

from specgen.calc.lines import line_velocity_limits
from specgen.results import Check, Results
from specgen.intake.model import Machine

Fmt = Callable[[float, str], str]

LINE_FAIL_FACTOR = 1.5  # pressure and return lines fail above 1.5 times the rule-of-thumb upper limit
HOLDING_VALVES = ("counterbalance_valve", "brake_valve", "counterbalance_valve_and_brake")


def _status(margin: float, warn: float) -> str:
    return "fail" if margin < 0 else "warn" if margin < warn else "pass"


def supply_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Supply working pressure (series: the sum; with lines: plus line losses) against the relief
    or compensator setting. Only where it says more than pressure_margin does per duty point."""
    warn = machine.thresholds.pressure_margin_warn.value
    for r in results.supply_modes:
        sup = machine.supply(r.supply)
        lines = any("pressure_line_loss" in results.duty(c.drive, c.duty).values or
                    "return_line_loss" in results.duty(c.drive, c.duty).values for c in r.contributions)
        if sup.circuit != "series" and not lines:
            continue
        limit, p = sup.pressure_limit, r["working_pressure"]
        setting = "compensator setting" if sup.compensated else "relief setting"
        margin = (limit - p) / limit
        status = "fail" if margin <= 0 else "warn" if margin < warn else "pass"
        what = "drives in series" if sup.circuit == "series" else "drives with their line losses"
        yield Check("supply_pressure", "Supply pressure within its setting", status, margin, warn, "ratio",
                    f"The {what} need {fmt(p, 'pressure')} at the pump against the {setting} {fmt(limit, 'pressure')} "
                    f"(margin {margin:.1%})" + {"fail": ": the drives cannot all reach their torque.",
                                                "warn": f": within {warn:.0%}.", "pass": "."}[status],
                    supply=r.supply, mode=r.mode)


def displacement_choice(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Sized motors: the displacement used against the smallest that meets the target pressure.
    Variable motors: every duty point's speed reachable with the available flow."""
    for drive in machine.drives:
        dr = results.drive_result(drive.id)
        if dr is None:
            continue
        if "minimum_displacement" in dr.values:
            need = dr["minimum_displacement"]
            proposed = dr.values.get("proposed_displacement")
            if drive.motor.displacement_given:
                have = drive.motor.displacement_max
                ok = have >= need * (1 - 1e-9)
                hint = f"; proposed size {fmt(proposed.value, 'displacement')}" if proposed else ""
                yield Check("displacement_choice", "Displacement meets the target pressure", "pass" if ok else "fail",
                            have, need, "displacement",
                            f"Displacement {fmt(have, 'displacement')} against the {fmt(need, 'displacement')} needed at "
                            f"the target pressure {fmt(drive.motor.target_pressure, 'pressure')}{hint}"
                            + ("." if ok else ": the drive needs more pressure than the target."), drive=drive.id)
            elif proposed is None:
                yield Check("displacement_choice", "Displacement meets the target pressure", "fail", None, need,
                            "displacement", f"No stocked {drive.motor.kind.replace('_', ' ')} motor reaches the "
                            f"{fmt(need, 'displacement')} needed; results are computed at that minimum, which is "
                            "not a size you can buy.", drive=drive.id)
            else:
                yield Check("displacement_choice", "Displacement meets the target pressure", "pass", proposed.value,
                            need, "displacement",
                            f"Proposed {fmt(proposed.value, 'displacement')} ({proposed.label.split('(')[-1].rstrip(')')}) "
                            f"covers the {fmt(need, 'displacement')} needed; results use the proposed size.",
                            drive=drive.id)
        for duty in drive.duty_points:
            r = results.duty(drive.id, duty.id)
            if "speed_reached" in r.values:
                yield Check("displacement_choice", "Variable motor reaches the duty speed", "fail",
                            r["speed_reached"], r["motor_speed"], "speed",
                            f"At its minimum displacement the available flow turns the motor only "
                            f"{fmt(r['speed_reached'], 'speed')} against {fmt(r['motor_speed'], 'speed')} needed.",
                            drive=drive.id, duty=duty.id)


def min_displacement_speed(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """A variable motor's speed at its minimum displacement with the available flow against its rating."""
    warn = machine.thresholds.speed_margin_warn.value
    for drive in machine.drives:
        dr = results.drive_result(drive.id)
        if dr is None or "min_displacement_speed" not in dr.values:
            continue
        n, limit = dr["min_displacement_speed"], drive.motor.rating.max_speed
        if limit is None:
            yield Check("min_displacement_speed", "Speed at minimum displacement within rating", "warn", n, None,
                        "speed", f"At its minimum displacement the motor can reach {fmt(n, 'speed')}, and no maximum "
                        "speed rating is given to compare with.", drive=drive.id)
            continue
        margin = (limit - n) / limit
        status = _status(margin, warn)
        yield Check("min_displacement_speed", "Speed at minimum displacement within rating", status, n, limit, "speed",
                    f"At its minimum displacement the available flow can turn the motor {fmt(n, 'speed')} against "
                    f"its rating {fmt(limit, 'speed')}" + {"fail": ": a light load at the minimum stop over-speeds "
                                                           "it; raise the stop or limit the flow.",
                                                           "warn": f": within {warn:.0%}.", "pass": "."}[status],
                    drive=drive.id)


def _velocity_check(kind: str, v: float, fmt: Fmt, **where) -> Check:
    lim = line_velocity_limits(kind)
    fail_at = None if kind == "suction" else LINE_FAIL_FACTOR * lim.high
    status = "fail" if fail_at is not None and v > fail_at else "warn" if v > lim.high else "pass"
    tail = {"fail": f": far above the {lim.high:g} m/s rule of thumb (failing above {fail_at or 0:g} m/s); "
                    "choose a larger bore.",
            "warn": f": above the {lim.high:g} m/s rule of thumb; expect more loss, heat and noise"
                    + ("; a suction line this fast can cavitate the pump." if kind == "suction" else "."),
            "pass": f", within the {lim.high:g} m/s rule of thumb."}[status]
    return Check("line_velocity", f"{kind.capitalize()} line velocity", status, v, lim.high, "velocity",
                 f"{kind.capitalize()} line velocity {fmt(v, 'velocity')}{tail}", **where)


def line_velocity(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Mean velocity in every given line against the rule-of-thumb limit of its kind (common practice,
    no source): warn above the upper limit; pressure and return lines fail above 1.5 times it."""
    for r in results.duties:
        for kind in ("pressure", "return"):
            key = f"{kind}_line_velocity"
            if key in r.values:
                yield _velocity_check(kind, r[key], fmt, drive=r.drive, duty=r.duty)
    for s in results.supplies:
        if "suction_line_velocity" in s.values:
            yield _velocity_check("suction", s["suction_line_velocity"], fmt, supply=s.supply)


def makeup_flow(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """An overrunning motor's inlet must be kept filled by the flow the other drives leave. Short:
    fail (cavitation, the load can run away), or warn where a counterbalance or brake valve is
    declared (it closes as its pilot pressure falls: lowering slows and may judder)."""
    warn = machine.thresholds.flow_margin_warn.value
    for r in results.supply_modes:
        for c in r.contributions:
            key = f"makeup_available[{c.drive}]"
            if key not in r.values:
                continue
            have, need = r[key], c.flow
            margin = (have - need) / need if need > 0 else float("inf")
            valve = machine.drive(c.drive).load_holding in HOLDING_VALVES
            status = ("warn" if valve else "fail") if margin < 0 else "warn" if margin < warn else "pass"
            tail = {"fail": ": the motor draws more than reaches its inlet and cavitates; the load can run away. "
                            "Add makeup flow (anti-cavitation valve, boost) or a counterbalance valve.",
                    "warn": (": short, the counterbalance valve will throttle the load down and it may judder."
                             if margin < 0 else f": under {warn:.0%} in hand."),
                    "pass": "."}[status]
            yield Check("makeup_flow", "Makeup flow for overrunning load", status, have, need, "flow",
                        f"The overrunning motor needs {fmt(need, 'flow')} at its inlet; the other drives leave "
                        f"{fmt(have, 'flow')}{tail}", drive=c.drive, duty=c.duty, supply=r.supply, mode=r.mode)


def heat_load(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Heat load of every mode (all supplies together) against the cooler's capacity, when given.
    The check takes the mode as running continuously."""
    if machine.cooler is None:
        return
    warn = machine.thresholds.heat_margin_warn.value
    cap = machine.cooler.capacity
    for m in results.modes:
        q = m["heat_load"]
        margin = (cap - q) / cap
        status = _status(margin, warn)
        parts = ", ".join(f"{i.symbol[2:-1]} {fmt(i.value, 'power')}" for i in m.values["heat_load"].inputs)
        yield Check("heat_load", "Heat load within cooler capacity", status, q, cap, "power",
                    f"The supplies put {fmt(q, 'power')} of heat into the oil ({parts}) against the cooler's "
                    f"{fmt(cap, 'power')}" + {"fail": ": run continuously the oil overheats.",
                                              "warn": f": under {warn:.0%} in hand.", "pass": "."}[status], mode=m.mode)


def series_outlet_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """In a series circuit a motor's outlet carries the drives downstream: against its outlet rating."""
    for r in results.supply_modes:
        if machine.supply(r.supply).circuit != "series":
            continue
        for c in r.contributions:
            limit = machine.drive(c.drive).motor.rating.max_outlet_pressure
            key = f"outlet_pressure[{c.drive}]"
            if limit is None or key not in r.values:
                continue
            p = r[key]
            ok = p <= limit
            yield Check("outlet_pressure", "Back pressure within outlet rating", "pass" if ok else "fail", p, limit,
                        "pressure", f"In series the outlet sits at {fmt(p, 'pressure')}, "
                        f"{'within' if ok else 'above'} the allowed outlet pressure {fmt(limit, 'pressure')}"
                        + ("." if ok else ": the shaft seal or the motor can fail; use a motor rated for series use."),
                        drive=c.drive, duty=c.duty, supply=r.supply, mode=r.mode)


DEPTH_CHECKS = [supply_pressure, displacement_choice, min_displacement_speed, line_velocity, makeup_flow, heat_load,
                series_outlet_pressure]
