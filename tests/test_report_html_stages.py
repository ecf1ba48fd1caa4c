"""The report shows both stages when the settings declare a construction stage (the demo)."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.report.basis import combinations, level_loads
from ifccheck.report.html_out import report_html

SAMPLES = Path(__file__).parents[1] / "sample_models"


@pytest.fixture(scope="module")
def demo():
    result, _, _ = run_check(
        SAMPLES / "quillfeather-rev-b.ifc", load_settings(SAMPLES / "quillfeather.toml")
    )
    return result, report_html(result, "imperial")


def _cells(row_html: str) -> list[str]:
    return [re.sub(r"<[^>]+>", "", c) for c in re.findall(r"<td[^>]*>(.*?)</td>", row_html)]


def test_summary_counts_per_stage(demo):
    result, page = demo
    assert len(result.stages) == 2
    fails = [b for b in result.beams if b.outcome == "fail"]
    in_service = [b for b in fails if b.stage_result("in_service").outcome == "fail"]
    only_construction = [b for b in fails if b.stage_result("in_service").outcome != "fail"]
    assert only_construction and all(
        b.stage_result("construction").outcome == "fail" for b in only_construction
    )
    summary = page.split('id="stage-summary"', 1)[1].split("</div>", 1)[0]
    assert (
        f"{len(in_service)} beams fail in service; {len(only_construction)} more fail only "
        "during construction" in summary
    )
    rows = re.findall(r"<tr>(.*?)</tr>", summary.split("<tbody>", 1)[1])
    for row, st in zip(rows, result.stages, strict=True):
        cells = _cells(row)
        assert cells[0] == st.title
        assert [int(c) for c in cells[3:8]] == [
            st.summary[k] for k in ("total", "pass", "fail", "not_checked", "governing")
        ]
    # a construction-only failure is said to be one in the list of what needs attention
    attention = page.split("Needs attention", 1)[1].split("</div>", 1)[0]
    assert "fails only during construction" in attention


def test_basis_of_each_stage(demo):
    result, page = demo
    basis = page.split('<section id="basis">', 1)[1].split("</section>", 1)[0]
    construction = basis.split('id="basis-construction"', 1)[1]
    service = basis.split('id="basis-construction"', 1)[0]
    for c in combinations(result, 1):
        assert f"<td>{c.name}</td>" in construction
    for c in combinations(result, 0):
        assert f"<td>{c.name}</td>" in service
    # the construction combinations are not the in-service ones
    assert {c.name for c in combinations(result, 1)} != {c.name for c in combinations(result, 0)}
    for x in level_loads(result, 1):
        assert f"<td>{x.what}</td>" in construction


def test_governing_stage_per_beam_in_table(demo):
    result, page = demo
    table = page.split('id="beam-table"', 1)[1].split("</table>", 1)[0]
    assert "Governing stage" in table
    stages = dict(re.findall(r'<tr data-guid="([^"]+)"[^>]*data-stage="([^"]+)"', table))
    assert stages
    for b in result.beams:
        if b.guid in stages:
            assert stages[b.guid] == b.stage.replace("_", " ")
