"""The records filled through their ``__dict__`` (``boresize.model.filled_through_dict``, a speed trick) behave as the
``@dataclass(frozen=True)`` records they were: the same parameters, defaults and errors, equal, hashed, shown,
pickled and replaced alike, still frozen. The comparison is with the ``__init__`` the dataclass wrote
(``PLAIN_INITS``)."""

from __future__ import annotations

import dataclasses
import pickle
from collections.abc import Callable
from typing import Any

import pytest

from boresize.criteria.base import CriterionContext
from boresize.model import PLAIN_INITS, CandidateResult, FluidState, Hydraulics, Verdict, filled_through_dict


def _plain(cls: type) -> Callable[..., Any]:
    def make(*args: Any, **kwargs: Any) -> Any:
        made = object.__new__(cls)
        PLAIN_INITS[cls](made, *args, **kwargs)
        return made
    return make


def _error(make: Callable[[], object]) -> str | None:
    try:
        make()
    except TypeError as exc:
        return str(exc)
    return None


def test_every_record_of_the_hot_path_is_filled_through_its_dict() -> None:
    assert {Hydraulics, Verdict, CandidateResult, FluidState, CriterionContext} <= set(PLAIN_INITS)


@pytest.mark.parametrize("call", [
    lambda c: c("velocity"),
    lambda c: c("velocity", "pass", ("r",), "s", bogus=1),
    lambda c: c("velocity", "pass", ("r",), "s", 1.0, 2.0, "m/s", 0.5, 9),
    lambda c: c("velocity", "pass", ("r",), "s", criterion="drop"),
    lambda c: c(),
])
def test_a_wrong_call_fails_with_the_dataclass_message(call: Callable[[Any], object]) -> None:
    ours = _error(lambda: call(Verdict))
    assert ours is not None and ours == _error(lambda: call(_plain(Verdict)))


def test_the_record_is_the_dataclass_record() -> None:
    args = ("velocity", "fail", ("velocity 3.1 m/s above the maximum 3 m/s",), "practice", 3.1, 3.0, "m/s")
    ours, plain = Verdict(*args, utilisation=1.03), _plain(Verdict)(*args, utilisation=1.03)
    assert ours == plain and hash(ours) == hash(plain) and repr(ours) == repr(plain)
    assert list(ours.__dict__.items()) == list(plain.__dict__.items())
    assert pickle.loads(pickle.dumps(ours)) == ours
    assert dataclasses.replace(ours, status="pass").status == "pass" and ours.status == "fail"
    with pytest.raises(dataclasses.FrozenInstanceError):
        ours.status = "pass"  # type: ignore[misc]
    defaults = Hydraulics(1.0, 0.001, 2.0, 1e5, 0.02, "turbulent", 100.0, 1e4, 4e3)
    assert defaults == _plain(Hydraulics)(1.0, 0.001, 2.0, 1e5, 0.02, "turbulent", 100.0, 1e4, 4e3)


def test_a_class_it_cannot_fill_alike_is_refused() -> None:
    @dataclasses.dataclass(frozen=True)
    class WithFactory:
        items: list[int] = dataclasses.field(default_factory=list)

    @dataclasses.dataclass(frozen=True)
    class WithPostInit:
        x: float

        def __post_init__(self) -> None:
            pass

    for cls in (WithFactory, WithPostInit):
        with pytest.raises(TypeError):
            filled_through_dict(cls)


def _endings(unit: str, high: float | None, low: float | None) -> tuple[str, str, str]:
    """The three endings of a reason (above the maximum, below the minimum, within) as judge_range wrote them for
    every verdict before lean-records (boresize 0dc92d8, criteria/limits.py _limit_texts, scale 1): the reference
    that the one text now written must equal."""
    above = f" {unit} above the maximum {high:.3g} {unit}" if high is not None else ""
    below = f" {unit} below the minimum {low:.3g} {unit}" if low is not None else ""
    bounds = " and ".join(text for text in (f"at most {high:.3g} {unit}" if high is not None else "",
                                            f"at least {low:.3g} {unit}" if low is not None else "") if text)
    return above, below, f" {unit} is {bounds}"


@pytest.mark.parametrize(("high", "low"), [(high, low) for high in (None, 3.0, 4.5e3) for low in (None, 0.7, 1.2e3)
                                           if high is None or low is None or low < high])
@pytest.mark.parametrize("value", [0.1, 1.0, 3.0, 3.5, 9e3])
def test_judge_range_writes_the_text_the_three_endings_wrote(high: float | None, low: float | None,
                                                            value: float) -> None:
    """``judge_range`` writes only the reason it returns (part of lean-records): the same text as the ending
    written before for that verdict (:func:`_endings`)."""
    from boresize.criteria.limits import judge_range
    from boresize.criteria.velocity import VelocityLimits

    options = {k: v for k, v in (("max", high), ("min", low)) if v is not None}
    got = judge_range(VelocityLimits(), value, options, "velocity", "m/s", 1.0, " at the inlet")
    above, below, within = _endings("m/s", high, low)
    ending = above if high is not None and value > high else below if low is not None and value < low else within
    assert got.reason == f"velocity {value:.3g}{ending} at the inlet"


def test_the_filled_init_keeps_the_typed_signature() -> None:
    """An IDE, inspect.signature and typing.get_type_hints show a plugin author the same typed parameters as the
    dataclass __init__ (found in review: the generated __init__ had lost its annotations)."""
    import inspect
    import typing

    from boresize.model import PLAIN_INITS, Verdict

    assert str(inspect.signature(Verdict)) == str(inspect.signature(PLAIN_INITS[Verdict]).replace(
        parameters=list(inspect.signature(PLAIN_INITS[Verdict]).parameters.values())[1:]))
    hints = typing.get_type_hints(Verdict.__init__)
    assert hints["criterion"] is str and hints["return"] is type(None) and "utilisation" in hints
