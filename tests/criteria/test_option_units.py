"""Criteria-file options: a dimensional option needs its unit, flags are true/false, and the listing shows an
option as a file writes it. All read from the OptionSpec declarations, never from a criterion id."""

from __future__ import annotations

import pytest

from boresize.criteria.base import Criterion, OptionSpec, option_text, parse_options
from boresize.errors import CriteriaFileError


class Limits(Criterion):
    id = "acme-limits"
    title = "test limits"
    source = "test"
    options = (
        OptionSpec("max", "velocity", None, "ft/s", "highest velocity"),
        OptionSpec("head", "length", 2, "m", "a default written bare, in its declared unit"),
        OptionSpec("drop", "pressure_difference", None, None, "no documented unit: the kind's first"),
        OptionSpec("share", "dimensionless", 0.5, None, "a fraction"),
        OptionSpec("strict", "dimensionless", 0, None, "a flag", flag=True),
    )


@pytest.mark.parametrize(("given", "message"), [
    ({"max": 10}, 'service.s.acme-limits.max: max = 10 has no unit; expected a velocity with its unit, '
                  'e.g. max = "10 ft/s"'),
    ({"max": "10"}, 'service.s.acme-limits.max: max = 10 has no unit; expected a velocity with its unit, '
                    'e.g. max = "10 ft/s"'),
    ({"drop": 0.5}, 'service.s.acme-limits.drop: drop = 0.5 has no unit; expected a pressure difference with its '
                    'unit, e.g. drop = "0.5 bar"'),
    ({"strict": 0.5}, "service.s.acme-limits.strict: strict = 0.5 is not true or false; expected strict = true or "
                      "strict = false"),
])
def test_a_bare_dimensional_option_or_a_bad_flag_is_named(given, message):
    with pytest.raises(CriteriaFileError) as caught:
        parse_options(Limits(), given, "service.s.acme-limits")
    assert str(caught.value) == message


def test_units_given_are_read_and_declared_defaults_take_their_unit():
    # 10 ft/s = 3.048 m/s (1 ft = 0.3048 m exactly); the bare default 2 of "head" is 2 m as declared.
    values = parse_options(Limits(), {"max": "10 ft/s", "share": 0.25, "strict": True}, "service.s.acme-limits")
    assert values == {"max": pytest.approx(3.048), "head": 2.0, "share": 0.25, "strict": 1.0}


def test_each_option_is_shown_as_a_file_writes_it():
    specs = {spec.name: spec for spec in Limits.options}
    assert option_text(specs["max"], 3.048) == "max = 10 ft/s"
    assert option_text(specs["drop"], 50_000.0) == "drop = 0.5 bar"  # 1 bar = 1e5 Pa
    assert option_text(specs["share"], 0.25) == "share = 0.25"
    assert option_text(specs["strict"], 1.0) == "strict = true"
    assert option_text(specs["strict"], 0.0) == "strict = false"
