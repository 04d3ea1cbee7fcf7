"""Build where proposed motor displacements come from: an ISO 3 series, or a parts file of stocked sizes.

A parts file is read, validated against ``motor-parts.schema.json`` and its sizes parsed to
m^3/rev; its problems point into the parts file itself. A file a spec names must lie in the
spec's folder tree unless the user allows files outside it (``resolve_inside``).
"""

from __future__ import annotations

import math
import os
from pathlib import Path

from specgen.errors import Problem, SpecError
from specgen.intake import defaults, schema
from specgen.intake.build_drives import build_table
from specgen.intake.model import Drive, Sizing
from specgen.intake.quantities import Builder
from specgen.intake.read import Source, load_file


def build_sizing(b: Builder, raw: dict | None, allow_outside: bool, drives: tuple[Drive, ...]) -> Sizing:
    raw = raw or {}
    path = ("sizing",)
    if "series" in raw and "parts_file" in raw:
        b.fail(path + ("parts_file",), "give series or parts_file, not both")
    if "parts_file" not in raw:
        return Sizing(series=raw.get("series", defaults.SIZING_SERIES))
    read = _parts_file(b, raw["parts_file"], path + ("parts_file",), allow_outside)
    if read is None:
        return Sizing(parts_file=raw["parts_file"])
    stock, tables = read
    for drive in drives:
        m = drive.motor
        if m.target_pressure is not None and m.kind not in stock:
            b.fail(("drives", drive.id, "motor", "kind"),
                   f"parts file '{raw['parts_file']}' lists no {m.kind} motors (it lists: {', '.join(stock)})")
    return Sizing(series="", stock=stock, parts_file=raw["parts_file"], tables=tables)


def resolve_inside(spec_name: str, relative: str, allow_outside: bool) -> tuple[Path, str | None]:
    """The real path of a file named in a spec, and why it is refused (None when it is not).

    Relative names are taken from the spec's folder. Symbolic links are followed before the test,
    so a link inside the folder tree that points out of it is refused too.
    """
    base = Path(os.path.realpath(Path(spec_name).parent))
    target = Path(os.path.realpath(base / relative))
    if allow_outside or target == base or base in target.parents:
        return target, None
    return target, (f"'{relative}' resolves to {target}, outside the spec's folder {base}; move the file into "
                    "that folder tree or run specgen with --allow-outside-files")


def _parts_file(b: Builder, name: str, here: tuple, allow_outside: bool) -> dict | None:
    """(motor kind -> sorted stocked displacements (m^3/rev), name -> efficiency table), or None when
    the file is refused."""
    target, refused = resolve_inside(b.source.name, name, allow_outside)
    if refused:
        b.fail(here, refused)
        return None
    if not target.is_file():
        b.fail(here, f"parts file '{name}' not found (looked for {target})")
        return None
    try:
        parts = load_file(target)
    except SpecError as exc:
        b.problems.extend(exc.problems)
        return None
    problems = _parts_schema_problems(parts)
    if problems:
        b.problems.extend(problems)
        return None
    pb = Builder(parts)  # a builder whose messages point into the parts file, at the list item
    stock = {}
    for kind, sizes in parts.data["motors"].items():
        items = dict(enumerate(sizes))
        values = [pb.quantity(items, k, ("motors", kind), "displacement") for k in items]
        stock[kind] = tuple(sorted(v for v in values if v is not None and math.isfinite(v) and v > 0))
    tables = {name: build_table(pb, t, ("efficiency_tables", name))
              for name, t in parts.data.get("efficiency_tables", {}).items()}
    if pb.problems:
        b.problems.extend(pb.problems)
        return None
    return stock, tables


def _parts_schema_problems(parts: Source) -> list[Problem]:
    root = schema.parts_schema()
    out = []
    for error in schema.parts_validator().iter_errors(parts.data):
        path, message = schema.message(error, root)
        out.append(Problem(parts.location(path), schema.dotted(path), message))
    return sorted(out, key=lambda p: (p.location.line, p.location.column, p.path))
