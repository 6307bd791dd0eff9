"""Gas lines with a large drop: segment marching against the isothermal gas equation (fluids, Crane TP-410),
the Fanno relations of adiabatic flow, and CoolProp's methane."""

from __future__ import annotations

import math

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.compressible import P_isothermal_critical_flow, isothermal_gas
from fluids.friction import friction_factor as fluids_friction_factor
from fluids.piping import nearest_pipe
from scipy.optimize import brentq

from boresize.errors import InputError
from boresize.hydraulics.compressible import isothermal_mass_flow, march_gas_line
from boresize.io.rows import line_from_row
from boresize.model import FluidState


def _ideal_gas(rho_ref: float, p_ref: float, t_ref: float, k: float = 1.4, mu: float = 1e-5):
    """A perfect gas: rho = rho_ref p/p_ref T_ref/T, constant viscosity, c = sqrt(k p / rho)."""
    def state(p: float, t: float) -> FluidState:
        rho = rho_ref * p / p_ref * t_ref / t
        return FluidState(density=rho, viscosity=mu, phase="gas", source="test", model="perfect gas",
                          speed_of_sound=math.sqrt(k * p / rho))
    return state


# fluids docs example: isothermal_gas(rho=11.3, fd=0.00185, P1=1E6, P2=9E5, L=1000, D=0.5) = 145.484757264
FLUIDS_EXAMPLE = 145.484757264


def test_isothermal_equation_reproduces_the_documented_example():
    assert isothermal_mass_flow(11.3, 0.00185, 1e6, 9e5, 1000.0, 0.5) == pytest.approx(FLUIDS_EXAMPLE, rel=5e-3)
    assert isothermal_mass_flow(11.3, 0.00185, 1e6, 9e5, 1000.0, 0.5) == pytest.approx(
        isothermal_gas(rho=11.3, fd=0.00185, P1=1e6, P2=9e5, L=1000.0, D=0.5), rel=1e-9)


def test_isothermal_marching_reproduces_the_documented_example():
    # The same line marched in segments (perfect gas, the example's fixed friction factor): the flow that
    # takes 1.0 MPa down to 0.9 MPa matches the fluids docs example within 0.5 %.
    gas = _ideal_gas(11.3, 1e6, 300.0)

    def outlet(mass_flow: float) -> float:
        return march_gas_line(1e6, 300.0, mass_flow, 0.5, 0.0, 1000.0, gas, friction_factor=0.00185).outlet_pressure

    assert brentq(lambda m: outlet(m) - 9e5, 100.0, 170.0, xtol=1e-6) == pytest.approx(FLUIDS_EXAMPLE, rel=5e-3)
    result = march_gas_line(1e6, 300.0, FLUIDS_EXAMPLE, 0.5, 0.0, 1000.0, gas, friction_factor=0.00185)
    # The acceleration term is G^2 (1/rho2 - 1/rho1) with rho2 = 11.3 * 0.9 (isothermal perfect gas).
    flux = FLUIDS_EXAMPLE / (math.pi * 0.25**2)
    assert result.acceleration_drop == pytest.approx(flux**2 * (1 / (11.3 * 0.9) - 1 / 11.3), rel=1e-3)
    assert not result.choked and result.outlet_temperature == 300.0


def test_isothermal_choking_is_detected_at_the_critical_flow():
    # Maximum isothermal flow: the outlet at fluids' P_isothermal_critical_flow (Wilkes, Fluid Mechanics for
    # Chemical Engineers) for the documented line; 3 % more flow cannot pass, 3 % less does.
    gas = _ideal_gas(11.3, 1e6, 300.0)
    p_critical = P_isothermal_critical_flow(P=1e6, fd=0.00185, D=0.5, L=1000.0)
    most = isothermal_gas(rho=11.3, fd=0.00185, P1=1e6, P2=p_critical, L=1000.0, D=0.5)
    below = march_gas_line(1e6, 300.0, 0.97 * most, 0.5, 0.0, 1000.0, gas, friction_factor=0.00185, segments=40)
    above = march_gas_line(1e6, 300.0, 1.03 * most, 0.5, 0.0, 1000.0, gas, friction_factor=0.00185, segments=40)
    assert not below.choked and below.reached_length == pytest.approx(1000.0)
    assert above.choked and above.reached_length < 1000.0
    # Isothermal flow chokes where v = sqrt(p/rho), Mach 1/sqrt(k) on the adiabatic speed of sound (k = 1.4).
    assert below.outlet_mach < 1 / math.sqrt(1.4) < 1.0


def _fanno(mach: float, k: float = 1.4) -> float:
    """Fanno parameter f L*/D of a perfect gas (Shapiro 1953, eq. 6.24; from memory)."""
    m2 = mach * mach
    return (1 - m2) / (k * m2) + (k + 1) / (2 * k) * math.log((k + 1) * m2 / (2 + (k - 1) * m2))


def test_adiabatic_marching_follows_fanno_flow():
    # Perfect gas, k = 1.4, fixed f: the outlet Mach number from f L/D = F(M1) - F(M2) and the pressure ratio
    # p2/p1 = M1/M2 sqrt((2 + (k-1) M1^2) / (2 + (k-1) M2^2)) (Fanno flow; Shapiro 1953, from memory).
    k, f, d, length, p1, t1, rho1 = 1.4, 0.015, 0.1, 20.0, 5e5, 300.0, 5.8
    gas = _ideal_gas(rho1, p1, t1, k)
    c1 = math.sqrt(k * p1 / rho1)
    m1 = 0.3
    mass_flow = m1 * c1 * rho1 * math.pi * d**2 / 4
    m2 = brentq(lambda m: _fanno(m1, k) - _fanno(m, k) - f * length / d, m1, 1.0)
    p2 = p1 * m1 / m2 * math.sqrt((2 + (k - 1) * m1**2) / (2 + (k - 1) * m2**2))
    result = march_gas_line(p1, t1, mass_flow, d, 0.0, length, gas, model="adiabatic", friction_factor=f, segments=40)
    assert result.outlet_pressure == pytest.approx(p2, rel=1e-3)  # isothermal flow would give 0.7 % less
    assert result.outlet_mach == pytest.approx(m2, rel=1e-3)
    # Stagnation temperature held: T2 = T1 (2 + (k-1) M1^2) / (2 + (k-1) M2^2).
    assert result.outlet_temperature == pytest.approx(t1 * (2 + (k - 1) * m1**2) / (2 + (k - 1) * m2**2), rel=1e-3)
    # Longer than the Fanno length L* = F(M1) D / f, the flow chokes.
    too_long = march_gas_line(p1, t1, mass_flow, d, 0.0, 1.1 * _fanno(m1, k) * d / f, gas, model="adiabatic",
                              friction_factor=f, segments=40)
    assert too_long.choked


METHANE = {"tag": "G-1", "fluid": "methane", "pressure": "20 bar", "temperature": "20 degC", "length": "10 km",
           "nps": "6", "service": "gas", "design_margin": "0 %"}


@pytest.mark.parametrize("flow", ["9 t/h", "10.5 t/h"])
def test_long_methane_line_agrees_with_the_isothermal_equation(sizer, flow):
    # 10 km of NPS 6 Sch 40 (ID from fluids' ASME B36.10M table), methane at 20 bar abs and 20 degC from
    # CoolProp. The marched outlet pressure, put into the isothermal gas equation (fluids) with the inlet
    # density and the inlet Colebrook friction factor, gives back the flow within 2 %.
    result = sizer.run(line_from_row({**METHANE, "flow": flow}))
    h = result.selected.hydraulics
    m = float(flow.split()[0]) * 1000 / 3600
    di = nearest_pipe(NPS=6, schedule="40")[1]
    rho = PropsSI("D", "T", 293.15, "P", 20e5, "Methane")
    mu = PropsSI("V", "T", 293.15, "P", 20e5, "Methane")
    v = m / rho / (math.pi * di**2 / 4)
    f = fluids_friction_factor(Re=rho * v * di / mu, eD=4.5e-5 / di)
    assert isothermal_gas(rho=rho, fd=f, P1=20e5, P2=h.outlet_pressure, L=10_000.0, D=di) == pytest.approx(m, rel=0.02)
    assert h.method.startswith("isothermal compressible flow in ") and "above the 10% limit of Crane" in h.method
    assert h.outlet_velocity > h.velocity and h.outlet_mach is not None and not h.choked
    # Velocity and Mach number stay the inlet's; the worst point met along this expanding line is its outlet.
    assert h.mach == pytest.approx(h.velocity / PropsSI("A", "T", 293.15, "P", 20e5, "Methane"), rel=1e-9)
    assert (h.peak_mach, h.peak_velocity, h.peak_position) == (h.outlet_mach, h.outlet_velocity, 10_000.0)
    # The simple (incompressible, inlet density) drop falls short by more than 15 %: the reason to march.
    simple = f * 10_000.0 / di * rho * v**2 / 2
    marched = 20e5 - h.outlet_pressure
    assert simple / marched - 1 < -0.15, f"simple method error {simple / marched - 1:.1%}"


def test_a_small_drop_keeps_the_simple_method_and_says_so(sizer):
    result = sizer.run(line_from_row({**METHANE, "flow": "3 t/h", "length": "500 m"}))
    h = result.selected.hydraulics
    assert h.method.startswith("incompressible Darcy-Weisbach, Colebrook friction factor, inlet density: drop ")
    assert "within the 10% limit of Crane TP-410" in h.method
    assert h.acceleration_drop == 0.0 and h.total_drop < 0.1 * 20e5
    assert h.outlet_pressure == pytest.approx(20e5 - h.drop, rel=1e-12)


def test_a_choked_methane_line_is_reported_and_fails_the_outlet_criterion(sizer):
    from boresize.criteria.base import CriterionContext
    from boresize.criteria.outlet_pressure import OutletPressure

    result = sizer.run(line_from_row({**METHANE, "flow": "12 t/h"}))  # beyond the isothermal maximum
    h = result.selected.hydraulics
    assert h.choked and "CHOKED" in h.method
    verdict = OutletPressure().evaluate(CriterionContext(result.line, result.state, result.selected.candidate, h,
                                                         {}, "gas"))
    assert verdict.status == "fail" and verdict.reason.startswith("choked flow: ")


def test_adiabatic_option_through_the_engine(sizer):
    iso = sizer.run(line_from_row({**METHANE, "flow": "10.5 t/h"})).selected.hydraulics
    adi = sizer.run(line_from_row({**METHANE, "flow": "10.5 t/h", "compressible": "adiabatic"})).selected.hydraulics
    assert adi.method.startswith("adiabatic compressible flow")
    # A long low-Mach pipeline is nearly isothermal (Crane TP-410, chapter 1): the two agree within 2 %.
    assert adi.outlet_pressure == pytest.approx(iso.outlet_pressure, rel=0.02)


def test_bad_models_name_the_field():
    gas = _ideal_gas(11.3, 1e6, 300.0)
    with pytest.raises(InputError, match=r"^compressible: unknown compressible model 'polytropic'; expected one of "
                                         r"isothermal, adiabatic$"):
        march_gas_line(1e6, 300.0, 100.0, 0.5, 0.0, 1000.0, gas, model="polytropic")

    def no_sound(p: float, t: float) -> FluidState:
        return FluidState(density=11.3 * p / 1e6, viscosity=1e-5, phase="gas", source="table", model="given")

    with pytest.raises(InputError, match=r"^compressible: the adiabatic model needs the speed of sound"):
        march_gas_line(1e6, 300.0, 100.0, 0.5, 0.0, 1000.0, no_sound, model="adiabatic")


def test_a_state_the_backend_cannot_give_stops_the_march_and_is_quoted():
    # A backend that refuses states below 0.95 MPa: the line cannot be rated past that point, and the record
    # says why instead of dropping the candidate's result or the whole line.
    gas = _ideal_gas(11.3, 1e6, 300.0)

    def refusing(p: float, t: float) -> FluidState:
        if p < 9.5e5:
            raise InputError("no state below 0.95 MPa", field="pressure", value=p, expected="p >= 0.95 MPa")
        return gas(p, t)

    result = march_gas_line(1e6, 300.0, FLUIDS_EXAMPLE, 0.5, 0.0, 1000.0, refusing, friction_factor=0.00185)
    assert result.choked and 0.0 < result.reached_length < 1000.0 and result.outlet_pressure >= 9.5e5
    assert result.stop_reason == ("sonic limit, or no state from the property backend (pressure: no state below "
                                  "0.95 MPa; expected p >= 0.95 MPa)")
