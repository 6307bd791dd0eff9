"""DN designations (ISO 6708) read as the NPS of ASME B36.10M / B36.19M."""

from __future__ import annotations

import pytest

from boresize.errors import InputError
from boresize.pipes import DEFAULT_PIPE_CLASS, NPS_LABELS, PipeClass, normalise_nps, nps_value
from boresize.pipes.catalogue import DN_BY_NPS


def test_dn_pairs_match_the_fluids_library() -> None:
    """Source: fluids.piping NPSS10 / SS10DN (ASME B36.19M schedule 10S, NPS 1/8 to 30 with their DN)."""
    piping = pytest.importorskip("fluids.piping")
    for nps, dn in zip(piping.NPSS10, piping.SS10DN):
        assert DN_BY_NPS[normalise_nps(nps)] == dn


def test_every_nps_has_a_dn_and_large_sizes_are_25_per_inch() -> None:
    # ASME B36.10M-2018 Table 1: DN 650 = NPS 26 ... DN 1200 = NPS 48
    assert set(DN_BY_NPS) == set(NPS_LABELS)
    assert DN_BY_NPS["26"] == 650 and DN_BY_NPS["48"] == 1200
    assert all(DN_BY_NPS[label] == 25 * nps_value(label) for label in NPS_LABELS if nps_value(label) >= 4)


@pytest.mark.parametrize(("text", "nps"), [
    ("DN 100", "4"), ("DN100", "4"), ("dn 15", "1/2"), ("DN-50", "2"), ("DN 6", "1/8"), ("DN 8", "1/4"),
    ("DN 10", "3/8"), ("DN 32", "1-1/4"), ("DN 90", "3-1/2"), ("DN 550", "22"), ("DN 1200", "48"), (" DN 80 ", "3"),
])
def test_dn_spellings(text: str, nps: str) -> None:
    assert normalise_nps(text) == nps


@pytest.mark.parametrize(("text", "message"), [
    ("DN 105", "DN 105 has no NPS in ASME B36.10M/B36.19M; nearest DN 100 (NPS 4)"),
    ("DN 4", "DN 4 has no NPS in ASME B36.10M/B36.19M; nearest DN 6 (NPS 1/8)"),
    ("DN 2000", "DN 2000 has no NPS in ASME B36.10M/B36.19M; nearest DN 1200 (NPS 48)"),
    ("DN 575", "DN 575 has no NPS in ASME B36.10M/B36.19M; nearest DN 550 (NPS 22) or DN 600 (NPS 24)"),
    ("100 DN", "cannot read '100 DN' as a DN or an NPS"),
    ("100 mm", "cannot read '100 mm' as a DN or an NPS"),
    ("DN 100 mm", "cannot read 'DN 100 mm' as a DN or an NPS"),
    ("DN", "cannot read 'DN' as a DN or an NPS"),
])
def test_dn_refused(text: str, message: str) -> None:
    with pytest.raises(InputError) as caught:
        normalise_nps(text)
    assert caught.value.message == message
    assert caught.value.field == "nps"


def test_pipe_class_sizes_in_dn() -> None:
    pipe_class = PipeClass(name="dn", material="cs", roughness=4.5e-5, schedule="40", sizes=("DN 50", "DN 100", "6"),
                           min_nps="DN 80")
    assert pipe_class.sizes == ("2", "4", "6") and pipe_class.min_nps == "3"
    assert DEFAULT_PIPE_CLASS.candidate("DN 150").nps == "6"
