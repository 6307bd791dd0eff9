"""The two-phase pressure-drop correlations a line or a service may name (``two_phase_method``).

The names are the fluids library's own (the keys of ``fluids.two_phase.two_phase_correlations``, e.g.
"Beggs-Brill", "Lockhart_Martinelli", "Friedel") and ``homogeneous`` (Darcy-Weisbach at the no-slip density); a name is matched without regard to case, spaces, hyphens
and underscores ("beggs brill") and stored as the library spells it. The rating itself is elsewhere (the two-phase hydraulics).
"""

from __future__ import annotations

import functools
import re

__all__ = ["library_methods", "two_phase_methods", "two_phase_method_name"]


@functools.lru_cache(maxsize=1)
def library_methods() -> tuple[str, ...]:
    """The correlation names of ``fluids.two_phase.two_phase_correlations``, sorted."""
    from fluids.two_phase import two_phase_correlations

    return tuple(sorted(two_phase_correlations))


def two_phase_methods() -> tuple[str, ...]:
    """Every name ``two_phase_method`` accepts: ``homogeneous`` and the fluids library's correlations."""
    return ("homogeneous", *library_methods())


def two_phase_method_name(text: str) -> str | None:
    """The fluids library's spelling of the correlation ``text`` names (case and separators ignored), or
    "homogeneous" (the no-slip method the two-phase hydraulics offers besides the library's), else None."""
    wanted = _key(text)
    if wanted == "homogeneous":
        return "homogeneous"
    return next((name for name in two_phase_methods() if _key(name) == wanted), None) if wanted else None


def _key(name: str) -> str:
    return re.sub(r"[\s_\-]+", "", name.casefold())
