"""boresize.testing: a criterion's context, or its verdict, for a line at one NPS in one call.

Sizes are ASME B36.10M: NPS 2 Sch 40 is 60.3 mm OD with a 3.91 mm wall (52.48 mm bore), NPS 1-1/2 Sch 40
48.3 mm OD with a 3.68 mm wall (40.94 mm bore).
"""

from __future__ import annotations

import math
import re
import sys
import types
from pathlib import Path
from typing import Any

import pytest

from boresize import check, make_line
from boresize.plugin import (
    Criterion,
    CriterionContext,
    CriteriaFileError,
    FluidState,
    InputError,
    OptionSpec,
    PluginError,
    Verdict,
    hookimpl,
    verdict,
)
from boresize.plugins import PluginHost
from boresize.sizing.engine import Sizer
from boresize.testing import criterion_context, run_criterion, size_line

WATER = {"tag": "W-1", "fluid": "water", "flow": "18 t/h", "pressure": "4 barg", "temperature": "20 degC",
         "length": "100 m"}


class MinimumBore(Criterion):
    id = "acme-minimum-bore"
    title = "ACME: no line below a minimum inside diameter"
    phases = frozenset({"liquid"})
    source = "company"
    options = (OptionSpec("min_id", "length", "40 mm", "mm", "smallest inside diameter"),)

    def evaluate(self, context: CriterionContext) -> Verdict:
        bore, limit = context.candidate.inside_diameter, context.options["min_id"]
        return verdict(self, "pass" if bore >= limit else "fail", f"bore {bore * 1e3:.2f} mm",
                       value=bore * 1e3, limit=limit * 1e3, unit="mm", utilisation=limit / bore)


def test_the_context_holds_the_engines_own_state_candidate_and_hydraulics():
    context = criterion_context(WATER, "2")
    engine = check(make_line(**WATER), "2")  # the public API's check of the same line at the same size
    assert engine.selected is not None
    assert (context.state, context.candidate, context.hydraulics) == (engine.state, engine.selected.candidate,
                                                                      engine.selected.hydraulics)
    assert (context.candidate.nps, context.candidate.schedule) == ("2", "40")
    assert context.candidate.inside_diameter == pytest.approx(0.05248)
    area = math.pi * 0.05248**2 / 4.0
    assert context.hydraulics.velocity == pytest.approx(5.0 / (context.state.density * area))  # 18 t/h = 5 kg/s
    assert (context.service, context.options, context.line.nps, context.line.tag) == ("liquid", {}, None, "W-1")


def test_a_line_object_and_its_text_give_the_same_context():
    assert criterion_context(make_line(**WATER), 3) == criterion_context(WATER, "3")


def test_options_are_read_by_the_criterions_specs_with_defaults_filled_in():
    context = criterion_context(WATER, "2", criterion=MinimumBore())
    assert context.options == {"min_id": pytest.approx(0.040)}
    context = criterion_context(WATER, "2", criterion=MinimumBore(), options={"min_id": "2 in"})
    assert context.options == {"min_id": pytest.approx(0.0508)}


def test_a_bad_option_is_the_criteria_files_error():
    with pytest.raises(CriteriaFileError) as info:
        criterion_context(WATER, "2", criterion=MinimumBore(), options={"max_id": "2 in"})
    assert str(info.value) == ("service.liquid.acme-minimum-bore: unknown option 'max_id' for criterion "
                               "'acme-minimum-bore'; expected one of min_id")


def test_options_without_a_criterion_are_refused():
    with pytest.raises(InputError) as info:
        criterion_context(WATER, "2", options={"min_id": "40 mm"})
    assert str(info.value) == ("options: options given without the criterion whose option specs read them; "
                               "expected criterion= with the options, or no options")


def test_run_criterion_returns_the_verdict_at_each_size():
    small = run_criterion(MinimumBore(), WATER, "1-1/2", options={"min_id": "45 mm"})
    large = run_criterion(MinimumBore(), WATER, "2", options={"min_id": "45 mm"})
    assert (small.status, small.value, small.limit) == ("fail", pytest.approx(40.94), pytest.approx(45.0))
    assert (large.status, large.reason, large.source) == ("pass", "bore 52.48 mm", "company")


def test_a_builtin_criterion_runs_the_same_way(host):
    fast = run_criterion(host.criteria.get("velocity"), WATER, "1-1/2", options={"max": "2 m/s"})
    assert (fast.status, fast.unit, fast.limit) == ("fail", "m/s", 2.0)
    assert fast.value == pytest.approx(criterion_context(WATER, "1-1/2").hydraulics.velocity)


class _ReturnsText(MinimumBore):
    def evaluate(self, context: CriterionContext) -> Verdict:
        return "pass"  # type: ignore[return-value]


class _ReturnsNaN(MinimumBore):
    def evaluate(self, context: CriterionContext) -> Verdict:
        return verdict(self, "pass", "nan", value=float("nan"))


class _Raises(MinimumBore):
    def evaluate(self, context: CriterionContext) -> Verdict:
        raise ZeroDivisionError("division by zero in a company rule")


class _NoSource(MinimumBore):
    source = ""


def test_a_faulty_criterion_is_named_as_the_engine_would_name_it():
    with pytest.raises(PluginError, match=r"^criterion 'acme-minimum-bore' returned str, not a Verdict$"):
        run_criterion(_ReturnsText(), WATER, "2")
    with pytest.raises(PluginError, match=r"^criterion 'acme-minimum-bore' returned value nan, not a number$"):
        run_criterion(_ReturnsNaN(), WATER, "2")
    with pytest.raises(ZeroDivisionError, match="division by zero in a company rule"):
        run_criterion(_Raises(), WATER, "2")


def test_a_criterion_that_registration_would_refuse_is_refused():
    with pytest.raises(PluginError) as info:
        run_criterion(_NoSource(), WATER, "2")
    assert str(info.value) == ("criterion 'acme-minimum-bore' of plugin 'test_testing' is not usable: source is empty "
                               '(see DEVELOPERS.md, "The criterion object")')


def test_a_criterion_is_not_run_on_a_phase_it_does_not_judge():
    air = {"tag": "A-1", "fluid": "air", "flow": "500 kg/h", "pressure": "6 barg", "temperature": "20 degC"}
    with pytest.raises(InputError) as info:
        run_criterion(MinimumBore(), air, "2")
    assert str(info.value) == ("line A-1: phase: criterion 'acme-minimum-bore' judges liquid; the engine does not "
                               "call it for this gas line; expected a line whose fluid is liquid at its conditions")


def test_a_line_the_engine_cannot_rate_raises_its_error():
    with pytest.raises(InputError) as info:
        criterion_context({**WATER, "fluid": "unobtainium"}, "2")
    assert info.value.field == "fluid" and "unobtainium" in str(info.value)
    with pytest.raises(InputError) as info:
        criterion_context(["not", "a", "line"], "2")  # type: ignore[arg-type]
    assert str(info.value) == "line: a list is not a line; expected a Line, or make_line's keyword arguments as a dict"


class _PlantWater:
    id = "plant-water"
    title = "ACME plant water at 1000 kg/m3 and 1 mPa s"

    def version(self) -> str:
        return "1.0"

    def handles(self, line: object) -> bool:
        return getattr(line, "fluid", "") == "plant water"

    def state(self, line: object, pressure: float, temperature: float) -> FluidState:
        return FluidState(density=1000.0, viscosity=1e-3, phase="liquid", source=self.id, model="constant 1.0")


class _PlantWaterPlugin:
    @hookimpl
    def boresize_register_property_backends(self, register):  # type: ignore[no-untyped-def]
        register.add(_PlantWater())


def test_a_plugins_own_backend_serves_the_line_through_a_sizer():
    sizer = Sizer(PluginHost.load(load_entry_points=False, extra=[_PlantWaterPlugin()]))
    context = criterion_context({**WATER, "fluid": "plant water"}, "2", sizer=sizer)
    assert (context.state.source, context.state.density) == ("plant-water", 1000.0)
    assert context.hydraulics.mass_flow == pytest.approx(5.0)


def test_size_line_sizes_with_the_plugin_registered_and_its_criteria_file(tmp_path):
    module = types.ModuleType("acme_bore")
    module.MinimumBore = MinimumBore  # type: ignore[attr-defined]
    exec("from boresize.plugin import hookimpl\n"  # noqa: S102 - a plugin module as an entry point loads it
         "@hookimpl\ndef boresize_register_criteria(register):\n    register.add(MinimumBore())\n", module.__dict__)
    path = tmp_path / "criteria.toml"
    path.write_text('[service.bore]\nphase = "liquid"\nacme-minimum-bore = { min_id = "45 mm" }\n')
    small = {**WATER, "flow": "0.5 t/h", "service": "bore"}
    sized = size_line(small, plugins=[module], criteria=path)
    assert (sized.status, sized.nps) == ("pass", "2")  # NPS 1-1/2 (40.94 mm bore) fails the 45 mm minimum
    # every service ends with line-feasibility, which no criteria file can drop
    assert [v.criterion for v in sized.selected.verdicts] == ["acme-minimum-bore", "line-feasibility"]
    checked = size_line(small, plugins=[module], criteria=path, nps="1-1/2")
    assert (checked.status, checked.nps, checked.selected.verdicts[0].status) == ("fail", "1-1/2", "fail")
    with pytest.raises(CriteriaFileError) as info:  # without the plugin the file names an unknown criterion
        size_line(small, criteria=path)
    assert str(info.value) == (
        f"service.bore.acme-minimum-bore: unknown criterion 'acme-minimum-bore' (in {path}); expected a criterion id "
        "(erosional, "
        "drop-per-length, velocity, npsh-margin, gravity-drain, flashing, momentum, noise-velocity, mach, "
        "outlet-pressure, property-crosscheck, flow-regime) or one of description, phase, design_margin, pipe_class, version, two_phase_method")


def test_the_guides_example_of_testing_a_plugin_runs(monkeypatch, tmp_path):
    root = Path(__file__).resolve().parents[1]
    guide = (root / "DEVELOPERS.md").read_text(encoding="utf-8")
    section = guide[guide.index("### Testing a plugin"):guide.index("## Hooks")]
    code = re.findall(r"```python\n(.*?)```", section, re.S)[0]
    monkeypatch.syspath_prepend(str(root / "plugins" / "acme-rack-minimum" / "src"))
    namespace: dict[str, Any] = {}
    try:
        exec(compile(code, "DEVELOPERS.md:Testing a plugin", "exec"), namespace)  # noqa: S102 - our own guide
        tests = {name: test for name, test in namespace.items() if name.startswith("test_")}
        assert sorted(tests) == ["test_below_the_rack_minimum_fails", "test_sized_with_the_plugin",
                                 "test_the_context_at_nps_2"]
        for test in tests.values():
            test(*([tmp_path] if test.__code__.co_argcount else []))
    finally:  # test_example_plugin skips when it finds the plugin importable
        sys.modules.pop("acme_rack_minimum", None)
