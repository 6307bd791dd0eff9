"""``gravity-drain``: self-venting screening of a gravity drain with the Froude number on the full bore.

Fr = v / sqrt(g D), with v the liquid velocity if it filled the bore (Q / (pi D^2 / 4)) and D the inside
diameter. Below Simpson's limit (Fr = 0.31; L. L. Simpson, "Sizing piping for process plants", Chem.
Eng. 75(13), 1968, pp. 192-214; the year and pages from memory) the liquid runs down the wall and the
gas it displaces rises freely through the same pipe: the line is self-venting. The regimes (band edges as
commonly published for vertical and steep gravity lines, e.g. the process-engineering notes at
casualprocessengineer.com "Gravity flow"; chosen conservative there):

- self-venting  Fr <= limit (0.31 by default; 0.3 is also common),
- entraining    limit < Fr < 1.0: gas is dragged down and collects at bends, flow is irregular,
- clearing      Fr >= 1.0: the liquid sweeps gas pockets along; the line runs full.

The largest flow that stays self-venting in a bore D is Q = Fr_limit sqrt(g D) pi D^2 / 4.
"""

from __future__ import annotations

import math
from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.errors import CriteriaFileError
from boresize.hydraulics.line import G
from boresize.model import Verdict

__all__ = ["GravityDrain", "SIMPSON_LIMIT", "froude_number", "drain_regime", "self_venting_flow"]

SIMPSON_LIMIT = 0.31  # Simpson (1968), see the module docstring
CLEARING_FROUDE = 1.0  # commonly published band edge (conservative), see the module docstring


def froude_number(velocity: float, diameter: float) -> float:
    """Fr = v / sqrt(g D) [-].

    :param velocity: full-bore liquid velocity [m/s]
    :param diameter: inside diameter [m]
    """
    return velocity / math.sqrt(G * diameter)


def self_venting_flow(diameter: float, froude_limit: float = SIMPSON_LIMIT) -> float:
    """The largest volume flow that keeps a bore self-venting [m3/s]: Fr_limit sqrt(g D) pi D^2/4.

    :param diameter: inside diameter [m]
    :param froude_limit: Froude number at the self-venting limit [-]

    >>> round(self_venting_flow(0.10226) * 3600, 2)   # NPS 4 Sch 40 (ID 102.26 mm, ASME B36.10M)
    9.18
    """
    return froude_limit * math.sqrt(G * diameter) * math.pi * diameter**2 / 4.0


def drain_regime(froude: float, limit: float = SIMPSON_LIMIT, clearing: float = CLEARING_FROUDE) -> str:
    """``self-venting`` (Fr <= limit), ``entraining`` (limit < Fr < clearing) or ``clearing`` (Fr >= clearing)."""
    if froude <= limit:
        return "self-venting"
    return "entraining" if froude < clearing else "clearing"


class GravityDrain(Criterion):
    id = "gravity-drain"
    size_trend = "larger-passes"  # the Froude number v/sqrt(gD) falls as the bore grows
    title = "Gravity drain self-venting (Froude number on the full bore, Simpson's limit)"
    phases = frozenset({"liquid"})
    source = ("Simpson (1968), Chem. Eng. 75(13): self-venting below Fr = v/sqrt(gD) = 0.31; "
              "entraining/clearing band edge Fr = 1.0 as commonly published")
    options = (
        OptionSpec("max_froude", "dimensionless", SIMPSON_LIMIT, None,
                   "self-venting limit on Fr = v/sqrt(g D) (Simpson 0.31; 0.3 also used)"),
        OptionSpec("clearing_froude", "dimensionless", CLEARING_FROUDE, None,
                   "Fr from which the liquid clears gas pockets (regime shown in the reason)"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        limit, clearing = values.get("max_froude", SIMPSON_LIMIT), values.get("clearing_froude", CLEARING_FROUDE)
        if not 0 < limit < clearing:
            raise CriteriaFileError(
                f"max_froude {limit:g} must be above 0 and below clearing_froude {clearing:g}",
                field=f"{where}.max_froude", value=limit, expected="0 < max_froude < clearing_froude, e.g. 0.31 and 1.0")

    def evaluate(self, context: CriterionContext) -> Verdict:
        limit = context.options.get("max_froude", SIMPSON_LIMIT)
        clearing = context.options.get("clearing_froude", CLEARING_FROUDE)
        diameter = context.candidate.inside_diameter
        froude = froude_number(context.hydraulics.velocity, diameter)
        regime = drain_regime(froude, limit, clearing)
        q_max = self_venting_flow(diameter, limit)
        reason = (f"Froude number {froude:.3g} on the full bore: {regime} (self-venting up to {limit:.3g}, clearing "
                  f"from {clearing:.3g}); NPS {context.candidate.nps} stays self-venting up to {q_max * 3600:.4g} "
                  f"m3/h ({q_max * context.state.density * 3.6:.4g} t/h), the line carries "
                  f"{context.hydraulics.volume_flow * 3600:.4g} m3/h")
        return verdict(self, "pass" if regime == "self-venting" else "fail", reason, value=froude, limit=limit,
                       unit="-", utilisation=froude / limit)
