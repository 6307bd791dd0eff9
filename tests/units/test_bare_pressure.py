"""Bare pressure units (9 psi, 0.5 bar, a header's [bar]): read as absolute, gauge or refused, and named on the line.

Numbers: 1 standard atmosphere = 101325 Pa exactly and 1 bar = 1e5 Pa exactly (SI definitions, ISO 80000-4);
1 psi = 6894.757293168361 Pa (NIST SP 811, App. B: 0.45359237 kg * 9.80665 m/s2 / 0.0254**2 m2).
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from boresize import check, make_line, run_lines, size, size_many
from boresize.cli.main import main
from boresize.errors import InputError, UnitError
from boresize.units import parse_pressure

ATM = 101325.0  # [Pa] SI definition (ISO 80000-4)
PSI = 6894.757293168361  # [Pa] NIST SP 811, App. B

NOTE_PSI = "pressure '9 psi' read as absolute (9 psia); write psig or psia to say which"
ERROR_PSI = ("line P-1: pressure: '9 psi' does not say gauge or absolute; expected a unit with g or a: psig (gauge) "
             "or psia (absolute)")


def _line(pressure: str = "9 psi", **more: str) -> dict[str, str]:
    return {"tag": "P-1", "fluid": "water", "flow": "45 t/h", "pressure": pressure, "temperature": "30 degC", **more}


@pytest.mark.parametrize(("cell", "mode", "pascal"), [
    ("9 psi", "absolute", 9 * PSI), ("9 psi", "gauge", 9 * PSI + ATM), ("0.5 bar", "absolute", 0.5e5),
    ("0.5 bar", "gauge", 0.5e5 + ATM), ("300 kPa", "gauge", 300e3 + ATM), ("1 MPa", "absolute", 1e6),
    ("-0.5 bar", "gauge", ATM - 0.5e5),
])
def test_a_bare_unit_is_read_as_the_mode_says(cell: str, mode: str, pascal: float) -> None:
    value, read = parse_pressure(cell, "pressure", None, mode)  # type: ignore[arg-type]
    assert math.isclose(value, pascal, rel_tol=1e-12)
    assert read is not None and read.read_as == mode


@pytest.mark.parametrize("cell", ["9 psig", "9 psia", "2 barg", "2 bar(a)", "300 kPag", "1 MPaa", "2 kg/cm2g"])
def test_a_unit_with_g_or_a_is_not_bare_and_passes_in_error_mode(cell: str) -> None:
    assert parse_pressure(cell, "pressure", None, "error")[1] is None


@pytest.mark.parametrize("mode", ["absolute", "gauge", "error"])
def test_a_standard_atmosphere_is_absolute_by_definition_in_every_mode(mode: str) -> None:
    # 1 atm = 101325 Pa (ISO 80000-4): a pressure level, so gauge mode must not read "1.5 atm" as 2.5 atm
    value, read = parse_pressure("1.5 atm", "pressure", None, mode)  # type: ignore[arg-type]
    assert math.isclose(value, 1.5 * ATM, rel_tol=1e-12) and read is None


def test_the_note_text_is_exact() -> None:
    assert parse_pressure("9 psi", "pressure")[1].note == NOTE_PSI  # type: ignore[union-attr]
    assert parse_pressure("5", "pressure", "bar", "gauge")[1].note == \
        "pressure '5 [bar]' read as gauge (5 barg); write barg or bara to say which"  # type: ignore[union-attr]
    assert parse_pressure("500 mbar", "pressure")[1].note == (  # type: ignore[union-attr]
        "pressure '500 mbar' read as absolute; write it in a unit with g (gauge) or a (absolute), such as barg "
        "or bara, to say which")


def test_error_mode_names_the_field_the_value_and_what_was_expected() -> None:
    with pytest.raises(UnitError) as info:
        make_line(**_line(), bare_pressure="error")
    assert str(info.value) == ERROR_PSI
    assert (info.value.field, info.value.value) == ("pressure", "9 psi")
    with pytest.raises(UnitError, match=r"^line P-1: min_outlet_pressure: '2 bar' does not say gauge or absolute; "
                                        r"expected a unit with g or a: barg \(gauge\) or bara \(absolute\)$"):
        make_line(**_line("9 barg", min_outlet_pressure="2 bar"), bare_pressure="error")


def test_make_line_records_each_bare_field_and_si_numbers_are_not_bare() -> None:
    line = make_line(**_line(min_outlet_pressure="2 bar"))
    assert [r.note for r in line.bare_pressures] == [
        NOTE_PSI, "min_outlet_pressure '2 bar' read as absolute (2 bara); write barg or bara to say which"]
    gauge = make_line(**_line(min_outlet_pressure="2 bar"), bare_pressure="gauge")
    assert math.isclose(gauge.pressure - line.pressure, ATM) and math.isclose(gauge.min_outlet_pressure or 0.0, 2e5 + ATM)
    assert make_line(tag="S", fluid="water", flow=1.0, pressure=4e5, temperature=300.0, si=True).bare_pressures == ()
    with pytest.raises(InputError, match="unknown bare-pressure mode 'gage'"):
        make_line(**_line(), bare_pressure="gage")  # type: ignore[arg-type]


def test_size_check_and_size_many_read_a_line_again_in_another_mode() -> None:
    line = make_line(**_line())
    absolute = size(line, plugins=False)
    assert absolute.notes[0] == NOTE_PSI
    gauge = size(line, plugins=False, bare_pressure="gauge")
    assert gauge.line is not None and math.isclose(gauge.line.pressure, 9 * PSI + ATM)
    assert gauge.notes[0] == "pressure '9 psi' read as gauge (9 psig); write psig or psia to say which"
    refused = check(line, "4", plugins=False, bare_pressure="error")
    assert refused.status == "error" and refused.error == ERROR_PSI and refused.error_field == "pressure"
    many = size_many([line, make_line(**_line("9 psig"))], plugins=False, workers=1, bare_pressure="error")
    assert [r.status for r in many] == ["error", "pass"]


def test_run_lines_counts_the_lines_read_from_a_bare_unit(tmp_path: Path) -> None:
    path = tmp_path / "lines.csv"
    path.write_text("tag,fluid,flow,pressure [bar],temperature\nA,water,45 t/h,9 barg,30 degC\n"
                    "B,water,45 t/h,9,30 degC\nC,water,45 t/h,9 psi,30 degC\n", encoding="utf-8")
    run = run_lines(path, plugins=False)
    assert run.summary() == ("3 lines: 3 pass, 0 fail, 0 error; 2 with a pressure in a bare unit (neither g nor a: "
                             "see the line's notes)")
    assert run.document()["summary"]["bare_pressure"] == 2
    assert [r.notes[:1] for r in run.results] == [(), ("pressure '9 [bar]' read as absolute (9 bara); write barg or "
                                                       "bara to say which",), (NOTE_PSI.replace("P-1", "C"),)]
    refused = run_lines(path, plugins=False, bare_pressure="error")
    assert [r.status for r in refused.results] == ["pass", "error", "error"]
    assert refused.document()["summary"]["bare_pressure"] == 0


@pytest.mark.parametrize(("mode", "status", "bar_abs"), [("absolute", "pass", 9 * PSI / 1e5),
                                                         ("gauge", "pass", (9 * PSI + ATM) / 1e5),
                                                         ("error", "error", None)])
def test_the_command_line_option(tmp_path: Path, capsys: pytest.CaptureFixture[str], mode: str, status: str,
                                 bar_abs: float | None) -> None:
    path = tmp_path / "lines.csv"
    path.write_text("tag,fluid,flow,pressure,temperature\nP-1,water,45 t/h,9 psi,30 degC\n", encoding="utf-8")
    code = main(["size", str(path), "--json", "--no-plugins", "--bare-pressure", mode])
    captured = capsys.readouterr()
    entry = json.loads(captured.out)["lines"][0]
    assert (code, entry["status"]) == ((0, "pass") if status == "pass" else (1, "error"))
    if bar_abs is None:
        assert entry["error"] == ERROR_PSI and "0 error" not in captured.err
    else:
        assert math.isclose(entry["pressure_bar_abs"], bar_abs, rel_tol=1e-5)
        assert "1 with a pressure in a bare unit" in captured.err


def test_an_unknown_mode_on_the_command_line_is_a_usage_error(capsys: pytest.CaptureFixture[str]) -> None:
    with pytest.raises(SystemExit) as info:
        main(["size", "x.csv", "--bare-pressure", "gage"])
    assert info.value.code == 2 and "invalid choice: 'gage'" in capsys.readouterr().err


def test_numpy_numbers_under_a_header_unit_are_bare_and_shown_as_numbers() -> None:
    import numpy as np

    assert parse_pressure(np.float64(5.0), "pressure", "bar")[1].note == \
        "pressure '5.0 [bar]' read as absolute (5.0 bara); write barg or bara to say which"  # type: ignore[union-attr]
    assert parse_pressure(np.int64(5), "pressure", "bar", "gauge")[0] == 5e5 + ATM
