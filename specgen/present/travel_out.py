"""The machine as a vehicle in the text and JSON outputs: its tractive effort values, each driven drive's
share, each travel duty point, and the envelope's corners (text) or every envelope row (JSON)."""

from __future__ import annotations

from typing import Callable

from specgen.results import TravelResult
from specgen.units import convert, format_si


def corners(envelope) -> list:
    """The envelope rows where the limiting line changes, with the first and the last: its shape in a few rows."""
    out = []
    for k, p in enumerate(envelope):
        if k == 0 or k == len(envelope) - 1 or p.limit != envelope[k - 1].limit:
            out.append(p)
    return out


def travel_lines(travel: TravelResult | None, system: str, table: Callable) -> list[str]:
    """Text lines: every travel value (vehicle, driven drives, duty points) and the envelope's corners."""
    if travel is None:
        return []
    picked = [("vehicle", v) for v in travel.values.values()]
    picked += [(f"drive {d}", v) for d, values in travel.per_drive.items() for v in values.values()]
    picked += [(f"{d} at {u}", v) for (d, u), values in travel.duties.items() for v in values.values()]
    rows = [[where, v.label, format_si(v.value, v.kind, system) + (" (assumed)" if v.assumed else ""), v.note]
            for where, v in picked]
    out = ["", "Travel: tractive effort against ground speed"] + table(["where", "quantity", "value", "note"], rows)
    env = [[format_si(p.speed, "velocity", system), format_si(p.effort, "force", system), p.limit]
           for p in corners(travel.envelope)]
    return out + ["", "Travel envelope (where the limiting line changes)"] + table(["speed", "effort", "set by"], env)


def travel_document(travel: TravelResult, system: str, value: Callable) -> dict:
    """The JSON "travel" object; ``value(Value, system)`` writes one value."""
    def pair(x: float, kind: str) -> dict:
        return dict(zip(("value", "unit"), convert(x, kind, system)))

    return {
        "values": {k: value(v, system) for k, v in travel.values.items()},
        "per_drive": {d: {k: value(v, system) for k, v in vals.items()} for d, vals in travel.per_drive.items()},
        "duty_points": [{"drive": d, "duty": u, "limit_line": travel.lines[(d, u)],
                         "values": {k: value(v, system) for k, v in vals.items()}}
                        for (d, u), vals in travel.duties.items()],
        "envelope": [{"speed": pair(p.speed, "velocity"), "effort": pair(p.effort, "force"), "limit": p.limit}
                     for p in travel.envelope],
    }
