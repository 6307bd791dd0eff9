"""Results as plain dictionaries: the JSON contract (README, "A short tour"), plus the calculation record.

A line with several operating cases is one entry: the contract keys come from the governing case
(named in ``case``), ``governing`` maps each criterion to the case that governs it, and ``cases``
lists every case's own entry in input order (empty for a line without named cases).
"""

from __future__ import annotations

import json
import math
from collections.abc import Mapping, Sequence
from typing import Any

from boresize import __version__
from boresize.model import CandidateResult, FluidState, LineResult, TwoPhaseFlow, Verdict, bare_pressure_count

__all__ = ["CAUTION", "SCHEMA_VERSION", "TWO_PHASE_CAUTION", "two_phase_count", "document", "document_schema", "dumps_strict", "dumps_record", "result_to_dict", "sheet_values", "SHEET_KEYS", "verdict_to_dict", "candidate_to_dict"]

CAUTION = (
    "boresize results are screening calculations. They must be checked by a competent engineer against the "
    "applicable codes and the company's standards before use; local codes govern."
)


TWO_PHASE_CAUTION = (
    "Two-phase lines carry large uncertainty: the pressure-drop correlations and flow-regime maps were fitted to "
    "limited data (Beggs and Brill 1973: air-water tests in 1 and 1.5 in pipe; in later comparisons with field "
    "data, drop errors of 30 % and more are common - from memory), and a regime near a map's boundary may be the "
    "other one. Slug flow and surge, and the loads they put on supports, need a specialist's review."
)


def two_phase_count(results: Sequence[LineResult]) -> int:
    """How many lines are two-phase in any of their cases (a two-phase state, or two-phase hydraulics)."""
    return sum(1 for r in results if any(_is_two_phase(one) for one in (r, *r.cases)))


def _is_two_phase(result: LineResult) -> bool:
    if result.state is not None and result.state.phase == "two-phase":
        return True
    return result.selected is not None and result.selected.hydraulics.two_phase is not None


SCHEMA_VERSION = "1.2"
"""The document's ``schema_version``: the major number changes when a key is removed or changes meaning, the minor
number when one is added. The schema itself ships as ``boresize/schema/document.schema.json``."""


def document_schema() -> dict[str, Any]:
    """The JSON Schema (draft 2020-12) of the document, as shipped in the package (``boresize schema``)."""
    from importlib.resources import files

    text = files("boresize").joinpath("schema", "document.schema.json").read_text(encoding="utf-8")
    schema: dict[str, Any] = json.loads(text)
    return schema


def _r6(value: float | None) -> float | None:
    """Round to 6 significant figures so that the JSON reads well and compares byte for byte.

    The rule of the whole document (the schema's description and README's "JSON document" say it too): physical
    quantities to 6 significant figures, utilisation (and headroom percentages) to 4 (:func:`_r4`). The format spec
    is a constant, not built for each value by a nested f-string; :func:`result_to_dict` rounds about 70 values a
    line.
    measured: result_to_dict 0.23 s to 0.19 s CPU for the 2,000 lines (`boresize size lines-2000.csv --workers 1
    --quiet --json`, result_to_dict timed alone in the process on the run's results, least of 9)."""
    if value is None:
        return None
    return float(format(value, ".6g"))


def _r4(value: float | None) -> float | None:
    """Round to 4 significant figures (utilisation), as :func:`_r6`."""
    if value is None:
        return None
    return float(format(value, ".4g"))


def verdict_to_dict(v: Verdict) -> dict[str, Any]:
    return {
        "criterion": v.criterion, "status": v.status, "value": _r6(v.value), "limit": _r6(v.limit), "unit": v.unit,
        "utilisation": _r4(v.utilisation), "reason": v.reason, "source": v.source,
    }


def candidate_to_dict(c: CandidateResult) -> dict[str, Any]:
    h = c.hydraulics
    return {
        "nps": c.candidate.nps, "schedule": c.candidate.schedule,
        "inside_diameter_mm": _r6(c.candidate.inside_diameter * 1e3), "velocity_m_s": _r6(h.velocity),
        "dp_kpa_per_100m": _r6(h.drop_per_length / 10.0), "reynolds": _r6(h.reynolds),
        "friction_factor": _r6(h.friction_factor), "regime": h.regime, "passed": c.passed,
        "failing": [v.criterion for v in c.verdicts if v.status in ("fail", "error")],
    }


def _headline(result: LineResult) -> dict[str, Any]:
    """The first keys of a line's entry after its tag: status, the size and its headline numbers, what controls
    (shared by :func:`result_to_dict` and :func:`sheet_values`, in this order)."""
    sel, state = result.selected, result.state
    h = sel.hydraulics if sel else None
    return {
        "status": result.status,
        "mode": result.mode,
        "nps": sel.candidate.nps if sel else None,
        "schedule": sel.candidate.schedule if sel else None,
        "inside_diameter_mm": _r6(sel.candidate.inside_diameter * 1e3) if sel else None,
        "velocity_m_s": _r6(h.velocity) if h else None,
        "dp_kpa_per_100m": _r6(h.drop_per_length / 10.0) if h else None,
        "density_kg_m3": _r6(state.density) if state else None,
        "viscosity_mpa_s": _r6(state.viscosity * 1e3) if state else None,
        "controlling": result.controlling,
        "utilisation": _r4(sel.worst.utilisation) if sel and sel.worst else None,
    }


def result_to_dict(result: LineResult) -> dict[str, Any]:
    """One line's entry in the JSON document (the contract's keys first)."""
    sel = result.selected
    entry: dict[str, Any] = {
        "tag": result.tag,
        **_headline(result),
        "verdicts": [verdict_to_dict(v) for v in sel.verdicts] if sel else [],
        "case": _case(result),
        "governing": dict(result.governing),
        "smallest_passing_nps": result.smallest_passing_nps,
    }
    if result.error:
        entry["error"] = result.error
        entry["error_field"] = result.error_field
    entry.update(_record(result))
    entry["input"] = dict(result.raw)
    entry["cases"] = [result_to_dict(c) for c in result.cases]
    return entry


#: The keys of a line's entry that the spreadsheet rows show (:mod:`boresize.io.sheet_rows`), in entry order.
SHEET_KEYS = ("status", "mode", "nps", "schedule", "inside_diameter_mm", "velocity_m_s", "dp_kpa_per_100m",
              "density_kg_m3", "viscosity_mpa_s", "controlling", "utilisation", "error", "service", "criteria_set",
              "notes", "phase", "property_source", "vapour_fraction", "total_drop_kpa", "outlet_pressure_bar_abs",
              "two_phase_method", "flow_regime", "liquid_holdup", "superficial_liquid_velocity_m_s",
              "superficial_gas_velocity_m_s", "mixture_density_kg_m3")


def sheet_values(result: LineResult) -> dict[str, Any]:
    """The :data:`SHEET_KEYS` of :func:`result_to_dict`'s entry (None where the entry has no such key), without
    building the rest of the record (verdicts, candidates, the input, the cases) that a CSV or table never shows.
    measured: 0.23 s to 0.065 s CPU for the 2,000 lines' CSV rows (`boresize size lines-2000.csv --workers 1
    --quiet -o x.csv`, the rows timed alone in the process, least of 7)."""
    sel, state = result.selected, result.state
    h = sel.hydraulics if sel else None
    flow = _two_phase_flow(h.two_phase) if h is not None and h.two_phase is not None else {}
    return {
        **_headline(result),
        "error": result.error or None,
        "service": result.service,
        "criteria_set": result.criteria_set,
        "notes": list(result.notes),
        "phase": state.phase if state is not None else None,
        "property_source": state.source if state is not None else None,
        "vapour_fraction": _r6(state.vapour_fraction) if state is not None else None,
        "total_drop_kpa": _r6(h.total_drop / 1e3) if h is not None else None,
        "outlet_pressure_bar_abs": _r6(h.outlet_pressure / 1e5) if h is not None and h.outlet_pressure is not None
        else None,
        **{key: flow.get(key) for key in ("two_phase_method", "flow_regime", "liquid_holdup",
                                          "superficial_liquid_velocity_m_s", "superficial_gas_velocity_m_s",
                                          "mixture_density_kg_m3")},
    }


def _case(result: LineResult) -> str | None:
    if result.line is not None and result.line.case:
        return result.line.case
    return result.raw.get("case") or None


def _bar(pressure: float | None) -> float | None:
    return _r6(pressure / 1e5) if pressure else None


def _record(result: LineResult) -> dict[str, Any]:
    """What a checker needs to follow the calculation."""
    sel, state, line = result.selected, result.state, result.line
    record: dict[str, Any] = {
        "service": result.service,
        "criteria_set": result.criteria_set,
        "notes": list(result.notes),
    }
    if line is not None:
        roughness = line.roughness if line.roughness is not None else sel.candidate.roughness if sel else None
        record.update({
            "fluid": line.fluid, "pressure_bar_abs": _r6(line.pressure / 1e5), "temperature_c": _r6(line.temperature - 273.15),
            "length_m": _r6(line.length), "pipe_class": sel.candidate.pipe_class if sel else line.pipe_class,
            "design_margin": result.design_margin if result.design_margin is not None else line.design_margin,
            "roughness_mm": _r6(roughness * 1e3) if roughness is not None else None,
        })
    if state is not None:
        record.update({"phase": state.phase, "property_source": state.source, "property_model": state.model,
                       "property_family": state.family, "property_validity": state.validity,
                       "property_backend_version": state.backend_version, "eos": state.eos,
                       "vapour_fraction": _r6(state.vapour_fraction),
                       "vapour_pressure_bar_abs": _bar(state.vapour_pressure),
                       "bubble_pressure_bar_abs": _bar(state.bubble_pressure),
                       "dew_pressure_bar_abs": _bar(state.dew_pressure),
                       "speed_of_sound_m_s": _r6(state.speed_of_sound)})
        record.update(_phase_properties(state, sel.hydraulics.two_phase if sel else None))
    if sel is not None:
        h = sel.hydraulics
        record.update({
            "sizing_mass_flow_kg_h": _r6(h.mass_flow * 3600.0), "volume_flow_m3_h": _r6(h.volume_flow * 3600.0),
            "reynolds": _r6(h.reynolds), "friction_factor": _r6(h.friction_factor), "regime": h.regime,
            "drop_kpa": _r6(h.drop / 1e3), "momentum_pa": _r6(h.momentum),
            "fittings_drop_kpa": _r6(h.fittings_drop / 1e3), "static_drop_kpa": _r6(h.static_drop / 1e3),
            "fixed_drop_kpa": _r6(h.fixed_drop / 1e3), "total_drop_kpa": _r6(h.total_drop / 1e3),
            "outlet_pressure_bar_abs": _r6(h.outlet_pressure / 1e5) if h.outlet_pressure is not None else None,
            "mach": _r6(h.mach), "outlet_mach": _r6(h.outlet_mach), "outlet_velocity_m_s": _r6(h.outlet_velocity),
            "choked": h.choked, "choke_length_m": _r6(h.choke_length),
            "acceleration_drop_kpa": _r6(h.acceleration_drop / 1e3),
            "fittings_k": _r6(h.fittings_k), "fittings_method": h.fittings_method, "drop_method": h.method,
            "first_guess_id_mm": _r6(result.first_guess_diameter * 1e3) if result.first_guess_diameter else None,
            **_two_phase_flow(h.two_phase),
            "candidates": [candidate_to_dict(c) for c in result.candidates],
        })
    return record


def _phase_properties(state: FluidState, flow: TwoPhaseFlow | None) -> dict[str, Any]:
    """Each phase's properties of a two-phase state (the state's, else as the correlation used them); all null
    for a single-phase line."""
    def pick(name: str) -> float | None:
        value: float | None = getattr(state, name)
        return value if value is not None or flow is None else getattr(flow, name)

    liquid_mu, gas_mu, sigma = pick("liquid_viscosity"), pick("gas_viscosity"), pick("surface_tension")
    return {"liquid_density_kg_m3": _r6(pick("liquid_density")), "gas_density_kg_m3": _r6(pick("gas_density")),
            "liquid_viscosity_mpa_s": _r6(liquid_mu * 1e3) if liquid_mu is not None else None,
            "gas_viscosity_mpa_s": _r6(gas_mu * 1e3) if gas_mu is not None else None,
            "surface_tension_mn_m": _r6(sigma * 1e3) if sigma is not None else None}


def _two_phase_flow(flow: TwoPhaseFlow | None) -> dict[str, Any]:
    """The selected size's two-phase hydraulics (all null for a single-phase line)."""
    if flow is None:
        return dict.fromkeys(TWO_PHASE_KEYS)
    return {
        "two_phase_method": flow.method, "flow_regime": flow.flow_regime, "regime_map": flow.regime_map,
        "liquid_holdup": _r6(flow.liquid_holdup),
        "superficial_liquid_velocity_m_s": _r6(flow.superficial_liquid_velocity),
        "superficial_gas_velocity_m_s": _r6(flow.superficial_gas_velocity),
        "mixture_velocity_m_s": _r6(flow.mixture_velocity), "mixture_density_kg_m3": _r6(flow.mixture_density),
        "two_phase_fittings_method": flow.fittings_method or None, "segments": flow.segments,
        "outlet_vapour_fraction": _r6(flow.outlet_vapour_fraction), "flash_point_m": _r6(flow.flash_point),
    }


#: The keys :func:`_two_phase_flow` adds to a line's record.
TWO_PHASE_KEYS = ("two_phase_method", "flow_regime", "regime_map", "liquid_holdup", "superficial_liquid_velocity_m_s",
                  "superficial_gas_velocity_m_s", "mixture_velocity_m_s", "mixture_density_kg_m3",
                  "two_phase_fittings_method", "segments", "outlet_vapour_fraction", "flash_point_m")


def document(results: Sequence[LineResult], *, criteria_source: str, lines_source: str,
             traceability: Mapping[str, Any] | None = None,
             criterion_seconds: Mapping[str, float] | None = None,
             document_block: Mapping[str, str] | None = None) -> dict[str, Any]:
    """The whole JSON document: lines in input order, a summary, the caution and (given) the traceability and
    the calculation sheet's document block (``document``: project, unit, number, revision, date, prepared, checked,
    approved, notes, each text; schema 1.2).

    Given ``criterion_seconds`` (criterion id -> seconds its evaluate took over the run), the summary holds them
    as ``criterion_seconds``, rounded to the microsecond.
    """
    counts = {status: sum(1 for r in results if r.status == status) for status in ("pass", "fail", "error")}
    doc: dict[str, Any] = {
        "schema_version": SCHEMA_VERSION,
        "boresize_version": __version__,
        "lines_source": lines_source,
        "criteria_source": criteria_source,
        "summary": {"lines": len(results), **counts, "bare_pressure": bare_pressure_count(results)},
        "caution": CAUTION,
    }
    if criterion_seconds is not None:
        doc["summary"]["criterion_seconds"] = {ident: round(t, 6) for ident, t in criterion_seconds.items()}
    if traceability is not None:
        doc["traceability"] = dict(traceability)
    if document_block is not None:
        doc["document"] = dict(document_block)
    doc["lines"] = [result_to_dict(r) for r in results]
    return doc


def dumps_strict(payload: Any) -> str:
    """``payload`` as indented JSON that any reader accepts: a NaN or infinite number (an infinite utilisation of a
    fail no size can meet) is written as null, with a note naming it in the ``notes`` of the nearest object that has
    them (a line's), never as the bare ``NaN`` or ``Infinity`` that strict JSON readers refuse.

    The bytes are ``json.dumps(_finite(payload), indent=2, ensure_ascii=False, allow_nan=False)``'s
    (tests/test_output_identity.py); the walk that writes null runs only when the payload holds a NaN or infinity.
    measured: the walk skipped, 0.28 s less CPU for the 2,000-line document (`boresize size lines-2000.csv --workers 1
    --quiet --json`, the walk timed alone in the process, least of 7)."""
    try:
        return _indent2(payload)
    except ValueError:  # a NaN or infinity somewhere (or a circular reference): the walk, then the same encoder
        pass
    return _indent2(_finite(payload, "", None))


def dumps_record(payload: Any) -> str:
    """``payload`` as one line of strict JSON (a JSON Lines record): :func:`dumps_strict`'s values, no indent.

    The C encoder refuses a NaN or infinity (allow_nan=False); only then is the record walked to write null.
    measured: 0.39 s to 0.16 s CPU for 2,000 records (`boresize size lines-2000.csv --workers 1 --quiet -o x.jsonl`,
    the records' encoding timed alone in the process)."""
    try:
        return json.dumps(payload, ensure_ascii=False, allow_nan=False, separators=(",", ":"))
    except ValueError:  # a NaN or infinity somewhere (or a circular reference, which the walk refuses too)
        pass
    return json.dumps(_finite(payload, "", None), ensure_ascii=False, allow_nan=False, separators=(",", ":"))


class _Unusual(Exception):
    """A value :func:`_indent2` leaves to the json module (a key that is not text, an object it does not know)."""


def _indent2(payload: Any) -> str:
    """``json.dumps(payload, indent=2, ensure_ascii=False, allow_nan=False)``, byte for byte, without the json
    module's pure-Python encoder (the one it uses whenever ``indent`` is given): text through the C string encoder,
    numbers by their ``repr`` as json writes them. A NaN or infinity raises ValueError as json does; anything
    unusual (a key that is not text, a type json would refuse, nesting too deep) is left to ``json.dumps`` itself.
    measured: 0.57 s to 0.38 s CPU for the 2,000-line document (13.7 MB; `boresize size lines-2000.csv
    --workers 1 --quiet --json`, the encoder timed alone in the process, least of 7). Writing containers of leaves with
    the C encoder (its item separator the indent) measured worse (0.52 s against 0.40 s: the test for leaves cost
    more than the C encoder saved) and was left out; so, again, were the C encoder for the leaf keys of each object
    (the nested values cut out and written in by this walk: 0.32 s against 0.30 s) and for a list of flat objects in
    one call (the verdicts), and appending a text or float item with its key in one string (0.288 s against 0.297 s):
    escaping the text and writing the floats, which both ways share, is most of the time."""
    out: list[str] = []
    try:
        _put(payload, "\n", out)
    except (_Unusual, RecursionError):
        return json.dumps(payload, indent=2, ensure_ascii=False, allow_nan=False)
    return "".join(out)


def _put(value: Any, newline: str, out: list[str]) -> None:
    """Append ``value`` as json.dumps(indent=2) writes it where ``newline`` (a line break and the indent) starts
    its lines; same type tests in the same order as json's encoder."""
    if isinstance(value, str):
        out.append(_string(value))
    elif value is None:
        out.append("null")
    elif value is True:
        out.append("true")
    elif value is False:
        out.append("false")
    elif isinstance(value, int):
        out.append(_int_text(value))
    elif isinstance(value, float):
        if value != value or value in _INFINITE:
            raise ValueError(f"Out of range float values are not JSON compliant: {value!r}")
        out.append(_float_text(value))
    elif isinstance(value, (list, tuple)):
        if not value:
            out.append("[]")
            return
        inner = newline + "  "
        before = "[" + inner
        for item in value:
            out.append(before)
            before = "," + inner
            _put(item, inner, out)
        out.append(newline + "]")
    elif isinstance(value, dict):
        if not value:
            out.append("{}")
            return
        inner = newline + "  "
        before = "{" + inner
        for key, item in value.items():
            if not isinstance(key, str):
                raise _Unusual
            out.append(before)
            out.append(_string(key))
            out.append(": ")
            before = "," + inner
            _put(item, inner, out)
        out.append(newline + "}")
    else:
        raise _Unusual


_INFINITE = (math.inf, -math.inf)
_int_text, _float_text = int.__repr__, float.__repr__
_string = json.encoder.encode_basestring  # the C one when built (json.dumps's with ensure_ascii=False)


def _finite(value: Any, where: str, notes: list[Any] | None) -> Any:
    if isinstance(value, float) and not math.isfinite(value):
        if notes is not None:
            notes.append(f"{where.lstrip('.')} {value!r} is written as null (JSON has no NaN or infinity)")
        return None
    if isinstance(value, dict):
        own = value.get("notes")
        inner = list(own) if isinstance(own, list) else notes
        out = {key: _finite(item, f"{where}.{key}", inner) for key, item in value.items()}
        if isinstance(own, list) and inner is not None and len(inner) > len(own):
            out["notes"] = inner
        return out
    if isinstance(value, (list, tuple)):
        return [_finite(item, f"{where}[{number}]", notes) for number, item in enumerate(value)]
    return value
