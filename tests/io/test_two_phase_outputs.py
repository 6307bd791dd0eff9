"""A two-phase line's details in every output: JSON (valid against the schema), CSV, XLSX, DataFrame, HTML, the
terminal table and the CLI's caution; single-phase lines unchanged (null, empty, no two-phase block).

No backend yields two-phase lines yet, so the two-phase result is a real water line's result with a hand-built
two-phase state and TwoPhaseFlow put in (the numbers are made up to be told apart, not a calculation).
"""

from __future__ import annotations

import csv
import dataclasses
import json
import math
from pathlib import Path

import jsonschema
import openpyxl
import pytest
from markupsafe import escape

from boresize import api
from boresize.io.csv_writer import write_csv
from boresize.io.dataframe import results_dataframe
from boresize.io.document import TWO_PHASE_CAUTION, TWO_PHASE_KEYS, document, document_schema, dumps_strict, two_phase_count
from boresize.io.xlsx import write_xlsx
from boresize.model import LineResult, TwoPhaseFlow
from boresize.report.html import render_html
from boresize.report.terminal import render_table

FLOW = TwoPhaseFlow(method="Beggs-Brill", vapour_fraction=0.125, flow_regime="intermittent", regime_map="Beggs-Brill",
                    liquid_holdup=0.4375, superficial_liquid_velocity=1.25, superficial_gas_velocity=6.5,
                    mixture_velocity=7.75, mixture_density=43.25, liquid_density=950.5, gas_density=5.75,
                    liquid_viscosity=2.5e-4, gas_viscosity=1.25e-5, surface_tension=0.0575,
                    fittings_method="Chisholm", segments=8, outlet_vapour_fraction=0.1875, flash_point=12.5)


@pytest.fixture(scope="module")
def run(tmp_path_factory: pytest.TempPathFactory) -> api.Run:
    lines = tmp_path_factory.mktemp("tp") / "lines.csv"
    lines.write_text("tag,fluid,flow,pressure,temperature\nW-1,water,20 t/h,5 bara,40 degC\n"
                     "TP-1,water,20 t/h,5 bara,40 degC\n", encoding="utf-8")
    return api.run_lines(lines, plugins=False)


def two_phase(result: LineResult, flow: TwoPhaseFlow = FLOW, **state: object) -> LineResult:
    """``result`` with a two-phase state and ``flow`` at its selected size."""
    assert result.selected is not None and result.state is not None
    hydraulics = dataclasses.replace(result.selected.hydraulics, two_phase=flow, velocity=flow.mixture_velocity)
    selected = dataclasses.replace(result.selected, hydraulics=hydraulics)
    fluid = dataclasses.replace(result.state, **{"phase": "two-phase", "vapour_fraction": flow.vapour_fraction,
                                                 "liquid_density": flow.liquid_density, "gas_density": flow.gas_density,
                                                 "liquid_viscosity": flow.liquid_viscosity,
                                                 "gas_viscosity": flow.gas_viscosity,
                                                 "surface_tension": flow.surface_tension, **state})
    return dataclasses.replace(result, selected=selected, state=fluid)


@pytest.fixture(scope="module")
def mixed(run: api.Run) -> list[LineResult]:
    return [run.results[0], two_phase(run.results[1])]


def _doc(results: list[LineResult]) -> dict[str, object]:
    doc = json.loads(dumps_strict(document(results, criteria_source="shipped", lines_source="test")))
    jsonschema.validate(doc, document_schema())
    return doc


def test_json_carries_the_two_phase_keys_and_single_phase_lines_have_them_null(mixed):
    single, tp = _doc(mixed)["lines"]  # type: ignore[index]
    assert tp["phase"] == "two-phase" and tp["vapour_fraction"] == 0.125
    assert (tp["two_phase_method"], tp["flow_regime"], tp["regime_map"]) == ("Beggs-Brill", "intermittent", "Beggs-Brill")
    assert (tp["liquid_holdup"], tp["superficial_liquid_velocity_m_s"], tp["superficial_gas_velocity_m_s"],
            tp["mixture_velocity_m_s"], tp["mixture_density_kg_m3"]) == (0.4375, 1.25, 6.5, 7.75, 43.25)
    assert (tp["liquid_density_kg_m3"], tp["gas_density_kg_m3"], tp["liquid_viscosity_mpa_s"], tp["gas_viscosity_mpa_s"],
            tp["surface_tension_mn_m"]) == (950.5, 5.75, 0.25, 0.0125, 57.5)
    assert (tp["two_phase_fittings_method"], tp["segments"], tp["outlet_vapour_fraction"], tp["flash_point_m"]) == \
        ("Chisholm", 8, 0.1875, 12.5)
    assert single["phase"] == "liquid"
    assert all(single[key] is None for key in (*TWO_PHASE_KEYS, "liquid_density_kg_m3", "surface_tension_mn_m"))


def test_the_per_phase_properties_come_from_the_flow_when_the_state_lacks_them(run):
    bare = two_phase(run.results[1], liquid_density=None, surface_tension=None)
    entry = _doc([bare])["lines"][0]  # type: ignore[index]
    assert entry["liquid_density_kg_m3"] == 950.5 and entry["surface_tension_mn_m"] == 57.5


@pytest.mark.parametrize("changes", [
    {"liquid_holdup": float("nan")}, {"liquid_holdup": None}, {"surface_tension": None},
    {"mixture_density": float("inf")}, {"superficial_gas_velocity": 1e300}, {"outlet_vapour_fraction": None,
                                                                              "flash_point": None},
    {"method": "=HYPERLINK(\"x\")", "flow_regime": "<script>alert(1)</script>", "fittings_method": ""},
    {"vapour_fraction": -0.0, "liquid_holdup": 1e-300}, {"segments": 10**6},
])
def test_hostile_two_phase_values_give_valid_outputs(run, tmp_path, changes):
    flow = dataclasses.replace(FLOW, **changes)
    results = [run.results[0], two_phase(run.results[1], flow, surface_tension=None)]
    entry = _doc(results)["lines"][1]  # type: ignore[index]
    for key, value in changes.items():
        shown = {"superficial_gas_velocity": "superficial_gas_velocity_m_s", "method": "two_phase_method",
                 "mixture_density": "mixture_density_kg_m3", "flash_point": "flash_point_m",
                 "fittings_method": "two_phase_fittings_method"}.get(key, key)
        if shown == "surface_tension":
            assert entry["surface_tension_mn_m"] is None
        elif isinstance(value, float) and not math.isfinite(value):
            assert entry[shown] is None and any(shown in note for note in entry["notes"])
        elif value == "":
            assert entry[shown] is None
        elif isinstance(value, (int, float)) and not isinstance(value, bool):
            assert entry[shown] == pytest.approx(value)
    write_csv(tmp_path / "out.csv", results)
    write_xlsx(tmp_path / "out.xlsx", results)
    page = render_html(results, trace={}, title="hostile")
    assert "<script>" not in page and "two-phase" in page
    with open(tmp_path / "out.csv", encoding="utf-8-sig", newline="") as handle:
        rows = list(csv.DictReader(handle))
    assert not rows[1]["result.two-phase method"].startswith("=")


def test_csv_and_xlsx_columns(mixed, tmp_path: Path):
    write_csv(tmp_path / "out.csv", mixed)
    with open(tmp_path / "out.csv", encoding="utf-8-sig", newline="") as handle:
        single, tp = list(csv.DictReader(handle))
    assert (tp["result.phase"], tp["result.flow regime"], tp["result.two-phase method"]) == \
        ("two-phase", "intermittent", "Beggs-Brill")
    assert float(tp["result.superficial gas velocity [m/s]"]) == 6.5 and float(tp["result.mixture density [kg/m3]"]) == 43.25
    assert float(tp["result.liquid holdup"]) == 0.4375 and float(tp["result.vapour fraction"]) == 0.125
    assert single["result.phase"] == "liquid"
    assert all(single[f"result.{name}"] == "" for name in ("flow regime", "two-phase method", "liquid holdup",
                                                           "superficial liquid velocity [m/s]", "mixture density [kg/m3]"))
    write_xlsx(tmp_path / "out.xlsx", mixed)
    sheet = openpyxl.load_workbook(tmp_path / "out.xlsx")["lines"]
    head = [c.value for c in sheet[1]]
    assert sheet.cell(row=3, column=head.index("result.mixture density [kg/m3]") + 1).value == 43.25
    assert sheet.cell(row=2, column=head.index("result.flow regime") + 1).value is None
    from boresize.io import read_line_list

    assert read_line_list(tmp_path / "out.csv").rows[1]["tag"] == "TP-1"  # the result columns are skipped


def test_the_dataframe_columns_are_the_json_keys(mixed):
    """two_phase_method is also a line-list input column, so its result column takes the result_ prefix (as phase)."""
    frame = results_dataframe(mixed)
    assert frame["flow_regime"].tolist()[1] == "intermittent" and frame["result_phase"].tolist() == ["liquid", "two-phase"]
    assert frame["mixture_density_kg_m3"].tolist()[1] == 43.25 and frame["result_two_phase_method"].isna().tolist()[0]


def test_the_html_page_shows_the_block_and_the_caution_for_a_two_phase_line_only(mixed, run):
    page = render_html(mixed, trace={}, title="two-phase")
    assert page.count('class="two-phase"') == 1 and "Beggs-Brill" in page and "intermittent" in page
    assert page.count("Two-phase caution.") == 1 and TWO_PHASE_CAUTION.split(":")[0] in page
    assert "57.5" in page and "mN/m" in page and "12.5" in page
    single = render_html([run.results[0]], trace={}, title="single")
    assert 'class="two-phase"' not in single and "Two-phase lines carry" not in single


def test_the_terminal_table_and_the_run_name_the_caution_when_there_are_two_phase_lines(mixed, run):
    assert two_phase_count(mixed) == 1 and two_phase_count([run.results[0]]) == 0
    assert "CAUTION (1 two-phase line): " + TWO_PHASE_CAUTION in render_table(mixed, "shipped", "1")
    assert TWO_PHASE_CAUTION not in render_table([run.results[0]], "shipped", "1")
    assert run.two_phase_caution() is None
    assert dataclasses.replace(run, results=tuple(api.SizingResult.of(r) for r in mixed)).two_phase_caution() == \
        "1 two-phase line: " + TWO_PHASE_CAUTION


def test_a_case_two_phase_counts_its_line(run):
    line = dataclasses.replace(run.results[0], cases=(run.results[0], two_phase(run.results[1])))
    assert two_phase_count([line]) == 1


def test_a_two_phase_state_without_a_rated_size_still_gives_valid_outputs_and_the_caution(run):
    assert run.results[1].state is not None
    state = dataclasses.replace(run.results[1].state, phase="two-phase", vapour_fraction=0.5, surface_tension=None)
    failed = dataclasses.replace(run.results[1], status="error", selected=None, candidates=(), state=state,
                                 error="TP-1: field flow: no size carries it", error_field="flow")
    entry = _doc([failed])["lines"][0]  # type: ignore[index]
    assert entry["phase"] == "two-phase" and entry["surface_tension_mn_m"] is None and "flow_regime" not in entry
    page = render_html([failed], trace={}, title="error")
    assert 'class="two-phase"' not in page and str(escape(TWO_PHASE_CAUTION)) in page  # in the cautions list
