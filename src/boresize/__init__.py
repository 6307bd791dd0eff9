"""boresize: size and check process piping lines from stream conditions.

Results are screening calculations to be checked by a competent engineer against the applicable
codes and the company's standards; local codes govern.

The public API is small: build a :class:`Sizer` (it loads the installed plugins and the criteria
sets), then ``run`` lines. Heavy modules (pint, CoolProp) load on first use, not on import.
"""

from __future__ import annotations

from importlib import import_module
from importlib.metadata import PackageNotFoundError, version
from typing import Any

from boresize.errors import (
    BoresizeError,
    CatalogueError,
    CriteriaFileError,
    InputError,
    PluginError,
    PropertyError,
    UnitError,
)
from boresize.model import Candidate, CandidateResult, Flow, FluidState, Hydraulics, Line, LineResult, Verdict

try:
    __version__ = version("boresize")
except PackageNotFoundError:  # pragma: no cover - running from a source tree without install
    __version__ = "0.0.0+unknown"

__all__ = [
    "BoresizeError",
    "Candidate",
    "CandidateResult",
    "CatalogueError",
    "CriteriaFileError",
    "Flow",
    "FluidState",
    "Hydraulics",
    "InputError",
    "Line",
    "LineResult",
    "PluginError",
    "PluginHost",
    "PropertyError",
    "Sizer",
    "UnitError",
    "Verdict",
    "__version__",
    "line_from_row",
    "load_config",
]

_LAZY = {
    "Sizer": "boresize.engine",
    "PluginHost": "boresize.plugins",
    "line_from_row": "boresize.lines",
    "load_config": "boresize.config",
}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        return getattr(import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'boresize' has no attribute {name!r}")
