"""The calculation sheet: the document block (file, mapping, bad input), titles without local paths, the hydraulic
totals on every record, and a checker's walk-through that redoes one line from the rendered HTML alone.

Outside references for the walk-through: Darcy-Weisbach dp = f (L/D) rho v^2/2 and the Colebrook-White equation
1/sqrt(f) = -2 log10(e/(3.7 D) + 2.51/(Re sqrt(f))) (C. F. Colebrook, J. ICE 11 (1939) 133-156), solved here by
plain fixed-point iteration; g = 9.80665 m/s2 (CGPM 1901); the standard library's HTML parser.
"""

from __future__ import annotations

import math
import re
from html.parser import HTMLParser
from pathlib import Path

import pytest

from boresize.api import DocumentBlock, read_document_block, run_lines
from boresize.cli.main import main
from boresize.errors import InputError

# water at 30 degC: 996 kg/m3, 0.80 mPa s, vapour pressure 4.25 kPa (IAPWS-95 via any steam table), rounded
LINES = ("tag,fluid,flow,pressure,temperature,length,elevation,fittings,fixed_drop,density,viscosity,"
         "vapour_pressure,service\n"
         "WT-1,water,40 t/h,6 bara,30 degC,180 m,7.5 m,elbow-90-lr: 6; gate: 2; check-swing,0.35 bar,"
         "996 kg/m3,0.8 mPa s,0.0425 bara,liquid\n")
SHEET = ('project = "Walk-through"\nunit = "Unit 7"\nnumber = "CALC-7-001"\nrevision = 2\ndate = 2026-12-03\n'
         'prepared = "P. Reparer"\nchecked = "C. Hecker"\napproved = ""\nnotes = "For the test."\n')


#: how far a hand result from numbers printed to 4 significant figures may stray (about 5 terms x 0.05 %)
ROUNDED = 2.5e-3


class _Tables(HTMLParser):
    """Every table of a page as rows of cell texts; and the page's title and headings."""

    def __init__(self) -> None:
        super().__init__()
        self.tables: list[list[list[str]]] = []
        self.headings: list[str] = []
        self._cell: list[str] | None = None
        self._heading: list[str] | None = None

    def handle_starttag(self, tag, attrs):  # type: ignore[no-untyped-def]
        if tag == "table":
            self.tables.append([])
        elif tag == "tr" and self.tables:
            self.tables[-1].append([])
        elif tag in ("td", "th"):
            self._cell = []
        elif tag in ("title", "h1", "h2", "h3"):
            self._heading = []

    def handle_endtag(self, tag):  # type: ignore[no-untyped-def]
        if tag in ("td", "th") and self._cell is not None and self.tables:
            self.tables[-1][-1].append("".join(self._cell).strip())
            self._cell = None
        elif tag in ("title", "h1", "h2", "h3") and self._heading is not None:
            self.headings.append("".join(self._heading).strip())
            self._heading = None

    def handle_data(self, data):  # type: ignore[no-untyped-def]
        if self._cell is not None:
            self._cell.append(data)
        if self._heading is not None:
            self._heading.append(data)

    def table(self, first_heading: str) -> list[list[str]]:
        return next(t for t in self.tables if t and t[0] and t[0][0] == first_heading)

    def row(self, first_heading: str, label: str) -> list[str]:
        return next(r for r in self.table(first_heading) if r[0].startswith(label))


def _numbers(text: str) -> list[float]:
    return [float(x) for x in re.findall(r"[-+]?\d+(?:\.\d+)?(?:e[-+]?\d+)?", text.replace("\u2212", "-"))]


@pytest.fixture(scope="module")
def page(tmp_path_factory: pytest.TempPathFactory) -> str:
    folder = tmp_path_factory.mktemp("sheet")
    (folder / "lines.csv").write_text(LINES, encoding="utf-8")
    (folder / "sheet.toml").write_text(SHEET, encoding="utf-8")
    run = run_lines(folder / "lines.csv", document=folder / "sheet.toml")
    return run.write(folder / "report.html").read_text(encoding="utf-8")


def test_a_checker_redoes_the_drop_and_outlet_pressure_from_the_record_alone(page: str) -> None:
    parsed = _Tables()
    parsed.feed(page)
    eq = "Quantity"
    # the inputs, as printed (numbers put into the equations, SI)
    mass, rho, d = _numbers(parsed.row(eq, "velocity")[2])[0], *_numbers(parsed.row(eq, "velocity")[2])[1:3]
    rho_re, v, d_re, mu = _numbers(parsed.row(eq, "Reynolds")[2])
    rough, _ = _numbers(parsed.row(eq, "relative roughness")[2])
    f_printed = _numbers(parsed.row(eq, "friction factor")[3])[0]
    used = "As used"
    length = _numbers(parsed.row(used, "length")[1])[0]
    rise = _numbers(parsed.row(used, "elevation")[1])[0]
    p_in = _numbers(parsed.row(eq, "outlet pressure")[2])[0] * 1e3  # p_in - total drop, kPa
    assert (rho, d) == (rho_re, d_re) and length == 180 and rise == 7.5
    totals = "Hydraulics at the selected size"
    fixed = _numbers(parsed.row(totals, "fixed allowances")[1])[0] * 1e3
    k_sum = sum(_numbers(r[1])[0] * _numbers(r[2])[0] for r in parsed.table("Fitting")[1:])
    assert [r[0] for r in parsed.table("Fitting")[1:]] == ["elbow-90-lr", "gate", "check-swing"]
    # redone by hand. The record prints every quantity to 4 significant figures, each within half a unit of its
    # 4th figure (0.05 % relative at most); a product or quotient of n printed numbers is then good to about n x
    # 0.05 %: ROUNDED bounds the hand results, a sum of printed kPa to the 4th figure of its largest term.
    v_hand = mass / (rho * math.pi * d * d / 4)
    assert v_hand == pytest.approx(v, rel=ROUNDED)
    re_hand = rho * v * d / mu
    f = 0.02
    for _ in range(60):
        f = (-2 * math.log10(rough / d / 3.7 + 2.51 / (re_hand * math.sqrt(f)))) ** -2
    assert f == pytest.approx(f_printed, rel=ROUNDED)
    q = rho * v * v / 2
    friction = f_printed * length / d * q
    fittings = k_sum * q  # no equivalent-length items here
    static = rho * 9.80665 * rise
    total = friction + fittings + static + fixed
    printed_total = _numbers(parsed.row(totals, "total drop")[1])[0] * 1e3
    printed_out = _numbers(parsed.row(totals, "outlet pressure")[1])[0] * 1e5
    assert _numbers(parsed.row(totals, "pipe friction")[1])[0] * 1e3 == pytest.approx(friction, rel=ROUNDED)
    assert _numbers(parsed.row(totals, "fittings (sum K")[1])[0] * 1e3 == pytest.approx(fittings, rel=ROUNDED)
    assert total == pytest.approx(printed_total, rel=ROUNDED)
    assert p_in - total == pytest.approx(printed_out, rel=3e-4)  # 4 figures of ~5 bar: 0.0005 bar each


# nitrogen at 3 bara and 20 degC over 1500 m: a drop of ~17 % of the inlet pressure, so the gas line is marched
GAS = ("tag,fluid,flow,pressure,temperature,length,fittings,service\n"
       "GN-1,nitrogen,3000 kg/h,3 bara,20 degC,1500 m,elbow-90-lr: 4,gas\n")


def test_a_checker_redoes_a_marched_gas_line_by_the_isothermal_equation(tmp_path: Path) -> None:
    """The isothermal flow equation of an ideal gas with one friction factor, p1^2 - p2^2 = G^2 (p1/rho1)
    [f L/D + 2 ln(p1/p2)] (Crane TP-410, eq. 1-6 with the acceleration term; any text on compressible pipe flow),
    fittings as equivalent length K D/f, solved by fixed-point iteration from the numbers the record prints."""
    (tmp_path / "gas.csv").write_text(GAS, encoding="utf-8")
    run = run_lines(tmp_path / "gas.csv")
    parsed = _Tables()
    parsed.feed(run.write(tmp_path / "gas.html").read_text(encoding="utf-8"))
    assert parsed.row("Hydraulics at the selected size", "segments")[1] != "1 (one density all along)"
    check = parsed.row("Quantity", "outlet pressure (hand check")
    g_flux, p1, rho1, f, length, k_sum, d = _numbers(check[2].split("kg/(m")[0])[:1] + [
        _numbers(check[2].split(part)[1])[0] for part in ("p₁ =", "ρ₁ =", "f =", "L =", "ΣK =", "D =")]
    p2 = p1
    for _ in range(100):
        p2 = math.sqrt(p1 * p1 - g_flux * g_flux * p1 / rho1 * (f * (length + k_sum * d / f) / d
                                                                + 2 * math.log(p1 / p2)))
    marched = _numbers(parsed.row("Hydraulics at the selected size", "outlet pressure")[1])[0] * 1e5
    assert p2 == pytest.approx(_numbers(check[3])[0] * 1e3, rel=ROUNDED)
    given = parsed.table("Input (as given)")
    assert all(len(row) == 2 for row in given)  # no header of GAS names a unit: no empty unit column
    # the march (real gas, f along the line, 16 segments) and the one-step equation agree within a few tenths of
    # a per cent of the outlet pressure for this near-ideal gas
    assert p2 == pytest.approx(marched, rel=5e-3)


def test_the_pdf_sheet_carries_the_same_walk_through(tmp_path: Path) -> None:
    """The PDF's text runs (read back as tests/report/test_pdf_sheet.py does): the total is the sum of its
    printed parts, and the outlet pressure the inlet's less the total."""
    pytest.importorskip("fpdf")
    from test_pdf_sheet import _sheet  # type: ignore[import-not-found]

    (tmp_path / "lines.csv").write_text(LINES, encoding="utf-8")
    *_, texts = _sheet(run_lines(tmp_path / "lines.csv"))
    runs = " | ".join(texts).split(" | ")
    at = runs.index("Δp = Δp_f + Δp_k + Δp_s + Δp_fixed")
    parts, total = _numbers(runs[at + 1]), _numbers(runs[at + 2])[0]
    assert len(parts) == 4 and sum(parts) == pytest.approx(total, rel=ROUNDED)  # each part to its 4th figure
    at = runs.index("p_out = p_in − Δp")
    (p_in, drop), p_out = _numbers(runs[at + 1]), _numbers(runs[at + 2])[0]
    assert drop == total and p_in - drop == pytest.approx(p_out, rel=ROUNDED)


def test_the_page_shows_the_document_block_and_no_local_path(page: str, tmp_path: Path) -> None:
    parsed = _Tables()
    parsed.feed(page)
    block = {r[0]: (r[1] if len(r) > 1 else "") for r in parsed.tables[0]}
    assert block == {"project": "Walk-through", "unit": "Unit 7", "number": "CALC-7-001", "revision": "2",
                     "date": "2026-12-03", "prepared": "P. Reparer", "checked": "C. Hecker", "approved": "",
                     "notes": "For the test."}
    assert parsed.headings[0] == "boresize line sizing report - CALC-7-001 - rev. 2 - Walk-through"
    assert not any("/" in h for h in parsed.headings)


def test_without_a_document_the_title_is_the_file_name_not_its_folder(tmp_path: Path) -> None:
    (tmp_path / "lines.csv").write_text(LINES, encoding="utf-8")
    run = run_lines(tmp_path / "lines.csv")
    parsed = _Tables()
    parsed.feed(run.write(tmp_path / "r.html").read_text(encoding="utf-8"))
    assert parsed.headings[0] == "boresize line sizing report - lines.csv"
    assert str(tmp_path) not in "".join(parsed.headings)
    # Run.write takes a block for one file (a mapping here)
    parsed = _Tables()
    parsed.feed(run.write(tmp_path / "r2.html", document={"number": "N-1"}).read_text(encoding="utf-8"))
    assert parsed.headings[0] == "boresize line sizing report - N-1"


def test_every_record_shows_the_totals_without_an_outlet_criterion(page: str) -> None:
    parsed = _Tables()
    parsed.feed(page)
    labels = [r[0] for r in parsed.table("Hydraulics at the selected size")[1:]]
    for label in ("drop method", "segments", "pipe friction", "fittings method", "static head", "fixed allowances",
                  "acceleration (gas)", "total drop", "outlet pressure", "choked"):
        assert any(x.startswith(label) for x in labels), label


@pytest.mark.parametrize(("text", "field", "part"), [
    ('projekt = "x"\n', "document", "unknown key 'projekt'"),
    ("project = 3.5\n", "document.project", "project = 3.5 is a float, not text"),
    ("revision = true\n", "document.revision", "is a bool"),
    ('prepared = ["a", "b"]\n', "document.prepared", "is a list"),
    ("date = 12:00:00\n", "document.date", "is a time"),
    ('project = "x\n', "document", "is not valid TOML"),
    ('project = "x"\nproject = "y"\n', "document", "is not valid TOML"),
    ("", "document", "holds no keys"),
    ('[sheet]\nproject = "x"\n', "document", "unknown key 'sheet'"),
    ('notes = "a\\u0007b"\n', "document.notes", "control character"),
    (f'notes = "{"x" * 2001}"\n', "document.notes", "2001 characters"),
    ("# " + "x" * 100_001 + "\n", "document", "larger than 100 kB"),
])
def test_a_bad_document_file_is_refused_naming_the_file_key_and_what_is_accepted(
        tmp_path: Path, text: str, field: str, part: str) -> None:
    path = tmp_path / "sheet.toml"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(InputError) as caught:
        read_document_block(path)
    assert caught.value.field == field and part in str(caught.value)
    assert str(path) in str(caught.value) and caught.value.expected


def test_a_document_block_from_a_mapping_or_a_table() -> None:
    from boresize.io.document_block import document_block

    assert document_block({"revision": 3, "date": "2026-01-02"}) == DocumentBlock(revision="3", date="2026-01-02")
    with pytest.raises(InputError, match="a list is not a document block"):
        document_block(["project"])  # type: ignore[arg-type]
    with pytest.raises(InputError, match="unknown key 'Project'"):
        run_lines([], document={"Project": "x"})


def test_the_cli_refuses_a_bad_document_before_sizing_with_exit_code_2(tmp_path: Path,
                                                                        capsys: pytest.CaptureFixture[str]) -> None:
    (tmp_path / "lines.csv").write_text(LINES, encoding="utf-8")
    (tmp_path / "bad.toml").write_bytes(b"\xff\xfeproject")
    code = main(["size", str(tmp_path / "lines.csv"), "--document", str(tmp_path / "bad.toml")])
    err = capsys.readouterr().err
    assert code == 2 and "is not UTF-8 text" in err and "Traceback" not in err
    code = main(["size", str(tmp_path / "lines.csv"), "--document", str(tmp_path / "missing.toml")])
    assert code == 2 and "cannot read document file" in capsys.readouterr().err


@pytest.mark.parametrize(("value", "shown"), [(338257.0, "338300"), (4.0, "4.000"), (0.69904, "0.6990"),
                                              (49500.0, "49500"), (-12.345, "-12.35"), (0.0, "0"), (None, "-")])
def test_summary_numbers_keep_four_significant_figures_in_fixed_notation(value: float | None, shown: str) -> None:
    from boresize.report.html import _sig

    assert _sig(value) == shown


def test_the_summary_row_has_fluid_flow_pressure_and_temperature(page: str) -> None:
    parsed = _Tables()
    parsed.feed(page)
    head, row = parsed.table("Tag")[:2]
    cells = dict(zip(head, row))
    assert cells["Fluid"] == "water" and cells["P in [bar abs]"] == "6.000" and cells["T [degC]"] == "30.0"
    assert float(cells["Sizing flow [kg/h]"]) >= 40000  # 40 t/h, and the service's design margin if any


def test_the_document_block_reaches_the_json_document_and_the_workbook_cover(tmp_path: Path) -> None:
    from jsonschema import Draft202012Validator
    from openpyxl import load_workbook

    from boresize.api import document_schema

    (tmp_path / "lines.csv").write_text(LINES, encoding="utf-8")
    (tmp_path / "sheet.toml").write_text(SHEET, encoding="utf-8")
    run = run_lines(tmp_path / "lines.csv", document=tmp_path / "sheet.toml")
    expected = {"project": "Walk-through", "unit": "Unit 7", "number": "CALC-7-001", "revision": "2",
                "date": "2026-12-03", "prepared": "P. Reparer", "checked": "C. Hecker", "approved": "",
                "notes": "For the test."}
    doc = run.document()
    assert doc["document"] == expected
    assert list(Draft202012Validator(document_schema()).iter_errors(doc)) == []
    assert "document" not in run_lines(tmp_path / "lines.csv").document()  # no block given: no key
    written = __import__("json").loads(run.write(tmp_path / "r.json").read_text(encoding="utf-8"))
    assert written["document"] == expected
    cover = load_workbook(run.write(tmp_path / "r.xlsx"))["cover"]
    cells = {row[0]: row[1] for row in cover.iter_rows(values_only=True) if row and row[0] in expected}
    assert {k: v or "" for k, v in cells.items()} == expected
    # a block given to write() alone replaces the run's own in that file
    other = load_workbook(run.write(tmp_path / "o.xlsx", document={"project": "Other"}))["cover"]
    assert any(row[:2] == ("project", "Other") for row in other.iter_rows(values_only=True))
    extra = dict(doc)
    extra["document"] = {**expected, "owner": "x"}  # the schema refuses an undeclared key in the block
    assert list(Draft202012Validator(document_schema()).iter_errors(extra))
