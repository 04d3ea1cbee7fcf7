"""The one results object every output reads: computed values with traces, and checks."""

from __future__ import annotations

from dataclasses import dataclass, field

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

    def duty(self, drive: str, duty: str) -> DutyResult:
        return next(r for r in self.duties if r.drive == drive and r.duty == duty)

    def supply_mode(self, supply: str, mode: str) -> SupplyModeResult:
        return next(r for r in self.supply_modes if r.supply == supply and r.mode == mode)

    def counts(self) -> dict[str, int]:
        out = {"pass": 0, "warn": 0, "fail": 0}
        for c in self.checks:
            out[c.status] += 1
        return out

    @property
    def verdict(self) -> str:
        c = self.counts()
        return "fail" if c["fail"] else "warn" if c["warn"] else "pass"
