"""The HTML report rendered in headless Chromium: plans drawn, one shape per beam, offline."""

from __future__ import annotations

from collections import Counter
from pathlib import Path

import pytest
import result_fixtures as rf

from ifccheck.report.html_out import write_diff_html, write_report_html

CHROMIUM = Path("/usr/bin/chromium")
ARGS = [
    "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync",
]  # fmt: skip

if not CHROMIUM.exists():
    pytest.skip(
        "needs Debian's chromium package (apt-get install chromium)", allow_module_level=True
    )
sync_api = pytest.importorskip("playwright.sync_api")


@pytest.fixture(scope="module")
def browser():
    with sync_api.sync_playwright() as p:
        b = p.chromium.launch(executable_path=str(CHROMIUM), args=ARGS)
        yield b
        b.close()


def _open(browser, path: Path):
    page = browser.new_page(viewport={"width": 1100, "height": 900})
    requests: list[str] = []
    page.on("request", lambda r: requests.append(r.url))
    page.goto(path.as_uri())
    page.wait_for_load_state("load")
    return page, requests


def test_report_renders_one_shape_per_beam(browser, tmp_path):
    result = rf.check_result()
    path = write_report_html(result, tmp_path / "m.report.html", "imperial")
    page, requests = _open(browser, path)
    page.screenshot(path=str(tmp_path / "report.png"), full_page=True)
    assert (tmp_path / "report.png").stat().st_size > 10_000
    assert requests == [path.as_uri()]  # nothing fetched but the page itself
    per_storey = page.evaluate(
        """() => Object.fromEntries([...document.querySelectorAll('figure.storey')].map(f =>
             [f.dataset.storey, [...f.querySelectorAll('svg.plan [data-guid]')]
               .map(e => e.getAttribute('data-guid'))]))"""
    )
    expected = Counter()
    for b in result.beams:
        expected[b.storey] += 1
    assert {k: len(v) for k, v in per_storey.items()} == dict(expected)
    assert sorted(g for v in per_storey.values() for g in v) == sorted(b.guid for b in result.beams)
    # each beam shape is drawn with a size: a line of real length on the screen
    sizes = page.evaluate(
        """() => [...document.querySelectorAll('svg.plan line.beam')].map(e => {
             const r = e.getBoundingClientRect(); return Math.max(r.width, r.height); })"""
    )
    assert len(sizes) == len(result.beams) and min(sizes) > 50
    page.close()


def test_diff_renders_crosses_at_lost_brace_points(browser, tmp_path):
    diff = rf.diff_result()
    path = write_diff_html(diff, tmp_path / "diff.html", "si")
    page, requests = _open(browser, path)
    page.screenshot(path=str(tmp_path / "diff.png"), full_page=True)
    assert requests == [path.as_uri()]
    n_beams = page.locator("svg.plan [data-guid]").count()
    assert n_beams == len(diff.new.beams)
    crosses = page.locator("svg.plan path.lost-brace").count()
    assert crosses == sum(len(c.lost_brace_points) for c in diff.changes)
    page.close()


def _visible_names(page) -> list[str]:
    return page.evaluate(
        """() => [...document.querySelectorAll('#beam-table tbody tr')]
             .filter(r => !r.hidden).map(r => r.dataset.name)"""
    )


def test_beam_table_sorts_filters_and_finds(browser, tmp_path):
    result = rf.check_result()
    path = write_report_html(result, tmp_path / "m.report.html", "imperial")
    page, requests = _open(browser, path)
    assert requests == [path.as_uri()]
    assert page.locator("#beam-filters").is_visible()  # the script ran: the filters show
    assert page.inner_text("#beam-count") == "4 of 4 beams"
    by_u = sorted((b for b in result.beams if b.utilisation is not None),
                  key=lambda b: b.utilisation)  # fmt: skip
    page.click("button.sort[data-key=utilisation]")
    names = _visible_names(page)
    assert names[0] == "B-3"  # not checked: no utilisation, sorted first
    assert names[1:] == [b.name for b in by_u]
    page.click("button.sort[data-key=utilisation]")
    assert _visible_names(page)[:3] == [b.name for b in reversed(by_u)]
    page.select_option("#filter-storey", "Level 3")
    assert sorted(_visible_names(page)) == ["B-3", "B-4"]
    assert page.inner_text("#beam-count") == "2 of 4 beams"
    page.select_option("#filter-storey", "")
    page.select_option("#filter-outcome", "fail")
    assert _visible_names(page) == ["B-2"]
    page.select_option("#filter-outcome", "")
    page.fill("#filter-text", rf.guids()["b4"][:10].lower())  # a GUID, in any case
    assert _visible_names(page) == ["B-4"]
    page.fill("#filter-text", "w24")  # a profile
    assert _visible_names(page) == ["B-1"]
    page.fill("#filter-text", "")
    # a failing beam on the plan leads to its details
    line = page.locator(f"svg.plan a[href='#beam-{rf.guids()['b2']}'] line.beam")
    line.evaluate("e => e.scrollIntoView({block: 'center'})")
    box = line.evaluate("e => { const r = e.getBoundingClientRect(); "
                        "return [r.left + 0.3 * r.width, r.top + r.height / 2]; }")  # fmt: skip
    page.mouse.click(*box)  # on the drawn line (a zero-height box to the browser)
    assert page.evaluate("location.hash") == f"#beam-{rf.guids()['b2']}"
    page.close()


def test_no_label_is_clipped_on_the_demo(browser, tmp_path):
    from ifccheck.check import run_check
    from ifccheck.config import load_settings

    samples = Path(__file__).parents[1] / "sample_models"
    result, _, _ = run_check(samples / "quillfeather-rev-b.ifc", load_settings(None))
    path = write_report_html(result, tmp_path / "demo.report.html", "imperial")
    page, _ = _open(browser, path)
    outside = page.evaluate(
        """() => [...document.querySelectorAll('svg.plan text, svg.chart text')].filter(t => {
             const s = t.ownerSVGElement.getBoundingClientRect(), r = t.getBoundingClientRect();
             return r.left < s.left - 0.5 || r.top < s.top - 0.5 ||
                    r.right > s.right + 0.5 || r.bottom > s.bottom + 0.5;
           }).map(t => t.textContent)"""
    )
    assert outside == []
    labels = page.evaluate("() => [...document.querySelectorAll('svg.plan text.label')].length")
    flagged = sum(b.outcome != "pass" for b in result.beams)
    assert labels == flagged  # every failing and not-checked beam is labelled
    # names show on hover: every beam shape carries a title starting with its name
    titles = page.evaluate(
        """() => [...document.querySelectorAll('svg.plan line.beam')]
             .map(e => e.querySelector('title').textContent)"""
    )
    assert sorted(t.split(" · ")[0] for t in titles) == sorted(b.name for b in result.beams)
    page.screenshot(path=str(tmp_path / "demo.png"), full_page=True)
    page.close()
