"""Find the schema and report templates whether installed from a wheel or run from a checkout."""

from __future__ import annotations

from importlib import resources
from pathlib import Path


def data_dir(name: str) -> Path:
    """Return the folder ``schemas`` or ``report_templates``.

    The wheel carries them at ``specgen/_data/<name>``; a source checkout (or an editable
    install, which does not copy them) has them at the project's top level.
    """
    packaged = resources.files("specgen") / "_data" / name
    if packaged.is_dir():
        return Path(str(packaged))
    here = Path(__file__).resolve().parent.parent / name
    if here.is_dir():
        return here
    raise FileNotFoundError(f"specgen is installed without its {name} folder")
