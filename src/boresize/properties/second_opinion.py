"""A second, independent property backend for a line: what the ``property-crosscheck`` criterion compares with.

Independent means another library with other equations: a state from CoolProp (reference equations, HEOS
mixtures, incompressible solutions: any backend id starting ``coolprop``) is checked with thermo, a state from
thermo with CoolProp (its reference equation for a pure fluid, HEOS for a mixture). The line's own density and
viscosity (backend ``table``) and any other backend have no second opinion here: :func:`independent_backend`
raises :class:`NoSecondOpinion` saying why. A plugin may compare with a backend of its own through
:func:`backend_state`, which takes a backend object as well as a built-in id.
"""

from __future__ import annotations

import threading
from dataclasses import replace
from typing import Any

from boresize.errors import BoresizeError, InputError
from boresize.model import FluidState, Line
from boresize.properties.base import is_mixture

__all__ = ["SECOND_OPINION_BACKENDS", "NoSecondOpinion", "backend_state", "independent_backend"]

#: The built-in backends :func:`backend_state` builds by id (its own instances, apart from the sizing's).
SECOND_OPINION_BACKENDS = ("coolprop", "coolprop-mixture", "thermo")

#: CoolProp incompressible solution codes -> the solute's name as thermo reads it (solutions in water, mass
#: fraction). Brines and pure heat-transfer fluids have no component model in thermo.
_SOLUTE_NAMES = {"MEG": "ethylene glycol", "MPG": "propylene glycol", "MGL": "glycerol", "MMA": "methanol",
                 "MEA": "ethanol", "MAM": "ammonia"}

#: Molar masses [g/mol] of water and those solutes (IUPAC atomic weights), for a composition given in moles.
_MOLAR_MASSES = {"water": 18.015, "MEG": 62.068, "MPG": 76.095, "MGL": 92.094, "MMA": 32.042, "MEA": 46.069,
                 "MAM": 17.031}
_WATER = ("water", "h2o", "7732-18-5")

_lock = threading.Lock()
_backends: dict[str, Any] = {}


class NoSecondOpinion(BoresizeError):
    """A line whose properties no independent backend can check; the message says why."""


def _builtin(backend_id: str) -> Any:
    """The built-in backend of ``backend_id`` (one instance per process, built on first use)."""
    with _lock:
        if backend_id not in _backends:
            if backend_id == "coolprop":
                from boresize.properties.coolprop import CoolPropBackend

                _backends[backend_id] = CoolPropBackend()
            elif backend_id == "coolprop-mixture":
                from boresize.properties.coolprop_mixture import CoolPropMixtureBackend

                _backends[backend_id] = CoolPropMixtureBackend()
            elif backend_id == "thermo":
                from boresize.properties.thermo import ThermoBackend

                _backends[backend_id] = ThermoBackend()
            else:
                raise InputError(f"no built-in property backend {backend_id!r} for a second opinion", field="backend",
                                 value=backend_id, expected=f"one of {', '.join(SECOND_OPINION_BACKENDS)}, or a "
                                                            "backend object")
        return _backends[backend_id]


def backend_state(backend: Any, line: Line, pressure: float, temperature: float,
                  fluid: str | None = None) -> FluidState:
    """The state of ``line``'s fluid (or ``fluid``) at ``pressure`` [Pa abs] and ``temperature`` [K] from
    ``backend``: a built-in id of :data:`SECOND_OPINION_BACKENDS` or a backend object (a plugin's own).

    The line's own choices for its first backend are left out (its ``backend``, ``eos``, given density,
    viscosity and vapour pressure): the second backend uses its own default model.

    :raises InputError: an unknown backend id, or the backend refuses the line (its message, with the line's tag)
    :raises PropertyError: the backend failed, returned something that is not a FluidState or an implausible value
    """
    chosen = _builtin(backend) if isinstance(backend, str) else backend
    bare = replace(line, fluid=fluid if fluid is not None else line.fluid, backend=None, eos=None, density=None,
                   viscosity=None, vapour_pressure=None)
    name = getattr(chosen, "id", type(chosen).__name__)
    from boresize.properties.select import checked_state

    return checked_state(chosen, bare, pressure, temperature, f"property backend {name!r}")


def independent_backend(line: Line, state: FluidState) -> tuple[str, str]:
    """(backend id, fluid text for it) of a second backend independent of the one that made ``state``.

    :raises NoSecondOpinion: the line's own values (``table``), a brine or heat-transfer fluid CoolProp alone
        models, a pure fluid CoolProp does not know, or a backend with no second opinion built in
    """
    source = state.source
    if source == "table":
        raise NoSecondOpinion("the line gives its own density and viscosity (backend table): there is no model to "
                              "check; give the fluid by name without density and viscosity, or use a service "
                              "without property-crosscheck")
    if source.startswith("coolprop") or source in ("gerg-2008", "aqueous"):  # CoolProp's equations -> thermo's
        return "thermo", _thermo_fluid(line.fluid)
    if source == "thermo":
        if is_mixture(line.fluid):
            return "coolprop-mixture", _aqueous_solution(line) or line.fluid
        if _builtin("coolprop")._known_name(line.fluid) is None:
            raise NoSecondOpinion(f"CoolProp has no equation for {line.fluid!r}, so thermo's state has no "
                                  "independent second opinion")
        return "coolprop", line.fluid
    raise NoSecondOpinion(f"backend {source!r} has no independent second backend built in (a plugin can compare "
                          "with boresize.plugin.backend_state)")


def _thermo_fluid(fluid: str) -> str:
    """The fluid as thermo reads it: a CoolProp incompressible solution as its components by mass."""
    from boresize.properties.coolprop_mixture import incompressible_spec

    spec = incompressible_spec(fluid)
    if spec is None:
        return fluid
    code, fraction = spec
    if code not in _SOLUTE_NAMES or fraction is None:
        raise NoSecondOpinion(f"{fluid!r} is a CoolProp incompressible fluid ({code}) with no component model in "
                              f"thermo: no independent second opinion")
    return f"mass: water {1.0 - fraction:.6g}, {_SOLUTE_NAMES[code]} {fraction:.6g}"


def _aqueous_solution(line: Line) -> str | None:
    """A water + alcohol, glycol or ammonia composition as CoolProp's incompressible solution
    (``INCOMP::MEG[0.3]``, Melinder's correlations), else None (other mixtures: CoolProp HEOS)."""
    from boresize.properties.composition import basis_of, parse_composition
    from boresize.properties.coolprop_mixture import SOLUTES

    try:
        composition = parse_composition(line.fluid, basis=basis_of(line.extra))
    except InputError:
        return None
    names = [" ".join(name.lower().split()) for name in composition.components]
    if len(names) != 2 or sum(name in _WATER for name in names) != 1:
        return None
    solute = names[1] if names[0] in _WATER else names[0]
    code = SOLUTES.get(solute)
    if code not in _SOLUTE_NAMES:
        return None
    fraction = composition.fractions[names.index(solute)]
    if composition.basis == "mole":
        solute_mass = fraction * _MOLAR_MASSES[code]
        fraction = solute_mass / (solute_mass + (1.0 - fraction) * _MOLAR_MASSES["water"])
    return f"INCOMP::{code}[{fraction:.6f}]"
