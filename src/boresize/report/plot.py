"""The calculation record's plot: velocity and drop per length against NPS, with the limits drawn.

One SVG per line (matplotlib, Agg-free SVG canvas, no pyplot state). Every rated candidate of every
case is a point; every verdict whose unit is that of the axis (``m/s`` or ``kPa/100 m``) adds its
limit as a dashed horizontal line, whatever criterion plugin gave it. The selected size is marked.
The SVG holds no user text except case names, which matplotlib escapes.
"""

from __future__ import annotations

import io
from collections.abc import Sequence
from typing import Any

from boresize.model import CandidateResult, LineResult

__all__ = ["line_plot_svg", "VELOCITY_COLOUR", "DROP_COLOUR", "AXES"]

#: Series colours (checked in the rendered screenshot by the tests).
VELOCITY_COLOUR = "#1f5fbf"
DROP_COLOUR = "#c0392b"
#: (axis title, verdict unit drawn on it, value of a candidate in that unit)
AXES = (("velocity [m/s]", "m/s"), ("drop per length [kPa/100 m]", "kPa/100 m"))
_MARKERS = ("o", "s", "^", "D", "v", "P")
Series = list[tuple[str, Sequence[CandidateResult]]]
#: Sizes below the selected one that the plot shows (all rated sizes when none is selected).
PLOTTED_BELOW = 5


def _value(candidate: CandidateResult, unit: str) -> float:
    h = candidate.hydraulics
    return h.velocity if unit == "m/s" else h.drop_per_length / 10.0


def _limits(series: Sequence[tuple[str, Sequence[CandidateResult]]], unit: str) -> dict[tuple[str, float], str]:
    """Distinct limits on one axis: (criterion, limit rounded to 4 figures) -> label."""
    found: dict[tuple[str, float], str] = {}
    for _, candidates in series:
        for candidate in candidates:
            for v in candidate.verdicts:
                if v.unit == unit and v.limit is not None and v.limit > 0:
                    key = (v.criterion, float(f"{v.limit:.4g}"))
                    found.setdefault(key, f"{v.criterion} {key[1]:g}")
    return dict(list(found.items())[:8])


def _label(name: str) -> str:
    return name.replace("$", r"\$")  # matplotlib would read $...$ as mathematics


def _window(result: LineResult, series: Series) -> tuple[list[str], Series]:
    """NPS labels to plot (from PLOTTED_BELOW below the selected size up) and the series cut to them."""
    sizes = sorted({(c.candidate.nps_value, c.candidate.nps) for _, cs in series for c in cs})
    labels = [label for _, label in sizes]
    chosen = result.selected.candidate.nps if result.selected else None
    if chosen in labels:
        labels = labels[max(0, labels.index(chosen) - PLOTTED_BELOW):]
    return labels, [(name, [c for c in cs if c.candidate.nps in labels]) for name, cs in series]


def _draw(axes: Any, labels: list[str], series: Series, unit: str, colour: str, chosen: str | None) -> None:
    """One axis: a line per case, a dashed line per limit, the selected size dotted; log scale."""
    from matplotlib.ticker import FuncFormatter, LogLocator, NullLocator

    position = {label: i for i, label in enumerate(labels)}
    for k, (name, candidates) in enumerate(series):
        axes.plot([position[c.candidate.nps] for c in candidates], [_value(c, unit) for c in candidates],
                  marker=_MARKERS[k % len(_MARKERS)], color=colour, linewidth=1.5, markersize=4,
                  label=_label(name or "sizing flow"))
    for n, ((_, limit), label) in enumerate(_limits(series, unit).items()):
        axes.axhline(limit, color=f"C{n + 2}", linestyle="--", linewidth=1.2, label=_label(label))
    if chosen in position:
        axes.axvline(position[chosen], color="#555555", linestyle=":", linewidth=1.0)
    axes.set_yscale("log")
    low, high = axes.get_ylim()
    axes.yaxis.set_major_locator(LogLocator(base=10.0, subs=(1.0, 2.0, 5.0) if high / max(low, 1e-30) < 1e3
                                            else (1.0,)))
    axes.yaxis.set_major_formatter(FuncFormatter(lambda value, _: f"{value:g}"))
    axes.yaxis.set_minor_locator(NullLocator())  # minor ticks cost most of the drawing time
    axes.set_xticks(range(len(labels)), labels, rotation=45)
    axes.grid(True, which="major", alpha=0.3)
    axes.legend(fontsize=6, loc="upper right")


def line_plot_svg(result: LineResult) -> str | None:
    """An inline SVG of the line's rated candidates, or None when nothing was rated."""
    cases = result.cases or (result,)
    series: Series = [(c.line.case if c.line and c.line.case else "", c.candidates) for c in cases if c.candidates]
    if not series:
        return None
    from boresize.optional import needs

    with needs("the plots of the HTML report"):
        import matplotlib
        from matplotlib.figure import Figure

    labels, series = _window(result, series)
    chosen = result.selected.candidate.nps if result.selected else None
    with matplotlib.rc_context({"svg.fonttype": "none", "svg.hashsalt": "boresize", "font.size": 8}):
        figure = Figure(figsize=(8.0, 3.2))
        figure.subplots_adjust(left=0.08, right=0.99, bottom=0.2, top=0.95, wspace=0.3)
        for axes, (title, unit), colour in zip(figure.subplots(1, 2), AXES, (VELOCITY_COLOUR, DROP_COLOUR)):
            _draw(axes, labels, series, unit, colour, chosen)
            axes.set_xlabel("NPS")
            axes.set_ylabel(title)
        buffer = io.StringIO()
        figure.savefig(buffer, format="svg", metadata={"Date": None})
    text = buffer.getvalue()
    return text[text.find("<svg"):]
