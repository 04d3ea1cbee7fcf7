"""The travel chart: deterministic greyscale SVG with prefixed ids, the limits named, key numbers in the text."""

from __future__ import annotations

import html
import re

from specgen.present.charts import Limit, Point
from specgen.present.traction_chart import tractive_effort_vs_speed
from tests.present.test_charts import assert_inside, drawn_figures


def chart(fig_id="fig5", **kw):
    # A variable transmission (numbers in kN and m/s): relief 21.3 kN to 3.1 m/s, falling as 1/v after;
    # adhesion 17.65 kN; engine power line 54.75 kW / v (hand-made figures)
    speeds = [0.0, 1.0, 2.0, 3.1, 4.0, 6.0, 8.0, 9.66]
    relief = [21.3 if v <= 3.1 else 21.3 * 3.1 / v for v in speeds]
    power = [None] + [54.75 / v for v in speeds[1:]]
    envelope = [min(x for x in (r, p, 17.65) if x is not None) for r, p in zip(relief, power)]
    args = dict(x_unit="m/s", y_unit="kN", speeds=speeds, envelope=envelope, relief=relief, power=power,
                adhesion=Limit("adhesion limit", "17.65 kN", 17.65, "continuous"),
                top_speed=Limit("top speed", "9.664 m/s", 9.664, "max"),
                points=[Point("push", 0.5, 16.0), Point("road", 8.0, 6.5), Point("downhill", 3.0, 5.0, True)])
    args.update(kw)
    return tractive_effort_vs_speed(fig_id, "Tractive effort against ground speed", **args)


def texts(svg: str) -> list[str]:
    return [html.unescape(t) for t in re.findall(r"<text[^>]*>([^<]*)</text>", svg)]


def test_same_input_same_bytes_with_prefixed_ids():
    a, b = chart(), chart()
    assert a.svg == b.svg and a.svg.startswith("<svg")
    ids = set(re.findall(r'\bid="([^"]+)"', a.svg))
    assert "fig5" in ids and all(i == "fig5" or i.startswith("fig5-") for i in ids)
    assert not ids & set(re.findall(r'\bid="([^"]+)"', chart("fig6").svg))


def test_only_greys():
    for colour in set(re.findall(r"#([0-9a-fA-F]{6})\b", chart().svg)):
        assert colour[0:2] == colour[2:4] == colour[4:6], colour


def test_limits_are_named_and_key_numbers_stated():
    c = chart()
    words = " ".join(texts(c.svg))
    for name in ("pressure limit", "engine power", "adhesion limit 17.65 kN", "top speed 9.664 m/s", "push", "road",
                 "ground speed v [m/s]", "tractive effort F [kN]"):
        assert name in words, name
    assert "Envelope from 17.65 kN at standstill" in c.alt and "top speed 9.664 m/s" in c.alt
    assert "downhill (overrunning) at 3.000 m/s, 5.000 kN" in c.alt


def test_everything_drawn_stays_inside_the_figure(monkeypatch):
    figures = drawn_figures(monkeypatch)
    chart(points=[Point("a_rather_long_duty_point_name", 9.6, 21.0), Point("b", 0.0, 0.0)])
    assert len(figures) == 1
    assert_inside(figures)
