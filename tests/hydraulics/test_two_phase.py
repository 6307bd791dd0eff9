"""Two-phase hydraulics (boresize.hydraulics.two_phase) against the fluids library and published values.

States are built from CoolProp at saturation (Q = 0 and Q = 1 properties), as the property backends give them.
"""

from __future__ import annotations

import math

import pytest
from fluids.two_phase import Beggs_Brill, Taitel_Dukler_regime, two_phase_dP, two_phase_dP_gravitational
from fluids.two_phase_voidage import Woldesemayat_Ghajar
from hypothesis import given, settings
from hypothesis import strategies as st

from boresize.errors import InputError, PropertyError
from boresize.hydraulics.line import rate_line
from boresize.hydraulics.two_phase import accepted_methods, beggs_brill_holdup, rate_two_phase
from boresize.hydraulics.two_phase import _Phases
from boresize.model import Candidate, Flow, FluidState, Line

PIPE = Candidate("3", 3.0, "40", 0.0889, 0.00549, 0.07792, 4.5e-5)  # ASME B36.10M NPS 3 Sch 40


def saturated(fluid: str = "Water", p: float = 10e5, x: float = 0.1) -> FluidState:
    """A two-phase state from CoolProp's saturated liquid and vapour at ``p``."""
    from CoolProp.CoolProp import PropsSI
    rl, rg = PropsSI("D", "P", p, "Q", 0, fluid), PropsSI("D", "P", p, "Q", 1, fluid)
    ml, mg = PropsSI("V", "P", p, "Q", 0, fluid), PropsSI("V", "P", p, "Q", 1, fluid)
    sigma = PropsSI("I", "P", p, "Q", 0, fluid)
    t = PropsSI("T", "P", p, "Q", x, fluid)
    rho = 1.0 / (x / rg + (1 - x) / rl)
    return FluidState(density=rho, viscosity=ml, phase="two-phase", source="coolprop", model="HEOS",
                      vapour_fraction=x, pressure=p, temperature=t, liquid_density=rl, gas_density=rg,
                      liquid_viscosity=ml, gas_viscosity=mg, surface_tension=sigma)


def line(**kw: object) -> Line:
    base: dict[str, object] = dict(tag="TP-1", fluid="water", flow=Flow("mass", 2.0), pressure=10e5,
                                   temperature=453.0, length=100.0)
    base.update(kw)
    return Line(**base)  # type: ignore[arg-type]


@pytest.mark.parametrize("method", ["Beggs-Brill", "Friedel", "Lockhart_Martinelli", "Muller_Steinhagen_Heck",
                                    "Chisholm"])
def test_drop_per_length_matches_fluids(method: str) -> None:
    """Frictional drop per metre equals fluids.two_phase.two_phase_dP on the same inputs (issue 16: within 1 %);
    for Beggs-Brill (horizontal) the fluids total without acceleration is the friction."""
    st8 = saturated()
    h = rate_two_phase(line(two_phase_method=method), st8, PIPE, 2.0)
    args = (2.0, 0.1, st8.liquid_density, PIPE.inside_diameter, 1.0, st8.gas_density, st8.liquid_viscosity,
            st8.gas_viscosity, st8.surface_tension, 10e5, None, PIPE.roughness, 0.0)
    if method == "Beggs-Brill":
        ref = Beggs_Brill(2.0, 0.1, st8.liquid_density, st8.gas_density, st8.liquid_viscosity, st8.gas_viscosity,
                          st8.surface_tension, 10e5, PIPE.inside_diameter, 0.0, PIPE.roughness, 1.0,
                          acceleration=False)
    else:
        ref = two_phase_dP(*args, Method=method)
    assert h.drop_per_length == pytest.approx(ref, rel=0.01)
    assert h.two_phase is not None and h.two_phase.method == method


def test_beggs_brill_docstring_example() -> None:
    """fluids' Beggs_Brill docstring example (Beggs & Brill 1973 as implemented there): 686.97 Pa over 1 m of
    a 50 mm horizontal smooth pipe, acceleration included."""
    ref = Beggs_Brill(m=0.6, x=0.1, rhol=915., rhog=2.67, mul=180E-6, mug=14E-6, sigma=0.0487, P=1E7, D=0.05,
                      angle=0, roughness=0.0, L=1.0)
    assert ref == pytest.approx(686.9724506803469, rel=1e-9)
    state = FluidState(density=1 / (0.1 / 2.67 + 0.9 / 915.), viscosity=180e-6, phase="two-phase", source="t",
                       model="t", vapour_fraction=0.1, liquid_density=915., gas_density=2.67,
                       liquid_viscosity=180e-6, gas_viscosity=14e-6, surface_tension=0.0487)
    pipe = Candidate("2", 2.0, "x", 0.06, 0.005, 0.05, 0.0)
    h = rate_two_phase(line(pressure=1e7, length=1.0), state, pipe, 0.6)
    assert h.drop + h.acceleration_drop == pytest.approx(686.9724506803469, rel=1e-6)


@pytest.mark.parametrize("angle", [-90.0, -30.0, -5.0, 0.0, 5.0, 30.0, 90.0])
def test_holdup_and_elevation_match_fluids(angle: float) -> None:
    """The Beggs-Brill total over an inclined line equals fluids' (friction + holdup elevation, no acceleration),
    and the static part is rho_s g dz with the Beggs-Brill holdup."""
    st8 = saturated()
    length = 10.0
    dz = length * math.sin(math.radians(angle))
    h = rate_two_phase(line(length=length, elevation=dz), st8, PIPE, 2.0)
    ref = Beggs_Brill(2.0, 0.1, st8.liquid_density, st8.gas_density, st8.liquid_viscosity, st8.gas_viscosity,
                      st8.surface_tension, 10e5, PIPE.inside_diameter, angle, PIPE.roughness, length,
                      acceleration=False)
    assert h.drop + h.static_drop == pytest.approx(ref, rel=1e-6)
    assert h.two_phase is not None and h.two_phase.liquid_holdup is not None
    assert 0.0 < h.two_phase.liquid_holdup <= 1.0


def test_other_correlations_elevation_uses_void_fraction_not_no_slip() -> None:
    """A vertical Friedel line: static drop from Woldesemayat-Ghajar void fraction (fluids'
    two_phase_dP_gravitational), which differs from the no-slip density's."""
    st8 = saturated()
    h = rate_two_phase(line(length=10.0, elevation=10.0, two_phase_method="Friedel"), st8, PIPE, 2.0)
    alpha = Woldesemayat_Ghajar(0.1, st8.liquid_density, st8.gas_density, st8.surface_tension, 2.0,
                                PIPE.inside_diameter, 10e5, 90.0)
    ref = two_phase_dP_gravitational(90.0, 10.0, alpha, st8.liquid_density, st8.gas_density)
    assert h.static_drop == pytest.approx(ref, rel=1e-6)
    assert h.static_drop != pytest.approx(st8.density * 9.80665 * 10.0, rel=0.05)


def test_regime_matches_fluids_and_map_points() -> None:
    """Flow regime as fluids.two_phase.Taitel_Dukler_regime gives it, and its docstring point (annular)."""
    assert Taitel_Dukler_regime(m=0.6, x=0.112, rhol=915.12, rhog=2.67, mul=180E-6, mug=14E-6, D=0.05,
                                roughness=0.0, angle=0)[0] == "annular"
    state = FluidState(density=1.0, viscosity=1.0, phase="two-phase", source="t", model="t", vapour_fraction=0.112,
                       liquid_density=915.12, gas_density=2.67, liquid_viscosity=180e-6, gas_viscosity=14e-6,
                       surface_tension=0.065)
    pipe = Candidate("2", 2.0, "x", 0.06, 0.005, 0.05, 0.0)
    h = rate_two_phase(line(pressure=1e7, length=1.0), state, pipe, 0.6)
    assert h.two_phase is not None and h.two_phase.flow_regime == "annular"
    assert h.two_phase.regime_map.startswith("Taitel-Dukler")
    # From memory of the Taitel-Dukler (1976) map: low gas and liquid rates stratify; a liquid-rich line at a
    # moderate gas rate is intermittent (slug); little liquid at high gas rate is annular.
    for m, x, expected in [(0.05, 0.01, "stratified"), (5.0, 0.002, "intermittent"), (2.0, 0.5, "annular")]:
        st8 = saturated(x=x)
        got = rate_two_phase(line(), st8, PIPE, m).two_phase
        ref = Taitel_Dukler_regime(m, x, st8.liquid_density, st8.gas_density, st8.liquid_viscosity,
                                   st8.gas_viscosity, PIPE.inside_diameter, 0.0, PIPE.roughness)[0]
        assert got is not None and got.flow_regime == ref
        assert got.flow_regime.startswith(expected)


def test_unknown_method_names_field_value_and_choices() -> None:
    with pytest.raises(InputError) as err:
        rate_two_phase(line(two_phase_method="beggs"), saturated(), PIPE, 2.0)
    assert err.value.field == "two_phase_method" and err.value.value == "beggs"
    assert "Beggs-Brill" in str(err.value.expected) and "homogeneous" in str(err.value.expected)
    assert "Friedel" in accepted_methods()


def test_rate_line_dispatches_and_names_missing_field() -> None:
    h = rate_line(line(), saturated(), PIPE, 2.0)
    assert h.two_phase is not None and "Beggs-Brill" in h.method
    bare = FluidState(density=50.0, viscosity=1e-4, phase="two-phase", source="t", model="t", vapour_fraction=0.1)
    with pytest.raises(InputError) as err:
        rate_line(line(), bare, PIPE, 2.0)
    assert err.value.field == "liquid_density"


def test_line_method_wins_over_service() -> None:
    h = rate_line(line(two_phase_method="Friedel"), saturated(), PIPE, 2.0, two_phase_method="homogeneous")
    assert h.two_phase is not None and h.two_phase.method == "Friedel"
    h = rate_line(line(), saturated(), PIPE, 2.0, two_phase_method="homogeneous")
    assert h.two_phase is not None and h.two_phase.method == "homogeneous"


def test_line_that_cannot_flow_is_choked_never_negative() -> None:
    h = rate_two_phase(line(length=5000.0), saturated(x=0.3), PIPE, 20.0)
    assert h.choked and h.outlet_pressure is not None and h.outlet_pressure >= 0.0
    assert "CANNOT FLOW" in h.method


def test_march_refreshes_along_the_line() -> None:
    """A long line with a property callable is re-flashed along it (here: CoolProp at each pressure with the
    inlet quality, a stand-in for a mixture flash at (p, T))."""
    calls: list[float] = []

    def props(p: float, t: float) -> FluidState:
        calls.append(p)
        return saturated(p=p, x=0.1)

    h = rate_two_phase(line(length=300.0), saturated(x=0.1), PIPE, 3.0, properties=props)
    assert h.two_phase is not None and h.two_phase.segments > 1 and calls
    assert h.two_phase.outlet_vapour_fraction == pytest.approx(0.1)

    def gas_only(p: float, t: float) -> FluidState:
        return FluidState(density=5.0, viscosity=1e-5, phase="gas", source="coolprop", model="HEOS")

    h = rate_two_phase(line(length=300.0), saturated(x=0.1), PIPE, 3.0, properties=gas_only)
    assert "then held: the backend gave a gas state, not two-phase" in h.method

    def failing(p: float, t: float) -> FluidState:
        raise PropertyError("too close to the dew curve")

    h = rate_two_phase(line(length=300.0), saturated(x=0.1), PIPE, 3.0, properties=failing)
    assert "then held: the property backend failed at" in h.method and "too close to the dew curve" in h.method


def test_holdup_helper_matches_fluids_beggs_brill_static() -> None:
    st8 = saturated()
    ph = _Phases(0.1, st8.liquid_density or 0, st8.gas_density or 0, st8.liquid_viscosity or 0,
                 st8.gas_viscosity or 0, st8.surface_tension)
    hl = beggs_brill_holdup(2.0, ph, PIPE.inside_diameter, 90.0)
    # fluids' Beggs_Brill with zero friction is impossible to isolate; its vertical total minus our friction at 0 deg
    total = Beggs_Brill(2.0, 0.1, ph.rhol, ph.rhog, ph.mul, ph.mug, ph.sigma or 0, 10e5, PIPE.inside_diameter, 90.0,
                        PIPE.roughness, 1.0, acceleration=False)
    assert total > (ph.rhol * hl + ph.rhog * (1 - hl)) * 9.80665 * 0.99


@settings(max_examples=30, deadline=None)
@given(st.sampled_from(["liquid", "gas"]), st.floats(1e-9, 1e-6))
def test_homogeneous_tends_to_single_phase(end: str, eps: float) -> None:
    """As x -> 0 (1), the homogeneous method's drop tends to boresize's own single-phase liquid (gas) rating."""
    x = eps if end == "liquid" else 1.0 - eps
    st8 = saturated(x=x)
    h2 = rate_two_phase(line(two_phase_method="homogeneous", length=10.0), st8, PIPE, 0.5)
    rho, mu = (st8.liquid_density, st8.liquid_viscosity) if end == "liquid" else (st8.gas_density, st8.gas_viscosity)
    single = FluidState(density=rho or 0, viscosity=mu or 0, phase="liquid" if end == "liquid" else "gas",
                        source="coolprop", model="HEOS")
    h1 = rate_line(line(length=10.0), single, PIPE, 0.5)
    tol = 3.0 * eps * (st8.liquid_density or 0) / (st8.gas_density or 1) + 1e-9  # the no-slip density's change
    assert h2.drop_per_length == pytest.approx(h1.drop_per_length, rel=tol)
    assert h2.velocity == pytest.approx(h1.velocity, rel=tol)


@pytest.mark.parametrize(("change", "field"), [
    ({"mass_flow": -2.0}, "flow"), ({"mass_flow": 0.0}, "flow"), ({"vapour_fraction": 1.5}, "vapour_fraction"),
    ({"gas_density": 2000.0}, "gas_density"), ({"length": math.nan}, "length"),
    ({"surface_tension": None}, "surface_tension")])
def test_hostile_inputs_are_named(change: dict[str, object], field: str) -> None:
    """Reversed or zero flow, a quality above 1, a vapour heavier than its liquid, a NaN length, no surface
    tension for Beggs-Brill: each an InputError naming its field."""
    from dataclasses import replace
    state, mass, ln = saturated(), float(change.pop("mass_flow", 2.0)), line(length=change.pop("length", 100.0))
    with pytest.raises(InputError) as err:
        rate_two_phase(ln, replace(state, **change), PIPE, mass)  # type: ignore[arg-type]
    assert err.value.field == field


def test_zero_length_riser_keeps_its_static_head_and_tiny_pipe_chokes() -> None:
    h = rate_two_phase(line(length=0.0, elevation=5.0), saturated(), PIPE, 2.0)
    assert h.drop == 0.0 and h.static_drop > 0.0
    assert h.total_drop == pytest.approx(h.static_drop + h.acceleration_drop)  # Beggs-Brill: 1/(1 - Ek)
    tiny = Candidate("1/8", 0.125, "80", 0.0103, 0.0024, 0.0055, 4.5e-5)
    h = rate_two_phase(line(), saturated(), tiny, 2.0)
    assert h.choked and h.outlet_pressure == 0.0 and h.total_drop == 10e5
