"""Duty cycles over the computed modes: the invented harbour crane (tests/specs/harbour_crane.yaml).

Relations: time average over the cycle; lumped heat balance C*dT/dt = P - k*(T - T_amb) (textbook heat
transfer); cooler k_c = P_rated / ETD_rated (common practice, no source); h = 12 W/(m^2*K) and
c_oil 1.9, c_steel 0.47 kJ/(kg*K) (from memory).
"""

import copy

import pytest
import yaml

from helpers import ROOT, spec_checks
from specgen.intake.read import Source
from specgen.pipeline import evaluate

CRANE = yaml.safe_load((ROOT / "tests" / "specs" / "harbour_crane.yaml").read_text(encoding="utf-8"))


def crane() -> dict:
    return copy.deepcopy(CRANE)


def results(data: dict):
    return evaluate(Source("mem.yaml", data, b"")).results


def test_cycle_heat_and_power_are_time_averages():
    r = results(crane())
    c = r.cycle_result("container_moves")
    q_hoist, q_lower = r.mode_result("hoisting")["heat_load"], r.mode_result("lowering")["heat_load"]
    # hand calculation: hoisting 20 % of 150 s = 30 s, lowering 20 s, 100 s idle (no heat):
    # Q_mean = (Q_hoist * 30 + Q_lower * 20) / 150
    assert c["mean_heat_load"] == pytest.approx((q_hoist * 30 + q_lower * 20) / 150)
    assert c["peak_heat_load"] == pytest.approx(max(q_hoist, q_lower))
    p_hoist = r.supply_mode("main", "hoisting")["pump_input_power"]
    p_lower = r.supply_mode("main", "lowering")["pump_input_power"]
    assert c.per_supply["main"] == pytest.approx((p_hoist * 30 + p_lower * 20) / 150)


def test_steady_and_peak_oil_temperature_by_hand():
    c = results(crane()).cycle_result("container_moves")
    # hand calculation: k = 10 kW / 40 K + 12 W/(m^2*K) * 2.4 m^2 = 250 + 28.8 = 278.8 W/K
    assert c["cooler_coefficient"] + c["natural_coefficient"] == pytest.approx(278.8)
    # T_ss = 30 degC + Q_mean / 278.8
    assert c["steady_temperature"] == pytest.approx(303.15 + c["mean_heat_load"] / 278.8)
    # C = 0.160 m^3 * 870 kg/m^3 * 1900 + 140 kg * 470 = 264480 + 65800 = 330280 J/K (density: the fluid
    # block's, here the assumed 870 kg/m^3); tau = 330280 / 278.8 = 1184.6 s
    assert c["heat_capacity"] == pytest.approx(330280.0)
    assert c["time_constant"] == pytest.approx(1184.65, abs=0.01)
    # the oil swings about the steady value: the peak of the repeating cycle lies above it
    assert c["steady_temperature"] < c["peak_temperature"] < c["steady_temperature"] + 3.0
    assert c.settled and c.series[0] == (0.0, 303.15)


def test_hoist_a_fifth_of_the_time_passes_and_continuous_fails():
    d = crane()
    assert spec_checks(d, "heat_load", mode="hoisting") == []  # judged by its cycle
    cyc = spec_checks(d, "heat_load", cycle="container_moves")
    assert [c.status for c in cyc] == ["pass"]
    assert [c.status for c in spec_checks(d, "oil_temperature", cycle="container_moves")] == ["pass"]
    d["modes"]["hoisting"]["continuous"] = True
    assert [c.status for c in spec_checks(d, "heat_load", mode="hoisting")] == ["fail"]


def test_a_cycle_of_the_hoist_only_fails():
    d = crane()
    d["duty_cycles"] = {"hoist_only": {"steps": [{"mode": "hoisting", "duration": "60 s"}]}}
    assert [c.status for c in spec_checks(d, "heat_load", cycle="hoist_only")] == ["fail"]
    assert [c.status for c in spec_checks(d, "oil_temperature", cycle="hoist_only")] == ["fail"]


def test_without_duty_cycles_every_mode_is_checked_as_before():
    d = crane()
    del d["duty_cycles"]
    statuses = {c.mode: c.status for c in spec_checks(d, "heat_load")}
    assert statuses == {"hoisting": "fail", "lowering": "pass"}
    assert spec_checks(d, "oil_temperature") == []


def test_share_above_the_continuous_rating():
    d = crane()
    # lift needs 251.1 bar at the inlet: above a 250 bar continuous rating for the 30 s of 150 s
    d["drives"]["hoist"]["motor"]["rating"]["continuous_pressure"] = "250 bar"
    assert results(d).cycle_result("container_moves").above_continuous == {"hoist": pytest.approx(0.2)}


def test_without_the_rated_temperature_difference_the_oil_check_warns():
    d = crane()
    del d["cooler"]["entering_temperature_difference"]
    (c,) = spec_checks(d, "oil_temperature", cycle="container_moves")
    assert c.status == "warn" and c.margin is None
    assert "entering_temperature_difference" in c.message
    assert [x.status for x in spec_checks(d, "heat_load", cycle="container_moves")] == ["pass"]


def test_natural_dissipation_alone_and_no_dissipation_at_all():
    d = crane()
    del d["cooler"]
    c = results(d).cycle_result("container_moves")
    # hand calculation: only h*A = 12 * 2.4 = 28.8 W/K; T_ss = 30 degC + Q_mean / 28.8
    assert c["steady_temperature"] == pytest.approx(303.15 + c["mean_heat_load"] / 28.8)
    assert [x.status for x in spec_checks(d, "oil_temperature")] == ["fail"]  # 5 kW on a bare tank boils
    d["reservoir"] = {"oil_volume": "160 L"}
    (w,) = spec_checks(d, "oil_temperature")
    assert w.status == "warn" and "needs a cooler" in w.message


def test_without_a_reservoir_the_peak_is_the_hottest_steps_equilibrium():
    d = crane()
    del d["reservoir"]
    r = results(d)
    c = r.cycle_result("container_moves")
    # hand calculation: k = 10 kW / 40 K = 250 W/K; T_peak = 30 degC + Q_hoisting / 250
    assert c["peak_temperature"] == pytest.approx(303.15 + r.mode_result("hoisting")["heat_load"] / 250.0)
    assert c.series == () and "heat_capacity" not in c.values
