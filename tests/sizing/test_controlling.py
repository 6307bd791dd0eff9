"""The controlling criterion (the one that fails on the next smaller size) and the smallest passing size of a
failing check, against hand calculations: continuity v = 4 Q / (pi D^2) and Darcy-Weisbach dp/L = f rho v^2 / (2 D),
D the Sch 40 inside diameter of the fluids library's ASME B36.10M table, rho and mu of water from CoolProp
(IAPWS-95), f the Colebrook friction factor of the fluids library."""

from __future__ import annotations

import math

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.friction import Colebrook
from fluids.piping import nearest_pipe

from boresize.io.rows import line_from_row
from boresize.sizing.engine import Sizer
from boresize.sizing.selection import SMALLEST_NOTE

WATER = {"tag": "CT-1", "fluid": "water", "flow": "60 t/h", "pressure": "5 barg", "temperature": "20 degC",
         "length": "100 m", "service": "cw"}
RHO = PropsSI("D", "T", 293.15, "P", 601_325.0, "Water")
MU = PropsSI("V", "T", 293.15, "P", 601_325.0, "Water")
MASS = 60_000 / 3600  # kg/s


def _sizer(host, tmp_path, criteria: str) -> Sizer:
    path = tmp_path / "criteria.toml"
    path.write_text(f'[service.cw]\nphase = "liquid"\n{criteria}', encoding="utf-8")
    return Sizer(host, criteria_file=path)


def _by_hand(nps: float, roughness: float) -> tuple[float, float]:
    """(velocity [m/s], drop per length [kPa/100 m]) of the line in Sch 40 pipe of size ``nps``."""
    di = nearest_pipe(NPS=nps, schedule="40")[1]
    v = 4.0 * MASS / RHO / (math.pi * di**2)
    f = Colebrook(RHO * v * di / MU, roughness / di)
    return v, f * RHO * v**2 / (2.0 * di) / 10.0


def test_controlling_is_the_criterion_that_fails_on_the_next_smaller_size(host, tmp_path):
    # Cooling-water style limits (common practice): a drop maximum and a velocity minimum. NPS 4 fails the drop,
    # NPS 6 passes with its velocity near the minimum: the drop set the size, the velocity is nearest its limit.
    sizer = _sizer(host, tmp_path, 'velocity = { min = "0.8 m/s", max = "3 m/s" }\n'
                                   'drop-per-length = { max = "30 kPa/100 m" }\n')
    result = sizer.run(line_from_row(WATER))
    roughness = result.selected.candidate.roughness
    (v4, drop4), (v6, drop6) = _by_hand(4, roughness), _by_hand(6, roughness)
    assert v4 <= 3.0 and drop4 > 30.0 and 0.8 <= v6 <= 3.0 and drop6 <= 30.0  # the hand calculation selects NPS 6
    assert 0.8 / v6 > drop6 / 30.0  # ... where the velocity minimum is nearest its limit
    assert result.status == "pass" and result.selected.candidate.nps == "6"
    below = [c for c in result.candidates if c.candidate.nps == "4"][0]
    assert [v.criterion for v in below.verdicts if v.status == "fail"] == ["drop-per-length"]
    assert result.controlling == "drop-per-length"
    assert result.selected.worst.criterion == "velocity"  # the old meaning, which the issue found misleading
    assert not any("smallest size" in note for note in result.notes)


def test_no_criterion_controls_on_the_smallest_size(host, tmp_path):
    sizer = _sizer(host, tmp_path, 'velocity = { max = "3 m/s" }\n')
    result = sizer.run(line_from_row({**WATER, "flow": "10 kg/h"}))
    smallest = sizer.config.pipe_class("default").candidates()[0].nps
    assert result.status == "pass" and result.selected.candidate.nps == smallest
    assert result.controlling is None
    assert SMALLEST_NOTE.format(nps=smallest) in result.notes


def test_controlling_over_cases_is_the_binding_fail_below_in_any_case(host, tmp_path):
    # The maximum case (90 t/h) sets the size; the normal case passes the size below. Of the criteria the maximum
    # case fails on the size below, the one nearest its limit at the size selected controls.
    sizer = _sizer(host, tmp_path, 'velocity = { max = "3 m/s" }\ndrop-per-length = { max = "60 kPa/100 m" }\n')
    cases = [line_from_row({**WATER, "flow": flow, "case": case}) for flow, case in (("20 t/h", "normal"),
                                                                                      ("90 t/h", "maximum"))]
    result = sizer.run_cases(cases)
    assert result.status == "pass"
    nps = [c.candidate.nps for c in result.cases[0].candidates]
    below = nps.index(result.selected.candidate.nps) - 1
    normal, maximum = (c.candidates[below] for c in result.cases)
    assert normal.passed and not maximum.passed
    failing = {v.criterion for v in maximum.verdicts if v.status == "fail"}
    at_size = {v.criterion: v.utilisation for v in result.cases[1].candidates[below + 1].verdicts}
    binding = max(failing, key=lambda c: at_size[c])
    assert result.controlling == binding
    assert {c.controlling for c in result.cases} == {result.controlling}


def test_a_fail_without_bound_below_does_not_control_where_another_criterion_binds(host, tmp_path):
    # Cold water, 151 m3/h over 250 m from 4.5 barg: on NPS 4 the drop takes the outlet below zero absolute, so
    # flashing (and line-feasibility) fail there without bound, as do velocity and drop per length. At the size
    # selected the flashing margin is nearly untouched while the drop per length is near its limit: the drop binds.
    sizer = _sizer(host, tmp_path, 'velocity = { max = "3 m/s" }\ndrop-per-length = { max = "35 kPa/100 m" }\n'
                                   'flashing = {}\n')
    result = sizer.run(line_from_row({**WATER, "flow": "151.06 m3/h", "pressure": "4.5 barg",
                                      "temperature": "7.9 degC", "length": "250 m"}))
    assert result.status == "pass"
    sizes = [c.candidate.nps for c in result.candidates]
    below = result.candidates[sizes.index(result.selected.candidate.nps) - 1]
    assert {"flashing", "drop-per-length"} <= {v.criterion for v in below.verdicts if v.status == "fail"}
    at_size = {v.criterion: v.utilisation for v in result.selected.verdicts}
    assert at_size["flashing"] < 0.05 < at_size["drop-per-length"]
    assert result.controlling == max((v.criterion for v in below.verdicts if v.status == "fail"
                                      and at_size.get(v.criterion) is not None), key=lambda c: at_size[c])
    assert result.controlling != "flashing"


def test_a_check_keeps_the_criterion_nearest_or_furthest_past_its_limit(host, tmp_path):
    sizer = _sizer(host, tmp_path, 'velocity = { max = "3 m/s" }\ndrop-per-length = { max = "30 kPa/100 m" }\n')
    for nps in ("4", "6"):
        result = sizer.run(line_from_row({**WATER, "nps": nps}))
        assert result.controlling == result.selected.worst.criterion


def test_a_failing_check_names_the_smallest_size_that_passes(host, tmp_path):
    # Only a 3 m/s maximum (common practice): by hand, the smallest Sch 40 size of the class running at most 3 m/s.
    sizer = _sizer(host, tmp_path, 'velocity = { max = "3 m/s" }\n')
    sizes = sizer.config.pipe_class("default").candidates()
    expected = next(c.nps for c in sizes if _by_hand(c.nps_value, c.roughness)[0] <= 3.0)
    failing = sizer.run(line_from_row({**WATER, "nps": "2"}))
    assert failing.status == "fail" and failing.smallest_passing_nps == expected == "4"
    assert f"the smallest size of pipe class default that passes is NPS {expected}" in failing.notes
    passing = sizer.run(line_from_row({**WATER, "nps": "6"}))
    assert passing.status == "pass" and passing.smallest_passing_nps is None


def test_a_failing_check_that_no_size_passes_says_so(host, tmp_path):
    sizer = _sizer(host, tmp_path, 'velocity = { max = "0.001 m/s" }\n')
    failing = sizer.run(line_from_row({**WATER, "nps": "2"}))
    assert failing.status == "fail" and failing.smallest_passing_nps is None
    assert "no size of pipe class default passes" in failing.notes


@pytest.mark.parametrize("flows", [("20 t/h", "90 t/h")])
def test_a_failing_check_with_cases_names_the_size_every_case_passes(host, tmp_path, flows):
    sizer = _sizer(host, tmp_path, 'velocity = { max = "3 m/s" }\n')
    cases = [line_from_row({**WATER, "flow": flow, "case": f"c{i}", "nps": "3"}) for i, flow in enumerate(flows)]
    result = sizer.run_cases(cases)
    sized = sizer.run(line_from_row({**WATER, "flow": flows[1]}))  # the larger flow sets the size
    assert result.status == "fail" and result.smallest_passing_nps == sized.selected.candidate.nps
