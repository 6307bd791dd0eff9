"""Faulty plugins for the bad-input corpus: each object is one kind of plugin mistake.

tests/test_corpus.py installs them as entry points of group ``boresize`` (the way a real plugin is
installed) and runs the CLI; tests/corpus/expected.toml holds the exact error each one must give.
Nothing here is a usable plugin.
"""

from __future__ import annotations

from boresize.criteria.base import Criterion, verdict
from boresize.hookspecs import hookimpl
from boresize.model import FluidState, Verdict


class _Raises(Criterion):
    id = "corpus-raises"
    title = "raises inside evaluate"
    source = "corpus"

    def evaluate(self, context):  # type: ignore[no-untyped-def]
        raise ZeroDivisionError("division by zero in a company rule")


class _ReturnsNone(Criterion):
    id = "corpus-returns-none"
    title = "forgets to return its verdict"
    source = "corpus"

    def evaluate(self, context):  # type: ignore[no-untyped-def]
        verdict(self, "pass", "computed but not returned")


class _ReturnsText(Criterion):
    id = "corpus-returns-text"
    title = "returns a string instead of a Verdict"
    source = "corpus"

    def evaluate(self, context):  # type: ignore[no-untyped-def]
        return "pass"


class _UnknownStatus(Criterion):
    id = "corpus-unknown-status"
    title = "returns a Verdict with a status boresize does not know"
    source = "corpus"

    def evaluate(self, context) -> Verdict:  # type: ignore[no-untyped-def]
        return verdict(self, "ok", "fine", value=1.0, limit=2.0, unit="m/s", utilisation=0.5)  # type: ignore[arg-type]


class _NanValue(Criterion):
    id = "corpus-nan-value"
    title = "passes a NaN value (a NaN compares false with every limit)"
    source = "corpus"

    def evaluate(self, context) -> Verdict:  # type: ignore[no-untyped-def]
        nan = float("nan")
        return verdict(self, "pass", "value is NaN", value=nan, limit=3.0, unit="m/s", utilisation=nan)


class _FaultyBackend:
    """Serves the fluids named ``corpus-...``; each name is one way a backend can go wrong."""

    id = "corpus-backend"
    title = "faulty property backend"

    def version(self) -> str:
        return "0"

    def handles(self, line) -> bool:  # type: ignore[no-untyped-def]
        return line.fluid.startswith("corpus-")

    def state(self, line, pressure, temperature):  # type: ignore[no-untyped-def]
        if line.fluid == "corpus-raises":
            raise KeyError("no table row for this temperature")
        if line.fluid == "corpus-dict":
            return {"density": 1000.0, "viscosity": 1e-3}
        if line.fluid == "corpus-nan-density":
            return FluidState(density=float("nan"), viscosity=1e-3, phase="liquid", source=self.id, model="corpus")
        return FluidState(density=1000.0, viscosity=1e-3, phase="slurry", source=self.id,  # type: ignore[arg-type]
                          model="corpus")


@hookimpl
def boresize_register_criteria(register):  # type: ignore[no-untyped-def]
    for criterion in (_Raises(), _ReturnsNone(), _ReturnsText(), _UnknownStatus(), _NanValue()):
        register.add(criterion)


@hookimpl
def boresize_register_property_backends(register):  # type: ignore[no-untyped-def]
    register.add(_FaultyBackend())


class HookRaises:
    """A registration hook that raises."""

    @hookimpl
    def boresize_register_criteria(self, register):  # type: ignore[no-untyped-def]
        raise RuntimeError("company rules file not found")


class RegistersText:
    """Registers a string where a criterion object belongs."""

    @hookimpl
    def boresize_register_criteria(self, register):  # type: ignore[no-untyped-def]
        register.add("velocity-max-3")


class _HalfCriterion:
    id = "corpus-half"
    title = "a criterion without source and evaluate"
    phases = frozenset({"liquid"})
    options = ()


class RegistersHalfCriterion:
    """Registers an object that lacks ``source`` and ``evaluate``."""

    @hookimpl
    def boresize_register_criteria(self, register):  # type: ignore[no-untyped-def]
        register.add(_HalfCriterion())


class _Velocity(Criterion):
    id = "velocity"
    title = "a second criterion with a built-in id"
    source = "corpus"


class DuplicateId:
    """Registers a criterion under an id a built-in already has."""

    @hookimpl
    def boresize_register_criteria(self, register):  # type: ignore[no-untyped-def]
        register.add(_Velocity())


hook_raises = HookRaises()
registers_text = RegistersText()
registers_half_criterion = RegistersHalfCriterion()
duplicate_id = DuplicateId()
