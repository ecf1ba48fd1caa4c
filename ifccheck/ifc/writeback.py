"""Write the check results back into a copy of the model as property sets.

Each beam of the result found in the model gets one property set named
:data:`PSET_NAME` (the project's own prefix; ``Pset_`` is reserved by
buildingSMART) with typed IFC measure values. Lengths, moments, forces and
stresses are written in the model's own project units where its unit
assignment has one for the quantity; where it has none the value is written
in SI with the unit attached to the property (IfcPropertySingleValue.Unit),
so every number states its unit. Moments are IfcTorqueMeasure, the moment
measure that IFC2X3, IFC4 and IFC4X3 all define (none of them has a
separate bending-moment measure).

The input file is only read. For a plain STEP file (ISO 10303-21) the copy is
the input's bytes with the new entity instances appended to its DATA section,
so every original instance keeps its line and id and a large model is written
in seconds; otherwise (or when the model already carries our property sets
from an earlier run, which are then replaced) the copy is rewritten through
ifcopenshell. Either way it is written to a temporary file beside the target
and renamed over it.
"""

from __future__ import annotations

import datetime as dt
import functools
import math
import re
import uuid
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import ifcopenshell
import ifcopenshell.guid
import ifcopenshell.ifcopenshell_wrapper as wrapper
import ifcopenshell.util.unit

from ifccheck.atomic import atomic_path
from ifccheck.ifc.reader import LINEAR_CLASSES, element_keys, open_ifc
from ifccheck.results import BeamResult, CheckResult

PSET_NAME = "ifccheck_SteelBeamAdequacy"
# the set's name before results format 2; a checked copy made then has it replaced, not doubled
EARLIER_PSET_NAMES = frozenset({"ifccheck_BeamCheck"})
_OWN_NAMES = EARLIER_PSET_NAMES | {PSET_NAME}

# quantity kind → (IFC unit type, measure type, SI unit name for the explicit unit)
_KINDS = {
    "length": ("LENGTHUNIT", "IfcLengthMeasure", "METRE"),
    "force": ("FORCEUNIT", "IfcForceMeasure", "NEWTON"),
    "stress": ("PRESSUREUNIT", "IfcPressureMeasure", "PASCAL"),
    "moment": ("TORQUEUNIT", "IfcTorqueMeasure", None),
}

# stage → the prefix of its properties (the governing stage's figures are unprefixed)
_STAGE_PREFIX = {"in_service": "InService", "construction": "Construction"}

_GUID_NAMESPACE = uuid.UUID("6f1d3c52-2b0e-4d7a-9a51-3f0c8e7d2a10")


def _stable_guid(*parts: str) -> str:
    """An IFC GlobalId fixed by its parts, so a rerun on the same input writes the same file."""
    return ifcopenshell.guid.compress(uuid.uuid5(_GUID_NAMESPACE, "|".join(parts)).hex)


# --- values handed to a sink -------------------------------------------------------
@dataclass(frozen=True)
class Enum:
    value: str


@dataclass(frozen=True)
class Typed:
    """A value of a defined type, e.g. IfcLabel('pass')."""

    type: str
    value: Any


@dataclass(frozen=True)
class Ref:
    id: int


DERIVED = object()  # an attribute the schema derives ('*' in a STEP file)


class _Sink:
    """Creates entity instances: through ifcopenshell or as STEP text."""

    def __init__(self, f: ifcopenshell.file) -> None:
        self.f = f
        self.schema = wrapper.schema_by_name(f.schema_identifier)
        self._attrs: dict[str, tuple[list[str], tuple[bool, ...]]] = {}

    def attributes(self, entity: str) -> tuple[list[str], tuple[bool, ...]]:
        """The entity's attribute names in schema order, and which are derived."""
        if entity not in self._attrs:
            decl: Any = self.schema.declaration_by_name(entity)  # an entity declaration
            names = [a.name() for a in decl.all_attributes()]
            self._attrs[entity] = (names, tuple(decl.derived()))
        return self._attrs[entity]

    def ordered(self, entity: str, values: dict[str, Any]) -> list[Any]:
        """Attribute values in schema order; names not in this schema's version are remapped."""
        names, derived = self.attributes(entity)
        if "Description" in values and "Description" not in names and "Specification" in names:
            values = dict(values)
            values["Specification"] = values.pop("Description")  # IFC4X3 IfcProperty
        if not values.keys() <= set(names):
            unknown = sorted(set(values) - set(names))
            raise ValueError(f"{entity} has no attribute {unknown} in {self.f.schema}")
        return [DERIVED if d else values.get(n) for n, d in zip(names, derived, strict=True)]

    def prop(self, name: str, description: str | None, value: Typed, unit: Any) -> Any:
        """An IfcPropertySingleValue (the bulk of what is written)."""
        return self.add(
            "IfcPropertySingleValue",
            Name=name,
            Description=description,
            NominalValue=value,
            Unit=unit,
        )

    def add(self, entity: str, **values: Any) -> Any:
        raise NotImplementedError

    def ref(self, instance: ifcopenshell.entity_instance) -> Any:
        raise NotImplementedError


class _EntitySink(_Sink):
    """Creates the instances in the opened file (the general, slower path)."""

    def _convert(self, v: Any) -> Any:
        if v is DERIVED:
            return None
        if isinstance(v, Enum):
            return v.value
        if isinstance(v, Typed):
            return self.f.create_entity(v.type, v.value)
        if isinstance(v, list | tuple):
            return [self._convert(x) for x in v]
        return v

    def add(self, entity: str, **values: Any) -> ifcopenshell.entity_instance:
        args = [self._convert(v) for v in self.ordered(entity, values)]
        return self.f.create_entity(entity, *args)

    def ref(self, instance: ifcopenshell.entity_instance) -> ifcopenshell.entity_instance:
        return instance


_PLAIN = re.compile(r"[ -~]*")  # printable ASCII


@functools.lru_cache(maxsize=4096)  # names and labels repeat on every beam
def step_string(s: str) -> str:
    """A STEP string literal (ISO 10303-21 §6.4.3): '' for ', \\\\ for \\, \\X4\\ for others."""
    if _PLAIN.fullmatch(s):
        body = s.replace("\\", "\\\\").replace("'", "''")
    else:
        out = []
        for ch in s:
            if " " <= ch <= "~":
                out.append({"\\": "\\\\", "'": "''"}.get(ch, ch))
            else:
                out.append(f"\\X4\\{ord(ch):08X}\\X0\\")
        body = "".join(out)
    return f"'{body}'"


def step_real(v: float) -> str:
    """A STEP real: always with a decimal point ('1.E-05', '100.0')."""
    if not math.isfinite(v):
        raise ValueError(f"{v} cannot be written to IFC")
    r = repr(float(v))
    mantissa, e, exponent = r.partition("e")
    if "." not in mantissa:
        mantissa += "."
    return mantissa + ("E" + exponent if e else "")


class _TextSink(_Sink):
    """Writes the instances as STEP lines, numbered after the file's highest id."""

    def __init__(self, f: ifcopenshell.file) -> None:
        super().__init__(f)
        self.next_id = f.get_max_id() + 1
        self.lines: list[str] = []
        self._real_types: dict[str, bool] = {}

    def _value(self, v: Any) -> str:
        if v is None:
            return "$"
        if v is DERIVED:
            return "*"
        if isinstance(v, Ref):
            return f"#{v.id}"
        if isinstance(v, bool):
            return ".T." if v else ".F."
        if isinstance(v, Enum):
            return f".{v.value}."
        if isinstance(v, str):
            return step_string(v)
        if isinstance(v, int):
            return str(v)
        if isinstance(v, float):
            return step_real(v)
        if isinstance(v, Typed):
            inner = step_real(float(v.value)) if self._is_real(v.type) else self._value(v.value)
            return f"{v.type.upper()}({inner})"
        if isinstance(v, list | tuple):
            return "(" + ",".join(self._value(x) for x in v) + ")"
        raise TypeError(f"cannot write {v!r}")

    def _is_real(self, type_name: str) -> bool:
        if type_name not in self._real_types:
            decl: Any = self.schema.declaration_by_name(type_name)  # a type declaration
            self._real_types[type_name] = "<real>" in str(decl.declared_type())
        return self._real_types[type_name]

    def add(self, entity: str, **values: Any) -> Ref:
        args = ",".join([self._value(v) for v in self.ordered(entity, values)])
        ref = Ref(self.next_id)
        self.next_id += 1
        self.lines.append(f"#{ref.id}={entity.upper()}({args});\n")
        return ref

    def prop(self, name: str, description: str | None, value: Typed, unit: Any) -> Ref:
        # all three schemas: (Name, Description | Specification, NominalValue, Unit)
        ref = Ref(self.next_id)
        self.next_id += 1
        desc = "$" if description is None else step_string(description)
        u = "$" if unit is None else f"#{unit.id}"
        v = value.value
        inner = step_real(float(v)) if self._is_real(value.type) else step_string(v)
        self.lines.append(
            f"#{ref.id}=IFCPROPERTYSINGLEVALUE({step_string(name)},{desc},"
            f"{value.type.upper()}({inner}),{u});\n"
        )
        return ref

    def ref(self, instance: ifcopenshell.entity_instance) -> Ref:
        return Ref(instance.id())


# --- units ---------------------------------------------------------------------------
class _Units:
    """Per quantity kind: the factor from SI to file units, and an explicit unit if needed."""

    def __init__(self, f: ifcopenshell.file, sink: _Sink) -> None:
        self.sink = sink
        self.scale: dict[str, float] = {}
        self.unit_name: dict[str, str] = {}
        self._has_project_unit: dict[str, bool] = {}
        self._explicit: dict[str, Any] = {}
        for kind, (unit_type, _, si_name) in _KINDS.items():
            project_unit = ifcopenshell.util.unit.get_project_unit(f, unit_type)
            scale = _usable_scale(project_unit)
            # a project unit with no usable conversion (a zero factor): explicit SI units
            self._has_project_unit[kind] = scale is not None
            if scale is not None and project_unit is not None:
                self.scale[kind] = 1.0 / scale
                self.unit_name[kind] = _unit_words(project_unit)
            else:
                self.scale[kind] = 1.0
                self.unit_name[kind] = (si_name or "newton metre").lower()

    def explicit(self, kind: str) -> Any:
        """The SI unit to attach to a property of ``kind``, or None if the project has one."""
        if self._has_project_unit[kind]:
            return None
        if kind not in self._explicit:
            add = self.sink.add
            if kind == "moment":
                newton = add("IfcSIUnit", UnitType=Enum("FORCEUNIT"), Name=Enum("NEWTON"))
                metre = add("IfcSIUnit", UnitType=Enum("LENGTHUNIT"), Name=Enum("METRE"))
                self._explicit[kind] = add(
                    "IfcDerivedUnit",
                    Elements=[
                        add("IfcDerivedUnitElement", Unit=newton, Exponent=1),
                        add("IfcDerivedUnitElement", Unit=metre, Exponent=1),
                    ],
                    UnitType=Enum("TORQUEUNIT"),
                )
            else:
                unit_type, _, si_name = _KINDS[kind]
                assert si_name is not None  # only the moment has no SI unit of its own
                self._explicit[kind] = add(
                    "IfcSIUnit", UnitType=Enum(unit_type), Name=Enum(si_name)
                )
        return self._explicit[kind]


def _usable_scale(unit: ifcopenshell.entity_instance | None) -> float | None:
    """SI per unit of a project unit, or None for none or one with no usable conversion."""
    if unit is None:
        return None
    try:
        scale = float(ifcopenshell.util.unit.get_unit_scale(unit))
    except Exception:  # a conversion factor that is not a number
        return None
    return scale if math.isfinite(scale) and scale > 0.0 else None


def _unit_words(unit: ifcopenshell.entity_instance) -> str:
    try:
        return ifcopenshell.util.unit.get_full_unit_name(unit).lower()
    except Exception:  # an unusual unit definition: its name is enough for a description
        return str(getattr(unit, "Name", "") or unit.is_a()).lower()


def _finite(v: float | None) -> bool:
    return v is not None and math.isfinite(v)


# --- the property sets ---------------------------------------------------------------
class _PsetWriter:
    def __init__(self, f: ifcopenshell.file, result: CheckResult, sink: _Sink) -> None:
        self.f = f
        self.result = result
        self.sink = sink
        self.units = _Units(f, sink)
        self.owner = _owner_history(f, result, sink)
        self.date_type = "IfcLabel" if f.schema == "IFC2X3" else "IfcDateTime"

    def _prop(self, name: str, measure: str, value: Any, unit=None, description=None):
        return self.sink.prop(name, description, Typed(measure, value), unit)

    def _quantity(self, name: str, kind: str, si: float | None, description=None):
        if si is None or not math.isfinite(si):
            return None
        value = si * self.units.scale[kind]
        return self._prop(name, _KINDS[kind][1], value, self.units.explicit(kind), description)

    def properties(self, b: BeamResult) -> list[Any]:
        r = self.result
        label, text, ratio = "IfcLabel", "IfcText", "IfcRatioMeasure"
        props: list[Any] = [self._prop("Outcome", label, b.outcome)]
        if b.reason is not None:
            props.append(self._prop("Reason", text, b.reason.text))
            props.append(self._prop("ReasonCode", label, b.reason.code.value))
        for name, v in (
            ("Utilisation", b.utilisation),
            ("StrengthUtilisation", b.strength_utilisation),
            ("FlexureUtilisation", b.flexure_utilisation),
            ("ShearUtilisation", b.shear_utilisation),
            ("DeflectionUtilisation", b.deflection_utilisation),
        ):
            if v is not None and math.isfinite(v):
                props.append(self._prop(name, ratio, float(v)))
        if b.controlling_limit:
            props.append(self._prop("ControllingLimit", label, b.controlling_limit))
        if b.fails_on:
            props.append(self._prop("FailsOn", label, " ".join(b.fails_on)))
        props += self.stage_properties(b)
        seg = b.governing
        if seg is not None:
            props.append(self._prop("LimitState", label, seg.limit_state))
            if seg.load_combination:
                props.append(self._prop("LoadCombination", label, seg.load_combination))
            props.append(self._prop("CompressionFlange", label, seg.flange))
            props.append(
                self._quantity(
                    "UnbracedLength", "length", seg.lb,
                    "Lb of the governing segment; 0 where a slab braces the flange continuously",
                )
            )  # fmt: skip
            if _finite(seg.cb):
                props.append(self._prop("Cb", "IfcReal", float(seg.cb)))
            props.append(self._quantity("SegmentStart", "length", seg.start))
            props.append(self._quantity("SegmentEnd", "length", seg.end))
            props.append(self._quantity("MomentDemand", "moment", seg.moment_demand))
            props.append(self._quantity("MomentCapacity", "moment", seg.moment_capacity))
        props.append(self._quantity("ShearDemand", "force", b.shear_demand))
        props.append(self._quantity("ShearCapacity", "force", b.shear_capacity))
        if b.span:
            props.append(self._quantity("Span", "length", b.span))
        scale = self.units.scale["length"]
        stations = sorted(p.station for p in b.brace_points if p.counts)
        if b.outcome != "not_checked" or stations:
            props.append(
                self._prop(
                    "BraceStations", text, " ".join(f"{s * scale:.6g}" for s in stations),
                    description=f"stations of the brace points that count, in "
                    f"{self.units.unit_name['length']} from the beam's start",
                )
            )  # fmt: skip
        if b.grade:
            props.append(self._prop("Grade", label, b.grade))
        props.append(self._quantity("YieldStress", "stress", b.fy or None))
        if b.notes:
            props.append(self._prop("Notes", text, "; ".join(b.notes)))
        props.append(self._prop("Standard", label, r.standard))
        props.append(self._prop("Method", label, r.method))
        props.append(self._prop("ToolVersion", label, f"{r.tool} {r.version}"))
        props.append(self._prop("CheckedAt", self.date_type, r.checked_at))
        return [p for p in props if p is not None]

    def stage_properties(self, b: BeamResult) -> list[Any]:
        """The governing stage, and each stage's outcome and utilisation (with, during
        construction, the governing Lb and combination); only for the stages the beam
        was checked in."""
        label, ratio = "IfcLabel", "IfcRatioMeasure"
        props: list[Any] = []
        if not b.stages:
            return props
        if b.outcome != "not_checked":
            props.append(self._prop("GoverningStage", label, b.stage))
        for st in b.stages:
            prefix = _STAGE_PREFIX.get(st.stage)
            if prefix is None:
                continue
            props.append(self._prop(f"{prefix}Outcome", label, st.outcome))
            if st.utilisation is not None and math.isfinite(st.utilisation):
                props.append(self._prop(f"{prefix}Utilisation", ratio, float(st.utilisation)))
            i = st.governing_segment
            if st.stage == "construction" and i is not None and 0 <= i < len(b.segments):
                seg = b.segments[i]
                props.append(
                    self._quantity(
                        "ConstructionUnbracedLength", "length", seg.lb,
                        "Lb of the governing segment during construction; 0 where the "
                        "attached deck braces the flange continuously",
                    )
                )  # fmt: skip
                if seg.load_combination:
                    props.append(
                        self._prop("ConstructionLoadCombination", label, seg.load_combination)
                    )
        return props

    def write(self, element: ifcopenshell.entity_instance, b: BeamResult) -> None:
        props = self.properties(b)
        existing = _own_pset(element)
        if existing is not None:  # only on the ifcopenshell path
            pset, rel = existing
            if len(rel.RelatedObjects) == 1:
                old = list(pset.HasProperties or [])
                pset.Name = PSET_NAME
                pset.HasProperties = props
                for p in old:
                    self.f.remove(p)
                return
            rel.RelatedObjects = [o for o in rel.RelatedObjects if o != element]
        pset = self.sink.add(
            "IfcPropertySet",
            GlobalId=_stable_guid("pset", b.guid, self.result.checked_at),
            OwnerHistory=self.owner,
            Name=PSET_NAME,
            Description="Steel beam adequacy to the design standard, written by ifccheck",
            HasProperties=props,
        )
        self.sink.add(
            "IfcRelDefinesByProperties",
            GlobalId=_stable_guid("rel", b.guid, self.result.checked_at),
            OwnerHistory=self.owner,
            RelatedObjects=[self.sink.ref(element)],
            RelatingPropertyDefinition=pset,
        )


def _own_pset(element: ifcopenshell.entity_instance):
    """An earlier property set of ours on ``element`` (from checking a checked copy)."""
    for rel in getattr(element, "IsDefinedBy", None) or ():
        if not rel.is_a("IfcRelDefinesByProperties"):
            continue
        definition = rel.RelatingPropertyDefinition
        if definition.is_a("IfcPropertySet") and definition.Name in _OWN_NAMES:
            return definition, rel
    return None


def _timestamp(iso: str) -> int:
    try:
        stamp = dt.datetime.fromisoformat(iso)
    except ValueError:
        return int(dt.datetime.now(dt.UTC).timestamp())
    if stamp.tzinfo is None:
        stamp = stamp.replace(tzinfo=dt.UTC)
    return int(stamp.timestamp())


def _owner_history(f: ifcopenshell.file, result: CheckResult, sink: _Sink) -> Any:
    """An owner history naming ifccheck as the application that added the property sets.

    Mandatory on rooted entities in IFC2X3, optional later; written in all three
    schemas for traceability. The owning user is the model's own where it has one.
    """
    users = f.by_type("IfcPersonAndOrganization")
    org = sink.add("IfcOrganization", Name=result.tool)
    if users:
        user = sink.ref(users[0])
    else:
        person = sink.add("IfcPerson", FamilyName=result.tool)
        user = sink.add("IfcPersonAndOrganization", ThePerson=person, TheOrganization=org)
    # IfcApplication identifiers are unique in a file (UNIQUE rule UR1): reuse ours if there
    identifier = f"{result.tool}/{result.version}"
    existing = [a for a in f.by_type("IfcApplication") if a.ApplicationIdentifier == identifier]
    if existing:
        app = sink.ref(existing[0])
    else:
        app = sink.add(
            "IfcApplication",
            ApplicationDeveloper=org,
            Version=result.version,
            ApplicationFullName=f"{result.tool} beam check",
            ApplicationIdentifier=identifier,
        )
    stamp = _timestamp(result.checked_at)
    # IFC4 IfcOwnerHistory rule CorrectChangeAction: ADDED needs a LastModifiedDate
    return sink.add(
        "IfcOwnerHistory",
        OwningUser=user,
        OwningApplication=app,
        ChangeAction=Enum("ADDED"),
        LastModifiedDate=stamp,
        CreationDate=stamp,
    )


def _add_psets(f: ifcopenshell.file, result: CheckResult, sink: _Sink) -> list[str]:
    writer = _PsetWriter(f, result, sink)
    missing: list[str] = []
    elements = _elements_by_key(f)
    for b in result.beams:
        element = elements.get(b.guid)
        if element is None:
            missing.append(b.guid)
            continue
        writer.write(element, b)
    return missing


def _elements_by_key(f: ifcopenshell.file) -> dict[str, ifcopenshell.entity_instance]:
    """Beams, columns and members by the key the reader lists them under (their GlobalId,
    suffixed ':2', ':3'... where several share one)."""
    keys = element_keys(f)
    out: dict[str, ifcopenshell.entity_instance] = {}
    for cls in LINEAR_CLASSES:
        try:
            found = f.by_type(cls)
        except RuntimeError:  # class not in this schema
            continue
        for e in found:
            out.setdefault(keys.get(e.id(), e.GlobalId), e)
    return out


def add_check_psets(f: ifcopenshell.file, result: CheckResult) -> list[str]:
    """Add one property set per beam of ``result`` to the opened file ``f``.

    Returns the GUIDs of result beams not found in the file.
    """
    return _add_psets(f, result, _EntitySink(f))


_END = b"END-ISO-10303-21;"
_DATA = re.compile(rb"(?m)^[ \t]*DATA[ \t]*[;(]")


def _data_end(raw: bytes) -> int | None:
    """Offset of the ENDSEC closing the (single) DATA section, or None if unusual."""
    starts = [m.end() for m in _DATA.finditer(raw)]
    if len(starts) != 1:  # ISO 10303-21 edition 3 allows several; rewrite those instead
        return None
    end = raw.rfind(_END)
    close = raw.rfind(b"ENDSEC;", 0, end) if end >= 0 else -1
    return close if close > starts[0] else None


def _has_own_psets(f: ifcopenshell.file) -> bool:
    return any(p.Name in _OWN_NAMES for p in f.by_type("IfcPropertySet"))


def _copy_with_lines(raw: bytes, at: int, lines: Sequence[str], path: Path) -> None:
    with atomic_path(path) as tmp, open(tmp, "wb") as fh:
        fh.write(raw[:at])
        if at > 0 and raw[at - 1 : at] not in (b"\n", b"\r"):
            fh.write(b"\n")
        fh.write("".join(lines).encode("ascii"))
        fh.write(raw[at:])


def write_checked_ifc(source_ifc: Path, result: CheckResult, path: Path) -> Path:
    """Write a copy of ``source_ifc`` with the check property sets to ``path``.

    The source is opened for reading only and never written; ``path`` must differ from it.
    """
    source_ifc, path = Path(source_ifc), Path(path)
    if path.resolve() == source_ifc.resolve():
        raise ValueError("the checked copy must not overwrite the input model")
    raw = source_ifc.read_bytes()
    f = open_ifc(source_ifc)  # as the reader opens it (IFC4X1/IFC4X2 read as IFC4)
    at = _data_end(raw) if ifcopenshell.guess_format(source_ifc) == ".ifc" else None
    if at is not None and not _has_own_psets(f):
        sink = _TextSink(f)
        _add_psets(f, result, sink)
        _copy_with_lines(raw, at, sink.lines, path)
        return path
    add_check_psets(f, result)
    f.header.file_name.name = path.name
    with atomic_path(path) as tmp:
        f.write(str(tmp), format=".ifc")
    return path
