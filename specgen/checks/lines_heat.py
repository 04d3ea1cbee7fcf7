"""Line velocity against the rule of thumb of its kind, and the heat load against the cooler.

Margins as defined in checks/status.py.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.calc.lines import line_velocity_limits
from specgen.checks.status import Check, Fmt, below, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

LINE_FAIL_FACTOR = 1.5  # pressure and return lines fail from 1.5 times the rule-of-thumb upper limit


def _velocity_check(kind: str, v: float, fmt: Fmt, **where) -> Check:
    lim = line_velocity_limits(kind)
    if kind == "suction":  # too fast a suction line is a warning (cavitation risk), never a failure
        margin = below(v, lim.high)
        st = status(margin, worst="warn")
        fail_at = None
    else:  # the warning band runs from the upper limit to the failing velocity
        fail_at = LINE_FAIL_FACTOR * lim.high
        margin = below(v, fail_at)
        st = status(margin, below(lim.high, fail_at))
    tail = {"fail": f": far above the {lim.high:g} m/s rule of thumb (failing above {fail_at or 0:g} m/s); "
                    "choose a larger bore.",
            "warn": f": above the {lim.high:g} m/s rule of thumb; expect more loss, heat and noise"
                    + ("; a suction line this fast can cavitate the pump." if kind == "suction" else "."),
            "pass": f", within the {lim.high:g} m/s rule of thumb."}[st]
    return Check("line_velocity", f"{kind.capitalize()} line velocity", st, v, lim.high, "velocity",
                 f"{kind.capitalize()} line velocity {fmt(v, 'velocity')}{tail}", margin=margin, **where)


def line_velocity(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Mean velocity in every given line against the rule-of-thumb limit of its kind (common practice,
    no source): warn above the upper limit; pressure and return lines fail from 1.5 times it."""
    for r in results.duties:
        for kind in ("pressure", "return"):
            key = f"{kind}_line_velocity"
            if key in r.values:
                yield _velocity_check(kind, r[key], fmt, drive=r.drive, duty=r.duty)
    for s in results.supplies:
        if "suction_line_velocity" in s.values:
            yield _velocity_check("suction", s["suction_line_velocity"], fmt, supply=s.supply)


def heat_load(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Heat load of every mode (all supplies together) against the cooler's capacity, when given.
    The check takes the mode as running continuously."""
    if machine.cooler is None:
        return
    warn = machine.thresholds.heat_margin_warn.value
    cap = machine.cooler.capacity
    for m in results.modes:
        q = m["heat_load"]
        margin = below(q, cap)
        st = status(margin, warn)
        parts = ", ".join(f"{supply} {fmt(heat, 'power')}" for supply, heat in m.heat_by_supply.items())
        yield Check("heat_load", "Heat load within cooler capacity", st, q, cap, "power",
                    f"The supplies put {fmt(q, 'power')} of heat into the oil ({parts}) against the cooler's "
                    f"{fmt(cap, 'power')}" + {"fail": ": run continuously the oil overheats.",
                                              "warn": f": under {warn:.0%} in hand.", "pass": "."}[st],
                    mode=m.mode, margin=margin)
