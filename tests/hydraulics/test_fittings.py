"""Fittings by kind and count, and the whole line's drop: against Darby (1999), Hooper (1981), Crane TP-410
and the fluids library as outside references."""

from __future__ import annotations

import math

import fluids.fittings as ff
import pytest
from fluids.friction import friction_factor as fluids_friction_factor
from fluids.friction import ft_Crane
import fluids.friction as ff_friction
from fluids.piping import nearest_pipe

from boresize.errors import InputError
from boresize.hydraulics.fittings import (
    KINDS,
    contraction_k,
    crane_ft,
    expansion_k,
    fitting_k,
    fittings_loss,
    k_from_cv,
    k_from_kv,
)
from boresize.hydraulics.line import rate_line
from boresize.io.rows import line_from_row, parse_fittings
from boresize.model import Candidate, Flow, FluidState, Line

# Our kind -> the row of fluids.fittings.Darby holding the constants of Silverberg & Darby, Chem. Eng. 1999.
DARBY_ROWS = {
    "elbow-90-sr": "Elbow, 90°, flanged, welded, bends, (r/D = 1)",
    "elbow-90-lr-threaded": "Elbow, 90°, threaded, long radius, (r/D = 1.5)",
    "elbow-90-threaded": "Elbow, 90°, threaded, standard, (r/D = 1)",
    "bend-90-2d": "Elbow, 90°, (r/D = 2)",
    "bend-90-4d": "Elbow, 90°, (r/D = 4)",
    "bend-90-6d": "Elbow, 90°, (r/D = 6)",
    "elbow-90-mitre-1": "Elbow, 90°, mitered, 1 weld, (90°)",
    "elbow-90-mitre-2": "Elbow, 90°, 2 welds, (45°)",
    "elbow-90-mitre-3": "Elbow, 90°, 3 welds, (30°)",
    "elbow-45-sr": "Elbow, 45°, threaded standard, (r/D = 1)",
    "elbow-45-lr": "Elbow, 45°, long radius, (r/D = 1.5)",
    "elbow-45-mitre": "Elbow, 45°, mitered, 1 weld, (45°)",
    "return-bend": "Elbow, 180°, flanged, (r/D = 1)",
    "return-bend-lr": "Elbow, 180°, all, (r/D = 1.5)",
    "tee-run": "Tee, Run-through, flanged, (r/D = 1)",
    "tee-branch": "Tee, Through-branch, (as elbow), flanged, (r/D = 1)",
    "tee-run-threaded": "Tee, Run-through, threaded, (r/D = 1)",
    "tee-branch-threaded": "Tee, Through-branch, (as elbow), threaded, (r/D = 1)",
    "tee-branch-stub-in": "Tee, Through-branch, (as elbow), stub-in branch",
    "gate": ff.DARBY_GATE_VALVE,
    "globe": ff.DARBY_GLOBE_FULL_VALVE,
    "angle-45": ff.DARBY_ANGLE_45DEG_FULL_VALVE,
    "angle-90": ff.DARBY_ANGLE_90DEG_FULL_VALVE,
    "ball": ff.DARBY_BALL_VALVE,
    "plug": ff.DARBY_PLUG_VALVE_STRAIGHT_THROUGH,
    "diaphragm": ff.DARBY_DIAPHRAGM_DAM_VALVE,
    "check-swing": ff.DARBY_SWING_CHECK_VALVE,
    "check-lift": ff.DARBY_LIFT_CHECK_VALVE,
}
# Our kind -> the row of fluids.fittings.Hooper (Hooper, Chem. Eng. 1981). Hooper's one row "gate, ball,
# plug valve, full line size" serves all three; fluids files the "tee used as elbow" rows under "Elbow, ...".
HOOPER_ROWS = {
    "elbow-90-sr": "Elbow, 90°, Standard (R/D = 1), Flanged/welded",
    "elbow-90-lr-welded": "Elbow, 90°, Long-radius (R/D = 1.5), All types",
    "elbow-90-lr-threaded": "Elbow, 90°, Long-radius (R/D = 1.5), All types",
    "elbow-90-threaded": "Elbow, 90°, Standard (R/D = 1), Screwed",
    "elbow-90-mitre-1": "Elbow, 90°, Mitered (R/D = 1.5), 1 weld (90° angle)",
    "elbow-90-mitre-2": "Elbow, 90°, Mitered (R/D = 1.5), 2 weld (45° angle)",
    "elbow-90-mitre-3": "Elbow, 90°, Mitered (R/D = 1.5), 3 weld (30° angle)",
    "elbow-45-sr": "Elbow, 45°, Standard (R/D = 1), All types",
    "elbow-45-lr": "Elbow, 45°, Long-radius (R/D 1.5), All types",
    "elbow-45-mitre": "Elbow, 45°, Mitered (R/D=1.5), 1 weld (45° angle)",
    "return-bend": "Elbow, 180°, Standard (R/D = 1), Flanged/welded",
    "return-bend-lr": "Elbow, 180°, Long-radius (R/D = 1.5), All types",
    "tee-run": "Tee, Through, Flanged or welded",
    "tee-run-threaded": "Tee, Run, Screwed",
    "tee-branch": "Elbow, Elbow, Standard, Flanged/welded",
    "tee-branch-threaded": "Elbow, Used as, Standard, Screwed",
    "tee-branch-stub-in": "Elbow, Elbow, Stub-in type branch",
    "gate": ff.HOOPER_GATE_FULL_LINE_SIZE_VALVE,
    "ball": ff.HOOPER_GATE_FULL_LINE_SIZE_VALVE,
    "plug": ff.HOOPER_GATE_FULL_LINE_SIZE_VALVE,
    "globe": ff.HOOPER_GLOBE_STANDARD_VALVE,
    "angle-45": ff.HOOPER_GLOBE_ANGLED_OR_Y_VALVE,
    "angle-90": ff.HOOPER_GLOBE_ANGLED_OR_Y_VALVE,
    "butterfly": ff.HOOPER_BUTTERFLY_VALVE,
    "diaphragm": ff.HOOPER_DIAPHRAGM_DAM_VALVE,
    "check-swing": ff.HOOPER_CHECK_VALVE_SWING,
    "check-lift": ff.HOOPER_CHECK_VALVE_LIFT,
    "check-tilting": ff.HOOPER_CHECK_VALVE_TILTING_DISK,
}
SIZES = (1.0, 2.0, 6.0, 12.0, 24.0)  # NPS
INCH = 0.0254  # m (exact, by definition)


@pytest.mark.parametrize("kind", sorted(DARBY_ROWS))
def test_darby_constants_and_k_match_the_published_table(kind):
    # Constants: Silverberg & Darby, Chem. Eng. 106(7) 1999, as tabulated in fluids.fittings.Darby.
    assert KINDS[kind].darby == pytest.approx(ff.Darby[DARBY_ROWS[kind]], rel=1e-12)
    for nps in SIZES:
        di = nearest_pipe(NPS=nps, schedule="40")[1]
        for re in (500.0, 1e4, 1e6):
            k, method = fitting_k(kind, "darby-3k", re, di, nps)
            assert method == "darby-3k"
            assert k == pytest.approx(ff.Darby3K(NPS=nps, Re=re, name=DARBY_ROWS[kind]), rel=1e-3)


@pytest.mark.parametrize("kind", sorted(HOOPER_ROWS))
def test_hooper_constants_and_k_match_the_published_table(kind):
    # Constants: Hooper, Chem. Eng., Aug. 24 1981, as tabulated in fluids.fittings.Hooper.
    assert KINDS[kind].hooper == pytest.approx(ff.Hooper[HOOPER_ROWS[kind]], rel=1e-12)
    for nps in SIZES:
        di = nearest_pipe(NPS=nps, schedule="40")[1]
        for re in (500.0, 1e4, 1e6):
            k, _ = fitting_k(kind, "hooper-2k", re, di, nps)
            assert k == pytest.approx(ff.Hooper2K(Di=di / INCH, Re=re, name=HOOPER_ROWS[kind]), rel=1e-3)


def test_the_documented_darby_and_hooper_examples():
    # fluids docs: Darby3K(NPS=2, Re=1e4, 45 deg angle valve) = 1.1572523963562356
    assert fitting_k("angle-45", "darby-3k", 1e4, 0.05248, 2.0)[0] == pytest.approx(1.1572523963562356, rel=1e-9)
    # fluids docs: Hooper2K(Di=2 in, Re=1e4, standard globe valve) = 6.15 (1500/1e4 + 4 (1 + 1/2))
    assert fitting_k("globe", "hooper-2k", 1e4, 2 * INCH, 2.0)[0] == pytest.approx(6.15, rel=1e-9)


CRANE_VALVES = {  # kind -> fluids' Crane function at full bore (beta = 1) for diameter d and friction factor fd
    "gate": lambda d, fd: ff.K_gate_valve_Crane(d, d, 0.0, fd=fd),
    "globe": lambda d, fd: ff.K_globe_valve_Crane(d, d, fd=fd),
    "angle-45": lambda d, fd: ff.K_angle_valve_Crane(d, d, fd=fd, style=0),
    "angle-90": lambda d, fd: ff.K_angle_valve_Crane(d, d, fd=fd, style=1),
    "ball": lambda d, fd: ff.K_ball_valve_Crane(d, d, 0.0, fd=fd),
    "plug": lambda d, fd: ff.K_plug_valve_Crane(d, d, 0.0, fd=fd, style=0),
    "butterfly": lambda d, fd: ff.K_butterfly_valve_Crane(d, fd=fd, style=0),
    "diaphragm": lambda d, fd: ff.K_diaphragm_valve_Crane(fd=fd, style=0),
    "check-swing": lambda d, fd: ff.K_swing_check_valve_Crane(fd=fd, angled=True),
    "check-lift": lambda d, fd: ff.K_lift_check_valve_Crane(d, d, fd=fd, angled=False),
    "check-tilting": lambda d, fd: ff.K_tilting_disk_check_valve_Crane(d, 5.0, fd=fd),
}


@pytest.mark.parametrize("kind", sorted(CRANE_VALVES))
def test_crane_valves_are_ft_times_l_over_d(kind):
    # Crane TP-410 valve L/D (A-27 to A-30), as implemented by fluids' K_*_Crane functions with the same fT.
    for nps in (2.0, 6.0, 12.0, 20.0):
        di = nearest_pipe(NPS=nps, schedule="40")[1]
        k, method = fitting_k(kind, "crane", 1e5, di, nps)
        assert method == "crane"
        assert k == pytest.approx(CRANE_VALVES[kind](di, crane_ft(nps)), rel=1e-9)


def test_crane_elbows_entrances_exit():
    di = nearest_pipe(NPS=4, schedule="40")[1]
    ft = crane_ft(4.0)
    # Crane TP-410: standard 90 deg elbow 30 fT, 45 deg elbow 16 fT, close return bend 50 fT, tee run 20 fT,
    # tee branch 60 fT, bends r/d 1.5 -> 14 fT, 2 -> 12 fT, 4 -> 14 fT, 6 -> 17 fT; mitre 90 deg 60 fT, 45 deg 15 fT
    # (fluids.fittings bend_rounded_Crane_fds and bend_miter_Crane_fds hold the same table).
    expected = {"elbow-90-sr": 30, "elbow-45-sr": 16, "return-bend": 50, "tee-run": 20, "tee-branch": 60,
                "elbow-90-lr-welded": 14, "bend-90-2d": 12, "bend-90-4d": 14, "bend-90-6d": 17, "elbow-90-mitre-1": 60,
                "elbow-45-mitre": 15}
    for kind, ld in expected.items():
        assert fitting_k(kind, "crane", 1e5, di, 4.0)[0] == pytest.approx(ld * ft, rel=1e-12), kind
    # Entrance and exit (Crane TP-410 A-29), the same values in fluids.fittings.
    assert fitting_k("entrance", "darby-3k", 1e5, di, 4.0)[0] == ff.entrance_sharp(method="Crane")
    assert fitting_k("entrance-projecting", "darby-3k", 1e5, di, 4.0)[0] == ff.entrance_distance(
        Di=di, t=0.001, method="Crane")
    assert fitting_k("entrance-rounded", "hooper-2k", 1e5, di, 4.0)[0] == ff.entrance_rounded(
        Di=di, rc=0.2 * di, method="Crane")
    assert fitting_k("exit", "crane", 1e5, di, 4.0)[0] == ff.exit_normal()


# fluids.friction.Crane_fts_nominal_Ds are nominal DN [m]; the NPS of each (ASME B36.10M), for the table check.
DN_TO_NPS = {0.015: 0.5, 0.02: 0.75, 0.025: 1.0, 0.032: 1.25, 0.04: 1.5, 0.05: 2.0, 0.065: 2.5, 0.08: 3.0,
             0.1: 4.0, 0.125: 5.0, 0.15: 6.0, 0.2: 8.0, 0.25: 10.0, 0.35: 14.0, 0.4: 16.0, 0.55: 22.0,
             0.6: 24.0, 0.9: 36.0}


def test_crane_ft_is_the_crane_table_value_by_value():
    # Crane TP-410 (2009 and later editions), "pipe friction data for clean commercial steel pipe with flow in
    # zone of complete turbulence", as digitised in fluids.friction.Crane_fts (one value per nominal size).
    assert len(ff_friction.Crane_fts) == len(ff_friction.Crane_fts_nominal_Ds) == len(DN_TO_NPS)
    for dn, ft in zip(ff_friction.Crane_fts_nominal_Ds, ff_friction.Crane_fts, strict=True):
        assert crane_ft(DN_TO_NPS[dn]) == ft, dn
    # Crane TP-410M example 7-2 takes fT = 0.015 for 150 mm (NPS 6) pipe.
    assert crane_ft(6.0) == 0.015
    # fluids' ft_Crane, a fit that reproduces the printed table when rounded, agrees at each printed size.
    for dn, nps in DN_TO_NPS.items():
        di = ff_friction.Crane_fts_Ds[ff_friction.Crane_fts_nominal_Ds.index(dn)]
        assert round(ft_Crane(di), 3) == crane_ft(nps), nps


def test_crane_ft_between_and_outside_the_printed_sizes():
    # Crane prints ranges 10-14, 16-22, 24-36 in: sizes inside take the range's value; a size between two
    # printed ones takes the smaller size's (higher) value; above 36 in, the 36 in value.
    assert [crane_ft(n) for n in (12.0, 18.0, 20.0, 30.0, 3.5, 42.0)] == [0.013, 0.012, 0.012, 0.011, 0.017, 0.011]
    # Below 1/2 in: Crane's formula 0.25 / log10(e/3.7D)^2, e = 0.0018 in, at the bore, no less than the 1/2 in value.
    di = nearest_pipe(NPS=0.25, schedule="40")[1]
    assert crane_ft(0.25, di) == pytest.approx(0.25 / math.log10(0.0018 * INCH / (3.7 * di)) ** 2, rel=1e-12)
    assert crane_ft(0.25, di) > crane_ft(0.5)
    assert crane_ft(0.125, 1.0) == 0.026  # a bore too large for the size: never below the 1/2 in value
    with pytest.raises(InputError, match=r"^nps: NPS 0.25 is below Crane's fT table; expected the inside diameter"):
        crane_ft(0.25)


def test_crane_example_7_2_kv_to_k_and_l_over_d():
    # Crane TP-410M example 7-2: 150 mm Y-pattern globe valve, Kv = 500, Sch 40 ID 154 mm:
    # K = 3.6, L/D = 240 with fT = 0.015, L = 37.0 m (also the fluids docs notebook "7.2 L, L over D and K").
    k = k_from_kv(500.0, 0.154)
    assert k == pytest.approx(3.6, abs=0.005)
    assert k == pytest.approx(ff.Kv_to_K(500.0, 0.154), rel=1e-9)
    assert k / 0.015 == pytest.approx(240.0, abs=0.5)
    assert k / 0.015 * 0.154 == pytest.approx(37.0, abs=0.05)
    # The same valve written in the fittings text.
    assert fittings_loss([("kv=500", 1.0)], None, reynolds=1e5, inside_diameter=0.154, nps=6.0).k_total == k
    # Cv: fluids docs example Cv_to_K(2.712, 0.015) = 14.719595348352 (IEC 60534: Kv = Cv / 1.156).
    assert k_from_cv(2.712, 0.015) == pytest.approx(14.719595348352, rel=1e-3)


@pytest.mark.parametrize("beta", [0.4, 0.6, 0.8])
@pytest.mark.parametrize("angle", [15.0, 40.0, 60.0, 180.0])
def test_reducers_follow_crane(beta, angle):
    # Crane TP-410 contraction and enlargement formulas, as implemented by fluids (K on the small bore).
    small, large = beta, 1.0
    assert contraction_k(beta, angle) == pytest.approx(ff.contraction_conical_Crane(large, small, angle=angle),
                                                       rel=1e-9)
    assert expansion_k(beta, angle) == pytest.approx(ff.diffuser_conical_Crane(small, large, angle=angle), rel=1e-9)
    # In the fittings text K is referred to the line: the larger bore for a contraction.
    loss = fittings_loss([(f"contraction({beta}, {angle:g})", 1.0), (f"expansion({beta}, {angle:g})", 1.0)],
                         None, reynolds=1e5, inside_diameter=0.1, nps=4.0)
    assert loss.k_total == pytest.approx(contraction_k(beta, angle) / beta**4 + expansion_k(beta, angle), rel=1e-12)


def test_explicit_items_and_counts():
    di, f = 0.10226, 0.02
    loss = fittings_loss(parse_fittings("K=2.5: 2; Leq=12 m; Leq=40 ft; L/D=340; elbow-90-lr-threaded: 4"), None,
                         reynolds=1e5, inside_diameter=di, nps=4.0)
    darby_lr = ff.Darby3K(NPS=4.0, Re=1e5, name=DARBY_ROWS["elbow-90-lr-threaded"])  # Silverberg & Darby 1999
    assert loss.k_total == pytest.approx(5.0 + 340 * 0.016 + 4 * darby_lr, rel=1e-9)  # fT 0.016 at NPS 4 (Crane)
    assert loss.equivalent_length == pytest.approx(12.0 + 40 * 0.3048, rel=1e-12)  # 1 ft = 0.3048 m (exact)
    # Equivalent length adds f Leq/D velocity heads (Darcy-Weisbach).
    assert loss.drop(f, 1000.0, 2.0, di) == pytest.approx((loss.k_total + f * loss.equivalent_length / di) * 2000.0)
    assert "Darby 3-K" in loss.method and "Crane" in loss.method


def test_a_kind_the_method_lacks_falls_back_and_says_so():
    loss = fittings_loss([("butterfly", 1.0), ("gate", 1.0)], "darby", reynolds=1e5, inside_diameter=0.1, nps=4.0)
    # Darby (1999) has no butterfly valve: Hooper's constants (1981) are used and the record names them.
    assert loss.k_total == pytest.approx(ff.Hooper2K(Di=0.1 / INCH, Re=1e5, name=ff.HOOPER_BUTTERFLY_VALVE)
                                         + ff.Darby3K(NPS=4.0, Re=1e5, name=ff.DARBY_GATE_VALVE), rel=1e-9)
    assert loss.method.startswith("fittings by Darby 3-K") and "butterfly by Hooper 2-K" in loss.method


def test_unknown_kind_lists_the_valid_ones():
    with pytest.raises(InputError, match=r"^fittings: unknown fitting 'elbow-91'; expected items 'KIND\[: COUNT\]'"
                       r".*elbow-90-lr.*'K=2\.5', 'Leq=12 m'") as info:
        fittings_loss([("elbow-91", 1.0)], None, reynolds=1e5, inside_diameter=0.1, nps=4.0)
    assert (info.value.field, info.value.value) == ("fittings", "elbow-91")


def test_bad_explicit_items_and_methods_name_the_field():
    with pytest.raises(InputError, match=r"^fittings: K 'x' in 'k=x' is not a number; expected items 'KIND"):
        fittings_loss([("k=x", 1.0)], None, reynolds=1e5, inside_diameter=0.1, nps=4.0)
    with pytest.raises(InputError, match=r"^fittings: beta 1.2 or angle 180 deg out of range in 'contraction\(1.2\)'"):
        fittings_loss([("contraction(1.2)", 1.0)], None, reynolds=1e5, inside_diameter=0.1, nps=4.0)
    with pytest.raises(InputError, match=r"^fittings_method: unknown fittings method 'idelchik'; expected one of "
                                         r"darby-3k, hooper-2k, crane$"):
        fittings_loss([], "idelchik", reynolds=1e5, inside_diameter=0.1, nps=4.0)


def test_parse_fittings_keeps_explicit_items():
    assert parse_fittings("gate: 2; K=2.5; Leq=12 m: 3; Kv=500; contraction(0.6, 30)") == (
        ("gate", 2.0), ("k=2.5", 1.0), ("leq=12 m", 3.0), ("kv=500", 1.0), ("contraction(0.6, 30)", 1.0))


# -- the whole line ---------------------------------------------------------------------------------------

FT = 0.3048  # m per ft (exact)


def test_crane_example_7_15_pump_system_total_head():
    # Crane TP-410 example 7-15 (fluids docs notebook "7.15 Power Required for Pumping"): water at 70 degF
    # (62.298 lb/ft3, 0.95 cP), 100 US gal/min, 3 in Sch 40, 500 ft of pipe, 400 ft static lift, exit,
    # gate valve, four standard elbows, a 2-1/2 x 3 in lift check valve. Crane: 421 ft of total head.
    rho = 62.298 * 0.45359237 / FT**3
    _, di, do, wall = nearest_pipe(NPS=3, schedule="40")
    di_valve = nearest_pipe(NPS=2.5, schedule="40")[1]
    k_check = ff.K_lift_check_valve_Crane(D1=di_valve, D2=di, fd=crane_ft(3.0), angled=False)  # Crane A-27 formula
    line = Line(tag="7-15", fluid="water", flow=Flow("volume", 100 * 3.785411784e-3 / 60), pressure=5e5,
                temperature=294.26, length=500 * FT, elevation=400 * FT, fittings_method="crane",
                fittings=(("exit", 1.0), ("gate", 1.0), ("elbow-90-sr", 4.0), (f"k={k_check}", 1.0)))
    state = FluidState(density=rho, viscosity=0.95e-3, phase="liquid", source="table", model="Crane 7-15")
    pipe = Candidate("3", 3.0, "40", do, wall, di, 0.0018 * 0.0254)
    hyd = rate_line(line, state, pipe, line.flow.value * rho)
    head = hyd.total_drop / (rho * 9.80665) / FT
    assert head == pytest.approx(421.0, rel=0.01)
    assert "Crane K = fT L/D" in hyd.method


def _water_line(**cells: str) -> dict[str, str]:
    return {"tag": "F-1", "fluid": "water", "flow": "40 t/h", "pressure": "6 barg", "temperature": "20 degC",
            "length": "80 m", "nps": "3", "service": "liquid", **cells}


def _independent_drops(sizer, result, k_names):
    """Friction and fittings drops from fluids (Clamond/Colebrook and Darby3K) at the result's state."""
    state, cand = result.state, result.selected.candidate
    area = math.pi * cand.inside_diameter**2 / 4
    v = 40_000 / 3600 / state.density / area
    re = state.density * v * cand.inside_diameter / state.viscosity
    f = fluids_friction_factor(Re=re, eD=cand.roughness / cand.inside_diameter)
    k = sum(count * ff.Darby3K(NPS=3.0, Re=re, name=name) for name, count in k_names)
    head = state.density * v**2 / 2
    return f * 80 / cand.inside_diameter * head, k * head


def test_fittings_elevation_allowances_and_outlet_pressure_through_the_engine(sizer):
    row = _water_line(fittings="elbow-90-lr-threaded: 6; gate: 2; check-swing", elevation="15 m",
                      fixed_drop="0.4 bar", min_outlet_pressure="2 barg", design_margin="0 %")
    result = sizer.run(line_from_row(row))
    h = result.selected.hydraulics
    friction, fittings = _independent_drops(sizer, result, [(DARBY_ROWS["elbow-90-lr-threaded"], 6),
                                                             (ff.DARBY_GATE_VALVE, 2), (ff.DARBY_SWING_CHECK_VALVE, 1)])
    static = result.state.density * 9.80665 * 15.0  # standard gravity (CGPM 1901)
    assert (h.drop, h.fittings_drop) == (pytest.approx(friction, rel=1e-5), pytest.approx(fittings, rel=1e-5))
    assert h.total_drop == pytest.approx(friction + fittings + static + 40_000.0, rel=1e-5)
    assert h.outlet_pressure == pytest.approx(701_325.0 - h.total_drop, rel=1e-9)  # 6 barg = 701.325 kPa abs
    assert "Darby 3-K" in h.method


def _outlet_verdict(sizer, max_drop=None, **cells):
    from boresize.criteria.base import CriterionContext
    from boresize.criteria.outlet_pressure import OutletPressure

    result = sizer.run(line_from_row(_water_line(**cells)))
    sel = result.selected
    criterion = OutletPressure()
    options = {"max_drop": max_drop} if max_drop is not None else {}
    return sel.hydraulics, criterion.evaluate(CriterionContext(result.line, result.state, sel.candidate,
                                                                sel.hydraulics, options, "liquid"))


def test_outlet_pressure_minimum_gauge_or_absolute(sizer):
    h, ok = _outlet_verdict(sizer, elevation="20 m", min_outlet_pressure="3 barg", design_margin="0 %")
    # 6 barg in, 2 bar of static head (1000 kg/m3 * 9.81 * 20 m) and some friction: about 4.6 bar abs out.
    assert ok.status == "pass" and ok.unit == "bar abs"
    assert ok.limit == pytest.approx(4.01325, rel=1e-9)  # 3 barg = 4.01325 bar abs (1 atm = 1.01325 bar)
    assert ok.utilisation == pytest.approx(h.total_drop / (701_325.0 - 401_325.0), rel=1e-9)
    _, low = _outlet_verdict(sizer, elevation="20 m", min_outlet_pressure="5 bar", design_margin="0 %")
    assert low.status == "fail" and low.reason.startswith("outlet pressure ")
    assert "below the minimum 5 bar abs" in low.reason


def test_outlet_pressure_drop_allowance_and_not_applicable(sizer):
    h, verdict = _outlet_verdict(sizer, max_drop=150_000.0, elevation="20 m")
    assert verdict.status == "fail" and verdict.value == pytest.approx(h.total_drop / 1e5)
    assert verdict.reason.startswith("total drop ") and "above the allowance 1.5 bar" in verdict.reason
    _, none = _outlet_verdict(sizer)
    assert none.status == "not-applicable"


def test_welded_and_threaded_elbows_are_separate_kinds():
    di, nps, re = nearest_pipe(NPS=4, schedule="40")[1], 4.0, 1e5
    # Darby 3-K (Silverberg & Darby 1999, fluids.fittings.Darby) prints the threaded r/D 1.5 elbow and the
    # flanged/welded r/D 1 elbow with their own constants; it prints no flanged/welded r/D 1.5 row.
    assert KINDS["elbow-90-lr-threaded"].darby == ff.Darby["Elbow, 90°, threaded, long radius, (r/D = 1.5)"]
    assert KINDS["elbow-90-sr"].darby == ff.Darby["Elbow, 90°, flanged, welded, bends, (r/D = 1)"]
    assert KINDS["elbow-90-threaded"].darby == ff.Darby["Elbow, 90°, threaded, standard, (r/D = 1)"]
    assert KINDS["elbow-90-lr-welded"].darby is None
    # Hooper 2-K (Hooper 1981, fluids.fittings.Hooper): screwed vs flanged/welded standard elbows differ; its
    # long-radius row is "all types".
    assert KINDS["elbow-90-threaded"].hooper == ff.Hooper["Elbow, 90°, Standard (R/D = 1), Screwed"]
    assert KINDS["elbow-90-sr"].hooper == ff.Hooper["Elbow, 90°, Standard (R/D = 1), Flanged/welded"]
    # Under Darby a welded long-radius elbow takes Hooper's constants, and the record names them.
    welded = fittings_loss([("elbow-90-lr-welded", 1.0)], "darby-3k", reynolds=re, inside_diameter=di, nps=nps)
    assert welded.k_total == pytest.approx(
        ff.Hooper2K(Di=di / INCH, Re=re, name="Elbow, 90°, Long-radius (R/D = 1.5), All types"), rel=1e-9)
    assert welded.method.endswith("; elbow-90-lr-welded by Hooper 2-K (Hooper, Chem. Eng. 1981)")
    threaded = fittings_loss([("elbow-90-lr-threaded", 1.0)], "darby-3k", reynolds=re, inside_diameter=di, nps=nps)
    assert threaded.k_total == pytest.approx(
        ff.Darby3K(NPS=nps, Re=re, name="Elbow, 90°, threaded, long radius, (r/D = 1.5)"), rel=1e-9)
    assert threaded.k_total != welded.k_total
    # Crane: 14 fT for the flanged or butt-welding r/D 1.5 elbow (fluids bend_rounded_Crane_fds); Crane has
    # no threaded long-radius elbow, so Darby's threaded constants serve and the record says so.
    assert fitting_k("elbow-90-lr-welded", "crane", re, di, nps) == (pytest.approx(14 * 0.016, rel=1e-12), "crane")
    assert fitting_k("elbow-90-lr-threaded", "crane", re, di, nps)[1] == "darby-3k"


def test_the_old_kind_names_still_work_as_documented():
    # elbow-90-lr is the welded long-radius elbow; elbow-90 the welded standard one.
    for old, new in (("elbow-90-lr", "elbow-90-lr-welded"), ("elbow-90", "elbow-90-sr"),
                     ("elbow-90-sr-threaded", "elbow-90-threaded"), ("elbow-90-sr-welded", "elbow-90-sr")):
        for method in ("darby-3k", "hooper-2k", "crane"):
            assert fitting_k(old, method, 1e5, 0.10226, 4.0) == fitting_k(new, method, 1e5, 0.10226, 4.0)


@pytest.mark.parametrize(("fittings", "message"), [
    ([("leq=-12 m", 1.0)], "fittings: Leq '-12 m' in 'leq=-12 m' is not above zero: a fitting adds to the drop and "
                           "cannot credit the line; expected an equivalent length above zero with its unit, "
                           "e.g. 'Leq=12 m'"),
    ([("leq=0 ft", 1.0)], "fittings: Leq '0 ft' in 'leq=0 ft' is not above zero: a fitting adds to the drop and "
                          "cannot credit the line; expected an equivalent length above zero with its unit, "
                          "e.g. 'Leq=12 m'"),
    ([("k=-2.5", 1.0)], "fittings: K '-2.5' in 'k=-2.5' is not above zero: a fitting adds to the drop and cannot "
                        "credit the line; expected a loss coefficient K above zero, e.g. 'K=2.5'"),
    ([("l/d=-30", 1.0)], "fittings: L/D '-30' in 'l/d=-30' is not above zero: a fitting adds to the drop and "
                         "cannot credit the line; expected an equivalent length ratio L/D above zero, "
                         "e.g. 'L/D=340'"),
    ([("gate", -2.0)], "fittings: count -2.0 of 'gate' is not above zero: a fitting adds to the drop and cannot "
                       "credit the line; expected a count above zero, e.g. 'gate: 2'"),
    ([("k=2", math.nan)], "fittings: count nan of 'k=2' is not above zero: a fitting adds to the drop and cannot "
                          "credit the line; expected a count above zero, e.g. 'gate: 2'"),
])
def test_fittings_that_would_credit_the_line_are_refused(fittings, message):
    with pytest.raises(InputError) as info:
        fittings_loss(fittings, None, reynolds=1e5, inside_diameter=0.1, nps=4.0)
    assert str(info.value) == message
    assert (info.value.field, info.value.value) == ("fittings", fittings[0][0])


def test_a_negative_equivalent_length_in_a_line_list_is_refused():
    # Through the line-list parser and the whole line: the error, not a smaller drop.
    line = Line(tag="N-1", fluid="water", flow=Flow("mass", 10.0), pressure=5e5, temperature=293.15, length=50.0,
                fittings=parse_fittings("gate; Leq=-12 m"))
    state = FluidState(density=998.0, viscosity=1e-3, phase="liquid", source="table", model="water")
    pipe = Candidate("3", 3.0, "40", 0.0889, 0.00549, 0.07792, 4.5e-5)
    with pytest.raises(InputError, match=r"^fittings: Leq '-12 m' in 'leq=-12 m' is not above zero"):
        rate_line(line, state, pipe, 10.0)
