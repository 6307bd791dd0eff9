"""Two-phase lines: detection, the services that accept them, the line's and the service's two_phase_method,
and a two-phase line rated end to end."""

from __future__ import annotations

import pytest

from boresize.api import make_line
from boresize.errors import CriteriaFileError, InputError
from boresize.io.rows import line_from_row
from boresize.sizing.services import load_config

STEAM = {"tag": "TP-1", "fluid": "steam", "flow": "10 t/h", "pressure": "10 bar", "quality": "0.3"}


def test_a_two_phase_line_is_rated_by_the_two_phase_method_and_matches_fluids(sizer):
    """Steam at quality 0.3 in service two-phase: the selected size's drop per length is fluids' Beggs-Brill on
    CoolProp's saturated liquid and vapour at 10 bar (outside references: fluids.two_phase.Beggs_Brill,
    CoolProp.PropsSI with Q = 0 and Q = 1)."""
    from CoolProp.CoolProp import PropsSI
    from fluids.two_phase import Beggs_Brill

    result = sizer.run(line_from_row(STEAM | {"service": "two-phase"}))
    assert result.status in ("pass", "fail") and result.selected is not None, result.error
    hyd = result.selected.hydraulics
    assert hyd.two_phase is not None and hyd.two_phase.method == "Beggs-Brill"
    assert hyd.mass_flow == pytest.approx(10000 / 3600 * (1 + (result.design_margin or 0.0)))
    p = 10e5
    rhol, rhog = PropsSI("D", "P", p, "Q", 0, "Water"), PropsSI("D", "P", p, "Q", 1, "Water")
    mul, mug = PropsSI("V", "P", p, "Q", 0, "Water"), PropsSI("V", "P", p, "Q", 1, "Water")
    sigma = PropsSI("I", "P", p, "Q", 0, "Water")
    cand = result.selected.candidate
    expected = Beggs_Brill(m=hyd.mass_flow, x=0.3, rhol=rhol, rhog=rhog, mul=mul,
                           mug=mug, sigma=sigma, P=p, D=cand.inside_diameter, angle=0.0,
                           roughness=cand.roughness, L=1.0)
    assert hyd.drop_per_length == pytest.approx(expected, rel=0.01)
    assert hyd.two_phase.vapour_fraction == pytest.approx(0.3)
    assert hyd.outlet_pressure is not None and 0 < hyd.outlet_pressure < p


def test_a_line_without_service_that_flashes_to_two_phases_gets_the_two_phase_service(sizer):
    from boresize.sizing.service_phase import default_service

    line = make_line("TP-2", "propane 0.5, n-butane 0.5", "10 t/h", "8 bar", "40 degC")
    from boresize.properties.select import fluid_state

    state = fluid_state(sizer.host, line)
    assert state.phase == "two-phase" and default_service(line, state) == "two-phase"


@pytest.mark.parametrize(("service", "phase"), [("gas", "gas"), ("liquid", "liquid or dense"), ("steam", "gas")])
def test_a_two_phase_line_in_a_single_phase_service_names_the_services_that_take_it(sizer, service, phase):
    result = sizer.run(line_from_row(STEAM | {"service": service}))
    assert result.status == "error" and result.error_field == "service"
    assert (f"service {service!r} judges {phase} lines only; use service letdown or two-phase or two-phase-intermittent"
            in result.error)


def test_the_shipped_two_phase_services_accept_two_phase_and_judge_with_criteria_that_can(host):
    config = load_config(host)
    for name, c_us in (("two-phase", 100.0), ("two-phase-intermittent", 125.0)):
        service = config.services[name]
        assert service.accepts == ("two-phase",)
        assert all("two-phase" in criterion.phases for criterion, _ in service.criteria)
        ids = {criterion.id: options for criterion, options in service.criteria}
        # API RP 14E (5th ed., 1991) section 2.5: C = 100 continuous, 125 intermittent (US units)
        assert ids["erosional"]["c_us"] == c_us
        assert {"erosional", "momentum", "drop-per-length"} <= set(ids)
    assert dict(config.services["gas"].takers)["two-phase"] == ("letdown", "two-phase", "two-phase-intermittent")


def test_a_two_phase_service_with_a_criterion_blind_to_two_phase_is_refused(host, tmp_path):
    path = tmp_path / "c.toml"
    path.write_text('[service.wet]\nphase = "two-phase"\nvelocity = { max = "20 m/s" }\n', encoding="utf-8")
    with pytest.raises(CriteriaFileError, match="accepts two-phase lines but velocity cannot judge one"):
        load_config(host, path)


def test_a_service_stores_its_two_phase_method_and_the_line_keeps_its_own(host, tmp_path):
    path = tmp_path / "c.toml"
    path.write_text('[service.wet]\nphase = "two-phase"\ntwo_phase_method = "beggs brill"\n'
                    'erosional = { c_us = 100 }\n', encoding="utf-8")
    assert load_config(host, path).services["wet"].two_phase_method == "Beggs-Brill"  # the fluids library's name
    line = line_from_row(STEAM | {"two_phase_method": "lockhart martinelli"})
    assert line.two_phase_method == "Lockhart_Martinelli"


@pytest.mark.parametrize("bad", ["Begs-Brill", "42", "homogenous"])
def test_an_unknown_two_phase_method_names_line_field_value_and_the_choices(bad):
    with pytest.raises(InputError) as info:
        line_from_row(STEAM | {"two_phase_method": bad})
    assert info.value.field == "two_phase_method"
    assert str(info.value).startswith(f"line TP-1: two_phase_method: unknown two-phase method {bad!r}; expected "
                                      f"homogeneous or a correlation of the fluids library: Bankoff, ")
    assert "Beggs-Brill" in str(info.value) and "Lockhart_Martinelli" in str(info.value)


def test_phase_two_phase_on_a_single_phase_state_asks_for_a_quality(sizer):
    line = make_line("TP-3", "water", "10 t/h", "5 bar", "40 degC", phase="two-phase", service="two-phase")
    result = sizer.run(line)
    assert result.status == "error" and result.error_field == "phase"
    assert "a pure fluid's two-phase line is given by its pressure and quality" in result.error


def test_near_saturation_in_a_single_phase_service_is_unchanged(sizer):
    from CoolProp.CoolProp import PropsSI

    t_sat = PropsSI("T", "P", 1e6, "Q", 0, "Water")  # CoolProp, IAPWS-95
    result = sizer.run(make_line("TP-4", "water", "10 t/h", 1e6, t_sat + 0.2, si=True, service="steam"))
    assert result.status == "pass"  # gas side, and the service's phase is gas


def test_a_mixture_that_flashes_to_two_phases_against_the_lines_own_phase_is_an_error(sizer):
    line = make_line("TP-5", "propane 0.5, n-butane 0.5", "10 t/h", "8 bar", "40 degC", phase="liquid")
    result = sizer.run(line)
    assert result.status == "error" and result.error_field == "phase"
    assert "is two-phase at 40 degC and 8 bar abs" in result.error and "the line's phase is liquid" in result.error


def test_homogeneous_is_one_name_for_the_line_list_and_the_hydraulics(sizer):
    """``homogeneous`` is accepted where the line list is read and where the line is rated (one list of names)."""
    from boresize.hydraulics.two_phase import accepted_methods
    from boresize.hydraulics.two_phase_names import two_phase_methods

    assert accepted_methods() == two_phase_methods() and "homogeneous" in two_phase_methods()
    result = sizer.run(line_from_row(STEAM | {"service": "two-phase", "two_phase_method": "Homogeneous"}))
    assert result.selected is not None and result.selected.hydraulics.two_phase is not None
    assert result.selected.hydraulics.two_phase.method == "homogeneous"


def test_critical_two_phase_flow_says_why_it_cannot_flow(sizer):
    """Steam-water at 0.05 bar abs, quality 0.5, 20 t/h: Beggs & Brill's acceleration term Ek = v_m v_sg rho_s / p
    reaches 1 in every size the class offers (the fluids library's Beggs_Brill turns negative there); the line
    fails as one that cannot flow, and the record says why (not 'at 0 m')."""
    row = STEAM | {"service": "two-phase", "pressure": "0.05 bar", "flow": "20 t/h", "quality": "0.5",
                   "length": "60 m"}
    result = sizer.run(line_from_row(row))
    assert result.status == "fail"
    worst = result.candidates[-1].hydraulics
    assert worst.choked and "acceleration term diverges" in worst.method and worst.outlet_pressure == 0.0


def test_the_drop_verdict_of_a_two_phase_line_names_the_correlation_not_darcy_weisbach(sizer):
    """Every number a line reports comes from the method its verdict used: a two-phase line's drop-per-length
    verdict cites the two-phase correlation that gave the drop."""
    result = sizer.run(line_from_row(STEAM | {"service": "two-phase"}))
    assert result.selected is not None
    drop = next(v for v in result.selected.verdicts if v.criterion == "drop-per-length")
    assert "Beggs-Brill" in drop.source and "Darcy-Weisbach" not in drop.source
    liquid = sizer.run(line_from_row({"tag": "W", "fluid": "water", "flow": "10 t/h", "pressure": "5 bar",
                                      "temperature": "20 degC", "service": "liquid"}))
    assert liquid.selected is not None
    assert "Darcy-Weisbach" in next(v for v in liquid.selected.verdicts if v.criterion == "drop-per-length").source
