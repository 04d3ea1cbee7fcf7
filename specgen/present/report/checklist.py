"""The checks as the report shows them: each check's row (value, limit, margin, where it links to,
an accepted warning beside it), the passing checks by check id, and page 1's figures (the smallest
margin, the number of assumed values, the review state with the content fingerprint).
"""

from __future__ import annotations

import math

from specgen.pipeline import Outcome
from specgen.present.report.values import STATUS_WORD, show, slug, typeset
from specgen.present.report.prime_movers import anchor as prime_mover_anchor
from specgen.results import Check


def review_context(o: Outcome, review) -> dict:
    """The review state for page 1, and the content fingerprint the review records are bound to."""
    from specgen.review import spec_fingerprint

    content = review.fingerprint if review is not None and review.fingerprint else spec_fingerprint(o.source)
    accepted = list(review.accepted) if review is not None else []
    return {"state": review.state if review is not None else "unknown",
            "text": review.text if review is not None else "not looked up (no review record was read)",
            "content": content, "content_short": content[:12],
            "accepted": len([d for d in accepted if not d.stale]), "stale": len([d for d in accepted if d.stale])}


def key_facts(o: Outcome, checks: list[dict], system: str) -> dict:
    """Page 1's figures: how many values were assumed, and the smallest margin of any check."""
    with_margin = [c for c in checks if c["margin"] is not None and math.isfinite(c["margin"])]
    smallest = min(with_margin, key=lambda c: (c["margin"], c["n"])) if with_margin else None
    return {"assumed": len(o.results.assumed()), "smallest": smallest}


def _disposition(d) -> dict:
    return {"name": d.name, "role": d.role, "date": d.date, "reason": d.reason, "stale": d.stale,
            "fingerprint": d.fingerprint[:12]}


def check_rows(o: Outcome, system: str, review=None) -> list[dict]:
    accepted = {(d.check, d.where): _disposition(d) for d in (review.accepted if review is not None else ())}
    out = []
    for n, c in enumerate(o.results.checks, start=1):
        symbol = ""  # a ratio in a check is a margin or threshold: shown in percent
        out.append({
            "n": n, "anchor": f"check-{n}", "id": c.id, "title": c.title, "status": c.status,
            "status_word": STATUS_WORD[c.status], "where": c.where or "whole machine",
            "value": show(c.value, c.kind, system, symbol), "limit": show(c.limit, c.kind, system, symbol),
            "message": typeset(c.message), "target": _check_target(c), "corner": c.corner,
            "where_short": ", ".join(x for x in (c.duty, c.mode) if x), "margin": c.margin,
            "where_compact": " / ".join(x for x in (c.drive, c.supply, c.cycle, c.duty, c.mode) if x) or "machine",
            "margin_text": _margin_text(c.margin, system),
            "disposition": accepted.get((c.id, c.where)) if c.status == "warn" else None,
        })
    return out


def _margin_text(margin: float | None, system: str) -> str:
    """A margin in percent; one against a limit of nothing (no load at rest) has no finite size."""
    if margin is None:
        return "-"
    return show(margin, "ratio", system) if math.isfinite(margin) else "unbounded"


def passing_groups(checks: list[dict]) -> list[dict]:
    """The passing checks by check id, in the order run: each id once, with every place it was
    judged, its margin there, and the smallest of them."""
    groups: dict[str, dict] = {}
    for c in checks:
        if c["status"] != "pass":
            continue
        g = groups.setdefault(c["id"], {"id": c["id"], "title": c["title"], "items": []})
        g["items"].append(c)
    for g in groups.values():
        with_margin = [c for c in g["items"] if c["margin"] is not None and math.isfinite(c["margin"])]
        g["smallest"] = min(with_margin, key=lambda c: (c["margin"], c["n"])) if with_margin else None
    return list(groups.values())


def _check_target(c: Check) -> str:
    if c.prime_mover:
        return prime_mover_anchor(c.prime_mover, c.mode)
    if c.drive and c.duty:
        return f"duty-{slug(c.drive)}-{slug(c.duty)}"
    if c.drive:
        return f"drive-{slug(c.drive)}"
    if c.supply and c.mode:
        return f"mode-{slug(c.supply)}-{slug(c.mode)}"
    if c.supply:
        return f"supply-{slug(c.supply)}"
    if c.mode:
        return f"mode-{slug(c.mode)}"
    if c.cycle:
        return f"cycle-{slug(c.cycle)}"
    return "checklist"
