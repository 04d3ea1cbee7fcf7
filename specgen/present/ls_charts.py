"""Charts of a load-sensing supply by operating mode: the pump pressure against each running drive's
need (the gap is what its valve throttles), and the flow asked against the flow the pump delivers.

Same rules as charts.py (whose frames, bars and drawing it uses): numbers already in display units,
greys with hatches and markers (never colour alone), a fixed hash salt and ids prefixed with the
figure's id, the key numbers in the text alternative.
"""

from __future__ import annotations

from typing import Sequence

from specgen.present.chart_frame import GREYS, INK, text_width
from specgen.present.charts import (LIMIT_STYLES, Chart, _bar_tops, _draw, _mode_axes, _num, _status_suffix,
                                    _supply_line)

MARKERS = ("o", "s", "^", "D", "v", "P", "X", "<", ">")


def pressure_by_mode(fig_id: str, title: str, *, unit: str, modes: Sequence[str], pump: Sequence[float],
                     drives: Sequence[str], needs: Sequence[Sequence[float | None]], relief: float) -> Chart:
    """Pump pressure per mode as bars, each running drive's need as a marker on it (``needs[mode][drive]``,
    None where the drive does not run), the relief setting as a dashed line."""
    y_max = 1.15 * max(list(pump) + [relief, 1e-9])
    key_pt = 7 * (0.5 + 2 * 0.4 + 2.2 + 0.8) + max([text_width(d) for d in drives] + [text_width("need of")])

    def build():
        ax = _mode_axes(title, modes, y_max, f"pressure p [{unit}]", key_pt)
        xs = range(len(modes))
        ax.bar(xs, pump, 0.55, color=GREYS[2], hatch="///", edgecolor=INK, linewidth=0.6, zorder=3,
               label="pump")
        _bar_tops(ax, xs, pump, [None] * len(modes))
        for j, drive in enumerate(drives):
            shift = (j - (len(drives) - 1) / 2) * min(0.12, 0.4 / max(len(drives), 1))  # markers side by side
            pts = [(x + shift, row[j]) for x, row in zip(xs, needs) if row[j] is not None]
            if pts:
                ax.plot([p[0] for p in pts], [p[1] for p in pts], linestyle="none", marker=MARKERS[j % len(MARKERS)],
                        markersize=5, markerfacecolor="white", markeredgecolor=INK, zorder=6, label=drive)
        ax.axhline(relief, color=INK, linewidth=1.1, linestyle=LIMIT_STYLES["relief"], zorder=4)
        ax.annotate(f"relief {_num(relief)} {unit}", (0.0, relief), xycoords=("axes fraction", "data"),
                    xytext=(3, 2), textcoords="offset points", ha="left", va="bottom", fontsize=7)
        ax.legend(loc="upper left", bbox_to_anchor=(1.0, 1.0), title="need of", title_fontsize=7, handlelength=2.2,
                  handleheight=1.4)
        return ax.figure

    parts = []
    for mode, p, row in zip(modes, pump, needs):
        need = ", ".join(f"{d} {_num(n)}" for d, n in zip(drives, row) if n is not None)
        parts.append(f"{mode}: pump {_num(p)} {unit} (needs: {need})")
    alt = f"{title}. Relief {_num(relief)} {unit}. " + "; ".join(parts) + "."
    return Chart(fig_id, _draw(fig_id, build), alt)


def flow_by_mode(fig_id: str, title: str, *, unit: str, modes: Sequence[str], asked: Sequence[float],
                 delivered: Sequence[float], available: Sequence[float], full_stroke: float,
                 statuses: Sequence[str | None]) -> Chart:
    """Flow asked (hatched) and delivered (grey) per mode side by side, the flow the pump can give in each
    mode (its power limiter) as a bold tick, full stroke as a dashed line; a mode whose drives miss their
    speed is marked by the worst reached-speed status."""
    y_max = 1.18 * max(list(asked) + list(delivered) + [full_stroke, 1e-9])

    def build():
        ax = _mode_axes(title, modes, y_max, f"flow q [{unit}]")
        xs = list(range(len(modes)))
        ax.bar([x - 0.16 for x in xs], asked, 0.3, color=GREYS[0], hatch="\\\\\\", edgecolor=INK, linewidth=0.6,
               zorder=3, label="asked")
        ax.bar([x + 0.16 for x in xs], delivered, 0.3, color=GREYS[3], edgecolor=INK, linewidth=0.6, zorder=3,
               label="delivered")
        _bar_tops(ax, [x + 0.16 for x in xs], delivered, statuses)
        ax.hlines(available, [x - 0.34 for x in xs], [x + 0.34 for x in xs], colors=INK, linewidth=2.0, zorder=5,
                  label="pump can give")
        _supply_line(ax, full_stroke, f"full stroke {_num(full_stroke)} {unit}")
        ax.legend(loc="upper left", fontsize=7, handlelength=2.2, handleheight=1.2)
        return ax.figure

    parts = "; ".join(f"{m}: asked {_num(a)}, delivered {_num(d)}, can give {_num(v)} {unit}"
                      f"{_status_suffix(s).lower()}" for m, a, d, v, s in zip(modes, asked, delivered, available,
                                                                              statuses))
    return Chart(fig_id, _draw(fig_id, build), f"{title}. Full stroke {_num(full_stroke)} {unit}. {parts}.")
