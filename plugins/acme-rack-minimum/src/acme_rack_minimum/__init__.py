"""ACME rule (an example company criterion): no line on a pipe rack below a minimum NPS.

boresize loads this module through the entry point group ``boresize`` and calls its hook
implementation; the criterion then applies to every service of a criteria file that names it.
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.plugin import (
    NPS_LABELS,
    CriteriaFileError,
    Criterion,
    CriterionContext,
    CriterionRegistry,
    OptionSpec,
    Verdict,
    hookimpl,
    nps_value,
    verdict,
)

__all__ = ["RackMinimumSize", "boresize_register_criteria", "location_of"]


def location_of(extra: tuple[tuple[str, str], ...]) -> str | None:
    """The line list's ``location`` cell (column name in any case), or None when the line gives none."""
    return next((value for key, value in extra if key.strip().lower() == "location"), None)


class RackMinimumSize(Criterion):
    id = "acme-rack-min-nps"
    title = "ACME: lines on pipe racks at least NPS 2"
    phases = frozenset({"liquid", "gas"})
    source = "company (ACME piping practice: mechanical integrity on racks)"
    options = (OptionSpec("min_nps", "dimensionless", 2, None, "smallest NPS allowed on a pipe rack (1.5 = 1-1/2)"),)
    size_trend = "larger-passes"  # a size below the minimum is cured by a larger one: the engine may walk

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        valid = {nps_value(label) for label in NPS_LABELS}
        if values["min_nps"] not in valid:
            raise CriteriaFileError(f"min_nps {values['min_nps']:g} is not a nominal pipe size",
                                    field=f"{where}.min_nps", value=values["min_nps"],
                                    expected="an NPS as a number: 1.5, 2, 3, 4 ...")

    def evaluate(self, context: CriterionContext) -> Verdict:
        location = location_of(context.line.extra)
        if location is None:
            return verdict(self, "not-applicable", f"line {context.line.tag} gives no location column")
        if "rack" not in location.lower():
            return verdict(self, "not-applicable", f"line {context.line.tag} is not on a pipe rack ({location!r})")
        size, minimum = context.candidate.nps_value, context.options["min_nps"]
        ok = size >= minimum
        reason = (f"NPS {context.candidate.nps} on {location!r} is {'at least' if ok else 'below'} "
                  f"the rack minimum NPS {minimum:g}")
        return verdict(self, "pass" if ok else "fail", reason, value=size, limit=minimum, unit="NPS",
                       utilisation=minimum / size)


@hookimpl
def boresize_register_criteria(register: CriterionRegistry) -> None:
    register.add(RackMinimumSize())
