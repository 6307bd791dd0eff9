"""Bare pressure units: ``9 psi``, ``0.5 bar``, ``300 kPa``, a header's ``pressure [bar]`` - a pressure unit with neither
a ``g`` (gauge) nor an ``a`` (absolute). boresize reads one as absolute (documented), as gauge, or refuses it
(:data:`BARE_PRESSURE_MODES`); each is named in a note on its line (:func:`parse_pressure`), and a line already
built is read again in another mode by :func:`reread` (the API's ``size``, ``check`` and ``size_many``)."""

from __future__ import annotations

import functools
import numbers
import re
from dataclasses import replace
from typing import Any, Literal

from boresize.errors import InputError, UnitError
from boresize.model import BareReading, Line
from boresize.units.quantities import ATMOSPHERE, parse_quantity
from boresize.units.text import _ABSOLUTE, _GAUGE, _NUMBER, _TOKEN, _Cell, _normalise, _replace_unicode

__all__ = ["BARE_PRESSURE_MODES", "BarePressure", "bare_pressure_mode", "parse_pressure", "reread"]

BarePressure = Literal["absolute", "gauge", "error"]
#: How a bare pressure unit is read: ``absolute`` (the default, as documented), ``gauge`` (one standard atmosphere,
#: 101325 Pa, added) or ``error`` (refused: the line is an error naming the field and the value).
BARE_PRESSURE_MODES: tuple[BarePressure, ...] = ("absolute", "gauge", "error")
#: The gauge and absolute spellings of each bare unit that has them (the normalised unit -> (gauge, absolute)).
_SPELLINGS = {"bar": ("barg", "bara"), "kPa": ("kPag", "kPaa"), "MPa": ("MPag", "MPaa"), "psi": ("psig", "psia"),
              "kgcm2a": ("kg/cm2g", "kg/cm2a")}

#: Units that are absolute by their definition, never a gauge reading: the standard atmosphere (1 atm =
#: 101325 Pa, ISO 80000-4) is a pressure level, so "1 atm" is not bare and gauge mode does not make it 2 atm.
_ABSOLUTE_BY_DEFINITION = frozenset({"atm"})


def bare_pressure_mode(value: object, field: str = "bare_pressure") -> BarePressure:
    """``value`` checked as one of :data:`BARE_PRESSURE_MODES`.

    :raises InputError: naming ``field``, the value and the three modes
    """
    if isinstance(value, str) and value in BARE_PRESSURE_MODES:
        return value
    raise InputError(f"unknown bare-pressure mode {value!r}", field=field, value=value,
                     expected=f"one of {', '.join(BARE_PRESSURE_MODES)}")


@functools.lru_cache(maxsize=256)
def _bare(unit: str) -> tuple[str, str] | None:
    """(gauge, absolute) spellings to suggest when ``unit`` is a bare pressure unit ("", "" for one without
    them, such as Pa or mbar); None when it says gauge or absolute, or is no unit boresize reads."""
    cleaned = _replace_unicode(unit.strip().strip("[]").strip())
    try:
        expression = _normalise(cleaned, _Cell("pressure", cleaned, "pressure"))
    except InputError:
        return None
    words = set(_TOKEN.findall(expression))
    if words & set(_GAUGE):
        return None
    if re.fullmatch(r"kgf?/cm2", cleaned, re.IGNORECASE):  # normalised to kgcm2a, but written without an a
        return _SPELLINGS["kgcm2a"]
    if words & set(_ABSOLUTE) or words <= _ABSOLUTE_BY_DEFINITION:
        return None
    return _SPELLINGS.get(expression, ("", ""))


def _reading(value: object, default_unit: str | None) -> tuple[str, str, str] | None:
    """(number as written, unit, the cell as messages show it) of a text or number cell; None otherwise."""
    default = (default_unit or "").strip().strip("[]").strip()
    if isinstance(value, str):
        match = _NUMBER.fullmatch(value)
        if match is None:
            return None
        number, unit = match.group(1), match.group(2).strip()
        shown = value.strip()
    elif isinstance(value, numbers.Real) and not isinstance(value, bool):  # numpy's too, shown as the parser shows it
        try:
            number = str(int(value)) if isinstance(value, numbers.Integral) else repr(float(value))
        except OverflowError:
            return None
        unit, shown = "", number
    else:
        return None
    if not unit and default:
        return number, default, f"{shown} [{default}]"
    return (number, unit, shown) if unit else None


def parse_pressure(value: object, field: str, default_unit: str | None = None,
                   bare: BarePressure = "absolute") -> tuple[float, BareReading | None]:
    """A pressure cell [Pa absolute], and for a bare unit how it was read (its ``note`` for the line; None otherwise).

    :param bare: how a bare unit is read (:data:`BARE_PRESSURE_MODES`)
    :raises InputError: as :func:`~boresize.units.parse_quantity`; in ``error`` mode, a bare unit (a UnitError naming
        the field, the value and the spellings with g or a)
    """
    reading = _reading(value, default_unit)
    spellings = _bare(reading[1]) if reading is not None else None
    try:
        pascal = parse_quantity(value, field, "pressure", default_unit)
    except InputError as exc:  # a bare gauge pressure at or below zero is a vacuum, not an error
        if bare != "gauge" or spellings is None or isinstance(exc, UnitError):
            raise
        pascal = parse_quantity(value, field, "pressure_difference", default_unit)
    if reading is None or spellings is None:
        return pascal, None
    number, _, shown = reading
    read = BareReading(field, shown, number, *spellings, "absolute")
    if bare == "error":
        raise _refused(read, value)
    return (_as_gauge(pascal, read, value), replace(read, read_as="gauge")) if bare == "gauge" else (pascal, read)


def _refused(read: BareReading, value: object) -> UnitError:
    """The error of a bare unit in ``error`` mode, naming the field, the value and what was expected."""
    return UnitError(f"'{read.shown}' does not say gauge or absolute", field=read.field, value=value,
                     expected=f"a unit with g or a: {read.gauge} (gauge) or {read.absolute} (absolute)" if read.gauge
                     else "a pressure unit with g (gauge) or a (absolute), such as barg or bara")


def _as_gauge(pascal: float, read: BareReading, value: object) -> float:
    """``pascal`` read as a gauge pressure: one standard atmosphere (101325 Pa) added; above zero absolute."""
    result = pascal + ATMOSPHERE
    if not result > 0.0:
        raise InputError(f"absolute pressure must be above zero: '{read.shown}' read as gauge is {result:g} Pa abs",
                         field=read.field, value=value, expected="a gauge pressure above -101.325 kPa")
    return result


def reread(line: Line, bare: BarePressure) -> Line:
    """``line`` with its pressures given in a bare unit read as ``bare`` says (the fields of ``bare_pressures``).

    :raises InputError: in ``error`` mode, the line's first bare pressure; a pressure at or below zero absolute; each
        naming the line
    """
    changes: dict[str, Any] = {}
    for read in line.bare_pressures:
        value: float = getattr(line, read.field)
        try:
            if bare == "error":
                raise _refused(read, read.shown)
            if read.read_as == "absolute" and bare == "gauge":
                changes[read.field] = _as_gauge(value, read, read.shown)
            elif read.read_as == "gauge" and bare == "absolute":
                changes[read.field] = _as_absolute(value - ATMOSPHERE, read)
        except InputError as exc:
            raise exc.for_line(line.tag) from None
    if not changes:
        return line
    read_as: Literal["absolute", "gauge"] = "gauge" if bare == "gauge" else "absolute"
    readings = tuple(replace(read, read_as=read_as) for read in line.bare_pressures)
    return replace(line, **changes, bare_pressures=readings)


def _as_absolute(pascal: float, read: BareReading) -> float:
    if not pascal > 0.0:
        raise InputError(f"absolute pressure must be above zero: '{read.shown}' read as absolute is {pascal:g} Pa abs",
                         field=read.field, value=read.shown,
                         expected="a pressure above 0 Pa abs (a g suffix adds 101.325 kPa)")
    return pascal
