"""Tests that a unit text read before gives the same answer as the first reading of it, to the last bit.

boresize keeps the conversion of each unit text it has read; the answers must not depend on that. The first
reading of a unit in a process (cold) is made in a child process that has read no unit yet, forked from one
that has only built the registry; the readings after it (warm) in the same child. Every spelling the trade
tables accept is checked both ways against an outside reference: a separate, plain pint registry (pint's
own definitions, none of boresize's spellings), or the definition of the unit (NIST SP 811, 2008,
Appendix B: "NIST SP 811") where plain pint has no such unit (gauge pressures, standard gas volumes).
"""

from __future__ import annotations

import importlib.metadata
import json
import random
import re
import subprocess
import sys
from collections.abc import Callable, Sequence
from typing import Any

import numpy as np
import pint
import pytest

from boresize.errors import InputError, UnitError
from boresize.io.rows import line_from_row
from boresize.properties.select import fluid_state
from boresize.units.text import _ALIASES, _TOKEN
from boresize.units import STANDARD_CONDITIONS, parse_flow, parse_quantity

PLAIN = pint.UnitRegistry()  # the outside reference: pint's own definitions only
ATM = 101325.0  # Pa, exact (NIST SP 811 B.8, atmosphere, standard)
PSI = 0.45359237 * 9.80665 / 0.0254**2  # Pa: pound (exact) * standard gravity (exact) / inch**2 (exact), NIST SP 811 B.9
KGF_CM2 = 9.80665 / 1e-4  # Pa, exact (NIST SP 811 B.9, kilogram-force per square centimeter 9.80665 E+04)
CUBIC_FOOT = 0.3048**3  # m3, exact (NIST SP 811 B.9, foot 0.3048 m)
SI = {"molar": "mol/s", "mass_flow": "kg/s", "volume_flow": "m**3/s", "standard": "m**3/s", "pressure": "Pa",
      "pressure_difference": "Pa", "temperature": "K", "temperature_difference": "K", "length": "m",
      "density": "kg/m**3", "viscosity": "Pa*s", "velocity": "m/s", "drop_per_length": "Pa/m",
      "dimensionless": "dimensionless"}
POUND = 0.45359237  # kg, exact (NIST SP 811 B.9, pound avoirdupois)
BARREL = 42 * 231 * 0.0254**3  # m3, exact (NIST SP 811 B.9, barrel for petroleum = 42 US gal of 231 in3)
Reference = Callable[[float], float]


def plain(expression: str, kind: str) -> Reference:
    """x -> x * ``expression`` in SI, by plain pint (pint's own unit names)."""
    return lambda x: float(PLAIN.Quantity(x, expression).to(SI[kind]).magnitude)


def gauge(unit_pa: float) -> Reference:
    """x -> x * unit + one standard atmosphere [Pa abs]: a gauge pressure reads from 101325 Pa (NIST SP 811 B.8)."""
    return lambda x: x * unit_pa + ATM


def per_second(cubic_metres: float, seconds: float) -> Reference:
    """x -> x * volume / time [m3/s] (a standard volume flow keeps its m3 at the reference state)."""
    return lambda x: x * cubic_metres / seconds


DAY, HOUR, MINUTE = 86400.0, 3600.0, 60.0  # s (exact)
# (unit as typed, kind, reference). kind "mass_flow", "volume_flow" and "standard" are read by parse_flow.
SPELLINGS: list[tuple[str, str, Reference]] = [
    # pressures: a bare unit and an "a" suffix are absolute
    *[(u, "pressure", plain("bar", "pressure")) for u in ("bar", "BAR", "Bar", "bara", "BARA", "BARa", "Bara",
                                                          "BarA", "barA", "bar(a)", "bar a", "bar [a]")],
    *[(u, "pressure", plain("kilopascal", "pressure")) for u in ("kPa", "kpa", "KPa", "KPA", "Kpa", "kPaa", "kPaA",
                                                                 "kpaa", "kpaA", "KPaa", "KPaA", "KPAa", "KPAA", "kPa(a)")],
    *[(u, "pressure", plain("megapascal", "pressure")) for u in ("MPa", "MPaa", "MPaA", "MPa (a)")],
    *[(u, "pressure", plain("psi", "pressure")) for u in ("psi", "PSI", "Psi", "psia", "psiA", "PSIA", "PSIa",
                                                          "Psia", "PsiA")],
    *[(u, "pressure", plain("kilogram_force/centimeter**2", "pressure")) for u in ("kg/cm2", "kgf/cm2", "kg/cm2a",
                                                                                   "kg/cm2 a")],
    ("Pa", "pressure", plain("pascal", "pressure")),
    # gauge pressures: one standard atmosphere above the reading
    *[(u, "pressure", gauge(1e5)) for u in ("barg", "barG", "BARG", "BARg", "Barg", "BarG", "bar(g)", "bar g",
                                            "bar [g]", "BAR(G)")],
    *[(u, "pressure", gauge(1e3)) for u in ("kPag", "kPaG", "kpag", "kpaG", "KPag", "KPaG", "KPAg", "KPAG",
                                            "kPa(g)", "kPa g")],
    *[(u, "pressure", gauge(1e6)) for u in ("MPag", "MPaG", "MPa(g)")],
    *[(u, "pressure", gauge(PSI)) for u in ("psig", "psiG", "PSIG", "PSIg", "Psig", "PsiG", "psi(g)")],
    *[(u, "pressure", gauge(KGF_CM2)) for u in ("kg/cm2g", "kgf/cm2g", "kg/cm2 g", "kg/cm2(g)")],
    # pressure differences and drops per length (no gauge, no absolute)
    ("bar", "pressure_difference", plain("bar", "pressure_difference")),
    ("psi", "pressure_difference", plain("psi", "pressure_difference")),
    ("kPa/100 m", "drop_per_length", lambda x: x * 1e3 / 100.0),  # kPa per 100 m (NIST SP 811: kPa = 1e3 Pa)
    ("bar/km", "drop_per_length", lambda x: x * 1e5 / 1e3),
    ("psi/100 ft", "drop_per_length", lambda x: x * PSI / (100 * 0.3048)),
    ("Pa/m", "drop_per_length", plain("pascal/meter", "drop_per_length")),
    # temperatures: absolute from the definitions (NIST SP 811 B.8), differences as intervals
    *[(u, "temperature", lambda x: x + 273.15) for u in ("degC", "°C", "C", "deg C", "℃", "celsius", "Celsius")],
    *[(u, "temperature", lambda x: (x + 459.67) / 1.8) for u in ("degF", "°F", "F", "deg F", "℉", "fahrenheit",
                                                                 "Fahrenheit")],
    *[(u, "temperature", lambda x: x / 1.8) for u in ("degR", "R")],
    *[(u, "temperature", lambda x: x) for u in ("K", "kelvin")],
    *[(u, "temperature_difference", lambda x: x) for u in ("K", "degC", "°C")],
    *[(u, "temperature_difference", lambda x: x / 1.8) for u in ("degF", "°F")],
    # mass flows
    *[(u, "mass_flow", plain("kilogram/hour", "mass_flow")) for u in ("kg/h", "KG/h", "Kg/h", "kg/hr", "kg/hrs",
                                                                      "kg/Hr", "kg/HR", "kg/hour")],
    *[(u, "mass_flow", plain("metric_ton/hour", "mass_flow")) for u in ("t/h", "te/h", "tonne/h", "tonnes/h")],
    ("t/d", "mass_flow", plain("metric_ton/day", "mass_flow")),
    ("kg/s", "mass_flow", plain("kilogram/second", "mass_flow")),
    # pound-mole: 453.59237 mol, from the exact avoirdupois pound (NIST SP 811 B.9)
    *[(u, "molar", lambda x: x * 453.59237 / HOUR) for u in ("lbmol/h", "lbmole/h", "lbmoles/h", "LBMOL/h",
                                                                    "lb-mol/h", "lb mole/h")],
    *[(u, "molar", plain("kilomole/hour", "molar")) for u in ("kmol/h", "kgmol/h", "kgmole/h", "Kmol/h", "KMOL/h",
                                                              "kmole/h", "kmoles/h")],
    *[(u, "mass_flow", plain("pound/hour", "mass_flow")) for u in ("lb/h", "lbs/h", "lbm/h")],
    *[(u, "mass_flow", plain("kilopound/hour", "mass_flow")) for u in ("klb/h", "klbs/h")],
    # the trade's tonne (mt, MT), thousand (k, K, M) and million (MM) pounds: NIST SP 811 B.9, pound 0.45359237 kg
    *[(u, "mass_flow", plain("metric_ton/hour", "mass_flow")) for u in ("mt/h", "MT/h", "mtph", "MTPH")],
    *[(u, "mass_flow", plain("metric_ton/day", "mass_flow")) for u in ("mtpd", "MTPD")],
    *[(u, "mass_flow", lambda x: x * POUND / HOUR) for u in ("LB/h", "LBS/h", "LBM/h")],
    *[(f"{p}{u}/h", "mass_flow", lambda x, f=f: x * f * POUND / HOUR)
      for p, f in (("k", 1e3), ("K", 1e3), ("M", 1e3), ("MM", 1e6)) for u in ("lb", "lbs", "lbm", "LB", "LBS", "LBM")],
    # actual volume flows
    *[(u, "volume_flow", plain("meter**3/hour", "volume_flow")) for u in ("m3/h", "m³/h", "M3/h", "m3/hr")],
    *[(u, "volume_flow", plain("gallon/minute", "volume_flow")) for u in ("gpm", "GPM", "USgpm", "USGPM", "usgpm")],
    *[(u, "volume_flow", plain("liter/minute", "volume_flow")) for u in ("lpm", "LPM", "l/min", "L/min")],
    *[(u, "volume_flow", plain("oil_barrel/day", "volume_flow")) for u in ("bbl/d", "BBL/d", "bpd", "BPD")],
    # the oil barrel, 42 US gal of 231 in3 (NIST SP 811 B.9), with the trade's thousand and million
    *[(u, "volume_flow", lambda x: x * BARREL / DAY) for u in ("bbls/d", "BBLS/d", "Bbl/d", "barrel/d", "barrels/d",
                                                              "Barrel/d", "Barrels/d", "bopd", "BOPD")],
    *[(f"{p}{u}/d", "volume_flow", lambda x, f=f: x * f * BARREL / DAY)
      for p, f in (("k", 1e3), ("K", 1e3), ("M", 1e3), ("MM", 1e6)) for u in ("bbl", "bbls", "BBL", "BBLS", "Bbl")],
    *[(u, "volume_flow", lambda x: x * 1e3 * BARREL / DAY) for u in ("kbpd", "KBPD", "Mbpd", "MBPD")],
    *[(u, "volume_flow", lambda x: x * 1e6 * BARREL / DAY) for u in ("MMbpd", "MMBPD")],
    ("ft3/s", "volume_flow", plain("foot**3/second", "volume_flow")),
    ("cm3/s", "volume_flow", plain("centimeter**3/second", "volume_flow")),
    # standard gas volume flows (m3 at the unit's reference state, per second)
    *[(u, "standard", per_second(1.0, HOUR)) for u in ("Sm3/h", "SM3/h", "sm3/h", "Nm3/h", "NM3/h")],
    *[(u, "standard", per_second(CUBIC_FOOT, DAY)) for u in ("scfd", "SCFD", "scf/d", "SCF/d")],
    *[(u, "standard", per_second(CUBIC_FOOT, HOUR)) for u in ("scfh", "SCFH")],
    *[(u, "standard", per_second(CUBIC_FOOT, MINUTE)) for u in ("scfm", "SCFM")],
    *[(u, "standard", per_second(1e3 * CUBIC_FOOT, DAY)) for u in ("Mscfd", "mscfd", "MSCFD", "Mscf/d", "mscf/d",
                                                                    "MSCF/d")],
    *[(u, "standard", per_second(1e6 * CUBIC_FOOT, DAY)) for u in ("MMSCFD", "MMscfd", "mmscfd", "MMscf/d",
                                                                    "mmscf/d", "MMSCF/d")],
    *[(u, "standard", per_second(1e6, DAY)) for u in ("MMSCMD", "MMscmd", "mmscmd")],
    # densities, viscosities, lengths, velocities, plain numbers
    *[(u, "density", plain("kilogram/meter**3", "density")) for u in ("kg/m3", "kg/m³", "kg/m**3")],
    ("g/cm3", "density", plain("gram/centimeter**3", "density")),
    ("lb/ft3", "density", plain("pound/foot**3", "density")),
    *[(u, "viscosity", plain("centipoise", "viscosity")) for u in ("cP", "cp", "CP", "cps")],
    *[(u, "viscosity", plain("millipascal*second", "viscosity")) for u in ("mPas", "mPa.s", "mPa·s", "mPa s",
                                                                           "mPa*s")],
    *[(u, "viscosity", plain("pascal*second", "viscosity")) for u in ("Pas", "Pa.s", "Pa s")],
    *[(u, "length", plain(p, "length")) for u, p in (("m", "meter"), ("mm", "millimeter"), ("km", "kilometer"),
                                                     ("ft", "foot"), ("in", "inch"), ("µm", "micrometer"))],
    *[(u, "velocity", plain(p, "velocity")) for u, p in (("m/s", "meter/second"), ("ft/s", "foot/second"))],
    *[(u, "dimensionless", plain("percent", "dimensionless")) for u in ("%", "pct", "percent")],
]
FLOW_BASIS = {"mass_flow": "mass", "volume_flow": "volume", "standard": "standard-volume", "molar": "molar"}


def si_value(text: str, kind: str, default_unit: str | None = None) -> float:
    """The SI float boresize gives for ``text`` (a flow through parse_flow, checking its basis)."""
    if kind in FLOW_BASIS:
        flow = parse_flow(text, "flow", default_unit)
        assert flow.basis == FLOW_BASIS[kind]
        return flow.value
    return parse_quantity(text, kind, kind, default_unit)  # type: ignore[arg-type]


#: Run in a child process: builds the registry, then reads each task ``[text, kind, default unit]`` twice in
#: a process forked for that task alone (cold, then warm); prints, per task, the two answers (the float, or
#: the error's class and message).
FRESH = """
import json, multiprocessing, sys
from boresize.errors import BoresizeError
from boresize.units import parse_flow, parse_quantity, registry

def read(text, kind, default):
    try:
        if kind == "flow":
            flow = parse_flow(text, "flow", default)
            return [flow.basis, flow.value, flow.reference_name]
        return parse_quantity(text, kind, kind, default)
    except BoresizeError as exc:
        return f"{type(exc).__name__}: {exc}"

def cold_and_warm(task):
    return [read(*task), read(*task)]

if __name__ == "__main__":
    registry()  # pint loaded; no unit read yet, so every forked child starts cold
    tasks = json.load(sys.stdin)
    with multiprocessing.get_context("fork").Pool(2, maxtasksperchild=1) as pool:
        print(json.dumps(pool.map(cold_and_warm, tasks, chunksize=1)))
"""


def cold_and_warm(tasks: Sequence[tuple[str, str, str | None]]) -> list[tuple[object, object]]:
    """(first reading in a process, second reading) of each (text, kind, default unit); kind "flow" reads a
    flow as [basis, SI value, reference state]; an error is its class and message."""
    out = subprocess.run([sys.executable, "-c", FRESH], input=json.dumps(tasks), capture_output=True, text=True,
                         check=True).stdout
    return [(cold, warm) for cold, warm in json.loads(out)]


def as_flow_kind(kind: str) -> str:
    return "flow" if kind in FLOW_BASIS else kind


@pytest.fixture(scope="module")
def spellings_read() -> dict[tuple[str, str], tuple[object, object]]:
    """Each spelling of SPELLINGS read cold and warm ("2.5 <unit>") in a fresh process."""
    answers = cold_and_warm([(f"2.5 {unit}", as_flow_kind(kind), None) for unit, kind, _ in SPELLINGS])
    return {(unit, kind): answer for (unit, kind, _), answer in zip(SPELLINGS, answers)}


def test_every_alias_of_the_trade_tables_is_checked_here() -> None:
    # a new spelling in unit_text._ALIASES needs its line in SPELLINGS (with an outside reference)
    typed = {word for unit, _, _ in SPELLINGS for word in _TOKEN.findall(unit)}
    assert sorted(set(_ALIASES) - typed) == []


@pytest.mark.parametrize("unit, kind, reference", SPELLINGS, ids=[f"{k}:{u}" for u, k, _ in SPELLINGS])
def test_a_unit_read_again_gives_pint_and_the_first_reading(unit: str, kind: str, reference: Reference,
                                                            spellings_read: dict[tuple[str, str], Any]) -> None:
    cold, warm = spellings_read[(unit, kind)]
    if kind in FLOW_BASIS:
        assert cold[0] == warm[0] == FLOW_BASIS[kind]
        cold, warm = cold[1], warm[1]
    assert cold == pytest.approx(reference(2.5), rel=1e-12, abs=0)
    assert warm == cold  # the same float, to the last bit
    si_value(f"2.5 {unit}", kind)  # in this process too, then with spaces and another number
    assert si_value(f" 7.25 {unit} ", kind) == pytest.approx(reference(7.25), rel=1e-12, abs=0)
    assert si_value(f"2.5 {unit}", kind) == cold


def test_gauge_pressure_from_the_standard_atmosphere() -> None:
    # NIST SP 811 B.8: 1 atm = 101325 Pa exactly; 1 bar = 1e5 Pa exactly (NIST SP 811 B.9)
    for text, expected in (("10 barg", 1.1013250e6), ("0 barg", 101325.0), ("-1.01325 barg", 0.0)):
        if expected > 0:
            assert parse_quantity(text, "pressure", "pressure") == pytest.approx(expected, rel=1e-12)
        else:  # exactly vacuum: refused, through the cached conversion as through the full parse
            with pytest.raises(InputError, match=r"^pressure: absolute pressure must be above zero: '-1\.01325 barg' is"):
                parse_quantity(text, "pressure", "pressure")
    # 14.695948775 psig is one more atmosphere: 2 atm (NIST SP 811 B.9: psi = 6894.757 Pa)
    assert parse_quantity(f"{ATM / PSI!r} psig", "pressure", "pressure") == pytest.approx(2 * ATM, rel=1e-12)


def test_degf_is_an_absolute_temperature_or_an_interval_by_the_field() -> None:
    # NIST SP 811 B.8: T/K = (t/degF + 459.67)/1.8; an interval of 1 degF is 1/1.8 K
    assert parse_quantity("212 degF", "temperature", "temperature") == pytest.approx(373.15, rel=1e-12)
    assert parse_quantity("18 degF", "dt", "temperature_difference") == pytest.approx(10.0, rel=1e-12)
    assert parse_quantity("212 degF", "temperature", "temperature") == pytest.approx(373.15, rel=1e-12)
    assert parse_quantity("-40 degF", "temperature", "temperature") == pytest.approx(233.15, rel=1e-12)
    assert parse_quantity("-40 degC", "temperature", "temperature") == pytest.approx(233.15, rel=1e-12)  # -40 is -40
    assert parse_quantity("9 degC", "dt", "temperature_difference") == pytest.approx(9.0, rel=1e-12)


def test_a_header_unit_and_a_cell_unit_share_one_conversion() -> None:
    # a bare number takes the header's unit; a number may also come as a float, an int or a numpy float
    first = si_value("65", "mass_flow", "[t/h]")
    assert first == pytest.approx(65_000 / 3600, rel=1e-12)  # 1 t = 1000 kg (NIST SP 811 B.9)
    for value in ("65 t/h", 65, 65.0, np.float64(65.0)):
        assert parse_flow(value, "flow", "t/h").value == first
    assert parse_quantity(np.int64(25), "length", "length", "ft") == pytest.approx(25 * 0.3048, rel=1e-12)
    assert parse_quantity("25", "length", "length", "ft") == pytest.approx(25 * 0.3048, rel=1e-12)


def test_a_standard_volume_keeps_its_reference_state() -> None:
    for text, name in (("2 MMSCFD", "scf"), ("3 MMSCFD", "scf"), ("100 Nm3/h", "Nm3"), ("200 Sm3/h", "Sm3")):
        flow = parse_flow(text)
        assert (flow.reference_t, flow.reference_p, flow.reference_name) == STANDARD_CONDITIONS[name]
    # ISO 13443: 15 degC and 101.325 kPa; DIN 1343: 0 degC and 101.325 kPa; 60 degF = 288.706 K (NIST SP 811 B.8)
    assert STANDARD_CONDITIONS["Sm3"][:2] == (288.15, ATM) and STANDARD_CONDITIONS["Nm3"][:2] == (273.15, ATM)
    assert STANDARD_CONDITIONS["scf"][0] == pytest.approx((60 + 459.67) / 1.8, rel=1e-12)


def test_a_logarithmic_unit_is_converted_by_pint_not_by_a_straight_line() -> None:
    # the bel is a log10 power ratio: 3 dB = 10**0.3 (IEC 60027-3); a decade is a factor 10, an octave 2
    for text, expected in (("3 dB", 10**0.3), ("6 dB", 10**0.6), ("2 decade", 100.0), ("2 octave", 4.0)):
        assert parse_quantity(text, "ratio", "dimensionless") == pytest.approx(expected, rel=1e-12)
        assert parse_quantity(text, "ratio", "dimensionless") == pytest.approx(expected, rel=1e-12)


def msg(text: str) -> str:
    return "^" + re.escape(text) + "$"


@pytest.mark.parametrize("text, kind, cls, message", [
    ("-300 degC", "temperature", InputError, "temperature: '-300 degC' is -26.85 K, at or below absolute zero; "
     "expected a temperature above 0 K (-273.15 degC)"),
    ("1e308 m*10", "length", InputError, "length: '1e308 m*10' is not a finite number; expected a finite number"),
    ("1,5 m", "length", InputError, "length: '1,5 m' has a comma or a separator in the number; expected digits "
     "with a decimal point and no thousands separator (1500, 1.5); a comma is refused because '1,5' is a decimal "
     "comma in much of the world"),
    ("nan m", "length", InputError, "length: 'nan m' is not a finite number; expected a finite number"),
    ("5", "length", UnitError, "length: missing unit in '5'; expected a length (m, mm, km, ft, in)"),
    ("5 m", "pressure", UnitError, "pressure: '5 m' is a length, not a pressure; expected a pressure (barg, bar, "
     "kPag, kPa, psig, psia; bar, kPa, MPa and psi without a g are absolute)"),
])
def test_errors_after_the_unit_was_read(text: str, kind: str, cls: type[Exception], message: str) -> None:
    parse_quantity("1 m", "length", "length")  # "m" as a length is known; the checks still run
    parse_quantity("1 degC", "temperature", "temperature")
    with pytest.raises(cls, match=msg(message)):
        parse_quantity(text, kind, kind)  # type: ignore[arg-type]


def test_a_unit_read_for_one_kind_is_judged_again_for_another() -> None:
    assert parse_quantity("0.5 bar", "drop", "pressure_difference") == pytest.approx(5e4, rel=1e-12)
    with pytest.raises(UnitError, match=r"is a pressure, not a flow"):
        parse_flow("0.5 bar")
    parse_quantity("2 barg", "pressure", "pressure")
    with pytest.raises(UnitError, match=r"^fixed_drop: '2 barg' is a gauge pressure, but a pressure difference is "
                                        r"neither gauge nor absolute"):
        parse_quantity("2 barg", "fixed_drop", "pressure_difference")


def test_first_and_later_readings_agree_to_the_last_bit() -> None:
    # numbers and messages, cold and warm, across the units whose conversion has an offset, a gauge zero, a
    # standard state or a number inside the unit; edge numbers beside seeded random ones
    pick = random.Random(20261)
    numbers = [0.0, -0.0, 1e-300, -1.01325, 1e9, -1e9, 1.0, 0.1, *(pick.uniform(-1e9, 1e9) for _ in range(12)),
               *(pick.uniform(-10, 10) for _ in range(8))]
    units_kinds = [("barg", "pressure_difference"), ("degF", "temperature"), ("degF", "temperature_difference"),
                   ("psig", "pressure"), ("MMSCFD", "flow"), ("kPa/100 m", "drop_per_length"), ("cP", "viscosity"),
                   ("%", "dimensionless")]
    tasks = [(f"{number!r} {unit}", kind, None) for unit, kind in units_kinds for number in numbers]
    answers = cold_and_warm(tasks)
    for task, (cold, warm) in zip(tasks, answers):
        assert warm == cold, task
    assert any(isinstance(cold, str) and cold.startswith("InputError: pressure: absolute pressure must be above")
               for cold, _ in answers)  # the messages were compared too (psig below vacuum)


def test_a_header_unit_read_cold_and_warm() -> None:
    # a bare number takes the header's unit; 1 t = 1000 kg (NIST SP 811 B.9)
    (cold, warm), (cell, _) = cold_and_warm([("65", "flow", "[t/h]"), ("65 t/h", "flow", None)])
    assert cold == warm == cell
    assert cold[0] == "mass" and cold[1] == pytest.approx(65_000 / 3600, rel=1e-12)


# --- the line and its properties ------------------------------------------------------------------------

def test_line_from_row_gives_the_same_line_cold_and_warm(host) -> None:
    row = {"tag": "P-1", "fluid": "water", "flow": "27 t/h", "pressure": "1.2 barg", "temperature": "77 degF",
           "length": "25", "design_margin": "10 %", "service": "pump-suction"}
    cold = line_from_row(row, {"length": "[m]"})
    warm = line_from_row(row, {"length": "[m]"})
    assert cold == warm
    assert (cold.length, cold.design_margin) == (25.0, pytest.approx(0.1, rel=1e-12))
    assert cold.pressure == pytest.approx(1.2e5 + ATM, rel=1e-12)  # NIST SP 811 B.8/B.9
    assert cold.temperature == pytest.approx((77 + 459.67) / 1.8, rel=1e-12)  # 298.15 K (NIST SP 811 B.8)
    assert cold.flow.value == pytest.approx(27_000 / 3600, rel=1e-12)


def test_fluid_state_is_recorded_for_each_state_point(host) -> None:
    from CoolProp.CoolProp import PropsSI

    lines = [line_from_row({"tag": f"L-{t}", "fluid": "water", "flow": "10 t/h", "pressure": "5 bar",
                            "temperature": f"{t} K"}) for t in (300.0, 320.0, 300.0)]
    states = [fluid_state(host, line) for line in lines]
    assert states[0] == states[2] and states[0] != states[1]
    for line, state in zip(lines, states):
        # CoolProp's reference call (PropsSI, IAPWS-95 for water) is the outside value
        assert state.density == pytest.approx(PropsSI("D", "P", line.pressure, "T", line.temperature, "Water"), rel=1e-9)
        assert (state.pressure, state.temperature, state.vapour_fraction) == (line.pressure, line.temperature, 0.0)
        assert state.backend_version == importlib.metadata.version("CoolProp")
    table = fluid_state(host, line_from_row({"tag": "T-1", "fluid": "brine", "flow": "10 t/h", "pressure": "5 bar",
                                             "temperature": "300 K", "density": "1100 kg/m3", "viscosity": "2 cP"}))
    assert table.backend_version == importlib.metadata.version("boresize")  # the installed distribution
