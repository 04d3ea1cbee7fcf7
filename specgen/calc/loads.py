"""Load models: torque and speed at the load shaft, SI floats throughout.

Units: force N, length m, mass kg, speed rev/s (rotational) or m/s (linear),
torque N*m, inertia kg*m^2, time s, angles rad.

Sign policy: speeds are magnitudes (>= 0); direction is the caller's concern.
A negative torque from the wheel or belt models means the load drives the
shaft (overrunning: downhill, lowering), which the caller must treat as such.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from specgen.calc.guards import finite as _finite, positive as _positive, non_negative as _non_negative

STANDARD_GRAVITY = 9.80665  # m/s^2, CGPM 1901 conventional value


@dataclass(frozen=True)
class ShaftLoad:
    """Torque (N*m) and speed (rev/s) at a load shaft."""

    torque: float
    speed: float

    @property
    def power(self) -> float:
        """Shaft power in W: P = 2*pi*n*T."""
        return 2.0 * math.pi * self.speed * self.torque


# --- winch -----------------------------------------------------------------


def winch_effective_diameter(drum_diameter: float, rope_diameter: float, layer: int = 1) -> float:
    """Pitch diameter of the rope centreline on the given layer.

    Formula: ``d_eff = d_drum + (2*layer - 1) * d_rope``, i.e. the effective
    radius ``r = d_drum/2 + (layer - 0.5) * d_rope``.

    ``layer`` is the number of the layer the rope leaves the drum from, counted
    from 1 for the first layer on the bare drum. The rope tension acts at the
    rope centreline, which on layer 1 sits half a rope diameter above the drum
    surface and rises one rope diameter per layer. Layers are assumed to stack
    a full rope diameter apart; real layers nest slightly closer, so this
    slightly overstates the radius (conservative for torque, slightly
    optimistic for drum speed at a given line speed).

    Source: rope-drum geometry (lever arm of the rope tension about the drum axis).

    Parameters: drum_diameter (m, bare drum / groove root), rope_diameter (m),
    layer (integer >= 1).

    Example: 400 mm drum, 16 mm rope, layer 3 -> 0.4 + 5*0.016 = 0.48 m.

    >>> round(winch_effective_diameter(0.4, 0.016, 3), 6)
    0.48
    """
    _positive("drum diameter", drum_diameter)
    _positive("rope diameter", rope_diameter)
    if isinstance(layer, bool) or int(layer) != layer or layer < 1:
        raise ValueError(f"layer must be a whole number from 1 (first layer on the bare drum), got {layer}.")
    return drum_diameter + (2 * int(layer) - 1) * rope_diameter


def winch_drum_torque(line_pull: float, drum_diameter: float, rope_diameter: float, layer: int = 1) -> float:
    """Drum torque for a line pull on a given layer.

    Formula: ``T = F * d_eff / 2`` with ``d_eff`` from
    :func:`winch_effective_diameter` (``r = d_drum/2 + (layer - 0.5)*d_rope``).

    Parameters: line_pull F (N, >= 0: a rope only pulls), drum_diameter (m),
    rope_diameter (m), layer (integer >= 1).

    Source: moment of the rope tension about the drum axis.

    Example: 50 kN on layer 3 of a 400 mm drum, 16 mm rope -> 50e3 * 0.24 = 12 kN*m.

    >>> round(winch_drum_torque(50e3, 0.4, 0.016, 3), 6)
    12000.0
    """
    _non_negative("line pull", line_pull)
    return line_pull * winch_effective_diameter(drum_diameter, rope_diameter, layer) / 2.0


def winch_drum_speed(line_speed: float, drum_diameter: float, rope_diameter: float, layer: int = 1) -> float:
    """Drum speed (rev/s) for a line speed on a given layer.

    Formula: ``n = v / (pi * d_eff)``.

    Parameters: line_speed v (m/s, >= 0), drum_diameter (m), rope_diameter (m),
    layer (integer >= 1).

    Source: rolling kinematics, rope length per revolution = pi * d_eff.

    Example: 0.5 m/s on d_eff = 0.48 m -> 0.5 / (pi*0.48) = 0.3316 rev/s (19.9 rpm).

    >>> round(winch_drum_speed(0.5, 0.4, 0.016, 3), 4)
    0.3316
    """
    _non_negative("line speed", line_speed)
    return line_speed / (math.pi * winch_effective_diameter(drum_diameter, rope_diameter, layer))


def winch_load(
    line_pull: float, line_speed: float, drum_diameter: float, rope_diameter: float, layer: int = 1
) -> ShaftLoad:
    """Drum shaft torque and speed for a winch duty point (see the two functions above).

    Example: 50 kN at 0.5 m/s on layer 3 (400 mm drum, 16 mm rope)
    -> 12 kN*m at 0.3316 rev/s.
    """
    return ShaftLoad(
        torque=winch_drum_torque(line_pull, drum_diameter, rope_diameter, layer),
        speed=winch_drum_speed(line_speed, drum_diameter, rope_diameter, layer),
    )


# --- wheel or track ----------------------------------------------------------


def grade_angle_from_percent(percent: float) -> float:
    """Grade angle (rad) from a slope in percent (rise over run * 100).

    Formula: ``theta = atan(percent / 100)``; negative means downhill.

    Source: trigonometry of a slope given as rise/run.

    Example: 10 % -> atan(0.1) = 0.09967 rad (5.71 deg).

    >>> round(grade_angle_from_percent(10.0), 5)
    0.09967
    """
    return math.atan(_finite("grade percent", percent) / 100.0)


def grade_angle_from_degrees(degrees: float) -> float:
    """Grade angle (rad) from degrees, strictly between -90 and 90.

    Example: 30 deg -> pi/6 = 0.5236 rad.

    >>> round(grade_angle_from_degrees(30.0), 4)
    0.5236
    """
    degrees = _finite("grade angle", degrees)
    if not -90.0 < degrees < 90.0:
        raise ValueError(f"grade angle must lie strictly between -90 and 90 degrees, got {degrees}.")
    return math.radians(degrees)


def tractive_force(
    mass: float,
    rolling_resistance: float,
    grade_angle: float,
    acceleration: float = 0.0,
    gravity: float = STANDARD_GRAVITY,
) -> float:
    """Total tractive force (N) a vehicle needs at the ground.

    Formula: ``F = m*g*(c_rr*cos(theta) + sin(theta)) + m*a``.

    Parameters: mass m (kg, > 0), rolling_resistance c_rr (dimensionless, >= 0),
    grade_angle theta (rad, positive uphill, in (-pi/2, pi/2)),
    acceleration a (m/s^2, negative for braking), gravity g (m/s^2).

    Source: Newton's second law along the slope with rolling resistance
    proportional to the normal force (vehicle dynamics textbooks).

    Example: 12 t, c_rr = 0.05, 10 % grade, 0.2 m/s^2:
    12000*9.80665*(0.05*0.99504 + 0.09950) + 12000*0.2 = 19 964 N.

    >>> round(tractive_force(12000, 0.05, grade_angle_from_percent(10), 0.2))
    19964
    """
    _positive("mass", mass)
    _non_negative("rolling resistance coefficient", rolling_resistance)
    _positive("gravity", gravity)
    grade_angle = _finite("grade angle", grade_angle)
    if not -math.pi / 2 < grade_angle < math.pi / 2:
        raise ValueError(f"grade angle must lie strictly between -pi/2 and pi/2 rad, got {grade_angle}.")
    acceleration = _finite("acceleration", acceleration)
    return mass * gravity * (rolling_resistance * math.cos(grade_angle) + math.sin(grade_angle)) + mass * acceleration


def wheel_load(force: float, wheel_radius: float, wheel_count: int, ground_speed: float) -> ShaftLoad:
    """Torque and speed per driven wheel (or track sprocket).

    Formulas: ``T = F * r / n_wheels``, ``n = v / (2*pi*r)``.

    Parameters: force F (N, total tractive force shared equally; negative when
    overrunning), wheel_radius r (m, rolling radius or sprocket pitch radius),
    wheel_count (whole number >= 1 of driven wheels), ground_speed v (m/s, >= 0).

    Source: lever arm of the ground force; rolling without slip.

    Example: 19 964 N over 4 wheels of r = 0.6 m at 2 m/s
    -> 2994.6 N*m per wheel at 0.5305 rev/s.

    >>> w = wheel_load(19964, 0.6, 4, 2.0)
    >>> round(w.torque, 1), round(w.speed, 4)
    (2994.6, 0.5305)
    """
    force = _finite("tractive force", force)
    _positive("wheel radius", wheel_radius)
    if isinstance(wheel_count, bool) or int(wheel_count) != wheel_count or wheel_count < 1:
        raise ValueError(f"wheel count must be a whole number of at least 1, got {wheel_count}.")
    _non_negative("ground speed", ground_speed)
    return ShaftLoad(
        torque=force * wheel_radius / int(wheel_count),
        speed=ground_speed / (2.0 * math.pi * wheel_radius),
    )


# --- belt or conveyor --------------------------------------------------------


def belt_load(belt_force: float, pulley_diameter: float, belt_speed: float) -> ShaftLoad:
    """Drive-pulley torque and speed for a belt conveyor.

    Formulas: ``T = F_belt * d_pulley / 2``, ``n = v / (pi * d_pulley)``.

    Parameters: belt_force F_belt (N, effective pull = tight-side minus
    slack-side tension; negative for a regenerating downhill conveyor),
    pulley_diameter (m, > 0, to the belt centreline), belt_speed v (m/s, >= 0).

    Source: lever arm of the effective belt pull; belt without slip.

    Example: 8 kN on a 0.5 m pulley at 1.5 m/s -> 2000 N*m at 0.9549 rev/s.

    >>> b = belt_load(8000, 0.5, 1.5)
    >>> round(b.torque, 6), round(b.speed, 4)
    (2000.0, 0.9549)
    """
    belt_force = _finite("belt force", belt_force)
    _positive("pulley diameter", pulley_diameter)
    _non_negative("belt speed", belt_speed)
    return ShaftLoad(torque=belt_force * pulley_diameter / 2.0, speed=belt_speed / (math.pi * pulley_diameter))


# --- speed-squared loads (fans, centrifugal pumps, turbulent mixers) ---------


def speed_squared_torque(reference_torque: float, reference_speed: float, speed: float) -> float:
    """Torque of a load whose torque follows the square of speed.

    Formula: ``T = T_ref * (n / n_ref)^2``.

    Parameters: reference_torque T_ref (N*m, >= 0) at reference_speed n_ref
    (rev/s, > 0); speed n (rev/s, >= 0).

    Source: fan / pump affinity laws (torque ~ n^2 for turbulent flow).

    Example: 400 N*m at 20 rev/s -> at 15 rev/s: 400 * 0.75^2 = 225 N*m.

    >>> speed_squared_torque(400.0, 20.0, 15.0)
    225.0
    """
    _non_negative("reference torque", reference_torque)
    _positive("reference speed", reference_speed)
    _non_negative("speed", speed)
    return reference_torque * (speed / reference_speed) ** 2


# --- inertia -----------------------------------------------------------------


def angular_acceleration(speed: float, ramp_time: float) -> float:
    """Mean angular acceleration (rad/s^2) for a linear ramp from rest.

    Formula: ``alpha = 2*pi*n / t_ramp``.

    Parameters: speed n (rev/s, >= 0) reached after ramp_time t_ramp (s, > 0).

    Example: 0.5 rev/s in 2 s -> pi/2 = 1.5708 rad/s^2.

    >>> round(angular_acceleration(0.5, 2.0), 4)
    1.5708
    """
    _non_negative("speed", speed)
    _positive("ramp time", ramp_time)
    return 2.0 * math.pi * speed / ramp_time


def acceleration_torque(inertia: float, speed: float, ramp_time: float) -> float:
    """Torque (N*m) to accelerate an inertia from rest to a speed in a ramp time.

    Formula: ``T_acc = J * alpha``, ``alpha = 2*pi*n / t_ramp``.

    Parameters: inertia J (kg*m^2, >= 0), speed n (rev/s), ramp_time (s, > 0).

    Source: Newton's second law for rotation.

    Example: 40 kg*m^2 to 0.5 rev/s in 2 s -> 40 * 1.5708 = 62.83 N*m.

    >>> round(acceleration_torque(40.0, 0.5, 2.0), 2)
    62.83
    """
    _non_negative("inertia", inertia)
    return inertia * angular_acceleration(speed, ramp_time)


def refer_inertia(load_inertia: float, ratio: float) -> float:
    """Load inertia referred to the motor shaft through a gear stage.

    Formula: ``J_motor_side = J_load / i^2`` with ``i = n_motor / n_load``.

    Parameters: load_inertia (kg*m^2, >= 0), ratio i (dimensionless, > 0).

    Source: equal kinetic energy on both sides of an ideal gear stage.

    Example: 40 kg*m^2 through i = 20 -> 0.1 kg*m^2.

    >>> refer_inertia(40.0, 20.0)
    0.1
    """
    _non_negative("load inertia", load_inertia)
    _positive("gear ratio", ratio)
    return load_inertia / ratio**2


def motor_acceleration_torque(
    load_inertia: float,
    ratio: float,
    load_speed: float,
    ramp_time: float,
    motor_side_inertia: float = 0.0,
    gear_efficiency: float = 1.0,
) -> float:
    """Torque at the motor shaft to accelerate the drive train from rest.

    Formula: ``T = (J_m + J_load / (i^2 * eta_gear)) * 2*pi*(i*n_load) / t_ramp``.

    The motor shaft accelerates ``i`` times faster than the load; the load
    inertia appears divided by ``i^2`` and, since the gear loses power while
    driving, by ``eta_gear`` as well (``eta_gear = 1`` ignores gear losses).

    Parameters: load_inertia J_load (kg*m^2, at the load shaft, >= 0),
    ratio i (n_motor / n_load, > 0), load_speed n_load (rev/s) reached after
    ramp_time (s, > 0), motor_side_inertia J_m (kg*m^2, motor rotor, coupling
    and fast gear side, >= 0), gear_efficiency (in (0, 1]).

    Source: Newton's second law for rotation with reflected inertia.

    Example: 40 kg*m^2 load, i = 20, 0.5 rev/s in 2 s, J_m = 0.02 kg*m^2:
    (0.02 + 0.1) * 2*pi*10/2 = 3.770 N*m.

    >>> round(motor_acceleration_torque(40.0, 20.0, 0.5, 2.0, 0.02), 3)
    3.77
    """
    _non_negative("motor-side inertia", motor_side_inertia)
    gear_efficiency = _positive("gear efficiency", gear_efficiency)
    if gear_efficiency > 1.0:
        raise ValueError(f"gear efficiency must not exceed 1, got {gear_efficiency}.")
    referred = refer_inertia(load_inertia, ratio) / gear_efficiency
    _non_negative("load speed", load_speed)
    return (motor_side_inertia + referred) * angular_acceleration(ratio * load_speed, ramp_time)
