"""The one results object every output reads: computed values with traces, and checks.

Results are keyed by id: a supply-mode's per-drive values sit in a mapping by drive id, a mode's
heat load keeps its parts by supply id, and a drive's duty results are found by drive and duty id.
No id is ever read back out of a symbol or a label.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property

from specgen.trace import Input, Value

__all__ = ["Check", "Contribution", "CornerResult", "CycleResult", "DriveResult", "DutyResult", "FluidResult",
           "ModeResult", "PrimeMoverModeResult", "Results",
           "SupplyModeResult", "SupplyResult", "TravelResult"]


SEVERITY = ("pass", "warn", "fail")  # least to most severe
RANK = {s: n for n, s in enumerate(SEVERITY)}


def most_severe(statuses) -> str:
    """The most severe of ``statuses`` ("pass" when there are none)."""
    return max(statuses, key=RANK.__getitem__, default="pass")


@dataclass(frozen=True)
class Check:
    """One verdict. ``value`` and ``limit`` are SI floats of ``kind`` (None where not numeric);
    ``margin`` is the signed fraction the module docstring defines for the check's id."""

    id: str
    title: str
    status: str  # "pass", "warn" or "fail"
    value: float | None
    limit: float | None
    kind: str
    message: str
    drive: str | None = None
    duty: str | None = None
    supply: str | None = None
    mode: str | None = None
    margin: float | None = None
    corner: str | None = None  # the operating corner this verdict was found at; None: the nominal point
    cycle: str | None = None  # a duty cycle's id, for the checks judged over a cycle
    prime_mover: str | None = None  # a shared prime mover's id, for the checks judged on it

    @property
    def where(self) -> str:
        parts = [f"{k} {v}" for k, v in (("drive", self.drive), ("duty point", self.duty),
                                          ("supply", self.supply), ("prime mover", self.prime_mover),
                                          ("mode", self.mode),
                                          ("duty cycle", self.cycle)) if v]
        return ", ".join(parts)

    @property
    def name(self) -> str:
        """The check id, where it applies and the corner it was found at, as one line."""
        return (f"{self.id} ({self.where})" if self.where else self.id) + (
            f" [at corner {self.corner}]" if self.corner else "")


class _ValuesByKey:
    """``result[key]`` is the SI number of ``result.values[key]``; ``trace`` is every value in order."""

    values: dict[str, Value]

    def __getitem__(self, key: str) -> float:
        return self.values[key].value

    @property
    def trace(self) -> dict:
        """Every value of this result in the order computed (here: ``values``)."""
        return self.values


@dataclass(frozen=True)
class DutyResult(_ValuesByKey):
    drive: str
    duty: str
    direction: str
    values: dict[str, Value]  # ordered as computed


@dataclass(frozen=True)
class Contribution:
    drive: str
    duty: str
    flow: float  # m^3/s


@dataclass(frozen=True)
class SupplyModeResult(_ValuesByKey):
    """A supply in one mode. ``values``: the supply's own; ``per_drive``: drive id -> {key: Value}
    for what belongs to one running drive (series inlet and outlet pressure, makeup flow left)."""

    supply: str
    mode: str
    contributions: tuple[Contribution, ...]
    values: dict[str, Value]
    per_drive: dict[str, dict[str, Value]] = field(default_factory=dict)
    order: tuple = ()  # keys in the order computed: a key of values, or (drive id, key) of per_drive

    def drive_value(self, drive: str, key: str) -> Value | None:
        return self.per_drive.get(drive, {}).get(key)

    @property
    def trace(self) -> dict:
        """Every value in the order computed, the per-drive ones keyed (drive id, key)."""
        if not self.order:
            return self.values
        return {k: self.per_drive[k[0]][k[1]] if isinstance(k, tuple) else self.values[k] for k in self.order}


@dataclass(frozen=True)
class DriveResult(_ValuesByKey):
    """Values that belong to a drive as a whole: sizing, a variable motor's limits and envelope."""

    drive: str
    values: dict[str, Value]
    envelope: tuple = ()  # calc.variable.EnvelopePoint rows at the relief setting, smallest displacement first
    proposed_from: str | None = None  # where a proposed size comes from: a series name ("R10") or "stocked"


@dataclass(frozen=True)
class SupplyResult(_ValuesByKey):
    """A supply across all modes: pump shaft speed and full delivery, and its worst modes by name."""

    supply: str
    values: dict[str, Value]
    worst_power_mode: str | None = None  # mode taking the most pump input power
    worst_heat_mode: str | None = None  # mode putting the most heat into the oil


@dataclass(frozen=True)
class ModeResult(_ValuesByKey):
    """A mode across all supplies: the heat load all supplies put into the one reservoir."""

    mode: str
    values: dict[str, Value]
    heat_by_supply: dict[str, float] = field(default_factory=dict)  # supply id -> its heat load, W


@dataclass(frozen=True)
class PrimeMoverModeResult(_ValuesByKey):
    """A shared prime mover in one mode (resolve/prime_mover.py). ``values``: its own (speed, power and
    torque available, summed power and torque); ``per_supply``: supply id -> {key: Value} for each pump on
    it that runs in the mode (pump speed, input power, torque at the prime mover's shaft)."""

    prime_mover: str
    mode: str
    speed_name: str
    values: dict[str, Value]
    per_supply: dict[str, dict[str, Value]] = field(default_factory=dict)

    @property
    def trace(self) -> dict:
        """Every value: the pumps' first (supply id, key), then the prime mover's own."""
        out: dict = {(sid, k): v for sid, vals in self.per_supply.items() for k, v in vals.items()}
        out.update(self.values)
        return out


@dataclass(frozen=True)
class FluidResult(_ValuesByKey):
    """Viscosity and density at the operating temperature (no values without a fluid)."""

    values: dict[str, Value] = field(default_factory=dict)


@dataclass(frozen=True)
class CornerResult:
    """Every check at one operating corner (specgen/corners.py), each with ``corner`` set to ``id``.

    ``overrides``: (spec path or group, what it does as text) in the spec's order; ``modes``: the
    modes the corner applies to (empty: every mode); ``basis``: where assumed values come from."""

    id: str
    title: str
    modes: tuple[str, ...]
    overrides: tuple[tuple[str, str], ...]
    checks: tuple[Check, ...]
    assumed: bool = False
    basis: str = ""

    def counts(self) -> dict[str, int]:
        out = dict.fromkeys(SEVERITY, 0)
        for c in self.checks:
            out[c.status] += 1
        return out

    @property
    def verdict(self) -> str:
        return most_severe(c.status for c in self.checks)


@dataclass(frozen=True)
class CycleResult(_ValuesByKey):
    """A duty cycle repeated without end: mean and peak heat, mean prime-mover power per supply, the share
    of the cycle each running drive spends above its continuous pressure rating, and the oil temperature.

    ``values``: the cycle's own (heat, dissipation, temperatures) in the order computed; ``per_supply``:
    supply id -> mean prime-mover power (W); ``above_continuous``: drive id -> time share above the motor's
    continuous pressure rating (only drives with a rating); ``series``: (time s, oil temperature K) pairs
    of the warm-up from ambient, for the chart (empty without an oil-temperature model); ``settled``: the
    warm-up reached a repeating cycle before its cap; ``missing``: why no oil temperature was computed.
    """

    cycle: str
    values: dict[str, Value]
    per_supply: dict[str, float] = field(default_factory=dict)
    above_continuous: dict[str, float] = field(default_factory=dict)
    series: tuple[tuple[float, float], ...] = ()
    settled: bool = True
    missing: str = ""


@dataclass(frozen=True)
class TravelResult(_ValuesByKey):
    """The machine as a vehicle (resolve/travel.py): ``values`` the vehicle's own (adhesion limit, effort at
    the pressure limit, top speed, engine power, corner power) in the order computed; ``per_drive``: drive
    id -> {key: Value} of each driven drive's share; ``duties``: (drive id, duty id) -> {key: Value} of each
    travel duty point (ground speed, tractive effort, its limits); ``lines``: (drive id, duty id) -> the
    envelope line that sets the effort at its speed (None for a braking duty point); ``envelope``: calc.traction.EnvelopePoint rows from
    standstill to the top speed."""

    values: dict[str, Value]
    per_drive: dict[str, dict[str, Value]] = field(default_factory=dict)
    duties: dict[tuple[str, str], dict[str, Value]] = field(default_factory=dict)
    lines: dict[tuple[str, str], str | None] = field(default_factory=dict)
    envelope: tuple = ()


# The order assumed values are listed in within one supply, drive or the fluid: the spec's own order.
ASSUMED_FIELDS = (("pump", "volumetric_efficiency"), ("pump", "overall_efficiency"),
                  ("motor", "efficiency", "volumetric"), ("motor", "efficiency", "hydromechanical"),
                  ("motor", "efficiency", "starting"), ("gear_stage", "efficiency"),
                  ("viscosity_100c",), ("density",), ("heat_transfer_coefficient",), ("max_oil_temperature",))
_OWNED = ("supplies", "drives")  # spec sections whose second key is an id


@dataclass(frozen=True)
class Results:
    duties: tuple[DutyResult, ...]
    supply_modes: tuple[SupplyModeResult, ...]
    checks: tuple[Check, ...] = field(default=())
    drives: tuple[DriveResult, ...] = ()
    supplies: tuple[SupplyResult, ...] = ()
    modes: tuple[ModeResult, ...] = ()
    fluid: FluidResult = field(default_factory=FluidResult)
    corners: tuple[CornerResult, ...] = ()  # each corner's checks; ``checks`` holds each at its worst
    cycles: tuple[CycleResult, ...] = ()
    prime_movers: tuple[PrimeMoverModeResult, ...] = ()  # each shared prime mover in each mode it runs

    def prime_mover_mode(self, prime_mover: str, mode: str) -> PrimeMoverModeResult | None:
        return next((r for r in self.prime_movers if r.prime_mover == prime_mover and r.mode == mode), None)
    travel: TravelResult | None = None  # the machine as a vehicle; None without a travel block

    def cycle_result(self, cycle: str) -> CycleResult | None:
        return next((c for c in self.cycles if c.cycle == cycle), None)

    def drive_result(self, drive: str) -> DriveResult | None:
        return self._drives_by_id.get(drive)

    def supply_result(self, supply: str) -> SupplyResult | None:
        return self._supplies_by_id.get(supply)

    def mode_result(self, mode: str) -> ModeResult | None:
        return self._modes_by_id.get(mode)

    def drive_duties(self, drive: str) -> dict[str, DutyResult]:
        """The duty results of one drive keyed by duty id, in the spec's order (empty for no drive)."""
        return self.duties_by_drive.get(drive, {})

    # Indexes built on first use, so lookups inside loops over every duty point stay linear.
    @cached_property
    def duties_by_drive(self) -> dict[str, dict[str, DutyResult]]:
        """drive id -> {duty id -> DutyResult}."""
        out: dict[str, dict[str, DutyResult]] = {}
        for r in self.duties:
            out.setdefault(r.drive, {})[r.duty] = r
        return out

    @cached_property
    def _drives_by_id(self) -> dict[str, DriveResult]:
        return {r.drive: r for r in self.drives}

    @cached_property
    def _supplies_by_id(self) -> dict[str, SupplyResult]:
        return {r.supply: r for r in self.supplies}

    @cached_property
    def _modes_by_id(self) -> dict[str, ModeResult]:
        return {r.mode: r for r in self.modes}

    @cached_property
    def _supply_modes_by_id(self) -> dict[tuple[str, str], SupplyModeResult]:
        return {(r.supply, r.mode): r for r in self.supply_modes}

    def duty(self, drive: str, duty: str) -> DutyResult:
        return self.duties_by_drive[drive][duty]

    def supply_mode(self, supply: str, mode: str) -> SupplyModeResult:
        return self._supply_modes_by_id[(supply, mode)]

    def assumed(self) -> list[Input]:
        """Every assumed input the computed values rest on, once each (by the spec field it stands for).

        Walks every Value's inputs: each supply (its own values, then its modes), each drive (its own
        values, then its duty points), each mode, the fluid. Listed by supply, drive, fluid in that
        order and within each in the spec's order of fields (ASSUMED_FIELDS). An assumed input that
        names no spec field is left out: it marks a value as resting on another listed assumption.
        """
        found: dict[tuple, Input] = {}
        for values in self._every_group():
            for v in values:
                for i in v.inputs:
                    if i.assumed and i.where:
                        found.setdefault(i.where, i)
        owners: dict[tuple, int] = {}

        def order(i: Input) -> tuple[int, int]:
            split = 2 if i.where[0] in _OWNED else 1
            owner, rest = i.where[:split], i.where[split:]
            rank = ASSUMED_FIELDS.index(rest) if rest in ASSUMED_FIELDS else len(ASSUMED_FIELDS)
            return owners.setdefault(owner, len(owners)), rank

        return sorted(found.values(), key=order)

    def _every_group(self):
        modes_by_supply: dict[str, list[SupplyModeResult]] = {s.supply: [] for s in self.supplies}
        for r in self.supply_modes:
            modes_by_supply.setdefault(r.supply, []).append(r)
        for supply, modes in modes_by_supply.items():
            whole = self.supply_result(supply)
            if whole is not None:
                yield whole.values.values()
            yield (v for r in modes for v in r.trace.values())
        for drive, duties in self.duties_by_drive.items():
            whole = self.drive_result(drive)
            if whole is not None:
                yield whole.values.values()
            yield (v for r in duties.values() for v in r.values.values())
        for m in self.modes:
            yield m.values.values()
        yield self.fluid.values.values()
        for c in self.cycles:
            yield c.values.values()
        for r in self.prime_movers:
            yield r.trace.values()
        if self.travel is not None:
            yield self.travel.values.values()
            yield (v for group in (*self.travel.per_drive.values(), *self.travel.duties.values())
                   for v in group.values())

    def counts(self) -> dict[str, int]:
        out = dict.fromkeys(SEVERITY, 0)
        for c in self.checks:
            out[c.status] += 1
        return out

    @property
    def verdict(self) -> str:
        return most_severe(c.status for c in self.checks)
