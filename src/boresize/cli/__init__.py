"""The ``boresize`` command: a shell over the public API (:mod:`boresize.api`)."""

from boresize.cli.main import build_parser, main

__all__ = ["build_parser", "main"]
