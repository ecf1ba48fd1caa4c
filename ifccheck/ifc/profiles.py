"""Profile definitions and steel materials → Section and Steel.

A profile with I-shape dimensions gives its section directly; a designation
found in the AISC Shapes Database v16.0 uses the tabulated properties, with
the modelled dimensions kept as a cross-check. Everything else is resolved
by name or reported with the reason it could not be.
"""

from __future__ import annotations

import copy
import re
from dataclasses import dataclass, field

import ifcopenshell
import ifcopenshell.util.element as uelement

from ifccheck.model import MaterialCategory, Section, Steel
from ifccheck.reasons import NotChecked, Reason
from ifccheck.sections import (
    channel_from_dimensions,
    i_section_from_dimensions,
    lookup,
    material_category,
    steel_from_name,
    steel_from_yield,
)

Entity = ifcopenshell.entity_instance

# A US designation inside a longer name: "Beam:W24X84:1234", "W 24x84", "W610x125"
_US_NAME = re.compile(
    r"(?<![A-Z])(W|M|S|HP|MC|C|WT|MT|ST|HSS|PIPE)\s*(\d+(?:\.\d+)?)\s*[X×]\s*(\d+(?:[./]\d+)*)",
    re.IGNORECASE,
)
_EU_NAME = re.compile(
    r"(?<![A-Z])(IPE|IPN|UPN|UPE|HE\s*\d+\s*[ABM]|HE[ABM]|HD|HL|UB|UC)\s*(\d*)", re.IGNORECASE
)

# Consistency check between tabulated and modelled dimensions (common practice:
# modelling tools round to 1/16 in or 1 mm; beyond 5 % the name is doubtful).
DIMENSION_AGREEMENT = 0.05


@dataclass
class ResolvedProfile:
    name: str
    section: Section | None
    source: str  # "profile set", "swept area", "type", "name"
    # depth and width of the outline when known (m), even if no section
    depth: float = 0.0
    width: float = 0.0
    reason: Reason | None = None  # why ``section`` is None
    notes: list[str] = field(default_factory=list)


def designation_in(text: str | None) -> str | None:
    """The first section designation found in a free-text name, or None."""
    if not text:
        return None
    m = _US_NAME.search(text)
    if m:
        return f"{m.group(1).upper()}{m.group(2)}X{m.group(3)}"
    m = _EU_NAME.search(text)
    if m:
        return re.sub(r"\s+", "", m.group(0)).upper()
    return None


_PROFILE_CACHE: dict[tuple, ResolvedProfile] = {}


def _profile_key(profile: Entity, scale: float) -> tuple | None:
    """Profiles equal in class, name and dimensions give equal sections."""
    if not profile.is_a("IfcParameterizedProfileDef"):
        return None
    info = profile.get_info(recursive=False, include_identifier=False)
    info.pop("Position", None)
    return (scale, *sorted((k, v) for k, v in info.items() if not hasattr(v, "is_a")))


def section_from_profile(profile: Entity, scale: float) -> ResolvedProfile:
    """Section for one IFC profile definition (dimensions scaled to metres).

    Parameterised profiles are cached by class, name and dimensions: real
    models repeat a few dozen profiles over thousands of members.
    """
    key = _profile_key(profile, scale)
    if key is None:
        return _section_from_profile(profile, scale)
    found = _PROFILE_CACHE.get(key)
    if found is None:
        found = _PROFILE_CACHE[key] = _section_from_profile(profile, scale)
    return copy.deepcopy(found) if found.notes else copy.copy(found)


def _section_from_profile(profile: Entity, scale: float) -> ResolvedProfile:
    name = (profile.ProfileName or "").strip()
    if profile.is_a("IfcIShapeProfileDef") and not profile.is_a("IfcAsymmetricIShapeProfileDef"):
        d = profile.OverallDepth * scale
        bf = profile.OverallWidth * scale
        tw = profile.WebThickness * scale
        tf = profile.FlangeThickness * scale
        r = (profile.FilletRadius or 0.0) * scale
        computed = i_section_from_dimensions(name or "I-shape", d, bf, tw, tf, r)
        return _prefer_table(name, computed, d, bf)
    if profile.is_a("IfcUShapeProfileDef"):
        d = profile.Depth * scale
        bf = profile.FlangeWidth * scale
        tw = profile.WebThickness * scale
        tf = profile.FlangeThickness * scale
        r = (profile.FilletRadius or 0.0) * scale
        computed = channel_from_dimensions(name or "channel", d, bf, tw, tf, r)
        return _prefer_table(name, computed, d, bf)
    depth, width = _outline_size(profile, scale)
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


def resolve_name(name: str | None) -> ResolvedProfile | None:
    """Resolve a designation through the shape table; None when no designation found."""
    token = designation_in(name)
    if token is None:
        return None
    section = lookup(token)
    if section is not None:
        return ResolvedProfile(section.name, section, "name", section.d, section.bf)
    if _EU_NAME.fullmatch(token):
        detail = f"'{token}' given by name only and no European shape table is shipped"
        return ResolvedProfile(
            token, None, "name",
            reason=Reason.of(NotChecked.PROFILE_WITHOUT_DIMENSIONS, detail=detail),
        )  # fmt: skip
    reason = Reason.of(
        NotChecked.PROFILE_NOT_IN_TABLE, name=token, table="AISC Shapes Database v16.0"
    )
    return ResolvedProfile(token, None, "name", reason=reason)


def _prefer_table(name: str, computed: Section, d: float, bf: float) -> ResolvedProfile:
    token = designation_in(name)
    table = lookup(token) if token else None
    if table is None:
        return ResolvedProfile(name or computed.name, computed, "", d, bf)
    off = max(abs(table.d - d) / table.d, abs(table.bf - bf) / table.bf)
    if off > DIMENSION_AGREEMENT:
        note = (
            f"modelled dimensions differ from {table.name} in the AISC Shapes Database by "
            f"{off:.0%}; properties computed from the modelled dimensions"
        )
        return ResolvedProfile(name, computed, "", d, bf, notes=[note])
    return ResolvedProfile(table.name, table, "", d, bf)


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
    source: str  # "material name", "material property", "default"
    notes: list[str] = field(default_factory=list)


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


def yield_stress(ifc: ifcopenshell.file, material: Entity, pressure_scale: float) -> float | None:
    """YieldStress of a material in Pa (IFC4 Pset_MaterialSteel, IFC2X3 mechanical props)."""
    for props in getattr(material, "HasProperties", None) or ():
        for prop in getattr(props, "Properties", None) or ():
            if prop.Name == "YieldStress" and getattr(prop, "NominalValue", None) is not None:
                return float(prop.NominalValue.wrappedValue) * pressure_scale
    if ifc.schema == "IFC2X3":
        for props in ifc.by_type("IfcMechanicalSteelMaterialProperties"):
            if props.Material == material and props.YieldStress:
                return float(props.YieldStress) * pressure_scale
    return None


def resolve_material(
    ifc: ifcopenshell.file,
    element: Entity,
    section: Section | None,
    default: Steel,
    pressure_scale: float,
    cache: dict | None = None,
) -> ResolvedMaterial:
    """Steel grade (or material category) of an element, with its source.

    ``cache`` (one per file) reuses the answer for members sharing materials.
    """
    select = uelement.get_material(element, should_skip_usage=False, should_inherit=True)
    mats = material_names(select)
    thickest = max(section.tf, section.tw) if section else None
    key = (tuple(m.id() for m in mats), thickest, default.grade, pressure_scale)
    resolved = cache.get(key) if cache is not None else None
    if resolved is None:
        resolved = _resolve(ifc, mats, thickest, default, pressure_scale)
        if cache is not None:
            cache[key] = resolved
    return ResolvedMaterial(
        resolved.name, resolved.category, resolved.steel, resolved.source, list(resolved.notes)
    )


def _resolve(
    ifc: ifcopenshell.file,
    mats: list[Entity],
    thickest: float | None,
    default: Steel,
    pressure_scale: float,
) -> ResolvedMaterial:
    names = [m.Name or "" for m in mats]
    label = " / ".join(n for n in names if n) or "(no material)"
    for mat in mats:
        steel = steel_from_name(mat.Name or "", thickest)
        if steel is not None:
            return ResolvedMaterial(mat.Name, MaterialCategory.STEEL, steel, "material name")
    for mat in mats:
        fy = yield_stress(ifc, mat, pressure_scale)
        if fy is not None:
            steel = steel_from_yield(fy, mat.Name or "steel")
            return ResolvedMaterial(
                mat.Name or "", MaterialCategory.STEEL, steel, "material property"
            )
    for mat in mats:
        text = " ".join(filter(None, [mat.Name, getattr(mat, "Category", None)]))
        category = material_category(text)
        if category in (MaterialCategory.CONCRETE, MaterialCategory.TIMBER):
            return ResolvedMaterial(label, category, None, "material name")
    note = (
        f"grade assumed {default.grade} (settings default): material '{label}' "
        "names no recognised steel grade"
    )
    return ResolvedMaterial(label, MaterialCategory.STEEL, default, "default", [note])
