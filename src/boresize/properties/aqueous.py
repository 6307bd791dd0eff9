"""Water with methanol, ethanol, ethylene glycol, propylene glycol or glycerol: backend id ``aqueous``.

The fluid is a composition of water and one of :data:`SOLUTIONS` (``mass: water 0.7, ethanol 0.3``,
mole fractions by default, see :mod:`boresize.properties.composition`) or an incompressible spelling of
one of them (``MEG 30%``, ``INCOMP::MEA[0.3]``: mass fractions). Chosen automatically before the
CoolProp incompressibles and thermo; ``backend = coolprop-mixture`` or ``thermo`` on the line picks those.

Models (named on every state with their versions):

* density and viscosity: the Melinder correlations for aqueous solutions (A. Melinder, Properties of
  secondary working fluids for indirect systems, IIR 2010) as CoolProp's incompressible solutions
  (INCOMP::MEA ethanol, MMA methanol, MEG, MPG, MGL glycerol; mass fraction). Validity: the solution's
  mass-fraction range (0 to 60 %) and temperatures from its freezing point to its upper limit (40 degC
  for the alcohols and glycerol, 100 degC for the glycols), each read from CoolProp.
* bubble pressure at T (the line's vapour pressure, read by the flashing and NPSH criteria): modified
  UNIFAC (Dortmund; J. Gmehling, J. Li, M. Schiller, Ind. Eng. Chem. Res. 32 (1993) 178-193) with the
  public parameters shipped in thermo (``DOUFIP2016``), in thermo's ``GibbsExcessLiquid`` with an ideal
  gas: P_bubble = sum x_i gamma_i Psat_i, with thermo's pure-component vapour-pressure correlations.
  Measured: the ethanol-water azeotrope at 1 atm 78.25 degC (published about 78.2 degC).

Refusals (:class:`~boresize.errors.PropertyError`, naming the range and what to do): a mass fraction or
temperature outside the correlation's range, and a pressure below the bubble pressure (the solution
boils there: these are liquid models).
"""

from __future__ import annotations

import functools
import math
import threading
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Line
from boresize.properties.base import ZERO_CELSIUS, check_absolute, check_plausible, describe_conditions, is_mixture
from boresize.properties.composition import Basis, basis_of, parse_composition
from boresize.properties.saturation import refuse_quality

__all__ = ["AqueousBackend", "SOLUTIONS", "Solution", "WATER_CAS", "check_liquid_inputs", "unifac_bubble_pressure",
           "unifac_liquid"]

WATER_CAS = "7732-18-5"
#: CoolProp incompressible code -> (solute CAS number, solute name). CAS registry numbers (from memory;
#: the chemicals database resolves each name to them).
SOLUTIONS: dict[str, tuple[str, str]] = {
    "MEA": ("64-17-5", "ethanol"), "MMA": ("67-56-1", "methanol"), "MEG": ("107-21-1", "ethylene glycol"),
    "MPG": ("57-55-6", "propylene glycol"), "MGL": ("56-81-5", "glycerol"),
}
_BY_CAS = {cas: code for code, (cas, _) in SOLUTIONS.items()}
#: Dortmund UNIFAC groups of glycerol, which thermo's DDBST assignment table lacks: 2 CH2, 1 CH,
#: 2 OH(primary), 1 OH(secondary) (subgroups 2, 3, 14, 81 of the Dortmund table).
_GLYCEROL_GROUPS = {2: 2, 3: 1, 14: 2, 81: 1}
_EOS = "modified UNIFAC (Dortmund)"


@dataclass(frozen=True)
class Solution:
    """An aqueous solution: CoolProp code, solute mass fraction [-], water and solute mole fractions [-],
    mean molar mass [kg/mol], a label and the composition's note (normalised fractions)."""

    code: str
    mass_fraction: float
    zs: tuple[float, float]
    molar_mass: float
    label: str
    note: str | None = None


@functools.lru_cache(maxsize=16)
def _molar_mass(cas: str) -> float:
    from boresize.properties.components import resolve_component

    return resolve_component(cas).molar_mass


@functools.lru_cache(maxsize=1024)
def solution_of(text: str, basis: Basis | None) -> Solution | None:
    """The solution ``text`` names (a water + solute composition or an incompressible spelling), else None.

    :raises InputError: an unreadable composition or an unknown component (field "fluid")
    """
    from boresize.properties.coolprop_mixture import incompressible_spec

    spec = incompressible_spec(text)
    if spec is not None:
        code, fraction = spec
        if code not in SOLUTIONS or fraction is None:
            return None
        return _solution(code, fraction, None)
    if not is_mixture(text):
        return None
    from boresize.properties.components import resolve_component

    composition = parse_composition(text, basis=basis)
    if len(composition.components) != 2:
        return None
    components = [resolve_component(name) for name in composition.components]
    cas = [c.cas for c in components]
    if WATER_CAS not in cas or not any(c in _BY_CAS for c in cas):
        return None
    solute = 1 - cas.index(WATER_CAS)
    fraction = composition.fractions[solute]
    if composition.basis == "mole":
        masses = [f * c.molar_mass for f, c in zip(composition.fractions, components)]
        fraction = masses[solute] / math.fsum(masses)
    return _solution(_BY_CAS[cas[solute]], fraction, composition.note)


def _solution(code: str, fraction: float, note: str | None) -> Solution:
    water, solute = _molar_mass(WATER_CAS), _molar_mass(SOLUTIONS[code][0])
    moles = ((1.0 - fraction) / water, fraction / solute)
    total = moles[0] + moles[1]
    zs = (moles[0] / total, moles[1] / total)
    label = f"{SOLUTIONS[code][1]} {fraction * 100:.4g} wt% in water"
    return Solution(code, fraction, zs, 1.0 / total, label, note)


class AqueousBackend:
    """Aqueous alcohols and glycols: Melinder density and viscosity, modified UNIFAC bubble pressure.

    :param cache_size: number of (solution, pressure, temperature) results kept [-]
    """

    id = "aqueous"
    title = "aqueous solutions (Melinder correlations through CoolProp, modified UNIFAC bubble pressure)"

    def __init__(self, cache_size: int = 4096) -> None:
        self._lock = threading.RLock()
        self._states: dict[str, Any] = {}
        self._liquids: dict[str, Any] = {}
        self._cached = functools.lru_cache(maxsize=cache_size)(self._state)

    def version(self) -> str:
        """CoolProp's and thermo's versions (no import)."""
        from boresize.properties.coolprop import _coolprop_version
        from boresize.properties.thermo_phases import thermo_version

        return f"CoolProp {_coolprop_version()}, thermo {thermo_version()}"

    def handles(self, line: Line) -> bool:
        """True for water with one solute of :data:`SOLUTIONS`, unless the line gives density and viscosity."""
        if line.density is not None and line.viscosity is not None:
            return False
        try:
            return solution_of(line.fluid, basis_of(line.extra)) is not None
        except InputError:
            return False  # an unknown name: the backend that serves mixtures explains it

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Liquid properties at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises InputError: a fluid that is not an aqueous solution of :data:`SOLUTIONS` ("fluid"), an
            ``eos`` ("eos"), a pressure or temperature not above zero
        :raises PropertyError: a fraction or temperature outside the correlation's range, or a pressure
            below the bubble pressure
        """
        check_liquid_inputs(line, self.id, pressure, temperature)
        solution = solution_of(line.fluid, basis_of(line.extra))
        if solution is None:
            raise InputError(f"{line.fluid!r} is not water with one of {', '.join(n for _, n in SOLUTIONS.values())}",
                             field="fluid", value=line.fluid,
                             expected="e.g. 'mass: water 0.7, ethanol 0.3' or 'MEG 30%'")
        with self._lock:
            return self._cached(solution, float(pressure), float(temperature))

    def bubble_pressure(self, solution: Solution, temperature: float) -> float:
        """Bubble pressure [Pa abs] of ``solution`` at ``temperature`` [K] (modified UNIFAC, ideal gas)."""
        with self._lock:
            return unifac_bubble_pressure(self._liquid(solution.code), solution.zs, temperature)

    # --- internals -----------------------------------------------------------------------------
    def _state(self, solution: Solution, pressure: float, temperature: float) -> FluidState:
        from CoolProp import CoolProp as CP

        incompressible = self._incompressible(solution)
        low_w, high_w = (incompressible.trivial_keyed_output(CP.ifraction_min),
                         incompressible.trivial_keyed_output(CP.ifraction_max))
        name, where = SOLUTIONS[solution.code][1], describe_conditions(pressure, temperature)
        todo = ("give the line's density and viscosity (and vapour_pressure), or name a backend "
                "(backend thermo: a cubic equation of state)")
        if not low_w - 1e-9 <= solution.mass_fraction <= high_w + 1e-9:
            raise PropertyError(f"aqueous: {name} {solution.mass_fraction * 100:.6g} wt% in water is outside the "
                                f"Melinder correlation's range "
                                f"INCOMP::{solution.code} ({name} {low_w * 100:g} to {high_w * 100:g} wt% in water); "
                                f"{todo}")
        freezing, top = incompressible.trivial_keyed_output(CP.iT_freeze), incompressible.Tmax()
        validity = (f"{name} {low_w * 100:g} to {high_w * 100:g} wt% in water; at {solution.mass_fraction * 100:.4g} "
                    f"wt% from {_celsius(freezing)} degC (freezing point) to {_celsius(top)} degC; liquid above its "
                    f"bubble pressure")
        if not freezing <= temperature <= top:
            raise PropertyError(f"aqueous: {solution.label} at {where} is outside the Melinder correlation's range "
                                f"INCOMP::{solution.code} ({_celsius(freezing)} degC (freezing point) to {_celsius(top)} "
                                f"degC at this fraction); {todo}")
        try:
            incompressible.update(CP.PT_INPUTS, pressure, temperature)
            density, viscosity = incompressible.rhomass(), incompressible.viscosity()
        except ValueError as exc:
            raise PropertyError(f"aqueous: CoolProp failed for INCOMP::{solution.code} {solution.label} at "
                                f"{where}: {exc}") from None
        check_plausible(density, viscosity, backend=self.id, fluid=solution.label, pressure=pressure,
                        temperature=temperature)
        bubble = self.bubble_pressure(solution, temperature)
        if not (math.isfinite(bubble) and bubble > 0.0):
            raise PropertyError(f"aqueous: no bubble pressure for {solution.label} at {where} ({bubble!r})")
        if pressure < bubble:
            raise PropertyError(f"aqueous: {solution.label} boils at {where}: its bubble pressure is "
                                f"{bubble / 1e5:.4g} bar abs ({_EOS}); the aqueous models are for the liquid: raise "
                                f"the pressure, or name backend thermo for a two-phase line")
        notes = (solution.note,) if solution.note else ()
        versions = self.version()
        model = (f"{versions}: density and viscosity Melinder (CoolProp incompressible INCOMP::{solution.code}, mass "
                 f"fraction {solution.mass_fraction:.4g}); bubble pressure {_EOS}, thermo DOUFIP2016 parameters, "
                 f"ideal gas, {self._vapour_methods(solution.code)}; at {where}" + "".join(f"; {n}" for n in notes))
        return FluidState(
            density=density, viscosity=viscosity, phase="liquid", source=self.id, model=model, vapour_fraction=0.0,
            vapour_pressure=bubble, bubble_pressure=bubble, molar_mass=solution.molar_mass, fluid_name=solution.label,
            backend_version=versions, eos="UNIFAC-Dortmund", pressure=pressure, temperature=temperature,
            composition=(("water", solution.zs[0]), (SOLUTIONS[solution.code][1], solution.zs[1])), notes=notes,
            family="aqueous solution", validity=validity)

    def _incompressible(self, solution: Solution) -> Any:
        """CoolProp's INCOMP state of the solution (one per code), set to its mass fraction."""
        from CoolProp import CoolProp as CP

        state = self._states.get(solution.code)
        if state is None:
            state = self._states[solution.code] = CP.AbstractState("INCOMP", solution.code)
        state.set_mass_fractions([solution.mass_fraction])
        return state

    def _liquid(self, code: str) -> Any:
        """thermo's GibbsExcessLiquid of water + the solute with modified UNIFAC (built once per solute)."""
        liquid = self._liquids.get(code)
        if liquid is None:
            from thermo.unifac import UNIFAC_group_assignment_DDBST

            cas = (WATER_CAS, SOLUTIONS[code][0])
            groups = [UNIFAC_group_assignment_DDBST(c, "MODIFIED_UNIFAC") or dict(_GLYCEROL_GROUPS) for c in cas]
            liquid = self._liquids[code] = unifac_liquid(cas, groups)
        return liquid

    def _vapour_methods(self, code: str) -> str:
        correlations = self._liquid(code).VaporPressures
        names = ("water", SOLUTIONS[code][1])
        return "vapour pressures " + ", ".join(f"{n} {c.method}" for n, c in zip(names, correlations))


def _celsius(kelvin: float) -> str:
    return f"{kelvin - ZERO_CELSIUS:.4g}"


def check_liquid_inputs(line: Line, backend: str, pressure: float, temperature: float) -> None:
    """The refusals both aqueous backends share: a quality, an ``eos``, a pressure or temperature not above zero.

    :raises InputError: naming the field, the value and what was expected
    """
    refuse_quality(line, backend)
    if line.eos and line.eos.strip():
        raise InputError(f"the {backend} backend has no equation of state {line.eos!r}", field="eos",
                         value=line.eos, expected="eos left blank (backend thermo offers cubic EOS)")
    check_absolute(pressure, temperature)


def unifac_liquid(cas: Sequence[str], groups: Sequence[dict[int, int]]) -> Any:
    """thermo's GibbsExcessLiquid of the components ``cas`` with modified UNIFAC (Dortmund, DOUFIP2016), their
    subgroups ``groups`` and thermo's vapour-pressure correlations."""
    from thermo import GibbsExcessLiquid, VaporPressure
    from thermo.unifac import DOUFIP2016, DOUFSG, UNIFAC

    xs = [1.0 / len(cas)] * len(cas)
    model = UNIFAC.from_subgroups(T=298.15, xs=xs, chemgroups=list(groups), version=1,
                                  interaction_data=DOUFIP2016, subgroups=DOUFSG)
    pressures = [VaporPressure(CASRN=c) for c in cas]
    return GibbsExcessLiquid(VaporPressures=pressures, GibbsExcessModel=model, T=298.15, P=101325.0, zs=xs)


def unifac_bubble_pressure(liquid: Any, zs: Sequence[float], temperature: float) -> float:
    """Bubble pressure [Pa abs] at ``temperature`` [K] of the liquid of mole fractions ``zs``: sum z_i gamma_i
    Psat_i (modified Raoult's law, ideal gas)."""
    state = liquid.to(T=temperature, P=101325.0, zs=list(zs))
    return math.fsum(z * g * p for z, g, p in zip(zs, state.gammas(), state.Psats()))
