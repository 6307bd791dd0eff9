"""Median time of one two-phase line, flash included (issue 16's target: at most 20 ms).

Run from the project root (not part of the test suite):

    .venv/bin/python benchmarks/bench_two_phase.py [--repeat 50]

The two-phase flash of the property backends is another change of the same issue; until it is merged this
times the hydraulics (``rate_two_phase``, Beggs-Brill, 100 m, NPS 3) together with a direct flash call that gives
the same inputs: CoolProp's saturated liquid and vapour of a pure fluid at a quality (five ``PropsSI`` calls),
and a thermo Peng-Robinson flash of a propane/n-butane mixture inside its envelope (flasher built once, as a
backend keeps it) with each phase's density and viscosity and the surface tension.
"""

from __future__ import annotations

import argparse
import statistics
import time
from collections.abc import Callable

from boresize.hydraulics.two_phase import rate_two_phase
from boresize.model import Candidate, Flow, FluidState, Line

PIPE = Candidate("3", 3.0, "40", 0.0889, 0.00549, 0.07792, 4.5e-5)
LINE = Line(tag="TP", fluid="water", flow=Flow("mass", 2.0), pressure=10e5, temperature=453.0, length=100.0,
            elevation=5.0)


def pure_state(i: int) -> FluidState:
    from CoolProp.CoolProp import PropsSI
    p, x = 10e5 * (1 + 1e-4 * i), 0.1
    rl, rg = PropsSI("D", "P", p, "Q", 0, "Water"), PropsSI("D", "P", p, "Q", 1, "Water")
    ml, mg = PropsSI("V", "P", p, "Q", 0, "Water"), PropsSI("V", "P", p, "Q", 1, "Water")
    sigma = PropsSI("I", "P", p, "Q", 0, "Water")
    return FluidState(density=1 / (x / rg + (1 - x) / rl), viscosity=ml, phase="two-phase", source="coolprop",
                      model="HEOS", vapour_fraction=x, liquid_density=rl, gas_density=rg, liquid_viscosity=ml,
                      gas_viscosity=mg, surface_tension=sigma)


def mixture_flash() -> Callable[[int], FluidState]:
    from thermo import PRMIX, CEOSGas, CEOSLiquid, ChemicalConstantsPackage, FlashVL

    constants, correlations = ChemicalConstantsPackage.from_IDs(["propane", "n-butane"])
    kw = dict(Tcs=constants.Tcs, Pcs=constants.Pcs, omegas=constants.omegas)
    flasher = FlashVL(constants, correlations, liquid=CEOSLiquid(PRMIX, kw, HeatCapacityGases=correlations.HeatCapacityGases),
                      gas=CEOSGas(PRMIX, kw, HeatCapacityGases=correlations.HeatCapacityGases))

    def state(i: int) -> FluidState:
        res = flasher.flash(T=300.0 + 1e-3 * i, P=6e5, zs=[0.5, 0.5])
        liq, gas = res.liquid0, res.gas
        x = res.gas_beta * gas.MW() / res.MW()  # vapour mass fraction from the molar one
        rl, rg = liq.rho_mass(), gas.rho_mass()
        return FluidState(density=1 / (x / rg + (1 - x) / rl), viscosity=liq.mu(), phase="two-phase",
                          source="thermo", model="PR", vapour_fraction=x, liquid_density=rl, gas_density=rg,
                          liquid_viscosity=liq.mu(), gas_viscosity=gas.mu(), surface_tension=liq.sigma())
    return state


def median_ms(flash: Callable[[int], FluidState], line: Line, repeat: int) -> float:
    times = []
    for i in range(repeat):
        start = time.perf_counter()
        rate_two_phase(line, flash(i), PIPE, 2.0)
        times.append(time.perf_counter() - start)
    return statistics.median(times) * 1e3


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--repeat", type=int, default=50)
    repeat = parser.parse_args().repeat
    pure_state(0)
    rate_two_phase(LINE, pure_state(0), PIPE, 2.0)  # imports and first calls, untimed
    print(f"pure water, CoolProp at quality + hydraulics: median {median_ms(pure_state, LINE, repeat):.2f} ms")
    flash = mixture_flash()
    flash(0)
    mix = Line(tag="TP", fluid="propane:0.5, n-butane:0.5", flow=Flow("mass", 2.0), pressure=6e5,
               temperature=300.0, length=100.0, elevation=5.0)
    print(f"propane/n-butane, thermo PR flash + hydraulics: median {median_ms(flash, mix, repeat):.2f} ms")
    print("target (issue 16): at most 20 ms a line, flash included")


if __name__ == "__main__":
    main()
