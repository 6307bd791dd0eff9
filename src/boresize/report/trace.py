"""The traceability record of a run: what produced the numbers, from which inputs, when.

A small value the run carries (:class:`Traceability`), made from what the sizer knows (its property
backends, its criteria configuration, its corroded roughness) and the line list read; the writers put
it into the JSON document and the HTML report as :meth:`Traceability.to_dict` gives it.
"""

from __future__ import annotations

import datetime
import importlib.metadata
import platform
from collections.abc import Callable, Iterable, Mapping
from dataclasses import dataclass, field
from typing import Any

from boresize import __version__

__all__ = ["LIBRARIES", "Traceability", "backend_record", "traceability"]

#: Libraries whose versions change numbers or files, recorded with every run.
LIBRARIES = ("CoolProp", "thermo", "chemicals", "fluids", "pint", "pluggy", "openpyxl", "jinja2", "matplotlib")


@dataclass(frozen=True)
class Traceability:
    """boresize and library versions, property backends, criteria set, input file and its SHA-256, date (UTC).

    :param property_backends: one record per backend (id, title, version, plugin), see :func:`backend_record`
    :param services: service name -> its criteria stamp
    :param corroded_roughness_mm: the corroded roughness of checked lines [mm], or None
    """

    property_backends: tuple[Mapping[str, str], ...]
    criteria_set: str
    criteria_source: str
    services: Mapping[str, str]
    corroded_roughness_mm: float | None
    lines_source: str
    lines_sha256: str | None
    date: str
    boresize_version: str = __version__
    python: str = field(default_factory=platform.python_version)
    libraries: Mapping[str, str] = field(default_factory=lambda: {
        name: version for name in LIBRARIES if (version := _installed(name))})

    def to_dict(self) -> dict[str, Any]:
        """The record as the JSON document holds it (keys in the document's order)."""
        return {
            "boresize_version": self.boresize_version,
            "python": self.python,
            "libraries": dict(self.libraries),
            "property_backends": [dict(b) for b in self.property_backends],
            "criteria_set": self.criteria_set,
            "criteria_source": self.criteria_source,
            "services": dict(self.services),
            "corroded_roughness_mm": self.corroded_roughness_mm,
            "lines_source": self.lines_source,
            "lines_sha256": self.lines_sha256,
            "date": self.date,
        }


def _installed(name: str) -> str | None:
    try:
        return importlib.metadata.version(name)
    except importlib.metadata.PackageNotFoundError:
        return None


def backend_record(backend: Any, plugin: str | None) -> dict[str, Any]:
    """A property backend's entry: id, title, version (a plugin's fault is shown, not raised), plugin."""
    try:
        version = str(backend.version())
    except Exception as exc:  # a plugin's fault must not stop the record; it is shown instead
        version = f"unknown ({type(exc).__name__}: {exc})"
    return {"id": backend.id, "title": getattr(backend, "title", backend.id), "version": version, "plugin": plugin}


def traceability(*, backends: Iterable[Any], owner: Callable[[str], str | None], criteria_set: str,
                 criteria_source: str, services: Mapping[str, str], check_roughness: float | None,
                 lines_source: str, lines_digest: str | None = None,
                 now: datetime.datetime | None = None) -> Traceability:
    """The record of a run.

    :param backends: the property backends used; ``owner(id)`` names the plugin that registered each
    :param services: service name -> its criteria stamp
    :param check_roughness: the corroded roughness of checked lines [m], or None
    :param now: the run's date (default: now, UTC); kept to the second
    """
    when = (now or datetime.datetime.now(datetime.timezone.utc)).replace(microsecond=0)
    return Traceability(
        property_backends=tuple(backend_record(b, owner(b.id)) for b in backends), criteria_set=criteria_set,
        criteria_source=criteria_source, services=dict(services),
        corroded_roughness_mm=check_roughness * 1e3 if check_roughness is not None else None,
        lines_source=lines_source, lines_sha256=lines_digest, date=when.isoformat())
