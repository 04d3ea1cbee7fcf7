"""The report's shared prime movers (present/report/prime_movers.py, report_templates/prime_movers.html):
one table per prime mover with a row per mode, its trace per mode, its checks linked there."""

from __future__ import annotations

from engine_spec import shared_engine
from helpers import minimal, write_spec
from page_html import FIXED, block
from specgen.pipeline import run_file
from specgen.present import report


def page(tmp_path, data):
    o = run_file(write_spec(tmp_path, data))
    return o, report.render(o, fp=FIXED)


def test_table_shows_each_pump_the_sum_and_the_margin(tmp_path):
    o, html = page(tmp_path, shared_engine())
    section = block(html, "prime-movers")
    # hand calculation (tests/engine_spec.py): rated 38 + 30 = 68 kW of 75 kW, margin 7/75 = 9.333 %;
    # idle 17.27 + 13.64 = 30.91 kW of 40 kW on the curve, margin 22.73 %
    row = section.split("<code>dig</code>", 1)[1].split("</tr>", 1)[0]
    for text in ("rated 2200 rpm", "75.00 kW", "38.00 kW", "30.00 kW", "68.00 kW", "9.333 %"):
        assert text in row, text
    row = section.split("<code>travel_idle</code>", 1)[1].split("</tr>", 1)[0]
    for text in ("idle 1000 rpm", "40.00 kW", "17.27 kW", "13.64 kW", "30.91 kW", "22.73 %"):
        assert text in row, text
    assert "Pump front" in section and "Pump rear" in section


def test_trace_per_mode_holds_the_sums_and_the_check_links_there(tmp_path):
    o, html = page(tmp_path, shared_engine())
    trace = block(html, "prime-mover-diesel-dig")
    assert "P_sum = 38.00 kW + 30.00 kW" in trace
    assert "T_pm = (108.5 N·m) * 1.200" in trace  # pump B's torque referred to the engine shaft
    start = html.index('id="prime-mover-diesel-dig"')
    links = html[start:html.index("</div>", start)]
    assert "Shared prime mover covers its pumps" in links  # the check is listed under its trace
    assert "<li><span class=\"status status-warn\">WARN</span>" in links
    assert 'href="#prime-mover-diesel-dig"' in html  # the checks table links the check to its trace


def test_no_section_without_shared_prime_movers(tmp_path):
    _, html = page(tmp_path, minimal())
    assert 'id="prime-movers"' not in html
