"""Load blocks read from a spec: each refused value or contradiction is one located line."""

import pytest

from helpers import minimal
from specgen.errors import SpecError
from specgen.intake.build_loads import grade_angle
from specgen.intake.read import Source
from specgen.pipeline import evaluate


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def winch_spec():
    d = minimal()
    d["drives"]["hoist"]["gear_stage"] = {"ratio": 25, "efficiency": 0.95}
    d["drives"]["hoist"]["duty_points"] = {"lift": {"load": {"winch": {
        "line_pull": "20 kN", "line_speed": "0.5 m/s", "drum_diameter": "400 mm", "rope_diameter": "16 mm",
        "layer": 3}}}}
    return d


def wheel_spec(grade):
    d = minimal()
    d["drives"]["hoist"]["gear_stage"] = {"ratio": 40, "efficiency": 0.96}
    d["drives"]["hoist"]["duty_points"] = {"lift": {"load": {"wheel": {
        "vehicle_mass": "12 t", "rolling_resistance": 0.05, "grade": grade, "acceleration": "0.2 m/s^2",
        "rolling_radius": "0.6 m", "driven_wheels": 4, "travel_speed": "2 m/s"}}}}
    return d


def test_grade_angle_from_a_slope_or_an_angle():
    # theta = atan(rise/run): 10 % -> atan(0.1) = 0.0996687 rad; 30 deg = pi/6 = 0.5235988 rad (trigonometry)
    assert grade_angle(0.10, percent=True) == pytest.approx(0.0996687, abs=1e-7)
    assert grade_angle(0.5235987755982988, percent=False) == pytest.approx(0.5235988, abs=1e-7)
    with pytest.raises(ValueError, match="strictly between -90 and 90 degrees"):
        grade_angle(1.6, percent=False)  # 91.7 deg


def test_a_grade_beyond_vertical_is_refused_at_its_field():
    with pytest.raises(SpecError) as e:
        outcome(wheel_spec("95 deg"))
    assert ("drives.hoist.duty_points.lift.load.wheel.grade: grade angle must lie strictly between -90 and 90 "
            "degrees, got 95.0.") in str(e.value)


def test_torque_and_load_together_is_refused_with_its_location():
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["load"] = {"belt": {"belt_pull": "8 kN", "pulley_diameter": "0.5 m",
                                                                    "belt_speed": "1.5 m/s"}}
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "drives.hoist.duty_points.lift.torque: give torque and speed, or a load block, not both" in str(e.value)


def test_two_load_models_and_a_grade_without_unit_are_refused():
    d = wheel_spec("8 %")
    d["drives"]["hoist"]["duty_points"]["lift"]["load"]["belt"] = {"belt_pull": "8 kN", "pulley_diameter": "0.5 m",
                                                                   "belt_speed": "1.5 m/s"}
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "exactly one load model" in str(e.value)
    with pytest.raises(SpecError) as e:
        outcome(wheel_spec(8))
    assert "load.wheel.grade" in str(e.value)
    with pytest.raises(SpecError) as e:
        outcome(wheel_spec("8"))
    assert "load.wheel.grade" in str(e.value) and "'8 %'" in str(e.value)


def test_a_wrong_unit_in_a_load_model_names_the_field():
    d = winch_spec()
    d["drives"]["hoist"]["duty_points"]["lift"]["load"]["winch"]["line_pull"] = "20 kN*m"
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "duty_points.lift.load.winch.line_pull" in str(e.value) and "force" in str(e.value)
