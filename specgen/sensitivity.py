"""Which inputs move each check's margin: every numeric input of the validated model moved by a step.

Method (a one-sided finite difference on the built model): every numeric input of the Machine is
found by walking its dataclasses (``numeric_inputs``); each is moved by ``step`` times its own
value (default 1 %) with dataclasses.replace along its field path (specgen/corners.py, nothing is
read or parsed again), and the moved machine is resolved and checked at the nominal point. The
change of each check's margin (the signed fraction of checks/status.py) is

    d_margin = margin(x * (1 + step)) - margin(x)

and the inputs are ranked by |d_margin|, ties broken by the input's path, so the order is stable.
For the weakest few margins (the ones the text and the report's tornado charts show) the inputs
at the top are also moved by -step, giving the change for a step either way.

What is moved, and what is not:

- every float of the supplies, drives (motor, ratings, gear stage, valves, lines, duty points and
  their loads and inertia), fluid, cooler, reservoir, duty cycles, ambient and oil-limit temperature;
  a Ratio (efficiency, density, an assumed value) by its value; a fixed motor's displacement
  (min = max) as one input, so it stays a fixed motor;
- temperatures move by the step of their absolute (kelvin) value: 1 % of 328 K is 3.3 K;
- an input at zero is left out (a fraction of zero is no step; listed under ``skipped``), as are
  whole numbers (ISO VG grade, rope layer, wheel count: choices, not quantities), thresholds
  (they move a check's status, not its margin), a maker's efficiency table and the sizing series;
- a step the relations refuse (an efficiency moved above 1 where a guard stops it) gives no change
  for that input (None), never an error.

Margins are those at the nominal point: operating corners move inputs themselves, so the
sensitivity is of the nominal design (their worst corner is reported by the checks as before).

Cost: one resolve and check of the machine for every input, plus one for each input shown at
-step: linear in the number of inputs. A moved copy shares every part the input does not sit in,
so resolve keeps the duty results of the other drives and the supply modes the input does not
reach (``reuse``): about 4 ms a copy of the demo instead of 8 ms, 0.6 s for its 157 inputs on
one core. The copies are checked in forked workers when CPUs are idle.

Example: for a motor whose inlet pressure is p_in = 2*pi*T/(Vg*eta_hm) + p_out, the pressure
margin (p_limit - p_in)/p_limit falls with +1 % of T by about 0.01 * (p_in - p_out)/p_limit, rises by
as much with +1 % of Vg or eta_hm, and rises with the relief setting by about 0.01 * p_in/p_limit.
"""

from __future__ import annotations

import dataclasses
import math
import os
import re
from dataclasses import dataclass

from specgen.checks import CHECKS
from specgen.corners import _keys, apply
from specgen.intake.build_corners import Target
from specgen.intake.build_variants import Moves
from specgen.intake.model import Machine, Motor, Ratio
from specgen.resolve.machine import resolve

DEFAULT_STEP = 0.01
MAX_STEP = 0.5
SHOWN_MARGINS = 5  # the weakest margins the text and the report show
SHOWN_INPUTS = 8  # inputs shown for each of them (and moved by -step too)
FORK_FROM = 40  # moved machines per worker before forking workers pays (python -m specgen.bench)
_SKIP = {"thresholds", "sizing", "modes", "signoff", "efficiency_table"}
_SPEC_NAMES = {"gear": "gear_stage", "ret": "return"}
_STEP = re.compile(r"^\s*(\d+(?:\.\d+)?)\s*(%?)\s*$")


def parse_step(text) -> float | None:
    """'1 %' -> 0.01, '0.5%' -> 0.005, '0.02' -> 0.02; None when not a step in (0, MAX_STEP]."""
    m = _STEP.match(str(text))
    if m is None:
        return None
    step = float(m.group(1)) / (100.0 if m.group(2) else 1.0)
    return step if 0 < step <= MAX_STEP else None


@dataclass(frozen=True)
class Knob:
    """One numeric input: ``path`` as the spec names it, its SI ``value``, the model ``steps`` it sits at
    (two for a fixed motor's displacement, moved together)."""

    path: str
    value: float
    steps: tuple[tuple, ...]


@dataclass(frozen=True)
class Effect:
    """The change of one margin when ``input`` moves by +step (``up``) and -step (``down``; None where
    not computed or refused)."""

    input: str
    up: float | None
    down: float | None = None


@dataclass(frozen=True)
class MarginSensitivity:
    """One check's margin at the nominal point and every input that moves it, ranked."""

    name: str  # check id and where it applies
    check: str
    margin: float
    effects: tuple[Effect, ...]


@dataclass(frozen=True)
class Sensitivity:
    step: float
    inputs: tuple[Knob, ...]
    skipped: tuple[tuple[str, str], ...]  # (path, why)
    margins: tuple[MarginSensitivity, ...]  # weakest margin first

    @property
    def weakest(self) -> tuple[MarginSensitivity, ...]:
        return self.margins[:SHOWN_MARGINS]


def numeric_inputs(machine: Machine) -> tuple[tuple[Knob, ...], tuple[tuple[str, str], ...]]:
    """Every numeric input of the model in the model's order, and those left out with why."""
    knobs: list[Knob] = []
    skipped: list[tuple[str, str]] = []

    def leaf(value, steps, names):
        path = ".".join(names)
        if value == 0:
            skipped.append((path, "zero: no step of its own size"))
        elif math.isfinite(value):
            knobs.append(Knob(path, float(value), (steps,)))

    def walk(node, steps, names):
        if isinstance(node, Ratio):
            leaf(node.value, steps, names)
        elif isinstance(node, Motor) and node.displacement_min is not None \
                and node.displacement_min == node.displacement_max:
            for f in dataclasses.fields(node):
                if f.name == "displacement_min":
                    ends = (steps + (("attr", "displacement_min"),), steps + (("attr", "displacement_max"),))
                    knobs.append(Knob(".".join(names + ("displacement",)), node.displacement_min, ends))
                elif f.name != "displacement_max" and f.name not in _SKIP:
                    walk(getattr(node, f.name), steps + (("attr", f.name),), names + (_name(node, f.name),))
        elif dataclasses.is_dataclass(node):
            for f in dataclasses.fields(node):
                if f.name not in _SKIP:
                    walk(getattr(node, f.name), steps + (("attr", f.name),), names + (_name(node, f.name),))
        elif isinstance(node, tuple) and node and dataclasses.is_dataclass(node[0]):
            for i, x in enumerate(node):
                ident = getattr(x, "id", None)
                walk(x, steps + ((("id", ident) if ident is not None else ("index", i)),), names + (str(ident or i),))
        elif isinstance(node, float):
            leaf(node, steps, names)

    walk(machine, (), ())
    return tuple(knobs), tuple(skipped)


def _name(node, attr: str) -> str:
    """The spec's key for a model attribute (motor efficiencies sit under ``efficiency``)."""
    if isinstance(node, Motor) and attr.endswith("_efficiency"):
        return "efficiency." + attr.removesuffix("_efficiency")
    if getattr(node, "model", None) and attr not in ("model",) and not isinstance(node, Motor):
        return f"{node.model}.{attr}"  # a load block: load.wheel.grade
    return _SPEC_NAMES.get(attr, attr)


def _no_text(value, kind) -> str:
    return ""  # the checks' sentences are not read here: only their margins


def _checked(machine: Machine, results) -> list:
    return [c for fn in CHECKS for c in fn(machine, results, _no_text)]


# Duty results of drives an input does not reach, kept across the moved machines (resolve's ``reuse``):
# a moved copy shares every part the input does not sit in, so those drives are not computed again.
_REUSE: dict = {}


def margins(machine: Machine, reuse: dict | None = None) -> dict[tuple, float]:
    """Every finite margin of the checks at the nominal point, keyed by where the check applies (corners._keys)."""
    checks = _checked(machine, resolve(machine, reuse))
    return {k: c.margin for k, c in zip(_keys(checks), checks) if c.margin is not None and math.isfinite(c.margin)}


def _named(machine: Machine, reuse: dict | None = None) -> dict[tuple, tuple[str, str, float]]:
    """``margins`` with each check's name and id: key -> (name, check id, margin)."""
    checks = _checked(machine, resolve(machine, reuse))
    return {k: (f"{c.id} ({c.where})" if c.where else c.id, c.id, c.margin) for k, c in zip(_keys(checks), checks)
            if c.margin is not None and math.isfinite(c.margin)}


def _moved(machine: Machine, knob: Knob, factor: float) -> Machine:
    return apply(machine, Moves(tuple(Target(knob.path, s, "scale", factor) for s in knob.steps)))


def _deltas(machine: Machine, knob: Knob, factor: float, base: dict) -> dict[tuple, float] | None:
    try:
        found = margins(_moved(machine, knob, factor), _REUSE)
    except (ArithmeticError, ValueError):  # a relation's guard refuses the moved value
        return None
    return {k: found[k] - base[k][2] for k in base if k in found}


# What forked workers read (set before the fork, so they inherit it rather than receive it).
_JOB: tuple = ()


def _run(n: int):
    machine, jobs, base = _JOB
    knob, factor = jobs[n]
    return _deltas(machine, knob, factor, base)


def _evaluate(machine: Machine, jobs: list[tuple[Knob, float]], base: dict) -> list:
    """``_deltas`` of every (input, factor), in order: in forked worker processes when there are many
    jobs and more than one idle CPU (every job is independent and pure, so the result is the same either
    way; on a machine busy with other work the workers only wait for each other, measured 1.4 s forked
    against 0.9 s here at a load average of 4 on 2 CPUs)."""
    global _JOB
    from specgen.present import chart_batch

    idle = chart_batch.usable_cpus() - round(os.getloadavg()[0]) if hasattr(os, "getloadavg") else 1
    n = min(idle, len(jobs) // FORK_FROM) if chart_batch.can_fork() else 1
    if n < 2:
        return [_deltas(machine, k, f, base) for k, f in jobs]
    _JOB = (machine, jobs, base)
    pool = chart_batch._fork_pool(n, chart_batch._quiet_worker)
    try:
        return pool.map(_run, range(len(jobs)), chunksize=max(1, len(jobs) // (4 * n)))
    finally:
        pool.terminate()
        pool.join()
        _JOB = ()


def _rank(effect: tuple[str, float]) -> tuple:
    # rounded so that changes equal but for rounding noise (a mass and a radius in one product) tie, then by path
    return (-round(abs(effect[1]), 12), effect[0])


def sensitivity(machine: Machine, step: float = DEFAULT_STEP) -> Sensitivity:
    """The change of every margin for a step of every numeric input, ranked (module docstring)."""
    knobs, skipped = numeric_inputs(machine)
    _REUSE.clear()
    base = _named(machine, _REUSE)  # fills the reuse with every drive of the design as it stands
    ups = dict(zip((k.path for k in knobs), _evaluate(machine, [(k, 1.0 + step) for k in knobs], base)))
    ranked = {}
    for key in base:
        effects = [(path, d[key]) for path, d in ups.items() if d is not None and d.get(key)]
        ranked[key] = sorted(effects, key=_rank)
    order = sorted(base, key=lambda k: (base[k][2], base[k][0]))
    shown = sorted({path for key in order[:SHOWN_MARGINS] for path, _ in ranked[key][:SHOWN_INPUTS]})
    by_path = {k.path: k for k in knobs}
    downs = dict(zip(shown, _evaluate(machine, [(by_path[p], 1.0 - step) for p in shown], base)))
    _REUSE.clear()
    out = []
    for key in order:
        effects = tuple(Effect(path, up, (downs.get(path) or {}).get(key) if path in downs else None)
                        for path, up in ranked[key])
        out.append(MarginSensitivity(base[key][0], base[key][1], base[key][2], effects))
    return Sensitivity(step, knobs, skipped, tuple(out))


def with_sensitivity(outcome, step: float = DEFAULT_STEP):
    """``outcome`` (pipeline.Outcome) with the sensitivity of its base design's margins attached."""
    return dataclasses.replace(outcome, sensitivity=sensitivity(outcome.machine, step))
