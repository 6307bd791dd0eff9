"""Benchmark: 300 natural-gas mixture lines through the command line, against two property floors.

The line list is three natural gases (lean, typical C1-C4, rich with nitrogen and carbon dioxide), 100 lines
each, at pressures 10-100 bar abs and temperatures 5-60 degC (deterministic), every row its own line, sized
against the demo unit's criteria (service gas). Three timings, all in this one process:

* boresize: the CLI (``boresize size``) run in-process on the line list, from reading it to the last result;
* the thermo floor (issue "The right property model for each fluid family"): the same work done directly
  with thermo, as a program that uses it would: import thermo, set up one flasher per gas (Peng-Robinson, the
  components' constants and correlations), then per line one PT flash, its mass density and the gas
  viscosity. The target is boresize within 1.5x this floor;
* the CoolProp floor: the same 300 states done directly with CoolProp HEOS (GERG-2008 parameters), one
  reused ``AbstractState`` per gas, the gas phase imposed, density and viscosity per line: the floor of the
  GERG-2008 path itself (CoolProp's import is timed apart; boresize pays it too).

Run: ``.venv/bin/python benchmarks/bench_mixtures.py [--lines 300]``
"""

from __future__ import annotations

import argparse
import contextlib
import io
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
CRITERIA = ROOT / "examples" / "demo-unit" / "criteria.toml"
TARGET = 1.5
#: name -> ((component, mole fraction), ...); the components as thermo and CoolProp both name them.
GASES: dict[str, tuple[tuple[str, float], ...]] = {
    "lean": (("methane", 0.95), ("ethane", 0.03), ("nitrogen", 0.015), ("carbon dioxide", 0.005)),
    "typical": (("methane", 0.90), ("ethane", 0.06), ("propane", 0.03), ("n-butane", 0.01)),
    "rich": (("methane", 0.80), ("ethane", 0.08), ("propane", 0.04), ("n-butane", 0.02), ("nitrogen", 0.03),
             ("carbon dioxide", 0.03)),
}
COOLPROP_NAMES = {"methane": "Methane", "ethane": "Ethane", "propane": "Propane", "n-butane": "n-Butane",
                  "nitrogen": "Nitrogen", "carbon dioxide": "CarbonDioxide"}
Point = tuple[str, float, float]


def points(count: int) -> list[Point]:
    """(gas, pressure [Pa abs], temperature [K]) of each line: 10-100 bar abs, 5-60 degC."""
    names = list(GASES)
    return [(names[i % 3], (10.0 + 90.0 * ((i * 7919) % 1000) / 999.0) * 1e5,
             273.15 + 5.0 + 55.0 * ((i * 104729) % 1000) / 999.0) for i in range(count)]


def fluid_text(gas: str) -> str:
    return ", ".join(f"{name}:{z:g}" for name, z in GASES[gas])


def build_line_list(cases: list[Point], folder: Path) -> Path:
    path = folder / f"natural-gas-{len(cases)}.csv"
    rows = ["tag,fluid,flow,pressure,temperature,length [m],service"]
    for i, (gas, p, t) in enumerate(cases):
        rows.append(f'NG-{i:04d},"{fluid_text(gas)}",{20 + i % 50} t/h,{p / 1e5:.4f} bara,{t - 273.15:.3f} degC,'
                    f"{100 + (i * 37) % 400},gas")
    path.write_text("\n".join(rows) + "\n", encoding="utf-8")
    return path


def run_cli(path: Path) -> tuple[float, str]:
    """Seconds for ``boresize size`` on the list in this process, and its summary output's last line."""
    from boresize.cli.main import main

    out = io.StringIO()
    start = time.perf_counter()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(io.StringIO()):
        try:
            main(["size", str(path), "--criteria", str(CRITERIA), "--workers", "1"])
        except SystemExit:
            pass
    elapsed = time.perf_counter() - start
    summary = [text for text in out.getvalue().splitlines() if " lines: " in text]
    return elapsed, summary[-1].split("   ")[0] if summary else "no summary line"


def thermo_floor(cases: list[Point]) -> float:
    """Seconds for import thermo, one PR flasher per gas, and per line a flash, density and gas viscosity."""
    start = time.perf_counter()
    from thermo import PRMIX, CEOSGas, CEOSLiquid, ChemicalConstantsPackage, FlashVL

    flashers = {}
    for gas, composition in GASES.items():
        ids = [name for name, _ in composition]
        constants, correlations = ChemicalConstantsPackage.from_IDs(ids)
        kwargs = {"eos_kwargs": {"Pcs": constants.Pcs, "Tcs": constants.Tcs, "omegas": constants.omegas},
                  "HeatCapacityGases": correlations.HeatCapacityGases}
        gas_phase = CEOSGas(PRMIX, T=300.0, P=1e5, zs=[z for _, z in composition], **kwargs)
        liquid = CEOSLiquid(PRMIX, T=300.0, P=1e5, zs=[z for _, z in composition], **kwargs)
        flashers[gas] = (FlashVL(constants, correlations, liquid=liquid, gas=gas_phase),
                         [z for _, z in composition], correlations)
    for gas, p, t in cases:
        flasher, zs, correlations = flashers[gas]
        result = flasher.flash(T=t, P=p, zs=zs)
        result.rho_mass()
        (result.gas or result).mu()
    return time.perf_counter() - start


def coolprop_floor(cases: list[Point]) -> float:
    """Seconds for the same states through one CoolProp HEOS AbstractState per gas, gas phase imposed."""
    from CoolProp import CoolProp as CP

    start = time.perf_counter()
    states = {}
    for gas, composition in GASES.items():
        state = CP.AbstractState("HEOS", "&".join(COOLPROP_NAMES[name] for name, _ in composition))
        state.set_mole_fractions([z for _, z in composition])
        state.specify_phase(CP.iphase_gas)
        states[gas] = state
    for gas, p, t in cases:
        state = states[gas]
        state.update(CP.PT_INPUTS, p, t)
        state.rhomass()
        state.viscosity()
    return time.perf_counter() - start


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--lines", type=int, default=300)
    args = parser.parse_args()
    cases = points(args.lines)
    start = time.perf_counter()
    import CoolProp.CoolProp  # noqa: F401  # paid once by any program that uses CoolProp

    imported = time.perf_counter() - start
    with tempfile.TemporaryDirectory() as folder:
        path = build_line_list(cases, Path(folder))
        cli, summary = run_cli(path)
    thermo_loaded = "thermo" in sys.modules  # the floor below pays thermo's import only when the CLI did not
    floor = thermo_floor(cases)
    cool = coolprop_floor(cases)
    print(f"{len(cases)} natural-gas lines (3 gases, 10-100 bar abs, 5-60 degC); CoolProp import {imported:.2f} s "
          f"(before the timings)")
    print(f"boresize size (CLI, in-process, 1 worker): {cli:.2f} s   [{summary}]")
    print(f"thermo floor (import, PR flasher per gas, flash + density + gas viscosity per line): {floor:.2f} s"
          f"{'  [thermo already imported by the CLI run: import not counted]' if thermo_loaded else ''}")
    print(f"CoolProp HEOS floor (GERG-2008 path: gas phase imposed, density + viscosity per line): {cool:.3f} s")
    ratio = cli / floor
    print(f"ratio boresize / thermo floor = {ratio:.2f} (target <= {TARGET}): {'met' if ratio <= TARGET else 'NOT met'}")


if __name__ == "__main__":
    main()
