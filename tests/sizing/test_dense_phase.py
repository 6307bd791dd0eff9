"""Dense phase: a fluid above its critical point at a liquid-like density is a phase of its own.

Outside reference: CoolProp's PropsSI (Span & Wagner CO2 equation of state) computed in the test. The rule
(T > Tc, p > pc and density above the critical density) is common practice, stated in
boresize.properties.coolprop.
"""

from __future__ import annotations

import pytest
from CoolProp.CoolProp import PropsSI

from boresize.api import make_line
from boresize.errors import CriteriaFileError
from boresize.plugins import PluginHost
from boresize.sizing.services import load_config

P, T = 100e5, 313.15  # 100 bar abs, 40 degC


def _co2(**fields: object):
    return make_line(tag="C-1", fluid="CO2", flow="100 t/h", pressure="100 bar", temperature="40 degC", **fields)


def test_co2_at_100_bar_40_degc_is_dense_with_coolprops_density(sizer):
    density = PropsSI("D", "P", P, "T", T, "CO2")
    # the rule's inputs, from CoolProp: above Tc and pc, denser than the critical density
    assert T > PropsSI("Tcrit", "CO2") and P > PropsSI("pcrit", "CO2")
    assert density > PropsSI("rhocrit", "CO2")
    result = sizer.run(_co2())
    assert result.status == "pass", result.error
    assert (result.state.phase, result.service) == ("dense", "liquid")
    assert result.state.density == pytest.approx(density, rel=1e-9)
    assert result.state.viscosity == pytest.approx(PropsSI("V", "P", P, "T", T, "CO2"), rel=1e-9)
    assert result.state.vapour_fraction is None  # no vapour fraction above the critical point
    # judged by the liquid service's velocity, drop and erosional limits; flashing needs a vapour pressure,
    # which a fluid above its critical temperature does not have
    judged = {v.criterion for v in result.selected.verdicts}
    assert {"velocity", "drop-per-length", "erosional"} <= judged and "flashing" not in judged


def test_co2_below_its_critical_density_stays_gas_like_supercritical(sizer):
    line = make_line(tag="C-2", fluid="CO2", flow="10 t/h", pressure="80 bar", temperature="40 degC")
    assert PropsSI("D", "P", 80e5, "T", T, "CO2") < PropsSI("rhocrit", "CO2")  # CoolProp
    result = sizer.run(line)
    assert (result.state.phase, result.service) == ("supercritical", "gas")


def test_a_dense_line_in_a_service_that_does_not_accept_it_is_refused_naming_those_that_do(sizer):
    result = sizer.run(_co2(service="gas"))
    assert result.status == "error" and result.error_field == "temperature"
    assert result.error == (
        "line C-1: temperature: CarbonDioxide is dense at 40 degC and 100 bar abs (coolprop); service 'gas' needs "
        "a gas line; services that accept a dense fluid: liquid, pump-discharge; expected conditions at which the fluid "
        "is gas, or a service that accepts a dense fluid")


def test_a_dense_line_in_pump_discharge_is_sized(sizer):
    result = sizer.run(_co2(service="pump-discharge"))
    assert (result.status, result.state.phase) == ("pass", "dense")


def test_a_criteria_file_service_accepts_dense_by_a_list(tmp_path, host):
    path = tmp_path / "dense.toml"
    path.write_text('[service.co2]\nphase = ["dense"]\nvelocity = { max = "4 m/s" }\n'
                    '[service.wet]\nphase = ["liquid", "vapour"]\nvelocity = { max = "4 m/s" }\n', encoding="utf-8")
    with pytest.raises(CriteriaFileError) as info:
        load_config(host, path)
    assert (info.value.field, info.value.value) == ("service.wet.phase", "vapour")
    path.write_text('[service.co2]\nphase = ["dense"]\nvelocity = { max = "4 m/s" }\n', encoding="utf-8")
    config = load_config(host, path)
    assert config.services["co2"].accepts == ("dense",)
    assert dict(config.services["gas"].takers)["dense"] == ("co2", "liquid", "pump-discharge")


def test_only_named_shipped_services_accept_dense():
    config = load_config(PluginHost.load(load_entry_points=False))
    assert sorted(n for n, s in config.services.items() if "dense" in s.accepts) == ["liquid", "pump-discharge"]


def test_a_dense_line_whose_drop_exceeds_ten_percent_of_its_pressure_is_marched():
    from boresize.hydraulics.line import rate_line
    from boresize.model import Candidate
    from boresize.properties.coolprop import CoolPropBackend

    backend = CoolPropBackend()
    line = make_line(tag="C-3", fluid="CO2", flow="100 t/h", pressure="100 bar", temperature="40 degC",
                     length="1000 m")
    state = backend.state(line, line.pressure, line.temperature)
    # NPS 4 Sch 40: OD 114.3 mm, wall 6.02 mm (ASME B36.10M)
    pipe = Candidate(nps="4", nps_value=4.0, schedule="40", outside_diameter=0.1143, wall=0.00602,
                     inside_diameter=0.10226, roughness=4.5e-5)
    hyd = rate_line(line, state, pipe, 100e3 / 3600, properties=lambda p, t: backend.state(line, p, t))
    # CoolProp: at the incompressible outlet pressure the density is far below the inlet's
    assert PropsSI("D", "P", hyd.outlet_pressure, "T", T, "CO2") < 0.7 * state.density
    assert hyd.method.startswith("isothermal compressible flow")
