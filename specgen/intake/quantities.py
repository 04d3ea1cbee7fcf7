"""Read quantities and ratios out of schema-valid spec data, collecting every problem with its place.

A ``Builder`` is handed to each topic builder (fluid, supplies, drives, loads, sizing): each value
is parsed to its SI float by kind (``units.parse``), checked for sign and range, and a refused
value becomes a Problem at ``file:line:col: dotted.path`` instead of stopping the build, so the
user sees every problem of the stage at once.

Example: ``Builder(source).quantity({"relief_setting": "250 bar"}, "relief_setting",
("supplies", "main"), "pressure")`` returns 25000000.0 (Pa) and records no problem.
"""

from __future__ import annotations

import math

from specgen import units
from specgen.errors import Problem
from specgen.intake.model import Ratio
from specgen.intake.read import Source, problem
from specgen.intake.schema import dotted

# Every SI value a quantity may take (Pa, m^3/rev, rev/s, N*m, W, K, kg/m^3): wide enough for any
# machine, narrow enough that products and quotients of a few of them stay finite floats.
SI_RANGE = (1e-12, 1e12)
MIN_EFFICIENCY = 0.01  # below 1 % no motor, pump or gear stage does useful work: a typing slip

class Builder:
    """Reads quantities out of schema-valid data, collecting every problem instead of stopping."""

    def __init__(self, source: Source):
        self.source = source
        self.problems: list[Problem] = []

    def fail(self, path: tuple, message: str) -> None:
        self.problems.append(problem(self.source.location(path), dotted(path), message))

    def quantity(self, data: dict, key: str, path: tuple, kind: str, sign: str = "positive",
                 default: float | None = None) -> float | None:
        """Parse data[key] as ``kind``; sign is 'positive', 'nonnegative' or 'any'."""
        if key not in data:
            return default
        here = path + (key,)
        value = self.parse(data[key], kind, here)
        if value is None:
            return default if default is not None else math.nan
        if sign == "positive" and value <= 0:
            self.fail(here, f"'{data[key]}' must be greater than zero")
        elif sign == "nonnegative" and value < 0:
            self.fail(here, f"'{data[key]}' must not be negative")
        elif value != 0 and not SI_RANGE[0] <= abs(value) <= SI_RANGE[1]:
            unit = units.KINDS[kind].si_unit.replace("**", "^")
            self.fail(here, f"'{data[key]}' is outside the range specgen computes with "
                            f"({SI_RANGE[0]:g} to {SI_RANGE[1]:g} {unit}); check the number and its unit")
        return value

    def parse(self, text: object, kind: str, here: tuple) -> float | None:
        """The SI value of ``text`` read as ``kind`` (``units.parse`` enforces the quantity grammar before
        pint sees the text); None, and a problem at ``here``, if refused."""
        try:
            return units.parse(text, kind)
        except units.UnitProblem as exc:
            self.fail(here, str(exc))
        except ArithmeticError:  # pint turns long digit strings into ints too large for a float
            self.fail(here, f"'{text}' is too large a number to compute with")
        return None

    def ratio(self, data: dict, key: str, path: tuple, default: float, basis: str = "",
              efficiency: bool = True) -> Ratio:
        if key not in data:
            return Ratio(default, assumed=bool(basis), basis=basis)
        here = path + (key,)
        value = self.parse(data[key], "ratio", here)
        if value is None:
            return Ratio(default)
        if efficiency and not 0 < value <= 1:
            self.fail(here, f"efficiency {data[key]!r} must lie in (0, 1], e.g. 0.92 or '92 %'")
        elif efficiency and value < MIN_EFFICIENCY:
            self.fail(here, f"efficiency {data[key]!r} is below {MIN_EFFICIENCY * 100:g} %; no working motor, pump "
                            "or gear stage is that poor: check the figure")
        elif not efficiency and not 0 <= value < 1:
            self.fail(here, f"{data[key]!r} must lie in [0, 1), e.g. 0.1 or '10 %'")
        return Ratio(value)
