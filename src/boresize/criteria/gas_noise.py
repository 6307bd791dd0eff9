"""``noise-velocity``: a gas velocity limit that falls with density, v_max = min(cap, a * rho^-b).

Company practice for gas lines, to keep flow noise and vibration down: the lighter the gas, the faster
it may flow, up to a cap. The power-law form is that of the Rhone-Poulenc curves. The shipped constants,
a = 175 and b = 0.43 (v in m/s, rho in kg/m3) with a 60 m/s cap, are from memory of offshore
process-design practice (NORSOK P-001, gas lines, as recalled): verify them against your company standard.
On a marched gas line it is judged where v*rho^b is highest, the point of lowest density, with the density
there (:mod:`boresize.criteria.along`); the reason says where.
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.along import worst_point
from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.errors import CriteriaFileError
from boresize.model import Verdict

__all__ = ["NoiseVelocity", "noise_velocity_limit"]


def noise_velocity_limit(density: float, a: float, b: float, cap: float) -> float:
    """v_max = min(cap, a * rho^-b) [m/s].

    :param density: gas density [kg/m3]
    :param a: coefficient [m/s at 1 kg/m3]
    :param b: exponent [-]
    :param cap: highest velocity whatever the density [m/s]

    >>> round(noise_velocity_limit(10.0, 175.0, 0.43, 100.0), 2)   # 175 * 10**-0.43
    65.02
    >>> noise_velocity_limit(1.0, 175.0, 0.43, 60.0)   # light gas: the cap governs
    60.0
    """
    limit: float = a * density**-b  # float ** float is typed Any (it may be complex)
    return min(cap, limit)


class NoiseVelocity(Criterion):
    id = "noise-velocity"
    size_trend = "larger-passes"  # v falls as the bore grows; the limit a*rho^-b does not change
    title = "Gas velocity limit against noise: v = a*rho^-b, capped"
    phases = frozenset({"gas"})
    source = ("company practice: v_max = a*rho^-b with a cap (the shipped a = 175, b = 0.43 and cap 60 m/s are "
              "common offshore practice, not a published standard: verify them against your company's standard)")
    options = (
        OptionSpec("a", "dimensionless", 175.0, None, "coefficient a of v = a*rho^-b (v in m/s, rho in kg/m3)"),
        OptionSpec("b", "dimensionless", 0.43, None, "exponent b of v = a*rho^-b"),
        OptionSpec("cap", "velocity", "60 m/s", "m/s", "highest velocity whatever the density"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        for name in ("a", "cap"):
            if not values.get(name, 1.0) > 0:
                raise CriteriaFileError(f"{name} must be above zero, got {values[name]:g}", field=f"{where}.{name}",
                                        value=values[name], expected="a positive number")
        if not 0 <= values.get("b", 0.43) < 1:
            raise CriteriaFileError(f"b {values['b']:g} is outside 0 to 1", field=f"{where}.b", value=values["b"],
                                    expected="an exponent between 0 and 1, e.g. 0.43")

    def evaluate(self, context: CriterionContext) -> Verdict:
        opts, point = context.options, worst_point(context)
        rho, v = point.density, point.velocity
        limit = noise_velocity_limit(rho, opts.get("a", 175.0), opts.get("b", 0.43), opts.get("cap", 60.0))
        formula = f"{opts.get('a', 175.0):g} x rho^-{opts.get('b', 0.43):g}"
        governs = "the cap" if limit == opts.get("cap", 60.0) else formula
        reason = (f"velocity {v:.3g} m/s {'within' if v <= limit else 'above'} the noise limit {limit:.3g} m/s "
                  f"({governs} at rho = {rho:.4g} kg/m3){point.where}")
        return verdict(self, "pass" if v <= limit else "fail", reason, value=v, limit=limit, unit="m/s",
                       utilisation=v / limit)
