"""The built-in criteria, registered through the same hook a third-party plugin uses."""

from __future__ import annotations

from boresize.criteria.drop_per_length import DropPerLength
from boresize.criteria.erosional import ErosionalVelocity
from boresize.criteria.velocity import VelocityLimits
from boresize.hookspecs import hookimpl
from boresize.registry import CriterionRegistry


@hookimpl
def boresize_register_criteria(register: CriterionRegistry) -> None:
    register.add(ErosionalVelocity())
    register.add(DropPerLength())
    register.add(VelocityLimits())
