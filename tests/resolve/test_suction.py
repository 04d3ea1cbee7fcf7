"""Pump inlet pressure values from a supply's suction side."""

import pytest

from specgen.intake.model import Pump, Ratio, Supply
from specgen.resolve.suction import suction_values


def supply(**kw) -> Supply:
    pump = Pump(40e-6, 25.0, None, Ratio(0.95), Ratio(0.85))
    return Supply(id="main", title="main", pump=pump, relief_setting=250e5, return_pressure=5e5,
                  prime_mover_power=None, **kw)


def test_nothing_without_a_suction_side():
    assert suction_values(supply(), 870.0, None) == []


def test_head_loss_and_strainer():
    # 101325 + 880*9.80665*0.3 - 2000 - 5000 = 96913.96 Pa (hydrostatics, hand calculation)
    v = suction_values(supply(suction_head=0.3, strainer_drop=5000.0), 880.0, 2000.0)
    assert v[0].value == pytest.approx(96913.956, abs=0.001)
    # the minimum inlet pressure left out: 0.8 bar abs, marked assumed (catalogue practice, from memory)
    assert v[1].value == pytest.approx(0.8e5) and v[1].assumed


def test_density_assumed_without_a_fluid_block():
    v = suction_values(supply(suction_head=0.0, strainer_drop=1000.0), None, None)
    assert v[0].value == pytest.approx(101325 - 1000)
    assert any(i.assumed for i in v[0].inputs)
