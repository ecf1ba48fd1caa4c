"""Both stages in the outputs: JSON, CSV, the property sets and the BCF topics.

Models: the pour bay of tests/stage_builders.py (our own; B10 fails only during
construction, at 2.03, B20 fails in both stages) and the demo's revision A with
sample_models/quillfeather.toml (72 beams, 21 failing, every failure construction-only).
Expected values come from the result objects of the same run, and the construction
utilisation of the W21X44 at 10 ft centres over 30 ft from the hand calculation of
tests/test_construction_stage.py (ASCE 37-14 §2.2 (from memory) with ASCE 7-16 §2.3.1
(2), 1.2D + 1.6C; AISC 360-16 Eqs. F1-1, F2-3 and F2-4): 2.03.
"""

from __future__ import annotations

import json
from pathlib import Path

import jsonschema
import pytest
from stage_builders import pour_bay_result

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.report.json_out import RESULTS_SCHEMA, results_document, write_results_json

SAMPLES = Path(__file__).parents[1] / "sample_models"
PSF = 47.88025898  # Pa (NIST SP 811)
HAND_RATIO = 2.03  # tests/test_construction_stage.py, worked by hand


@pytest.fixture(scope="module")
def bay(tmp_path_factory):
    model, result = pour_bay_result(tmp_path_factory.mktemp("bay") / "bay.ifc")
    return model, result, {b.name: b for b in result.beams}


@pytest.fixture(scope="module")
def demo():
    result, _, _ = run_check(
        SAMPLES / "quillfeather-rev-a.ifc", load_settings(SAMPLES / "quillfeather.toml")
    )
    return result, {b.name: b for b in result.beams}


def _validator() -> jsonschema.Draft202012Validator:
    return jsonschema.Draft202012Validator(json.loads(RESULTS_SCHEMA.read_text()))


# --- JSON ------------------------------------------------------------------------------
def test_json_beam_stages_match_the_result(bay):
    _, result, beams = bay
    doc = results_document(result)
    assert list(_validator().iter_errors(doc)) == []
    by_name = {b["name"]: b for b in doc["beams"]}
    b10, obj = by_name["B10"], beams["B10"]
    assert (b10["stage"], b10["outcome"]) == ("construction", "fail")
    service, construction = b10["stages"]
    assert service["stage"] == "in_service" and service["outcome"] == "pass"
    assert construction["stage"] == "construction" and construction["outcome"] == "fail"
    assert construction["utilisation"] == pytest.approx(HAND_RATIO, abs=0.01)
    st = obj.stage_result("construction")
    assert st is not None and st.governing_segment is not None
    assert construction["governing_segment"] == st.governing_segment
    seg = b10["segments"][construction["governing_segment"]]
    assert seg["stage"] == "construction" and not seg["continuous"]
    assert seg["lb"] == pytest.approx(30 * 0.3048, abs=0.01)
    assert construction["load_combination"] == seg["load_combination"] == "1.2D+1.6C"
    assert construction["controlling_limit"] == "flexure"
    assert construction["deflection_utilisation"] is None  # strength only during the pour
    # the top-level figures are the governing (construction) stage's
    assert b10["utilisation"] == construction["utilisation"]
    assert b10["governing_segment"] == construction["governing_segment"]
    # in service the slab braces the top flange; its own governing segment says so
    sseg = b10["segments"][service["governing_segment"]]
    assert sseg["stage"] == "in_service"
    assert service["utilisation"] == pytest.approx(obj.stages[0].utilisation)
    assert service["utilisation"] < 1.0
    # the construction demand: wet concrete and construction live load on the beam
    cases = {x["case"] for x in construction["demand"]["line_loads"]}
    assert cases == {"D", "C"}
    # B20 fails in both stages
    assert [s["outcome"] for s in by_name["B20"]["stages"]] == ["fail", "fail"]


def test_json_design_basis_per_stage(bay):
    _, result, _ = bay
    stages = results_document(result)["basis"]["stages"]
    assert [s["stage"] for s in stages] == ["in_service", "construction"]
    service, construction = stages
    assert construction["slab_bracing"] is False and construction["levels"] == ["Level 2"]
    combos = {c["name"]: c for c in construction["combinations"]}
    assert set(combos) == {"1.4D", "1.2D+1.6C"}
    assert combos["1.2D+1.6C"]["number"] == "2"
    assert combos["1.2D+1.6C"]["factors"] == {"D": 1.2, "C": 1.6}
    assert "ASCE 37-14" in combos["1.2D+1.6C"]["source"]
    assert "ASCE 7-16 §2.3.1 (2)" in combos["1.2D+1.6C"]["source"]
    assert all(c["purpose"] == "strength" for c in construction["combinations"])
    # in service: ASCE 7-16 §2.3.1 by number, then the deflection combinations
    numbers = {c["name"]: c["number"] for c in service["combinations"]}
    assert numbers["1.4D"] == "1" and numbers["1.2D+1.6L"] == "2"
    assert {"L", "D+L"} <= set(numbers)
    loads = {(x["case"], x["load"]): x for x in construction["loads"]}
    # the wet concrete from the 5.5 in slab at 2400 kg/m³: one row for the one slab
    wet = loads[("D", "wet concrete")]
    assert wet["pressure"] == pytest.approx(5.5 * 0.0254 * 2400 * 9.80665, rel=1e-6)
    assert wet["source"] == "slab:0.1397"
    assert loads[("C", "construction live")]["pressure"] == pytest.approx(20 * PSF, rel=1e-6)
    assert loads[("C", "construction live")]["source"] == "construction.live"
    assert not loads[("C", "construction live")]["default"]  # the settings give it
    rows = {(r["level"], r["case"]): r for r in construction["load_balance"]}
    assert rows[("Level 2", "C")]["applied"] == pytest.approx(900 * 0.3048**2 * 20 * PSF)
    assert construction["summary"] == {
        "pass": 2, "fail": 4, "not_checked": 0, "total": 6, "governing": 4
    }  # fmt: skip
    # the in-service basis is the one the document gave before, now with slab and number
    doc = results_document(result)["basis"]
    assert doc["loads"] == service["loads"] and doc["combinations"] == service["combinations"]


def test_json_demo_validates_and_shows_the_pour_failures(demo, tmp_path):
    result, beams = demo
    path = write_results_json(result, tmp_path / "a.results.json", detail=True)
    doc = json.loads(path.read_text(encoding="utf-8"))
    assert list(_validator().iter_errors(doc)) == []
    failing = [b for b in doc["beams"] if b["outcome"] == "fail"]
    assert len(failing) == 21
    for b in failing:  # every failure of revision A is construction-only
        assert b["stage"] == "construction"
        assert [s["outcome"] for s in b["stages"]] == ["pass", "fail"]
    b = next(x for x in doc["beams"] if x["name"] == "L2-B1-10")
    construction = b["stages"][1]
    assert construction["utilisation"] == pytest.approx(HAND_RATIO, abs=0.01)
    assert construction["utilisation"] == beams["L2-B1-10"].stage_result("construction").utilisation
    assert construction["diagram"] is not None and construction["curve"]
    # a roof beam is checked in service only (no concrete poured on the roof)
    roof = next(x for x in doc["beams"] if x["name"] == "R-B1-7.5")
    assert [s["stage"] for s in roof["stages"]] == ["in_service"]
    basis = doc["basis"]["stages"]
    assert basis[1]["summary"]["fail"] == 21 and basis[1]["levels"] == ["Level 2"]


def test_json_without_a_stage_breakdown_is_its_in_service_stage():
    import result_fixtures as rf

    result = rf.check_result()
    doc = results_document(result)
    assert list(_validator().iter_errors(doc)) == []
    for b, out in zip(result.beams, doc["beams"], strict=True):
        assert [s["stage"] for s in out["stages"]] == ["in_service"]
        assert out["stages"][0]["outcome"] == b.outcome
        assert out["stages"][0]["utilisation"] == b.utilisation
    assert doc["basis"]["stages"] == []


# --- CSV -------------------------------------------------------------------------------
def _csv(result, units: str) -> dict[str, dict[str, str]]:
    import csv
    import io

    from ifccheck.report.csv_out import beams_csv

    return {r["name"]: r for r in csv.DictReader(io.StringIO(beams_csv(result, units)))}


def test_csv_stage_columns_match_the_result(bay):
    _, result, beams = bay
    rows = _csv(result, "imperial")
    b10, obj = rows["B10"], beams["B10"]
    assert b10["governing_stage"] == "construction" and b10["outcome"] == "fail"
    assert (b10["in_service_outcome"], b10["construction_outcome"]) == ("pass", "fail")
    assert float(b10["construction_utilisation"]) == pytest.approx(HAND_RATIO, abs=0.01)
    for stage in ("in_service", "construction"):
        st = obj.stage_result(stage)
        assert st is not None and st.governing_segment is not None
        seg = obj.segments[st.governing_segment]
        assert float(b10[f"{stage}_utilisation"]) == pytest.approx(st.utilisation, rel=1e-5)
        assert float(b10[f"{stage}_lb_ft"]) == pytest.approx(seg.lb / 0.3048, rel=1e-5)
        assert b10[f"{stage}_load_combination"] == seg.load_combination
    assert float(b10["construction_lb_ft"]) == pytest.approx(30.0, abs=0.01)
    assert float(b10["in_service_lb_ft"]) == 0.0  # the slab braces the top flange
    assert b10["construction_load_combination"] == "1.2D+1.6C"
    assert (rows["B20"]["in_service_outcome"], rows["B20"]["construction_outcome"]) == (
        "fail", "fail"
    )  # fmt: skip
    si = _csv(result, "si")["B10"]
    assert float(si["construction_lb_m"]) == pytest.approx(30 * 0.3048, abs=0.003)


def test_csv_demo_pour_failures_and_empty_cells(demo):
    result, beams = demo
    rows = _csv(result, "imperial")
    failing = [r for r in rows.values() if r["outcome"] == "fail"]
    assert len(failing) == 21
    assert all(r["governing_stage"] == "construction" for r in failing)
    assert all((r["in_service_outcome"], r["construction_outcome"]) == ("pass", "fail")
               for r in failing)  # fmt: skip
    roof = rows["R-B1-7.5"]  # checked in service only: the construction cells are empty
    assert roof["in_service_outcome"] == "pass" and roof["governing_stage"] == "in_service"
    for col in ("construction_outcome", "construction_utilisation", "construction_lb_ft",
                "construction_load_combination"):  # fmt: skip
        assert roof[col] == ""
    assert float(rows["L2-B1-10"]["construction_utilisation"]) == pytest.approx(
        beams["L2-B1-10"].stage_result("construction").utilisation, rel=1e-5
    )


# --- property sets -----------------------------------------------------------------------
@pytest.mark.parametrize("schema", ["IFC2X3", "IFC4"])
def test_psets_carry_the_governing_stage_and_the_construction_figures(tmp_path, schema):
    from test_writeback import _check_copy, _props

    model, result = pour_bay_result(tmp_path / "bay.ifc", schema)
    copy = _check_copy(model, tmp_path / "bay.checked.ifc", result)  # valid IFC
    beams = {b.name: b for b in result.beams}
    b10 = beams["B10"]
    props = _props(copy, b10.guid)
    value = {k: p.NominalValue.wrappedValue for k, p in props.items()}
    kind = {k: p.NominalValue.is_a() for k, p in props.items()}
    assert value["GoverningStage"] == "construction" and kind["GoverningStage"] == "IfcLabel"
    assert value["Outcome"] == "fail"
    assert (value["InServiceOutcome"], value["ConstructionOutcome"]) == ("pass", "fail")
    assert kind["ConstructionOutcome"] == "IfcLabel"
    assert kind["ConstructionUtilisation"] == kind["InServiceUtilisation"] == "IfcRatioMeasure"
    assert value["ConstructionUtilisation"] == pytest.approx(HAND_RATIO, abs=0.01)
    assert value["ConstructionUtilisation"] == pytest.approx(
        b10.stage_result("construction").utilisation
    )
    assert value["InServiceUtilisation"] == pytest.approx(
        b10.stage_result("in_service").utilisation
    )
    # the model is in feet: Lb = 30 ft in the file's unit
    assert kind["ConstructionUnbracedLength"] == "IfcLengthMeasure"
    assert value["ConstructionUnbracedLength"] == pytest.approx(30.0, abs=0.01)
    assert value["ConstructionLoadCombination"] == "1.2D+1.6C"
    b20 = {k: p.NominalValue.wrappedValue for k, p in _props(copy, beams["B20"].guid).items()}
    assert (b20["InServiceOutcome"], b20["ConstructionOutcome"]) == ("fail", "fail")
    assert not any(n.startswith("Pset_") for n in {p.Name for p in copy.by_type("IfcPropertySet")})


def test_psets_demo_construction_only_failures(tmp_path, demo):
    import ifcopenshell
    import ifcopenshell.util.element

    from ifccheck.ifc.writeback import PSET_NAME, write_checked_ifc

    result, beams = demo
    out = write_checked_ifc(SAMPLES / "quillfeather-rev-a.ifc", result, tmp_path / "a.ifc")
    copy = ifcopenshell.open(str(out))
    for b in result.beams:
        p = ifcopenshell.util.element.get_psets(copy.by_guid(b.guid))[PSET_NAME]
        assert p["GoverningStage"] == b.stage
        if b.outcome == "fail":  # every failure of revision A is construction-only
            assert (p["InServiceOutcome"], p["ConstructionOutcome"]) == ("pass", "fail")
        if b.stage_result("construction") is None:  # the roof, the canopy
            assert not any(k.startswith("Construction") for k in p)
    p = ifcopenshell.util.element.get_psets(copy.by_guid(beams["L2-B1-10"].guid))[PSET_NAME]
    assert p["ConstructionUtilisation"] == pytest.approx(HAND_RATIO, abs=0.01)


# --- BCF -------------------------------------------------------------------------------
def _bcf_topics(result, path: Path) -> dict[str, object]:
    from test_report_bcf import _topics

    from ifccheck.report.bcf_out import write_issues_bcf

    topics = _topics(write_issues_bcf(result, path, "imperial"))
    return {guids[0]: t.topic for t, guids in topics if len(guids) == 1}


def test_bcf_construction_only_and_both_stages(bay, tmp_path):
    _, result, beams = bay
    topics = _bcf_topics(result, tmp_path / "bay.bcf")
    b10 = topics[beams["B10"].guid]
    assert b10.title.startswith("B10 (W21X44, Level 2) fails during construction")
    assert "elastic lateral-torsional buckling" in b10.title
    assert b10.title.endswith("passes in service")
    text = b10.description
    assert text.startswith("This beam fails during construction")
    assert "passes in service (utilisation" in text
    assert "Lb = 30.00 ft" in text and "under 1.2D+1.6C" in text  # the construction segment
    assert "segment 1 of 1" in text  # counted among the construction stage's segments
    assert "deck is not attached" in text
    # the remedies as the engineer's options, not as instructions
    assert "for the engineer to choose from: shoring the beam" in text
    assert "deck fastened to the beam before the pour" in text
    assert "In service:" not in text  # nothing fails in service
    b20 = topics[beams["B20"].guid]
    assert "fails in service in deflection" in b20.title
    assert "and during construction in elastic lateral-torsional buckling" in b20.title
    assert "In service: live-load deflection" in b20.description
    assert "During construction: the governing length" in b20.description
    assert "for the engineer to choose from: shoring" in b20.description
    # the girders pass in both stages: no topic
    assert beams["G0"].guid not in topics


def test_bcf_demo_pour_failures_say_so(demo, tmp_path):
    result, beams = demo
    topics = _bcf_topics(result, tmp_path / "a.bcf")
    failing = [b for b in result.beams if b.outcome == "fail"]
    assert len(failing) == 21
    for b in failing:
        t = topics[b.guid]
        assert "fails during construction (wet concrete)" in t.title
        assert t.title.endswith("; passes in service")
        assert "shoring the beam" in t.description
    t = topics[beams["L2-B1-10"].guid]
    assert t.title == (
        "L2-B1-10 (W21X44, Level 2) fails during construction (wet concrete) in elastic "
        "lateral-torsional buckling, utilisation 2.04; passes in service"
    )  # 2.034 (the hand value 2.03) shown rounded up
    assert "Lb = 30.00 ft" in t.description and "under 1.2D+1.6C" in t.description


# --- the revision comparison -------------------------------------------------------------
def test_diff_outputs_name_the_stage_of_each_change(demo, tmp_path):
    import csv

    from ifccheck.diff import diff_results
    from ifccheck.report.csv_out import write_diff_csv
    from ifccheck.report.json_out import DIFF_SCHEMA, diff_document

    old, _ = demo
    new, _, _ = run_check(
        SAMPLES / "quillfeather-rev-b.ifc", load_settings(SAMPLES / "quillfeather.toml")
    )
    diff = diff_results(old, new)
    doc = diff_document(diff, "imperial")
    jsonschema.validate(doc, json.loads(DIFF_SCHEMA.read_text()))
    change = next(c for c in diff.changes if c.name == "L2-B1-40")
    out = doc["beams"][change.guid]
    assert out["stage"] == change.stage
    rose = {x["stage"]: x for x in out["causes"] if x["kind"] == "utilisation_rose"}
    assert set(rose) == {"in_service", "construction"}  # its wider strip, in both stages
    for stage, x in rose.items():
        before = old.beams[[b.guid for b in old.beams].index(change.old_guid)]
        after = new.beams[[b.guid for b in new.beams].index(change.guid)]
        assert x["before"] == pytest.approx(before.stage_result(stage).utilisation)
        assert x["after"] == pytest.approx(after.stage_result(stage).utilisation)
    words = out["reasons"]
    assert any(w.startswith("its utilisation in service rose from") for w in words)
    assert any(w.startswith("its utilisation during construction rose from 2.04") for w in words)
    # a roof beam, checked in service only in both revisions, says no stage
    roof = next(c for c in doc["beams"].values() if c["name"] == "R-G90-0")
    assert all("in service" not in w and "construction" not in w for w in roof["reasons"])
    path = write_diff_csv(diff, tmp_path / "diff.csv", "imperial")
    with path.open(newline="") as fh:
        rows = {r["name"]: r for r in csv.DictReader(fh)}
    assert rows["L2-B1-40"]["stage"] == change.stage
    assert "during construction rose" in rows["L2-B1-40"]["reasons"]


# --- the design basis per stage ------------------------------------------------------------
def test_basis_functions_take_a_stage_by_index_or_name(demo):
    from ifccheck.report.basis import combinations, level_loads, load_source_text
    from ifccheck.report.display import DisplayUnits

    result, _ = demo
    assert level_loads(result, "construction") == level_loads(result, 1)
    assert level_loads(result, "in_service") == level_loads(result) == level_loads(result, 0)
    loads = level_loads(result, "construction")
    # Level 2's two slabs (the floor and the balcony) are both 5.5 in: one wet-concrete row
    wet = [x for x in loads if x.what == "wet concrete"]
    assert [(x.level, x.case, x.source) for x in wet] == [("Level 2", "D", "slab:0.1397")]
    assert wet[0].pressure == pytest.approx(0.1397 * 2400 * 9.80665, rel=1e-6)
    words = load_source_text(DisplayUnits("imperial"), wet[0], result)
    assert words.startswith("modelled slab 5.5") and "(default density)" in words
    live = next(x for x in loads if x.case == "C")
    assert live.pressure == pytest.approx(20 * PSF, rel=1e-6)  # the demo settings' 20 psf
    assert not any(x.what == "slab self-weight" for x in loads)  # in service only
    names = [(c.name, c.number, c.purpose) for c in combinations(result, "construction")]
    assert names == [("1.4D", "1", "strength"), ("1.2D+1.6C", "2", "strength")]
    assert combinations(result, "in_service") == combinations(result)
    assert {"L", "D+L"} <= {c.name for c in combinations(result)}
