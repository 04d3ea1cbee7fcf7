"""The one pint registry: parse text to SI floats by a field's meaning, format SI floats for display.

pint lives here and nowhere else. The computation core sees plain floats in these SI units:
pressure Pa, displacement m^3/rev, flow m^3/s, rotational speed rev/s, torque N*m, power W,
temperature K, and the base SI unit for every other kind below.
"""

from __future__ import annotations

import math
import os
import re
from dataclasses import dataclass
from functools import lru_cache


@dataclass(frozen=True)
class Kind:
    """What a field means: its dimension, the SI unit the core uses and an example for messages."""

    name: str
    dimensionality: str
    si_unit: str
    example: str
    angle_exponent: int | None = None  # radians expected in root units; None: not checked


KINDS: dict[str, Kind] = {
    k.name: k
    for k in [
        Kind("pressure", "[mass] / [length] / [time] ** 2", "Pa", "250 bar"),
        Kind("displacement", "[length] ** 3", "m**3/revolution", "160 cm^3"),
        Kind("flow", "[length] ** 3 / [time]", "m**3/s", "45 L/min"),
        Kind("speed", "1 / [time]", "revolution/s", "1500 rpm", angle_exponent=1),
        Kind("torque", "[mass] * [length] ** 2 / [time] ** 2", "N*m", "1.8 kN*m"),
        Kind("power", "[mass] * [length] ** 2 / [time] ** 3", "W", "55 kW"),
        Kind("ratio", "", "dimensionless", "92 %"),
        Kind("temperature", "[temperature]", "K", "50 degC"),
        Kind("density", "[mass] / [length] ** 3", "kg/m**3", "870 kg/m^3"),
        Kind("force", "[mass] * [length] / [time] ** 2", "N", "40 kN"),
        Kind("length", "[length]", "m", "450 mm"),
        Kind("velocity", "[length] / [time]", "m/s", "0.5 m/s"),
        Kind("acceleration", "[length] / [time] ** 2", "m/s**2", "0.3 m/s^2"),
        Kind("mass", "[mass]", "kg", "12 t"),
        Kind("inertia", "[mass] * [length] ** 2", "kg*m**2", "4.5 kg*m^2"),
        Kind("time", "[time]", "s", "3 s"),
        Kind("angle", "", "radian", "5 deg", angle_exponent=1),
        Kind("viscosity", "[length] ** 2 / [time]", "m**2/s", "46 mm^2/s"),
        Kind("number", "", "dimensionless", "2300"),  # a plain count or group (layers, Reynolds number)
    ]
}

# What each kind is shown in, per display system. Torque never as J (pint would simplify N*m to J).
DISPLAY: dict[str, dict[str, str]] = {
    "SI": {
        "pressure": "bar", "displacement": "cm^3/rev", "flow": "L/min", "speed": "rpm",
        "torque": "N*m", "power": "kW", "ratio": "%", "temperature": "degC",
        "density": "kg/m^3", "force": "kN", "length": "mm", "velocity": "m/s",
        "acceleration": "m/s^2", "mass": "kg", "inertia": "kg*m^2", "time": "s",
        "angle": "deg", "viscosity": "mm^2/s", "heat": "kW", "number": "",
    },
    "US": {
        "pressure": "psi", "displacement": "in^3/rev", "flow": "gpm", "speed": "rpm",
        "torque": "lbf*in", "power": "hp", "ratio": "%", "temperature": "degF",
        "density": "lb/ft^3", "force": "lbf", "length": "in", "velocity": "ft/s",
        "acceleration": "ft/s^2", "mass": "lb", "inertia": "lb*ft^2", "time": "s",
        "angle": "deg", "viscosity": "cSt", "heat": "hp", "number": "",
    },
}

# pint spellings of the display units above (kept apart so the shown text stays plain ASCII).
_PINT_SPELLING = {
    "cm^3/rev": "cm**3/revolution", "in^3/rev": "inch**3/revolution", "%": "percent",
    "degC": "degC", "degF": "degF", "kg/m^3": "kg/m**3", "lb/ft^3": "lb/ft**3",
    "m/s^2": "m/s**2", "ft/s^2": "ft/s**2", "kg*m^2": "kg*m**2", "lb*ft^2": "lb*ft**2",
    "mm^2/s": "mm**2/s", "cSt": "mm**2/s", "hp": "hp",
}

# Units that have the dimension of torque but mean energy: refused for torque fields.
_ENERGY_UNITS = {"joule", "watt_hour", "calorie", "british_thermal_unit", "electron_volt", "erg",
                 "kilowatt_hour", "thermochemical_calorie", "international_calorie", "watt_second"}

_NUMBER_THEN_UNIT = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


class UnitProblem(ValueError):
    """A value could not be read as the kind of quantity its field needs."""


# pint can keep its parsed unit definitions on disk (pint's own cache folder, ~/.cache/pint on
# Linux): building the registry then takes about 0.015 s instead of 0.1 s, a third of what
# `specgen check` adds on top of its imports. The cache is a pickle that pint names by its
# definitions' content and version, and writes in place: a run killed while writing it, or two
# first runs at once, can leave a short file, and a read-only home has no cache at all. Any such
# failure is caught and the registry built from the definitions instead (correct, only slower;
# delete the folder to rebuild it). SPECGEN_UNIT_CACHE=off never uses it; a folder path moves it.
UNIT_CACHE_ENV = "SPECGEN_UNIT_CACHE"


@lru_cache(maxsize=1)
def registry():
    """Build the application registry once per process, from pint's disk cache when it can."""
    import pint

    folder = os.environ.get(UNIT_CACHE_ENV, "").strip() or ":auto:"
    ureg = None
    if folder.lower() not in ("off", "0", "no", "false"):
        try:
            ureg = pint.UnitRegistry(cache_folder=folder, autoconvert_offset_to_baseunit=False)
        except Exception:  # unreadable, short or foreign cache, or no folder to write it: build anew
            ureg = None
    if ureg is None:
        ureg = pint.UnitRegistry(autoconvert_offset_to_baseunit=False)
    ureg.define("revolution_alias = revolution = rev")
    ureg.define("gpm = gallon / minute = usgpm")
    return ureg


def _describe_dimension(q) -> str:
    for kind in KINDS.values():
        if kind.dimensionality and q.dimensionality == registry().get_dimensionality(kind.dimensionality):
            return kind.name
    return str(q.dimensionality) or "a plain number"


@lru_cache(maxsize=4096)
def parse(text: object, kind_name: str) -> float:
    """Read ``text`` (e.g. "3625 psi") as a quantity of ``kind_name``; return the SI float.

    Raises UnitProblem with a sentence naming the value and the dimension expected.
    Ratios may be plain numbers (0.92) or percentages ("92 %").
    """
    kind = KINDS[kind_name]
    if isinstance(text, bool):
        raise UnitProblem(f"expected {kind.name} such as '{kind.example}', got {text!r}")
    if isinstance(text, (int, float)):
        if kind.name == "ratio":
            value = float(text)
            _finite(value, text)
            return value
        raise UnitProblem(f"'{text}' has no unit; write the {kind.name} with its unit, e.g. '{kind.example}'")
    if not isinstance(text, str) or not text.strip():
        raise UnitProblem(f"expected {kind.name} such as '{kind.example}', got {text!r}")
    if kind.name == "temperature":
        return _parse_temperature(text)
    quick = _number_times_unit(text, kind.name)
    return quick if quick is not None else _read(text, kind)


# "2.6 kN*m": a number, then unit names joined by * and / with small whole powers.
_PLAIN_UNIT = re.compile(r"[A-Za-z_%]+(?:\s*(?:\^|\*\*)\s*-?\d)?(?:\s*[*/]\s*[A-Za-z_%]+(?:\s*(?:\^|\*\*)\s*-?\d)?)*")


def _number_times_unit(text: str, kind_name: str) -> float | None:
    """The SI value of "number unit" as the number times the unit's cached factor, else None.

    pint takes about 0.3 ms to read one quantity, and a spec repeats a few units (bar, rpm,
    cm^3) many times over: reading each unit once per kind keeps the cost per value small.
    None sends the text the full way (any other form, or a unit that is not a plain scale).
    """
    m = _NUMBER_THEN_UNIT.match(text)
    if not m or not _PLAIN_UNIT.fullmatch(m.group(2)):
        return None
    factor = _unit_factor(m.group(2), kind_name)
    if factor is None:
        return None
    value = float(m.group(1)) * factor
    _finite(value, text)
    return value


@lru_cache(maxsize=None)
def _unit_factor(unit: str, kind_name: str) -> float | None:
    """SI value of one ``unit`` read as ``kind_name``; None if it fails or is not a plain scale.

    pint's converters are scales, offsets (degC) and logarithms (dB); only a scale reads 0 as 0.
    """
    kind = KINDS[kind_name]
    try:
        one, zero = _read(f"1 {unit}", kind), _read(f"0 {unit}", kind)
    except UnitProblem:
        return None  # the full reading of the text gives the message
    return one if zero == 0 else None


def _read(text: str, kind: Kind) -> float:
    q = _quantity(text)
    ureg = registry()
    if q.unitless and kind.name not in ("ratio", "angle"):
        raise UnitProblem(f"'{text}' has no unit; write the {kind.name} with its unit, e.g. '{kind.example}'")
    if kind.name in ("ratio", "angle"):
        if not q.dimensionless:
            raise UnitProblem(f"'{text}' is {_describe_dimension(q)}; expected {kind.name} such as '{kind.example}'")
        if kind.name == "angle" and not _has_angle(q):
            raise UnitProblem(f"'{text}' has no angle unit; write it as e.g. '{kind.example}'")
        value = float(q.to(kind.si_unit).magnitude)
    else:
        if q.dimensionality != ureg.get_dimensionality(kind.dimensionality):
            raise UnitProblem(
                f"'{text}' is {_describe_dimension(q)}; expected {kind.name} such as '{kind.example}'"
            )
        value = _to_si(q, kind, text)
    _finite(value, text)
    return value


def _quantity(text: str):
    ureg = registry()
    try:
        q = ureg.Quantity(text.strip())
    except Exception as exc:  # pint raises several unrelated types for unreadable text
        name = getattr(exc, "unit_names", None) or getattr(exc, "args", [""])[:1]
        detail = f"unknown unit {', '.join(map(str, name))!s}" if name else "unreadable"
        raise UnitProblem(f"'{text}' cannot be read as a quantity ({detail})") from None
    if not isinstance(q, ureg.Quantity):  # a bare number written as a string
        q = ureg.Quantity(float(q), "dimensionless")
    return q


def _has_angle(q) -> bool:
    return dict(q.to_root_units().units._units).get("radian", 0) != 0


def _to_si(q, kind: Kind, text: str) -> float:
    root_angle = dict(q.to_root_units().units._units).get("radian", 0)
    if kind.name == "speed":
        if root_angle != 1:
            raise UnitProblem(
                f"'{text}' gives no turns or angle per time; write rotational speed as e.g. '1500 rpm', '25 rev/s' or '157 rad/s'"
            )
        return float(q.to("revolution/s").magnitude)
    if kind.name == "displacement":
        if root_angle == 0:  # "160 cm^3" is taken as per revolution, as the trade writes it
            return float(q.to("m**3").magnitude)
        if root_angle == -1:
            return float(q.to("m**3/revolution").magnitude)
        raise UnitProblem(f"'{text}' is not a displacement per revolution, e.g. '{kind.example}'")
    if kind.name == "torque":
        names = set(q.units._units)
        if names & _ENERGY_UNITS or not any(
            registry().get_dimensionality(n) == registry().get_dimensionality("[length]") for n in names
        ):
            raise UnitProblem(f"'{text}' reads as energy; write torque as force times length, e.g. '{kind.example}'")
    return float(q.to(kind.si_unit).magnitude)


def _parse_temperature(text: str) -> float:
    # Offset units cannot be parsed as one expression ("55 degC" raises in pint): split first.
    m = _NUMBER_THEN_UNIT.match(text)
    if not m or not m.group(2):
        raise UnitProblem(f"'{text}' is not a temperature such as '50 degC'")
    ureg = registry()
    try:
        q = ureg.Quantity(float(m.group(1)), m.group(2))
        kelvin = float(q.to("K").magnitude)
    except Exception:
        raise UnitProblem(f"'{text}' is not a temperature such as '50 degC' (unknown or wrong unit)") from None
    if kelvin <= 0:
        raise UnitProblem(f"'{text}' is at or below absolute zero")
    return kelvin


def _finite(value: float, text: object) -> None:
    if not math.isfinite(value):
        raise UnitProblem(f"'{text}' is not a finite number")


@lru_cache(maxsize=None)
def _factor(kind_name: str, unit: str) -> tuple[float, float]:
    """Scale and offset taking the SI value of a kind to ``unit`` (offset only for temperature)."""
    ureg = registry()
    si = KINDS[kind_name].si_unit if kind_name in KINDS else "W"
    spelled = _PINT_SPELLING.get(unit, unit)
    if kind_name == "temperature":
        zero = ureg.Quantity(0.0, si).to(spelled).magnitude
        one = ureg.Quantity(1.0, si).to(spelled).magnitude
        return float(one - zero), float(zero)
    return float(ureg.Quantity(1.0, si).to(spelled).magnitude), 0.0


def display_unit(kind_name: str, system: str) -> str:
    return DISPLAY[system][kind_name]


def convert(value_si: float, kind_name: str, system: str) -> tuple[float, str]:
    """SI float -> (value, unit text) in the display system."""
    unit = display_unit(kind_name, system)
    scale, offset = _factor(kind_name, unit)
    return value_si * scale + offset, unit


def significant(value: float, digits: int = 4) -> str:
    """Fixed-point text with about ``digits`` significant figures, never in exponent form."""
    if value == 0 or not math.isfinite(value):
        return "0" if value == 0 else str(value)
    decimals = max(0, digits - 1 - int(math.floor(math.log10(abs(value)))))
    text = f"{value:.{decimals}f}"
    return "0" if float(text) == 0 else text


def format_si(value_si: float, kind_name: str, system: str) -> str:
    """e.g. format_si(25e6, "pressure", "SI") -> "250.0 bar"."""
    value, unit = convert(value_si, kind_name, system)
    return f"{significant(value)} {unit}".rstrip()
