"""The error tree of boresize.

Every fault boresize raises is a ``BoresizeError``. The subclasses are also builtins
(``ValueError``, ``LookupError``, ``RuntimeError``) so that callers who catch those keep working.
Messages name the value given, the field it came from and what was expected; the line tag is
added by the engine when the error is tied to a line.
"""

from __future__ import annotations

from boresize.report.printable import printable as printable  # how a message is shown on a terminal (the CLI's)

__all__ = [
    "BoresizeError",
    "MissingModuleError",
    "OPTIONAL_MODULES",
    "missing_module",
    "InputError",
    "UnitError",
    "CatalogueError",
    "CriteriaFileError",
    "PropertyError",
    "PluginError",
    "UsageError",
]


class BoresizeError(Exception):
    """Root of every error boresize raises on purpose."""


class InputError(BoresizeError, ValueError):
    """A value given by the user is not usable.

    :param message: what is wrong, in plain words
    :param field: the input field (column, option or key) at fault
    :param value: the value as given
    :param expected: what would have been accepted
    :param tag: the line tag, when the error belongs to one line
    """

    def __init__(
        self,
        message: str,
        *,
        field: str | None = None,
        value: object = None,
        expected: str | None = None,
        tag: str | None = None,
    ) -> None:
        self.message = message
        self.field = field
        self.value = value
        self.expected = expected
        self.tag = tag
        super().__init__(self._render())

    def _render(self) -> str:
        parts = []
        if self.tag:
            parts.append(f"{self.tag}: " if self.tag.startswith("row ") else f"line {self.tag}: ")
        if self.field:
            parts.append(f"{self.field}: ")
        parts.append(self.message)
        if self.expected:
            parts.append(f"; expected {self.expected}")
        return "".join(parts)

    def for_line(self, tag: str) -> InputError:
        """Return a copy of this error tied to the line ``tag`` (same class)."""
        clone = type(self).__new__(type(self))
        InputError.__init__(
            clone,
            self.message,
            field=self.field,
            value=self.value,
            expected=self.expected,
            tag=tag,
        )
        return clone


class UnitError(InputError):
    """A quantity whose unit is missing, unknown or of the wrong dimension."""


class CriteriaFileError(InputError):
    """The criteria file names an unknown criterion, option, service or pipe class."""


class CatalogueError(BoresizeError, LookupError):
    """A pipe size, schedule or class that the catalogue does not hold, or bad catalogue data."""


class PropertyError(BoresizeError, RuntimeError):
    """A property backend failed, or returned a value outside a physical range."""


class PluginError(BoresizeError, RuntimeError):
    """A plugin could not be loaded or registered (for example a duplicate id)."""


class UsageError(BoresizeError, ValueError):
    """The command line asks for something that cannot be done (exit code 2)."""


#: import name -> the extra of boresize that installs it (pyproject.toml's [project.optional-dependencies];
#: ``boresize[outputs]`` installs them all)
OPTIONAL_MODULES: dict[str, str] = {"matplotlib": "report", "openpyxl": "xlsx", "jinja2": "report",
                                    "fpdf": "report", "rich": "progress"}


class MissingModuleError(BoresizeError, ImportError):
    """An optional module an output needs is not installed; ``module`` names it."""

    def __init__(self, message: str, module: str) -> None:
        super().__init__(message)
        self.module = module


def missing_module(exc: ImportError, output: str | None) -> MissingModuleError | None:
    """The clear error for ``exc`` when it is one of :data:`OPTIONAL_MODULES` missing, else None."""
    module = (exc.name or "").split(".")[0]
    if module not in OPTIONAL_MODULES:
        return None
    what = output or "this output"
    extra = OPTIONAL_MODULES[module]
    return MissingModuleError(f"the Python module '{module}' is not installed, and {what} needs it: install "
                              f"boresize[{extra}] (pip install \"boresize[{extra}]\", or boresize[outputs] for "
                              f"every output)", module)
