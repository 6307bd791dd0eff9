"""Batch runs and operating cases: worker processes, any executor, progress, isolation, cases, check mode.

Expected sizes come from the fluids library (Darcy-Weisbach with Clamond's exact Colebrook solution,
ASME B36.10M inside diameters via ``fluids.piping.nearest_pipe``) and CoolProp (IAPWS-95 water), as
in tests/test_engine.py; boresize's own numbers are never the expectation.
"""

from __future__ import annotations

import io
import math
import re
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

import pytest
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe

from boresize.io.line_items import line_items
from boresize.sizing.batch import SizerSpec, run_items, spec_for, summary
from boresize.sizing.engine import Sizer
from boresize.errors import InputError
from boresize.io import read_line_list
from boresize.io.csv_reader import parse_csv_text
from boresize.api import size_rows

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
# A service with maximum limits only (values common practice): a larger pipe never fails it, so the
# smallest size passing every case is the largest of the sizes each case needs alone.
CRITERIA = ('version = "test"\n[service.water]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\n'
            'drop-per-length = { max = "40 kPa/100 m" }\n')
PREFERRED = (0.5, 0.75, 1, 1.5, 2, 3, 4, 6, 8, 10, 12)  # default class: preferred NPS, Sch 40 (README, "Your own criteria and pipe classes")
CASES = {"normal": ("40 t/h", "20 degC"), "maximum": ("75 t/h", "20 degC"), "hot": ("60 t/h", "90 degC")}
P_ABS = 601325.0  # 5 barg


def _water(t_c: float) -> tuple[float, float]:
    from CoolProp.CoolProp import PropsSI

    t = t_c + 273.15
    return PropsSI("D", "T", t, "P", P_ABS, "Water"), PropsSI("V", "T", t, "P", P_ABS, "Water")


def _fluids_rating(mass_flow: float, nps: float, t_c: float) -> tuple[float, float]:
    """(velocity [m/s], drop [Pa/m]) from fluids and CoolProp; roughness 0.045 mm (default class)."""
    rho, mu = _water(t_c)
    di = nearest_pipe(NPS=nps, schedule="40")[1]
    v = mass_flow / rho / (math.pi * di**2 / 4)
    f = friction_factor(Re=rho * v * di / mu, eD=4.5e-5 / di)
    return v, f / di * rho * v**2 / 2


def _needed(mass_flow: float, t_c: float) -> float:
    for nps in PREFERRED:
        v, dp = _fluids_rating(mass_flow, nps, t_c)
        if v <= 3.0 and dp <= 400.0:
            return nps
    raise AssertionError("no size")


@pytest.fixture(scope="module")
def water_sizer(host, tmp_path_factory) -> Sizer:
    path = tmp_path_factory.mktemp("crit") / "criteria.toml"
    path.write_text(CRITERIA)
    return Sizer(host, criteria_file=path)


def _rows(text: str):
    return parse_csv_text(text).pairs()


def _case_csv(tag: str = "P-1") -> str:
    rows = "".join(f"{tag},water,{flow},5 barg,{temp},water,{name}\n" for name, (flow, temp) in CASES.items())
    return "tag,fluid,flow,pressure,temperature,service,case\n" + rows


def test_a_line_with_cases_takes_the_smallest_size_every_case_passes(water_sizer):
    result = size_rows(_rows(_case_csv()), sizer=water_sizer)[0]
    flows = {name: float(flow.split()[0]) / 3.6 for name, (flow, _) in CASES.items()}  # t/h -> kg/s
    temps = {name: float(temp.split()[0]) for name, (_, temp) in CASES.items()}
    expected = max(_needed(flows[n], temps[n]) for n in CASES)
    assert result.status == "pass"
    assert result.selected.candidate.nps_value == expected
    assert [c.line.case for c in result.cases] == list(CASES)
    assert all(c.selected.candidate.nps_value == expected for c in result.cases)
    # per criterion, the governing case is the one with the highest value at the selected size (fluids)
    ratings = {n: _fluids_rating(flows[n], expected, temps[n]) for n in CASES}
    governing = dict(result.governing)
    assert governing["velocity"] == max(CASES, key=lambda n: ratings[n][0])
    assert governing["drop-per-length"] == max(CASES, key=lambda n: ratings[n][1])
    assert result.line.case in CASES and result.controlling in governing


def test_rows_without_a_case_column_stay_one_line_each(water_sizer):
    text = ("tag,fluid,flow,pressure,temperature,service\nA,water,40 t/h,5 barg,20 degC,water\n"
            "B,water,75 t/h,5 barg,20 degC,water\n")
    results = size_rows(_rows(text), sizer=water_sizer)
    assert [r.tag for r in results] == ["A", "B"]
    assert [r.cases for r in results] == [(), ()]
    assert results[0].selected.candidate.nps_value == _needed(40 / 3.6, 20.0)
    assert results[1].selected.candidate.nps_value == _needed(75 / 3.6, 20.0)


def test_cases_apart_in_the_list_join_their_line_at_its_first_row(water_sizer):
    text = ("tag,fluid,flow,pressure,temperature,service,case\nA,water,40 t/h,5 barg,20 degC,water,normal\n"
            "B,water,10 t/h,5 barg,20 degC,water,\nA,water,75 t/h,5 barg,20 degC,water,maximum\n")
    results = size_rows(_rows(text), sizer=water_sizer)
    assert [(r.tag, len(r.cases)) for r in results] == [("A", 2), ("B", 0)]
    assert results[0].selected.candidate.nps_value == _needed(75 / 3.6, 20.0)


@pytest.mark.parametrize(("extra_row", "message"), [
    ("P-1,water,abc,5 barg,20 degC,water,start-up", r"^line P-1, case start-up: flow: 'abc'"),
    ("P-1,water,10 t/h,5 barg,20 degC,water,normal", r"^line P-1: case: case 'normal' appears 2 times"),
])
def test_a_bad_case_makes_the_line_an_error_naming_the_case(water_sizer, extra_row, message):
    result = size_rows(_rows(_case_csv() + extra_row + "\n"), sizer=water_sizer)[0]
    assert result.status == "error"
    assert len(result.cases) == 4
    assert re.search(message, result.error), result.error


def test_workers_give_the_same_results_in_input_order(host):
    line_list = read_line_list(DEMO / "lines.csv")
    spec = spec_for(DEMO / "criteria.toml", False, None)
    alone = run_items(_items(line_list.pairs()), sizer=Sizer(host, criteria_file=DEMO / "criteria.toml"))
    parallel = run_items(_items(line_list.pairs()), spec, workers=2, chunk_size=1)
    threads = ThreadPoolExecutor(2)
    try:
        pooled = run_items(_items(line_list.pairs()), spec, executor=threads)
    finally:
        threads.shutdown()
    def key(results):
        return [(r.tag, r.status, r.selected.candidate.nps if r.selected else None, len(r.cases)) for r in results]
    assert key(parallel) == key(alone) == key(pooled)
    assert [r.tag for r in alone] == list(dict.fromkeys(row["tag"] for row in line_list.rows))


def test_a_bad_line_on_a_worker_stays_on_that_line(tmp_path):
    text = ("tag,fluid,flow,pressure,temperature\nA,water,10 t/h,3 barg,20 degC\nB,water,10 bar,3 barg,20 degC\n"
            "C,unobtainium,1 t/h,3 barg,20 degC\nD,water,12 t/h,3 barg,20 degC\n")
    results = run_items(_items(_rows(text)), SizerSpec(load_entry_points=False), workers=2, chunk_size=1)
    assert [r.status for r in results] == ["pass", "error", "error", "pass"]
    assert results[1].error.startswith("line B: flow: ")
    assert results[2].error_field == "fluid"
    assert summary(results) == "4 lines: 2 pass, 0 fail, 2 error"


def test_progress_bar_when_asked_for(water_sizer):
    stream = io.StringIO()
    run_items(_items(_rows(_case_csv("P-1") + "Q,water,5 t/h,5 barg,20 degC,water,\n")), sizer=water_sizer, progress=True,
              progress_stream=stream)
    assert "2/2" in stream.getvalue() and "lines" in stream.getvalue()
    quiet = io.StringIO()
    run_items(_items(_rows(_case_csv())), sizer=water_sizer, progress=None, progress_stream=quiet)
    assert quiet.getvalue() == ""  # not a terminal, not asked for


def test_a_parallel_run_needs_a_spec_not_a_sizer(water_sizer):
    with pytest.raises(InputError, match=r"spec: a parallel run cannot send a Sizer to its workers; expected a "
                                         r"SizerSpec"):
        run_items(_items(_rows(_case_csv())), sizer=water_sizer, workers=2)


def test_check_mode_with_corroded_roughness_and_a_given_schedule(host, water_sizer):
    # NPS 4 Sch 80 (ASME B36.10M via fluids), roughness 0.5 mm (a corroded line, common practice value).
    sizer = Sizer(host, config=water_sizer.config, check_roughness=0.5e-3)
    text = ("tag,fluid,flow,pressure,temperature,service,nps,schedule\n"
            "E-1,water,60 t/h,5 barg,20 degC,water,4,80\nN-1,water,60 t/h,5 barg,20 degC,water,,\n")
    checked, sized = size_rows(_rows(text), sizer=sizer)
    rho, mu = _water(20.0)
    di = nearest_pipe(NPS=4, schedule="80")[1]
    v = 60 / 3.6 / rho / (math.pi * di**2 / 4)
    dp = friction_factor(Re=rho * v * di / mu, eD=0.5e-3 / di) / di * rho * v**2 / 2
    assert (checked.mode, checked.selected.candidate.schedule) == ("check", "80")
    assert checked.selected.candidate.inside_diameter == pytest.approx(di, abs=1e-5)
    assert checked.selected.hydraulics.drop_per_length == pytest.approx(dp, rel=1e-6)
    assert "checked with corroded roughness 0.5 mm" in checked.notes
    assert sized.mode == "size" and sized.line.roughness is None  # sizing keeps the class's roughness


def _items(pairs):  # type: ignore[no-untyped-def]
    """The lines of (row, units) pairs, read as the run reads them."""
    return line_items(pairs).items


def test_the_summary_says_line_for_one_line_and_lines_for_more() -> None:
    from boresize.sizing.batch import summary_text

    assert summary_text(1, 1, 0, 0, 0) == "1 line: 1 pass, 0 fail, 0 error"
    assert summary_text(0, 0, 0, 0, 0) == "0 lines: 0 pass, 0 fail, 0 error"
    assert summary_text(2, 1, 1, 0, 0) == "2 lines: 1 pass, 1 fail, 0 error"


class _LazyFuture:
    """A future whose task runs when its result is asked for (any object with result() is one to run_items)."""

    def __init__(self, events: list[str], fn, args) -> None:  # type: ignore[no-untyped-def]
        self.events, self.fn, self.args = events, fn, args

    def result(self):  # type: ignore[no-untyped-def]
        self.events.append(f"chunk of {len(self.args[1])}")
        return self.fn(*self.args)


class _LazyExecutor:
    def __init__(self, events: list[str]) -> None:
        self.events = events

    def submit(self, fn, /, *args, **kwargs):  # type: ignore[no-untyped-def]
        return _LazyFuture(self.events, fn, args)

    def map(self, fn, *iterables, **kwargs):  # type: ignore[no-untyped-def]
        return map(fn, *iterables)


def test_a_parallel_run_applies_each_in_input_order_as_chunks_come_back_not_at_the_end():
    # A run that streams its results (CSV, JSON Lines) or counts them hands each result on as soon as every earlier
    # line is back, so it never holds every line's full result: here the first line is handed on before the
    # second chunk is even run, and what each() returns None for is not kept.
    text = "tag,fluid,flow,pressure,temperature\n" + "".join(
        f"L{i},water,{10 + i} t/h,3 barg,20 degC\n" for i in range(6))
    events: list[str] = []

    def each(result):  # type: ignore[no-untyped-def]
        events.append(result.tag)
        return result if result.tag in ("L0", "L5") else None

    kept = run_items(_items(_rows(text)), SizerSpec(load_entry_points=False), executor=_LazyExecutor(events),
                     chunk_size=2, each=each)
    assert [r.tag for r in kept] == ["L0", "L5"]
    assert events == ["chunk of 2", "L0", "L1", "chunk of 2", "L2", "L3", "chunk of 2", "L4", "L5"]
