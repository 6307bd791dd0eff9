"""Modules that serve one output only (a plot, a report, a workbook, a progress bar): a missing one is named with
the output that needs it and the command that installs it, never reported as an internal error.

:func:`needs` wraps the code of one output; :func:`missing_module` builds the message (the command line uses it as
its last guard too).
"""

from __future__ import annotations

from collections.abc import Iterator
from contextlib import contextmanager

from boresize.errors import BoresizeError

__all__ = ["OPTIONAL_MODULES", "MissingModuleError", "missing_module", "needs"]

#: import name -> the package pip installs it from
OPTIONAL_MODULES: dict[str, str] = {"matplotlib": "matplotlib", "openpyxl": "openpyxl", "jinja2": "jinja2",
                                    "rich": "rich"}


class MissingModuleError(BoresizeError, ImportError):
    """An optional module an output needs is not installed; ``module`` names it."""

    def __init__(self, message: str, module: str) -> None:
        super().__init__(message)
        self.module = module


def missing_module(exc: ImportError, output: str | None) -> MissingModuleError | None:
    """The clear error for ``exc`` when it is one of :data:`OPTIONAL_MODULES` missing, else None."""
    module = (exc.name or "").split(".")[0]
    if module not in OPTIONAL_MODULES:
        return None
    what = output or "this output"
    return MissingModuleError(f"{what} needs the Python module '{module}', which is not installed: "
                              f"pip install {OPTIONAL_MODULES[module]}", module)


@contextmanager
def needs(output: str) -> Iterator[None]:
    """Turn a missing optional module inside the block into a :class:`MissingModuleError` naming ``output``."""
    try:
        yield
    except ModuleNotFoundError as exc:
        error = missing_module(exc, output)
        if error is None:
            raise
        raise error from exc
