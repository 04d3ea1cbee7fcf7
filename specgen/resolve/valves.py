"""Valves on a duty point's pressure budget past the motor relations: the braking torque a port
(crossover) relief allows against the braking torque needed, and a counterbalance valve's
load-induced pressure and the heat it makes while lowering.

Pure: the model's SI floats in, traced Values out, put into the duty point's Record.
"""

from __future__ import annotations

from specgen.calc import loads, valves
from specgen.intake.model import Drive, DutyPoint, Ratio
from specgen.resolve.record import Record, motor_eff
from specgen.trace import Input, Value

SRC_PORT = "port relief across the motor, the motor acting as a pump: T = Vg*(p_cross - p_low)/(2*pi*eta_hm)"
SRC_DECEL = "Newton's second law for rotation, inertia referred through the gear stage"
SRC_LOAD = "ideal motor torque relation dp = 2*pi*T/Vg, the load referred through the gear ratio"
SRC_CB = "energy balance on a counterbalance valve: the load's power and the pump's hydraulic power are throttled"


def budget_valves(rec: Record, drive: Drive, duty: DutyPoint, vg: float, p_out: float, eta_hm: Ratio,
                  n_m: float, q: float) -> None:
    """Braking values (port relief) and counterbalance values of one duty point."""
    overrun = duty.direction == "overrunning"
    if drive.port_relief is not None and (overrun or duty.inertia):
        _braking_need(rec, drive, duty, n_m)
        rec.put(Value("port_relief_braking_torque", "Braking torque the port relief allows", "T_brake,max",
                      valves.port_relief_braking_torque(vg, drive.port_relief, p_out, eta_hm.value), "torque",
                      "T_brake,max = Vg * (p_port - p_low) / (2*pi * eta_hm)",
                      "the most braking torque before the port relief opens and the load slips",
                      (Input("Vg", "motor displacement", vg, "displacement"),
                       Input("p_port", "port relief setting", drive.port_relief, "pressure"),
                       Input("p_low", "low-side (makeup) pressure", p_out, "pressure"),
                       motor_eff(drive.id, "hydromechanical", eta_hm)), SRC_PORT))
    if overrun and drive.counterbalance is not None:
        ratio = drive.gear.ratio if drive.gear else 1.0
        t_l = rec.get("load_torque")
        rec.put(Value("load_induced_pressure", "Pressure the load induces at the load port", "p_load",
                      2 * 3.141592653589793 * t_l / (ratio * vg), "pressure", "p_load = 2*pi*T_L / (i * Vg)",
                      "the load held at rest, no friction counted (the highest it can be)",
                      (Input("T_L", "load torque", t_l, "torque"), Input("i", "gear ratio", ratio, "number"),
                       Input("Vg", "motor displacement", vg, "displacement")), SRC_LOAD))
        p_in = rec.get("inlet_pressure")
        p_load = rec.get("shaft_power")
        rec.put(Value("counterbalance_heat", "Heat made in the counterbalance valve", "Q_cb", p_load + p_in * q, "power",
                      "Q_cb = P_load + p_in * q", "the lowering load's power plus the pump's hydraulic power into "
                      "the inlet, both throttled across the valve",
                      (Input("P_load", "power absorbed from the load", p_load, "power"),
                       Input("p_in", "inlet (pilot) pressure", p_in, "pressure"),
                       Input("q", "flow", q, "flow")), SRC_CB))


def _braking_need(rec: Record, drive: Drive, duty: DutyPoint, n_m: float) -> float:
    """Braking torque needed at the motor: an overrunning duty's motor torque (it already holds any
    stopping torque), or for a driving duty with an inertia block the torque to stop it in its ramp time."""
    if duty.direction == "overrunning":
        t = rec.get("motor_torque")
        rec.put(Value("braking_torque_needed", "Braking torque needed at motor", "T_brake", t, "torque",
                      "T_brake = T", "the overrunning duty's motor torque (load and stopping torque)",
                      (Input("T", "motor torque", t, "torque"),), SRC_DECEL))
        return t
    j = duty.inertia
    ratio, eta_g = (drive.gear.ratio, drive.gear.efficiency.value) if drive.gear else (1.0, 1.0)
    # stopping: the load's inertia reaches the motor through the gear losses; the load's own
    # torque helps the stop and is not counted (the braking need is never understated)
    t = (j.motor_inertia + loads.refer_inertia(j.load_inertia, ratio) * eta_g) * loads.angular_acceleration(
        n_m, j.ramp_time)
    return rec.put(Value("braking_torque_needed", "Braking torque to stop the load", "T_brake", t, "torque",
                         "T_brake = (J_m + J_L * eta_g / i^2) * 2*pi*n / t_ramp",
                         "torque to stop the load from the duty speed in the ramp time (its own load torque "
                         "helping is not counted)",
                         (Input("J_m", "motor-side inertia", j.motor_inertia, "inertia"),
                          Input("J_L", "load inertia", j.load_inertia, "inertia"),
                          Input("i", "gear ratio", ratio, "number"), Input("eta_g", "gear efficiency", eta_g, "ratio"),
                          Input("n", "motor speed", n_m, "speed"), Input("t_ramp", "ramp time", j.ramp_time, "time")),
                         SRC_DECEL))
