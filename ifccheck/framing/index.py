"""Member geometry as numpy arrays, and a 3D box index over member bodies.

The index is a set of shapely STRtrees, one per horizontal elevation band:
an item goes into every band its z-range touches, a query only into the bands
its own z-range touches. A plan-only tree would return every storey's members
stacked on one grid point; banding keeps the candidates per query to the
members near the query's own elevation, so the cost stays O(n log n) however
tall the building is.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import shapely
from shapely import STRtree

from ifccheck.framing.roles import structural_mask
from ifccheck.model import Member, MemberRole

# Geometry used for a member whose profile did not resolve (common practice:
# a medium floor beam); the member still takes part in the framing.
FALLBACK_DEPTH = 0.300  # m
FALLBACK_WIDTH = 0.150  # m

# A member is treated as vertical (column-like host) above this |direction.z|.
VERTICAL_COSINE = 0.9

CONNECTOR_ROLES = (MemberRole.BEAM, MemberRole.STRUT, MemberRole.BRACE)
GRAPH_ROLES = (MemberRole.BEAM, MemberRole.STRUT, MemberRole.BRACE, MemberRole.COLUMN)


@dataclass
class MemberGeometry:
    """Per-member arrays (row i is ``members[i]``), SI units, global axes.

    ``u`` is the unit axis from start to end, ``web`` the unit depth direction
    (bottom → top flange) made normal to ``u``, ``lat`` the unit flange-width
    direction (``web × u``). ``depth``/``width`` fall back to
    FALLBACK_DEPTH/FALLBACK_WIDTH where the section is missing (``fallback``).
    """

    members: list[Member]
    guids: list[str]
    p0: np.ndarray
    p1: np.ndarray
    u: np.ndarray
    length: np.ndarray
    depth: np.ndarray
    width: np.ndarray
    web: np.ndarray
    lat: np.ndarray
    top: np.ndarray  # highest top of steel along the member
    vertical: np.ndarray  # column-like host: role COLUMN or near-vertical axis
    valid: np.ndarray  # non-zero length and finite coordinates
    fallback: np.ndarray
    is_beam: np.ndarray
    is_bracing: np.ndarray  # STRUT or BRACE
    is_column: np.ndarray
    in_graph: np.ndarray  # BEAM, STRUT, BRACE or COLUMN, and structural
    # may brace or support: a known section or a column, never hardware (roles.py)
    structural: np.ndarray
    excluded_kind: list[str | None]  # why a member of a graph role is not structural

    @property
    def n(self) -> int:
        return len(self.guids)

    @property
    def is_connector(self) -> np.ndarray:
        """Members whose ends are tested for bearing on / framing into a host."""
        return self.is_beam | self.is_bracing

    @property
    def is_host(self) -> np.ndarray:
        return self.in_graph & self.valid


def member_geometry(members: list[Member]) -> MemberGeometry:
    """Vectorise the members' centroid lines, frames and section sizes."""
    n = len(members)
    p0 = np.array([m.start for m in members], dtype=float).reshape(n, 3)
    p1 = np.array([m.end for m in members], dtype=float).reshape(n, 3)
    up = np.array([m.web_up for m in members], dtype=float).reshape(n, 3)
    fallback = np.array([m.section is None for m in members], dtype=bool)
    depth = np.array([m.section.d if m.section else FALLBACK_DEPTH for m in members], float)
    width = np.array([m.section.bf if m.section else FALLBACK_WIDTH for m in members], float)
    role = [m.role for m in members]
    structural, kinds = structural_mask(members)
    is_beam = np.array([r is MemberRole.BEAM for r in role], dtype=bool) & structural
    is_bracing = np.array([r in (MemberRole.STRUT, MemberRole.BRACE) for r in role], dtype=bool)
    is_bracing &= structural
    is_column = np.array([r is MemberRole.COLUMN for r in role], dtype=bool) & structural
    in_graph = is_beam | is_bracing | is_column
    graph_role = np.array([r in GRAPH_ROLES for r in role], dtype=bool)
    excluded = [k if graph_role[i] else None for i, k in enumerate(kinds)]

    d = p1 - p0
    length = np.linalg.norm(d, axis=1)
    valid = np.isfinite(length) & (length > 1e-9)
    u = np.divide(d, length[:, None], out=np.zeros_like(d), where=valid[:, None])

    # Depth direction: web_up made normal to the axis; global z when web_up is
    # missing or along the axis; global x for a vertical member without one.
    web = up - (up * u).sum(1)[:, None] * u
    wn = np.linalg.norm(web, axis=1)
    bad = wn < 1e-6
    z = np.tile([0.0, 0.0, 1.0], (n, 1))
    alt = z - u[:, 2:3] * u
    alt_n = np.linalg.norm(alt, axis=1)
    alt_bad = alt_n < 1e-6
    alt[alt_bad] = np.array([1.0, 0.0, 0.0]) - u[alt_bad, 0:1] * u[alt_bad]
    alt_n = np.linalg.norm(alt, axis=1)
    web[bad] = alt[bad]
    wn[bad] = alt_n[bad]
    web = np.divide(web, wn[:, None], out=np.zeros_like(web), where=wn[:, None] > 0)
    lat = np.cross(web, u)

    top = np.maximum(p0[:, 2], p1[:, 2]) + 0.5 * depth * np.abs(web[:, 2])
    vertical = valid & (is_column | (np.abs(u[:, 2]) > VERTICAL_COSINE))
    vertical &= np.abs(d[:, 2]) > 1e-6
    return MemberGeometry(
        members=members,
        guids=[m.guid for m in members],
        p0=p0,
        p1=p1,
        u=u,
        length=length,
        depth=depth,
        width=width,
        web=web,
        lat=lat,
        top=top,
        vertical=vertical,
        valid=valid,
        fallback=fallback,
        is_beam=is_beam,
        is_bracing=is_bracing,
        is_column=is_column,
        in_graph=in_graph,
        structural=structural,
        excluded_kind=excluded,
    )


def unique_sorted(a: np.ndarray) -> np.ndarray:
    """Sorted unique values. (np.unique on large int64 arrays is hash-based in
    numpy ≥ 2.3 and many times slower than a sort on this workload.)"""
    a = np.sort(a)
    return a[np.r_[True, a[1:] != a[:-1]]] if len(a) else a


def is_in(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Elementwise ``a in b`` for integer arrays, by sort and binary search."""
    b = unique_sorted(b)
    if not len(b):
        return np.zeros(len(a), dtype=bool)
    pos = np.minimum(np.searchsorted(b, a), len(b) - 1)
    return b[pos] == a


def body_boxes(geom: MemberGeometry, grow_xy: np.ndarray, grow_z: np.ndarray):
    """Axis-aligned boxes (lo, hi) around each centroid line, grown per member."""
    lo = np.minimum(geom.p0, geom.p1)
    hi = np.maximum(geom.p0, geom.p1)
    g = np.stack([grow_xy, grow_xy, grow_z], axis=1)
    return lo - g, hi + g


class BoxIndex:
    """Items are 3D axis-aligned boxes; queries return intersecting pairs.

    An item row whose box is not finite (``inf``/``nan``) or is inverted is
    left out, so callers can keep row numbers aligned with their members.
    """

    def __init__(self, lo: np.ndarray, hi: np.ndarray, band: float = 1.5):
        self.lo = np.asarray(lo, dtype=float).reshape(-1, 3)
        self.hi = np.asarray(hi, dtype=float).reshape(-1, 3)
        self.band = band
        self.trees: dict[int, tuple[STRtree, np.ndarray]] = {}
        # rows with a non-finite or inverted box are absent from the index
        present = np.flatnonzero(
            np.isfinite(self.lo).all(1) & np.isfinite(self.hi).all(1) & (self.lo <= self.hi).all(1)
        )
        self.z0 = float(self.lo[present, 2].min()) if len(present) else 0.0
        if not len(present):
            return
        rows, bands = self._expand(self.lo[present, 2], self.hi[present, 2])
        items = present[rows]
        order = np.argsort(bands, kind="stable")
        items, bands = items[order], bands[order]
        cuts = np.flatnonzero(np.diff(bands)) + 1
        for chunk_items, chunk_band in zip(
            np.split(items, cuts), bands[np.r_[0, cuts]], strict=True
        ):
            boxes = shapely.box(
                self.lo[chunk_items, 0],
                self.lo[chunk_items, 1],
                self.hi[chunk_items, 0],
                self.hi[chunk_items, 1],
            )
            self.trees[int(chunk_band)] = (STRtree(boxes), chunk_items)

    def _expand(self, zlo: np.ndarray, zhi: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """(row, band) for every band each z-range touches."""
        b0 = np.floor((zlo - self.z0) / self.band).astype(np.int64)
        b1 = np.floor((zhi - self.z0) / self.band).astype(np.int64)
        count = b1 - b0 + 1
        rows = np.repeat(np.arange(len(zlo)), count)
        offset = np.arange(len(rows)) - np.repeat(np.cumsum(count) - count, count)
        return rows, np.repeat(b0, count) + offset

    def query(self, lo: np.ndarray, hi: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Pairs (query row, item row) whose boxes intersect (closed), unique."""
        lo = np.asarray(lo, dtype=float).reshape(-1, 3)
        hi = np.asarray(hi, dtype=float).reshape(-1, 3)
        empty = np.zeros(0, dtype=np.int64)
        if not self.trees or not len(lo):
            return empty, empty
        ok = np.flatnonzero(np.isfinite(lo).all(1) & np.isfinite(hi).all(1))
        if not len(ok):
            return empty, empty
        rows, bands = self._expand(lo[ok, 2], hi[ok, 2])
        rows = ok[rows]
        order = np.argsort(bands, kind="stable")
        rows, bands = rows[order], bands[order]
        cuts = np.flatnonzero(np.diff(bands)) + 1
        out_q, out_i = [], []
        for chunk_rows, chunk_band in zip(np.split(rows, cuts), bands[np.r_[0, cuts]], strict=True):
            entry = self.trees.get(int(chunk_band))
            if entry is None:
                continue
            tree, items = entry
            boxes = shapely.box(
                lo[chunk_rows, 0], lo[chunk_rows, 1], hi[chunk_rows, 0], hi[chunk_rows, 1]
            )
            qi, ti = tree.query(boxes)
            out_q.append(chunk_rows[qi])
            out_i.append(items[ti])
        if not out_q:
            return empty, empty
        q = np.concatenate(out_q)
        i = np.concatenate(out_i)
        keep = (lo[q, 2] <= self.hi[i, 2]) & (hi[q, 2] >= self.lo[i, 2])
        q, i = q[keep], i[keep]
        if len(q) and (hi[:, 2] - lo[:, 2]).max(initial=0.0) > 0.0:
            # a box spanning several bands can meet one item in more than one band
            key = unique_sorted(q * (len(self.lo) + 1) + i)
            q, i = key // (len(self.lo) + 1), key % (len(self.lo) + 1)
        return q.astype(np.int64), i.astype(np.int64)
