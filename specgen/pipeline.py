"""The build as a visible pipeline: load -> validate -> compute -> check. Rendering comes after."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from specgen.calc.resolve import resolve
from specgen.checks import run_checks
from specgen.results import Results
from specgen.spec.load import Source, load_file, load_text
from specgen.spec.model import Machine
from specgen.spec.validate import build


@dataclass(frozen=True)
class Outcome:
    source: Source
    machine: Machine
    results: Results


def evaluate(source: Source) -> Outcome:
    machine = build(source)
    results = run_checks(machine, resolve(machine))
    return Outcome(source, machine, results)


def run_file(path: str | Path) -> Outcome:
    """Load, validate, compute and check one spec file. Raises SpecError for bad input."""
    return evaluate(load_file(path))


def run_text(raw: bytes, name: str) -> Outcome:
    return evaluate(load_text(raw, name))
