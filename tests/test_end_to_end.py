"""`ifccheck check` and `ifccheck diff` on the demo models, through the CLI.

Expected findings are those the invented scenario builds in (ifccheck/samples/
scenario.py); the schema is the project's own JSON contract.
"""

from __future__ import annotations

import csv
import json
import zipfile
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.element
import jsonschema
import pytest
from click.testing import CliRunner

from ifccheck.cli import main
from ifccheck.ifc.writeback import PSET_NAME

SAMPLES = Path(__file__).parents[1] / "sample_models"
SCHEMAS = Path(__file__).parents[1] / "ifccheck" / "schemas"


def run(*args: str):
    return CliRunner().invoke(main, list(args))


@pytest.fixture(scope="module")
def rev_b(tmp_path_factory):
    out = tmp_path_factory.mktemp("rev-b")
    model = SAMPLES / "quillfeather-rev-b.ifc"
    before = model.read_bytes()
    result = run("check", str(model), "--config", str(SAMPLES / "quillfeather.toml"),
                 "--out", str(out))  # fmt: skip
    assert model.read_bytes() == before  # the input model is never modified
    return result, out


def test_check_exit_code_and_summary_line(rev_b):
    result, _ = rev_b
    # the scenario's two weakened beams fail, and so do the two neighbours that take the
    # floor of the beam pulled short of its girder (no load disappears with it); Level 2's
    # other beams fail during construction (the deck is not fastened before the pour)
    assert result.exit_code == 1
    assert "49 pass, 21 fail, 1 not checked" in result.output
    assert "construction stage" in result.output
    # the audit before the beams: revision B's roof strut has no material
    assert (
        "model information: 1 of 8 requirements not met "
        "(Braces and struts name their steel grade: 1 element)" in result.output
    )
    assert "licensed engineer" in result.output


def test_outputs_agree_with_each_other(rev_b):
    _, out = rev_b
    doc = json.loads((out / "quillfeather-rev-b.results.json").read_text())
    jsonschema.validate(doc, json.loads((SCHEMAS / "results.schema.json").read_text()))
    outcomes = {b["guid"]: b["outcome"] for b in doc["beams"]}
    by_name = {b["name"]: b for b in doc["beams"]}
    assert by_name["L2-B2-20"]["outcome"] == "fail"
    assert by_name["R-G90-0"]["outcome"] == "fail"
    assert by_name["L2-B1-50"]["outcome"] == "not_checked"
    assert by_name["L2-B1-40"]["outcome"] == "fail" and by_name["L2-E1-60"]["outcome"] == "fail"

    with (out / "quillfeather-rev-b.beams.csv").open(newline="") as fh:
        rows = list(csv.DictReader(fh))
    assert {r["guid"]: r["outcome"] for r in rows} == outcomes
    assert "lb_ft" in rows[0] and "moment_demand_kip_ft" in rows[0]  # model in feet

    checked = ifcopenshell.open(str(out / "quillfeather-rev-b.checked.ifc"))
    original = ifcopenshell.open(str(SAMPLES / "quillfeather-rev-b.ifc"))
    assert len(checked.by_type("IfcRoot")) >= len(original.by_type("IfcRoot"))
    for guid, outcome in outcomes.items():
        psets = ifcopenshell.util.element.get_psets(checked.by_guid(guid))
        assert psets[PSET_NAME]["Outcome"] == outcome

    # BCF 2.1: one folder per topic; the viewpoint (.bcfv) selects the beam's GUID
    with zipfile.ZipFile(out / "quillfeather-rev-b.issues.bcf") as z:
        topics: dict[str, str] = {}
        for n in z.namelist():
            if "/" in n:
                topics[n.split("/")[0]] = topics.get(n.split("/")[0], "") + z.read(n).decode()
    flagged = {g for g, s in outcomes.items() if s != "pass"}
    # and one topic per unmet model information requirement: revision B's roof strut,
    # exported without a material (ifccheck/samples/scenario.py)
    info = {k: t for k, t in topics.items() if "Model information:" in t}
    beam_topics = {k: t for k, t in topics.items() if k not in info}
    assert len(beam_topics) == len(flagged)
    for guid in flagged:
        assert sum(guid in text for text in beam_topics.values()) == 1
    strut = next(r for r in doc["requirements"] if r["failing"])
    assert [r["name"] for r in doc["requirements"] if not r["met"]] == [strut["name"]]
    assert strut["identifier"] == "member_grade" and strut["failures"][0]["name"] == "R-S15"
    (text,) = info.values()
    assert strut["name"] in text and strut["failing_guids"][0] in text


def test_metric_model_in_si_units(tmp_path):
    result = run("check", str(SAMPLES / "brambleford.ifc"), "--config",
                 str(SAMPLES / "brambleford.toml"), "--out", str(tmp_path))  # fmt: skip
    assert result.exit_code == 1  # the lintel bears on nothing and cannot be checked
    assert "6 pass, 0 fail, 1 not checked" in result.output
    with (tmp_path / "brambleford.beams.csv").open(newline="") as fh:
        rows = list(csv.DictReader(fh))
    assert "lb_m" in rows[0] and "fy_MPa" in rows[0]
    lintel = next(r for r in rows if r["name"] == "L1")
    # given by name only, HEB160 resolves from the European catalogue; nothing carries it
    assert lintel["profile"] == "HEB160"
    assert lintel["reason"].startswith("unsupported")


def test_diff_through_the_cli(tmp_path):
    result = run("diff", str(SAMPLES / "quillfeather-rev-a.ifc"),
                 str(SAMPLES / "quillfeather-rev-b.ifc"), "--config",
                 str(SAMPLES / "quillfeather.toml"), "--out", str(tmp_path))  # fmt: skip
    assert result.exit_code == 1  # weakened beams found
    assert "7 weakened" in result.output
    doc = json.loads((tmp_path / "diff.json").read_text())
    jsonschema.validate(doc, json.loads((SCHEMAS / "diff.schema.json").read_text()))
    weakened = {b["name"]: b for b in doc["beams"].values() if b["change"] == "weakened"}
    assert {"R-G90-0", "L2-B2-20", "L2-B1-50"} <= set(weakened)
    assert weakened["R-G90-0"]["lost_brace_points"] == pytest.approx([15 * 0.3048], abs=1e-3)
    for name in ("diff.csv", "diff.bcf", "diff.html"):
        assert (tmp_path / name).stat().st_size > 0


def test_nothing_weakened_between_identical_revisions(tmp_path):
    a = str(SAMPLES / "quillfeather-rev-a.ifc")
    result = run("diff", a, a, "--config", str(SAMPLES / "quillfeather.toml"),
                 "--out", str(tmp_path))  # fmt: skip
    assert result.exit_code == 0, result.output
    assert "0 weakened" in result.output


def test_bad_settings_file_is_one_line_exit_2(tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text('[loads]\nlive = "100 pounds"\n')
    result = CliRunner().invoke(
        main, ["check", str(SAMPLES / "brambleford.ifc"), "--config", str(bad)]
    )
    assert result.exit_code == 2
    assert "loads.live" in result.output and "Traceback" not in result.output


def test_asd_method_switch(tmp_path):
    config = str(SAMPLES / "quillfeather.toml")
    result = run("check", str(SAMPLES / "quillfeather-rev-a.ifc"), "--config", config,
                 "--method", "ASD", "--out", str(tmp_path))  # fmt: skip
    doc = json.loads((tmp_path / "quillfeather-rev-a.results.json").read_text())
    assert doc["method"] == "ASD"
    combos = {s["load_combination"] for b in doc["beams"] for s in b["segments"]}
    # ASCE 7-16 §2.4.1 (1)-(7) as they load each beam, with live load on parts of the
    # balcony beam (§4.3.3), and ASCE 37-14 D + C during construction
    from ifccheck.loads.combinations import ASD

    allowed = {c.name for c in ASD} | {"D+0.75L", "D+0.75Lr", "D+0.75S", "D+0.45W+0.75S",
                                       "D+0.45W+0.75Lr", "D+C"}  # fmt: skip
    assert {c.split(" (")[0] for c in combos} <= allowed
    assert {"D+L", "0.6D+0.6W", "D+C"} <= combos
    assert not any(c.startswith(("1.2D", "1.4D", "0.9D")) for c in combos)
    assert result.exit_code in (0, 1)


def test_summary_names_failing_and_not_checked_beams(rev_b):
    result, _ = rev_b
    lines = result.output.splitlines()
    # the scenario: the shaft over L2-B2-20, the roof infill deleted beside R-G90-0,
    # L2-B1-50 pulled short of its girder
    assert any(x.startswith("  fail: L2-B2-20 (Level 2, W21X44): utilisation 1.11") for x in lines)
    assert any(x.startswith("  fail: R-G90-0 (Roof") for x in lines)
    assert any(x.startswith("  not checked: L2-B1-50 (Level 2): unstable") for x in lines)
    assert "elastic lateral-torsional buckling over Lb = 15.00 ft" in result.output
    # warnings name members by name and GUID
    assert "warning: R-S15 (" in result.output and "strut line R-S15 reaches" in result.output
    assert "note: no settings file" not in result.output  # a settings file was given


def test_defaults_are_said_and_long_lists_are_cut(tmp_path):
    result = run("check", str(SAMPLES / "quillfeather-rev-b.ifc"), "--out", str(tmp_path))
    # the documented defaults (config.py): 60 psf dead, 100 psf live, the roof included
    note = [x for x in result.output.splitlines() if x.startswith("note: ")]
    assert len(note) == 1 and "60 psf" in note[0] and "100 psf" in note[0]
    listed = [x for x in result.output.splitlines() if x.startswith(("  fail:", "  not checked:"))]
    doc = json.loads((tmp_path / "quillfeather-rev-b.results.json").read_text())
    flagged = doc["summary"]["fail"] + doc["summary"]["not_checked"]
    assert flagged > 10 and len(listed) == 10
    assert f"  and {flagged - 10} more (see the report)" in result.output


def test_diff_lines_are_words_said_once(tmp_path):
    result = run("diff", str(SAMPLES / "quillfeather-rev-a.ifc"),
                 str(SAMPLES / "quillfeather-rev-b.ifc"), "--config",
                 str(SAMPLES / "quillfeather.toml"), "--out", str(tmp_path))  # fmt: skip
    out = result.output
    assert "not_checked" not in out and "status" not in out  # words, not tokens
    assert "  removed: R-B3-15 (Roof, W12X40)" in out  # the deleted roof infill, by name
    assert "because R-B3-15 was removed" in out  # its neighbours' strips grew
    assert "L2-G30-30" in out and "no longer reaches it" in out  # not shown as improved
    for line in out.splitlines():
        if line.startswith("  weakened:") or line.startswith("  changed:"):
            parts = line.split(": ", 2)[2].split("; ")
            assert len(parts) == len(set(parts))


def test_diff_warns_when_models_share_no_beams(tmp_path):
    result = run("diff", str(SAMPLES / "brambleford.ifc"),
                 str(SAMPLES / "quillfeather-rev-a.ifc"), "--out", str(tmp_path))  # fmt: skip
    assert "share no beams" in result.output and "not revisions of one model" in result.output
    assert "share no beams" in (tmp_path / "diff.html").read_text()
