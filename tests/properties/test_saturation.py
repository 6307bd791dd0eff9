"""Saturated lines by quality, and the near-saturation error, against CoolProp computed in the test.

CoolProp's PropsSI (IAPWS-95 for water, Span & Wagner for CO2) is the outside reference: every expected
density, viscosity and saturation temperature below is computed here with it.
"""

from __future__ import annotations

import pytest
from CoolProp.CoolProp import PropsSI

from boresize.api import make_line
from boresize.errors import InputError
from boresize.io.document import result_to_dict
from boresize.io.rows import line_from_row
from boresize.properties.saturation import SATURATION_MARGIN

P = 1e6  # 10 bar abs


def _steam(**fields: object) -> dict[str, object]:
    return {"tag": "S-1", "fluid": "steam", "flow": "10 t/h", "pressure": "10 bar", **fields}


def _tsat_text(t_sat: float) -> str:
    return f"{t_sat - 273.15:.2f} degC"


def test_saturated_steam_by_quality_is_coolprops_saturated_vapour(sizer):
    t_sat = PropsSI("T", "P", P, "Q", 1, "Water")  # CoolProp, IAPWS-95
    line = make_line(tag="S-1", fluid="steam", flow="10 t/h", pressure="10 bar", temperature=None, quality=1,
                     service="steam")
    assert line.temperature == pytest.approx(t_sat, rel=1e-12) and line.quality == 1.0
    result = sizer.run(line)
    assert result.status == "pass", result.error
    assert result.state.phase == "gas"
    assert result.state.density == pytest.approx(PropsSI("D", "P", P, "Q", 1, "Water"), rel=1e-9)
    assert result.state.viscosity == pytest.approx(PropsSI("V", "P", P, "Q", 1, "Water"), rel=1e-9)
    record = result_to_dict(result)
    assert record["vapour_fraction"] == 1.0
    assert record["temperature_c"] == pytest.approx(t_sat - 273.15, rel=1e-6)
    assert "by its quality" in record["property_model"]


def test_saturated_liquid_by_quality_zero_is_coolprops_saturated_liquid(sizer):
    line = line_from_row(_steam(fluid="water", temperature="saturated", quality="0"))
    result = sizer.run(line)
    assert result.status != "error", result.error
    assert (result.state.phase, result.state.vapour_fraction) == ("liquid", 0.0)
    assert result.state.density == pytest.approx(PropsSI("D", "P", P, "Q", 0, "Water"), rel=1e-9)
    assert result.state.viscosity == pytest.approx(PropsSI("V", "P", P, "Q", 0, "Water"), rel=1e-9)
    assert result.state.vapour_pressure == pytest.approx(P)  # a saturated liquid sits at its vapour pressure


@pytest.mark.parametrize(("quality", "temperature"), [("100 %", None), ("1", "saturated"), ("1.0", "179.9 degC")])
def test_quality_column_spellings(quality, temperature):
    row = _steam(quality=quality)
    if temperature is not None:
        row["temperature"] = temperature
    line = line_from_row(row)
    assert line.quality == 1.0
    assert line.temperature == pytest.approx(PropsSI("T", "P", P, "Q", 1, "Water"), rel=1e-12)


def test_temperature_that_disagrees_with_saturation_names_both():
    t_sat = PropsSI("T", "P", P, "Q", 1, "Water")
    with pytest.raises(InputError) as info:
        line_from_row(_steam(quality="1", temperature="185 degC"))
    assert str(info.value) == (
        f"line S-1: temperature: temperature 185.00 degC disagrees with the saturation temperature "
        f"{_tsat_text(t_sat)} of Water at 10 bar abs (quality 1); expected the temperature left blank or "
        f"'saturated', or within 0.5 K of {_tsat_text(t_sat)}")


@pytest.mark.parametrize(("cells", "field", "message"), [
    ({"quality": "0.5", "phase": "gas"}, "phase", "phase gas disagrees with quality 0.5 (two-phase)"),
    ({"quality": "-0.1"}, "quality", "quality -0.1 is outside 0 to 1"),
    ({"quality": "1.2"}, "quality", "quality 1.2 is outside 0 to 1"),
    ({"quality": "1", "fluid": "methane:0.9, ethane:0.1"}, "quality",
     "quality 1 is given for the mixture 'methane:0.9, ethane:0.1': a saturated state by quality is available "
     "for pure fluids only"),
    ({"quality": "1", "backend": "thermo"}, "quality",
     "quality 1 is for pure fluids of the coolprop backend; backend 'thermo' does not take a quality"),
    ({"quality": "1", "pressure": "250 bar"}, "pressure", "250 bar abs is off the saturation curve of Water"),
    ({"quality": "1", "phase": "liquid"}, "phase", "phase liquid disagrees with quality 1 (saturated vapour)"),
    ({"temperature": "saturated"}, "temperature", "temperature 'saturated' needs a quality"),
])
def test_quality_errors_name_field_and_value(cells, field, message):
    with pytest.raises(InputError) as info:
        line_from_row(_steam(**({"temperature": None} | cells)))
    assert info.value.field == field
    assert str(info.value).startswith(f"line S-1: {field}: {message}")


def test_steam_just_below_saturation_without_quality_or_phase_is_an_error_giving_the_saturation_temperature(sizer):
    t_sat = PropsSI("T", "P", P, "Q", 0, "Water")  # CoolProp, IAPWS-95
    line = make_line(tag="S-1", fluid="steam", flow="10 t/h", pressure="10 bar", temperature=t_sat - 0.015, si=True)
    result = sizer.run(line)
    assert result.status == "error" and result.error_field == "temperature"
    shown = f"{t_sat - 0.015 - 273.15:.2f} degC"
    assert result.error == (
        f"line S-1: temperature: Water at {shown} and 10 bar abs is within {SATURATION_MARGIN:g} K of its saturation "
        f"temperature {_tsat_text(t_sat)} (coolprop): liquid or vapour is not fixed by pressure and temperature; "
        f"give a quality (1 saturated vapour, 0 saturated liquid) or the line's phase (liquid or gas); expected a "
        f"quality (1 saturated vapour, 0 saturated liquid) or the line's phase (liquid or gas), or a temperature "
        f"more than 0.5 K from {_tsat_text(t_sat)}")


def test_near_saturation_with_a_service_of_the_other_side_names_it(sizer):
    t_sat = PropsSI("T", "P", P, "Q", 0, "Water")
    line = make_line(tag="S-1", fluid="steam", flow="10 t/h", pressure="10 bar", temperature=t_sat - 0.015, si=True,
                     service="steam")
    result = sizer.run(line)
    assert result.status == "error" and "; service 'steam' needs a gas; expected" in result.error


def test_near_saturation_sized_on_the_side_the_service_and_the_state_agree_on(sizer):
    t_sat = PropsSI("T", "P", P, "Q", 0, "Water")
    line = make_line(tag="S-1", fluid="water", flow="10 t/h", pressure="10 bar", temperature=t_sat - 0.015, si=True,
                     service="pump-discharge")
    result = sizer.run(line)
    assert result.status != "error", result.error
    # CoolProp at the line's own (p, T): subcooled by 0.015 K
    assert result.state.density == pytest.approx(PropsSI("D", "P", P, "T", t_sat - 0.015, "Water"), rel=1e-9)


def test_near_saturation_with_the_lines_phase_is_the_saturated_state_of_that_side(sizer):
    t_sat = PropsSI("T", "P", P, "Q", 0, "Water")
    line = make_line(tag="S-1", fluid="steam", flow="10 t/h", pressure="10 bar", temperature=t_sat - 0.015, si=True,
                     phase="gas")
    result = sizer.run(line)
    assert result.status != "error", result.error
    assert result.state.density == pytest.approx(PropsSI("D", "P", P, "Q", 1, "Water"), rel=1e-9)
    assert result.state.vapour_fraction == 1.0


def test_beyond_the_margin_the_pressure_and_temperature_decide(sizer):
    t_sat = PropsSI("T", "P", P, "Q", 0, "Water")
    line = make_line(tag="S-1", fluid="steam", flow="10 t/h", pressure="10 bar",
                     temperature=t_sat + SATURATION_MARGIN + 0.05, si=True)
    result = sizer.run(line)
    assert (result.status, result.service, result.state.phase) == ("pass", "gas", "gas")
    assert result.state.saturation_temperature is None
