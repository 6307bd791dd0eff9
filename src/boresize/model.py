"""The data that flows through boresize, as frozen dataclasses.

Inside boresize every number is a plain float in SI units (kg, m, s, Pa absolute, K).
Conversion from what the user typed happens once, in :mod:`boresize.units` and
:mod:`boresize.io.rows`.
"""

from __future__ import annotations

import sys
from collections.abc import Callable, Sequence
from dataclasses import MISSING, dataclass, field, fields
from typing import Any, Literal, TypeVar

__all__ = [
    "BareReading",
    "bare_pressure_count",
    "bare_pressure_note",
    "bare_pressure_text",
    "Flow",
    "Line",
    "FluidState",
    "Candidate",
    "Hydraulics",
    "TwoPhaseFlow",
    "Verdict",
    "CandidateResult",
    "LineResult",
    "VerdictStatus",
    "Phase",
    "Mode",
]

_Record = TypeVar("_Record")

#: each record class filled through its ``__dict__`` -> the ``__init__`` its ``@dataclass`` wrote (the benchmark
#: ``bench_hotpath.py --trick lean-records`` (or ``dict-filled``) puts them back to measure the trick)
PLAIN_INITS: dict[type, Callable[..., None]] = {}


# measured: lean-records +11 to +18 % of the rating of issue 19's 2,000 pure-fluid lines (CPU, medians and least
#   of 9-11 interleaved rounds; benchmarks/bench_hotpath.py --trick lean-records --rating --repeat 11)
def filled_through_dict(cls: type[_Record]) -> type[_Record]:
    """Give a frozen dataclass an ``__init__`` that fills the instance's ``__dict__`` directly (the same
    parameters, order and defaults) instead of one ``object.__setattr__`` a field, the way ``@dataclass(frozen=True)``
    writes it (10 us for the 29 fields of :class:`Hydraulics`). The instance is the same: the same fields, equal,
    hashed and shown alike, still frozen. Only for classes without ``__post_init__``, default factories or
    keyword-only fields (refused here). The cost: each instance holds a dict of its own, about 64 bytes more
    (CPython 3.11 keeps the fields of an instance never asked for its ``__dict__`` inline). Part of the trick
    ``lean-records``, with ``criteria.limits.judge_range`` writing only the reason text it returns: neither
    reliably gains 10 % alone (this one +3 to +16 %, that one +5 to +24 %, on the loaded machine)."""
    if hasattr(cls, "__post_init__"):
        raise TypeError(f"{cls.__name__} has a __post_init__")
    params, lines, defaults = [], [], {}
    for f in fields(cls):  # type: ignore[arg-type]
        if f.default_factory is not MISSING or f.kw_only is True or not f.init:
            raise TypeError(f"{cls.__name__}.{f.name} needs the dataclass __init__")
        if f.default is MISSING:
            params.append(f.name)
        else:
            defaults[f"_default_{f.name}"] = f.default
            params.append(f"{f.name}=_default_{f.name}")
        lines.append(f"    d[{f.name!r}] = {f.name}")
    # made by a factory run in the class's module, so that the typed signature resolves there (typing.get_type_hints,
    # inspect, IDEs) as the dataclass __init__'s does; the defaults come in as the factory's arguments
    made: dict[str, Any] = {}
    body = f"    def __init__(self, {', '.join(params)}):\n        d = self.__dict__\n" + \
        "\n".join("    " + line for line in lines)
    exec(f"def _make({', '.join(defaults)}):\n{body}\n    return __init__", sys.modules[cls.__module__].__dict__,
         made)
    init = made["_make"](**defaults)
    init.__qualname__ = f"{cls.__qualname__}.__init__"
    init.__module__ = cls.__module__
    init.__annotations__ = dict(cls.__init__.__annotations__)  # the typed signature plugin authors' tools show
    PLAIN_INITS[cls] = cls.__init__
    setattr(cls, "__init__", init)
    return cls


VerdictStatus = Literal["pass", "fail", "warn", "not-applicable", "error"]
#: The statuses that let a size pass (a warning does not stop it; a criterion that does not apply neither).
PASSING_STATUSES = frozenset({"pass", "warn", "not-applicable"})
#: ``dense``: above the critical point (T > Tc and p > pc) at a density above the critical density, a liquid-like
#: fluid; ``supercritical``: above the critical point at or below the critical density, gas-like
#: (:mod:`boresize.properties.coolprop` states the rule and its source).
Phase = Literal["liquid", "gas", "two-phase", "supercritical", "dense"]
FlowBasis = Literal["mass", "volume", "standard-volume", "molar"]
#: ``size`` picks the smallest size that passes; ``check`` rates the size the line names.
Mode = Literal["size", "check"]


@dataclass(frozen=True)
class Flow:
    """A flow as the user gave it, in SI.

    :param basis: ``mass`` [kg/s], ``volume`` (actual, at line conditions) [m3/s] or
        ``standard-volume`` [m3/s at the reference conditions] or ``molar`` [mol/s]
    :param value: the flow in the SI unit of its basis
    :param reference_t: reference temperature of a standard volume [K]
    :param reference_p: reference pressure of a standard volume [Pa abs]
    :param reference_name: a label for the reference conditions (e.g. "15 degC, 1.01325 bar")
    """

    basis: FlowBasis
    value: float
    reference_t: float | None = None
    reference_p: float | None = None
    reference_name: str | None = None


@dataclass(frozen=True)
class BareReading:
    """A pressure field given in a bare unit (``9 psi``, a header's ``[bar]``: neither gauge nor absolute).

    :param field: the field ("pressure", "min_outlet_pressure" ...)
    :param shown: the cell as messages show it ("9 psi", "5 [bar]")
    :param number: the number as written ("9")
    :param gauge: the unit's gauge spelling ("psig"), "" when it has none (Pa, mbar)
    :param absolute: the unit's absolute spelling ("psia"), "" when it has none
    :param read_as: how it was read: "absolute" or "gauge" (one standard atmosphere added)
    """

    field: str
    shown: str
    number: str
    gauge: str
    absolute: str
    read_as: Literal["absolute", "gauge"]

    @property
    def note(self) -> str:
        """The note on the line: "pressure '9 psi' read as absolute (9 psia); write psig or psia to say which"."""
        if not self.gauge:
            return (f"{self.field} '{self.shown}' read as {self.read_as}; write it in a unit with g (gauge) or a "
                    "(absolute), such as barg or bara, to say which")
        spelling = self.gauge if self.read_as == "gauge" else self.absolute
        return (f"{self.field} '{self.shown}' read as {self.read_as} ({self.number} {spelling}); write {self.gauge} "
                f"or {self.absolute} to say which")


@dataclass(frozen=True)
class Line:
    """One line case, validated and in SI.

    :param pressure: inlet pressure [Pa abs]
    :param temperature: [K]
    :param length: straight length [m]
    :param density: given density [kg/m3] (replaces the backend when given with viscosity)
    :param viscosity: given dynamic viscosity [Pa s]
    :param design_margin: fraction added to the flow for sizing (0.1 = 10 %)
    :param phase: the phase the user says the line carries ("liquid"/"gas"), or None
    :param eos: equation of state or model asked of the backend (e.g. "PR", "SRK"), or None for its default
    :param elevation: outlet elevation minus inlet elevation [m], rise positive
    :param fittings: fittings as (kind, count) pairs, e.g. (("elbow-90-lr", 4.0), ("gate", 2.0))
    :param fixed_drop: equipment and control-valve allowances added to the line drop [Pa]
    :param min_outlet_pressure: lowest pressure the receiver accepts at the line end [Pa abs]
    :param source_pressure: pressure in the vessel a pump suction draws from [Pa abs]
    :param liquid_level: liquid level above the pump datum (suction static head) [m]
    :param npsh_required: NPSH required by the pump at the sizing flow [m]
    :param vapour_pressure: vapour (or bubble) pressure of the liquid at line temperature [Pa abs], for a backend
        that gives none (the line's own density and viscosity, CoolProp's incompressible liquids and brines)
    :param roughness: absolute roughness that replaces the pipe class's (corroded pipe) [m]
    :param case: operating case name ("normal", "maximum", ...) or None
    :param schedule: the schedule of an existing line checked at ``nps`` (replaces the pipe class's), or None
    :param fittings_method: "darby-3k" (default), "hooper-2k" or "crane" (see hydraulics.fittings), or None
    :param compressible: gas lines above a 10 % drop: "isothermal" (default) or "adiabatic", or None
    :param quality: vapour mass fraction at the inlet [-] of a saturated pure fluid (1 saturated vapour,
        0 saturated liquid), or None; with it the pressure alone fixes the state and ``temperature`` is the
        saturation temperature at ``pressure`` (:func:`boresize.properties.saturated_line.saturated_line`)
    :param two_phase_method: the two-phase pressure-drop correlation asked for (as the fluids library names it,
        e.g. "Beggs-Brill"), None for the service's or the default
    :param bare_pressures: the pressure fields given in a bare unit (``9 psi``) and how each was read
    """

    tag: str
    fluid: str
    flow: Flow
    pressure: float
    temperature: float
    length: float = 100.0
    service: str | None = None
    pipe_class: str | None = None
    nps: str | None = None
    density: float | None = None
    viscosity: float | None = None
    design_margin: float | None = None
    phase: Literal["liquid", "gas", "two-phase"] | None = None
    backend: str | None = None
    eos: str | None = None
    elevation: float = 0.0
    fittings: tuple[tuple[str, float], ...] = ()
    fixed_drop: float = 0.0
    min_outlet_pressure: float | None = None
    source_pressure: float | None = None
    liquid_level: float | None = None
    npsh_required: float | None = None
    roughness: float | None = None
    vapour_pressure: float | None = None
    case: str | None = None
    extra: tuple[tuple[str, str], ...] = ()
    schedule: str | None = None
    fittings_method: str | None = None
    compressible: str | None = None
    quality: float | None = None
    #: each pressure field given in a bare unit (``9 psi``: neither gauge nor absolute) and how it was read
    bare_pressures: tuple[BareReading, ...] = ()
    two_phase_method: str | None = None


@filled_through_dict
@dataclass(frozen=True)
class FluidState:
    """Properties of the fluid at the line's inlet conditions.

    :param density: [kg/m3]
    :param viscosity: dynamic viscosity [Pa s]
    :param vapour_pressure: saturation (pure) or bubble (mixture) pressure at T [Pa abs], if known
    :param speed_of_sound: [m/s], if known
    :param source: the backend id ("coolprop", "table", ...)
    :param model: the model or equation of state used, with the backend version
    :param vapour_fraction: vapour mass fraction (quality) [-], if known
    :param bubble_pressure: bubble-point pressure of a mixture at T [Pa abs], if known
    :param dew_pressure: dew-point pressure of a mixture at T [Pa abs], if known
    :param backend_version: version of the library behind ``source``
    :param eos: the equation of state or model id used (e.g. "PR", "HEOS")
    :param pressure: the pressure the properties were evaluated at [Pa abs]
    :param temperature: the temperature the properties were evaluated at [K]
    :param composition: (component, mole fraction) pairs of a mixture
    :param notes: remarks on how the state was obtained (e.g. fractions normalised)
    :param saturation_temperature: saturation temperature at ``pressure`` [K] of a pure fluid whose state is
        saturated (a quality, or a phase at saturation) or lies within
        :data:`boresize.properties.saturation.SATURATION_MARGIN` of it; None elsewhere
    :param family: the fluid family the model was chosen for ("pure fluid", "natural gas", "aqueous solution",
        "hydrocarbon mixture", "given values", ...), None where the backend does not say
    :param validity: the chosen model's validity range as text ("90-450 K, up to 35 MPa"), None where not known
    :param liquid_density: of a two-phase state, the liquid phase's density [kg/m3] (``density`` is then the
        no-slip mixture's, 1/rho = x/rho_g + (1 - x)/rho_l); None for a single-phase state
    :param gas_density: of a two-phase state, the vapour phase's density [kg/m3]
    :param liquid_viscosity: of a two-phase state, the liquid phase's dynamic viscosity [Pa s]
    :param gas_viscosity: of a two-phase state, the vapour phase's dynamic viscosity [Pa s]
    :param surface_tension: of a two-phase state, the gas-liquid surface tension [N/m], None where not known
    """

    density: float
    viscosity: float
    phase: Phase
    source: str
    model: str
    vapour_fraction: float | None = None
    vapour_pressure: float | None = None
    speed_of_sound: float | None = None
    molar_mass: float | None = None
    fluid_name: str | None = None
    bubble_pressure: float | None = None
    dew_pressure: float | None = None
    backend_version: str | None = None
    eos: str | None = None
    pressure: float | None = None
    temperature: float | None = None
    composition: tuple[tuple[str, float], ...] = ()
    notes: tuple[str, ...] = ()
    saturation_temperature: float | None = None
    family: str | None = None
    validity: str | None = None
    liquid_density: float | None = None
    gas_density: float | None = None
    liquid_viscosity: float | None = None
    gas_viscosity: float | None = None
    surface_tension: float | None = None


@dataclass(frozen=True)
class Candidate:
    """A pipe size the pipe class allows.

    :param nps: nominal pipe size as written in the trade ("1-1/2", "4")
    :param outside_diameter: [m]
    :param wall: [m]
    :param inside_diameter: [m]
    :param roughness: absolute roughness [m]
    """

    nps: str
    nps_value: float
    schedule: str
    outside_diameter: float
    wall: float
    inside_diameter: float
    roughness: float
    pipe_class: str = "default"


@dataclass(frozen=True)
class TwoPhaseFlow:
    """The two-phase part of one candidate's hydraulics (all SI); ``Hydraulics.two_phase`` holds it.

    :param method: the pressure-drop correlation as the fluids library names it ("Beggs-Brill", "Friedel"...)
    :param vapour_fraction: vapour mass fraction at the inlet [-]
    :param flow_regime: the flow regime at the inlet as the map names it ("stratified smooth", "slug"...)
    :param regime_map: the published map the regime comes from ("Taitel-Dukler", "Mandhane-Gregory-Aziz")
    :param liquid_holdup: in-situ liquid volume fraction from the correlation [-] (the elevation term uses it),
        None where the correlation gives none
    :param superficial_liquid_velocity: m (1 - x) / (rho_l A) [m/s]
    :param superficial_gas_velocity: m x / (rho_g A) [m/s]
    :param mixture_velocity: the sum of the superficial velocities [m/s] (``Hydraulics.velocity`` too)
    :param mixture_density: the no-slip mixture density [kg/m3] the erosional limit uses
    :param liquid_density: [kg/m3]; :param gas_density: [kg/m3]; :param liquid_viscosity: [Pa s];
        :param gas_viscosity: [Pa s]; :param surface_tension: [N/m] (the inlet's, as the correlation used them)
    :param fittings_method: how the fittings' two-phase drop was found (a named multiplier method)
    :param segments: the number of segments the line was marched in (1: rated at inlet properties)
    :param outlet_vapour_fraction: vapour mass fraction at the line end after the flash along it, None when
        the line was not re-flashed
    :param flash_point: distance from the inlet [m] at which a liquid line reached its bubble pressure and
        became two-phase (a letdown line), None otherwise
    """

    method: str
    vapour_fraction: float
    flow_regime: str
    regime_map: str
    liquid_holdup: float | None
    superficial_liquid_velocity: float
    superficial_gas_velocity: float
    mixture_velocity: float
    mixture_density: float
    liquid_density: float
    gas_density: float
    liquid_viscosity: float
    gas_viscosity: float
    surface_tension: float | None = None
    fittings_method: str = ""
    segments: int = 1
    outlet_vapour_fraction: float | None = None
    flash_point: float | None = None


@filled_through_dict
@dataclass(frozen=True)
class Hydraulics:
    """Single-phase hydraulics of one candidate at the sizing flow (all SI).

    :param mass_flow: [kg/s]; :param volume_flow: [m3/s]; :param velocity: [m/s]
    :param friction_factor: Darcy friction factor [-]
    :param drop_per_length: frictional pressure drop per metre [Pa/m]
    :param drop: frictional drop over the line length [Pa]
    :param momentum: rho*v^2 [Pa]
    :param fittings_drop: drop across the line's fittings [Pa]
    :param static_drop: rho*g*elevation [Pa] (negative for a line that falls)
    :param fixed_drop: equipment and control-valve allowances [Pa]
    :param total_drop: friction + fittings + static + fixed (+ acceleration, compressible) [Pa]
    :param outlet_pressure: inlet pressure minus total drop [Pa abs]
    :param method: how the drop was computed (e.g. "incompressible Darcy-Weisbach"), with its sources
    :param fittings_k: sum of the fittings' loss coefficients [-]; :param fittings_method: how K was found
    :param acceleration_drop: G^2 (1/rho_out - 1/rho_in) of a compressible line [Pa] (part of total_drop)
    :param outlet_velocity: [m/s] and :param outlet_mach: [-] at the line end (compressible method), or None
    :param choked: True when the flow cannot pass the whole line at this size (sonic limit reached, or no
        state from the property backend on the way; ``method`` says which)
    :param peak_velocity: the highest velocity along a marched gas line, where its density is lowest [m/s],
        with ``peak_density`` [kg/m3] and ``peak_position`` (distance from the inlet [m]) there; None for a
        line rated with one density (liquids, and gas lines within the simple method's limit), whose
        ``velocity`` holds all along. The velocity-type criteria judge this point.
    :param peak_mach: the highest Mach number along a marched gas line [-], at ``peak_mach_position`` [m]
    :param two_phase: the two-phase details of a two-phase line (flow regime, holdup, superficial velocities,
        each phase's properties), None for a single-phase line
    """

    mass_flow: float
    volume_flow: float
    velocity: float
    reynolds: float
    friction_factor: float
    regime: Literal["laminar", "transition", "turbulent"]
    drop_per_length: float
    drop: float
    momentum: float
    mach: float | None = None
    fittings_drop: float = 0.0
    static_drop: float = 0.0
    fixed_drop: float = 0.0
    total_drop: float = 0.0
    outlet_pressure: float | None = None
    method: str = "incompressible Darcy-Weisbach"
    fittings_k: float = 0.0
    fittings_method: str = ""
    acceleration_drop: float = 0.0
    outlet_velocity: float | None = None
    outlet_mach: float | None = None
    choked: bool = False
    choke_length: float | None = None  # distance from the inlet at which the flow chokes [m], None when it does not
    peak_velocity: float | None = None  # highest velocity along a marched line [m/s], None: ``velocity`` holds all along
    peak_density: float | None = None  # the density where the velocity peaks [kg/m3] (a marched line)
    peak_position: float | None = None  # that point's distance from the inlet [m] (a marched line)
    peak_mach: float | None = None  # highest Mach number along a marched line [-], None when not marched or no c
    peak_mach_position: float | None = None  # that point's distance from the inlet [m]
    two_phase: TwoPhaseFlow | None = None


@filled_through_dict
@dataclass(frozen=True)
class Verdict:
    """One criterion's judgement of one candidate.

    ``value`` and ``limit`` are in ``unit`` (a display unit such as "m/s" or "kPa/100 m");
    ``utilisation`` is value/limit oriented so that 1.0 is the limit and more is worse.
    """

    criterion: str
    status: VerdictStatus
    reasons: tuple[str, ...]
    source: str
    value: float | None = None
    limit: float | None = None
    unit: str = ""
    utilisation: float | None = None

    @property
    def reason(self) -> str:
        return " ".join(self.reasons)


@filled_through_dict
@dataclass(frozen=True)
class CandidateResult:
    """A candidate with its hydraulics and every verdict on it."""

    candidate: Candidate
    hydraulics: Hydraulics
    verdicts: tuple[Verdict, ...]

    @property
    def passed(self) -> bool:
        return all(v.status in PASSING_STATUSES for v in self.verdicts)

    @property
    def worst(self) -> Verdict | None:
        """The verdict with the highest utilisation (the one closest to, or furthest past, its limit)."""
        rated = [v for v in self.verdicts if v.utilisation is not None]
        return max(rated, key=lambda v: v.utilisation or 0.0, default=None)


@dataclass(frozen=True)
class LineResult:
    """The outcome for one line: selected size, its verdicts, or the error that stopped it.

    A line with several operating cases carries one result per case in ``cases`` (input order); its
    own fields are those of the governing case (the one closest to, or furthest past, a limit at the
    selected size), and ``governing`` names, per criterion id, the case that governs it.
    """

    tag: str
    status: Literal["pass", "fail", "error"]
    mode: Mode
    line: Line | None = None
    state: FluidState | None = None
    selected: CandidateResult | None = None
    candidates: tuple[CandidateResult, ...] = ()
    controlling: str | None = None
    error: str | None = None
    error_field: str | None = None
    notes: tuple[str, ...] = ()
    service: str | None = None
    criteria_set: str | None = None
    sizing_flow: float | None = None
    first_guess_diameter: float | None = None
    raw: dict[str, str] = field(default_factory=dict)
    cases: tuple[LineResult, ...] = ()
    governing: tuple[tuple[str, str], ...] = ()
    #: a failing check (given NPS): the smallest size of its pipe class that passes (None: none does, or not a
    #: failing check)
    smallest_passing_nps: str | None = None
    #: the design margin applied to the flow [-] (the line's own, else its service's); None when not rated
    design_margin: float | None = None


def bare_pressure_count(results: Sequence[LineResult]) -> int:
    """How many lines gave a pressure in a bare unit (``9 psi``, in any of their cases)."""
    return sum(1 for r in results if any(one.line is not None and one.line.bare_pressures for one in (r, *r.cases)))


def bare_pressure_text(results: Sequence[LineResult]) -> str:
    """The run summary's count of lines with a pressure in a bare unit ("" when none has one)."""
    return bare_pressure_note(bare_pressure_count(results))


def bare_pressure_note(bare: int) -> str:
    """The run summary's note for ``bare`` lines with a pressure in a bare unit ("" when none)."""
    return f"; {bare} with a pressure in a bare unit (neither g nor a: see the line's notes)" if bare else ""
