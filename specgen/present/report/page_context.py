"""The report page's context: every value the template shows, as plain values and formatted text.

``context(outcome, ...)`` walks the machine -- checks, supplies, drives, modes, the fluid, the
assumed values, the symbols of the traces, the checklist of items the calculation cannot cover and
the sign-off -- and asks for the charts (chart_data.py) as it goes. Every number shown is a Results
value (or a model input) formatted with units.format_si in the machine's display units; nothing
here recomputes a relation.
"""

from __future__ import annotations


from specgen import __version__
from specgen.results import RANK
from specgen.cautions import CAUTIONS
from specgen.fingerprint import Fingerprint
from specgen.pipeline import Outcome
from specgen.present.chart_batch import Batch
from specgen.present.markdown_text import to_html
from specgen.present.report.chart_data import (MARGIN_ROWS_PER_CHART, cycle_chart, drive_charts, margin_charts,
                                                margin_rows, supply_charts)
from specgen.present.report.checklist import check_rows, key_facts, passing_groups, review_context
from specgen.present.report.entered import drive_rows, duty_rows, fluid_rows, given_text, supply_rows
from specgen.present.report.grouped import Case, by_source, grouped, number_relations
from specgen.present.report.values import STATUS_WORD, show, slug, trace_row, typeset
from specgen.present.report.closed_loop import loop_table
from specgen.present.report.load_sensing import ls_context
from specgen.present.report.prime_movers import prime_mover_sections
from specgen.present.report.travel import travel_context
from specgen.present.report.sensitivity import sensitivity_context
from specgen.present.report.variants import variants_context


MANUAL_ITEMS = (
    ("Hoses, tubes and fittings",
     "Every hose, tube, fitting and port in each circuit is rated for a working pressure at least equal to "
     "the relief setting of its supply{reliefs}, with the maker's safety factor, and suits the fluid and "
     "temperature."),
    ("Brakes and load holding",
     "Every suspended or overrunning load{overrun} is held by a load-holding or counterbalance valve fitted "
     "at the motor, and by a brake that holds on loss of pressure where people can be beneath or beside it."),
    ("Guarding", "Rotating shafts, couplings, drums, reels, belts and pinch points are guarded."),
    ("Emergency stop",
     "An emergency stop brings every drive to a safe stop and holds it; stored energy is released or "
     "held safely on stop."),
    ("Filtration and fluid cleanliness",
     "Filtration holds the fluid to an ISO 4406 cleanliness code that meets the most sensitive component's "
     "requirement; filters carry a clogging indicator."),
    ("Makers' data", "Every efficiency, rating and limit used above agrees with the component makers' current "
     "data sheets; every value marked assumed has been replaced or accepted."),
    ("Standards and codes",
     "The hydraulic system complies with ISO 4413 (general rules and safety requirements for hydraulic "
     "systems) and the local codes and regulations that apply to the machine."),
)

SIGNOFF_ROLES = (("prepared_by", "Prepared by"), ("checked_by", "Checked by"), ("approved_by", "Approved by"))

def context(o: Outcome, *, fp: Fingerprint, date: str | None = None, reviews: list | None = None,
            draw: Batch | None = None, review=None) -> dict:
    """Everything the report template shows, as plain values and formatted text.

    The charts are asked for from ``draw`` and left for the caller to draw (Batch.start, finish);
    without it they are drawn here, before this returns. ``review``: the review.ReviewStatus of the
    spec (its state and its accepted warnings), when known."""
    m, r = o.machine, o.results
    system = m.display_units
    fig_counter = iter(range(1, 10_000))

    def fig_n() -> str:
        return f"fig{next(fig_counter)}"

    checks = check_rows(o, system, review)
    problems = sorted((c for c in checks if c["status"] != "pass"), key=lambda c: (-RANK[c["status"]], c["n"]))
    # The charts are asked for while the context is built and drawn together: many of them in
    # parallel (chart_batch.py), in the same order and to the same bytes.
    own_batch = draw is None
    draw = Batch() if own_batch else draw
    margins = margin_charts(o, fig_n, draw)
    supplies = [_supply_context(o, sup, system, checks, fig_n, draw) for sup in m.supplies]
    drives = [_drive_context(o, d, system, checks) for d in m.drives]
    _mark_repeats(drives)
    charted = _charted(o, {d["id"] for d in drives if d["same_as"]})
    for d, ctx in zip(m.drives, drives):
        duties = [x for x in r.duties if x.drive == d.id]
        if d.id in charted and duties:
            ctx["charts"], ctx["back_pressure"] = drive_charts(o, d, duties, system, fig_n, draw)
    mode_cases = [Case(x.mode, f"mode-{slug(x.mode)}", x.values)
                  for x in map(r.mode_result, (md.id for md in m.modes)) if x is not None and x.values]
    mode_traces = _groups("modes-all", "All supplies, by operating mode", mode_cases, system, checks) \
        if mode_cases else []
    cycles = [_cycle_context(o, c, system, checks, fig_n, draw) for c in r.cycles]
    travel = travel_context(o, system, checks, fig_n, draw)
    fluid_values = r.fluid.values
    extras = {"variants": variants_context(o), "sensitivity": sensitivity_context(o, fig_n, draw)}
    if own_batch:
        draw.draw()
    doc = f"{m.document_number[:60]} - " if m.document_number else ""
    fp_footer = f"{doc}{m.title[:80]} - rev {m.revision} - file SHA-256 {fp.short}"
    fluid_trace = _trace_block("fluid-trace", "Fluid at the working temperature", fluid_values, system, checks) \
        if fluid_values else None
    prime_movers = prime_mover_sections(o, system, checks)
    blocks = ([fluid_trace] if fluid_trace else []) + mode_traces + [c["trace"] for c in cycles] + \
        [t for s in supplies for t in s["traces"]] + [t for d in drives for t in d["traces"]] + \
        [t for p in prime_movers for t in p["traces"]] + ([{"rows": travel["trace"]}] if travel else [])
    relations = number_relations(blocks)
    return {
        "machine": {"id": m.id, "title": m.title, "revision": m.revision, "units": system,
                    "document_number": m.document_number,
                    "page_size": m.page_size if m.page_size in ("A4", "Letter") else "A4"},
        "spec_file": o.source.name, "fingerprint": fp, "version": __version__, "date": date,
        "footer": fp_footer,
        "verdict": r.verdict, "verdict_word": STATUS_WORD[r.verdict], "counts": r.counts(),
        "problems": problems, "checks": checks, "passing_groups": passing_groups(checks),
        "key_facts": key_facts(o, checks, system), "max_drive_charts": MAX_DRIVE_CHARTS, "review": review_context(o, review),
        "corners": [{"id": k.id, "title": k.title, "modes": ", ".join(k.modes),
                     "moves": typeset("; ".join(f"{path} {value}" for path, value in k.overrides)),
                     "basis": k.basis if k.assumed else "", "verdict": k.verdict,
                     "verdict_word": STATUS_WORD[k.verdict]} for k in r.corners],
        "cautions": [{"title": t, "text": x} for t, x in CAUTIONS],
        "description_html": to_html(m.description),
        "fluid": fluid_rows(o, system),
        "fluid_trace": fluid_trace, "relations": relations, "relation_sources": by_source(relations),
        "modes": _modes(o), "mode_traces": mode_traces, "supplies": supplies, "drives": drives, "cycles": cycles,
        "prime_movers": prime_movers,
        "margin_charts": margins, "travel": travel, "margin_total": len(margin_rows(o)),
        "margin_shown": min(len(margin_rows(o)), MARGIN_ROWS_PER_CHART), "assumed": _assumed(o, system), "symbols": _symbols(o),
        "manual_items": _manual_items(o, system),
        "signoff": [{"role": label, "name": m.signoff.get(key, "")} for key, label in SIGNOFF_ROLES],
        # Recorded reviews of this spec (a list of mappings: name, role, date, verdict, fingerprint,
        # machine_revision, remarks); shown in the template's "reviews" block, empty by default.
        "reviews": list(reviews or []),
        **extras,
    }


def _trace_block(anchor: str, title: str, values: dict, system: str, checks: list[dict], rows=None) -> dict:
    own = [c for c in checks if c["target"] == anchor]
    return {"anchor": anchor, "title": title, "grouped": False,
            "rows": rows if rows is not None else [trace_row(v, system) for v in values.values()],
            "problems": [c for c in own if c["status"] != "pass"], "passing": [c for c in own if c["status"] == "pass"]}


def _group(anchor: str, title: str, cases: list[Case], system: str, checks: list[dict], rows=None,
           whole: dict | None = None) -> dict:
    """One case: its full trace, every input put into its relation; several: the grouped trace,
    each relation once with a column of results a case (grouped.py). ``whole``: the values that
    hold for every case (a drive's pressure limit, a supply's pump), set first."""
    if len(cases) == 1:
        head = [trace_row(v, system) for v in (whole or {}).values()]
        own = rows if rows is not None else [trace_row(v, system) for v in cases[0].values.values()]
        return _trace_block(cases[0].anchor, f"{title}: {cases[0].title or cases[0].name}", cases[0].values,
                            system, checks, head + own)
    return grouped(anchor, title, cases, system, checks, whole)


MAX_CASE_COLUMNS = 7  # value columns a grouped trace prints side by side on a portrait page


def _groups(anchor: str, title: str, cases: list[Case], system: str, checks: list[dict], rows=None,
            whole: dict | None = None) -> list[dict]:
    """The trace of ``cases`` as one block, or as several of at most MAX_CASE_COLUMNS cases each
    (the values of the whole in the first) when there are more than a page holds side by side."""
    if len(cases) <= MAX_CASE_COLUMNS:
        return [_group(anchor, title, cases, system, checks, rows, whole)]
    parts = [cases[k:k + MAX_CASE_COLUMNS] for k in range(0, len(cases), MAX_CASE_COLUMNS)]
    return [grouped(f"{anchor}-{n}", f"{title} ({n} of {len(parts)})", part, system, checks,
                    whole if n == 1 else None) for n, part in enumerate(parts, start=1)]


def _cycle_context(o: Outcome, c, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    """A duty cycle: its steps, its trace (heat, power, oil temperature) and the oil-temperature chart."""
    cycle = next(x for x in o.machine.duty_cycles if x.id == c.cycle)
    rows = [{"mode": s.mode, "time": show(s.duration, "time", system)} for s in cycle.steps]
    extra = [f"mean prime-mover power of supply {s}: {show(p, 'power', system)}" for s, p in c.per_supply.items()]
    extra += [f"drive {d} above its continuous pressure rating {show(x, 'ratio', system)} of the time"
              for d, x in c.above_continuous.items()]
    return {"id": c.cycle, "title": cycle.title, "period": show(cycle.period, "time", system), "steps": rows,
            "trace": _trace_block(f"cycle-{slug(c.cycle)}", f"Duty cycle {cycle.title}", c.values, system, checks),
            "extra": extra, "missing": c.missing, "chart": cycle_chart(o, c, system, fig_n, draw)}


def _supply_context(o: Outcome, sup, system: str, checks: list[dict], fig_n, draw: Batch) -> dict:
    m, r = o.machine, o.results
    modes = [x for x in r.supply_modes if x.supply == sup.id]  # only the modes that run this supply
    entered = supply_rows(o, sup, system)
    whole = r.supply_result(sup.id)
    traces = []
    whole_values = whole.values if whole is not None and whole.values else None
    if modes:
        cases = [Case(x.mode, f"mode-{slug(x.supply)}-{slug(x.mode)}", x.trace,
                      next((md.title for md in m.modes if md.id == x.mode), x.mode)) for x in modes]
        traces += _groups(f"supply-{slug(sup.id)}-modes", "The pump, then each operating mode", cases, system,
                          checks, whole=whole_values)
    elif whole_values:
        traces.append(_trace_block(f"supply-{slug(sup.id)}-all", "All modes", whole_values, system, checks))
    return {
        "id": sup.id, "anchor": f"supply-{slug(sup.id)}", "title": sup.title, "entered": entered,
        "has_modes": bool(modes),
        "drives": [{"id": d.id, "anchor": f"drive-{slug(d.id)}"} for d in m.drives if d.supply == sup.id],
        "charts": supply_charts(o, sup, modes, system, fig_n, draw) if modes else [],
        "load_sensing": ls_context(o, sup, system, fig_n, draw) if modes else None,
        "closed_loop": loop_table(o, sup, system),
        "traces": traces, **_split(checks, f"supply-{slug(sup.id)}"),
    }


def _drive_context(o: Outcome, d, system: str, checks: list[dict]) -> dict:
    """A drive's section; its charts are asked for afterwards, for the drives that get them."""
    r = o.results
    duties = [x for x in r.duties if x.drive == d.id]
    entered = drive_rows(o, d, system)
    traces = []
    whole = r.drive_result(d.id)
    whole_values = whole.values if whole is not None and whole.values else None
    if whole_values and not duties:
        traces.append(_trace_block(f"drive-{slug(d.id)}-all", "Drive as a whole", whole_values, system, checks))
    if duties:
        cases = [Case(x.duty, f"duty-{slug(x.drive)}-{slug(x.duty)}", x.values,
                      f"{d.duty(x.duty).title} ({x.direction})") for x in duties]
        x = duties[0]
        rows = [trace_row(v, system, given_text(o, x.drive, x.duty, k)) for k, v in x.values.items()]
        traces += _groups(f"drive-{slug(d.id)}-duties", "The drive, then each duty point", cases, system, checks,
                          rows, whole_values)
    return {
        "id": d.id, "anchor": f"drive-{slug(d.id)}", "title": d.title, "supply": d.supply,
        "supply_anchor": f"supply-{slug(d.supply)}", "notes_html": to_html(d.notes),
        "entered": entered, "duties_entered": duty_rows(o, d, system),
        "charts": [], "back_pressure": None, "same_as": None,
        "traces": traces, **_split(checks, f"drive-{slug(d.id)}"),
    }


def _split(checks: list[dict], target: str) -> dict:
    """The checks aimed at ``target``: warnings and failures, and the passing ones."""
    own = [c for c in checks if c["target"] == target]
    return {"problems": [c for c in own if c["status"] != "pass"], "passing": [c for c in own if c["status"] == "pass"]}


MAX_DRIVE_CHARTS = 8  # drives charted at most: a large machine's report stays a document, not an atlas


def _charted(o: Outcome, repeats: set[str] = frozenset()) -> set[str]:
    """The drives whose torque and speed charts carry what the tables do not: those with a check that
    warns or fails, to see how near the limit the duty points sit; on a large machine only the
    MAX_DRIVE_CHARTS with the smallest margins, and never a repeat of a drive already charted.
    The margin chart and the traces hold the rest."""
    worst: dict[str, float] = {}
    for c in o.results.checks:
        if c.drive and c.status != "pass" and c.drive not in repeats:
            margin = c.margin if c.margin is not None else float("-inf")
            worst[c.drive] = min(worst.get(c.drive, float("inf")), margin)
    order = sorted(worst, key=lambda d: (worst[d], d))
    return set(order[:MAX_DRIVE_CHARTS])


def _signature(d: dict) -> str:
    """What a drive's section shows, without its own id and supply: two drives with the same signature
    have the same motor, gear stage, duty points, values and relations."""
    import json

    prefix = f"drives.{d['id']}."
    # the supply is named beside a repeat: like drives on other supplies of the same data repeat too
    entered = [(x["label"], x["path"].removeprefix(prefix), x["entered"], x["shown"], x["assumed"])
               for x in d["entered"] if x["path"] != prefix + "supply"]
    duties = [{k: v for k, v in u.items() if k != "more"} for u in d["duties_entered"]]
    traces = [[(x["label"], x["formula"], x.get("result"), [c and c["text"] for c in x.get("cells", [])],
                x.get("span") and x["span"]["text"], x["note"]) for x in t["rows"]] for t in d["traces"]]
    return json.dumps([entered, duties, traces], sort_keys=True, default=str).replace(f'"{prefix}', '"')


def _mark_repeats(drives: list[dict]) -> None:
    """A drive the same as an earlier one (a machine of many like conveyors) is shown as a reference
    to it, with its own warnings and failures; its numbers are those of the first."""
    first: dict[str, dict] = {}
    for d in drives:
        key = _signature(d)
        if key in first:
            f = first[key]
            d["same_as"] = {"id": f["id"], "anchor": f["anchor"], "title": f["title"]}
            d["anchors"] = [t["anchor"] for t in d["traces"]] + [c["anchor"] for t in d["traces"]
                                                                 for c in t.get("cases", [])]
            d["all_problems"] = d["problems"] + [c for t in d["traces"] for c in t["problems"]]
        else:
            first[key] = d


def _modes(o: Outcome) -> list[dict]:
    return [{"id": md.id, "title": md.title, "running": [{"drive": d, "duty": u, "anchor": f"duty-{slug(d)}-{slug(u)}"}
                                                           for d, u in md.running]}
            for md in o.machine.modes]


def _assumed(o: Outcome, system: str) -> list[dict]:
    """Every assumed input the results rest on (built from the traces), with its basis."""
    return [{"where": ".".join(i.where), "value": show(i.value, i.kind, system, i.symbol, i.label), "basis": typeset(i.basis)}
            for i in o.results.assumed()]


def _manual_items(o: Outcome, system: str) -> list[dict]:
    def relief(s) -> float:  # a closed loop's higher relief side
        return max((v for _, v in s.high_pressure_reliefs), default=s.relief_setting)

    reliefs = ", ".join(f"{s.id} {show(relief(s), 'pressure', system)}" for s in o.machine.supplies)
    over = ", ".join(f"{r.drive} {r.duty}" for r in o.results.duties if r.direction == "overrunning")
    fill = {"reliefs": f" ({reliefs})" if reliefs else "", "overrun": f" (here: {over})" if over else ""}
    return [{"n": n, "title": t, "text": text.format(**fill)} for n, (t, text) in enumerate(MANUAL_ITEMS, start=1)]


def _symbols(o: Outcome) -> list[dict]:
    """Each symbol that appears only inside relations, once, with its meaning: every computed or
    given value is named beside its own symbol in its trace row, so the legend holds the rest."""
    seen: dict[str, str] = {}
    own: set[str] = set()
    r = o.results
    m = o.machine
    parts = [*r.duties, *r.supply_modes,
             *map(r.drive_result, (d.id for d in m.drives)), *map(r.supply_result, (s.id for s in m.supplies)),
             *map(r.mode_result, (md.id for md in m.modes))]
    groups = ([x.trace for x in parts if x is not None] + [r.fluid.trace] + [c.values for c in r.cycles]
              + [x.trace for x in r.prime_movers])
    for values in groups:
        for v in values.values():
            own.add(v.symbol)
            for i in v.inputs:
                if "[" not in i.symbol:
                    seen.setdefault(i.symbol, i.label)
    return [{"symbol": s, "label": typeset(lab)} for s, lab in seen.items() if s not in own]
