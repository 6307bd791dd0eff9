"""Modules that serve one output only (a plot, a report, a workbook, a progress bar): a missing one is named with
the output that needs it and the command that installs it, never reported as an internal error.

:func:`needs` wraps the code of one output; :func:`~boresize.errors.missing_module` builds the message (the
command line, which imports only :mod:`boresize.errors`, uses it as its last guard too).
"""

from __future__ import annotations

from collections.abc import Iterator
from contextlib import contextmanager

from boresize.errors import OPTIONAL_MODULES, MissingModuleError, missing_module

__all__ = ["OPTIONAL_MODULES", "MissingModuleError", "missing_module", "needs"]  # the first three from boresize.errors


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
