"""Oil temperature relations against hand calculations.

Lumped heat balance C*dT/dt = P - k*(T - T_amb) (first-order system, textbook heat transfer); cooler
capacity scaled linearly with the entering temperature difference (common practice, no source);
c_oil 1.9 kJ/(kg*K), c_steel 0.47 kJ/(kg*K), h 12 W/(m^2*K) (from memory).
"""

import math

import pytest

from specgen.calc import thermal

AMB = 293.15  # 20 degC


def test_mean_heat_time_weighted():
    # hand calculation: (20 kW * 40 s + 2 kW * 160 s) / 200 s = (800 + 320) kJ / 200 s = 5.6 kW
    assert thermal.mean_heat([(20e3, 40.0), (2e3, 160.0)]) == pytest.approx(5600.0)


def test_cooler_scaled_linearly_with_temperature_difference():
    # hand calculation: k_c = 15 kW / 40 K = 375 W/K; at 30 K: 15 kW * 30 / 40 = 11.25 kW
    assert thermal.cooler_coefficient(15e3, 40.0) == pytest.approx(375.0)
    assert thermal.cooler_capacity_at(15e3, 40.0, AMB + 30.0, AMB) == pytest.approx(11250.0)


def test_natural_dissipation_and_heat_capacity():
    # hand calculation: 2.5 m^2 * 12 W/(m^2*K) = 30 W/K; 200 kg * 1900 + 150 kg * 470 = 380000 + 70500 J/K
    assert thermal.natural_coefficient(2.5) == pytest.approx(30.0)
    assert thermal.heat_capacity(200.0, 150.0) == pytest.approx(450500.0)


def test_steady_temperature_and_time_constant():
    # hand calculation: 293.15 + 5600 / (375 + 30) = 293.15 + 13.827 = 306.977 K; tau = 450500 / 405 = 1112.35 s
    assert thermal.steady_temperature(AMB, 5600.0, 405.0) == pytest.approx(306.977, abs=1e-3)
    assert thermal.time_constant(450500.0, 405.0) == pytest.approx(1112.35, abs=0.01)


def test_segment_after_one_time_constant():
    # hand calculation: 343.15 + (293.15 - 343.15) * exp(-1) = 343.15 - 50 * 0.367879 = 324.756 K
    assert thermal.segment_end(AMB, 343.15, 1000.0, 1000.0) == pytest.approx(324.756, abs=1e-3)


def test_warmup_of_a_constant_load_follows_the_exponential():
    # one step of 4 kW for 100 s, k = 100 W/K, C = 1e5 J/K: tau = 1000 s, T_eq = 293.15 + 40 = 333.15 K.
    # After 10 cycles (1000 s): 333.15 - 40 * exp(-1) = 318.435 K (hand calculation)
    w = thermal.warmup([(4000.0, 100.0)], AMB, 100.0, 1e5)
    at = dict(zip(w.times, w.temperatures))
    assert at[1000.0] == pytest.approx(318.435, abs=1e-3)
    assert w.settled and w.peak == pytest.approx(333.15, abs=0.02)


def test_warmup_of_an_on_off_cycle_settles_at_the_periodic_peak():
    # 5 kW for 200 s then nothing for 800 s, k = 100 W/K, C = 1e5 J/K (tau 1000 s), T_eq,on = 50 K over ambient.
    # Periodic solution (hand calculation): theta_peak = 50 * (1 - e^-0.2) / (1 - e^-1)
    #   = 50 * 0.181269 / 0.632121 = 14.338 K; the mean-heat steady state is only 50 * 0.2 = 10 K.
    w = thermal.warmup([(5000.0, 200.0), (0.0, 800.0)], AMB, 100.0, 1e5)
    assert w.settled
    assert w.peak - AMB == pytest.approx(14.338, abs=0.02)
    assert thermal.steady_temperature(AMB, thermal.mean_heat([(5000.0, 200.0), (0.0, 800.0)]), 100.0) - AMB \
        == pytest.approx(10.0)


def test_warmup_stops_at_the_cap_and_says_so():
    # tau = 1e6 s against a 10 s cycle: 3 cycles cannot settle
    w = thermal.warmup([(1000.0, 10.0)], AMB, 1.0, 1e6, max_cycles=3)
    assert not w.settled and w.cycles == 3
    # the peak is still the repeating cycle's: a constant 1000 W over k = 1 W/K settles 1000 K over ambient
    assert w.peak == pytest.approx(AMB + 1000.0, rel=1e-9)
    assert max(w.temperatures) < AMB + 1.0  # while the series itself has hardly started
    # the on/off cycle capped early still gives the periodic peak 14.338 K (hand calculation above)
    capped = thermal.warmup([(5000.0, 200.0), (0.0, 800.0)], AMB, 100.0, 1e5, max_cycles=1)
    assert not capped.settled and capped.peak - AMB == pytest.approx(14.338, abs=1e-3)
    assert w.times == tuple(sorted(w.times)) and w.times[0] == 0.0 and w.temperatures[0] == AMB


def test_share_above():
    # hand calculation: 40 s above in 40 + 160 s -> 0.2
    assert thermal.share_above([(True, 40.0), (False, 160.0)]) == pytest.approx(0.2)
    assert not math.isnan(thermal.share_above([(False, 1.0)]))
