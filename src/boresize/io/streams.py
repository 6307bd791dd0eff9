"""A stream of a process simulation turned into a :class:`~boresize.model.Line`.

Simulation tools expose a material stream as an object or a dict holding its temperature, its pressure,
its mass flow and its composition as mole fractions by component name. :func:`line_from_stream` reads
those under the names the tools commonly use (see :data:`FIELD_NAMES`; exact names first, then the same
names in any letter case) and builds the line with :func:`boresize.api.make_line`.

The unit of every number read is known, never assumed. A pint Quantity or a text with its unit
(``"6 kg/s"``) is read as such. A bare number takes its unit from, in this order:

1. the caller's ``units={...}`` (keys: ``temperature``, ``pressure``, ``mass_flow`` or the attribute's
   own name; values: unit text such as ``"kg/h"``, ``"barg"``, ``"degC"``);
2. the table :data:`STREAM_TYPES` of simulator object types, matched by the module and class name of
   the object's type or any of its bases (no simulator is imported):

   ========================================  =========  ========  ================  ===================
   type (module, class)                      T          P         mass flow         composition
   ========================================  =========  ========  ================  ===================
   ``thermo`` ``Stream``                     T [K]      P [Pa]    ``m`` [kg/s]      ``zs`` with ``IDs``
   ``thermo`` ``EquilibriumStream``          T [K]      P [Pa]    ``m`` [kg/s]      ``zs`` with ``IDs``
   ``thermosteam`` / ``biosteam`` ``Stream`` T [K]      P [Pa]    ``F_mass`` [kg/h] ``z_mol`` with
                                                                                    ``chemicals.IDs``
   ========================================  =========  ========  ================  ===================

   (thermo's units checked on its own objects; thermosteam's from that library's documentation:
   ``F_mass`` kg/hr, ``F_mol`` kmol/hr, which is not read: a line's flow is a mass flow);
3. ``si=True``: the caller asserts the stream's bare numbers are SI (K, Pa abs, kg/s).

Any other bare number (a plain dict or object, no units given) is an :class:`InputError` naming the
stream, the attribute, the value and the three ways to give its unit: a 3,600x error (kg/h read as kg/s)
is refused rather than guessed.

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

__all__ = ["FIELD_NAMES", "STREAM_TYPES", "line_from_stream", "stream_value"]

#: Field -> names a stream may use for it (looked up in this order).
FIELD_NAMES: dict[str, tuple[str, ...]] = {
    "tag": ("tag", "name", "ID", "id", "label"),
    "temperature": ("T", "temperature", "temp"),
    "pressure": ("P", "pressure", "press"),
    "mass_flow": ("mass_flow", "F_mass", "mass_flow_rate", "massflow", "m_dot", "mdot"),
    "composition": ("composition", "zs", "z_mol", "mole_fractions", "mole_fraction", "z", "zi"),
    "components": ("components", "IDs", "component_names", "names", "CASs"),
    "fluid": ("fluid",),
}

_THERMO = {"temperature": ("T", "K"), "pressure": ("P", "Pa"), "mass_flow": ("m", "kg/s"),
           "composition": ("zs", ""), "components": ("IDs", "")}
_THERMOSTEAM = {"temperature": ("T", "K"), "pressure": ("P", "Pa"), "mass_flow": ("F_mass", "kg/h"),
                "composition": ("z_mol", ""), "components": ("chemicals.IDs", "")}
#: (top-level module, class name) of a simulator's stream type -> field -> (attribute, unit of its numbers).
#: A dotted attribute is read step by step. Matched against the type of the object and its bases.
STREAM_TYPES: dict[tuple[str, str], dict[str, tuple[str, str]]] = {
    ("thermo", "Stream"): _THERMO,  # checked on thermo.Stream(..., m=1): m [kg/s], T [K], P [Pa]
    ("thermo", "EquilibriumStream"): _THERMO,
    ("thermosteam", "Stream"): _THERMOSTEAM,  # the library's documentation: F_mass [kg/hr]
    ("biosteam", "Stream"): _THERMOSTEAM,  # biosteam's Stream is thermosteam's
}
_DIMENSIONAL = ("temperature", "pressure", "mass_flow")
_FROM_STREAM = ("tag", "fluid", "flow", "pressure", "temperature", "si")
_WHAT = {"temperature": "T [K]", "pressure": "P [Pa abs]", "mass_flow": "a mass flow [kg/s]",
         "composition": "mole fractions by component name"}
_EXAMPLE = {"temperature": ("40 degC", "K"), "pressure": ("4 bar", "Pa"), "mass_flow": ("6 kg/s", "kg/s")}


def stream_type(stream: object) -> dict[str, tuple[str, str]] | None:
    """The :data:`STREAM_TYPES` entry of a stream's type (or of one of its bases), or None."""
    if isinstance(stream, Mapping):
        return None
    for cls in type(stream).__mro__:
        top = str(getattr(cls, "__module__", "") or "").split(".")[0]
        entry = STREAM_TYPES.get((top, cls.__name__))
        if entry is not None:
            return entry
    return None


def stream_value(stream: object, field: str) -> object:
    """The value a stream gives for ``field`` (a key of :data:`FIELD_NAMES`), or None when it gives none."""
    return _find(stream, field)[1]


def _find(stream: object, field: str) -> tuple[str, object]:
    """(the attribute or key read, its value) for ``field``; the value is None when the stream gives none."""
    known = stream_type(stream)
    if known is not None and field in known:
        attribute = known[field][0]
        value: object = stream
        for step in attribute.split("."):
            value = getattr(value, step, None)
        if value is not None and not callable(value):
            return attribute, value
    names = FIELD_NAMES[field]
    get = _getter(stream)
    for name in names:
        value = get(name)
        if value is not None and not callable(value):
            return name, value
    lowered = {name.lower() for name in names}
    keys = stream.keys() if isinstance(stream, Mapping) else [k for k in dir(stream) if not k.startswith("_")]
    for key in keys:
        if isinstance(key, str) and key.lower() in lowered:
            value = get(key)
            if value is not None and not callable(value):
                return key, value
    return names[0], None


def _getter(stream: object) -> Callable[[str], Any]:
    if isinstance(stream, Mapping):
        return stream.get
    return lambda name: getattr(stream, name, None)


def line_from_stream(stream: object, *, tag: str | None = None, fluid: str | None = None, trace: float = 0.0,
                     units: Mapping[str, str] | None = None, si: bool = False, **line_fields: object) -> Line:
    """A Line from a stream's temperature, pressure, mass flow and mole fractions, each in a known unit.

    :param stream: a mapping or an object (see the module docstring for the names read)
    :param tag: the line tag (default: the stream's tag, name or ID)
    :param fluid: a fluid name to use instead of the stream's composition (e.g. "water", "steam")
    :param trace: mole fraction at or below which a component is left out [-]
    :param units: the unit of a bare number, by field (``temperature``, ``pressure``, ``mass_flow``) or by
        the stream's attribute name, e.g. ``{"F_mass": "kg/h"}``; wins over :data:`STREAM_TYPES`
    :param si: the caller asserts the stream's other bare numbers are SI (K, Pa abs, kg/s)
    :param line_fields: any other :func:`~boresize.api.make_line` field (service, length, nps, ...);
        a bare number is in its SI unit
    :raises InputError: a stream without one of the four values, a bare number whose unit is not known,
        or an unreadable composition, naming the field, the stream and what was expected
    """
    name = tag if tag is not None else stream_value(stream, "tag")
    label = str(name) if name is not None else "(untagged)"
    _check_fields(line_fields, label)
    given_units = _check_units(units, label)
    known = stream_type(stream)
    values: dict[str, Any] = {field: _with_unit(stream, field, label, given_units, known, si)
                              for field in _DIMENSIONAL}
    extra: dict[str, Any] = dict(line_fields)
    return make_line(tag=label, fluid=fluid or _fluid(stream, label, trace), flow=values["mass_flow"],
                     pressure=values["pressure"], temperature=values["temperature"], si=True, **extra)


def _check_units(units: object, label: str) -> dict[str, str]:
    """The caller's units, keys checked: a field or one of its attribute names, a unit text each."""
    if units is None:
        return {}
    if not isinstance(units, Mapping):
        raise InputError(f"units for stream {label} is a {type(units).__name__}", field="units", value=units,
                         expected='a mapping such as {"mass_flow": "kg/h"}')
    names = set(_DIMENSIONAL) | {n for f in _DIMENSIONAL for n in FIELD_NAMES[f]} | {
        entry[f][0] for entry in STREAM_TYPES.values() for f in _DIMENSIONAL}
    for key, unit in units.items():
        if not isinstance(key, str) or key not in names:
            raise InputError(f"units for stream {label} names {key!r}, which is not read", field="units",
                             value=key, expected=f"one of {', '.join(sorted(names, key=str.lower))}")
        if not isinstance(unit, str) or not unit.strip():
            raise InputError(f"units for stream {label}: {key} has unit {unit!r}", field="units", value=unit,
                             expected='a unit as text, e.g. "kg/h", "barg", "degC"')
    return dict(units)


def _with_unit(stream: object, field: str, label: str, units: Mapping[str, str],
               known: Mapping[str, tuple[str, str]] | None, si: bool) -> object:
    """The stream's value for ``field`` as make_line reads it with si=True: a number given its known unit."""
    attribute, value = _find(stream, field)
    if value is None:
        raise InputError(f"stream {label} gives no {field.replace('_', ' ')}", field=field, value=_shown(stream),
                         expected=f"{_WHAT[field]} under one of {', '.join(FIELD_NAMES[field])}")
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        return value  # a pint Quantity or a text with its unit (or a fault make_line names)
    unit = units.get(attribute) or units.get(field)
    if unit is None and known is not None and known.get(field, ("", ""))[0] == attribute:
        unit = known[field][1]
    if unit is not None:
        try:
            return f"{float(value)!r} {unit}"
        except OverflowError:  # an int beyond any float: make_line names the field and the value
            return f"{value} {unit}"
    if si:
        return value
    example, si_unit = _EXAMPLE[field]
    raise InputError(
        f"stream {label}: {attribute} = {value!r} is a bare number and the unit of {attribute} on a "
        f"{type(stream).__name__} is not known", field=field, value=value,
        expected=f"a pint Quantity or text with its unit (e.g. {example!r}), or units={{{attribute!r}: "
        f"'<unit>'}}, or si=True when the stream's numbers are SI ({si_unit})")


def _check_fields(line_fields: Mapping[str, object], label: str) -> None:
    """Refuse a keyword that is no line field (make_line would raise a TypeError, outside boresize's errors)."""
    allowed = [p for p in inspect.signature(make_line).parameters if p not in _FROM_STREAM]
    for key in line_fields:
        if key not in allowed:
            raise InputError(f"unknown line field {key!r} for stream {label}", field=key, value=line_fields[key],
                             expected=f"one of {', '.join(allowed)}")


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
