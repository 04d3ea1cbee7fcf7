"""The report's sensitivity section: a tornado chart (present/chart_tornado.py) for each of the weakest
margins, from the sensitivity table (specgen/sensitivity.py) computed when the report is asked for it."""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present import chart_tornado
from specgen.sensitivity import SHOWN_INPUTS


def sensitivity_context(o: Outcome, fig_n, draw) -> dict | None:
    """None without a sensitivity table (the report then has no such section)."""
    s = getattr(o, "sensitivity", None)
    if s is None:
        return None
    step = f"{s.step * 100:g} %"
    charts = []
    for m in s.weakest:
        rows = [chart_tornado.TornadoRow(e.input, _points(e.up), _points(e.down)) for e in m.effects[:SHOWN_INPUTS]]
        if rows:
            charts.append({"name": m.name, "margin": f"{m.margin * 100:.2f} %",
                           "chart": draw(chart_tornado.tornado, fig_n(), f"{m.name}: margin {m.margin * 100:.2f} %",
                                         rows, step)})
    return {"step": step, "inputs": len(s.inputs), "skipped": len(s.skipped), "charts": charts}


def _points(x: float | None) -> float | None:
    return None if x is None else x * 100.0
