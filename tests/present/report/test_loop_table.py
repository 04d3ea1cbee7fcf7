"""The report's closed-loop table (specgen/present/report/closed_loop.py, report_templates/closed_loop.html):
one row per mode with the hand-checked figures of helpers.closed_loop() (tests/resolve/test_closed_loop.py
shows the arithmetic); none for an open circuit."""

from helpers import closed_loop, minimal, write_spec
from page_html import FIXED
from specgen.pipeline import run_file
from specgen.present import report
from specgen.present.report.closed_loop import loop_table


def test_report_table_and_page(tmp_path):
    o = run_file(write_spec(tmp_path, closed_loop()))
    t = loop_table(o, o.machine.supply("loop"), "SI")
    assert [r["mode"] for r in t["rows"]] == ["driving", "braking"]
    assert t["rows"][0]["duties"] == "wheel at drive"
    assert t["rows"][0]["cells"][:2] == ["50.00 %", "300.0 bar"]
    page = report.render(o, fp=FIXED)
    assert 'id="supply-loop-loop"' in page and "-27.83 kW" in page
    plain = run_file(write_spec(tmp_path, minimal(), "open.yaml"))
    assert loop_table(plain, plain.machine.supply("main"), "SI") is None
    assert 'id="supply-main-loop"' not in report.render(plain, fp=FIXED)


def test_entered_table_names_the_low_side_for_a_loop(tmp_path):
    o = run_file(write_spec(tmp_path, closed_loop()))
    page = report.render(o, fp=FIXED)
    # keys are shown under the supply's prefix, wrapping at the dots; the label rides in the title
    assert 'title="Low side (charge pressure)">closed_loop.<wbr>charge.<wbr>pressure<' in page
    assert "return_pressure" not in page
