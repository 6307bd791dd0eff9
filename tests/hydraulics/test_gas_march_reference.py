"""A long real-gas line against an independent march (tests/gas_reference.py: CoolProp properties, the fluids
library's friction factor, the isothermal momentum balance stepped in pressure instead of length)."""

from __future__ import annotations

import math
import re

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe

from boresize.io.rows import line_from_row
from gas_reference import isothermal_march

# 5 km of NPS 4 Sch 40 (bore from the fluids library's ASME B36.10M table, default roughness 0.045 mm) carrying
# nitrogen from 30 bar abs and 15 degC, horizontal, no fittings.
NITROGEN = {"tag": "N-1", "fluid": "nitrogen", "pressure": "30 bar", "temperature": "15 degC", "length": "5 km",
            "nps": "4", "service": "gas", "design_margin": "0 %"}
BORE = nearest_pipe(NPS=4, schedule="40")[1]
ROUGHNESS = 4.5e-5


def _reference(flow_t_h: float):
    return isothermal_march("Nitrogen", 30e5, 288.15, flow_t_h / 3.6, BORE, ROUGHNESS, 5000.0, steps=2000)


def test_a_long_nitrogen_line_reaches_the_outlet_of_an_independent_march(sizer):
    result = sizer.run(line_from_row({**NITROGEN, "flow": "10 t/h"}))
    h = result.selected.hydraulics
    assert result.selected.candidate.inside_diameter == pytest.approx(BORE, rel=1e-4)
    reference = _reference(10.0)
    assert reference.outlet_pressure is not None and reference.outlet_pressure < 0.5 * 30e5  # a large drop
    assert h.outlet_pressure == pytest.approx(reference.outlet_pressure, rel=0.01)
    assert not h.choked and h.choke_length is None
    # The worst point of this expanding line is its outlet: the velocity there is G / rho_out.
    flux = 10.0 / 3.6 / (math.pi * BORE**2 / 4)
    assert h.peak_position == 5000.0 and h.peak_velocity == pytest.approx(flux / reference.outlet_density, rel=0.01)
    assert h.peak_density == pytest.approx(reference.outlet_density, rel=0.01)
    # The method text states the simple method's fraction, which an inlet-density Darcy-Weisbach drop gives.
    rho, mu = PropsSI("D", "P", 30e5, "T", 288.15, "Nitrogen"), PropsSI("V", "P", 30e5, "T", 288.15, "Nitrogen")
    simple = friction_factor(Re=flux * BORE / mu, eD=ROUGHNESS / BORE) * 5000.0 / BORE * flux**2 / (2 * rho)
    stated = re.search(r"the incompressible drop is ([\d.]+)% of inlet pressure, above the 10% limit", h.method)
    assert stated is not None and float(stated.group(1)) == pytest.approx(100 * simple / 30e5, abs=0.06)
    marched = re.search(r"; the marched drop is ([\d.]+)% of inlet pressure", h.method)
    assert marched is not None and float(marched.group(1)) == pytest.approx(100 * (1 - h.outlet_pressure / 30e5), abs=0.06)


def test_a_choking_nitrogen_line_says_where_it_chokes(sizer):
    result = sizer.run(line_from_row({**NITROGEN, "flow": "14 t/h"}))
    h = result.selected.hydraulics
    reference = _reference(14.0)
    assert reference.outlet_pressure is None and reference.choke_length is not None
    assert h.choked and h.choke_length == pytest.approx(reference.choke_length, rel=0.03)
    assert f"CHOKED {h.choke_length:,.0f} m from the inlet, of 5,000 m of pipe" in h.method
    assert result.status == "fail"
    velocity = next(v for v in result.selected.verdicts if v.criterion == "velocity")  # the shipped gas service's
    assert f"{h.choke_length:,.0f} m from the inlet, where the flow chokes (inlet " in velocity.reason


def test_every_gas_size_beyond_the_simple_limit_is_marched(sizer):
    # Sizing rates sizes that fail by far: each is marched, and no method text calls a drop beyond the
    # simple method's 10 % limit (Crane TP-410) "within" it.
    result = sizer.run(line_from_row({**NITROGEN, "flow": "10 t/h", "nps": ""}))
    marched = 0
    for rated in result.candidates:
        h = rated.hydraulics
        fraction = re.search(r"drop is ([\d.]+)% of inlet pressure|drop ([\d.]+)% of inlet pressure", h.method)
        assert fraction is not None, h.method
        percent = float(fraction.group(1) or fraction.group(2))
        if percent > 10.0:
            assert h.method.startswith("isothermal compressible flow") and h.peak_velocity is not None
            assert "not marched" not in h.method and "within" not in h.method
            marched += 1
        else:
            assert "within the 10% limit" in h.method and h.peak_velocity is None
    assert 0 < marched < len(result.candidates)  # both methods were met


def test_a_gas_line_with_nothing_to_march_says_its_drop_is_above_the_limit():
    # No length and no fittings, but a 1,000 m rise: the static head rho g dz of air at 1.2 bar abs (ideal gas,
    # rho = p M / (R T) with M = 28.96 g/mol) is about 12 % of the inlet pressure, and there is nothing to march.
    from boresize.hydraulics.line import rate_line
    from boresize.model import Candidate, Flow, FluidState, Line

    rho = 1.2e5 * 0.02896 / (8.314462618 * 293.15)
    line = Line(tag="A-1", fluid="air", flow=Flow("mass", 0.1), pressure=1.2e5, temperature=293.15, length=0.0,
                elevation=1000.0)
    state = FluidState(density=rho, viscosity=1.8e-5, phase="gas", source="table", model="given")
    h = rate_line(line, state, Candidate("4", 4.0, "40", 0.1143, 0.00602, BORE, ROUGHNESS), 0.1)
    assert h.static_drop == pytest.approx(rho * 9.80665 * 1000.0, rel=1e-12)
    assert h.method.startswith(f"incompressible Darcy-Weisbach, Colebrook friction factor, inlet density: drop "
                               f"{h.static_drop / 1.2e5:.1%} of inlet pressure, above the 10% limit of Crane TP-410, "
                               f"not marched: the line has no length or fittings to march along")
