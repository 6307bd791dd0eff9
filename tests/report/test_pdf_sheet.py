"""The PDF calculation sheet (``-o report.pdf``): pages counted in the file itself ('/Type /Page' objects), the text
of every page read back from the uncompressed content streams (fpdf2 writes each character as its two-byte code in
the font subset; the subset's own table maps codes back to characters), the document block and "sheet N of M" on
every page, at most two sheets a line for the demo unit, a missing fpdf2 named with its extra, hostile inputs.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from boresize.api import run_lines
from boresize.cli.main import main
from boresize.optional import MissingModuleError

pytest.importorskip("fpdf")

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
SHEET = ('project = "Ελληνικά: Δp ρ ε"\nunit = "Unit 7"\nnumber = "CALC-7-001"\nrevision = 2\ndate = 2026-12-03\n'
         'prepared = "P. Reparer"\nchecked = "C. Hecker"\napproved = "A. Pprover"\nnotes = "For the test."\n')
TOKENS = re.compile(rb"/F(\d+) [\d.]+ Tf|\(((?:\\.|[^\\)])*)\) Tj", re.S)
ESCAPES = {ord("n"): 10, ord("r"): 13, ord("t"): 9, ord("b"): 8, ord("f"): 12}


def _unescape(raw: bytes) -> bytes:
    out, i = bytearray(), 0
    while i < len(raw):
        if raw[i] == 0x5C:  # backslash
            nxt = raw[i + 1]
            if 0x30 <= nxt <= 0x37:
                digits = re.match(rb"[0-7]{1,3}", raw[i + 1:i + 4]).group()  # type: ignore[union-attr]
                out.append(int(digits, 8))
                i += 1 + len(digits)
                continue
            out.append(ESCAPES.get(nxt, nxt))
            i += 2
        else:
            out.append(raw[i])
            i += 1
    return bytes(out)


def page_texts(pdf, data: bytes) -> list[str]:  # type: ignore[no-untyped-def]
    """The text of each page, decoded through each font's subset table."""
    reverse = {font.i: {cid: chr(glyph.unicode[0]) for glyph, cid in font.subset._char_id_per_glyph.items()
                        if glyph.unicode and glyph.unicode[0]} for font in pdf.fonts.values()}
    pages = []
    for stream in re.findall(rb"stream\n(2 J\n.*?)endstream", data, re.S):
        font, text = None, []
        for match in TOKENS.finditer(stream):
            if match.group(1):
                font = int(match.group(1))
                continue
            raw = _unescape(match.group(2))
            codes = [int.from_bytes(raw[k:k + 2], "big") for k in range(0, len(raw), 2)]
            text.append("".join(reverse[font].get(code, "\ufffd") for code in codes))
        pages.append(" | ".join(text))
    return pages


def _sheet_n_of_m(n: int, total: int, text: str) -> bool:
    """"sheet | N of M" in a page's text (fpdf2 writes the page count, filled in last, as a text run of its own)."""
    return re.search(rf"\| sheet \| {n} of\s*(\| )?{total}\b", text) is not None


def _sheet(run, document=None):  # type: ignore[no-untyped-def]
    from boresize.api.output import page_title
    from boresize.report.pdf import build_pdf

    pdf = build_pdf(run.results, trace=run.trace.to_dict(), title=page_title(run),
                    headers=run.line_list.headers or None, units=run.line_list.units,
                    document=run.document_block)
    pdf.set_compression(False)
    data = bytes(pdf.output())
    return pdf, data, page_texts(pdf, data)


@pytest.fixture(scope="module")
def demo(tmp_path_factory):  # type: ignore[no-untyped-def]
    path = tmp_path_factory.mktemp("doc") / "sheet.toml"
    path.write_text(SHEET, encoding="utf-8")
    run = run_lines(DEMO / "lines.csv", DEMO / "criteria.toml", plugins=False, document=path)
    return run, *_sheet(run)


def test_every_page_has_the_document_block_and_sheet_n_of_m(demo):  # type: ignore[no-untyped-def]
    run, pdf, data, texts = demo
    total = pdf.pages_count
    assert data.count(b"/Type /Page\n") == total == len(texts) > 1
    for n, text in enumerate(texts, 1):
        assert _sheet_n_of_m(n, total, text), (n, text[:300])
        for value in ("Ελληνικά: Δp ρ ε", "Unit 7", "CALC-7-001", "2026-12-03", "P. Reparer", "C. Hecker",
                      "A. Pprover"):
            assert value in text, (n, value)
        assert "competent engineer" in text  # the caution at the foot of every page
    assert "{nb}" not in " ".join(texts)


def test_the_summary_sheet_and_a_line_record(demo):  # type: ignore[no-untyped-def]
    run, pdf, data, texts = demo
    first = texts[0].replace(" | ", " ")  # a heading wrapped in its cell is two text runs
    assert "They must be checked by a competent engineer" in first and "For the test." in first  # not the footer's
    for head in ("Tag", "Fluid", "Flow [kg/h]", "P in [bar abs]", "T [°C]", "Size", "v [m/s]", "Δp [kPa/100 m]",
                 "Controlling", "Util.", "Status"):
        assert head in first, head
    for result in run.results:
        assert result.tag in first
    body = " ".join(texts[1:])
    for text in ("Input as used", "property source", "Hydraulics at the selected size", "total drop",
                 "outlet pressure", "Δp_f = f (L/D) ρ v² / 2", "ε / D", "Criterion", "Limit", "Traceability"):
        assert text in body, text


def test_a_demo_line_takes_at_most_two_sheets(demo):  # type: ignore[no-untyped-def]
    run, pdf, data, texts = demo
    starts = [n for n, text in enumerate(texts) if re.search(r"\| Line \S+: (pass|fail|error)", text)]
    assert len(starts) == len(run.results)
    ends = starts[1:] + [len(texts)]
    assert max(end - start for start, end in zip(starts, ends)) <= 2, list(zip(starts, ends))


def test_the_cli_writes_a_pdf_and_no_title_shows_a_folder(tmp_path, capsys):  # type: ignore[no-untyped-def]
    out = tmp_path / "sheet.pdf"
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                 "-q", "-o", str(out)])
    assert code in (0, 1)
    data = out.read_bytes()
    assert data.startswith(b"%PDF-") and data.rstrip().endswith(b"%%EOF")
    assert str(DEMO).encode() not in data and str(tmp_path).encode() not in data
    assert not list(tmp_path.glob(".*boresize-tmp*"))


def test_a_missing_fpdf2_names_the_report_extra(tmp_path, monkeypatch, capsys):  # type: ignore[no-untyped-def]
    monkeypatch.setitem(__import__("sys").modules, "fpdf", None)
    monkeypatch.setitem(__import__("sys").modules, "fpdf.fonts", None)
    out = tmp_path / "sheet.pdf"
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                 "-q", "-o", str(out)])
    err = capsys.readouterr().err
    assert code == 2 and "internal error" not in err and "Traceback" not in err
    assert "'fpdf' is not installed, and the PDF calculation sheet needs it: install boresize[report]" in err, err
    assert not out.exists()
    from boresize.report.pdf import render_pdf

    with pytest.raises(MissingModuleError, match=r"install boresize\[report\]"):
        render_pdf([], trace={}, title="t")


LINE = ("tag,fluid,flow,pressure,temperature,length,density,viscosity,service\n"
        "{tag},water,40 t/h,6 bara,30 degC,80 m,996 kg/m3,0.8 mPa s,liquid\n")


@pytest.mark.parametrize("document, tag", [
    ({"project": "工場 プロジェクト 🚀 Ωmega", "prepared": "Émile Zoë", "notes": "⚠️ " + "x" * 1900}, "P-1"),
    ({"project": "p" * 2000, "number": "N" * 2000}, "T" * 400),
    (None, "Ρ-λ/ε 🔥"),
])
def test_hostile_text_prints_without_error(document, tag):  # type: ignore[no-untyped-def]
    import io

    run = run_lines(io.StringIO(LINE.format(tag=tag)), plugins=False, document=document)
    pdf, data, texts = _sheet(run)
    assert pdf.pages_count <= 4
    for n, text in enumerate(texts, 1):
        assert _sheet_n_of_m(n, pdf.pages_count, text)
    if document and "prepared" in document:
        assert "Émile Zoë" in texts[-1] and "Ωmega" in texts[0] and "?" in texts[0]  # glyphs the font lacks: "?"


def test_no_lines_and_a_line_in_error():  # type: ignore[no-untyped-def]
    import io

    from boresize.report.pdf import build_pdf

    pdf = build_pdf([], trace={}, title="empty")
    assert pdf.pages_count == 1
    run = run_lines(io.StringIO(LINE.format(tag="E-1").replace("40 t/h", "forty")), plugins=False)
    assert run.results[0].status == "error"
    pdf, data, texts = _sheet(run)
    assert pdf.pages_count == 2 and "Error:" in texts[1] and "flow" in texts[1]


def test_a_two_phase_line_has_its_block_and_caution():  # type: ignore[no-untyped-def]
    import io
    import sys

    sys.path.insert(0, str(Path(__file__).resolve().parents[1] / "io"))
    from test_two_phase_outputs import two_phase  # the hand-built two-phase result of the output tests

    from boresize.report.pdf import build_pdf

    run = run_lines(io.StringIO("tag,fluid,flow,pressure,temperature\nTP-1,water,20 t/h,5 bara,40 degC\n"),
                    plugins=False)
    pdf = build_pdf([two_phase(run.results[0])], trace={}, title="tp")
    pdf.set_compression(False)
    texts = page_texts(pdf, bytes(pdf.output()))
    assert "Two-phase lines carry large uncertainty" in texts[0]
    assert "Two-phase flow (selected size)" in " ".join(texts[1:]) and "liquid holdup" in " ".join(texts[1:])


def test_no_status_word_is_cut_in_its_column(demo):  # type: ignore[no-untyped-def]
    """A verdict status is one text run: the issue found "not-applica | ble" in the PDF's status column."""
    run, pdf, data, texts = demo
    statuses = {v.status for r in run.results if r.selected for v in r.selected.verdicts}
    assert "not-applicable" in statuses  # the demo has no outlet criterion on most lines
    runs = {cell for text in texts for cell in text.split(" | ")}
    assert statuses <= runs, statuses - runs
