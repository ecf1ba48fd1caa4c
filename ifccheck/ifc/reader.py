"""Read an IFC file into the shared Model vocabulary.

Units come from the file's unit assignment, placements are resolved to the
global frame, and every member's centroid line is taken from the best source
available: the 'Axis' representation (offset by the body's profile position
or, lacking a body, by the cardinal point), else the body extrusion, else
the tessellated body (counted as a geometry fallback).
"""

from __future__ import annotations

import logging
import re
import tempfile
import zipfile
from collections.abc import Mapping
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.element as uelement
import ifcopenshell.util.unit as uunit
import numpy as np
from shapely.geometry import MultiPolygon, Polygon
from shapely.ops import unary_union

from ifccheck.errors import ModelError
from ifccheck.ifc import geometry as geo
from ifccheck.ifc.profiles import (
    GradeContext,
    ResolvedProfile,
    resolve_material,
    resolve_name,
    section_from_profile,
)
from ifccheck.model import (
    MaterialCategory,
    Member,
    MemberRole,
    Model,
    Slab,
    Steel,
    Storey,
    Wall,
)
from ifccheck.reasons import NotChecked, Reason
from ifccheck.sections import default_steel
from ifccheck.sections.dimensions import shape_of_section

Entity = ifcopenshell.entity_instance
log = logging.getLogger(__name__)

LINEAR_CLASSES = ("IfcBeam", "IfcColumn", "IfcMember")
SLAB_CLASSES = ("IfcSlab", "IfcPlate")
WALL_CLASSES = ("IfcWall",)
BRACE_TYPES = {"BRACE", "KICKER", "KNEEBRACE", "KNEE_BRACE"}
STRUT_TYPES = {"STRUT", "TIE", "TIEROD", "TIE_ROD"}
BEAMLIKE_MEMBER_TYPES = {"PURLIN", "RAFTER", "STRINGER", "JOIST", "GIRT"}


# Schemas the IFC library may lack, read as the schema whose entities they share
# for everything this tool reads (buildingSMART: IFC4X1 and IFC4X2 add alignment,
# bridge and road entities on top of IFC4 ADD2).
SCHEMA_FALLBACK = {"IFC4X1": "IFC4", "IFC4X2": "IFC4"}
_FILE_SCHEMA = re.compile(rb"FILE_SCHEMA\s*\(\s*\(\s*'([A-Za-z0-9_]+)'\s*\)\s*\)")


def open_ifc(path: str | Path, warnings: list[str] | None = None) -> ifcopenshell.file:
    """Open an IFC file, turning every failure into a one-line ModelError.

    A file in a schema the IFC library lacks but :data:`SCHEMA_FALLBACK` maps
    (IFC4X1, IFC4X2) is read as IFC4, and a warning is added to ``warnings``.
    """
    p = Path(path)
    if not p.exists():
        raise ModelError(f"{p}: no such file")
    if p.is_dir():
        raise ModelError(f"{p}: is a directory, not an IFC file")
    if zipfile.is_zipfile(p):
        raise ModelError(f"{p}: compressed IFC (ifcZIP) is not read; unzip it first")
    with p.open("rb") as fh:
        head = fh.read(64).lstrip(b"\xef\xbb\xbf \t\r\n")
        fh.seek(0)
        header = fh.read(1 << 16)
        size = p.stat().st_size
        fh.seek(max(0, size - 256))
        tail = fh.read()
    if not head.startswith(b"ISO-10303-21"):
        raise ModelError(f"{p}: not an IFC file (no ISO-10303-21 header)")
    if b"END-ISO-10303-21" not in tail:
        raise ModelError(f"{p}: truncated IFC file (no END-ISO-10303-21 trailer)")
    m = _FILE_SCHEMA.search(header)
    declared = m.group(1).decode("ascii").upper() if m else ""
    target = next((v for k, v in SCHEMA_FALLBACK.items() if declared.startswith(k)), None)
    if m is not None and target is not None and declared not in _known_schemas():
        return _open_as(p, m, declared, target, warnings)
    return _parse(p, str(p))


def _known_schemas() -> set[str]:
    import ifcopenshell.ifcopenshell_wrapper as wrapper

    return {s.upper() for s in wrapper.schema_names()}


def _parse(p: Path, file_name: str) -> ifcopenshell.file:
    try:
        return ifcopenshell.open(file_name)
    except Exception as exc:  # ifcopenshell raises several error types
        detail = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        raise ModelError(f"{p}: cannot parse IFC file: {detail}") from None


def _open_as(
    p: Path, m: re.Match, declared: str, target: str, warnings: list[str] | None
) -> ifcopenshell.file:
    """Read a copy of the file whose header names ``target`` (the input is not touched)."""
    data = p.read_bytes()
    patched = data[: m.start(1)] + target.encode("ascii") + data[m.end(1) :]
    with tempfile.TemporaryDirectory(prefix="ifccheck-") as tmp:
        copy = Path(tmp) / p.name
        copy.write_bytes(patched)
        try:
            f = ifcopenshell.open(str(copy))
        except Exception as exc:  # an entity IFC4 does not have
            detail = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
            raise ModelError(
                f"{p}: schema {declared} is not known to the IFC library, and reading it as "
                f"{target} failed: {detail}"
            ) from None
    if warnings is not None:
        warnings.append(
            f"schema {declared} is not known to the IFC library: read as {target}, whose "
            "entities it shares for beams, columns, profiles, materials and slabs"
        )
    return f


def length_unit_name(ifc: ifcopenshell.file) -> str:
    """Name of the file's length unit: 'metre', 'millimetre', 'foot', 'inch', ..."""
    unit = uunit.get_project_unit(ifc, "LENGTHUNIT")
    if unit is None:
        return "metre"
    if unit.is_a("IfcSIUnit"):
        prefix = (unit.Prefix or "").lower()
        return f"{prefix}metre"
    name = (unit.Name or "").strip().lower()
    aliases = {"feet": "foot", "ft": "foot", "inches": "inch", "in": "inch", "yards": "yard"}
    return aliases.get(name, name or "unknown")


def read_model(
    path: str | Path,
    default_grade: str | None = None,
    materials: Mapping[str, str] | None = None,
) -> Model:
    """Read a model file. Raises ModelError for a file that is not a usable model.

    ``default_grade`` is the grade members are checked on when the model names
    none; None (the default) leaves such members not checked. ``materials`` maps
    material names to grades (the settings' ``[steel.materials]``).
    """
    warnings: list[str] = []
    ifc = open_ifc(path, warnings)
    default = default_steel(default_grade) if default_grade else None
    reader = _Reader(ifc, Path(path).name, default, materials or {})
    model = reader.read()
    model.warnings[:0] = [("", w) for w in warnings]
    if not any(m.role in (MemberRole.BEAM,) for m in model.members):
        raise ModelError(f"{Path(path)}: {_no_beams(ifc)}")
    return model


def _count(ifc: ifcopenshell.file, cls: str) -> int:
    try:
        return len(ifc.by_type(cls))
    except RuntimeError:  # class not in this schema
        return 0


def _no_beams(ifc: ifcopenshell.file) -> str:
    """Why a model has no beams to check, in one line."""
    physical = sum(_count(ifc, c) for c in LINEAR_CLASSES)
    analysis = _count(ifc, "IfcStructuralAnalysisModel")
    if physical == 0 and analysis:
        curves = _count(ifc, "IfcStructuralCurveMember")
        return (
            f"no beams: an analysis model only ({analysis} IfcStructuralAnalysisModel, "
            f"{curves} structural curve members) and no physical IfcBeam, IfcColumn or IfcMember; "
            "export the physical model"
        )
    assemblies, plates = _count(ifc, "IfcElementAssembly"), _count(ifc, "IfcPlate")
    if physical == 0 and (assemblies or plates):
        return (
            f"no beams: only {assemblies} assemblies (IfcElementAssembly) and {plates} plates "
            "(IfcPlate), with no IfcBeam, IfcColumn or IfcMember parts; export the assemblies "
            "with their beams and columns as parts"
        )
    return "no beams in the model (no IfcBeam or beam-like IfcMember)"


class _Reader:
    def __init__(
        self,
        ifc: ifcopenshell.file,
        name: str,
        default: Steel | None,
        materials: Mapping[str, str],
    ) -> None:
        self.ifc = ifc
        self.name = name
        self.scale = float(uunit.calculate_unit_scale(ifc, "LENGTHUNIT"))
        try:
            self.pressure_scale = float(uunit.calculate_unit_scale(ifc, "PRESSUREUNIT"))
        except Exception:  # no pressure unit assigned: SI pascal
            self.pressure_scale = 1.0
        self.grades = GradeContext(default, dict(materials), self.pressure_scale)
        self.model = Model(
            source=name,
            schema=ifc.schema_identifier if hasattr(ifc, "schema_identifier") else ifc.schema,
            length_unit=length_unit_name(ifc),
            length_scale=self.scale,
        )
        self.placements = geo.PlacementCache()
        self._materials: dict = {}

    # --- entry ------------------------------------------------------------------
    def read(self) -> Model:
        self._read_storeys()
        self.model.material_names = sorted(
            {m.Name for m in self.ifc.by_type("IfcMaterial") if m.Name}
        )
        for element in self._elements(LINEAR_CLASSES):
            member = self._member(element)
            if member is not None:
                self.model.members.append(member)
        for element in self._elements(SLAB_CLASSES):
            slab = self._slab(element)
            if slab is not None:
                self.model.slabs.append(slab)
        for element in self._elements(WALL_CLASSES):
            wall = self._wall(element)
            if wall is not None:
                self.model.walls.append(wall)
        return self.model

    def _elements(self, classes: tuple[str, ...]) -> list[Entity]:
        seen: dict[int, Entity] = {}
        for cls in classes:
            try:
                found = self.ifc.by_type(cls)
            except RuntimeError:  # class not in this schema
                continue
            for e in found:
                seen[e.id()] = e
        return [seen[k] for k in sorted(seen)]

    def _read_storeys(self) -> None:
        for st in self.ifc.by_type("IfcBuildingStorey"):
            z = self.placements.of(st)[2, 3] * self.scale
            if st.ObjectPlacement is None and st.Elevation is not None:
                z = float(st.Elevation) * self.scale
            self.model.storeys.append(Storey(st.GlobalId, st.Name or st.GlobalId, float(z)))
        self.model.storeys.sort(key=lambda s: s.elevation)

    def _storey(self, element: Entity) -> str:
        """The storey an element is in, through the assemblies it is a part of."""
        container = uelement.get_container(element)
        whole: Entity | None = element
        while container is None:
            whole = uelement.get_aggregate(whole) if whole is not None else None
            if whole is None or whole.is_a("IfcSpatialElement" if self.ifc.schema != "IFC2X3"
                                           else "IfcSpatialStructureElement"):  # fmt: skip
                container = whole
                break
            container = uelement.get_container(whole)
        while container is not None and not container.is_a("IfcBuildingStorey"):
            container = uelement.get_aggregate(container)
        if container is None:
            return ""
        return container.Name or container.GlobalId

    # --- members ----------------------------------------------------------------
    def _member(self, element: Entity) -> Member | None:
        notes: list[str] = []
        predefined = (uelement.get_predefined_type(element) or "").upper()
        role = _role(element, predefined)
        axis = geo.axis_points(element)
        set_profile, set_source, set_name = self._set_profile(element)
        extrusion = self._main_extrusion(element, axis, set_profile)
        profile = self._profile(element, extrusion, set_profile, set_source, set_name)
        notes += profile.notes
        line = self._centroid_line(element, profile, notes, extrusion, axis)
        if line is None:
            self.model.warnings.append(
                (element.GlobalId, f"{element.is_a()} '{element.Name}' has no readable geometry")
            )
            return None
        start, end, web_up, axis_source = line
        shape = profile.shape
        if shape is None and profile.section is not None:
            shape = shape_of_section(profile.section)
        material = resolve_material(
            self.ifc, element, shape, self.grades, profile.name, self._materials
        )
        notes += material.notes
        unresolved = profile.reason or material.reason
        if material.category in (
            MaterialCategory.CONCRETE,
            MaterialCategory.TIMBER,
            MaterialCategory.OTHER,
        ):
            unresolved = Reason.of(
                NotChecked.NOT_STEEL, category=material.category.value, material=material.name
            )
        member = Member(
            guid=element.GlobalId,
            ifc_class=element.is_a(),
            predefined_type=predefined,
            name=element.Name or "",
            storey=self._storey(element),
            role=role,
            start=tuple(float(v) for v in start),
            end=tuple(float(v) for v in end),
            web_up=tuple(float(v) for v in web_up),
            profile_name=profile.name,
            section=profile.section,
            steel=material.steel,
            material_name=material.name,
            material=material.category,
            axis_source=axis_source,
            profile_source=profile.source,
            grade_source=material.source,
            notes=notes,
            unresolved=unresolved,
            envelope=(profile.depth, profile.width),
            family=profile.family,
            dimensions=shape.dimensions() if shape is not None else {},
        )
        return member

    def _set_profile(self, element: Entity) -> tuple[Entity | None, str, str]:
        """The profile of the material profile set (occurrence, then type), its source
        and the set's name."""
        select = uelement.get_material(element, should_skip_usage=True, should_inherit=False)
        source = "profile set"
        if select is None or not select.is_a("IfcMaterialProfileSet"):
            el_type = uelement.get_type(element)
            select = uelement.get_material(el_type, should_skip_usage=True) if el_type else None
            source = "type profile set"
        if select is not None and select.is_a("IfcMaterialProfileSet"):
            profiles = [p.Profile for p in select.MaterialProfiles if p.Profile]
            if profiles:
                return profiles[0], source, select.Name or ""
        return None, "", ""

    def _main_extrusion(
        self,
        element: Entity,
        axis: tuple[np.ndarray, np.ndarray] | None,
        set_profile: Entity | None,
    ) -> tuple[np.ndarray, Entity] | None:
        """The extrusion that is the member itself, among the items of its body.

        Bodies also hold stiffeners, cap plates and end plates: the member is the
        extrusion along the Axis (when there is one), preferably the one whose
        profile is the profile set's, else the longest.
        """
        found = geo.extrusions(element)
        if len(found) <= 1:
            return found[0] if found else None
        t = None
        if axis is not None and np.linalg.norm(axis[1] - axis[0]) > 0:
            t = (axis[1] - axis[0]) / np.linalg.norm(axis[1] - axis[0])
        set_name = (getattr(set_profile, "ProfileName", None) or "").strip().upper()

        def score(item: tuple[np.ndarray, Entity]) -> tuple[bool, bool, float]:
            direction, length = geo.extrusion_direction(*item)
            along = t is None or abs(float(np.dot(direction, t))) > 0.999
            area = item[1].SweptArea
            same = set_profile is not None and (
                area == set_profile
                or (bool(set_name) and (area.ProfileName or "").strip().upper() == set_name)
            )
            return along, same, length

        return max(found, key=score)

    def _profile(
        self,
        element: Entity,
        extrusion: tuple[np.ndarray, Entity] | None,
        set_profile: Entity | None,
        set_source: str,
        set_name: str,
    ) -> ResolvedProfile:
        """Profile from the material profile set, else the swept area, else a name."""
        if set_profile is not None:
            resolved = section_from_profile(set_profile, self.scale)
            resolved.source = set_source
            if resolved.section is None and resolved.shape is None and set_name:
                by_set_name = resolve_name(set_name)
                if by_set_name is not None and by_set_name.section is not None:
                    by_set_name.source = set_source
                    return by_set_name
            if resolved.section is not None or resolved.shape is not None:
                return resolved
            by_name = self._profile_by_name(element)
            if by_name is not None and (by_name.section or by_name.shape):
                return by_name
            return resolved
        if extrusion is not None:
            resolved = section_from_profile(extrusion[1].SweptArea, self.scale)
            resolved.source = "swept area"
            if resolved.section is None:
                fallback = self._profile_by_name(element)
                if fallback is not None and (
                    fallback.section is not None
                    or (fallback.shape is not None and resolved.shape is None)
                ):
                    return fallback
            return resolved
        by_name = self._profile_by_name(element)
        if by_name is not None:
            return by_name
        return ResolvedProfile("", None, "", reason=Reason.of(NotChecked.NO_PROFILE))

    def _profile_by_name(self, element: Entity) -> ResolvedProfile | None:
        el_type = uelement.get_type(element)
        for text, source in (
            (getattr(el_type, "Name", None), "type name"),
            (getattr(element, "ObjectType", None), "name"),
            (getattr(element, "Tag", None), "name"),
            (element.Name, "name"),
        ):
            resolved = resolve_name(text)
            if resolved is not None:
                resolved.source = source
                return resolved
        return None

    def _centroid_line(
        self,
        element: Entity,
        profile: ResolvedProfile,
        notes: list[str],
        extrusion: tuple[np.ndarray, Entity] | None,
        axis: tuple[np.ndarray, np.ndarray] | None,
    ) -> tuple[np.ndarray, np.ndarray, np.ndarray, str] | None:
        """The centroid line. An Axis representation decides the line and its length; the
        body's extrusion along it gives the offset to the centroid and the depth direction."""
        obj = self.placements.of(element)
        ext_line = None
        if extrusion is not None:
            ext_line = self._extrusion_line(obj, *extrusion, profile.up)
        if axis is not None:
            a0 = geo.transform(obj, axis[0])[0]
            a1 = geo.transform(obj, axis[1])[0]
            t = a1 - a0
            if np.linalg.norm(t) > 0:
                t = t / np.linalg.norm(t)
                if ext_line is not None:
                    s, e, up = ext_line
                    along = e - s
                    if np.linalg.norm(along) > 0 and abs(np.dot(along, t)) > 0.999 * np.linalg.norm(
                        along
                    ):
                        rel = s - a0
                        offset = rel - np.dot(rel, t) * t
                        return (a0 + offset) * self.scale, (a1 + offset) * self.scale, up, "axis"
                    notes.append(
                        "the body's extrusion does not run along the Axis: axis used alone"
                    )
                up, across = _section_frame(obj, t)
                cp = self._cardinal_point(element)
                ox, oy = geo.cardinal_offset(
                    cp, profile.depth / self.scale, profile.width / self.scale
                )
                offset = ox * across + oy * up
                if cp not in (5, 10):
                    notes.append(f"centroid offset from the axis by cardinal point {cp}")
                return (a0 + offset) * self.scale, (a1 + offset) * self.scale, up, "axis"
        if ext_line is not None:
            s, e, up = ext_line
            return s * self.scale, e * self.scale, up, "extrusion"
        return self._geometry_line(element, notes)

    def _extrusion_line(
        self,
        obj: np.ndarray,
        item_matrix: np.ndarray,
        solid: Entity,
        up2d: tuple[float, float] | None = None,
    ) -> tuple[np.ndarray, np.ndarray, np.ndarray] | None:
        m = obj @ item_matrix @ geo.axis2_matrix(solid.Position)
        prof = solid.SweptArea
        centre = np.zeros(2)
        if prof.is_a("IfcArbitraryClosedProfileDef"):
            outline = geo.profile_outline(prof)
            if outline is None:
                return None
            c = outline.polygon.centroid
            centre = np.array([c.x, c.y])
            pm = np.eye(4)
        elif prof.is_a("IfcDerivedProfileDef"):
            pm = geo.axis2_matrix(getattr(prof.ParentProfile, "Position", None))
        else:
            pm = geo.axis2_matrix(getattr(prof, "Position", None))
        p0 = geo.transform(m @ pm, np.array([centre[0], centre[1], 0.0]))[0]
        direction = np.asarray(solid.ExtrudedDirection.DirectionRatios, dtype=float)
        direction = m[:3, :3] @ (direction / np.linalg.norm(direction))
        p1 = p0 + direction * solid.Depth
        frame = m @ pm
        up = frame[:3, 1] if up2d is None else frame[:3, 0] * up2d[0] + frame[:3, 1] * up2d[1]
        up = up - np.dot(up, direction) * direction
        return p0, p1, up / np.linalg.norm(up)

    def _cardinal_point(self, element: Entity) -> int:
        select = uelement.get_material(element, should_skip_usage=False, should_inherit=False)
        if select is not None and select.is_a("IfcMaterialProfileSetUsage"):
            return int(select.CardinalPoint or 5)
        return 5

    def _geometry_line(
        self, element: Entity, notes: list[str]
    ) -> tuple[np.ndarray, np.ndarray, np.ndarray, str] | None:
        verts = self._tessellate(element)
        if verts is None or len(verts) < 4:
            return None
        self.model.geometry_fallbacks += 1
        notes.append("centroid line taken from tessellated body geometry (no axis or extrusion)")
        centre = verts.mean(axis=0)
        _, _, vt = np.linalg.svd(verts - centre, full_matrices=False)
        t = vt[0]
        proj = (verts - centre) @ t
        # verts are in metres already; callers expect metres from this path
        start = centre + proj.min() * t
        end = centre + proj.max() * t
        rest = vt[1:]
        up = rest[np.argmax(np.abs(rest[:, 2]))] if abs(t[2]) < 0.9 else rest[0]
        if up[2] < 0:
            up = -up
        return start, end, up / np.linalg.norm(up), "geometry"

    def _tessellate(self, element: Entity) -> np.ndarray | None:
        found = self._tessellate_faces(element)
        return None if found is None else found[0]

    # --- slabs and walls ----------------------------------------------------------
    def _slab(self, element: Entity) -> Slab | None:
        found = self._footprint(element)
        if found is None:
            if element.is_a("IfcSlab"):
                self.model.warnings.append(
                    (element.GlobalId, f"slab '{element.Name}' has no readable footprint")
                )
            return None
        poly, bottom, top, notes = found
        thickness = top - bottom
        if element.is_a("IfcPlate") and (thickness > 0.5 or poly.area < 1.0):
            return None  # a plate that is not a deck (stiffener, gusset...)
        openings: list[Polygon] = []
        for rel in getattr(element, "HasOpenings", None) or ():
            opening = rel.RelatedOpeningElement
            hole = self._footprint(opening)
            if hole is None:
                notes.append(f"opening {opening.GlobalId} could not be read and is ignored")
                continue
            hpoly, hb, ht, _ = hole
            if ht > bottom and hb < top:
                openings.append(hpoly)
        footprint = poly.difference(unary_union(openings)) if openings else poly
        return Slab(
            guid=element.GlobalId,
            name=element.Name or "",
            storey=self._storey(element),
            footprint=footprint,
            underside=bottom,
            top=top,
            ifc_class=element.is_a(),
            openings=openings,
            notes=notes,
        )

    def _footprint(
        self, element: Entity
    ) -> tuple[Polygon | MultiPolygon, float, float, list[str]] | None:
        obj = self.placements.of(element)
        parts = []
        for item_matrix, item in geo.body_items(element):
            if not item.is_a("IfcExtrudedAreaSolid"):
                parts = []
                break
            found = geo.plan_footprint(obj @ item_matrix, item)
            if found is None:
                parts = []
                break
            parts.append(found)
        if parts:
            poly = unary_union([p[0] for p in parts])
            bottom = min(p[1] for p in parts)
            top = max(p[2] for p in parts)
            s = self.scale
            return _scale_poly(poly, s), bottom * s, top * s, []
        verts_faces = self._tessellate_faces(element)
        if verts_faces is None:
            return None
        self.model.geometry_fallbacks += 1
        verts, faces = verts_faces
        tris = [Polygon(verts[f][:, :2]) for f in faces]
        tris = [t for t in tris if t.is_valid and t.area > 1e-9]
        if not tris:
            return None
        poly = unary_union(tris)
        note = "footprint taken from tessellated body geometry"
        return poly, float(verts[:, 2].min()), float(verts[:, 2].max()), [note]

    def _tessellate_faces(self, element: Entity) -> tuple[np.ndarray, np.ndarray] | None:
        import ifcopenshell.geom

        settings = ifcopenshell.geom.settings()
        settings.set("use-world-coords", True)
        try:
            shape = ifcopenshell.geom.create_shape(settings, element)
        except Exception:  # geometry kernel failure: no footprint
            return None
        verts = np.asarray(shape.geometry.verts, dtype=float).reshape(-1, 3)
        faces = np.asarray(shape.geometry.faces, dtype=int).reshape(-1, 3)
        return verts, faces

    def _wall(self, element: Entity) -> Wall | None:
        found = self._footprint(element)
        if found is None:
            return None
        poly, bottom, top, _ = found
        if isinstance(poly, MultiPolygon):
            poly = max(poly.geoms, key=lambda g: g.area)
        material = resolve_material(
            self.ifc, element, None, GradeContext(pressure_scale=self.pressure_scale)
        )
        category = material.category
        return Wall(
            guid=element.GlobalId,
            name=element.Name or "",
            storey=self._storey(element),
            footprint=poly,
            base=bottom,
            top=top,
            material=category,
        )


def _scale_poly(poly, s: float):
    from shapely import affinity

    return affinity.scale(poly, xfact=s, yfact=s, origin=(0, 0))


def _section_frame(obj: np.ndarray, t: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Depth ('up') and width directions of a section on an axis-only member.

    IFC4 places the profile in the object's local xy plane with its depth
    along local y when the axis runs along local z; otherwise members are
    taken as upright (web vertical), common practice for floor framing.
    """
    local_y = obj[:3, 1]
    if abs(np.dot(obj[:3, 2], t)) > 0.999:
        up = local_y
    else:
        up = np.array([0.0, 0.0, 1.0]) if abs(t[2]) < 0.9 else np.array([0.0, 1.0, 0.0])
    up = up - np.dot(up, t) * t
    up /= np.linalg.norm(up)
    across = np.cross(up, t)
    return up, across


def _role(element: Entity, predefined: str) -> MemberRole:
    if element.is_a("IfcColumn"):
        return MemberRole.COLUMN
    if element.is_a("IfcBeam"):
        return MemberRole.BEAM
    object_type = (getattr(element, "ObjectType", None) or "").upper()
    kind = predefined if predefined not in ("", "USERDEFINED", "NOTDEFINED") else object_type
    if kind in BRACE_TYPES:
        return MemberRole.BRACE
    if kind in STRUT_TYPES:
        return MemberRole.STRUT
    if kind in BEAMLIKE_MEMBER_TYPES:
        return MemberRole.BEAM
    return MemberRole.OTHER
