"""The engine's gas march asks a backend's light ``gas_march`` where it offers one, else its ``state()``.

Reference: CoolProp (HEOS) through the coolprop backend's own state(): a marched line must come out the same,
bit for bit, whichever path the march takes (tests/properties/test_gas_march.py compares the points).
"""

from __future__ import annotations

import pytest

from boresize.api import make_line
from boresize.model import FluidState
from boresize.properties.coolprop import GasPoint
from boresize.properties.select import choose_backend
from boresize.sizing import engine


def _steam(**fields: object):
    # 150 t/h of steam at 3 barg over 3 km: every size is marched, the smaller ones choke
    return make_line(tag="S-1", fluid="steam", flow="150 t/h", pressure="3 barg", temperature="saturated", quality=1.0,
                     length="3000 m",
                     service="steam", **fields)


def test_the_light_path_serves_coolprop_and_state_serves_a_backend_without_it(sizer):
    line = _steam()
    assert isinstance(sizer._gas_along(line)(2e5, 450.0), GasPoint)
    mixture = make_line(tag="M-1", fluid="methane:0.9, ethane:0.1", flow="1 t/h", pressure="10 bar",
                        temperature="20 degC")
    got = sizer._gas_along(mixture)(8e5, 290.0)  # coolprop-mixture: no gas_march, its full state()
    assert isinstance(got, FluidState)
    assert got == choose_backend(sizer.host, mixture).state(mixture, 8e5, 290.0)


@pytest.mark.parametrize("model", ["isothermal", "adiabatic"])
def test_a_marched_line_is_the_same_on_either_path(sizer, monkeypatch, model):
    line = _steam(compressible=model)
    light = sizer.run(line), sizer._rate_all(sizer._prepare(line))  # and every size of the class, rated
    marched = [c for c in light[1] if "compressible flow" in c.hydraulics.method]
    assert marched and any(c.hydraulics.choked for c in marched)

    def full(self, line):  # the march before the light path: state() at every point
        return lambda p, t: choose_backend(self.host, line).state(line, p, t)

    monkeypatch.setattr(engine.Sizer, "_gas_along", full)
    for backend in sizer.host.backends:
        getattr(backend, "cache_clear", lambda: None)()
    assert repr((sizer.run(line), sizer._rate_all(sizer._prepare(line)))) == repr(light)
