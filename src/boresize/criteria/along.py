"""Where a velocity-type criterion judges a line: the worst point along it, and the words that say where.

A line rated with one density (a liquid, or a gas line within the simple method's limit) has one velocity all
along: it is judged as it is, and the texts do not change. A marched gas line keeps the worst points its march
met (:class:`boresize.model.Hydraulics` ``peak_velocity``, ``peak_density``, ``peak_position``, ``peak_mach``):
where the density is lowest the velocity, rho*v^2 = G^2/rho, v*sqrt(rho) = G/sqrt(rho) and v*rho^b (b < 1) are
all highest at a fixed mass flux G, so that one point is the worst for the velocity, momentum, erosional and
noise criteria alike. A minimum velocity is judged at the lower of the inlet and outlet velocities.
"""

from __future__ import annotations

from typing import NamedTuple

from boresize.criteria.base import CriterionContext
from boresize.model import Hydraulics

__all__ = ["Point", "worst_point", "slowest_point", "place", "metres"]


class Point(NamedTuple):
    """A point a criterion judges: velocity [m/s], density [kg/m3] and the words that say where ("" when the
    line has one velocity all along)."""

    velocity: float
    density: float
    where: str


def metres(distance: float) -> str:
    """A distance as the record writes it: "1,200 m", "35.5 m"."""
    return f"{distance:,.0f} m" if abs(distance) >= 100.0 else f"{distance:.3g} m"


def place(h: Hydraulics, position: float, at_outlet: bool, inlet_value: str) -> str:
    """Where a worst point lies: " at the inlet", " at the outlet, 1,200 m (inlet 20.3 m/s)", " 850 m from the
    inlet (inlet ...)"; ``inlet_value`` is the value there, written with its unit."""
    if at_outlet and not h.choked:
        return f" at the outlet, {metres(position)} from the inlet (inlet {inlet_value})"
    if position <= 0.0:
        return " at the inlet"
    if h.choke_length is not None and position >= h.choke_length * (1.0 - 1e-9):
        return f" {metres(position)} from the inlet, where the flow chokes (inlet {inlet_value})"
    return f" {metres(position)} from the inlet (inlet {inlet_value})"


def worst_point(context: CriterionContext, inlet_value: str | None = None) -> Point:
    """The point of highest velocity (lowest density) along the line; ``inlet_value``: the judged value at the
    inlet as the reason writes it (the inlet velocity when not given)."""
    h = context.hydraulics
    if h.peak_velocity is None or h.peak_density is None or h.peak_position is None:
        return Point(h.velocity, context.state.density, "")
    at_outlet = h.outlet_velocity is not None and h.peak_velocity >= h.outlet_velocity
    inlet = inlet_value if inlet_value is not None else f"{h.velocity:.3g} m/s"
    return Point(h.peak_velocity, h.peak_density, place(h, h.peak_position, at_outlet, inlet))


def slowest_point(context: CriterionContext) -> Point:
    """The lower-velocity end of the line (for a minimum velocity): the inlet unless the outlet is slower."""
    h = context.hydraulics
    if h.peak_velocity is None or h.outlet_velocity is None or h.outlet_velocity >= h.velocity:
        return Point(h.velocity, context.state.density, " at the inlet" if h.peak_velocity is not None else "")
    return Point(h.outlet_velocity, h.mass_flow / (h.outlet_velocity * h.volume_flow / h.velocity),
                 place(h, context.line.length, True, f"{h.velocity:.3g} m/s"))
