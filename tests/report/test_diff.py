"""Revision compare: ``boresize diff`` on hand-made documents and on the demo's two revisions.

The demo acceptance: revision 2 raises the flow of some lines by 30 %. The lines that changed size
are found here by reading the two result documents directly (no diff code); ``boresize diff`` must
name exactly those. One of them is also checked from outside: the fluids library and CoolProp show
that the old size of 140-P-002 exceeds the pump-discharge drop limit at the new maximum flow.
"""

from __future__ import annotations

import csv
import json
import math
from pathlib import Path

import pytest
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe

from boresize.cli import main
from boresize.report.diff import compare, render_diff

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"


def _entry(tag: str, nps: str | None, status: str = "pass", case: str | None = None, verdicts=(), **extra):
    return {"tag": tag, "nps": nps, "schedule": "40", "status": status, "case": case, "controlling": "velocity",
            "utilisation": 0.5, "verdicts": [{"criterion": c, "status": s} for c, s in verdicts], **extra}


def test_compare_names_added_removed_and_each_kind_of_change():
    old = {"lines": [_entry("A", "4", input={"flow": "10 t/h"}), _entry("B", "2"),
                     _entry("C", "3", cases=[{}], case="normal"), _entry("D", "6", verdicts=[("velocity", "pass")]),
                     _entry("E", "1")]}
    new = {"lines": [_entry("A", "6", input={"flow": "13 t/h"}, candidates=[{"nps": "4", "failing": ["velocity"]}]),
                     _entry("C", "3", cases=[{}], case="maximum"), _entry("D", "6", verdicts=[("velocity", "fail")],
                                                                          status="fail"),
                     _entry("E", "1"), _entry("F", "2")]}
    diff = compare(old, new)
    assert (diff.added, diff.removed, diff.unchanged) == (["F"], ["B"], 1)
    assert diff.tags("size") == ["A"]
    assert diff.tags("governing-case") == ["C"]
    assert diff.tags("status") == ["D"] and diff.tags("verdict") == ["D"]
    size = next(c for c in diff.changes if c.kind == "size")
    assert (size.old, size.new) == ("NPS 4 Sch 40", "NPS 6 Sch 40")
    assert "flow 10 t/h -> 13 t/h" in size.reason and "NPS 4 now fails velocity" in size.reason
    text = render_diff(diff, "rev1", "rev2")
    assert "added (1): F" in text and "removed (1): B" in text and "  A: NPS 4 Sch 40 -> NPS 6 Sch 40" in text


def test_identical_documents_have_no_differences():
    doc = {"lines": [_entry("A", "4"), _entry("B", "2")]}
    diff = compare(doc, json.loads(json.dumps(doc)))
    assert diff.empty and diff.unchanged == 2


@pytest.fixture(scope="module")
def revisions(tmp_path_factory) -> tuple[dict, dict, Path, Path]:
    folder = tmp_path_factory.mktemp("rev")
    docs = []
    for name in ("lines.csv", "lines-rev2.csv"):
        out = folder / f"{name}.json"
        code = main(["size", str(DEMO / name), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                     "--output", str(out)])
        assert code in (0, 1)
        docs.append(json.loads(out.read_text()))
    return docs[0], docs[1], folder / "lines.csv.json", folder / "lines-rev2.csv.json"


def test_revision_two_raises_some_flows_by_30_percent():
    def flows(name):
        with open(DEMO / name, encoding="utf-8") as handle:
            return [(row["tag"], row["case"], row["flow"]) for row in csv.DictReader(handle)]
    raised = 0
    for (tag, case, old), (tag2, case2, new) in zip(flows("lines.csv"), flows("lines-rev2.csv"), strict=True):
        assert (tag, case) == (tag2, case2)
        (a, unit), (b, unit2) = old.split(" ", 1), new.split(" ", 1)
        assert unit == unit2 and float(b) in (pytest.approx(float(a)), pytest.approx(1.3 * float(a)))
        raised += float(b) != float(a)
    assert raised >= 4


def test_diff_of_the_demo_revisions_names_exactly_the_lines_that_changed_size(revisions, capsys):
    old, new, old_path, new_path = revisions
    before = {line["tag"]: (line["nps"], line["schedule"]) for line in old["lines"]}
    changed = [line["tag"] for line in new["lines"] if before[line["tag"]] != (line["nps"], line["schedule"])]
    assert changed  # the revision must change some sizes, or the acceptance proves nothing
    capsys.readouterr()
    code = main(["diff", str(old_path), str(new_path), "--json"])
    report = json.loads(capsys.readouterr().out)
    assert code == 1
    assert report["size_changed"] == changed
    assert (report["added"], report["removed"]) == ([], [])
    # the text form names each of them on a "size changed" line, and no other line there
    main(["diff", str(old_path), str(new_path)])
    text = capsys.readouterr().out
    rows = text.split("size changed")[1].splitlines()[1:]
    block = rows[:next((i for i, row in enumerate(rows) if not row.startswith("  ")), len(rows))]
    assert [row.split(":")[0].strip() for row in block] == changed


def test_diff_sizes_two_line_lists_itself(capsys):
    code = main(["diff", str(DEMO / "lines.csv"), str(DEMO / "lines-rev2.csv"), "--criteria",
                 str(DEMO / "criteria.toml"), "--no-plugins", "--json"])
    assert code == 1
    assert "140-P-002" in json.loads(capsys.readouterr().out)["size_changed"]


def test_old_size_of_p002_fails_the_drop_limit_at_the_new_maximum_flow(revisions):
    # 70.2 t/h + 10 % design margin of water at 30 degC, 10.5325 bar abs (CoolProp, IAPWS-95) in the
    # old size, NPS 4 Sch 40 (ASME B36.10M via fluids), roughness 0.045 mm: Darcy-Weisbach with fluids'
    # Colebrook. The limit is the pump-discharge drop limit the document's verdict quotes.
    from CoolProp.CoolProp import PropsSI

    old, new, _, _ = revisions
    entry = next(line for line in old["lines"] if line["tag"] == "140-P-002")
    limit = next(v["limit"] for v in entry["verdicts"] if v["criterion"] == "drop-per-length")
    rho = PropsSI("D", "T", 303.15, "P", 1053250.0, "Water")
    mu = PropsSI("V", "T", 303.15, "P", 1053250.0, "Water")
    di = nearest_pipe(NPS=float(entry["nps"]), schedule="40")[1]
    v = 70.2 * 1.1 / 3.6 / rho / (math.pi * di**2 / 4)
    drop = friction_factor(Re=rho * v * di / mu, eD=4.5e-5 / di) / di * rho * v**2 / 2 / 10.0  # kPa/100 m
    assert drop > limit
    assert next(line for line in new["lines"] if line["tag"] == "140-P-002")["nps"] != entry["nps"]


# --- changed inputs, also where the size held (issue 17) ------------------------------------------------------

OLD_LIST = """tag,fluid,flow,pressure,temperature,length [m],service,case
W-1,water,40 t/h,5 barg,30 degC,100,liquid,
W-2,water,20 t/h,5 barg,30 degC,100,liquid,
W-3,water,20 t/h,5 barg,30 degC,100,liquid,
W-4,water,20 t/h,5 barg,30 degC,100,liquid,normal
W-4,water,30 t/h,5 barg,30 degC,100,liquid,maximum
W-5,water,20 t/h,5 barg,30 degC,100,liquid,
"""
# W-1 flow +25 %; W-2 temperature and length; W-3 the same; W-4 the maximum case's pressure; W-5 renamed W-6;
# a new column (roughness) that only W-2 fills.
NEW_LIST = """tag,fluid,flow,pressure,temperature,length [m],service,case,roughness
W-1,water,50 t/h,5 barg,30 degC,100,liquid,,
W-2,water,20 t/h,5 barg,40 degC,120,liquid,,0.05 mm
W-3,water,20 t/h,5 barg,30 degC,100,liquid,,
W-4,water,20 t/h,5 barg,30 degC,100,liquid,normal,
W-4,water,30 t/h,6 barg,30 degC,100,liquid,maximum,
W-6,water,20 t/h,5 barg,30 degC,100,liquid,,
"""


@pytest.fixture(scope="module")
def known_lists(tmp_path_factory) -> tuple[Path, Path]:
    folder = tmp_path_factory.mktemp("known")
    (folder / "old.csv").write_text(OLD_LIST, encoding="utf-8")
    (folder / "new.csv").write_text(NEW_LIST, encoding="utf-8")
    return folder / "old.csv", folder / "new.csv"


def test_diff_lists_every_changed_input_also_where_the_size_held(known_lists, capsys):
    old, new = known_lists
    code = main(["diff", str(old), str(new), "--no-plugins", "--json"])
    report = json.loads(capsys.readouterr().out)
    assert code == 1
    assert (report["added"], report["removed"]) == (["W-6"], ["W-5"])
    inputs = {item["tag"]: [(c["field"], c["old"], c["new"]) for c in item["inputs"]]
              for item in report["inputs_changed"]}
    assert inputs == {
        "W-1": [("flow", "40 t/h", "50 t/h")],
        "W-2": [("temperature", "30 degC", "40 degC"), ("length", "100", "120"), ("roughness", None, "0.05 mm")],
        "W-4": [("maximum/pressure", "5 barg", "6 barg")],
    }
    # 40 -> 50 t/h of water keeps its size (the case: a 25 % rise once counted as "unchanged")
    assert report["size_changed"] == [] and report["changes"] == []
    assert report["size_held_inputs_changed"] == ["W-1", "W-2", "W-4"]
    assert report["unchanged"] == 1  # W-3 alone
    main(["diff", str(old), str(new), "--no-plugins"])
    text = capsys.readouterr().out
    assert "  W-1 (size held): flow 40 t/h -> 50 t/h\n" in text
    assert "  W-2 (size held): temperature 30 degC -> 40 degC; length 100 -> 120; roughness (none) -> 0.05 mm" in text
    assert "3 line(s) kept their size though inputs changed: W-1, W-2, W-4" in text
    assert "1 line(s) unchanged" in text


def test_size_held_with_inputs_changed_is_counted_apart_from_unchanged():
    old = {"lines": [_entry("A", "4", input={"tag": "A", "flow": "10 t/h", "fluid": "water"}),
                     _entry("B", "4", input={"tag": "B", "flow": "10 t/h"})]}
    new = {"lines": [_entry("A", "4", input={"tag": "A", "flow": "12.5 t/h", "fluid": "water"}),
                     _entry("B", "4", input={"tag": "B", "flow": "10 t/h"})]}
    diff = compare(old, new)
    assert (diff.unchanged, diff.held, diff.changes) == (1, ["A"], [])
    assert [c.text() for c in diff.inputs] == ["flow 10 t/h -> 12.5 t/h"]
    assert not diff.empty
    assert diff.to_dict()["inputs_changed"] == [
        {"tag": "A", "size_held": True, "inputs": [{"field": "flow", "old": "10 t/h", "new": "12.5 t/h"}]}]


def test_documents_without_input_cells_are_compared_on_resolved_values():
    old = {"lines": [_entry("A", "4", fluid="water", sizing_mass_flow_kg_h=1000.0, service="liquid")]}
    new = {"lines": [_entry("A", "4", fluid="water", sizing_mass_flow_kg_h=1250.0, service="pump-discharge")]}
    diff = compare(old, new)
    assert [(c.field, c.old, c.new) for c in diff.inputs] == [
        ("sizing_mass_flow_kg_h", "1000.0", "1250.0"), ("service", "liquid", "pump-discharge")]


@pytest.mark.parametrize("lines", [[1], ["x"], [{"nps": "4"}], [{"tag": ""}], [{"tag": 5}]])
def test_a_document_line_without_a_tag_is_refused_by_name(tmp_path, capsys, lines):
    good = tmp_path / "good.json"
    good.write_text(json.dumps({"lines": [_entry("A", "4")]}), encoding="utf-8")
    bad = tmp_path / "bad.json"
    bad.write_text(json.dumps({"lines": lines}), encoding="utf-8")
    assert main(["diff", str(good), str(bad)]) == 2
    err = capsys.readouterr().err
    assert "line 1 of 'lines' has no tag" in err and "Traceback" not in err


def test_a_repeated_tag_names_its_occurrence_in_the_changed_inputs():
    old = {"lines": [_entry("A", "4", input={"flow": "1 t/h"}), _entry("A", "4", input={"flow": "2 t/h"})]}
    new = {"lines": [_entry("A", "4", input={"flow": "1 t/h"}), _entry("A", "4", input={"flow": "3 t/h"})]}
    diff = compare(old, new)
    assert (diff.held, diff.unchanged) == (["A (#2)"], 1)
    assert "  A (#2) (size held): flow 2 t/h -> 3 t/h" in render_diff(diff, "a", "b")
