"""A stream of a process simulation turned into a :class:`~boresize.model.Line`.

Simulation tools expose a material stream as an object or a dict holding its temperature [K], its
pressure [Pa abs], its mass flow [kg/s] and its composition as mole fractions by component name.
:func:`line_from_stream` reads those under the names the tools commonly use (see :data:`FIELD_NAMES`;
exact names first, then the same names in any letter case) and builds the line with
:func:`boresize.api.make_line` in SI (``si=True``): a bare number is in kg/s, Pa abs or K, and a pint
Quantity or a text with its unit is read as such.

The composition may be a mapping name -> mole fraction, a list of (name, fraction) pairs, a list of
fractions beside a list of component names (``zs`` with ``IDs`` or ``components``), or text in the form
of :mod:`boresize.properties.composition`. Components at or below ``trace`` (default 0) are left out,
because simulations list every component of the flowsheet, most at zero; one component left is a pure
fluid. The fractions left must sum to 1 within 1 % (checked here; the property backend normalises
them, with a warning).
"""

from __future__ import annotations

import inspect
import numbers
from collections.abc import Callable, Mapping, Sequence
from typing import Any

from boresize.api import make_line
from boresize.errors import InputError
from boresize.model import Line

__all__ = ["FIELD_NAMES", "line_from_stream", "stream_value"]

#: Field -> names a stream may use for it (looked up in this order).
FIELD_NAMES: dict[str, tuple[str, ...]] = {
    "tag": ("tag", "name", "ID", "id", "label"),
    "temperature": ("T", "temperature", "temp"),
    "pressure": ("P", "pressure", "press"),
    "mass_flow": ("mass_flow", "F_mass", "mass_flow_rate", "massflow", "m_dot", "mdot"),
    "composition": ("composition", "zs", "mole_fractions", "mole_fraction", "z", "zi"),
    "components": ("components", "IDs", "component_names", "names", "CASs"),
    "fluid": ("fluid",),
}
_FROM_STREAM = ("tag", "fluid", "flow", "pressure", "temperature", "si")
_WHAT = {"temperature": "T [K]", "pressure": "P [Pa abs]", "mass_flow": "a mass flow [kg/s]",
         "composition": "mole fractions by component name"}


def stream_value(stream: object, field: str) -> object:
    """The value a stream gives for ``field`` (a key of :data:`FIELD_NAMES`), or None when it gives none."""
    names = FIELD_NAMES[field]
    get = _getter(stream)
    for name in names:
        value = get(name)
        if value is not None and not callable(value):
            return value
    lowered = {name.lower() for name in names}
    keys = stream.keys() if isinstance(stream, Mapping) else [k for k in dir(stream) if not k.startswith("_")]
    for key in keys:
        if isinstance(key, str) and key.lower() in lowered:
            value = get(key)
            if value is not None and not callable(value):
                return value
    return None


def _getter(stream: object) -> Callable[[str], Any]:
    if isinstance(stream, Mapping):
        return stream.get
    return lambda name: getattr(stream, name, None)


def line_from_stream(stream: object, *, tag: str | None = None, fluid: str | None = None, trace: float = 0.0,
                     **line_fields: object) -> Line:
    """A Line from a stream's T [K], P [Pa abs], mass flow [kg/s] and mole fractions.

    :param stream: a mapping or an object (see the module docstring for the names read)
    :param tag: the line tag (default: the stream's tag, name or ID)
    :param fluid: a fluid name to use instead of the stream's composition (e.g. "water", "steam")
    :param trace: mole fraction at or below which a component is left out [-]
    :param line_fields: any other :func:`~boresize.api.make_line` field (service, length, nps, ...);
        a bare number is in its SI unit
    :raises InputError: a stream without one of the four values, or an unreadable composition,
        naming the field, the stream and what was expected
    """
    name = tag if tag is not None else stream_value(stream, "tag")
    label = str(name) if name is not None else "(untagged)"
    _check_fields(line_fields, label)
    values: dict[str, Any] = {field: _required(stream, field, label)
                              for field in ("temperature", "pressure", "mass_flow")}
    extra: dict[str, Any] = dict(line_fields)
    return make_line(tag=label, fluid=fluid or _fluid(stream, label, trace), flow=values["mass_flow"],
                     pressure=values["pressure"], temperature=values["temperature"], si=True, **extra)


def _check_fields(line_fields: Mapping[str, object], label: str) -> None:
    """Refuse a keyword that is no line field (make_line would raise a TypeError, outside boresize's errors)."""
    allowed = [p for p in inspect.signature(make_line).parameters if p not in _FROM_STREAM]
    for key in line_fields:
        if key not in allowed:
            raise InputError(f"unknown line field {key!r} for stream {label}", field=key, value=line_fields[key],
                             expected=f"one of {', '.join(allowed)}")


def _required(stream: object, field: str, label: str) -> object:
    value = stream_value(stream, field)
    if value is None:
        raise InputError(f"stream {label} gives no {field.replace('_', ' ')}", field=field, value=_shown(stream),
                         expected=f"{_WHAT[field]} under one of {', '.join(FIELD_NAMES[field])}")
    return value


def _shown(stream: object) -> str:
    return repr(stream)[:120]


def _fluid(stream: object, label: str, trace: float) -> str:
    """The fluid text of a stream: a pure fluid name, or "name:fraction, ..." mole fractions."""
    given = stream_value(stream, "composition")
    if given is None:
        named = stream_value(stream, "fluid")
        if isinstance(named, str):
            return named
        raise InputError(f"stream {label} gives no composition", field="composition", value=_shown(stream),
                         expected=f"{_WHAT['composition']} under one of {', '.join(FIELD_NAMES['composition'])}, "
                         f"or fluid=")
    if isinstance(given, str):
        return given
    pairs = [(n, f) for n, f in _pairs(stream, given, label) if f > trace]
    if not pairs:
        raise InputError(f"stream {label} has no component above {trace:g}", field="composition",
                         value=_shown(given), expected="at least one mole fraction above the trace level")
    if len(pairs) == 1:
        return pairs[0][0]
    text = ", ".join(f"{n}:{f!r}" for n, f in pairs)
    from boresize.properties.composition import parse_composition

    parse_composition(text)  # refuse now a sum far from 1 (or a name given twice), not at sizing time
    return text


def _pairs(stream: object, given: Any, label: str) -> list[tuple[str, float]]:
    """(component, mole fraction) pairs from a mapping, a list of pairs, or fractions beside names."""
    if isinstance(given, Mapping) or hasattr(given, "items"):  # a dict, a pandas Series
        items = list(given.items())
    elif isinstance(given, Sequence) or hasattr(given, "__len__"):  # a list, a numpy array
        values = list(given)
        if values and all(isinstance(v, numbers.Real) for v in values):
            names: Any = stream_value(stream, "components")
            if names is None or isinstance(names, str) or len(list(names)) != len(values):
                raise InputError(f"stream {label} gives {len(values)} fractions without as many component names",
                                 field="composition", value=_shown(given),
                                 expected=f"component names under one of {', '.join(FIELD_NAMES['components'])}")
            items = list(zip(names, values))
        else:
            items = [tuple(v) for v in values]
    else:
        raise InputError(f"stream {label} gives a composition of type {type(given).__name__}", field="composition",
                         value=_shown(given), expected="a mapping name -> mole fraction, or pairs, or text")
    return [_pair(item, label) for item in items]


def _pair(item: object, label: str) -> tuple[str, float]:
    if not (isinstance(item, tuple) and len(item) == 2) or isinstance(item[1], bool) \
            or not isinstance(item[1], numbers.Real):
        raise InputError(f"stream {label}: composition item {item!r} is not a name and a mole fraction",
                         field="composition", value=repr(item), expected="(name, fraction) with a number")
    return str(item[0]), float(item[1])
