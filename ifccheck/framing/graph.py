"""Assemble the framing graph and the per-member digest from the links."""

from __future__ import annotations

from operator import attrgetter

import networkx as nx
import numpy as np

from ifccheck.framing.anchorage import Anchorage
from ifccheck.framing.connections import KIND_BRACE, KIND_FRAMING, KIND_SUPPORT, Links
from ifccheck.framing.index import FALLBACK_DEPTH, FALLBACK_WIDTH, MemberGeometry
from ifccheck.framing.slabs import Interval
from ifccheck.framing.types import (
    BracePoint,
    EndName,
    Framing,
    FramingEdge,
    MemberFraming,
    Support,
)
from ifccheck.model import Model
from ifccheck.perf import gc_paused
from ifccheck.reasons import NotChecked, Reason

END_NAMES: dict[int, EndName | None] = {0: "start", 1: "end", -1: None}
WALL_CLASS = "IfcWall"

NOTE_NO_SLAB = (
    "no slab or other diaphragm modelled on this storey; framing braces assumed anchored "
    "(common practice)"
)
NOTE_SLAB_OFF = (
    "slab bracing switched off (construction stage); framing braces assumed anchored "
    "(common practice)"
)


def _fallback_note(profile: str) -> str:
    return (
        f"no section resolved for profile {profile!r}; framing used a fallback depth of "
        f"{FALLBACK_DEPTH:.3f} m and flange width of {FALLBACK_WIDTH:.3f} m"
    )


def _line_reason(geom: MemberGeometry, rows: list[int]) -> Reason:
    kind = "strut" if all(geom.members[r].role.value == "strut" for r in rows) else "bracing"
    return Reason.of(
        NotChecked.BRACE_UNANCHORED,
        kind=kind,
        members=tuple(geom.members[r].name or geom.guids[r] for r in rows),
    )


def build_framing(
    model: Model,
    geom: MemberGeometry,
    links: Links,
    coverage: dict[int, list[Interval]],
    anchorage: Anchorage,
    slab_bracing: bool,
) -> Framing:
    """The MultiDiGraph, the MemberFraming per beam/strut/brace, the load
    order and the support cycles."""
    with gc_paused():
        return _build(model, geom, links, coverage, anchorage, slab_bracing)


def _build(
    model: Model,
    geom: MemberGeometry,
    links: Links,
    coverage: dict[int, list[Interval]],
    anchorage: Anchorage,
    slab_bracing: bool,
) -> Framing:
    graph = nx.MultiDiGraph()
    for i, m in enumerate(geom.members):
        if geom.in_graph[i]:
            graph.add_node(m.guid, role=m.role.value, ifc_class=m.ifc_class)
    for w in model.walls:
        graph.add_node(w.guid, role="wall", ifc_class=WALL_CLASS)

    framings, warnings = _member_records(geom)
    unanchored = {
        r: _line_reason(geom, anchorage.line[r]) for r, ok in anchorage.anchored.items() if not ok
    }
    for r in sorted(unanchored):
        warnings.append((geom.guids[r], f"{unanchored[r]}; its brace points do not count"))
    edges, support_edges = _apply_links(model, geom, links, framings, unanchored)
    graph.add_edges_from(edges)
    _finish_members(model, geom, links, framings, coverage, slab_bracing)

    order_nodes = [g for i, g in enumerate(geom.guids) if geom.in_graph[i]]
    load_order, levels, cycles = load_path_order(order_nodes, support_edges)
    for cyc in cycles:
        warnings.append(
            (
                cyc[0],
                f"support cycle {cycle_path(cyc)}: these members bear on each other "
                "(a model problem); their demand is not computed",
            )
        )
    return Framing(
        graph=graph,
        members={geom.guids[i]: mf for i, mf in framings.items()},
        load_order=load_order,
        load_levels=levels,
        cycles=cycles,
        warnings=warnings,
        bracing_lines=_guid_lines(anchorage, geom, model),
    )


def _member_records(geom: MemberGeometry) -> tuple[dict[int, MemberFraming], list[tuple[str, str]]]:
    """An empty framing record for every member that frames (by row), and the warnings
    about members whose depth was a fallback or whose length is zero."""
    framings: dict[int, MemberFraming] = {}
    warnings: list[tuple[str, str]] = []
    for i in np.flatnonzero(geom.is_connector).tolist():
        m = geom.members[i]
        mf = MemberFraming(guid=m.guid)
        if geom.fallback[i]:
            mf.notes.append(_fallback_note(m.profile_name))
        if not geom.valid[i]:
            mf.notes.append("zero-length member: no framing found")
            warnings.append((m.guid, "zero-length member ignored by the framing analysis"))
        framings[i] = mf
    for i in np.flatnonzero(geom.in_graph & ~geom.is_connector & geom.fallback).tolist():
        m = geom.members[i]
        warnings.append((m.guid, _fallback_note(m.profile_name)))
    return framings, warnings


def _apply_links(
    model: Model,
    geom: MemberGeometry,
    links: Links,
    framings: dict[int, MemberFraming],
    unanchored: dict[int, Reason],
) -> tuple[list[tuple[str, str, dict[str, FramingEdge]]], list[tuple[str, str]]]:
    """Each link becomes a graph edge, a support of the member that frames in and a brace
    point of its host (one that does not count where its bracing line reaches no anchor,
    ``unanchored``). Returns the edges and the (beam, host) pairs the load path follows."""
    # per-link values gathered with numpy, then one pass in Python
    nm = geom.n
    names = np.array(geom.guids + [w.guid for w in model.walls], dtype=object)
    classes = np.array(
        [m.ifc_class for m in geom.members] + [WALL_CLASS] * len(model.walls), dtype=object
    )
    key = np.where(links.host_wall, nm + links.host, links.host)
    rows = zip(
        links.conn.tolist(),
        names[links.conn].tolist(),
        np.where(links.host_wall, -1, links.host).tolist(),  # -1: a wall
        names[key].tolist(),
        classes[key].tolist(),
        [END_NAMES[e] for e in links.end.tolist()],
        geom.is_beam[links.conn].tolist(),
        links.station.tolist(),
        links.at.tolist(),
        links.kind.tolist(),
        links.flange.tolist(),
        strict=True,
    )
    edges = []
    support_edges: list[tuple[str, str]] = []
    for c, cg, h, hg, h_class, end, is_beam, station, at, kind, flange in rows:
        counts, reason = True, None
        if kind == KIND_BRACE and c in unanchored:
            counts, reason = False, unanchored[c]
        edge = FramingEdge(cg, hg, station, at, kind, end, flange, counts)
        edges.append((cg, hg, {"edge": edge}))
        own = framings[c]
        own.supports.append(Support(station=at, by=hg, by_class=h_class, end=end))
        own.brace_points.append(BracePoint(station=at, kind="support", by=hg, flange="both"))
        if is_beam and kind != KIND_BRACE and h >= 0:
            support_edges.append((cg, hg))
        host = framings.get(h)
        if host is not None and kind != KIND_SUPPORT:
            host.brace_points.append(
                BracePoint(
                    station=station,
                    kind="framing" if kind == KIND_FRAMING else "brace",
                    by=cg,
                    flange=flange,
                    counts=counts,
                    reason=reason,
                )
            )
            if kind == KIND_FRAMING and is_beam and cg not in host.carries:
                host.carries.append(cg)
    return edges, support_edges


def _finish_members(
    model: Model,
    geom: MemberGeometry,
    links: Links,
    framings: dict[int, MemberFraming],
    coverage: dict[int, list[Interval]],
    slab_bracing: bool,
) -> None:
    """Each member's free ends and state, its supports and brace points in station order,
    the members it carries, its slab bracing, and the notes on framing with no slab."""
    linked = np.zeros((geom.n, 2), dtype=bool)
    at_end = links.end >= 0
    linked[links.conn[at_end], links.end[at_end]] = True
    # a diaphragm ties the framing: a modelled slab, or a declared deck that braces
    levels_with_slab = {s.level or s.storey for s in model.slabs if s.braces or not s.declared}
    by_station = attrgetter("station", "by")
    bp_order = attrgetter("station", "kind", "by")
    for i, mf in framings.items():
        m = geom.members[i]
        if not linked[i, 0]:
            mf.free_ends.append("start")
        if not linked[i, 1]:
            mf.free_ends.append("end")
        if not mf.supports:
            mf.state = "unsupported"
        elif mf.free_ends:
            mf.state = "cantilever"
        mf.supports.sort(key=by_station)
        mf.brace_points.sort(key=bp_order)
        if len(mf.carries) > 1:  # in station order along this member
            carried = set(mf.carries)
            mf.carries = list(dict.fromkeys(b.by for b in mf.brace_points if b.by in carried))
        mf.continuous_bracing = list(coverage.get(i, []))
        if any(b.kind == "framing" and b.counts for b in mf.brace_points):
            if (m.level or m.storey) not in levels_with_slab and not coverage.get(i):
                mf.notes.append(NOTE_NO_SLAB)
            elif not slab_bracing and not coverage.get(i):
                mf.notes.append(NOTE_SLAB_OFF)


def _guid_lines(anchorage: Anchorage, geom: MemberGeometry, model: Model) -> nx.Graph:
    """The bracing-line graph with its nodes named by GUID."""

    def name(node: tuple) -> tuple:
        if node[0] in ("member", "column"):
            return (node[0], geom.guids[node[1]])
        if node[0] == "wall":
            return ("wall", model.walls[node[1]].guid)
        return node

    return nx.relabel_nodes(anchorage.graph, name, copy=True)


def cycle_path(cycle: list[str]) -> str:
    """'A → B → C → A'."""
    return " → ".join([*cycle, cycle[0]])


def load_path_order(
    nodes: list[str], edges: list[tuple[str, str]]
) -> tuple[list[str], list[list[str]], list[list[str]]]:
    """The load path, carried → carrier: (order, levels, cycles).

    ``levels`` are topological generations: each member comes after every
    member it carries. Strongly connected groups (support cycles) are
    condensed to one step of one level and reported in ``cycles``.
    """
    d = nx.DiGraph()
    d.add_nodes_from(nodes)
    d.add_edges_from(edges)
    rank = {g: i for i, g in enumerate(nodes)}
    sccs = list(nx.strongly_connected_components(d))
    cond = nx.condensation(d, sccs)
    levels: list[list[str]] = []
    cycles: list[list[str]] = []
    for generation in nx.topological_generations(cond):
        level: list[str] = []
        for n in generation:
            group = sorted(cond.nodes[n]["members"], key=rank.__getitem__)
            level.extend(group)
            if len(group) > 1:
                ring = [u for u, _ in nx.find_cycle(d.subgraph(group))]
                first = ring.index(min(ring, key=rank.__getitem__))  # start at the first member
                ring = ring[first:] + ring[:first]
                cycles.append(ring + [g for g in group if g not in ring])
        levels.append(sorted(level, key=rank.__getitem__))
    cycles.sort(key=lambda c: min(rank[g] for g in c))
    order = [g for level in levels for g in level]
    return order, levels, cycles
