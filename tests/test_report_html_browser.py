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
