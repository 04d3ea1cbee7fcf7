"""Unit parsing and display. pint is the reference for every conversion (source: pint)."""

import math

import pint
import pytest

from specgen import units

U = pint.UnitRegistry()
U.define("gpm = gallon / minute")


@pytest.mark.parametrize("text, kind, reference", [
    # reference values computed by pint itself (source: pint)
    ("250 bar", "pressure", U("250 bar").to("Pa").magnitude),
    ("3625 psi", "pressure", U("3625 psi").to("Pa").magnitude),
    ("25 MPa", "pressure", 25e6),
    ("160 cm^3", "displacement", U("160 cm**3").to("m**3").magnitude),
    ("160 cc", "displacement", U("160 cc").to("m**3").magnitude),
    ("9.8 in^3", "displacement", U("9.8 in**3").to("m**3").magnitude),
    ("45 L/min", "flow", U("45 L/min").to("m**3/s").magnitude),
    ("12 gpm", "flow", U("12 gallon/minute").to("m**3/s").magnitude),
    ("1.8 kN*m", "torque", 1800.0),
    ("1200 lbf*in", "torque", U("1200 lbf*inch").to("N*m").magnitude),
    ("900 lbf*ft", "torque", U("900 lbf*foot").to("N*m").magnitude),
    ("55 kW", "power", 55e3),
    ("40 hp", "power", U("40 hp").to("W").magnitude),
    ("870 kg/m^3", "density", 870.0),
])
def test_parse_matches_pint(text, kind, reference):
    assert units.parse(text, kind) == pytest.approx(reference, rel=1e-12)


def test_us_gallon_per_minute():
    # 1 US gallon = 231 in^3 exactly (NIST Handbook 44, from memory), so 1 gpm = 3.785411784 L/min
    assert units.parse("1 gpm", "flow") * 60e3 == pytest.approx(3.785411784, rel=1e-9)


def test_speed_is_revolutions_per_second():
    # 12 rpm = 0.2 rev/s by definition; 2*pi rad/s = 1 rev/s
    assert units.parse("12 rpm", "speed") == pytest.approx(0.2)
    assert units.parse(f"{2 * math.pi} rad/s", "speed") == pytest.approx(1.0)
    assert units.parse("3 rev/s", "speed") == pytest.approx(3.0)


def test_displacement_per_revolution_spellings_agree():
    # the trade writes "cm^3" and "cm^3/rev" for the same displacement
    assert units.parse("160 cm^3/rev", "displacement") == pytest.approx(units.parse("160 cm^3", "displacement"))


def test_ratio_forms():
    assert units.parse(0.92, "ratio") == 0.92
    assert units.parse("92 %", "ratio") == pytest.approx(0.92)


def test_temperature_offset_units():
    # 55 degC = 328.15 K and 131 degF = 328.15 K (definition of the Celsius and Fahrenheit scales)
    assert units.parse("55 degC", "temperature") == pytest.approx(328.15)
    assert units.parse("131 degF", "temperature") == pytest.approx(328.15)


@pytest.mark.parametrize("text, kind, words", [
    ("250 rpm", "pressure", "expected pressure"),
    ("250", "pressure", "has no unit"),
    (250, "pressure", "has no unit"),
    ("250 blorf", "pressure", "unknown unit"),
    ("5 kJ", "torque", "reads as energy"),
    ("5 J", "torque", "reads as energy"),
    ("12 Hz", "speed", "no turns or angle"),
    ("45 L", "flow", "expected flow"),
    ("nan bar", "pressure", "not a finite"),
    ("inf psi", "pressure", "not a finite"),
    ("-500 degC", "temperature", "absolute zero"),
    ("hot", "temperature", "not a temperature"),
    (True, "ratio", "expected ratio"),
])
def test_bad_values_are_refused_with_a_reason(text, kind, words):
    with pytest.raises(units.UnitProblem, match=words):
        units.parse(text, kind)


def test_display_si_and_us():
    # 250 bar = 3625.94 psi (source: pint, 1 psi = 6894.757 Pa)
    assert units.format_si(25e6, "pressure", "SI") == "250.0 bar"
    assert units.format_si(25e6, "pressure", "US") == "3626 psi"
    # torque is never shown as J
    assert units.format_si(1800, "torque", "SI") == "1800 N*m"
    assert units.format_si(units.parse("1200 lbf*in", "torque"), "torque", "US") == "1200 lbf*in"
    assert units.format_si(0.2, "speed", "SI") == "12.00 rpm"
    assert units.format_si(units.parse("12 gpm", "flow"), "flow", "US") == "12.00 gpm"


def test_significant_never_uses_exponents():
    assert units.significant(123456.0) == "123456"
    assert units.significant(0.000123456) == "0.0001235"
    assert units.significant(0.0) == "0"


@pytest.mark.parametrize("text", ["12 W/m^2/K", "12 W/(m^2*K)", "12 W/(m^2 K)", "12 W/(m²·K)"])
def test_heat_transfer_coefficient_as_data_sheets_print_it(text):
    assert units.parse(text, "heat_transfer_coefficient") == pytest.approx(12.0)


def test_a_temperature_difference_in_degrees_is_a_difference():
    # 40 degC of difference is 40 K; 72 degF of difference is 72 * 5/9 = 40 K (definition of the scales)
    assert units.parse("40 degC", "temperature_difference") == pytest.approx(40.0)
    assert units.parse("72 degF", "temperature_difference") == pytest.approx(40.0)
    assert units.parse("40 K", "temperature_difference") == pytest.approx(40.0)
    with pytest.raises(units.UnitProblem):
        units.parse("12 W/(m^2*K)", "power")


def test_a_boolean_is_refused_even_after_a_cached_one():
    assert units.parse(1, "ratio") == 1.0
    with pytest.raises(units.UnitProblem, match="expected ratio"):
        units.parse(True, "ratio")
