"""Nothing lost, nothing written where it should not be.

The input spec is never written; `check -o FILE` that fails part-way leaves the earlier FILE as it
was; a report writes only inside OUTDIR and never follows a symlink out of it.
"""

from __future__ import annotations

import copy
import os
from pathlib import Path

import pytest

from helpers import EXAMPLE, minimal, run_cli, write_spec


def snapshot(root: Path, skip: Path | None = None) -> dict[str, tuple[bytes, int]]:
    """Every file under ``root`` (outside ``skip``) with its bytes and modification time."""
    out = {}
    for p in sorted(root.rglob("*")):
        if skip is not None and (p == skip or skip in p.parents):
            continue
        if p.is_file() and not p.is_symlink():
            out[str(p.relative_to(root))] = (p.read_bytes(), p.stat().st_mtime_ns)
    return out


def two_specs(folder: Path) -> list[Path]:
    first = minimal()
    second = copy.deepcopy(first)
    second["machine"]["id"] = "second-rig"
    return [write_spec(folder, first, "first.yaml"), write_spec(folder, second, "second.yaml")]


@pytest.mark.parametrize("command", [
    ["check"], ["check", "--format", "json"], ["check", "-o", "{out}/check.txt"], ["report", "-o", "{out}/report"],
], ids=["check", "check-json", "check-o", "report"])
def test_the_input_spec_is_never_written(tmp_path, command):
    specs = tmp_path / "specs"
    specs.mkdir()
    spec = specs / "machine.yaml"
    spec.write_bytes(EXAMPLE.read_bytes())
    before = snapshot(specs)
    out = tmp_path / "out"
    code, _, err = run_cli(*[a.format(out=out) for a in command], spec)
    assert code in (0, 1), err
    assert snapshot(specs) == before  # same bytes, same mtime, and no new file beside the spec


def test_check_o_that_fails_while_writing_leaves_the_earlier_file(tmp_path, monkeypatch):
    spec = write_spec(tmp_path, minimal())
    target = tmp_path / "results.txt"
    target.write_text("results of an earlier run\n")

    def disk_full(fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "fsync", disk_full)  # the new text is written, then flushing it fails
    code, out, err = run_cli("check", "-o", target, spec)
    assert code == 2 and "No space left on device" in err and "Traceback" not in err
    assert target.read_text() == "results of an earlier run\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["results.txt", "spec.yaml"]  # no temporary left


def test_check_o_with_a_bad_spec_among_good_ones_leaves_the_earlier_file(tmp_path):
    good = write_spec(tmp_path, minimal(), "good.yaml")
    bad = write_spec(tmp_path, "format: 1\nmachine: {id: x}\n", "bad.yaml")
    target = tmp_path / "results.json"
    target.write_text("{}\n")
    code, _, err = run_cli("check", "--format", "json", "-o", target, good, bad)
    assert code == 2 and "bad.yaml" in err
    assert target.read_text() == "{}\n"


def test_check_o_replaces_the_file_whole(tmp_path):
    """The counterpart: a run that succeeds does replace the file, with the complete output."""
    spec = write_spec(tmp_path, minimal())
    target = tmp_path / "results.txt"
    target.write_text("x" * 100_000)
    code, out, _ = run_cli("check", "-o", target, spec)
    assert code == 0 and out == ""
    text = target.read_text()
    assert text.startswith(f"{spec}: PASS") and "x" not in text.splitlines()[0]


def test_report_writes_only_inside_outdir(tmp_path):
    specs = tmp_path / "specs"
    specs.mkdir()
    paths = two_specs(specs)
    (tmp_path / "neighbour.txt").write_text("not ours\n")
    outdir = tmp_path / "reports" / "latest"
    before = snapshot(tmp_path)
    code, _, err = run_cli("report", "-o", outdir, *paths)
    assert code == 0, err
    assert snapshot(tmp_path, skip=outdir) == before
    written = [p for p in outdir.rglob("*") if p.is_file()]
    assert written and all(outdir in p.parents for p in written)
    assert [p.name for p in (tmp_path / "reports").iterdir()] == ["latest"]  # the staging folder is gone


def test_report_replaces_a_symlinked_file_without_writing_through_it(tmp_path):
    spec = write_spec(tmp_path, minimal())
    outside = tmp_path / "outside.html"
    outside.write_text("someone else's file\n")
    outdir = tmp_path / "out"
    outdir.mkdir()
    (outdir / "index.html").symlink_to(outside)
    code, _, err = run_cli("report", "-o", outdir, spec)
    assert outside.read_text() == "someone else's file\n"
    if code == 0:
        assert not (outdir / "index.html").is_symlink()
    else:
        assert code == 2 and "symlink" in err and "Traceback" not in err


def test_report_refuses_a_symlinked_folder_out_of_outdir(tmp_path):
    """Several specs give OUTDIR/<machine id>/index.html; that folder must not lead out of OUTDIR."""
    specs = tmp_path / "specs"
    specs.mkdir()
    paths = two_specs(specs)
    elsewhere = tmp_path / "elsewhere"
    elsewhere.mkdir()
    (elsewhere / "index.html").write_text("someone else's page\n")
    outdir = tmp_path / "out"
    outdir.mkdir()
    (outdir / "second-rig").symlink_to(elsewhere, target_is_directory=True)
    code, _, err = run_cli("report", "-o", outdir, *paths)
    assert (elsewhere / "index.html").read_text() == "someone else's page\n"
    assert sorted(p.name for p in elsewhere.iterdir()) == ["index.html"]
    assert code == 2 and "symlink" in err and "Traceback" not in err
