"""Review records bound to a spec's content: who reviewed which content, when, and the verdict.

The record file sits beside the spec: ``loader.yaml`` -> ``loader.reviews.yaml`` (``reviews_path``).
It is YAML, written by ``specgen review`` and meant to be committed with the spec::

    review_format: 1
    spec: loader.yaml
    reviews:
    - name: A. Checker
      role: checking engineer
      date: '2025-03-14'
      verdict: approved
      fingerprint: 3f1c...e9    # content fingerprint, 64 hex digits
      machine_revision: C
      remarks: ''

Records are only ever appended: the file is rewritten atomically as its old bytes unchanged plus
the new record, and the result is read back to prove every earlier record survived.

Content fingerprint (``content_fingerprint``), review_format 1: the sha256, in hex, of the UTF-8
bytes of ``json.dumps(N, sort_keys=True, separators=(",", ":"), ensure_ascii=False)`` where N is
the loaded spec with every quantity field converted to its SI float and every plain number made a
float, both rounded to 12 significant figures (``spec.content.normalised``). Comments, layout, key
order, quoting and unit spelling of an equal value ("250 bar", "25 MPa", "25000 kPa") do not
change it; any changed value, text, added or removed key does. "3626 psi" is 250.003 bar: a
different value, so a different fingerprint, which errs on the side of asking for a new review.
A spec that names sizing parts files hashes {"spec": N, "parts_files": {name: loaded data}}
instead, so a change to the shop's stock list asks for a new review too.

A record may instead accept one warning (a disposition), with the optional ``warning`` key::

    - name: A. Checker
      role: checking engineer
      date: '2025-03-14'
      verdict: accepted_warning
      fingerprint: 3f1c...e9          # the content the warning was accepted on
      machine_revision: C
      remarks: ''
      warning:
        check: pressure_margin         # the check's id
        where: drive track_left, duty point climb   # the check's ``where``
        value: 0.061237               # the check's value then (SI), to see when it moves
        reason: bank climb is a short transient; compensator kept at 270 bar

It is bound to the check id, where the check applies and the content fingerprint: when the spec's
content or the check's value has changed since, the acceptance is stale and shown so. Only a
warning can be accepted; a failing check cannot. A disposition never changes the review state of
the spec (``status``) and never hides the warning: the outputs show both.

This records a review; it is not a signature.
"""

from __future__ import annotations

import hashlib
import json
import os
from dataclasses import asdict, dataclass
from pathlib import Path

import yaml

from specgen.dates import date_or_today
from specgen.errors import Location, Problem, SpecError
from specgen.output import write_atomic
from specgen.intake.content import normalised
from specgen.intake.read import Source, load_file, load_text

REVIEWS_SUFFIX = ".reviews.yaml"
REVIEW_FORMAT = 1
VERDICTS = ("approved", "approved_with_remarks", "rejected")
ACCEPTING = ("approved", "approved_with_remarks")
ACCEPTED_WARNING = "accepted_warning"  # the verdict of a record that carries a ``warning``
FIELDS = ("name", "role", "date", "verdict", "fingerprint", "machine_revision", "remarks")
OPTIONAL = ("warning",)
WARNING_FIELDS = ("check", "where", "value", "reason")
VALUE_TOLERANCE = 1e-9  # relative: a value that moved less than this has not changed
MAX_NAME = 200
MAX_REMARKS = 5000


@dataclass(frozen=True)
class Review:
    name: str
    role: str
    date: str  # ISO 8601 calendar date, e.g. 2025-03-14
    verdict: str
    fingerprint: str
    machine_revision: str = ""
    remarks: str = ""
    warning: dict | None = None  # a disposition: check, where, value (SI float or None), reason

    @property
    def short(self) -> str:
        return self.fingerprint[:12]

    @property
    def is_disposition(self) -> bool:
        return self.warning is not None

    @property
    def who(self) -> str:
        return f"{self.name} ({self.role})"


def reviews_path(spec_path: str | Path) -> Path:
    """``specs/loader.yaml`` -> ``specs/loader.reviews.yaml`` (same folder, same stem)."""
    p = Path(spec_path)
    return p.with_name(p.stem + REVIEWS_SUFFIX)


def is_reviews_file(path: str | Path) -> bool:
    return str(path).endswith(REVIEWS_SUFFIX)


def content_fingerprint(data: dict, parts: dict | None = None) -> str:
    """sha256 hex of the spec's normalised content (see the module text for the exact rule).

    ``parts``: the loaded data of the parts files the spec names, by the name it gives them; a
    spec that names none hashes exactly as its content alone.
    """
    body = normalised(data) if not parts else {"spec": normalised(data), "parts_files": parts}
    text = json.dumps(body, sort_keys=True, separators=(",", ":"), ensure_ascii=False)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def named_parts_files(source: Source) -> dict:
    """The loaded data of every sizing parts file ``source`` names, so changing stock needs a review.

    Read only after the spec was built, which has already refused files outside its folder tree.
    """
    from specgen.intake.build_sizing import resolve_inside

    sizing = source.data.get("sizing")
    name = sizing.get("parts_file") if isinstance(sizing, dict) else None
    if not isinstance(name, str):
        return {}
    target, _ = resolve_inside(source.name, name, allow_outside=True)
    return {name: json.loads(json.dumps(load_file(target).data))} if target.is_file() else {}


def spec_fingerprint(source: Source) -> str:
    """The review fingerprint of a loaded spec: its content and the parts files it names."""
    return content_fingerprint(source.data, named_parts_files(source))


def review_date(given: str | None = None, environ=os.environ) -> str:
    """The date a review is recorded under: ``given`` (specgen/dates.py), else SOURCE_DATE_EPOCH (UTC), else today."""
    return date_or_today(given, environ)


def _parse(source: Source) -> list[Review]:
    d = source.data
    problems = []

    def bad(path: tuple, message: str) -> None:
        problems.append(Problem(source.location(path), ".".join(map(str, path)), message))

    if d.get("review_format") != REVIEW_FORMAT:
        bad(("review_format",), f"this version of specgen reads review_format {REVIEW_FORMAT}")
    entries = d.get("reviews")
    if not isinstance(entries, list):
        bad(("reviews",), "should be a list of review records")
        raise SpecError(problems)
    out = []
    for i, e in enumerate(entries):
        if not isinstance(e, dict):
            bad(("reviews", i), "a review record is a mapping of name, role, date, verdict, fingerprint")
            continue
        for key in set(e) - set(FIELDS) - set(OPTIONAL):
            bad(("reviews", i, key), f"unknown key '{key}' (allowed: {', '.join(FIELDS + OPTIONAL)})")
        for key in FIELDS[:5]:
            if key not in e:
                bad(("reviews", i), f"'{key}' is required")
        warning = _parse_warning(e.get("warning"), ("reviews", i, "warning"), bad) if "warning" in e else None
        allowed = (ACCEPTED_WARNING,) if "warning" in e else VERDICTS
        if e.get("verdict") is not None and e.get("verdict") not in allowed:
            bad(("reviews", i, "verdict"), f"{e['verdict']!r} is not one of: {', '.join(allowed)}")
        if not problems:
            out.append(Review(**{k: str(e.get(k, "") or "") for k in FIELDS}, warning=warning))
    if problems:
        raise SpecError(problems)
    return out


def _parse_warning(w, path: tuple, bad) -> dict | None:
    """The ``warning`` of a disposition record: check and where (text), value (a number or null), reason."""
    if not isinstance(w, dict):
        bad(path, "a warning disposition is a mapping of check, where, value, reason")
        return None
    for key in set(w) - set(WARNING_FIELDS):
        bad(path + (key,), f"unknown key '{key}' (allowed: {', '.join(WARNING_FIELDS)})")
    for key in ("check", "where", "reason"):
        if not isinstance(w.get(key), str) or (key != "where" and not w.get(key).strip()):
            bad(path + (key,), "should be text" + ("" if key == "where" else " (not empty)"))
    value = w.get("value")
    if value is not None and (isinstance(value, bool) or not isinstance(value, (int, float))):
        bad(path + ("value",), "should be a number or null")
    return {"check": str(w.get("check", "")), "where": str(w.get("where", "")),
            "value": None if value is None or isinstance(value, bool) else float(value),
            "reason": str(w.get("reason", "")).strip()}


def read_reviews(path: str | Path) -> list[Review]:
    """Every record in a reviews file, oldest first; [] when there is no file."""
    source = _load_reviews(path)
    return _parse(source) if source is not None else []


def _load_reviews(path: str | Path) -> Source | None:
    """The reviews file as loaded, with the limits of a spec (a regular file of at most
    read.MAX_BYTES, inside the spec's folder tree); None when there is no file."""
    p = Path(path)
    if not os.path.lexists(p):
        return None
    return load_file(p, inside=p.parent)


def _one_line(label: str, text: str, limit: int) -> str:
    text = text.strip()
    if not text or "\n" in text or len(text) > limit:
        raise SpecError([Problem(Location(label), "", f"give one line of at most {limit} characters")])
    return text


def append_review(spec_path: str | Path, source: Source, machine_revision: str, name: str, role: str,
                  verdict: str, remarks: str = "", when: str | None = None) -> Review:
    """Add a record for the spec's current content to its reviews file and return it."""
    if verdict not in VERDICTS:
        raise SpecError([Problem(Location("--verdict"), "", f"{verdict!r} is not one of: {', '.join(VERDICTS)}")])
    if len(remarks) > MAX_REMARKS:
        raise SpecError([Problem(Location("--remarks"), "", f"remarks are limited to {MAX_REMARKS} characters")])
    record = Review(name=_one_line("--by", name, MAX_NAME), role=_one_line("--role", role, MAX_NAME),
                    date=review_date(when), verdict=verdict, fingerprint=spec_fingerprint(source),
                    machine_revision=machine_revision, remarks=remarks.strip())
    _append(spec_path, record)
    return record


def _append(spec_path: str | Path, record: Review) -> None:
    """Append ``record`` to the spec's reviews file, keeping every earlier byte and record."""
    target = reviews_path(spec_path)
    loaded = _load_reviews(target)
    old = _parse(loaded) if loaded is not None else []
    head = loaded.raw if loaded is not None else _header(Path(spec_path).name)
    if head and not head.endswith(b"\n"):
        head += b"\n"
    fields = {k: v for k, v in asdict(record).items() if k in FIELDS or v is not None}
    entry = yaml.safe_dump([fields], sort_keys=False, allow_unicode=True, default_flow_style=False)
    raw = head + entry.encode("utf-8")
    if _parse(load_text(raw, str(target))) != old + [record]:
        raise SpecError([Problem(Location(str(target)), "", "the file does not end with its 'reviews' list; "
                                 "the new record cannot be appended without rewriting it")])
    write_atomic(target, raw)


def _header(spec_name: str) -> bytes:
    return (
        f"# Review record for {spec_name}, kept by `specgen review`: one entry per review, oldest first.\n"
        "# fingerprint: sha256 of the spec's normalised content (quantities in SI, keys sorted), so\n"
        "# reformatting the spec keeps it and any changed value changes it. Append with `specgen review`;\n"
        "# do not edit or remove earlier entries. A record of a review, not a signature.\n"
        f"review_format: {REVIEW_FORMAT}\n"
        f"spec: {json.dumps(spec_name)}\n"
        "reviews:\n"
    ).encode("utf-8")


@dataclass(frozen=True)
class ReviewStatus:
    """Whether the spec's current content is covered by a review.

    ``state``: "reviewed" (the latest record for this content accepts it), "rejected" (the latest
    record for this content rejects it), "changed" (records exist, none for this content) or
    "unreviewed" (no record at all).
    """

    state: str
    fingerprint: str | None  # of the current content; None when no review is recorded (nothing to match)
    file: str
    matching: Review | None  # latest record for the current content
    last: Review | None  # latest record of all
    accepted: tuple = ()  # Disposition of each warning accepted in the record

    @property
    def covered(self) -> bool:
        return self.state == "reviewed"

    @property
    def text(self) -> str:
        m, last = self.matching, self.last
        if self.state == "reviewed":
            return f"reviewed: {m.verdict.replace('_', ' ')} by {m.who} on {m.date} (fingerprint {m.short})"
        if self.state == "rejected":
            return f"rejected by {m.who} on {m.date} (fingerprint {m.short}); revise the spec and have it reviewed again"
        if self.state == "changed":
            return (f"changed since the last review ({last.verdict.replace('_', ' ')} by {last.who} on {last.date}, "
                    f"fingerprint {last.short}; now {self.fingerprint[:12]})")
        return f"no review recorded (specgen review writes one to {self.file})"

    @property
    def disposition_lines(self) -> list[str]:
        """One line a warning accepted in the record (and whether the acceptance still holds)."""
        return [d.text for d in self.accepted]

    def as_dict(self) -> dict:
        out = {"state": self.state, "covered": self.covered, "fingerprint": self.fingerprint, "file": self.file,
               "matching": _record_dict(self.matching), "last": _record_dict(self.last), "text": self.text}
        if self.accepted:  # only where warnings were accepted: outputs without them stay as they were
            out["dispositions"] = [d.as_dict() for d in self.accepted]
        return out


def _record_dict(r: Review | None) -> dict | None:
    return None if r is None else {k: v for k, v in asdict(r).items() if k in FIELDS or v is not None}


def status(spec_path: str | Path, source: Source, checks: list | None = None) -> ReviewStatus:
    """The review state of ``source`` (the loaded spec at ``spec_path``); with ``checks`` (the
    outcome's), the warnings accepted in the record too. Accepted warnings do not count as reviews."""
    target = reviews_path(spec_path)
    records = read_reviews(target)
    if not records:  # nothing to match: spare a large spec the second parse of every quantity
        return ReviewStatus("unreviewed", None, str(target), None, None)
    from specgen.dispositions import dispositions  # the record's accepted warnings, against the checks

    current = spec_fingerprint(source)
    accepted = tuple(dispositions(records, current, checks or []))
    records = [r for r in records if not r.is_disposition]
    if not records:
        return ReviewStatus("unreviewed", current, str(target), None, None, accepted)
    matching = next((r for r in reversed(records) if r.fingerprint == current), None)
    last = records[-1]
    state = ("reviewed" if matching.verdict in ACCEPTING else "rejected") if matching else "changed"
    return ReviewStatus(state, current, str(target), matching, last, accepted)


def reviews_for_report(spec_path: str | Path, source: Source) -> list[dict]:
    """Every recorded review for the report's sign-off block, oldest first, marked against the content.

    Each: name, role, date, verdict, remarks, fingerprint, matches_current (bool).
    """
    current = spec_fingerprint(source)
    return [{"name": r.name, "role": r.role, "date": r.date, "verdict": r.verdict, "remarks": r.remarks,
             "fingerprint": r.fingerprint, "matches_current": r.fingerprint == current}
            for r in read_reviews(reviews_path(spec_path)) if not r.is_disposition]
