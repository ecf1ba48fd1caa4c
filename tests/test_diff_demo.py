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


def test_revision_a_passes_in_service(revisions):
    a, _ = revisions
    service, construction = a.stages
    assert service.stage == "in_service"
    assert (service.summary["pass"], service.summary["fail"], service.summary["total"]) == (
        72, 0, 72,
    )  # fmt: skip
    # its failures are all in the construction stage: with the deck not fastened before the
    # pour (the settings' construction.deck_braces = false), nothing braces Level 2's beams
    # between their ends while the concrete is wet; the girders stay braced by the infill
    assert construction.stage == "construction" and construction.levels == ["Level 2"]
    failing = [b for b in a.beams if b.outcome == "fail"]
    assert failing and all(b.stage == "construction" for b in failing)
    assert {b.name for b in failing} == {
        b.name for b in a.beams
        if b.storey == "Level 2" and "-G" not in b.name
    }  # fmt: skip
    assert a.summary() == {"pass": 51, "fail": 21, "not_checked": 0, "total": 72}
    # each checked beam is governed by exactly one stage: 21 by construction, 51 in service
    assert (service.summary["governing"], construction.summary["governing"]) == (51, 21)


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
    assert d.matched == 71
    assert len(d.removed) == 1 and not d.added
    weakened = {c.name: c for c in d.weakened}
    # the two roof infill beams beside the deleted one take its load, and the two Level 2
    # beams beside the one pulled short take its floor: their utilisation rises
    assert set(weakened) == {
        "R-G90-0", "L2-B2-20", "L2-B1-50", "R-B3-7.5", "R-B3-22.5", "L2-B1-40", "L2-E1-60",
    }  # fmt: skip

    shaft_causes = {(x.kind, x.stage) for x in weakened["L2-B2-20"].causes}
    # the slab cut matters in service; during construction nothing braced it anyway
    assert (CauseKind.LB_GREW, "in_service") in shaft_causes
    assert (CauseKind.UTILISATION_ROSE, "in_service") in shaft_causes
    assert not any(stage == "construction" for _kind, stage in shaft_causes)

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
    # now: L2-G30-30 is unchanged in service (within noise, still braced at 50 ft from the
    # other side) and L2-G0-30's demand fell only because L2-B1-50 no longer reaches it:
    # never better
    by_a = {x.name: x for x in a.beams}
    by_b = {x.name: x for x in b.beams}
    in_service = [
        x.stage_result("in_service").utilisation for x in (by_a["L2-G30-30"], by_b["L2-G30-30"])
    ]
    assert in_service[1] == pytest.approx(in_service[0], abs=0.005)
    for name in ("L2-G0-30", "L2-G30-30"):
        girder = next(c for c in d.changes if c.name == name)
        assert girder.change == "changed" and not girder.lost_brace_points
        cause = next(x for x in girder.causes if x.kind is CauseKind.DEMAND_FELL_LOST_LOAD)
        assert [names[g] for g in cause.members] == ["L2-B1-50"]
    assert weakened["R-B3-7.5"].utilisation_after > weakened["R-B3-7.5"].utilisation_before
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


def test_diff_words_name_the_stage_of_each_cause(revisions):
    """A construction-stage change is said as such, and each stage's causes fold with
    their own stage's: L2-B1-40 (tributary 10 ft → 15 ft beside the pulled-short beam)
    rises in both stages, and the two rises are two distinct reasons."""
    from ifccheck.report.display import DisplayUnits
    from ifccheck.report.wording import change_reasons, diff_names

    a, b = revisions
    d = diff_results(a, b)
    du = DisplayUnits("imperial")
    names = diff_names(d)
    beams = {x.guid: x for x in b.beams}
    by_name = {c.name: c for c in d.changes}
    words = change_reasons(by_name["L2-B1-40"], du, names, beams[by_name["L2-B1-40"].guid])
    rises = [w for w in words if "rose from" in w and "utilisation" in w]
    assert len(rises) == 2
    assert "its utilisation in service rose" in rises[0]
    assert "its utilisation during construction rose" in rises[1]
    # the girder's lower demand is never put as an improvement, nor as load gone missing
    girder = change_reasons(by_name["L2-G0-30"], du, names, beams[by_name["L2-G0-30"].guid])
    fell = next(w for w in girder if "no longer reaches it" in w)
    assert "not an improvement" in fell and "nowhere" not in fell
    # the roof girder's lost brace, longer Lb and outcome are each said once
    roof = change_reasons(by_name["R-G90-0"], du, names, beams[by_name["R-G90-0"].guid])
    assert sum("went from pass to fail" in w for w in roof) == 1
    assert sum("lost the brace point" in w for w in roof) == 1


def test_geometry_matching_when_guids_are_regenerated(revisions):
    a, b = revisions
    for beam in b.beams:
        beam.guid = "new-" + beam.guid
    d = diff_results(a, b)
    assert d.matched == 70  # the pulled-short beam no longer matches by geometry
    assert all(c.matched_by == "geometry" for c in d.changes)
    assert {"R-G90-0", "L2-B2-20"} <= {c.name for c in d.weakened}
