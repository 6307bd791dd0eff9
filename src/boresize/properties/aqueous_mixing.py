"""Water with glycols and amines (TEG, DEG, MEA, DEA, MDEA), and water with more than one solute: backend
``aqueous-mixing``.

The fluid is a composition with water and one or more of :data:`SOLUTES` (``mass: water 0.5, TEG 0.5``,
``mass: water 0.5, MDEA 0.45, MEA 0.05``; mole fractions by default, see
:mod:`boresize.properties.composition`). Water with a single alcohol or glycol that a Melinder correlation
covers (methanol, ethanol, MEG, MPG, glycerol) is backend ``aqueous``'s, which is chosen before this one.
Chosen automatically before thermo's cubic equations of state, which split water + TEG into two liquids
(a Peng-Robinson artefact: the pair is fully miscible).

Models (named on every state). No correlation made for these solutions is shipped offline (CoolProp has no
incompressible for them), so density and viscosity come from a **mixing rule** over thermo's pure-liquid
correlations, and every state says so in its family, validity and notes:

* density: ideal mixing of volumes (Amagat), V = sum x_i V_i, with thermo's pure saturated-liquid molar
  volumes. Aqueous glycols and amines contract on mixing, so this reads about 1-3 % light.
  MDEA has no liquid-density correlation in thermo 0.6.1: its pure density is the modified Rackett equation
  (Spencer and Danner) with Z_RA fitted here to 1038 kg/m3 at 25 degC (handbook value, from memory).
* viscosity: logarithmic mixing on mass fractions, ln mu = sum w_i ln mu_i, with thermo's pure-liquid
  viscosities (DEA: DIPPR, Perry's 8th edition, which reaches 20 degC). Chosen over the mole-fraction
  form (Arrhenius / Grunberg-Nissan without interaction), which under-predicts water + glycol viscosity
  several-fold (50 wt % TEG at 20 degC: about 1.5 mPa s against about 6-7 mPa s measured, from memory). The
  mass form reads 11-24 % high against the Melinder MEG and MPG correlations at 30 and 50 wt %, 20-60 degC,
  and Amagat 0.6-2.1 % light (tests/properties/test_aqueous_mixing.py): high viscosity is the conservative
  side for pressure drop, light density the non-conservative side for velocity.
* bubble pressure: modified UNIFAC (Dortmund) with thermo's DOUFIP2016 parameters and an ideal gas, as
  backend ``aqueous``; every Dortmund group assignment comes from thermo's DDBST table except glycerol's
  (written by hand, as in :mod:`boresize.properties.aqueous`). A solute pair without published Dortmund
  interaction parameters (ethers of TEG/DEG with amines or with MEG) is refused.

Refusals (:class:`~boresize.errors.PropertyError`, naming the range and what to do): a temperature outside
0 degC to the lowest upper limit of the pure correlations (at most 120 degC), a solute pair without UNIFAC parameters, and a
pressure below the bubble pressure.
"""

from __future__ import annotations

import functools
import math
import threading
from dataclasses import dataclass
from typing import Any

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Line
from boresize.properties.aqueous import (
    _EOS,
    _GLYCEROL_GROUPS,
    SOLUTIONS,
    WATER_CAS,
    _celsius,
    check_liquid_inputs,
    unifac_bubble_pressure,
    unifac_liquid,
)
from boresize.properties.base import ZERO_CELSIUS, check_plausible, describe_conditions, is_mixture
from boresize.properties.composition import Basis, basis_of, parse_composition

__all__ = ["AqueousMixingBackend", "MixedSolution", "SOLUTES", "mixed_solution_of"]

#: CAS number -> short name of the solutes this backend serves with water (CAS numbers from memory; the
#: chemicals database resolves each name to them). The Melinder solutes join only alongside another solute.
SOLUTES: dict[str, str] = {
    "112-27-6": "TEG", "111-46-6": "DEG", "141-43-5": "MEA", "111-42-2": "DEA", "105-59-9": "MDEA",
    **{cas: name for cas, name in SOLUTIONS.values()},
}
_NEW = frozenset(("112-27-6", "111-46-6", "141-43-5", "111-42-2", "105-59-9"))
_MDEA = "105-59-9"
#: MDEA liquid density anchor for the modified Rackett equation: 1038 kg/m3 at 25 degC (from memory).
_MDEA_ANCHOR = (298.15, 1038.0)
#: pure-liquid viscosity methods preferred over thermo's default (DEA: REFPROP_FIT starts at 32 degC and
#: its extrapolation to 20 degC reads 5.6 Pa s; DIPPR reads 0.81 Pa s there and 0.38 Pa s at 30 degC).
_VISCOSITY_METHOD = {"111-42-2": "DIPPR_PERRY_8E"}
#: upper temperature [K] of the mixing rules here (amine regenerators run near 120 degC); not checked above.
_T_CAP = ZERO_CELSIUS + 120.0
_FAMILY = "aqueous solution (mixing rule)"
_NOTE = ("density and viscosity from a mixing rule over pure-liquid correlations (no correlation made for this "
         "solution): density about 1-3 % light, viscosity uncertain by the order of 5-30 % (about 10-25 % high on "
         "aqueous MEG and MPG)")


@dataclass(frozen=True)
class MixedSolution:
    """Water and solutes: CAS numbers (water first), mole and mass fractions [-], mean molar mass
    [kg/mol], a label and the composition's note."""

    cas: tuple[str, ...]
    zs: tuple[float, ...]
    ws: tuple[float, ...]
    molar_mass: float
    label: str
    note: str | None = None


def _name(cas: str) -> str:
    return "water" if cas == WATER_CAS else SOLUTES[cas]


@functools.lru_cache(maxsize=1024)
def mixed_solution_of(text: str, basis: Basis | None, named: bool = False) -> MixedSolution | None:
    """The solution ``text`` names when this backend serves it (water with one of TEG, DEG, MEA, DEA, MDEA,
    or with two or more of :data:`SOLUTES`; with ``named``, the line names this backend, also water with one
    Melinder solute, which backend aqueous serves by default), else None.

    :raises InputError: an unreadable composition or an unknown component (field "fluid")
    """
    if not is_mixture(text):
        return None
    from boresize.properties.components import resolve_component

    composition = parse_composition(text, basis=basis)
    components = [resolve_component(name) for name in composition.components]
    cas = [c.cas for c in components]
    solutes = [c for c in cas if c != WATER_CAS]
    if WATER_CAS not in cas or len(set(cas)) != len(cas) or not solutes:
        return None
    if not all(c in SOLUTES for c in solutes):
        return None
    if len(solutes) == 1 and solutes[0] not in _NEW and not named:
        return None  # water + one Melinder solute: backend aqueous
    order = sorted(range(len(cas)), key=lambda i: cas[i] != WATER_CAS)
    masses = [components[i].molar_mass for i in order]
    fractions = [composition.fractions[i] for i in order]
    if composition.basis == "mole":
        zs = fractions
        total = math.fsum(z * m for z, m in zip(zs, masses))
        ws = [z * m / total for z, m in zip(zs, masses)]
    else:
        ws = fractions
        moles = [w / m for w, m in zip(ws, masses)]
        zs = [n / math.fsum(moles) for n in moles]
    molar_mass = math.fsum(z * m for z, m in zip(zs, masses))
    ordered = tuple(cas[i] for i in order)
    label = ", ".join(f"{_name(c)} {w * 100:.4g}" for c, w in zip(ordered, ws) if c != WATER_CAS)
    label = f"{label} wt% in water"
    return MixedSolution(ordered, tuple(zs), tuple(ws), molar_mass, label, composition.note)


class AqueousMixingBackend:
    """Water with glycols and amines: mixing-rule density and viscosity, modified UNIFAC bubble pressure.

    :param cache_size: number of (solution, pressure, temperature) results kept [-]
    """

    id = "aqueous-mixing"
    title = ("aqueous glycols and amines (thermo pure-liquid correlations with mixing rules, modified UNIFAC "
             "bubble pressure)")

    def __init__(self, cache_size: int = 4096) -> None:
        self._lock = threading.RLock()
        self._pure_cache: dict[str, tuple[Any, Any]] = {}
        self._liquids: dict[tuple[str, ...], Any] = {}
        self._cached = functools.lru_cache(maxsize=cache_size)(self._state)

    def version(self) -> str:
        """thermo's version (no import)."""
        from boresize.properties.thermo_phases import thermo_version

        return f"thermo {thermo_version()}"

    def handles(self, line: Line) -> bool:
        """True for the solutions :func:`mixed_solution_of` reads, unless the line gives density and viscosity."""
        if line.density is not None and line.viscosity is not None:
            return False
        try:
            return mixed_solution_of(line.fluid, basis_of(line.extra)) is not None
        except InputError:
            return False  # an unknown name: the backend that serves mixtures explains it

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Liquid properties at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises InputError: a fluid this backend does not serve ("fluid"), an ``eos`` ("eos"), a pressure or
            temperature not above zero
        :raises PropertyError: a temperature outside the range, a solute pair without UNIFAC parameters, or a
            pressure below the bubble pressure
        """
        check_liquid_inputs(line, self.id, pressure, temperature)
        solution = mixed_solution_of(line.fluid, basis_of(line.extra), named=True)
        if solution is None:
            raise InputError(f"{line.fluid!r} is not water with {', '.join(sorted(set(SOLUTES.values())))}",
                             field="fluid", value=line.fluid, expected="e.g. 'mass: water 0.5, TEG 0.5'")
        with self._lock:
            return self._cached(solution, float(pressure), float(temperature))

    def bubble_pressure(self, solution: MixedSolution, temperature: float) -> float:
        """Bubble pressure [Pa abs] of ``solution`` at ``temperature`` [K] (modified UNIFAC, ideal gas)."""
        with self._lock:
            return unifac_bubble_pressure(self._liquid(solution.cas), solution.zs, temperature)

    def liquid_properties(self, solution: MixedSolution, temperature: float) -> tuple[float, float]:
        """Density [kg/m3] (Amagat) and viscosity [Pa s] (log-mass-fraction mixing) at ``temperature`` [K]."""
        volume, log_viscosity = 0.0, 0.0
        with self._lock:
            for cas, z, w in zip(solution.cas, solution.zs, solution.ws):
                molar_volume, viscosity = self._pure(cas, temperature)
                volume += z * molar_volume
                log_viscosity += w * math.log(viscosity)
        return solution.molar_mass / volume, math.exp(log_viscosity)

    def temperature_range(self, solution: MixedSolution) -> tuple[float, float]:
        """[K]: 0 degC to the lowest upper limit of the pure density and viscosity correlations, at most 120 degC."""
        tops = []
        for cas in solution.cas:
            volume, viscosity = self._pure_correlations(cas)
            if volume is not None:
                tops.append(volume.T_limits[volume.method][1])
            tops.append(viscosity.T_limits[viscosity.method][1])
        return ZERO_CELSIUS, min(min(tops), _T_CAP)

    # --- internals -----------------------------------------------------------------------------
    def _state(self, solution: MixedSolution, pressure: float, temperature: float) -> FluidState:
        where = describe_conditions(pressure, temperature)
        todo = "give the line's density and viscosity (and vapour_pressure)"
        low, high = self.temperature_range(solution)
        names = ", ".join(_name(c) for c in solution.cas)
        validity = (f"water with {names} at any fractions, {_celsius(low)} to {_celsius(high)} degC (freezing point "
                    f"not checked); density Amagat and viscosity log-mass-fraction mixing of pure-liquid "
                    f"correlations, no correlation made for this solution; liquid above its bubble pressure")
        if not low <= temperature <= high:
            raise PropertyError(f"aqueous-mixing: {solution.label} at {where} is outside the mixing rule's range "
                                f"({_celsius(low)} to {_celsius(high)} degC); {todo}")
        self._check_parameters(solution)
        density, viscosity = self.liquid_properties(solution, temperature)
        check_plausible(density, viscosity, backend=self.id, fluid=solution.label, pressure=pressure,
                        temperature=temperature)
        bubble = self.bubble_pressure(solution, temperature)
        if not (math.isfinite(bubble) and bubble > 0.0):
            raise PropertyError(f"aqueous-mixing: no bubble pressure for {solution.label} at {where} ({bubble!r})")
        if pressure < bubble:
            raise PropertyError(f"aqueous-mixing: {solution.label} boils at {where}: its bubble pressure is "
                                f"{bubble / 1e5:.4g} bar abs ({_EOS}); these models are for the liquid: raise the "
                                f"pressure, or name backend thermo for a two-phase line")
        notes = tuple(n for n in (solution.note, _NOTE, self._extrapolated(solution, temperature)) if n)
        versions = self.version()
        model = (f"{versions}: density Amagat (ideal volumes) and viscosity ln mu = sum w_i ln mu_i over "
                 f"{self._methods(solution)}; bubble pressure {_EOS}, thermo DOUFIP2016 parameters, ideal gas; at "
                 f"{where}" + "".join(f"; {n}" for n in notes))
        return FluidState(
            density=density, viscosity=viscosity, phase="liquid", source=self.id, model=model, vapour_fraction=0.0,
            vapour_pressure=bubble, bubble_pressure=bubble, molar_mass=solution.molar_mass, fluid_name=solution.label,
            backend_version=versions, eos="UNIFAC-Dortmund", pressure=pressure, temperature=temperature,
            composition=tuple((_name(c), z) for c, z in zip(solution.cas, solution.zs)), notes=notes,
            family=_FAMILY, validity=validity)

    def _pure_correlations(self, cas: str) -> tuple[Any, Any]:
        """thermo's VolumeLiquid (None for MDEA) and ViscosityLiquid of one component."""
        pure = self._pure_cache.get(cas)
        if pure is None:
            from thermo import ViscosityLiquid, VolumeLiquid

            volume = None if cas == _MDEA else VolumeLiquid(CASRN=cas)
            viscosity = ViscosityLiquid(CASRN=cas)
            if cas in _VISCOSITY_METHOD:
                viscosity.method = _VISCOSITY_METHOD[cas]
            pure = self._pure_cache[cas] = (volume, viscosity)
        return pure

    def _pure(self, cas: str, temperature: float) -> tuple[float, float]:
        """Pure saturated-liquid molar volume [m3/mol] and viscosity [Pa s] at ``temperature`` [K]."""
        volume, viscosity = self._pure_correlations(cas)
        molar_volume = _mdea_volume(temperature) if volume is None else volume.T_dependent_property(temperature)
        mu = viscosity.T_dependent_property(temperature)
        if not (molar_volume and mu and molar_volume > 0.0 and mu > 0.0):
            raise PropertyError(f"aqueous-mixing: thermo has no liquid density or viscosity of {_name(cas)} at "
                                f"{_celsius(temperature)} degC ({molar_volume!r}, {mu!r})")
        return float(molar_volume), float(mu)

    def _extrapolated(self, solution: MixedSolution, temperature: float) -> str | None:
        """A note naming the pure correlations used below their lower limit (a subcooled solute), else None."""
        below = []
        for cas in solution.cas:
            for correlation in self._pure_correlations(cas):
                if correlation is not None and temperature < correlation.T_limits[correlation.method][0]:
                    low = correlation.T_limits[correlation.method][0]
                    below.append(f"{_name(cas)} {type(correlation).__name__} {correlation.method} (from "
                                 f"{_celsius(low)} degC)")
        if not below:
            return None
        return f"extrapolated below the range of {', '.join(below)}: more uncertain"

    def _methods(self, solution: MixedSolution) -> str:
        parts = []
        for cas in solution.cas:
            volume, viscosity = self._pure_correlations(cas)
            density = "modified Rackett fitted to 1038 kg/m3 at 25 degC" if volume is None else volume.method
            parts.append(f"{_name(cas)} {density}/{viscosity.method}")
        return "pure liquids (density/viscosity) " + ", ".join(parts)

    def _groups(self, cas: str) -> dict[int, int]:
        from thermo.unifac import UNIFAC_group_assignment_DDBST

        if cas == SOLUTIONS["MGL"][0]:
            return dict(_GLYCEROL_GROUPS)
        groups = UNIFAC_group_assignment_DDBST(cas, "MODIFIED_UNIFAC")
        if not groups:
            raise PropertyError(f"aqueous-mixing: no modified UNIFAC groups for {_name(cas)}")
        return dict(groups)

    def _check_parameters(self, solution: MixedSolution) -> None:
        """Refuse a mixture whose main groups lack Dortmund interaction parameters (thermo leaves them 0)."""
        from thermo.unifac import DOUFIP2016, DOUFSG

        mains = {cas: {DOUFSG[s].main_group_id for s in self._groups(cas)} for cas in solution.cas}
        for i, a in enumerate(solution.cas):
            for b in solution.cas[i + 1:]:
                missing = [(m, n) for m in mains[a] for n in mains[b] if m != n and n not in DOUFIP2016.get(m, {})]
                if missing:
                    raise PropertyError(f"aqueous-mixing: modified UNIFAC (Dortmund) has no published interaction "
                                        f"parameters between {_name(a)} and {_name(b)} (main groups {missing[0]}), "
                                        f"so the bubble pressure of {solution.label} is unknown; give the line's "
                                        f"density, viscosity and vapour_pressure")

    def _liquid(self, cas: tuple[str, ...]) -> Any:
        """thermo's GibbsExcessLiquid of the components with modified UNIFAC (built once per set)."""
        liquid = self._liquids.get(cas)
        if liquid is None:
            liquid = self._liquids[cas] = unifac_liquid(cas, [self._groups(c) for c in cas])
        return liquid


@functools.lru_cache(maxsize=1)
def _mdea_rackett() -> tuple[float, float, float]:
    """MDEA's (Tc [K], R Tc / Pc [m3/mol], Z_RA) with Z_RA fitted to the density anchor."""
    from chemicals import MW, Pc, Tc

    tc, pc, molar_mass = Tc(_MDEA), Pc(_MDEA), MW(_MDEA) / 1000.0
    scale = 8.314462618 * tc / pc
    t_anchor, rho_anchor = _MDEA_ANCHOR
    exponent = 1.0 + (1.0 - t_anchor / tc) ** (2.0 / 7.0)
    z_ra = (molar_mass / rho_anchor / scale) ** (1.0 / exponent)
    return tc, scale, z_ra


def _mdea_volume(temperature: float) -> float:
    """MDEA saturated-liquid molar volume [m3/mol] by the modified Rackett equation."""
    tc, scale, z_ra = _mdea_rackett()
    return float(scale * z_ra ** (1.0 + (1.0 - min(temperature / tc, 1.0)) ** (2.0 / 7.0)))


