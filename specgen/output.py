"""Write files so that a reader never sees half a file, a failed run leaves the old one intact,
no output replaces an input or a file specgen did not write, and a killed run leaves no litter.

- ``write_atomic``: a temporary file beside the target, flushed to disk, renamed into place, with
  the permissions the umask gives a new file (0644 under umask 022), not mkstemp's 0600.
- ``refuse_inputs``: an output path that is one of the run's inputs (the same file after links,
  also a hard link) is refused before anything is written.
- ``staging_folder`` / ``remove_stale``: temporary files and folders carry the writing process's
  id in their name (``.NAME.PID.XXXX.tmp``); the next run beside the same target removes those
  whose process is gone, and never those of a run still going.
- ``refuse_foreign_files``: a report folder's ``index.html`` (and ``report.pdf`` beside it) is
  replaced only when that ``index.html`` is a specgen page (its ``<meta name="generator"
  content="specgen ...">``, read from the first 4 KiB), so ``report -o docs`` cannot overwrite a
  site's own home page.
"""

from __future__ import annotations

import os
import re
import shutil
import stat
import tempfile
from pathlib import Path

from specgen.errors import Location, Problem, SpecError

GENERATOR_MARK = b'<meta name="generator" content="specgen '
REPORT_PAGE = "index.html"
_HEAD_BYTES = 4096


def new_file_mode() -> int:
    """The mode ``open()`` would give a new file: 0o666 less the process umask."""
    mask = os.umask(0o022)
    os.umask(mask)
    return 0o666 & ~mask


def _temp_prefix(target: Path) -> str:
    return f".{target.name or 'output'}.{os.getpid()}."


def write_atomic(path: str | Path, data: str | bytes) -> None:
    """Write to a temporary file beside ``path``, flush it to disk, then rename it into place."""
    target = Path(path)
    target.parent.mkdir(parents=True, exist_ok=True)
    remove_stale(target)
    raw = data.encode("utf-8") if isinstance(data, str) else data
    fd, tmp = tempfile.mkstemp(prefix=_temp_prefix(target), suffix=".tmp", dir=target.parent)
    try:
        with os.fdopen(fd, "wb") as fh:
            os.fchmod(fh.fileno(), new_file_mode())
            fh.write(raw)
            fh.flush()
            os.fsync(fh.fileno())
        os.replace(tmp, target)
    except BaseException:
        try:
            os.unlink(tmp)
        except FileNotFoundError:
            pass
        raise


def staging_folder(target: str | Path) -> Path:
    """A new empty folder beside ``target`` to render into, named for this process (see remove_stale)."""
    target = Path(target)
    target.parent.mkdir(parents=True, exist_ok=True)
    remove_stale(target)
    return Path(tempfile.mkdtemp(prefix=_temp_prefix(target), suffix=".tmp", dir=target.parent))


def _running(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OverflowError, ValueError):
        return True  # someone else's live process, or a number we cannot ask about: leave it
    return True


def remove_stale(target: str | Path) -> list[Path]:
    """Remove the temporary files and folders of ``target`` left by runs that are no longer running."""
    target = Path(target)
    own = re.compile(re.escape(f".{target.name or 'output'}.") + r"([0-9]+)\.[^/]+\.tmp")
    removed = []
    try:
        entries = list(os.scandir(target.parent))
    except OSError:
        return removed
    for entry in entries:
        m = own.fullmatch(entry.name)
        if not m or _running(int(m.group(1))):
            continue
        try:
            if entry.is_dir(follow_symlinks=False):
                shutil.rmtree(entry.path)
            else:
                os.unlink(entry.path)
            removed.append(Path(entry.path))
        except OSError:
            pass  # another run got there first, or not ours to remove
    return removed


def _same_file(a: str | Path, b: str | Path) -> bool:
    if os.path.realpath(a) == os.path.realpath(b):
        return True
    try:
        sa, sb = os.stat(a), os.stat(b)
    except (OSError, ValueError):
        return False
    return (sa.st_dev, sa.st_ino) == (sb.st_dev, sb.st_ino)


def refuse_inputs(output: str | Path, inputs) -> None:
    """Raise SpecError (nothing written) when ``output`` is one of ``inputs`` after links."""
    for given in inputs:
        if _same_file(output, given):
            raise SpecError([Problem(Location(str(output)), "", f"is an input of this run ({given}); "
                                     "write the output to another file")])


def is_specgen_page(path: str | Path) -> bool:
    """True when ``path`` is a regular file whose first 4 KiB carry specgen's generator tag."""
    try:
        fd = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_NOFOLLOW", 0))
    except OSError:
        return False
    try:
        if not stat.S_ISREG(os.fstat(fd).st_mode):
            return False
        return GENERATOR_MARK in os.read(fd, _HEAD_BYTES)
    finally:
        os.close(fd)


def refuse_foreign_files(folder: str | Path, relative: list[str | Path]) -> None:
    """Raise SpecError unless every file of ``relative`` under ``folder`` may be replaced: an
    existing ``index.html`` must be a specgen page, and so must an ``index.html`` beside any other
    existing file (a report.pdf in a folder of someone else's site stays theirs)."""
    folder = Path(folder)
    for rel in relative:
        existing = folder / rel
        page = existing.parent / REPORT_PAGE
        if not os.path.lexists(existing) or not os.path.lexists(page) or is_specgen_page(page):
            continue
        what = "was not written by specgen" if existing == page else f"sits beside {page}, which specgen did not write"
        raise SpecError([Problem(Location(str(existing)), "", (
            f"{what} (no specgen generator tag); specgen replaces only its own report: choose an empty "
            "folder or an earlier report's"))])
