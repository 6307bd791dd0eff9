"""What the command line's parts share: the options that give one line, and how JSON is printed."""

from __future__ import annotations

import sys

__all__ = ["SINGLE_LINE_FIELDS", "print_json"]

#: (option, help) of each line-list column that ``boresize size`` takes as an option for one line.
SINGLE_LINE_FIELDS = (
    ("tag", "line tag (default: LINE-1)"), ("fluid", "fluid name, CoolProp name or CAS number"),
    ("flow", "flow with its unit: '65 t/h', '120 m3/h', '2 MMSCFD'"),
    ("pressure", "inlet pressure: '10 barg', '1100 kPa' (bare bar, kPa, psi are absolute)"),
    ("temperature", "temperature: '40 degC', '313 K', '100 degF'"), ("length", "straight length: '120 m'"),
    ("service", "criteria set (see 'boresize criteria')"), ("pipe-class", "pipe class (see 'boresize pipes')"),
    ("nps", "check this NPS instead of sizing"), ("density", "given density: '850 kg/m3'"),
    ("viscosity", "given viscosity: '1.2 cP'"), ("design-margin", "margin on flow: '10 %%'"),
    ("phase", "liquid or gas: what the line must carry"), ("backend", "property backend id"),
    ("schedule", "schedule of the NPS to check (default: the pipe class's)"),
    ("quality", "vapour mass fraction of a saturated pure fluid: 1 saturated vapour, 0 saturated liquid "
                "(temperature then blank or 'saturated')"),
    ("vapour-pressure", "vapour pressure for a liquid whose backend gives none (given density and viscosity, "
                        "brines): '0.05 bar'"),
)


def print_json(payload: object) -> None:
    """``payload`` as indented strict JSON on stdout (UTF-8 kept as it is; see :func:`boresize.api.output.strict_json`)."""
    from boresize.api.output import strict_json

    sys.stdout.write(strict_json(payload) + "\n")
