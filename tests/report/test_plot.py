"""The record's plot is readable: enough labelled ticks, limits labelled with value and unit, cases told apart by
colour and marker (the Okabe-Ito palette), a legend, the selected size marked.

Outside references: the standard library's HTML parser reads the SVG (which <text> sits in which tick group);
the palette's colours are those published by M. Okabe and K. Ito, "Color Universal Design" (2008).
"""

from __future__ import annotations

import re
from html.parser import HTMLParser
from pathlib import Path

import pytest

from boresize.api import check, make_line, run_lines
from boresize.report.plot import CASE_COLOURS, line_plot_svg

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
OKABE_ITO = {"#0072b2", "#d55e00", "#009e73", "#cc79a7", "#e69f00", "#56b4e9", "#000000", "#f0e442"}


class _Svg(HTMLParser):
    """Texts of an SVG by the id of the tick group they sit in ("" outside any)."""

    def __init__(self) -> None:
        super().__init__()
        self.stack: list[str] = []
        self.texts: list[tuple[str, str]] = []
        self._in_text = False

    def handle_starttag(self, tag, attrs):  # type: ignore[no-untyped-def]
        if tag == "g":
            self.stack.append(dict(attrs).get("id") or "")
        self._in_text = tag == "text"

    def handle_endtag(self, tag):  # type: ignore[no-untyped-def]
        if tag == "g" and self.stack:
            self.stack.pop()
        if tag == "text":
            self._in_text = False

    def handle_data(self, data):  # type: ignore[no-untyped-def]
        if self._in_text and data.strip():
            group = next((g for g in reversed(self.stack) if g.startswith(("xtick_", "ytick_"))), "")
            self.texts.append((group, data.strip()))


def _parse(svg: str) -> _Svg:
    parsed = _Svg()
    parsed.feed(svg)
    return parsed


@pytest.fixture(scope="module")
def demo() -> dict[str, str]:
    run = run_lines(DEMO / "lines.csv", DEMO / "criteria.toml", plugins=False)
    return {r.tag: svg for r in run.results if (svg := line_plot_svg(r)) is not None}


def test_every_plot_has_at_least_four_labelled_ticks_on_each_y_axis(demo: dict[str, str]) -> None:
    for tag, svg in demo.items():
        # the two panels' y tick labels: numbers in ytick groups (the panels are cut at the second "axes_" group)
        first, second = svg.split('id="axes_2"')
        for panel in (first, second):
            labels = [text for group, text in _parse(panel).texts if group.startswith("ytick_")]
            assert len(labels) >= 4, (tag, labels)
            assert all(re.fullmatch(r"[-\u2212]?[\d.]+(e[-+]?\d+)?", text) for text in labels), (tag, labels)


def test_limit_labels_carry_value_and_unit(demo: dict[str, str]) -> None:
    # examples/demo-unit/criteria.toml: 140-FO-050 (service heavy-oil) has velocity 3 m/s and drop 40 kPa/100 m
    texts = [text for _, text in _parse(demo["140-FO-050"]).texts]
    assert "velocity 3 m/s" in texts and "drop 40 kPa/100 m" in texts
    for tag, svg in demo.items():
        for _, text in _parse(svg).texts:
            if text.startswith(("velocity ", "drop ", "erosional ")) and "[" not in text:  # not an axis title
                assert text.endswith((" m/s", " kPa/100 m")), (tag, text)


def test_cases_differ_in_colour_and_marker_from_a_colour_blind_safe_palette(demo: dict[str, str]) -> None:
    svg = demo["140-P-002"]  # three cases: normal, maximum, minimum (examples/demo-unit/lines.csv)
    strokes = set(re.findall(r"stroke: (#[0-9a-f]{6})", svg))
    cases = {c.lower() for c in CASE_COLOURS[:3]}
    assert cases <= strokes and cases <= OKABE_ITO and len(cases) == 3
    assert len(set(re.findall(r'<defs>\s*<path id="(m[0-9a-f]+)"', svg))) >= 3  # one marker shape per case
    legend = [text for _, text in _parse(svg).texts]
    assert {"normal", "maximum", "minimum", "case"} <= set(legend)  # the legend names each case


def test_the_selected_size_is_marked_with_a_band_and_a_label(demo: dict[str, str]) -> None:
    svg = demo["140-P-002"]
    assert [text for _, text in _parse(svg).texts].count("selected NPS 4") == 2  # one per panel
    assert "#e0e0e0" in svg  # the band


def test_a_narrow_span_gets_a_linear_axis_with_labelled_ticks() -> None:
    # one size only (checked at NPS 3): every value lies within a decade of the limits
    line = make_line(tag="L", fluid="water", flow="20 t/h", pressure="5 barg", temperature="20 degC",
                     length="50 m", service="liquid")
    svg = line_plot_svg(check(line, nps="3"))
    assert svg is not None
    labels = [text for group, text in _parse(svg.split('id="axes_2"')[0]).texts if group.startswith("ytick_")]
    assert len(labels) >= 4 and labels[0] == "0"  # a linear axis starts at zero


def test_case_names_are_text_not_mathematics_or_markup_and_many_cases_stay_apart() -> None:
    from boresize.io.csv_reader import parse_csv_text

    rows = ["tag,fluid,flow,pressure,temperature,length,case,service"]
    names = ["$\\frac$", "<b>max</b>", *(f"c{k}" for k in range(3, 9))]  # an unbalanced TeX command, markup, 8 cases
    rows += [f"H-1,water,{10 + 2 * k} t/h,5 barg,20 degC,50 m,{name},liquid" for k, name in enumerate(names)]
    run = run_lines(parse_csv_text("\n".join(rows) + "\n", "hostile.csv"), plugins=False)
    svg = line_plot_svg(run.results[0])
    assert svg is not None and "<b>" not in svg
    texts = [text for _, text in _parse(svg).texts]
    assert "$\\frac$" in texts and "<b>max</b>" in texts  # as written, in the legend
    # all seven palette colours are drawn (the eighth case reuses the first colour with another marker)
    assert {c.lower() for c in CASE_COLOURS} <= set(re.findall(r"stroke: (#[0-9a-f]{6})", svg))
    assert len(set(re.findall(r'<defs>\s*<path id="(m[0-9a-f]+)"', svg))) >= 6  # six marker shapes
