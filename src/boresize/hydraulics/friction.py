"""Darcy friction factor for single-phase flow in round pipe (SI, dimensionless).

``colebrook`` solves the Colebrook-White equation exactly through the Wright omega function;
``darcy_friction_factor`` is what the rest of boresize calls: it picks the flow regime and
returns the factor with the regime's name; ``regime_text`` says in words which factor a regime used.

Regimes (the critical zone of L. F. Moody, "Friction factors for pipe flow", Trans. ASME 66 (1944) 671-684,
also Crane TP-410's: flow there "may be either laminar or turbulent"): laminar below Re 2000, turbulent from
Re 4000. In between the factor is not predictable, so boresize takes the larger of 64/Re and Colebrook: a drop
check then errs on the safe side whichever the flow is. The band's lower end sits below the onset of sustained
turbulence measured by K. Avila et al., "The onset of turbulence in pipe flow", Science 333 (2011) 192-196
(Re about 2040), so no flow that may be turbulent is given the laminar factor.
"""

from __future__ import annotations

import math
from typing import Literal

from boresize.errors import InputError
from boresize.hydraulics.wright import wright_omega  # measured: see hydraulics/wright.py

__all__ = [
    "LAMINAR_LIMIT",
    "TURBULENT_LIMIT",
    "Regime",
    "colebrook",
    "laminar",
    "swamee_jain",
    "darcy_friction_factor",
    "regime_text",
    "along_text",
]

Regime = Literal["laminar", "transition", "turbulent"]

LAMINAR_LIMIT = 2000.0
"""Reynolds number below which pipe flow is taken as laminar [-] (lower end of Moody's 1944 critical zone)."""
TURBULENT_LIMIT = 4000.0
"""Reynolds number from which pipe flow is taken as turbulent [-] (upper end of Moody's 1944 critical zone)."""

_K = 2.0 / math.log(10.0)  # 1/sqrt(f) = -_K ln(...) is Colebrook's -2 log10(...)


def _check_reynolds(reynolds: float) -> None:
    if not (math.isfinite(reynolds) and reynolds > 0.0):
        raise InputError(
            f"Reynolds number {reynolds!r} is not usable",
            field="reynolds",
            value=reynolds,
            expected="a finite Reynolds number > 0",
        )


def _check_relative_roughness(relative_roughness: float) -> None:
    if not (math.isfinite(relative_roughness) and 0.0 <= relative_roughness < 1.0):
        raise InputError(
            f"relative roughness {relative_roughness!r} is not usable",
            field="relative_roughness",
            value=relative_roughness,
            expected="a relative roughness e/D with 0 <= e/D < 1",
        )


def colebrook(reynolds: float, relative_roughness: float) -> float:
    r"""Darcy friction factor from the Colebrook-White equation, solved exactly in closed form.

    Solves :math:`1/\sqrt{f} = -2\log_{10}\left(\frac{e/D}{3.7} + \frac{2.51}{Re\sqrt{f}}\right)`
    without iteration.

    Derivation: write :math:`x = 1/\sqrt{f}`, :math:`a = (e/D)/3.7`, :math:`b = 2.51/Re`,
    :math:`k = 2/\ln 10`. Then :math:`y = a + b x` satisfies :math:`y = e^{-x/k}`, so
    :math:`z = y/(b k)` satisfies :math:`z e^{z} = e^{a/(bk)}/(bk)` and
    :math:`z = W(e^{t}) = \omega(t)` with :math:`t = a/(bk) - \ln(bk)`, where
    :math:`\omega` is the Wright omega function. Hence
    :math:`x = k\,\omega(t) - a/b = -k \ln(b k\,\omega(t))`. The first form is used when the
    roughness term is small, the second otherwise (it avoids the cancellation of two large
    terms at high :math:`Re\,e/D`). :math:`\omega(t)` is evaluated directly, so nothing
    overflows at high Reynolds numbers (``lambertw(exp(t))`` would).

    :param reynolds: Reynolds number [-], finite and > 0
    :param relative_roughness: relative roughness e/D [-], 0 <= e/D < 1 (0 = smooth pipe)
    :returns: Darcy friction factor [-]
    :raises InputError: for a Reynolds number or relative roughness outside those ranges

    Accuracy: within a few units in the last place of a 50-digit solution over
    4e3 <= Re <= 1e8, 0 <= e/D <= 0.05 (see tests/test_hydraulics.py).

    References: C. F. Colebrook, "Turbulent flow in pipes, with particular reference to the
    transition region between the smooth and rough pipe laws", J. ICE 11(4):133-156 (1939),
    doi:10.1680/ijoti.1939.13150. Lambert W solution: J. Keady, "Colebrook-White formula for
    pipe flows", J. Hydraulic Eng. 124(1):96 (1998); A. A. More, "Analytical solutions for the
    Colebrook and White equation and for pressure drop in ideal gas flow in pipes",
    Chem. Eng. Sci. 61(16):5515-5519 (2006).

    >>> round(colebrook(1e5, 1e-4), 7)
    0.0185139
    """
    _check_reynolds(reynolds)
    _check_relative_roughness(relative_roughness)
    return _colebrook(reynolds, relative_roughness)


def _colebrook(reynolds: float, relative_roughness: float) -> float:
    """:func:`colebrook` on inputs already checked (Re [-] finite > 0, 0 <= e/D < 1); returns f [-]."""
    a_over_b = relative_roughness * reynolds / (3.7 * 2.51)
    bk = 2.51 * _K / reynolds
    omega = wright_omega(a_over_b / _K - math.log(bk))
    k_omega = _K * omega
    if a_over_b <= 0.5 * k_omega:
        x = k_omega - a_over_b
    else:
        x = -_K * math.log(bk * omega)
    return 1.0 / (x * x)


def laminar(reynolds: float) -> float:
    """Darcy friction factor of fully developed laminar flow, 64/Re (Hagen-Poiseuille).

    :param reynolds: Reynolds number [-], finite and > 0
    :returns: Darcy friction factor [-]
    :raises InputError: for a Reynolds number that is not finite and > 0
    """
    _check_reynolds(reynolds)
    return 64.0 / reynolds


def swamee_jain(reynolds: float, relative_roughness: float) -> float:
    """Darcy friction factor from the explicit Swamee-Jain approximation (for comparison only).

    f = 0.25 / [log10((e/D)/3.7 + 5.74/Re^0.9)]^2. Stated range 5e3 <= Re <= 1e8,
    1e-6 <= e/D <= 1e-2; off Colebrook by up to a few per cent. boresize rates pipes with
    :func:`colebrook`; this is kept to show the size of the approximation.

    :param reynolds: Reynolds number [-], finite and > 0
    :param relative_roughness: relative roughness e/D [-], 0 <= e/D < 1
    :returns: Darcy friction factor [-]

    Reference: P. K. Swamee and A. K. Jain, "Explicit equations for pipe-flow problems",
    J. Hydraulics Div. ASCE 102(5):657-664 (1976).
    """
    _check_reynolds(reynolds)
    _check_relative_roughness(relative_roughness)
    log_term = math.log10(relative_roughness / 3.7 + 5.74 / reynolds**0.9)
    return 0.25 / (log_term * log_term)


def darcy_friction_factor(reynolds: float, relative_roughness: float) -> tuple[float, Regime]:
    """Darcy friction factor and flow regime for single-phase flow in a round pipe.

    - Re < 2000: laminar, f = 64/Re.
    - 2000 <= Re < 4000: transition (Moody's critical zone). The flow may be laminar or turbulent;
      f is the larger of 64/Re and :func:`colebrook` at that Re, so a pressure-drop check errs on the
      safe side whichever it is. (Colebrook is the larger everywhere in the band for any e/D >= 0: it
      falls with Re and rises with e/D, so it is never below its smooth-pipe value at Re 4000, 0.0399,
      while 64/Re never exceeds 0.032 there.)
    - Re >= 4000: turbulent, f from :func:`colebrook` (exact).

    :param reynolds: Reynolds number [-], finite and > 0
    :param relative_roughness: relative roughness e/D [-], 0 <= e/D < 1
    :returns: (Darcy friction factor [-], regime name)
    :raises InputError: for a Reynolds number that is not finite and > 0 (field ``reynolds``)
        or a relative roughness outside 0 <= e/D < 1 (field ``relative_roughness``)
    """
    _check_reynolds(reynolds)
    _check_relative_roughness(relative_roughness)
    if reynolds < LAMINAR_LIMIT:
        return 64.0 / reynolds, "laminar"
    turbulent = _colebrook(reynolds, relative_roughness)
    if reynolds < TURBULENT_LIMIT:
        return max(64.0 / reynolds, turbulent), "transition"
    return turbulent, "turbulent"


def regime_text(regime: Regime) -> str:
    """Which friction factor :func:`darcy_friction_factor` used for ``regime``, and why, for the record."""
    if regime == "laminar":
        return f"laminar friction factor 64/Re (Re below {LAMINAR_LIMIT:.0f})"
    if regime == "transition":
        return (f"transition (Re {LAMINAR_LIMIT:.0f}-{TURBULENT_LIMIT:.0f}, Moody's critical zone, where the flow "
                f"may be laminar or turbulent): the larger of 64/Re and Colebrook, here Colebrook, so the drop "
                f"errs on the safe side")
    return "Colebrook friction factor"


def along_text() -> str:
    """The rule of :func:`darcy_friction_factor` in one phrase, for a line whose regime may change along it."""
    return (f"64/Re below Re {LAMINAR_LIMIT:.0f}, the larger of 64/Re and Colebrook up to Re {TURBULENT_LIMIT:.0f}, "
            f"Colebrook above")
