"""Closed-loop (hydrostatic) supplies: the charge pump covers the loop's leakage and flushing, the
pump's stroke covers the motors' flow, and the motors of one loop run in one direction.

Margins as defined in checks/status.py:
  charge_flow    (charge flow - leakage and flushing) / (leakage and flushing); warning band
                 CHARGE_MARGIN_WARN (25 %): leakage grows with wear and temperature, and a charge
                 pump that only just covers a new loop starves a worn one (common practice, no
                 source; from memory charge pumps are 10-25 % of the main pump's displacement)
  pump_stroke    (1 - displacement setting): the share of full stroke left; warning band
                 thresholds.flow_margin_warn (5 %), as for a pump's delivery against its demand
  loop_direction None: a declaration of the modes, not a number
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, below, reaches, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

CHARGE_MARGIN_WARN = 0.25


def _loops(machine: Machine, results: Results):
    """Each closed-loop supply in each mode it runs in."""
    return (r for r in results.supply_modes if machine.supply(r.supply).circuit == "closed_loop")


def charge_flow(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Charge flow against the loop's leakage plus flushing: short, the low side falls below the charge
    pressure, the pistons lift off and the loop cavitates."""
    for r in _loops(machine, results):
        have, need = r["charge_flow"], r["charge_flow_needed"]
        margin = reaches(have, need)
        st = status(margin, CHARGE_MARGIN_WARN)
        yield Check("charge_flow", "Charge flow covers leakage and flushing", st, have, need, "flow",
                    f"The charge pump gives {fmt(have, 'flow')} against {fmt(need, 'flow')} of leakage and flushing"
                    + {"fail": ": the low side cannot hold the charge pressure; the loop cavitates and the motors "
                               "lose control of the load. Fit a larger charge pump or less flushing.",
                       "warn": f": under {CHARGE_MARGIN_WARN:.0%} in hand for wear and hot oil.",
                       "pass": "."}[st], supply=r.supply, mode=r.mode, margin=margin)


def pump_stroke(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """The pump's displacement setting within full stroke: beyond it the pump cannot give (driving) or
    take back (overrunning) the motors' flow."""
    warn = machine.thresholds.flow_margin_warn.value
    for r in _loops(machine, results):
        x = r["pump_displacement_setting"]
        margin = below(x, 1.0)
        st = status(margin, warn)
        overrun = "braking_power" in r.values
        tail = {"fail": (": the pump cannot take the motors' flow back; the load drives the engine over its speed "
                         "or runs away. Give the motors less displacement or the load less speed."
                         if overrun else ": the pump cannot deliver the motors' flow; they run slower than specified."),
                "warn": f": under {warn:.0%} of stroke in hand.", "pass": "."}[st]
        yield Check("pump_stroke", "Pump stroke within full displacement", st, x, 1.0, "ratio",
                    f"The loop {'returns' if overrun else 'takes'} {fmt(r['flow_demand'], 'flow')}: the pump runs at "
                    f"{x:.1%} of its stroke" + tail, supply=r.supply, mode=r.mode, margin=margin)


def loop_direction(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Motors on one loop share its high side: in a mode they all drive or all overrun."""
    for r in _loops(machine, results):
        ways = {c.drive: results.duty(c.drive, c.duty).direction for c in r.contributions}
        if len(set(ways.values())) < 2:
            continue
        over = ", ".join(d for d, w in ways.items() if w == "overrunning")
        yield Check("loop_direction", "Motors of one loop run one way", status(None), None, None, "",
                    f"In this mode {over} overrun while the other motors of the loop drive: motors on one loop "
                    "share its high side, so the overrunning ones are left out of the loop's figures. Give them "
                    "duty points of one direction, or a loop each.", supply=r.supply, mode=r.mode)
