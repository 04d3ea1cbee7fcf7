"""Messages for quantities specgen cannot read (specgen/unit_hints.py through units.parse): the
dimension said in words and the nearest known spelling suggested."""

import pytest

from helpers import minimal, run_cli, write_spec
from specgen.unit_hints import dimension_words, suggestion
from specgen.units import UnitProblem, parse


@pytest.mark.parametrize("text, kind, message", [
    ("9 kNm", "torque", "'9 kNm' is not a torque: it reads as length per mass; did you mean '9 kN*m'?"),
    ("20 Nm", "torque", "did you mean '20 N*m'?"),
    ("250 barr", "pressure", "'250 barr' cannot be read as a quantity (unknown unit barr); did you mean '250 bar'?"),
    ("45 lpm", "flow", "did you mean '45 L/min'?"),  # never 'rpm', which is no flow
    ("12 gpn", "flow", "did you mean '12 gpm'?"),
    ("1500 rmp", "speed", "did you mean '1500 rpm'?"),
    ("30 kw", "power", "did you mean '30 kW'?"),
    ("250 Mpa", "pressure", "did you mean '250 MPa'?"),
    ("50 degc", "temperature", "did you mean '50 degC'?"),
    ("250 rpm", "pressure", "'250 rpm' is speed; expected pressure such as '250 bar'"),
])
def test_message_names_the_dimension_in_words_and_the_nearest_spelling(text, kind, message):
    with pytest.raises(UnitProblem) as err:
        parse(text, kind)
    assert message in str(err.value)


def test_no_suggestion_when_nothing_near_fits():
    with pytest.raises(UnitProblem) as err:
        parse("250 blorf", "pressure")
    assert str(err.value) == "'250 blorf' cannot be read as a quantity (unknown unit blorf)"
    assert suggestion("kW", "pressure") is None  # a real unit of another kind: no guess


def test_dimension_words():
    assert dimension_words({"[length]": 1, "[mass]": -1}) == "length per mass"
    assert dimension_words({"[mass]": 1, "[length]": 3, "[time]": -2}) == "mass times length cubed per time squared"
    assert dimension_words({"[time]": -4}) == "one per time to the power 4"
    assert dimension_words({}) == "a plain number"


def test_spec_error_line_carries_the_hint(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "286.5 Nm"
    code, _, err = run_cli("check", write_spec(tmp_path, d))
    assert code == 2 and err.count("\n") == 1
    assert "drives.hoist.duty_points.lift.torque:" in err and "did you mean '286.5 N*m'?" in err
