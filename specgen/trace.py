"""One record type for every computed number: what it is, how it was computed, from what."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Input:
    """One quantity a Value was computed from. An assumed input (a default, not the spec's figure)
    names the spec field it stands for (``where``, a path of keys) and what it rests on (``basis``)."""

    symbol: str
    label: str
    value: float  # SI
    kind: str  # a units.KINDS name
    assumed: bool = False
    where: tuple[str, ...] = ()  # spec path, e.g. ("drives", "hoist", "motor", "efficiency", "starting")
    basis: str = ""


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


def indexed(symbol: str, index: str) -> str:
    """Display symbol of one of several like quantities, e.g. ``indexed("q", "hoist")`` -> "q[hoist]".

    Only for showing a trace; results are keyed by id in mappings and never read back from a symbol.
    """
    return f"{symbol}[{index}]"


def given(key: str, label: str, symbol: str, value: float, kind: str, assumed: bool = False,
          note: str = "", where: tuple[str, ...] = (), basis: str = "") -> Value:
    """A value taken from the spec as entered (no formula)."""
    return Value(key, label, symbol, value, kind, words="as entered" if not assumed else "assumed",
                 inputs=(Input(symbol, label, value, kind, assumed, where, basis),) if assumed else (), note=note)
