"""Registration checks the whole contract and names each part that is missing or wrong, with the plugin."""

from __future__ import annotations

from types import SimpleNamespace
from typing import Any

import pytest

from boresize.plugin import (
    BackendRegistry,
    Criterion,
    CriterionContext,
    CriterionRegistry,
    FluidState,
    OptionSpec,
    PipeClassRegistry,
    PluginError,
    Verdict,
    hookimpl,
    pipe_class_from_table,
    verdict,
)
from boresize.plugins import PluginHost

GUIDE = '(see DEVELOPERS.md, "The criterion object")'
KNOWN = "dense, gas, liquid, supercritical, two-phase"


class _Good(Criterion):
    id = "acme-good"
    title = "ACME: a rule that passes"
    source = "company"
    options = (OptionSpec("max", "velocity", "3 m/s", "m/s", "highest velocity"),)

    def evaluate(self, context: CriterionContext) -> Verdict:
        return verdict(self, "pass", "fine")


def _criterion(**changes: Any) -> SimpleNamespace:
    """A plain object with the criterion attributes of _Good, changed (a value of ... removes the attribute)."""
    good = _Good()
    parts = {"id": good.id, "title": good.title, "source": good.source, "phases": good.phases,
             "options": good.options, "evaluate": good.evaluate}
    parts.update(changes)
    return SimpleNamespace(**{k: v for k, v in parts.items() if v is not ...})


def _refusal(item: object, registry: Any = None) -> str:
    registry = CriterionRegistry() if registry is None else registry  # an empty registry is falsy
    with pytest.raises(PluginError) as info:
        registry.bound_to("acme-rules").add(item)
    return str(info.value)


def test_a_complete_criterion_is_accepted_as_a_plain_object_or_through_the_base_class():
    registry = CriterionRegistry().bound_to("acme-rules")
    registry.add(_Good())
    registry.add(_criterion(id="acme-plain"))
    assert registry.ids() == ("acme-good", "acme-plain") and registry.owner("acme-plain") == "acme-rules"


def test_a_criterion_of_the_base_class_without_source_is_refused():
    class NoSource(Criterion):  # before, accepted; every evaluation then raised
        id = "acme-no-source"
        title = "forgets its source"

    assert _refusal(NoSource()) == f"criterion 'acme-no-source' of plugin 'acme-rules' is not usable: source is empty {GUIDE}"


@pytest.mark.parametrize(("changes", "fault"), [
    ({"source": ...}, "source is missing"),
    ({"title": ...}, "title is missing"),
    ({"title": "   "}, "title is empty"),
    ({"title": None}, "title None is not text"),
    ({"source": 3}, "source 3 is not text"),
    ({"phases": ...}, "phases is missing"),
    ({"phases": frozenset()}, f"phases is empty; expected a set of one or more of {KNOWN}"),
    ({"phases": "liquid"}, f"phases 'liquid' is not a set of phases ({KNOWN})"),
    ({"phases": {"liquid", "slurry", "solid"}}, f"phases holds 'slurry', 'solid', not one of {KNOWN}"),
    ({"options": ...}, "options is missing"),
    ({"options": []}, "options [] is not a tuple of OptionSpec"),
    ({"options": (OptionSpec("max", "velocity"), {"name": "min"})}, "options[1] {'name': 'min'} is not an OptionSpec"),
    ({"evaluate": ...}, "evaluate is missing"),
    ({"evaluate": "pass"}, "evaluate is not callable"),
    ({"size_trend": "up"}, "size_trend 'up' is not one of 'larger-passes', 'falls-with-size' or None"),
    ({"size_trend": "larger_passes"},
     "size_trend 'larger_passes' is not one of 'larger-passes', 'falls-with-size' or None"),
    ({"proposes_first_guess": 1}, "proposes_first_guess 1 is not True or False"),
    ({"proposes_first_guess": True}, "proposes_first_guess is True but diameter_at_limit is missing"),
    ({"diameter_at_limit": 0.1}, "diameter_at_limit is not callable"),
])
def test_each_missing_or_wrong_part_is_named(changes: dict[str, Any], fault: str):
    assert _refusal(_criterion(**changes)) == f"criterion 'acme-good' of plugin 'acme-rules' is not usable: {fault} {GUIDE}"


def test_declared_traits_with_their_right_values_are_accepted():
    registry = CriterionRegistry().bound_to("acme-rules")
    registry.add(_criterion(id="acme-traits", size_trend="falls-with-size",
                            proposes_first_guess=True, diameter_at_limit=lambda *args: 0.1))
    registry.add(_criterion(id="acme-unknown-trend", size_trend=None))
    assert registry.ids() == ("acme-traits", "acme-unknown-trend")


@pytest.mark.parametrize(("ident", "fault"), [
    ("Acme_Rule", "id 'Acme_Rule' is not kebab-case"),
    ("acme--rule", "id 'acme--rule' is not kebab-case"),
    ("-acme", "id '-acme' is not kebab-case"),
    ("", "id '' is not kebab-case"),
])
def test_an_id_must_be_kebab_case(ident: str, fault: str):
    assert _refusal(_criterion(id=ident)) == (
        f"criterion {ident!r} of plugin 'acme-rules' is not usable: {fault} (lower-case letters and digits joined "
        f"by hyphens: 'acme-rack-min-nps') {GUIDE}")


def test_an_id_that_is_not_text_is_named():
    assert _refusal(_criterion(id=7)) == f"criterion 7 of plugin 'acme-rules' is not usable: id 7 is not text {GUIDE}"


def test_every_fault_of_one_criterion_is_named_at_once():
    assert _refusal(_criterion(source="", phases={"solid"}, evaluate=...)) == (
        f"criterion 'acme-good' of plugin 'acme-rules' is not usable: source is empty; phases holds 'solid', "
        f"not one of {KNOWN}; evaluate is missing {GUIDE}")


def test_an_object_without_id_is_named_by_its_repr():
    assert _refusal("velocity-max-3") == "plugin 'acme-rules' registered a criterion without an id: 'velocity-max-3'"


def test_the_refusal_names_the_plugin_that_registered_it():
    class AcmeRules:
        @hookimpl
        def boresize_register_criteria(self, register: CriterionRegistry) -> None:
            register.add(_criterion(source=""))

    with pytest.raises(PluginError) as info:
        PluginHost.load(load_entry_points=False, extra=[AcmeRules()])
    assert str(info.value) == f"criterion 'acme-good' of plugin 'AcmeRules' is not usable: source is empty {GUIDE}"


class _Backend:
    id = "plant-water"
    title = "plant water"

    def version(self) -> str:
        return "1.0"

    def handles(self, line: object) -> bool:
        return False

    def state(self, line: object, pressure: float, temperature: float) -> FluidState:
        return FluidState(density=1000.0, viscosity=1e-3, phase="liquid", source=self.id, model="constant")


def test_a_property_backend_is_checked_part_by_part():
    registry = BackendRegistry()
    registry.bound_to("acme-water").add(_Backend())
    assert registry.owner("plant-water") == "acme-water"
    broken = SimpleNamespace(id="Plant Water", title="", handles=_Backend().handles, version="1.0")
    assert _refusal(broken, BackendRegistry()) == (
        "property backend 'Plant Water' of plugin 'acme-rules' is not usable: id 'Plant Water' is not kebab-case "
        "(lower-case letters and digits joined by hyphens: 'acme-rack-min-nps'); title is empty; state is missing; "
        'version is not callable (see DEVELOPERS.md, "boresize_register_property_backends(register)")')
    assert _refusal(object(), BackendRegistry()).startswith("plugin 'acme-rules' registered a property backend "
                                                             "without an id: <object object at ")


def test_a_pipe_class_must_be_a_pipe_class():
    registry = PipeClassRegistry()
    registry.bound_to("acme-classes").add(pipe_class_from_table("ACME-CS", {
        "material": "carbon steel", "roughness": "0.045 mm", "schedule": "40", "sizes": ["1", "2"]}))
    assert registry.owner("ACME-CS") == "acme-classes"
    assert _refusal({"name": "ACME-CS"}, PipeClassRegistry()) == (
        "plugin 'acme-rules' registered a dict as a pipe class, not a PipeClass: {'name': 'ACME-CS'}; build one "
        'with pipe_class_from_table (see DEVELOPERS.md, "boresize_register_pipe_classes(register)")')
