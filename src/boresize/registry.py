"""Registries that hooks fill: one object per id, with the plugin that added it.

A hook implementation receives a registry already bound to its plugin's name, so a duplicate id
can be rejected with an error that names both plugins. Each registry checks what it is given against
the documented contract (criterion, property backend, pipe class) and names every part that is missing
or wrong, with the plugin that registered it.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterator
from collections.abc import Set as AbstractSet
from typing import Any, Generic, TypeVar

from boresize.criteria.base import OptionSpec
from boresize.criteria.protocol import KNOWN_PHASES
from boresize.errors import PluginError
from boresize.pipes import PipeClass

T = TypeVar("T")

__all__ = ["Registry", "CriterionRegistry", "BackendRegistry", "PipeClassRegistry", "KEBAB_CASE"]

#: An id as criteria files and line lists name it: lower-case words of letters and digits joined by hyphens.
KEBAB_CASE = re.compile(r"[a-z][a-z0-9]*(?:-[a-z0-9]+)*")

#: Checks an object before it is accepted: (object, plugin name) -> None, or raises PluginError.
Check = Callable[[Any, str], None]


class Registry(Generic[T]):
    """Objects by id, in registration order, each remembering the plugin that added it.

    :param kind: what is registered ("criterion", "property backend", "pipe class"), for messages
    :param key: how to read an object's id
    :param check: validates an object and the plugin registering it (raises PluginError)
    """

    def __init__(self, kind: str, key: Callable[[T], str], check: Check | None = None) -> None:
        self.kind = kind
        self._key = key
        self._check = check
        self._items: dict[str, T] = {}
        self._owners: dict[str, str] = {}
        self._plugin = "<unknown>"

    def bound_to(self, plugin_name: str) -> Registry[T]:
        """Set the plugin whose hook is about to run; returns self for the hook call."""
        self._plugin = plugin_name
        return self

    def add(self, item: T) -> None:
        """Register ``item``; an item that breaks the contract, or a second item with the same id, raises
        PluginError naming the plugin (both plugins for a duplicate)."""
        if self._check is not None:
            self._check(item, self._plugin)
        try:
            ident = self._key(item)
        except AttributeError as exc:
            raise _without_id(self.kind, self._plugin, item) from exc
        if ident in self._items:
            raise PluginError(
                f"{self.kind} id {ident!r} is registered twice: by plugin {self._owners[ident]!r} "
                f"and by plugin {self._plugin!r}; uninstall one of them or rename the id"
            )
        self._items[ident] = item
        self._owners[ident] = self._plugin

    def get(self, ident: str) -> T:
        try:
            return self._items[ident]
        except KeyError:
            raise KeyError(ident) from None

    def owner(self, ident: str) -> str:
        return self._owners[ident]

    def ids(self) -> tuple[str, ...]:
        return tuple(self._items)

    def __contains__(self, ident: object) -> bool:
        return ident in self._items

    def __iter__(self) -> Iterator[T]:
        return iter(self._items.values())

    def __len__(self) -> int:
        return len(self._items)


def _without_id(kind: str, plugin: str, item: object) -> PluginError:
    return PluginError(f"plugin {plugin!r} registered a {kind} without an id: {item!r}")


def _text_fault(item: object, name: str) -> str | None:
    """What is wrong with a required text attribute (missing, not text, empty), or None."""
    if not hasattr(item, name):
        return f"{name} is missing"
    value = getattr(item, name)
    if not isinstance(value, str):
        return f"{name} {value!r} is not text"
    return None if value.strip() else f"{name} is empty"


def _id_fault(item: object) -> str | None:
    ident = getattr(item, "id")
    if not isinstance(ident, str):
        return f"id {ident!r} is not text"
    if KEBAB_CASE.fullmatch(ident):
        return None
    return f"id {ident!r} is not kebab-case (lower-case letters and digits joined by hyphens: 'acme-rack-min-nps')"


def _phases_fault(item: object) -> str | None:
    if not hasattr(item, "phases"):
        return "phases is missing"
    phases = getattr(item, "phases")
    known = ", ".join(sorted(KNOWN_PHASES))
    if not isinstance(phases, AbstractSet):
        return f"phases {phases!r} is not a set of phases ({known})"
    if not phases:
        return f"phases is empty; expected a set of one or more of {known}"
    unknown = sorted(repr(p) for p in phases if p not in KNOWN_PHASES)
    return f"phases holds {', '.join(unknown)}, not one of {known}" if unknown else None


def _options_fault(item: object) -> str | None:
    if not hasattr(item, "options"):
        return "options is missing"
    options = getattr(item, "options")
    if not isinstance(options, tuple):
        return f"options {options!r} is not a tuple of OptionSpec"
    wrong = [f"options[{i}] {o!r} is not an OptionSpec" for i, o in enumerate(options) if not isinstance(o, OptionSpec)]
    return "; ".join(wrong) or None


def _callable_fault(item: object, name: str) -> str | None:
    if not hasattr(item, name):
        return f"{name} is missing"
    return None if callable(getattr(item, name)) else f"{name} is not callable"


#: The optional traits the sizing core reads (see :class:`boresize.criteria.base.Criterion`): flags must be bools.
_TRAIT_FLAGS = ("proposes_first_guess",)
_SIZE_TRENDS = (None, "larger-passes", "falls-with-size")


def _traits_fault(item: object) -> str | None:
    """What is wrong with the optional traits a criterion declares (a misspelt trend would be read as unknown)."""
    faults = []
    trend = getattr(item, "size_trend", None)
    if trend not in _SIZE_TRENDS:
        faults.append(f"size_trend {trend!r} is not one of 'larger-passes', 'falls-with-size' or None")
    faults += [f"{name} {getattr(item, name)!r} is not True or False" for name in _TRAIT_FLAGS
               if not isinstance(getattr(item, name, False), bool)]
    if hasattr(item, "diameter_at_limit") and not callable(getattr(item, "diameter_at_limit")):
        faults.append("diameter_at_limit is not callable")
    if getattr(item, "proposes_first_guess", False) is True and not hasattr(item, "diameter_at_limit"):
        faults.append("proposes_first_guess is True but diameter_at_limit is missing")
    return "; ".join(faults) or None


def _refuse(kind: str, item: object, plugin: str, faults: list[str | None], guide: str) -> None:
    """Raise one PluginError naming every fault found, or return when there is none."""
    found = [fault for fault in faults if fault]
    if found:
        raise PluginError(f"{kind} {getattr(item, 'id', item)!r} of plugin {plugin!r} is not usable: "
                          f"{'; '.join(found)} (see DEVELOPERS.md, {guide})")


def check_criterion(item: object, plugin: str) -> None:
    """Check the whole criterion protocol (:class:`boresize.criteria.protocol.CriterionProtocol`)."""
    if not hasattr(item, "id"):
        raise _without_id("criterion", plugin, item)
    faults = [_id_fault(item), _text_fault(item, "title"), _text_fault(item, "source"), _phases_fault(item),
              _options_fault(item), _callable_fault(item, "evaluate"), _traits_fault(item)]
    _refuse("criterion", item, plugin, faults, '"The criterion object"')


def check_backend(item: object, plugin: str) -> None:
    """Check a property backend (:class:`boresize.properties.base.PropertyBackend`)."""
    if not hasattr(item, "id"):
        raise _without_id("property backend", plugin, item)
    faults = [_id_fault(item), _text_fault(item, "title")]
    faults += [_callable_fault(item, name) for name in ("handles", "state", "version")]
    _refuse("property backend", item, plugin, faults, '"boresize_register_property_backends(register)"')


def check_pipe_class(item: object, plugin: str) -> None:
    """A pipe class must be a :class:`boresize.pipes.PipeClass` (its sizes and schedules are checked when built)."""
    if not isinstance(item, PipeClass):
        raise PluginError(f"plugin {plugin!r} registered a {type(item).__name__} as a pipe class, not a PipeClass: "
                          f"{item!r}; build one with pipe_class_from_table (see DEVELOPERS.md, "
                          f'"boresize_register_pipe_classes(register)")')


class CriterionRegistry(Registry[Any]):
    def __init__(self) -> None:
        super().__init__("criterion", lambda c: c.id, check_criterion)


class BackendRegistry(Registry[Any]):
    def __init__(self) -> None:
        super().__init__("property backend", lambda b: b.id, check_backend)


class PipeClassRegistry(Registry[PipeClass]):
    def __init__(self) -> None:
        super().__init__("pipe class", lambda p: p.name, check_pipe_class)
