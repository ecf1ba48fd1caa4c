"""Beam statics: moment, shear and deflection of straight prismatic beams.

A beam of length L rests on two or more vertical supports (pins: no
rotational restraint, the usual assumption for simple shear connections)
and carries uniform line loads over [a, b] and point loads. Simple spans,
overhangs and continuous beams are all solved the same way.

Method (Euler-Bernoulli, exact for these loads): nodes are placed at the
ends, supports, point loads and load boundaries, so the load is uniform
within each element. Walking from the free left end, shear, moment, slope
and deflection are carried across each element by their exact polynomials
(V' = -q, M' = V, EI θ' = -M, v' = θ with v downward). Every response is
linear in the unknowns — the support reactions, the slope θ0 and the
deflection v0 at x = 0 — which follow from k + 2 equations per beam: zero
shear and moment past the right end, and zero deflection at each of the k
supports. The same polynomials then give the response at any station, so
the dense station grid costs no extra unknowns. Beams with the same number
of nodes and supports are solved together as one batched numpy system, and
lengths are scaled by L so the small systems stay well conditioned.

Sign conventions: loads downward positive, M sagging positive, V = dM/dx
(positive just right of a left-end support), deflection w downward
positive, reactions upward positive.
"""

from __future__ import annotations

import itertools
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import numpy as np

from ifccheck.errors import UnstableBeamError
from ifccheck.perf import gc_paused

# Nodes closer than this fraction of L are one node; supports closer than
# SUPPORT_MERGE × L (plus 1 mm) are one support.
NODE_MERGE = 1e-9
SUPPORT_MERGE = 1e-3
# Loads and supports may lie this far outside [0, L] (rounding of geometry).
OUTSIDE_TOLERANCE = 0.005  # m
_CHUNK = 32768  # stations evaluated per step


@dataclass(frozen=True)
class LineLoad:
    """Uniform load ``w`` (N/m, downward positive) from ``start`` to ``end`` (m)."""

    w: float
    start: float
    end: float


@dataclass(frozen=True)
class PointLoad:
    """Concentrated load ``P`` (N, downward positive) at ``station`` (m)."""

    P: float
    station: float


@dataclass(frozen=True)
class CaseLoads:
    """The loads of one load case on one beam."""

    line: tuple[LineLoad, ...] = ()
    point: tuple[PointLoad, ...] = ()


@dataclass
class BeamProblem:
    """One beam: geometry, stiffness, supports and loads by case.

    ``EI`` (N·m²) only scales deflections (for a prismatic beam the reactions,
    moments and shears do not depend on it); ``None`` gives NaN deflections.
    ``extra_stations`` are added to the output stations (brace points...).
    ``combinations`` (factors by case name) are this beam's own: its analysis gets
    their exact max |M| and max |V| as ``maxima``, computed in bulk.
    """

    length: float
    supports: Sequence[float]
    cases: Mapping[str, CaseLoads]
    EI: float | None = None
    extra_stations: Sequence[float] = ()
    combinations: Sequence[Mapping[str, float]] = ()


@dataclass
class Diagram:
    """Response of a beam to one load case or combination.

    ``x`` is non-decreasing: each node (support, point load, load boundary)
    appears twice, as the end of one element and the start of the next, so
    ``V`` has its values just left and just right of each jump. The exact
    element polynomials are kept too (``nodes``, ``node_M``, ``node_V``,
    ``elem_q``), so :meth:`moment_at` and the maxima are exact, not sampled.
    """

    x: np.ndarray
    M: np.ndarray  # N·m, sagging positive
    V: np.ndarray  # N
    w: np.ndarray  # m, downward positive
    supports: np.ndarray  # support stations, m
    reactions: np.ndarray  # N, upward positive, one per support
    length: float
    nodes: np.ndarray  # m
    node_M: np.ndarray  # N·m at each node
    node_V: np.ndarray  # N just right of each node
    elem_q: np.ndarray  # N/m, uniform load on each element
    node_w: np.ndarray  # m, deflection at each node
    node_slope: np.ndarray  # dw/dx at each node
    EI: float  # N·m², NaN when not given

    def scaled(self, factor: float) -> Diagram:
        """Every response times ``factor`` (a linear beam under scaled loads)."""
        f = factor
        return Diagram(
            self.x, self.M * f, self.V * f, self.w * f, self.supports, self.reactions * f,
            self.length, self.nodes, self.node_M * f, self.node_V * f, self.elem_q * f,
            self.node_w * f, self.node_slope * f, self.EI,
        )  # fmt: skip

    def _element(self, x: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        e = np.clip(np.searchsorted(self.nodes, x, side="right") - 1, 0, self.nodes.size - 2)
        return e, x - self.nodes[e]

    def moment_at(self, stations: np.ndarray | Sequence[float] | float) -> np.ndarray:
        """Exact M (N·m) at any stations."""
        x = np.asarray(stations, dtype=float)
        e, s = self._element(x)
        return self.node_M[e] + self.node_V[e] * s - self.elem_q[e] * s * s / 2

    def shear_at(self, stations: np.ndarray | Sequence[float] | float) -> np.ndarray:
        """Exact V (N) at any stations; at a jump, the value just right of it."""
        x = np.asarray(stations, dtype=float)
        e, s = self._element(x)
        return self.node_V[e] - self.elem_q[e] * s

    def deflection_at(self, stations: np.ndarray | Sequence[float] | float) -> np.ndarray:
        """Exact deflection w (m, downward positive) at any stations."""
        x = np.asarray(stations, dtype=float)
        e, s = self._element(x)
        M, V, q = self.node_M[e], self.node_V[e], self.elem_q[e]
        bend = s * s * (M / 2 + V * s / 6 - q * s * s / 24) / self.EI
        return self.node_w[e] + self.node_slope[e] * s - bend

    def moment_extremes(self, a: float = 0.0, b: float | None = None) -> tuple[float, float]:
        """Exact (max M, min M) over [a, b] (whole beam by default), N·m."""
        b = self.length if b is None else b
        l = np.diff(self.nodes)
        q = self.elem_q
        with np.errstate(divide="ignore", invalid="ignore"):
            s = np.where(q != 0, self.node_V[:-1] / q, -1.0)  # where V = 0 inside
        inner = (s > 0) & (s < l)
        cand = np.concatenate(
            (self.nodes, self.nodes[:-1][inner] + s[inner], np.array([a, b], dtype=float))
        )
        cand = cand[(cand >= a) & (cand <= b)]
        m = self.moment_at(cand)
        return float(m.max()), float(m.min())

    @property
    def max_moment(self) -> float:
        """max |M| (N·m), exact."""
        hi, lo = self.moment_extremes()
        return max(hi, -lo)

    @property
    def max_positive_moment(self) -> float:
        return max(0.0, self.moment_extremes()[0])

    @property
    def max_negative_moment(self) -> float:
        """Largest hogging moment as a positive number (0 when none)."""
        return max(0.0, -self.moment_extremes()[1])

    @property
    def max_shear(self) -> float:
        """max |V| (N), exact (V is linear within elements)."""
        return float(np.max(np.abs(self.V)))

    @property
    def max_deflection(self) -> float:
        """max |w| (m) over the stations; NaN when EI was not given."""
        return float(np.max(np.abs(self.w)))

    def span_deflections(self) -> list[tuple[float, float, str, float]]:
        """(a, b, "span" | "overhang", max |w| in [a, b]) for each span and overhang."""
        out = []
        for a, b, kind in spans_of(self.supports, self.length):
            inside = (self.x >= a - 1e-12) & (self.x <= b + 1e-12)
            out.append((a, b, kind, float(np.max(np.abs(self.w[inside])))))
        return out


def spans_of(supports: np.ndarray, length: float) -> list[tuple[float, float, str]]:
    """Spans between consecutive supports, plus overhangs beyond the outer ones."""
    s = np.asarray(supports, dtype=float)
    out: list[tuple[float, float, str]] = []
    tol = 1e-6 * max(length, 1.0)
    if s[0] > tol:
        out.append((0.0, float(s[0]), "overhang"))
    out += [(float(a), float(b), "span") for a, b in itertools.pairwise(s)]
    if length - s[-1] > tol:
        out.append((float(s[-1]), float(length), "overhang"))
    return out


@dataclass
class BeamAnalysis:
    """All load cases of one beam on a shared set of stations."""

    length: float
    x: np.ndarray
    supports: np.ndarray
    cases: tuple[str, ...]
    M: np.ndarray  # (cases, stations)
    V: np.ndarray
    w: np.ndarray
    reactions: np.ndarray  # (cases, supports)
    nodes: np.ndarray  # (nodes,)
    node_M: np.ndarray  # (cases, nodes)
    node_V: np.ndarray  # (cases, nodes)
    elem_q: np.ndarray  # (cases, nodes - 1)
    node_w: np.ndarray  # (cases, nodes)
    node_slope: np.ndarray  # (cases, nodes)
    EI: float

    def case(self, name: str) -> Diagram:
        return self.combine({name: 1.0}) if name in self.cases else self._missing(name)

    def _missing(self, name: str) -> Diagram:
        raise KeyError(f"load case {name!r} not analysed (have {', '.join(self.cases)})")

    def combine(self, factors: Mapping[str, float]) -> Diagram:
        """Linear superposition Σ factor × case; cases not analysed count as zero."""
        f = np.array([factors.get(c, 0.0) for c in self.cases])
        return Diagram(
            self.x,
            f @ self.M,
            f @ self.V,
            f @ self.w,
            self.supports,
            f @ self.reactions,
            self.length,
            self.nodes,
            f @ self.node_M,
            f @ self.node_V,
            f @ self.elem_q,
            f @ self.node_w,
            f @ self.node_slope,
            self.EI,
        )

    @property
    def spans(self) -> list[tuple[float, float, str]]:
        return spans_of(self.supports, self.length)

    def combination_maxima(
        self, combinations: Sequence[Mapping[str, float]]
    ) -> tuple[list[float], list[float]]:
        """Exact (max |M|, max |V|) of each combination, without building diagrams."""
        F = _factor_matrix(combinations, self.cases)
        m, v = _maxima(self.nodes[None], self.node_M[None], self.node_V[None], self.elem_q[None], F)
        return m[0].tolist(), v[0].tolist()

    # filled by analyse_beams(..., combinations=...): max |M|, max |V| per combination
    maxima: tuple[np.ndarray, np.ndarray] | None = None


def _factor_matrix(combinations: Sequence[Mapping[str, float]], cases: Sequence[str]) -> np.ndarray:
    F = np.array([[c.get(name, 0.0) for name in cases] for c in combinations], dtype=float)
    return F.reshape(len(combinations), len(cases))


def _maxima(
    nodes: np.ndarray, nM: np.ndarray, nV: np.ndarray, nq: np.ndarray, F: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    """Exact max |M| and max |V| (B, K) of K combinations of B beams' cases.

    nodes (B, n); nM, nV (B, C, n) node moments and shears (just right);
    nq (B, C, n-1) element loads; F (K, C) factors, or (B, K, C) for factors of
    each beam's own. Within an element M peaks where V = 0, and V is linear, so
    its extremes are at the element ends.
    """
    spec = "bkc,bcn->bkn" if F.ndim == 3 else "kc,bcn->bkn"
    M = np.einsum(spec, F, nM)
    V = np.einsum(spec, F, nV)
    q = np.einsum(spec, F, nq)
    l = np.diff(nodes, axis=1)[:, None, :]
    Vr, Ml = V[:, :, :-1], M[:, :, :-1]
    with np.errstate(divide="ignore", invalid="ignore"):
        s = np.where(q != 0, Vr / q, -1.0)
    inner = (s > 0) & (s < l)
    s = np.where(inner, s, 0.0)
    peak = np.where(inner, Ml + Vr * s - q * s * s / 2, 0.0)
    m = np.maximum(np.abs(M).max(axis=2), np.abs(peak).max(axis=2, initial=0.0))
    v = np.maximum(np.abs(Vr).max(axis=2, initial=0.0), np.abs(Vr - q * l).max(axis=2, initial=0.0))
    return m, v


def _fail_once(errors: dict[int, Exception], beams: np.ndarray, make) -> None:
    for b in np.unique(beams):
        errors.setdefault(int(b), make(int(b)))


def analyse_beams(
    problems: Sequence[BeamProblem],
    per_span: int = 200,
    combinations: Sequence[Mapping[str, float]] = (),
) -> list[BeamAnalysis | Exception]:
    """Solve many beams; each entry is a :class:`BeamAnalysis` or the error for that beam
    (:class:`UnstableBeamError` for a mechanism, ``ValueError`` for bad input).

    With ``combinations`` (factors by case name), each analysis also gets
    ``maxima``: exact max |M| and max |V| per combination, computed in bulk; a
    problem with combinations of its own gets the maxima of those instead.

    Every analysis carries the union of the case names of all problems (a case a
    beam does not have is all zero on it). The work is vectorised over beams:
    one pass gathers the loads, then all beams with the same node and support
    counts are solved as one batch.
    """
    with gc_paused():
        return _analyse_beams(problems, per_span, combinations)


@dataclass
class _Gathered:
    """Every beam's supports, loads and extra stations as flat arrays (beam index first)."""

    length: np.ndarray  # per beam, m (1.0 where the length is bad)
    EI: np.ndarray  # per beam, N·m² (NaN where not given)
    cases: tuple[str, ...]
    support_beam: np.ndarray
    support_x: np.ndarray
    point_beam: np.ndarray
    point_case: np.ndarray
    point_force: np.ndarray
    point_x: np.ndarray
    line_beam: np.ndarray
    line_case: np.ndarray
    line_w: np.ndarray
    line_start: np.ndarray
    line_end: np.ndarray
    extra_beam: np.ndarray
    extra_x: np.ndarray
    errors: dict[int, Exception]


def _gather(problems: Sequence[BeamProblem]) -> _Gathered:
    """Flatten the problems into arrays; positions outside a beam are errors of that beam
    (clipped onto it so the arrays stay usable), zero-length loads are dropped."""
    nb = len(problems)
    case_index: dict[str, int] = {}
    length = np.empty(nb)
    EI = np.empty(nb)
    supports: tuple[list[int], list[float]] = ([], [])
    points: tuple[list[int], list[int], list[tuple[float, float]]] = ([], [], [])
    lines: tuple[list[int], list[int], list[tuple[float, float, float]]] = ([], [], [])
    extras: tuple[list[int], list[float]] = ([], [])
    for i, p in enumerate(problems):
        length[i] = p.length
        EI[i] = p.EI if p.EI else np.nan
        supports[0].extend([i] * len(p.supports))
        supports[1].extend(p.supports)
        extras[0].extend([i] * len(p.extra_stations))
        extras[1].extend(p.extra_stations)
        for name, cl in p.cases.items():
            c = case_index.setdefault(name, len(case_index))
            points[0].extend([i] * len(cl.point))
            points[1].extend([c] * len(cl.point))
            points[2].extend((pl.P, pl.station) for pl in cl.point)
            lines[0].extend([i] * len(cl.line))
            lines[1].extend([c] * len(cl.line))
            lines[2].extend((ll.w, ll.start, ll.end) for ll in cl.line)
    errors: dict[int, Exception] = {}
    bad_length = ~(np.isfinite(length) & (length > 0))
    _fail_once(errors, np.flatnonzero(bad_length),
               lambda b: ValueError(f"beam length must be positive, got {length[b]}"))  # fmt: skip
    ls = np.where(bad_length, 1.0, length)

    def on_beam(b: np.ndarray, x: np.ndarray, what: str) -> np.ndarray:
        out = (x < -OUTSIDE_TOLERANCE) | (x > ls[b] + OUTSIDE_TOLERANCE) | ~np.isfinite(x)
        for j in np.flatnonzero(out):
            errors.setdefault(
                int(b[j]),
                ValueError(
                    f"{what} at {x[j]:.4f} m lies outside the beam (length {ls[b[j]]:.4f} m)"
                ),
            )
        return np.clip(np.nan_to_num(x), 0.0, ls[b])

    def ints(values: list[int]) -> np.ndarray:
        return np.asarray(values, dtype=int)

    def floats(values: list, width: int) -> np.ndarray:
        return np.asarray(values, dtype=float).reshape(-1, width)

    support_beam = ints(supports[0])
    support_x = on_beam(support_beam, np.asarray(supports[1], dtype=float), "support")
    point_beam, point_case, pv = ints(points[0]), ints(points[1]), floats(points[2], 2)
    point_x = on_beam(point_beam, pv[:, 1], "point load")
    line_beam, line_case, lv = ints(lines[0]), ints(lines[1]), floats(lines[2], 3)
    la = on_beam(line_beam, lv[:, 1], "line load")
    lz = on_beam(line_beam, lv[:, 2], "line load")
    la, lz = np.minimum(la, lz), np.maximum(la, lz)
    keep = (lz - la > NODE_MERGE * ls[line_beam]) & (lv[:, 0] != 0.0)
    extra_beam = ints(extras[0])
    extra_x = on_beam(extra_beam, np.asarray(extras[1], dtype=float), "station")
    return _Gathered(
        ls, EI, tuple(case_index), support_beam, support_x, point_beam, point_case, pv[:, 0],
        point_x, line_beam[keep], line_case[keep], lv[keep, 0], la[keep], lz[keep],
        extra_beam, extra_x, errors,
    )  # fmt: skip


def _merged_supports(g: _Gathered, nb: int) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Supports closer than the tolerance merged, sorted per beam; (beam, x, count per beam).
    A beam left with fewer than two is a mechanism (an error of that beam)."""
    o = np.lexsort((g.support_x, g.support_beam))
    sb, sx = g.support_beam[o], g.support_x[o]
    new = np.ones(sb.size, dtype=bool)
    new[1:] = (sb[1:] != sb[:-1]) | (np.diff(sx) > SUPPORT_MERGE * g.length[sb[1:]] + 1e-3)
    sb, sx = sb[new], sx[new]
    count = np.bincount(sb, minlength=nb)
    _fail_once(
        g.errors,
        np.flatnonzero(count < 2),
        lambda b: UnstableBeamError(
            f"{count[b]} support{'s' if count[b] != 1 else ''}: a beam on pins needs two or more"
        ),
    )
    return sb, sx, count


@dataclass
class _Nodes:
    """Every solvable beam's nodes (ends, supports, point loads, load boundaries) as keys
    2·beam + x/L in one sorted array, so that one search finds any beam's node."""

    key: np.ndarray
    beam: np.ndarray
    xh: np.ndarray  # x / L
    first: np.ndarray  # the first node of its beam
    last: np.ndarray
    start: np.ndarray  # per beam: index of its first node (-1 when not solved)
    count: np.ndarray  # per beam: number of nodes

    def nearest(self, b: np.ndarray, x: np.ndarray, length: np.ndarray) -> np.ndarray:
        k_ = 2.0 * b + x / length[b]
        return self.nearest_key(k_)

    def nearest_key(self, k_: np.ndarray) -> np.ndarray:
        i = np.clip(np.searchsorted(self.key, k_), 1, self.key.size - 1)
        return np.where(np.abs(self.key[i - 1] - k_) <= np.abs(self.key[i] - k_), i - 1, i)


def _node_table(g: _Gathered, ok: np.ndarray, sb: np.ndarray, sx: np.ndarray) -> _Nodes:
    good = np.flatnonzero(ok)
    ls = g.length
    cand_b = np.concatenate((good, good, sb, g.point_beam, g.line_beam, g.line_beam))
    cand_x = np.concatenate(
        (np.zeros(good.size), ls[good], sx, g.point_x, g.line_start, g.line_end)
    )
    m = ok[cand_b]
    nk = np.sort(2.0 * cand_b[m] + cand_x[m] / ls[cand_b[m]])
    nbeam = np.floor(nk / 2.0).astype(int)
    new = np.ones(nk.size, dtype=bool)
    new[1:] = (nbeam[1:] != nbeam[:-1]) | (np.diff(nk) > NODE_MERGE)
    nk, nbeam = nk[new], nbeam[new]
    xh = nk - 2.0 * nbeam
    first = np.ones(nk.size, dtype=bool)
    first[1:] = nbeam[1:] != nbeam[:-1]
    last = np.roll(first, -1)
    xh[first], xh[last] = 0.0, 1.0
    nk = 2.0 * nbeam + xh
    start = np.full(ls.size, -1)
    start[nbeam[first]] = np.flatnonzero(first)
    return _Nodes(nk, nbeam, xh, first, last, start, np.bincount(nbeam, minlength=ls.size))


def _stations_per_element(nodes: _Nodes, is_support: np.ndarray, per_span: int) -> np.ndarray:
    """Sample stations per element: ``per_span`` over the span (or overhang) holding it."""
    n = nodes.key.size
    idx = np.arange(n)
    bound = is_support | nodes.first | nodes.last
    prev_b = np.maximum.accumulate(np.where(bound, idx, -1))
    nxt = np.minimum.accumulate(np.where(bound, idx, n)[::-1])[::-1]
    nxt_b = nxt[np.minimum(idx + 1, n - 1)]
    h = np.diff(nodes.xh, append=1.0)
    span = np.where(nodes.last, 1.0, nodes.xh[nxt_b] - nodes.xh[prev_b])
    ratio = per_span * h / np.where(span > 0, span, 1.0)
    return np.maximum(2, np.ceil(ratio - 1e-6).astype(int) + 1)  # robust to rounding


def _analyse_beams(
    problems: Sequence[BeamProblem],
    per_span: int,
    combinations: Sequence[Mapping[str, float]],
) -> list[BeamAnalysis | Exception]:
    nb = len(problems)
    g = _gather(problems)
    sb, sx, nsup = _merged_supports(g, nb)
    ok = np.ones(nb, dtype=bool)
    ok[list(g.errors)] = False
    nodes = _node_table(g, ok, sb, sx)
    ls, C = g.length, len(g.cases)

    # supports, point forces and load steps onto their nodes
    is_support = np.zeros(nodes.key.size, dtype=bool)
    m = ok[sb]
    is_support[nodes.nearest(sb[m], sx[m], ls)] = True
    forces = np.zeros((nodes.key.size, C))
    m = ok[g.point_beam]
    np.add.at(forces, (nodes.nearest(g.point_beam[m], g.point_x[m], ls), g.point_case[m]),
              g.point_force[m])  # fmt: skip
    dq = np.zeros((nodes.key.size, C))
    m = ok[g.line_beam]
    lb, lc, lw = g.line_beam[m], g.line_case[m], g.line_w[m]
    np.add.at(dq, (nodes.nearest(lb, g.line_start[m], ls), lc), lw)
    np.add.at(dq, (nodes.nearest(lb, g.line_end[m], ls), lc), -lw)
    q = np.cumsum(dq, axis=0)  # a beam's adds and removes cancel before the next beam
    counts = _stations_per_element(nodes, is_support, per_span)

    # extra stations: drop those on a node, find the element of the others
    m = ok[g.extra_beam]
    ek, first_of = np.unique(2.0 * g.extra_beam[m] + g.extra_x[m] / ls[g.extra_beam[m]],
                             return_index=True)  # fmt: skip
    ex_exact = g.extra_x[m][first_of]  # the stations as given, not rebuilt from keys
    on_node = np.abs(nodes.key[nodes.nearest_key(ek)] - ek) <= 1e-9
    ek, ex_exact = ek[~on_node], ex_exact[~on_node]
    eb = np.floor(ek / 2.0).astype(int)
    e_node = np.searchsorted(nodes.key, ek, side="right") - 1
    e_node = np.where(nodes.last[e_node], e_node - 1, e_node)

    # beams with the same node and support counts are solved as one batch
    results: list[BeamAnalysis | Exception] = [g.errors.get(i, ValueError()) for i in range(nb)]
    groups: dict[tuple[int, int], list[int]] = {}
    for b in np.flatnonzero(ok):
        groups.setdefault((int(nodes.count[b]), int(nsup[b])), []).append(int(b))
    pos_in_group = np.full(nb, -1)
    F_all = _factor_matrix(combinations, g.cases) if combinations else None
    own = [_factor_matrix(p.combinations, g.cases) if p.combinations else None for p in problems]
    for (n, k), members in groups.items():
        G = np.asarray(members)
        F = F_all
        counts_k: list[int] | None = None
        if any(own[i] is not None for i in members):
            counts_k = [len(problems[i].combinations) or len(combinations) for i in members]
            F = np.zeros((G.size, max(counts_k, default=0), C))
            for j, i in enumerate(members):
                fi = own[i] if own[i] is not None else F_all
                if fi is not None:
                    F[j, : fi.shape[0]] = fi
        pos_in_group[G] = np.arange(G.size)
        node_ids = nodes.start[G][:, None] + np.arange(n)[None, :]
        sn = np.nonzero(is_support[node_ids])[1].reshape(G.size, k)
        sel = pos_in_group[eb] >= 0
        solved = _solve_group(
            ls[G], g.EI[G], nodes.xh[node_ids], sn, forces[node_ids], q[node_ids[:, :-1]],
            counts[node_ids[:, :-1]], pos_in_group[eb[sel]], e_node[sel] - nodes.start[eb[sel]],
            ek[sel] - 2.0 * eb[sel], ex_exact[sel], g.cases, F,
        )  # fmt: skip
        for j, (i, res) in enumerate(zip(members, solved, strict=True)):
            if counts_k is not None and res.maxima is not None:
                kk = counts_k[j]
                res.maxima = (res.maxima[0][:kk], res.maxima[1][:kk])
            results[i] = res
        pos_in_group[G] = -1
    return results


def _solve_group(
    L: np.ndarray,
    EI: np.ndarray,
    xh: np.ndarray,
    sn: np.ndarray,
    forces: np.ndarray,
    q_load: np.ndarray,
    counts: np.ndarray,
    e_b: np.ndarray,
    e_e: np.ndarray,
    e_x: np.ndarray,
    e_real: np.ndarray,
    cases: tuple[str, ...],
    F: np.ndarray | None = None,
) -> list[BeamAnalysis]:
    """Solve B beams with n nodes and k supports each, C load cases, as one batch.

    Positions are scaled by L (xh = x / L); e_* give extra stations as (beam
    in group, element, x / L, x).
    """
    B, n = xh.shape
    C = forces.shape[2]
    k = sn.shape[1]
    lh = np.diff(xh, axis=1)[:, :, None]  # (B, ne, 1)
    bi = np.arange(B)[:, None]

    # patterns: C load cases, then a unit upward reaction at each support
    P = np.zeros((B, n, C + k))
    P[:, :, :C] = forces
    P[bi, sn, C + np.arange(k)[None, :]] = -1.0
    q = np.zeros((B, n - 1, C + k))
    q[:, :, :C] = q_load * L[:, None, None]

    def before(a: np.ndarray) -> np.ndarray:
        """Σ over elements e < j, for each node j."""
        z = np.zeros((B, 1, a.shape[2]))
        return np.concatenate((z, np.cumsum(a, axis=1)), axis=1)

    V = -np.cumsum(P, axis=1) - before(q * lh)  # just right of each node
    Ve = V[:, :-1]
    M = before(Ve * lh - q * lh**2 / 2)
    Me = M[:, :-1]
    th = before(-(Me * lh + Ve * lh**2 / 2 - q * lh**3 / 6))
    v = before(th[:, :-1] * lh - (Me * lh**2 / 2 + Ve * lh**3 / 6 - q * lh**4 / 24))

    # unknowns [R_1..R_k, θ0, v0]; equations: V(L+) = 0, M(L) = 0, v(support) = 0
    A = np.zeros((B, k + 2, k + 2))
    A[:, 0, :k] = V[:, -1, C:]
    A[:, 1, :k] = M[:, -1, C:]
    vs = v[bi, sn]  # (B, k, C + k)
    A[:, 2:, :k] = vs[:, :, C:]
    A[:, 2:, k] = xh[bi, sn]
    A[:, 2:, k + 1] = 1.0
    rhs = -np.concatenate((V[:, -1:, :C], M[:, -1:, :C], vs[:, :, :C]), axis=1)
    sol = np.linalg.solve(A, rhs)  # (B, k + 2, C)
    R, th0, v0 = sol[:, :k], sol[:, k : k + 1], sol[:, k + 1 : k + 2]

    def total(a: np.ndarray) -> np.ndarray:
        return a[:, :, :C] + a[:, :, C:] @ R

    V, M, th, v = total(V), total(M), total(th), total(v)
    th = th + th0
    v = v + v0 + xh[:, :, None] * th0
    qc = q[:, :, :C]

    # stations: element grids (both ends included) plus the extra stations
    cnt = counts.ravel()
    elem = np.repeat(np.arange(cnt.size), cnt)
    start = np.repeat(np.cumsum(cnt) - cnt, cnt)
    s = (np.arange(elem.size) - start) / np.repeat(cnt - 1, cnt) * lh.ravel()[elem]
    exact = np.full(elem.size, np.nan)  # stations given exactly (the extras)
    if e_b.size:
        elem = np.concatenate((elem, e_b * (n - 1) + e_e))
        s = np.concatenate((s, e_x - xh[e_b, e_e]))
        exact = np.concatenate((exact, e_real))
    b_of = elem // (n - 1)
    xs = xh[:, :-1].ravel()[elem] + s
    # grid stations are already in order; a stable sort slots the extras in
    order = np.argsort(2.0 * b_of + xs, kind="stable")
    s, b_of, elem, xs, exact = s[order], b_of[order], elem[order], xs[order], exact[order]

    # evaluate the element polynomials in chunks small enough to stay in cache
    ne = B * (n - 1)
    coef = [a[:, :-1].reshape(ne, C) for a in (M, V, th, v)] + [qc.reshape(ne, C)]
    Lb = L[b_of]
    wscale = Lb**3 / EI[b_of]  # w = ŵ L³ / EI, M = M̂ L
    N = s.size
    Ms, Vs, ws = np.empty((C, N)), np.empty((C, N)), np.empty((C, N))
    for a in range(0, N, _CHUNK):
        z = min(a + _CHUNK, N)
        e = elem[a:z]
        Mi, Vi, ti, vi, qi = (c[e] for c in coef)
        S = s[a:z, None]
        S2 = S * S
        Ms[:, a:z] = ((Mi + Vi * S - qi * (S2 / 2)) * Lb[a:z, None]).T
        Vs[:, a:z] = (Vi - qi * S).T
        wv = vi + ti * S - S2 * (Mi / 2 + Vi * (S / 6) - qi * (S2 / 24))
        ws[:, a:z] = (wv * wscale[a:z, None]).T
    xs = np.where(np.isnan(exact), xs * Lb, exact)
    bounds = np.concatenate(([0], np.cumsum(np.bincount(b_of, minlength=B))))
    sup_x = xh[bi, sn] * L[:, None]
    nM = np.transpose(M * L[:, None, None], (0, 2, 1))  # (B, C, n)
    nV = np.transpose(V, (0, 2, 1))
    nq = np.transpose(qc / L[:, None, None], (0, 2, 1))
    nodes_m = xh * L[:, None]
    nw = np.transpose(v * (L**3 / EI)[:, None, None], (0, 2, 1))
    nth = np.transpose(th * (L**2 / EI)[:, None, None], (0, 2, 1))
    mx = _maxima(nodes_m, nM, nV, nq, F) if F is not None else None
    out = []
    for b in range(B):
        a, z = bounds[b], bounds[b + 1]
        out.append(
            BeamAnalysis(
                length=float(L[b]),
                x=xs[a:z],
                supports=sup_x[b],
                cases=cases,
                M=Ms[:, a:z],
                V=Vs[:, a:z],
                w=ws[:, a:z],
                reactions=R[b].T,
                nodes=nodes_m[b],
                node_M=nM[b],
                node_V=nV[b],
                elem_q=nq[b],
                node_w=nw[b],
                node_slope=nth[b],
                EI=float(EI[b]),
                maxima=(mx[0][b], mx[1][b]) if mx is not None else None,
            )
        )
    return out


def analyse_beam(problem: BeamProblem, per_span: int = 200) -> BeamAnalysis:
    """Solve one beam; raises :class:`UnstableBeamError` or ``ValueError``."""
    res = analyse_beams([problem], per_span)[0]
    if isinstance(res, Exception):
        raise res
    return res


def solve_beam(
    length: float,
    supports: Sequence[float],
    line_loads: Sequence[LineLoad] = (),
    point_loads: Sequence[PointLoad] = (),
    EI: float | None = None,
    extra_stations: Sequence[float] = (),
    per_span: int = 200,
) -> Diagram:
    """One beam, one load case: the diagram of moment, shear, deflection, reactions."""
    p = BeamProblem(
        length,
        supports,
        {"load": CaseLoads(tuple(line_loads), tuple(point_loads))},
        EI,
        extra_stations,
    )
    return analyse_beam(p, per_span).case("load")
