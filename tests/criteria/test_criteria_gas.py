"""``momentum`` (rho*v^2, banded by pressure), ``noise-velocity`` (v = a*rho^-b, capped) and ``mach``."""

from __future__ import annotations

import math

import CoolProp.CoolProp as CP
import fluids
import pytest

from boresize.criteria.base import parse_options
from boresize.criteria.gas_noise import NoiseVelocity, noise_velocity_limit
from boresize.criteria.mach import MachLimit
from boresize.criteria.momentum import Momentum
from boresize.errors import CriteriaFileError
from boresize.io.rows import line_from_row
from criteria_context import make_context


def _verdict(result, criterion: str):
    return next(v for v in result.selected.verdicts if v.criterion == criterion)


def test_momentum_against_its_limit():
    options = parse_options(Momentum(), {"max": "15 kPa"}, "service.g.momentum")
    assert options == {"max": 15000.0}  # rho*v^2 in Pa; 15 kPa = 15000 Pa (definition of the unit)
    ok = Momentum().evaluate(make_context(velocity=20.0, density=30.0, options=options))   # 12 000 Pa
    bad = Momentum().evaluate(make_context(velocity=25.0, density=30.0, options=options))  # 18 750 Pa
    assert (ok.status, bad.status) == ("pass", "fail")
    assert bad.value == pytest.approx(18750.0) and bad.unit == "Pa"


def test_momentum_band_by_pressure_in_the_shipped_gas_set(sizer):
    # Methane at 60 bar abs and 25 degC through NPS 6 Sch 40: rho from CoolProp, the bore from the fluids
    # library. gas-by-pressure bands rho*v^2 by inlet pressure (common practice): 60 bar -> the 80 bar band.
    row = {"tag": "G-1", "fluid": "methane", "flow": "60 t/h", "pressure": "60 bar", "temperature": "25 degC",
           "nps": "6", "service": "gas-by-pressure"}
    result = sizer.run(line_from_row(row))
    rho = CP.PropsSI("D", "T", 298.15, "P", 60e5, "Methane")
    di = fluids.nearest_pipe(NPS=6, schedule="40")[1]
    v = 60000 / 3600 / rho / (math.pi * di**2 / 4)
    verdict = _verdict(result, "momentum")
    assert verdict.value == pytest.approx(rho * v**2, rel=1e-6)
    assert verdict.limit == 12500.0
    assert "(band: inlet pressure up to 80 bar abs)" in verdict.reason
    low = sizer.run(line_from_row({**row, "pressure": "15 bar", "flow": "10 t/h"}))
    assert _verdict(low, "momentum").limit == 7500.0


def test_noise_velocity_formula_and_cap():
    # v_max = min(cap, a rho^-b), company practice; a = 175, b = 0.43, cap 60 m/s. Evaluated by hand:
    # rho = 50 kg/m3 -> 175 exp(-0.43 ln 50) = 175 x 0.18597 = 32.54 m/s; rho = 2 kg/m3 -> 129.9 m/s, capped at 60.
    assert noise_velocity_limit(50.0, 175.0, 0.43, 60.0) == pytest.approx(32.54, abs=0.01)
    assert noise_velocity_limit(2.0, 175.0, 0.43, 60.0) == 60.0
    options = parse_options(NoiseVelocity(), {}, "service.g.noise-velocity")  # the shipped defaults
    dense = NoiseVelocity().evaluate(make_context(velocity=35.0, density=50.0, options=options))
    light = NoiseVelocity().evaluate(make_context(velocity=35.0, density=2.0, options=options))
    assert dense.status == "fail" and "175 x rho^-0.43 at rho = 50 kg/m3" in dense.reason
    assert light.status == "pass" and "the cap" in light.reason


def test_noise_velocity_options_are_checked():
    with pytest.raises(CriteriaFileError, match=r"service\.g\.noise-velocity\.b: b 1\.5 is outside 0 to 1"):
        parse_options(NoiseVelocity(), {"b": 1.5}, "service.g.noise-velocity")


def test_mach_from_the_equation_of_state_speed_of_sound(sizer):
    # Nitrogen at 2 bar abs and 20 degC, 150 kg/h through 5 m of NPS 1 Sch 40 (a 3 % drop: rated
    # incompressible, Mach at the inlet): Mach = v / c with c from CoolProp and the bore from the fluids
    # library (definition of the Mach number). The general gas set limits it to 0.3 (common practice).
    row = {"tag": "N-1", "fluid": "nitrogen", "flow": "150 kg/h", "pressure": "2 bar", "temperature": "20 degC",
           "nps": "1", "length": "5 m", "service": "gas"}
    verdict = _verdict(sizer.run(line_from_row(row)), "mach")
    rho = CP.PropsSI("D", "T", 293.15, "P", 2e5, "Nitrogen")
    c = CP.PropsSI("A", "T", 293.15, "P", 2e5, "Nitrogen")
    di = fluids.nearest_pipe(NPS=1, schedule="40")[1]
    mach = 150 / 3600 / rho / (math.pi * di**2 / 4) / c
    assert verdict.value == pytest.approx(mach, rel=1e-6)
    assert (verdict.status, verdict.limit) == ("pass", 0.3)
    tight = MachLimit().evaluate(make_context(mach=mach, options={"max": 0.05}))
    assert tight.status == "fail" and "above the maximum 0.05 -" in tight.reason


def test_mach_without_a_speed_of_sound_is_an_error_that_says_how_to_supply_it():
    verdict = MachLimit().evaluate(make_context(options={"max": 0.3}))
    assert verdict.status == "error"
    assert verdict.reason == ("Mach number not judged: the speed of sound of line T-1 is unknown (backend 'test' "
                              "gives none); name the fluid so that a backend gives it (a line's own density and "
                              "viscosity carry none) or judge the line in a service without mach (criteria file)")


def test_mach_needs_a_limit():
    with pytest.raises(CriteriaFileError, match="no limit given"):
        parse_options(MachLimit(), {}, "service.g.mach")


def test_mach_is_judged_where_it_is_highest():
    # A gas expands along the line, so v/c rises towards the outlet: the higher of the two is judged.
    from dataclasses import replace

    context = make_context(mach=0.20, options={"max": 0.3}, line={"length": 1200.0})
    marched = replace(context.hydraulics, outlet_mach=0.35, peak_mach=0.35, peak_mach_position=1200.0)
    verdict = MachLimit().evaluate(replace(context, hydraulics=marched))
    assert (verdict.status, verdict.value) == ("fail", 0.35)
    assert verdict.reason == ("Mach number 0.35 - above the maximum 0.3 - at the outlet, 1,200 m from the inlet "
                              "(inlet 0.2)")
    assert MachLimit().evaluate(context).reason == "Mach number at the inlet 0.2 - is at most 0.3 -"
