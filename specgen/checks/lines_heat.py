"""Line velocity against the rule of thumb of its kind, the heat load against the cooler, and the oil
temperature of each duty cycle against its limit.

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


OIL_WARN_BAND = 5.0  # K below the oil limit where the oil_temperature check warns (common practice, no source)


def cycled_modes(machine: Machine) -> set[str]:
    """Modes judged by their duty cycle: listed in a cycle and not declared continuous."""
    listed = {m for c in machine.duty_cycles for m in c.modes}
    return {m.id for m in machine.modes if m.id in listed and not m.continuous}


def heat_load(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Heat load of every mode (all supplies together) against the cooler's capacity, when given.
    The check takes the mode as running continuously, except a mode a duty cycle lists (and not
    declared continuous): that mode is judged by the cycle's mean heat load instead."""
    if machine.cooler is None:
        return
    warn = machine.thresholds.heat_margin_warn.value
    cap = machine.cooler.capacity
    by_cycle = cycled_modes(machine)
    for m in results.modes:
        if m.mode in by_cycle:
            continue
        q = m["heat_load"]
        margin = below(q, cap)
        st = status(margin, warn)
        parts = ", ".join(f"{supply} {fmt(heat, 'power')}" for supply, heat in m.heat_by_supply.items())
        yield Check("heat_load", "Heat load within cooler capacity", st, q, cap, "power",
                    f"The supplies put {fmt(q, 'power')} of heat into the oil ({parts}) against the cooler's "
                    f"{fmt(cap, 'power')}" + {"fail": ": run continuously the oil overheats.",
                                              "warn": f": under {warn:.0%} in hand.", "pass": "."}[st],
                    mode=m.mode, margin=margin)
    for c in results.cycles:
        q = c["mean_heat_load"]
        margin = below(q, cap)
        st = status(margin, warn)
        yield Check("heat_load", "Mean heat load of the duty cycle within cooler capacity", st, q, cap, "power",
                    f"Over the cycle the supplies put a mean {fmt(q, 'power')} of heat into the oil (peak "
                    f"{fmt(c['peak_heat_load'], 'power')}) against the cooler's {fmt(cap, 'power')}"
                    + {"fail": ": repeated without end the oil overheats.",
                       "warn": f": under {warn:.0%} in hand.", "pass": "."}[st],
                    cycle=c.cycle, margin=margin)


def oil_margin(peak: float, limit: float, ambient: float) -> tuple[float, float]:
    """(margin, warning band) of an oil temperature: margin = (T_max - T) / (T_max - T_amb), the band
    OIL_WARN_BAND kelvin in the same fraction. Example: limit 80 degC, ambient 30 degC, oil 77 degC ->
    margin 3/50 = 0.06, band 5/50 = 0.10: warn."""
    reference = limit - ambient if limit > ambient else 1.0  # an ambient at the limit leaves no room: any oil fails
    gap = round(limit - peak, 9)  # kelvin to a nanokelvin: 5 K below the limit is on the band's edge, not inside
    return gap / reference, OIL_WARN_BAND / reference


def oil_temperature(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Peak oil temperature of every duty cycle (repeated from ambient) against max_oil_temperature:
    fail at or above the limit, warn within OIL_WARN_BAND of it. Warns when it cannot be computed."""
    limit = machine.max_oil_temperature.value
    title = "Oil temperature over the duty cycle"
    for c in results.cycles:
        if c.missing:
            yield Check("oil_temperature", title, status(None, worst="warn"), None, limit, "temperature",
                        f"No oil temperature: {c.missing}.", cycle=c.cycle)
            continue
        peak = max(c["peak_temperature"], c["steady_temperature"])
        margin, band = oil_margin(peak, limit, machine.ambient_temperature)
        st = status(margin, band)
        settled = "" if c.settled else " (the repeating cycle's peak; the warm-up from ambient is longer than charted)"
        yield Check("oil_temperature", title, st, peak, limit, "temperature",
                    f"The oil reaches {fmt(peak, 'temperature')} (steady {fmt(c['steady_temperature'], 'temperature')})"
                    f"{settled} against the limit of {fmt(limit, 'temperature')}"
                    + {"fail": ": add cooling or shorten the working share of the cycle.",
                       "warn": f": within {OIL_WARN_BAND:g} K of it.", "pass": "."}[st],
                    cycle=c.cycle, margin=margin)
