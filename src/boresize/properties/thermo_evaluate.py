"""From a loaded thermo package to a :class:`~boresize.model.FluidState`: pure components, mixtures, and
a liquid whose phase is already known. See :mod:`boresize.properties.thermo` for the rules.
"""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Phase
from boresize.properties.base import describe_conditions
from boresize.properties.mixing import homogeneous_density, mcadams_viscosity

if TYPE_CHECKING:
    from boresize.properties.thermo import Fluid
    from boresize.properties.thermo_phases import PhaseResult, ThermoPackage

__all__ = ["evaluate_pure", "evaluate_mixture", "liquid_direct", "gas_direct", "no_envelope", "liquid_surface_tension"]


def evaluate_pure(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float,
                  hint: str | None, tolerance: float) -> FluidState:
    """One component at (pressure [Pa abs], temperature [K]); ``tolerance`` [-] marks saturation."""
    _check_solid(package, fluid, temperature)
    tc, pc = package.tcs[0], package.pcs[0]
    if temperature >= tc:
        phase: Phase = "supercritical" if pressure >= pc else "gas"
        return _state(package, fluid, eos, pressure, temperature, phase, package.gas(temperature, pressure, [1.0]),
                      quality=1.0)
    psat = package.vapour_pressure(temperature)
    if psat is None:
        raise PropertyError(f"thermo: no vapour-pressure correlation of {fluid.label} covers "
                            f"{temperature - 273.15:.4g} degC")
    if abs(pressure - psat) <= tolerance * psat:
        return _saturated(package, fluid, eos, psat, temperature, hint)
    if pressure > psat:
        result = package.liquid(temperature, pressure, [1.0], psat)
        return _state(package, fluid, eos, pressure, temperature, "liquid", result, quality=0.0, vapour=psat)
    result = package.gas(temperature, pressure, [1.0])
    return _state(package, fluid, eos, pressure, temperature, "gas", result, quality=1.0, vapour=psat)


def _saturated(package: ThermoPackage, fluid: Fluid, eos: str, psat: float, temperature: float,
               hint: str | None) -> FluidState:
    """On the vapour-pressure curve: the side the line's phase names, else two-phase of unknown quality."""
    if hint == "gas":
        result = package.gas(temperature, psat, [1.0])
        return _state(package, fluid, eos, psat, temperature, "gas", result, quality=1.0, vapour=psat,
                      notes=("on the saturation curve: saturated vapour, as the line's phase says",))
    result = package.liquid(temperature, psat, [1.0], psat)
    if hint == "liquid":
        return _state(package, fluid, eos, psat, temperature, "liquid", result, quality=0.0, vapour=psat,
                      notes=("on the saturation curve: saturated liquid, as the line's phase says",))
    return _state(package, fluid, eos, psat, temperature, "two-phase", result, quality=None, vapour=psat,
                  notes=("on the saturation curve: pressure and temperature do not fix the vapour fraction, "
                         "saturated-liquid properties shown; give the line's phase",))


def evaluate_mixture(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float,
                     own: bool) -> FluidState:
    """Flash a mixture at (pressure [Pa abs], temperature [K]); ``own``: the line's own conditions
    (then a two-phase state also gets the bubble and dew pressures at T)."""
    split = package.flash(temperature, pressure, fluid.zs)
    zs = fluid.zs
    if split.label == "V":
        return _state(package, fluid, eos, pressure, temperature, "gas", package.gas(temperature, pressure, zs),
                      quality=1.0)
    if split.label == "L":
        bubble = package.saturation_pressure(temperature, zs, 0.0)
        notes = () if bubble is not None else ("no bubble point found at this temperature; saturated COSTALD "
                                               "volume without compression",)
        return _liquid_state(package, fluid, eos, pressure, temperature, bubble, notes)
    if split.label == "VL":
        return _two_phase(package, fluid, eos, pressure, temperature, split.vapour_fraction,
                          split.gas_zs, split.liquid_zs, own)
    if split.label.count("L") >= 2:
        raise _two_liquids(fluid, pressure, temperature, split.label)
    raise PropertyError(f"thermo: unexpected phase {split.label!r} for {fluid.label} at "
                        f"{describe_conditions(pressure, temperature)}")


def _two_liquids(fluid: Fluid, pressure: float, temperature: float, label: str) -> InputError:
    """The refusal of a state thermo's flash splits into two liquid phases ("LL", "VLL"): this backend
    models one liquid, and a one-liquid average of two liquids is a plausible wrong number."""
    from chemicals.elements import simple_formula_parser
    from chemicals.identifiers import search_chemical

    others = [(name, cas) for name, cas in zip(fluid.names, fluid.cas) if cas != "7732-18-5"]
    hydrocarbons = all(set(simple_formula_parser(search_chemical(cas).formula)) == {"C", "H"} for _, cas in others)
    if len(others) < len(fluid.cas):
        pair = "water and hydrocarbon" if hydrocarbons else f"water and {', '.join(name for name, _ in others)}"
    else:
        pair = "two liquids of " + ", ".join(fluid.names)
    return InputError(f"two liquid phases ({pair}) in {fluid.label} at {describe_conditions(pressure, temperature)}: "
                      f"thermo's flash finds {label!r} and this backend models one liquid, so its density and "
                      f"viscosity would be wrong", field="fluid", value=fluid.label,
                      expected="each liquid phase's line sized separately, or the line's own density and viscosity")


def liquid_direct(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float,
                  bubble: float) -> FluidState:
    """A mixture already found liquid at this temperature, well above its bubble pressure [Pa abs]."""
    note = (f"liquid without a new flash: above 1.05 x the bubble pressure {bubble / 1e5:.4g} bar abs found "
            f"at this temperature",)
    return _liquid_state(package, fluid, eos, pressure, temperature, bubble, note)


def gas_direct(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float) -> FluidState:
    """A mixture already found gas at this temperature, at which it has no bubble or dew point."""
    note = ("gas without a new flash: no bubble or dew point was found at this temperature",)
    return _state(package, fluid, eos, pressure, temperature, "gas", package.gas(temperature, pressure, fluid.zs),
                  quality=1.0, notes=note)


def no_envelope(package: ThermoPackage, fluid: Fluid, temperature: float) -> bool:
    """True when the mixture has no two-phase region at ``temperature`` [K]: above the critical temperature
    of every component (common practice: the envelope lies below the heaviest component's Tc), or no
    bubble and no dew pressure found."""
    if temperature > max(tc for tc, z in zip(package.tcs, fluid.zs) if z > 0.0):
        return True
    return (package.saturation_pressure(temperature, fluid.zs, 0.0) is None
            and package.saturation_pressure(temperature, fluid.zs, 1.0) is None)


def _liquid_state(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float,
                  bubble: float | None, notes: tuple[str, ...]) -> FluidState:
    result = package.liquid(temperature, pressure, fluid.zs, bubble)
    from chemicals.volume import COSTALD_mixture_parameters

    tcm = COSTALD_mixture_parameters(list(fluid.zs), list(package.tcs), list(package.vcs), list(package.omegas))[0]
    phase: Phase = "liquid" if temperature < tcm else "supercritical"
    return _state(package, fluid, eos, pressure, temperature, phase, result, quality=0.0, vapour=bubble,
                  bubble=bubble, notes=notes)


def _two_phase(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float,
               vapour_fraction: float, gas_zs: tuple[float, ...], liquid_zs: tuple[float, ...], own: bool) -> FluidState:
    """Homogeneous two-phase state from the flash's phase compositions."""
    gas = package.gas(temperature, pressure, gas_zs)
    liquid = package.liquid(temperature, pressure, liquid_zs, None)
    vapour_mass = vapour_fraction * gas.molar_mass
    quality = vapour_mass / (vapour_mass + (1.0 - vapour_fraction) * liquid.molar_mass)
    bubble = package.saturation_pressure(temperature, fluid.zs, 0.0) if own else None
    dew = package.saturation_pressure(temperature, fluid.zs, 1.0) if own else None
    from boresize.properties.thermo_phases import PhaseResult

    mixed = PhaseResult(
        homogeneous_density(quality, gas.density, liquid.density),
        mcadams_viscosity(quality, gas.viscosity, liquid.viscosity),
        vapour_fraction * gas.molar_mass + (1.0 - vapour_fraction) * liquid.molar_mass,
        f"two-phase: homogeneous (no-slip) density, McAdams viscosity; {gas.method}; {liquid.method}",
    )
    sigma, sigma_note = _surface_tension(package, liquid_zs, temperature, pressure)
    notes = (f"two-phase: vapour mass fraction {quality:.4g}; gas {gas.density:.4g} kg/m3, "
             f"{gas.viscosity * 1e3:.4g} mPa s; liquid {liquid.density:.4g} kg/m3, {liquid.viscosity * 1e3:.4g} mPa s",
             sigma_note)
    state = _state(package, fluid, eos, pressure, temperature, "two-phase", mixed, quality=quality,
                   vapour=bubble, bubble=bubble, dew=dew, notes=notes)
    return replace(state, liquid_density=liquid.density, gas_density=gas.density, liquid_viscosity=liquid.viscosity,
                   gas_viscosity=gas.viscosity, surface_tension=sigma)


def liquid_surface_tension(cas: tuple[str, ...], liquid_zs: tuple[float, ...], temperature: float,
                           pressure: float) -> tuple[float | None, str]:
    """The surface tension [N/m] of a liquid phase of mole fractions ``liquid_zs`` over the components ``cas`` at
    ``temperature`` [K], by the same method as this backend's two-phase states (:func:`_surface_tension`), and the
    note that says so; for a backend with no surface tension of its own (CoolProp's mixtures)."""
    from boresize.properties.thermo_phases import load_package

    try:
        package = load_package(tuple(cas), "PR")  # the EOS does not enter the surface tension
    except (InputError, PropertyError, ValueError, KeyError) as exc:
        return None, f"surface tension not known: thermo could not load the components ({exc})"
    return _surface_tension(package, tuple(liquid_zs), temperature, pressure)


def _surface_tension(package: ThermoPackage, liquid_zs: tuple[float, ...], temperature: float,
                     pressure: float) -> tuple[float | None, str]:
    """The liquid phase's surface tension [N/m] at ``temperature`` [K] by thermo's ``SurfaceTensionMixture`` of the
    package's correlations (its default method, named in the note: Winterfeld, Scriven and Davis (1978) over the
    components' pure surface tensions), and the note that says so; None and a note where thermo gives none.

    A component above its critical temperature (methane dissolved in a condensate) has no surface tension and
    an extrapolated liquid volume that swamps the mixing rule (1e-7 N/m for methane 0.1, n-pentane 0.9 at
    20 degC, against about 13 mN/m with thermo's own volumes): it is left out and the rest renormalised, which
    overestimates the surface tension somewhat (dissolved gas lowers it); the note names what was left out."""
    from boresize.properties.mixing import mass_fractions

    kept = [i for i, tc in enumerate(package.tcs) if temperature < tc and liquid_zs[i] > 0.0]
    if not kept:
        return None, "surface tension not known: every component of the liquid is above its critical temperature"
    total = sum(liquid_zs[i] for i in kept)
    zs = [liquid_zs[i] / total if i in kept else 0.0 for i in range(len(liquid_zs))]
    mixture = package.correlations.SurfaceTensionMixture
    sigma = mixture(temperature, pressure, zs, list(mass_fractions(zs, package.molar_masses)))
    if sigma is None or not sigma > 0.0:
        return None, f"surface tension not known: thermo's SurfaceTensionMixture gave none ({mixture.method})"
    value = float(sigma)
    left = [package.names[i] for i in range(len(zs)) if i not in kept and liquid_zs[i] > 0.0]
    without = f"; without {', '.join(left)} (above the critical temperature), an upper estimate" if left else ""
    return value, f"surface tension {value * 1e3:.4g} mN/m: thermo's SurfaceTensionMixture ({mixture.method}){without}"


def _check_solid(package: ThermoPackage, fluid: Fluid, temperature: float) -> None:
    """InputError (field "temperature") below the melting point of a pure component, when known."""
    melting = package.constants.Tms[0]
    if melting is not None and temperature < melting:
        raise InputError(f"{fluid.label} would be solid at {temperature - 273.15:.4g} degC: below its melting "
                         f"point {melting - 273.15:.4g} degC", field="temperature", value=temperature,
                         expected=f"at least {melting - 273.15:.4g} degC for {fluid.label}")


def _state(package: ThermoPackage, fluid: Fluid, eos: str, pressure: float, temperature: float, phase: Phase,
           result: PhaseResult, *, quality: float | None, vapour: float | None = None, bubble: float | None = None,
           dew: float | None = None, notes: tuple[str, ...] = ()) -> FluidState:
    """Assemble the FluidState and its model text (versions, EOS, methods, state point, notes)."""
    from boresize.properties.thermo_phases import EOS_TITLES, thermo_version, versions

    all_notes = ((fluid.note,) if fluid.note else ()) + notes + _near_critical(package, fluid, pressure, temperature)
    model = (f"{versions()}: {EOS_TITLES[eos]} EOS, kij ChemSep PR; {result.method}; at "
             f"{describe_conditions(pressure, temperature)}" + "".join(f"; {n}" for n in all_notes))
    return FluidState(
        density=result.density, viscosity=result.viscosity, phase=phase, source="thermo", model=model,
        vapour_fraction=quality, vapour_pressure=vapour, speed_of_sound=result.speed_of_sound,
        molar_mass=result.molar_mass, fluid_name=fluid.label,
        bubble_pressure=bubble, dew_pressure=dew, backend_version=thermo_version(), eos=eos, pressure=pressure,
        temperature=temperature, composition=tuple(zip(fluid.names, fluid.zs)), notes=all_notes,
        family=("pure component" if len(fluid.zs) == 1 else "mixture") + " (cubic equation of state)",
        validity=("cubic EOS: gas density within about 3 % of the reference equations away from the critical point "
                  "(README, property accuracy); liquid by the methods named; about 10 % off near and above the "
                  "critical point"),
    )


#: Reduced temperature band and lowest reduced pressure (against the mole-fraction average of the components'
#: critical points) in which a cubic EOS state counts as near-critical: there a cubic EOS is least accurate
#: (dense CO2 at 40 degC and 100 bar, Tr 1.03, came out 10 % light against CoolProp's reference equation; natural
#: gas at Tr 1.45 is within about 3 %). Common practice bounds.
NEAR_CRITICAL = (0.9, 1.2, 0.5)


def _near_critical(package: ThermoPackage, fluid: Fluid, pressure: float, temperature: float) -> tuple[str, ...]:
    """A note when the state lies near or above the (pseudo-)critical point, else ()."""
    tcs, pcs = package.constants.Tcs, package.constants.Pcs
    if any(t is None for t in tcs) or any(p is None for p in pcs):
        return ()
    tc = sum(z * t for z, t in zip(fluid.zs, tcs))
    pc = sum(z * p for z, p in zip(fluid.zs, pcs))
    if not NEAR_CRITICAL[0] * tc <= temperature <= NEAR_CRITICAL[1] * tc or pressure < NEAR_CRITICAL[2] * pc:
        return ()
    advice = " (backend coolprop serves this pure fluid with its reference equation)" if len(fluid.zs) == 1 else ""
    return (f"near or above the critical point (T/Tc {temperature / tc:.3g}, P/Pc {pressure / pc:.3g}): a cubic "
            f"equation of state may be 10 % off in density here{advice}",)
