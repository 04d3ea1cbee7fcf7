"""The report's shared prime movers (present/report/prime_movers.py, report_templates/prime_movers.html):
one table per prime mover with a row per mode, its trace with a column a mode, its checks linked there."""

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


def test_trace_holds_the_sums_a_column_a_mode_and_the_check_links_there(tmp_path):
    o, html = page(tmp_path, shared_engine())
    trace = block(html, "prime-mover-diesel-trace")
    # each relation once (primer 16: the pumps' input powers add; torque referred through the drive ratio)
    assert trace.count("P_sum = sum(P_in,i)") == 1 and "T_pm = T_p * i_pd" in trace
    assert 'id="prime-mover-diesel-dig"' in trace  # the mode's column, where its checks link
    # hand calculation (tests/engine_spec.py) in mode dig: 38 + 30 = 68 kW; pump B's 108.5 N*m times
    # its drive ratio 1.2 = 130.2 N*m at the engine shaft
    for text in (">68.00<", ">130.2<"):
        assert text in trace, text
    start = html.index('id="prime-mover-diesel-trace"')
    links = html[start:html.index("</div>", start)]
    assert "Shared prime mover covers its pumps" in links  # the check is listed under its trace
    assert "<li><span class=\"status status-warn\">WARN</span>" in links
    assert 'href="#prime-mover-diesel-dig"' in html  # the checks table links the check to its column


def test_no_section_without_shared_prime_movers(tmp_path):
    _, html = page(tmp_path, minimal())
    assert 'id="prime-movers"' not in html
