"""The built-in criteria, registered through the same hook a third-party plugin uses."""

from __future__ import annotations

from boresize.criteria.drop_per_length import DropPerLength
from boresize.criteria.erosional import ErosionalVelocity
from boresize.criteria.feasibility import LineFeasibility
from boresize.criteria.flashing import Flashing
from boresize.criteria.flow_regime import FlowRegime
from boresize.criteria.gas_noise import NoiseVelocity
from boresize.criteria.gravity_drain import GravityDrain
from boresize.criteria.mach import MachLimit
from boresize.criteria.momentum import Momentum
from boresize.criteria.npsh import NpshMargin
from boresize.criteria.outlet_pressure import OutletPressure
from boresize.criteria.property_crosscheck import PropertyCrosscheck
from boresize.criteria.velocity import VelocityLimits
from boresize.hookspecs import hookimpl
from boresize.registry import CriterionRegistry


@hookimpl
def boresize_register_criteria(register: CriterionRegistry) -> None:
    register.add(ErosionalVelocity())
    register.add(DropPerLength())
    register.add(VelocityLimits())
    register.add(NpshMargin())
    register.add(GravityDrain())
    register.add(Flashing())
    register.add(Momentum())
    register.add(NoiseVelocity())
    register.add(MachLimit())
    register.add(OutletPressure())
    register.add(PropertyCrosscheck())
    register.add(FlowRegime())
    register.add(LineFeasibility())
