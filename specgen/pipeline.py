"""The build as a visible pipeline: read -> validate and build -> resolve -> check, at the nominal point
and at each operating corner (specgen/corners.py). Rendering comes after."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Callable

from specgen.checks import run_checks
from specgen.heap import few_full_collections
from specgen.intake.model import Machine
from specgen.intake.read import Source, load_file
from specgen.corners import run_corners
from specgen.intake.validate import build_with_corners
from specgen.resolve.load import decide_directions
from specgen.resolve.machine import resolve
from specgen.results import Results


@dataclass(frozen=True)
class Outcome:
    source: Source
    machine: Machine
    results: Results


def evaluate(source: Source, allow_outside_files: bool = False) -> Outcome:
    """``allow_outside_files``: a file the spec names (a parts file) may lie outside its folder tree."""
    return _outcome(lambda: source, allow_outside_files)


def run_file(path: str | Path, allow_outside_files: bool = False) -> Outcome:
    """Load, validate, compute and check one spec file. Raises SpecError for bad input."""
    return _outcome(lambda: load_file(path), allow_outside_files)


def _outcome(read: Callable[[], Source], allow_outside_files: bool) -> Outcome:
    """The one entry to the stages; they make no cyclic garbage to sweep for (specgen/heap.py)."""
    with few_full_collections():
        source = read()
        machine, corners = build_with_corners(source, decide_directions, allow_outside_files=allow_outside_files)
        results = run_corners(machine, run_checks(machine, resolve(machine)), corners, resolve, run_checks)
    return Outcome(source, machine, results)
