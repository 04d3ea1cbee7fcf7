"""The documented CI example and the pre-commit hook, run for real in a throwaway git repository.

The workflow's own review step is taken from examples/ci/spec-review.yml and run with bash, as the
CI runner would, against a repository holding two revisions of the example machine. No network:
installing, uploading and posting the comment are the runner's steps and are not run here.
"""

import os
import re
import shlex
import shutil
import subprocess
import sys
from pathlib import Path

import pytest
import xml.etree.ElementTree as ET

import yaml

import specgen
from revisions import GIT_ENV, commit, example_revision, git, make_repo
from helpers import EXAMPLE, ROOT
from specgen.cli import COMMANDS

WORKFLOW = ROOT / "examples" / "ci" / "spec-review.yml"
SCRIPT = ROOT / "examples" / "ci" / "spec-review.sh"

pytestmark = pytest.mark.skipif(shutil.which("bash") is None or shutil.which("git") is None,
                                reason="needs bash and git")


@pytest.fixture
def env(tmp_path):
    """PATH with a `specgen` that runs the code under test with this interpreter."""
    bin_dir = tmp_path / "bin"
    bin_dir.mkdir()
    shim = bin_dir / "specgen"
    shim.write_text(f'#!/bin/sh\nexec {shlex.quote(sys.executable)} -m specgen "$@"\n', encoding="utf-8")
    shim.chmod(0o755)
    package_root = str(Path(specgen.__file__).resolve().parent.parent)
    e = {**os.environ, **GIT_ENV, "PATH": f"{bin_dir}{os.pathsep}{os.environ['PATH']}",
         "PYTHONPATH": package_root, "SCRIPT": str(SCRIPT), "BASE_REF": "main"}
    e["SKIP_REPORTS"] = "1"  # reports take seconds each; one test below builds them
    for key in ("FAIL_ON", "REQUIRE_REVIEW", "GITHUB_ACTIONS"):
        e.pop(key, None)
    return e


def review_step() -> str:
    wf = yaml.safe_load(WORKFLOW.read_text(encoding="utf-8"))
    steps = wf["jobs"]["specs"]["steps"]
    return next(s for s in steps if s.get("id") == "review")["run"]


def run_step(repo: Path, env: dict, **extra) -> tuple[int, str]:
    """Run the workflow's review step; return the status it reports and the job log."""
    output = repo.parent / "github_output"
    output.write_text("", encoding="utf-8")
    # the workflow compares with origin/<target>; this repository has no remote, so the branch itself
    step = review_step().replace('"origin/$BASE_REF"', '"$BASE_REF"')
    done = subprocess.run(["bash", "-c", step], cwd=repo, env={**env, "GITHUB_OUTPUT": str(output), **extra},
                          capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, done.stderr  # the step itself records the status and carries on
    status = re.fullmatch(r"status=(\d+)\n", output.read_text(encoding="utf-8"))
    assert status, output.read_text(encoding="utf-8")
    return int(status.group(1)), done.stdout + done.stderr


@pytest.fixture
def repo(tmp_path, env):
    r = make_repo(tmp_path / "machines")
    commit(r, {"specs/harvester.yaml": EXAMPLE.read_text(encoding="utf-8"), "README.md": "machines\n"}, "rev C")
    git(r, "checkout", "-q", "-b", "heavier-climb")
    return r


def test_workflow_is_an_inactive_example():
    assert not (ROOT / ".github" / "workflows" / WORKFLOW.name).exists()
    wf = yaml.safe_load(WORKFLOW.read_text(encoding="utf-8"))
    steps = wf["jobs"]["specs"]["steps"]
    assert any("upload-artifact" in s.get("uses", "") for s in steps)
    assert any("gh pr comment" in s.get("run", "") and "diff.md" in s["run"] for s in steps)
    assert wf["jobs"]["specs"]["env"]["SCRIPT"].endswith(SCRIPT.name)
    text = WORKFLOW.read_text(encoding="utf-8") + SCRIPT.read_text(encoding="utf-8")
    assert "--format github" in text and "--format junit" in text and "check.xml" in text


def test_regression_fails_the_job_and_the_comment_says_why(repo, env):
    # 5 kN*m on the left track needs far more than the 280 bar relief setting: pressure margin pass -> fail
    commit(repo, {"specs/harvester.yaml": example_revision({("track_left", "harvest"): "5 kN*m"})}, "heavier")
    with_reports = {"SKIP_REPORTS": "0" if "report" in COMMANDS else "1"}
    status, log = run_step(repo, env, GITHUB_ACTIONS="true", **with_reports)
    assert status == 1, log
    out = repo / "build" / "spec-review"
    # on a GitHub runner the failing check marks its duty point's line in the pull request
    error = re.search(r"^::error file=specs/harvester\.yaml,line=(\d+),title=pressure_margin "
                      r"\(drive track_left%2C duty point harvest\)::", log, re.M)
    assert error, log
    spec_lines = (repo / "specs" / "harvester.yaml").read_text(encoding="utf-8").splitlines()
    assert spec_lines[int(error.group(1)) - 1].strip().startswith("harvest:")
    junit = ET.fromstring((out / "check.xml").read_bytes())
    failed = [c.get("name") for c in junit.iter("testcase") if c.find("failure") is not None]
    assert "pressure_margin (drive track_left, duty point harvest)" in failed
    full = (out / "diff-full.md").read_text(encoding="utf-8")
    assert len((out / "diff.md").read_text(encoding="utf-8")) <= 60_000 and "pressure\\_margin" in full
    md = (out / "diff.md").read_text(encoding="utf-8")
    assert md.startswith("## Spec changes against main (")
    assert "### specgen diff: " in md and "| status | check | where | value before | value now | limit |" in md
    assert "| **pass -> fail** | pressure\\_margin | drive track\\_left, duty point harvest |" in md
    assert "FAIL" in (out / "check.txt").read_text(encoding="utf-8")
    if "report" in COMMANDS:
        assert any((out / "reports").rglob("*.html"))
    assert git(repo, "status", "--porcelain", "--untracked-files=no") == ""


def test_harmless_change_passes_and_warn_threshold_is_honoured(repo, env):
    # 3.17 kN*m on the right track: inside the 10 % pressure margin (pass -> warn); relief respelled in psi
    commit(repo, {"specs/harvester.yaml": example_revision({("track_right", "harvest"): "3.17 kN*m"},
                                                           relief_in_psi="main")}, "right track 3.17 kN*m")
    status, log = run_step(repo, env)
    assert status == 0, log  # pass -> warn is no failure with FAIL_ON=fail
    md = (repo / "build" / "spec-review" / "diff.md").read_text(encoding="utf-8")
    assert re.search(r"\*\*\d+ checks? got worse: 0 now fail, \d+ now warn\.\*\*", md)
    assert "| **pass -> warn** | pressure\\_margin | drive track\\_right, duty point harvest |" in md
    assert "Same value written differently" in md and "supplies.main.relief\\_setting: '" in md
    assert run_step(repo, env, FAIL_ON="warn")[0] == 1


def test_require_review_holds_until_a_review_is_committed(repo, env):
    status, log = run_step(repo, env, REQUIRE_REVIEW="1")
    assert status == 1 and "review required: specs/harvester.yaml" in log
    assert "No spec changed." in (repo / "build" / "spec-review" / "diff.md").read_text(encoding="utf-8")
    done = subprocess.run(["specgen", "review", "specs/harvester.yaml", "--by", "A. Checker", "--role",
                           "checking engineer", "--verdict", "approved", "--date", "2025-03-14"],
                          cwd=repo, env=env, capture_output=True, text=True)
    assert done.returncode == 0, done.stderr
    git(repo, "add", "specs/harvester.reviews.yaml")
    git(repo, "commit", "-q", "-m", "review of rev C")
    status, log = run_step(repo, env, REQUIRE_REVIEW="1")
    assert status == 0, log
    assert "No spec changed." in (repo / "build" / "spec-review" / "diff.md").read_text(encoding="utf-8")


def test_new_spec_is_said_to_be_new(repo, env):
    shutil.copy(EXAMPLE, repo / "specs" / "second.yaml")
    git(repo, "add", "specs/second.yaml")
    git(repo, "commit", "-q", "-m", "a second machine")
    status, _ = run_step(repo, env)
    assert status == 0
    md = (repo / "build" / "spec-review" / "diff.md").read_text(encoding="utf-8")
    assert "### specs/second.yaml\n\nA new spec: no earlier revision to compare with" in md


def test_pre_commit_hook_checks_changed_specs(repo, env):
    hooks = yaml.safe_load((ROOT / ".pre-commit-hooks.yaml").read_text(encoding="utf-8"))
    hook = next(h for h in hooks if h["id"] == "specgen-check-specs")
    assert re.search(hook["files"], "specs/harvester.yaml") and re.search(hook["files"], "plant/specs/a.yml")
    assert re.search(hook["exclude"], "specs/harvester.reviews.yaml")
    assert not re.search(hook["exclude"], "specs/harvester.yaml")
    entry = shlex.split(hook["entry"])
    ok = subprocess.run(entry + ["specs/harvester.yaml"], cwd=repo, env=env, capture_output=True, text=True)
    assert ok.returncode == 0, ok.stderr  # the example warns but does not fail
    (repo / "specs" / "broken.yaml").write_text("format: 1\nmachine: {id: x}\n", encoding="utf-8")
    bad = subprocess.run(entry + ["specs/harvester.yaml", "specs/broken.yaml"], cwd=repo, env=env,
                         capture_output=True, text=True)
    assert bad.returncode == 2 and bad.stderr.startswith("error: specs/broken.yaml:")
