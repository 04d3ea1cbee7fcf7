"""Load-sensing supplies in every output: per mode the pump's pressure and flow, and each drive's
need, asked and reached flow and speed and throttling loss, as SI rows (specgen/resolve/load_sensing.py
computes them), and those rows as the terminal's table. The report reads the same rows
(present/report/load_sensing.py); JSON carries the values themselves (per_drive of each supply mode).
"""

from __future__ import annotations

from dataclasses import dataclass

from specgen.units import format_si


@dataclass(frozen=True)
class DriveShare:
    """One running drive of a load-sensing supply in one mode, SI floats."""

    drive: str
    duty: str
    need: float  # Pa at the supply
    asked: float  # m^3/s
    reached: float  # m^3/s
    speed: float  # rev/s, duty motor speed
    speed_reached: float  # rev/s
    throttling: float  # W


@dataclass(frozen=True)
class PumpMode:
    """A load-sensing supply in one mode: pump pressure and flows (SI), its drives, and the notes."""

    supply: str
    mode: str
    pressure: float  # Pa
    available: float | None  # m^3/s the pump can give (None: nothing runs)
    delivered: float  # m^3/s
    throttling: float  # W, every drive's throttling loss
    note: str
    drives: tuple[DriveShare, ...]


def pump_modes(o, supply_id: str) -> list[PumpMode]:
    """Every mode of a load-sensing supply, in the order computed (empty for any other supply)."""
    if not o.machine.supply(supply_id).load_sensing:
        return []
    out = []
    for r in o.results.supply_modes:
        if r.supply != supply_id:
            continue
        shares = []
        for c in r.contributions:
            got = r.drive_value(c.drive, "reached_flow")
            if got is None:  # overrunning through makeup valves: takes no pump flow
                continue
            duty = o.results.duty(c.drive, c.duty).values
            need = duty.get("supply_pressure_required") or duty["inlet_pressure"]
            shares.append(DriveShare(c.drive, c.duty, need.value, c.flow, got.value, duty["motor_speed"].value,
                                     r.drive_value(c.drive, "reached_speed").value,
                                     r.drive_value(c.drive, "throttling_loss").value))
        avail = r.values.get("pump_available_flow")
        heat = r.values.get("heat_throttling")
        out.append(PumpMode(r.supply, r.mode, r["pump_pressure"], avail.value if avail else None,
                            r["pump_delivered_flow"], heat.value if heat else 0.0,
                            "; ".join(n for n in (r.values["pump_pressure"].note,
                                                  avail.note if avail else "") if n), tuple(shares)))
    return out


def text_lines(o, system: str) -> list[str]:
    """The terminal's table of every load-sensing supply (nothing without one)."""
    from specgen.present.text import table  # the terminal's one table layout

    rows = []
    for sup in o.machine.supplies:
        for pm in pump_modes(o, sup.id):
            where = f"{pm.supply}/{pm.mode}"
            avail = format_si(pm.available, "flow", system) if pm.available is not None else "-"
            rows.append([where, "pump", format_si(pm.pressure, "pressure", system), avail,
                         format_si(pm.delivered, "flow", system), "", "", format_si(pm.throttling, "power", system),
                         pm.note])
            rows += [[where, f"{s.drive} at {s.duty}", format_si(s.need, "pressure", system),
                      format_si(s.asked, "flow", system), format_si(s.reached, "flow", system),
                      format_si(s.speed, "speed", system), format_si(s.speed_reached, "speed", system),
                      format_si(s.throttling, "power", system), ""] for s in pm.drives]
    if not rows:
        return []
    return ["", "Load-sensing supplies: pump pressure and flow, each drive's share and throttling loss"] + table(
        ["where", "pump or drive", "p pump / need", "q avail / asked", "q delivered / got", "n asked", "n reached",
         "P throttled", "note"], rows)
