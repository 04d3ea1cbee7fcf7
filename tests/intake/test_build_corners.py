"""Building operating corners: every override checked once against its field's kind and the model."""

from __future__ import annotations

import pytest
from helpers import minimal, run_cli, write_spec

from specgen.intake.schema import field_at


def _spec(**corners) -> dict:
    d = minimal()
    d["fluid"] = {"iso_vg": 46, "temperature": "40 degC"}
    d["corners"] = corners
    return d


def test_the_schema_gives_each_override_path_its_kind():
    assert field_at(("supplies", "main", "relief_setting"), "290 bar").kind == "pressure"
    assert field_at(("drives", "x", "motor", "efficiency", "volumetric"), 0.9).kind == "ratio"
    assert field_at(("fluid", "temperature"), "-20 degC").kind == "temperature"
    assert field_at(("supplies", "main", "relief"), "290 bar") is None


@pytest.mark.parametrize("override, expected", [
    ({"set": {"fluid.temprature": "-20 degC"}}, "'fluid.temprature' is not a quantity"),
    ({"set": {"fluid.temperature": "250 bar"}}, "corners.cold.set.fluid.temperature"),
    ({"set": {"supplies.spare.relief_setting": "260 bar"}}, "names 'spare', which is not defined"),
    ({"scale": {"motors.volumetric_efficiency": "-96 %"}}, "an efficiency lies in (0, 1]"),
    ({"scale": {"fluid.temperature": 1.1}}, "a temperature cannot be scaled"),
    ({"scale": {"supplies.main.relief_setting": "a lot"}}, "not a factor"),
    ({"set": {"drives.hoist.duty_points.lift.torque": "300 N*m"}}, "duty points are the design's own cases"),
    ({"modes": ["night"], "set": {"fluid.temperature": "-20 degC"}}, "names mode 'night'"),
])
def test_a_bad_override_is_refused_with_exit_2_and_a_located_line(tmp_path, override, expected):
    path = write_spec(tmp_path, _spec(cold=override))
    code, out, err = run_cli("check", path)
    assert code == 2 and out == ""
    lines = [x for x in err.splitlines() if x.strip()]
    located = [x for x in lines if f"{path}:" in x and "corners.cold" in x]
    assert len(located) == 1 and expected in located[0], err
    assert "Traceback" not in err


def test_relief_tolerance_corner_moves_a_closed_loop_relief_side_given_on_its_own(tmp_path):
    # A relief valve drifts to the top of its tolerance (+5 %, from memory, common practice); a loop whose
    # side B has its own 400 bar relief drifts to 420 bar with it, while side A follows the 420 bar relief
    # setting (441 bar at the corner).
    from helpers import closed_loop
    from specgen.corners import apply
    from specgen.intake.read import load_text
    from specgen.intake.validate import build_with_corners
    from specgen.resolve.load import decide_directions

    data = closed_loop()
    data["supplies"]["loop"]["closed_loop"]["high_pressure_reliefs"] = {"side_b": "400 bar"}
    data["typical_corners"] = True
    spec = write_spec(tmp_path, data)
    machine, corners = build_with_corners(load_text(spec.read_bytes(), str(spec)), decide_directions)
    moved = apply(machine, next(c for c in corners if c.id == "relief_high")).supply("loop")
    assert moved.relief_setting == pytest.approx(441e5)
    assert moved.closed_loop.high_pressure_reliefs.side_b == pytest.approx(420e5)
    assert moved.closed_loop.high_pressure_reliefs.side_a is None
