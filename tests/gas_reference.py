"""An independent march of a long horizontal gas line, for tests (not boresize's method).

Real-gas properties from CoolProp (``PropsSI``), the Darcy friction factor from the fluids library
(``fluids.friction.friction_factor``, Clamond's solution of Colebrook), and the steady 1-D isothermal
momentum balance of a constant bore (mass flux G = m/A, specific volume v = 1/rho):

    dp + G^2 dv + f G^2 v / (2 D) dx = 0,   so   dx = -(dp + G^2 dv) 2 D / (f G^2 v)

stepped in PRESSURE (boresize steps in length): the pressure falls from the inlet in small equal steps and
the length each step takes is summed (f v averaged over the step). The outlet pressure is where the summed
length reaches the line's; the flow chokes where a pressure step no longer gains length (dx/dp = 0: the
isothermal sonic point G^2 (-dv/dp)_T = 1), and the length summed there is the choke length.
"""

from __future__ import annotations

import math
from typing import NamedTuple

from CoolProp.CoolProp import PropsSI
from fluids.friction import friction_factor


class Reference(NamedTuple):
    outlet_pressure: float | None  # [Pa abs], None when the flow chokes first
    choke_length: float | None  # [m] from the inlet, None when the line carries the flow to its end
    outlet_density: float  # at the outlet, or at the choke point [kg/m3]


def isothermal_march(fluid: str, p_in: float, t: float, mass_flow: float, diameter: float, roughness: float,
                     length: float, steps: int = 4000) -> Reference:
    """March ``length`` [m] of horizontal pipe from ``p_in`` [Pa abs] at ``t`` [K] with ``mass_flow`` [kg/s];
    the pressure steps are ``p_in / steps``."""
    flux = mass_flow / (math.pi * diameter**2 / 4.0)

    def point(p: float) -> tuple[float, float]:
        rho = PropsSI("D", "P", p, "T", t, fluid)
        mu = PropsSI("V", "P", p, "T", t, fluid)
        return 1.0 / rho, friction_factor(Re=flux * diameter / mu, eD=roughness / diameter)

    step, x, p = p_in / steps, 0.0, p_in
    nu, f = point(p)
    while p - step > 0.01 * p_in:
        nu2, f2 = point(p - step)
        dx = (step - flux**2 * (nu2 - nu)) * 2.0 * diameter / (flux**2 * (f * nu + f2 * nu2) / 2.0)
        if dx <= 0.0:  # past the sonic point: this flow cannot pass more pipe
            return Reference(None, x, 1.0 / nu)
        if x + dx >= length:  # the outlet lies within this step: interpolate
            share = (length - x) / dx
            return Reference(p - share * step, None, 1.0 / (nu + share * (nu2 - nu)))
        x, p, nu, f = x + dx, p - step, nu2, f2
    return Reference(None, x, 1.0 / nu)
