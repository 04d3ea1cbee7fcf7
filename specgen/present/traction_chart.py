"""The travel chart: tractive effort against ground speed, with the lines that bound it and the duty points.

Drawn like the other report charts (charts.py, chart_frame.py): numbers already in display units, greys
only, series told apart by line style and width and named on the chart, the same bytes for the same
input, every SVG id prefixed with the figure's id.
"""

from __future__ import annotations

from typing import Sequence

from specgen.present.chart_frame import GREYS, HEIGHT_IN, INK, KEY_ROW, LABEL, TICK, TICK_TEXT
from specgen.present.charts import (_CLEAR, LIMIT_STYLES, Chart, Limit, Line, Point, _draw, _horizontal_limits, _key,
                                   _key_labels, _num, _numeric_frame, _point_text, _points)


def _name_line(ax, x: float, y: float, text: str) -> None:
    ax.annotate(text, (x, y), xytext=(3, 3), textcoords="offset points", ha="left", va="bottom", fontsize=6.8,
                bbox=_CLEAR, annotation_clip=True)


def tractive_effort_vs_speed(fig_id: str, title: str, *, x_unit: str, y_unit: str, speeds: Sequence[float],
                             envelope: Sequence[float], relief: Sequence[float], power: Sequence[float | None],
                             adhesion: Limit, top_speed: Limit, points: Sequence[Point]) -> Chart:
    """The envelope (heavy line) over ``speeds``: the lowest of the effort at the pressure limit (dashed),
    the engine power line (dotted; None where it does not apply), the adhesion limit (horizontal,
    dash-dot) up to the top speed (vertical); the travel duty points (vehicle effort at ground speed;
    open squares braking).

    Example: a relief line of 21.3 kN to 3.1 m/s and falling after, adhesion 17.7 kN, a 54.8 kW power
    line: the envelope is set by the adhesion to 3.1 m/s, by the engine power after.
    """
    x_max = 1.08 * max(list(speeds) + [p.x for p in points] + [top_speed.at, 1e-9])
    tops = [e for e in envelope] + list(relief) + [adhesion.at] + [p.y for p in points]
    y_max = 1.15 * max(tops + [1e-9])

    def build():
        frame = _numeric_frame(HEIGHT_IN, title, (0, x_max), (0, y_max), KEY_ROW + TICK + TICK_TEXT + LABEL)
        ax = frame.ax
        ax.plot(list(speeds), list(relief), color=GREYS[6], linewidth=1.1, linestyle=LIMIT_STYLES["relief"], zorder=3)
        k = len(speeds) // 3
        _name_line(ax, speeds[k], min(relief[k], y_max * 0.95), "pressure limit")
        shown = [(v, f) for v, f in zip(speeds, power) if f is not None and f <= y_max]
        if shown:
            ax.plot([v for v, _ in shown], [f for _, f in shown], color=GREYS[6], linewidth=1.3,
                    linestyle=LIMIT_STYLES["min"], zorder=3)
            v, f = shown[len(shown) * 2 // 3]
            _name_line(ax, v, f, "engine power")
        _horizontal_limits(ax, [adhesion], y_max)
        ax.axvline(top_speed.at, color=INK, linewidth=1.0, linestyle=LIMIT_STYLES["max"], zorder=3)
        ax.annotate(f"{top_speed.label} {top_speed.value}", (top_speed.at, 0.0), xycoords=("data", "axes fraction"),
                    xytext=(-3, 4), textcoords="offset points", rotation=90, ha="right", va="bottom", fontsize=6.8,
                    bbox=_CLEAR)
        ax.plot(list(speeds), list(envelope), color=INK, linewidth=2.0, zorder=4)
        _points(ax, points, (x_max, y_max), (frame.width, frame.height))
        key_lines = [Line("tractive effort envelope", 0.0)]
        _key(ax, key_lines, points, len(_key_labels(key_lines, points)))
        frame.label(f"ground speed v [{x_unit}]", f"tractive effort F [{y_unit}]")
        return frame.fig

    alt = (f"{title}. Envelope from {_num(envelope[0] if envelope else 0.0)} {y_unit} at standstill to "
           f"{_num(envelope[-1] if envelope else 0.0)} {y_unit} at the {top_speed.label} {top_speed.value}; "
           f"{adhesion.label} {adhesion.value}; effort at the pressure limit {_num(relief[0] if relief else 0.0)} "
           f"{y_unit} at standstill. Duty points: {_point_text(points, x_unit, y_unit) or 'none'}.")
    return Chart(fig_id, _draw(fig_id, build), alt)
