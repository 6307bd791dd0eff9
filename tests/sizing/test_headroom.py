"""Rating mode ("headroom"): the largest flow a line carries at its size before a criterion fails."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.piping import nearest_pipe

from boresize.sizing.engine import Sizer
from boresize.io.rows import line_from_row
from boresize.sizing.headroom import TOLERANCE, find_headroom, headroom, headroom_to_dict

WATER = {"tag": "HR-1", "fluid": "water", "flow": "60 t/h", "pressure": "5 barg", "temperature": "20 degC",
         "length": "100 m", "service": "liquid", "fittings": "elbow-90-lr: 4; gate: 2; check-swing"}


def _at(sizer: Sizer, line, factor: float):
    """The line at its rated size with its flow times ``factor`` and no design margin."""
    flow = replace(line.flow, value=line.flow.value * factor)
    return sizer.run(replace(line, flow=flow, design_margin=0.0))


@pytest.mark.parametrize("cells", [{}, {"design_margin": "10 %"}, {"nps": "6"}, {"nps": "3"}])
def test_headroom_is_the_boundary_between_pass_and_fail(sizer, cells):
    line = line_from_row({**WATER, **cells})
    result = find_headroom(sizer, line)
    assert result.percent is not None
    fixed = replace(line, nps=result.nps)
    boundary = 1.0 + result.percent / 100.0
    at = _at(sizer, fixed, boundary)
    below = _at(sizer, fixed, boundary * (1.0 - 10 * TOLERANCE))
    assert at.status == "fail" and below.status == "pass"
    failing = {v.criterion for v in at.selected.verdicts if v.status == "fail"}
    assert failing and failing == set(result.limited_by)
    assert all(v.status in ("pass", "warn", "not-applicable") for v in below.selected.verdicts)
    if cells.get("nps") == "3":  # 60 t/h is too much for NPS 3 (about 3.6 m/s): negative headroom
        assert result.percent < 0.0


def test_headroom_under_a_velocity_limit_matches_the_pipe_area(host, tmp_path):
    # Only a velocity limit: the boundary is v = 3 m/s, i.e. m = 3 rho A with rho from CoolProp (IAPWS-95)
    # at 20 degC, 6.01325 bar abs and the NPS 4 Sch 40 ID from fluids' ASME B36.10M table.
    criteria = tmp_path / "velocity-only.toml"
    criteria.write_text('[service.liquid]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\n', encoding="utf-8")
    sizer = Sizer(host, criteria_file=criteria)
    line = line_from_row({**WATER, "nps": "4"})
    rho = PropsSI("D", "T", 293.15, "P", 601_325.0, "Water")
    di = nearest_pipe(NPS=4, schedule="40")[1]
    expected = 3.0 * rho * math.pi * di**2 / 4 / (60_000 / 3600) - 1.0
    assert headroom(sizer, line) == pytest.approx(100.0 * expected, abs=100.0 * 2 * TOLERANCE)


def test_headroom_of_a_gas_line_against_its_outlet_pressure(host, tmp_path):
    # A methane line marched as compressible, limited by the receiver's minimum pressure.
    criteria = tmp_path / "outlet.toml"
    criteria.write_text('[service.gas]\nphase = "gas"\noutlet-pressure = { min = "12 bar" }\n', encoding="utf-8")
    sizer = Sizer(host, criteria_file=criteria)
    line = line_from_row({"tag": "HR-G", "fluid": "methane", "flow": "8 t/h", "pressure": "20 bar",
                          "temperature": "20 degC", "length": "10 km", "nps": "6", "service": "gas"})
    result = find_headroom(sizer, line)
    assert result.limited_by == ("outlet-pressure",)
    boundary = 1.0 + result.percent / 100.0
    at, below = _at(sizer, line, boundary), _at(sizer, line, boundary * (1.0 - 10 * TOLERANCE))
    assert at.status == "fail" and below.status == "pass"
    assert at.selected.hydraulics.method.startswith("isothermal compressible flow")
    # At the boundary the outlet sits on the 12 bar minimum.
    assert at.selected.hydraulics.outlet_pressure == pytest.approx(12e5, rel=1e-3)


def test_headroom_json_keys_and_an_unratable_line(sizer):
    line = line_from_row(WATER)
    entry = headroom_to_dict(find_headroom(sizer, line))
    assert set(entry) == {"headroom_percent", "headroom_nps", "headroom_limited_by", "headroom_decrease_percent",
                          "headroom_low_limited_by", "headroom_note"}
    assert entry["headroom_note"] == (f"at NPS {entry['headroom_nps']} every criterion passes up to "
                                      f"{100 + entry['headroom_percent']:.4g} % of the design flow (design margin not "
                                      f"applied): above, {', '.join(entry['headroom_limited_by'])} fails; no criterion "
                                      f"fails below, down to 0.000976562 times the design flow")
    bad = find_headroom(sizer, line_from_row({**WATER, "fittings": "elbow-91"}))
    assert bad.percent is None and bad.note.startswith("line HR-1: fittings: unknown fitting 'elbow-91'")


def _velocity_window(host, tmp_path, nps: str):
    """A line checked at ``nps`` under a minimum and a maximum velocity only (1 and 3 m/s, common practice for
    cooling water), and the window of flow factors where 1 <= v <= 3 m/s by hand: continuity v = 4 Q / (pi D^2)
    with Q = m / rho, rho from CoolProp (IAPWS-95) at 20 degC and 6.01325 bar abs, D the Sch 40 ID from the
    fluids library's ASME B36.10M table."""
    criteria = tmp_path / "window.toml"
    criteria.write_text('[service.liquid]\nphase = "liquid"\nvelocity = { max = "3 m/s", min = "1 m/s" }\n',
                        encoding="utf-8")
    sizer = Sizer(host, criteria_file=criteria)
    line = line_from_row({**WATER, "nps": nps})
    rho = PropsSI("D", "T", 293.15, "P", 601_325.0, "Water")
    di = nearest_pipe(NPS=float(nps), schedule="40")[1]
    design_velocity = 4.0 * (60_000 / 3600 / rho) / (math.pi * di**2)
    return find_headroom(sizer, line), 1.0 / design_velocity, 3.0 / design_velocity


@pytest.mark.parametrize("nps", ["4", "8", "3"])
def test_headroom_finds_the_window_between_a_minimum_and_a_maximum_velocity(host, tmp_path, nps):
    # NPS 4 runs about 2 m/s (inside the window), NPS 8 about 0.5 m/s (below the minimum: the window lies above
    # the design flow), NPS 3 about 3.6 m/s (above the maximum: the window lies below it).
    result, low, high = _velocity_window(host, tmp_path, nps)
    assert result.percent == pytest.approx(100.0 * (high - 1.0), abs=100.0 * high * 2 * TOLERANCE)
    assert result.decrease_percent == pytest.approx(100.0 * (1.0 - low), abs=100.0 * low * 2 * TOLERANCE)
    assert result.limited_by == ("velocity",) and result.low_limited_by == ("velocity",)
    assert result.note == (f"at NPS {nps} every criterion passes from {low * 100:.4g} % to {high * 100:.4g} % of the "
                           f"design flow (design margin not applied): below, velocity fails; above, velocity fails")


def test_headroom_with_no_minimum_reports_no_lower_boundary(host, tmp_path):
    criteria = tmp_path / "velocity-only.toml"
    criteria.write_text('[service.liquid]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\n', encoding="utf-8")
    result = find_headroom(Sizer(host, criteria_file=criteria), line_from_row({**WATER, "nps": "4"}))
    assert result.decrease_percent is None and result.low_limited_by == ()
    assert result.note.endswith("above, velocity fails; no criterion fails below, down to 0.000976562 times the "
                                "design flow")


def test_headroom_finds_a_window_narrower_than_the_search_step(host, tmp_path):
    # NPS 2 at 60 t/h runs about 7.7 m/s. Under a 1 m/s minimum velocity and a 35 kPa/100 m maximum drop (common
    # practice for cooling water) it passes only between v = 1 m/s and the flow whose drop is 35 kPa/100 m, a window
    # narrower than a factor of 1.41. By hand: continuity for the minimum; Darcy-Weisbach with the fluids library's
    # Colebrook friction factor for the maximum (IAPWS-95 density and viscosity from CoolProp, Sch 40 ID from fluids).
    from fluids.friction import Colebrook

    criteria = tmp_path / "cw.toml"
    criteria.write_text('[service.liquid]\nphase = "liquid"\nvelocity = { max = "3 m/s", min = "1 m/s" }\n'
                        'drop-per-length = { max = "35 kPa/100 m" }\n', encoding="utf-8")
    sizer = Sizer(host, criteria_file=criteria)
    line = line_from_row({**WATER, "nps": "2"})
    rho = PropsSI("D", "T", 293.15, "P", 601_325.0, "Water")
    mu = PropsSI("V", "T", 293.15, "P", 601_325.0, "Water")
    di = nearest_pipe(NPS=2, schedule="40")[1]
    roughness = sizer.run(line).selected.candidate.roughness
    design_v = 4.0 * (60_000 / 3600 / rho) / (math.pi * di**2)

    def drop(v: float) -> float:  # kPa/100 m
        return Colebrook(rho * v * di / mu, roughness / di) * rho * v**2 / (2.0 * di) / 10.0

    low, high = 1.0, 3.0  # the velocity at which the drop reaches 35 kPa/100 m, by bisection
    for _ in range(60):
        low, high = ((low + high) / 2, high) if drop((low + high) / 2) < 35.0 else (low, (low + high) / 2)
    upper, lower = low / design_v, 1.0 / design_v
    assert 1.0 < upper / lower < 2.0 ** 0.5
    result = find_headroom(sizer, line)
    assert result.percent == pytest.approx(100.0 * (upper - 1.0), abs=100.0 * upper * 2 * TOLERANCE)
    assert result.decrease_percent == pytest.approx(100.0 * (1.0 - lower), abs=100.0 * lower * 2 * TOLERANCE)
    assert result.limited_by == ("drop-per-length",) and result.low_limited_by == ("velocity",)
