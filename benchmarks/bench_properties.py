"""Property calls per second: a pure fluid and a 5-component mixture, with and without the cache.

Run from the project root (not part of the test suite; it takes about a minute):

    .venv/bin/python benchmarks/bench_properties.py [--scale 0.2]

Modes: "cached" repeats one state point (the backend's result cache answers); "new point" changes the
pressure on every call (and, for "full flash", the temperature too, so that no phase decision is reused);
"phase known" changes only the pressure at one temperature, where the backend evaluates the known phase
without a flash. The first call of each backend (library import, database load) is timed separately.
"""

from __future__ import annotations

import argparse
import time
from collections.abc import Callable

from boresize.model import Flow, Line
from boresize.properties.coolprop import CoolPropBackend
from boresize.properties.coolprop_mixture import CoolPropMixtureBackend
from boresize.properties.thermo import ThermoBackend

MIXTURE = "methane:0.85, ethane:0.07, propane:0.03, nitrogen:0.03, carbon dioxide:0.02"
T0 = 273.15


def line(fluid: str) -> Line:
    return Line(tag="BENCH", fluid=fluid, flow=Flow("mass", 1.0), pressure=50e5, temperature=T0 + 20.0)


def rate(call: Callable[[int], object], count: int) -> float:
    """Calls per second of ``call(i)`` for i in range(count)."""
    start = time.perf_counter()
    for i in range(count):
        call(i)
    return count / (time.perf_counter() - start)


def first_call(backend: object, fluid: str) -> float:
    """Seconds for the first call (imports and databases)."""
    start = time.perf_counter()
    backend.state(line(fluid), 50e5, T0 + 20.0)  # type: ignore[attr-defined]
    return time.perf_counter() - start


def cases(scale: float) -> list[tuple[str, str, str, Callable[[int], object], int]]:
    pure, thermo, mixture = CoolPropBackend(), ThermoBackend(), CoolPropMixtureBackend()
    water, gas = line("water"), line(MIXTURE)
    n = lambda count: max(5, int(count * scale))  # noqa: E731
    return [
        ("coolprop", "water", "cached", lambda i: pure.state(water, 50e5, T0 + 20.0), n(20000)),
        ("coolprop", "water", "new point", lambda i: pure.state(water, 50e5 + i, T0 + 20.0), n(2000)),
        ("thermo", "5-component gas", "cached", lambda i: thermo.state(gas, 50e5, T0 + 20.0), n(20000)),
        ("thermo", "5-component gas", "phase known", lambda i: thermo.state(gas, 40e5 + i, T0 + 21.0), n(2000)),
        ("thermo", "5-component gas", "full flash", lambda i: thermo.state(gas, 40e5 + i, T0 + 30.0 + i * 1e-3), n(300)),
        ("coolprop-mixture", "5-component gas", "cached", lambda i: mixture.state(gas, 50e5, T0 + 20.0), n(20000)),
        ("coolprop-mixture", "5-component gas", "phase known", lambda i: mixture.state(gas, 40e5 + i, T0 + 21.0), n(500)),
        ("coolprop-mixture", "5-component gas", "full flash",
         lambda i: mixture.state(gas, 40e5 + i, T0 + 30.0 + i * 1e-3), n(30)),
    ], {"coolprop": (pure, "water"), "thermo": (thermo, MIXTURE), "coolprop-mixture": (mixture, MIXTURE)}


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--scale", type=float, default=1.0, help="fraction of the default call counts")
    args = parser.parse_args()
    rows, firsts = cases(args.scale)
    print(f"{'backend':<18}{'fluid':<17}{'mode':<13}{'calls':>7}{'calls/s':>12}{'us/call':>10}")
    for name, (backend, fluid) in firsts.items():
        print(f"{name:<18}{'':<17}{'first call':<13}{1:>7}{'':>12}{first_call(backend, fluid) * 1e6:>10.0f}")
    for backend, fluid, mode, call, count in rows:
        if mode == "phase known":
            rate(lambda i: call(-1 - i), 5)  # the flashes that decide the phase at this temperature
        per_second = rate(call, count)
        print(f"{backend:<18}{fluid:<17}{mode:<13}{count:>7}{per_second:>12.0f}{1e6 / per_second:>10.1f}")


if __name__ == "__main__":
    main()
