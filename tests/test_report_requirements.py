"""The model information audit in the outputs: BCF topics read back with bcf-client,
the report's section, the summary clause and results.json."""

from __future__ import annotations

import json
import re

import jsonschema
import pytest
import requirement_builders as rb
import result_fixtures as rf
from bcf.v2.bcfxml import BcfXml

from ifccheck.check import run_check
from ifccheck.config import Settings
from ifccheck.report.bcf_out import write_issues_bcf
from ifccheck.report.html_out import report_html
from ifccheck.report.json_out import RESULTS_SCHEMA, results_document
from ifccheck.report.requirements import (
    LABEL,
    model_information_section,
    summary_clause,
)
from ifccheck.results import RequirementElement, RequirementResult


@pytest.fixture(scope="module")
def audited(tmp_path_factory):
    path = rb.audit_model(tmp_path_factory.mktemp("audit") / "audit.ifc")
    result, _, _ = run_check(path, Settings(), requirements=True)
    return result


def _read_topics(path):
    bcf_file = BcfXml.load(path)
    out = []
    for t in bcf_file.topics.values():
        guids = [g for vp in t.viewpoints.values() for g in (vp.get_selected_guids() or [])]
        out.append((t.topic, guids))
    bcf_file.close()
    return out


def test_one_topic_per_unmet_specification_selecting_exactly_its_failing_elements(
    audited, tmp_path
):
    path = write_issues_bcf(audited, tmp_path / "audit.issues.bcf")
    topics = _read_topics(path)
    info = {t.title: guids for t, guids in topics if LABEL in t.labels}
    unmet = [r for r in audited.requirements if not r.met]
    assert len(info) == len(unmet) == len(rb.FAILS)
    for r in unmet:
        (title,) = [k for k in info if r.name in k]
        assert sorted(info[title]) == sorted(r.failing_guids)
        assert len(info[title]) == len(set(info[title]))
    # the beam topics are still one per failing or not-checked beam
    beams = [
        guids for t, guids in topics if LABEL not in t.labels and "not structural" not in t.labels
    ]  # the hardware has its own one topic
    flagged = {b.guid for b in audited.beams if b.outcome != "pass"}
    assert len(beams) == len(flagged) and {g for gs in beams for g in gs} == flagged


def test_a_topic_says_what_the_model_needs_and_a_rerun_gives_the_same_topics(audited, tmp_path):
    first = _read_topics(write_issues_bcf(audited, tmp_path / "a.bcf"))
    again = _read_topics(write_issues_bcf(audited, tmp_path / "b.bcf"))
    assert {t.guid for t, _ in first} == {t.guid for t, _ in again}
    grade = next(t for t, _ in first if "Beams name their steel grade" in t.title)
    assert "1 element" in grade.title and grade.topic_type == "Request"
    assert "What the model needs: Associate a material" in grade.description
    assert "B-NOGRADE (IfcBeam, Level 2): no material" in grade.description
    assert "ifctester" in grade.description
    deck = next(t for t, _ in first if "slab or declared deck" in t.title)
    assert "Checked by ifccheck itself" in deck.description


def test_no_audit_no_topics(tmp_path):
    result = rf.check_result()
    assert result.requirements == []
    topics = _read_topics(write_issues_bcf(result, tmp_path / "m.bcf"))
    assert not any(LABEL in t.labels for t, _ in topics)


def test_the_report_section_lists_failing_elements_by_name_and_storey(audited):
    section = model_information_section(audited)
    assert section.startswith('<section id="model-information"><h2>Model information</h2>')
    rows = re.findall(r'<tr class="(met|unmet)"><td>([^<]+)</td>', section)
    assert [name for _, name in rows] == [r.name for r in audited.requirements]
    assert all(state == "unmet" for state, _ in rows)
    assert "0 of 8 requirements are met; 8 elements fail 8 of them." in section
    for key, name in rb.FAILS.items():
        assert f"<td>{name}</td>" in section, key
    assert "<td>B-NOGRADE</td><td>IfcBeam</td><td>Level 2</td><td>no material</td>" in section
    assert "<td>B-NOSTOREY</td><td>IfcBeam</td><td>(no storey)</td>" in section
    # shown on the plans: a plan per storey with a labelled mark per failing member
    plans = re.findall(r'<figure class="requirement-plan" data-storey="([^"]+)">', section)
    assert plans == ["Roof", "Level 2", "(no storey)"]  # top down, then the unplaced storey
    marked = set(re.findall(r'<g class="failing" data-guid="([^"]+)">', section))
    members = {e.guid for r in audited.requirements for e in r.failing if e.start is not None}
    assert marked == members and len(members) == len(rb.FAILS)


def test_the_report_has_the_section_after_the_summary(audited):
    page = report_html(audited, "imperial")
    assert page.index('id="summary"') < page.index('id="model-information"')
    assert page.index('id="model-information"') < page.index('id="plans"')
    assert 'id="model-information"' not in report_html(rf.check_result(), "si")


def test_the_summary_clause_counts_unmet_specifications(audited):
    clause = summary_clause(audited)
    assert clause.startswith("; model information: 8 of 8 requirements not met (")
    assert "Beams name their steel grade: 1 element" in clause and "; 5 more)" in clause
    result = rf.check_result()
    assert summary_clause(result) == ""
    result.requirements = [_record(met=True)]
    assert summary_clause(result) == "; model information: all 1 requirements met"


def _record(met: bool) -> RequirementResult:
    failing = [] if met else [RequirementElement("2O2Fr$t4X7Zf8NOew3FLOH", "K1", "IfcMember",
                                                 "Roof", "no material")]  # fmt: skip
    return RequirementResult("member_grade", "Braces and struts name their steel grade", "d",
                             "i", "ifccheck.ids", "ifctester", 3, failing, met)  # fmt: skip


def test_results_json_carries_the_audit_and_the_schema_is_strict(audited):
    doc = json.loads(json.dumps(results_document(audited)))
    schema = json.loads(RESULTS_SCHEMA.read_text())
    validator = jsonschema.Draft202012Validator(schema)
    assert list(validator.iter_errors(doc)) == []
    by_id = {r["identifier"]: r for r in doc["requirements"]}
    assert set(by_id) == set(rb.FAILS)
    grade = by_id["beam_grade"]
    assert grade["checked_by"] == "ifctester" and grade["source"] == "ifccheck.ids"
    assert grade["failing"] == 1 and grade["passing"] == grade["applicable"] - 1
    assert grade["failing_guids"] == [grade["failures"][0]["guid"]]
    assert grade["failures"][0]["name"] == "B-NOGRADE" and grade["met"] is False
    nograde = next(b for b in doc["beams"] if b["name"] == "B-NOGRADE")
    assert nograde["reason_code"] == "no_grade"
    assert (
        "model information requirement not met: 'Beams name their steel grade'"
        in (nograde["reason"])
    )
    doc["requirements"][0]["surprise"] = 1
    assert not validator.is_valid(doc)
    # a document without the audit stays valid (the key is additive)
    del doc["requirements"]
    assert validator.is_valid(doc)
