"""What a user's type checker sees of the public API: real types through the lazy top level, and
results typed without None once ``raise_for_error()`` (or ``isinstance(r, RatedResult)``) rules out an error."""

from __future__ import annotations

import ast
import re
import textwrap
from dataclasses import fields
from pathlib import Path

import pytest

import boresize
from boresize import LineResult, RatedResult, SizingResult, make_line, size

# A notebook user's script; each line a test looks at ends with "# <- name".
_SCRIPT = textwrap.dedent("""\
    import boresize
    from boresize import RatedResult, check, make_line, size, size_many

    line = make_line(tag="P-101", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC")
    r = size(line)
    reveal_type(r)  # <- result
    reveal_type(r.nps)  # <- optional nps
    reveal_type(size_many([line]))  # <- many
    reveal_type(check(line, nps="3"))  # <- check
    r.nps + 1  # <- nps plus one
    r.velocity_m_s * 2  # <- optional float
    rated = r.raise_for_error()
    reveal_type(rated)  # <- rated
    reveal_type(rated.nps)  # <- rated nps
    reveal_type(rated.velocity_m_s)  # <- rated float
    reveal_type(rated.selected)  # <- rated selected
    reveal_type(rated.velocity)  # <- rated quantity
    reveal_type(rated.outlet_pressure_bar_abs)  # <- still optional
    doubled = rated.velocity_m_s * 2 + rated.selected.hydraulics.velocity
    if isinstance(r, RatedResult):
        reveal_type(r.state)  # <- narrowed
    """)


def _lazy_names() -> dict[str, str]:
    return dict(boresize._LAZY)


def _type_checking_imports() -> dict[str, str]:
    """name -> module of the imports under ``if TYPE_CHECKING:`` in boresize/__init__.py."""
    tree = ast.parse(Path(boresize.__file__).read_text(encoding="utf-8"))
    found: dict[str, str] = {}
    for node in tree.body:
        if isinstance(node, ast.If) and isinstance(node.test, ast.Name) and node.test.id == "TYPE_CHECKING":
            for stmt in node.body:
                assert isinstance(stmt, ast.ImportFrom) and stmt.module is not None
                found.update({alias.name: stmt.module for alias in stmt.names})
    return found


def test_every_lazy_name_is_imported_for_type_checkers_from_the_module_it_loads_from() -> None:
    assert _type_checking_imports() == _lazy_names()
    assert set(_lazy_names()) <= set(boresize.__all__)


@pytest.fixture(scope="module")
def mypy_report(tmp_path_factory: pytest.TempPathFactory) -> dict[str, list[str]]:
    """mypy --strict on the user script: the notes and errors of each marked line, by its marker."""
    api = pytest.importorskip("mypy.api", reason="mypy is not installed (pip install -e '.[test]' installs it)")
    folder = tmp_path_factory.mktemp("typing")
    script = folder / "user_script.py"
    script.write_text(_SCRIPT + "".join(f"reveal_type(boresize.{name})  # <- lazy {name}\n"
                                        for name in sorted(_lazy_names())), encoding="utf-8")
    # boresize as this test imports it: a source tree on mypy_path comes before an installed (editable) copy
    source = Path(boresize.__file__).resolve().parents[1]
    path = "" if "site-packages" in source.parts else f"mypy_path = {source}\n"
    config = folder / "mypy.ini"
    config.write_text(f"[mypy]\nstrict = True\n{path}", encoding="utf-8")
    stdout, stderr, _ = api.run([str(script), "--config-file", str(config), "--cache-dir", str(folder / "cache"),
                                 "--no-error-summary", "--show-error-codes"])
    markers = {i: m.group(1) for i, text in enumerate(script.read_text().splitlines(), start=1)
               if (m := re.search(r"# <- (.+)$", text))}
    report: dict[str, list[str]] = {marker: [] for marker in markers.values()}
    report["unmarked"] = []
    for row in stdout.splitlines():
        match = re.match(rf"{re.escape(str(script))}:(\d+): (?:note|error): (.*)$", row)
        if match:
            report[markers.get(int(match.group(1)), "unmarked")].append(match.group(2))
    assert not stderr, stderr
    return report



def _revealed(report: dict[str, list[str]], marker: str) -> str:
    notes = report[marker]
    assert len(notes) == 1 and notes[0].startswith("Revealed type is "), notes
    return notes[0].removeprefix("Revealed type is ").strip('"')


def test_size_is_a_sizing_result_to_a_type_checker(mypy_report: dict[str, list[str]]) -> None:
    assert _revealed(mypy_report, "result") == "boresize.api.result.SizingResult"
    assert _revealed(mypy_report, "check") == "boresize.api.result.SizingResult"
    assert _revealed(mypy_report, "many") == "list[boresize.api.result.SizingResult]"
    assert _revealed(mypy_report, "optional nps") == "str | None"


def test_every_lazy_name_has_its_real_type(mypy_report: dict[str, list[str]]) -> None:
    for name in _lazy_names():
        revealed = _revealed(mypy_report, f"lazy {name}")
        assert revealed != "Any" and revealed.startswith("def ("), (name, revealed)
    assert _revealed(mypy_report, "lazy Sizer").endswith("-> boresize.sizing.engine.Sizer")
    assert _revealed(mypy_report, "lazy make_line").endswith("-> boresize.model.Line")


def test_misuse_of_a_result_is_a_type_error(mypy_report: dict[str, list[str]]) -> None:
    assert 'Unsupported operand types for + ("str" and "int")  [operator]' in mypy_report["nps plus one"]
    assert 'Unsupported operand types for * ("None" and "int")  [operator]' in mypy_report["optional float"]


def test_raise_for_error_and_isinstance_give_types_without_none(mypy_report: dict[str, list[str]]) -> None:
    assert _revealed(mypy_report, "rated") == "boresize.api.result.RatedResult"
    assert _revealed(mypy_report, "rated nps") == "str"
    assert _revealed(mypy_report, "rated float") == "float"
    assert _revealed(mypy_report, "rated selected") == "boresize.model.CandidateResult"
    assert re.fullmatch(r"pint\.[\w.]*Quantity\[float\]", _revealed(mypy_report, "rated quantity"))
    assert _revealed(mypy_report, "still optional") == "float | None"
    assert _revealed(mypy_report, "narrowed") == "boresize.model.FluidState"
    assert mypy_report["unmarked"] == []  # the arithmetic on the rated result type-checks


def test_a_rated_line_is_a_rated_result_and_raise_for_error_returns_it() -> None:
    line = make_line(tag="P-101", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC")
    result = size(line, plugins=False)
    assert type(result) is RatedResult and result.raise_for_error() is result
    assert SizingResult.of(result) is result
    both = size([line, make_line(tag="P-101", fluid="water", flow="54 t/h", pressure="9 barg",
                                 temperature="30 degC", case="maximum")], plugins=False)
    assert [type(case) for case in both.cases] == [RatedResult, RatedResult]


def test_an_error_result_is_no_rated_result() -> None:
    result = size(make_line(tag="X-1", fluid="unobtainium", flow="45 t/h", pressure="9 barg",
                            temperature="30 degC"), plugins=False)
    assert result.status == "error" and type(result) is SizingResult
    assert not isinstance(result, RatedResult)


def test_raise_for_error_turns_a_sizing_result_built_by_hand_into_an_equal_rated_result() -> None:
    engine = size(make_line(tag="P-101", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC"),
                  plugins=False)
    values = {f.name: getattr(engine, f.name) for f in fields(LineResult)}
    by_hand = SizingResult(**values)
    rated = by_hand.raise_for_error()
    assert type(rated) is RatedResult
    assert all(getattr(rated, f.name) == getattr(by_hand, f.name) for f in fields(LineResult))
    assert rated.to_dict() == by_hand.to_dict() == engine.to_dict()
    assert (rated.nps, rated.schedule) == (by_hand.nps, by_hand.schedule) == ("4", "40")


def _narrowed_names() -> list[str]:
    """The attributes RatedResult declares without None (its ``if TYPE_CHECKING:`` block), and nps, schedule."""
    import inspect

    from boresize.api import result as module

    tree = ast.parse(inspect.getsource(module))
    rated = next(n for n in tree.body if isinstance(n, ast.ClassDef) and n.name == "RatedResult")
    block = next(n for n in rated.body if isinstance(n, ast.If))
    return [n.target.id for n in block.body if isinstance(n, ast.AnnAssign) and isinstance(n.target, ast.Name)] \
        + ["nps", "schedule"]


def test_what_rated_result_types_without_none_is_never_none_on_the_demo_unit() -> None:
    from boresize import line_from_row, size_many
    from boresize.io import read_line_list

    demo = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
    listed = read_line_list(demo / "lines.csv")
    by_tag: dict[str, list[boresize.Line]] = {}
    for row, units in listed.pairs():
        line = line_from_row(row, units)
        by_tag.setdefault(line.tag, []).append(line)
    results = size_many(list(by_tag.values()), criteria=demo / "criteria.toml", plugins=False)
    names = _narrowed_names()
    assert {"line", "state", "selected", "velocity_m_s", "density", "nps"} <= set(names)
    rated = [r for r in results if r.status != "error"]
    assert len(rated) >= 10 and all(isinstance(r, RatedResult) for r in rated)
    assert all(not isinstance(r, RatedResult) for r in results if r.status == "error")
    for result in rated:
        for case in (result, *result.cases):
            assert [name for name in names if getattr(case, name) is None] == [], case.tag
