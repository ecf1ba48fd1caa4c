"""Source: PyNiteFEA (``Pynite``) 3.x, a general-purpose 3D structural finite element
library for Python, https://github.com/JWock82/Pynite; closed forms from the AISC
*Steel Construction Manual*, 15th ed., Table 3-23, American Institute of Steel
Construction, 2017.

Beam statics against closed-form beam formulas and against PyNiteFEA.

Closed forms are the AISC Steel Construction Manual Table 3-23 cases
("Shears, Moments and Deflections"), quoted from memory; the general cases
(continuous, overhangs, partial loads, point loads anywhere) are checked
against PyNiteFEA, a general-purpose 3D frame analysis library.
"""

from __future__ import annotations

import numpy as np
import pytest
from Pynite import FEModel3D

from ifccheck.loads.statics import (
    BeamProblem,
    CaseLoads,
    LineLoad,
    PointLoad,
    UnstableBeamError,
    analyse_beam,
    analyse_beams,
    solve_beam,
)

E = 200e9
I = 3.0e-4
EI = E * I


def test_simple_span_uniform() -> None:
    # Table 3-23 case 1: M = wL²/8 at midspan, Δ = 5wL⁴/384EI, R = V = wL/2
    L, w = 9.0, 12e3
    d = solve_beam(L, [0, L], [LineLoad(w, 0, L)], EI=EI)
    assert d.max_moment == pytest.approx(w * L**2 / 8, rel=1e-12)
    assert d.moment_at(L / 2) == pytest.approx(w * L**2 / 8, rel=1e-12)
    assert d.max_deflection == pytest.approx(5 * w * L**4 / (384 * EI), rel=1e-9)
    assert d.reactions == pytest.approx([w * L / 2, w * L / 2], rel=1e-12)
    assert d.V[0] == pytest.approx(w * L / 2) and d.V[-1] == pytest.approx(-w * L / 2)
    assert d.max_shear == pytest.approx(w * L / 2)
    # case 1: M(x) = wx(L - x)/2
    x = np.linspace(0, L, 17)
    assert d.moment_at(x) == pytest.approx(w * x * (L - x) / 2, abs=1e-6)


def test_simple_span_midspan_point_load() -> None:
    # Table 3-23 case 7: M = PL/4, Δ = PL³/48EI, R = P/2
    L, P = 8.0, 50e3
    d = solve_beam(L, [0, L], point_loads=[PointLoad(P, L / 2)], EI=EI)
    assert d.max_moment == pytest.approx(P * L / 4, rel=1e-12)
    assert d.max_deflection == pytest.approx(P * L**3 / (48 * EI), rel=1e-9)
    assert d.reactions == pytest.approx([P / 2, P / 2])
    # the shear jumps by P at the load: the station appears with both values
    at = np.flatnonzero(np.isclose(d.x, L / 2))
    assert len(at) == 2
    assert d.V[at] == pytest.approx([P / 2, -P / 2])


def test_third_point_loads() -> None:
    # Table 3-23 case 9: two equal loads at third points: M = Pa (a = L/3) constant
    # between them, Δmax = 23PL³/648EI
    L, P = 9.0, 40e3
    loads = [PointLoad(P, L / 3), PointLoad(P, 2 * L / 3)]
    d = solve_beam(L, [0, L], point_loads=loads, EI=EI, extra_stations=[L / 2])
    assert d.max_moment == pytest.approx(P * L / 3, rel=1e-12)
    assert d.moment_at([L / 3, L / 2, 2 * L / 3]) == pytest.approx([P * L / 3] * 3)
    assert d.w[np.isclose(d.x, L / 2)] == pytest.approx(23 * P * L**3 / (648 * EI), rel=1e-12)
    assert d.max_deflection == pytest.approx(23 * P * L**3 / (648 * EI), rel=1e-12)
    # without a station at midspan the sampled maximum is within the grid's reach
    coarse = solve_beam(L, [0, L], point_loads=loads, EI=EI)
    assert coarse.max_deflection == pytest.approx(23 * P * L**3 / (648 * EI), rel=1e-4)
    assert d.moment_at(L / 2) == pytest.approx(d.moment_at(L / 3))


def test_two_span_continuous_uniform() -> None:
    # Table 3-23 case 29: two equal spans, uniform load: M = -wL²/8 over the middle
    # support, R1 = R3 = 3wL/8, R2 = 10wL/8, max positive M = 9wL²/128 at 3L/8
    L, w = 7.5, 15e3
    d = solve_beam(2 * L, [0, L, 2 * L], [LineLoad(w, 0, 2 * L)], EI=EI)
    assert d.moment_at(L) == pytest.approx(-w * L**2 / 8, rel=1e-10)
    assert d.max_negative_moment == pytest.approx(w * L**2 / 8, rel=1e-10)
    assert d.max_positive_moment == pytest.approx(9 * w * L**2 / 128, rel=1e-10)
    assert d.moment_at(3 * L / 8) == pytest.approx(9 * w * L**2 / 128, rel=1e-10)
    assert d.reactions == pytest.approx([3 * w * L / 8, 10 * w * L / 8, 3 * w * L / 8])
    # Table 3-23 case 29: Δmax = wL⁴/185EI at 0.4215L from the end supports
    assert d.max_deflection == pytest.approx(w * L**4 / (185 * EI), rel=2e-3)
    assert d.w[np.isclose(d.x, L)] == pytest.approx(0.0, abs=1e-12)


def test_overhanging_beam_uniform() -> None:
    # Table 3-23 case 24: span l, overhang a, uniform w over the whole length:
    # R1 = w(l² - a²)/2l, R2 = w(l + a)²/2l, M over R2 = -wa²/2,
    # tip deflection = wa(4a²l - l³ + 3a³)/24EI
    l, a, w = 8.0, 2.5, 10e3
    d = solve_beam(l + a, [0, l], [LineLoad(w, 0, l + a)], EI=EI)
    assert d.reactions == pytest.approx([w * (l**2 - a**2) / (2 * l), w * (l + a) ** 2 / (2 * l)])
    assert d.moment_at(l) == pytest.approx(-w * a**2 / 2, rel=1e-10)
    assert d.max_positive_moment == pytest.approx(w / (8 * l**2) * (l + a) ** 2 * (l - a) ** 2)
    tip = w * a * (4 * a**2 * l - l**3 + 3 * a**3) / (24 * EI)
    assert d.w[-1] == pytest.approx(tip, rel=1e-9)
    assert d.M[-1] == pytest.approx(0.0, abs=1e-6) and d.V[-1] == pytest.approx(0.0, abs=1e-6)


def test_partial_uniform_load_statics() -> None:
    # equilibrium of a simple span with w over [a, b]: R2 = w(b - a)(a + b)/2L
    L, w, a, b = 10.0, 8e3, 2.0, 5.0
    d = solve_beam(L, [0, L], [LineLoad(w, a, b)], EI=EI)
    R2 = w * (b - a) * (a + b) / 2 / L
    assert d.reactions == pytest.approx([w * (b - a) - R2, R2])
    assert d.moment_at(7.0) == pytest.approx(R2 * 3.0)


def _pynite(
    length: float,
    supports: list[float],
    lines: list[LineLoad],
    points: list[PointLoad],
    stations: np.ndarray,
) -> tuple[np.ndarray, np.ndarray, np.ndarray, list[float]]:
    """M (sagging +), V, w (down +) at the stations and reactions (up +) from PyNiteFEA,
    a planar beam along X bending in the XY plane, nodes at every load boundary."""
    xs = sorted(
        {0.0, length, *supports, *(p.station for p in points), *(x for ll in lines for x in
                                                                (ll.start, ll.end))}
    )  # fmt: skip
    m = FEModel3D()
    m.add_material("S", E, 77e9, 0.3, 7850)
    m.add_section("W", 0.01, 1e-5, I, 1e-6)
    for i, x in enumerate(xs):
        m.add_node(f"N{i}", x, 0, 0)
        m.def_support(f"N{i}", support_DZ=True, support_RX=True, support_RY=True)
    for i in range(len(xs) - 1):
        m.add_member(f"M{i}", f"N{i}", f"N{i + 1}", "S", "W")
    sup_nodes = [i for i, x in enumerate(xs) if any(abs(x - s) < 1e-9 for s in supports)]
    for i in sup_nodes:  # pins: vertical restraint, free rotation in the XY plane
        m.def_support(f"N{i}", support_DX=i == sup_nodes[0], support_DY=True, support_DZ=True,
                      support_RX=True, support_RY=True)  # fmt: skip
    for i in range(len(xs) - 1):
        a, b = xs[i], xs[i + 1]
        w = sum(ll.w for ll in lines if ll.start <= a + 1e-9 and ll.end >= b - 1e-9)
        if w:
            m.add_member_dist_load(f"M{i}", "Fy", -w, -w)
    for p in points:
        i = next(i for i, x in enumerate(xs) if abs(x - p.station) < 1e-9)
        m.add_node_load(f"N{i}", "FY", -p.P)
    m.add_load_combo("C", {"Case 1": 1.0})
    m.analyze_linear()
    M, V, W = [], [], []
    for x in stations:
        i = min(max(int(np.searchsorted(xs, x, side="right")) - 1, 0), len(xs) - 2)
        mem, s = m.members[f"M{i}"], x - xs[i]
        M.append(-mem.moment("Mz", s, "C"))  # PyNite's Mz is hogging-positive here
        V.append(mem.shear("Fy", s, "C"))
        W.append(-mem.deflection("dy", s, "C"))
    R = [m.nodes[f"N{i}"].RxnFY["C"] for i in sup_nodes]
    return np.array(M), np.array(V), np.array(W), R


@pytest.mark.parametrize(
    ("length", "supports", "lines", "points"),
    [
        # three-span continuous with a left overhang, partial loads and point loads
        (
            20.0,
            [1.5, 8.0, 14.0, 20.0],
            [LineLoad(6e3, 0.0, 20.0), LineLoad(9e3, 3.0, 11.0)],
            [PointLoad(25e3, 5.0), PointLoad(40e3, 17.0), PointLoad(10e3, 0.0)],
        ),
        # backspan with a cantilever at the right end, load on the tip
        (9.0, [0.0, 6.0], [LineLoad(4e3, 0.0, 9.0)], [PointLoad(15e3, 9.0)]),
        # simple span with unsymmetric point loads
        (11.0, [0.0, 11.0], [], [PointLoad(30e3, 2.0), PointLoad(12e3, 7.5)]),
    ],
)
def test_against_pynite(
    length: float, supports: list[float], lines: list[LineLoad], points: list[PointLoad]
) -> None:
    d = solve_beam(length, supports, lines, points, EI=EI)
    stations = np.linspace(0.0, length, 57)[1:-1] + 0.013  # off the nodes
    stations = stations[stations < length]
    M, V, W, R = _pynite(length, supports, lines, points, stations)
    scale_m = np.abs(M).max()
    assert d.moment_at(stations) == pytest.approx(M, abs=1e-9 * scale_m)
    assert d.shear_at(stations) == pytest.approx(V, abs=1e-9 * np.abs(V).max())
    assert d.deflection_at(stations) == pytest.approx(W, abs=1e-9 * np.abs(W).max())
    assert d.reactions == pytest.approx(R, rel=1e-9)


def test_fewer_than_two_supports_is_unstable() -> None:
    with pytest.raises(UnstableBeamError, match="1 support"):
        solve_beam(5.0, [0.0], [LineLoad(1e3, 0, 5)], EI=EI)
    with pytest.raises(UnstableBeamError, match="0 supports"):
        solve_beam(5.0, [], [LineLoad(1e3, 0, 5)], EI=EI)
    # two supports closer than the merge tolerance are one
    with pytest.raises(UnstableBeamError):
        solve_beam(5.0, [2.0, 2.0005], [LineLoad(1e3, 0, 5)], EI=EI)


def test_load_outside_the_beam_rejected() -> None:
    with pytest.raises(ValueError, match="outside the beam"):
        solve_beam(5.0, [0, 5], point_loads=[PointLoad(1e3, 6.0)], EI=EI)


def test_batch_reports_errors_per_beam_and_matches_single_solves() -> None:
    rng = np.random.default_rng(3)
    problems = []
    for i in range(40):
        L = float(rng.uniform(4, 12))
        sup = [0.0, L] if i % 3 else [0.0, L / 2, L]
        if i % 7 == 0:
            sup = [L / 2]  # unstable
        cases = {
            "D": CaseLoads(
                (LineLoad(float(rng.uniform(1e3, 9e3)), 0.0, L),),
                (PointLoad(float(rng.uniform(1e3, 5e4)), float(rng.uniform(0, L))),),
            ),
            "L": CaseLoads((LineLoad(5e3, 0.2 * L, 0.7 * L),)),
        }
        problems.append(BeamProblem(L, sup, cases, EI, extra_stations=[0.3 * L]))
    batch = analyse_beams(problems)
    for p, res in zip(problems, batch, strict=True):
        if len(p.supports) < 2:
            assert isinstance(res, UnstableBeamError)
            continue
        assert not isinstance(res, Exception)
        one = analyse_beam(p)
        assert res.x == pytest.approx(one.x)
        assert res.M == pytest.approx(one.M, abs=1e-9 * np.abs(one.M).max())
        assert res.w == pytest.approx(one.w, abs=1e-9 * np.abs(one.w).max())
        # equilibrium: reactions carry every load, case by case
        for c in ("D", "L"):
            total = sum(ll.w * (ll.end - ll.start) for ll in p.cases[c].line)
            total += sum(pl.P for pl in p.cases[c].point)
            assert res.case(c).reactions.sum() == pytest.approx(total, rel=1e-10)
        assert 0.3 * p.length in list(res.x)


def test_stations_dense_sorted_and_include_extras() -> None:
    L = 10.0
    d = solve_beam(L, [0, L], [LineLoad(1e3, 0, L)], EI=EI, extra_stations=[1.234, 7.77])
    assert np.all(np.diff(d.x) >= 0)
    assert len(d.x) >= 200
    assert 1.234 in d.x and 7.77 in d.x
    assert d.x[0] == 0 and d.x[-1] == L


def test_combination_is_linear_superposition() -> None:
    L = 9.0
    p = BeamProblem(
        L,
        [0, L],
        {
            "D": CaseLoads((LineLoad(5e3, 0, L),)),
            "L": CaseLoads((), (PointLoad(20e3, 3.0),)),
        },
        EI,
    )
    a = analyse_beam(p)
    combo = a.combine({"D": 1.2, "L": 1.6})
    assert combo.M == pytest.approx(1.2 * a.case("D").M + 1.6 * a.case("L").M)
    assert combo.reactions == pytest.approx(
        1.2 * a.case("D").reactions + 1.6 * a.case("L").reactions
    )
    mo, sh = a.combination_maxima([{"D": 1.2, "L": 1.6}, {"D": 1.4}])
    assert mo[0] == pytest.approx(combo.max_moment) and sh[0] == pytest.approx(combo.max_shear)
    assert mo[1] == pytest.approx(1.4 * 5e3 * L**2 / 8)  # 1.4 × wL²/8
    assert a.combine({"S": 1.0}).max_moment == 0.0  # a case not analysed counts as zero


def test_without_ei_deflection_is_nan_but_statics_hold() -> None:
    d = solve_beam(6.0, [0, 6], [LineLoad(1e3, 0, 6)])
    assert np.isnan(d.max_deflection)
    assert d.max_moment == pytest.approx(1e3 * 36 / 8)


def test_span_deflections_and_spans() -> None:
    l, a, w = 8.0, 2.0, 10e3
    p = BeamProblem(l + a, [0, l], {"D": CaseLoads((LineLoad(w, 0, l + a),))}, EI)
    res = analyse_beam(p)
    assert res.spans == [(0.0, l, "span"), (l, l + a, "overhang")]
    spans = res.case("D").span_deflections()
    assert spans[1][3] == pytest.approx(abs(res.case("D").w[-1]))
