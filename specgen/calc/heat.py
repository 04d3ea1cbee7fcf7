"""Heat load of one supply in one operating mode, as a breakdown in W.

Energy balance: whatever the pump takes in and the shafts do not deliver as
useful work ends up as heat in the fluid: ``P_heat = P_pump_in - P_shaft``.

Units: flow m^3/s, pressure Pa, power W.

Model (one pump outlet, one outlet pressure at a time):
  fixed pump              delivers its full flow. Flow the drives do not take
                          (surplus) leaves over the relief valve or through an
                          open-centre valve at ``dump_pressure``. While any
                          surplus flows the pump outlet sits at
                          ``max(supply_pressure, dump_pressure)``, since the
                          surplus path and the drives share one outlet.
  pressure-compensated    delivers only the demanded flow, at the compensator
  pump                    setting (the drives throttle down from it), plus an
                          optional standby flow: compensator control bleed and
                          leakage not covered by the stated efficiency.

Breakdown terms (they sum to ``total``):
  pump_loss     pump input power minus its hydraulic output (pump efficiency)
  surplus_loss  surplus flow times the outlet pressure (fixed pump)
  standby_loss  standby flow times the compensator setting (compensated pump)
  drive_loss    hydraulic power sent to the drives minus their shaft power:
                valve metering, line losses and motor losses together
"""

from __future__ import annotations

from dataclasses import dataclass

from specgen.calc.guards import non_negative as _non_negative, efficiency as _efficiency
from specgen.calc import supply

# Demand within this relative margin above delivery counts as equal (rounding
# of flows computed elsewhere).
_FLOW_TOL = 1e-9


@dataclass(frozen=True)
class HeatBreakdown:
    """Power balance of one supply in one mode, all in W."""

    pump_input: float
    shaft_power: float
    pump_loss: float
    surplus_loss: float
    standby_loss: float
    drive_loss: float
    pump_pressure: float  # Pa, outlet pressure the pump works against

    @property
    def total(self) -> float:
        """Heat load in W: ``P_pump_in - P_shaft`` (equals the sum of the loss terms)."""
        return self.pump_input - self.shaft_power


def _check_shaft_power(shaft_power: float, hydraulic_to_drives: float) -> float:
    shaft_power = _non_negative("shaft power", shaft_power)
    if shaft_power > hydraulic_to_drives * (1.0 + 1e-9) + 1e-9:
        raise ValueError(
            "shaft power exceeds the hydraulic power sent to the drives; check the duty points and pressures."
        )
    return shaft_power


def fixed_pump_heat(
    pump_delivery: float,
    demand_flow: float,
    supply_pressure: float,
    dump_pressure: float,
    pump_efficiency: float,
    shaft_power: float,
) -> HeatBreakdown:
    """Heat load of a fixed-displacement pump supply.

    Formulas: ``q_s = q_pump - q_demand``; ``p_pump = max(p_supply, p_dump)``
    if ``q_s > 0`` else ``p_supply``; ``P_in = q_pump*p_pump/eta_t``;
    surplus loss ``q_s*p_pump``; drive loss ``q_demand*p_pump - P_shaft``.

    Parameters: pump_delivery q_pump (m^3/s, effective delivery), demand_flow
    q_demand (m^3/s, summed flow the running drives take, <= q_pump),
    supply_pressure (Pa, set by the highest demand), dump_pressure (Pa: the
    relief setting when surplus goes over relief, or the open-centre pressure
    when it passes through the valve centre), pump_efficiency eta_t (overall,
    (0, 1]), shaft_power (W, summed useful shaft power of the drives).

    Raises ValueError when the demand exceeds the delivery: the flow-balance
    check must report that case; there is no steady state to compute.

    Source: energy balance (first law) on the circuit; hydraulic power ``q*p``.

    Example: 100 L/min pump, 60 L/min demand at 180 bar, relief 210 bar,
    eta_t 0.85, 13.5 kW shaft: p_pump = 210 bar; P_in = 1.6667e-3*210e5/0.85
    = 41 176 W; surplus 6.667e-4*210e5 = 14 000 W; drive loss
    1e-3*210e5 - 13 500 = 7 500 W; pump loss 6 176 W; total 27 676 W.
    """
    q_pump = _non_negative("pump delivery", pump_delivery)
    q_demand = _non_negative("demand flow", demand_flow)
    p_supply = _non_negative("supply pressure", supply_pressure)
    p_dump = _non_negative("dump pressure", dump_pressure)
    eta_t = _efficiency("pump overall efficiency", pump_efficiency)
    if q_demand > q_pump * (1.0 + _FLOW_TOL):
        raise ValueError("demand flow exceeds the pump delivery; the supply cannot hold this mode.")
    q_surplus = max(q_pump - q_demand, 0.0)
    p_pump = max(p_supply, p_dump) if q_surplus > 0.0 else p_supply
    q_demand = min(q_demand, q_pump)
    shaft_power = _check_shaft_power(shaft_power, q_demand * p_pump)
    hydraulic_out = q_pump * p_pump
    pump_input = supply.input_power(q_pump, p_pump, eta_t)
    return HeatBreakdown(
        pump_input=pump_input,
        shaft_power=shaft_power,
        pump_loss=pump_input - hydraulic_out,
        surplus_loss=q_surplus * p_pump,
        standby_loss=0.0,
        drive_loss=q_demand * p_pump - shaft_power,
        pump_pressure=p_pump,
    )


def compensated_pump_heat(
    demand_flow: float,
    compensator_pressure: float,
    pump_efficiency: float,
    shaft_power: float,
    standby_flow: float = 0.0,
) -> HeatBreakdown:
    """Heat load of a pressure-compensated variable pump supply.

    Formulas: ``P_in = (q_demand + q_standby)*p_comp/eta_t``; standby loss
    ``q_standby*p_comp``; drive loss ``q_demand*p_comp - P_shaft``.

    Parameters: demand_flow (m^3/s, >= 0), compensator_pressure p_comp (Pa),
    pump_efficiency eta_t (overall, (0, 1]), shaft_power (W), standby_flow
    (m^3/s, >= 0, default 0: the control bleed and leakage beyond the stated
    efficiency, taken from the pump maker's data when it is to be counted).

    Source: energy balance (first law) on the circuit; hydraulic power ``q*p``.

    Example: 60 L/min demand, compensator 210 bar, eta_t 0.85, 13.5 kW shaft,
    2 L/min standby: P_in = (1e-3 + 3.333e-5)*210e5/0.85 = 25 529 W; standby
    700 W; drive loss 21 000 - 13 500 = 7 500 W; pump loss 3 829 W; total 12 029 W.
    """
    q_demand = _non_negative("demand flow", demand_flow)
    p_comp = _non_negative("compensator pressure", compensator_pressure)
    eta_t = _efficiency("pump overall efficiency", pump_efficiency)
    q_standby = _non_negative("standby flow", standby_flow)
    shaft_power = _check_shaft_power(shaft_power, q_demand * p_comp)
    hydraulic_out = (q_demand + q_standby) * p_comp
    pump_input = supply.input_power(q_demand + q_standby, p_comp, eta_t)
    return HeatBreakdown(
        pump_input=pump_input,
        shaft_power=shaft_power,
        pump_loss=pump_input - hydraulic_out,
        surplus_loss=0.0,
        standby_loss=q_standby * p_comp,
        drive_loss=q_demand * p_comp - shaft_power,
        pump_pressure=p_comp,
    )
