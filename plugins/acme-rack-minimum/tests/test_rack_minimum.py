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
from boresize.plugin import CriteriaFileError, parse_options
from boresize.testing import criterion_context, plugin_sizer, run_criterion, size_line

LINE = {"tag": "U-1", "fluid": "water", "flow": "0.5 t/h", "pressure": "4 barg", "temperature": "20 degC",
        "service": "utility-rack"}
ON_RACK = {**LINE, "extra": {"location": "Pipe rack 3"}}


@pytest.fixture(scope="module")
def criteria(tmp_path_factory: pytest.TempPathFactory) -> Path:
    path: Path = tmp_path_factory.mktemp("acme") / "criteria.toml"
    path.write_text(textwrap.dedent("""
        [service.utility-rack]
        phase = "liquid"
        velocity = { max = "2 m/s" }
        acme-rack-min-nps = { min_nps = 2 }
    """))
    return path


@pytest.fixture(scope="module")
def sizer(criteria: Path):
    """The engine with this plugin registered (as its entry point would) and the criteria file above."""
    return plugin_sizer([acme_rack_minimum], criteria)


def _rack_verdict(verdicts):
    return next(v for v in verdicts if v.criterion == "acme-rack-min-nps")


def test_a_small_line_on_a_rack_is_sized_up_to_nps_2(criteria):
    result = size_line(ON_RACK, plugins=[acme_rack_minimum], criteria=criteria)  # one call, no fixture
    assert result.status == "pass" and result.selected.candidate.nps == "2"
    verdict = _rack_verdict(result.selected.verdicts)
    assert (verdict.status, verdict.value, verdict.limit, verdict.unit) == ("pass", 2.0, 2.0, "NPS")
    smaller = [c for c in result.candidates if c.candidate.nps_value < 2]
    assert smaller and all(_rack_verdict(c.verdicts).status == "fail" for c in smaller)


def test_the_same_line_off_the_rack_keeps_its_small_size(sizer):
    result = size_line({**LINE, "extra": {"location": "unit 140 grade"}}, sizer=sizer)
    assert result.selected.candidate.nps_value < 2
    assert _rack_verdict(result.selected.verdicts).reason == "line U-1 is not on a pipe rack ('unit 140 grade')"


def test_below_the_minimum_fails_and_at_it_passes(sizer):
    below = run_criterion(RackMinimumSize(), ON_RACK, "1-1/2", options={"min_nps": 2}, sizer=sizer)
    at = run_criterion(RackMinimumSize(), ON_RACK, "2", options={"min_nps": 2}, sizer=sizer)
    assert (below.status, below.value, below.limit, below.utilisation) == ("fail", 1.5, 2.0, pytest.approx(4 / 3))
    assert below.reason == "NPS 1-1/2 on 'Pipe rack 3' is below the rack minimum NPS 2"
    assert (at.status, at.reason) == ("pass", "NPS 2 on 'Pipe rack 3' is at least the rack minimum NPS 2")


def test_the_minimum_defaults_to_nps_2(sizer):
    context = criterion_context(ON_RACK, "3", criterion=RackMinimumSize(), sizer=sizer)
    assert (context.options, context.service, context.candidate.nps) == ({"min_nps": 2.0}, "utility-rack", "3")


def test_any_line_runs_on_the_shipped_sets_without_a_criteria_file():
    verdict = run_criterion(RackMinimumSize(), {**ON_RACK, "service": None}, "1")
    assert (verdict.status, verdict.value) == ("fail", 1.0)


def test_a_line_without_location_is_not_applicable(sizer):
    verdict = run_criterion(RackMinimumSize(), LINE, "1", sizer=sizer)
    assert (verdict.status, verdict.reason) == ("not-applicable", "line U-1 gives no location column")


def test_min_nps_must_be_a_pipe_size():
    assert parse_options(RackMinimumSize(), {"min_nps": 1.5}, "service.x.acme-rack-min-nps") == {"min_nps": 1.5}
    with pytest.raises(CriteriaFileError, match=r"min_nps 2\.7 is not a nominal pipe size"):
        parse_options(RackMinimumSize(), {"min_nps": 2.7}, "service.x.acme-rack-min-nps")


def test_location_column_in_any_case():
    assert location_of((("Location", "rack"),)) == "rack"
    assert location_of((("area", "north"),)) is None
