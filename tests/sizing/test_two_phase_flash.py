"""Two-phase lines along their length and through CoolProp's mixture backends: the surface tension of a CoolProp
mixture's liquid (thermo's method, as the thermo backend), and the isenthalpic re-flash of a pure fluid."""

from __future__ import annotations

import pytest

from boresize.io.rows import line_from_row

PROPANE_BUTANE = {"tag": "M-1", "fluid": "propane:0.6, n-butane:0.4", "flow": "20 t/h", "pressure": "10 bara",
                  "temperature": "50 degC", "length": "60 m", "service": "two-phase"}


def _thermo_sigma(names: list[str], liquid_zs: list[float], temperature: float, pressure: float) -> float:
    """thermo's SurfaceTensionMixture over the pure components, called directly (the outside reference)."""
    from thermo import ChemicalConstantsPackage

    constants, correlations = ChemicalConstantsPackage.from_IDs(names)
    masses = [z * m for z, m in zip(liquid_zs, constants.MWs)]
    ws = [m / sum(masses) for m in masses]
    return float(correlations.SurfaceTensionMixture(temperature, pressure, liquid_zs, ws))


@pytest.mark.parametrize("backend", ["coolprop-mixture", "gerg-2008"])
def test_a_coolprop_mixture_two_phase_line_gets_thermos_surface_tension_of_its_liquid_and_sizes(sizer, backend):
    """Propane 0.6, n-butane 0.4 (mole) at 10 bar abs, 50 degC is two-phase; CoolProp gives no surface tension of a
    mixture, so the state's is thermo's SurfaceTensionMixture on CoolProp's liquid composition (outside
    references: CoolProp's PT flash of the same mixture, thermo's SurfaceTensionMixture)."""
    from CoolProp import CoolProp as CP

    result = sizer.run(line_from_row(PROPANE_BUTANE | {"backend": backend}))
    assert result.status in ("pass", "fail"), result.error
    state = result.state
    assert state.phase == "two-phase" and state.surface_tension is not None
    reference = CP.AbstractState("HEOS", "Propane&n-Butane")
    reference.set_mole_fractions([0.6, 0.4])
    reference.update(CP.PT_INPUTS, 10e5, 323.15)
    expected = _thermo_sigma(["propane", "n-butane"], list(reference.mole_fractions_liquid()), 323.15, 10e5)
    # 0.04 % apart: the backend's package prefers the published liquid-volume correlations, which the mixing rule
    # (Winterfeld-Scriven-Davis) weights by; thermo's defaults are called here
    assert state.surface_tension == pytest.approx(expected, rel=2e-3)
    assert 0.003 < state.surface_tension < 0.012  # light hydrocarbon liquids at 50 degC: a few mN/m
    assert any("SurfaceTensionMixture" in note and "CoolProp's liquid-phase composition" in note
               for note in state.notes)
    two = result.selected.hydraulics.two_phase
    assert two is not None and two.method == "Beggs-Brill" and two.surface_tension == state.surface_tension


def test_a_dissolved_supercritical_component_is_left_out_of_the_surface_tension_and_the_note_says_so(sizer):
    """Methane 0.85, n-pentane 0.15 at 30 bar abs, 20 degC: methane is above its critical temperature, so (as in
    the thermo backend) it is left out of the liquid's surface tension and the note names it."""
    row = PROPANE_BUTANE | {"fluid": "methane:0.85, n-pentane:0.15", "pressure": "30 bara", "temperature": "20 degC",
                            "backend": "coolprop-mixture"}
    result = sizer.run(line_from_row(row))
    assert result.status in ("pass", "fail"), result.error
    assert result.state.surface_tension is not None and 0.005 < result.state.surface_tension < 0.03
    assert any("without methane" in note for note in result.state.notes)


def test_a_long_steam_water_line_flashes_isenthalpically_and_its_outlet_quality_is_coolprops(sizer):
    """Water at 3 bar abs, quality 0.1, 20 t/h, 400 m of NPS 8: the pressure falls along the line, so the quality
    rises; the outlet's is CoolProp's HmassP flash at the outlet pressure with the inlet's enthalpy (outside
    reference: CoolProp.PropsSI)."""
    from CoolProp.CoolProp import PropsSI

    row = {"tag": "RB-1", "fluid": "water", "flow": "20 t/h", "pressure": "3 bara", "quality": "0.1",
           "length": "400 m", "service": "two-phase", "nps": "8", "design_margin": "0 %"}
    result = sizer.run(line_from_row(row))
    assert result.status in ("pass", "fail"), result.error
    hyd = result.selected.hydraulics
    assert hyd.two_phase is not None and hyd.two_phase.segments > 1 and not hyd.choked
    outlet_x = hyd.two_phase.outlet_vapour_fraction
    assert outlet_x is not None and outlet_x > hyd.two_phase.vapour_fraction + 0.005
    h_in = PropsSI("H", "P", 3e5, "Q", 0.1, "Water")
    assert outlet_x == pytest.approx(PropsSI("Q", "P", hyd.outlet_pressure, "H", h_in, "Water"), rel=1e-3)
    assert "isenthalpically" in hyd.method and "HmassP" in hyd.method


def test_a_mixture_line_re_flashes_isothermally_and_says_so(sizer):
    row = PROPANE_BUTANE | {"length": "800 m", "nps": "4", "backend": "coolprop-mixture", "design_margin": "0 %"}
    result = sizer.run(line_from_row(row))
    assert result.status in ("pass", "fail"), result.error
    hyd = result.selected.hydraulics
    assert hyd.two_phase is not None and hyd.two_phase.segments > 1
    assert "isothermal" in hyd.method
    assert hyd.two_phase.outlet_vapour_fraction is not None


def test_a_line_may_name_the_homogeneous_method_the_hydraulics_offer(sizer):
    """two_phase_method "homogeneous" (any case) was refused by the line reader though the hydraulics rate it."""
    row = {"tag": "H-1", "fluid": "R134a", "flow": "5 t/h", "pressure": "5 bara", "quality": "0.3", "length": "60 m",
           "service": "two-phase", "two_phase_method": "Homogeneous"}
    result = sizer.run(line_from_row(row))
    assert result.status in ("pass", "fail"), result.error
    assert result.selected.hydraulics.two_phase.method == "homogeneous"
