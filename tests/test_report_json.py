"""The JSON results and diff documents: schema, SI values, no NaN, atomic writes."""

from __future__ import annotations

import json
import math
from pathlib import Path

import jsonschema
import pytest
import result_fixtures as rf

from ifccheck.atomic import atomic_path, write_text
from ifccheck.report.json_out import (
    DIFF_SCHEMA,
    RESULTS_SCHEMA,
    diff_document,
    results_document,
    write_diff_json,
    write_results_json,
)

BRIEF_BEAM_KEYS = {
    "guid", "name", "storey", "profile", "grade", "fy", "span", "supports", "brace_points",
    "continuous_bracing", "segments", "governing_segment", "flexure_utilisation",
    "shear_utilisation", "deflection_utilisation", "strength_utilisation", "utilisation",
    "controlling_limit", "outcome", "notes", "reason", "demand",
}  # fmt: skip
SEGMENT_KEYS = {
    "start", "end", "lb", "cb", "moment_demand", "moment_capacity", "utilisation", "limit_state",
    "load_combination",
}  # fmt: skip


def _strict_load(path: Path):
    """json.load that refuses NaN and Infinity (they are not JSON, RFC 8259 §6)."""

    def refuse(name: str):
        raise ValueError(f"non-JSON constant {name}")

    return json.loads(path.read_text(encoding="utf-8"), parse_constant=refuse)


def _validator(path: Path) -> jsonschema.Draft202012Validator:
    schema = json.loads(path.read_text())
    jsonschema.Draft202012Validator.check_schema(schema)
    return jsonschema.Draft202012Validator(schema)


@pytest.mark.parametrize("detail", [False, True])
def test_results_json_validates_against_schema(tmp_path, detail):
    path = write_results_json(rf.check_result(), tmp_path / "m.results.json", detail=detail)
    doc = _strict_load(path)
    errors = list(_validator(RESULTS_SCHEMA).iter_errors(doc))
    assert errors == []
    assert ("curve" in doc["beams"][0]) is detail


def test_schema_is_strict_so_undocumented_keys_fail():
    doc = results_document(rf.check_result())
    doc["beams"][0]["surprise"] = 1
    v = _validator(RESULTS_SCHEMA)
    assert not v.is_valid(doc)
    doc = results_document(rf.check_result())
    doc["beams"][1]["outcome"] = "ok"  # not one of the three outcomes
    assert not v.is_valid(doc)


def test_results_carry_the_contract_keys_and_summary():
    result = rf.check_result()
    doc = results_document(result)
    for key in ("tool", "version", "model", "settings", "summary", "beams", "standard",
                "method", "checked_at", "warnings", "caution"):  # fmt: skip
        assert key in doc
    assert set(doc["model"]) >= {"file", "schema", "sha256"}
    s = doc["summary"]
    assert {k: s[k] for k in ("pass", "fail", "not_checked", "total")} == {
        "pass": 2, "fail": 1, "not_checked": 1, "total": 4
    }  # fmt: skip
    assert s["not_checked_by_reason"] == {"profile_not_in_table": 1}
    assert s["load_balance"] == [] and s["assumed_grade"] is None
    for b in doc["beams"]:
        assert BRIEF_BEAM_KEYS <= set(b)
        for s in b["segments"]:
            assert SEGMENT_KEYS <= set(s)
        if b["governing_segment"] is not None:
            gov = b["segments"][b["governing_segment"]]
            assert gov["utilisation"] == max(s["utilisation"] for s in b["segments"])
            assert b["flexure_utilisation"] == gov["utilisation"]
            parts = (b["flexure_utilisation"], b["shear_utilisation"])
            assert b["strength_utilisation"] == max(parts)
            assert b["utilisation"] == max(*parts, b["deflection_utilisation"])
    not_checked = next(b for b in doc["beams"] if b["outcome"] == "not_checked")
    assert not_checked["reason"] and not_checked["utilisation"] is None
    assert not_checked["segments"] == [] and not_checked["governing_segment"] is None


def test_values_are_si_base_units():
    doc = results_document(rf.check_result())
    b2 = next(b for b in doc["beams"] if b["name"] == "B-2")
    gov = b2["segments"][b2["governing_segment"]]
    # 1 ft = 0.3048 m exactly (NIST SP 811); the middle segment runs 7.5 ft to 22.5 ft
    assert gov["lb"] == pytest.approx(15 * 0.3048, rel=1e-12)
    assert gov["start"] == pytest.approx(7.5 * 0.3048, rel=1e-12)
    # A992 Fy = 50 ksi (ASTM A992); 1 ksi = 6.894757293168e6 Pa (NIST SP 811)
    assert b2["fy"] == pytest.approx(50 * 6.894757293168e6, rel=1e-12)
    assert gov["limit_state"] == "elastic_ltb"
    assert doc["units"]["moment"] == "N·m"
    loads = b2["demand"]["point_loads"]
    assert loads and loads[0]["source"] == rf.guids()["s1"]


def test_nan_and_infinity_become_null(tmp_path):
    result = rf.check_result()
    result.beams[0].shear_utilisation = float("nan")
    result.beams[0].segments[0].cb = float("inf")
    path = write_results_json(result, tmp_path / "r.json")
    doc = _strict_load(path)
    assert doc["settings"]["odd"] is None  # the fixture's settings carry a NaN
    assert doc["beams"][0]["shear_utilisation"] is None
    assert doc["beams"][0]["segments"][0]["cb"] is None
    assert _validator(RESULTS_SCHEMA).is_valid(doc)


def test_one_beam_per_line(tmp_path):
    result = rf.check_result()
    text = write_results_json(result, tmp_path / "r.json").read_text()
    beam_lines = [ln for ln in text.splitlines() if ln.lstrip().startswith('{"guid"')]
    assert len(beam_lines) == len(result.beams) + len(result.slabs)


def test_diff_json_validates_and_orders_weakened_first(tmp_path):
    diff = rf.diff_result()
    path = write_diff_json(diff, tmp_path / "diff.json")
    doc = _strict_load(path)
    assert list(_validator(DIFF_SCHEMA).iter_errors(doc)) == []
    changes = list(doc["beams"].values())
    assert changes[0]["change"] == "weakened"
    assert set(doc["beams"]) == {c.guid for c in diff.changes}
    assert all(doc["beams"][g]["guid"] == g for g in doc["beams"])
    reg = changes[0]
    assert reg["lost_brace_points"] == [pytest.approx(15 * 0.3048)]
    assert reg["lb_before"] == pytest.approx(7.5 * 0.3048)
    assert reg["lb_after"] == pytest.approx(15 * 0.3048)
    assert (reg["outcome_before"], reg["outcome_after"]) == ("pass", "fail")
    s = doc["summary"]
    assert (s["weakened"], s["strengthened"], s["added"], s["removed"]) == (1, 1, 1, 1)
    assert s["new_failures"] == 1 and doc["matched"] == 3
    assert doc["added"] == diff.added and doc["removed"] == diff.removed
    bad = diff_document(diff)
    next(iter(bad["beams"].values()))["change"] = "worse"
    assert not _validator(DIFF_SCHEMA).is_valid(bad)


def test_atomic_write_keeps_old_file_on_failure(tmp_path):
    target = tmp_path / "out.json"
    write_text(target, "old")
    with pytest.raises(RuntimeError), atomic_path(target) as tmp:
        tmp.write_text("half")
        raise RuntimeError("disk full")
    assert target.read_text() == "old"
    assert [p.name for p in tmp_path.iterdir()] == ["out.json"]  # no temporary left behind


def test_many_beams_write(tmp_path):
    # speed is measured by benchmarks/bench_outputs.py, not asserted here
    result = rf.many_beams(2_000)
    path = write_results_json(result, tmp_path / "big.json")
    doc = json.loads(path.read_text())
    assert len(doc["beams"]) == 2_000
    assert all(math.isfinite(b["length"]) for b in doc["beams"][:100])
