"""The ACME rack rule, run through boresize as an installed plugin would be.

The rule itself is the reference: ACME (an invented company for this example) allows nothing below NPS 2 on
pipe racks. NPS numbers follow ASME B36.10M labels (NPS 1-1/2 is 1.5).
"""

from __future__ import annotations

import textwrap
from pathlib import Path

import pytest

import acme_rack_minimum
from acme_rack_minimum import RackMinimumSize, location_of
from boresize.criteria.base import parse_options
from boresize.sizing.engine import Sizer
from boresize.errors import CriteriaFileError
from boresize.plugins import PluginHost
from boresize.api import size_rows

ROW = {"tag": "U-1", "fluid": "water", "flow": "0.5 t/h", "pressure": "4 barg", "temperature": "20 degC",
       "service": "utility-rack"}


@pytest.fixture(scope="module")
def sizer(tmp_path_factory: pytest.TempPathFactory) -> Sizer:
    path: Path = tmp_path_factory.mktemp("acme") / "criteria.toml"
    path.write_text(textwrap.dedent("""
        [service.utility-rack]
        phase = "liquid"
        velocity = { max = "2 m/s" }
        acme-rack-min-nps = { min_nps = 2 }
    """))
    host = PluginHost.load(load_entry_points=False, extra=[acme_rack_minimum])
    return Sizer(host, criteria_file=path)


def _rack_verdict(result):
    """The rack verdict of a LineResult (its selected size) or of one CandidateResult."""
    verdicts = result.selected.verdicts if hasattr(result, "selected") else result.verdicts
    return next(v for v in verdicts if v.criterion == "acme-rack-min-nps")


def test_a_small_line_on_a_rack_is_sized_up_to_nps_2(sizer):
    result = size_rows([({**ROW, "location": "Pipe rack 3"}, {})], sizer=sizer)[0]
    assert result.status == "pass" and result.selected.candidate.nps == "2"
    verdict = _rack_verdict(result)
    assert (verdict.status, verdict.value, verdict.limit, verdict.unit) == ("pass", 2.0, 2.0, "NPS")
    smaller = [c for c in result.candidates if c.candidate.nps_value < 2]
    assert smaller and all(_rack_verdict(c).status == "fail" for c in smaller)


def test_the_same_line_off_the_rack_keeps_its_small_size(sizer):
    result = size_rows([({**ROW, "location": "unit 140 grade"}, {})], sizer=sizer)[0]
    assert result.selected.candidate.nps_value < 2
    assert _rack_verdict(result).reason == "line U-1 is not on a pipe rack ('unit 140 grade')"


def test_a_line_without_location_is_not_applicable(sizer):
    result = size_rows([(ROW, {})], sizer=sizer)[0]
    assert _rack_verdict(result).status == "not-applicable"
    assert _rack_verdict(result).reason == "line U-1 gives no location column"


def test_min_nps_must_be_a_pipe_size():
    assert parse_options(RackMinimumSize(), {"min_nps": 1.5}, "service.x.acme-rack-min-nps") == {"min_nps": 1.5}
    with pytest.raises(CriteriaFileError, match=r"min_nps 2\.7 is not a nominal pipe size"):
        parse_options(RackMinimumSize(), {"min_nps": 2.7}, "service.x.acme-rack-min-nps")


def test_location_column_in_any_case():
    assert location_of((("Location", "rack"),)) == "rack"
    assert location_of((("area", "north"),)) is None
