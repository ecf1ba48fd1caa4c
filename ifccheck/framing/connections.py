"""Connection detection: which member ends lie on which member bodies or walls,
and which beams pass over a column or rest on a member crossing beneath.

All tests run on candidate pairs from the spatial index, vectorised in numpy.
A host's local frame is (u along its axis, lat across its flanges, web up its
depth); an end point's offsets in that frame are its station ``s``, lateral
offset ``a`` and depthwise offset ``b`` from the host's centroid line.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import shapely
from shapely import STRtree

from ifccheck.config import FramingSettings
from ifccheck.framing.index import BoxIndex, MemberGeometry, body_boxes, is_in
from ifccheck.model import Wall

# Members closer to parallel than this do not frame into each other at an end
# (collinear members meeting end to end are a splice or a continuation).
PARALLEL_COSINE = float(np.cos(np.radians(10.0)))
# The brace station is where the connector's axis crosses the host's web plane
# when the connector is at least this far from parallel in plan (sin 15°);
# otherwise the projection of its end point onto the host's axis.
CROSSING_SINE = float(np.sin(np.radians(15.0)))
# A bracing end within this fraction of the host depth from its centroid is
# "mid-depth" and restrains both flanges; beyond it, the nearer flange.
MID_DEPTH_FRACTION = 1.0 / 6.0

KIND_FRAMING = "framing"
KIND_BRACE = "brace"
KIND_SUPPORT = "support"


@dataclass
class Links:
    """One row per connection of a member (``conn``) onto a host.

    ``end`` is 0 (start), 1 (end) or -1 (an intermediate point of ``conn``).
    ``host`` indexes the members, or the walls where ``host_wall``.
    ``station`` runs along the host (0 for walls), ``at`` along ``conn``.
    """

    conn: np.ndarray
    end: np.ndarray
    host: np.ndarray
    host_wall: np.ndarray
    station: np.ndarray
    at: np.ndarray
    kind: np.ndarray
    flange: np.ndarray

    @staticmethod
    def empty() -> Links:
        i = np.zeros(0, dtype=np.int64)
        f = np.zeros(0, dtype=float)
        return Links(i, i, i, np.zeros(0, bool), f, f, np.zeros(0, "<U7"), np.zeros(0, "<U6"))

    def __len__(self) -> int:
        return len(self.conn)

    def select(self, mask: np.ndarray) -> Links:
        return Links(*(getattr(self, f)[mask] for f in _FIELDS))

    @staticmethod
    def concat(parts: list[Links]) -> Links:
        parts = [p for p in parts if len(p)] or [Links.empty()]
        return Links(*(np.concatenate([getattr(p, f) for p in parts]) for f in _FIELDS))


_FIELDS = ("conn", "end", "host", "host_wall", "station", "at", "kind", "flange")


@dataclass
class WallGeometry:
    walls: list[Wall]
    footprint: np.ndarray  # shapely polygons grown by the gap
    base: np.ndarray
    top: np.ndarray
    tree: STRtree | None


def wall_geometry(walls: list[Wall], gap: float) -> WallGeometry:
    """Wall footprints grown by the gap tolerance, in an STRtree."""
    foot = np.array([shapely.buffer(w.footprint, gap, join_style="mitre") for w in walls])
    base = np.array([w.base for w in walls], dtype=float)
    top = np.array([w.top for w in walls], dtype=float)
    return WallGeometry(walls, foot, base, top, STRtree(foot) if len(walls) else None)


def host_index(geom: MemberGeometry, fs: FramingSettings) -> BoxIndex:
    """Index over host bodies, grown so any accepted end falls inside the box."""
    half = 0.5 * np.maximum(geom.depth, geom.width)
    reach = float(geom.depth[geom.valid].max(initial=0.0))  # deepest connector
    grow_xy = half + fs.gap
    grow_z = half + reach + fs.elevation_tolerance + fs.gap
    lo, hi = body_boxes(geom, grow_xy, grow_z)
    host = geom.is_host
    lo[~host] = np.inf  # never matches: an empty box
    hi[~host] = -np.inf
    return BoxIndex(lo, hi)


def _flange_from_offset(b: np.ndarray, d_host: np.ndarray) -> np.ndarray:
    """Flange a bracing end restrains, from its depthwise offset b."""
    lim = MID_DEPTH_FRACTION * d_host
    return np.where(b < -lim, "bottom", np.where(b > lim, "top", "both"))


def end_links(
    geom: MemberGeometry, walls: WallGeometry, fs: FramingSettings, index: BoxIndex
) -> Links:
    """Connections of every connector end onto member bodies and walls.

    An end carried by a column or a wall is not also taken as framing into a
    beam whose body reaches the same point (the column or wall carries it).
    """
    gap, tol = fs.gap, fs.elevation_tolerance
    conn = np.flatnonzero(geom.is_connector & geom.valid)
    nc = len(conn)
    pts = np.concatenate([geom.p0[conn], geom.p1[conn]])
    owner = np.concatenate([conn, conn])
    which = np.repeat([0, 1], nc)

    qi, h = index.query(pts, pts)
    keep = owner[qi] != h
    qi, h = qi[keep], h[keep]
    a_idx = owner[qi]
    p = pts[qi]
    d_a = geom.depth[a_idx]
    d_b = geom.depth[h]
    w_b = geom.width[h]
    vert = geom.vertical[h]

    # -- non-vertical hosts: offsets in the host's frame
    r = p - geom.p0[h]
    s = np.einsum("ij,ij->i", r, geom.u[h])
    a = np.einsum("ij,ij->i", r, geom.lat[h])
    b = np.einsum("ij,ij->i", r, geom.web[h])
    along = np.einsum("ij,ij->i", geom.u[a_idx], geom.u[h])
    beam_conn = geom.is_beam[a_idx]
    # a beam end must overlap the host's depth (top-flush, bottom-flush, any
    # depths) or bear on its top; it cannot hang below it
    upper_ok = b - 0.5 * d_a <= 0.5 * d_b + tol
    lower_beam = (b >= -0.5 * d_b - tol) | (b + 0.5 * d_a > -0.5 * d_b)
    # a brace or kicker may meet either flange from outside
    lower_brace = b + 0.5 * d_a >= -0.5 * d_b - tol
    elev_ok = upper_ok & np.where(beam_conn, lower_beam, lower_brace)
    ok_line = (
        ~vert
        & (s >= -gap)
        & (s <= geom.length[h] + gap)
        & (np.abs(a) <= 0.5 * w_b + gap)
        & elev_ok
        & (np.abs(along) < PARALLEL_COSINE)
    )
    # station where the connector's axis crosses the host's web plane
    across = np.einsum("ij,ij->i", geom.u[a_idx], geom.lat[h])
    skew = np.abs(across) > CROSSING_SINE
    s_cross = s - np.divide(a * along, across, out=np.zeros_like(a), where=skew)
    station_line = np.clip(np.where(skew, s_cross, s), 0.0, geom.length[h])

    # -- vertical hosts: plan distance from the axis at the end's elevation
    z0, z1 = geom.p0[h, 2], geom.p1[h, 2]
    dz = np.where(np.abs(z1 - z0) > 1e-9, z1 - z0, 1.0)
    t = np.clip((p[:, 2] - z0) / dz, 0.0, 1.0)
    axis = geom.p0[h] + t[:, None] * (geom.p1[h] - geom.p0[h])
    plan = np.hypot(p[:, 0] - axis[:, 0], p[:, 1] - axis[:, 1])
    zb, zt = np.minimum(z0, z1), np.maximum(z0, z1)
    underside = p[:, 2] - 0.5 * d_a
    # a beam end: the column comes up from below it and reaches its underside;
    # a bracing end: anywhere along the column's height
    bears = (zb <= underside + tol) & (zt >= underside - tol)
    meets = (p[:, 2] >= zb - tol - 0.5 * d_a) & (p[:, 2] <= zt + tol + 0.5 * d_a)
    ok_col = (
        vert
        & (plan <= 0.5 * np.maximum(d_b, w_b) + gap)
        & np.where(beam_conn, bears, meets)
        & (np.abs(along) < PARALLEL_COSINE)
    )
    station_col = t * geom.length[h]

    ok = ok_line | ok_col
    qi, h, a_idx = qi[ok], h[ok], a_idx[ok]
    vert, b, d_b, d_a = vert[ok], b[ok], d_b[ok], d_a[ok]
    station = np.where(vert, station_col[ok], station_line[ok])

    # -- walls: end inside the grown footprint, underside within the wall height
    wq, ww = _wall_hits(walls, pts, geom.depth[owner], fs)

    strong = np.zeros(len(pts), dtype=bool)
    strong[qi[vert]] = True
    strong[wq] = True
    keep = vert | ~strong[qi]
    qi, h, a_idx, vert, b, d_b, d_a, station = (
        x[keep] for x in (qi, h, a_idx, vert, b, d_b, d_a, station)
    )

    beam_conn = geom.is_beam[a_idx]
    kind = np.where(beam_conn, np.where(vert, KIND_SUPPORT, KIND_FRAMING), KIND_BRACE)
    on_top = b - 0.5 * d_a >= 0.5 * d_b - tol
    flange = np.where(
        beam_conn,
        np.where(vert, "both", np.where(on_top, "top", "both")),
        np.where(vert, "both", _flange_from_offset(b, d_b)),
    )
    member_links = Links(
        conn=a_idx,
        end=which[qi],
        host=h,
        host_wall=np.zeros(len(h), bool),
        station=station,
        at=np.where(which[qi] == 0, 0.0, geom.length[a_idx]),
        kind=kind.astype("<U7"),
        flange=flange.astype("<U6"),
    )
    member_links = _resolve_mutual(geom, member_links)

    wa = owner[wq]
    wall_links = Links(
        conn=wa,
        end=which[wq],
        host=ww,
        host_wall=np.ones(len(ww), bool),
        station=np.zeros(len(ww)),
        at=np.where(which[wq] == 0, 0.0, geom.length[wa]),
        kind=np.where(geom.is_beam[wa], KIND_SUPPORT, KIND_BRACE).astype("<U7"),
        flange=np.full(len(ww), "both", "<U6"),
    )
    return Links.concat([member_links, wall_links])


def _wall_hits(
    walls: WallGeometry, pts: np.ndarray, d_a: np.ndarray, fs: FramingSettings
) -> tuple[np.ndarray, np.ndarray]:
    """(point row, wall row) for ends inside a wall's grown footprint and height."""
    if walls.tree is None or not len(pts):
        e = np.zeros(0, dtype=np.int64)
        return e, e
    qi, wi = walls.tree.query(shapely.points(pts[:, :2]), predicate="intersects")
    underside = pts[qi, 2] - 0.5 * d_a[qi]
    tol = fs.elevation_tolerance
    ok = (underside > walls.base[wi] + tol) & (underside <= walls.top[wi] + tol)
    return qi[ok].astype(np.int64), wi[ok].astype(np.int64)


def _resolve_mutual(geom: MemberGeometry, links: Links) -> Links:
    """Two beams whose ends meet each other (a corner with no column): the
    deeper one carries the other; equal depths keep both (reported as a cycle)."""
    beam = (links.kind == KIND_FRAMING) & geom.is_beam[links.host]
    if not beam.any():
        return links
    n = geom.n + 1
    key = links.conn * n + links.host
    rev = links.host * n + links.conn
    mutual = beam & is_in(rev, key[beam])
    drop = mutual & (geom.depth[links.conn] > geom.depth[links.host] + 1e-9)
    return links.select(~drop)


def intermediate_links(
    geom: MemberGeometry,
    walls: WallGeometry,
    fs: FramingSettings,
    index: BoxIndex,
    ends: Links,
) -> Links:
    """Supports within a beam's length: a column whose top (or body) meets the
    beam's underside, a member crossing beneath it, or a wall beneath it."""
    gap, tol = fs.gap, fs.elevation_tolerance
    beams = np.flatnonzero(geom.is_beam & geom.valid & ~geom.vertical)
    if not len(beams):
        return Links.empty()
    lo, hi = body_boxes(geom, 0.5 * geom.width + gap, 0.5 * geom.depth + tol + gap)
    qi, h = index.query(lo[beams], hi[beams])
    a_idx = beams[qi]
    keep = a_idx != h
    a_idx, h = a_idx[keep], h[keep]
    vert = geom.vertical[h]
    found = Links.concat(
        [
            _columns_under(geom, a_idx[vert], h[vert], gap, tol),
            _members_beneath(geom, a_idx[~vert], h[~vert], gap, tol),
        ]
    )
    # pairs already linked at an end (either way) are not intermediate supports
    n = geom.n + 1
    m = ~ends.host_wall
    have = np.concatenate([ends.conn[m] * n + ends.host[m], ends.host[m] * n + ends.conn[m]])
    found = found.select(~is_in(found.conn * n + found.host, have))
    return Links.concat([found, _walls_beneath(geom, walls, beams, gap, tol)])


def _columns_under(
    geom: MemberGeometry, a: np.ndarray, c: np.ndarray, gap: float, tol: float
) -> Links:
    """Beam a passes over or into column c within its length."""
    if not len(a):
        return Links.empty()
    # the beam's elevation over the column top, then the column's axis point at
    # that elevation (the same plan point for a plumb column)
    top_pt = np.where((geom.p1[c, 2] >= geom.p0[c, 2])[:, None], geom.p1[c], geom.p0[c])
    _, _, za = _plan_station(geom, a, top_pt)
    z0, z1 = geom.p0[c, 2], geom.p1[c, 2]
    zb, zt = np.minimum(z0, z1), np.maximum(z0, z1)
    t = np.clip((za - z0) / np.where(np.abs(z1 - z0) > 1e-9, z1 - z0, 1.0), 0.0, 1.0)
    axis = geom.p0[c] + t[:, None] * (geom.p1[c] - geom.p0[c])
    s_plan, off, za = _plan_station(geom, a, axis)
    underside = za - 0.5 * geom.depth[a] * np.abs(geom.web[a, 2])
    half = 0.5 * np.maximum(geom.depth[c], geom.width[c])
    zone = half + gap
    ok = (
        (off <= half + gap)
        & (zb <= underside + tol)
        & (zt >= underside - tol)
        & (s_plan >= zone)
        & (s_plan <= geom.length[a] - zone)
    )
    a, c, s_plan, t = a[ok], c[ok], s_plan[ok], t[ok]
    return Links(
        conn=a,
        end=np.full(len(a), -1),
        host=c,
        host_wall=np.zeros(len(a), bool),
        station=t * geom.length[c],
        at=s_plan,
        kind=np.full(len(a), KIND_SUPPORT, "<U7"),
        flange=np.full(len(a), "both", "<U6"),
    )


def _plan_station(
    geom: MemberGeometry, a: np.ndarray, pt: np.ndarray
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Station along member a (3D) of the plan projection of pt, the plan
    offset of pt from a's line, and a's centroid elevation there."""
    d = geom.p1[a] - geom.p0[a]
    dxy = d[:, :2]
    lp = np.linalg.norm(dxy, axis=1)
    ok = lp > 1e-9
    ux = np.divide(dxy, lp[:, None], out=np.zeros_like(dxy), where=ok[:, None])
    r = pt[:, :2] - geom.p0[a, :2]
    sp = np.einsum("ij,ij->i", r, ux)
    off = np.abs(r[:, 0] * ux[:, 1] - r[:, 1] * ux[:, 0])
    frac = np.divide(sp, lp, out=np.zeros_like(sp), where=ok)
    z = geom.p0[a, 2] + frac * d[:, 2]
    return frac * geom.length[a], off, z


def _members_beneath(
    geom: MemberGeometry, a: np.ndarray, g: np.ndarray, gap: float, tol: float
) -> Links:
    """Beam a rests on member g crossing beneath it (a's underside on g's top)."""
    if not len(a):
        return Links.empty()
    pa, ra = geom.p0[a, :2], (geom.p1[a] - geom.p0[a])[:, :2]
    pg, rg = geom.p0[g, :2], (geom.p1[g] - geom.p0[g])[:, :2]
    cross = ra[:, 0] * rg[:, 1] - ra[:, 1] * rg[:, 0]
    la, lg = np.linalg.norm(ra, axis=1), np.linalg.norm(rg, axis=1)
    skew = np.abs(cross) > CROSSING_SINE * la * lg
    safe = np.where(skew, cross, 1.0)
    w = pg - pa
    ta = (w[:, 0] * rg[:, 1] - w[:, 1] * rg[:, 0]) / safe
    tg = (w[:, 0] * ra[:, 1] - w[:, 1] * ra[:, 0]) / safe
    za = geom.p0[a, 2] + ta * (geom.p1[a, 2] - geom.p0[a, 2])
    zg = geom.p0[g, 2] + tg * (geom.p1[g, 2] - geom.p0[g, 2])
    a_under = za - 0.5 * geom.depth[a] * np.abs(geom.web[a, 2])
    g_top = zg + 0.5 * geom.depth[g] * np.abs(geom.web[g, 2])
    sa, sg = ta * geom.length[a], tg * geom.length[g]
    zone = 0.5 * geom.width[g] + gap
    ok = (
        skew
        & (sa >= zone)
        & (sa <= geom.length[a] - zone)
        & (sg >= -gap)
        & (sg <= geom.length[g] + gap)
        & (np.abs(a_under - g_top) <= tol)
    )
    a, g, sa, sg = a[ok], g[ok], sa[ok], sg[ok]
    return Links(
        conn=a,
        end=np.full(len(a), -1),
        host=g,
        host_wall=np.zeros(len(a), bool),
        station=np.clip(sg, 0.0, geom.length[g]),
        at=sa,
        kind=np.full(len(a), KIND_FRAMING, "<U7"),
        flange=np.full(len(a), "top", "<U6"),
    )


def _walls_beneath(
    geom: MemberGeometry, walls: WallGeometry, beams: np.ndarray, gap: float, tol: float
) -> Links:
    """Beam resting on a wall top within its length (not at its ends)."""
    if walls.tree is None or not len(beams):
        return Links.empty()
    lines = shapely.linestrings(np.stack([geom.p0[beams, :2], geom.p1[beams, :2]], axis=1))
    qi, wi = walls.tree.query(lines, predicate="intersects")
    a = beams[qi]
    seg = shapely.intersection(lines[qi], walls.footprint[wi])
    cen = shapely.get_coordinates(shapely.centroid(seg))
    if len(cen) != len(a):  # an empty intersection has no centroid coordinates
        keep = ~shapely.is_empty(seg)
        a, wi, seg = a[keep], wi[keep], seg[keep]
        cen = shapely.get_coordinates(shapely.centroid(seg))
    s, _, za = _plan_station(geom, a, np.column_stack([cen, np.zeros(len(cen))]))
    underside = za - 0.5 * geom.depth[a] * np.abs(geom.web[a, 2])
    zone = 0.5 * shapely.length(seg) + gap
    ok = (
        (np.abs(underside - walls.top[wi]) <= tol)
        & (s - zone >= 0.0)
        & (s + zone <= geom.length[a])
    )
    a, wi, s = a[ok], wi[ok], s[ok]
    return Links(
        conn=a,
        end=np.full(len(a), -1),
        host=wi.astype(np.int64),
        host_wall=np.ones(len(a), bool),
        station=np.zeros(len(a)),
        at=s,
        kind=np.full(len(a), KIND_SUPPORT, "<U7"),
        flange=np.full(len(a), "both", "<U6"),
    )
