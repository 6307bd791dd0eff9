"""CoolProp mixtures (HEOS, where CoolProp holds the binary parameters) and CoolProp's incompressible
liquids and brines. Backend id ``coolprop-mixture``.

Incompressibles are chosen automatically; HEOS mixtures only when the line says ``backend =
coolprop-mixture`` (a CoolProp mixture flash costs 12-100 ms and its states need the guards below;
mixtures of GERG-2008 components go to :mod:`boresize.properties.gerg`, which decides the phase from the
envelope and imposes it, others to the thermo backend).

Incompressible spellings (the fraction is by mass, as CoolProp defines these solutions):
``INCOMP::MEG-30%``, ``INCOMP::MEG[0.3]``, a pure heat-transfer fluid ``INCOMP::T66``, or the friendly
``MEG 30%``, ``30 % ethylene glycol``, ``propylene glycol 40 wt%``, ``NaCl 10%``: the solutes of
:data:`SOLUTES` (ethylene and propylene glycol, glycerol, methanol, ethanol, ammonia, NaCl, CaCl2,
MgCl2, K2CO3, LiCl in water). Always liquid; no vapour pressure. Water with an alcohol or glycol goes to
the ``aqueous`` backend first (:mod:`boresize.properties.aqueous`: the same fits, plus a bubble pressure).

Guards on HEOS mixture states (each a :class:`~boresize.errors.PropertyError` naming the backend and
the value): compressibility factor Z <= 0, or outside 0.05..2 for a gas (Z = 163 for methane/n-decane
and Z < 0 for water/methane were measured; a two-phase state's Z is its bulk p / (rho R T)); a viscosity that is not a finite number; a liquid whose
density differs by more than 10 % from the densities at 0.9 and 1.1 times the pressure (a wrong root:
propane/n-butane 60/40 at 20 degC gives 231 kg/m3 from 20.5 to 21.5 bar abs and 540 kg/m3 at 20 and 22
bar abs); a liquid viscosity more
than a factor 2 from the logarithmic mixing of its components' own CoolProp viscosities (CoolProp's
liquid-mixture viscosity gave 9.5 mPa s for water/methanol 80/20 mol at 25 degC). A two-phase state
carries the homogeneous density and the McAdams viscosity of its phases, each evaluated with its phase
imposed, and its bubble and dew pressures at T (CoolProp's QT saturation; a liquid state its bubble pressure, so
``flashing``, ``npsh-margin`` and a letdown line judge it). Speed: after a few gas states of one mixture at one temperature with no bubble or dew point
there, later gas states at that temperature are evaluated with the gas phase imposed (about 50 times
faster), see :mod:`boresize.properties.coolprop_heos`.

Source: I. H. Bell et al., Ind. Eng. Chem. Res. 53 (2014) 2498-2508, doi:10.1021/ie4033999; mixture
parameters of GERG-2008 (O. Kunz, W. Wagner, J. Chem. Eng. Data 57 (2012) 3032-3091) where available.
"""

from __future__ import annotations

import collections
import functools
import re
import threading
from typing import Any

from boresize.errors import InputError, PropertyError
from boresize.model import Flow, FluidState, Line
from boresize.properties.base import check_plausible, describe_conditions
from boresize.properties.composition import Basis, basis_of, parse_composition
from boresize.properties.coolprop import CoolPropBackend, _coolprop_version
from boresize.properties.coolprop_heos import (
    GAS_FLASHES_BEFORE_CHECK,
    guard_state,
    heos_point,
    no_envelope,
    set_fractions,
)
from boresize.properties.saturation import refuse_quality

__all__ = ["CoolPropMixtureBackend", "SOLUTES", "is_incompressible", "incompressible_spec"]

#: Friendly solute names -> CoolProp incompressible solution code (solutions in water, mass fraction).
SOLUTES: dict[str, str] = {
    "meg": "MEG", "ethylene glycol": "MEG", "monoethylene glycol": "MEG", "mpg": "MPG",
    "propylene glycol": "MPG", "glycerol": "MGL", "glycerine": "MGL", "methanol": "MMA", "ethanol": "MEA",
    "ammonia": "MAM", "nacl": "MNA", "sodium chloride": "MNA", "cacl2": "MCA", "calcium chloride": "MCA",
    "mgcl2": "MMG", "magnesium chloride": "MMG", "k2co3": "MKC", "potassium carbonate": "MKC",
    "licl": "MLI", "lithium chloride": "MLI",
}
_WORDS = r"(?:\s*(?:aqueous|solution|brine|in\s+water|aq\.?))*"
_PCT = r"(?P<pct>\d+(?:\.\d+)?)\s*(?:wt\s*|mass\s*)?%"
_FRIENDLY = (re.compile(rf"^{_WORDS}\s*(?P<name>[a-z0-9 ]+?)\s*{_PCT}{_WORDS}\s*$", re.IGNORECASE),
             re.compile(rf"^{_WORDS}\s*{_PCT}\s*(?P<name>[a-z0-9 ]+?){_WORDS}\s*$", re.IGNORECASE))
_INCOMP = re.compile(r"^\s*INCOMP::(?P<code>[A-Za-z0-9]+)(?:-(?P<pct>\d+(?:\.\d+)?)%|\[(?P<frac>[\d.]+)\])?\s*$")
_GAS_Z = (0.05, 2.0)


def incompressible_spec(fluid: str) -> tuple[str, float | None] | None:
    """(CoolProp code, mass fraction or None) for an incompressible spelling, else None."""
    match = _INCOMP.match(fluid)
    if match:
        fraction = match.group("frac") or match.group("pct")
        scale = 1.0 if match.group("frac") else 100.0
        return match.group("code"), float(fraction) / scale if fraction else None
    for pattern in _FRIENDLY:
        found = pattern.match(fluid)
        if found and " ".join(found.group("name").lower().split()) in SOLUTES:
            return SOLUTES[" ".join(found.group("name").lower().split())], float(found.group("pct")) / 100.0
    return None


def is_incompressible(fluid: str) -> bool:
    """True when ``fluid`` names a CoolProp incompressible liquid or brine."""
    return incompressible_spec(fluid) is not None


#: The cache keys of :meth:`CoolPropMixtureBackend._compute`: (code, mass fraction) of an incompressible,
#: ("HEOS", CoolProp names, fractions, basis, note) of a mixture.
_IncompressibleKey = tuple[str, "float | None"]
_HeosKey = tuple[str, tuple[str, ...], tuple[float, ...], str, "str | None"]


class CoolPropMixtureBackend:
    """CoolProp HEOS mixtures (explicit) and incompressible liquids and brines (automatic).

    :param cache_size: number of results kept [-]
    """

    id = "coolprop-mixture"
    title = "CoolProp mixtures (HEOS) and incompressible liquids"

    def __init__(self, cache_size: int = 1024) -> None:
        self._lock = threading.RLock()
        self._states: dict[str, Any] = {}
        self._pure = CoolPropBackend()
        self._cached = functools.lru_cache(maxsize=cache_size)(self._compute)
        self._gas_flashes: collections.Counter[tuple[Any, ...]] = collections.Counter()
        self._gas_known: set[tuple[Any, ...]] = set()
        self._saturation: dict[tuple[Any, ...], tuple[float | None, float | None]] = {}

    def version(self) -> str:
        """CoolProp's version (no import)."""
        return _coolprop_version()

    def handles(self, line: Line) -> bool:
        """True for an incompressible liquid or brine (HEOS mixtures are chosen explicitly)."""
        return not (line.density is not None and line.viscosity is not None) and is_incompressible(line.fluid)

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Properties at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises InputError: unknown component, a pair without binary parameters ("backend"), a
            temperature or fraction outside an incompressible fit's range
        :raises PropertyError: CoolProp failed, or a guard above refused its result
        """
        refuse_quality(line, self.id)  # a saturated state by quality: pure fluids of coolprop only
        if line.eos and line.eos.strip().upper() not in ("HEOS", "GERG-2008", "GERG"):
            raise InputError(f"the coolprop-mixture backend has no equation of state {line.eos!r}", field="eos",
                             value=line.eos, expected="HEOS (or leave eos blank); backend thermo offers cubic EOS")
        spec = incompressible_spec(line.fluid)
        if spec is not None:
            return self._cached("INCOMP", spec, float(pressure), float(temperature))
        return self._cached("HEOS", self._heos_key(line.fluid, basis_of(line.extra)), float(pressure),
                            float(temperature))

    def _heos_key(self, fluid: str, basis: Basis | None) -> _HeosKey:
        """("HEOS", CoolProp names, fractions, basis, note) of a composition, parsed and resolved."""
        composition = parse_composition(fluid, basis=basis)
        names = tuple(self._pure.resolve(name) for name in composition.components)
        return ("HEOS", names, composition.fractions, composition.basis, composition.note)

    def _compute(self, kind: str, key: _IncompressibleKey | _HeosKey, pressure: float,
                 temperature: float) -> FluidState:
        with self._lock:
            if len(key) == 2:  # kind "INCOMP": (CoolProp code, mass fraction)
                return self._incompressible(key[0], key[1], pressure, temperature)
            _, names, fractions, basis, note = key
            return self._mixture(names, fractions, basis, note, pressure, temperature)

    # -- incompressibles --------------------------------------------------------------------------
    def _incompressible(self, code: str, fraction: float | None, pressure: float, temperature: float) -> FluidState:
        from CoolProp import CoolProp as CP

        label = code if fraction is None else f"{code}-{fraction * 100:g}%"
        try:
            state = self._abstract("INCOMP", code)
            if fraction is not None:
                state.set_mass_fractions([fraction])
            state.update(CP.PT_INPUTS, pressure, temperature)
            density, viscosity = state.rhomass(), state.viscosity()
        except ValueError as exc:  # CoolProp: unknown code, fraction or temperature out of the fit's range
            raise _incompressible_error(label, str(exc)) from None
        check_plausible(density, viscosity, backend=self.id, fluid=f"INCOMP::{label}", pressure=pressure,
                        temperature=temperature)
        model = (f"CoolProp {_coolprop_version()} INCOMP::{label} (incompressible liquid fit, mass fraction); "
                 f"at {describe_conditions(pressure, temperature)}")
        return FluidState(density=density, viscosity=viscosity, phase="liquid", source=self.id, model=model,
                          vapour_fraction=0.0, fluid_name=f"INCOMP::{label}", backend_version=_coolprop_version(),
                          eos="INCOMP", pressure=pressure, temperature=temperature,
                          family="incompressible liquid or brine",
                          validity=f"CoolProp's fit of INCOMP::{code}: {state.Tmin() - 273.15:.4g} to "
                                   f"{state.Tmax() - 273.15:.4g} degC (CoolProp refuses a state outside it)")

    # -- HEOS mixtures ----------------------------------------------------------------------------
    def _mixture(self, names: tuple[str, ...], fractions: tuple[float, ...], basis: str, note: str | None,
                 pressure: float, temperature: float) -> FluidState:
        state = self._heos(names)
        label = " & ".join(f"{n} {f:.4g}" for n, f in zip(names, fractions)) + f" ({basis})"
        key = (names, fractions, basis, temperature)
        try:
            set_fractions(state, fractions, basis)
            point = heos_point(state, self._heos_phases(names), names, pressure, temperature, key in self._gas_known)
            zs = tuple(state.get_mole_fractions())
            if point.phase != "two-phase":
                guard_state(self, state, names, zs, point, pressure, temperature, label)
            check_plausible(point.density, point.viscosity, backend=self.id, fluid=label, pressure=pressure,
                            temperature=temperature)
            if point.phase == "gas" and not point.imposed:
                self._gas_flashes[key] += 1
                if self._gas_flashes[key] == GAS_FLASHES_BEFORE_CHECK and no_envelope(state, temperature):
                    self._gas_known.add(key)
        except ValueError as exc:
            raise PropertyError(f"coolprop-mixture: CoolProp failed for {label} at "
                                f"{describe_conditions(pressure, temperature)}: {exc}") from None
        bubble, dew = self._bubble_dew(names, key, pressure, point.phase)
        notes = ((note,) if note else ()) + point.notes
        model = (f"CoolProp {_coolprop_version()} HEOS mixture (multi-fluid Helmholtz model, GERG-2008 parameters "
                 f"where available); at {describe_conditions(pressure, temperature)}" + "".join(f"; {n}" for n in notes))
        return FluidState(density=point.density, viscosity=point.viscosity, phase=point.phase, source=self.id,
                          model=model, vapour_fraction=point.quality, speed_of_sound=point.speed_of_sound,
                          molar_mass=state.molar_mass(), fluid_name=label, backend_version=_coolprop_version(),
                          eos="HEOS", pressure=pressure, temperature=temperature,
                          composition=tuple(zip(names, zs)), notes=notes, family="mixture (CoolProp HEOS, named)",
                          bubble_pressure=bubble, dew_pressure=dew,
                          validity="CoolProp's multi-fluid model where its binary parameters are fitted (GERG-2008 "
                                   "pairs); estimated elsewhere", **point.phase_fields())

    def _bubble_dew(self, names: tuple[str, ...], key: tuple[Any, ...], pressure: float, phase: str
                    ) -> tuple[float | None, float | None]:
        """(bubble, dew) pressure [Pa abs] of a liquid or two-phase state by CoolProp's QT saturation of the mixture
        at the key's temperature (about 0.4 ms each, once per mixture and temperature); None where CoolProp finds
        none or where it contradicts the state (a liquid lies above its bubble pressure, a two-phase state between
        the two; a retrograde mixture's other dew point is not the one). The march of a two-phase line makes no flash
        below the dew pressure (all gas there); a liquid letdown line flashes at the bubble pressure, and
        ``flashing`` and ``npsh-margin`` judge a liquid against it. None for a gas (not needed; not computed)."""
        from CoolProp import CoolProp as CP

        if phase not in ("liquid", "two-phase"):
            return None, None
        if key not in self._saturation:
            _, fractions, basis, temperature = key
            state = self._heos_phases(names)
            found: list[float | None] = []
            for quality in (0.0, 1.0):
                try:
                    set_fractions(state, fractions, basis)
                    state.update(CP.QT_INPUTS, quality, temperature)
                    found.append(float(state.p()))
                except ValueError:
                    found.append(None)
            self._saturation[key] = (found[0], found[1])
        bubble, dew = self._saturation[key]
        if phase == "liquid":
            return (bubble if bubble is not None and 0.0 < bubble < pressure else None), None
        return (bubble if bubble is not None and bubble > pressure else None,
                dew if dew is not None and 0.0 < dew < pressure else None)

    def _heos_phases(self, names: tuple[str, ...]) -> Any:
        """A second AbstractState of the same components, for the phases of a two-phase state."""
        return self._abstract("HEOS-phase", "&".join(names), backend="HEOS")

    def _heos(self, names: tuple[str, ...]) -> Any:
        key = "&".join(names)
        try:
            return self._abstract("HEOS", key)
        except ValueError as exc:  # "Could not match the binary pair [...] - for now this is an error."
            raise InputError(f"CoolProp has no binary parameters for {' & '.join(names)} ({exc})", field="backend",
                             value="coolprop-mixture", expected="backend thermo for this mixture") from None

    def _abstract(self, kind: str, name: str, backend: str | None = None) -> Any:
        key = f"{kind}::{name}"
        if key not in self._states:
            from CoolProp import CoolProp as CP

            self._states[key] = CP.AbstractState(backend or kind, name)
        return self._states[key]

    def pure_viscosity(self, name: str, pressure: float, temperature: float) -> tuple[str, float]:
        """(phase, viscosity [Pa s]) of one pure component at (pressure [Pa abs], temperature [K])."""
        line = Line(tag="component", fluid=name, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature)
        pure = self._pure.state(line, pressure, temperature)
        return pure.phase, pure.viscosity


def _incompressible_error(label: str, message: str) -> InputError | PropertyError:
    """InputError for a temperature or fraction out of a fit's range, else PropertyError."""
    lowered = message.lower()
    if "temperature" in lowered or "freezing" in lowered:
        return InputError(f"INCOMP::{label}: {message}", field="temperature", value=label,
                          expected="a temperature inside the fit's range")
    if "composition" in lowered or "fraction" in lowered:
        return InputError(f"INCOMP::{label}: {message}", field="fluid", value=label,
                          expected="a mass fraction inside the fit's range")
    if "not found" in lowered or "valid" in lowered:
        return InputError(f"unknown incompressible fluid INCOMP::{label}", field="fluid", value=label,
                          expected=f"a CoolProp incompressible such as INCOMP::MEG-30% or {', '.join(sorted(set(SOLUTES.values())))}")
    return PropertyError(f"coolprop-mixture: CoolProp failed for INCOMP::{label}: {message}")

