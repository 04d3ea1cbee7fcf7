"""Pump inlet pressure against hand calculations (hydrostatics; ISO 2533 standard atmosphere)."""

import pytest

from specgen.calc import suction


def test_standard_atmosphere():
    assert suction.STANDARD_ATMOSPHERE == 101325.0  # ISO 2533, sea level


def test_inlet_pressure_with_head_and_losses():
    # 101325 + 870 * 9.80665 * 0.5 - 5000 - 10000 = 90590.89 Pa (hand calculation)
    assert suction.pump_inlet_pressure(0.5, 870.0, 5000.0, 10000.0) == pytest.approx(90590.89, abs=0.01)


def test_pump_above_the_oil_loses_head():
    # pump 1 m above the oil: 101325 - 870 * 9.80665 * 1 = 92793.2 Pa before any loss
    assert suction.pump_inlet_pressure(-1.0, 870.0) == pytest.approx(92793.21, abs=0.01)
