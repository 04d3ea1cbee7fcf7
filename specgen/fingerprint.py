"""A fingerprint of a spec: the sha256 of its bytes, and where git knows it, the commit and state.

The hash identifies exactly which bytes a report was computed from; the git part says which commit
the work tree was at and whether the spec differs from it. git is asked read-only
(GIT_OPTIONAL_LOCKS=0 keeps ``git status`` from refreshing the index) with a timeout, through
``specgen.gittrust`` so no program a spec's folder names can run, and any
failure (no git, not a work tree, a slow disk, an ownership refusal) gives no git part, never an
error: a report must not fail because version control is absent.

Example: ``fingerprint(b"format: 1\\n", None).short`` is the first 12 hex digits of the sha256.
"""

from __future__ import annotations

import hashlib
import subprocess
from dataclasses import dataclass
from pathlib import Path

from specgen import gittrust

GIT_TIMEOUT_S = 5.0


@dataclass(frozen=True)
class Fingerprint:
    sha256: str
    commit: str | None = None  # HEAD of the work tree holding the spec
    state: str | None = None  # "clean", "modified" (differs from HEAD) or "untracked"

    @property
    def short(self) -> str:
        return self.sha256[:12]

    @property
    def git_text(self) -> str:
        """e.g. "commit 1a2b3c4d5e6f, spec clean"; empty when git knows nothing of the spec."""
        if not self.commit:
            return ""
        return f"commit {self.commit[:12]}, spec {self.state}"


def _git(args: list[str], cwd: Path) -> str | None:
    try:
        done = gittrust.run(args, cwd, timeout=GIT_TIMEOUT_S)
    except (OSError, subprocess.SubprocessError, ValueError):
        return None
    if done is None or done.returncode != 0:
        return None
    return done.stdout.decode("utf-8", "replace")


def git_state(path: str | Path) -> tuple[str | None, str | None]:
    """(HEAD commit, spec state) for a file in a git work tree, else (None, None)."""
    p = Path(path).resolve()
    if not p.is_file():
        return None, None
    head = _git(["rev-parse", "--verify", "--quiet", "HEAD"], p.parent)
    if not head:
        return None, None
    status = _git(["status", "--porcelain", "--untracked-files=all", "--ignored=no", "--ignore-submodules=all",
                   "--no-renames", "--", p.name], p.parent)
    if status is None:
        return None, None
    code = status[:2]
    state = "clean" if not status.strip() else "untracked" if code == "??" else "modified"
    return head.strip(), state


def fingerprint(raw: bytes, path: str | Path | None) -> Fingerprint:
    """Hash ``raw`` (the spec's bytes); add git's view of ``path`` when it is in a work tree."""
    digest = hashlib.sha256(raw).hexdigest()
    commit, state = git_state(path) if path is not None else (None, None)
    return Fingerprint(digest, commit, state)
