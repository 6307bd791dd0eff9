"""The written-out conversions of the commonest spellings (``boresize.units.common``) against pint itself.

Each spelling is read again through the full parse (pint, boresize's registry) with no conversion remembered; what
the parser then remembers must be the table's row, every float to the last bit. On a difference the test prints
the table to paste into ``common.py``. The SI values themselves are checked against NIST SP 811 in
tests/units/test_parse_cache.py and test_units.py.
"""

from __future__ import annotations

import pytest

from boresize.units import common, quantities
from boresize.units.quantities import parse_flow, parse_quantity


def _read_through_pint(monkeypatch: pytest.MonkeyPatch) -> dict[tuple[str, str], tuple[object, ...]]:
    monkeypatch.setattr(quantities, "_CONVERSIONS", {})
    for text, kind in common.SPELLINGS:
        if kind == "flow":
            parse_flow(f"1 {text}", "flow")
        else:
            parse_quantity(f"1 {text}" if text else 1.0, "field", kind)  # type: ignore[arg-type]
    return {key: tuple(row) for key, row in quantities._CONVERSIONS.items()}


def _exact(row: tuple[object, ...]) -> tuple[object, ...]:
    return tuple(value.hex() if isinstance(value, float) else _exact(value) if isinstance(value, tuple) else value
                 for value in row)


def test_every_row_is_what_pint_gives(monkeypatch: pytest.MonkeyPatch) -> None:
    read = _read_through_pint(monkeypatch)
    table = "\n".join(f"    {key!r}: {row!r}," for key, row in read.items())
    assert list(read) == list(common.TABLE), table
    assert {key: _exact(row) for key, row in read.items()} == {key: _exact(row) for key, row in common.TABLE.items()}, table


def test_the_parser_starts_with_the_table() -> None:
    for key, row in common.TABLE.items():
        assert tuple(quantities._CONVERSIONS[key]) == row


@pytest.mark.parametrize(("cell", "kind", "expected"), [
    ("5 barg", "pressure", 5 * 100000.00000000003 + 101325.0),  # pint's own bar scale, as before the table
    ("25 degC", "temperature", 298.15),  # 0 degC = 273.15 K (NIST SP 811 B.8)
    ("-300 degC", "temperature", None),  # below absolute zero: the full parse gives the message
    ("-2 bara", "pressure", None),
    ("1e400 m", "length", None),
])
def test_a_table_row_keeps_the_full_parse_checks(cell: str, kind: str, expected: float | None) -> None:
    if expected is not None:
        assert parse_quantity(cell, "field", kind) == expected  # type: ignore[arg-type]
    else:
        with pytest.raises(Exception, match="field"):
            parse_quantity(cell, "field", kind)  # type: ignore[arg-type]
