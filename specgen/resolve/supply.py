"""Supplies: the pump's speed and full delivery, then per mode the circuit (parallel or series),
pump pressure and input power, prime mover torque, makeup flow for overrunning drives and the heat
load; per mode the heat all supplies put into the reservoir; per supply its worst modes.

Circuits:
  parallel  flows add; the supply pressure is the highest pressure any running drive needs
            (its inlet pressure plus its pressure-line loss).
  series    the running drives in the spec's order; the same line flow passes through each, so the
            line carries the largest demand and a drive needing less is taken as bypassed at its
            valve for the difference. Pressures add from the end: the last outlet sits at the
            return pressure, each inlet is its outlet plus its differential, each outlet is the
            next inlet plus the lines between. An overrunning drive adds no differential (its
            counterbalance valve holds the load), only its line losses.

Pure: SI floats in, traced Values out.
"""

from __future__ import annotations

from specgen.calc import heat, supply as pump
from specgen.resolve.load_sensing import ls_pump_and_heat
from specgen.resolve.closed_loop import resolve_loop_mode
from specgen.resolve.record import Record, eff
from specgen.resolve.lines import line_values
from specgen.resolve.pump_shaft import braking_and_heat, prime_mover_draw
from specgen.resolve.series import series_start
from specgen.resolve.suction import suction_values
from specgen.results import Contribution, FluidResult, ModeResult, SupplyModeResult, SupplyResult
from specgen.intake.model import Machine, Supply
from specgen.trace import Input, Value, given, indexed

SRC_PUMP = "positive-displacement pump relations (fluid-power textbook)"
SRC_HEAT = "energy balance (first law) on the circuit: heat = power in - useful shaft power"
SRC_PARALLEL = "parallel circuit: flows add, the highest pressure demand sets the supply pressure"
SRC_SERIES = "series circuit: one flow through every motor, pressure differentials add"


def supply_base(sup: Supply, fluid: FluidResult, shared_speed: Value | None = None) -> dict[str, Value]:
    """Prime mover and pump shaft speed, full delivery, suction line: mode-independent for a supply with
    its own prime mover figures. ``shared_speed``: the speed of the shared prime mover the supply names,
    in one mode or the fastest its modes run (resolve/prime_mover.py), which the pump turns at times its
    drive ratio."""
    rec = Record()
    p = sup.pump
    n_p = p.shaft_speed
    if shared_speed is None and sup.prime_mover_speed is not None:
        shared_speed = given("prime_mover_speed", "Prime mover speed", "n_pm", sup.prime_mover_speed, "speed")
    if shared_speed is not None:
        n_pm = rec.put(shared_speed)
        if n_p is None:
            n_p = rec.put(Value("pump_shaft_speed", "Pump shaft speed", "n_p", n_pm * sup.drive_ratio, "speed",
                                "n_p = n_pm * i_pd", "prime mover speed times the pump drive ratio",
                                (Input("n_pm", "prime mover speed", n_pm, "speed"),
                                 Input("i_pd", "pump drive ratio", sup.drive_ratio, "ratio")), SRC_PUMP))
    if n_p is not None and "pump_shaft_speed" not in rec.values:
        rec.put(given("pump_shaft_speed", "Pump shaft speed", "n_p", n_p, "speed"))
    if p.delivery is not None:
        rec.put(given("pump_delivery", "Pump delivery", "q_p", p.delivery, "flow"))
    else:
        stroked = sup.strokes_back or sup.closed_loop is not None  # a variable pump: its full stroke
        rec.put(Value("pump_delivery", "Pump delivery" + (" at full stroke" if stroked else ""), "q_p",
                      pump.delivery(p.displacement, n_p, p.volumetric_efficiency.value), "flow",
                      "q_p = Vp * n_p * eta_v,p", "pump displacement times shaft speed times volumetric efficiency",
                      (Input("Vp", "pump displacement", p.displacement, "displacement"),
                       Input("n_p", "pump shaft speed", n_p, "speed"),
                       eff("eta_v,p", "pump volumetric efficiency", p.volumetric_efficiency,
                           ("supplies", sup.id, "pump", "volumetric_efficiency"))), SRC_PUMP))
    if sup.suction_line is not None and "kinematic_viscosity" in fluid.values:
        # the pump draws its geometric flow; leakage returns inside it
        q_s = p.displacement * n_p if p.displacement is not None else rec.get("pump_delivery")
        for value in line_values("suction", sup.suction_line, q_s, fluid["kinematic_viscosity"], fluid["density"]):
            rec.put(value)
    density = fluid["density"] if "density" in fluid.values else None
    for value in suction_values(sup, density, rec.get("suction_line_loss")):
        rec.put(value)
    return rec.values


def resolve_supply_mode(machine: Machine, sup: Supply, mode, duties: dict, base: dict) -> SupplyModeResult | None:
    # The mode's own drives, in the mode's order: a walk over the whole machine for every mode and
    # supply would make a large spec quadratic.
    running = [(d, u) for d, u in mode.running if machine.drive(d).supply == sup.id]
    if not running:
        return None
    if sup.circuit == "closed_loop":
        return resolve_loop_mode(machine, sup, mode, running, duties, base)
    if sup.circuit != "parallel":  # in series the spec's order of drives is the order along the line
        running.sort(key=lambda x: machine.drive_position(x[0]))
    contributions = tuple(Contribution(d, u, duties[(d, u)]["flow_demand"]) for d, u in running)
    rec = Record()
    # an overrunning motor fed through makeup valves from the return line draws nothing from the pump
    pumped = [(d, u) for d, u in running if _pump_fed(machine, d, duties[(d, u)])]
    pumped_c = [c for c in contributions if (c.drive, c.duty) in pumped]
    flows = tuple(Input(indexed("q", c.drive), f"{c.drive} at {c.duty}", c.flow, "flow") for c in pumped_c)
    note = "" if len(pumped) == len(running) else (
        "not counted: " + ", ".join(f"{d} at {u}" for d, u in running if (d, u) not in pumped)
        + " (overrunning, its inlet filled through makeup valves from the return line)")
    if not pumped:
        demand = rec.put(Value("flow_demand", "Flow demand on the pump", "q_sum", 0.0, "flow", "q_sum = 0",
                               "no running drive takes flow from the pump", (), "continuity of flow", note=note))
        p_work = rec.put(Value("working_pressure", "Supply working pressure", "p_s", sup.return_pressure, "pressure",
                               "p_s = p_return", "no drive takes pump flow: the line sits at the return pressure",
                               (Input("p_return", "return pressure", sup.return_pressure, "pressure"),), SRC_PARALLEL))
    elif sup.circuit == "series":
        demand = rec.put(Value("flow_demand", "Series line flow", "q_line", max(c.flow for c in pumped_c), "flow",
                               "q_line = max(q_i)", "the largest demand of the drives in series; a drive needing less "
                               "is bypassed at its valve for the difference", flows, SRC_SERIES, note=note))
        p_work = _series_pressures(rec, machine, sup, running, duties)
    else:
        demand = rec.put(Value("flow_demand", "Summed flow demand", "q_sum", sum(c.flow for c in pumped_c), "flow",
                               "q_sum = sum(q_i)", "drives in parallel: their flows add", flows,
                               "continuity of flow in a parallel circuit", note=note))
        needs = [(d, u, duties[(d, u)].values.get("supply_pressure_required") or duties[(d, u)].values["inlet_pressure"])
                 for d, u in pumped]
        p_work = rec.put(Value("working_pressure", "Supply working pressure", "p_s", max(x[2].value for x in needs),
                               "pressure", "p_s = max(p_supply,i)",
                               "the highest pressure a running drive needs at the supply (inlet plus pressure-line loss)",
                               tuple(Input(indexed("p", d), f"{d} at {u}", v.value, "pressure") for d, u, v in needs),
                               SRC_PARALLEL))
    if sup.prime_mover is not None:  # on a shared prime mover the pump's speed belongs to the mode
        rec.put(base["pump_shaft_speed"])
    q_pump = rec.put(base["pump_delivery"])
    rec.put(Value("flow_surplus", "Surplus (+) or shortfall (-)", "dq", q_pump - demand, "flow",
                  "dq = q_p - q_sum", "pump delivery less the flow the drives take",
                  (Input("q_p", "pump delivery", q_pump, "flow"), Input("q_sum", "flow demand", demand, "flow")), ""))
    _makeup(rec, machine, sup, running, pumped, duties, q_pump, demand)
    if sup.load_sensing:  # the highest need plus the margin, the flow shared out: resolve/load_sensing.py
        _prime_mover(rec, sup, base, ls_pump_and_heat(rec, sup, pumped, running, duties, base))
    else:
        _pump_and_heat(rec, sup, pumped, running, duties, q_pump, demand, p_work, base)
    return SupplyModeResult(sup.id, mode.id, contributions, rec.values, rec.per_drive, tuple(rec.order))


def _pump_fed(machine: Machine, drive_id: str, duty) -> bool:
    """Does this running duty point take its inlet flow from the pump: every driving one, and an
    overrunning one lowered through a counterbalance valve (the pump holds its pilot open)."""
    return duty.direction != "overrunning" or machine.drive(drive_id).pump_fed_overrun


def _series_pressures(rec: Record, machine: Machine, sup: Supply, running, duties) -> float:
    p = sup.return_pressure
    terms = [Input("p_return", "return pressure", p, "pressure")]
    for d, u in reversed(running):
        r = duties[(d, u)].values
        # line losses and directional-valve drops between this motor and the next (or tank, or pump)
        ret = sum(r[k].value for k in ("return_line_loss", "valve_drop_to_tank") if k in r)
        press = sum(r[k].value for k in ("pressure_line_loss", "valve_drop_to_motor") if k in r)
        dp = 0.0 if duties[(d, u)].direction == "overrunning" else r["pressure_differential"].value
        outlet = p + ret
        inlet = outlet + dp
        rec.put(Value("outlet_pressure", f"Outlet pressure of {d} in series", "p_out", outlet, "pressure",
                      "p_out = p_next + dp_return_line", "the next drive's inlet (or the return) plus the line between",
                      (Input("p_next", "pressure downstream", p, "pressure"),
                       Input("dp_return_line", "return-line loss", ret, "pressure")), SRC_SERIES), drive=d)
        rec.put(Value("inlet_pressure", f"Inlet pressure of {d} in series", "p_in", inlet, "pressure",
                      "p_in = p_out + dp", "outlet pressure plus the motor's differential",
                      (Input("p_out", "outlet pressure", outlet, "pressure"),
                       Input("dp", "pressure differential", dp, "pressure")), SRC_SERIES), drive=d)
        p = inlet + press
        terms += [Input(indexed("dp", d), f"{d} at {u}: differential", dp, "pressure"),
                  Input(indexed("dp_lines", d), f"{d}: line losses", ret + press, "pressure")]
    series_start(rec, machine, sup, running, duties)
    return rec.put(Value("working_pressure", "Supply working pressure", "p_s", p, "pressure",
                         "p_s = p_return + sum(dp_i + dp_lines,i)",
                         "return pressure plus every differential and line loss in the series", tuple(terms),
                         SRC_SERIES))


def _makeup(rec: Record, machine: Machine, sup: Supply, running, pumped, duties, q_pump: float,
            demand: float) -> None:
    """Flow that can fill each overrunning drive's inlet. Pump-fed (lowering through a counterbalance
    valve): the pump delivery less what the other running drives take. Through makeup valves: the
    flow the other drives return to tank plus the pump's surplus that reaches tank, and the return
    pressure that pushes it through the makeup valves."""
    for d, u in running:
        if duties[(d, u)].direction != "overrunning":
            continue
        others = [(od, ou) for od, ou in running if od != d]
        if (d, u) in pumped:
            taken = sum(duties[k]["flow_demand"] for k in others if k in pumped)
            rec.put(Value("makeup_available", f"Flow left to fill {d}'s inlet", "q_makeup", q_pump - taken, "flow",
                          "q_makeup = q_p - sum(q_other)", "pump delivery less what the other running drives take",
                          (Input("q_p", "pump delivery", q_pump, "flow"),)
                          + tuple(Input(indexed("q", od), f"{od} at {ou}", duties[(od, ou)]["flow_demand"], "flow")
                                  for od, ou in others if (od, ou) in pumped), "continuity of flow"), drive=d)
            continue
        returning = [(od, ou) for od, ou in others if (od, ou) in pumped]
        back = sum(duties[k]["flow_demand"] for k in returning)
        # a compensated pump strokes back: its unused delivery never flows
        surplus = 0.0 if sup.strokes_back else max(q_pump - demand, 0.0)
        rec.put(Value("makeup_available", f"Flow returning to tank that can fill {d}'s inlet", "q_makeup",
                      back + surplus, "flow", "q_makeup = sum(q_return,other) + q_surplus",
                      "the other drives' return flow and the pump's surplus, drawn through the makeup valves",
                      tuple(Input(indexed("q", od), f"{od} at {ou} returning", duties[(od, ou)]["flow_demand"], "flow")
                            for od, ou in returning)
                      + (Input("q_surplus", "pump surplus to tank" + (" (compensated pump: none)" if sup.strokes_back
                                                                      else ""), surplus, "flow"),),
                      "continuity of flow"), drive=d)
        rec.put(Value("makeup_pressure", "Return pressure at the makeup valves", "p_makeup", sup.return_pressure,
                      "pressure", "p_makeup = p_return", "the return-line pressure that pushes oil through the makeup "
                      "(anti-cavitation) valves into the inlet",
                      (Input("p_return", "return pressure", sup.return_pressure, "pressure"),), "continuity of flow"),
                 drive=d)


def _pump_and_heat(rec: Record, sup: Supply, pumped, running, duties, q_pump, demand, p_work, base) -> None:
    p = sup.pump
    eta_t = p.overall_efficiency
    q_in, ps_in = Input("q_p", "pump delivery", q_pump, "flow"), Input("p_s", "working pressure", p_work, "pressure")
    taken = min(demand, q_pump)  # in a shortfall the drives share what there is and slow down
    share = taken / demand if demand > 0 else 1.0
    driving = [duties[k] for k in pumped if duties[k].direction != "overrunning"]
    braking = [duties[k] for k in running if duties[k].direction == "overrunning"]
    if sup.compensated:
        p_pump = rec.put(given("pump_pressure", "Pump outlet pressure (compensator setting)", "p_pump",
                               p.compensator_setting, "pressure"))
        q_del = rec.put(Value("pump_delivered_flow", "Flow the pump delivers", "q_del", taken, "flow",
                              "q_del = min(q_sum, q_p)", "a compensated pump strokes back to the flow the drives take",
                              (Input("q_sum", "flow demand", demand, "flow"), q_in), SRC_PUMP))
    else:
        dump, why = {"working_pressure": (p_work, "bypassed at the working pressure"),
                     "relief": (sup.relief_setting, "over the relief valve"),
                     "open_centre": (sup.open_centre_pressure, "through the open centre")}[sup.surplus_to]
        surplus = q_pump > demand
        p_pump = rec.put(Value("pump_pressure", "Pump outlet pressure", "p_pump",
                               max(p_work, dump) if surplus else p_work, "pressure",
                               "p_pump = max(p_s, p_dump)" if surplus else "p_pump = p_s",
                               f"surplus flow leaves {why}; the pump outlet sits at the higher of that and the "
                               "drives' pressure" if surplus else "no surplus flow: the drives set the pressure",
                               (ps_in, Input("p_dump", "pressure the surplus is dumped at", dump, "pressure")), SRC_PUMP))
        q_del = q_pump
    shaft = sum(r["shaft_power"] for r in driving) * share
    shaft = min(shaft, taken * p_pump)  # a drive that needs more than the pump pressure cannot deliver it
    if sup.compensated:
        hb = heat.compensated_pump_heat(taken, p_pump, eta_t.value, shaft)
        formula, words = "P_in = q_del * p_comp / eta_t", "delivered flow at the compensator setting, over overall efficiency"
        ins = (Input("q_del", "delivered flow", q_del, "flow"), Input("p_comp", "compensator setting", p_pump, "pressure"))
    else:
        hb = heat.fixed_pump_heat(q_pump, taken, p_work, p_pump if q_pump > demand else p_work, eta_t.value, shaft)
        formula, words = "P_in = q_p * p_pump / eta_t", "full delivery at the pump outlet pressure, over overall efficiency"
        ins = (q_in, Input("p_pump", "pump outlet pressure", p_pump, "pressure"))
    p_in = rec.put(Value("pump_input_power", "Pump input power", "P_in", hb.pump_input, "power", formula, words,
                         ins + (eff("eta_t", "pump overall efficiency", eta_t,
                                    ("supplies", sup.id, "pump", "overall_efficiency")),), SRC_PUMP,
                         note="surplus flow is taken as returned at the working pressure"
                         if not sup.compensated and sup.surplus_to == "working_pressure" else ""))
    _prime_mover(rec, sup, base, p_in)
    _heat(rec, hb, shaft, braking, share)


def _prime_mover(rec: Record, sup: Supply, base, p_in: float) -> None:
    """Pump input torque and what the pump takes from its prime mover."""
    pin_in = Input("P_in", "pump input power", p_in, "power")
    if "pump_shaft_speed" in base:
        n_p = base["pump_shaft_speed"].value
        rec.put(Value("pump_input_torque", "Pump input torque", "T_p", pump.input_torque(p_in, n_p), "torque",
                      "T_p = P_in / (2*pi*n_p)", "input power over the pump's angular speed",
                      (pin_in, Input("n_p", "pump shaft speed", n_p, "speed")), SRC_PUMP))
    prime_mover_draw(rec, sup, p_in, SRC_PUMP)


def _heat(rec: Record, hb, shaft: float, braking, share: float) -> None:
    p_brake = sum(r["shaft_power"] for r in braking) * share
    rec.put(Value("useful_shaft_power", "Useful shaft power of the driving motors", "P_shaft", shaft, "power",
                  "P_shaft = sum(P_i)", "shaft power of every driving motor running", (), SRC_HEAT))
    rec.put(Value("heat_pump_loss", "Heat from pump losses", "Q_pump", hb.pump_loss, "power",
                  "Q_pump = P_in - P_hydraulic", "pump input less its hydraulic output", (), SRC_HEAT))
    if hb.surplus_loss:
        rec.put(Value("heat_surplus_loss", "Heat from surplus flow", "Q_surplus", hb.surplus_loss, "power",
                      "Q_surplus = (q_p - q_sum) * p_pump", "surplus flow dumped at the pump outlet pressure", (),
                      SRC_HEAT))
    rec.put(Value("heat_drive_loss", "Heat in valves, lines and motors", "Q_drives", hb.drive_loss, "power",
                  "Q_drives = q_sum * p_pump - P_shaft",
                  "hydraulic power sent to the drives less their useful shaft power", (), SRC_HEAT))
    braking_and_heat(rec, braking, p_brake, hb.pump_input, shaft, hb.total + p_brake)


def mode_heat(mode, supply_modes) -> ModeResult | None:
    """Heat all supplies running in ``mode`` put into the one reservoir."""
    parts = [r for r in supply_modes if r.mode == mode.id]
    if not parts:
        return None
    total = sum(r["heat_load"] for r in parts)
    value = Value("heat_load", "Heat load of the machine (cooling duty)", "Q_machine", total, "power",
                  "Q_machine = sum(Q_supply)", "every supply running in the mode returns to the one reservoir",
                  tuple(Input(indexed("Q", r.supply), f"supply {r.supply}", r["heat_load"], "power") for r in parts),
                  SRC_HEAT)
    return ModeResult(mode.id, {"heat_load": value}, {r.supply: r["heat_load"] for r in parts})


def supply_summary(sup: Supply, base: dict, supply_modes) -> SupplyResult:
    """The supply's mode-independent values and, across its modes, the worst for power and heat."""
    rec = Record()
    rec.values.update(base)
    mine = [r for r in supply_modes if r.supply == sup.id]
    worst = {}
    for key, label in (("pump_input_power", "Highest pump input power"), ("heat_load", "Highest heat load")):
        if not mine:
            continue
        top = max(mine, key=lambda r: r[key])
        worst[key] = top.mode
        rec.put(Value(f"worst_{key}", label, "max", top[key], "power", f"max over modes of {key}",
                      f"the worst mode is {top.mode}",
                      tuple(Input(indexed("", r.mode), f"mode {r.mode}", r[key], "power") for r in mine), "",
                      note=f"mode {top.mode}"))
    return SupplyResult(sup.id, rec.values, worst.get("pump_input_power"), worst.get("heat_load"))
