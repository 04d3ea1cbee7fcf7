"""Duty cycles, the cooler's rated temperature difference and the reservoir as the spec writes them."""

import copy

import pytest
import yaml

from helpers import ROOT, run_cli, write_spec
from specgen.intake.read import Source
from specgen.pipeline import evaluate

CRANE = yaml.safe_load((ROOT / "tests" / "specs" / "harbour_crane.yaml").read_text(encoding="utf-8"))


def machine(d):
    return evaluate(Source("mem.yaml", d, b"")).machine


def refused(tmp_path, d) -> str:
    code, out, err = run_cli("check", write_spec(tmp_path, d))
    assert code == 2 and "Traceback" not in err
    return err


def test_steps_by_share_and_by_duration():
    m = machine(copy.deepcopy(CRANE))
    (c,) = m.duty_cycles
    # 20 % of 150 s = 30 s; the 20 s step as written; the period as written
    assert [(s.mode, s.duration) for s in c.steps] == [("hoisting", pytest.approx(30.0)), ("lowering", 20.0)]
    assert c.period == 150.0
    assert m.cooler.entering_temperature_difference == 40.0  # "40 K"
    # 0.160 m^3 * 870 kg/m^3 (the fluid block's assumed density) = 139.2 kg
    assert m.reservoir.oil_mass == pytest.approx(139.2)
    assert m.reservoir.heat_transfer_coefficient.assumed
    assert m.max_oil_temperature.value == pytest.approx(343.15) and m.ambient_temperature == pytest.approx(303.15)


def test_period_defaults_to_the_steps_and_the_limit_to_80_degc():
    d = copy.deepcopy(CRANE)
    d["duty_cycles"]["container_moves"] = {"steps": [{"mode": "hoisting", "duration": "30 s"},
                                                     {"mode": "lowering", "duration": "20 s"}]}
    del d["max_oil_temperature"]
    m = machine(d)
    assert m.duty_cycles[0].period == 50.0
    assert m.max_oil_temperature.value == pytest.approx(353.15) and m.max_oil_temperature.assumed


def test_temperature_difference_in_degc_is_a_difference():
    d = copy.deepcopy(CRANE)
    d["cooler"]["entering_temperature_difference"] = "40 degC"
    assert machine(d).cooler.entering_temperature_difference == pytest.approx(40.0)


def test_unknown_mode_in_a_cycle_is_refused_at_its_line(tmp_path):
    d = copy.deepcopy(CRANE)
    d["duty_cycles"]["container_moves"]["steps"][1]["mode"] = "slewing"
    err = refused(tmp_path, d)
    assert "duty_cycles.container_moves.steps.1.mode" in err and "'slewing'" in err


def test_share_needs_a_period(tmp_path):
    d = copy.deepcopy(CRANE)
    del d["duty_cycles"]["container_moves"]["period"]
    assert "needs the cycle's period" in refused(tmp_path, d)


def test_steps_longer_than_the_period_are_refused(tmp_path):
    d = copy.deepcopy(CRANE)
    d["duty_cycles"]["container_moves"]["period"] = "40 s"  # 20 % of 40 s + 20 s = 28 s fits
    machine(d)
    d["duty_cycles"]["container_moves"]["period"] = "24 s"  # 4.8 s + 20 s = 24.8 s does not
    assert "longer than the period" in refused(tmp_path, d)


def test_duration_and_share_together_are_refused(tmp_path):
    d = copy.deepcopy(CRANE)
    d["duty_cycles"]["container_moves"]["steps"][0]["duration"] = "30 s"
    assert "duty_cycles.container_moves.steps.0" in refused(tmp_path, d)


def test_a_reservoir_of_oil_alone():
    d = copy.deepcopy(CRANE)
    d["reservoir"] = {"oil_mass": "200 kg"}
    m = machine(d)
    assert (m.reservoir.oil_mass, m.reservoir.steel_mass, m.reservoir.surface_area) == (200.0, 0.0, 0.0)
    # hand calculation: C = 200 kg * 1900 J/(kg*K) = 380 kJ/K; only the cooler dissipates: k = 250 W/K
    c = evaluate(Source("mem.yaml", d, b"")).results.cycle_result("container_moves")
    assert c["heat_capacity"] == pytest.approx(380000.0) and c["time_constant"] == pytest.approx(1520.0)
