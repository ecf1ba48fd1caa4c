"""Live load reduction, ASCE 7-16 §4.7 (quoted from memory; the tests name each rule).

L = L0 (0.25 + 15 / √(K_LL·A_T)) with A_T in ft² (Eq. 4.7-1), i.e.
L = L0 (0.25 + 4.57 / √(K_LL·A_T)) with A_T in m², permitted where
K_LL·A_T ≥ 400 ft² (37.16 m²), and not less than 0.50 L0 for members supporting
one floor, 0.40 L0 for members supporting two or more (§4.7.2). K_LL from
Table 4.7-1 for beams: interior beams and edge beams without cantilever slabs 2;
edge beams with cantilever slabs, cantilever beams and all other members 1.
No reduction where L0 exceeds 100 psf (§4.7.3), for assembly uses (§4.7.5) or
for roofs (§4.7.6; roof live load is Lr, not L).

A_T is the floor the load path carries to the member: a beam's own tributary
floor, and for a girder the floor of the beams framing into it, each beam's
area shared between its supports as its live-load reactions are.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

FT2 = 0.3048**2  # m² per ft² (exact)
PSF = 4.4482216152605 / 0.3048**2  # Pa per psf (exact)
MIN_INFLUENCE = 400.0 * FT2  # m², K_LL·A_T below which no reduction is permitted
HEAVY_LIVE = 100.0 * PSF  # Pa, L0 above which live load is not reduced (§4.7.3)
ONE_FLOOR_LIMIT = 0.50
TWO_FLOORS_LIMIT = 0.40
# A slab running further than this past an edge beam's line is a cantilever slab
# (common practice: an ordinary slab edge is half a flange and a pour stop, within a foot).
CANTILEVER_SLAB = 0.3048  # m

KIND_INTERIOR = "interior beam"
KIND_EDGE = "edge beam without a cantilever slab"
KIND_EDGE_CANTILEVER = "edge beam with a cantilever slab"
KIND_CANTILEVER = "cantilever beam"
K_LL = {KIND_INTERIOR: 2.0, KIND_EDGE: 2.0, KIND_EDGE_CANTILEVER: 1.0, KIND_CANTILEVER: 1.0}


def reduction_factor(k_ll: float, area: float, floors: int = 1) -> float:
    """L / L0 for a member with live load element factor ``k_ll`` and tributary area
    ``area`` (m²) supporting ``floors`` floors: 1.0 where K_LL·A_T < 400 ft²."""
    influence = k_ll * area
    if influence < MIN_INFLUENCE or influence <= 0.0:
        return 1.0
    factor = 0.25 + 15.0 / math.sqrt(influence / FT2)
    limit = TWO_FLOORS_LIMIT if floors >= 2 else ONE_FLOOR_LIMIT
    return min(1.0, max(limit, factor))


def beam_kind(cantilever: bool, open_sides: list[tuple[str, float]]) -> str:
    """The member's row of Table 4.7-1: a beam with an overhang is a cantilever beam; a
    beam with no parallel neighbour on a side is an edge beam, with a cantilever slab
    where the floor runs more than CANTILEVER_SLAB past its line on that side."""
    if cantilever:
        return KIND_CANTILEVER
    if not open_sides:
        return KIND_INTERIOR
    if any(width > CANTILEVER_SLAB for _side, width in open_sides):
        return KIND_EDGE_CANTILEVER
    return KIND_EDGE


@dataclass(frozen=True)
class LiveReduction:
    """How the floor live load of one beam was reduced (factor 1.0: not reduced)."""

    factor: float  # L / L0
    k_ll: float
    area: float  # m², A_T
    kind: str  # the member's row of Table 4.7-1
    floors: int  # floors whose live load it supports
    note: str  # why, in words

    @classmethod
    def of(cls, kind: str, area: float, floors: int) -> LiveReduction:
        k = K_LL[kind]
        factor = reduction_factor(k, area, floors)
        ft2 = area / FT2
        if factor >= 1.0:
            note = (
                f"live load not reduced: K_LL·A_T = {k:g} × {ft2:.0f} ft² is below 400 ft² "
                "(ASCE 7-16 §4.7.2)"
            )
        else:
            limit = TWO_FLOORS_LIMIT if floors >= 2 else ONE_FLOOR_LIMIT
            capped = " (the §4.7.2 limit)" if factor == limit else ""
            note = (
                f"live load reduced to {factor:.3f} L0{capped}: ASCE 7-16 Eq. 4.7-1 with "
                f"K_LL = {k:g} ({kind}, Table 4.7-1) and A_T = {area:.1f} m² ({ft2:.0f} ft²)"
            )
        return cls(factor, k, area, kind, floors, note)
