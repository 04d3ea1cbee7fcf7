"""Drives in series from rest and at their pressure limit, per mode.

From rest every running motor in series needs its starting differential at once, so walking
upstream from the tank the outlet of each motor at start is the return pressure plus every
downstream motor's starting differential dp_start = 2*pi*T_start / (Vg * eta_start); a motor gets
at most p_limit - p_out,start across it:
  T_breakaway = Vg * (p_limit - p_out,start) * eta_start / (2*pi).
Running, its torque at the pressure limit is taken at its series outlet pressure:
  T_limit = Vg * (p_limit - p_out) * eta_hm / (2*pi).
Example: two 200 cm^3 motors, the downstream one needing 500 N*m from rest at eta_start 0.8:
dp_start = 2*pi*500 / (200e-6*0.8) = 196.3 bar; with a 330 bar limit and 0 bar return the upstream
motor gets 330 - 196.3 = 133.7 bar: T_breakaway = 200e-6 * 133.7e5 * 0.8 / (2*pi) = 340.4 N*m.

Pure: SI floats in, traced Values out (per drive in the supply-mode record).
"""

from __future__ import annotations

from specgen.calc import motor, starting
from specgen.intake.model import Machine, Supply
from specgen.resolve.limits import governing_setting, pressure_limit
from specgen.resolve.record import Record, motor_eff
from specgen.trace import Input, Value, indexed

SRC = "series circuit from rest: every motor's starting differential adds (motor torque relation with eta_start)"
SRC_LIMIT = "positive-displacement motor relations at the series outlet pressure"


def series_start(rec: Record, machine: Machine, sup: Supply, running, duties) -> None:
    """Per running drive: starting outlet pressure, breakaway torque from rest and torque at the limit."""
    p = sup.return_pressure
    downstream: list[Input] = [Input("p_return", "return pressure", p, "pressure")]
    for d, u in reversed(running):
        r = duties[(d, u)]
        drive = machine.drive(d)
        m = drive.motor
        vg = r["displacement"]
        limit = pressure_limit(drive, sup)
        lim_in = Input("p_limit", f"pressure limit ({governing_setting(limit)})", limit.value, "pressure")
        vg_in = Input("Vg", "motor displacement", vg, "displacement")
        p_run_out = rec.per_drive[d]["outlet_pressure"].value
        rec.put(Value("relief_torque", f"Torque of {d} at the pressure limit in series", "T_relief",
                      motor.torque(vg, limit.value - p_run_out, m.hydromechanical_efficiency.value), "torque",
                      "T_relief = Vg * (p_limit - p_out) * eta_hm / (2*pi)",
                      "the most torque the motor gives with the drives downstream at its outlet",
                      (vg_in, lim_in, Input("p_out", "series outlet pressure", p_run_out, "pressure"),
                       motor_eff(d, "hydromechanical", m.hydromechanical_efficiency)), SRC_LIMIT), drive=d)
        eta_st = m.starting_efficiency
        if "starting_torque_motor" in r.values:
            rec.put(Value("start_outlet_pressure", f"Outlet pressure of {d} from rest", "p_out,start", p, "pressure",
                          "p_out,start = p_return + sum(dp_start,downstream)",
                          "every motor downstream needs its starting differential at once", tuple(downstream), SRC),
                    drive=d)
            rec.put(Value("breakaway_torque", f"Breakaway torque of {d} in series", "T_start",
                          motor.torque(vg, limit.value - p, eta_st.value), "torque",
                          "T_start = Vg * (p_limit - p_out,start) * eta_start / (2*pi)",
                          "torque from rest with the downstream motors starting too",
                          (vg_in, lim_in, Input("p_out,start", "outlet pressure from rest", p, "pressure"),
                           motor_eff(d, "starting", eta_st)), SRC), drive=d)
        if r.direction == "overrunning":
            continue
        t_start = r["starting_torque_motor"] if "starting_torque_motor" in r.values else (
            r.values.get("motor_torque_load") or r.values["motor_torque"]).value
        dp_start = starting.starting_differential(t_start, vg, eta_st.value)
        downstream.append(Input(indexed("dp_start", d), f"{d} at {u}: starting differential "
                                f"2*pi*{t_start:.4g} N*m / (Vg * eta_start)", dp_start, "pressure"))
        p += dp_start
