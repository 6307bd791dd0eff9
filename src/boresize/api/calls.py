"""The Python API: build lines from quantities or text, then size or check them, one or many at a time.

What simulation scripts and notebooks call (the CLI is a thin layer over the same engine)::

    line = make_line(tag="P-1", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC")
    result = size(line)              # a SizingResult: result.nps, result.velocity (pint), result.velocity_m_s
    results = size_many(lines)       # input order; worker processes by default from PROCESS_THRESHOLD lines

Values are text with a unit ("65 t/h"), pint Quantities from any registry (read by magnitude and unit
name, so registries never mix), or bare numbers with their unit stated (``units={"flow": "t/h"}``, or
``si=True`` for SI: kg/s, Pa absolute, K, m, kg/m3, Pa s). A bare number without a unit is an error.
Every fault is an exception of :mod:`boresize.errors` naming the field and the value; a line that cannot
be sized in a batch becomes a result with status ``error`` and the batch goes on.
"""

from __future__ import annotations

import numbers
import os
from collections.abc import Iterable, Mapping, Sequence
from concurrent.futures import Executor
from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING, Union

from boresize.api.result import SizingResult
from boresize.io.values import number_text, quantity_text
from boresize.sizing.batch import ExecutorLike, SizerSpec, is_executor, run_items, shared_sizer, size_item, spec_for
from boresize.errors import InputError, UnitError
from boresize.io.line_items import LineItem, RowFault
from boresize.model import Line
from boresize.units import BarePressure, bare_pressure_mode, reread

if TYPE_CHECKING:
    import pint

    from boresize.sizing.engine import Sizer

__all__ = ["PROCESS_THRESHOLD", "SI_UNITS", "check", "default_sizer", "make_line", "quantity_text",
           "size", "size_many"]

#: Lines from which :func:`size_many` starts worker processes when given no executor nor ``workers``.
PROCESS_THRESHOLD = 200
#: Unit of a bare number per field with ``si=True`` (pressures absolute; a bare flow is a mass flow).
SI_UNITS: dict[str, str] = {
    "flow": "kg/s", "pressure": "Pa", "temperature": "K", "length": "m", "density": "kg/m3", "viscosity": "Pa*s",
    "elevation": "m", "fixed_drop": "Pa", "min_outlet_pressure": "Pa", "source_pressure": "Pa",
    "liquid_level": "m", "npsh_required": "m", "roughness": "m", "vapour_pressure": "Pa",
}
Value = Union[str, float, int, "pint.Quantity[float]", None]
Item = Union[Line, Sequence[Line]]



# -- building a line ---------------------------------------------------------------------------
def make_line(tag: str, fluid: str | Mapping[str, float], flow: Value, pressure: Value, temperature: Value, *,
              units: Mapping[str, str] | None = None, si: bool = False, length: Value = None,
              service: str | None = None, pipe_class: str | None = None, nps: str | float | None = None,
              schedule: str | int | None = None, density: Value = None, viscosity: Value = None,
              design_margin: Value = None, phase: str | None = None, backend: str | None = None,
              eos: str | None = None, elevation: Value = None, fittings: str | Mapping[str, float] | None = None,
              fixed_drop: Value = None, min_outlet_pressure: Value = None, source_pressure: Value = None,
              liquid_level: Value = None, npsh_required: Value = None, roughness: Value = None,
              case: str | None = None, fittings_method: str | None = None, compressible: str | None = None,
              extra: Mapping[str, str] | None = None, quality: Value = None,
              vapour_pressure: Value = None, two_phase_method: str | None = None,
              bare_pressure: BarePressure = "absolute") -> Line:
    """A validated :class:`~boresize.model.Line` (SI inside) from text, pint Quantities or numbers.

    The fields are the line-list columns of the README (``fluid`` may also be a mapping component ->
    mole fraction; ``fittings`` a mapping kind -> count). Pressures without a ``g`` are absolute.

    :param units: the unit of a bare number per field, as a header's brackets give it (``{"flow": "t/h"}``)
    :param si: bare numbers without a unit in ``units`` are in the field's SI unit (:data:`SI_UNITS`)
    :param extra: further columns kept with the line (e.g. ``{"composition_basis": "mass"}``)
    :param bare_pressure: how a pressure in a bare unit (``9 psi``, neither g nor a) is read: ``absolute`` (as
        documented), ``gauge`` (101325 Pa added) or ``error``; the line's ``bare_pressures`` name each one
    :param quality: vapour mass fraction of a saturated pure fluid (1 or ``"100 %"`` saturated vapour, 0
        saturated liquid); ``temperature`` is then None or ``"saturated"`` (or the saturation temperature)
    :raises InputError: (UnitError for units) naming the line, the field, the value and what was expected
    """
    given = dict(locals())
    mode = bare_pressure_mode(bare_pressure)
    _check_units_keys(units or {}, tag)
    row: dict[str, object] = {}
    cell_units: dict[str, str | None] = {}
    absolute = {name for name, value in given.items() if si and name in SI_UNITS and SI_UNITS[name] == "Pa"
                and isinstance(value, numbers.Real) and not (units or {}).get(name)}
    for name, value in given.items():
        if name in ("units", "si", "extra", "bare_pressure") or value is None:
            continue
        row[name], cell_units[name] = _cell(name, value, units or {}, si, tag)
    for key, value in (extra or {}).items():
        row[str(key)] = str(value)
    from boresize.io.rows import line_from_row

    return line_from_row(row, cell_units, bare_pressure=mode, absolute=absolute)


def _cell(name: str, value: object, units: Mapping[str, str], si: bool, tag: str) -> tuple[object, str | None]:
    """The line-list cell of one value, and the unit of a bare number (None when the cell carries it)."""
    if name == "fluid" and not isinstance(value, str):
        from boresize.properties.composition import composition_text

        return composition_text(value), None
    if name == "fittings" and isinstance(value, Mapping):
        return "; ".join(f"{kind}: {number_text(count, name, tag)}" for kind, count in value.items()), None
    if hasattr(value, "magnitude") and hasattr(value, "units"):
        return quantity_text(value, name, tag), None
    if isinstance(value, bool) or not isinstance(value, (str, numbers.Real)):
        raise InputError(f"a {type(value).__name__} is not a value boresize reads", field=name, value=value,
                         expected="text such as '65 t/h', a pint Quantity, or a number with its unit stated",
                         tag=str(tag))
    if isinstance(value, str):
        return value, units.get(name)
    unit = units.get(name) or (SI_UNITS.get(name) if si else None)
    if name in SI_UNITS and unit is None:
        raise UnitError(f"bare number {value!r} has no unit", field=name, value=value, tag=str(tag),
                        expected=f"text with its unit, a pint Quantity, units={{'{name}': ...}}, or si=True "
                        f"for {SI_UNITS[name]}")
    return number_text(value, name, tag), unit


def _check_units_keys(units: Mapping[str, str], tag: str) -> None:
    unknown = sorted(set(units) - set(SI_UNITS))
    if unknown:
        raise InputError(f"units given for {', '.join(map(repr, unknown))}, which take no unit", field="units",
                         value=dict(units), expected=f"units for {', '.join(SI_UNITS)}", tag=str(tag))


# -- one line ----------------------------------------------------------------------------------
def size(line: Item, *, criteria: str | Path | None = None, plugins: bool = True,
         sizer: Sizer | None = None, bare_pressure: BarePressure | None = None) -> SizingResult:
    """Size a line (or check the NPS it gives); a list of Lines with one tag is one line's operating cases.

    A fault on the line (an unknown fluid, a fluid in the wrong phase) is a result with status
    ``error``; :meth:`SizingResult.raise_for_error` turns it into an exception.

    :param criteria: a criteria TOML file (the shipped sets when None)
    :param plugins: False to use only boresize's built-in plugins (no entry points)
    :param sizer: an engine to use instead of one built from ``criteria`` and ``plugins``
    :param bare_pressure: the line's pressures given in a bare unit (``9 psi``) read again as ``absolute``,
        ``gauge`` or refused (``error``: a result with status ``error``); None keeps them as the line was made
    :raises InputError: (field "line") something that is not a Line or a list of one line's cases
    """
    if sizer is not None and criteria is not None:
        raise InputError("both a sizer and a criteria file given", field="criteria", value=str(criteria),
                         expected="one of them: a Sizer already holds its criteria")
    item = reread_item(checked_item(line, 1), bare_pressure)
    engine = sizer or default_sizer(spec_for(criteria, plugins, None))
    return SizingResult.of(size_item(engine, item))


def check(line: Item, nps: str | float | None = None, *, schedule: str | int | None = None,
          criteria: str | Path | None = None, plugins: bool = True, sizer: Sizer | None = None,
          bare_pressure: BarePressure | None = None) -> SizingResult:
    """Check the line at ``nps`` (in ``schedule``, else the pipe class's), or at the NPS the line gives;
    ``bare_pressure`` as in :func:`size`.

    :raises InputError: an unknown NPS or schedule, or no NPS at all (field "nps")
    """
    from boresize.pipes import normalise_nps, normalise_schedule

    item = checked_item(line, 1)
    lines = [item] if isinstance(item, Line) else list(item)
    given = normalise_nps(nps) if nps is not None else lines[0].nps
    if given is None:
        raise InputError("no NPS to check", field="nps", value=None, tag=lines[0].tag,
                         expected="nps= or a line that gives its NPS (size() sizes a line)")
    wall = normalise_schedule(schedule) if schedule is not None else None
    lines = [replace(one, nps=given, schedule=wall or one.schedule) for one in lines]
    return size(lines[0] if isinstance(item, Line) else lines, criteria=criteria, plugins=plugins, sizer=sizer,
                bare_pressure=bare_pressure)


def default_sizer(spec: SizerSpec) -> Sizer:
    """The sizer of this process for ``spec`` (built once: loading plugins and criteria costs time)."""
    return shared_sizer(spec)


def reread_item(item: Item, bare_pressure: BarePressure | None) -> LineItem:
    """``item`` with its pressures in a bare unit read as ``bare_pressure`` says (None: as made); a line refused
    (``error`` mode, or at or below zero absolute) becomes a row fault, sized as a result with status ``error``."""
    if bare_pressure is None:
        return item if isinstance(item, Line) else tuple(item)
    mode = bare_pressure_mode(bare_pressure)
    cases = [item] if isinstance(item, Line) else list(item)
    read: list[Line | RowFault] = []
    for case in cases:
        try:
            read.append(reread(case, mode))
        except InputError as exc:
            read.append(RowFault(case.tag, "check" if case.nps else "size", case.case or "", exc))
    return read[0] if isinstance(item, Line) else tuple(read)


def checked_item(value: object, position: int) -> Item:
    """A Line, or a non-empty list of Lines sharing one tag (one line's cases)."""
    if isinstance(value, Line):
        return value
    if isinstance(value, Sequence) and not isinstance(value, str) and value \
            and all(isinstance(v, Line) for v in value):
        tags = {v.tag for v in value}
        if len(tags) == 1:
            return tuple(value)
        raise InputError(f"the cases of item {position} have different tags: {', '.join(sorted(tags))}",
                         field="line", value=sorted(tags), expected="one tag for every case of a line")
    raise InputError(f"item {position} is a {type(value).__name__}, not a Line", field="line",
                     value=repr(value)[:80], expected="a Line from make_line() or line_from_stream(), or a "
                     "list of one line's cases")


# -- many lines --------------------------------------------------------------------------------
def size_many(lines: Iterable[Item], executor: Executor | ExecutorLike | None = None, *, workers: int | None = None,
              criteria: str | Path | None = None, plugins: bool = True,
              chunk_size: int | None = None, bare_pressure: BarePressure | None = None) -> list[SizingResult]:
    """Size (or check) many lines; one result per item, in input order.

    :param lines: Lines, or lists of one line's operating cases
    :param executor: any object with ``submit`` and ``map`` (a thread or process pool, a dask ``Client`` or its
        ``get_executor()``); it is not shut down here. Workers build their own sizer from ``criteria`` (sent
        by content: the workers need no copy of the file) and ``plugins``; chunks follow the executor's worker
        count where it says it (a dask client: the cluster's threads).
    :param workers: worker processes to size on when no executor is given (1: this process alone); default:
        one per CPU from :data:`PROCESS_THRESHOLD` lines, else 1
    :param chunk_size: lines per task (default: about eight tasks per worker, 1 to 64 lines each)
    :param bare_pressure: as in :func:`size`, per line (a line refused is a result with status ``error``)
    :raises InputError: an item that is not a line, an executor that is not one, workers below 1
    """
    items = [reread_item(checked_item(value, i), bare_pressure) for i, value in enumerate(lines, start=1)]
    spec = spec_for(criteria, plugins, None)
    if executor is not None and not is_executor(executor):
        raise InputError(f"a {type(executor).__name__} is not an executor", field="executor",
                         value=repr(executor)[:80], expected="an object with submit() and map() (a "
                         "concurrent.futures executor, a dask Client) or None")
    if workers is not None and (isinstance(workers, bool) or not isinstance(workers, int) or workers < 1):
        raise InputError(f"workers {workers!r} is not a whole number of 1 or more", field="workers", value=workers,
                         expected="1 or more worker processes, or None")
    count = workers or ((os.cpu_count() or 1) if len(items) >= PROCESS_THRESHOLD else 1)
    results = run_items(items, spec, sizer=default_sizer(spec), executor=executor, workers=count,
                        chunk_size=chunk_size, progress=False, retry_hint="workers=1")
    return [SizingResult.of(r) for r in results]
