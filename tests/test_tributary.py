"""Tributary widths under one-way deck action.

The expected widths are the usual one-way tributary rule (common practice):
each beam the deck spans between takes half the centre-to-centre spacing to
its neighbours on each side, clipped to the slab; girders parallel to the
deck span take no deck load.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import shapely
from builders import FT, bay_30ft, beam, framing, model, slab
from shapely import affinity
from shapely.geometry import box

from ifccheck.config import Settings, settings_from_dict
from ifccheck.framing.types import Framing
from ifccheck.loads.tributary import (
    compute_tributary,
    family_direction,
    find_neighbours,
    plan_families,
)
from ifccheck.model import Member, Model

L = 30 * FT


def on_pins(*beams: Member) -> Framing:
    """A hand-built framing with each beam on a pin at either end (hosts not modelled)."""
    return framing(
        {b.guid: [(0.0, f"P0-{b.guid}", "IfcColumn", "start"),
                  (b.length, f"P1-{b.guid}", "IfcColumn", "end")] for b in beams}
    )  # fmt: skip


def floor_width(tr, station: float) -> float:
    return sum(p.width for p in tr.pieces if p.kind == "floor" and p.start <= station < p.end)


def test_plan_families_wrap_at_180() -> None:
    labels = plan_families(np.array([0.5, 179.8, 90.0, 90.2, 45.0, 359.9]))
    assert labels[0] == labels[1] == labels[5]
    assert labels[2] == labels[3]
    assert len({labels[0], labels[2], labels[4]}) == 3


def test_family_direction_across_zero() -> None:
    assert family_direction(np.array([179.0, 1.0])) % 180 == pytest.approx(0.0, abs=1e-9)
    assert family_direction(np.array([89.0, 91.0])) == pytest.approx(90.0)


def test_find_neighbours_skips_collinear_and_short_overlaps() -> None:
    # rows at n = 0 (two collinear beams), 3 and 6; a stub at n = 1.5 that
    # overlaps the long beams by 0.5 m only
    u0 = np.array([0.0, 5.0, 0.0, 0.0, 9.5])
    u1 = np.array([5.0, 10.0, 10.0, 10.0, 20.0])
    n = np.array([0.0, 0.0, 3.0, 6.0, 1.5])
    nb = find_neighbours(u0, u1, n)
    assert nb.plus[2] == 3 and nb.gap_plus[2] == pytest.approx(3.0)
    assert nb.minus[2] in (0, 1) and nb.gap_minus[2] == pytest.approx(3.0)
    assert nb.plus[0] == 2 and nb.plus[1] == 2  # the collinear neighbour is not one
    assert nb.minus[0] == -1 and np.isinf(nb.gap_minus[0])
    # the stub needs 20 % of its 10.5 m to overlap: 0.5 m is not enough
    assert nb.plus[4] == -1 and nb.minus[4] == -1
    assert nb.minus[3] == 2


def test_bay_infill_takes_10_ft() -> None:
    m, fr = bay_30ft()
    res = compute_tributary(m, Settings(), fr)
    deck = res.deck_spans["L2"]
    assert deck.source == "inferred"
    assert deck.angle == pytest.approx(0.0, abs=1e-9)  # deck spans along x
    assert deck.beam_angle == pytest.approx(90.0)
    assert deck.typical_spacing == pytest.approx(10 * FT)
    for g in ("B1", "B2"):
        tr = res.beams[g]
        assert tr.role == "deck"
        assert tr.left == pytest.approx(5 * FT) and tr.right == pytest.approx(5 * FT)
        assert tr.floor_area == pytest.approx(10 * FT * L)
        slab_pieces = [p for p in tr.pieces if p.kind == "slab"]
        assert slab_pieces and all(p.slab == "S1" for p in slab_pieces)
        assert sum((p.end - p.start) * p.width for p in slab_pieces) == pytest.approx(10 * FT * L)
    # B1, looking from y = 0 to y = 30 ft, has E1 (x = 0) on its left and B2 on its right
    assert res.beams["B1"].left_neighbour == "E1" and res.beams["B1"].right_neighbour == "B2"


def test_bay_edge_beams_and_girders() -> None:
    m, fr = bay_30ft()
    res = compute_tributary(m, Settings(), fr)
    e1, e2 = res.beams["E1"], res.beams["E2"]
    # the slab ends at the column lines: 5 ft inside, nothing outside
    assert e1.floor_area == pytest.approx(5 * FT * L)
    assert sorted((e1.left, e1.right)) == pytest.approx([0.0, 5 * FT])
    assert e2.floor_area == pytest.approx(5 * FT * L)
    assert any("slab edge" in n for n in e1.notes)
    for g in ("G1", "G2"):
        assert res.beams[g].role == "girder" and res.beams[g].pieces == []


def test_slab_opening_reduces_the_strip() -> None:
    # a 3 ft × 6 ft opening inside B1's strip (x 5-15 ft), from y = 10 to 16 ft
    hole = box(11 * FT, 10 * FT, 14 * FT, 16 * FT)
    m, fr = bay_30ft(opening=hole)
    tr = compute_tributary(m, Settings(), fr).beams["B1"]
    assert tr.floor_area == pytest.approx((300 - 18) * FT**2)
    assert floor_width(tr, 5 * FT) == pytest.approx(10 * FT)
    assert floor_width(tr, 13 * FT) == pytest.approx(7 * FT)
    assert floor_width(tr, 20 * FT) == pytest.approx(10 * FT)
    floor = sorted((p.start, p.end) for p in tr.pieces if p.kind == "floor")
    assert [a for a, _ in floor] == pytest.approx([0.0, 10 * FT, 16 * FT])
    # B2's strip (15-25 ft) is untouched
    b2 = compute_tributary(m, Settings(), fr).beams["B2"]
    assert b2.floor_area == pytest.approx(300 * FT**2)


def test_slanted_opening_edge_is_integrated() -> None:
    # a triangular opening in B1's strip: area 0.5 × 4 ft × 8 ft = 16 ft²
    tri = shapely.Polygon([(11 * FT, 10 * FT), (15 * FT, 10 * FT), (15 * FT, 18 * FT)])
    m, fr = bay_30ft(opening=tri)
    tr = compute_tributary(m, Settings(), fr).beams["B1"]
    assert tr.floor_area == pytest.approx((300 - 16) * FT**2, rel=1e-9)
    # the opening is 4 ft wide at y = 10 ft narrowing to 0 at 18 ft: at y = 16.05 ft
    # it takes 4 (1 - 6.05/8) ft off the 10 ft strip (width averaged over a bin)
    assert floor_width(tr, 16.05 * FT) == pytest.approx((10 - 4 * (1 - 6.05 / 8)) * FT, rel=0.01)
    assert floor_width(tr, 5 * FT) == pytest.approx(10 * FT)


def test_storey_override_turns_the_deck() -> None:
    m, fr = bay_30ft()
    s = settings_from_dict({"loads": {"storeys": {"L2": {"deck_span": "y"}}}})
    res = compute_tributary(m, s, fr)
    assert res.deck_spans["L2"].source == "settings"
    assert res.deck_spans["L2"].angle == pytest.approx(90.0)
    assert res.beams["B1"].role == "girder"
    g1 = res.beams["G1"]
    assert g1.role == "deck"
    assert g1.floor_area == pytest.approx(15 * FT * L)  # half of 30 ft inside, edge outside


def test_slab_override_turns_the_deck_on_that_slab() -> None:
    m, fr = bay_30ft()
    s = settings_from_dict({"loads": {"slabs": {"S1": {"deck_span": "90 deg"}}}})
    res = compute_tributary(m, s, fr)
    assert res.deck_spans["L2"].source == "inferred"  # the storey as inferred
    assert res.beams["G1"].role == "deck" and res.beams["B1"].role == "girder"


def test_no_slab_modelled_gives_no_floor_load() -> None:
    # no pass on self-weight alone: without a slab or a declared deck, no floor
    # load is invented from the beam spacing
    m, fr = bay_30ft()
    m.slabs = []
    res = compute_tributary(m, Settings(), fr)
    assert res.deck_spans["L2"].source == "inferred"  # the framing still tells the direction
    assert all(tr.pieces == [] for tr in res.beams.values())


def test_slab_not_bearing_gives_no_load() -> None:
    m, fr = bay_30ft()
    m.slabs[0].underside += 0.5  # half a metre above the steel
    m.slabs[0].top += 0.5
    res = compute_tributary(m, Settings(), fr)
    assert res.beams["B1"].pieces == []
    assert res.floors == []  # the slab bears on no beam: no floor of the framing


def test_topping_on_deck_slab_counts_weight_twice_area_once() -> None:
    m, fr = bay_30ft(slab_thickness=0.06)
    m.slabs.append(slab("T1", box(0, 0, L, L), underside=4.06, thickness=0.08))
    tr = compute_tributary(m, Settings(), fr).beams["B1"]
    assert tr.floor_area == pytest.approx(10 * FT * L)
    weights = {p.slab for p in tr.pieces if p.kind == "slab"}
    assert weights == {"S1", "T1"}


def test_far_neighbour_is_not_a_neighbour() -> None:
    # beams at 0, 10 and 20 ft, and a lone beam 100 ft away: more than three
    # typical spacings, so B3's outer side reaches the slab edge instead
    members = [beam(f"B{i}", (x * FT, 0), (x * FT, L), "W16X26") for i, x in
               enumerate((0, 10, 20, 120))]  # fmt: skip
    s = slab("S", box(-5 * FT, 0, 125 * FT, L))
    res = compute_tributary(model(members, [s]), Settings(), on_pins(*members))
    b2 = res.beams["B2"]
    assert {b2.left_neighbour, b2.right_neighbour} == {"B1", None}
    # its strip: 5 ft toward B1, and out to at most one typical spacing (10 ft) on
    # the open side; the floor beyond the strips (x = 30 to 110 ft) still reaches the
    # nearest beams, B2 and B3, split at the midpoint x = 70 ft to within a 0.5 m cell
    assert b2.left + b2.right == pytest.approx(15 * FT)
    assert b2.floor_area == pytest.approx(55 * FT * L, rel=0.02)
    assert res.beams["B3"].floor_area == pytest.approx(55 * FT * L, rel=0.02)
    # and no floor disappears (conservation, exact by construction)
    total = sum(tr.floor_area for tr in res.beams.values())
    assert total == pytest.approx(s.footprint.area, rel=1e-9)
    assert res.floors[0].delivered == pytest.approx(res.floors[0].area, rel=1e-9)


def rotated(m: Model, degrees: float) -> Model:
    c, s = math.cos(math.radians(degrees)), math.sin(math.radians(degrees))

    def rot(p):
        return (c * p[0] - s * p[1], s * p[0] + c * p[1], p[2])

    members: list[Member] = []
    for mm in m.members:
        mm.start, mm.end = rot(mm.start), rot(mm.end)
        members.append(mm)
    for sl in m.slabs:
        sl.footprint = affinity.rotate(sl.footprint, degrees, origin=(0, 0))
    return m


def test_skewed_grid_gives_the_same_widths() -> None:
    m, fr = bay_30ft(opening=box(11 * FT, 10 * FT, 14 * FT, 16 * FT))
    res = compute_tributary(rotated(m, 30.0), Settings(), fr)
    assert res.deck_spans["L2"].angle == pytest.approx(30.0)
    assert res.beams["B1"].floor_area == pytest.approx((300 - 18) * FT**2)
    assert res.beams["B2"].floor_area == pytest.approx(300 * FT**2)
    assert res.beams["G1"].role == "girder"
