"""Units: the one pint registry, the trade's unit spellings, and the parsing of cell text into SI floats.

``quantities`` holds the registry and the parsers (pint loads on first use); ``text`` holds the trade's
spellings and the splitting of a cell's text into number and unit (no pint).
"""

from boresize.units.quantities import (
    ATMOSPHERE,
    STANDARD_CONDITIONS,
    QuantityKind,
    format_unit_help,
    parse_flow,
    parse_quantity,
    registry,
)

__all__ = ["ATMOSPHERE", "STANDARD_CONDITIONS", "QuantityKind", "format_unit_help", "parse_flow", "parse_quantity",
           "registry"]
