"""Property backends: CoolProp pure fluids and the line's own values (table)."""

from __future__ import annotations

import importlib.metadata
import math
import subprocess
import sys
from typing import Any

import pytest

from boresize.errors import InputError, PropertyError
from boresize.model import Flow, Line
from boresize.properties import (
    CoolPropBackend,
    PropertyBackend,
    TableBackend,
    builtin_backends,
)

ATM = 101325.0  # [Pa], standard atmosphere (definition)
T0 = 273.15  # [K] at 0 degC (definition of the Celsius scale)


def make_line(fluid: str = "water", **overrides: Any) -> Line:
    values: dict[str, Any] = {
        "tag": "L-100",
        "fluid": fluid,
        "flow": Flow("mass", 10.0),
        "pressure": ATM,
        "temperature": T0 + 20.0,
    }
    values.update(overrides)
    return Line(**values)


@pytest.fixture(scope="module")
def coolprop() -> CoolPropBackend:
    return CoolPropBackend()


# --- package surface -------------------------------------------------------------------------------


def test_importing_properties_does_not_import_coolprop() -> None:
    # measured here: CoolProp costs ~2.5 s to import; boresize must import it lazily.
    code = "import sys, boresize.properties; print('CoolProp' in sys.modules)"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "False"


def test_builtin_backends_follow_the_protocol() -> None:
    # base.py contract: ids, titles and the three methods of PropertyBackend
    backends = builtin_backends()
    assert [b.id for b in backends] == ["coolprop", "table"]
    assert all(isinstance(b, PropertyBackend) and b.title for b in backends)


def test_coolprop_version_is_the_installed_distribution(coolprop: CoolPropBackend) -> None:
    import CoolProp  # the library itself says which version it is

    assert coolprop.version() == CoolProp.__version__


# --- CoolProp values against published references ------------------------------------------------


def test_water_density_20c_1atm(coolprop: CoolPropBackend) -> None:
    state = coolprop.state(make_line(), ATM, T0 + 20.0)
    # IAPWS-95 (IAPWS release, Wagner & Pruss 2002 tables): 998.21 kg/m3 at 20 degC, 0.101325 MPa
    assert state.density == pytest.approx(998.2, rel=1e-3)
    assert state.source == "coolprop"
    assert state.fluid_name == "Water"
    assert state.model.startswith(f"CoolProp {importlib.metadata.version('CoolProp')} HEOS")
    # molar mass of water 18.015268 g/mol (IAPWS-95)
    assert state.molar_mass == pytest.approx(0.018015268, rel=1e-9)


def test_water_viscosity_20c(coolprop: CoolPropBackend) -> None:
    state = coolprop.state(make_line(), ATM, T0 + 20.0)
    # IAPWS 2008 release on the viscosity of ordinary water: 1.0016 mPa s at 20 degC, 0.1 MPa
    assert state.viscosity == pytest.approx(1.0016e-3, rel=5e-3)


def test_water_vapour_pressure_100c(coolprop: CoolPropBackend) -> None:
    state = coolprop.state(make_line(), 2 * ATM, T0 + 100.0)
    # IAPWS-95 saturation table: 101.418 kPa at 100 degC
    assert state.vapour_pressure == pytest.approx(101.418e3, rel=5e-4)
    # above the critical temperature 647.096 K (IAPWS-95) there is no vapour pressure
    assert coolprop.state(make_line(), 300e5, 700.0).vapour_pressure is None


def test_methane_density_matches_propssi(coolprop: CoolPropBackend) -> None:
    from CoolProp.CoolProp import PropsSI

    state = coolprop.state(make_line("methane"), 50e5, T0 + 20.0)
    # CoolProp's own high-level interface (PropsSI): our reused AbstractState wrapper must agree
    assert state.density == pytest.approx(PropsSI("D", "P", 50e5, "T", T0 + 20.0, "Methane"), rel=1e-9)
    assert state.viscosity == pytest.approx(PropsSI("V", "P", 50e5, "T", T0 + 20.0, "Methane"), rel=1e-9)
    # methane critical point 190.56 K, 45.99 bar (Setzmann & Wagner 1991): T > Tc and p > pc
    assert state.phase == "supercritical"


def test_propane_vapour_pressure_20c(coolprop: CoolPropBackend) -> None:
    state = coolprop.state(make_line("propane"), 20e5, T0 + 20.0)
    # NIST Chemistry WebBook saturation table for propane: ~8.36 bar at 20 degC (from memory)
    assert state.vapour_pressure == pytest.approx(8.36e5, rel=5e-3)
    assert state.phase == "liquid"


# --- names ------------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("given", "canonical"),
    [
        ("water", "Water"),
        ("WATER", "Water"),
        ("H2O", "Water"),  # CoolProp alias list
        ("7732-18-5", "Water"),  # CAS registry number of water
        ("steam", "Water"),  # trade name
        ("74-82-8", "Methane"),  # CAS registry number of methane
        ("nitrogen", "Nitrogen"),
        ("propane", "n-Propane"),
        ("n butane", "n-Butane"),
        ("air", "Air"),  # CoolProp's pseudo-pure air
        ("CO2", "CarbonDioxide"),
        ("R744", "CarbonDioxide"),  # ASHRAE 34 refrigerant number of CO2
        ("carbon dioxide", "CarbonDioxide"),
        ("hydrogen sulphide", "HydrogenSulfide"),
        ("Hydrogen Sulfide", "HydrogenSulfide"),
    ],
)
def test_name_resolution(coolprop: CoolPropBackend, given: str, canonical: str) -> None:
    # canonical names as listed in CoolProp's FluidsList
    assert coolprop.resolve(given) == canonical


def test_unknown_fluid_lists_close_matches(coolprop: CoolPropBackend) -> None:
    with pytest.raises(InputError, match=r"^fluid: unknown fluid 'watr' \(close matches: Water") as info:
        coolprop.state(make_line("watr"), ATM, T0 + 20.0)
    assert info.value.field == "fluid"
    assert info.value.value == "watr"
    assert "CAS number" in (info.value.expected or "")


def test_mixture_is_not_handled(coolprop: CoolPropBackend) -> None:
    line = make_line("methane:0.9, ethane:0.1")
    assert not coolprop.handles(line)
    assert not coolprop.handles(make_line("Methane[0.9]&Ethane[0.1]"))
    with pytest.raises(InputError, match="is a mixture; the coolprop backend handles pure fluids only"):
        coolprop.state(line, ATM, T0 + 20.0)


def test_handles(coolprop: CoolPropBackend) -> None:
    assert coolprop.handles(make_line("steam"))
    assert not coolprop.handles(make_line("unobtainium"))
    # the line's own values win over the backend (README, line list columns density/viscosity)
    assert not coolprop.handles(make_line("water", density=1000.0, viscosity=1e-3))


# --- range and phase --------------------------------------------------------------------------------


def test_below_triple_point_is_solid(coolprop: CoolPropBackend) -> None:
    # triple point of water 273.16 K = 0.01 degC (IAPWS-95)
    message = (r"^temperature: Water would be solid at -20 degC: "
               r"below its triple point 0\.01 degC \(273\.16 K\);")
    with pytest.raises(InputError, match=message) as info:
        coolprop.state(make_line(), ATM, T0 - 20.0)
    assert info.value.field == "temperature"
    assert info.value.expected == "at least 0.01 degC for Water"


def test_below_melting_line_is_solid(coolprop: CoolPropBackend) -> None:
    # methane at 1000 bar freezes near -159 degC (melting line of Setzmann & Wagner 1991, in CoolProp);
    # -178 degC is above its triple point (-182.46 degC) yet solid at that pressure
    with pytest.raises(InputError, match="Methane would be solid at -178.15 degC and 1000 bar abs") as info:
        coolprop.state(make_line("methane"), 1000e5, 95.0)
    assert info.value.field == "temperature"


def test_above_limits(coolprop: CoolPropBackend) -> None:
    # IAPWS-95 is valid to 1273 K and 1000 MPa; CoolProp allows 2000 K and 1000 MPa for water
    with pytest.raises(InputError, match="^temperature: 2726.85 degC is above the upper limit") as info:
        coolprop.state(make_line(), ATM, 3000.0)
    assert info.value.expected == "at most 1726.85 degC for Water"
    with pytest.raises(InputError, match="^pressure: 20000 bar abs is above the upper limit") as info:
        coolprop.state(make_line(), 2e9, 300.0)
    assert info.value.expected == "at most 10000 bar abs for Water"
    with pytest.raises(InputError, match="^pressure: 0 Pa is not an absolute pressure"):
        coolprop.state(make_line(), 0.0, 300.0)


@pytest.mark.parametrize(
    ("pressure", "temperature", "phase"),
    [
        # water critical point 647.096 K, 22.064 MPa (IAPWS-95)
        (ATM, T0 + 20.0, "liquid"),
        (ATM, T0 + 120.0, "gas"),  # above the 100 degC boiling point at 1 atm
        (300e5, 600.0, "liquid"),  # CoolProp supercritical_liquid (p > pc, T < Tc): dense, sized as liquid
        (300e5, 700.0, "supercritical"),  # T > Tc and p > pc
        (ATM, 1000.0, "gas"),  # CoolProp supercritical_gas (T > Tc, p < pc)
    ],
)
def test_phase_mapping(coolprop: CoolPropBackend, pressure: float, temperature: float, phase: str) -> None:
    assert coolprop.state(make_line(), pressure, temperature).phase == phase


def test_on_the_saturation_curve(coolprop: CoolPropBackend) -> None:
    from CoolProp.CoolProp import PropsSI

    # IAPWS-95 saturation pressure at 100 degC; CoolProp refuses a (p, T) flash exactly there
    psat = PropsSI("P", "T", T0 + 100.0, "Q", 0, "Water")
    plain = coolprop.state(make_line(), psat, T0 + 100.0)
    assert plain.phase == "two-phase"
    assert plain.vapour_fraction is None
    assert "give the line's phase" in plain.model
    vapour = coolprop.state(make_line(phase="gas"), psat, T0 + 100.0)
    # steam tables (IAPWS-IF97): saturated vapour at 100 degC has v = 1.6718 m3/kg (from memory)
    assert vapour.density == pytest.approx(1 / 1.6718, rel=1e-3)
    assert (vapour.phase, vapour.vapour_fraction) == ("gas", 1.0)
    liquid = coolprop.state(make_line(phase="liquid"), psat, T0 + 100.0)
    # IAPWS-95 saturated liquid at 100 degC: 958.35 kg/m3 (from memory)
    assert liquid.density == pytest.approx(958.35, rel=1e-3)


# --- guards and caching -----------------------------------------------------------------------------


class _Tampered:
    """A CoolProp AbstractState whose chosen outputs are replaced (test double at the library edge)."""

    def __init__(self, real: Any, **outputs: Any) -> None:
        self._real = real
        self._outputs = outputs

    def __getattr__(self, name: str) -> Any:
        if name in self._outputs:
            return self._outputs[name]
        return getattr(self._real, name)


def _tampered_backend(monkeypatch: pytest.MonkeyPatch, **outputs: Any) -> CoolPropBackend:
    backend = CoolPropBackend()
    backend.resolve("water")
    real = backend._abstract_state("Water")
    monkeypatch.setitem(backend._states, "Water", _Tampered(real, **outputs))
    return backend


def test_implausible_density_is_a_property_error(monkeypatch: pytest.MonkeyPatch) -> None:
    # plausibility guard (common practice): 0.01..2000 kg/m3
    backend = _tampered_backend(monkeypatch, rhomass=lambda: 5.0e4)
    message = r"^coolprop: density 50000 kg/m3 for Water at 1.01325 bar abs, 20 degC is outside the plausible"
    with pytest.raises(PropertyError, match=message):
        backend.state(make_line(), ATM, T0 + 20.0)


def test_nan_viscosity_is_a_property_error(monkeypatch: pytest.MonkeyPatch) -> None:
    # plausibility guard (common practice): 1e-6..10 Pa s, and never NaN
    backend = _tampered_backend(monkeypatch, viscosity=lambda: math.nan)
    with pytest.raises(PropertyError, match="^coolprop: viscosity nan Pa s for Water"):
        backend.state(make_line(), ATM, T0 + 20.0)


def test_failed_call_is_a_property_error(monkeypatch: pytest.MonkeyPatch) -> None:
    def fail(*args: Any) -> None:
        raise ValueError("solver did not converge")

    backend = _tampered_backend(monkeypatch, update=fail)
    message = r"^coolprop: CoolProp failed for Water at 1.01325 bar abs, 20 degC: solver did not converge$"
    with pytest.raises(PropertyError, match=message):
        backend.state(make_line(), ATM, T0 + 20.0)


def test_results_are_cached(coolprop: CoolPropBackend) -> None:
    first = coolprop.state(make_line("nitrogen"), 10e5, 300.0)
    again = coolprop.state(make_line("N2", tag="other"), 10e5, 300.0)  # same fluid by alias
    assert again is first


# --- table backend ----------------------------------------------------------------------------------


def test_table_uses_the_line_values() -> None:
    # values typed on the line (README: density/viscosity columns are used instead of a backend)
    line = make_line("crude oil", density=870.0, viscosity=12e-3)
    table = TableBackend()
    assert table.handles(line)
    state = table.state(line, line.pressure, line.temperature)
    assert (state.density, state.viscosity, state.source) == (870.0, 12e-3, "table")
    assert state.phase == "liquid"  # 300 kg/m3 threshold (common practice)
    assert state.vapour_pressure is None
    assert state.model.startswith("line list values")


def test_table_phase_rules() -> None:
    table = TableBackend()
    gas = make_line("fuel gas", density=25.0, viscosity=1.1e-5)
    assert table.state(gas, gas.pressure, gas.temperature).phase == "gas"  # below 300 kg/m3 (common practice)
    dense = make_line("ethylene", density=250.0, viscosity=3e-5, phase="liquid")
    state = table.state(dense, dense.pressure, dense.temperature)
    assert state.phase == "liquid"
    assert state.model == "line list values (phase liquid as given)"


def test_table_missing_value_names_the_field() -> None:
    table = TableBackend()
    line = make_line("crude oil", density=870.0)
    assert not table.handles(line)
    with pytest.raises(InputError, match="^viscosity: viscosity is missing") as info:
        table.state(line, line.pressure, line.temperature)
    assert info.value.field == "viscosity"
    line = make_line("crude oil", viscosity=1e-3)
    with pytest.raises(InputError, match="^density: density is missing"):
        table.state(line, line.pressure, line.temperature)


def test_table_implausible_value_is_an_input_error() -> None:
    line = make_line("slurry", density=8000.0, viscosity=1e-3)
    # plausibility guard (common practice): 0.01..2000 kg/m3
    message = "^density: density 8000 kg/m3 is outside the plausible range"
    with pytest.raises(InputError, match=message) as info:
        TableBackend().state(line, line.pressure, line.temperature)
    assert info.value.expected == "0.01 to 2000 kg/m3"


def test_table_refuses_other_conditions() -> None:
    # a density typed for the line's conditions cannot convert a standard volume at 1 atm, 15 degC
    line = make_line("fuel gas", pressure=40e5, density=30.0, viscosity=1.1e-5)
    message = "hold at 40 bar abs, 20 degC only, not at 1.01325 bar abs, 15 degC"
    with pytest.raises(InputError, match=message) as info:
        TableBackend().state(line, ATM, T0 + 15.0)
    assert info.value.field == "flow"


# -- the line's own vapour pressure (with its own density and viscosity) ----------------------------------------
FUEL_OIL = {"tag": "FO-1", "fluid": "fuel oil", "flow": "20 t/h", "pressure": "6 barg", "temperature": "60 degC",
            "length": "100 m", "density": "950 kg/m3", "viscosity": "120 cP", "service": "liquid"}


def test_a_given_vapour_pressure_lets_flashing_judge_a_line_of_its_own_values(sizer):
    from boresize.io.rows import line_from_row

    unjudged = sizer.run(line_from_row(FUEL_OIL))
    assert unjudged.status == "error" and "flashing not judged" in (unjudged.error or "")
    judged = sizer.run(line_from_row({**FUEL_OIL, "vapour_pressure": "0.05 bar"}))
    assert judged.status == "pass" and judged.state is not None and judged.state.vapour_pressure == 5000.0
    flashing = next(v for v in judged.selected.verdicts if v.criterion == "flashing")  # type: ignore[union-attr]
    assert flashing.status == "pass" and "vapour/bubble pressure 0.05 bar abs" in flashing.reason


def test_a_brine_takes_its_vapour_pressure_from_the_line(sizer):
    from boresize.io.rows import line_from_row

    brine = {"tag": "B-1", "fluid": "NaCl 10%", "flow": "20 t/h", "pressure": "3 barg", "temperature": "20 degC"}
    assert sizer.run(line_from_row(brine)).status == "error"  # CoolProp's brines carry no vapour pressure
    judged = sizer.run(line_from_row({**brine, "vapour_pressure": "0.02 bar"}))
    assert judged.status == "pass" and judged.state is not None and judged.state.vapour_pressure == 2000.0


@pytest.mark.parametrize(("row", "message"), [
    ({**FUEL_OIL, "vapour_pressure": "8 bar"},
     "line FO-1: vapour_pressure: vapour pressure 8 bar abs is above the inlet pressure 7.013 bar abs: the liquid "
     "would boil at the inlet; expected a vapour pressure at or below the inlet pressure (absolute)"),
    ({"tag": "W-1", "fluid": "water", "flow": "20 t/h", "pressure": "6 barg", "temperature": "60 degC",
      "vapour_pressure": "0.2 bar"},
     "line W-1: vapour_pressure: a vapour pressure is given, but backend 'coolprop' computes its own (0.1995 bar abs); "
     "expected vapour_pressure only where the backend gives none (the line's own density and viscosity, brines); "
     "leave it blank otherwise"),
    ({**FUEL_OIL, "density": "20 kg/m3", "viscosity": "0.012 cP", "service": "gas", "vapour_pressure": "0.2 bar"},
     "line FO-1: vapour_pressure: a vapour pressure is given for a gas line; expected vapour_pressure only for a "
     "liquid line (leave it blank otherwise)"),
])
def test_a_vapour_pressure_that_cannot_hold_is_refused_naming_the_field(sizer, row, message):
    from boresize.io.rows import line_from_row

    result = sizer.run(line_from_row(row))
    assert (result.status, result.error) == ("error", message)
