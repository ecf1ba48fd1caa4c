"""The shared vocabulary: plain typed data passed between pipeline stages.

Everything is in SI base units (m, m², m⁴, m⁶, Pa, N, N·m) and global model
coordinates. Only ``ifccheck.ifc`` builds these from ifcopenshell entities;
every later stage works on these objects alone.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum

import numpy as np
from shapely.geometry import MultiPolygon, Polygon

from ifccheck.reasons import Reason

Point3 = tuple[float, float, float]


class ShapeFamily(StrEnum):
    """Cross-section families the tool distinguishes."""

    I_SHAPE = "I"  # W, M, S, HP, IPE, HE…, and I-shaped built-ups
    CHANNEL = "C"  # C, MC, UPN
    TEE = "T"
    ANGLE = "L"
    HOLLOW_RECT = "HSS"
    HOLLOW_ROUND = "PIPE"
    OTHER = "other"


class MaterialCategory(StrEnum):
    STEEL = "steel"
    CONCRETE = "concrete"
    TIMBER = "timber"
    OTHER = "other"
    UNKNOWN = "unknown"


class MemberRole(StrEnum):
    """What a member does in the framing, from its IFC class and type."""

    BEAM = "beam"  # IfcBeam (any predefined type except those below)
    COLUMN = "column"  # IfcColumn
    BRACE = "brace"  # IfcMember BRACE / kicker, diagonal members
    STRUT = "strut"  # IfcMember STRUT / TIE, or a beam serving only as a strut
    OTHER = "other"  # other IfcMember types (purlins, mullions...)


@dataclass(frozen=True)
class Section:
    """Cross-section properties about the section's own principal axes.

    x is the major (strong) axis, y the minor. Dimensions in m, areas m²,
    moduli m³, second moments m⁴, warping constant m⁶.
    """

    name: str
    family: ShapeFamily
    d: float  # overall depth
    bf: float  # flange width
    tw: float  # web thickness
    tf: float  # flange thickness
    r: float  # fillet radius (web-to-flange), 0 when unknown
    A: float
    Ix: float
    Iy: float
    Sx: float
    Sy: float
    Zx: float
    Zy: float
    rx: float
    ry: float
    J: float
    Cw: float
    ho: float  # distance between flange centroids
    rts: float  # effective radius of gyration for LTB (AISC F2-7)
    source: str  # e.g. "AISC Shapes Database v16.0" or "computed from dimensions"
    # Clear web height h used for web slenderness (AISC B4.1b: d - 2k for rolled
    # shapes); when not tabulated, d - 2(tf + r).
    h: float = 0.0
    mass_per_length: float = 0.0  # kg/m, from A and 7850 kg/m³ unless tabulated
    # --- Design-engine fields (AISC 360-16 F4-F10, Chapter E). The defaults describe a
    # doubly symmetric section, so a Section built without them keeps its meaning.
    # How it was made: "rolled", "welded" or "" (unknown); the one decision is
    # ifccheck.sections.classify.is_built_up.
    fabrication: str = ""
    bf_bottom: float = 0.0  # bottom flange width of a singly symmetric I (0: same as bf)
    tf_bottom: float = 0.0  # bottom flange thickness (0: same as tf)
    # Elastic and plastic neutral axes (bending about x) below the top fibre (0: d/2).
    # "Top" is the flange of a tee and the outstanding legs of a double angle (as the
    # AISC tables draw them), and the toe of a single angle's vertical leg d (as IFC
    # draws an L: heel at the bottom).
    y_top: float = 0.0
    y_plastic: float = 0.0
    x0: float = 0.0  # shear centre from the centroid along x (m), for Chapter E4
    y0: float = 0.0  # shear centre from the centroid along y, positive up (m)
    rz: float = 0.0  # least (principal-axis) radius of gyration of an angle (m)
    pair_gap: float | None = None  # double angle (2L): gap between the backs; None: single

    @property
    def flange_slenderness(self) -> float:
        """λf = bf / 2tf for I-shapes, bf / tf for channels (AISC Table B4.1b)."""
        if self.family is ShapeFamily.CHANNEL:
            return self.bf / self.tf
        return self.bf / (2.0 * self.tf)

    @property
    def web_slenderness(self) -> float:
        """λw = h / tw (AISC Table B4.1b)."""
        return self.h / self.tw


@dataclass(frozen=True)
class Steel:
    """A steel grade with the strengths that apply to one section."""

    grade: str  # normalised name, e.g. "A992", "S355"
    fy: float  # Pa, after any thickness reduction
    fu: float  # Pa
    E: float = 200e9  # Pa (29,000 ksi = 199.95 GPa for AISC; 210 GPa for EN)
    G: float = 77.2e9  # Pa
    source: str = ""  # where the grade came from (material name, property, default)


@dataclass
class Member:
    """A linear structural element: beam, column, brace, strut.

    ``start`` and ``end`` lie on the centroid line (not the modelling
    reference line). ``web_up`` is the unit vector of the section's local
    depth direction (from bottom flange to top flange) in global coordinates.
    """

    guid: str
    ifc_class: str
    predefined_type: str
    name: str
    storey: str
    role: MemberRole
    start: Point3
    end: Point3
    web_up: Point3
    profile_name: str
    section: Section | None
    steel: Steel | None
    material_name: str
    material: MaterialCategory
    axis_source: str  # "axis", "extrusion" or "geometry"
    profile_source: str  # "profile set", "swept area", "type", "name", ...
    grade_source: str  # "material name", "material property", "default"
    notes: list[str] = field(default_factory=list)
    # Why this member cannot be checked at all (unresolved profile, non-steel...).
    unresolved: Reason | None = None
    # Outline depth and width (m) when known without a full section.
    envelope: tuple[float, float] = (0.0, 0.0)
    # The floor or roof level a horizontal framing member belongs to (set by the
    # floors stage: its storey, or its elevation where storeys do not tell).
    level: str = ""
    # How the role was decided: "class" (IFC class and type) or "geometry".
    role_source: str = "class"
    # --- Shape as read (reader, issue 11): the family and dimensions are known for
    # every common shape, with or without section properties (a tee, an angle or a
    # hollow section can brace and support before it can be checked).
    family: ShapeFamily | None = None
    # Dimensions in m named for the family (d, bf, tw, tf, r; angles d, b, t, r; ...).
    dimensions: dict[str, float] = field(default_factory=dict)

    @property
    def length(self) -> float:
        return float(np.linalg.norm(np.subtract(self.end, self.start)))

    @property
    def direction(self) -> np.ndarray:
        v = np.subtract(self.end, self.start)
        n = np.linalg.norm(v)
        return v / n if n > 0 else v

    @property
    def depth(self) -> float:
        return self.section.d if self.section else self.envelope[0]

    @property
    def flange_width(self) -> float:
        return self.section.bf if self.section else self.envelope[1]

    @property
    def top_of_steel(self) -> float:
        """Highest elevation of the section along the member (m)."""
        half = 0.5 * self.depth * abs(self.web_up[2])
        return max(self.start[2], self.end[2]) + half

    @property
    def bending_axis(self) -> str:
        """The section axis gravity bends it about: "minor" for a member placed web-flat
        (its depth direction within 45° of horizontal), else "major"."""
        return "minor" if abs(self.web_up[2]) < 0.7071 else "major"

    @property
    def is_vertical(self) -> bool:
        return bool(abs(self.direction[2]) > 0.9)


@dataclass
class Slab:
    """A floor slab or deck in plan, with its openings as holes."""

    guid: str
    name: str
    storey: str
    footprint: Polygon | MultiPolygon  # plan (x, y), openings removed
    underside: float  # m
    top: float  # m
    ifc_class: str = "IfcSlab"
    openings: list[Polygon] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)
    level: str = ""  # the level it bears on (set by the floors stage)
    # A deck declared in the settings, not modelled: it bears on every beam of its
    # level, braces their top flanges if ``braces``, and weighs ``self_weight``.
    declared: bool = False
    braces: bool = True
    self_weight: float | None = None  # Pa; None: thickness × concrete density
    bearing_tolerance: float | None = None  # m; None: framing.slab_bearing_tolerance

    @property
    def thickness(self) -> float:
        return self.top - self.underside


@dataclass
class Wall:
    """A wall that can support or anchor framing: plan footprint and height."""

    guid: str
    name: str
    storey: str
    footprint: Polygon
    base: float
    top: float
    material: MaterialCategory = MaterialCategory.UNKNOWN


@dataclass
class Storey:
    guid: str
    name: str
    elevation: float  # m


@dataclass
class Level:
    """A floor or roof level: the storey's framing, or beams at one elevation."""

    name: str  # the storey's name, or the elevation ("+36 ft") where storeys do not tell
    elevation: float  # m, median top of steel of its beams
    storey: str = ""  # the storey it belongs to, when there is one
    beams: int = 0  # horizontal framing members on it


@dataclass
class Model:
    """What the reader produced from one model file."""

    source: str  # file name
    schema: str  # IFC2X3, IFC4, IFC4X3...
    length_unit: str  # the file's own length unit name, e.g. "foot", "millimetre"
    length_scale: float  # metres per file length unit
    storeys: list[Storey] = field(default_factory=list)
    members: list[Member] = field(default_factory=list)
    slabs: list[Slab] = field(default_factory=list)
    walls: list[Wall] = field(default_factory=list)
    warnings: list[tuple[str, str]] = field(default_factory=list)  # (guid, message)
    geometry_fallbacks: int = 0
    levels: list[Level] = field(default_factory=list)  # set by the floors stage
    material_names: list[str] = field(default_factory=list)  # every IfcMaterial's name
    # Beams, columns and members that could not be read (a placement that cycles, a zero
    # direction, coordinates far from the rest): kept out of the framing and the loads,
    # each with its reason in ``unresolved``; the beams among them are listed as not checked.
    # Their start and end are NaN: their position is not known.
    unreadable: list[Member] = field(default_factory=list)
    # A GlobalId several elements share → the keys its elements are listed under
    # (the first keeps the GlobalId, the others get ":2", ":3"...).
    duplicate_guids: dict[str, list[str]] = field(default_factory=dict)

    def member(self, guid: str) -> Member:
        for m in self.members:
            if m.guid == guid:
                return m
        raise KeyError(guid)
