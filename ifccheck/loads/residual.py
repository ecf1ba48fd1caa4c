"""The floor the deck strips do not reach, delivered to the nearest supporting beam.

One-way strips cover the floor between the beams the deck spans between,
from support centreline to support centreline. What is left of a slab —
the edge beyond the outermost girder line, the corners, the strips beside
openings — still bears on the framing and must reach it, or load would
disappear. The leftover is cut into square cells; each cell goes to the
nearest beam the slab bears on, as a uniform load over the cell's extent
along that beam (clipped to the beam's span). The area is conserved
exactly; its distribution along the beam is to within a cell.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely import STRtree
from shapely.geometry.base import BaseGeometry

# Cell size of the leftover floor (m): small against a bay, large against noise.
CELL = 0.5
# Leftover slivers below this area are rounding of the strip geometry, not floor.
SLIVER = 1e-6  # m²


@dataclass(frozen=True)
class ResidualPiece:
    """Leftover floor of one slab delivered to one beam over [start, end] (stations)."""

    beam: int  # index into the beams given
    slab: int  # index into the slabs given
    start: float
    end: float
    area: float  # m² of floor (plan)


def leftover_pieces(
    leftovers: Sequence[tuple[int, BaseGeometry]],
    candidates: dict[int, list[int]],
    p0: np.ndarray,
    t: np.ndarray,
    span: np.ndarray,
    scale: np.ndarray,
) -> tuple[list[ResidualPiece], dict[int, float]]:
    """Deliver each slab's leftover floor to its nearest candidate beam.

    ``leftovers`` are (slab index, leftover geometry); ``candidates[slab]``
    the beams it bears on. Per beam: ``p0`` its plan start, ``t`` its plan
    direction, ``span`` the (start, end) stations of its span and ``scale``
    station per plan length. Returns the pieces and, per slab, the area that
    reached no beam.
    """
    pieces: list[ResidualPiece] = []
    lost: dict[int, float] = {}
    for si, geom in leftovers:
        if geom.is_empty or geom.area <= SLIVER:
            continue
        beams = candidates.get(si, [])
        if not beams:
            lost[si] = lost.get(si, 0.0) + float(geom.area)
            continue
        cells = _cells(geom)
        if cells.size == 0:
            continue
        lines = shapely.linestrings(
            np.stack(
                [p0[beams] + t[beams] * (span[beams, 0] / scale[beams])[:, None],
                 p0[beams] + t[beams] * (span[beams, 1] / scale[beams])[:, None]], axis=1
            )
        )  # fmt: skip
        nearest = STRtree(lines).query_nearest(shapely.centroid(cells), all_matches=False)[1]
        for cell, k in zip(cells, nearest.tolist(), strict=True):
            b = beams[k]
            pieces.append(_piece(cell, b, si, p0[b], t[b], span[b], scale[b]))
    return pieces, lost


def _cells(geom: BaseGeometry) -> np.ndarray:
    """The leftover cut by a square grid, polygons only."""
    x0, y0, x1, y1 = geom.bounds
    xs = np.arange(np.floor(x0 / CELL), np.ceil(x1 / CELL)) * CELL
    ys = np.arange(np.floor(y0 / CELL), np.ceil(y1 / CELL)) * CELL
    gx, gy = np.meshgrid(xs, ys)
    grid = shapely.box(gx.ravel(), gy.ravel(), gx.ravel() + CELL, gy.ravel() + CELL)
    shapely.prepare(geom)
    hit = grid[shapely.intersects(geom, grid)]
    parts = shapely.intersection(hit, geom)
    parts = parts[shapely.area(parts) > SLIVER * 1e-3]
    return np.asarray(parts, dtype=object)


def _piece(
    cell: BaseGeometry, b: int, si: int, p0: np.ndarray, t: np.ndarray, span: np.ndarray,
    scale: float,
) -> ResidualPiece:  # fmt: skip
    xy = shapely.get_coordinates(cell)
    u = (xy - p0) @ t * scale  # stations along the beam
    lo, hi = float(np.clip(u.min(), span[0], span[1])), float(np.clip(u.max(), span[0], span[1]))
    width = CELL * scale
    if hi - lo < 1e-3 * width:  # beyond the beam's end: over the last cell of its span
        lo, hi = (span[1] - width, span[1]) if lo >= span[1] else (span[0], span[0] + width)
        lo, hi = max(lo, float(span[0])), min(hi, float(span[1]))
    return ResidualPiece(b, si, lo, hi, float(cell.area))
