"""The machine model: frozen dataclasses holding SI floats, in the order the spec wrote them.

Units: pressure Pa, displacement m^3/rev, flow m^3/s, speed rev/s, torque N*m, power W,
temperature K, density kg/m^3, force N, length m, velocity m/s, acceleration m/s^2, mass kg,
inertia kg*m^2, time s, angle rad, kinematic viscosity m^2/s. A model is built only from a
validated spec (see validate.py and the build_*.py modules it calls).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from functools import cached_property

from specgen.intake import defaults
from specgen.iso_vg import GRADES_WITHOUT_TYPICAL_100C



@dataclass(frozen=True)
class Ratio:
    """A dimensionless factor (efficiency, threshold); ``assumed`` when a default filled it in."""

    value: float
    assumed: bool = False
    basis: str = ""  # where an assumed value comes from


@dataclass(frozen=True)
class Fluid:
    iso_vg: int
    temperature: float
    density: Ratio  # kg/m^3 carried as a Ratio so "assumed" travels with it
    viscosity_100c: float | None = None  # m^2/s measured at 100 degC; None: typical VI-100 value

    @property
    def viscosity_known(self) -> bool:
        """Can the viscosity at the operating temperature be found: a usable temperature, and a
        measured 100 degC viscosity or a grade that has a typical one."""
        if self.temperature is None or not math.isfinite(self.temperature):
            return False
        return self.viscosity_100c is not None or self.iso_vg not in GRADES_WITHOUT_TYPICAL_100C


@dataclass(frozen=True)
class Line:
    """A hydraulic line (hose or tube): bore, straight length and fittings as equivalent length."""

    inner_diameter: float  # m
    length: float  # m
    equivalent_length: float = 0.0  # m, fittings and bends
    roughness: float = 0.0  # m, absolute; 0: hydraulically smooth (hose, drawn tube)


@dataclass(frozen=True)
class Lines:
    pressure: Line | None = None  # valve to motor inlet
    ret: Line | None = None  # motor outlet to valve or tank ("return" in the spec)


@dataclass(frozen=True)
class Pump:
    displacement: float | None
    shaft_speed: float | None
    delivery: float | None
    volumetric_efficiency: Ratio
    overall_efficiency: Ratio
    control: str = "fixed"  # "fixed", "pressure_compensated" or "load_sensing"
    compensator_setting: float | None = None  # Pa
    # Pa absolute, carried as a Ratio so "assumed" travels with it
    min_inlet_pressure: Ratio = Ratio(defaults.PUMP_MIN_INLET, assumed=True, basis=defaults.PUMP_MIN_INLET_BASIS)
    # load-sensing control (control: load_sensing)
    ls_margin: float | None = None  # Pa, pump pressure above the highest load-sense pressure (dp_LS)
    standby_pressure: Ratio | None = None  # Pa, with nothing running; carried as a Ratio so "assumed" travels
    input_power_limit: float | None = None  # W, power (torque) limiter: the pump destrokes to stay within it
    input_torque_limit: float | None = None  # N*m, the same limit given as input torque


@dataclass(frozen=True)
class FlowDivider:
    """A flow divider between two drives of a load-sensing supply: ``ratio`` of its inlet flow goes to
    the first drive, the rest to the second; ``pressure_drop`` across it at its working flow (maker's data)."""

    drives: tuple[str, str]
    ratio: float  # share of the inlet flow to drives[0], 0 < ratio < 1
    pressure_drop: float  # Pa


@dataclass(frozen=True)
class Charge:
    """The charge pump of a closed loop: it turns on the main pump's shaft (through drive) and holds
    the loop's low side at its relief pressure. Either a displacement or a delivered flow."""

    pressure: float  # Pa, charge relief setting: the low side of the loop
    displacement: float | None = None  # m^3/rev
    flow: float | None = None  # m^3/s delivered, when given instead of a displacement
    volumetric_efficiency: Ratio = Ratio(1.0)
    overall_efficiency: Ratio = Ratio(1.0)


@dataclass(frozen=True)
class ReliefSides:
    """A closed loop's high-pressure relief per side (Pa); None: the supply's relief_setting."""

    side_a: float | None = None
    side_b: float | None = None


@dataclass(frozen=True)
class ClosedLoop:
    """A closed-loop (hydrostatic) transmission: charge circuit, flushing and high-pressure reliefs."""

    charge: Charge
    flushing_flow: float = 0.0  # m^3/s taken out of the low side by the flushing valve
    high_pressure_reliefs: ReliefSides = ReliefSides()


@dataclass(frozen=True)
class Supply:
    id: str
    title: str
    pump: Pump
    relief_setting: float
    return_pressure: float
    prime_mover_power: float | None
    prime_mover_speed: float | None = None  # rev/s
    drive_ratio: float = 1.0  # pump shaft speed / prime mover speed
    circuit: str = "parallel"  # "parallel" or "series"
    surplus_to: str = "working_pressure"  # "working_pressure", "relief" or "open_centre"
    open_centre_pressure: float | None = None  # Pa
    suction_line: Line | None = None
    suction_head: float | None = None  # m, oil level above the pump inlet (negative: below)
    strainer_drop: float = 0.0  # Pa, suction strainer pressure drop
    feeds: str | None = None  # what a supply with no drives in the spec feeds (a charge circuit...)
    ls_valves: str | None = None  # load sensing: "post_compensated" (flow sharing) or "pre_compensated"
    priority: tuple[str, ...] = ()  # load sensing: drives a priority valve serves first, in this order
    flow_divider: FlowDivider | None = None  # load sensing: a flow divider between two drives

    @property
    def load_sensing(self) -> bool:
        return self.pump.control == "load_sensing"

    @property
    def strokes_back(self) -> bool:
        """A variable pump that delivers only the flow the drives take (compensated or load-sensing)."""
        return self.pump.control in ("pressure_compensated", "load_sensing")
    prime_mover: str | None = None  # id of a shared prime mover (machine-level); None: its own figures above
    closed_loop: ClosedLoop | None = None  # with circuit "closed_loop"

    def __post_init__(self) -> None:
        # A closed loop's low side is its charge pressure: it stands in for the return pressure, and
        # stays so in every copy (an operating corner that moves the charge pressure moves it too).
        if self.closed_loop is not None and self.closed_loop.charge.pressure is not None:
            object.__setattr__(self, "return_pressure", self.closed_loop.charge.pressure)

    @property
    def compensated(self) -> bool:
        return self.pump.control == "pressure_compensated"

    @property
    def pressure_limit(self) -> float:
        """Highest pressure the drives can get: the compensator setting, else the relief setting (a closed
        loop: its lower high-pressure relief side, as either side may be the high one)."""
        if self.compensated and self.pump.compensator_setting is not None:
            return self.pump.compensator_setting
        return min((v for _, v in self.high_pressure_reliefs), default=self.relief_setting)

    @property
    def high_pressure_reliefs(self) -> tuple[tuple[str, float], ...]:
        """A closed loop's high-pressure relief per side, ("A", Pa) and ("B", Pa), each the relief
        setting unless the spec gives it; empty for any other circuit."""
        if self.closed_loop is None:
            return ()
        sides = self.closed_loop.high_pressure_reliefs
        return (("A", self.relief_setting if sides.side_a is None else sides.side_a),
                ("B", self.relief_setting if sides.side_b is None else sides.side_b))


@dataclass(frozen=True)
class Rating:
    continuous_pressure: float | None = None
    peak_pressure: float | None = None
    min_speed: float | None = None
    max_speed: float | None = None
    max_outlet_pressure: float | None = None
    max_case_pressure: float | None = None
    intermittent_pressure: float | None = None
    intermittent_share: float | None = None  # share of the time the intermittent rating may be used


@dataclass(frozen=True)
class EfficiencyTable:
    """The maker's efficiencies on a grid: rows by pressure differential (Pa), columns by speed (rev/s)."""

    pressures: tuple[float, ...]  # rising
    speeds: tuple[float, ...]  # rising
    volumetric: tuple[tuple[float, ...], ...]  # [pressure][speed]
    hydromechanical: tuple[tuple[float, ...], ...]
    starting: tuple[float, ...] | None = None  # per pressure, at zero speed


@dataclass(frozen=True)
class Motor:
    kind: str
    model: str
    displacement_min: float
    displacement_max: float
    over_centre: bool
    volumetric_efficiency: Ratio
    hydromechanical_efficiency: Ratio
    starting_efficiency: Ratio
    rating: Rating
    case_drain: bool
    target_pressure: float | None = None  # Pa, inlet pressure to size the displacement for
    efficiency_table: EfficiencyTable | None = None

    @property
    def variable(self) -> bool:
        return self.displacement_min != self.displacement_max

    @property
    def displacement_given(self) -> bool:
        return self.displacement_max is not None


@dataclass(frozen=True)
class GearStage:
    ratio: float
    efficiency: Ratio
    starting_efficiency: Ratio | None = None  # None: the running efficiency, marked assumed where used


@dataclass(frozen=True)
class WinchLoad:
    line_pull: float  # N
    line_speed: float  # m/s
    drum_diameter: float  # m
    rope_diameter: float  # m
    layer: int  # counted from 1, the first layer on the bare drum
    model: str = "winch"


@dataclass(frozen=True)
class WheelLoad:
    vehicle_mass: float  # kg
    rolling_resistance: float  # coefficient, dimensionless
    grade: float  # rad, positive uphill
    rolling_radius: float  # m (for a track: the sprocket pitch radius)
    driven_wheels: int
    travel_speed: float  # m/s
    acceleration: float = 0.0  # m/s^2
    grade_text: str = ""  # as written ("8 %" or "4 deg"), for the trace
    model: str = "wheel"


@dataclass(frozen=True)
class BeltLoad:
    belt_pull: float  # N, effective pull (tight side minus slack side)
    pulley_diameter: float  # m
    belt_speed: float  # m/s
    model: str = "belt"


@dataclass(frozen=True)
class SpeedSquaredLoad:
    reference_torque: float  # N*m
    reference_speed: float  # rev/s
    speed: float  # rev/s
    model: str = "speed_squared"


@dataclass(frozen=True)
class TrackTurnLoad:
    """One track of a skid-steered vehicle turning (calc/skid_steer.py): the vehicle's figures come from
    the spec's travel block, filled in when it is built (intake/build_travel.py)."""

    track: str  # "outer" or "inner" in the turn (a pivot turn: either, both need the same thrust)
    speed: float  # m/s: the vehicle's centre speed in a steady turn, each track's speed in a pivot turn
    turn_radius: float | None = None  # m, to the vehicle's centre line; None: a pivot turn
    vehicle_mass: float = math.nan  # kg, the whole vehicle
    rolling_resistance: float = math.nan  # f_r
    lateral_resistance: float = math.nan  # mu_t
    contact_length: float = math.nan  # m, each track on the ground
    tread: float = math.nan  # m, centre to centre of the tracks
    sprocket_radius: float = math.nan  # m, pitch radius
    model: str = "track_turn"

    @property
    def pivot(self) -> bool:
        return self.turn_radius is None


@dataclass(frozen=True)
class Inertia:
    load_inertia: float  # kg*m^2 at the load shaft
    ramp_time: float  # s, from rest to the duty speed (overrunning: from the duty speed to rest)
    motor_inertia: float = 0.0  # kg*m^2, motor rotor and fast side of the gear stage


@dataclass(frozen=True)
class DutyPoint:
    id: str
    title: str
    torque: float | None  # N*m at the load shaft, when given directly
    speed: float | None  # rev/s at the load shaft, when given directly
    direction: str | None  # "driving" or "overrunning"; as written (None: not given) until the load's
    # sign decides it (resolve/load.py), which every model past validation has done
    starting_torque: float | None
    load: WinchLoad | WheelLoad | BeltLoad | SpeedSquaredLoad | TrackTurnLoad | None = None
    inertia: Inertia | None = None
    displacement: float | None = None  # m^3/rev a variable motor is set to at this duty point
    duration: str = "continuous"  # "continuous", "intermittent" or "peak": the rating step it is checked at


@dataclass(frozen=True)
class DirectionalValve:
    """A drive's directional valve: pressure drops given at a rated flow (orifice law scales them)."""

    rated_flow: float  # m^3/s
    drop_to_motor: float = 0.0  # Pa at rated flow, supply port to motor port
    drop_to_tank: float = 0.0  # Pa at rated flow, motor port to tank port


@dataclass(frozen=True)
class Counterbalance:
    """Counterbalance (over-centre) valve on the load side of a motor."""

    setting: float  # Pa, opening pressure with no pilot pressure
    pilot_ratio: float  # k: the pilot pressure's advantage over the load-port pressure


@dataclass(frozen=True)
class Drive:
    id: str
    title: str
    supply: str
    motor: Motor
    gear: GearStage | None
    back_pressure: float | None
    case_pressure: float | None
    load_holding: str | None
    duty_points: tuple[DutyPoint, ...]
    notes: str = ""
    lines: Lines | None = None
    available_flow: float | None = None  # m^3/s the valve section gives at most; None: pump delivery
    port_relief: float | None = None  # Pa, port or crossover relief setting across the motor
    directional_valve: DirectionalValve | None = None
    counterbalance: Counterbalance | None = None

    @property
    def pump_fed_overrun(self) -> bool:
        """Does the pump fill the inlet of an overrunning duty point (lowering through a counterbalance
        valve), rather than makeup valves from the return line."""
        return self.counterbalance is not None or self.load_holding in (
            "counterbalance_valve", "counterbalance_valve_and_brake")

    def duty(self, duty_id: str) -> DutyPoint:
        return next(d for d in self.duty_points if d.id == duty_id)


@dataclass(frozen=True)
class Mode:
    id: str
    title: str
    running: tuple[tuple[str, str], ...]  # (drive id, duty point id)
    continuous: bool = False  # runs without end: its heat is checked as today even in a duty cycle
    prime_mover_speeds: tuple[tuple[str, str], ...] = ()  # (prime mover id, speed name); others at their default

    def speed_name(self, prime_mover_id: str) -> str | None:
        """The speed name this mode runs ``prime_mover_id`` at; None: the prime mover's default."""
        return next((name for pm, name in self.prime_mover_speeds if pm == prime_mover_id), None)


@dataclass(frozen=True)
class PowerPoint:
    """One point of a prime mover's power curve: the power it can give at a speed."""

    speed: float  # rev/s
    power: float  # W


@dataclass(frozen=True)
class PrimeMover:
    """An engine or electric motor that drives one or more pumps (supplies name it by id).

    ``speeds``: name -> rev/s in the spec's order; ``default_speed`` the name modes run at unless
    they name another (the one called ``rated``, else the only one). ``power_curve``: rising speeds;
    between its points the power is interpolated linearly, never extrapolated (every named speed lies
    on it, refused at intake otherwise). Without a curve the power is ``power`` at every speed.
    ``curve_basis``: the rated power as entered beside the curve; an operating corner that moves
    ``power`` scales the whole curve by power / curve_basis (a derated engine is derated at every speed)."""

    id: str
    title: str
    kind: str  # "engine" or "electric_motor"
    power: float  # W, rated
    speeds: dict[str, float]
    default_speed: str
    power_curve: tuple[PowerPoint, ...] = ()
    max_speed: float | None = None  # rev/s, overspeed limit
    motoring_torque: float | None = None  # N*m the prime mover can absorb when the pumps drive it
    curve_basis: float | None = None  # W

    def speed(self, name: str) -> float:
        return self.speeds[name]


@dataclass(frozen=True)
class Thresholds:
    pressure_margin_warn: Ratio = Ratio(0.10)
    flow_margin_warn: Ratio = Ratio(0.05)
    power_margin_warn: Ratio = Ratio(0.10)
    breakaway_margin_warn: Ratio = Ratio(0.10)
    speed_margin_warn: Ratio = Ratio(0.05)
    heat_margin_warn: Ratio = Ratio(0.10)
    counterbalance_factor: Ratio = Ratio(1.3)  # setting / highest load-induced pressure
    traction_margin_warn: Ratio = Ratio(0.10)


@dataclass(frozen=True)
class Sizing:
    """Where proposed displacements come from: an ISO 3 series, or a parts file's stocked sizes."""

    series: str = "R10"
    stock: dict | None = None  # motor kind -> tuple of stocked displacements (m^3/rev), sorted
    parts_file: str = ""  # as written in the spec
    tables: dict | None = None  # name -> EfficiencyTable, the parts file's efficiency_tables


@dataclass(frozen=True)
class Cooler:
    capacity: float  # W of heat the oil cooler rejects at the operating temperature (or at the ETD)
    entering_temperature_difference: float | None = None  # K, oil in minus ambient air the capacity is rated at


@dataclass(frozen=True)
class Reservoir:
    """The reservoir's natural dissipation and, with the oil and steel, the machine's heat capacity."""

    surface_area: float  # m^2 of wall and pipe giving heat to the air
    oil_mass: float  # kg
    steel_mass: float  # kg
    heat_transfer_coefficient: Ratio  # W/(m^2*K), carried as a Ratio so "assumed" travels with it


@dataclass(frozen=True)
class CycleStep:
    mode: str
    duration: float  # s


@dataclass(frozen=True)
class DutyCycle:
    """Modes in turn, repeated without end; time of the period no step covers puts no heat in."""

    id: str
    title: str
    steps: tuple[CycleStep, ...]
    period: float  # s, at least the sum of the steps

    @property
    def modes(self) -> set[str]:
        return {s.mode for s in self.steps}


@dataclass(frozen=True)
class Travel:
    """The machine as a vehicle: the drives that drive its wheels or tracks (one motor each) and what the
    ground and the transmission limit (calc/traction.py, calc/skid_steer.py)."""

    drives: tuple[str, ...]  # driven drive ids, one motor per wheel or sprocket
    running_gear: str  # "wheels" or "tracks"
    vehicle_mass: float  # kg
    driven_mass: float  # kg on the driven wheels or tracks (the whole vehicle unless given)
    rolling_radius: float  # m, wheel rolling radius or sprocket pitch radius
    adhesion: Ratio  # mu; assumed (low end of the typical range) when not given
    rolling_resistance: float  # f_r
    tread: float | None = None  # m, tracks: centre to centre
    contact_length: float | None = None  # m, tracks: each track on the ground
    lateral_resistance: float | None = None  # mu_t, tracks
    mode: str | None = None  # the mode whose prime mover power bounds the envelope; None: the first running a driven drive
    title: str = "Vehicle"


@dataclass(frozen=True)
class Machine:
    id: str
    title: str
    revision: str
    description: str
    display_units: str
    page_size: str
    signoff: dict = field(default_factory=dict)
    document_number: str = ""  # the drawing-register number of the printed report, if the firm uses one
    fluid: Fluid | None = None
    supplies: tuple[Supply, ...] = ()
    drives: tuple[Drive, ...] = ()
    modes: tuple[Mode, ...] = ()
    thresholds: Thresholds = Thresholds()
    sizing: Sizing = Sizing()
    cooler: Cooler | None = None
    reservoir: Reservoir | None = None
    duty_cycles: tuple[DutyCycle, ...] = ()
    ambient_temperature: float | None = None  # K
    max_oil_temperature: Ratio = Ratio(353.15)  # K, carried as a Ratio so "assumed" travels with it
    prime_movers: tuple[PrimeMover, ...] = ()  # shared by several supplies (Supply.prime_mover)
    travel: Travel | None = None  # the machine as a vehicle; None: no travel block

    # Indexes by id, built on first use: the checks look drives and supplies up inside loops over
    # every duty point, and a scan each time would make a 1,000-drive spec quadratic.
    @cached_property
    def _supplies_by_id(self) -> dict[str, Supply]:
        return {s.id: s for s in self.supplies}

    @cached_property
    def _drives_by_id(self) -> dict[str, Drive]:
        return {d.id: d for d in self.drives}

    @cached_property
    def _drive_positions(self) -> dict[str, int]:
        return {d.id: i for i, d in enumerate(self.drives)}

    def drive_position(self, drive_id: str) -> int:
        """Where the drive stands in the spec's order of drives (0 first)."""
        return self._drive_positions[drive_id]

    def supply(self, supply_id: str) -> Supply:
        return self._supplies_by_id[supply_id]

    def drive(self, drive_id: str) -> Drive:
        return self._drives_by_id[drive_id]

    def prime_mover(self, prime_mover_id: str) -> PrimeMover:
        return next(p for p in self.prime_movers if p.id == prime_mover_id)
