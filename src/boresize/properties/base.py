"""What a property backend is, and the checks every backend shares.

A property backend turns a line's fluid and a state point (pressure [Pa abs], temperature [K])
into a :class:`~boresize.model.FluidState`. Backends are registered as plugins through the
``boresize_register_property_backends`` hook; this module only defines the contract.
"""

from __future__ import annotations

import math
from typing import Protocol, runtime_checkable

from boresize.errors import InputError, PropertyError
from boresize.model import FluidState, Line

__all__ = [
    "PropertyBackend",
    "DENSITY_RANGE",
    "VISCOSITY_RANGE",
    "ZERO_CELSIUS",
    "describe_conditions",
    "check_absolute",
    "check_plausible",
    "is_mixture",
]

#: Plausible density [kg/m3]: a plausibility guard (common practice), not a physical law.
#: A gas at a deep vacuum or a liquid metal falls outside it on purpose: such lines need review.
DENSITY_RANGE: tuple[float, float] = (0.01, 2000.0)
#: Plausible dynamic viscosity [Pa s]: a plausibility guard (common practice).
VISCOSITY_RANGE: tuple[float, float] = (1e-6, 10.0)
#: 0 degC in kelvin [K] (definition of the Celsius scale).
ZERO_CELSIUS = 273.15


@runtime_checkable
class PropertyBackend(Protocol):
    """A source of fluid properties.

    :ivar id: short id used in line lists and reports ("coolprop", "table")
    :ivar title: a human title for reports
    """

    id: str
    title: str

    def handles(self, line: Line) -> bool:
        """True when this backend may serve ``line`` when the user did not pick a backend."""
        ...

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """Properties of ``line.fluid`` at ``pressure`` [Pa abs] and ``temperature`` [K].

        :raises boresize.errors.InputError: for a user mistake (field "fluid", "temperature" or
            "pressure")
        :raises boresize.errors.PropertyError: when the property call fails or returns a value
            outside a plausible range
        """
        ...

    def version(self) -> str:
        """Version of the library or data behind the backend."""
        ...


def describe_conditions(pressure: float, temperature: float) -> str:
    """Conditions as an engineer reads them, e.g. "1.01325 bar abs, 20 degC".

    :param pressure: [Pa abs]
    :param temperature: [K]
    """
    return f"{pressure / 1e5:.6g} bar abs, {round(temperature - ZERO_CELSIUS, 2):g} degC"


def check_absolute(pressure: float, temperature: float) -> None:
    """Refuse a pressure [Pa abs] or temperature [K] that is not a finite number above zero (every backend's first
    check).

    :raises InputError: naming the field, the value and what was expected
    """
    for field, value in (("pressure", pressure), ("temperature", temperature)):
        if not (math.isfinite(value) and value > 0.0):
            raise InputError(f"{value:g} is not above zero", field=field, value=value,
                             expected=f"an absolute {field} above zero")


def check_plausible(
    density: float, viscosity: float, *, backend: str, fluid: str, pressure: float, temperature: float
) -> None:
    """Raise :class:`PropertyError` when a computed property is not finite or is implausible.

    :param density: [kg/m3], must lie in :data:`DENSITY_RANGE`
    :param viscosity: dynamic viscosity [Pa s], must lie in :data:`VISCOSITY_RANGE`
    :param backend: backend id, named in the message
    :param fluid: fluid name, named in the message
    :param pressure: [Pa abs]; :param temperature: [K] (named in the message)
    """
    if (type(density) is float and type(viscosity) is float and DENSITY_RANGE[0] <= density <= DENSITY_RANGE[1]
            and VISCOSITY_RANGE[0] <= viscosity <= VISCOSITY_RANGE[1]):
        return  # both plausible (a NaN or an infinity fails a finite range): no message to build
    where = f"{fluid} at {describe_conditions(pressure, temperature)}"
    checks = (
        ("density", density, DENSITY_RANGE, "kg/m3"),
        ("viscosity", viscosity, VISCOSITY_RANGE, "Pa s"),
    )
    for name, value, (low, high), unit in checks:
        if not (math.isfinite(value) and low <= value <= high):
            raise PropertyError(
                f"{backend}: {name} {value:.6g} {unit} for {where} is outside the plausible range "
                f"{low:g} to {high:g} {unit}"
            )


def is_mixture(fluid: str) -> bool:
    """True for a mixture written as "a:0.5, b:0.5", "a[0.5]&b[0.5]" or "a&b"."""
    return any(mark in fluid for mark in (":", "&", "[", ","))
