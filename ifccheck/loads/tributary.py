"""Tributary widths of floor beams under one-way deck action.

On each storey the floor beams are grouped by plan direction (families of
parallel beams). The deck spans between the family with the closest
spacing — perpendicular to those beams — unless the settings say otherwise
(per storey or per slab). Each beam of that family (a "deck beam") takes
half the centre-to-centre distance to its nearest overlapping parallel
neighbour on each side; with no neighbour on a side it takes the floor out
to the slab edge (at most one typical spacing) where a slab is modelled, and
nothing where none is. The strip (beam line buffered by those widths, flat
caps) is clipped to the footprints of the slabs bearing on the beam (their
openings are holes), and its width along the beam becomes a set of pieces
[start, end, width] in stations. Beams of the other families ("girders")
take no deck load; they carry the reactions of the beams framing into them.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Literal

import numpy as np
import shapely
from shapely import STRtree
from shapely.geometry.base import BaseGeometry
from shapely.geometry.polygon import orient

from ifccheck.config import Settings, StoreyLoads, deck_span_degrees
from ifccheck.model import Member, MemberRole, Model, Slab
from ifccheck.perf import gc_paused

# Beams whose plan directions differ by less than this are parallel.
FAMILY_TOLERANCE = 3.0  # degrees
# Parallel beams whose centre lines are closer than this are collinear (one row).
ROW_TOLERANCE = 0.05  # m
# A parallel beam is a neighbour when it overlaps this fraction of the beam.
MIN_OVERLAP = 0.2
# A neighbour farther than this many typical spacings is across a gap (a
# courtyard, another wing), not the other support of the deck.
FAR_NEIGHBOUR = 3.0
# Bins per beam when integrating a clipped strip (plus the strip's vertices).
BINS = 40

Role = Literal["deck", "girder", "other"]


@dataclass(frozen=True)
class WidthPiece:
    """Tributary width over [start, end] (stations along the beam, m).

    ``kind`` "floor" pieces carry superimposed dead and live load (each floor
    area counted once); "slab" pieces carry the self-weight of ``slab``.
    ``slab`` is None where no slab is modelled (width from beam spacing alone).
    """

    start: float
    end: float
    width: float  # m of floor per m of beam
    slab: str | None
    kind: Literal["floor", "slab"]


@dataclass
class Tributary:
    """What one floor beam takes from the deck."""

    guid: str
    storey: str
    role: Role
    left: float = 0.0  # m, nominal width on the beam's left (looking start → end)
    right: float = 0.0
    left_neighbour: str | None = None
    right_neighbour: str | None = None
    pieces: list[WidthPiece] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)

    @property
    def floor_area(self) -> float:
        """Floor area carried (m²)."""
        return sum((p.end - p.start) * p.width for p in self.pieces if p.kind == "floor")


@dataclass
class DeckSpan:
    """The deck span direction used on one storey."""

    storey: str
    angle: float | None  # deck span direction, degrees from +x in [0, 180)
    source: Literal["inferred", "settings", "none"]
    beam_angle: float | None  # direction of the beams the deck spans between
    typical_spacing: float | None  # m, median spacing of those beams
    # every family of parallel beams: (direction in degrees, beams, typical spacing)
    families: list[tuple[float, int, float | None]] = field(default_factory=list)


@dataclass
class TributaryResult:
    beams: dict[str, Tributary]
    deck_spans: dict[str, DeckSpan]
    warnings: list[tuple[str, str]] = field(default_factory=list)


def floor_beams(model: Model) -> list[Member]:
    """Members that can carry floor load: horizontal-ish beams with a plan length."""
    out = []
    for m in model.members:
        if m.role is not MemberRole.BEAM or m.is_vertical:
            continue
        if math.hypot(m.end[0] - m.start[0], m.end[1] - m.start[1]) > 1e-6:
            out.append(m)
    return out


def plan_families(angles: np.ndarray, tol: float = FAMILY_TOLERANCE) -> np.ndarray:
    """Family label per plan angle (degrees, any range): angles mod 180 within
    ``tol`` of a chain of neighbours share a label (wrapping at 0/180)."""
    a = np.mod(angles, 180.0)
    if a.size == 0:
        return np.zeros(0, dtype=int)
    order = np.argsort(a)
    s = a[order]
    brk = np.diff(s) > tol
    lab_sorted = np.concatenate(([0], np.cumsum(brk)))
    if s[0] + 180.0 - s[-1] <= tol and lab_sorted[-1] > 0:
        lab_sorted[lab_sorted == lab_sorted[-1]] = 0  # the family across 0°/180°
    labels = np.empty_like(lab_sorted)
    labels[order] = lab_sorted
    _, labels = np.unique(labels, return_inverse=True)
    return labels


def family_direction(angles: np.ndarray) -> float:
    """Mean direction (degrees in [0, 180)) of nearly parallel plan angles."""
    r = np.radians(np.mod(angles, 180.0)) * 2.0  # double angles: θ and θ+180 agree
    return float(np.degrees(np.arctan2(np.sin(r).mean(), np.cos(r).mean()) / 2.0) % 180.0)


@dataclass
class Neighbours:
    """Nearest overlapping parallel beam on each side (+p and -p) of each beam."""

    plus: np.ndarray  # index of the neighbour on the +p side, -1 when none
    minus: np.ndarray
    gap_plus: np.ndarray  # centre-to-centre distance, inf when none
    gap_minus: np.ndarray


def find_neighbours(
    u0: np.ndarray, u1: np.ndarray, n: np.ndarray, max_gap: float = math.inf
) -> Neighbours:
    """Nearest parallel neighbours by a sweep over rows of collinear beams.

    ``u0 <= u1`` are the beams' extents along the family direction and ``n``
    their offsets across it. Beams within ROW_TOLERANCE of each other in ``n``
    form one row (collinear, not neighbours); a neighbour overlaps at least
    MIN_OVERLAP of the beam. Rows are visited outward from each beam's row
    until one holds a neighbour or ``max_gap`` is passed.
    """
    N = n.size
    plus = np.full(N, -1)
    minus = np.full(N, -1)
    gp = np.full(N, np.inf)
    gm = np.full(N, np.inf)
    if N == 0:
        return Neighbours(plus, minus, gp, gm)
    order = np.argsort(n, kind="stable")
    ns = n[order]
    row_of_sorted = np.concatenate(([0], np.cumsum(np.diff(ns) > ROW_TOLERANCE)))
    R = int(row_of_sorted[-1]) + 1
    starts = np.searchsorted(row_of_sorted, np.arange(R + 1))
    rows = [order[starts[r] : starts[r + 1]] for r in range(R)]
    row_n = np.array([n[r].mean() for r in rows])
    need = np.maximum(MIN_OVERLAP * (u1 - u0), 1e-3)
    for direction, best, gap in ((1, plus, gp), (-1, minus, gm)):
        open_rows = {r: rows[r] for r in range(R)}
        k = 1
        while open_rows and k < R:
            for r in list(open_rows):
                t = r + direction * k
                if t < 0 or t >= R or abs(row_n[t] - row_n[r]) > max_gap:
                    del open_rows[r]
                    continue
                a, b = open_rows[r], rows[t]
                ov = np.minimum(u1[a][:, None], u1[b][None, :]) - np.maximum(
                    u0[a][:, None], u0[b][None, :]
                )
                ok = ov >= need[a][:, None]
                found = ok.any(axis=1)
                if found.any():
                    pick = np.argmax(np.where(ok, ov, -np.inf), axis=1)
                    hit_a, hit_b = a[found], b[pick[found]]
                    best[hit_a] = hit_b
                    gap[hit_a] = np.abs(n[hit_b] - n[hit_a])
                    rest = a[~found]
                    if rest.size:
                        open_rows[r] = rest
                    else:
                        del open_rows[r]
            k += 1
    return Neighbours(plus, minus, gp, gm)


@dataclass
class _Family:
    direction: float  # degrees
    members: np.ndarray  # indices into the storey's beam list
    spacing: float | None


def _override_angle(*entries: StoreyLoads | None) -> float | None:
    for e in entries:
        if e is not None and e.deck_span is not None:
            return deck_span_degrees(e.deck_span)
    return None


def _angle_diff(a: float, b: float) -> float:
    d = abs(a - b) % 180.0
    return min(d, 180.0 - d)


def _nearest_family(families: list[_Family], beam_direction: float) -> int | None:
    if not families:
        return None
    return int(np.argmin([_angle_diff(f.direction, beam_direction) for f in families]))


def _orient(polys: np.ndarray) -> np.ndarray:
    """Exteriors counter-clockwise, holes clockwise."""
    if hasattr(shapely, "orient_polygons"):  # shapely >= 2.1
        return shapely.orient_polygons(polys)
    return np.array([orient(p, 1.0) for p in polys], dtype=object)


@dataclass
class _Integrated:
    runs: list[list[tuple[float, float, float]]]  # per strip: (u0, u1, width), plan
    plus: np.ndarray  # area on the +nrm side of the beam line, per strip
    minus: np.ndarray


def _integrate(
    geoms: Sequence[BaseGeometry],
    p0: np.ndarray,
    t: np.ndarray,
    nrm: np.ndarray,
    plan_len: np.ndarray,
) -> _Integrated:
    """Width of each clipped strip along its beam, as runs of constant width.

    All strips at once: each strip's boundary edges go to beam-local
    coordinates (u along the beam, v across toward ``nrm``); the area with
    u <= cut is -∮ v du over the boundary clipped to u <= cut (the closing
    segments lie on u = cut, where du = 0), exact for polygons. Cuts are the
    strip's vertices, plus a uniform grid of BINS where an edge is slanted.
    Arrays p0, t, nrm, plan_len are per strip.
    """
    J = len(geoms)
    empty = _Integrated([[] for _ in range(J)], np.zeros(J), np.zeros(J))
    if J == 0:
        return empty
    parts, part_job = shapely.get_parts(np.array(geoms, dtype=object), return_index=True)
    keep = shapely.get_type_id(parts) == 3  # polygons only (drop slivers of lines/points)
    parts, part_job = parts[keep], part_job[keep]
    if parts.size == 0:
        return empty
    rings, ring_part = shapely.get_rings(_orient(parts), return_index=True)
    xy, vert_ring = shapely.get_coordinates(rings, return_index=True)
    vjob = part_job[ring_part[vert_ring]]
    d = xy - p0[vjob]
    u = np.einsum("ij,ij->i", d, t[vjob])
    v = np.einsum("ij,ij->i", d, nrm[vjob])
    same = vert_ring[1:] == vert_ring[:-1]
    ejob = vjob[:-1][same]
    u1, v1, u2, v2 = u[:-1][same], v[:-1][same], u[1:][same], v[1:][same]
    refl = (t[:, 0] * nrm[:, 1] - t[:, 1] * nrm[:, 0] < 0)[ejob]  # mirrored frame
    u1, u2 = np.where(refl, u2, u1), np.where(refl, u1, u2)
    v1, v2 = np.where(refl, v2, v1), np.where(refl, v1, v2)

    def clipped(xa, ya, xb, yb, cut):  # -∫ y dx over the part of each edge with x <= cut
        ca, cb = np.minimum(xa, cut), np.minimum(xb, cut)
        dx = xb - xa
        with np.errstate(divide="ignore", invalid="ignore"):
            k = np.where(dx != 0, (yb - ya) / dx, 0.0)
        return -(cb - ca) * (2 * ya + k * (ca - xa + cb - xa)) / 2

    # side areas: the same formula with the axes swapped (a mirror: negate)
    minus = -np.bincount(ejob, clipped(v1, u1, v2, u2, 0.0), minlength=J)
    total = np.bincount(ejob, clipped(u1, v1, u2, v2, np.inf), minlength=J)
    plus = total - minus

    slant = (np.abs(u2 - u1) > 1e-9) & (np.abs(v2 - v1) > 1e-9)
    slanted = np.bincount(ejob, slant, minlength=J) > 0
    gj = np.flatnonzero(slanted)
    grid_job = np.repeat(gj, BINS + 1)
    grid_u = np.tile(np.linspace(0.0, 1.0, BINS + 1), gj.size) * plan_len[grid_job]
    ends = np.arange(J)
    cjob = np.concatenate((ejob, grid_job, ends, ends))
    cu = np.concatenate((u1, grid_u, np.zeros(J), plan_len))
    cu = np.clip(cu, 0.0, plan_len[cjob])
    key = np.unique(2.0 * cjob + cu / plan_len[cjob])
    cjob = np.floor(key / 2.0).astype(int)
    frac = key - 2.0 * cjob
    new = np.ones(key.size, dtype=bool)
    new[1:] = (cjob[1:] != cjob[:-1]) | (np.diff(frac) > 1e-9)
    key, cjob, frac = key[new], cjob[new], frac[new]
    last = np.ones(key.size, dtype=bool)
    last[:-1] = cjob[1:] != cjob[:-1]
    frac[last] = 1.0
    cut = frac * plan_len[cjob]

    # area left of each cut: every cut against every edge of its strip
    e_start = np.searchsorted(ejob, np.arange(J))
    e_count = np.bincount(ejob, minlength=J)
    n_pairs = e_count[cjob]
    pair_cut = np.repeat(np.arange(cut.size), n_pairs)
    offset = np.arange(pair_cut.size) - np.repeat(np.cumsum(n_pairs) - n_pairs, n_pairs)
    pe = e_start[cjob][pair_cut] + offset
    A = np.bincount(
        pair_cut, clipped(u1[pe], v1[pe], u2[pe], v2[pe], cut[pair_cut]), minlength=cut.size
    )

    # bins between consecutive cuts of a strip, merged into runs of equal width
    b = np.flatnonzero(~last)
    bjob, lo, hi = cjob[b], cut[b], cut[b + 1]
    area = np.maximum(A[b + 1] - A[b], 0.0)
    width = area / (hi - lo)
    tol = 1e-6 * np.maximum(1.0, np.abs(v1).max(initial=1.0))
    start = np.ones(b.size, dtype=bool)
    start[1:] = (bjob[1:] != bjob[:-1]) | (np.abs(np.diff(width)) > tol)
    run = np.cumsum(start) - 1
    r_area = np.bincount(run, area)
    r_lo = lo[start]
    r_hi = np.maximum.reduceat(hi, np.flatnonzero(start)) if b.size else hi
    r_job = bjob[start]
    runs: list[list[tuple[float, float, float]]] = [[] for _ in range(J)]
    for j, a_, z_, ar in zip(r_job.tolist(), r_lo.tolist(), r_hi.tolist(), r_area.tolist(),
                             strict=True):  # fmt: skip
        w = ar / (z_ - a_)
        if w > tol:
            runs[j].append((a_, z_, w))
    return _Integrated(runs, plus, minus)


_TOUCH = 1e-3  # m


def _strips(
    p0: np.ndarray,
    p1: np.ndarray,
    t: np.ndarray,
    nrm: np.ndarray,
    ext_plus: np.ndarray,
    ext_minus: np.ndarray,
    shrink: float,
) -> np.ndarray:
    """The beams' lines buffered by ext_plus toward +nrm and ext_minus toward
    -nrm, flat caps; ``shrink`` pulls every side in (keeping a sliver)."""
    a = p0 + shrink * t
    b = p1 - shrink * t
    ep = np.maximum(ext_plus - shrink, shrink)[:, None] * nrm
    em = np.maximum(ext_minus - shrink, shrink)[:, None] * nrm
    if shrink == 0.0:
        ep, em = ext_plus[:, None] * nrm, ext_minus[:, None] * nrm
    return shapely.polygons(np.stack([a - em, b - em, b + ep, a + ep], axis=1))


def compute_tributary(model: Model, settings: Settings) -> TributaryResult:
    """Deck span direction per storey and tributary width pieces per floor beam."""
    with gc_paused():
        return _compute_tributary(model, settings)


def _compute_tributary(model: Model, settings: Settings) -> TributaryResult:
    beams = floor_beams(model)
    result = TributaryResult(beams={}, deck_spans={})
    loads = settings.loads
    by_storey: dict[str, list[int]] = {}
    for i, m in enumerate(beams):
        by_storey.setdefault(m.storey, []).append(i)
    if not beams:
        return result

    p0 = np.array([m.start[:2] for m in beams], dtype=float)
    p1 = np.array([m.end[:2] for m in beams], dtype=float)
    d = p1 - p0
    plan_len = np.hypot(d[:, 0], d[:, 1])
    t = d / plan_len[:, None]
    angle = np.degrees(np.arctan2(t[:, 1], t[:, 0])) % 180.0
    length3d = np.array([m.length for m in beams])
    top = np.array([m.top_of_steel for m in beams])

    # per storey: families, neighbours, typical spacing, deck family
    family_of = np.full(len(beams), -1)
    fam_p = np.zeros((len(beams), 2))  # the family's +p direction for each beam
    left = np.zeros(len(beams))
    right = np.zeros(len(beams))  # widths toward +p (left) and -p (right) before edges
    nb_plus = np.full(len(beams), -1)
    nb_minus = np.full(len(beams), -1)
    storey_families: dict[str, list[_Family]] = {}
    for storey, idx_list in by_storey.items():
        idx = np.asarray(idx_list)
        labels = plan_families(angle[idx])
        fams: list[_Family] = []
        for f in range(int(labels.max()) + 1 if idx.size else 0):
            members = idx[labels == f]
            direction = family_direction(angle[members])
            td = np.array([math.cos(math.radians(direction)), math.sin(math.radians(direction))])
            pd = np.array([-td[1], td[0]])
            ua, ub = p0[members] @ td, p1[members] @ td
            mid = 0.5 * (p0[members] + p1[members])
            nb = find_neighbours(np.minimum(ua, ub), np.maximum(ua, ub), mid @ pd)
            nearest = np.minimum(nb.gap_plus, nb.gap_minus)
            spacing = (
                float(np.median(nearest[np.isfinite(nearest)]))
                if np.isfinite(nearest).any()
                else None
            )
            if spacing is not None:
                for gap, nbr in ((nb.gap_plus, nb.plus), (nb.gap_minus, nb.minus)):
                    too_far = gap > FAR_NEIGHBOUR * spacing
                    gap[too_far] = np.inf
                    nbr[too_far] = -1
            gp = np.where(np.isfinite(nb.gap_plus), nb.gap_plus / 2, 0.0)
            gm = np.where(np.isfinite(nb.gap_minus), nb.gap_minus / 2, 0.0)
            family_of[members] = len(fams)
            fam_p[members] = pd
            left[members], right[members] = gp, gm
            nb_plus[members] = np.where(nb.plus >= 0, members[np.maximum(nb.plus, 0)], -1)
            nb_minus[members] = np.where(nb.minus >= 0, members[np.maximum(nb.minus, 0)], -1)
            fams.append(_Family(direction, members, spacing))
        storey_families[storey] = fams

        spaced = [i for i, f in enumerate(fams) if f.spacing is not None]
        inferred: int | None
        if spaced:
            inferred = min(spaced, key=lambda i: (fams[i].spacing, -fams[i].members.size))
        else:
            inferred = max(range(len(fams)), key=lambda i: fams[i].members.size, default=None)
        override = _override_angle(loads.storeys.get(storey))
        span_angle: float | None
        source: Literal["inferred", "settings", "none"]
        if override is not None:
            chosen = _nearest_family(fams, (override + 90.0) % 180.0)
            span_angle, source = override, "settings"
        else:
            chosen = inferred
            span_angle = (fams[chosen].direction + 90.0) % 180.0 if chosen is not None else None
            source = "inferred" if chosen is not None else "none"
        result.deck_spans[storey] = DeckSpan(
            storey=storey,
            angle=span_angle,
            source=source,
            beam_angle=fams[chosen].direction if chosen is not None else None,
            typical_spacing=fams[chosen].spacing if chosen is not None else None,
            families=[(f.direction, int(f.members.size), f.spacing) for f in fams],
        )

    slabs = model.slabs
    storeys_with_slab = {s.storey for s in slabs}
    foot = np.array([s.footprint for s in slabs], dtype=object)
    under = np.array([s.underside for s in slabs], dtype=float)
    slab_top = np.array([s.top for s in slabs], dtype=float)
    tree = STRtree(foot) if slabs else None
    if slabs:
        shapely.prepare(foot)
    tol = settings.framing.slab_bearing_tolerance

    # nominal strips: the storey's deck family with edge extensions
    edge_ext = np.zeros(len(beams))
    for families in storey_families.values():
        for family in families:
            # a lone beam (no spacing known) takes the floor out to the slab edge
            edge_ext[family.members] = (
                family.spacing if family.spacing is not None else plan_len[family.members]
            )
    nrm = np.stack([-t[:, 1], t[:, 0]], axis=1)
    flip = np.einsum("ij,ij->i", nrm, fam_p) < 0  # the beam's own left is -p
    nrm[flip] *= -1.0  # now nrm is +p for every beam
    ext_plus = np.where(nb_plus >= 0, left, edge_ext)
    ext_minus = np.where(nb_minus >= 0, right, edge_ext)
    rects = _strips(p0, p1, t, nrm, ext_plus, ext_minus, 0.0)
    # the query strips are a hair smaller, so slabs that only touch them drop out
    query = _strips(p0, p1, t, nrm, ext_plus, ext_minus, _TOUCH)
    cand: dict[int, list[int]] = {}
    if tree is not None:
        bi, si = tree.query(query, predicate="intersects")
        bearing = np.abs(under[si] - top[bi]) <= tol
        for b, s in zip(bi[bearing].tolist(), si[bearing].tolist(), strict=True):
            cand.setdefault(b, []).append(s)
        # slabs stacked on a bearing slab (a topping on a deck) are carried too
        for b, s in zip(bi[~bearing].tolist(), si[~bearing].tolist(), strict=True):
            if b in cand and any(abs(under[s] - slab_top[c]) <= tol for c in cand[b]):
                cand[b].append(s)

    # the family the deck spans between, per (storey, slab): overrides first
    deck_cache: dict[tuple[str, str | None], int | None] = {}

    def deck_family(storey: str, slab: Slab | None) -> int | None:
        key = (storey, slab.guid if slab is not None else None)
        if key not in deck_cache:
            fams = storey_families[storey]
            entries = [loads.storeys.get(storey)]
            if slab is not None:
                entries = [loads.slabs.get(slab.guid), loads.storeys.get(slab.storey), *entries]
            angle = _override_angle(*entries)
            beam_dir = result.deck_spans[storey].beam_angle
            if angle is not None:
                beam_dir = (angle + 90.0) % 180.0
            deck_cache[key] = None if beam_dir is None else _nearest_family(fams, beam_dir)
        return deck_cache[key]

    to_clip: list[list[int]] = [[] for _ in beams]
    trs: list[Tributary] = []
    for i, m in enumerate(beams):
        fam: dict[str | None, int | None] = {None: deck_family(m.storey, None)}
        for si in cand.get(i, []):
            fam[slabs[si].guid] = deck_family(m.storey, slabs[si])
        tr = _beam_tributary(
            m,
            beams,
            slabs,
            cand.get(i, []),
            m.storey in storeys_with_slab,
            int(family_of[i]),
            float(plan_len[i]),
            float(length3d[i]),
            (float(left[i]), float(right[i])),
            (int(nb_plus[i]), int(nb_minus[i])),
            float(edge_ext[i]),
            bool(flip[i]),
            fam,
            to_clip[i],
        )
        result.beams[m.guid] = tr
        trs.append(tr)
    jobs = _clip_jobs(to_clip, rects, slabs, foot, trs, length3d, plan_len)

    # integrate every clipped strip in one pass
    owner = np.array([i for i, js in enumerate(jobs) for _ in js], dtype=int)
    flat = [j for js in jobs for j in js]
    got = _integrate([j.geom for j in flat], p0[owner], t[owner], nrm[owner], plan_len[owner])
    side = np.zeros((len(beams), 2))
    for k, (i, job) in enumerate(zip(owner.tolist(), flat, strict=True)):
        tr = result.beams[beams[i].guid]
        scale = length3d[i] / plan_len[i]  # station per plan length (sloped beams)
        for kind in job.kinds:
            tr.pieces += [WidthPiece(a * scale, z * scale, w / scale, job.slab, kind)
                          for a, z, w in got.runs[k]]  # fmt: skip
        if "floor" in job.kinds:
            side[i] += (got.plus[k], got.minus[k])
    for i in np.unique(owner).tolist():
        # a side without a neighbour reaches the slab edge: report its mean width
        tr = result.beams[beams[i].guid]
        wp = float(side[i, 0] / plan_len[i]) if nb_plus[i] < 0 else float(left[i])
        wm = float(side[i, 1] / plan_len[i]) if nb_minus[i] < 0 else float(right[i])
        _set_widths(tr, wp, wm, bool(flip[i]), beams, int(nb_plus[i]), int(nb_minus[i]))
    return result


def _set_widths(
    tr: Tributary, wp: float, wm: float, flip: bool, beams: Sequence[Member], bp: int, bm: int
) -> None:
    """Report widths toward +p / -p as left / right seen looking from start to end."""
    gp = beams[bp].guid if bp >= 0 else None
    gm = beams[bm].guid if bm >= 0 else None
    if flip:
        tr.left, tr.right, tr.left_neighbour, tr.right_neighbour = wm, wp, gm, gp
    else:
        tr.left, tr.right, tr.left_neighbour, tr.right_neighbour = wp, wm, gp, gm


@dataclass
class _Job:
    """A clipped strip to integrate: its geometry, slab and what it loads."""

    geom: BaseGeometry
    slab: str
    kinds: tuple[Literal["floor", "slab"], ...]


def _beam_tributary(
    m: Member,
    beams: Sequence[Member],
    slabs: Sequence[Slab],
    candidates: list[int],
    storey_has_slab: bool,
    family: int,
    plan_len: float,
    length3d: float,
    half: tuple[float, float],
    nbrs: tuple[int, int],
    edge: float,
    flip: bool,
    deck_family: dict[str | None, int | None],
    to_clip: list[int],
) -> Tributary:
    """Role, nominal widths and notes of one beam; slabs to clip its strip to
    go to ``to_clip``. ``deck_family`` gives the family the deck spans between
    on each slab (key: slab GUID) and where no slab is modelled (key None)."""
    scale = length3d / plan_len  # station per plan length (sloped beams)
    plus_gap, minus_gap = half
    nb_plus, nb_minus = nbrs
    tr = Tributary(guid=m.guid, storey=m.storey, role="other")

    def is_deck_beam(slab: Slab | None) -> bool:
        return deck_family[slab.guid if slab is not None else None] == family

    def nominal(with_edges: bool) -> tuple[float, float]:
        wp = plus_gap if nb_plus >= 0 else (edge if with_edges else 0.0)
        wm = minus_gap if nb_minus >= 0 else (edge if with_edges else 0.0)
        return wp, wm

    def set_widths(wp: float, wm: float) -> None:
        _set_widths(tr, wp, wm, flip, beams, nb_plus, nb_minus)

    if not candidates:
        if not is_deck_beam(None):
            tr.role = "girder"
            return tr
        if storey_has_slab:
            tr.notes.append("no slab bears on this beam: no floor load")
            return tr
        tr.role = "deck"
        wp, wm = nominal(False)
        set_widths(wp, wm)
        if wp + wm > 0:
            tr.pieces.append(WidthPiece(0.0, length3d, (wp + wm) / scale, None, "floor"))
        tr.notes.append("no slab modelled on this storey: tributary width from beam spacing")
        return tr

    deck_slabs = [s for s in candidates if is_deck_beam(slabs[s])]
    if not deck_slabs:
        tr.role = "girder"
        return tr
    tr.role = "deck"
    wp, wm = nominal(True)
    set_widths(wp, wm)
    for side, nb in (("+", nb_plus), ("-", nb_minus)):
        if nb < 0:
            where = "left" if (side == "+") != flip else "right"
            tr.notes.append(f"no parallel neighbour on the {where}: floor taken to the slab edge")

    to_clip.extend(deck_slabs)
    return tr


def _clip_jobs(
    to_clip: list[list[int]],
    rects: np.ndarray,
    slabs: Sequence[Slab],
    foot: np.ndarray,
    trs: list[Tributary],
    length3d: np.ndarray,
    plan_len: np.ndarray,
) -> list[list[_Job]]:
    """Clip each deck beam's strip to its slabs (vectorised); a strip wholly on
    one slab becomes a full-length piece at once, the others become jobs."""
    jobs: list[list[_Job]] = [[] for _ in to_clip]
    pb = np.array([i for i, ss in enumerate(to_clip) for _ in ss], dtype=int)
    ps = np.array([s for ss in to_clip for s in ss], dtype=int)
    if pb.size == 0:
        return jobs
    n_slabs = np.bincount(pb, minlength=len(to_clip))
    one = n_slabs[pb] == 1
    covered = np.zeros(pb.size, dtype=bool)
    covered[one] = shapely.covers(foot[ps[one]], rects[pb[one]])
    for i, si in zip(pb[covered].tolist(), ps[covered].tolist(), strict=True):
        tr, sl = trs[i], slabs[si]
        w = float((tr.left + tr.right) * plan_len[i] / length3d[i])  # per station length
        tr.pieces.append(WidthPiece(0.0, float(length3d[i]), w, sl.guid, "floor"))
        if sl.thickness > 0:
            tr.pieces.append(WidthPiece(0.0, float(length3d[i]), w, sl.guid, "slab"))
    pb, ps = pb[~covered], ps[~covered]
    clips = shapely.intersection(rects[pb], foot[ps])
    keep = ~shapely.is_empty(clips)
    pb, ps, clips = pb[keep], ps[keep], clips[keep]
    # strips over several slabs: overlapping slabs need the floor area counted once
    by_beam: dict[int, list[int]] = {}
    for k, i in enumerate(pb.tolist()):
        by_beam.setdefault(i, []).append(k)
    pa = [(ks[x], ks[y]) for ks in by_beam.values() if len(ks) > 1
          for x in range(len(ks)) for y in range(x + 1, len(ks))]  # fmt: skip
    overlapping: set[int] = set()
    if pa:
        a_, b_ = np.array(pa).T
        ov = shapely.area(shapely.intersection(clips[a_], clips[b_])) > 1e-9
        overlapping = {int(pb[k]) for k in a_[ov]}

    def kinds(sl: Slab) -> tuple[Literal["floor", "slab"], ...]:
        return ("floor", "slab") if sl.thickness > 0 else ("floor",)

    for i, ks in by_beam.items():
        if i not in overlapping:
            jobs[i] += [_Job(clips[k], slabs[ps[k]].guid, kinds(slabs[ps[k]])) for k in ks]
            continue
        taken: BaseGeometry | None = None
        for k in ks:
            sl, clip = slabs[ps[k]], clips[k]
            floor = clip if taken is None else shapely.difference(clip, taken)
            jobs[i].append(_Job(floor, sl.guid, ("floor",)))
            if sl.thickness > 0:
                jobs[i].append(_Job(clip, sl.guid, ("slab",)))
            taken = clip if taken is None else shapely.union(taken, clip)
    return jobs
