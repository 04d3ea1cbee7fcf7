"""The yard loader demo end to end: one engine shared by a closed-loop travel pump and a load-sensing work
pump, checked by hand against the relations of the domain primer (sections 6, 14, 15 and 16)."""

from __future__ import annotations

from pathlib import Path

import pytest

from specgen.intake.read import load_text
from specgen.pipeline import evaluate

SPEC = Path(__file__).resolve().parents[1] / "example_specs" / "yard_loader.yaml"
RPM = 1 / 60
LPM = 1e-3 / 60


@pytest.fixture(scope="module")
def results():
    return evaluate(load_text(SPEC.read_bytes(), str(SPEC))).results


def _sm(results, supply, mode):
    return next(r for r in results.supply_modes if r.supply == supply and r.mode == mode)


def test_pumps_turn_at_the_engine_speed_the_mode_names(results):
    # Mode sweeping names the engine's 'work' speed, 1800 rpm; drive ratio 1 (primer 16: pump speed = engine
    # speed times drive ratio). Work pump 36 cm^3 * 1800 rpm * 0.94 = 60.912 L/min (primer 6: q = Vp * n * eta_v).
    work = _sm(results, "work", "sweeping")
    assert work["pump_shaft_speed"] == pytest.approx(1800 * RPM)
    assert work["pump_delivery"] == pytest.approx(36e-6 * 30 * 0.94)
    assert _sm(results, "work", "climbing")["pump_shaft_speed"] == pytest.approx(2400 * RPM)


def test_load_sensing_pump_runs_at_the_highest_need_plus_its_margin(results):
    # primer 14: p_pump = max(p_need) + dp_LS; the auger needs the most in mode sweeping.
    work = _sm(results, "work", "sweeping")
    needs = [results.duty(d, u)["inlet_pressure"] for d, u in (("brush", "sweep"), ("auger", "collect"), ("fan", "cool"))]
    assert work["pump_pressure"] == pytest.approx(max(needs) + 20e5)
    # throttling loss of the brush: (p_pump - p_need) * q (primer 14), hand calculation from the same values
    brush = results.duty("brush", "sweep")
    assert work.drive_value("brush", "throttling_loss").value == pytest.approx(
        (work["pump_pressure"] - brush["inlet_pressure"]) * brush["flow_demand"], rel=1e-9)


def test_engine_load_is_the_sum_of_both_pumps(results):
    # primer 16: input powers of the pumps on one engine add; 55 kW at 2400 rpm from the power curve.
    pm = results.prime_mover_mode("diesel", "climbing")
    total = _sm(results, "travel", "climbing")["pump_input_power"] + _sm(results, "work", "climbing")["pump_input_power"]
    assert pm["power_used"] == pytest.approx(total)
    assert pm["power_available"] == pytest.approx(55e3)
    # at the 'work' speed, 1800 rpm, the curve point gives 46 kW
    assert results.prime_mover_mode("diesel", "sweeping")["power_available"] == pytest.approx(46e3)


def test_downhill_the_travel_pump_drives_the_engine_and_no_valve_heat_is_made(results):
    # primer 15: overrunning, the motors pump and the pump motors the engine: negative input power.
    travel = _sm(results, "travel", "descending")
    assert travel["pump_input_power"] < 0
    pm = results.prime_mover_mode("diesel", "descending")
    assert pm["power_used"] == pytest.approx(travel["pump_input_power"])
    checks = {(c.id, c.mode): c for c in results.checks if c.prime_mover == "diesel"}
    braking = checks[("engine_braking", "descending")]
    assert braking.status == "pass" and braking.limit == pytest.approx(95.0)  # motoring torque, N*m
