"""Readers of line lists (CSV, XLSX, TOML) and writers of results (JSON, CSV, XLSX; HTML in ``report``)."""

from boresize.io.csv_reader import LineList, read_csv
from boresize.io.read import read_line_list
from boresize.io.document import document, result_to_dict
from boresize.io.write import write_output

__all__ = ["LineList", "document", "read_csv", "read_line_list", "result_to_dict", "write_output"]
