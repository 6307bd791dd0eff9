"""The text side of unit parsing: what an engineer typed, split and respelled for pint.

Splits a cell such as "65 t/h" into its number and its unit text (refusing separators, NaN and
infinity), and turns trade spellings (m³, t/h, mt/h, mPa.s, barg, kPa(g), MMSCFD, Mlb/h, kbbl/d ...) into
expressions pint reads correctly, refusing the ambiguous ones (Mpa, ton, nm3, Mt, M, mbbl). Also holds the extra unit
definitions of the registry and the help text of every quantity kind. No pint here: the rules are
listed, and the registry and the quantities are built, in :mod:`boresize.units`, the public face.
"""

from __future__ import annotations

import math
import numbers
import re
from dataclasses import dataclass

from boresize.errors import InputError, UnitError

# ---------------------------------------------------------------------------------------------
# Quantity kinds, their help text, and the extra definitions of the registry

# kind -> (SI unit for pint, noun, examples)
_KINDS: dict[str, tuple[str, str, str]] = {
    "mass_flow": ("kg/s", "a mass flow", "kg/h, t/h, kg/s, lb/h"),
    "volume_flow": ("m**3/s", "a volume flow", "m3/h, l/min, gpm"),
    "pressure": ("Pa", "a pressure", "barg, bar, kPag, kPa, psig, psia; bar, kPa, MPa and psi "
                 "without a g are absolute"),
    "pressure_difference": ("Pa", "a pressure difference", "bar, kPa, psi, without g or a"),
    "temperature": ("K", "a temperature", "degC, °C, C, degF, °F, F, K"),
    "temperature_difference": ("K", "a temperature difference", "K, degC, degF"),
    "length": ("m", "a length", "m, mm, km, ft, in"),
    "density": ("kg/m**3", "a density", "kg/m3, g/cm3, lb/ft3"),
    "viscosity": ("Pa*s", "a dynamic viscosity", "cP, mPa s, Pa s"),
    "velocity": ("m/s", "a velocity", "m/s, ft/s"),
    "drop_per_length": ("Pa/m", "a pressure drop per length", "kPa/100 m, bar/km, psi/100 ft, Pa/m"),
    "dimensionless": ("dimensionless", "a plain number", "0.1, 10 %"),
}
# SI unit in pint -> what a quantity of that dimension is, in the trade's words (for a wrong dimension)
_DESCRIPTIONS = (("kg/s", "a mass flow"), ("m**3/s", "a volume flow"), ("Pa", "a pressure"),
                 ("K", "a temperature"), ("m", "a length"), ("kg/m**3", "a density"),
                 ("Pa*s", "a dynamic viscosity"), ("m**2/s", "a kinematic viscosity"),
                 ("m/s", "a velocity"), ("Pa/m", "a pressure drop per length"), ("kg", "a mass"),
                 ("m**3", "a volume"), ("m**2", "an area"), ("s", "a time"), ("1/s", "a rate per time"),
                 ("dimensionless", "a plain number"), ("Sm3", "a standard gas volume"),
                 ("Nm3", "a standard gas volume"), ("scf", "a standard gas volume"),
                 ("Sm3/s", "a standard gas volume flow"), ("Nm3/s", "a standard gas volume flow"),
                 ("scf/s", "a standard gas volume flow"))
_STANDARD_HELP = "a standard gas volume flow (Sm3/h, Nm3/h, MMSCFD)"
_MOLAR_HELP = "a molar flow (kmol/h, lbmol/h)"
_FLOW_HELP = (f"{_KINDS['mass_flow'][1]} ({_KINDS['mass_flow'][2]}), {_KINDS['volume_flow'][1]} "
              f"({_KINDS['volume_flow'][2]}), {_STANDARD_HELP} or {_MOLAR_HELP}")

_DEFINITIONS = """
barg = bar; offset: 1.01325
bara = bar
kPag = kPa; offset: 101.325
kPaa = kPa
MPag = MPa; offset: 0.101325
MPaa = MPa
psig = psi; offset: 14.695948775513449
psia = psi
kgcm2g = technical_atmosphere; offset: 1.0332274527998859
kgcm2a = technical_atmosphere
standard_cubic_metre = [iso_standard_volume] = Sm3
normal_cubic_metre = [normal_volume] = Nm3
cubic_metre_60F = [standard_volume_60F] = m3_60F
standard_cubic_foot = 0.028316846592 * cubic_metre_60F = scf
MMSCFD = 1e6 * scf / day = MMscfd
gpm = gallon / minute
kPa_per_100m = 10 * Pa / m
bar_per_km = 100 * Pa / m
psi_per_100ft = 0.01 * psi / ft
"""
_GAUGE = ("barg", "kPag", "MPag", "psig", "kgcm2g")
_ABSOLUTE = ("bara", "kPaa", "MPaa", "psia", "kgcm2a")


def _help(kind: str) -> str:
    if kind == "flow":
        return _FLOW_HELP
    _, noun, examples = _KINDS[kind]
    return f"{noun} ({examples})"


# ---------------------------------------------------------------------------------------------
# Spelling normalisation (text -> pint expression)

_AMBIGUOUS = {
    "Mpa": "MPa (megapascal, a pressure) or mPa (millipascal, as in mPa s)",
    "ton": "t for the metric tonne (1000 kg); 'ton' is also the US short ton (907 kg)",
    "nm3": "Nm3 for normal cubic metres ('nm3' reads as cubic nanometres)",
}
_AMBIGUOUS.update({"mpa": _AMBIGUOUS["Mpa"], "MPA": _AMBIGUOUS["Mpa"], "tons": _AMBIGUOUS["ton"]})
# The trade's M is a thousand and MM a million (Mscf, Mlb, MMbbl), where SI's M is mega and its m milli: a
# spelling that reads one way in the trade and another in SI is refused, naming both readings. The lowercase
# mscf and mmscf stay the trade's thousand and million (scf takes no SI prefix in the trade's use, and boresize
# has always read them so); on lb and bbl a small m is SI's milli to pint and is refused.
_AMBIGUOUS.update({
    "Mt": "t, mt or MT for the metric tonne, with the number in full; 'Mt' is the megatonne (1e9 kg) in SI and "
          "a thousand tonnes (1e6 kg) by the trade's M",
    "M": "the unit with its prefix (Mlb/h, Mbbl/d, Mscf/d: the trade's M is a thousand) or m for the metre; "
         "'M' alone is the molar (mol/L) in SI",
    "MM": "the unit with its prefix (MMlb/h, MMbbl/d, MMscfd: the trade's MM is a million) or mm for the "
          "millimetre",
})
for _small, _big, _noun in (("lb", "lb", "pounds"), ("lbs", "lb", "pounds"), ("bbl", "bbl", "barrels"),
                            ("bbls", "bbl", "barrels"), ("bpd", "bpd", "barrels a day")):
    _AMBIGUOUS["m" + _small] = (f"M{_big} or k{_big} for a thousand {_noun} (the trade's M); 'm{_small}' is "
                                f"milli (0.001) in SI")
    _AMBIGUOUS["mm" + _small] = (f"MM{_big} for a million {_noun} (the trade's MM); 'mm{_small}' is no unit in "
                                 f"SI, where a small m is milli")

_ALIASES: dict[str, str] = {
    "SM3": "Sm3", "sm3": "Sm3", "NM3": "Nm3", "SCF": "scf",
    "scfd": "(scf/day)", "scfh": "(scf/hour)", "scfm": "(scf/minute)",
    "Mscf": "(1000*scf)", "mscf": "(1000*scf)", "MMscf": "(1e6*scf)", "mmscf": "(1e6*scf)",
    "Mscfd": "(1000*scf/day)", "mscfd": "(1000*scf/day)", "MMSCFD": "(1e6*scf/day)",
    "MMscfd": "(1e6*scf/day)", "mmscfd": "(1e6*scf/day)", "MMSCMD": "(1e6*Sm3/day)",
    "MMscmd": "(1e6*Sm3/day)", "mmscmd": "(1e6*Sm3/day)",
    "te": "t", "tonne": "t", "tonnes": "t",
    "hr": "hour", "hrs": "hour", "Hr": "hour", "HR": "hour", "KG": "kg", "Kg": "kg", "M3": "m**3",
    "gpm": "(gallon/minute)", "USgpm": "(gallon/minute)", "usgpm": "(gallon/minute)", "lpm": "(L/minute)",
    "bpd": "(oil_barrel/day)", "BPD": "(oil_barrel/day)", "bopd": "(oil_barrel/day)", "BOPD": "(oil_barrel/day)",
    "kbpd": "(1000*oil_barrel/day)", "KBPD": "(1000*oil_barrel/day)", "Mbpd": "(1000*oil_barrel/day)",
    "MBPD": "(1000*oil_barrel/day)", "MMbpd": "(1e6*oil_barrel/day)", "MMBPD": "(1e6*oil_barrel/day)",
    "mt": "t", "MT": "t", "mtpd": "(t/day)", "MTPD": "(t/day)", "mtph": "(t/hour)", "MTPH": "(t/hour)",
    "cp": "centipoise", "cP": "centipoise", "CP": "centipoise", "cps": "centipoise",
    "mPas": "(mPa*s)", "Pas": "(Pa*s)", "pct": "percent", "%": "percent",
    "kpa": "kPa", "KPa": "kPa", "KPA": "kPa", "Kpa": "kPa", "Bar": "bar", "BAR": "bar",
    "PSI": "psi", "Psi": "psi",
    # pound-mole: 453.59237 mol (the avoirdupois pound, exactly 0.45359237 kg, of a gram-mole)
    "lbmol": "(453.59237*mol)", "lbmole": "(453.59237*mol)", "lbmoles": "(453.59237*mol)",
    "LBMOL": "(453.59237*mol)", "kgmol": "kmol", "kgmole": "kmol", "Kmol": "kmol", "KMOL": "kmol", "kmole": "kmol", "kmoles": "kmol",
}
for _word in ("SCFD", "SCFH", "SCFM", "MSCF", "MMSCF", "MSCFD", "GPM", "USGPM", "LPM"):
    _ALIASES[_word] = _ALIASES[_word.lower()]
# Pounds and oil barrels (42 US gal; pint's own "barrel" and "bbl" are 31.5 gal), bare or with the trade's
# k or M (a thousand) or MM (a million)
_TRADE_STEMS = {**dict.fromkeys(("lb", "lbs", "lbm", "LB", "LBS", "LBM"), "lb"),
                **dict.fromkeys(("bbl", "bbls", "BBL", "BBLS", "Bbl", "barrel", "barrels", "Barrel", "Barrels"),
                                "oil_barrel")}
for _stem, _unit in _TRADE_STEMS.items():
    _ALIASES[_stem] = _unit
    if not _stem.lower().startswith("barrel"):
        for _prefix, _factor in (("k", "1000"), ("K", "1000"), ("M", "1000"), ("MM", "1e6")):
            _ALIASES[_prefix + _stem] = f"({_factor}*{_unit})"
_BARREL = re.compile(r"[A-Za-z]*(?:bbl|BBL|barrel|Barrel)[sS]?")  # any other prefix on a barrel: pint's 31.5 gal
for _spelling, _stem in [("bar", "bar"), ("Bar", "bar"), ("BAR", "bar"), ("kPa", "kPa"), ("kpa", "kPa"),
                         ("KPa", "kPa"), ("KPA", "kPa"), ("MPa", "MPa"), ("psi", "psi"), ("PSI", "psi"),
                         ("Psi", "psi")]:
    for _suffix, _mark in (("g", "g"), ("G", "g"), ("a", "a"), ("A", "a")):
        _ALIASES[_spelling + _suffix] = _stem + _mark

# lb-mol, lb mol, kg-mol, kg mol: the trade's pound-mole and kilogram-mole written in two words
_MOLE = re.compile(r"\b(lb|kg)[\s\-]?mol(?:e|es)?\b", re.IGNORECASE)
_POWER = re.compile(r"(m|dm|cm|mm|um|km|ft|in|yd)([23])")
_TOKEN = re.compile(r"[A-Za-z_][A-Za-z_0-9]*|%")
_PER_NUMBER = re.compile(r"/\s*(\d+(?:\.\d+)?(?:[eE][+-]?\d+)?)\s*\*?\s*([A-Za-z_][A-Za-z_0-9]*(?:\*\*\d)?)")
_MARKED = re.compile(r"^(bar|kpa|mpa|psi|kgf?/cm2)\s*[\(\[]?\s*([ga])\s*[\)\]]?$", re.IGNORECASE)
_ALLOWED = re.compile(r"[A-Za-z0-9_ */()^.%+-]*")
_WHOLE_TEMPERATURE = {"C": "degC", "F": "degF", "R": "degR", "celsius": "degC", "fahrenheit": "degF",
                      "Celsius": "degC", "Fahrenheit": "degF", "kelvin": "K"}
_DELTA = {"degC": "delta_degC", "degF": "delta_degF"}
_OFFSET = frozenset(_GAUGE) | {"degC", "degF", "delta_degC", "delta_degF"}


@dataclass(frozen=True)
class _Cell:
    """What the user gave, for messages: field, raw value, kind and the text as shown."""

    field: str
    value: object
    kind: str
    shown: str = ""

    def error(self, message: str, expected: str | None = None,
              cls: type[InputError] = UnitError) -> InputError:
        """An error naming the field and the value; ``expected`` defaults to the kind's help."""
        return cls(message, field=self.field, value=self.value, expected=expected or _help(self.kind))


def _replace_unicode(text: str) -> str:
    """Unicode the trade types (m³, mPa·s, °C, µm) -> ASCII pint reads; "deg C" -> "degC"."""
    for old, new in (("³", "3"), ("²", "2"), ("·", "*"), ("⋅", "*"), ("×", "*"), ("µ", "u"),
                     ("μ", "u"), ("º", "°"), ("℃", "degC"), ("℉", "degF"), ("−", "-"), ("°", "deg")):
        text = text.replace(old, new)
    text = re.sub(r"\bdeg\s+([CFR])\b", r"deg\1", text)
    return re.sub(r"(?<=[A-Za-z)])\.(?=[A-Za-z(])", "*", text)  # mPa.s -> mPa*s


def _marked_pressure(unit: str) -> str | None:
    """"bar(g)", "kPa a", "kg/cm2g" -> barg, kPaa, kgcm2g (ambiguous MPa casings are left alone)."""
    match = _MARKED.match(unit)
    if match is None or (match.group(1).lower() == "mpa" and match.group(1) != "MPa"):
        return None
    stem = match.group(1).lower()
    stem = {"kpa": "kPa", "mpa": "MPa"}.get(stem, "kgcm2" if "/" in stem else stem)
    return stem + match.group(2).lower()


def _token(word: str, cell: _Cell) -> str:
    if word in _AMBIGUOUS:
        raise cell.error(f"unit '{word}' in '{cell.shown}' is ambiguous", _AMBIGUOUS[word])
    if word in _ALIASES:
        return _ALIASES[word]
    if _BARREL.fullmatch(word):
        raise cell.error(f"unknown unit '{word}' in '{cell.shown}'", f"{_help(cell.kind)}; the oil barrel (42 US "
                         "gal) is bbl, with k or M for a thousand (kbbl, Mbbl) and MM for a million (MMbbl)")
    power = _POWER.fullmatch(word)
    return f"{power.group(1)}**{power.group(2)}" if power else word


def _normalise(unit: str, cell: _Cell) -> str:
    """Turn a trade spelling of a unit into an expression pint reads correctly."""
    unit = _replace_unicode(unit.strip().strip("[]").strip())
    marked = _marked_pressure(unit)
    if marked is not None:
        return marked
    if re.fullmatch(r"kgf?/cm2", unit, re.IGNORECASE):
        return "kgcm2a"
    if not _ALLOWED.fullmatch(unit):
        raise cell.error(f"unknown unit in '{cell.shown}'")
    if cell.kind in ("temperature", "temperature_difference"):
        unit = _WHOLE_TEMPERATURE.get(unit, unit)
        return _DELTA.get(unit, unit) if cell.kind == "temperature_difference" else unit
    if cell.kind == "dimensionless" and unit in ("-", "frac", "fraction"):
        return "dimensionless"
    unit = _MOLE.sub(lambda match: "lbmol" if match.group(1).lower() == "lb" else "kmol", unit)
    unit = _TOKEN.sub(lambda match: _token(match.group(0), cell), unit)
    return _PER_NUMBER.sub(r"/(\1*\2)", unit)  # kPa/100 m -> kPa/(100*m)



# ---------------------------------------------------------------------------------------------
# Number and quantity

_NUMBER = re.compile(r"\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(.*)", re.DOTALL)
_NOT_FINITE = re.compile(r"\s*[+-]?(nan|inf|infinity)\b", re.IGNORECASE)
_NUMBER_EXAMPLE = {"flow": "65 t/h", "pressure": "10 barg", "temperature": "20 degC", "dimensionless": "10 %"}
_SEPARATOR_HELP = ("digits with a decimal point and no thousands separator (1500, 1.5); a comma is "
                   "refused because '1,5' is a decimal comma in much of the world")


def _split(text: str, cell: _Cell) -> tuple[float, str]:
    """Split "65 t/h" into (65.0, "t/h"), refusing separators, NaN and infinity."""
    match = _NUMBER.fullmatch(text)
    if match is None:
        if _NOT_FINITE.match(text):
            raise cell.error(f"'{cell.shown}' is not a finite number", "a finite number", InputError)
        raise cell.error(f"'{cell.shown}' does not start with a number", _example(cell.kind), InputError)
    number, rest = match.group(1), match.group(2).strip()
    if rest.startswith(",") or rest[:1].isdigit():
        raise cell.error(f"'{cell.shown}' has a comma or a separator in the number", _SEPARATOR_HELP,
                         InputError)
    return _finite(float(number), cell), rest


def _example(kind: str) -> str:
    example = _NUMBER_EXAMPLE.get(kind, f"1 {_KINDS[kind][2].split(',')[0]}" if kind in _KINDS else "1")
    return f"a number and a unit, e.g. '{example}'"


def _finite(number: float, cell: _Cell) -> float:
    if not math.isfinite(number):
        raise cell.error(f"'{cell.shown}' is not a finite number", "a finite number", InputError)
    return number


def _number_and_unit(cell: _Cell) -> tuple[float, str, _Cell]:
    """(number, unit text, cell with the text as shown) of a string or a real number (numpy too)."""
    value = cell.value
    if value is None or (isinstance(value, str) and not value.strip()):
        raise cell.error("no value given", cls=InputError)
    if isinstance(value, str):
        cell = _Cell(cell.field, value, cell.kind, value.strip())
        number, unit = _split(value, cell)
        return number, unit, cell
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        raise cell.error(f"{value!r} is not a number", _example(cell.kind), InputError)
    shown = str(int(value)) if isinstance(value, numbers.Integral) else repr(float(value))
    cell = _Cell(cell.field, value, cell.kind, shown)
    try:
        return _finite(float(value), cell), "", cell
    except OverflowError:  # an int beyond the float range
        raise cell.error(f"'{shown}' is not a finite number", "a finite number", InputError) from None


def _plain_split(value: object, default_unit: str | None) -> tuple[float, str] | None:
    """(number, unit text) of a cell that :func:`_number_and_unit` splits without complaint, the unit of
    ``default_unit`` (a header's) standing in for a missing one: the key of a conversion already read.
    None for anything else (the full parse then gives the message)."""
    if isinstance(value, str):
        match = _NUMBER.fullmatch(value)
        if match is None:
            return None
        unit = match.group(2).strip()
        if unit.startswith(",") or unit[:1].isdigit():
            return None
        number = float(match.group(1))
    elif isinstance(value, numbers.Real) and not isinstance(value, bool):
        try:
            number, unit = float(value), ""
        except OverflowError:
            return None
    else:
        return None
    if not math.isfinite(number):
        return None
    return number, unit or (default_unit or "").strip().strip("[]").strip()
