"""One record type for every computed number: what it is, how it was computed, from what."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Input:
    symbol: str
    label: str
    value: float  # SI
    kind: str  # a units.KINDS name
    assumed: bool = False


@dataclass(frozen=True)
class Value:
    """A computed quantity in SI with its trace. ``formula`` is symbolic, ``words`` in plain text."""

    key: str
    label: str
    symbol: str
    value: float
    kind: str
    formula: str = ""
    words: str = ""
    inputs: tuple[Input, ...] = ()
    source: str = ""
    note: str = ""

    @property
    def assumed(self) -> bool:
        return any(i.assumed for i in self.inputs)


def given(key: str, label: str, symbol: str, value: float, kind: str, assumed: bool = False,
          note: str = "") -> Value:
    """A value taken from the spec as entered (no formula)."""
    return Value(key, label, symbol, value, kind, words="as entered" if not assumed else "assumed",
                 inputs=(Input(symbol, label, value, kind, assumed),) if assumed else (), note=note)
