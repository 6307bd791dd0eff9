"""Two-phase lines through the command line: a pure fluid by quality and a CoolProp mixture inside its envelope,
`python -m boresize size --json`, the document valid against its schema, and the HTML report's two-phase block."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import jsonschema

from boresize.io.document import document_schema

ROWS = ('tag,fluid,flow,pressure,temperature,length,service,quality,backend\n'
        'RB-1,water,20 t/h,3 bara,,60 m,two-phase,0.1,\n'
        'M-1,"propane:0.6, n-butane:0.4",20 t/h,10 bara,50 degC,60 m,two-phase,,coolprop-mixture\n')


def _run(tmp_path: Path, *args: str) -> subprocess.CompletedProcess[str]:
    env = os.environ | {"PYTHONPATH": str(Path(__file__).resolve().parents[2] / "src")}
    return subprocess.run([sys.executable, "-m", "boresize", "size", *args], capture_output=True, text=True,
                          cwd=tmp_path, env=env, timeout=300, check=False)


def test_two_phase_lines_size_from_the_cli_with_their_fields_and_the_html_block(tmp_path: Path) -> None:
    (tmp_path / "lines.csv").write_text(ROWS, encoding="utf-8")
    done = _run(tmp_path, "lines.csv", "--json")
    assert done.returncode in (0, 1), done.stderr  # 1: a line fails its criteria
    assert "Traceback" not in done.stderr
    doc = json.loads(done.stdout)
    jsonschema.validate(doc, document_schema())
    text = json.dumps(doc)
    for tag in ("RB-1", "M-1"):
        entry = next(line for line in doc["lines"] if line["tag"] == tag)
        assert entry["status"] in ("pass", "fail"), entry.get("error")
    for key in ("flow_regime", "two_phase_method", "liquid_holdup"):
        assert f'"{key}"' in text
    html = tmp_path / "report.html"
    done = _run(tmp_path, "lines.csv", "-o", str(html))
    assert done.returncode in (0, 1), done.stderr
    page = html.read_text(encoding="utf-8")
    assert "Beggs-Brill" in page and "flow regime" in page.lower() and "holdup" in page.lower()
