"""Every file read is bounded, no output overwrites an input or a page specgen did not write,
written files follow the umask, a killed run's leftovers are cleared, and echoes of input are short."""

from __future__ import annotations

import os
import stat
import subprocess
import sys
import time

import pytest
import yaml
from helpers import ROOT, minimal, run_cli, write_spec

from specgen import output
from specgen.review import reviews_path


@pytest.fixture
def spec(tmp_path):
    return write_spec(tmp_path, minimal())


@pytest.mark.parametrize("how", ["same", "symlink", "hardlink", "reviews", "dotted"])
def test_check_output_that_is_an_input_is_refused_and_nothing_written(spec, tmp_path, how):
    before = spec.read_bytes()
    target = {"same": spec, "symlink": tmp_path / "link.yaml", "hardlink": tmp_path / "hard.yaml",
              "reviews": reviews_path(spec), "dotted": tmp_path / "." / spec.name}[how]
    if how == "symlink":
        target.symlink_to(spec)
    if how == "hardlink":
        os.link(spec, target)
    code, out, err = run_cli("check", spec, "-o", target)
    assert code == 2 and "is an input of this run" in err
    assert spec.read_bytes() == before
    assert how != "reviews" or not target.exists()


def test_diff_output_that_is_the_new_spec_is_refused(spec, tmp_path):
    old = write_spec(tmp_path, minimal(), "old.yaml")
    before = spec.read_bytes()
    code, _, err = run_cli("diff", old, spec, "-o", spec)
    assert code == 2 and "is an input of this run" in err
    assert spec.read_bytes() == before


def test_check_output_that_is_a_parts_file_is_refused(tmp_path):
    data = minimal()
    data["sizing"] = {"parts_file": "stock.parts.yaml"}
    parts = tmp_path / "stock.parts.yaml"
    stock = "format: 1\nmotors:\n  axial_piston:\n    - 90 cm^3\n    - 110 cm^3\n"
    parts.write_text(stock)
    spec = write_spec(tmp_path, data)
    assert run_cli("check", spec)[0] in (0, 1)  # a valid spec and parts file
    code, _, err = run_cli("check", spec, "-o", parts)
    assert code == 2 and "is an input of this run" in err and parts.read_text() == stock


def test_report_never_replaces_an_index_html_specgen_did_not_write(spec, tmp_path):
    site = tmp_path / "site"
    site.mkdir()
    (site / "index.html").write_text("<html>the team's home page</html>")
    code, _, err = run_cli("report", spec, "-o", site)
    assert code == 2 and "was not written by specgen" in err
    assert (site / "index.html").read_text() == "<html>the team's home page</html>"
    rep = tmp_path / "rep"
    assert run_cli("report", spec, "-o", rep)[0] == 0
    assert output.is_specgen_page(rep / "index.html")
    assert run_cli("report", spec, "-o", rep)[0] == 0  # its own earlier report is replaced


def test_report_refuses_a_spec_named_where_its_page_goes(tmp_path):
    rep = tmp_path / "rep"
    rep.mkdir()
    page = write_spec(rep, minimal(), "index.html")
    before = page.read_bytes()
    code, _, err = run_cli("report", page, "-o", rep)
    assert code == 2 and page.read_bytes() == before


def test_foreign_index_beside_a_pdf_keeps_both(tmp_path):
    (tmp_path / "index.html").write_text("mine")
    (tmp_path / "report.pdf").write_bytes(b"%PDF-")
    with pytest.raises(output.SpecError, match="which specgen did not write"):
        output.refuse_foreign_files(tmp_path, ["report.pdf"])


def test_written_files_follow_the_umask(spec, tmp_path):
    old = os.umask(0o027)
    try:
        out = tmp_path / "out.txt"
        assert run_cli("check", spec, "-o", out)[0] == 0
        assert stat.S_IMODE(out.stat().st_mode) == 0o640
        os.umask(0o022)
        output.write_atomic(out, "x")
        assert stat.S_IMODE(out.stat().st_mode) == 0o644
    finally:
        os.umask(old)


def test_leftovers_of_a_killed_run_are_removed_and_a_live_runs_kept(tmp_path):
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True, text=True)
    dead_pid = int(dead.stdout)
    time.sleep(0.05)
    target = tmp_path / "rep"
    stale_dir = tmp_path / f".rep.{dead_pid}.abc123.tmp"
    stale_dir.mkdir()
    (stale_dir / "index.html").write_text("half")
    stale_file = tmp_path / f".rep.{dead_pid}.def456.tmp"
    stale_file.write_text("half")
    live = tmp_path / f".rep.{os.getpid()}.ghi789.tmp"
    live.mkdir()
    other = tmp_path / ".rep.notes.tmp"  # not of our naming: never touched
    other.write_text("keep")
    staging = output.staging_folder(target)
    assert not stale_dir.exists() and not stale_file.exists()
    assert live.exists() and other.exists() and staging.is_dir()
    assert staging.name.startswith(f".rep.{os.getpid()}.")


def test_review_record_that_is_a_device_or_fifo_or_outside_link_is_refused(spec, tmp_path):
    record = reviews_path(spec)
    record.symlink_to("/dev/zero")
    code, _, err = run_cli("check", spec)
    assert code == 2 and "outside the folder" in err  # refused before it is opened: no endless read
    record.unlink()
    if hasattr(os, "mkfifo"):
        os.mkfifo(record)
        run = subprocess.run([sys.executable, "-m", "specgen", "check", str(spec)], capture_output=True, text=True,
                             env={**os.environ, "PYTHONPATH": str(ROOT)}, timeout=120)
        assert run.returncode == 2 and "is not a regular file" in run.stderr  # no hang
        record.unlink()
    outside = tmp_path.parent / f"{tmp_path.name}-elsewhere.yaml"
    outside.write_text("review_format: 1\nreviews: []\n")
    (tmp_path / "sub").mkdir()
    inner = write_spec(tmp_path / "sub", minimal())
    reviews_path(inner).symlink_to(outside)
    code, _, err = run_cli("check", inner)
    assert code == 2 and "outside the folder" in err
    big = reviews_path(spec)
    big.write_bytes(b"#" * (1024 * 1024 + 10))
    code, _, err = run_cli("check", spec)
    assert code == 2 and "limited to" in err


def test_parts_file_that_is_a_fifo_device_or_outside_link_is_refused(tmp_path):
    data = minimal()
    data["sizing"] = {"parts_file": "stock.parts.yaml"}
    (tmp_path / "specs").mkdir()
    spec = write_spec(tmp_path / "specs", data)
    parts = tmp_path / "specs" / "stock.parts.yaml"
    for make in ("device", "fifo", "outside"):
        if parts.is_symlink() or parts.exists():
            parts.unlink()
        if make == "device":
            parts.symlink_to("/dev/zero")
        elif make == "fifo":
            os.mkfifo(parts)
        else:
            (tmp_path / "elsewhere.yaml").write_text("parts_format: 1\n")
            parts.symlink_to(tmp_path / "elsewhere.yaml")
        run = subprocess.run([sys.executable, "-m", "specgen", "check", str(spec)], capture_output=True, text=True,
                             env={**os.environ, "PYTHONPATH": str(ROOT)}, timeout=120)
        assert run.returncode == 2 and "Traceback" not in run.stderr, (make, run.stderr)


def test_a_huge_value_is_echoed_in_a_short_line(tmp_path):
    data = minimal()
    data["drives"]["hoist"]["duty_points"]["lift"]["torque"] = list(range(30_000))
    data["machine"]["title"] = "T" * 5000
    code, out, err = run_cli("check", write_spec(tmp_path, yaml.safe_dump(data, default_flow_style=True)))
    assert code == 2
    assert err and max(len(line) for line in err.splitlines()) < 700, max(len(x) for x in err.splitlines())
