"""`ifccheck requirements` and the audit options of `ifccheck check`, through the CLI."""

from __future__ import annotations

import json
from pathlib import Path

import ifctester
import pytest
import requirement_builders as rb
from click.testing import CliRunner
from ifctester import ids as idslib
from xmlschema import XMLSchema

from ifccheck.cli import main
from ifccheck.config import settings_from_dict
from ifccheck.errors import SettingsError
from ifccheck.ifc.requirements import REQUIREMENTS

SAMPLES = Path(__file__).parents[1] / "sample_models"
XSD = Path(ifctester.__file__).parent / "ids.xsd"


def run(*args: str):
    return CliRunner().invoke(main, list(args))


def test_requirements_writes_a_valid_ids_and_names_what_ifccheck_checks_itself(tmp_path):
    out = tmp_path / "ifccheck.ids"
    result = run("requirements", "--out", str(out))
    assert result.exit_code == 0, result.output
    assert XMLSchema(str(XSD)).is_valid(str(out))
    lines = result.output.splitlines()
    assert lines[0] == f"{out}: 5 specifications (IDS 1.0, valid against the IDS schema " \
        "ifctester ships)"  # fmt: skip
    assert "  Members say what they are (IFC2X3: on their type) [IFC2X3]" in lines
    for r in REQUIREMENTS:
        assert any(line.startswith(f"  {r.name}") for line in lines), r.name
    own = lines.index("checked by ifccheck itself (IDS 1.0 facets cannot express them):")
    assert lines[own + 1 :] == [f"  {r.name}" for r in REQUIREMENTS if r.checked_by == "ifccheck"]


def test_requirements_follows_the_settings(tmp_path):
    config = tmp_path / "project.toml"
    config.write_text('[requirements]\ngrades = ["A992"]\nstorey = false\nhardware = false\n')
    out = tmp_path / "project.ids"
    result = run("requirements", "--out", str(out), "--config", str(config))
    assert result.exit_code == 0, result.output
    names = [s.name for s in idslib.open(str(out)).specifications]
    assert "Framing sits in a storey" not in names and len(names) == 4
    assert "No hardware written as IfcBeam" not in result.output
    off = tmp_path / "off.toml"
    off.write_text("[requirements]\nbeam_grade = false\nmember_grade = false\n"
                   "member_type = false\nstorey = false\n")  # fmt: skip
    result = run("requirements", "--out", str(tmp_path / "x.ids"), "--config", str(off))
    assert result.exit_code == 2
    assert result.output.strip() == (
        "ifccheck: error: requirements: every requirement an IDS can express is switched off"
    )


def test_check_without_the_audit(tmp_path):
    result = run("check", str(SAMPLES / "quillfeather-rev-b.ifc"), "--config",
                 str(SAMPLES / "quillfeather.toml"), "--out", str(tmp_path),
                 "--no-requirements")  # fmt: skip
    assert result.exit_code == 1
    assert "model information" not in result.output
    doc = json.loads((tmp_path / "quillfeather-rev-b.results.json").read_text())
    assert doc["requirements"] == []


def test_check_against_a_projects_ids_instead(tmp_path):
    model = rb.audit_model(tmp_path / "audit.ifc")
    project = tmp_path / "project.ids"
    own = idslib.Ids(title="Project requirements")
    spec = idslib.Specification(name="Beams are named", ifcVersion=["IFC4"], identifier="named")
    spec.applicability.append(idslib.Entity(name="IFCBEAM"))
    spec.requirements.append(idslib.Attribute(name="Name", cardinality="required"))
    own.specifications.append(spec)
    assert own.to_xml(str(project))
    result = run("check", str(model), "--out", str(tmp_path / "out"), "--no-requirements",
                 "--ids", str(project))  # fmt: skip
    assert "model information: all 1 requirements met" in result.output
    doc = json.loads((tmp_path / "out" / "audit.results.json").read_text())
    assert [(r["name"], r["identifier"], r["source"]) for r in doc["requirements"]] == [
        ("Beams are named", "named", "project.ids")
    ]


@pytest.mark.parametrize("content", [None, "<ids xmlns='x'/>"])
def test_an_unusable_ids_is_exit_2_in_one_line(tmp_path, content):
    ids_path = tmp_path / "bad.ids"
    if content is not None:
        ids_path.write_text(content)
    result = run("check", str(SAMPLES / "brambleford.ifc"), "--out", str(tmp_path / "out"),
                 "--ids", str(ids_path))  # fmt: skip
    assert result.exit_code == 2
    (line,) = result.output.strip().splitlines()
    assert line.startswith(f"ifccheck: error: --ids {ids_path}: ")
    assert not (tmp_path / "out").exists()


@pytest.mark.parametrize(
    ("table", "key"),
    [
        ({"grades": "A992"}, "requirements.grades"),
        ({"grades": ["A992", "S335J0"]}, "requirements.grades[1]"),
        ({"axis": "no"}, "requirements.axis"),
        ({"profiles": False}, "requirements.profiles"),
    ],
)
def test_the_requirements_table_is_validated(table, key):
    with pytest.raises(SettingsError) as info:
        settings_from_dict({"requirements": table})
    assert str(info.value).startswith(f"settings: {key}: ")


def test_the_requirements_table_reads_back():
    s = settings_from_dict({"requirements": {"grades": ["A992", "A992", "S355"], "axis": False}})
    assert s.requirements.grades == ["A992", "S355"]
    assert not s.requirements.axis and s.requirements.profile
    assert s.is_default("requirements.storey") and not s.is_default("requirements.axis")
