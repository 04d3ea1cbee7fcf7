"""Plain YAML values are read as written (YAML 1.2 core rules), never as YAML 1.1's surprises.

YAML 1.1 reads 1:4 as 64 (base 60: 1*60 + 4), 30:1 as 1801 (30*60 + 1), 017 as 15 (octal),
0x1F as 31, 1_000 as 1000 and yes/on as true (YAML 1.1 type repository, from memory); here a
colon ratio is refused with the number to write, the others stay text, so the field that needed
a number says so where it is written.
"""

from __future__ import annotations

import os

import pytest
import yaml
from helpers import minimal, run_cli, write_spec

from specgen.errors import SpecError
from specgen.intake.read import load_file, load_text


@pytest.mark.parametrize("plain, value", [
    ("0x1F", "0x1F"), ("0o17", "0o17"), ("017", "017"), ("1_000", "1_000"),
    (".inf", ".inf"), ("-.inf", "-.inf"), ("+.inf", "+.inf"), (".nan", ".nan"), ("yes", "yes"), ("on", "on"),
    ("Off", "Off"), ("n", "n"), ("2025-03-14", "2025-03-14"), ("0b101", "0b101"),
    ("true", True), ("False", False), ("12", 12), ("-3", -3), ("0", 0), ("0.92", 0.92), ("2.5e3", 2500.0),
    ("1e5", 100000.0), (".5", 0.5), ("1.", 1.0), ("~", None),
])
def test_plain_values_read_as_written(plain, value):
    data = load_text(f"x: {plain}\n".encode(), "s.yaml").data
    assert data["x"] == value and type(data["x"]) is type(value)


@pytest.mark.parametrize("text, words", [
    ("x: 1:4", "'1:4': write a ratio as a number, e.g. 0.25 or 4"),
    ("x: 30:1", "'30:1': write a ratio as a number, e.g. 30 or 0.03333"),
    ("1:4: x", "'1:4': write a ratio as a number"),
    ("x: !!int 0x1F", "'0x1F' is not a decimal number"),
    ("x: !!float .nan", "'.nan' is not a decimal number"),
    ("x: !!bool yes", "'yes' is not a boolean"),
    ("x: !!binary aGVsbG8=", "the YAML tag '!!binary' is not allowed"),
    ("x: !!timestamp 2025-03-14", "the YAML tag '!!timestamp' is not allowed"),
    ("x: !!set {a, b}", "the YAML tag '!!set' is not allowed"),
    ("x: 1e400", "1e400 is too large a number"),
    ("x: " + "9" * 400, "more than 300 digits"),
    ("x: " + "9" * 5000, "more than 300 digits"),  # past Python's own limit on int() of a string
])
def test_tags_and_oversize_numbers_are_refused_where_written(text, words):
    with pytest.raises(SpecError) as err:
        load_text((text + "\n").encode(), "s.yaml")
    assert words in str(err.value) and str(err.value).startswith("s.yaml:1:")


@pytest.mark.parametrize("where, plain, words", [
    (("drives", "hoist", "gear_stage"), {"ratio": "1:4", "efficiency": 0.95}, "write a ratio as a number, e.g. 0.25"),
    (("drives", "hoist", "duty_points", "lift"), {"torque": "1:4", "speed": "500 rpm"},
     "'1:4': write a ratio as a number, e.g. 0.25 or 4"),
    (("supplies", "main"), {"relief_setting": "9,5 bar"}, "the decimal mark is a point: 9.5 bar"),
    (("drives", "hoist", "motor"), {"case_drain": "yes"}, "'yes' should be"),
])
def test_a_spec_with_yaml_1_1_values_is_refused_with_a_located_line(tmp_path, where, plain, words):
    data = minimal()
    node = data
    for key in where:
        node = node.setdefault(key, {})
    node.update(plain)
    text = yaml.safe_dump(data, sort_keys=False)
    for v in plain.values():  # write them plain, as a person would, not quoted as safe_dump does
        text = text.replace(f"'{v}'", str(v))
    code, out, err = run_cli("check", write_spec(tmp_path, text))
    assert code == 2 and out == "", err
    assert words in err and "Traceback" not in err


def test_huge_integers_in_a_spec_give_exit_2(tmp_path):
    text = yaml.safe_dump(minimal(), sort_keys=False).replace("revision: A", "revision: " + "7" * 500)
    code, _, err = run_cli("check", write_spec(tmp_path, text))
    assert code == 2 and "more than 300 digits" in err


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="needs FIFOs")
def test_fifo_device_and_folder_are_refused_by_what_is_opened(tmp_path):
    fifo = tmp_path / "spec.yaml"
    os.mkfifo(fifo)
    for path, words in ((fifo, "is not a regular file"), ("/dev/zero", "is not a regular file"),
                        (tmp_path, "is a folder")):
        with pytest.raises(SpecError, match=words):
            load_file(path)
    link = tmp_path / "link.yaml"
    link.symlink_to("/dev/zero")
    with pytest.raises(SpecError, match="is not a regular file"):
        load_file(link)


def test_a_file_beside_a_spec_must_stay_in_its_folder(tmp_path):
    (tmp_path / "outside.yaml").write_text("a: 1\n")
    folder = tmp_path / "specs"
    folder.mkdir()
    (folder / "x.yaml").symlink_to(tmp_path / "outside.yaml")
    with pytest.raises(SpecError, match="outside the folder"):
        load_file(folder / "x.yaml", inside=folder)
    assert load_file(tmp_path / "outside.yaml", inside=tmp_path).data == {"a": 1}
