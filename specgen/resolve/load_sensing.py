"""A load-sensing supply in one mode: pump pressure from the highest need plus the margin, the flow the
pump can give (power limiter), who gets it (priority valve, flow divider, the valves' compensators),
each drive's reached flow and speed and the flow throttled in its valve, and the heat.

Per drive (``per_drive``): flow_offered, reached_flow, reached_speed, throttling_loss. Per mode:
ls_margin, pump_pressure, pump_available_flow (with its limiter), flow_divider_* (when a divider
splits), pump_delivered_flow, pump_input_power, heat terms. Relations: specgen/calc/load_sensing.py.

Pure: the model's SI floats in, traced Values out.
"""

from __future__ import annotations

from dataclasses import dataclass

from specgen.calc import load_sensing as ls
from specgen.intake.model import Supply
from specgen.resolve.pump_shaft import braking_and_heat
from specgen.resolve.record import Record, eff
from specgen.trace import Input, Value, given, indexed

SRC_LS = "load-sensing pump control: the pump holds its margin over the highest load pressure (fluid-power textbook)"
SRC_SHARE = "priority valve and valve compensators of a load-sensing bank (common practice, no source)"
SRC_ORIFICE = "orifice law q = k*sqrt(dp) across the metering spool (turbulent flow through a restriction; textbook)"
SRC_PUMP = "positive-displacement pump relations (fluid-power textbook)"
SRC_HEAT = "energy balance (first law) on the circuit: heat = power in - useful shaft power"
SRC_DIVIDER = "energy balance on the flow divider (first law); its drop from the maker's data"


def _need(duty) -> Value:
    """The pressure a running drive needs at the supply: its inlet plus valve and line drops."""
    return duty.values.get("supply_pressure_required") or duty.values["inlet_pressure"]


def ls_pump_and_heat(rec: Record, sup: Supply, pumped, running, duties, base) -> float:
    """Record the LS pump, the share of each drive and the heat of one mode; returns the pump input power (W)."""
    p = sup.pump
    where = ("supplies", sup.id, "pump")
    margin = rec.put(given("ls_margin", "Load-sensing margin", "dp_LS", p.ls_margin, "pressure"))
    q_max = base["pump_delivery"].value
    eta_t = p.overall_efficiency
    if not pumped:
        st = p.standby_pressure
        rec.put(given("pump_pressure", "Pump outlet pressure (standby)", "p_pump", st.value, "pressure",
                      assumed=st.assumed, where=where + ("standby_pressure",), basis=st.basis,
                      note="no running drive takes pump flow"))
        rec.put(Value("pump_delivered_flow", "Flow the pump delivers", "q_del", 0.0, "flow", "q_del = 0",
                      "the pump idles at its standby pressure", (), SRC_LS))
        p_in = rec.put(Value("pump_input_power", "Pump input power", "P_in", 0.0, "power", "P_in = 0",
                             "no flow delivered (standby leakage is the pump maker's data, not counted)", (), SRC_PUMP))
        _heat(rec, p_in, 0.0, 0.0, 0.0, 0.0, [duties[k] for k in running if duties[k].direction == "overrunning"], {})
        return p_in
    divider = sup.flow_divider
    split = divider is not None and all(any(d == x for d, _ in pumped) for x in divider.drives)
    takers = _takers(rec, sup, pumped, duties, split)
    p_pump, capped = ls.pump_pressure([t.need for t in takers], margin, sup.relief_setting)
    top = max(takers, key=lambda t: t.need)
    rec.put(Value("pump_pressure", "Pump outlet pressure", "p_pump", p_pump, "pressure",
                  "p_pump = min(max(p_i) + dp_LS, p_relief)",
                  "the highest pressure a running drive needs plus the load-sensing margin, at most the relief setting",
                  tuple(Input(indexed("p", t.name), t.label, t.need, "pressure") for t in takers)
                  + (Input("dp_LS", "load-sensing margin", margin, "pressure"),
                     Input("p_relief", "relief setting", sup.relief_setting, "pressure")), SRC_LS,
                  note=(f"capped by the relief setting: {top.name} gets less than the margin, the relief valve "
                        "opens and the pump strokes to its full available flow over it") if capped else
                  f"set by {top.name}"))
    q_avail = _available(rec, sup, p_pump, q_max, base)
    f_top = ls.metering_factor(p_pump - top.need, margin)
    consumers, factors = [], []
    for t in takers:
        # flow sharing: every compensator works on the highest load's pressure difference
        own = t.priority is not None or sup.ls_valves == "pre_compensated"
        f = ls.metering_factor(p_pump - t.need, margin) if own else f_top
        factors.append(f)
        consumers.append(ls.Consumer(t.demand * f, t.need, t.priority))
    offers = ls.offered_flows(consumers, q_avail, sup.ls_valves)
    reached_total = 0.0
    drive_flows = {}  # drive id -> (flow offered, flow reached, the sharing rule)
    for t, f, offer in zip(takers, factors, offers):
        can = offer if f >= 1.0 else min(offer, t.demand * f)
        got = min(t.demand, can)
        reached_total += got
        if t.legs is None:
            drive_flows[t.name] = (can, got, _rule(t, sup.ls_valves, f))
        else:
            _divider(rec, sup.flow_divider, t, can, got, drive_flows, _rule(t, sup.ls_valves, f))
    q_del = q_avail if capped else reached_total
    rec.put(Value("pump_delivered_flow", "Flow the pump delivers", "q_del", q_del, "flow",
                  "q_del = q_avail" if capped else "q_del = sum(q_reached,i)",
                  "relief open: the pump strokes to the flow it can give, the rest goes over the relief valve"
                  if capped else "the pump strokes to the flow the drives take",
                  (Input("q_avail", "flow available", q_avail, "flow"),
                   Input("q_taken", "flow the drives take", reached_total, "flow")), SRC_LS))
    p_in = rec.put(Value("pump_input_power", "Pump input power", "P_in", q_del * p_pump / eta_t.value, "power",
                         "P_in = q_del * p_pump / eta_t", "delivered flow at the pump pressure, over overall efficiency",
                         (Input("q_del", "delivered flow", q_del, "flow"),
                          Input("p_pump", "pump outlet pressure", p_pump, "pressure"),
                          eff("eta_t", "pump overall efficiency", eta_t, where + ("overall_efficiency",))), SRC_PUMP))
    shares = _per_drive(rec, sup, pumped, duties, drive_flows, p_pump, q_avail, split)
    throttled = sum(rec.per_drive[d]["throttling_loss"].value for d in drive_flows)
    braking = [duties[k] for k in running if duties[k].direction == "overrunning"]
    useful = sum(duties[k]["shaft_power"] * shares[k[0]] for k in pumped if duties[k].direction != "overrunning")
    sent = sum(_need(duties[k]).value * drive_flows[k[0]][1] for k in pumped)
    _heat(rec, p_in, p_pump * q_del, throttled, p_pump * (q_del - reached_total), sent - useful, braking, shares,
          useful)
    return p_in


@dataclass(frozen=True)
class _Taker:
    """A drive, or the flow divider feeding two, as one flow taker: its demand (m^3/s) and need at the
    supply (Pa); ``priority`` its place behind the priority valve; ``legs`` a divider's (drive, need) pairs."""

    name: str
    label: str
    demand: float
    need: float
    priority: int | None = None
    legs: tuple | None = None


def _takers(rec: Record, sup: Supply, pumped, duties, split: bool) -> list[_Taker]:
    out, legs = [], []
    for d, u in pumped:
        r = duties[(d, u)]
        if split and d in sup.flow_divider.drives:
            legs.append((d, r))
            continue
        rank = sup.priority.index(d) if d in sup.priority else None
        out.append(_Taker(d, f"{d} at {u}" + (" (priority)" if rank is not None else ""), r["flow_demand"],
                          _need(r).value, rank))
    if split:
        div = sup.flow_divider
        legs.sort(key=lambda x: div.drives.index(x[0]))
        (d1, r1), (d2, r2) = legs
        q_in = rec.put(Value("flow_divider_demand", "Flow the divider needs at its inlet", "q_div",
                             ls.divider_inlet_demand(r1["flow_demand"], r2["flow_demand"], div.ratio), "flow",
                             "q_div = max(q_1 / r, q_2 / (1 - r))", "enough for both legs at the divider's split",
                             (Input(indexed("q", d1), d1, r1["flow_demand"], "flow"),
                              Input(indexed("q", d2), d2, r2["flow_demand"], "flow"),
                              Input("r", f"share to {d1}", div.ratio, "ratio")), SRC_DIVIDER))
        p1, p2 = _need(r1).value, _need(r2).value
        p_div = rec.put(Value("flow_divider_pressure", "Pressure the divider needs at its inlet", "p_div",
                              max(p1, p2) + div.pressure_drop, "pressure", "p_div = max(p_1, p_2) + dp_div",
                              "the higher leg's pressure plus the divider's own drop",
                              (Input(indexed("p", d1), d1, p1, "pressure"), Input(indexed("p", d2), d2, p2, "pressure"),
                               Input("dp_div", "flow divider drop", div.pressure_drop, "pressure")), SRC_DIVIDER))
        out.append(_Taker("flow divider", f"flow divider ({d1}, {d2})", q_in, p_div,
                          legs=((d1, p1), (d2, p2))))
    return out


def _available(rec: Record, sup: Supply, p_pump: float, q_max: float, base) -> float:
    """The flow the pump can give: full stroke, or less where the power limiter destrokes it."""
    p = sup.pump
    q_in = Input("q_max", "pump delivery at full stroke", q_max, "flow")
    if p.input_power_limit is None and p.input_torque_limit is None:
        return rec.put(Value("pump_available_flow", "Flow the pump can give", "q_avail", q_max, "flow",
                             "q_avail = q_max", "full stroke (no power limiter)", (q_in,), SRC_PUMP))
    if p.input_power_limit is not None:
        p_lim = rec.put(given("pump_power_limit", "Pump power limiter setting", "P_limit", p.input_power_limit,
                              "power"))
    else:
        n_p = base["pump_shaft_speed"].value
        p_lim = rec.put(Value("pump_power_limit", "Power the torque limiter allows", "P_limit",
                              ls.torque_limit_power(p.input_torque_limit, n_p), "power", "P_limit = 2*pi*n_p*T_limit",
                              "torque limit at the pump shaft speed",
                              (Input("T_limit", "input torque limit", p.input_torque_limit, "torque"),
                               Input("n_p", "pump shaft speed", n_p, "speed")), SRC_PUMP))
    eta_t = p.overall_efficiency
    q = ls.power_limited_flow(p_lim, eta_t.value, p_pump, q_max)
    return rec.put(Value("pump_available_flow", "Flow the pump can give (power limiter)", "q_avail", q, "flow",
                         "q_avail = min(q_max, P_limit * eta_t / p_pump)",
                         "the pump destrokes so that its input power stays within the limit",
                         (q_in, Input("P_limit", "power limit", p_lim, "power"),
                          eff("eta_t", "pump overall efficiency", eta_t, ("supplies", sup.id, "pump",
                                                                           "overall_efficiency")),
                          Input("p_pump", "pump outlet pressure", p_pump, "pressure")), SRC_PUMP,
                         note="the limiter destrokes the pump" if q < q_max else "the limiter leaves full stroke"))


def _rule(t: _Taker, valves: str, f: float) -> str:
    """The sharing rule that offered ``t`` its flow, as a formula."""
    if t.priority is not None:
        rule = "q_offer = q_avail - sum(q_reached of the priority drives before it)"
    elif valves == "post_compensated":
        rule = "q_offer = q * q_left / sum(q_j), q_left after the priority drives"
    else:
        rule = "q_offer = q_left after the drives needing less pressure and the priority drives"
    return rule + (", at most q * sqrt(dp_available / dp_LS)" if f < 1.0 else "")


def _divider(rec: Record, div, taker: _Taker, can: float, got: float, drive_flows: dict, rule: str) -> None:
    """Split the divider's offered and reached inlet flow between its legs and record its loss."""
    (d1, p1), (d2, p2) = taker.legs
    for d, share in ((d1, div.ratio), (d2, 1.0 - div.ratio)):
        drive_flows[d] = (can * share, got * share, f"q_offer = r_leg * q_offer,div (r_leg = {share:.4g}; the divider's "
                          f"{rule.replace('q_offer =', 'q_offer,div =')})")
    rec.put(Value("flow_divider_loss", "Power lost in the flow divider", "P_div",
                  ls.divider_loss(got, div.ratio, div.pressure_drop, p1, p2), "power",
                  "P_div = dp_div * q_in + |p_1 - p_2| * q_low",
                  "the divider's drop on the whole flow and the lower leg throttled to its load "
                  "(part of the drives' throttling losses)",
                  (Input("q_in", "divider inlet flow", got, "flow"), Input("r", f"share to {d1}", div.ratio, "ratio"),
                   Input("dp_div", "flow divider drop", div.pressure_drop, "pressure"),
                   Input(indexed("p", d1), d1, p1, "pressure"), Input(indexed("p", d2), d2, p2, "pressure")),
                  SRC_DIVIDER))


def _per_drive(rec: Record, sup: Supply, pumped, duties, drive_flows: dict, p_pump: float, q_avail: float,
               split: bool) -> dict[str, float]:
    """Each drive's offered and reached flow, reached speed and throttling loss; returns reached / demand."""
    legs = sup.flow_divider.drives if split else ()
    shares = {}
    for d, u in pumped:
        r = duties[(d, u)]
        q, n = r["flow_demand"], r["motor_speed"]
        offer, got, rule = drive_flows[d]
        if d in legs:
            words, src = "its leg of what the divider is offered (it may exceed the demand: the drive runs faster)", \
                SRC_DIVIDER
        else:
            words, src = "what the priority valve and the compensators leave this drive", SRC_SHARE
        rec.put(Value("flow_offered", f"Flow offered to {d}", "q_offer", offer, "flow", rule,
                      words, (Input("q", "flow demand", q, "flow"),
                              Input("q_avail", "flow the pump can give", q_avail, "flow")), src), drive=d)
        rec.put(Value("reached_flow", f"Flow {d} gets", "q_reached", got, "flow",
                      "q_reached = q_leg" if src == SRC_DIVIDER else "q_reached = min(q, q_offer)",
                      "its demand, or less where the pump, the margin or the sharing cut it",
                      (Input("q", "flow demand", q, "flow"), Input("q_offer", "flow offered", offer, "flow")), src),
                drive=d)
        share = got / q if q > 0 else 1.0
        shares[d] = share
        rec.put(Value("reached_speed", f"Motor speed {d} reaches", "n_reached", n * share, "speed",
                      "n_reached = n * q_reached / q", "the duty speed in proportion to the flow it gets",
                      (Input("n", "duty motor speed", n, "speed"), Input("q_reached", "flow reached", got, "flow"),
                       Input("q", "flow demand", q, "flow")), SRC_PUMP), drive=d)
        need = _need(r).value
        rec.put(Value("throttling_loss", f"Throttling loss in {d}'s valve", "P_throttle",
                      ls.throttling_loss(p_pump, need, got), "power", "P_throttle = (p_pump - p_need) * q_reached",
                      "pressure the valve throttles away between the pump and the drive, times its flow (heat)",
                      (Input("p_pump", "pump outlet pressure", p_pump, "pressure"),
                       Input("p_need", "pressure the drive needs", need, "pressure"),
                       Input("q_reached", "flow reached", got, "flow")), SRC_LS), drive=d)
    return shares


def _heat(rec: Record, p_in: float, hydraulic: float, throttled: float, over_relief: float, drives: float,
          braking, shares: dict, useful: float = 0.0) -> None:
    p_brake = sum(r["shaft_power"] * shares.get(r.drive, 1.0) for r in braking)
    rec.put(Value("useful_shaft_power", "Useful shaft power of the driving motors", "P_shaft", useful, "power",
                  "P_shaft = sum(P_i * q_reached,i / q_i)", "shaft power of every driving motor at the flow it gets",
                  (), SRC_HEAT))
    rec.put(Value("heat_pump_loss", "Heat from pump losses", "Q_pump", p_in - hydraulic, "power",
                  "Q_pump = P_in - q_del * p_pump", "pump input less its hydraulic output", (), SRC_HEAT))
    rec.put(Value("heat_throttling", "Heat throttled in the drives' valves", "Q_throttle", throttled, "power",
                  "Q_throttle = sum((p_pump - p_i) * q_reached,i)", "every drive's throttling loss", (), SRC_LS))
    if over_relief > 0:
        rec.put(Value("heat_surplus_loss", "Heat from flow over the relief valve", "Q_relief", over_relief, "power",
                      "Q_relief = (q_del - sum(q_reached)) * p_relief", "flow the drives cannot take, at the relief "
                      "setting", (), SRC_HEAT))
    rec.put(Value("heat_drive_loss", "Heat in lines, valve drops and motors", "Q_drives", drives, "power",
                  "Q_drives = sum(p_i * q_reached,i) - P_shaft",
                  "hydraulic power at the drives' own needs less their useful shaft power", (), SRC_HEAT))
    braking_and_heat(rec, braking, p_brake, p_in, useful, p_in - useful + p_brake)
