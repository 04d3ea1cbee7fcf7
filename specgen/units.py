"""Parse text to SI floats by a field's meaning, format SI floats for display.

pint lives here and in unit_kinds.py (the kinds and the one registry) and nowhere else. The
computation core sees plain floats in these SI units: pressure Pa, displacement m^3/rev, flow
m^3/s, rotational speed rev/s, torque N*m, power W, temperature K, and the base SI unit for every
other kind below.

What a quantity may be written as (checked by ``parse`` before pint sees the text, so no unit
text is ever evaluated as arithmetic)::

    quantity := number [unit]              spaces or tabs allowed around both
    number   := [+|-] digits [. [digits]] [exponent]  |  [+|-] . digits [exponent]
    exponent := (e|E) [+|-] digits         digits are 0-9 only
    unit     := %  |  term (joiner term)*  "%" only alone, as the whole unit
    joiner   := *  |  /  |  ·  |  spaces
    term     := name [power]               name: letters, _, µ, ° (no digits); not a bare
                                           number such as pi
    power    := (^ | **) [-] digit         a small whole power 1 to 9, e.g. cm^3, m/s^2, s^-1,
              | [⁻] superscript digit      or as a data sheet prints it: cm³, s⁻¹
    spaces   := space, tab, no-break space (U+00A0, U+202F) or thin space (U+2009); a line
                break only at either end (a block scalar's)

Examples that pass: "250 bar", "9.5 mm", "-3e2 Pa", "160 cm^3/rev", "1.8 kN*m", "45 L/min",
"1200 lbf*in", "92 %", "4.5 kg*m^2". Refused, with a hint: "9,5 mm" (the decimal mark is a
point), "1:4" (a ratio is one number, 0.25 or 4), "1500 psi 2" (two numbers), "200 bar + 7 bar",
"25 MPa-bar", "1.2 kN*m*2" (arithmetic), "500 bar%" (% not alone), "100 pi*bar" (pi is a number).
"""

from __future__ import annotations

import math
import re
from functools import lru_cache

from specgen.unit_kinds import _PINT_SPELLING, DISPLAY, KINDS, UNIT_CACHE_ENV, Kind, registry  # noqa: F401


# Temperature units whose difference is read as a difference (the scale, never the offset).
_DELTA = {"K": 1.0, "degC": 1.0, "°C": 1.0, "kelvin": 1.0, "degF": 5.0 / 9.0, "°F": 5.0 / 9.0}

# Units that have the dimension of torque but mean energy: refused for torque fields.
_ENERGY_UNITS = {"joule", "watt_hour", "calorie", "british_thermal_unit", "electron_volt", "erg",
                 "kilowatt_hour", "thermochemical_calorie", "international_calorie", "watt_second"}


class UnitProblem(ValueError):
    """A value could not be read as the kind of quantity its field needs."""


def _describe_dimension(q) -> str:
    from specgen.unit_hints import dimension_words

    for kind in KINDS.values():
        if kind.dimensionality and q.dimensionality == registry().get_dimensionality(kind.dimensionality):
            return kind.name
    return dimension_words(q.dimensionality)


def _wrong_kind(text: str, q, kind: Kind, unit: str) -> UnitProblem:
    """'250 rpm' is speed; expected pressure ... / '9 kNm' is not a torque: it reads as length per mass.

    A unit of another kind is a plain mistake of field; only a unit of no kind gets a spelling hint
    (worked out only here, as fields of no single kind try every kind in turn)."""
    from specgen.unit_hints import did_you_mean

    named = next((k.name for k in KINDS.values() if k.dimensionality
                  and q.dimensionality == registry().get_dimensionality(k.dimensionality)), None)
    if named:
        return UnitProblem(f"'{text}' is {named}; expected {kind.name} such as '{kind.example}'")
    hint = "" if q.dimensionless else did_you_mean(text, unit, kind.name)
    return UnitProblem(f"'{text}' is not a {kind.name}: it reads as {_describe_dimension(q)}"
                       + (hint or f"; write it as e.g. '{kind.example}'"))


# The grammar in the module text, as regular expressions on ASCII digits and spaces only
# (Python's \d and \s would also take Arabic-Indic digits and line separators).
_SP = "[ \t\u00a0\u2009\u202f]"  # a space, a tab, and the no-break and thin spaces pasted from data sheets
_NUMBER = r"[-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?"
_NAME = "[A-Za-z\u00b5\u03bc\u00b0][A-Za-z_\u00b5\u03bc\u00b0]*"
_SUPERSCRIPT = "\u207b?[\u00b9\u00b2\u00b3\u2074-\u2079]"  # cm³, s⁻¹ as a data sheet prints them
_TERM = f"{_NAME}(?:{_SP}*(?:\\^|\\*\\*){_SP}*-?[1-9](?![0-9])|{_SUPERSCRIPT}(?![\u00b9\u00b2\u00b3\u2070-\u2079]))?"
_UNIT = f"%|{_TERM}(?:(?:{_SP}*[*/\u00b7]{_SP}*|{_SP}+){_TERM})*"
_ENDS = "[ \t\r\n\u00a0\u2009\u202f]*"  # a quoted or block scalar may carry a line break at either end
_QUANTITY = re.compile(f"{_ENDS}({_NUMBER}){_SP}*({_UNIT})?{_ENDS}")
_UNIT_CHARACTER = re.compile(f"[A-Za-z_\u00b5\u03bc\u00b0%*/\u00b7^0-9 \t\r\n\u00a0\u2009\u202f\u00b9\u00b2\u00b3\u2070-\u2079\u207b]")
_PLAIN_POWER = str.maketrans("\u207b\u00b9\u00b2\u00b3\u2074\u2075\u2076\u2077\u2078\u2079\u00a0\u2009\u202f",
                             "-123456789   ")
_NAMES = re.compile(_NAME)
_NOT_FINITE = re.compile(f"{_SP}*[-+]?(?:nan|inf(?:inity)?)(?![A-Za-z])", re.IGNORECASE)
_DECIMAL_COMMA = re.compile(f"{_SP}*([-+]?[0-9]+),([0-9]+)")
_COLON_RATIO = re.compile(f"{_SP}*([0-9]+(?:\\.[0-9]*)?){_SP}*:{_SP}*([0-9]+(?:\\.[0-9]*)?){_SP}*")
_OPERATOR = re.compile("[-+=()\\[\\]{}<>!&|,;:#@$\\\\]")


def grammar_problem(text: str, kind_name: str = "") -> str | None:
    """Why ``text`` is not one number and a unit by the grammar in the module text, or None.

    The sentence names the common mistake it sees (a decimal comma, a ratio with a colon, two
    numbers, arithmetic) and how to write the value instead.
    """
    if _QUANTITY.fullmatch(text):
        return None
    example = KINDS[kind_name].example if kind_name in KINDS else "250 bar"
    one = f"write one number and its unit, e.g. '{example}'"
    m = _DECIMAL_COMMA.match(text)
    if m:
        fixed = f"{m.group(1)}.{m.group(2)}{text[m.end():]}".strip()
        more = (f", or without a thousands separator: {m.group(1)}{m.group(2)}{text[m.end():]}".rstrip()
                if len(m.group(2)) == 3 else "")
        return f"'{text}': the decimal mark is a point: {fixed}{more}"
    m = _COLON_RATIO.fullmatch(text)
    if m:
        a, b = float(m.group(1)), float(m.group(2))
        if a and b:
            return f"'{text}': write a ratio as a number, e.g. {a / b:.4g} or {b / a:.4g}"
        return f"'{text}': write a ratio as a number, e.g. 0.25 or 4"
    if _NOT_FINITE.match(text):
        return f"'{text}' is not a finite number"
    number = re.match(f"{_SP}*{_NUMBER}", text)
    if not number:
        if kind_name == "temperature":
            return f"'{text}' is not a temperature such as '{example}'"
        return f"'{text}' does not start with a number; {one}"
    rest = text[number.end():]
    if "%" in rest and rest.strip() != "%":
        return f"'{text}': '%' stands only alone as the whole unit, e.g. '92 %'"
    op = _OPERATOR.search(rest)
    if op:
        return f"'{text}' holds arithmetic or a sign ('{op.group()}') after the number; {one}"
    if re.search("(?:\\^|\\*\\*|[\u00b9\u00b2\u00b3\u2070-\u2079])", rest):
        return (f"'{text}' uses a power specgen does not read; put a small whole power straight on a unit, "
                "e.g. 'cm^3' or 'm/s^2'")
    if re.search("[0-9]", rest):
        return f"'{text}' holds more than one number; {one}"
    odd = next((c for c in rest if not _UNIT_CHARACTER.fullmatch(c)), None)
    if odd is not None:
        return f"'{text}' holds {odd!r} (U+{ord(odd):04X}), which is no part of a number or a unit; {one}"
    return f"'{text}' is not one number and a unit (unit names joined by '*', '/' or a space); {one}"


def _split(text: str, kind: Kind) -> tuple[float, str]:
    """(number, unit text) of grammatical ``text``; UnitProblem naming the mistake otherwise."""
    why = grammar_problem(text, kind.name)
    if why:
        raise UnitProblem(why)
    m = _QUANTITY.fullmatch(text)
    value = float(m.group(1))  # a string of any length: float() gives inf, never an exception
    _finite(value, text)
    unit = re.sub(f"({_SUPERSCRIPT})", r"^\1", m.group(2) or "").translate(_PLAIN_POWER)  # pint's spelling
    for name in _NAMES.findall(unit):
        if _is_plain_number(name):
            raise UnitProblem(f"'{text}': '{name}' is a number, not a unit; {_one(kind)}")
    return value, unit


def _one(kind: Kind) -> str:
    return f"write one number and its unit, e.g. '{kind.example}'"


@lru_cache(maxsize=None)
def _is_plain_number(name: str) -> bool:
    """True for unit names pint defines as bare numbers (pi, ...): they would multiply the value."""
    ureg = registry()
    try:
        q = ureg.Quantity(1.0, name)
    except Exception:  # an unknown name: the full reading names it
        return False
    if not q.dimensionless or _has_angle(q):
        return False
    return str(q.units) != "percent"


# A heat transfer coefficient as data sheets print it, "W/(m^2*K)": the one bracket the grammar
# takes, rewritten to "W/m^2/K" before the grammar sees it (nothing else in brackets is read).
_PER_PRODUCT = re.compile(r"/\(\s*([^()*·\s]+)\s*[*·\s]\s*([^()*·\s]+)\s*\)\s*$")


def parse(text: object, kind_name: str) -> float:
    """Read ``text`` (e.g. "3625 psi") as a quantity of ``kind_name``; return the SI float.

    Raises UnitProblem with a sentence naming the value and the dimension expected, or the
    mistake in writing it (see the grammar in the module text). Ratios may be plain numbers
    (0.92) or percentages ("92 %").
    """
    if isinstance(text, bool):  # refused before the cache: True == 1 would find a cached 1
        kind = KINDS[kind_name]
        raise UnitProblem(f"expected {kind.name} such as '{kind.example}', got {text!r}")
    if kind_name == "heat_transfer_coefficient" and isinstance(text, str):
        text = _PER_PRODUCT.sub(r"/\1/\2", text)
    return _parse(text, kind_name)


@lru_cache(maxsize=4096)
def _parse(text: object, kind_name: str) -> float:
    kind = KINDS[kind_name]
    if isinstance(text, (int, float)):
        if kind.name == "ratio":
            try:
                value = float(text)
            except OverflowError:  # an integer of hundreds of digits
                raise UnitProblem(f"'{text}' is too large a number to compute with") from None
            _finite(value, text)
            return value
        raise UnitProblem(f"'{text}' has no unit; write the {kind.name} with its unit, e.g. '{kind.example}'")
    if not isinstance(text, str) or not text.strip():
        raise UnitProblem(f"expected {kind.name} such as '{kind.example}', got {text!r}")
    number, unit = _split(text, kind)
    if kind.name == "temperature_difference" and unit in _DELTA:  # 40 degC of difference is 40 K, not 313 K
        return number * _DELTA[unit]
    if kind.name == "temperature":
        return _parse_temperature(text, number, unit)
    quick = _number_times_unit(number, unit, kind.name, text)
    return quick if quick is not None else _read(text, kind, number, unit)


def _number_times_unit(number: float, unit: str, kind_name: str, text: str) -> float | None:
    """The SI value of "number unit" as the number times the unit's cached factor, else None.

    pint takes about 0.3 ms to read one quantity, and a spec repeats a few units (bar, rpm,
    cm^3) many times over: reading each unit once per kind keeps the cost per value small.
    None sends the text the full way (a unit that is not a plain scale, or none at all).
    """
    if not unit:
        return None
    factor = _unit_factor(unit, kind_name)
    if factor is None:
        return None
    value = number * factor
    _finite(value, text)
    return value


@lru_cache(maxsize=None)
def _unit_factor(unit: str, kind_name: str) -> float | None:
    """SI value of one ``unit`` read as ``kind_name``; None if it fails or is not a plain scale.

    pint's converters are scales, offsets (degC) and logarithms (dB); only a scale reads 0 as 0.
    """
    kind = KINDS[kind_name]
    try:
        one, zero = _read(f"1 {unit}", kind, 1.0, unit), _read(f"0 {unit}", kind, 0.0, unit)
    except UnitProblem:
        return None  # the full reading of the text gives the message
    return one if zero == 0 else None


def _read(text: str, kind: Kind, number: float, unit: str) -> float:
    q = _quantity(text, number, unit, kind.name)
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
            raise _wrong_kind(text, q, kind, unit)
        value = _to_si(q, kind, text)
    _finite(value, text)
    return value


def _quantity(text: str, number: float, unit: str, kind_name: str = ""):
    """pint reads only the unit text (already checked by the grammar); the number stays a float."""
    ureg = registry()
    if not unit:
        return ureg.Quantity(number, "dimensionless")
    try:
        return ureg.Quantity(number, unit)
    except Exception as exc:  # pint raises several unrelated types for unreadable text
        name = getattr(exc, "unit_names", None) or getattr(exc, "args", [""])[:1]
        detail = f"unknown unit {', '.join(map(str, name))!s}" if name else "unreadable"
        from specgen.unit_hints import did_you_mean

        hint = did_you_mean(text, unit, kind_name) if kind_name else ""
        raise UnitProblem(f"'{text}' cannot be read as a quantity ({detail}){hint}") from None


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


def _parse_temperature(text: str, number: float, unit: str) -> float:
    # Offset units cannot be multiplied out ("55 degC" raises in pint): number and unit apart.
    if not unit:
        raise UnitProblem(f"'{text}' is not a temperature such as '50 degC'")
    ureg = registry()
    try:
        q = ureg.Quantity(number, unit)
        kelvin = float(q.to("K").magnitude)
    except Exception:
        from specgen.unit_hints import did_you_mean

        raise UnitProblem(f"'{text}' is not a temperature such as '50 degC' (unknown or wrong unit)"
                          + did_you_mean(text, unit, "temperature")) from None
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
