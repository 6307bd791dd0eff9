"""``flow-regime``: a two-phase line fails when its flow regime is one the service lists (slug flow by default).

The regime is the one the hydraulics recorded (:attr:`boresize.model.TwoPhaseFlow.flow_regime`, from the
Taitel-Dukler map, :mod:`boresize.hydraulics.two_phase`). Taitel & Dukler name slug and elongated-bubble flow
together "intermittent", so the default fails both names. A line without two-phase hydraulics is an error, never
a pass: an unevaluated regime is not a good one.
"""

from __future__ import annotations

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, chosen, verdict
from boresize.hydraulics.two_phase import REGIME_NAMES
from boresize.model import Verdict

__all__ = ["FlowRegime"]


class FlowRegime(Criterion):
    id = "flow-regime"
    size_trend = None  # the regime moves both ways with the bore (slug at one size, stratified or annular at others)
    phases = frozenset({"two-phase"})
    title = "Two-phase flow regime (Taitel-Dukler map)"
    source = ("Taitel & Dukler (1976), AIChE J. 22(1) 47-55, the flow-regime map; slug flow is failed for "
              "vibration by common practice")
    options = (OptionSpec("fail", "dimensionless", "slug, intermittent", None,
                          "the regimes that fail, a list of names (slug and intermittent by default)",
                          choices=REGIME_NAMES),)

    def evaluate(self, context: CriterionContext) -> Verdict:
        two = context.hydraulics.two_phase
        if two is None:
            return verdict(self, "error", "no two-phase hydraulics for this line: the flow regime was not evaluated")
        failing = chosen(self.options[0], context.options.get("fail", 0.0))
        bad = two.flow_regime in failing
        reason = (f"flow regime {two.flow_regime!r} from the {two.regime_map} map "
                  f"{'is' if bad else 'is not'} one the service fails ({', '.join(failing) or 'none'})")
        return verdict(self, "fail" if bad else "pass", reason)
