"""The report's load-sensing block of a supply: one table of the pump and each drive per mode
(present/load_sensing.py rows, formatted), and the pressure and flow charts by mode (present/ls_charts.py).
Empty for any other supply."""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present import ls_charts
from specgen.present.chart_batch import Batch
from specgen.present.load_sensing import pump_modes
from specgen.present.report.values import plain, show
from specgen.results import most_severe
from specgen.units import convert


def ls_context(o: Outcome, sup, system: str, fig_n, draw: Batch) -> dict | None:
    """Rows and charts of a load-sensing supply; None for any other."""
    modes = pump_modes(o, sup.id)
    if not modes:
        return None
    rows = []
    for pm in modes:
        rows.append({"mode": pm.mode, "what": "pump", "p": show(pm.pressure, "pressure", system),
                     "asked": show(pm.available, "flow", system) if pm.available is not None else "-",
                     "got": show(pm.delivered, "flow", system), "n": "", "n_got": "",
                     "loss": show(pm.throttling, "power", system), "note": pm.note})
        rows += [{"mode": pm.mode, "what": f"{s.drive} at {s.duty}", "p": show(s.need, "pressure", system),
                  "asked": show(s.asked, "flow", system), "got": show(s.reached, "flow", system),
                  "n": show(s.speed, "speed", system), "n_got": show(s.speed_reached, "speed", system),
                  "loss": show(s.throttling, "power", system), "note": ""} for s in pm.drives]
    return {"rows": rows, "margin": show(sup.pump.ls_margin, "pressure", system),
            "valves": sup.ls_valves.replace("_", "-"), "charts": _charts(o, sup, modes, system, fig_n, draw)}


def _charts(o: Outcome, sup, modes, system: str, fig_n, draw: Batch) -> list:
    p_unit, q_unit = convert(0.0, "pressure", system)[1], convert(0.0, "flow", system)[1]
    drives = list(dict.fromkeys(s.drive for pm in modes for s in pm.drives))
    needs = [[next((plain(s.need, "pressure", system) for s in pm.drives if s.drive == d), None) for d in drives]
             for pm in modes]
    by_check: dict[str, list[str]] = {}
    for c in o.results.checks:
        if c.id == "reached_speed" and c.supply == sup.id:
            by_check.setdefault(c.mode, []).append(c.status)
    full = o.results.supply_result(sup.id)["pump_delivery"]
    pressure = draw(ls_charts.pressure_by_mode, fig_n(), f"{sup.title}: pump pressure and drive needs by mode",
                    unit=p_unit, modes=[pm.mode for pm in modes], pump=[plain(pm.pressure, "pressure", system)
                                                                        for pm in modes],
                    drives=drives, needs=needs, relief=plain(sup.relief_setting, "pressure", system))
    flow = draw(ls_charts.flow_by_mode, fig_n(), f"{sup.title}: flow asked and delivered by mode", unit=q_unit,
                modes=[pm.mode for pm in modes], asked=[plain(sum(s.asked for s in pm.drives), "flow", system)
                                                        for pm in modes],
                delivered=[plain(pm.delivered, "flow", system) for pm in modes],
                available=[plain(pm.available if pm.available is not None else full, "flow", system) for pm in modes],
                full_stroke=plain(full, "flow", system),
                statuses=[(lambda s: s if s != "pass" else None)(most_severe(by_check.get(pm.mode, [])))
                          for pm in modes])
    return [pressure, flow]
