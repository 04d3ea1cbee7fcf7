"""What every kind of supply writes the same way at its pump shaft: the power and torque it takes from
its own prime mover, and the heat balance that closes a supply's mode.

Relations (fluid-power textbook; first law of thermodynamics on the circuit):
    T_pm = P_in / (2*pi*n_pm)        torque taken from the prime mover at its speed n_pm [N*m]
    Q    = P_in - P_shaft + P_brake  heat load: power in that does no useful work, plus the power
                                     absorbed from overrunning loads [W]
Example: 20 kW at 2000 rpm: T_pm = 20000 / (2*pi*33.33) = 95.5 N*m.
"""

from __future__ import annotations

from specgen.calc import supply as pump
from specgen.intake.model import Supply
from specgen.resolve.record import Record
from specgen.trace import Input, Value, given

SRC_HEAT = "energy balance (first law) on the circuit: heat = power in - useful shaft power"


def prime_mover_draw(rec: Record, sup: Supply, p_in: float, source: str) -> None:
    """The supply's own prime mover power (as entered) and the torque the pump takes from it.

    ``p_in``: pump input power [W] (negative when the load drives the pump); ``source``: the relation's
    source as the supply kind states it."""
    if sup.prime_mover_power is not None:
        rec.put(given("prime_mover_power", "Prime mover power available", "P_pm", sup.prime_mover_power, "power"))
    if sup.prime_mover_speed is not None:
        rec.put(Value("prime_mover_torque", "Torque taken from the prime mover", "T_pm",
                      pump.input_torque(p_in, sup.prime_mover_speed), "torque", "T_pm = P_in / (2*pi*n_pm)",
                      "pump input power at the prime mover's speed (losses of a pump drive gearbox neglected)",
                      (Input("P_in", "pump input power", p_in, "power"),
                       Input("n_pm", "prime mover speed", sup.prime_mover_speed, "speed")), source))


def braking_and_heat(rec: Record, braking, p_brake: float, p_in: float, useful: float, heat: float) -> None:
    """The power absorbed from overrunning loads (when any runs) and the mode's heat load ``heat`` [W],
    which the caller has summed as P_in - P_shaft + P_brake from its own parts."""
    if braking:
        rec.put(Value("braking_power", "Power absorbed from overrunning loads", "P_brake", p_brake, "power",
                      "P_brake = sum(P_overrunning)", "the lowering or downhill load's power, turned to heat at the "
                      "load-holding valve", (), SRC_HEAT))
    rec.put(Value("heat_load", "Heat load (cooling duty)", "Q", heat, "power",
                  "Q = P_in - P_shaft + P_brake", "power in that does no useful work, plus power absorbed from the load",
                  (Input("P_in", "pump input power", p_in, "power"),
                   Input("P_shaft", "useful shaft power", useful, "power"),
                   Input("P_brake", "absorbed braking power", p_brake, "power")), SRC_HEAT))
