"""The tornado chart: how far each input moves one margin, for a step up and a step down.

One horizontal pair of bars per input, the input that moves the margin most at the top: the change
of the margin in percentage points when the input rises by the step (hatched bar) and when it falls
by the step (plain grey bar), both drawn from the zero line, so an input that helps the margin
when it rises points right with its hatched bar. Greys and hatches only; drawn like every report
chart (charts.py: fixed hash salt, ids prefixed with the figure's id, margins from measured text).

Example: a motor whose pressure margin is 6.1 % moves by +0.90 points for +1 % of its displacement
and by -0.92 points for -1 %: the displacement's row has a hatched bar to +0.90 and a grey one to -0.92.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

from specgen.present.chart_frame import EDGE, GREYS, INK, KEY_ROW, LABEL, TICK, TICK_TEXT, WIDTH_IN, new_frame, \
    text_width, ticks, wrap
from specgen.present.charts import Chart, _draw

NAMES = 0.5  # the most of the width the input names may take


@dataclass(frozen=True)
class TornadoRow:
    """One input: its name and the change of the margin (percentage points) for +step and -step
    (None where that step was refused or not computed)."""

    label: str
    up: float | None
    down: float | None


def tornado(fig_id: str, title: str, rows: Sequence[TornadoRow], step_text: str) -> Chart:
    """The rows in the order given (largest first), a pair of bars each; ``step_text`` e.g. "1 %"."""
    w_pt = WIDTH_IN * 72
    room = NAMES * w_pt - TICK - EDGE
    names = [wrap(r.label, room, 6.5) for r in rows]
    lines = sum(n.count("\n") + 1 for n in names)
    height = 0.95 + 0.09 * lines + 0.16 * max(len(rows), 2)
    values = [x for r in rows for x in (r.up, r.down) if x is not None]
    reach = max([abs(x) for x in values] + [1e-9]) * 1.3
    x_range = (-reach, reach)
    left = TICK + max((text_width(n, 6.5) for n in names), default=0.0) + EDGE
    bottom = KEY_ROW + TICK + TICK_TEXT + LABEL

    def build():
        from matplotlib.patches import Patch
        from matplotlib.transforms import offset_copy

        frame = new_frame(height, title, left, bottom, EDGE)
        ax = frame.ax
        ax.grid(axis="y", visible=False)
        ys = list(range(len(rows)))
        up = [(y - 0.18, r.up) for y, r in zip(ys, rows) if r.up is not None]
        down = [(y + 0.18, r.down) for y, r in zip(ys, rows) if r.down is not None]
        if up:
            ax.barh([y for y, _ in up], [x for _, x in up], 0.34, color=GREYS[0], hatch="////", edgecolor=INK,
                    linewidth=0.5, zorder=3)
        if down:
            ax.barh([y for y, _ in down], [x for _, x in down], 0.34, color=GREYS[3], edgecolor=INK,
                    linewidth=0.5, zorder=3)
        for y, x in up + down:  # each bar's value beyond its end
            ax.annotate(_signed(x), (x, y), xytext=(2 if x >= 0 else -2, 0), textcoords="offset points",
                        va="center", ha="left" if x >= 0 else "right", fontsize=6, zorder=5)
        ax.axvline(0, color=INK, linewidth=1.0, zorder=4)
        beside = offset_copy(ax.get_yaxis_transform(), fig=frame.fig, x=-TICK, y=0.0, units="points")
        for y, name in zip(ys, names):
            ax.text(0.0, y, name, transform=beside, ha="right", va="center", fontsize=6.5, clip_on=False)
        ax.set_yticks([])
        ax.set_ylim(len(rows) - 0.4, -0.6)
        ax.set_xticks(*ticks(*x_range, frame.width, 7 * 4))
        ax.set_xlim(*x_range)
        frame.label("change of the margin [percentage points]")
        handles = [Patch(facecolor=GREYS[0], hatch="////", edgecolor=INK, label=f"input +{step_text}"),
                   Patch(facecolor=GREYS[3], edgecolor=INK, label=f"input -{step_text}")]
        frame.fig.legend(handles=handles, loc="lower center", bbox_to_anchor=(0.5, 0.0), ncol=2)
        return frame.fig

    parts = "; ".join(f"{r.label} {_signed(r.up)} / {_signed(r.down)}" for r in rows)
    alt = f"{title}. Change of the margin in percentage points for +{step_text} / -{step_text} of each input: {parts}."
    return Chart(fig_id, _draw(fig_id, build), alt)


def _signed(x: float | None) -> str:
    """Percentage points to three figures with their sign: -0.8, +0.812."""
    return "not computed" if x is None else f"{x:+.3g}"
