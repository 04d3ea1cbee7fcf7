"""A drive's pressure limit and what a duty point needs to start from rest.

Pressure limit: the lowest of the supply's relief setting (a closed loop's lower high-pressure
relief side), a compensated pump's compensator setting and the drive's own port or crossover
relief; torque at the limit, breakaway, a variable motor's envelope and sizing all read this one
value.
Starting: a load that acts at standstill (a hanging winch load, grade and rolling resistance, belt
pull) must be overcome from rest through the gear stage at its starting efficiency; an explicit
starting torque still wins where larger.

Pure: the model's SI floats in, traced Values out.
"""

from __future__ import annotations

from dataclasses import replace

from specgen.calc import loads, starting
from specgen.intake import defaults
from specgen.intake.model import BeltLoad, Drive, DutyPoint, Ratio, ReliefSides, Supply, TrackTurnLoad, WheelLoad, WinchLoad
from specgen.resolve.record import eff
from specgen.trace import Input, Value

SRC_LIMIT = "the lowest pressure-limiting setting on the motor's path: no drive sees more"
SRC_START = "load acting at standstill referred to the motor through the gear stage at its starting efficiency"


def pressure_limit(drive: Drive, sup: Supply) -> Value:
    """The drive's pressure limit, with the setting that governs named in the trace."""
    settings = [("relief setting", "p_relief", sup.relief_setting, ("supplies", sup.id, "relief_setting"))]
    loop = sup.closed_loop
    if loop is not None and loop.high_pressure_reliefs != ReliefSides():  # a side of its own
        settings = [(f"high-pressure relief, side {side}", f"p_relief,{side}", value, ())
                    for side, value in sup.high_pressure_reliefs]  # the lower side limits, as either may be high
    if sup.compensated and sup.pump.compensator_setting is not None:
        settings.append(("compensator setting", "p_comp", sup.pump.compensator_setting,
                         ("supplies", sup.id, "pump", "compensator_setting")))
    if drive.port_relief is not None:
        settings.append(("port relief", "p_port", drive.port_relief, ("drives", drive.id, "port_relief")))
    name, _, value, _ = min(settings, key=lambda s: s[2])
    return Value("pressure_limit", "Pressure limit of the drive", "p_limit", value, "pressure",
                 "p_limit = min(" + ", ".join(s[1] for s in settings) + ")",
                 "the lowest setting that limits the pressure at this motor",
                 tuple(Input(sym, label, v, "pressure") for label, sym, v, _ in settings), SRC_LIMIT,
                 note=f"governed by the {name}")


def governing_setting(limit: Value) -> str:
    """The name of the setting that governs a pressure_limit Value ("relief setting", ...)."""
    return limit.note.removeprefix("governed by the ") or "relief setting"


def peak_limit(drive: Drive, sup: Supply) -> float:
    """The highest pressure a spike can bring to the motor: the supply's relief setting or a lower
    port relief (a compensator responds too slowly to cap a spike)."""
    relief = max((v for _, v in sup.high_pressure_reliefs), default=sup.relief_setting)  # a loop's higher side
    return min(relief, drive.port_relief) if drive.port_relief is not None else relief


def gear_starting_efficiency(drive: Drive) -> Ratio:
    """The gear stage's starting efficiency; absent, the running one marked assumed."""
    if drive.gear is None:
        return Ratio(1.0)
    if drive.gear.starting_efficiency is not None:
        return drive.gear.starting_efficiency
    return Ratio(drive.gear.efficiency.value, assumed=True, basis=defaults.GEAR_STARTING_BASIS)


def static_load_values(duty: DutyPoint, load_values: dict) -> list[Value]:
    """The load-shaft torque that acts at standstill, for a driving duty point's load model
    (winch, wheel, belt, a track's turn; zero for a speed-squared load, a wheel load the grade would
    roll, a belt pushing). Empty without a load model."""
    load = duty.load
    if duty.direction == "overrunning" or load is None:
        return []
    none_at_rest = Value("static_load_torque", "Load torque at standstill", "T_L,static", 0.0, "torque",
                         "T_L,static = 0", "the load model puts no torque on the shaft at rest", (), SRC_START)
    if isinstance(load, WinchLoad):
        d_eff = loads.winch_effective_diameter(load.drum_diameter, load.rope_diameter, load.layer)
        t = starting.winch_static_torque(load.line_pull, d_eff)
        return [Value("static_load_torque", "Load torque at standstill", "T_L,static", t, "torque",
                      "T_L,static = F * d_eff / 2", "the hanging line pull on the working layer, at rest",
                      (Input("F", "line pull", load.line_pull, "force"),
                       Input("d_eff", "effective drum diameter", d_eff, "length")), SRC_START)]
    if isinstance(load, WheelLoad):
        f = starting.wheel_static_force(load.vehicle_mass, load.rolling_resistance, load.grade)
        if f <= 0:
            return [replace(none_at_rest, words="downhill the grade holds no load against the start")]
        t = f * load.rolling_radius / load.driven_wheels
        return [Value("static_load_torque", "Load torque at standstill", "T_L,static", t, "torque",
                      "T_L,static = m*g*(c_rr*cos(theta) + sin(theta)) * r / n_wheels",
                      "grade and rolling resistance at rest, no acceleration, per driven wheel",
                      (Input("m", "vehicle mass", load.vehicle_mass, "mass"),
                       Input("c_rr", "rolling resistance", load.rolling_resistance, "ratio"),
                       Input("theta", "grade angle", load.grade, "angle"),
                       Input("r", "rolling radius", load.rolling_radius, "length"),
                       Input("n_wheels", "driven wheels", load.driven_wheels, "number")), SRC_START)]
    if isinstance(load, BeltLoad) and load.belt_pull > 0:
        t = load.belt_pull * load.pulley_diameter / 2.0
        return [Value("static_load_torque", "Load torque at standstill", "T_L,static", t, "torque",
                      "T_L,static = F_belt * d_pulley / 2", "the belt pull at rest",
                      (Input("F_belt", "effective belt pull", load.belt_pull, "force"),
                       Input("d_pulley", "pulley diameter", load.pulley_diameter, "length")), SRC_START)]
    if isinstance(load, TrackTurnLoad) and "load_torque" in load_values:  # the tracks slide sideways from rest too
        return [Value("static_load_torque", "Load torque at standstill", "T_L,static", load_values["load_torque"].value,
                      "torque", "T_L,static = T_L", "the turn's sprocket torque, needed from rest as well",
                      (Input("T_L", "sprocket torque in the turn", load_values["load_torque"].value, "torque"),),
                      SRC_START)]
    return [none_at_rest]  # a fan or mixer (torque with the square of speed), a belt pushing


def starting_need(drive: Drive, duty: DutyPoint, static: float | None) -> Value | None:
    """Torque the motor must give from rest: the larger of the static load and an explicit starting
    torque, referred through the gear stage at its starting efficiency. None: nothing to start."""
    if duty.direction == "overrunning":
        return None
    candidates = [(s, w) for s, w in ((static, "static load"), (duty.starting_torque, "load starting torque"))
                  if s is not None]
    if not candidates:
        return None
    t_load, which = max(candidates, key=lambda c: c[0])
    ratio = drive.gear.ratio if drive.gear else 1.0
    eta = gear_starting_efficiency(drive)
    ins = [Input("T_L,start", which, t_load, "torque"), Input("i", "gear ratio", ratio, "number"),
           eff("eta_g,start", "gear starting efficiency", eta, ("drives", drive.id, "gear_stage", "starting_efficiency"))]
    note = ""
    if len(candidates) == 2:
        other = [c for c in candidates if c[1] != which][0]
        ins.append(Input("T_L,other", other[1], other[0], "torque"))
        note = f"the {which} governs"
    return Value("starting_torque_motor", "Starting torque needed at motor", "T_need",
                 starting.motor_start_torque(t_load, ratio, eta.value), "torque",
                 "T_need = max(T_L,static, T_L,start) / (i * eta_g,start)",
                 "the load's torque at standstill referred to the motor shaft from rest", tuple(ins), SRC_START,
                 note=note)
