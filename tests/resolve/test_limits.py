"""The drive's pressure limit and the torque to start from rest, straight from the model."""

import pytest

from specgen.intake.model import Ratio
from specgen.resolve import limits


def model(data):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).machine


def test_lowest_setting_governs_and_is_named():
    from helpers import minimal

    d = minimal()
    d["supplies"]["main"]["pump"].update({"control": "pressure_compensated", "compensator_setting": "240 bar"})
    m = model(d)
    v = limits.pressure_limit(m.drive("hoist"), m.supply("main"))
    assert v.value == pytest.approx(240e5) and v.note == "governed by the compensator setting"
    assert [i.symbol for i in v.inputs] == ["p_relief", "p_comp"]
    d["drives"]["hoist"]["port_relief"] = "220 bar"
    m = model(d)
    v = limits.pressure_limit(m.drive("hoist"), m.supply("main"))
    assert v.value == pytest.approx(220e5) and limits.governing_setting(v) == "port relief"
    # a compensator is too slow to cap a spike: the peak check sees the relief or the port relief
    assert limits.peak_limit(m.drive("hoist"), m.supply("main")) == pytest.approx(220e5)


def test_gear_starting_efficiency_falls_back_to_running_marked_assumed():
    from helpers import minimal

    d = minimal()
    d["drives"]["hoist"]["gear_stage"] = {"ratio": 4, "efficiency": 0.95}
    eta = limits.gear_starting_efficiency(model(d).drive("hoist"))
    assert eta.value == 0.95 and eta.assumed and "maker's data" in eta.basis
    d["drives"]["hoist"]["gear_stage"]["starting_efficiency"] = 0.85
    assert limits.gear_starting_efficiency(model(d).drive("hoist")) == Ratio(0.85)
