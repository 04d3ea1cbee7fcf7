"""The machine as a vehicle: tractive effort against ground speed, and every travel duty point on it.

Each driven drive (one motor per wheel or sprocket) gives at its pressure limit, at its maximum
displacement, ``F_i = Vg_max * (p_limit - p_out) * eta_hm / (2*pi) * i * eta_g / r``; the vehicle's
effort at the pressure limit is their sum. Its flow is its valve section's available flow, else an
equal share of its supply's pump delivery among the driven drives on that supply; the flow fills the
maximum displacement up to ``v_full = 2*pi*r * q*eta_v/(Vg_max*i)`` and reaches at most
``v_top = 2*pi*r * min(q*eta_v/Vg_min, n_rated)/i``; the slowest drive sets the vehicle's speeds (all
wheels run at one ground speed). The engine's power bounds the effort by ``eta_total * P_engine / v``,
with ``eta_total`` the lowest chain of pump overall, motor volumetric and hydro-mechanical and gear
efficiencies among the driven drives; the ground by ``mu * W_driven``. calc/traction.py has the
relations. The motors' constant efficiencies are used (a maker's table is read at the duty points only).

A travel duty point is any duty point of a driven drive: its ground speed is its wheel (sprocket)
speed times the rolling circumference, its tractive effort the wheel force ``T_L / r`` times the
number of driven drives (the vehicle's effort with every driven wheel pulling alike; a track in a
turn: as if both tracks pulled like this one), its adhesion limit ``mu * W_driven * cos(theta)``.

Pure: the model's SI floats and the resolved duty points in, traced Values out.
"""

from __future__ import annotations

import math

from specgen.calc import traction
from specgen.calc.loads import STANDARD_GRAVITY
from specgen.intake.model import Drive, Machine, Supply, TrackTurnLoad, Travel, WheelLoad
from specgen.resolve.record import Record, eff, motor_eff
from specgen.resolve.prime_mover import prime_mover_power_at
from specgen.results import DriveResult, DutyResult, TravelResult
from specgen.trace import Input, Value, indexed

SRC_EFFORT = "motor torque T = Vg*dp*eta_hm/(2*pi) through the gear stage, over the rolling radius"
SRC_ADHESION = "Coulomb friction at the tyre or track contact (vehicle dynamics textbooks)"
SRC_SPEED = "motor speed-flow relation n = q*eta_v/Vg, through the gear stage, rolling without slip"
SRC_POWER = "power balance of the transmission: engine power times the efficiencies from pump to ground"
SRC_CORNER = "corner power of a travel transmission: the most effort times the top speed"
SRC_DUTY = "wheel force T_L / r shared alike by the driven wheels; rolling without slip"
ENVELOPE_STEPS = 40


def _gear(drive: Drive):
    return (drive.gear.ratio, drive.gear.efficiency) if drive.gear else (1.0, None)


def _back_pressure(drive: Drive, sup: Supply) -> float:
    return drive.back_pressure if drive.back_pressure is not None else sup.return_pressure


def _max_displacement(drive: Drive, dr: DriveResult) -> float:
    if drive.motor.displacement_given:
        return drive.motor.displacement_max
    proposed = dr.values.get("proposed_displacement") or dr.values["minimum_displacement"]
    return proposed.value


def travel_mode(machine: Machine) -> str | None:
    """The mode the envelope's engine power is taken at: the travel block's, else the first that runs a driven drive."""
    tr = machine.travel
    if tr.mode is not None:
        return tr.mode
    return next((m.id for m in machine.modes if any(d in tr.drives for d, _ in m.running)), None)


def resolve_travel(machine: Machine, duties: dict[tuple[str, str], DutyResult], drives: dict[str, DriveResult],
                   deliveries: dict[str, float]) -> TravelResult | None:
    """``duties``: (drive, duty) -> resolved duty point; ``drives``: drive id -> its DriveResult;
    ``deliveries``: supply id -> pump delivery (m^3/s). None without a travel block."""
    tr = machine.travel
    if tr is None:
        return None
    rec = Record()
    r_in = Input("r", "rolling radius (track: sprocket pitch radius)", tr.rolling_radius, "length")
    sharing = {}
    for did in tr.drives:
        sharing[machine.drive(did).supply] = sharing.get(machine.drive(did).supply, 0) + 1
    shares = {did: _drive_share(rec, machine, machine.drive(did), drives[did], deliveries, sharing, r_in)
              for did in tr.drives}
    f_relief = rec.put(Value(
        "relief_effort", "Tractive effort at the pressure limit", "F_relief", sum(s[0] for s in shares.values()),
        "force", "F_relief = sum(F_relief,i)", "the driven motors' efforts at their pressure limits added",
        tuple(Input(indexed("F_relief", d), f"drive {d}", s[0], "force") for d, s in shares.items()), SRC_EFFORT))
    v_full = rec.put(_slowest("full_displacement_speed", "Ground speed the flow reaches at full displacement", "v_full",
                              {d: s[1] for d, s in shares.items()}))
    v_top = rec.put(_slowest("top_speed", "Top travel speed", "v_max", {d: s[2] for d, s in shares.items()}))
    f_adh = rec.put(Value(
        "adhesion_limit", "Adhesion limit", "F_adh", traction.adhesion_limit(tr.adhesion.value, tr.driven_mass),
        "force", "F_adh = mu * m_driven * g", "the most effort the ground takes before the driven wheels slip",
        (eff("mu", "adhesion coefficient", tr.adhesion, ("travel", "adhesion")),
         Input("m_driven", "mass on the driven wheels or tracks", tr.driven_mass, "mass"),
         Input("g", "standard gravity", STANDARD_GRAVITY, "acceleration")), SRC_ADHESION))
    eta = rec.put(_efficiency(machine, tr))
    power = _engine_power(rec, machine, tr)
    f_max = rec.put(Value("max_effort", "Most usable tractive effort", "F_max", min(f_relief, f_adh), "force",
                          "F_max = min(F_relief, F_adh)", "the effort at the pressure limit, capped by adhesion",
                          (Input("F_relief", "effort at the pressure limit", f_relief, "force"),
                           Input("F_adh", "adhesion limit", f_adh, "force")), SRC_ADHESION))
    corner = rec.put(Value("corner_power", "Corner power", "P_corner", traction.corner_power(f_max, v_top), "power",
                           "P_corner = F_max * v_max", "the power the transmission would need to give its most "
                           "effort at its top speed",
                           (Input("F_max", "most usable effort", f_max, "force"),
                            Input("v_max", "top travel speed", v_top, "velocity")), SRC_CORNER))
    if power is not None and power > 0:
        rec.put(Value("corner_power_ratio", "Corner power over engine power", "R_corner", corner / power, "ratio",
                      "R_corner = P_corner / P_engine",
                      "above 1 the engine's power, not the pressure limit or the flow, bounds part of the speed range",
                      (Input("P_corner", "corner power", corner, "power"),
                       Input("P_engine", "engine power", power, "power")), SRC_CORNER))
    t = traction.Transmission(f_relief, v_full, v_top, any(machine.drive(d).motor.variable for d in tr.drives))
    duty_values, lines = {}, {}
    for did in tr.drives:
        for u in machine.drive(did).duty_points:
            key = (did, u.id)
            duty_values[key], lines[key] = _duty(tr, u.load, duties[key], t, eta, power, r_in)
    return TravelResult(rec.values, rec.per_drive, duty_values, lines,
                        traction.envelope(t, f_adh, eta, power, ENVELOPE_STEPS))


def _drive_share(rec: Record, machine: Machine, drive: Drive, dr: DriveResult, deliveries: dict, sharing: dict,
                 r_in: Input) -> tuple[float, float, float]:
    """One driven drive: its effort at the pressure limit, the ground speed at which its flow fills the
    maximum displacement, and its top ground speed; put under its id."""
    m, sup = drive.motor, machine.supply(drive.supply)
    tr = machine.travel
    ratio, eta_g = _gear(drive)
    vg_max = _max_displacement(drive, dr)
    vg_min = m.displacement_min if m.displacement_given else vg_max
    limit = dr.values["pressure_limit"].value
    p_out = _back_pressure(drive, sup)
    i_in = Input("i", "gear ratio", ratio, "number")
    g_in = eff("eta_g", "gear efficiency", eta_g, ("drives", drive.id, "gear_stage", "efficiency")) if eta_g else \
        Input("eta_g", "gear efficiency (no gear stage)", 1.0, "ratio")
    vg_in = Input("Vg_max", "maximum displacement", vg_max, "displacement")
    f = rec.put(Value(
        "relief_effort", "Tractive effort at the pressure limit", "F_relief,i",
        traction.effort_at_pressure(vg_max, max(limit - p_out, 0.0), m.hydromechanical_efficiency.value, ratio,
                                    g_in.value, tr.rolling_radius), "force",
        "F_relief,i = Vg_max * (p_limit - p_out) * eta_hm / (2*pi) * i * eta_g / r",
        "the motor's torque at the pressure limit at its largest displacement, through the gear stage, at the ground",
        (vg_in, Input("p_limit", "pressure limit", limit, "pressure"), Input("p_out", "back pressure", p_out, "pressure"),
         motor_eff(drive.id, "hydromechanical", m.hydromechanical_efficiency), i_in, g_in, r_in), SRC_EFFORT),
        drive=drive.id)
    if drive.available_flow is not None:
        q = rec.put(Value("travel_flow", "Flow to the motor", "q_i", drive.available_flow, "flow", "q_i = q_avail",
                          "the drive's valve section gives at most this",
                          (Input("q_avail", "available flow", drive.available_flow, "flow"),), SRC_SPEED), drive=drive.id)
    else:
        n_share = sharing[sup.id]
        q = rec.put(Value("travel_flow", "Flow to the motor", "q_i", deliveries[sup.id] / n_share, "flow",
                          "q_i = q_p / n_driven", "the pump delivery shared alike by the driven drives on the supply",
                          (Input("q_p", "pump delivery", deliveries[sup.id], "flow"),
                           Input("n_driven", f"driven drives on supply {sup.id}", n_share, "number")), SRC_SPEED),
                    drive=drive.id)
    v_in = motor_eff(drive.id, "volumetric", m.volumetric_efficiency)
    q_in = Input("q_i", "flow to the motor", q, "flow")
    full = rec.put(Value(
        "full_displacement_speed", "Ground speed the flow reaches at full displacement", "v_full,i",
        traction.ground_speed(q * m.volumetric_efficiency.value / vg_max / ratio, tr.rolling_radius), "velocity",
        "v_full,i = 2*pi*r * q_i * eta_v / (Vg_max * i)", "the flow through the largest displacement, at the ground",
        (q_in, v_in, vg_in, i_in, r_in), SRC_SPEED), drive=drive.id)
    n_flow = math.inf if vg_min == 0 else q * m.volumetric_efficiency.value / vg_min
    rating = m.rating.max_speed
    n_top = n_flow if rating is None else min(n_flow, rating)
    if not math.isfinite(n_top):
        n_top = q * m.volumetric_efficiency.value / vg_max  # a zero stop and no rating: the full-displacement speed
    ins = (q_in, v_in, Input("Vg_min", "minimum displacement", vg_min, "displacement"), i_in, r_in)
    if rating is not None:
        ins += (Input("n_rated", "maximum speed rating", rating, "speed"),)
    top = rec.put(Value(
        "top_speed", "Top ground speed", "v_max,i", traction.ground_speed(n_top / ratio, tr.rolling_radius), "velocity",
        "v_max,i = 2*pi*r * min(q_i * eta_v / Vg_min, n_rated) / i",
        "the flow through the smallest displacement, or the motor's speed rating where lower, at the ground", ins,
        SRC_SPEED, note="set by the speed rating" if rating is not None and rating < n_flow else "set by the flow"),
        drive=drive.id)
    return f, full, top


def _slowest(key: str, label: str, symbol: str, speeds: dict[str, float]) -> Value:
    slowest = min(speeds, key=speeds.get)
    return Value(key, label, symbol, speeds[slowest], "velocity", f"{symbol} = min({symbol},i)",
                 "every driven wheel runs at one ground speed: the slowest drive sets it",
                 tuple(Input(indexed(symbol, d), f"drive {d}", v, "velocity") for d, v in speeds.items()), SRC_SPEED,
                 note=f"drive {slowest}")


def _efficiency(machine: Machine, tr: Travel) -> Value:
    """The lowest chain of efficiencies from the engine to the ground among the driven drives."""
    chains = {}
    for did in tr.drives:
        d = machine.drive(did)
        sup = machine.supply(d.supply)
        _, eta_g = _gear(d)
        parts = (eff("eta_p", "pump overall efficiency", sup.pump.overall_efficiency,
                     ("supplies", sup.id, "pump", "overall_efficiency")),
                 motor_eff(did, "volumetric", d.motor.volumetric_efficiency),
                 motor_eff(did, "hydromechanical", d.motor.hydromechanical_efficiency),
                 eff("eta_g", "gear efficiency", eta_g, ("drives", did, "gear_stage", "efficiency")) if eta_g
                 else Input("eta_g", "gear efficiency (no gear stage)", 1.0, "ratio"))
        chains[did] = parts
    worst = min(chains, key=lambda k: math.prod(p.value for p in chains[k]))
    parts = chains[worst]
    return Value("transmission_efficiency", "Efficiency from engine to ground", "eta_total",
                 math.prod(p.value for p in parts), "ratio", "eta_total = eta_p * eta_v * eta_hm * eta_g",
                 "pump overall, motor volumetric and hydro-mechanical, and gear efficiencies in a chain", parts,
                 SRC_POWER, note=f"drive {worst}" if len(chains) > 1 else "")


def _engine_power(rec: Record, machine: Machine, tr: Travel) -> float | None:
    """The engine power the driven drives' supplies have, each prime mover counted once; None when none is given."""
    mode = travel_mode(machine)
    found: dict[object, tuple[str, float]] = {}
    for did in tr.drives:
        sid = machine.drive(did).supply
        key = getattr(machine.supply(sid), "prime_mover", None) or ("supply", sid)
        power = prime_mover_power_at(machine, sid, mode)
        if power is not None and key not in found:
            found[key] = (sid, power)
    if not found:
        return None
    return rec.put(Value("engine_power", "Engine power for travel", "P_engine", sum(p for _, p in found.values()),
                         "power", "P_engine = sum(P_pm)", "the prime mover power of the driven drives' supplies, "
                         "each prime mover once" + (f", in mode {mode}" if mode else ""),
                         tuple(Input(indexed("P_pm", s), f"supply {s}", p, "power") for s, p in found.values()),
                         SRC_POWER))


def _duty(tr: Travel, load, r: DutyResult, t: traction.Transmission, eta: float, power: float | None,
          r_in: Input) -> tuple[dict[str, Value], str | None]:
    """A travel duty point: ground speed, tractive effort, adhesion limit and the envelope at its speed."""
    radius, r_use = tr.rolling_radius, r_in
    if isinstance(load, (WheelLoad, TrackTurnLoad)):
        radius = load.rolling_radius if isinstance(load, WheelLoad) else load.sprocket_radius
        r_use = Input("r", "rolling radius of the load model", radius, "length")
    n_l, t_l = r["load_speed"], r["load_torque"]
    n_driven = len(tr.drives)
    out = Record()
    v = out.put(Value("ground_speed", "Ground speed", "v", traction.ground_speed(n_l, radius), "velocity",
                      "v = 2*pi*r * n_L", "wheel (sprocket) speed times the rolling circumference",
                      (Input("n_L", "wheel (sprocket) speed", n_l, "speed"), r_use), SRC_DUTY))
    overrun = r.direction == "overrunning"
    out.put(Value("tractive_effort", "Tractive effort" + (" (braking)" if overrun else ""), "F",
                  t_l / radius * n_driven, "force", "F = T_L / r * n_driven",
                  "the wheel (sprocket) force, as if every driven wheel pulled alike",
                  (Input("T_L", "wheel (sprocket) torque", t_l, "torque"), r_use,
                   Input("n_driven", "driven drives", n_driven, "number")), SRC_DUTY,
                  note="the load drives the wheels: braking effort" if overrun else ""))
    grade = load.grade if isinstance(load, WheelLoad) else 0.0
    out.put(Value("adhesion_limit", "Adhesion limit at this duty point", "F_adh",
                  traction.adhesion_limit(tr.adhesion.value, tr.driven_mass, grade), "force",
                  "F_adh = mu * m_driven * g * cos(theta)", "the normal force on the driven wheels on the grade, times mu",
                  (eff("mu", "adhesion coefficient", tr.adhesion, ("travel", "adhesion")),
                   Input("m_driven", "mass on the driven wheels or tracks", tr.driven_mass, "mass"),
                   Input("g", "standard gravity", STANDARD_GRAVITY, "acceleration"),
                   Input("theta", "grade angle", grade, "angle")), SRC_ADHESION))
    if overrun:  # the load drives the wheels: the transmission's envelope does not bound it
        return out.values, None
    effort, line = traction.effort_limit(t, v, None, eta, power)
    out.put(Value("envelope_effort", "Transmission's tractive effort at this speed", "F_env", effort, "force",
                  "F_env = min(F_relief(v), eta_total * P_engine / v), 0 above v_max",
                  "what the pressure limit, the engine's power and the flow allow at this ground speed",
                  (Input("v", "ground speed", v, "velocity"), Input("F_relief", "effort at the pressure limit",
                                                                  t.relief_effort, "force"),
                   Input("v_max", "top travel speed", t.top_speed, "velocity"),
                   Input("eta_total", "efficiency from engine to ground", eta, "ratio"))
                  + ((Input("P_engine", "engine power", power, "power"),) if power is not None else ()),
                  SRC_POWER, note=f"set by the {line}"))
    return out.values, line
