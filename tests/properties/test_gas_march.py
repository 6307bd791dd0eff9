"""The coolprop backend's light path for a gas march (CoolPropBackend.gas_march) against its full state().

Reference: CoolProp itself (HEOS reference equations of state). The light path must give the very floats
state() gives (the same AbstractState calls in the same order) and refuse the same states with the same errors,
so that a marched line's results are byte-identical whichever path the engine takes. Each point is also compared
with a fresh backend's state() (a new AbstractState with no history), so that the order of the points
evaluated before it does not matter.
"""

from __future__ import annotations

from typing import Any

from dataclasses import replace

import pytest
from CoolProp.CoolProp import PropsSI

from boresize.api import make_line
from boresize.errors import BoresizeError
from boresize.model import Line
from boresize.properties.coolprop import CoolPropBackend, GasPoint

T_SAT_9_BAR = PropsSI("T", "P", 9e5, "Q", 1.0, "Water")  # [K], CoolProp's saturation temperature at 9 bar abs

# (fluid, line pressure, line temperature, extra line fields, march points (p [Pa abs], T [K]))
CASES: list[tuple[str, str, str, dict[str, object], list[tuple[float, float]]]] = [
    ("methane", "50 bar", "20 degC", {}, [(50e5 * f, 293.15 - d) for f in (1.0, 0.93, 0.7, 0.31, 0.021)
                                          for d in (0.0, 7.5, 60.0)]),
    ("nitrogen", "10 bar", "-150 degC", {}, [(p, 123.15) for p in (10e5, 3e5, 1e5, 2.5e4)]),
    ("CO2", "100 bar", "40 degC", {}, [(p, 313.15) for p in (100e5, 80e5, 73.8e5, 60e5, 30e5, 5e5)]),
    ("air", "8 barg", "35 degC", {}, [(p, 308.15) for p in (9e5, 6e5, 2e5, 1.1e5)]),
    # superheated steam, marched isothermally and adiabatically (cooling towards saturation)
    ("steam", "10 bar", "250 degC", {}, [(p, t) for p in (10e5, 8e5, 4e5, 1.5e5, 0.3e5)
                                         for t in (523.15, 460.0, 400.0)]),
    # saturated steam by quality and by phase: points on and near the curve go through state()'s saturation rules
    ("steam", "10 bar", "179.88 degC", {"quality": 1.0}, [(10e5, 453.03), (9e5, 453.03), (9e5, 448.0),
                                                           (9e5, T_SAT_9_BAR + 0.2), (5e5, 453.03), (1002745.0, 453.03)]),
    ("water", "10 bar", "180 degC", {"phase": "gas"}, [(9.9e5, 453.15), (10.02e5, 453.15), (1e5, 453.15)]),
    # refusals: not absolute, above the EOS's pressure and temperature limits, below the triple point, solid
    ("steam", "10 bar", "250 degC", {}, [(0.0, 523.15), (-1.0, 523.15), (2e10, 523.15), (1e5, 3000.0),
                                         (1e5, 200.0), (1e5, float("nan")), (float("nan"), 523.15)]),
    ("methane", "50 bar", "20 degC", {}, [(50e5, 80.0), (1e3, 120.0), (1e9, 293.15)]),
]


def _fresh(backend: CoolPropBackend) -> CoolPropBackend:
    """A new backend (new AbstractStates, empty cache) sharing ``backend``'s name map (slow to build)."""
    fresh = CoolPropBackend()
    fresh._names = backend._name_map()
    return fresh


def _outcome(call, p: float, t: float) -> tuple[str, object]:
    try:
        s = call(p, t)
    except BoresizeError as exc:
        return type(exc).__name__, str(exc)
    return "state", (s.density, s.viscosity, s.speed_of_sound)


@pytest.mark.parametrize("fluid, pressure, temperature, extra, points", CASES)
def test_light_path_gives_state_floats_and_refusals(fluid: str, pressure: str, temperature: str,
                                                    extra: dict[str, object], points: list[tuple[float, float]]):
    line: Line = make_line(tag="G-1", fluid=fluid, flow="10 t/h", pressure=pressure, temperature=temperature,
                           **extra)
    backend = CoolPropBackend()
    light = backend.gas_march(line)
    assert light is not None
    for p, t in points + points[::-1]:  # and in the other order: no dependence on the point before
        got = _outcome(light, p, t)
        assert got == _outcome(lambda p, t: backend.state(line, p, t), p, t), (p, t)
        assert got == _outcome(lambda p, t: _fresh(backend).state(line, p, t), p, t), (p, t)
        if got[0] == "state":  # bit for bit, not approximately
            assert all(type(x) is float for x in got[1]), got  # type: ignore[attr-defined]


def test_light_path_takes_the_cheap_route_off_the_curve_and_state_at_it():
    line = make_line(tag="G-2", fluid="steam", flow="10 t/h", pressure="10 bar", temperature="179.88 degC",
                     quality=1.0)
    light = CoolPropBackend().gas_march(line)
    assert light is not None
    assert isinstance(light(5e5, 473.15), GasPoint)  # superheated at 5 bar: the plain (p, T) flash
    assert not isinstance(light(9e5, T_SAT_9_BAR + 0.2), GasPoint)  # near saturation at 9 bar: the saturated vapour of state()
    assert not isinstance(light(line.pressure, line.temperature), GasPoint)  # the line's own point, by quality


@pytest.mark.parametrize("fields", [{"fluid": "unobtainium"}, {"fluid": "methane:0.9, ethane:0.1"},
                                    {"quality": 1.5}, {"quality": float("nan")}])
def test_no_light_path_where_state_refuses_the_line(fields: dict[str, object]):
    line = replace(make_line(tag="G-3", fluid="steam", flow="1 t/h", pressure="10 bar", temperature="200 degC"),
                   **fields)  # past make_line's own checks, as a plugin or an API caller might build it
    backend = CoolPropBackend()
    assert backend.gas_march(line) is None  # the engine then marches on state(), which gives the refusal
    with pytest.raises(BoresizeError):
        backend.state(line, 9e5, 473.15)


def test_a_subclass_with_its_own_state_is_asked_through_it():
    class Tweaked(CoolPropBackend):
        def state(self, line: Line, pressure: float, temperature: float):  # type: ignore[no-untyped-def]
            return replace(super().state(line, pressure, temperature), density=1.0)

    line = make_line(tag="G-4", fluid="methane", flow="1 t/h", pressure="10 bar", temperature="20 degC")
    assert Tweaked().gas_march(line) is None  # the engine then marches on Tweaked.state
    assert CoolPropBackend().gas_march(line) is not None


def test_a_subclass_that_corrects_the_evaluation_and_a_replaced_state_march_on_state(
        monkeypatch: pytest.MonkeyPatch) -> None:
    """A company backend that subclasses CoolPropBackend and corrects ``_compute`` (viscosity x 1.5), or an
    instance whose ``state`` was replaced, is marched on what its ``state()`` gives at every point (found in
    review: the light path skipped the correction past the inlet: outlet 107.5 against 90.8 kPa abs for this
    line). The reference is the same line marched with no light path at all (``gas_march`` giving None: state()
    at every point, as before the light path existed); conditions of our own."""
    from boresize.hookspecs import hookimpl
    from boresize.plugins import PluginHost
    from boresize.sizing.engine import Sizer

    class Corrected(CoolPropBackend):
        id, title = "coolprop-corrected", "CoolProp, viscosity x 1.5"

        def _compute(self, *args):  # type: ignore[no-untyped-def]
            state = super()._compute(*args)
            return replace(state, viscosity=state.viscosity * 1.5)

    wrapped = CoolPropBackend()
    wrapped.id, plain = "coolprop-wrapped", wrapped.state
    wrapped.state = lambda line, p, t: replace(plain(line, p, t), viscosity=plain(line, p, t).viscosity * 1.5)  # type: ignore[method-assign]

    class Plug:
        @hookimpl
        def boresize_register_property_backends(self, register):  # type: ignore[no-untyped-def]
            register.add(Corrected())
            register.add(wrapped)

    def hydraulics(backend_id: str) -> Any:
        sizer = Sizer(PluginHost.load(load_entry_points=False, extra=[Plug()]))
        line = make_line(tag="G-5", fluid="nitrogen", flow="20 t/h", pressure="3 barg", temperature="20 degC",
                         length="3000 m", service="gas", backend=backend_id, nps="6")
        result = sizer.run(line)
        assert result.selected is not None, result.error
        return result.selected.hydraulics

    got = {b: hydraulics(b) for b in ("coolprop-corrected", "coolprop-wrapped")}
    assert all("compressible flow in" in h.method for h in got.values())  # marched
    monkeypatch.setattr(CoolPropBackend, "gas_march", lambda self, line: None)
    for backend_id, h in got.items():
        assert h == hydraulics(backend_id), backend_id
