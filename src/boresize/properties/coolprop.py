"""Pure-fluid properties from CoolProp's Helmholtz-energy reference equations of state (HEOS).

CoolProp is imported lazily, on the first call that needs it (the import costs about 2.5 s), so
importing boresize stays fast. One ``AbstractState("HEOS", fluid)`` is kept per fluid and reused;
results are cached per (fluid, pressure, temperature).

Phase names. CoolProp's phase index is mapped to the four phases boresize knows: liquid -> liquid,
gas -> gas, supercritical (T > Tc and p > pc) and critical_point -> supercritical, twophase ->
two-phase; supercritical_liquid (p > pc, T < Tc) -> "liquid" because it is dense and liquid-like and
is sized as a liquid; supercritical_gas (T > Tc, p < pc) -> "gas" because it is sized as a gas.

A (p, T) pair on the saturation curve does not fix the vapour fraction. Within a relative
:data:`SATURATION_TOLERANCE` of the vapour pressure the state is "two-phase" (saturated-liquid
properties, vapour fraction unknown), unless the line says which phase it carries: then the
saturated liquid (``phase="liquid"``) or saturated vapour (``phase="gas"``) is returned.

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
from dataclasses import dataclass
from typing import Any, Literal

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Line, Phase
from boresize.properties.base import ZERO_CELSIUS, check_plausible, describe_conditions

__all__ = ["CoolPropBackend", "TRADE_NAMES", "SATURATION_TOLERANCE", "is_mixture"]

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
#: The phase a line says it carries (Line.phase): at saturation it picks the side of the curve.
PhaseHint = Literal["liquid", "gas"] | None


def _normalise(name: str) -> str:
    """Key for name matching: case-folded, without spaces, hyphens and underscores."""
    return re.sub(r"[\s_\-]+", "", name.casefold())


def is_mixture(fluid: str) -> bool:
    """True for a mixture written as "a:0.5, b:0.5", "a[0.5]&b[0.5]" or "a&b"."""
    return any(mark in fluid for mark in (":", "&", "[", ","))


@dataclass(frozen=True)
class _Limits:
    """Fixed points and range of one fluid's equation of state (SI: K, Pa, kg/mol)."""

    t_triple: float
    p_triple: float
    t_critical: float
    t_max: float
    p_max: float
    molar_mass: float


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
        return self._cached_state(name, float(pressure), float(temperature), line.phase)

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
                t_max=state.Tmax(), p_max=state.pmax(), molar_mass=state.molar_mass(),
            )
        return self._states[name]

    def _compute(self, name: str, pressure: float, temperature: float, hint: PhaseHint) -> FluidState:
        """Uncached evaluation; see :meth:`state`."""
        with self._lock:
            state = self._abstract_state(name)
            limits = self._limits[name]
            _check_range(state, name, limits, pressure, temperature)
            try:
                result = _evaluate(state, name, limits, pressure, temperature, hint)
            except ValueError as exc:  # CoolProp reports its failures as ValueError
                raise PropertyError(
                    f"coolprop: CoolProp failed for {name} at "
                    f"{describe_conditions(pressure, temperature)}: {exc}"
                ) from exc
        check_plausible(
            result.density, result.viscosity, backend=self.id, fluid=name,
            pressure=pressure, temperature=temperature,
        )
        return result


@functools.lru_cache(maxsize=1)
def _coolprop_version() -> str:
    """CoolProp's version from the installed distribution's metadata (no import of CoolProp)."""
    return importlib.metadata.version("CoolProp")


def _celsius(temperature: float) -> str:
    """A temperature [K] written in degC for messages."""
    return f"{round(temperature - ZERO_CELSIUS, 2):g} degC"


def _check_range(state: Any, name: str, limits: _Limits, pressure: float, temperature: float) -> None:
    """Raise InputError when (pressure [Pa abs], temperature [K]) is outside the EOS range or solid."""
    if not pressure > 0.0:
        raise InputError(f"{pressure:g} Pa is not an absolute pressure", field="pressure",
                         value=pressure, expected="a pressure above zero (absolute)")
    if pressure > limits.p_max:
        raise InputError(
            f"{pressure / 1e5:.6g} bar abs is above the upper limit of the {name} equation of state",
            field="pressure", value=pressure, expected=f"at most {limits.p_max / 1e5:.6g} bar abs for {name}")
    if temperature > limits.t_max:
        raise InputError(
            f"{_celsius(temperature)} is above the upper limit of the {name} equation of state",
            field="temperature", value=temperature, expected=f"at most {_celsius(limits.t_max)} for {name}")
    if temperature < limits.t_triple:
        raise InputError(
            f"{name} would be solid at {_celsius(temperature)}: below its triple point "
            f"{_celsius(limits.t_triple)} ({limits.t_triple:.2f} K)",
            field="temperature", value=temperature,
            expected=f"at least {_celsius(limits.t_triple)} for {name}")
    melting = _melting_temperature(state, limits, pressure)
    if melting is not None and temperature < melting:
        raise InputError(
            f"{name} would be solid at {_celsius(temperature)} and {pressure / 1e5:.6g} bar abs: "
            f"below its melting temperature {_celsius(melting)} at that pressure",
            field="temperature", value=temperature, expected=f"at least {_celsius(melting)} for {name}")


def _melting_temperature(state: Any, limits: _Limits, pressure: float) -> float | None:
    """Melting temperature [K] at ``pressure`` [Pa abs], or None when the fluid has no melting line
    there (then CoolProp's own flash still refuses a solid state, reported as PropertyError)."""
    if not state.has_melting_line() or pressure <= limits.p_triple:
        return None
    from CoolProp import CoolProp as CP

    try:
        return float(state.melting_line(CP.iT, CP.iP, pressure))
    except ValueError:  # pressure outside the melting-line correlation's range
        return None


def _evaluate(
    state: Any, name: str, limits: _Limits, pressure: float, temperature: float, hint: PhaseHint
) -> FluidState:
    """Run CoolProp at (pressure [Pa abs], temperature [K]); raises CoolProp's ValueError."""
    from CoolProp import CoolProp as CP

    vapour_pressure = None
    if limits.t_triple <= temperature < limits.t_critical:
        state.update(CP.QT_INPUTS, 0.0, temperature)
        vapour_pressure = state.p()
    saturated = vapour_pressure is not None and (
        abs(pressure - vapour_pressure) <= SATURATION_TOLERANCE * vapour_pressure)
    if saturated:
        quality = 1.0 if hint == "gas" else 0.0
        state.update(CP.QT_INPUTS, quality, temperature)
        phase: Phase = hint if hint in ("liquid", "gas") else "two-phase"
        fraction = quality if hint in ("liquid", "gas") else None
    else:
        state.update(CP.PT_INPUTS, pressure, temperature)
        phase = _map_phase(int(state.phase()), name, pressure, temperature)
        fraction = None if phase == "two-phase" else 0.0 if phase == "liquid" else 1.0
    # recorded whole here (version, state point, a single phase's vapour fraction), so that the engine's
    # record of the state (properties.select) has nothing to fill in and need not copy it
    return FluidState(
        density=state.rhomass(), viscosity=state.viscosity(), phase=phase, source="coolprop",
        model=_model_text(saturated, hint), vapour_fraction=fraction,
        vapour_pressure=vapour_pressure, speed_of_sound=state.speed_sound(),
        molar_mass=limits.molar_mass, fluid_name=name, backend_version=_coolprop_version(),
        pressure=pressure, temperature=temperature,
    )


def _map_phase(index: int, name: str, pressure: float, temperature: float) -> Phase:
    """boresize phase for CoolProp's phase index (see the module docstring)."""
    if index not in _PHASE_BY_INDEX:
        raise PropertyError(
            f"coolprop: CoolProp gave an unknown phase (index {index}) for {name} at "
            f"{describe_conditions(pressure, temperature)}")
    return _PHASE_BY_INDEX[index]


def _model_text(saturated: bool, hint: PhaseHint) -> str:
    """Model text for FluidState.model, e.g. "CoolProp 8.0.0 HEOS (reference EOS)"."""
    text = f"CoolProp {_coolprop_version()} {_MODEL}"
    if not saturated:
        return text
    if hint in ("liquid", "gas"):
        side = "liquid" if hint == "liquid" else "vapour"
        return f"{text}; on the saturation curve, saturated {side} as the line's phase says"
    return (f"{text}; on the saturation curve: pressure and temperature do not fix the vapour "
            f"fraction, saturated-liquid properties shown; give the line's phase")
