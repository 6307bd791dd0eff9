"""Results as rows for spreadsheets: the input columns as given, then boresize's result columns.

One row per input row, in input order by line: a line with several operating cases gives one row
per case (each keeps its input cells), all showing the line's selected size and each its own
hydraulics. Result headers start with ``result.`` so that the readers skip them when the file is read
back as a line list. A second table lists every rated candidate of every line and case.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

from boresize.io.csv_reader import RESULT_PREFIX
from boresize.io.document import sheet_values
from boresize.io.rows import parse_header
from boresize.model import LineResult

__all__ = ["RESULT_COLUMNS", "CANDIDATE_HEADERS", "case_name", "case_rows", "input_headers", "result_rows",
           "candidate_rows", "input_fields", "line_rows", "result_head"]

#: (header, key of the case's JSON entry); the line's own status and size come first.
RESULT_COLUMNS: tuple[tuple[str, str], ...] = (
    ("status", "line_status"), ("case status", "status"), ("mode", "mode"), ("nps", "nps"),
    ("schedule", "schedule"), ("inside diameter [mm]", "inside_diameter_mm"), ("velocity [m/s]", "velocity_m_s"),
    ("drop per length [kPa/100 m]", "dp_kpa_per_100m"), ("total drop [kPa]", "total_drop_kpa"),
    ("outlet pressure [bar abs]", "outlet_pressure_bar_abs"), ("density [kg/m3]", "density_kg_m3"),
    ("viscosity [mPa s]", "viscosity_mpa_s"), ("controlling", "controlling"), ("utilisation", "utilisation"),
    ("governs", "governs"), ("service", "service"), ("criteria set", "criteria_set"),
    ("property source", "property_source"), ("phase", "phase"), ("vapour fraction", "vapour_fraction"),
    ("flow regime", "flow_regime"), ("two-phase method", "two_phase_method"), ("liquid holdup", "liquid_holdup"),
    ("superficial liquid velocity [m/s]", "superficial_liquid_velocity_m_s"),
    ("superficial gas velocity [m/s]", "superficial_gas_velocity_m_s"),
    ("mixture density [kg/m3]", "mixture_density_kg_m3"), ("notes", "notes"), ("error", "error"),
)
CANDIDATE_HEADERS = ("tag", "case", "nps", "schedule", "inside diameter [mm]", "velocity [m/s]",
                     "drop per length [kPa/100 m]", "reynolds", "friction factor", "regime", "passes",
                     "selected", "worst criterion", "worst utilisation", "failing")


def case_rows(result: LineResult) -> list[LineResult]:
    """The results that map one to one onto input rows: the cases, or the line itself."""
    return list(result.cases) if result.cases else [result]


def case_name(result: LineResult) -> str | None:
    """The case a result belongs to (from the line, or from the row when the row could not be read)."""
    if result.line is not None and result.line.case:
        return result.line.case
    return result.raw.get("case") or None


def input_headers(results: Sequence[LineResult], headers: Sequence[str] | None = None) -> list[str]:
    """The input headers as given, or (no line list at hand) the fields of the rows in order of appearance."""
    if headers:
        return list(headers)
    fields: dict[str, None] = {"tag": None}
    for result in results:
        for row in case_rows(result):
            fields.update(dict.fromkeys(row.raw))
    return list(fields)


def _input_cells(result: LineResult, fields: Sequence[str]) -> list[str]:
    raw = result.raw or {"tag": result.tag, "case": case_name(result) or ""}
    return [raw.get(name, "") for name in fields]


def _result_cells(line: LineResult, case: LineResult) -> list[Any]:
    entry = sheet_values(case)  # not the whole record: a row shows these few keys
    entry["line_status"] = line.status
    entry["nps"], entry["schedule"] = (line.selected.candidate.nps, line.selected.candidate.schedule) \
        if line.selected else (entry["nps"], entry["schedule"])
    name = case_name(case)
    entry["governs"] = "; ".join(c for c, governing in line.governing if governing == name) if line.cases else ""
    entry["notes"] = "; ".join(entry.get("notes") or ())
    return [entry.get(key) for _, key in RESULT_COLUMNS]


def result_rows(results: Sequence[LineResult],
                headers: Sequence[str] | None = None) -> tuple[list[str], list[list[Any]]]:
    """Header row and one row per input row: input cells (text as given) then result cells."""
    shown = input_headers(results, headers)
    fields = input_fields(shown)
    table = []
    for line in results:
        table += line_rows(line, fields)
    return result_head(shown), table


def input_fields(shown: Sequence[str]) -> list[str]:
    """The field each input header names (``"length [m]"`` -> ``length``)."""
    return [parse_header(h).field for h in shown]


def result_head(shown: Sequence[str]) -> list[str]:
    """The header row: the input headers shown, then the result columns."""
    return list(shown) + [RESULT_PREFIX + name for name, _ in RESULT_COLUMNS]


def line_rows(line: LineResult, fields: Sequence[str]) -> list[list[Any]]:
    """One line's rows (one per case): its input cells for ``fields`` then its result cells."""
    return [_input_cells(case, fields) + _result_cells(line, case) for case in case_rows(line)]


def _candidate_row(tag: str, case: str, selected: str | None, c: Any) -> list[Any]:
    h, worst = c.hydraulics, c.worst
    failing = "; ".join(v.criterion for v in c.verdicts if v.status in ("fail", "error"))
    return [tag, case, c.candidate.nps, c.candidate.schedule, c.candidate.inside_diameter * 1e3, h.velocity,
            h.drop_per_length / 10.0, h.reynolds, h.friction_factor, h.regime, "yes" if c.passed else "no",
            "yes" if c.candidate.nps == selected else "", worst.criterion if worst else "",
            worst.utilisation if worst else None, failing]


def candidate_rows(results: Sequence[LineResult]) -> tuple[list[str], list[list[Any]]]:
    """Every rated candidate of every line and case, smallest first."""
    table = []
    for line in results:
        selected = line.selected.candidate.nps if line.selected else None
        for case in case_rows(line):
            table += [_candidate_row(line.tag, case_name(case) or "", selected, c) for c in case.candidates]
    return list(CANDIDATE_HEADERS), table
