"""The kinds of quantity a spec field can hold, their SI and display units, and the one pint registry.

Data and the registry only: specgen/units.py parses and formats with them, specgen/unit_hints.py
words its suggestions with them.
"""

from __future__ import annotations

import os
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
        Kind("area", "[length] ** 2", "m**2", "2.5 m^2"),
        Kind("volume", "[length] ** 3", "m**3", "400 L"),
        Kind("temperature_difference", "[temperature]", "K", "40 K"),
        Kind("heat_transfer_coefficient", "[mass] / [time] ** 3 / [temperature]", "W/(m**2*K)", "12 W/m^2/K"),
        Kind("thermal_conductance", "[mass] * [length] ** 2 / [time] ** 3 / [temperature]", "W/K", "400 W/K"),
        Kind("heat_capacity", "[mass] * [length] ** 2 / [time] ** 2 / [temperature]", "J/K", "450 kJ/K"),
        Kind("specific_heat", "[length] ** 2 / [time] ** 2 / [temperature]", "J/(kg*K)", "1.9 kJ/kg/K"),
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
        "area": "m^2", "volume": "L", "temperature_difference": "K", "heat_transfer_coefficient": "W/(m^2*K)",
        "thermal_conductance": "W/K", "heat_capacity": "kJ/K", "specific_heat": "kJ/(kg*K)",
    },
    "US": {
        "pressure": "psi", "displacement": "in^3/rev", "flow": "gpm", "speed": "rpm",
        "torque": "lbf*in", "power": "hp", "ratio": "%", "temperature": "degF",
        "density": "lb/ft^3", "force": "lbf", "length": "in", "velocity": "ft/s",
        "acceleration": "ft/s^2", "mass": "lb", "inertia": "lb*ft^2", "time": "s",
        "angle": "deg", "viscosity": "cSt", "heat": "hp", "number": "",
        "area": "ft^2", "volume": "gal", "temperature_difference": "K", "heat_transfer_coefficient": "W/(m^2*K)",
        "thermal_conductance": "W/K", "heat_capacity": "kJ/K", "specific_heat": "kJ/(kg*K)",
    },
}

# pint spellings of the display units above (kept apart so the shown text stays plain ASCII).
_PINT_SPELLING = {
    "cm^3/rev": "cm**3/revolution", "in^3/rev": "inch**3/revolution", "%": "percent",
    "degC": "degC", "degF": "degF", "kg/m^3": "kg/m**3", "lb/ft^3": "lb/ft**3",
    "m/s^2": "m/s**2", "ft/s^2": "ft/s**2", "kg*m^2": "kg*m**2", "lb*ft^2": "lb*ft**2",
    "mm^2/s": "mm**2/s", "cSt": "mm**2/s", "hp": "hp",
    "m^2": "m**2", "ft^2": "ft**2", "W/(m^2*K)": "W/(m**2*K)", "kJ/(kg*K)": "kJ/(kg*K)",
}

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
