"""Readers of line lists and writers of results."""

from boresize.io.csv_reader import LineList, read_csv
from boresize.io.results import document, result_to_dict

__all__ = ["LineList", "document", "read_csv", "result_to_dict"]
