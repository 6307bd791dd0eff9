"""``gravity-drain`` (Froude number, Simpson's limit) and ``flashing`` (lowest pressure along a liquid line)."""

from __future__ import annotations

import math
import textwrap
from pathlib import Path

import CoolProp.CoolProp as CP
import fluids
import pytest

from boresize.criteria.base import parse_options
from boresize.criteria.flashing import Flashing
from boresize.criteria.gravity_drain import GravityDrain, drain_regime, froude_number, self_venting_flow
from boresize.sizing.engine import Sizer
from boresize.errors import CriteriaFileError
from boresize.io.rows import line_from_row
from criteria_context import make_context

G = 9.80665  # standard gravity [m/s2], exact


# --- gravity-drain --------------------------------------------------------------------------------------------

def test_self_venting_flow_of_nps_4_sch_40():
    # Acceptance: Q = 0.31 sqrt(g D) pi D^2/4 with the NPS 4 Sch 40 bore from the fluids library
    # (ASME B36.10M: 102.26 mm) is 9.18 m3/h within 0.5 % (Simpson's limit, definition of Fr).
    _, di, _, _ = fluids.nearest_pipe(NPS=4, schedule="40")
    assert self_venting_flow(di, 0.31) * 3600 == pytest.approx(9.18, rel=0.005)


def test_froude_number_is_its_definition():
    # Fr = v / sqrt(g D): 1 m/s in a 1.0197 m bore (g D = 10 m2/s2) gives 1/sqrt(10) (definition).
    assert froude_number(1.0, 10.0 / G) == pytest.approx(1 / math.sqrt(10.0), rel=1e-12)


@pytest.mark.parametrize(("froude", "regime", "status"), [
    (0.20, "self-venting", "pass"),
    (0.31, "self-venting", "pass"),   # Simpson's limit itself still vents (Fr <= 0.31)
    (0.50, "entraining", "fail"),
    (1.50, "clearing", "fail"),       # bands as commonly published: 0.31 / 1.0
])
def test_regimes_and_verdicts(froude, regime, status):
    di = 0.10226
    velocity = froude * math.sqrt(G * di)
    verdict = GravityDrain().evaluate(make_context(velocity=velocity, inside_diameter=di))
    assert drain_regime(froude) == regime
    assert verdict.status == status and verdict.unit == "-"
    assert verdict.value == pytest.approx(froude, rel=1e-9) and verdict.limit == 0.31
    assert f": {regime} (" in verdict.reason
    assert "stays self-venting up to 9.179 m3/h" in verdict.reason  # 9.18 m3/h as above, to 4 figures


def test_limit_0_3_is_allowed_and_nonsense_is_named():
    options = parse_options(GravityDrain(), {"max_froude": 0.3}, "service.drain.gravity-drain")
    assert options == {"max_froude": 0.3, "clearing_froude": 1.0}
    with pytest.raises(CriteriaFileError, match=r"max_froude 1\.2 must be above 0 and below clearing_froude 1"):
        parse_options(GravityDrain(), {"max_froude": 1.2}, "service.drain.gravity-drain")


def test_gravity_drain_service_picks_the_smallest_self_venting_size(sizer):
    # 25 m3/h of water: the chosen bore must vent (Fr <= 0.31) and the next smaller preferred size (NPS 4,
    # 102.26 mm per fluids) must not, both by Fr's definition with IDs from the fluids library.
    row = {"tag": "D-1", "fluid": "water", "flow": "25 m3/h", "pressure": "1.2 bar", "temperature": "25 degC",
           "service": "gravity-drain"}
    result = sizer.run(line_from_row(row))
    q = 25.0 / 3600
    chosen = fluids.nearest_pipe(NPS=float(result.selected.candidate.nps), schedule="40")[1]
    smaller = fluids.nearest_pipe(NPS=4, schedule="40")[1]
    assert result.status == "pass" and result.selected.candidate.nps == "6"
    assert q / (math.pi * chosen**2 / 4) / math.sqrt(G * chosen) <= 0.31
    assert q / (math.pi * smaller**2 / 4) / math.sqrt(G * smaller) > 0.31


# --- flashing -------------------------------------------------------------------------------------------------

def _rundown_file(tmp_path: Path) -> Path:
    path = tmp_path / "criteria.toml"
    path.write_text(textwrap.dedent("""
        [service.rundown]
        phase = "liquid"
        flashing = { margin = "0 bar" }
    """))
    return path


def test_line_running_uphill_from_a_vessel_at_its_bubble_point_fails_with_the_flash_pressure(tmp_path, host):
    # Acceptance. Water 0.2 K below boiling at 1.5 bar abs (IAPWS-95 via CoolProp) rises 10 m through 30 m of
    # NPS 3 Sch 40. Lowest pressure = P_in - friction - rho g dz, friction by Darcy-Weisbach with the fluids
    # library's Colebrook (Clamond) factor: well below the vapour pressure, so it flashes at P_sat(T).
    t = CP.PropsSI("T", "P", 1.5e5, "Q", 0, "Water") - 0.2
    row = {"tag": "RD-1", "fluid": "water", "flow": "30 t/h", "pressure": "1.5 bar", "temperature": f"{t} K",
           "length": "30 m", "nps": "3", "elevation": "10 m", "service": "rundown"}
    result = Sizer(host, criteria_file=_rundown_file(tmp_path)).run(line_from_row(row))
    verdict = next(v for v in result.selected.verdicts if v.criterion == "flashing")
    rho = CP.PropsSI("D", "T", t, "P", 1.5e5, "Water")
    mu = CP.PropsSI("V", "T", t, "P", 1.5e5, "Water")
    p_sat = CP.PropsSI("P", "T", t, "Q", 0, "Water")
    di = fluids.nearest_pipe(NPS=3, schedule="40")[1]
    v = 30000 / 3600 / rho / (math.pi * di**2 / 4)
    f = fluids.friction_factor(Re=rho * v * di / mu, eD=4.5e-5 / di)
    lowest = 1.5e5 - f * 30 / di * rho * v**2 / 2 - rho * G * 10
    assert result.status == "fail" and verdict.status == "fail"
    assert verdict.value == pytest.approx(lowest / 1e5, rel=1e-3) and verdict.unit == "bar abs"
    assert verdict.limit == pytest.approx(p_sat / 1e5, rel=1e-6)
    assert f"the liquid would flash at {p_sat / 1e5:.4g} bar abs" in verdict.reason
    assert "outlet, the high point 10 m above the inlet" in verdict.reason


def test_a_falling_line_is_credited_its_static_gain():
    # Inlet at the vapour pressure, 20 kPa friction, 5 m fall (rho g dz = -49 kPa): the outlet is above the
    # inlet, so the inlet is the lowest known point and, at P_vap exactly, does not flash (definition).
    context = make_context(drop=20e3, static=-1000.0 * G * 5.0, line={"pressure": 3e5, "elevation": -5.0},
                           state={"vapour_pressure": 3e5})
    verdict = Flashing().evaluate(context)
    assert verdict.status == "pass" and "at the inlet" in verdict.reason


def test_margin_and_warn_only():
    # 2.00 bar abs inlet, 0.30 bar of friction and fittings: 1.70 bar abs at the outlet; P_vap 1.60 bar abs.
    context = dict(drop=25e3, fittings=5e3, line={"pressure": 2e5}, state={"vapour_pressure": 1.6e5})
    assert Flashing().evaluate(make_context(**context)).status == "pass"
    tight = parse_options(Flashing(), {"margin": "0.2 bar"}, "service.x.flashing")
    failed = Flashing().evaluate(make_context(**context, options=tight))
    assert failed.status == "fail" and failed.limit == pytest.approx(1.8)
    assert "+ margin 0.2 bar" in failed.reason
    warned = Flashing().evaluate(make_context(**context, options={**tight, "warn_only": 1.0}))
    assert warned.status == "warn"


def test_bubble_pressure_of_a_mixture_wins_over_the_vapour_pressure():
    # A backend that knows the bubble pressure of a mixture gives it as FluidState.bubble_pressure; criteria
    # read it when present. Simulated here on a stand-in state object.
    context = make_context(drop=10e3, line={"pressure": 2e5}, state={"vapour_pressure": 1.0e5})
    state = type("State", (), {**vars(context.state), "bubble_pressure": 1.95e5})()
    verdict = Flashing().evaluate(type(context)(context.line, state, context.candidate, context.hydraulics,
                                                context.options, context.service))
    assert verdict.status == "fail" and verdict.limit == pytest.approx(1.95)


def test_unknown_vapour_pressure_is_an_error_that_says_how_to_supply_it():
    # Unjudged is never a pass: a liquid whose backend gives no vapour or bubble pressure is not judged.
    verdict = Flashing().evaluate(make_context())
    assert verdict.status == "error"
    assert verdict.reason == ("flashing not judged: the vapour or bubble pressure of line T-1 is unknown (backend "
                              "'test' gives none); name the fluid so that a backend gives it (CoolProp for a pure "
                              "fluid, thermo for a mixture), give the line's vapour_pressure, or judge the line in "
                              "a service without flashing (criteria file)")


def test_warn_only_must_be_true_or_false(tmp_path, host):
    path = tmp_path / "criteria.toml"
    path.write_text('[service.x]\nphase = "liquid"\nflashing = { warn_only = "sometimes" }\n')
    with pytest.raises(CriteriaFileError, match=r"service\.x\.flashing\.warn_only"):
        Sizer(host, criteria_file=path)
