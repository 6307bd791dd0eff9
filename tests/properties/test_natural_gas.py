"""Natural gas and other GERG-2008 component sets: backend gerg-2008 (issue 15).

References, each computed in the test: "GERG-2008 through CoolProp" is CoolProp's own HEOS mixture flash
(unconstrained, its own phase decision) with the GERG-2008 parameters; "CoolProp reference equation" is
CoolProp's pure-fluid equation of state; Raoult's law with CoolProp's pure-water vapour pressure bounds the dew
point of a wet gas. The GERG-2008 range is Kunz & Wagner 2012 (from memory).
"""

from __future__ import annotations

from typing import Any

import pytest

from boresize.errors import InputError, PropertyError
from boresize.model import Flow, Line
from boresize.plugins import PluginHost
from boresize.properties.gerg import GergBackend
from boresize.properties.select import choose_backend, fluid_state

T0 = 273.15  # [K] at 0 degC (definition of the Celsius scale)
GASES = {
    "lean": (("methane", "Methane", 0.95), ("ethane", "Ethane", 0.03), ("nitrogen", "Nitrogen", 0.015),
             ("carbon dioxide", "CarbonDioxide", 0.005)),
    "typical": (("methane", "Methane", 0.90), ("ethane", "Ethane", 0.06), ("propane", "Propane", 0.03),
                ("n-butane", "n-Butane", 0.01)),
    "rich": (("methane", "Methane", 0.80), ("ethane", "Ethane", 0.08), ("propane", "Propane", 0.04),
             ("n-butane", "n-Butane", 0.02), ("nitrogen", "Nitrogen", 0.03), ("carbon dioxide", "CarbonDioxide", 0.03)),
}


def text(gas: str) -> str:
    return ", ".join(f"{name}:{z}" for name, _, z in GASES[gas])


def make_line(fluid: str, pressure: float, temperature: float, **overrides: Any) -> Line:
    return Line(tag="NG-1", fluid=fluid, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature,
                **overrides)


@pytest.fixture(scope="module")
def gerg() -> GergBackend:
    return GergBackend()


def coolprop_flash(names: list[str], zs: list[float], pressure: float, temperature: float) -> tuple[float, float]:
    """GERG-2008 through CoolProp: (density [kg/m3], viscosity [Pa s]) from CoolProp's own PT flash."""
    from CoolProp import CoolProp as CP

    state = CP.AbstractState("HEOS", "&".join(names))
    state.set_mole_fractions(zs)
    state.update(CP.PT_INPUTS, pressure, temperature)
    return state.rhomass(), state.viscosity()


@pytest.mark.parametrize("gas", sorted(GASES))
@pytest.mark.parametrize("temperature", [T0 + 5.0, T0 + 40.0])
def test_density_and_viscosity_agree_with_gerg_2008_through_coolprop(gerg: GergBackend, gas: str,
                                                                     temperature: float) -> None:
    names = [cp for _, cp, _ in GASES[gas]]
    zs = [z for _, _, z in GASES[gas]]
    for bar in (10.0, 40.0, 70.0, 100.0):
        pressure = bar * 1e5
        state = gerg.state(make_line(text(gas), pressure, temperature), pressure, temperature)
        density, viscosity = coolprop_flash(names, zs, pressure, temperature)  # GERG-2008 through CoolProp
        assert state.phase == "gas" and state.source == "gerg-2008"
        assert state.density == pytest.approx(density, rel=1e-3)
        assert state.viscosity == pytest.approx(viscosity, rel=1e-2)


def test_the_line_names_family_validity_and_model(gerg: GergBackend) -> None:
    import importlib.metadata

    state = gerg.state(make_line(text("typical"), 50e5, T0 + 20.0), 50e5, T0 + 20.0)
    assert state.family == "natural gas" and state.eos == "GERG-2008"
    assert state.validity == ("GERG-2008 normal range 90-450 K, up to 35 MPa; extended range 60-700 K, up to "
                              "70 MPa (Kunz & Wagner 2012)")
    assert state.model.startswith(f"GERG-2008 (ISO 20765-2) through CoolProp {importlib.metadata.version('CoolProp')}")
    assert "gas phase imposed: above the cricondentherm" in state.model
    co2 = gerg.state(make_line("carbon dioxide:0.9, nitrogen:0.1", 20e5, T0 + 20.0), 20e5, T0 + 20.0)
    assert co2.family == "GERG-2008 component set"


def test_a_gerg_set_is_chosen_automatically_and_a_named_backend_is_honoured(host: PluginHost) -> None:
    line = make_line(text("rich"), 50e5, T0 + 20.0)
    assert choose_backend(host, line).id == "gerg-2008"
    assert choose_backend(host, make_line("C1:0.9, C2:0.06, nC4:0.04", 50e5, T0 + 20.0)).id == "gerg-2008"
    assert choose_backend(host, make_line("methane:0.9, benzene:0.1", 50e5, T0 + 20.0)).id == "thermo"
    assert choose_backend(host, make_line(text("rich"), 50e5, T0 + 20.0, eos="SRK")).id == "thermo"
    thermo = fluid_state(host, make_line(text("rich"), 50e5, T0 + 20.0, backend="thermo"))
    assert thermo.source == "thermo" and thermo.eos == "PR"
    assert fluid_state(host, line).source == "gerg-2008"


@pytest.mark.parametrize(("pressure", "temperature", "where"), [
    (50e5, 750.0, "50 bar abs, 476.85 degC"),
    (800e5, T0 + 20.0, "800 bar abs, 20 degC"),
    (10e5, 50.0, "10 bar abs, -223.15 degC"),
])
def test_outside_the_extended_range_is_refused_naming_the_range(gerg: GergBackend, pressure: float,
                                                                temperature: float, where: str) -> None:
    message = (f"gerg-2008: {where} is outside the GERG-2008 extended range (60-700 K, up to 70 MPa; "
               f"Kunz & Wagner 2012)")
    with pytest.raises(PropertyError) as caught:
        gerg.state(make_line(text("lean"), pressure, temperature), pressure, temperature)
    assert str(caught.value) == message


def test_outside_the_normal_range_carries_a_note(gerg: GergBackend) -> None:
    state = gerg.state(make_line(text("lean"), 50e5, 500.0), 50e5, 500.0)
    assert ("outside the GERG-2008 normal range (90-450 K, up to 35 MPa), inside its extended range: larger "
            "uncertainty") in state.notes
    inside = gerg.state(make_line(text("lean"), 50e5, 400.0), 50e5, 400.0)
    assert not any("normal range" in note for note in inside.notes)
    dense = gerg.state(make_line(text("lean"), 500e5, T0 + 20.0), 500e5, T0 + 20.0)  # above 35 MPa: a note
    names, zs = [cp for _, cp, _ in GASES["lean"]], [z for _, _, z in GASES["lean"]]
    assert dense.density == pytest.approx(coolprop_flash(names, zs, 500e5, T0 + 20.0)[0], rel=1e-3)
    assert any("outside the GERG-2008 normal range" in note for note in dense.notes)


@pytest.mark.parametrize("decane", [0.001, 0.0003])
def test_a_lean_gas_near_its_dew_point_gets_its_phase_right(gerg: GergBackend, decane: float) -> None:
    from CoolProp import CoolProp as CP

    reference = CP.AbstractState("HEOS", "Methane&n-Decane")  # GERG-2008 through CoolProp: its dew point
    reference.set_mole_fractions([1.0 - decane, decane])
    reference.update(CP.PQ_INPUTS, 50e5, 1.0)
    dew = reference.T()
    fluid = f"methane:{1.0 - decane}, n-decane:{decane}"
    for offset, phase in ((-3.0, "two-phase"), (-1.0, "two-phase"), (1.0, "gas"), (3.0, "gas")):
        state = gerg.state(make_line(fluid, 50e5, dew + offset), 50e5, dew + offset)
        assert state.phase == phase, (offset, state.model)


def test_a_wet_gas_is_two_phase_below_its_water_dew_point_and_gas_above(gerg: GergBackend) -> None:
    from CoolProp import CoolProp as CP

    # Raoult's law with CoolProp's pure-water vapour pressure: 0.1 mol % water at 50 bar abs has a partial
    # pressure of 5 kPa, water's vapour pressure near 33 degC; well below and above it the phase is plain.
    assert CP.PropsSI("P", "T", T0 + 10.0, "Q", 0, "Water") < 5e3 < CP.PropsSI("P", "T", T0 + 60.0, "Q", 0, "Water")
    fluid = "methane:0.999, water:0.001"
    assert gerg.state(make_line(fluid, 50e5, T0 + 60.0), 50e5, T0 + 60.0).phase == "gas"
    assert gerg.state(make_line(fluid, 50e5, T0 + 10.0), 50e5, T0 + 10.0).phase == "two-phase"


def test_an_lpg_liquid_is_near_the_propane_reference_and_has_its_bubble_pressure(gerg: GergBackend) -> None:
    from CoolProp import CoolProp as CP

    state = gerg.state(make_line("propane:0.98, n-butane:0.02", 20e5, T0 + 20.0), 20e5, T0 + 20.0)
    propane = CP.PropsSI("D", "P", 20e5, "T", T0 + 20.0, "Propane")  # CoolProp reference equation
    saturation = CP.PropsSI("P", "T", T0 + 20.0, "Q", 0, "Propane")
    assert state.phase == "liquid" and state.family == "GERG-2008 component set"
    assert state.density == pytest.approx(propane, rel=0.01)
    assert state.vapour_pressure is not None and 0.95 * saturation < state.vapour_pressure < saturation


def test_a_named_backend_refuses_what_gerg_2008_does_not_cover(gerg: GergBackend) -> None:
    with pytest.raises(InputError, match=r"fluid: benzene is not a GERG-2008 component"):
        gerg.state(make_line("methane:0.9, benzene:0.1", 10e5, 300.0), 10e5, 300.0)
    with pytest.raises(InputError, match=r"eos: the gerg-2008 backend has no equation of state 'SRK'"):
        gerg.state(make_line(text("lean"), 10e5, 300.0, eos="SRK"), 10e5, 300.0)
    with pytest.raises(InputError, match=r"fluid: a pure fluid is not a GERG-2008 mixture"):
        gerg.state(make_line("methane", 10e5, 300.0), 10e5, 300.0)
    with pytest.raises(InputError, match=r"temperature: -5 is not above zero"):
        gerg.state(make_line(text("lean"), 10e5, -5.0), 10e5, -5.0)
