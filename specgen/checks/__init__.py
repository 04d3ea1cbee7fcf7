"""Every automatic check: what it compares, its status rule and its sentence.

A check reads computed results and the model's ratings and thresholds; it never recomputes a
relation. Status: "fail" when a limit is crossed, "warn" inside the warning margin, else "pass".
To add a check: write a function taking (machine, results, fmt) and yielding Check records, and
list it in CHECKS (DEVELOPERS.md has the details).
"""

from __future__ import annotations

from dataclasses import replace
from typing import Callable, Iterator

from specgen.checks.depth import DEPTH_CHECKS
from specgen.results import Check, Results
from specgen.intake.model import Machine
from specgen.units import format_si

Fmt = Callable[[float, str], str]


def _margin_status(margin: float, warn: float) -> str:
    return "fail" if margin <= 0 else "warn" if margin < warn else "pass"


def pressure_margin(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Required inlet pressure (plus any pressure-line loss) against the supply's relief setting
    (a compensated pump's compensator setting), at every driving duty point."""
    warn = machine.thresholds.pressure_margin_warn.value
    for r in results.duties:
        if r.direction == "overrunning":
            continue
        sup = machine.supply(machine.drive(r.drive).supply)
        relief = sup.pressure_limit
        setting = "compensator setting" if sup.compensated else "relief setting"
        with_line = "supply_pressure_required" in r.values
        p_in = r["supply_pressure_required"] if with_line else r["inlet_pressure"]
        margin = (relief - p_in) / relief
        status = _margin_status(margin, warn)
        text = {
            "fail": f"needs more than the {setting} allows: the motor cannot give this torque",
            "warn": f"is within {warn:.0%} of the {setting}: little room for losses and wear",
            "pass": f"leaves enough margin below the {setting}",
        }[status]
        what = "Inlet pressure plus pressure-line loss" if with_line else "Inlet pressure"
        against = "compensator" if sup.compensated else "relief"
        yield Check("pressure_margin", "Pressure margin to relief", status, margin, warn, "ratio",
                    f"{what} {fmt(p_in, 'pressure')} against {against} {fmt(relief, 'pressure')} "
                    f"(margin {margin:.1%}) {text}.", drive=r.drive, duty=r.duty)


def _missing(check_id: str, title: str, what: str, drive: str) -> Check:
    return Check(check_id, title, "warn", None, None, "", f"No {what} rating given; enter the motor maker's figure.",
                 drive=drive)


def pressure_ratings(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Working pressure against the continuous rating; relief setting against the peak rating."""
    for drive in machine.drives:
        rating = drive.motor.rating
        relief = machine.supply(drive.supply).relief_setting
        if rating.peak_pressure is None:
            yield _missing("peak_pressure", "Relief setting within peak rating", "peak pressure", drive.id)
        else:
            ok = relief <= rating.peak_pressure
            yield Check("peak_pressure", "Relief setting within peak rating", "pass" if ok else "fail", relief,
                        rating.peak_pressure, "pressure",
                        f"Relief setting {fmt(relief, 'pressure')} is {'within' if ok else 'above'} the motor's peak "
                        f"rating {fmt(rating.peak_pressure, 'pressure')}"
                        + ("." if ok else ": a pressure spike can reach the motor beyond its rating."), drive=drive.id)
        if rating.continuous_pressure is None:
            yield _missing("continuous_pressure", "Working pressure within continuous rating", "continuous pressure",
                           drive.id)
            continue
        for duty in drive.duty_points:
            r = results.duty(drive.id, duty.id)
            key = "braking_pressure" if r.direction == "overrunning" else "inlet_pressure"
            p = r[key]
            ok = p <= rating.continuous_pressure
            what = "Pressure held at the outlet" if key == "braking_pressure" else "Inlet pressure"
            yield Check("continuous_pressure", "Working pressure within continuous rating", "pass" if ok else "fail",
                        p, rating.continuous_pressure, "pressure",
                        f"{what} {fmt(p, 'pressure')} is {'within' if ok else 'above'} the continuous rating "
                        f"{fmt(rating.continuous_pressure, 'pressure')}.", drive=drive.id, duty=duty.id)


def speed_ratings(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Motor speed within its maximum (warn near it) and above its minimum for smooth running."""
    warn = machine.thresholds.speed_margin_warn.value
    for drive in machine.drives:
        rating = drive.motor.rating
        if rating.max_speed is None:
            yield _missing("max_speed", "Motor speed within maximum", "maximum speed", drive.id)
        for duty in drive.duty_points:
            n = results.duty(drive.id, duty.id)["motor_speed"]
            if rating.max_speed is not None:
                margin = (rating.max_speed - n) / rating.max_speed
                status = "fail" if margin < 0 else "warn" if margin < warn else "pass"
                yield Check("max_speed", "Motor speed within maximum", status, n, rating.max_speed, "speed",
                            f"Motor speed {fmt(n, 'speed')} against the maximum rating {fmt(rating.max_speed, 'speed')}"
                            + {"fail": ": over-speed damages the motor.", "warn": f": within {warn:.0%} of the limit.",
                               "pass": "."}[status], drive=drive.id, duty=duty.id)
            if rating.min_speed is not None:
                ok = n >= rating.min_speed
                yield Check("min_speed", "Motor speed above smooth-running minimum", "pass" if ok else "warn", n,
                            rating.min_speed, "speed",
                            f"Motor speed {fmt(n, 'speed')} is {'above' if ok else 'below'} the smooth-running "
                            f"minimum {fmt(rating.min_speed, 'speed')}" + ("." if ok else ": expect uneven rotation."),
                            drive=drive.id, duty=duty.id)


def breakaway(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Torque from rest at the relief setting (starting efficiency) against the starting torque."""
    warn = machine.thresholds.breakaway_margin_warn.value
    for r in results.duties:
        if "starting_torque_motor" not in r.values:
            continue
        have, need = r["breakaway_torque"], r["starting_torque_motor"]
        margin = (have - need) / need if need > 0 else float("inf")
        status = "fail" if have < need else "warn" if margin < warn else "pass"
        yield Check("breakaway", "Breakaway torque at relief setting", status, have, need, "torque",
                    f"From rest the motor gives {fmt(have, 'torque')} at the relief setting against "
                    f"{fmt(need, 'torque')} needed"
                    + {"fail": ": the load will not start.", "warn": f": less than {warn:.0%} in hand.",
                       "pass": "."}[status], drive=r.drive, duty=r.duty)


def port_pressures(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Back pressure against the allowed outlet pressure; case pressure against the case rating."""
    for drive in machine.drives:
        rating = drive.motor.rating
        if rating.max_outlet_pressure is not None:
            for duty in drive.duty_points:
                r = results.duty(drive.id, duty.id)
                if r.direction == "overrunning":
                    continue
                p = r["back_pressure"]
                ok = p <= rating.max_outlet_pressure
                yield Check("outlet_pressure", "Back pressure within outlet rating", "pass" if ok else "fail", p,
                            rating.max_outlet_pressure, "pressure",
                            f"Back pressure {fmt(p, 'pressure')} is {'within' if ok else 'above'} the allowed outlet "
                            f"pressure {fmt(rating.max_outlet_pressure, 'pressure')}.", drive=drive.id, duty=duty.id)
        if drive.motor.case_drain:
            if drive.case_pressure is None or rating.max_case_pressure is None:
                yield Check("case_pressure", "Case pressure within rating", "warn", drive.case_pressure,
                            rating.max_case_pressure, "pressure",
                            "The motor has a case drain but the case pressure or its rating is not given; "
                            "a blocked or long drain line can burst the shaft seal.", drive=drive.id)
            else:
                ok = drive.case_pressure <= rating.max_case_pressure
                yield Check("case_pressure", "Case pressure within rating", "pass" if ok else "fail",
                            drive.case_pressure, rating.max_case_pressure, "pressure",
                            f"Case pressure {fmt(drive.case_pressure, 'pressure')} is {'within' if ok else 'above'} "
                            f"the rating {fmt(rating.max_case_pressure, 'pressure')}"
                            + ("." if ok else ": the shaft seal can fail."), drive=drive.id)


def load_holding(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """An overrunning duty point needs a declared way to hold and control the load."""
    for r in results.duties:
        if r.direction != "overrunning":
            continue
        held = machine.drive(r.drive).load_holding
        ok = held not in (None, "none")
        yield Check("load_holding", "Load holding for overrunning load", "pass" if ok else "fail", None, None, "",
                    (f"Overrunning load is held by {held.replace('_', ' ')}." if ok else
                     "The load drives the motor here but no load-holding valve or brake is declared: "
                     "the load can run away."), drive=r.drive, duty=r.duty)


def supply_flow(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Pump delivery against the summed flow demand of every mode."""
    warn = machine.thresholds.flow_margin_warn.value
    for r in results.supply_modes:
        q_p, q = r["pump_delivery"], r["flow_demand"]
        margin = (q_p - q) / q_p
        status = "fail" if margin < 0 else "warn" if margin < warn else "pass"
        yield Check("pump_flow", "Pump delivery covers flow demand", status, q, q_p, "flow",
                    f"Drives need {fmt(q, 'flow')} of the pump's {fmt(q_p, 'flow')}"
                    + {"fail": ": the drives will run slower than specified.",
                       "warn": f": under {warn:.0%} surplus.", "pass": "."}[status], supply=r.supply, mode=r.mode)


def prime_mover(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Pump input power in every mode against the prime mover's power."""
    warn = machine.thresholds.power_margin_warn.value
    for r in results.supply_modes:
        if "prime_mover_power" not in r.values:
            continue
        need, have = r["pump_input_power"], r["prime_mover_power"]
        margin = (have - need) / have
        status = "fail" if margin < 0 else "warn" if margin < warn else "pass"
        yield Check("prime_mover_power", "Prime mover power covers pump input", status, need, have, "power",
                    f"Pump takes {fmt(need, 'power')} of the prime mover's {fmt(have, 'power')}"
                    + {"fail": ": the engine or electric motor will stall or trip.",
                       "warn": f": under {warn:.0%} in hand.", "pass": "."}[status], supply=r.supply, mode=r.mode)


CHECKS = [pressure_margin, pressure_ratings, speed_ratings, breakaway, port_pressures, load_holding,
          supply_flow, prime_mover] + DEPTH_CHECKS


def run_checks(machine: Machine, results: Results) -> Results:
    """Return ``results`` with every check attached, in a stable order."""
    system = machine.display_units

    def fmt(value: float, kind: str) -> str:
        return format_si(value, kind, system)

    checks = [c for fn in CHECKS for c in fn(machine, results, fmt)]
    return replace(results, checks=tuple(checks))
