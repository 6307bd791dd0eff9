"""``flashing``: the lowest pressure along a liquid line stays above the vapour (or bubble) pressure.

The line list gives the inlet pressure and the net elevation of the outlet (rise positive), not the
profile in between, so the pressure is checked where it is known:

- the inlet: P_in,
- the outlet: P_in - friction - fittings - rho g dz - allowances. When the line rises this is also its high
  point (with all the friction before it, the conservative reading of a rising line); when it falls the fall
  is credited at the outlet.

Equipment and control-valve allowances (``fixed_drop``) are included, and placed before the outlet: where
they sit along the line is not known, and the outlet after every loss is the lowest pressure the line can
reach wherever they sit (the conservative choice; a liquid that flashes across a control valve and
recondenses downstream still flashes in the valve).

The line flashes where the pressure falls below P_vap + margin; the verdict names that pressure. P_vap is
the bubble pressure of a mixture when the backend gives one, else the vapour pressure at the line
temperature (a liquid at its bubble point has P_vap equal to its pressure). A backend that gives neither
(a line's own density and viscosity, CoolProp's incompressible liquids and its mixture backend) leaves the
line unjudged: the verdict is ``error``, naming what is missing and how to supply it, never a pass.
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.criteria.npsh import source_vapour_pressure
from boresize.errors import CriteriaFileError
from boresize.model import Verdict, VerdictStatus

__all__ = ["Flashing", "lowest_pressure"]


def lowest_pressure(inlet_pressure: float, friction: float, fittings: float, static: float,
                    allowances: float = 0.0) -> tuple[float, str]:
    """The lowest known pressure of a liquid line [Pa abs] and where it is ("inlet" or "outlet").

    :param inlet_pressure: [Pa abs]
    :param friction: frictional drop over the straight length [Pa]
    :param fittings: drop across the fittings [Pa]
    :param static: rho g dz with the rise positive [Pa] (negative for a falling line)
    :param allowances: equipment and control-valve allowances (``fixed_drop``) [Pa], taken before the outlet
    """
    outlet = inlet_pressure - friction - fittings - static - allowances
    return (outlet, "outlet") if outlet < inlet_pressure else (inlet_pressure, "inlet")


class Flashing(Criterion):
    id = "flashing"
    size_trend = "larger-passes"  # the lowest pressure on the line rises with the bore (less friction)
    title = "No flashing along a liquid line (lowest pressure above the vapour or bubble pressure)"
    phases = frozenset({"liquid"})
    source = "physics: a liquid boils where its pressure falls below its vapour or bubble pressure"
    options = (
        OptionSpec("margin", "pressure_difference", "0 bar", "bar", "keep the lowest pressure this far above P_vap"),
        OptionSpec("warn_only", "dimensionless", 0, None, "true: a line that would flash gets warn, not fail",
                   flag=True),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        if values.get("margin", 0.0) < 0.0:
            raise CriteriaFileError(f"margin {values['margin'] / 1e5:g} bar is negative", field=f"{where}.margin",
                                    value=values["margin"] / 1e5, expected="a margin of 0 bar or more")
        if values.get("warn_only", 0.0) not in (0.0, 1.0):
            raise CriteriaFileError(f"warn_only {values['warn_only']:g} is not true or false",
                                    field=f"{where}.warn_only", value=values["warn_only"], expected="true or false")

    def evaluate(self, context: CriterionContext) -> Verdict:
        p_vap = source_vapour_pressure(context)
        if p_vap is None:
            return verdict(self, "error", f"flashing not judged: the vapour or bubble pressure of line "
                           f"{context.line.tag} is unknown (backend {context.state.source!r} gives none); name the "
                           f"fluid so that a backend gives it (CoolProp for a pure fluid, thermo for a mixture), "
                           f"give the line's vapour_pressure, or judge the line in a service without flashing "
                           f"(criteria file)")
        hyd, line = context.hydraulics, context.line
        lowest, where = lowest_pressure(line.pressure, hyd.drop, hyd.fittings_drop, hyd.static_drop, hyd.fixed_drop)
        margin = context.options.get("margin", 0.0)
        limit = p_vap + margin
        ok = lowest >= limit
        place = where
        if where == "outlet" and line.elevation > 0:
            place = f"outlet, the high point {line.elevation:.3g} m above the inlet"
        if where == "outlet" and hyd.fixed_drop:
            place += f", after {hyd.fixed_drop / 1e5:.3g} bar of allowances"
        reason = (f"lowest pressure {lowest / 1e5:.4g} bar abs at the {place} "
                  f"({'above' if ok else 'below'} vapour/bubble pressure {p_vap / 1e5:.4g} bar abs"
                  f"{f' + margin {margin / 1e5:.3g} bar' if margin else ''})")
        if not ok:
            reason += f": the liquid would flash at {p_vap / 1e5:.4g} bar abs"
        status: VerdictStatus = "pass" if ok else ("warn" if context.options.get("warn_only", 0.0) else "fail")
        return verdict(self, status, reason, value=lowest / 1e5, limit=limit / 1e5, unit="bar abs",
                       utilisation=limit / lowest if lowest > 0 else 1.0 + (limit - lowest) / limit)
