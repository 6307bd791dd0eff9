"""``property-crosscheck``: the line's properties against a second, independent backend.

References computed here: CoolProp's reference equations (``PropsSI``) and HEOS mixtures (``AbstractState``), and
thermo's Peng-Robinson EOS (``thermo.eos.PR`` with the chemicals database's constants) for a gas density.
"""

from __future__ import annotations

from dataclasses import replace

import CoolProp
import CoolProp.CoolProp as CP
import pytest
from chemicals import MW, Pc, Tc, omega
from thermo.eos import PR

import boresize.criteria.property_crosscheck as crosscheck
from boresize.criteria.base import parse_options
from boresize.criteria.property_crosscheck import PropertyCrosscheck
from boresize.errors import CriteriaFileError, InputError
from boresize.model import Flow, FluidState, Line
from boresize.plugin import NoSecondOpinion, backend_state, independent_backend
from boresize.testing import run_criterion, size_line
from criteria_context import make_context

METHANE = Line(tag="G-1", fluid="methane", flow=Flow("mass", 1.0), pressure=20e5, temperature=293.15)
WHERE = "service.gas.property-crosscheck"


def _coolprop_methane() -> tuple[float, float]:
    """Density [kg/m3] and viscosity [Pa s] of methane at 20 bar abs and 20 degC (CoolProp reference EOS)."""
    return (CP.PropsSI("D", "T", 293.15, "P", 20e5, "Methane"), CP.PropsSI("V", "T", 293.15, "P", 20e5, "Methane"))


def _thermo_state(density_factor: float, viscosity_factor: float, options: dict[str, str] | None = None):
    """The verdict on a state said to be thermo's whose values are CoolProp's times the factors: the second
    opinion is then CoolProp's reference equation, computed here too."""
    rho, mu = _coolprop_methane()
    state = {"density": rho * density_factor, "viscosity": mu * viscosity_factor, "phase": "gas", "source": "thermo",
             "model": "thermo test model"}
    opts = parse_options(PropertyCrosscheck(), options or {}, WHERE)
    context = make_context(line={"tag": "G-1", "fluid": "methane", "pressure": 20e5, "temperature": 293.15},
                           state=state, options=opts)
    return PropertyCrosscheck().evaluate(context), rho, mu


def test_the_reason_names_both_models_and_both_values_of_the_worst_quantity():
    result, rho, mu = _thermo_state(1.2, 1.1)
    # 1.2 rho against rho: |rho - 1.2 rho| / 1.2 rho = 16.7 %; viscosity 0.1 / 1.1 = 9.09 %
    assert result.status == "fail"
    assert result.reason == (
        f"density differs by 16.7 %, above the fail limit 15 %: {rho * 1.2:.5g} kg/m3 from thermo (thermo test "
        f"model) against {rho:.5g} kg/m3 from coolprop (CoolProp {CoolProp.__version__} HEOS (reference EOS)); "
        "viscosity 9.09 %")
    assert (result.value, result.limit, result.unit) == (pytest.approx(100 * 0.2 / 1.2), 15.0, "%")
    assert result.utilisation == pytest.approx((0.2 / 1.2) / 0.15)


@pytest.mark.parametrize(("factor", "options", "status"), [
    (1.03, None, "pass"),                                   # 2.9 % < warn 5 % (shipped defaults)
    (1.08, None, "warn"),                                   # 7.4 %: between 5 and 15 %
    (1.25, None, "fail"),                                   # 20 % > 15 %
    (1.03, {"warn": "1 %"}, "warn"),                        # the file's own warn
    (1.08, {"warn": "1 %", "fail": "0.05"}, "fail"),        # a fraction reads as well as a percentage
    (1.25, {"warn": "25 %", "fail": "30 %"}, "pass"),
])
def test_thresholds(factor, options, status):
    result, _, _ = _thermo_state(factor, 1.0, options)
    assert result.status == status, result.reason
    assert result.value == pytest.approx(100 * (factor - 1) / factor)


def test_a_coolprop_line_is_checked_with_thermo():
    # Methane at 20 bar abs, 20 degC: the line's density is CoolProp's, the second thermo's Peng-Robinson EOS.
    result = run_criterion(PropertyCrosscheck(), {"tag": "G-1", "fluid": "methane", "flow": "1 t/h",
                                                  "pressure": "20 bar", "temperature": "20 degC"}, "2")
    rho_cp = CP.PropsSI("D", "T", 293.15, "P", 20e5, "Methane")
    cas = "74-82-8"
    rho_pr = MW(cas) / 1000.0 / PR(Tc=Tc(cas), Pc=Pc(cas), omega=omega(cas), T=293.15, P=20e5).V_g
    difference = abs(rho_pr - rho_cp) / rho_cp * 100
    assert result.status == "pass"
    stated = result.reason if result.reason.startswith("density") else result.reason.split("; ")[-1]
    assert f"density {difference:.3g} %" in stated or f"density differs by {difference:.3g} %" in stated
    assert result.value >= difference - 1e-9


def test_a_thermo_mixture_is_checked_with_coolprop_heos():
    # Methane/ethane 90/10 mol at 50 bar abs, 20 degC: thermo serves it, CoolProp HEOS (GERG-2008 parameters) checks.
    line = {"tag": "NG-1", "fluid": "methane:0.9, ethane:0.1", "flow": "1 t/h", "pressure": "50 bar",
            "temperature": "20 degC", "backend": "thermo"}
    result = run_criterion(PropertyCrosscheck(), line, "4")
    heos = CP.AbstractState("HEOS", "Methane&Ethane")
    heos.set_mole_fractions([0.9, 0.1])
    heos.specify_phase(CP.iphase_gas)
    heos.update(CP.PT_INPUTS, 50e5, 293.15)
    # density is the quantity that differs most here (PR about 2 % dense against GERG-2008, as the issue says)
    assert result.reason.startswith("density differs by ")
    assert f"against {heos.rhomass():.5g} kg/m3 from coolprop-mixture (CoolProp {CoolProp.__version__} HEOS" \
        in result.reason
    assert result.status == "pass"


def test_a_gerg_2008_line_is_checked_with_thermo():
    # The same gas by default goes to GERG-2008 through CoolProp; thermo's Peng-Robinson is its second opinion.
    line = {"tag": "NG-2", "fluid": "methane:0.9, ethane:0.1", "flow": "1 t/h", "pressure": "50 bar",
            "temperature": "20 degC"}
    result = run_criterion(PropertyCrosscheck(), line, "4")
    heos = CP.AbstractState("HEOS", "Methane&Ethane")
    heos.set_mole_fractions([0.9, 0.1])
    heos.specify_phase(CP.iphase_gas)
    heos.update(CP.PT_INPUTS, 50e5, 293.15)
    assert result.status == "pass" and result.reason.startswith("density differs by "), result.reason
    assert f"{heos.rhomass():.5g} kg/m3 from gerg-2008" in result.reason and "from thermo" in result.reason


def test_the_second_evaluation_runs_once_per_line(monkeypatch, tmp_path):
    calls = []
    plain = crosscheck.backend_state

    def counting(*args, **kwargs):  # type: ignore[no-untyped-def]
        calls.append(args[0])
        return plain(*args, **kwargs)

    monkeypatch.setattr(crosscheck, "backend_state", counting)
    criteria = tmp_path / "criteria.toml"
    criteria.write_text('[service.checked]\nphase = "liquid"\nvelocity = { max = "2 m/s" }\n'
                        'property-crosscheck = {}\n', encoding="utf-8")
    result = size_line({"tag": "W-1", "fluid": "water", "flow": "60 t/h", "pressure": "7 barg",
                        "temperature": "23 degC", "service": "checked"}, criteria=criteria)
    rated = [v for c in result.candidates for v in c.verdicts if v.criterion == "property-crosscheck"]
    assert len(rated) >= 3 and calls == ["thermo"]
    assert result.status == "pass"


@pytest.mark.parametrize(("row", "words"), [
    ({"fluid": "heavy oil", "density": "950 kg/m3", "viscosity": "120 cP"}, "backend table"),
    ({"fluid": "NaCl 10%"}, "'NaCl 10%' is a CoolProp incompressible fluid (MNA) with no component model in thermo"),
    ({"fluid": "1-octanol"}, "CoolProp has no equation for '1-octanol'"),
    ({"fluid": "methane:0.99, 1-octanol:0.01", "pressure": "1 bar", "temperature": "150 degC"},
     "the second backend coolprop-mixture could not evaluate 'methane:0.99, 1-octanol:0.01'"),
])
def test_no_second_backend_is_an_error_saying_why(row, words):
    line = {"tag": "E-1", "flow": "1 t/h", "pressure": "5 barg", "temperature": "20 degC", **row}
    result = run_criterion(PropertyCrosscheck(), line, "2")
    assert result.status == "error" and result.value is None
    assert result.reason.startswith("properties not cross-checked: ") and words in result.reason, result.reason


def test_a_plugin_reaches_the_second_opinion_through_boresize_plugin():
    state = FluidState(density=1.0, viscosity=1e-5, phase="gas", source="acme-gas", model="acme")
    with pytest.raises(NoSecondOpinion, match="backend 'acme-gas' has no independent second backend"):
        independent_backend(METHANE, state)
    assert independent_backend(METHANE, FluidState(1.0, 1e-5, "gas", "coolprop", "x")) == ("thermo", "methane")
    rho, _ = _coolprop_methane()
    assert backend_state("coolprop", METHANE, 20e5, 293.15).density == pytest.approx(rho, rel=1e-9)
    with pytest.raises(InputError, match="no built-in property backend 'refprop'"):
        backend_state("refprop", METHANE, 20e5, 293.15)


@pytest.mark.parametrize(("given", "message"), [
    ({"warn": 5}, "warn 5 is outside 0 to 100 %"),             # a bare 5 is 500 %, not 5 %
    ({"fail": "150 %"}, "fail 1.5 is outside 0 to 100 %"),
    ({"warn": "0 %"}, "warn 0 is outside 0 to 100 %"),
    ({"warn": "20 %", "fail": "10 %"}, "warn 0.2 is above fail 0.1"),
    ({"warn": "-5 %"}, "warn -0.05 is outside 0 to 100 %"),
])
def test_options_out_of_range_are_errors_naming_the_option(given, message):
    with pytest.raises(CriteriaFileError, match=message.replace("(", r"\(")) as info:
        parse_options(PropertyCrosscheck(), given, WHERE)
    assert info.value.field.startswith(WHERE)


def test_a_thermo_aqueous_alcohol_is_checked_with_melinder():
    # 30 wt% methanol in water at 10 degC: thermo serves the composition; the second opinion is CoolProp's
    # incompressible solution (Melinder), computed here. thermo's logarithmic viscosity mixing is far too low.
    line = {"tag": "A-1", "fluid": "mass: water 0.7, methanol 0.3", "flow": "1 t/h", "pressure": "3 bar",
            "temperature": "10 degC", "backend": "thermo"}  # by default the aqueous backend (Melinder) serves it
    result = run_criterion(PropertyCrosscheck(), line, "2")
    melinder = CP.AbstractState("INCOMP", "MMA")
    melinder.set_mass_fractions([0.3])
    melinder.update(CP.PT_INPUTS, 3e5, 283.15)
    assert result.status == "fail" and result.reason.startswith("viscosity differs by ")
    assert f"against {melinder.viscosity() * 1e3:.5g} mPa s from coolprop-mixture (CoolProp {CoolProp.__version__} " \
           "INCOMP::MMA-30%" in result.reason


def test_a_mole_composition_maps_to_the_solutions_mass_fraction():
    # water/ethanol 80/20 mol: mass fraction 0.2 M_EtOH / (0.2 M_EtOH + 0.8 M_water), molar masses from chemicals
    line = Line(tag="A-2", fluid="water:0.8, ethanol:0.2", flow=Flow("mass", 1.0), pressure=3e5, temperature=298.15)
    state = FluidState(990.0, 2e-3, "liquid", "thermo", "x")
    backend, fluid = independent_backend(line, state)
    ethanol, water = 0.2 * MW("64-17-5"), 0.8 * MW("7732-18-5")
    assert backend == "coolprop-mixture" and fluid.startswith("INCOMP::MEA[") and fluid.endswith("]")
    assert float(fluid[len("INCOMP::MEA["):-1]) == pytest.approx(ethanol / (ethanol + water), rel=1e-4)
    assert independent_backend(replace(line, fluid="water:0.5, acetone:0.5"), state)[1] == "water:0.5, acetone:0.5"
