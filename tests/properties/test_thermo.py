"""The thermo backend: pure fluids and mixtures against CoolProp's reference equations of state, caching,
phase decisions, failed flashes and plausibility guards."""

from __future__ import annotations

import subprocess
import sys
from typing import Any

import pytest

from boresize.errors import InputError, PropertyError
from boresize.model import Flow, Line
from boresize.properties.thermo import ThermoBackend
from boresize.properties.thermo_phases import load_package

T0 = 273.15  # [K] at 0 degC (definition of the Celsius scale)
ATM = 101325.0  # [Pa] standard atmosphere (definition)
R = 8.314462618  # [J/(mol K)] molar gas constant (CODATA 2018, exact)
NATURAL_GAS = "methane:0.90, ethane:0.06, propane:0.04"
LPG = "propane:0.6, n-butane:0.4"


def make_line(fluid: str, pressure: float, temperature: float, **overrides: Any) -> Line:
    return Line(tag="TH-1", fluid=fluid, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature,
                **overrides)


@pytest.fixture(scope="module")
def backend() -> ThermoBackend:
    return ThermoBackend()


def state(thermo: ThermoBackend, fluid: str, pressure: float, temperature: float, **overrides: Any):
    return thermo.state(make_line(fluid, pressure, temperature, **overrides), pressure, temperature)


def coolprop(fluid: str, pressure: float, temperature: float, fractions: list[float] | None = None) -> Any:
    """A CoolProp HEOS AbstractState updated at (p, T): the reference for the checks below."""
    from CoolProp import CoolProp as CP

    reference = CP.AbstractState("HEOS", fluid)
    if fractions:
        reference.set_mole_fractions(fractions)
    reference.update(CP.PT_INPUTS, pressure, temperature)
    return reference


# --- start-up ----------------------------------------------------------------------------------------


def test_importing_boresize_and_building_a_sizer_does_not_import_thermo() -> None:
    # measured here: thermo's databases cost ~4 s to load; they must load only when a line needs them.
    code = ("import sys, boresize; from boresize.plugins import PluginHost; from boresize.sizing.engine import Sizer; "
            "Sizer(PluginHost.load(load_entry_points=False)); "
            "print(sorted(m for m in ('thermo', 'chemicals') if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "[]"


def test_one_thermo_package_per_component_set_and_eos() -> None:
    # one start-up per process: the same object comes back (functools.lru_cache)
    assert load_package(("74-98-6",), "PR") is load_package(("74-98-6",), "PR")


# --- pure fluids: thermo against CoolProp ------------------------------------------------------------


def test_water_liquid_against_coolprop(backend: ThermoBackend) -> None:
    result = state(backend, "water", ATM, T0 + 20.0, backend="thermo")
    reference = coolprop("Water", ATM, T0 + 20.0)  # IAPWS-95 and the IAPWS 2008 viscosity, via CoolProp
    # Stated tolerance: density 0.5 % (a plain Peng-Robinson liquid is -15 %), viscosity 2 %.
    assert result.phase == "liquid"
    assert result.density == pytest.approx(reference.rhomass(), rel=5e-3)
    assert result.viscosity == pytest.approx(reference.viscosity(), rel=2e-2)
    assert result.source == "thermo" and result.eos == "PR"
    assert result.backend_version and result.backend_version in result.model
    assert "at 1.01325 bar abs, 20 degC" in result.model


def test_propane_liquid_and_vapour_pressure_against_coolprop_and_nist(backend: ThermoBackend) -> None:
    result = state(backend, "propane", 20e5, T0 + 20.0)
    reference = coolprop("Propane", 20e5, T0 + 20.0)  # Lemmon et al. (2009) propane EOS via CoolProp
    # Stated tolerance: density 1 % (plain Peng-Robinson: +4.8 %), viscosity 3 %.
    assert result.density == pytest.approx(reference.rhomass(), rel=1e-2)
    assert result.viscosity == pytest.approx(reference.viscosity(), rel=3e-2)
    from CoolProp.CoolProp import PropsSI

    # vapour pressure at 20 degC: CoolProp 8.365 bar abs; NIST Chemistry WebBook ~8.36 bar (from memory)
    assert result.vapour_pressure == pytest.approx(PropsSI("P", "T", T0 + 20.0, "Q", 0, "Propane"), rel=5e-3)
    assert result.vapour_pressure == pytest.approx(8.36e5, rel=1e-2)


@pytest.mark.parametrize("pressure", [50e5, 100e5])
def test_methane_gas_against_coolprop_with_pressure_corrected_viscosity(backend: ThermoBackend, pressure: float) -> None:
    result = state(backend, "methane", pressure, T0 + 20.0, backend="thermo")
    reference = coolprop("Methane", pressure, T0 + 20.0)  # Setzmann & Wagner (1991) EOS via CoolProp
    # Stated tolerance: Peng-Robinson density 3 %; Lorentz-Bray-Clarke viscosity 3 % (thermo's default gas
    # viscosity ignores pressure: -8 % at 50 bar, -20 % at 100 bar, measured here).
    assert result.density == pytest.approx(reference.rhomass(), rel=3e-2)
    assert result.viscosity == pytest.approx(reference.viscosity(), rel=3e-2)
    assert "Lorentz-Bray-Clarke" in result.model
    assert result.phase == "supercritical"  # above Tc 190.56 K and pc 45.99 bar (Setzmann & Wagner 1991)


def test_a_component_coolprop_lacks_goes_to_thermo(backend: ThermoBackend) -> None:
    result = state(backend, "ethylene glycol", ATM, T0 + 20.0)
    # CRC Handbook: ethylene glycol 1.1135 g/cm3 at 20 degC (from memory); COSTALD alone gives +13 %
    assert result.density == pytest.approx(1113.5, rel=1e-2)
    # CRC Handbook: viscosity about 21 mPa s at 20 degC (from memory); a 15 % band
    assert result.viscosity == pytest.approx(0.021, rel=0.15)


def test_a_pure_component_below_its_melting_point_is_an_input_error(backend: ThermoBackend) -> None:
    with pytest.raises(InputError, match=r"temperature: water would be solid at -10 degC"):
        state(backend, "water", ATM, T0 - 10.0, backend="thermo")


# --- mixtures --------------------------------------------------------------------------------------


def test_natural_gas_density_z_and_viscosity_against_gerg_2008(backend: ThermoBackend) -> None:
    result = state(backend, NATURAL_GAS, 70e5, T0 + 15.0)
    # CoolProp HEOS mixture with the GERG-2008 parameters (Kunz & Wagner 2012) for these components
    reference = coolprop("Methane&Ethane&Propane", 70e5, T0 + 15.0, [0.90, 0.06, 0.04])
    z = 70e5 * result.molar_mass / (result.density * R * (T0 + 15.0))
    # Stated tolerance: Peng-Robinson density and Z within 3.5 %; Lorentz-Bray-Clarke viscosity within 3 %
    assert result.density == pytest.approx(reference.rhomass(), rel=3.5e-2)
    assert z == pytest.approx(reference.compressibility_factor(), rel=3.5e-2)
    assert result.viscosity == pytest.approx(reference.viscosity(), rel=3e-2)
    assert result.speed_of_sound == pytest.approx(reference.speed_sound(), rel=2e-2)
    assert result.phase == "gas" and result.vapour_fraction == 1.0
    assert dict(result.composition) == pytest.approx({"methane": 0.90, "ethane": 0.06, "propane": 0.04})


def test_a_volume_translated_eos_can_be_chosen_and_is_closer_for_the_gas(backend: ThermoBackend) -> None:
    plain = state(backend, NATURAL_GAS, 70e5, T0 + 15.0)
    translated = state(backend, NATURAL_GAS, 70e5, T0 + 15.0, eos="PR-translated")
    srk = state(backend, NATURAL_GAS, 70e5, T0 + 15.0, eos="srk")
    reference = coolprop("Methane&Ethane&Propane", 70e5, T0 + 15.0, [0.90, 0.06, 0.04]).rhomass()  # GERG-2008
    assert abs(translated.density / reference - 1) < abs(plain.density / reference - 1)
    assert translated.eos == "PR-TRANSLATED" and "Le Guennec" in translated.model
    assert srk.eos == "SRK" and "Soave-Redlich-Kwong" in srk.model
    with pytest.raises(InputError, match=r"eos: unknown equation of state 'BWRS'.*expected one of PR, PR78, SRK"):
        state(backend, NATURAL_GAS, 70e5, T0 + 15.0, eos="BWRS")


def test_liquid_hydrocarbon_mixture_bubble_pressure_and_density(backend: ThermoBackend) -> None:
    result = state(backend, LPG, 25e5, T0 + 20.0)
    reference = coolprop("Propane&n-Butane", 25e5, T0 + 20.0, [0.6, 0.4])  # CoolProp HEOS (GERG-2008 pair)
    from CoolProp import CoolProp as CP

    bubble = CP.AbstractState("HEOS", "Propane&n-Butane")
    bubble.set_mole_fractions([0.6, 0.4])
    bubble.update(CP.QT_INPUTS, 0.0, T0 + 20.0)
    # Stated tolerance: bubble pressure 3 % (Peng-Robinson with ChemSep kij), liquid density 1.5 %
    assert result.phase == "liquid"
    assert result.bubble_pressure == pytest.approx(bubble.p(), rel=3e-2)
    assert result.vapour_pressure == result.bubble_pressure
    assert result.density == pytest.approx(reference.rhomass(), rel=1.5e-2)
    assert "Amagat" in result.model


def test_two_phase_mixture_reports_quality_and_homogeneous_density(backend: ThermoBackend) -> None:
    from fluids.two_phase_voidage import homogeneous

    result = state(backend, LPG, 4e5, T0 + 20.0)
    assert result.phase == "two-phase"
    # Between its dew (3.86 bar) and bubble (5.72 bar) pressures; CoolProp HEOS gives 3.85 and 5.69 bar abs
    assert result.dew_pressure == pytest.approx(3.846e5, rel=3e-2)
    assert result.bubble_pressure == pytest.approx(5.690e5, rel=3e-2)
    # CoolProp's molar vapour fraction 0.908 at 4 bar abs, 20 degC -> mass fraction ~0.90 (mole -> mass with
    # the phase molar masses); a 3 % band for the EOS difference
    assert result.vapour_fraction == pytest.approx(0.90, rel=3e-2)
    gas, liquid = 8.92, 557.3  # CoolProp HEOS saturated phase densities at these conditions [kg/m3]
    void = homogeneous(result.vapour_fraction, liquid, gas)  # fluids: homogeneous (no-slip) void fraction
    assert result.density == pytest.approx(void * gas + (1 - void) * liquid, rel=5e-2)


def test_mass_fraction_composition_converts_to_mole_fractions(backend: ThermoBackend) -> None:
    result = state(backend, "mass: water 0.7, methanol 0.3", 3e5, T0 + 25.0)
    # molar masses 18.015 and 32.042 g/mol (IUPAC standard atomic weights): 0.7/18.015 : 0.3/32.042
    water = (0.7 / 18.015) / (0.7 / 18.015 + 0.3 / 32.042)
    assert dict(result.composition)["water"] == pytest.approx(water, rel=1e-3)


# --- caching and phase decisions ----------------------------------------------------------------------


def count_flashes(monkeypatch: pytest.MonkeyPatch, cas: tuple[str, ...]) -> list[float]:
    package = load_package(cas, "PR")
    calls: list[float] = []
    original = package.flash

    def counting(temperature: float, pressure: float, zs: Any) -> Any:
        calls.append(pressure)
        return original(temperature, pressure, zs)

    monkeypatch.setattr(package, "flash", counting)
    return calls


def test_same_fluid_pressure_and_temperature_is_one_flash(monkeypatch: pytest.MonkeyPatch) -> None:
    backend = ThermoBackend()
    calls = count_flashes(monkeypatch, ("74-98-6", "106-97-8"))
    first = state(backend, LPG, 30e5, T0 + 21.0)
    again = state(backend, LPG, 30e5, T0 + 21.0)
    assert again is first and len(calls) == 1
    # a liquid already found above its bubble pressure at this T: a higher pressure needs no new flash
    higher = state(backend, LPG, 40e5, T0 + 21.0)
    assert len(calls) == 1 and "without a new flash" in higher.model
    assert higher.density > first.density  # compressed further


def test_a_gas_without_an_envelope_at_its_temperature_skips_the_flash(monkeypatch: pytest.MonkeyPatch) -> None:
    backend = ThermoBackend()
    calls = count_flashes(monkeypatch, ("74-82-8", "74-84-0", "74-98-6"))
    states = [state(backend, NATURAL_GAS, p, T0 + 60.0) for p in (60e5, 59e5, 58e5, 57e5, 56e5)]
    assert len(calls) == 3  # three flashes, then the envelope check finds no bubble or dew point at 60 degC
    assert "without a new flash" in states[-1].model
    flashed = ThermoBackend()
    monkeypatch.undo()
    assert states[-1].density == pytest.approx(state(flashed, NATURAL_GAS, 56e5, T0 + 60.0).density, rel=1e-9)


# --- faults ---------------------------------------------------------------------------------------------


def test_a_failed_flash_is_a_property_error_naming_backend_fluid_and_conditions(monkeypatch: pytest.MonkeyPatch) -> None:
    package = load_package(("74-82-8", "74-84-0", "74-98-6"), "PR")

    def failing(temperature: float, pressure: float, zs: Any) -> Any:
        raise UnboundLocalError("cannot access local variable 'sln'")  # what thermo 0.6.1 raises when stuck

    monkeypatch.setattr(package, "flash", failing)
    with pytest.raises(PropertyError, match=r"^thermo: flash failed for methane 0.9, ethane 0.06, propane 0.04 at "
                                            r"12 bar abs, 20 degC \(PR\): UnboundLocalError"):
        state(ThermoBackend(), NATURAL_GAS, 12e5, T0 + 20.0)


def test_an_implausible_property_is_a_property_error_naming_the_backend_and_value(monkeypatch: pytest.MonkeyPatch) -> None:
    from boresize.properties.thermo_phases import PhaseResult

    package = load_package(("74-82-8", "74-84-0", "74-98-6"), "PR")
    monkeypatch.setattr(package, "gas", lambda t, p, zs: PhaseResult(5000.0, 1e-5, 0.018, "test", None))
    with pytest.raises(PropertyError, match=r"thermo: density 5000 kg/m3 for .* outside the plausible range 0.01 to 2000"):
        state(ThermoBackend(), NATURAL_GAS, 13e5, T0 + 20.0)


def test_pressure_must_be_positive(backend: ThermoBackend) -> None:
    with pytest.raises(InputError, match=r"pressure: 0 is not above zero"):
        backend.state(make_line(NATURAL_GAS, 10e5, T0), 0.0, T0)
