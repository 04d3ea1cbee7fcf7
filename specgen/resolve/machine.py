"""Walk the machine model and compute every duty point and every supply in every mode.

Order: fluid properties -> each supply's pump (speed, full delivery) -> each drive: load model,
motor torque and speed, then the displacement (given, proposed from a target pressure, or set by
a variable motor's control), the efficiencies (constant, or from the maker's table: resolve/efficiency.py),
flow, line losses and pressures -> each supply in each mode (circuit, pump, prime mover, heat) -> each
mode's heat load -> each duty cycle's heat, power and oil temperature (resolve/thermal.py).
Pure: takes the model's SI floats, returns Results; no I/O, no pint.
"""

from __future__ import annotations

from specgen.calc import gearing, loads, motor, valves, variable
from specgen.resolve import limits
from specgen.resolve.limits import governing_setting
from specgen.resolve.valves import budget_valves as _budget_valves
from specgen.resolve.record import Record, eff, motor_eff
from specgen.resolve.drive import DriveSetup, setup_drive
from specgen.resolve.efficiency import duty_efficiencies
from specgen.resolve.fluid import fluid_values
from specgen.resolve.lines import line_values
from specgen.resolve.load import load_values
from specgen.resolve.prime_mover import mode_base, resolve_prime_movers, speed_value
from specgen.resolve.supply import mode_heat, resolve_supply_mode, supply_base, supply_summary
from specgen.resolve.thermal import resolve_cycles
from specgen.resolve.travel import resolve_travel
from specgen.results import DutyResult, FluidResult, Results
from specgen.intake.model import Drive, DutyPoint, Machine, Ratio, Supply
from specgen.trace import Input, Value, given

SRC_MOTOR = "positive-displacement motor relations (fluid-power textbook)"
SRC_GEAR = "gear-stage power balance (machine-design textbook)"
SRC_INERTIA = "Newton's second law for rotation, inertia referred through the gear stage"
SRC_ORIFICE = "orifice law dp = dp_rated*(q/q_rated)^2 (turbulent flow through a fixed restriction; textbook)"
SRC_CB = "counterbalance valve opening balance p_load + k*p_pilot = p_set (valve maker's relation)"
SRC_CONTROL = "variable motor control: largest displacement that reaches the speed, n = q*eta_v/Vg"



def back_pressure(drive: Drive, sup: Supply) -> float:
    """Back pressure at the motor outlet before any return-line loss."""
    return drive.back_pressure if drive.back_pressure is not None else sup.return_pressure


def _gear(drive: Drive) -> tuple[float, Ratio]:
    return (drive.gear.ratio, drive.gear.efficiency) if drive.gear else (1.0, Ratio(1.0))


def duty_mechanics(drive: Drive, duty: DutyPoint) -> Record:
    """Load torque and speed, then motor speed and torque (acceleration torque added)."""
    rec = Record()
    for value in load_values(duty):
        rec.put(value)
    ratio, eta_g = _gear(drive)
    overrun = duty.direction == "overrunning"
    t_load, n_load = rec.get("load_torque"), rec.get("load_speed")
    i_in = Input("i", "gear ratio", ratio, "number")
    g_in = eff("eta_g", "gear efficiency", eta_g, ("drives", drive.id, "gear_stage", "efficiency"))
    tl_in = Input("T_L", "load torque", t_load, "torque")
    nl_in = Input("n_L", "load speed", n_load, "speed")
    n_m = rec.put(Value("motor_speed", "Motor speed", "n", gearing.motor_speed(n_load, ratio), "speed",
                        "n = n_L * i", "load speed times gear ratio", (nl_in, i_in), SRC_GEAR))
    key = "motor_torque_load" if duty.inertia else "motor_torque"
    if overrun:
        t_m = rec.put(Value(key, "Motor torque (load drives motor)", "T" if not duty.inertia else "T_load",
                            gearing.motor_torque_overrunning(t_load, ratio, eta_g.value), "torque",
                            "T = T_L * eta_g / i", "load torque through the gear stage, power flowing back",
                            (tl_in, g_in, i_in), SRC_GEAR))
    else:
        t_m = rec.put(Value(key, "Motor torque" if not duty.inertia else "Motor torque for the load",
                            "T" if not duty.inertia else "T_load",
                            gearing.motor_torque_driving(t_load, ratio, eta_g.value), "torque", "T = T_L / (i * eta_g)",
                            "load torque divided by gear ratio and gear efficiency", (tl_in, i_in, g_in), SRC_GEAR))
    if duty.inertia:
        j = duty.inertia
        alpha = loads.angular_acceleration(n_m, j.ramp_time)
        if overrun:  # stopping the load: its inertia reaches the motor through the gear losses
            t_acc = (j.motor_inertia + loads.refer_inertia(j.load_inertia, ratio) * eta_g.value) * alpha
            formula, words = ("T_acc = (J_m + J_L * eta_g / i^2) * 2*pi*n / t_ramp",
                              "torque to stop the load from the duty speed in the ramp time, at the motor")
        else:
            t_acc = loads.motor_acceleration_torque(j.load_inertia, ratio, n_load, j.ramp_time, j.motor_inertia,
                                                    eta_g.value)
            formula, words = ("T_acc = (J_m + J_L / (i^2 * eta_g)) * 2*pi*n / t_ramp",
                              "torque to bring the load from rest to the duty speed in the ramp time, at the motor")
        rec.put(Value("acceleration_torque", "Acceleration torque at motor", "T_acc", t_acc, "torque", formula, words,
                      (Input("J_m", "motor-side inertia", j.motor_inertia, "inertia"),
                       Input("J_L", "load inertia", j.load_inertia, "inertia"), i_in, g_in,
                       Input("n", "motor speed", n_m, "speed"), Input("t_ramp", "ramp time", j.ramp_time, "time")),
                      SRC_INERTIA))
        rec.put(Value("motor_torque", "Motor torque with acceleration", "T", t_m + t_acc, "torque",
                      "T = T_load + T_acc", "steady load torque plus acceleration torque at the motor",
                      (Input("T_load", "motor torque for the load", t_m, "torque"),
                       Input("T_acc", "acceleration torque", t_acc, "torque")), SRC_INERTIA))
    return rec


def _displacement(rec: Record, drive: Drive, duty: DutyPoint, setup: DriveSetup, n_m: float) -> float:
    m = drive.motor
    if setup.proposed:
        src = setup.result.values.get("proposed_displacement") or setup.result.values["minimum_displacement"]
        return rec.put(Value("displacement", "Motor displacement (proposed)", "Vg", setup.vg_max, "displacement",
                             f"Vg = {src.symbol}", "the proposed size: the spec gives no displacement",
                             (Input(src.symbol, src.label, src.value, "displacement"),), src.source,
                             note="proposed" if "proposed_displacement" in setup.result.values
                             else "proposed: no stocked size is large enough, computed at the minimum"))
    if setup.vg_min == setup.vg_max:
        return rec.put(given("displacement", "Motor displacement", "Vg", setup.vg_max, "displacement"))
    if duty.displacement is not None:
        return rec.put(given("displacement", "Motor displacement (set at this duty point)", "Vg", duty.displacement,
                             "displacement"))
    s = variable.choose_displacement(setup.vg_min, setup.vg_max, setup.available_flow,
                                     m.volumetric_efficiency.value, n_m)
    note = ""
    if not s.reaches_speed:
        note = f"even the minimum displacement only reaches {s.speed * 60:.4g} rpm with the available flow"
    elif s.displacement == setup.vg_max:
        note = "at the maximum displacement: the available flow is more than the speed needs"
    rec.put(Value("displacement", "Motor displacement (set by the control)", "Vg", s.displacement, "displacement",
                  "Vg = min(max(q_avail * eta_v / n, Vg_min), Vg_max)",
                  "the largest displacement that reaches the speed with the available flow (most torque per bar)",
                  (Input("q_avail", "available flow", setup.available_flow, "flow"),
                   motor_eff(drive.id, "volumetric", m.volumetric_efficiency), Input("n", "motor speed", n_m, "speed"),
                   Input("Vg_min", "minimum displacement", setup.vg_min, "displacement"),
                   Input("Vg_max", "maximum displacement", setup.vg_max, "displacement")), SRC_CONTROL, note=note))
    if not s.reaches_speed:
        rec.put(Value("speed_reached", "Motor speed the available flow reaches", "n_reached", s.speed, "speed",
                      "n_reached = q_avail * eta_v / Vg_min", "available flow through the minimum displacement",
                      (Input("q_avail", "available flow", setup.available_flow, "flow"),
                       motor_eff(drive.id, "volumetric", m.volumetric_efficiency),
                       Input("Vg_min", "minimum displacement", setup.vg_min, "displacement")), SRC_CONTROL))
    return s.displacement


# The losses between a motor and its supply (pressure side) or tank (tank side): (loss key, symbol, label).
_PRESSURE_SIDE = (("pressure", "dp_pressure_line", "pressure-line loss"),
                  ("valve_drop_to_motor", "dp_valve,P", "directional valve drop to motor"))
_TANK_SIDE = (("return", "dp_return_line", "return-line loss"),
              ("valve_drop_to_tank", "dp_valve,T", "directional valve drop to tank"))


def _with_losses(base: Input, losses: dict, side) -> tuple[Input, ...]:
    """``base`` followed by each loss of ``side`` found in ``losses``, as trace inputs (pressures add)."""
    return (base,) + tuple(Input(symbol, label, losses[key], "pressure") for key, symbol, label in side if key in losses)


def resolve_duty(drive: Drive, duty: DutyPoint, sup: Supply, mech: Record, setup: DriveSetup,
                 fluid: FluidResult) -> DutyResult:
    """Hydraulics of one duty point, after its mechanics and the drive's displacement are known."""
    m = drive.motor
    rec = Record()
    rec.values.update(mech.values)
    ratio, eta_g = _gear(drive)
    eta_v, eta_hm, eta_st = m.volumetric_efficiency, m.hydromechanical_efficiency, m.starting_efficiency
    overrun = duty.direction == "overrunning"
    n_m, t_m = mech.get("motor_speed"), mech.get("motor_torque")
    if duty.id in setup.minimum_by_duty:
        rec.put(setup.minimum_by_duty[duty.id])
    vg = _displacement(rec, drive, duty, setup, n_m)
    eta_v, eta_hm, eta_st = duty_efficiencies(rec, drive, duty, sup, t_m, n_m, vg, back_pressure(drive, sup))
    vg_in = Input("Vg", "motor displacement", vg, "displacement")
    t_in = Input("T", "motor torque", t_m, "torque")
    n_in = Input("n", "motor speed", n_m, "speed")
    hm_in = motor_eff(drive.id, "hydromechanical", eta_hm)
    v_in = motor_eff(drive.id, "volumetric", eta_v)
    i_in = Input("i", "gear ratio", ratio, "number")
    g_in = eff("eta_g", "gear efficiency", eta_g, ("drives", drive.id, "gear_stage", "efficiency"))

    q = rec.put(Value("flow_demand", "Flow demand", "q", motor.flow_for_speed(n_m, vg, eta_v.value), "flow",
                      "q = Vg * n / eta_v", "displacement times speed, plus leakage", (vg_in, n_in, v_in), SRC_MOTOR,
                      note="overrunning: flow the supply must give to keep the inlet filled" if overrun else ""))
    losses = {}
    if drive.lines is not None:
        nu, rho = fluid["kinematic_viscosity"], fluid["density"]
        for kind, line in (("pressure", drive.lines.pressure), ("return", drive.lines.ret)):
            if line is not None:
                for value in line_values(kind, line, q, nu, rho):
                    rec.put(value)
                losses[kind] = rec.get(f"{kind}_line_loss")
    p_out0 = back_pressure(drive, sup)
    valve = drive.directional_valve
    if valve is not None:
        for key, label, drop in (("valve_drop_to_motor", "Directional valve drop to motor", valve.drop_to_motor),
                                 ("valve_drop_to_tank", "Directional valve drop to tank", valve.drop_to_tank)):
            losses[key] = rec.put(Value(
                key, label, "dp_valve", valves.orifice_drop(drop, valve.rated_flow, q), "pressure",
                "dp_valve = dp_rated * (q / q_rated)^2", "the valve's drop at its rated flow, scaled with the square "
                "of the flow", (Input("dp_rated", "drop at rated flow", drop, "pressure"),
                                Input("q_rated", "rated flow", valve.rated_flow, "flow"),
                                Input("q", "flow demand", q, "flow")), SRC_ORIFICE))
    ins = _with_losses(Input("p_return", "return pressure", p_out0, "pressure"), losses, _TANK_SIDE)
    if len(ins) > 1:
        p_out = rec.put(Value("back_pressure", "Back pressure at outlet", "p_out", sum(i.value for i in ins),
                              "pressure", "p_out = " + " + ".join(i.symbol for i in ins),
                              "return pressure plus the losses between the motor outlet and tank", ins, SRC_MOTOR))
    else:
        p_out = rec.put(given("back_pressure", "Back pressure at outlet", "p_out", p_out0, "pressure"))
    pout_in = Input("p_out", "back pressure", p_out, "pressure")

    if overrun:
        dp = rec.put(Value("pressure_differential", "Braking pressure differential", "dp",
                           motor.braking_pressure(t_m, vg, eta_hm.value), "pressure",
                           "dp = 2*pi*T*eta_hm / Vg", "pressure the motor builds pumping against its outlet valve",
                           (t_in, hm_in, vg_in), SRC_MOTOR))
        cb = drive.counterbalance
        p_pilot = valves.counterbalance_pilot_pressure(cb.setting, dp, cb.pilot_ratio) if cb is not None else 0.0
        if p_pilot > 0:
            p_in = rec.put(Value("inlet_pressure", "Inlet (pilot) pressure to open the counterbalance valve", "p_in",
                                 p_pilot, "pressure", "p_in = (p_set - dp) / (1 + k)",
                                 "the pump holds the valve open through its pilot while the load lowers",
                                 (Input("p_set", "counterbalance setting", cb.setting, "pressure"),
                                  Input("dp", "braking differential", dp, "pressure"),
                                  Input("k", "pilot ratio", cb.pilot_ratio, "number")), SRC_CB))
        else:
            p_in = rec.put(Value("inlet_pressure", "Inlet pressure required", "p_in", p_out, "pressure", "p_in = p_out",
                                 "the supply only keeps the inlet filled; the load is held at the outlet"
                                 + ("" if cb is None else " (the load alone opens the counterbalance valve)"),
                                 (pout_in,), SRC_MOTOR))
        if p_pilot > 0:  # the load port sits at the inlet (pilot) pressure plus the braking differential
            rec.put(Value("braking_pressure", "Pressure held at outlet port", "p_hold", dp + p_in, "pressure",
                          "p_hold = dp + p_in", "braking differential on top of the inlet (pilot) pressure",
                          (Input("dp", "braking differential", dp, "pressure"),
                           Input("p_in", "inlet (pilot) pressure", p_in, "pressure")), SRC_CB))
        else:
            rec.put(Value("braking_pressure", "Pressure held at outlet port", "p_hold", dp + p_out, "pressure",
                          "p_hold = dp + p_out", "braking differential on top of the inlet pressure",
                          (Input("dp", "braking differential", dp, "pressure"), pout_in), SRC_MOTOR))
    else:
        dp = rec.put(Value("pressure_differential", "Pressure differential required", "dp",
                           motor.pressure_for_torque(t_m, vg, eta_hm.value), "pressure",
                           "dp = 2*pi*T / (Vg * eta_hm)", "torque over displacement and efficiency",
                           (t_in, vg_in, hm_in), SRC_MOTOR))
        p_in = rec.put(Value("inlet_pressure", "Inlet pressure required", "p_in", dp + p_out, "pressure",
                             "p_in = dp + p_out", "pressure differential plus back pressure",
                             (Input("dp", "pressure differential", dp, "pressure"), pout_in), SRC_MOTOR))
    ins = _with_losses(Input("p_in", "inlet pressure", p_in, "pressure"), losses, _PRESSURE_SIDE)
    if len(ins) > 1:
        rec.put(Value("supply_pressure_required", "Pressure the supply must give", "p_supply",
                      sum(i.value for i in ins), "pressure", "p_supply = " + " + ".join(i.symbol for i in ins),
                      "motor inlet pressure plus the losses between the supply and the motor inlet", ins, SRC_MOTOR))
    rec.put(Value("shaft_power", "Shaft power" + (" absorbed from load" if overrun else ""), "P",
                  motor.shaft_power(t_m, n_m), "power", "P = 2*pi*n*T", "torque times angular speed",
                  (t_in, n_in), SRC_MOTOR))
    rec.put(Value("hydraulic_power", "Hydraulic power", "P_h", motor.hydraulic_power(q, dp), "power",
                  "P_h = q * dp", "flow times pressure differential",
                  (Input("q", "flow demand", q, "flow"), Input("dp", "pressure differential", dp, "pressure")),
                  SRC_MOTOR))

    limit = setup.result.values["pressure_limit"]
    p_limit = limit.value
    dp_relief = p_limit - p_out
    relief_in = Input("p_limit", f"pressure limit ({governing_setting(limit)})", p_limit, "pressure")
    t_relief = rec.put(Value("relief_torque", "Motor torque at the pressure limit", "T_relief",
                             motor.torque(vg, dp_relief, eta_hm.value), "torque",
                             "T_relief = Vg * (p_limit - p_out) * eta_hm / (2*pi)",
                             "the most torque the drive's pressure limit lets the motor give",
                             (vg_in, relief_in, pout_in, hm_in), SRC_MOTOR))
    rec.put(Value("relief_torque_load", "Load torque at the pressure limit", "T_relief,L",
                  gearing.load_torque(t_relief, ratio, eta_g.value), "torque", "T_relief,L = T_relief * i * eta_g",
                  "torque at the pressure limit through the gear stage",
                  (Input("T_relief", "torque at the pressure limit", t_relief, "torque"), i_in, g_in), SRC_GEAR))
    rec.put(Value("breakaway_torque", "Breakaway torque at the pressure limit", "T_start",
                  motor.torque(vg, dp_relief, eta_st.value), "torque",
                  "T_start = Vg * (p_limit - p_out) * eta_start / (2*pi)",
                  "torque from rest, with starting efficiency",
                  (vg_in, relief_in, pout_in, motor_eff(drive.id, "starting", eta_st)), SRC_MOTOR))
    static = None
    for value in limits.static_load_values(duty, rec.values):
        static = rec.put(value)
    need = limits.starting_need(drive, duty, static)
    if need is not None:
        rec.put(need)
    _budget_valves(rec, drive, duty, vg, p_out, eta_hm, n_m, q)
    return DutyResult(drive.id, duty.id, duty.direction, rec.values)


def resolve(machine: Machine, reuse: dict | None = None) -> Results:
    """Compute every drive's duty points, then every supply in every mode (checks come after).

    ``reuse``: a dict kept across calls on machines that share their unchanged parts (the sensitivity's
    moved copies, specgen/sensitivity.py): a drive whose record and supply, and every part of the machine
    but its drives and supplies, are the very objects of an earlier call keeps that call's duty results."""
    fluid = fluid_values(machine.fluid)
    bases = {s.id: supply_base(s, fluid, speed_value(machine, s)) for s in machine.supplies}
    duties, drive_results = {}, []
    rest = tuple(getattr(machine, f) for f in machine.__dataclass_fields__ if f not in ("drives", "supplies")) \
        if reuse is not None else ()
    for drive in machine.drives:
        sup = machine.supply(drive.supply)
        shared = (drive, sup) + rest
        hit = reuse.get(id(drive)) if reuse is not None else None
        if hit is not None and len(hit[0]) == len(shared) and all(a is b for a, b in zip(hit[0], shared)):
            drive_results.append(hit[1])
            duties.update(hit[2])
            continue
        mech = {duty.id: duty_mechanics(drive, duty) for duty in drive.duty_points}
        torques = {u.id: (mech[u.id].get("motor_torque"), u.direction) for u in drive.duty_points}
        starts = {}
        for u in drive.duty_points:
            static = [v.value for v in limits.static_load_values(u, mech[u.id].values)]
            need = limits.starting_need(drive, u, static[0] if static else None)
            if need is not None:
                starts[u.id] = need.value
        setup = setup_drive(drive, sup, torques, back_pressure(drive, sup), bases[sup.id]["pump_delivery"].value,
                            machine.sizing, starts)
        drive_results.append(setup.result)
        for duty in drive.duty_points:
            duties[(drive.id, duty.id)] = resolve_duty(drive, duty, sup, mech[duty.id], setup, fluid)
        if reuse is not None:
            reuse[id(drive)] = (shared, setup.result,
                                {(drive.id, u.id): duties[(drive.id, u.id)] for u in drive.duty_points})
    supply_modes = []
    for mode in machine.modes:
        for sup in machine.supplies:
            if reuse is None:
                r = resolve_supply_mode(machine, sup, mode, duties, mode_base(machine, sup, mode, bases[sup.id], fluid))
            else:  # kept while the supply, its running drives and their duty results are the same objects
                on = [(d, u) for d, u in mode.running if machine.drive(d).supply == sup.id]
                shared = (sup, mode) + rest + tuple(machine.drive(d) for d, _ in on) + tuple(duties[x] for x in on)
                hit = reuse.get((id(sup), mode.id))
                if hit is not None and len(hit[0]) == len(shared) and all(a is b for a, b in zip(hit[0], shared)):
                    r = hit[1]
                else:
                    r = resolve_supply_mode(machine, sup, mode, duties, mode_base(machine, sup, mode, bases[sup.id], fluid))
                    reuse[(id(sup), mode.id)] = (shared, r)
            if r is not None:
                supply_modes.append(r)
    supplies = tuple(supply_summary(s, bases[s.id], supply_modes) for s in machine.supplies)
    modes = tuple(m for m in (mode_heat(mode, supply_modes) for mode in machine.modes) if m is not None)
    cycles = resolve_cycles(machine, modes, supply_modes, duties)
    travel = resolve_travel(machine, duties, {r.drive: r for r in drive_results},
                            {s: base["pump_delivery"].value for s, base in bases.items()}) if machine.travel else None
    return Results(duties=tuple(duties.values()), supply_modes=tuple(supply_modes), drives=tuple(drive_results),
                   supplies=supplies, modes=modes, fluid=fluid, cycles=cycles,
                   prime_movers=resolve_prime_movers(machine, supply_modes), travel=travel)
