"""Line and point loads from the settings, and roof live load, snow and wind on a roof:
each reaches the load path, the reactions and the load balance like a floor load.

The bay (tests/builders.py) is 30 ft × 30 ft: W24X55 girders G1 (y = 0) and G2
(y = 30 ft) between columns, W16X26 beams E1, E2 on the other column lines, infill B1,
B2 at the girders' third points. Sources: statics by construction (reactions of a
simple span: wL/2, P·b/L); ASCE 7-16 §2.3.1 combinations (quoted from memory).
"""

from __future__ import annotations

import pytest
from builders import FT, LBF, PSF, bay_30ft

from ifccheck.config import settings_from_dict
from ifccheck.loads.demand import compute_demand

KIP = 1000 * LBF
L = 30 * FT


def demand(**loads: object):
    m, fr = bay_30ft()
    s = settings_from_dict({"loads": {"dead": "0 psf", "live": "50 psf", **loads}})
    return compute_demand(m, fr, s)


def test_a_line_load_by_guid_reaches_the_girders_and_the_balance():
    d = demand(lines=[{"guid": "B1", "case": "D", "intensity": "1 klf", "label": "wall"}])
    b1 = d.beams["B1"]
    (line,) = [x for x in b1.line_loads if x.source.startswith("line load")]
    assert line.source == "line load loads.lines[1] (wall)"
    assert (line.case, line.w, line.start, line.end) == ("D", pytest.approx(KIP / FT), 0.0,
                                                         pytest.approx(L))  # fmt: skip
    # its wL/2 = 15 kip reaches each girder at B1's station (with B1's other dead load)
    plain = demand()
    for girder in ("G1", "G2"):
        with_wall = sum(p.P for p in d.beams[girder].point_loads if p.case == "D")
        without = sum(p.P for p in plain.beams[girder].point_loads if p.case == "D")
        assert with_wall - without == pytest.approx(15 * KIP, rel=1e-9)
    row = next(r for r in d.load_balance if r.case == "D")
    before = next(r for r in plain.load_balance if r.case == "D")
    assert row.applied - before.applied == pytest.approx(30 * KIP, rel=1e-9)
    assert row.delivered == pytest.approx(row.applied, rel=1e-6)


def test_a_partial_line_load_and_a_point_load_by_name():
    d = demand(
        lines=[{"name": "B2", "case": "L", "intensity": "2 klf", "start": "0 ft", "end": "10 ft"}],
        points=[{"name": "B2", "station": "20 ft", "case": "S", "force": "3 kip"}],
    )
    b2 = d.beams["B2"]
    (p,) = [y for y in b2.point_loads if y.source.startswith("point load")]
    assert (p.case, p.P, p.station) == ("S", pytest.approx(3 * KIP), pytest.approx(20 * FT))
    # reactions at G1 (station 0): the 20 kip partial line load centred at 5 ft gives
    # 20·25/30, the 3 kip point at 20 ft gives 3·10/30
    (start,) = [s for s in b2.supports if s.by == "G1"]
    plain = demand().beams["B2"]
    (start0,) = [s for s in plain.supports if s.by == "G1"]
    assert start.reactions["L"] - start0.reactions["L"] == pytest.approx(20 * 25 / 30 * KIP)
    assert start.reactions["S"] == pytest.approx(3 * 10 / 30 * KIP)
    # the snow case is in its combinations now: 1.2D + 1.6L + 0.5S, ... (§2.3.1 (2))
    assert "1.2D+1.6L+0.5S" in [c.name for c in b2.combinations]
    assert "S" in b2.to_output().reactions


def test_edge_selects_the_beams_at_the_edges_of_the_level():
    # G1, G2 (the girders at y = 0 and 30 ft) and E1, E2 (on x = 0 and 30 ft) have floor
    # on one side only; B1, B2 have parallel beams on both sides
    d = demand(lines=[{"edge": "L2", "case": "D", "intensity": "400 plf", "label": "façade"}])
    loaded = {g for g, bd in d.beams.items() if any("façade" in x.source for x in bd.line_loads)}
    assert loaded == {"G1", "G2", "E1", "E2"}


def test_an_uplift_line_load_acts_upward():
    d = demand(lines=[{"guid": "B1", "case": "W", "intensity": "0.5 klf"}])
    (w,) = [x for x in d.beams["B1"].line_loads if x.case == "W"]
    assert w.w == pytest.approx(-0.5 * KIP / FT)
    assert "0.9D+1.0W" in [c.name for c in d.beams["B1"].combinations]
    row = next(r for r in d.load_balance if r.case == "W")
    assert row.applied == pytest.approx(-15 * KIP, rel=1e-9)
    assert row.delivered == pytest.approx(row.applied, rel=1e-6)


def test_roof_live_snow_and_uplift_on_a_roof_level():
    # a level given roof loads is a roof: no floor live load unless it is given
    d = demand(storeys={"L2": {"roof_live": "20 psf", "snow": "30 psf", "wind_uplift": "25 psf"}})
    b1 = d.beams["B1"]
    by_source = {x.source: x for x in b1.line_loads}
    assert "live" not in by_source
    width = 10 * FT
    assert by_source["roof live"].w == pytest.approx(20 * PSF * width)
    assert by_source["snow"].w == pytest.approx(30 * PSF * width)
    assert by_source["wind uplift"].w == pytest.approx(-25 * PSF * width)
    names = [c.name for c in b1.combinations]
    # §2.3.1 (1), (2) with Lr or S, (3) with 0.5W, (4), (6): every one that applies
    for name in ("1.4D", "1.2D+0.5Lr", "1.2D+0.5S", "1.2D+1.6Lr", "1.2D+1.6S",
                 "1.2D+1.6S+0.5W", "1.2D+1.0W+0.5S", "0.9D+1.0W"):  # fmt: skip
        assert name in names
    assert b1.governing_moment == "1.2D+1.6S"  # snow 30 psf > roof live 20 psf
    # no floor live load on the roof, nor in the girders' reactions from it
    for g in ("B1", "G1", "E1"):
        assert not any("L" in c.factors for c in d.beams[g].combinations), g
    assert d.beams["G1"].governing_moment == "1.2D+1.6S"
    cases = {r.case for r in d.load_balance}
    assert {"Lr", "S", "W"} <= cases


def test_a_load_on_a_beam_that_carries_nothing_is_warned_and_unbalanced():
    from builders import beam, framing, model, slab
    from shapely.geometry import box

    m, fr = bay_30ft()
    loose = beam("X", (5 * FT, 0), (5 * FT, 10 * FT), "W12X26")
    m2 = model([*m.members, loose], [slab("S1", box(0, 0, L, L))])
    sup = {g: [(s.station, s.by, s.by_class, s.end) for s in mf.supports]
           for g, mf in fr.members.items()}  # fmt: skip
    fr2 = framing({**sup, "X": []}, edges=[("B1", "G1", L / 3, "start"),
                                          ("B1", "G2", L / 3, "end"),
                                          ("B2", "G1", 2 * L / 3, "start"),
                                          ("B2", "G2", 2 * L / 3, "end")])  # fmt: skip
    s = settings_from_dict(
        {"loads": {"points": [{"guid": "X", "station": "2 ft", "case": "D", "force": "5 kip"}]}}
    )
    d = compute_demand(m2, fr2, s)
    assert any("loads.points[1]" in w and "not carried" in w for _, w in d.warnings)
    row = next(r for r in d.load_balance if r.case == "D")
    assert row.applied - row.delivered == pytest.approx(5 * KIP, rel=1e-6)
    assert any("not conserved for D" in w for _, w in d.warnings)
