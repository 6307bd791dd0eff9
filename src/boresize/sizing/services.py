"""Criteria sets and pipe classes: the shipped set, merged with a user's criteria file (TOML).

A criteria file holds ``[service.NAME]`` tables whose keys are criterion ids with their options
(plus ``phase``, ``design_margin``, ``pipe_class`` and ``description``), and ``[pipe_class.NAME]``
tables. A service defined in the file replaces the shipped service of the same name whole, so what
a company writes is exactly what runs, with one exception: every service gets the ``line-feasibility``
criterion (:mod:`boresize.criteria.feasibility`) appended last. It has no options; a file may name it with an
empty table (``line-feasibility = {}``) and no more, and cannot remove it.

The shipped sets live in ``criteria/sets/*.toml``, one file per family of services, each with a ``name``
and a ``version``; a service may carry its own ``version``. Every service knows the set and version it
came from (:attr:`Service.stamp`), which is stamped on each result. Any criterion may give ``bands`` of
options by NPS and by pressure (see :mod:`boresize.criteria.bands`).
"""

from __future__ import annotations

import sys
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from importlib import resources
from pathlib import Path
from typing import Any

from boresize.criteria.bands import resolve_criterion
from boresize.criteria.feasibility import FEASIBILITY_ID, LineFeasibility
from boresize.errors import CriteriaFileError, InputError
from boresize.pipes import PipeClass, pipe_class_from_table
from boresize.plugins import PluginHost
from boresize.units import parse_quantity

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

__all__ = ["Service", "SizingConfig", "load_config", "read_toml"]

SERVICE_KEYS = ("description", "phase", "design_margin", "pipe_class", "version", "two_phase_method")
TOP_KEYS = ("name", "version", "service", "pipe_class")
#: The phases a service may accept: "dense" is a fluid above its critical point at a liquid-like density
#: (:mod:`boresize.properties.coolprop`), judged only by services that name it; "two-phase" a gas-liquid line.
SERVICE_PHASES = ("liquid", "gas", "dense", "two-phase")
#: The shipped criteria sets, one file per family, in ``boresize/criteria/sets/``.
SHIPPED_SETS = ("liquid.toml", "gas.toml", "two-phase.toml")


_FEASIBILITY = LineFeasibility()


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
    set_name: str = "built-in"
    version: str = ""
    #: every phase the service accepts (``phase = ["liquid", "dense"]``), the first being ``phase``
    phases: tuple[str, ...] = ()
    #: the two-phase pressure-drop correlation the service asks for (fluids' name); a line's own wins
    two_phase_method: str | None = None
    #: (phase, names of the services in force that accept it), filled when the config is loaded
    takers: tuple[tuple[str, tuple[str, ...]], ...] = field(default=(), compare=False, repr=False)

    @property
    def accepts(self) -> tuple[str, ...]:
        """The phases whose lines this service judges; empty when it names none (any single phase)."""
        return self.phases or ((self.phase,) if self.phase else ())

    def __post_init__(self) -> None:
        """Every service judges ``line-feasibility``, last, however it was built (file, shipped set or code)."""
        if not any(getattr(criterion, "id", None) == FEASIBILITY_ID for criterion, _ in self.criteria):
            object.__setattr__(self, "criteria", (*self.criteria, (_FEASIBILITY, {})))

    @property
    def stamp(self) -> str:
        """The criteria set a result was judged by: ``"pump-suction (boresize-liquid 2026.1)"``."""
        return f"{self.name} ({self.set_name} {self.version})" if self.version else f"{self.name} ({self.set_name})"


@dataclass
class SizingConfig:
    """Services and pipe classes in force for a run, with where they came from."""

    services: dict[str, Service]
    pipe_classes: dict[str, PipeClass]
    version: str
    origin: str = "built-in"
    notes: list[str] = field(default_factory=list)
    sets: dict[str, str] = field(default_factory=dict)

    def service_names(self) -> tuple[str, ...]:
        return tuple(sorted(self.services))

    def pipe_class(self, name: str | None) -> PipeClass:
        """The named class, or the default class; unknown names raise InputError listing the valid ones."""
        key = name or "default"
        if key not in self.pipe_classes:
            raise InputError(f"unknown pipe class {key!r}", field="pipe_class", value=key,
                             expected=f"one of {', '.join(sorted(self.pipe_classes))}")
        return self.pipe_classes[key]


def read_toml(path: str | Path, content: bytes | None = None) -> dict[str, Any]:
    """Read a TOML file, or its ``content`` already read (named by ``path``); a fault becomes a CriteriaFileError
    naming the file."""
    try:
        if content is None:
            with open(path, "rb") as handle:
                content = handle.read()
        return tomllib.loads(content.decode("utf-8"))
    except OSError as exc:
        raise CriteriaFileError(f"cannot read {path}: {exc.strerror}", field="criteria", value=str(path),
                                expected="a readable TOML file") from exc
    except UnicodeDecodeError as exc:  # TOML is UTF-8 text
        raise CriteriaFileError(f"{path} is not UTF-8 text", field="criteria", value=str(path),
                                expected="a TOML file saved as UTF-8") from exc
    except tomllib.TOMLDecodeError as exc:
        raise CriteriaFileError(f"{path} is not valid TOML: {exc}", field="criteria", value=str(path),
                                expected="a TOML file with [service.NAME] and [pipe_class.NAME] tables") from exc
    except RecursionError as exc:  # tomllib recurses once per nested array or inline table
        raise CriteriaFileError(f"{path} nests arrays or tables too deeply to be read", field="criteria",
                                value=str(path), expected="a TOML file with [service.NAME] and [pipe_class.NAME] "
                                "tables") from exc


def _shipped_documents() -> list[tuple[str, dict[str, Any]]]:
    """(file name, document) of every shipped criteria set."""
    folder = resources.files("boresize.criteria").joinpath("sets")
    return [(name, tomllib.loads(folder.joinpath(name).read_text(encoding="utf-8"))) for name in SHIPPED_SETS]


def _label(document: Mapping[str, Any], key: str, default: str) -> str:
    value = document.get(key, default)
    if not isinstance(value, str) or not value.strip():
        raise CriteriaFileError(f"{key} must be a non-empty string", field=key, value=value,
                                expected=f'a {key} such as "ACME-PS-0001" or "rev 3"')
    return value.strip()


def _service(name: str, table: Mapping[str, Any], host: PluginHost, origin: str,
             set_label: tuple[str, str] = ("built-in", "")) -> Service:
    where = f"service.{name}"
    if not isinstance(table, Mapping):
        raise CriteriaFileError("a service must be a table", field=where, value=table,
                                expected="criterion ids with their options")
    criteria = []
    for key, options in table.items():
        if key in SERVICE_KEYS:
            continue
        if key == FEASIBILITY_ID:
            _check_feasibility(options, f"{where}.{key}")
            continue
        if key not in host.criteria:
            raise CriteriaFileError(f"unknown criterion {key!r}", field=f"{where}.{key}", value=key,
                                    expected=f"a criterion id ({', '.join(_named_ids(host))}) or one of "
                                             f"{', '.join(SERVICE_KEYS)}")
        if not isinstance(options, Mapping):
            raise CriteriaFileError("criterion options must be a table", field=f"{where}.{key}", value=options,
                                    expected='an inline table such as { max = "3 m/s" }')
        criteria.append(resolve_criterion(host.criteria.get(key), options, f"{where}.{key}"))
    if not criteria:  # line-feasibility alone passes every line at the smallest size that carries the flow
        raise CriteriaFileError(
            f"service {name!r} in {origin} lists no criteria, so every line would pass at the smallest size",
            field=where, value=name,
            expected=f'at least one criterion besides {FEASIBILITY_ID}, e.g. velocity = {{ max = "3 m/s" }} '
                     f'(criteria: {", ".join(_named_ids(host))})')
    phases = _phases(table.get("phase"), where)
    if "two-phase" in phases:  # a criterion that cannot judge a two-phase line would pass it unseen
        blind = [c.id for c, _ in criteria if "two-phase" not in c.phases]
        if blind:
            raise CriteriaFileError(
                f"service {name!r} accepts two-phase lines but {', '.join(blind)} cannot judge one",
                field=where, value=", ".join(blind),
                expected="criteria that judge two-phase lines (" + ", ".join(
                    i for i in _named_ids(host) if "two-phase" in host.criteria.get(i).phases) + ")")
    margin = parse_quantity(table.get("design_margin", 0.0), f"{where}.design_margin", "dimensionless")
    if not 0.0 <= margin < 1.0:  # a negative margin would shrink the sizing flow: a silently small size
        raise CriteriaFileError(f"{table['design_margin']!r} is outside 0 to 100 %", field=f"{where}.design_margin",
                                value=table["design_margin"], expected='a fraction of the flow such as "10 %" or 0.1')
    set_name, version = set_label
    if "version" in table:
        version = _label(table, "version", version)
    return Service(name=name, criteria=tuple(criteria), phase=phases[0] if phases else None, phases=phases,
                   design_margin=margin,
                   pipe_class=table.get("pipe_class"), description=str(table.get("description", "")), origin=origin,
                   set_name=set_name, version=version,
                   two_phase_method=_two_phase_method(table.get("two_phase_method"), f"{where}.two_phase_method"))


def _two_phase_method(value: Any, where: str) -> str | None:
    """A service's ``two_phase_method``: a correlation of ``fluids.two_phase.two_phase_correlations``."""
    if value is None:
        return None
    from boresize.hydraulics.two_phase_names import library_methods, two_phase_method_name

    name = two_phase_method_name(value) if isinstance(value, str) else None
    if name is None:
        raise CriteriaFileError(f"unknown two-phase method {value!r}", field=where, value=value,
                                expected=f"homogeneous or a correlation of the fluids library: {', '.join(library_methods())}")
    return name


def _phases(value: Any, where: str) -> tuple[str, ...]:
    """A service's ``phase``: one of :data:`SERVICE_PHASES` or a list of them (``["liquid", "dense"]``)."""
    if value is None:
        return ()
    given = [value] if isinstance(value, str) else value if isinstance(value, list) and value else [value]
    for phase in given:
        if phase not in SERVICE_PHASES:
            raise CriteriaFileError(f"unknown phase {phase!r}", field=f"{where}.phase", value=phase,
                                    expected='"liquid", "gas", "dense" or "two-phase", or a list of them')
    return tuple(dict.fromkeys(given))


def _named_ids(host: PluginHost) -> tuple[str, ...]:
    """The criterion ids a file may choose from (not line-feasibility: every service has it anyway)."""
    return tuple(ident for ident in host.criteria.ids() if ident != FEASIBILITY_ID)


def _check_feasibility(options: Mapping[str, Any], where: str) -> None:
    """``line-feasibility`` in a file: an empty table at most (every service gets it; nothing may weaken it)."""
    if not isinstance(options, Mapping) or options:
        shown = next(iter(options)) if isinstance(options, Mapping) else options
        raise CriteriaFileError(f"{FEASIBILITY_ID} cannot be removed, weakened or banded: it has no options and "
                                f"every service gets it", field=where, value=shown,
                                expected=f"{FEASIBILITY_ID} = {{}} or nothing (it is always applied)")


def _merge(config: SizingConfig, document: Mapping[str, Any], host: PluginHost, origin: str,
           set_label: tuple[str, str], folder: Path | None = None) -> None:
    unknown = sorted(set(document) - set(TOP_KEYS))
    if unknown:
        raise CriteriaFileError(f"unknown table or key {unknown[0]!r}", field=unknown[0], value=unknown[0],
                                expected=f"one of {', '.join(TOP_KEYS)}")
    for key in ("pipe_class", "service"):
        if not isinstance(document.get(key, {}), Mapping):
            raise CriteriaFileError(f"{key} = {document[key]!r} is not a table", field=key, value=document[key],
                                    expected=f"[{key}.NAME] tables")
    for name, table in document.get("pipe_class", {}).items():
        config.pipe_classes[name] = pipe_class_from_table(name, table, folder)
    for name, table in document.get("service", {}).items():
        config.services[name] = _service(name, table, host, origin, set_label)
    for service in config.services.values():
        if service.pipe_class is not None and service.pipe_class not in config.pipe_classes:
            raise CriteriaFileError(f"unknown pipe class {service.pipe_class!r}",
                                    field=f"service.{service.name}.pipe_class", value=service.pipe_class,
                                    expected=f"one of {', '.join(sorted(config.pipe_classes))}")
    config.sets[set_label[0]] = set_label[1]


def _merge_shipped(config: SizingConfig, host: PluginHost) -> None:
    """Each shipped set file; a service defined in two of them is a packaging fault, named."""
    seen: dict[str, str] = {}
    for file_name, document in _shipped_documents():
        label = (_label(document, "name", file_name), _label(document, "version", "unversioned"))
        for service in document.get("service", {}):
            if service in seen:
                raise CriteriaFileError(f"service {service!r} is shipped twice, in {seen[service]} and {file_name}",
                                        field=f"service.{service}", value=service, expected="one file per service")
            seen[service] = file_name
        _merge(config, document, host, "built-in", label)
    config.version = ", ".join(f"{name} {version}" for name, version in config.sets.items())


def load_config(host: PluginHost, path: str | Path | None = None, content: bytes | None = None) -> SizingConfig:
    """The shipped criteria sets and pipe classes, then the criteria file at ``path`` if given (its ``content``
    when given: a worker sizes with the bytes the caller read, not a file it may not have).

    Services from the file are stamped with the file's ``name`` (else its file name) and ``version``
    (else "unversioned").
    """
    classes = {pc.name: pc for pc in host.pipe_classes}
    config = SizingConfig(services={}, pipe_classes=classes, version="")
    _merge_shipped(config, host)
    if path is not None:
        document = read_toml(path, content)
        label = (_label(document, "name", Path(path).name), _label(document, "version", "unversioned"))
        try:
            _merge(config, document, host, str(path), label, Path(path).parent)
        except CriteriaFileError as exc:  # name the file: a fault in it is not one of the shipped sets'
            message = exc.message if str(path) in exc.message else f"{exc.message} (in {path})"
            raise CriteriaFileError(message, field=exc.field, value=exc.value, expected=exc.expected) from exc
        config.origin = str(path)
        if "version" in document:
            config.version = f"{config.version} + {label[1]}"
    return _with_takers(config)


def _with_takers(config: SizingConfig) -> SizingConfig:
    """Each service told which services of the config accept each phase (named when a line's phase does
    not fit the service it asks for)."""
    takers = tuple((phase, tuple(sorted(n for n, s in config.services.items() if phase in s.accepts)))
                   for phase in SERVICE_PHASES)
    config.services = {name: replace(s, takers=takers) for name, s in config.services.items()}
    return config
