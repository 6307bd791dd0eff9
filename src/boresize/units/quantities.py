"""The one pint registry of boresize, and the parsing of what engineers type into SI floats.

Everything a user types ("65 t/h", "10 barg", "20 °C", "50 kPa/100 m") passes through
:func:`parse_quantity` or :func:`parse_flow` once, at the edge; inside boresize every number is a
plain SI float (kg, m, s, Pa absolute, K).

Rules the parser applies (pint alone gets each of them wrong or refuses them):

* The number and the unit are split here, not by pint: offset units (gauge pressures, degC)
  cannot be multiplied, and pint reads "40 kPa/100 m" as 0.4 kPa*m. A number inside a unit
  ("/100 m", "/100 ft") divides by the whole group.
* Pressure: ``bar``, ``kPa``, ``MPa``, ``psi`` without a suffix are ABSOLUTE (as are ``bara``,
  ``psia`` ...). A ``g`` suffix (``barg``, ``kPa(g)``, ``psig``, ``kg/cm2g``) adds one standard
  atmosphere, 101325 Pa. A pressure difference or a drop per length takes neither suffix.
* Temperature: degC, °C, C, degF, °F, F, K, degR; a bare C or F is a degree only in a
  temperature field (elsewhere C is the coulomb). A temperature difference reads degC and degF
  as intervals (1 degF = 5/9 K).
* Standard gas volumes are their own dimensions, one per reference state, so that pint never
  converts Nm3 to Sm3 without the temperature ratio: ``Sm3`` (15 degC, 101.325 kPa, ISO 13443),
  ``Nm3`` (0 degC, 101.325 kPa, DIN 1343), ``scf`` (60 degF, 14.696 psia, the oil and gas
  convention; some US contracts use 14.73 psia: give Sm3 or a mass flow when that matters).
* Trade spellings: m3, m³, t/h, te/h, mt/h and MT/h (the metric tonne, not pint's millitonne),
  MTPD, mPa.s, mPa·s, cP, gpm (US gallons), bbl and barrel (the oil barrel, 42 US gal, not pint's
  31.5 gal), bpd. The trade's M is a thousand and MM a million, not pint's mega: Mscf (1000 scf),
  MMSCFD (1e6 scf/d), Mlb/h and klb/h (1000 lb/h), MMlb/h, Mbbl/d and kbbl/d (1000 bbl/d), MMbbl/d,
  kbpd, MBPD; the lowercase mscf and mmscf read as Mscf and MMscf. Spellings that mean two things
  are refused naming both readings: "Mpa"/"mpa"/"MPA" (MPa or mPa?), "ton" (short ton or tonne?),
  "nm3" (nanometre³ or Nm3?), "Mt" (megatonne or a thousand tonnes?), "M" and "MM" alone (a
  thousand or the molar; a million or millimetres?), "mlb", "mbbl", "mbpd" and their "mm" forms
  (SI's milli or the trade's thousand?); a barrel with any other prefix ("Gbbl") is unknown.
* Decimal commas and thousands separators are refused ("1,5" and "1,500" mean different things
  in different countries).

The spelling tables and the splitting of the text live in :mod:`boresize.units.text`; this module
builds the registry and the quantities and checks their dimensions. A unit text that passed every
check for a kind keeps its conversion (``SI = number * factor * scale + offset``, the same float
operations as the full parse, found once by pint): the next number in that unit costs a multiply
(a logarithmic unit, which no straight line converts, goes to pint every time).
"""

from __future__ import annotations

import functools
import math
import re
import sys
from tokenize import TokenError
from typing import TYPE_CHECKING, Literal, NamedTuple

from boresize.errors import InputError
from boresize.model import Flow, FlowBasis
from boresize.units.common import TABLE
from boresize.units.text import (
    _ABSOLUTE,
    _DEFINITIONS,
    _DESCRIPTIONS,
    _GAUGE,
    _KINDS,
    _OFFSET,
    _TOKEN,
    _Cell,
    _finite,
    _help,
    _normalise,
    _number_and_unit,
    _plain_split,
)

if TYPE_CHECKING:  # pint costs 0.2-0.3 s to import: it loads with the registry, on first use
    import pint
    from pint.facets.plain import PlainUnit

__all__ = [
    "ATMOSPHERE",
    "QuantityKind",
    "STANDARD_CONDITIONS",
    "registry",
    "application_registry",
    "parse_quantity",
    "parse_flow",
    "format_unit_help",
    "is_unit",
]

QuantityKind = Literal["mass_flow", "volume_flow", "pressure", "pressure_difference", "temperature",
                       "temperature_difference", "length", "density", "viscosity", "velocity",
                       "drop_per_length", "dimensionless"]

ATMOSPHERE = 101325.0  # [Pa] standard atmosphere, exact (NIST SP 811, App. B): the zero of every gauge unit
_PSI = 6894.757293168361  # [Pa] 1 lbf/in2 = 0.45359237 kg * 9.80665 m/s2 / 0.0254**2 m2 (NIST SP 811, App. B)

#: Reference states of the standard volume units: name -> (T [K], P [Pa abs], label).
STANDARD_CONDITIONS: dict[str, tuple[float, float, str]] = {
    "Sm3": (288.15, ATMOSPHERE, "15 degC, 101.325 kPa (ISO 13443 standard conditions)"),
    "Nm3": (273.15, ATMOSPHERE, "0 degC, 101.325 kPa (DIN 1343 normal conditions)"),
    "scf": ((60.0 + 459.67) / 1.8, 14.696 * _PSI, "60 degF, 14.696 psia"),
}
# pint unit in which each family's SI value (m3 at its own reference state) is expressed
_STANDARD_SI = {"Sm3": "Sm3/s", "Nm3": "Nm3/s", "scf": "m3_60F/s"}


@functools.cache
def registry() -> pint.UnitRegistry[float]:
    """The process-wide unit registry, built on first call (0.2-0.3 s with the pint import).

    Adds gauge/absolute pressures (barg, bara, kPag, kPaa, MPag, psig, psia, kgcm2g), the
    standard-volume units (Sm3, Nm3, scf, MMSCFD), m3/m2 spellings, gpm (US), and the display units
    kPa_per_100m, bar_per_km, psi_per_100ft.
    """
    _import_pint()
    import pint

    try:
        ureg: pint.UnitRegistry[float] = pint.UnitRegistry(cache_folder=":auto:")
    except OSError:  # cache folder not writable: build without it
        ureg = pint.UnitRegistry()
    for line in _definition_lines():
        ureg.define(line)
    return ureg


_WITHOUT_DASK: list[bool] = []  # set by leave_dask_out_of_pint(): the command line's processes hold no dask array


def leave_dask_out_of_pint() -> None:
    """Have pint, when this process first imports it, load without its dask support (the command line's choice).

    pint 0.25 imports dask whenever it is installed (``pint.compat``), and dask brings jinja2, yaml, psutil and
    toolz: about a third of a second of each run. Only Quantities wrapping dask arrays need it, and the command
    line makes none; a library caller keeps pint as it is. dask stays importable by anything after pint.
    """
    if not _WITHOUT_DASK:
        _WITHOUT_DASK.append(True)


def _import_pint() -> None:
    """Import pint, without dask if :func:`leave_dask_out_of_pint` asked and neither is loaded yet."""
    if _WITHOUT_DASK and "pint" not in sys.modules and "dask" not in sys.modules:
        # measured: -0.28 s, 1.01 -> 0.73 s, one line in units outside units/common.py's table
        # (CPU of a one-line run after `import CoolProp`, least of 5, interleaved; benchmarks/bench_scale.py --one-line)
        sys.modules["dask"] = None  # type: ignore[assignment]  # find_spec("dask") then answers None
        try:
            import pint  # noqa: F401  # loaded here, without dask; used by the caller
        finally:
            del sys.modules["dask"]


def _definition_lines() -> list[str]:
    """boresize's unit definitions, in the order pint needs them."""
    lines = [line for line in _DEFINITIONS.splitlines() if line]
    for prefix in ("", "d", "c", "m", "u", "k"):  # explicit, or pint reads cm3 as centi-(m3)
        lines += [f"{prefix}m3 = {prefix}m**3", f"{prefix}m2 = {prefix}m**2"]
    return lines


_PREPARED: list[object] = []  # the application registries that have boresize's units (kept alive: compared by identity)


def application_registry() -> pint.UnitRegistry[float]:
    """pint's application registry (``pint.get_application_registry()``, or the one the caller set with
    ``pint.set_application_registry``), with boresize's extra units added once: the quantities the API returns
    live there, so that they add to the caller's own (pint refuses to mix registries).

    Only the units the registry lacks are defined: a name (or alias) the caller already defined stays theirs,
    and nothing is redefined. The parser keeps its own registry (:func:`registry`): what a cell means does not
    depend on the caller's definitions.
    """
    _import_pint()
    import pint

    app = pint.get_application_registry()  # type: ignore[no-untyped-call]
    ureg = app.get()
    if not any(ureg is seen for seen in _PREPARED):
        # which names are missing is decided before any is defined: once m3 is defined, "cm3" would read as centi-m3;
        # asked through the application wrapper, which loads a lazy registry first
        missing = [line for line in _definition_lines() if not any(name in app for name in _names(line))]
        for line in missing:
            try:
                ureg.define(line)
            except (pint.PintError, ValueError, KeyError):  # it leans on a unit of the caller's that differs: skip
                continue
        _PREPARED.append(ureg)
    return ureg  # type: ignore[no-any-return]


def _names(definition: str) -> list[str]:
    """The unit name and aliases a definition line gives ("standard_cubic_metre = [...] = Sm3")."""
    parts = [part.strip() for part in definition.split("=")]
    return [parts[0], *parts[2:]]


def format_unit_help(kind: QuantityKind) -> str:
    """What a field of ``kind`` accepts, for messages: e.g. "a mass flow (kg/h, t/h, kg/s, lb/h)"."""
    return _help(kind)


# ---------------------------------------------------------------------------------------------
# Quantity (the text is split and respelled in boresize.units.text)


def _quantity(value: object, field: str, kind: str, default_unit: str | None) -> tuple[_Parsed, _Cell, str]:
    """Parse a cell into a pint Quantity (the unit in the cell wins over ``default_unit``); also the unit
    text it was read in (the key of :data:`_CONVERSIONS`, "" for a plain number)."""
    number, unit, cell = _number_and_unit(_Cell(field, value, kind))
    default = (default_unit or "").strip().strip("[]").strip()
    if not unit and default:
        unit, cell = default, _Cell(field, value, kind, f"{cell.shown} [{default}]")
    elif not unit and kind == "dimensionless":
        one = _unit_of("dimensionless")
        return _Parsed(number, one.units, one.dimensionality, 1.0), cell, ""
    elif not unit:
        raise cell.error(f"missing unit in '{cell.shown}'")
    expression = _normalise(unit, cell)
    words = set(_TOKEN.findall(expression))
    if kind in ("pressure_difference", "drop_per_length"):
        for names, what in ((_GAUGE, "a gauge pressure"), (_ABSOLUTE, "an absolute pressure")):
            if words.intersection(names):
                noun = _KINDS[kind][1]
                raise cell.error(f"'{cell.shown}' is {what}, but {noun} is neither gauge nor absolute")
    if kind == "viscosity" and "MPa" in words:  # 1 MPa s = 1e6 Pa s: a typo for mPa s
        raise cell.error(f"'{cell.shown}' is in megapascal-seconds (1 MPa s = 1e6 Pa s)",
                         f"{_help(kind)}; mPa s with a small m is the millipascal")
    _check_powers(expression, cell)
    return _build(number, expression, cell), cell, unit


_POWER_OP = re.compile(r"\*\*|\^")
_SMALL_EXPONENT = re.compile(r"\s*\(?\s*[+-]?\d(?:\.\d+)?(?![\d.eE])\s*\)?(?!\s*(?:\*\*|\^))")


def _check_powers(expression: str, cell: _Cell) -> None:
    """Refuse a power that is not one small number (m**3, s^-1): pint computes "10**10**10" exactly,
    a ten-billion-digit integer, and never returns."""
    powers = list(_POWER_OP.finditer(expression))
    if len(powers) > 4 or any(not _SMALL_EXPONENT.match(expression, p.end()) for p in powers):
        raise cell.error(f"cannot read the unit of '{cell.shown}': a power must be one small number, as in "
                         f"m**3 or s^-1")


@functools.lru_cache(maxsize=4096)  # measured: +76 % on rows-errors (benchmarks/bench_parsing.py unit-parse)
def _unit_of(expression: str) -> pint.Quantity[float]:
    """One of the unit ``expression`` (parsing costs ~100 us; a line list repeats its units)."""
    return registry().parse_expression(expression)


def _to_si(units: PlainUnit, si: str) -> tuple[float, float] | None:
    """(scale, offset) with value_si = value * scale + offset, from pint's own conversion of 0 and 1;
    None for a unit pint does not convert linearly (the logarithmic dB, neper, decade, octave)."""
    ureg = registry()
    zero, one, two = (float(ureg.Quantity(x, units).to(si).magnitude) for x in (0.0, 1.0, 2.0))
    if not math.isclose(two, 2.0 * one - zero, rel_tol=1e-9, abs_tol=1e-12 * abs(one - zero)):
        return None
    return one - zero, zero


def _magnitude_si(quantity: _Parsed, si: str) -> float:
    """``quantity.to(si).magnitude``, through the linear map of its unit where it has one."""
    linear = _to_si(quantity.units, si)
    if linear is None:
        return float(registry().Quantity(float(quantity.magnitude), quantity.units).to(si).magnitude)
    scale, offset = linear
    return float(quantity.magnitude) * scale + offset


class _Parsed(NamedTuple):
    """A parsed cell: what pint's Quantity would hold, without building one per cell (~100 us each)."""

    magnitude: float  # the number times ``factor``
    units: PlainUnit
    dimensionality: object
    factor: float  # the magnitude of the unit expression (1000 for "1000*scf"), 1.0 for an offset unit


def _build(number: float, expression: str, cell: _Cell) -> _Parsed:
    """``number`` times the unit ``expression``, with pint's faults turned into UnitError."""
    _import_pint()  # the first pint import of a parse: before registry()
    import pint

    try:
        if expression in _OFFSET:  # offset units are built, never multiplied
            unit = _offset_unit(expression)
            return _Parsed(number, unit.units, unit.dimensionality, 1.0)
        unit = _unit_of(expression)
        factor = float(unit.magnitude)
        return _Parsed(number * factor, unit.units, unit.dimensionality, factor)
    except pint.UndefinedUnitError as exc:
        names = ", ".join(f"'{name}'" for name in exc.unit_names)
        raise cell.error(f"unknown unit {names} in '{cell.shown}'") from exc
    except pint.OffsetUnitCalculusError as exc:
        raise cell.error(f"'{cell.shown}' combines a gauge or degC/degF unit with other units") from exc
    except (pint.PintError, TokenError, AssertionError, SyntaxError, TypeError, ValueError, ZeroDivisionError,
            OverflowError) as exc:
        raise cell.error(f"cannot read the unit of '{cell.shown}'") from exc


def is_unit(text: str) -> bool:
    """Whether ``text`` reads as a unit boresize knows ("ft", "t/h", "kPa/100 m"; not "design" or "see P&ID")."""
    cell = _Cell("header", text, "length", text)
    try:
        _build(1.0, _normalise(text.strip(), cell), cell)
    except InputError:
        return False
    return True


@functools.lru_cache(maxsize=64)  # measured: +76 % on rows-errors with _unit_of's (bench_parsing.py unit-parse)
def _offset_unit(expression: str) -> pint.Quantity[float]:
    """One of an offset unit (degC, barg ...), built rather than parsed."""
    return registry().Quantity(1.0, expression)


# ---------------------------------------------------------------------------------------------
# Dimension check and the public parsers


@functools.cache  # measured: +98 % on rows-errors (benchmarks/bench_parsing.py unit-dimension)
def _dimension(expression: str) -> object:
    """The pint dimensionality of a unit expression (cached)."""
    return registry().parse_expression(expression).dimensionality


def _wrong_dimension(quantity: _Parsed, noun: str, cell: _Cell) -> InputError:
    """The error for a quantity of the wrong kind, saying in the trade's words what it is."""
    found = {_dimension(si): name for si, name in _DESCRIPTIONS}.get(quantity.dimensionality)
    what = found or f"a quantity of dimension {quantity.dimensionality}"
    expected = _help(cell.kind)
    if what == "a kinematic viscosity" and cell.kind == "viscosity":
        expected += "; multiply a kinematic viscosity by the density to get it"
    return cell.error(f"'{cell.shown}' is {what}, not {noun}", expected)


def parse_quantity(value: object, field: str, kind: QuantityKind,
                   default_unit: str | None = None) -> float:
    """Parse a cell such as "10 barg" into an SI float, checking its dimension against ``kind``.

    Returns, by kind: mass_flow [kg/s], volume_flow [m3/s, actual], pressure [Pa ABSOLUTE: a bare
    bar/kPa/MPa/psi is absolute, a g suffix adds 101325 Pa], pressure_difference [Pa],
    temperature [K], temperature_difference [K], length [m], density [kg/m3], viscosity [Pa s],
    velocity [m/s], drop_per_length [Pa/m], dimensionless [-] ("10 %" -> 0.1).

    :param value: the cell ("65 t/h"), or a bare number that takes ``default_unit``; anything else (None,
        a list, a bool) raises InputError naming ``field``
    :param field: the field name used in error messages
    :param kind: what the field holds
    :param default_unit: unit of a bare number, e.g. from a header "flow [t/h]" (brackets allowed)
    :raises InputError: no value, not a number, NaN/inf, separators, pressure <= 0 Pa abs, T <= 0 K
    :raises UnitError: missing, unknown or ambiguous unit, wrong dimension, gauge unit on a difference
    """
    split = _plain_split(value, default_unit)
    if split is not None and (known := _CONVERSIONS.get((split[1], kind))) is not None:
        fast = split[0] * known.factor * known.scale + known.offset  # a unit read before: the operations below
        if math.isfinite(fast) and (fast > 0.0 or kind not in ("pressure", "temperature")):
            return fast
    quantity, cell, unit = _quantity(value, field, kind, default_unit)
    si, noun, _ = _KINDS[kind]
    if quantity.dimensionality != _dimension(si):
        raise _wrong_dimension(quantity, noun, cell)
    _remember(unit, kind, quantity.factor, _to_si(quantity.units, si))
    result = _finite(_magnitude_si(quantity, si), cell)  # "1e308 m*10" overflows to inf
    if kind == "pressure" and result <= 0.0:
        raise cell.error(f"absolute pressure must be above zero: '{cell.shown}' is {result:g} Pa abs",
                         "a pressure above 0 Pa abs (a g suffix adds 101.325 kPa)", InputError)
    if kind == "temperature" and result <= 0.0:
        raise cell.error(f"'{cell.shown}' is {result:g} K, at or below absolute zero",
                         "a temperature above 0 K (-273.15 degC)", InputError)
    return result


def parse_flow(value: object, field: str = "flow", default_unit: str | None = None) -> Flow:
    """Parse a flow cell into a :class:`~boresize.model.Flow` with its basis.

    mass [kg/s] (kg/h, t/h, lb/h, klb/h, t/d ...), volume [m3/s at line conditions] (m3/h, l/min,
    gpm, bbl/d, ft3/s ...), standard-volume [m3/s at the reference state named by the unit,
    see :data:`STANDARD_CONDITIONS`] (Sm3/h, Nm3/h, scfm, MMSCFD ...) or molar [mol/s] (kmol/h, mol/s,
    lbmol/h, kmol/d ...; the line's molar mass makes it a mass flow). A flow <= 0 is returned
    as is (the line validator judges it); a wrong dimension raises :class:`UnitError`.
    """
    split = _plain_split(value, default_unit)
    if split is not None and (known := _CONVERSIONS.get((split[1], "flow"))) is not None:
        magnitude = split[0] * known.factor  # a unit read before: the operations below, without pint
        if math.isfinite(magnitude):
            return Flow(known.basis, magnitude * known.scale + known.offset, *known.reference)
    quantity, cell, unit = _quantity(value, field, "flow", default_unit)
    if not math.isfinite(float(quantity.magnitude)):  # "1e308 t/h*1e10" overflows to inf
        raise cell.error(f"'{cell.shown}' is not a finite number", "a finite number", InputError)
    for basis, si, reference in _FLOW_BASES:
        if quantity.dimensionality == _dimension(si):
            _remember(unit, "flow", quantity.factor, _to_si(quantity.units, si), basis, reference)
            return Flow(basis, _magnitude_si(quantity, si), *reference)
    raise _wrong_dimension(quantity, "a flow", cell)


# basis, SI unit in pint, (reference T [K], reference P [Pa abs], label) of each flow basis
_FLOW_BASES: tuple[tuple[FlowBasis, str, tuple[float | None, float | None, str | None]], ...] = (
    ("mass", "kg/s", (None, None, None)), ("volume", "m**3/s", (None, None, None)),
    ("molar", "mol/s", (None, None, None)),
    *(("standard-volume", si, STANDARD_CONDITIONS[name]) for name, si in _STANDARD_SI.items()))


# ---------------------------------------------------------------------------------------------
# The conversions already read: (unit text, kind) -> how a number in that unit becomes SI


class _Conversion(NamedTuple):
    """``(number * factor) * scale + offset`` is the SI value: the same float operations in the same order as
    the full parse (:func:`_build`, then :func:`_magnitude_si`), so both give the same float to the last bit."""

    factor: float
    scale: float
    offset: float
    basis: FlowBasis = "mass"  # a flow's basis (unused for any other kind)
    reference: tuple[float | None, float | None, str | None] = (None, None, None)  # a standard volume's state


_CONVERSIONS: dict[tuple[str, str], _Conversion] = {}  # measured: +84 % on rows (benchmarks/bench_parsing.py)
# the commonest spellings, as read through pint (tests/units/test_common_units.py checks each to the last bit), so
# that a run reading only these never imports pint, numpy nor scipy: measured: -0.43 s, 0.73 -> 0.30 s, one line
# (CPU of a one-line run after `import CoolProp`, least of 5, interleaved; benchmarks/bench_scale.py --one-line)
_CONVERSIONS.update((key, _Conversion(*row)) for key, row in TABLE.items())
_CONVERSIONS_KEPT = 4096  # unit spellings remembered; a line list uses a handful


def _remember(unit: str, kind: str, factor: float, linear: tuple[float, float] | None, basis: FlowBasis = "mass",
              reference: tuple[float | None, float | None, str | None] = (None, None, None)) -> None:
    """Keep the conversion of a unit text whose unit passed the checks of ``kind`` (none for a non-linear unit);
    the checks of the number itself (finite, above zero) run on every call."""
    if linear is not None and len(_CONVERSIONS) < _CONVERSIONS_KEPT:
        _CONVERSIONS[(unit, kind)] = _Conversion(factor, *linear, basis, reference)
