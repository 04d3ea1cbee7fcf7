"""The intermittent pressure rating against the duty cycle: how much of the cycle a drive spends above
its continuous rating, against the share of time the maker allows the intermittent rating to be used.

    margin = (s_allowed - s_above) / s_allowed

s_above: the cycle's time share with the motor's working pressure above its continuous rating
(resolve/thermal.py, CycleResult.above_continuous); s_allowed: ``rating.intermittent_share``.
Fail at or above the allowed share (status.py's one rule: at the limit counts as crossed), warn
within INTERMITTENT_WARN_BAND of it, pass below. Only drives whose motor gives an intermittent share
are judged here; without one, time above the continuous rating is judged, duty point by duty point,
by continuous_pressure alone.

Worked example: 20 % allowed, 19 s of a 100 s cycle above the continuous rating: margin
(0.20 - 0.19)/0.20 = 0.05, inside the 0.10 band: warn.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

# A tenth of the allowed share: 18 % of the cycle against a 20 % allowance already warns, since a
# step a little longer than planned takes the drive past it (common practice, no source).
INTERMITTENT_WARN_BAND = 0.10


def _margin(share: float, allowed: float) -> float:
    """(s_allowed - s_above) / s_allowed; with no time allowed at all, any time above fails (margin
    -s_above) and none passes (infinite margin, as status.reaches gives a zero need)."""
    if allowed > 0:
        return (allowed - share) / allowed
    return -share if share > 0 else float("inf")


def intermittent_share(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Per duty cycle and drive: the share of the cycle above the continuous rating against the
    motor's intermittent_share."""
    title = "Time above the continuous rating within the intermittent share"
    for c in results.cycles:
        for drive in machine.drives:
            allowed = drive.motor.rating.intermittent_share
            if allowed is None or drive.id not in c.above_continuous:
                continue
            share = c.above_continuous[drive.id]
            margin = _margin(share, allowed)
            st = status(margin, INTERMITTENT_WARN_BAND)
            rating = drive.motor.rating.continuous_pressure
            yield Check("intermittent_share", title, st, share, allowed, "ratio",
                        f"The drive works above its continuous rating {fmt(rating, 'pressure')} "
                        f"for {fmt(share, 'ratio')} "
                        f"of the cycle against the {fmt(allowed, 'ratio')} the intermittent rating allows"
                        + {"fail": ": the motor is overloaded over the cycle; lower the pressure or the share.",
                           "warn": ": within a tenth of the allowance.", "pass": "."}[st],
                        drive=drive.id, cycle=c.cycle, margin=margin)
