"""The pump's absolute inlet pressure from its suction side, at the fluid state given.

A function of the fluid result (density, and the suction-line loss computed at its viscosity), so
the same relation can be evaluated at any operating corner.
Pure: SI floats in, traced Values out.
"""

from __future__ import annotations

from specgen.calc import suction
from specgen.intake import defaults
from specgen.intake.model import Supply
from specgen.trace import Input, Value

SRC_INLET = ("hydrostatics of the suction side p = p_atm + rho*g*h less the losses on the way in; "
             "standard atmosphere 1.01325 bar (ISO 2533)")


def suction_values(sup: Supply, density: float | None, line_loss: float | None) -> list[Value]:
    """Pump inlet absolute pressure and the minimum it may be, for a supply with a suction line or
    suction block; empty otherwise."""
    if sup.suction_line is None and sup.suction_head is None and not sup.strainer_drop:
        return []
    assumed_density = density is None
    if assumed_density:  # no fluid block: typical mineral oil, marked assumed
        density = defaults.OIL_DENSITY
    head = sup.suction_head if sup.suction_head is not None else 0.0
    loss = line_loss or 0.0
    p = suction.pump_inlet_pressure(head, density, loss, sup.strainer_drop)
    ins = (Input("p_atm", "standard atmosphere", suction.STANDARD_ATMOSPHERE, "pressure"),
           Input("rho", "oil density", density, "density", assumed_density, ("fluid",) if assumed_density else (),
                 defaults.OIL_BASIS if assumed_density else ""),
           Input("h", "oil level above the pump inlet", head, "length"),
           Input("dp_suction_line", "suction-line loss", loss, "pressure"),
           Input("dp_strainer", "strainer drop", sup.strainer_drop, "pressure"))
    m = sup.pump.min_inlet_pressure
    return [
        Value("pump_inlet_pressure", "Pump inlet pressure (absolute)", "p_in,abs", p, "pressure",
              "p_in,abs = p_atm + rho*g*h - dp_suction_line - dp_strainer",
              "atmosphere on the oil plus the oil head, less the losses on the way to the pump", ins, SRC_INLET,
              note="no head given: oil level taken at the pump inlet" if sup.suction_head is None else ""),
        Value("pump_min_inlet_pressure", "Lowest allowed pump inlet pressure (absolute)", "p_in,min", m.value,
              "pressure", "p_in,min", "the pump's minimum absolute inlet pressure, continuous",
              (Input("p_in,min", "minimum inlet pressure", m.value, "pressure", m.assumed,
                     ("supplies", sup.id, "pump", "min_inlet_pressure") if m.assumed else (), m.basis),),
              "pump maker's data" if not m.assumed else "catalogue practice (from memory)"),
    ]
