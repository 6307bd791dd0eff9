"""Tests of the pipe catalogue (ASME B36.10M / B36.19M) and of pipe classes.

Outside references: the ASME B36.10M-2018 and B36.19M-2018 tables (anchors below), and the
``fluids`` package (fluids.piping, which transcribes B36.10M-2004 and B36.19M-2004) for every row.
"""

from __future__ import annotations

from pathlib import Path

import pytest
from fluids.piping import nearest_pipe, schedule_lookup

import boresize.pipes as pipes
from boresize.errors import CatalogueError, CriteriaFileError, InputError
from boresize.pipes import (
    DEFAULT_PIPE_CLASS,
    NPS_LABELS,
    SCHEDULES,
    Catalogue,
    PipeClass,
    load_catalogue,
    normalise_nps,
    normalise_schedule,
    pipe_class_from_table,
    read_catalogue_file,
    read_catalogue_text,
)

MM = 1e-3
GOOD_HEAD = "# standard: TEST\nnps,od_mm,schedule,wall_mm\n"


# --- anchors -----------------------------------------------------------------------------------------

def test_nps_4_sch_40_anchor() -> None:
    size = load_catalogue().get("4", "40")
    assert size.outside_diameter == pytest.approx(114.3 * MM, abs=1e-7)  # ASME B36.10M-2018 Table 1
    assert size.wall == pytest.approx(6.02 * MM, abs=1e-7)  # ASME B36.10M-2018 Table 1
    assert size.inside_diameter == pytest.approx(102.26 * MM, abs=1e-7)  # 114.3 - 2 x 6.02, B36.10M-2018
    assert size.standard == "ASME B36.10M-2018"


def test_nps_12_sch_40_and_40s_anchors() -> None:
    catalogue = load_catalogue()
    assert catalogue.get("12", "40").wall == pytest.approx(10.31 * MM, abs=1e-7)  # ASME B36.10M-2018 Table 1
    assert catalogue.get("12", "40S").wall == pytest.approx(9.53 * MM, abs=1e-7)  # ASME B36.19M-2018 Table 1
    assert catalogue.get("12", "40S").standard == "ASME B36.19M-2018"


def test_std_and_xs_share_walls_with_schedules_as_the_standard_says() -> None:
    # ASME B36.10M-2018 para. 8 (from memory): STD = Sch 40 up to NPS 10, XS = Sch 80 up to NPS 8;
    # larger STD is 9.53 mm (3/8 in) and larger XS 12.70 mm (1/2 in).
    catalogue = load_catalogue()
    for nps in ("1/8", "1", "4", "10"):
        assert catalogue.get(nps, "STD").wall == catalogue.get(nps, "40").wall
    for nps in ("1/8", "2", "8"):
        assert catalogue.get(nps, "XS").wall == catalogue.get(nps, "80").wall
    for nps in ("12", "24", "48"):
        assert catalogue.get(nps, "STD").wall == pytest.approx(9.53 * MM, abs=1e-7)
        assert catalogue.get(nps, "XS").wall == pytest.approx(12.70 * MM, abs=1e-7)


# --- every row against fluids.piping -----------------------------------------------------------------

def test_every_catalogue_row_matches_fluids() -> None:
    # fluids.piping.nearest_pipe (B36.10M-2004 / B36.19M-2004 tables): OD to 0.1 mm, wall to 0.01 mm.
    mismatches = []
    for size in load_catalogue():
        nps, di, do, t = nearest_pipe(NPS=size.nps_value, schedule=size.schedule)
        if (nps != size.nps_value or abs(do - size.outside_diameter) > 0.1 * MM
                or abs(t - size.wall) > 0.01 * MM or abs(di - size.inside_diameter) > 0.2 * MM):
            mismatches.append((size.nps, size.schedule, size.outside_diameter, size.wall, (nps, do, t)))
    assert mismatches == []


def test_every_fluids_row_is_in_the_catalogue() -> None:
    # The reverse sweep over fluids.piping.schedule_lookup. Its "5" table is left out: B36.10M designates
    # no Schedule 5 (the walls fluids lists there are the B36.19M 5S walls, which the catalogue holds).
    catalogue = load_catalogue()
    absent = []
    for schedule in SCHEDULES:
        nps_list, _, outside, walls = schedule_lookup[schedule]
        for nps, do_mm, t_mm in zip(nps_list, outside, walls):
            label = normalise_nps(float(nps))
            if not catalogue.has(label, schedule):
                absent.append((label, schedule, do_mm, t_mm))
    assert absent == []


def test_sizes_run_from_one_eighth_to_48_and_stainless_to_30() -> None:
    catalogue = load_catalogue()
    assert catalogue.sizes() == NPS_LABELS  # ASME B36.10M-2018 Table 1, NPS 1/8 .. 48
    stainless = {s.nps for s in catalogue if s.standard.startswith("ASME B36.19M")}
    assert max(stainless, key=pipes.nps_value) == "30"  # ASME B36.19M-2018 Table 1 ends at NPS 30
    # ASME B36.10M-2018 lists no Sch 120, 160 or XXS at NPS 3-1/2 (from memory; fluids agrees)
    at_3_5 = catalogue.schedules("3-1/2")
    assert set(at_3_5) == {"5S", "10", "10S", "30", "STD", "40", "40S", "XS", "80", "80S"}
    walls = [catalogue.get("3-1/2", s).wall for s in at_3_5]
    assert walls == sorted(walls)  # thinnest first


# --- load-time validation ----------------------------------------------------------------------------

@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("nps,od_mm,schedule,wall_mm\n1,33.4,40,3.38\n", r"^bad\.csv: no '# standard: NAME' comment line"),
        ("# standard: X\nnps,od,schedule,wall_mm\n1,33.4,40,3.38\n",
         r"^bad\.csv: header should be nps,od_mm,schedule,wall_mm, found nps,od,schedule,wall_mm$"),
        (GOOD_HEAD, r"^bad\.csv: no rows after the header$"),
        (GOOD_HEAD + "1,33.4,40\n", r"^bad\.csv, line 3: 3 cells '1,33.4,40'; expected nps,od_mm,schedule,wall_mm$"),
        (GOOD_HEAD + "1,33.4,40,abc\n", r"^bad\.csv, line 3: wall_mm 'abc' is not a length above zero in mm$"),
        (GOOD_HEAD + "1,33.4,40,0\n", r"^bad\.csv, line 3: wall_mm '0' is not a length above zero in mm$"),
        (GOOD_HEAD + "1,-33.4,40,3.38\n", r"^bad\.csv, line 3: od_mm '-33\.4' is not a length above zero in mm$"),
        (GOOD_HEAD + "1,33.4,40,nan\n", r"^bad\.csv, line 3: wall_mm 'nan' is not a length above zero in mm$"),
        (GOOD_HEAD + "1,33.4,40,16.7\n", r"^bad\.csv, line 3: wall_mm 16\.7 is not less than half of od_mm 33\.4$"),
        (GOOD_HEAD + "1.1,33.4,40,3.38\n", r"^bad\.csv, line 3: nps: unknown NPS '1\.1'; expected one of 1/8"),
        (GOOD_HEAD + "1,33.4,41,3.38\n", r"^bad\.csv, line 3: schedule: unknown schedule '41'; expected one of 10"),
        (GOOD_HEAD + "1,33.4,40,3.38\n1,33.4,Sch 40,3.20\n",
         r"^bad\.csv, line 4: NPS 1 schedule 40 already given at bad\.csv, line 3$"),
        (GOOD_HEAD + "1,33.4,40,3.38\n1,33.5,80,4.55\n",
         r"^bad\.csv, line 4: od_mm 33\.5 for NPS 1 differs from 33\.4 at bad\.csv, line 3$"),
    ],
)
def test_bad_catalogue_text_is_rejected_naming_file_line_and_value(text: str, message: str) -> None:
    with pytest.raises(CatalogueError, match=message):
        read_catalogue_text(text, source="bad.csv")


def test_good_catalogue_text_computes_the_inside_diameter() -> None:
    rows = read_catalogue_text(GOOD_HEAD + "# a comment\n1,33.4,40,3.38  # trailing note\n", source="ok.csv")
    assert rows[0].inside_diameter == pytest.approx(26.64 * MM, abs=1e-9)  # B36.10M-2018: 33.4 - 2 x 3.38
    assert rows[0].standard == "TEST"


def test_catalogue_file_reader(tmp_path: Path) -> None:
    path = tmp_path / "pipes.csv"
    path.write_text(GOOD_HEAD + "2,60.3,40,3.91\n2,60.3,40,3.91\n", encoding="utf-8")
    with pytest.raises(CatalogueError, match=r"pipes\.csv, line 4: NPS 2 schedule 40 already given at .*line 3"):
        read_catalogue_file(path)
    with pytest.raises(CatalogueError, match=r"^cannot read pipe catalogue .*missing\.csv"):
        read_catalogue_file(tmp_path / "missing.csv")


def test_catalogue_rejects_a_row_given_by_two_files() -> None:
    first = read_catalogue_text("# standard: A\n" + GOOD_HEAD.split("\n", 1)[1] + "2,60.3,40,3.91\n")
    second = read_catalogue_text("# standard: B\n" + GOOD_HEAD.split("\n", 1)[1] + "2,60.3,40,3.91\n")
    with pytest.raises(CatalogueError, match=r"^NPS 2 schedule 40 is listed twice \(A and B\)$"):
        Catalogue([*first, *second])


# --- NPS and schedule names ---------------------------------------------------------------------------

@pytest.mark.parametrize(
    ("given", "label"),
    [("1.5", "1-1/2"), (1.5, "1-1/2"), ("1 1/2", "1-1/2"), ("1-1/2", "1-1/2"), ("1½", "1-1/2"),
     ("NPS 2", "2"), ('2"', "2"), (2, "2"), ("0.125", "1/8"), ("1/8", "1/8"), ("¾ in", "3/4"),
     (" 2-1/2 ", "2-1/2"), ("nps3-1/2", "3-1/2"), (48, "48"), ("10.0", "10")],
)
def test_nps_spellings(given: str | float, label: str) -> None:
    # Labels as ASME B36.10M-2018 Table 1 writes NPS (1-1/2, 2-1/2 ...).
    assert normalise_nps(given) == label


@pytest.mark.parametrize("given", ["2.7", 2.7, "7", "1/0", "abc", "", True, None, float("nan")])  # DN spellings: tests/pipes/test_dn.py
def test_unknown_nps_names_the_value_and_lists_the_valid_ones(given: object) -> None:
    pattern = r"^line_nps: unknown NPS .*; expected one of 1/8, 1/4, 3/8, .*, 46, 48$"
    with pytest.raises(InputError, match=pattern) as info:
        normalise_nps(given, field="line_nps")  # type: ignore[arg-type]
    assert info.value.field == "line_nps"
    assert info.value.value is given or info.value.value != info.value.value  # nan is not equal to itself
    assert info.value.expected == "one of " + ", ".join(NPS_LABELS)


def test_unknown_nps_message_quotes_the_text() -> None:
    with pytest.raises(InputError, match=r"^nps: unknown NPS '2\.7'; expected one of 1/8, "):
        normalise_nps("2.7")


@pytest.mark.parametrize(
    ("given", "name"),
    [("40", "40"), (40, "40"), ("Sch 40", "40"), ("SCH40", "40"), ("sch. 80", "80"), ("40s", "40S"),
     ("Sch 10S", "10S"), ("std", "STD"), ("xs", "XS"), ("XH", "XS"), ("xxh", "XXS"), ("XXS", "XXS"),
     ("Schedule 160", "160"), (80.0, "80")],
)
def test_schedule_spellings(given: str | int, name: str) -> None:
    # Designations as ASME B36.10M-2018 / B36.19M-2018 print them; XH/XXH are the older trade synonyms.
    assert normalise_schedule(given) == name


@pytest.mark.parametrize("given", ["5", "41", "Sch 40X", "heavy", 40.5, True, None])
def test_unknown_schedule_names_the_value_and_lists_the_valid_ones(given: object) -> None:
    with pytest.raises(InputError, match=r"^schedule: unknown schedule .*; expected one of 10, 20, 30, 40, 60"):
        normalise_schedule(given)  # type: ignore[arg-type]


def test_missing_schedule_lists_what_exists_at_that_nps() -> None:
    # ASME B36.10M-2018 Table 1 lists no Sch 40 wall at NPS 22.
    with pytest.raises(CatalogueError, match=r"^no schedule 40 at NPS 22 \(given: nps='22', schedule='Sch 40'\); "
                                             r"schedules at NPS 22: 5S, 10S, 10, 20, STD, 30, XS, 60, 80, "):
        load_catalogue().get("22", "Sch 40")
    assert not load_catalogue().has(22, 40)
    assert load_catalogue().has("1½", "sch 40")


# --- pipe classes ------------------------------------------------------------------------------------

def test_default_class_follows_the_design() -> None:
    cls = DEFAULT_PIPE_CLASS
    assert (cls.name, cls.material, cls.schedule) == ("default", "carbon steel", "40")  # README
    assert cls.roughness == pytest.approx(0.045 * MM)  # commercial steel, common practice (Moody 1944)
    labels = [c.nps for c in cls.candidates()]
    assert not {"1-1/4", "2-1/2", "3-1/2", "5"} & set(labels)  # README: preferred sizes only
    assert labels[0] == "1/2" and labels[-1] == "36"
    DEFAULT_PIPE_CLASS.check()


def test_default_class_candidates_match_fluids_and_are_ordered_by_bore() -> None:
    candidates = DEFAULT_PIPE_CLASS.candidates()
    bores = [c.inside_diameter for c in candidates]
    assert bores == sorted(bores)
    for c in candidates:
        _, di, do, t = nearest_pipe(NPS=c.nps_value, schedule=c.schedule)  # fluids.piping, B36.10M-2004
        assert (c.inside_diameter, c.outside_diameter, c.wall) == pytest.approx((di, do, t), abs=0.01 * MM)
        assert c.pipe_class == "default" and c.roughness == DEFAULT_PIPE_CLASS.roughness
    assert {c.nps: c.schedule for c in candidates if c.schedule != "40"} == {
        "22": "STD", "26": "STD", "28": "STD", "30": "STD"}  # B36.10M-2018 lists no Sch 40 there


def test_class_from_table() -> None:
    table = {"material": "carbon steel", "roughness": 0.045, "schedule": {"default": "sch 40", "14": "std"},
             "sizes": ["6", 2, "4", "3", "14"], "min_nps": "3"}
    cls = pipe_class_from_table("CS150", table)
    assert cls.sizes == ("2", "3", "4", "6", "14")
    assert cls.schedule_for("14") == "STD" and cls.schedule_for(6) == "40"
    candidates = cls.candidates()
    assert [(c.nps, c.schedule) for c in candidates] == [("3", "40"), ("4", "40"), ("6", "40"), ("14", "STD")]
    assert candidates[-1].wall == pytest.approx(9.53 * MM, abs=1e-7)  # ASME B36.10M-2018: NPS 14 STD
    assert candidates[0].roughness == pytest.approx(0.045 * MM)
    assert cls.candidate("1-1/4").inside_diameter == pytest.approx(nearest_pipe(NPS=1.25)[1])  # fluids, Sch 40


def test_class_from_table_defaults_to_the_default_sizes() -> None:
    cls = pipe_class_from_table("SS", {"material": "316L", "roughness": 0.015, "schedule": "10S",
                                       "sizes": ["1/2", "1", "2"]})
    assert [c.inside_diameter for c in cls.candidates()] == pytest.approx(
        [nearest_pipe(NPS=n, schedule="10S")[1] for n in (0.5, 1, 2)])  # fluids.piping, B36.19M-2004
    xs = pipe_class_from_table("XS", {"material": "carbon steel", "roughness": 0.045, "schedule": "XS"})
    assert xs.sizes == DEFAULT_PIPE_CLASS.sizes


def test_class_roughness_with_a_unit() -> None:
    pytest.importorskip("boresize.units")
    cls = pipe_class_from_table("CS", {"material": "cs", "roughness": "0.0018 in", "schedule": "40", "sizes": [2]})
    assert cls.roughness == pytest.approx(0.0018 * 25.4e-3)  # 1 in = 25.4 mm exactly (NIST SP 811)
    with pytest.raises(CriteriaFileError, match=r"^pipe_class\.CS\.roughness: '0\.05 m/s' is a velocity"):
        pipe_class_from_table("CS", {"material": "cs", "roughness": "0.05 m/s", "schedule": "40", "sizes": [2]})


@pytest.mark.parametrize(
    ("table", "field", "message"),
    [
        ({"material": "cs", "roughness": 0.045, "schedule": "40", "colour": "red"}, "pipe_class.CS150.colour",
         r"unknown key 'colour'; expected one of material, roughness, schedule, sizes, min_nps"),
        ({"material": "cs", "schedule": "40"}, "pipe_class.CS150.roughness", r"missing key 'roughness'"),
        ({"material": "cs", "roughness": 0.045, "schedule": "40S", "sizes": ["2", "26"]},
         "pipe_class.CS150.schedule", r"pipe class 'CS150' has no schedule 40S at NPS 26; expected one of 10, STD, "),
        ({"material": "cs", "roughness": 0.045, "schedule": {"default": "40", "22": "40S"}},
         "pipe_class.CS150.schedule.22",
         r"pipe class 'CS150' has no schedule 40S at NPS 22; expected one of 5S, 10S, 10, 20, STD"),
        ({"material": "cs", "roughness": 0.045, "schedule": "40", "sizes": ["2", "2.7"]},
         "pipe_class.CS150.sizes", r"unknown NPS '2\.7'; expected one of 1/8"),
        ({"material": "cs", "roughness": 0.045, "schedule": "40"}, "pipe_class.CS150.schedule",
         r"pipe class 'CS150' has no schedule 40 at NPS 22; expected one of .* at NPS 22 \(list the sizes, or "
         r"override it: schedule = \{ default = \"40\", \"22\" = \"STD\" \}\)$"),  # default sizes, B36.10M
        ({"material": "cs", "roughness": 0.045, "schedule": "41"}, "pipe_class.CS150.schedule",
         r"unknown schedule '41'; expected one of 10, 20"),
        ({"material": "cs", "roughness": 0.045, "schedule": {"14": "STD"}}, "pipe_class.CS150.schedule",
         r"the schedule table has no 'default'"),
        ({"material": "cs", "roughness": 45, "schedule": "40"}, "pipe_class.CS150.roughness",
         r"roughness 45 mm is out of range; expected an absolute roughness from 0 to 10 mm"),
        ({"material": "cs", "roughness": True, "schedule": "40"}, "pipe_class.CS150.roughness",
         r"roughness must be a number in mm or a length with its unit"),
        ({"material": "", "roughness": 0.045, "schedule": "40"}, "pipe_class.CS150.material",
         r"material must be a non-empty text"),
        ({"material": "cs", "roughness": 0.045, "schedule": "40", "sizes": "2"}, "pipe_class.CS150.sizes",
         r"sizes must be a non-empty list of NPS"),
        ({"material": "cs", "roughness": 0.045, "schedule": "40", "sizes": ["2", 2.0]}, "pipe_class.CS150.sizes",
         r"NPS 2 is listed more than once"),
        ({"material": "cs", "roughness": 0.045, "schedule": "40", "sizes": ["2", "3"], "min_nps": "4"},
         "pipe_class.CS150.min_nps", r"min_nps 4 is above every size of the class"),
    ],
)
def test_bad_class_tables(table: dict[str, object], field: str, message: str) -> None:
    with pytest.raises(CriteriaFileError, match=f"^{field.replace('.', r'[.]')}: {message}") as info:
        pipe_class_from_table("CS150", table)
    assert info.value.field == field


def test_class_table_must_be_a_table() -> None:
    with pytest.raises(CriteriaFileError, match=r"^pipe_class\.X: a pipe class must be a table; expected a table"):
        pipe_class_from_table("X", "40")  # type: ignore[arg-type]


def test_class_in_code_with_a_missing_wall_fails_check() -> None:
    cls = PipeClass(name="thin", material="cs", roughness=0.045e-3, schedule="10S", sizes=("1/4", "26"))
    with pytest.raises(CatalogueError, match=r"^pipe class 'thin': no schedule 10S at NPS 26; schedules at NPS 26: "
                                             r"10, STD, 20, XS$"):
        cls.check()
    with pytest.raises(CatalogueError, match=r"no schedule 10S at NPS 26"):
        cls.candidates()


def test_public_names() -> None:
    assert sorted(pipes.__all__) == sorted(set(pipes.__all__))
    for name in pipes.__all__:
        assert hasattr(pipes, name), name
