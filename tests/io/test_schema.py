"""Every JSON document boresize writes validates against the JSON Schema shipped in the package (``boresize schema``)."""

from __future__ import annotations

import copy
import json
from pathlib import Path

import pytest
from jsonschema import Draft202012Validator

from boresize import api
from boresize.cli import main

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
SCHEMA = api.document_schema()
VALIDATOR = Draft202012Validator(SCHEMA)


def _problems(doc: dict) -> list[str]:
    return [f"{list(e.absolute_path)}: {e.message}" for e in VALIDATOR.iter_errors(doc)]


def test_the_schema_is_a_valid_2020_12_schema_and_names_the_version():
    Draft202012Validator.check_schema(SCHEMA)
    assert SCHEMA["$schema"] == "https://json-schema.org/draft/2020-12/schema"
    assert SCHEMA["properties"]["schema_version"] == {"const": api.SCHEMA_VERSION}
    assert "6 significant figures" in SCHEMA["description"]


def test_boresize_schema_prints_the_shipped_schema(capsys):
    assert main(["schema"]) == 0
    assert json.loads(capsys.readouterr().out) == SCHEMA


@pytest.mark.parametrize("extra", [[], ["--every-size"], ["--headroom"]])
def test_the_demo_json_validates(extra, capsys):
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--json",
                 "--no-plugins", *extra])
    doc = json.loads(capsys.readouterr().out)
    assert code == 1 and doc["schema_version"] == api.SCHEMA_VERSION  # the demo has one failing line
    assert _problems(doc) == []
    assert {line["status"] for line in doc["lines"]} == {"pass", "fail"}
    if "--every-size" in extra:
        assert all(line["candidates"] for line in doc["lines"])
    if "--headroom" in extra:
        assert all("headroom_percent" in line for line in doc["lines"])


def _mixed_run(tmp_path: Path) -> api.Run:
    """A pass, an error (a flow in bar), a fail (40 t/h of water checked in NPS 1/2) and an error (unknown fluid)."""
    csv = tmp_path / "lines.csv"
    csv.write_text("tag,fluid,flow,pressure,temperature,nps\nA,water,10 t/h,3 barg,20 degC,\n"
                   "B,water,10 bar,3 barg,20 degC,\nC,water,40 t/h,3 barg,20 degC,1/2\n"
                   "D,no-such-fluid,10 t/h,3 barg,20 degC,\n", encoding="utf-8")
    return api.run_lines(csv, plugins=False, headroom=True)


def test_a_document_with_error_and_fail_lines_validates(tmp_path):
    run = _mixed_run(tmp_path)
    doc = run.document(timings=True)
    assert [line["status"] for line in doc["lines"]] == ["pass", "error", "fail", "error"]
    assert doc["lines"][1]["error_field"] == "flow" and "criterion_seconds" in doc["summary"]
    assert _problems(doc) == []
    assert _problems(run.document()) == []


def test_a_wrong_document_fails_validation(tmp_path):
    doc = _mixed_run(tmp_path).document()
    wrong = copy.deepcopy(doc)
    wrong["lines"][0]["status"] = "ok"
    assert any("'ok' is not one of" in p for p in _problems(wrong))
    wrong = copy.deepcopy(doc)
    del wrong["lines"][1]["error"]
    assert any("'error' is a required property" in p for p in _problems(wrong))
    wrong = copy.deepcopy(doc)
    wrong["lines"][0]["velocity"] = 1.0  # a key the schema does not declare
    assert any("'velocity' was unexpected" in p for p in _problems(wrong))
    wrong = copy.deepcopy(doc)
    wrong["schema_version"] = "0.9"
    assert _problems(wrong)


def test_one_results_to_dict_validates_as_a_line_entry():
    line_schema = {"$schema": SCHEMA["$schema"], "$defs": SCHEMA["$defs"], "$ref": "#/$defs/line"}
    line = api.make_line(tag="P-101", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC",
                         length="120 m", service="pump-discharge")
    for result in (api.size(line), api.check(line, nps="1")):
        assert [e.message for e in Draft202012Validator(line_schema).iter_errors(result.to_dict())] == []
