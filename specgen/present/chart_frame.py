"""The frame every report chart is drawn in: style, page furniture, text measured for margins, ticks.

Speed: a report draws many charts, so each is drawn once, straight to the SVG canvas. Margins are
fixed per chart from the measured widths of its tick labels, names and keys (text_width), ticks
are set, not located, and title and axis labels are placed, not measured: a layout engine would
draw every figure twice and measure every text again.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass
from typing import Sequence

# Plain engineering-document greys; hatches carry the distinction in print. Only line hatches:
# a dotted or circled hatch is hundreds of little curves in every SVG tile (150 kB a chart).
INK = "#000000"
GREYS = ("#ffffff", "#d0d0d0", "#f2f2f2", "#a8a8a8", "#e4e4e4", "#bcbcbc", "#8c8c8c")
HATCHES = ("", "///", "---", "xx", "\\\\\\", "++", "|||", "////", "xxx")
WIDTH_IN = 6.4  # fits the text width of A4 and Letter with 18 mm margins
HEIGHT_IN = 3.3
# Two charts side by side (a drive's torque and speed charts): each drawn at this width, so that
# its text prints at the same size as a full-width chart's.
HALF_WIDTH_IN = 3.45
HALF_HEIGHT_IN = 2.55

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



# Fixed page furniture, in points, from the sizes in STYLE and matplotlib's default tick length
# (3.5) and pad (3.5), axis label pad (4) and title pad (6). Margins are worked out from these and
# the measured widths of the tick labels once per chart: a layout engine would measure every text
# of the figure again in an extra drawing pass, which costs more than the rest of the drawing.
TICK = 3.5 + 3.5
TICK_TEXT = 7 * 1.25  # height of a line of 7 pt text, descenders included
LABEL = 4 + 7.5 * 1.25 + 3  # axis label: pad, line, clearance to the edge
TITLE_LINE = 8.5 * 1.25
TITLE = TITLE_LINE + 6 + 3
KEY_ROW = 17.0  # a one-row key below the axes: text line, border pads and its gap to the edge
EDGE = 6.0


@functools.lru_cache(maxsize=None)
def _font(size: float, bold: bool):
    """The font file the charts' text is laid out with (found once, in the charts' style)."""
    import matplotlib
    from matplotlib.font_manager import FontProperties, findfont

    weight = "bold" if bold else "normal"
    with matplotlib.rc_context(STYLE):
        path = findfont(FontProperties(family="sans-serif", weight=weight))
    return FontProperties(fname=path, size=size, weight=weight)


SPARE = 1.04  # hinted renderers and a browser's own copy of the font set some texts this much wider


@functools.lru_cache(maxsize=4096)
def text_width(text: str, size: float = 7.0, bold: bool = False) -> float:
    """The room in points to keep for ``text`` (its widest line) at ``size`` points: the font's own
    advances, as the SVG backend lays text out by, and SPARE on top.

    Example: "100" at 7 pt in DejaVu Sans: three digits of 0.636 em, 13.36 pt, so 13.9 pt of room."""
    from matplotlib.textpath import text_to_path

    return SPARE * max((text_to_path.get_text_width_height_descent(line, _font(size, bold), ismath=False)[0]
                        for line in text.split("\n")), default=0.0)


def wrap(text: str, width_pt: float, size: float = 7.0, bold: bool = False) -> str:
    """``text`` broken into lines ("\\n") no wider than ``width_pt``: at spaces, and inside a word
    only where the word alone is wider than a line. Text that fits comes back as it was."""
    if text_width(text, size, bold) <= width_pt:
        return text
    lines, line = [], ""
    for word in text.split():
        while len(word) > 1 and text_width(word, size, bold) > width_pt:
            if line:
                lines.append(line)
                line = ""
            cut = max((k for k in range(1, len(word)) if text_width(word[:k], size, bold) <= width_pt), default=1)
            lines.append(word[:cut])
            word = word[cut:]
        if line and text_width(f"{line} {word}", size, bold) <= width_pt:
            line = f"{line} {word}"
        else:
            if line:
                lines.append(line)
            line = word
    return "\n".join(lines + [line] if line else lines)


def ticks(lo: float, hi: float, length_pt: float, per_tick_pt: float) -> tuple[list[float], list[str]]:
    """Round tick values in [lo, hi] and their labels, about one per ``per_tick_pt`` of axis
    (matplotlib's own spacing rule), with the fewest decimals that show every value exactly.

    Example: ticks(0, 4400, 170, 14) -> [0, 500, ..., 4000] labelled "0" ... "4000"."""
    from matplotlib.ticker import MaxNLocator

    nbins = min(9, max(1, int(length_pt // per_tick_pt)))
    span = hi - lo
    vals = [float(v) + 0.0 for v in MaxNLocator(nbins=nbins, steps=[1, 2, 2.5, 5, 10]).tick_values(lo, hi)
            if lo - 1e-9 * span <= v <= hi + 1e-9 * span]
    decimals = next((d for d in range(7) if all(abs(round(v, d) - v) <= 1e-9 * max(1.0, abs(v)) for v in vals)), 6)
    # matplotlib's own tick labels write a minus sign, not a hyphen
    return vals, [f"{round(v, decimals) + 0.0:.{decimals}f}".replace("-", "\N{MINUS SIGN}") for v in vals]


@dataclass
class Frame:
    """A figure with one axes placed by fixed margins (points), and the axes' size in points."""

    fig: object
    ax: object
    width: float
    height: float
    left: float  # the left margin
    title: str  # the title, broken into lines that fit the figure

    def label(self, x_label: str, y_label: str = "") -> None:
        """Title and axis labels at fixed places beside the tick labels the margins were made for;
        left to itself, matplotlib measures every tick label again to place them."""
        ax = self.ax
        ax.set_title(self.title, loc="left", y=1.0)
        ax.set_xlabel(x_label)
        ax.xaxis.set_label_coords(0.5, -(TICK + TICK_TEXT + 4) / self.height)
        if y_label:
            ax.set_ylabel(y_label)
            ax.yaxis.set_label_coords(-(self.left - LABEL + 4) / self.width, 0.5)


def new_frame(height_in: float, title: str, left: float, bottom: float, right: float = EDGE,
              width_in: float = WIDTH_IN) -> Frame:
    """A figure and its axes, with room above for ``title`` (in as many lines as it takes)."""
    from matplotlib.figure import Figure

    fig = Figure(figsize=(width_in, height_in))
    w_pt, h_pt = width_in * 72, height_in * 72
    title = wrap(title, w_pt - left - EDGE, STYLE["axes.titlesize"])
    top = TITLE + TITLE_LINE * title.count("\n")
    ax = fig.add_axes((left / w_pt, bottom / h_pt, 1 - (left + right) / w_pt, 1 - (bottom + top) / h_pt))
    return Frame(fig, ax, w_pt - left - right, h_pt - bottom - top, left, title)


def left_margin(labels: Sequence[str]) -> float:
    """The left margin that holds the widest y tick label and the y axis label beside it."""
    return TICK + max((text_width(t) for t in labels), default=0.0) + LABEL
