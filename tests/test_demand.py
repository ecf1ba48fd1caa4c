"""Demand orchestration on hand-built bays: tributary loads, the load path
infill → girder → column, combinations, overrides and the failure cases.

Hand checks use simple-span statics (AISC Manual Table 3-23 cases 1 and 9,
from memory): R = wL/2, M = wL²/8, and M = Pa under equal loads at the third
points; ASCE 7-16 §2.3.1 / §2.4.1 for the combinations.
"""

from __future__ import annotations

from pathlib import Path

import pytest
from builders import (
    E_STEEL,
    FT,
    IN,
    LBF,
    PSF,
    G,
    bay_30ft,
    beam,
    column,
    framing,
    model,
    slab,
    w_section,
)
from shapely.geometry import box

from ifccheck.check import check_beams
from ifccheck.config import Settings, settings_from_dict
from ifccheck.design import get_standard
from ifccheck.errors import DemandFileError
from ifccheck.loads.combinations import LIVE_DEFLECTION, TOTAL_DEFLECTION
from ifccheck.loads.demand import AnalysisDemand, compute_demand, load_demand_csv
from ifccheck.reasons import NotChecked
from ifccheck.results import DemandOut

L = 30 * FT
SPACING = 10 * FT
T = 0.14  # m, slab thickness of the bay
RHO_C = 2400.0  # kg/m³, default concrete density
RHO_S = 7850.0  # kg/m³, steel
SDL = 2872.8  # Pa, default superimposed dead (60 psf)
LIVE = 4788.0  # Pa, default live (100 psf)


def infill_line_loads() -> tuple[float, float]:
    """(D, L) in N/m on an infill beam of the bay: 10 ft of floor."""
    steel = w_section("W16X26").A * RHO_S * G
    dead = steel + (SDL + T * RHO_C * G) * SPACING
    return dead, LIVE * SPACING


def test_infill_loads_and_reactions() -> None:
    m, fr = bay_30ft()
    r = compute_demand(m, fr, Settings())
    b1 = r.beams["B1"]
    assert b1.reason is None and b1.source == "computed" and b1.role == "deck"
    assert b1.tributary_left == pytest.approx(5 * FT) and b1.tributary_right == pytest.approx(
        5 * FT
    )
    by_source = {x.source: x for x in b1.line_loads}
    assert by_source["steel self-weight"].w == pytest.approx(7.68 * IN**2 * RHO_S * G)
    assert by_source["superimposed dead"].w == pytest.approx(SDL * SPACING)
    assert by_source["slab self-weight S1"].w == pytest.approx(T * RHO_C * G * SPACING)
    assert by_source["live"].w == pytest.approx(LIVE * SPACING) and by_source["live"].case == "L"
    wd, wl = infill_line_loads()
    for s in b1.supports:  # Table 3-23 case 1: R = wL/2
        assert s.reactions["D"] == pytest.approx(wd * L / 2, rel=1e-9)
        assert s.reactions["L"] == pytest.approx(wl * L / 2, rel=1e-9)
    # 1.2D + 1.6L governs an ordinary floor (ASCE 7-16 §2.3.1 (2)); M = wL²/8
    assert b1.governing_moment == "1.2D+1.6L"
    assert b1.max_moment == pytest.approx((1.2 * wd + 1.6 * wl) * L**2 / 8, rel=1e-9)
    assert b1.max_shear == pytest.approx((1.2 * wd + 1.6 * wl) * L / 2, rel=1e-9)


def test_girder_point_loads_are_the_infill_reactions() -> None:
    m, fr = bay_30ft()
    r = compute_demand(m, fr, Settings())
    g1 = r.beams["G1"]
    assert g1.role == "girder"
    assert [x.source for x in g1.line_loads] == ["steel self-weight"]
    wd, wl = infill_line_loads()
    loads = sorted((p.station, p.case, p.P, p.source) for p in g1.point_loads)
    assert [(round(s / FT, 6), c, src) for s, c, _, src in loads] == [
        (10.0, "D", "B1"), (10.0, "L", "B1"), (20.0, "D", "B2"), (20.0, "L", "B2"),
    ]  # fmt: skip
    for _, case, P, _ in loads:
        assert P == pytest.approx((wd if case == "D" else wl) * L / 2, rel=1e-9)
    # Table 3-23 case 9 plus case 1: M = Pa + wL²/8 at midspan, a = L/3
    w_g = w_section("W24X55").A * RHO_S * G
    P = 1.2 * wd * L / 2 + 1.6 * wl * L / 2
    assert g1.governing_moment == "1.2D+1.6L"
    assert g1.max_moment == pytest.approx(P * L / 3 + 1.2 * w_g * L**2 / 8, rel=1e-9)
    assert g1.max_shear == pytest.approx(P + 1.2 * w_g * L / 2, rel=1e-9)


def test_asd_names_its_combination() -> None:
    m, fr = bay_30ft()
    r = compute_demand(m, fr, settings_from_dict({"design": {"method": "ASD"}}))
    wd, wl = infill_line_loads()
    b1 = r.beams["B1"]
    assert r.method == "ASD"
    assert b1.governing_moment == "D+L" and b1.governing_shear == "D+L"  # ASCE 7-16 §2.4.1 (2)
    assert b1.max_moment == pytest.approx((wd + wl) * L**2 / 8, rel=1e-9)


def test_columns_collect_the_whole_bay() -> None:
    m, fr = bay_30ft()
    r = compute_demand(m, fr, Settings())
    steel = sum(mm.section.A * mm.length for mm in m.members if mm.ifc_class == "IfcBeam")
    dead = steel * RHO_S * G + (SDL + T * RHO_C * G) * L * L
    live = LIVE * L * L
    cols = r.support_reactions
    assert set(cols) == {"C0", "C1", "C2", "C3"}
    assert sum(c["D"] for c in cols.values()) == pytest.approx(dead, rel=1e-9)
    assert sum(c["L"] for c in cols.values()) == pytest.approx(live, rel=1e-9)
    # symmetric bay: each column a quarter
    assert cols["C0"]["L"] == pytest.approx(live / 4, rel=1e-9)


def test_opening_reduces_the_load_on_its_beams() -> None:
    hole = box(11 * FT, 10 * FT, 14 * FT, 16 * FT)  # 18 ft² inside B1's strip
    m, fr = bay_30ft(opening=hole)
    r = compute_demand(m, fr, Settings())
    _, wl = infill_line_loads()
    full_live = wl * L
    b1 = r.beams["B1"]
    live = sum(s.reactions["L"] for s in b1.supports)
    assert live == pytest.approx(full_live - LIVE * 18 * FT**2, rel=1e-9)
    assert len([x for x in b1.line_loads if x.case == "L"]) == 3  # partial loads
    # and the girders see the smaller reactions
    from_b1 = sum(p.P for g in ("G1", "G2") for p in r.beams[g].point_loads
                  if p.source == "B1" and p.case == "L")  # fmt: skip
    assert from_b1 == pytest.approx(live, rel=1e-12)
    assert sum(s.reactions["L"] for s in r.beams["B2"].supports) == pytest.approx(full_live)


def test_deflections_by_case() -> None:
    m, fr = bay_30ft()
    r = compute_demand(m, fr, Settings())
    wd, wl = infill_line_loads()
    EI = E_STEEL * 301 * IN**4  # W16X26 Ix = 301 in⁴ (AISC Shapes Database v16.0)
    b1 = r.beams["B1"]
    # Table 3-23 case 1: Δ = 5wL⁴/384EI at midspan
    assert b1.diagram(LIVE_DEFLECTION).deflection_at(L / 2) == pytest.approx(
        5 * wl * L**4 / (384 * EI), rel=1e-9
    )
    assert b1.diagram(TOTAL_DEFLECTION).deflection_at(L / 2) == pytest.approx(
        5 * (wd + wl) * L**4 / (384 * EI), rel=1e-9
    )
    assert b1.spans == [(0.0, pytest.approx(L), "span")]
    assert b1.diagram("1.4D").max_moment == pytest.approx(1.4 * wd * L**2 / 8, rel=1e-9)


def test_to_output_summary() -> None:
    m, fr = bay_30ft()
    out = compute_demand(m, fr, Settings()).beams["G1"].to_output()
    assert isinstance(out, DemandOut)
    assert out.source == "computed" and out.moment_combination == "1.2D+1.6L"
    assert {p.source for p in out.point_loads} == {"B1", "B2"}
    assert len(out.reactions["D"]) == 2


def test_bay_through_the_framing_stage() -> None:
    framing_stage = pytest.importorskip("ifccheck.framing")
    m, hand = bay_30ft()
    fr = framing_stage.analyse_framing(m)
    by_stage = compute_demand(m, fr, Settings())
    by_hand = compute_demand(m, hand, Settings())
    for g in ("B1", "B2", "G1", "G2", "E1", "E2"):
        assert by_stage.beams[g].reason is None
        assert by_stage.beams[g].max_moment == pytest.approx(by_hand.beams[g].max_moment, rel=1e-6)


# -- demand from an analysis -------------------------------------------------------------


def write(tmp_path: Path, text: str) -> Path:
    p = tmp_path / "demand.csv"
    p.write_text(text, encoding="utf-8")
    return p


def test_override_from_csv(tmp_path: Path) -> None:
    p = write(tmp_path, "guid,moment (kip-ft),shear [kip]\nB1,250,-30\nG1,400,\nNOPE,1,1\n")
    demand = load_demand_csv(p)
    kipft, kip = 1e3 * LBF * FT, 1e3 * LBF
    b1_given = demand["B1"]  # `moment`: a magnitude without its sign
    assert not b1_given.signed and b1_given.sagging == b1_given.hogging
    assert b1_given.peak == pytest.approx(250 * kipft) and b1_given.shear == pytest.approx(30 * kip)
    assert demand["G1"].peak == pytest.approx(400 * kipft) and demand["G1"].shear is None
    m, fr = bay_30ft()
    r = compute_demand(m, fr, Settings(), overrides=demand)
    b1, g1 = r.beams["B1"], r.beams["G1"]
    assert b1.source == "analysis" and b1.governing_moment == "analysis"
    assert b1.max_moment == pytest.approx(250 * kipft) and b1.max_shear == pytest.approx(30 * kip)
    # no shear given: the computed shear stays
    assert g1.max_moment == pytest.approx(400 * kipft) and g1.governing_shear == "1.2D+1.6L"
    assert [w for w in r.warnings if w[0] == "NOPE"] == [
        ("NOPE", "the demand file names NOPE, which is no floor beam of the model")
    ]
    assert r.beams["B2"].source == "computed"
    # the check keeps the computed shape (for Cb) scaled to the analysis peak
    members = {mm.guid: mm for mm in m.members}
    (out,) = check_beams(
        [(members["B1"], fr.members["B1"], b1)], get_standard("AISC 360-16"), Settings()
    )
    d = out.diagram
    moment = dict(zip(d.stations, d.moment, strict=True))
    assert max(d.moment) == pytest.approx(250 * kipft)
    L = 30 * FT
    assert moment[min(moment, key=lambda x: abs(x - L / 4))] / max(d.moment) == pytest.approx(
        0.75, abs=2e-3
    )  # the wx(L - x)/2 shape of the uniform load, sampled at 161 stations


def test_csv_units_in_cells(tmp_path: Path) -> None:
    p = write(tmp_path, "GUID,Moment,Shear\nB1,339 kN*m,120 kN\nB2,250 kip-ft,\n")
    d = load_demand_csv(p)
    assert (d["B1"].peak, d["B1"].shear) == (pytest.approx(339e3), pytest.approx(120e3))
    assert d["B2"].peak == pytest.approx(250e3 * LBF * FT)


def test_signed_and_split_moment_columns(tmp_path: Path) -> None:
    p = write(tmp_path, "guid,moment_pos (kN*m),moment_neg (kN*m),cb\nB1,120,45,1.3\nB2,80,,\n")
    d = load_demand_csv(p)
    assert (d["B1"].sagging, d["B1"].hogging, d["B1"].cb) == (120e3, 45e3, 1.3)
    assert d["B1"].signed and (d["B2"].sagging, d["B2"].hogging) == (80e3, 0.0)
    p = write(tmp_path, "guid,moment_signed (kN*m)\nB1,-60\nB2,75\n")
    d = load_demand_csv(p)
    assert (d["B1"].sagging, d["B1"].hogging) == (0.0, 60e3)  # negative: hogging
    assert (d["B2"].sagging, d["B2"].hogging) == (75e3, 0.0)


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("guid,shear (kN)\nB1,3\n", "no moment column"),
        ("guid,moment (kN*m),moment_pos (kN*m)\nB1,3,4\n", "one kind of moment column"),
        ("guid,moment_pos (kN*m),cb\nB1,3,5\n", "cb 5 is outside 1.0 to 3.0"),
        ("moment (kN*m)\n3\n", "no 'guid' column"),
        ("guid,moment (psf)\nB1,3\n", "column 'moment': 'psf' is not a moment unit"),
        ("guid,moment (kN*m)\nB1,lots\n", "line 2: moment:"),
        ("guid,moment\nB1,250\n", "line 2: moment: '250' has no units"),
        ("guid,moment (kN*m)\nB1,\n", "line 2: empty moment"),
        ("guid,moment (kN*m)\nB1,3\nB1,4\n", "line 3: B1 appears twice"),
        ("guid,moment (kN*m)\n,3\n", "line 2: empty guid"),
        ("", "empty"),
    ],
)
def test_bad_demand_files(tmp_path: Path, text: str, message: str) -> None:
    with pytest.raises(DemandFileError) as e:
        load_demand_csv(write(tmp_path, text))
    assert message in str(e.value)
    assert "\n" not in str(e.value)


def test_missing_demand_file(tmp_path: Path) -> None:
    with pytest.raises(DemandFileError, match="no such file"):
        load_demand_csv(tmp_path / "none.csv")


# -- load paths that cannot be followed ------------------------------------------------


# the small floor has no slab: its level is declared to carry none, so that its beams
# are computed on their self-weight (ASCE 7-16 §2.3.1 combination 1, 1.4D)
NO_FLOOR = settings_from_dict({"loads": {"storeys": {"L2": {"floor": False}}}})


def small_floor():
    """Beam N on girder H (on columns); A and K bear on each other (a cycle);
    U bears on nothing; S has a single support (a cantilever)."""
    members = [
        column("C0", 0, 0), column("C1", 6, 0), column("C2", 0, 20), column("C3", 6, 20),
        beam("H", (0, 0), (6, 0), "W24X55"),
        beam("N", (3, 0), (3, 6), "W16X26"),
        beam("A", (0, 20), (6, 20), "W16X26"),
        beam("K", (3, 20), (3, 14), "W16X26"),
        beam("U", (20, 0), (26, 0), "W16X26"),
        beam("S", (0, 30), (3, 30), "W16X26"),
    ]  # fmt: skip
    fr = framing(
        {
            "H": [(0.0, "C0", "IfcColumn", "start"), (6.0, "C1", "IfcColumn", "end")],
            "N": [(0.0, "H", "IfcBeam", "start"), (6.0, "C9", "IfcColumn", "end")],
            "A": [(0.0, "C2", "IfcColumn", "start"), (3.0, "K", "IfcBeam", None)],
            "K": [(0.0, "A", "IfcBeam", "start"), (6.0, "C3", "IfcColumn", "end")],
            "U": [],
            "S": [(0.0, "C9", "IfcColumn", "start")],
        },
        order=["N", "H", "A", "K", "U", "S"],
    )
    return model(members, []), fr


def test_cycle_and_unsupported_beams_are_reported_and_the_rest_computed() -> None:
    m, fr = small_floor()
    r = compute_demand(m, fr, NO_FLOOR)
    for g in ("A", "K"):
        assert r.beams[g].reason.code is NotChecked.LOAD_PATH_CYCLE
        assert r.beams[g].analysis is None
    assert [set(c) for c in fr.cycles] == [{"A", "K"}]  # found once, by the framing graph
    assert r.beams["A"].reason.text.startswith("load-path cycle A → K → A")
    assert not any("cycle" in msg for _, msg in r.warnings)  # the graph warns, not demand
    assert r.beams["U"].reason.code is NotChecked.UNSUPPORTED
    assert r.beams["S"].reason.code is NotChecked.UNSTABLE
    assert r.beams["S"].reason.text.startswith("unstable: 1 support")
    assert "cantilever" in r.beams["S"].reason.text
    # N and H are computed; N's reaction reaches H at H's station 3 m (projection)
    assert r.beams["N"].reason is None and r.beams["H"].reason is None
    (p_d,) = [p for p in r.beams["H"].point_loads if p.case == "D"]
    assert p_d.source == "N" and p_d.station == pytest.approx(3.0)
    assert p_d.P == pytest.approx(r.beams["N"].supports[0].reactions["D"])


def test_beam_outside_the_framing_analysis() -> None:
    m, fr = small_floor()
    del fr.members["N"]
    r = compute_demand(m, fr, NO_FLOOR)
    assert r.beams["N"].reason.code is NotChecked.NOT_IN_FRAMING
    assert r.beams["H"].point_loads == []


def test_override_gives_demand_to_a_beam_that_could_not_be_computed() -> None:
    m, fr = small_floor()
    given = {"U": AnalysisDemand(5e4, 5e4, 2e4, signed=False)}
    r = compute_demand(m, fr, Settings(), overrides=given)
    u = r.beams["U"]
    assert u.reason is None and u.source == "analysis" and u.max_moment == 5e4
    assert any("analysis demand used" in n for n in u.notes)


def test_continuous_beam_over_a_column() -> None:
    # a two-span beam over a middle column, 10 ft of floor on each side:
    # Table 3-23 case 29 reactions 3wL/8, 10wL/8, 3wL/8 for span L
    span = 20 * FT
    members = [
        *(column(f"C{i}", i * span, 0) for i in range(3)),
        *(beam(f"P{j}", (0, y), (2 * span, y), "W16X26") for j, y in enumerate((-SPACING, 0,
                                                                                SPACING))),
    ]  # fmt: skip
    sl = slab("S", box(0, -1.5 * SPACING, 2 * span, 1.5 * SPACING))
    sup = [(0.0, "C0", "IfcColumn", "start"), (span, "C1", "IfcColumn", None),
           (2 * span, "C2", "IfcColumn", "end")]  # fmt: skip
    fr = framing({"P0": sup, "P1": sup, "P2": sup})
    r = compute_demand(model(members, [sl]), fr, Settings())
    p1 = r.beams["P1"]
    wl = LIVE * SPACING
    assert [s.reactions["L"] for s in p1.supports] == pytest.approx(
        [3 * wl * span / 8, 10 * wl * span / 8, 3 * wl * span / 8], rel=1e-9
    )
    assert p1.diagram("L").moment_at(span) == pytest.approx(-wl * span**2 / 8, rel=1e-9)


def test_end_at_a_column_girder_joint_goes_to_the_column() -> None:
    m, fr = bay_30ft()
    # E1's start also touches G1's end region: the framing lists both
    fr.members["E1"].supports.append(
        type(fr.members["E1"].supports[0])(0.0, "G1", "IfcBeam", "start")
    )
    r = compute_demand(m, fr, Settings())
    e1 = r.beams["E1"]
    assert {p.source for p in r.beams["G1"].point_loads} == {"B1", "B2"}
    assert any("the reaction goes to C0" in n for n in e1.notes)


def test_storey_loads_override_defaults() -> None:
    m, fr = bay_30ft()
    s = settings_from_dict({"loads": {"storeys": {"L2": {"live": "125 psf", "dead": "0 psf"}}}})
    b1 = compute_demand(m, fr, s).beams["B1"]
    live = [x.w for x in b1.line_loads if x.case == "L"]
    assert live == [pytest.approx(125 * PSF * SPACING)]
    assert "superimposed dead" not in {x.source for x in b1.line_loads}


# -- partial live loading (ASCE 7-16 §4.3.3) --------------------------------------


def test_live_patterns_cover_every_proper_subset_up_to_four_regions():
    from ifccheck.loads.combinations import live_patterns

    assert live_patterns(1) == []
    assert sorted(live_patterns(2)) == [(0,), (1,)]
    assert len(live_patterns(4)) == 2**4 - 2
    many = live_patterns(6)
    assert (0, 2, 4) in many and (1, 3, 5) in many and (2, 3) in many


def test_overhanging_beam_live_load_on_one_region_at_a_time():
    # AISC Manual Table 3-23 (from memory): uniform load on the backspan only of
    # an overhanging beam gives the simple-span wL²/8; on the overhang only,
    # the hogging moment at the support is w·a²/2.
    import numpy as np

    from ifccheck.loads.demand import _live_by_region, region_labels
    from ifccheck.loads.statics import BeamProblem, LineLoad, analyse_beams, spans_of

    span, a, w = 9.144, 2.438, 10_000.0
    length = span + a
    regions = spans_of(np.array([0.0, span]), length)
    assert region_labels(regions) == ["span 1", "overhang"]
    cases = _live_by_region([LineLoad(w, 0.0, length)], [], regions)
    (res,) = analyse_beams([BeamProblem(length, [0.0, span], cases, EI=1e8)])
    back = res.combine({"L@0": 1.0})
    over = res.combine({"L@1": 1.0})
    assert float(np.max(back.M)) == pytest.approx(w * span**2 / 8, rel=1e-6)
    assert float(np.min(over.M)) == pytest.approx(-w * a**2 / 2, rel=1e-6)
    both = res.combine({"L@0": 1.0, "L@1": 1.0})
    assert float(np.max(both.M)) < float(np.max(back.M))  # the pattern governs sagging
