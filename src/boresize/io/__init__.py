"""Readers of line lists (CSV, XLSX, TOML, DataFrames) and writers of results (JSON, CSV, XLSX).

Which writer a file gets is chosen by :mod:`boresize.api.output` (the HTML report lives in ``report``)."""

from boresize.io.csv_reader import LineList, read_csv
from boresize.io.read import read_line_list
from boresize.io.document import document, result_to_dict

__all__ = ["LineList", "document", "read_csv", "read_line_list", "result_to_dict"]
