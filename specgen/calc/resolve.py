"""Walk the machine model and compute every duty point and every supply in every mode.

Pure: takes the model's SI floats, returns Results; no I/O, no pint.
"""

from __future__ import annotations

from specgen.calc import gearing, motor, supply as pump
from specgen.results import Contribution, DutyResult, Results, SupplyModeResult
from specgen.spec.model import Drive, DutyPoint, Machine, Ratio, Supply
from specgen.trace import Input, Value, given

SRC_MOTOR = "positive-displacement motor relations (fluid-power textbook)"
SRC_GEAR = "gear-stage power balance (machine-design textbook)"
SRC_PUMP = "positive-displacement pump relations (fluid-power textbook)"


def _eff(symbol: str, label: str, r: Ratio) -> Input:
    return Input(symbol, label, r.value, "ratio", r.assumed)


def back_pressure(drive: Drive, sup: Supply) -> float:
    return drive.back_pressure if drive.back_pressure is not None else sup.return_pressure


def working_displacement(drive: Drive) -> float:
    """Displacement the duty points are computed at: a variable motor at its maximum."""
    return drive.motor.displacement_max


def resolve_duty(drive: Drive, duty: DutyPoint, sup: Supply) -> DutyResult:
    m = drive.motor
    vg = working_displacement(drive)
    ratio = drive.gear.ratio if drive.gear else 1.0
    eta_g = drive.gear.efficiency if drive.gear else Ratio(1.0)
    eta_v, eta_hm, eta_st = m.volumetric_efficiency, m.hydromechanical_efficiency, m.starting_efficiency
    p_out = back_pressure(drive, sup)
    overrun = duty.direction == "overrunning"
    v: dict[str, Value] = {}

    def put(val: Value) -> float:
        v[val.key] = val
        return val.value

    i_in = Input("i", "gear ratio", ratio, "ratio")
    g_in = _eff("eta_g", "gear efficiency", eta_g)
    vg_in = Input("Vg", "motor displacement", vg, "displacement")
    t_load = put(given("load_torque", "Load torque", "T_L", duty.torque, "torque"))
    n_load = put(given("load_speed", "Load speed", "n_L", duty.speed, "speed"))
    tl_in = Input("T_L", "load torque", t_load, "torque")
    nl_in = Input("n_L", "load speed", n_load, "speed")

    n_m = put(Value("motor_speed", "Motor speed", "n", gearing.motor_speed(n_load, ratio), "speed",
                    "n = n_L * i", "load speed times gear ratio", (nl_in, i_in), SRC_GEAR))
    if overrun:
        t_m = gearing.motor_torque_overrunning(t_load, ratio, eta_g.value)
        put(Value("motor_torque", "Motor torque (load drives motor)", "T", t_m, "torque",
                  "T = T_L * eta_g / i", "load torque through the gear stage, power flowing back",
                  (tl_in, g_in, i_in), SRC_GEAR))
    else:
        t_m = gearing.motor_torque_driving(t_load, ratio, eta_g.value)
        put(Value("motor_torque", "Motor torque", "T", t_m, "torque", "T = T_L / (i * eta_g)",
                  "load torque divided by gear ratio and gear efficiency", (tl_in, i_in, g_in), SRC_GEAR))
    t_in = Input("T", "motor torque", t_m, "torque")
    hm_in = _eff("eta_hm", "hydro-mechanical efficiency", eta_hm)
    v_in = _eff("eta_v", "volumetric efficiency", eta_v)
    pout_in = Input("p_out", "back pressure", p_out, "pressure")
    put(given("back_pressure", "Back pressure at outlet", "p_out", p_out, "pressure"))

    if overrun:
        dp = put(Value("pressure_differential", "Braking pressure differential", "dp",
                       motor.braking_pressure(t_m, vg, eta_hm.value), "pressure",
                       "dp = 2*pi*T*eta_hm / Vg", "pressure the motor builds pumping against its outlet valve",
                       (t_in, hm_in, vg_in), SRC_MOTOR))
        put(Value("inlet_pressure", "Inlet pressure required", "p_in", p_out, "pressure", "p_in = p_out",
                  "the supply only keeps the inlet filled; the load is held at the outlet",
                  (pout_in,), SRC_MOTOR))
        put(Value("braking_pressure", "Pressure held at outlet port", "p_hold", dp + p_out, "pressure",
                  "p_hold = dp + p_out", "braking differential on top of the inlet pressure",
                  (Input("dp", "braking differential", dp, "pressure"), pout_in), SRC_MOTOR))
    else:
        dp = put(Value("pressure_differential", "Pressure differential required", "dp",
                       motor.pressure_for_torque(t_m, vg, eta_hm.value), "pressure",
                       "dp = 2*pi*T / (Vg * eta_hm)", "torque over displacement and efficiency",
                       (t_in, vg_in, hm_in), SRC_MOTOR))
        put(Value("inlet_pressure", "Inlet pressure required", "p_in", dp + p_out, "pressure",
                  "p_in = dp + p_out", "pressure differential plus back pressure",
                  (Input("dp", "pressure differential", dp, "pressure"), pout_in), SRC_MOTOR))
    n_in = Input("n", "motor speed", n_m, "speed")
    q = put(Value("flow_demand", "Flow demand", "q", motor.flow_for_speed(n_m, vg, eta_v.value), "flow",
                  "q = Vg * n / eta_v", "displacement times speed, plus leakage", (vg_in, n_in, v_in), SRC_MOTOR,
                  note="overrunning: flow the supply must give to keep the inlet filled" if overrun else ""))
    put(Value("shaft_power", "Shaft power" + (" absorbed from load" if overrun else ""), "P",
              motor.shaft_power(t_m, n_m), "power", "P = 2*pi*n*T", "torque times angular speed",
              (t_in, n_in), SRC_MOTOR))
    put(Value("hydraulic_power", "Hydraulic power", "P_h", motor.hydraulic_power(q, dp), "power",
              "P_h = q * dp", "flow times pressure differential",
              (Input("q", "flow demand", q, "flow"), Input("dp", "pressure differential", dp, "pressure")), SRC_MOTOR))

    dp_relief = sup.relief_setting - p_out
    relief_in = Input("p_relief", "relief setting", sup.relief_setting, "pressure")
    t_relief = put(Value("relief_torque", "Motor torque at relief setting", "T_relief",
                         motor.torque(vg, dp_relief, eta_hm.value), "torque",
                         "T_relief = Vg * (p_relief - p_out) * eta_hm / (2*pi)",
                         "the most torque the supply's relief setting lets the motor give",
                         (vg_in, relief_in, pout_in, hm_in), SRC_MOTOR))
    put(Value("relief_torque_load", "Load torque at relief setting", "T_relief,L",
              gearing.load_torque(t_relief, ratio, eta_g.value), "torque", "T_relief,L = T_relief * i * eta_g",
              "relief torque through the gear stage", (Input("T_relief", "relief torque", t_relief, "torque"), i_in, g_in),
              SRC_GEAR))
    put(Value("breakaway_torque", "Breakaway torque at relief setting", "T_start",
                        motor.torque(vg, dp_relief, eta_st.value), "torque",
                        "T_start = Vg * (p_relief - p_out) * eta_start / (2*pi)",
                        "torque from rest, with starting efficiency", (vg_in, relief_in, pout_in,
                                                                       _eff("eta_start", "starting efficiency", eta_st)),
                        SRC_MOTOR))
    if duty.starting_torque is not None:
        ts_in = Input("T_L,start", "load starting torque", duty.starting_torque, "torque")
        put(Value("starting_torque_motor", "Starting torque needed at motor", "T_need",
                  gearing.motor_torque_driving(duty.starting_torque, ratio, eta_g.value), "torque",
                  "T_need = T_L,start / (i * eta_g)", "load starting torque referred to the motor shaft",
                  (ts_in, i_in, g_in), SRC_GEAR))
    return DutyResult(drive.id, duty.id, duty.direction, v)


def resolve_supply_mode(machine: Machine, sup: Supply, mode, duties: dict) -> SupplyModeResult | None:
    running = [(d, u) for d, u in mode.running if machine.drive(d).supply == sup.id]
    if not running:
        return None
    contributions = tuple(Contribution(d, u, duties[(d, u)]["flow_demand"]) for d, u in running)
    v: dict[str, Value] = {}

    def put(val: Value) -> float:
        v[val.key] = val
        return val.value

    demand = put(Value("flow_demand", "Summed flow demand", "q_sum", sum(c.flow for c in contributions), "flow",
                       "q_sum = sum(q_i)", "drives in parallel: their flows add",
                       tuple(Input(f"q[{c.drive}]", f"{c.drive} at {c.duty}", c.flow, "flow") for c in contributions),
                       "continuity of flow in a parallel circuit"))
    p = sup.pump
    if p.delivery is not None:
        q_pump = put(given("pump_delivery", "Pump delivery", "q_p", p.delivery, "flow"))
    else:
        q_pump = put(Value("pump_delivery", "Pump delivery", "q_p",
                           pump.delivery(p.displacement, p.shaft_speed, p.volumetric_efficiency.value), "flow",
                           "q_p = Vp * n_p * eta_v,p", "pump displacement times shaft speed times volumetric efficiency",
                           (Input("Vp", "pump displacement", p.displacement, "displacement"),
                            Input("n_p", "pump shaft speed", p.shaft_speed, "speed"),
                            _eff("eta_v,p", "pump volumetric efficiency", p.volumetric_efficiency)), SRC_PUMP))
    put(Value("flow_surplus", "Surplus (+) or shortfall (-)", "dq", q_pump - demand, "flow",
              "dq = q_p - q_sum", "pump delivery less summed demand",
              (Input("q_p", "pump delivery", q_pump, "flow"), Input("q_sum", "summed demand", demand, "flow")), ""))
    inlets = [(d, u, duties[(d, u)]["inlet_pressure"]) for d, u in running]
    p_work = put(Value("working_pressure", "Supply working pressure", "p_s", max(x[2] for x in inlets), "pressure",
                       "p_s = max(p_in,i)", "the highest inlet pressure of the drives running in parallel",
                       tuple(Input(f"p_in[{d}]", f"{d} at {u}", pv, "pressure") for d, u, pv in inlets),
                       "parallel circuit: the supply pressure is set by the highest demand"))
    eta_t = p.overall_efficiency
    put(Value("pump_input_power", "Pump input power", "P_in", pump.input_power(q_pump, p_work, eta_t.value), "power",
              "P_in = q_p * p_s / eta_t", "all delivered flow at the working pressure, over overall efficiency",
              (Input("q_p", "pump delivery", q_pump, "flow"), Input("p_s", "working pressure", p_work, "pressure"),
               _eff("eta_t", "pump overall efficiency", eta_t)), SRC_PUMP,
              note="surplus flow is taken as returned at the working pressure"))
    if p.displacement is not None:
        eta_hm = eta_t.value / p.volumetric_efficiency.value
        put(Value("pump_input_torque", "Pump input torque", "T_p",
                  pump.input_torque(p.displacement, p_work, eta_hm), "torque",
                  "T_p = Vp * p_s / (2*pi*eta_hm,p)", "pump displacement times pressure over 2 pi and efficiency",
                  (Input("Vp", "pump displacement", p.displacement, "displacement"),
                   Input("p_s", "working pressure", p_work, "pressure"),
                   Input("eta_hm,p", "pump hydro-mechanical efficiency (eta_t / eta_v)", eta_hm, "ratio",
                         eta_t.assumed or p.volumetric_efficiency.assumed)), SRC_PUMP))
    if sup.prime_mover_power is not None:
        put(given("prime_mover_power", "Prime mover power available", "P_pm", sup.prime_mover_power, "power"))
    return SupplyModeResult(sup.id, mode.id, contributions, v)


def resolve(machine: Machine) -> Results:
    """Compute every drive's duty points, then every supply in every mode (checks come after)."""
    duties = {}
    for drive in machine.drives:
        sup = machine.supply(drive.supply)
        for duty in drive.duty_points:
            duties[(drive.id, duty.id)] = resolve_duty(drive, duty, sup)
    supply_modes = []
    for mode in machine.modes:
        for sup in machine.supplies:
            r = resolve_supply_mode(machine, sup, mode, duties)
            if r is not None:
                supply_modes.append(r)
    return Results(duties=tuple(duties.values()), supply_modes=tuple(supply_modes))
