"""A small ordered collector of traced values, shared by the resolve steps."""

from __future__ import annotations

from specgen.intake.model import Ratio
from specgen.trace import Input, Value


class Record:
    """Traced values in the order they were computed; ``put`` returns the number for the next step.

    ``values``: key -> Value; ``per_drive``: drive id -> {key: Value} for values of one drive among
    several (``put(value, drive=...)``); ``order``: every key as put, (drive id, key) for the latter.
    """

    def __init__(self) -> None:
        self.values: dict[str, Value] = {}
        self.per_drive: dict[str, dict[str, Value]] = {}
        self.order: list = []

    def put(self, value: Value, drive: str | None = None) -> float:
        if drive is None:
            self.values[value.key] = value
            self.order.append(value.key)
        else:
            self.per_drive.setdefault(drive, {})[value.key] = value
            self.order.append((drive, value.key))
        return value.value

    def get(self, key: str) -> float | None:
        v = self.values.get(key)
        return None if v is None else v.value


def eff(symbol: str, label: str, r: Ratio, where: tuple[str, ...] = ()) -> Input:
    """An efficiency (or other ratio) as a trace input, carrying "assumed" along; ``where``: its spec path."""
    return Input(symbol, label, r.value, "ratio", r.assumed, where if r.assumed else (), r.basis if r.assumed else "")


MOTOR_EFFICIENCY = {"volumetric": ("eta_v", "volumetric efficiency"),
                    "hydromechanical": ("eta_hm", "hydro-mechanical efficiency"),
                    "starting": ("eta_start", "starting efficiency")}


def motor_eff(drive: str, which: str, r: Ratio) -> Input:
    """A motor efficiency of drive ``drive`` (``which``: a key of MOTOR_EFFICIENCY) as a trace input."""
    symbol, label = MOTOR_EFFICIENCY[which]
    return eff(symbol, label, r, ("drives", drive, "motor", "efficiency", which))
