"""The aqueous-mixing backend: water with TEG, DEG, MEA, DEA, MDEA or several solutes.

References, named beside each check: CoolProp's reference equation for water (IAPWS-95) and its Melinder
incompressibles (INCOMP::MEG, INCOMP::MPG) computed in the test; thermo's pure-liquid correlations computed in
the test; handbook densities marked "from memory".
"""

from __future__ import annotations

from typing import Any

import pytest

from boresize.api import size_rows
from boresize.errors import InputError, PropertyError
from boresize.model import Flow, Line
from boresize.properties.aqueous_mixing import AqueousMixingBackend, MixedSolution
from boresize.properties.select import fluid_state

T0 = 273.15
WATER = "7732-18-5"


@pytest.fixture(scope="module")
def backend() -> AqueousMixingBackend:
    return AqueousMixingBackend()


def make_line(fluid: str, pressure: float = 4e5, temperature: float = T0 + 20.0, **fields: Any) -> Line:
    return Line(tag="AM-1", fluid=fluid, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature, **fields)


def at(backend: AqueousMixingBackend, fluid: str, pressure: float = 4e5, celsius: float = 20.0) -> Any:
    return backend.state(make_line(fluid, pressure, T0 + celsius), pressure, T0 + celsius)


def binary(cas: str, mass_fraction: float) -> MixedSolution:
    """A water + solute solution built from mass fractions with chemicals' molar masses."""
    from chemicals import MW

    masses = (MW(WATER) / 1000.0, MW(cas) / 1000.0)
    ws = (1.0 - mass_fraction, mass_fraction)
    moles = [w / m for w, m in zip(ws, masses)]
    zs = tuple(n / sum(moles) for n in moles)
    return MixedSolution((WATER, cas), zs, ws, sum(z * m for z, m in zip(zs, masses)), "test")


# --- the pure ends against the pure-component references ------------------------------------------------
@pytest.mark.parametrize("celsius", [20.0, 60.0])
def test_water_end_is_iapws95(backend: AqueousMixingBackend, celsius: float) -> None:
    import CoolProp.CoolProp as CP

    # 1 ppm TEG: the mixing rule must return water's own properties (IAPWS-95 and its viscosity through CoolProp)
    state = at(backend, "mass: water 0.999999, TEG 0.000001", 4e5, celsius)
    assert state.density == pytest.approx(CP.PropsSI("D", "P", 4e5, "T", T0 + celsius, "Water"), rel=2e-3)
    assert state.viscosity == pytest.approx(CP.PropsSI("V", "P", 4e5, "T", T0 + celsius, "Water"), rel=2e-2)
    # and the bubble pressure water's vapour pressure (IAPWS-95)
    assert state.bubble_pressure == pytest.approx(CP.PropsSI("P", "T", T0 + celsius, "Q", 0, "Water"), rel=1e-2)


@pytest.mark.parametrize(("name", "cas"), [("TEG", "112-27-6"), ("DEG", "111-46-6"), ("MEA", "141-43-5")])
def test_solute_end_is_thermos_pure_liquid(backend: AqueousMixingBackend, name: str, cas: str) -> None:
    from chemicals import MW
    from thermo import ViscosityLiquid, VolumeLiquid

    density, viscosity = backend.liquid_properties(binary(cas, 1.0 - 1e-9), T0 + 40.0)
    # thermo's pure-liquid correlations, computed here
    assert density == pytest.approx(MW(cas) / 1000.0 / VolumeLiquid(CASRN=cas).T_dependent_property(T0 + 40.0),
                                    rel=1e-6)
    assert viscosity == pytest.approx(ViscosityLiquid(CASRN=cas).T_dependent_property(T0 + 40.0), rel=1e-6)


def test_handbook_densities(backend: AqueousMixingBackend) -> None:
    # pure TEG about 1125 kg/m3 at 20 degC (handbook, from memory)
    density, _ = backend.liquid_properties(binary("112-27-6", 1.0), T0 + 20.0)
    assert density == pytest.approx(1125.0, rel=5e-3)
    # 50 wt% MDEA about 1045 kg/m3 at 25 degC (handbook, from memory): Amagat reads light (contraction on mixing)
    density, _ = backend.liquid_properties(binary("105-59-9", 0.5), T0 + 25.0)
    assert 0.96 * 1045.0 < density < 1045.0
    # pure MDEA away from the Rackett anchor: about 1010 kg/m3 at 60 degC (handbook, from memory)
    density, _ = backend.liquid_properties(binary("105-59-9", 1.0), T0 + 60.0)
    assert density == pytest.approx(1010.0, rel=1.5e-2)


# --- the mixing rule's bias, measured against the Melinder correlations (CoolProp incompressibles) -------
@pytest.mark.parametrize(("code", "cas"), [("MEG", "107-21-1"), ("MPG", "57-55-6")])
@pytest.mark.parametrize("fraction", [0.3, 0.5])
@pytest.mark.parametrize("celsius", [20.0, 40.0, 60.0])
def test_mixing_rule_against_melinder(backend: AqueousMixingBackend, code: str, cas: str, fraction: float,
                                      celsius: float) -> None:
    import CoolProp.CoolProp as CP

    reference = CP.AbstractState("INCOMP", code)
    reference.set_mass_fractions([fraction])
    reference.update(CP.PT_INPUTS, 3e5, T0 + celsius)
    density, viscosity = backend.liquid_properties(binary(cas, fraction), T0 + celsius)
    # the documented bias: Amagat 0.5-2.5 % light, log-mass-fraction viscosity 5-30 % high
    assert -0.025 < density / reference.rhomass() - 1 < -0.005
    assert 0.05 < viscosity / reference.viscosity() - 1 < 0.30


# --- states, families and refusals ----------------------------------------------------------------------
@pytest.mark.parametrize("fluid", [
    "mass: water 0.5, TEG 0.5", "mass: water 0.5, DEG 0.5", "mass: water 0.7, MEA 0.3",
    "mass: water 0.65, DEA 0.35", "mass: water 0.5, MDEA 0.5", "mass: water 0.5, MDEA 0.45, MEA 0.05",
    "mass: water 0.5, MDEA 0.4, methanol 0.1", "water 0.5, ethanol 0.3, methanol 0.2",
])
def test_served_with_the_mixing_rule_named(host: Any, fluid: str) -> None:
    state = fluid_state(host, make_line(fluid, 4e5, T0 + 40.0))
    assert state.source == "aqueous-mixing" and state.phase == "liquid"
    assert state.family == "aqueous solution (mixing rule)"
    assert state.validity is not None and "no correlation made for this solution" in state.validity
    assert any("mixing rule" in note for note in state.notes)
    # the bubble pressure lies below water's own vapour pressure (IAPWS-95, 0.0738 bar abs at 40 degC) for the
    # non-volatile solutes: glycols and amines lower it
    if "methanol" not in fluid:
        assert state.bubble_pressure is not None and 0.0 < state.bubble_pressure < 7385.0


def test_teg_is_no_longer_two_liquids(sizer: Any) -> None:
    # water + TEG is fully miscible (the dehydration solvent); Peng-Robinson split it into 'LL'
    rows = [({"tag": "TEG-1", "fluid": "mass: water 0.5, TEG 0.5", "flow": "10 t/h", "pressure": "4 bar",
              "temperature": "20 degC", "service": "liquid"}, {})]
    (result,) = size_rows(rows, sizer=sizer)
    assert result.status != "error", result.error


@pytest.mark.parametrize(("fluid", "expected"), [
    ("mass: water 0.5, TEG 0.5", True), ("mass: water 0.7, MDEA 0.3", True), ("water 0.5, MEG 0.3, MPG 0.2", True),
    ("mass: water 0.7, ethanol 0.3", False),  # the Melinder backend's
    ("mass: water 0, TEG 1", False), ("TEG", False), ("water 0.5, TEG 0.3, n-hexane 0.2", False),
    ("TEG 0.5, MEA 0.5", False), ("water 0.5, unobtainium 0.5", False),
])
def test_what_the_backend_takes(backend: AqueousMixingBackend, fluid: str, expected: bool) -> None:
    assert backend.handles(make_line(fluid)) is expected


def test_refusals_name_the_range(backend: AqueousMixingBackend) -> None:
    with pytest.raises(PropertyError, match=r"0 to 100 degC"):
        at(backend, "mass: water 0.5, TEG 0.5", 10e5, 150.0)
    with pytest.raises(PropertyError, match=r"0 to 100 degC"):
        at(backend, "mass: water 0.5, TEG 0.5", 4e5, -5.0)
    with pytest.raises(PropertyError, match=r"no published interaction parameters between TEG and MEA"):
        at(backend, "mass: water 0.5, TEG 0.4, MEA 0.1", 4e5, 40.0)
    # 30 wt% MEA at 60 degC boils near water's 0.199 bar abs (IAPWS-95): 0.05 bar abs is below its bubble pressure
    with pytest.raises(PropertyError, match=r"boils at 0.05 bar abs, 60 degC: its bubble pressure is 0\.1"):
        at(backend, "mass: water 0.7, MEA 0.3", 0.05e5, 60.0)
    # DEA's viscosity correlation (DIPPR, thermo) starts at 20 degC: below it the line says it is extrapolated
    from thermo import ViscosityLiquid

    dippr = ViscosityLiquid(CASRN="111-42-2")
    low = dippr.T_limits["DIPPR_PERRY_8E"][0]
    cold = at(backend, "mass: water 0.5, DEA 0.5", 4e5, low - T0 - 10.0)
    assert any("extrapolated below the range of" in n and "DEA ViscosityLiquid DIPPR_PERRY_8E" in n for n in cold.notes)
    warm = at(backend, "mass: water 0.5, DEA 0.5", 4e5, low - T0 + 10.0)
    assert not any("ViscosityLiquid" in n for n in warm.notes)
    with pytest.raises(InputError, match=r"eos"):
        backend.state(make_line("mass: water 0.5, TEG 0.5", eos="PR"), 4e5, T0 + 20.0)
