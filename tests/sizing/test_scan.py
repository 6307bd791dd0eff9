"""The guided candidate scan (boresize.sizing.scan): when it may walk, and when it must rate every size.

The reference for every selection here is the selection's definition: the smallest size of the pipe
class that passes every criterion, found by rating every size from the smallest
(``Sizer(every_size=True)``). The scan may only skip sizes it can prove fail.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

import pytest

from boresize.api import make_line
from boresize.sizing.services import Service, SizingConfig
from boresize.criteria.bands import resolve_criterion
from boresize.criteria.base import CriterionContext, verdict
from boresize.sizing.engine import Sizer
from boresize.model import FluidState, Verdict
from boresize.sizing.scan import direction, start_diameter, trend_of

# Water at about 20 degC with its properties given (density and viscosity: IAPWS-95 at 20 degC, 1 atm, from
# memory to 3 figures), so that the tests need no equation of state.
WATER = {"density": "998 kg/m3", "viscosity": "1.0 mPa.s"}


class NoSize:
    """A company rule of the kind plugins bring, with no trend: NPS 3 is not allowed (common practice: some
    companies keep 3-1/2 and 5 off their classes; here 3, so that the default class shows it)."""

    id, title, phases, source, options = "no-nps-3", "NPS 3 not allowed", frozenset({"liquid"}), "company", ()

    def __init__(self, calls: list[str] | None = None) -> None:
        self.calls = calls if calls is not None else []

    def evaluate(self, context: CriterionContext) -> Verdict:
        self.calls.append(context.candidate.nps)
        ok = context.candidate.nps != "3"
        return verdict(self, "pass" if ok else "fail", "NPS 3 is not allowed" if not ok else "allowed size")


class AtLeast(NoSize):
    """A plugin criterion that declares its trend: sizes below NPS 6 fail (a company minimum for a header)."""

    id, title, size_trend = "at-least-6", "header at least NPS 6", "larger-passes"

    def evaluate(self, context: CriterionContext) -> Verdict:
        self.calls.append(context.candidate.nps)
        value = context.candidate.nps_value
        return verdict(self, "pass" if value >= 6 else "fail", f"NPS {context.candidate.nps}", value=value,
                       limit=6.0, unit="-", utilisation=6.0 / value)


def _sizers(host: Any, *extra: Any) -> tuple[Sizer, Sizer]:
    """(guided, every size) sizers whose 'test' service holds drop-per-length <= 40 kPa/100 m and ``extra``."""
    base = Sizer(host)
    drop = base.config.services["liquid"].criteria
    drop = tuple(pair for pair in drop if pair[0].id == "drop-per-length")
    service = Service(name="test", criteria=drop + tuple((c, {}) for c in extra), phase="liquid")
    config = SizingConfig(services={**base.config.services, "test": service}, pipe_classes=base.config.pipe_classes,
                          version="test")
    return Sizer(host, config=config), Sizer(host, config=config, every_size=True)


def _line(flow: str) -> Any:
    return make_line("T-1", "water", flow, "5 barg", "20 degC", service="test", length="100 m", **WATER)


def test_a_criterion_without_a_trend_that_fails_sends_the_scan_back_to_every_size(host: Any) -> None:
    rule = NoSize()
    guided, every = _sizers(host, rule)
    plain = _sizers(host)[0].run(_line("25 m3/h"))
    assert plain.selected is not None and plain.selected.candidate.nps == "3"  # the drop alone selects NPS 3
    rule.calls.clear()
    result = guided.run(_line("25 m3/h"))
    assert rule.calls[-1] != "3" and rule.calls.count("1/2") == 1  # rated from the smallest after the fail at 3
    assert result.selected == every.run(_line("25 m3/h")).selected
    assert result.selected is not None and result.selected.candidate.nps == "4"


def test_a_plugin_that_declares_its_trend_is_walked_not_scanned(host: Any) -> None:
    rule = AtLeast()
    guided, every = _sizers(host, rule)
    result = guided.run(_line("10 m3/h"))
    rated = [c.candidate.nps for c in result.candidates]
    # walked up from the drop's first guess (NPS 2), not from the smallest; two sizes above (engine.RATED_ABOVE)
    assert rated == ["2", "3", "4", "6", "8", "10"]
    assert rule.calls == rated  # each size rated once
    assert result.selected == every.run(_line("10 m3/h")).selected
    assert result.selected is not None and result.selected.candidate.nps == "6"


@pytest.mark.parametrize("flow", ["0.3 m3/h", "5 m3/h", "25 m3/h", "400 m3/h", "4000 m3/h", "40000 m3/h"])
def test_the_guided_scan_and_every_size_agree_from_tiny_to_beyond_the_class(host: Any, flow: str) -> None:
    guided, every = _sizers(host, AtLeast())
    a, b = guided.run(_line(flow)), every.run(_line(flow))
    assert (a.status, a.controlling, a.selected) == (b.status, b.controlling, b.selected)


def test_limits_banded_by_nps_that_shrink_with_size_have_no_trend(host: Any) -> None:
    velocity = Sizer(host).host.criteria.get("velocity")
    growing, _ = resolve_criterion(velocity, {"bands": [{"up_to_nps": "2", "max": "1 m/s"}, {"max": "2 m/s"}]}, "t")
    shrinking, _ = resolve_criterion(velocity, {"bands": [{"up_to_nps": "2", "max": "2 m/s"}, {"max": "1 m/s"}]}, "t")
    candidates = Sizer(host).config.pipe_class("default").candidates()
    assert trend_of(growing, 5e5, candidates) == "falls-with-size"
    assert trend_of(shrinking, 5e5, candidates) is None
    assert trend_of(NoSize(), 5e5, candidates) is None
    assert trend_of(AtLeast(), 5e5, candidates) == "larger-passes"


def test_a_fail_points_to_the_size_that_cures_it() -> None:
    def judged(status: str, value: float | None = None, limit: float | None = None) -> Verdict:
        return Verdict(criterion="x", status=status, value=value, limit=limit, reasons=("r",),  # type: ignore[arg-type]
                       source="test")

    assert direction(judged("pass"), None) == 0 and direction(judged("warn"), "larger-passes") == 0
    assert direction(judged("fail", 3.0, 2.0), "falls-with-size") == 1  # above a maximum: larger
    assert direction(judged("fail", 0.5, 0.9), "falls-with-size") == -1  # below a minimum: smaller
    assert direction(judged("fail", 0.5, 0.9), "larger-passes") == 1  # e.g. NPSH available below required
    assert direction(judged("fail"), "falls-with-size") is None
    assert direction(judged("error"), "larger-passes") is None
    assert direction(judged("fail", 3.0, 2.0), None) is None


def test_a_roughness_beyond_the_smallest_bore_is_refused_whichever_sizes_are_rated(host: Any) -> None:
    line = replace(_line("25 m3/h"), roughness=0.02)  # 20 mm: above the 15.8 mm bore of NPS 1/2 Sch 40
    result = _sizers(host)[0].run(line)
    assert result.status == "error" and result.error is not None
    assert "smaller than the inside diameter 0.01576 m" in result.error  # ASME B36.10M: 1/2 Sch 40 ID 15.80 mm


def test_a_banded_criterion_carries_the_traits_of_the_one_it_wraps(host: Any) -> None:
    velocity = host.criteria.get("velocity")
    banded, _ = resolve_criterion(velocity, {"bands": [{"up_to_nps": "2", "max": "1 m/s"}, {"max": "2 m/s"}]}, "t")
    assert banded.size_trend == "falls-with-size"
    assert banded.proposes_first_guess is False  # a limit that depends on the size gives the record no first guess
    state = FluidState(density=998.0, viscosity=1e-3, phase="liquid", source="given", model="given")
    # 0.01 m3/s at the largest sizes' 2 m/s: D = sqrt(4 Q / (pi v)) = 0.0797885 m (continuity)
    at_limit = banded.diameter_at_limit({}, _line("36 m3/h"), state, 0.01 * 998.0, 4.5e-5)
    assert at_limit == pytest.approx(0.0797885, rel=1e-6)


def test_the_scan_starts_where_the_largest_proposal_meets_its_limit(host: Any) -> None:
    class Proposes(AtLeast):
        def diameter_at_limit(self, options: Any, line: Any, state: Any, mass_flow: float,
                              roughness: float) -> float:
            return 0.2

    state = FluidState(density=998.0, viscosity=1e-3, phase="liquid", source="given", model="given")
    plain = Service(name="t", criteria=((NoSize(), {}),))
    assert start_diameter(plain, _line("36 m3/h"), state, 9.98, 4.5e-5) == 0.0  # nothing proposed: the smallest
    both = Service(name="t", criteria=((Proposes(), {}), (host.criteria.get("velocity"), {"max": 2.0})))
    assert start_diameter(both, _line("36 m3/h"), state, 9.98, 4.5e-5) == 0.2
