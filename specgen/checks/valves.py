"""Valve and suction checks: braking torque within what a port relief allows, a counterbalance
valve's setting against the load and the motor's peak rating, and the pump's absolute inlet
pressure against its minimum (cavitation).

Margins as defined in checks/status.py.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, against, below, reaches, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results


def port_relief_braking(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Braking torque needed (overrunning load, stopping an inertia) against what the port relief allows."""
    for r in results.duties:
        if "port_relief_braking_torque" not in r.values or "braking_torque_needed" not in r.values:
            continue
        have, need = r["port_relief_braking_torque"], r["braking_torque_needed"]
        margin = reaches(have, need)
        st = status(margin)
        yield Check("port_relief_braking", "Port relief holds the braking torque", st, have, need, "torque",
                    f"The port relief {fmt(machine.drive(r.drive).port_relief, 'pressure')} lets the motor brake "
                    f"{fmt(have, 'torque')} against {fmt(need, 'torque')} needed"
                    + ("." if st == "pass" else ": the relief opens first and the load slips or overruns."),
                    drive=r.drive, duty=r.duty, margin=margin)


def counterbalance_setting(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """A counterbalance valve's setting: at least the factor times the highest load-induced
    pressure, and within the motor's peak rating."""
    factor = machine.thresholds.counterbalance_factor.value
    for drive in machine.drives:
        cb = drive.counterbalance
        if cb is None:
            continue
        loads = [(u, r["load_induced_pressure"]) for u, r in results.drive_duties(drive.id).items()
                 if "load_induced_pressure" in r.values]
        if loads:
            duty, p_load = max(loads, key=lambda x: x[1])
            need = factor * p_load
            margin = reaches(cb.setting, need)
            st = status(margin)
            yield Check("counterbalance_setting", "Counterbalance setting covers the load", st, cb.setting, need,
                        "pressure",
                        f"Setting {fmt(cb.setting, 'pressure')} against {factor:g} x the load-induced "
                        f"{fmt(p_load, 'pressure')} = {fmt(need, 'pressure')}"
                        + ("." if st == "pass" else ": the valve can open under the load alone and let it creep "
                                                    "or run away."), drive=drive.id, duty=duty, margin=margin)
        peak = drive.motor.rating.peak_pressure
        if peak is not None:
            margin = below(cb.setting, peak)
            st = status(margin)
            yield Check("counterbalance_setting", "Counterbalance setting within peak rating", st, cb.setting, peak,
                        "pressure", f"Setting {fmt(cb.setting, 'pressure')} is {against(cb.setting, peak, st == 'pass')}"
                        f" the motor's peak rating {fmt(peak, 'pressure')}"
                        + ("." if st == "pass" else ": the held load can pressurise the motor beyond its rating."),
                        drive=drive.id, margin=margin)


def pump_inlet_pressure(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """The pump's absolute inlet pressure against its minimum: below it the pump cavitates (fail)."""
    for s in results.supplies:
        if "pump_inlet_pressure" not in s.values:
            continue
        have, low = s["pump_inlet_pressure"], s["pump_min_inlet_pressure"]
        margin = reaches(have, low)
        st = status(margin)
        yield Check("pump_inlet_pressure", "Pump inlet pressure above its minimum", st, have, low, "pressure",
                    f"The pump inlet sits at {fmt(have, 'pressure')} absolute, {against(have, low, st == 'pass', ('above', 'below'))} "
                    f"the minimum {fmt(low, 'pressure')} absolute"
                    + ("." if st == "pass" else ": the pump cavitates; raise the oil level, shorten or widen the "
                                                "suction line, or use a lower-drop strainer."),
                    supply=s.supply, margin=margin)
