"""Roles from geometry where the IFC class says little, and which members are structural.

Authoring tools write steep members as IfcBeam, untyped IfcMember for
struts and braces, and hardware (nuts, washers, rods, plates, boards) as
IfcBeam or IfcColumn. Two decisions are made here, before the framing graph:

- the role a member plays, by its slope where its class and type do not
  say it (common practice): an IfcBeam steeper than 80° from horizontal acts
  as a column, one between 45° and 80° as a brace; an IfcMember with no type
  is a column when vertical, a brace when diagonal, and a strut when
  horizontal (a beam where a slab bears on it). Each inference is a note.
- whether a member is structural, i.e. may brace or support another: a
  member with a known section (any shape family) or a column, and never
  hardware. Pieces shorter than the depth of the member they touch are
  dropped where the connections are found.
"""

from __future__ import annotations

import math
import re

import numpy as np

from ifccheck.model import Member, MemberRole, Model, Slab

STEEP_COLUMN = 80.0  # degrees from horizontal (common practice)
STEEP_BRACE = 45.0
DIAGONAL = 10.0  # an untyped member rising more than this is diagonal
UNTYPED = {"", "NOTDEFINED", "USERDEFINED"}

# words in a name that mark hardware → the kind reported (whole words or prefixes)
_HARDWARE = (
    (r"nuts?|bolts?|washers?|screws?|studs?|rivets?|anchors?|fasteners?", "fastener"),
    (r"rings?", "ring"),
    (r"rods?|round ?bars?|threaded", "rod"),
    (r"plates?|pl\d|flats?|fl\d|flt|gussets?|stiffeners?|shims?|cleats?", "plate or flat"),
    (r"boards?|panels?|claddings?|insulation", "board"),
)
_HARDWARE_RE = [(re.compile(rf"(?<![a-z])(?:{p})(?![a-z])"), kind) for p, kind in _HARDWARE]
# words that make a name a structural member whatever else it says ("plate girder")
_STRUCTURAL_RE = re.compile(r"(?<![a-z])(?:girders?|beams?|joists?|columns?|trusse?s?|braces?|"
                            r"struts?|kickers?|purlins?|rafters?|lintels?)(?![a-z])")  # fmt: skip
UNKNOWN_SECTION = "member of unknown section"
STUB = "piece shorter than the member it touches"
PLURALS = {
    "fastener": "fasteners",
    "ring": "rings",
    "rod": "rods",
    "plate or flat": "plates or flats",
    "board": "boards",
    UNKNOWN_SECTION: "members of unknown section",
    STUB: "pieces shorter than the member they touch",
}


def slope_degrees(m: Member) -> float:
    """Angle of the member's axis from horizontal, degrees (90 for vertical)."""
    z = abs(float(m.direction[2]))
    return math.degrees(math.asin(min(z, 1.0)))


def infer_roles(model: Model, bearing_tolerance: float) -> int:
    """Set roles from geometry where the class says little; returns how many changed."""
    changed = 0
    for m in model.members:
        role, why = _geometric_role(m, model.slabs, bearing_tolerance)
        if role is not None and role is not m.role:
            m.notes.append(f"role taken as {role.value}: {why} (common practice)")
            m.role, m.role_source = role, "geometry"
            changed += 1
    return changed


def _geometric_role(
    m: Member, slabs: list[Slab], tolerance: float
) -> tuple[MemberRole | None, str]:
    slope = slope_degrees(m)
    if m.length <= 0.0 or not math.isfinite(slope):
        return None, ""
    if m.ifc_class == "IfcBeam":
        if slope > STEEP_COLUMN:
            return MemberRole.COLUMN, f"an IfcBeam {slope:.0f}° from horizontal"
        if slope > STEEP_BRACE:
            return MemberRole.BRACE, f"an IfcBeam {slope:.0f}° from horizontal"
        return None, ""
    if m.ifc_class != "IfcMember" or m.role is not MemberRole.OTHER:
        return None, ""
    if m.predefined_type not in UNTYPED:
        return None, ""
    if slope > STEEP_COLUMN:
        return MemberRole.COLUMN, "a vertical IfcMember with no type"
    if slope > DIAGONAL:
        return MemberRole.BRACE, f"a diagonal IfcMember with no type ({slope:.0f}°)"
    if _slab_on_top(m, slabs, tolerance):
        return MemberRole.BEAM, "a horizontal IfcMember with no type carrying a slab"
    return MemberRole.STRUT, "a horizontal IfcMember with no type"


def _slab_on_top(m: Member, slabs: list[Slab], tolerance: float) -> bool:
    from shapely.geometry import Point

    mid = Point(0.5 * (m.start[0] + m.end[0]), 0.5 * (m.start[1] + m.end[1]))
    top = m.top_of_steel
    return any(
        abs(s.underside - top) <= tolerance and s.footprint.covers(mid)
        for s in slabs
        if not s.declared
    )


def non_structural_kind(m: Member) -> str | None:
    """Why a member may not brace or support another (its kind), or None if it may.

    A name that says hardware (nut, washer, rod, plate, board…) decides, whatever
    section an outline gave it, unless it also says what structural member it is.
    """
    text = f"{m.name} {m.profile_name}".lower()
    if not _STRUCTURAL_RE.search(text):
        for pattern, kind in _HARDWARE_RE:
            if pattern.search(text):
                return kind
    if m.role is MemberRole.COLUMN or m.section is not None:
        return None
    return UNKNOWN_SECTION


def structural_mask(members: list[Member]) -> tuple[np.ndarray, list[str | None]]:
    """Per member: whether it may brace or support, and the kind where it may not."""
    kinds = [non_structural_kind(m) for m in members]
    return np.array([k is None for k in kinds], dtype=bool), kinds
