"""Natural gas and other GERG-2008 component sets: GERG-2008 (ISO 20765-2) through CoolProp. Backend id
``gerg-2008``, chosen automatically for a mixture whose components all belong to :data:`GERG_COMPONENTS`
(the 21 components of GERG-2008) and whose line names no other equation of state; ``backend = thermo``
still gets thermo's cubic EOS.

Model. CoolProp's HEOS multi-fluid model with the GERG-2008 mixture parameters and departure functions
(Kunz & Wagner 2012) for every pair of these components; the pure-fluid parts are CoolProp's reference
equations of state, not GERG-2008's own simpler ones (the model text says so). Family "natural gas" when
methane is at least half the moles, else "GERG-2008 component set" (a CO2/N2 mix, hydrogen blends).

Validity (Kunz & Wagner 2012, from memory): normal range 90-450 K up to 35 MPa; extended range
60-700 K up to 70 MPa. A state outside the normal range but inside the extended one carries a note
saying so; outside the extended range it is a :class:`~boresize.errors.PropertyError` naming the range.

Phase, decided before CoolProp is asked (CoolProp's unconstrained mixture PT flash costs 12-100 ms and
can be wrong near a dew curve; a state with its phase imposed costs 0.2-1.5 ms). Once per composition,
CoolProp traces the GERG-2008 phase envelope (20-200 ms); it is trusted when the curve rises to its highest
temperature (the cricondentherm) and falls again, so that maximum is not the end of a truncated trace.

* More than :data:`CRICONDENTHERM_MARGIN` above the cricondentherm no pressure is two-phase: the gas phase
  is imposed ("dense" above the pseudo-critical density, else "gas"). This is the natural-gas fast path.
* Below that, and above both ends of the traced curve, the crossings of the curve at T decide: an odd
  number of crossings above p -> two-phase (CoolProp's own flash gives the vapour fraction; a two-phase
  line is an error until two-phase sizing exists; where that flash finds one phase the state is refused as
  too close to the curve); above the top crossing -> liquid when it is a bubble point (the bulk phase the
  denser one), gas-like above an upper dew point; below every crossing -> gas. A liquid gets CoolProp with
  the liquid phase imposed, the envelope's bubble pressure at T as its vapour pressure, and the liquid
  guards of :mod:`boresize.properties.coolprop_heos` (wrong root, viscosity against log mixing).
* Without a trusted envelope (water, heavy ends) or below the curve's end temperatures, thermo's flash
  (Peng-Robinson, :mod:`boresize.properties.thermo`) decides; gas and liquid then get CoolProp with that
  phase imposed, and a two-phase state is thermo's own, with a note.

Liquids of these components (LPG, dense CO2) stay on CoolProp rather than thermo's liquid: closer to the
pure-fluid reference where it matters (measured: CO2/N2 98/2 at 20 degC, 100 bar abs: HEOS 823 kg/m3,
thermo 795, pure CO2 856; propane/n-butane 98/2 at 20 degC, 20 bar abs: HEOS 505.3, thermo 505.6, pure
propane 503.3).
"""

from __future__ import annotations

import functools
import math
import threading
from dataclasses import dataclass, replace
from typing import Any

from boresize.errors import BoresizeError, InputError, PropertyError
from boresize.model import Flow, FluidState, Line, Phase
from boresize.properties.base import ZERO_CELSIUS, check_absolute, check_plausible, describe_conditions, is_mixture
from boresize.properties.coolprop_heos import GAS_Z_RANGE

__all__ = ["GergBackend", "GERG_COMPONENTS", "NORMAL_RANGE", "EXTENDED_RANGE", "CRICONDENTHERM_MARGIN",
           "NATURAL_GAS_METHANE", "is_gerg_set"]

#: CAS number -> CoolProp name of the 21 GERG-2008 components (ISO 20765-2; Kunz & Wagner 2012).
GERG_COMPONENTS: dict[str, str] = {
    "74-82-8": "Methane", "7727-37-9": "Nitrogen", "124-38-9": "CarbonDioxide", "74-84-0": "Ethane",
    "74-98-6": "Propane", "106-97-8": "n-Butane", "75-28-5": "IsoButane", "109-66-0": "n-Pentane",
    "78-78-4": "Isopentane", "110-54-3": "n-Hexane", "142-82-5": "n-Heptane", "111-65-9": "n-Octane",
    "111-84-2": "n-Nonane", "124-18-5": "n-Decane", "1333-74-0": "Hydrogen", "7782-44-7": "Oxygen",
    "630-08-0": "CarbonMonoxide", "7732-18-5": "Water", "7783-06-4": "HydrogenSulfide", "7440-59-7": "Helium",
    "7440-37-1": "Argon",
}
#: GERG-2008 normal range: (T min [K], T max [K], p max [Pa]) (Kunz & Wagner 2012, from memory).
NORMAL_RANGE = (90.0, 450.0, 35e6)
#: GERG-2008 extended range: (T min [K], T max [K], p max [Pa]) (Kunz & Wagner 2012, from memory).
EXTENDED_RANGE = (60.0, 700.0, 70e6)
#: Temperature above the cricondentherm beyond which the gas phase is imposed without a flash [K].
CRICONDENTHERM_MARGIN = 2.0
#: Methane mole fraction from which a GERG-2008 mixture is called "natural gas" [-].
NATURAL_GAS_METHANE = 0.5
VALIDITY = ("GERG-2008 normal range 90-450 K, up to 35 MPa; extended range 60-700 K, up to 70 MPa "
            "(Kunz & Wagner 2012)")


def is_gerg_set(cas: tuple[str, ...]) -> bool:
    """True when every component (CAS number) is one of the 21 GERG-2008 components."""
    return all(c in GERG_COMPONENTS for c in cas)


@dataclass(frozen=True)
class Envelope:
    """CoolProp's phase envelope of one composition, as the phase decision reads it.

    :ivar points: (T [K], ln p [ln Pa], bubble side) along the traced curve, from the low-pressure dew end; a
        point is on the bubble side when the bulk phase is the denser one (past the critical point); empty when
        CoolProp could not trace a trusted envelope
    :ivar cricondentherm: highest temperature on the curve [K] (None without a trusted envelope)
    :ivar t_low: the ray test is used only above this temperature [K] (the higher of the curve's two end
        temperatures, so that the unknown closing of the curve is never crossed)
    :ivar rho_critical: pseudo-critical molar density [mol/m3] (molar average of the components' critical
        volumes), splitting a "gas" from a "dense" single-phase state
    :ivar molar_mass: [kg/mol]
    """

    points: tuple[tuple[float, float, bool], ...]
    cricondentherm: float | None
    t_low: float
    rho_critical: float
    molar_mass: float

    def crossings(self, temperature: float) -> list[tuple[float, bool]]:
        """(pressure [Pa abs], bubble side) where the curve crosses ``temperature`` [K], lowest first."""
        found = []
        for (t1, lnp1, bubble1), (t2, lnp2, _) in zip(self.points, self.points[1:]):
            if (t1 - temperature) * (t2 - temperature) <= 0.0 and t1 != t2:
                share = (temperature - t1) / (t2 - t1)
                found.append((math.exp(lnp1 + share * (lnp2 - lnp1)), bubble1))
        return sorted(found)


class GergBackend:
    """GERG-2008 through CoolProp HEOS for mixtures of the 21 GERG-2008 components.

    :param cache_size: number of (composition, pressure, temperature) results kept [-]
    """

    id = "gerg-2008"
    title = "GERG-2008 (ISO 20765-2) through CoolProp HEOS: natural gas and other GERG-2008 component sets"

    def __init__(self, cache_size: int = 4096) -> None:
        from boresize.properties.coolprop_mixture import CoolPropMixtureBackend
        from boresize.properties.thermo import ThermoBackend

        self._lock = threading.RLock()
        self._thermo = ThermoBackend()
        self._heos = CoolPropMixtureBackend()  # its liquid guards and pure-fluid viscosities
        self._states: dict[tuple[tuple[str, ...], tuple[float, ...]], Any] = {}
        self._envelopes: dict[tuple[tuple[str, ...], tuple[float, ...]], Envelope] = {}
        self._cached = functools.lru_cache(maxsize=cache_size)(self._compute)

    def version(self) -> str:
        """CoolProp's version (no import)."""
        from boresize.properties.coolprop import _coolprop_version

        return _coolprop_version()

    def handles(self, line: Line) -> bool:
        """True for a mixture of GERG-2008 components only, with no other EOS named and no own properties."""
        if line.density is not None and line.viscosity is not None or not is_mixture(line.fluid):
            return False
        if line.eos and line.eos.strip().upper() not in ("GERG-2008", "GERG", "HEOS"):
            return False
        from boresize.properties.coolprop_mixture import is_incompressible

        if is_incompressible(line.fluid):
            return False
        try:
            fluid = self._thermo.fluid(line.fluid, _basis(line))
        except InputError:
            return False  # thermo explains the mistake (it is chosen next and resolves names with close matches)
        return len(fluid.cas) > 1 and is_gerg_set(fluid.cas)

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Properties at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises InputError: a component outside GERG-2008 (field "fluid"), an unknown EOS ("eos"), a pressure
            or temperature not above zero
        :raises PropertyError: outside GERG-2008's extended range, CoolProp failed, or a guard refused its result
        """
        from boresize.properties.saturation import refuse_quality

        refuse_quality(line, self.id)
        if line.eos and line.eos.strip().upper() not in ("GERG-2008", "GERG", "HEOS"):
            raise InputError(f"the gerg-2008 backend has no equation of state {line.eos!r}", field="eos",
                             value=line.eos, expected="GERG-2008 (or leave eos blank); backend thermo offers cubic EOS")
        check_absolute(pressure, temperature)
        fluid = self._thermo.fluid(line.fluid, _basis(line))
        outside = [name for name, cas in zip(fluid.names, fluid.cas) if cas not in GERG_COMPONENTS]
        if outside:
            raise InputError(f"{', '.join(outside)} is not a GERG-2008 component", field="fluid", value=line.fluid,
                             expected="the 21 GERG-2008 components (methane to n-decane, N2, CO2, H2, O2, CO, water, "
                                      "H2S, helium, argon), or backend thermo")
        if len(fluid.cas) < 2:
            raise InputError("a pure fluid is not a GERG-2008 mixture", field="fluid", value=line.fluid,
                             expected="a mixture, or backend coolprop for a pure fluid")
        return self._cached(fluid, float(pressure), float(temperature))

    def cache_clear(self) -> None:
        """Forget cached results (AbstractStates and envelopes are kept)."""
        self._cached.cache_clear()

    # --- internals -----------------------------------------------------------------------------
    def _compute(self, fluid: Any, pressure: float, temperature: float) -> FluidState:
        notes = _range_notes(pressure, temperature)
        names = tuple(GERG_COMPONENTS[c] for c in fluid.cas)
        key = (names, tuple(fluid.zs))
        where = f"{fluid.label} at {describe_conditions(pressure, temperature)}"
        with self._lock:
            try:
                state = self._state_for(key)
                envelope = self._envelope(key)
                if (envelope.cricondentherm is not None
                        and temperature > envelope.cricondentherm + CRICONDENTHERM_MARGIN):
                    how = (f"gas phase imposed: above the cricondentherm "
                           f"{envelope.cricondentherm - ZERO_CELSIUS:.4g} degC of the GERG-2008 phase envelope")
                    return self._single(fluid, state, envelope, "gas", pressure, temperature, notes + (how,))
                if envelope.cricondentherm is not None and temperature > envelope.t_low:
                    return self._by_envelope(fluid, state, envelope, pressure, temperature, notes)
                text = ", ".join(f"{cas}:{z!r}" for cas, z in zip(fluid.cas, fluid.zs))
                probe = Line(tag="gerg-2008 phase", fluid=text, flow=Flow("mass", 1.0), pressure=pressure,
                             temperature=temperature)
                try:
                    decided = self._thermo.state(probe, pressure, temperature)
                except PropertyError as exc:
                    raise PropertyError(f"gerg-2008: the GERG-2008 phase envelope does not decide the phase of {where}; thermo's "
                                        f"flash, which then decides the phase, failed ({exc})") from None
                if decided.phase in ("gas", "supercritical"):
                    how = "gas phase imposed: thermo's Peng-Robinson flash found one gas phase"
                    return self._single(fluid, state, envelope, "gas", pressure, temperature, notes + (how,))
                if decided.phase in ("liquid", "dense"):
                    how = "liquid phase imposed: thermo's Peng-Robinson flash found one liquid phase"
                    return self._single(fluid, state, envelope, "liquid", pressure, temperature, notes + (how,),
                                        decided.bubble_pressure or decided.vapour_pressure)
            except BoresizeError:
                raise  # already names the line's fault (two liquid phases, a range): not CoolProp's
            except ValueError as exc:
                raise PropertyError(f"gerg-2008: CoolProp failed for {where}: {exc}") from None
        return replace(decided, family=_family(fluid), validity=VALIDITY,
                       notes=decided.notes + notes + ("two-phase by thermo's Peng-Robinson flash: the GERG-2008 "
                                                      "path gives single-phase states only",))

    def _by_envelope(self, fluid: Any, state: Any, envelope: Envelope, pressure: float, temperature: float,
                     notes: tuple[str, ...]) -> FluidState:
        """The phase from where (p, T) lies against the envelope's curve at T: between a dew and a bubble (or a
        second dew) crossing -> two-phase; above the top crossing -> liquid when that crossing is a bubble point,
        else gas-like; below every crossing -> gas."""
        crossings = envelope.crossings(temperature)
        above = [c for c in crossings if c[0] > pressure]
        below = [c for c in crossings if c[0] <= pressure]
        at = f"at {temperature - ZERO_CELSIUS:.4g} degC"
        if len(above) % 2 == 1:
            return self._two_phase(fluid, state, pressure, temperature, notes, crossings)
        if not below or above:
            how = (f"gas phase imposed: below the dew pressure {crossings[0][0] / 1e5:.4g} bar abs {at} of the "
                   f"GERG-2008 phase envelope" if crossings else "gas phase imposed: no envelope crossing " + at)
            return self._single(fluid, state, envelope, "gas", pressure, temperature, notes + (how,))
        top, bubble_side = below[-1]
        if bubble_side:
            how = f"liquid phase imposed: above the bubble pressure {top / 1e5:.4g} bar abs {at} (GERG-2008 envelope)"
            return self._single(fluid, state, envelope, "liquid", pressure, temperature, notes + (how,), top)
        how = f"gas phase imposed: above the upper dew pressure {top / 1e5:.4g} bar abs {at} (GERG-2008 envelope)"
        return self._single(fluid, state, envelope, "gas", pressure, temperature, notes + (how,))

    def _two_phase(self, fluid: Any, state: Any, pressure: float, temperature: float, notes: tuple[str, ...],
                   crossings: list[tuple[float, bool]]) -> FluidState:
        """A two-phase state: CoolProp's own flash (each phase's density and viscosity, no surface tension),
        with the envelope's bubble and dew pressures at T."""

        from boresize.properties.coolprop_heos import heos_point

        names = tuple(GERG_COMPONENTS[c] for c in fluid.cas)
        dew = max((p for p, bubble in crossings if not bubble and p <= pressure), default=None)
        bubble = min((p for p, bubble in crossings if bubble and p > pressure), default=None)
        state.unspecify_phase()
        point = heos_point(state, self._heos._heos_phases(names), names, pressure, temperature, False)
        inside = (f"inside the GERG-2008 phase envelope at {describe_conditions(pressure, temperature)}"
                  + (f" (dew pressure {dew / 1e5:.4g} bar abs)" if dew else ""))
        if point.phase != "two-phase":
            raise PropertyError(f"gerg-2008: {fluid.label} is {inside}, but CoolProp's flash finds one {point.phase} "
                                f"phase there: too close to the dew or bubble curve to size as one phase")
        model = (f"GERG-2008 (ISO 20765-2) through CoolProp {self.version()} HEOS flash; {inside}"
                 + "".join(f"; {n}" for n in notes + point.notes))
        return FluidState(density=point.density, viscosity=point.viscosity, phase="two-phase", source=self.id,
                          model=model, vapour_fraction=point.quality, molar_mass=float(state.molar_mass()),
                          fluid_name=fluid.label, bubble_pressure=bubble, dew_pressure=dew, eos="GERG-2008",
                          backend_version=self.version(), pressure=pressure, temperature=temperature,
                          composition=tuple(zip(fluid.names, fluid.zs)), notes=notes + point.notes,
                          family=_family(fluid), validity=VALIDITY, **point.phase_fields())

    def _single(self, fluid: Any, state: Any, envelope: Envelope, phase: str, pressure: float, temperature: float,
                notes: tuple[str, ...], bubble_pressure: float | None = None) -> FluidState:
        """One phase, imposed on CoolProp: gas ("dense" above the pseudo-critical density) or liquid (with its
        bubble pressure [Pa abs] and the liquid guards)."""
        from CoolProp import CoolProp as CP

        from boresize.properties.coolprop_heos import Point, guard_state

        state.specify_phase(CP.iphase_gas if phase == "gas" else CP.iphase_liquid)
        try:
            state.update(CP.PT_INPUTS, pressure, temperature)
        except ValueError:
            if phase != "gas":
                raise
            state.specify_phase(CP.iphase_supercritical)  # a dense gas: CoolProp's gas guess misses (50 MPa, 300 K)
            state.update(CP.PT_INPUTS, pressure, temperature)
        density, viscosity, z, sound = state.rhomass(), state.viscosity(), state.compressibility_factor(), state.speed_sound()
        label: Phase = "liquid"
        bubble = None
        if phase == "gas":
            label = "dense" if state.rhomolar() > envelope.rho_critical else "gas"
            if not (GAS_Z_RANGE[0] < z <= GAS_Z_RANGE[1]):
                raise PropertyError(f"gerg-2008: compressibility factor Z = {z:.6g} for {fluid.label} at "
                                    f"{describe_conditions(pressure, temperature)} is outside {GAS_Z_RANGE[0]:g} "
                                    f"to {GAS_Z_RANGE[1]:g}: CoolProp's state is not trusted")
        else:
            names = tuple(GERG_COMPONENTS[c] for c in fluid.cas)
            guard_state(self._heos, state, names, tuple(fluid.zs),
                        Point("liquid", density, viscosity, 0.0, sound), pressure, temperature, fluid.label)
            bubble = bubble_pressure
        check_plausible(density, viscosity, backend=self.id, fluid=fluid.label, pressure=pressure,
                        temperature=temperature)
        version = self.version()
        model = (f"GERG-2008 (ISO 20765-2) through CoolProp {version} HEOS: GERG-2008 mixture parameters "
                 f"(Kunz & Wagner 2012) with CoolProp's reference pure-fluid equations; at "
                 f"{describe_conditions(pressure, temperature)}" + "".join(f"; {n}" for n in notes))
        return FluidState(density=density, viscosity=viscosity, phase=label, source=self.id, model=model,
                          vapour_fraction=1.0 if phase == "gas" else 0.0, speed_of_sound=sound,
                          vapour_pressure=bubble, bubble_pressure=bubble, molar_mass=envelope.molar_mass,
                          fluid_name=fluid.label, backend_version=version, eos="GERG-2008", pressure=pressure,
                          temperature=temperature, composition=tuple(zip(fluid.names, fluid.zs)), notes=notes,
                          family=_family(fluid), validity=VALIDITY)

    def _state_for(self, key: tuple[tuple[str, ...], tuple[float, ...]]) -> Any:
        if key not in self._states:
            from CoolProp import CoolProp as CP

            state = CP.AbstractState("HEOS", "&".join(key[0]))
            state.set_mole_fractions(list(key[1]))
            self._states[key] = state
        return self._states[key]

    def _envelope(self, key: tuple[tuple[str, ...], tuple[float, ...]]) -> Envelope:
        """The composition's phase envelope from CoolProp (once per composition)."""
        if key not in self._envelopes:
            from CoolProp import CoolProp as CP

            names, zs = key
            state = CP.AbstractState("HEOS", "&".join(names))
            state.set_mole_fractions(list(zs))
            volume = math.fsum(z / state.get_fluid_constant(i, CP.irhomolar_critical) for i, z in enumerate(zs))
            points: tuple[tuple[float, float, bool], ...] = ()
            tmax, t_low = None, math.inf
            try:
                state.build_phase_envelope("none")
                data = state.get_phase_envelope_data()
                temperatures = list(data.T)
                top = max(range(len(temperatures)), key=temperatures.__getitem__) if temperatures else 0
                if 0 < top < len(temperatures) - 1 and temperatures[-1] < temperatures[top] - 1.0 and all(
                        math.isfinite(t) for t in temperatures):
                    points = tuple((t, lnp, bulk > other) for t, lnp, bulk, other in
                                   zip(temperatures, data.lnp, data.rhomolar_vap, data.rhomolar_liq))
                    tmax, t_low = temperatures[top], max(temperatures[0], temperatures[-1])
            except ValueError:  # CoolProp could not trace the envelope (water, heavy ends): thermo decides
                pass
            self._envelopes[key] = Envelope(points, tmax, t_low, 1.0 / volume, state.molar_mass())
        return self._envelopes[key]


def _basis(line: Line) -> Any:
    from boresize.properties.composition import basis_of

    return basis_of(line.extra)


def _family(fluid: Any) -> str:
    methane = dict(zip(fluid.cas, fluid.zs)).get("74-82-8", 0.0)
    return "natural gas" if methane >= NATURAL_GAS_METHANE else "GERG-2008 component set"


def _range_notes(pressure: float, temperature: float) -> tuple[str, ...]:
    """A note outside GERG-2008's normal range; PropertyError outside its extended range."""
    where = describe_conditions(pressure, temperature)
    low, high, top = EXTENDED_RANGE
    if not (low <= temperature <= high and pressure <= top):
        raise PropertyError(f"gerg-2008: {where} is outside the GERG-2008 extended range ({low:g}-{high:g} K, up "
                            f"to {top / 1e6:g} MPa; Kunz & Wagner 2012)")
    low, high, top = NORMAL_RANGE
    if not (low <= temperature <= high and pressure <= top):
        return (f"outside the GERG-2008 normal range ({low:g}-{high:g} K, up to {top / 1e6:g} MPa), inside its "
                f"extended range: larger uncertainty",)
    return ()
