"""Synthetic framed floors of a chosen size, for benchmarks (invented data).

Each bay of a square grid has a column, a girder, an edge beam and two
infill beams at third points (five members a bay); every storey has one
slab over the whole grid with an opening in every tenth bay.
"""

from __future__ import annotations

import math
from pathlib import Path

from ifccheck.ifc.author import ModelAuthor
from ifccheck.samples.scenario import w_shape

MEMBERS_PER_BAY = 5
BAY = 30.0  # ft


def synthetic_floors(n_members: int, storeys: int | None = None) -> ModelAuthor:
    """A model of about ``n_members`` members in feet (IFC4)."""
    bays = max(1, n_members // MEMBERS_PER_BAY)
    storeys = storeys or max(1, round(math.sqrt(bays) / 6))
    per_storey = max(1, bays // storeys)
    side = max(1, round(math.sqrt(per_storey)))
    a = ModelAuthor("IFC4", "foot", project="Synthetic floors", seed=f"synthetic-{n_members}")
    col, girder, infill = w_shape("W12X65"), w_shape("W24X62"), w_shape("W18X35")
    for k in range(storeys):
        name = f"Level {k + 2}"
        a.storey(name, 14.0 * (k + 1))
        for i in range(side):
            for j in range(side):
                x0, y0 = i * BAY, j * BAY
                a.column(name, (x0, y0, -14.0), 14.0, col, key=f"c{k}:{i}:{j}")
                a.beam(name, (x0, y0, 0), (x0, y0 + BAY, 0), girder, key=f"g{k}:{i}:{j}",
                       cardinal_point=8)  # fmt: skip
                a.beam(name, (x0, y0, 0), (x0 + BAY, y0, 0), infill, key=f"e{k}:{i}:{j}",
                       cardinal_point=8)  # fmt: skip
                for t in (1, 2):
                    y = y0 + t * BAY / 3
                    a.beam(name, (x0, y, 0), (x0 + BAY, y, 0), infill, key=f"b{k}:{i}:{j}:{t}",
                           cardinal_point=8)  # fmt: skip
        extent = side * BAY
        holes = [
            [(i * BAY + 3, j * BAY + 3), (i * BAY + 8, j * BAY + 3), (i * BAY + 8, j * BAY + 7),
             (i * BAY + 3, j * BAY + 7)]
            for i in range(side) for j in range(side) if (i * side + j) % 10 == 5
        ]  # fmt: skip
        a.slab(name, [(0, 0), (extent, 0), (extent, extent), (0, extent)], 5.5 / 12, 5.5 / 12,
               openings=holes, key=f"slab{k}")  # fmt: skip
    return a


def write_synthetic(n_members: int, path: str | Path) -> Path:
    return synthetic_floors(n_members).write(path)


def grid_members(bays: int, storeys: int) -> int:
    """Members of :func:`framed_building`: per storey (n+1)² columns, 2·n·(n+1) girders
    and edge beams on the grid lines, 2·n² infill beams."""
    return storeys * ((bays + 1) ** 2 + 2 * bays * (bays + 1) + 2 * bays * bays)


def framed_building(bays: int = 10, storeys: int = 20, slab: bool = True) -> ModelAuthor:
    """A building of ``storeys`` floors of ``bays`` × ``bays`` 30 ft bays (invented data):
    columns on every grid node, girders along y on the grid lines, beams along x on the
    grid lines and two infill beams at the third points of each bay; with ``slab`` a
    5.5 in concrete slab over each whole floor. 20 storeys of 10 × 10 bays: 10,820 members,
    8,400 of them beams."""
    a = ModelAuthor("IFC4", "foot", project="Framed building",
                    seed=f"building-{bays}x{storeys}-{int(slab)}")  # fmt: skip
    col, girder, infill = w_shape("W14X90"), w_shape("W24X84"), w_shape("W21X44")
    n = bays
    for k in range(storeys):
        name = f"Level {k + 2}"
        a.storey(name, 14.0 * (k + 1))
        for i in range(n + 1):
            for j in range(n + 1):
                x0, y0 = i * BAY, j * BAY
                a.column(name, (x0, y0, -14.0), 14.0, col, key=f"c{k}:{i}:{j}")
                if j < n:
                    a.beam(name, (x0, y0, 0), (x0, y0 + BAY, 0), girder, key=f"g{k}:{i}:{j}",
                           cardinal_point=8)  # fmt: skip
                if i < n:
                    a.beam(name, (x0, y0, 0), (x0 + BAY, y0, 0), infill, key=f"e{k}:{i}:{j}",
                           cardinal_point=8)  # fmt: skip
                if i < n and j < n:
                    for t in (1, 2):
                        y = y0 + t * BAY / 3
                        a.beam(name, (x0, y, 0), (x0 + BAY, y, 0), infill,
                               key=f"b{k}:{i}:{j}:{t}", cardinal_point=8)  # fmt: skip
        if slab:
            extent = n * BAY
            a.slab(name, [(0, 0), (extent, 0), (extent, extent), (0, extent)], 5.5 / 12,
                   5.5 / 12, key=f"slab{k}")  # fmt: skip
    return a
