"""CoolProp HEOS mixture states for :mod:`boresize.properties.coolprop_mixture`: one point, its guards,
and the check that lets later gas states skip CoolProp's stability test (SI in and out).

CoolProp runs a phase-stability check on every unconstrained mixture update (12-100 ms);
``specify_phase`` skips it (0.2-6 ms) but is silently wrong when the phase is wrong. A gas phase is
imposed only at a temperature where the mixture was already found gas
:data:`GAS_FLASHES_BEFORE_CHECK` times and has no bubble and no dew point (CoolProp's saturation solver
finds none), so no pressure at that temperature is two-phase.
"""

from __future__ import annotations

import functools
import math
from collections.abc import Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

from boresize.errors import PropertyError
from boresize.model import Phase
from boresize.properties.base import describe_conditions
from boresize.properties.coolprop import _map_phase
from boresize.properties.mixing import homogeneous_density, mcadams_viscosity

if TYPE_CHECKING:
    from boresize.properties.coolprop_mixture import CoolPropMixtureBackend

__all__ = ["GAS_FLASHES_BEFORE_CHECK", "GAS_Z_RANGE", "Point", "set_fractions", "heos_point", "guard_state",
           "no_envelope"]

#: Unconstrained gas updates at one temperature before the envelope check [-].
GAS_FLASHES_BEFORE_CHECK = 3
#: Lowest plausible liquid viscosity [Pa s] (plausibility guard, common practice).
LIQUID_VISCOSITY_MIN = 1e-5
#: Plausible compressibility factor of a gas or supercritical mixture [-] (plausibility guard).
GAS_Z_RANGE = (0.05, 2.0)


@dataclass(frozen=True)
class Point:
    """One mixture state: phase, density [kg/m3], viscosity [Pa s], vapour mass fraction [-],
    speed of sound [m/s] or None, whether the gas phase was imposed, and notes."""

    phase: Phase
    density: float
    viscosity: float
    quality: float
    speed_of_sound: float | None
    imposed: bool = False
    notes: tuple[str, ...] = ()
    #: of a two-phase point: (liquid density [kg/m3], gas density [kg/m3], liquid viscosity [Pa s], gas viscosity
    #: [Pa s]); None for one phase
    phases: tuple[float, float, float, float] | None = None
    #: of a two-phase point: the liquid phase's surface tension [N/m], None where not known
    surface_tension: float | None = None

    def phase_fields(self) -> dict[str, float | None]:
        """The FluidState fields of a two-phase point's phases (none for one phase); CoolProp gives no
        surface tension of a mixture: ``surface_tension`` is thermo's of the liquid phase (:func:`_sigma`)."""
        if self.phases is None:
            return {}
        rho_l, rho_g, mu_l, mu_g = self.phases
        return {"liquid_density": rho_l, "gas_density": rho_g, "liquid_viscosity": mu_l, "gas_viscosity": mu_g,
                "surface_tension": self.surface_tension}


#: The note of a two-phase HEOS mixture state: CoolProp has no surface tension model for mixtures, so the
#: liquid phase's is thermo's (:func:`_sigma`); this note where that too fails.
NO_SURFACE_TENSION = "surface tension not known: CoolProp gives none for a mixture"


def set_fractions(state: Any, fractions: Sequence[float], basis: str) -> None:
    """Set mole or mass fractions [-] on a CoolProp AbstractState."""
    if basis == "mass":
        state.set_mass_fractions(list(fractions))
    else:
        state.set_mole_fractions(list(fractions))


def heos_point(state: Any, phases: Any, names: tuple[str, ...], pressure: float, temperature: float,
               gas_known: bool) -> Point:
    """Update ``state`` at (pressure [Pa abs], temperature [K]) and read it; raises CoolProp's ValueError.

    :param phases: a second AbstractState of the same components (for the phases of a two-phase state)
    :param gas_known: impose the gas phase (see the module docstring)
    """
    from CoolProp import CoolProp as CP

    if gas_known:
        state.specify_phase(CP.iphase_gas)
    try:
        state.update(CP.PT_INPUTS, pressure, temperature)
    finally:
        if gas_known:
            state.unspecify_phase()
    phase = "gas" if gas_known else _map_phase(int(state.phase()), " & ".join(names), pressure, temperature)
    # a two-phase state's Z is the bulk p / (rho R T): CoolProp's compressibility_factor() evaluates the Helmholtz
    # energy at the bulk density, inside the spinodal, and gave Z = -0.27 just below propane/n-butane's bubble
    # pressure (11.75 bar abs, 50 degC), where p / (rho R T) = 0.049
    z = (pressure / (state.rhomolar() * state.gas_constant() * temperature) if phase == "two-phase"
         else state.compressibility_factor())
    _guard_z(z, phase, names, pressure, temperature)
    if phase != "two-phase":
        notes = ("gas phase imposed: no bubble or dew point at this temperature",) if gas_known else ()
        quality = 0.0 if phase == "liquid" else 1.0
        return Point(phase, state.rhomass(), state.viscosity(), quality, state.speed_sound(), gas_known, notes)
    return _two_phase(state, phases, names, pressure, temperature)


def _two_phase(state: Any, phases: Any, names: tuple[str, ...], pressure: float, temperature: float) -> Point:
    """Homogeneous density and McAdams viscosity from the two phases, each evaluated with its phase imposed."""
    from CoolProp import CoolProp as CP

    molar_gas = state.Q()
    gas_mass = molar_gas * state.saturated_vapor_keyed_output(CP.imolar_mass)
    quality = gas_mass / (gas_mass + (1.0 - molar_gas) * state.saturated_liquid_keyed_output(CP.imolar_mass))
    sigma, sigma_note = _sigma(names, tuple(state.mole_fractions_liquid()), pressure, temperature)
    viscosities = []
    for fractions, imposed in ((state.mole_fractions_vapor(), CP.iphase_gas),
                               (state.mole_fractions_liquid(), CP.iphase_liquid)):
        phases.set_mole_fractions(list(fractions))
        phases.specify_phase(imposed)
        try:
            phases.update(CP.PT_INPUTS, pressure, temperature)
            viscosities.append(phases.viscosity())
        finally:
            phases.unspecify_phase()
    rho_gas = state.saturated_vapor_keyed_output(CP.iDmass)
    rho_liquid = state.saturated_liquid_keyed_output(CP.iDmass)
    note = (f"two-phase: vapour mass fraction {quality:.4g}; gas {rho_gas:.4g} kg/m3, {viscosities[0] * 1e3:.4g} mPa s; "
            f"liquid {rho_liquid:.4g} kg/m3, {viscosities[1] * 1e3:.4g} mPa s; homogeneous density, McAdams viscosity",)
    return Point("two-phase", homogeneous_density(quality, rho_gas, rho_liquid),
                 mcadams_viscosity(quality, viscosities[0], viscosities[1]), quality, None, False,
                 (*note, sigma_note), (rho_liquid, rho_gas, viscosities[1], viscosities[0]), sigma)


@functools.lru_cache(maxsize=256)
def _cas_numbers(names: tuple[str, ...]) -> tuple[str, ...] | None:
    """The CAS numbers CoolProp gives the components ``names`` (they never change), None where it knows none."""
    from CoolProp import CoolProp as CP

    try:
        return tuple(CP.get_fluid_param_string(name, "CAS") for name in names)
    except ValueError:
        return None


def _sigma(names: tuple[str, ...], liquid_zs: tuple[float, ...], pressure: float,
           temperature: float) -> tuple[float | None, str]:
    """The liquid phase's surface tension [N/m] and its note: CoolProp has none for a mixture, so thermo's
    SurfaceTensionMixture over the pure components, the method of the thermo backend
    (:func:`boresize.properties.thermo_evaluate.liquid_surface_tension`), on CoolProp's liquid composition."""
    from boresize.properties.thermo_evaluate import liquid_surface_tension

    # measured: 0.5-0.6 ms a two-phase flash (CPU, least of 3 x 20 get_fluid_param_string(name, "CAS") calls for
    # n-Propane & n-Butane), now once per component tuple (:func:`_cas_numbers`)
    cas = _cas_numbers(names)
    if cas is None:
        return None, NO_SURFACE_TENSION
    sigma, note = liquid_surface_tension(cas, liquid_zs, temperature, pressure)
    if sigma is None:
        return None, f"{NO_SURFACE_TENSION}; {note}"
    return sigma, f"{note}, on CoolProp's liquid-phase composition (CoolProp gives none for a mixture)"


def _guard_z(z: float, phase: str, names: tuple[str, ...], pressure: float, temperature: float) -> None:
    """PropertyError for Z <= 0, Z > 2, or Z < 0.05 in a gas (measured nonsense: Z = 163, Z < 0)."""
    low, high = GAS_Z_RANGE if phase in ("gas", "supercritical") else (0.0, GAS_Z_RANGE[1])
    if not (math.isfinite(z) and low < z <= high):
        raise PropertyError(f"coolprop-mixture: compressibility factor Z = {z:.6g} for {' & '.join(names)} "
                            f"({phase}) at {describe_conditions(pressure, temperature)} is outside "
                            f"{low:g} to {high:g}: CoolProp's mixture state is not trusted")


def guard_state(backend: CoolPropMixtureBackend, state: Any, names: tuple[str, ...], zs: tuple[float, ...],
                point: Point, pressure: float, temperature: float, label: str) -> None:
    """The viscosity, wrong-root and liquid-viscosity guards (see coolprop_mixture's docstring)."""
    from CoolProp import CoolProp as CP

    where = f"{label} at {describe_conditions(pressure, temperature)}"
    if not math.isfinite(point.viscosity):
        raise PropertyError(f"coolprop-mixture: viscosity {point.viscosity} for {where} is not a number")
    if point.phase != "liquid":
        return
    if point.viscosity < LIQUID_VISCOSITY_MIN:
        raise PropertyError(f"coolprop-mixture: liquid viscosity {point.viscosity:.6g} Pa s for {where} is below the "
                            f"plausible {LIQUID_VISCOSITY_MIN:g} Pa s")
    for factor in (0.9, 1.1):
        state.update(CP.PT_INPUTS, pressure * factor, temperature)
        if abs(state.rhomass() / point.density - 1.0) > 0.10:
            raise PropertyError(f"coolprop-mixture: density {point.density:.6g} kg/m3 for {where} but "
                                f"{state.rhomass():.6g} kg/m3 at {factor:g} x that pressure: a wrong root, or a "
                                f"near-critical liquid CoolProp's mixture model does not resolve (use backend thermo)")
    pures = [backend.pure_viscosity(name, pressure, temperature) for name in names]
    if all(phase == "liquid" for phase, _ in pures):
        ideal = math.exp(math.fsum(z * math.log(mu) for z, (_, mu) in zip(zs, pures)))
        if not 0.5 <= point.viscosity / ideal <= 2.0:
            raise PropertyError(f"coolprop-mixture: liquid viscosity {point.viscosity:.4g} Pa s for {where} is "
                                f"{point.viscosity / ideal:.2f} x the log-mixing value {ideal:.4g} Pa s of its "
                                f"components; CoolProp's liquid-mixture viscosity is not trusted here "
                                f"(use backend thermo)")


def no_envelope(state: Any, temperature: float) -> bool:
    """True when CoolProp finds neither a bubble nor a dew point of the mixture at ``temperature`` [K]."""
    from CoolProp import CoolProp as CP

    for quality in (0.0, 1.0):
        try:
            state.update(CP.QT_INPUTS, quality, temperature)
        except ValueError:
            continue
        return False
    return True
