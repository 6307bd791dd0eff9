"""The Wright omega function of a real argument, in plain Python (SI-free, dimensionless).

``wright_omega(x)`` is the w with w + ln w = x. It follows the algorithm of P. W. Lawrence, R. M. Corless and
D. J. Jeffrey, "Algorithm 917: Complex double-precision evaluation of the Wright omega function", ACM Trans.
Math. Softw. 38(3):20 (2012), doi:10.1145/2168773.2168779, on the real line: a first guess on three intervals,
then one or two Fritsch-Shafer-Crowley steps (F. N. Fritsch, R. E. Shafer, W. P. Crowley, "Solution of the
transcendental equation w e^w = x", Comm. ACM 16(2):123-124 (1973)). It is the same algorithm, step for step,
as ``scipy.special.wrightomega`` for a real argument, so it gives the same double to the last bit (the test
compares them over a million arguments); importing ``scipy.special`` for it cost each run about 0.3-0.5 s.
"""

from __future__ import annotations

import math
import sys

__all__ = ["wright_omega"]

# measured: -0.33 s, 1.34 -> 1.01 s, one line: scipy.special no longer imported (CPU of a one-line run after
# `import CoolProp`, least of 5, interleaved with scipy's wrightomega; benchmarks/bench_scale.py --one-line)
_TWO_STEP_TOLERANCE = sys.float_info.epsilon  # a second step when the first leaves an error above this


def wright_omega(x: float) -> float:
    """Wright omega of a real ``x`` [-]: the w > 0 with w + ln(w) = x (0 for -inf, x itself above 1e20)."""
    if math.isnan(x) or x == math.inf or x > 1e20:
        return x
    if x < -50.0:  # exp(x) is w to the last bit (0 when it underflows, as for -inf)
        return math.exp(x)
    if x < -2.0:
        w = math.exp(x)
    elif x < 1.0:
        w = math.exp(2.0 * (x - 1.0) / 3.0)
    else:
        w = math.log(x)
        w = x - w + w / x
    r = x - w - math.log(w)
    w, wp1 = _step(w, r)
    if abs((2.0 * w * w - 8.0 * w - 1.0) * math.pow(abs(r), 4.0)) >= _TWO_STEP_TOLERANCE * 72.0 * math.pow(abs(wp1), 6.0):
        w, _ = _step(w, x - w - math.log(w))
    return w


def _step(w: float, r: float) -> tuple[float, float]:
    """One Fritsch-Shafer-Crowley step from ``w`` with residual ``r``: the new w, and the old w + 1."""
    wp1 = w + 1.0
    e = r / wp1 * (2.0 * wp1 * (wp1 + 2.0 / 3.0 * r) - r) / (2.0 * wp1 * (wp1 + 2.0 / 3.0 * r) - 2.0 * r)
    return w * (1.0 + e), wp1
