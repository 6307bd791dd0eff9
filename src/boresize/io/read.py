"""Reading a line list of any supported kind, chosen by the file's extension."""

from __future__ import annotations

from pathlib import Path

from boresize.errors import InputError
from boresize.io.csv_reader import LineList, read_csv

__all__ = ["LINE_LIST_SUFFIXES", "read_line_list"]

LINE_LIST_SUFFIXES = (".csv", ".tsv", ".txt", ".xlsx", ".xlsm", ".toml")


def read_line_list(path: str | Path) -> LineList:
    """A line list from CSV (also .tsv/.txt), XLSX (.xlsx/.xlsm) or TOML.

    :raises InputError: (field "lines") an unknown extension or an unreadable file
    """
    suffix = Path(path).suffix.lower()
    if suffix in (".csv", ".tsv", ".txt"):
        return read_csv(path)
    if suffix in (".xlsx", ".xlsm"):
        from boresize.io.xlsx import read_xlsx

        return read_xlsx(path)
    if suffix == ".toml":
        from boresize.io.toml_lines import read_toml_lines

        return read_toml_lines(path)
    raise InputError(f"cannot tell the kind of line list {str(path)!r} from its extension", field="lines",
                     value=str(path), expected=f"a file ending in {', '.join(LINE_LIST_SUFFIXES)}")
