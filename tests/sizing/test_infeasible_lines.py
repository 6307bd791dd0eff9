"""Lines that cannot flow, liquids that flash and criteria that cannot judge, end to end: none of them passes.

The hand calculations below use CoolProp (density, viscosity, vapour pressure) and the fluids library (Colebrook
friction factor, ASME B36.10M bores) directly, not boresize's own hydraulics.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe

from boresize.io.rows import line_from_row
from boresize.sizing.engine import Sizer

G = 9.80665  # standard gravity [m/s2]
ROUGHNESS = 0.045e-3  # the default pipe class's roughness [m] (README: carbon steel, 0.045 mm)
LIQUID_SERVICES = ("liquid", "pump-suction", "pump-suction-bubble-point", "pump-discharge", "cooling-water",
                   "gravity-drain")


def _friction_drop(mass_flow: float, rho: float, mu: float, length: float, nps: float) -> float:
    """Darcy-Weisbach drop [Pa] in Sch 40 pipe of ``nps`` with the fluids library's Colebrook friction factor."""
    diameter = nearest_pipe(NPS=nps, schedule="40")[1]  # ASME B36.10M inside diameter [m]
    velocity = mass_flow / rho / (math.pi * diameter**2 / 4.0)
    f = friction_factor(Re=rho * velocity * diameter / mu, eD=ROUGHNESS / diameter)
    return f * length / diameter * rho * velocity**2 / 2.0


def _verdict(result, ident: str):
    return next(v for v in result.selected.verdicts if v.criterion == ident)


def test_a_liquid_line_with_a_large_rise_fails_with_its_outlet_named(sizer: Sizer):
    # 30 t/h of water at 20 degC lifted 40 m from 2 barg through 60 m of NPS 4: the static head alone,
    # rho g dz = 3.92 bar, exceeds the 3.01 bar abs at the inlet.
    row = {"tag": "RISE-1", "fluid": "water", "flow": "30 t/h", "pressure": "2 barg", "temperature": "20 degC",
           "length": "60 m", "elevation": "40 m", "service": "pump-discharge", "nps": "4"}
    p_in, t = 301325.0, 293.15
    rho, mu = PropsSI("D", "T", t, "P", p_in, "Water"), PropsSI("V", "T", t, "P", p_in, "Water")
    friction = _friction_drop(30e3 / 3600, rho, mu, 60.0, 4)
    static = rho * G * 40.0
    p_out = p_in - static - friction  # the independent hand calculation
    assert p_out < 0
    result = sizer.run(line_from_row(row))
    verdict = _verdict(result, "line-feasibility")
    assert result.status == "fail" and _verdict(result, "flashing").status == "fail"  # below P_vap long before 0
    assert verdict.status == "fail" and verdict.value == pytest.approx(p_out / 1e5, rel=1e-6)
    assert verdict.reason == (
        f"outlet pressure {p_out / 1e5:.4g} bar abs at the outlet, 40 m above the inlet is at or below zero absolute: "
        f"the line cannot carry the flow at this size (inlet 3.013 bar abs, total drop {(p_in - p_out) / 1e5:.4g} bar: "
        f"friction {friction / 1e5:.4g}, static {static / 1e5:.4g})")


def test_sizing_a_line_no_size_can_lift_fails_on_feasibility(sizer: Sizer):
    row = {"tag": "RISE-2", "fluid": "water", "flow": "30 t/h", "pressure": "2 barg", "temperature": "20 degC",
           "length": "60 m", "elevation": "40 m", "service": "pump-discharge"}
    result = sizer.run(line_from_row(row))
    assert result.status == "fail"
    assert all(any(v.criterion == "line-feasibility" and v.status == "fail" for v in c.verdicts)
               for c in result.candidates)


def test_a_negative_loss_fails_at_every_size(sizer: Sizer):
    row = {"tag": "NEG-1", "fluid": "water", "flow": "30 t/h", "pressure": "6 barg", "temperature": "20 degC",
           "length": "100 m", "fixed_drop": "-0.5 bar", "service": "pump-discharge"}
    result = sizer.run(line_from_row(row))
    assert result.status == "fail" and result.controlling == "line-feasibility"
    assert {v.reason for c in result.candidates for v in c.verdicts if v.criterion == "line-feasibility"} == {
        "a loss credits the line: allowance (fixed_drop) -0.5 bar; losses must be 0 or more (a pressure gain is "
        "not a loss)"}


def test_a_fitting_that_would_credit_the_line_is_refused_on_reading(sizer: Sizer):
    # The fittings reader refuses it before any size is rated: the line is an error naming the fitting.
    row = {"tag": "NEG-2", "fluid": "water", "flow": "30 t/h", "pressure": "6 barg", "temperature": "20 degC",
           "length": "100 m", "fittings": "Leq=-40 m", "service": "pump-discharge"}
    result = sizer.run(line_from_row(row))
    assert result.status == "error" and result.error == (
        "line NEG-2: fittings: Leq '-40 m' in 'leq=-40 m' is not above zero: a fitting adds to the drop and cannot "
        "credit the line; expected an equivalent length above zero with its unit, e.g. 'Leq=12 m'")


@pytest.mark.parametrize("service", LIQUID_SERVICES)
def test_a_liquid_below_its_vapour_pressure_after_the_allowances_fails_in_every_shipped_liquid_service(
        sizer: Sizer, service: str):
    # Water at 95 degC enters at 1.5 bar abs, 20 m of NPS 4, a 0.7 bar control-valve allowance: the outlet is
    # below the vapour pressure (0.845 bar abs, CoolProp) although friction alone leaves it well above.
    row = {"tag": "FL-1", "fluid": "water", "flow": "44 m3/h", "pressure": "1.5 bar", "temperature": "95 degC",
           "length": "20 m", "fixed_drop": "0.7 bar", "service": service, "nps": "4",
           "source_pressure": "1.5 bar", "liquid_level": "3 m", "npsh_required": "2 m"}
    p_in, t = 1.5e5, 368.15
    rho, mu = PropsSI("D", "T", t, "P", p_in, "Water"), PropsSI("V", "T", t, "P", p_in, "Water")
    p_vap = PropsSI("P", "T", t, "Q", 0, "Water")
    friction = _friction_drop(44.0 / 3600 * rho, rho, mu, 20.0, 4)
    lowest = p_in - friction - 0.7e5
    assert lowest < p_vap < p_in - friction  # it flashes only once the allowance is counted
    result = sizer.run(line_from_row(row))
    verdict = _verdict(result, "flashing")
    assert result.status == "fail" and verdict.status == "fail"
    assert verdict.value == pytest.approx(lowest / 1e5, rel=1e-6) and verdict.limit == pytest.approx(p_vap / 1e5)
    assert verdict.reason == (f"lowest pressure {lowest / 1e5:.4g} bar abs at the outlet, after 0.7 bar of allowances "
                              f"(below vapour/bubble pressure {p_vap / 1e5:.4g} bar abs): the liquid would flash at "
                              f"{p_vap / 1e5:.4g} bar abs")
    assert _verdict(result, "line-feasibility").status == "pass"


def test_a_company_file_may_still_only_warn(host, tmp_path: Path):
    path = tmp_path / "criteria.toml"
    path.write_text('[service.liquid]\nphase = "liquid"\nflashing = { warn_only = true }\n')
    row = {"tag": "FL-2", "fluid": "water", "flow": "44 m3/h", "pressure": "1.5 bar", "temperature": "95 degC",
           "length": "20 m", "fixed_drop": "0.7 bar", "service": "liquid", "nps": "4"}
    result = Sizer(host, criteria_file=path).run(line_from_row(row))
    assert _verdict(result, "flashing").status == "warn" and result.status == "pass"


MIXTURE = {"tag": "MX-1", "fluid": "INCOMP::T66", "backend": "coolprop-mixture", "flow": "20 t/h",
           "pressure": "3 barg", "temperature": "25 degC", "length": "15 m", "service": "pump-suction",
           "source_pressure": "3 barg", "liquid_level": "3 m", "npsh_required": "3 m"}
NO_BUBBLE = ("the vapour or bubble pressure is unknown (backend 'coolprop-mixture' gives none): name the fluid so that "
             "a backend gives it (CoolProp for a pure fluid, thermo for a mixture), give the line's vapour_pressure, "
             "or set at_bubble_point for a liquid drawn at its bubble point")


def test_a_mixture_pump_suction_the_backend_cannot_judge_is_an_error_not_a_pass(sizer: Sizer):
    # CoolProp's incompressible liquids have no vapour pressure: NPSH margin and flashing cannot be judged.
    result = sizer.run(line_from_row(MIXTURE))
    assert result.state is not None and result.state.source == "coolprop-mixture"
    assert result.state.bubble_pressure is None and result.state.vapour_pressure is None
    assert result.status == "error" and result.selected is None
    assert result.error == (f"line MX-1: NPSH margin not judged for line MX-1: {NO_BUBBLE}; or size the line in a "
                            f"service without npsh-margin (criteria file)")
    statuses = {(v.criterion, v.status) for c in result.candidates for v in c.verdicts
                if v.criterion in ("npsh-margin", "flashing")}
    assert statuses == {("npsh-margin", "error"), ("flashing", "error")}


def test_a_coolprop_mixture_liquid_is_judged_at_coolprops_bubble_pressure(sizer: Sizer):
    """A HEOS mixture's liquid state carries CoolProp's QT bubble pressure at T (source: CoolProp, the same mixture),
    so NPSH margin and flashing judge it (they could not before)."""
    from CoolProp import CoolProp as CP

    result = sizer.run(line_from_row({**MIXTURE, "fluid": "n-hexane:0.5, n-heptane:0.5"}))
    mix = CP.AbstractState("HEOS", "n-Hexane&n-Heptane")
    mix.set_mole_fractions([0.5, 0.5])
    mix.update(CP.QT_INPUTS, 0.0, 298.15)
    assert result.state is not None and result.state.bubble_pressure == pytest.approx(mix.p(), rel=1e-9)
    assert result.status in ("pass", "fail"), result.error
    assert {v.status for c in result.candidates for v in c.verdicts
            if v.criterion in ("npsh-margin", "flashing")} <= {"pass", "fail"}


def test_the_same_mixture_checked_at_a_size_fails_and_says_why(sizer: Sizer):
    result = sizer.run(line_from_row({**MIXTURE, "nps": "4"}))
    assert result.status == "fail"
    assert "a criterion could not judge this size (error verdict)" in result.notes
    assert _verdict(result, "npsh-margin").status == "error"


def test_a_marched_gas_line_without_fittings_has_no_fittings_drop_to_fail_on(sizer: Sizer):
    # Found by the invariant "more flow never selects a smaller size": the march split its friction between pipe
    # and fittings by difference, leaving -2e-15 Pa of "fittings drop", which line-feasibility read as a credit.
    import math

    from boresize import make_line

    line = make_line("N2-1", "nitrogen", 1.0, math.exp(15.875), 410.0, length=math.exp(1.61328125), si=True,
                     service="gas", nps="1/2")  # the values the invariant drew
    result = sizer.run(line)
    hyd = result.selected.hydraulics  # type: ignore[union-attr]
    assert "compressible flow" in hyd.method and hyd.fittings_drop == 0.0
    feasibility = next(v for v in result.selected.verdicts if v.criterion == "line-feasibility")  # type: ignore[union-attr]
    assert "credits" not in feasibility.reason
