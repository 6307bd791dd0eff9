"""Tests of boresize.units: conversions against NIST SP 811 and the fluids library, and every error path.

Conversion factors are from NIST Special Publication 811 (2008), Appendix B.8/B.9 ("NIST SP 811"), and are
cross-checked against ``fluids.constants`` (which carries the CODATA/NIST values). Exact factors are noted.
"""

from __future__ import annotations

import math
import re
import subprocess
import sys

import fluids.constants as fc
import numpy as np
import pint
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from boresize.errors import InputError, UnitError
from boresize.units import (
    STANDARD_CONDITIONS,
    format_unit_help,
    parse_flow,
    parse_quantity,
    registry,
)

PSI = 6894.757  # Pa, NIST SP 811 B.9 (pound-force per square inch, 6.894 757 E+03)
POUND = 0.45359237  # kg, exact (NIST SP 811 B.9, pound avoirdupois)
US_GALLON = 3.785411784e-3  # m3, exact (NIST SP 811 B.9, gallon [U.S.])
FOOT = 0.3048  # m, exact (NIST SP 811 B.9)
CUBIC_FOOT = FOOT**3  # 0.028316846592 m3, exact
ATM = 101325.0  # Pa, exact (NIST SP 811 B.9, standard atmosphere)
FLOW_HELP = ("a mass flow (kg/h, t/h, kg/s, lb/h), a volume flow (m3/h, l/min, gpm), a standard gas "
             "volume flow (Sm3/h, Nm3/h, MMSCFD) or a molar flow (kmol/h, lbmol/h)")
LENGTH_HELP = "a length (m, mm, km, ft, in)"
DIFFERENCE_UNITS = "bar, kPa, psi, without g or a"


def msg(text: str) -> str:
    """An exact error message as a pytest ``match`` pattern."""
    return "^" + re.escape(text) + "$"


# --- registry ----------------------------------------------------------------------------------------

def test_no_registry_at_import_time() -> None:
    # importing the module builds no registry and does not import pint (0.2-0.3 s, measured here)
    code = ("import sys, boresize.units as u; "
            "print(u.registry.cache_info().currsize, 'pint' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.split() == ["0", "False"]


def test_registry_is_built_once() -> None:
    assert registry() is registry()


def test_registry_gauge_units_are_built_not_parsed() -> None:
    ureg = registry()
    # 1 standard atmosphere = 101325 Pa exactly (NIST SP 811 B.9); 1 bar = 1e5 Pa exactly
    assert ureg.Quantity(5, "barg").to("Pa").magnitude == pytest.approx(601325.0, rel=1e-12)
    assert ureg.Quantity(0, "psig").to("Pa").magnitude == pytest.approx(ATM, rel=1e-9)
    assert ureg.Quantity(0, "kPag").to("Pa").magnitude == pytest.approx(ATM, rel=1e-12)
    assert ureg.Quantity(14.696, "psia").to("Pa").magnitude == pytest.approx(14.696 * PSI, rel=1e-6)


def test_registry_cubic_spellings_are_not_prefixed_m3() -> None:
    ureg = registry()
    # 1 cm3 = 1e-6 m3 (SI); pint alone would read a defined "m3" with prefix c as 0.01 m3
    assert ureg.Quantity(1, "cm3").to("m**3").magnitude == pytest.approx(1e-6, rel=1e-12)
    assert ureg.Quantity(250, "m3/h").to("m**3/s").magnitude == pytest.approx(250 / 3600, rel=1e-12)


def test_registry_standard_volumes_do_not_convert_into_each_other() -> None:
    # Sm3 (15 degC) and Nm3 (0 degC) differ by 288.15/273.15 (ideal gas): no plain conversion may exist
    with pytest.raises(pint.DimensionalityError):
        registry().Quantity(1, "Nm3").to("Sm3")


# --- conversions (outside references) ---------------------------------------------------------------

@pytest.mark.parametrize(
    ("text", "kind", "expected"),
    [
        ("1 psi", "pressure_difference", PSI),  # NIST SP 811
        ("1 psi", "pressure_difference", fc.psi),  # fluids.constants
        ("1 bar", "pressure_difference", 1e5),  # NIST SP 811, exact
        ("1 kg/cm2", "pressure", 98066.5),  # NIST SP 811, kilogram-force per square centimetre
        ("1 mmHg", "pressure", fc.mmHg),  # fluids.constants (NIST SP 811: 1.333 224 E+02)
        ("1 atm", "pressure", ATM),  # NIST SP 811, exact
        ("1 lb/s", "mass_flow", POUND),  # NIST SP 811, exact
        ("3600 lb/h", "mass_flow", fc.lb),  # fluids.constants
        ("1 klb/h", "mass_flow", 1000 * POUND / 3600),  # klb = 1000 lb (common practice)
        ("3.6 t/h", "mass_flow", 1.0),  # 1 t = 1000 kg (NIST SP 811 B.9, ton metric)
        ("3.6 te/h", "mass_flow", 1.0),  # "te" is the UK trade spelling of the tonne (common practice)
        ("86.4 t/d", "mass_flow", 1.0),  # 1 d = 86400 s (NIST SP 811)
        ("60 gpm", "volume_flow", US_GALLON),  # NIST SP 811, exact; gpm = US gallons per minute
        ("60 gpm", "volume_flow", fc.gallon),  # fluids.constants
        ("86400 bbl/d", "volume_flow", 42 * US_GALLON),  # NIST SP 811: barrel (petroleum) = 42 US gal
        ("1 ft3/s", "volume_flow", CUBIC_FOOT),  # NIST SP 811, exact
        ("60 l/min", "volume_flow", 1e-3),  # 1 L = 1e-3 m3 (NIST SP 811)
        ("1 L/s", "volume_flow", 1e-3),  # NIST SP 811
        ("1 ft", "length", FOOT),  # NIST SP 811, exact
        ("1 in", "length", 0.0254),  # NIST SP 811, exact
        ("1 ft/s", "velocity", fc.foot),  # fluids.constants
        ("1 lb/ft3", "density", 16.01846),  # NIST SP 811, pound per cubic foot 1.601 846 E+01
        ("1 g/cm3", "density", 1000.0),  # SI
        ("1 cP", "viscosity", 1e-3),  # NIST SP 811, centipoise 1.0 E-03 Pa s
        ("1 cp", "viscosity", 1e-3),  # trade spelling of cP (pint alone reads "cp" as a cup)
        ("1 mPa s", "viscosity", 1e-3),  # SI
        ("1 mPa.s", "viscosity", 1e-3),  # SI
        ("1 mPa·s", "viscosity", 1e-3),  # SI
        ("1 Pa s", "viscosity", 1.0),  # SI
        ("1 Pa.s", "viscosity", 1.0),  # SI
        ("1 P", "viscosity", 0.1),  # NIST SP 811, poise 1.0 E-01 Pa s
    ],
)
def test_conversion_against_references(text: str, kind: str, expected: float) -> None:
    assert parse_quantity(text, "x", kind) == pytest.approx(expected, rel=1e-6)


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("5 barg", 601325.0),  # 5e5 + 101325 Pa (NIST SP 811: bar, standard atmosphere)
        ("5 bar(g)", 601325.0),
        ("5 bar g", 601325.0),
        ("5 BARG", 601325.0),
        ("5 bara", 5e5),
        ("5 bar", 5e5),  # a bare bar is absolute (documented rule)
        ("100 kPag", 201325.0),
        ("100 kPa(g)", 201325.0),
        ("1 MPag", 1101325.0),
        ("0 psig", ATM),  # gauge zero is one standard atmosphere
        ("14.696 psia", 14.696 * PSI),  # NIST SP 811 psi
        ("1 kg/cm2g", 98066.5 + ATM),  # NIST SP 811 kgf/cm2 + standard atmosphere
        ("-0.5 barg", 51325.0),  # a vacuum is fine while the absolute pressure stays above zero
    ],
)
def test_pressure_is_absolute(text: str, expected: float) -> None:
    assert parse_quantity(text, "pressure", "pressure") == pytest.approx(expected, rel=1e-6)


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("20 degC", 293.15),  # NIST SP 811 4.2.1.1: T/K = t/degC + 273.15
        ("20 °C", 293.15),
        ("20 C", 293.15),
        ("20 deg C", 293.15),
        ("60 degF", 288.7056),  # NIST SP 811 B.9: T/K = (t/degF + 459.67)/1.8
        ("60 °F", fc.zero_Celsius + (60 - 32) * fc.degree_Fahrenheit),  # fluids.constants
        ("60 F", 288.7056),
        ("491.67 degR", 273.15),  # NIST SP 811: T/K = (T/degR)/1.8
        ("300 K", 300.0),
    ],
)
def test_temperature(text: str, expected: float) -> None:
    assert parse_quantity(text, "temperature", "temperature") == pytest.approx(expected, rel=1e-6)


def test_temperature_difference_is_an_interval() -> None:
    # NIST SP 811 B.9: a degree Fahrenheit interval is 5/9 K; a degree Celsius interval is 1 K
    assert parse_quantity("9 degF", "rise", "temperature_difference") == pytest.approx(5.0, rel=1e-12)
    assert parse_quantity("10 degC", "rise", "temperature_difference") == pytest.approx(10.0, rel=1e-12)


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("40 kPa/100 m", 400.0),  # 40e3 Pa / 100 m; pint alone reads this as 0.4 kPa*m
        ("40 kPa/100m", 400.0),
        ("50 kPa/100 m", 500.0),
        ("0.5 bar/km", 50.0),  # 0.5e5 Pa / 1000 m
        ("2 psi/100 ft", 2 * PSI / (100 * FOOT)),  # NIST SP 811 psi and ft
        ("500 Pa/m", 500.0),
    ],
)
def test_drop_per_length(text: str, expected: float) -> None:
    assert parse_quantity(text, "max", "drop_per_length") == pytest.approx(expected, rel=1e-6)


@pytest.mark.parametrize("text", ["10 %", "10%", "0.1", "0.1 -"])
def test_dimensionless(text: str) -> None:
    assert parse_quantity(text, "design_margin", "dimensionless") == pytest.approx(0.1, rel=1e-12)


def test_default_unit_applies_to_bare_numbers_only() -> None:
    assert parse_quantity(3.6, "flow", "mass_flow", "[t/h]") == pytest.approx(1.0)  # header "flow [t/h]"
    assert parse_quantity("3.6", "flow", "mass_flow", "t/h") == pytest.approx(1.0)
    assert parse_quantity("1 kg/s", "flow", "mass_flow", "t/h") == pytest.approx(1.0)  # the cell wins
    assert parse_quantity("40", "max", "drop_per_length", "kPa/100 m") == pytest.approx(400.0)
    assert parse_quantity(1, "p", "pressure", "barg") == pytest.approx(201325.0)  # 1e5 + 101325 Pa


@given(st.floats(min_value=-1e12, max_value=1e12, allow_nan=False, allow_infinity=False))
@settings(max_examples=60, deadline=None)
def test_any_python_float_text_reads_back(number: float) -> None:
    # the number splitter must read every repr() Python writes (1e-05, -3.5, 1e+300 ...)
    assert parse_quantity(f"{number!r} kPa/100 m", "max", "drop_per_length") == pytest.approx(number * 10)


# --- flows ------------------------------------------------------------------------------------------

@pytest.mark.parametrize(
    ("text", "basis", "expected"),
    [
        ("65 t/h", "mass", 65000 / 3600),
        ("250 m3/h", "volume", 250 / 3600),
        ("250 m³/h", "volume", 250 / 3600),
        ("10 gpm", "volume", 10 * US_GALLON / 60),  # NIST SP 811, exact
        ("1000 lb/h", "mass", 1000 * POUND / 3600),  # NIST SP 811, exact
    ],
)
def test_flow_basis(text: str, basis: str, expected: float) -> None:
    flow = parse_flow(text)
    assert (flow.basis, flow.reference_t, flow.reference_p) == (basis, None, None)
    assert flow.value == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("text", ["1 MMSCFD", "1 mmscfd", "1 MMscfd", "1000 Mscf/d", "1e6 scf/d", "1e6 SCFD"])
def test_mmscfd_volume_part(text: str) -> None:
    # 1 MMSCFD = 1e6 scf per day; 1 ft3 = 0.028316846592 m3 exactly (NIST SP 811); "M" = thousand and
    # "MM" = million in gas trade units (common practice)
    flow = parse_flow(text)
    assert flow.basis == "standard-volume"
    assert flow.value == pytest.approx(1e6 * 0.028316846592 / 86400, rel=1e-9)
    assert flow.reference_t == pytest.approx(288.7056, rel=1e-6)  # 60 degF (NIST SP 811)
    assert flow.reference_p == pytest.approx(14.696 * PSI, rel=1e-6)  # 14.696 psia
    assert flow.reference_name == "60 degF, 14.696 psia"


def test_scfm() -> None:
    flow = parse_flow("60 scfm")
    assert flow.value == pytest.approx(CUBIC_FOOT, rel=1e-9)  # NIST SP 811, exact ft3
    assert flow.reference_t == pytest.approx(288.7056, rel=1e-6)


# --- the trade's spellings: tonne, thousand and million, the oil barrel -------------------------------
# References from exact definitions (NIST SP 811, 2008, App. B.9): 1 lb = 0.45359237 kg, 1 in = 0.0254 m,
# 1 US gal = 231 in3, the barrel (petroleum) = 42 US gal, 1 t (ton, metric) = 1000 kg, 1 h = 3600 s,
# 1 d = 86400 s. The trade's M is a thousand and MM a million (as in Mscf, MMSCFD: common practice).
EXACT_POUND = 0.45359237  # kg, exact (NIST SP 811 B.9, pound avoirdupois)
EXACT_GALLON = 231 * 0.0254**3  # m3, exact (NIST SP 811 B.9, gallon [U.S.] = 231 in3)
OIL_BARREL = 42 * EXACT_GALLON  # m3, exact (NIST SP 811 B.9, barrel [for petroleum, 42 gallons (U.S.)])


def test_oil_barrel_is_exactly_42_us_gallons() -> None:
    assert OIL_BARREL == pytest.approx(0.158987294928, rel=1e-15)  # NIST SP 811 B.9: 1.589 873 E-01 m3
    assert parse_flow("86400 bbl/d").value == pytest.approx(OIL_BARREL, rel=1e-12)


@pytest.mark.parametrize(
    ("text", "basis", "expected"),
    [
        ("20 mt/h", "mass", 20 * 1000 / 3600),  # mt = the metric tonne, not the millitonne
        ("20 MT/h", "mass", 20 * 1000 / 3600),
        ("20 mt/d", "mass", 20 * 1000 / 86400),
        ("20 MTPD", "mass", 20 * 1000 / 86400),
        ("20 mtpd", "mass", 20 * 1000 / 86400),
        ("20 MTPH", "mass", 20 * 1000 / 3600),
        ("20 mtph", "mass", 20 * 1000 / 3600),
        ("1 Mlb/h", "mass", 1e3 * EXACT_POUND / 3600),  # the trade's thousand pounds, not pint's mega
        ("1 MLB/h", "mass", 1e3 * EXACT_POUND / 3600),
        ("1 Mlbs/h", "mass", 1e3 * EXACT_POUND / 3600),
        ("1 klb/h", "mass", 1e3 * EXACT_POUND / 3600),
        ("1 KLB/h", "mass", 1e3 * EXACT_POUND / 3600),
        ("1 MMlb/h", "mass", 1e6 * EXACT_POUND / 3600),
        ("1 MMLB/h", "mass", 1e6 * EXACT_POUND / 3600),
        ("1 LB/h", "mass", EXACT_POUND / 3600),
        ("1 bbl/d", "volume", OIL_BARREL / 86400),
        ("1 BBL/d", "volume", OIL_BARREL / 86400),
        ("1 bbls/d", "volume", OIL_BARREL / 86400),
        ("1 barrel/d", "volume", OIL_BARREL / 86400),  # pint's own barrel is 31.5 gal
        ("1 barrels/d", "volume", OIL_BARREL / 86400),
        ("30 kbbl/d", "volume", 30e3 * OIL_BARREL / 86400),
        ("30 Mbbl/d", "volume", 30e3 * OIL_BARREL / 86400),
        ("30 MBBL/d", "volume", 30e3 * OIL_BARREL / 86400),
        ("2 MMbbl/d", "volume", 2e6 * OIL_BARREL / 86400),
        ("1 bpd", "volume", OIL_BARREL / 86400),
        ("1 BOPD", "volume", OIL_BARREL / 86400),
        ("30 kbpd", "volume", 30e3 * OIL_BARREL / 86400),
        ("30 MBPD", "volume", 30e3 * OIL_BARREL / 86400),
        ("2 MMbpd", "volume", 2e6 * OIL_BARREL / 86400),
    ],
)
def test_trade_spellings_against_exact_definitions(text: str, basis: str, expected: float) -> None:
    flow = parse_flow(text)
    assert flow.basis == basis
    assert flow.value == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(("thousands", "units"), [("30 kbbl/d", "30000 bbl/d"), ("30 Mbbl/d", "30000 bbl/d"),
                                                  ("5 Mlb/h", "5000 lb/h"), ("5 MMlb/h", "5000000 lb/h"),
                                                  ("20 mt/h", "20 t/h"), ("30 kbpd", "30000 bpd")])
def test_a_prefix_is_the_number_in_full(thousands: str, units: str) -> None:
    assert parse_flow(thousands).value == pytest.approx(parse_flow(units).value, rel=1e-15)


TONNE_HINT = ("t, mt or MT for the metric tonne, with the number in full; 'Mt' is the megatonne (1e9 kg) in SI "
              "and a thousand tonnes (1e6 kg) by the trade's M")
M_HINT = ("the unit with its prefix (Mlb/h, Mbbl/d, Mscf/d: the trade's M is a thousand) or m for the metre; "
          "'M' alone is the molar (mol/L) in SI")
MM_HINT = ("the unit with its prefix (MMlb/h, MMbbl/d, MMscfd: the trade's MM is a million) or mm for the "
           "millimetre")


@pytest.mark.parametrize(("value", "word", "hint"), [
    ("1 Mt/h", "Mt", TONNE_HINT),
    ("5 M/h", "M", M_HINT),
    ("5 M lb/h", "M", M_HINT),
    ("5 MM lb/h", "MM", MM_HINT),
    ("5 mlb/h", "mlb", "Mlb or klb for a thousand pounds (the trade's M); 'mlb' is milli (0.001) in SI"),
    ("5 mlbs/h", "mlbs", "Mlb or klb for a thousand pounds (the trade's M); 'mlbs' is milli (0.001) in SI"),
    ("5 mmlb/h", "mmlb", "MMlb for a million pounds (the trade's MM); 'mmlb' is no unit in SI, where a small m "
                         "is milli"),
    ("5 mbbl/d", "mbbl", "Mbbl or kbbl for a thousand barrels (the trade's M); 'mbbl' is milli (0.001) in SI"),
    ("5 mmbbl/d", "mmbbl", "MMbbl for a million barrels (the trade's MM); 'mmbbl' is no unit in SI, where a "
                           "small m is milli"),
    ("5 mbpd", "mbpd", "Mbpd or kbpd for a thousand barrels a day (the trade's M); 'mbpd' is milli (0.001) in SI"),
])
def test_trade_prefixes_that_read_two_ways_are_refused(value: str, word: str, hint: str) -> None:
    with pytest.raises(UnitError, match=msg(f"flow: unit '{word}' in '{value}' is ambiguous; expected {hint}")):
        parse_flow(value)


def test_m_alone_is_refused_in_any_field() -> None:
    with pytest.raises(UnitError, match=msg(f"length: unit 'M' in '100 M' is ambiguous; expected {M_HINT}")):
        parse_quantity("100 M", "length", "length")


@pytest.mark.parametrize("word", ["Gbbl", "cbarrel", "ubbls"])
def test_a_barrel_with_another_prefix_is_unknown(word: str) -> None:
    # pint would read these as its own 31.5 gal barrel
    with pytest.raises(UnitError, match=msg(
            f"flow: unknown unit '{word}' in '1 {word}/d'; expected {FLOW_HELP}; the oil barrel (42 US gal) is "
            "bbl, with k or M for a thousand (kbbl, Mbbl) and MM for a million (MMbbl)")):
        parse_flow(f"1 {word}/d")


def test_lowercase_mscf_stays_the_trade_thousand() -> None:
    # decided: mscf and mmscf are the gas trade's thousand and million, as boresize has always read them
    assert parse_flow("1 mscf/d").value == parse_flow("1 Mscf/d").value == parse_flow("1000 scf/d").value
    assert parse_flow("1 mmscf/d").value == parse_flow("1 MMscf/d").value == parse_flow("1e6 scf/d").value


@pytest.mark.parametrize(
    ("text", "temperature", "pressure", "value"),
    [
        ("3600 Sm3/h", 288.15, 101325.0, 1.0),  # ISO 13443: 15 degC, 101.325 kPa
        ("86400 Sm3/d", 288.15, 101325.0, 1.0),  # ISO 13443
        ("3600 Nm3/h", 273.15, 101325.0, 1.0),  # DIN 1343: 0 degC, 101.325 kPa
    ],
)
def test_standard_metric_flows(text: str, temperature: float, pressure: float, value: float) -> None:
    flow = parse_flow(text)
    assert flow.basis == "standard-volume"
    assert flow.value == pytest.approx(value, rel=1e-12)
    assert (flow.reference_t, flow.reference_p) == (temperature, pressure)


def test_standard_conditions_table() -> None:
    assert STANDARD_CONDITIONS["Sm3"][:2] == (288.15, 101325.0)  # ISO 13443
    assert STANDARD_CONDITIONS["Nm3"][:2] == (273.15, 101325.0)  # DIN 1343
    # 60 degF and 14.696 psia: the oil and gas convention (common practice); NIST SP 811 degF and psi
    assert STANDARD_CONDITIONS["scf"][0] == pytest.approx((60 + 459.67) / 1.8, rel=1e-12)
    assert STANDARD_CONDITIONS["scf"][1] == pytest.approx(14.696 * fc.psi, rel=1e-12)


def test_flow_zero_and_negative_are_left_to_the_line_validator() -> None:
    assert parse_flow("0 kg/h").value == 0.0
    assert parse_flow("-5 t/h").value == pytest.approx(-5000 / 3600)


def test_flow_with_default_unit() -> None:
    assert parse_flow(65, default_unit="[t/h]").value == pytest.approx(65000 / 3600)


# --- errors -----------------------------------------------------------------------------------------

def test_flow_of_wrong_dimension() -> None:
    message = f"flow: '10 bar' is a pressure, not a flow; expected {FLOW_HELP}"
    with pytest.raises(UnitError, match=msg(message)) as info:
        parse_flow("10 bar")
    assert (info.value.field, info.value.value, info.value.expected) == ("flow", "10 bar", FLOW_HELP)


def test_flow_of_a_mass_not_a_rate() -> None:
    with pytest.raises(UnitError, match=msg(f"flow: '10 kg' is a mass, not a flow; expected {FLOW_HELP}")):
        parse_flow("10 kg")


def test_errors_are_also_value_errors() -> None:
    # callers that catch ValueError keep working (boresize.errors contract)
    with pytest.raises(ValueError, match="is a pressure, not a flow"):
        parse_flow("10 bar")


def test_missing_unit() -> None:
    with pytest.raises(UnitError, match=msg("length: missing unit in '10'; expected " + LENGTH_HELP)):
        parse_quantity("10", "length", "length")
    with pytest.raises(UnitError, match=msg(f"flow: missing unit in '65'; expected {FLOW_HELP}")):
        parse_flow(65)


def test_default_unit_of_wrong_dimension() -> None:
    with pytest.raises(UnitError, match=msg(
            "flow: '10 [bar]' is a pressure, not a mass flow; expected a mass flow (kg/h, t/h, kg/s, lb/h)")):
        parse_quantity(10, "flow", "mass_flow", "bar")


def test_volume_flow_refuses_mass_and_standard_flows() -> None:
    with pytest.raises(UnitError, match=msg(
            "q: '10 kg/h' is a mass flow, not a volume flow; expected a volume flow (m3/h, l/min, gpm)")):
        parse_quantity("10 kg/h", "q", "volume_flow")
    with pytest.raises(UnitError, match=re.escape("'10 Sm3/h' is a standard gas volume flow, not a volume")):
        parse_quantity("10 Sm3/h", "q", "volume_flow")


@pytest.mark.parametrize("value", ["abc", "t/h", "about 5 t/h"])
def test_text_that_is_not_a_number(value: str) -> None:
    with pytest.raises(InputError, match=msg(
            f"flow: '{value}' does not start with a number; expected a number and a unit, e.g. '65 t/h'")):
        parse_flow(value)


@pytest.mark.parametrize("value", ["nan kg/h", "inf kg/h", "-Infinity kg/h", "1e999 kg/h"])
def test_text_that_is_not_finite(value: str) -> None:
    message = f"flow: '{value}' is not a finite number; expected a finite number"
    with pytest.raises(InputError, match=msg(message)):
        parse_flow(value)


@pytest.mark.parametrize("value", [math.nan, math.inf, -math.inf])
def test_float_that_is_not_finite(value: float) -> None:
    message = f"p: '{value}' is not a finite number; expected a finite number"
    with pytest.raises(InputError, match=msg(message)):
        parse_quantity(value, "p", "pressure", "bar")


@pytest.mark.parametrize("value", ["1,5 bar", "1,000 kg/h", "1 000 kg/h"])
def test_separators_and_decimal_commas_are_refused(value: str) -> None:
    expected = ("digits with a decimal point and no thousands separator (1500, 1.5); a comma is refused "
                "because '1,5' is a decimal comma in much of the world")
    with pytest.raises(InputError, match=msg(f"x: '{value}' has a comma or a separator in the number; "
                                             f"expected {expected}")):
        parse_quantity(value, "x", "pressure")


@pytest.mark.parametrize("value", [None, "", "   "])
def test_no_value(value: str | None) -> None:
    with pytest.raises(InputError, match=msg("length: no value given; expected " + LENGTH_HELP)):
        parse_quantity(value, "length", "length")


def test_numpy_numbers_are_numbers() -> None:
    # a DataFrame cell arrives as a numpy scalar; 1 t = 1000 kg (NIST SP 811)
    assert parse_quantity(np.int64(36), "flow", "mass_flow", "t/h") == pytest.approx(10.0)
    assert parse_quantity(np.float64(3.6), "flow", "mass_flow", "t/h") == pytest.approx(1.0)


def test_int_beyond_float_range() -> None:
    message = f"x: '{10**400}' is not a finite number; expected a finite number"
    with pytest.raises(InputError, match=msg(message)):
        parse_quantity(10**400, "x", "length", "m")


def test_bool_is_not_a_number() -> None:
    with pytest.raises(InputError, match=re.escape("p: True is not a number")):
        parse_quantity(True, "p", "pressure", "bar")  # type: ignore[arg-type]


# 1 bar = 1e5 Pa, 1 atm = 101325 Pa (NIST SP 811)
@pytest.mark.parametrize(("value", "pa"), [("-2 barg", "-98675"), ("0 bar", "0"), ("-1.1 barg", "-8675")])
def test_absolute_pressure_must_be_above_zero(value: str, pa: str) -> None:
    with pytest.raises(InputError, match=msg(
            f"pressure: absolute pressure must be above zero: '{value}' is {pa} Pa abs; "
            "expected a pressure above 0 Pa abs (a g suffix adds 101.325 kPa)")):
        parse_quantity(value, "pressure", "pressure")


def test_temperature_below_absolute_zero() -> None:
    with pytest.raises(InputError, match=msg(
            "temperature: '-300 degC' is -26.85 K, at or below absolute zero; "
            "expected a temperature above 0 K (-273.15 degC)")):
        parse_quantity("-300 degC", "temperature", "temperature")


@pytest.mark.parametrize(("value", "kind", "what", "noun", "help_"), [
    ("0.5 barg", "pressure_difference", "a gauge", "a pressure difference", DIFFERENCE_UNITS),
    ("0.5 bar(g)", "pressure_difference", "a gauge", "a pressure difference", DIFFERENCE_UNITS),
    ("0.5 psia", "pressure_difference", "an absolute", "a pressure difference", DIFFERENCE_UNITS),
    ("1 barg/km", "drop_per_length", "a gauge", "a pressure drop per length",
     "kPa/100 m, bar/km, psi/100 ft, Pa/m"),
])
def test_differences_refuse_gauge_and_absolute(
    value: str, kind: str, what: str, noun: str, help_: str
) -> None:
    with pytest.raises(UnitError, match=msg(
            f"dp: '{value}' is {what} pressure, but {noun} is neither gauge nor absolute; "
            f"expected {noun} ({help_})")):
        parse_quantity(value, "dp", kind)


def test_kinematic_viscosity_is_not_dynamic() -> None:
    with pytest.raises(UnitError, match=msg(
            "viscosity: '1 cSt' is a kinematic viscosity, not a dynamic viscosity; expected a dynamic "
            "viscosity (cP, mPa s, Pa s); multiply a kinematic viscosity by the density to get it")):
        parse_quantity("1 cSt", "viscosity", "viscosity")


def test_megapascal_seconds_are_refused_as_a_typo() -> None:
    with pytest.raises(UnitError, match=msg(
            "viscosity: '1 MPa s' is in megapascal-seconds (1 MPa s = 1e6 Pa s); "
            "expected a dynamic viscosity (cP, mPa s, Pa s); mPa s with a small m is the millipascal")):
        parse_quantity("1 MPa s", "viscosity", "viscosity")


@pytest.mark.parametrize(("value", "word", "kind"), [
    ("5 Mpa", "Mpa", "pressure"), ("5 MPA", "MPA", "pressure"), ("1 mpa s", "mpa", "viscosity"),
])
def test_mpa_casing_is_ambiguous(value: str, word: str, kind: str) -> None:
    with pytest.raises(UnitError, match=msg(
            f"x: unit '{word}' in '{value}' is ambiguous; "
            "expected MPa (megapascal, a pressure) or mPa (millipascal, as in mPa s)")):
        parse_quantity(value, "x", kind)


def test_ton_and_nm3_are_ambiguous() -> None:
    with pytest.raises(UnitError, match=msg(
            "flow: unit 'ton' in '10 ton/h' is ambiguous; "
            "expected t for the metric tonne (1000 kg); 'ton' is also the US short ton (907 kg)")):
        parse_flow("10 ton/h")
    with pytest.raises(UnitError, match=msg(
            "flow: unit 'nm3' in '10 nm3/h' is ambiguous; "
            "expected Nm3 for normal cubic metres ('nm3' reads as cubic nanometres)")):
        parse_flow("10 nm3/h")


@pytest.mark.parametrize(("value", "message"), [
    ("10 foo/h", "unknown unit 'foo' in '10 foo/h'"),
    ("10 kg$/h", "unknown unit in '10 kg$/h'"),
    ("10 kg/", "cannot read the unit of '10 kg/'"),
    ("10 (kg/h", "cannot read the unit of '10 (kg/h'"),
    ("10 barg/h", "'10 barg/h' combines a gauge or degC/degF unit with other units"),
])
def test_unreadable_units(value: str, message: str) -> None:
    with pytest.raises(UnitError, match=msg(f"flow: {message}; expected {FLOW_HELP}")) as info:
        parse_flow(value)
    assert info.value.value == value


def test_coulomb_is_not_a_length() -> None:
    # "C" means degC only in a temperature field; elsewhere it keeps its SI meaning (coulomb)
    message = "'10 C' is a quantity of dimension [current] * [time], not a length"
    with pytest.raises(UnitError, match=re.escape(message)):
        parse_quantity("10 C", "length", "length")


# --- help texts ---------------------------------------------------------------------------------------

def test_format_unit_help() -> None:
    assert format_unit_help("mass_flow") == "a mass flow (kg/h, t/h, kg/s, lb/h)"
    assert format_unit_help("viscosity") == "a dynamic viscosity (cP, mPa s, Pa s)"
    assert "absolute" in format_unit_help("pressure")
