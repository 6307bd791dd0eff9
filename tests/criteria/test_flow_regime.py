"""The flow-regime criterion and the two-phase reading of erosional and momentum (API RP 14E section 2.5)."""

from __future__ import annotations

from dataclasses import replace

import pytest

from boresize.criteria.base import parse_options
from boresize.criteria.erosional import ErosionalVelocity
from boresize.criteria.flow_regime import FlowRegime
from boresize.criteria.momentum import Momentum
from boresize.errors import CriteriaFileError
from boresize.model import TwoPhaseFlow
from tests.criteria.criteria_context import make_context

TWO = TwoPhaseFlow(method="Beggs-Brill", vapour_fraction=0.1, flow_regime="intermittent",
                   regime_map="Taitel-Dukler (1976)", liquid_holdup=0.5, superficial_liquid_velocity=1.0,
                   superficial_gas_velocity=9.0, mixture_velocity=10.0, mixture_density=50.0, liquid_density=900.0,
                   gas_density=5.0, liquid_viscosity=1e-4, gas_viscosity=1e-5)


def context(two: TwoPhaseFlow | None, options: dict[str, float] | None = None):  # type: ignore[no-untyped-def]
    ctx = make_context(velocity=10.0, density=50.0, state={"phase": "two-phase"}, options=options)
    return replace(ctx, hydraulics=replace(ctx.hydraulics, two_phase=two))


def test_default_fails_slug_and_intermittent() -> None:
    crit = FlowRegime()
    opts = parse_options(crit, {}, "service.tp.flow-regime")
    v = crit.evaluate(context(TWO, opts))
    assert v.status == "fail" and "intermittent" in v.reasons[0] and "Taitel-Dukler" in v.reasons[0]
    v = crit.evaluate(context(replace(TWO, flow_regime="annular"), opts))
    assert v.status == "pass"


def test_listed_regimes_and_unevaluated_is_error() -> None:
    crit = FlowRegime()
    opts = parse_options(crit, {"fail": ["annular", "stratified wavy"]}, "service.tp.flow-regime")
    assert crit.evaluate(context(replace(TWO, flow_regime="annular"), opts)).status == "fail"
    assert crit.evaluate(context(TWO, opts)).status == "pass"
    assert crit.evaluate(context(None, opts)).status == "error"
    assert crit.phases == frozenset({"two-phase"})


@pytest.mark.parametrize("raw", [["slugg"], 3, [1, 2], "annular, sluggish"])
def test_bad_names_are_refused(raw: object) -> None:
    with pytest.raises(CriteriaFileError) as err:
        parse_options(FlowRegime(), {"fail": raw}, "service.tp.flow-regime")
    assert err.value.field == "service.tp.flow-regime.fail"


def test_erosional_and_momentum_read_the_no_slip_mixture() -> None:
    """API RP 14E (1991) section 2.5: v_e = C/sqrt(rho_m) with the gas/liquid mixture density; here the no-slip
    mixture density and mixture velocity of the two-phase hydraulics, whatever the state's density says."""
    ctx = replace(context(TWO), state=replace(context(TWO).state, density=999.0))
    v = ErosionalVelocity().evaluate(replace(ctx, options={"c_us": 100.0}))
    assert v.limit == pytest.approx(100.0 * 1.2199 / 50.0**0.5, rel=1e-3)
    assert "two-phase" in ErosionalVelocity.phases and "two-phase" in Momentum.phases
    m = Momentum().evaluate(replace(ctx, options={"max": 4000.0}))
    assert m.value == pytest.approx(50.0 * 10.0**2)
