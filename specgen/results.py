"""The one results object every output reads: computed values with traces, and checks."""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property

from specgen.trace import Value


@dataclass(frozen=True)
class DutyResult:
    drive: str
    duty: str
    direction: str
    values: dict[str, Value]  # ordered as computed

    def __getitem__(self, key: str) -> float:
        return self.values[key].value


@dataclass(frozen=True)
class Contribution:
    drive: str
    duty: str
    flow: float  # m^3/s


@dataclass(frozen=True)
class SupplyModeResult:
    supply: str
    mode: str
    contributions: tuple[Contribution, ...]
    values: dict[str, Value]

    def __getitem__(self, key: str) -> float:
        return self.values[key].value


class _ValuesByKey:
    """``result[key]`` is the SI number of ``result.values[key]``."""

    values: dict[str, Value]

    def __getitem__(self, key: str) -> float:
        return self.values[key].value


@dataclass(frozen=True)
class DriveResult(_ValuesByKey):
    """Values that belong to a drive as a whole: sizing, a variable motor's limits and envelope."""

    drive: str
    values: dict[str, Value]
    envelope: tuple = ()  # calc.variable.EnvelopePoint rows at the relief setting, smallest displacement first


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


@dataclass(frozen=True)
class Check:
    """One verdict. ``value`` and ``limit`` are SI floats of ``kind`` (None where not numeric)."""

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

    @property
    def where(self) -> str:
        parts = [f"{k} {v}" for k, v in (("drive", self.drive), ("duty point", self.duty),
                                          ("supply", self.supply), ("mode", self.mode)) if v]
        return ", ".join(parts)


@dataclass(frozen=True)
class Results:
    duties: tuple[DutyResult, ...]
    supply_modes: tuple[SupplyModeResult, ...]
    checks: tuple[Check, ...] = field(default=())
    drives: tuple[DriveResult, ...] = ()
    supplies: tuple[SupplyResult, ...] = ()
    modes: tuple[ModeResult, ...] = ()
    fluid: dict[str, Value] = field(default_factory=dict)  # viscosity and density at the operating temperature

    def drive_result(self, drive: str) -> DriveResult | None:
        return self._drives_by_id.get(drive)

    def supply_result(self, supply: str) -> SupplyResult | None:
        return self._supplies_by_id.get(supply)

    def mode_result(self, mode: str) -> ModeResult | None:
        return self._modes_by_id.get(mode)

    # Indexes built on first use, so lookups inside loops over every duty point stay linear.
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
    def _duties_by_id(self) -> dict[tuple[str, str], DutyResult]:
        return {(r.drive, r.duty): r for r in self.duties}

    @cached_property
    def _supply_modes_by_id(self) -> dict[tuple[str, str], SupplyModeResult]:
        return {(r.supply, r.mode): r for r in self.supply_modes}

    def duty(self, drive: str, duty: str) -> DutyResult:
        return self._duties_by_id[(drive, duty)]

    def supply_mode(self, supply: str, mode: str) -> SupplyModeResult:
        return self._supply_modes_by_id[(supply, mode)]

    def counts(self) -> dict[str, int]:
        out = {"pass": 0, "warn": 0, "fail": 0}
        for c in self.checks:
            out[c.status] += 1
        return out

    @property
    def verdict(self) -> str:
        c = self.counts()
        return "fail" if c["fail"] else "warn" if c["warn"] else "pass"
