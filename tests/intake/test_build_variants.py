"""Bad variants are refused at validation: one located line each (file, line, field), exit status 2."""

from __future__ import annotations

from pathlib import Path

import pytest

from helpers import minimal, run_cli, write_spec


@pytest.mark.parametrize("key, value, says", [
    ("supplies.main.relief", "200 bar", "is not a field of the spec"),
    ("supplies.main.relief_setting", "200 kW", "supplies.main.relief_setting"),
    ("drives.winch.motor.displacement", "100 cm^3", "names 'winch', which is not defined"),
    ("drives.hoist.motor.kind", "vane", "cannot be replaced by a variant"),
    ("drives.hoist.motor.displacement", {"min": "120 cm^3", "max": "100 cm^3"}, "minimum displacement"),
    ("drives.hoist.motor.efficiency_table", "fast", "has no efficiency table 'fast'"),
    ("supplies.main.pump.control", "load_sensed", "takes one of"),
    ("drives.hoist.motor.efficiency.volumetric", 1.2, "an efficiency lies in (0, 1]"),
])
def test_a_bad_replacement_is_located_at_its_key(tmp_path, key, value, says):
    data = minimal()
    data["variants"] = {"bad": {"set": {key: value}}}
    path = write_spec(tmp_path, data)
    code, out, err = run_cli("check", path)
    assert code == 2 and out == ""
    (line,) = err.strip().splitlines()
    # the variants block starts after the minimal spec: its "set" key's line and the field's path
    text = path.read_text(encoding="utf-8").splitlines()
    where = int(line.removeprefix("error: ").split(":")[1])
    assert key.split(".")[0] in text[where - 1] and f"variants.bad.set.{key}" in line
    assert says in line


def test_a_number_must_be_positive_and_a_count_whole(tmp_path):
    data = minimal()
    data["drives"]["hoist"]["gear_stage"] = {"ratio": 20}
    for value, ok in ((2.5, True), (-3, False), (25, True)):
        data["variants"] = {"v": {"set": {"drives.hoist.gear_stage.ratio": value}}}
        code, _, err = run_cli("check", write_spec(tmp_path, data))
        assert (code != 2) == ok, err
    duty = data["drives"]["hoist"]["duty_points"]["lift"]
    del duty["torque"], duty["speed"]
    duty["load"] = {"winch": {"line_pull": "10 kN", "line_speed": "0.5 m/s", "drum_diameter": "300 mm",
                              "rope_diameter": "10 mm", "layer": 2}}
    for value, ok in ((2.5, False), (3, True)):
        data["variants"] = {"v": {"set": {"drives.hoist.duty_points.lift.load.winch.layer": value}}}
        code, _, err = run_cli("check", write_spec(tmp_path, data))
        assert (code != 2) == ok, err
    assert "does not fit 'drives.hoist.duty_points.lift.load.winch.layer'" in run_cli(
        "check", write_spec(tmp_path, dict(data, variants={"v": {"set": {
            "drives.hoist.duty_points.lift.load.winch.layer": 2.5}}})))[2]


def _yard_loader_with(tmp_path, key: str, value: str):
    text = (Path(__file__).resolve().parents[2] / "example_specs" / "yard_loader.yaml").read_text()
    text += f"\nvariants:\n  alt:\n    title: Alt\n    set:\n      {key}: {value}\n"
    spec = tmp_path / "v.yaml"
    spec.write_text(text)
    return run_cli("check", "-q", str(spec))


@pytest.mark.parametrize("key, value, words", [
    # a pump made pressure compensated keeps the load-sensing valve keys, which only a load-sensing pump takes
    ("supplies.work.pump.control", "pressure_compensated", "ls_valves applies only"),
    ("supplies.work.prime_mover", "nothing", "not defined under prime_movers"),
    # the charge pressure above the side-B relief (400 bar) of the loop
    ("supplies.travel.closed_loop.charge.pressure", "500 bar", "above the charge pressure"),
    ("modes.sweeping.prime_mover_speeds.diesel", "idle", "cannot be moved here"),
])
def test_a_variant_keeps_every_rule_of_the_spec(tmp_path, key, value, words):
    code, out, err = _yard_loader_with(tmp_path, key, value)
    assert code == 2 and "Traceback" not in err
    assert "variants.alt" in err and words in err and len(err.strip().splitlines()) == 1
