"""Every class of bad input: one located line each, exit status 2, no traceback."""

import re
import subprocess
import sys

import pytest

from helpers import ROOT, minimal, run_cli, write_spec

import yaml


def errors_for(tmp_path, data):
    path = write_spec(tmp_path, data)
    code, out, err = run_cli("check", path)
    assert code == 2, err
    assert "Traceback" not in err
    lines = [l for l in err.splitlines() if l.startswith("error: ")]
    assert len(lines) == len(err.splitlines())
    return path, lines


def line_of(path, needle):
    for n, text in enumerate(path.read_text().splitlines(), 1):
        if needle in text:
            return n
    raise AssertionError(needle)


def test_duplicate_key_is_an_error(tmp_path):
    text = yaml.safe_dump(minimal(), sort_keys=False).replace(
        "    relief_setting: 250 bar\n", "    relief_setting: 250 bar\n    relief_setting: 180 bar\n")
    path, lines = errors_for(tmp_path, text)
    n = line_of(path, "relief_setting: 180 bar")
    assert lines == [lines[0]] and f"{path}:{n}:" in lines[0] and "duplicate key 'relief_setting'" in lines[0]


def test_schema_error_names_line_column_and_path(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["motor"]["kind"] = "piston"
    path, lines = errors_for(tmp_path, d)
    n = line_of(path, "kind: piston")
    assert re.search(rf"spec\.yaml:{n}:\d+: drives\.hoist\.motor\.kind: 'piston' is not one of", lines[0])


def test_unknown_key_points_at_the_key(tmp_path):
    d = minimal()
    d["supplies"]["main"]["relief"] = "250 bar"
    path, lines = errors_for(tmp_path, d)
    n = line_of(path, "relief: 250 bar")
    assert f":{n}:" in lines[0] and "supplies.main.relief: unknown key 'relief'" in lines[0]


def test_missing_required_field(tmp_path):
    d = minimal()
    del d["supplies"]["main"]["relief_setting"]
    _, lines = errors_for(tmp_path, d)
    assert "supplies.main: 'relief_setting' is required here" in lines[0]


def test_unknown_unit(tmp_path):
    d = minimal()
    d["supplies"]["main"]["relief_setting"] = "250 barr"
    path, lines = errors_for(tmp_path, d)
    assert f":{line_of(path, '250 barr')}:" in lines[0]
    assert "supplies.main.relief_setting: '250 barr' cannot be read as a quantity (unknown unit barr)" in lines[0]


def test_wrong_dimension_names_field_value_and_expected(tmp_path):
    d = minimal()
    d["supplies"]["main"]["relief_setting"] = "250 rpm"
    _, lines = errors_for(tmp_path, d)
    assert "supplies.main.relief_setting: '250 rpm'" in lines[0] and "expected pressure" in lines[0]


@pytest.mark.parametrize("value, words", [("0 cm^3", "greater than zero"), ("-100 cm^3", "greater than zero"),
                                           ("nan cm^3", "not a finite"), ("inf cm^3", "not a finite")])
def test_non_physical_values(tmp_path, value, words):
    d = minimal()
    d["drives"]["hoist"]["motor"]["displacement"] = value
    _, lines = errors_for(tmp_path, d)
    assert "drives.hoist.motor.displacement" in lines[0] and words in lines[0]


@pytest.mark.parametrize("value", [1.2, 0, -0.5, "120 %"])
def test_efficiency_outside_unit_interval(tmp_path, value):
    d = minimal()
    d["drives"]["hoist"]["motor"]["efficiency"]["volumetric"] = value
    _, lines = errors_for(tmp_path, d)
    assert "drives.hoist.motor.efficiency.volumetric" in lines[0] and "(0, 1]" in lines[0]


def test_dangling_references_name_both_ends(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["supply"] = "aux"
    d["modes"]["work"]["drives"] = {"hoist": "drop", "winch": "lift"}
    _, lines = errors_for(tmp_path, d)
    text = "\n".join(lines)
    assert "drives.hoist.supply: drive 'hoist' names supply 'aux', which is not defined (supplies: main)" in text
    assert "mode 'work' runs drive 'hoist' at duty point 'drop', which drive 'hoist' does not define" in text
    assert "mode 'work' names drive 'winch', which is not defined (drives: hoist)" in text


def test_several_errors_reported_at_once(tmp_path):
    d = minimal()
    d["supplies"]["main"]["relief_setting"] = "250 rpm"
    d["drives"]["hoist"]["motor"]["displacement"] = "-1 cm^3"
    d["drives"]["hoist"]["duty_points"]["lift"]["speed"] = "500 N*m"
    _, lines = errors_for(tmp_path, d)
    assert len(lines) == 3


@pytest.mark.parametrize("content, words", [
    ("", "file is empty"),
    ("format: 1\nmachine: [\n", "YAML syntax error"),
    ("- a\n- b\n", "must be a YAML mapping"),
    ("format: 2\n", "reads format 1"),
])
def test_unreadable_files(tmp_path, content, words):
    _, lines = errors_for(tmp_path, content)
    assert any(words in l for l in lines)


def test_not_utf8_and_binary_and_missing_and_folder(tmp_path):
    bad = tmp_path / "latin.yaml"
    bad.write_bytes("machine: caf\xe9\n".encode("latin-1"))
    binary = tmp_path / "blob.yaml"
    binary.write_bytes(b"\x00\x01\x02")
    (tmp_path / "empty_folder").mkdir()
    for target, words in [(bad, "not UTF-8"), (binary, "binary"), (tmp_path / "none.yaml", "no such file"),
                          (tmp_path / "empty_folder", "is a folder")]:
        code, _, err = run_cli("check", target)
        assert code == 2 and words in err and "Traceback" not in err


def test_python_tags_cannot_build_objects(tmp_path):
    path = write_spec(tmp_path, "format: 1\nmachine: !!python/object/apply:os.system ['echo pwned']\n")
    code, out, err = run_cli("check", path)
    assert code == 2 and "pwned" not in out and "Traceback" not in err


def test_subprocess_gives_no_traceback(tmp_path):
    d = minimal()
    d["supplies"]["main"]["relief_setting"] = "250 rpm"
    path = write_spec(tmp_path, d)
    p = subprocess.run([sys.executable, "-m", "specgen", "check", str(path)], capture_output=True, text=True, cwd=ROOT)
    assert p.returncode == 2 and "Traceback" not in p.stderr and "relief_setting" in p.stderr
