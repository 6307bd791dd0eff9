"""The built-in pipe classes, registered through the same hook a third-party plugin uses."""

from __future__ import annotations

from boresize.hookspecs import hookimpl
from boresize.pipes.classes import DEFAULT_PIPE_CLASS
from boresize.registry import PipeClassRegistry


@hookimpl
def boresize_register_pipe_classes(register: PipeClassRegistry) -> None:
    register.add(DEFAULT_PIPE_CLASS)
