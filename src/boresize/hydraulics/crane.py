"""Crane Co., Technical Paper 410 (TP-410) data for fittings: the fully turbulent friction factor fT of clean
commercial steel by nominal size, K of a valve from its Kv or Cv, and the geometric losses of reducers (SI floats;
K and fT are dimensionless).
"""

from __future__ import annotations

import math

from boresize.errors import InputError

__all__ = ["CRANE_ROUGHNESS", "CRANE_FT_TABLE", "crane_ft", "k_from_kv", "k_from_cv", "contraction_k",
           "expansion_k"]

CRANE_ROUGHNESS = 0.0018 * 0.0254  # clean commercial steel, 0.0018 in [m] (Crane TP-410)
#: Crane TP-410's table "pipe friction data for clean commercial steel pipe with flow in zone of complete
#: turbulence": (NPS [in], fT [-]), as printed in the 2009 and later editions (sizes 1/2 to 36 in; where Crane
#: prints a range, 5-6, 10-14, 16-22, 24-36 in, both ends are listed). Read from fluids.friction.Crane_fts
#: (its nominal DN 15 to 900 mm are these NPS) and a public Crane-based calculator's copy of A-27, which agree.
CRANE_FT_TABLE: tuple[tuple[float, float], ...] = (
    (0.5, 0.026), (0.75, 0.024), (1.0, 0.022), (1.25, 0.021), (1.5, 0.020), (2.0, 0.019), (2.5, 0.018),
    (3.0, 0.017), (4.0, 0.016), (5.0, 0.015), (6.0, 0.015), (8.0, 0.014), (10.0, 0.013), (14.0, 0.013),
    (16.0, 0.012), (22.0, 0.012), (24.0, 0.011), (36.0, 0.011),
)


def crane_ft(nps: float, inside_diameter: float | None = None) -> float:
    """Crane's fully turbulent friction factor fT of clean commercial steel for a fitting of nominal size ``nps``.

    The value printed in :data:`CRANE_FT_TABLE` (Crane TP-410). A size Crane does not print takes the value of
    the next smaller printed size (fT falls as size grows, so this errs high); above 36 in, the 36 in value.
    Below 1/2 in Crane prints nothing: its formula fT = 0.25 / log10(e / 3.7 D)^2 (e = 0.0018 in) at
    ``inside_diameter``, but never less than the 1/2 in value.

    :param nps: nominal pipe size [in]; :param inside_diameter: [m], needed only below NPS 1/2
    :returns: Darcy friction factor [-] (0.015 for NPS 6)
    """
    smallest, first = CRANE_FT_TABLE[0]
    if nps < smallest:
        if inside_diameter is None:
            raise InputError(f"NPS {nps:g} is below Crane's fT table", field="nps", value=nps,
                             expected="the inside diameter, for Crane's fT formula below NPS 1/2")
        log_term = math.log10(CRANE_ROUGHNESS / (3.7 * inside_diameter))
        return max(first, 0.25 / (log_term * log_term))
    return next(ft for size, ft in reversed(CRANE_FT_TABLE) if size <= nps)


def k_from_kv(kv: float, inside_diameter: float) -> float:
    """K of a valve from its Kv [m3/h of water at 1 bar]: K = 1.6e9 D^4 / Kv^2, D [m] (Crane TP-410M)."""
    return 1.6e9 * inside_diameter**4 / kv**2


def k_from_cv(cv: float, inside_diameter: float) -> float:
    """K of a valve from its Cv [US gal/min of water at 1 psi], with Kv = Cv / 1.156 (IEC 60534-1)."""
    return k_from_kv(cv / 1.156, inside_diameter)


def contraction_k(beta: float, angle: float = 180.0) -> float:
    """Contraction K referred to the SMALLER bore (Crane TP-410): beta = d_small/d_large [-], angle [deg].

    0.8 sin(a/2)(1 - b^2) up to 45 deg, else 0.5 (1 - b^2) sqrt(sin(a/2)).
    """
    half = math.radians(angle) / 2.0
    if angle <= 45.0:
        return 0.8 * math.sin(half) * (1.0 - beta**2)
    return 0.5 * (1.0 - beta**2) * math.sqrt(math.sin(half))


def expansion_k(beta: float, angle: float = 180.0) -> float:
    """Expansion K referred to the SMALLER bore (Crane TP-410): beta = d_small/d_large [-], angle [deg].

    2.6 sin(a/2)(1 - b^2)^2 up to 45 deg, else (1 - b^2)^2.
    """
    if angle <= 45.0:
        return 2.6 * math.sin(math.radians(angle) / 2.0) * (1.0 - beta**2) ** 2
    return (1.0 - beta**2) ** 2
