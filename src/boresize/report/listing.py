"""Listings for ``boresize criteria`` and ``boresize pipes``."""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

from boresize.criteria.base import documented_unit, option_text
from boresize.sizing.services import SizingConfig
from boresize.plugins import PluginHost

__all__ = ["render_criteria", "render_pipe_classes", "render_nps"]


def _fmt(value: float) -> str:
    return f"{value:.4g}"


def _options(criterion: Any, options: Mapping[str, float]) -> str:
    """The options as a criteria file writes them: ``max = 40 kPa/100 m, warn_only = false``."""
    specs = {spec.name: spec for spec in criterion.options}
    return ", ".join(option_text(specs[name], value) if name in specs else f"{name} = {_fmt(value)}"
                     for name, value in options.items())


def render_criteria(host: PluginHost, config: SizingConfig) -> str:
    out = ["Installed criteria:"]
    for c in host.criteria:
        out.append(f"  {c.id:<18} {c.title}  [plugin {host.criteria.owner(c.id)}]")
        for spec in c.options:
            documented = ("true/false" if spec.flag else "names: " + ", ".join(getattr(spec, "choices", ()))
                          if getattr(spec, "choices", ()) else documented_unit(spec))
            unit = f" [{documented}]" if documented else ""
            out.append(f"      {spec.name}{unit}: {spec.help}")
    out.append("")
    out.append(f"Criteria sets by service (set {config.version}; from {config.origin}):")
    for name in config.service_names():
        service = config.services[name]
        phase = f" ({', '.join(service.accepts)})" if service.accepts else ""
        out.append(f"  {name}{phase}: {service.description}  [set {service.set_name} {service.version}]")
        for criterion, options in service.criteria:
            shown = _options(criterion, options) or "defaults"
            out.append(f"      {criterion.id}: {shown}" if not hasattr(criterion, "bands") else f"      {criterion.id}:")
            for band in getattr(criterion, "bands", ()):  # limits banded by NPS and pressure
                out.append(f"        {band.label}: {_options(criterion, band.options)}")
    out.append("")
    out.append("A line without a service gets 'liquid' or 'gas' by its phase.")
    return "\n".join(out) + "\n"


def render_pipe_classes(config: SizingConfig) -> str:
    out = ["Pipe classes:"]
    for name in sorted(config.pipe_classes):
        pc = config.pipe_classes[name]
        catalogue = getattr(pc, "catalogue", "")
        if catalogue:  # a class over a user's CSV or a fluids.piping table: sizes as that catalogue names them
            schedule = f", schedule {pc.schedule}" if pc.schedule else ""
            out.append(f"  {name}: {pc.material}{schedule}, catalogue {catalogue}")
            out.append(f"      sizes: {', '.join(pc.sizes)}")
            continue
        out.append(f"  {name}: {pc.material}, schedule {pc.schedule}, roughness {pc.roughness * 1e3:g} mm")
        overrides = ", ".join(f"{nps}: {sch}" for nps, sch in pc.schedule_by_nps)
        if overrides:
            out.append(f"      schedule overrides: {overrides}")
        out.append(f"      sizes: {', '.join(pc.sizes)}" + (f" (minimum {pc.min_nps})" if pc.min_nps else ""))
    out.append("")
    out.append("Use 'boresize pipes --nps 4' for the schedules of one size (ASME B36.10M / B36.19M).")
    out.append("")
    out.append("Built-in catalogues for a class's 'catalogue' key (or a CSV file, see README):")
    from boresize.pipes.fluids_tables import BUILTIN_CATALOGUES

    for entry in BUILTIN_CATALOGUES.values():
        out.append(f"  {entry.name:<14} {entry.standard}, via fluids.piping; {entry.material}, roughness "
                   f"{entry.roughness_note}")
    return "\n".join(out) + "\n"


def render_nps(nps: str) -> str:
    from boresize.pipes import load_catalogue, normalise_nps

    catalogue = load_catalogue()
    label = normalise_nps(nps)
    out = [f"NPS {label}:", f"  {'schedule':<9} {'OD mm':>8} {'wall mm':>8} {'ID mm':>8}  standard"]
    for schedule in catalogue.schedules(label):
        size = catalogue.get(label, schedule)
        out.append(f"  {schedule:<9} {size.outside_diameter * 1e3:8.1f} {size.wall * 1e3:8.2f} "
                   f"{size.inside_diameter * 1e3:8.2f}  {size.standard}")
    return "\n".join(out) + "\n"
