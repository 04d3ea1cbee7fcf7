"""Machine-readable output: every number with its unit, every check with where it applies."""

from __future__ import annotations

import hashlib
import json
import math

from specgen import __version__
from specgen.cautions import CAUTIONS
from specgen.pipeline import Outcome
from specgen.present.travel_out import travel_document
from specgen.units import convert
from specgen.trace import Value
from specgen.units import KINDS

OUTPUT_FORMAT = 1


def _value(v: Value, system: str) -> dict:
    number, unit = convert(v.value, v.kind, system)
    return {"label": v.label, "value": number, "unit": unit, "si_value": v.value,
            "si_unit": KINDS[v.kind].si_unit.replace("**", "^"), "assumed": v.assumed}


def assumed_list(results, system: str) -> list[dict]:
    """Every assumed input the results rest on (Results.assumed), once each: its spec path, its
    value (a ratio as a plain number, anything else in the display units, with "unit") and basis."""
    out = []
    for i in results.assumed():
        item = {"where": ".".join(i.where), "value": i.value, "basis": i.basis}
        if i.kind not in ("ratio", "number"):
            item["value"], item["unit"] = convert(i.value, i.kind, system)
        out.append(item)
    return out


def _margin(m: float | None) -> float | None:
    """JSON has no infinity: a margin without a finite value (a need of zero) is written as null."""
    return m if m is not None and math.isfinite(m) else None


def _limit(x: float | None, kind: str, system: str) -> dict | None:
    if x is None:
        return None
    if not kind:
        return {"value": x, "unit": ""}
    number, unit = convert(x, kind, system)
    return {"value": number, "unit": unit}


def _check(c, system: str, with_corner: bool) -> dict:
    """One check; ``with_corner``: the spec names corners, so say where the check was found (null:
    the nominal point). A spec without corners writes no such key."""
    out = {"id": c.id, "title": c.title, "status": c.status,
           "value": _limit(c.value, c.kind, system), "limit": _limit(c.limit, c.kind, system),
           "margin": _margin(c.margin), "message": c.message,
           "where": {"drive": c.drive, "duty": c.duty, "supply": c.supply, "mode": c.mode,
                     **({"cycle": c.cycle} if c.cycle else {}),
                     **({"prime_mover": c.prime_mover} if c.prime_mover else {})}}
    if with_corner:
        out["corner"] = c.corner
    return out


def _corner(k, system: str) -> dict:
    """One operating corner: what it moves, its verdict and every check at it."""
    return {"id": k.id, "title": k.title, "modes": list(k.modes),
            "overrides": [{"path": path, "value": value} for path, value in k.overrides],
            "assumed": k.assumed, "basis": k.basis, "verdict": k.verdict, "counts": k.counts(),
            "checks": [_check(c, system, False) for c in k.checks]}


def _cycle(c, system: str) -> dict:
    """A duty cycle's values; mean prime-mover power per supply; time share above the continuous pressure
    rating per drive; the oil-temperature series as [seconds, temperature in display units]."""
    return {"cycle": c.cycle, "values": {k: _value(v, system) for k, v in c.values.items()},
            "mean_prime_mover_power": {s: dict(zip(("value", "unit"), convert(p, "power", system)))
                                       for s, p in c.per_supply.items()},
            "share_above_continuous_pressure": dict(c.above_continuous),
            "oil_temperature_series": [[t, convert(x, "temperature", system)[0]] for t, x in c.series],
            "settled": c.settled, "missing": c.missing}


def _prime_mover(x, system: str) -> dict:
    """A shared prime mover in one mode: its own values and, by supply id, each pump's on it."""
    return {"prime_mover": x.prime_mover, "mode": x.mode, "speed_name": x.speed_name,
            "values": {k: _value(v, system) for k, v in x.values.items()},
            "per_supply": {s: {k: _value(v, system) for k, v in vals.items()} for s, vals in x.per_supply.items()}}


def document(o: Outcome, review=None) -> dict:
    """``review``: the spec's review.ReviewStatus; its as_dict() goes under "review" when given."""
    system = o.machine.display_units
    r = o.results
    return {
        "specgen": __version__,
        "output_format": OUTPUT_FORMAT,
        "spec": {"file": o.source.name, "sha256": hashlib.sha256(o.source.raw).hexdigest()},
        "machine": {"id": o.machine.id, "title": o.machine.title, "revision": o.machine.revision,
                    "display_units": system},
        "verdict": r.verdict,
        "counts": r.counts(),
        **results_part(r, system, o.machine),
        **(variants_part(o) if getattr(o, "variants", ()) else {}),
        **(sensitivity_part(o) if getattr(o, "sensitivity", None) is not None else {}),
        **({"review": review.as_dict()} if review is not None else {}),
        "cautions": [{"title": t, "text": x} for t, x in CAUTIONS],
    }


def variants_part(o: Outcome) -> dict:
    from specgen.present.variants_json import variants_document

    return variants_document(o)


def sensitivity_part(o: Outcome) -> dict:
    from specgen.present.sensitivity_out import document as sensitivity_document

    return {"sensitivity": sensitivity_document(o.sensitivity)}


def results_part(r, system: str, machine) -> dict:
    """Every computed value, check, corner and assumed input of one design (the base or a variant)."""
    return {
        "duty_points": [
            {"drive": d.drive, "duty": d.duty, "direction": d.direction,
             "values": {k: _value(v, system) for k, v in d.values.items()}}
            for d in r.duties
        ],
        "supply_modes": [
            {"supply": s.supply, "mode": s.mode,
             "contributions": [{"drive": c.drive, "duty": c.duty,
                                **dict(zip(("flow", "unit"), convert(c.flow, "flow", system)))}
                               for c in s.contributions],
             "values": {k: _value(v, system) for k, v in s.values.items()},
             "per_drive": {d: {k: _value(v, system) for k, v in values.items()} for d, values in s.per_drive.items()}}
            for s in r.supply_modes
        ],
        "drives": [
            {"drive": d.drive, "values": {k: _value(v, system) for k, v in d.values.items()},
             "envelope": [{"displacement": dict(zip(("value", "unit"), convert(e.displacement, "displacement", system))),
                           "speed": dict(zip(("value", "unit"), convert(e.speed, "speed", system))),
                           "torque": dict(zip(("value", "unit"), convert(e.torque, "torque", system))),
                           "speed_capped": e.speed_capped} for e in d.envelope]}
            for d in r.drives if d.values or d.envelope
        ],
        "supplies": [
            {"supply": s.supply, "worst_power_mode": s.worst_power_mode, "worst_heat_mode": s.worst_heat_mode,
             "values": {k: _value(v, system) for k, v in s.values.items()},
             **({"circuit": "closed_loop"} if machine.supply(s.supply).closed_loop is not None else {})}
            for s in r.supplies
        ],
        "modes": [{"mode": m.mode, "values": {k: _value(v, system) for k, v in m.values.items()}} for m in r.modes],
        "fluid": {k: _value(v, system) for k, v in r.fluid.values.items()},
        **({"duty_cycles": [_cycle(c, system) for c in r.cycles]} if r.cycles else {}),
        **({"prime_movers": [_prime_mover(x, system) for x in r.prime_movers]} if r.prime_movers else {}),
        **({"travel": travel_document(r.travel, system, _value)} if r.travel else {}),
        "checks": [_check(c, system, bool(r.corners)) for c in r.checks],
        **({"corners": [_corner(k, system) for k in r.corners]} if r.corners else {}),
        "assumed": assumed_list(r, system),
    }


def render(outcomes: list[Outcome], reviews: list | None = None) -> str:
    docs = [document(o, r) for o, r in zip(outcomes, reviews or [None] * len(outcomes))]
    body = docs[0] if len(docs) == 1 else {"specgen": __version__, "output_format": OUTPUT_FORMAT, "specs": docs}
    return json.dumps(body, indent=2, ensure_ascii=False) + "\n"
