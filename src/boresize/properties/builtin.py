"""The built-in property backends, registered through the same hook a third-party plugin uses.

Order matters for the automatic choice (the first backend whose ``handles(line)`` is true serves a
line that names no backend): line list values, then CoolProp for pure fluids it knows, then water with an
alcohol or glycol (``aqueous``), then water with TEG, DEG, amines or several solutes (``aqueous-mixing``),
then CoolProp incompressible liquids and brines, then GERG-2008 through
CoolProp for mixtures of the 21 GERG-2008 components (natural gas), then thermo for other mixtures and the pure
components CoolProp lacks.
"""

from __future__ import annotations

from boresize.hookspecs import hookimpl
from boresize.properties.aqueous import AqueousBackend
from boresize.properties.aqueous_mixing import AqueousMixingBackend
from boresize.properties.coolprop import CoolPropBackend
from boresize.properties.coolprop_mixture import CoolPropMixtureBackend
from boresize.properties.gerg import GergBackend
from boresize.properties.given import TableBackend
from boresize.properties.thermo import ThermoBackend
from boresize.registry import BackendRegistry


@hookimpl
def boresize_register_property_backends(register: BackendRegistry) -> None:
    register.add(TableBackend())
    register.add(CoolPropBackend())
    register.add(AqueousBackend())
    register.add(AqueousMixingBackend())
    register.add(CoolPropMixtureBackend())
    register.add(GergBackend())
    register.add(ThermoBackend())
