"""The sized line list as a plain-text table, with errors and the caution below it.

Every echoed text (tag, service, fluid source, messages) is shown with its control and format characters
escaped (:func:`boresize.report.printable.printable`): the table is for a terminal. The other outputs keep it exact.
"""

from __future__ import annotations

from collections.abc import Sequence

from boresize.io.document import CAUTION, TWO_PHASE_CAUTION, two_phase_count
from boresize.model import LineResult, bare_pressure_text
from boresize.report.printable import printable
from boresize.sizing.selection import controlling_utilisation

__all__ = ["render_table"]

COLUMNS = ("Tag", "Service", "Status", "NPS", "Sch", "ID mm", "v m/s", "dP kPa/100m", "rho kg/m3", "mu cP",
           "Controlling", "Source")


def _row(r: LineResult) -> tuple[str, ...]:
    sel, state = r.selected, r.state
    if sel is None or state is None:
        return (r.tag, r.service or "-", r.status.upper(), "-", "-", "-", "-", "-", "-", "-", "-", "-")
    h = sel.hydraulics
    controlling = _controlling(r)
    status = r.status.upper() + (" (check)" if r.mode == "check" else "")
    return (r.tag, r.service or "-", status, sel.candidate.nps, sel.candidate.schedule,
            f"{sel.candidate.inside_diameter * 1e3:.1f}", f"{h.velocity:.2f}", f"{h.drop_per_length / 10:.1f}",
            f"{state.density:.4g}", f"{state.viscosity * 1e3:.3g}", controlling, state.source)


def _controlling(r: LineResult) -> str:
    """The controlling criterion with its utilisation at the size shown (and, for a line with several cases,
    the case where that utilisation is highest); "smallest size" when the smallest size was selected."""
    if r.controlling is None:
        return "smallest size" if r.status == "pass" and r.mode == "size" else "-"
    utilisation, case = controlling_utilisation(r)
    shown = r.controlling + (f" {utilisation:.0%}" if utilisation is not None else "")
    return shown + (f" ({case})" if case else "")


def render_table(results: Sequence[LineResult], criteria_source: str, criteria_set: str) -> str:
    """The table, the summary naming the criteria file and set, failures, errors and notes, the caution."""
    rows = [COLUMNS] + [tuple(printable(cell) for cell in _row(r)) for r in results]
    widths = [max(len(row[i]) for row in rows) for i in range(len(COLUMNS))]
    out = ["  ".join(cell.ljust(w) for cell, w in zip(row, widths)).rstrip() for row in rows]
    out.insert(1, "  ".join("-" * w for w in widths))
    counts = {s: sum(1 for r in results if r.status == s) for s in ("pass", "fail", "error")}
    out.append("")
    out.append(f"{len(results)} line{'' if len(results) == 1 else 's'}: {counts['pass']} pass, {counts['fail']} fail, {counts['error']} error"
               f"{bare_pressure_text(results)}   "
               f"(criteria: {printable(criteria_source)}, set {printable(criteria_set)})")
    details = [r for r in results if r.status != "pass" or r.notes]
    for r in details:
        if r.error:
            out.append(f"  ERROR {printable(r.error)}")
            continue
        failing = [v for v in (r.selected.verdicts if r.selected else ()) if v.status in ("fail", "error")]
        for v in failing:
            out.append(printable(f"  {r.status.upper()} {r.tag}: {v.criterion}: {v.reason}"))
        for note in r.notes:
            out.append(printable(f"  note {r.tag}: {note}"))
    out.append("")
    out.append("CAUTION: " + CAUTION)
    two_phase = two_phase_count(results)
    if two_phase:
        out.append(f"CAUTION ({two_phase} two-phase line{'s' if two_phase > 1 else ''}): " + TWO_PHASE_CAUTION)
    return "\n".join(out) + "\n"
