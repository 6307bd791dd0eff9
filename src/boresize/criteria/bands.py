"""Limits banded by NPS and by line pressure, as company standards write them.

In a criteria file any criterion may give ``bands``: a list of tables, each with the criterion's options
for that band and up to two bounds, both inclusive:

- ``up_to_nps``: the band covers candidates up to this NPS (``"2"``, ``"1-1/2"``),
- ``up_to_pressure``: the band covers lines whose inlet pressure is up to this (``"20 barg"``, ``"5 bar"``).

The first band (in file order) whose bounds hold judges the candidate; a band without bounds covers
everything that is left, so it goes last. Options given beside ``bands`` apply to every band::

    velocity = { min = "0.5 m/s", bands = [
        { up_to_nps = "2", max = "1.5 m/s" },
        { up_to_nps = "6", max = "2.5 m/s" },
        { max = "3 m/s" },
    ] }

A candidate that no band covers gets an ``error`` verdict that says which size and pressure were left out.
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, replace
from types import MappingProxyType
from typing import Any

from boresize.criteria.base import CriterionContext, SizeTrend, parse_options
from boresize.errors import CriteriaFileError, InputError
from boresize.model import FluidState, Line, Verdict
from boresize.pipes import normalise_nps, nps_value
from boresize.units import parse_quantity

__all__ = ["BAND_KEYS", "Band", "BandedCriterion", "resolve_criterion"]

BAND_KEYS = ("up_to_nps", "up_to_pressure")


@dataclass(frozen=True)
class Band:
    """One band: the options that apply, and its inclusive upper bounds.

    :param up_to_nps: largest NPS covered, as a number (1.5 for NPS 1-1/2), or None for no bound
    :param up_to_pressure: highest inlet pressure covered [Pa abs], or None for no bound
    """

    options: Mapping[str, float]
    up_to_nps: float | None = None
    up_to_nps_label: str | None = None
    up_to_pressure: float | None = None

    def covers(self, nps: float, pressure: float) -> bool:
        """True when the band holds a candidate of NPS ``nps`` [-] on a line at ``pressure`` [Pa abs]."""
        return ((self.up_to_nps is None or nps <= self.up_to_nps)
                and (self.up_to_pressure is None or pressure <= self.up_to_pressure))

    @property
    def reason(self) -> str:
        """The note a banded verdict's reasons end with: ``(band: <label>)``."""
        return f"(band: {self.label})"

    @property
    def label(self) -> str:
        parts = []
        if self.up_to_nps_label is not None:
            parts.append(f"NPS up to {self.up_to_nps_label}")
        if self.up_to_pressure is not None:
            parts.append(f"inlet pressure up to {self.up_to_pressure / 1e5:.4g} bar abs")
        return ", ".join(parts) or "all other sizes and pressures"


class BandedCriterion:
    """A criterion judged with the options of the band that covers each candidate.

    It carries the wrapped criterion's id, title, phases, source and options, so that the engine, the
    listings and error verdicts see the criterion itself, and its traits (see
    :class:`boresize.criteria.Criterion`): ``size_trend`` as declared (the guided
    scan then checks that the bands keep the trend over the sizes it rates), ``diameter_at_limit`` with the
    options of the band for the largest sizes at the line's pressure. A banded limit depends on the size, so it
    proposes no first guess for the record (``proposes_first_guess`` is False).
    """

    proposes_first_guess = False

    def __init__(self, inner: Any, bands: Sequence[Band], where: str) -> None:
        self.inner = inner
        self.bands = tuple(bands)
        self.where = where
        self.id, self.title, self.phases = inner.id, inner.title, inner.phases
        self.source, self.options = inner.source, inner.options
        self.size_trend: SizeTrend | None = getattr(inner, "size_trend", None)

    def band_for(self, nps: float, pressure: float) -> Band | None:
        """The first band that covers NPS ``nps`` [-] at inlet pressure ``pressure`` [Pa abs], or None."""
        for band in self.bands:
            if band.covers(nps, pressure):
                return band
        return None

    def diameter_at_limit(self, options: Mapping[str, float], line: Line, state: FluidState, mass_flow: float,
                          roughness: float) -> float | None:
        """The wrapped criterion's diameter at its limit, with the options of the band for the largest sizes at
        the line's inlet pressure (``options``, the banded criterion's own, are empty)."""
        band = self.band_for(math.inf, line.pressure)
        at_limit = getattr(self.inner, "diameter_at_limit", None)
        if band is None or at_limit is None:
            return None
        return at_limit(band.options, line, state, mass_flow, roughness)  # type: ignore[no-any-return]

    def evaluate(self, context: CriterionContext) -> Verdict:
        cand, line = context.candidate, context.line
        band = self.band_for(cand.nps_value, line.pressure)
        if band is None:
            return Verdict(criterion=self.id, status="error", source=self.source, reasons=(
                f"no band of {self.where} covers NPS {cand.nps} at {line.pressure / 1e5:.4g} bar abs; "
                f"end the bands with one without bounds",))
        result = self.inner.evaluate(replace(context, options=MappingProxyType(dict(band.options))))
        if not isinstance(result, Verdict):
            return result  # type: ignore[no-any-return]  # the engine reports the wrong type, naming the plugin
        return replace(result, reasons=(*result.reasons, band.reason))

    def __repr__(self) -> str:
        return f"<criterion {self.id} in {len(self.bands)} bands>"


def resolve_criterion(criterion: Any, table: Mapping[str, Any], where: str) -> tuple[Any, Mapping[str, float]]:
    """Parse a criterion's options from the criteria file: plain options, or ``bands`` of them.

    :param table: the criterion's table in the file (option name -> value, maybe ``bands``)
    :param where: its place in the file, e.g. ``service.gas.momentum``, used in messages
    :returns: (criterion, options in SI); with bands, a :class:`BandedCriterion` and no options of its own
    :raises CriteriaFileError: a bad option, band or bound, naming its place
    """
    table = _flags(criterion, table)
    if "bands" not in table:
        return criterion, parse_options(criterion, table, where)
    common = {key: value for key, value in table.items() if key != "bands"}
    raw = table["bands"]
    if isinstance(raw, (str, bytes)) or not isinstance(raw, Sequence) or not raw:
        raise CriteriaFileError("bands must be a list of tables", field=f"{where}.bands", value=raw,
                                expected='a list such as [{ up_to_nps = "2", max = "1.5 m/s" }, { max = "3 m/s" }]')
    bands = [_band(criterion, common, item, f"{where}.bands[{number}]") for number, item in enumerate(raw, start=1)]
    _check_reachable(bands, where)
    return BandedCriterion(criterion, bands, where), {}


def _band(criterion: Any, common: Mapping[str, Any], item: object, where: str) -> Band:
    if not isinstance(item, Mapping):
        raise CriteriaFileError("a band must be a table", field=where, value=item,
                                expected='a table such as { up_to_nps = "2", max = "1.5 m/s" }')
    item = _flags(criterion, item)
    names = sorted({spec.name for spec in criterion.options} | set(BAND_KEYS))
    unknown = sorted(set(item) - set(names))
    if unknown:  # name the bounds too: "up_to_np" is a misspelt bound, not an option
        raise CriteriaFileError(f"unknown key {unknown[0]!r} in a band of criterion {criterion.id!r}", field=where,
                                value=unknown[0], expected=f"one of {', '.join(names)}")
    options = {**common, **{key: value for key, value in item.items() if key not in BAND_KEYS}}
    parsed = parse_options(criterion, options, where)
    label, nps, pressure = None, None, None
    if "up_to_nps" in item:
        try:
            label = normalise_nps(item["up_to_nps"], f"{where}.up_to_nps")
        except InputError as exc:
            raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from exc
        nps = nps_value(label)
    if "up_to_pressure" in item:
        try:
            pressure = parse_quantity(item["up_to_pressure"], f"{where}.up_to_pressure", "pressure")
        except InputError as exc:
            raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from exc
    return Band(options=parsed, up_to_nps=nps, up_to_nps_label=label, up_to_pressure=pressure)


def _check_reachable(bands: Sequence[Band], where: str) -> None:
    """A band after one without bounds can never apply: say so rather than ignore it."""
    for number, band in enumerate(bands[:-1], start=1):
        if band.up_to_nps is None and band.up_to_pressure is None:
            raise CriteriaFileError(
                f"band {number} has no bounds, so bands after it can never apply", field=f"{where}.bands",
                value=f"{len(bands)} bands", expected="the band without up_to_nps or up_to_pressure last")


def _flags(criterion: Any, table: Mapping[str, Any]) -> dict[str, Any]:
    """TOML true/false for a plain-number option becomes 1.0/0.0 (``warn_only = true``)."""
    plain = {spec.name for spec in getattr(criterion, "options", ()) if spec.kind == "dimensionless"}
    return {key: (float(value) if key in plain and isinstance(value, bool) else value) for key, value in table.items()}
