"""The pipe tables the fluids library ships, offered as named catalogues (``catalogue = "pvc-sch40"``).

Each name is one wall series of one standard, read from ``fluids.piping`` (millimetres there, metres here).
The default roughness of each material is common practice, from memory: 0.0015 mm for PVC and HDPE ("drawn
tubing, plastic" on Moody's chart, L. F. Moody, Trans. ASME 66, 1944); 0.15 mm for BS 1387 tube, which is
sold galvanised (galvanised iron 0.15 mm, Moody 1944; fluids.friction lists 0.152 mm).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from boresize.errors import InputError
from boresize.pipes.catalogue import DN_BY_NPS, normalise_nps, nps_value
from boresize.pipes.tables import TableSize

__all__ = ["BUILTIN_CATALOGUES", "BuiltinCatalogue", "builtin_sizes"]

_PLASTIC = 0.0015e-3
_GALVANISED = 0.15e-3
_PLASTIC_NOTE = "0.0015 mm (smooth plastic; common practice, Moody 1944)"
_GALVANISED_NOTE = "0.15 mm (galvanised; common practice, Moody 1944)"


@dataclass(frozen=True)
class BuiltinCatalogue:
    """One named series: its standard, material, default roughness [m] and the fluids.piping lists it reads."""

    name: str
    standard: str
    material: str
    roughness: float
    roughness_note: str
    schedule: str
    nominal: str  # fluids.piping list of the nominal sizes (NPS in inches, or DN)
    od: str
    inside: str
    wall: str


def _pvc(schedule: str, nominal: str) -> BuiltinCatalogue:
    return BuiltinCatalogue(f"pvc-sch{schedule}", "ASTM D1785 (PVC pipe, schedules 40, 80, 120)", "PVC",
                            _PLASTIC, _PLASTIC_NOTE, schedule, nominal, f"S{schedule}o_D1785", f"S{schedule}i_D1785",
                            f"S{schedule}t_D1785")


def _hdpe(sdr: str, key: str) -> BuiltinCatalogue:
    return BuiltinCatalogue(f"hdpe-sdr{sdr}", "ASTM F2619 (PE pipe, IPS sizes, by SDR)", "HDPE", _PLASTIC,
                            _PLASTIC_NOTE, f"SDR {sdr}", f"NPSDR{key}_F2619", f"SDR{key}o_F2619SI",
                            f"SDR{key}i_F2619SI", f"SDR{key}t_F2619SI")


def _bs1387(series: str) -> BuiltinCatalogue:
    upper = series.upper()
    return BuiltinCatalogue(f"bs1387-{series}", "BS 1387:1985 (steel tubes for screwing, light/medium/heavy)",
                            "galvanised steel", _GALVANISED, _GALVANISED_NOTE, series, f"DN_{upper}_BS1387",
                            f"{upper}o_BS1387", f"{upper}i_BS1387", f"{upper}t_BS1387")


#: Every built-in catalogue by name, in the order ``boresize pipes`` lists them.
BUILTIN_CATALOGUES: dict[str, BuiltinCatalogue] = {c.name: c for c in (
    _pvc("40", "NPS_D1785"), _pvc("80", "NPS_D1785"), _pvc("120", "NPS120_D1785"),
    *(_hdpe(sdr, sdr.replace(".", "")) for sdr in ("7", "9", "11", "13.5", "17", "21", "26", "32.5")),
    _bs1387("light"), _bs1387("medium"), _bs1387("heavy"),
)}
_NPS_BY_DN = {dn: label for label, dn in DN_BY_NPS.items()}


@functools.cache
def builtin_sizes(name: str) -> tuple[TableSize, ...]:
    """The sizes of built-in catalogue ``name`` (a key of :data:`BUILTIN_CATALOGUES`), smallest bore first."""
    import fluids.piping as piping  # fluids is already a dependency; loaded only when a class names a table

    entry = BUILTIN_CATALOGUES[name]
    lists = [getattr(piping, attribute) for attribute in (entry.nominal, entry.od, entry.inside, entry.wall)]
    sizes = []
    for nominal, od, inside, wall in zip(*lists, strict=True):
        label, value = _label(float(nominal), entry.nominal.startswith("DN"))
        sizes.append(TableSize(name=label, schedule=entry.schedule, outside_diameter=od * 1e-3, wall=wall * 1e-3,
                               inside_diameter=inside * 1e-3, roughness=entry.roughness, nps_value=value,
                               source=f"{entry.standard}, via fluids.piping"))
    return tuple(sorted(sizes, key=lambda s: s.inside_diameter))


def _label(nominal: float, is_dn: bool) -> tuple[str, float]:
    """The size as the standard names it ("DN 15" for BS 1387, the NPS otherwise) and its NPS value."""
    if is_dn:
        dn = round(nominal)
        return f"DN {dn}", nps_value(_NPS_BY_DN[dn])
    try:
        return normalise_nps(nominal), nominal
    except InputError:  # HDPE runs past NPS 48 (54, 63, 65): named as fluids.piping lists them
        return f"{nominal:g}", nominal
