"""The machine model: frozen dataclasses holding SI floats, in the order the spec wrote them.

Units: pressure Pa, displacement m^3/rev, flow m^3/s, speed rev/s, torque N*m, power W,
temperature K, density kg/m^3. A model is built only from a validated spec (see validate.py).
"""

from __future__ import annotations

from dataclasses import dataclass, field


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


@dataclass(frozen=True)
class Pump:
    displacement: float | None
    shaft_speed: float | None
    delivery: float | None
    volumetric_efficiency: Ratio
    overall_efficiency: Ratio


@dataclass(frozen=True)
class Supply:
    id: str
    title: str
    pump: Pump
    relief_setting: float
    return_pressure: float
    prime_mover_power: float | None


@dataclass(frozen=True)
class Rating:
    continuous_pressure: float | None = None
    peak_pressure: float | None = None
    min_speed: float | None = None
    max_speed: float | None = None
    max_outlet_pressure: float | None = None
    max_case_pressure: float | None = None


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

    @property
    def variable(self) -> bool:
        return self.displacement_min != self.displacement_max


@dataclass(frozen=True)
class GearStage:
    ratio: float
    efficiency: Ratio


@dataclass(frozen=True)
class DutyPoint:
    id: str
    title: str
    torque: float
    speed: float
    direction: str  # "driving" or "overrunning"
    starting_torque: float | None


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

    def duty(self, duty_id: str) -> DutyPoint:
        return next(d for d in self.duty_points if d.id == duty_id)


@dataclass(frozen=True)
class Mode:
    id: str
    title: str
    running: tuple[tuple[str, str], ...]  # (drive id, duty point id)


@dataclass(frozen=True)
class Thresholds:
    pressure_margin_warn: Ratio = Ratio(0.10)
    flow_margin_warn: Ratio = Ratio(0.05)
    power_margin_warn: Ratio = Ratio(0.10)
    breakaway_margin_warn: Ratio = Ratio(0.10)
    speed_margin_warn: Ratio = Ratio(0.05)


@dataclass(frozen=True)
class Machine:
    id: str
    title: str
    revision: str
    description: str
    display_units: str
    page_size: str
    signoff: dict = field(default_factory=dict)
    fluid: Fluid | None = None
    supplies: tuple[Supply, ...] = ()
    drives: tuple[Drive, ...] = ()
    modes: tuple[Mode, ...] = ()
    thresholds: Thresholds = Thresholds()

    def supply(self, supply_id: str) -> Supply:
        return next(s for s in self.supplies if s.id == supply_id)

    def drive(self, drive_id: str) -> Drive:
        return next(d for d in self.drives if d.id == drive_id)
