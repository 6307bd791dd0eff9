"""CoolProp backend prefixes in the fluid column (HEOS::, INCOMP::; REFPROP:: and tabular ones refused)."""

from __future__ import annotations

import pytest

from boresize.errors import InputError
from boresize.io.rows import line_from_row

ROW = {"tag": "T", "flow": "10 t/h", "pressure": "5 barg", "temperature": "20 degC"}


@pytest.mark.parametrize(("fluid", "read_as", "backend"), [
    ("HEOS::Water", "Water", "coolprop"), ("heos::water", "water", "coolprop"), (" HEOS :: Water ", "Water", "coolprop"),
    ("HEOS::Methane[0.9]&Ethane[0.1]", "Methane[0.9]&Ethane[0.1]", "coolprop-mixture"),
    ("INCOMP::MEG[0.3]", "INCOMP::MEG[0.3]", None),
])
def test_accepted_prefixes(fluid: str, read_as: str, backend: str | None) -> None:
    line = line_from_row({**ROW, "fluid": fluid})
    assert (line.fluid, line.backend) == (read_as, backend)


@pytest.mark.parametrize(("fluid", "backend", "message"), [
    ("REFPROP::Water", None, "REFPROP is not installed"),
    ("BICUBIC&HEOS::Water", None, "BICUBIC&HEOS interpolates tables"),
    ("TTSE&HEOS::Water", None, "TTSE&HEOS interpolates tables"),
    ("IF97::Water", None, "unknown CoolProp backend prefix 'IF97'"),
    ("HEOS::", None, "no fluid after 'HEOS::'"),
    ("HEOS::Water", "thermo", "the backend column says 'thermo'"),
])
def test_refused_prefixes(fluid: str, backend: str | None, message: str) -> None:
    row = {**ROW, "fluid": fluid, **({"backend": backend} if backend else {})}
    with pytest.raises(InputError, match=message):
        line_from_row(row)


def test_heos_water_sizes_as_water() -> None:
    from boresize.api import make_line, size

    plain = size(make_line("T", "Water", "10 t/h", "5 barg", "20 degC"), plugins=False)
    prefixed = size(make_line("T", "HEOS::Water", "10 t/h", "5 barg", "20 degC"), plugins=False)
    assert prefixed.nps == plain.nps == "2" and prefixed.velocity == plain.velocity
