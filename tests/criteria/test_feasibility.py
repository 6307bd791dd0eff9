"""line-feasibility: every service has it, no criteria file drops or weakens it, and it fails a line that cannot
flow (outlet at or below zero absolute, choked, a loss that credits the line)."""

from __future__ import annotations

import textwrap
from dataclasses import replace
from pathlib import Path
from typing import get_args

import pytest

from boresize.criteria.feasibility import FEASIBILITY_ID, LineFeasibility
from boresize.errors import CriteriaFileError
from boresize.model import Phase
from boresize.sizing.services import Service, load_config
from criteria_context import make_context


def test_every_shipped_service_ends_with_line_feasibility(host):
    config = load_config(host)
    assert len(config.services) >= 10
    for service in config.services.values():
        ids = [criterion.id for criterion, _ in service.criteria]
        assert ids[-1] == FEASIBILITY_ID and ids.count(FEASIBILITY_ID) == 1, service.name


def test_a_criteria_file_cannot_drop_it(host, tmp_path: Path):
    path = tmp_path / "criteria.toml"
    path.write_text('[service.bare]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\n')
    ids = [c.id for c, _ in load_config(host, path).services["bare"].criteria]
    assert ids == ["velocity", FEASIBILITY_ID]
    path.write_text('[service.named]\nphase = "liquid"\nline-feasibility = {}\nvelocity = { max = "3 m/s" }\n')
    ids = [c.id for c, _ in load_config(host, path).services["named"].criteria]
    assert ids == ["velocity", FEASIBILITY_ID]  # named once, still last


@pytest.mark.parametrize(("value", "shown"), [('{ warn_only = true }', "warn_only"), ("false", False),
                                              ('{ bands = [{ up_to_nps = "2" }] }', "bands")])
def test_a_criteria_file_cannot_weaken_it(host, tmp_path: Path, value: str, shown: object):
    path = tmp_path / "criteria.toml"
    path.write_text(f'[service.weak]\nphase = "gas"\nline-feasibility = {value}\n')
    with pytest.raises(CriteriaFileError) as caught:
        load_config(host, path)
    assert str(caught.value) == (
        "service.weak.line-feasibility: line-feasibility cannot be removed, weakened or banded: it has no options "
        f"and every service gets it (in {path}); expected line-feasibility = {{}} or nothing (it is always applied)")
    assert caught.value.value == shown


def test_a_service_built_in_code_gets_it_too(host):
    service = Service(name="code", criteria=((host.criteria.get("velocity"), {"max": 3.0}),))
    assert [c.id for c, _ in service.criteria] == ["velocity", FEASIBILITY_ID]


def test_it_judges_every_phase_and_never_says_not_applicable():
    assert LineFeasibility.phases == frozenset(get_args(Phase))
    assert LineFeasibility.options == ()
    # 2 bar abs in, 0.5 bar of friction: outlet 1.5 bar abs.
    context = make_context(drop=0.5e5)
    verdict = LineFeasibility().evaluate(replace(context, hydraulics=replace(context.hydraulics,
                                                                             outlet_pressure=1.5e5)))
    assert verdict.status == "pass" and verdict.utilisation is None
    assert verdict.reason == ("the line can carry the flow: outlet pressure 1.5 bar abs above zero absolute, not "
                              "choked, no negative loss")


def test_outlet_at_zero_absolute_fails():
    # Exactly the inlet pressure (2 bar abs) lost: at zero absolute is not a flow.
    context = make_context(drop=0.5e5, static=1.5e5, line={"elevation": 15.3})
    context = replace(context, hydraulics=replace(context.hydraulics, outlet_pressure=0.0))
    verdict = LineFeasibility().evaluate(context)
    assert verdict.status == "fail" and verdict.utilisation == pytest.approx(1.0)
    assert verdict.reason == ("outlet pressure 0 bar abs at the outlet, 15.3 m above the inlet is at or below zero "
                              "absolute: the line cannot carry the flow at this size (inlet 2 bar abs, total drop 2 "
                              "bar: friction 0.5, static 1.5)")


def test_choked_line_names_where_it_chokes():
    context = make_context(drop=1e5, line={"length": 500.0})
    choked = replace(context.hydraulics, choked=True, choke_length=312.0, outlet_pressure=1e5)
    verdict = LineFeasibility().evaluate(replace(context, hydraulics=choked))
    assert verdict.status == "fail"
    assert verdict.reason == ("choked flow: the flow chokes 312 m from the inlet of the 500 m line: the line cannot "
                              "carry the flow at this size (total drop 1 bar: friction 1)")
    unplaced = LineFeasibility().evaluate(replace(context, hydraulics=replace(choked, choke_length=None)))
    assert unplaced.reason.startswith("choked flow: the line reaches its sonic limit before its end: ")


@pytest.mark.parametrize(("hydraulics", "line", "named"), [
    ({"fixed_drop": -0.3e5}, {"fixed_drop": -0.3e5}, "allowance (fixed_drop) -0.3 bar"),
    ({"drop": -0.2e5}, {"length": -50.0}, "friction drop -0.2 bar (length -50 m)"),
    ({"fittings_drop": -0.1e5, "fittings_k": -2.0}, {}, "fittings drop -0.1 bar (sum of K -2)"),
])
def test_a_loss_that_credits_the_line_fails(hydraulics, line, named):
    context = make_context(drop=0.1e5, line=line)
    context = replace(context, hydraulics=replace(context.hydraulics, **hydraulics))
    verdict = LineFeasibility().evaluate(context)
    assert verdict.status == "fail"
    assert verdict.reason == (f"a loss credits the line: {named}; losses must be 0 or more (a pressure gain is not "
                              f"a loss)")


def test_no_outlet_pressure_from_the_method_is_an_error_not_a_pass():
    context = make_context(drop=0.1e5)
    context = replace(context, hydraulics=replace(context.hydraulics, outlet_pressure=None, method="a method"))
    verdict = LineFeasibility().evaluate(context)
    assert verdict.status == "error"
    assert verdict.reason == ("line feasibility not judged: the line's method gives no outlet pressure at this size "
                              "(a method)")


def test_the_outlet_pressure_criterion_with_a_limit_and_no_outlet_is_an_error(host):
    criterion = host.criteria.get("outlet-pressure")
    context = make_context(drop=0.1e5, options={"max_drop": 1e5})
    context = replace(context, hydraulics=replace(context.hydraulics, outlet_pressure=None, method="a method"))
    verdict = criterion.evaluate(context)
    assert verdict.status == "error"
    assert verdict.reason == "outlet pressure not judged: the line's method gives no outlet pressure at this size " \
                             "(a method)"


def test_the_readme_says_every_service_gets_it():
    readme = (Path(__file__).resolve().parents[2] / "README.md").read_text(encoding="utf-8")
    assert "`line-feasibility`" in readme and "never a pass" in textwrap.dedent(readme)
