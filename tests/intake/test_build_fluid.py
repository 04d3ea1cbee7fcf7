"""The fluid block at intake: the ISO VG grades specgen holds data for, and a grade without a typical
100 degC viscosity needing a measured one before lines can be computed."""

import pytest

from helpers import minimal
from specgen.errors import SpecError
from specgen.intake.read import Source
from specgen.pipeline import evaluate


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def lined():
    d = minimal()
    d["fluid"] = {"iso_vg": 46, "temperature": "50 degC", "density": "870 kg/m^3"}
    d["drives"]["hoist"]["lines"] = {"pressure": {"inner_diameter": "12.7 mm", "length": "6 m"}}
    return d


def test_the_schema_lists_exactly_the_iso_3448_grades_specgen_holds_data_for():
    # ISO 3448 grades VG 2 to VG 1500 (from memory: 18 grades); the schema's enum and the data agree
    from specgen.intake.schema import schema
    from specgen.iso_vg import GRADES_WITHOUT_TYPICAL_100C, ISO_VG_GRADES

    grades = schema()["properties"]["fluid"]["properties"]["iso_vg"]["enum"]
    assert grades == list(ISO_VG_GRADES) and len(grades) == 18
    assert GRADES_WITHOUT_TYPICAL_100C == {2, 3, 5}


def test_a_grade_without_a_typical_100c_viscosity_needs_a_measured_one_for_lines():
    d = lined()
    d["fluid"]["iso_vg"] = 5
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "drives.hoist.lines: lines need the fluid's viscosity" in str(e.value)
    d["fluid"]["viscosity_100c"] = "1.6 mm^2/s"
    assert outcome(d).results.fluid.values["viscosity_100c"].value == pytest.approx(1.6e-6)


def test_a_100c_viscosity_not_below_the_40c_one_is_refused():
    d = lined()
    d["fluid"]["viscosity_100c"] = "50 mm^2/s"  # VG 46 is 46 mm^2/s at 40 degC (ISO 3448): oil thins as it warms
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "fluid.viscosity_100c" in str(e.value) and "below" in str(e.value)
