"""The "as entered" tables: what the spec's author wrote, beside the value specgen read from it.

``as_entered`` is the one place the report reads the spec's own text, and only to show it: every
number the report computes with or charts comes from the model and the Results.
"""

from __future__ import annotations

from specgen.pipeline import Outcome
from specgen.present.report.values import show, typeset


def as_entered(data, path: tuple) -> str | None:
    """The spec's own text at a dotted path, to show as the author wrote it; None where the spec left it out."""
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


def _row(label: str, data, path: tuple, value, kind: str | None, system: str, assumed: bool = False,
         basis: str = "", symbol: str = "") -> dict:
    """One line of an "as entered" table: the spec's text and the value in the display system."""
    if kind is None:
        shown = "-" if value in (None, "") else str(value)
    else:
        shown = show(value, kind, system, symbol or ("eta" if kind == "ratio" else ""), label)
    return {"label": label, "path": ".".join(path), "entered": as_entered(data, path), "shown": shown,
            "assumed": assumed, "basis": typeset(basis)}


def _leaves(node, path: tuple) -> list[tuple[tuple, str]]:
    """Every plain value under ``node`` with its dotted path, in the order the spec wrote them."""
    if isinstance(node, dict):
        return [leaf for k, v in node.items() for leaf in _leaves(v, path + (k,))]
    if isinstance(node, list):
        return [leaf for k, v in enumerate(node) for leaf in _leaves(v, path + (k,))]
    return [(path, "true" if node is True else "false" if node is False else str(node))]


def extra_rows(data, base: tuple, rows: list[dict], skip: tuple = ()) -> list[dict]:
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


def drive_rows(o: Outcome, drive, system: str) -> list[dict]:
    """The drive's motor, gear, pressures and load holding as entered, then anything else written under it."""
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
    rows += extra_rows(data, base, rows, skip=("title", "notes", "duty_points"))
    return rows


def duty_rows(o: Outcome, drive, system: str) -> list[dict]:
    """Each duty point's torque, speed and starting torque as entered, and anything else written under it."""
    data = o.source.data
    out = []
    for d in drive.duty_points:
        p = ("drives", drive.id, "duty_points", d.id)
        rows = {key: _row(label, data, p + (key,), value, "torque" if key != "speed" else "speed", system)
                if value is not None else None
                for key, label, value in (("torque", "Load torque", d.torque), ("speed", "Load speed", d.speed),
                                          ("starting_torque", "Starting torque", d.starting_torque))}
        more = extra_rows(data, p, [r for r in rows.values() if r], skip=("title", "direction"))
        out.append({"id": d.id, "title": d.title, "direction": d.direction, "torque": rows["torque"],
                    "speed": rows["speed"], "starting": rows["starting_torque"], "more": more})
    return out


def given_text(o: Outcome, drive_id: str, duty_id: str, key: str) -> str | None:
    """What the spec wrote for a load torque or speed a trace row shows (None for computed values)."""
    path = {"load_torque": "torque", "load_speed": "speed"}.get(key)
    if path is None:
        return None
    return as_entered(o.source.data, ("drives", drive_id, "duty_points", duty_id, path))


def fluid_rows(o: Outcome, system: str) -> list[dict]:
    """The fluid's grade, working temperature and density as entered."""
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


def supply_rows(o: Outcome, sup, system: str) -> list[dict]:
    """The supply's pump, relief, return and prime mover as entered, then anything else written under it."""
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
    low = (("Low side (charge pressure)", ("closed_loop", "charge", "pressure")) if sup.closed_loop is not None
           else ("Return pressure", ("return_pressure",)))  # a closed loop's low side takes the return's place
    entered.append(_row(low[0], data, sp + low[1], sup.return_pressure, "pressure", system))
    if sup.prime_mover_power is not None:
        entered.append(_row("Prime mover power", data, sp + ("prime_mover_power",), sup.prime_mover_power,
                            "power", system))
    entered += extra_rows(data, sp, entered, skip=("title",))
    return entered
