"""Text from a spec or its file name cannot forge a line of output, markup or a mention."""

from __future__ import annotations

import re

import pytest
from helpers import minimal, run_cli, write_spec

from specgen.errors import Location, Problem
from specgen.present import diff_markdown
from specgen.safe_text import clip, escape


@pytest.mark.parametrize("raw, shown", [
    ("a.yaml\nPASS  everything", "a.yaml\\nPASS  everything"),
    ("a\r\nb", "a\\r\\nb"),
    ("x\u2028y\u2029z", "x\\u2028y\\u2029z"),
    ("\x1b[32mPASS\x1b[0m", "\\x1b[32mPASS\\x1b[0m"),
    ("abc\u202edcba", "abc\\u202edcba"),
    ("l\u200fr\u061cx\u2066y", "l\\u200fr\\u061cx\\u2066y"),
    ("::error file=a::forged", "\\x3a:error file=a::forged"),
    ("Förderband ölpumpe", "Förderband ölpumpe"),
])
def test_escape_keeps_one_visible_line(raw, shown):
    assert escape(raw) == shown and "\n" not in escape(raw)


def test_a_file_name_cannot_forge_a_pass_line_in_quiet_check(tmp_path):
    data = minimal()
    data["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "5000 N*m"  # fails: the spec is not fine
    name = "spec.yaml\nPASS  all checks pass"
    spec = write_spec(tmp_path, data, name)
    code, out, err = run_cli("check", "-q", spec)
    assert code == 1
    assert not any(line.startswith("PASS") for line in out.splitlines()), out
    assert "spec.yaml\\nPASS" in out


def test_a_file_name_cannot_split_an_error_line(tmp_path):
    spec = write_spec(tmp_path, "format: 1\n", "bad\nerror: forged.yaml")
    code, _, err = run_cli("check", spec)
    assert code == 2 and len(err.splitlines()) >= 1
    assert all(line.startswith("error: ") and "bad\\nerror: forged" in line for line in err.splitlines())


def test_problem_lines_cap_every_echo():
    p = Problem(Location("s.yaml", 3, 4), "drives.x", f"'{'9' * 5000} bar' holds more than one number; '{'y' * 20}'")
    text = str(p)
    assert len(text) < 300 and "(5004 characters)" in text and f"'{'y' * 20}'" in text
    assert clip("abc", 2) == "ab... (3 characters)"
    long_message = Problem(Location("s.yaml"), "", "z" * 10_000)
    assert len(str(long_message)) < 500


@pytest.mark.parametrize("where, value", [
    (("machine", "id"), "rig\n"),
    (("machine", "title"), "Rig\nPASS"),
    (("machine", "title"), "Rig\u2028PASS"),
    (("machine", "revision"), "A\n"),
    (("drives", "hoist", "motor", "model"), "M1\r"),
])
def test_ids_and_titles_with_a_line_break_are_refused(tmp_path, where, value):
    data = minimal()
    node = data
    for key in where[:-1]:
        node = node[key]
    node[where[-1]] = value
    code, _, err = run_cli("check", write_spec(tmp_path, data))
    assert code == 2 and ".".join(where) in err, err


def test_a_key_with_a_trailing_line_break_is_not_an_id(tmp_path):
    data = minimal()
    data["drives"]["hoist\n"] = data["drives"].pop("hoist")
    data["modes"]["work"]["drives"] = {"hoist\n": "lift"}
    code, _, err = run_cli("check", write_spec(tmp_path, data))
    assert code == 2 and "'hoist\\n' is not a valid id" in err


@pytest.mark.parametrize("text, bad", [
    ("![x](https://example.invalid/p.png)", [r"(?<!\\)!\[", r"(?<!\\)\]\("]),
    ("[click](https://example.invalid)", [r"(?<!\\)\[", r"https://"]),
    ("<https://example.invalid>", ["<https"]),
    ("see https://example.invalid and www.example.invalid", ["https://", "www\\."]),
    ("@someone and @org/team", [r"@\w"]),
    ("fixes #12", [r"(?<!&)#\d"]),
    ("~~struck~~ *em* _em_ **strong**", [r"(?<!\\)~", r"(?<!\\)\*", r"(?<!\\)_"]),
    ("<img src=x onerror=alert(1)>", ["<img"]),
    ("a | b", [r"(?<!\\)\|"]),
    ("`code`", [r"(?<!\\)`"]),
    ("$x$", [r"(?<!\\)\$"]),
    ("# Heading", ["^#"]),
    ("> quote", ["^>"]),
    ("1. item", [r"^1\."]),
    ("a\nb\u2028c", ["\n", "\u2028"]),
    ("\x1b[31m", ["\x1b"]),
])
def test_markdown_cells_render_nothing_from_spec_text(text, bad):
    cell = diff_markdown._md_cell(text)
    for pattern in bad:
        assert not re.search(pattern, cell), (pattern, cell)


def test_markdown_diff_of_a_hostile_title_stays_text(tmp_path):
    data = minimal()
    data["machine"]["title"] = "Rig ![x](https://example.invalid/a.png) @someone #1 <b>bold</b>"
    old = write_spec(tmp_path, data, "old.yaml")
    data["supplies"]["main"]["relief_setting"] = "240 bar"
    new = write_spec(tmp_path, data, "new.yaml")
    code, out, err = run_cli("diff", old, new, "--format", "markdown")
    assert code in (0, 1), err
    title = out.splitlines()[0]
    assert "<b>" not in title and "![" not in title and "@someone" not in title and "#1" not in title


def test_an_apostrophe_in_a_sentence_does_not_cut_it():
    words = "the spec's folder " + "y" * 120 + " and 'z'"
    text = str(Problem(Location("s.yaml"), "", f"'{'x' * 100}' resolves to {words}"))
    assert words in text and "(100 characters)" in text
