"""boresize: size and check process piping lines from stream conditions.

Results are screening calculations to be checked by a competent engineer against the applicable
codes and the company's standards; local codes govern.

The public API is small (see README "From Python"): build a line with :func:`make_line` (text,
pint Quantities, or numbers with their unit stated) or :func:`line_from_stream` (a simulation
stream's T, P, mass flow and mole fractions), then :func:`size`, :func:`check` or
:func:`size_many` (any ``concurrent.futures.Executor``); a whole line list (a file, stdin, a
DataFrame) goes through :func:`run_lines`, whose :class:`Run` writes itself to .json, .jsonl, .csv, .xlsx or
.html. Results are :class:`SizingResult` objects with pint quantities, plain floats and ``to_dict()``. DataFrames go in and out through
:func:`size_dataframe`, :func:`read_dataframe` and :func:`results_dataframe`. :class:`Sizer` is the
engine underneath. Every name loads on first use: importing boresize loads neither pint, CoolProp,
thermo nor pandas; type checkers see the real types through the imports under ``TYPE_CHECKING``.
``result.raise_for_error()`` returns a :class:`RatedResult`, typed without the Nones of an error result.
"""

from __future__ import annotations

from importlib import import_module
from importlib.metadata import PackageNotFoundError, version
from typing import TYPE_CHECKING, Any

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

if TYPE_CHECKING:  # the real types of the names _LAZY loads on first use (a test keeps the two in step)
    from boresize.api import Run, check, make_line, run_lines, size, size_dataframe, size_many
    from boresize.api.result import RatedResult, SizingResult
    from boresize.io.dataframe import read_dataframe, results_dataframe
    from boresize.io.rows import line_from_row
    from boresize.io.streams import line_from_stream
    from boresize.plugins import PluginHost
    from boresize.sizing.engine import Sizer
    from boresize.sizing.services import load_config

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
    "RatedResult",
    "Run",
    "Sizer",
    "SizingResult",
    "UnitError",
    "Verdict",
    "__version__",
    "check",
    "line_from_row",
    "line_from_stream",
    "load_config",
    "make_line",
    "read_dataframe",
    "results_dataframe",
    "run_lines",
    "size",
    "size_dataframe",
    "size_many",
]

_LAZY = {
    "Sizer": "boresize.sizing.engine",
    "PluginHost": "boresize.plugins",
    "line_from_row": "boresize.io.rows",
    "load_config": "boresize.sizing.services",
    "make_line": "boresize.api",
    "size": "boresize.api",
    "check": "boresize.api",
    "size_many": "boresize.api",
    "run_lines": "boresize.api",
    "Run": "boresize.api",
    "SizingResult": "boresize.api.result",
    "RatedResult": "boresize.api.result",
    "line_from_stream": "boresize.io.streams",
    "read_dataframe": "boresize.io.dataframe",
    "results_dataframe": "boresize.io.dataframe",
    "size_dataframe": "boresize.api",
}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        return getattr(import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'boresize' has no attribute {name!r}")


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))
