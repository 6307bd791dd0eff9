"""A DN key in a TOML line list (``dn = 100``, ``DN = "100"``) feeds ``nps``, as a DN column does in a CSV."""

from __future__ import annotations

from pathlib import Path

import pytest

from boresize.io.line_items import line_items
from boresize.io.toml_lines import read_toml_lines
from boresize.model import Line

LINE = 'tag = "{tag}"\nfluid = "water"\nflow = "20 t/h"\npressure = "5 barg"\ntemperature = "20 degC"\n'


def _items(tmp_path: Path, keys: list[str]) -> list[object]:
    text = "".join(f"[[line]]\n{LINE.format(tag=f'T{i}')}{key}\n" for i, key in enumerate(keys))
    path = tmp_path / "lines.toml"
    path.write_text(text, encoding="utf-8")
    return list(line_items(read_toml_lines(path).pairs()).items)


@pytest.mark.parametrize(("key", "nps"), [
    # ASME B36.10M-2018 Table 1 pairs DN 100 with NPS 4, DN 80 with NPS 3, DN 15 with NPS 1/2
    ("dn = 100", "4"), ('DN = "80"', "3"), ('DN = "DN 100"', "4"), ('dn = "100.0"', "4"), ("dn = 15", "1/2"),
])
def test_dn_keys(tmp_path: Path, key: str, nps: str) -> None:
    (line,) = _items(tmp_path, [key])
    assert isinstance(line, Line) and line.nps == nps


def test_a_dn_without_an_nps_is_that_line_s_error(tmp_path: Path) -> None:
    first, bad, last = _items(tmp_path, ["dn = 100", "dn = 105", "dn = 50"])
    assert isinstance(first, Line) and isinstance(last, Line)
    assert not isinstance(bad, Line) and "DN 105 has no NPS" in str(bad)
