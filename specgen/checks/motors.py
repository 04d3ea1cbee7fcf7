"""Sizing and motor checks: the displacement against the target pressure (or a variable motor's
reach of its duty speed), breakaway torque from rest, and load holding for overrunning loads.

Margins as defined in checks/status.py.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, reaches, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

TITLE_TARGET = "Displacement meets the target pressure"


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
                margin = reaches(have, need)
                st = status(margin)
                hint = f"; proposed size {fmt(proposed.value, 'displacement')}" if proposed else ""
                yield Check("displacement_choice", TITLE_TARGET, st, have, need, "displacement",
                            f"Displacement {fmt(have, 'displacement')} against the {fmt(need, 'displacement')} "
                            f"needed at the target pressure {fmt(drive.motor.target_pressure, 'pressure')}{hint}"
                            + ("." if st == "pass" else ": the drive needs more pressure than the target."),
                            drive=drive.id, margin=margin)
            elif proposed is None:
                yield Check("displacement_choice", TITLE_TARGET, status(None), None, need,
                            "displacement", f"No stocked {drive.motor.kind.replace('_', ' ')} motor reaches the "
                            f"{fmt(need, 'displacement')} needed; results are computed at that minimum, which is "
                            "not a size you can buy.", drive=drive.id)
            else:
                margin = reaches(proposed.value, need)
                yield Check("displacement_choice", TITLE_TARGET, status(margin), proposed.value,
                            need, "displacement",
                            f"Proposed {fmt(proposed.value, 'displacement')} ({dr.proposed_from}) "
                            f"covers the {fmt(need, 'displacement')} needed; results use the proposed size.",
                            drive=drive.id, margin=margin)
        for duty_id, r in results.drive_duties(drive.id).items():
            if "speed_reached" in r.values:
                margin = reaches(r["speed_reached"], r["motor_speed"])
                yield Check("displacement_choice", "Variable motor reaches the duty speed", status(margin),
                            r["speed_reached"], r["motor_speed"], "speed",
                            f"At its minimum displacement the available flow turns the motor only "
                            f"{fmt(r['speed_reached'], 'speed')} against {fmt(r['motor_speed'], 'speed')} needed.",
                            drive=drive.id, duty=duty_id, margin=margin)


def breakaway(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Torque from rest at the drive's pressure limit (starting efficiency) against the torque the
    load needs from rest (a load at standstill or an explicit starting torque). In series, per mode:
    the drives downstream start at the same time and take their starting differentials first."""
    warn = machine.thresholds.breakaway_margin_warn.value
    in_series = {}
    for sm in results.supply_modes:
        for c in sm.contributions:
            v = sm.drive_value(c.drive, "breakaway_torque")
            if v is not None:
                in_series.setdefault((c.drive, c.duty), []).append((sm, v.value))
    for r in results.duties:
        if "starting_torque_motor" not in r.values:
            continue
        need = r["starting_torque_motor"]
        limit = results.drive_result(r.drive).values.get("pressure_limit") if results.drive_result(r.drive) else None
        setting = limit.note.removeprefix("governed by the ") if limit is not None else "relief setting"
        where = [(None, r["breakaway_torque"])] + in_series.get((r.drive, r.duty), [])
        if len(where) > 1:
            where = where[1:]  # in series the mode's start governs; the duty alone assumes the return at the outlet
        for sm, have in where:
            margin = reaches(have, need)
            st = status(margin, warn)
            p_lim = f" {fmt(limit.value, 'pressure')}" if limit is not None else ""
            ctx = "" if sm is None else (
                f" with the drives downstream starting too (outlet "
                f"{fmt(sm.drive_value(r.drive, 'start_outlet_pressure').value, 'pressure')})")
            yield Check("breakaway", "Breakaway torque at relief setting", st, have, need, "torque",
                        f"From rest the motor gives {fmt(have, 'torque')} at the {setting}{p_lim}{ctx} against "
                        f"{fmt(need, 'torque')} needed"
                        + {"fail": ": the load will not start.", "warn": f": less than {warn:.0%} in hand.",
                           "pass": "."}[st], drive=r.drive, duty=r.duty,
                        **({} if sm is None else {"supply": sm.supply, "mode": sm.mode}), margin=margin)


def load_holding(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """An overrunning duty point needs a declared way to hold and control the load (no margin: a
    declaration, not a number)."""
    for r in results.duties:
        if r.direction != "overrunning":
            continue
        held = machine.drive(r.drive).load_holding
        ok = held not in (None, "none")
        yield Check("load_holding", "Load holding for overrunning load", "pass" if ok else status(None), None, None,
                    "", (f"Overrunning load is held by {held.replace('_', ' ')}." if ok else
                         "The load drives the motor here but no load-holding valve or brake is declared: "
                         "the load can run away."), drive=r.drive, duty=r.duty)
