"""Terminal text: the drive table, the supply table and the checks, in aligned columns."""

from __future__ import annotations

from specgen.cautions import SHORT
from specgen.results import RANK
from specgen.pipeline import Outcome
from specgen.present import load_sensing
from specgen.present.closed_loop import LOOP_COLUMNS, cells, duty_points, loop_modes
from specgen.present.json_out import assumed_list
from specgen.present.travel_out import travel_lines
from specgen.units import format_si
from specgen.safe_text import escape

DUTY_COLUMNS = (
    ("motor_torque", "T motor"), ("motor_speed", "n motor"), ("pressure_differential", "dp"),
    ("inlet_pressure", "p in"), ("flow_demand", "q"), ("shaft_power", "P shaft"),
    ("relief_torque", "T at limit"),
)
# Pressure-budget values beyond the table's columns, listed where a duty point or a series mode has them
BUDGET_KEYS = ("static_load_torque", "starting_torque_motor", "breakaway_torque", "valve_drop_to_motor",
               "valve_drop_to_tank", "supply_pressure_required", "braking_torque_needed", "port_relief_braking_torque",
               "load_induced_pressure", "counterbalance_heat")
SERIES_KEYS = ("inlet_pressure", "outlet_pressure", "relief_torque", "start_outlet_pressure", "breakaway_torque",
               "makeup_available", "makeup_pressure")
SUPPLY_COLUMNS = (
    ("flow_demand", "demand"), ("pump_delivery", "delivery"), ("flow_surplus", "surplus"),
    ("working_pressure", "p work"), ("pump_input_power", "P pump in"), ("prime_mover_power", "P available"),
)

def table(header: list[str], rows: list[list[str]]) -> list[str]:
    rows = [[escape(c) for c in r] for r in rows]  # ids and notes from the spec: one line each
    widths = [max(len(r[i]) for r in [header] + rows) for i in range(len(header))]
    def line(cells):
        return "  ".join(c.ljust(w) for c, w in zip(cells, widths)).rstrip()
    return [line(header), line(["-" * w for w in widths])] + [line(r) for r in rows]


def headline(o: Outcome) -> str:
    m, c = o.machine, o.results.counts()
    return (f"{escape(o.source.name)}: {o.results.verdict.upper()}  {escape(m.title)} rev {escape(m.revision)}  "
            f"({c['pass']} pass, {c['warn']} warn, {c['fail']} fail)")


def checks_lines(o: Outcome, only_problems: bool) -> list[str]:
    checks = sorted(o.results.checks, key=lambda c: -RANK[c.status])
    if only_problems:
        checks = [c for c in checks if c.status != "pass"]
    return [f"{c.status.upper():4}  {c.id:20} {escape(c.where)}{_at(c)}: {escape(c.message)}" for c in checks]


def _at(c) -> str:
    """Where a check found at an operating corner says so; the nominal point says nothing."""
    return f" [at corner {c.corner}]" if c.corner else ""


def corner_lines(o: Outcome) -> list[str]:
    """Each operating corner: what it moves and its own verdict, one line each."""
    if not o.results.corners:
        return []
    out = ["", "Operating corners (every check above is shown at its worst; the nominal point wins a tie)"]
    for r in o.results.corners:
        moves = "; ".join(f"{k} {v}" for k, v in r.overrides)
        modes = f" (modes {', '.join(r.modes)})" if r.modes else ""
        note = f" ({r.basis})" if r.assumed else ""
        out.append(escape(f"  {r.id}: {r.title}{modes}: {moves}{note} -> {r.verdict}"))
    return out


def fluid_sizing_heat_lines(o: Outcome, system: str) -> list[str]:
    """Fluid, sizing and variable-motor values, and each mode's heat load, one line each."""
    r = o.results
    picked = [("fluid", v) for v in r.fluid.values.values()]
    picked += [(f"drive {d.drive}", v) for d in r.drives for v in d.values.values()]
    picked += [(f"supply {s.supply}", v) for s in r.supplies for k, v in s.values.items()
               if k.startswith("worst_") or k.startswith("pump_") and "inlet" in k]
    picked += [(f"mode {m.mode}", v) for m in r.modes for v in m.values.values()]
    if not picked:
        return []
    rows = [[where, v.label, format_si(v.value, v.kind, system) + (" (assumed)" if v.assumed else ""), v.note]
            for where, v in picked]
    return ["", "Fluid, sizing, variable motors and heat"] + table(["where", "quantity", "value", "note"], rows)


def cycle_lines(o: Outcome, system: str) -> list[str]:
    """Each duty cycle's heat, mean prime-mover power per supply, time above continuous pressure and oil
    temperature, one line each (nothing without duty cycles)."""
    rows = []
    for c in o.results.cycles:
        where = f"cycle {c.cycle}"
        rows += [[where, v.label, format_si(v.value, v.kind, system) + (" (assumed)" if v.assumed else ""), v.note]
                 for v in c.values.values()]
        rows += [[where, f"Mean prime-mover power, supply {s}", format_si(p, "power", system), ""]
                 for s, p in c.per_supply.items()]
        rows += [[where, f"Time above continuous pressure rating, drive {d}", format_si(x, "ratio", system), ""]
                 for d, x in c.above_continuous.items()]
        if c.missing:
            rows.append([where, "Oil temperature", "-", c.missing])
    if not rows:
        return []
    return ["", "Duty cycles and oil temperature"] + table(["where", "quantity", "value", "note"], rows)


def prime_mover_lines(o: Outcome, system: str) -> list[str]:
    """Each shared prime mover in each mode: speed, power available, each pump's input power, the sum and
    the torque at its shaft, one line each (nothing without shared prime movers)."""
    rows = []
    for r in o.results.prime_movers:
        pumps = ", ".join(f"{sid} {format_si(v['pump_input_power'].value, 'power', system)}"
                          for sid, v in r.per_supply.items())
        rows.append([r.prime_mover, r.mode, f"{r.speed_name} {format_si(r['prime_mover_speed'], 'speed', system)}",
                     format_si(r["power_available"], "power", system), pumps,
                     format_si(r["power_used"], "power", system), format_si(r["torque_used"], "torque", system)])
    if not rows:
        return []
    return ["", "Shared prime movers in each mode"] + table(
        ["prime mover", "mode", "speed", "P available", "pumps (P in)", "P sum", "T sum"], rows)


def budget_lines(o: Outcome, system: str) -> list[str]:
    """Starting, valve and braking values of each duty point, and each drive's values in a series or
    with makeup flow in each mode, one line each."""
    r = o.results
    picked = [(f"{d.drive} at {d.duty}", d.values[k]) for d in r.duties for k in BUDGET_KEYS if k in d.values
              and (k != "breakaway_torque" or "starting_torque_motor" in d.values)
              and (k != "supply_pressure_required" or "valve_drop_to_motor" in d.values)]
    picked += [(f"{sm.supply}/{sm.mode}: {d}", vals[k]) for sm in r.supply_modes for d, vals in sm.per_drive.items()
               for k in SERIES_KEYS if k in vals]
    if not picked:
        return []
    rows = [[where, v.label, format_si(v.value, v.kind, system) + (" (assumed)" if v.assumed else ""), v.note]
            for where, v in picked]
    return ["", "Pressure budget: starting, valves, braking, series"] + table(["where", "quantity", "value", "note"],
                                                                            rows)


def closed_loop_lines(o: Outcome, system: str) -> list[str]:
    """Each closed-loop supply in each mode: stroke, high and low side, flows, pump input, charge, heat."""
    rows = [[r.supply, r.mode, duty_points(r)] + cells(r, system) for r in loop_modes(o)]
    if not rows:
        return []
    return ["", "Closed-loop transmissions (negative pump input: the load drives the prime mover)"] + table(
        ["supply", "mode", "duty points"] + [h for _, h, _ in LOOP_COLUMNS], rows)


def render(o: Outcome, quiet: bool = False, review=None) -> str:
    """``review``: the spec's review.ReviewStatus, shown under the headline when given."""
    system = o.machine.display_units
    out = [headline(o)] + ([f"Review: {escape(review.text)}"] if review is not None else [])
    out += [f"Accepted: {escape(line)}" for line in (review.disposition_lines if review is not None else [])]
    if not quiet:
        out += ["", "Drives at each duty point (motor shaft)"]
        rows = []
        for r in o.results.duties:
            rows.append([r.drive, r.duty + (" (overrun)" if r.direction == "overrunning" else "")] + [
                format_si(r.values[k].value, r.values[k].kind, system) for k, _ in DUTY_COLUMNS])
        out += table(["drive", "duty point"] + [h for _, h in DUTY_COLUMNS], rows)
        out += ["", "Supplies in each operating mode"]
        rows = []
        for r in o.results.supply_modes:
            rows.append([r.supply, r.mode] + [
                format_si(r.values[k].value, r.values[k].kind, system) if k in r.values else "-"
                for k, _ in SUPPLY_COLUMNS])
        out += table(["supply", "mode"] + [h for _, h in SUPPLY_COLUMNS], rows)
        out += closed_loop_lines(o, system)
        out += fluid_sizing_heat_lines(o, system)
        out += prime_mover_lines(o, system)
        out += cycle_lines(o, system)
        out += budget_lines(o, system)
        out += load_sensing.text_lines(o, system)
        out += travel_lines(o.results.travel, system, table)
        out += [f"Supply {escape(s.id)} feeds no drive in this spec ({escape(s.feeds)}): not computed"
                for s in o.machine.supplies if s.feeds is not None and not any(
                    d.supply == s.id for d in o.machine.drives)]
        out += ["", "Checks (failures and warnings first)"]
    problems = checks_lines(o, only_problems=quiet)
    out += problems
    out += corner_lines(o) if not quiet else []
    if getattr(o, "variants", ()):
        from specgen.present.variants_text import variant_lines

        out += variant_lines(o, quiet)
    if getattr(o, "sensitivity", None) is not None:
        from specgen.present.sensitivity_out import text_lines

        out += text_lines(o.sensitivity)
    assumed = assumed_list(o.results, system)
    if assumed and not quiet:
        out += ["", "Assumed values (not given in the spec)"]
        out += [escape(f"  {a['where']} = {a['value']:g}{' ' + a['unit'] if 'unit' in a else ''}: {a['basis']}")
                for a in assumed]
    out += ["", SHORT] if not quiet else [SHORT]  # the caution line is never left out, quiet or not
    return "\n".join(out) + "\n"
