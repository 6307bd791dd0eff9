"""Molar flows (kmol/h, mol/s, lbmol/h, kmol/d) turned into mass flows through the line's molar mass."""

from __future__ import annotations

import pytest

from boresize.api import make_line, size
from boresize.units import parse_flow

LBMOL = 453.59237  # mol per pound-mole: the avoirdupois pound is exactly 0.45359237 kg (1959 agreement)


@pytest.mark.parametrize(("text", "mol_s"), [
    ("100 kmol/h", 100_000 / 3600), ("1 mol/s", 1.0), ("10 lbmol/h", 10 * LBMOL / 3600),
    ("24 kmol/d", 1000 / 3600), ("3 kgmol/h", 3000 / 3600), ("5 lbmole/h", 5 * LBMOL / 3600),
    # the pound-mole and kilogram-mole in two words, as line lists write them
    ("10 lb-mol/h", 10 * LBMOL / 3600), ("10 lb mol/h", 10 * LBMOL / 3600), ("10 LB-MOL/HR", 10 * LBMOL / 3600),
    ("10 Lb-Mole/h", 10 * LBMOL / 3600), ("3 kg-mol/h", 3000 / 3600), ("3 kg mole/h", 3000 / 3600),
])
def test_molar_units(text: str, mol_s: float) -> None:
    flow = parse_flow(text)
    assert flow.basis == "molar"
    assert flow.value == pytest.approx(mol_s, rel=1e-12)


def test_methane_100_kmol_h_is_its_molar_mass_times_100() -> None:
    from CoolProp.CoolProp import PropsSI

    molar_mass = PropsSI("M", "Methane")  # kg/mol from CoolProp's own fluid file (16.04246 g/mol)
    result = size(make_line("G", "methane", "100 kmol/h", "20 barg", "20 degC", design_margin="0 %"), plugins=False)
    assert result.status != "error"
    assert result.sizing_flow == pytest.approx(100_000 * molar_mass / 3600, rel=1e-9)
    # CoolProp's 16.0428 g/mol (GERG-2008's value) gives 1604.28 kg/h; IUPAC atomic weights give 16.0425
    assert any(note.startswith(f"molar flow 100 kmol/h read as {100 * molar_mass * 1000:.6g} kg/h with molar mass")
               for note in result.notes)


def test_a_mixture_takes_its_mean_molar_mass() -> None:
    from chemicals import MW, CAS_from_any

    # mean molar mass of 90 % methane, 10 % ethane (mole), from the chemicals database's molecular weights [g/mol]
    mean = 0.9 * MW(CAS_from_any("methane")) + 0.1 * MW(CAS_from_any("ethane"))
    result = size(make_line("M", "methane:0.9, ethane:0.1", "10 kmol/h", "20 barg", "20 degC", design_margin="0 %"), plugins=False)
    assert result.status != "error"
    assert result.sizing_flow * 3600 == pytest.approx(10 * mean, rel=1e-4)


def test_a_line_with_its_own_density_has_no_molar_mass() -> None:
    result = size(make_line("T", "oil", "10 lbmol/h", "5 barg", "20 degC", density="850 kg/m3",
                            viscosity="2 cP"), plugins=False)
    assert result.status == "error"
    assert "needs the stream's molar mass" in (result.error or "")


def test_flow_help_names_molar_units() -> None:
    from boresize.errors import InputError

    with pytest.raises(InputError) as caught:
        parse_flow("100 furlong")
    assert "a molar flow (kmol/h, lbmol/h)" in str(caught.value)
