"""The bad-spec corpus: every file in tests/corpus/bad gives exit status 2 and one located line per problem.

Each case states what it expects in its first lines (or, for a file that cannot hold them, in a
sidecar NAME.expect or, for a folder, in NAME/expect):

    # expect: <part of the message>
    # line: <line the message must point at>     (optional)

one "expect" per problem, in the order reported. Adding a file adds a case.
"""

from __future__ import annotations

import os
import re
import subprocess
import sys
from pathlib import Path

import pytest

from helpers import ROOT, run_cli

CORPUS = Path(__file__).resolve().parent / "corpus" / "bad"
CASES = sorted(p for p in CORPUS.iterdir() if not p.name.endswith(".expect"))

# error: FILE[:LINE:COL]: [dotted.path: ]sentence
LINE = re.compile(r"^error: (?P<file>.+?)(?::(?P<line>\d+):(?P<col>\d+))?: (?P<rest>\S.*)$")


def expectations(case: Path) -> list[tuple[str, int | None]]:
    if case.is_dir():
        source = case / "expect"
    elif case.with_name(case.name + ".expect").exists():
        source = case.with_name(case.name + ".expect")
    else:
        source = case
    found: list[tuple[str, int | None]] = []
    for raw in source.read_bytes().decode("utf-8", "replace").splitlines():
        if raw.startswith("# expect: "):
            found.append((raw[len("# expect: "):], None))
        elif raw.startswith("# line: "):
            found[-1] = (found[-1][0], int(raw[len("# line: "):]))
        else:
            break
    assert found, f"{case.name} states no '# expect:' line"
    return found


def test_corpus_is_large_enough():
    assert len(CASES) >= 40


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_bad_spec_is_refused_with_one_located_line_per_problem(case):
    expected = expectations(case)
    code, out, err = run_cli("check", case)
    assert code == 2, err
    assert out == "" and "Traceback" not in err and "internal error" not in err
    lines = err.splitlines()
    assert len(lines) == len(expected), err
    for line, (text, line_no) in zip(lines, expected):
        m = LINE.match(line)
        assert m and m["file"] == str(case), line
        assert text in line, f"expected {text!r} in {line!r}"
        if line_no is not None:
            assert m["line"] and int(m["line"]) == line_no, line


def _subprocess(*args: str) -> subprocess.CompletedProcess:
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    env.pop("SPECGEN_DEBUG", None)
    return subprocess.run([sys.executable, "-m", "specgen", *args], capture_output=True, text=True,
                          env=env, cwd=ROOT, timeout=120)


@pytest.mark.parametrize("name", ["binary_zero_byte.yaml", "not_utf8.yaml", "tag_python_object.yaml",
                                  "alias_recursive.yaml", "folder_given_as_spec.yaml", "unit_power_tower.yaml"])
def test_a_real_process_prints_no_traceback(name):
    run = _subprocess("check", str(CORPUS / name))
    assert run.returncode == 2
    assert run.stdout == "" and "Traceback" not in run.stderr
    assert run.stderr.startswith(f"error: {CORPUS / name}")
    assert "hacked" not in run.stdout + run.stderr  # the os.system tag was never run


def test_whole_corpus_in_one_run_reports_every_file():
    """Problems in one spec do not hide the next: every file gets its own lines."""
    run = _subprocess("check", *[str(c) for c in CASES])
    assert run.returncode == 2 and "Traceback" not in run.stderr
    reported = {LINE.match(line)["file"] for line in run.stderr.splitlines()}
    assert reported == {str(c) for c in CASES}
    assert len(run.stderr.splitlines()) == sum(len(expectations(c)) for c in CASES)
