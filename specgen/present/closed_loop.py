"""The closed-loop supplies' figures as one compact table: one row per mode (the duty points its
motors run at), the same columns in text and in the report. Nothing is recomputed here."""

from __future__ import annotations

from specgen.units import format_si

# (value key, short heading, symbol), in the order shown
LOOP_COLUMNS = (
    ("pump_displacement_setting", "stroke", "x"), ("working_pressure", "p high", "p_H"),
    ("low_side_pressure", "p low", "p_L"), ("flow_demand", "q loop", "q_loop"),
    ("pump_input_torque", "T pump in", "T_p"), ("pump_input_power", "P pump in", "P_in"),
    ("charge_flow", "q charge", "q_c"), ("charge_flow_needed", "q needed", "q_c,need"),
    ("transmission_efficiency", "eta", "eta_T"), ("heat_load", "heat", "Q"),
)


def loop_modes(o, supply: str | None = None) -> list:
    """The supply-mode results of closed-loop supplies (of ``supply`` alone when given), in results order."""
    m = o.machine
    return [r for r in o.results.supply_modes if m.supply(r.supply).circuit == "closed_loop"
            and (supply is None or r.supply == supply)]


def duty_points(r) -> str:
    """The duty points the loop's motors run at in this mode, "drive at duty" each."""
    return ", ".join(f"{c.drive} at {c.duty}" for c in r.contributions)


def cells(r, system: str) -> list[str]:
    """One row's values in the display units ("-" where the mode has none, e.g. no efficiency at zero power)."""
    return [format_si(r.values[k].value, r.values[k].kind, system) if k in r.values else "-"
            for k, _, _ in LOOP_COLUMNS]
