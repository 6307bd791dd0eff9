"""Texts agree with the numbers beside them: every number a reason, method text, note, the terminal table or the
HTML report states next to a reported value is read back out of the text and compared with that value at the
text's own precision.

Each template is a regular expression with named groups; a group's getter gives the reported value it must equal
(the verdict's value or limit, the hydraulics, the fluid state). The lines are varied so that every built-in
criterion and every branch of its text is met: liquid, gas rated by the simple method, a marched gas line, a gas
line not marched because it already fails, a choked line, a pump suction, a bubble-point suction, a gravity
drain, a line with a minimum velocity, one in the friction transition zone, a failing check and a line with two
operating cases.
"""

from __future__ import annotations

import re
from collections.abc import Callable
from dataclasses import replace

import pytest

from boresize.hydraulics.friction import LAMINAR_LIMIT, TURBULENT_LIMIT
from boresize.io.document import result_to_dict
from boresize.io.rows import line_from_row
from boresize.model import CandidateResult, LineResult, Verdict
from boresize.report.html import render_html
from boresize.report.terminal import COLUMNS, render_table
from boresize.sizing.engine import Sizer
from boresize.sizing.selection import SMALLEST_NOTE, controlling_utilisation

N = r"-?[0-9][0-9.]*(?:e[-+]?[0-9]+)?"  # a number as Python's g and f formats print it
WATER = {"fluid": "water", "pressure": "5 barg", "temperature": "20 degC", "length": "100 m"}
METHANE = {"fluid": "methane", "pressure": "20 bar", "temperature": "20 degC"}
ROWS: dict[str, dict[str, str]] = {
    "liquid": {**WATER, "flow": "60 t/h", "fittings": "elbow-90-lr: 4; gate: 2"},
    "liquid-own-margin": {**WATER, "flow": "60 t/h", "design_margin": "12.5 %"},
    "minimum-velocity": {**WATER, "flow": "60 t/h", "service": "cooling-water", "nps": "8"},
    "transition": {**WATER, "flow": "130 kg/h", "nps": "1/2"},
    "smallest": {**WATER, "flow": "10 kg/h"},
    "failing-check": {**WATER, "flow": "60 t/h", "nps": "2", "min_outlet_pressure": "4 barg"},
    "gas-simple": {**METHANE, "flow": "2 t/h", "length": "50 m"},
    "gas-marched": {**METHANE, "flow": "8 t/h", "length": "10 km", "nps": "6", "min_outlet_pressure": "12 bar"},
    "gas-not-marched": {**METHANE, "flow": "8 t/h", "length": "10 km", "nps": "3"},
    "gas-choked": {**METHANE, "flow": "20 t/h", "length": "2 km", "nps": "2"},
    "gas-by-pressure": {**METHANE, "flow": "5 t/h", "length": "100 m", "service": "gas-by-pressure"},
    "pump-suction": {**WATER, "flow": "30 t/h", "length": "15 m", "service": "pump-suction", "pressure": "1.2 bar",
                     "source_pressure": "1.2 bar", "liquid_level": "3 m", "npsh_required": "2.5 m"},
    "bubble-point": {"fluid": "propane", "flow": "30 t/h", "pressure": "10 bar", "temperature": "20 degC",
                     "length": "20 m", "elevation": "-5 m", "service": "pump-suction-bubble-point",
                     "liquid_level": "4 m", "npsh_required": "2 m"},
    "gravity-drain": {**WATER, "flow": "20 m3/h", "length": "30 m", "elevation": "-4 m", "service": "gravity-drain"},
}

Getter = Callable[[LineResult, CandidateResult, Verdict], float | None]
#: criterion id -> [(pattern, {group: (getter, format spec)})]; every pattern must match the verdict's reason
#: (a pattern starting with "?" only where it applies: when the text has that part).
_V: Getter = lambda r, c, v: v.value  # noqa: E731
_L: Getter = lambda r, c, v: v.limit  # noqa: E731
_RHO: Getter = lambda r, c, v: r.state.density if r.state else None  # noqa: E731
#: the density where a velocity-type criterion judged: the worst point of a marched gas line, else the inlet's
_RHO_AT: Getter = lambda r, c, v: c.hydraulics.peak_density if c.hydraulics.peak_density is not None else _RHO(r, c, v)  # noqa: E731
_BAR = 1e5


def _range(noun: str, unit: str) -> list[tuple[str, dict[str, tuple[Getter, str]]]]:
    """judge_range: "<noun> <value> <unit> above the maximum <limit>" / "below the minimum" / "is at most/least"."""
    return [(rf"^{noun} (?P<value>{N}) {re.escape(unit)}", {"value": (_V, ".3g")}),
            (rf"?(?:above the maximum|below the minimum) (?P<limit>{N}) {re.escape(unit)}", {"limit": (_L, ".3g")})]


TEMPLATES: dict[str, list[tuple[str, dict[str, tuple[Getter, str]]]]] = {
    "velocity": _range("velocity", "m/s"),
    "drop-per-length": _range("drop", "kPa/100 m"),
    "momentum": _range(r"rho\*v\^2", "Pa"),
    "mach": [(rf"^Mach number (?:at the (?:inlet|outlet) )?(?P<value>{N})", {"value": (_V, ".3g")})],
    "erosional": [(rf"^velocity (?P<v>{N}) m/s (?:within|above) the erosional velocity (?P<limit>{N}) m/s "
                   rf"\(C = {N} US units, rho = (?P<rho>{N}) kg/m3\)",
                   {"v": (_V, ".3g"), "limit": (_L, ".3g"), "rho": (_RHO_AT, ".4g")})],
    "noise-velocity": [(rf"^velocity (?P<v>{N}) m/s (?:within|above) the noise limit (?P<limit>{N}) m/s "
                        rf"\(.* at rho = (?P<rho>{N}) kg/m3\)",
                        {"v": (_V, ".3g"), "limit": (_L, ".3g"), "rho": (_RHO_AT, ".4g")})],
    "flashing": [(rf"^lowest pressure (?P<low>{N}) bar abs at the .* vapour/bubble pressure (?P<pv>{N}) bar abs",
                  {"low": (_V, ".4g"), "pv": (lambda r, c, v: _pvap(r), ".4g")})],
    "npsh-margin": [(rf"^NPSH available (?P<a>{N}) m (?:meets|is below) the (?P<n>{N}) m needed \(NPSHr (?P<r>{N}) m",
                     {"a": (_V, ".3g"), "n": (_L, ".3g"),
                      "r": (lambda r, c, v: r.line.npsh_required if r.line else None, ".3g")}),
                    (rf"suction losses (?P<loss>{N}) m",
                     {"loss": (lambda r, c, v: _suction_losses(r, c), ".3g")})],
    "outlet-pressure": [(rf"?^outlet pressure (?P<out>{N}) bar abs (?:below|is at least) the minimum (?P<min>{N}) bar",
                         {"out": (lambda r, c, v: (c.hydraulics.outlet_pressure or 0.0) / _BAR, ".4g"),
                          "min": (_L, ".4g")}),
                        (rf"?total drop (?P<total>{N}) bar",
                         {"total": (lambda r, c, v: c.hydraulics.total_drop / _BAR, ".4g")}),
                        (rf"?friction (?P<f>{N})", {"f": (lambda r, c, v: c.hydraulics.drop / _BAR, ".3g")}),
                        (rf"?static (?P<s>{N})", {"s": (lambda r, c, v: c.hydraulics.static_drop / _BAR, ".3g")})],
    "property-crosscheck": [(rf"^(?:density|viscosity|vapour pressure|bubble pressure) differs by (?P<v>{N}) %",
                             {"v": (_V, ".3g")}),
                            (rf"?above the fail limit (?P<limit>{N}) %", {"limit": (_L, ".3g")}),
                            (rf"?^density differs by {N} %, [^:]*: (?P<rho>{N}) kg/m3 from",
                             {"rho": (_RHO, ".5g")}),
                            (rf"?^viscosity differs by {N} %, [^:]*: (?P<mu>{N}) mPa s from",
                             {"mu": (lambda r, c, v: r.state.viscosity * 1e3 if r.state else None, ".5g")})],
    "gravity-drain": [(rf"^Froude number (?P<fr>{N}) on the full bore: .* \(self-venting up to (?P<lim>{N}),",
                       {"fr": (_V, ".3g"), "lim": (_L, ".3g")}),
                      (rf"the line carries (?P<q>{N}) m3/h$",
                       {"q": (lambda r, c, v: c.hydraulics.volume_flow * 3600, ".4g")})],
}


def _pvap(result: LineResult) -> float | None:
    state = result.state
    if state is None:
        return None
    pressure = state.bubble_pressure if state.bubble_pressure is not None else state.vapour_pressure
    return None if pressure is None else pressure / _BAR


def _suction_losses(result: LineResult, c: CandidateResult) -> float | None:
    h, state = c.hydraulics, result.state
    return None if state is None else (h.drop + h.fittings_drop + h.fixed_drop) / (state.density * 9.80665)


def _agree(text: str, expected: float | None, spec: str) -> bool:
    """The number ``text`` reads as ``expected`` formatted at the text's precision ``spec``."""
    return expected is not None and float(text) == float(format(expected, spec))


@pytest.fixture(scope="module")
def results(sizer: Sizer, tmp_path_factory: pytest.TempPathFactory) -> dict[str, LineResult]:
    out = {name: sizer.run(line_from_row({"tag": name, **row})) for name, row in ROWS.items()}
    cases = [line_from_row({"tag": "two-cases", **WATER, "flow": flow, "case": case})
             for flow, case in (("40 t/h", "normal"), ("70 t/h", "maximum"))]
    out["two-cases"] = sizer.run_cases(cases)
    # A marched line that chokes: a service judging the outlet alone, so that no criterion stops the march.
    criteria = tmp_path_factory.mktemp("criteria") / "outlet-only.toml"
    criteria.write_text('[service.gas]\nphase = "gas"\noutlet-pressure = {}\n', encoding="utf-8")
    choking = {"tag": "gas-marched-choked", **METHANE, "flow": "20 t/h", "length": "2 km", "nps": "3"}
    out["gas-marched-choked"] = Sizer(sizer.host, criteria_file=criteria).run(line_from_row(choking))
    # property-crosscheck is in no shipped service (opt-in): a service of its own.
    checked = tmp_path_factory.mktemp("criteria") / "crosschecked.toml"
    checked.write_text('[service.checked]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\n'
                       'property-crosscheck = {}\n', encoding="utf-8")
    crosschecked = {"tag": "crosschecked", **WATER, "flow": "60 t/h", "service": "checked"}
    out["crosschecked"] = Sizer(sizer.host, criteria_file=checked).run(line_from_row(crosschecked))
    for name, result in out.items():
        assert result.status in ("pass", "fail"), (name, result.error)
    return out


def _rated(results: dict[str, LineResult]) -> list[tuple[str, LineResult, CandidateResult]]:
    """Every rated candidate of every line and case, with the result it belongs to."""
    out = []
    for name, result in results.items():
        for each in result.cases or (result,):
            out += [(name, each, c) for c in each.candidates]
    return out


def _marched(c: CandidateResult) -> bool:
    return c.hydraulics.method.startswith(("isothermal", "adiabatic"))


def test_every_built_in_criterion_is_met(results):
    met = {v.criterion for _, _, c in _rated(results) for v in c.verdicts if v.status in ("pass", "fail", "warn")}
    assert set(TEMPLATES) <= met, set(TEMPLATES) - met
    assert any(v.status == "fail" and v.criterion == "velocity" and "minimum" in v.reason
               for _, _, c in _rated(results) for v in c.verdicts)


def test_verdict_reasons_state_the_reported_values(results):
    checked = 0
    for name, result, c in _rated(results):
        for v in c.verdicts:
            if v.status not in ("pass", "fail", "warn") or v.criterion not in TEMPLATES:
                continue
            if v.reason.startswith("choked flow"):
                continue  # no value stated beside a limit: the choking texts are checked below
            for pattern, groups in TEMPLATES[v.criterion]:
                optional = pattern.startswith("?")
                match = re.search(pattern.lstrip("?"), v.reason)
                if match is None:
                    assert optional, f"{name} NPS {c.candidate.nps} {v.criterion}: {v.reason!r} !~ {pattern!r}"
                    continue
                for group, (getter, spec) in groups.items():
                    expected = getter(result, c, v)
                    assert _agree(match[group], expected, spec), \
                        f"{name} NPS {c.candidate.nps} {v.criterion}: {group} {match[group]} != {expected} ({v.reason})"
                    checked += 1
    assert checked > 100


def test_limits_in_range_reasons_agree_with_the_status(results):
    for _, _, c in _rated(results):
        for v in c.verdicts:
            if v.criterion in ("velocity", "drop-per-length", "momentum") and v.status in ("pass", "fail"):
                limit_named = "above the maximum" in v.reason or "below the minimum" in v.reason
                choked = c.hydraulics.choked and v.reason.startswith("choked flow: ")  # no drop carries the flow
                assert (limit_named or choked) == (v.status == "fail"), v.reason
            if v.criterion in ("erosional", "noise-velocity"):
                assert (" within " in v.reason) == (v.status == "pass"), v.reason
            if v.criterion == "flashing" and v.status != "not-applicable":
                assert ("(above " in v.reason) == (v.status == "pass"), v.reason


def test_mach_text_names_where_its_value_is(results):
    # The speed of sound at the inlet is the fluid state's; the outlet Mach number the march's.
    marched = []
    for name, result, c in _rated(results):
        for v in c.verdicts:
            if v.criterion != "mach" or v.status == "not-applicable":
                continue
            where = re.search(r"^Mach number at the inlet|at the inlet$|at the outlet|m from the inlet|"
                              r"where the flow chokes", v.reason)
            assert where is not None, v.reason
            h, state = c.hydraulics, result.state
            at_peak = h.peak_mach is not None and not where[0].endswith("at the inlet")  # the worst point of a marched line
            expected = h.peak_mach if at_peak else h.velocity / state.speed_of_sound
            (marched if _marched(c) else []).append((name, c.candidate.nps, v.reason, expected, v.value))
            if not _marched(c):
                assert v.value == pytest.approx(expected, rel=1e-9), (name, v.reason)
    assert marched, "no marched gas candidate was judged for Mach"
    wrong = [m for m in marched if m[4] != pytest.approx(m[3], rel=1e-9)]
    assert not wrong, wrong


_SIMPLE = re.compile(rf"drop (?P<x>{N})% of inlet pressure, within the (?P<lim>{N})% limit")
_MARCHED = re.compile(rf"the incompressible drop is (?P<x>{N})% of inlet pressure, above the (?P<lim>{N})% limit")


def test_method_texts_state_the_drop_fraction_and_its_limit(results):
    wrong = []
    for name, result, c in _rated(results):
        h, line = c.hydraulics, result.line
        simple, marched = _SIMPLE.search(h.method), _MARCHED.search(h.method)
        assert not (simple and marched)
        if marched:
            assert float(marched["x"]) > float(marched["lim"]), h.method
            choked = re.search(r"CHOKED (?P<at>[\d,.]+) m from the inlet, of (?P<of>[\d,.]+) m of pipe", h.method)
            assert (choked is not None) == h.choked, h.method
            if choked:
                assert float(choked["at"].replace(",", "")) < float(choked["of"].replace(",", ""))
        elif simple:
            fraction = (h.drop + h.fittings_drop + h.static_drop) / line.pressure * 100.0
            assert _agree(simple["x"], fraction, ".1f"), (name, h.method, fraction)
            if float(simple["x"]) > float(simple["lim"]):
                wrong.append((name, c.candidate.nps, h.method))
    assert not wrong, wrong  # "within the limit" only where the drop is within it


def test_notes_state_the_reported_values(results, sizer):
    smallest = sizer.config.pipe_class("default").candidates()[0].nps
    seen = set()
    for name, result in results.items():
        shown = result.selected
        for note in result.notes:
            band = re.search(rf"transition zone \((?P<lo>{N})-(?P<hi>{N})\)", note)
            if band:
                seen.add("transition")
                assert (float(band["lo"]), float(band["hi"])) == (LAMINAR_LIMIT, TURBULENT_LIMIT)
                assert LAMINAR_LIMIT <= shown.hydraulics.reynolds < TURBULENT_LIMIT, name
            closest = re.search(r"closest is NPS (\S+)$", note)
            if closest:
                assert closest[1] == shown.candidate.nps
            if note == SMALLEST_NOTE.format(nps=smallest):
                seen.add("smallest")
                assert shown.candidate.nps == smallest and result.controlling is None
            passing = re.search(r"that passes is NPS (\S+)$", note)
            if passing:
                seen.add("smallest-passing")
                assert passing[1] == result.smallest_passing_nps
        if shown is not None and shown.hydraulics.regime == "transition" and not result.cases:
            assert any("transition zone" in n for n in result.notes), name
    assert seen == {"transition", "smallest", "smallest-passing"}
    assert any(r.selected.hydraulics.choked for r in results.values()), "no choked line among the lines"


def test_terminal_table_states_the_reported_values(results, sizer):
    table = render_table(list(results.values()), sizer.config.origin, sizer.config.version)
    lines = table.splitlines()
    starts = [lines[0].index(column) for column in COLUMNS]
    rows = {}
    for text in lines[2:2 + len(results)]:
        cells = [text[a:b].strip() for a, b in zip(starts, starts[1:] + [None])]
        rows[cells[0]] = dict(zip(COLUMNS, cells))
    for name, result in results.items():
        row, sel, state = rows[name], result.selected, result.state
        h = sel.hydraulics
        assert row["NPS"] == sel.candidate.nps
        for column, value, spec in (("ID mm", sel.candidate.inside_diameter * 1e3, ".1f"), ("v m/s", h.velocity, ".2f"),
                                    ("dP kPa/100m", h.drop_per_length / 10, ".1f"), ("rho kg/m3", state.density, ".4g"),
                                    ("mu cP", state.viscosity * 1e3, ".3g")):
            assert _agree(row[column], value, spec), (name, column, row[column], value)
        controlling = re.fullmatch(rf"(?P<c>\S+) (?P<u>{N})%(?: \((?P<case>[^)]+)\))?", row["Controlling"])
        if result.controlling is None:
            assert row["Controlling"] in ("smallest size", "-"), (name, row)
            continue
        assert controlling is not None and controlling["c"] == result.controlling, (name, row["Controlling"])
        utilisation, case = controlling_utilisation(result)
        assert _agree(controlling["u"], utilisation * 100, ".0f"), (name, row["Controlling"], utilisation)
        assert controlling["case"] == case
        if case is not None:  # the case named is the one where the controlling criterion's utilisation is highest
            assert dict(result.governing)[result.controlling] == case


def test_record_and_html_state_the_reported_values(results):
    for name, result in results.items():
        entry = result_to_dict(result)
        assert entry["controlling"] == result.controlling
        assert entry["design_margin"] == result.design_margin
        assert entry["smallest_passing_nps"] == result.smallest_passing_nps
        for verdict, shown in zip(result.selected.verdicts, entry["verdicts"]):
            assert shown["reason"] == verdict.reason
    page = render_html(list(results.values()), trace={}, title="texts")
    # a line of several cases shows its margins side by side: the label, an empty unit cell, then one cell per case
    margins = re.findall(rf"design margin</td>\s*(?:<td></td>\s*)?<td[^>]*>(?P<m>{N}) % \(the (line|service)&#39;s\)", page)
    assert len(margins) >= len(results)
    expected = [r.design_margin for r in results.values()]
    assert {float(m) for m, _ in margins} == {float(format(m * 100, ".3g")) for m in expected}
    own = [m for m, whose in margins if whose == "line"]
    assert own == ["12.5"]
    summary = re.findall(r'<tr><td class="tag"><a href="#line-\d+">([^<]+)</a>.*?<td class="num">[^<]*</td><td>([^<]*)</td>'
                         r'<td class="num">([^<]*)</td>', page, flags=re.S)
    assert len(summary) == len(results)
    for tag, controlling, utilisation in summary:
        result = results[tag]
        if result.controlling is None:
            assert controlling.startswith(("none (the smallest size", "-")) and utilisation == "-", (tag, controlling)
            continue
        assert controlling == result.controlling
        assert utilisation == format(controlling_utilisation(result)[0], ".0%"), (tag, utilisation)


def test_a_failing_check_names_the_smallest_passing_size_as_sizing_selects(results, sizer):
    failing = results["failing-check"]
    assert failing.status == "fail" and failing.mode == "check"
    sized = sizer.run(line_from_row({"tag": "sized", **{k: v for k, v in ROWS["failing-check"].items() if k != "nps"}}))
    assert sized.status == "pass" and failing.smallest_passing_nps == sized.selected.candidate.nps




def test_headroom_note_states_the_window(results, sizer):
    from boresize.sizing.headroom import find_headroom, headroom_to_dict

    line = results["minimum-velocity"].line
    room = find_headroom(sizer, replace(line, nps="4"))
    entry = headroom_to_dict(room)
    window = re.search(rf"passes from (?P<lo>{N}) % to (?P<hi>{N}) % of the design flow", room.note)
    assert window is not None, room.note
    assert _agree(window["hi"], 100.0 + room.percent, ".4g") and _agree(window["lo"], 100.0 - room.decrease_percent, ".4g")
    assert float(window["hi"]) == pytest.approx(100.0 + entry["headroom_percent"], rel=1e-3)
    assert float(window["lo"]) == pytest.approx(100.0 - entry["headroom_decrease_percent"], rel=1e-3)


def test_diff_states_the_controlling_criterion_with_its_own_utilisation(results):
    from boresize.report.diff import compare

    for name in ("liquid", "two-cases"):
        result = results[name]
        new = result_to_dict(result)
        old = {**new, "nps": "1"}  # a revision where the line was one size smaller
        change = next(c for c in compare({"lines": [old]}, {"lines": [new]}).changes if c.kind == "size")
        utilisation, case = controlling_utilisation(result)
        stated = re.search(rf"now controlled by (?P<c>\S+) (?P<u>{N})%(?: in case (?P<case>.+))?$", change.reason)
        assert stated is not None, change.reason
        assert stated["c"] == result.controlling and _agree(stated["u"], utilisation * 100, ".0f"), change.reason
        assert stated["case"] == case
