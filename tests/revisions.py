"""Two revisions of a spec for the diff and CI tests: a throwaway git repository and example variants."""

from __future__ import annotations

import os
import subprocess
from pathlib import Path

import yaml

GIT_ENV = {
    "GIT_AUTHOR_NAME": "Test Author", "GIT_AUTHOR_EMAIL": "author@example.invalid",
    "GIT_COMMITTER_NAME": "Test Author", "GIT_COMMITTER_EMAIL": "author@example.invalid",
    "GIT_CONFIG_GLOBAL": os.devnull, "GIT_CONFIG_NOSYSTEM": "1",
    "GIT_AUTHOR_DATE": "2025-01-01T00:00:00Z", "GIT_COMMITTER_DATE": "2025-01-01T00:00:00Z",
}


def git(repo: Path, *args: str) -> str:
    done = subprocess.run(["git", *args], cwd=repo, env={**os.environ, **GIT_ENV}, capture_output=True,
                          text=True, check=True)
    return done.stdout


def make_repo(path: Path) -> Path:
    path.mkdir(parents=True, exist_ok=True)
    git(path, "init", "-q", "-b", "main")
    return path


def commit(repo: Path, files: dict[str, str], message: str) -> str:
    """Write ``files`` (path -> text), commit them, return the commit id."""
    for name, text in files.items():
        p = repo / name
        p.parent.mkdir(parents=True, exist_ok=True)
        p.write_text(text, encoding="utf-8")
        git(repo, "add", name)
    git(repo, "commit", "-q", "-m", message)
    return git(repo, "rev-parse", "HEAD").strip()


def example_revision(torques: dict[tuple[str, str], str] | None = None, relief_in_psi: str | None = None) -> str:
    """The example machine as new YAML text (reformatted: no comments, another layout), with the given
    duty point torques ((drive, duty) -> text) and, optionally, one supply's relief setting respelled in
    psi at the same value (1 psi = 6894.757293168 Pa, pint's definition)."""
    from helpers import example_data
    from specgen.units import parse

    data = example_data()
    for (drive, duty), torque in (torques or {}).items():
        point = data["drives"][drive]["duty_points"][duty]
        assert "torque" in point, f"{drive}.{duty} gives no direct torque in the example"
        point["torque"] = torque
    if relief_in_psi:
        s = data["supplies"][relief_in_psi]
        s["relief_setting"] = f"{parse(s['relief_setting'], 'pressure') / 6894.757293168:.7g} psi"
    return yaml.safe_dump(data, sort_keys=False, allow_unicode=True)
