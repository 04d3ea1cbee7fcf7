"""A quantity is one number and a unit by the grammar in specgen/units.py, or it is refused.

The oracle below is the grammar written out again, independently of the code: a string that it
refuses must be refused by ``units.parse`` for every kind, a string that ``parse`` accepts must
be grammatical, and a grammatical string made of known units of the right kind is accepted.
Reference values: 1 bar = 1e5 Pa, 1 mm = 1e-3 m (SI definitions).
"""

from __future__ import annotations

import re

import pytest
from hypothesis import given
from hypothesis import strategies as st

from specgen import units

_NUM = r"[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?"
_NAME = "[A-Za-z\u00b5\u03bc\u00b0][A-Za-z_\u00b5\u03bc\u00b0]*"
_S = "[ \t\u00a0\u2009\u202f]"
_TERM = rf"{_NAME}({_S}*(\^|\*\*){_S}*-?[1-9]|\u207b?[\u00b9\u00b2\u00b3\u2074-\u2079])?"
_END = "[ \t\r\n\u00a0\u2009\u202f]*"
ORACLE = re.compile(rf"{_END}{_NUM}{_S}*(%|{_TERM}(({_S}*[*/\u00b7]{_S}*|{_S}+){_TERM})*)?{_END}")


def grammatical(text: str) -> bool:
    return ORACLE.fullmatch(text) is not None


KNOWN = {"pressure": ["bar", "psi", "MPa", "kPa"], "length": ["mm", "m", "in"], "torque": ["N*m", "kN·m", "lbf*in"],
         "displacement": ["cm^3", "cm^3/rev", "in**3", "cm ^ 3 / rev"], "flow": ["L/min", "gpm", "m^3/s"],
         "speed": ["rpm", "rev/min", "rev/s", "rad/s"], "ratio": ["%"],
         "acceleration": ["m/s^2", "m s^-2", "m/s\u00b2", "m\u00a0s\u207b\u00b2"]}

numbers = st.builds(
    lambda sign, whole, frac, exp: f"{sign}{whole}{frac}{exp}",
    st.sampled_from(["", "+"]), st.integers(1, 99999).map(str),
    st.sampled_from(["", ".", ".5", ".25"]), st.sampled_from(["", "e2", "E-1", "e+3"]))


@given(numbers, st.sampled_from(sorted(KNOWN)), st.data(), st.sampled_from(["", " ", "  ", "\t"]))
def test_grammatical_text_of_known_units_is_accepted(number, kind, data, space):
    unit = data.draw(st.sampled_from(KNOWN[kind]))
    text = f"{number}{space}{unit}"
    assert grammatical(text)
    assert units.parse(text, kind) > 0


PIECES = ["1", "25", "0.5", ".5", "9,5", "1:4", "e3", "E-2", " ", "bar", "mm", "kN", "m", "pi", "%", "*", "/",
          "^2", "**2", "^", "+", "-", "(", ")", "2", "·", ",", ":", "\n", "\u00a0", "\u0663", "inf", "nan", "x",
          "\u00b3", "\u207b", "\u00b9", "\u2070", "\u200b", "\u2028"]


@given(st.lists(st.sampled_from(PIECES), min_size=1, max_size=7).map("".join))
def test_accepted_if_and_only_if_grammatical(text):
    accepted = False
    for kind in ("pressure", "length", "torque", "ratio", "angle", "temperature"):
        try:
            units.parse(text, kind)
            accepted = True
        except units.UnitProblem:
            pass
    if accepted:
        assert grammatical(text), text
    if not grammatical(text):
        assert not accepted, text
        assert units.grammar_problem(text) is not None


@given(st.text(max_size=30))
def test_any_text_outside_the_grammar_is_refused(text):
    if not grammatical(text):
        with pytest.raises(units.UnitProblem):
            units.parse(text, "pressure")


@pytest.mark.parametrize("text, kind, words", [
    ("9,5 mm", "length", "'9,5 mm': the decimal mark is a point: 9.5 mm"),
    ("1,5 bar", "pressure", "the decimal mark is a point: 1.5 bar"),
    ("3000,5 psi", "pressure", "the decimal mark is a point: 3000.5 psi"),
    ("3,000 psi", "pressure", "without a thousands separator: 3000 psi"),
    ("1:4", "ratio", "'1:4': write a ratio as a number, e.g. 0.25 or 4"),
    ("30:1", "ratio", "write a ratio as a number, e.g. 30 or 0.03333"),
    ("1500 psi 2", "pressure", "holds more than one number"),
    ("1.2 kN*m*2", "torque", "holds more than one number"),
    ("200 bar + 7 bar", "pressure", "holds arithmetic or a sign ('+')"),
    ("25 MPa-bar", "pressure", "holds arithmetic or a sign ('-')"),
    ("2*(3 bar)", "pressure", "holds arithmetic"),
    ("100 pi*bar", "pressure", "'pi' is a number, not a unit"),
    ("500 bar%", "pressure", "'%' stands only alone as the whole unit"),
    ("250 bar^2^2", "pressure", "uses a power specgen does not read"),
    ("250 bar**2.5", "pressure", "uses a power specgen does not read"),
    ("250 bar\u200b", "pressure", "U+200B"),
    ("250 bar\u2028", "pressure", "U+2028"),
    ("5 cm\u00b3\u00b3", "displacement", "uses a power specgen does not read"),
    ("\u0663 bar", "pressure", "does not start with a number"),
    ("nan bar", "pressure", "is not a finite number"),
    ("1e400 bar", "pressure", "is not a finite number"),
    ("1" * 400 + " bar", "pressure", "is not a finite number"),
])
def test_common_mistakes_are_named(text, kind, words):
    with pytest.raises(units.UnitProblem) as err:
        units.parse(text, kind)
    assert words in str(err.value)


@pytest.mark.parametrize("text, kind, si", [
    ("9.5 mm", "length", 9.5e-3),  # SI definition
    ("  -3e2 Pa ", "pressure", -300.0),
    ("250bar", "pressure", 250e5),
    ("250 bar\n", "pressure", 250e5),  # a block scalar's final line break
    ("92%", "ratio", 0.92),
    ("5 m s^-2", "acceleration", 5.0),
    ("2 kN·m", "torque", 2000.0),
    ("160 cm\u00b3", "displacement", 160e-6),  # as a data sheet prints it
    ("250\u00a0bar", "pressure", 250e5),  # a no-break space pasted from a document
])
def test_forms_in_use_stay_accepted(text, kind, si):
    assert units.parse(text, kind) == pytest.approx(si)


def test_an_integer_of_hundreds_of_digits_as_a_ratio_is_refused_not_a_crash():
    with pytest.raises(units.UnitProblem, match="too large"):
        units.parse(10 ** 400, "ratio")
