"""Warnings accepted in a spec's review record, and whether each acceptance still holds.

A reviewer may accept a warning (never a failure) with a reason: ``specgen review SPEC --by NAME
--role ROLE --accept-warning CHECK [--where WHERE] --reason TEXT`` appends a record with the
optional ``warning`` key (review.py shows the format) bound to the check's id, where it applies
(the check's ``where``), its value then, and the content fingerprint. Each time the spec is checked
the acceptance is set against the current checks: it holds while the content fingerprint and the
check's value are those it was accepted on, and is stale, saying why, as soon as either moved.

Example: accepted on content 0f8a800aa3d3 at a pressure margin of 6.124 %; the compensator is then
set 1 bar higher: the content fingerprint and the margin both change, so the acceptance is shown
stale beside the warning, which stays a warning throughout.
"""

from __future__ import annotations

from dataclasses import asdict, dataclass
from pathlib import Path

from specgen.errors import Location, Problem, SpecError
from specgen.intake.read import Source
from specgen.review import (ACCEPTED_WARNING, MAX_NAME, MAX_REMARKS, VALUE_TOLERANCE, Review, _append, _one_line,
                            review_date, spec_fingerprint)


def _same_value(a: float | None, b: float | None) -> bool:
    if a is None or b is None:
        return a is None and b is None
    return abs(a - b) <= VALUE_TOLERANCE * max(abs(a), abs(b), 1e-300)


def append_disposition(spec_path: str | Path, source: Source, machine_revision: str, checks: list, name: str,
                       role: str, check_id: str, where: str | None, reason: str, when: str | None = None) -> Review:
    """Record that ``name`` accepts the warning of check ``check_id`` (at ``where``) for the current
    content, with ``reason``. Refused (SpecError, exit 2) when no check of that id warns there, when
    it fails (a failure cannot be accepted), or when ``where`` is needed to tell two apart."""
    label = "--accept-warning"
    same_id = [c for c in checks if c.id == check_id]
    if not same_id:
        known = sorted({c.id for c in checks if c.status == "warn"})
        raise SpecError([Problem(Location(label), "", f"no check '{check_id}' in this spec (warning now: "
                                 f"{', '.join(known) or 'none'})")])
    here = [c for c in same_id if where is None or c.where == where]
    if not here:
        raise SpecError([Problem(Location("--where"), "", f"check '{check_id}' does not apply at '{where}' "
                                 f"(it applies at: {'; '.join(c.where or 'whole machine' for c in same_id)})")])
    failing = [c for c in here if c.status == "fail"]
    warning = [c for c in here if c.status == "warn"]
    if failing and not warning:
        c = failing[0]
        raise SpecError([Problem(Location(label), "", f"check '{check_id}' ({c.where or 'whole machine'}) fails; a "
                                 "failing check cannot be accepted: change the design until it passes or warns")])
    if not warning:
        raise SpecError([Problem(Location(label), "", f"check '{check_id}' passes there: there is no warning to accept")])
    if len(warning) > 1:
        raise SpecError([Problem(Location("--where"), "", f"check '{check_id}' warns at several places; name one "
                                 f"with --where: {'; '.join(c.where for c in warning)}")])
    c = warning[0]
    record = Review(name=_one_line("--by", name, MAX_NAME), role=_one_line("--role", role, MAX_NAME),
                    date=review_date(when), verdict=ACCEPTED_WARNING, fingerprint=spec_fingerprint(source),
                    machine_revision=machine_revision, remarks="",
                    warning={"check": c.id, "where": c.where, "value": c.value,
                             "reason": _one_line("--reason", reason, MAX_REMARKS)})
    _append(spec_path, record)
    return record


@dataclass(frozen=True)
class Disposition:
    """A warning accepted in the review record, as it stands for the current content and results.

    ``stale``: "" while the content fingerprint and the check's value are those it was accepted on;
    otherwise why not (the spec changed, the value moved)."""

    check: str
    where: str
    name: str
    role: str
    date: str
    reason: str
    fingerprint: str
    value_then: float | None
    value_now: float | None
    stale: str

    @property
    def text(self) -> str:
        place = f"{self.check} ({self.where})" if self.where else self.check
        head = f"warning {place} accepted by {self.name} ({self.role}) on {self.date}: {self.reason}"
        return head + (f" [STALE: {self.stale}; accept it again or change the design]" if self.stale else "")

    def as_dict(self) -> dict:
        return {**asdict(self), "accepted": not self.stale}


def dispositions(records: list[Review], current: str, checks: list) -> list[Disposition]:
    """The latest acceptance of each warning that warns now, in the order of the checks, marked stale
    when the content fingerprint or the check's value differs from the accepted ones."""
    latest: dict[tuple[str, str], Review] = {}
    for r in records:
        if r.is_disposition:
            latest[(r.warning["check"], r.warning["where"])] = r
    out = []
    for c in checks:
        r = latest.get((c.id, c.where))
        if c.status != "warn" or r is None:
            continue
        why = []
        if r.fingerprint != current:
            why.append(f"the spec's content changed (content fingerprint {r.short} then, {current[:12]} now)")
        if not _same_value(r.warning["value"], c.value):
            why.append("the check's value moved")
        out.append(Disposition(c.id, c.where, r.name, r.role, r.date, r.warning["reason"], r.fingerprint,
                               r.warning["value"], c.value, "; ".join(why)))
    return out
