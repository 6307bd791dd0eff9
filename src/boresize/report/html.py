"""A self-contained HTML report that a checker can follow (Jinja2, autoescaped; plots inline as SVG).

Contents: a summary table with status colours and the controlling criterion; per line the
calculation record (inputs as given with their column units, the values as used in SI-derived
units, the property source, the candidates from one size below the selected one to two above,
every verdict with value, limit, utilisation and reason), a plot of velocity and drop per length
against NPS with the limits drawn; the cautions; and the traceability record.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from boresize.sizing.batch import summary
from boresize.io.document import CAUTION, TWO_PHASE_CAUTION, two_phase_count
from boresize.io.sheet_rows import case_name, case_rows
from boresize.io.rows import parse_header
from boresize.model import CandidateResult, LineResult
from boresize.sizing.selection import controlling_utilisation

__all__ = ["MAX_PLOTS", "render_html", "write_html"]

#: Lines that get a plot; a longer list is still reported in full, with a note (plots cost ~0.1 s each).
MAX_PLOTS = 300


_FLOW_UNITS = {"mass": "kg/h", "volume": "m3/h at line conditions", "standard-volume": "m3/h", "molar": "kmol/h"}


def _num(value: float | None, digits: int = 4) -> str:
    return "-" if value is None else f"{value:.{digits}g}"


def _pct(value: float | None) -> str:
    return "-" if value is None else f"{value:.0%}"


def _given(case: LineResult, headers: Mapping[str, str], units: Mapping[str, str | None]) -> list[tuple[str, str, str]]:
    raw = case.raw or {"tag": case.tag}
    return [(headers.get(name, name), value, units.get(name) or "") for name, value in raw.items() if value != ""]


def _margin(case: LineResult) -> str:
    """The design margin applied, and whose it is (the line's own or its service's)."""
    line = case.line
    own = line is not None and line.design_margin is not None
    applied = case.design_margin if case.design_margin is not None else line.design_margin if line else None
    if applied is None:
        return "the service's"
    return f"{applied * 100:.3g} % ({'the line' if own else 'the service'}'s)"


def _used(case: LineResult) -> list[tuple[str, str, str]]:
    line, state, sel = case.line, case.state, case.selected
    if line is None:
        return []
    rows = [("fluid", line.fluid + (f" ({state.fluid_name})" if state and state.fluid_name else ""), ""),
            ("flow", _num(line.flow.value * 3600, 6), _FLOW_UNITS[line.flow.basis] + (
                f" at {line.flow.reference_name}" if line.flow.reference_name else "")),
            ("design margin", _margin(case), ""),
            ("sizing mass flow", _num(case.sizing_flow * 3600 if case.sizing_flow else None, 6), "kg/h"),
            ("inlet pressure", _num(line.pressure / 1e5, 6), "bar abs"),
            ("temperature", _num(line.temperature - 273.15, 5), "degC"), ("length", _num(line.length), "m"),
            ("elevation (rise +)", _num(line.elevation), "m")]
    if sel is not None:
        rough = line.roughness if line.roughness is not None else sel.candidate.roughness
        rows += [("pipe class", sel.candidate.pipe_class, ""), ("roughness", _num(rough * 1e3), "mm")]
    if state is not None:
        rows += [("density", _num(state.density, 5), "kg/m3"), ("viscosity", _num(state.viscosity * 1e3, 4), "mPa s"),
                 ("phase", state.phase, ""), ("property source", f"{state.source}: {state.model}", "")]
        if state.family:
            rows.append(("fluid family", state.family, ""))
        if state.validity:
            rows.append(("model validity", state.validity, ""))
        if state.vapour_pressure:
            rows.append(("vapour pressure", _num(state.vapour_pressure / 1e5, 5), "bar abs"))
    rows += [("service", case.service or "-", ""), ("criteria set", case.criteria_set or "-", "")]
    if case.first_guess_diameter:
        rows.append(("Swamee-Jain first guess (not used for verdicts)", _num(case.first_guess_diameter * 1e3), "mm ID"))
    return rows


def _two_phase(case: LineResult) -> list[tuple[str, str, str]]:
    """The two-phase block of a case's record (empty for a single-phase case, so that its record stays as it was)."""
    flow = case.selected.hydraulics.two_phase if case.selected else None
    if flow is None:
        return []
    state = case.state

    def prop(name: str) -> float | None:
        value: float | None = getattr(state, name, None) if state is not None else None
        return value if value is not None else getattr(flow, name)

    def scaled(value: float | None, factor: float) -> float | None:
        return None if value is None else value * factor

    rows = [("pressure-drop correlation", flow.method, "fluids"), ("flow regime", flow.flow_regime, flow.regime_map),
            ("vapour mass fraction (inlet)", _num(flow.vapour_fraction), "-"),
            ("liquid holdup", _num(flow.liquid_holdup), "-"),
            ("superficial liquid velocity", _num(flow.superficial_liquid_velocity), "m/s"),
            ("superficial gas velocity", _num(flow.superficial_gas_velocity), "m/s"),
            ("mixture velocity", _num(flow.mixture_velocity), "m/s"),
            ("mixture density (no-slip, erosional limit)", _num(flow.mixture_density, 5), "kg/m3"),
            ("liquid density", _num(prop("liquid_density"), 5), "kg/m3"),
            ("gas density", _num(prop("gas_density"), 5), "kg/m3"),
            ("liquid viscosity", _num(scaled(prop("liquid_viscosity"), 1e3)), "mPa s"),
            ("gas viscosity", _num(scaled(prop("gas_viscosity"), 1e3)), "mPa s"),
            ("surface tension", _num(scaled(prop("surface_tension"), 1e3)), "mN/m")]
    if flow.fittings_method:
        rows.append(("fittings (two-phase multiplier)", flow.fittings_method, ""))
    if flow.segments > 1:
        rows.append(("segments marched", str(flow.segments), ""))
    if flow.outlet_vapour_fraction is not None:
        rows.append(("vapour mass fraction (outlet)", _num(flow.outlet_vapour_fraction), "-"))
    if flow.flash_point is not None:
        rows.append(("flashes (bubble pressure reached) at", _num(flow.flash_point), "m from the inlet"))
    return rows


def _window(candidates: Sequence[CandidateResult], chosen: str | None) -> list[dict[str, Any]]:
    """One size below the selected one to two above (all rated sizes when none is selected)."""
    labels = [c.candidate.nps for c in candidates]
    at = labels.index(chosen) if chosen in labels else None
    shown = candidates if at is None else candidates[max(at - 1, 0):at + 3]
    rows = []
    for c in shown:
        h, worst = c.hydraulics, c.worst
        rows.append({"nps": c.candidate.nps, "schedule": c.candidate.schedule,
                     "id": _num(c.candidate.inside_diameter * 1e3), "velocity": _num(h.velocity),
                     "drop": _num(h.drop_per_length / 10.0), "reynolds": _num(h.reynolds),
                     "friction": _num(h.friction_factor), "regime": h.regime,
                     "worst": worst.criterion if worst else "-",
                     "utilisation": _pct(worst.utilisation if worst else None),
                     "result": "pass" if c.passed else "fail", "selected": c.candidate.nps == chosen})
    return rows


def _verdicts(case: LineResult) -> list[dict[str, str]]:
    return [{"criterion": v.criterion, "status": v.status, "value": _num(v.value), "limit": _num(v.limit),
             "unit": v.unit, "utilisation": _pct(v.utilisation), "reason": v.reason, "source": v.source}
            for v in (case.selected.verdicts if case.selected else ())]


def _line_view(result: LineResult, headers: Mapping[str, str], units: Mapping[str, str | None],
               plot: bool) -> dict[str, Any]:
    from boresize.report.plot import line_plot_svg

    sel, chosen = result.selected, result.selected.candidate.nps if result.selected else None
    cases = [{"name": case_name(c) or "", "status": c.status, "error": c.error if result.cases else None,
              "given": _given(c, headers, units), "used": _used(c), "candidates": _window(c.candidates, chosen),
              "verdicts": _verdicts(c), "two_phase": _two_phase(c)} for c in case_rows(result)]
    return {"tag": result.tag, "status": result.status, "mode": result.mode, "service": result.service or "-",
            "case_count": len(result.cases) or 1, "nps": sel.candidate.nps if sel else "",
            "schedule": sel.candidate.schedule if sel else "",
            "velocity": _num(sel.hydraulics.velocity if sel else None),
            "drop": _num(sel.hydraulics.drop_per_length / 10.0 if sel else None),
            "controlling": _controlling(result), "utilisation": _pct(controlling_utilisation(result)[0]),
            "case": case_name(result) if result.cases else "", "governing": list(result.governing),
            "error": result.error, "notes": list(result.notes), "cases": cases,
            "plot": line_plot_svg(result) if plot else None}


def _controlling(result: LineResult) -> str:
    """The controlling criterion, or why there is none (the smallest size selected)."""
    if result.controlling is None and result.status == "pass" and result.mode == "size":
        return "none (the smallest size the pipe class allows)"
    return result.controlling or "-"


def _trace_rows(trace: Mapping[str, Any]) -> list[tuple[str, str]]:
    rows = []
    for key, value in trace.items():
        if isinstance(value, Mapping):
            value = ", ".join(f"{k}: {v}" for k, v in value.items())
        elif isinstance(value, list):
            value = "; ".join(", ".join(f"{k} {v}" for k, v in item.items()) if isinstance(item, Mapping) else str(item)
                              for item in value)
        rows.append((key.replace("_", " "), "-" if value is None else str(value)))
    return rows


def render_html(results: Sequence[LineResult], *, trace: Mapping[str, Any], title: str,
                headers: Sequence[str] | None = None, units: Mapping[str, str | None] | None = None,
                max_plots: int = MAX_PLOTS) -> str:
    """The report as one HTML string (no external files, scripts or fonts)."""
    from boresize.optional import needs

    with needs("the HTML report"):
        from jinja2 import Environment, StrictUndefined

    from boresize.report.html_template import TEMPLATE

    by_field = {parse_header(h).field: h for h in headers or ()}
    lines = [_line_view(r, by_field, units or {}, i < max_plots) for i, r in enumerate(results)]
    cautions = [f"{r.tag}: {note}" for r in results for note in r.notes]
    cautions += [r.error for r in results if r.error]
    if two_phase_count(results):
        cautions.insert(0, TWO_PHASE_CAUTION)
    if len(results) > max_plots:
        cautions.append(f"plots are drawn for the first {max_plots} lines only")
    env = Environment(autoescape=True, undefined=StrictUndefined, trim_blocks=True, lstrip_blocks=True)
    return env.from_string(TEMPLATE).render(title=title, caution=CAUTION, summary=summary(results), lines=lines,
                                            cautions=cautions, two_phase_caution=TWO_PHASE_CAUTION, trace=_trace_rows(trace))


def write_html(path: str | Path, results: Sequence[LineResult], **kwargs: Any) -> None:
    """Write :func:`render_html` to ``path`` (UTF-8)."""
    Path(path).write_text(render_html(results, **kwargs), encoding="utf-8")
