"""Write files so that a reader never sees half a file and a failed run leaves the old one intact."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path


def write_atomic(path: str | Path, data: str | bytes) -> None:
    """Write to a temporary file beside ``path``, flush it to disk, then rename it into place."""
    target = Path(path)
    target.parent.mkdir(parents=True, exist_ok=True)
    raw = data.encode("utf-8") if isinstance(data, str) else data
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=target.parent)
    try:
        with os.fdopen(fd, "wb") as fh:
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
