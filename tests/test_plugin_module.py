"""boresize.plugin: everything a plugin author imports, from one module."""

from __future__ import annotations

import boresize.plugin as plugin
from boresize import errors, hookspecs
from boresize.criteria import base
from boresize.criteria.base import Criterion
from boresize.criteria.protocol import CriterionProtocol

EXPECTED = {
    "hookimpl", "CriterionRegistry", "BackendRegistry", "PipeClassRegistry",
    "CriterionProtocol", "Criterion", "CriterionContext", "OptionSpec", "QuantityKind", "KNOWN_PHASES",
    "parse_options", "verdict", "Verdict", "VerdictStatus",
    "Line", "FluidState", "Candidate", "Hydraulics", "Phase",
    "PropertyBackend", "check_plausible", "describe_conditions", "backend_state", "independent_backend", "NoSecondOpinion",
    "PipeClass", "pipe_class_from_table", "NPS_LABELS", "normalise_nps", "nps_value",
    "BoresizeError", "InputError", "UnitError", "CriteriaFileError", "CatalogueError", "PropertyError", "PluginError",
    "MissingModuleError",
}


def test_all_lists_exactly_what_a_plugin_author_needs():
    assert len(plugin.__all__) == len(set(plugin.__all__))
    assert set(plugin.__all__) == EXPECTED
    assert all(hasattr(plugin, name) for name in plugin.__all__)


def test_every_error_of_the_tree_is_exported():
    # UsageError is the command line's own (a bad option): no plugin raises it. The error module's helpers
    # (printable, missing_module, OPTIONAL_MODULES) are not errors.
    tree = {name for name in errors.__all__ if isinstance(getattr(errors, name), type)
            and issubclass(getattr(errors, name), BaseException)}
    assert "MissingModuleError" in tree and "InputError" in tree  # the filter keeps the errors
    assert tree - {"UsageError"} <= set(plugin.__all__)


def test_the_names_are_the_ones_boresize_uses():
    assert plugin.hookimpl is hookspecs.hookimpl
    assert (plugin.Criterion, plugin.CriterionContext, plugin.OptionSpec, plugin.verdict) == (
        base.Criterion, base.CriterionContext, base.OptionSpec, base.verdict)


def test_the_base_class_and_the_builtins_follow_the_protocol(host):
    class Rule(Criterion):
        id, title, source = "acme-rule", "a rule", "company"

    assert isinstance(Rule(), CriterionProtocol)
    assert all(isinstance(criterion, CriterionProtocol) for criterion in host.criteria)
    assert not isinstance(object(), CriterionProtocol)
    assert plugin.KNOWN_PHASES == frozenset({"liquid", "gas", "two-phase", "supercritical", "dense"})
