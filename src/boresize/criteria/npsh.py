"""``npsh-margin``: NPSH available at a pump suction against NPSH required with a margin.

NPSHa = (P_source - P_vap) / (rho g) + z_level - (friction + fittings + fixed losses) / (rho g)   [m]

with P_source the pressure on the liquid surface in the source vessel [Pa abs], P_vap the vapour
(pure fluid) or bubble (mixture) pressure at the pumping temperature [Pa abs], z_level the liquid level
above the pump datum [m] (positive: flooded suction; negative: suction lift) and the losses of the
suction line (this candidate) [Pa]. The form is that of every pump handbook, e.g. R. Mackay, *The
Practical Pumping Handbook* (Elsevier, 2004), section 4.4.2: NPSHA = Hs + Ha - Hvp - Hf.

A liquid drawn from a vessel at its bubble point is in equilibrium with its vapour: P_vap = P_source and
NPSHa is the static head minus the losses (option ``at_bubble_point``).

Margin (ANSI/HI 9.6.1-2012 style): NPSHa must reach max(ratio * NPSHr, NPSHr + min_margin). The guideline
values by application, as summarised publicly from ANSI/HI 9.6.1-2012 (check against the standard):
hydrocarbon process pumps ratio 1.1 or 1 m, whichever is greater; chemical process pumps 1.1 or 0.6 m
(1.2 or 1 m outside the preferred range at high suction specific speed); water/wastewater, power plant
and pulp-and-paper pumps 1.1 or 0.6 m below Nss 145 (metric), 1.2 or 1 m above; building services
above 1.0 (1.1 or 0.6 m at high Nss). See :data:`HI_MARGINS`.
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.errors import CriteriaFileError
from boresize.hydraulics.line import G
from boresize.model import Verdict

__all__ = ["HI_MARGINS", "NpshMargin", "npsh_available", "npsh_needed", "source_vapour_pressure"]

#: ANSI/HI 9.6.1-2012 margins by application: name -> (ratio NPSHa/NPSHr, minimum margin [m]).
#: Values as summarised publicly from the guideline (low suction specific speed where it distinguishes).
HI_MARGINS: dict[str, tuple[float, float]] = {
    "hydrocarbon-process": (1.1, 1.0),
    "chemical-process": (1.1, 0.6),
    "water-wastewater": (1.1, 0.6),
    "power-plant": (1.1, 0.6),
    "pulp-and-paper": (1.1, 0.6),
    "high-suction-specific-speed": (1.2, 1.0),
}


def npsh_available(source_pressure: float, vapour_pressure: float, density: float, liquid_level: float,
                   losses: float) -> float:
    """NPSH available at the pump datum [m].

    :param source_pressure: pressure on the liquid surface in the source vessel [Pa abs]
    :param vapour_pressure: vapour or bubble pressure at the pumping temperature [Pa abs]
    :param density: liquid density at the pumping temperature [kg/m3]
    :param liquid_level: liquid level above the pump datum [m], negative for a suction lift
    :param losses: suction line losses: friction, fittings and fixed allowances [Pa]

    >>> round(npsh_available(101325.0, 2339.0, 998.2, 3.0, 9790.0), 3)   # water at 20 degC: 10.112 m + 3 m - 1.000 m of losses
    12.112
    """
    return (source_pressure - vapour_pressure - losses) / (density * G) + liquid_level


def npsh_needed(npsh_required: float, ratio: float, min_margin: float) -> float:
    """The NPSH available a pump needs [m]: max(ratio * NPSHr, NPSHr + min_margin) (ANSI/HI 9.6.1 style).

    :param npsh_required: NPSH required by the pump at the flow [m]
    :param ratio: margin ratio NPSHa/NPSHr [-]
    :param min_margin: minimum margin NPSHa - NPSHr [m]
    """
    return max(ratio * npsh_required, npsh_required + min_margin)


def source_vapour_pressure(context: CriterionContext) -> float | None:
    """Bubble pressure (mixtures) or vapour pressure (pure fluids) of the state [Pa abs], or None."""
    bubble = getattr(context.state, "bubble_pressure", None)
    return bubble if bubble is not None else context.state.vapour_pressure


class NpshMargin(Criterion):
    id = "npsh-margin"
    size_trend = "larger-passes"  # NPSH available rises with the bore (less suction friction)
    title = "NPSH available with margin over NPSH required (ANSI/HI 9.6.1 style)"
    phases = frozenset({"liquid"})
    source = ("NPSHa = (P_source - P_vap)/(rho g) + level - losses/(rho g) (pump handbooks); margin rule of "
              "ANSI/HI 9.6.1-2012 (ratio or metres, whichever is greater)")
    options = (
        OptionSpec("ratio", "dimensionless", 1.1, None, "NPSHa/NPSHr at least this (ANSI/HI 9.6.1: 1.1 to 1.2)"),
        OptionSpec("min_margin", "length", "1 m", "m", "NPSHa - NPSHr at least this (ANSI/HI 9.6.1: 0.6 to 1 m)"),
        OptionSpec("at_bubble_point", "dimensionless", 0, None,
                   "true: the source liquid is at its bubble point, vapour pressure = source pressure", flag=True),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        if values.get("ratio", 1.0) < 1.0:
            raise CriteriaFileError(f"ratio {values['ratio']:g} is below 1", field=f"{where}.ratio",
                                    value=values["ratio"], expected="a ratio NPSHa/NPSHr of 1 or more, e.g. 1.1")
        if values.get("min_margin", 0.0) < 0.0:
            raise CriteriaFileError(f"min_margin {values['min_margin']:g} m is negative", field=f"{where}.min_margin",
                                    value=values["min_margin"], expected="a margin of 0 m or more, e.g. '1 m'")
        if values.get("at_bubble_point", 0.0) not in (0.0, 1.0):
            raise CriteriaFileError(f"at_bubble_point {values['at_bubble_point']:g} is not true or false",
                                    field=f"{where}.at_bubble_point", value=values["at_bubble_point"],
                                    expected="true or false")

    def evaluate(self, context: CriterionContext) -> Verdict:
        line, opts = context.line, context.options
        at_bubble = bool(opts.get("at_bubble_point", 0.0))
        missing = _missing_inputs(context, at_bubble)
        if missing:
            return verdict(self, "error", f"NPSH margin not judged for line {line.tag}: {missing}; or size the line "
                           f"in a service without npsh-margin (criteria file)")
        p_vap = source_vapour_pressure(context)
        p_source = line.source_pressure if line.source_pressure is not None else 0.0
        if at_bubble:
            p_source = p_vap = max(p_source, p_vap or 0.0)
        hyd = context.hydraulics
        losses = hyd.drop + hyd.fittings_drop + hyd.fixed_drop
        available = npsh_available(p_source, p_vap, context.state.density, line.liquid_level, losses)  # type: ignore[arg-type]
        needed = npsh_needed(line.npsh_required, opts.get("ratio", 1.1), opts.get("min_margin", 1.0))  # type: ignore[arg-type]
        ok = available >= needed
        reason = (f"NPSH available {available:.3g} m {'meets' if ok else 'is below'} the {needed:.3g} m needed "
                  f"(NPSHr {line.npsh_required:.3g} m x {opts.get('ratio', 1.1):.3g} or + "
                  f"{opts.get('min_margin', 1.0):.3g} m, whichever is greater); "
                  f"{_terms(context, p_source, p_vap, losses, at_bubble)}")  # type: ignore[arg-type]
        return verdict(self, "pass" if ok else "fail", reason, value=available, limit=needed, unit="m",
                       utilisation=_utilisation(available, needed))


def _missing_inputs(context: CriterionContext, at_bubble: bool) -> str:
    """What NPSH available needs and the line lacks, with how to supply it; empty when nothing is missing."""
    line = context.line
    names = [name for name in ("npsh_required", "liquid_level") if getattr(line, name) is None]
    if not at_bubble and line.source_pressure is None:
        names.append("source_pressure")
    parts = [f"no {', '.join(names)} given (line-list columns: give them)"] if names else []
    if not at_bubble and source_vapour_pressure(context) is None:
        parts.append(f"the vapour or bubble pressure is unknown (backend {context.state.source!r} gives none): name "
                     f"the fluid so that a backend gives it (CoolProp for a pure fluid, thermo for a mixture), give "
                     f"the line's vapour_pressure, or set at_bubble_point for a liquid drawn at its bubble point")
    return "; ".join(parts)


def _terms(context: CriterionContext, p_source: float, p_vap: float, losses: float, at_bubble: bool) -> str:
    rho_g = context.state.density * G
    level = context.line.liquid_level or 0.0
    side = "above" if level >= 0 else "below"
    head = (f"liquid level {abs(level):.3g} m {side} the pump datum (sign convention: level above the datum "
            f"positive, a suction lift negative)")
    pressures = ("source at its bubble point: vapour pressure = source pressure" if at_bubble else
                 f"source {p_source / 1e5:.4g} bar abs, vapour pressure {p_vap / 1e5:.4g} bar abs")
    note = "" if at_bubble or p_vap <= p_source else "; the vapour pressure exceeds the source pressure: check inputs"
    return f"{pressures}; {head}; suction losses {losses / rho_g:.3g} m{note}"


def _utilisation(available: float, needed: float) -> float:
    """needed/available, 1.0 at the limit; when NPSHa <= 0, 1 + shortfall/needed (finite, above 1)."""
    if available > 0:
        return needed / available
    return 1.0 + (needed - available) / max(needed, 1e-9)
