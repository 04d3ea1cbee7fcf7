"""The build as a visible pipeline: read -> validate and build -> resolve -> check, at the nominal point
and at each operating corner (specgen/corners.py), for the base design and each design variant
(specgen/variants.py). Rendering comes after."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Callable

from specgen.checks import run_checks
from specgen.heap import few_full_collections
from specgen.intake.model import Machine
from specgen.intake.read import Source, load_file
from specgen.corners import run_corners
from specgen.errors import Problem, SpecError
from specgen.intake.validate import build_design
from specgen.resolve.load import decide_directions
from specgen.resolve.machine import resolve
from specgen.results import Results, most_severe
from specgen.variants import VariantOutcome, run_variants


@dataclass(frozen=True)
class Outcome:
    source: Source
    machine: Machine
    results: Results
    variants: tuple[VariantOutcome, ...] = ()  # the design variants that ran, in the spec's order
    sensitivity: object = None  # sensitivity.Sensitivity of the base design's margins, when asked for

    @property
    def verdict(self) -> str:
        """The worst verdict of the base design and every variant that ran."""
        return most_severe([self.results.verdict] + [v.results.verdict for v in self.variants])


def evaluate(source: Source, allow_outside_files: bool = False, variants: tuple[str, ...] | None = None) -> Outcome:
    """``allow_outside_files``: a file the spec names (a parts file) may lie outside its folder tree;
    ``variants``: the ids of the design variants to run (None: every one; (): none)."""
    return _outcome(lambda: source, allow_outside_files, variants)


def run_file(path: str | Path, allow_outside_files: bool = False, variants: tuple[str, ...] | None = None) -> Outcome:
    """Load, validate, compute and check one spec file. Raises SpecError for bad input."""
    return _outcome(lambda: load_file(path), allow_outside_files, variants)


def _outcome(read: Callable[[], Source], allow_outside_files: bool, wanted: tuple[str, ...] | None) -> Outcome:
    """The one entry to the stages; they make no cyclic garbage to sweep for (specgen/heap.py)."""
    with few_full_collections():
        source = read()
        machine, corners, variants = build_design(source, decide_directions, allow_outside_files=allow_outside_files)
        results = run_corners(machine, run_checks(machine, resolve(machine)), corners, resolve, run_checks)
        ran = run_variants(select(source, variants, wanted), corners, resolve, run_checks)
    return Outcome(source, machine, results, ran)


def select(source: Source, variants: tuple, wanted: tuple[str, ...] | None) -> tuple:
    """The variants named in ``wanted`` (None: all), in the spec's order; an unknown name is bad input."""
    if wanted is None:
        return variants
    known = {v.id for v in variants}
    missing = [w for w in wanted if w not in known]
    if missing:
        have = f"its variants: {', '.join(sorted(known))}" if known else "it declares no variants"
        raise SpecError([Problem(source.location(("variants",)), "variants",
                                 f"no variant '{missing[0]}' in this spec ({have})")])
    return tuple(v for v in variants if v.id in wanted)
