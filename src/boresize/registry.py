"""Registries that hooks fill: one object per id, with the plugin that added it.

A hook implementation receives a registry already bound to its plugin's name, so a duplicate id
can be rejected with an error that names both plugins.
"""

from __future__ import annotations

from collections.abc import Callable, Iterator
from typing import Any, Generic, TypeVar

from boresize.errors import PluginError

T = TypeVar("T")

__all__ = ["Registry", "CriterionRegistry", "BackendRegistry", "PipeClassRegistry"]


class Registry(Generic[T]):
    """Objects by id, in registration order, each remembering the plugin that added it.

    :param kind: what is registered ("criterion", "property backend", "pipe class"), for messages
    :param key: how to read an object's id
    :param check: validates an object before it is accepted (raises PluginError)
    """

    def __init__(self, kind: str, key: Callable[[T], str], check: Callable[[T], None] | None = None) -> None:
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
        """Register ``item``; a second item with the same id raises PluginError naming both plugins."""
        try:
            ident = self._key(item)
        except AttributeError as exc:
            raise PluginError(
                f"plugin {self._plugin!r} registered a {self.kind} without an id: {item!r}"
            ) from exc
        if ident in self._items:
            raise PluginError(
                f"{self.kind} id {ident!r} is registered twice: by plugin {self._owners[ident]!r} "
                f"and by plugin {self._plugin!r}; uninstall one of them or rename the id"
            )
        if self._check is not None:
            self._check(item)
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


def _check_criterion(item: Any) -> None:
    missing = [name for name in ("id", "title", "phases", "options", "evaluate") if not hasattr(item, name)]
    if missing:
        raise PluginError(f"criterion {getattr(item, 'id', item)!r} lacks {', '.join(missing)}")


def _check_backend(item: Any) -> None:
    missing = [name for name in ("id", "title", "handles", "state", "version") if not hasattr(item, name)]
    if missing:
        raise PluginError(f"property backend {getattr(item, 'id', item)!r} lacks {', '.join(missing)}")


class CriterionRegistry(Registry[Any]):
    def __init__(self) -> None:
        super().__init__("criterion", lambda c: c.id, _check_criterion)


class BackendRegistry(Registry[Any]):
    def __init__(self) -> None:
        super().__init__("property backend", lambda b: b.id, _check_backend)


class PipeClassRegistry(Registry[Any]):
    def __init__(self) -> None:
        super().__init__("pipe class", lambda p: p.name)
