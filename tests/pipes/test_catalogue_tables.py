"""Pipe classes over other catalogues: the fluids library's tables (PVC, HDPE, BS 1387) and a user's CSV."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from boresize.cli import main
from boresize.errors import CatalogueError, CriteriaFileError
from boresize.pipes import pipe_class_from_table
from boresize.pipes.catalogue_class import CataloguePipeClass
from boresize.pipes.fluids_tables import BUILTIN_CATALOGUES, builtin_sizes

piping = pytest.importorskip("fluids.piping")


@pytest.mark.parametrize("name", list(BUILTIN_CATALOGUES))
def test_builtin_tables_are_the_fluids_numbers(name: str) -> None:
    """Source: fluids.piping, the lists each catalogue names (mm there, m here): every OD, ID and wall."""
    entry = BUILTIN_CATALOGUES[name]
    expected = sorted(zip(getattr(piping, entry.od), getattr(piping, entry.inside), getattr(piping, entry.wall)),
                      key=lambda row: row[1])
    sizes = builtin_sizes(name)
    assert len(sizes) == len(expected)
    for size, (od, inside, wall) in zip(sizes, expected):
        assert size.outside_diameter == pytest.approx(od * 1e-3, rel=1e-12)
        assert size.inside_diameter == pytest.approx(inside * 1e-3, rel=1e-12)
        assert size.wall == pytest.approx(wall * 1e-3, rel=1e-12)
        assert "via fluids.piping" in size.source


def test_pvc_schedule_40_two_inch_matches_astm_d1785() -> None:
    """ASTM D1785 (from memory): NPS 2 Sch 40 PVC, OD 2.375 in (60.325 mm), minimum wall 0.154 in (3.9116 mm);
    fluids.piping S40o_D1785 / S40t_D1785 hold the same."""
    pvc = pipe_class_from_table("PVC", {"catalogue": "pvc-sch40", "sizes": ["2"]})
    (two,) = pvc.candidates()
    assert (two.nps, two.schedule) == ("2", "40")
    assert two.outside_diameter == pytest.approx(0.060325, abs=1e-9)
    assert two.wall == pytest.approx(0.0039116, abs=1e-9)
    assert two.roughness == pytest.approx(0.0015e-3)  # smooth plastic, common practice (Moody 1944)
    assert pvc.material == "PVC"


def test_bs1387_medium_is_named_by_dn() -> None:
    """BS 1387 medium DN 25: fluids.piping MEDIUMo_BS1387 / MEDIUMt_BS1387 give OD 34.2 mm (the standard's maximum
    OD; from memory, its minimum is 33.3 mm) and wall 3.2 mm."""
    galv = pipe_class_from_table("GALV", {"catalogue": "bs1387-medium", "sizes": ["dn25", "DN 50"]})
    one, two = galv.candidates()
    assert (one.nps, one.schedule, two.nps) == ("DN 25", "medium", "DN 50")
    assert one.outside_diameter == pytest.approx(0.0342) and one.wall == pytest.approx(0.0032)
    assert one.nps_value == 1.0 and one.roughness == pytest.approx(0.15e-3)  # DN 25 = NPS 1 (ISO 6708)


def test_hdpe_sizes_run_past_nps_48_by_their_own_names() -> None:
    """fluids.piping NPSDR21_F2619 ends at NPS 65, beyond the ASME list: kept as written, ordered by bore."""
    hdpe = pipe_class_from_table("PE", {"catalogue": "hdpe-sdr21"})
    names = [c.nps for c in hdpe.candidates()]
    assert names[-1] == "65" and names[0] == "2-1/2"
    bores = [c.inside_diameter for c in hdpe.candidates()]
    assert bores == sorted(bores)


CSV = """\
# PE100 SDR 17 (EN 12201-2 values from memory, for this test only)
size,OD [mm],wall [mm],roughness [mm]
DN 110,110,6.6,0.0015
"160 mm",160,9.5,0.007
DN 90,90,5.4,0.0015
"""


def _class(tmp_path: Path, text: str, **table: object) -> CataloguePipeClass:
    (tmp_path / "cat").mkdir(exist_ok=True)
    (tmp_path / "cat" / "pe.csv").write_text(text, encoding="utf-8")
    made = pipe_class_from_table("PE", {"catalogue": "cat/pe.csv", **table}, tmp_path)
    assert isinstance(made, CataloguePipeClass)
    return made


def test_user_csv_round_trip(tmp_path: Path) -> None:
    pe = _class(tmp_path, CSV, material="PE100")
    found = pe.candidates()
    assert [c.nps for c in found] == ["DN 90", "DN 110", "160 mm"]  # as written, smallest bore first
    assert found[1].inside_diameter == pytest.approx(0.110 - 2 * 0.0066)
    assert found[2].roughness == pytest.approx(0.007e-3)  # the row's own roughness
    assert pe.candidate("dn 110").nps == "DN 110"
    with pytest.raises(CatalogueError, match="has no size '4'"):
        pe.candidate("4")


def test_user_csv_with_inside_diameters_in_inches_and_the_class_roughness(tmp_path: Path) -> None:
    text = "size,OD (in),ID (in),schedule\n4,4.5,4.026,40\n4,4.5,3.826,80\n"  # ASME B36.10M NPS 4 Sch 40 / 80
    pe = _class(tmp_path, text, roughness="0.045 mm", schedule="80", material="steel")
    (four,) = pe.candidates()
    assert four.inside_diameter == pytest.approx(3.826 * 0.0254) and four.roughness == pytest.approx(0.045e-3)
    assert four.nps_value == 4.0


@pytest.mark.parametrize(("text", "words"), [
    ("size,OD,wall [mm]\nDN 110,110,6.6\n", ["line 1, column 2 'OD'", "no length unit"]),
    ("size,OD [yard],wall [mm]\nDN 110,110,6.6\n", ["unknown length unit 'yard'"]),
    ("size,OD [mm],wall [mm]\nDN 110,110,x\n", ["line 2, column 'wall [mm]'", "value 'x'", "positive length"]),
    ("size,OD [mm],wall [mm]\nDN 110,110,55\n", ["line 2, column 'wall [mm]'", "leaves no bore"]),
    ("size,OD [mm],ID [mm]\nDN 110,110,120\n", ["column 'ID [mm]'", "an ID under the OD"]),
    ("size,OD [mm],wall [mm]\nDN 110,110\n", ["line 2: 2 cells, the heading has 3"]),
    ("size,OD [mm],wall [mm]\nDN 110,inf,5\n", ["value 'inf'"]),
    ("size,OD [mm],wall [mm],roughness [mm]\nDN 110,110,5,-1\n", ["column 'roughness [mm]'", "value '-1'"]),
    ("size,OD [mm],wall [mm],ID [mm]\nDN 110,110,5,100\n", ["wall column or an ID column, not both"]),
    ("size,OD [mm]\nDN 110,110\n", ["wall column or an ID column, one of them"]),
    ("size,OD [mm],wall [mm],colour\nDN 110,110,5,red\n", ["column 4 'colour'", "unknown column"]),
    ("size,OD [mm],wall [mm]\nDN 110,110,5\ndn110,110,5\n", ["line 3: size 'dn110' is listed twice"]),
    ("# only a comment\n", ["has no heading"]),
    ("size,OD [mm],wall [mm]\n\"\x1b[31mRED\",110,5\n", ["line 2, column 'size'", "control characters"]),
])
def test_bad_catalogue_cells_are_named(tmp_path: Path, text: str, words: list[str]) -> None:
    with pytest.raises(CriteriaFileError) as caught:
        _class(tmp_path, text, roughness=0.0015)
    message = str(caught.value)
    assert "pe.csv" in message and caught.value.field == "pipe_class.PE.catalogue"
    for word in words:
        assert word in message


@pytest.mark.parametrize(("table", "field", "words"), [
    ({"catalogue": "pvc-sch50"}, "catalogue", "unknown pipe catalogue 'pvc-sch50'"),
    ({"catalogue": 40}, "catalogue", "a built-in name or a CSV file"),
    ({"catalogue": "pvc-sch40", "sizes": ["DN 110"]}, "sizes", "has no size 'DN 110'"),
    ({"catalogue": "pvc-sch40", "sizes": ["2", "2"]}, "sizes", "more than once"),
    ({"catalogue": "pvc-sch40", "sizes": "2"}, "sizes", "a non-empty list"),
    ({"catalogue": "pvc-sch40", "sizes": []}, "sizes", "a non-empty list"),
    ({"catalogue": "pvc-sch40", "schedule": "80"}, "schedule", "no schedule '80'"),
    ({"catalogue": "pvc-sch40", "min_nps": "2"}, "min_nps", "unknown key 'min_nps'"),
    ({"catalogue": "pvc-sch40", "roughness": 50}, "roughness", "out of range"),
    ({"catalogue": "nowhere.csv"}, "catalogue", "cannot read pipe catalogue"),
])
def test_bad_catalogue_classes(table: dict[str, object], field: str, words: str) -> None:
    with pytest.raises(CriteriaFileError) as caught:
        pipe_class_from_table("X", table)
    assert caught.value.field == f"pipe_class.X.{field}" and words in str(caught.value)


def test_a_csv_without_roughness_needs_the_class_to_give_one(tmp_path: Path) -> None:
    with pytest.raises(CriteriaFileError, match="no roughness column"):
        _class(tmp_path, "size,OD [mm],wall [mm]\nDN 110,110,6.6\n")


def test_sizing_with_a_user_catalogue_shows_the_name_as_written(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    (tmp_path / "pe.csv").write_text(CSV, encoding="utf-8")
    (tmp_path / "crit.toml").write_text('[pipe_class.PE]\ncatalogue = "pe.csv"\n[service.water]\nphase = "liquid"\n'
                                        'pipe_class = "PE"\nvelocity = { max = "2 m/s" }\n', encoding="utf-8")
    (tmp_path / "lines.csv").write_text("tag,fluid,service,flow,pressure,temperature\n"
                                        "L1,water,water,50 t/h,5 barg,20 C\n", encoding="utf-8")
    code = main(["size", str(tmp_path / "lines.csv"), "--criteria", str(tmp_path / "crit.toml"), "--json",
                 "--no-plugins"])
    assert code == 0
    line = json.loads(capsys.readouterr().out)["lines"][0]
    # 50 t/h of water (~998 kg/m3) is 13.9 l/s: 2 m/s needs a bore over 94 mm, DN 110 (96.8 mm) is the first
    assert line["nps"] == "DN 110"
    assert main(["pipes", "--criteria", str(tmp_path / "crit.toml"), "--no-plugins"]) == 0
    listing = capsys.readouterr().out
    assert "sizes: DN 90, DN 110, 160 mm" in listing and "hdpe-sdr11" in listing and "BS 1387" in listing


def test_a_catalogue_with_several_schedules_needs_the_class_to_name_one(tmp_path: Path) -> None:
    text = "size,OD [mm],wall [mm],schedule\nDN 110,110,6.6,SDR 17\nDN 110,110,10,SDR 11\n"
    with pytest.raises(CriteriaFileError, match="several schedules; the class names none"):
        _class(tmp_path, text, roughness=0.0015)
    sdr11 = _class(tmp_path, text, roughness=0.0015, schedule="SDR 11")
    assert [(c.nps, c.schedule, round(c.wall * 1e3, 3)) for c in sdr11.candidates()] == [("DN 110", "SDR 11", 10.0)]
