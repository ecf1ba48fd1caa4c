"""Read an IFC file into the shared Model vocabulary.

Units come from the file's unit assignment, placements are resolved to the
global frame, and every member's centroid line is taken from the best source
available: the 'Axis' representation (offset by the body's profile position
or, lacking a body, by the cardinal point), else the body extrusion, else
the tessellated body (counted as a geometry fallback).
"""

from __future__ import annotations

import json
import logging
import math
import os
import re
import tempfile
import threading
import zipfile
from collections import Counter
from collections.abc import Callable, Mapping
from pathlib import Path
from typing import Any, TypeVar

import ifcopenshell
import ifcopenshell.util.element as uelement
import ifcopenshell.util.unit as uunit
import numpy as np
from shapely.geometry import MultiPolygon, Polygon
from shapely.ops import unary_union

from ifccheck.errors import ElementError, ModelError
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
from ifccheck.units import MODEL_LENGTH_UNITS, model_length_unit

Entity = ifcopenshell.entity_instance
log = logging.getLogger(__name__)
_text = geo.text_value

# Members farther than this from the median member position are not used (m): a
# georeferenced model puts its origin far away, but its members lie close together.
FAR_LIMIT = 100_000.0
PLAN_GRID = 1e-9  # m: plan outlines are snapped to it (see _scale_poly)
# A slab thinner than this is taken as having no thickness (m).
MIN_SLAB_THICKNESS = 1e-6
DUPLICATES_SHOWN = 10  # shared GlobalIds listed by name in the warning

T = TypeVar("T")


def read_guarded(read: Callable[[Entity], T], element: Entity) -> T:
    """Read one element; anything in its data the reader cannot use is an ElementError.

    Coordinates too large to add overflow to inf without a numpy warning: the element is
    then refused as not finite where its position is checked. An entity of the wrong type
    where a reference belongs (a point for a placement, say) fails as whatever Python
    error its use raises: that too makes the element unreadable, never the run, with the
    error named (IFCCHECK_DEBUG=1 raises it, to tell a reader bug from bad data)."""
    try:
        with np.errstate(over="ignore", invalid="ignore"):
            return read(element)
    except ElementError:
        raise
    except Exception as exc:
        if os.environ.get("IFCCHECK_DEBUG"):
            raise
        text = " ".join(str(exc).split())[:120]
        raise ElementError(
            f"its data is not what IFC allows there ({type(exc).__name__}: {text}); if the "
            "file is valid IFC, this is an ifccheck bug"
        ) from None


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


# The IFC library's log is one per process: parses in threads take turns, so that each
# reads the messages of its own file.
_PARSE_LOCK = threading.Lock()


def _parse(p: Path, file_name: str) -> ifcopenshell.file:
    with _PARSE_LOCK:
        ifcopenshell.get_log()  # drain what earlier calls left in the library's log
        try:
            f = ifcopenshell.open(file_name)
        except Exception as exc:  # ifcopenshell raises several error types
            text = str(exc).strip()
            detail = text.splitlines()[0] if text else type(exc).__name__
            raise ModelError(f"{p}: cannot parse IFC file: {detail}") from None
        _check_parse_log(p)
    _check_complete(p, f)
    return f


# "[error] [SYN123] [2026-01-01 00:00:00] message" (ifcopenshell's text log format)
_LOG_ERROR = re.compile(r"^\[error\](?:\s*\[[^\]]*\])*\s*(?P<message>.*)$")


def parse_errors(log: str) -> list[str]:
    """The error messages in an ifcopenshell log, text or JSON format (warnings left out)."""
    out = []
    for line in log.splitlines():
        line = line.strip()
        if line.startswith("{"):
            try:
                entry = json.loads(line)
            except ValueError:  # not a JSON line after all
                entry = {}
            if isinstance(entry, dict) and entry.get("level") == "error":
                out.append(str(entry.get("message", "")).strip())
            continue
        m = _LOG_ERROR.match(line)
        if m:
            out.append(m.group("message").strip())
    return out


def _check_parse_log(p: Path) -> None:
    """A file the parser had to skip or drop parts of is refused (ModelError).

    The IFC library reads on past an entity it cannot parse (a file cut mid-entity, a
    name not in the schema, text where a number belongs in a list) and leaves a
    reference to a missing entity empty; checking what remains would pass a model with
    members lost, so the file is refused with the parser's first message."""
    errors = parse_errors(ifcopenshell.get_log())
    if not errors:
        return
    first = errors[0]
    kind = "incomplete" if "reference" in first.lower() else "damaged"
    more = f" (and {len(errors) - 1} more)" if len(errors) > 1 else ""
    raise ModelError(f"{p}: {kind} IFC file, the parser reports: {first}{more}")


def _check_complete(p: Path, f: ifcopenshell.file) -> None:
    """A file with no entities or no IfcProject is not a model (ModelError)."""
    try:
        projects = len(f.by_type("IfcProject"))
    except RuntimeError:  # a schema without IfcProject
        projects = 0
    if not projects:
        what = (
            "no entities (empty DATA section)"
            if len(f.by_type("IfcRoot")) == 0
            else ("no IfcProject")
        )
        raise ModelError(f"{p}: not a complete IFC model: {what}")


def _open_as(
    p: Path, m: re.Match, declared: str, target: str, warnings: list[str] | None
) -> ifcopenshell.file:
    """Read a copy of the file whose header names ``target`` (the input is not touched)."""
    data = p.read_bytes()
    patched = data[: m.start(1)] + target.encode("ascii") + data[m.end(1) :]
    with tempfile.TemporaryDirectory(prefix="ifccheck-") as tmp:
        copy = Path(tmp) / p.name
        copy.write_bytes(patched)
        with _PARSE_LOCK:
            ifcopenshell.get_log()  # drain what earlier calls left in the library's log
            try:
                f = ifcopenshell.open(str(copy))
            except Exception as exc:  # an entity IFC4 does not have
                text = str(exc).strip()
                detail = text.splitlines()[0] if text else type(exc).__name__
                raise ModelError(
                    f"{p}: schema {declared} is not known to the IFC library, and reading it "
                    f"as {target} failed: {detail}"
                ) from None
            _check_parse_log(p)
        _check_complete(p, f)
    if warnings is not None:
        warnings.append(
            f"schema {declared} is not known to the IFC library: read as {target}, whose "
            "entities it shares for beams, columns, profiles, materials and slabs"
        )
    return f


def length_unit_name(ifc: ifcopenshell.file) -> str:
    """Name of the file's length unit: 'metre', 'millimetre', 'foot', 'inch', ...
    ('metre', the SI default, for a file that assigns none)."""
    unit = uunit.get_project_unit(ifc, "LENGTHUNIT")
    if unit is None:
        return "metre"
    if unit.is_a("IfcSIUnit"):
        prefix = (unit.Prefix or "").lower()
        return f"{prefix}metre"
    name = _text(unit.Name).strip().lower()
    aliases = {"feet": "foot", "ft": "foot", "inches": "inch", "in": "inch", "yards": "yard"}
    return aliases.get(name, name or "unknown")


def unit_scale(ifc: ifcopenshell.file, unit_type: str) -> tuple[float | None, str]:
    """(scale to SI, "") of the project's unit of a type: (None, "") when the file assigns
    none, (None, why) when the one it assigns has no usable conversion."""
    try:
        unit = uunit.get_project_unit(ifc, unit_type)
    except Exception:  # a unit assignment the library cannot walk
        return None, f"the {unit_type} assignment cannot be read"
    if unit is None:
        return None, ""
    name = (_text(getattr(unit, "Name", None)) or unit.is_a()) if hasattr(unit, "is_a") else "?"
    if unit.is_a("IfcContextDependentUnit"):
        return None, f"{unit_type} {name!s} is a context-dependent unit with no conversion to SI"
    try:
        scale = float(uunit.calculate_unit_scale(ifc, unit_type))
    except Exception:  # a conversion factor that is not a number
        return None, f"the conversion factor of {unit_type} {name!s} is not a number"
    if not (math.isfinite(scale) and scale > 0.0):
        return None, f"{unit_type} {name!s} has a conversion factor of {scale:g} (not positive)"
    return scale, ""


def model_length_scale(
    ifc: ifcopenshell.file, path: Path, length_unit: str | None, warnings: list[str]
) -> tuple[float, str]:
    """(metres per file unit, unit name) of a model.

    A model must say its length unit (lengths are never guessed from magnitudes):
    one that assigns none, or one with no usable conversion, is a ModelError unless
    ``length_unit`` (``--length-unit``) is given, which is then used with a warning.
    ``length_unit`` is not used when the model assigns a usable unit of its own."""
    scale, problem = unit_scale(ifc, "LENGTHUNIT")
    if scale is not None:
        name = length_unit_name(ifc)
        if length_unit is not None and model_length_unit(length_unit) != name:
            warnings.append(
                f"--length-unit {length_unit} not used: the model assigns its own length unit "
                f"({name})"
            )
        return scale, name
    what = problem or "the model assigns no length unit (IfcUnitAssignment)"
    if length_unit is None:
        raise ModelError(
            f"{path}: {what}; lengths are never guessed: give --length-unit (e.g. mm or ft)"
        )
    name = model_length_unit(length_unit)
    warnings.append(f"{what}: lengths taken in {name} (--length-unit)")
    return MODEL_LENGTH_UNITS[name], name


def read_model(
    path: str | Path,
    default_grade: str | None = None,
    materials: Mapping[str, str] | None = None,
    length_unit: str | None = None,
) -> Model:
    """Read a model file. Raises ModelError for a file that is not a usable model.

    ``default_grade`` is the grade members are checked on when the model names
    none; None (the default) leaves such members not checked. ``materials`` maps
    material names to grades (the settings' ``[steel.materials]``). ``length_unit``
    is the unit a model that assigns none is read in (see :func:`model_length_scale`).
    An element that cannot be read is listed in ``Model.unreadable`` (beams, columns,
    members) or skipped with a warning (slabs, walls, openings); never the run.
    """
    warnings: list[str] = []
    ifc = open_ifc(path, warnings)
    scale, unit_name = model_length_scale(ifc, Path(path), length_unit, warnings)
    default = default_steel(default_grade) if default_grade else None
    reader = _Reader(ifc, Path(path).name, default, materials or {}, (scale, unit_name))
    model = reader.read()
    model.warnings[:0] = [("", w) for w in warnings + reader.unit_warnings]
    if not any(m.role is MemberRole.BEAM for m in [*model.members, *model.unreadable]):
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
        length: tuple[float, str],
    ) -> None:
        self.ifc = ifc
        self.name = name
        self.scale = length[0]
        self.unit_warnings: list[str] = []
        pressure, problem = unit_scale(ifc, "PRESSUREUNIT")
        if problem:  # yield stresses given as properties cannot be read
            self.unit_warnings.append(f"{problem}: yield stresses given as properties not read")
        # no pressure unit assigned: SI pascal; an unusable one: None
        self.pressure_scale = pressure if pressure is not None else (None if problem else 1.0)
        self.grades = GradeContext(default, dict(materials), self.pressure_scale)
        self.model = Model(
            source=name,
            schema=ifc.schema_identifier if hasattr(ifc, "schema_identifier") else ifc.schema,
            length_unit=length[1],
            length_scale=self.scale,
        )
        self.placements = geo.PlacementCache()
        self._materials: dict = {}
        self.keys: dict[int, str] = {}
        self.median: np.ndarray | None = None  # median member position (m), once read

    # --- entry ------------------------------------------------------------------
    def read(self) -> Model:
        self._read_storeys()
        self.model.material_names = sorted(
            {m.Name for m in self.ifc.by_type("IfcMaterial") if isinstance(m.Name, str) and m.Name}
        )
        self.keys = element_keys(self.ifc)
        self._note_duplicates()
        for element in self._elements(LINEAR_CLASSES):
            try:
                member = read_guarded(self._member, element)
            except ElementError as exc:
                self._unreadable(element, str(exc))
                continue
            if member is not None:
                self.model.members.append(member)
        self._far_members()
        for element in self._elements(SLAB_CLASSES):
            try:
                slab = read_guarded(self._slab, element)
            except ElementError as exc:
                self._skipped(element, "slab" if element.is_a("IfcSlab") else "plate", exc)
                continue
            if slab is not None:
                self.model.slabs.append(slab)
        for element in self._elements(WALL_CLASSES):
            try:
                wall = read_guarded(self._wall, element)
            except ElementError as exc:
                self._skipped(element, "wall", exc)
                continue
            if wall is not None:
                self.model.walls.append(wall)
        self._far_areas()
        return self.model

    def key(self, element: Entity) -> str:
        """The GUID an element is listed under (suffixed when the GUID is shared)."""
        return self.keys.get(element.id(), element.GlobalId)

    def _note_duplicates(self) -> None:
        if not any(":" in k for k in self.keys.values()):  # no GlobalId is shared
            return
        elements = self._elements(LINEAR_CLASSES + SLAB_CLASSES + WALL_CLASSES)
        counts = Counter(e.GlobalId for e in elements if isinstance(e.GlobalId, str))
        groups: dict[str, list[str]] = {}
        names: dict[str, str] = {}
        for element in elements:
            if counts[element.GlobalId] > 1:
                key = self.key(element)
                groups.setdefault(element.GlobalId, []).append(key)
                names[key] = _text(element.Name) or element.is_a()
        if not groups:
            return
        self.model.duplicate_guids = groups
        shown = [
            f"{g} ({', '.join(f'{names[k]} as {k}' for k in keys)})"
            for g, keys in list(groups.items())[:DUPLICATES_SHOWN]
        ]
        more = len(groups) - len(shown)
        self.model.warnings.append(
            (
                "",
                f"{len(groups)} GlobalId{'s are' if len(groups) != 1 else ' is'} shared by "
                f"several elements (IFC requires them unique): {'; '.join(shown)}"
                + (f"; and {more} more" if more > 0 else "")
                + "; results list each element under its GlobalId with ':2', ':3'... added "
                "after the first",
            )
        )

    def _unreadable(self, element: Entity, detail: str) -> None:
        """A beam, column or member that cannot be read: listed, out of the framing."""
        name = _text(element.Name)
        try:
            predefined = _text(uelement.get_predefined_type(element)).upper()
            role = _role(element, predefined)
            storey = self._storey(element)
        except Exception:  # relationships as unreadable as the element: class alone
            predefined, storey = "", ""
            role = _role_of_class(element)
        nan = (math.nan, math.nan, math.nan)
        reason = Reason.of(NotChecked.BAD_ELEMENT, detail=detail)
        self.model.unreadable.append(
            Member(
                guid=self.key(element),
                ifc_class=element.is_a(),
                predefined_type=predefined,
                name=name,
                storey=storey,
                role=role,
                start=nan,
                end=nan,
                web_up=(0.0, 0.0, 1.0),
                profile_name="",
                section=None,
                steel=None,
                material_name="",
                material=MaterialCategory.UNKNOWN,
                axis_source="",
                profile_source="",
                grade_source="",
                notes=[f"position unknown: {detail}"],
                unresolved=reason,
            )
        )
        self.model.warnings.append(
            (self.key(element), f"{element.is_a()} cannot be read and is left out of the "
                                f"framing: {detail}")
        )  # fmt: skip

    def _skipped(self, element: Entity, what: str, exc: Exception) -> None:
        label = f"{what} '{_text(element.Name)}'" if _text(element.Name) else what
        self.model.warnings.append((self.key(element), f"{label} ignored: {exc}"))

    def _far_members(self) -> None:
        """Members far from the rest (beyond FAR_LIMIT of the median member position) are
        taken out of the framing and listed as unreadable: their coordinates are absurd."""
        members = self.model.members
        if len(members) < 2:
            return
        starts = np.array([m.start for m in members], dtype=float)
        ends = np.array([m.end for m in members], dtype=float)
        self.median = np.median((starts + ends) / 2.0, axis=0)
        distance = np.maximum(_distance(starts, self.median), _distance(ends, self.median))
        keep: list[Member] = []
        for m, far in zip(members, distance.tolist(), strict=True):
            if far <= FAR_LIMIT:
                keep.append(m)
                continue
            detail = (
                f"it lies {far / 1000.0:,.0f} km from the median position of the model's "
                f"members (more than {FAR_LIMIT / 1000.0:.0f} km: absurd coordinates)"
            )
            m.notes.insert(0, f"position not used: {detail}")
            m.start = m.end = (math.nan, math.nan, math.nan)
            m.unresolved = Reason.of(NotChecked.BAD_ELEMENT, detail=detail)
            self.model.unreadable.append(m)
            self.model.warnings.append((m.guid, f"{m.ifc_class} left out of the framing: {detail}"))
        self.model.members = keep

    def _far_areas(self) -> None:
        """Slabs and walls far from the members are ignored with a warning."""
        median = self.median
        if median is None:
            return
        places: list[tuple[str, list[Slab] | list[Wall]]] = [
            ("slab", self.model.slabs),
            ("wall", self.model.walls),
        ]
        for kind, items in places:
            keep: list = []
            for item in items:
                x0, y0, x1, y1 = item.footprint.bounds
                corners = np.array([[x0, y0], [x1, y1], [x0, y1], [x1, y0]])
                far = float(np.max(_distance(corners, median[:2])))
                if far <= FAR_LIMIT:
                    keep.append(item)
                    continue
                label = f"{kind} '{item.name}'" if item.name else kind
                self.model.warnings.append(
                    (item.guid, f"{label} ignored: it lies {far / 1000.0:,.0f} km from the "
                                "median position of the model's members (absurd coordinates)")
                )  # fmt: skip
            items[:] = keep

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
            try:
                read_guarded(self._read_storey, st)
            except ElementError as exc:
                name = _text(st.Name)
                self.model.warnings.append((st.GlobalId, f"storey '{name}' ignored: {exc}"))
        self.model.storeys.sort(key=lambda s: s.elevation)

    def _read_storey(self, st: Entity) -> None:
        """One storey: its elevation from its placement, else its Elevation attribute."""
        name = _text(st.Name) or _text(st.GlobalId) or f"#{st.id()}"
        elevation = st.Elevation if isinstance(st.Elevation, int | float) else None
        try:
            z = self.placements.of(st)[2, 3] * self.scale
        except ElementError as exc:
            if elevation is None or not math.isfinite(elevation):
                raise
            self.model.warnings.append(
                (st.GlobalId, f"storey '{name}': {exc}; its Elevation attribute used")
            )
            z = float(elevation) * self.scale
        if st.ObjectPlacement is None and elevation is not None and math.isfinite(elevation):
            z = float(elevation) * self.scale
        self.model.storeys.append(Storey(st.GlobalId, name, float(z)))

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
        return _text(container.Name) or _text(container.GlobalId)

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
            raise ElementError("it has no readable geometry (no axis, extrusion or body)")
        start, end, web_up, axis_source = line
        if not (np.isfinite(start).all() and np.isfinite(end).all()):
            raise ElementError("its position is not a finite point (coordinates overflow)")
        if not np.linalg.norm(np.subtract(end, start)) > 0.0:
            raise ElementError("it has zero length (its axis and body start and end at one point)")
        if not np.isfinite(web_up).all():
            raise ElementError("its section has no depth direction")
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
            guid=self.key(element),
            ifc_class=element.is_a(),
            predefined_type=predefined,
            name=_text(element.Name),
            storey=self._storey(element),
            role=role,
            start=_point(start),
            end=_point(end),
            web_up=_point(web_up),
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
        if unresolved is not None and unresolved.code is NotChecked.BAD_ELEMENT:
            self.model.warnings.append((member.guid, f"{element.is_a()} {unresolved.text}"))
        shared = self.model.duplicate_guids.get(element.GlobalId)
        if shared:
            others = ", ".join(k for k in shared if k != member.guid)
            member.notes.append(
                f"GlobalId {element.GlobalId} is shared with {others}: listed as {member.guid}"
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
                return profiles[0], source, _text(select.Name)
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
        set_name = _text(getattr(set_profile, "ProfileName", None)).strip().upper()

        def score(item: tuple[np.ndarray, Entity]) -> tuple[bool, bool, float]:
            try:
                direction, length = geo.extrusion_direction(*item)
            except ElementError:  # an unreadable item is the member only if nothing else is
                return False, False, -1.0
            along = t is None or abs(float(np.dot(direction, t))) > 0.999
            area = item[1].SweptArea
            same = set_profile is not None and (
                area == set_profile
                or (bool(set_name) and _text(area.ProfileName).strip().upper() == set_name)
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
            if _bad(resolved):  # impossible dimensions: no name makes them a section
                return resolved
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
            if _bad(resolved):
                return resolved
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
            (_text(getattr(el_type, "Name", None)), "type name"),
            (_text(getattr(element, "ObjectType", None)), "name"),
            (getattr(element, "Tag", None), "name"),
            (_text(element.Name), "name"),
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
        direction = m[:3, :3] @ np.asarray(geo.extruded_direction(solid), dtype=float)
        p1 = p0 + direction * geo.extrusion_depth(solid)
        frame = m @ pm
        up = frame[:3, 1] if up2d is None else frame[:3, 0] * up2d[0] + frame[:3, 1] * up2d[1]
        up = up - np.dot(up, direction) * direction
        norm = float(np.linalg.norm(up))
        if not norm > 1e-9:
            raise ElementError(f"extrusion #{solid.id()} runs in its own profile plane")
        return p0, p1, up / norm

    def _cardinal_point(self, element: Entity) -> int:
        select = uelement.get_material(element, should_skip_usage=False, should_inherit=False)
        if select is not None and select.is_a("IfcMaterialProfileSetUsage"):
            cp = select.CardinalPoint
            if cp is None:
                return 5
            if isinstance(cp, bool) or not isinstance(cp, int) or not 1 <= cp <= 10:
                raise ElementError(
                    f"cardinal point {geo._shown(cp)} is not 1 to 10 (IfcCardinalPointReference)"
                )
            return cp
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
        label = f"slab '{_text(element.Name)}'" if _text(element.Name) else "slab"
        if found is None:
            if element.is_a("IfcSlab"):
                self.model.warnings.append(
                    (self.key(element), f"{label} has no readable footprint")
                )
            return None
        poly, bottom, top, notes = found
        thickness = top - bottom
        if element.is_a("IfcPlate") and (thickness > 0.5 or poly.area < 1.0):
            return None  # a plate that is not a deck (stiffener, gusset...)
        if not thickness > MIN_SLAB_THICKNESS:
            if element.is_a("IfcSlab"):
                self.model.warnings.append(
                    (self.key(element), f"{label} ignored: it has zero thickness "
                                        "(it neither carries load nor braces)")
                )  # fmt: skip
            return None
        for note in notes:
            if "crosses itself" in note:
                self.model.warnings.append((self.key(element), f"{label}: {note}"))
        openings: list[Polygon] = []
        for rel in getattr(element, "HasOpenings", None) or ():
            opening = rel.RelatedOpeningElement
            try:
                hole = self._footprint(opening)
            except ElementError as exc:
                self.model.warnings.append(
                    (self.key(element), f"opening {opening.GlobalId} of {label} ignored: {exc}")
                )
                continue
            if hole is None:
                notes.append(f"opening {opening.GlobalId} could not be read and is ignored")
                continue
            hpoly, hb, ht, hnotes = hole
            for note in hnotes:
                if "crosses itself" in note:
                    self.model.warnings.append(
                        (self.key(element), f"opening {opening.GlobalId} of {label}: {note}")
                    )
            if not hpoly.area > 0.0:
                self.model.warnings.append(
                    (self.key(element), f"opening {opening.GlobalId} of {label} ignored: "
                                        "it encloses no area")
                )  # fmt: skip
                continue
            if ht > bottom and hb < top:
                openings.append(hpoly)
        footprint = poly.difference(unary_union(openings)) if openings else poly
        if footprint.is_empty:
            self.model.warnings.append(
                (self.key(element), f"{label} ignored: its openings cover all of it")
            )
            return None
        return Slab(
            guid=self.key(element),
            name=_text(element.Name),
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
        parts: list[geo.Footprint] = []
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
            poly = unary_union([p.polygon for p in parts])
            bottom = min(p.bottom for p in parts)
            top = max(p.top for p in parts)
            s = self.scale
            notes = [p.repaired for p in parts if p.repaired]
            plan = _scale_poly(poly, s)
            if plan.is_empty:
                raise ElementError("its plan outline encloses no area (smaller than 1 nm)")
            return plan, bottom * s, top * s, notes
        verts_faces = self._tessellate_faces(element)
        if verts_faces is None:
            return None
        self.model.geometry_fallbacks += 1
        verts, faces = verts_faces
        tris = [Polygon(verts[f][:, :2]) for f in faces]
        tris = [t for t in tris if t.is_valid and t.area > 1e-9]
        if not tris:
            return None
        poly = _scale_poly(unary_union(tris), 1.0)
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
        geometry: Any = shape.geometry  # type: ignore[union-attr]  # a triangulation here
        verts = np.asarray(geometry.verts, dtype=float).reshape(-1, 3)
        faces = np.asarray(geometry.faces, dtype=int).reshape(-1, 3)
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
        if not poly.area > 0.0 or not top > bottom:
            raise ElementError("it has no plan area or no height")
        return Wall(
            guid=self.key(element),
            name=_text(element.Name),
            storey=self._storey(element),
            footprint=poly,
            base=bottom,
            top=top,
            material=category,
        )


def element_keys(ifc: ifcopenshell.file) -> dict[int, str]:
    """Entity id → the key an element is listed under, for the elements whose GlobalId
    another element the reader reads also has: the first (lowest id) keeps the GlobalId,
    the others get ':2', ':3'... (':' is not in the IFC GlobalId alphabet). The check
    copy's write-back finds elements by the same keys."""
    seen: dict[str, int] = {}
    keys: dict[int, str] = {}
    found: dict[int, Entity] = {}
    for cls in LINEAR_CLASSES + SLAB_CLASSES + WALL_CLASSES:
        try:
            found.update({e.id(): e for e in ifc.by_type(cls)})
        except RuntimeError:  # class not in this schema
            continue
    for i in sorted(found):
        guid = found[i].GlobalId
        if not isinstance(guid, str) or not guid:  # no GlobalId: the entity's own number
            keys[i] = f"#{i}"
            continue
        n = seen.get(guid, 0) + 1
        seen[guid] = n
        if n > 1:
            keys[i] = f"{guid}:{n}"
    return keys


def _point(v: np.ndarray) -> tuple[float, float, float]:
    return float(v[0]), float(v[1]), float(v[2])


def _distance(points: np.ndarray, centre: np.ndarray) -> np.ndarray:
    """Euclidean distances of points (rows) from a centre, without overflow for
    coordinates near the largest float (each row scaled by its largest component)."""
    with np.errstate(over="ignore"):  # a difference beyond the largest float: inf, far
        d = np.abs(points - centre)
        scale = d.max(axis=1)
        safe = np.where(np.isfinite(scale) & (scale > 0.0), scale, 1.0)
        return scale * np.sqrt(((d / safe[:, None]) ** 2).sum(axis=1))


def _role_of_class(element: Entity) -> MemberRole:
    if element.is_a("IfcColumn"):
        return MemberRole.COLUMN
    return MemberRole.BEAM if element.is_a("IfcBeam") else MemberRole.OTHER


def _bad(resolved: ResolvedProfile) -> bool:
    return resolved.reason is not None and resolved.reason.code is NotChecked.BAD_ELEMENT


def _scale_poly(poly, s: float):
    """A plan outline in metres, on a nanometre grid: coordinates so small they are
    subnormal make the polygon operations of the loads stage divide by zero."""
    import shapely

    snapped = shapely.transform(poly, lambda c: np.round(c * (s / PLAN_GRID)) * PLAN_GRID)
    if snapped.is_valid:
        return snapped
    parts = [g for g in shapely.get_parts(shapely.make_valid(snapped))
             if isinstance(g, Polygon | MultiPolygon)]  # fmt: skip
    return unary_union(parts) if parts else Polygon()


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
    object_type = _text(getattr(element, "ObjectType", None)).upper()
    kind = predefined if predefined not in ("", "USERDEFINED", "NOTDEFINED") else object_type
    if kind in BRACE_TYPES:
        return MemberRole.BRACE
    if kind in STRUT_TYPES:
        return MemberRole.STRUT
    if kind in BEAMLIKE_MEMBER_TYPES:
        return MemberRole.BEAM
    return MemberRole.OTHER
