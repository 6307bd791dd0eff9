"""Shipped criteria sets (data with a version and a source for every value), bands by NPS and pressure,
and the stamp of the set on results."""

from __future__ import annotations

import re
import textwrap
from importlib import resources
from pathlib import Path

import pytest

import boresize.sizing.services as config_module
from boresize.sizing.services import SHIPPED_SETS, load_config
from boresize.criteria.bands import BandedCriterion, resolve_criterion
from boresize.criteria.velocity import VelocityLimits
from boresize.sizing.engine import Sizer
from boresize.errors import CriteriaFileError
from boresize.hookspecs import hookimpl
from boresize.io.rows import line_from_row
from boresize.plugins import PluginHost
from boresize.report.listing import render_criteria
from boresize.api import size_rows
from criteria_context import make_context

REQUIRED_SERVICES = {
    "liquid": "liquid", "pump-suction": "liquid", "pump-suction-bubble-point": "liquid",
    "pump-discharge": "liquid", "cooling-water": "liquid", "gravity-drain": "liquid",
    "gas": "gas", "gas-by-pressure": "gas", "steam": "gas", "vapour-low-pressure": "gas",
    "two-phase": "two-phase", "two-phase-intermittent": "two-phase",  # issue 16
}
# A value's source must be one of these words (house rule: a standard, a handbook, or a marked rule of thumb).
SOURCE_WORDS = ("API RP 14E", "ANSI/HI 9.6.1", "Simpson", "common practice", "company practice", "from memory",
                "physics")


def test_the_services_the_issue_asks_for_are_shipped(host):
    config = load_config(host)
    for name, phase in REQUIRED_SERVICES.items():
        service = config.services[name]
        assert service.phase == phase and service.origin == "built-in"
        assert service.set_name in ("boresize-liquid", "boresize-gas", "boresize-two-phase") and re.fullmatch(r"\d{4}\.\d+", service.version)
    assert config.version == "boresize-liquid 2026.2, boresize-gas 2026.1, boresize-two-phase 2026.1"


def _set_lines():
    folder = resources.files("boresize.criteria").joinpath("sets")
    for name in SHIPPED_SETS:
        yield from ((name, line) for line in folder.joinpath(name).read_text(encoding="utf-8").splitlines())


def test_every_shipped_value_names_its_source():
    # Each criterion entry carries a comment with its source, on its line or on the comment line above it.
    previous = ""
    checked = 0
    for file_name, line in _set_lines():
        if re.match(r"^[a-z][a-z-]* = \{", line) and not line.startswith(("phase", "description")):
            comment = line.partition("#")[2] if "#" in line else previous
            assert any(word in comment for word in SOURCE_WORDS), f"{file_name}: no source for: {line}"
            checked += 1
        previous = line if line.startswith("#") else previous if line.startswith("    {") else ""
    assert checked >= 25


def test_a_service_shipped_twice_is_named(monkeypatch, host):
    service = {"phase": "liquid", "velocity": {"max": "3 m/s"}}
    twice = [("a.toml", {"name": "a", "version": "1", "service": {"x": service}}),
             ("b.toml", {"name": "b", "version": "1", "service": {"x": service}})]
    monkeypatch.setattr(config_module, "_shipped_documents", lambda: twice)
    with pytest.raises(CriteriaFileError, match="service 'x' is shipped twice, in a.toml and b.toml"):
        load_config(host)


# --- stamps -----------------------------------------------------------------------------------------------------

def test_stamp_names_the_service_the_set_and_its_version(host, tmp_path: Path):
    config = load_config(host)
    assert config.services["pump-suction"].stamp == "pump-suction (boresize-liquid 2026.2)"
    path = tmp_path / "acme.toml"
    path.write_text(textwrap.dedent("""
        name = "ACME-PS-0001"
        version = "rev 3"
        [service.gas]
        phase = "gas"
        velocity = { max = "18 m/s" }
        [service.fuel-gas]
        version = "rev 4"
        phase = "gas"
        velocity = { max = "15 m/s" }
    """))
    config = load_config(host, path)
    assert config.services["gas"].stamp == "gas (ACME-PS-0001 rev 3)"
    assert config.services["fuel-gas"].stamp == "fuel-gas (ACME-PS-0001 rev 4)"
    assert config.services["steam"].stamp == "steam (boresize-gas 2026.1)"
    assert config.version == "boresize-liquid 2026.2, boresize-gas 2026.1, boresize-two-phase 2026.1 + rev 3"


def test_a_file_without_name_or_version_is_stamped_with_its_file_name(host, tmp_path: Path):
    path = tmp_path / "site.toml"
    path.write_text('[service.gas]\nphase = "gas"\nvelocity = { max = "18 m/s" }\n')
    assert load_config(host, path).services["gas"].stamp == "gas (site.toml unversioned)"


def test_version_must_be_text(host, tmp_path: Path):
    path = tmp_path / "bad.toml"
    path.write_text("version = 3\n")
    with pytest.raises(CriteriaFileError, match="version: version must be a non-empty string"):
        load_config(host, path)


def test_every_result_is_stamped_with_its_set_and_version(sizer):
    row = {"tag": "W-1", "fluid": "water", "flow": "20 t/h", "pressure": "5 barg", "temperature": "20 degC",
           "service": "pump-discharge"}
    assert sizer.run(line_from_row(row)).criteria_set == "pump-discharge (boresize-liquid 2026.2)"


# --- bands ------------------------------------------------------------------------------------------------------

SUCTION_BANDS = {"bands": [{"up_to_nps": "2", "max": "0.9 m/s"}, {"up_to_nps": "10", "max": "1.5 m/s"},
                           {"max": "1.8 m/s"}]}


@pytest.mark.parametrize(("nps", "limit"), [("1-1/2", 0.9), ("2", 0.9), ("3", 1.5), ("10", 1.5), ("12", 1.8)])
def test_bands_by_nps_are_inclusive_and_taken_in_order(nps, limit):
    criterion, options = resolve_criterion(VelocityLimits(), SUCTION_BANDS, "service.ps.velocity")
    assert isinstance(criterion, BandedCriterion) and options == {}
    verdict = criterion.evaluate(make_context(velocity=1.0, nps=nps))
    assert verdict.limit == pytest.approx(limit)
    assert verdict.reasons[-1].startswith("(band: ")


def test_bands_by_pressure_and_common_options(tmp_path: Path, host):
    # Options beside `bands` apply to every band; pressures may be gauge (10 barg = 11.01325 bar abs).
    path = tmp_path / "criteria.toml"
    path.write_text(textwrap.dedent("""
        [service.cw]
        phase = "liquid"
        [[service.cw.velocity.bands]]
        up_to_pressure = "10 barg"
        max = "2 m/s"
        [[service.cw.velocity.bands]]
        max = "3 m/s"
        [service.cw.velocity]
        min = "1 m/s"
    """))
    (criterion, _), (feasibility, _) = load_config(host, path).services["cw"].criteria
    assert feasibility.id == "line-feasibility"  # every service gets it, last
    first, second = criterion.bands
    assert first.up_to_pressure == pytest.approx(11.01325e5)
    assert first.options == {"max": 2.0, "min": 1.0} and second.options == {"max": 3.0, "min": 1.0}
    assert criterion.band_for(4.0, 11.0e5) is first and criterion.band_for(4.0, 11.1e5) is second


def test_no_band_covers_gives_an_error_verdict_naming_the_gap():
    criterion, _ = resolve_criterion(VelocityLimits(), {"bands": [{"up_to_nps": "6", "max": "2 m/s"}]},
                                     "service.x.velocity")
    verdict = criterion.evaluate(make_context(nps="8"))
    assert verdict.status == "error"
    assert verdict.reason == ("no band of service.x.velocity covers NPS 8 at 2 bar abs; "
                              "end the bands with one without bounds")


@pytest.mark.parametrize(("table", "message"), [
    ({"bands": "fast"}, r"service\.x\.velocity\.bands: bands must be a list of tables"),
    ({"bands": [{"max": "3 m/s"}, {"up_to_nps": "2", "max": "1 m/s"}]},
     r"band 1 has no bounds, so bands after it can never apply"),
    ({"bands": [{"up_to_nps": "2.7", "max": "1 m/s"}]},
     r"service\.x\.velocity\.bands\[1\]\.up_to_nps: unknown NPS '2\.7'"),
    ({"bands": [{"up_to_pressure": "10 m3/h", "max": "1 m/s"}]},
     r"service\.x\.velocity\.bands\[1\]\.up_to_pressure: .*not a pressure"),
    ({"bands": [{"up_to_nps": "2", "maximum": "1 m/s"}]},
     r"service\.x\.velocity\.bands\[1\]: unknown key 'maximum' in a band of criterion 'velocity'; "
     r"expected one of max, min, up_to_nps, up_to_pressure"),
    ({"bands": [3]}, r"service\.x\.velocity\.bands\[1\]: a band must be a table"),
])
def test_bad_bands_are_named(table, message):
    with pytest.raises(CriteriaFileError, match=message):
        resolve_criterion(VelocityLimits(), table, "service.x.velocity")


def test_banded_sizing_end_to_end(sizer):
    # pump-suction limits NPS 2 and below to 0.9 m/s (common practice). 5 t/h of water: NPS 1-1/2 would run at
    # 1.1 m/s (bore 40.9 mm, ASME B36.10M) and NPS 2 at 0.66 m/s, so the set picks NPS 2.
    row = {"tag": "PS-1", "fluid": "water", "flow": "5 t/h", "pressure": "2 barg", "temperature": "20 degC",
           "service": "pump-suction", "source_pressure": "2 barg", "liquid_level": "3 m", "npsh_required": "2 m"}
    result = sizer.run(line_from_row(row))
    velocity = next(v for v in result.selected.verdicts if v.criterion == "velocity")
    assert result.selected.candidate.nps == "2"
    assert velocity.limit == pytest.approx(0.9) and "(band: NPS up to 2)" in velocity.reason


def test_the_listing_shows_bands_and_set_versions(host):
    text = render_criteria(host, load_config(host))
    assert "pump-suction (liquid): pump suction, subcooled liquid  [set boresize-liquid 2026.2]" in text
    # options as a criteria file writes them, in the unit each is documented in (liquid.toml, gas.toml)
    assert "        NPS up to 2: max = 0.9 m/s" in text
    assert "        inlet pressure up to 80 bar abs: max = 12500 Pa" in text


def test_sizer_accepts_the_shipped_sets_for_every_service(host):
    # Every shipped service resolves against the installed criteria (a typo in a set file fails here).
    assert set(REQUIRED_SERVICES) <= set(Sizer(host).config.services)


def test_the_readme_bands_example_loads(host, tmp_path: Path):
    readme = (Path(__file__).resolve().parents[2] / "README.md").read_text(encoding="utf-8")
    block = next(b for b in re.findall(r"```toml\n(.*?)```", readme, re.S) if "bands" in b)
    path = tmp_path / "readme.toml"
    path.write_text(block)
    service = load_config(host, path).services["hc-liquid"]
    velocity = dict((c.id, c) for c, _ in service.criteria)["velocity"]
    assert [band.options["max"] for band in velocity.bands] == [1.5, 2.5, 3.0]


class _Raises:
    id, title, phases, source, options = "acme-raises", "raises", frozenset({"liquid"}), "company", ()

    def evaluate(self, context):
        raise ZeroDivisionError("company rule divided by zero")


class _RaisingPlugin:
    @hookimpl
    def boresize_register_criteria(self, register):
        register.add(_Raises())


def test_a_raising_plugin_criterion_in_bands_is_named_and_the_batch_goes_on(tmp_path: Path):
    host = PluginHost.load(load_entry_points=False, extra=[_RaisingPlugin()])
    path = tmp_path / "criteria.toml"
    path.write_text('[service.x]\nphase = "liquid"\nacme-raises = { bands = [{ up_to_nps = "4" }, {}] }\n')
    rows = [({"tag": f"L-{n}", "fluid": "water", "flow": "5 t/h", "pressure": "3 barg", "temperature": "20 degC",
              "service": service}, {}) for n, service in ((1, "x"), (2, "liquid"))]
    first, second = size_rows(rows, sizer=Sizer(host, criteria_file=path))
    assert first.status == "error"
    assert "criterion 'acme-raises' of plugin '_RaisingPlugin' raised ZeroDivisionError" in first.error
    assert second.status == "pass"


def test_the_listing_shows_options_as_a_criteria_file_writes_them(host, tmp_path: Path):
    # Each option in the unit it is documented in (OptionSpec.default_unit), flags as true/false, plain numbers
    # bare. 10 ft/s = 3.048 m/s (1 ft = 0.3048 m exactly); 5 psi = 0.344738 bar (1 psi = 6894.757 Pa, NIST SP 811);
    # 400 Pa/m = 40 kPa/100 m.
    path = tmp_path / "acme.toml"
    path.write_text(textwrap.dedent("""
        [service.acme]
        phase = "liquid"
        description = "acme water"
        velocity = { max = "10 ft/s" }
        flashing = { margin = "5 psi", warn_only = true }
        erosional = { c_us = 125 }
        drop-per-length = { max = "400 Pa/m" }
    """))
    lines = render_criteria(host, load_config(host, path)).splitlines()
    start = lines.index("  acme (liquid): acme water  [set acme.toml unversioned]")
    assert lines[start + 1:start + 6] == [
        "      velocity: max = 3.048 m/s",
        "      flashing: margin = 0.344738 bar, warn_only = true",
        "      erosional: c_us = 125",
        "      drop-per-length: max = 40 kPa/100 m",
        "      line-feasibility: defaults",
    ]
    text = "\n".join(lines)
    assert " SI" not in text
