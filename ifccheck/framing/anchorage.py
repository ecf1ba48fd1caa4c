"""Anchorage of bracing members (struts, braces, kickers).

A bracing member only restrains the beams it frames into when its bracing
line leads to something that does not move with those beams: a column, a
wall, a slab diaphragm, or a vertically braced bay (a brace that meets a
column is itself on a column). The line runs along bracing members only:
struts meeting one another, or meeting at the same point of a beam from
either side (a line of struts across parallel beams), never along the braced
beams themselves. Connected components of that graph answer the question.
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass, field

import networkx as nx
import numpy as np

from ifccheck.framing.connections import Links
from ifccheck.framing.index import MemberGeometry
from ifccheck.framing.slabs import Interval, covers

SLAB = ("slab",)


@dataclass
class Anchorage:
    """Per bracing-member row: whether its line is anchored, and the line."""

    anchored: dict[int, bool] = field(default_factory=dict)
    line: dict[int, list[int]] = field(default_factory=dict)  # rows on the same line
    anchors: dict[int, list[str]] = field(default_factory=dict)  # what anchors it
    # the bracing-line graph: ("member", row), ("column", row), ("wall", index), ("slab",)
    graph: nx.Graph = field(default_factory=nx.Graph)


def bracing_anchorage(
    geom: MemberGeometry,
    links: Links,
    coverage: dict[int, list[Interval]],
    gap: float,
    wall_guids: list[str],
) -> Anchorage:
    """Connected components of the bracing-line graph and their anchors."""
    g = nx.Graph()
    bracing = np.flatnonzero(geom.is_bracing & geom.valid)
    g.add_nodes_from(("member", int(i)) for i in bracing)

    sel = geom.is_bracing[links.conn]
    conn, host = links.conn[sel], links.host[sel]
    wall, station = links.host_wall[sel], links.station[sel]
    joints: dict[int, list[tuple[float, int]]] = {}
    for c, h, w, s in zip(
        conn.tolist(), host.tolist(), wall.tolist(), station.tolist(), strict=True
    ):
        me = ("member", c)
        if w:
            g.add_edge(me, ("wall", h))
        elif geom.is_bracing[h]:
            g.add_edge(me, ("member", h))
        elif geom.is_column[h] or geom.vertical[h]:
            g.add_edge(me, ("column", h))
        else:
            # on a braced member: anchored there only by a slab bearing on it
            if covers(coverage.get(h, []), s, gap):
                g.add_edge(me, SLAB)
            joints.setdefault(h, []).append((s, c))
    # bracing members meeting at one point of a beam continue the line through it
    for ends in joints.values():
        ends.sort()
        for (s1, c1), (s2, c2) in itertools.pairwise(ends):
            if c1 != c2 and s2 - s1 <= 0.5 * (geom.width[c1] + geom.width[c2]) + gap:
                g.add_edge(("member", c1), ("member", c2))
    for row in bracing.tolist():
        if coverage.get(row):
            g.add_edge(("member", row), SLAB)

    out = Anchorage(graph=g)
    for comp in nx.connected_components(g):
        rows = sorted(n[1] for n in comp if n[0] == "member")
        if not rows:
            continue
        found = sorted(
            "slab"
            if n == SLAB
            else f"wall {wall_guids[n[1]]}"
            if n[0] == "wall"
            else f"column {geom.guids[n[1]]}"
            for n in comp
            if n[0] != "member"
        )
        for r in rows:
            out.anchored[r] = bool(found)
            out.line[r] = rows
            out.anchors[r] = found
    return out
