"""A missing optional module (one that serves an output only) is named with the output and the pip command, and the
command line exits 2 without a traceback or "internal error" (issue 18). ``sys.modules[name] = None`` makes the
import fail as an uninstalled module does."""

from __future__ import annotations

from pathlib import Path

import pytest

from boresize.cli import main
from boresize.optional import MissingModuleError, needs

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"


def test_the_cli_names_the_module_the_output_and_the_command(tmp_path, monkeypatch, capsys):
    monkeypatch.setitem(__import__("sys").modules, "openpyxl", None)
    out = tmp_path / "results.xlsx"
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                 "--output", str(out)])
    err = capsys.readouterr().err
    assert code == 2
    assert "internal error" not in err and "Traceback" not in err
    assert "'openpyxl'" in err and ".xlsx workbook" in err and 'install boresize[xlsx] (pip install "boresize[xlsx]"' in err
    assert not out.exists()


def test_a_missing_module_of_a_report_is_a_boresize_error(monkeypatch):
    monkeypatch.setitem(__import__("sys").modules, "jinja2", None)
    from boresize.report.html import render_html

    with pytest.raises(MissingModuleError, match=r"module 'jinja2' is not installed, and the HTML report needs it: install boresize\[report\]"):
        render_html([], trace={}, title="t")


def test_another_missing_module_is_not_dressed_up():
    with pytest.raises(ModuleNotFoundError) as caught, needs("an output"):
        import boresize_no_such_module  # type: ignore[import-not-found]  # noqa: F401
    assert not isinstance(caught.value, MissingModuleError)


OUTPUT_MODULES = ("matplotlib", "openpyxl", "jinja2", "fpdf", "rich")


def _without_outputs(monkeypatch) -> None:  # type: ignore[no-untyped-def]
    """A core-only install: every output module missing (``import`` of a None entry fails as uninstalled)."""
    import sys

    for name in OUTPUT_MODULES:  # submodules too: an imported ``rich.console`` is found without its parent
        for loaded in [m for m in sys.modules if m == name or m.startswith(name + ".")] or [name]:
            monkeypatch.setitem(sys.modules, loaded, None)


def test_the_core_install_sizes_and_writes_json_and_csv(tmp_path, monkeypatch, capsys):
    _without_outputs(monkeypatch)
    json_out, csv_out = tmp_path / "r.json", tmp_path / "r.csv"
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                 "--output", str(json_out), "--output", str(csv_out)])
    captured = capsys.readouterr()
    assert code == 1, captured.err  # the demo list has one failing line on purpose (Makefile's demo target)
    assert "140-P-001" in captured.out  # the terminal table needs none of the output modules
    assert json_out.exists() and csv_out.exists()


@pytest.mark.parametrize(("suffix", "options", "extra", "module"), [
    (".xlsx", [], "xlsx", "openpyxl"),
    (".html", [], "report", "jinja2"),
    (".pdf", [], "report", "fpdf"),
    (".json", ["--progress"], "progress", "rich"),
])
def test_each_output_names_its_extra(tmp_path, monkeypatch, capsys, suffix, options, extra, module):
    _without_outputs(monkeypatch)
    out = tmp_path / f"r{suffix}"
    code = main(["size", str(DEMO / "lines.csv"), "--no-plugins", "--output", str(out), *options])
    err = capsys.readouterr().err
    assert code == 2, err
    assert "Traceback" not in err and "internal error" not in err
    assert f"'{module}' is not installed" in err and f'install boresize[{extra}] (pip install "boresize[{extra}]"' in err


def test_an_xlsx_line_list_without_openpyxl_names_the_extra(tmp_path, monkeypatch, capsys):
    _without_outputs(monkeypatch)
    sheet = tmp_path / "lines.xlsx"
    sheet.write_bytes(b"PK\x03\x04 not read: the module is missing first")
    code = main(["size", str(sheet), "--no-plugins"])
    err = capsys.readouterr().err
    assert code == 2 and "reading a .xlsx line list needs it: install boresize[xlsx]" in err, err


def test_the_extras_in_pyproject_install_the_modules_they_are_named_for():
    import re
    import sys

    if sys.version_info >= (3, 11):
        import tomllib
    else:
        import tomli as tomllib
    from boresize.errors import OPTIONAL_MODULES

    project = tomllib.loads((DEMO.parents[1] / "pyproject.toml").read_text(encoding="utf-8"))["project"]
    extras = project["optional-dependencies"]
    core = {re.split(r"[<>=;\[ ]", d)[0].lower() for d in project["dependencies"]}
    for module, extra in OPTIONAL_MODULES.items():
        assert any(d.lower().startswith(module) for d in extras[extra]), (module, extra)
        assert module not in core, f"{module} is an extra's, not a core dependency"
        assert extra in extras["outputs"][0], extra
    assert "boresize[outputs]" in extras["test"]
