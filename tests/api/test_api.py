"""The Python API (boresize.api, boresize.api.result, the package's __init__), against pint, CoolProp and fluids."""

from __future__ import annotations

import math
import pickle
import subprocess
import sys

import numpy as np
import pint
import pytest
from CoolProp.CoolProp import PropsSI
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe

import boresize
from boresize import BoresizeError, InputError, Line, LineResult, SizingResult, UnitError
from boresize.api import check, make_line, size, size_many
from boresize.io.document import result_to_dict

# A registry of the caller's own: boresize must read its Quantities without mixing it with boresize's.
ureg = pint.UnitRegistry()
Q_ = ureg.Quantity
WATER = {"fluid": "water", "pressure": "9 barg", "temperature": "30 degC"}


@pytest.fixture(scope="module")
def water_line() -> Line:
    return make_line(tag="P-1", flow="45 t/h", design_margin="0 %", **WATER)


@pytest.fixture(scope="module")
def sized(water_line: Line) -> SizingResult:
    return size(water_line, plugins=False)


# -- make_line: quantities, text and bare numbers ---------------------------------------------
@pytest.mark.parametrize(("field", "quantity", "si"), [
    ("flow", Q_(65, "t/h"), "kg/s"),
    ("flow", Q_(120, "m**3/hour"), "m**3/s"),
    ("pressure", Q_(10, "bar"), "Pa"),        # pint's bar is absolute, as boresize's bare bar is
    ("pressure", Q_(150, "psi"), "Pa"),
    ("temperature", Q_(30, "degC"), "K"),
    ("temperature", Q_(100, "degF"), "K"),
    ("length", Q_(400, "ft"), "m"),
    ("density", Q_(62.0, "lb/ft**3"), "kg/m**3"),
    ("viscosity", Q_(1.2, "cP"), "Pa*s"),
])
def test_quantities_of_another_registry_convert_as_that_registry_converts_them(field, quantity, si):
    # Reference: pint's own conversion in the caller's registry.
    values = {"tag": "Q-1", "fluid": "water", "flow": "1 kg/s", "pressure": "1 bar", "temperature": "300 K",
              field: quantity}
    line = make_line(**values)
    got = line.flow.value if field == "flow" else getattr(line, field)
    assert got == pytest.approx(quantity.to(si).magnitude, rel=1e-12)


def test_text_units_and_si_give_the_same_line():
    # 45 t/h = 12.5 kg/s (1 t = 1000 kg, SI brochure); 9 barg = 9e5 + 101325 Pa (standard atmosphere, NIST SP 811);
    # 30 degC = 303.15 K (SI definition of the Celsius scale).
    text = make_line(tag="A", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC", length="120 m")
    units = make_line(tag="A", fluid="water", flow=45, pressure=9, temperature=30, length=120,
                      units={"flow": "t/h", "pressure": "barg", "temperature": "degC", "length": "m"})
    si = make_line(tag="A", fluid="water", flow=12.5, pressure=1001325.0, temperature=303.15, length=120.0, si=True)
    assert text.flow.value == pytest.approx(12.5, rel=1e-15)
    assert text.pressure == pytest.approx(1001325.0, rel=1e-15)
    assert text.temperature == pytest.approx(303.15, rel=1e-15)
    for other in (units, si):
        assert other.flow == text.flow
        assert other.pressure == pytest.approx(text.pressure, rel=1e-15)
        assert other.temperature == pytest.approx(text.temperature, rel=1e-15)
        assert other.length == text.length


def test_numpy_numbers_mappings_and_optional_fields_are_read():
    line = make_line(tag="A", fluid={"methane": 0.9, "ethane": 0.1}, flow=np.float64(2.0), pressure=np.float32(5e6),
                     temperature=np.int64(300), si=True, nps=4, schedule=80, fittings={"elbow-90-lr": 4, "gate": 2},
                     design_margin=0.1, elevation=Q_(-3, "m"), extra={"composition_basis": "mole"})
    assert line.flow.value == 2.0 and line.pressure == 5e6 and line.temperature == 300.0
    assert line.fluid == "methane:0.9, ethane:0.1"
    assert (line.nps, line.schedule) == ("4", "80")
    assert line.fittings == (("elbow-90-lr", 4.0), ("gate", 2.0))
    assert line.design_margin == 0.1 and line.elevation == -3.0
    assert ("composition_basis", "mole") in line.extra


def test_a_bare_number_without_its_unit_names_the_field_and_value():
    with pytest.raises(UnitError, match=r"line P-9: flow: bare number 45 has no unit; expected .*si=True") as info:
        make_line(tag="P-9", fluid="water", flow=45, pressure="9 barg", temperature="30 degC")
    assert (info.value.field, info.value.value, info.value.tag) == ("flow", 45, "P-9")


@pytest.mark.parametrize(("changes", "error", "field", "pattern"), [
    ({"flow": [45]}, InputError, "flow", r"a list is not a value boresize reads"),
    ({"flow": True}, InputError, "flow", r"a bool is not a value"),
    ({"flow": float("nan")}, UnitError, "flow", r"bare number nan has no unit"),
    ({"flow": float("inf"), "si": True}, InputError, "flow", r"inf is not a finite number"),
    ({"flow": Q_(np.array([1.0, 2.0]), "kg/s")}, InputError, "flow", r"is not a number"),
    ({"flow": Q_(20, "degC")}, UnitError, "flow", r"is a temperature, not a flow"),
    ({"pressure": Q_(3, "m")}, UnitError, "pressure", r"is a length, not a pressure"),
    ({"pressure": "abc"}, InputError, "pressure", r"does not start with a number"),
    ({"flow": "-5 t/h"}, InputError, "flow", r"is not above zero"),
    ({"units": {"fluid": "kg"}}, InputError, "units", r"units given for 'fluid', which take no unit"),
    ({"fittings": {"gate": "two"}}, InputError, "fittings", r"'two' is not a number"),
    ({"nps": "2.7"}, InputError, "nps", r"unknown NPS '2.7'"),
    ({"fluid": 42}, InputError, "fluid", r"a composition cannot be a int"),
])
def test_bad_values_raise_errors_of_the_package_tree_with_field_and_value(changes, error, field, pattern):
    values = {"tag": "E-1", "fluid": "water", "flow": "45 t/h", **WATER, **changes}
    with pytest.raises(error, match=pattern) as info:
        make_line(**values)
    assert isinstance(info.value, BoresizeError)
    assert info.value.field == field
    assert info.value.value is not None


# -- size and check -----------------------------------------------------------------------------
def test_size_agrees_with_coolprop_and_the_fluids_library(sized):
    # Outside references: water properties from CoolProp (IAPWS-95), the inside diameter from fluids'
    # ASME B36.10M table, the friction factor from fluids (Clamond, exact Colebrook), roughness 0.045 mm.
    rho = PropsSI("D", "T", 303.15, "P", 1001325.0, "Water")
    mu = PropsSI("V", "T", 303.15, "P", 1001325.0, "Water")
    _, di, _, _ = nearest_pipe(NPS=float(sized.nps), schedule=sized.schedule)
    v = 12.5 / rho / (math.pi * di**2 / 4)
    f = friction_factor(Re=rho * v * di / mu, eD=0.045e-3 / di)
    assert sized.status == "pass"
    assert sized.inside_diameter_mm == pytest.approx(di * 1e3, rel=1e-4)
    assert sized.velocity_m_s == pytest.approx(v, rel=1e-4)
    assert sized.dp_kpa_per_100m == pytest.approx(f * rho * v**2 / (2 * di) / 10, rel=1e-3)
    assert sized.density_kg_m3 == pytest.approx(rho, rel=1e-6)
    assert sized.viscosity_mpa_s == pytest.approx(mu * 1e3, rel=1e-6)
    # The Quantities carry the same numbers; 1 ft = 0.3048 m exactly (international foot).
    assert sized.velocity.to("ft/s").magnitude == pytest.approx(v / 0.3048, rel=1e-4)
    assert sized.density.to("kg/m**3").magnitude == pytest.approx(rho, rel=1e-6)
    assert sized.viscosity.to("Pa*s").magnitude == pytest.approx(mu, rel=1e-6)
    assert sized.drop_per_length.to("Pa/m").magnitude == pytest.approx(sized.dp_kpa_per_100m * 10, rel=1e-12)
    assert sized.inside_diameter.to("m").magnitude == pytest.approx(di, rel=1e-4)


def test_result_is_a_line_result_with_the_json_entry(sized, water_line, sizer):
    assert isinstance(sized, LineResult)
    assert sized.to_dict() == result_to_dict(sizer.run(water_line))
    for key in ("velocity_m_s", "dp_kpa_per_100m", "inside_diameter_mm", "density_kg_m3", "viscosity_mpa_s"):
        assert getattr(sized, key) == pytest.approx(sized.to_dict()[key], rel=1e-5)
    assert sized.nps == sized.to_dict()["nps"] and sized.schedule == sized.to_dict()["schedule"]
    assert pickle.loads(pickle.dumps(sized)).to_dict() == sized.to_dict()
    assert "P-1" in repr(sized) and "pass" in repr(sized)


def test_check_rates_the_line_at_the_size_given(water_line):
    # NPS 2 Sch 40, ID 52.50 mm (ASME B36.10M via fluids): 12.5 kg/s of water runs near 5.8 m/s, beyond the
    # 3 m/s of the liquid service (common practice).
    result = check(water_line, nps="2", plugins=False)
    _, di, _, _ = nearest_pipe(NPS=2, schedule="40")
    assert result.mode == "check" and result.nps == "2" and result.status == "fail"
    assert result.inside_diameter_mm == pytest.approx(di * 1e3, rel=1e-4)
    assert check(water_line, nps=2, schedule="80", plugins=False).schedule == "80"


@pytest.mark.parametrize(("call", "error", "field", "pattern"), [
    (lambda line: check(line, nps="2.7", plugins=False), InputError, "nps", r"unknown NPS '2.7'"),
    (lambda line: check(line, plugins=False), InputError, "nps", r"no NPS to check"),
    (lambda line: check(line, nps="4", schedule="41", plugins=False), InputError, "schedule", r"unknown schedule"),
    (lambda line: size("P-1"), InputError, "line", r"item 1 is a str, not a Line"),
    (lambda line: size([line, make_line(tag="other", flow="1 t/h", **WATER)]), InputError, "line",
     r"different tags: P-1, other"),
    (lambda line: size(line, criteria="x.toml", sizer=object()), InputError, "criteria", r"both a sizer"),
    (lambda line: size_many([line], executor="pool"), InputError, "executor", r"a str is not an executor"),
    (lambda line: size_many([line], workers=0), InputError, "workers", r"workers 0 is not a whole number"),
    (lambda line: size_many([line, 3]), InputError, "line", r"item 2 is a int, not a Line"),
])
def test_api_calls_raise_package_errors_naming_the_field(water_line, call, error, field, pattern):
    with pytest.raises(error, match=pattern) as info:
        call(water_line)
    assert info.value.field == field


def test_an_engine_fault_is_an_error_result_that_raise_for_error_raises(water_line):
    # Water at 200 degC and 9 barg is steam (saturation 180 degC at 10 bar abs, IAPWS-IF97 steam tables).
    hot = make_line(tag="<b>H&1</b>", fluid="water", flow="45 t/h", pressure="9 barg", temperature="200 degC",
                    service="liquid")
    result = size(hot, plugins=False)
    assert result.status == "error" and result.velocity is None and result.velocity_m_s is None
    with pytest.raises(InputError, match=r"line <b>H&1</b>: temperature: .*needs a liquid") as info:
        result.raise_for_error()
    assert (info.value.field, info.value.value, info.value.tag) == ("temperature", hot.temperature, "<b>H&1</b>")
    page = result._repr_html_()
    assert "<b>H&amp;1</b>" not in page and "&lt;b&gt;H&amp;amp;1&lt;/b&gt;" not in page
    assert "&lt;b&gt;H&amp;1&lt;/b&gt;" in page
    assert size(water_line, plugins=False).raise_for_error().passed


def test_html_repr_escapes_every_user_text():
    line = make_line(tag="<script>alert(1)</script>", flow="45 t/h", case="<i>max</i>", **WATER)
    page = size(line, plugins=False)._repr_html_()
    assert "<script>" not in page and "<i>" not in page
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in page
    assert "<table>" in page and "velocity" in page


def test_operating_cases_size_as_one_line():
    normal = make_line(tag="P-6", flow="45 t/h", case="normal", **WATER)
    peak = make_line(tag="P-6", flow="60 t/h", case="maximum", **WATER)
    both = size([normal, peak], plugins=False)
    alone = size(peak, plugins=False)
    assert [c.line.case for c in both.cases] == ["normal", "maximum"]
    assert isinstance(both.cases[0], SizingResult)
    assert both.nps == alone.nps  # the larger flow governs the size


def test_size_many_keeps_input_order(water_line):
    flows = [80, 10, 45, 120, 25]
    lines = [make_line(tag=f"L-{f}", flow=f"{f} t/h", **WATER) for f in flows]
    results = size_many(lines, plugins=False)
    assert [r.tag for r in results] == [f"L-{f}" for f in flows]
    assert [r.to_dict() for r in results] == [size(line, plugins=False).to_dict() for line in lines]


# -- the package's public names -------------------------------------------------------------
def test_all_names_resolve_and_are_listed_once():
    assert len(boresize.__all__) == len(set(boresize.__all__))
    for name in boresize.__all__:
        assert getattr(boresize, name) is not None, name
    assert set(boresize.__all__) <= set(dir(boresize))
    assert boresize.size is size and boresize.SizingResult is SizingResult
    with pytest.raises(AttributeError, match="no attribute 'sise'"):
        boresize.sise  # noqa: B018


def test_importing_boresize_stays_light():
    code = ("import sys, boresize; heavy = ('pint', 'CoolProp', 'thermo', 'pandas', 'numpy', 'scipy', 'dask'); "
            "print(sorted(m for m in heavy if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout
    assert out.strip() == "[]"
