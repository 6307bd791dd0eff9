"""Built-in criteria against their published definitions."""

from __future__ import annotations

import math

import pytest

from boresize.criteria.base import CriterionContext, parse_options
from boresize.criteria.drop_per_length import DropPerLength
from boresize.criteria.erosional import C_US_TO_SI, ErosionalVelocity, erosional_velocity
from boresize.criteria.velocity import VelocityLimits
from boresize.errors import CriteriaFileError
from boresize.model import Candidate, Flow, FluidState, Hydraulics, Line


def _context(velocity: float, density: float = 1000.0, drop_per_length: float = 100.0,
             options: dict[str, float] | None = None) -> CriterionContext:
    line = Line(tag="T-1", fluid="water", flow=Flow("mass", 1.0), pressure=2e5, temperature=300.0)
    state = FluidState(density=density, viscosity=1e-3, phase="liquid", source="table", model="test")
    cand = Candidate("4", 4.0, "40", 0.1143, 0.00602, 0.10226, 4.5e-5)
    hyd = Hydraulics(1.0, 1e-3, velocity, 1e5, 0.02, "turbulent", drop_per_length, drop_per_length * 100, density * velocity**2)
    return CriterionContext(line, state, cand, hyd, options or {}, "liquid")


def test_api_rp14e_erosional_velocity_water_c100():
    # API RP 14E (5th ed. 1991) eq. 2.14: v_e = C/sqrt(rho), C = 100 in US units.
    # rho = 1000 kg/m3 = 62.428 lb/ft3 -> v_e = 100/sqrt(62.428) = 12.656 ft/s = 3.858 m/s.
    assert erosional_velocity(1000.0, 100 * C_US_TO_SI) == pytest.approx(3.858, abs=5e-4)


def test_c_us_to_si_from_exact_unit_definitions():
    # NIST SP 811 Appendix B: 1 lb/ft3 = 1.601846 E+01 kg/m3; 1 ft = 0.3048 m exactly.
    assert C_US_TO_SI == pytest.approx(0.3048 * math.sqrt(16.01846), rel=1e-6)
    assert 100 * C_US_TO_SI == pytest.approx(121.99, abs=0.005)


def test_erosional_c_si_and_c_us_agree():
    crit = ErosionalVelocity()
    by_us = crit.evaluate(_context(3.0, options=parse_options(crit, {"c_us": 100}, "s.e")))
    by_si = crit.evaluate(_context(3.0, options=parse_options(crit, {"c_si": 100 * C_US_TO_SI}, "s.e")))
    assert by_us.limit == pytest.approx(by_si.limit, rel=1e-12)
    assert by_us.status == "pass" and by_us.unit == "m/s"
    assert "API RP 14E" in by_us.source


def test_erosional_fails_above_limit_and_reports_value_and_limit():
    crit = ErosionalVelocity()
    v = crit.evaluate(_context(4.0, options={"c_us": 100}))
    assert v.status == "fail"
    assert v.value == 4.0 and v.limit == pytest.approx(3.858, abs=5e-4)
    assert v.utilisation == pytest.approx(4.0 / 3.858, rel=1e-3)
    assert "above the erosional velocity" in v.reason


def test_erosional_rejects_both_constants():
    with pytest.raises(CriteriaFileError, match="give C once"):
        parse_options(ErosionalVelocity(), {"c_us": 100, "c_si": 122}, "service.x.erosional")


def test_unknown_option_lists_the_valid_names():
    with pytest.raises(CriteriaFileError) as info:
        parse_options(VelocityLimits(), {"maximum": "3 m/s"}, "service.liquid.velocity")
    assert str(info.value) == ("service.liquid.velocity: unknown option 'maximum' for criterion 'velocity'; "
                               "expected one of max, min")


def test_velocity_limits_max_and_min():
    crit = VelocityLimits()
    options = parse_options(crit, {"max": "3 m/s", "min": "1 m/s"}, "service.cw.velocity")
    assert crit.evaluate(_context(2.0, options=options)).status == "pass"
    high = crit.evaluate(_context(3.5, options=options))
    low = crit.evaluate(_context(0.5, options=options))
    assert (high.status, high.limit) == ("fail", 3.0)
    assert (low.status, low.limit) == ("fail", 1.0)
    assert "below the minimum" in low.reason


def test_velocity_min_not_below_max():
    with pytest.raises(CriteriaFileError, match="min 3 m/s is not below max 2 m/s"):
        parse_options(VelocityLimits(), {"max": "2 m/s", "min": "3 m/s"}, "service.x.velocity")


def test_drop_per_length_in_kpa_per_100m():
    crit = DropPerLength()
    options = parse_options(crit, {"max": "40 kPa/100 m"}, "service.liquid.drop-per-length")
    # 40 kPa per 100 m is 400 Pa/m (definition of the unit).
    assert options["max"] == pytest.approx(400.0)
    ok = crit.evaluate(_context(1.0, drop_per_length=399.0, options=options))
    bad = crit.evaluate(_context(1.0, drop_per_length=401.0, options=options))
    assert ok.status == "pass" and bad.status == "fail"
    assert bad.value == pytest.approx(40.1) and bad.unit == "kPa/100 m"


def test_drop_per_length_needs_a_limit():
    with pytest.raises(CriteriaFileError, match="no limit given"):
        parse_options(DropPerLength(), {}, "service.x.drop-per-length")
