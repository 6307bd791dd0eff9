"""The Python API: build lines, size or check them one or many at a time, run a whole line list, read results.

See :mod:`boresize.api.calls` for the calls on lines, :mod:`boresize.api.run` for a run of a line list
(:func:`run_lines` and the :class:`Run` that writes itself), :mod:`boresize.api.result` for
:class:`SizingResult`, :mod:`boresize.api.output` for the output formats and :mod:`boresize.api.tools` for
the listings and the comparison of two revisions.
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
from boresize.api.output import OUTPUT_SUFFIXES, check_output, check_outputs
from boresize.api.result import RatedResult, SizingResult
from boresize.api.run import (SLOW_CRITERION_SECONDS, SLOW_CRITERION_SHARE, CriterionTime, Run, read_lines,
                              roughness_value, run_lines, size_dataframe, size_rows)
from boresize.io.csv_reader import LineList
from boresize.io.document import SCHEMA_VERSION, document_schema
from boresize.io.document_block import DocumentBlock, read_document_block

__all__ = ["OUTPUT_SUFFIXES", "PROCESS_THRESHOLD", "SCHEMA_VERSION", "SI_UNITS", "SLOW_CRITERION_SECONDS", "SLOW_CRITERION_SHARE",
           "CriterionTime", "DocumentBlock", "LineList", "RatedResult", "Run", "SizingResult",
           "check", "check_output", "check_outputs", "default_sizer", "document_schema", "make_line", "quantity_text",
           "read_document_block", "read_lines",
           "roughness_value", "run_lines", "size", "size_dataframe", "size_many", "size_rows"]
