"""Component names to chemical identities, through the ``chemicals`` databases (imported lazily).

A component may be written by name (``methane``, ``n-butane``), formula (``CO2``, ``H2S``), CAS number
(``74-82-8``) or one of the trade's shorthands in :data:`SHORTHANDS` (``C1``, ``nC4``, ``MEG``, ``MDEA``),
which win over the databases where the databases read them otherwise (``C1`` is carbon there, ``DEA``
a pesticide). An unknown name is an :class:`~boresize.errors.InputError` naming it, with close matches
from a list of common process components and, failing those, from the databases' names.

Source of names, formulas, CAS numbers and molar masses: C. Bell et al., ``chemicals`` (PubChem-derived
identifier database), https://github.com/CalebBell/chemicals.
"""

from __future__ import annotations

import difflib
import re
from dataclasses import dataclass
from typing import Any

from boresize.errors import InputError

__all__ = ["AMBIGUOUS_FORMULAS", "BLENDS", "CONDENSED_FORMULAS", "Component", "SHORTHANDS", "is_known_component",
           "resolve_component"]

#: Trade shorthands -> CAS number (checked against chemicals' database by a test).
SHORTHANDS: dict[str, str] = {
    "c1": "74-82-8", "c2": "74-84-0", "c3": "74-98-6", "ic4": "75-28-5", "nc4": "106-97-8",
    "ic5": "78-78-4", "nc5": "109-66-0", "nc6": "110-54-3", "nc7": "142-82-5", "nc8": "111-65-9",
    "nc9": "111-84-2", "nc10": "124-18-5", "meg": "107-21-1", "deg": "111-46-6", "teg": "112-27-6",
    "mea": "141-43-5", "dea": "111-42-2", "mdea": "105-59-9", "mpg": "57-55-6",
}

#: Common process components offered first as close matches for a misspelt name.
COMMON = (
    "methane", "ethane", "propane", "n-butane", "isobutane", "n-pentane", "isopentane", "n-hexane",
    "n-heptane", "n-octane", "n-nonane", "n-decane", "ethylene", "propylene", "benzene", "toluene",
    "o-xylene", "m-xylene", "p-xylene", "cyclohexane", "nitrogen", "oxygen", "argon", "hydrogen", "helium",
    "carbon dioxide", "carbon monoxide", "hydrogen sulfide", "sulfur dioxide", "ammonia", "water",
    "methanol", "ethanol", "isopropanol", "acetone", "ethylene glycol", "diethylene glycol",
    "triethylene glycol", "propylene glycol", "monoethanolamine", "diethanolamine",
    "methyldiethanolamine", "chlorine", "hydrogen chloride", "acetic acid", "styrene", "butadiene",
)

_CAS = re.compile(r"^\d{2,7}-\d{2}-\d$")

#: Trade names of blends that the database would misread as one compound ("LPG" is alanine there,
#: "natural gas" methane): refused, with what to write instead.
BLENDS: dict[str, str] = {
    "lpg": "LPG is a mixture: write its composition, e.g. 'propane:0.6, n-butane:0.4'",
    "natural gas": "natural gas is a mixture: write its composition, e.g. 'methane:0.90, ethane:0.06, propane:0.04'",
    "air": "air is a mixture: write 'nitrogen:0.7812, oxygen:0.2096, argon:0.0092', or use pure fluid Air",
    "hydrochloric acid": "hydrochloric acid is a solution: write e.g. 'mass: water 0.7, hydrogen chloride 0.3'",
    "xylene": "xylene is sold as a mixture of isomers: name one (o-xylene, m-xylene, p-xylene) or write the "
              "mixture, e.g. 'o-xylene:0.2, m-xylene:0.45, p-xylene:0.2, ethylbenzene:0.15'",
    "xylenes": "xylenes are a mixture of isomers: write the mixture, e.g. 'o-xylene:0.2, m-xylene:0.45, "
               "p-xylene:0.2, ethylbenzene:0.15'",
}


#: Condensed structural formulas the trade writes -> CAS number. The database reads a formula by its atoms alone,
#: so "C2H5OH" (C2H6O) came out as dimethyl ether; these name one compound.
CONDENSED_FORMULAS: dict[str, str] = {
    "CH3OH": "67-56-1", "C2H5OH": "64-17-5", "CH3CH2OH": "64-17-5", "CH3COOH": "64-19-7", "HCOOH": "64-18-6",
    "CH3COCH3": "67-64-1", "C6H5CH3": "108-88-3", "CH3CHO": "75-07-0", "CH3OCH3": "115-10-6",
}
#: Molecular formulas that several process compounds share (isomers): refused, naming them, since the
#: database would pick one without a word (C4H10 is n-butane there, never isobutane). Names from chemicals.
AMBIGUOUS_FORMULAS: dict[str, tuple[str, ...]] = {
    "C2H6O": ("ethanol", "dimethyl ether"), "C2H4O": ("acetaldehyde", "ethylene oxide"),
    "C2H4O2": ("acetic acid", "methyl formate"), "C3H6": ("propylene", "cyclopropane"),
    "C3H8O": ("1-propanol", "isopropanol", "methyl ethyl ether"), "C3H6O": ("acetone", "propanal", "propylene oxide"),
    "C4H10": ("n-butane", "isobutane"), "C4H8": ("1-butene", "cis-2-butene", "trans-2-butene", "isobutene",
                                                 "cyclobutane"),
    "C4H6": ("1,3-butadiene", "1-butyne", "2-butyne"), "C4H10O": ("1-butanol", "2-butanol", "isobutanol",
                                                                   "tert-butanol", "diethyl ether"),
    "C5H12": ("n-pentane", "isopentane", "neopentane"), "C5H10": ("1-pentene", "cyclopentane", "2-methyl-2-butene"),
    "C6H14": ("n-hexane", "2-methylpentane", "3-methylpentane", "2,2-dimethylbutane", "2,3-dimethylbutane"),
    "C6H12": ("cyclohexane", "methylcyclopentane", "1-hexene"), "C7H16": ("n-heptane", "2-methylhexane",
                                                                        "3-methylhexane"),
    "C8H10": ("o-xylene", "m-xylene", "p-xylene", "ethylbenzene"), "C8H18": ("n-octane", "isooctane"),
    "C3H8O2": ("propylene glycol", "1,3-propanediol"), "C9H12": ("cumene", "n-propylbenzene", "mesitylene"),
}
_FORMULA = re.compile(r"^(?:[A-Z][a-z]?\d*)+$")


@dataclass(frozen=True)
class Component:
    """A resolved component: CAS number, the database's common name and molar mass [kg/mol]; ``note`` says how
    a name that is only a synonym in the database was read ("'stuff' read as diacetylmorphine ...")."""

    given: str
    cas: str
    name: str
    molar_mass: float
    note: str | None = None


def resolve_component(given: str) -> Component:
    """The chemical identity of ``given`` (name, formula, CAS number or shorthand).

    :raises InputError: (field "fluid") for a name the databases do not know, with close matches
    """
    key = given.strip()
    blend = " ".join(key.casefold().split())
    if blend in BLENDS:
        raise InputError(f"{key!r} is not one component", field="fluid", value=key, expected=BLENDS[blend])
    isomers = AMBIGUOUS_FORMULAS.get(_hill(key) or "") if key not in CONDENSED_FORMULAS else None
    if isomers:
        raise InputError(f"{key!r} is the formula of several compounds ({', '.join(isomers)}, ...)", field="fluid",
                         value=key, expected=f"the compound's name, e.g. {isomers[0]!r}, or its CAS number")
    found = _search(key)
    if found is None:
        raise InputError(f"unknown component {key!r}{_hint(key)}", field="fluid", value=key,
                         expected="a component name, formula or CAS number the chemicals database knows "
                                  "(e.g. methane, n-butane, CO2, 7732-18-5) or a shorthand such as nC4 or MEG")
    cas = _cas_text(found.CAS)
    note = None if _plainly_named(key, found) else \
        f"{key!r} read as {found.common_name} (CAS {cas}), a synonym in the chemicals database"
    return Component(given=key, cas=cas, name=found.common_name, molar_mass=found.MW / 1000.0, note=note)


def _squeezed(text: str) -> str:
    return re.sub(r"[\s_\-,()\[\]']+", "", text.casefold())


def _plainly_named(key: str, found: Any) -> bool:
    """Whether ``key`` is the found compound's common or IUPAC name, formula, CAS number, a shorthand, a name
    of the common list, or one of these with an n- (normal) prefix: anything else is a database synonym."""
    given = _squeezed(key)
    names = {_squeezed(found.common_name), _squeezed(found.iupac_name or ""), _squeezed(found.formula),
             _squeezed(_cas_text(found.CAS))}
    return (given in names or given.removeprefix("n") in names or _hill(key) == found.formula or given in SHORTHANDS
            or given in {_squeezed(c) for c in COMMON} or key in CONDENSED_FORMULAS)


def _hill(key: str) -> str | None:
    """The Hill formula of ``key`` when it is written as a formula ("C2H5OH" -> "C2H6O"), else None."""
    if not _FORMULA.match(key):
        return None
    atoms: dict[str, int] = {}
    for symbol, count in re.findall(r"([A-Z][a-z]?)(\d*)", key):
        atoms[symbol] = atoms.get(symbol, 0) + int(count or 1)
    first = [a for a in ("C", "H") if a in atoms] if "C" in atoms else []
    order = first + sorted(a for a in atoms if a not in first)
    return "".join(f"{a}{atoms[a] if atoms[a] > 1 else ''}" for a in order)


def is_known_component(given: str) -> bool:
    """True when :func:`resolve_component` would resolve ``given`` (no close-match search on failure)."""
    return " ".join(given.casefold().split()) not in BLENDS and _search(given.strip()) is not None


def _search(key: str) -> Any:
    """chemicals' metadata of a name, formula, CAS number or shorthand, or None."""
    from chemicals.identifiers import search_chemical

    query = CONDENSED_FORMULAS.get(key) or SHORTHANDS.get(re.sub(r"[\s_\-]+", "", key.casefold()), key)
    try:
        return search_chemical(query)
    except ValueError:  # chemicals: "Chemical name (x) not recognized"
        return None


def _cas_text(cas: int | str) -> str:
    """chemicals stores a CAS number as an integer (74828); write it as 74-82-8."""
    text = str(cas)
    if _CAS.match(text):
        return text
    return f"{text[:-3]}-{text[-3:-1]}-{text[-1]}"


def _hint(name: str) -> str:
    """ " (close matches: a, b)" from the common list, else from the databases' names, or ""."""
    key = name.casefold()
    close = difflib.get_close_matches(key, COMMON + tuple(SHORTHANDS), n=4, cutoff=0.75)
    if not close:
        close = difflib.get_close_matches(key, _database_names(), n=4, cutoff=0.85)
    return f" (close matches: {', '.join(close)})" if close else ""


def _database_names() -> list[str]:
    """Every name in chemicals' identifier database (about 950,000; loaded only to suggest matches)."""
    from chemicals.identifiers import pubchem_db

    return list(getattr(pubchem_db, "name_index", {}).keys())
