"""Smoke subset for the lowest-versions install (.ci/lowest-versions): a pure fluid, three mixtures (aqueous,
GERG-2008, thermo's cubic EOS), a two-phase line (fluids' correlations), the HTML report, the workbook and the PDF
calculation sheet, through the installed `boresize` command. Plain asserts: needs no test extra."""

from __future__ import annotations

import json
import os
import subprocess
import sys
import tempfile
from pathlib import Path

LINES = """tag,fluid,flow,pressure,temperature,quality,length [m],service,backend
S-PURE,water,45 t/h,9 barg,30 degC,,100,pump-discharge,
S-GAS,methane,12000 Sm3/h,6 barg,25 degC,,100,,
S-MEG,"mass: water 0.7, ethylene glycol 0.3",20 t/h,3 barg,20 degC,,100,,
S-NG,"mole: methane 0.9, ethane 0.07, propane 0.03",5 t/h,40 bara,20 degC,,100,,
S-PR,"mole: methane 0.9, ethane 0.07, propane 0.03",5 t/h,40 bara,20 degC,,100,,thermo
S-2PH,water,5 t/h,3 bara,,0.1,100,two-phase,
"""
TAGS = ("S-PURE", "S-GAS", "S-MEG", "S-NG", "S-PR", "S-2PH")


def main() -> int:
    with tempfile.TemporaryDirectory(prefix="boresize-smoke-") as tmp:
        folder = Path(tmp)
        lines = folder / "lines.csv"
        lines.write_text(LINES, encoding="utf-8")
        outputs = [folder / "r.json", folder / "r.html", folder / "r.xlsx", folder / "r.pdf"]
        command = [sys.executable, "-m", "boresize", "size", str(lines)]
        for output in outputs:
            command += ["--output", str(output)]
        env = dict(os.environ, BORESIZE_DEBUG="1")  # an internal error shows its traceback in the CI log
        done = subprocess.run(command, capture_output=True, text=True, env=env)
        print(done.stdout[-3000:], done.stderr[-3000:], sep="\n")
        assert done.returncode in (0, 1), f"exit {done.returncode}"
        assert "Traceback" not in done.stderr, "a traceback reached the user"
        document = json.loads(outputs[0].read_text(encoding="utf-8"))
        results = {item["tag"]: item for item in document["lines"]}
        for tag in TAGS:
            assert tag in results, f"{tag} missing from the JSON document"
            item = results[tag]
            assert item["status"] == "pass", f"{tag}: {item['status']} {item.get('notes')} {item.get('reason', '')}"
            assert item["nps"], f"{tag}: no size selected"
        page = outputs[1].read_text(encoding="utf-8")
        assert "S-PURE" in page and "S-PR" in page and "<svg" in page, "the HTML report lacks the lines or plots"
        from openpyxl import load_workbook

        book = load_workbook(outputs[2])
        cells = {str(cell.value) for sheet in book.worksheets for row in sheet.iter_rows() for cell in row}
        assert "S-MEG" in cells, "the workbook lacks the lines"
        assert results["S-2PH"]["phase"] == "two-phase", "S-2PH is not rated as a two-phase line"
        sheet = outputs[3].read_bytes()  # fpdf2's floor (the report extra): a summary sheet, then one a line at least
        assert sheet.startswith(b"%PDF-") and sheet.count(b"/Type /Page\n") >= 1 + len(results), "the PDF sheet"
    print("smoke: pure fluid, mixtures, two-phase line, HTML report, PDF sheet and workbook: ok")
    return 0


if __name__ == "__main__":
    sys.exit(main())
