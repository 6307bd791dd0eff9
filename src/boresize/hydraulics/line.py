"""The whole line: straight-pipe friction plus fittings, static head and fixed allowances.

``rate_line`` is what the engine calls for each candidate. Fittings are added by the fittings
method; static head is rho*g*dz with the rise positive; fixed allowances are added as given.
"""

from __future__ import annotations

from dataclasses import replace

from boresize.hydraulics.darcy import rate_pipe
from boresize.model import Candidate, FluidState, Hydraulics, Line

__all__ = ["G", "rate_line"]

G = 9.80665  # standard acceleration of gravity [m/s2] (CGPM 1901, exact)


def rate_line(line: Line, state: FluidState, candidate: Candidate, mass_flow: float) -> Hydraulics:
    """Hydraulics of ``candidate`` carrying ``mass_flow`` [kg/s] along ``line`` (SI throughout).

    Total drop = friction (Darcy-Weisbach) + fittings + static (rho g dz, rise positive) + fixed
    allowances; outlet pressure = inlet pressure - total drop [Pa abs].
    """
    roughness = line.roughness if line.roughness is not None else candidate.roughness
    hyd = rate_pipe(mass_flow, state.density, state.viscosity, candidate.inside_diameter, roughness,
                    line.length, state.speed_of_sound)
    static = state.density * G * line.elevation
    fittings = 0.0
    total = hyd.drop + fittings + static + line.fixed_drop
    return replace(hyd, fittings_drop=fittings, static_drop=static, fixed_drop=line.fixed_drop,
                   total_drop=total, outlet_pressure=line.pressure - total)
