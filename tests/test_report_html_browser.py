"""The HTML report rendered in headless Chromium: plans drawn, one shape per beam, offline."""

from __future__ import annotations

import re
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
    if path.name.endswith(".report.html"):  # the check report's script says when it is done
        page.wait_for_function("document.documentElement.dataset.ready", timeout=30_000)
        assert page.evaluate("document.documentElement.dataset.ready") == "1"
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
    line = page.locator(f"svg.plan line.beam[data-guid='{rf.guids()['b2']}']")
    line.evaluate("e => e.scrollIntoView({block: 'center'})")
    box = line.evaluate("e => { const r = e.getBoundingClientRect(); "
                        "return [r.left + 0.3 * r.width, r.top + r.height / 2]; }")  # fmt: skip
    page.mouse.click(*box)  # on the drawn line (a zero-height box to the browser)
    assert page.evaluate("location.hash") == f"#beam-{rf.guids()['b2']}"
    # ... rendered there from the embedded data: diagram, curve, a cross at the segment
    detail = page.locator(f"#detail-view article#beam-{rf.guids()['b2']}")
    assert detail.count() == 1
    assert detail.locator("polyline.moment").count() == 1
    assert detail.locator("polyline.curve").count() == 1
    assert detail.locator("path.segment-mark").count() == 1  # it fails: a cross
    text = detail.inner_text()
    assert "Lb 15.00 ft" in text and "at 15.00 ft from the end at J3" in text
    assert "An opening in slab" in text and "W16X31" in text
    assert detail.locator("table.segments tr.governing").count() == 1
    # a passing beam opened from the table
    page.click("#beam-table a[href='#beam-" + rf.guids()["b1"] + "']")
    passing = page.locator(f"#detail-view article#beam-{rf.guids()['b1']}")
    assert passing.locator("circle.segment-mark").count() == 1  # it passes: a dot
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
    # every failing and not-checked beam is labelled where its label fits; the captions
    # count the others
    captions = page.evaluate(
        "() => [...document.querySelectorAll('figure.storey .label-count')].map(e => e.textContent)"
    )
    counts = [re.match(r"(\d+) of (\d+) ", c) for c in captions if c]
    assert sum(int(m.group(1)) for m in counts) == labels
    assert sum(int(m.group(2)) for m in counts) == flagged and labels >= flagged - 2
    # names show on hover: the hover text of a beam starts with its name
    first = page.locator("svg.plan line.beam").first
    guid = first.get_attribute("data-guid")
    first.dispatch_event("mouseover")
    tip = page.inner_text("#plan-tip")
    assert tip.split(" · ")[0] == next(b.name for b in result.beams if b.guid == guid)
    page.screenshot(path=str(tmp_path / "demo.png"), full_page=True)
    page.close()


def _label_boxes(page) -> list[list[float]]:
    return page.evaluate(
        """() => [...document.querySelectorAll('svg.plan text.label')].map(t => {
             const r = t.getBoundingClientRect(); return [r.left, r.top, r.right, r.bottom]; })"""
    )


def _overlaps(boxes) -> list[tuple[int, int]]:
    return [
        (i, j)
        for i, a in enumerate(boxes)
        for j, b in enumerate(boxes[i + 1 :], i + 1)
        if a[0] < b[2] - 0.5 and b[0] < a[2] - 0.5 and a[1] < b[3] - 0.5 and b[1] < a[3] - 0.5
    ]


def test_crowded_plan_labels_never_overlap_and_zoom_labels_more(browser, tmp_path):
    result = rf.many_beams(400)
    for i, b in enumerate(result.beams):  # one storey, beams 0.5 m apart, every one failing
        b.storey, b.outcome, b.utilisation = "Level 2", "fail", 1.2 + i / 1000
        b.start, b.end = (0.0, 0.5 * i, 0.0), (60.0, 0.5 * i, 0.0)
    path = write_report_html(result, tmp_path / "crowded.report.html", "si")
    page, requests = _open(browser, path)
    assert requests == [path.as_uri()]
    before = _label_boxes(page)
    assert 0 < len(before) < 400 and _overlaps(before) == []
    caption = page.inner_text("figure.storey .label-count")
    assert f"{len(before)} of 400 failing or not-checked beams labelled" in caption
    size = page.evaluate("getComputedStyle(document.querySelector('svg.plan text.label')).fontSize")
    for _ in range(3):
        page.click("figure.storey button[data-zoom=in]")
    page.wait_for_timeout(400)  # labels are placed again once the zoom settles
    after = _label_boxes(page)
    assert after and _overlaps(after) == []
    # at 8x, labels keep their size on the screen
    height = sum(b[3] - b[1] for b in before) / len(before)
    assert abs(sum(b[3] - b[1] for b in after) / len(after) - height) < 3
    assert size == "11px"
    # the labels shown are within the drawing's view
    view = page.evaluate(
        "(() => { const r = document.querySelector('svg.plan').getBoundingClientRect();"
        " return [r.left, r.top, r.right, r.bottom]; })()"
    )
    assert all(b[0] >= view[0] - 1 and b[2] <= view[2] + 1 for b in after)
    page.click("figure.storey button[data-zoom=reset]")
    page.wait_for_timeout(200)
    reset = _label_boxes(page)  # placed again by the script: as many, give or take rounding
    assert _overlaps(reset) == [] and abs(len(reset) - len(before)) <= len(before) // 5
    page.close()


def test_table_pages_through_every_beam(browser, tmp_path):
    result = rf.many_beams(400)
    path = write_report_html(result, tmp_path / "many.report.html", "si")
    page, _ = _open(browser, path)
    assert page.inner_text("#beam-count") == "400 of 400 beams"
    assert page.inner_text("#page-text") == "page 1 of 8"
    seen = []
    for _ in range(8):
        seen += _visible_names(page)
        page.click("#page-next") if page.is_enabled("#page-next") else None
    assert len(seen) == 400
    page.select_option("#filter-outcome", "not_checked")
    assert page.inner_text("#beam-count") == "100 of 400 beams"
    assert page.inner_text("#page-text") == "page 1 of 2"
    page.close()


def test_without_scripts_the_summary_and_caution_show(browser, tmp_path):
    from ifccheck import CAUTION

    path = write_report_html(rf.check_result(), tmp_path / "m.report.html", "si")
    context = browser.new_context(java_script_enabled=False)
    page = context.new_page()
    page.goto(path.as_uri())
    assert page.locator("#summary .caution").is_visible()
    assert CAUTION in page.inner_text("#summary")
    assert page.locator("#summary table.counts").is_visible()
    assert page.locator("svg.plan line.beam").count() == len(rf.check_result().beams)
    context.close()


def test_demo_details_show_both_stages(browser, tmp_path):
    from ifccheck.check import run_check
    from ifccheck.config import load_settings

    samples = Path(__file__).parents[1] / "sample_models"
    result, _, _ = run_check(
        samples / "quillfeather-rev-b.ifc", load_settings(samples / "quillfeather.toml")
    )
    b = next(
        b for b in result.beams
        if b.outcome == "fail" and b.stage_result("in_service").outcome == "pass"
    )  # fmt: skip
    path = write_report_html(result, tmp_path / "demo.report.html", "imperial")
    page, _ = _open(browser, path)
    page.evaluate(f"location.hash = '#beam-{b.guid}'")
    article = page.locator(f"#detail-view article#beam-{b.guid}")
    article.wait_for()
    rows = article.locator("table.stages tbody tr")
    assert rows.count() == 2
    service, construction = rows.nth(0).inner_text(), rows.nth(1).inner_text()
    assert service.startswith("in service") and "pass" in service
    assert construction.startswith("construction (governs)") and "fail" in construction
    con = b.stage_result("construction")
    seg = b.segments[con.governing_segment]
    assert f"{seg.cb:.2f}" in construction and seg.load_combination in construction
    assert article.locator("table.stages tr.governing").inner_text() == construction
    page.close()
