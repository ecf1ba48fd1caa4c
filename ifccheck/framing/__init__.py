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
    coverage = (
        slab_coverage(
            geom, model.slabs, fs.slab_bearing_tolerance, np.flatnonzero(geom.is_connector)
        )
        if bs.slab
        else {}
    )
    anchorage = bracing_anchorage(geom, links, coverage, fs.gap, [w.guid for w in model.walls])
    return build_framing(model, geom, links, coverage, anchorage, bs.slab)
