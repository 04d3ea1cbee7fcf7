"""What changed between two revisions of a spec: its inputs, its results and its checks.

Inputs are compared by physical value: a quantity field (its kind read from the schema, see
``spec.content``) is parsed to SI on both sides, so "250 bar" and "3626 psi" are the same value
(they differ by 0.0013 %, under ``INPUT_TOLERANCE``) and are listed only as respelled, while
"250 bar" -> "260 bar" is a change. Drives, duty points, supplies and modes are matched by id:
an id present on one side only is added or removed, never paired with another item.

Results are compared over every computed Value of every duty point, supply/mode pair, drive,
supply, mode, shared prime mover in each mode and of the fluid, matched by ids; a value counts as moved when it differs by more than ``RESULT_TOLERANCE``
(relative, with ``ABSOLUTE_FLOOR`` in SI for values at zero).

Checks are matched by id and where they apply (drive, duty point, supply, mode, prime mover). Severity is
pass < warn < fail; a check that got more severe, or appears at warn or fail, is a regression.
Regressions come first, worst first.

Example: raising the climb torque of the demo machine's tracks from 3.1 to 3.4 kN*m moves the
inlet pressure from 260.7 to about 285 bar and turns ``pressure_margin`` there from warn to fail.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from specgen.results import RANK
from specgen.pipeline import Outcome
from specgen.intake.content import common_kind, si_value
from specgen.intake.read import plain_data
from specgen.intake.schema import Field, fields

INPUT_TOLERANCE = 1e-4  # 0.01 %: a value converted to 4-5 significant figures is the same value
RESULT_TOLERANCE = 1e-4
ABSOLUTE_FLOOR = 1e-12  # SI; only decides between exactly zero and a computed near-zero
FAIL_ON = ("warn", "fail")


@dataclass(frozen=True)
class InputChange:
    """One field or item of the spec. ``change``: added, removed, changed or respelled (same value)."""

    path: tuple
    change: str
    old: object = None
    new: object = None
    kind: str | None = None  # units kind of a quantity leaf
    noun: str | None = None  # "drive", "duty point" ... for an added or removed item
    old_si: float | None = None
    new_si: float | None = None

    @property
    def dotted(self) -> str:
        return ".".join(str(p) for p in self.path)


# What computed values belong to, and the ids that name one: scope -> (where keys, words)
SCOPES = {
    "duty_point": (("drive", "duty"), ("drive", "duty point")),
    "supply_mode": (("supply", "mode"), ("supply", "mode")),
    "supply_mode_drive": (("supply", "mode", "drive"), ("supply", "mode", "drive")),
    "drive": (("drive",), ("drive",)),
    "supply": (("supply",), ("supply",)),
    "mode": (("mode",), ("mode",)),
    "fluid": ((), ()),
    "prime_mover_mode": (("prime_mover", "mode"), ("prime mover", "mode")),
    "travel": ((), ()),
    "travel_drive": (("drive",), ("drive",)),
    "travel_duty_point": (("drive", "duty"), ("drive", "duty point")),
}


@dataclass(frozen=True)
class Owner:
    """What computed values belong to: a drive's duty point, a supply in a mode, a drive, a supply,
    a mode, or the fluid."""

    scope: str  # a key of SCOPES
    ids: tuple[str, ...] = ()

    @property
    def first(self) -> str | None:
        return self.ids[0] if self.ids else None

    @property
    def text(self) -> str:
        words = SCOPES[self.scope][1]
        return ", ".join(f"{w} {i}" for w, i in zip(words, self.ids)) or self.scope

    def where(self) -> dict:
        return dict(zip(SCOPES[self.scope][0], self.ids))


@dataclass(frozen=True)
class ValueChange:
    """A computed value that moved, appeared or disappeared. ``old``/``new`` are SI floats."""

    owner: Owner
    key: str
    label: str
    kind: str
    change: str  # changed, added or removed
    old: float | None
    new: float | None

    @property
    def delta(self) -> float | None:
        return None if self.old is None or self.new is None else self.new - self.old

    @property
    def percent(self) -> float | None:
        """(new - old) / |old| * 100; None when old is zero or missing."""
        if self.delta is None or self.old == 0:
            return None
        return self.delta / abs(self.old) * 100.0


@dataclass(frozen=True)
class CheckChange:
    """A check whose status or value changed, or that exists on one side only.

    ``change``: worse, better, moved (same status, value moved or found at another operating
    corner), added or removed.
    """

    id: str
    title: str
    where: dict
    change: str
    old_status: str | None
    new_status: str | None
    kind: str
    old_value: float | None
    new_value: float | None
    limit: float | None
    message: str
    old_corner: str | None = None  # the operating corner the check was reported at (None: nominal)
    new_corner: str | None = None

    @property
    def where_text(self) -> str:
        names = {"drive": "drive", "duty": "duty point", "supply": "supply", "mode": "mode",
                 "prime_mover": "prime mover"}
        return ", ".join(f"{names[k]} {v}" for k, v in self.where.items() if v)

    @property
    def regression(self) -> str | None:
        """The status a regression reached ("warn" or "fail"), else None."""
        if self.change in ("worse", "added") and self.new_status in ("warn", "fail"):
            return self.new_status
        return None


@dataclass(frozen=True)
class Side:
    name: str
    machine_id: str
    title: str
    revision: str
    verdict: str
    counts: dict


@dataclass(frozen=True)
class Diff:
    old: Side
    new: Side
    display_units: str
    inputs: tuple[InputChange, ...]
    owners: tuple[tuple[Owner, str], ...]  # result items on one side only: (owner, "added"|"removed")
    values: tuple[ValueChange, ...]
    checks: tuple[CheckChange, ...]
    still_failing: tuple[CheckChange, ...]  # failing on both sides, unchanged: never left unsaid

    @property
    def input_changes(self) -> tuple[InputChange, ...]:
        return tuple(c for c in self.inputs if c.change != "respelled")

    @property
    def respelled(self) -> tuple[InputChange, ...]:
        return tuple(c for c in self.inputs if c.change == "respelled")

    def regressions(self, at: str = "warn") -> tuple[CheckChange, ...]:
        """Checks that got worse and now stand at ``at`` or beyond ("warn" counts fail too)."""
        return tuple(c for c in self.checks if c.regression and RANK[c.regression] >= RANK[at])


def _close(a: float, b: float, tolerance: float) -> bool:
    return math.isclose(a, b, rel_tol=tolerance, abs_tol=ABSOLUTE_FLOOR)


def _same_number(a, b) -> bool:
    numbers = all(isinstance(x, (int, float)) and not isinstance(x, bool) for x in (a, b))
    return numbers and _close(float(a), float(b), INPUT_TOLERANCE)


def diff_inputs(old: dict, new: dict) -> list[InputChange]:
    """Every field added, removed or changed between two loaded specs, in the new spec's order."""
    old_info, new_info = fields(old), fields(new)
    out: list[InputChange] = []

    def leaf(path, a, b):
        info = new_info.get(path, Field())
        kind = info.kind or old_info.get(path, Field()).kind
        sa, sb = si_value(a, kind), si_value(b, kind)
        if kind is None and info.quantity and a != b and (shared := common_kind(a, b)):
            kind, sa, sb = shared
        if sa is not None and sb is not None:
            if _close(sa, sb, INPUT_TOLERANCE):
                if a != b:
                    out.append(InputChange(path, "respelled", a, b, kind, old_si=sa, new_si=sb))
                return
            out.append(InputChange(path, "changed", a, b, kind, old_si=sa, new_si=sb))
        elif a != b and not _same_number(a, b):
            out.append(InputChange(path, "changed", plain_data(a), plain_data(b), kind))

    def walk(path, a, b):
        if isinstance(a, dict) and isinstance(b, dict):
            for k in b:
                if k in a:
                    walk(path + (k,), a[k], b[k])
                else:
                    out.append(InputChange(path + (k,), "added", None, plain_data(b[k]),
                                           noun=new_info[path + (k,)].noun))
            for k in a:
                if k not in b:
                    out.append(InputChange(path + (k,), "removed", plain_data(a[k]), None,
                                           noun=old_info[path + (k,)].noun))
        elif isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
            for i, (x, y) in enumerate(zip(a, b)):
                walk(path + (i,), x, y)
        elif isinstance(a, (dict, list)) or isinstance(b, (dict, list)):
            if plain_data(a) != plain_data(b):
                out.append(InputChange(path, "changed", plain_data(a), plain_data(b)))
        else:
            leaf(path, a, b)

    walk((), old, new)
    return out


def _result_items(outcome: Outcome) -> dict[Owner, dict]:
    """Every group of computed values, by owner, in the order the results hold them."""
    r = outcome.results
    items = {Owner("duty_point", (d.drive, d.duty)): d.values for d in r.duties}
    for s in r.supply_modes:
        items[Owner("supply_mode", (s.supply, s.mode))] = s.values
        items.update({Owner("supply_mode_drive", (s.supply, s.mode, d)): v for d, v in s.per_drive.items()})
    items.update({Owner("drive", (d.drive,)): d.values for d in getattr(r, "drives", ()) if d.values})
    items.update({Owner("supply", (s.supply,)): s.values for s in getattr(r, "supplies", ()) if s.values})
    items.update({Owner("mode", (m.mode,)): m.values for m in getattr(r, "modes", ()) if m.values})
    if r.fluid.values:
        items[Owner("fluid")] = r.fluid.values
    items.update({Owner("prime_mover_mode", (x.prime_mover, x.mode)): x.values for x in r.prime_movers})
    if getattr(r, "travel", None) is not None:
        items[Owner("travel")] = r.travel.values
        items.update({Owner("travel_drive", (d,)): v for d, v in r.travel.per_drive.items()})
        items.update({Owner("travel_duty_point", key): v for key, v in r.travel.duties.items()})
    return items


def diff_results(old: Outcome, new: Outcome) -> tuple[list[tuple[Owner, str]], list[ValueChange]]:
    """Result items on one side only, and every computed value that moved beyond the tolerance."""
    a, b = _result_items(old), _result_items(new)
    owners = [(o, "added") for o in b if o not in a] + [(o, "removed") for o in a if o not in b]
    values = []
    for owner, new_values in b.items():
        if owner not in a:
            continue
        old_values = a[owner]
        for key, v in new_values.items():
            if key not in old_values:
                values.append(ValueChange(owner, key, v.label, v.kind, "added", None, v.value))
            elif not _close(old_values[key].value, v.value, RESULT_TOLERANCE):
                values.append(ValueChange(owner, key, v.label, v.kind, "changed", old_values[key].value, v.value))
        for key, v in old_values.items():
            if key not in new_values:
                values.append(ValueChange(owner, key, v.label, v.kind, "removed", v.value, None))
    return owners, values


def _check_keys(outcome: Outcome) -> dict[tuple, object]:
    """Checks by (id, drive, duty, supply, mode, prime mover); a repeat of the same key gets its ordinal."""
    out, seen = {}, {}
    for c in outcome.results.checks:
        base = (c.id, c.drive, c.duty, c.supply, c.mode, c.prime_mover)
        n = seen.get(base, 0)
        seen[base] = n + 1
        out[base + (n,)] = c
    return out


def _record(c_old, c_new, change: str) -> CheckChange:
    ref = c_new or c_old
    corners = (c_old.corner if c_old else None, c_new.corner if c_new else None)
    message = ref.message
    if c_old and c_new and corners[0] != corners[1]:  # the worst case is found at another corner: say so
        old, new = (f"corner {k}" if k else "the nominal point" for k in corners)
        message = f"Worst at {new} (was {old}): {message}"
    return CheckChange(
        id=ref.id, title=ref.title,
        where={"drive": ref.drive, "duty": ref.duty, "supply": ref.supply,
               **({"prime_mover": ref.prime_mover} if ref.prime_mover else {}), "mode": ref.mode},
        change=change, old_status=c_old.status if c_old else None, new_status=c_new.status if c_new else None,
        kind=ref.kind, old_value=c_old.value if c_old else None, new_value=c_new.value if c_new else None,
        limit=ref.limit, message=message,
        old_corner=c_old.corner if c_old else None, new_corner=c_new.corner if c_new else None,
    )


def _rank(c: CheckChange) -> tuple:
    order = {"worse": 0, "added": 1, "better": 2, "removed": 3, "moved": 4}
    regression_first = 0 if c.regression else 1
    return (regression_first, -RANK.get(c.new_status or "pass", 0) if c.regression else 0, order[c.change])


def diff_checks(old: Outcome, new: Outcome) -> tuple[list[CheckChange], list[CheckChange]]:
    """Check changes, regressions first (worst first), and the checks failing unchanged on both sides."""
    a, b = _check_keys(old), _check_keys(new)
    changes, still = [], []
    for key, cn in b.items():
        co = a.get(key)
        if co is None:
            changes.append(_record(None, cn, "added"))
        elif RANK[cn.status] != RANK[co.status]:
            changes.append(_record(co, cn, "worse" if RANK[cn.status] > RANK[co.status] else "better"))
        elif co.corner != cn.corner:  # the same status found at another corner: the worst case moved
            changes.append(_record(co, cn, "moved"))
        elif (co.value is None) != (cn.value is None) or (
                co.value is not None and not _close(co.value, cn.value, RESULT_TOLERANCE)):
            changes.append(_record(co, cn, "moved"))
        elif cn.status == "fail":
            still.append(_record(co, cn, "unchanged"))
    changes += [_record(co, None, "removed") for key, co in a.items() if key not in b]
    changes.sort(key=_rank)  # stable: within a rank, the new spec's check order
    return changes, still


def _side(o: Outcome) -> Side:
    m = o.machine
    return Side(o.source.name, m.id, m.title, m.revision, o.results.verdict, o.results.counts())


def compare(old: Outcome, new: Outcome) -> Diff:
    """The whole difference from ``old`` to ``new``; values are shown in the new spec's units."""
    owners, values = diff_results(old, new)
    checks, still = diff_checks(old, new)
    return Diff(
        old=_side(old), new=_side(new), display_units=new.machine.display_units,
        inputs=tuple(diff_inputs(old.source.data, new.source.data)),
        owners=tuple(owners), values=tuple(values), checks=tuple(checks), still_failing=tuple(still),
    )
