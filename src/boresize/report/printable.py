"""Text echoed to a terminal with its invisible characters shown, never acted on.

A tag, a fluid, a service or an error message echoing a value may hold control characters (an ESC that starts
a colour or cursor sequence, a BEL, a CR that moves back over the line), bidirectional format characters
(U+202E turns the rest of the line right to left) or line separators. Printed raw they change what the
terminal shows. :func:`printable` replaces each character that ``str.isprintable`` refuses by its escape as
Python writes it: ``\\x1b``, ``\\x07``, ``\\r``, ``\\t``, ``\\u202e``, ``\\U000e0001``. Only terminal output
(the table, stderr messages) is escaped: JSON, CSV, XLSX and HTML keep the exact text, which is data.
"""

from __future__ import annotations

__all__ = ["printable"]

_NAMED = {"\n": "\\n", "\r": "\\r", "\t": "\\t"}


def printable(text: str, *, newlines: bool = False) -> str:
    """``text`` with each non-printable character shown as its escape (``newlines``: keep ``\\n`` as is)."""
    if text.isprintable():
        return text
    return "".join(ch if ch.isprintable() or (newlines and ch == "\n") else _escape(ch) for ch in text)


def _escape(ch: str) -> str:
    code = ord(ch)
    if ch in _NAMED:
        return _NAMED[ch]
    if code < 0x100:
        return f"\\x{code:02x}"
    return f"\\u{code:04x}" if code < 0x10000 else f"\\U{code:08x}"
