"""The model information requirements: what a beam needs in the model to be checked.

Two kinds, reported side by side in one structure (:class:`RequirementResult`):

- what IDS 1.0 facets can express (entity and predefined type, attributes,
  materials, partOf) is written as an Information Delivery Specification, the
  buildingSMART open standard, with ``ifctester``'s API (:func:`build_ids`,
  :func:`write_ids`), and audited with ``ifctester`` (:func:`audit_ifc`), so
  that the modelling team can run the same file in their own tools;
- what the facets cannot express (a parametric or catalogue profile, an
  'Axis' representation, a slab or declared deck on each floor level, no
  hardware written as IfcBeam) ifccheck checks itself: the profile and the
  axis here on the IFC entities, the floors and the hardware from the model
  and framing the pipeline made (:func:`floor_deck_requirement`,
  :func:`hardware_requirement`).

A beam that is not checked for a reason one of its unmet requirements causes
keeps that reason, which then names the requirement (:func:`name_unmet`).
"""

from __future__ import annotations

import re
from collections.abc import Collection, Iterable, Mapping, Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Literal
from xml.etree import ElementTree

import ifcopenshell
import ifcopenshell.ifcopenshell_wrapper as wrapper
import ifcopenshell.util.element as uelement
from ifctester import ids as idslib
from xmlschema.validators.exceptions import XMLSchemaException

from ifccheck import __version__
from ifccheck.atomic import atomic_path
from ifccheck.config import RequirementSettings
from ifccheck.errors import ElementError, IdsFileError
from ifccheck.ifc import geometry as geo
from ifccheck.ifc.profiles import resolve_name
from ifccheck.ifc.reader import (
    BEAMLIKE_MEMBER_TYPES,
    BRACE_TYPES,
    STRUT_TYPES,
    open_ifc,
    read_guarded,
)
from ifccheck.model import Member, Model
from ifccheck.reasons import NotChecked
from ifccheck.results import BeamResult, RequirementElement, RequirementResult
from ifccheck.sections.grades import known_grades, steel_from_name

Entity = ifcopenshell.entity_instance
Checker = Literal["ifctester", "ifccheck"]

IDS_NAMESPACE = "http://standards.buildingsmart.org/IDS"
IDS_FILE = "ifccheck.ids"  # the name the tool's own IDS is written and reported under
OWN_SOURCE = "ifccheck"  # the source of the requirements ifccheck checks itself
IDS_VERSIONS = ("IFC2X3", "IFC4", "IFC4X3_ADD2")  # the IFC versions IDS 1.0 names
_IFC4_ON = ("IFC4", "IFC4X3_ADD2")

BEAMS = ("IFCBEAM", "IFCBEAMSTANDARDCASE")
MEMBERS = ("IFCMEMBER", "IFCMEMBERSTANDARDCASE")
COLUMNS = ("IFCCOLUMN", "IFCCOLUMNSTANDARDCASE")
FLOORS = (
    "IFCSLAB",
    "IFCSLABSTANDARDCASE",
    "IFCSLABELEMENTEDCASE",
    "IFCPLATE",
    "IFCPLATESTANDARDCASE",
)
FRAMING = (*BEAMS, *MEMBERS, *COLUMNS, *FLOORS)
_PROFILE_CODES = frozenset(
    {
        NotChecked.NO_PROFILE,
        NotChecked.PROFILE_NOT_IN_TABLE,
        NotChecked.PROFILE_WITHOUT_DIMENSIONS,
        NotChecked.OUTLINE_NOT_RECOGNISED,
    }
)


@dataclass(frozen=True)
class Requirement:
    """One requirement of the tool's own: its words and how it is checked."""

    key: str  # the IDS identifier and the result's identifier
    setting: str  # the [requirements] flag that switches it
    name: str
    description: str
    instructions: str
    versions: tuple[str, ...]
    checked_by: Checker
    # the not-checked reasons an unmet requirement causes (None: whatever stops the check)
    needed_for: frozenset[NotChecked] | None = frozenset()


REQUIREMENTS: tuple[Requirement, ...] = (
    Requirement(
        key="beam_grade",
        setting="beam_grade",
        name="Beams name their steel grade",
        description=(
            "Every IfcBeam has a material whose name gives its steel grade (A992, A572 Gr 50, "
            "S355 ...) or its yield strength (345 MPa, 50 ksi), so that the beam is checked "
            "without an assumed grade. A concrete or timber beam names its material class "
            "(C30/37, GL24h) or says concrete or timber; it is left out of the steel check."
        ),
        instructions=(
            "Associate a material with the beam or its type (an IfcMaterial, or a material "
            "profile set whose material is) named with the grade, e.g. 'ASTM A992' or 'S355J2'. "
            "ifccheck also reads a YieldStress material property, which an IDS cannot test from "
            "the beam: name the grade as well."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifctester",
        needed_for=frozenset({NotChecked.NO_GRADE}),
    ),
    Requirement(
        key="member_grade",
        setting="member_grade",
        name="Braces and struts name their steel grade",
        description=(
            "Every IfcMember typed as a brace, strut, kicker, tie, purlin, rafter, stringer, "
            "joist or girt has a material whose name gives its steel grade or yield strength: "
            "whether a brace is adequate (AISC 360-16 Appendix 6) depends on its steel."
        ),
        instructions=(
            "Associate a material named with the grade (e.g. 'ASTM A36', 'S275') with the member "
            "or its type."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifctester",
        needed_for=frozenset({NotChecked.NO_GRADE}),
    ),
    Requirement(
        key="member_type",
        setting="member_type",
        name="Members say what they are",
        description=(
            "Every IfcMember has a PredefinedType, on the member or its IfcMemberType (BRACE, "
            "STRUT, PURLIN, RAFTER ...), or USERDEFINED with an ObjectType ifccheck reads "
            "(KICKER, TIE, JOIST, GIRT ...), so that its role in the framing is read rather than "
            "guessed from its slope."
        ),
        instructions=(
            "Set the member's PredefinedType (or its type's) to what it is; for a kind the "
            "enumeration lacks, USERDEFINED with the kind as ObjectType."
        ),
        versions=_IFC4_ON,
        checked_by="ifctester",
    ),
    Requirement(
        key="member_type_ifc2x3",
        setting="member_type",
        name="Members say what they are (IFC2X3: on their type)",
        description=(
            "In IFC2X3 an IfcMember has no PredefinedType of its own: it takes the PredefinedType "
            "of its IfcMemberType (BRACE, STRUT, PURLIN, RAFTER ...), so that its role in the "
            "framing is read rather than guessed from its slope. An ObjectType ifccheck reads "
            "(KICKER, TIE, JOIST, GIRT ...) is accepted too."
        ),
        instructions=(
            "Give every IfcMember an IfcMemberType (IfcRelDefinesByType) whose PredefinedType "
            "says what it is."
        ),
        versions=("IFC2X3",),
        checked_by="ifctester",
    ),
    Requirement(
        key="storey",
        setting="storey",
        name="Framing sits in a storey",
        description=(
            "Every beam, column, member, slab and plate is contained in an IfcBuildingStorey, "
            "directly or through the assembly it is a part of, so that each floor's beams, slab "
            "and loads are matched by storey."
        ),
        instructions=(
            "Contain the element in its storey (IfcRelContainedInSpatialStructure); parts of an "
            "IfcElementAssembly may take the assembly's storey."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifctester",
    ),
    Requirement(
        key="profile",
        setting="profile",
        name="Profiles by dimensions or a catalogue name",
        description=(
            "Every IfcBeam and IfcMember has a parametric profile (IfcIShapeProfileDef, "
            "IfcUShapeProfileDef, IfcLShapeProfileDef ...) in its material profile set or body, "
            "or a profile, type or element name that is a catalogue designation ifccheck reads "
            "(W24X84, IPE300, HE 200 A, HSS6X6X1/2 ...). A drawn outline without such a name is "
            "read only by recognising its shape, or not at all. IDS 1.0 facets cannot test a "
            "profile's kind: ifccheck checks this itself."
        ),
        instructions=(
            "Export the profile as a parametric profile with its dimensions, or name it with its "
            "catalogue designation."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifccheck",
        needed_for=_PROFILE_CODES,
    ),
    Requirement(
        key="axis",
        setting="axis",
        name="Beams and members have an Axis line",
        description=(
            "Every IfcBeam and IfcMember has an 'Axis' representation (its reference line), so "
            "that its ends, connections and brace points are found on the line the modeller drew "
            "rather than taken from its body. IDS 1.0 facets cannot test representations: "
            "ifccheck checks this itself."
        ),
        instructions=(
            "Export the members' Axis representation (in most tools an option of the IFC export)."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifccheck",
        needed_for=frozenset({NotChecked.NOT_IN_FRAMING}),
    ),
    Requirement(
        key="floor_deck",
        setting="floor_deck",
        name="A slab or declared deck on every floor level",
        description=(
            "Every level whose beams carry a floor or roof has a slab (IfcSlab or IfcPlate) "
            "modelled on it, or a deck declared under [decks] in the settings: without one no "
            "floor load reaches its beams, and they are not checked. A level the settings mark "
            "floor = false needs none. IDS 1.0 facets cannot relate a level to its slabs: "
            "ifccheck checks this itself, beam by beam."
        ),
        instructions=(
            "Model the level's slab or deck, or declare the deck under [decks] in the settings."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifccheck",
        needed_for=frozenset({NotChecked.NO_FLOOR_LOAD}),
    ),
    Requirement(
        key="hardware",
        setting="hardware",
        name="No hardware written as IfcBeam",
        description=(
            "Plates, flats, bolts, rods and boards are exported as IfcPlate, "
            "IfcMechanicalFastener or IfcDiscreteAccessory, not as IfcBeam: every IfcBeam is a "
            "beam to check, and ifccheck leaves these out of the framing by their names. IDS 1.0 "
            "facets cannot tell hardware from beams: ifccheck checks this itself."
        ),
        instructions=(
            "Export the element with the class of what it is (IfcPlate, IfcMechanicalFastener, "
            "IfcDiscreteAccessory)."
        ),
        versions=IDS_VERSIONS,
        checked_by="ifccheck",
        needed_for=None,
    ),
)
BY_KEY = {r.key: r for r in REQUIREMENTS}


def enabled(settings: RequirementSettings) -> list[Requirement]:
    """The tool's requirements the settings leave switched on, in order."""
    return [r for r in REQUIREMENTS if settings.enabled(r.setting)]


# --------------------------------------------------------------------------
# XSD patterns (XML Schema regular expressions: the whole value must match)
# --------------------------------------------------------------------------

_XSD_META = set("\\|.-^?*+{}()[]")
_SP = "[ _]*"  # the reader reads "_" as a space and collapses runs of spaces
_START = "(.*[^A-Za-z0-9.,])?"  # a grade stands alone: nothing alphanumeric just before it
_DIGIT_END = "([^0-9].*)?"
_ALNUM_END = "([^A-Za-z0-9].*)?"
_GR = f"{_SP}([Gg][Rr]([Aa][Dd][Ee])?\\.?|-|/)?{_SP}"  # "A572 Gr 50", "A572-50", "A572 Grade 50"
_ASTM = f"([Aa][Ss][Tt][Mm]{_SP})?[Aa]{_SP}-?{_SP}"
_MPA = f"{_SP}([Mm][Pp][Aa]|[Nn]{_SP}/{_SP}[Mm][Mm][2²])"
_KSI = f"{_SP}[Kk][Ss][Ii]"
# yield strengths the reader finds plausible for steel: 150-999 MPa, 25-149 ksi
_YIELD = (
    f"(1[5-9][0-9]|[2-9][0-9][0-9])([.,][0-9]+)?{_MPA}.*",
    f"(2[5-9]|[3-9][0-9]|1[0-4][0-9])([.,][0-9]+)?{_KSI}.*",
)
# concrete and timber name their material class instead (EN 206 C30/37, EN 14080 GL24h)
_NOT_STEEL = (
    ".*([Cc][Oo][Nn][Cc][Rr][Ee][Tt][Ee]|[Tt][Ii][Mm][Bb][Ee][Rr]|[Ww][Oo][Oo][Dd]"
    "|[Gg][Ll][Uu][Ll][Aa][Mm]).*",
    f"{_START}[Ll]?[Cc] ?[0-9][0-9][0-9]? ?/ ?[0-9][0-9][0-9]?{_DIGIT_END}",
    f"{_START}[Gg][Ll] ?[0-9][0-9] ?[HhCc]{_ALNUM_END}",
)


def xsd_literal(text: str, spaces: str = "\\s+") -> str:
    """``text`` as an XSD regular expression matching it in either case; runs of
    whitespace match ``spaces``."""
    out: list[str] = []
    for part in re.split(r"(\s+)", text):
        if not part:
            continue
        if part.isspace():
            out.append(spaces)
            continue
        for ch in part:
            if ch.lower() != ch.upper():
                out.append(f"[{ch.upper()}{ch.lower()}]")
            elif ch in _XSD_META:
                out.append("\\" + ch)
            elif ch == "$":
                out.append("[$]")
            else:
                out.append(ch)
    return "".join(out)


def _grade_alternative(grade: str) -> str | None:
    """The pattern of a grade as the reader normalises it ("A572 Gr 50", "S355"), to follow
    ``_START``."""
    m = re.fullmatch(r"A(\d+)(?: Gr ([0-9A-Z]+))?", grade)
    if m:
        body = _ASTM + m.group(1) + (_GR + xsd_literal(m.group(2)) if m.group(2) else "")
        end = _DIGIT_END if (m.group(2) or m.group(1))[-1].isdigit() else _ALNUM_END
        return body + end
    m = re.fullmatch(r"S(\d{3})", grade)
    if m:
        return f"[Ss]{_SP}-?{_SP}{m.group(1)}{_DIGIT_END}"
    m = re.fullmatch(r"Fy (\d+(?:\.\d+)?) (MPa|ksi)", grade)
    if m:
        number = m.group(1).replace(".", "[.,]")
        unit = _MPA if m.group(2) == "MPa" else _KSI
        return f"{number}([.,]0+)?{unit}.*"
    return None


def grade_pattern(grades: Sequence[str] = (), materials: Iterable[str] = ()) -> str:
    """The XSD pattern a material name meets when it gives a steel grade.

    ``grades`` is the project's own list (settings ``requirements.grades``); empty, every
    grade the reader knows and a yield strength written out (150-999 MPa, 25-149 ksi).
    The pattern is never looser than the reader (tests/test_requirements.py). Names of
    the settings' ``[steel.materials]`` match as they are, and concrete and timber classes
    match too (those beams name their material, and are out of the steel check's scope).
    """
    steel: list[str] = []
    for grade in grades or known_grades():
        found = steel_from_name(grade)
        alt = _grade_alternative(found.grade) if found is not None else None
        if alt is None:
            raise ValueError(f"{grade!r} is not a steel grade this tool knows")
        if alt not in steel:
            steel.append(alt)
    if not grades:
        steel += _YIELD
    parts = [f"{_START}({'|'.join(steel)})", *_NOT_STEEL]
    parts += [xsd_literal(" ".join(name.split())) for name in materials if name.strip()]
    return "|".join(parts)


def member_type_words(versions: Iterable[str]) -> list[str]:
    """Every IfcMemberTypeEnum value of the schemas (but USERDEFINED and NOTDEFINED), and
    the ObjectType words the reader takes as a role (KICKER, TIE, JOIST ...)."""
    words: list[str] = []
    for version in versions:
        enum = wrapper.schema_by_name(version).declaration_by_name("IfcMemberTypeEnum")
        items = enum.as_enumeration_type()
        assert items is not None  # IfcMemberTypeEnum is an enumeration in every schema
        words += [w for w in items.enumeration_items() if w not in ("USERDEFINED", "NOTDEFINED")]
    words += sorted(BRACE_TYPES | STRUT_TYPES | BEAMLIKE_MEMBER_TYPES)
    return list(dict.fromkeys(words))


def framing_member_words() -> list[str]:
    """The member types the reader takes as a brace, strut or beam."""
    return sorted(BRACE_TYPES | STRUT_TYPES | BEAMLIKE_MEMBER_TYPES)


def _words_pattern(words: Iterable[str]) -> idslib.Restriction:
    return idslib.Restriction(options={"pattern": "|".join(xsd_literal(w) for w in words)})


def _classes(names: Sequence[str]) -> str | idslib.Restriction:
    if len(names) == 1:
        return names[0]
    return idslib.Restriction(options={"enumeration": list(names)})


# --------------------------------------------------------------------------
# The IDS
# --------------------------------------------------------------------------


def _specification(
    r: Requirement, settings: RequirementSettings, materials: Iterable[str]
) -> idslib.Specification:
    spec = idslib.Specification(
        name=r.name,
        ifcVersion=list(r.versions),
        identifier=r.key,
        description=r.description,
        instructions=r.instructions,
    )
    grade = idslib.Restriction(options={"pattern": grade_pattern(settings.grades, materials)})
    if r.key == "beam_grade":
        spec.applicability.append(idslib.Entity(name=_classes(BEAMS)))
        spec.requirements.append(idslib.Material(value=grade, cardinality="required"))
    elif r.key == "member_grade":
        spec.applicability.append(
            idslib.Entity(name=_classes(MEMBERS), predefinedType=_words_pattern(
                framing_member_words()))
        )  # fmt: skip
        spec.requirements.append(idslib.Material(value=grade, cardinality="required"))
    elif r.key in ("member_type", "member_type_ifc2x3"):
        spec.applicability.append(idslib.Entity(name=_classes(MEMBERS)))
        spec.requirements.append(
            idslib.Entity(
                name=_classes(MEMBERS),
                predefinedType=_words_pattern(member_type_words(r.versions)),
            )
        )
    elif r.key == "storey":
        spec.applicability.append(idslib.Entity(name=_classes(FRAMING)))
        spec.requirements.append(idslib.PartOf(name="IFCBUILDINGSTOREY", cardinality="required"))
    else:
        raise ValueError(f"{r.key} is not written as an IDS specification")
    return spec


def build_ids(
    settings: RequirementSettings | None = None, materials: Iterable[str] = ()
) -> idslib.Ids:
    """The tool's information requirements as an IDS (those IDS 1.0 facets can express).

    ``materials`` are the names the settings map to grades (``[steel.materials]``).
    """
    settings = settings or RequirementSettings()
    materials = list(materials)
    own = [r for r in enabled(settings) if r.checked_by == "ifccheck"]
    described = "; ".join(r.name for r in own) or "none switched on"
    document = idslib.Ids(
        title="ifccheck: information a steel beam check needs",
        version=__version__,
        description=(
            "What ifccheck needs in a model to check every steel beam to AISC 360-16 with "
            "brace points inferred from the framing. ifccheck also checks, itself, what IDS 1.0 "
            f"facets cannot express: {described}."
        ),
        purpose="Information for a structural steel beam check (AISC 360-16)",
    )
    for r in enabled(settings):
        if r.checked_by == "ifctester":
            document.specifications.append(_specification(r, settings, materials))
    return document


def ids_text(document: idslib.Ids) -> str:
    """The IDS as XML text, validated against the IDS 1.0 schema ifctester ships."""
    if not document.specifications:
        raise IdsFileError("requirements: every requirement an IDS can express is switched off")
    text = '<?xml version="1.0" encoding="utf-8"?>\n' + document.to_string().strip() + "\n"
    errors = list(idslib.get_schema().iter_errors(text))
    if errors:  # a bug of ours: the document is built from known parts
        raise RuntimeError(f"the IDS written does not validate: {errors[0].reason}")
    return text


def write_ids(
    path: str | Path, settings: RequirementSettings | None = None, materials: Iterable[str] = ()
) -> tuple[Path, idslib.Ids]:
    """Write the tool's IDS to ``path`` atomically (validated first); returns the path
    and the document."""
    document = build_ids(settings, materials)
    text = ids_text(document)
    path = Path(path)
    with atomic_path(path) as tmp:
        tmp.write_text(text, encoding="utf-8")
    return path, document


def load_ids(path: str | Path) -> idslib.Ids:
    """A project's own IDS file, validated against the IDS 1.0 schema; IdsFileError (exit 2)
    for a file that is missing or not a valid IDS."""
    p = Path(path)
    if not p.is_file():
        raise IdsFileError(f"--ids {p}: no such file")
    try:
        document = idslib.open(str(p), validate=True)
        # ifctester 0.9 does not read a specification's identifier back: take it from the XML
        found = ElementTree.parse(p).getroot().iter(f"{{{IDS_NAMESPACE}}}specification")
        for spec, element in zip(document.specifications, found, strict=False):
            spec.identifier = spec.identifier or element.get("identifier")
        return document
    except idslib.IdsXmlValidationError as exc:
        reason = getattr(exc.xml_error, "reason", None) or "not valid against the IDS 1.0 schema"
        raise IdsFileError(f"--ids {p}: not a valid IDS 1.0 file: {reason}") from None
    except (XMLSchemaException, SyntaxError, ValueError, KeyError, TypeError) as exc:
        raise IdsFileError(f"--ids {p}: cannot be read as an IDS file: {exc}") from None


# --------------------------------------------------------------------------
# The audit
# --------------------------------------------------------------------------


def _guid(element: Entity) -> str:
    return getattr(element, "GlobalId", None) or f"#{element.id()}"


def storey_of(element: Entity) -> str:
    """The storey an element is in, through the assemblies it is a part of ('' if none)."""
    spatial = (
        "IfcSpatialStructureElement" if element.file.schema == "IFC2X3" else "IfcSpatialElement"
    )
    container = uelement.get_container(element)
    whole: Entity | None = element
    while container is None:
        whole = uelement.get_aggregate(whole) if whole is not None else None
        if whole is None:
            break
        if whole.is_a(spatial):
            container = whole
            break
        container = uelement.get_container(whole)
    while container is not None and not container.is_a("IfcBuildingStorey"):
        container = uelement.get_aggregate(container)
    return (container.Name or container.GlobalId) if container is not None else ""


def _element(element: Entity, reason: str) -> RequirementElement:
    return RequirementElement(
        guid=_guid(element),
        name=getattr(element, "Name", None) or "",
        ifc_class=element.is_a(),
        storey=storey_of(element) if element.is_a("IfcProduct") else "",
        reason=reason,
    )


def _material_words(element: Entity) -> str:
    material = uelement.get_material(element, should_skip_usage=True)
    if material is None:
        return "no material"
    names = sorted({m.Name for m in _materials_of(material) if getattr(m, "Name", None)})
    if not names:
        return "its material has no name"
    quoted = ", ".join(f"'{n}'" for n in names)
    return f"material {quoted} gives no steel grade"


def _materials_of(material: Entity) -> list[Entity]:
    if material.is_a("IfcMaterial"):
        return [material]
    found: list[Entity] = []
    for attr in ("Materials", "MaterialProfiles", "MaterialLayers", "MaterialConstituents"):
        for item in getattr(material, attr, None) or ():
            found.append(item if item.is_a("IfcMaterial") else item.Material)
    return [m for m in found if m is not None]


def _own_words(key: str, element: Entity) -> str | None:
    """Why an element fails one of the tool's IDS specifications, in the tool's words."""
    if key in ("beam_grade", "member_grade"):
        return _material_words(element)
    if key in ("member_type", "member_type_ifc2x3"):
        found = uelement.get_predefined_type(element)
        type_obj = uelement.get_type(element)
        where = "" if type_obj is not None else " and no IfcMemberType"
        return f"PredefinedType {found or 'not set'}{where}"
    if key == "storey":
        return "not contained in a storey (nor is an assembly it is part of)"
    return None


def _records(
    ifc: ifcopenshell.file, document: idslib.Ids, source: str, own: bool
) -> list[RequirementResult]:
    """Audit ``ifc`` against ``document`` with ifctester: one record per specification that
    applies to the model's IFC version."""
    document.validate(ifc, should_filter_version=True)
    out: list[RequirementResult] = []
    for spec in document.specifications:
        if not spec.is_ifc_version:
            continue
        applicable = list({e.id(): e for e in spec.applicable_entities}.values())
        reasons: dict[int, list[str]] = {}
        for facet in spec.requirements:
            for failure in facet.failures:
                reasons.setdefault(failure["element"].id(), []).append(str(failure["reason"]))
        key = (spec.identifier or "") if own else (spec.identifier or spec.name or "")
        failing: list[RequirementElement] = []
        for e in applicable:
            if spec.maxOccurs == 0:
                failing.append(_element(e, "the specification prohibits such elements"))
            elif e in spec.failed_entities:
                words = _own_words(key, e) if own else None
                failing.append(_element(e, words or "; ".join(reasons.get(e.id(), []))))
        out.append(
            RequirementResult(
                identifier=key,
                name=spec.name or "",
                description=spec.description or "",
                instructions=spec.instructions or "",
                source=source,
                checked_by="ifctester",
                applicable=len(applicable),
                failing=failing,
                met=bool(spec.status),
            )
        )
    return out


def _linear(ifc: ifcopenshell.file) -> list[Entity]:
    """Every IfcBeam and IfcMember (subtypes included), in file order."""
    found: dict[int, Entity] = {}
    for cls in ("IfcBeam", "IfcMember"):
        for e in ifc.by_type(cls):
            found[e.id()] = e
    return [found[k] for k in sorted(found)]


def _base_profile(profile: Entity) -> Entity:
    while profile.is_a("IfcDerivedProfileDef") and profile.ParentProfile is not None:
        profile = profile.ParentProfile
    return profile


def profile_problem(element: Entity) -> str | None:
    """Why an element's profile is neither parametric nor a catalogue name, or None."""
    profiles: list[Entity] = []
    material = uelement.get_material(element, should_skip_usage=True)
    if material is not None and material.is_a("IfcMaterialProfileSet"):
        profiles += [p.Profile for p in material.MaterialProfiles or () if p.Profile]
    profiles += [solid.SweptArea for _, solid in geo.extrusions(element) if solid.SweptArea]
    if any(_base_profile(p).is_a("IfcParameterizedProfileDef") for p in profiles):
        return None
    el_type = uelement.get_type(element)
    names = [getattr(_base_profile(p), "ProfileName", None) for p in profiles]
    names += [getattr(p, "ProfileName", None) for p in profiles]
    names += [getattr(el_type, "Name", None), getattr(element, "ObjectType", None),
              getattr(element, "Tag", None), element.Name]  # fmt: skip
    for text in names:
        found = resolve_name(text)
        if found is not None and (found.section is not None or found.shape is not None):
            return None
    if not profiles:
        return "no profile: no material profile set, no extruded body and no designation in a name"
    kinds = sorted({_base_profile(p).is_a() for p in profiles})
    return f"{', '.join(kinds)} without a catalogue designation in its profile, type or name"


def _own_ifc_record(r: Requirement, elements: Sequence[Entity]) -> RequirementResult:
    failing: list[RequirementElement] = []

    def problem_of(e: Entity) -> str | None:
        if r.key == "profile":
            return profile_problem(e)
        if r.key == "axis":
            return None if geo.axis_points(e) is not None else "no 'Axis' representation"
        raise ValueError(r.key)

    for e in elements:
        try:
            problem = read_guarded(problem_of, e)
        except ElementError as exc:  # the element's data cannot be read: it fails
            problem = str(exc)
        if problem is not None:
            failing.append(_element(e, problem))
    return own_record(r.key, len(elements), failing)


def own_record(key: str, applicable: int, failing: list[RequirementElement]) -> RequirementResult:
    """The record of one of the requirements ifccheck checks itself."""
    r = BY_KEY[key]
    return RequirementResult(
        identifier=r.key,
        name=r.name,
        description=r.description,
        instructions=r.instructions,
        source=OWN_SOURCE,
        checked_by="ifccheck",
        applicable=applicable,
        failing=failing,
        met=not failing,
    )


def audit_ifc(
    path: str | Path,
    settings: RequirementSettings | None,
    materials: Iterable[str] = (),
    project_ids: Sequence[str | Path] = (),
) -> list[RequirementResult]:
    """Audit a model file: against the tool's IDS (unless ``settings`` is None) and the
    profile and axis requirements ifccheck checks itself, then against each of the
    project's IDS files. The floor and hardware requirements need the pipeline's model and
    framing (:func:`floor_deck_requirement`, :func:`hardware_requirement`)."""
    documents = [(Path(p).name, load_ids(p)) for p in project_ids]
    ifc = open_ifc(path)
    out: list[RequirementResult] = []
    if settings is not None:
        own = build_ids(settings, materials)
        if own.specifications:
            out += _records(ifc, own, IDS_FILE, own=True)
        linear = _linear(ifc)
        for r in enabled(settings):
            if r.key in ("profile", "axis"):
                out.append(_own_ifc_record(r, linear))
    for name, document in documents:
        out += _records(ifc, document, name, own=False)
    return out


def floor_deck_requirement(
    model: Model, floor_beams: Iterable[Member], floor_levels: Collection[str]
) -> RequirementResult:
    """Beams on a level that carries a floor (``floor_levels``) but has no slab modelled
    and no deck declared (the model after the floors stage, declared decks included)."""
    slabbed = {s.level or s.storey for s in model.slabs}
    beams = [m for m in floor_beams if (m.level or m.storey) in floor_levels]
    failing = [
        _member_element(m, f"no slab modelled on {m.level or m.storey} and no deck declared")
        for m in beams
        if (m.level or m.storey) not in slabbed
    ]
    return own_record("floor_deck", len(beams), failing)


def hardware_requirement(model: Model, hardware: Mapping[str, str]) -> RequirementResult:
    """IfcBeams the framing took for hardware (``hardware``: GUID → kind, e.g. "plate or
    flat", from the framing's excluded members)."""
    beams = [m for m in model.members if m.ifc_class.upper() in BEAMS]
    failing = [
        _member_element(m, f"an IfcBeam whose name says {hardware[m.guid]}")
        for m in beams
        if m.guid in hardware
    ]
    return own_record("hardware", len(beams), failing)


def _member_element(m: Member, reason: str) -> RequirementElement:
    return RequirementElement(m.guid, m.name, m.ifc_class, m.storey, reason, m.start, m.end)


def place(records: Iterable[RequirementResult], model: Model) -> None:
    """Give failing members their centroid line from the model (for the plans)."""
    members = {m.guid: m for m in model.members}
    for record in records:
        for e in record.failing:
            m = members.get(e.guid)
            if m is not None and e.start is None:
                e.start, e.end = m.start, m.end


def ordered(records: Iterable[RequirementResult]) -> list[RequirementResult]:
    """The tool's requirements in their order, then the project's, as given."""
    order = {r.key: i for i, r in enumerate(REQUIREMENTS)}
    items = list(records)
    own = [x for x in items if x.source in (IDS_FILE, OWN_SOURCE)]
    rest = [x for x in items if x.source not in (IDS_FILE, OWN_SOURCE)]
    return sorted(own, key=lambda x: order.get(x.identifier, len(order))) + rest


def name_unmet(beams: Iterable[BeamResult], records: Iterable[RequirementResult]) -> int:
    """A not-checked beam that fails one of the tool's requirements its check needs keeps
    its reason, which then names the requirement; returns how many beams were named."""
    failing: dict[str, list[Requirement]] = {}
    for record in records:
        r = BY_KEY.get(record.identifier)
        if r is None or record.source not in (IDS_FILE, OWN_SOURCE):
            continue
        for e in record.failing:
            failing.setdefault(e.guid, []).append(r)
    named = 0
    for b in beams:
        if b.outcome != "not_checked" or b.reason is None or b.guid not in failing:
            continue
        names = [
            r.name for r in failing[b.guid] if r.needed_for is None or b.reason.code in r.needed_for
        ]
        if names:
            b.reason = b.reason.naming(names)
            named += 1
    return named
