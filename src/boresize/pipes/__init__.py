"""Pipe sizes (ASME B36.10M and B36.19M catalogue) and pipe classes.

Every length handed out is in metres. See :mod:`boresize.pipes.catalogue` for the data and
:mod:`boresize.pipes.classes` for pipe classes and the criteria file's ``[pipe_class.NAME]`` tables.
"""

from __future__ import annotations

from boresize.pipes.catalogue import (
    NPS_LABELS,
    SCHEDULES,
    Catalogue,
    PipeSize,
    load_catalogue,
    normalise_nps,
    normalise_schedule,
    nps_value,
    read_catalogue_file,
    read_catalogue_text,
)
from boresize.pipes.catalogue_class import pipe_class_from_table
from boresize.pipes.classes import DEFAULT_PIPE_CLASS, PipeClass

__all__ = [
    "DEFAULT_PIPE_CLASS",
    "NPS_LABELS",
    "SCHEDULES",
    "Catalogue",
    "PipeClass",
    "PipeSize",
    "load_catalogue",
    "normalise_nps",
    "normalise_schedule",
    "nps_value",
    "pipe_class_from_table",
    "read_catalogue_file",
    "read_catalogue_text",
]
