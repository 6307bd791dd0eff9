"""``erosional``: velocity below the API RP 14E erosional velocity v_e = C / sqrt(rho_m).

On a marched gas line it is judged where v*sqrt(rho) is highest, the point of lowest density, with the density
there (:mod:`boresize.criteria.along`); the reason says where.
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.along import worst_point
from boresize.criteria.base import CriterionContext, Criterion, OptionSpec, verdict
from boresize.errors import CriteriaFileError
from boresize.hydraulics.erosional import C_US_TO_SI, erosional_velocity
from boresize.model import Verdict

__all__ = ["C_US_TO_SI", "ErosionalVelocity", "erosional_velocity"]  # the kernel re-exported


class ErosionalVelocity(Criterion):
    id = "erosional"
    #: two-phase: API RP 14E section 2.5 uses the no-slip mixture density and velocity
    phases = frozenset({"liquid", "gas", "two-phase"})
    size_trend = "larger-passes"  # v = Q/A falls as the bore grows; the limit C/sqrt(rho) does not change
    phases = frozenset({"liquid", "gas", "two-phase"})  # RP 14E section 2.5 was written for gas/liquid lines
    title = "Erosional velocity (API RP 14E)"
    source = "API RP 14E, 5th ed. (1991), eq. 2.14: v_e = C/sqrt(rho); C = 100 (US units) for continuous service"
    options = (
        OptionSpec("c_us", "dimensionless", None, None, "C in (ft/s)(lb/ft3)^0.5; 100 continuous, 125 intermittent"),
        OptionSpec("c_si", "dimensionless", None, None, "C in (m/s)(kg/m3)^0.5 (= 1.2199 x C in US units)"),
    )

    def check_options(self, values: dict[str, float], where: str) -> None:
        if "c_us" in values and "c_si" in values:
            raise CriteriaFileError(
                "give C once", field=where, value="c_us and c_si", expected="either c_us or c_si"
            )
        for name, value in values.items():
            if not value > 0:
                raise CriteriaFileError(f"C must be positive, got {value:g}", field=f"{where}.{name}", value=value,
                                        expected="a positive number such as c_us = 100")

    def c_si(self, options: Mapping[str, float]) -> float:
        opts = options if type(options) is dict else dict(options)
        if "c_si" in opts:
            return float(opts["c_si"])
        return float(opts.get("c_us", 100.0)) * C_US_TO_SI

    def evaluate(self, context: CriterionContext) -> Verdict:
        c_si = self.c_si(context.options)
        point = worst_point(context)
        two = context.hydraulics.two_phase
        if two is not None:  # RP 14E section 2.5: the gas/liquid mixture density (no-slip) and mixture velocity
            point = point._replace(velocity=two.mixture_velocity, density=two.mixture_density)
        limit = erosional_velocity(point.density, c_si)
        v = point.velocity
        ok = v <= limit
        reason = (
            f"velocity {v:.3g} m/s {'within' if ok else 'above'} the erosional velocity "
            f"{limit:.3g} m/s (C = {c_si / C_US_TO_SI:.4g} US units, rho = {point.density:.4g} kg/m3){point.where}"
        )
        return verdict(self, "pass" if ok else "fail", reason, value=v, limit=limit, unit="m/s", utilisation=v / limit)
