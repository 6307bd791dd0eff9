"""The property accuracy table of README.md: boresize's automatic property model per fluid family against a
reference, computed here directly with CoolProp.

Each row runs a family's state points through boresize's own automatic backend choice (``boresize.api.make_line``
then :func:`boresize.properties.select.fluid_state`, as a line list would), so the table follows the routing as it
changes; the pure-fluid row "thermo" names ``backend = thermo`` (what serves a pure component CoolProp lacks).
References, each computed with CoolProp here: its reference equations of state (``PropsSI``); HEOS mixtures with
the GERG-2008 mixing parameters (Kunz & Wagner 2012) for natural gases and hydrocarbon liquids; the incompressible
solutions (Melinder's correlations) for aqueous alcohols and glycols. The deviation is (boresize - reference) /
reference; the table gives the largest in magnitude, with its sign, for density and viscosity.

Run: ``.venv/bin/python benchmarks/property_accuracy.py`` (prints the Markdown table; about 20-40 s).
"""

from __future__ import annotations

import re
import sys
import time
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from boresize.model import FluidState

#: (density [kg/m3], viscosity [Pa s]) of the reference at (pressure [Pa abs], temperature [K]).
Reference = Callable[[float, float], tuple[float, float]]

NATURAL_GASES = {
    "lean": {"Methane": 0.95, "Ethane": 0.03, "Nitrogen": 0.01, "CarbonDioxide": 0.01},
    "medium": {"Methane": 0.88, "Ethane": 0.06, "Propane": 0.03, "Nitrogen": 0.02, "CarbonDioxide": 0.01},
    "rich": {"Methane": 0.80, "Ethane": 0.10, "Propane": 0.05, "n-Butane": 0.02, "Nitrogen": 0.02,
             "CarbonDioxide": 0.01},
}
HYDROCARBON_LIQUIDS = {"n-hexane/n-heptane 50/50 mol": {"n-Hexane": 0.5, "n-Heptane": 0.5},
                       "n-pentane/n-octane 30/70 mol": {"n-Pentane": 0.3, "n-Octane": 0.7}}
#: (line-list spelling, CoolProp incompressible code, mass fraction of the solute)
AQUEOUS = [("ethanol", "MEA", 0.1), ("ethanol", "MEA", 0.3), ("methanol", "MMA", 0.1), ("methanol", "MMA", 0.3),
           ("ethylene glycol", "MEG", 0.3), ("ethylene glycol", "MEG", 0.5)]
PURE = [("water", "Water", 5e5, 293.15), ("water", "Water", 5e5, 353.15), ("methane", "Methane", 20e5, 293.15),
        ("nitrogen", "Nitrogen", 10e5, 293.15), ("propane", "Propane", 10e5, 293.15),
        ("carbon dioxide", "CarbonDioxide", 15e5, 313.15), ("ammonia", "Ammonia", 10e5, 293.15),
        ("toluene", "Toluene", 3e5, 333.15)]


@dataclass(frozen=True)
class Point:
    """One state point: the line's fluid text (and backend, if it names one), pressure [Pa abs], temperature [K]."""

    fluid: str
    pressure: float
    temperature: float
    reference: Reference
    label: str
    backend: str | None = None


@dataclass(frozen=True)
class Family:
    family: str
    reference: str
    span: str
    points: Sequence[Point]


def _props_si(name: str) -> Reference:
    from CoolProp.CoolProp import PropsSI

    return lambda p, t: (PropsSI("D", "P", p, "T", t, name), PropsSI("V", "P", p, "T", t, name))


def _heos(fractions: dict[str, float], phase: str) -> Reference:
    import CoolProp.CoolProp as CP

    state = CP.AbstractState("HEOS", "&".join(fractions))
    state.set_mole_fractions(list(fractions.values()))

    def reference(p: float, t: float) -> tuple[float, float]:
        state.specify_phase(CP.iphase_gas if phase == "gas" else CP.iphase_liquid)
        state.update(CP.PT_INPUTS, p, t)
        return state.rhomass(), state.viscosity()

    return reference


def _incompressible(code: str, fraction: float) -> Reference:
    import CoolProp.CoolProp as CP

    state = CP.AbstractState("INCOMP", code)
    state.set_mass_fractions([fraction])

    def reference(p: float, t: float) -> tuple[float, float]:
        state.update(CP.PT_INPUTS, p, t)
        return state.rhomass(), state.viscosity()

    return reference


#: CoolProp's names -> the line list's
_LINE_NAMES = {"CarbonDioxide": "CO2"}


def _composition(fractions: dict[str, float]) -> str:
    return ", ".join(f"{_LINE_NAMES.get(name, name.lower())}:{x:g}" for name, x in fractions.items())


def _where(label: str, pressure: float, temperature: float) -> str:
    return f"{label}, {pressure / 1e5:g} bar, {temperature - 273.15:g} degC"


def families() -> list[Family]:
    pure = [Point(fluid, p, t, _props_si(name), fluid) for fluid, name, p, t in PURE]
    gas = [Point(_composition(x), p * 1e5, t, _heos(x, "gas"), f"{label} gas") for label, x in NATURAL_GASES.items()
           for p in (10, 50, 100) for t in (278.15, 313.15)]
    liquid = [Point(_composition(x), p * 1e5, t, _heos(x, "liquid"), label) for label, x in HYDROCARBON_LIQUIDS.items()
              for p in (2, 20) for t in (293.15, 353.15)]
    aqueous = [Point(f"mass: water {1 - w:g}, {solute} {w:g}", 3e5, t, _incompressible(code, w),
                     f"{solute} {w * 100:g} wt%") for solute, code, w in AQUEOUS for t in (283.15, 298.15, 313.15)]
    chosen = [
        Family("pure fluids", "CoolProp reference EOS (PropsSI)", "water, methane, nitrogen, propane, CO2, ammonia, "
               "toluene; 3-20 bar, 20-80 degC", pure),
        Family("natural gas", "CoolProp HEOS, GERG-2008 mixing parameters", "3 gases (CH4 80-95 %, to n-C4, N2, "
               "CO2); 10-100 bar, 5-40 degC", gas),
        Family("hydrocarbon liquids", "CoolProp HEOS mixture (its viscosity an estimate)", "n-C6/n-C7 50/50, "
               "n-C5/n-C8 30/70 mol; 2-20 bar, 20-80 degC", liquid),
        Family("aqueous alcohols and glycols", "CoolProp incompressibles (Melinder)", "ethanol, methanol 10 and 30 "
               "wt%, MEG 30 and 50 wt%; 3 bar, 10-40 degC", aqueous),
    ]
    # Where the automatic model is the reference's own library, its row reads 0 %; the same points with
    # backend = thermo (the second opinion property-crosscheck uses) show how far an independent model lies.
    second = [Family(f"{f.family}, backend = thermo", f.reference, "the same points",
                     [Point(q.fluid, q.pressure, q.temperature, q.reference, q.label, "thermo") for q in f.points])
              for f in chosen]
    mixing = Family("aqueous glycols, backend = aqueous-mixing", "CoolProp incompressibles (Melinder)",
                    "MEG 30 and 50 wt%; 3 bar, 10-40 degC (its mixing rule, used for TEG, DEG and amines)",
                    [Point(q.fluid, q.pressure, q.temperature, q.reference, q.label, "aqueous-mixing")
                     for q in aqueous if "glycol" in q.label])
    return [row for pair in zip(chosen, second) for row in pair] + [mixing]


def _model_name(state: FluidState) -> str:
    """The backend and its model, without library versions (the table stays true across upgrades)."""
    model = re.sub(r"^[A-Za-z]+ [0-9.]+(?:(?: \+|,) [a-z]+ [0-9.]+)?:? ", "", state.model.split(";")[0])
    model = re.sub(r" \(CoolProp incompressible [^)]*\)", "", model)  # one row per family, not per solution
    model = re.sub(r"\b(CoolProp|thermo|chemicals) [0-9][0-9.]*", r"\1", model)
    return f"{state.source}: {model}" + (f" ({state.family})" if state.family else "")


def _measure(host: object, family: Family) -> tuple[set[str], list[tuple[float, str]], list[str]]:
    """(models used, largest density and viscosity deviations [-] with where, faults) of a family."""
    from boresize.api import make_line
    from boresize.errors import BoresizeError
    from boresize.properties.select import fluid_state

    models: set[str] = set()
    worst = [(0.0, ""), (0.0, "")]
    faults: list[str] = []
    for point in family.points:
        where = _where(point.label, point.pressure, point.temperature)
        line = make_line("acc", point.fluid, "1 kg/s", point.pressure, point.temperature, si=True,
                         backend=point.backend)
        try:
            state = fluid_state(host, line)  # type: ignore[arg-type]
        except BoresizeError as exc:
            faults.append(f"{where}: {exc}")
            continue
        models.add(_model_name(state))
        for number, (value, reference) in enumerate(zip((state.density, state.viscosity),
                                                        point.reference(point.pressure, point.temperature))):
            deviation = value / reference - 1.0
            if abs(deviation) > abs(worst[number][0]):
                worst[number] = (deviation, where)
    return models, worst, faults


def table() -> tuple[str, list[str]]:
    """The Markdown table, and every point boresize refused (named)."""
    from boresize.plugins import PluginHost

    host = PluginHost.load(load_entry_points=False)
    rows = ["| family | model (boresize's automatic choice) | reference | range | largest deviation: density, "
            "viscosity |", "|---|---|---|---|---|"]
    faults: list[str] = []
    for family in families():
        models, worst, refused = _measure(host, family)
        faults += refused
        counted = f"; {len(refused)} of {len(family.points)} points refused" if refused else ""
        shown = ", ".join(f"{d * 100:+.1f} %" + (f" ({where})" if abs(d) >= 0.0005 else "") for d, where in worst)
        rows.append(f"| {family.family} | {'; '.join(sorted(models)) or '-'} | {family.reference} | {family.span} | "
                    f"{shown}{counted} |")
    return "\n".join(rows), faults


def main() -> None:
    start = time.perf_counter()
    text, faults = table()
    print(text)
    for fault in faults:
        print(f"refused: {fault}", file=sys.stderr)
    print(f"({time.perf_counter() - start:.0f} s)", file=sys.stderr)


if __name__ == "__main__":
    main()
