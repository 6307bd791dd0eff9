"""The per-line shortcuts before rating (NPS and schedule texts read once, fluid names by any spelling, the
plausibility message built only when needed, states recorded whole by the backend) change no answer.

Every check compares with a reference outside boresize: CoolProp's own ``PropsSI`` and version, the
``fluids`` package's pipe table (ASME B36.10M), or the exact error message the uncached code gives.
"""

from __future__ import annotations

import importlib.metadata
import math
from typing import Any

import pytest

from boresize.errors import InputError, PropertyError
from boresize.model import Flow, Line
from boresize.pipes import load_catalogue, normalise_nps, normalise_schedule, nps_value
from boresize.pipes import catalogue as catalogue_module
from boresize.properties import CoolPropBackend, TableBackend
from boresize.properties.base import check_plausible

ATM = 101325.0  # [Pa], standard atmosphere (definition)
T0 = 273.15  # [K] at 0 degC (definition of the Celsius scale)


def make_line(fluid: str = "water", **overrides: Any) -> Line:
    values: dict[str, Any] = {"tag": "L-1", "fluid": fluid, "flow": Flow("mass", 10.0), "pressure": ATM,
                              "temperature": T0 + 20.0}
    values.update(overrides)
    return Line(**values)


# --- NPS and schedule texts ------------------------------------------------------------------------


@pytest.mark.parametrize("text", ["1 1/2", 'NPS 1-1/2"', "1½", "1.5"])
def test_an_nps_text_read_twice_gives_the_same_pipe(text: str) -> None:
    from fluids.piping import nearest_pipe

    # fluids' ASME B36.10M table: NPS 1-1/2 Sch 40 has Di 40.89 mm (OD 48.26 mm, wall 3.68 mm)
    _, inside, _, _ = nearest_pipe(NPS=1.5, schedule="40")
    for _ in range(2):  # the second call is answered from the texts already read
        label = normalise_nps(text)
        assert nps_value(text) == 1.5
        assert load_catalogue().get(label, "40").inside_diameter == pytest.approx(inside, abs=1e-6)


def test_an_unknown_nps_fails_with_its_own_message_after_known_ones() -> None:
    normalise_nps("2")
    normalise_nps("2.0")
    for _ in range(2):  # an unknown text is never kept: the same message every time, with the field given
        with pytest.raises(InputError, match=r"^line_nps: unknown NPS '2\.7'; expected one of 1/8, 1/4, ") as info:
            normalise_nps("2.7", "line_nps")
        assert (info.value.field, info.value.value) == ("line_nps", "2.7")


def test_true_is_no_nps_even_after_one_was_read() -> None:
    # 1 == True in Python: a cache keyed by value would answer True with NPS 1
    assert normalise_nps("1") == normalise_nps(1) == "1"
    with pytest.raises(InputError, match=r"^nps: unknown NPS True; expected one of 1/8"):
        normalise_nps(True)


def test_many_spellings_past_the_bound_still_read_right(monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr(catalogue_module, "_TEXTS_KEPT", 50)
    spellings = [f"{' ' * i}{label}{' ' * i}" for i in range(4) for label in ("1/2", "3/4", "2", "4", "6") * 5]
    # ASME B36.10M designations: NPS 1/2, 3/4, 2, 4, 6 (from memory)
    expected = {"1/2": 0.5, "3/4": 0.75, "2": 2.0, "4": 4.0, "6": 6.0}
    for text in spellings * 3:
        assert nps_value(text) == expected[text.strip()]
    assert len(catalogue_module._LABEL_BY_TEXT) <= 50


def test_a_schedule_text_read_twice_and_an_unknown_one() -> None:
    # ASME B36.10M: XH is another name of XS, "Sch 40" is schedule 40; B36.19M: 40S
    for _ in range(2):
        assert (normalise_schedule("Sch 40"), normalise_schedule("xh"), normalise_schedule("40s")) == ("40", "XS", "40S")
        with pytest.raises(InputError, match=r"^wall: unknown schedule 'Sch 41'; expected one of 10, 20, 30, 40, 60"):
            normalise_schedule("Sch 41", "wall")


# --- fluid names -------------------------------------------------------------------------------------


def test_two_fluids_resolved_in_turn_keep_their_own_properties() -> None:
    from CoolProp.CoolProp import PropsSI

    backend = CoolPropBackend()
    for _ in range(2):
        for given, coolprop_name, temperature in (("water", "Water", T0 + 20.0), ("methane", "Methane", T0 + 20.0),
                                                  ("Water ", "Water", T0 + 60.0), ("CH4", "Methane", T0 + 60.0)):
            line = make_line(given)
            assert backend.handles(line)
            state = backend.state(line, ATM, temperature)
            # CoolProp's own PropsSI at the same state point (the reference)
            assert state.density == pytest.approx(PropsSI("D", "P", ATM, "T", temperature, coolprop_name), rel=1e-9)
            assert state.fluid_name == coolprop_name


def test_unknown_and_mixture_names_keep_their_messages_after_a_known_one() -> None:
    backend = CoolPropBackend()
    assert backend.resolve("water") == "Water"
    for _ in range(2):  # the second time the name is answered from the names already read
        assert not backend.handles(make_line("watr"))
        with pytest.raises(InputError, match=r"^fluid: unknown fluid 'watr' \(close matches: Water") as info:
            backend.resolve("watr")
        assert (info.value.field, info.value.value) == ("fluid", "watr")
        assert not backend.handles(make_line("methane:0.9, ethane:0.1"))
        with pytest.raises(InputError, match=r"^fluid: 'methane:0\.9, ethane:0\.1' is a mixture; the coolprop "
                                             r"backend handles pure fluids only; expected one pure fluid"):
            backend.resolve("methane:0.9, ethane:0.1")


def test_given_density_and_viscosity_win_over_a_name_already_read() -> None:
    backend = CoolPropBackend()
    assert backend.handles(make_line("water"))
    # README, line list columns: given density and viscosity are used instead of the backend
    assert not backend.handles(make_line("water", density=998.0, viscosity=1e-3))


# --- the state a backend records -------------------------------------------------------------------------


@pytest.mark.parametrize(("temperature", "phase", "fraction"), [
    (T0 + 20.0, "liquid", 0.0),  # water boils at 99.97 degC at 1 atm (IAPWS-95, from memory)
    (T0 + 120.0, "gas", 1.0),
])
def test_coolprop_state_is_recorded_whole(temperature: float, phase: str, fraction: float) -> None:
    from CoolProp.CoolProp import PropsSI

    state = CoolPropBackend().state(make_line(), ATM, temperature)
    assert (state.phase, state.vapour_fraction) == (phase, fraction)
    assert (state.pressure, state.temperature) == (ATM, temperature)
    assert state.backend_version == importlib.metadata.version("CoolProp")
    assert state.viscosity == pytest.approx(PropsSI("V", "P", ATM, "T", temperature, "Water"), rel=1e-9)


def test_saturated_state_without_a_phase_has_no_vapour_fraction() -> None:
    from CoolProp.CoolProp import PropsSI

    psat = PropsSI("P", "T", T0 + 100.0, "Q", 0, "Water")  # IAPWS-95 through CoolProp
    state = CoolPropBackend().state(make_line(), psat, T0 + 100.0)
    assert (state.phase, state.vapour_fraction) == ("two-phase", None)


def test_table_state_is_recorded_whole() -> None:
    line = make_line("heavy fuel oil", density=950.0, viscosity=0.12)
    state = TableBackend().state(line, line.pressure, line.temperature)
    assert (state.phase, state.vapour_fraction) == ("liquid", 0.0)
    assert (state.pressure, state.temperature) == (line.pressure, line.temperature)
    assert state.backend_version == importlib.metadata.version("boresize")


# --- plausibility --------------------------------------------------------------------------------------


@pytest.mark.parametrize(("density", "viscosity", "message"), [
    (math.nan, 1e-3, r"^b: density nan kg/m3 for f at 1\.01325 bar abs, 20 degC is outside the plausible "
                     r"range 0\.01 to 2000 kg/m3$"),
    (998.0, math.inf, r"^b: viscosity inf Pa s for f at 1\.01325 bar abs, 20 degC is outside the plausible "
                      r"range 1e-06 to 10 Pa s$"),
    (3000, 1e-3, r"^b: density 3000 kg/m3 for f .* range 0\.01 to 2000 kg/m3$"),  # an int takes the full check
    (998.0, -1.0, r"^b: viscosity -1 Pa s for f"),
])
def test_implausible_values_keep_their_messages(density: float, viscosity: float, message: str) -> None:
    # the ranges are boresize's plausibility guards (common practice); the conditions are the ones given
    with pytest.raises(PropertyError, match=message):
        check_plausible(density, viscosity, backend="b", fluid="f", pressure=ATM, temperature=T0 + 20.0)


def test_plausible_values_of_any_number_type_pass() -> None:
    import numpy as np

    # water at 20 degC: 998.2 kg/m3 and 1.002 mPa s (IAPWS, from memory)
    for density, viscosity in ((998.2, 1.002e-3), (998, 1e-3), (np.float64(998.2), np.float64(1.002e-3))):
        assert check_plausible(density, viscosity, backend="b", fluid="f", pressure=ATM, temperature=T0) is None
    with pytest.raises(PropertyError, match=r"^b: density nan kg/m3"):
        check_plausible(np.float64("nan"), 1e-3, backend="b", fluid="f", pressure=ATM, temperature=T0)
