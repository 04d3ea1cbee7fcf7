"""Flow and power checks: pump delivery (a load-sensing pump: the flow it can give) against the flow
demand, pump input power against the prime mover, and the makeup flow an overrunning motor's inlet needs.

Margins as defined in checks/status.py.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, below, reaches, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

MAKEUP_PRESSURE = 1e5  # Pa: return pressure to push oil through makeup valves (common practice, no source)
HOLDING_VALVES = ("counterbalance_valve", "brake_valve", "counterbalance_valve_and_brake")


def pump_flow(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Pump delivery against the summed flow demand of every mode; a load-sensing pump's against the flow
    it can give at the mode's pump pressure (its power limiter may destroke it below full delivery)."""
    warn = machine.thresholds.flow_margin_warn.value
    for r in results.supply_modes:
        if machine.supply(r.supply).circuit == "closed_loop":
            continue  # a closed loop's pump strokes to the demand: judged by pump_stroke
        q_p, q = r.values.get("pump_available_flow", r.values["pump_delivery"]).value, r["flow_demand"]
        margin = below(q, q_p)
        st = status(margin, warn)
        yield Check("pump_flow", "Pump delivery covers flow demand", st, q, q_p, "flow",
                    f"Drives need {fmt(q, 'flow')} of the pump's {fmt(q_p, 'flow')}"
                    + {"fail": ": the drives will run slower than specified.",
                       "warn": f": under {warn:.0%} surplus.", "pass": "."}[st],
                    supply=r.supply, mode=r.mode, margin=margin)


def prime_mover_power(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Pump input power in every mode against the prime mover's power."""
    warn = machine.thresholds.power_margin_warn.value
    for r in results.supply_modes:
        if "prime_mover_power" not in r.values:
            continue
        need, have = r["pump_input_power"], r["prime_mover_power"]
        margin = below(need, have)
        st = status(margin, warn)
        # a closed loop's overrunning load drives the pump: engine_braking judges that
        message = (f"The pump returns {fmt(-need, 'power')} to the prime mover: it is driven, not loaded "
                   "(engine_braking judges it)." if need < 0 else
                   f"Pump takes {fmt(need, 'power')} of the prime mover's {fmt(have, 'power')}"
                   + {"fail": ": the engine or electric motor will stall or trip.",
                      "warn": f": under {warn:.0%} in hand.", "pass": "."}[st])
        yield Check("prime_mover_power", "Prime mover power covers pump input", st, need, have, "power", message,
                    supply=r.supply, mode=r.mode, margin=margin)


def makeup_flow(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """An overrunning motor's inlet must be kept filled by the flow the other drives leave. Short:
    fail (cavitation, the load can run away), or warn where a counterbalance or brake valve is
    declared (it closes as its pilot pressure falls: lowering slows and may judder)."""
    warn = machine.thresholds.flow_margin_warn.value
    for r in results.supply_modes:
        for c in r.contributions:
            left = r.drive_value(c.drive, "makeup_available")
            if left is None:
                continue
            have, need = left.value, c.flow
            margin = reaches(have, need)
            valve = machine.drive(c.drive).load_holding in HOLDING_VALVES
            st = status(margin, warn, worst="warn" if valve else "fail")
            tail = {"fail": ": the motor draws more than reaches its inlet and cavitates; the load can run away. "
                            "Add makeup flow (anti-cavitation valve, boost) or a counterbalance valve.",
                    "warn": (": short, the counterbalance valve will throttle the load down and it may judder."
                             if margin <= 0 else f": under {warn:.0%} in hand."),
                    "pass": "."}[st]
            via_makeup = r.drive_value(c.drive, "makeup_pressure")
            source = ("the other drives leave" if via_makeup is None else
                      "the other drives' return flow and the pump's surplus to tank give")
            yield Check("makeup_flow", "Makeup flow for overrunning load", st, have, need, "flow",
                        f"The overrunning motor needs {fmt(need, 'flow')} at its inlet; {source} "
                        f"{fmt(have, 'flow')}{tail}", drive=c.drive, duty=c.duty, supply=r.supply, mode=r.mode,
                        margin=margin)
            if via_makeup is not None:
                p = via_makeup.value
                margin = (p - MAKEUP_PRESSURE) / MAKEUP_PRESSURE
                st = status(margin, worst="warn")
                yield Check("makeup_flow", "Return pressure pushes the makeup flow", st, p, MAKEUP_PRESSURE,
                            "pressure", f"The return pressure {fmt(p, 'pressure')} pushes oil through the makeup "
                            f"valves into the inlet" + ("." if st == "pass" else
                                                        f", under about {fmt(MAKEUP_PRESSURE, 'pressure')}: the "
                                                        "inlet may not fill and the motor can cavitate; add a "
                                                        "back-pressure valve in the return line."),
                            drive=c.drive, duty=c.duty, supply=r.supply, mode=r.mode, margin=margin)
