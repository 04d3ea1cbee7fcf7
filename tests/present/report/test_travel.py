"""The report's travel section: its chart, the vehicle's trace and the duty points with the line that
sets their envelope; nothing (and no figure number taken) without a travel block."""

from __future__ import annotations

from page_html import FIXED, block
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.present import report
from specgen.present.report.travel import travel_context
from specgen.units import format_si
from vehicles import carrier


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def test_travel_section_shows_every_vehicle_value_and_the_chart():
    o = outcome(carrier())
    page = report.render(o, fp=FIXED)
    text = block(page, "travel")
    assert "Tractive effort against ground speed" in text and "Calculation trace, travel" in text
    for v in o.results.travel.values.values():
        if v.kind != "ratio":
            assert format_si(v.value, v.kind, "SI") in text, v.key
    # hand calculation (tests/vehicles.py): the pivot's 36 400 N at 0.3 m/s, set by the pressure limit
    assert "36.40 kN" in text and "0.3000 m/s" in text and ">relief<" in text


def test_no_travel_block_no_section_and_no_figure_number():
    from helpers import minimal
    taken = []
    assert travel_context(outcome(minimal()), "SI", [], lambda: taken.append(1) or "fig1", None) is None
    assert taken == []
