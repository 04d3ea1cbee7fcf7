import pytest
from hypothesis import given
from hypothesis import strategies as st

from specgen.calc import heat

LPM = 1 / 60_000  # m^3/s per L/min


def _terms(b):
    return b.pump_loss + b.surplus_loss + b.standby_loss + b.drive_loss


def test_fixed_pump_surplus_over_relief():
    # Hand calculation: 100 L/min pump, 60 L/min demand, surplus over a 210 bar relief,
    # eta_t 0.85, 13.5 kW shaft. Textbook P[kW] = q[L/min]*p[bar]/600:
    # hydraulic out 100*210/600 = 35 kW, input 35/0.85 = 41.176 kW,
    # surplus 40*210/600 = 14 kW, drives 60*210/600 - 13.5 = 7.5 kW, total 27.676 kW.
    b = heat.fixed_pump_heat(100 * LPM, 60 * LPM, 180e5, 210e5, 0.85, 13_500.0)
    assert b.pump_pressure == 210e5
    assert b.pump_input == pytest.approx(35_000 / 0.85)
    assert b.surplus_loss == pytest.approx(14_000.0)
    assert b.drive_loss == pytest.approx(7_500.0)
    assert b.total == pytest.approx(27_676.47, rel=1e-6)
    # Energy balance: the terms add up to input minus shaft power.
    assert _terms(b) == pytest.approx(b.total)


def test_fixed_pump_open_centre_neutral():
    # Hand calculation: no drive running, 100 L/min through an open centre at 6 bar, eta_t 0.8:
    # 100*6/600 = 1 kW hydraulic, input 1.25 kW, all of it heat.
    b = heat.fixed_pump_heat(100 * LPM, 0.0, 0.0, 6e5, 0.8, 0.0)
    assert b.surplus_loss == pytest.approx(1_000.0)
    assert b.total == pytest.approx(1_250.0)


def test_fixed_pump_open_centre_with_load_runs_at_load_pressure():
    # Single-outlet pump: with a drive at 150 bar and the surplus bypassing, the outlet
    # sits at 150 bar. Hand: surplus 40*150/600 = 10 kW.
    b = heat.fixed_pump_heat(100 * LPM, 60 * LPM, 150e5, 6e5, 0.9, 12_000.0)
    assert b.pump_pressure == 150e5
    assert b.surplus_loss == pytest.approx(10_000.0)


def test_fixed_pump_without_surplus():
    # Hand calculation: demand equals delivery at 200 bar: no surplus, 100*200/600 = 33.33 kW out.
    b = heat.fixed_pump_heat(100 * LPM, 100 * LPM, 200e5, 250e5, 0.9, 30_000.0)
    assert b.surplus_loss == 0.0
    assert b.pump_pressure == 200e5
    assert b.drive_loss == pytest.approx(100 * 200 / 600 * 1000 - 30_000.0)


def test_compensated_pump_with_standby_flow():
    # Hand calculation: 60 L/min at a 210 bar compensator, 2 L/min standby, eta_t 0.85,
    # 13.5 kW shaft: out (62*210/600) = 21.7 kW, input 25.529 kW, standby 2*210/600 = 0.7 kW,
    # drives 21 - 13.5 = 7.5 kW, total 12.029 kW.
    b = heat.compensated_pump_heat(60 * LPM, 210e5, 0.85, 13_500.0, standby_flow=2 * LPM)
    assert b.standby_loss == pytest.approx(700.0)
    assert b.drive_loss == pytest.approx(7_500.0)
    assert b.total == pytest.approx(12_029.41, rel=1e-6)
    assert _terms(b) == pytest.approx(b.total)


@given(
    demand=st.floats(min_value=0.0, max_value=99.9),
    efficiency=st.floats(min_value=0.5, max_value=1.0),
)
def test_compensated_pump_never_hotter_than_fixed_pump_over_relief(demand, efficiency):
    # Energy balance: while a fixed pump dumps surplus over relief it runs its full flow at
    # the relief setting; a compensated pump at that setting makes only the demand, so it
    # wastes no more. (At full demand the fixed pump runs at load pressure instead, and
    # the property need not hold, so demand stays below delivery here.)
    shaft = demand * LPM * 150e5 * 0.8
    fixed = heat.fixed_pump_heat(100 * LPM, demand * LPM, 150e5, 210e5, efficiency, shaft)
    comp = heat.compensated_pump_heat(demand * LPM, 210e5, efficiency, shaft)
    assert comp.total <= fixed.total + 1e-6


def test_demand_above_delivery_rejected():
    with pytest.raises(ValueError, match="exceeds the pump delivery"):
        heat.fixed_pump_heat(50 * LPM, 60 * LPM, 150e5, 210e5, 0.9, 0.0)


def test_shaft_power_above_hydraulic_power_rejected():
    # Energy balance: 60 L/min at 210 bar is 21 kW; 25 kW of shaft power is impossible.
    with pytest.raises(ValueError, match="shaft power exceeds"):
        heat.compensated_pump_heat(60 * LPM, 210e5, 0.9, 25_000.0)


@pytest.mark.parametrize("eta", [0.0, 1.5])
def test_bad_pump_efficiency_rejected(eta):
    with pytest.raises(ValueError, match="efficiency"):
        heat.compensated_pump_heat(60 * LPM, 210e5, eta, 0.0)
