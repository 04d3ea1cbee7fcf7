"""Speed checks: motor speed against its maximum and its smooth-running minimum, and a variable
motor's speed at its minimum displacement against the maximum.

Margins as defined in checks/status.py; below the smooth-running minimum is a warning only.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, against, below, missing, reaches, status
from specgen.intake.model import Drive, Machine

if TYPE_CHECKING:
    from specgen.results import DutyResult, Results


def _max_speed(drive: Drive, duty_id: str, r: DutyResult, warn: float, fmt: Fmt) -> Iterator[Check]:
    limit = drive.motor.rating.max_speed
    if limit is None:
        return
    n = r["motor_speed"]
    margin = below(n, limit)
    st = status(margin, warn)
    yield Check("max_speed", "Motor speed within maximum", st, n, limit, "speed",
                f"Motor speed {fmt(n, 'speed')} against the maximum rating {fmt(limit, 'speed')}"
                + {"fail": ": over-speed damages the motor.", "warn": f": within {warn:.0%} of the limit.",
                   "pass": "."}[st], drive=drive.id, duty=duty_id, margin=margin)


def _min_speed(drive: Drive, duty_id: str, r: DutyResult, fmt: Fmt) -> Iterator[Check]:
    limit = drive.motor.rating.min_speed
    if limit is None:
        return
    n = r["motor_speed"]
    margin = reaches(n, limit)
    st = status(margin, worst="warn")  # below the minimum the motor runs unevenly; it is not damaged
    ok = st == "pass"
    yield Check("min_speed", "Motor speed above smooth-running minimum", st, n, limit, "speed",
                f"Motor speed {fmt(n, 'speed')} is {against(n, limit, ok, ('above', 'below'))} the smooth-running "
                f"minimum {fmt(limit, 'speed')}" + ("." if ok else ": expect uneven rotation."),
                drive=drive.id, duty=duty_id, margin=margin)


def _missing_max(drive: Drive) -> Iterator[Check]:
    if drive.motor.rating.max_speed is None:
        yield missing("max_speed", "Motor speed within maximum", "maximum speed", drive.id)


def max_speed(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Motor speed at every duty point against its maximum rating (warn near it)."""
    warn = machine.thresholds.speed_margin_warn.value
    for drive in machine.drives:
        yield from _missing_max(drive)
        for duty_id, r in results.drive_duties(drive.id).items():
            yield from _max_speed(drive, duty_id, r, warn, fmt)


def min_speed(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Motor speed at every duty point against its smooth-running minimum (warn only)."""
    for drive in machine.drives:
        for duty_id, r in results.drive_duties(drive.id).items():
            yield from _min_speed(drive, duty_id, r, fmt)


def speed_ratings(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Maximum and minimum speed, drive by drive and duty point by duty point."""
    warn = machine.thresholds.speed_margin_warn.value
    for drive in machine.drives:
        yield from _missing_max(drive)
        for duty_id, r in results.drive_duties(drive.id).items():
            yield from _max_speed(drive, duty_id, r, warn, fmt)
            yield from _min_speed(drive, duty_id, r, fmt)


def min_displacement_speed(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """A variable motor's speed at its minimum displacement with the available flow against its rating."""
    warn = machine.thresholds.speed_margin_warn.value
    for drive in machine.drives:
        dr = results.drive_result(drive.id)
        if dr is None or "min_displacement_speed" not in dr.values:
            continue
        n, limit = dr["min_displacement_speed"], drive.motor.rating.max_speed
        if limit is None:
            yield Check("min_displacement_speed", "Speed at minimum displacement within rating",
                        status(None, worst="warn"), n, None, "speed",
                        f"At its minimum displacement the motor can reach {fmt(n, 'speed')}, and no maximum "
                        "speed rating is given to compare with.", drive=drive.id)
            continue
        margin = below(n, limit)
        st = status(margin, warn)
        yield Check("min_displacement_speed", "Speed at minimum displacement within rating", st, n, limit, "speed",
                    f"At its minimum displacement the available flow can turn the motor {fmt(n, 'speed')} against "
                    f"its rating {fmt(limit, 'speed')}" + {"fail": ": a light load at the minimum stop over-speeds "
                                                           "it; raise the stop or limit the flow.",
                                                           "warn": f": within {warn:.0%}.", "pass": "."}[st],
                    drive=drive.id, margin=margin)
