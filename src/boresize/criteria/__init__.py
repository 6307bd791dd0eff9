"""Criteria: objects that judge a candidate size and return a Verdict."""

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, parse_options, verdict

__all__ = ["Criterion", "CriterionContext", "OptionSpec", "parse_options", "verdict"]
