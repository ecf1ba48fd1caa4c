"""Continuous top-flange bracing by slabs bearing on members.

A slab braces the parts of a member's top flange its underside actually sits
on: |slab.underside − member top of steel| ≤ slab_bearing_tolerance, over the
length of the member's plan line inside the slab footprint (openings are
holes in the footprint, so they are excluded). Slabs are found through the
elevation-banded box index (an STRtree per band), so a tall building's
stacked floors are not all candidates for every beam.
"""

from __future__ import annotations

import numpy as np
import shapely

from ifccheck.framing.index import BoxIndex, MemberGeometry
from ifccheck.model import Slab

Interval = tuple[float, float]

# Intervals closer than this are merged (two slabs meeting over a beam).
MERGE_GAP = 1e-6  # m
# A line is tested for partial cover on its part this far in from each end.
END_TRIM = 1e-3  # m


def slab_coverage(
    geom: MemberGeometry, slabs: list[Slab], tolerance: float, members: np.ndarray
) -> dict[int, list[Interval]]:
    """Sorted, merged station intervals covered by bearing slabs, per member row.

    ``members`` lists the member rows to consider; rows with no coverage are
    absent from the result.
    """
    rows = members[geom.valid[members] & ~geom.vertical[members]]
    if not slabs or not len(rows):
        return {}
    xy0, xy1 = geom.p0[rows, :2], geom.p1[rows, :2]
    plan_len = np.linalg.norm(xy1 - xy0, axis=1)
    rows, xy0, xy1, plan_len = (x[plan_len > 1e-9] for x in (rows, xy0, xy1, plan_len))
    ux = (xy1 - xy0) / plan_len[:, None]
    lines = shapely.linestrings(np.stack([xy0, xy1], axis=1))
    foot = np.array([s.footprint for s in slabs], dtype=object)
    shapely.prepare(foot)

    # candidates: plan boxes meet and the slab underside is at the top of steel
    b = shapely.bounds(foot)
    under = np.array([s.underside for s in slabs], dtype=float)
    tol = np.array([bearing_tolerance(s, tolerance) for s in slabs], dtype=float)
    slab_lo = np.column_stack([b[:, 0], b[:, 1], under - tol])
    slab_hi = np.column_stack([b[:, 2], b[:, 3], under + tol])
    top = geom.top[rows]
    li, si = BoxIndex(slab_lo, slab_hi).query(
        np.column_stack([np.minimum(xy0, xy1), top]),
        np.column_stack([np.maximum(xy0, xy1), top]),
    )
    if not len(li):
        return {}

    # whole line under the slab (boundary included): no overlay needed
    full = shapely.covers(foot[si], lines[li])
    # otherwise only lines whose inner part (1 mm off each end) meets the slab
    # can be partly covered; an end merely touching a slab edge is not
    trim = np.minimum(END_TRIM, 0.25 * plan_len)[:, None]
    inner = shapely.linestrings(np.stack([xy0 + trim * ux, xy1 - trim * ux], axis=1))
    part = ~full
    part[part] = shapely.intersects(foot[si[part]], inner[li[part]])

    member_parts = [rows[li[full]]]
    lo_parts = [np.zeros(int(full.sum()))]
    hi_parts = [geom.length[rows[li[full]]]]
    if part.any():
        pl, ps = li[part], si[part]
        inter = shapely.intersection(lines[pl], foot[ps])
        pieces, owner = shapely.get_parts(inter, return_index=True)
        keep = (shapely.get_type_id(pieces) == 1) & (shapely.length(pieces) > 0.0)
        pieces, owner = pieces[keep], owner[keep]
        if len(pieces):
            coords, piece_of = shapely.get_coordinates(pieces, return_index=True)
            line = pl[owner[piece_of]]
            # plan station → station along the 3D centroid line
            scale = geom.length[rows[line]] / plan_len[line]
            st = np.einsum("ij,ij->i", coords - xy0[line], ux[line]) * scale
            starts = np.r_[0, np.flatnonzero(np.diff(piece_of)) + 1]
            m = rows[pl[owner]]
            member_parts.append(m)
            lo_parts.append(np.clip(np.minimum.reduceat(st, starts), 0.0, geom.length[m]))
            hi_parts.append(np.clip(np.maximum.reduceat(st, starts), 0.0, geom.length[m]))
    return _merge(np.concatenate(member_parts), np.concatenate(lo_parts), np.concatenate(hi_parts))


def bearing_tolerance(slab: Slab, default: float) -> float:
    """How far a slab's underside may lie from a top of steel and still bear on it
    (a declared deck bears on every beam of its level)."""
    return slab.bearing_tolerance if slab.bearing_tolerance is not None else default


def _merge(member: np.ndarray, lo: np.ndarray, hi: np.ndarray) -> dict[int, list[Interval]]:
    """Per member, sorted intervals with overlapping or touching ones merged."""
    order = np.lexsort((lo, member))
    out: dict[int, list[Interval]] = {}
    for m, a, b in zip(member[order].tolist(), lo[order].tolist(), hi[order].tolist(), strict=True):
        spans = out.setdefault(m, [])
        if spans and a <= spans[-1][1] + MERGE_GAP:
            if b > spans[-1][1]:
                spans[-1] = (spans[-1][0], b)
        else:
            spans.append((a, b))
    return out


def covers(spans: list[Interval], station: float, tol: float) -> bool:
    """Whether a station lies within any interval grown by tol."""
    return any(a - tol <= station <= b + tol for a, b in spans)
