"""Simulation streams to lines (boresize.io.streams), against CoolProp and pint as outside references."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import pint
import pytest
from CoolProp.CoolProp import PropsSI

from boresize import BoresizeError, InputError, line_from_stream, make_line, size
from boresize.properties.composition import parse_composition
from boresize.io.streams import stream_value

ureg = pint.UnitRegistry()


@dataclass
class SimStream:
    """A stream object as a simulation tool exposes one (SI attributes, fractions beside component IDs)."""

    ID: str
    T: float
    P: float
    F_mass: float
    zs: object
    IDs: tuple[str, ...]


def test_a_dict_stream_becomes_a_line_in_si():  # si=True: the caller asserts the bare numbers are SI
    stream = {"name": "S-1", "T": 313.15, "P": 4.0e5, "mass_flow": 6.0,
              "composition": {"water": 0.85, "methanol": 0.15, "ethanol": 0.0, "propane": 0.0}}
    line = line_from_stream(stream, si=True, service="liquid", length="80 m")
    assert (line.tag, line.temperature, line.pressure, line.flow.basis, line.flow.value) == \
        ("S-1", 313.15, 4.0e5, "mass", 6.0)
    assert (line.service, line.length) == ("liquid", 80.0)
    parsed = parse_composition(line.fluid)
    assert dict(zip(parsed.components, parsed.fractions)) == {"water": 0.85, "methanol": 0.15}


def test_an_object_stream_with_fractions_beside_ids():
    stream = SimStream("S-2", T=300.0, P=2.0e6, F_mass=2.0, zs=np.array([0.9, 0.0, 0.1]),
                       IDs=("methane", "propane", "ethane"))
    line = line_from_stream(stream, si=True)
    assert line.tag == "S-2" and line.fluid == "methane:0.9, ethane:0.1"
    assert line.flow.value == 2.0 and line.pressure == 2.0e6


def test_names_are_found_in_any_letter_case_and_quantities_are_read():
    stream = {"Name": "S-3", "Temperature": ureg.Quantity(40, "degC"), "Pressure": ureg.Quantity(3, "bar"),
              "Mass_Flow": ureg.Quantity(36, "t/h"), "Composition": [("water", 1.0)]}
    line = line_from_stream(stream)
    # 40 degC = 313.15 K, 3 bar = 3e5 Pa (absolute), 36 t/h = 10 kg/s: pint's conversions in the caller's registry.
    assert line.temperature == pytest.approx(ureg.Quantity(40, "degC").to("K").magnitude, rel=1e-12)
    assert line.pressure == pytest.approx(3e5, rel=1e-12)
    assert line.flow.value == pytest.approx(10.0, rel=1e-12)
    assert line.fluid == "water"  # one component: a pure fluid


def test_trace_components_are_left_out():
    stream = {"id": "S-4", "T": 300.0, "P": 1e6, "mass_flow": 1.0,
              "composition": {"methane": 0.995, "ethane": 0.004, "propane": 0.001}}
    assert line_from_stream(stream, si=True, trace=0.002).fluid == "methane:0.995, ethane:0.004"
    assert stream_value(stream, "tag") == "S-4"


def test_a_pure_water_stream_sizes_with_coolprop_properties():
    # Reference: CoolProp IAPWS-95 density and viscosity at the stream's T and P.
    stream = {"name": "CW-1", "T": 301.15, "P": 4.5e5, "mass_flow": 45.0, "composition": {"water": 1.0}}
    result = size(line_from_stream(stream, si=True, service="cooling-water"), plugins=False)
    assert result.density_kg_m3 == pytest.approx(PropsSI("D", "T", 301.15, "P", 4.5e5, "Water"), rel=1e-6)
    assert result.viscosity_mpa_s == pytest.approx(PropsSI("V", "T", 301.15, "P", 4.5e5, "Water") * 1e3, rel=1e-6)
    area = math.pi * (result.inside_diameter_mm / 1e3) ** 2 / 4
    assert result.velocity_m_s == pytest.approx(45.0 / result.density_kg_m3 / area, rel=1e-9)


def test_the_stream_path_and_make_line_give_the_same_result():
    stream = SimStream("S-5", T=313.15, P=4.0e5, F_mass=6.0, zs=[0.85, 0.15], IDs=("water", "methanol"))
    direct = make_line(tag="S-5", fluid="water:0.85, methanol:0.15", flow="6 kg/s", pressure="4 bara",
                       temperature="313.15 K", service="liquid")
    assert size(line_from_stream(stream, si=True, service="liquid"), plugins=False).to_dict() == \
        size(direct, plugins=False).to_dict()


def test_an_unknown_line_field_is_refused_by_name():
    stream = {"name": "S-6", "T": 300.0, "P": 1e5, "mass_flow": 1.0, "composition": {"water": 1.0}}
    pattern = r"unknown line field 'lenght' for stream S-6; expected one of .*length"
    with pytest.raises(InputError, match=pattern) as info:
        line_from_stream(stream, si=True, lenght="3 m")
    assert (info.value.field, info.value.value) == ("lenght", "3 m")
    with pytest.raises(InputError, match=r"unknown line field 'flow'"):
        line_from_stream(stream, si=True, flow="3 t/h")  # the flow is the stream's own


@pytest.mark.parametrize(("stream", "field", "pattern"), [
    ({"name": "X", "P": 1e5, "mass_flow": 1.0, "composition": {"water": 1.0}}, "temperature",
     r"stream X gives no temperature; expected T \[K\] under one of T, temperature, temp"),
    ({"name": "X", "T": 300.0, "P": 1e5, "composition": {"water": 1.0}}, "mass_flow",
     r"stream X gives no mass flow"),
    ({"name": "X", "T": 300.0, "P": 1e5, "mass_flow": 1.0}, "composition", r"stream X gives no composition"),
    ({"name": "X", "T": 300.0, "P": 1e5, "mass_flow": 1.0, "zs": [0.5, 0.5]}, "composition",
     r"gives 2 fractions without as many component names"),
    ({"name": "X", "T": 300.0, "P": 1e5, "mass_flow": 1.0, "composition": {"water": "most"}}, "composition",
     r"composition item \('water', 'most'\) is not a name and a mole fraction"),
    ({"name": "X", "T": 300.0, "P": 1e5, "mass_flow": 1.0, "composition": {"water": 0.0}}, "composition",
     r"has no component above 0"),
    ({"name": "X", "T": 300.0, "P": 1e5, "mass_flow": 1.0, "composition": 7}, "composition",
     r"gives a composition of type int"),
    ({"name": "X", "T": 300.0, "P": -1.0, "mass_flow": 1.0, "composition": {"water": 1.0}}, "pressure",
     r"absolute pressure must be above zero"),
    ({"name": "X", "T": 300.0, "P": 1e5, "mass_flow": 1.0, "composition": {"water": 0.5, "methanol": 0.3}}, "fluid",
     r"sum"),
])
def test_bad_streams_raise_errors_naming_the_field(stream, field, pattern):
    with pytest.raises(InputError, match=pattern) as info:
        line_from_stream(stream, si=True)
    assert isinstance(info.value, BoresizeError)
    assert info.value.field == field and info.value.value is not None


# -- the unit of every number read is known (STREAM_TYPES, units=, si=True) -------------------------------
def test_thermo_stream_is_read_with_its_own_units():
    # Reference: thermo's Stream stores m [kg/s], T [K], P [Pa] as given (checked on the object itself).
    thermo = pytest.importorskip("thermo")
    stream = thermo.Stream(IDs=["methane", "ethane"], zs=[0.9, 0.1], T=300, P=5e6, m=1)
    line = line_from_stream(stream, tag="G-1")
    assert (line.flow.basis, line.flow.value) == ("mass", pytest.approx(stream.m, rel=1e-12))
    assert (line.temperature, line.pressure) == (300.0, 5e6)
    assert line.fluid == "methane:0.9, ethane:0.1"


def _thermosteam_like(**attributes: object) -> object:
    """A stand-in for thermosteam's Stream, matched by module and class name only (thermosteam not installed)."""
    chemicals = type("Chemicals", (), {"IDs": ("Water",)})()
    cls = type("Stream", (), {"__module__": "thermosteam._stream", "chemicals": chemicals, **attributes})
    return cls()


def test_a_thermosteam_stream_mass_flow_is_kg_per_hour():
    # Source: thermosteam's documentation of Stream.F_mass [kg/hr] (from the library's documentation;
    # not checked on the library itself, which is not installed here). 3600 kg/h = 1 kg/s.
    stream = _thermosteam_like(ID="S-7", T=300.0, P=2e5, F_mass=3600.0, z_mol=[1.0])
    line = line_from_stream(stream)
    assert (line.tag, line.fluid, line.flow.value, line.pressure) == ("S-7", "Water", 1.0, 2e5)
    # a subclass (thermosteam's MultiStream is one) is matched through its base
    sub = type("MultiStream", (type(stream),), {})()
    assert line_from_stream(sub).flow.value == 1.0
    # the caller's units win over the table
    assert line_from_stream(stream, units={"F_mass": "t/h"}).flow.value == pytest.approx(1000.0, rel=1e-12)


def test_an_unknown_object_with_bare_numbers_is_refused():
    stream = SimStream("S-9", T=300.0, P=2.0e6, F_mass=2.0, zs=[1.0], IDs=("methane",))
    with pytest.raises(InputError) as info:
        line_from_stream(stream)
    assert str(info.value) == (
        "temperature: stream S-9: T = 300.0 is a bare number and the unit of T on a SimStream is not known; "
        "expected a pint Quantity or text with its unit (e.g. '40 degC'), or units={'T': '<unit>'}, or si=True "
        "when the stream's numbers are SI (K)")
    assert (info.value.field, info.value.value) == ("temperature", 300.0)
    with pytest.raises(InputError, match=r"mass_flow: stream S-9: F_mass = 2.0 is a bare number"):
        line_from_stream(stream, units={"T": "K", "P": "Pa"})


def test_a_dict_with_units_is_accepted():
    stream = {"name": "S-10", "T": "40 degC", "P": ureg.Quantity(3, "bar"), "F_mass": 36.0,
              "composition": {"water": 1.0}}
    line = line_from_stream(stream, units={"mass_flow": "t/h"})
    # 36 t/h = 10 kg/s; 40 degC = 313.15 K (pint, the outside reference)
    assert line.flow.value == pytest.approx(ureg.Quantity(36, "t/h").to("kg/s").magnitude, rel=1e-12)
    assert line.temperature == pytest.approx(313.15, rel=1e-12) and line.pressure == pytest.approx(3e5)


@pytest.mark.parametrize(("units", "pattern"), [
    ("kg/h", r"units: units for stream S-11 is a str; expected a mapping"),
    ({"flow": "t/h"}, r"units for stream S-11 names 'flow', which is not read; expected one of F_mass, m, "),
    ({"mass_flow": 3}, r"units for stream S-11: mass_flow has unit 3; expected a unit as text"),
    ({"mass_flow": "bar"}, r"flow: '1.0 bar' is a pressure, not a flow"),
])
def test_bad_units_are_refused_by_name(units, pattern):
    stream = {"name": "S-11", "T": "300 K", "P": "1 bar", "mass_flow": 1.0, "composition": {"water": 1.0}}
    with pytest.raises(InputError, match=pattern):
        line_from_stream(stream, units=units)


def test_a_number_beyond_any_float_is_an_input_error_not_an_overflow():
    stream = _thermosteam_like(ID="S-12", T=300.0, P=2e5, F_mass=10**400, z_mol=[1.0])
    with pytest.raises(InputError, match=r"line S-12: flow: "):
        line_from_stream(stream)
