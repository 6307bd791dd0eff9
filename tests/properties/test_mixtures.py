"""Mixture input and the rest of issue 3: compositions and the sum rule, component names, CoolProp
mixtures and incompressibles with their guards, two-phase reporting, and a mixed line list end to end."""

from __future__ import annotations

import math
from typing import Any

import pytest

from boresize.errors import InputError, PropertyError
from boresize.io.document import result_to_dict
from boresize.io.rows import line_from_row
from boresize.model import Flow, Line
from boresize.properties.components import SHORTHANDS, resolve_component
from boresize.properties.composition import composition_text, parse_composition
from boresize.properties.coolprop_mixture import CoolPropMixtureBackend, incompressible_spec
from boresize.properties.phase import two_phase_screen
from boresize.api import size_rows

T0 = 273.15  # [K] at 0 degC (definition of the Celsius scale)


def make_line(fluid: str, pressure: float, temperature: float, **overrides: Any) -> Line:
    return Line(tag="MX-1", fluid=fluid, flow=Flow("mass", 1.0), pressure=pressure, temperature=temperature,
                **overrides)


@pytest.fixture(scope="module")
def mixture_backend() -> CoolPropMixtureBackend:
    return CoolPropMixtureBackend()


# --- compositions (rule of issue 3: normalise with a warning within 1 %, an error beyond) -------------


@pytest.mark.parametrize("text", [
    "methane:0.90, ethane:0.06, propane:0.04",
    "methane=0.90; ethane=0.06; propane=0.04",
    "methane 90 %, ethane 6 %, propane 4 %",
    "Methane[0.90]&Ethane[0.06]&Propane[0.04]",
])
def test_text_forms_of_a_composition(text: str) -> None:
    parsed = parse_composition(text)
    assert [c.lower() for c in parsed.components] == ["methane", "ethane", "propane"]
    assert parsed.fractions == pytest.approx((0.90, 0.06, 0.04)) and parsed.basis == "mole"


def test_names_with_commas_and_mass_basis() -> None:
    parsed = parse_composition("mass: 1,2-dichloroethane 0.4, water 0.6")
    assert parsed.components == ("1,2-dichloroethane", "water") and parsed.basis == "mass"
    assert parse_composition("water:0.7, methanol:0.3", basis="mass").basis == "mass"


@pytest.mark.parametrize("value", [
    {"methane": 0.9, "ethane": 0.1},
    [["methane", 0.9], ["ethane", 0.1]],
    [{"name": "methane", "fraction": 0.9}, {"name": "ethane", "fraction": "10 %"}],
])
def test_toml_list_and_table_forms(value: object) -> None:
    parsed = parse_composition(value)
    assert parsed.components == ("methane", "ethane") and parsed.fractions == pytest.approx((0.9, 0.1))
    assert parse_composition(composition_text(value)).fractions == pytest.approx((0.9, 0.1))


def test_a_sum_within_one_percent_is_normalised_with_a_warning() -> None:
    with pytest.warns(UserWarning, match=r"mole fractions summed to 0.995; normalised to 1"):
        parsed = parse_composition("methane:0.895, ethane:0.06, propane:0.04")
    assert sum(parsed.fractions) == pytest.approx(1.0, abs=1e-15)
    assert parsed.fractions[0] == pytest.approx(0.895 / 0.995) and parsed.note


@pytest.mark.parametrize(("text", "message"), [
    ("methane:0.80, ethane:0.06, propane:0.04", r"fluid: the mole fractions sum to 0.9, not 1; expected fractions "
                                                r"summing to 1 \(a sum within 1% of 1 is normalised\)"),
    ("methane:0.5, ethane:0.6", r"fluid: the mole fractions sum to 1.1, not 1"),
    ("methane:x, ethane:0.5", r"fluid: cannot read 'methane:x, ethane:0.5' as a component and its fraction"),
    ("methane:0.5, Methane:0.5", r"fluid: component 'Methane' is given twice"),
    ("methane:-0.1, ethane:1.1", r"fluid: fraction -0.1 of 'methane' is not a fraction"),
])
def test_bad_compositions_are_input_errors(text: str, message: str) -> None:
    with pytest.raises(InputError, match=message):
        parse_composition(text)


def test_an_unknown_component_names_it_with_close_matches() -> None:
    with pytest.raises(InputError, match=r"fluid: unknown component 'metane' \(close matches: methane"):
        resolve_component("metane")


@pytest.mark.parametrize(("short", "name"), [("C1", "methane"), ("nC4", "butane"), ("iC4", "isobutane"),
                                            ("MEG", "ethylene glycol"), ("DEA", "diethanolamine"),
                                            ("MDEA", "n-methyldiethanolamine")])
def test_trade_shorthands(short: str, name: str) -> None:
    # CAS numbers: methane 74-82-8, n-butane 106-97-8, isobutane 75-28-5, ethylene glycol 107-21-1,
    # diethanolamine 111-42-2, MDEA 105-59-9 (CAS registry, from memory; chemicals' database agrees)
    component = resolve_component(short)
    assert component.name == name and component.cas == SHORTHANDS[short.lower()]


# --- CoolProp incompressibles and HEOS mixtures -------------------------------------------------------


@pytest.mark.parametrize("text", ["MEG 30%", "30 % ethylene glycol", "ethylene glycol 30 wt%", "INCOMP::MEG-30%",
                                  "INCOMP::MEG[0.3]"])
def test_incompressible_spellings(text: str) -> None:
    assert incompressible_spec(text) == ("MEG", pytest.approx(0.3))


def test_ethylene_glycol_solution_density(mixture_backend: CoolPropMixtureBackend) -> None:
    result = mixture_backend.state(make_line("MEG 30%", 5e5, T0 + 20.0), 5e5, T0 + 20.0)
    # CRC Handbook, aqueous ethylene glycol: 30 wt% at 20 degC 1.0381 g/cm3 (from memory)
    assert result.density == pytest.approx(1038.1, rel=3e-3)
    assert result.phase == "liquid" and result.source == "coolprop-mixture" and "INCOMP::MEG-30%" in result.model


def test_incompressible_out_of_range_is_an_input_error(mixture_backend: CoolPropMixtureBackend) -> None:
    with pytest.raises(InputError, match=r"temperature: INCOMP::MEG-30%: .*freezing point"):
        mixture_backend.state(make_line("MEG 30%", 5e5, T0 - 40.0), 5e5, T0 - 40.0)
    with pytest.raises(InputError, match=r"fluid: INCOMP::MEG-90%: Your composition 0.9 is not between"):
        mixture_backend.state(make_line("MEG 90%", 5e5, T0 + 20.0), 5e5, T0 + 20.0)


def test_heos_natural_gas_matches_coolprop(mixture_backend: CoolPropMixtureBackend) -> None:
    from CoolProp.CoolProp import PropsSI

    fluid = "methane:0.90, ethane:0.06, propane:0.04"
    result = mixture_backend.state(make_line(fluid, 70e5, T0 + 15.0), 70e5, T0 + 15.0)
    # CoolProp's high-level interface on the same mixture must agree with the wrapper
    assert result.density == pytest.approx(
        PropsSI("D", "P", 70e5, "T", T0 + 15.0, "Methane[0.9]&Ethane[0.06]&Propane[0.04]"), rel=1e-9)
    assert result.eos == "HEOS" and "GERG-2008" in result.model


@pytest.mark.parametrize(("fluid", "pressure", "temperature", "message"), [
    # water/methane at 300 K, 50 bar: a two-phase flash whose compressibility_factor() is -0.23 (CoolProp's Helmholtz
    # energy at the bulk density; the bulk p/(rho R T) is 0.48, which the guard now takes): refused by its viscosity
    ("water:0.5, methane:0.5", 50e5, 300.0, r"viscosity nan Pa s .* outside the plausible range"),
    # propane/n-butane 60/40 at 20 degC: 231 kg/m3 at 21.13 bar abs, 540 kg/m3 at 20 and 25 bar
    ("propane:0.6, n-butane:0.4", 21.13e5, T0 + 20.0, r"density 231.2\d+ kg/m3 .* a wrong root"),
    # water/methanol 80/20 mol at 25 degC: CoolProp 9.5 mPa s; measured mixtures are about 1.3 mPa s
    ("water:0.8, methanol:0.2", 5e5, T0 + 25.0, r"liquid viscosity 0.009\d+ Pa s .* not trusted here"),
])
def test_heos_guards(mixture_backend: CoolPropMixtureBackend, fluid: str, pressure: float, temperature: float,
                     message: str) -> None:
    with pytest.raises(PropertyError, match=f"^coolprop-mixture: .*{message}"):
        mixture_backend.state(make_line(fluid, pressure, temperature), pressure, temperature)


def test_a_pair_without_binary_parameters_asks_for_thermo(mixture_backend: CoolPropMixtureBackend) -> None:
    with pytest.raises(InputError, match=r"backend: CoolProp has no binary parameters for Water & MDM .*; "
                                         r"expected backend thermo for this mixture"):
        mixture_backend.state(make_line("water:0.5, MDM:0.5", 5e5, 300.0), 5e5, 300.0)


# --- two-phase screen ---------------------------------------------------------------------------------


def test_two_phase_screen_is_api_rp_14e_at_the_homogeneous_density() -> None:
    from fluids import erosional_velocity  # fluids: API RP 14E, V = C/sqrt(rho), C in US units

    from boresize.model import FluidState

    state = FluidState(density=9.75, viscosity=1e-5, phase="two-phase", source="thermo", model="m",
                       vapour_fraction=0.9)
    density, velocity = two_phase_screen(state)  # type: ignore[misc]
    assert density == 9.75 and velocity == pytest.approx(erosional_velocity(9.75, 100), rel=1e-4)
    assert two_phase_screen(FluidState(998.0, 1e-3, "liquid", "coolprop", "m")) is None


# --- a mixed line list end to end ---------------------------------------------------------------------

ROWS = [
    {"tag": "P-1", "fluid": "water", "flow": "50 t/h", "pressure": "5 barg", "temperature": "20 degC"},
    {"tag": "G-1", "fluid": "methane:0.90, ethane:0.06, propane:0.04", "flow": "10 MMSCFD", "pressure": "70 bar",
     "temperature": "15 degC", "design_margin": "0 %"},
    {"tag": "L-1", "fluid": "propane:0.6, n-butane:0.4", "flow": "20 t/h", "pressure": "25 bar",
     "temperature": "20 degC"},
    {"tag": "X-2P", "fluid": "propane:0.6, n-butane:0.4", "flow": "20 t/h", "pressure": "4 bar",
     "temperature": "20 degC"},
    {"tag": "F-1", "fluid": "fuel oil", "flow": "12 m3/h", "pressure": "4 barg", "temperature": "80 degC",
     "density": "950 kg/m3", "viscosity": "120 cP"},
    {"tag": "X-UNK", "fluid": "metane:0.9, ethane:0.1", "flow": "1 t/h", "pressure": "10 bar",
     "temperature": "20 degC"},
    {"tag": "X-SUM", "fluid": "methane:0.8, ethane:0.1", "flow": "1 t/h", "pressure": "10 bar",
     "temperature": "20 degC"},
    {"tag": "B-1", "fluid": "NaCl 10%", "flow": "30 m3/h", "pressure": "5 barg", "temperature": "20 degC"},
    {"tag": "X-FLASH", "fluid": "water", "flow": "10 t/h", "pressure": "1 bar", "temperature": "120 degC",
     "phase": "liquid"},
    {"tag": "P-2", "fluid": "water", "flow": "50 t/h", "pressure": "5 barg", "temperature": "25 degC"},
]


@pytest.fixture(scope="module")
def batch(sizer: Any) -> dict[str, Any]:
    results = size_rows([(row, {}) for row in ROWS], sizer=sizer)
    return {r.tag: r for r in results}


def test_mixed_line_list_sizes_the_good_lines_and_records_each_source(batch: dict[str, Any], sizer: Any) -> None:
    from boresize.report.terminal import render_table

    expected = {"P-1": "coolprop", "G-1": "gerg-2008", "L-1": "gerg-2008", "F-1": "table", "B-1": "coolprop-mixture",
                "P-2": "coolprop", "X-2P": "gerg-2008"}
    table = render_table(list(batch.values()), sizer.config.origin, sizer.config.version)
    unjudged = {"F-1", "B-1"}  # line-list values and CoolProp's brines give no vapour pressure: flashing says error
    for tag, source in expected.items():
        entry = result_to_dict(batch[tag])
        assert entry["property_source"] == source and entry["property_model"]
        if tag in unjudged:
            assert entry["status"] == "error" and entry["error"].startswith(f"line {tag}: flashing not judged: ")
            continue
        assert entry["status"] in ("pass", "fail"), entry.get("error")
        row = next(line for line in table.splitlines() if line.startswith(tag + " "))
        assert row.rstrip().endswith(source)  # the table's Source column


def test_a_two_phase_mixture_through_gerg_is_sized_with_thermos_surface_tension(batch: dict[str, Any]) -> None:
    """X-2P (propane 0.6, n-butane 0.4 at 4 bar, 20 degC) flashes to two phases; GERG-2008 (CoolProp) gives no
    surface tension of a mixture, so the liquid's comes from thermo's SurfaceTensionMixture and Beggs-Brill rates it
    (tests/sizing/test_two_phase_flash.py checks the value against thermo)."""
    result = batch["X-2P"]
    assert result.status in ("pass", "fail") and result.service == "two-phase", result.error
    assert result.state.phase == "two-phase" and result.state.surface_tension is not None
    assert result.selected.hydraulics.two_phase.method == "Beggs-Brill"


def test_natural_gas_in_mmscfd_converts_with_the_eos_at_60_degf(batch: dict[str, Any]) -> None:
    from CoolProp import CoolProp as CP

    reference = CP.AbstractState("HEOS", "Methane&Ethane&Propane")
    reference.set_mole_fractions([0.90, 0.06, 0.04])
    reference.update(CP.PT_INPUTS, 101325.0, (60.0 - 32.0) / 1.8 + T0)  # 14.696 psia, 60 degF (GERG-2008)
    volume = 10e6 * 0.3048**3 / 86400.0  # 10 MMSCFD in m3/s (1 ft = 0.3048 m exactly)
    # the row sets design_margin 0 %, so the sizing flow is the converted flow itself
    assert batch["G-1"].sizing_flow == pytest.approx(volume * reference.rhomass(), rel=5e-3)


@pytest.mark.parametrize(("tag", "field", "message"), [
    ("X-UNK", "fluid", r"line X-UNK: fluid: unknown component 'metane' \(close matches: methane"),
    ("X-SUM", "fluid", r"line X-SUM: fluid: the mole fractions sum to 0.9, not 1"),
    ("X-FLASH", "temperature", r"line X-FLASH: temperature: Water is gas at 120 degC and 1 bar abs, vapour pressure "
                               r"1.98\d* bar abs \(coolprop\)"),
])
def test_bad_lines_give_their_stated_error_and_the_batch_goes_on(batch: dict[str, Any], tag: str, field: str,
                                                                 message: str) -> None:
    entry = result_to_dict(batch[tag])
    assert entry["status"] == "error" and entry["error_field"] == field
    assert re_search(message, entry["error"])


def re_search(pattern: str, text: str) -> bool:
    import re

    assert re.search(pattern, text), text
    return True


def test_a_failed_flash_in_a_batch_names_line_backend_and_conditions(sizer: Any, monkeypatch: pytest.MonkeyPatch) -> None:
    from boresize.properties.thermo_phases import load_package

    package = load_package(("74-98-6", "106-97-8"), "PR")

    def failing(temperature: float, pressure: float, zs: Any) -> Any:
        raise ArithmeticError("no convergence")

    monkeypatch.setattr(package, "flash", failing)
    rows = [dict(ROWS[0], tag="OK-1"), {"tag": "X-FAIL", "fluid": "propane:0.6, n-butane:0.4", "flow": "5 t/h",
                                        "pressure": "33 bar", "temperature": "31 degC", "backend": "thermo"}, dict(ROWS[0], tag="OK-2")]
    results = size_rows([(row, {}) for row in rows], sizer=sizer)
    assert [r.status for r in results][0] != "error" and results[2].status != "error"
    assert results[1].status == "error" and results[1].error_field == "fluid"
    assert results[1].error.startswith("line X-FAIL: thermo: flash failed for propane 0.6, butane 0.4 at 33 bar abs, "
                                       "31 degC (PR): ArithmeticError: no convergence")


def test_line_from_row_keeps_a_composition_basis_column() -> None:
    line = line_from_row({"tag": "W", "fluid": "water:0.7, methanol:0.3", "flow": "1 t/h", "pressure": "3 bar",
                          "temperature": "25 degC", "composition_basis": "mass"})
    from boresize.properties.composition import basis_of

    assert basis_of(line.extra) == "mass"
    assert math.isclose(parse_composition(line.fluid, basis=basis_of(line.extra)).fractions[0], 0.7)


def test_a_toml_line_list_gives_a_composition_as_a_table_or_a_list(sizer: Any) -> None:
    from boresize.io.toml_lines import lines_from_document

    common = {"flow": "5 t/h", "pressure": "25 bar", "temperature": "20 degC"}
    document = {"line": [{"tag": "T-1", "fluid": {"propane": 0.6, "n-butane": 0.4}, **common},
                         {"tag": "T-2", "fluid": [["propane", 0.6], ["n-butane", 0.4]], **common},
                         {"tag": "T-3", "fluid": [{"name": "propane", "fraction": 0.6},
                                                  {"name": "n-butane", "fraction": 0.4}], **common}]}
    results = size_rows(lines_from_document(document).pairs(), sizer=sizer)
    densities = {r.state.density for r in results}
    assert [r.status for r in results] == ["pass"] * 3 and len(densities) == 1
    assert results[0].state.source == "gerg-2008"  # GERG-2008 components only: chosen automatically


def test_every_state_records_backend_version_and_state_point(batch: dict[str, Any]) -> None:
    import importlib.metadata

    for tag, library in (("P-1", "CoolProp"), ("G-1", "CoolProp"), ("B-1", "CoolProp")):
        state = batch[tag].state
        assert state.backend_version.startswith(importlib.metadata.version(library))  # the installed distribution
        assert state.pressure == batch[tag].line.pressure and state.temperature == batch[tag].line.temperature
    assert batch["F-1"].state.backend_version == importlib.metadata.version("boresize")


def test_a_blend_name_is_not_read_as_one_compound() -> None:
    # chemicals' identifier database reads "LPG" as L-alanine and "natural gas" as methane (measured)
    with pytest.raises(InputError, match=r"fluid: 'LPG' is not one component; expected LPG is a mixture"):
        resolve_component("LPG")


def test_every_state_reports_its_phase_and_vapour_fraction(batch: dict[str, Any]) -> None:
    # issue 3: vapour mass fraction 0 for a liquid, 1 for a gas, whatever the backend
    assert batch["P-1"].state.vapour_fraction == 0.0 and batch["F-1"].state.vapour_fraction == 0.0
    assert batch["G-1"].state.vapour_fraction == 1.0


def test_coolprop_mixture_refuses_a_cubic_eos(mixture_backend: CoolPropMixtureBackend) -> None:
    with pytest.raises(InputError, match=r"eos: the coolprop-mixture backend has no equation of state 'PR'"):
        mixture_backend.state(make_line("methane:0.9, ethane:0.1", 50e5, 300.0, eos="PR"), 50e5, 300.0)


def test_water_and_liquid_hydrocarbons_are_refused_not_averaged(sizer):
    # Water and n-hexane are practically immiscible (hexane dissolves to about 10 mg/L in water at 25 degC:
    # IUPAC-NIST Solubility Data Series vol. 81, from memory), so a 50/50 liquid is two liquid phases.
    # A one-liquid flash gave 667 kg/m3 for it: a plausible wrong number, refused instead.
    rows = [
        ({"tag": "LL-1", "fluid": "water:0.5, n-hexane:0.5", "flow": "10 t/h", "pressure": "3 barg",
          "temperature": "25 degC", "service": "liquid"}, {}),
        ({"tag": "LL-2", "fluid": "water:0.7, methanol:0.3", "flow": "10 t/h", "pressure": "3 barg",
          "temperature": "25 degC", "service": "liquid"}, {}),
    ]
    hexane, methanol = size_rows(rows, sizer=sizer)
    assert hexane.status == "error" and hexane.error_field == "fluid"
    assert "form two liquid phases" in hexane.error
    assert "sized as separate streams" in hexane.error
    assert methanol.status == "pass"  # water and methanol mix in all proportions (one liquid)
