"""Every state names the fluid family its model was chosen for and the model's validity range (issue: "the right
property model for each fluid family"); a cubic EOS state near the critical point says it may be 10 % off.

References computed here: CoolProp's reference equations (PropsSI) for pure CO2 and water, and their limits.
"""

from __future__ import annotations

import CoolProp.CoolProp as CP
import pytest

from boresize import make_line
from boresize.plugins import PluginHost
from boresize.properties.select import fluid_state


@pytest.fixture(scope="module")
def host() -> PluginHost:
    return PluginHost.load(load_entry_points=False)


@pytest.mark.parametrize(("fluid", "backend", "family"), [
    ("water", None, "pure fluid"), ("NaCl 10%", None, "incompressible liquid or brine"),
    ("toluene:0.5, benzene:0.5", None, "mixture (cubic equation of state)"),
    ("methane:0.9, ethane:0.1", None, "natural gas"), ("mass: water 0.7, ethanol 0.3", None, "aqueous solution"),
    ("toluene", "thermo", "pure component (cubic equation of state)"),
])
def test_each_backend_names_the_family_and_a_validity_range(host, fluid, backend, family) -> None:  # noqa: ANN001
    state = fluid_state(host, make_line("F-1", fluid, "1 t/h", "3 barg", "30 degC", backend=backend))
    assert state.family == family and state.validity


def test_a_pure_fluids_validity_is_its_coolprop_equations_range(host) -> None:  # noqa: ANN001
    state = fluid_state(host, make_line("F-1", "water", "1 t/h", "3 barg", "30 degC"))
    t_min, t_max = CP.PropsSI("Ttriple", "Water"), CP.PropsSI("Tmax", "Water")
    p_max = CP.PropsSI("pmax", "Water")
    assert state.validity == (f"Water reference equation of state in CoolProp: {t_min:.6g} to {t_max:.6g} K, up to "
                              f"{p_max / 1e6:.6g} MPa")


def test_the_line_values_family(host) -> None:  # noqa: ANN001
    line = make_line("F-1", "oil", "1 t/h", "3 barg", "30 degC", density="900 kg/m3", viscosity="20 cP",
                     vapour_pressure="0.1 bar")
    assert fluid_state(host, line).family == "given values"


def test_dense_co2_through_a_cubic_eos_says_it_may_be_10_percent_off(host) -> None:  # noqa: ANN001
    # CO2 at 100 bar abs, 40 degC: thermo's Peng-Robinson is about 10 % light against CoolProp's reference equation
    state = fluid_state(host, make_line("C-1", "CO2", "1 t/h", "100 bar", "40 degC", backend="thermo"))
    reference = CP.PropsSI("D", "P", 100e5, "T", 313.15, "CO2")
    assert abs(state.density / reference - 1) > 0.05  # why the note exists
    assert any(note.startswith("near or above the critical point (T/Tc 1.03, P/Pc 1.36): a cubic equation of state "
                               "may be 10 % off in density here") for note in state.notes), state.notes


def test_natural_gas_far_above_its_critical_temperature_gets_no_near_critical_note(host) -> None:  # noqa: ANN001
    state = fluid_state(host, make_line("G-1", "methane:0.9, ethane:0.1", "1 t/h", "50 bar", "20 degC",
                                        backend="thermo"))
    assert not any("critical point" in note for note in state.notes), state.notes
