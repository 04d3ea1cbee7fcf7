"""Load-shaft torque and speed of a duty point, traced, from a load model or as entered.

Every load model's inputs appear in the trace of the load torque and speed it computes.
Torques are returned as magnitudes: a negative model torque (downhill, regenerating belt) makes
the duty point overrunning (``decide_directions``, run as the spec is validated), and the note
says so.
"""

from __future__ import annotations

import math
from dataclasses import replace

from specgen.calc import loads, skid_steer
from specgen.intake.model import BeltLoad, DutyPoint, Machine, SpeedSquaredLoad, TrackTurnLoad, WheelLoad, WinchLoad
from specgen.trace import Input, Value, given

SRC_WINCH = "winch drum torque and rope speed on the working layer (hoisting textbook)"
SRC_WHEEL = "tractive force on a grade with rolling resistance (vehicle dynamics textbook)"
SRC_WHEEL_SHAFT = "ground force times rolling radius, shared by the driven wheels; rolling without slip"
SRC_BELT = "conveyor drive pulley: effective belt pull times pulley radius (conveyor textbook)"
SRC_FAN = "fan and pump affinity laws: torque follows the square of speed"
SRC_SKID = "skid steering, steady turn on level ground (Wong, Theory of Ground Vehicles, skid-steer chapter)"
SRC_TURN_SPEED = "rigid-body kinematics of a turn without slip"

_OVERRUN_NOTE = "negative: the load drives the motor (overrunning); its magnitude is used"


def decide_directions(machine: Machine) -> tuple[Machine, list[tuple[tuple, str]]]:
    """The machine with every duty point's direction decided, and the duty points whose written
    direction contradicts their load, as (path in the spec, sentence).

    A duty point runs the way the spec wrote it ("driving" when it wrote none), except that a wheel,
    belt or track-turn load whose force is negative (downhill, braking, a regenerating belt, the inner
    track of a steady skid-steer turn) drives the motor:
    it is overrunning whatever was written, and writing "driving" there is a contradiction; so is
    writing "overrunning" for a wheel or belt load whose force is positive.

    Example: a 12 t vehicle, c_rr 0.02, on a -10 % grade: F = m*g*(0.02*cos(theta) + sin(theta))
    = 12000*9.80665*(0.0199 - 0.0995) = -9368 N < 0, so the duty point is overrunning.
    """
    problems: list[tuple[tuple, str]] = []
    drives = []
    for drive in machine.drives:
        duties = []
        for duty in drive.duty_points:
            direction, refused = duty_direction(duty)
            if refused:
                problems.append((("drives", drive.id, "duty_points", duty.id, "direction"), refused))
            duties.append(duty if direction == duty.direction else replace(duty, direction=direction))
        drives.append(replace(drive, duty_points=tuple(duties)))
    return replace(machine, drives=tuple(drives)), problems


def duty_direction(duty: DutyPoint) -> tuple[str, str | None]:
    """The direction a duty point runs in, and why its written direction is refused (None if it is not)."""
    written = duty.direction
    sign = _load_sign(duty.load)
    if sign is None:
        return written or "driving", None
    if sign < 0:
        if written == "driving":
            return "overrunning", ("the load model gives a negative torque here (the load drives the motor, "
                                   "e.g. downhill); write direction: overrunning or leave it out")
        return "overrunning", None
    if written == "overrunning":
        return written, ("the load model gives a driving torque here; an overrunning "
                         f"{duty.load.model} load needs a negative force (downhill, braking)")
    return written or "driving", None


def _load_sign(load) -> float | None:
    """The sign-carrying force of a wheel, belt or track-turn load (N); None for other loads or unusable inputs."""
    try:
        if isinstance(load, WheelLoad):
            return loads.tractive_force(load.vehicle_mass, load.rolling_resistance, load.grade, load.acceleration)
        if isinstance(load, BeltLoad):
            return load.belt_pull
        if isinstance(load, TrackTurnLoad):
            return track_thrust(load)
    except (ValueError, TypeError):  # a bad input already has its own message
        return None
    return None


def load_values(duty: DutyPoint) -> list[Value]:
    """Values ending with 'load_torque' (N*m) and 'load_speed' (rev/s) for this duty point."""
    m = duty.load
    if m is None:
        return [given("load_torque", "Load torque", "T_L", duty.torque, "torque"),
                given("load_speed", "Load speed", "n_L", duty.speed, "speed")]
    return _MODELS[type(m)](m)


def _winch(w: WinchLoad) -> list[Value]:
    f = Input("F", "line pull", w.line_pull, "force")
    dd = Input("d_drum", "drum diameter", w.drum_diameter, "length")
    dr = Input("d_rope", "rope diameter", w.rope_diameter, "length")
    layer = Input("layer", "rope layer (1 = first on the bare drum)", w.layer, "number")
    v = Input("v", "line speed", w.line_speed, "velocity")
    d_eff = loads.winch_effective_diameter(w.drum_diameter, w.rope_diameter, w.layer)
    return [
        Value("rope_pitch_diameter", "Rope pitch diameter on the working layer", "d_eff", d_eff, "length",
              "d_eff = d_drum + (2*layer - 1)*d_rope", "drum diameter plus the rope layers, to the rope centreline",
              (dd, dr, layer), SRC_WINCH),
        Value("load_torque", "Drum torque", "T_L",
              loads.winch_drum_torque(w.line_pull, w.drum_diameter, w.rope_diameter, w.layer), "torque",
              "T_L = F * (d_drum/2 + (layer - 0.5)*d_rope)", "line pull times the radius to the rope centreline",
              (f, dd, dr, layer), SRC_WINCH),
        Value("load_speed", "Drum speed", "n_L",
              loads.winch_drum_speed(w.line_speed, w.drum_diameter, w.rope_diameter, w.layer), "speed",
              "n_L = v / (pi * d_eff)", "line speed over the rope length one drum turn takes up",
              (v, Input("d_eff", "rope pitch diameter", d_eff, "length")), SRC_WINCH),
    ]


def _wheel(w: WheelLoad) -> list[Value]:
    out = []
    if w.grade_text.strip().endswith("%"):
        percent = math.tan(w.grade) * 100.0
        out.append(Value("grade_angle", "Grade angle", "theta", w.grade, "angle", "theta = atan(grade / 100)",
                         "slope angle of a grade given as rise over run in percent",
                         (Input("grade", "grade, percent / 100", percent / 100.0, "ratio"),), "trigonometry of a slope"))
    else:
        out.append(given("grade_angle", "Grade angle", "theta", w.grade, "angle"))
    m = Input("m", "vehicle mass", w.vehicle_mass, "mass")
    force = loads.tractive_force(w.vehicle_mass, w.rolling_resistance, w.grade, w.acceleration)
    out.append(Value("tractive_force", "Tractive force", "F", force, "force",
                     "F = m*g*(c_rr*cos(theta) + sin(theta)) + m*a",
                     "rolling resistance and the climb against gravity, plus the force to accelerate",
                     (m, Input("g", "standard gravity", loads.STANDARD_GRAVITY, "acceleration"),
                      Input("c_rr", "rolling resistance coefficient", w.rolling_resistance, "ratio"),
                      Input("theta", "grade angle", w.grade, "angle"),
                      Input("a", "acceleration", w.acceleration, "acceleration")), SRC_WHEEL,
                     note=_OVERRUN_NOTE if force < 0 else ""))
    shaft = loads.wheel_load(force, w.rolling_radius, w.driven_wheels, w.travel_speed)
    r = Input("r", "rolling radius (track: sprocket pitch radius)", w.rolling_radius, "length")
    out += [
        Value("load_torque", "Wheel (sprocket) torque", "T_L", abs(shaft.torque), "torque", "T_L = |F| * r / n_w",
              "tractive force times rolling radius, shared by the driven wheels",
              (Input("F", "tractive force", force, "force"), r,
               Input("n_w", "driven wheels", w.driven_wheels, "number")), SRC_WHEEL_SHAFT,
              note=_OVERRUN_NOTE if force < 0 else ""),
        Value("load_speed", "Wheel (sprocket) speed", "n_L", shaft.speed, "speed", "n_L = v / (2*pi*r)",
              "ground speed over the rolling circumference", (Input("v", "travel speed", w.travel_speed, "velocity"), r),
              SRC_WHEEL_SHAFT),
    ]
    return out


def _belt(b: BeltLoad) -> list[Value]:
    shaft = loads.belt_load(b.belt_pull, b.pulley_diameter, b.belt_speed)
    d = Input("d", "pulley diameter", b.pulley_diameter, "length")
    return [
        Value("load_torque", "Pulley torque", "T_L", abs(shaft.torque), "torque", "T_L = |F_belt| * d / 2",
              "effective belt pull times pulley radius", (Input("F_belt", "effective belt pull", b.belt_pull, "force"), d),
              SRC_BELT, note=_OVERRUN_NOTE if b.belt_pull < 0 else ""),
        Value("load_speed", "Pulley speed", "n_L", shaft.speed, "speed", "n_L = v / (pi * d)",
              "belt speed over the pulley circumference", (Input("v", "belt speed", b.belt_speed, "velocity"), d),
              SRC_BELT),
    ]


def _speed_squared(s: SpeedSquaredLoad) -> list[Value]:
    n = Input("n_L", "speed", s.speed, "speed")
    return [
        Value("load_torque", "Load torque (speed squared)", "T_L",
              loads.speed_squared_torque(s.reference_torque, s.reference_speed, s.speed), "torque",
              "T_L = T_ref * (n_L / n_ref)^2", "reference torque scaled by the square of the speed ratio",
              (Input("T_ref", "reference torque", s.reference_torque, "torque"),
               Input("n_ref", "reference speed", s.reference_speed, "speed"), n), SRC_FAN),
        given("load_speed", "Load speed", "n_L", s.speed, "speed"),
    ]


def track_thrust(t: TrackTurnLoad) -> float:
    """The thrust (N) of the track this load turns; negative for an inner track braking in a steady turn."""
    thrusts = skid_steer.track_thrusts(skid_steer.vehicle_weight(t.vehicle_mass), t.rolling_resistance,
                                       t.lateral_resistance, t.contact_length, t.tread, t.pivot)
    return thrusts.outer if t.track == skid_steer.OUTER else thrusts.inner


def _track_turn(t: TrackTurnLoad) -> list[Value]:
    """Turning resistance moment, both track thrusts, then this track's sprocket torque and speed."""
    weight = skid_steer.vehicle_weight(t.vehicle_mass)
    th = skid_steer.track_thrusts(weight, t.rolling_resistance, t.lateral_resistance, t.contact_length, t.tread,
                                  t.pivot)
    w_in, b_in = Input("W", "vehicle weight", weight, "force"), Input("B", "tread", t.tread, "length")
    f_r = Input("f_r", "rolling resistance coefficient", t.rolling_resistance, "ratio")
    m_in = Input("M_r", "turning resistance moment", th.moment, "torque")
    pivot = " (pivot turn: both tracks, in opposite directions)" if t.pivot else ""
    out = [
        Value("vehicle_weight", "Vehicle weight", "W", weight, "force", "W = m * g", "vehicle mass times gravity",
              (Input("m", "vehicle mass", t.vehicle_mass, "mass"),
               Input("g", "standard gravity", loads.STANDARD_GRAVITY, "acceleration")), "CGPM 1901 standard gravity"),
        Value("turning_moment", "Turning resistance moment", "M_r", th.moment, "torque", "M_r = mu_t * W * L / 4",
              "lateral resistance of both tracks sliding sideways about the turning centre",
              (Input("mu_t", "lateral resistance coefficient", t.lateral_resistance, "ratio"), w_in,
               Input("L", "track contact length", t.contact_length, "length")), SRC_SKID),
        Value("outer_track_thrust", "Outer track thrust" + pivot, "F_outer", th.outer, "force",
              "F_outer = f_r * W / 2 + M_r / B", "half the rolling resistance plus the turning moment over the tread",
              (f_r, w_in, m_in, b_in), SRC_SKID),
    ]
    if t.pivot:
        out.append(Value("inner_track_thrust", "Inner track thrust (pivot turn, in reverse)", "F_inner", th.inner,
                         "force", "F_inner = f_r * W / 2 + M_r / B",
                         "in a pivot turn the inner track drives in reverse with the outer track's thrust",
                         (f_r, w_in, m_in, b_in), SRC_SKID))
    else:
        out.append(Value("inner_track_thrust", "Inner track thrust", "F_inner", th.inner, "force",
                         "F_inner = f_r * W / 2 - M_r / B",
                         "half the rolling resistance less the turning moment over the tread", (f_r, w_in, m_in, b_in),
                         SRC_SKID, note="negative: the inner track brakes (it is overrun)" if th.inner < 0 else ""))
    outer_v, inner_v = skid_steer.track_speeds(t.speed, t.turn_radius, t.tread)
    mine = t.track == skid_steer.OUTER
    force = th.outer if mine else th.inner
    v_track = outer_v if mine else inner_v
    if t.pivot:
        out.append(given("track_speed", "Track speed (pivot turn)", "v_track", v_track, "velocity"))
    else:
        out.append(Value("track_speed", f"{t.track.capitalize()} track speed", "v_track", v_track, "velocity",
                         f"v_track = v * (R {'+' if mine else '-'} B/2) / R",
                         "the vehicle's speed carried out to this track's centre line",
                         (Input("v", "vehicle speed", t.speed, "velocity"),
                          Input("R", "turn radius", t.turn_radius, "length"), b_in), SRC_TURN_SPEED))
    r = Input("r", "sprocket pitch radius", t.sprocket_radius, "length")
    out += [
        Value("load_torque", "Sprocket torque", "T_L", abs(force) * t.sprocket_radius, "torque",
              "T_L = |F_track| * r", f"this ({t.track}) track's thrust times the sprocket pitch radius",
              (Input("F_track", f"{t.track} track thrust", force, "force"), r), SRC_SKID,
              note=_OVERRUN_NOTE if force < 0 else ""),
        Value("load_speed", "Sprocket speed", "n_L", loads.wheel_load(0.0, t.sprocket_radius, 1, v_track).speed,
              "speed", "n_L = v_track / (2*pi*r)", "track speed over the sprocket's pitch circumference",
              (Input("v_track", "track speed", v_track, "velocity"), r), SRC_TURN_SPEED),
    ]
    return out


_MODELS = {WinchLoad: _winch, WheelLoad: _wheel, BeltLoad: _belt, SpeedSquaredLoad: _speed_squared,
           TrackTurnLoad: _track_turn}
