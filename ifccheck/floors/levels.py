"""Floor and roof levels: the storeys where they tell, else beams grouped by elevation.

Real exports often have no IfcBuildingStorey, or put every member in one.
The level of a horizontal framing member is then found from its top of
steel: tops within ``framing.level_tolerance`` of a neighbour form one level
(single linkage over the sorted elevations), named by its elevation in the
model's unit system ("+36 ft", "+10.97 m").
"""

from __future__ import annotations

import math
from collections import defaultdict

import numpy as np

from ifccheck.model import Level, Member, MemberRole, Model
from ifccheck.units import display_factor, display_label, system_for

# A member rising less than this (sine of its slope) is horizontal framing.
HORIZONTAL_SINE = math.sin(math.radians(10.0))
LEVEL_ROLES = (MemberRole.BEAM, MemberRole.STRUT)


def is_level_framing(m: Member) -> bool:
    """Horizontal beams and struts, the members a floor or roof is framed of."""
    return m.role in LEVEL_ROLES and abs(float(m.direction[2])) < HORIZONTAL_SINE


def elevation_label(z: float, length_unit: str) -> str:
    """'+36 ft', '-1.2 m': a level named by its elevation in the model's units."""
    system = system_for(length_unit)
    value = z * display_factor("length", system)
    text = f"{value:+.2f}".rstrip("0").rstrip(".")
    return f"{text} {display_label('length', system)}"


def assign_levels(model: Model, tolerance: float) -> list[Level]:
    """Give every horizontal framing member and slab a level; returns the levels.

    The framing is grouped by elevation; a group takes its storey's name when
    all its members are in that storey and no other group is, else it is named
    by its elevation (no storeys, all framing in one storey, a storey with a
    step in it). A group named by elevation still belongs to its storey where
    it has one, so settings given by storey name apply to it.
    """
    framing = [m for m in model.members if is_level_framing(m)]
    clusters = _clusters(framing, tolerance)
    storeys = [{m.storey for m in c} for c in clusters]
    owners: dict[str, int] = defaultdict(int)
    for st in storeys:
        if len(st) == 1 and "" not in st:
            owners[next(iter(st))] += 1
    levels = []
    for cluster, st in zip(clusters, storeys, strict=True):
        z = float(np.median([m.top_of_steel for m in cluster]))
        storey = next(iter(st)) if len(st) == 1 and "" not in st else ""
        name = storey if storey and owners[storey] == 1 else elevation_label(z, model.length_unit)
        for m in cluster:
            m.level = name
        levels.append(Level(name=name, elevation=z, storey=storey, beams=len(cluster)))
    levels.sort(key=lambda lv: lv.elevation)
    for s in model.slabs:
        s.level = _slab_level(s.underside, s.storey, levels, tolerance)
    model.levels = levels
    return levels


def _clusters(members: list[Member], tolerance: float) -> list[list[Member]]:
    """Members whose tops of steel chain within ``tolerance`` of each other."""
    if not members:
        return []
    tops = np.array([m.top_of_steel for m in members])
    order = np.argsort(tops, kind="stable")
    breaks = np.flatnonzero(np.diff(tops[order]) > tolerance) + 1
    return [[members[i] for i in part] for part in np.split(order, breaks)]


def _slab_level(underside: float, storey: str, levels: list[Level], tolerance: float) -> str:
    """The level a slab sits on: the nearest to its underside within the tolerance,
    preferring its own storey's; '' when none is near."""
    near = [lv for lv in levels if abs(lv.elevation - underside) <= tolerance]
    if not near:
        return ""
    own = [lv for lv in near if storey and storey in (lv.name, lv.storey)]
    return min(own or near, key=lambda lv: abs(lv.elevation - underside)).name
