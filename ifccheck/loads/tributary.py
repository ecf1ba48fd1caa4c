"""Tributary widths of floor beams under one-way deck action, with the floor conserved.

On each level the load-carrying floor beams (``spans.load_capable``) are
grouped by plan direction (families of parallel beams). The deck spans
perpendicular to the family that the infill beams belong to — the beams
framing into other beams at both ends — unless the settings say otherwise
(per level, per slab, or a declared deck). Where neither tells, the level's
deck direction is unknown and its beams are not checked.

Each beam of that family (a "deck beam") takes half the centre-to-centre
distance to its nearest overlapping parallel neighbour on each side; with no
neighbour on a side it takes the floor out to the slab edge (at most one
typical spacing). The strip runs between the centrelines of the beam's
supports, is clipped to the footprints of the slabs bearing on the beam
(openings are holes) and its width along the beam becomes pieces [start,
end, width] in stations. Whatever floor of a bearing slab the strips leave
(edges beyond the outer beams, corners, the sides of openings) goes to the
nearest beam the slab bears on (``residual.py``), so every area of floor
reaches a member. Beams of the other families ("girders") carry the
reactions of the beams framing into them, and their share of the leftover.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field, replace
from typing import Literal

import numpy as np
import shapely
from shapely import STRtree
from shapely.geometry.base import BaseGeometry
from shapely.geometry.polygon import orient

from ifccheck.config import Settings, StoreyLoads, deck_span_degrees
from ifccheck.floors import assign_levels, match_levels
from ifccheck.framing.slabs import bearing_tolerance
from ifccheck.framing.types import Framing
from ifccheck.loads.residual import leftover_pieces
from ifccheck.loads.spans import BeamSpan, beam_spans, load_capable
from ifccheck.model import Member, Model, Slab
from ifccheck.perf import gc_paused
from ifccheck.reasons import Reason

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
    # sides ("left"/"right") with no parallel neighbour: the beam is at the edge of its
    # floor there; with the mean width (m) of floor beyond its line on that side
    open_sides: list[tuple[str, float]] = field(default_factory=list)

    @property
    def edge(self) -> bool:
        """At the edge of its floor: no parallel beam on one side (or either)."""
        return bool(self.open_sides)

    @property
    def floor_area(self) -> float:
        """Floor area carried (m²)."""
        return sum((p.end - p.start) * p.width for p in self.pieces if p.kind == "floor")


@dataclass
class DeckSpan:
    """The deck span direction used on one level."""

    storey: str  # the level's name
    angle: float | None  # deck span direction, degrees from +x in [0, 180)
    source: Literal["inferred", "settings", "none"]
    beam_angle: float | None  # direction of the beams the deck spans between
    typical_spacing: float | None  # m, median spacing of those beams
    # every family of parallel beams: (direction in degrees, beams, typical spacing)
    families: list[tuple[float, int, float | None]] = field(default_factory=list)
    evidence: int = 0  # beams that agree: the infill of the deck family, or its beams
    basis: str = ""  # "infill beams", "the only family of parallel beams" or "settings"


@dataclass
class FloorArea:
    """The floor of one slab or declared deck that the load path distributes."""

    slab: str  # GUID
    level: str
    area: float  # m² (plan, openings removed)
    delivered: float = 0.0  # m² that reached a beam
    computed: bool = True  # False where the level's deck direction is unknown


@dataclass
class TributaryResult:
    beams: dict[str, Tributary]
    deck_spans: dict[str, DeckSpan]
    warnings: list[tuple[str, str]] = field(default_factory=list)
    # floor beams that carry nothing, and why (fewer than two supports, ...)
    unable: dict[str, Reason] = field(default_factory=dict)
    spans: dict[str, BeamSpan] = field(default_factory=dict)
    floors: list[FloorArea] = field(default_factory=list)


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
    members: np.ndarray  # indices into the level's beam list
    spacing: float | None
    infill: int = 0  # members framing into beams at both ends


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


def compute_tributary(model: Model, settings: Settings, framing: Framing) -> TributaryResult:
    """Deck span direction per level and tributary width pieces per load-carrying beam."""
    if not model.levels:  # called without the floors stage: the levels it would find
        assign_levels(model, settings.framing.level_tolerance)
    with gc_paused():
        return _compute_tributary(model, settings, framing)


def level_of(m: Member) -> str:
    return m.level or m.storey


def level_entries(model: Model, settings: Settings) -> dict[str, StoreyLoads]:
    """The ``loads.storeys`` entry that applies to each level (by name, storey or
    elevation); a declared deck's ``deck_span`` stands in where the entry has none."""
    tol = settings.framing.level_tolerance
    out: dict[str, StoreyLoads] = {}
    for key, entry in settings.loads.storeys.items():
        for lv in match_levels(key, model.levels, tol):
            out[lv.name] = entry
    for key, deck in settings.decks.items():
        if deck.deck_span is None:
            continue
        for lv in match_levels(key, model.levels, tol):
            found = out.get(lv.name, StoreyLoads())
            if found.deck_span is None:
                out[lv.name] = replace(found, deck_span=deck.deck_span)
    return out


@dataclass
class _Beams:
    """The load-carrying floor beams as arrays (row i is ``members[i]``), plan geometry."""

    members: list[Member]
    p0: np.ndarray  # plan start
    t: np.ndarray  # plan unit direction
    plan_len: np.ndarray
    angle: np.ndarray  # plan direction, degrees in [0, 180)
    length3d: np.ndarray
    top: np.ndarray
    span: np.ndarray  # (start, end) stations of the centreline span
    scale: np.ndarray  # station per plan length (sloped beams)
    infill: np.ndarray  # frames into beams at both ends


def _beam_arrays(beams: list[Member], spans: dict[str, BeamSpan], framing: Framing) -> _Beams:
    p0 = np.array([m.start[:2] for m in beams], dtype=float).reshape(-1, 2)
    p1 = np.array([m.end[:2] for m in beams], dtype=float).reshape(-1, 2)
    d = p1 - p0
    plan_len = np.hypot(d[:, 0], d[:, 1])
    length3d = np.array([m.length for m in beams], dtype=float)
    beam_guids = {m.guid for m in beams}
    return _Beams(
        members=beams,
        p0=p0,
        t=d / plan_len[:, None],
        plan_len=plan_len,
        angle=np.degrees(np.arctan2(d[:, 1], d[:, 0])) % 180.0,
        length3d=length3d,
        top=np.array([m.top_of_steel for m in beams], dtype=float),
        span=np.array([(spans[m.guid].start, spans[m.guid].end) for m in beams]).reshape(-1, 2),
        scale=length3d / plan_len,
        infill=np.array([_is_infill(framing, m.guid, beam_guids) for m in beams], dtype=bool),
    )


def _is_infill(framing: Framing, guid: str, beams: set[str]) -> bool:
    """Both ends bear on beams only (no column or wall at either end)."""
    by_end: dict[str, set[str]] = {}
    for s in framing.members[guid].supports:
        if s.end is not None:
            by_end.setdefault(s.end, set()).add(s.by)
    return len(by_end) == 2 and all(hosts <= beams for hosts in by_end.values())


def _compute_tributary(model: Model, settings: Settings, framing: Framing) -> TributaryResult:
    capable, unable = load_capable(model, framing)
    spans = beam_spans(model, framing, capable)
    result = TributaryResult(beams={}, deck_spans={}, unable=unable, spans=spans)
    if not capable:
        return result
    bm = _beam_arrays(capable, spans, framing)
    entries = level_entries(model, settings)
    by_level: dict[str, list[int]] = {}
    for i, m in enumerate(capable):
        by_level.setdefault(level_of(m), []).append(i)

    n = len(capable)
    family_of = np.full(n, -1)
    fam_p = np.zeros((n, 2))  # the family's +p direction for each beam
    half = np.zeros((n, 2))  # half gaps toward +p and -p (0 where no neighbour)
    nb = np.full((n, 2), -1)  # neighbours toward +p and -p
    level_families: dict[str, list[_Family]] = {}
    for level, rows in by_level.items():
        fams = _families(np.asarray(rows), bm, family_of, fam_p, half, nb)
        level_families[level] = fams
        result.deck_spans[level] = _deck_span(level, fams, bm, entries.get(level))

    slabs = model.slabs
    cand = _bearing_slabs(bm, slabs, settings.framing.slab_bearing_tolerance)
    deck_cache: dict[tuple[str, str | None], int | None] = {}

    def deck_family(level: str, slab: Slab | None) -> int | None:
        key = (level, slab.guid if slab is not None else None)
        if key not in deck_cache:
            fams = level_families[level]
            angle = _override_angle(settings.loads.slabs.get(slab.guid)) if slab else None
            beam_dir = result.deck_spans[level].beam_angle
            if angle is not None:
                beam_dir = (angle + 90.0) % 180.0
            deck_cache[key] = None if beam_dir is None else _nearest_family(fams, beam_dir)
        return deck_cache[key]

    # nominal strips: the deck family with edge extensions, support centreline to centreline
    edge_ext = np.zeros(n)
    for families in level_families.values():
        for family in families:
            # a lone beam (no spacing known) takes the floor out to the slab edge
            edge_ext[family.members] = (
                family.spacing if family.spacing is not None else bm.plan_len[family.members]
            )
    t = bm.t
    nrm = np.stack([-t[:, 1], t[:, 0]], axis=1)
    flip = np.einsum("ij,ij->i", nrm, fam_p) < 0  # the beam's own left is -p
    nrm[flip] *= -1.0  # now nrm is +p for every beam
    ext_plus = np.where(nb[:, 0] >= 0, half[:, 0], edge_ext)
    ext_minus = np.where(nb[:, 1] >= 0, half[:, 1], edge_ext)
    a = bm.p0 + t * (bm.span[:, 0] / bm.scale)[:, None]
    b = bm.p0 + t * (bm.span[:, 1] / bm.scale)[:, None]
    rects = _strips(a, b, t, nrm, ext_plus, ext_minus, 0.0)

    to_clip: list[list[int]] = [[] for _ in capable]
    trs: list[Tributary] = []
    for i, m in enumerate(capable):
        level = level_of(m)
        fam: dict[str | None, int | None] = {None: deck_family(level, None)}
        for si in cand.get(i, []):
            fam[slabs[si].guid] = deck_family(level, slabs[si])
        tr = _beam_tributary(
            m, capable, slabs, cand.get(i, []), int(family_of[i]),
            (float(ext_plus[i]), float(ext_minus[i])), (int(nb[i, 0]), int(nb[i, 1])),
            bool(flip[i]), fam, to_clip[i],
        )  # fmt: skip
        if result.deck_spans[level].angle is None:
            tr.role, to_clip[i] = "other", []
        result.beams[m.guid] = tr
        trs.append(tr)
    jobs, taken = _clip_jobs(to_clip, rects, slabs, bm, trs)

    # integrate every clipped strip in one pass
    owner = np.array([i for i, js in enumerate(jobs) for _ in js], dtype=int)
    flat = [j for js in jobs for j in js]
    got = _integrate([j.geom for j in flat], a[owner], t[owner], nrm[owner],
                     (bm.span[owner, 1] - bm.span[owner, 0]) / bm.scale[owner])  # fmt: skip
    side = np.zeros((n, 2))
    for k, (i, job) in enumerate(zip(owner.tolist(), flat, strict=True)):
        tr = result.beams[capable[i].guid]
        s0, sc = float(bm.span[i, 0]), float(bm.scale[i])
        for kind in job.kinds:
            tr.pieces += [WidthPiece(s0 + u0 * sc, s0 + u1 * sc, w / sc, job.slab, kind)
                          for u0, u1, w in got.runs[k]]  # fmt: skip
        if "floor" in job.kinds:
            side[i] += (got.plus[k], got.minus[k])
    for i in np.unique(owner).tolist():
        # a side without a neighbour reaches the slab edge: report its mean width
        tr = result.beams[capable[i].guid]
        length = (bm.span[i, 1] - bm.span[i, 0]) / bm.scale[i]
        wp = float(side[i, 0] / length) if nb[i, 0] < 0 else float(half[i, 0])
        wm = float(side[i, 1] / length) if nb[i, 1] < 0 else float(half[i, 1])
        _set_widths(tr, wp, wm, bool(flip[i]), capable, int(nb[i, 0]), int(nb[i, 1]))
    _open_sides(result, bm, slabs, cand, nb, flip, nrm, a, b, edge_ext, family_of)
    _deliver_leftovers(result, bm, slabs, cand, taken)
    return result


def _open_sides(
    result: TributaryResult, bm: _Beams, slabs: Sequence[Slab], cand: dict[int, list[int]],
    nb: np.ndarray, flip: np.ndarray, nrm: np.ndarray, a: np.ndarray, b: np.ndarray,
    reach: np.ndarray, family_of: np.ndarray,
) -> None:  # fmt: skip
    """The sides of each beam with no parallel neighbour, and the mean width of the
    floor beyond it there (its bearing slabs within ``reach`` of its line)."""
    rows = [(i, side) for i in range(len(bm.members)) for side in (0, 1)
            if family_of[i] >= 0 and nb[i, side] < 0]  # fmt: skip
    if not rows:
        return
    idx = np.array([i for i, _ in rows], dtype=int)
    plus = np.array([side == 0 for _, side in rows])
    ext = reach[idx]
    rects = _strips(a[idx], b[idx], bm.t[idx], nrm[idx], np.where(plus, ext, 0.0),
                    np.where(plus, 0.0, ext), 0.0)  # fmt: skip
    union: dict[int, BaseGeometry] = {}
    for i in set(idx.tolist()):
        feet = [slabs[si].footprint for si in cand.get(i, [])]
        union[i] = shapely.union_all(feet) if feet else shapely.Polygon()
    floors = np.array([union[i] for i in idx.tolist()], dtype=object)
    area = shapely.area(shapely.intersection(rects, floors))
    length = np.maximum(np.linalg.norm(b[idx] - a[idx], axis=1), 1e-9)
    for (i, side), ar, ln in zip(rows, area.tolist(), length.tolist(), strict=True):
        where = "left" if (side == 0) != bool(flip[i]) else "right"
        result.beams[bm.members[i].guid].open_sides.append((where, ar / ln))


def _families(
    rows: np.ndarray, bm: _Beams, family_of: np.ndarray, fam_p: np.ndarray,
    half: np.ndarray, nb: np.ndarray,
) -> list[_Family]:  # fmt: skip
    """Families of parallel beams on one level, their neighbours and spacing."""
    labels = plan_families(bm.angle[rows])
    fams: list[_Family] = []
    for f in range(int(labels.max()) + 1 if rows.size else 0):
        members = rows[labels == f]
        direction = family_direction(bm.angle[members])
        td = np.array([math.cos(math.radians(direction)), math.sin(math.radians(direction))])
        pd = np.array([-td[1], td[0]])
        ua = bm.p0[members] @ td
        ub = (bm.p0[members] + bm.t[members] * bm.plan_len[members, None]) @ td
        mid = bm.p0[members] + 0.5 * bm.t[members] * bm.plan_len[members, None]
        found = find_neighbours(np.minimum(ua, ub), np.maximum(ua, ub), mid @ pd)
        nearest = np.minimum(found.gap_plus, found.gap_minus)
        finite = np.isfinite(nearest)
        spacing = float(np.median(nearest[finite])) if finite.any() else None
        if spacing is not None:
            for gap, nbr in ((found.gap_plus, found.plus), (found.gap_minus, found.minus)):
                too_far = gap > FAR_NEIGHBOUR * spacing
                gap[too_far] = np.inf
                nbr[too_far] = -1
        family_of[members] = len(fams)
        fam_p[members] = pd
        half[members, 0] = np.where(np.isfinite(found.gap_plus), found.gap_plus / 2, 0.0)
        half[members, 1] = np.where(np.isfinite(found.gap_minus), found.gap_minus / 2, 0.0)
        nb[members, 0] = np.where(found.plus >= 0, members[np.maximum(found.plus, 0)], -1)
        nb[members, 1] = np.where(found.minus >= 0, members[np.maximum(found.minus, 0)], -1)
        fams.append(_Family(direction, members, spacing, int(bm.infill[members].sum())))
    return fams


def _deck_span(level: str, fams: list[_Family], bm: _Beams, entry: StoreyLoads | None) -> DeckSpan:
    """The deck direction of a level: from the settings, else from the infill beams."""
    families = [(f.direction, int(f.members.size), f.spacing) for f in fams]
    override = _override_angle(entry)
    basis = ""
    chosen: int | None
    span_angle: float | None
    source: Literal["inferred", "settings", "none"]
    if override is not None:
        chosen = _nearest_family(fams, (override + 90.0) % 180.0)
        span_angle, source = override, "settings"
    else:
        counts = [f.infill for f in fams]
        best = max(counts, default=0)
        chosen = counts.index(best) if best > 0 and counts.count(best) == 1 else None
        basis = "infill beams" if chosen is not None else ""
        if chosen is None and best == 0 and len(fams) == 1 and fams[0].spacing is not None:
            chosen, basis = 0, "the only family of parallel beams"
        span_angle = (fams[chosen].direction + 90.0) % 180.0 if chosen is not None else None
        source = "inferred" if chosen is not None else "none"
    return DeckSpan(
        storey=level,
        angle=span_angle,
        source=source,
        beam_angle=fams[chosen].direction if chosen is not None else None,
        typical_spacing=fams[chosen].spacing if chosen is not None else None,
        families=families,
        evidence=(
            (fams[chosen].infill or int(fams[chosen].members.size)) if chosen is not None else 0
        ),
        basis="settings" if override is not None else basis,
    )


def _bearing_slabs(bm: _Beams, slabs: Sequence[Slab], tolerance: float) -> dict[int, list[int]]:
    """Per beam row, the slabs bearing on it: the underside at its top of steel (a
    declared deck: every beam of its level), footprints meeting its span line."""
    cand: dict[int, list[int]] = {}
    if not slabs:
        return cand
    foot = np.array([s.footprint for s in slabs], dtype=object)
    under = np.array([s.underside for s in slabs], dtype=float)
    slab_top = np.array([s.top for s in slabs], dtype=float)
    tol = np.array([bearing_tolerance(s, tolerance) for s in slabs], dtype=float)
    a = bm.p0 + bm.t * (bm.span[:, 0] / bm.scale)[:, None]
    b = bm.p0 + bm.t * (bm.span[:, 1] / bm.scale)[:, None]
    lines = shapely.linestrings(np.stack([a, b], axis=1))
    bi, si = STRtree(foot).query(lines, predicate="intersects")
    level = np.array([level_of(m) for m in bm.members], dtype=object)
    slab_level = np.array([s.level for s in slabs], dtype=object)
    declared = np.array([s.declared for s in slabs], dtype=bool)
    bearing = np.abs(under[si] - bm.top[bi]) <= tol[si]
    bearing &= ~declared[si] | (slab_level[si] == level[bi])
    for i, s in zip(bi[bearing].tolist(), si[bearing].tolist(), strict=True):
        cand.setdefault(i, []).append(s)
    # slabs stacked on a bearing slab (a topping on a deck) are carried too
    for i, s in zip(bi[~bearing].tolist(), si[~bearing].tolist(), strict=True):
        if i in cand and any(abs(under[s] - slab_top[c]) <= tolerance for c in cand[i]):
            cand[i].append(s)
    return cand


def _deliver_leftovers(
    result: TributaryResult, bm: _Beams, slabs: Sequence[Slab], cand: dict[int, list[int]],
    taken: dict[int, list[BaseGeometry]],
) -> None:  # fmt: skip
    """Every bearing slab's floor that no strip took goes to its nearest beam."""
    bearing_on: dict[int, list[int]] = {}
    for i, ss in cand.items():
        for s in ss:
            bearing_on.setdefault(s, []).append(i)
    leftovers = []
    for si, beams in sorted(bearing_on.items()):
        slab = slabs[si]
        levels = {level_of(bm.members[i]) for i in beams}
        computed = all(result.deck_spans[lv].angle is not None for lv in levels)
        area = float(slab.footprint.area)
        result.floors.append(FloorArea(slab.guid, slab.level or slab.storey, area,
                                       computed=computed))  # fmt: skip
        if not computed:
            continue
        strips = taken.get(si, [])
        rest = shapely.difference(slab.footprint, shapely.union_all(strips)) if strips else (
            slab.footprint
        )  # fmt: skip
        leftovers.append((si, rest))
    pieces, lost = leftover_pieces(leftovers, bearing_on, bm.p0, bm.t, bm.span, bm.scale)
    delivered: dict[int, float] = {}
    for p in pieces:
        slab = slabs[p.slab]
        tr = result.beams[bm.members[p.beam].guid]
        w = p.area / (p.end - p.start)
        tr.pieces.append(WidthPiece(p.start, p.end, w, slab.guid, "floor"))
        if _has_self_weight(slab):
            tr.pieces.append(WidthPiece(p.start, p.end, w, slab.guid, "slab"))
        delivered[p.slab] = delivered.get(p.slab, 0.0) + p.area
    for si, area in lost.items():
        result.warnings.append(
            (slabs[si].guid, f"{area:.2f} m² of floor of slab {slabs[si].name or slabs[si].guid} "
             "reaches no beam: its load is not carried")
        )  # fmt: skip
    strip_area: dict[str, float] = {}
    for tr in result.beams.values():
        for piece in tr.pieces:
            if piece.kind == "floor" and piece.slab is not None:
                strip_area[piece.slab] = strip_area.get(piece.slab, 0.0) + (
                    (piece.end - piece.start) * piece.width
                )
    for fa in result.floors:
        fa.delivered = strip_area.get(fa.slab, 0.0)


def _has_self_weight(slab: Slab) -> bool:
    return (slab.self_weight or 0.0) > 0.0 if slab.self_weight is not None else slab.thickness > 0


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
    family: int,
    extent: tuple[float, float],
    nbrs: tuple[int, int],
    flip: bool,
    deck_family: dict[str | None, int | None],
    to_clip: list[int],
) -> Tributary:
    """Role, nominal widths and notes of one beam; slabs to clip its strip to
    go to ``to_clip``. ``extent`` is how far its strip reaches on each side (half
    the gap to a neighbour, or out toward the slab edge); ``deck_family`` gives
    the family the deck spans between on each slab (key: slab GUID) and on the
    level (key None)."""
    plus_gap, minus_gap = extent
    nb_plus, nb_minus = nbrs
    tr = Tributary(guid=m.guid, storey=level_of(m), role="other")

    def is_deck_beam(slab: Slab | None) -> bool:
        return deck_family[slab.guid if slab is not None else None] == family

    if not candidates:
        tr.role = "deck" if is_deck_beam(None) else "girder"
        return tr
    deck_slabs = [s for s in candidates if is_deck_beam(slabs[s])]
    if not deck_slabs:
        tr.role = "girder"
        return tr
    tr.role = "deck"
    _set_widths(tr, plus_gap, minus_gap, flip, beams, nb_plus, nb_minus)
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
    bm: _Beams,
    trs: list[Tributary],
) -> tuple[list[list[_Job]], dict[int, list[BaseGeometry]]]:
    """Clip each deck beam's strip to its slabs (vectorised); a strip wholly on
    one slab becomes a full-span piece at once, the others become jobs.
    Also returns, per slab index, the floor geometry the strips took."""
    jobs: list[list[_Job]] = [[] for _ in to_clip]
    taken: dict[int, list[BaseGeometry]] = {}
    pb = np.array([i for i, ss in enumerate(to_clip) for _ in ss], dtype=int)
    ps = np.array([s for ss in to_clip for s in ss], dtype=int)
    if pb.size == 0:
        return jobs, taken
    foot = np.array([s.footprint for s in slabs], dtype=object)
    n_slabs = np.bincount(pb, minlength=len(to_clip))
    one = n_slabs[pb] == 1
    covered = np.zeros(pb.size, dtype=bool)
    covered[one] = shapely.covers(foot[ps[one]], rects[pb[one]])
    for i, si in zip(pb[covered].tolist(), ps[covered].tolist(), strict=True):
        tr, sl = trs[i], slabs[si]
        s0, s1 = float(bm.span[i, 0]), float(bm.span[i, 1])
        w = float((tr.left + tr.right) / bm.scale[i])  # per station length
        tr.pieces.append(WidthPiece(s0, s1, w, sl.guid, "floor"))
        if _has_self_weight(sl):
            tr.pieces.append(WidthPiece(s0, s1, w, sl.guid, "slab"))
        taken.setdefault(si, []).append(rects[i])
    pb, ps = pb[~covered], ps[~covered]
    clips = shapely.intersection(rects[pb], foot[ps])
    keep = ~shapely.is_empty(clips)
    pb, ps, clips = pb[keep], ps[keep], clips[keep]
    for si, clip in zip(ps.tolist(), clips, strict=True):
        taken.setdefault(si, []).append(clip)
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
        return ("floor", "slab") if _has_self_weight(sl) else ("floor",)

    for i, ks in by_beam.items():
        if i not in overlapping:
            jobs[i] += [_Job(clips[k], slabs[ps[k]].guid, kinds(slabs[ps[k]])) for k in ks]
            continue
        union: BaseGeometry | None = None
        for k in ks:
            sl, clip = slabs[ps[k]], clips[k]
            floor = clip if union is None else shapely.difference(clip, union)
            jobs[i].append(_Job(floor, sl.guid, ("floor",)))
            if _has_self_weight(sl):
                jobs[i].append(_Job(clip, sl.guid, ("slab",)))
            union = clip if union is None else shapely.union(union, clip)
    return jobs, taken
