"""The numbers each report chart needs, taken from the Results, and the calls to charts.py.

Chart geometry that is not itself a result (a limit line drawn on the pressure-differential axis,
the slope of the displacement line) is taken as a difference or quotient of shown results, and
the caption says so. ``draw(fn, fig_id, ...)`` asks for the chart ``fn(fig_id, ...)``: a
chart_batch.Batch, or any callable that draws it at once.
"""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present import charts
from specgen.present.chart_batch import Batch
from specgen.present.report.values import plain, show, unit_text

MARGIN_CHECKS = {
    "pressure_margin": ("inlet vs pressure limit", "given"),
    "continuous_pressure": ("vs continuous rating", "below"),
    "peak_pressure": ("relief vs peak rating", "below"),
    "max_speed": ("speed vs max rating", "below"),
    "min_speed": ("speed vs min rating", "above"),
}

MARGIN_ROWS_PER_CHART = 24
MAX_STACKED_DRIVES = 8  # a supply's flow bars show each drive's share up to this many drives


def _displacement(r) -> float | None:
    """The displacement a duty point was computed at (its "displacement" result), if it has one."""
    return r["displacement"] if "displacement" in r.values else None


def drive_charts(o: Outcome, drive, duties, system: str, fig_n, draw: Batch) -> list:
    """Torque against pressure differential and speed against flow for one drive.

    The displacement lines are the shown results' own quotients: T_relief / (p_relief - p_out)
    (= Vg * eta_hm / 2 pi) and n / q (= eta_v / Vg), one line per displacement used.
    """
    sup = o.machine.supply(drive.supply)
    unit = {k: unit_text(k, system) for k in ("pressure", "torque", "flow", "speed")}
    driving = [r for r in duties if r.direction != "overrunning"] or duties
    p_out = max(r["back_pressure"] for r in driving)  # the highest back pressure leaves the least differential
    dr = o.results.drive_result(drive.id)
    p_limit = dr["pressure_limit"] if dr is not None and "pressure_limit" in dr.values else sup.relief_setting
    t_lines: dict[float, charts.Line] = {}
    n_lines: dict[float, charts.Line] = {}
    for r in duties:
        vg = _displacement(r)
        label = f"Vg {show(vg, 'displacement', system)}" if vg else "working displacement"
        dp_relief = p_limit - r["back_pressure"]  # the torque at the limit is the slope times this
        if dp_relief > 0:
            t_lines.setdefault(round(vg or 0.0, 12), charts.Line(label, plain(r["relief_torque"], "torque", system)
                                                                 / plain(dp_relief, "pressure", system)))
        if r["flow_demand"] > 0:
            n_lines.setdefault(round(vg or 0.0, 12), charts.Line(label, plain(r["motor_speed"], "speed", system)
                                                                 / plain(r["flow_demand"], "flow", system)))
    rating = drive.motor.rating

    def at_dp(p: float) -> float:
        return plain(p - p_out, "pressure", system)

    limits = [charts.Limit("relief setting", show(sup.relief_setting, "pressure", system),
                           at_dp(sup.relief_setting), "relief")]
    if sup.compensated and sup.pump.compensator_setting is not None:
        limits.append(charts.Limit("compensator setting", show(sup.pump.compensator_setting, "pressure", system),
                                   at_dp(sup.pump.compensator_setting), "compensator"))
    if drive.port_relief is not None:
        limits.append(charts.Limit("port relief", show(drive.port_relief, "pressure", system),
                                   at_dp(drive.port_relief), "relief"))
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
        points=[charts.Point(r.duty, plain(r["pressure_differential"], "pressure", system),
                             plain(r["motor_torque"], "torque", system), ov) for r, ov in zip(duties, overrun)])
    speed_limits = []
    for key, name, style in (("max_speed", "maximum speed", "max"), ("min_speed", "minimum speed", "min")):
        value = getattr(rating, key)
        if value is not None:
            speed_limits.append(charts.Limit(name, show(value, "speed", system), plain(value, "speed", system), style))
    speed = draw(
        charts.speed_vs_flow, fig_n(), f"{drive.title}: speed against flow",
        x_unit=unit["flow"], y_unit=unit["speed"],
        lines=list(n_lines.values()) or [charts.Line("no line", 0.0)], limits=speed_limits,
        points=[charts.Point(r.duty, plain(r["flow_demand"], "flow", system), plain(r["motor_speed"], "speed", system),
                             ov) for r, ov in zip(duties, overrun)])
    return [torque, speed], show(p_out, "pressure", system)


def supply_charts(o: Outcome, sup, modes, system: str, fig_n, draw: Batch) -> list:
    """Flow demand and pump input power by mode for one supply, with its delivery and prime mover power."""
    q_unit, w_unit = unit_text("flow", system), unit_text("power", system)
    by_check = {(c.id, c.supply, c.mode): c.status for c in o.results.checks if c.supply}
    titles = {m.id: m.id for m in o.machine.modes}
    drives: list[str] = []
    for r in modes:
        for c in r.contributions:
            if c.drive not in drives:
                drives.append(c.drive)
    flows = [[sum(plain(c.flow, "flow", system) for c in r.contributions if c.drive == d) for d in drives]
             for r in modes]
    if len(drives) > MAX_STACKED_DRIVES:  # too many to tell apart: each mode's total, drives in the trace
        drives, flows = [f"all {len(drives)} drives"], [[sum(row)] for row in flows]
    names = [titles[r.mode] for r in modes]
    flow = draw(
        charts.flow_by_mode, fig_n(), f"{sup.title}: flow demand by operating mode", unit=q_unit, modes=names,
        drives=drives, flows=flows,
        delivery=[plain(r["pump_delivery"], "flow", system) for r in modes],
        statuses=[by_check.get(("pump_flow", sup.id, r.mode)) for r in modes])
    available = modes[0].values.get("prime_mover_power")
    power = draw(
        charts.power_by_mode, fig_n(), f"{sup.title}: pump input power by operating mode", unit=w_unit, modes=names,
        power=[plain(r["pump_input_power"], "power", system) for r in modes],
        available=plain(available.value, "power", system) if available else None,
        statuses=[by_check.get(("prime_mover_power", sup.id, r.mode)) for r in modes],
        shared_by=sup.prime_mover or "")
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


def margin_charts(o: Outcome, fig_n, draw: Batch) -> list:
    """The smallest margins, smallest first, on one chart of at most MARGIN_ROWS_PER_CHART rows: the
    ones a reviewer looks at. Every margin is in the checklist, whatever the size of the machine."""
    rows = sorted(margin_rows(o), key=lambda r: (r.margin, r.label))
    if not rows:
        return []
    part = rows[:MARGIN_ROWS_PER_CHART]
    suffix = f" (the {len(part)} smallest of {len(rows)})" if len(rows) > len(part) else ""
    return [draw(charts.margin_overview, fig_n(), f"Pressure and speed margins, smallest first{suffix}", part)]


def cycle_chart(o: Outcome, cycle, system: str, fig_n, draw: Batch):
    """Oil temperature against time (minutes) over the repeated duty cycle, with the limit and the steady
    temperature; None when the cycle has no oil-temperature series."""
    if not cycle.series:
        return None
    limit = o.machine.max_oil_temperature.value
    unit = unit_text("temperature", system)
    return draw(
        charts.oil_temperature_vs_time, fig_n(), f"Duty cycle {cycle.cycle}: oil temperature from ambient",
        x_unit="min", y_unit=unit, times=[t / 60.0 for t, _ in cycle.series],
        temperatures=[plain(x, "temperature", system) for _, x in cycle.series],
        limit=charts.Limit("oil limit", show(limit, "temperature", system), plain(limit, "temperature", system), "max"),
        steady=plain(cycle["steady_temperature"], "temperature", system))
