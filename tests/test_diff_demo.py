"""`diff` on the two revisions of the demo model finds the bracing revision B drops.

Expected changes are those the invented scenario builds in (ifccheck/samples/
scenario.py): stations by construction, in feet converted to metres.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.diff import diff_results
from ifccheck.results import CauseKind

FT = 0.3048
SAMPLES = Path(__file__).parents[1] / "sample_models"


@pytest.fixture(scope="module")
def revisions():
    settings = load_settings(SAMPLES / "quillfeather.toml")
    a, _, _ = run_check(SAMPLES / "quillfeather-rev-a.ifc", settings)
    b, _, _ = run_check(SAMPLES / "quillfeather-rev-b.ifc", settings)
    return a, b


def test_revision_a_passes(revisions):
    a, _ = revisions
    assert a.summary() == {"pass": 64, "fail": 0, "not_checked": 0, "total": 64}


def test_revision_b_findings(revisions):
    _, b = revisions
    by_name = {x.name: x for x in b.beams}
    assert by_name["L2-B2-20"].outcome == "fail"  # duct shaft through the slab over it
    assert by_name["R-G90-0"].outcome == "fail"  # roof infill deleted
    pulled = by_name["L2-B1-50"]
    assert pulled.outcome == "not_checked" and "support" in pulled.reason.text


def test_diff_names_the_weakened_beams(revisions):
    a, b = revisions
    d = diff_results(a, b)
    names = {x.guid: x.name for x in b.beams}
    assert d.matched == 63
    assert len(d.removed) == 1 and not d.added
    weakened = {c.name: c for c in d.weakened}
    # the two roof infill beams beside the deleted one take its load, and the two Level 2
    # beams beside the one pulled short take its floor: their utilisation rises
    assert set(weakened) == {
        "R-G90-0", "L2-B2-20", "L2-B1-50", "R-B3-7.5", "R-B3-22.5", "L2-B1-40", "L2-E1-60",
    }  # fmt: skip

    roof = weakened["R-G90-0"]  # lost the brace at 15 ft: Lb 7.5 ft → 15 ft
    assert roof.lost_brace_points == pytest.approx([15 * FT], abs=1e-3)
    assert roof.lb_before == pytest.approx(7.5 * FT, abs=1e-3)
    assert roof.lb_after == pytest.approx(15 * FT, abs=1e-3)
    assert roof.outcome_before == "pass" and roof.outcome_after == "fail"

    shaft = weakened["L2-B2-20"]  # 15 ft of slab bracing cut away
    assert shaft.lost_continuous_bracing == pytest.approx(15 * FT, abs=0.02)
    assert shaft.lb_before == pytest.approx(0.0)
    assert shaft.lb_after == pytest.approx(15 * FT, abs=0.02)

    # the girders the pulled-short infill loaded carry its floor through its neighbours
    # now (no load disappears): a girder whose demand still fell did so only because
    # L2-B1-50 no longer reaches it, so it is "changed", never strengthened (issue 10, item 7)
    assert not any(c.name == "L2-G30-30" for c in d.changes)  # within noise, still braced
    c = next(c for c in d.changes if c.name == "L2-G0-30")
    assert c.change == "changed" and not c.lost_brace_points, c.causes
    lost = next(x for x in c.causes if x.kind is CauseKind.DEMAND_FELL_LOST_LOAD)
    assert [names[g] for g in lost.members] == ["L2-B1-50"]
    roof = weakened["R-B3-7.5"]
    assert roof.utilisation_after > roof.utilisation_before
    # R-B3-15 deleted: infill at 7.5 ft spacing carries 7.5 ft, then 3.75 + 7.5 = 11.25 ft
    grew = next(x for x in roof.causes if x.kind is CauseKind.TRIBUTARY_GREW)
    assert (grew.before / FT, grew.after / FT) == pytest.approx((7.5, 11.25), abs=0.01)
    old_names = {x.guid: x.name for x in a.beams}
    assert [old_names[g] for g in grew.members] == ["R-B3-15"]

    pulled = weakened["L2-B1-50"]
    assert pulled.lost_supports and pulled.outcome_after == "not_checked"
    # the support it lost is said once: not again as a lost brace or slab bracing beyond it
    assert not pulled.lost_brace_points and pulled.lost_continuous_bracing == 0.0


def test_geometry_matching_when_guids_are_regenerated(revisions):
    a, b = revisions
    for beam in b.beams:
        beam.guid = "new-" + beam.guid
    d = diff_results(a, b)
    assert d.matched == 62  # the pulled-short beam no longer matches by geometry
    assert all(c.matched_by == "geometry" for c in d.changes)
    assert {"R-G90-0", "L2-B2-20"} <= {c.name for c in d.weakened}
