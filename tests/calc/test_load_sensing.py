"""Load-sensing relations (specgen/calc/load_sensing.py) against hand calculations.

Worked example (hand calculation, arithmetic beside each assertion): hoist needs 210 bar at 60 L/min,
slew 90 bar at 30 L/min, dp_LS 20 bar, q_max 100 L/min. The pump relation p_pump = max(p_i) + dp_LS
and the loss (p_pump - p_i) * q_i are primer section 14 (fluid-power textbook relations); the sharing
rules are common practice, no source.
"""

import math

import pytest

from specgen.calc import load_sensing as ls

BAR, L_MIN = 1e5, 1e-3 / 60


def test_pump_pressure_is_highest_need_plus_margin():
    # 210 + 20 = 230 bar, below the 250 bar relief (hand calculation)
    assert ls.pump_pressure([210 * BAR, 90 * BAR], 20 * BAR, 250 * BAR) == (pytest.approx(230 * BAR), False)


def test_pump_pressure_capped_by_relief():
    # 210 + 20 = 230 bar > 220 bar relief: the relief caps it (hand calculation)
    assert ls.pump_pressure([210 * BAR, 90 * BAR], 20 * BAR, 220 * BAR) == (220 * BAR, True)


def test_throttling_losses_of_the_worked_example():
    p_pump = 230 * BAR
    # hoist: 20 bar * 60 L/min = 20e5 Pa * 1e-3 m^3/s = 2000 W (hand calculation)
    assert ls.throttling_loss(p_pump, 210 * BAR, 60 * L_MIN) == pytest.approx(2000.0)
    # slew: (230 - 90) bar * 30 L/min = 140e5 * 5e-4 = 7000 W (hand calculation)
    assert ls.throttling_loss(p_pump, 90 * BAR, 30 * L_MIN) == pytest.approx(7000.0)
    # a drive needing more than the pump gives throttles nothing
    assert ls.throttling_loss(p_pump, 240 * BAR, 30 * L_MIN) == 0.0


def test_flow_sharing_gives_every_drive_the_same_share():
    consumers = [ls.Consumer(60 * L_MIN, 210 * BAR), ls.Consumer(30 * L_MIN, 90 * BAR)]
    # q_max 75 L/min: each offered q_i * 75/90 = 0.8333 q_i: 50 and 25 L/min (hand calculation)
    offers = ls.offered_flows(consumers, 75 * L_MIN, "post_compensated")
    assert [o / L_MIN for o in offers] == pytest.approx([50.0, 25.0])
    assert offers[0] / (60 * L_MIN) == pytest.approx(75 / 90)
    # q_max 100 L/min: offers above the demands, 100/90 of each (hand calculation)
    offers = ls.offered_flows(consumers, 100 * L_MIN, "post_compensated")
    assert [o / L_MIN for o in offers] == pytest.approx([66.667, 33.333], abs=1e-3)


def test_pre_compensated_serves_the_lowest_pressure_first():
    consumers = [ls.Consumer(60 * L_MIN, 210 * BAR), ls.Consumer(30 * L_MIN, 90 * BAR)]
    # slew (90 bar) first: offered 75, takes 30; hoist offered 75 - 30 = 45 L/min (hand calculation)
    offers = ls.offered_flows(consumers, 75 * L_MIN, "pre_compensated")
    assert [o / L_MIN for o in offers] == pytest.approx([45.0, 75.0])
    # 25 L/min: the slew gets 25 of its 30, the hoist nothing: it stops
    offers = ls.offered_flows(consumers, 25 * L_MIN, "pre_compensated")
    assert [o / L_MIN for o in offers] == pytest.approx([0.0, 25.0])


def test_priority_drive_first_then_sharing():
    consumers = [ls.Consumer(60 * L_MIN, 210 * BAR), ls.Consumer(30 * L_MIN, 90 * BAR),
                 ls.Consumer(20 * L_MIN, 120 * BAR, priority=0)]
    # steering (priority) offered all 75, takes 20; 55 left shared 60:30 -> 36.667 and 18.333 (hand calculation)
    offers = ls.offered_flows(consumers, 75 * L_MIN, "post_compensated")
    assert [o / L_MIN for o in offers] == pytest.approx([36.667, 18.333, 75.0], abs=1e-3)
    # only 15 L/min: the priority drive takes it all, the others get nothing
    offers = ls.offered_flows(consumers, 15 * L_MIN, "post_compensated")
    assert [o / L_MIN for o in offers] == pytest.approx([0.0, 0.0, 15.0])


def test_power_limited_flow():
    # 40 kW * 0.85 / 230e5 Pa = 1.4783e-3 m^3/s = 88.70 L/min, under the 100 L/min full stroke (hand calculation)
    q = ls.power_limited_flow(40e3, 0.85, 230 * BAR, 100 * L_MIN)
    assert q / L_MIN == pytest.approx(88.696, abs=1e-3)
    # 60 kW would allow 133 L/min: full stroke governs
    assert ls.power_limited_flow(60e3, 0.85, 230 * BAR, 100 * L_MIN) == pytest.approx(100 * L_MIN)


def test_torque_limit_as_power():
    # 180 N*m at 1800 rpm = 30 rev/s: 2*pi*30*180 = 33 929 W (P = 2*pi*n*T, textbook)
    assert ls.torque_limit_power(180.0, 30.0) == pytest.approx(33929.2, abs=0.1)


def test_metering_factor_follows_the_orifice_law():
    # 5 bar across a section sized for 20 bar: sqrt(5/20) = 0.5 (orifice law q ~ sqrt(dp), textbook)
    assert ls.metering_factor(5 * BAR, 20 * BAR) == pytest.approx(0.5)
    assert ls.metering_factor(25 * BAR, 20 * BAR) == 1.0
    assert ls.metering_factor(0.0, 20 * BAR) == 0.0
    assert ls.metering_factor(15 * BAR, 20 * BAR) == pytest.approx(math.sqrt(0.75))


def test_flow_divider():
    # 30 and 20 L/min at r 0.5: inlet max(30/0.5, 20/0.5) = 60 L/min (hand calculation)
    assert ls.divider_inlet_demand(30 * L_MIN, 20 * L_MIN, 0.5) / L_MIN == pytest.approx(60.0)
    # r 0.6: max(30/0.6, 20/0.4) = max(50, 50) = 50 L/min
    assert ls.divider_inlet_demand(30 * L_MIN, 20 * L_MIN, 0.6) / L_MIN == pytest.approx(50.0)
    # 60 L/min, 10 bar drop, legs 150 and 100 bar: 10e5*1e-3 + 50e5*5e-4 = 1000 + 2500 = 3500 W (hand calculation)
    assert ls.divider_loss(60 * L_MIN, 0.5, 10 * BAR, 150 * BAR, 100 * BAR) == pytest.approx(3500.0)
    # r 0.25, first leg lower at 100 bar gets 15 L/min: 1000 + 50e5 * 2.5e-4 = 2250 W
    assert ls.divider_loss(60 * L_MIN, 0.25, 10 * BAR, 100 * BAR, 150 * BAR) == pytest.approx(2250.0)


def test_margin_left_by_rounding_reads_as_full_margin():
    # p_pump = 152.83965428657848 bar + 20 bar leaves 19.999999999997 bar after the subtraction in
    # floating point; the valve section has its whole margin (hand calculation: p_pump - p_need = dp_LS).
    p_need = 152.83965428657848e5
    p_pump = p_need + 20e5
    assert ls.metering_factor(p_pump - p_need, 20e5) == 1.0
    # a real shortfall still meters: 5 bar of 20 -> sqrt(0.25) = 0.5 (orifice law, textbook)
    assert ls.metering_factor(5e5, 20e5) == 0.5
