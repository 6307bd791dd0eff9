"""Fuzzing of the unit parser and the line-list readers (hypothesis).

Whatever text or object arrives, each entry point either gives a clean result or raises an error
of boresize's own tree (:class:`boresize.errors.BoresizeError`) that names its field and what was
expected: never another exception, never an infinite or NaN number, never a hang. A hang is caught
by a watchdog timer that interrupts an example running for seconds (no per-example hypothesis deadline:
on a loaded machine a 400 ms deadline failed examples that take under 1 ms when run again).

The quick runs are derandomized (the same examples every time, so CI is stable); the ``slow``
sweeps draw fresh random examples on every run. The properties are the package's contract
(README: "No Python traceback reaches the user"; errors name the field, the value and what was
expected), not values computed by boresize.
"""

from __future__ import annotations

import contextlib
import math
import signal
import typing
from collections.abc import Iterator

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from boresize.errors import BoresizeError, InputError
from boresize.io.csv_reader import LineList, parse_csv_text
from boresize.io.rows import COLUMNS, line_from_row
from boresize.model import Flow, Line
from boresize.units import QuantityKind, parse_flow, parse_quantity, registry
from boresize.api import size_rows

KINDS = typing.get_args(QuantityKind)
QUICK = settings(max_examples=150, deadline=None, derandomize=True,
                 suppress_health_check=[HealthCheck.too_slow])
SWEEP = settings(max_examples=3000, deadline=None,
                 suppress_health_check=[HealthCheck.too_slow])
BUDGETS = [pytest.param(QUICK, id="quick"), pytest.param(SWEEP, id="sweep", marks=pytest.mark.slow)]
WATCHDOG_S = 5.0  # an example still running after this long is a hang


class Hang(Exception):
    """Raised by the watchdog inside an example that runs for too long (not a boresize error)."""


@contextlib.contextmanager
def watchdog(seconds: float = WATCHDOG_S) -> Iterator[None]:
    """Interrupt the block with :class:`Hang` after ``seconds`` (SIGALRM; main thread, POSIX)."""
    def _raise(signum: int, frame: object) -> None:
        raise Hang(f"still running after {seconds} s")

    previous = signal.signal(signal.SIGALRM, _raise)
    signal.setitimer(signal.ITIMER_REAL, seconds)
    try:
        yield
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)


@pytest.fixture(scope="module", autouse=True)
def _warm_registry() -> None:
    registry()  # the first call builds pint's registry (~0.3 s): not an example's time


# ---------------------------------------------------------------------------------------------
# Strategies: text an engineer (or a broken export) might put in a cell

NUMBER_TEXT = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True).map(repr),
    st.integers(min_value=-(10**40), max_value=10**40).map(str),
    st.from_regex(r"[+-]?\d{0,5}(\.\d{0,4})?([eE][+-]?\d{1,3})?", fullmatch=True),
    st.sampled_from(["nan", "NaN", "inf", "-inf", "Infinity", "1,5", "1.500,25", "1 500", "1_000", "0x1F",
                     "", " ", "--1", "+-2", ".", "1e", "1e999", "1e-999", "١٢", "½"]),
)
UNIT_WORDS = st.sampled_from([
    "m", "mm", "km", "ft", "in", "kg", "g", "lb", "t", "te", "ton", "h", "hr", "s", "min", "d", "day",
    "barg", "bara", "bar", "bar(g)", "bar a", "kPa", "kPag", "kpa", "MPa", "Mpa", "mPa", "psi", "psig", "psia",
    "kg/cm2g", "atm", "Pa", "degC", "°C", "deg C", "℃", "C", "F", "K", "R", "degF", "°F", "degR",
    "m3", "m³", "M3", "Sm3", "Nm3", "nm3", "scf", "MMSCFD", "MMscfd", "scfm", "gpm", "bbl", "BPD", "l", "L",
    "cP", "cp", "mPa.s", "mPa·s", "mPas", "Pa s", "St", "%", "pct", "-", "frac",
    "/", "/", "*", "**", "^", "(", ")", "[", "]", " ", " ", "100", "0", "-1", "2", "9", "99", "1e308",
    "1e-308", ".", ",", ";", "$", "#", "'", '"', "\\", "µ", "²", "³", "·", "−", "🙂", "\x00", "\t", "\n",
    "nan", "inf", "_", "e", "E", "dimensionless", "delta_degC", "offset", "=", "@", "!",
])
UNIT_TEXT = st.lists(UNIT_WORDS, max_size=7).map("".join)
CELL_TEXT = st.one_of(
    st.tuples(NUMBER_TEXT, st.sampled_from(["", " ", "  "]), UNIT_TEXT).map("".join),
    st.text(max_size=30),
    st.text(alphabet="0123456789.eE+-*/^() kgmsbarhtPaCFK%,;", max_size=25),
)
ODD_VALUES = st.one_of(
    st.none(), st.booleans(), st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**400), max_value=10**400), st.just([3]), st.just({"a": 1}), st.binary(max_size=8),
    st.complex_numbers(max_magnitude=10, allow_nan=False), st.decimals(allow_nan=True, allow_infinity=True),
    st.fractions(),
)
DEFAULT_UNITS = st.one_of(st.none(), UNIT_TEXT, UNIT_TEXT.map(lambda u: f"[{u}]"))


def _check_error(exc: BoresizeError, field: str) -> None:
    """A user-facing error names its field and what was expected (the value is in ``exc.value``)."""
    if isinstance(exc, InputError):
        assert exc.field is not None and exc.field.startswith(field), (exc.field, str(exc))
        assert exc.expected, str(exc)
        assert f"{exc.field}: " in str(exc), str(exc)


# ---------------------------------------------------------------------------------------------
# Unit parser

@pytest.mark.parametrize("budget", BUDGETS)
def test_parse_quantity_gives_a_finite_si_value_or_an_error_of_the_tree(budget: settings) -> None:
    @budget
    @given(value=st.one_of(CELL_TEXT, ODD_VALUES), kind=st.sampled_from(KINDS), unit=DEFAULT_UNITS)
    def check(value: object, kind: str, unit: str | None) -> None:
        try:
            with watchdog():
                result = parse_quantity(value, "cell", kind, unit)  # type: ignore[arg-type]
        except BoresizeError as exc:
            _check_error(exc, "cell")
            return
        assert type(result) is float and math.isfinite(result), result
        if kind in ("pressure", "temperature"):
            assert result > 0.0, result  # absolute pressure and thermodynamic temperature

    check()


@pytest.mark.parametrize("budget", BUDGETS)
def test_parse_flow_gives_a_finite_flow_with_its_basis_or_an_error_of_the_tree(budget: settings) -> None:
    @budget
    @given(value=st.one_of(CELL_TEXT, ODD_VALUES), unit=DEFAULT_UNITS)
    def check(value: object, unit: str | None) -> None:
        try:
            with watchdog():
                flow = parse_flow(value, "flow", unit)  # type: ignore[arg-type]
        except BoresizeError as exc:
            _check_error(exc, "flow")
            return
        assert isinstance(flow, Flow) and flow.basis in ("mass", "volume", "standard-volume", "molar")  # molar: kmol/h, lbmol/h
        assert math.isfinite(flow.value), flow
        if flow.basis == "standard-volume":
            assert flow.reference_t and flow.reference_p and flow.reference_name, flow

    check()


@pytest.mark.parametrize("text", [
    "1 m*10**10**10",       # a tower of powers: Python would compute a 10-billion-digit integer
    "1 (m)**9**9**9",
    "1 m*9**9**9",
    "1 m*(10**99)**99",
])
def test_a_tower_of_powers_in_a_unit_is_refused_quickly(text: str) -> None:
    with watchdog(2.0), pytest.raises(InputError, match=r"^length: "):
        parse_quantity(text, "length", "length")


@pytest.mark.parametrize(("text", "message"), [
    ("1 m/0", "length: cannot read the unit of '1 m/0'; expected a length (m, mm, km, ft, in)"),
    ("1e308 m*10", "length: '1e308 m*10' is not a finite number; expected a finite number"),
])
def test_a_unit_that_divides_by_zero_or_overflows_is_an_input_error(text: str, message: str) -> None:
    with pytest.raises(InputError) as info:
        parse_quantity(text, "length", "length")
    assert str(info.value) == message


# ---------------------------------------------------------------------------------------------
# Line-list readers

VALID_ROW = {"tag": "P-1", "fluid": "water", "flow": "10 t/h", "pressure": "5 barg", "temperature": "20 degC",
             "length": "120 m", "service": "liquid", "design_margin": "10 %", "fittings": "elbow-90-lr: 4"}
ROW_KEYS = st.sampled_from(tuple(COLUMNS) + ("lenght", "", "remarks"))
ROWS = st.dictionaries(ROW_KEYS, st.one_of(CELL_TEXT, ODD_VALUES), max_size=8)
UNIT_MAPS = st.dictionaries(st.sampled_from(COLUMNS), st.one_of(st.none(), UNIT_TEXT), max_size=4)


def _check_line(line: Line) -> None:
    """A clean Line holds only finite SI numbers, with the signs physics needs."""
    assert line.tag and line.fluid
    assert math.isfinite(line.flow.value) and line.flow.value > 0.0, line.flow
    assert math.isfinite(line.pressure) and line.pressure > 0.0, line.pressure
    assert math.isfinite(line.temperature) and line.temperature > 0.0, line.temperature
    assert math.isfinite(line.length) and line.length > 0.0, line.length
    for name in ("density", "viscosity", "roughness", "npsh_required", "source_pressure", "min_outlet_pressure"):
        value = getattr(line, name)
        assert value is None or (math.isfinite(value) and value > 0.0), (name, value)
    for name in ("elevation", "fixed_drop"):
        assert math.isfinite(getattr(line, name)), name
    assert line.design_margin is None or 0.0 <= line.design_margin < 1.0
    assert all(math.isfinite(count) and count > 0 for _, count in line.fittings), line.fittings


@pytest.mark.parametrize("budget", BUDGETS)
def test_line_from_row_gives_a_clean_line_or_an_error_naming_the_line(budget: settings) -> None:
    @budget
    @given(cells=ROWS, units=UNIT_MAPS, start=st.sampled_from([VALID_ROW, {}]))
    def check(cells: dict[str, object], units: dict[str, str | None], start: dict[str, str]) -> None:
        row = {**start, **cells}
        try:
            with watchdog():
                line = line_from_row(row, units, position=7)
        except BoresizeError as exc:
            if isinstance(exc, InputError):
                assert exc.tag, str(exc)  # the line (its tag, or "row 7") is named
                assert exc.field and exc.expected, str(exc)
            return
        _check_line(line)

    check()


CSV_ALPHABET = st.sampled_from(list("tagflowpressuretemperature[]/ 0123456789.,;\t\"'\n\r#-") +
                               ["\ufeff", "t/h", "barg", "degC", "water", "tag", "fluid", "flow", "pressure",
                                "temperature", "nps", "\r\n", ",,", ";;", '""', "é", "\x00"])
CSV_TEXT = st.lists(CSV_ALPHABET, max_size=60).map("".join)
HEADER = st.lists(st.sampled_from(list(COLUMNS) + ["flow [t/h]", "Pressure [barg]", "lenght", "", " tag "]),
                  min_size=1, max_size=8)


@st.composite
def csv_documents(draw: st.DrawFn) -> str:
    """A header from the real columns (sometimes misspelt) and rows of fuzzed cells."""
    sep = draw(st.sampled_from([",", ";", "\t"]))
    header = draw(HEADER)
    rows = draw(st.lists(st.lists(CELL_TEXT.map(lambda c: c.replace("\n", " ")), max_size=len(header) + 2),
                         max_size=5))
    bom = draw(st.sampled_from(["", "\ufeff"]))
    quote = draw(st.booleans())
    cell = (lambda c: '"' + c.replace('"', '""') + '"') if quote else (lambda c: c)
    return bom + "\n".join(sep.join(cell(c) for c in line) for line in [header, *rows]) + "\n"


@pytest.mark.parametrize("budget", BUDGETS)
def test_parse_csv_text_gives_rows_or_an_error_of_the_tree(budget: settings) -> None:
    @budget
    @given(text=st.one_of(CSV_TEXT, csv_documents(), st.text(max_size=80)))
    def check(text: str) -> None:
        try:
            with watchdog():
                parsed = parse_csv_text(text, "fuzz.csv")
        except BoresizeError as exc:
            _check_error(exc, "")
            return
        assert isinstance(parsed, LineList)
        for position, row in enumerate(parsed.rows, start=1):
            assert all(isinstance(key, str) and isinstance(value, str) for key, value in row.items())
            try:
                with watchdog():
                    _check_line(line_from_row(row, parsed.units, position))
            except BoresizeError:
                pass

    check()


@pytest.mark.parametrize("budget", BUDGETS)
def test_sizing_fuzzed_rows_never_reports_an_internal_error(budget: settings, sizer) -> None:  # noqa: ANN001
    # End to end: whatever the rows hold, every row gets a result and none is an "internal error"
    # (the engine's label for an exception outside boresize's error tree).
    @settings(budget, deadline=None, max_examples=budget.max_examples // 5)
    @given(rows=st.lists(st.fixed_dictionaries({}, optional={k: CELL_TEXT for k in COLUMNS}).map(
        lambda cells: {**VALID_ROW, **cells}), min_size=1, max_size=3))
    def check(rows: list[dict[str, str]]) -> None:
        with watchdog(20.0):
            results = size_rows([(row, {}) for row in rows], sizer=sizer)
        assert results, rows
        for result in results:
            assert "internal error" not in (result.error or ""), result.error

    check()
