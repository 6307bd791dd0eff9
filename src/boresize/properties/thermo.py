"""Mixtures, and pure fluids CoolProp lacks, from thermo and chemicals with a cubic equation of state.

The fluid is a composition (:mod:`boresize.properties.composition`: names, formulas, CAS numbers or
shorthands with mole or mass fractions) or one component name. The EOS is the line's ``eos``
(:data:`EOS_ALIASES`; Peng-Robinson when not given). The methods of each phase are listed in
:mod:`boresize.properties.thermo_phases` and named in every state's ``model`` text, with the thermo
and chemicals versions, the EOS and the state point.

Phase. A mixture is flashed (thermo ``FlashVL``, one liquid phase: a water-hydrocarbon system that
forms two liquids is outside this backend). "V" -> gas, "L" -> liquid (supercritical above its
pseudo-critical temperature), "VL" -> two-phase with the homogeneous density and McAdams viscosity and
the vapour mass fraction. A liquid's bubble pressure at T is its ``vapour_pressure`` (criteria read it);
a two-phase state at the line's own conditions also carries the bubble and dew pressures. A gas gets no
dew-point search by default (a search that finds none costs ~0.4 s): :meth:`ThermoBackend.saturation_pressures`
gives both on request. ``vapour_fraction`` is the vapour mass fraction (0 for a liquid, 1 for a gas).

Speed. Results are cached per (composition, EOS, pressure, temperature); thermo packages are built
once per process (:func:`~boresize.properties.thermo_phases.load_package`). Once a flash has found a
liquid above its bubble pressure at T, a later call at the same T and a pressure at least
:data:`LIQUID_MARGIN` times that bubble pressure evaluates the liquid directly, without a flash: a
liquid compressed further above its bubble point stays liquid. Likewise, after
:data:`GAS_FLASHES_BEFORE_CHECK` gas flashes at one T (a gas line marched segment by segment), the
backend searches the bubble and dew points at T once; when there are none (or T is above every
component's critical temperature), later gas states at that T are evaluated without a flash.

Traps avoided (measured, thermo 0.6.1): a plain cubic EOS liquid density (water -15 %), a gas viscosity
that ignores pressure, fractions that do not sum to 1 accepted silently, a bare ValueError for an
unknown name: see the module docs named above.
"""

from __future__ import annotations

import collections
import functools
import math
import threading
from dataclasses import dataclass

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Line
from boresize.properties.base import check_absolute, check_plausible, describe_conditions
from boresize.properties.composition import Basis, Composition, basis_of, parse_composition
from boresize.properties.coolprop import SATURATION_TOLERANCE, is_mixture
from boresize.properties.thermo_evaluate import evaluate_mixture, evaluate_pure, gas_direct, liquid_direct, no_envelope
from boresize.properties.saturation import refuse_quality

__all__ = ["ThermoBackend", "EOS_ALIASES", "GAS_FLASHES_BEFORE_CHECK", "LIQUID_MARGIN", "LIQUID_VISCOSITY_MIN",
           "eos_id"]

#: Spellings of the EOS column -> EOS id (matched upper-case, spaces and underscores as hyphens).
EOS_ALIASES: dict[str, str] = {
    "PR": "PR", "PENG-ROBINSON": "PR", "PR76": "PR", "PR78": "PR78", "SRK": "SRK", "SOAVE": "SRK",
    "SOAVE-REDLICH-KWONG": "SRK", "TWU-PR": "TWU-PR", "PR-TRANSLATED": "PR-TRANSLATED", "PR-T": "PR-TRANSLATED",
    "SRK-TRANSLATED": "SRK-TRANSLATED", "SRK-T": "SRK-TRANSLATED",
}
#: Pressure over the known bubble pressure above which a liquid is evaluated without a flash [-].
LIQUID_MARGIN = 1.05
#: Gas flashes of one mixture at one temperature after which the backend checks, once, whether the
#: mixture has a two-phase region there; if not, later gas states at that temperature skip the flash.
GAS_FLASHES_BEFORE_CHECK = 3
#: Lowest plausible liquid viscosity [Pa s] (plausibility guard, common practice).
LIQUID_VISCOSITY_MIN = 1e-5


def eos_id(text: str | None) -> str:
    """The EOS id for the line's ``eos`` text ("PR" when None).

    :raises InputError: (field "eos") for an EOS this backend does not offer
    """
    if text is None or not text.strip():
        return "PR"
    key = "-".join(text.strip().upper().replace("_", " ").split())
    if key not in EOS_ALIASES:
        raise InputError(f"unknown equation of state {text!r} for the thermo backend", field="eos", value=text,
                         expected="one of PR, PR78, SRK, Twu-PR, PR-translated, SRK-translated")
    return EOS_ALIASES[key]


@dataclass(frozen=True)
class Fluid:
    """A resolved fluid: database names, CAS numbers, mole fractions, and the parse note."""

    label: str
    names: tuple[str, ...]
    cas: tuple[str, ...]
    zs: tuple[float, ...]
    note: str | None = None


class ThermoBackend:
    """Mixtures by components (and pure fluids CoolProp does not know) through thermo + chemicals.

    :param cache_size: number of (fluid, EOS, pressure, temperature) results kept [-]
    """

    id = "thermo"
    title = "thermo + chemicals (mixtures, cubic equations of state)"

    def __init__(self, cache_size: int = 4096) -> None:
        self._lock = threading.RLock()
        self._cached = functools.lru_cache(maxsize=cache_size)(self._compute)
        self._known: dict[tuple[Fluid, str, float], tuple[str, float | None]] = {}
        self._gas_flashes: collections.Counter[tuple[Fluid, str, float]] = collections.Counter()

    def version(self) -> str:
        """thermo's version, read from the installed distribution (no import)."""
        from boresize.properties.thermo_phases import thermo_version

        return thermo_version()

    def handles(self, line: Line) -> bool:
        """True for a mixture (not a CoolProp incompressible) or a component the chemicals database knows,
        unless the line gives its own density and viscosity."""
        from boresize.properties.coolprop_mixture import is_incompressible

        if line.density is not None and line.viscosity is not None or is_incompressible(line.fluid):
            return False
        if is_mixture(line.fluid):
            return True
        from boresize.properties.components import is_known_component

        return is_known_component(line.fluid)

    def fluid(self, text: str, basis: Basis | None = None) -> Fluid:
        """Parse and resolve ``text`` (a composition or one component).

        :raises InputError: (field "fluid") unknown component (with close matches), unreadable
            composition, or fractions whose sum is more than 1 % from 1
        """
        return _resolve(text, basis)

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Properties of ``line.fluid`` at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises InputError: fluid (field "fluid"), EOS ("eos"), pressure or temperature not above zero
        :raises PropertyError: a failed flash (naming the fluid, the EOS and the conditions), or a
            property outside the plausible range
        """
        refuse_quality(line, self.id)  # a saturated state by quality: pure fluids of coolprop only
        check_absolute(pressure, temperature)
        fluid = self.fluid(line.fluid, basis_of(line.extra))
        eos = eos_id(line.eos)
        own = math.isclose(pressure, line.pressure) and math.isclose(temperature, line.temperature)
        return self._cached(fluid, eos, float(pressure), float(temperature), line.phase, own)

    def saturation_pressures(self, line: Line, temperature: float) -> tuple[float | None, float | None]:
        """(bubble, dew) pressure [Pa abs] of the line's mixture at ``temperature`` [K]; None where the
        search finds none (above the cricondentherm, for instance). For one component, both are its
        vapour pressure (None above its critical temperature)."""
        from boresize.properties.thermo_phases import load_package

        fluid = self.fluid(line.fluid, basis_of(line.extra))
        package = load_package(fluid.cas, eos_id(line.eos))
        with self._lock:
            if len(fluid.cas) == 1:
                pressure = package.vapour_pressure(temperature)
                return pressure, pressure
            return (package.saturation_pressure(temperature, fluid.zs, 0.0),
                    package.saturation_pressure(temperature, fluid.zs, 1.0))

    def cache_clear(self) -> None:
        """Forget cached results and phase decisions (thermo packages are kept)."""
        self._cached.cache_clear()
        self._known.clear()
        self._gas_flashes.clear()

    # --- internals -----------------------------------------------------------------------------
    def _compute(self, fluid: Fluid, eos: str, pressure: float, temperature: float, hint: str | None,
                 own: bool) -> FluidState:
        where = f"{fluid.label} at {describe_conditions(pressure, temperature)} ({eos})"
        with self._lock:
            try:
                state = self._evaluate(fluid, eos, pressure, temperature, hint, own)
            except (InputError, PropertyError):
                raise
            except Exception as exc:  # thermo reports a failed flash with assorted exception types
                raise PropertyError(f"thermo: flash failed for {where}: {type(exc).__name__}: {exc}") from exc
        check_plausible(state.density, state.viscosity, backend=self.id, fluid=fluid.label,
                        pressure=pressure, temperature=temperature)
        if state.phase in ("liquid", "two-phase"):
            _refuse_two_liquids(fluid, where)
        if state.phase == "liquid" and state.viscosity < LIQUID_VISCOSITY_MIN:
            raise PropertyError(f"thermo: liquid viscosity {state.viscosity:.6g} Pa s for {where} is below the "
                                f"plausible {LIQUID_VISCOSITY_MIN:g} Pa s")
        return state

    def _evaluate(self, fluid: Fluid, eos: str, pressure: float, temperature: float, hint: str | None,
                  own: bool) -> FluidState:
        from boresize.properties.thermo_phases import load_package

        package = load_package(fluid.cas, eos)
        if len(fluid.cas) == 1:
            return evaluate_pure(package, fluid, eos, pressure, temperature, hint, SATURATION_TOLERANCE)
        key = (fluid, eos, temperature)
        phase, bubble = self._known.get(key, ("", None))
        if phase == "liquid" and bubble is not None and pressure >= LIQUID_MARGIN * bubble:
            return liquid_direct(package, fluid, eos, pressure, temperature, bubble)
        if phase == "gas":
            return gas_direct(package, fluid, eos, pressure, temperature)
        state = evaluate_mixture(package, fluid, eos, pressure, temperature, own)
        if state.phase == "liquid" and state.bubble_pressure is not None and pressure > state.bubble_pressure:
            self._known[key] = ("liquid", state.bubble_pressure)
        elif state.phase == "gas":
            self._gas_flashes[key] += 1
            if self._gas_flashes[key] == GAS_FLASHES_BEFORE_CHECK and no_envelope(package, fluid, temperature):
                self._known[key] = ("gas", None)
        return state


WATER_CAS = "7732-18-5"
#: Mole fraction above which water, and C3+ hydrocarbons together, count as a liquid phase of their own [-]
IMMISCIBLE_FRACTION = 0.01


@functools.lru_cache(maxsize=256)
def _heavy_hydrocarbon(cas: str) -> bool:
    """True for a hydrocarbon (carbon and hydrogen only) with three or more carbon atoms."""
    from chemicals.elements import simple_formula_parser
    from chemicals.identifiers import search_chemical

    atoms = simple_formula_parser(search_chemical(cas).formula)
    return set(atoms) == {"C", "H"} and atoms["C"] >= 3


def _refuse_two_liquids(fluid: Fluid, where: str) -> None:
    """A liquid with water and C3+ hydrocarbons (each above 1 mol %) splits into two liquid phases, which
    this backend's flash cannot represent: it would report one liquid with a wrong density (water/hexane
    came out at 667 kg/m3). Refuse it rather than give a plausible wrong number."""
    zs = dict(zip(fluid.cas, fluid.zs))
    water = zs.get(WATER_CAS, 0.0)
    heavy = sum(z for cas, z in zs.items() if cas != WATER_CAS and _heavy_hydrocarbon(cas))
    if water > IMMISCIBLE_FRACTION and heavy > IMMISCIBLE_FRACTION:
        raise InputError(
            f"water ({water:.3g} mol) and C3+ hydrocarbons ({heavy:.3g} mol) form two liquid phases in {where}; "
            f"the thermo backend models one liquid, so its density and viscosity would be wrong",
            field="fluid", value=fluid.label,
            expected="the water and hydrocarbon liquids sized as separate streams, or the line's own density "
                     "and viscosity")


@functools.lru_cache(maxsize=1024)  # measured: +17 % on mixtures (benchmarks/bench_parsing.py thermo-names)
def _resolve(text: str, basis: Basis | None) -> Fluid:
    """Parse a composition or a single component and resolve every name (cached per text)."""
    from boresize.properties.components import resolve_component
    from boresize.properties.mixing import mole_fractions

    composition = (parse_composition(text, basis=basis) if is_mixture(text)
                   else Composition((text.strip(),), (1.0,), "mole", 1.0))
    components = [resolve_component(name) for name in composition.components]
    merged: dict[str, float] = {}
    for component, fraction in zip(components, composition.fractions):
        if component.cas in merged:
            raise InputError(f"{component.given!r} names {component.name} again", field="fluid", value=text,
                             expected="each component once")
        merged[component.cas] = fraction
    fractions = tuple(merged.values())
    if composition.basis == "mass":
        fractions = mole_fractions(fractions, [c.molar_mass for c in components])
    names = tuple(c.name for c in components)
    label = names[0] if len(names) == 1 else ", ".join(f"{n} {z:.4g}" for n, z in zip(names, fractions))
    notes = [composition.note] if composition.note else []
    notes += [c.note for c in components if c.note]  # a name read through a database synonym: say as what
    return Fluid(label, names, tuple(merged), fractions, "; ".join(notes) or None)
