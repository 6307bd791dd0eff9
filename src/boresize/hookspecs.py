"""Hook specifications: the whole contract between boresize and its plugins.

Every hook receives a small registry object with an ``add(...)`` method rather than returning loose
values, so that boresize can tell which plugin registered what (and reject duplicate ids naming both) and
check each object against its contract, naming what is missing. Built-in criteria, property backends and pipe
classes are registered through these same hooks. Plugin authors import ``hookimpl`` and the rest from
:mod:`boresize.plugin`.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

import pluggy

if TYPE_CHECKING:
    from boresize.registry import BackendRegistry, CriterionRegistry, PipeClassRegistry

PROJECT = "boresize"
hookspec = pluggy.HookspecMarker(PROJECT)
hookimpl = pluggy.HookimplMarker(PROJECT)

__all__ = ["PROJECT", "hookimpl", "hookspec"]


@hookspec
def boresize_register_criteria(register: CriterionRegistry) -> None:
    """Add criteria (objects that judge a candidate size) to boresize.

    :param register: call ``register.add(criterion)`` once per criterion; a criterion follows
        :class:`boresize.criteria.protocol.CriterionProtocol`: ``id`` (kebab-case), ``title``, ``source``,
        ``phases``, ``options`` and ``evaluate(context) -> Verdict`` (see DEVELOPERS.md).
    """


@hookspec
def boresize_register_property_backends(register: BackendRegistry) -> None:
    """Add property backends (objects that turn fluid, pressure and temperature into a FluidState).

    :param register: call ``register.add(backend)``; a backend follows
        :class:`boresize.properties.base.PropertyBackend`: ``id`` (kebab-case), ``title``, ``handles(line)``,
        ``state(line, pressure, temperature)`` and ``version()``.
    """


@hookspec
def boresize_register_pipe_classes(register: PipeClassRegistry) -> None:
    """Add named pipe classes (material, roughness, schedule by NPS, allowed sizes).

    :param register: call ``register.add(pipe_class)`` with a :class:`boresize.pipes.PipeClass`.
    """
