"""Two-phase states: each backend that can flash to two phases records each phase's properties.

Checked against the libraries themselves, called directly: CoolProp's PropsSI at Q = 0 and Q = 1 (IAPWS-95 for
water, the reference equations of state), CoolProp's HEOS mixture flash, and thermo's Peng-Robinson flash with
its own SurfaceTensionMixture. The mixture density is the no-slip density 1/rho = x/rho_g + (1 - x)/rho_l and the
viscosity McAdams' 1/mu = x/mu_g + (1 - x)/mu_l (McAdams, Woods, Heroman, Trans. ASME 64 (1942) 193-200).
"""

from __future__ import annotations

import pytest
from CoolProp.CoolProp import PropsSI

from boresize.api import make_line
from boresize.errors import InputError
from boresize.plugins import PluginHost  # noqa: F401 (the type of the conftest fixture)
from boresize.properties.select import fluid_state

P = 1e6  # 10 bar abs


def _state(host: PluginHost, **fields: object):
    return fluid_state(host, make_line("TP-1", flow="10 t/h", **fields))


@pytest.mark.parametrize("quality", [0.05, 0.3, 0.9])
def test_water_by_quality_has_coolprops_saturated_phases_and_homogeneous_mixture(host, quality):
    state = _state(host, fluid="water", pressure="10 bar", temperature=None, quality=quality)
    rho_l, rho_g = PropsSI("D", "P", P, "Q", 0, "Water"), PropsSI("D", "P", P, "Q", 1, "Water")  # CoolProp, IAPWS-95
    mu_l, mu_g = PropsSI("V", "P", P, "Q", 0, "Water"), PropsSI("V", "P", P, "Q", 1, "Water")
    assert state.phase == "two-phase" and state.vapour_fraction == quality
    assert (state.liquid_density, state.gas_density) == (pytest.approx(rho_l, rel=1e-9), pytest.approx(rho_g, rel=1e-9))
    assert (state.liquid_viscosity, state.gas_viscosity) == (pytest.approx(mu_l, rel=1e-9), pytest.approx(mu_g, rel=1e-9))
    assert state.density == pytest.approx(1.0 / (quality / rho_g + (1.0 - quality) / rho_l), rel=1e-12)
    assert state.viscosity == pytest.approx(1.0 / (quality / mu_g + (1.0 - quality) / mu_l), rel=1e-12)
    assert state.surface_tension == pytest.approx(PropsSI("I", "P", P, "Q", 0, "Water"), rel=1e-9)
    # IAPWS R1-76(2014): water's surface tension at 179.9 degC is about 42.1 mN/m (from memory)
    assert state.surface_tension == pytest.approx(0.0421, rel=0.01)
    assert state.temperature == pytest.approx(PropsSI("T", "P", P, "Q", 0, "Water"), rel=1e-12)
    assert state.speed_of_sound is None


def test_quality_tends_to_the_saturated_phases_at_its_ends(host):
    wet = _state(host, fluid="water", pressure="10 bar", temperature=None, quality=1e-9)
    dry = _state(host, fluid="water", pressure="10 bar", temperature=None, quality=1.0 - 1e-9)
    assert wet.density == pytest.approx(PropsSI("D", "P", P, "Q", 0, "Water"), rel=1e-6)
    assert dry.density == pytest.approx(PropsSI("D", "P", P, "Q", 1, "Water"), rel=1e-6)


def test_a_fluid_without_coolprop_surface_tension_gives_none_and_says_so(host, monkeypatch):
    from boresize.properties import coolprop

    real = coolprop._cp

    class _State:  # CoolProp's own message for a fluid without a surface-tension curve (e.g. Novec649)
        def __init__(self, inner):
            self._inner = inner

        def __getattr__(self, name):
            return getattr(self._inner, name)

        def surface_tension(self):
            raise ValueError("surface tension curve not provided")

    backend = coolprop.CoolPropBackend()
    original = backend._abstract_state
    monkeypatch.setattr(backend, "_abstract_state", lambda name: _State(original(name)))
    monkeypatch.setattr(coolprop, "_cp", real)
    line = make_line("TP-1", "water", "10 t/h", "10 bar", None, quality=0.5)
    state = backend.state(line, line.pressure, line.temperature)
    assert state.surface_tension is None
    assert state.notes == ("CoolProp has no surface tension for Water: surface tension not known",)
    assert state.liquid_density == pytest.approx(PropsSI("D", "P", P, "Q", 0, "Water"), rel=1e-9)


def test_coolprop_mixture_two_phase_records_each_phase_and_thermo_s_surface_tension(host):
    """Each phase from CoolProp's own flash; the surface tension, which CoolProp has none of for a mixture, from
    thermo's SurfaceTensionMixture of the liquid phase (outside references: CoolProp AbstractState, thermo)."""
    state = _state(host, fluid="propane 0.5, n-butane 0.5", pressure="8 bar", temperature="40 degC",
                   backend="coolprop-mixture")
    from CoolProp import CoolProp as CP

    flash = CP.AbstractState("HEOS", "Propane&Butane")  # CoolProp's own (p, T) flash of the mixture
    flash.set_mole_fractions([0.5, 0.5])
    flash.update(CP.PT_INPUTS, 8e5, 313.15)
    assert state.phase == "two-phase"
    assert state.liquid_density == pytest.approx(flash.saturated_liquid_keyed_output(CP.iDmass), rel=1e-9)
    assert state.gas_density == pytest.approx(flash.saturated_vapor_keyed_output(CP.iDmass), rel=1e-9)
    x = state.vapour_fraction
    assert state.density == pytest.approx(1.0 / (x / state.gas_density + (1.0 - x) / state.liquid_density), rel=1e-12)
    assert state.viscosity == pytest.approx(
        1.0 / (x / state.gas_viscosity + (1.0 - x) / state.liquid_viscosity), rel=1e-12)
    assert state.surface_tension is not None and 0.001 < state.surface_tension < 0.05  # N/m, a light hydrocarbon liquid
    assert any("surface tension" in note and "SurfaceTensionMixture" in note for note in state.notes)


def test_gerg_two_phase_records_each_phase(host):
    state = _state(host, fluid="propane 0.5, n-butane 0.5", pressure="8 bar", temperature="40 degC")
    assert state.source == "gerg-2008" and state.phase == "two-phase"
    assert state.liquid_density is not None and state.gas_density is not None
    assert state.liquid_density > 400.0 > 30.0 > state.gas_density  # liquid LPG about 520, vapour about 17 kg/m3


def test_thermo_two_phase_records_each_phase_and_thermos_mixture_surface_tension(host):
    state = _state(host, fluid="propane 0.5, n-butane 0.5", pressure="8 bar", temperature="40 degC", backend="thermo")
    from boresize.properties.mixing import mass_fractions
    from boresize.properties.thermo_phases import load_package

    package = load_package(("74-98-6", "106-97-8"), "PR")
    split = package.flash(313.15, 8e5, (0.5, 0.5))
    liquid, gas = package.liquid(313.15, 8e5, split.liquid_zs, None), package.gas(313.15, 8e5, split.gas_zs)
    assert state.phase == "two-phase"
    assert (state.liquid_density, state.gas_density) == (pytest.approx(liquid.density), pytest.approx(gas.density))
    assert state.liquid_viscosity == pytest.approx(liquid.viscosity)
    assert state.gas_viscosity == pytest.approx(gas.viscosity)
    sigma = package.correlations.SurfaceTensionMixture(
        313.15, 8e5, list(split.liquid_zs), list(mass_fractions(split.liquid_zs, package.molar_masses)))
    assert state.surface_tension == pytest.approx(sigma, rel=1e-12)
    # propane about 6 and n-butane about 10 mN/m at 40 degC (from memory): the mixture lies between
    assert 0.005 < state.surface_tension < 0.011
    assert any("SurfaceTensionMixture (Winterfeld, Scriven, and Davis (1978))" in note for note in state.notes)


def test_thermo_leaves_a_supercritical_component_out_of_the_surface_tension_and_says_so(host):
    state = _state(host, fluid="methane 0.8, n-pentane 0.2", pressure="20 bar", temperature="20 degC",
                   backend="thermo")
    assert state.phase == "two-phase"
    # n-pentane alone is about 16 mN/m at 20 degC (from memory); without methane the estimate is n-pentane's
    assert state.surface_tension == pytest.approx(0.016, rel=0.05)
    assert any("without methane (above the critical temperature), an upper estimate" in n for n in state.notes)


def test_a_pure_fluid_on_its_saturation_curve_without_quality_asks_for_one(host):
    from boresize.api import size

    t_sat = PropsSI("T", "P", P, "Q", 0, "Water")  # CoolProp, IAPWS-95: on the curve at 10 bar
    line = make_line("TP-1", "water", "10 t/h", P, t_sat, si=True, phase="two-phase")
    result = size(line)
    assert result.status == "error"
    assert "give the line's quality (vapour mass fraction)" in (result.error or ""), result.error


def test_phase_two_phase_with_given_values_is_refused(host):
    with pytest.raises(InputError, match="backend 'table' takes one density and viscosity"):
        _state(host, fluid="wet gas", pressure="10 bar", temperature="40 degC", density="50 kg/m3",
               viscosity="0.02 cP", phase="two-phase")
