"""The plain-Python Wright omega against scipy's (``scipy.special.wrightomega``, the reference library it
replaces on the friction-factor path): the same double to the last bit, and w + ln w = x."""

from __future__ import annotations

import math
import random

import numpy as np
import pytest
from scipy.special import wrightomega

from boresize.hydraulics.wright import wright_omega


def _arguments() -> list[float]:
    rng = random.Random(19)
    # the Colebrook argument runs from about 6 (Re 2000, smooth) to about 1e6 (e/D 0.05, Re 1e8); all branches too
    return ([rng.uniform(-60.0, 30.0) for _ in range(20_000)] + [10.0 ** rng.uniform(0.0, 21.0) for _ in range(40_000)]
            + [rng.uniform(5.0, 20.0) for _ in range(20_000)]
            + [-50.0, -2.0, 1.0, 1e20, 0.0, -0.0, -800.0, 5e-324, math.nextafter(-2.0, 0.0), math.nextafter(1.0, 2.0)])


def test_same_double_as_scipy() -> None:
    xs = _arguments()
    ours = [wright_omega(x) for x in xs]
    theirs = wrightomega(np.array(xs)).tolist()
    assert [x for x, a, b in zip(xs, ours, theirs) if a.hex() != b.hex()] == []


@pytest.mark.parametrize("x", [math.inf, -math.inf, 1e300, -1e300])
def test_ends_as_scipy(x: float) -> None:
    assert wright_omega(x) == float(wrightomega(x))


def test_nan_stays_nan() -> None:
    assert math.isnan(wright_omega(math.nan))


@pytest.mark.parametrize("x", [-10.0, -1.0, 0.0, 0.5, 7.0, 15.0, 1e6])
def test_solves_its_equation(x: float) -> None:
    # the definition: w + ln(w) = x (R. M. Corless, D. J. Jeffrey, "The Wright omega function", 2002)
    w = wright_omega(x)
    assert w + math.log(w) == pytest.approx(x, rel=1e-14, abs=1e-14)
