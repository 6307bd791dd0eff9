"""Mixture compositions as a line list writes them, parsed and checked (no property library needed).

Accepted forms (the fluid cell of a line list, or a value from a TOML line list):

* ``"methane:0.90, ethane:0.06, propane:0.04"`` - mole fractions (the default basis). ``=`` or a
  space may stand for the colon (``"methane 0.90, ethane 0.06"``) and ``;`` for the comma. A name may
  itself hold commas or digits (``"1,2-dichloroethane:0.5"``): an item ends only after its number.
* ``"mass: water 0.7, methanol 0.3"`` - mass fractions; ``"mol:"`` or ``"mole:"`` says mole
  explicitly. A ``composition_basis`` column (``mass`` or ``mole``) does the same for a whole line.
* ``"water 70 %, methanol 30 %"`` - percentages (each number followed by ``%``).
* CoolProp's own spelling ``"Methane[0.9]&Ethane[0.1]"`` (mole fractions).
* TOML: ``fluid = {methane = 0.9, ethane = 0.06, propane = 0.04}``,
  ``fluid = [["methane", 0.9], ["ethane", 0.1]]`` or
  ``fluid = [{name = "methane", fraction = 0.9}, {name = "ethane", fraction = 0.1}]``;
  :func:`composition_text` turns any of these into the text form above.

The sum rule: fractions whose sum lies within :data:`SUM_TOLERANCE` (1 %) of 1 are normalised, with
a warning (``Composition.note``, also issued as a Python ``UserWarning``); a sum further from 1 is an
:class:`~boresize.errors.InputError` naming the sum. (thermo itself accepts any sum silently.)
"""

from __future__ import annotations

import math
import re
import warnings
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Literal

from boresize.errors import InputError

__all__ = ["Composition", "SUM_TOLERANCE", "parse_composition", "composition_text", "basis_of"]

Basis = Literal["mole", "mass"]

#: Largest |sum - 1| of the given fractions that is normalised with a warning rather than refused [-].
SUM_TOLERANCE = 0.01

_EXAMPLE = "'methane:0.90, ethane:0.06, propane:0.04' or 'mass: water 0.7, methanol 0.3'"
_BASIS = re.compile(r"^\s*(mass|wt|weight|mol|mole|molar)\s*(?:fractions?|frac|%)?\s*:\s*", re.IGNORECASE)
_NUMBER = r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?"
_ITEM = re.compile(rf"\s*(?P<name>[^:=;]+?)\s*(?:[:=]\s*|\s+)(?P<value>{_NUMBER})\s*(?P<pct>%?)\s*(?:[,;]|$)")
_BRACKET = re.compile(rf"^\s*(?P<name>[^\[\]&]+?)\s*\[\s*(?P<value>{_NUMBER})\s*\]\s*$")


@dataclass(frozen=True)
class Composition:
    """A parsed composition.

    :param components: component names (or CAS numbers) as written, stripped
    :param fractions: fractions on ``basis``, normalised to sum to 1 [-]
    :param basis: "mole" or "mass"
    :param given_sum: the sum of the fractions as given [-]
    :param note: the normalisation warning, when the given sum was not 1
    """

    components: tuple[str, ...]
    fractions: tuple[float, ...]
    basis: Basis
    given_sum: float
    note: str | None = None

    def text(self) -> str:
        """Canonical text, e.g. ``"mole: methane 0.9, ethane 0.1"`` (a cache key and a record)."""
        items = ", ".join(f"{name} {fraction:.6g}" for name, fraction in zip(self.components, self.fractions))
        return f"{self.basis}: {items}"


def basis_of(extra: Sequence[tuple[str, str]]) -> Basis | None:
    """The ``composition_basis`` column among a line's extra cells ("mass", "mole" or None)."""
    for key, value in extra:
        if key.strip().lower() == "composition_basis":
            return _basis_word(value, "composition_basis")
    return None


def _basis_word(word: str, field: str) -> Basis:
    key = word.strip().lower()
    if key in ("mass", "wt", "weight"):
        return "mass"
    if key in ("mol", "mole", "molar"):
        return "mole"
    raise InputError(f"unknown composition basis {word!r}", field=field, value=word, expected="mass or mole")


def composition_text(value: object) -> str:
    """The text form of a composition given as text, a mapping or a list (TOML forms, see module doc).

    :raises InputError: (field "fluid") for a shape that is none of the accepted forms
    """
    if isinstance(value, str):
        return value
    pairs = _pairs(value)
    return ", ".join(f"{name}:{_number(fraction, value)!r}" for name, fraction in pairs)


def _pairs(value: object) -> list[tuple[str, object]]:
    """(name, fraction) pairs from a mapping or a list of pairs or tables."""
    if isinstance(value, Mapping):
        return [(str(k), v) for k, v in value.items()]
    if isinstance(value, Sequence):
        pairs: list[tuple[str, object]] = []
        for item in value:
            if isinstance(item, Mapping) and "name" in item and "fraction" in item:
                pairs.append((str(item["name"]), item["fraction"]))
            elif isinstance(item, Sequence) and not isinstance(item, str) and len(item) == 2:
                pairs.append((str(item[0]), item[1]))
            else:
                raise InputError(f"composition item {item!r} is not a name and a fraction", field="fluid",
                                 value=value, expected="[name, fraction] pairs or {name=..., fraction=...} tables")
        return pairs
    raise InputError(f"a composition cannot be a {type(value).__name__}", field="fluid", value=value,
                     expected=f"text such as {_EXAMPLE}, a table of name = fraction, or a list of pairs")


def parse_composition(value: object, *, basis: Basis | None = None) -> Composition:
    """Parse and check a composition (see the module docstring for the forms and the sum rule).

    :param value: text, a mapping name -> fraction, or a list of pairs/tables
    :param basis: the basis when the text does not say ("mole" when neither says)
    :raises InputError: (field "fluid") for an unreadable item, a negative or non-finite fraction,
        a component named twice, no component, or fractions whose sum is more than 1 % from 1
    """
    if isinstance(value, str):
        text_basis, pairs = _parse_text(value)
        raw = value
    else:
        text_basis, pairs, raw = None, [(n, _number(f, value)) for n, f in _pairs(value)], composition_text(value)
    chosen: Basis = text_basis or basis or "mole"
    names = [name for name, _ in pairs]
    fractions = [fraction for _, fraction in pairs]
    _check_items(raw, names, fractions)
    return _normalised(raw, tuple(names), tuple(fractions), chosen)


def _parse_text(text: str) -> tuple[Basis | None, list[tuple[str, float]]]:
    """(basis from a "mass:" prefix or None, [(name, fraction)]) from the text form."""
    body, found = text, None
    match = _BASIS.match(text)
    if match:
        found = _basis_word(match.group(1), "fluid")
        body = text[match.end():]
    if "&" in body or "[" in body:
        return found, [_bracket_item(part, text) for part in body.split("&")]
    pairs: list[tuple[str, float]] = []
    position = 0
    body = body.strip()
    while position < len(body):
        item = _ITEM.match(body, position)
        if item is None or not item.group("name").strip(" ,;"):
            rest = body[position:].strip(" ,;")
            raise InputError(f"cannot read {rest!r} as a component and its fraction", field="fluid", value=text,
                             expected=f"items 'name:fraction' separated by commas, e.g. {_EXAMPLE}")
        fraction = float(item.group("value")) / (100.0 if item.group("pct") else 1.0)
        pairs.append((item.group("name").strip(" ,;"), fraction))
        position = item.end()
    return found, pairs


def _bracket_item(part: str, text: str) -> tuple[str, float]:
    match = _BRACKET.match(part)
    if match is None:
        raise InputError(f"cannot read {part.strip()!r} as Name[fraction]", field="fluid", value=text,
                         expected="CoolProp's form 'Methane[0.9]&Ethane[0.1]'")
    return match.group("name").strip(), float(match.group("value"))


def _number(value: object, whole: object) -> float:
    """A fraction from a TOML value (a number, or text such as "0.9" or "90 %")."""
    if isinstance(value, bool):
        raise InputError(f"fraction {value!r} is not a number", field="fluid", value=whole, expected="a fraction")
    if isinstance(value, (int, float)):
        return float(value)
    text = str(value).strip()
    scale = 100.0 if text.endswith("%") else 1.0
    try:
        return float(text.rstrip("% ")) / scale
    except ValueError:
        raise InputError(f"fraction {value!r} is not a number", field="fluid", value=whole,
                         expected="a fraction such as 0.9 or '90 %'") from None


def _check_items(raw: str, names: list[str], fractions: list[float]) -> None:
    if not names:
        raise InputError("no component given", field="fluid", value=raw, expected=f"a composition such as {_EXAMPLE}")
    for name, fraction in zip(names, fractions):
        if not (math.isfinite(fraction) and fraction >= 0.0):
            raise InputError(f"fraction {fraction:g} of {name!r} is not a fraction", field="fluid", value=raw,
                             expected="fractions of 0 or more")
    seen: set[str] = set()
    for name in names:
        key = name.casefold()
        if key in seen:
            raise InputError(f"component {name!r} is given twice", field="fluid", value=raw,
                             expected="each component once")
        seen.add(key)


def _normalised(raw: str, names: tuple[str, ...], fractions: tuple[float, ...], basis: Basis) -> Composition:
    """Apply the sum rule (see module docstring); components with a zero fraction are left out."""
    total = math.fsum(fractions)
    if abs(total - 1.0) > SUM_TOLERANCE:
        raise InputError(f"the {basis} fractions sum to {total:.6g}, not 1", field="fluid", value=raw,
                         expected=f"fractions summing to 1 (a sum within {SUM_TOLERANCE:.0%} of 1 is normalised)")
    note = None
    if total != 1.0 and not math.isclose(total, 1.0, rel_tol=1e-12):
        note = f"{basis} fractions summed to {total:.6g}; normalised to 1"
        warnings.warn(f"{raw!r}: {note}", UserWarning, stacklevel=3)
    kept = [(n, f / total) for n, f in zip(names, fractions) if f > 0.0]
    return Composition(tuple(n for n, _ in kept), tuple(f for _, f in kept), basis, total, note)
