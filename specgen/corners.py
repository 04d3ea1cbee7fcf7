"""Operating corners: apply each to the built machine, check it, and judge every check at its worst.

A corner (built and validated once in intake/build_corners.py) moves model fields along their
``Target`` steps with ``dataclasses.replace``: nothing is read or parsed again. The moved machine
goes through the same resolve and checks as the nominal one, so a colder fluid reaches viscosity,
line losses and every check computed from the fluid result with no rule of its own.

Worst corner: each check is matched across the nominal point and every corner by where it applies
(check id, drive, duty point, supply, mode and, for a repeat at one place, its ordinal). The check
reported is the one with the most severe status; on a tie the nominal point wins, then the corner
first in the spec. A corner limited to some modes competes only in checks of those modes, of the
duty points and drives that run in them, and of the machine or a supply as a whole. A check a
corner raises that the nominal point does not have is reported too, when it warns or fails
(safety output is never dropped).

Engine speed: a supply whose pump shaft speed is given as well as its prime mover speed turns its
pump at the moved prime mover speed times its drive ratio at a corner that moves the engine speed.

Example: the demo's main supply with ``relief_setting: 280 bar`` at a corner scaling
``supplies.relief_setting`` by "+5 %" is checked at 294 bar; a breakaway check that passes
nominally and warns there is reported as a warning at that corner.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Callable

from specgen.results import RANK, Check
from specgen.intake.build_corners import Corner, Target
from specgen.intake.model import Machine, Ratio
from specgen.results import CornerResult, Results


def apply(machine: Machine, corner: Corner) -> Machine:
    """The machine at ``corner``: every target moved, every other field shared with ``machine``."""
    moved = machine
    for t in corner.targets:
        moved = _replace(moved, t.steps, lambda old, t=t: _move(old, t))
    if moved.supplies is not machine.supplies:
        moved = replace(moved, supplies=tuple(_engine_speed(new, old) for new, old in
                                              zip(moved.supplies, machine.supplies)))
    return moved


def _move(old, t: Target):
    base = old.value if isinstance(old, Ratio) else old
    new = t.amount if t.how == "set" else base + t.amount if t.how == "points" else base * t.amount
    return Ratio(new) if isinstance(old, Ratio) else new


def _replace(node, steps: tuple, fn: Callable):
    if not steps:
        return fn(node)
    how, name = steps[0]
    if how == "index":  # a record of a tuple without ids (a duty cycle's steps)
        return tuple(_replace(x, steps[1:], fn) if i == name else x for i, x in enumerate(node))
    if how == "id":
        return tuple(_replace(x, steps[1:], fn) if x.id == name else x for x in node)
    return replace(node, **{name: _replace(getattr(node, name), steps[1:], fn)})


def _engine_speed(new, old):
    n = new.prime_mover_speed
    if n == old.prime_mover_speed or n is None or new.pump.shaft_speed is None:
        return new
    return replace(new, pump=replace(new.pump, shaft_speed=n * new.drive_ratio))


def _keys(checks) -> list[tuple]:
    """Where each check applies, with an ordinal for a repeat at the same place."""
    seen: dict[tuple, int] = {}
    out = []
    for c in checks:
        base = (c.id, c.drive, c.duty, c.supply, c.mode)
        n = seen.get(base, 0)
        seen[base] = n + 1
        out.append(base + (n,))
    return out


def run_corners(machine: Machine, nominal: Results, corners: tuple[Corner, ...],
                resolve: Callable[[Machine], Results], check: Callable[[Machine, Results], Results]) -> Results:
    """``nominal`` with ``corners`` attached and each check replaced by its worst: the nominal values
    (duty points, supplies, traces) stay as they are."""
    if not corners:
        return nominal
    found = []
    for corner in corners:
        moved = apply(machine, corner)
        checks = check(moved, resolve(moved)).checks
        if corner.modes:
            running = {pair for m in machine.modes if m.id in corner.modes for pair in m.running}
            drives = {drive for drive, _ in running}
            checks = tuple(c for c in checks if _in_modes(c, corner.modes, running, drives))
        found.append(CornerResult(corner.id, corner.title, corner.modes, corner.overrides,
                                  tuple(replace(c, corner=corner.id) for c in checks), corner.assumed, corner.basis))
    return replace(nominal, checks=worst(nominal.checks, [r.checks for r in found]), corners=tuple(found))


def _in_modes(c: Check, modes: tuple[str, ...], running: set, drives: set) -> bool:
    """Does check ``c`` belong to one of ``modes``: its own mode, the duty point (``running``: the
    (drive, duty) pairs of those modes) or drive it names running in one of them, or (naming none
    of these) the machine or a supply as a whole."""
    if c.mode is not None:
        return c.mode in modes
    if c.drive is None:
        return True
    return (c.drive, c.duty) in running if c.duty is not None else c.drive in drives


def worst(nominal: tuple[Check, ...], at_corners: list[tuple[Check, ...]]) -> tuple[Check, ...]:
    """Each nominal check replaced by its most severe match at a corner (the nominal point wins a
    tie, then the earlier corner); then checks found only at a corner that warn or fail."""
    best = dict(zip(_keys(nominal), nominal))
    extra: dict[tuple, Check] = {}
    for checks in at_corners:
        for key, c in zip(_keys(checks), checks):
            held = best.get(key)
            if held is not None:
                if RANK[c.status] > RANK[held.status]:
                    best[key] = c
            elif c.status != "pass" and (key not in extra or RANK[c.status] > RANK[extra[key].status]):
                extra[key] = c
    return tuple(best.values()) + tuple(extra.values())
