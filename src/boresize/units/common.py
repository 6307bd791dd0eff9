"""The conversions of the commonest unit spellings, written out, so that a run reading only these needs no pint.

The parser remembers how each unit text it has read becomes SI (``quantities._CONVERSIONS``: the number times
``factor``, times ``scale``, plus ``offset``). :data:`TABLE` is what that memory holds after reading each
spelling of :data:`SPELLINGS` through pint with boresize's registry: the parser starts with it, as if it had read
them before. tests/units/test_common_units.py reads every spelling again through pint and requires the same
floats to the last bit (and prints the table to paste when they differ); a spelling not in the table goes
through pint as before. A command line that sizes one line in these units then never imports pint, nor numpy
and scipy, which pint imports (see the measured comment where :data:`TABLE` is used).
"""

from __future__ import annotations

from boresize.model import FlowBasis

__all__ = ["SPELLINGS", "TABLE"]

#: (unit text as written in a cell, kind of field): "flow" for a flow of any basis, else a ``QuantityKind``
SPELLINGS: tuple[tuple[str, str], ...] = (
    *((text, "flow") for text in ("kg/h", "kg/s", "t/h", "t/d", "lb/h", "klb/h", "m3/h", "m3/s", "l/min", "l/s",
                                  "gpm", "Sm3/h", "Sm3/d", "Nm3/h", "MMSCFD", "scfm", "kmol/h")),
    *((text, "pressure") for text in ("barg", "bara", "bar", "kPag", "kPaa", "kPa", "MPag", "MPaa", "MPa", "psig",
                                      "psia", "psi", "Pa")),
    *((text, "pressure_difference") for text in ("bar", "kPa", "Pa", "psi")),
    *((text, "temperature") for text in ("degC", "°C", "C", "degF", "°F", "F", "K")),
    *((text, "temperature_difference") for text in ("K", "degC", "degF")),
    *((text, "length") for text in ("m", "mm", "km", "ft", "in")),
    ("kg/m3", "density"),
    *((text, "viscosity") for text in ("cP", "mPa s", "mPa.s", "Pa s")),
    *((text, "velocity") for text in ("m/s", "ft/s")),
    *((text, "drop_per_length") for text in ("kPa/100 m", "bar/km", "psi/100 ft", "Pa/m")),
    *((text, "dimensionless") for text in ("", "%")),
)

#: (unit text, kind) -> (factor, scale, offset, flow basis, reference state of a standard volume)
TABLE: dict[tuple[str, str], tuple[float, float, float, FlowBasis, tuple[float | None, float | None, str | None]]] = {
    ('kg/h', 'flow'): (1.0, 0.0002777777777777778, 0.0, 'mass', (None, None, None)),
    ('kg/s', 'flow'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('t/h', 'flow'): (1.0, 0.2777777777777778, 0.0, 'mass', (None, None, None)),
    ('t/d', 'flow'): (1.0, 0.011574074074074073, 0.0, 'mass', (None, None, None)),
    ('lb/h', 'flow'): (1.0, 0.0001259978805555556, 0.0, 'mass', (None, None, None)),
    ('klb/h', 'flow'): (1000.0, 0.0001259978805555556, 0.0, 'mass', (None, None, None)),
    ('m3/h', 'flow'): (1.0, 0.0002777777777777778, 0.0, 'volume', (None, None, None)),
    ('m3/s', 'flow'): (1.0, 1.0, 0.0, 'volume', (None, None, None)),
    ('l/min', 'flow'): (1.0, 1.666666666666667e-05, 0.0, 'volume', (None, None, None)),
    ('l/s', 'flow'): (1.0, 0.0010000000000000002, 0.0, 'volume', (None, None, None)),
    ('gpm', 'flow'): (1.0, 6.309019639999999e-05, 0.0, 'volume', (None, None, None)),
    ('Sm3/h', 'flow'): (1.0, 0.0002777777777777778, 0.0, 'standard-volume',
        (288.15, 101325.0, '15 degC, 101.325 kPa (ISO 13443 standard conditions)')),
    ('Sm3/d', 'flow'): (1.0, 1.1574074074074073e-05, 0.0, 'standard-volume',
        (288.15, 101325.0, '15 degC, 101.325 kPa (ISO 13443 standard conditions)')),
    ('Nm3/h', 'flow'): (1.0, 0.0002777777777777778, 0.0, 'standard-volume',
        (273.15, 101325.0, '0 degC, 101.325 kPa (DIN 1343 normal conditions)')),
    ('MMSCFD', 'flow'): (1000000.0, 3.2774128e-07, 0.0, 'standard-volume',
        (288.7055555555556, 101325.35318040224, '60 degF, 14.696 psia')),
    ('scfm', 'flow'): (1.0, 0.0004719474432, 0.0, 'standard-volume',
        (288.7055555555556, 101325.35318040224, '60 degF, 14.696 psia')),
    ('kmol/h', 'flow'): (1.0, 0.2777777777777778, 0.0, 'molar', (None, None, None)),
    ('barg', 'pressure'): (1.0, 100000.00000000003, 101325.0, 'mass', (None, None, None)),
    ('bara', 'pressure'): (1.0, 100000.0, 0.0, 'mass', (None, None, None)),
    ('bar', 'pressure'): (1.0, 100000.0, 0.0, 'mass', (None, None, None)),
    ('kPag', 'pressure'): (1.0, 1000.0, 101325.0, 'mass', (None, None, None)),
    ('kPaa', 'pressure'): (1.0, 1000.0, 0.0, 'mass', (None, None, None)),
    ('kPa', 'pressure'): (1.0, 1000.0, 0.0, 'mass', (None, None, None)),
    ('MPag', 'pressure'): (1.0, 1000000.0, 101325.0, 'mass', (None, None, None)),
    ('MPaa', 'pressure'): (1.0, 1000000.0, 0.0, 'mass', (None, None, None)),
    ('MPa', 'pressure'): (1.0, 1000000.0, 0.0, 'mass', (None, None, None)),
    ('psig', 'pressure'): (1.0, 6894.757293168368, 101325.00000000003, 'mass', (None, None, None)),
    ('psia', 'pressure'): (1.0, 6894.7572931683635, 0.0, 'mass', (None, None, None)),
    ('psi', 'pressure'): (1.0, 6894.7572931683635, 0.0, 'mass', (None, None, None)),
    ('Pa', 'pressure'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('bar', 'pressure_difference'): (1.0, 100000.0, 0.0, 'mass', (None, None, None)),
    ('kPa', 'pressure_difference'): (1.0, 1000.0, 0.0, 'mass', (None, None, None)),
    ('Pa', 'pressure_difference'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('psi', 'pressure_difference'): (1.0, 6894.7572931683635, 0.0, 'mass', (None, None, None)),
    ('degC', 'temperature'): (1.0, 1.0, 273.15, 'mass', (None, None, None)),
    ('°C', 'temperature'): (1.0, 1.0, 273.15, 'mass', (None, None, None)),
    ('C', 'temperature'): (1.0, 1.0, 273.15, 'mass', (None, None, None)),
    ('degF', 'temperature'): (1.0, 0.5555555555555429, 255.37222222222223, 'mass', (None, None, None)),
    ('°F', 'temperature'): (1.0, 0.5555555555555429, 255.37222222222223, 'mass', (None, None, None)),
    ('F', 'temperature'): (1.0, 0.5555555555555429, 255.37222222222223, 'mass', (None, None, None)),
    ('K', 'temperature'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('K', 'temperature_difference'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('degC', 'temperature_difference'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('degF', 'temperature_difference'): (1.0, 0.5555555555555556, 0.0, 'mass', (None, None, None)),
    ('m', 'length'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('mm', 'length'): (1.0, 0.001, 0.0, 'mass', (None, None, None)),
    ('km', 'length'): (1.0, 1000.0, 0.0, 'mass', (None, None, None)),
    ('ft', 'length'): (1.0, 0.30479999999999996, 0.0, 'mass', (None, None, None)),
    ('in', 'length'): (1.0, 0.0254, 0.0, 'mass', (None, None, None)),
    ('kg/m3', 'density'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('cP', 'viscosity'): (1.0, 0.001, 0.0, 'mass', (None, None, None)),
    ('mPa s', 'viscosity'): (1.0, 0.001, 0.0, 'mass', (None, None, None)),
    ('mPa.s', 'viscosity'): (1.0, 0.001, 0.0, 'mass', (None, None, None)),
    ('Pa s', 'viscosity'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('m/s', 'velocity'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('ft/s', 'velocity'): (1.0, 0.30479999999999996, 0.0, 'mass', (None, None, None)),
    ('kPa/100 m', 'drop_per_length'): (0.01, 1000.0, 0.0, 'mass', (None, None, None)),
    ('bar/km', 'drop_per_length'): (1.0, 100.0, 0.0, 'mass', (None, None, None)),
    ('psi/100 ft', 'drop_per_length'): (0.01, 22620.594793859465, 0.0, 'mass', (None, None, None)),
    ('Pa/m', 'drop_per_length'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('', 'dimensionless'): (1.0, 1.0, 0.0, 'mass', (None, None, None)),
    ('%', 'dimensionless'): (1.0, 0.01, 0.0, 'mass', (None, None, None)),
}
