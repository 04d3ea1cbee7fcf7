"""The tornado chart: deterministic greyscale SVG with prefixed ids, both steps drawn, key numbers in the text."""

from __future__ import annotations

import re

from present.test_charts import assert_inside, drawn_figures, texts

from specgen.present.chart_tornado import TornadoRow, tornado

ROWS = [TornadoRow("drives.hoist.duty_points.lift.torque", -0.8, 0.8),
        TornadoRow("supplies.main.relief_setting", 0.812, -0.828),
        TornadoRow("drives.a_drive_with_a_long_identifier.motor.efficiency.hydromechanical", 0.79, None)]


def test_same_rows_same_bytes_with_ids_prefixed_and_greys_only():
    a, b = (tornado("fig5", "pressure_margin (drive hoist)", ROWS, "1 %") for _ in range(2))
    assert a.svg == b.svg and a.svg.startswith("<svg")
    ids = set(re.findall(r'\bid="([^"]+)"', a.svg))
    assert all(i == "fig5" or i.startswith("fig5-") for i in ids)
    for colour in set(re.findall(r"#([0-9a-fA-F]{6})\b", a.svg)):
        assert colour[0:2] == colour[2:4] == colour[4:6], colour


def test_every_input_and_step_is_named_and_a_missing_step_is_said():
    c = tornado("fig6", "pressure_margin (drive hoist)", ROWS, "1 %")
    shown = texts(c.svg)
    assert "supplies.main.relief_setting" in shown and "input +1 %" in shown and "input -1 %" in shown
    assert "-0.8" in shown and "+0.812" in shown
    assert "supplies.main.relief_setting +0.812 / -0.828" in c.alt and "not computed" in c.alt


def test_everything_drawn_stays_inside_the_figure(monkeypatch):
    figures = drawn_figures(monkeypatch)
    tornado("fig7", "A long margin name " * 6, ROWS * 3, "0.5 %")
    assert_inside(figures)
