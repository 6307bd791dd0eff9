"""Benchmark: what each remaining speed trick of reading and rating gains, on the case it names.

Method as in ``bench_rating.py``: one process; each case is run once to warm every cache (property results
included), then the two variants run in turn on every chunk of the case (interleaved, the order
alternating, CPU time of this process, so that a busy machine slows both alike); the script prints the
median time of each and the gain of the trick in % of the time without it. The project keeps a trick only
where it gains at least 10 % on its case (DEVELOPERS.md); a kept trick carries a one-line comment with the
figure printed here. A trick is switched off (or back on) by patching, whatever the source holds, so that a
trick taken out can be measured again:

* ``unit-conversions``: :mod:`boresize.units.quantities` keeps the conversion of each unit text that parsed
  (``_CONVERSIONS``), so that the next number in that unit is a multiply and an add;
* ``unit-lru``: its ``lru_cache`` on the pint parse of a unit expression, the linear map to SI, the offset
  units and the dimension of an SI unit (``unit-both``: this and ``unit-conversions`` together); on the
  ``rows-errors`` case, all four (``unit-lru-errors``) and each (``unit-parse``: the parse and the offset
  units, ``unit-linear``, ``unit-dimension``);
* ``nps-texts``: :mod:`boresize.pipes.catalogue` keeps the NPS and schedule spellings read
  (``_LABEL_BY_TEXT``, ``_SCHEDULE_BY_TEXT``);
* ``coolprop-names``: the CoolProp backend keeps each fluid spelling's canonical name (``_known``);
* ``thermo-names``: the thermo backend's ``lru_cache`` of parsed and resolved compositions (``_resolve``);
* ``component-names``: :mod:`boresize.properties.components`' ``lru_cache`` of component look-ups
  (``resolve_component``, ``_search``);
* ``heos-names``: the CoolProp mixture backend's ``lru_cache`` of parsed compositions (``_heos_key``);
* ``bands-context`` / ``bands-verdict``: a banded criterion builds the engine's ``CriterionContext`` and the
  ``Verdict`` directly instead of through ``dataclasses.replace`` (``bands-both``: the two together);
* ``band-reason``: a band's note for the reasons is a ``cached_property`` (off: a property);
* ``fittings-plans``: :mod:`boresize.hydraulics.fittings` keeps each line's parsed fittings and every K
  that does not depend on Re (``_PLANS``).

Cases: ``rows`` reads the 2,000-line list of ``bench_batch.py`` into Lines (``line_from_row``); ``rows-nps``
is the same list with an NPS and a schedule on every row, in assorted spellings; ``rows-errors`` the same
list with a length of the wrong dimension on every row (each row's message path); ``demo`` sizes it;
``banded`` sizes 400 lines on the shipped services with banded limits (``bench_rating.py``); ``mixtures``
sizes 200 lines of gas mixtures (thermo and CoolProp HEOS) and a component only the chemicals database
serves; ``fittings`` sizes 400 of the demo lines with a fittings list on each.

Run: ``.venv/bin/python benchmarks/bench_parsing.py [--lines 2000] [--repeat 7] [--only NAME]``
"""

from __future__ import annotations

import argparse
import dataclasses
import statistics
import sys
import tempfile
import time
from collections.abc import Callable, Iterator, Mapping, Sequence
from contextlib import contextmanager
from pathlib import Path
from typing import Any

sys.path.insert(0, str(Path(__file__).resolve().parent))
from bench_batch import DEMO, build_line_list  # noqa: E402
from bench_rating import banded_lines  # noqa: E402

import boresize.hydraulics.fittings as fittings  # noqa: E402
import boresize.hydraulics.line as hydraulics_line  # noqa: E402
import boresize.pipes.catalogue as catalogue  # noqa: E402
import boresize.properties.components as components  # noqa: E402
import boresize.properties.thermo as thermo  # noqa: E402
import boresize.units.quantities as quantities  # noqa: E402
from boresize.api import make_line  # noqa: E402
from boresize.criteria.bands import Band, BandedCriterion  # noqa: E402
from boresize.criteria.base import CriterionContext  # noqa: E402
from boresize.errors import InputError  # noqa: E402
from boresize.io.read import read_line_list  # noqa: E402
from boresize.io.rows import line_from_row  # noqa: E402
from boresize.model import Line, Verdict  # noqa: E402
from boresize.plugins import PluginHost  # noqa: E402
from boresize.properties.coolprop import CoolPropBackend, _normalise, is_mixture  # noqa: E402
from boresize.properties.coolprop_mixture import CoolPropMixtureBackend  # noqa: E402
from boresize.sizing import engine  # noqa: E402

Row = tuple[Mapping[str, object], Mapping[str, str | None], int]


# -- the tricks, both ways ------------------------------------------------------------------------------------
@contextmanager
def _attributes(on: bool, target: Any, plain: Mapping[str, Any]) -> Iterator[None]:
    """Without the trick: ``target``'s attributes named in ``plain`` replaced by the plain ones."""
    original = {name: getattr(target, name) for name in plain}
    if not on:
        for name, value in plain.items():
            setattr(target, name, value)
    try:
        yield
    finally:
        for name, value in original.items():
            setattr(target, name, value)


def _uncached(*functions: Any) -> dict[str, Any]:
    return {f.__name__: f.__wrapped__ for f in functions}


def unit_conversions(on: bool) -> Any:
    return _attributes(on, quantities, {"_CONVERSIONS": {}, "_remember": lambda *args, **kwargs: None})


def unit_lru(on: bool) -> Any:
    q = quantities
    return _attributes(on, q, _uncached(q._unit_of, q._to_si, q._offset_unit, q._dimension))


def unit_parse(on: bool) -> Any:
    return _attributes(on, quantities, _uncached(quantities._unit_of, quantities._offset_unit))


def unit_linear(on: bool) -> Any:
    return _attributes(on, quantities, _uncached(quantities._to_si))


def unit_dimension(on: bool) -> Any:
    return _attributes(on, quantities, _uncached(quantities._dimension))


@contextmanager
def unit_both(on: bool) -> Iterator[None]:
    with unit_conversions(on), unit_lru(on):
        yield


def nps_texts(on: bool) -> Any:
    return _attributes(on, catalogue, {"_LABEL_BY_TEXT": {}, "_SCHEDULE_BY_TEXT": {},
                                       "_remember": lambda *args: None})


def _known_name_plain(self: CoolPropBackend, fluid: str) -> str | None:
    return None if is_mixture(fluid) else self._name_map().get(_normalise(fluid))


def coolprop_names(on: bool) -> Any:
    return _attributes(on, CoolPropBackend, {"_known_name": _known_name_plain})


def thermo_names(on: bool) -> Any:
    return _attributes(on, thermo, _uncached(thermo._resolve))


def component_names(on: bool) -> Any:
    return _attributes(on, components, _uncached(components.resolve_component, components._search))


def heos_names(on: bool) -> Any:
    return _attributes(on, CoolPropMixtureBackend, _uncached(CoolPropMixtureBackend._heos_key))


def _banded_evaluate(direct_context: bool, direct_verdict: bool) -> Callable[[Any, CriterionContext], Verdict]:
    """``BandedCriterion.evaluate`` with or without each of its two direct constructions."""

    def evaluate(self: Any, context: CriterionContext) -> Verdict:
        cand, line = context.candidate, context.line
        band = self.band_for(cand.nps_value, line.pressure)
        if band is None:
            return _ORIGINAL_EVALUATE(self, context)
        if direct_context and type(context) is CriterionContext:
            banded = CriterionContext(line, context.state, cand, context.hydraulics, band.options, context.service)
        else:
            banded = dataclasses.replace(context, options=band.options)
        result = self.inner.evaluate(banded)
        if direct_verdict and type(result) is Verdict:
            return Verdict(result.criterion, result.status, (*result.reasons, band.reason), result.source,
                           result.value, result.limit, result.unit, result.utilisation)
        if not isinstance(result, Verdict):
            return result  # type: ignore[no-any-return]
        return dataclasses.replace(result, reasons=(*result.reasons, band.reason))

    return evaluate


_ORIGINAL_EVALUATE = BandedCriterion.evaluate


def bands_context(on: bool) -> Any:
    return _attributes(on, BandedCriterion, {"evaluate": _banded_evaluate(False, True)})


def bands_verdict(on: bool) -> Any:
    return _attributes(on, BandedCriterion, {"evaluate": _banded_evaluate(True, False)})


def bands_both(on: bool) -> Any:
    return _attributes(on, BandedCriterion, {"evaluate": _banded_evaluate(False, False)})


def _fittings_loss_plain(items: Any, method: str | None, *, reynolds: float, inside_diameter: float,
                         nps: float) -> Any:
    chosen = fittings.normalise_method(method)
    terms, fixed = fittings._plan(tuple(items), chosen, inside_diameter, nps)
    return fixed if fixed is not None else fittings._loss(terms, chosen, reynolds)


@contextmanager
def fittings_plans(on: bool) -> Iterator[None]:
    with _attributes(on, hydraulics_line, {"fittings_loss": _fittings_loss_plain}), \
            _attributes(on, fittings, {"fittings_loss": _fittings_loss_plain}):
        yield


@contextmanager
def band_reason(on: bool) -> Iterator[None]:
    """Without: the band's reason written for every verdict (a property instead of a cached one)."""
    original = Band.__dict__["reason"]
    if not on:
        Band.reason = property(original.func)  # type: ignore[assignment]
    try:
        yield
    finally:
        Band.reason = original  # type: ignore[method-assign]


TRICKS: dict[str, tuple[Callable[[bool], Any], str]] = {
    "unit-conversions": (unit_conversions, "rows"),
    "unit-lru": (unit_lru, "rows"),
    "unit-both": (unit_both, "rows"),
    "unit-lru-errors": (unit_lru, "rows-errors"),
    "unit-parse": (unit_parse, "rows-errors"),
    "unit-linear": (unit_linear, "rows-errors"),
    "unit-dimension": (unit_dimension, "rows-errors"),
    "nps-texts": (nps_texts, "rows-nps"),
    "coolprop-names": (coolprop_names, "demo"),
    "thermo-names": (thermo_names, "mixtures"),
    "component-names": (component_names, "mixtures"),
    "heos-names": (heos_names, "mixtures"),
    "bands-context": (bands_context, "banded"),
    "bands-verdict": (bands_verdict, "banded"),
    "bands-both": (bands_both, "banded"),
    "band-reason": (band_reason, "banded"),
    "fittings-plans": (fittings_plans, "fittings"),
}


# -- the cases ------------------------------------------------------------------------------------------------
def list_rows(count: int) -> list[Row]:
    with tempfile.TemporaryDirectory() as folder:
        listed = read_line_list(build_line_list(count, Path(folder)))
    return [(row, listed.units, position) for position, row in enumerate(listed.rows, start=2)]


_NPS = ("3", '4"', "6", "NPS 8", "1-1/2", "2", "10", "1 1/2")
_SCHEDULES = ("40", "STD", "Sch 80", "40S", "XS", "80")


def rows_with_nps(rows: Sequence[Row]) -> list[Row]:
    return [({**row, "nps": _NPS[i % len(_NPS)], "schedule": _SCHEDULES[i % len(_SCHEDULES)]}, units, position)
            for i, (row, units, position) in enumerate(rows)]


def mixture_lines(count: int) -> list[list[Line]]:
    natural_gas = "methane:0.90, ethane:0.06, propane:0.04"
    lines = []
    for i in range(count):
        scale = 0.5 + ((i * 7919) % 1000) / 1000.0
        kind = i % 3
        if kind == 0:
            lines.append(make_line(f"T-{i}", natural_gas, f"{20000 * scale:.5g} Sm3/h", "20 barg", "30 degC",
                                   service="gas", length="300 m"))
        elif kind == 1:
            lines.append(make_line(f"H-{i}", natural_gas, f"{20000 * scale:.5g} Sm3/h", "20 barg", "30 degC",
                                   service="gas", length="300 m", backend="coolprop-mixture"))
        else:
            lines.append(make_line(f"C-{i}", "n-hexadecane", f"{10 * scale:.4g} t/h", "3 barg", "60 degC",
                                   service="liquid", length="100 m"))
    return [[line] for line in lines]


def fittings_lines(rows: Sequence[Row], count: int) -> list[list[Line]]:
    items = "elbow-90-sr: 6; elbow-45-sr: 2; gate: 2; check-swing: 1; tee-run: 3; entrance: 1; exit: 1"
    return [[line_from_row({**row, "fittings": items}, units, position)] for row, units, position in rows[:count]]


def rows_with_errors(rows: Sequence[Row]) -> list[Row]:
    """The list with a length of the wrong dimension on every row (a column filled in the wrong unit)."""
    return [({**row, "length": f"{i % 90 + 10} kg"}, units, position) for i, (row, units, position) in enumerate(rows)]


def read_rows(rows: Sequence[Row]) -> float:
    start = time.process_time()
    for row, units, position in rows:
        try:
            line_from_row(row, units, position)
        except InputError:
            pass
    return time.process_time() - start


def size_all(sizer: engine.Sizer, lines: Sequence[Sequence[Line]]) -> float:
    start = time.process_time()
    for cases in lines:
        sizer.run_cases(list(cases))
    return time.process_time() - start


def measure(name: str, work: Sequence[Any], run: Callable[[Sequence[Any]], float], repeat: int,
            chunk: int) -> float:
    """Median CPU seconds of the case with and without the trick; prints and returns the gain in %."""
    patch, case = TRICKS[name]
    times: dict[bool, list[float]] = {True: [], False: []}
    for rep in range(repeat):
        total = {True: 0.0, False: 0.0}
        for number, first in enumerate(range(0, len(work), chunk)):
            part = work[first:first + chunk]
            for on in ((True, False) if (rep + number) % 2 == 0 else (False, True)):
                with patch(on):
                    total[on] += run(part)
        for on, seconds in total.items():
            times[on].append(seconds)
    with_, without = statistics.median(times[True]), statistics.median(times[False])
    gain = (without - with_) / without * 100.0
    print(f"{name:17s} case {case:9s} with {with_ * 1e3:8.1f} ms  without {without * 1e3:8.1f} ms  "
          f"gain {gain:+5.1f} %  ({repeat} repetitions interleaved by {chunk}, CPU-time medians)", flush=True)
    return gain


def main(argv: Sequence[str] | None = None) -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--lines", type=int, default=2000, help="lines of the rows and demo cases")
    parser.add_argument("--repeat", type=int, default=7)
    parser.add_argument("--only", choices=sorted(TRICKS), action="append")
    args = parser.parse_args(argv)
    names = args.only or list(TRICKS)
    needed = {TRICKS[name][1] for name in names}
    rows = list_rows(args.lines)
    sizer = engine.Sizer(PluginHost.load(load_entry_points=False), criteria_file=DEMO / "criteria.toml")
    sized = {"demo": lambda: [[line_from_row(*row)] for row in rows],
             "banded": lambda: banded_lines(max(args.lines // 5, 10)),
             "mixtures": lambda: mixture_lines(max(args.lines // 10, 9)),
             "fittings": lambda: fittings_lines(rows, max(args.lines // 5, 10))}
    cases: dict[str, tuple[Sequence[Any], Callable[[Sequence[Any]], float], int]] = {
        "rows": (rows, read_rows, 200), "rows-nps": (rows_with_nps(rows), read_rows, 200),
        "rows-errors": (rows_with_errors(rows), read_rows, 200)}
    for case in needed & sized.keys():
        cases[case] = (sized[case](), lambda part: size_all(sizer, part), 50)
    for work, run, _ in (cases[case] for case in needed):
        run(work)  # warm every cache
    for name in names:
        work, run, chunk = cases[TRICKS[name][1]]
        measure(name, work, run, args.repeat, chunk)


if __name__ == "__main__":
    main()
