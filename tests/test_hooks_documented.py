"""Meta-test: every hook in boresize.hookspecs is documented in DEVELOPERS.md and exercised here.

For each hook, DEVELOPERS.md must hold a section whose heading names the hook with its parameters and that
gives the signature, the arguments, the return contract and a runnable example. The example is executed as
a plugin module and what it registers is used through the engine. A new hook fails these tests until it has
both a section and an entry in EXERCISES.
"""

from __future__ import annotations

import inspect
import re
import textwrap
import types
from collections.abc import Callable
from pathlib import Path

import pytest

from boresize import hookspecs
from boresize.sizing.engine import Sizer
from boresize.io.rows import line_from_row
from boresize.plugins import PluginHost

GUIDE = Path(__file__).resolve().parents[1] / "DEVELOPERS.md"
HOOKS = sorted(name for name, obj in vars(hookspecs).items()
               if callable(obj) and hasattr(obj, f"{hookspecs.PROJECT}_spec"))


def _section(hook: str) -> str:
    """The text of the guide's section for ``hook``: from its ``###`` heading to the next heading."""
    text = GUIDE.read_text(encoding="utf-8")
    match = re.search(rf"^### `{hook}\((?P<params>[^)]*)\)`\n(?P<body>.*?)(?=^##)", text, re.M | re.S)
    assert match, f"DEVELOPERS.md has no section '### `{hook}(...)`'"
    return match.group(0)


def _example_plugin(hook: str) -> types.ModuleType:
    """Run the section's python example as a module named after the hook (what an installed plugin is)."""
    blocks = re.findall(r"```python\n(.*?)```", _section(hook), re.S)
    assert blocks, f"the section of {hook} has no python example"
    module = types.ModuleType(f"guide_{hook}")
    exec(compile(blocks[0], f"DEVELOPERS.md:{hook}", "exec"), module.__dict__)  # noqa: S102 - our own guide
    return module


def _criteria_file(tmp_path: Path, body: str) -> Path:
    path = tmp_path / "criteria.toml"
    path.write_text(textwrap.dedent(body))
    return path


def _exercise_criteria(module: types.ModuleType, tmp_path: Path) -> None:
    # The example's 40 mm minimum bore against ASME B36.10M bores: NPS 1-1/2 Sch 40 is 40.9 mm, NPS 1 is 26.6 mm.
    host = PluginHost.load(load_entry_points=False, extra=[module])
    assert host.criteria.owner("acme-minimum-bore") == module.__name__
    path = _criteria_file(tmp_path, '[service.small]\nphase = "liquid"\nacme-minimum-bore = { min_id = "40 mm" }\n')
    row = {"tag": "X-1", "fluid": "water", "flow": "0.5 t/h", "pressure": "3 barg", "temperature": "20 degC",
           "service": "small", "pipe_class": "all"}
    sizer = Sizer(host, criteria_file=_criteria_file(tmp_path, path.read_text() + textwrap.dedent("""
        [pipe_class.all]
        material = "carbon steel"
        roughness = "0.045 mm"
        schedule = "40"
        sizes = ["1", "1-1/2", "2"]
    """)))
    result = sizer.run(line_from_row(row))
    assert result.selected.candidate.nps == "1-1/2"
    # the plugin's criterion, then line-feasibility, which every service ends with
    assert [(v.criterion, v.status) for v in result.candidates[0].verdicts] == [("acme-minimum-bore", "fail"),
                                                                                 ("line-feasibility", "pass")]


def _exercise_backends(module: types.ModuleType, tmp_path: Path) -> None:
    host = PluginHost.load(load_entry_points=False, extra=[module])
    assert host.backends.owner("plant-water") == module.__name__
    row = {"tag": "PW-1", "fluid": "plant water", "flow": "36 m3/h", "pressure": "3 barg", "temperature": "20 degC"}
    result = Sizer(host).run(line_from_row(row))
    assert result.state.source == "plant-water" and result.state.density == 1000.0
    assert result.selected.hydraulics.mass_flow == pytest.approx(10.0)  # 36 m3/h x 1000 kg/m3 = 10 kg/s


def _exercise_pipe_classes(module: types.ModuleType, tmp_path: Path) -> None:
    # Sch 80 NPS 2 per ASME B36.10M: 60.3 mm OD, 5.54 mm wall, 49.22 mm bore.
    host = PluginHost.load(load_entry_points=False, extra=[module])
    assert host.pipe_classes.owner("ACME-CS-300") == module.__name__
    row = {"tag": "C-1", "fluid": "water", "flow": "5 t/h", "pressure": "3 barg", "temperature": "20 degC",
           "pipe_class": "ACME-CS-300", "nps": "2"}
    candidate = Sizer(host).run(line_from_row(row)).selected.candidate
    assert (candidate.schedule, candidate.pipe_class) == ("80", "ACME-CS-300")
    assert candidate.inside_diameter == pytest.approx(0.04922, abs=1e-5)


EXERCISES: dict[str, Callable[[types.ModuleType, Path], None]] = {
    "boresize_register_criteria": _exercise_criteria,
    "boresize_register_property_backends": _exercise_backends,
    "boresize_register_pipe_classes": _exercise_pipe_classes,
}


def test_the_hookspecs_are_found():
    assert "boresize_register_criteria" in HOOKS and len(HOOKS) >= 3


@pytest.mark.parametrize("hook", HOOKS)
def test_every_hook_is_documented_with_signature_arguments_contract_and_example(hook: str):
    section = _section(hook)
    params = list(inspect.signature(getattr(hookspecs, hook)).parameters)
    assert section.startswith(f"### `{hook}({', '.join(params)})`")
    for part in ("**Signature:**", "**Arguments:**", "**Return contract:**", "**Example:**"):
        assert part in section, f"the section of {hook} lacks {part}"
    signature = inspect.signature(getattr(hookspecs, hook))  # annotations are strings (postponed evaluation)
    typed = ", ".join(f"{name}: {p.annotation}" for name, p in signature.parameters.items())
    assert f"**Signature:** `{hook}({typed}) -> {signature.return_annotation}`" in section
    assert "@hookimpl" in section and f"def {hook}(" in section


@pytest.mark.parametrize("hook", HOOKS)
def test_every_hook_has_a_test_that_exercises_it(hook: str):
    assert hook in EXERCISES, f"{hook} has no exercise in tests/test_hooks_documented.py"


@pytest.mark.parametrize("hook", sorted(EXERCISES))
def test_the_documented_example_works(hook: str, tmp_path: Path):
    assert hook in HOOKS, f"EXERCISES names {hook}, which is not a hook"
    EXERCISES[hook](_example_plugin(hook), tmp_path)
