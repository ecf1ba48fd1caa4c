"""The information requirements as an IDS, and the audit before the beams.

Sources: buildingSMART Information Delivery Specification 1.0 (its XSD, as shipped
with ifctester); ifctester, the IfcOpenShell project's IDS tool, as the reference
audit of what the IDS facets express.
"""

from __future__ import annotations

from pathlib import Path

import ifcopenshell
import ifctester
import pytest
import requirement_builders as rb
from ifctester import ids as idslib
from xmlschema import XMLSchema

from ifccheck.check import run_check
from ifccheck.config import RequirementSettings, Settings, settings_from_dict
from ifccheck.errors import IdsFileError
from ifccheck.ifc.requirements import (
    IDS_FILE,
    IDS_VERSIONS,
    REQUIREMENTS,
    build_ids,
    grade_pattern,
    load_ids,
    write_ids,
)
from ifccheck.reasons import NotChecked
from ifccheck.sections.grades import material_category, steel_from_name

XSD = Path(ifctester.__file__).parent / "ids.xsd"  # the IDS 1.0 schema ifctester ships


@pytest.fixture(scope="module")
def audit_model(tmp_path_factory) -> Path:
    return rb.audit_model(tmp_path_factory.mktemp("audit") / "audit.ifc")


@pytest.fixture(scope="module")
def audited(audit_model):
    result, model, _ = run_check(audit_model, Settings(), requirements=True)
    return result, model


def _names(model) -> dict[str, str]:
    return {m.guid: m.name for m in model.members}


# --- the IDS file ---------------------------------------------------------------
def test_the_ids_validates_against_the_xsd_ifctester_ships_and_round_trips(tmp_path):
    path, written = write_ids(tmp_path / "ifccheck.ids")
    XMLSchema(str(XSD)).validate(str(path))  # raises on any schema violation
    reopened = idslib.open(str(path), validate=True)
    assert [s.name for s in reopened.specifications] == [s.name for s in written.specifications]
    for a, b in zip(reopened.specifications, written.specifications, strict=True):
        assert (a.description, a.instructions) == (b.description, b.instructions)
        assert list(a.ifcVersion) == list(b.ifcVersion)

    def without_identifiers(document: idslib.Ids) -> dict:
        # ifctester 0.9 does not read a specification's identifier back (load_ids does)
        d = document.asdict()
        for spec in d["specifications"]["specification"]:
            spec.pop("@identifier", None)
        return d

    # read again, every facet and restriction is the same
    assert without_identifiers(reopened) == without_identifiers(written)
    assert [s.identifier for s in load_ids(path).specifications] == [
        s.identifier for s in written.specifications
    ]


def test_a_document_that_breaks_the_schema_is_refused(tmp_path):
    path, _ = write_ids(tmp_path / "ifccheck.ids")
    broken = tmp_path / "broken.ids"
    broken.write_text(path.read_text().replace('ifcVersion="IFC2X3 IFC4 IFC4X3_ADD2"',
                                               'ifcVersion="IFC5"', 1))  # fmt: skip
    assert not XMLSchema(str(XSD)).is_valid(str(broken))
    with pytest.raises(IdsFileError, match=r"not a valid IDS 1\.0 file"):
        load_ids(broken)


def test_every_specification_says_what_for_whom_and_how():
    document = build_ids()
    by_id = {s.identifier: s for s in document.specifications}
    assert set(by_id) == {r.key for r in REQUIREMENTS if r.checked_by == "ifctester"}
    for s in document.specifications:
        assert s.name and s.description and s.instructions
        assert s.applicability and s.requirements
        assert set(s.ifcVersion) <= set(IDS_VERSIONS)
    # IFC2X3 and IFC4 are both covered by every requirement; the member type has a
    # specification of its own for IFC2X3, where the predefined type is on the type
    for versions in (("IFC2X3",), ("IFC4",), ("IFC4X3_ADD2",)):
        covered = {s.identifier.removesuffix("_ifc2x3") for s in document.specifications
                   if set(versions) <= set(s.ifcVersion)}  # fmt: skip
        assert covered == {"beam_grade", "member_grade", "member_type", "storey"}
    assert list(by_id["member_type_ifc2x3"].ifcVersion) == ["IFC2X3"]
    assert "IFC2X3" not in by_id["member_type"].ifcVersion
    # applicability by class and, for the braces and struts, by predefined type
    grade = by_id["member_grade"].applicability[0]
    assert grade.predefinedType is not None
    assert grade.predefinedType == "BRACE" and grade.predefinedType == "kicker"
    assert grade.predefinedType != "MULLION"
    # what the facets cannot express is named in the file's description
    for r in REQUIREMENTS:
        if r.checked_by == "ifccheck":
            assert r.name in document.info["description"]


def test_settings_switch_specifications_and_set_the_projects_grades():
    settings = settings_from_dict(
        {"requirements": {"storey": False, "axis": False, "grades": ["A992", "S355J2"]}}
    ).requirements
    document = build_ids(settings, materials=["Metal - Steel - 250 MPa"])
    assert "storey" not in {s.identifier for s in document.specifications}
    assert "Beams and members have an Axis line" not in document.info["description"]
    beam = next(s for s in document.specifications if s.identifier == "beam_grade")
    value = beam.requirements[0].value
    assert value == "ASTM A992" and value == "S355J2+N"
    assert value != "S275"  # not a grade of this project
    assert value != "Fy 50 ksi"  # a yield strength is no grade of the project's list
    assert value == "metal  - steel -  250 mpa"  # a name mapped in [steel.materials]
    with pytest.raises(IdsFileError, match="switched off"):
        write_ids("never.ids", RequirementSettings(beam_grade=False, member_grade=False,
                                                    member_type=False, storey=False))  # fmt: skip
    assert not Path("never.ids").exists()


# --- the grade pattern against the reader -----------------------------------------
ACCEPTED = [
    "A992", "ASTM A992", "astm a992 steel", "A-992", "A572-50", "A572 Gr 50", "A572 Grade 50",
    "A36", "A500 Gr C", "A53 Gr B", "A913 Gr 65", "A1085", "S355", "S355J2+N", "S 355",
    "s275jr", "S235", "S460M", "_S355_", "Fy 50 ksi", "Fy=50ksi", "250 MPa", "345 N/mm2",
    "Metal - Steel - 250 MPa", "C30/37", "Concrete", "GL24h", "Timber",
]  # fmt: skip
REFUSED = [
    "Steel", "S335J0", "XA992", "A9920", "A360", "A500 Gr CX", "5 MPa", "1250 MPa", "2.250 MPa",
    "Fe 360", "", "Default",
]  # fmt: skip


@pytest.mark.parametrize("name", ACCEPTED + REFUSED)
def test_the_grade_pattern_is_never_looser_than_the_reader(name):
    """A name the IDS accepts is one the reader takes a grade from (or a concrete or
    timber name, out of the steel check's scope): the IDS never passes a beam the check
    then leaves with no grade."""
    pattern = idslib.Restriction(options={"pattern": grade_pattern()})
    accepted = pattern == name
    assert accepted is (name in ACCEPTED)
    if accepted:
        read = steel_from_name(name)
        assert read is not None or material_category(name).value in ("concrete", "timber")


# --- the audit: ifctester's own and ifccheck's agree ------------------------------
def test_ifctester_and_the_summary_agree_element_by_element(audit_model, audited, tmp_path):
    result, _model = audited
    path, _ = write_ids(tmp_path / IDS_FILE)
    reference = idslib.open(str(path), validate=True)
    reference.validate(ifcopenshell.open(str(audit_model)), should_filter_version=True)
    records = {r.name: r for r in result.requirements if r.checked_by == "ifctester"}
    applying = [s for s in reference.specifications if s.is_ifc_version]
    assert set(records) == {s.name for s in applying}
    for spec in applying:
        record = records[spec.name]
        assert record.source == IDS_FILE
        assert record.applicable == len({e.GlobalId for e in spec.applicable_entities})
        assert set(record.failing_guids) == {e.GlobalId for e in spec.failed_entities}
        assert record.passing == record.applicable - len(spec.failed_entities)
        assert record.met is bool(spec.status)


def test_one_element_fails_each_requirement(audited):
    result, model = audited
    names = _names(model)
    failing = {r.identifier: [e.name for e in r.failing] for r in result.requirements}
    # the storey check is the one that sees the unnamed slab and columns too: none fail
    assert failing == {key: [name] for key, name in rb.FAILS.items()}
    by_key = {r.identifier: r for r in result.requirements}
    assert by_key["beam_grade"].failing[0].reason == "no material"
    assert "IfcArbitraryClosedProfileDef" in by_key["profile"].failing[0].reason
    assert by_key["member_type"].failing[0].reason.startswith("PredefinedType not set")
    assert {e.guid for r in result.requirements for e in r.failing} <= set(names)
    for r in result.requirements:
        assert r.passing == r.applicable - 1 and not r.met


def test_a_beam_not_checked_for_want_of_a_requirement_names_it(audited):
    result, _ = audited
    beams = {b.name: b for b in result.beams}
    by_key = {r.key: r for r in REQUIREMENTS}
    nograde = beams["B-NOGRADE"]
    assert nograde.outcome == "not_checked" and nograde.reason.code is NotChecked.NO_GRADE
    assert nograde.reason.requirements == (by_key["beam_grade"].name,)
    assert by_key["beam_grade"].name in nograde.reason.text
    nodeck = beams["R-NODECK"]
    assert nodeck.reason.code is NotChecked.NO_FLOOR_LOAD
    assert nodeck.reason.requirements == (by_key["floor_deck"].name,)
    # a requirement unmet by a beam that is checked all the same names nothing
    assert beams["B-NOAXIS"].outcome != "not_checked" and beams["B-NOAXIS"].reason is None
    # hardware written as a beam: whatever stops its check, the fix is its class
    plate = beams["Plate P1"]
    assert plate.outcome == "not_checked"
    assert plate.reason.requirements == (by_key["hardware"].name,)


def test_an_unaudited_check_names_nothing(audit_model):
    result, _, _ = run_check(audit_model, Settings())
    assert result.requirements == []
    assert all(not b.reason.requirements for b in result.beams if b.reason is not None)


def test_ifc2x3_members_take_their_type_from_the_member_type(tmp_path):
    path = rb.ifc2x3_members(tmp_path / "members.ifc")
    result, _model, _ = run_check(path, Settings(), requirements=True)
    by_key = {r.identifier: r for r in result.requirements}
    assert "member_type" not in by_key  # the IFC4 specification does not apply to IFC2X3
    record = by_key["member_type_ifc2x3"]
    assert record.applicable == 2
    assert [e.name for e in record.failing] == ["M-UNTYPED"]
    ifc = ifcopenshell.open(str(path))
    typed = next(e for e in ifc.by_type("IfcMember") if e.Name == "M-TYPED")
    assert typed.ObjectType is None  # it passes by its IfcMemberType alone


def test_a_projects_own_ids_is_audited_as_well_or_instead(audit_model, tmp_path):
    own = idslib.Ids(title="Project requirements")
    spec = idslib.Specification(name="Beams are tagged", ifcVersion=["IFC4"],
                                identifier="tagged")  # fmt: skip
    spec.applicability.append(idslib.Entity(name="IFCBEAM"))
    spec.requirements.append(idslib.Attribute(name="Tag", cardinality="required"))
    own.specifications.append(spec)
    project = tmp_path / "project.ids"
    assert own.to_xml(str(project))
    both, _, _ = run_check(audit_model, Settings(), requirements=True, project_ids=[project])
    records = [r for r in both.requirements if r.source == "project.ids"]
    assert [r.name for r in records] == ["Beams are tagged"]
    beams = ifcopenshell.open(str(audit_model)).by_type("IfcBeam")
    assert set(records[0].failing_guids) == {b.GlobalId for b in beams}  # none is tagged
    assert both.requirements[-1] is records[0]  # the tool's own first
    instead, _, _ = run_check(audit_model, Settings(), project_ids=[project])
    assert [r.source for r in instead.requirements] == ["project.ids"]
    # the project's specifications name no beam's reason: the tool does not know they
    # are needed for the check
    nograde = next(b for b in instead.beams if b.name == "B-NOGRADE")
    assert nograde.reason.requirements == ()


@pytest.mark.parametrize(
    ("text", "message"),
    [("not xml at all", "cannot be read"), ("<ids/>", r"not a valid IDS 1\.0 file")],
)
def test_an_unusable_project_ids_is_one_line(tmp_path, text, message):
    bad = tmp_path / "bad.ids"
    bad.write_text(text)
    with pytest.raises(IdsFileError, match=message) as info:
        load_ids(bad)
    assert "\n" not in str(info.value)
    with pytest.raises(IdsFileError, match="no such file"):
        load_ids(tmp_path / "missing.ids")


@pytest.mark.parametrize("schema", ["IFC2X3", "IFC4", "IFC4X3"])
def test_every_schema_is_audited(tmp_path, schema):
    """One beam without a material and one member without a type, in each IFC version the
    IDS names: the grade and member type specifications that apply find exactly them."""
    a = rb.ModelAuthor(schema, "metre", project="Schemas", seed=f"schemas-{schema}")
    a.storey("Level 1", 3.0)
    ipe = rb.IProfile("IPE300", 0.3, 0.15, 0.0071, 0.0107, 0.015)
    a.beam("Level 1", (0, 0, 0), (6, 0, 0), ipe, material="S355", key="ok", name="B-OK")
    a.beam("Level 1", (0, 3, 0), (6, 3, 0), ipe, material=None, key="bare", name="B-BARE")
    a.member("Level 1", (3, 0, -0.2), (3, 3, -0.2), ipe, predefined=None, material="S355",
             key="untyped", name="M-UNTYPED")  # fmt: skip
    path = a.write(tmp_path / f"{schema}.ifc")
    result, _, _ = run_check(path, Settings(), requirements=True)
    failing = {r.identifier: [e.name for e in r.failing] for r in result.requirements}
    member_type = "member_type_ifc2x3" if schema == "IFC2X3" else "member_type"
    assert failing["beam_grade"] == ["B-BARE"]
    assert failing[member_type] == ["M-UNTYPED"]
    (other,) = {"member_type", "member_type_ifc2x3"} - {member_type}
    assert other not in failing  # the other schema's specification does not apply
    reference = build_ids()
    reference.validate(ifcopenshell.open(str(path)), should_filter_version=True)
    for spec in reference.specifications:
        if spec.is_ifc_version:
            record = next(r for r in result.requirements if r.name == spec.name)
            assert set(record.failing_guids) == {e.GlobalId for e in spec.failed_entities}


def test_a_projects_grade_may_be_a_yield_strength():
    pattern = idslib.Restriction(options={"pattern": grade_pattern(["250 MPa", "Fy 50 ksi"])})
    assert pattern == "Steel 250MPa" and pattern == "250.0 N/mm2" and pattern == "50 ksi"
    assert pattern != "2500 MPa" and pattern != "350 MPa" and pattern != "A992"
