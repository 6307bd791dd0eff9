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
    assert "'openpyxl'" in err and ".xlsx workbook" in err and "pip install openpyxl" in err
    assert not out.exists()


def test_a_missing_module_of_a_report_is_a_boresize_error(monkeypatch):
    monkeypatch.setitem(__import__("sys").modules, "jinja2", None)
    from boresize.report.html import render_html

    with pytest.raises(MissingModuleError, match=r"module 'jinja2' is not installed, and the HTML report needs it: pip install jinja2"):
        render_html([], trace={}, title="t")


def test_another_missing_module_is_not_dressed_up():
    with pytest.raises(ModuleNotFoundError) as caught, needs("an output"):
        import boresize_no_such_module  # type: ignore[import-not-found]  # noqa: F401
    assert not isinstance(caught.value, MissingModuleError)
