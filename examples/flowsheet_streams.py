"""Size the lines of a flowsheet from its streams, as a simulation script would.

Invented flowsheet, "Unit 30, methanol recovery" (no real plant): a water/methanol feed is
pumped to a column; methanol goes overhead and is condensed; the water leaves at the bottom; a
fuel gas fires the reboiler and cooling water serves the condenser. A simulation tool would hand
over each stream as an object with T [K], P [Pa], mass flow [kg/s] and mole fractions of every
component of the flowsheet (most of them zero in any one stream); here they are plain dicts and
one small class. Each stream becomes a line with :func:`boresize.line_from_stream` (``si=True``: the
caller states the export is SI; a bare number of unknown unit is refused) and is sized.

Run: ``python examples/flowsheet_streams.py [--no-plugins]``
"""

from __future__ import annotations

import argparse
from dataclasses import dataclass

import boresize
from boresize.io.streams import stream_value

COMPONENTS = ("water", "methanol", "methane", "ethane", "propane", "nitrogen")


@dataclass
class Stream:
    """What a simulation tool's stream object offers (invented, SI): T [K], P [Pa abs], F_mass [kg/s]."""

    ID: str
    T: float
    P: float
    F_mass: float
    zs: tuple[float, ...]  # mole fractions in the order of IDs
    IDs: tuple[str, ...] = COMPONENTS


# The streams as the simulation exported them; line data (service, length) comes from the line list.
STREAMS: list[object] = [
    {"name": "S-301", "T": 313.15, "P": 4.0e5, "mass_flow": 6.0,
     "composition": {"water": 0.85, "methanol": 0.15, "methane": 0.0, "ethane": 0.0, "propane": 0.0, "nitrogen": 0.0}},
    Stream("S-302", T=318.15, P=3.0e5, F_mass=1.6, zs=(0.01, 0.99, 0.0, 0.0, 0.0, 0.0)),
    Stream("S-303", T=378.15, P=2.5e5, F_mass=4.4, zs=(0.995, 0.005, 0.0, 0.0, 0.0, 0.0)),
    {"name": "S-304", "T": 300.0, "P": 5.0e5, "mass_flow": 0.06,
     "composition": {"methane": 0.92, "ethane": 0.05, "propane": 0.02, "nitrogen": 0.01}},
    Stream("S-305", T=301.15, P=4.5e5, F_mass=45.0, zs=(1.0, 0.0, 0.0, 0.0, 0.0, 0.0)),
]
LINE_DATA = {  # tag -> line-list fields the simulation does not know
    "S-301": {"service": "liquid", "length": "80 m"},
    # S-302 (99 wt% methanol) and S-303 (105 degC) lie outside the aqueous backend's Melinder correlations
    # (0-60 wt%, up to 40 degC for methanol), which refuse them: thermo's cubic equation of state is named instead.
    "S-302": {"service": "liquid", "length": "40 m", "backend": "thermo"},
    "S-303": {"service": "liquid", "length": "60 m", "backend": "thermo"},
    "S-304": {"service": "gas", "length": "120 m"},
    "S-305": {"service": "cooling-water", "length": "200 m"},
}


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--no-plugins", action="store_true", help="use only boresize's built-in plugins")
    plugins = not parser.parse_args(argv).no_plugins
    print(f"{'line':6s} {'fluid':30s} {'NPS':>6s} {'v [m/s]':>8s} {'dp [kPa/100 m]':>15s}  controlling      status")
    worst = 0
    for stream in STREAMS:
        tag = str(stream_value(stream, "tag"))
        line = boresize.line_from_stream(stream, si=True, **LINE_DATA[tag])  # this export is SI
        result = boresize.size(line, plugins=plugins)
        if result.status == "error":
            print(f"{tag:6s} error: {result.error}")
            worst = 1
            continue
        print(f"{tag:6s} {line.fluid[:30]:30s} {result.nps:>6s} {result.velocity_m_s:8.2f} "
              f"{result.dp_kpa_per_100m:15.1f}  {result.controlling or '-':15s}  {result.status}")
        worst = max(worst, 0 if result.passed else 1)
    return worst


if __name__ == "__main__":
    raise SystemExit(main())
