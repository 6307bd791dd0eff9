"""Two-phase (gas-liquid) hydraulics of one line: a named correlation of the fluids library, marched in segments.

Default correlation: Beggs-Brill (1973), the one correlation of the set built from data at every inclination
(horizontal to vertical), whose liquid holdup gives the elevation term. Other correlations are the fluids
library's names (``two_phase_dP``) plus ``homogeneous`` (Darcy-Weisbach at the no-slip density with the McAdams
mixture viscosity); for those the elevation term uses the void fraction of Woldesemayat & Ghajar (2007), or of
Chisholm (1983) where the surface tension is not known, never the no-slip density. Fittings: the homogeneous
multiplier, K rho_m v_m^2 / 2 at the no-slip density (Collier & Thome, *Convective Boiling and Condensation*,
3rd ed., 1994). Flow regime from the Taitel-Dukler (1976) map. Two-phase correlations carry large uncertainty:
Beggs & Brill quote about +/-10 % on their own data; field data scatter +/-30 % or more.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass, replace

from boresize.errors import InputError, PropertyError
from boresize.hydraulics.darcy import _pipe_flow
from boresize.hydraulics.fittings import fittings_loss
from boresize.hydraulics.friction import darcy_friction_factor
from boresize.model import Candidate, FluidState, Hydraulics, Line, TwoPhaseFlow

__all__ = ["DEFAULT_METHOD", "REGIME_NAMES", "accepted_methods", "rate_letdown", "rate_two_phase", "flow_regime", "beggs_brill_holdup",
           "resolve_method"]

Properties = Callable[[float, float], FluidState]

DEFAULT_METHOD = "Beggs-Brill"
G = 9.80665  # standard gravity [m/s2]
REGIME_MAP = "Taitel-Dukler (1976)"
#: the regimes the Taitel-Dukler map gives, and those of Mandhane-Gregory-Aziz (1974) a plugin may report
REGIME_NAMES = ("stratified smooth", "stratified wavy", "intermittent", "annular", "bubbly",
                "elongated bubble", "stratified", "wave", "slug", "annular mist", "dispersed bubble")
FITTINGS_METHOD = ("homogeneous two-phase multiplier, K rho_m v_m^2/2 at the no-slip density (Collier & Thome, "
                   "Convective Boiling and Condensation, 3rd ed., 1994)")
_REEVALUATE = 0.02  # re-flash when the pressure has fallen 2 % since the last flash (a pure fluid's HmassP flash)
#: a mixture's flash (a CoolProp HEOS PT flash: 6-9 ms with its phases) is made at the inlet pressure times
#: (1 - 10 %)^k, a grid shared by every size of the line (cached by the backend), and the properties are linearly
#: interpolated in pressure between the flashes that bracket the local pressure; below the state's dew pressure at
#: T (the mixture all gas there) no flash is made, the last two-phase one held.
# measured: coolprop-mixture 24.9 -> 14.0 ms a line, gerg-2008 20.8 -> 15.2 ms (3 -> 2 flashes a line; CPU, least of
# 3 medians of 10 lines, loaded machine: benchmarks/bench_two_phase.py's cases timed by process_time, main at e8854d3
# against this) for a 5 % grid holding each flash's properties; and closer to a march re-flashed at every segment
# (tests/hydraulics/test_two_phase_march.py: within 0.2 % and 1 %, where the held 5 % grid gave 15 % low)
_REEVALUATE_SLOW = 0.10
_MARCH = 0.05  # march in segments when the drop is above 5 % of the inlet pressure
_MATERIAL = 0.05  # or when the mixture density changes by more than 5 % along the line (_changes_materially)
_SEGMENTS = 20


def accepted_methods() -> tuple[str, ...]:
    """The correlation names ``two_phase_method`` accepts: ``homogeneous`` and the fluids library's (one list, in
    :mod:`boresize.hydraulics.two_phase_names`, which the line-list and criteria-file readers check against)."""
    from boresize.hydraulics.two_phase_names import two_phase_methods
    return two_phase_methods()


def resolve_method(line: Line, method: str | None) -> str:
    """The correlation of a line: its own ``two_phase_method``, else the service's, else Beggs-Brill."""
    name = line.two_phase_method or method or DEFAULT_METHOD
    accepted = accepted_methods()
    if name not in accepted:
        raise InputError(f"unknown two-phase method {name!r}", field="two_phase_method", value=name,
                         expected=f"one of {', '.join(accepted)}", tag=line.tag)
    return name


@dataclass(frozen=True)
class _Phases:
    x: float
    rhol: float
    rhog: float
    mul: float
    mug: float
    sigma: float | None

    @property
    def rho_m(self) -> float:  # no-slip mixture density
        return 1.0 / (self.x / self.rhog + (1.0 - self.x) / self.rhol)


def _phases(state: FluidState, tag: str) -> _Phases:
    fields = ("vapour_fraction", "liquid_density", "gas_density", "liquid_viscosity", "gas_viscosity")
    for name in fields:
        value = getattr(state, name)
        if value is None or not math.isfinite(value) or value < 0.0 or (name != "vapour_fraction" and value <= 0):
            raise InputError(f"the two-phase state has no usable {name} ({value!r})", field=name, value=value,
                             expected="the per-phase value from the property backend", tag=tag)
    x = float(state.vapour_fraction)  # type: ignore[arg-type]
    if x > 1.0:
        raise InputError(f"vapour fraction {x:g} is above 1", field="vapour_fraction", value=x,
                         expected="a vapour mass fraction from 0 to 1", tag=tag)
    if not state.gas_density < state.liquid_density:  # type: ignore[operator]
        raise InputError(f"gas density {state.gas_density:g} kg/m3 is not below the liquid's "
                         f"{state.liquid_density:g} kg/m3", field="gas_density", value=state.gas_density,
                         expected="a vapour lighter than its liquid (a two-phase state below the critical point)",
                         tag=tag)
    return _Phases(x, float(state.liquid_density), float(state.gas_density),  # type: ignore[arg-type]
                   float(state.liquid_viscosity), float(state.gas_viscosity),  # type: ignore[arg-type]
                   state.surface_tension)


def beggs_brill_holdup(m: float, ph: _Phases, diameter: float, angle: float) -> float:
    """In-situ liquid holdup of Beggs & Brill (1973), as fluids.two_phase.Beggs_Brill computes it [-]."""
    from fluids.two_phase import _Beggs_Brill_holdup
    area = 0.25 * math.pi * diameter**2
    vsl, vsg = (1.0 - ph.x) * m / (ph.rhol * area), ph.x * m / (ph.rhog * area)
    vm = vsl + vsg
    fr, lam = vm * vm / (G * diameter), vsl / vm
    if lam <= 0.0:
        return 0.0
    if lam >= 1.0:
        return 1.0
    l1, l2, l3, l4 = 316.0 * lam**0.302, 0.0009252 * lam**-2.4684, 0.1 * lam**-1.4516, 0.5 * lam**-6.738
    if (lam < 0.01 and fr < l1) or (lam >= 0.01 and fr < l2):
        regime = 0
    elif lam >= 0.01 and l2 <= fr <= l3:
        regime = 1
    elif (0.01 <= lam < 0.4 and l3 < fr <= l1) or (lam >= 0.4 and l3 < fr <= l4):
        regime = 2
    else:
        regime = 3
    lv = vsl * (ph.rhol / (G * (ph.sigma or 0.02))) ** 0.25
    rad = math.radians(angle)
    if regime != 1:
        hl = float(_Beggs_Brill_holdup(regime, lam, fr, rad, lv))
    else:
        a = (l3 - fr) / (l3 - l2)
        hl = float(a * _Beggs_Brill_holdup(0, lam, fr, rad, lv) + (1 - a) * _Beggs_Brill_holdup(2, lam, fr, rad, lv))
    return min(1.0, hl)  # the correlation can exceed 1 at very low Froude numbers: no more liquid than the pipe


def _void(m: float, ph: _Phases, diameter: float, p: float, angle: float) -> tuple[float, str]:
    from fluids.two_phase_voidage import Chisholm_voidage, Woldesemayat_Ghajar
    if ph.x <= 0.0 or ph.x >= 1.0:
        return (1.0 if ph.x >= 1.0 else 0.0), "single phase"
    if ph.sigma is not None:
        return float(Woldesemayat_Ghajar(ph.x, ph.rhol, ph.rhog, ph.sigma, m, diameter, p, angle)), \
            "void fraction of Woldesemayat & Ghajar (2007)"
    return float(Chisholm_voidage(ph.x, ph.rhol, ph.rhog)), "void fraction of Chisholm (1983)"


def flow_regime(m: float, ph: _Phases, diameter: float, roughness: float, angle: float) -> str:
    """The Taitel-Dukler (1976) regime (fluids.two_phase.Taitel_Dukler_regime); pure liquid or gas named so."""
    from fluids.two_phase import Taitel_Dukler_regime
    if ph.x <= 0.0:
        return "liquid"
    if ph.x >= 1.0:
        return "gas"
    return str(Taitel_Dukler_regime(m, ph.x, ph.rhol, ph.rhog, ph.mul, ph.mug, diameter, angle, roughness)[0])


@dataclass(frozen=True)
class _Step:
    friction: float  # [Pa]
    static: float  # [Pa]
    acceleration: float  # [Pa]
    holdup: float


def _segment(method: str, m: float, ph: _Phases, p: float, bore: tuple[float, float], dx: float, dz: float,
             tag: str) -> tuple[_Step, str]:
    diameter, roughness = bore
    angle = _angle(dx, dz)
    if method == "homogeneous":
        mu_m = 1.0 / (ph.x / ph.mug + (1.0 - ph.x) / ph.mul)  # McAdams et al. (1942)
        dpl = _pipe_flow(m, ph.rho_m, mu_m, diameter, roughness, max(dx, 1.0), None)[4]
        alpha, void_text = _void(m, ph, diameter, p, angle)
        rho_s = ph.rhol * (1 - alpha) + ph.rhog * alpha
        return _Step(dpl * dx, rho_s * G * dz, 0.0, 1 - alpha), void_text
    if method == "Beggs-Brill":
        from fluids.two_phase import Beggs_Brill
        if ph.x <= 0.0 or ph.x >= 1.0:
            return _segment("homogeneous", m, ph, p, bore, dx, dz, tag)
        sigma = _need_sigma(ph, method, tag)
        hl = beggs_brill_holdup(m, ph, diameter, angle)
        rho_s = ph.rhol * hl + ph.rhog * (1 - hl)
        per_metre = float(Beggs_Brill(m, ph.x, ph.rhol, ph.rhog, ph.mul, ph.mug, sigma, p, diameter, angle,
                                      roughness, 1.0, G, False))  # friction + rho_s g sin(angle), per metre
        friction = (per_metre - rho_s * G * math.sin(math.radians(angle))) * dx
        static = rho_s * G * dz
        total = friction + static
        area = 0.25 * math.pi * diameter**2
        vsg, vm = ph.x * m / (ph.rhog * area), m * (ph.x / ph.rhog + (1 - ph.x) / ph.rhol) / area
        ek = vsg * vm * (ph.rhol * hl + ph.rhog * (1 - hl)) / p
        accel = total * ek / (1 - ek) if ek < 0.9 else math.inf
        return _Step(friction, static, accel, hl), "holdup of Beggs & Brill (1973)"
    from fluids.two_phase import two_phase_dP
    if ph.x <= 0.0 or ph.x >= 1.0:
        return _segment("homogeneous", m, ph, p, bore, dx, dz, tag)
    try:
        dpl = float(two_phase_dP(m, ph.x, ph.rhol, diameter, 1.0, ph.rhog, ph.mul, ph.mug, ph.sigma, p, None,
                                 roughness, angle, method))
    except (ValueError, TypeError, ZeroDivisionError) as exc:
        raise InputError(f"the {method} correlation cannot rate this line ({exc})", field="two_phase_method",
                         value=method, expected="a correlation whose inputs the state gives, e.g. Beggs-Brill",
                         tag=tag) from exc
    alpha, void_text = _void(m, ph, diameter, p, angle)
    static = (ph.rhol * (1 - alpha) + ph.rhog * alpha) * G * dz
    return _Step(dpl * dx, static, 0.0, 1 - alpha), void_text


def _angle(dx: float, dz: float) -> float:
    """Inclination [degrees, rise positive] of a run dx [m] rising dz [m]; a run of no length is vertical."""
    if dx <= 0.0:
        return 0.0 if dz == 0.0 else math.copysign(90.0, dz)
    return math.degrees(math.asin(max(-1.0, min(1.0, dz / dx))))


def _need_sigma(ph: _Phases, method: str, tag: str) -> float:
    if ph.sigma is None or not ph.sigma > 0:
        raise InputError(f"the {method} correlation needs the surface tension, which the state lacks",
                         field="surface_tension", value=ph.sigma,
                         expected="a backend that gives it, or two_phase_method = \"homogeneous\"", tag=tag)
    return ph.sigma


def _usable(state: FluidState) -> bool:
    return state.phase == "two-phase" and all(
        getattr(state, n) is not None for n in ("vapour_fraction", "liquid_density", "gas_density",
                                                "liquid_viscosity", "gas_viscosity"))


def rate_two_phase(line: Line, state: FluidState, candidate: Candidate, mass_flow: float, method: str | None = None,
                   properties: Properties | None = None) -> Hydraulics:
    """Hydraulics of a two-phase line (SI throughout); see the module text for the methods.

    :raises InputError: an unknown ``two_phase_method``, a state without its per-phase fields, or a correlation
        whose inputs the state lacks
    """
    name = resolve_method(line, method)
    inlet = _phases(state, line.tag)
    if not (math.isfinite(mass_flow) and mass_flow > 0.0):
        raise InputError(f"mass flow {mass_flow!r} kg/s is not usable", field="flow", value=mass_flow,
                         expected="a finite flow > 0 (the line's inlet is where the flow enters)", tag=line.tag)
    if not (math.isfinite(line.length) and line.length >= 0.0 and math.isfinite(line.elevation)):
        raise InputError(f"length {line.length!r} m / elevation {line.elevation!r} m is not usable", field="length",
                         value=line.length, expected="a finite length >= 0 m and a finite elevation", tag=line.tag)
    diameter = candidate.inside_diameter
    roughness = line.roughness if line.roughness is not None else candidate.roughness
    bore = (diameter, roughness)
    first, void_text = _segment(name, mass_flow, inlet, line.pressure, bore, line.length, line.elevation, line.tag)
    one_shot = first.friction + first.static + first.acceleration
    segments = _SEGMENTS if line.length > 0 and abs(one_shot) > _MARCH * line.pressure else 1
    if segments == 1 and _changes_materially(line, state, inlet, one_shot, properties):
        segments = _SEGMENTS
    march = _march(line, name, mass_flow, inlet, bore, segments, properties, state)
    area = 0.25 * math.pi * diameter**2
    vm = mass_flow / (inlet.rho_m * area)
    mu_m = 1.0 / (inlet.x / inlet.mug + (1.0 - inlet.x) / inlet.mul)
    re = inlet.rho_m * vm * diameter / mu_m
    f_ns, regime = darcy_friction_factor(re, roughness / diameter)
    loss = fittings_loss(line.fittings, line.fittings_method, reynolds=re, inside_diameter=diameter,
                         nps=candidate.nps_value)
    fittings = loss.drop(f_ns, inlet.rho_m, vm, diameter)
    total = march.friction + march.static + march.acceleration + fittings + line.fixed_drop
    dpl = march.friction / march.reached if march.reached > 0 else first.friction / max(line.length, 1.0)
    choked = march.stopped or total >= line.pressure
    angle = _angle(line.length, line.elevation)
    regime_name = flow_regime(mass_flow, inlet, diameter, roughness, angle)
    text = (f"two-phase {name} ({_SOURCES.get(name, 'as fluids.two_phase names it')}), elevation by the "
            f"{void_text}, {march.segments} segment(s), properties {march.note}; flow regime {regime_name!r} from "
            f"the {REGIME_MAP} map (AIChE J. 22(1)){' outside its near-horizontal range' if abs(angle) > 10 else ''}"
            f"; fittings by the {FITTINGS_METHOD} ({loss.method}); two-phase correlations are uncertain (+/-30 % "
            f"or more on field data): slug flow and surge need a specialist's review")
    outlet = line.pressure - total
    if choked:  # the line cannot pass this flow: no outlet pressure below zero is reported as a number to use
        outlet = 0.0
        text += (f"; CANNOT FLOW: stops {format(march.reached, '.4g')} m from the inlet: {march.why}" if march.stopped
                 else "; CANNOT FLOW: the drop reaches the inlet pressure at the outlet")
    two = TwoPhaseFlow(method=name, vapour_fraction=inlet.x, flow_regime=regime_name, regime_map=REGIME_MAP,
                       liquid_holdup=first.holdup, superficial_liquid_velocity=mass_flow * (1 - inlet.x) / (
                           inlet.rhol * area),
                       superficial_gas_velocity=mass_flow * inlet.x / (inlet.rhog * area), mixture_velocity=vm,
                       mixture_density=inlet.rho_m, liquid_density=inlet.rhol, gas_density=inlet.rhog,
                       liquid_viscosity=inlet.mul, gas_viscosity=inlet.mug, surface_tension=inlet.sigma,
                       fittings_method=FITTINGS_METHOD, segments=march.segments,
                       outlet_vapour_fraction=march.outlet_x)
    return Hydraulics(mass_flow=mass_flow, volume_flow=mass_flow / inlet.rho_m, velocity=vm, reynolds=re,
                      friction_factor=dpl * 2 * diameter / (inlet.rho_m * vm * vm) if vm > 0 else f_ns,
                      regime=regime, drop_per_length=dpl, drop=march.friction, momentum=inlet.rho_m * vm * vm,
                      fittings_drop=fittings, static_drop=march.static, fixed_drop=line.fixed_drop,
                      total_drop=line.pressure if choked else total, outlet_pressure=outlet,
                      method=text, fittings_k=loss.k_total, fittings_method=FITTINGS_METHOD,
                      acceleration_drop=march.acceleration, choked=choked,
                      choke_length=march.reached if choked else None, two_phase=two)


_SOURCES = {"Beggs-Brill": "Beggs & Brill, J. Pet. Tech. 25(5), 1973, via fluids.two_phase.Beggs_Brill",
            "homogeneous": "Darcy-Weisbach at the no-slip density, McAdams mixture viscosity",
            "Friedel": "Friedel, 1979, via fluids.two_phase.Friedel",
            "Lockhart_Martinelli": "Lockhart & Martinelli, 1949, via fluids.two_phase.Lockhart_Martinelli",
            "Muller_Steinhagen_Heck": "Muller-Steinhagen & Heck, 1986, via fluids.two_phase"}


@dataclass
class _March:
    friction: float = 0.0
    static: float = 0.0
    acceleration: float = 0.0
    reached: float = 0.0
    segments: int = 1
    stopped: bool = False
    outlet_x: float | None = None
    note: str = "at the inlet"
    why: str = ""  # why the march stopped, when it did


def _march(line: Line, name: str, m: float, inlet: _Phases, bore: tuple[float, float], segments: int,
           properties: Properties | None, state: FluidState) -> _March:
    out = _March(segments=segments, outlet_x=inlet.x)
    dx, dz = line.length / segments, line.elevation / segments
    ph, p, p_flash = inlet, line.pressure, line.pressure
    along = properties is not None and segments > 1 and state.source != "table"
    how = str(getattr(properties, "label", f"at (p, inlet T = {line.temperature:.5g} K), isothermal"))
    held = ""
    cheap = getattr(properties, "cheap", False)
    every = _REEVALUATE if cheap else _REEVALUATE_SLOW
    nodes = [(line.pressure, inlet)]  # a mixture's flashes, highest pressure first, interpolated between

    def at(pressure: float) -> _Phases:
        """The properties at ``pressure`` (re-flashed or interpolated as the module text says)."""
        nonlocal ph, p_flash, held
        if along and not held and cheap and pressure < p_flash * (1 - every):
            p_flash = _grid(line.pressure, pressure, every)  # on a grid: the sizes of one line share their flashes
            new, held = _reflash(properties, p_flash, line)
            if new is not None:
                ph = _phases(new, line.tag)
        elif along and not cheap:
            while not held and pressure < nodes[-1][0]:
                node = _grid_below(line.pressure, pressure, every)
                if node >= nodes[-1][0]:  # a grid point a few ulps above ``pressure``: the next one down (progress)
                    node = nodes[-1][0] * (1.0 - every)
                if state.dew_pressure is not None and node < state.dew_pressure:
                    # the last two-phase point, 1 % above the dew pressure (GERG-2008 refuses a flash closer to
                    # its envelope), held below it; where even that flash fails, the last grid flash is held
                    edge = state.dew_pressure * (1.0 + _DEW_STEP)
                    new = _reflash(properties, edge, line)[0] if edge < nodes[-1][0] else None
                    if new is not None:
                        nodes.append((edge, _phases(new, line.tag)))
                    held = (f"below the dew pressure {state.dew_pressure / 1e5:.4g} bar abs at T the mixture is all "
                            f"gas (the properties {'of a flash 1 % above it' if new is not None else 'of the last flash'}"
                            f" held there)")
                    break
                new, held = _reflash(properties, node, line)
                if new is not None:
                    nodes.append((node, _phases(new, line.tag)))
                else:  # the fluid left two-phase between the last flash and this node: find where, then hold
                    nodes.extend(_edge(properties, line, nodes[-1][0], node))
            ph = _interpolate(nodes, pressure)
        return ph

    for i in range(segments):
        start = at(p)
        out.outlet_x = start.x
        step = _segment(name, m, start, p, bore, dx, dz, line.tag)[0]
        drop = step.friction + step.static + step.acceleration
        if segments > 1 and along and math.isfinite(drop) and 0.0 < drop < p:
            # measured: the segment's drop again at its mid-pressure's properties (predictor-corrector): a
            # flashing mixture's 20 segments at each segment's inlet properties came out 5-8 % low against 200
            # (tests/hydraulics/test_two_phase_march.py's cases); +20 correlation calls a marched size, no flash
            middle = _segment(name, m, at(p - 0.5 * drop), p - 0.5 * drop, bore, dx, dz, line.tag)[0]
            step, drop = middle, middle.friction + middle.static + middle.acceleration
        if not math.isfinite(drop) or drop >= p:
            out.stopped, out.reached = True, i * dx + (dx * p / drop if math.isfinite(drop) and drop > 0 else 0.0)
            out.why = ("the drop reaches the local pressure" if math.isfinite(drop) else
                       "the acceleration term diverges there (Beggs & Brill's Ek = v_m v_sg rho_s / p reaches 0.9: "
                       "critical two-phase flow)" if math.isinf(step.acceleration) else
                       "the correlation gives no finite drop there")
            out.friction += step.friction * (out.reached - i * dx) / dx if dx > 0 else 0.0
            out.note = _note(segments, how, held, along, every, cheap) + " until the line could not flow"
            return out
        out.friction += step.friction
        out.static += step.static
        out.acceleration += step.acceleration
        p -= drop
        out.reached = (i + 1) * dx
    if along and not held and p < p_flash and cheap:  # the outlet's own quality
        new, held = _reflash(properties, p, line)
        out.outlet_x = new.vapour_fraction if new is not None else out.outlet_x
    elif along and not cheap and len(nodes) > 1:
        out.outlet_x = _interpolate(nodes, p).x  # the outlet's, where the flashes bracket it (else the lowest's)
    out.note = _note(segments, how, held, along, every, cheap)
    return out


def _changes_materially(line: Line, state: FluidState, inlet: _Phases, drop: float,
                        properties: Properties | None) -> bool:
    """Whether a line whose drop is within 5 % of its inlet pressure still changes materially along it: its no-slip
    mixture density moves by more than 5 % between the inlet and the outlet (near a bubble point a small fall in
    pressure flashes much liquid: a 3 % drop unmarched came out 21 % low against a march re-flashed at every
    segment). A pure fluid is flashed at the outlet's own pressure; a mixture at its flash grid's node below the
    outlet (shared with the march and the line's other sizes), the change scaled to the line's own drop; a node
    below the dew pressure (all gas there) counts as material."""
    if properties is None or state.source == "table" or not (line.length > 0 and 0.0 < drop < line.pressure):
        return False
    outlet = line.pressure - drop
    if getattr(properties, "cheap", False):
        node, scale = outlet, 1.0
    else:
        node = _grid_below(line.pressure, outlet, _REEVALUATE_SLOW)
        if state.dew_pressure is not None and node < state.dew_pressure:
            return True
        scale = drop / (line.pressure - node)
    new, held = _reflash(properties, node, line)
    if new is None:
        return bool(held)  # the fluid leaves two-phase (or the backend fails) before that node: march and say so
    rho = _phases(new, line.tag).rho_m
    return abs(rho - inlet.rho_m) / inlet.rho_m * scale > _MATERIAL


_DEW_STEP = 0.01  # a mixture's last two-phase flash, this fraction above its dew pressure (see _march)
_EDGE_FLASHES = 4  # bisections for where a mixture leaves two-phase: within 10 % / 2^4 = 0.6 % of the pressure


def _edge(properties: Properties | None, line: Line, high: float, low: float) -> list[tuple[float, _Phases]]:
    """The lowest two-phase point found between ``high`` (two-phase) and ``low`` (not) [Pa abs] by bisection, as a
    node to interpolate to and hold below (a backend whose state gives no dew pressure): holding the last grid
    flash, up to 10 % above the dew pressure, gave a letdown line's friction 15-21 % low."""
    best: list[tuple[float, _Phases]] = []
    for _ in range(_EDGE_FLASHES):
        middle = 0.5 * (high + low)
        new, _ = _reflash(properties, middle, line)
        if new is None:
            low = middle
        else:
            high, best = middle, [(middle, _phases(new, line.tag))]
    return best


def _grid_below(inlet: float, p: float, every: float) -> float:
    """The highest pressure [Pa abs] of the grid inlet * (1 - every)^k at or below ``p``."""
    k = math.ceil(math.log(p / inlet) / math.log(1.0 - every))
    return inlet * (1.0 - every) ** k


def _interpolate(nodes: list[tuple[float, _Phases]], p: float) -> _Phases:
    """The properties at ``p`` [Pa abs], linear in pressure between the two flashes (highest pressure first) that
    bracket it; the nearest flash's outside them (above the inlet on a downhill line, below the last flash)."""
    if p >= nodes[0][0]:
        return nodes[0][1]
    for (p_hi, hi), (p_lo, lo) in zip(nodes, nodes[1:]):
        if p >= p_lo:
            w = (p_hi - p) / (p_hi - p_lo)
            sigma = (hi.sigma + w * (lo.sigma - hi.sigma)) if hi.sigma is not None and lo.sigma is not None else \
                (hi.sigma if w < 0.5 else lo.sigma)
            return _Phases(hi.x + w * (lo.x - hi.x), hi.rhol + w * (lo.rhol - hi.rhol), hi.rhog + w * (lo.rhog - hi.rhog),
                           hi.mul + w * (lo.mul - hi.mul), hi.mug + w * (lo.mug - hi.mug), sigma)
    return nodes[-1][1]


def _grid(inlet: float, p: float, every: float = _REEVALUATE) -> float:
    """The highest pressure [Pa abs] of the grid inlet * (1 - every)^k at or below ``p``'s step: the re-flash
    pressure, at most ``every`` (a fraction) above ``p``."""
    k = math.floor(math.log(p / inlet) / math.log(1.0 - every))
    return inlet * (1.0 - every) ** k


def _note(segments: int, how: str, held: str, along: bool, every: float = _REEVALUATE, cheap: bool = True) -> str:
    if segments == 1:
        return ("at the inlet (drop within 5 % of the inlet pressure and density within 5 % along the line: one "
                "segment)")
    if not cheap and along:
        grid = (f"re-flashed {how} at the inlet pressure times {1 - every:g}^k, linearly interpolated in pressure "
                f"between those flashes")
        return f"{grid}, then held: {held}" if held else grid
    if held:
        return f"re-flashed {how} each {every:.0%} of pressure fall, then held: {held}"
    if along:
        return (f"re-flashed {how} each {every:.0%} of pressure fall along the line (at the inlet "
                f"pressure times {1 - every:g}^k)")
    return "held at the inlet's (no property callable along the line)"


def _reflash(properties: Properties | None, p: float, line: Line) -> tuple[FluidState | None, str]:
    """Flash at ``p`` [Pa abs]: (the state, '') when it is two-phase, else (None, why not); the march then holds
    the last two-phase properties."""
    assert properties is not None
    try:
        new = properties(p, line.temperature)
    except (InputError, PropertyError) as exc:
        return None, f"the property backend failed at {p / 1e5:.4g} bar abs ({exc})"
    if not _usable(new):
        return None, f"the backend gave a {new.phase} state, not two-phase, at {p / 1e5:.4g} bar abs"
    return new, ""


_FLASH_STEP = 1e-3  # the two-phase part starts from a flash this fraction below the bubble pressure


def rate_letdown(line: Line, state: FluidState, liquid: Hydraulics, candidate: Candidate, mass_flow: float,
                 method: str | None, properties: Properties | None) -> Hydraulics | None:
    """A liquid letdown line that reaches its bubble pressure before its end: liquid to the flash point, two-phase
    after it; None when the liquid part does not reach the bubble pressure within the pipe (or nothing says where
    it is: no vapour or bubble pressure, no property callable), the liquid answer then standing.

    The pressure falls linearly along the pipe at the liquid gradient (friction plus rho g dz / L), so the flash
    point is x_f = (p_in - p_bubble) / gradient. From there the line is rated by :func:`rate_two_phase` from the
    flash at p_bubble (1 - 0.1 %) by ``properties`` (a pure fluid's isenthalpic HmassP flash at the inlet liquid's
    enthalpy, a mixture's flash at (p, T)); the fittings (two-phase multiplier) and fixed allowances are taken in
    the two-phase part, the conservative side. Flow regime, holdup, mixture velocity and density (the erosional
    and momentum criteria's) are the outlet's, the most vapour and so the worst point.
    """
    bubble = state.bubble_pressure if state.bubble_pressure is not None else state.vapour_pressure
    if bubble is None or properties is None or not (math.isfinite(bubble) and 0.0 < bubble < line.pressure):
        return None
    if not (line.length > 0.0 and math.isfinite(line.length)):
        return None
    gradient = liquid.drop_per_length + state.density * G * line.elevation / line.length
    if not (math.isfinite(gradient) and gradient > 0.0):
        return None
    x_f = (line.pressure - bubble) / gradient
    if x_f >= line.length:
        return None
    flashed = _flash(properties, bubble * (1.0 - _FLASH_STEP), line)
    rest = line.length - x_f
    tail = _tail(line, bubble, rest)
    two = rate_two_phase(tail, flashed, candidate, mass_flow, method, properties)
    assert two.two_phase is not None
    liquid_drop = liquid.drop_per_length * x_f
    liquid_static = state.density * G * line.elevation * x_f / line.length
    record = replace(two.two_phase, flash_point=x_f)
    velocity, momentum, where = two.velocity, two.momentum, "the flash point (the outlet could not be flashed)"
    if not two.choked and two.outlet_pressure is not None:
        outlet = _outlet_flow(properties, two.outlet_pressure, line, candidate, mass_flow, record)
        if outlet is not None:
            record, where = outlet, "the outlet, the most vapour and the worst point"
            velocity, momentum = record.mixture_velocity, record.mixture_density * record.mixture_velocity ** 2
    friction = liquid_drop + two.drop
    total = line.pressure if two.choked else liquid_drop + liquid_static + two.total_drop
    text = (f"letdown: liquid for {x_f:.4g} m to the bubble pressure {bubble / 1e5:.4g} bar abs ({liquid.method}), "
            f"then two-phase for {rest:.4g} m from a flash at {bubble * (1 - _FLASH_STEP) / 1e5:.4g} bar abs "
            f"(fittings and allowances taken there; flow regime, holdup, mixture velocity and density at {where}): "
            f"{two.method}")
    return replace(two, velocity=velocity, momentum=momentum, drop=friction,
                   drop_per_length=friction / (x_f + (two.choke_length if two.choked and two.choke_length else rest)),
                   static_drop=liquid_static + two.static_drop, total_drop=total,
                   outlet_pressure=0.0 if two.choked else line.pressure - total, method=text,
                   choke_length=x_f + two.choke_length if two.choke_length is not None else None, two_phase=record)


def _tail(line: Line, pressure: float, length: float) -> Line:
    """The two-phase part of a letdown line: from the flash point at ``pressure`` [Pa abs] for ``length`` [m]."""
    return replace(line, pressure=pressure, length=length, elevation=line.elevation * length / line.length)


def _flash(properties: Properties, p: float, line: Line) -> FluidState:
    try:
        flashed = properties(p, line.temperature)
    except (InputError, PropertyError) as exc:
        raise InputError(f"the flash below the bubble pressure at {p / 1e5:.4g} bar abs failed ({exc})",
                         field="pressure", value=line.pressure,
                         expected="a letdown line whose property backend flashes below its bubble pressure",
                         tag=line.tag) from exc
    if not _usable(flashed):
        raise InputError(f"the flash at {p / 1e5:.4g} bar abs, just below the bubble pressure, gave a "
                         f"{flashed.phase} state without per-phase values, not a two-phase one", field="phase",
                         value=flashed.phase, expected="a backend giving the two-phase state of a flashing liquid",
                         tag=line.tag)
    return flashed


def _outlet_flow(properties: Properties, p: float, line: Line, candidate: Candidate, m: float,
                 record: TwoPhaseFlow) -> TwoPhaseFlow | None:
    """The two-phase record at the outlet pressure ``p`` [Pa abs]; None when the flash there fails."""
    try:
        state = properties(p, line.temperature)
    except (InputError, PropertyError):
        return None
    if not _usable(state):
        return None
    ph = _phases(state, line.tag)
    diameter = candidate.inside_diameter
    roughness = line.roughness if line.roughness is not None else candidate.roughness
    area = 0.25 * math.pi * diameter**2
    angle = _angle(line.length, line.elevation)
    holdup = beggs_brill_holdup(m, ph, diameter, angle) if ph.sigma is not None else 1.0 - _void(
        m, ph, diameter, p, angle)[0]
    return replace(record, flow_regime=flow_regime(m, ph, diameter, roughness, angle), liquid_holdup=holdup,
                   superficial_liquid_velocity=m * (1 - ph.x) / (ph.rhol * area),
                   superficial_gas_velocity=m * ph.x / (ph.rhog * area), mixture_velocity=m / (ph.rho_m * area),
                   mixture_density=ph.rho_m, outlet_vapour_fraction=ph.x)
