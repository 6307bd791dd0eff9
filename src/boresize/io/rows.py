"""Turning one line-list row (text cells) into a validated :class:`~boresize.model.Line` in SI.

Header names are case-insensitive and may carry a default unit in brackets (``flow [t/h]``) or, read the
same way, in parentheses at the end (``Length (m)``).
A cell may carry its own unit (``65 t/h``), which wins over the header's. Every dimensional
field needs a unit from one of the two: a bare number is an error, never a guess.
"""

from __future__ import annotations

import json
import math
import re
from collections.abc import Collection, Mapping
from dataclasses import dataclass

from boresize.errors import InputError
from boresize.model import BareReading, Flow, Line
from boresize.pipes import normalise_nps, normalise_schedule
from boresize.units import BarePressure, QuantityKind, parse_flow, parse_pressure, parse_quantity

__all__ = ["ALIASES", "UNBALANCED_QUOTE", "NOT_READ", "not_read", "COLUMNS", "Header", "parse_header", "line_from_row", "DEFAULT_LENGTH_M"]

COLUMNS = (
    "tag", "fluid", "flow", "pressure", "temperature", "length", "service", "pipe_class", "nps",
    "density", "viscosity", "design_margin", "phase", "backend", "eos", "elevation", "fittings", "fixed_drop",
    "min_outlet_pressure", "source_pressure", "liquid_level", "npsh_required", "roughness", "case", "schedule",
    "fittings_method", "compressible", "quality", "vapour_pressure", "two_phase_method",
)
# Optional quantities: column -> (quantity kind, must be above zero, example for messages)
OPTIONAL_QUANTITIES: dict[str, tuple[QuantityKind, bool, str]] = {
    "elevation": ("length", False, "outlet minus inlet elevation, rise positive, e.g. '12 m' or '-3 m'"),
    "fixed_drop": ("pressure_difference", False, "equipment and control-valve allowances, e.g. '0.7 bar'"),
    "min_outlet_pressure": ("pressure", True, "lowest pressure at the line end, e.g. '2 barg'"),
    "source_pressure": ("pressure", True, "pressure of the vessel a pump draws from, e.g. '0.5 barg'"),
    "liquid_level": ("length", False, "liquid level above the pump datum, e.g. '4 m'"),
    "npsh_required": ("length", True, "NPSH required by the pump, e.g. '3.5 m'"),
    "roughness": ("length", True, "absolute roughness replacing the pipe class's, e.g. '0.5 mm'"),
    "vapour_pressure": ("pressure", True, "vapour or bubble pressure at line temperature, with the line's own "
                                          "density and viscosity, e.g. '0.05 bar'"),
}
_COLUMN_SET = frozenset(COLUMNS)
#: The trade's usual headings for a column (as :func:`parse_header` normalises them: lower case, spaces and
#: dashes as ``_``, a unit in brackets or parentheses left off) -> the column they feed. Listed in README.md.
ALIASES: dict[str, str] = {
    "line_number": "tag", "line_no": "tag", "line_no.": "tag", "line_tag": "tag", "line_id": "tag",
    "fluid_name": "fluid", "medium": "fluid",
    "mass_flow": "flow", "mass_flow_rate": "flow", "mass_flowrate": "flow", "flow_rate": "flow", "flowrate": "flow",
    "operating_pressure": "pressure", "inlet_pressure": "pressure",
    "operating_temperature": "temperature",
    "pipe_length": "length", "line_length": "length",
    "elevation_change": "elevation", "elevation_difference": "elevation",
    "nominal_pipe_size": "nps", "nominal_size": "nps", "line_size": "nps",
    "pipe_schedule": "schedule", "sch": "schedule",
    "piping_class": "pipe_class", "pipe_spec": "pipe_class", "piping_spec": "pipe_class", "line_class": "pipe_class",
    "flow_margin": "design_margin",
    "dynamic_viscosity": "viscosity",
}
REQUIRED = ("tag", "fluid", "flow", "pressure", "temperature")
#: Key under which a reader keeps a row's non-empty cells that no header names. Such a row is
#: refused: a decimal comma or an unquoted separator shifts every cell after it into the wrong column.
BEYOND_HEADER = "(beyond the header)"
#: Key under which the CSV reader marks a row that opens a quote its line does not close (an unbalanced quote);
#: its value is the text from the opening quote to the end of its line. The rows after it are read on their own, never swallowed into its cell.
UNBALANCED_QUOTE = "(unbalanced quote)"
#: Key under which a reader marks a row holding a cell it could not read as text (a TOML table where a value
#: is expected, a CSV cell over the csv module's field limit): the row is that error, the other rows are read.
#: Its value is :func:`not_read`'s JSON of the error's field, value, expectation and message.
NOT_READ = "(not read)"
#: Key under which :func:`boresize.io.line_items.group_rows` marks a row whose tag an earlier line already has
#: (same tag, no case or a different line); its value names that earlier row.
DUPLICATE_TAG = "(tag given before)"
DEFAULT_LENGTH_M = 100.0
#: Units an NPS header may name: the NPS is a size in inches, so ``NPS (mm)`` is refused, never read as inches.
_NPS_UNITS = frozenset({"in", "inch", "inches", '"'})
#: Headings of a DN column (ISO 6708): they feed ``nps`` with this unit, so a bare ``100`` is read as DN 100.
_DN_HEADINGS = frozenset({"dn", "nominal_diameter"})
DN_UNIT = "DN"
_HEADER = re.compile(r"^\s*([^\[\]]*?)\s*(?:\[(.*)\])?\s*$")
#: A unit in parentheses closing a header (``Length (m)``, ``Design Margin (%)``): read as in brackets.
_PAREN_UNIT = re.compile(r"^\s*([^\[\]()]*?)\s*\(([^()]*)\)\s*$")


def not_read(error: InputError) -> dict[str, str]:
    """The cell a reader adds to a row it could not read (see :data:`NOT_READ`)."""
    value = "" if error.value is None else str(error.value)
    return {NOT_READ: json.dumps([error.field or "row", value, error.expected or "", error.message])}


def _not_read(text: str) -> InputError:
    field, value, expected, message = json.loads(text)
    return InputError(message, field=field, value=value, expected=expected or None)


@dataclass(frozen=True)
class Header:
    """A column: the field it feeds (lower case, spaces and dashes as ``_``) and its default unit."""

    field: str
    unit: str | None
    text: str


def parse_header(text: str) -> Header:
    """``"Flow [t/h]"`` -> Header("flow", "t/h"); ``"Length (m)"`` -> Header("length", "m");
    ``"Pipe Class"`` -> Header("pipe_class", None); a heading of :data:`ALIASES` feeds its column
    (``"Pipe Length [m]"`` -> Header("length", "m"))."""
    match = _PAREN_UNIT.match(text or "") or _HEADER.match(text or "")
    name = (match.group(1) if match else text).strip().lower()
    name = re.sub(r"[\s\-]+", "_", name)
    unit = match.group(2).strip() if match and match.group(2) else None
    if name in _DN_HEADINGS:  # a DN column feeds nps; its bare numbers are DN ("DN (mm)" is read the same way)
        return Header(field="nps", unit=DN_UNIT if unit in (None, "mm") else f"{DN_UNIT} {unit}", text=text)
    return Header(field=ALIASES.get(name, name), unit=unit or None, text=text)


def _text(row: Mapping[str, object], name: str) -> str | None:
    value = row.get(name)
    if value is None:
        return None
    if isinstance(value, float) and math.isnan(value):
        return None
    text = str(value).strip()
    return text or None


def _cells(row: Mapping[str, object]) -> dict[str, str]:
    """Every non-empty cell of ``row`` as stripped text (what :func:`_text` gives), read once per row."""
    return {name: text for name in row if (text := _text(row, name)) is not None}


def _positive(value: float, field: str, raw: object, expected: str) -> float:
    if not value > 0:
        raise InputError(f"{raw!r} is not above zero", field=field, value=raw, expected=expected)
    return value


def _flow(raw: str, unit: str | None) -> Flow:
    flow = parse_flow(raw, "flow", unit)
    _positive(flow.value, "flow", raw, "a flow above zero, e.g. '65 t/h'")
    return flow


def _optional_quantity(cells: Mapping[str, str], units: Mapping[str, str | None], name: str,
                       kind: QuantityKind, expected: str) -> float | None:
    raw = cells.get(name)
    if raw is None:
        return None
    value = parse_quantity(raw, name, kind, units.get(name))
    return _positive(value, name, raw, expected)


_PREFIX = re.compile(r"^\s*(?P<prefix>[A-Za-z0-9&]+)\s*::\s*(?P<rest>.*?)\s*$")
_TABULAR = frozenset({"BICUBIC&HEOS", "TTSE&HEOS"})


def _coolprop_prefix(fluid: str, backend: str | None) -> tuple[str, str | None]:
    """A fluid with CoolProp's ``HEOS::`` prefix is the fluid after it on the coolprop backend (coolprop-mixture for
    a mixture); ``INCOMP::`` is read by that backend itself. Other prefixes are refused, each saying why."""
    match = _PREFIX.match(fluid)
    if match is None:
        return fluid, backend
    prefix, rest = match["prefix"].upper(), match["rest"]
    if prefix == "INCOMP":
        return fluid, backend
    if prefix == "REFPROP":
        raise InputError(f"{fluid!r}: REFPROP is not installed; boresize computes with CoolProp's own equations "
                         "(HEOS), not NIST REFPROP", field="fluid", value=fluid,
                         expected=f"the fluid without the prefix ('{rest}') or with CoolProp's 'HEOS::{rest}'")
    if prefix in _TABULAR:
        raise InputError(f"{fluid!r}: {match['prefix']} interpolates tables CoolProp builds from HEOS on first use; "
                         "boresize computes HEOS directly", field="fluid", value=fluid,
                         expected=f"'HEOS::{rest}' or '{rest}'")
    if prefix != "HEOS":
        raise InputError(f"{fluid!r}: unknown CoolProp backend prefix {match['prefix']!r}", field="fluid", value=fluid,
                         expected=f"'HEOS::{rest}' (or '{rest}'), or INCOMP:: for an incompressible liquid")
    if not rest:
        raise InputError(f"{fluid!r}: no fluid after 'HEOS::'", field="fluid", value=fluid, expected="e.g. 'HEOS::Water'")
    from boresize.properties.base import is_mixture  # no CoolProp import: a text test

    wanted = "coolprop-mixture" if is_mixture(rest) else "coolprop"
    if backend is not None and backend.lower() != wanted:
        raise InputError(f"'HEOS::' names CoolProp's {wanted} backend, but the backend column says {backend!r}",
                         field="backend", value=backend, expected=f"{wanted}, or no backend (or no 'HEOS::' prefix)")
    return rest, wanted


def _choice(cells: Mapping[str, str], name: str, allowed: tuple[str, ...]) -> str | None:
    raw = cells.get(name)
    if raw is None:
        return None
    if raw.lower() not in allowed:
        raise InputError(f"unknown {name} {raw!r}", field=name, value=raw, expected=f"one of {', '.join(allowed)}")
    return raw.lower()


def _two_phase_method(raw: str | None) -> str | None:
    """The line's two-phase correlation, as the fluids library names it (case ignored)."""
    if raw is None:
        return None
    from boresize.hydraulics.two_phase_names import library_methods, two_phase_method_name

    name = two_phase_method_name(raw)
    if name is None:
        raise InputError(f"unknown two-phase method {raw!r}", field="two_phase_method", value=raw,
                         expected=f"homogeneous or a correlation of the fluids library: {', '.join(library_methods())}")
    return name


def line_from_row(row: Mapping[str, object], units: Mapping[str, str | None] | None = None,
                  position: int | None = None, bare_pressure: BarePressure = "absolute",
                  absolute: Collection[str] = ()) -> Line:
    """Validate one row (field name -> cell) into a Line.

    :param units: default unit per field, from the header brackets
    :param position: 1-based row number, used to name a line that has no tag
    :param bare_pressure: how a pressure in a bare unit (``9 psi``) is read: absolute, gauge, or an error; each
        such field is named in the line's ``bare_pressures`` notes
    :param absolute: fields given as a bare number whose default unit in ``units`` is stated absolute
        (``make_line(si=True)``: Pa abs), never a bare pressure
    :raises InputError: naming the line, the field, the value and what was expected
    """
    units = units or {}
    cells = _cells(row)
    tag = cells.get("tag") or (f"row {position}" if position is not None else "(untagged)")
    try:
        if NOT_READ in cells:
            raise _not_read(cells[NOT_READ])
        if UNBALANCED_QUOTE in cells:
            quoted = cells[UNBALANCED_QUOTE]
            raise InputError(f"the quote opened in {quoted!r} does not close on its line, so its cells "
                             "are not read (the rows after it are read as written)", field="row", value=quoted,
                             expected="a closing quote in the same cell (\"1,5\"), or no quote at the start of "
                             "a cell; a quote inside a quoted cell is written twice (\"\")")
        if BEYOND_HEADER in cells:
            raise InputError(f"cells {row[BEYOND_HEADER]} lie outside the header's columns", field="row",
                             value=row[BEYOND_HEADER], expected="one cell per column; quote a cell that holds the "
                             "separator (a decimal comma such as 1,5 splits a cell in two)")
        if DUPLICATE_TAG in cells:
            raise InputError(f"tag {tag!r} is already the tag of the line in {row[DUPLICATE_TAG]}", field="tag",
                             value=tag, expected="each tag once; rows of one line's operating cases each name "
                             "their case in the case column")
        quality = _quality(cells)
        for name in REQUIRED:
            if name not in cells and (name != "temperature" or quality is None):
                raise InputError("missing value", field=name, value="", expected=_EXPECTED[name])
        length = _optional_quantity(cells, units, "length", "length", "a length above zero, e.g. '120 m'")
        margin_raw = cells.get("design_margin")
        margin = parse_quantity(margin_raw, "design_margin", "dimensionless",
                                units.get("design_margin")) if margin_raw else None
        if margin is not None and not 0 <= margin < 1:
            raise InputError(f"{margin_raw!r} is outside 0 to 100 %", field="design_margin", value=margin_raw,
                             expected="a fraction of the flow such as '10 %' or 0.1")
        nps_raw, schedule = cells.get("nps"), cells.get("schedule")
        nps_unit = units.get("nps")
        if nps_raw and nps_unit is not None and nps_unit.startswith(DN_UNIT):
            if nps_unit != DN_UNIT:
                raise InputError(f"a DN has no unit but mm, not {nps_unit[len(DN_UNIT):].strip()!r}", field="nps",
                                 value=f"{nps_raw} [{nps_unit}]", expected="a heading 'DN' or 'DN (mm)', e.g. '100'")
            if re.fullmatch(r"\d+(?:\.0*)?", nps_raw):
                nps_raw = f"DN {nps_raw}"
        elif nps_raw and nps_unit is not None and nps_unit.lower() not in _NPS_UNITS:
            raise InputError(f"an NPS is in inches, not {nps_unit!r}", field="nps", value=f"{nps_raw} [{nps_unit}]",
                             expected="the nominal pipe size in inches (a header 'NPS' or 'NPS (in)'), e.g. '6'")
        notes: list[BareReading] = []  # pressures in a bare unit (read in the order of the messages before)
        bare: list[BareReading] = []
        optional = _optional_fields(cells, units, (bare_pressure, absolute), notes)
        fluid, backend = _coolprop_prefix(cells["fluid"], cells.get("backend"))
        flow = _flow(cells["flow"], units.get("flow"))
        pressure = _pressure(cells["pressure"], "pressure", units, (bare_pressure, absolute), bare)
        line = Line(
            tag=tag,
            fluid=fluid,
            flow=flow,
            pressure=pressure,
            temperature=_temperature(cells, units, quality),
            length=length if length is not None else DEFAULT_LENGTH_M,
            service=cells.get("service"),
            pipe_class=cells.get("pipe_class"),
            nps=normalise_nps(nps_raw) if nps_raw else None,
            density=_optional_quantity(cells, units, "density", "density", "a density above zero, e.g. '850 kg/m3'"),
            viscosity=_optional_quantity(cells, units, "viscosity", "viscosity", "a viscosity above zero, e.g. '1.2 cP'"),
            design_margin=margin,
            phase=_choice(cells, "phase", ("liquid", "gas", "two-phase")),  # type: ignore[arg-type]
            backend=backend,
            eos=cells.get("eos"),
            fittings=parse_fittings(cells.get("fittings")),
            fittings_method=_fittings_method(cells.get("fittings_method")),
            compressible=_choice(cells, "compressible", ("isothermal", "adiabatic")),
            case=cells.get("case"),
            schedule=normalise_schedule(schedule, "schedule") if schedule else None,
            **optional,
            extra=tuple((k, str(v)) for k, v in row.items() if k not in _COLUMN_SET and v not in (None, "")),
            quality=quality,
            bare_pressures=(*bare, *notes),
            two_phase_method=_two_phase_method(cells.get("two_phase_method")),
        )
        if quality is None:
            return line
        from boresize.properties.saturated_line import saturated_line  # lazy: the properties load CoolProp

        return saturated_line(line)
    except InputError as exc:
        raise exc.for_line(tag) from None


def _quality(cells: Mapping[str, str]) -> float | None:
    """The vapour mass fraction of a saturated line (a plain number or a percent), None when not given."""
    raw = cells.get("quality")
    return None if raw is None else parse_quantity(raw, "quality", "dimensionless")


def _temperature(cells: Mapping[str, str], units: Mapping[str, str | None], quality: float | None) -> float:
    """The temperature [K]; NaN for a line with a quality whose temperature is blank or ``saturated`` (the
    saturation temperature replaces it)."""
    raw = cells.get("temperature")
    if raw is not None and raw.lower() == "saturated" and quality is None:
        raise InputError("temperature 'saturated' needs a quality", field="temperature", value=raw,
                         expected="a quality (1 saturated vapour, 0 saturated liquid), or a temperature with its unit")
    if raw is None or raw.lower() == "saturated":
        return math.nan
    return parse_quantity(raw, "temperature", "temperature", units.get("temperature"))


def _pressure(raw: str, name: str, units: Mapping[str, str | None], bare: tuple[BarePressure, Collection[str]],
              notes: list[BareReading]) -> float:
    """A pressure field [Pa abs]; a bare unit's reading added to ``notes`` (none for a field of ``absolute``,
    whose number has no unit of its own and whose default unit is stated absolute)."""
    mode, absolute = bare
    value, note = parse_pressure(raw, name, units.get(name), "absolute" if name in absolute else mode)
    if note is not None and name not in absolute:
        notes.append(note)
    return value


def _optional_fields(cells: Mapping[str, str], units: Mapping[str, str | None],
                     bare: tuple[BarePressure, Collection[str]],
                     notes: list[BareReading]) -> dict[str, float]:
    values: dict[str, float] = {}
    for name, (kind, positive, example) in OPTIONAL_QUANTITIES.items():
        raw = cells.get(name)
        if raw is None:
            continue
        value = _pressure(raw, name, units, bare, notes) if kind == "pressure" else \
            parse_quantity(raw, name, kind, units.get(name))
        values[name] = _positive(value, name, raw, example) if positive else value
    return values


def _fittings_method(raw: str | None) -> str | None:
    """The fittings method id ("darby-3k", "hooper-2k", "crane"), None when the cell is empty."""
    if not raw:
        return None
    from boresize.hydraulics.fittings import normalise_method  # lazy: the hydraulics package loads scipy

    return normalise_method(raw)


def parse_fittings(text: str | None) -> tuple[tuple[str, float], ...]:
    """``"elbow-90-lr: 4; gate: 2"`` (``;`` or ``|`` between items) -> (("elbow-90-lr", 4.0), ("gate", 2.0)).

    A kind without a count counts once. The kinds are checked by the fittings method, not here.
    Explicit items ``K=2.5``, ``Leq=12 m``, ``L/D=340``, ``Kv=500``, ``Cv=580`` keep their ``=`` (see
    :mod:`boresize.hydraulics.fittings`).
    """
    if not text:
        return ()
    pairs = []
    for item in re.split(r"[;|]", text):
        item = item.strip()
        if not item:
            continue
        explicit = re.match(r"(?i)\s*(k|leq|l/d|kv|cv)\s*=", item)  # "K=2.5", "Leq=12 m": no count after "="
        kind, _, count = item.partition(":") if ":" in item or explicit else item.partition("=")
        try:
            number = float(count) if count.strip() else 1.0
        except ValueError:
            raise InputError(f"count {count.strip()!r} of {kind.strip()!r} is not a number", field="fittings",
                             value=text, expected="items such as 'elbow-90-lr: 4; gate: 2'") from None
        if not (number > 0 and math.isfinite(number)):
            raise InputError(f"count of {kind.strip()!r} must be above zero", field="fittings", value=text,
                             expected="items such as 'elbow-90-lr: 4; gate: 2'")
        pairs.append((kind.strip().lower(), number))
    return tuple(pairs)


_EXPECTED = {
    "tag": "a line tag such as '6\"-P-1001'",
    "fluid": "a fluid name (water, methane), CoolProp name or CAS number",
    "flow": "a flow with its unit, e.g. '65 t/h', '120 m3/h' or '2 MMSCFD'",
    "pressure": "an inlet pressure with its unit, e.g. '10 barg' or '1100 kPa' (bare bar/kPa are absolute)",
    "temperature": "a temperature with its unit, e.g. '40 degC', or a quality with the temperature blank",
}
