"""Read a spec from a file, or from a git revision without touching the work tree.

``REV:path`` (``HEAD~1:specs/loader.yaml``, ``main:specs/loader.yaml``) is read with
``git show REV:path`` in the current folder's repository; as in git, ``path`` is taken from the
repository's top folder, and ``REV:./path`` from the current folder. Only reading commands are
run: the index, the work tree and the history are left alone. The repository is the first
``.git`` above the current folder, and git runs through ``specgen.gittrust``, so no program a
repository-like folder or a config names can run (``show`` also with --no-textconv --no-ext-diff). Anything else is a plain file path;
a path that exists as a file always wins, so a file name holding a colon still reads as a file.

Failures (git missing, not a repository, an unknown revision, a path not in that revision) are
reported as a SpecError naming the argument, never as a traceback.

A design variant of a spec (specgen/variants.py) is named ``spec.yaml#variant`` (``REV:spec.yaml#variant``
from git): ``split_variant`` takes the id off; the diff then compares that variant.

Example: ``read_spec("HEAD:example_specs/reed_harvester.yaml").name`` is that same text, and its
data is the spec as committed, whatever the file on disk now holds.
"""

from __future__ import annotations

import subprocess
from pathlib import Path

from specgen import gittrust
from specgen.errors import Location, Problem, SpecError
from specgen.intake.read import MAX_BYTES, Source, load_file, load_text

GIT_TIMEOUT_S = 60.0


def split_revision(arg: str) -> tuple[str, str] | None:
    """(revision, path) for an argument of the form REV:path that is not an existing file."""
    if Path(arg).is_file() or ":" not in arg:
        return None
    rev, path = arg.split(":", 1)
    if not rev or not path:
        return None
    return rev, path


def split_variant(arg: str) -> tuple[str, str | None]:
    """(spec argument, variant id) for ``spec.yaml#variant`` or ``REV:spec.yaml#variant``; the id is
    None without a ``#`` (or when the whole argument names an existing file)."""
    if "#" not in arg or Path(arg).is_file():
        return arg, None
    spec, vid = arg.rsplit("#", 1)
    return (spec, vid) if spec and vid else (arg, None)


def _fail(arg: str, message: str) -> SpecError:
    return SpecError([Problem(Location(arg), "", message)])


def _git(arg: str, args: list[str]) -> subprocess.CompletedProcess:
    try:
        done = gittrust.run(args, Path.cwd(), timeout=GIT_TIMEOUT_S)
    except OSError:
        raise _fail(arg, "cannot read a revision: git is not installed or not on PATH") from None
    except subprocess.TimeoutExpired:
        raise _fail(arg, f"git did not answer within {GIT_TIMEOUT_S:.0f} s") from None
    if done is None:
        raise _fail(arg, f"cannot read revision '{arg.split(':', 1)[0]}': the current folder is not in a git repository")
    return done


def _first_line(raw: bytes) -> str:
    text = raw.decode("utf-8", "replace").strip().splitlines()
    return text[0].removeprefix("fatal: ") if text else "git failed"


def read_revision(arg: str, rev: str, path: str) -> bytes:
    """The bytes of ``path`` at ``rev``. Raises SpecError with a sentence saying what is wrong."""
    if rev.startswith("-"):
        raise _fail(arg, f"'{rev}' is not a revision")
    top = _git(arg, ["rev-parse", "--show-toplevel"])
    if top.returncode != 0:
        raise _fail(arg, f"cannot read revision '{rev}': the current folder is not in a git repository")
    commit = _git(arg, ["rev-parse", "--verify", "--quiet", f"{rev}^{{commit}}"])
    if commit.returncode != 0:
        raise _fail(arg, f"unknown revision '{rev}' in the repository at {top.stdout.decode().strip()}")
    kind = _git(arg, ["cat-file", "-t", f"{rev}:{path}"])
    if kind.returncode != 0:
        hint = "" if path.startswith("./") else (
            f" (paths are from the repository's top folder; write '{rev}:./{path}' for one relative to the "
            "current folder)")
        raise _fail(arg, f"'{path}' does not exist in revision '{rev}'{hint}")
    if kind.stdout.strip() != b"blob":
        raise _fail(arg, f"'{path}' is a {kind.stdout.decode().strip()} in revision '{rev}', not a spec file")
    size = _git(arg, ["cat-file", "-s", f"{rev}:{path}"])
    if size.returncode == 0 and int(size.stdout.strip() or 0) > MAX_BYTES:
        raise _fail(arg, f"file is {int(size.stdout)} bytes; specs are limited to {MAX_BYTES} bytes")
    shown = _git(arg, ["show", "--no-textconv", "--no-ext-diff", f"{rev}:{path}"])
    if shown.returncode != 0:
        raise _fail(arg, _first_line(shown.stderr))
    return shown.stdout


def read_spec(arg: str) -> Source:
    """Load a spec from ``REV:path`` or a plain path; the Source is named ``arg`` for messages."""
    parts = split_revision(arg)
    if parts is None:
        return load_file(arg)
    return load_text(read_revision(arg, *parts), arg)
