"""The report's charts: matplotlib figures drawn as SVG for inline use, from plain numbers.

Every function takes numbers already in the display units (the report works them out of the
Results) and returns a Chart: the SVG markup and a text alternative that states the key numbers.
The charts read in greyscale print: series differ by line style, marker, hatch and a direct label,
never by colour alone.

Determinism: the SVG hash salt is fixed, the metadata carries no date or creator, and every id in
an SVG is prefixed with the figure's own id, so several charts inline in one page keep unique ids
and the same input gives the same bytes.

Style, margins, text measurement and ticks are in chart_frame.py.
"""

from __future__ import annotations

import io
import re
from dataclasses import dataclass
from typing import Sequence

from specgen.present.chart_frame import (EDGE, GREYS, HALF_HEIGHT_IN, HALF_WIDTH_IN, HATCHES, INK, KEY_ROW,
                                         LABEL, STYLE, TICK, TICK_TEXT, TITLE, WIDTH_IN, Frame, left_margin, new_frame,
                                         text_width, ticks, wrap)
from specgen.units import significant


@dataclass(frozen=True)
class Chart:
    id: str
    svg: str  # inline SVG markup (no XML declaration)
    alt: str  # text alternative stating the key numbers


@dataclass(frozen=True)
class Point:
    """A duty point on a chart. ``overrunning`` points get an open square instead of a dot."""

    label: str
    x: float
    y: float
    overrunning: bool = False


@dataclass(frozen=True)
class Limit:
    """A limit line at ``at`` (chart units), named ``label`` and stating ``value`` (the limit as
    entered, with its unit); ``style`` is one of LIMIT_STYLES."""

    label: str
    value: str
    at: float
    style: str


LIMIT_STYLES = {"relief": (0, (6, 2)), "compensator": (0, (3, 1.5)), "continuous": (0, (6, 2, 1.5, 2)),
                "peak": (0, (1.2, 1.6)),
                "max": (0, (6, 2)), "min": (0, (1.2, 1.6))}


@dataclass(frozen=True)
class MarginRow:
    """One margin on the overview: ``margin`` as a fraction of its limit (negative: limit crossed)."""

    label: str
    margin: float
    status: str  # "pass", "warn" or "fail"
    warn: float | None = None  # the warning threshold for this kind of margin, as a fraction


_CLEAR = {"boxstyle": "square,pad=0.1", "facecolor": "white", "edgecolor": "none"}


def _num(x: float) -> str:
    return significant(x)




_ID = re.compile(r'\bid="([^"]+)"')
_HREF = re.compile(r'href="#([^"]+)"')
_URL = re.compile(r"url\(#([^)]+)\)")


def _svg(fig, fig_id: str) -> str:
    """Render ``fig`` to SVG markup for inline use with every internal id prefixed by ``fig_id``."""
    from matplotlib.backends.backend_svg import FigureCanvasSVG

    buf = io.StringIO()
    # The SVG canvas itself, not savefig: no pyplot state, no second drawing pass for a layout engine.
    FigureCanvasSVG(fig).print_svg(buf, metadata={"Date": None, "Creator": None})
    svg = buf.getvalue()
    svg = svg[svg.index("<svg"):]  # drop the XML declaration and DOCTYPE: not allowed inline in HTML
    svg = _ID.sub(lambda m: m.group(0) if m.group(1) == fig_id else f'id="{fig_id}-{m.group(1)}"', svg)
    svg = _HREF.sub(lambda m: f'href="#{fig_id}-{m.group(1)}"', svg)
    svg = _URL.sub(lambda m: f"url(#{fig_id}-{m.group(1)})", svg)
    # Scales with the page; the figure's text alternative is the paragraph with id "<fig_id>-alt".
    return svg.replace(f'id="{fig_id}"', f'id="{fig_id}" role="img" aria-labelledby="{fig_id}-alt"', 1)


def prepare() -> None:
    """Import the drawing modules and find the fonts now, so that processes forked from this one
    to draw charts start with them (specgen/present/chart_batch.py)."""
    import matplotlib.backends.backend_svg  # noqa: F401
    import matplotlib.figure  # noqa: F401

    for bold in (False, True):
        text_width("0", 7.0, bold)


def _draw(fig_id: str, build) -> str:
    """The SVG of the figure ``build()`` returns, built and drawn in the report's style."""
    import matplotlib

    with matplotlib.rc_context({**STYLE, "svg.id": fig_id}):
        return _svg(build(), fig_id)


LIMIT_TEXT_GAP = 10.0  # points between two limit lines for their labels to stand apart


def _merge_limits(limits: Sequence[Limit], span: float, axis_pt: float = 0.0) -> list[tuple[float, str, str]]:
    """Limits that fall (almost) on one spot share one label so their texts do not overprint:
    "relief setting = continuous rating 280.0 bar" when the values agree. ``axis_pt``, the length
    of the axis in points: lines closer than LIMIT_TEXT_GAP on it count as one spot."""
    near = max(0.025, LIMIT_TEXT_GAP / axis_pt if axis_pt else 0.0)
    groups: list[list[Limit]] = []
    for lim in sorted(limits, key=lambda x: x.at):
        # a group's label is a line of text a distinct value: the next line must clear all of them
        lines = len({x.value for x in groups[-1]}) if groups else 1
        if groups and abs(lim.at - groups[-1][0].at) <= near * lines * span:
            groups[-1].append(lim)
        else:
            groups.append([lim])
    out = []
    for g in groups:
        if len({lim.value for lim in g}) == 1:
            text = " = ".join(lim.label for lim in g) + f" {g[0].value}"
        else:  # close but different: one line of text a value, side by side
            values = list(dict.fromkeys(lim.value for lim in g))
            text = "\n".join(" = ".join(lim.label for lim in g if lim.value == v) + f" {v}" for v in values)
        out.append((g[0].at, g[0].style, text))
    return out


def _points(ax, points: Sequence[Point], span: tuple[float, float], size_pt: tuple[float, float]) -> None:
    """Duty points with their names; points that fall on one spot share one label. ``size_pt`` is
    the axes' width and height, to see which names would run out of the axes."""
    groups: list[list[Point]] = []
    for p in points:
        near = next((g for g in groups if abs(g[0].x - p.x) <= 0.01 * span[0] and abs(g[0].y - p.y) <= 0.01 * span[1]),
                    None)
        if near is None:
            groups.append([p])
        else:
            near.append(p)
    for overrunning, look in ((False, {"marker": "o", "markersize": 4.5, "color": INK}),
                              (True, {"marker": "s", "markersize": 5, "markerfacecolor": "white",
                                      "markeredgecolor": INK, "markeredgewidth": 1.0})):
        shown = [p for p in points if p.overrunning == overrunning]
        if shown:  # one line artist of markers for each shape, not one for each point
            ax.plot([p.x for p in shown], [p.y for p in shown], linestyle="none", zorder=5, **look)
    for k, g in enumerate(groups):
        # The lines through the points rise to the right: labels above-left or below-right of a point
        # stay clear of them; alternate the two so neighbouring points keep readable labels. A label
        # with no room on its side of the point goes to the other side (the one with more room if
        # neither has enough), and a label set right of a point at the foot of the axes goes level
        # with it, clear of the x axis' tick labels.
        text = ", ".join(p.label for p in g)
        x_pt, need = g[0].x / span[0] * size_pt[0], text_width(text) + 8
        fits = {False: x_pt >= need, True: size_pt[0] - x_pt >= need}  # by side: right?
        right = k % 2 == 1
        if not fits[right]:
            right = not right if fits[not right] else size_pt[0] - x_pt > x_pt
        dx, dy, ha, va = (5, -4, "left", "top") if right else (-5, 4, "right", "bottom")
        if right and g[0].y / span[1] * size_pt[1] < 12:
            dx, dy, va = 6, 0, "center"
        ax.annotate(text, (g[0].x, g[0].y), xytext=(dx, dy), textcoords="offset points",
                    ha=ha, va=va, fontsize=7, zorder=6, bbox=_CLEAR)


LINE_WIDTHS = (1.4, 0.7, 2.2, 0.45)  # one displacement's line from the next, in the key too


def _key_labels(lines: Sequence[Line], points: Sequence[Point]) -> list[str]:
    labels = [line.label for line in lines] + ["driving duty point"]
    return labels + ["overrunning duty point"] if any(p.overrunning for p in points) else labels


KEY_ITEM = 7 * (2.0 + 0.8 + 2.0)  # a key entry's handle, its pad and the gap to the next, in points
KEY_LINE = 7 * 1.25 + 7 * 0.5  # one more row of the key


def _key_columns(labels: Sequence[str], width_pt: float) -> int:
    """As many key entries a row as fit the figure's width (all in one row where they fit)."""
    for ncol in range(len(labels), 0, -1):
        rows = [labels[k:k + ncol] for k in range(0, len(labels), ncol)]
        if max(sum(text_width(t) + KEY_ITEM for t in row) for row in rows) <= width_pt - 2 * EDGE:
            return ncol
    return 1


def _key(ax, lines: Sequence[Line], points: Sequence[Point], ncol: int) -> None:
    """A small key for what is not labelled on the chart itself: each displacement's line (told
    apart by its weight) and the point shapes."""
    from matplotlib.lines import Line2D

    handles = [Line2D([], [], color=INK, linewidth=LINE_WIDTHS[k % len(LINE_WIDTHS)], label=line.label)
               for k, line in enumerate(lines)]
    handles.append(Line2D([], [], color=INK, marker="o", markersize=4.5, linestyle="none",
                          label="driving duty point"))
    if any(p.overrunning for p in points):
        handles.append(Line2D([], [], marker="s", markersize=5, markerfacecolor="white", markeredgecolor=INK,
                              linestyle="none", label="overrunning duty point"))
    # At the foot of the figure, in the rows the margins keep for it (KEY_ROW, KEY_LINE a row more).
    ax.figure.legend(handles=handles, loc="lower center", bbox_to_anchor=(0.5, 0.0), ncol=ncol)


def _vertical_limits(ax, limits: Sequence[Limit], span: float) -> None:
    # Labels stand at the foot of their line: the displacement line runs high on the right.
    width_pt = ax.get_position().width * ax.figure.get_figwidth() * 72
    height_pt = ax.get_position().height * ax.figure.get_figheight() * 72
    for at, style, text in _merge_limits(limits, span, width_pt):
        ax.axvline(at, color=INK, linewidth=1.0, linestyle=LIMIT_STYLES[style], zorder=3)
        # a label up its line stays inside the axes: set smaller (down to 5 pt) where it is long
        longest = max(text_width(line, 6.8) for line in text.split("\n"))
        size = max(5.0, min(6.8, 6.8 * (height_pt - 8) / longest)) if longest else 6.8
        ax.annotate(text, (at, 0.0), xycoords=("data", "axes fraction"), xytext=(-3, 4),
                    textcoords="offset points", rotation=90, ha="right", va="bottom", fontsize=size, bbox=_CLEAR)


def _horizontal_limits(ax, limits: Sequence[Limit], span: float) -> None:
    # An upper limit is labelled at the left, where the speed line is low; a lower one at the right.
    height_pt = ax.get_position().height * ax.figure.get_figheight() * 72
    for at, style, text in _merge_limits(limits, span, height_pt):
        ax.axhline(at, color=INK, linewidth=1.0, linestyle=LIMIT_STYLES[style], zorder=3)
        left = style != "min"
        ax.annotate(text, (0.0 if left else 1.0, at), xycoords=("axes fraction", "data"),
                    xytext=(4 if left else -4, 2), textcoords="offset points", ha="left" if left else "right",
                    va="bottom", fontsize=6.8, bbox=_CLEAR)


def _point_text(points: Sequence[Point], x_unit: str, y_unit: str) -> str:
    return "; ".join(f"{p.label}{' (overrunning)' if p.overrunning else ''} at {_num(p.x)} {x_unit}, "
                     f"{_num(p.y)} {y_unit}" for p in points)


def _limit_text(limits: Sequence[Limit], unit: str) -> str:
    return "; ".join(f"{lim.label} {lim.value} at {_num(lim.at)} {unit}" for lim in limits)


@dataclass(frozen=True)
class Line:
    """A straight line through the origin, ``y = slope * x``, for one displacement, labelled."""

    label: str
    slope: float


def _lines(ax, lines: Sequence[Line], x_max: float) -> None:
    """One line a displacement; the key names each by its weight (at the right edge, where the
    lines leave the chart, the limit labels stand)."""
    for k, line in enumerate(lines):
        ax.plot([0, x_max], [0, line.slope * x_max], color=INK, linewidth=LINE_WIDTHS[k % len(LINE_WIDTHS)],
                zorder=4)


def _line_text(lines: Sequence[Line], x_unit: str, y_unit: str) -> str:
    return "; ".join(f"{line.label}: {_num(line.slope)} {y_unit} per {x_unit}" for line in lines)


def _numeric_frame(height_in: float, title: str, x_range: tuple[float, float], y_range: tuple[float, float],
                   bottom: float, width_in: float = WIDTH_IN) -> Frame:
    """A frame whose margins hold the tick labels it will carry, with those ticks set."""
    y_vals, y_labels = ticks(*y_range, height_in * 72 - bottom - TITLE, 7 * 2)
    left = left_margin(y_labels)
    x_vals, x_labels = ticks(*x_range, width_in * 72 - left - EDGE, 7 * 3)
    right = max(EDGE, text_width(x_labels[-1]) / 2 + 1) if x_labels else EDGE  # the last label's overhang
    frame = new_frame(height_in, title, left, bottom, right, width_in)
    frame.ax.set_yticks(y_vals, y_labels)
    frame.ax.set_xticks(x_vals, x_labels)
    frame.ax.set_xlim(*x_range)
    frame.ax.set_ylim(*y_range)
    return frame


def _line_chart(fig_id: str, title: str, *, x_label: str, y_label: str, x_max: float, y_max: float,
                lines: Sequence[Line], points: Sequence[Point], paint_limits) -> str:
    """A drive's line chart, drawn half the text width wide: two stand side by side on the page."""
    labels = _key_labels(lines, points)
    ncol = _key_columns(labels, HALF_WIDTH_IN * 72)
    key = KEY_ROW + KEY_LINE * (-(-len(labels) // ncol) - 1)

    def build():
        frame = _numeric_frame(HALF_HEIGHT_IN, title, (0, x_max), (0, y_max), key + TICK + TICK_TEXT + LABEL,
                               HALF_WIDTH_IN)
        ax = frame.ax
        _lines(ax, lines, x_max)
        paint_limits(ax)
        _points(ax, points, (x_max, y_max), (frame.width, frame.height))
        _key(ax, lines, points, ncol)
        frame.label(x_label, y_label)
        return frame.fig

    return _draw(fig_id, build)


def torque_vs_pressure(fig_id: str, title: str, *, x_unit: str, y_unit: str, lines: Sequence[Line],
                       points: Sequence[Point], limits: Sequence[Limit]) -> Chart:
    """Motor torque against pressure differential: a straight line ``T = slope * dp`` for each
    displacement the duty points use, the duty points, and the pressure limits (relief setting,
    continuous and peak ratings, less the back pressure) as vertical lines.

    Example: slope 12.27 (N*m per bar: Vg 820 cm^3/rev at eta_hm 0.94) passes 200 bar at 2454 N*m.
    """
    xs = [p.x for p in points] + [lim.at for lim in limits]
    x_max = 1.1 * max(xs + [1e-9])
    y_max = 1.12 * max([ln.slope * x_max for ln in lines] + [p.y for p in points] + [1e-9])
    svg = _line_chart(fig_id, title, x_label=f"pressure differential dp [{x_unit}]",
                      y_label=f"motor torque T [{y_unit}]", x_max=x_max, y_max=y_max, lines=lines, points=points,
                      paint_limits=lambda ax: _vertical_limits(ax, limits, x_max))
    alt = (f"{title}. Lines: {_line_text(lines, x_unit, y_unit)}. Duty points: {_point_text(points, x_unit, y_unit)}. "
           f"Limits as pressure differential: {_limit_text(limits, x_unit)}.")
    return Chart(fig_id, svg, alt)


def speed_vs_flow(fig_id: str, title: str, *, x_unit: str, y_unit: str, lines: Sequence[Line],
                  points: Sequence[Point], limits: Sequence[Limit]) -> Chart:
    """Motor speed against flow: a line ``n = slope * q`` for each displacement the duty points
    use, the duty points, and the minimum and maximum speed ratings as horizontal lines.

    Example: slope 1.171 (rpm per L/min: Vg 820 cm^3/rev at eta_v 0.96) passes 20.5 L/min at 24 rpm.
    """
    x_max = 1.15 * max([p.x for p in points] + [1e-9])
    ys = [p.y for p in points] + [lim.at for lim in limits] + [ln.slope * x_max for ln in lines]
    y_max = 1.1 * max(ys + [1e-9])
    svg = _line_chart(fig_id, title, x_label=f"flow to motor q [{x_unit}]", y_label=f"motor speed n [{y_unit}]",
                      x_max=x_max, y_max=y_max, lines=lines, points=points,
                      paint_limits=lambda ax: _horizontal_limits(ax, limits, y_max))
    alt = (f"{title}. Lines: {_line_text(lines, x_unit, y_unit)}. Duty points: {_point_text(points, x_unit, y_unit)}. "
           f"Speed limits: {_limit_text(limits, y_unit) or 'none given'}.")
    return Chart(fig_id, svg, alt)


def _status_suffix(status: str | None) -> str:
    return {"fail": " FAIL", "warn": " WARN"}.get(status or "", "")


def _bar_tops(ax, xs, heights, statuses) -> None:
    """Each bar's value on its top, with WARN or FAIL beside it in bold where the check says so."""
    for x, h, status in zip(xs, heights, statuses):
        ax.text(x, h, f"{_num(h)}{_status_suffix(status)}", ha="center", va="bottom", fontsize=7,
                fontweight="bold" if status in ("warn", "fail") else "normal", zorder=6, bbox=_CLEAR)


def _supply_line(ax, at: float, text: str) -> None:
    """What the supply can give (pump delivery, prime mover power): a dashed line named at the right."""
    ax.axhline(at, color=INK, linewidth=1.1, linestyle=LIMIT_STYLES["relief"], zorder=4)
    ax.annotate(text, (1.0, at), xycoords=("axes fraction", "data"), xytext=(-3, 2), textcoords="offset points",
                ha="right", va="bottom", fontsize=7, bbox=_CLEAR)


BAR_HEIGHT_IN = 2.2  # a supply's bars by mode: a few bars need less height than a line chart


def _mode_axes(title: str, modes: Sequence[str], y_max: float, y_label: str, right_pt: float = 0.0,
               y_min: float = 0.0):
    """Axes for bars by operating mode, ``right_pt`` of room kept at the right for a key; ``y_min``
    below zero for a bar that is negative (a pump driven by its load)."""
    h_pt = BAR_HEIGHT_IN * 72
    bottom = TICK + TICK_TEXT + LABEL
    y_vals, y_labels = ticks(y_min, y_max, h_pt - bottom - TITLE, 7 * 2)
    frame = new_frame(BAR_HEIGHT_IN, title, left_margin(y_labels), bottom, EDGE + right_pt)
    ax = frame.ax
    ax.grid(axis="x", visible=False)
    ax.set_yticks(y_vals, y_labels)
    ax.set_xticks(list(range(len(modes))), list(modes))
    ax.set_xlim(-0.6, len(modes) - 0.4)
    ax.set_ylim(y_min, y_max)
    frame.label("operating mode", y_label)
    return ax


def flow_by_mode(fig_id: str, title: str, *, unit: str, modes: Sequence[str], drives: Sequence[str],
                 flows: Sequence[Sequence[float]], delivery: float | Sequence[float],
                 statuses: Sequence[str] | None = None) -> Chart:
    """Summed flow demand per operating mode, stacked by drive (``flows[mode][drive]``), against the
    pump delivery drawn as a dashed line. Each drive has its own hatch and grey and a label.

    ``delivery`` a list (one a mode) when the pump's speed belongs to the mode (a shared prime mover at
    a named speed): then each mode's delivery is a dashed stroke over its own bar."""
    totals = [sum(row) for row in flows]
    per_mode = not isinstance(delivery, (int, float))
    if per_mode and len(set(delivery)) == 1:
        delivery, per_mode = delivery[0], False
    y_max = 1.18 * max(totals + (list(delivery) if per_mode else [delivery]) + [1e-9])
    statuses = list(statuses) if statuses else [None] * len(modes)

    # The key of drives stands right of the axes: border pads, hatch swatch, its gap, the widest name.
    key_pt = 7 * (0.5 + 2 * 0.4 + 2.2 + 0.8) + max([text_width(d) for d in drives] + [text_width("drive")])

    def build():
        ax = _mode_axes(title, modes, y_max, f"flow demand q [{unit}]", key_pt)
        xs = range(len(modes))
        bottoms = [0.0] * len(modes)
        for j, drive in enumerate(drives):
            heights = [row[j] for row in flows]
            bars = ax.bar(xs, heights, 0.6, bottom=bottoms, color=GREYS[j % len(GREYS)],
                          hatch=HATCHES[j % len(HATCHES)], edgecolor=INK, linewidth=0.6, label=drive, zorder=3)
            for bar, h, b in zip(bars, heights, bottoms):
                if h > 0.07 * y_max:
                    ax.text(bar.get_x() + bar.get_width() / 2, b + h / 2, drive, ha="center", va="center",
                            fontsize=6.5, zorder=5, bbox=_CLEAR)
            bottoms = [b + h for b, h in zip(bottoms, heights)]
        _bar_tops(ax, xs, totals, statuses)
        if per_mode:
            for x, q in zip(xs, delivery):
                ax.hlines(q, x - 0.4, x + 0.4, color=INK, linewidth=1.1, linestyle=LIMIT_STYLES["relief"], zorder=4)
            ax.annotate("dashed: pump delivery at the mode's speed", (1.0, 1.0), xycoords="axes fraction",
                        xytext=(-3, -9), textcoords="offset points", ha="right", va="top", fontsize=7, bbox=_CLEAR)
        else:
            _supply_line(ax, delivery, f"pump delivery {_num(delivery)} {unit}")
        ax.legend(loc="upper left", bbox_to_anchor=(1.0, 1.0), title="drive", title_fontsize=7, handlelength=2.2,
                  handleheight=1.4)
        return ax.figure

    parts = []
    for mode, row, total, status in zip(modes, flows, totals, statuses):
        share = ", ".join(f"{d} {_num(q)}" for d, q in zip(drives, row) if q)
        parts.append(f"{mode}: {_num(total)} {unit}{_status_suffix(status).lower()} ({share})")
    have = ("Pump delivery by mode: " + "; ".join(f"{m}: {_num(q)} {unit}" for m, q in zip(modes, delivery))
            if per_mode else f"Pump delivery {_num(delivery)} {unit}")
    alt = f"{title}. {have}. Demand by mode: " + "; ".join(parts) + "."
    return Chart(fig_id, _draw(fig_id, build), alt)


def power_by_mode(fig_id: str, title: str, *, unit: str, modes: Sequence[str], power: Sequence[float],
                  available: float | None, statuses: Sequence[str] | None = None, shared_by: str = "") -> Chart:
    """Pump input power per operating mode as bars, against the prime mover's power (dashed line)."""
    y_max = 1.18 * max(list(power) + [available or 0.0, 1e-9])
    y_min = 1.18 * min(list(power) + [0.0])  # below zero: the load drives the pump (closed loop, overrunning)
    statuses = list(statuses) if statuses else [None] * len(modes)

    def build():
        ax = _mode_axes(title, modes, y_max, f"pump input power P_in [{unit}]", y_min=y_min)
        xs = range(len(modes))
        ax.bar(xs, power, 0.55, color=GREYS[1], hatch="///", edgecolor=INK, linewidth=0.6, zorder=3)
        _bar_tops(ax, xs, power, statuses)
        if available is not None:
            _supply_line(ax, available, f"prime mover {_num(available)} {unit}")
        return ax.figure

    have = (f"Prime mover {_num(available)} {unit}" if available is not None else
            f"On the shared prime mover {shared_by}, checked with the other pumps on it" if shared_by else
            "No prime mover power given")
    parts = "; ".join(f"{m}: {_num(p)} {unit}{_status_suffix(s).lower()}" for m, p, s in zip(modes, power, statuses))
    return Chart(fig_id, _draw(fig_id, build), f"{title}. {have}. Pump input power by mode: {parts}.")


MARGIN_CLIP = 1.0  # margins beyond 100 % of the limit are drawn at 100 % and labelled with their value
MARGIN_NAMES = 0.55  # the most of the width the row names may take
_MARGIN_LOOK = {"fail": (GREYS[6], "xxxx"), "warn": (GREYS[1], "////"), "pass": (GREYS[2], "")}


def margin_overview(fig_id: str, title: str, rows: Sequence[MarginRow]) -> Chart:
    """Every margin as a horizontal bar in percent of its limit, smallest first, so crossed limits
    (left of the zero line) and warnings sit at the top; each bar carries its value and status."""
    ordered = sorted(rows, key=lambda r: (r.margin, r.label))
    w_pt = WIDTH_IN * 72
    # Row names may take MARGIN_NAMES of the width: longer ones are set smaller, down to 5.5 pt,
    # and what is still too long goes onto more lines, in taller rows.
    room = MARGIN_NAMES * w_pt - TICK - EDGE
    size = 7.0
    widest = max((text_width(r.label) for r in ordered), default=0.0)
    if widest > room:
        size = max(5.5, 7.0 * room / widest)
    names = [wrap(r.label, room, size) for r in ordered]
    lines = max([n.count("\n") + 1 for n in names] + [1])
    height = 0.9 + (0.13 + 0.1 * (lines - 1)) * max(len(ordered), 3)
    x_min = min([-0.1] + [1.15 * r.margin for r in ordered])

    x_range = (x_min * 100, MARGIN_CLIP * 100 + 12)
    shown = [min(r.margin, MARGIN_CLIP) * 100 for r in ordered]
    labels = [f"{'> ' if r.margin > MARGIN_CLIP else ''}{_num(r.margin * 100)} %{_status_suffix(r.status)}"
              for r in ordered]
    inside = [w > 62 for w in shown]
    starts = [max(w, 0, (r.warn or 0) * 100 + 0.8) + 2 for r, w in zip(ordered, shown)]  # right of bar and tick
    bottom = TICK + TICK_TEXT + LABEL
    left = TICK + max((text_width(n, size) for n in names), default=0.0) + EDGE
    # Values written right of their bar may run past the axes: keep room for the longest overhang.
    # A text starting at fraction f of the axes, t wide, fits when t <= (1 - f) * (w_pt - left - right) + right - EDGE.
    right = EDGE
    for r, text, start, ins in zip(ordered, labels, starts, inside):
        f = (start - x_range[0]) / (x_range[1] - x_range[0])
        if not ins and f > 0:
            t = text_width(text, 6.5, r.status != "pass")
            right = max(right, (t + EDGE - (1 - f) * (w_pt - left)) / f)

    def build():
        from matplotlib.transforms import offset_copy

        frame = new_frame(height, title, left, bottom, right)
        ax = frame.ax
        ax.grid(axis="y", visible=False)
        ys = list(range(len(ordered)))
        looks = [_MARGIN_LOOK[r.status] for r in ordered]
        # One call for all the bars, one line of markers for all the warning ticks.
        ax.barh(ys, shown, 0.7, color=[face for face, _ in looks], hatch=[hatch for _, hatch in looks],
                edgecolor=INK, linewidth=0.5, zorder=3)
        warned = [(r.warn * 100, y) for y, r in zip(ys, ordered) if r.warn is not None]
        if warned:
            ax.plot([x for x, _ in warned], [y for _, y in warned], linestyle="none", marker="|", markersize=8,
                    color=INK, markeredgewidth=1.0, zorder=4)
        for y, r, w, text, start, ins in zip(ys, ordered, shown, labels, starts, inside):
            ax.text(w - 1 if ins else start, y, text, va="center", ha="right" if ins else "left",
                    fontsize=6.5, fontweight="bold" if r.status != "pass" else "normal", zorder=5,
                    bbox=_CLEAR if ins else None)
        ax.axvline(0, color=INK, linewidth=1.2, zorder=4)
        # Row names as plain texts beside the axes (a tick for each row would cost five artists).
        beside = offset_copy(ax.get_yaxis_transform(), fig=frame.fig, x=-TICK, y=0.0, units="points")
        for y, name in zip(ys, names):
            ax.text(0.0, y, name, transform=beside, ha="right", va="center", fontsize=size, clip_on=False)
        ax.set_yticks([])
        ax.set_ylim(len(ordered) - 0.4, -0.6)  # smallest margin at the top
        ax.set_xticks(*ticks(*x_range, frame.width, 7 * 3))
        ax.set_xlim(*x_range)
        frame.label("margin to the limit [% of the limit]")
        return frame.fig

    worst = ordered[:5]
    alt = (f"{title}. {len(ordered)} margins, "
           f"{sum(r.status == 'fail' for r in ordered)} crossed and {sum(r.status == 'warn' for r in ordered)} "
           f"within the warning level. Smallest: "
           + "; ".join(f"{r.label} {_num(r.margin * 100)} % ({r.status})" for r in worst) + ".")
    return Chart(fig_id, _draw(fig_id, build), alt)


def oil_temperature_vs_time(fig_id: str, title: str, *, x_unit: str, y_unit: str, times: Sequence[float],
                            temperatures: Sequence[float], limit: Limit, steady: float) -> Chart:
    """Oil temperature against time over the repeated duty cycle, from ambient, with the limit line
    (dashed) and the steady temperature of the mean heat load (dotted). Numbers in display units."""
    hot = max(list(temperatures) + [limit.at, steady])
    cold = min(list(temperatures) + [0.0])
    y_range = (cold, hot + 0.15 * (hot - cold or 1.0))
    x_max = max(times[-1] if times else 0.0, 1e-9)

    def build():
        frame = _numeric_frame(BAR_HEIGHT_IN, title, (0, x_max), y_range, TICK + TICK_TEXT + LABEL)
        ax = frame.ax
        ax.plot(list(times), list(temperatures), color=INK, linewidth=1.2, zorder=4)
        _horizontal_limits(ax, [limit], y_range[1] - y_range[0])
        ax.axhline(steady, color=GREYS[4], linewidth=0.8, linestyle=LIMIT_STYLES["min"], zorder=2)
        ax.annotate(f"steady {_num(steady)} {y_unit}", (1.0, steady), xycoords=("axes fraction", "data"),
                    xytext=(-4, -3), textcoords="offset points", ha="right", va="top", fontsize=6.8, bbox=_CLEAR)
        frame.label(f"time t [{x_unit}]", f"oil temperature T [{y_unit}]")
        return frame.fig

    peak = max(temperatures) if temperatures else steady
    alt = (f"{title}. Oil temperature from {_num(temperatures[0] if temperatures else steady)} {y_unit} over "
           f"{_num(x_max)} {x_unit} of repeated cycles, peak {_num(peak)} {y_unit}; steady {_num(steady)} {y_unit}; "
           f"{limit.label} {limit.value}.")
    return Chart(fig_id, _draw(fig_id, build), alt)
