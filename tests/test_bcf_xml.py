"""The planned BCF serializer writes exactly what xsdata writes, and bcf-client reads
every topic back (BCF 2.1, buildingSMART; bcf-client's data model)."""

from __future__ import annotations

import zipfile

import bcf.v2.model as mdl
import result_fixtures as rf
from bcf.v2.bcfxml import BcfXml
from bcf.xml_parser import XmlParserSerializer

from ifccheck.report.bcf_out import write_issues_bcf
from ifccheck.report.bcf_xml import FastXmlHandler


def _documents(path):
    """(class, xml) of every document in a BCF file."""
    kinds = {"markup.bcf": mdl.Markup, ".bcfv": mdl.VisualizationInfo,
             "project.bcfp": mdl.ProjectExtension, "bcf.version": mdl.Version}  # fmt: skip
    with zipfile.ZipFile(path) as z:
        for name in z.namelist():
            if name.endswith("/"):  # a topic's folder
                continue
            cls = next((c for end, c in kinds.items() if name.endswith(end)), None)
            assert cls is not None, name
            yield cls, z.read(name)


def test_planned_writer_is_byte_for_byte_xsdata(tmp_path):
    result = rf.many_beams(40)
    path = write_issues_bcf(result, tmp_path / "m.issues.bcf")
    xsdata, fast = XmlParserSerializer(), FastXmlHandler()
    n = 0
    for cls, xml in _documents(path):
        obj = xsdata.parse(xml, cls)
        assert fast.serialize(obj) == xsdata.serialize(obj)
        assert fast.serialize(obj).encode() == xml  # what the file holds is the same text
        n += 1
    assert n > 40


def test_text_needing_escapes_and_unusual_values():
    topic = mdl.Topic(
        guid="3f1c8f0e-0000-4000-8000-000000000001",
        title="a < b & \"c\" > 'd'",
        description="line 1\nline 2\t& more",
        creation_author="x",
        creation_date=None,
        topic_type="Error",
        labels=["", "a&b", "<"],
        index=3,
    )
    markup = mdl.Markup(topic=topic)
    point = mdl.Point(x=1e-20, y=-0.0, z=float("inf"))
    line = mdl.Line(start_point=point, end_point=mdl.Point(x=1e300, y=float("nan"), z=2.0))
    info = mdl.VisualizationInfo(
        guid="3f1c8f0e-0000-4000-8000-000000000002",
        lines=mdl.VisualizationInfoLines(line=[line]),
        components=mdl.Components(
            visibility=mdl.ComponentVisibility(default_visibility=False),
        ),
    )
    xsdata, fast = XmlParserSerializer(), FastXmlHandler()
    for obj in (markup, info):
        assert fast.serialize(obj) == xsdata.serialize(obj)


def test_bcf_client_reads_every_topic_back(tmp_path):
    result = rf.many_beams(60)
    path = write_issues_bcf(result, tmp_path / "m.issues.bcf")
    bcf_file = BcfXml.load(path)
    assert bcf_file is not None
    issues = {b.guid for b in result.beams if b.outcome in ("fail", "not_checked")}
    selected = set()
    for t in bcf_file.topics.values():
        assert t.topic.title and t.topic.guid
        for vp in t.viewpoints.values():
            selected.update(vp.get_selected_guids() or [])
    bcf_file.close()
    assert issues <= selected
