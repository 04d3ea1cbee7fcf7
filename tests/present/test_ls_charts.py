"""Load-sensing charts (specgen/present/ls_charts.py): deterministic greyscale SVG, labelled axes, the key
numbers in the text alternative; and the report's block for the invented timber crane."""

from __future__ import annotations

import html
import re

from helpers import ROOT
from specgen.present import ls_charts


def pressure(fig_id="fig1"):
    return ls_charts.pressure_by_mode(fig_id, "Crane: pump pressure", unit="bar", modes=["lift", "slew"],
                                      pump=[230.0, 110.0], drives=["hoist", "slew"],
                                      needs=[[210.0, 90.0], [None, 90.0]], relief=250.0)


def flow(fig_id="fig2"):
    return ls_charts.flow_by_mode(fig_id, "Crane: flow", unit="L/min", modes=["lift", "fast"], asked=[90.0, 120.0],
                                  delivered=[90.0, 100.0], available=[100.0, 100.0], full_stroke=100.0,
                                  statuses=[None, "fail"])


def texts(svg: str) -> list[str]:
    return [html.unescape(t) for t in re.findall(r"<text[^>]*>([^<]*)</text>", svg)]


def test_same_input_same_bytes_greys_only_and_prefixed_ids():
    for make in (pressure, flow):
        a, b = make(), make()
        assert a.svg == b.svg
        for colour in set(re.findall(r"#([0-9a-fA-F]{6})\b", a.svg)):
            assert colour[0:2] == colour[2:4] == colour[4:6], colour
        ids = set(re.findall(r'\bid="([^"]+)"', a.svg))
        assert all(i == a.id or i.startswith(a.id + "-") for i in ids)


def test_pressure_chart_names_axes_and_needs():
    c = pressure()
    assert "pressure p [bar]" in texts(c.svg) and "operating mode" in texts(c.svg)
    # the throttled gap of the slew in the lift mode reads off the alternative: 230 against 90 bar
    assert "lift: pump 230.0 bar (needs: hoist 210.0, slew 90.00)" in c.alt
    assert "slew: pump 110.0 bar (needs: slew 90.00)" in c.alt and "Relief 250.0 bar" in c.alt


def test_flow_chart_marks_a_mode_whose_drives_slow():
    c = flow()
    assert "flow q [L/min]" in texts(c.svg)
    assert "fast: asked 120.0, delivered 100.0, can give 100.0 L/min fail" in c.alt


def test_report_shows_the_load_sensing_block(tmp_path):
    from helpers import run_cli

    code, out, err = run_cli("report", ROOT / "tests" / "specs" / "timber_crane.yaml", "-o", tmp_path / "r")
    page = (tmp_path / "r" / "index.html").read_text(encoding="utf-8")
    assert "Load sensing: pump pressure, shares and throttling" in page
    # the light slew beside the heavy hoist: 7.390 kW throttled against 1.688 kW (resolve tests check the relation)
    block = page[page.index('id="supply-crane-ls"'):]
    assert "<td>slew at turn</td><td class=\"num\">89.09 bar</td>" in block and "7.390 kW" in block
    assert "pump pressure and drive needs by mode" in block and "flow asked and delivered by mode" in block


def test_report_of_a_load_sensing_supply_is_the_same_bytes_twice(tmp_path):
    from helpers import run_cli

    spec = ROOT / "tests" / "specs" / "timber_crane.yaml"
    run_cli("report", spec, "-o", tmp_path / "a")
    run_cli("report", spec, "-o", tmp_path / "b")
    assert (tmp_path / "a" / "index.html").read_bytes() == (tmp_path / "b" / "index.html").read_bytes()
