"""Built-in criteria are ordinary plugins: the sizing core knows of a criterion only what it declares.

A company plugin re-registers every built-in criterion under its own id (``company-velocity``, ...) and a
criteria file uses only those ids. Sizing the demo unit and a varied list with it must select the same sizes
AND rate the same number of candidates per line as the built-ins: the guided scan, its starting diameter,
and the record's first guess treat the company criteria exactly like the built-ins.
"""

from __future__ import annotations

import json
import tomllib
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import replace
from importlib import resources
from pathlib import Path
from typing import Any

import pytest

from boresize.api import make_line
from boresize.criteria.base import CriterionContext
from boresize.criteria.feasibility import FEASIBILITY_ID
from boresize.hookspecs import hookimpl
from boresize.io.read import read_line_list
from boresize.io.rows import line_from_row
from boresize.model import FluidState, Line, LineResult, Verdict
from boresize.plugins import PluginHost
from boresize.registry import CriterionRegistry
from boresize.sizing.engine import Sizer
from boresize.sizing.services import SERVICE_KEYS, SHIPPED_SETS

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
PREFIX = "company-"


class CompanyPlugin:
    """A test-only plugin: registers the criteria it is given through the hook every plugin uses."""

    def __init__(self, criteria: Iterable[Any]) -> None:
        self.criteria = tuple(criteria)

    @hookimpl
    def boresize_register_criteria(self, register: CriterionRegistry) -> None:
        for criterion in self.criteria:
            register.add(criterion)


def _builtins() -> list[Any]:
    """The built-in rules a company may re-register; not line-feasibility, which every service gets whatever
    its file says (sizing.services)."""
    host = PluginHost.load(load_entry_points=False)
    return [host.criteria.get(ident) for ident in host.criteria.ids() if ident != FEASIBILITY_ID]


def _subclassed() -> list[Any]:
    """Each built-in subclassed under the company's id: it inherits the built-in's declared traits."""
    return [type(f"Company{type(c).__name__}", (type(c),), {"id": PREFIX + c.id})() for c in _builtins()]


class Wrapped:
    """A company criterion that wraps a built-in (no inheritance from boresize's Criterion) and declares no
    trait: the core must treat it as unknown (rate every size when it fails)."""

    def __init__(self, inner: Any) -> None:
        self.inner = inner
        self.id, self.title, self.phases = PREFIX + inner.id, f"company {inner.title}", inner.phases
        self.source, self.options = f"company, after {inner.source}", inner.options

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check = getattr(self.inner, "check_options", None)  # optional in the protocol (flow-regime has none)
        if check is not None:
            check(values, where)

    def evaluate(self, context: CriterionContext) -> Verdict:
        return replace(self.inner.evaluate(context), criterion=self.id, source=self.source)


#: What the company says of each rule, written out by the company (not read from the built-ins): (size trend,
#: whether it gives the record's first guess)
COMPANY_TRAITS = {
    "velocity": ("falls-with-size", False),
    "drop-per-length": ("falls-with-size", True),
    "erosional": ("larger-passes", False),
    "momentum": ("larger-passes", False),
    "noise-velocity": ("larger-passes", False),
    "mach": ("larger-passes", False),
    "gravity-drain": ("larger-passes", False),
    "npsh-margin": ("larger-passes", False),
    "flashing": ("larger-passes", False),
    "outlet-pressure": ("larger-passes", False),
    "property-crosscheck": ("larger-passes", False),
    "flow-regime": (None, False),  # the regime moves both ways with the bore: no trend to declare
}


class Declared(Wrapped):
    """The wrapper with the company's own declaration of every trait."""

    def __init__(self, inner: Any) -> None:
        super().__init__(inner)
        self.size_trend, self.proposes_first_guess = COMPANY_TRAITS[inner.id]

    def diameter_at_limit(self, options: Mapping[str, float], line: Line, state: FluidState, mass_flow: float,
                          roughness: float) -> float | None:
        return self.inner.diameter_at_limit(options, line, state, mass_flow, roughness)  # type: ignore[no-any-return]


def _toml(value: Any) -> str:
    """A value of a criteria file as TOML (strings, numbers, flags, inline tables and lists of them)."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    if isinstance(value, str):
        return json.dumps(value)
    if isinstance(value, Mapping):
        return "{ " + ", ".join(f"{json.dumps(k)} = {_toml(v)}" for k, v in value.items()) + " }"
    return "[" + ", ".join(_toml(item) for item in value) + "]"


def _company_criteria_file(folder: Path) -> Path:
    """The shipped sets and the demo unit's criteria file in one file, every criterion id renamed to the company's."""
    documents = [tomllib.loads(resources.files("boresize.criteria").joinpath("sets", name).read_text("utf-8"))
                 for name in SHIPPED_SETS]
    demo = tomllib.loads((DEMO / "criteria.toml").read_text("utf-8"))
    services: dict[str, dict[str, Any]] = {}
    for document in (*documents, demo):
        services.update(document.get("service", {}))
    text = ['name = "company"', 'version = "test"']
    for name, table in demo.get("pipe_class", {}).items():
        text += [f"[pipe_class.{json.dumps(name)}]", *(f"{k} = {_toml(v)}" for k, v in table.items())]
    for name, table in services.items():
        text.append(f"[service.{json.dumps(name)}]")
        text += [f"{json.dumps(k if k in SERVICE_KEYS else PREFIX + k)} = {_toml(v)}" for k, v in table.items()]
    path = folder / "company.toml"
    path.write_text("\n".join(text) + "\n", encoding="utf-8")
    return path


def _demo_lines() -> list[list[Line]]:
    """The demo unit's line list, one list of cases per line, in file order."""
    listed = read_line_list(DEMO / "lines.csv")
    lines: dict[str, list[Line]] = {}
    for position, row in enumerate(listed.rows, start=2):
        line = line_from_row(row, listed.units, position)
        lines.setdefault(line.tag, []).append(line)
    return list(lines.values())


def _varied_lines() -> list[list[Line]]:
    """Gas lines (marched, banded by pressure, low-pressure vapour, steam) and liquid lines (pump suctions,
    a velocity minimum, a gravity drain, a checked size), one case each."""
    made = [
        make_line("G-1", "methane", "20000 Sm3/h", "3 barg", "25 degC", service="gas", length="1500 m"),
        make_line("G-2", "methane", "60000 Sm3/h", "40 barg", "30 degC", service="gas-by-pressure", length="800 m"),
        make_line("G-3", "methane", "300 Sm3/h", "8 barg", "30 degC", service="gas-by-pressure", length="50 m"),
        make_line("G-4", "nitrogen", "800 Nm3/h", "1.1 bar", "20 degC", service="vapour-low-pressure", length="60 m"),
        make_line("G-5", "steam", "6 t/h", "10 barg", "200 degC", service="steam", length="250 m"),
        make_line("G-6", "nitrogen", "3000 Nm3/h", "1.5 barg", "20 degC", service="gas", length="2000 m"),
        make_line("L-1", "water", "60 m3/h", "1.5 barg", "30 degC", service="pump-suction", length="20 m",
                  source_pressure="1.5 barg", liquid_level="3 m", npsh_required="3 m"),
        make_line("L-2", "water", "400 m3/h", "2 barg", "30 degC", service="pump-suction", length="40 m",
                  source_pressure="2 barg", liquid_level="2 m", npsh_required="5 m"),
        make_line("L-3", "water", "250 m3/h", "4 barg", "25 degC", service="cooling-water", length="300 m"),
        make_line("L-4", "water", "40 m3/h", "1 barg", "40 degC", service="gravity-drain", length="30 m",
                  elevation="-6 m"),
        make_line("L-5", "toluene", "25 t/h", "6 barg", "60 degC", service="liquid", length="120 m"),
        make_line("L-6", "water", "30 m3/h", "5 barg", "20 degC", service="liquid", nps="3"),
        make_line("L-7", "water", "15 m3/h", "9 barg", "20 degC", service="pump-discharge", length="180 m"),
    ]
    return [[line] for line in made]


def _rated(result: LineResult) -> tuple[int, ...]:
    """How many candidates were rated for the line and for each of its cases."""
    return (len(result.candidates), *(len(case.candidates) for case in result.cases))


def _outcome(result: LineResult) -> tuple[Any, ...]:
    """What a line's sizing selects, and how each rated size was rated (the hydraulic method), with the company
    prefix taken off the criterion ids named."""
    def plain(text: str | None) -> str | None:
        return text.replace(PREFIX, "") if text else text

    return (result.tag, result.status, result.selected.candidate if result.selected else None,
            plain(result.controlling), result.first_guess_diameter,
            tuple((c.status, c.selected.candidate if c.selected else None) for c in result.cases),
            tuple((c.candidate.nps, plain(c.hydraulics.method)) for c in result.candidates))


def _run(sizer: Sizer, lines: Sequence[Sequence[Line]]) -> list[LineResult]:
    return [sizer.run_cases(list(cases)) for cases in lines]


@pytest.fixture(scope="module")
def builtin_sizer() -> Sizer:
    return Sizer(PluginHost.load(load_entry_points=False), criteria_file=DEMO / "criteria.toml")


def _company_sizer(criteria: Iterable[Any], folder: Path) -> Sizer:
    host = PluginHost.load(load_entry_points=False, extra=[CompanyPlugin(criteria)])
    sizer = Sizer(host, criteria_file=_company_criteria_file(folder))
    used = {c.id for service in sizer.config.services.values() for c, _ in service.criteria} - {FEASIBILITY_ID}
    assert used and all(ident.startswith(PREFIX) for ident in used)  # no built-in id is left in any service
    return sizer


LISTS = {"demo": _demo_lines, "varied": _varied_lines}


@pytest.mark.parametrize("which", sorted(LISTS))
@pytest.mark.parametrize("make", [_subclassed, lambda: [Declared(c) for c in _builtins()]],
                         ids=["subclassed", "declared"])
def test_built_ins_under_company_ids_select_the_same_sizes_rating_as_many(builtin_sizer: Sizer, tmp_path: Path,
                                                                          which: str, make: Any) -> None:
    lines = LISTS[which]()
    expected = _run(builtin_sizer, lines)
    got = _run(_company_sizer(make(), tmp_path), lines)
    # the lists really size lines (the demo's 140-P-001 gives no NPSH inputs and 140-FO-050 no vapour pressure:
    # pump-suction's npsh-margin and liquid's flashing cannot judge them, and unjudged is an error)
    assert sum(r.selected is not None for r in expected) >= len(lines) - (3 if which == "demo" else 1)
    if which == "varied":  # gas sizes beyond the simple method's limit are marched
        assert any(c.hydraulics.method.startswith("isothermal compressible") for r in expected for c in r.candidates)
    assert [_outcome(r) for r in got] == [_outcome(r) for r in expected]
    assert [_rated(r) for r in got] == [_rated(r) for r in expected]


def test_company_criteria_that_declare_nothing_select_the_same_but_rate_more(builtin_sizer: Sizer,
                                                                           tmp_path: Path) -> None:
    """Without traits the engine falls back to rating every size from the smallest: the same selections,
    more candidates rated (so the counts compared above do depend on the declared traits)."""
    lines = _varied_lines()
    expected = _run(builtin_sizer, lines)
    got = _run(_company_sizer([Wrapped(c) for c in _builtins()], tmp_path), lines)
    assert [_outcome(r)[:4] for r in got] == [_outcome(r)[:4] for r in expected]
    assert all(g.first_guess_diameter is None for g in got)  # no criterion proposes one
    assert all(_rated(g) >= _rated(e) for g, e in zip(got, expected))
    assert sum(_rated(g)[0] for g in got) > sum(_rated(e)[0] for e in expected)
