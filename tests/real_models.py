"""Small models that reproduce how authoring tools write sections, grades and geometry.

Each builder writes one convention with ifcopenshell's entity API on top of
ModelAuthor and returns the file's path. Dimensions are in millimetre models
unless said otherwise; the sections drawn are IPE300 (EN 10365, from memory:
h 300, b 150, tw 7.1, tf 10.7, r 15 mm), IPE500 (h 500, b 200, tw 10.2, tf 16,
r 21) and L100x100x10 (EN 10056-1, from memory: r1 12, r2 6).
"""

from __future__ import annotations

import math
from collections.abc import Callable
from pathlib import Path

import ifcopenshell

from ifccheck.ifc.author import IProfile, ModelAuthor

IPE300 = IProfile("IPE300", 300.0, 150.0, 7.1, 10.7, 15.0)
IPE500 = IProfile("IPE500", 500.0, 200.0, 10.2, 16.0, 21.0)
SPAN = 6000.0  # mm


def _profile_of(element) -> tuple[list, list]:
    """The body extrusions of an element and the profile-set profiles it is given."""
    solids = [
        item
        for rep in element.Representation.Representations
        for item in rep.Items
        if item.is_a("IfcExtrudedAreaSolid")
    ]
    profiles = []
    for rel in element.HasAssociations or ():
        if rel.is_a("IfcRelAssociatesMaterial"):
            usage = rel.RelatingMaterial
            if usage.is_a("IfcMaterialProfileSetUsage"):
                profiles += list(usage.ForProfileSet.MaterialProfiles)
    return solids, profiles


def _replace_profile(element, profile) -> None:
    solids, material_profiles = _profile_of(element)
    for s in solids:
        s.SweptArea = profile
    for mp in material_profiles:
        mp.Profile = profile


def _i_corners(p: IProfile, fillets: bool) -> tuple[list, list]:
    """Corner points of an I (and, with fillets, the arc mid-points), counter-clockwise."""
    hb, hd, hw, tf, r = p.bf / 2, p.d / 2, p.tw / 2, p.tf, p.r
    k = math.sqrt(0.5) * r
    if not fillets:
        return [
            (-hb, -hd), (hb, -hd), (hb, -hd + tf), (hw, -hd + tf), (hw, hd - tf), (hb, hd - tf),
            (hb, hd), (-hb, hd), (-hb, hd - tf), (-hw, hd - tf), (-hw, -hd + tf),
            (-hb, -hd + tf),
        ], []  # fmt: skip
    corners = [
        (-hb, -hd), (hb, -hd), (hb, -hd + tf),
        (hw + r, -hd + tf), (hw, -hd + tf + r),  # arc 1
        (hw, hd - tf - r), (hw + r, hd - tf),  # arc 2
        (hb, hd - tf), (hb, hd), (-hb, hd), (-hb, hd - tf),
        (-hw - r, hd - tf), (-hw, hd - tf - r),  # arc 3
        (-hw, -hd + tf + r), (-hw - r, -hd + tf),  # arc 4
        (-hb, -hd + tf),
    ]  # fmt: skip
    centres = [
        (hw + r, -hd + tf + r), (hw + r, hd - tf - r), (-hw - r, hd - tf - r),
        (-hw - r, -hd + tf + r),
    ]  # fmt: skip
    mids = [
        (centres[0][0] - k, centres[0][1] - k), (centres[1][0] - k, centres[1][1] + k),
        (centres[2][0] + k, centres[2][1] + k), (centres[3][0] + k, centres[3][1] - k),
    ]  # fmt: skip
    return corners, list(zip(centres, mids, strict=True))


def i_outline_profile(a: ModelAuthor, p: IProfile, corners: int, name: str | None = None):
    """An I drawn as a polygon: 12 corners, or 16 with the root fillets as arcs
    (IfcIndexedPolyCurve with IfcArcIndex in IFC4, trimmed circles in IFC2X3)."""
    f = a.f
    pts, arcs = _i_corners(p, fillets=corners == 16)
    if corners == 12:
        poly = [f.createIfcCartesianPoint((float(x), float(y))) for x, y in pts]
        curve = f.createIfcPolyline([*poly, poly[0]])
    elif a.schema != "IFC2X3":
        mids = [m for _, m in arcs]
        coords = f.createIfcCartesianPointList2D([list(map(float, c)) for c in pts + mids])
        n = len(pts)
        # arcs from corner 4→5, 6→7, 12→13, 14→15 (1-based), through the mid points
        arc_at = {3: n + 1, 5: n + 2, 11: n + 3, 13: n + 4}
        segments = []
        for i in range(n):
            j = (i + 1) % n
            if i in arc_at:
                segments.append(f.create_entity("IfcArcIndex", (i + 1, arc_at[i], j + 1)))
            else:
                segments.append(f.create_entity("IfcLineIndex", (i + 1, j + 1)))
        curve = f.createIfcIndexedPolyCurve(coords, segments, False)
    else:
        segments = []
        arc_starts = {3: arcs[0], 5: arcs[1], 11: arcs[2], 13: arcs[3]}
        n = len(pts)
        for i in range(n):
            j = (i + 1) % n
            p0 = f.createIfcCartesianPoint(tuple(map(float, pts[i])))
            p1 = f.createIfcCartesianPoint(tuple(map(float, pts[j])))
            if i in arc_starts:
                centre, _ = arc_starts[i]
                circle = f.createIfcCircle(
                    f.createIfcAxis2Placement2D(f.createIfcCartesianPoint(centre), None), p.r
                )
                # fillets turn clockwise round their centres on a counter-clockwise outline
                piece = f.createIfcTrimmedCurve(circle, [p0], [p1], False, "CARTESIAN")
            else:
                piece = f.createIfcPolyline([p0, p1])
            segments.append(f.createIfcCompositeCurveSegment("CONTINUOUS", True, piece))
        curve = f.createIfcCompositeCurve(segments, False)
    return f.createIfcArbitraryClosedProfileDef("AREA", name, curve)


def _beam_along_x(a: ModelAuthor, profile: IProfile, **kw):
    return a.beam("L1", (0.0, 0.0, 0.0), (SPAN, 0.0, 0.0), profile, **kw)


def outline_i(tmp: Path, corners: int, schema: str = "IFC4") -> Path:
    """An unnamed I outline of IPE300, material S355JR."""
    a = ModelAuthor(schema, "millimetre", seed=f"outline{corners}{schema}")
    a.storey("L1", 3000.0)
    beam = _beam_along_x(a, IPE300, material="S355JR", key="b", name="B1")
    _replace_profile(beam, i_outline_profile(a, IPE300, corners))
    if schema == "IFC2X3":  # no profile sets: the body alone carries the outline
        pass
    return a.write(tmp / f"outline-{corners}-{schema}.ifc")


def _axis_map(a: ModelAuthor, length: float):
    f = a.f
    p0 = f.createIfcCartesianPoint((0.0, 0.0, 0.0))
    p1 = f.createIfcCartesianPoint((0.0, 0.0, float(length)))
    rep = f.createIfcShapeRepresentation(
        a.axis_ctx, "Axis", "Curve3D", [f.createIfcPolyline([p0, p1])]
    )
    return f.createIfcRepresentationMap(a.axis2((0, 0, 0)), rep)


def stiffened_girder(tmp: Path) -> Path:
    """A 14 m IPE500 girder, IFC2X3 (no profile sets), whose type maps both its Axis and
    its body; the body holds a web-stiffener plate before the girder's own extrusion."""
    a = ModelAuthor("IFC2X3", "millimetre", seed="stiffened")
    a.storey("L1", 4000.0)
    f = a.f
    length = 14000.0
    girder = a.beam("L1", (0.0, 0.0, 0.0), (length, 0.0, 0.0), IPE500, material="S355J2",
                    key="g", name="G1", axis=False, body=False)  # fmt: skip
    # stiffener: a 90 x 15 mm plate on one side of the web, extruded up the web's clear height
    # (local y), at 7 m along the girder
    clear = IPE500.d - 2 * IPE500.tf
    plate = f.createIfcRectangleProfileDef(
        "AREA", "PL15x90", f.createIfcAxis2Placement2D(f.createIfcCartesianPoint((0.0, 0.0)), None),
        90.0, 15.0,
    )  # fmt: skip
    stiffener = f.createIfcExtrudedAreaSolid(
        plate, a.axis2((IPE500.tw / 2 + 45.0, -clear / 2, 7000.0), (0, 1, 0), (1, 0, 0)),
        f.createIfcDirection((0.0, 0.0, 1.0)), clear,
    )  # fmt: skip
    own = f.createIfcExtrudedAreaSolid(
        a._profile(IPE500), a.axis2((0.0, 0.0, 0.0)), f.createIfcDirection((0.0, 0.0, 1.0)),
        length,
    )  # fmt: skip
    body_map = f.createIfcRepresentationMap(
        a.axis2((0, 0, 0)),
        f.createIfcShapeRepresentation(a.body_ctx, "Body", "SweptSolid", [stiffener, own]),
    )
    axis_map = _axis_map(a, length)
    target = f.createIfcCartesianTransformationOperator3D(None, None, a.origin, None, None)
    beam_type = f.create_entity(
        "IfcBeamType", GlobalId=a.guid("type:g"), OwnerHistory=a.owner, Name="IPE500",
        RepresentationMaps=[axis_map, body_map], PredefinedType="BEAM",
    )  # fmt: skip
    f.create_entity("IfcRelDefinesByType", GlobalId=a.guid("deftype:g"), OwnerHistory=a.owner,
                    RelatedObjects=[girder], RelatingType=beam_type)  # fmt: skip
    girder.Representation = f.createIfcProductDefinitionShape(
        None, None,
        [
            f.createIfcShapeRepresentation(a.axis_ctx, "Axis", "MappedRepresentation",
                                           [f.createIfcMappedItem(axis_map, target)]),
            f.createIfcShapeRepresentation(a.body_ctx, "Body", "MappedRepresentation",
                                           [f.createIfcMappedItem(body_map, target)]),
        ],
    )  # fmt: skip
    return a.write(tmp / "stiffened-girder.ifc")


def mapped_axis_only(tmp: Path) -> Path:
    """An IPE300 beam (profile set) with no body and its Axis as a mapped item, IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="mappedaxis")
    a.storey("L1", 3000.0)
    f = a.f
    beam = _beam_along_x(a, IPE300, material="S355JR", key="b", name="B1", axis=False,
                         body=False)  # fmt: skip
    target = f.createIfcCartesianTransformationOperator3D(None, None, a.origin, None, None)
    rep = f.createIfcShapeRepresentation(
        a.axis_ctx, "Axis", "MappedRepresentation",
        [f.createIfcMappedItem(_axis_map(a, SPAN), target)],
    )  # fmt: skip
    beam.Representation = f.createIfcProductDefinitionShape(None, None, [rep])
    return a.write(tmp / "mapped-axis.ifc")


def _typed(a: ModelAuthor, element, type_name: str, key: str) -> None:
    f = a.f
    cls = {"IfcBeam": "IfcBeamType", "IfcColumn": "IfcColumnType"}.get(
        element.is_a(), "IfcMemberType"
    )
    predefined = "BEAM" if cls == "IfcBeamType" else ("COLUMN" if cls == "IfcColumnType"
                                                       else "BRACE")  # fmt: skip
    t = f.create_entity(cls, GlobalId=a.guid(f"type:{key}"), OwnerHistory=a.owner,
                        Name=type_name, PredefinedType=predefined)  # fmt: skip
    f.create_entity("IfcRelDefinesByType", GlobalId=a.guid(f"deftype:{key}"),
                    OwnerHistory=a.owner, RelatedObjects=[element], RelatingType=t)  # fmt: skip


def _material(a: ModelAuthor, element, name: str, key: str) -> None:
    a.f.createIfcRelAssociatesMaterial(
        a.guid(f"mat:{key}"), a.owner, None, None, [element], a.material(name)
    )


def name_only(tmp: Path, type_name: str, material: str, file_name: str) -> Path:
    """A beam known by its type's name only: an Axis, no body, no profile set, IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed=file_name)
    a.storey("L1", 3000.0)
    beam = _beam_along_x(a, IPE300, material=None, key="b", name="B1", body=False)
    _typed(a, beam, type_name, "b")
    _material(a, beam, material, "b")
    return a.write(tmp / file_name)


def half_ipe_tee(tmp: Path) -> Path:
    """A tee strut cut from IPE300 as an IfcTShapeProfileDef named '1/2IPE300', IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="halfipe")
    a.storey("L1", 3000.0)
    _beam_along_x(a, IPE300, material="S355JR", key="b", name="B1")
    strut = a.member("L1", (0.0, 0.0, 0.0), (0.0, 3000.0, 0.0), IPE300, predefined="STRUT",
                     material="S355JR", key="t", name="T1")  # fmt: skip
    f = a.f
    pos = f.createIfcAxis2Placement2D(f.createIfcCartesianPoint((0.0, 0.0)), None)
    tee = f.createIfcTShapeProfileDef(
        "AREA", "1/2IPE300", pos, 150.0, 150.0, 7.1, 10.7, 15.0, None, None, None, None
    )
    _replace_profile(strut, tee)
    return a.write(tmp / "half-ipe.ifc")


def angle_brace(tmp: Path) -> Path:
    """A kicker with an IfcLShapeProfileDef giving every dimension (L100x100x10), IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="angle")
    a.storey("L1", 3000.0)
    _beam_along_x(a, IPE300, material="S355JR", key="b", name="B1")
    kicker = a.member("L1", (3000.0, 0.0, -150.0), (3000.0, 1500.0, -1200.0), IPE300,
                      predefined="BRACE", material="S275JR", key="k", name="K1")  # fmt: skip
    f = a.f
    pos = f.createIfcAxis2Placement2D(f.createIfcCartesianPoint((0.0, 0.0)), None)
    angle = f.createIfcLShapeProfileDef(
        "AREA", "L100x100x10", pos, 100.0, 100.0, 10.0, 12.0, 6.0, None
    )
    _replace_profile(kicker, angle)
    return a.write(tmp / "angle-brace.ifc")


def mismatched_grade(tmp: Path) -> Path:
    """A beam whose material is misspelt 'S335J0' while its type name says S355J0, IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="s335")
    a.storey("L1", 3000.0)
    beam = _beam_along_x(a, IPE300, material="S335J0", key="b", name="B1")
    _typed(a, beam, "IPE300 S355J0", "b")
    return a.write(tmp / "s335.ifc")


def ifc4x1_header(tmp: Path) -> Path:
    """An IFC4 model whose header declares IFC4X1 (the entities are those of IFC4)."""
    a = ModelAuthor("IFC4", "millimetre", seed="ifc4x1")
    a.storey("L1", 3000.0)
    _beam_along_x(a, IPE300, material="S355JR", key="b", name="B1")
    path = a.write(tmp / "ifc4x1.ifc")
    text = path.read_text()
    path.write_text(text.replace("FILE_SCHEMA(('IFC4'));", "FILE_SCHEMA(('IFC4X1'));"))
    return path


def _assembly(a: ModelAuthor, key: str, at: tuple[float, float, float], parts: bool):
    """An IfcElementAssembly in storey L1 at ``at``; with ``parts``, two IPE300 beams
    placed relative to it and a cap plate, else plates only."""
    f = a.f
    st = a.storeys["L1"]
    placement = a.placement(st.ObjectPlacement, at)
    assembly = f.create_entity(
        "IfcElementAssembly", GlobalId=a.guid(key), OwnerHistory=a.owner, Name=f"A-{key}",
        ObjectPlacement=placement, AssemblyPlace="FACTORY", PredefinedType="GIRDER",
    )  # fmt: skip
    a._contained["L1"].append(assembly)
    members = []
    if parts:
        for i, y in enumerate((0.0, 2000.0)):
            beam = a.beam("L1", (0.0, y, 0.0), (SPAN, y, 0.0), IPE300, material="S355JR",
                          key=f"{key}-b{i}", name=f"{key}-B{i}")  # fmt: skip
            a._contained["L1"].remove(beam)
            beam.ObjectPlacement.PlacementRelTo = placement
            members.append(beam)
    plate = a.slab("L1", [(0, 0), (200, 0), (200, 300), (0, 300)], 20.0, 0.0,
                   name=f"{key}-PL", key=f"{key}-pl", material="S355JR",
                   ifc_class="IfcPlate")  # fmt: skip
    a._contained["L1"].remove(plate)
    plate.ObjectPlacement.PlacementRelTo = placement
    members.append(plate)
    a._aggregate(assembly, members)
    return assembly


def assemblies(tmp: Path) -> Path:
    """Two beams as parts of an assembly placed 10 m along x and 5 m along y, IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="assembly")
    a.storey("L1", 3000.0)
    _assembly(a, "a1", (10000.0, 5000.0, 0.0), parts=True)
    return a.write(tmp / "assemblies.ifc")


def assemblies_only(tmp: Path) -> Path:
    """Assemblies holding plates only, no beams or columns, IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="assemblyonly")
    a.storey("L1", 3000.0)
    _assembly(a, "a1", (0.0, 0.0, 0.0), parts=False)
    _assembly(a, "a2", (4000.0, 0.0, 0.0), parts=False)
    return a.write(tmp / "assemblies-only.ifc")


def analysis_only(tmp: Path) -> Path:
    """An analysis model (IfcStructuralAnalysisModel, two curve members) and nothing
    physical, IFC4."""
    a = ModelAuthor("IFC4", "millimetre", seed="analysis")
    a.storey("L1", 3000.0)
    f = a.f
    members = []
    for i, (x0, x1) in enumerate(((0.0, SPAN), (SPAN, 2 * SPAN))):
        v0 = f.createIfcVertexPoint(f.createIfcCartesianPoint((x0, 0.0, 3000.0)))
        v1 = f.createIfcVertexPoint(f.createIfcCartesianPoint((x1, 0.0, 3000.0)))
        edge = f.createIfcEdge(v0, v1)
        rep = f.createIfcTopologyRepresentation(a.context, "Reference", "Edge", [edge])
        m = f.create_entity(
            "IfcStructuralCurveMember", GlobalId=a.guid(f"scm{i}"), OwnerHistory=a.owner,
            Name=f"M{i}", Representation=f.createIfcProductDefinitionShape(None, None, [rep]),
            PredefinedType="RIGID_JOINED_MEMBER", Axis=f.createIfcDirection((0.0, 0.0, 1.0)),
        )  # fmt: skip
        members.append(m)
    model = f.create_entity(
        "IfcStructuralAnalysisModel", GlobalId=a.guid("sam"), OwnerHistory=a.owner,
        Name="Analysis", PredefinedType="LOADING_3D",
    )  # fmt: skip
    f.create_entity("IfcRelAssignsToGroup", GlobalId=a.guid("samrel"), OwnerHistory=a.owner,
                    RelatedObjects=members, RelatingGroup=model)  # fmt: skip
    return a.write(tmp / "analysis-only.ifc")


BUILDERS: dict[str, Callable[[Path], Path]] = {
    "outline-12": lambda t: outline_i(t, 12),
    "outline-16": lambda t: outline_i(t, 16),
    "outline-16-ifc2x3": lambda t: outline_i(t, 16, "IFC2X3"),
    "stiffened-girder": stiffened_girder,
    "mapped-axis": mapped_axis_only,
    "heb300-by-name": lambda t: name_only(t, "HEB 300", "S355J2", "heb300.ifc"),
    "welded-by-name": lambda t: name_only(t, "h=930 b=160 tw=10 tf=20", "S355J2", "welded.ifc"),
    "metal-250": lambda t: name_only(t, "IPE300", "Metal - Steel - 250 MPa", "metal250.ifc"),
    "half-ipe": half_ipe_tee,
    "angle-brace": angle_brace,
    "s335": mismatched_grade,
    "ifc4x1": ifc4x1_header,
    "assemblies": assemblies,
}


def build_all(tmp: Path) -> dict[str, Path]:
    """Every model above that holds beams, by name."""
    tmp.mkdir(parents=True, exist_ok=True)
    return {name: build(tmp) for name, build in BUILDERS.items()}


__all__ = ["BUILDERS", "build_all", "ifcopenshell"]
