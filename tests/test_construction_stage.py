"""The construction stage on the demo's Level 2: the steel and the deck alone under the
wet concrete and the construction live load, against the finished building.

Expected values are worked by hand from the invented scenario (ifccheck/samples/
scenario.py: a 5.5 in slab, W21X44 infill at 10 ft centres spanning 30 ft) and the demo
settings (construction live load 20 psf, the deck not fastened before the pour).
Sources: ASCE 37-14 §2.2 (from memory) with ASCE 7-16 §2.3.1 (2), 1.2D + 1.6C; statics
wL²/8 (AISC Manual Table 3-23 case 1, from memory); AISC 360-16 Eq. F1-1 (Cb),
F2-3/F2-4 (elastic LTB) worked here; properties from the AISC Shapes Database v16.0.
"""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.sections.table import lookup

SAMPLES = Path(__file__).parents[1] / "sample_models"
FT, IN = 0.3048, 0.0254
PSF = 4.4482216152605 / FT**2  # Pa per psf (exact)
KSI = 6894757.293168361  # Pa per ksi
G = 9.80665
E, FY = 29000 * KSI, 50 * KSI  # AISC 360-16; A992
CONCRETE, STEEL = 2400.0, 7850.0  # kg/m³, the default densities
SLAB = 5.5 * IN  # the scenario's Level 2 slab
LIVE_C = 20.0 * PSF  # the demo's construction live load
SPAN, SPACING = 30 * FT, 10 * FT


def phi_mn_elastic(name: str, lb: float, cb: float) -> float:
    """φMn by AISC 360-16 F2 where Lb > Lr (elastic LTB), from tabulated properties."""
    s = lookup(name)
    assert s is not None
    jc = s.J / (s.Sx * s.ho)
    lr = 1.95 * s.rts * E / (0.7 * FY) * math.sqrt(jc + math.sqrt(jc**2 + 6.76 * (0.7 * FY / E)
                                                                  ** 2))  # fmt: skip
    assert lb > lr
    fcr = cb * math.pi**2 * E / (lb / s.rts) ** 2 * math.sqrt(1 + 0.078 * jc * (lb / s.rts) ** 2)
    return 0.90 * min(fcr * s.Sx, FY * s.Zx)


@pytest.fixture(scope="module")
def demo():
    settings = load_settings(SAMPLES / "quillfeather.toml")
    result, _, _ = run_check(SAMPLES / "quillfeather-rev-a.ifc", settings)
    return result, {b.name: b for b in result.beams}


def test_infill_governed_by_the_construction_stage_unbraced_over_the_span(demo):
    _, beams = demo
    b = beams["L2-B1-10"]
    s = lookup("W21X44")
    assert s is not None
    # wet concrete 5.5 in × 2400 kg/m³ × g on a 10 ft strip, plus the steel; 20 psf on top
    w_d = SLAB * CONCRETE * G * SPACING + s.A * STEEL * G
    w_c = LIVE_C * SPACING
    construction = b.stage_result("construction")
    assert construction is not None and construction.demand is not None
    loads = construction.demand.line_loads
    assert sum(x.intensity for x in loads if x.case == "D") == pytest.approx(w_d, rel=1e-6)
    assert sum(x.intensity for x in loads if x.case == "C") == pytest.approx(w_c, rel=1e-6)
    assert {x.source for x in loads} >= {"steel self-weight", "construction live"}
    m_u = (1.2 * w_d + 1.6 * w_c) * SPAN**2 / 8  # 1.2D + 1.6C
    cb = 12.5 / (2.5 + 3 * 0.75 + 4 * 1.0 + 3 * 0.75)  # F1-1, uniform load over the span
    phi_mn = phi_mn_elastic("W21X44", SPAN, cb)
    seg = b.segments[construction.governing_segment]
    assert (seg.stage, seg.flange, seg.load_combination) == ("construction", "top", "1.2D+1.6C")
    assert seg.lb == pytest.approx(SPAN, abs=0.01) and not seg.continuous
    assert seg.cb == pytest.approx(cb, rel=2e-3)
    assert seg.moment_demand == pytest.approx(m_u, rel=2e-3)
    assert seg.moment_capacity == pytest.approx(phi_mn, rel=5e-3)
    assert construction.utilisation == pytest.approx(m_u / phi_mn, rel=5e-3)
    assert construction.outcome == "fail"  # about twice its LTB strength
    # in service the slab braces the top flange: Lb = 0, a lower utilisation
    service = b.stage_result("in_service")
    assert service is not None and service.outcome == "pass"
    assert all(x.continuous for x in b.stage_segments("in_service") if x.flange == "top")
    assert b.stage == "construction" and b.outcome == "fail"
    assert b.governing is seg and b.utilisation == construction.utilisation
    assert service.utilisation is not None and service.utilisation < construction.utilisation


def test_girders_and_other_levels(demo):
    result, beams = demo
    # the girders are braced by the infill framing in, in both stages: service governs
    g = beams["L2-G30-0"]
    assert g.stage == "in_service"
    c = g.stage_result("construction")
    assert c is not None and c.governing_segment is not None
    assert g.segments[c.governing_segment].lb == pytest.approx(10 * FT, abs=0.01)
    # no concrete on the roof or the canopy: checked in service only
    assert [s.stage for s in beams["R-B1-7.5"].stages] == ["in_service"]
    assert [s.stage for s in beams["CN-B36"].stages] == ["in_service"]
    assert [s.levels for s in result.stages] == [["Canopy", "Level 2", "Roof"], ["Level 2"]]


def test_construction_totals_by_hand(demo):
    result, beams = demo
    stage = result.stages[1]
    assert (stage.stage, stage.slab_bracing) == ("construction", False)
    assert [c.name for c in stage.combinations] == ["1.4D", "1.2D+1.6C"]
    rows = {(r.level, r.case): r for r in stage.load_balance}
    # revision A's Level 2: the slab 91 ft × 61 ft less the 10 ft × 6 ft stair, and the
    # 8 ft × 8 ft balcony slab (scenario outlines)
    area = (91 * 61 - 10 * 6 + 8 * 8) * FT**2
    steel = sum(
        x.intensity * (x.end - x.start)
        for b in beams.values()
        if b.storey == "Level 2" and (st := b.stage_result("construction")) is not None
        and st.demand is not None
        for x in st.demand.line_loads
        if x.source == "steel self-weight"
    )  # fmt: skip
    assert rows[("Level 2", "C")].applied == pytest.approx(area * LIVE_C, rel=1e-6)
    assert rows[("Level 2", "D")].applied == pytest.approx(
        area * SLAB * CONCRETE * G + steel, rel=1e-6
    )
    for key in (("Level 2", "C"), ("Level 2", "D")):
        assert rows[key].delivered == pytest.approx(rows[key].applied, rel=5e-3)
    wet = [x for x in stage.loads if x.what == "wet concrete"]
    assert wet and all(x.pressure == pytest.approx(SLAB * CONCRETE * G) for x in wet)
    assert any("ASCE 37-14" in n for n in stage.notes)


def test_with_the_deck_fastened_the_infill_is_governed_in_service(tmp_path):
    settings = load_settings(SAMPLES / "quillfeather.toml")
    assert settings.construction is not None
    settings.construction = replace(settings.construction, deck_braces=True)
    result, _, _ = run_check(SAMPLES / "quillfeather-rev-a.ifc", settings)
    b = next(x for x in result.beams if x.name == "L2-B1-10")
    assert b.stage == "in_service" and b.outcome == "pass"
    construction = b.stage_result("construction")
    assert construction is not None and construction.outcome == "pass"
    top = [x for x in b.stage_segments("construction") if x.flange == "top"]
    assert top and all(x.continuous and x.lb == 0.0 for x in top)
    # 1.2D + 1.6C against φMp: well below the in-service 1.2D + 1.6L
    s = lookup("W21X44")
    assert s is not None
    w_d = SLAB * CONCRETE * G * SPACING + s.A * STEEL * G
    m_u = (1.2 * w_d + 1.6 * LIVE_C * SPACING) * SPAN**2 / 8
    assert max(x.moment_demand for x in top) == pytest.approx(m_u, rel=2e-3)
    assert construction.flexure_utilisation == pytest.approx(m_u / (0.9 * FY * s.Zx), rel=5e-3)
    assert result.stages[1].slab_bracing is True
    assert result.summary()["fail"] == 0  # revision A passes once the deck is fastened


def test_slab_bracing_off_is_no_longer_a_construction_stage(tmp_path):
    settings = load_settings(SAMPLES / "quillfeather.toml")
    settings.construction = None
    settings.bracing.slab = False
    result, _, _ = run_check(SAMPLES / "quillfeather-rev-a.ifc", settings)
    assert [s.stage for s in result.stages] == ["in_service"]
    b = next(x for x in result.beams if x.name == "L2-B1-10")
    # in-service loads (1.2D + 1.6L with the 80 psf floor), with no slab bracing
    assert b.governing is not None and b.governing.load_combination == "1.2D+1.6L"
    assert b.governing.lb == pytest.approx(SPAN, abs=0.01)
    girder = next(x for x in result.beams if x.name == "L2-G30-0")  # braced by framing
    assert any("bracing.slab = false" in n for n in girder.notes)
    assert not any("construction stage" in n for n in (*b.notes, *girder.notes))
