"""The plugin host: a factory for the pluggy manager and a typed facade over it.

Nothing is built at import time. ``PluginHost.load()`` adds the hook specs, registers boresize's
own plugins (built-in criteria, backends and pipe classes use the same hooks as everyone else),
then loads the installed entry points of group ``boresize``. Core code calls the facade, never
``pm.hook`` directly. Set ``BORESIZE_TRACE_HOOKS=1`` to print every hook call to stderr: the hook, the
plugin and what it registered.
"""

from __future__ import annotations

import importlib
import os
import sys
from collections.abc import Callable, Iterable
from importlib.metadata import entry_points
from typing import Any

import pluggy

from boresize import hookspecs
from boresize.errors import PluginError
from boresize.registry import BackendRegistry, CriterionRegistry, PipeClassRegistry, Registry

__all__ = ["BUILTIN_PLUGINS", "ENTRY_POINT_GROUP", "TRACE_VARIABLE", "PluginHost", "get_plugin_manager"]

ENTRY_POINT_GROUP = "boresize"
#: The environment variable that turns hook tracing on (any value but empty or "0").
TRACE_VARIABLE = "BORESIZE_TRACE_HOOKS"
BUILTIN_PLUGINS = (
    "boresize.criteria.builtin",
    "boresize.properties.builtin",
    "boresize.pipes.builtin",
)


def get_plugin_manager(*, load_entry_points: bool = True, extra: Iterable[object] = ()) -> pluggy.PluginManager:
    """Build a plugin manager: specs, built-in plugins, then installed entry points and ``extra``.

    :param load_entry_points: False to leave out third-party plugins (tests, reproducible runs)
    :param extra: plugin objects or modules to register after the others (tests, embedding)
    """
    pm = pluggy.PluginManager(hookspecs.PROJECT)
    pm.add_hookspecs(hookspecs)
    for module_name in BUILTIN_PLUGINS:
        pm.register(importlib.import_module(module_name), name=module_name)
    if load_entry_points:
        _load_entry_points(pm)
    for plugin in extra:
        pm.register(plugin, name=getattr(plugin, "__name__", None) or type(plugin).__name__)
    if _tracing():  # hooks called through pm.hook; the registration hooks are traced by _fill
        pm.trace.root.setwriter(sys.stderr.write)
        pm.enable_tracing()
    return pm


def _tracing() -> bool:
    return os.environ.get(TRACE_VARIABLE, "") not in ("", "0")


def _trace_to_stderr(text: str) -> None:
    sys.stderr.write(f"boresize: trace: {text}\n")


def _load_entry_points(pm: pluggy.PluginManager) -> None:
    for ep in entry_points(group=ENTRY_POINT_GROUP):
        if pm.has_plugin(ep.name):
            continue
        try:
            plugin = ep.load()
        except Exception as exc:  # an installed plugin that cannot import: say which one
            raise PluginError(
                f"plugin {ep.name!r} (entry point {ep.value!r}) failed to load: {type(exc).__name__}: {exc}"
            ) from exc
        pm.register(plugin, name=ep.name)


def _fill(pm: pluggy.PluginManager, hook_name: str, registry: Registry[Any],
          trace: Callable[[str], None] | None = None) -> None:
    """Call one hook plugin by plugin, binding the registry to each plugin's name.

    Each implementation is called on its own (not through ``pm.hook``) so that the registry knows which
    plugin adds what; ``trace`` then receives one line per call: the hook, the plugin, what it registered.
    """
    caller = getattr(pm.hook, hook_name)
    for impl in caller.get_hookimpls():  # registration order (built-ins first)
        before = len(registry)
        try:
            impl.function(register=registry.bound_to(impl.plugin_name))
        except PluginError:
            raise
        except Exception as exc:
            raise PluginError(
                f"plugin {impl.plugin_name!r} raised in {hook_name}: {type(exc).__name__}: {exc}"
            ) from exc
        if trace is not None:
            added = registry.ids()[before:]
            what = f"{registry.kind} {', '.join(added)}" if added else "nothing"
            trace(f"{hook_name}(register) of plugin {impl.plugin_name!r} registered {what}")


class PluginHost:
    """Typed facade: what the installed plugins registered, collected once."""

    def __init__(self, pm: pluggy.PluginManager) -> None:
        self.pm = pm
        self.criteria = CriterionRegistry()
        self.backends = BackendRegistry()
        self.pipe_classes = PipeClassRegistry()
        trace = _trace_to_stderr if _tracing() else None
        _fill(pm, "boresize_register_criteria", self.criteria, trace)
        _fill(pm, "boresize_register_property_backends", self.backends, trace)
        _fill(pm, "boresize_register_pipe_classes", self.pipe_classes, trace)

    @classmethod
    def load(cls, *, load_entry_points: bool = True, extra: Iterable[object] = ()) -> PluginHost:
        """Build the manager and collect every registration (see :func:`get_plugin_manager`)."""
        return cls(get_plugin_manager(load_entry_points=load_entry_points, extra=extra))

    def plugin_names(self) -> tuple[str, ...]:
        return tuple(name for name, _ in self.pm.list_name_plugin())
