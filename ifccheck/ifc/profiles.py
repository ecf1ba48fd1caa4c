"""Profile definitions and steel materials → Section, Shape and Steel.

Every profile becomes a :class:`~ifccheck.sections.dimensions.Shape` with its
family and dimensions where it can: the parametric profiles (I, U, T, L,
rectangular and circular hollow, asymmetric I, lipped C, Z) directly, a polygon
outline by recognising what it draws, and anything else by the designation in
its name. A designation found in the AISC Shapes Database v16.0 uses the
tabulated properties, with the modelled dimensions kept as a cross-check; the
European catalogue and modelled dimensions give computed properties.

The steel grade is looked for wherever models put it, in this order: the
settings' ``[steel.materials]`` table, the material's name, its yield-stress
property, then the type, profile and element names and their properties, then
the material of an analysis member assigned to the element.
"""

from __future__ import annotations

import copy
import math
from collections.abc import Mapping
from dataclasses import dataclass, field, replace

import ifcopenshell
import ifcopenshell.util.element as uelement
import numpy as np
import shapely
from shapely import affinity
from shapely.geometry import Polygon

from ifccheck.errors import ElementError
from ifccheck.ifc.geometry import real
from ifccheck.ifc.geometry import text_value as _text
from ifccheck.model import MaterialCategory, Section, ShapeFamily, Steel
from ifccheck.reasons import NotChecked, Reason
from ifccheck.sections import grade_problem, material_category, steel_from_name, steel_from_yield
from ifccheck.sections.dimensions import Shape, plausible, section_of, shape_of_section
from ifccheck.sections.grades import fy_problem
from ifccheck.sections.names import find_shape
from ifccheck.sections.outline import Recognised, recognise
from ifccheck.sections.table import SOURCE as AISC_SOURCE

Entity = ifcopenshell.entity_instance

# Consistency check between tabulated and modelled dimensions (common practice:
# modelling tools round to 1/16 in or 1 mm; beyond 5 % the name is doubtful).
DIMENSION_AGREEMENT = 0.05
# A section recognised in an outline must have the outline's own area within this.
OUTLINE_AREA_AGREEMENT = 0.02


@dataclass
class ResolvedProfile:
    name: str
    section: Section | None
    source: str  # "profile set", "swept area", "type name", "name", ...
    # depth and width of the outline when known (m), even if no section
    depth: float = 0.0
    width: float = 0.0
    reason: Reason | None = None  # why ``section`` is None
    notes: list[str] = field(default_factory=list)
    shape: Shape | None = None  # family and dimensions, with or without a section
    # depth direction in profile coordinates where it is not +y (a turned outline)
    up: tuple[float, float] | None = None

    @property
    def family(self) -> ShapeFamily | None:
        if self.section is not None:
            return self.section.family
        return self.shape.family if self.shape is not None else None


def _from_named(found, source: str = "name") -> ResolvedProfile:
    shape = found.shape
    if shape is None and found.section is not None:
        shape = shape_of_section(found.section)
    depth = shape.d if shape else 0.0
    width = shape.bf if shape else 0.0
    return ResolvedProfile(
        found.token, found.section, source, depth, width, found.reason, list(found.notes), shape
    )


def resolve_name(name: str | None) -> ResolvedProfile | None:
    """Resolve the designation in a name; None when the name holds no designation."""
    found = find_shape(name)
    return _from_named(found) if found is not None else None


_PROFILE_CACHE: dict[tuple, ResolvedProfile] = {}


def _profile_key(profile: Entity, scale: float) -> tuple | None:
    """Profiles equal in class, name and dimensions give equal sections."""
    if profile.is_a("IfcParameterizedProfileDef"):
        info = profile.get_info(recursive=False, include_identifier=False)
        info.pop("Position", None)
        return (scale, *sorted((k, v) for k, v in info.items() if not hasattr(v, "is_a")))
    if profile.is_a("IfcArbitraryClosedProfileDef"):
        from ifccheck.ifc.geometry import profile_outline

        try:
            outline = profile_outline(profile)
        except Exception:  # an unreadable curve: not cached, resolved (and reported) each time
            return None
        if outline is None:
            return None
        rings = shapely.get_rings(outline.polygon)
        coords = tuple(tuple(np.round(shapely.get_coordinates(r), 9).ravel()) for r in rings)
        return (scale, profile.is_a(), _text(profile.ProfileName), coords)
    return None


def section_from_profile(profile: Entity, scale: float) -> ResolvedProfile:
    """Section for one IFC profile definition (dimensions scaled to metres).

    Profiles are cached by class, name and dimensions (outlines by their
    points): real models repeat a few dozen profiles over thousands of members.
    """
    key = _profile_key(profile, scale)
    if key is None:
        return _section_from_profile(profile, scale)
    found = _PROFILE_CACHE.get(key)
    if found is None:
        found = _PROFILE_CACHE[key] = _section_from_profile(profile, scale)
    return copy.deepcopy(found) if found.notes else copy.copy(found)


def _angle_scale(entity: Entity) -> float:
    import ifcopenshell.util.unit as uunit

    try:
        scale = float(uunit.calculate_unit_scale(entity.file, "PLANEANGLEUNIT"))
    except Exception:  # no unit assignment: radians
        return 1.0
    if not (math.isfinite(scale) and scale > 0.0):
        raise ElementError(f"the plane angle unit has a conversion factor of {scale:g}")
    return scale


def _get(profile: Entity, attr: str, scale: float) -> float:
    value = getattr(profile, attr, None)
    if value is None:
        return 0.0
    label = getattr(profile, "ProfileName", None) or f"#{profile.id()}"
    return real(value, f"{attr} of {profile.is_a()} '{label}'") * scale


def _parametric_shape(profile: Entity, name: str, s: float) -> Shape | ResolvedProfile | None:
    """Shape of a parametric profile; a ResolvedProfile when it has no routine; None if
    the class has no shape dimensions."""
    kind = profile.is_a()
    label = name or kind

    def slope(attr: str) -> float:
        raw = getattr(profile, attr, None)
        if not raw:
            return 0.0
        return real(raw, f"{attr} of {kind} '{label}'") * _angle_scale(profile)

    if profile.is_a("IfcAsymmetricIShapeProfileDef"):
        bb, tb = _get(profile, "BottomFlangeWidth", s), _get(profile, "BottomFlangeThickness", s)
        bt = _get(profile, "TopFlangeWidth", s) or bb
        tt = _get(profile, "TopFlangeThickness", s) or tb
        d, tw = _get(profile, "OverallDepth", s), _get(profile, "WebThickness", s)
        r = _get(profile, "BottomFlangeFilletRadius", s)
        same = math.isclose(bt, bb, rel_tol=1e-6) and math.isclose(tt, tb, rel_tol=1e-6)
        return Shape(
            label, ShapeFamily.I_SHAPE, d, bt, tw, tt, r, source=kind,
            bf_bottom=0.0 if same else bb, tf_bottom=0.0 if same else tb,
        )  # fmt: skip
    if profile.is_a("IfcIShapeProfileDef"):
        return Shape(
            label, ShapeFamily.I_SHAPE,
            _get(profile, "OverallDepth", s), _get(profile, "OverallWidth", s),
            _get(profile, "WebThickness", s), _get(profile, "FlangeThickness", s),
            _get(profile, "FilletRadius", s), slope("FlangeSlope"), source=kind,
        )  # fmt: skip
    if profile.is_a("IfcUShapeProfileDef"):
        return Shape(
            label, ShapeFamily.CHANNEL,
            _get(profile, "Depth", s), _get(profile, "FlangeWidth", s),
            _get(profile, "WebThickness", s), _get(profile, "FlangeThickness", s),
            _get(profile, "FilletRadius", s), slope("FlangeSlope"), source=kind,
        )  # fmt: skip
    if profile.is_a("IfcTShapeProfileDef"):
        return Shape(
            label, ShapeFamily.TEE,
            _get(profile, "Depth", s), _get(profile, "FlangeWidth", s),
            _get(profile, "WebThickness", s), _get(profile, "FlangeThickness", s),
            _get(profile, "FilletRadius", s), slope("FlangeSlope"), source=kind,
        )  # fmt: skip
    if profile.is_a("IfcLShapeProfileDef"):
        d, t = _get(profile, "Depth", s), _get(profile, "Thickness", s)
        b = _get(profile, "Width", s) or d  # IFC: Width absent means equal legs
        return Shape(label, ShapeFamily.ANGLE, d, b, t, t, _get(profile, "FilletRadius", s),
                     source=kind)  # fmt: skip
    if profile.is_a("IfcRectangleHollowProfileDef"):
        t = _get(profile, "WallThickness", s)
        return Shape(
            label, ShapeFamily.HOLLOW_RECT, _get(profile, "YDim", s), _get(profile, "XDim", s),
            t, t, _get(profile, "OuterFilletRadius", s), source=kind,
        )  # fmt: skip
    if profile.is_a("IfcCircleHollowProfileDef"):
        od, t = 2.0 * _get(profile, "Radius", s), _get(profile, "WallThickness", s)
        return Shape(label, ShapeFamily.HOLLOW_ROUND, od, od, t, t, source=kind)
    if profile.is_a("IfcCShapeProfileDef") or profile.is_a("IfcZShapeProfileDef"):
        lipped = profile.is_a("IfcCShapeProfileDef")
        d = _get(profile, "Depth", s)
        b = _get(profile, "Width", s) or _get(profile, "FlangeWidth", s)
        t = _get(profile, "WallThickness", s) or _get(profile, "WebThickness", s)
        what = "cold-formed lipped channel" if lipped else "Z-section"
        family = ShapeFamily.CHANNEL if lipped else ShapeFamily.OTHER
        shape = Shape(label, family, d, b, t, t, source=kind)
        detail = f"{what} {label} (d {d * 1e3:.4g}, b {b * 1e3:.4g}, t {t * 1e3:.4g} mm): " + (
            "no section-property routine for this shape yet"
        )
        return ResolvedProfile(
            label, None, "", d, b, Reason.of(NotChecked.SHAPE_WITHOUT_PROPERTIES, detail=detail),
            shape=shape,
        )  # fmt: skip
    return None


def _section_from_profile(profile: Entity, scale: float) -> ResolvedProfile:
    name = _text(getattr(profile, "ProfileName", None)).strip()
    if profile.is_a("IfcDerivedProfileDef"):
        parent = section_from_profile(profile.ParentProfile, scale)
        parent.notes.append(
            f"derived profile '{name or profile.ParentProfile.ProfileName}': read as its parent"
        )
        return parent
    found = _parametric_shape(profile, name, scale)
    if isinstance(found, ResolvedProfile):
        return found
    if found is not None:
        return _from_shape(found, name)
    depth, width = _outline_size(profile, scale)
    if profile.is_a("IfcArbitraryClosedProfileDef"):
        return _from_outline(profile, name, scale, depth, width)
    resolved = resolve_name(name)
    if resolved is not None:
        resolved.depth = resolved.depth or depth
        resolved.width = resolved.width or width
        return resolved
    kind = profile.is_a()
    detail = (
        f"{kind} '{name}' is not a shape this tool can resolve by name"
        if name
        else f"unnamed {kind}"
    )
    reason = Reason.of(NotChecked.PROFILE_WITHOUT_DIMENSIONS, detail=detail)
    return ResolvedProfile(name or kind, None, "", depth, width, reason)


def _from_shape(shape: Shape, name: str) -> ResolvedProfile:
    """A parametric shape, preferring the tabulated section its name designates.

    Dimensions no section can have (zero or negative, flanges that leave no web, a web
    wider than its flange) make the element not checked, whatever its name says."""
    why = plausible(shape)
    if why is not None:
        detail = f"profile {shape.describe()}: {why}"
        return ResolvedProfile(
            name or shape.name, None, "", 0.0, 0.0, Reason.of(NotChecked.BAD_ELEMENT, detail=detail)
        )
    section, reason = section_of(shape)
    named = find_shape(name) if name else None
    if named is not None and named.section is not None and named.family is shape.family:
        table = named.section
        off = max(abs(table.d - shape.d) / table.d, abs(table.bf - shape.bf) / table.bf)
        if off > DIMENSION_AGREEMENT:
            where = "the AISC Shapes Database" if table.source == AISC_SOURCE else "its catalogue"
            note = (
                f"modelled dimensions differ from {table.name} in {where} by {off:.0%}; "
                "properties computed from the modelled dimensions"
            )
            return ResolvedProfile(name, section, "", shape.d, shape.bf, reason, [note], shape)
        if table.source == AISC_SOURCE or section is None:
            return ResolvedProfile(table.name, table, "", shape.d, shape.bf, None, [], shape)
    if named is not None and named.family is not None and named.family is not shape.family:
        note = f"name '{name}' designates a different shape; the profile's dimensions are used"
        return ResolvedProfile(name or shape.name, section, "", shape.d, shape.bf, reason,
                               [note], shape)  # fmt: skip
    return ResolvedProfile(name or shape.name, section, "", shape.d, shape.bf, reason, [], shape)


def _from_outline(
    profile: Entity, name: str, scale: float, depth: float, width: float
) -> ResolvedProfile:
    """A polygon outline: by its name when that designates a shape of its size, else by
    recognising what it draws."""
    named = resolve_name(name)
    if named is not None and (named.section is not None or named.shape is not None):
        fits = depth <= 0.0 or (
            named.depth > 0.0
            and abs(named.depth - depth) <= DIMENSION_AGREEMENT * named.depth
            and abs(named.width - width) <= DIMENSION_AGREEMENT * max(named.width, 1e-9)
        )
        if fits:
            named.depth, named.width = depth or named.depth, width or named.width
            return named
    from ifccheck.ifc.geometry import profile_outline

    kind = profile.is_a()
    label = name or kind
    try:
        outline = profile_outline(profile)
    except ElementError as exc:  # a curve with bad points or no area
        outline = None
        why = str(exc)
    except Exception as exc:  # a curve the reader does not know
        outline = None
        why = f"its curve cannot be read ({type(exc).__name__})"
    else:
        why = "its curve cannot be read"
    if outline is not None and not isinstance(outline.polygon, Polygon):
        why = f"{outline.repaired} into separate parts"
    elif outline is not None:
        poly = affinity.scale(outline.polygon, scale, scale, origin=(0.0, 0.0))
        found = recognise(poly, label)
        if isinstance(found, Recognised):
            resolved = _recognised(found, label, poly.area, depth, width)
            if outline.repaired:
                resolved.notes.append(outline.repaired)
            return resolved
        why = found
    detail = f"{label}: {why}" + (f"; the name '{name}' designates no shape" if name else "")
    return ResolvedProfile(
        label, None, "", depth, width, Reason.of(NotChecked.OUTLINE_NOT_RECOGNISED, detail=detail)
    )


def _recognised(
    found: Recognised, label: str, area: float, depth: float, width: float
) -> ResolvedProfile:
    shape = found.shape
    if label.startswith("Ifc"):  # an unnamed outline: named by what it draws
        dims = "x".join(f"{v * 1000:.4g}" for k, v in shape.dimensions().items() if k != "r")
        label = f"{shape.family.value} {dims} (outline)"
        shape = replace(shape, name=label)
    section, reason = section_of(shape)
    notes = [f"profile outline read as {shape.describe()}"]
    if section is not None:
        off = abs(section.A - area) / area
        if off > OUTLINE_AREA_AGREEMENT:
            detail = (
                f"{label} reads as {shape.describe()}, but that section's area "
                f"{section.A * 1e4:.4g} cm² differs from the outline's {area * 1e4:.4g} cm² "
                f"by {off:.1%} (limit {OUTLINE_AREA_AGREEMENT:.0%})"
            )
            return ResolvedProfile(
                label, None, "", depth, width,
                Reason.of(NotChecked.OUTLINE_NOT_RECOGNISED, detail=detail), notes, shape,
            )  # fmt: skip
        section = replace(section, source="computed from dimensions measured on the outline")
    up = None if found.up == (0.0, 1.0) else found.up
    return ResolvedProfile(label, section, "", shape.d, shape.bf, reason, notes, shape, up)


def _outline_size(profile: Entity, scale: float) -> tuple[float, float]:
    from ifccheck.ifc.geometry import profile_outline

    try:
        outline = profile_outline(profile)
    except Exception:  # an unreadable outline only loses the envelope size
        return 0.0, 0.0
    if outline is None:
        return 0.0, 0.0
    x0, y0, x1, y1 = outline.polygon.bounds
    return (y1 - y0) * scale, (x1 - x0) * scale


# --- materials -------------------------------------------------------------------


@dataclass
class ResolvedMaterial:
    name: str
    category: MaterialCategory
    steel: Steel | None
    source: str  # "material name", "material property", "type name", ..., "default"
    notes: list[str] = field(default_factory=list)
    reason: Reason | None = None  # no grade found (and no default given)


def material_names(material: Entity | None) -> list[Entity]:
    """The IfcMaterial entities behind any material select."""
    if material is None:
        return []
    if material.is_a("IfcMaterial"):
        return [material]
    if material.is_a("IfcMaterialProfileSetUsage"):
        return material_names(material.ForProfileSet)
    if material.is_a("IfcMaterialProfileSet"):
        return [p.Material for p in material.MaterialProfiles if p.Material]
    if material.is_a("IfcMaterialProfile"):
        return [material.Material] if material.Material else []
    if material.is_a("IfcMaterialLayerSetUsage"):
        return material_names(material.ForLayerSet)
    if material.is_a("IfcMaterialLayerSet"):
        return [layer.Material for layer in material.MaterialLayers if layer.Material]
    if material.is_a("IfcMaterialList"):
        return list(material.Materials)
    if material.is_a("IfcMaterialConstituentSet"):
        return [c.Material for c in material.MaterialConstituents or () if c.Material]
    return []


def yield_stress(
    ifc: ifcopenshell.file, material: Entity, pressure_scale: float | None
) -> float | None:
    """YieldStress of a material in Pa (IFC4 material properties, IFC2X3 mechanical props);
    None when it gives none or the file's pressure unit is unusable (``pressure_scale``
    None). ElementError for a value that is not a number."""
    if pressure_scale is None:
        return None
    what = f"YieldStress of material '{material.Name}'"
    for props in getattr(material, "HasProperties", None) or ():
        for prop in getattr(props, "Properties", None) or ():
            if prop.Name == "YieldStress" and getattr(prop, "NominalValue", None) is not None:
                return real(prop.NominalValue.wrappedValue, what) * pressure_scale
    if ifc.schema == "IFC2X3":
        for props in ifc.by_type("IfcMechanicalSteelMaterialProperties"):
            if props.Material == material and props.YieldStress is not None:
                return real(props.YieldStress, what) * pressure_scale
    return None


@dataclass(frozen=True)
class GradeContext:
    """What the grade search needs besides the element: settings and file-wide values."""

    default: Steel | None = None  # steel.default_grade when the settings set it
    materials: Mapping[str, str] = field(default_factory=dict)  # [steel.materials]
    pressure_scale: float | None = 1.0  # None: the file's pressure unit is unusable

    def mapped(self, name: str) -> str | None:
        key = " ".join(name.split()).casefold()
        for k, v in self.materials.items():
            if " ".join(k.split()).casefold() == key:
                return v
        return None


# Property names that may hold a grade on an element or its type (matched in lower case).
_GRADE_PROPERTY_WORDS = ("grade", "material", "steel", "yield", "fy")


def _property_texts(obj: Entity | None) -> list[str]:
    if obj is None:
        return []
    try:
        psets = uelement.get_psets(obj)
    except Exception:  # malformed property sets: nothing to read
        return []
    out = []
    for props in psets.values():
        for prop, value in props.items():
            if prop == "id" or not isinstance(value, str):
                continue
            if any(w in prop.lower() for w in _GRADE_PROPERTY_WORDS):
                out.append(value)
    return out


def _analysis_materials(element: Entity) -> list[Entity]:
    """Materials of the analysis members assigned to a physical element (either way)."""
    found: list[Entity] = []
    rels = list(getattr(element, "ReferencedBy", None) or ())
    rels += [r for r in getattr(element, "HasAssignments", None) or ()
             if r.is_a("IfcRelAssignsToProduct")]  # fmt: skip
    for rel in rels:
        if not rel.is_a("IfcRelAssignsToProduct"):
            continue
        others = [rel.RelatingProduct, *(rel.RelatedObjects or ())]
        for other in others:
            if other is None or other == element or not other.is_a("IfcStructuralMember"):
                continue
            found += material_names(uelement.get_material(other, should_skip_usage=False))
    return found


class _BeyondTable(Exception):
    """A grade whose yield strength by thickness stops short of the section's plates."""


def _steel_named(text: str, thickest: float | None, *, round_hss: bool = False) -> Steel | None:
    try:
        return steel_from_name(text, thickest, round_hss=round_hss)
    except ValueError as exc:  # EN 10025-2: a plate thicker than the grade's table
        raise _BeyondTable(str(exc)) from None


def resolve_material(
    ifc: ifcopenshell.file,
    element: Entity,
    shape: Shape | None,
    context: GradeContext,
    profile_name: str = "",
    cache: dict | None = None,
) -> ResolvedMaterial:
    """Steel grade (or material category) of an element, with its source and notes.

    ``cache`` (one per file) reuses the material-only answer for members sharing
    materials; the names and properties of each element are read only when the
    materials give no grade. A grade whose yield strength is not tabulated for the
    section's thickness leaves the element not checked (section_out_of_scope).
    """
    try:
        return _resolve_material(ifc, element, shape, context, profile_name, cache)
    except _BeyondTable as exc:
        select = uelement.get_material(element, should_skip_usage=False, should_inherit=True)
        name = " / ".join(_text(m.Name) for m in material_names(select) if _text(m.Name))
        name = name or "(no material)"
        return ResolvedMaterial(
            name, MaterialCategory.STEEL, None, "",
            reason=Reason.of(NotChecked.SECTION_OUT_OF_SCOPE, detail=str(exc)),
        )  # fmt: skip


def _resolve_material(
    ifc: ifcopenshell.file,
    element: Entity,
    shape: Shape | None,
    context: GradeContext,
    profile_name: str = "",
    cache: dict | None = None,
) -> ResolvedMaterial:
    select = uelement.get_material(element, should_skip_usage=False, should_inherit=True)
    mats = material_names(select)
    thickest = shape.thickest if shape is not None else None
    round_hss = shape is not None and shape.family is ShapeFamily.HOLLOW_ROUND
    key = (tuple(m.id() for m in mats), thickest, round_hss)
    found = cache.get(key) if cache is not None else None
    if found is None:
        found = _from_materials(ifc, mats, thickest, round_hss, context)
        if cache is not None:
            cache[key] = found
    resolved = replace(found, notes=list(found.notes))
    if resolved.reason is not None:  # the material says something no steel can be
        return resolved
    el_type = uelement.get_type(element)
    texts = [
        ("type name", _text(getattr(el_type, "Name", None))),
        ("profile name", profile_name),
        ("element name", _text(element.Name)),
        ("element type", _text(getattr(element, "ObjectType", None))),
    ]
    if resolved.steel is not None:
        _note_disagreement(resolved, texts, thickest, round_hss)
        return resolved
    if resolved.category in (
        MaterialCategory.CONCRETE,
        MaterialCategory.TIMBER,
        MaterialCategory.OTHER,
    ):
        return resolved
    candidates = [*texts, *(("type property", t) for t in _property_texts(el_type))]
    candidates += [("element property", t) for t in _property_texts(element)]
    for source, text in candidates:
        steel = _steel_named(text or "", thickest, round_hss=round_hss)
        if steel is not None:
            return _found_elsewhere(resolved, steel, source, text or "")
    for mat in _analysis_materials(element):
        steel = _steel_named(_text(mat.Name), thickest, round_hss=round_hss)
        if steel is not None:
            source = "analysis member material"
            return _found_elsewhere(resolved, steel, source, _text(mat.Name))
    return _no_grade(resolved, context, [t for _, t in texts if t])


def _found_elsewhere(
    resolved: ResolvedMaterial, steel: Steel, source: str, text: str
) -> ResolvedMaterial:
    notes = list(resolved.notes)
    problem = grade_problem(resolved.name)
    if problem:
        notes.append(f"material '{resolved.name}': {problem}; {steel.grade} from the {source} "
                     f"'{text}' used instead")  # fmt: skip
    else:
        notes.append(f"grade {steel.grade} from the {source} '{text}' (the material names none)")
    return ResolvedMaterial(resolved.name, MaterialCategory.STEEL, steel, source, notes)


def _note_disagreement(
    resolved: ResolvedMaterial, texts: list, thickest: float | None, round_hss: bool
) -> None:
    assert resolved.steel is not None
    for source, text in texts:
        try:
            other = _steel_named(text or "", thickest, round_hss=round_hss)
        except _BeyondTable:  # a grade named elsewhere that cannot apply: nothing to note
            continue
        if other is not None and other.grade != resolved.steel.grade:
            resolved.notes.append(
                f"the {source} '{text}' names {other.grade}; the material's "
                f"{resolved.steel.grade} is used"
            )
            return


def _no_grade(
    resolved: ResolvedMaterial, context: GradeContext, names: list[str]
) -> ResolvedMaterial:
    problems = [p for p in (grade_problem(n) for n in [resolved.name, *names]) if p]
    label = resolved.name
    detail = f"material '{label}' names no steel grade, nor do the type, profile or element"
    if problems:
        detail += f" ({problems[0]})"
    if context.default is not None and resolved.category in (
        MaterialCategory.STEEL,
        MaterialCategory.UNKNOWN,
    ):
        note = (
            f"grade assumed {context.default.grade} (steel.default_grade in the settings): "
            + detail
        )
        return ResolvedMaterial(
            label, MaterialCategory.STEEL, context.default, "default", [*resolved.notes, note]
        )
    return ResolvedMaterial(
        label, resolved.category, None, "", list(resolved.notes),
        Reason.of(NotChecked.NO_GRADE, detail=detail),
    )  # fmt: skip


def _from_materials(
    ifc: ifcopenshell.file,
    mats: list[Entity],
    thickest: float | None,
    round_hss: bool,
    context: GradeContext,
) -> ResolvedMaterial:
    names = [_text(m.Name) for m in mats]
    label = " / ".join(n for n in names if n) or "(no material)"
    for mat in mats:
        mapped = context.mapped(_text(mat.Name))
        if mapped is not None:
            steel = _steel_named(mapped, thickest, round_hss=round_hss)
            if steel is not None:
                note = f"grade {steel.grade} for material '{mat.Name}' from [steel.materials]"
                return ResolvedMaterial(
                    _text(mat.Name), MaterialCategory.STEEL, steel, "settings", [note]
                )
    for mat in mats:
        for text in (_text(mat.Name), _text(getattr(mat, "Description", None))):
            steel = _steel_named(text or "", thickest, round_hss=round_hss)
            if steel is not None:
                return ResolvedMaterial(
                    _text(mat.Name), MaterialCategory.STEEL, steel, "material name"
                )
    for mat in mats:
        fy = yield_stress(ifc, mat, context.pressure_scale)
        if fy is not None and fy_problem(fy):
            detail = f"material '{mat.Name}': {fy_problem(fy)}"
            return ResolvedMaterial(
                _text(mat.Name), MaterialCategory.STEEL, None, "material property",
                reason=Reason.of(NotChecked.BAD_ELEMENT, detail=detail),
            )  # fmt: skip
        if fy is not None:
            steel = steel_from_yield(fy, _text(mat.Name) or "steel")
            return ResolvedMaterial(
                _text(mat.Name), MaterialCategory.STEEL, steel, "material property"
            )
    category = MaterialCategory.UNKNOWN
    for mat in mats:
        text = " ".join(filter(None, [_text(mat.Name), _text(getattr(mat, "Category", None))]))
        found = material_category(text)
        if found in (MaterialCategory.CONCRETE, MaterialCategory.TIMBER):
            return ResolvedMaterial(label, found, None, "material name")
        if found is not MaterialCategory.UNKNOWN and category is MaterialCategory.UNKNOWN:
            category = found
    return ResolvedMaterial(label, category, None, "")
