"""A small ordered collector of traced values, shared by the resolve steps."""

from __future__ import annotations

from specgen.intake.model import Ratio
from specgen.trace import Input, Value


class Record:
    """Traced values in the order they were computed; ``put`` returns the number for the next step."""

    def __init__(self) -> None:
        self.values: dict[str, Value] = {}

    def put(self, value: Value) -> float:
        self.values[value.key] = value
        return value.value

    def get(self, key: str) -> float | None:
        v = self.values.get(key)
        return None if v is None else v.value


def eff(symbol: str, label: str, r: Ratio) -> Input:
    """An efficiency (or other ratio) as a trace input, carrying "assumed" along."""
    return Input(symbol, label, r.value, "ratio", r.assumed)
