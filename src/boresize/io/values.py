"""Values as line-list text: numbers as exact text, pint Quantities of any registry with their unit's name.

What a cell of a line list holds when the value comes from Python (a DataFrame cell, an API argument).
"""

from __future__ import annotations

import math
import numbers
import re

from boresize.errors import InputError

__all__ = ["number_text", "quantity_text"]

_OFFSET_NAMES = {"delta_degree_Celsius": "delta_degC", "delta_degree_Fahrenheit": "delta_degF",
                 "degree_Celsius": "degC", "degree_Fahrenheit": "degF", "degree_Rankine": "degR"}


def number_text(value: object, field: str, tag: str) -> str:
    """A real number as exact text ("65", "0.1"); numpy scalars too."""
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        raise InputError(f"{value!r} is not a number", field=field, value=value, expected="a real number",
                         tag=str(tag))
    if isinstance(value, numbers.Integral):
        return str(int(value))
    number = float(value)
    if not math.isfinite(number):
        raise InputError(f"{value!r} is not a finite number", field=field, value=value, expected="a finite number",
                         tag=str(tag))
    return repr(number)


def quantity_text(quantity: object, field: str, tag: str = "(untagged)") -> str:
    """A pint Quantity of any registry as line-list text: "65.0 metric_ton/hour", "20.0 degC".

    Only the magnitude and the unit's name cross over, so boresize's registry never meets the caller's.
    :raises InputError: a magnitude that is not one real number (an array, a string)
    """
    magnitude = getattr(quantity, "magnitude")
    unit = format(getattr(quantity, "units"), "C")
    unit = re.sub(r"[A-Za-z_]+", lambda m: _OFFSET_NAMES.get(m.group(0), m.group(0)), unit)
    number = number_text(magnitude, field, tag)
    return number if unit in ("", "dimensionless") else f"{number} {unit}"
