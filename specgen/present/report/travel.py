"""The report's travel section: the machine as a vehicle in one chart and three compact tables.

The chart is tractive effort against ground speed (present/traction_chart.py) from the envelope rows
of the Results; the tables are the vehicle's trace, each driven drive's share and each travel duty
point. Every number is a Results value formatted with units; nothing here recomputes a relation.
"""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present.chart_batch import Batch
from specgen.present.charts import Limit, Point
from specgen.present.report.values import show, slug, trace_row
from specgen.present.traction_chart import tractive_effort_vs_speed
from specgen.units import convert

CHECK_IDS = ("adhesion", "tractive_envelope", "wheel_spin")
DRIVE_COLUMNS = (("relief_effort", "F_relief,i"), ("travel_flow", "q_i"), ("full_displacement_speed", "v_full,i"),
                 ("top_speed", "v_max,i"))
DUTY_COLUMNS = (("ground_speed", "v"), ("tractive_effort", "F"), ("adhesion_limit", "F_adh"),
                ("envelope_effort", "F_env"))


def travel_context(o: Outcome, system: str, checks: list[dict], fig_n, draw: Batch) -> dict | None:
    """The travel section's content; None without a travel block (no figure number is taken then)."""
    tr = o.results.travel
    if tr is None:
        return None
    travel = o.machine.travel
    duties = [{"drive": d, "duty": u, "anchor": f"duty-{slug(d)}-{slug(u)}", "line": tr.lines[(d, u)] or "braking",
               "cells": [show(values[k].value, values[k].kind, system) if k in values else "-" for k, _ in DUTY_COLUMNS]}
              for (d, u), values in tr.duties.items()]
    drives = [{"drive": d, "anchor": f"drive-{slug(d)}",
               "cells": [show(values[k].value, values[k].kind, system) if k in values else "-" for k, _ in DRIVE_COLUMNS]}
              for d, values in tr.per_drive.items()]
    return {
        "title": travel.title,
        "running_gear": travel.running_gear, "chart": _chart(o, system, fig_n, draw),
        "trace": [trace_row(v, system) for v in tr.values.values()],
        "drive_head": [sym for _, sym in DRIVE_COLUMNS], "drives": drives,
        "duty_head": [sym for _, sym in DUTY_COLUMNS], "duties": duties,
        "checks": [c for c in checks if c["id"] == "wheel_spin" or (c["id"] in CHECK_IDS and c["status"] != "pass")],
    }


def _chart(o: Outcome, system: str, fig_n, draw: Batch):
    tr = o.results.travel
    v_unit, f_unit = convert(0.0, "velocity", system)[1], convert(0.0, "force", system)[1]

    def v(x: float) -> float:
        return convert(x, "velocity", system)[0]

    def f(x: float) -> float:
        return convert(x, "force", system)[0]

    env = tr.envelope
    # Driven drives alike at one duty point (both tracks climbing) are one point, named by the duty point.
    found: dict[tuple, list[str]] = {}
    for (d, u), vals in tr.duties.items():
        at = (u, vals["ground_speed"].value, vals["tractive_effort"].value, "envelope_effort" not in vals)
        found.setdefault(at, []).append(d)
    by_duty = {}
    for at in found:
        by_duty[at[0]] = by_duty.get(at[0], 0) + 1
    points = [Point(u if by_duty[u] == 1 else f"{u} ({', '.join(ds)})", v(x), f(y), braking)
              for (u, x, y, braking), ds in found.items()]
    return draw(
        tractive_effort_vs_speed, fig_n(), "Tractive effort against ground speed", x_unit=v_unit, y_unit=f_unit,
        speeds=[v(p.speed) for p in env], envelope=[f(p.effort) for p in env], relief=[f(p.relief) for p in env],
        power=[None if p.power is None else f(p.power) for p in env],
        adhesion=Limit("adhesion limit", show(tr["adhesion_limit"], "force", system), f(tr["adhesion_limit"]), "continuous"),
        top_speed=Limit("top speed", show(tr["top_speed"], "velocity", system), v(tr["top_speed"]), "max"),
        points=points)
