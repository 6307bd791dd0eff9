"""Velocity-type criteria judge a marched gas line at its worst point and say where.

The line: 5 km of NPS 4 Sch 40 (bore from the fluids library) carrying 8 t/h of nitrogen from 30 bar abs and
15 degC; the drop is about a third of the inlet pressure, so the line is marched. The inlet values come from
CoolProp, the outlet values from an independent march (tests/gas_reference.py). Each criterion gets a limit
halfway between its inlet and outlet values: the inlet meets it, the outlet breaks it, so the line must fail,
naming the outlet; a limit 5 % above the outlet value passes.
"""

from __future__ import annotations

import math
import textwrap

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.piping import nearest_pipe

from boresize.io.rows import line_from_row
from boresize.sizing.engine import Sizer
from gas_reference import isothermal_march

ROW = {"tag": "N-8", "fluid": "nitrogen", "flow": "8 t/h", "pressure": "30 bar", "temperature": "15 degC",
       "length": "5 km", "nps": "4", "service": "n2", "design_margin": "0 %"}
BORE = nearest_pipe(NPS=4, schedule="40")[1]
MASS_FLOW = 8.0 / 3.6
B = 0.43  # the noise-velocity exponent used here


@pytest.fixture(scope="module")
def ends() -> dict[str, tuple[float, float]]:
    """(inlet, outlet) value of what each criterion judges, computed outside boresize."""
    reference = isothermal_march("Nitrogen", 30e5, 288.15, MASS_FLOW, BORE, 4.5e-5, 5000.0, steps=2000)
    assert reference.outlet_pressure is not None
    flux = MASS_FLOW / (math.pi * BORE**2 / 4)
    rho = (PropsSI("D", "P", 30e5, "T", 288.15, "Nitrogen"), reference.outlet_density)
    c = (PropsSI("A", "P", 30e5, "T", 288.15, "Nitrogen"),
         PropsSI("A", "P", reference.outlet_pressure, "T", 288.15, "Nitrogen"))
    v = (flux / rho[0], flux / rho[1])
    pick = lambda judged: (judged(0), judged(1))  # noqa: E731 - (inlet, outlet)
    return {"velocity": pick(lambda i: v[i]), "momentum": pick(lambda i: rho[i] * v[i] ** 2),
            "erosional": pick(lambda i: v[i] * math.sqrt(rho[i])),  # v / (C/sqrt(rho)) = v sqrt(rho) / C
            "noise-velocity": pick(lambda i: v[i] * rho[i] ** B),  # v / (a rho^-b) = v rho^b / a
            "mach": pick(lambda i: v[i] / c[i])}


def _options(criterion: str, limit: float) -> str:
    """The criterion's options that put its limit at ``limit`` (in the units of ``ends``)."""
    return {"velocity": f'{{ max = "{limit!r} m/s" }}', "momentum": f'{{ max = "{limit!r} Pa" }}',
            "erosional": f"{{ c_si = {limit!r} }}", "noise-velocity": f'{{ a = {limit!r}, b = {B}, cap = "900 m/s" }}',
            "mach": f"{{ max = {limit!r} }}"}[criterion]


def _verdict(host, tmp_path, criterion: str, limit: float):
    path = tmp_path / "criteria.toml"
    path.write_text(textwrap.dedent(f"""
        [service.n2]
        phase = "gas"
        "{criterion}" = {_options(criterion, limit)}
    """))
    result = Sizer(host, criteria_file=path).run(line_from_row(ROW))
    assert result.selected.hydraulics.method.startswith("isothermal compressible flow")  # marched
    return next(v for v in result.selected.verdicts if v.criterion == criterion), result


@pytest.mark.parametrize("criterion", ["velocity", "momentum", "erosional", "noise-velocity", "mach"])
def test_a_limit_the_inlet_meets_and_the_outlet_breaks_fails_at_the_outlet(host, tmp_path, ends, criterion):
    inlet, outlet = ends[criterion]
    assert outlet > 1.2 * inlet  # the line really expands
    verdict, result = _verdict(host, tmp_path, criterion, (inlet + outlet) / 2)
    assert verdict.status == "fail" and result.status == "fail"
    assert "at the outlet, 5,000 m from the inlet (inlet " in verdict.reason
    assert verdict.utilisation == pytest.approx(outlet / ((inlet + outlet) / 2), rel=0.01)
    passing, _ = _verdict(host, tmp_path, criterion, 1.05 * outlet)
    assert passing.status == "pass" and "at the outlet, 5,000 m from the inlet" in passing.reason


def test_the_velocity_judged_is_the_outlets_and_the_reason_gives_both(host, tmp_path, ends):
    inlet, outlet = ends["velocity"]
    verdict, _ = _verdict(host, tmp_path, "velocity", (inlet + outlet) / 2)
    assert verdict.value == pytest.approx(outlet, rel=0.01)
    assert verdict.reason == (f"velocity {verdict.value:.3g} m/s above the maximum {verdict.limit:.3g} m/s at the "
                              f"outlet, 5,000 m from the inlet (inlet {inlet:.3g} m/s)")
