"""Sensitivity of every margin: finite differences on the built model, ranked, deterministic."""

from __future__ import annotations

import json
from dataclasses import replace

import pytest

from helpers import minimal, run_cli, write_spec
from specgen.checks import run_checks
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.resolve.machine import resolve
from specgen.sensitivity import numeric_inputs, parse_step, sensitivity


def _machine(data=None):
    return evaluate(Source("mem.yaml", data or minimal(), b""), variants=()).machine


def _margin(machine, check_id="pressure_margin"):
    return next(c.margin for c in run_checks(machine, resolve(machine)).checks if c.id == check_id)


def _effects(s, check_id="pressure_margin"):
    m = next(x for x in s.margins if x.check == check_id)
    return {e.input: e for e in m.effects}, [e.input for e in m.effects]


def test_a_sensitivity_equals_a_finite_difference_computed_here():
    m = _machine()
    s = sensitivity(m, 0.01)
    effects, _ = _effects(s)
    # Finite difference by hand on the model: relief setting 250 bar -> 252.5 bar.
    sup = m.supplies[0]
    moved = replace(m, supplies=(replace(sup, relief_setting=sup.relief_setting * 1.01),))
    assert effects["supplies.main.relief_setting"].up == pytest.approx(_margin(moved) - _margin(m), rel=1e-9)
    # and the load torque 286.5 N*m -> 289.365 N*m, moved down as well
    drive = m.drives[0]
    duty = drive.duty_points[0]
    down = replace(m, drives=(replace(drive, duty_points=(replace(duty, torque=duty.torque * 0.99),)),))
    assert effects["drives.hoist.duty_points.lift.torque"].down == pytest.approx(_margin(down) - _margin(m), rel=1e-9)


def test_the_pressure_margin_is_ruled_by_torque_displacement_efficiency_and_relief():
    # Hand calculation (minimal rig): p_in = 2*pi*T/(Vg*eta_hm) + p_out = 2*pi*286.5/(100e-6*0.9) + 5 bar
    # = 200.01 + 5 = 205.01 bar; margin = (p_r - p_in)/p_r with p_r = 250 bar.
    # +1 % of T: dp rises 2.000 bar -> margin -0.800 points; +1 % of Vg or eta_hm: dp falls 1.980 bar
    # -> +0.792 points; +1 % of p_r: margin = 1 - p_in/(1.01 p_r) -> +0.812 points; +1 % of p_out (0.05 bar):
    # -0.02 points. So the four lead, the return pressure comes far behind.
    effects, order = _effects(sensitivity(_machine(), 0.01))
    assert set(order[:4]) == {"drives.hoist.duty_points.lift.torque", "drives.hoist.motor.displacement",
                              "drives.hoist.motor.efficiency.hydromechanical", "supplies.main.relief_setting"}
    assert effects["drives.hoist.duty_points.lift.torque"].up == pytest.approx(-0.00800, abs=2e-5)
    assert effects["drives.hoist.motor.displacement"].up == pytest.approx(0.00792, abs=2e-5)
    assert effects["supplies.main.relief_setting"].up == pytest.approx(0.00812, abs=2e-5)
    assert effects["supplies.main.return_pressure"].up == pytest.approx(-0.0002, abs=2e-5)


def test_inputs_are_walked_in_model_order_with_zeros_skipped_and_a_fixed_motor_moved_whole():
    data = minimal()
    data["supplies"]["main"]["return_pressure"] = "0 bar"
    knobs, skipped = numeric_inputs(_machine(data))
    paths = [k.path for k in knobs]
    assert ("supplies.main.return_pressure", "zero: no step of its own size") in skipped
    assert "drives.hoist.motor.displacement" in paths and not any("displacement_m" in p for p in paths)
    assert len(next(k for k in knobs if k.path == "drives.hoist.motor.displacement").steps) == 2
    assert paths.index("supplies.main.relief_setting") < paths.index("drives.hoist.motor.displacement")


def test_ranking_is_stable_and_ties_go_by_path():
    m = _machine()
    a, b = sensitivity(m), sensitivity(m)
    assert a == b
    _, order = _effects(a)
    # Vg and eta_hm enter p_in as one product: equal effects, so the path decides their order
    assert order.index("drives.hoist.motor.displacement") < order.index("drives.hoist.motor.efficiency.hydromechanical")


@pytest.mark.parametrize("text, step", [("1 %", 0.01), ("0.5%", 0.005), ("0.02", 0.02), ("0", None),
                                        ("60 %", None), ("one", None)])
def test_the_step_is_read_as_a_percentage_or_a_fraction(text, step):
    assert parse_step(text) == (pytest.approx(step) if step else None)


def test_check_prints_the_top_inputs_and_json_carries_the_whole_table(tmp_path):
    path = write_spec(tmp_path, minimal())
    code, out, _ = run_cli("check", "--sensitivity", "--step", "2 %", path)
    assert code == 0 and "+2 % / -2 %" in out
    code, out, _ = run_cli("check", "--sensitivity", "--format", "json", path)
    table = json.loads(out)["sensitivity"]
    assert table["step"] == 0.01 and {"path": "supplies.main.relief_setting", "si_value": 2.5e7,
                                      "si_step": pytest.approx(2.5e5)} in table["inputs"]
    assert all(m["effects"] == sorted(m["effects"], key=lambda e: -round(abs(e["per_step"]), 12))
               for m in table["margins"])
    code, _, err = run_cli("check", "--sensitivity", "--step", "80 %", path)
    assert code == 2 and "--step" in err


def test_report_draws_a_tornado_chart_for_the_weakest_margins(tmp_path):
    code, out, err = run_cli("report", "--sensitivity", write_spec(tmp_path, minimal()), "-o", tmp_path / "rep")
    html = (tmp_path / "rep" / "index.html").read_text(encoding="utf-8")
    assert code == 0 and 'id="sensitivity"' in html
    assert "hoist.duty_points.lift.torque" in html.split('id="sensitivity"')[1]


def test_forked_workers_give_the_same_table_as_one_process(monkeypatch):
    from specgen import sensitivity as sens
    from specgen.present import chart_batch

    if "fork" not in __import__("multiprocessing").get_all_start_methods():
        pytest.skip("this system cannot fork")
    m = _machine()
    monkeypatch.setattr(chart_batch, "can_fork", lambda: False)
    alone = sensitivity(m)
    monkeypatch.setattr(chart_batch, "can_fork", lambda: True)
    monkeypatch.setattr(chart_batch, "usable_cpus", lambda: 2)
    monkeypatch.setattr(sens.os, "getloadavg", lambda: (0.0, 0.0, 0.0))
    monkeypatch.setattr(sens, "FORK_FROM", 4)
    forked = []
    real = chart_batch._fork_pool
    monkeypatch.setattr(chart_batch, "_fork_pool", lambda n, init: forked.append(n) or real(n, init))
    assert sensitivity(m) == alone and forked and set(forked) == {2}  # both steps drawn by two workers


def test_reused_parts_give_the_results_of_a_whole_resolve():
    from helpers import EXAMPLE

    from specgen import sensitivity as sens
    from specgen.pipeline import run_file

    m = run_file(EXAMPLE, variants=()).machine
    knobs = {k.path: k for k in numeric_inputs(m)[0]}
    reuse: dict = {}
    sens.margins(m, reuse)
    for path in ("drives.cutter_reel.motor.displacement", "supplies.aux.pump.displacement", "fluid.temperature",
                 "drives.bale_winch.gear_stage.ratio", "cooler.capacity"):
        moved = sens._moved(m, knobs[path], 1.05)
        assert resolve(moved, reuse) == resolve(moved), path
        assert sens.margins(moved, reuse) == sens.margins(moved), path


def test_the_json_with_a_sensitivity_table_follows_the_published_schema(tmp_path):
    import jsonschema

    from helpers import ROOT

    schema = json.loads((ROOT / "schemas" / "check-output.schema.json").read_text(encoding="utf-8"))
    code, out, _ = run_cli("check", "--sensitivity", "--format", "json", write_spec(tmp_path, minimal()))
    jsonschema.Draft202012Validator(schema).validate(json.loads(out))
