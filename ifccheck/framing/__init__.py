"""Framing stage: connections, supports, brace points, slab coverage,
anchorage and load-path order, from a Model.

Stages (each callable alone, e.g. by the benchmark):
``member_geometry`` → ``host_index`` → ``end_links`` / ``intermediate_links``
→ ``slab_coverage`` → ``bracing_anchorage`` → ``build_framing``.
"""

from __future__ import annotations

import numpy as np

from ifccheck.config import BracingSettings, FramingSettings
from ifccheck.framing.anchorage import Anchorage, bracing_anchorage
from ifccheck.framing.connections import (
    Links,
    end_links,
    host_index,
    intermediate_links,
    wall_geometry,
)
from ifccheck.framing.graph import build_framing, load_path_order
from ifccheck.framing.index import BoxIndex, MemberGeometry, member_geometry
from ifccheck.framing.roles import PLURALS, STUB, infer_roles
from ifccheck.framing.slabs import slab_coverage
from ifccheck.framing.types import (
    BracePoint,
    Framing,
    MemberFraming,
    Support,
)
from ifccheck.model import Model
from ifccheck.perf import gc_paused

__all__ = [
    "Anchorage",
    "BoxIndex",
    "BracePoint",
    "Framing",
    "Links",
    "MemberFraming",
    "MemberGeometry",
    "Support",
    "analyse_framing",
    "bracing_anchorage",
    "build_framing",
    "end_links",
    "host_index",
    "infer_roles",
    "intermediate_links",
    "load_path_order",
    "member_geometry",
    "slab_coverage",
    "wall_geometry",
]


def analyse_framing(
    model: Model,
    framing: FramingSettings | None = None,
    bracing: BracingSettings | None = None,
) -> Framing:
    """Connections, supports, brace points, slab bracing, anchorage and
    load-path order for every beam, strut and brace of the model."""
    fs = framing or FramingSettings()
    bs = bracing or BracingSettings()
    with gc_paused():
        return _analyse(model, fs, bs)


def _analyse(model: Model, fs: FramingSettings, bs: BracingSettings) -> Framing:
    geom = member_geometry(model.members)
    walls = wall_geometry(model.walls, fs.gap)
    index = host_index(geom, fs)
    ends = end_links(geom, walls, fs, index)
    links = Links.concat([ends, intermediate_links(geom, walls, fs, index, ends)])
    links, stubs = drop_stub_links(geom, links)
    # a declared deck's own switch decides whether it braces; modelled slabs follow bracing.slab
    bracing_slabs = [s for s in model.slabs if (s.braces if s.declared else bs.slab)]
    coverage = slab_coverage(
        geom, bracing_slabs, fs.slab_bearing_tolerance, np.flatnonzero(geom.is_connector)
    )
    anchorage = bracing_anchorage(geom, links, coverage, fs.gap, [w.guid for w in model.walls])
    framing = build_framing(model, geom, links, coverage, anchorage, bs.slab)
    framing.excluded = excluded_members(geom, stubs)
    if framing.excluded:
        framing.warnings.append(("", excluded_warning(framing.excluded)))
    return framing


def drop_stub_links(geom: MemberGeometry, links: Links) -> tuple[Links, set[int]]:
    """Links without pieces shorter than the depth of the member they touch (hardware,
    stubs, cap plates); returns the kept links and the rows of the stubs."""
    on_member = ~links.host_wall
    host = np.where(on_member, links.host, 0)
    stub_conn = on_member & (geom.length[links.conn] < geom.depth[host])
    stub_host = on_member & (geom.length[host] < geom.depth[links.conn])
    stubs = set(links.conn[stub_conn].tolist()) | set(host[stub_host].tolist())
    return links.select(~(stub_conn | stub_host)), stubs


def excluded_members(geom: MemberGeometry, stubs: set[int]) -> dict[str, list[str]]:
    """GUIDs of the members that brace or support nothing, by kind."""
    out: dict[str, list[str]] = {}
    for i, kind in enumerate(geom.excluded_kind):
        if kind is not None:
            out.setdefault(kind, []).append(geom.guids[i])
    for i in sorted(stubs):
        if geom.excluded_kind[i] is None:
            out.setdefault(STUB, []).append(geom.guids[i])
    return dict(sorted(out.items()))


def excluded_warning(excluded: dict[str, list[str]]) -> str:
    """One line for every member that braces or supports nothing, counted by kind."""
    total = sum(len(v) for v in excluded.values())
    parts = ", ".join(f"{len(v)} {k if len(v) == 1 else PLURALS.get(k, k)}"
                      for k, v in excluded.items())  # fmt: skip
    return (
        f"{total} element{'s' if total != 1 else ''} written as beams, columns or members "
        f"brace and support nothing (not structural members): {parts}"
    )
