"""Load-sensing supply checks: does every running drive reach its duty speed with the flow the pump,
the power limiter, the priority valve, a flow divider and the valves' compensators leave it.

Margin (checks/status.py): (flow offered to the drive - flow it needs) / flow it needs, the offer
being what the sharing rule would give it (specgen/calc/load_sensing.py). Fail at or below 0 (the
drive runs slower than its duty speed, or exactly at the edge); warn inside the speed warning band
(thresholds.speed_margin_warn, 5 % by default): the drive gets its flow with little in hand.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, reaches, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results


def reached_speed(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Each drive on a load-sensing supply, in every mode: the motor speed it reaches against its duty speed."""
    warn = machine.thresholds.speed_margin_warn.value
    for r in results.supply_modes:
        for c in r.contributions:
            reached, offered = r.drive_value(c.drive, "reached_speed"), r.drive_value(c.drive, "flow_offered")
            if reached is None or offered is None:
                continue
            duty = results.duty(c.drive, c.duty)
            n, q = duty["motor_speed"], duty["flow_demand"]
            margin = reaches(offered.value, q)
            st = status(margin, warn)
            got = r.drive_value(c.drive, "reached_flow").value
            tail = {"fail": (f": it gets {fmt(got, 'flow')} of the {fmt(q, 'flow')} it needs and runs slow."
                             if got < q else ": it gets its flow with nothing in hand."),
                    "warn": f": it gets its flow with under {warn:.0%} in hand.", "pass": "."}[st]
            yield Check("reached_speed", "Drive reaches its duty speed", st, reached.value, n, "speed",
                        f"Motor speed reached {fmt(reached.value, 'speed')} against the duty speed "
                        f"{fmt(n, 'speed')}{tail}", drive=c.drive, duty=c.duty, supply=r.supply, mode=r.mode,
                        margin=margin)
