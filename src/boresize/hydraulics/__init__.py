"""Hydraulics kernels: friction factor, Darcy-Weisbach rating, diameter estimate (SI floats)."""

from __future__ import annotations

from boresize.hydraulics.darcy import drop_per_length, flow_area, rate_pipe, reynolds, velocity
from boresize.hydraulics.diameter import exact_diameter, swamee_jain_diameter
from boresize.hydraulics.friction import (
    LAMINAR_LIMIT,
    TURBULENT_LIMIT,
    Regime,
    colebrook,
    darcy_friction_factor,
    laminar,
    regime_text,
    swamee_jain,
)

__all__ = [
    "LAMINAR_LIMIT",
    "TURBULENT_LIMIT",
    "Regime",
    "colebrook",
    "laminar",
    "swamee_jain",
    "darcy_friction_factor",
    "regime_text",
    "flow_area",
    "velocity",
    "reynolds",
    "drop_per_length",
    "rate_pipe",
    "swamee_jain_diameter",
    "exact_diameter",
]
