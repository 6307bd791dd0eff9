"""Tests of boresize.hydraulics against published values and the fluids library."""

from __future__ import annotations

import math
from decimal import Decimal, localcontext

import fluids
import fluids.friction as ff
import pytest

import boresize.hydraulics as hydraulics
from boresize.errors import InputError
from boresize.hydraulics import (
    colebrook,
    darcy_friction_factor,
    drop_per_length,
    exact_diameter,
    laminar,
    rate_pipe,
    regime_text,
    reynolds,
    swamee_jain,
    swamee_jain_diameter,
    velocity,
)

INCH = 0.0254  # m, exact by definition
FOOT = 0.3048  # m, exact by definition
US_GALLON = 3.785411784e-3  # m3, exact by definition

REYNOLDS_SWEEP = [4e3 * (1e8 / 4e3) ** (i / 24) for i in range(25)]
ROUGHNESS_SWEEP = [0.0, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 0.05]


def colebrook_50_digits(re: float, rel_roughness: float) -> Decimal:
    """1/sqrt(f) of the Colebrook equation solved to 50 digits (safeguarded Newton, stdlib decimal)."""
    with localcontext() as ctx:
        ctx.prec = 60
        a, b = Decimal(rel_roughness) / Decimal("3.7"), Decimal("2.51") / Decimal(re)
        k = 2 / Decimal(10).ln()
        low, high, x = Decimal("1e-30"), Decimal("1e6"), Decimal(5)
        for _ in range(1000):
            y = a + b * x
            g = x + k * y.ln()
            low, high = (low, x) if g > 0 else (x, high)
            step = x - g / (1 + k * b / y)
            step = step if low < step < high else (low + high) / 2
            if abs(step - x) <= Decimal("1e-50") * x:
                return +step
            x = step
    raise AssertionError("no convergence")


# --- Colebrook -----------------------------------------------------------------------------


def test_colebrook_published_value() -> None:
    # Colebrook (1939) solved for Re = 1e5, e/D = 1e-4: 0.018513866077471, the doctest value in
    # the fluids docs (fluids.friction.Colebrook); rounded to 7 digits, 0.0185139.
    assert colebrook(1e5, 1e-4) == pytest.approx(0.018513866077471, rel=1e-13)
    assert round(colebrook(1e5, 1e-4), 7) == 0.0185139


@pytest.mark.parametrize("rel_roughness", ROUGHNESS_SWEEP)
def test_colebrook_matches_fluids(rel_roughness: float) -> None:
    # fluids.friction.Colebrook (exact Lambert W form) and fluids.friction.Clamond (Clamond 2009,
    # doi:10.1021/ie801626g, "accurate to an rtol of 1E-9 or better" per the fluids docs).
    for re in REYNOLDS_SWEEP:
        f = colebrook(re, rel_roughness)
        assert f == pytest.approx(ff.Colebrook(re, rel_roughness), rel=1e-9), re
        assert f == pytest.approx(ff.Clamond(re, rel_roughness), rel=1e-9), re


@pytest.mark.parametrize("rel_roughness", [*ROUGHNESS_SWEEP, 0.2, 0.9])
@pytest.mark.parametrize("re", [1e-2, 1.0, 2100.0, 4e3, 1e5, 1e7, 1e8, 1e12])
def test_colebrook_machine_precision(re: float, rel_roughness: float) -> None:
    # Against a 50-digit solution of the Colebrook (1939) equation itself: a few ulp.
    x_exact = colebrook_50_digits(re, rel_roughness)
    f = colebrook(re, rel_roughness)
    assert f == pytest.approx(float(1 / (x_exact * x_exact)), rel=2e-15)
    # Residual g(x) = x + 2 log10(e/D/3.7 + 2.51 x/Re) at x = 1/sqrt(f), in 50-digit arithmetic,
    # divided by x g'(x) so that it reads as the relative error of x: machine precision.
    with localcontext() as ctx:
        ctx.prec = 60
        x, b, k = 1 / Decimal(f).sqrt(), Decimal("2.51") / Decimal(re), 2 / Decimal(10).ln()
        y = Decimal(rel_roughness) / Decimal("3.7") + b * x
        residual = x + k * y.ln()
        assert abs(residual) / (x * (1 + k * b / y)) < Decimal("1e-15")


def test_colebrook_smooth_pipe_crane_example_7_1() -> None:
    # Crane TP-410 (2009) Example 7-1, water in smooth plastic pipe: Re = 100600, f = 0.0179
    # (read from the chart), as quoted in the fluids docs "Crane TP 410 Solved Problems/7.1".
    assert colebrook(100600.0, 0.0) == pytest.approx(0.0179, rel=0.01)


def test_swamee_jain_friction_factor_matches_fluids() -> None:
    # fluids.friction.Swamee_Jain_1976 (Swamee & Jain 1976); fluids writes (6.97/Re)^0.9 where
    # we write 5.74/Re^0.9, the same constant to 3 digits.
    for re in REYNOLDS_SWEEP:
        for rel_roughness in ROUGHNESS_SWEEP:
            expected = ff.Swamee_Jain_1976(re, rel_roughness)
            assert swamee_jain(re, rel_roughness) == pytest.approx(expected, rel=2e-4)


# --- regimes and errors --------------------------------------------------------------------


@pytest.mark.parametrize("re", [1e-3, 1.0, 500.0, 1999.999])
def test_laminar_is_hagen_poiseuille(re: float) -> None:
    # Hagen-Poiseuille, f = 64/Re (fluids.friction.friction_laminar).
    assert laminar(re) == pytest.approx(ff.friction_laminar(re), rel=1e-15)
    assert darcy_friction_factor(re, 1e-3) == (pytest.approx(64.0 / re, rel=1e-15), "laminar")


def test_regime_boundaries() -> None:
    # The critical zone of Moody's chart (L. F. Moody, Trans. ASME 66, 1944): Re 2000 to 4000.
    assert darcy_friction_factor(1999.999, 0.0)[1] == "laminar"
    assert darcy_friction_factor(2000.0, 0.0)[1] == "transition"
    assert darcy_friction_factor(3999.999, 0.0)[1] == "transition"
    assert darcy_friction_factor(4000.0, 0.0)[1] == "turbulent"
    # The band's lower end is below the onset of turbulence fluids takes from Avila et al., Science 333 (2011).
    assert hydraulics.LAMINAR_LIMIT < ff.LAMINAR_TRANSITION_PIPE == 2040.0


TRANSITION_SWEEP = [2000.0 + 25.0 * i for i in range(80)] + [3999.999]  # Re 2000 to 4000


@pytest.mark.parametrize("rel_roughness", ROUGHNESS_SWEEP)
def test_transition_takes_the_larger_of_laminar_and_colebrook(rel_roughness: float) -> None:
    # Against the fluids library computed here: its laminar factor (friction_factor Method="laminar",
    # Hagen-Poiseuille 64/Re) and its Colebrook (fluids.friction.Colebrook, the 1939 equation).
    for re in TRANSITION_SWEEP:
        f, regime = darcy_friction_factor(re, rel_roughness)
        lam = ff.friction_factor(Re=re, eD=rel_roughness, Method="laminar")
        turb = ff.Colebrook(re, rel_roughness)
        assert regime == "transition"
        assert f == pytest.approx(max(lam, turb), rel=1e-9), re
        # Conservative: no point in the band below either curve, nor below fluids' own pick there
        # (friction_factor's default, laminar below Re 2040 and Clamond's Colebrook solution above).
        assert f >= lam and f >= turb * (1 - 1e-12), re
        assert f >= ff.friction_factor(Re=re, eD=rel_roughness) * (1 - 1e-12), re


@pytest.mark.parametrize("rel_roughness", ROUGHNESS_SWEEP)
def test_the_factor_never_falls_as_re_drops_through_the_band(rel_roughness: float) -> None:
    # From the turbulent side down to the band's lower end, f at fixed e/D only rises as Re falls: no
    # jump down at any Re a flow may be turbulent (the old 2100 switch fell by a factor of 1.6 there).
    sweep = [4000.0 + 100.0 * i for i in range(5, -1, -1)] + sorted(TRANSITION_SWEEP, reverse=True)
    factors = [darcy_friction_factor(re, rel_roughness)[0] for re in sweep]
    assert all(lower >= higher for higher, lower in zip(factors, factors[1:]))
    assert darcy_friction_factor(4000.0, rel_roughness)[0] == pytest.approx(ff.Colebrook(4000.0, rel_roughness),
                                                                          rel=1e-9)


def test_regime_text_says_which_factor_and_why() -> None:
    assert regime_text("laminar") == "laminar friction factor 64/Re (Re below 2000)"
    assert regime_text("transition") == (
        "transition (Re 2000-4000, Moody's critical zone, where the flow may be laminar or turbulent): the larger "
        "of 64/Re and Colebrook, here Colebrook, so the drop errs on the safe side")
    assert regime_text("turbulent") == "Colebrook friction factor"
    # A line in the band says so in its method text (what reaches the record's drop_method).
    from boresize.hydraulics.line import rate_line
    from boresize.model import Candidate, Flow, FluidState, Line

    state = FluidState(density=870.0, viscosity=0.02, phase="liquid", source="table", model="oil")
    pipe = Candidate("5", 5.0, "40", 0.1413, 0.00655, 0.1282, 4.5e-5)
    line = Line(tag="T-1", fluid="oil", flow=Flow("mass", 0.2), pressure=5e5, temperature=300.0, length=100.0)
    for mass_flow, regime in ((2.0, "laminar"), (6.0, "transition"), (20.0, "turbulent")):  # Re 990, 2980, 9930
        hyd = rate_line(line, state, pipe, mass_flow)
        assert hyd.regime == regime, mass_flow
        assert hyd.method == f"incompressible Darcy-Weisbach, {regime_text(regime)}; no fittings"


@pytest.mark.parametrize("bad", [0.0, -1.0, math.nan, math.inf])
def test_bad_reynolds_raises(bad: float) -> None:
    with pytest.raises(InputError, match=r"^reynolds: Reynolds number .* is not usable") as info:
        darcy_friction_factor(bad, 1e-4)
    assert info.value.field == "reynolds"
    assert info.value.expected == "a finite Reynolds number > 0"
    assert info.value.value is bad or (math.isnan(bad) and math.isnan(info.value.value))
    with pytest.raises(InputError, match="^reynolds: "):
        colebrook(bad, 1e-4)
    with pytest.raises(InputError, match="^reynolds: "):
        laminar(bad)


@pytest.mark.parametrize("bad", [-1e-6, 1.0, 3.0, math.nan])
def test_bad_relative_roughness_raises(bad: float) -> None:
    with pytest.raises(InputError, match=r"^relative_roughness: relative roughness .* is not usable"
                       r"; expected a relative roughness e/D with 0 <= e/D < 1$") as info:
        darcy_friction_factor(1e5, bad)
    assert info.value.field == "relative_roughness"


# --- Darcy-Weisbach ------------------------------------------------------------------------


def test_crane_example_7_13_fuel_oil_2_inch() -> None:
    # Crane TP-410 (2009) Example 7-13, data and answer as reproduced in the fluids docs
    # ("Crane TP 410 Solved Problems/7.13 Flow given in English Units - Oil"): fuel oil
    # SG 0.815, 2.7 cSt, 2 US gal/s in 100 ft of 2-inch Sch 40 steel pipe (roughness 0.0018 in);
    # Crane: f = 0.0230, dP = 66 500 Pa (9.65 psi).
    density = 0.815 * 999.1  # water reference density as in the fluids notebook
    viscosity = 2.7e-6 * density
    flow = 2.0 * US_GALLON
    _, inside_diameter, _, _ = fluids.nearest_pipe(NPS=2, schedule="40")  # ASME B36.10M
    result = rate_pipe(flow * density, density, viscosity, inside_diameter, 0.0018 * INCH, 100 * FOOT)
    assert result.regime == "turbulent"
    assert result.friction_factor == pytest.approx(0.0230, rel=0.02)
    assert result.drop == pytest.approx(66500.0, rel=0.02)


WATER_LINES = [  # (mass flow kg/s, inside diameter m, roughness m); water 998 kg/m3, 1.0 mPa s
    (0.5, 0.0266, 4.5e-5),
    (2.0, 0.0525, 4.5e-5),
    (10.0, 0.1023, 4.5e-5),
    (50.0, 0.2027, 4.5e-5),
    (200.0, 0.3048, 1.5e-6),
    (800.0, 0.5906, 1.5e-4),
]


@pytest.mark.parametrize(("mass_flow", "diameter", "roughness"), WATER_LINES)
def test_rate_pipe_matches_fluids_one_phase_dp(mass_flow: float, diameter: float, roughness: float) -> None:
    # fluids.friction.one_phase_dP (Darcy-Weisbach with fluids' Clamond friction factor),
    # fluids.core.Reynolds, and the definitions v = m/(rho A), rho v^2, Mach = v/c.
    density, viscosity, length, sound = 998.0, 1.0e-3, 250.0, 1480.0
    result = rate_pipe(mass_flow, density, viscosity, diameter, roughness, length, speed_of_sound=sound)
    expected_dp = ff.one_phase_dP(mass_flow, density, viscosity, diameter, roughness, L=length)
    v = mass_flow / density / (math.pi / 4 * diameter**2)
    assert result.drop == pytest.approx(expected_dp, rel=1e-9)
    assert result.drop_per_length == pytest.approx(expected_dp / length, rel=1e-9)
    expected_re = fluids.core.Reynolds(V=v, D=diameter, rho=density, mu=viscosity)
    assert result.reynolds == pytest.approx(expected_re, rel=1e-13)
    assert result.velocity == pytest.approx(v, rel=1e-13)
    assert result.volume_flow == pytest.approx(mass_flow / density, rel=1e-15)
    assert result.momentum == pytest.approx(density * v * v, rel=1e-13)
    assert result.mach == pytest.approx(v / sound, rel=1e-13)
    assert result.regime == "turbulent"


def test_rate_pipe_laminar_matches_fluids() -> None:
    # fluids.friction.one_phase_dP in laminar flow (64/Re below fluids' switch at Re 2040).
    result = rate_pipe(0.2, 870.0, 0.13, 0.1282, 4.5e-5, 100.0)
    assert result.regime == "laminar" and result.reynolds < 2040
    assert result.drop == pytest.approx(ff.one_phase_dP(0.2, 870.0, 0.13, 0.1282, 4.5e-5, L=100.0), rel=1e-12)
    assert result.mach is None


def test_kernels_agree_with_fluids_darcy_weisbach() -> None:
    # fluids.core.dP_from_K with fluids.core.K_from_f: dP = f L/D rho v^2/2.
    f, rho, diameter = 0.021, 998.0, 0.1023
    v = velocity(10.0, rho, diameter)
    expected = fluids.core.dP_from_K(fluids.core.K_from_f(fd=f, L=1.0, D=diameter), rho=rho, V=v)
    assert drop_per_length(f, rho, v, diameter) == pytest.approx(expected, rel=1e-14)
    expected_re = fluids.core.Reynolds(V=v, D=diameter, rho=rho, mu=1e-3)
    assert reynolds(rho, v, diameter, 1e-3) == pytest.approx(expected_re, rel=1e-14)


@pytest.mark.parametrize(
    ("kwargs", "field", "expected"),
    [
        ({"density": 0.0}, "density", "a finite value > 0 kg/m3"),
        ({"viscosity": -1e-3}, "viscosity", "a finite value > 0 Pa s"),
        ({"mass_flow": math.nan}, "mass_flow", "a finite value > 0 kg/s"),
        ({"inside_diameter": 0.0}, "inside_diameter", "a finite value > 0 m"),
        ({"length": -1.0}, "length", "a finite length >= 0 m"),
        ({"roughness": 0.2}, "roughness", "a roughness >= 0 m and smaller than the inside diameter 0.1 m"),
        ({"speed_of_sound": 0.0}, "speed_of_sound", "a finite value > 0 m/s"),
    ],
)
def test_rate_pipe_bad_input_raises(kwargs: dict[str, float], field: str, expected: str) -> None:
    args = {"mass_flow": 5.0, "density": 998.0, "viscosity": 1e-3, "inside_diameter": 0.1,
            "roughness": 4.5e-5, "length": 100.0} | kwargs
    with pytest.raises(InputError, match=rf"^{field}: .* is not usable; expected ") as info:
        rate_pipe(**args)
    assert (info.value.field, info.value.expected) == (field, expected)


# --- diameter ------------------------------------------------------------------------------


def test_swamee_jain_diameter_textbook_air_duct() -> None:
    # Cengel & Cimbala, Fluid Mechanics, Example 8-4 "Determining the Diameter of an Air Duct":
    # air at 35 degC (1.145 kg/m3, 1.895e-5 kg/m s), 0.35 m3/s, smooth plastic duct 150 m long,
    # head loss 20 m. Data from the example text; answers from memory: Colebrook D = 0.267 m,
    # Swamee-Jain D = 0.271 m.
    rho, mu, flow = 1.145, 1.895e-5, 0.35
    target = rho * 9.81 * 20.0 / 150.0  # Pa/m; g = 9.81 m/s2 as in the example
    assert swamee_jain_diameter(flow, target, rho, mu, 0.0) == pytest.approx(0.271, abs=0.0005)
    assert exact_diameter(flow, target, rho, mu, 0.0) == pytest.approx(0.267, abs=0.0005)


@pytest.mark.parametrize("flow", [0.001, 0.005, 0.02, 0.1, 0.5])  # m3/s
@pytest.mark.parametrize("target", [100.0, 500.0, 1000.0])  # Pa/m
def test_swamee_jain_diameter_is_a_first_guess_for_water(flow: float, target: float) -> None:
    # Water, carbon steel 0.045 mm. exact_diameter checked with fluids.friction.one_phase_dP;
    # the Swamee-Jain guess 0.5-2 % too large (measured here: 0.7-1.7 %).
    rho, mu, rough = 998.0, 1.0e-3, 4.5e-5
    exact = exact_diameter(flow, target, rho, mu, rough)
    assert ff.one_phase_dP(flow * rho, rho, mu, exact, rough, L=1.0) == pytest.approx(target, rel=1e-9)
    guess = swamee_jain_diameter(flow, target, rho, mu, rough)
    assert 1.005 < guess / exact < 1.02


def test_exact_diameter_in_the_laminar_turbulent_jump() -> None:
    # A target between the laminar (Hagen-Poiseuille) and Colebrook drops at Re = 2000 has no
    # exact solution; the diameter at Re = 2000 (definition of Re) is returned.
    rho, mu, flow, rough = 870.0, 0.05, 0.01, 4.5e-5
    d_jump = 4 * rho * flow / (math.pi * 2000.0 * mu)
    v = flow / (math.pi / 4 * d_jump**2)
    dp_laminar = ff.friction_laminar(2000.0) / d_jump * rho * v * v / 2
    dp_colebrook = ff.Colebrook(2000.0, rough / d_jump) / d_jump * rho * v * v / 2
    target = 0.5 * (dp_laminar + dp_colebrook)
    assert exact_diameter(flow, target, rho, mu, rough) == pytest.approx(d_jump, rel=1e-9)


def test_diameter_errors() -> None:
    message = r"^volume_flow: 0.0 m3/s is not usable; expected a finite value > 0 m3/s$"
    with pytest.raises(InputError, match=message):
        swamee_jain_diameter(0.0, 100.0, 998.0, 1e-3, 4.5e-5)
    with pytest.raises(InputError, match=r"^roughness: -1.0 m is not usable") as info:
        exact_diameter(0.01, 100.0, 998.0, 1e-3, -1.0)
    assert info.value.field == "roughness"
    message = r"^drop_per_length: 1000000000000.0 Pa/m needs a pipe rougher than e/D = 0.9; expected "
    with pytest.raises(InputError, match=message):
        exact_diameter(1e-4, 1e12, 998.0, 1e-3, 0.01)


def test_public_api() -> None:
    # The names the engine is written against (hydraulics brief).
    assert set(hydraulics.__all__) >= {
        "LAMINAR_LIMIT", "TURBULENT_LIMIT", "colebrook", "laminar", "swamee_jain",
        "darcy_friction_factor", "flow_area", "velocity", "reynolds", "drop_per_length",
        "rate_pipe", "swamee_jain_diameter", "exact_diameter",
    }
    assert all(hasattr(hydraulics, name) for name in hydraulics.__all__)
    assert (hydraulics.LAMINAR_LIMIT, hydraulics.TURBULENT_LIMIT) == (2000.0, 4000.0)
