"""Everything a plugin author imports, from one module.

A plugin is a module with hook implementations marked by :data:`hookimpl`, installed with an entry point
in group ``boresize`` (DEVELOPERS.md, "Writing a plugin")::

    from boresize.plugin import Criterion, CriterionContext, OptionSpec, Verdict, hookimpl, verdict

    class MinimumBore(Criterion):
        id = "acme-minimum-bore"
        title = "ACME: no line below a minimum inside diameter"
        source = "company"
        options = (OptionSpec("min_id", "length", "40 mm", "mm", "smallest inside diameter"),)

        def evaluate(self, context: CriterionContext) -> Verdict: ...

    @hookimpl
    def boresize_register_criteria(register: CriterionRegistry) -> None:
        register.add(MinimumBore())

Tests of a plugin build a context and run a criterion on a line with :mod:`boresize.testing`.
"""

from __future__ import annotations

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, parse_options, verdict
from boresize.criteria.protocol import KNOWN_PHASES, CriterionProtocol
from boresize.errors import (
    BoresizeError,
    CatalogueError,
    CriteriaFileError,
    InputError,
    MissingModuleError,
    PluginError,
    PropertyError,
    UnitError,
)
from boresize.hookspecs import hookimpl
from boresize.model import Candidate, FluidState, Hydraulics, Line, Phase, Verdict, VerdictStatus
from boresize.pipes import NPS_LABELS, PipeClass, normalise_nps, nps_value, pipe_class_from_table
from boresize.properties.base import PropertyBackend, check_plausible, describe_conditions
from boresize.properties.second_opinion import NoSecondOpinion, backend_state, independent_backend
from boresize.registry import BackendRegistry, CriterionRegistry, PipeClassRegistry
from boresize.units import QuantityKind

__all__ = [
    # hooks and the registries they receive
    "hookimpl",
    "CriterionRegistry",
    "BackendRegistry",
    "PipeClassRegistry",
    # criteria
    "CriterionProtocol",
    "Criterion",
    "CriterionContext",
    "OptionSpec",
    "QuantityKind",
    "KNOWN_PHASES",
    "parse_options",
    "verdict",
    "Verdict",
    "VerdictStatus",
    # what a criterion reads, and what a property backend returns
    "Line",
    "FluidState",
    "Candidate",
    "Hydraulics",
    "Phase",
    # property backends
    "PropertyBackend",
    "check_plausible",
    "describe_conditions",
    "backend_state",
    "independent_backend",
    "NoSecondOpinion",
    # pipe classes
    "PipeClass",
    "pipe_class_from_table",
    "NPS_LABELS",
    "normalise_nps",
    "nps_value",
    # errors
    "BoresizeError",
    "InputError",
    "UnitError",
    "CriteriaFileError",
    "CatalogueError",
    "PropertyError",
    "PluginError",
    "MissingModuleError",
]
