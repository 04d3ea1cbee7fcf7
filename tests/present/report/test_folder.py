"""Writing the report: same bytes each run, dates, atomic replacement, exit statuses, several specs,
PDF, fingerprint and git state, and the report's imports kept out of check."""

from __future__ import annotations

import hashlib
import os
import re
import sys
from pathlib import Path

import pytest

from revisions import commit, make_repo
from helpers import EXAMPLE, minimal, run_cli, write_spec
from specgen.fingerprint import Fingerprint, fingerprint
from specgen.present import charts


def test_two_runs_give_identical_bytes(tmp_path):
    a, b = tmp_path / "a", tmp_path / "b"
    assert run_cli("report", EXAMPLE, "-o", a)[0] == 0
    assert run_cli("report", EXAMPLE, "-o", b)[0] == 0
    assert (a / "index.html").read_bytes() == (b / "index.html").read_bytes()

def test_no_date_unless_asked(tmp_path, monkeypatch):
    monkeypatch.delenv("SOURCE_DATE_EPOCH", raising=False)
    spec = write_spec(tmp_path, minimal())
    assert run_cli("report", spec, "-o", tmp_path / "plain")[0] == 0
    plain = (tmp_path / "plain" / "index.html").read_text()
    assert re.search(r"Report date</th><td[^>]*><span class=\"absent\">not stated", plain)
    assert not re.search(r"\b20\d\d-\d\d-\d\d\b", plain)
    assert run_cli("report", spec, "-o", tmp_path / "dated", "--date", "2024-03-05")[0] == 0
    assert "Report date</th><td>2024-03-05</td>" in (tmp_path / "dated" / "index.html").read_text()
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1700000000")  # 2023-11-14T22:13:20Z
    assert run_cli("report", spec, "-o", tmp_path / "epoch")[0] == 0
    assert "Report date</th><td>2023-11-14</td>" in (tmp_path / "epoch" / "index.html").read_text()
    # --date wins over SOURCE_DATE_EPOCH
    assert run_cli("report", spec, "-o", tmp_path / "both", "--date", "2025-01-31")[0] == 0
    assert "2025-01-31" in (tmp_path / "both" / "index.html").read_text()

@pytest.mark.parametrize("option, env", [("2024-13-01", None), ("05/03/2024", None), (None, "yesterday")])
def test_bad_dates_exit_2_with_one_line(tmp_path, monkeypatch, option, env):
    monkeypatch.delenv("SOURCE_DATE_EPOCH", raising=False)
    if env:
        monkeypatch.setenv("SOURCE_DATE_EPOCH", env)
    args = ["report", write_spec(tmp_path, minimal()), "-o", tmp_path / "out"] + (["--date", option] if option else [])
    code, out, err = run_cli(*args)
    assert code == 2 and len(err.strip().splitlines()) == 1 and "Traceback" not in err
    assert not (tmp_path / "out").exists()

def test_failed_render_leaves_the_earlier_report_untouched(tmp_path, monkeypatch):
    out = tmp_path / "rep"
    spec = write_spec(tmp_path, minimal())
    assert run_cli("report", spec, "-o", out)[0] == 0
    before = (out / "index.html").read_bytes()
    (out / "notes.txt").write_text("mine")  # a file of the user's in OUTDIR stays

    calls = []

    def broken(*args, **kwargs):
        calls.append(1)
        raise RuntimeError("chart failed mid-render")

    monkeypatch.setattr(charts, "margin_overview", broken)
    d = minimal()
    d["machine"]["revision"] = "B"
    write_spec(tmp_path, d)
    code, _, err = run_cli("report", spec, "-o", out)
    assert calls and code == 3 and "chart failed mid-render" in err
    assert (out / "index.html").read_bytes() == before
    assert (out / "notes.txt").read_text() == "mine"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["rep", "spec.yaml"]  # no staging folder left

def test_exit_codes_and_report_written_when_checks_fail(tmp_path):
    assert run_cli("report", write_spec(tmp_path, minimal(), "ok.yaml"), "-o", tmp_path / "ok")[0] == 0
    warn = minimal()
    warn["thresholds"] = {"pressure_margin_warn": "30 %"}  # 205 bar of 250 bar: 18 % margin, a warning
    warn_spec = write_spec(tmp_path, warn, "warn.yaml")
    assert run_cli("report", warn_spec, "-o", tmp_path / "warn")[0] == 0  # warnings allowed
    assert run_cli("report", "--strict", warn_spec, "-o", tmp_path / "strict")[0] == 1
    assert "Overall: WARN" in (tmp_path / "strict" / "index.html").read_text()
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    code, out, _ = run_cli("report", write_spec(tmp_path, d, "fails.yaml"), "-o", tmp_path / "fail")
    assert code == 1 and "FAIL" in out
    assert "Overall: FAIL" in (tmp_path / "fail" / "index.html").read_text()
    bad = minimal()
    bad["supplies"]["main"]["relief_setting"] = "250 kg"
    code, out, err = run_cli("report", write_spec(tmp_path, bad, "bad.yaml"), "-o", tmp_path / "bad")
    assert code == 2 and "bad.yaml:" in err and "relief_setting" in err and "Traceback" not in err
    assert not (tmp_path / "bad").exists()
    with pytest.raises(SystemExit) as stop:  # -o is required: argparse exits 2
        run_cli("report", EXAMPLE)
    assert stop.value.code == 2

def test_several_specs_give_a_folder_each_and_an_index(tmp_path):
    first = write_spec(tmp_path, minimal(), "first.yaml")
    other = minimal()
    other["machine"]["id"], other["machine"]["title"] = "hoist-rig", "Hoist rig <b>"
    other["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    spec = write_spec(tmp_path, other, "rig.yaml")
    out = tmp_path / "all"
    code, stdout, _ = run_cli("report", first, spec, "-o", out)
    assert code == 1
    index = (out / "index.html").read_text()
    assert (out / "bench-rig" / "index.html").is_file() and (out / "hoist-rig" / "index.html").is_file()
    rows = re.findall(r"<tr><th scope=\"row\"><a href=\"([^\"]+)\">([^<]+)</a>.*?status-(\w+)", index)
    assert rows == [("bench-rig/index.html", "Test rig", "pass"), ("hoist-rig/index.html", "Hoist rig &lt;b&gt;", "fail")]
    assert "Cautions" in index

def test_pdf_without_the_extra_says_how_and_still_writes_html(tmp_path, monkeypatch):
    monkeypatch.setitem(sys.modules, "weasyprint", None)  # import fails as if not installed
    out = tmp_path / "rep"
    (out).mkdir()
    (out / "report.pdf").write_bytes(b"%PDF- stale")
    code, _, err = run_cli("report", write_spec(tmp_path, minimal()), "-o", out, "--pdf")
    assert code == 0 and "pip install 'specgen[pdf]'" in err
    assert (out / "index.html").is_file()
    assert not (out / "report.pdf").exists()  # an older PDF no longer matches the HTML beside it
    assert "removed" in err

def test_pdf_has_numbered_footers(tmp_path):
    pytest.importorskip("weasyprint", reason="the optional 'pdf' extra (WeasyPrint) is not installed")
    pypdf = pytest.importorskip("pypdf")
    out = tmp_path / "rep"
    assert run_cli("report", write_spec(tmp_path, minimal()), "-o", out, "--pdf")[0] == 0
    pages = pypdf.PdfReader(out / "report.pdf").pages
    assert 4 <= len(pages) <= 12
    sha = hashlib.sha256((tmp_path / "spec.yaml").read_bytes()).hexdigest()[:12]
    for k, page in enumerate(pages, start=1):
        text = page.extract_text()
        assert f"page {k} of {len(pages)}" in text and "Test rig" in text and sha in text
    assert abs(float(pages[0].mediabox.width) - 595.3) < 1  # A4 by default: 210 mm = 595.3 pt

def test_fingerprint_hash_and_git_state(tmp_path, monkeypatch):
    raw = EXAMPLE.read_bytes()
    assert fingerprint(raw, None).sha256 == hashlib.sha256(raw).hexdigest()
    repo = make_repo(tmp_path / "repo")
    head = commit(repo, {"m.yaml": "format: 1\n"}, "spec")
    assert fingerprint(b"", repo / "m.yaml") == Fingerprint(hashlib.sha256(b"").hexdigest(), head, "clean")
    (repo / "m.yaml").write_text("format: 1\n# edited\n")
    assert fingerprint(b"", repo / "m.yaml").state == "modified"
    (repo / "new.yaml").write_text("x")
    assert fingerprint(b"", repo / "new.yaml").state == "untracked"
    outside = tmp_path / "loose.yaml"
    outside.write_text("x")
    monkeypatch.setenv("GIT_CEILING_DIRECTORIES", str(tmp_path))
    assert fingerprint(b"x", outside).commit is None
    monkeypatch.setenv("PATH", str(tmp_path / "nothing-here"))  # no git at all: fails soft
    assert fingerprint(b"x", repo / "m.yaml").commit is None

def test_report_shows_fingerprint_and_git_state(tmp_path):
    repo = make_repo(tmp_path / "repo")
    import yaml

    text = yaml.safe_dump(minimal(), sort_keys=False)
    head = commit(repo, {"rig.yaml": text}, "spec")
    out = tmp_path / "rep"
    assert run_cli("report", repo / "rig.yaml", "-o", out)[0] == 0
    page = (out / "index.html").read_text()
    assert hashlib.sha256(text.encode()).hexdigest() in page
    assert head in page and "the spec is <strong>clean</strong>" in page

def test_report_imports_stay_out_of_check(tmp_path):
    import subprocess

    code = ("import sys, specgen.cli as c; c.main(['check', '-q', sys.argv[1]]); "
            "print(sorted(m for m in ('matplotlib', 'jinja2', 'nh3', 'markdown') if m in sys.modules))")
    done = subprocess.run([sys.executable, "-c", code, str(EXAMPLE)], capture_output=True, text=True,
                          cwd=str(Path(__file__).resolve().parents[3]), env={**os.environ})
    assert done.stdout.strip().splitlines()[-1] == "[]"
