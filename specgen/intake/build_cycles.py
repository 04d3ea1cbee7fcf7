"""Build the duty cycles and the oil-temperature settings from a schema-valid spec.

A step runs a mode for a duration, or for a share of the cycle's period. The period defaults to
the sum of the steps; a longer period leaves time in which no step runs (no heat into the oil).
Every refused value is a problem at its field (mode references are checked in validate.py).
"""

from __future__ import annotations

import math

from specgen.intake import defaults
from specgen.intake.model import CycleStep, DutyCycle, Ratio
from specgen.intake.quantities import Builder

MAX_CYCLES = 20  # duty cycles a spec may hold: each is warmed up over many repetitions


def build_cycle(b: Builder, cid: str, raw: dict) -> DutyCycle:
    path = ("duty_cycles", cid)
    period = b.quantity(raw, "period", path, "time")
    steps = []
    for i, step in enumerate(raw["steps"]):
        here = path + ("steps", i)
        if "duration" in step:
            duration = b.quantity(step, "duration", here, "time")
        else:
            share = b.ratio(step, "share", here, 0.0, efficiency=False)
            if period is None:
                b.fail(here + ("share",), "a step given as a share needs the cycle's period")
                duration = math.nan
            elif not 0 < share.value <= 1:
                b.fail(here + ("share",), f"share {step['share']!r} must lie in (0, 100 %]")
                duration = math.nan
            else:
                duration = share.value * period
        steps.append(CycleStep(mode=step["mode"], duration=duration))
    total = sum(s.duration for s in steps)
    if period is None:
        period = total
    elif math.isfinite(total) and math.isfinite(period) and total > period * (1 + 1e-9):
        b.fail(path + ("period",), f"the steps take {total:g} s, longer than the period of {period:g} s")
    return DutyCycle(id=cid, title=raw.get("title", cid), steps=tuple(steps), period=period)


def build_cycles(b: Builder, raw: dict | None) -> tuple[DutyCycle, ...]:
    if not raw:
        return ()
    if len(raw) > MAX_CYCLES:
        b.fail(("duty_cycles",), f"{len(raw)} duty cycles given; a spec may hold at most {MAX_CYCLES}")
        return ()
    return tuple(build_cycle(b, cid, c) for cid, c in raw.items())


def build_max_oil_temperature(b: Builder, d: dict) -> Ratio:
    if "max_oil_temperature" in d:
        return Ratio(b.quantity(d, "max_oil_temperature", (), "temperature", sign="any"))
    return Ratio(defaults.MAX_OIL_TEMPERATURE, assumed=True, basis=defaults.MAX_OIL_BASIS)
