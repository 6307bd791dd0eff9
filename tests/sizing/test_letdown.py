"""Letdown lines: a liquid line that reaches its bubble pressure within its length is rated two-phase from there
(``rate_letdown``) when its service accepts two-phase lines; a liquid-only service keeps failing it ``flashing``."""

from __future__ import annotations

import math

import pytest

from boresize.io.rows import line_from_row

HOT_WATER = {"tag": "LD-1", "fluid": "water", "flow": "2 t/h", "pressure": "3 bara", "temperature": "125 degC",
             "length": "160 m", "nps": "1", "schedule": "40", "service": "letdown"}


def _liquid_gradient(mass_flow: float, diameter: float, roughness: float) -> tuple[float, float]:
    """(Darcy-Weisbach gradient [Pa/m], saturation pressure [Pa abs]) of water at 3 bar abs, 125 degC: CoolProp's
    properties, fluids' Colebrook friction factor (the outside references)."""
    from CoolProp.CoolProp import PropsSI
    from fluids.friction import friction_factor

    rho, mu = (PropsSI(k, "P", 3e5, "T", 398.15, "Water") for k in ("D", "V"))
    v = mass_flow / (rho * math.pi * diameter**2 / 4)
    f = friction_factor(Re=rho * v * diameter / mu, eD=roughness / diameter, Method="Colebrook")
    return f * rho * v * v / (2 * diameter), PropsSI("P", "T", 398.15, "Q", 0, "Water")


def test_hot_water_flashes_where_the_liquid_gradient_reaches_the_vapour_pressure(sizer):
    from CoolProp.CoolProp import PropsSI

    result = sizer.run(line_from_row(HOT_WATER))
    assert result.status in ("pass", "fail"), result.error
    h = result.selected.hydraulics
    two = h.two_phase
    assert two is not None and two.flash_point is not None
    gradient, p_sat = _liquid_gradient(h.mass_flow, result.selected.candidate.inside_diameter,
                                       result.selected.candidate.roughness)
    assert p_sat == pytest.approx(2.32e5, rel=5e-3)  # steam tables: 2.32 bar abs at 125 degC
    assert two.flash_point == pytest.approx((3e5 - p_sat) / gradient, rel=0.01)
    assert 0 < two.flash_point < 160 and h.outlet_pressure < p_sat and not h.choked
    h_in = PropsSI("H", "P", 3e5, "T", 398.15, "Water")
    expected = PropsSI("Q", "P", h.outlet_pressure, "H", h_in, "Water")
    assert two.outlet_vapour_fraction == pytest.approx(expected, rel=0.01)
    assert "letdown: liquid for" in h.method and "then two-phase" in h.method
    ids = {v.criterion for v in result.selected.verdicts}
    assert "flow-regime" in ids and "flashing" not in ids  # judged as the two-phase line it becomes
    assert h.total_drop == pytest.approx(3e5 - h.outlet_pressure)


def test_a_liquid_only_service_keeps_failing_a_flashing_line(sizer):
    result = sizer.run(line_from_row(HOT_WATER | {"service": "liquid"}))
    assert result.selected.hydraulics.two_phase is None
    assert {v.criterion: v.status for v in result.selected.verdicts}["flashing"] == "fail"


def test_a_letdown_line_that_stays_above_its_vapour_pressure_is_a_liquid_line(sizer):
    result = sizer.run(line_from_row(HOT_WATER | {"length": "20 m"}))
    assert result.status in ("pass", "fail"), result.error
    h = result.selected.hydraulics
    assert h.two_phase is None and h.outlet_pressure > 2.33e5


def test_a_rising_letdown_line_flashes_earlier_by_its_static_head(sizer):
    flat = sizer.run(line_from_row(HOT_WATER)).selected.hydraulics.two_phase
    rising = sizer.run(line_from_row(HOT_WATER | {"elevation": "5 m"})).selected.hydraulics.two_phase
    assert flat is not None and rising is not None and rising.flash_point < flat.flash_point


def test_the_report_labels_a_two_phase_lines_acceleration_without_gas(sizer):
    from boresize.report.html import _totals

    labels = [row[0] for row in _totals(sizer.run(line_from_row(HOT_WATER)))]
    assert "acceleration" in labels and "acceleration (gas)" not in labels
    liquid = [row[0] for row in _totals(sizer.run(line_from_row(HOT_WATER | {"length": "20 m"})))]
    assert "acceleration (gas)" in liquid


MIXED_LIQUID = {"tag": "LD-MIX", "fluid": "propane:0.6, n-butane:0.4", "backend": "coolprop-mixture",
                "flow": "12 t/h", "pressure": "14 bara", "temperature": "50 degC", "length": "280 m", "nps": "2",
                "service": "letdown", "design_margin": "0 %"}


def test_a_subcooled_mixture_letdown_flashes_where_the_liquid_gradient_reaches_its_bubble_pressure(sizer):
    """Propane 0.6 / n-butane 0.4 (mole), liquid at 14 bar abs, 50 degC (bubble pressure 11.77 bar abs). Outside
    references: CoolProp's QT bubble pressure and PT liquid density and viscosity of the same HEOS mixture, fluids'
    Colebrook friction factor, Darcy-Weisbach."""
    from CoolProp import CoolProp as CP
    from fluids.friction import friction_factor

    result = sizer.run(line_from_row(MIXED_LIQUID))
    assert result.status in ("pass", "fail"), result.error
    h, pipe = result.selected.hydraulics, result.selected.candidate
    mix = CP.AbstractState("HEOS", "n-Propane&n-Butane")
    mix.set_mole_fractions([0.6, 0.4])
    mix.update(CP.QT_INPUTS, 0.0, 323.15)
    bubble = mix.p()
    mix.update(CP.PT_INPUTS, 14e5, 323.15)
    rho, mu = mix.rhomass(), mix.viscosity()
    v = (12000 / 3600) / (rho * math.pi * pipe.inside_diameter**2 / 4)
    f = friction_factor(Re=rho * v * pipe.inside_diameter / mu, eD=pipe.roughness / pipe.inside_diameter,
                        Method="Colebrook")
    gradient = f * rho * v * v / (2 * pipe.inside_diameter)
    assert result.state is not None and result.state.phase == "liquid"
    assert result.state.bubble_pressure == pytest.approx(bubble, rel=1e-9)
    two = h.two_phase
    assert two is not None and two.flash_point == pytest.approx((14e5 - bubble) / gradient, rel=0.01)
    assert 0 < two.flash_point < 280 and not h.choked and h.outlet_pressure < bubble
    assert two.outlet_vapour_fraction is not None and 0 < two.outlet_vapour_fraction < 1
    assert "letdown: liquid for" in h.method and "then two-phase" in h.method
