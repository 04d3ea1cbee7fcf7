"""Chart functions: deterministic inline SVG with unique ids, greyscale only, text alternatives."""

from __future__ import annotations

import html
import re

from specgen.present import charts
from specgen.present.charts import Limit, Line, MarginRow, Point


def torque(fig_id="fig1", title="Hoist: torque against pressure differential", **kw):
    args = dict(x_unit="bar", y_unit="N*m", lines=[Line("Vg 820.0 cm^3/rev", 12.27)],
                points=[Point("harvest", 211.9, 2600.0), Point("lower", 80.0, 900.0, overrunning=True)],
                limits=[Limit("relief setting", "280.0 bar", 272.0, "relief"),
                        Limit("continuous rating", "280.0 bar", 272.0, "continuous"),
                        Limit("peak rating", "320.0 bar", 312.0, "peak")])
    args.update(kw)
    return charts.torque_vs_pressure(fig_id, title, **args)


def texts(svg: str) -> list[str]:
    return [html.unescape(t) for t in re.findall(r"<text[^>]*>([^<]*)</text>", svg)]


def test_same_input_same_bytes_and_no_date():
    a, b = torque(), torque()
    assert a.svg == b.svg
    assert "dc:date" not in a.svg and "<dc:creator>" not in a.svg
    assert not a.svg.startswith("<?xml") and a.svg.startswith("<svg")


def test_ids_are_prefixed_per_figure_and_references_follow():
    one, two = torque("fig1"), torque("fig2")
    ids1 = set(re.findall(r'\bid="([^"]+)"', one.svg))
    ids2 = set(re.findall(r'\bid="([^"]+)"', two.svg))
    assert "fig1" in ids1 and all(i == "fig1" or i.startswith("fig1-") for i in ids1)
    assert not ids1 & ids2
    for ref in re.findall(r'(?:href="#|url\(#)([^")]+)', one.svg):
        assert ref in ids1, ref
    assert 'role="img" aria-labelledby="fig1-alt"' in one.svg


def test_only_greys_so_print_in_greyscale_loses_nothing():
    svgs = [torque().svg,
            charts.flow_by_mode("fig3", "Main: flow", unit="L/min", modes=["a", "b"], drives=["d1", "d2", "d3"],
                                flows=[[10, 20, 5], [30, 0, 1]], delivery=50.0, statuses=["pass", "fail"]).svg,
            charts.margin_overview("fig4", "Margins", [MarginRow("x", -0.1, "fail"), MarginRow("y", 0.05, "warn", 0.1),
                                                       MarginRow("z", 0.5, "pass", 0.1)]).svg]
    for svg in svgs:
        for colour in set(re.findall(r"#([0-9a-fA-F]{6})\b", svg)):
            r, g, b = colour[0:2], colour[2:4], colour[4:6]
            assert r == g == b, colour


def test_torque_chart_labels_axes_with_units_and_merges_coinciding_limits():
    c = torque()
    shown = texts(c.svg)
    assert "pressure differential dp [bar]" in shown and "motor torque T [N*m]" in shown
    # relief setting and continuous rating fall on one line: one label, not two overprinted
    assert "relief setting = continuous rating 280.0 bar" in shown
    assert "peak rating 320.0 bar" in shown
    assert "overrunning duty point" in shown  # the key only lists shapes that are drawn
    assert "harvest at 211.9 bar, 2600 N*m" in c.alt and "peak rating 320.0 bar at 312.0 bar" in c.alt
    assert "overrunning duty point" not in texts(torque(points=[Point("a", 1.0, 2.0)]).svg)
    assert "Vg 820.0 cm^3/rev: 12.27 N*m per bar" in c.alt


def test_several_displacements_each_get_a_named_line():
    c = torque(lines=[Line("Vg 28.00 cm^3/rev", 0.41), Line("Vg 12.00 cm^3/rev", 0.176)])
    shown = texts(c.svg)
    assert "Vg 28.00 cm^3/rev" in shown and "Vg 12.00 cm^3/rev" in shown
    assert shown.count("Vg 28.00 cm^3/rev") == 1  # named once, in the key, by its line's weight


def test_speed_chart_states_limits():
    c = charts.speed_vs_flow("fig5", "Track: speed against flow", x_unit="L/min", y_unit="rpm",
                             lines=[Line("Vg 820.0 cm^3/rev", 1.171)], points=[Point("harvest", 20.5, 24.0)],
                             limits=[Limit("maximum speed", "110.0 rpm", 110.0, "max"),
                                     Limit("minimum speed", "3.000 rpm", 3.0, "min")])
    assert "motor speed n [rpm]" in texts(c.svg) and "flow to motor q [L/min]" in texts(c.svg)
    assert "maximum speed 110.0 rpm at 110.0 rpm" in c.alt and "harvest at 20.50 L/min, 24.00 rpm" in c.alt


def test_flow_chart_totals_and_status_in_text():
    c = charts.flow_by_mode("fig6", "Main: flow demand by operating mode", unit="L/min", modes=["harvest", "transit"],
                            drives=["left", "right"], flows=[[20.5, 20.5], [51.25, 60.0]], delivery=100.0,
                            statuses=["pass", "fail"])
    shown = texts(c.svg)
    assert "41.00" in shown and "111.2 FAIL" in shown  # 51.25 + 60 = 111.25 over the 100 delivered
    assert "pump delivery 100.0 L/min" in shown
    assert "transit: 111.2 L/min fail (left 51.25, right 60.00)" in c.alt


def test_power_chart_without_prime_mover():
    c = charts.power_by_mode("fig7", "Aux: power", unit="kW", modes=["m1"], power=[22.9], available=None)
    assert "No prime mover power given" in c.alt and "prime mover" not in " ".join(texts(c.svg))


def test_margin_overview_puts_crossed_limits_first_and_labels_them():
    rows = [MarginRow("fan: speed vs max rating", 0.30, "pass", 0.05),
            MarginRow("hoist lift: inlet vs relief", -0.2, "fail", 0.1),
            MarginRow("track climb: inlet vs relief", 0.069, "warn", 0.1),
            MarginRow("track: speed vs min rating", 7.0, "pass")]
    c = charts.margin_overview("fig8", "Margins", rows)
    shown = texts(c.svg)
    order = [t for t in shown if t in {r.label for r in rows}]
    assert order == ["hoist lift: inlet vs relief", "track climb: inlet vs relief", "fan: speed vs max rating",
                     "track: speed vs min rating"]
    assert "-20.00 % FAIL" in shown and "6.900 % WARN" in shown and "> 700.0 %" in shown
    assert "1 crossed and 1 within the warning level" in c.alt


def test_hostile_and_dollar_text_is_kept_as_text():
    c = torque(title="Winch <script>alert(1)</script> $5 $x$")
    assert "<script" not in c.svg
    assert "Winch &lt;script&gt;alert(1)&lt;/script&gt; $5 $x$" in c.svg  # no mathtext, escaped


def test_coinciding_points_share_one_label_and_close_limits_stack():
    c = torque(points=[Point("hoist", 100.0, 1200.0), Point("lower", 100.0, 1200.0, overrunning=True)],
               limits=[Limit("compensator setting", "270.0 bar", 262.0, "compensator"),
                       Limit("relief setting", "280.0 bar", 272.0, "relief")])
    shown = texts(c.svg)
    assert "hoist, lower" in shown and "hoist" not in shown
    # two close limits with different values: one line of text each, never joined by "="
    assert "compensator setting 270.0 bar" in shown and "relief setting 280.0 bar" in shown
    assert not any("=" in t for t in shown)


def test_ticks_are_round_and_written_with_the_fewest_decimals():
    assert charts.ticks(0, 4400, 170, 14) == ([0.0, 500.0, 1000.0, 1500.0, 2000.0, 2500.0, 3000.0, 3500.0, 4000.0],
                                              ["0", "500", "1000", "1500", "2000", "2500", "3000", "3500", "4000"])
    values, labels = charts.ticks(-97.75, 112, 300, 21)  # a margin overview with a limit crossed by 85 %
    assert values[0] == -75.0 and labels[:4] == ["\N{MINUS SIGN}75", "\N{MINUS SIGN}50", "\N{MINUS SIGN}25", "0"]
    assert charts.ticks(0, 0.0023, 380, 21)[1] == ["0.0000", "0.0005", "0.0010", "0.0015", "0.0020"]


def test_long_text_wraps_at_spaces_and_inside_a_word_only_when_it_must():
    title = "Main hoist winch of the harbour crane: torque against pressure differential"
    assert charts.wrap(title, 1000, 8.5) == title  # fits: unchanged
    lines = charts.wrap(title, 200, 8.5).split("\n")
    assert lines == ["Main hoist winch of the harbour crane:", "torque against pressure differential"]
    parts = charts.wrap("x" * 120, 100).split("\n")
    assert "".join(parts) == "x" * 120 and all(charts.text_width(p) <= 100 for p in parts)


def drawn_figures(monkeypatch) -> list:
    """Every figure the charts draw from here on (drawn in this process)."""
    figures = []
    real = charts._svg
    monkeypatch.setattr(charts, "_svg", lambda fig, fig_id: figures.append(fig) or real(fig, fig_id))
    return figures


def assert_inside(figures) -> None:
    # The margins are worked out from measured text widths, not by a layout engine: check them by
    # the extent of every artist as a renderer at 720 dpi sets it (hinting too small to matter).
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    for fig in figures:
        fig.set_dpi(720)
        box = fig.get_tightbbox(FigureCanvasAgg(fig).get_renderer())  # inches
        width, height = fig.get_size_inches()
        assert box.x0 >= -0.5 / 72 and box.y0 >= -0.5 / 72, box
        assert box.x1 <= width + 0.5 / 72 and box.y1 <= height + 0.5 / 72, box


def test_example_report_charts_stay_inside_their_figures(monkeypatch):
    from helpers import EXAMPLE
    from specgen.fingerprint import Fingerprint
    from specgen.pipeline import run_file
    from specgen.present import chart_batch, report

    monkeypatch.setattr(chart_batch, "FORK_FROM", 10**6)  # drawn here, where they can be looked at
    figures = drawn_figures(monkeypatch)
    report.render(run_file(EXAMPLE), fp=Fingerprint("0" * 64))
    # the torque and speed charts of the two drives with warnings (track_right is track_left's twin),
    # flow and power of each of the two supplies, the margin overview, and the bale round's oil temperature
    assert len(figures) == 10
    assert_inside(figures)


def test_everything_drawn_stays_inside_the_figure(monkeypatch):
    figures = drawn_figures(monkeypatch)
    torque(title="A very long drive title for the main hoist winch of the harbour crane: torque against "
                 "pressure differential", y_unit="lbf*in", lines=[Line("Vg 28.00 in^3/rev", 4.1), Line("Vg 12", 1.8)],
           points=[Point("p1", 10.0, 40.0), Point("lowering_fast", 4000.0, 16000.0, True)])
    charts.speed_vs_flow("fig2", "Speed", x_unit="gpm", y_unit="rpm", lines=[Line("Vg 1", 230.0)],
                         points=[Point("a_rather_long_duty_name", 0.2, 40.0), Point("b", 20.0, 4600.0)],
                         limits=[Limit("maximum speed", "5000 rpm", 5000, "max"),
                                 Limit("minimum speed", "3 rpm", 3, "min")])
    charts.flow_by_mode("fig3", "Flow", unit="gpm", modes=["m1", "a_long_mode_name"],
                        drives=["main_hoist_winch_left", "slew_drive_with_a_long_identifier", "d3"],
                        flows=[[10, 20, 5], [100, 50, 50]], delivery=150.0, statuses=["pass", "fail"])
    charts.margin_overview("fig4", "Margins", [
        MarginRow("drive_with_a_quite_long_identifier duty_point: inlet vs pressure limit", -0.85, "fail", 0.1),
        MarginRow("x" * 140, 0.05, "warn", 0.1), MarginRow("fan: speed vs min rating", 19.0, "pass")])
    assert len(figures) == 4
    assert_inside(figures)


def oil(fig_id="fig7", **kw):
    args = dict(x_unit="min", y_unit="degC", times=[0.0, 0.5, 1.0, 1.5, 2.0], temperatures=[30.0, 38.0, 36.0, 42.0, 40.0],
                limit=Limit("oil limit", "70.00 degC", 70.0, "max"), steady=39.0)
    args.update(kw)
    return charts.oil_temperature_vs_time(fig_id, "Duty cycle lift: oil temperature from ambient", **args)


def test_oil_temperature_chart_labels_axes_limit_and_key_numbers(monkeypatch):
    figures = drawn_figures(monkeypatch)
    c = oil()
    shown = texts(c.svg)
    assert "time t [min]" in shown and "oil temperature T [degC]" in shown
    assert "oil limit 70.00 degC" in shown and "steady 39.00 degC" in shown
    assert "peak 42.00 degC" in c.alt and "from 30.00 degC over 2.000 min" in c.alt
    assert c.svg == oil().svg
    for colour in set(re.findall(r"#([0-9a-fA-F]{6})\b", c.svg)):
        assert colour[0:2] == colour[2:4] == colour[4:6], colour
    oil("fig8", y_unit="degF", temperatures=[-4.0, 150.0, 140.0, 171.0, 160.0], steady=150.0,
        limit=Limit("oil limit", "176.0 degF", 176.0, "max"))
    assert_inside(figures)


def test_power_chart_reaches_below_zero_for_a_pump_driven_by_its_load():
    # a closed loop overrunning: -6.7 kW goes back to the engine; the axis must show the bar below zero
    c = charts.power_by_mode("fig9", "Travel: power", unit="kW", modes=["climb", "descend"], power=[30.2, -16.7],
                             available=42.0)
    shown = texts(c.svg)
    assert "\N{MINUS SIGN}10" in shown  # axis from 1.18 * -16.7 = -19.7 kW: a tick below zero
    assert "-16.70" in shown and "descend: -16.70 kW" in c.alt
    positive = charts.power_by_mode("fig9", "Travel: power", unit="kW", modes=["climb"], power=[30.2], available=42.0)
    assert not any(t.startswith("\N{MINUS SIGN}") for t in texts(positive.svg))


def test_a_delivery_that_follows_the_mode_is_drawn_over_each_bar():
    # A pump on a shared prime mover delivers at each mode's engine speed (yard loader: 60.91 L/min at
    # 1800 rpm, 81.22 L/min at 2400 rpm): one dashed line at the first mode's delivery would misstate the rest.
    c = charts.flow_by_mode("fig9", "Work: flow", unit="L/min", modes=["sweeping", "pushing"], drives=["brush"],
                            flows=[[50.89], [19.56]], delivery=[60.91, 81.22])
    assert "Pump delivery by mode: sweeping: 60.91 L/min; pushing: 81.22 L/min" in c.alt
    same = charts.flow_by_mode("fig9", "Work: flow", unit="L/min", modes=["a", "b"], drives=["brush"],
                               flows=[[10.0], [12.0]], delivery=[40.0, 40.0])
    assert "Pump delivery 40 L/min" in same.alt or "Pump delivery 40.00 L/min" in same.alt
