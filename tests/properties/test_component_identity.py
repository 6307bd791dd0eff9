"""A component name is read as one compound, and the line says which.

The chemicals database reads a formula by its atoms alone and keeps one compound per formula, so an isomer
formula or a condensed structural formula came out as the wrong compound without a word ("C2H5OH" as dimethyl
ether, "C4H10" never isobutane), and a word such as "stuff" matched a street synonym of a drug. Identities are
checked against the database's own CAS numbers (chemicals, PubChem-derived) and CoolProp's molar masses.
"""

from __future__ import annotations

import math

import pytest

from boresize.errors import InputError
from boresize.properties.components import AMBIGUOUS_FORMULAS, CONDENSED_FORMULAS, resolve_component


@pytest.mark.parametrize(("formula", "cas"), [("C2H5OH", "64-17-5"), ("CH3OH", "67-56-1"), ("CH3COOH", "64-19-7")])
def test_a_condensed_formula_is_the_compound_it_draws(formula: str, cas: str) -> None:
    from CoolProp.CoolProp import PropsSI

    component = resolve_component(formula)
    assert component.cas == cas and component.note is None
    names = {"64-17-5": "Ethanol", "67-56-1": "Methanol"}
    if cas in names:  # molar mass against CoolProp's reference data
        assert math.isclose(component.molar_mass, PropsSI("M", names[cas]), rel_tol=1e-3)


@pytest.mark.parametrize("formula", ["C4H10", "C2H6O", "C8H10", "C5H12"])
def test_an_isomer_formula_is_refused_naming_the_isomers(formula: str) -> None:
    with pytest.raises(InputError) as info:
        resolve_component(formula)
    isomers = AMBIGUOUS_FORMULAS[formula]
    assert str(info.value) == (f"fluid: {formula!r} is the formula of several compounds ({', '.join(isomers)}, ...); "
                               f"expected the compound's name, e.g. {isomers[0]!r}, or its CAS number")


def test_every_listed_isomer_and_condensed_formula_resolves_in_the_database() -> None:
    # the table's names must be real: each isomer resolves, and at least two distinct compounds per formula
    for formula, isomers in AMBIGUOUS_FORMULAS.items():
        found = {resolve_component(name).cas for name in isomers}
        assert len(found) == len(isomers) >= 2, formula
    assert all(resolve_component(f).cas == cas for f, cas in CONDENSED_FORMULAS.items())


@pytest.mark.parametrize(("given", "name"), [("stuff", "diacetylmorphine"), ("glycol", "ethylene glycol"),
                                             ("R134a", "norflurane")])
def test_a_name_read_through_a_database_synonym_carries_a_note_naming_the_compound(given: str, name: str) -> None:
    component = resolve_component(given)
    assert component.name == name
    assert component.note == f"{given!r} read as {name} (CAS {component.cas}), a synonym in the chemicals database"


@pytest.mark.parametrize("given", ["methane", "n-butane", "nC4", "CO2", "NH3", "HCl", "74-82-8", "Water", "MDEA",
                                   "isobutane", "propylene glycol"])
def test_plain_names_formulas_and_shorthands_carry_no_note(given: str) -> None:
    assert resolve_component(given).note is None


def test_xylene_is_a_blend_and_is_refused() -> None:
    with pytest.raises(InputError, match="xylene is sold as a mixture of isomers"):
        resolve_component("xylene")


def test_the_note_reaches_the_line() -> None:
    from boresize import make_line, size

    result = size(make_line(tag="S-1", fluid="toluene:0.5, glycol:0.5", flow="5 t/h", pressure="3 barg",
                            temperature="40 degC", backend="thermo"), plugins=False)
    notes = " ".join(result.notes) + (result.state.model if result.state else "")
    assert "'glycol' read as ethylene glycol (CAS 107-21-1)" in notes, notes
