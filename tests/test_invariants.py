"""Physics invariants over wide random inputs (hypothesis), for the hydraulics, every criterion and the engine.

These properties hold for any line, so a violation is a silently wrong size whatever the input:

- Darcy-Weisbach with the Colebrook friction factor (Colebrook 1939; Moody, Trans. ASME 66, 1944): at a
  given mass flow, a larger bore gives a lower velocity (continuity) and a lower drop per length; a
  rougher pipe never gives a lower friction factor, so never a lower drop; more flow never a lower drop.
- Sizing picks the smallest passing size, so more flow never selects a smaller size, a looser limit never
  selects a larger one, and checking the selected size passes.
- The answer does not depend on the units the input was written in (t/h or kg/s or lb/h, barg or kPa
  absolute or psia, degC or K or degF; conversion factors exact by definition, NIST SP 811 App. B)
  beyond the last bits of a float.

Every criterion the host registers is exercised alone and within the shipped services; a criterion
that no shipped service uses needs example options in ``EXAMPLE_OPTIONS``, and every option needs its
direction of "looser" in ``LOOSER`` (or a place in ``NOT_A_LIMIT``), or a meta-test fails.
Quick runs are derandomized (stable CI); the ``slow`` sweeps draw fresh examples every run.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import Any

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from boresize.sizing.services import Service, SizingConfig
from boresize.criteria.bands import BandedCriterion
from boresize.criteria.base import parse_options
from boresize.sizing.engine import Sizer
from boresize.hydraulics.darcy import rate_pipe
from boresize.io.rows import line_from_row
from boresize.model import Flow, Hydraulics, Line, LineResult, Verdict
from boresize.pipes import pipe_class_from_table

QUICK = settings(max_examples=40, deadline=None, derandomize=True, suppress_health_check=list(HealthCheck))
SWEEP = settings(max_examples=400, deadline=None, suppress_health_check=list(HealthCheck))
BUDGETS = [pytest.param(QUICK, id="quick"), pytest.param(SWEEP, id="sweep", marks=pytest.mark.slow)]
REL = 1e-9  # "beyond rounding": a few units in the last place, through a chain of conversions

#: Options of criteria that no shipped service uses (values: common practice, for the test only).
EXAMPLE_OPTIONS: dict[str, dict[str, Any]] = {"outlet-pressure": {"max_drop": "100 kPa"}, "property-crosscheck": {}}
#: (criterion, option) -> +1 when a larger value is looser, -1 when a smaller value is looser.
LOOSER: dict[tuple[str, str], int] = {
    ("velocity", "max"): +1, ("velocity", "min"): -1, ("drop-per-length", "max"): +1, ("drop-per-length", "min"): -1,
    ("erosional", "c_us"): +1, ("erosional", "c_si"): +1, ("momentum", "max"): +1, ("mach", "max"): +1,
    ("noise-velocity", "a"): +1, ("noise-velocity", "cap"): +1, ("gravity-drain", "max_froude"): +1,
    ("npsh-margin", "ratio"): -1, ("npsh-margin", "min_margin"): -1, ("flashing", "margin"): -1,
    ("outlet-pressure", "min"): -1, ("outlet-pressure", "max_drop"): +1,
    ("property-crosscheck", "warn"): +1, ("property-crosscheck", "fail"): +1,
}
#: Options that are not a limit (a flag, a display band, or an exponent whose sense depends on the density).
NOT_A_LIMIT = {("flashing", "warn_only"), ("npsh-margin", "at_bubble_point"), ("gravity-drain", "clearing_froude"),
               ("noise-velocity", "b"), ("flow-regime", "fail")}  # a list of regime names, not a limit


# ---------------------------------------------------------------------------------------------
# Darcy-Weisbach kernel

def _log_uniform(low: float, high: float) -> st.SearchStrategy[float]:
    """Floats spread evenly in logarithm between ``low`` and ``high`` (both > 0)."""
    return st.floats(math.log(low), math.log(high)).map(math.exp)


PIPE = st.fixed_dictionaries({
    "mass_flow": _log_uniform(1e-4, 1e4), "density": _log_uniform(0.05, 2000.0), "viscosity": _log_uniform(5e-6, 5.0),
    "diameter": _log_uniform(0.004, 1.5), "roughness": _log_uniform(1e-7, 3e-3),
})
#: What grows by a factor k >= 1 -> (the change, sense of velocity, sense of drop per length): -1 never rises, +1
#: never falls, 0 not judged. Roughness stays below 0.5 D so that only the named input changes.
KERNEL = {
    "a larger bore": (lambda p, k: {"diameter": p["diameter"] * k}, -1, -1),
    "a rougher pipe": (lambda p, k: {"roughness": p["roughness"] * k}, 0, +1),
    "more flow": (lambda p, k: {"mass_flow": p["mass_flow"] * k}, +1, +1),
}


@pytest.mark.parametrize("budget", BUDGETS)
@pytest.mark.parametrize("change", KERNEL)
def test_the_darcy_weisbach_rating_moves_the_right_way(change: str, budget: settings) -> None:
    grow, sense_v, sense_dp = KERNEL[change]

    @settings(budget, max_examples=budget.max_examples * 10)
    @given(pipe=PIPE, factor=st.floats(1.0, 4.0))
    def check(pipe: dict[str, float], factor: float) -> None:
        pipe = {**pipe, "roughness": min(pipe["roughness"], 0.1 * pipe["diameter"])}
        before, after = (rate_pipe(q["mass_flow"], q["density"], q["viscosity"], q["diameter"], q["roughness"], 100.0)
                         for q in (pipe, {**pipe, **grow(pipe, factor)}))
        for sense, a, b in ((sense_v, before.velocity, after.velocity),
                            (sense_dp, before.drop_per_length, after.drop_per_length)):
            assert sense * (b - a) >= -1e-12 * a, (change, pipe, factor, a, b)

    check()


# ---------------------------------------------------------------------------------------------
# Lines for each service: real fluids through the property backends, in the phase the service wants

FITTINGS = st.sampled_from([(), (("elbow-90-lr", 4.0),), (("elbow-90-sr", 6.0), ("gate", 2.0), ("check-swing", 1.0)),
                            (("tee-branch", 1.0), ("globe", 1.0), ("exit", 1.0))])
METHODS = st.sampled_from([None, "darby-3k", "hooper-2k", "crane"])
PIPES = st.fixed_dictionaries({"pipe_class": st.sampled_from([None, "SS-10S"]),
                               "roughness": st.sampled_from([None, 5e-4])})  # 0.5 mm: corroded steel


def _saturation_k(pressure: float) -> float:
    from CoolProp.CoolProp import PropsSI

    return float(PropsSI("T", "P", pressure, "Q", 0, "Water"))


@st.composite
def liquid_lines(draw: st.DrawFn, service: str) -> Line:
    """Water (CoolProp, with vapour pressure) or a line-list liquid, subcooled, with suction data."""
    pressure = draw(_log_uniform(1.5e5, 40e5))
    temperature = draw(st.floats(278.15, min(_saturation_k(pressure) - 5.0, 420.0)))
    table = draw(st.booleans())
    return Line(
        tag="L", fluid="process oil" if table else "water", flow=Flow("mass", 1.0), pressure=pressure,
        temperature=temperature, length=draw(_log_uniform(5.0, 500.0)), service=service,
        density=draw(st.floats(600.0, 1300.0)) if table else None,
        viscosity=draw(_log_uniform(2e-4, 0.3)) if table else None,
        elevation=draw(st.floats(-10.0, 10.0)), fittings=draw(FITTINGS), fittings_method=draw(METHODS),
        design_margin=draw(st.sampled_from([None, 0.1])), **draw(PIPES), source_pressure=pressure * draw(st.floats(0.3, 1.0)), liquid_level=draw(st.floats(0.0, 8.0)),
        npsh_required=draw(st.floats(0.5, 6.0)),
    )


@st.composite
def gas_lines(draw: st.DrawFn, service: str) -> Line:
    """Methane or nitrogen (CoolProp, with speed of sound), or superheated steam for a steam service."""
    low = service == "vapour-low-pressure"
    pressure = draw(_log_uniform(0.1e5, 3.5e5) if low else _log_uniform(1.2e5, 100e5))
    if service == "steam":
        fluid, temperature = "water", _saturation_k(pressure) + draw(st.floats(5.0, 150.0))
    else:
        fluid, temperature = draw(st.sampled_from(["methane", "nitrogen"])), draw(st.floats(253.15, 423.15))
    return Line(tag="G", fluid=fluid, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature,
                length=draw(_log_uniform(5.0, 2000.0)), service=service, fittings=draw(FITTINGS),
                fittings_method=draw(METHODS), elevation=draw(st.floats(-20.0, 20.0)), **draw(PIPES))


@st.composite
def two_phase_lines(draw: st.DrawFn, service: str) -> Line:
    """Steam-water by quality (CoolProp's saturated phases), on a line that may rise or fall."""
    return Line(tag="T", fluid="water", flow=Flow("mass", 1.0), pressure=draw(_log_uniform(1.5e5, 40e5)),
                temperature=373.15, quality=draw(st.floats(0.02, 0.9)), length=draw(_log_uniform(5.0, 500.0)),
                service=service, elevation=draw(st.floats(-10.0, 10.0)), fittings=draw(FITTINGS), **draw(PIPES))


def lines_for(service: Service) -> st.SearchStrategy[Line]:
    if service.phase == "two-phase":
        return two_phase_lines(service.name)
    return liquid_lines(service.name) if service.phase == "liquid" else gas_lines(service.name)


def flow_for(service: Service) -> st.SearchStrategy[float]:
    if service.phase == "two-phase":
        return _log_uniform(0.05, 40.0)
    return _log_uniform(0.05, 400.0) if service.phase == "liquid" else _log_uniform(0.005, 40.0)


def _with_flow(line: Line, mass_flow: float) -> Line:
    return replace(line, flow=Flow("mass", mass_flow))


def _bore(result: LineResult) -> float:
    assert result.selected is not None
    return result.selected.candidate.inside_diameter


# ---------------------------------------------------------------------------------------------
# Services: the shipped ones, and each criterion alone

def _one_criterion_services(sizer: Sizer) -> dict[str, Service]:
    """For every (shipped service, criterion) a service holding that criterion alone, named "SERVICE/ID";
    a criterion no shipped service uses gets a liquid and a gas service with ``EXAMPLE_OPTIONS``."""
    services: dict[str, Service] = {}
    for service in sizer.config.services.values():
        for pair in service.criteria:
            name = f"{service.name}/{pair[0].id}"
            services[name] = replace(service, name=name, criteria=(pair,))
    used = {pair[0].id for s in sizer.config.services.values() for pair in s.criteria}
    for criterion in sizer.host.criteria:
        if criterion.id in used or criterion.id not in EXAMPLE_OPTIONS:
            continue
        options = parse_options(criterion, EXAMPLE_OPTIONS[criterion.id], f"test.{criterion.id}")
        for phase in sorted(criterion.phases & {"liquid", "gas"}):
            name = f"example-{phase}/{criterion.id}"
            services[name] = Service(name=name, criteria=((criterion, options),), phase=phase)
    return services


@pytest.fixture(scope="module")
def lab(host) -> Sizer:  # noqa: ANN001
    """A sizer whose configuration holds the shipped services and every one-criterion service."""
    base = Sizer(host)
    stainless = pipe_class_from_table("SS-10S", {  # a thin-wall class with every size (ASME B36.19M)
        "material": "stainless steel", "roughness": "0.015 mm", "schedule": "10S", "min_nps": "1/2",
        "sizes": ["1/2", "3/4", "1", "1-1/4", "1-1/2", "2", "2-1/2", "3", "4", "6", "8", "10", "12"]})
    config = SizingConfig(services={**base.config.services, **_one_criterion_services(base)},
                          pipe_classes={**base.config.pipe_classes, "SS-10S": stainless}, version="invariants")
    return Sizer(host, config=config)


def _service_names() -> tuple[list[str], list[str]]:
    """(shipped services, one-criterion services), read at collection time with the built-in plugins."""
    from boresize.sizing.services import load_config
    from boresize.plugins import PluginHost

    host = PluginHost.load(load_entry_points=False)
    base = Sizer(host, config=load_config(host))
    return sorted(base.config.services), sorted(_one_criterion_services(base))


SHIPPED, ALONE = _service_names()
# Quick: each shipped service, and every criterion alone drawn at random; sweep: any of them, many more examples.
SERVICE_RUNS = (
    [pytest.param((name,), settings(QUICK, max_examples=12), id=f"{name}-quick") for name in SHIPPED]
    + [pytest.param(tuple(ALONE), settings(QUICK, max_examples=60), id="each-criterion-alone-quick")]
    + [pytest.param(tuple(SHIPPED + ALONE), settings(SWEEP, max_examples=2000), id="sweep", marks=pytest.mark.slow)]
)
# The size-monotonic invariants (more flow, a looser limit) leave out the services that judge the flow regime: the
# Taitel-Dukler regime moves both ways with the flow and the bore (slug at one size, annular at the next), so a
# service failing slug flow may rightly select a smaller size for more flow. The other invariants hold for them.
_REGIME = ("two-phase", "two-phase-intermittent", "/flow-regime")
MONOTONE_RUNS = (
    [pytest.param((name,), settings(QUICK, max_examples=12), id=f"{name}-quick") for name in SHIPPED
     if not name.endswith(_REGIME)]
    + [pytest.param(tuple(n for n in ALONE if not n.endswith(_REGIME)), settings(QUICK, max_examples=60),
                    id="each-criterion-alone-quick")]
    + [pytest.param(tuple(n for n in SHIPPED + ALONE if not n.endswith(_REGIME)), settings(SWEEP, max_examples=2000),
                    id="sweep", marks=pytest.mark.slow)]
)


@st.composite
def service_lines(draw: st.DrawFn, lab: Sizer, names: tuple[str, ...]) -> tuple[Service, Line, float]:
    """A service among ``names``, a line in its phase, and a mass flow [kg/s]."""
    service = lab.config.services[draw(st.sampled_from(names))]
    return service, draw(lines_for(service)), draw(flow_for(service))


def test_every_registered_criterion_is_exercised_and_every_option_has_a_direction(lab: Sizer) -> None:
    exercised = {pair[0].id for s in lab.config.services.values() for pair in s.criteria}
    assert set(lab.host.criteria.ids()) <= exercised, "give the criterion EXAMPLE_OPTIONS or use it in a shipped set"
    for criterion in lab.host.criteria:
        for spec in criterion.options:
            key = (criterion.id, spec.name)
            assert key in LOOSER or key in NOT_A_LIMIT, f"say which way option {key} is looser (LOOSER)"


@pytest.mark.parametrize(("names", "budget"), MONOTONE_RUNS)
def test_more_flow_never_selects_a_smaller_size(lab: Sizer, names: tuple[str, ...], budget: settings) -> None:
    @budget
    @given(case=service_lines(lab, names), factor=st.floats(1.0, 5.0))
    def check(case: tuple[Service, Line, float], factor: float) -> None:
        _, line, flow = case
        small = lab.run(_with_flow(line, flow))
        large = lab.run(_with_flow(line, flow * factor))
        assume(small.status == "pass" and large.status == "pass")
        assert _bore(large) >= _bore(small), (line, flow, factor)

    check()


def _loosened(service: Service, factor: float) -> Service:
    """The service with every limit ``factor`` times looser (bands too); options that are not limits kept."""
    def loosen(criterion_id: str, options: dict[str, float]) -> dict[str, float]:
        out = dict(options)
        for key, value in options.items():
            sense = LOOSER.get((criterion_id, key))
            if sense is not None and value:
                out[key] = value * factor if sense > 0 else value / factor
        return out

    pairs = []
    for criterion, options in service.criteria:
        if isinstance(criterion, BandedCriterion):
            bands = [replace(b, options=loosen(criterion.id, dict(b.options))) for b in criterion.bands]
            criterion = BandedCriterion(criterion.inner, bands, criterion.where)
        pairs.append((criterion, loosen(criterion.id, dict(options))))
    return replace(service, name=service.name + " (looser)", criteria=tuple(pairs))


@pytest.mark.parametrize(("names", "budget"), MONOTONE_RUNS)
def test_a_looser_limit_never_selects_a_larger_size(lab: Sizer, names: tuple[str, ...], budget: settings) -> None:
    @budget
    @given(case=service_lines(lab, names), factor=st.floats(1.0, 3.0))
    def check(case: tuple[Service, Line, float], factor: float) -> None:
        service, line, flow = case
        loose = _loosened(service, factor)
        config = replace(lab.config, services={**lab.config.services, loose.name: loose})
        tight = lab.run(_with_flow(line, flow))
        looser = Sizer(lab.host, config=config).run(replace(_with_flow(line, flow), service=loose.name))
        assume(tight.status == "pass")
        assert looser.status == "pass", (line, flow, factor, looser.error)
        assert _bore(looser) <= _bore(tight), (line, flow, factor)

    check()


@pytest.mark.parametrize(("names", "budget"), SERVICE_RUNS)
def test_checking_the_selected_size_passes(lab: Sizer, names: tuple[str, ...], budget: settings) -> None:
    @budget
    @given(case=service_lines(lab, names))
    def check(case: tuple[Service, Line, float]) -> None:
        _, line, flow = case
        sized = lab.run(_with_flow(line, flow))
        assume(sized.status == "pass")
        chosen = sized.selected.candidate  # type: ignore[union-attr]
        checked = lab.run(replace(_with_flow(line, flow), nps=chosen.nps, schedule=chosen.schedule))
        assert (checked.mode, checked.status) == ("check", "pass"), checked.error
        assert checked.selected.candidate == chosen  # type: ignore[union-attr]
        assert checked.selected.hydraulics == sized.selected.hydraulics  # type: ignore[union-attr]

    check()


# ---------------------------------------------------------------------------------------------
# Units the input was written in

def _texts(mass_flow: float, pressure: float, temperature: float) -> list[dict[str, str]]:
    """The same conditions in three sets of units (exact factors: NIST SP 811, App. B)."""
    pound = 0.45359237  # kg, exact
    psi = pound * 9.80665 / 0.0254**2  # Pa, exact
    return [
        {"flow": f"{mass_flow * 3.6!r} t/h", "pressure": f"{(pressure - 101325.0) / 1e5!r} barg",
         "temperature": f"{temperature - 273.15!r} degC"},
        {"flow": f"{mass_flow!r} kg/s", "pressure": f"{pressure / 1e3!r} kPa", "temperature": f"{temperature!r} K"},
        {"flow": f"{mass_flow * 3600 / pound!r} lb/h", "pressure": f"{pressure / psi!r} psia",
         "temperature": f"{(temperature - 273.15) * 1.8 + 32!r} degF"},
    ]


def _knife_edge(a: LineResult, b: LineResult) -> bool:
    """Two sizes differ only when the smaller one sits on a limit to within rounding (utilisation 1 +- REL)."""
    small = min((a, b), key=_bore)
    nps = small.selected.candidate.nps  # type: ignore[union-attr]
    other = max((a, b), key=_bore)
    there = [c for c in other.candidates if c.candidate.nps == nps]
    return bool(there) and there[0].worst is not None and abs((there[0].worst.utilisation or 0) - 1.0) < 1e-6


@pytest.mark.parametrize("budget", BUDGETS)
def test_results_do_not_depend_on_the_units_of_the_input(sizer: Sizer, budget: settings) -> None:  # noqa: ANN001
    @budget
    @given(fluid=st.sampled_from(["water", "methane", "nitrogen"]), mass_flow=_log_uniform(0.01, 100.0),
           pressure=_log_uniform(1.5e5, 60e5), temperature=st.floats(280.0, 360.0))
    def check(fluid: str, mass_flow: float, pressure: float, temperature: float) -> None:
        results = [sizer.run(line_from_row({"tag": "U", "fluid": fluid, "length": "100 m", **cells}))
                   for cells in _texts(mass_flow, pressure, temperature)]
        first = results[0]
        for other in results[1:]:
            assert other.status == first.status, (first.error, other.error)
            if first.status == "error":
                assert other.error_field == first.error_field
                continue
            assert other.line.pressure == pytest.approx(first.line.pressure, rel=REL)  # type: ignore[union-attr]
            assert other.sizing_flow == pytest.approx(first.sizing_flow, rel=REL)
            if _bore(other) != _bore(first):
                assert _knife_edge(first, other), (fluid, mass_flow, pressure, temperature)
                continue
            a, b = first.selected.hydraulics, other.selected.hydraulics  # type: ignore[union-attr]
            assert b.velocity == pytest.approx(a.velocity, rel=REL)
            assert b.drop_per_length == pytest.approx(a.drop_per_length, rel=REL)
            assert other.state.density == pytest.approx(first.state.density, rel=REL)  # type: ignore[union-attr]

    check()


@pytest.mark.parametrize(("names", "budget"), SERVICE_RUNS)
def test_the_guided_scan_selects_what_rating_every_size_selects(lab: Sizer, names: tuple[str, ...],
                                                               budget: settings) -> None:
    """The definition of the selection (the smallest size that passes, rating every size from the smallest)
    against the guided scan the engine uses by default (boresize.sizing.scan): same status, size and verdicts."""
    every = Sizer(lab.host, config=lab.config, every_size=True)

    @budget
    @given(case=service_lines(lab, names), factor=st.floats(0.2, 5.0))
    def check(case: tuple[Service, Line, float], factor: float) -> None:
        _, line, flow = case
        guided, full = lab.run(_with_flow(line, flow * factor)), every.run(_with_flow(line, flow * factor))
        assert (guided.status, guided.error, guided.controlling) == (full.status, full.error, full.controlling)
        if full.selected is not None:
            assert guided.selected == full.selected, (line, flow * factor)
            assert len(guided.candidates) <= len(full.candidates)

    check()


def test_every_built_in_criterion_declares_which_way_its_fails_point(lab: Sizer) -> None:
    """The guided scan knows only what a criterion declares (``size_trend``): a new built-in without a trend
    would silently fall back to rating every size."""
    from boresize.sizing.scan import declared_trend

    # flow-regime: the regime moves both ways with the bore (stratified, slug, annular), so it declares no trend
    undeclared = [ident for ident in lab.host.criteria.ids()
                  if declared_trend(lab.host.criteria.get(ident)) is None and ident != "flow-regime"]
    assert undeclared == []


@pytest.mark.parametrize(("names", "budget"), SERVICE_RUNS)
def test_no_passing_line_cannot_flow_or_flashes(lab: Sizer, names: tuple[str, ...], budget: settings) -> None:
    """A passing line has an outlet above zero absolute and is not choked (line-feasibility, in every service); a
    passing liquid in a shipped service stays at or above its vapour pressure at the inlet and at the outlet after
    every loss, allowances included (flashing, in every shipped liquid service)."""
    @budget
    @given(case=service_lines(lab, names), factor=st.floats(0.5, 2.0))
    def check(case: tuple[Service, Line, float], factor: float) -> None:
        service, line, flow = case
        sized = lab.run(_with_flow(line, flow * factor))
        assume(sized.status == "pass")
        hyd = sized.selected.hydraulics  # type: ignore[union-attr]
        assert hyd.outlet_pressure is not None and hyd.outlet_pressure > 0.0 and not hyd.choked
        p_vap = sized.state.vapour_pressure if sized.state is not None else None
        if "/" not in service.name and service.phase == "liquid":
            assert p_vap is not None  # a shipped liquid service judges flashing: unknown P_vap is no pass
            if hyd.two_phase is None:  # a letdown line may pass as the two-phase line it becomes past its flash point
                assert min(line.pressure, hyd.outlet_pressure) >= p_vap
        for rated in sized.candidates:  # every size judged, the rejected ones too
            _judged_on_its_own_method(sized, line, rated.hydraulics, rated.verdicts)

    check()


def _judged_on_its_own_method(sized: LineResult, line: Line, hyd: Hydraulics, verdicts: tuple[Verdict, ...]) -> None:
    """No verdict judged on numbers the line's method did not compute: a gas size past the simple method's limit
    is marched (its outlet from the march, never the incompressible formula), a simple-method size reports the
    outlet that method gives, and the velocity-type verdicts of a marched size judge its worst point."""
    from boresize.hydraulics.compressible import SIMPLE_LIMIT
    from boresize.hydraulics.line import is_gas

    assert sized.state is not None
    simple = hyd.method.startswith("incompressible")
    fraction = (hyd.drop + hyd.fittings_drop + hyd.static_drop) / line.pressure
    if simple:
        assert hyd.outlet_pressure == pytest.approx(line.pressure - hyd.total_drop, rel=1e-12)
        has_length = line.length > 0.0 or bool(line.fittings)
        assert not (is_gas(sized.state) and fraction > SIMPLE_LIMIT and has_length), hyd.method
        assert ("within" in hyd.method) == (is_gas(sized.state) and fraction <= SIMPLE_LIMIT), hyd.method
    elif hyd.peak_velocity is not None:  # marched: velocity-type criteria at the worst point met on the march
        for v in verdicts:
            if v.criterion == "velocity" and v.status in ("pass", "fail") and v.unit == "m/s" and v.value is not None \
                    and "above the maximum" in v.reason:
                assert v.value == pytest.approx(hyd.peak_velocity, rel=1e-9), v.reason
