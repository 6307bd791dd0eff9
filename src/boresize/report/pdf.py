"""A paged calculation sheet as PDF (fpdf2: pure Python, from the package index alone; ``boresize[report]``).

Every page carries the document block in a box at its head (project, unit, number, revision, date, prepared,
checked, approved) with "sheet N of M". The first sheet has the screening caution, the notes and the summary
table (tag, fluid, flow, P, T, size, v, drop, controlling, utilisation, status); then each line starts a new
sheet with, per case, the inputs as used and the property source, the two-phase block where there is one, the
hydraulic totals of the selected size with its fittings, the equations with the numbers put in (the same rows
the HTML record shows: :mod:`boresize.report.html`), and the verdicts with value, limit and status. No plot: a
line takes one or two sheets.

The text is set in DejaVu Sans, which matplotlib ships (so Greek letters and the equations' signs print without
a system font or network access); a character that font lacks is printed as "?".
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from boresize.io.document import CAUTION, TWO_PHASE_CAUTION, two_phase_count
from boresize.io.document_block import DocumentBlock
from boresize.io.rows import parse_header
from boresize.model import LineResult
from boresize.sizing.batch import summary

__all__ = ["build_pdf", "font_path", "render_pdf", "write_pdf"]

FONT = "DejaVu"
#: the colours of a status cell (the text says the status too): blue for pass, orange for fail, grey for error
_FILLS = {"pass": (214, 230, 245), "fail": (250, 215, 180), "error": (225, 225, 225)}
_BLOCK_KEYS = ("project", "unit", "number", "revision", "date", "prepared", "checked", "approved")


def font_path(bold: bool = False) -> Path:
    """DejaVu Sans as shipped in matplotlib's data folder (no network, no system font)."""
    import matplotlib

    return Path(matplotlib.get_data_path()) / "fonts" / "ttf" / ("DejaVuSans-Bold.ttf" if bold else "DejaVuSans.ttf")


def _sheet_class() -> type:
    from fpdf import FPDF

    class Sheet(FPDF):
        """An A4 page with the document block boxed at its head and "sheet N of M" in the box."""

        def __init__(self, title: str, block: DocumentBlock | None) -> None:
            super().__init__(orientation="P", unit="mm", format="A4")
            self.sheet_title = title
            self.block = block
            #: per page, the text of its head box (with "{nb}" for the page count until the PDF is output)
            self.stamps: list[list[str]] = []
            self.set_margins(12, 12, 12)
            self.set_auto_page_break(True, margin=14)
            self.add_font(FONT, "", str(font_path()))
            self.add_font(FONT, "B", str(font_path(bold=True)))
            self.set_title(title)
            self.set_creator("boresize")

        def header(self) -> None:
            block = self.block or DocumentBlock()
            values = {key: getattr(block, key) for key in _BLOCK_KEYS}
            cells = [[("project", values["project"], 76), ("unit", values["unit"], 30),
                      ("number", values["number"], 50), ("revision", values["revision"], 30)],
                     [("date", values["date"], 30), ("prepared", values["prepared"], 38),
                      ("checked", values["checked"], 38), ("approved", values["approved"], 38),
                      ("sheet", f"{self.page_no()} of {{nb}}", 42)]]
            stamp = [self.sheet_title]
            self.set_font(FONT, "B", 8)
            self.cell(0, 5, self.fit(self.sheet_title, 186), new_x="LMARGIN", new_y="NEXT")
            for row in cells:
                x = self.l_margin
                y = self.get_y()
                for label, value, width in row:
                    self.set_xy(x, y)
                    self.set_font(FONT, "", 5.5)
                    self.set_text_color(90, 90, 90)
                    self.cell(width, 2.8, label)
                    self.set_xy(x, y + 2.6)
                    self.set_font(FONT, "B" if label == "sheet" else "", 7.5)
                    self.set_text_color(0, 0, 0)
                    self.cell(width, 4, self.fit(value, width - 1) if label != "sheet" else value)
                    self.rect(x, y, width, 7)
                    x += width
                    stamp.append(f"{label}: {value}")
                self.set_y(y + 7)
            self.stamps.append(stamp)
            self.ln(3)

        def footer(self) -> None:
            self.set_y(-11)
            self.set_font(FONT, "", 6)
            self.set_text_color(90, 90, 90)
            self.cell(0, 3, "Screening calculation: to be checked by a competent engineer against the applicable "
                            "codes and company standards; local codes govern.", align="C")
            self.set_text_color(0, 0, 0)

        def fit(self, text: str, width: float) -> str:
            """``text`` on one line, cut with "..." to ``width`` mm in the current font."""
            text = " ".join(text.split())
            if self.get_string_width(text) <= width:
                return text
            while text and self.get_string_width(text + "...") > width:
                text = text[:-1]
            return text + "..."

    return Sheet


def _printable(text: object, covered: frozenset[int]) -> str:
    """The text with every character the font lacks replaced by "?" (no control characters either)."""
    return "".join(ch if ord(ch) in covered or ch == "\n" else ("  " if ch == "\t" else "?") for ch in str(text))


def build_pdf(results: Sequence[LineResult], *, trace: Mapping[str, Any], title: str,
              headers: Sequence[str] | None = None, units: Mapping[str, str | None] | None = None,
              document: DocumentBlock | None = None) -> Any:
    """The sheet as an fpdf2 document (its ``pages_count`` and ``stamps`` are what tests look at)."""
    from boresize.optional import needs

    with needs("the PDF calculation sheet"):
        pdf = _sheet_class()(title, document)

    from boresize.report.html import _line_view, _trace_rows

    covered = frozenset(pdf.fonts[FONT.lower()].cmap) | frozenset(pdf.fonts[FONT.lower() + "B"].cmap)

    cleaned: dict[str, str] = {}
    widths: dict[tuple[str, str, float, str], float] = {}

    def clean(text: object) -> str:
        key = str(text)
        if key not in cleaned:
            cleaned[key] = _printable(key, covered)
        return cleaned[key]

    def width_of(text: str) -> float:
        """fpdf2's string width [mm], remembered per font, style, size and text: a sheet measures the same labels,
        units and words again and again, and fpdf2 takes ~0.1 ms a call (half the time of a long list)."""
        key = (pdf.font_family, pdf.font_style, pdf.font_size_pt, text)
        found = widths.get(key)
        if found is None:
            found = widths[key] = pdf.get_string_width(text)
        return found

    pdf.sheet_title = clean(title)
    if document is not None:
        pdf.block = DocumentBlock(**{key: clean(value) for key, value in document.rows()})

    def heading(text: str, size: float = 9.5) -> None:
        pdf.set_font(FONT, "B", size)
        pdf.multi_cell(0, size * 0.5, clean(text), align="L", new_x="LMARGIN", new_y="NEXT")
        pdf.ln(0.8)

    def para(text: str, size: float = 7.5) -> None:
        pdf.set_font(FONT, "", size)
        pdf.multi_cell(0, size * 0.45, clean(text), align="L", new_x="LMARGIN", new_y="NEXT")
        pdf.ln(0.8)

    def wrap(text: str, width: float) -> list[str]:
        """``text`` in lines no wider than ``width`` mm in the current font (a long word is cut)."""
        lines: list[str] = []
        for part in text.split("\n"):
            if width_of(part) <= width:
                lines.append(part)
                continue
            line, used = "", 0.0
            space = width_of(" ")
            for word in part.split(" "):
                w = width_of(word)
                while w > width:  # a word wider than the column: cut it
                    if line:
                        lines.append(line)
                        line, used = "", 0.0
                    cut = max(1, int(len(word) * width / w))
                    lines.append(word[:cut])
                    word = word[cut:]
                    w = width_of(word)
                if line and used + space + w > width:
                    lines.append(line)
                    line, used = "", 0.0
                line, used = (f"{line} {word}", used + space + w) if line else (word, w)
            lines.append(line)
        return lines

    def table(head: Sequence[str], rows: Sequence[Sequence[object]], widths: Sequence[float],
              status_column: int | None = None, size: float = 7.0) -> None:
        """A ruled grid, its heading repeated after a page break (drawn cell by cell: fpdf2's own table takes
        about a second a line)."""
        if not rows:
            return
        scale = min(1.0, pdf.epw / sum(widths))  # never wider than the page
        cols = [w * scale for w in widths]
        step, pad = size * 0.42, 0.6

        def draw(values: Sequence[object], bold: bool) -> None:
            pdf.set_font(FONT, "B" if bold else "", size)
            cells = [wrap(clean("-" if value is None else value), w - 2 * pad) for value, w in zip(values, cols)]
            height = max(len(c) for c in cells) * step + 2 * pad
            if pdf.get_y() + height > pdf.page_break_trigger and not bold:
                pdf.add_page()
                draw(head, True)
                pdf.set_font(FONT, "", size)
            x, y = pdf.l_margin, pdf.get_y()
            for i, (lines, w) in enumerate(zip(cells, cols)):
                fill = (235, 235, 235) if bold else _FILLS.get(str(values[i])) if i == status_column else None
                if fill:
                    pdf.set_fill_color(*fill)
                pdf.rect(x, y, w, height, style="DF" if fill else "D")
                for k, line in enumerate(lines):
                    pdf.text(x + pad, y + pad + (k + 0.78) * step, line)
                x += w
            pdf.set_y(y + height)

        if pdf.get_y() + 4 * step > pdf.page_break_trigger:  # a heading never ends a page
            pdf.add_page()
        draw(head, True)
        for values in rows:
            draw(values, False)
        pdf.ln(1.5)

    by_field = {parse_header(h).field: h for h in headers or ()}
    views = [_line_view(r, by_field, units or {}, False) for r in results]

    # the first sheet: caution, notes, summary
    pdf.add_page()
    heading("Line sizing calculation sheet", 12)
    para(CAUTION, 8)
    if two_phase_count(results):
        para(TWO_PHASE_CAUTION, 7.5)
    if document is not None and document.notes:
        para("Notes: " + document.notes, 8)
    para(summary(results), 8)
    heading("Summary")
    table(("Tag", "Fluid", "Flow [kg/h]", "P in [bar abs]", "T [°C]", "Size", "v [m/s]", "Δp [kPa/100 m]",
           "Controlling", "Util.", "Status"),
          [(v["tag"], v["fluid"], v["flow"], v["pressure"], v["temperature"],
            f"NPS {v['nps']} {v['schedule']}".strip() if v["nps"] else "-", v["velocity"], v["drop"],
            v["controlling"], v["utilisation"], v["status"]) for v in views],
          (24, 22, 16, 14, 11, 18, 12, 15, 30, 11, 13), status_column=10, size=6.5)
    cautions = [f"{r.tag}: {note}" for r in results for note in r.notes] + [r.error for r in results if r.error]
    if cautions:
        heading("Cautions")
        for text in cautions:
            para("- " + text, 7)

    # one or two sheets per line
    for view in views:
        pdf.add_page()
        size = f", NPS {view['nps']} {view['schedule']}".rstrip() if view["nps"] else ""
        heading(f"Line {view['tag']}: {view['status']}{size}", 11)
        if view["error"]:
            para("Error: " + view["error"], 8)
        for text in view["notes"]:
            para("Note: " + text, 7.5)
        if view["case_count"] > 1:
            para(f"{view['case_count']} cases; governing case {view['case'] or '-'}; "
                 f"controlling {view['controlling']}", 7.5)
        elif view["controlling"] != "-":
            para(f"Controlling: {view['controlling']}", 7.5)
        cases = view["cases"]
        several = len(cases) > 1
        governing = next((c for c in cases if view["case"] and c["name"] == view["case"]), cases[0])
        for case in cases:
            if several:
                heading(f"Case {case['name']}: {case['status']}", 8.5)
            if case["error"]:
                para("Error: " + case["error"], 7.5)
            used = "Input as used" + (f" (what differs from case {case['differs_from']})"
                                      if case["differs_from"] is not None else "")
            table((used, "Value", "Unit"), case["used"], (70, 84, 32), size=6.5)
            table(("Two-phase flow (selected size)", "Value", "Unit or source"), case["two_phase"], (70, 84, 32),
                  size=6.5)
        # the cases side by side: one column of totals per case, one verdict table with the case named
        names = [c["name"] or "-" for c in cases] if several else ["Value"]
        labels: list[str] = []
        unit_of: dict[str, str] = {}
        for case in cases:
            for label, _, unit in case["totals"]:
                if label not in labels:
                    labels.append(label)
                    unit_of[label] = unit
        values = [{label: value for label, value, _ in c["totals"]} for c in cases]
        width = 116 / len(names)
        table(("Hydraulics at the selected size", *names, "Unit"),
              [(label, *(v.get(label, "-") for v in values), unit_of[label]) for label in labels],
              (50, *([width] * len(names)), 20), size=6.5)
        if several:
            para(f"Fittings and equations: case {governing['name']}"
                 + (", the governing case." if view["case"] else "."), 7)
        table(("Fitting", "Count", "K each", "L_eq each [m]", "K from"),
              [(f["kind"], f["count"], f["k"], f["leq"], f["source"]) for f in governing["fittings"]],
              (50, 16, 20, 24, 76), size=6.5)
        table(("Quantity", "Equation", "With the numbers (SI)", "Result"), governing["equations"], (34, 52, 72, 28),
              size=6.5)
        verdicts = [((c["name"] or "-",) if several else ()) + (v["criterion"], v["status"], v["value"], v["limit"],
                    v["unit"], v["utilisation"], v["reason"]) for c in cases for v in c["verdicts"]]
        table((("Case",) if several else ()) + ("Criterion", "Status", "Value", "Limit", "Unit", "Util.", "Reason"),
              verdicts, ((16,) if several else ()) + (28, 19, 13, 13, 14, 10, 89 - (16 if several else 0)),
              status_column=2 if several else 1, size=6.5)

    # traceability, on the last sheet
    heading("Traceability")
    table(("Record", "Value"), _trace_rows(trace), (40, 146), size=6.5)
    return pdf


def render_pdf(results: Sequence[LineResult], **kwargs: Any) -> bytes:
    """The sheet as PDF bytes (see :func:`build_pdf`)."""
    return bytes(build_pdf(results, **kwargs).output())


def write_pdf(path: str | Path, results: Sequence[LineResult], **kwargs: Any) -> None:
    """Write :func:`render_pdf` to ``path``."""
    Path(path).write_bytes(render_pdf(results, **kwargs))
