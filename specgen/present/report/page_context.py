"""The report page's context: every value the template shows, as plain values and formatted text.

``context(outcome, ...)`` walks the machine -- checks, supplies, drives, modes, the fluid, the
assumed values, the symbols of the traces, the checklist of items the calculation cannot cover and
the sign-off -- and asks for the charts (chart_data.py) as it goes. Every number shown is a Results
value (or a model input) formatted with units.format_si in the machine's display units; nothing
here recomputes a relation.
"""

from __future__ import annotations

from specgen import __version__
from specgen.results import RANK
from specgen.cautions import CAUTIONS
from specgen.fingerprint import Fingerprint
from specgen.pipeline import Outcome
from specgen.present.chart_batch import Batch
from specgen.present.markdown_text import to_html
from specgen.present.report.chart_data import cycle_chart, drive_charts, margin_charts, supply_charts
from specgen.present.report.entered import drive_rows, duty_rows, fluid_rows, given_text, supply_rows
from specgen.present.report.sensitivity import sensitivity_context
from specgen.present.report.values import STATUS_WORD, show, slug, trace_row
from specgen.present.report.variants import variants_context
from specgen.results import Check


MANUAL_ITEMS = (
    ("Hoses, tubes and fittings",
     "Every hose, tube, fitting and port in each circuit is rated for a working pressure at least equal to "
     "the relief setting of its supply{reliefs}, with the maker's safety factor, and suits the fluid and "
     "temperature."),
    ("Brakes and load holding",
     "Every suspended or overrunning load{overrun} is held by a load-holding or counterbalance valve fitted "
     "at the motor, and by a brake that holds on loss of pressure where people can be beneath or beside it."),
    ("Guarding", "Rotating shafts, couplings, drums, reels, belts and pinch points are guarded."),
    ("Emergency stop",
     "An emergency stop brings every drive to a safe stop and holds it; stored energy is released or "
     "held safely on stop."),
    ("Filtration and fluid cleanliness",
     "Filtration holds the fluid to an ISO 4406 cleanliness code that meets the most sensitive component's "
     "requirement; filters carry a clogging indicator."),
    ("Makers' data", "Every efficiency, rating and limit used above agrees with the component makers' current "
     "data sheets; every value marked assumed has been replaced or accepted."),
    ("Standards and codes",
     "The hydraulic system complies with ISO 4413 (general rules and safety requirements for hydraulic "
     "systems) and the local codes and regulations that apply to the machine."),
)

SIGNOFF_ROLES = (("prepared_by", "Prepared by"), ("checked_by", "Checked by"), ("approved_by", "Approved by"))

DUTY_COLUMNS = (("motor_torque", "T"), ("motor_speed", "n"), ("pressure_differential", "dp"),
                ("inlet_pressure", "p_in"), ("flow_demand", "q"), ("shaft_power", "P"),
                ("relief_torque", "T_relief"))

SUPPLY_COLUMNS = (("flow_demand", "q_sum"), ("pump_delivery", "q_p"), ("flow_surplus", "dq"),
                  ("working_pressure", "p_s"), ("pump_input_power", "P_in"), ("prime_mover_power", "P_pm"))


def context(o: Outcome, *, fp: Fingerprint, date: str | None = None, reviews: list | None = None,
            draw: Batch | None = None) -> dict:
    """Everything the report template shows, as plain values and formatted text.

    The charts are asked for from ``draw`` and left for the caller to draw (Batch.start, finish);
    without it they are drawn here, before this returns."""
    m, r = o.machine, o.results
    system = m.display_units
    fig_counter = iter(range(1, 10_000))

    def fig_n() -> str:
        return f"fig{next(fig_counter)}"

    checks = _checks(o, system)
    problems = sorted((c for c in checks if c["status"] != "pass"), key=lambda c: (-RANK[c["status"]], c["n"]))
    # The charts are asked for while the context is built and drawn together: many of them in
    # parallel (chart_batch.py), in the same order and to the same bytes.
    own_batch = draw is None
    draw = Batch() if own_batch else draw
    margins = margin_charts(o, fig_n, draw)
    supplies = [_supply_context(o, sup, system, checks, fig_n, draw) for sup in m.supplies]
    drives = [_drive_context(o, d, system, checks, fig_n, draw) for d in m.drives]
    mode_traces = [_trace_block(f"mode-{slug(x.mode)}", f"Mode {x.mode}", x.values, system, checks)
                   for x in map(r.mode_result, (md.id for md in m.modes)) if x is not None and x.values]
    cycles = [_cycle_context(o, c, system, checks, fig_n, draw) for c in r.cycles]
    fluid_values = r.fluid.values
    extras = {"variants": variants_context(o), "sensitivity": sensitivity_context(o, fig_n, draw)}
    if own_batch:
        draw.draw()
    fp_footer = f"{m.title[:80]} - rev {m.revision} - spec sha256 {fp.short}"
    return {
        "machine": {"id": m.id, "title": m.title, "revision": m.revision, "units": system,
                    "page_size": m.page_size if m.page_size in ("A4", "Letter") else "A4"},
        "spec_file": o.source.name, "fingerprint": fp, "version": __version__, "date": date,
        "footer": fp_footer,
        "verdict": r.verdict, "verdict_word": STATUS_WORD[r.verdict], "counts": r.counts(),
        "problems": problems, "checks": checks,
        "corners": [{"id": k.id, "title": k.title, "modes": ", ".join(k.modes),
                     "moves": "; ".join(f"{path} {value}" for path, value in k.overrides),
                     "basis": k.basis if k.assumed else "", "verdict": k.verdict,
                     "verdict_word": STATUS_WORD[k.verdict]} for k in r.corners],
        "cautions": [{"title": t, "text": x} for t, x in CAUTIONS],
        "description_html": to_html(m.description),
        "fluid": fluid_rows(o, system),
        "fluid_trace": _trace_block("fluid-trace", "Fluid at the working temperature", fluid_values, system, checks)
        if fluid_values else None,
        "modes": _modes(o), "mode_traces": mode_traces, "supplies": supplies, "drives": drives, "cycles": cycles,
        "margin_charts": margins, "assumed": _assumed(o, system), "symbols": _symbols(o),
        "manual_items": _manual_items(o, system),
        "signoff": [{"role": label, "name": m.signoff.get(key, "")} for key, label in SIGNOFF_ROLES],
        # Recorded reviews of this spec (a list of mappings: name, role, date, verdict, fingerprint,
        # machine_revision, remarks); shown in the template's "reviews" block, empty by default.
        "reviews": list(reviews or []),
        **extras,
    }


def _checks(o: Outcome, system: str) -> list[dict]:
    out = []
    for n, c in enumerate(o.results.checks, start=1):
        symbol = ""  # a ratio in a check is a margin or threshold: shown in percent
        out.append({
            "n": n, "anchor": f"check-{n}", "id": c.id, "title": c.title, "status": c.status,
            "status_word": STATUS_WORD[c.status], "where": c.where or "whole machine",
            "value": show(c.value, c.kind, system, symbol), "limit": show(c.limit, c.kind, system, symbol),
            "message": c.message, "target": _check_target(c), "corner": c.corner,
        })
    return out


def _check_target(c: Check) -> str:
    if c.drive and c.duty:
        return f"duty-{slug(c.drive)}-{slug(c.duty)}"
    if c.drive:
        return f"drive-{slug(c.drive)}"
    if c.supply and c.mode:
        return f"mode-{slug(c.supply)}-{slug(c.mode)}"
    if c.supply:
        return f"supply-{slug(c.supply)}"
    if c.mode:
        return f"mode-{slug(c.mode)}"
    if c.cycle:
        return f"cycle-{slug(c.cycle)}"
    return "checklist"


def _table(results, columns, system: str, first_head: list[str], first_cells: list[list[str]]) -> dict:
    head = []
    for key, symbol in columns:
        sample = next((r.values[key] for r in results if key in r.values), None)
        if sample is not None:
            head.append({"key": key, "label": sample.label, "symbol": symbol})
    rows = []
    for r in results:
        rows.append([show(r.values[h["key"]].value, r.values[h["key"]].kind, system, r.values[h["key"]].symbol)
                     if h["key"] in r.values else "-" for h in head])
    return {"head": head, "rows": rows, "first_head": first_head, "first_cells": first_cells}


def _trace_block(anchor: str, title: str, values: dict, system: str, checks: list[dict]) -> dict:
    return {"anchor": anchor, "title": title, "rows": [trace_row(v, system) for v in values.values()],
            "checks": [c for c in checks if c["target"] == anchor]}


def _cycle_context(o: Outcome, c, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    """A duty cycle: its steps, its trace (heat, power, oil temperature) and the oil-temperature chart."""
    cycle = next(x for x in o.machine.duty_cycles if x.id == c.cycle)
    rows = [{"mode": s.mode, "time": show(s.duration, "time", system)} for s in cycle.steps]
    extra = [f"mean prime-mover power of supply {s}: {show(p, 'power', system)}" for s, p in c.per_supply.items()]
    extra += [f"drive {d} above its continuous pressure rating {show(x, 'ratio', system)} of the time"
              for d, x in c.above_continuous.items()]
    return {"id": c.cycle, "title": cycle.title, "period": show(cycle.period, "time", system), "steps": rows,
            "trace": _trace_block(f"cycle-{slug(c.cycle)}", f"Duty cycle {cycle.title}", c.values, system, checks),
            "extra": extra, "missing": c.missing, "chart": cycle_chart(o, c, system, fig_n, draw)}


def _supply_context(o: Outcome, sup, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    m, r = o.machine, o.results
    modes = [x for x in r.supply_modes if x.supply == sup.id]  # only the modes that run this supply
    entered = supply_rows(o, sup, system)
    whole = r.supply_result(sup.id)
    traces = []
    if whole is not None and whole.values:
        traces.append(_trace_block(f"supply-{slug(sup.id)}-all", "All modes", whole.values, system, checks))
    for x in modes:
        title = next((md.title for md in m.modes if md.id == x.mode), x.mode)
        block = _trace_block(f"mode-{slug(x.supply)}-{slug(x.mode)}", f"Mode {title}", x.trace, system, checks)
        block["mode"] = x.mode
        traces.append(block)
    return {
        "id": sup.id, "anchor": f"supply-{slug(sup.id)}", "title": sup.title, "entered": entered,
        "table": _table(modes, SUPPLY_COLUMNS, system, ["Mode"], [[x.mode] for x in modes]),
        "drives": [{"id": d.id, "anchor": f"drive-{slug(d.id)}"} for d in m.drives if d.supply == sup.id],
        "charts": supply_charts(o, sup, modes, system, fig_n, draw) if modes else [],
        "traces": traces, "checks": [c for c in checks if c["target"] == f"supply-{slug(sup.id)}"],
    }


def _drive_context(o: Outcome, d, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    r = o.results
    duties = [x for x in r.duties if x.drive == d.id]
    charts_, p_out = drive_charts(o, d, duties, system, fig_n, draw) if duties else ([], None)
    entered = drive_rows(o, d, system)
    traces = []
    whole = r.drive_result(d.id)
    if whole is not None and whole.values:
        traces.append(_trace_block(f"drive-{slug(d.id)}-all", "Drive as a whole", whole.values, system, checks))
    for x in duties:
        anchor = f"duty-{slug(x.drive)}-{slug(x.duty)}"
        traces.append({"anchor": anchor, "title": f"Duty point {d.duty(x.duty).title}", "duty": x.duty,
                       "direction": x.direction, "checks": [c for c in checks if c["target"] == anchor],
                       "rows": [trace_row(v, system, given_text(o, x.drive, x.duty, k)) for k, v in x.values.items()]})
    return {
        "id": d.id, "anchor": f"drive-{slug(d.id)}", "title": d.title, "supply": d.supply,
        "supply_anchor": f"supply-{slug(d.supply)}", "notes_html": to_html(d.notes),
        "entered": entered, "duties_entered": duty_rows(o, d, system),
        "table": _table(duties, DUTY_COLUMNS, system, ["Duty point", "Direction"],
                        [[x.duty, x.direction] for x in duties]),
        "charts": charts_, "back_pressure": p_out,
        "traces": traces, "checks": [c for c in checks if c["target"] == f"drive-{slug(d.id)}"],
    }


def _modes(o: Outcome) -> list[dict]:
    return [{"id": md.id, "title": md.title, "running": [{"drive": d, "duty": u, "anchor": f"duty-{slug(d)}-{slug(u)}"}
                                                           for d, u in md.running]}
            for md in o.machine.modes]


def _assumed(o: Outcome, system: str) -> list[dict]:
    """Every assumed input the results rest on (built from the traces), with its basis."""
    return [{"where": ".".join(i.where), "value": show(i.value, i.kind, system, i.symbol, i.label), "basis": i.basis}
            for i in o.results.assumed()]


def _manual_items(o: Outcome, system: str) -> list[dict]:
    reliefs = ", ".join(f"{s.id} {show(s.relief_setting, 'pressure', system)}" for s in o.machine.supplies)
    over = ", ".join(f"{r.drive} {r.duty}" for r in o.results.duties if r.direction == "overrunning")
    fill = {"reliefs": f" ({reliefs})" if reliefs else "", "overrun": f" (here: {over})" if over else ""}
    return [{"n": n, "title": t, "text": text.format(**fill)} for n, (t, text) in enumerate(MANUAL_ITEMS, start=1)]


def _symbols(o: Outcome) -> list[dict]:
    """Each symbol used in the traces once, with its meaning, for the legend above them."""
    seen: dict[str, str] = {}
    r = o.results
    m = o.machine
    parts = [*r.duties, *r.supply_modes,
             *map(r.drive_result, (d.id for d in m.drives)), *map(r.supply_result, (s.id for s in m.supplies)),
             *map(r.mode_result, (md.id for md in m.modes))]
    groups = [x.trace for x in parts if x is not None] + [r.fluid.trace]
    for values in groups:
        for v in values.values():
            seen.setdefault(v.symbol, v.label)
            for i in v.inputs:
                if "[" not in i.symbol:
                    seen.setdefault(i.symbol, i.label)
    return [{"symbol": s, "label": lab} for s, lab in seen.items()]
