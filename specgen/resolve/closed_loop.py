"""A closed-loop supply (hydrostatic transmission) in one mode: loop flow, pump stroke, high side,
pump torque and power, charge flow and power, transmission efficiency and heat.

The motors of one loop share its lines: they run in parallel, their flows add and the highest
pressure any of them needs sets the high side. Their duty points are resolved as for any drive,
with the charge pressure as the pressure at their outlets (the supply's return pressure,
intake/build_closed_loop.py), so each motor's inlet pressure is already p_L + its differential + its
line and valve drops: that is its high-side need.

Driving: the pump strokes to x = q / (Vp*n_p*eta_v,p) and takes x*Vp*(p_H - p_L)/(2*pi*eta_hm,p).
Overrunning (every motor of the loop overruns): the motors pump q = Vg*n*eta_v,m at their braking
differential, the pump swallows it at x = q*eta_v,p/(Vp*n_p) and gives x*Vp*(p_H - p_L)*eta_hm,p/(2*pi)
back to its shaft: the pump input power and torque are negative (the load drives the prime mover) and
nothing is throttled in a valve, so the heat is the motor and pump losses and the charge circuit
alone. Line losses are left out while overrunning: the power returned is taken at its largest, the
side that matters for the prime mover's braking and overspeed.
The charge pump turns with the main pump; its power adds to the input power and, as its whole flow
returns to tank at the charge pressure (leaks, flushing, charge relief), to the heat.

Pure: SI floats in, traced Values out. Example (hand calculation): one motor needing 95 L/min at
p_H 300 bar on a 100 cm^3 pump at 2000 rpm (eta_v 0.95, eta_t 0.874, so eta_hm 0.92), charge 25 bar:
x = 0.5, T_loop = 237.87 N*m, P_loop = 2*pi*33.33*237.87 = 49.82 kW.
"""

from __future__ import annotations

import math

from specgen.calc import closed_loop as hst, supply as pump_calc
from specgen.intake.model import Machine, Supply
from specgen.resolve.pump_shaft import prime_mover_draw
from specgen.resolve.record import Record, eff, motor_eff
from specgen.results import Contribution, SupplyModeResult
from specgen.trace import Input, Value, given, indexed

SRC_HST = "hydrostatic transmission relations (fluid-power textbook), efficiencies in the direction of the power"
SRC_CHARGE = "charge flow covers the loop's leakage sum(V*n*(1 - eta_v)) and the flushing flow (design rule)"
SRC_HEAT = "energy balance (first law) on the loop: heat = power in - useful shaft power + power absorbed from the load"


def _pump_path(sup: Supply, key: str) -> tuple[str, ...]:
    return ("supplies", sup.id, "pump", key)


def _charge_path(sup: Supply, key: str) -> tuple[str, ...]:
    return ("supplies", sup.id, "closed_loop", "charge", key)


def _motor_volumetric(machine: Machine, drive_id: str, duty) -> Input:
    """The motor's volumetric efficiency at this duty point: from the maker's table where it was read there."""
    v = duty.values.get("table_volumetric_efficiency")
    if v is not None:
        return Input("eta_v", v.label, v.value, "ratio")
    return motor_eff(drive_id, "volumetric", machine.drive(drive_id).motor.volumetric_efficiency)


def resolve_loop_mode(machine: Machine, sup: Supply, mode, running, duties: dict, base: dict) -> SupplyModeResult:
    """``running``: (drive id, duty id) of the supply's drives running in ``mode``; ``base``: the supply's
    mode-independent values (pump shaft speed, full-stroke delivery)."""
    rec = Record()
    driving = [(d, u) for d, u in running if duties[(d, u)].direction != "overrunning"]
    overrun = not driving
    carried = running if overrun else driving
    note = "" if len(carried) == len(running) else (
        "not counted: " + ", ".join(f"{d} at {u}" for d, u in running if (d, u) not in carried)
        + " (overrunning while other motors of the loop drive: motors on one loop share its high side)")
    flows, highs, leaks = {}, {}, {}
    for d, u in carried:
        r = duties[(d, u)]
        vg, n = r.values["displacement"], r.values["motor_speed"]
        v_in = _motor_volumetric(machine, d, r)
        vg_in = Input("Vg", "motor displacement", vg.value, "displacement")
        n_in = Input("n", "motor speed", n.value, "speed")
        if overrun:
            flows[d] = rec.put(Value("loop_flow", f"Flow {d} pumps into the loop", "q_m",
                                     vg.value * n.value * v_in.value, "flow", "q_m = Vg * n * eta_v",
                                     "the overrun motor works as a pump: displacement times speed, less its leakage",
                                     (vg_in, n_in, v_in), SRC_HST), drive=d)
            hold = r.values["braking_pressure"]
            highs[d] = rec.put(Value("high_side_pressure", f"High-side pressure {d} builds", "p_H,m", hold.value,
                                     "pressure", "p_H,m = p_hold", "the braking differential on top of the low side",
                                     (Input("p_hold", hold.label, hold.value, "pressure"),), SRC_HST), drive=d)
        else:
            flows[d] = rec.put(Value("loop_flow", f"Flow {d} takes from the loop", "q_m", r["flow_demand"], "flow",
                                     "q_m = q", "the motor's flow demand at this duty point",
                                     (Input("q", "flow demand", r["flow_demand"], "flow"),), SRC_HST), drive=d)
            need = r.values.get("supply_pressure_required") or r.values["inlet_pressure"]
            highs[d] = rec.put(Value("high_side_pressure", f"High-side pressure {d} needs", "p_H,m", need.value,
                                     "pressure", "p_H,m = p_L + dp + dp_lines",
                                     "its inlet pressure (charge pressure at the outlet plus its differential and "
                                     "return-side drops) plus the pressure-side drops",
                                     (Input(need.symbol, need.label, need.value, "pressure"),), SRC_HST), drive=d)
        leaks[d] = rec.put(Value("motor_leakage", f"Leakage of {d} the charge pump makes up", "q_leak,m",
                                 hst.leakage(vg.value, n.value, v_in.value), "flow", "q_leak,m = Vg * n * (1 - eta_v)",
                                 "displacement times speed times the volumetric loss", (vg_in, n_in, v_in),
                                 SRC_CHARGE), drive=d)
    contributions = tuple(Contribution(d, u, flows.get(d, 0.0)) for d, u in running)
    q = rec.put(Value("flow_demand", "Loop flow the motors return" if overrun else "Loop flow the motors take",
                      "q_loop", sum(flows.values()), "flow", "q_loop = sum(q_m)", "motors on one loop run in parallel: "
                      "their flows add", tuple(Input(indexed("q_m", d), f"{d}", f, "flow") for d, f in flows.items()),
                      SRC_HST, note=note))
    p = sup.pump
    n_p = base["pump_shaft_speed"].value
    rec.put(base["pump_delivery"])
    vp_in = Input("Vp", "pump maximum displacement", p.displacement, "displacement")
    np_in = Input("n_p", "pump shaft speed", n_p, "speed")
    ev_in = eff("eta_v,p", "pump volumetric efficiency", p.volumetric_efficiency,
                _pump_path(sup, "volumetric_efficiency"))
    q_in = Input("q_loop", "loop flow", q, "flow")
    if overrun:
        x = rec.put(Value("pump_displacement_setting", "Pump displacement setting (stroke)", "x",
                          hst.stroke_overrunning(q, p.displacement, n_p, p.volumetric_efficiency.value), "ratio",
                          "x = q_loop * eta_v,p / (Vp * n_p)", "the pump, driven as a motor, swallows the motors' "
                          "flow; 1 is full stroke", (q_in, ev_in, vp_in, np_in), SRC_HST))
    else:
        x = rec.put(Value("pump_displacement_setting", "Pump displacement setting (stroke)", "x",
                          hst.stroke_driving(q, p.displacement, n_p, p.volumetric_efficiency.value), "ratio",
                          "x = q_loop / (Vp * n_p * eta_v,p)", "loop flow over the full-stroke delivery; 1 is full "
                          "stroke", (q_in, vp_in, np_in, ev_in), SRC_HST))
    p_l = rec.put(given("low_side_pressure", "Low-side (charge) pressure", "p_L", sup.closed_loop.charge.pressure,
                        "pressure"))
    p_h = rec.put(Value("working_pressure", "High-side pressure at the pump", "p_H", max(highs.values(), default=p_l),
                        "pressure", "p_H = max(p_H,m)", "the highest pressure a motor of the loop "
                        + ("builds (line losses left out: the most power returned)" if overrun else "needs"),
                        tuple(Input(indexed("p_H", d), f"{d}", v, "pressure") for d, v in highs.items()), SRC_HST))
    dp = rec.put(Value("loop_pressure_differential", "Loop pressure differential", "dp_loop", p_h - p_l, "pressure",
                       "dp_loop = p_H - p_L", "high side less low side",
                       (Input("p_H", "high-side pressure", p_h, "pressure"),
                        Input("p_L", "low-side pressure", p_l, "pressure")), SRC_HST))
    ratio = p.overall_efficiency.value / p.volumetric_efficiency.value
    # The spec's own figures keep the ratio at or under 1 (intake refuses more); an operating corner that
    # lowers the volumetric efficiency alone can lift it past 1, where it is held at 1 and said so.
    eta_hm = rec.put(Value("pump_hydromechanical_efficiency", "Pump hydro-mechanical efficiency", "eta_hm,p",
                           min(ratio, 1.0), "ratio",
                           "eta_hm,p = eta_t,p / eta_v,p" if ratio <= 1 else "eta_hm,p = min(eta_t,p / eta_v,p, 1)",
                           "overall over volumetric efficiency",
                           (eff("eta_t,p", "pump overall efficiency", p.overall_efficiency,
                                _pump_path(sup, "overall_efficiency")), ev_in), SRC_HST,
                           note="held at 1: the overall efficiency is above the volumetric here (a corner lowers "
                                "the volumetric alone); the loop torque here is a lower bound" if ratio > 1 else ""))
    x_in, dp_in = Input("x", "displacement setting", x, "ratio"), Input("dp_loop", "loop differential", dp, "pressure")
    hm_in = Input("eta_hm,p", "pump hydro-mechanical efficiency", eta_hm, "ratio")
    if overrun:
        t_loop = rec.put(Value("pump_loop_torque", "Torque the pump gives back to its shaft", "T_loop",
                               hst.pump_torque_overrunning(x, p.displacement, dp, eta_hm), "torque",
                               "T_loop = -x * Vp * dp_loop * eta_hm,p / (2*pi)",
                               "the pump works as a motor: negative, it drives the prime mover",
                               (x_in, vp_in, dp_in, hm_in), SRC_HST))
    else:
        t_loop = rec.put(Value("pump_loop_torque", "Pump torque for the loop", "T_loop",
                               hst.pump_torque_driving(x, p.displacement, dp, eta_hm), "torque",
                               "T_loop = x * Vp * dp_loop / (2*pi * eta_hm,p)", "stroke times displacement times "
                               "differential over the hydro-mechanical efficiency", (x_in, vp_in, dp_in, hm_in),
                               SRC_HST))
    p_loop = rec.put(Value("pump_loop_power", "Pump power for the loop" + (" (returned)" if overrun else ""), "P_loop",
                           2.0 * math.pi * n_p * t_loop, "power", "P_loop = 2*pi*n_p*T_loop",
                           "torque times angular speed", (Input("T_loop", "loop torque", t_loop, "torque"), np_in),
                           SRC_HST))
    p_c = _charge(rec, sup, n_p, np_in, leaks)
    p_in = rec.put(Value("pump_input_power", "Pump input power (loop and charge)", "P_in", p_loop + p_c, "power",
                         "P_in = P_loop + P_c", "loop power and charge pump power on one shaft",
                         (Input("P_loop", "loop power", p_loop, "power"),
                          Input("P_c", "charge pump power", p_c, "power")),
                         SRC_HST, note="negative: the load drives the prime mover" if p_loop + p_c < 0 else ""))
    pin_in = Input("P_in", "pump input power", p_in, "power")
    rec.put(Value("pump_input_torque", "Pump input torque", "T_p", pump_calc.input_torque(p_in, n_p), "torque",
                  "T_p = P_in / (2*pi*n_p)", "input power over the pump's angular speed", (pin_in, np_in), SRC_HST,
                  note="negative: the pump drives its shaft" if p_in < 0 else ""))
    prime_mover_draw(rec, sup, p_in, SRC_HST)
    _efficiency_and_heat(rec, [duties[k] for k in carried], overrun, q, dp, p_loop, p_c, p_in)
    return SupplyModeResult(sup.id, mode.id, contributions, rec.values, rec.per_drive, tuple(rec.order))


def _charge(rec: Record, sup: Supply, n_p: float, np_in: Input, leaks: dict) -> float:
    """Charge flow, the flow it must cover, what leaves over the charge relief, and the charge pump's power."""
    c, p = sup.closed_loop.charge, sup.pump
    if c.flow is not None:
        q_c = rec.put(given("charge_flow", "Charge flow", "q_c", c.flow, "flow"))
    else:
        q_c = rec.put(Value("charge_flow", "Charge flow", "q_c", pump_calc.delivery(c.displacement, n_p,
                                                                                    c.volumetric_efficiency.value),
                            "flow", "q_c = Vc * n_p * eta_v,c", "charge pump displacement times the main pump's "
                            "shaft speed (through drive) times its volumetric efficiency",
                            (Input("Vc", "charge pump displacement", c.displacement, "displacement"), np_in,
                             eff("eta_v,c", "charge pump volumetric efficiency", c.volumetric_efficiency,
                                 _charge_path(sup, "volumetric_efficiency"))), SRC_CHARGE))
    vp, ev = p.displacement, p.volumetric_efficiency
    if c.displacement is not None:
        rec.put(Value("charge_displacement_share", "Charge pump displacement over the main pump's", "Vc/Vp",
                      c.displacement / vp, "ratio", "Vc/Vp = Vc / Vp", "the charge pump's size beside the main pump's",
                      (Input("Vc", "charge pump displacement", c.displacement, "displacement"),
                       Input("Vp", "pump maximum displacement", vp, "displacement")), SRC_CHARGE,
                      note="usually 10-25 % (from memory, common practice)"))
    pump_leak = hst.leakage(vp, n_p, ev.value)
    flush = sup.closed_loop.flushing_flow
    need = rec.put(Value("charge_flow_needed", "Charge flow needed (leakage and flushing)", "q_c,need",
                         pump_leak + sum(leaks.values()) + flush, "flow",
                         "q_c,need = Vp * n_p * (1 - eta_v,p) + sum(q_leak,m) + q_flush",
                         "the pump's leakage at full displacement, every running motor's leakage and the flushing flow",
                         (Input("Vp", "pump maximum displacement", vp, "displacement"), np_in,
                          eff("eta_v,p", "pump volumetric efficiency", ev, _pump_path(sup, "volumetric_efficiency")))
                         + tuple(Input(indexed("q_leak", d), f"{d} leakage", f, "flow") for d, f in leaks.items())
                         + (Input("q_flush", "flushing flow", flush, "flow"),), SRC_CHARGE))
    rec.put(Value("charge_relief_flow", "Charge flow over the charge relief", "q_c,relief", max(q_c - need, 0.0),
                  "flow", "q_c,relief = max(q_c - q_c,need, 0)", "what the loop does not take leaves over the charge "
                  "relief at the charge pressure",
                  (Input("q_c", "charge flow", q_c, "flow"), Input("q_c,need", "charge flow needed", need, "flow")),
                  SRC_CHARGE))
    return rec.put(Value("charge_power", "Charge pump power", "P_c",
                         hst.charge_power(q_c, c.pressure, c.overall_efficiency.value), "power",
                         "P_c = q_c * p_c / eta_t,c", "charge flow at the charge pressure over the charge pump's "
                         "overall efficiency",
                         (Input("q_c", "charge flow", q_c, "flow"),
                          Input("p_c", "charge pressure", c.pressure, "pressure"),
                          eff("eta_t,c", "charge pump overall efficiency", c.overall_efficiency,
                              _charge_path(sup, "overall_efficiency"))), SRC_HST))


def _efficiency_and_heat(rec: Record, duties: list, overrun: bool, q: float, dp: float, p_loop: float, p_c: float,
                         p_in: float) -> None:
    """Transmission efficiency and the heat breakdown: pump, motors and lines, charge circuit."""
    shafts = tuple(Input(indexed("P", r.drive), f"{r.drive} at {r.duty}", r["shaft_power"], "power") for r in duties)
    total = sum(r["shaft_power"] for r in duties)
    p_h = q * dp  # hydraulic power between pump and motors
    if overrun:
        shaft, brake = 0.0, rec.put(Value("braking_power", "Power absorbed from overrunning loads", "P_brake", total,
                                          "power", "P_brake = sum(P_m)", "shaft power the loads put into the motors",
                                          shafts, SRC_HEAT))
        if brake > 0:
            rec.put(Value("transmission_efficiency", "Transmission efficiency, motor shaft to pump shaft", "eta_T",
                          -p_loop / brake, "ratio", "eta_T = -P_loop / P_brake",
                          "power returned to the pump shaft over the power the loads put in (eta_t,m * eta_t,p)",
                          (Input("P_loop", "loop power (returned)", p_loop, "power"),
                           Input("P_brake", "absorbed power", brake, "power")), SRC_HST))
        pump_loss, drive_loss = p_h + p_loop, brake - p_h
    else:
        shaft, brake = rec.put(Value("useful_shaft_power", "Useful shaft power of the motors", "P_shaft", total,
                                     "power", "P_shaft = sum(P_m)", "shaft power of every motor on the loop",
                                     shafts, SRC_HEAT)), 0.0
        if p_in > 0:
            rec.put(Value("transmission_efficiency", "Transmission efficiency, pump shaft to motor shafts", "eta_T",
                          shaft / p_in, "ratio", "eta_T = P_shaft / P_in",
                          "useful shaft power over the pump input power (loop and charge)",
                          (Input("P_shaft", "useful shaft power", shaft, "power"),
                           Input("P_in", "pump input power", p_in, "power")), SRC_HST))
        pump_loss, drive_loss = p_loop - p_h, p_h - shaft
    rec.put(Value("heat_pump_loss", "Heat from pump losses", "Q_pump", pump_loss, "power",
                  "Q_pump = q_loop * dp_loop + P_loop" if overrun else "Q_pump = P_loop - q_loop * dp_loop",
                  "the pump's loss between its shaft and the loop", (), SRC_HEAT))
    rec.put(Value("heat_drive_loss", "Heat in lines and motors", "Q_drives", drive_loss, "power",
                  "Q_drives = P_brake - q_loop * dp_loop" if overrun else "Q_drives = q_loop * dp_loop - P_shaft",
                  "the motors' and lines' loss between the loop and the motor shafts", (), SRC_HEAT))
    rec.put(Value("heat_charge", "Heat from the charge circuit", "Q_charge", p_c, "power", "Q_charge = P_c",
                  "the whole charge flow returns to tank at the charge pressure (leaks, flushing, charge relief), "
                  "with the charge pump's own losses", (Input("P_c", "charge pump power", p_c, "power"),), SRC_HEAT))
    rec.put(Value("heat_load", "Heat load (cooling duty)", "Q", p_in - shaft + brake, "power",
                  "Q = P_in - P_shaft + P_brake", "power in that does no useful work, plus power absorbed from the "
                  "load; an overrunning load's power goes back to the prime mover, none is throttled in a valve",
                  (Input("P_in", "pump input power", p_in, "power"),
                   Input("P_shaft", "useful shaft power", shaft, "power"),
                   Input("P_brake", "absorbed braking power", brake, "power")), SRC_HEAT))
