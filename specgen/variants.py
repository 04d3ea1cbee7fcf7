"""Design variants: check each variant's machine as the base design is checked, and compare them side by side.

A variant's machine was built once at validation (intake/build_variants.py); here it goes through
the same resolve, checks and operating corners as the base design (specgen/corners.py), so its
numbers are those of the spec edited by hand to match it.

The comparison (``compare``) puts the base design and every variant that ran in columns:

- the worst margin of each check id (the smallest signed fraction, checks/status.py), as found
  after the operating corners;
- each supply's pump input power and prime-mover power in its most demanding mode, and the
  highest heat load of any mode;
- each duty cycle's peak oil temperature, when computed;
- every check whose status differs between the columns, and each column's verdict.

Example: the demo's ``larger_reel`` variant (reel motor 250 cm^3 instead of 200 cm^3) lowers the
reel's inlet pressure at the cutting duty point, so its pressure margin grows while its flow demand,
and with it the main pump's load in harvest mode, grows too.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Callable

from specgen.corners import _keys, run_corners
from specgen.intake.build_corners import Corner
from specgen.intake.build_variants import Variant, written_out
from specgen.intake.model import Machine
from specgen.results import Results, most_severe

BASE = "base"  # the column of the base design


@dataclass(frozen=True)
class VariantOutcome:
    """One variant after its checks: ``results`` holds every value and each check at its worst corner."""

    id: str
    title: str
    overrides: tuple[tuple[str, str], ...]
    machine: Machine
    results: Results


def run_variants(variants: tuple[Variant, ...], corners: tuple[Corner, ...],
                 resolve: Callable[[Machine], Results], check: Callable[[Machine, Results], Results]
                 ) -> tuple[VariantOutcome, ...]:
    """Each variant resolved and checked at the nominal point and at every operating corner."""
    out = []
    for v in variants:
        results = run_corners(v.machine, check(v.machine, resolve(v.machine)), corners, resolve, check)
        out.append(VariantOutcome(v.id, v.title, v.overrides, v.machine, results))
    return tuple(out)


@dataclass(frozen=True)
class Row:
    """One line of the side-by-side table: ``values`` in SI (``kind``), base design first, then each
    variant; None where a column has no such value."""

    key: str
    label: str
    kind: str
    values: tuple[float | None, ...]


@dataclass(frozen=True)
class StatusRow:
    """A check whose status differs between the columns: its name and the status in each (None: absent)."""

    name: str
    statuses: tuple[str | None, ...]


@dataclass(frozen=True)
class Comparison:
    columns: tuple[str, ...]  # "base", then the variant ids
    titles: tuple[str, ...]
    verdicts: tuple[str, ...]
    rows: tuple[Row, ...]
    differing: tuple[StatusRow, ...]

    @property
    def verdict(self) -> str:
        """The worst verdict of every column: a failing variant is never hidden."""
        return most_severe(self.verdicts)


def compare(base_title: str, base: Results, variants: tuple[VariantOutcome, ...]) -> Comparison:
    results = (base,) + tuple(v.results for v in variants)
    rows: list[Row] = []
    ids = list(dict.fromkeys(c.id for r in results for c in r.checks))
    for cid in ids:
        worst = tuple(_worst_margin(r, cid) for r in results)
        if any(m is not None for m in worst):  # a check with no numeric margin (load holding) has no row
            rows.append(Row(f"margin.{cid}", f"Worst margin, {cid}", "ratio", worst))
    supplies = list(dict.fromkeys(s.supply for r in results for s in r.supplies))
    for sid in supplies:
        rows.append(Row(f"pump_input_power.{sid}", f"Pump input power, supply {sid} (highest mode)", "power",
                        tuple(_supply_value(r, sid, "worst_pump_input_power") for r in results)))
        rows.append(Row(f"prime_mover_power.{sid}", f"Prime-mover power, supply {sid}", "power",
                        tuple(_highest(r, sid, "prime_mover_power") for r in results)))
    rows.append(Row("heat_load", "Heat load (highest mode)", "power",
                    tuple(max((m["heat_load"] for m in r.modes if "heat_load" in m.values), default=None)
                          for r in results)))
    cycles = list(dict.fromkeys(c.cycle for r in results for c in r.cycles))
    for cyc in cycles:
        temps = tuple(_cycle_value(r, cyc, "peak_temperature") for r in results)
        if any(t is not None for t in temps):
            rows.append(Row(f"oil_temperature.{cyc}", f"Peak oil temperature, duty cycle {cyc}", "temperature", temps))
    return Comparison((BASE,) + tuple(v.id for v in variants), (base_title,) + tuple(v.title for v in variants),
                      tuple(r.verdict for r in results), tuple(rows), tuple(_differing(results)))


def own_problems(base: Results, variant: Results) -> list:
    """A variant's checks worth saying beside the base design's: every failure, and each warning the base
    design does not give at the same place (those are said once, with the base design), worst first."""
    warned = {(c.id, c.drive, c.duty, c.supply, c.mode, c.cycle) for c in base.checks if c.status == "warn"}
    found = [c for c in variant.checks if c.status == "fail" or c.status == "warn" and (
        c.id, c.drive, c.duty, c.supply, c.mode, c.cycle) not in warned]
    return sorted(found, key=lambda c: c.status != "fail")


def _worst_margin(r: Results, cid: str) -> float | None:
    found = [c.margin for c in r.checks if c.id == cid and c.margin is not None and math.isfinite(c.margin)]
    return min(found) if found else None


def _supply_value(r: Results, sid: str, key: str) -> float | None:
    s = r.supply_result(sid)
    return s[key] if s is not None and key in s.values else None


def _highest(r: Results, sid: str, key: str) -> float | None:
    return max((x[key] for x in r.supply_modes if x.supply == sid and key in x.values), default=None)


def _cycle_value(r: Results, cycle: str, key: str) -> float | None:
    c = r.cycle_result(cycle)
    return c[key] if c is not None and key in c.values else None


def _differing(results: tuple[Results, ...]) -> list[StatusRow]:
    """Checks matched by where they apply (corners._keys) whose status is not the same in every column."""
    by_key: dict[tuple, list] = {}
    names: dict[tuple, str] = {}
    for n, r in enumerate(results):
        for key, c in zip(_keys(r.checks), r.checks):
            by_key.setdefault(key, [None] * len(results))[n] = c.status
            names.setdefault(key, f"{c.id} ({c.where})" if c.where else c.id)
    return [StatusRow(names[k], tuple(s)) for k, s in by_key.items() if len(set(s)) > 1]


def as_outcome(outcome, vid: str, name: str):
    """``outcome`` (pipeline.Outcome) seen as the variant ``vid`` alone, for the revision diff: its
    machine and results, and the spec's data with the variant's replacements written in (so the
    diff of inputs names them), under ``name`` (e.g. "spec.yaml#larger_reel")."""
    v = next(x for x in outcome.variants if x.id == vid)
    data = written_out(outcome.source.data, vid)
    return replace(outcome, source=replace(outcome.source, name=name, data=data), machine=v.machine,
                   results=v.results, variants=())


def views(outcome) -> list:
    """Each variant that ran as an Outcome of its own (pipeline.Outcome), named ``spec.yaml#id``:
    for outputs that list one spec's checks (JUnit, CI annotations)."""
    return [replace(outcome, source=replace(outcome.source, name=f"{outcome.source.name}#{v.id}"),
                    machine=v.machine, results=v.results, variants=()) for v in getattr(outcome, "variants", ())]


def without_variants(outcome):
    """``outcome`` with no ``variants`` key in its spec data, so a diff against one variant lists only
    what the variant replaces."""
    if "variants" not in outcome.source.data:
        return outcome
    data = {k: v for k, v in outcome.source.data.items() if k != "variants"}
    return replace(outcome, source=replace(outcome.source, data=data))
