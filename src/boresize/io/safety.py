"""Output safety for spreadsheets: text that a spreadsheet would run as a formula is neutralised.

A cell whose text starts with ``=``, ``+``, ``-`` or ``@`` (or a tab or carriage return) is read by
spreadsheet programs as a formula, which can run commands or fetch URLs when the file is opened
("CSV injection"; OWASP, "CSV Injection", https://owasp.org/www-community/attacks/CSV_Injection).
CSV cells get a leading apostrophe, as OWASP recommends; XLSX cells are stored as text with the
quote-prefix style. A cell that is a plain number (``-3``, ``+5``, ``-1.5e3``) is a number, not a
formula, and stays as it is. boresize's readers take the apostrophe off again, so a results file
can be read back as a line list without loss.
"""

from __future__ import annotations

import math

__all__ = ["FORMULA_STARTS", "is_number_text", "neutralise", "restore", "as_number"]

#: First characters that make a spreadsheet read a cell as a formula (OWASP).
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r")


def is_number_text(text: str) -> bool:
    """True when ``text`` is a finite plain number ("-3", "+5", "1.5e3"), which no spreadsheet runs."""
    try:
        return math.isfinite(float(text))
    except ValueError:
        return False


def neutralise(text: str) -> str:
    """Prefix an apostrophe to text a spreadsheet would run as a formula; numbers and other text unchanged."""
    if text and text.startswith(FORMULA_STARTS) and not is_number_text(text):
        return "'" + text
    return text


def restore(text: str) -> str:
    """Undo :func:`neutralise` (a leading apostrophe before a formula character is removed)."""
    if len(text) > 1 and text[0] == "'" and text[1:].startswith(FORMULA_STARTS):
        return text[1:]
    return text


def as_number(text: str) -> int | float | None:
    """The number ``text`` spells, when writing it as that number loses nothing (``"25"`` -> 25,
    ``"0.5"`` -> 0.5, but ``"0.50"`` and ``"1e3"`` stay text); else None."""
    stripped = text.strip()
    if stripped != text or not stripped:
        return None
    try:
        whole = int(stripped)
    except ValueError:
        pass
    else:
        return whole if str(whole) == stripped and abs(whole) < 10**15 else None
    try:
        number = float(stripped)
    except ValueError:
        return None
    return number if math.isfinite(number) and repr(number) == stripped else None
