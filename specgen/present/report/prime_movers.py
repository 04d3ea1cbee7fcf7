"""The report's shared prime movers: what was entered, and per mode one compact table row.

For each prime mover: its figures as entered (rated power, named speeds, power curve, overspeed limit,
motoring torque) in one line; a table with a row per mode that runs a pump on it (speed, power
available, each pump's input power, the sum and the prime_mover_load check's margin); the checks on
it; and its calculation trace, each relation once with a column a mode (a mode's column is anchored
``prime-mover-<id>-<mode>``, where its checks link).
Every number is a Results value or a check's margin, formatted; nothing is recomputed here.
"""

from __future__ import annotations

from dataclasses import replace

from specgen.pipeline import Outcome
from specgen.present.report.grouped import Case, grouped
from specgen.present.report.values import show, slug

NOUN = {"engine": "Engine", "electric_motor": "Electric motor"}
CASE_COLUMNS = 7  # value columns a grouped trace prints side by side on a portrait page


def anchor(prime_mover: str, mode: str | None = None) -> str:
    """The HTML id of a prime mover's section, or of its trace in one mode (where its checks link)."""
    return f"prime-mover-{slug(prime_mover)}" + (f"-{slug(mode)}" if mode is not None else "")


def _entered(mover, system: str) -> str:
    parts = [f"rated power {show(mover.power, 'power', system)}",
             "speeds " + ", ".join(f"{name} {show(n, 'speed', system)}" for name, n in mover.speeds.items())
             + f" (default: {mover.default_speed})"]
    if mover.power_curve:
        parts.append("power curve " + ", ".join(f"{show(p.power, 'power', system)} at {show(p.speed, 'speed', system)}"
                                                for p in mover.power_curve) + ", linear between")
    parts.append("overspeed limit " + (show(mover.max_speed, "speed", system) if mover.max_speed is not None
                                       else "not given"))
    parts.append("motoring torque " + (show(mover.motoring_torque, "torque", system)
                                       if mover.motoring_torque is not None else "not given"))
    return "; ".join(parts)


def prime_mover_sections(o: Outcome, system: str, checks: list[dict]) -> list[dict]:
    """One section per shared prime mover that runs in some mode (empty without shared prime movers)."""
    r = o.results
    load = {(c.prime_mover, c.mode): c.margin for c in r.checks if c.id == "prime_mover_load"}
    out = []
    for mover in o.machine.prime_movers:
        rows = [x for x in r.prime_movers if x.prime_mover == mover.id]
        if not rows:
            continue
        pumps = [s.id for s in o.machine.supplies if s.prime_mover == mover.id]
        table = []
        for x in rows:
            cells = [show(x.per_supply[s]["pump_input_power"].value, "power", system) if s in x.per_supply else "-"
                     for s in pumps]
            margin = load.get((mover.id, x.mode))
            table.append({"mode": x.mode, "speed": f"{x.speed_name} {show(x['prime_mover_speed'], 'speed', system)}",
                          "available": show(x["power_available"], "power", system), "pumps": cells,
                          "sum": show(x["power_used"], "power", system),
                          "margin": show(margin, "ratio", system) if margin is not None else "-"})
        cases = []
        for x in rows:
            values = {f"prime_mover_torque:{sid}": replace(v, label=f"{v.label}, supply {sid}")
                      for sid, vals in x.per_supply.items() for k, v in vals.items() if k == "prime_mover_torque"}
            values.update(x.values)
            cases.append(Case(x.mode, anchor(mover.id, x.mode), values))
        # each relation once with a column a mode, as the supplies' traces (at most a page's width of columns)
        parts = [cases[k:k + CASE_COLUMNS] for k in range(0, len(cases), CASE_COLUMNS)]
        traces = [grouped(anchor(mover.id) + (f"-part-{n}" if len(parts) > 1 else "-trace"),
                          f"Calculation trace, {mover.id}" + (f" ({n} of {len(parts)})" if len(parts) > 1 else ""),
                          part, system, checks) for n, part in enumerate(parts, start=1)]
        for t in traces:
            t["checks"] = t["problems"] + t["passing"]
        out.append({"id": mover.id, "title": mover.title, "anchor": anchor(mover.id), "noun": NOUN[mover.kind],
                    "entered": _entered(mover, system), "pumps": pumps, "rows": table, "traces": traces,
                    "checks": [c for t in traces for c in t["checks"]]})
    return out
