"""Sizing from a target pressure: the minimum displacement, the ISO 3 or stocked size proposed,
the displacement_choice check, and the parts file's own errors and folder rule."""

import math
import os

import pytest
import yaml

from helpers import minimal, run_cli, write_spec
from specgen.errors import SpecError
from specgen.pipeline import evaluate, run_file
from specgen.intake.read import Source


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def sized(series=None):
    d = minimal()
    m = d["drives"]["hoist"]["motor"]
    del m["displacement"]
    m["target_pressure"] = "200 bar"
    if series:
        d["sizing"] = {"series": series}
    return d


def test_target_pressure_proposes_the_next_r10_size_and_computes_with_it():
    o = outcome(sized())
    dr = o.results.drive_result("hoist")
    # Vg_min = 2*pi*T / ((p_target - p_out)*eta_hm) = 2*pi*286.5 / (195e5*0.9) = 102.57 cm^3
    vg_min = 2 * math.pi * 286.5 / (195e5 * 0.9)
    assert dr["minimum_displacement"] == pytest.approx(vg_min)
    # ISO 3 R10: ... 100, 125, 160 ... -> 125 cm^3; R20: 100, 112 -> 112 cm^3
    assert dr["proposed_displacement"] == pytest.approx(125e-6)
    r = o.results.duty("hoist", "lift")
    assert r["displacement"] == pytest.approx(125e-6) and r.values["displacement"].note == "proposed"
    assert r["pressure_differential"] == pytest.approx(2 * math.pi * 286.5 / (125e-6 * 0.9))
    c = next(c for c in o.results.checks if c.id == "displacement_choice")
    assert c.status == "pass"
    assert outcome(sized("R20")).results.drive_result("hoist")["proposed_displacement"] == pytest.approx(112e-6)


def test_given_displacement_below_the_minimum_fails():
    d = minimal()
    d["drives"]["hoist"]["motor"]["target_pressure"] = "150 bar"  # needs 2*pi*286.5/(145e5*0.9) = 137.9 cm^3
    o = outcome(d)
    c = next(c for c in o.results.checks if c.id == "displacement_choice")
    assert c.status == "fail" and c.limit == pytest.approx(2 * math.pi * 286.5 / (145e5 * 0.9))
    assert "160.0 cm^3/rev" in c.message  # the R10 proposal is named


def test_motor_needs_a_displacement_or_a_target():
    d = minimal()
    del d["drives"]["hoist"]["motor"]["displacement"]
    with pytest.raises(SpecError) as e:
        outcome(d)
    assert "drives.hoist.motor: give the motor's displacement, or target_pressure" in str(e.value)


PARTS = {"format": 1, "motors": {"axial_piston": ["90 cm^3", "110 cm^3", "140 cm^3"]}}


def test_parts_file_gives_the_smallest_stocked_size(tmp_path):
    (tmp_path / "stock.parts.yaml").write_text(yaml.safe_dump(PARTS), encoding="utf-8")
    d = sized()
    d["sizing"] = {"parts_file": "stock.parts.yaml"}
    o = run_file(write_spec(tmp_path, d))
    assert o.results.drive_result("hoist")["proposed_displacement"] == pytest.approx(110e-6)  # >= 102.6 cm^3


def test_nothing_in_stock_large_enough_fails_the_choice(tmp_path):
    (tmp_path / "stock.parts.yaml").write_text(yaml.safe_dump({"format": 1, "motors": {"axial_piston": ["90 cm^3"]}}),
                                               encoding="utf-8")
    d = sized()
    d["sizing"] = {"parts_file": "stock.parts.yaml"}
    o = run_file(write_spec(tmp_path, d))
    c = next(c for c in o.results.checks if c.id == "displacement_choice")
    assert c.status == "fail" and "No stocked axial piston motor" in c.message
    assert o.results.duty("hoist", "lift")["displacement"] == pytest.approx(2 * math.pi * 286.5 / (195e5 * 0.9))


def test_parts_file_errors_point_into_the_parts_file(tmp_path):
    (tmp_path / "stock.parts.yaml").write_text("format: 1\nmotors:\n  axial_piston:\n    - 90 cm^3\n    - 110 bar\n",
                                               encoding="utf-8")
    d = sized()
    d["sizing"] = {"parts_file": "stock.parts.yaml"}
    with pytest.raises(SpecError) as e:
        run_file(write_spec(tmp_path, d))
    text = str(e.value)
    assert f"{tmp_path / 'stock.parts.yaml'}:5:7: motors.axial_piston.1: '110 bar' is pressure" in text


def test_parts_file_kind_missing_is_located_in_the_spec(tmp_path):
    (tmp_path / "stock.parts.yaml").write_text(yaml.safe_dump({"format": 1, "motors": {"orbital": ["100 cm^3"]}}),
                                               encoding="utf-8")
    d = sized()
    d["sizing"] = {"parts_file": "stock.parts.yaml"}
    with pytest.raises(SpecError) as e:
        run_file(write_spec(tmp_path, d))
    assert "drives.hoist.motor.kind: parts file 'stock.parts.yaml' lists no axial_piston motors" in str(e.value)


def shared_and_machine(tmp_path):
    """A parts file in tmp/shared and an empty spec folder tmp/machine beside it."""
    outside = tmp_path / "shared"
    outside.mkdir()
    (outside / "stock.parts.yaml").write_text(yaml.safe_dump(PARTS), encoding="utf-8")
    spec_dir = tmp_path / "machine"
    spec_dir.mkdir()
    return outside, spec_dir


def test_parts_file_outside_the_spec_folder_is_refused_unless_allowed(tmp_path):
    _, spec_dir = shared_and_machine(tmp_path)
    d = sized()
    d["sizing"] = {"parts_file": "../shared/stock.parts.yaml"}
    spec = write_spec(spec_dir, d)
    code, _, err = run_cli("check", spec)
    assert code == 2 and "sizing.parts_file" in err and "outside the spec's folder" in err
    assert "--allow-outside-files" in err and "Traceback" not in err
    code, out, _ = run_cli("check", "--allow-outside-files", spec)
    assert code != 2 and "110.0 cm^3/rev" in out  # computed with the stocked size


def test_symlink_out_of_the_tree_is_refused(tmp_path):
    outside, spec_dir = shared_and_machine(tmp_path)
    os.symlink(outside / "stock.parts.yaml", spec_dir / "stock.parts.yaml")
    d = sized()
    d["sizing"] = {"parts_file": "stock.parts.yaml"}
    with pytest.raises(SpecError) as e:
        run_file(write_spec(spec_dir, d))
    assert "outside the spec's folder" in str(e.value)
    assert run_file(write_spec(spec_dir, d), allow_outside_files=True).results.drive_result("hoist")
