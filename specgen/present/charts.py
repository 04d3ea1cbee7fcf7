"""The report's charts: matplotlib figures drawn as SVG for inline use, from plain numbers.

Every function takes numbers already in the display units (the report works them out of the
Results) and returns a Chart: the SVG markup and a text alternative that states the key numbers.
The charts read in greyscale print: series differ by line style, marker, hatch and a direct label,
never by colour alone.

Determinism: the SVG hash salt is fixed, the metadata carries no date or creator, and every id in
an SVG is prefixed with the figure's own id, so several charts inline in one page keep unique ids
and the same input gives the same bytes.
"""

from __future__ import annotations

import io
import re
from dataclasses import dataclass
from typing import Sequence

from specgen.units import significant

# Plain engineering-document greys; hatches carry the distinction in print.
INK = "#000000"
GREYS = ("#ffffff", "#d0d0d0", "#f2f2f2", "#a8a8a8", "#e4e4e4", "#bcbcbc", "#8c8c8c")
HATCHES = ("", "///", "...", "xx", "\\\\\\", "++", "oo", "--", "||")
WIDTH_IN = 6.4  # fits the text width of A4 and Letter with 18 mm margins
HEIGHT_IN = 3.3

STYLE = {
    "svg.hashsalt": "specgen-report",
    # Text stays text: searchable, selectable and half the size of glyph paths. Layout is measured
    # with DejaVu Sans; Verdana, drawn to nearly the same widths, stands in where it is missing.
    "svg.fonttype": "none",
    "font.family": "sans-serif",
    "font.sans-serif": ["DejaVu Sans", "Verdana", "Bitstream Vera Sans", "Arial", "Helvetica"],
    "text.parse_math": False,  # a "$" in a drive title is text, not mathematics
    "font.size": 7.5,
    "axes.titlesize": 8.5,
    "axes.labelsize": 7.5,
    "axes.edgecolor": INK,
    "axes.linewidth": 0.6,
    "axes.grid": True,
    "grid.color": "#c8c8c8",
    "grid.linewidth": 0.4,
    "grid.linestyle": "-",
    "xtick.labelsize": 7,
    "ytick.labelsize": 7,
    "legend.fontsize": 7,
    "legend.frameon": False,
    "hatch.linewidth": 0.5,
    "hatch.color": INK,
}


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


def _new_figure(height_in: float = HEIGHT_IN):
    from matplotlib.figure import Figure

    return Figure(figsize=(WIDTH_IN, height_in), layout="constrained")


_ID = re.compile(r'\bid="([^"]+)"')
_HREF = re.compile(r'href="#([^"]+)"')
_URL = re.compile(r"url\(#([^)]+)\)")


def _inline_svg(fig, fig_id: str) -> str:
    """Render ``fig`` to SVG markup for inline use with every internal id prefixed by ``fig_id``."""
    import matplotlib

    buf = io.StringIO()
    with matplotlib.rc_context({**STYLE, "svg.id": fig_id}):
        fig.savefig(buf, format="svg", metadata={"Date": None, "Creator": None})
    svg = buf.getvalue()
    svg = svg[svg.index("<svg"):]  # drop the XML declaration and DOCTYPE: not allowed inline in HTML
    svg = _ID.sub(lambda m: m.group(0) if m.group(1) == fig_id else f'id="{fig_id}-{m.group(1)}"', svg)
    svg = _HREF.sub(lambda m: f'href="#{fig_id}-{m.group(1)}"', svg)
    svg = _URL.sub(lambda m: f"url(#{fig_id}-{m.group(1)})", svg)
    # Scales with the page; the figure's text alternative is the paragraph with id "<fig_id>-alt".
    return svg.replace(f'id="{fig_id}"', f'id="{fig_id}" role="img" aria-labelledby="{fig_id}-alt"', 1)


def _draw(fig_id: str, height_in: float, paint) -> str:
    import matplotlib

    with matplotlib.rc_context(STYLE):
        fig = _new_figure(height_in)
        paint(fig)
        return _inline_svg(fig, fig_id)


def _merge_limits(limits: Sequence[Limit], span: float) -> list[tuple[float, str, str]]:
    """Limits that fall (almost) on one spot share one label so their texts do not overprint:
    "relief setting = continuous rating 280.0 bar" when the values agree."""
    groups: list[list[Limit]] = []
    for lim in sorted(limits, key=lambda x: x.at):
        if groups and abs(lim.at - groups[-1][0].at) <= 0.025 * span:
            groups[-1].append(lim)
        else:
            groups.append([lim])
    out = []
    for g in groups:
        if len({lim.value for lim in g}) == 1:
            text = " = ".join(lim.label for lim in g) + f" {g[0].value}"
        else:  # close but different: one line of text each, side by side
            text = "\n".join(f"{lim.label} {lim.value}" for lim in g)
        out.append((g[0].at, g[0].style, text))
    return out


def _points(ax, points: Sequence[Point], span: tuple[float, float]) -> None:
    """Duty points with their names; points that fall on one spot share one label."""
    groups: list[list[Point]] = []
    for p in points:
        near = next((g for g in groups if abs(g[0].x - p.x) <= 0.01 * span[0] and abs(g[0].y - p.y) <= 0.01 * span[1]),
                    None)
        if near is None:
            groups.append([p])
        else:
            near.append(p)
    for p in points:
        if p.overrunning:
            ax.plot([p.x], [p.y], linestyle="none", marker="s", markersize=5, markerfacecolor="white",
                    markeredgecolor=INK, markeredgewidth=1.0, zorder=5)
        else:
            ax.plot([p.x], [p.y], linestyle="none", marker="o", markersize=4.5, color=INK, zorder=5)
    for k, g in enumerate(groups):
        # The lines through the points rise to the right: labels above-left or below-right of a point
        # stay clear of them; alternate the two so neighbouring points keep readable labels.
        dx, dy, ha, va = (-5, 4, "right", "bottom") if k % 2 == 0 else (5, -4, "left", "top")
        ax.annotate(", ".join(p.label for p in g), (g[0].x, g[0].y), xytext=(dx, dy), textcoords="offset points",
                    ha=ha, va=va, fontsize=7, zorder=6, bbox=_CLEAR)


def _key(ax, line_label: str, points: Sequence[Point]) -> None:
    """A small key for what is not labelled on the chart itself: the line and the point shapes."""
    from matplotlib.lines import Line2D

    handles = [Line2D([], [], color=INK, linewidth=1.4, label=line_label),
               Line2D([], [], color=INK, marker="o", markersize=4.5, linestyle="none", label="driving duty point")]
    if any(p.overrunning for p in points):
        handles.append(Line2D([], [], marker="s", markersize=5, markerfacecolor="white", markeredgecolor=INK,
                              linestyle="none", label="overrunning duty point"))
    ax.figure.legend(handles=handles, loc="outside lower center", ncol=len(handles))


def _vertical_limits(ax, limits: Sequence[Limit], span: float) -> None:
    # Labels stand at the foot of their line: the displacement line runs high on the right.
    for at, style, text in _merge_limits(limits, span):
        ax.axvline(at, color=INK, linewidth=1.0, linestyle=LIMIT_STYLES[style], zorder=3)
        ax.annotate(text, (at, 0.0), xycoords=("data", "axes fraction"), xytext=(-3, 4),
                    textcoords="offset points", rotation=90, ha="right", va="bottom", fontsize=6.8, bbox=_CLEAR)


def _horizontal_limits(ax, limits: Sequence[Limit], span: float) -> None:
    # An upper limit is labelled at the left, where the speed line is low; a lower one at the right.
    for at, style, text in _merge_limits(limits, span):
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
    widths = (1.4, 0.9, 2.0, 0.6)
    for k, line in enumerate(lines):
        ax.plot([0, x_max], [0, line.slope * x_max], color=INK, linewidth=widths[k % len(widths)], zorder=4)
        if len(lines) > 1:  # several displacements: each line named where it leaves the chart
            ax.annotate(line.label, (x_max, line.slope * x_max), xytext=(-3, 2), textcoords="offset points",
                        ha="right", va="bottom", fontsize=6.5, bbox=_CLEAR, annotation_clip=True)


def _line_text(lines: Sequence[Line], x_unit: str, y_unit: str) -> str:
    return "; ".join(f"{line.label}: {_num(line.slope)} {y_unit} per {x_unit}" for line in lines)


def _line_chart(fig_id: str, title: str, *, x_label: str, y_label: str, x_max: float, y_max: float,
                lines: Sequence[Line], points: Sequence[Point], paint_limits) -> str:
    def paint(fig):
        ax = fig.subplots()
        _lines(ax, lines, x_max)
        paint_limits(ax)
        _points(ax, points, (x_max, y_max))
        _key(ax, lines[0].label if len(lines) == 1 else "constant displacement (named at the right)", points)
        ax.set_xlim(0, x_max)
        ax.set_ylim(0, y_max)
        ax.set_xlabel(x_label)
        ax.set_ylabel(y_label)
        ax.set_title(title, loc="left")

    return _draw(fig_id, HEIGHT_IN, paint)


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


def _mode_axes(ax, title: str, modes: Sequence[str], y_max: float, y_label: str) -> None:
    ax.set_xticks(list(range(len(modes))), list(modes))
    ax.set_xlim(-0.6, len(modes) - 0.4)
    ax.set_ylim(0, y_max)
    ax.set_xlabel("operating mode")
    ax.set_ylabel(y_label)
    ax.set_title(title, loc="left")


def flow_by_mode(fig_id: str, title: str, *, unit: str, modes: Sequence[str], drives: Sequence[str],
                 flows: Sequence[Sequence[float]], delivery: float, statuses: Sequence[str] | None = None) -> Chart:
    """Summed flow demand per operating mode, stacked by drive (``flows[mode][drive]``), against the
    pump delivery drawn as a dashed line. Each drive has its own hatch and grey and a label."""
    totals = [sum(row) for row in flows]
    y_max = 1.18 * max(totals + [delivery, 1e-9])
    statuses = list(statuses) if statuses else [None] * len(modes)

    def paint(fig):
        ax = fig.subplots()
        ax.grid(axis="x", visible=False)
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
        _supply_line(ax, delivery, f"pump delivery {_num(delivery)} {unit}")
        _mode_axes(ax, title, modes, y_max, f"flow demand q [{unit}]")
        ax.legend(loc="upper left", bbox_to_anchor=(1.0, 1.0), title="drive", title_fontsize=7, handlelength=2.2,
                  handleheight=1.4)

    parts = []
    for mode, row, total, status in zip(modes, flows, totals, statuses):
        share = ", ".join(f"{d} {_num(q)}" for d, q in zip(drives, row) if q)
        parts.append(f"{mode}: {_num(total)} {unit}{_status_suffix(status).lower()} ({share})")
    alt = f"{title}. Pump delivery {_num(delivery)} {unit}. Demand by mode: " + "; ".join(parts) + "."
    return Chart(fig_id, _draw(fig_id, HEIGHT_IN, paint), alt)


def power_by_mode(fig_id: str, title: str, *, unit: str, modes: Sequence[str], power: Sequence[float],
                  available: float | None, statuses: Sequence[str] | None = None) -> Chart:
    """Pump input power per operating mode as bars, against the prime mover's power (dashed line)."""
    y_max = 1.18 * max(list(power) + [available or 0.0, 1e-9])
    statuses = list(statuses) if statuses else [None] * len(modes)

    def paint(fig):
        ax = fig.subplots()
        ax.grid(axis="x", visible=False)
        xs = range(len(modes))
        ax.bar(xs, power, 0.55, color=GREYS[1], hatch="///", edgecolor=INK, linewidth=0.6, zorder=3)
        _bar_tops(ax, xs, power, statuses)
        if available is not None:
            _supply_line(ax, available, f"prime mover {_num(available)} {unit}")
        _mode_axes(ax, title, modes, y_max, f"pump input power P_in [{unit}]")

    have = f"Prime mover {_num(available)} {unit}" if available is not None else "No prime mover power given"
    parts = "; ".join(f"{m}: {_num(p)} {unit}{_status_suffix(s).lower()}" for m, p, s in zip(modes, power, statuses))
    return Chart(fig_id, _draw(fig_id, HEIGHT_IN, paint), f"{title}. {have}. Pump input power by mode: {parts}.")


MARGIN_CLIP = 1.0  # margins beyond 100 % of the limit are drawn at 100 % and labelled with their value
_MARGIN_LOOK = {"fail": (GREYS[6], "xxxx"), "warn": (GREYS[1], "////"), "pass": (GREYS[2], "")}


def margin_overview(fig_id: str, title: str, rows: Sequence[MarginRow]) -> Chart:
    """Every margin as a horizontal bar in percent of its limit, smallest first, so crossed limits
    (left of the zero line) and warnings sit at the top; each bar carries its value and status."""
    ordered = sorted(rows, key=lambda r: (r.margin, r.label))
    height = 0.9 + 0.17 * max(len(ordered), 3)
    x_min = min([-0.1] + [1.15 * r.margin for r in ordered])

    def paint(fig):
        ax = fig.subplots()
        ax.grid(axis="y", visible=False)
        ys = list(range(len(ordered)))
        shown = [min(r.margin, MARGIN_CLIP) * 100 for r in ordered]
        for y, r, w in zip(ys, ordered, shown):
            face, hatch = _MARGIN_LOOK[r.status]
            ax.barh(y, w, 0.7, color=face, hatch=hatch, edgecolor=INK, linewidth=0.5, zorder=3)
            if r.warn is not None:
                ax.plot([r.warn * 100], [y], marker="|", markersize=8, color=INK, markeredgewidth=1.0, zorder=4)
            text = f"{'> ' if r.margin > MARGIN_CLIP else ''}{_num(r.margin * 100)} %{_status_suffix(r.status)}"
            inside = w > 62
            clear = max(w, 0, (r.warn or 0) * 100 + 0.8)  # start right of the bar and of the warning tick
            ax.text(w - 1 if inside else clear + 2, y, text, va="center", ha="right" if inside else "left",
                    fontsize=6.5, fontweight="bold" if r.status != "pass" else "normal", zorder=5,
                    bbox=_CLEAR if inside else None)
        ax.axvline(0, color=INK, linewidth=1.2, zorder=4)
        ax.set_yticks(ys, [r.label for r in ordered])
        ax.set_ylim(len(ordered) - 0.4, -0.6)  # smallest margin at the top
        ax.set_xlim(x_min * 100, MARGIN_CLIP * 100 + 12)
        ax.set_xlabel("margin to the limit [% of the limit]")
        ax.set_title(title, loc="left")

    worst = ordered[:5]
    alt = (f"{title}. {len(ordered)} margins, "
           f"{sum(r.status == 'fail' for r in ordered)} crossed and {sum(r.status == 'warn' for r in ordered)} "
           f"within the warning level. Smallest: "
           + "; ".join(f"{r.label} {_num(r.margin * 100)} % ({r.status})" for r in worst) + ".")
    return Chart(fig_id, _draw(fig_id, height, paint), alt)
