"""The whole line: straight-pipe friction plus fittings, static head, fixed allowances, gas compressibility.

``rate_line`` is what the engine calls for each candidate. Total drop = friction (Darcy-Weisbach,
friction factor by regime) + fittings (:mod:`boresize.hydraulics.fittings`) + static head rho g dz (rise positive)
+ fixed allowances (equipment, control valves), and the outlet pressure is the inlet pressure less
the total. A gas or vapour line whose flowing drop (friction + fittings + static) exceeds 10 % of its
inlet pressure (Crane TP-410) is marched in segments with the properties re-evaluated along it
(:mod:`boresize.hydraulics.compressible`); its fittings become an equivalent length L = K D / f spread
along the line, and the fixed allowances are taken at its end. For such a line ``mach`` is the
outlet's, the highest on the line, so that a Mach limit judges the worst point; velocity, momentum
and Reynolds number stay the inlet's, and ``drop_per_length`` is the mean over the line.
"""

from __future__ import annotations

from dataclasses import replace

from boresize.hydraulics.compressible import (
    SIMPLE_LIMIT,
    GasLine,
    GasProperties,
    Properties,
    march_gas_line,
    scaled_properties,
    segment_count,
)
from boresize.hydraulics.darcy import _pipe_flow
from boresize.hydraulics.fittings import FittingsLoss, fittings_loss
from boresize.hydraulics.friction import Regime, along_text, regime_text
from boresize.model import Candidate, FluidState, Hydraulics, Line

__all__ = ["G", "rate_line", "is_gas"]

G = 9.80665  # standard acceleration of gravity [m/s2] (CGPM 1901, exact)


def is_gas(state: FluidState) -> bool:
    """True for a gas, vapour, supercritical or dense fluid: the states whose density follows the pressure (a dense
    fluid is above its critical point: no saturation curve, so a long line is marched like a gas)."""
    return state.phase in ("gas", "supercritical", "dense")


def rate_line(line: Line, state: FluidState, candidate: Candidate, mass_flow: float,
              properties: Properties | None = None, two_phase_method: str | None = None,
              letdown: bool = False, march_properties: GasProperties | None = None) -> Hydraulics:
    """Hydraulics of ``candidate`` carrying ``mass_flow`` [kg/s] along ``line`` (SI throughout).

    :param line: length [m], elevation [m, rise positive], fittings, fixed_drop [Pa], inlet pressure
        [Pa abs] and temperature [K], fittings_method, compressible model
    :param state: properties at the inlet
    :param properties: (p [Pa abs], T [K]) -> FluidState, the equation of state along a gas line; None
        (or line-list values) scales the inlet density as an ideal gas
    :param two_phase_method: the service's two-phase correlation (the line's own ``two_phase_method`` wins)
    :param letdown: the service accepts two-phase lines: a liquid line whose pressure falls below its vapour (or
        bubble) pressure within its length is rated two-phase from that point
        (:func:`boresize.hydraulics.two_phase.rate_letdown`)
    :param march_properties: what a gas march reads of ``properties``, where the backend gives it cheaper (the same
        floats); None marches on ``properties``
    :returns: Hydraulics with every drop [Pa], the outlet pressure [Pa abs] and the method text
    :raises InputError: an unknown fitting or method (field "fittings", "fittings_method", "compressible",
        "two_phase_method"), a two-phase state without its per-phase values
    """
    if state.phase == "two-phase":  # a named two-phase correlation (boresize.hydraulics.two_phase)
        from boresize.hydraulics.two_phase import rate_two_phase
        return rate_two_phase(line, state, candidate, mass_flow, two_phase_method, properties)
    diameter, density = candidate.inside_diameter, state.density
    roughness = line.roughness if line.roughness is not None else candidate.roughness
    v, re, f, regime, dpl, mach = _pipe_flow(mass_flow, density, state.viscosity, diameter, roughness, line.length,
                                             state.speed_of_sound)
    drop = dpl * line.length
    loss = fittings_loss(line.fittings, line.fittings_method, reynolds=re, inside_diameter=diameter,
                         nps=candidate.nps_value)
    fittings = loss.drop(f, density, v, diameter)
    static = density * G * line.elevation
    fraction = (drop + fittings + static) / line.pressure
    if is_gas(state) and fraction > SIMPLE_LIMIT and line.length + loss.equivalent_length + loss.k_total > 0.0:
        hyd = Hydraulics(mass_flow=mass_flow, volume_flow=mass_flow / density, velocity=v, reynolds=re,
                         friction_factor=f, regime=regime, drop_per_length=dpl, drop=drop, momentum=density * v * v,
                         mach=mach, fittings_k=loss.k_total, fittings_method=loss.method)
        return _compressible(line, state, hyd, loss, (diameter, roughness), properties, fraction, march_properties)
    total = drop + fittings + static + line.fixed_drop
    bubble = state.bubble_pressure if state.bubble_pressure is not None else state.vapour_pressure
    if letdown and state.phase == "liquid" and bubble is not None and line.pressure - total < bubble:
        from boresize.hydraulics.two_phase import rate_letdown
        liquid = Hydraulics(mass_flow=mass_flow, volume_flow=mass_flow / density, velocity=v, reynolds=re,
                            friction_factor=f, regime=regime, drop_per_length=dpl, drop=drop,
                            momentum=density * v * v, method=_simple_text(state, fraction, loss, regime))
        flashed = rate_letdown(line, state, liquid, candidate, mass_flow, two_phase_method, properties)
        if flashed is not None:
            return flashed
    return Hydraulics(mass_flow=mass_flow, volume_flow=mass_flow / density, velocity=v, reynolds=re,
                      friction_factor=f, regime=regime, drop_per_length=dpl, drop=drop, momentum=density * v * v,
                      mach=mach, fittings_drop=fittings, static_drop=static, fixed_drop=line.fixed_drop,
                      total_drop=total, outlet_pressure=line.pressure - total,
                      method=_simple_text(state, fraction, loss, regime), fittings_k=loss.k_total,
                      fittings_method=loss.method, acceleration_drop=0.0, outlet_velocity=None, outlet_mach=None,
                      choked=False)


def _simple_text(state: FluidState, fraction: float, loss: FittingsLoss, regime: Regime) -> str:
    text = f"incompressible Darcy-Weisbach, {regime_text(regime)}"
    if is_gas(state):
        within = fraction <= SIMPLE_LIMIT
        text += (f", inlet density: drop {fraction:.1%} of inlet pressure, "
                 f"{'within' if within else 'above'} the {SIMPLE_LIMIT:.0%} limit of Crane TP-410"
                 f"{'' if within else ', not marched: the line has no length or fittings to march along'}")
    return f"{text}; {loss.method}"


def _compressible(line: Line, state: FluidState, hyd: Hydraulics, loss: FittingsLoss, bore: tuple[float, float],
                  properties: Properties | None, fraction: float, march_properties: GasProperties | None = None
                  ) -> Hydraulics:
    """March the line (pipe + fittings as equivalent length); split friction between pipe and fittings.

    :param bore: (inside diameter [m], absolute roughness [m])
    """
    diameter, roughness = bore
    scaled = properties is None or state.source == "table"
    along: GasProperties = (scaled_properties(state, line.pressure, line.temperature) if properties is None or scaled
                            else march_properties or properties)
    fittings_length = loss.equivalent_length + loss.k_total * diameter / hyd.friction_factor
    marched = line.length + fittings_length
    gas = march_gas_line(line.pressure, line.temperature, hyd.mass_flow, diameter, roughness, marched,
                         along, model=line.compressible or "isothermal", elevation=line.elevation,
                         segments=segment_count(fraction))
    pipe_drop = gas.friction_drop * line.length / marched
    fittings_drop = gas.friction_drop * fittings_length / marched  # 0 exactly without fittings: no -1e-15 remainder
    outlet = gas.outlet_pressure - line.fixed_drop

    def scale(x: float) -> float:  # a marched length to a distance along the pipe (fittings spread evenly)
        return min(line.length, x * line.length / marched)

    return replace(
        hyd, drop=pipe_drop, drop_per_length=_mean_gradient(gas, marched, hyd.drop_per_length),
        fittings_drop=fittings_drop, static_drop=gas.static_drop,
        acceleration_drop=gas.acceleration_drop, fixed_drop=line.fixed_drop, total_drop=line.pressure - outlet,
        outlet_pressure=outlet, outlet_velocity=gas.outlet_velocity, outlet_mach=gas.outlet_mach,
        choked=gas.choked, choke_length=scale(gas.reached_length) if gas.choked else None,
        peak_velocity=gas.peak_velocity, peak_density=gas.peak_density, peak_position=scale(gas.peak_length),
        peak_mach=gas.peak_mach, peak_mach_position=scale(gas.peak_mach_length) if gas.peak_mach else None,
        method=_compressible_text(gas, state, scaled, fraction, (marched, line.length), loss))


def _mean_gradient(gas: GasLine, marched: float, at_inlet: float) -> float:
    """The friction drop per metre [Pa/m], the mean over the length the flow passes (all of it unless it chokes);
    ``at_inlet`` (the inlet's gradient) for a line choked at its inlet."""
    passed = gas.reached_length if gas.choked else marched
    return gas.friction_drop / passed if passed > 0.0 else at_inlet


def _compressible_text(gas: GasLine, state: FluidState, scaled: bool, fraction: float,
                       lengths: tuple[float, float], loss: FittingsLoss) -> str:
    """The method text; ``lengths``: (marched length, pipe length) [m]."""
    marched, pipe = lengths
    source = ("inlet values scaled as an ideal gas (Z and viscosity held)" if scaled
              else f"{state.source} ({state.model}) re-evaluated along the line")
    text = (f"{gas.model} compressible flow in {gas.segments} segments with acceleration, properties from "
            f"{source}: the incompressible drop is {fraction:.1%} of inlet pressure, above the "
            f"{SIMPLE_LIMIT:.0%} limit of Crane TP-410; fittings as equivalent length L = K D/f ({loss.method}); "
            f"friction factor re-evaluated along the line ({along_text()}), drop per length the mean over the "
            f"length passed; velocity, momentum and Mach number the inlet's, the velocity-type criteria judging the "
            f"worst point along the line")
    marched_drop = gas.friction_drop + gas.static_drop + gas.acceleration_drop  # the balance closes on p_in - p_end
    if not gas.choked:
        text += f"; the marched drop is {marched_drop / (gas.outlet_pressure + marched_drop):.1%} of inlet pressure"
    else:
        text += (f"; CHOKED {gas.reached_length * pipe / marched:,.0f} m from the inlet, of {pipe:,.0f} m of "
                 f"pipe ({gas.reached_length:.4g} m of {marched:.4g} m marched, the fittings' equivalent length "
                 f"spread along the pipe): {gas.stop_reason}")
    return text
