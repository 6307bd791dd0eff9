"""Units: the one pint registry, the trade's unit spellings, and the parsing of cell text into SI floats.

``quantities`` holds the registry and the parsers (pint loads on first use); ``text`` holds the trade's
spellings and the splitting of a cell's text into number and unit (no pint); ``bare`` reads a pressure whose unit
says neither gauge nor absolute (``9 psi``) as the run asks and names it in a note.
"""

from boresize.units.quantities import (
    ATMOSPHERE,
    STANDARD_CONDITIONS,
    QuantityKind,
    application_registry,
    format_unit_help,
    parse_flow,
    parse_quantity,
    registry,
)
from boresize.units.bare import BARE_PRESSURE_MODES, BarePressure, bare_pressure_mode, parse_pressure, reread

__all__ = ["ATMOSPHERE", "BARE_PRESSURE_MODES", "BarePressure", "bare_pressure_mode", "parse_pressure", "reread", "STANDARD_CONDITIONS", "QuantityKind", "application_registry", "format_unit_help", "parse_flow", "parse_quantity",
           "registry"]
