"""The traceability record of a run: what produced the numbers, from which inputs, when."""

from __future__ import annotations

import datetime
import importlib.metadata
import platform
from typing import Any

from boresize import __version__
from boresize.sizing.engine import Sizer

__all__ = ["traceability", "LIBRARIES"]

#: Libraries whose versions change numbers or files, recorded with every run.
LIBRARIES = ("CoolProp", "thermo", "chemicals", "fluids", "pint", "pluggy", "openpyxl", "jinja2", "matplotlib")


def _installed(name: str) -> str | None:
    try:
        return importlib.metadata.version(name)
    except importlib.metadata.PackageNotFoundError:
        return None


def _backend_version(backend: Any) -> str:
    try:
        return str(backend.version())
    except Exception as exc:  # a plugin's fault must not stop the record; it is shown instead
        return f"unknown ({type(exc).__name__}: {exc})"


def traceability(sizer: Sizer, *, lines_source: str, lines_digest: str | None = None,
                 now: datetime.datetime | None = None) -> dict[str, Any]:
    """boresize and library versions, property backends, criteria set, input file and its SHA-256, date (UTC)."""
    host, config = sizer.host, sizer.config
    backends = [{"id": b.id, "title": getattr(b, "title", b.id), "version": _backend_version(b),
                 "plugin": host.backends.owner(b.id)} for b in host.backends]
    services = {name: getattr(config.services[name], "stamp", name) for name in config.service_names()}
    when = (now or datetime.datetime.now(datetime.timezone.utc)).replace(microsecond=0)
    return {
        "boresize_version": __version__,
        "python": platform.python_version(),
        "libraries": {name: version for name in LIBRARIES if (version := _installed(name))},
        "property_backends": backends,
        "criteria_set": config.version,
        "criteria_source": config.origin,
        "services": services,
        "corroded_roughness_mm": sizer.check_roughness * 1e3 if sizer.check_roughness is not None else None,
        "lines_source": lines_source,
        "lines_sha256": lines_digest,
        "date": when.isoformat(),
    }
