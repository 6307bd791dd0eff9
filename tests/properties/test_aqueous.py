"""The aqueous backend: water with an alcohol or glycol, and the refusals where no model fits.

References, named beside each check: the Melinder correlations computed directly through CoolProp's
incompressibles; CoolProp's reference equations for pure water, ethanol and methanol; published
ethanol-water vapour-liquid equilibrium at 1 atm (from memory, see the table below).
"""

from __future__ import annotations

from typing import Any

import pytest
from scipy.optimize import brentq

from boresize.api import size_rows
from boresize.errors import InputError, PropertyError
from boresize.io.rows import line_from_row
from boresize.model import Flow, Line
from boresize.properties.aqueous import AqueousBackend, solution_of

T0 = 273.15
ATM = 101325.0
# Molar masses [g/mol]: water 18.015, ethanol 46.068, methanol 32.042 (IUPAC standard atomic weights)
MOLAR = {"water": 18.015, "ethanol": 46.068, "methanol": 32.042}


@pytest.fixture(scope="module")
def backend() -> AqueousBackend:
    return AqueousBackend()


def make_line(fluid: str, pressure: float = 3e5, temperature: float = T0 + 25.0, **fields: Any) -> Line:
    return Line(tag="AQ-1", fluid=fluid, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature, **fields)


def melinder(code: str, fraction: float, pressure: float, temperature: float) -> tuple[float, float]:
    """Density [kg/m3] and viscosity [Pa s] of CoolProp's incompressible solution, computed directly."""
    import CoolProp.CoolProp as CP

    state = CP.AbstractState("INCOMP", code)
    state.set_mass_fractions([fraction])
    state.update(CP.PT_INPUTS, pressure, temperature)
    return state.rhomass(), state.viscosity()


# --- density and viscosity against the Melinder correlations (CoolProp incompressibles) -----------------
@pytest.mark.parametrize(("name", "code", "temperatures"), [
    ("ethanol", "MEA", (10.0, 25.0, 40.0)),  # MEA and MMA end at 40 degC in CoolProp
    ("methanol", "MMA", (10.0, 25.0, 40.0)),
    ("ethylene glycol", "MEG", (10.0, 40.0, 70.0)),
])
@pytest.mark.parametrize("fraction", [0.1, 0.3])
def test_density_and_viscosity_are_melinders(backend: AqueousBackend, name: str, code: str,
                                             temperatures: tuple[float, ...], fraction: float) -> None:
    fluid = f"mass: water {1 - fraction:g}, {name} {fraction:g}"
    for celsius in temperatures:
        temperature = T0 + celsius
        result = backend.state(make_line(fluid, 3e5, temperature), 3e5, temperature)
        density, viscosity = melinder(code, fraction, 3e5, temperature)  # Melinder through CoolProp, directly
        assert result.density == pytest.approx(density, rel=1e-3)
        assert result.viscosity == pytest.approx(viscosity, rel=1e-3)
        assert result.phase == "liquid" and result.family == "aqueous solution" and result.source == "aqueous"
        assert f"INCOMP::{code}" in result.model and "Melinder" in result.model and "UNIFAC (Dortmund)" in result.model
        assert "wt% in water" in (result.validity or "")


def test_mole_fractions_are_converted_to_the_mass_fraction(backend: AqueousBackend) -> None:
    # 0.3 mol methanol in water -> 0.3 * 32.042 / (0.3 * 32.042 + 0.7 * 18.015) by mass
    mass = 0.3 * MOLAR["methanol"] / (0.3 * MOLAR["methanol"] + 0.7 * MOLAR["water"])
    solution = solution_of("water:0.7, methanol:0.3", None)
    assert solution is not None and solution.code == "MMA"
    assert solution.mass_fraction == pytest.approx(mass, rel=1e-4)
    result = backend.state(make_line("water:0.7, methanol:0.3"), 3e5, T0 + 25.0)
    assert result.density == pytest.approx(melinder("MMA", mass, 3e5, T0 + 25.0)[0], rel=1e-3)


def test_the_incompressible_spellings_get_the_same_state_and_a_bubble_pressure(backend: AqueousBackend) -> None:
    by_mass = backend.state(make_line("mass: water 0.7, ethanol 0.3", 3e5, T0 + 40.0), 3e5, T0 + 40.0)
    for spelling in ("INCOMP::MEA[0.3]", "INCOMP::MEA-30%", "ethanol 30 wt%"):
        result = backend.state(make_line(spelling, 3e5, T0 + 40.0), 3e5, T0 + 40.0)
        assert (result.density, result.viscosity, result.bubble_pressure) == (
            by_mass.density, by_mass.viscosity, by_mass.bubble_pressure)
    glycol = backend.state(make_line("MEG 30%", 3e5, T0 + 20.0), 3e5, T0 + 20.0)
    assert glycol.vapour_pressure is not None and glycol.vapour_pressure == glycol.bubble_pressure


# --- bubble pressure ------------------------------------------------------------------------------------
# Ethanol-water at 1 atm, liquid mole fraction of ethanol -> bubble temperature [degC]: the classic table
# of Perry's Chemical Engineers' Handbook (vapour-liquid equilibrium of ethanol-water, from memory), and
# the azeotrope at 89.4 mol % ethanol, 78.15 degC.
ETHANOL_WATER_1ATM = [(0.0966, 86.7), (0.2337, 82.7), (0.5079, 79.8), (0.894, 78.15)]


@pytest.mark.parametrize(("ethanol", "celsius"), ETHANOL_WATER_1ATM)
def test_ethanol_water_bubble_temperature_at_one_atmosphere(backend: AqueousBackend, ethanol: float,
                                                             celsius: float) -> None:
    # Outside the Melinder density range (above 60 wt %) the bubble pressure is still defined: it is asked of
    # the UNIFAC liquid directly. Tolerance 0.5 K (about 2 % in pressure near 80 degC): the table is quoted to
    # 0.1 K and from memory; measured deviations over the whole table are -0.8 to +0.1 K.
    from boresize.properties.aqueous import _solution

    mass = ethanol * MOLAR["ethanol"] / (ethanol * MOLAR["ethanol"] + (1 - ethanol) * MOLAR["water"])
    solution = _solution("MEA", mass, None)
    bubble_t = brentq(lambda t: backend.bubble_pressure(solution, t) - ATM, T0 + 60.0, T0 + 100.0)
    assert bubble_t - T0 == pytest.approx(celsius, abs=0.5)


@pytest.mark.parametrize(("fluid", "solute", "celsius"), [
    ("mass: water 0.7, ethanol 0.3", "Ethanol", 40.0), ("mass: water 0.9, ethanol 0.1", "Ethanol", 10.0),
    ("mass: water 0.7, methanol 0.3", "Methanol", 25.0),
])
def test_the_bubble_pressure_lies_between_the_pure_vapour_pressures(backend: AqueousBackend, fluid: str,
                                                                    solute: str, celsius: float) -> None:
    import CoolProp.CoolProp as CP

    temperature = T0 + celsius
    result = backend.state(make_line(fluid, 3e5, temperature), 3e5, temperature)
    water = CP.PropsSI("P", "T", temperature, "Q", 0, "Water")  # IAPWS-95 through CoolProp
    pure = CP.PropsSI("P", "T", temperature, "Q", 0, solute)  # CoolProp reference equation
    assert result.bubble_pressure is not None and water < result.bubble_pressure < pure
    assert result.vapour_pressure == result.bubble_pressure


def test_a_glycol_solution_bubble_pressure_is_close_to_waters_partial_pressure(backend: AqueousBackend) -> None:
    import CoolProp.CoolProp as CP

    temperature = T0 + 60.0
    solution = solution_of("MEG 30%", None)
    assert solution is not None
    result = backend.state(make_line("MEG 30%", 3e5, temperature), 3e5, temperature)
    raoult = solution.zs[0] * CP.PropsSI("P", "T", temperature, "Q", 0, "Water")  # Raoult's law, water only
    # ethylene glycol's own vapour pressure is under 1 % of water's at 60 degC: the bubble pressure is water's
    # partial pressure, with an activity coefficient of water near 1 (within 5 %)
    assert result.bubble_pressure == pytest.approx(raoult, rel=0.05)


# --- refusals -------------------------------------------------------------------------------------------
@pytest.mark.parametrize(("fluid", "celsius", "pressure", "message"), [
    ("mass: water 0.3, ethanol 0.7", 25.0, 3e5,
     "aqueous: ethanol 70 wt% in water is outside the Melinder correlation's range INCOMP::MEA (ethanol 0 to 60 "
     "wt% in water); give the line's density and viscosity (and vapour_pressure), or name a backend (backend "
     "thermo: a cubic equation of state)"),
    ("mass: water 0.7, ethanol 0.3", 60.0, 3e5,
     "aqueous: ethanol 30 wt% in water at 3 bar abs, 60 degC is outside the Melinder correlation's range "
     "INCOMP::MEA (-20.14 degC (freezing point) to 40 degC at this fraction); give the line's density and "
     "viscosity (and vapour_pressure), or name a backend (backend thermo: a cubic equation of state)"),
    ("MEG 30%", -20.0, 3e5, "aqueous: ethylene glycol 30 wt% in water at 3 bar abs, -20 degC is outside"),
    ("mass: water 0.7, ethanol 0.3", 40.0, 0.1e5,
     "aqueous: ethanol 30 wt% in water boils at 0.1 bar abs, 40 degC: its bubble pressure is 0.13"),
])
def test_outside_the_range_is_refused_naming_it(backend: AqueousBackend, fluid: str, celsius: float,
                                                pressure: float, message: str) -> None:
    with pytest.raises(PropertyError) as caught:
        backend.state(make_line(fluid, pressure, T0 + celsius), pressure, T0 + celsius)
    assert str(caught.value).startswith(message)


def test_an_eos_is_refused(backend: AqueousBackend) -> None:
    with pytest.raises(InputError, match=r"eos: the aqueous backend has no equation of state 'PR'"):
        backend.state(make_line("MEG 30%", eos="PR"), 3e5, T0 + 25.0)


@pytest.mark.parametrize(("fluid", "expected"), [
    ("mass: water 0.7, ethanol 0.3", True), ("MEG 30%", True), ("INCOMP::MPG[0.4]", True),
    ("mass: water 0.6, glycerol 0.4", True), ("NaCl 10%", False), ("water:1, ethanol:0", False),
    ("water:0.5, ethanol:0.3, methanol:0.2", False), ("water:0.5, n-hexane:0.5", False),
    ("water:0.5, unobtainium:0.5", False), ("ethanol", False), ("INCOMP::MEG", False),
])
def test_what_the_backend_takes(backend: AqueousBackend, fluid: str, expected: bool) -> None:
    assert backend.handles(make_line(fluid)) is expected


# --- through the sizer ----------------------------------------------------------------------------------
def test_water_and_hexane_are_refused_with_what_to_do(sizer: Any) -> None:
    # Water and liquid propane split into two liquid phases (thermo's flash says 'LL' at 20 bar, 25 degC);
    # they are practically immiscible (propane's solubility in water is about 60 mg/L at 25 degC: from memory).
    rows = [({"tag": "LL-3", "fluid": "water:0.5, propane:0.5", "flow": "10 t/h", "pressure": "20 bar",
              "temperature": "25 degC", "service": "liquid"}, {}),
            ({"tag": "LL-4", "fluid": "water:0.5, n-hexane:0.5", "flow": "10 t/h", "pressure": "3 barg",
              "temperature": "25 degC", "service": "liquid"}, {})]
    propane, hexane = size_rows(rows, sizer=sizer)
    assert propane.status == "error" and propane.error == (
        "line LL-3: fluid: two liquid phases (water and hydrocarbon) in water 0.5, propane 0.5 at 20 bar abs, "
        "25 degC: thermo's flash finds 'LL' and this backend models one liquid, so its density and viscosity "
        "would be wrong; expected each liquid phase's line sized separately, or the line's own density and "
        "viscosity")
    assert hexane.status == "error" and hexane.error == (
        "line LL-4: fluid: water (0.5 mol) and C3+ hydrocarbons (0.5 mol) form two liquid phases in water 0.5, "
        "hexane 0.5 at 4.01325 bar abs, 25 degC (PR); the thermo backend models one liquid, so its density and "
        "viscosity would be wrong; expected the water and hydrocarbon liquids sized as separate streams, or the "
        "line's own density and viscosity")


def test_flashing_on_an_aqueous_line_uses_the_bubble_pressure(sizer: Any, backend: AqueousBackend) -> None:
    row = {"tag": "EW-1", "fluid": "mass: water 0.7, ethanol 0.3", "flow": "20 t/h", "pressure": "0.6 bar",
           "temperature": "40 degC", "service": "liquid", "length": "100 m", "elevation": "2 m"}
    result = sizer.run(line_from_row(row))
    assert result.state is not None and result.state.source == "aqueous"
    bubble = backend.state(make_line("mass: water 0.7, ethanol 0.3", 0.6e5, T0 + 40.0), 0.6e5, T0 + 40.0)
    flashing = next(v for v in result.selected.verdicts if v.criterion == "flashing")
    assert f"vapour/bubble pressure {bubble.bubble_pressure / 1e5:.4g} bar abs" in flashing.reason
    # the bubble pressure lies above water's own 0.0738 bar abs at 40 degC (IAPWS-95 through CoolProp): a
    # check against water alone would have passed a line that flashes
    assert bubble.bubble_pressure is not None and bubble.bubble_pressure > 0.0738e5
    from boresize.io.document import result_to_dict

    entry = result_to_dict(result)
    assert entry["property_family"] == "aqueous solution" and entry["property_source"] == "aqueous"
    assert entry["property_validity"].startswith("ethanol 0 to 60 wt% in water; at 30 wt% from -20.14 degC")


def test_npsh_on_an_aqueous_pump_suction_uses_the_bubble_pressure(sizer: Any, backend: AqueousBackend) -> None:
    row = {"tag": "EW-2", "fluid": "MEG 30%", "flow": "5 t/h", "pressure": "1.2 bar", "temperature": "60 degC",
           "service": "pump-suction", "source_pressure": "1.2 bar", "liquid_level": "3 m", "npsh_required": "2 m"}
    result = sizer.run(line_from_row(row))
    npsh = next(v for v in result.selected.verdicts if v.criterion == "npsh-margin")
    bubble = backend.state(make_line("MEG 30%", 1.2e5, T0 + 60.0), 1.2e5, T0 + 60.0).bubble_pressure
    assert bubble is not None and f"vapour pressure {bubble / 1e5:.4g} bar abs" in npsh.reason
    # NPSHa = (P_source - P_bubble) / (rho g) + level - losses (Hydraulic Institute definition; g = 9.80665 m/s2)
    hyd, rho = result.selected.hydraulics, result.state.density
    losses = hyd.drop + hyd.fittings_drop + hyd.fixed_drop
    assert npsh.value == pytest.approx((1.2e5 - bubble - losses) / (rho * 9.80665) + 3.0, rel=1e-6)
