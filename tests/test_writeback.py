"""Results written back into a copy of the model as property sets."""

from __future__ import annotations

import hashlib
from collections import Counter
from dataclasses import replace
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.element
import ifcopenshell.util.unit
import ifcopenshell.validate
import pytest
import result_fixtures as rf

from ifccheck.ifc.writeback import (
    PSET_NAME,
    add_check_psets,
    step_real,
    step_string,
    write_checked_ifc,
)
from ifccheck.reasons import NotChecked, Reason
from ifccheck.results import CheckResult

SAMPLES = Path(__file__).resolve().parent.parent / "sample_models"
FT = 0.3048  # m, NIST SP 811


def _sha(path: Path) -> str:
    return hashlib.sha256(path.read_bytes()).hexdigest()


def _validation_statements(f: ifcopenshell.file) -> list:
    logger = ifcopenshell.validate.json_logger()
    ifcopenshell.validate.validate(f, logger)
    return logger.statements


def _counts(f: ifcopenshell.file) -> Counter:
    return Counter(e.is_a() for e in f)


def _props(f: ifcopenshell.file, guid: str) -> dict:
    """Our property set's properties on the element: name → IfcPropertySingleValue."""
    element = f.by_guid(guid)
    sets = [
        rel.RelatingPropertyDefinition
        for rel in element.IsDefinedBy
        if rel.is_a("IfcRelDefinesByProperties")
        and rel.RelatingPropertyDefinition.Name == PSET_NAME
    ]
    assert len(sets) == 1
    return {p.Name: p for p in sets[0].HasProperties}


def _check_copy(source: Path, out: Path, result: CheckResult) -> ifcopenshell.file:
    before = _sha(source)
    write_checked_ifc(source, result, out)
    assert _sha(source) == before  # the input model is never modified
    original = ifcopenshell.open(str(source))
    copy = ifcopenshell.open(str(out))
    assert copy.schema == original.schema
    assert _validation_statements(copy) == []
    orig_counts, copy_counts = _counts(original), _counts(copy)
    for entity, n in orig_counts.items():
        assert copy_counts[entity] >= n, entity
    orig_guids = {e.GlobalId for e in original.by_type("IfcRoot")}
    assert orig_guids <= {e.GlobalId for e in copy.by_type("IfcRoot")}
    return copy


@pytest.mark.parametrize(
    ("schema", "unit"), [("IFC2X3", "foot"), ("IFC4", "millimetre"), ("IFC4X3", "metre")]
)
def test_writeback_valid_complete_and_in_file_units(tmp_path, schema, unit):
    source = rf.write_model(tmp_path / "model.ifc", schema, unit)
    result = rf.check_result()
    copy = _check_copy(source, tmp_path / "model.checked.ifc", result)
    scale = ifcopenshell.util.unit.calculate_unit_scale(copy)  # metres per file unit
    g = rf.guids()
    b2 = _props(copy, g["b2"])
    assert b2["Outcome"].NominalValue.wrappedValue == "fail"
    assert b2["Outcome"].NominalValue.is_a("IfcLabel")
    assert b2["LimitState"].NominalValue.wrappedValue == "elastic_ltb"
    assert b2["Utilisation"].NominalValue.is_a("IfcRatioMeasure")
    assert b2["Utilisation"].NominalValue.wrappedValue == pytest.approx(result.beams[1].utilisation)
    assert b2["Cb"].NominalValue.is_a("IfcReal")
    lb = b2["UnbracedLength"].NominalValue
    assert lb.is_a("IfcLengthMeasure")
    assert lb.wrappedValue * scale == pytest.approx(15 * FT)  # 15 ft in the file's own unit
    assert b2["UnbracedLength"].Unit is None  # the project assigns a length unit
    stations = [float(s) * scale for s in b2["BraceStations"].NominalValue.wrappedValue.split()]
    assert stations == pytest.approx([0.0, 7.5 * FT, 22.5 * FT, 30 * FT])
    # ModelAuthor assigns no torque unit: SI, with the unit stated on the property
    demand = b2["MomentDemand"]
    assert demand.NominalValue.is_a("IfcTorqueMeasure")
    assert demand.NominalValue.wrappedValue == pytest.approx(
        result.beams[1].governing.moment_demand
    )
    assert demand.Unit.is_a("IfcDerivedUnit") and demand.Unit.UnitType == "TORQUEUNIT"
    date = b2["CheckedAt"].NominalValue
    assert date.is_a("IfcLabel" if schema == "IFC2X3" else "IfcDateTime")
    assert date.wrappedValue == rf.CHECKED_AT
    for key in ("Standard", "Method", "ToolVersion"):
        assert b2[key].NominalValue.is_a("IfcLabel")
    b3 = _props(copy, g["b3"])
    assert b3["Outcome"].NominalValue.wrappedValue == "not_checked"
    assert "shape table" in b3["Reason"].NominalValue.wrappedValue
    assert "Utilisation" not in b3
    names = {p.Name for p in copy.by_type("IfcPropertySet")}
    assert not any(n.startswith("Pset_") for n in names - {"Pset_MaterialSteel"})
    # a beam of the model that is not in the result gets nothing
    assert not any(
        rel.RelatingPropertyDefinition.Name == PSET_NAME
        for rel in copy.by_guid(g["j1"]).IsDefinedBy
    )


def test_values_use_a_torque_unit_the_model_assigns(tmp_path):
    a = rf.author("IFC4", "foot")
    f = a.f
    kilonewton = f.createIfcSIUnit(None, "FORCEUNIT", "KILO", "NEWTON")
    metre = f.createIfcSIUnit(None, "LENGTHUNIT", None, "METRE")
    knm = f.createIfcDerivedUnit(
        [f.createIfcDerivedUnitElement(kilonewton, 1), f.createIfcDerivedUnitElement(metre, 1)],
        "TORQUEUNIT",
        None,
    )
    assignment = f.by_type("IfcUnitAssignment")[0]
    assignment.Units = [*assignment.Units, knm, kilonewton]
    source = a.write(tmp_path / "knm.ifc")
    result = rf.check_result()
    copy = _check_copy(source, tmp_path / "knm.checked.ifc", result)
    props = _props(copy, rf.guids()["b2"])
    expected_knm = result.beams[1].governing.moment_demand / 1000  # N·m → kN·m
    assert props["MomentDemand"].NominalValue.wrappedValue == pytest.approx(expected_knm)
    assert props["MomentDemand"].Unit is None
    assert props["ShearDemand"].NominalValue.wrappedValue == pytest.approx(
        result.beams[1].shear_demand / 1000
    )


def test_writing_into_a_checked_copy_replaces_the_old_set(tmp_path):
    source = rf.write_model(tmp_path / "m.ifc")
    first = write_checked_ifc(source, rf.check_result(), tmp_path / "m.checked.ifc")
    again = write_checked_ifc(first, rf.check_result(), tmp_path / "m.checked2.ifc")
    f = ifcopenshell.open(str(again))
    assert _validation_statements(f) == []
    props = _props(f, rf.guids()["b2"])  # asserts exactly one set of ours
    assert props["Outcome"].NominalValue.wrappedValue == "fail"


def test_a_set_of_the_earlier_name_is_replaced_not_doubled(tmp_path):
    source = rf.write_model(tmp_path / "m.ifc")
    first = ifcopenshell.open(str(write_checked_ifc(source, rf.check_result(), tmp_path / "a.ifc")))
    for pset in first.by_type("IfcPropertySet"):
        if pset.Name == PSET_NAME:
            pset.Name = "ifccheck_BeamCheck"  # as results format 1 named it
    first.write(str(tmp_path / "old.ifc"))
    f = ifcopenshell.open(str(write_checked_ifc(tmp_path / "old.ifc", rf.check_result(),
                                                tmp_path / "b.ifc")))  # fmt: skip
    names = [p.Name for p in f.by_type("IfcPropertySet")]
    assert "ifccheck_BeamCheck" not in names and names.count(PSET_NAME) == 4
    assert _props(f, rf.guids()["b2"])["Outcome"].NominalValue.wrappedValue == "fail"


def test_property_names_follow_the_json_names(tmp_path):
    from ifccheck.report.json_out import beam_dict, segment_dict

    source = rf.write_model(tmp_path / "m.ifc")
    result = rf.check_result()
    copy = ifcopenshell.open(str(write_checked_ifc(source, result, tmp_path / "c.ifc")))
    b2 = result.beams[1]
    props = _props(copy, b2.guid)
    doc = {**segment_dict(b2.governing), **beam_dict(b2)}
    for key in ("outcome", "utilisation", "controlling_limit", "load_combination",
                "strength_utilisation", "flexure_utilisation", "shear_utilisation",
                "deflection_utilisation", "reason_code", "limit_state"):  # fmt: skip
        ifc_name = "".join(w.capitalize() for w in key.split("_"))
        if doc[key] in (None, ""):
            continue
        value = props[ifc_name].NominalValue.wrappedValue
        assert value == (pytest.approx(doc[key]) if isinstance(doc[key], float) else doc[key])
    assert PSET_NAME == "ifccheck_SteelBeamAdequacy" and not PSET_NAME.startswith("Pset_")


def test_refuses_to_overwrite_the_input(tmp_path):
    source = rf.write_model(tmp_path / "m.ifc")
    with pytest.raises(ValueError):
        write_checked_ifc(source, rf.check_result(), source)


@pytest.mark.parametrize("sample", ["brambleford.ifc", "quillfeather-rev-a.ifc"])
def test_demo_models(tmp_path, sample):
    source = SAMPLES / sample
    f = ifcopenshell.open(str(source))
    beams = f.by_type("IfcBeam")[:4]
    result = rf.check_result()
    result.beams = [replace(b, guid=e.GlobalId) for b, e in zip(result.beams, beams, strict=False)]
    copy = _check_copy(source, tmp_path / "demo.checked.ifc", result)
    for b in result.beams:
        psets = ifcopenshell.util.element.get_psets(copy.by_guid(b.guid))
        assert psets[PSET_NAME]["Outcome"] == b.outcome


def test_fast_copy_keeps_the_original_lines_and_matches_the_general_path(tmp_path):
    source = rf.write_model(tmp_path / "m.ifc", "IFC4", "foot")
    result = rf.check_result()
    result.beams[2].reason = Reason.of(  # quote, backslash, non-ASCII
        NotChecked.PROFILE_NOT_IN_TABLE, name="HSS–ODD \\ ☃", table="see note's table"
    )
    fast = write_checked_ifc(source, result, tmp_path / "fast.ifc")
    raw, copy = source.read_bytes(), fast.read_bytes()
    end = raw.rfind(b"ENDSEC;")
    assert copy.startswith(raw[:end])  # every original instance keeps its line and id
    assert copy.endswith(raw[end:])
    general = ifcopenshell.open(str(source))
    add_check_psets(general, result)
    general.write(str(tmp_path / "general.ifc"))
    a = ifcopenshell.open(str(fast))
    b = ifcopenshell.open(str(tmp_path / "general.ifc"))
    assert _validation_statements(a) == []
    for beam in result.beams:
        pa = ifcopenshell.util.element.get_psets(a.by_guid(beam.guid))[PSET_NAME]
        pb = ifcopenshell.util.element.get_psets(b.by_guid(beam.guid))[PSET_NAME]
        pa.pop("id"), pb.pop("id")
        assert pa == pb
    reason = ifcopenshell.util.element.get_psets(a.by_guid(result.beams[2].guid))[PSET_NAME]
    assert reason["Reason"] == result.beams[2].reason.text
    assert reason["ReasonCode"] == "profile_not_in_table"


@pytest.mark.parametrize(
    ("value", "text"), [(100.0, "100.0"), (1e-05, "1.E-05"), (-2.5e20, "-2.5E+20"), (0.1, "0.1")]
)
def test_step_real_always_has_a_decimal_point(value, text):
    # ISO 10303-21 §6.4.2: a real has a decimal point; the exponent follows an E
    assert step_real(value) == text
    assert float(text) == value


def test_step_string_escapes():
    # ISO 10303-21 §6.4.3: apostrophe doubled, backslash doubled, \X4\ for non-ASCII
    assert step_string("it's") == "'it''s'"
    assert step_string("a\\b") == "'a\\\\b'"
    assert step_string("é") == "'\\X4\\000000E9\\X0\\'"


def test_many_beams_write_back(tmp_path):
    # speed is measured by benchmarks/bench_outputs.py, not asserted here
    import ifcopenshell.guid

    from ifccheck.ifc.author import ModelAuthor

    a = ModelAuthor("IFC4", "foot")
    a.storey("Level 1", 0.0)
    # bare beams (no geometry) are enough to time the write-back, and quick to make
    elements = [
        a.f.create_entity("IfcBeam", GlobalId=ifcopenshell.guid.new(), Name=f"B{i}")
        for i in range(1_000)
    ]
    source = a.write(tmp_path / "big.ifc")
    result = rf.many_beams(1_000)
    result.beams = [
        replace(b, guid=e.GlobalId) for b, e in zip(result.beams, elements, strict=True)
    ]
    out = write_checked_ifc(source, result, tmp_path / "big.checked.ifc")
    copy = ifcopenshell.open(str(out))
    assert len(copy.by_type("IfcPropertySet")) == 1_000
