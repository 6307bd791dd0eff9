"""The criterion protocol: what boresize reads of a criterion, whoever wrote it.

Registration (:mod:`boresize.registry`) checks the required members by hand and names each one that is
missing or wrong; :class:`CriterionProtocol` states the same contract for a type checker and for
``isinstance``. :class:`boresize.criteria.base.Criterion` is a base class that follows it.
"""

from __future__ import annotations

from collections.abc import Set as AbstractSet
from typing import TYPE_CHECKING, Protocol, get_args, runtime_checkable

from boresize.model import Phase

if TYPE_CHECKING:
    from boresize.criteria.base import CriterionContext, OptionSpec
    from boresize.model import Verdict

__all__ = ["CriterionProtocol", "KNOWN_PHASES"]

#: The phases a criterion may name in ``phases``: those a property backend reports (the engine matches a
#: supercritical state to "gas" too, see :func:`boresize.sizing.service_phase.phase_group`).
KNOWN_PHASES: frozenset[str] = frozenset(get_args(Phase))


@runtime_checkable
class CriterionProtocol(Protocol):
    """An object that judges one candidate size of a line and returns a Verdict.

    Required (checked when a plugin registers the criterion):

    - ``id``: kebab-case, unique across all plugins (``acme-rack-min-nps``); the key a criteria file uses
    - ``title``: one line for listings (not empty)
    - ``source``: the standard, handbook, "common practice" or "company" behind the rule (not empty)
    - ``phases``: a non-empty set of :data:`KNOWN_PHASES` the criterion judges
    - ``options``: a tuple of :class:`~boresize.criteria.base.OptionSpec` (may be empty)
    - ``evaluate(context) -> Verdict``

    Optional (read with ``getattr`` when present; see DEVELOPERS.md, "The criterion object"):

    - ``check_options(values, where)``: validate the parsed options, raise ``CriteriaFileError``
    - the traits the sizing core reads, declared with their defaults on :class:`~boresize.criteria.base.Criterion`
      and checked at registration when present: ``size_trend`` (``"larger-passes"``, ``"falls-with-size"`` or
      None), ``proposes_first_guess`` (a bool), ``diameter_at_limit(...)`` (callable)
    """

    @property
    def id(self) -> str: ...

    @property
    def title(self) -> str: ...

    @property
    def source(self) -> str: ...

    @property
    def phases(self) -> AbstractSet[str]: ...

    @property
    def options(self) -> tuple[OptionSpec, ...]: ...

    def evaluate(self, context: CriterionContext) -> Verdict: ...
