"""Exit statuses (specgen/exits.py): the named values, the rules, and every command using them."""

from __future__ import annotations

import pytest

from helpers import EXAMPLE, minimal, run_cli, write_spec
from specgen import exits
from specgen.diff import compare
from specgen.pipeline import run_file


def test_the_statuses_keep_their_numbers():
    # scripts and CI jobs test these numbers: they never change
    assert (exits.OK, exits.FAILED, exits.BAD_INPUT, exits.INTERNAL, exits.INTERRUPTED) == (0, 1, 2, 3, 130)


@pytest.mark.parametrize("verdicts, strict, status", [
    (["pass"], False, 0), (["pass", "warn"], False, 0), (["pass", "warn"], True, 1), (["pass", "fail"], False, 1),
    (["fail"], True, 1), ([], False, 0), ([], True, 0)])
def test_verdicts_give_the_status(verdicts, strict, status):
    assert exits.verdict_status(verdicts, strict) == status


def test_a_missing_review_raises_the_status_to_failed_and_never_lowers_it():
    assert exits.review_status(exits.OK, covered=True) == exits.OK
    assert exits.review_status(exits.OK, covered=False) == exits.FAILED
    assert exits.review_status(exits.FAILED, covered=True) == exits.FAILED


def _lift_torque(tmp_path, name, torque):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = torque
    folder = tmp_path / name
    folder.mkdir()
    return run_file(write_spec(folder, d))


def test_diff_status_follows_fail_on(tmp_path):
    # p_in = 2*pi*T/(Vg*eta_hm) + p_out: 286.5 N*m -> 205.02 bar (pass); 322 N*m -> 229.80 bar, margin
    # 8.081 % under the 10 % warning (warn); 400 N*m -> 284.3 bar, over the 250 bar limit (fail). Hand calculation.
    passing, warned, failed = (_lift_torque(tmp_path, n, t) for n, t in
                               (("a", "286.5 N*m"), ("b", "322 N*m"), ("c", "400 N*m")))
    assert exits.diff_status(compare(passing, warned), "fail") == exits.OK
    assert exits.diff_status(compare(passing, warned), "warn") == exits.FAILED
    assert exits.diff_status(compare(passing, failed), "fail") == exits.FAILED
    assert exits.diff_status(compare(warned, passing), "warn") == exits.OK  # the way back improves


def test_commands_return_the_named_statuses(tmp_path):
    assert run_cli("check", EXAMPLE)[0] == exits.OK  # the demo warns only
    assert run_cli("check", "--strict", EXAMPLE)[0] == exits.FAILED
    assert run_cli("check", tmp_path / "missing.yaml")[0] == exits.BAD_INPUT
    assert run_cli("report", "--strict", EXAMPLE, "-o", tmp_path / "rep")[0] == exits.FAILED
    assert run_cli("report", EXAMPLE, "-o", tmp_path / "rep", "--date", "soon")[0] == exits.BAD_INPUT
    assert run_cli()[0] == exits.BAD_INPUT  # no command: the help, and the status of bad input


def test_an_internal_error_is_one_line_and_status_3(tmp_path, monkeypatch):
    from specgen import cli

    def broken(args):
        raise ZeroDivisionError("float division by zero")

    monkeypatch.delenv("SPECGEN_DEBUG", raising=False)
    monkeypatch.setitem(cli.COMMANDS, "check", broken)
    code, _, err = run_cli("check", EXAMPLE)
    assert code == exits.INTERNAL and err.count("\n") == 1 and err.startswith("internal error: ZeroDivisionError")
