"""Write small IFC models: used by the demo-model generator and the tests.

Coordinates and dimensions are given in the file's own length unit. The
conventions follow the buildingSMART IFC4 specification: a linear member's
object placement sits at its start point with the local z axis along the
member (the 'Axis' runs from local z = 0 to z = L), the profile lies in the
local xy plane with its depth along local y, and the cardinal point of an
IfcMaterialProfileSetUsage names the profile point that lies on the axis.
"""

from __future__ import annotations

import hashlib
import uuid
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path

import ifcopenshell
import ifcopenshell.guid
import numpy as np

from ifccheck.ifc.geometry import cardinal_offset

Vec = Sequence[float]

LENGTH_UNITS = {
    # name: (IfcSIUnit prefix or None, conversion to metre for conversion-based units)
    "metre": (None, None),
    "millimetre": ("MILLI", None),
    "foot": (None, 0.3048),
    "inch": (None, 0.0254),
}


@dataclass
class IProfile:
    """An I-shape in file units; ``name`` is the designation written to the file."""

    name: str
    d: float
    bf: float
    tw: float
    tf: float
    r: float = 0.0
    kind: str = "I"  # "I" (IfcIShapeProfileDef), "U" (channel), "outline", "name"


class ModelAuthor:
    """Builds an IFC file entity by entity (works for IFC2X3, IFC4 and IFC4X3)."""

    def __init__(
        self,
        schema: str = "IFC4",
        length_unit: str = "foot",
        project: str = "Project",
        seed: str = "ifccheck",
    ) -> None:
        if length_unit not in LENGTH_UNITS:
            raise ValueError(f"unknown length unit {length_unit}")
        self.schema = schema
        self.length_unit = length_unit
        self.seed = seed
        self._counter = 0
        self.f = ifcopenshell.file(schema=schema)  # type: ignore[arg-type]
        f = self.f
        self.origin = f.createIfcCartesianPoint((0.0, 0.0, 0.0))
        self.world = f.createIfcAxis2Placement3D(self.origin, None, None)
        self.context = f.createIfcGeometricRepresentationContext(
            None, "Model", 3, 1.0e-5, self.world, None
        )
        if schema == "IFC2X3":
            self.body_ctx = self.axis_ctx = self.context
        else:
            self.body_ctx = f.createIfcGeometricRepresentationSubContext(
                "Body", "Model", None, None, None, None, self.context, None, "MODEL_VIEW", None
            )
            self.axis_ctx = f.createIfcGeometricRepresentationSubContext(
                "Axis", "Model", None, None, None, None, self.context, None, "GRAPH_VIEW", None
            )
        units = [self._length_unit(), f.createIfcSIUnit(None, "AREAUNIT", None, "SQUARE_METRE")]
        units.append(f.createIfcSIUnit(None, "PRESSUREUNIT", None, "PASCAL"))
        assignment = f.createIfcUnitAssignment(units)
        owner = self._owner_history() if schema == "IFC2X3" else None
        self.owner = owner
        self.project = f.createIfcProject(
            self.guid("project"), owner, project, None, None, None, None, [self.context], assignment
        )
        self.site = f.createIfcSite(
            self.guid("site"), owner, "Site", None, None, self.placement(None, (0, 0, 0)),
            None, None, "ELEMENT", None, None, None, None, None,
        )  # fmt: skip
        self.building = f.createIfcBuilding(
            self.guid("building"), owner, "Building", None, None,
            self.placement(self.site.ObjectPlacement, (0, 0, 0)), None, None, "ELEMENT",
            None, None, None,
        )  # fmt: skip
        self._aggregate(self.project, [self.site])
        self._aggregate(self.site, [self.building])
        self.storeys: dict[str, ifcopenshell.entity_instance] = {}
        self._contained: dict[str, list[ifcopenshell.entity_instance]] = {}
        self._materials: dict[str, ifcopenshell.entity_instance] = {}

    # --- identity and bookkeeping -------------------------------------------------
    def guid(self, key: str) -> str:
        """A GlobalId fixed by the seed and a key, so regenerated files are identical."""
        digest = hashlib.sha1(f"{self.seed}:{key}".encode()).hexdigest()[:32]
        return ifcopenshell.guid.compress(uuid.UUID(digest).hex)

    def _next(self, prefix: str) -> str:
        self._counter += 1
        return f"{prefix}-{self._counter}"

    def _owner_history(self) -> ifcopenshell.entity_instance:
        f = self.f
        person = f.createIfcPerson(None, "Modeller", None, None, None, None, None, None)
        org = f.createIfcOrganization(None, "Demo Office", None, None, None)
        pao = f.createIfcPersonAndOrganization(person, org, None)
        app = f.createIfcApplication(org, "0.1", "ifccheck samples", "ifccheck")
        return f.createIfcOwnerHistory(pao, app, None, "ADDED", None, None, None, 0)

    def _length_unit(self) -> ifcopenshell.entity_instance:
        f = self.f
        prefix, to_metre = LENGTH_UNITS[self.length_unit]
        if to_metre is None:
            return f.createIfcSIUnit(None, "LENGTHUNIT", prefix, "METRE")
        metre = f.createIfcSIUnit(None, "LENGTHUNIT", None, "METRE")
        value = f.create_entity("IfcLengthMeasure", to_metre)
        factor = f.createIfcMeasureWithUnit(value, metre)
        exp = f.createIfcDimensionalExponents(1, 0, 0, 0, 0, 0, 0)
        return f.createIfcConversionBasedUnit(exp, "LENGTHUNIT", self.length_unit.upper(), factor)

    def _aggregate(self, whole, parts) -> None:
        self.f.createIfcRelAggregates(
            self.guid(self._next("agg")), self.owner, None, None, whole, parts
        )

    # --- geometry primitives ------------------------------------------------------
    def axis2(
        self, location: Vec, z: Vec | None = None, x: Vec | None = None
    ) -> ifcopenshell.entity_instance:
        f = self.f
        loc = f.createIfcCartesianPoint(tuple(float(v) for v in location))
        zd = f.createIfcDirection(tuple(float(v) for v in z)) if z is not None else None
        xd = f.createIfcDirection(tuple(float(v) for v in x)) if x is not None else None
        return f.createIfcAxis2Placement3D(loc, zd, xd)

    def placement(self, relative_to, location: Vec, z: Vec | None = None, x: Vec | None = None):
        return self.f.createIfcLocalPlacement(relative_to, self.axis2(location, z, x))

    def storey(self, name: str, elevation: float) -> ifcopenshell.entity_instance:
        st = self.f.createIfcBuildingStorey(
            self.guid(f"storey:{name}"), self.owner, name, None, None,
            self.placement(self.building.ObjectPlacement, (0, 0, elevation)),
            None, None, "ELEMENT", float(elevation),
        )  # fmt: skip
        self._aggregate(self.building, [st])
        self.storeys[name] = st
        self._contained[name] = []
        return st

    def _polyline2d(self, pts: Sequence[Vec]) -> ifcopenshell.entity_instance:
        f = self.f
        points = [f.createIfcCartesianPoint((float(p[0]), float(p[1]))) for p in pts]
        points.append(points[0])
        return f.createIfcPolyline(points)

    def _profile(self, p: IProfile, offset: tuple[float, float] = (0.0, 0.0)):
        f = self.f
        pos = f.createIfcAxis2Placement2D(f.createIfcCartesianPoint(offset), None)
        if p.kind == "I":
            return f.createIfcIShapeProfileDef(
                "AREA", p.name, pos, p.bf, p.d, p.tw, p.tf, p.r or None
            )
        if p.kind == "U":
            return f.createIfcUShapeProfileDef(
                "AREA", p.name, pos, p.d, p.bf, p.tw, p.tf, p.r or None, None, None
            )
        # an outline of the I-shape only, no dimensions: the reader must go by name
        hb, hd, htw, tf = p.bf / 2, p.d / 2, p.tw / 2, p.tf
        ox, oy = offset
        outline = [
            (-hb, -hd), (hb, -hd), (hb, -hd + tf), (htw, -hd + tf), (htw, hd - tf),
            (hb, hd - tf), (hb, hd), (-hb, hd), (-hb, hd - tf), (-htw, hd - tf),
            (-htw, -hd + tf), (-hb, -hd + tf),
        ]  # fmt: skip
        curve = self._polyline2d([(x + ox, y + oy) for x, y in outline])
        return f.createIfcArbitraryClosedProfileDef("AREA", p.name, curve)

    def material(self, name: str, yield_stress: float | None = None, category: str | None = None):
        """An IfcMaterial, optionally with a steel yield stress property (Pa)."""
        key = f"{name}|{yield_stress}|{category}"
        if key in self._materials:
            return self._materials[key]
        f = self.f
        if self.schema == "IFC2X3":
            mat = f.createIfcMaterial(name)
            if yield_stress is not None:
                f.createIfcMechanicalSteelMaterialProperties(
                    mat, None, None, None, None, None, yield_stress, None, None, None, None
                )
        else:
            mat = f.createIfcMaterial(name, None, category)
            if yield_stress is not None:
                prop = f.createIfcPropertySingleValue(
                    "YieldStress", None, f.create_entity("IfcPressureMeasure", yield_stress), None
                )
                f.createIfcMaterialProperties("Pset_MaterialSteel", None, [prop], mat)
        self._materials[key] = mat
        return mat

    # --- members ------------------------------------------------------------------
    def linear(
        self,
        ifc_class: str,
        storey: str,
        start: Vec,
        end: Vec,
        profile: IProfile,
        material: str | ifcopenshell.entity_instance | None = "A992",
        name: str | None = None,
        predefined: str | None = None,
        key: str | None = None,
        cardinal_point: int = 5,
        axis: bool = True,
        body: bool = True,
        offset_in: str = "solid",
        via_type: bool = False,
        roll: float = 0.0,
    ) -> ifcopenshell.entity_instance:
        """A beam, column or member between two points given in storey coordinates.

        ``offset_in`` puts the cardinal-point offset in the extrusion position
        ("solid") or the profile position ("profile"). ``roll`` turns the
        section about its axis (radians). ``via_type`` puts profile, material
        and body on an IfcBeamType-like type object.
        """
        f = self.f
        s = np.asarray(start, float)
        e = np.asarray(end, float)
        z = e - s
        length = float(np.linalg.norm(z))
        z /= length
        up = np.array([0.0, 0.0, 1.0]) if abs(z[2]) < 0.9 else np.array([0.0, 1.0, 0.0])
        y = up - np.dot(up, z) * z
        y /= np.linalg.norm(y)
        x = np.cross(y, z)
        if roll:
            c, sn = np.cos(roll), np.sin(roll)
            x, y = c * x + sn * y, -sn * x + c * y
        st = self.storeys[storey]
        placement = self.placement(st.ObjectPlacement, s.tolist(), z.tolist(), x.tolist())
        key = key or self._next(ifc_class)
        cx, cy = cardinal_offset(cardinal_point, profile.d, profile.bf)
        reps = []
        body_item = None
        if body:
            in_profile = offset_in == "profile"
            prof = self._profile(profile, (cx, cy) if in_profile else (0.0, 0.0))
            solid_pos = self.axis2((0.0, 0.0, 0.0) if in_profile else (cx, cy, 0.0))
            direction = f.createIfcDirection((0.0, 0.0, 1.0))
            body_item = f.createIfcExtrudedAreaSolid(prof, solid_pos, direction, length)
        if axis:
            p0 = f.createIfcCartesianPoint((0.0, 0.0, 0.0))
            p1 = f.createIfcCartesianPoint((0.0, 0.0, length))
            reps.append(
                f.createIfcShapeRepresentation(
                    self.axis_ctx, "Axis", "Curve3D", [f.createIfcPolyline([p0, p1])]
                )
            )
        type_obj = None
        if body_item is not None and via_type:
            rep_map = f.createIfcRepresentationMap(
                self.axis2((0, 0, 0)),
                f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [body_item]),
            )
            type_class = {"IfcBeam": "IfcBeamType", "IfcColumn": "IfcColumnType"}.get(
                ifc_class, "IfcMemberType"
            )
            type_obj = f.create_entity(
                type_class,
                GlobalId=self.guid(f"type:{key}"),
                OwnerHistory=self.owner,
                Name=profile.name,
                RepresentationMaps=[rep_map],
                PredefinedType=predefined or ("BEAM" if ifc_class == "IfcBeam" else "NOTDEFINED"),
            )
            target = f.createIfcCartesianTransformationOperator3D(
                None, None, self.origin, None, None
            )
            mapped = f.createIfcMappedItem(rep_map, target)
            reps.append(
                f.createIfcShapeRepresentation(
                    self.body_ctx, "Body", "MappedRepresentation", [mapped]
                )
            )
        elif body_item is not None:
            reps.append(
                f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [body_item])
            )
        shape = f.createIfcProductDefinitionShape(None, None, reps) if reps else None
        attrs = {
            "GlobalId": self.guid(key),
            "OwnerHistory": self.owner,
            "Name": name or key,
            "ObjectPlacement": placement,
            "Representation": shape,
        }
        if self.schema != "IFC2X3" and predefined:
            attrs["PredefinedType"] = predefined
        element = f.create_entity(ifc_class, **attrs)
        if self.schema == "IFC2X3" and predefined:
            element.ObjectType = predefined
        self._contained[storey].append(element)
        if type_obj is not None:
            rel = "IfcRelDefinesByType"
            f.create_entity(
                rel, GlobalId=self.guid(f"deftype:{key}"), OwnerHistory=self.owner,
                RelatedObjects=[element], RelatingType=type_obj,
            )  # fmt: skip
        if material is not None:
            self._associate_material(
                element, type_obj, material, profile, cardinal_point, key, body
            )
        return element

    def _associate_material(self, element, type_obj, material, profile, cardinal_point, key, body):
        f = self.f
        mat = material if not isinstance(material, str) else self.material(material)
        if self.schema == "IFC2X3":
            target = type_obj or element
            f.createIfcRelAssociatesMaterial(
                self.guid(f"mat:{key}"), self.owner, None, None, [target], mat
            )
            return
        prof = self._profile(profile)
        mp = f.createIfcMaterialProfile(None, None, mat, prof, None, None)
        mps = f.createIfcMaterialProfileSet(profile.name, None, [mp], None)
        if type_obj is not None:
            f.createIfcRelAssociatesMaterial(
                self.guid(f"mattype:{key}"), None, None, None, [type_obj], mps
            )
            return
        usage = f.createIfcMaterialProfileSetUsage(mps, cardinal_point, None)
        f.createIfcRelAssociatesMaterial(
            self.guid(f"mat:{key}"), None, None, None, [element], usage
        )

    def beam(self, storey, start, end, profile, **kw):
        kw.setdefault("predefined", "BEAM")
        return self.linear("IfcBeam", storey, start, end, profile, **kw)

    def column(self, storey, base, height, profile, **kw):
        kw.setdefault("predefined", "COLUMN")
        top = (base[0], base[1], base[2] + height)
        return self.linear("IfcColumn", storey, base, top, profile, **kw)

    def member(self, storey, start, end, profile, predefined="STRUT", **kw):
        return self.linear("IfcMember", storey, start, end, profile, predefined=predefined, **kw)

    # --- slabs, openings, walls ---------------------------------------------------
    def _vertical_extrusion(self, outline, thickness, z_bottom, holes=()):
        f = self.f
        outer = self._polyline2d(outline)
        if holes:
            inner = [self._polyline2d(h) for h in holes]
            prof = f.createIfcArbitraryProfileDefWithVoids("AREA", None, outer, inner)
        else:
            prof = f.createIfcArbitraryClosedProfileDef("AREA", None, outer)
        pos = self.axis2((0.0, 0.0, z_bottom))
        return f.createIfcExtrudedAreaSolid(
            prof, pos, f.createIfcDirection((0.0, 0.0, 1.0)), thickness
        )

    def slab(
        self,
        storey: str,
        outline: Sequence[Vec],
        thickness: float,
        top: float,
        openings: Sequence[Sequence[Vec]] = (),
        name: str = "Slab",
        key: str | None = None,
        material: str = "Normal-weight concrete",
        ifc_class: str = "IfcSlab",
    ) -> ifcopenshell.entity_instance:
        """A flat slab; ``top`` is the top-of-slab elevation relative to the storey."""
        f = self.f
        key = key or self._next("slab")
        st = self.storeys[storey]
        solid = self._vertical_extrusion(outline, thickness, top - thickness)
        rep = f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [solid])
        attrs = {
            "GlobalId": self.guid(key),
            "OwnerHistory": self.owner,
            "Name": name,
            "ObjectPlacement": self.placement(st.ObjectPlacement, (0, 0, 0)),
            "Representation": f.createIfcProductDefinitionShape(None, None, [rep]),
        }
        if ifc_class == "IfcSlab":
            attrs["PredefinedType"] = "FLOOR"
        slab = f.create_entity(ifc_class, **attrs)
        self._contained[storey].append(slab)
        f.createIfcRelAssociatesMaterial(
            self.guid(f"mat:{key}"), self.owner, None, None, [slab], self.material(material)
        )
        for i, hole in enumerate(openings):
            self.opening(slab, hole, thickness, top - thickness, f"{key}:opening:{i}")
        return slab

    def opening(self, host, outline, thickness, z_bottom, key):
        """An IfcOpeningElement cut through ``host`` (plan outline, storey coordinates)."""
        f = self.f
        margin = 0.1 * thickness
        solid = self._vertical_extrusion(outline, thickness + 2 * margin, z_bottom - margin)
        rep = f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [solid])
        opening = f.createIfcOpeningElement(
            self.guid(key), self.owner, "Opening", None, None,
            self.f.createIfcLocalPlacement(host.ObjectPlacement, self.axis2((0, 0, 0))),
            f.createIfcProductDefinitionShape(None, None, [rep]), None,
            *([] if self.schema == "IFC2X3" else ["OPENING"]),
        )  # fmt: skip
        f.createIfcRelVoidsElement(self.guid(f"void:{key}"), self.owner, None, None, host, opening)
        return opening

    def wall(self, storey, start, end, thickness, height, base=0.0, name="Wall", key=None,
             material="Concrete"):  # fmt: skip
        """A straight wall on its centreline (plan points in storey coordinates)."""
        f = self.f
        key = key or self._next("wall")
        s = np.asarray(start[:2], float)
        e = np.asarray(end[:2], float)
        t = (e - s) / np.linalg.norm(e - s)
        n = np.array([-t[1], t[0]]) * thickness / 2
        outline = [tuple(s - n), tuple(e - n), tuple(e + n), tuple(s + n)]
        solid = self._vertical_extrusion(outline, height, base)
        rep = f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [solid])
        wall = f.create_entity(
            "IfcWall" if self.schema != "IFC2X3" else "IfcWallStandardCase",
            GlobalId=self.guid(key), OwnerHistory=self.owner, Name=name,
            ObjectPlacement=self.placement(self.storeys[storey].ObjectPlacement, (0, 0, 0)),
            Representation=f.createIfcProductDefinitionShape(None, None, [rep]),
        )  # fmt: skip
        self._contained[storey].append(wall)
        f.createIfcRelAssociatesMaterial(
            self.guid(f"mat:{key}"), self.owner, None, None, [wall], self.material(material)
        )
        return wall

    # --- output -------------------------------------------------------------------
    def finish(self) -> ifcopenshell.file:
        for name, elements in self._contained.items():
            if elements:
                self.f.createIfcRelContainedInSpatialStructure(
                    self.guid(f"contain:{name}"), self.owner, None, None, elements,
                    self.storeys[name],
                )  # fmt: skip
        self._contained = {k: [] for k in self._contained}
        return self.f

    def write(self, path: str | Path, timestamp: str = "2026-01-01T00:00:00") -> Path:
        """Write the file; a fixed header timestamp keeps regenerated files identical."""
        self.finish()
        path = Path(path)
        header = self.f.header.file_name
        header.name = path.name
        header.time_stamp = timestamp
        header.preprocessor_version = "ifccheck model author"
        header.originating_system = "ifccheck"
        self.f.write(str(path))
        return path
