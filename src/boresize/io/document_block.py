"""The document block of a calculation sheet: project, unit, number, revision, date, who prepared, checked and
approved it, and notes. Read from a small TOML file (``boresize size --document sheet.toml``) or given as a
mapping (``run_lines(..., document={...})``); the writers receive it as a :class:`DocumentBlock`.

Example file::

    project = "Demo unit revamp"
    unit = "Unit 20"
    number = "CALC-20-001"
    revision = "B"
    date = 2026-12-03
    prepared = "A. Author"
    checked = "C. Checker"
    approved = ""
    notes = "Issued for review."
"""

from __future__ import annotations

import datetime
import tomllib
from collections.abc import Mapping
from dataclasses import dataclass, fields
from pathlib import Path
from typing import Any

from boresize.errors import InputError

__all__ = ["DOCUMENT_KEYS", "DocumentBlock", "document_block", "read_document_block"]

#: the longest value accepted for one key (a block is a header, not a report)
MAX_CHARS = 2000
#: the largest document file read (nine keys of at most MAX_CHARS each, with room for comments)
MAX_FILE_BYTES = 100_000


@dataclass(frozen=True)
class DocumentBlock:
    """Who and what a calculation sheet is for; every key text ("" when not given)."""

    project: str = ""
    unit: str = ""
    number: str = ""
    revision: str = ""
    date: str = ""
    prepared: str = ""
    checked: str = ""
    approved: str = ""
    notes: str = ""

    def rows(self) -> list[tuple[str, str]]:
        """(label, value) for every key, in the file's order (empty values included, as blanks to sign)."""
        return [(f.name, getattr(self, f.name)) for f in fields(self)]

    @property
    def title(self) -> str:
        """A page title from the number and project (never a path); "" when neither is given."""
        return " - ".join(part for part in (self.number, self.revision and f"rev. {self.revision}", self.project)
                          if part)


#: the keys a document block accepts, in order
DOCUMENT_KEYS = tuple(f.name for f in fields(DocumentBlock))


def _shown(value: Any) -> str:
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _text(key: str, value: Any, where: str) -> str:
    if key == "date" and isinstance(value, (datetime.date, datetime.datetime)):
        return value.isoformat()
    if key in ("revision", "number") and isinstance(value, int) and not isinstance(value, bool):
        return str(value)
    if not isinstance(value, str):
        allowed = "text or a TOML date (2026-12-03)" if key == "date" else \
            "text or a whole number" if key in ("revision", "number") else "text"
        raise InputError(f"{key} = {_shown(value)} is a {type(value).__name__}, not {allowed} ({where})", field=f"document.{key}",
                         value=repr(value)[:80], expected=allowed)
    if len(value) > MAX_CHARS:
        raise InputError(f"{key} is {len(value)} characters long ({where})", field=f"document.{key}",
                         value=value[:40] + "...", expected=f"at most {MAX_CHARS} characters")
    if any(ord(ch) < 32 and ch not in "\n\t" for ch in value):
        raise InputError(f"{key} holds a control character ({where})", field=f"document.{key}",
                         value=repr(value)[:80], expected="printable text")
    return value.strip()


def document_block(given: DocumentBlock | Mapping[str, Any] | str | Path | None,
                   where: str = "the document block") -> DocumentBlock | None:
    """A DocumentBlock from a block, a mapping of its keys, or a TOML file's path; None for None.

    :raises InputError: (field ``document`` or ``document.KEY``) an unknown key, a value of the wrong type, a file
        that cannot be read or is not TOML
    """
    if given is None or isinstance(given, DocumentBlock):
        return given
    if isinstance(given, (str, Path)):
        return read_document_block(given)
    if not isinstance(given, Mapping):
        raise InputError(f"a {type(given).__name__} is not a document block", field="document",
                         value=repr(given)[:80], expected="a TOML file's path or a mapping of "
                                                          + ", ".join(DOCUMENT_KEYS))
    unknown = [str(key) for key in given if key not in DOCUMENT_KEYS]
    if unknown:
        raise InputError(f"unknown key {unknown[0]!r} in {where}", field="document", value=unknown[0],
                         expected="one of " + ", ".join(DOCUMENT_KEYS))
    return DocumentBlock(**{key: _text(key, value, where) for key, value in given.items()})


def read_document_block(path: str | Path) -> DocumentBlock:
    """The document block in a TOML file (top-level keys, or a ``[document]`` table).

    :raises InputError: (field ``document``) a missing or unreadable file, not TOML, an unknown key, a wrong type
    """
    where = str(path)
    if Path(path).exists() and not Path(path).is_file():
        raise InputError(f"document file {where!r} is not a regular file", field="document", value=where,
                         expected="a TOML file")
    try:
        if Path(path).stat().st_size > MAX_FILE_BYTES:
            raise InputError(f"document file {where!r} is larger than {MAX_FILE_BYTES // 1000} kB", field="document",
                             value=where, expected="a small TOML file of the document's keys")
        data = Path(path).read_bytes()
    except OSError as exc:
        raise InputError(f"cannot read document file {where!r} ({exc.strerror or type(exc).__name__})",
                         field="document", value=where, expected="a readable TOML file") from None
    try:
        table: Mapping[str, Any] = tomllib.loads(data.decode("utf-8-sig"))
    except UnicodeDecodeError:
        raise InputError(f"document file {where!r} is not UTF-8 text", field="document", value=where,
                         expected="a TOML file saved as UTF-8") from None
    except tomllib.TOMLDecodeError as exc:
        raise InputError(f"document file {where!r} is not valid TOML: {exc}", field="document", value=where,
                         expected="a TOML file of key = \"value\" lines") from None
    if set(table) == {"document"} and isinstance(table["document"], Mapping):
        table = table["document"]
    if not table:
        raise InputError(f"document file {where!r} holds no keys", field="document", value=where,
                         expected="one or more of " + ", ".join(DOCUMENT_KEYS))
    block = document_block(table, f"document file {where!r}")
    assert block is not None
    return block
