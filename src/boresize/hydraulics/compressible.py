"""Gas and vapour lines whose drop is large against the inlet pressure (SI floats in and out).

Crane TP-410 (chapter 1, "compressible flow") allows the incompressible Darcy equation while the drop
stays under 10 % of the inlet pressure; above that the line must be treated as compressible.
:func:`march_gas_line` then divides the line into segments and, on each, solves the steady 1-D
momentum balance for constant area (mass flux G = m/A):

    dp + G^2 d(1/rho) + f/(2D) G^2/rho dx + rho g dz = 0

with the friction and static terms averaged over the segment (trapezoidal rule) and the density,
viscosity (hence f) re-evaluated by the equation of state at each segment end. ``isothermal`` holds
the inlet temperature; ``adiabatic`` keeps the stagnation enthalpy h + v^2/2 + g z constant with an
ideal-gas enthalpy, cp = k/(k-1) p/(rho T) and k = rho c^2/p at the inlet (so the gas cools as it
speeds up; the Joule-Thomson effect of a real gas is not included).

A segment without a subsonic solution is choked: the flow cannot pass that length of pipe. Segments
are halved up to :data:`REFINEMENTS` times before choking is declared; the record gives where. A trial
state the property backend cannot give (a solid, a failed flash) counts as no solution, and
``stop_reason`` then quotes the backend's message.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Protocol

from boresize.errors import BoresizeError, InputError
from boresize.hydraulics.darcy import flow_area
from boresize.hydraulics.friction import darcy_friction_factor
from boresize.model import FluidState

__all__ = ["SIMPLE_LIMIT", "MODELS", "Properties", "GasState", "GasProperties", "GasLine", "isothermal_mass_flow", "scaled_properties",
           "segment_count", "march_gas_line"]

SIMPLE_LIMIT = 0.10
"""Drop / inlet pressure up to which the incompressible equation is used [-] (Crane TP-410)."""
MODELS = ("isothermal", "adiabatic")
REFINEMENTS = 5
"""Times a segment that finds no solution is halved before the flow is called choked."""
_G = 9.80665  # standard gravity [m/s2]

Properties = Callable[[float, float], FluidState]
"""(pressure [Pa abs], temperature [K]) -> FluidState: the EOS along the line."""


class GasState(Protocol):
    """What the march reads of a state: a FluidState, or a backend's lighter point (CoolPropBackend.gas_march)."""

    @property
    def density(self) -> float: ...  # [kg/m3]
    @property
    def viscosity(self) -> float: ...  # [Pa s]
    @property
    def speed_of_sound(self) -> float | None: ...  # [m/s]


GasProperties = Callable[[float, float], GasState]
"""(pressure [Pa abs], temperature [K]) -> the state's density, viscosity and speed of sound."""


@dataclass(frozen=True)
class GasLine:
    """Result of a marched gas line. Pressures [Pa abs], drops [Pa], T [K], rho [kg/m3], v [m/s], x [m]."""

    outlet_pressure: float
    outlet_temperature: float
    outlet_density: float
    outlet_velocity: float
    outlet_mach: float | None
    friction_drop: float
    acceleration_drop: float
    static_drop: float
    choked: bool
    reached_length: float
    segments: int
    model: str
    stop_reason: str | None = None
    peak_velocity: float = 0.0  # the highest velocity met at a segment end (inlet included) [m/s]
    peak_density: float = 0.0  # the density there [kg/m3]
    peak_length: float = 0.0  # its distance from the inlet along the marched length [m]
    peak_mach: float | None = None  # the highest Mach number met at a segment end [-], None without c
    peak_mach_length: float = 0.0  # its distance from the inlet along the marched length [m]


@dataclass(frozen=True)
class _Point:
    p: float
    t: float
    nu: float  # specific volume [m3/kg]
    f: float  # Darcy friction factor [-]
    c: float | None  # speed of sound [m/s]


@dataclass(frozen=True)
class _Pipe:
    flux: float  # G [kg/m2 s]
    diameter: float
    roughness: float
    properties: GasProperties
    model: str
    friction_factor: float | None
    cp: float  # ideal-gas heat capacity for the adiabatic energy balance [J/kg K]
    floor: float  # lowest pressure a segment may reach before it is called choked [Pa]
    failures: list[str] = field(default_factory=list)  # property errors met by the current segment's trials


def isothermal_mass_flow(density_in: float, friction_factor: float, p_in: float, p_out: float, length: float,
                         diameter: float) -> float:
    """Isothermal ideal-gas flow in a pipe, with the acceleration term.

    m = A sqrt( rho1/p1 (p1^2 - p2^2) / (f L/D + 2 ln(p1/p2)) )

    :param density_in: [kg/m3]; :param friction_factor: Darcy [-]; :param p_in, p_out: [Pa abs]
    :param length: [m]; :param diameter: [m]
    :returns: mass flow [kg/s] (Crane TP-410 eq. 1-6; fluids.compressible.isothermal_gas)
    """
    ratio = density_in / p_in * (p_in**2 - p_out**2)
    return flow_area(diameter) * math.sqrt(ratio / (friction_factor * length / diameter + 2.0 * math.log(p_in / p_out)))


def scaled_properties(state: FluidState, p_in: float, t_in: float) -> Properties:
    """Ideal-gas scaling from the inlet state: rho ~ p/T (Z held), viscosity held, c ~ sqrt(T).

    Used when no equation of state can be asked along the line (line-list density and viscosity).
    """
    def along(pressure: float, temperature: float) -> FluidState:
        c = state.speed_of_sound * math.sqrt(temperature / t_in) if state.speed_of_sound else None
        return FluidState(density=state.density * pressure / p_in * t_in / temperature, viscosity=state.viscosity,
                          phase=state.phase, source=state.source, model=f"{state.model}, scaled as an ideal gas",
                          speed_of_sound=c)
    return along


def segment_count(drop_fraction: float) -> int:
    """Segments for a line whose incompressible drop is ``drop_fraction`` of its inlet pressure [-].

    About 1 % of the inlet pressure per segment, at least 10 and at most 100 (common practice).
    """
    return int(min(100, max(10, math.ceil(drop_fraction / 0.01))))


def _point(pipe: _Pipe, p: float, t: float) -> _Point | None:
    """The state at (p [Pa abs], T [K]), or None (recorded) when the property backend cannot give it."""
    try:
        state = pipe.properties(p, t)
    except BoresizeError as exc:  # a trial state off the physical path: no solution there, noted
        pipe.failures.append(str(exc))
        return None
    return _Point(p, t, 1.0 / state.density, _friction(pipe, state), state.speed_of_sound)


def _friction(pipe: _Pipe, state: GasState) -> float:
    """The fixed friction factor, or darcy_friction_factor's at the state's Reynolds number G D / mu [-]."""
    if pipe.friction_factor is not None:
        return pipe.friction_factor
    return darcy_friction_factor(pipe.flux * pipe.diameter / state.viscosity, pipe.roughness / pipe.diameter)[0]


def _state_at(pipe: _Pipe, a: _Point, p2: float, dz: float) -> _Point | None:
    """The point at pressure p2: same T (isothermal) or T from the stagnation enthalpy (adiabatic).

    None when the energy balance asks for a temperature below 0.7 times the segment's inlet temperature:
    no subsonic state lies there (at the sonic point of an ideal gas T/T0 = 2/(k+1) >= 0.75), or when
    the backend gives no state.
    """
    if pipe.model == "isothermal":
        return _point(pipe, p2, a.t)
    t2, b = a.t, _point(pipe, p2, a.t)
    for _ in range(3):  # the kinetic-energy term is small: three passes settle T to well under 0.01 K
        if b is None:
            return None
        t2 = a.t + (pipe.flux**2 * (a.nu**2 - b.nu**2) / 2.0 - _G * dz) / pipe.cp
        if t2 < 0.7 * a.t:
            return None
        b = _point(pipe, p2, t2)
    return b


def _terms(pipe: _Pipe, a: _Point, b: _Point, dx: float, dz: float) -> tuple[float, float, float]:
    """(friction, acceleration, static) drops over a segment [Pa]."""
    g2 = pipe.flux**2
    friction = g2 * dx / (4.0 * pipe.diameter) * (a.f * a.nu + b.f * b.nu)
    return friction, g2 * (b.nu - a.nu), _G * dz * 2.0 / (a.nu + b.nu)


def _segment(pipe: _Pipe, a: _Point, dx: float, dz: float) -> _Point | None:
    """Outlet point of one segment on the subsonic branch, or None when there is none (secant method)."""
    def residual(p2: float) -> tuple[float, _Point | None]:
        b = _state_at(pipe, a, p2, dz)
        return (a.p - p2 - sum(_terms(pipe, a, b, dx, dz)), b) if b is not None else (0.0, None)

    tolerance = 1e-9 * a.p
    x_prev = a.p - sum(_terms(pipe, a, a, dx, dz))
    if x_prev <= pipe.floor:
        return None
    r_prev, b = residual(x_prev)
    x = x_prev + r_prev
    for _ in range(40):
        if b is None or abs(r_prev) <= tolerance:
            return b
        if not pipe.floor < x < 2.0 * a.p:
            return None
        r, b = residual(x)
        if b is None:
            return None
        slope = (r - r_prev) / (x - x_prev) if x != x_prev else -1.0
        if slope >= 0.0:  # past the maximum of the residual: the supersonic branch, or no root at all
            return None
        x_prev, r_prev, x = x, r, x - r / slope
    return None


def _advance(pipe: _Pipe, a: _Point, dx: float, dz: float, depth: int = 0) -> tuple[_Point, float, bool]:
    """March one segment, halving it when it finds no solution. Returns (last point, length covered, ok)."""
    b = _segment(pipe, a, dx, dz)
    if b is not None:
        return b, dx, True
    if depth >= REFINEMENTS:
        return a, 0.0, False
    half, covered, ok = _advance(pipe, a, dx / 2.0, dz / 2.0, depth + 1)
    if not ok:
        return half, covered, False
    end, more, ok = _advance(pipe, half, dx / 2.0, dz / 2.0, depth + 1)
    return end, covered + more, ok


def _heat_capacity(inlet: GasState, p_in: float, t_in: float, model: str) -> float:
    """Ideal-gas cp [J/kg K] from the isentropic exponent k = rho c^2 / p (adiabatic model only)."""
    if model == "isothermal":
        return math.inf
    if not inlet.speed_of_sound:
        raise InputError("the adiabatic model needs the speed of sound, which the property backend does not give",
                         field="compressible", value=model, expected="isothermal, or a backend that gives c")
    k = inlet.density * inlet.speed_of_sound**2 / p_in
    return k / (k - 1.0) * p_in / (inlet.density * t_in) if k > 1.0 else math.inf


def march_gas_line(p_in: float, t_in: float, mass_flow: float, diameter: float, roughness: float, length: float,
                   properties: GasProperties, *, model: str = "isothermal", elevation: float = 0.0,
                   friction_factor: float | None = None, segments: int = 20) -> GasLine:
    """March a gas line from its inlet in ``segments`` equal lengths (halved where needed).

    :param p_in: inlet pressure [Pa abs]; :param t_in: inlet temperature [K]; :param mass_flow: [kg/s]
    :param diameter: inside diameter [m]; :param roughness: absolute roughness [m]
    :param length: length to march [m]: straight pipe plus the fittings' equivalent length
    :param properties: the EOS along the line, (p [Pa abs], T [K]) -> FluidState (or a GasState)
    :param model: ``isothermal`` or ``adiabatic``
    :param elevation: outlet minus inlet elevation [m], spread evenly over ``length``
    :param friction_factor: a fixed Darcy friction factor [-]; None re-evaluates it per point by regime
    :raises InputError: unknown model, or adiabatic without a speed of sound
    """
    if model not in MODELS:
        raise InputError(f"unknown compressible model {model!r}", field="compressible", value=model,
                         expected=f"one of {', '.join(MODELS)}")
    inlet = properties(p_in, t_in)
    pipe = _Pipe(mass_flow / flow_area(diameter), diameter, roughness, properties, model, friction_factor,
                 _heat_capacity(inlet, p_in, t_in, model), max(0.02 * p_in, 1000.0))
    a = start = _Point(p_in, t_in, 1.0 / inlet.density, _friction(pipe, inlet), inlet.speed_of_sound)
    sums, reached, dx, dz = [0.0, 0.0, 0.0], 0.0, length / segments, elevation / segments
    peaks = _Peaks(pipe.flux, start)
    for _ in range(segments):
        pipe.failures.clear()
        b, covered, ok = _advance(pipe, a, dx, dz)
        share = dz * covered / dx
        for i, term in enumerate(_terms(pipe, a, b, covered, share)):
            sums[i] += term
        a, reached = b, reached + covered
        peaks.meet(b, reached)
        if not ok:
            break
    return _result(pipe, start, a, sums, reached, length, segments, peaks)


class _Peaks:
    """The worst points met along the march: highest velocity (lowest density) and highest Mach number."""

    def __init__(self, flux: float, inlet: _Point) -> None:
        self.flux, self.nu, self.at = flux, inlet.nu, 0.0
        self.mach, self.mach_at = (flux * inlet.nu / inlet.c if inlet.c else None), 0.0

    def meet(self, point: _Point, x: float) -> None:
        """Take ``point``, at ``x`` [m] from the inlet, where it is worse than the worst so far."""
        if point.nu > self.nu:
            self.nu, self.at = point.nu, x
        if point.c and self.mach is not None and self.flux * point.nu / point.c > self.mach:
            self.mach, self.mach_at = self.flux * point.nu / point.c, x

def _result(pipe: _Pipe, start: _Point, end: _Point, sums: list[float], reached: float, length: float,
            segments: int, peaks: _Peaks) -> GasLine:
    velocity = pipe.flux * end.nu
    choked = reached < length * (1.0 - 1e-9)
    reason = None
    if choked:
        reason = "sonic limit" + (f", or no state from the property backend ({pipe.failures[-1]})"
                                  if pipe.failures else "")
    # Close the balance on the pressures themselves: the friction sum takes what the terms leave.
    friction = start.p - end.p - sums[1] - sums[2]
    return GasLine(outlet_pressure=end.p, outlet_temperature=end.t, outlet_density=1.0 / end.nu,
                   outlet_velocity=velocity, outlet_mach=velocity / end.c if end.c else None,
                   friction_drop=friction, acceleration_drop=sums[1], static_drop=sums[2], choked=choked,
                   reached_length=reached, segments=segments, model=pipe.model, stop_reason=reason,
                   peak_velocity=pipe.flux * peaks.nu, peak_density=1.0 / peaks.nu, peak_length=peaks.at,
                   peak_mach=peaks.mach, peak_mach_length=peaks.mach_at)
