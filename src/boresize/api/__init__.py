"""The Python API: build lines, size or check them one or many at a time, and read results.

See :mod:`boresize.api.calls` for the calls and :mod:`boresize.api.result` for :class:`SizingResult`.
"""

from boresize.api.calls import (
    PROCESS_THRESHOLD,
    SI_UNITS,
    check,
    default_sizer,
    make_line,
    quantity_text,
    size,
    size_many,
)
from boresize.api.result import RatedResult, SizingResult

__all__ = ["PROCESS_THRESHOLD", "SI_UNITS", "RatedResult", "SizingResult", "check", "default_sizer", "make_line",
           "quantity_text", "size", "size_many"]
