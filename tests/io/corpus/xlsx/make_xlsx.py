"""Write the XLSX files of the bad-input corpus (run by hand: ``.venv/bin/python tests/corpus/xlsx/make_xlsx.py``).

The workbooks are committed; this script says what is in each, cell by cell, since a binary file
cannot be read in a review. Each holds one kind of spreadsheet mistake; tests/corpus/expected.toml
gives the exact error each must produce.
"""

from __future__ import annotations

import datetime
from pathlib import Path

from openpyxl import Workbook
from openpyxl.styles import Font

HERE = Path(__file__).parent
HEADER = ["tag", "fluid", "flow", "pressure", "temperature"]
OK_1 = ["OK-1", "water", "20 t/h", "5 barg", "20 degC"]
OK_2 = ["OK-2", "water", "20 t/h", "5 barg", "20 degC"]

WORKBOOKS: dict[str, list[list[object]]] = {
    # Numbers typed as numbers, with no unit in the cell nor in the header.
    "bare_numbers.xlsx": [HEADER, OK_1, ["XL-BARE-FLOW", "water", 20, "5 barg", "20 degC"],
                          ["XL-BARE-TEMPERATURE", "water", "20 t/h", "5 barg", 20.5], OK_2],
    # A spreadsheet turned the NPS 1/2 into the date 2 January.
    "nps_as_date.xlsx": [HEADER + ["nps"], OK_1 + [None],
                         ["XL-NPS-DATE", "water", "2 t/h", "5 barg", "20 degC", datetime.datetime(2026, 1, 2)],
                         OK_2 + [None]],
    # Cells beyond the last header column (a column inserted without a header).
    "extra_cells.xlsx": [HEADER, OK_1, ["XL-EXTRA-CELL", "water", "20 t/h", "5 barg", "20 degC", "150 m"], OK_2],
    # A decimal comma typed as text.
    "decimal_comma.xlsx": [HEADER, OK_1, ["XL-DECIMAL-COMMA", "water", "1,5 t/h", "5 barg", "20 degC"], OK_2],
    # The header row was deleted: the first row is a line.
    "missing_header.xlsx": [OK_1, OK_2],
    # A formula never calculated by a spreadsheet program (no saved value).
    "formula_without_value.xlsx": [HEADER, OK_1, ["XL-FORMULA", "water", "=10*2 & \" t/h\"", "5 barg", "20 degC"]],
    # One stray cell at the sheet's last cell (set below): a 5 KB file whose declared dimension is
    # 2**20 rows by 2**14 columns; only the cells present are read.
    "lim_stray_cell.xlsx": [HEADER, OK_1, OK_2],
}
#: Single cells set after the rows: workbook -> (cell, value; None for a formatted cell without a value).
STRAY_CELLS: dict[str, list[tuple[str, object]]] = {
    "lim_stray_cell.xlsx": [("XFD1048576", "stray"), ("XFD3", None)],
}


def main() -> None:
    for name, rows in WORKBOOKS.items():
        book = Workbook()
        sheet = book.active
        sheet.title = "lines"
        for row in rows:
            sheet.append(row)
        for coordinate, value in STRAY_CELLS.get(name, []):
            sheet[coordinate].value = value
            sheet[coordinate].font = Font(bold=True)
        book.save(HERE / name)
    # Not a workbook at all: CSV text saved under an .xlsx name.
    (HERE / "not_a_workbook.xlsx").write_text(",".join(HEADER) + "\n" + ",".join(OK_1) + "\n", encoding="utf-8")


if __name__ == "__main__":
    main()
