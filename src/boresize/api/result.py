"""The result the Python API returns: a :class:`~boresize.model.LineResult` with readable accessors.

:class:`SizingResult` is a LineResult (every field, every writer and the engine work with it as
they do with the base class) that adds, for the selected size (the closest one when none passes):

* plain floats named as in the JSON contract: ``velocity_m_s``, ``dp_kpa_per_100m``,
  ``inside_diameter_mm``, ``density_kg_m3``, ``viscosity_mpa_s``, ``total_drop_kpa`` ...
* the same values as pint Quantities of pint's application registry (``pint.get_application_registry()``, the one
  ``pint.set_application_registry`` set; boresize adds the units it lacks, :func:`boresize.units.quantities.application_registry`):
  ``velocity``, ``drop_per_length``, ``inside_diameter``, ``density``, ``viscosity`` ... They add to your own
  quantities of that registry; for another registry pass the magnitude and unit name
  (``other.Quantity(q.magnitude, str(q.units))``);
* ``to_dict()`` (the JSON entry of :func:`boresize.io.document.result_to_dict`), a short ``repr`` and
  ``_repr_html_`` for notebooks, and ``raise_for_error()``.

Accessors are None only for a result with status ``error`` (no size was rated). A result that rated a
size (``pass`` or ``fail``) is a :class:`RatedResult`, the same object typed without those Nones:
``size(line).raise_for_error()`` returns it (or raises), and ``isinstance(result, RatedResult)`` narrows a
result for a type checker::

    rated = size(line).raise_for_error()
    rated.velocity_m_s * 2          # a float, not float | None
"""

from __future__ import annotations

import html
import math
from collections.abc import Callable
from dataclasses import dataclass, fields
from typing import TYPE_CHECKING, Any, TypeVar, overload

from boresize.errors import BoresizeError, InputError
from boresize.model import CandidateResult, FluidState, Hydraulics, Line, LineResult

if TYPE_CHECKING:
    import pint

__all__ = ["RatedResult", "SizingResult"]

_R = TypeVar("_R", bound="SizingResult")


def _hyd(result: LineResult) -> Hydraulics | None:
    return result.selected.hydraulics if result.selected else None


class _Float:
    """A plain float of the selected size, in the unit its name says; None for an error result."""

    def __init__(self, read: Callable[[LineResult], float | None], doc: str) -> None:
        self._read = read
        self.__doc__ = doc

    @overload
    def __get__(self, obj: None, owner: type | None = None) -> _Float: ...
    @overload
    def __get__(self, obj: LineResult, owner: type | None = None) -> float | None: ...

    def __get__(self, obj: LineResult | None, owner: type | None = None) -> float | None | _Float:
        return self if obj is None else self._read(obj)


class _Quantity:
    """The same value as a pint Quantity of the application registry; None for an error result."""

    def __init__(self, number: str, unit: str, doc: str) -> None:
        self._number, self._unit = number, unit
        self.__doc__ = doc

    @overload
    def __get__(self, obj: None, owner: type | None = None) -> _Quantity: ...
    @overload
    def __get__(self, obj: LineResult, owner: type | None = None) -> pint.Quantity[float] | None: ...

    def __get__(self, obj: LineResult | None, owner: type | None = None) -> pint.Quantity[float] | None | _Quantity:
        if obj is None:
            return self
        value = getattr(obj, self._number)
        if value is None:
            return None
        from boresize.units.quantities import application_registry

        ureg = application_registry()
        if self._unit == "kPa_per_100m" and not math.isclose(ureg.Quantity(1.0, self._unit).to("Pa/m").magnitude, 10.0):
            return ureg.Quantity(value, "kPa/hm")  # the caller's own kPa_per_100m means something else: theirs stays
        return ureg.Quantity(value, self._unit)


def _sel(read: Callable[[CandidateResult], float | None]) -> Callable[[LineResult], float | None]:
    return lambda r: read(r.selected) if r.selected else None


def _h(read: Callable[[Hydraulics], float | None]) -> Callable[[LineResult], float | None]:
    return lambda r: read(h) if (h := _hyd(r)) is not None else None


@dataclass(frozen=True, repr=False)
class SizingResult(LineResult):
    """One line's result (see the module docstring); build it with :meth:`of` from a LineResult."""

    inside_diameter_mm = _Float(_sel(lambda c: c.candidate.inside_diameter * 1e3), "inside diameter [mm]")
    velocity_m_s = _Float(_h(lambda h: h.velocity), "mean velocity at the sizing flow [m/s]")
    dp_kpa_per_100m = _Float(_h(lambda h: h.drop_per_length / 10.0), "frictional drop per length [kPa/100 m]")
    total_drop_kpa = _Float(_h(lambda h: h.total_drop / 1e3), "friction, fittings, static and fixed drop [kPa]")
    outlet_pressure_bar_abs = _Float(_h(lambda h: None if h.outlet_pressure is None else h.outlet_pressure / 1e5),
                                     "pressure at the line end [bar abs]")
    sizing_mass_flow_kg_h = _Float(_h(lambda h: h.mass_flow * 3600.0), "mass flow with the design margin [kg/h]")
    reynolds = _Float(_h(lambda h: h.reynolds), "Reynolds number [-]")
    density_kg_m3 = _Float(lambda r: r.state.density if r.state else None, "density at the inlet [kg/m3]")
    viscosity_mpa_s = _Float(lambda r: r.state.viscosity * 1e3 if r.state else None,
                             "dynamic viscosity at the inlet [mPa s]")
    utilisation = _Float(_sel(lambda c: c.worst.utilisation if c.worst else None),
                         "the highest value over its limit of any criterion at the size [-] (1 is the limit; "
                         "the controlling criterion is the one that fails on the next smaller size)")

    inside_diameter = _Quantity("inside_diameter_mm", "mm", "inside diameter (Quantity)")
    velocity = _Quantity("velocity_m_s", "m/s", "mean velocity (Quantity)")
    drop_per_length = _Quantity("dp_kpa_per_100m", "kPa_per_100m", "frictional drop per length (Quantity)")
    total_drop = _Quantity("total_drop_kpa", "kPa", "total drop (Quantity)")
    outlet_pressure = _Quantity("outlet_pressure_bar_abs", "bar", "pressure at the line end, absolute (Quantity)")
    sizing_mass_flow = _Quantity("sizing_mass_flow_kg_h", "kg/h", "sizing mass flow (Quantity)")
    density = _Quantity("density_kg_m3", "kg/m**3", "density (Quantity)")
    viscosity = _Quantity("viscosity_mpa_s", "mPa*s", "dynamic viscosity (Quantity)")

    @staticmethod
    def of(result: LineResult) -> SizingResult:
        """The SizingResult of an engine result (its cases too); a SizingResult is returned as it is.

        A result that rated a size (status ``pass`` or ``fail``) comes back as a :class:`RatedResult`.
        """
        if isinstance(result, SizingResult):
            return result
        kind = SizingResult if result.status == "error" else RatedResult
        return _copy(kind, result)

    @property
    def nps(self) -> str | None:
        """Nominal pipe size of the selected (or closest) candidate, as the trade writes it ("1-1/2")."""
        return self.selected.candidate.nps if self.selected else None

    @property
    def schedule(self) -> str | None:
        """Schedule of the selected (or closest) candidate ("40", "10S")."""
        return self.selected.candidate.schedule if self.selected else None

    @property
    def passed(self) -> bool:
        """True when the line passed every criterion (in every case)."""
        return self.status == "pass"

    def to_dict(self) -> dict[str, Any]:
        """The line's entry of the JSON document (same as :func:`boresize.io.document.result_to_dict`)."""
        from boresize.io.document import result_to_dict

        return result_to_dict(self)

    def raise_for_error(self) -> RatedResult:
        """Return this result as a :class:`RatedResult`, or raise for a result with status ``error``.

        The RatedResult is the same result (``self`` for those :func:`boresize.size` returns) with
        ``selected``, ``state``, ``line``, ``nps``, ``velocity_m_s`` ... typed without None, so a type
        checker accepts ``size(line).raise_for_error().velocity_m_s * 2``. ``status`` may still be ``fail``.

        :raises InputError: when the engine named the field at fault (``field`` and ``value`` set)
        :raises BoresizeError: otherwise (a plugin or property fault without a field)
        """
        if self.status != "error":
            return self if isinstance(self, RatedResult) else _copy(RatedResult, self)
        if self.error_field is None:
            raise BoresizeError(self.error or f"line {self.tag}: error")
        error = InputError(self.error or "error")  # the message already names the line and the field
        error.field, error.tag = self.error_field, self.tag
        error.value = getattr(self.line, self.error_field, None) if self.line is not None else \
            self.raw.get(self.error_field)
        raise error

    def __repr__(self) -> str:
        if self.status == "error":
            return f"<SizingResult {self.tag!r} error: {self.error}>"
        return (f"<SizingResult {self.tag!r} {self.status}: NPS {self.nps} Sch {self.schedule}, "
                f"{self.velocity_m_s:.3g} m/s, {self.dp_kpa_per_100m:.3g} kPa/100 m, controlling {self.controlling}>")

    def _repr_html_(self) -> str:
        """A small table for notebooks; every text is escaped."""
        e = html.escape
        rows = [("status", self.status), ("mode", self.mode), ("service", self.service or "")]
        if self.status == "error":
            rows.append(("error", self.error or ""))
        else:
            rows += [("NPS", f"{self.nps} Sch {self.schedule}"),
                     ("inside diameter", _num(self.inside_diameter_mm, "mm")),
                     ("velocity", _num(self.velocity_m_s, "m/s")),
                     ("drop per length", _num(self.dp_kpa_per_100m, "kPa/100 m")),
                     ("density", _num(self.density_kg_m3, "kg/m3")),
                     ("viscosity", _num(self.viscosity_mpa_s, "mPa s")), ("controlling", self.controlling or "")]
        rows += [("note", note) for note in self.notes]
        body = "".join(f"<tr><th>{e(k)}</th><td>{e(str(v))}</td></tr>" for k, v in rows)
        return (f"<div class='boresize-result'><strong>{e(self.tag)}</strong><table>{body}</table>"
                f"{_verdicts_html(self)}</div>")


class RatedResult(SizingResult):
    """A result that rated a size (status ``pass`` or ``fail``), typed without the Nones of an error result.

    :func:`boresize.size`, :func:`boresize.check` and :func:`boresize.size_many` return one for every line
    that did not end in ``error``; :meth:`SizingResult.raise_for_error` returns it (or raises), and
    ``isinstance(result, RatedResult)`` narrows a :class:`SizingResult`. Fields, accessors, JSON and
    writers are those of SizingResult; only their types differ. ``outlet_pressure``, ``utilisation`` and
    ``controlling`` stay optional: a line can be rated without them (no end pressure computed, no
    criterion with a limit).
    """

    if TYPE_CHECKING:  # what SizingResult's accessors return once a size was rated
        line: Line
        state: FluidState
        selected: CandidateResult
        sizing_flow: float
        inside_diameter_mm: float
        velocity_m_s: float
        dp_kpa_per_100m: float
        total_drop_kpa: float
        sizing_mass_flow_kg_h: float
        reynolds: float
        density_kg_m3: float
        viscosity_mpa_s: float
        inside_diameter: pint.Quantity[float]
        velocity: pint.Quantity[float]
        drop_per_length: pint.Quantity[float]
        total_drop: pint.Quantity[float]
        sizing_mass_flow: pint.Quantity[float]
        density: pint.Quantity[float]
        viscosity: pint.Quantity[float]

    @property
    def nps(self) -> str:
        """Nominal pipe size of the selected (or closest) candidate, as the trade writes it ("1-1/2")."""
        return self.selected.candidate.nps

    @property
    def schedule(self) -> str:
        """Schedule of the selected (or closest) candidate ("40", "10S")."""
        return self.selected.candidate.schedule


def _copy(kind: type[_R], result: LineResult) -> _R:
    """``result`` as a ``kind``: the same field values, its cases converted by :meth:`SizingResult.of`."""
    values = {f.name: getattr(result, f.name) for f in fields(LineResult)}
    values["cases"] = tuple(SizingResult.of(case) for case in result.cases)
    return kind(**values)


def _num(value: float | None, unit: str = "") -> str:
    return "-" if value is None else f"{value:.4g} {unit}".rstrip()


def _verdicts_html(result: LineResult) -> str:
    """The verdicts at the selected size as an escaped table ('' when there are none)."""
    if not result.selected or not result.selected.verdicts:
        return ""
    e = html.escape
    head = "".join(f"<th>{name}</th>" for name in ("criterion", "status", "value", "limit", "unit", "reason"))
    rows = "".join(
        f"<tr><td>{e(v.criterion)}</td><td>{e(v.status)}</td><td>{_num(v.value)}</td>"
        f"<td>{_num(v.limit)}</td><td>{e(v.unit)}</td><td>{e(v.reason)}</td></tr>"
        for v in result.selected.verdicts)
    return f"<table><tr>{head}</tr>{rows}</table>"
