"""The review report: a static HTML page (inline CSS and SVG, no script) built from one Outcome.

``context(outcome, ...)`` turns the Results, the model and the spec as entered into plain values
for the templates in report_templates/ (Jinja2, autoescape on), asking for the charts as it goes;
``render`` has the charts drawn (chart_batch.py: in worker processes where that pays) while the
templates load, and renders them;
``write`` renders every spec into a temporary folder beside OUTDIR and only then moves the files
into place, so a failed run leaves an earlier report untouched.

Every number shown is a Results value (or a model input) formatted with units.format_si in the
machine's display units; nothing here recomputes a relation. Chart geometry that is not itself a
result (a limit line drawn on the pressure-differential axis, the slope of the displacement line)
is taken as a difference or quotient of shown results, and the caption says so.
"""

from __future__ import annotations

import os
import re
import shutil
import tempfile
from dataclasses import dataclass
from datetime import date as Date, datetime, timezone
from pathlib import Path

from specgen import __version__
from specgen.cautions import CAUTIONS
from specgen.errors import Location, Problem, SpecError
from specgen.fingerprint import Fingerprint, fingerprint
from specgen.pipeline import Outcome
from specgen.present import chart_batch, charts
from specgen.present.chart_batch import Batch
from specgen.present.markdown_text import to_html
from specgen.present.values import assumed_inputs, convert, format_si, significant
from specgen.resources import data_dir
from specgen.results import Check
from specgen.trace import Input, Value

REPORT_FILE = "index.html"
PDF_FILE = "report.pdf"
STATUS_ORDER = {"fail": 0, "warn": 1, "pass": 2}
STATUS_WORD = {"pass": "PASS", "warn": "WARN", "fail": "FAIL"}

# Margins on the overview chart: check id -> (short name, which side of the limit is safe).
MARGIN_CHECKS = {
    "pressure_margin": ("inlet vs pressure limit", "given"),
    "continuous_pressure": ("vs continuous rating", "below"),
    "peak_pressure": ("relief vs peak rating", "below"),
    "max_speed": ("speed vs max rating", "below"),
    "min_speed": ("speed vs min rating", "above"),
}
MARGIN_ROWS_PER_CHART = 48

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


# ---------------------------------------------------------------------------------------------
# Formatting


def slug(text: str) -> str:
    """An HTML id fragment: ids in specs are already plain, this keeps anything else safe."""
    return re.sub(r"[^A-Za-z0-9_-]+", "-", str(text)).strip("-") or "x"


def _is_efficiency(symbol: str, label: str) -> bool:
    return symbol.startswith("eta") or "efficiency" in label


def show(value: float | None, kind: str, system: str, symbol: str = "", label: str = "") -> str:
    """A number with its unit in the display system. Gear ratios and other plain ratios stay plain
    numbers; efficiencies and margins are shown in percent."""
    if value is None:
        return "-"
    if not kind:
        return significant(value)
    if kind == "ratio" and symbol and not _is_efficiency(symbol, label):
        return significant(value)
    return format_si(value, kind, system)


def _plain(value: float, kind: str, system: str) -> float:
    return convert(value, kind, system)[0]


def _raw(data, path: tuple):
    """The spec's own text at a dotted path, or None where the spec left it out."""
    node = data
    for part in path:
        if not isinstance(node, dict) or part not in node:
            return None
        node = node[part]
    if isinstance(node, bool):
        return "true" if node else "false"
    if isinstance(node, (dict, list)):
        return None
    return str(node)


@dataclass
class Segment:
    text: str
    assumed: bool = False


def _input_text(i: Input, system: str) -> str:
    if i.kind == "ratio":
        return significant(i.value)  # substituted as a plain factor: 0.9400, not 94.00 %
    return show(i.value, i.kind, system, i.symbol, i.label)


def substitute(value: Value, system: str) -> list[Segment]:
    """The formula with each input's value and unit put in place of its symbol.

    Example: "T = T_L / (i * eta_g)" -> "T = (1200 N*m) / (30.00 * 0.9400)". Sums and maxima over
    many inputs are written out in full; the segments flag assumed inputs so the page can mark them.
    """
    formula = value.formula
    if " = " not in formula or not value.inputs:
        return []
    lhs, rhs = formula.split(" = ", 1)
    by_symbol = {i.symbol: i for i in value.inputs}
    names = sorted(by_symbol, key=len, reverse=True)
    pattern = re.compile(r"(?<![\w\[\],.])(" + "|".join(map(re.escape, names)) + r")(?![\w\[\],])")
    out = [Segment(f"{lhs} = ")]
    pos, hits = 0, 0
    for m in pattern.finditer(rhs):
        out.append(Segment(rhs[pos:m.start()]))
        i = by_symbol[m.group(1)]
        text = _input_text(i, system)
        out.append(Segment(f"({text})" if " " in text else text, i.assumed))
        pos, hits = m.end(), hits + 1
    out.append(Segment(rhs[pos:]))
    if hits:
        return [s for s in out if s.text]
    fn = rhs.split("(", 1)[0].strip()
    if fn in ("sum", "max", "min"):  # e.g. "q_sum = sum(q_i)": write every term out
        terms = [Segment(_input_text(i, system), i.assumed) for i in value.inputs]
        joined: list[Segment] = [Segment(f"{lhs} = " + ("" if fn == "sum" else f"{fn}("))]
        for k, t in enumerate(terms):
            if k:
                joined.append(Segment(" + " if fn == "sum" else ", "))
            joined.append(t)
        if fn != "sum":
            joined.append(Segment(")"))
        return joined
    return []


def trace_row(value: Value, system: str, entered: str | None = None) -> dict:
    return {
        "key": value.key, "label": value.label, "symbol": value.symbol, "formula": value.formula,
        "words": value.words, "substituted": substitute(value, system),
        "inputs": [{"symbol": i.symbol, "label": i.label, "text": _input_text(i, system) if i.kind != "ratio"
                    else show(i.value, i.kind, system, i.symbol, i.label), "assumed": i.assumed}
                   for i in value.inputs],
        "result": show(value.value, value.kind, system, value.symbol, value.label),
        "source": value.source, "note": value.note, "assumed": value.assumed, "given": not value.formula,
        "entered": entered,
    }


def _row(label: str, data, path: tuple, value, kind: str | None, system: str, assumed: bool = False,
         basis: str = "", symbol: str = "") -> dict:
    """One line of an "as entered" table: the spec's text and the value in the display system."""
    if kind is None:
        shown = "-" if value in (None, "") else str(value)
    else:
        shown = show(value, kind, system, symbol or ("eta" if kind == "ratio" else ""), label)
    return {"label": label, "path": ".".join(path), "entered": _raw(data, path), "shown": shown,
            "assumed": assumed, "basis": basis}


# ---------------------------------------------------------------------------------------------
# Context


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
    return "checklist"


def _checks(o: Outcome, system: str) -> list[dict]:
    out = []
    for n, c in enumerate(o.results.checks, start=1):
        symbol = ""  # a ratio in a check is a margin or threshold: shown in percent
        out.append({
            "n": n, "anchor": f"check-{n}", "id": c.id, "title": c.title, "status": c.status,
            "status_word": STATUS_WORD[c.status], "where": c.where or "whole machine",
            "value": show(c.value, c.kind, system, symbol), "limit": show(c.limit, c.kind, system, symbol),
            "message": c.message, "target": _check_target(c),
        })
    return out


def _drive_entered(o: Outcome, drive, system: str) -> list[dict]:
    data, m = o.source.data, drive.motor
    base = ("drives", drive.id)
    mp = base + ("motor",)
    rows = [_row("Motor kind", data, mp + ("kind",), m.kind.replace("_", " "), None, system)]
    if m.model:
        rows.append(_row("Motor model", data, mp + ("model",), m.model, None, system))
    if m.variable:
        rows += [_row("Displacement, minimum", data, mp + ("displacement", "min"), m.displacement_min,
                      "displacement", system),
                 _row("Displacement, maximum", data, mp + ("displacement", "max"), m.displacement_max,
                      "displacement", system)]
        if m.over_centre:
            rows.append(_row("Over centre", data, mp + ("displacement", "over_centre"), "yes", None, system))
    else:
        rows.append(_row("Displacement", data, mp + ("displacement",), m.displacement_max, "displacement", system))
    for key, label, r in (("volumetric", "Volumetric efficiency", m.volumetric_efficiency),
                          ("hydromechanical", "Hydro-mechanical efficiency", m.hydromechanical_efficiency),
                          ("starting", "Starting efficiency", m.starting_efficiency)):
        rows.append(_row(label, data, mp + ("efficiency", key), r.value, "ratio", system, r.assumed, r.basis))
    rating = m.rating
    for key, label, kind in (("continuous_pressure", "Continuous pressure rating", "pressure"),
                             ("peak_pressure", "Peak pressure rating", "pressure"),
                             ("min_speed", "Minimum speed rating", "speed"),
                             ("max_speed", "Maximum speed rating", "speed"),
                             ("max_outlet_pressure", "Allowed outlet pressure", "pressure"),
                             ("max_case_pressure", "Allowed case pressure", "pressure")):
        value = getattr(rating, key)
        if value is not None:
            rows.append(_row(label, data, mp + ("rating", key), value, kind, system))
    rows.append(_row("Case drain", data, mp + ("case_drain",), "yes" if m.case_drain else "no", None, system))
    if drive.gear:
        g = drive.gear
        rows.append(_row("Gear ratio (motor / load speed)", data, base + ("gear_stage", "ratio"), g.ratio, "ratio",
                         system, symbol="i"))
        rows.append(_row("Gear efficiency", data, base + ("gear_stage", "efficiency"), g.efficiency.value, "ratio",
                         system, g.efficiency.assumed, g.efficiency.basis))
    sup = o.machine.supply(drive.supply)
    if drive.back_pressure is not None:
        rows.append(_row("Back pressure", data, base + ("back_pressure",), drive.back_pressure, "pressure", system))
    else:
        row = _row("Back pressure", data, base + ("back_pressure",), sup.return_pressure, "pressure", system)
        row["basis"] = f"not given: the return pressure of supply {sup.id} is used"
        rows.append(row)
    if drive.case_pressure is not None:
        rows.append(_row("Case pressure", data, base + ("case_pressure",), drive.case_pressure, "pressure", system))
    rows.append(_row("Load holding", data, base + ("load_holding",),
                     (drive.load_holding or "none declared").replace("_", " "), None, system))
    return rows


def _duty_entered(o: Outcome, drive, system: str) -> list[dict]:
    data = o.source.data
    out = []
    for d in drive.duty_points:
        p = ("drives", drive.id, "duty_points", d.id)
        rows = {key: _row(label, data, p + (key,), value, "torque" if key != "speed" else "speed", system)
                if value is not None else None
                for key, label, value in (("torque", "Load torque", d.torque), ("speed", "Load speed", d.speed),
                                          ("starting_torque", "Starting torque", d.starting_torque))}
        more = _extra_rows(data, p, [r for r in rows.values() if r], skip=("title", "direction"))
        out.append({"id": d.id, "title": d.title, "direction": d.direction, "torque": rows["torque"],
                    "speed": rows["speed"], "starting": rows["starting_torque"], "more": more})
    return out


DUTY_COLUMNS = (("motor_torque", "T"), ("motor_speed", "n"), ("pressure_differential", "dp"),
                ("inlet_pressure", "p_in"), ("flow_demand", "q"), ("shaft_power", "P"),
                ("relief_torque", "T_relief"))
SUPPLY_COLUMNS = (("flow_demand", "q_sum"), ("pump_delivery", "q_p"), ("flow_surplus", "dq"),
                  ("working_pressure", "p_s"), ("pump_input_power", "P_in"), ("prime_mover_power", "P_pm"))


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


def _given_text(o: Outcome, drive_id: str, duty_id: str, key: str) -> str | None:
    path = {"load_torque": "torque", "load_speed": "speed"}.get(key)
    if path is None:
        return None
    return _raw(o.source.data, ("drives", drive_id, "duty_points", duty_id, path))


def _displacement(r) -> float | None:
    """The displacement a duty point was computed at: its own value, else the relief trace's input."""
    if "displacement" in r.values:
        return r["displacement"]
    return next((i.value for i in r.values["relief_torque"].inputs if i.symbol == "Vg"), None)


def _drive_charts(o: Outcome, drive, duties, system: str, fig_n, draw: Batch) -> list:
    """Torque against pressure differential and speed against flow for one drive.

    The displacement lines are the shown results' own quotients: T_relief / (p_relief - p_out)
    (= Vg * eta_hm / 2 pi) and n / q (= eta_v / Vg), one line per displacement used.
    """
    sup = o.machine.supply(drive.supply)
    unit = {k: convert(0.0, k, system)[1] for k in ("pressure", "torque", "flow", "speed")}
    driving = [r for r in duties if r.direction != "overrunning"] or duties
    p_out = max(r["back_pressure"] for r in driving)  # the highest back pressure leaves the least differential
    t_lines: dict[float, charts.Line] = {}
    n_lines: dict[float, charts.Line] = {}
    for r in duties:
        vg = _displacement(r)
        label = f"Vg {show(vg, 'displacement', system)}" if vg else "working displacement"
        dp_relief = sup.relief_setting - r["back_pressure"]
        if dp_relief > 0:
            t_lines.setdefault(round(vg or 0.0, 12), charts.Line(label, _plain(r["relief_torque"], "torque", system)
                                                                 / _plain(dp_relief, "pressure", system)))
        if r["flow_demand"] > 0:
            n_lines.setdefault(round(vg or 0.0, 12), charts.Line(label, _plain(r["motor_speed"], "speed", system)
                                                                 / _plain(r["flow_demand"], "flow", system)))
    rating = drive.motor.rating

    def at_dp(p: float) -> float:
        return _plain(p - p_out, "pressure", system)

    limits = [charts.Limit("relief setting", show(sup.relief_setting, "pressure", system),
                           at_dp(sup.relief_setting), "relief")]
    if sup.compensated and sup.pump.compensator_setting is not None:
        limits.append(charts.Limit("compensator setting", show(sup.pump.compensator_setting, "pressure", system),
                                   at_dp(sup.pump.compensator_setting), "compensator"))
    for key, name, style in (("continuous_pressure", "continuous rating", "continuous"),
                             ("peak_pressure", "peak rating", "peak")):
        value = getattr(rating, key)
        if value is not None:
            limits.append(charts.Limit(name, show(value, "pressure", system), at_dp(value), style))
    overrun = [r.direction == "overrunning" for r in duties]
    torque = draw(
        charts.torque_vs_pressure, fig_n(), f"{drive.title}: torque against pressure differential",
        x_unit=unit["pressure"], y_unit=unit["torque"], lines=list(t_lines.values()) or [charts.Line("no line", 0.0)],
        limits=limits,
        points=[charts.Point(r.duty, _plain(r["pressure_differential"], "pressure", system),
                             _plain(r["motor_torque"], "torque", system), ov) for r, ov in zip(duties, overrun)])
    speed_limits = []
    for key, name, style in (("max_speed", "maximum speed", "max"), ("min_speed", "minimum speed", "min")):
        value = getattr(rating, key)
        if value is not None:
            speed_limits.append(charts.Limit(name, show(value, "speed", system), _plain(value, "speed", system), style))
    speed = draw(
        charts.speed_vs_flow, fig_n(), f"{drive.title}: speed against flow",
        x_unit=unit["flow"], y_unit=unit["speed"],
        lines=list(n_lines.values()) or [charts.Line("no line", 0.0)], limits=speed_limits,
        points=[charts.Point(r.duty, _plain(r["flow_demand"], "flow", system), _plain(r["motor_speed"], "speed", system),
                             ov) for r, ov in zip(duties, overrun)])
    return [torque, speed], show(p_out, "pressure", system)


def _supply_charts(o: Outcome, sup, modes, system: str, fig_n, draw: Batch) -> list:
    q_unit, w_unit = convert(0.0, "flow", system)[1], convert(0.0, "power", system)[1]
    by_check = {(c.id, c.supply, c.mode): c.status for c in o.results.checks if c.supply}
    titles = {m.id: m.id for m in o.machine.modes}
    drives: list[str] = []
    for r in modes:
        for c in r.contributions:
            if c.drive not in drives:
                drives.append(c.drive)
    flows = [[sum(_plain(c.flow, "flow", system) for c in r.contributions if c.drive == d) for d in drives]
             for r in modes]
    names = [titles[r.mode] for r in modes]
    flow = draw(
        charts.flow_by_mode, fig_n(), f"{sup.title}: flow demand by operating mode", unit=q_unit, modes=names,
        drives=drives, flows=flows,
        delivery=_plain(modes[0]["pump_delivery"], "flow", system),
        statuses=[by_check.get(("pump_flow", sup.id, r.mode)) for r in modes])
    available = modes[0].values.get("prime_mover_power")
    power = draw(
        charts.power_by_mode, fig_n(), f"{sup.title}: pump input power by operating mode", unit=w_unit, modes=names,
        power=[_plain(r["pump_input_power"], "power", system) for r in modes],
        available=_plain(available.value, "power", system) if available else None,
        statuses=[by_check.get(("prime_mover_power", sup.id, r.mode)) for r in modes])
    return [flow, power]


def margin_rows(o: Outcome) -> list[charts.MarginRow]:
    """Every pressure and speed margin as a fraction of its limit, from the checks' value and limit."""
    th = o.machine.thresholds
    warn = {"pressure_margin": th.pressure_margin_warn.value, "max_speed": th.speed_margin_warn.value}
    rows = []
    for c in o.results.checks:
        if c.id not in MARGIN_CHECKS or c.value is None or c.limit is None:
            continue
        name, side = MARGIN_CHECKS[c.id]
        if side == "given":
            margin = c.value
        elif side == "below":
            margin = (c.limit - c.value) / c.limit
        else:
            margin = (c.value - c.limit) / c.limit
        where = " ".join(x for x in (c.drive, c.duty, c.supply, c.mode) if x)
        rows.append(charts.MarginRow(f"{where}: {name}", margin, c.status, warn.get(c.id)))
    return rows


def _margin_charts(o: Outcome, fig_n, draw: Batch) -> list:
    rows = sorted(margin_rows(o), key=lambda r: (r.margin, r.label))
    count = -(-len(rows) // MARGIN_ROWS_PER_CHART)  # charts needed; rows shared evenly between them
    size = -(-len(rows) // max(count, 1))
    parts = [rows[k:k + size] for k in range(0, len(rows), size)]
    out = []
    for k, part in enumerate(parts, start=1):
        suffix = f" (part {k} of {len(parts)})" if len(parts) > 1 else ""
        out.append(draw(charts.margin_overview, fig_n(), f"Pressure and speed margins, smallest first{suffix}", part))
    return out


def _assumed(o: Outcome, system: str) -> list[dict]:
    out = []
    for a in assumed_inputs(o.machine):
        kind = "density" if a.get("unit") else "ratio"
        out.append({"where": a["where"], "value": show(a["value"], kind, system, "eta" if kind == "ratio" else ""),
                    "basis": a["basis"]})
    return out


def _manual_items(o: Outcome, system: str) -> list[dict]:
    reliefs = ", ".join(f"{s.id} {show(s.relief_setting, 'pressure', system)}" for s in o.machine.supplies)
    over = ", ".join(f"{r.drive} {r.duty}" for r in o.results.duties if r.direction == "overrunning")
    fill = {"reliefs": f" ({reliefs})" if reliefs else "", "overrun": f" (here: {over})" if over else ""}
    return [{"n": n, "title": t, "text": text.format(**fill)} for n, (t, text) in enumerate(MANUAL_ITEMS, start=1)]


def _symbols(o: Outcome) -> list[dict]:
    """Each symbol used in the traces once, with its meaning, for the legend above them."""
    seen: dict[str, str] = {}
    r = o.results
    groups = [x.trace for x in (*r.duties, *r.supply_modes, *r.drives, *r.supplies, *r.modes, r.fluid)]
    for values in groups:
        for v in values.values():
            seen.setdefault(v.symbol, v.label)
            for i in v.inputs:
                if "[" not in i.symbol:
                    seen.setdefault(i.symbol, i.label)
    return [{"symbol": s, "label": lab} for s, lab in seen.items()]


def _leaves(node, path: tuple) -> list[tuple[tuple, str]]:
    """Every plain value under ``node`` with its dotted path, in the order the spec wrote them."""
    if isinstance(node, dict):
        return [leaf for k, v in node.items() for leaf in _leaves(v, path + (k,))]
    if isinstance(node, list):
        return [leaf for k, v in enumerate(node) for leaf in _leaves(v, path + (k,))]
    return [(path, "true" if node is True else "false" if node is False else str(node))]


def _extra_rows(data, base: tuple, rows: list[dict], skip: tuple = ()) -> list[dict]:
    """Rows for what the spec wrote under ``base`` that the explicit rows do not show, so every
    entry appears as entered; its effect is in the calculation trace."""
    covered = {r["path"] for r in rows}
    node = data
    for part in base:
        node = node.get(part, {}) if isinstance(node, dict) else {}
    out = []
    for path, raw in _leaves(node, base):
        dotted = ".".join(str(x) for x in path)
        if dotted in covered or any(dotted.startswith(".".join(base + (s,))) for s in skip):
            continue
        out.append({"label": str(path[-1]).replace("_", " ").capitalize(), "path": dotted, "entered": raw,
                    "shown": "see trace", "assumed": False, "basis": ""})
    return out


def _trace_block(anchor: str, title: str, values: dict, system: str, checks: list[dict]) -> dict:
    return {"anchor": anchor, "title": title, "rows": [trace_row(v, system) for v in values.values()],
            "checks": [c for c in checks if c["target"] == anchor]}


def _supply_context(o: Outcome, sup, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    m, r = o.machine, o.results
    modes = [x for x in r.supply_modes if x.supply == sup.id]
    data, sp = o.source.data, ("supplies", sup.id)
    pp = sp + ("pump",)
    p = sup.pump
    entered = []
    for key, label, value, kind in (("displacement", "Pump displacement", p.displacement, "displacement"),
                                    ("shaft_speed", "Pump shaft speed", p.shaft_speed, "speed"),
                                    ("delivery", "Pump delivery", p.delivery, "flow"),
                                    ("compensator_setting", "Compensator setting", p.compensator_setting, "pressure")):
        if value is not None:
            entered.append(_row(label, data, pp + (key,), value, kind, system))
    for key, label, ratio in (("volumetric_efficiency", "Pump volumetric efficiency", p.volumetric_efficiency),
                              ("overall_efficiency", "Pump overall efficiency", p.overall_efficiency)):
        entered.append(_row(label, data, pp + (key,), ratio.value, "ratio", system, ratio.assumed, ratio.basis))
    entered.append(_row("Relief setting", data, sp + ("relief_setting",), sup.relief_setting, "pressure", system))
    entered.append(_row("Return pressure", data, sp + ("return_pressure",), sup.return_pressure, "pressure", system))
    if sup.prime_mover_power is not None:
        entered.append(_row("Prime mover power", data, sp + ("prime_mover_power",), sup.prime_mover_power,
                            "power", system))
    entered += _extra_rows(data, sp, entered, skip=("title",))
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
        "charts": _supply_charts(o, sup, modes, system, fig_n, draw) if modes else [],
        "traces": traces, "checks": [c for c in checks if c["target"] == f"supply-{slug(sup.id)}"],
    }


def _drive_context(o: Outcome, d, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    r = o.results
    duties = [x for x in r.duties if x.drive == d.id]
    charts_, p_out = _drive_charts(o, d, duties, system, fig_n, draw) if duties else ([], None)
    entered = _drive_entered(o, d, system)
    entered += _extra_rows(o.source.data, ("drives", d.id), entered, skip=("title", "notes", "duty_points"))
    traces = []
    whole = r.drive_result(d.id)
    if whole is not None and whole.values:
        traces.append(_trace_block(f"drive-{slug(d.id)}-all", "Drive as a whole", whole.values, system, checks))
    for x in duties:
        anchor = f"duty-{slug(x.drive)}-{slug(x.duty)}"
        traces.append({"anchor": anchor, "title": f"Duty point {d.duty(x.duty).title}", "duty": x.duty,
                       "direction": x.direction, "checks": [c for c in checks if c["target"] == anchor],
                       "rows": [trace_row(v, system, _given_text(o, x.drive, x.duty, k)) for k, v in x.values.items()]})
    return {
        "id": d.id, "anchor": f"drive-{slug(d.id)}", "title": d.title, "supply": d.supply,
        "supply_anchor": f"supply-{slug(d.supply)}", "notes_html": to_html(d.notes),
        "entered": entered, "duties_entered": _duty_entered(o, d, system),
        "table": _table(duties, DUTY_COLUMNS, system, ["Duty point", "Direction"], [[x.duty, x.direction] for x in duties]),
        "charts": charts_, "back_pressure": p_out,
        "traces": traces, "checks": [c for c in checks if c["target"] == f"drive-{slug(d.id)}"],
    }


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
    problems = sorted((c for c in checks if c["status"] != "pass"), key=lambda c: (STATUS_ORDER[c["status"]], c["n"]))
    # The charts are asked for while the context is built and drawn together: many of them in
    # parallel (chart_batch.py), in the same order and to the same bytes.
    own_batch = draw is None
    draw = Batch() if own_batch else draw
    margin_charts = _margin_charts(o, fig_n, draw)
    supplies = [_supply_context(o, sup, system, checks, fig_n, draw) for sup in m.supplies]
    drives = [_drive_context(o, d, system, checks, fig_n, draw) for d in m.drives]
    mode_traces = [_trace_block(f"mode-{slug(x.mode)}", f"Mode {x.mode}", x.values, system, checks)
                   for x in r.modes if x.values]
    fluid_values = r.fluid.values
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
        "cautions": [{"title": t, "text": x} for t, x in CAUTIONS],
        "description_html": to_html(m.description),
        "fluid": _fluid(o, system),
        "fluid_trace": _trace_block("fluid-trace", "Fluid at the working temperature", fluid_values, system, checks)
        if fluid_values else None,
        "modes": _modes(o), "mode_traces": mode_traces, "supplies": supplies, "drives": drives,
        "margin_charts": margin_charts, "assumed": _assumed(o, system), "symbols": _symbols(o),
        "manual_items": _manual_items(o, system),
        "signoff": [{"role": label, "name": m.signoff.get(key, "")} for key, label in SIGNOFF_ROLES],
        # Recorded reviews of this spec (a list of mappings: name, role, date, verdict, fingerprint,
        # machine_revision, remarks); shown in the template's "reviews" block, empty by default.
        "reviews": list(reviews or []),
    }


def _fluid(o: Outcome, system: str) -> list[dict]:
    f = o.machine.fluid
    if f is None:
        return []
    data = o.source.data
    return [
        _row("Viscosity grade (ISO 3448)", data, ("fluid", "iso_vg"), f"ISO VG {f.iso_vg}", None, system),
        _row("Working temperature", data, ("fluid", "temperature"), f.temperature, "temperature", system),
        _row("Density", data, ("fluid", "density"), f.density.value, "density", system, f.density.assumed,
             f.density.basis),
    ]


def _modes(o: Outcome) -> list[dict]:
    return [{"id": md.id, "title": md.title, "running": [{"drive": d, "duty": u, "anchor": f"duty-{slug(d)}-{slug(u)}"}
                                                           for d, u in md.running]}
            for md in o.machine.modes]


# ---------------------------------------------------------------------------------------------
# Rendering and writing


def environment():
    import jinja2

    env = jinja2.Environment(loader=jinja2.FileSystemLoader(str(data_dir("report_templates"))),
                             autoescape=True, undefined=jinja2.StrictUndefined, trim_blocks=True,
                             lstrip_blocks=True, keep_trailing_newline=True)
    from markupsafe import Markup

    env.filters["css_string"] = css_string
    env.globals["Markup"] = Markup  # for the charts' SVG, which charts.py builds and escapes
    return env


def css_string(text: str):
    """Text as a quoted CSS string: every character that is not a plain letter, digit or space is
    written as a CSS hex escape, so no text from a spec can end the string or the style sheet."""
    from markupsafe import Markup

    # The space after each escape ends it (CSS consumes one whitespace after a hex escape).
    body = "".join(ch if ch.isascii() and (ch.isalnum() or ch == " ") else f"\\{ord(ch):x} " for ch in str(text))
    return Markup(f'"{body}"')


def render(o: Outcome, *, fp: Fingerprint | None = None, date: str | None = None,
           reviews: list | None = None) -> str:
    """The report page for one outcome, as HTML text."""
    from markupsafe import Markup

    fp = fp or fingerprint(o.source.raw, _spec_path(o))
    batch = Batch()
    ctx = context(o, fp=fp, date=date, reviews=reviews, draw=batch)
    batch.start()
    try:  # the templates load while the charts are drawn
        template = environment().get_template("report.html")
    finally:
        batch.finish()
    ctx["description_html"] = Markup(ctx["description_html"])
    for d in ctx["drives"]:
        d["notes_html"] = Markup(d["notes_html"])
    return template.render(**ctx)


def render_index(entries: list[dict], date: str | None) -> str:
    return environment().get_template("index.html").render(entries=entries, date=date, version=__version__)


def _spec_path(o: Outcome) -> Path | None:
    p = Path(o.source.name)
    return p if p.is_file() else None


def report_date(option: str | None, epoch: str | None) -> str | None:
    """The date to print: --date YYYY-MM-DD, else SOURCE_DATE_EPOCH (UTC), else none at all."""
    if option:
        try:
            if not re.fullmatch(r"\d{4}-\d{2}-\d{2}", option):
                raise ValueError(option)
            return Date.fromisoformat(option).isoformat()
        except ValueError:
            raise SpecError([Problem(Location("--date"), "", f"'{option}' is not a date written YYYY-MM-DD")]) from None
    if epoch:
        try:
            return datetime.fromtimestamp(int(epoch.strip()), tz=timezone.utc).date().isoformat()
        except (ValueError, OverflowError, OSError):
            raise SpecError([Problem(Location("SOURCE_DATE_EPOCH"), "",
                                     f"'{epoch}' is not a whole number of seconds since 1970-01-01")]) from None
    return None


def start_drawing() -> bool:
    """Start the chart workers now (chart_batch.start_workers), before the specs are read and
    checked, so that they import matplotlib meanwhile on the other cores; ``write`` stops them."""
    return chart_batch.start_workers()


@dataclass
class Written:
    files: list[Path]
    notes: list[str]


def _folder_names(outcomes: list[Outcome]) -> list[str]:
    names, used = [], set()
    for o in outcomes:
        base = slug(o.machine.id)
        name, k = base, 2
        while name in used:
            name, k = f"{base}-{k}", k + 1
        used.add(name)
        names.append(name)
    return names


def _refuse_outside(root: Path, dest: Path) -> None:
    """Refuse to write through a symlinked folder that leads out of the output folder."""
    parent = Path(os.path.realpath(dest.parent))
    if parent != root and root not in parent.parents:
        raise SpecError([Problem(Location(str(dest.parent)), "",
                                 "is a symlink out of the output folder; specgen will not write through it")])


def write(outcomes: list[Outcome], outdir: str | Path, *, date: str | None = None, pdf: bool = False,
          reviews_for=None) -> Written:
    """Write the report(s) into ``outdir``: one spec gives OUTDIR/index.html (and report.pdf with
    ``pdf``); several give one subfolder each plus OUTDIR/index.html listing them with their verdict.

    Everything is rendered into a temporary folder beside ``outdir`` first; only when all of it
    has been written are the files moved into place (os.replace, one file at a time), so an error
    in any render leaves the earlier report as it was. Files in ``outdir`` that are not ours stay.
    """
    from specgen.present import pdf as pdf_out

    target = Path(outdir)
    target.parent.mkdir(parents=True, exist_ok=True)
    notes: list[str] = []
    make_pdf = pdf and pdf_out.available(notes)
    staging = Path(tempfile.mkdtemp(prefix=f".{target.name or 'report'}.", suffix=".tmp", dir=target.parent))
    try:
        rel: list[Path] = []
        single = len(outcomes) == 1
        names = [""] if single else _folder_names(outcomes)
        entries = []
        for o, name in zip(outcomes, names):
            folder = staging / name if name else staging
            folder.mkdir(parents=True, exist_ok=True)
            fp = fingerprint(o.source.raw, _spec_path(o))
            reviews = reviews_for(o) if reviews_for else None
            html = render(o, fp=fp, date=date, reviews=reviews)
            (folder / REPORT_FILE).write_text(html, encoding="utf-8")
            rel.append(Path(name) / REPORT_FILE if name else Path(REPORT_FILE))
            if make_pdf:
                pdf_out.write_pdf(html, folder / PDF_FILE, base=folder)
                rel.append(Path(name) / PDF_FILE if name else Path(PDF_FILE))
            c = o.results.counts()
            entries.append({"href": f"{name}/{REPORT_FILE}", "title": o.machine.title, "id": o.machine.id,
                            "revision": o.machine.revision, "spec_file": o.source.name, "verdict": o.results.verdict,
                            "verdict_word": STATUS_WORD[o.results.verdict], "counts": c, "sha": fp.short})
        if not single:
            (staging / REPORT_FILE).write_text(render_index(entries, date), encoding="utf-8")
            rel.append(Path(REPORT_FILE))
        for path in rel:
            with open(staging / path, "rb") as fh:
                os.fsync(fh.fileno())
        # All rendered: swap the files in. A PDF left from an earlier run would no longer match.
        target.mkdir(parents=True, exist_ok=True)
        root = Path(os.path.realpath(target))
        for path in rel:
            _refuse_outside(root, target / path)
        for path in rel:
            (target / path).parent.mkdir(parents=True, exist_ok=True)
            os.replace(staging / path, target / path)
        for name in names:
            stale = target / name / PDF_FILE if name else target / PDF_FILE
            _refuse_outside(root, stale)
            if not make_pdf and stale.exists():
                stale.unlink()
                notes.append(f"removed {stale} from an earlier run: it no longer matches this report")
        return Written([target / p for p in rel], notes)
    finally:
        chart_batch.stop_workers()
        shutil.rmtree(staging, ignore_errors=True)
