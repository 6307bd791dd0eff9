"""Property backends: turn a line's fluid and a state point into a :class:`~boresize.model.FluidState`.

Importing this package does not import CoolProp; each backend imports its library on first use.
"""

from __future__ import annotations

from boresize.properties.base import PropertyBackend, check_plausible
from boresize.properties.coolprop import CoolPropBackend
from boresize.properties.given import TableBackend

__all__ = [
    "PropertyBackend",
    "CoolPropBackend",
    "TableBackend",
    "builtin_backends",
    "check_plausible",
]


def builtin_backends() -> tuple[PropertyBackend, ...]:
    """New instances of the backends boresize ships: coolprop, then table.

    ``CoolPropBackend.handles`` declines a line that gives its own density and viscosity, so the
    table backend serves such a line whatever the order.
    """
    return (CoolPropBackend(), TableBackend())
