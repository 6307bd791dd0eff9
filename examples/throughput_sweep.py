"""Throughput sweep: which lines of a unit need upsizing if the unit runs at 80 % to 130 % of design?

Invented scenario, "Unit 50, solvent recovery" (no real plant): six existing lines, each with the
flow it carries at 100 % throughput and its installed NPS. For every throughput from 80 % to 130 %
in 5 % steps, each line is checked at its installed size (``check``); a line needs upsizing from the
first throughput at which it fails, and the size it would need at 130 % is found by sizing it there.
A plot of each line's utilisation (its controlling criterion's value over the limit; 1 is the limit)
against throughput is saved as a PNG.

Run: ``python examples/throughput_sweep.py [--out DIR] [--no-plugins]``
"""

from __future__ import annotations

import argparse
from pathlib import Path

import matplotlib

matplotlib.use("Agg")  # files only, no window
import matplotlib.pyplot as plt  # noqa: E402
import pint  # noqa: E402

import boresize  # noqa: E402

ureg = pint.UnitRegistry()  # our own registry: boresize reads Quantities by magnitude and unit name
Q_ = ureg.Quantity

# tag, fluid, flow at 100 %, inlet pressure, temperature, length, service, installed NPS
UNIT_50 = [
    ("50-P-101", "water", Q_(60, "t/h"), "8 barg", Q_(40, "degC"), Q_(150, "m"), "pump-discharge", "4"),
    ("50-P-102", "toluene", Q_(18, "t/h"), "4 barg", Q_(60, "degC"), Q_(90, "m"), "liquid", "3"),
    ("50-CW-110", "water", Q_(300, "m**3/hour"), "4 barg", Q_(28, "degC"), Q_(250, "m"), "cooling-water", "8"),
    ("50-G-120", "nitrogen", "1500 Nm3/h", "6 barg", Q_(20, "degC"), Q_(120, "m"), "gas", "3"),
    ("50-ST-130", "steam", Q_(5, "t/h"), "10 barg", Q_(200, "degC"), Q_(200, "m"), "steam", "6"),
    ("50-HC-140", "methanol", Q_(12, "t/h"), "3 barg", Q_(35, "degC"), Q_(60, "m"), "liquid", "3"),
]
THROUGHPUTS = [0.80 + 0.05 * i for i in range(11)]  # 80 % ... 130 %


def scaled(flow: object, factor: float) -> object:
    """The flow at ``factor`` times design: a Quantity scales; a text "1500 Nm3/h" is rewritten."""
    if isinstance(flow, str):
        number, unit = flow.split(" ", 1)
        return f"{float(number) * factor!r} {unit}"
    return flow * factor  # type: ignore[operator]


def line_at(row: tuple, factor: float, check_nps: bool = True) -> boresize.Line:
    tag, fluid, flow, pressure, temperature, length, service, nps = row
    return boresize.make_line(tag=tag, fluid=fluid, flow=scaled(flow, factor), pressure=pressure,
                              temperature=temperature, length=length, service=service,
                              nps=nps if check_nps else None)


def sweep(plugins: bool) -> dict[str, list[boresize.SizingResult]]:
    """Results per line tag, one per throughput (checked at the installed NPS)."""
    lines = [line_at(row, factor) for row in UNIT_50 for factor in THROUGHPUTS]
    results = boresize.size_many(lines, plugins=plugins)
    n = len(THROUGHPUTS)
    return {row[0]: results[i * n:(i + 1) * n] for i, row in enumerate(UNIT_50)}


def report(by_line: dict[str, list[boresize.SizingResult]], plugins: bool) -> list[str]:
    """One text line per line: fine over the whole range, or from which throughput it fails and why."""
    text = []
    for row in UNIT_50:
        tag, results = row[0], by_line[row[0]]
        failing = [(factor, r) for factor, r in zip(THROUGHPUTS, results) if r.status != "pass"]
        if not failing:
            text.append(f"{tag:10s} NPS {row[7]:>3s}: passes from 80 % to 130 % "
                        f"(utilisation {results[-1].utilisation:.2f} at 130 %)")
            continue
        factor, first = failing[0]
        needed = boresize.size(line_at(row, THROUGHPUTS[-1], check_nps=False), plugins=plugins)
        reason = first.error if first.status == "error" else \
            f"{first.controlling} at utilisation {first.utilisation:.2f}"
        text.append(f"{tag:10s} NPS {row[7]:>3s}: needs upsizing from {100 * factor:.0f} % ({reason}); "
                    f"NPS {needed.nps} Sch {needed.schedule} carries 130 %")
    return text


def plot(by_line: dict[str, list[boresize.SizingResult]], path: Path) -> Path:
    figure, axes = plt.subplots(figsize=(8, 5))
    percent = [100 * f for f in THROUGHPUTS]
    for tag, results in by_line.items():
        axes.plot(percent, [r.utilisation if r.utilisation is not None else float("nan") for r in results],
                  marker="o", label=tag)
    axes.axhline(1.0, color="red", linestyle="--", label="limit")
    axes.set_xlabel("unit throughput [% of design]")
    axes.set_ylabel("utilisation of the controlling criterion [-]")
    axes.set_title("Unit 50 (invented): lines at their installed size")
    axes.legend(fontsize="small")
    axes.grid(True, alpha=0.3)
    figure.savefig(path, dpi=100, bbox_inches="tight")
    plt.close(figure)
    return path


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default="out", help="folder for the plot (created if missing)")
    parser.add_argument("--no-plugins", action="store_true", help="use only boresize's built-in plugins")
    args = parser.parse_args(argv)
    plugins = not args.no_plugins
    by_line = sweep(plugins)
    for text in report(by_line, plugins):
        print(text)
    out = Path(args.out)
    out.mkdir(parents=True, exist_ok=True)
    print(f"plot written to {plot(by_line, out / 'throughput_sweep.png')}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
