"""Pure-fluid properties from CoolProp's Helmholtz-energy reference equations of state (HEOS).

CoolProp is imported lazily, on the first call that needs it (the import costs about 2.5 s), so
importing boresize stays fast. One ``AbstractState("HEOS", fluid)`` is kept per fluid and reused;
results are cached per (fluid, pressure, temperature).

Phase names. CoolProp's phase index is mapped to the phases boresize knows: liquid -> liquid,
gas -> gas, twophase -> two-phase; supercritical_liquid (p > pc, T < Tc) -> "liquid" because it is
liquid-like and has a vapour pressure at T; supercritical_gas (T > Tc, p < pc) -> "gas". Above the
critical point (supercritical: T > Tc and p > pc; critical_point) the state is "dense" when its density
exceeds the critical density, else "supercritical" (gas-like). The critical density as the line between a
liquid-like and a gas-like supercritical fluid is common practice (a simple stand-in for the
pseudo-critical line, the locus of the heat-capacity maximum, which it crosses near the critical point).

Saturation. A line that gives a quality (0 or 1) is evaluated by CoolProp's PQ flash at its own pressure
(:mod:`boresize.properties.saturation`); points of the same line elsewhere (a gas march, the reference
conditions of a standard volume) by (p, T) on the side the quality names. A (p, T) pair on the saturation
curve (within a relative :data:`SATURATION_TOLERANCE` of the vapour pressure) does not fix the vapour
fraction: it is "two-phase" with saturated-liquid properties and no vapour fraction, unless the line's
phase names the side. Within :data:`~boresize.properties.saturation.SATURATION_MARGIN` of the saturation
temperature at its pressure, a state records that temperature (``saturation_temperature``), and a line
whose phase names the side gets the saturated state of that side at its pressure.

Source: I. H. Bell, J. Wronski, S. Quoilin, V. Lemort, "Pure and Pseudo-pure Fluid Thermophysical
Property Evaluation and the Open-Source Thermophysical Property Library CoolProp",
Ind. Eng. Chem. Res. 53 (2014) 2498-2508, doi:10.1021/ie4033999.
"""

from __future__ import annotations

import difflib
import functools
import importlib.metadata
import re
import threading
from collections.abc import Callable
from dataclasses import replace
from typing import Any, Literal, NamedTuple

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Line, Phase
from boresize.properties.base import is_mixture, check_plausible, describe_conditions
from boresize.properties.coolprop_range import Limits as _Limits
from boresize.properties.mixing import homogeneous_density, mcadams_viscosity
from boresize.properties.coolprop_range import check_range as _check_range
from boresize.properties.saturation import check_quality, saturation_near

__all__ = ["CoolPropBackend", "GasPoint", "TRADE_NAMES", "SATURATION_TOLERANCE", "is_mixture", "coolprop_saturation"]

#: Names the trade uses that CoolProp's alias lists lack (matched after normalisation, so
#: "carbon dioxide" and "hydrogen sulfide" already resolve through CoolProp's own names).
TRADE_NAMES: dict[str, str] = {
    "steam": "Water",
    "cooling water": "Water",
    "boiler feed water": "Water",
    "demineralised water": "Water",
    "demineralized water": "Water",
    "instrument air": "Air",
    "plant air": "Air",
    "hydrogen sulphide": "HydrogenSulfide",
    "sulphur dioxide": "SulfurDioxide",
    "propene": "Propylene",
    "ethene": "Ethylene",
    "i-butane": "IsoButane",
}

#: Relative distance from the vapour pressure within which (p, T) is taken as saturated [-].
#: CoolProp itself refuses a (p, T) flash within 1e-6 of the vapour pressure.
SATURATION_TOLERANCE = 1e-5

_PHASE_BY_INDEX: dict[int, Phase] = {
    0: "liquid",  # iphase_liquid
    1: "supercritical",  # iphase_supercritical
    2: "gas",  # iphase_supercritical_gas
    3: "liquid",  # iphase_supercritical_liquid
    4: "supercritical",  # iphase_critical_point
    5: "gas",  # iphase_gas
    6: "two-phase",  # iphase_twophase
}

_MODEL = "HEOS (reference EOS)"
#: The phase a line says it carries (Line.phase): at saturation "liquid" or "gas" picks the side of the curve.
PhaseHint = Literal["liquid", "gas", "two-phase"] | None


class GasPoint(NamedTuple):
    """The three properties a gas march reads at one point (:meth:`CoolPropBackend.gas_march`)."""

    density: float  # [kg/m3]
    viscosity: float  # [Pa s]
    speed_of_sound: float | None  # [m/s]


def _normalise(name: str) -> str:
    """Key for name matching: case-folded, without spaces, hyphens and underscores."""
    return re.sub(r"[\s_\-]+", "", name.casefold())


class CoolPropBackend:
    """Pure fluids by common name, CoolProp name, alias or CAS number (case-insensitive).

    :param cache_size: number of (fluid, pressure, temperature) results kept [-]
    """

    id = "coolprop"
    title = "CoolProp (pure fluids, reference equations of state)"

    def __init__(self, cache_size: int = 4096) -> None:
        self._names: dict[str, str] | None = None
        self._states: dict[str, Any] = {}
        self._limits: dict[str, _Limits] = {}
        self._lock = threading.RLock()
        self._cached_state = functools.lru_cache(maxsize=cache_size)(self._compute)

    def version(self) -> str:
        """CoolProp's version, read from the installed distribution (no import)."""
        return _coolprop_version()

    def handles(self, line: Line) -> bool:
        """True for a pure fluid CoolProp knows, unless the line gives its own density and viscosity."""
        if line.density is not None and line.viscosity is not None:
            return False
        return self._known_name(line.fluid) is not None

    def resolve(self, fluid: str) -> str:
        """CoolProp's canonical name for ``fluid`` (name, alias, CAS number or trade name).

        :raises InputError: (field "fluid") for a mixture or an unknown name, with close matches
        """
        name = self._known_name(fluid)
        if name is not None:
            return name
        if is_mixture(fluid):
            raise InputError(
                f"'{fluid}' is a mixture; the coolprop backend handles pure fluids only",
                field="fluid", value=fluid, expected="one pure fluid: a name, alias or CAS number",
            )
        names = self._name_map()
        key = _normalise(fluid)
        if key in names:
            return names[key]
        close = difflib.get_close_matches(key, names.keys(), n=8, cutoff=0.6)
        suggestions = list(dict.fromkeys(names[k] for k in close))[:4]
        hint = f" (close matches: {', '.join(suggestions)})" if suggestions else ""
        raise InputError(
            f"unknown fluid '{fluid}'{hint}", field="fluid", value=fluid,
            expected="a pure fluid CoolProp knows, by name, alias or CAS number "
            "(e.g. water, methane, 7732-18-5)",
        )

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Properties of ``line.fluid`` at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises InputError: unknown fluid or mixture (field "fluid"); temperature below the triple
            point or melting line, or above the EOS limit ("temperature"); pressure not positive or
            above the EOS limit ("pressure")
        :raises PropertyError: CoolProp failed, or a result is outside the plausible range
        """
        name = self.resolve(line.fluid)
        quality, hint = line.quality, line.phase
        if quality is not None:  # the quality holds at the line's own point; elsewhere it names the side
            check_quality(line, quality)
            hint = hint or ("gas" if quality == 1.0 else "liquid" if quality == 0.0 else None)
            own = pressure == line.pressure and temperature == line.temperature
            quality = quality if own else None
        return self._cached_state(name, float(pressure), float(temperature), hint, quality)

    def gas_march(self, line: Line) -> Callable[[float, float], GasPoint | FluidState] | None:
        """The properties a gas march reads (density, viscosity, speed of sound) along ``line``:
        (p [Pa abs], T [K]) -> the same floats, and the same errors, as :meth:`state` gives there, from the same
        CoolProp calls in the same order, without building the full record (its texts, limits, phase and
        saturation fields) nor passing the name look-up and the result cache at every point; a state the line's
        phase or the saturation curve decides, and the line's own point, come from :meth:`state` itself.
        None where :meth:`state` refuses the line itself (unknown fluid, bad quality): it gives that refusal; and
        for any subclass, or an instance whose ``state`` or evaluation was replaced, which may change what
        :meth:`state` gives (a company's corrected viscosity): the march must then ask :meth:`state` at every point."""
        if type(self) is not CoolPropBackend or {"state", "_compute"} & vars(self).keys():
            return None  # a subclass or an instance that changes what state() gives: the march must ask state()
        try:
            name = self.resolve(line.fluid)
            if line.quality is not None:
                check_quality(line, line.quality)
        except InputError:
            return None
        hint: PhaseHint = line.phase
        if line.quality is not None:  # as state() does away from the line's own point
            hint = hint or ("gas" if line.quality == 1.0 else "liquid" if line.quality == 0.0 else None)

        def at(pressure: float, temperature: float) -> GasPoint | FluidState:
            if pressure == line.pressure and temperature == line.temperature:
                return self.state(line, pressure, temperature)  # the inlet: cached, and the quality holds there
            return self._gas_point(name, float(pressure), float(temperature), hint)
        # measured: +15-24 % sizing steam lines (4 runs), 57 -> 44 us a point (benchmarks/bench_rating.py --only gas-march)
        return at

    def isenthalpic(self, line: Line, inlet: FluidState) -> _Isenthalpic | None:
        """The flash along a pure two-phase line: (p [Pa abs], T [K, ignored]) -> the state at the inlet's
        specific enthalpy (CoolProp's HmassP flash), so the quality rises as the pressure falls (an adiabatic
        line: friction work stays in the fluid, kinetic and potential energy changes neglected); None for a
        state not two-phase by quality."""
        if inlet.phase == "liquid" and inlet.pressure is not None and inlet.temperature is not None:
            return self._liquid_enthalpy(line, inlet)  # a letdown line: the liquid flashes downstream
        if inlet.phase != "two-phase" or inlet.vapour_fraction is None or inlet.pressure is None:
            return None
        return self._from_enthalpy(line, "PQ_INPUTS", inlet.pressure, inlet.vapour_fraction,
                                   f"quality {inlet.vapour_fraction:g}")

    def _liquid_enthalpy(self, line: Line, inlet: FluidState) -> _Isenthalpic:
        """The isenthalpic flash from a liquid inlet (CoolProp's PT flash gives its enthalpy)."""
        assert inlet.pressure is not None and inlet.temperature is not None
        return self._from_enthalpy(line, "PT_INPUTS", inlet.pressure, inlet.temperature, f"{inlet.temperature:.6g} K")

    def _from_enthalpy(self, line: Line, inputs: str, pressure: float, other: float, shown: str) -> _Isenthalpic:
        """The isenthalpic flash at the specific enthalpy of the inlet CoolProp's ``inputs`` update
        (pressure [Pa abs] and quality or temperature [K]) gives; ``shown`` names the second input for errors."""
        name = self.resolve(line.fluid)
        with self._lock:
            state = self._abstract_state(name)
            try:
                state.update(getattr(_cp(), inputs), pressure, other)
            except ValueError as exc:
                raise PropertyError(f"coolprop: CoolProp failed for {name} at {pressure / 1e5:.6g} bar abs, "
                                    f"{shown}: {exc}") from exc
            return _Isenthalpic(self, name, float(state.hmass()))

    def saturation_temperature(self, fluid: str, pressure: float) -> tuple[str, float]:
        """(CoolProp name, saturation temperature [K]) of a pure fluid at ``pressure`` [Pa abs].

        :raises InputError: unknown fluid ("fluid"); a pressure off the saturation curve ("pressure")
        :raises PropertyError: CoolProp failed
        """
        name = self.resolve(fluid)
        with self._lock:
            state = self._abstract_state(name)
            limits = self._limits[name]
            if not limits.p_triple <= pressure < limits.p_critical:
                raise InputError(
                    f"{pressure / 1e5:.6g} bar abs is off the saturation curve of {name}, which runs from its "
                    f"triple point {limits.p_triple / 1e5:.6g} to its critical point {limits.p_critical / 1e5:.6g} "
                    f"bar abs", field="pressure", value=pressure,
                    expected=f"a pressure below the critical pressure of {name} for a quality")
            try:
                state.update(_cp().PQ_INPUTS, pressure, 0.0)
                return name, float(state.T())
            except ValueError as exc:
                raise PropertyError(f"coolprop: CoolProp failed for saturated {name} at "
                                    f"{pressure / 1e5:.6g} bar abs: {exc}") from exc

    def cache_clear(self) -> None:
        """Forget cached results (the AbstractState objects are kept)."""
        self._cached_state.cache_clear()

    # --- internals -----------------------------------------------------------------------------

    def _known_name(self, fluid: str) -> str | None:
        """The canonical name of a pure fluid CoolProp knows, else None."""
        return None if is_mixture(fluid) else self._name_map().get(_normalise(fluid))

    def _name_map(self) -> dict[str, str]:
        """Normalised name -> canonical name, built once from CoolProp's fluid list."""
        if self._names is None:
            from CoolProp import CoolProp as CP

            candidates: dict[str, set[str]] = {}
            for fluid in CP.get_global_param_string("FluidsList").split(","):
                spellings = [fluid, CP.get_fluid_param_string(fluid, "CAS")]
                spellings += CP.get_fluid_param_string(fluid, "aliases").split(",")
                for spelling in spellings:
                    key = _normalise(spelling)
                    # aliases that hold commas ("1,1,1,4,4,4-...") split into bare fragments
                    if key and not spelling.strip().isdigit():
                        candidates.setdefault(key, set()).add(fluid)
            names = {k: next(iter(v)) for k, v in candidates.items() if len(v) == 1}
            names.update({_normalise(k): v for k, v in TRADE_NAMES.items()})
            self._names = names
        return self._names

    def _abstract_state(self, name: str) -> Any:
        """The reused ``AbstractState("HEOS", name)`` of one fluid (caller holds the lock)."""
        if name not in self._states:
            from CoolProp import CoolProp as CP

            state = CP.AbstractState("HEOS", name)
            self._states[name] = state
            self._limits[name] = _Limits(
                t_triple=state.Ttriple(), p_triple=state.p_triple(), t_critical=state.T_critical(),
                p_critical=state.p_critical(), rho_critical=state.rhomass_critical(), t_max=state.Tmax(), p_max=state.pmax(), molar_mass=state.molar_mass(),
            )
        return self._states[name]

    def _compute(self, name: str, pressure: float, temperature: float, hint: PhaseHint,
                 quality: float | None) -> FluidState:
        """Uncached evaluation; see :meth:`state`."""
        with self._lock:
            state = self._abstract_state(name)
            limits = self._limits[name]
            _check_range(state, name, limits, pressure, temperature)
            try:
                result = _evaluate(state, name, limits, (pressure, temperature), hint, quality)
            except ValueError as exc:  # CoolProp reports its failures as ValueError
                raise _failed(name, pressure, temperature, exc) from exc
        check_plausible(
            result.density, result.viscosity, backend=self.id, fluid=name,
            pressure=pressure, temperature=temperature,
        )
        return result

    def _gas_point(self, name: str, pressure: float, temperature: float, hint: PhaseHint) -> GasPoint | FluidState:
        """:meth:`_compute` without a quality, giving only what a gas march reads (see :meth:`gas_march`)."""
        with self._lock:
            state = self._abstract_state(name)
            limits = self._limits[name]
            _check_range(state, name, limits, pressure, temperature)
            try:
                point = _evaluate_gas(state, name, limits, (pressure, temperature), hint)
            except ValueError as exc:
                raise _failed(name, pressure, temperature, exc) from exc
        if point is None:  # at saturation: the state the line's phase or the curve gives, as state() has it
            return self._cached_state(name, pressure, temperature, hint, None)
        check_plausible(point.density, point.viscosity, backend=self.id, fluid=name, pressure=pressure,
                        temperature=temperature)
        return point


def _failed(name: str, pressure: float, temperature: float, exc: ValueError) -> PropertyError:
    """The error for CoolProp's failure ``exc`` at (pressure [Pa abs], temperature [K])."""
    return PropertyError(f"coolprop: CoolProp failed for {name} at {describe_conditions(pressure, temperature)}: {exc}")


@functools.lru_cache(maxsize=1)
def _coolprop_version() -> str:
    """CoolProp's version from the installed distribution's metadata (no import of CoolProp)."""
    return importlib.metadata.version("CoolProp")


def _cp() -> Any:
    """CoolProp's low-level module (imported on first use)."""
    from CoolProp import CoolProp as CP

    return CP


def _evaluate(state: Any, name: str, limits: _Limits, point: tuple[float, float], hint: PhaseHint,
              quality: float | None) -> FluidState:
    """Run CoolProp at ``point`` (pressure [Pa abs], temperature [K]); raises CoolProp's ValueError."""
    CP = _cp()
    pressure, temperature = point
    if quality is not None:
        if 0.0 < quality < 1.0:
            return _two_phase(state, name, limits, pressure, quality, hint)
        state.update(CP.PQ_INPUTS, pressure, quality)
        side: Phase = "gas" if quality == 1.0 else "liquid"
        return _result(state, name, limits, (side, quality, pressure, float(state.T())),
                       (pressure, float(state.T())), _model_text("quality", hint))
    vapour_pressure, t_sat = _saturation(state, limits, pressure, temperature)
    if t_sat is not None and hint in ("liquid", "gas"):
        state.update(CP.PQ_INPUTS, pressure, 1.0 if hint == "gas" else 0.0)
        return _result(state, name, limits, (hint, 1.0 if hint == "gas" else 0.0, pressure, t_sat),
                       (pressure, t_sat), _model_text("phase", hint))
    if vapour_pressure is not None and abs(pressure - vapour_pressure) <= SATURATION_TOLERANCE * vapour_pressure:
        state.update(CP.QT_INPUTS, 0.0, temperature)
        return _result(state, name, limits, ("two-phase", None, vapour_pressure, t_sat), point,
                       _model_text("curve", hint))
    phase = _pt_flash(state, name, limits, point)
    fraction = 0.0 if phase == "liquid" else None if phase == "dense" else 1.0
    return _result(state, name, limits, (phase, fraction, vapour_pressure, t_sat), point, _model_text(None, hint))


def _evaluate_gas(state: Any, name: str, limits: _Limits, point: tuple[float, float], hint: PhaseHint) -> GasPoint | None:
    """:func:`_evaluate` without a quality, to the same CoolProp calls in the same order, giving only the density,
    viscosity and speed of sound of a (p, T) flash; None where the saturation curve or the line's phase decides
    the state instead (at saturation). Raises CoolProp's ValueError."""
    pressure, temperature = point
    vapour_pressure, t_sat = _saturation(state, limits, pressure, temperature)
    if t_sat is not None and hint in ("liquid", "gas"):
        return None
    if vapour_pressure is not None and abs(pressure - vapour_pressure) <= SATURATION_TOLERANCE * vapour_pressure:
        return None
    _pt_flash(state, name, limits, point)
    return GasPoint(state.rhomass(), state.viscosity(), state.speed_sound())


def _saturation(state: Any, limits: _Limits, pressure: float, temperature: float) -> tuple[float | None, float | None]:
    """(vapour pressure [Pa abs] at ``temperature`` [K], saturation temperature [K] when ``temperature`` is within
    the margin of it at ``pressure`` [Pa abs]); Nones outside the saturation curve's temperatures."""
    if not limits.t_triple <= temperature < limits.t_critical:
        return None, None
    CP = _cp()
    state.update(CP.QT_INPUTS, 0.0, temperature)
    vapour_pressure = float(state.p())
    return vapour_pressure, saturation_near(state, pressure, temperature,
                                            float(state.first_saturation_deriv(CP.iP, CP.iT)), vapour_pressure,
                                            (limits.p_triple, limits.p_critical))


def _pt_flash(state: Any, name: str, limits: _Limits, point: tuple[float, float]) -> Phase:
    """CoolProp's (p, T) flash at ``point`` (pressure [Pa abs], temperature [K]) and the phase it gives."""
    pressure, temperature = point
    state.update(_cp().PT_INPUTS, pressure, temperature)
    phase = _map_phase(int(state.phase()), name, pressure, temperature)
    if phase == "supercritical" and state.rhomass() > limits.rho_critical:
        phase = "dense"
    return phase


def _result(state: Any, name: str, limits: _Limits, found: tuple[Phase, float | None, float | None, float | None],
            point: tuple[float, float], model: str) -> FluidState:
    """The FluidState of CoolProp's current ``state``: ``found`` is (phase, vapour fraction, vapour pressure
    [Pa abs], saturation temperature [K]); ``point`` the (pressure [Pa abs], temperature [K]) evaluated.
    Recorded whole here (version, state point, a single phase's vapour fraction), so that the engine's record
    of the state (properties.select) has nothing to fill in."""
    phase, fraction, vapour_pressure, t_sat = found
    return FluidState(
        density=state.rhomass(), viscosity=state.viscosity(), phase=phase, source="coolprop", model=model,
        vapour_fraction=fraction, vapour_pressure=vapour_pressure, speed_of_sound=state.speed_sound(),
        molar_mass=limits.molar_mass, fluid_name=name, backend_version=_coolprop_version(),
        pressure=point[0], temperature=point[1], saturation_temperature=t_sat, family="pure fluid",
        validity=(f"{name} reference equation of state in CoolProp: {limits.t_triple:.6g} to {limits.t_max:.6g} K, up "
                  f"to {limits.p_max / 1e6:.6g} MPa"),
    )


def _two_phase(state: Any, name: str, limits: _Limits, pressure: float, quality: float, hint: PhaseHint) -> FluidState:
    """A two-phase state by quality at ``pressure`` [Pa abs]: saturated liquid and vapour at that pressure
    (PQ flash, Q = 0 and Q = 1), the no-slip density and McAdams viscosity of the mixture, and CoolProp's
    surface tension where it has a correlation for the fluid (else None and a note)."""
    CP = _cp()
    state.update(CP.PQ_INPUTS, pressure, 0.0)
    t_sat, rho_l, mu_l = float(state.T()), float(state.rhomass()), float(state.viscosity())
    notes: tuple[str, ...] = ()
    try:
        sigma: float | None = float(state.surface_tension())
    except ValueError:  # CoolProp: "surface tension curve not provided" for this fluid
        sigma = None
        notes = (f"CoolProp has no surface tension for {name}: surface tension not known",)
    state.update(CP.PQ_INPUTS, pressure, 1.0)
    rho_g, mu_g = float(state.rhomass()), float(state.viscosity())
    base = _result(state, name, limits, ("two-phase", quality, pressure, t_sat), (pressure, t_sat),
                   _model_text("quality", "two-phase"))
    return replace(base, density=homogeneous_density(quality, rho_g, rho_l),
                   viscosity=mcadams_viscosity(quality, mu_g, mu_l), speed_of_sound=None,
                   liquid_density=rho_l, gas_density=rho_g, liquid_viscosity=mu_l, gas_viscosity=mu_g,
                   surface_tension=sigma, notes=notes)


def _map_phase(index: int, name: str, pressure: float, temperature: float) -> Phase:
    """boresize phase for CoolProp's phase index (see the module docstring)."""
    if index not in _PHASE_BY_INDEX:
        raise PropertyError(
            f"coolprop: CoolProp gave an unknown phase (index {index}) for {name} at "
            f"{describe_conditions(pressure, temperature)}")
    return _PHASE_BY_INDEX[index]


def _model_text(how: str | None, hint: PhaseHint) -> str:
    """Model text for FluidState.model, e.g. "CoolProp 8.0.0 HEOS (reference EOS)"; ``how`` is "quality"
    (saturated by the line's quality), "phase" (saturated on the side the line's phase names), "curve"
    (on the saturation curve, side unknown) or None (a (p, T) flash)."""
    text = f"CoolProp {_coolprop_version()} {_MODEL}"
    side = "vapour" if hint == "gas" else "liquid"
    if how == "quality" and hint == "two-phase":
        return (f"{text}; two-phase at the line's pressure by its quality: saturated liquid and vapour (Q = 0 and 1), "
                f"homogeneous (no-slip) density, McAdams viscosity")
    if how == "quality":
        return f"{text}; saturated {side} at the line's pressure, by its quality"
    if how == "phase":
        return f"{text}; at saturation, saturated {side} at the line's pressure as the line's phase says"
    if how == "curve":
        return (f"{text}; on the saturation curve: pressure and temperature do not fix the vapour "
                f"fraction, saturated-liquid properties shown; give the line's phase")
    return text


@functools.lru_cache(maxsize=1)
def _shared() -> CoolPropBackend:
    """A backend for the saturation temperatures of lines being built (its names and states are its own)."""
    return CoolPropBackend(cache_size=16)


def coolprop_saturation(fluid: str, pressure: float) -> tuple[str, float]:
    """(CoolProp name, saturation temperature [K]) of a pure fluid at ``pressure`` [Pa abs]
    (see :meth:`CoolPropBackend.saturation_temperature`)."""
    return _shared().saturation_temperature(fluid, pressure)


class _Isenthalpic:
    """(p [Pa abs], T [K, ignored]) -> the state of a pure fluid at one specific enthalpy [J/kg] and ``p``: two-phase
    by CoolProp's HmassP flash quality, else the one-phase state at the flash's temperature."""

    label = "isenthalpically (CoolProp's HmassP flash at the inlet's enthalpy)"
    cheap = True  # a flash cheap enough to redo at the outlet's own pressure (two-phase march)

    def __init__(self, backend: CoolPropBackend, name: str, enthalpy: float) -> None:
        self._backend, self._name, self._h = backend, name, enthalpy

    def __call__(self, pressure: float, temperature: float) -> FluidState:
        backend = self._backend
        with backend._lock:
            state = backend._abstract_state(self._name)
            try:
                state.update(_cp().HmassP_INPUTS, self._h, pressure)
            except ValueError as exc:
                raise PropertyError(f"coolprop: CoolProp's HmassP flash failed for {self._name} at "
                                    f"{pressure / 1e5:.6g} bar abs, h {self._h / 1e3:.6g} kJ/kg: {exc}") from exc
            quality, t = float(state.Q()), float(state.T())
        if 0.0 < quality < 1.0:
            return backend._cached_state(self._name, float(pressure), t, "two-phase", quality)
        return backend._cached_state(self._name, float(pressure), t, None, None)
