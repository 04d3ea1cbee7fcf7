"""Run git so that nothing a spec's folder holds can make it run a program.

A pull request can commit a folder laid out like a bare repository (``HEAD``, ``config``,
``objects/``, ``refs/``) whose ``config`` names programs: ``core.fsmonitor``, hooks, a pager, a
filter or textconv driver, ``diff.external``, ``core.sshCommand``. Started inside such a folder,
git would take it for a repository and run them. So every git call specgen makes goes through
``run`` here:

- the repository is found by walking up from a trusted starting point (the spec's folder, or
  the current folder for ``REV:path``) to the first ``.git`` folder or file, the only kind git
  creates and the only kind a commit cannot carry (git refuses ``.git`` as a tracked path); it is
  named to git explicitly (``--git-dir``, ``--work-tree``), so no folder that merely looks like a
  repository is ever used, and ``safe.bareRepository=explicit`` refuses one should git look
  itself; GIT_CEILING_DIRECTORIES stops the walk as it stops git's;
- ``-c`` settings turn off what a command could run: the file system monitor, hooks, the pager,
  every network transport (a partial clone would fetch a missing object: ``protocol.allow=never``
  and GIT_NO_LAZY_FETCH), the untracked cache and signature display; callers add
  ``--no-textconv --no-ext-diff`` to ``show`` and ``--ignore-submodules=all`` to ``status`` (a
  submodule has its own config);
- pathspecs are literal (a file named ``*`` or ``:(glob)x`` names itself only);
- the environment loses every ``GIT_*`` variable but the user's choice of config files
  (GIT_CONFIG_GLOBAL, GIT_CONFIG_SYSTEM, GIT_CONFIG_NOSYSTEM) and GIT_CEILING_DIRECTORIES, so a
  GIT_DIR, GIT_INDEX_FILE or GIT_CONFIG_PARAMETERS from a calling hook cannot redirect a call.

Trusted: the git program on PATH, the user's global and system git config (kept: CI runners put
``safe.directory`` there, and ``core.autocrlf`` makes ``status`` answer correctly), and the
repository's own ``.git`` config, which a clone writes and a commit cannot change. Its program
settings that the commands above could reach are overridden all the same; a clean filter the
user's own config defines for a path (git-lfs) still runs in ``status``, as it does for any git
command the user types there; a repository whose config includes a tracked file
(``include.path``) has chosen to trust that file's filters too.

Example: ``run(["rev-parse", "HEAD"], Path("specs"))`` is git's answer for the repository holding
``specs/``, or None when no ``.git`` lies above it.
"""

from __future__ import annotations

import os
import subprocess
from pathlib import Path

SAFE_CONFIG = (
    "core.fsmonitor=false", "core.hooksPath=/dev/null", "safe.bareRepository=explicit", "core.pager=cat",
    "core.untrackedCache=false", "protocol.allow=never", "log.showSignature=false",
)
KEPT_ENV = ("GIT_CONFIG_GLOBAL", "GIT_CONFIG_SYSTEM", "GIT_CONFIG_NOSYSTEM", "GIT_CEILING_DIRECTORIES")


def environment() -> dict[str, str]:
    """os.environ without git's redirections, with prompts, pagers, locks and lazy fetches off."""
    env = {k: v for k, v in os.environ.items() if not k.startswith("GIT_") or k in KEPT_ENV}
    env.update(GIT_OPTIONAL_LOCKS="0", LC_ALL="C", GIT_TERMINAL_PROMPT="0", GIT_PAGER="cat", PAGER="cat",
               GIT_NO_LAZY_FETCH="1", GIT_NO_REPLACE_OBJECTS="1")
    return env


def _ceilings() -> list[Path]:
    raw = os.environ.get("GIT_CEILING_DIRECTORIES", "")
    return [Path(os.path.realpath(c)) for c in raw.split(os.pathsep) if c and os.path.isabs(c)]


def find_repository(start: str | Path) -> tuple[Path, Path] | None:
    """(git dir, work tree top) of the first ``.git`` at or above ``start``; None if there is none."""
    here = Path(os.path.realpath(start))
    ceilings = _ceilings()
    while True:
        dot = here / ".git"
        if dot.is_dir() or dot.is_file():
            return dot, here
        if here.parent == here or here.parent in ceilings:
            return None
        here = here.parent


def command(args: list[str], repository: tuple[Path, Path]) -> list[str]:
    git_dir, top = repository
    settings = [part for s in SAFE_CONFIG for part in ("-c", s)]
    return ["git", "--no-pager", "--literal-pathspecs", *settings, f"--git-dir={git_dir}", f"--work-tree={top}", *args]


def run(args: list[str], start: str | Path, *, timeout: float,
        repository: tuple[Path, Path] | None = None) -> subprocess.CompletedProcess | None:
    """Run ``git args`` in ``start`` (a folder) against its repository; None when there is none.

    Raises what subprocess raises (OSError when git is missing, TimeoutExpired); output is bytes.
    """
    repository = repository or find_repository(start)
    if repository is None:
        return None
    return subprocess.run(command(args, repository), cwd=start, env=environment(), capture_output=True,
                          stdin=subprocess.DEVNULL, timeout=timeout, check=False)
