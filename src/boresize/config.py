"""Criteria sets and pipe classes: the shipped set, merged with a user's criteria file (TOML).

A criteria file holds ``[service.NAME]`` tables whose keys are criterion ids with their options
(plus ``phase``, ``design_margin``, ``pipe_class`` and ``description``), and ``[pipe_class.NAME]``
tables. A service defined in the file replaces the shipped service of the same name whole, so what
a company writes is exactly what runs.
"""

from __future__ import annotations

import sys
from collections.abc import Mapping
from dataclasses import dataclass, field
from importlib import resources
from pathlib import Path
from typing import Any

from boresize.criteria.base import parse_options
from boresize.errors import CriteriaFileError, InputError
from boresize.pipes import PipeClass, pipe_class_from_table
from boresize.plugins import PluginHost
from boresize.units import parse_quantity

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

__all__ = ["Service", "SizingConfig", "load_config", "read_toml"]

SERVICE_KEYS = ("description", "phase", "design_margin", "pipe_class")
TOP_KEYS = ("version", "service", "pipe_class")


@dataclass(frozen=True)
class Service:
    """A named criteria set, resolved against the installed criteria (options in SI)."""

    name: str
    criteria: tuple[tuple[Any, Mapping[str, float]], ...]
    phase: str | None = None
    design_margin: float = 0.0
    pipe_class: str | None = None
    description: str = ""
    origin: str = "built-in"


@dataclass
class SizingConfig:
    """Services and pipe classes in force for a run, with where they came from."""

    services: dict[str, Service]
    pipe_classes: dict[str, PipeClass]
    version: str
    origin: str = "built-in"
    notes: list[str] = field(default_factory=list)

    def service_names(self) -> tuple[str, ...]:
        return tuple(sorted(self.services))

    def pipe_class(self, name: str | None) -> PipeClass:
        """The named class, or the default class; unknown names raise InputError listing the valid ones."""
        key = name or "default"
        if key not in self.pipe_classes:
            raise InputError(f"unknown pipe class {key!r}", field="pipe_class", value=key,
                             expected=f"one of {', '.join(sorted(self.pipe_classes))}")
        return self.pipe_classes[key]


def read_toml(path: str | Path) -> dict[str, Any]:
    """Read a TOML file; a syntax error becomes a CriteriaFileError naming the file."""
    try:
        with open(path, "rb") as handle:
            return tomllib.load(handle)
    except OSError as exc:
        raise CriteriaFileError(f"cannot read {path}: {exc.strerror}", field="criteria", value=str(path),
                                expected="a readable TOML file") from exc
    except tomllib.TOMLDecodeError as exc:
        raise CriteriaFileError(f"{path} is not valid TOML: {exc}", field="criteria", value=str(path),
                                expected="a TOML file with [service.NAME] and [pipe_class.NAME] tables") from exc


def _builtin_document() -> dict[str, Any]:
    text = resources.files("boresize.criteria").joinpath("sets/builtin.toml").read_text(encoding="utf-8")
    return tomllib.loads(text)


def _service(name: str, table: Mapping[str, Any], host: PluginHost, origin: str) -> Service:
    where = f"service.{name}"
    if not isinstance(table, Mapping):
        raise CriteriaFileError("a service must be a table", field=where, value=table,
                                expected="criterion ids with their options")
    criteria = []
    for key, options in table.items():
        if key in SERVICE_KEYS:
            continue
        if key not in host.criteria:
            raise CriteriaFileError(f"unknown criterion {key!r}", field=f"{where}.{key}", value=key,
                                    expected=f"a criterion id ({', '.join(host.criteria.ids())}) or one of "
                                             f"{', '.join(SERVICE_KEYS)}")
        if not isinstance(options, Mapping):
            raise CriteriaFileError("criterion options must be a table", field=f"{where}.{key}", value=options,
                                    expected='an inline table such as { max = "3 m/s" }')
        criterion = host.criteria.get(key)
        criteria.append((criterion, parse_options(criterion, options, f"{where}.{key}")))
    phase = table.get("phase")
    if phase not in (None, "liquid", "gas"):
        raise CriteriaFileError(f"unknown phase {phase!r}", field=f"{where}.phase", value=phase,
                                expected='"liquid" or "gas"')
    margin = parse_quantity(table.get("design_margin", 0.0), f"{where}.design_margin", "dimensionless")
    return Service(name=name, criteria=tuple(criteria), phase=phase, design_margin=margin,
                   pipe_class=table.get("pipe_class"), description=str(table.get("description", "")), origin=origin)


def _merge(config: SizingConfig, document: Mapping[str, Any], host: PluginHost, origin: str) -> None:
    unknown = sorted(set(document) - set(TOP_KEYS))
    if unknown:
        raise CriteriaFileError(f"unknown table or key {unknown[0]!r}", field=unknown[0], value=unknown[0],
                                expected=f"one of {', '.join(TOP_KEYS)}")
    for name, table in document.get("pipe_class", {}).items():
        config.pipe_classes[name] = pipe_class_from_table(name, table)
    for name, table in document.get("service", {}).items():
        config.services[name] = _service(name, table, host, origin)
    for service in config.services.values():
        if service.pipe_class is not None and service.pipe_class not in config.pipe_classes:
            raise CriteriaFileError(f"unknown pipe class {service.pipe_class!r}",
                                    field=f"service.{service.name}.pipe_class", value=service.pipe_class,
                                    expected=f"one of {', '.join(sorted(config.pipe_classes))}")
    if "version" in document:
        config.version = f"{config.version} + {document['version']}"


def load_config(host: PluginHost, path: str | Path | None = None) -> SizingConfig:
    """The shipped criteria sets and pipe classes, then the criteria file at ``path`` if given."""
    classes = {pc.name: pc for pc in host.pipe_classes}
    builtin = _builtin_document()
    config = SizingConfig(services={}, pipe_classes=classes, version=str(builtin.get("version", "builtin")))
    _merge(config, {k: v for k, v in builtin.items() if k != "version"}, host, "built-in")
    if path is not None:
        _merge(config, read_toml(path), host, str(path))
        config.origin = str(path)
    return config
