"""No program named by a spec's folder runs: a committed folder laid out like a repository is never used.

Each planted config names a command that would create a marker file; the control test shows
plain git does run it, so the marker's absence after specgen's calls means something.
"""

from __future__ import annotations

import shlex
import subprocess
from pathlib import Path

import pytest
import yaml
from helpers import minimal, run_cli
from revisions import GIT_ENV, commit, make_repo

from specgen import gittrust
from specgen.fingerprint import fingerprint

HOOKS = ("fsmonitor", "pager", "textconv", "filter", "external", "ssh", "alias", "hook")


def plant(folder: Path, marker_dir: Path) -> None:
    """A folder that git would take for a repository, whose config runs a command at every turn."""
    (folder / "objects").mkdir(parents=True, exist_ok=True)
    (folder / "refs" / "heads").mkdir(parents=True, exist_ok=True)
    (folder / "HEAD").write_text("ref: refs/heads/main\n")
    (folder / "hooks").mkdir(exist_ok=True)

    def touch(name: str) -> str:
        return f'"touch {shlex.quote(str(marker_dir / ("marker-" + name)))}; cat"'

    for name in ("post-checkout", "pre-commit", "post-index-change", "fsmonitor-watchman"):
        hook = folder / "hooks" / name
        hook.write_text(f"#!/bin/sh\ntouch {marker_dir / 'marker-hook'}\n")
        hook.chmod(0o755)
    (folder / "config").write_text(
        "[core]\n\trepositoryformatversion = 0\n\tbare = false\n\tworktree = .\n"
        f"\tfsmonitor = {touch('fsmonitor')}\n\tpager = {touch('pager')}\n\tsshCommand = {touch('ssh')}\n"
        f'[diff "spec"]\n\ttextconv = {touch("textconv")}\n[diff]\n\texternal = {touch("external")}\n'
        f'[filter "spec"]\n\tclean = {touch("filter")}\n\tsmudge = {touch("filter")}\n'
        f"[alias]\n\tshow = !{touch('alias')[1:-1]}\n\tstatus = !{touch('alias')[1:-1]}\n")
    (folder / ".gitattributes").write_text("*.yaml diff=spec filter=spec\n")


def markers(where: Path) -> list[str]:
    return sorted(p.name for p in where.glob("marker-*"))


@pytest.fixture
def planted(tmp_path):
    """A real repository holding, committed, a spec inside a folder laid out like a repository."""
    repo = make_repo(tmp_path / "repo")
    spec_text = yaml.safe_dump(minimal(), sort_keys=False)
    head = commit(repo, {"specs/evil/rig.yaml": spec_text}, "spec")
    plant(repo / "specs" / "evil", tmp_path)
    return repo, repo / "specs" / "evil", head


def test_plain_git_in_the_planted_folder_would_run_its_command(planted, tmp_path):
    _, evil, _ = planted
    subprocess.run(["git", "status", "--porcelain"], cwd=evil, capture_output=True,
                   env={"PATH": "/usr/bin:/bin", **GIT_ENV}, timeout=60)
    assert "marker-fsmonitor" in markers(tmp_path)  # the attack is real


def test_fingerprint_uses_the_enclosing_repository_and_runs_nothing(planted, tmp_path):
    repo, evil, head = planted
    raw = (evil / "rig.yaml").read_bytes()
    fp = fingerprint(raw, evil / "rig.yaml")
    assert (fp.commit, fp.state) == (head, "clean")
    assert markers(tmp_path) == []
    (evil / "rig.yaml").write_bytes(raw + b"# edited\n")
    assert fingerprint(raw, evil / "rig.yaml").state == "modified"
    assert markers(tmp_path) == []


def test_report_on_a_spec_in_the_planted_folder_runs_nothing(planted, tmp_path):
    _, evil, head = planted
    code, out, err = run_cli("report", evil / "rig.yaml", "-o", tmp_path / "out")
    assert code in (0, 1), err
    assert head[:12] in (tmp_path / "out" / "index.html").read_text()
    assert markers(tmp_path) == []


def test_diff_of_a_revision_from_inside_the_planted_folder_runs_nothing(planted, tmp_path, monkeypatch):
    _, evil, _ = planted
    monkeypatch.chdir(evil)
    code, out, err = run_cli("diff", "HEAD:./rig.yaml", "rig.yaml", "--format", "markdown")
    assert code == 0, err
    assert markers(tmp_path) == []


def test_git_variables_of_a_calling_hook_cannot_redirect_a_call(planted, tmp_path, monkeypatch):
    repo, evil, head = planted
    monkeypatch.setenv("GIT_DIR", str(evil))
    monkeypatch.setenv("GIT_WORK_TREE", str(evil))
    monkeypatch.setenv("GIT_INDEX_FILE", str(tmp_path / "no-index"))
    monkeypatch.setenv("GIT_CONFIG_PARAMETERS", f"'core.fsmonitor'='touch {tmp_path}/marker-env'")
    monkeypatch.setenv("GIT_EXTERNAL_DIFF", f"touch {tmp_path}/marker-env")
    fp = fingerprint(b"", evil / "rig.yaml")
    assert (fp.commit, fp.state) == (head, "clean")
    env = gittrust.environment()
    assert not {"GIT_DIR", "GIT_WORK_TREE", "GIT_INDEX_FILE", "GIT_CONFIG_PARAMETERS", "GIT_EXTERNAL_DIFF"} & set(env)
    assert markers(tmp_path) == []


def test_a_planted_folder_with_no_repository_above_gives_no_git_part(tmp_path, monkeypatch):
    evil = tmp_path / "loose" / "evil"
    plant(evil, tmp_path)
    (evil / "rig.yaml").write_text("format: 1\n")
    monkeypatch.setenv("GIT_CEILING_DIRECTORIES", str(tmp_path))
    assert gittrust.find_repository(evil) is None
    assert fingerprint(b"", evil / "rig.yaml").commit is None
    monkeypatch.chdir(evil)
    code, _, err = run_cli("diff", "HEAD:./rig.yaml", "rig.yaml")
    assert code == 2 and "not in a git repository" in err
    assert markers(tmp_path) == []


def test_every_call_carries_the_settings_that_stop_programs():
    cmd = gittrust.command(["status"], (Path("/r/.git"), Path("/r")))
    settings = {cmd[i + 1] for i, part in enumerate(cmd) if part == "-c"}
    assert {"core.fsmonitor=false", "core.hooksPath=/dev/null", "safe.bareRepository=explicit",
            "protocol.allow=never"} <= settings
    assert cmd[:2] == ["git", "--no-pager"] and "--git-dir=/r/.git" in cmd and "--work-tree=/r" in cmd
