"""BCF issues: read back with bcf-client; outcomes agree across every output."""

from __future__ import annotations

import math
import zipfile

import ifcopenshell
import ifcopenshell.util.element
import pandas as pd
import pytest
import result_fixtures as rf
from bcf.v2.bcfxml import BcfXml

from ifccheck.ifc.writeback import PSET_NAME
from ifccheck.report import write_all, write_diff_all
from ifccheck.report.bcf_out import camera_for, write_diff_bcf, write_issues_bcf

FT = 0.3048  # m, NIST SP 811


def _topics(path):
    bcf_file = BcfXml.load(path)
    topics = list(bcf_file.topics.values())
    out = []
    for t in topics:
        guids = [g for vp in t.viewpoints.values() for g in (vp.get_selected_guids() or [])]
        out.append((t, guids))
    bcf_file.close()
    return out


def test_one_topic_per_failing_or_not_checked_beam(tmp_path):
    model = ifcopenshell.open(str(rf.write_model(tmp_path / "m.ifc")))
    model_guids = {e.GlobalId for e in model.by_type("IfcRoot")}
    result = rf.check_result()
    topics = _topics(write_issues_bcf(result, tmp_path / "m.issues.bcf"))
    expected = {b.guid for b in result.beams if b.outcome in ("fail", "not_checked")}
    assert len(topics) == len(expected) == 2
    selected = set()
    for _, guids in topics:
        assert len(guids) == 1 and guids[0] in model_guids
        selected.update(guids)
    assert selected == expected


def test_topic_words_say_where_why_and_what_to_do(tmp_path):
    result = rf.check_result()
    topics = dict(
        (guids[0], t)
        for t, guids in _topics(write_issues_bcf(result, tmp_path / "i.bcf", "imperial"))
    )
    g = rf.guids()
    fail = topics[g["b2"]].topic
    assert "B-2" in fail.title and "elastic lateral-torsional buckling" in fail.title
    text = fail.description
    assert "7.50 ft to 22.50 ft" in text  # the governing segment's stations
    assert "Lb = 15.00 ft" in text
    assert "utilisation 1.31" in text and "1.2D + 1.6L" in text
    # a brace at the middle of the 7.5–22.5 ft segment, given from the named end
    assert "at 15.00 ft from the end at J3 would make it pass" in text
    assert "The lightest W16 that passes as braced today is W16X31" in text
    assert "S1" in text and "does not count" in text  # the strut, by name
    assert "fail" in fail.labels
    nc = topics[g["b3"]].topic
    assert "not checked" in nc.title
    assert "shape table" in nc.description and "profile" in nc.description.lower()


def test_viewpoint_camera_looks_down_at_the_beam_midpoint(tmp_path):
    result = rf.check_result()
    beams = {b.guid: b for b in result.beams}
    for t, guids in _topics(write_issues_bcf(result, tmp_path / "i.bcf")):
        b = beams[guids[0]]
        (vp,) = t.viewpoints.values()
        cam = vp.visualization_info.perspective_camera
        pos = (cam.camera_view_point.x, cam.camera_view_point.y, cam.camera_view_point.z)
        d = (cam.camera_direction.x, cam.camera_direction.y, cam.camera_direction.z)
        up = (cam.camera_up_vector.x, cam.camera_up_vector.y, cam.camera_up_vector.z)
        mid = tuple((s + e) / 2 for s, e in zip(b.start, b.end, strict=True))
        assert math.hypot(*d) == pytest.approx(1.0)
        assert d[2] < -0.3  # from above
        assert sum(a * c for a, c in zip(d, up, strict=True)) == pytest.approx(0.0, abs=1e-9)
        to_mid = [m - p for m, p in zip(mid, pos, strict=True)]
        dist = math.hypot(*to_mid)
        # the midpoint lies on the line of sight (coordinates in metres, as BCF requires)
        assert [c / dist for c in to_mid] == pytest.approx(list(d), abs=1e-9)
        assert 45.0 <= cam.field_of_view <= 60.0  # BCF 2.1 markup schema range


def test_camera_for_vertical_and_tiny_members():
    pos, d, up = camera_for((0.0, 0.0, 0.0), (0.0, 0.0, 3.0))
    assert all(math.isfinite(v) for v in (*pos, *d, *up))
    pos, d, up = camera_for((1.0, 1.0, 1.0), (1.0, 1.0, 1.0))
    assert all(math.isfinite(v) for v in (*pos, *d, *up))


def test_rerun_gives_the_same_topic_guids(tmp_path):
    a = _topics(write_issues_bcf(rf.check_result(), tmp_path / "a.bcf"))
    b = _topics(write_issues_bcf(rf.check_result(), tmp_path / "b.bcf"))
    assert sorted(t.guid for t, _ in a) == sorted(t.guid for t, _ in b)


def test_file_is_bcf_2_1(tmp_path):
    path = write_issues_bcf(rf.check_result(), tmp_path / "i.bcf")
    with zipfile.ZipFile(path) as z:
        assert b'VersionId="2.1"' in z.read("bcf.version")
        assert sum(n.endswith("markup.bcf") for n in z.namelist()) == 2


def test_diff_bcf_topic_per_weakened_beam(tmp_path):
    diff = rf.diff_result()
    new_model = ifcopenshell.open(str(rf.write_model(tmp_path / "b.ifc")))
    topics = _topics(write_diff_bcf(diff, tmp_path / "diff.bcf", "imperial"))
    assert len(topics) == len(diff.weakened) == 1
    t, guids = topics[0]
    assert guids == [diff.weakened[0].guid]
    assert new_model.by_guid(guids[0]).is_a("IfcBeam")
    assert "lost 1 brace point" in t.topic.title
    assert "15.00 ft" in t.topic.description
    (vp,) = t.viewpoints.values()
    lines = vp.visualization_info.lines.line
    b2 = next(b for b in diff.new.beams if b.guid == guids[0])
    assert lines[0].start_point.x == pytest.approx(b2.start[0] + 15 * FT)


def test_outcomes_agree_across_json_csv_psets_and_bcf(tmp_path):
    import json

    source = rf.write_model(tmp_path / "scenario.ifc", "IFC4", "foot")
    result = rf.check_result()
    paths = write_all(result, source, tmp_path / "out", "imperial")
    assert {p.name for p in paths.values()} == {
        "scenario.results.json", "scenario.beams.csv", "scenario.checked.ifc",
        "scenario.issues.bcf", "scenario.report.html",
    }  # fmt: skip
    from_json = {b["guid"]: b["outcome"] for b in json.loads(paths["json"].read_text())["beams"]}
    df = pd.read_csv(paths["csv"])
    from_csv = dict(zip(df["guid"], df["outcome"], strict=True))
    copy = ifcopenshell.open(str(paths["ifc"]))
    from_psets = {
        g: ifcopenshell.util.element.get_psets(copy.by_guid(g))[PSET_NAME]["Outcome"]
        for g in from_json
    }
    from_bcf = {}
    for t, guids in _topics(paths["bcf"]):
        outcome = "fail" if "fail" in t.topic.labels else "not_checked"
        assert ("not checked" in t.topic.labels) is (outcome == "not_checked")
        from_bcf[guids[0]] = outcome
    expected = {b.guid: b.outcome for b in result.beams}
    assert from_json == from_csv == from_psets == expected
    assert from_bcf == {g: s for g, s in expected.items() if s != "pass"}
    diff_paths = write_diff_all(rf.diff_result(), tmp_path / "diff", "si")
    assert {p.name for p in diff_paths.values()} == {
        "diff.json",
        "diff.csv",
        "diff.bcf",
        "diff.html",
    }
