"""The built-in property backends, registered through the same hook a third-party plugin uses."""

from __future__ import annotations

from boresize.hookspecs import hookimpl
from boresize.properties.coolprop import CoolPropBackend
from boresize.properties.table import TableBackend
from boresize.registry import BackendRegistry


@hookimpl
def boresize_register_property_backends(register: BackendRegistry) -> None:
    register.add(TableBackend())
    register.add(CoolPropBackend())
