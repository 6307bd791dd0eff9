"""A self-contained HTML report that a checker can follow (Jinja2, autoescaped; plots inline as SVG).

Contents: a summary table with status colours and the controlling criterion; per line the
calculation record (inputs as given with their column units, the values as used in SI-derived
units, the property source, the candidates from one size below the selected one to two above,
every verdict with value, limit, utilisation and reason), a plot of velocity and drop per length
against NPS with the limits drawn; the cautions; and the traceability record.
"""

from __future__ import annotations

import math
import re
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from boresize.sizing.batch import summary
from boresize.io.document import CAUTION, TWO_PHASE_CAUTION, two_phase_count
from boresize.io.sheet_rows import case_name, case_rows
from boresize.io.rows import parse_header
from boresize.io.document_block import DocumentBlock
from boresize.model import CandidateResult, Hydraulics, LineResult
from boresize.sizing.selection import controlling_utilisation

__all__ = ["MAX_PLOTS", "render_html", "write_html"]

#: Lines that get a plot; a longer list is still reported in full, with a note (plots cost ~0.1 s each).
MAX_PLOTS = 300
#: Lines that get a full calculation record on the page; a longer list keeps every line in its summary table and the
#: records of its failing and error lines first, then its first passing lines, and says how many it left out (a page
#: of 50,000 records is one no reader or browser can use; every record is in the JSON and JSON Lines outputs).
MAX_RECORDS = 500


_FLOW_UNITS = {"mass": "kg/h", "volume": "m3/h at line conditions", "standard-volume": "m3/h", "molar": "kmol/h"}


def _num(value: float | None, digits: int = 4) -> str:
    return "-" if value is None else f"{value:.{digits}g}"


def _sig(value: float | None, digits: int = 4) -> str:
    """``value`` to ``digits`` significant figures in fixed notation, trailing zeros kept (4.000, 49500, 0.7406)."""
    if value is None or not math.isfinite(value):
        return "-" if value is None else str(value)
    if value == 0:
        return "0"
    places = digits - 1 - math.floor(math.log10(abs(value)))
    return f"{round(value, places):.{max(places, 0)}f}"


#: Significant figures of every computed quantity on the record (velocity, pressures, drops, density, viscosity,
#: flow, Re, f, K...): the same number of figures wherever a quantity appears (summary, inputs as used, totals,
#: equations, candidates, verdicts), so that "2.213 bar abs" never stands next to "5.51325 bar abs".
FIGURES = 4


def _q(value: float | None) -> str:
    """A computed quantity to :data:`FIGURES` significant figures: fixed notation from 0.001 to below 10 million
    (trailing zeros kept: 4.000), else scientific (2.921e-04)."""
    if value is None or not math.isfinite(value) or value == 0 or 1e-3 <= abs(value) < 1e7:
        return _sig(value, FIGURES)
    return f"{value:.{FIGURES - 1}e}"


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
        return "- (not rated)"
    return f"{applied * 100:.3g} % ({'the line' if own else 'the service'}'s)"


def _used(case: LineResult) -> list[tuple[str, str, str]]:
    line, state, sel = case.line, case.state, case.selected
    if line is None:
        return []
    rows = [("fluid", line.fluid + (f" ({state.fluid_name})" if state and state.fluid_name else ""), ""),
            ("flow", _q(line.flow.value * 3600), _FLOW_UNITS[line.flow.basis] + (
                f" at {line.flow.reference_name}" if line.flow.reference_name else "")),
            ("design margin", _margin(case), ""),
            ("sizing mass flow", _q(case.sizing_flow * 3600 if case.sizing_flow else None), "kg/h"),
            ("inlet pressure", _q(line.pressure / 1e5), "bar abs"),
            ("temperature", f"{line.temperature - 273.15:.1f}", "degC"), ("length", _num(line.length, 6), "m"),
            ("elevation (rise +)", _num(line.elevation, 6), "m")]
    if sel is not None:
        rough = line.roughness if line.roughness is not None else sel.candidate.roughness
        rows += [("pipe class", sel.candidate.pipe_class, ""), ("roughness", _num(rough * 1e3), "mm")]
    if state is not None:
        rows += [("density", _q(state.density), "kg/m3"), ("viscosity", _q(state.viscosity * 1e3), "mPa s"),
                 ("phase", state.phase, ""), ("property source", f"{state.source}: {state.model}", "")]
        if state.family:
            rows.append(("fluid family", state.family, ""))
        if state.validity:
            rows.append(("model validity", state.validity, ""))
        if state.vapour_pressure:
            rows.append(("vapour pressure", _q(state.vapour_pressure / 1e5), "bar abs"))
    rows += [("service", case.service or "-", ""), ("criteria set", case.criteria_set or "-", "")]
    if case.first_guess_diameter:
        rows.append(("Swamee-Jain first guess (not used for verdicts)", _q(case.first_guess_diameter * 1e3), "mm ID"))
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
            ("vapour mass fraction (inlet)", _q(flow.vapour_fraction), "-"),
            ("liquid holdup", _q(flow.liquid_holdup), "-"),
            ("superficial liquid velocity", _q(flow.superficial_liquid_velocity), "m/s"),
            ("superficial gas velocity", _q(flow.superficial_gas_velocity), "m/s"),
            ("mixture velocity", _q(flow.mixture_velocity), "m/s"),
            ("mixture density (no-slip, erosional limit)", _q(flow.mixture_density), "kg/m3"),
            ("liquid density", _q(prop("liquid_density")), "kg/m3"),
            ("gas density", _q(prop("gas_density")), "kg/m3"),
            ("liquid viscosity", _q(scaled(prop("liquid_viscosity"), 1e3)), "mPa s"),
            ("gas viscosity", _q(scaled(prop("gas_viscosity"), 1e3)), "mPa s"),
            ("surface tension", _q(scaled(prop("surface_tension"), 1e3)), "mN/m")]
    if flow.fittings_method:
        rows.append(("fittings (two-phase multiplier)", flow.fittings_method, ""))
    if flow.segments > 1:
        rows.append(("segments marched", str(flow.segments), ""))
    if flow.outlet_vapour_fraction is not None:
        rows.append(("vapour mass fraction (outlet)", _q(flow.outlet_vapour_fraction), "-"))
    if flow.flash_point is not None:
        rows.append(("flashes (bubble pressure reached) at", _q(flow.flash_point), "m from the inlet"))
    return rows


def _kpa(value: float | None) -> str:
    return _q(None if value is None else value / 1e3)


def _fittings(case: LineResult) -> list[dict[str, str]]:
    """Each fitting of the line at the selected size: kind, count, K each, equivalent length each, method."""
    from boresize.hydraulics.fittings import fittings_loss

    line, sel = case.line, case.selected
    if line is None or sel is None or not line.fittings:
        return []
    h, cand = sel.hydraulics, sel.candidate
    try:
        loss = fittings_loss(line.fittings, line.fittings_method, reynolds=h.reynolds,
                             inside_diameter=cand.inside_diameter, nps=cand.nps_value)
    except (ValueError, ArithmeticError):  # the line was rated with them: only a changed table could refuse them
        return []
    return [{"kind": item.spec, "count": _num(item.count), "k": _q(item.k),
             "leq": _q(item.equivalent_length), "source": item.source} for item in loss.items]


def _segments(h: Hydraulics) -> str:
    found = re.search(r"in (\d+) segments", h.method)
    return found.group(1) if found else "1 (one density all along)"


def _totals(case: LineResult) -> list[tuple[str, str, str]]:
    """The hydraulic totals of the selected size, whether or not an outlet criterion is set."""
    sel = case.selected
    if sel is None:
        return []
    h = sel.hydraulics
    rows = [("drop method", h.method, ""), ("segments", _segments(h), ""),
            ("pipe friction", _kpa(h.drop), "kPa"),
            ("fittings (sum K " + _q(h.fittings_k) + ")", _kpa(h.fittings_drop), "kPa"),
            ("static head (rise +)", _kpa(h.static_drop), "kPa"),
            ("fixed allowances", _kpa(h.fixed_drop), "kPa"),
            ("acceleration" if h.two_phase is not None else "acceleration (gas)", _kpa(h.acceleration_drop), "kPa"),
            ("total drop", _kpa(h.total_drop), "kPa"),
            ("outlet pressure", _q(None if h.outlet_pressure is None else h.outlet_pressure / 1e5), "bar abs"),
            ("choked", ("yes" + (f", at {_num(h.choke_length)} m from the inlet" if h.choke_length is not None
                                 else "")) if h.choked else "no", "")]
    if h.fittings_method:
        rows.insert(4, ("fittings method", h.fittings_method, ""))
    return rows


def _equations(case: LineResult) -> list[tuple[str, str, str, str]]:
    """(quantity, equation, with the selected size's numbers, result with unit): the line redone by hand.

    For a line rated with one density (liquids, short gas lines); a marched gas line shows its inlet step and
    says that the totals come from the march.
    """
    line, sel, state = case.line, case.selected, case.state
    if line is None or sel is None or state is None or sel.hydraulics.two_phase is not None:
        return []  # a two-phase line's method is not these single-phase equations
    h, cand = sel.hydraulics, sel.candidate
    d, rho, mu = cand.inside_diameter, state.density, state.viscosity
    rough = line.roughness if line.roughness is not None else cand.roughness
    v, f, re_, length = h.velocity, h.friction_factor, h.reynolds, line.length
    q = 0.5 * rho * v * v
    rows = [("velocity", "v = m / (ρ π D² / 4)",
             f"{_q(h.mass_flow)} / ({_q(rho)} × π × {_q(d)}² / 4)",
             f"{_q(v)} m/s"),
            ("Reynolds number", "Re = ρ v D / μ",
             f"{_q(rho)} × {_q(v)} × {_q(d)} / {_q(mu)}", _q(re_)),
            ("relative roughness", "ε / D", f"{_q(rough)} / {_q(d)}", _q(rough / d))]
    if h.regime == "laminar":
        rows.append(("friction factor (laminar)", "f = 64 / Re", f"64 / {_q(re_)}", _q(f)))
    else:
        rows.append(("friction factor (Colebrook-White)",
                     "1/√f = −2 log₁₀(ε/(3.7 D) + 2.51/(Re √f))",
                     f"1/√f = −2 log₁₀({_q(rough / d)}/3.7 + 2.51/({_q(re_)} √f))",
                     _q(f)))
    rows.append(("velocity head", "q = ρ v² / 2", f"{_q(rho)} × {_q(v)}² / 2",
                 f"{_q(q)} Pa"))
    marched = h.acceleration_drop != 0.0 or "segments" in h.method
    if marched:
        rows.append(("pipe friction (marched)", "Δp_f = Σ f (ΔL/D) ρ v²/2 over the segments",
                     "properties re-evaluated along the line: not one step by hand", f"{_kpa(h.drop)} kPa"))
        check = _isothermal_outlet(h.mass_flow, d, rho, line.pressure, f, length, h.fittings_k)
        if check is not None and not h.choked:
            g_flux = h.mass_flow / (math.pi * d * d / 4)
            rows.append(("outlet pressure (hand check: isothermal ideal gas, inlet f)",
                         "p₁² − p₂² = G² (p₁/ρ₁) [f (L + ΣK D/f)/D + 2 ln(p₁/p₂)]; G = m / (π D² / 4); "
                         "then less Δp_s and Δp_fixed",
                         f"G = {_q(g_flux)} kg/(m² s), p₁ = {_q(line.pressure)} Pa, ρ₁ = {_q(rho)}, f = {_q(f)}, "
                         f"L = {_q(length)}, ΣK = {_q(h.fittings_k)}, D = {_q(d)}; solved for p₂ by iteration",
                         f"{_kpa(check - h.static_drop - h.fixed_drop)} kPa abs"))
    else:
        rows.append(("pipe friction (Darcy-Weisbach)", "Δp_f = f (L/D) ρ v² / 2",
                     f"{_q(f)} × ({_q(length)} / {_q(d)}) × {_q(q)}",
                     f"{_kpa(h.drop)} kPa"))
        rows.append(("fittings", "Δp_k = (Σ K + f L_eq/D) ρ v² / 2",
                     f"{_q(h.fittings_drop / q if q else 0.0)} × {_q(q)}",
                     f"{_kpa(h.fittings_drop)} kPa"))
        rows.append(("static head", "Δp_s = ρ g Δz",
                     f"{_q(rho)} × 9.80665 × {_q(line.elevation)}", f"{_kpa(h.static_drop)} kPa"))
    parts = [_kpa(h.drop), _kpa(h.fittings_drop), _kpa(h.static_drop), _kpa(h.fixed_drop)]
    total_eq = "Δp = Δp_f + Δp_k + Δp_s + Δp_fixed"
    if marched:
        parts.append(_kpa(h.acceleration_drop))
        total_eq += " + Δp_acc"
    rows.append(("total drop", total_eq, " + ".join(parts), f"{_kpa(h.total_drop)} kPa"))
    if h.outlet_pressure is not None:
        rows.append(("outlet pressure", "p_out = p_in − Δp",
                     f"{_kpa(line.pressure)} − {_kpa(h.total_drop)}", f"{_kpa(h.outlet_pressure)} kPa abs"))
    return rows


def _isothermal_outlet(mass_flow: float, diameter: float, density: float, inlet: float, friction: float,
                       length: float, k_sum: float) -> float | None:
    """The outlet pressure of isothermal ideal-gas flow with one friction factor [Pa abs] (Crane TP-410's
    isothermal equation with the acceleration term), fittings as equivalent length K D/f: the hand check of a
    marched gas line. None when no outlet pressure satisfies it (choked) or the iteration does not settle."""
    if min(mass_flow, diameter, density, inlet, friction) <= 0:
        return None
    g_flux = mass_flow / (math.pi * diameter * diameter / 4)
    resistance = friction * (length + k_sum * diameter / friction) / diameter
    outlet = inlet
    for _ in range(200):
        square = inlet * inlet - g_flux * g_flux * inlet / density * (resistance + 2 * math.log(inlet / outlet))
        if square <= 0:
            return None
        new = math.sqrt(square)
        if abs(new - outlet) < 1e-9 * inlet:
            return new
        outlet = new
    return None


def _window(candidates: Sequence[CandidateResult], chosen: str | None) -> list[dict[str, Any]]:
    """One size below the selected one to two above (all rated sizes when none is selected)."""
    labels = [c.candidate.nps for c in candidates]
    at = labels.index(chosen) if chosen in labels else None
    shown = candidates if at is None else candidates[max(at - 1, 0):at + 3]
    rows = []
    for c in shown:
        h, worst = c.hydraulics, c.worst
        rows.append({"nps": c.candidate.nps, "schedule": c.candidate.schedule,
                     "id": _q(c.candidate.inside_diameter * 1e3), "velocity": _q(h.velocity),
                     "drop": _q(h.drop_per_length / 10.0), "reynolds": _q(h.reynolds),
                     "friction": _q(h.friction_factor), "regime": h.regime,
                     "worst": worst.criterion if worst else "-",
                     "utilisation": _pct(worst.utilisation if worst else None),
                     "result": "pass" if c.passed else "fail", "selected": c.candidate.nps == chosen})
    return rows


def _verdicts(case: LineResult) -> list[dict[str, str]]:
    return [{"criterion": v.criterion, "status": v.status, "value": _q(v.value), "limit": _q(v.limit),
             "unit": v.unit, "utilisation": _pct(v.utilisation), "reason": v.reason, "source": v.source}
            for v in (case.selected.verdicts if case.selected else ())]


def _line_view(result: LineResult, headers: Mapping[str, str], units: Mapping[str, str | None],
               plot: bool, number: int = 1, record: bool = True) -> dict[str, Any]:
    """The template's view of one line: its summary row, and its calculation record when ``record``."""
    from boresize.report.plot import line_plot_svg

    chosen = result.selected.candidate.nps if result.selected else None
    if not record:
        return {**_summary_view(result), "number": number, "record": False, "cases": [], "plot": None, "side": None}
    cases: list[dict[str, Any]] = [{"name": case_name(c) or "", "status": c.status, "error": c.error if result.cases else None,
              "given": _given(c, headers, units), "used": _used(c), "candidates": _window(c.candidates, chosen),
              "verdicts": _verdicts(c), "two_phase": _two_phase(c), "totals": _totals(c), "fittings": _fittings(c),
              "equations": _equations(c), "differs_from": None} for c in case_rows(result)]
    side = _side_by_side(case_rows(result), cases) if len(cases) > 1 else None
    for case in cases if side else ():  # the inputs and key results are in the side-by-side table
        case["given"], case["used"] = [], []
    return {**_summary_view(result), "number": number, "record": True, "cases": cases,
            "plot": line_plot_svg(result) if plot else None, "side": side}


def _summary_view(result: LineResult) -> dict[str, Any]:
    """A line's summary-table values (and what its record heading shows)."""
    sel = result.selected
    return {"tag": result.tag, "status": result.status, "mode": result.mode, "service": result.service or "-",
            "case_count": len(result.cases) or 1, "nps": sel.candidate.nps if sel else "",
            "schedule": sel.candidate.schedule if sel else "",
            "velocity": _sig(sel.hydraulics.velocity if sel else None, 4),
            "drop": _sig(sel.hydraulics.drop_per_length / 10.0 if sel else None, 4),
            "total": _sig(sel.hydraulics.total_drop / 1e3 if sel else None, 4),
            "fluid": result.line.fluid if result.line else "-",
            "flow": _sig(result.sizing_flow * 3600 if result.sizing_flow else None, 4),
            "pressure": _sig(result.line.pressure / 1e5 if result.line else None, 4),
            "temperature": "-" if result.line is None else f"{result.line.temperature - 273.15:.1f}",
            "controlling": _controlling(result), "utilisation": _pct(controlling_utilisation(result)[0]),
            "case": case_name(result) if result.cases else "", "governing": list(result.governing),
            "error": result.error, "notes": list(result.notes)}


def _union(lists: Sequence[Sequence[tuple[str, str, str]]]) -> list[tuple[str, str]]:
    """(name, unit) of every row of any case, in first-seen order."""
    seen: dict[tuple[str, str], None] = {}
    for rows in lists:
        for name, _, unit in rows:
            seen.setdefault((name, unit), None)
    return list(seen)


def _side_by_side(results: Sequence[LineResult], cases: Sequence[Mapping[str, Any]]) -> dict[str, Any]:
    """The cases of a line in one table, a column per case: the inputs as given, as used, and the key results at
    the selected size; rows whose values differ between cases are marked (``differs``)."""
    rows: list[dict[str, Any]] = []

    def add(section: str, name: str, unit: str, values: list[str]) -> None:
        rows.append({"section": section, "name": name, "unit": unit, "values": values,
                     "differs": len(set(values)) > 1})

    for section, key in (("input (as given)", "given"), ("as used", "used")):
        for name, unit in _union([c[key] for c in cases]):
            if name == "case":
                continue
            add(section, name, unit, [next((v for n, v, u in c[key] if (n, u) == (name, unit)), "")
                                      for c in cases])
    results_rows: list[tuple[str, str, Any]] = [
        ("status", "", lambda r: r.status),
        ("velocity", "m/s", lambda r: _sig(r.selected.hydraulics.velocity, 4) if r.selected else "-"),
        ("drop per length", "kPa/100 m",
         lambda r: _sig(r.selected.hydraulics.drop_per_length / 10.0, 4) if r.selected else "-"),
        ("total drop", "kPa", lambda r: _sig(r.selected.hydraulics.total_drop / 1e3, 4) if r.selected else "-"),
        ("outlet pressure", "bar abs", lambda r: _sig(r.selected.hydraulics.outlet_pressure / 1e5, 4)
         if r.selected and r.selected.hydraulics.outlet_pressure is not None else "-"),
        ("worst criterion", "", lambda r: f"{r.selected.worst.criterion} {_pct(r.selected.worst.utilisation)}"
         if r.selected and r.selected.worst else "-"),
    ]
    for name, unit, read in results_rows:
        add("at the selected size", name, unit, [str(read(r)) for r in results])
    return {"names": [c["name"] for c in cases], "statuses": [c["status"] for c in cases], "rows": rows}


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
                max_plots: int = MAX_PLOTS, document: DocumentBlock | None = None,
                max_records: int = MAX_RECORDS) -> str:
    """The report as one HTML string (no external files, scripts or fonts): every line in the summary table, the
    calculation records of at most ``max_records`` lines (failing and error lines first, then the first passing
    ones; the page says how many it left out), plots in the first ``max_plots`` records."""
    from boresize.optional import needs

    with needs("the HTML report"):
        from jinja2 import Environment, StrictUndefined

    from boresize.report.html_template import TEMPLATE

    by_field = {parse_header(h).field: h for h in headers or ()}
    kept = _kept_records(results, max_records)
    lines, plotted = [], 0
    for number, result in enumerate(results, start=1):
        record = number - 1 in kept
        lines.append(_line_view(result, by_field, units or {}, record and plotted < max_plots, number, record))
        plotted += record
    cautions = [f"{r.tag}: {note}" for r in results for note in r.notes]
    cautions += [r.error for r in results if r.error]
    if two_phase_count(results):
        cautions.insert(0, TWO_PHASE_CAUTION)
    if len(kept) > max_plots:
        cautions.append(f"plots are drawn in the first {max_plots} records only")
    left_out = _left_out_text(results, kept)  # shown under the summary line and above the records
    env = Environment(autoescape=True, undefined=StrictUndefined, trim_blocks=True, lstrip_blocks=True)
    return env.from_string(TEMPLATE).render(title=title, document=document.rows() if document else [],
                                            caution=CAUTION, summary=summary(results), lines=lines,
                                            cautions=cautions, two_phase_caution=TWO_PHASE_CAUTION,
                                            left_out=left_out,
                                            trace=_trace_rows(trace))


def _kept_records(results: Sequence[LineResult], limit: int) -> set[int]:
    """Indices of the lines whose records the page shows: all of them up to ``limit``; past it the failing and
    error lines first (in list order), then the first passing ones."""
    if len(results) <= limit:
        return set(range(len(results)))
    order = [i for i, r in enumerate(results) if r.status != "pass"] + [i for i, r in enumerate(results)
                                                                         if r.status == "pass"]
    return set(order[:max(limit, 0)])


def _left_out_text(results: Sequence[LineResult], kept: set[int]) -> str:
    """What the page leaves out, by status ('' when nothing)."""
    if len(kept) == len(results):
        return ""
    counts = {s: sum(1 for i, r in enumerate(results) if r.status == s and i not in kept)
              for s in ("pass", "fail", "error")}
    which = ", ".join(f"{n} {s}" for s, n in counts.items() if n)
    return (f"this page shows the calculation records of {len(kept)} of {len(results)} lines (failing and error "
            f"lines first, then the first passing ones); the records of {len(results) - len(kept)} "
            f"line{'' if len(results) - len(kept) == 1 else 's'} ({which}) "
            f"are left out: every line is in the summary table, and every record is in the JSON (--json, -o x.json) "
            f"and JSON Lines (-o x.jsonl) outputs")


def write_html(path: str | Path, results: Sequence[LineResult], **kwargs: Any) -> None:
    """Write :func:`render_html` to ``path`` (UTF-8)."""
    Path(path).write_text(render_html(results, **kwargs), encoding="utf-8")
