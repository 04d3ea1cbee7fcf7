"""Pressure checks: margin to the relief (or compensator) setting per duty point and per supply,
the motor's peak, continuous, outlet and case pressure ratings.

Each reads computed results and the model's ratings, never recomputes a relation, and judges by
the one status rule of checks/status.py (margins as defined there).
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, against, below, missing, status
from specgen.intake.model import Drive, Machine
from specgen.resolve.limits import governing_setting, peak_limit, pressure_limit
from specgen.trace import Value

if TYPE_CHECKING:
    from specgen.results import Results


def pressure_margin(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Required inlet pressure (plus any pressure-line and valve loss) against the drive's pressure
    limit (the lowest of relief, compensator and port relief settings), at every driving duty point."""
    warn = machine.thresholds.pressure_margin_warn.value
    for r in results.duties:
        if r.direction == "overrunning":
            continue
        limit = _limit(machine, results, r.drive)
        relief, setting = limit.value, governing_setting(limit)
        with_line = "supply_pressure_required" in r.values
        p_in = r["supply_pressure_required"] if with_line else r["inlet_pressure"]
        margin = below(p_in, relief)
        st = status(margin, warn)
        text = {
            "fail": f"needs more than the {setting} allows: the motor cannot give this torque",
            "warn": f"is within {warn:.0%} of the {setting}: little room for losses and wear",
            "pass": f"leaves enough margin below the {setting}",
        }[st]
        valve, line = "valve_drop_to_motor" in r.values, "pressure_line_loss" in r.values
        what = ("Inlet pressure plus line and valve losses" if valve and line else
                "Inlet pressure plus valve drop" if valve else
                "Inlet pressure plus pressure-line loss" if with_line else "Inlet pressure")
        device = {"compensator setting": "compensator", "relief setting": "relief"}.get(setting, setting)
        yield Check("pressure_margin", "Pressure margin to relief", st, margin, warn, "ratio",
                    f"{what} {fmt(p_in, 'pressure')} against {device} {fmt(relief, 'pressure')} "
                    f"(margin {margin:.1%}) {text}.", drive=r.drive, duty=r.duty, margin=margin)


def _limit(machine: Machine, results: Results, drive_id: str) -> Value:
    dr = results.drive_result(drive_id)
    if dr is not None and "pressure_limit" in dr.values:
        return dr.values["pressure_limit"]
    drive = machine.drive(drive_id)
    return pressure_limit(drive, machine.supply(drive.supply))


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
        margin = below(p, limit)
        st = status(margin, warn)
        what = "drives in series" if sup.circuit == "series" else "drives with their line losses"
        yield Check("supply_pressure", "Supply pressure within its setting", st, margin, warn, "ratio",
                    f"The {what} need {fmt(p, 'pressure')} at the pump against the {setting} {fmt(limit, 'pressure')} "
                    f"(margin {margin:.1%})" + {"fail": ": the drives cannot all reach their torque.",
                                                "warn": f": within {warn:.0%}.", "pass": "."}[st],
                    supply=r.supply, mode=r.mode, margin=margin)


def _peak(machine: Machine, drive: Drive, fmt: Fmt) -> Iterator[Check]:
    rating = drive.motor.rating
    relief = peak_limit(drive, machine.supply(drive.supply))
    port = drive.port_relief is not None and drive.port_relief <= machine.supply(drive.supply).relief_setting
    what = "Port relief setting" if port else "Relief setting"
    if rating.peak_pressure is None:
        yield missing("peak_pressure", "Relief setting within peak rating", "peak pressure", drive.id)
        return
    margin = below(relief, rating.peak_pressure)
    st = status(margin)
    ok = st == "pass"
    yield Check("peak_pressure", "Relief setting within peak rating", st, relief, rating.peak_pressure, "pressure",
                f"{what} {fmt(relief, 'pressure')} is {against(relief, rating.peak_pressure, ok)} the motor's "
                f"peak rating {fmt(rating.peak_pressure, 'pressure')}"
                + ("." if ok else ": a pressure spike can reach the motor beyond its rating."),
                drive=drive.id, margin=margin)


def _rating_for(drive: Drive, duration: str) -> tuple[float | None, str]:
    """The rating step a duty point of ``duration`` is checked at; a missing intermittent rating
    falls back to the continuous one (stricter)."""
    rating = drive.motor.rating
    if duration == "peak":
        return rating.peak_pressure, "peak rating"
    if duration == "intermittent" and rating.intermittent_pressure is not None:
        share = f" (for at most {rating.intermittent_share:.0%} of the time)" if rating.intermittent_share else ""
        return rating.intermittent_pressure, "intermittent rating" + share
    return rating.continuous_pressure, "continuous rating"


def _series_inlets(machine: Machine, results: Results, drive: Drive) -> dict[str, list]:
    """duty id -> [(mode, inlet pressure in series)] for a drive on a series supply."""
    out: dict[str, list] = {}
    if machine.supply(drive.supply).circuit != "series":
        return out
    for sm in results.supply_modes:
        for c in sm.contributions:
            v = sm.drive_value(drive.id, "inlet_pressure") if c.drive == drive.id else None
            if v is not None:
                out.setdefault(c.duty, []).append((sm, v.value))
    return out


def _continuous(machine: Machine, drive: Drive, results: Results, fmt: Fmt) -> Iterator[Check]:
    series = _series_inlets(machine, results, drive)
    for duty_id, r in results.drive_duties(drive.id).items():
        limit, step = _rating_for(drive, drive.duty(duty_id).duration)
        if limit is None:
            yield missing("continuous_pressure", "Working pressure within continuous rating",
                          step.split(" (")[0].replace("rating", "pressure"), drive.id)
            return
        key = "braking_pressure" if r.direction == "overrunning" else "inlet_pressure"
        if duty_id in series and r.direction != "overrunning":
            for sm, p in series[duty_id]:
                margin = below(p, limit)
                st = status(margin)
                yield Check("continuous_pressure", "Working pressure within continuous rating", st, p, limit,
                            "pressure", f"In series the inlet sits at {fmt(p, 'pressure')} (its own differential, "
                            f"the drives downstream and the return), {against(p, limit, st == 'pass')} the {step} "
                            f"{fmt(limit, 'pressure')}.", drive=drive.id, duty=duty_id, supply=sm.supply,
                            mode=sm.mode, margin=margin)
            continue
        p = r[key]
        margin = below(p, limit)
        st = status(margin)
        what = "Pressure held at the outlet" if key == "braking_pressure" else "Inlet pressure"
        yield Check("continuous_pressure", "Working pressure within continuous rating", st, p, limit, "pressure",
                    f"{what} {fmt(p, 'pressure')} is {against(p, limit, st == 'pass')} the {step} "
                    f"{fmt(limit, 'pressure')}.", drive=drive.id, duty=duty_id, margin=margin)


def _outlet(drive: Drive, results: Results, fmt: Fmt) -> Iterator[Check]:
    limit = drive.motor.rating.max_outlet_pressure
    if limit is None:
        return
    for duty_id, r in results.drive_duties(drive.id).items():
        if r.direction == "overrunning":
            continue
        p = r["back_pressure"]
        margin = below(p, limit)
        st = status(margin)
        yield Check("outlet_pressure", "Back pressure within outlet rating", st, p, limit, "pressure",
                    f"Back pressure {fmt(p, 'pressure')} is {against(p, limit, st == 'pass')} the allowed outlet "
                    f"pressure {fmt(limit, 'pressure')}.", drive=drive.id, duty=duty_id, margin=margin)


def _case(drive: Drive, fmt: Fmt) -> Iterator[Check]:
    if not drive.motor.case_drain:
        return
    limit = drive.motor.rating.max_case_pressure
    if drive.case_pressure is None or limit is None:
        yield Check("case_pressure", "Case pressure within rating", status(None, worst="warn"), drive.case_pressure,
                    limit, "pressure",
                    "The motor has a case drain but the case pressure or its rating is not given; "
                    "a blocked or long drain line can burst the shaft seal.", drive=drive.id)
        return
    p = drive.case_pressure
    margin = below(p, limit)
    st = status(margin)
    ok = st == "pass"
    yield Check("case_pressure", "Case pressure within rating", st, p, limit, "pressure",
                f"Case pressure {fmt(p, 'pressure')} is {against(p, limit, ok)} the rating {fmt(limit, 'pressure')}"
                + ("." if ok else ": the shaft seal can fail."), drive=drive.id, margin=margin)


def peak_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """The supply's relief setting against every motor's peak pressure rating."""
    for drive in machine.drives:
        yield from _peak(machine, drive, fmt)


def continuous_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Working pressure (inlet; overrunning: the pressure held at the outlet) against the continuous rating."""
    for drive in machine.drives:
        yield from _continuous(machine, drive, results, fmt)


def outlet_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Back pressure of every driving duty point against the motor's allowed outlet pressure."""
    for drive in machine.drives:
        yield from _outlet(drive, results, fmt)


def case_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Case pressure of a motor with a case drain against its case rating."""
    for drive in machine.drives:
        yield from _case(drive, fmt)


def pressure_ratings(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Peak and continuous pressure ratings, drive by drive."""
    for drive in machine.drives:
        yield from _peak(machine, drive, fmt)
        yield from _continuous(machine, drive, results, fmt)


def port_pressures(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Outlet and case pressure ratings, drive by drive."""
    for drive in machine.drives:
        yield from _outlet(drive, results, fmt)
        yield from _case(drive, fmt)


def series_outlet_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """In a series circuit a motor's outlet carries the drives downstream: against its outlet rating."""
    for r in results.supply_modes:
        if machine.supply(r.supply).circuit != "series":
            continue
        for c in r.contributions:
            limit = machine.drive(c.drive).motor.rating.max_outlet_pressure
            outlet = r.drive_value(c.drive, "outlet_pressure")
            if limit is None or outlet is None:
                continue
            p = outlet.value
            margin = below(p, limit)
            st = status(margin)
            ok = st == "pass"
            yield Check("outlet_pressure", "Back pressure within outlet rating", st, p, limit,
                        "pressure", f"In series the outlet sits at {fmt(p, 'pressure')}, "
                        f"{against(p, limit, ok)} the allowed outlet pressure {fmt(limit, 'pressure')}"
                        + ("." if ok else ": the shaft seal or the motor can fail; use a motor rated for series use."),
                        drive=c.drive, duty=c.duty, supply=r.supply, mode=r.mode, margin=margin)
