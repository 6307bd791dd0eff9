"""Loss coefficients of pipe fittings by kind and count (SI floats; K is dimensionless).

Three published methods, chosen per line (``fittings_method``):

- ``darby-3k`` (default): K = K1/Re + Ki (1 + Kd / NPS^0.3), NPS the nominal size [in]. Constants from
  P. Silverberg, R. Darby, "Correlate pressure drops through fittings", Chem. Eng. 106(7) (1999) 101,
  and P. Silverberg, Chem. Eng. 108(4) (2001) 127.
- ``hooper-2k``: K = K1/Re + Kinf (1 + 1 in / D), D the inside diameter [in]. Constants from
  W. B. Hooper, "The 2-K method predicts head losses in pipe fittings", Chem. Eng., Aug. 24 1981, p. 97.
- ``crane``: K = fT L/D, fT the fully turbulent friction factor of clean commercial steel of the
  fitting's nominal size as tabulated by Crane (:func:`crane_ft`) and L/D the equivalent length ratio of
  Crane Co., Technical Paper 410 (TP-410).

A kind the chosen method has no constants for takes the first of Darby, Hooper, Crane that has
them, and the record says so. Entrances, the exit and reducers are geometric losses taken from
Crane TP-410 under every method.

Fittings text (the ``fittings`` column), items separated by ``;`` or ``|``, each ``SPEC[: COUNT]``:

- a kind from :data:`KINDS`, e.g. ``elbow-90-lr-welded: 4; gate: 2; check-swing``. Elbows come welded
  (flanged or butt-welding) or threaded, each with its own published constants: ``elbow-90-sr`` (welded) and
  ``elbow-90-threaded``, ``elbow-90-lr-welded`` and ``elbow-90-lr-threaded``; ``elbow-90-lr`` is the welded
  long-radius elbow (the process-plant fitting from NPS 2 up)
- ``K=2.5``: a loss coefficient given directly, referred to the line's velocity
- ``Leq=12 m``: an equivalent length of pipe (unit required: m, ft ...); friction factor of the line

Every K, equivalent length and count must be above zero: a fitting adds to the drop, never credits it.
- ``L/D=340``: an equivalent length ratio, K = fT L/D (Crane)
- ``Kv=500`` [m3/h] or ``Cv=580`` [US gal/min]: a line-size valve's flow coefficient, K by Crane TP-410
- ``contraction(0.6)`` / ``contraction(0.6, 30)``: the line flows into a smaller bore, beta = smaller
  bore / line bore, optional included cone angle [deg] (default 180, a sudden contraction)
- ``expansion(0.6)`` / ``expansion(0.6, 20)``: the line flows into a larger bore, beta = line bore /
  larger bore
"""

from __future__ import annotations

import math
import numbers
import re
from collections.abc import Iterable
from dataclasses import dataclass

from boresize.errors import InputError
from boresize.hydraulics.crane import (
    CRANE_FT_TABLE,
    CRANE_ROUGHNESS,
    contraction_k,
    crane_ft,
    expansion_k,
    k_from_cv,
    k_from_kv,
)

__all__ = ["METHODS", "DEFAULT_METHOD", "KINDS", "FittingItem", "FittingsLoss", "normalise_method", "crane_ft",
           "darby_k", "hooper_k", "k_from_kv", "k_from_cv", "contraction_k", "expansion_k", "fitting_k",
           "fittings_loss", "syntax_help", "CRANE_FT_TABLE", "CRANE_ROUGHNESS"]

METHODS = ("darby-3k", "hooper-2k", "crane")
DEFAULT_METHOD = "darby-3k"
_METHOD_ALIASES = {"darby": "darby-3k", "3-k": "darby-3k", "3k": "darby-3k", "hooper": "hooper-2k",
                   "2-k": "hooper-2k", "2k": "hooper-2k", "crane-tp410": "crane", "crane-k": "crane"}
_SOURCES = {
    "darby-3k": "Darby 3-K (Silverberg & Darby, Chem. Eng. 1999; Silverberg, Chem. Eng. 2001)",
    "hooper-2k": "Hooper 2-K (Hooper, Chem. Eng. 1981)",
    "crane": "Crane K = fT L/D (Crane TP-410)",
    "crane-geometry": "Crane TP-410",
}


@dataclass(frozen=True)
class _Kind:
    """Published constants of one kind: Darby (K1, Ki, Kd [in]), Hooper (K1, Kinf), Crane L/D or K."""

    title: str
    darby: tuple[float, float, float] | None = None
    hooper: tuple[float, float] | None = None
    crane_ld: float | tuple[float, float, float] | None = None  # one L/D, or by size (<=8, <=14, above)
    crane_k: float | None = None  # geometric loss (entrance, exit): K itself


KINDS: dict[str, _Kind] = {
    # Darby prints no flanged/welded r/D 1.5 elbow (its welded rows are r/D 1, 2, 4, 6): under darby-3k a welded
    # long-radius elbow takes Hooper's "long radius, all types" and the record says so. Crane's 14 fT is its
    # "flanged or butt-welding 90 deg elbow" r/D 1.5; Crane has no threaded long-radius elbow.
    "elbow-90-sr": _Kind("90 deg elbow, standard (r/D 1), flanged or welded", (800, 0.091, 4.0), (800, 0.25), 30),
    "elbow-90-lr-welded": _Kind("90 deg elbow, long radius (r/D 1.5), flanged or welded", None, (800, 0.20), 14),
    "elbow-90-lr-threaded": _Kind("90 deg elbow, long radius (r/D 1.5), threaded", (800, 0.071, 4.2), (800, 0.20)),
    "elbow-90-threaded": _Kind("90 deg elbow, standard (r/D 1), threaded", (800, 0.14, 4.0), (800, 0.40), 30),
    "bend-90-2d": _Kind("90 deg bend, r/D 2", (800, 0.056, 3.9), None, 12),
    "bend-90-4d": _Kind("90 deg bend, r/D 4", (800, 0.066, 3.9), None, 14),
    "bend-90-6d": _Kind("90 deg bend, r/D 6", (800, 0.075, 4.2), None, 17),
    "elbow-90-mitre-1": _Kind("90 deg mitre, 1 weld", (1000, 0.27, 4.0), (1000, 1.15), 60),
    "elbow-90-mitre-2": _Kind("90 deg mitre, 2 welds", (800, 0.068, 4.1), (800, 0.35)),
    "elbow-90-mitre-3": _Kind("90 deg mitre, 3 welds", (800, 0.035, 4.2), (800, 0.30)),
    "elbow-45-sr": _Kind("45 deg elbow, standard (r/D 1)", (500, 0.071, 4.2), (500, 0.20), 16),
    "elbow-45-lr": _Kind("45 deg elbow, long radius (r/D 1.5)", (500, 0.052, 4.0), (500, 0.15)),
    "elbow-45-mitre": _Kind("45 deg mitre, 1 weld", (500, 0.086, 4.0), (500, 0.25), 15),
    "return-bend": _Kind("180 deg return, r/D 1, flanged", (1000, 0.12, 4.0), (1000, 0.35), 50),
    "return-bend-lr": _Kind("180 deg return, r/D 1.5", (1000, 0.10, 4.0), (1000, 0.30)),
    "tee-run": _Kind("tee, flow through run, flanged or welded", (150, 0.05, 4.0), (150, 0.05), 20),
    "tee-branch": _Kind("tee, flow through branch, flanged or welded", (800, 0.28, 4.0), (800, 0.80), 60),
    "tee-run-threaded": _Kind("tee, flow through run, threaded", (200, 0.091, 4.0), (200, 0.10), 20),
    "tee-branch-threaded": _Kind("tee, flow through branch, threaded", (500, 0.274, 4.0), (500, 0.70), 60),
    "tee-branch-stub-in": _Kind("stub-in branch, flow through branch", (1000, 0.34, 4.0), (1000, 1.0)),
    "gate": _Kind("gate valve, full bore", (300, 0.037, 3.9), (300, 0.10), 8),
    "globe": _Kind("globe valve, standard", (1500, 1.7, 3.6), (1500, 4.0), 340),
    "angle-45": _Kind("angle (Y-pattern) valve, 45 deg", (950, 0.25, 4.0), (1000, 2.0), 55),
    "angle-90": _Kind("angle valve, 90 deg", (1000, 0.69, 4.0), (1000, 2.0), 150),
    "ball": _Kind("ball valve, full bore", (300, 0.017, 3.5), (300, 0.10), 3),
    "plug": _Kind("plug valve, straight through", (300, 0.084, 3.9), (300, 0.10), 18),
    "butterfly": _Kind("butterfly valve, centric", None, (800, 0.25), (45, 35, 25)),
    "diaphragm": _Kind("diaphragm valve, weir (dam) type", (1000, 0.69, 4.9), (1000, 2.0), 149),
    "check-swing": _Kind("swing check valve", (1500, 0.46, 4.0), (1500, 1.5), 100),
    "check-lift": _Kind("lift check valve", (2000, 2.85, 3.8), (2000, 10.0), 600),
    "check-tilting": _Kind("tilting-disc check valve (5 deg)", None, (1000, 0.5), (40, 30, 20)),
    "entrance": _Kind("pipe entrance, sharp-edged, flush", crane_k=0.5),
    "entrance-projecting": _Kind("pipe entrance, inward projecting", crane_k=0.78),
    "entrance-rounded": _Kind("pipe entrance, rounded (r/d >= 0.15)", crane_k=0.04),
    "exit": _Kind("pipe exit into a vessel", crane_k=1.0),
}
_ALIASES = {"elbow-90": "elbow-90-sr", "elbow-45": "elbow-45-sr", "elbow-90-lr": "elbow-90-lr-welded",
            "elbow-90-sr-welded": "elbow-90-sr", "elbow-90-sr-threaded": "elbow-90-threaded"}
_EXPLICIT = re.compile(r"^(k|leq|l/d|kv|cv)\s*=\s*(.+)$")
_REDUCER = re.compile(r"^(contraction|expansion)\s*\(\s*([^,()]+?)\s*(?:,\s*([^,()]+?)\s*)?\)$")


@dataclass(frozen=True)
class FittingItem:
    """One item of the fittings text: K each [-], equivalent length each [m], and where K came from."""

    spec: str
    count: float
    k: float
    equivalent_length: float
    source: str


@dataclass(frozen=True)
class FittingsLoss:
    """All fittings of a line: total K [-], total equivalent length [m], and the method text for the record."""

    k_total: float
    equivalent_length: float
    method: str
    items: tuple[FittingItem, ...]

    def drop(self, friction_factor: float, density: float, velocity: float, diameter: float) -> float:
        """Pressure drop [Pa] = (sum K + f Leq/D) rho v^2/2; f [-], rho [kg/m3], v [m/s], D [m]."""
        return (self.k_total + friction_factor * self.equivalent_length / diameter) * 0.5 * density * velocity**2


def syntax_help() -> str:
    """What the fittings text accepts, for error messages."""
    return (f"items 'KIND[: COUNT]' separated by ';' with KIND one of {', '.join(KINDS)}; or 'K=2.5', "
            f"'Leq=12 m', 'L/D=340', 'Kv=500', 'Cv=580', 'contraction(BETA[, ANGLE])', 'expansion(BETA[, ANGLE])'")


def normalise_method(method: str | None) -> str:
    """The method id for ``method`` (None gives :data:`DEFAULT_METHOD`); InputError naming the choices."""
    if method is None:
        return DEFAULT_METHOD
    key = method.strip().lower()
    key = _METHOD_ALIASES.get(key, key)
    if key not in METHODS:
        raise InputError(f"unknown fittings method {method!r}", field="fittings_method", value=method,
                         expected=f"one of {', '.join(METHODS)}")
    return key


def darby_k(k1: float, ki: float, kd: float, reynolds: float, nps: float) -> float:
    """Darby 3-K: K = K1/Re + Ki (1 + Kd / NPS^0.3). :param nps: nominal size [in]; Re [-]; returns K [-]."""
    k: float = k1 / reynolds + ki * (1.0 + kd / nps**0.3)  # float ** float is typed Any (it may be complex)
    return k


def hooper_k(k1: float, kinf: float, reynolds: float, inside_diameter: float) -> float:
    """Hooper 2-K: K = K1/Re + Kinf (1 + 1/D_in). :param inside_diameter: [m]; Re [-]; returns K [-]."""
    return k1 / reynolds + kinf * (1.0 + 0.0254 / inside_diameter)


def _crane_ld(kind: _Kind, nps: float) -> float | None:
    if isinstance(kind.crane_ld, tuple):
        small, middle, large = kind.crane_ld  # Crane gives these by size: 2-8 in, 10-14 in, 16 in and up
        return small if nps <= 8.0 else middle if nps <= 14.0 else large
    return kind.crane_ld


def fitting_k(kind: str, method: str, reynolds: float, inside_diameter: float, nps: float) -> tuple[float, str]:
    """K [-] of one named fitting and the method that gave it.

    :param kind: a key of :data:`KINDS` (or an alias); :param method: one of :data:`METHODS`
    :param reynolds: Reynolds number in the line [-]; :param inside_diameter: [m]
    :param nps: nominal pipe size [in] (Darby's correlation uses the nominal size)
    :raises InputError: for an unknown kind, listing the valid ones
    """
    k1, rest, source = _kind_terms(kind, method, inside_diameter, nps)
    return (k1 / reynolds + rest if k1 else rest), source


def _kind_terms(kind: str, method: str, inside_diameter: float, nps: float) -> tuple[float, float, str]:
    """(K1 [-], rest [-], method) of one named fitting, K = K1/Re + rest; K1 is 0 when K does not depend on Re.

    ``rest`` is the second term of :func:`darby_k` or :func:`hooper_k` (the same arithmetic), or the
    whole K of Crane's L/D and geometric losses. Arguments and errors as :func:`fitting_k`.
    """
    data = KINDS.get(_ALIASES.get(kind, kind))
    if data is None:
        raise InputError(f"unknown fitting {kind!r}", field="fittings", value=kind, expected=syntax_help())
    if data.crane_k is not None:
        return 0.0, data.crane_k, "crane-geometry"
    crane_ld = _crane_ld(data, nps)
    for name in (method, *METHODS):
        if name == "darby-3k" and data.darby is not None:
            k1, ki, kd = data.darby
            return k1, ki * (1.0 + kd / nps**0.3), name
        if name == "hooper-2k" and data.hooper is not None:
            k1, kinf = data.hooper
            return k1, kinf * (1.0 + 0.0254 / inside_diameter), name
        if name == "crane" and crane_ld is not None:
            return 0.0, crane_ft(nps, inside_diameter) * crane_ld, name
    raise AssertionError(f"fitting kind {kind!r} has no constants")  # pragma: no cover - table is complete


_CREDIT = "a fitting adds to the drop and cannot credit the line"
_WHAT = {"k": ("K", "a loss coefficient K above zero, e.g. 'K=2.5'"),
         "l/d": ("L/D", "an equivalent length ratio L/D above zero, e.g. 'L/D=340'"),
         "kv": ("Kv", "a flow coefficient Kv above zero, e.g. 'Kv=500'"),
         "cv": ("Cv", "a flow coefficient Cv above zero, e.g. 'Cv=580'"),
         "beta": ("beta", "a diameter ratio beta above zero, e.g. 'contraction(0.6)'"),
         "angle": ("angle", "an included angle above zero in deg, e.g. 'expansion(0.6, 20)'")}


def _number(text: str, spec: str, key: str) -> float:
    """The number ``text`` of item ``spec``; InputError unless it is finite and above zero."""
    what, expected = _WHAT[key]
    try:
        value = float(text)
    except ValueError:
        raise InputError(f"{what} {text!r} in {spec!r} is not a number", field="fittings", value=spec,
                         expected=syntax_help()) from None
    if not (math.isfinite(value) and value > 0.0):
        raise InputError(f"{what} {text!r} in {spec!r} is not above zero: {_CREDIT}", field="fittings",
                         value=spec, expected=expected)
    return value


def _equivalent_length(raw: str, spec: str) -> float:
    """The length [m] of a ``Leq=`` item; InputError unless it is above zero."""
    from boresize.units import parse_quantity

    length = parse_quantity(raw, "fittings", "length")
    if not length > 0.0:
        raise InputError(f"Leq {raw!r} in {spec!r} is not above zero: {_CREDIT}", field="fittings", value=spec,
                         expected="an equivalent length above zero with its unit, e.g. 'Leq=12 m'")
    return length


def _explicit(key: str, raw: str, spec: str, inside_diameter: float, nps: float) -> tuple[float, float, str]:
    """(K, Leq [m], source) of a K=, Leq=, L/D=, Kv= or Cv= item."""
    if key == "leq":
        return 0.0, _equivalent_length(raw, spec), "given"
    value = _number(raw, spec, key)
    if key == "k":
        return value, 0.0, "given"
    if key == "l/d":
        return crane_ft(nps, inside_diameter) * value, 0.0, "crane"
    if key == "kv":
        return k_from_kv(value, inside_diameter), 0.0, "crane-geometry"
    return k_from_cv(value, inside_diameter), 0.0, "crane-geometry"


def _reducer(match: re.Match[str], spec: str) -> float:
    """K of a contraction or expansion referred to the line's bore (the larger one for a contraction)."""
    beta = _number(match.group(2), spec, "beta")
    angle = _number(match.group(3), spec, "angle") if match.group(3) else 180.0
    if beta >= 1.0 or angle > 180.0:
        raise InputError(f"beta {beta:g} or angle {angle:g} deg out of range in {spec!r}", field="fittings",
                         value=spec, expected="0 < beta < 1 (smaller bore / larger bore) and 0 < angle <= 180 deg")
    if match.group(1) == "contraction":
        return contraction_k(beta, angle) / beta**4  # the line is the larger, upstream bore
    return expansion_k(beta, angle)  # the line is the smaller, upstream bore


_Term = tuple[str, float, float, float, float, str]  # spec, count, K1, rest (K = K1/Re + rest), Leq each [m], source
#: (fittings, method, inside diameter, nps) -> the terms, and the whole loss when no K depends on Re (else None)
# measured: +22 % on fittings (benchmarks/bench_parsing.py fittings-plans)
_PLANS: dict[tuple[object, ...], tuple[tuple[_Term, ...], FittingsLoss | None]] = {}
_PLANS_MAX = 4096


def _term(spec: str, count: float, method: str, inside_diameter: float, nps: float) -> _Term:
    if not (isinstance(count, numbers.Real) and math.isfinite(count) and count > 0.0):
        raise InputError(f"count {count!r} of {spec!r} is not above zero: {_CREDIT}", field="fittings",
                         value=spec, expected="a count above zero, e.g. 'gate: 2'")
    text = spec.strip().lower()
    explicit = _EXPLICIT.match(text)
    if explicit:
        k, leq, source = _explicit(explicit.group(1), explicit.group(2).strip(), spec, inside_diameter, nps)
        return spec, count, 0.0, k, leq, source
    reducer = _REDUCER.match(text)
    if reducer:
        return spec, count, 0.0, _reducer(reducer, spec), 0.0, "crane-geometry"
    k1, rest, source = _kind_terms(text, method, inside_diameter, nps)
    return spec, count, k1, rest, 0.0, source


def _loss(terms: tuple[_Term, ...], chosen: str, reynolds: float) -> FittingsLoss:
    items = tuple(FittingItem(spec, count, k1 / reynolds + rest if k1 else rest, leq, source)
                  for spec, count, k1, rest, leq, source in terms)
    k_total = sum(item.k * item.count for item in items)
    leq = sum(item.equivalent_length * item.count for item in items)
    return FittingsLoss(k_total, leq, _method_text(chosen, items), items)


def _plan(fittings: tuple[tuple[str, float], ...], chosen: str, inside_diameter: float,
          nps: float) -> tuple[tuple[_Term, ...], FittingsLoss | None]:
    terms = tuple(_term(spec, count, chosen, inside_diameter, nps) for spec, count in fittings)
    fixed = None if any(term[2] for term in terms) else _loss(terms, chosen, 1.0)
    return terms, fixed


def fittings_loss(fittings: Iterable[tuple[str, float]], method: str | None, *, reynolds: float,
                  inside_diameter: float, nps: float) -> FittingsLoss:
    """Total K and equivalent length of a line's fittings, with the method text for the record.

    :param fittings: (spec, count) pairs as in :attr:`boresize.model.Line.fittings`
    :param method: one of :data:`METHODS` (aliases accepted), None for :data:`DEFAULT_METHOD`
    :param reynolds: [-]; :param inside_diameter: [m]; :param nps: nominal size [in]
    :raises InputError: unknown kind or method, or a malformed explicit item (field "fittings")

    The parsing, and every K that does not depend on Re, is worked out once per fittings, method and size.
    """
    chosen = normalise_method(method)
    fittings = tuple(fittings)
    key = (fittings, chosen, inside_diameter, nps)
    try:
        plan = _PLANS.get(key)
    except TypeError:  # unhashable items (lists): work it out every time
        return _loss(_plan(fittings, chosen, inside_diameter, nps)[0], chosen, reynolds)
    if plan is None:
        plan = _plan(fittings, chosen, inside_diameter, nps)
        if len(_PLANS) >= _PLANS_MAX:
            _PLANS.clear()
        _PLANS[key] = plan
    terms, fixed = plan
    return fixed if fixed is not None else _loss(terms, chosen, reynolds)


def _method_text(chosen: str, items: tuple[FittingItem, ...]) -> str:
    if not items:
        return "no fittings"
    text = f"fittings by {_SOURCES[chosen]}"
    others = sorted({item.source for item in items} - {chosen})
    for source in others:
        specs = ", ".join(dict.fromkeys(item.spec for item in items if item.source == source))
        text += f"; {specs} as given" if source == "given" else f"; {specs} by {_SOURCES[source]}"
    return text
