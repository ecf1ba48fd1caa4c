"""Source: ASCE/SEI 7-16, *Minimum Design Loads and Associated Criteria for Buildings and
Other Structures*, American Society of Civil Engineers, Reston, VA, 2017.

Live load reduction, ASCE 7-16 §4.7 (quoted from memory).

Eq. 4.7-1: L = L0 (0.25 + 15/√(K_LL·A_T)), A_T in ft², where K_LL·A_T ≥ 400 ft²; not
below 0.50 L0 for members supporting one floor, 0.40 L0 for two or more (§4.7.2);
K_LL from Table 4.7-1 (interior beams and edge beams without cantilever slabs 2, edge
beams with cantilever slabs and cantilever beams 1); none for L0 > 100 psf (§4.7.3),
assembly uses (§4.7.5) or roofs. The floor models are written with ifcopenshell's
entity API; their areas and reactions are statics by construction.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import settings_from_dict
from ifccheck.ifc.author import ModelAuthor
from ifccheck.loads.reduction import (
    KIND_CANTILEVER,
    KIND_EDGE,
    KIND_EDGE_CANTILEVER,
    KIND_INTERIOR,
    beam_kind,
    reduction_factor,
)
from ifccheck.samples.scenario import w_shape

FT = 0.3048
FT2 = FT**2
PSF = 4.4482216152605 / FT**2
KIP_FT = 1355.8179483314004  # N·m
LIVE = 50.0  # psf, invented


def test_eq_4_7_1_on_a_girder_of_900_square_feet():
    # K_LL = 2 (interior girder), A_T = 900 ft²: K_LL·A_T = 1800 ft² ≥ 400 ft²;
    # L/L0 = 0.25 + 15/√1800 = 0.25 + 15/42.43 = 0.25 + 0.3536 = 0.6036 ≥ 0.50
    assert reduction_factor(2.0, 900 * FT2) == pytest.approx(0.25 + 15 / math.sqrt(1800))
    assert reduction_factor(2.0, 900 * FT2) == pytest.approx(0.6036, abs=1e-4)


def test_threshold_and_limits():
    # K_LL·A_T below 400 ft²: no reduction (§4.7.2)
    assert reduction_factor(2.0, 199 * FT2) == 1.0
    assert reduction_factor(1.0, 399 * FT2) == 1.0
    # at 400 ft²: 0.25 + 15/20 = 1.0 exactly
    assert reduction_factor(1.0, 400 * FT2) == pytest.approx(1.0)
    # large areas stop at 0.50 L0 (one floor) and 0.40 L0 (two or more floors)
    assert reduction_factor(2.0, 10_000 * FT2, floors=1) == 0.50
    assert reduction_factor(2.0, 10_000 * FT2, floors=2) == 0.40
    # 0.25 + 15/√(2·2000) = 0.487 is below the one-floor limit, above the two-floor one
    assert reduction_factor(2.0, 2000 * FT2, floors=2) == pytest.approx(0.25 + 15 / math.sqrt(4000))


def test_table_4_7_1_kinds():
    assert beam_kind(False, []) == KIND_INTERIOR
    assert beam_kind(False, [("left", 0.15)]) == KIND_EDGE  # slab edge 6 in past the line
    assert beam_kind(False, [("right", 1.2)]) == KIND_EDGE_CANTILEVER  # 4 ft cantilever slab
    assert beam_kind(True, []) == KIND_CANTILEVER


def floor(tmp: Path, overhang: float = 0.0) -> Path:
    """A 40 ft × 60 ft floor in feet: W24X55 girders along x on y = -30, 0 and 30 ft
    between columns, W16X26 beams on the column lines x = 0 and 40 ft, and W16X26 infill
    at x = 10, 20 and 30 ft spanning 30 ft from each outer girder to the middle one, a
    5.5 in slab over it all; ``overhang`` (ft) runs the slab past the y = -30 ft girder."""
    a = ModelAuthor("IFC4", "foot", project="LLR floor", seed=f"llr-{tmp.name}")
    a.storey("Level 2", 14.0)
    col, girder, beam = w_shape("W12X65"), w_shape("W24X55"), w_shape("W16X26")
    for x in (0.0, 40.0):
        for y in (-30.0, 0.0, 30.0):
            a.column("Level 2", (x, y, -14.0), 14.0, col, key=f"c{x}{y}", name=f"C{x:g}{y:g}")
        for y0 in (-30.0, 0.0):
            a.beam("Level 2", (x, y0, 0.0), (x, y0 + 30, 0.0), beam, key=f"e{x}{y0}",
                   name=f"E{x:g}/{y0:g}", cardinal_point=8)  # fmt: skip
    for y in (-30.0, 0.0, 30.0):
        a.beam("Level 2", (0.0, y, 0.0), (40.0, y, 0.0), girder, key=f"g{y}", name=f"G{y:g}",
               cardinal_point=8)  # fmt: skip
    for x in (10.0, 20.0, 30.0):
        for y0 in (-30.0, 0.0):
            a.beam("Level 2", (x, y0, 0.0), (x, y0 + 30, 0.0), beam, key=f"b{x}{y0}",
                   name=f"B{x:g}/{y0:g}", cardinal_point=8)  # fmt: skip
    o = overhang
    a.slab("Level 2", [(0, -30 - o), (40, -30 - o), (40, 30), (0, 30)], 5.5 / 12, 5.5 / 12,
           key="slab")  # fmt: skip
    return a.write(tmp / "floor.ifc")


def settings(**level: object):
    return settings_from_dict({
        "steel": {"default_grade": "A992"},
        "loads": {"dead": "0 psf", "live": f"{LIVE} psf", "live_reduction": True,
                  "storeys": {"Level 2": level} if level else {}},
    })  # fmt: skip


def test_girder_carrying_900_square_feet_through_its_beams(tmp_path):
    result, _, _ = run_check(floor(tmp_path), settings())
    beams = {b.name: b for b in result.beams}
    g = beams["G0"].demand
    assert g is not None and g.live_reduction is not None
    lr = g.live_reduction
    # the middle girder carries half of each of its six 10 ft × 30 ft infill bays:
    # A_T = 6 × 300 ft² / 2 = 900 ft²; interior (parallel girders on both sides), K_LL = 2
    assert lr.area == pytest.approx(900 * FT2, rel=1e-3)
    assert (lr.k_ll, lr.kind, lr.floors) == (2.0, KIND_INTERIOR, 1)
    assert lr.factor == pytest.approx(0.25 + 15 / math.sqrt(1800), rel=1e-3)  # 0.604
    assert "0.604 L0" in lr.note
    # 15 kip of unreduced live load at 10, 20 and 30 ft along the 40 ft girder (two infill
    # ends of 50 psf × 10 ft × 15 ft each): M_L = 22.5·20 − 15·10 = 300 kip-ft
    live = [p for p in g.point_loads if p.case == "L"]
    assert sorted(round(p.force / 4448.2216, 3) for p in live) == [7.5] * 6
    # the strength check takes 1.2 M_D + 1.6 × 0.604 × M_L; the dead load is the girder's
    # steel and, at each third point, two infill ends of slab and steel over 15 ft
    b = beams["G0"]
    top = max(b.segments, key=lambda s: s.moment_demand)
    assert top.load_combination == "1.2D+1.6L"
    infill_dead = beams["B20/0"].demand
    assert infill_dead is not None
    p_d = 2 * sum(x.intensity for x in infill_dead.line_loads if x.case == "D") * 15 * FT
    steel = sum(x.intensity for x in g.line_loads if x.case == "D")
    m_d = steel * (40 * FT) ** 2 / 8 + (1.5 * p_d * 20 - p_d * 10) * FT
    m_l = 300 * KIP_FT
    assert top.moment_demand == pytest.approx(1.2 * m_d + 1.6 * lr.factor * m_l, rel=2e-3)
    # the infill: A_T = 300 ft², K_LL·A_T = 600 ft²: L/L0 = 0.25 + 15/√600 = 0.862
    infill = beams["B20/0"].demand
    assert infill is not None and infill.live_reduction is not None
    assert infill.live_reduction.factor == pytest.approx(0.25 + 15 / math.sqrt(600), rel=1e-3)
    # the outer girders carry 450 ft² from one side; the slab stops at their line: edge
    # beams without a cantilever slab, K_LL = 2, L/L0 = 0.25 + 15/30 = 0.75
    edge = beams["G-30"].demand
    assert edge is not None and edge.live_reduction is not None
    assert edge.live_reduction.kind == KIND_EDGE
    assert edge.live_reduction.factor == pytest.approx(0.75, rel=1e-3)
    # deflection is computed with the unreduced live load
    assert any("unreduced" in n for n in result.stages[0].notes)


def test_edge_girder_with_a_cantilever_slab_takes_k_ll_1(tmp_path):
    # the slab runs 4 ft past G-30: Table 4.7-1, edge beam with a cantilever slab
    result, _, _ = run_check(floor(tmp_path, overhang=4.0), settings())
    edge = next(b for b in result.beams if b.name == "G-30").demand
    assert edge is not None and edge.live_reduction is not None
    lr = edge.live_reduction
    assert (lr.kind, lr.k_ll) == (KIND_EDGE_CANTILEVER, 1.0)
    # its A_T: 450 ft² through the infill, and the 4 ft × 40 ft overhang it carries itself
    assert lr.area == pytest.approx((450 + 160) * FT2, rel=0.02)
    assert lr.factor == pytest.approx(0.25 + 15 / math.sqrt(lr.area / FT2), rel=1e-3)


@pytest.mark.parametrize(
    "level",
    [
        {"live_reduction": False},  # switched off for the level
        {"assembly": True},  # §4.7.5
        {"live": "125 psf"},  # §4.7.3: L0 over 100 psf
        {"roof": True, "live": "50 psf"},  # a roof (an occupied one): not by §4.7
    ],
)
def test_no_reduction(tmp_path, level):
    result, _, _ = run_check(floor(tmp_path), settings(**level))
    g = next(b for b in result.beams if b.name == "G0")
    assert g.demand is not None and g.demand.live_reduction is None
    assert any(p.case == "L" for p in g.demand.point_loads)


def test_off_by_default(tmp_path):
    s = settings_from_dict({"steel": {"default_grade": "A992"},
                            "loads": {"dead": "0 psf", "live": f"{LIVE} psf"}})  # fmt: skip
    result, _, _ = run_check(floor(tmp_path), s)
    assert all(b.demand is None or b.demand.live_reduction is None for b in result.beams)


def test_partitions_are_live_load_not_reduced(tmp_path):
    # ASCE 7-16 §4.3.2 (from memory): a partition allowance of at least 15 psf, as live load
    s = settings_from_dict({
        "steel": {"default_grade": "A992"},
        "loads": {"dead": "0 psf", "live": f"{LIVE} psf", "live_reduction": True,
                  "partitions": "15 psf"},
    })  # fmt: skip
    result, _, _ = run_check(floor(tmp_path), s)
    b = next(x for x in result.beams if x.name == "B20/0")
    assert b.demand is not None and b.demand.live_reduction is not None
    parts = [x for x in b.demand.line_loads if x.source == "partitions"]
    assert [x.case for x in parts] == ["L"]
    assert parts[0].intensity == pytest.approx(15 * PSF * 10 * FT, rel=1e-6)
    r = b.demand.live_reduction.factor
    # M = (1.6·(r·50 + 15) psf × 10 ft + 1.2 × steel) × L²/8, partitions unreduced
    steel = sum(x.intensity for x in b.demand.line_loads if x.case == "D")
    w = 1.6 * (r * LIVE + 15) * PSF * 10 * FT + 1.2 * steel
    top = max(b.segments, key=lambda s: s.moment_demand)
    assert top.moment_demand == pytest.approx(w * (30 * FT) ** 2 / 8, rel=2e-3)
    rows = {(r_.level, r_.case): r_ for r_ in result.stages[0].load_balance}
    assert rows[("Level 2", "L")].applied == pytest.approx(
        40 * 60 * FT2 * (LIVE + 15) * PSF, rel=1e-3
    )
