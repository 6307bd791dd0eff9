"""The calculation record's plot: velocity and drop per length against NPS, with the limits drawn.

One SVG per line (matplotlib, Agg-free SVG canvas, no pyplot state). Every rated candidate of every
case is a point; each case has its own colour AND marker from the Okabe-Ito palette (told apart by readers
with a colour-vision deficiency and in grey print), named in a legend below the panels. Every verdict whose unit
is that of the axis (``m/s`` or ``kPa/100 m``) adds its limit as a dashed horizontal line labelled with the
criterion, the value and the unit ("velocity 3 m/s", "drop 40 kPa/100 m"), whatever criterion plugin gave it. The
selected size is a shaded band labelled "selected NPS ...". An axis whose values span less than a decade is
linear (with about six labelled ticks); a wider span is logarithmic with 1-2-5 ticks labelled.
The SVG holds no user text except case names, which matplotlib escapes.
"""

from __future__ import annotations

import io
from collections.abc import Sequence
from typing import Any

from boresize.model import CandidateResult, LineResult

__all__ = ["line_plot_svg", "CASE_COLOURS", "AXES", "LIMIT_COLOUR", "SELECTED_COLOUR"]

#: The cases' colours, in order: the Okabe-Ito palette (M. Okabe and K. Ito, "Color Universal Design", 2008),
#: yellow left out (too pale on white). A line with one case draws it in the first colour.
CASE_COLOURS = ("#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#000000")
#: Limit lines (dashed, labelled) and the selected size's band.
LIMIT_COLOUR = "#444444"
SELECTED_COLOUR = "#e0e0e0"
_DASHES = ("--", "-.", ":", (0, (6, 2, 1, 2)))
#: (axis title, verdict unit drawn on it, value of a candidate in that unit)
AXES = (("velocity [m/s]", "m/s"), ("drop per length [kPa/100 m]", "kPa/100 m"))
_MARKERS = ("o", "s", "^", "D", "v", "P")
Series = list[tuple[str, Sequence[CandidateResult]]]
#: Sizes below the selected one that the plot shows (all rated sizes when none is selected).
PLOTTED_BELOW = 5


def _value(candidate: CandidateResult, unit: str) -> float:
    h = candidate.hydraulics
    return h.velocity if unit == "m/s" else h.drop_per_length / 10.0


#: Shorter names of criteria on a limit's label (others keep their id).
_SHORT = {"drop-per-length": "drop"}


def _is_minimum(limit: float, value: float | None, utilisation: float | None) -> bool:
    """A limit the value must stay above: its utilisation is limit/value rather than value/limit."""
    if not value or utilisation is None or value <= 0:
        return False
    return abs(utilisation - limit / value) < abs(utilisation - value / limit) - 1e-9


def _limits(series: Sequence[tuple[str, Sequence[CandidateResult]]], unit: str) -> dict[tuple[str, float], str]:
    """Distinct limits on one axis: (criterion, limit rounded to 4 figures) -> label with value and unit."""
    found: dict[tuple[str, float], str] = {}
    for _, candidates in series:
        for candidate in candidates:
            for v in candidate.verdicts:
                if v.unit == unit and v.limit is not None and v.limit > 0:
                    key = (v.criterion, float(f"{v.limit:.4g}"))
                    least = " min" if _is_minimum(v.limit, v.value, v.utilisation) else ""
                    found.setdefault(key, f"{_SHORT.get(v.criterion, v.criterion)}{least} {key[1]:g} {unit}")
    return dict(list(found.items())[:6])


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


def _scale(axes: Any, values: Sequence[float]) -> None:
    """Linear with about six ticks when the values span less than a decade, else log with 1-2-5 ticks labelled
    (1 only over more than three decades, 2 and 5 then unlabelled minor ticks)."""
    from matplotlib.ticker import FuncFormatter, LogLocator, MaxNLocator, NullFormatter

    positive = [v for v in values if v > 0]
    low, high = (min(positive), max(positive)) if positive else (1.0, 10.0)
    label = FuncFormatter(lambda value, _: f"{value:g}")
    if high / low < 10:
        axes.set_ylim(0, high * 1.15)
        axes.yaxis.set_major_locator(MaxNLocator(nbins=6, steps=[1, 2, 2.5, 5, 10]))
        axes.yaxis.set_major_formatter(label)
        return
    axes.set_yscale("log")
    axes.set_ylim(low / 1.4, high * 1.4)
    wide = high / low > 1e3
    axes.yaxis.set_major_locator(LogLocator(base=10.0, subs=(1.0,) if wide else (1.0, 2.0, 5.0)))
    axes.yaxis.set_major_formatter(label)
    axes.yaxis.set_minor_locator(LogLocator(base=10.0, subs=(2.0, 5.0) if wide else (3.0,)))
    axes.yaxis.set_minor_formatter(NullFormatter())


def _draw(axes: Any, labels: list[str], series: Series, unit: str, chosen: str | None) -> list[Any]:
    """One axis: a line per case (colour and marker), a labelled dashed line per limit, the selected size as a
    shaded band; returns the cases' line handles (for the legend)."""
    position = {label: i for i, label in enumerate(labels)}
    handles = []
    values: list[float] = []
    for k, (name, candidates) in enumerate(series):
        ys = [_value(c, unit) for c in candidates]
        values += ys
        handles += axes.plot([position[c.candidate.nps] for c in candidates], ys,
                             marker=_MARKERS[k % len(_MARKERS)], color=CASE_COLOURS[k % len(CASE_COLOURS)],
                             linewidth=1.5, markersize=5, label=_label(name or "sizing flow"))
    limits = _limits(series, unit)
    values += [limit for _, limit in limits]
    _scale(axes, values)
    # labels of limits in ascending order alternate right and left, so that two close limits stay readable
    for n, ((_, limit), text) in enumerate(sorted(limits.items(), key=lambda item: item[0][1])):
        axes.axhline(limit, color=LIMIT_COLOUR, linestyle=_DASHES[n % len(_DASHES)], linewidth=1.1)
        axes.text(len(labels) - 0.5 if n % 2 == 0 else -0.5, limit, _label(text), color=LIMIT_COLOUR, fontsize=7,
                  ha="right" if n % 2 == 0 else "left", va="bottom",
                  bbox={"facecolor": "white", "edgecolor": "none", "alpha": 0.8, "pad": 1})
    if chosen in position:
        at = position[chosen]
        half = 0.4 if len(labels) > 1 else 0.1
        axes.axvspan(at - half, at + half, color=SELECTED_COLOUR, zorder=0)
        axes.text(at, 1.01, f"selected NPS {_label(chosen or '')}", transform=axes.get_xaxis_transform(),
                  ha="center", va="bottom", fontsize=7, fontweight="bold")
    axes.set_xlim(-0.5, len(labels) - 0.5)
    axes.set_xticks(range(len(labels)), [_label(label) for label in labels], rotation=45)
    axes.grid(True, which="major", alpha=0.3)
    return handles


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
        figure = Figure(figsize=(8.0, 3.4))
        figure.subplots_adjust(left=0.08, right=0.99, bottom=0.27, top=0.92, wspace=0.25)
        handles: list[Any] = []
        for axes, (title, unit) in zip(figure.subplots(1, 2), AXES):
            handles = _draw(axes, labels, series, unit, chosen)
            axes.set_xlabel("NPS")
            axes.set_ylabel(title)
        figure.legend(handles=handles, loc="lower center", bbox_to_anchor=(0.5, -0.01), ncol=min(len(handles), 4), fontsize=7, frameon=False,
                      title="case" if len(handles) > 1 else None, title_fontsize=7, borderaxespad=0.2)
        buffer = io.StringIO()
        figure.savefig(buffer, format="svg", metadata={"Date": None})
    text = buffer.getvalue()
    return text[text.find("<svg"):]
