"""Demand from an analysis, and the diff's flange-aware comparison.

Sources: statics by construction (the analysis moment must reach the check
unchanged), and the rule that a brace or slab length lost on either flange is
a loss (DESIGN.md §3, "Compression flange matters").
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import settings_from_dict
from ifccheck.diff import compare_beam
from ifccheck.results import BeamResult, BracePointOut

SAMPLES = Path(__file__).parents[1] / "sample_models"
KIP_FT = 1355.8179483314004  # N·m


@pytest.fixture(scope="module")
def overridden(tmp_path_factory):
    csv = tmp_path_factory.mktemp("demand") / "demand.csv"
    model = SAMPLES / "quillfeather-rev-a.ifc"
    # find two GUIDs by name from a plain run
    settings = settings_from_dict({"loads": {"dead": "20 psf", "live": "0 psf"}})
    plain, _, _ = run_check(model, settings)
    guid = {b.name: b.guid for b in plain.beams}
    csv.write_text(f"guid,moment (kip-ft)\n{guid['L2-E1-30']},200\n{guid['L2-B1-10']},-150\n")
    result, _, _ = run_check(model, settings, csv)
    return {b.name: b for b in result.beams}


def test_analysis_moment_reaches_the_check_unscaled(overridden):
    # with no live load 1.4D governs the computed shape; the analysis value is
    # what must be checked, whatever combination gave the shape
    b = overridden["L2-E1-30"]
    assert max(s.moment_demand for s in b.segments) == pytest.approx(200 * KIP_FT, rel=1e-6)


def test_analysis_moment_checks_both_flanges(overridden):
    # the sign of an analysis moment is not trusted: the bottom flange, braced
    # only at the supports, is checked for |M| too and governs here
    b = overridden["L2-B1-10"]
    flanges = {s.flange for s in b.segments}
    assert flanges == {"top", "bottom"}
    bottom = max((s for s in b.segments if s.flange == "bottom"), key=lambda s: s.utilisation)
    assert bottom.moment_demand == pytest.approx(150 * KIP_FT, rel=1e-6)
    assert bottom.lb == pytest.approx(30 * 0.3048, rel=1e-6)
    assert b.governing.flange == "bottom"


def _beam(points, continuous=()) -> BeamResult:
    return BeamResult(
        guid="b", name="B", storey="L", ifc_class="IfcBeam", profile="W21X44", grade="A992",
        fy=345e6, start=(0.0, 0.0, 0.0), end=(9.0, 0.0, 0.0), length=9.0, span=9.0,
        brace_points=[BracePointOut(s, "brace", "k", f, True) for s, f in points],
        continuous_bracing=list(continuous), outcome="pass", utilisation=0.5,
    )  # fmt: skip


def test_lost_kicker_on_the_bottom_flange_is_found_at_a_station_still_braced_on_top():
    old = _beam([(0.0, "both"), (4.0, "top"), (4.0, "bottom"), (9.0, "both")])
    new = _beam([(0.0, "both"), (4.0, "top"), (9.0, "both")])
    change = compare_beam(old, new, "guid")
    assert change is not None and change.change == "weakened"
    assert change.lost_brace_points == [4.0]


def test_slab_bracing_that_moves_is_a_loss_where_it_left():
    old = _beam([(0.0, "both"), (9.0, "both")], continuous=[(0.0, 6.0)])
    new = replace(old, continuous_bracing=[(3.0, 9.0)])
    change = compare_beam(old, new, "guid")
    assert change is not None and change.change == "weakened"
    assert change.lost_continuous_bracing == pytest.approx(3.0)


@pytest.fixture(scope="module")
def signed(tmp_path_factory):
    """Revision A with analysis demand given by sign (the demo's own loads)."""
    from ifccheck.config import load_settings

    csv = tmp_path_factory.mktemp("signed") / "demand.csv"
    model = SAMPLES / "quillfeather-rev-a.ifc"
    settings = load_settings(SAMPLES / "quillfeather.toml")
    plain, _, _ = run_check(model, settings)
    guid = {b.name: b.guid for b in plain.beams}
    csv.write_text(f"guid,moment_pos (kip-ft),moment_neg (kip-ft)\n{guid['L2-B2-10']},180,\n")
    unsigned = csv.with_name("unsigned.csv")
    unsigned.write_text(f"guid,moment (kip-ft)\n{guid['L2-B2-10']},180\n")
    a, _, _ = run_check(model, settings, csv)
    b, _, _ = run_check(model, settings, unsigned)
    return {x.name: x for x in a.beams}, {x.name: x for x in b.beams}


def test_a_sagging_analysis_moment_loads_only_the_top_flange(signed):
    by_sign, unsigned = signed
    b = by_sign["L2-B2-10"]
    # in service the slab braces the top flange over the whole span: 180 kip-ft sagging only
    service = b.stage_segments("in_service")
    assert {s.flange for s in service} == {"top"}
    assert all(s.continuous for s in service)
    assert max(s.moment_demand for s in service) == pytest.approx(180 * KIP_FT, rel=1e-6)
    assert b.stage_result("in_service").outcome == "pass"
    # the analysis is of the finished building: the construction stage keeps its own loads
    assert all(s.load_combination != "analysis" for s in b.stage_segments("construction"))
    # given without its sign, the unbraced bottom flange (Lb = 30 ft) is checked for it too
    u = unsigned["L2-B2-10"]
    bottom = [s for s in u.stage_segments("in_service") if s.flange == "bottom"]
    assert bottom and bottom[0].lb == pytest.approx(30 * 0.3048, rel=1e-6)
    assert u.utilisation > b.utilisation
    assert any("without its sign" in n for n in u.notes)
