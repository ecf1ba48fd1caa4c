"""The service's web page in headless Chromium: sign in, upload, follow, open, download."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from ifccheck import CAUTION
from ifccheck.service.client import ServerProcess, make_token

CHROMIUM = Path("/usr/bin/chromium")
ARGS = [
    "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync",
]  # fmt: skip
SAMPLES = Path(__file__).parents[1] / "sample_models"

if not CHROMIUM.exists():
    pytest.skip(
        "needs Debian's chromium package (apt-get install chromium)", allow_module_level=True
    )
sync_api = pytest.importorskip("playwright.sync_api")


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    data = tmp_path_factory.mktemp("page") / "data"
    token = make_token(data, "browser")
    with ServerProcess(data, "--workers", "1") as proc:  # revisions run in turn anyway
        proc.token = token
        yield proc


@pytest.fixture(scope="module")
def browser():
    with sync_api.sync_playwright() as p:
        b = p.chromium.launch(executable_path=str(CHROMIUM), args=ARGS)
        yield b
        b.close()


def _upload(page, model: Path, key: str) -> None:
    page.set_input_files("#f-model", str(model))
    page.set_input_files("#f-settings", str(SAMPLES / "quillfeather.toml"))
    page.fill("#f-key", key)
    page.click("#upload-button")
    page.wait_for_selector("#upload-message:has-text('Received as submission')")


def test_sign_in_upload_and_open_the_reports(server, browser, tmp_path):
    context = browser.new_context(accept_downloads=True, viewport={"width": 1300, "height": 900})
    page = context.new_page()
    requests: list[str] = []
    context.on("request", lambda r: requests.append(r.url))
    page.goto(server.url + "/")
    assert page.inner_text("#caution") == CAUTION

    page.fill("#token", "ifck_000000000000_" + "n" * 43)
    page.click("#signin-form button")
    page.wait_for_selector("#signin-error:has-text('not accepted')")
    page.fill("#token", server.token)
    page.click("#signin-form button")
    page.wait_for_selector("#app:not([hidden])")
    # the token is kept in this tab's sessionStorage only
    assert page.evaluate("sessionStorage.getItem('ifccheck.token')") == server.token
    assert page.evaluate("localStorage.length") == 0 and context.cookies() == []

    _upload(page, SAMPLES / "quillfeather-rev-a.ifc", "quillfeather")
    page.wait_for_selector("tr[data-status=finished]", timeout=120_000)
    _upload(page, SAMPLES / "quillfeather-rev-b.ifc", "quillfeather")
    # (the page's CSP forbids eval, so wait on elements rather than on a script)
    page.locator("tr[data-status=finished]").nth(1).wait_for(timeout=120_000)
    rows = page.locator("#submissions tbody tr")
    newest, oldest = rows.nth(0), rows.nth(1)
    assert "72 beams: 51 pass, 21 fail" in oldest.inner_text()  # 21 fail during construction
    assert "weakened since the previous revision" in newest.inner_text()
    # "Compared with" names the earlier revision by its file, not by a raw id
    compared = newest.locator("td.compared")
    assert "quillfeather-rev-a.ifc" in compared.inner_text()
    assert oldest.get_attribute("data-id") not in compared.inner_text()
    # each file is offered once: the reports open, the others download
    files = newest.locator("td.files button")
    offered = [files.nth(i).get_attribute("data-file") for i in range(files.count())]
    assert sorted(offered) == sorted(set(offered))
    assert newest.locator("button.download[data-file='report.html']").count() == 0
    # the state is not drawn in a reassuring green beside beams that fail
    colour = newest.locator(".status-finished").evaluate("e => getComputedStyle(e).color")
    r, g, b = (int(v) for v in colour[colour.index("(") + 1 : -1].split(",")[:3])
    assert not (g > r + 40 and g > b + 40), colour
    page.screenshot(path=str(tmp_path / "page.png"), full_page=True)

    with page.expect_popup() as popup_info:
        oldest.locator("button.open[data-file='report.html']").click()
    report = popup_info.value
    console: list[str] = []
    report.on("console", lambda m: console.append(m.text))
    report.wait_for_url("**/files/report.html?*")
    report.wait_for_load_state("load")
    assert CAUTION in report.content()
    assert "quillfeather-rev-a.ifc" in report.content()
    report.screenshot(path=str(tmp_path / "report.png"))
    assert not [m for m in console if "Content Security Policy" in m], console
    # the report's own table script runs under the policy (its hash), nothing else may
    assert report.locator("#beam-filters").is_visible()
    report.select_option("#filter-outcome", "fail")
    # revision A: every beam passes in service; Level 2's infill, edge and balcony beams
    # fail during construction (the deck is not fastened before the pour)
    assert report.inner_text("#beam-count") == "21 of 72 beams"
    # sandboxed: the report runs in an opaque origin, with no way to the page's storage
    assert (
        report.evaluate(
            "() => { try { return sessionStorage.length; } catch (e) { return 'denied'; } }"
        )
        == "denied"
    )

    with page.expect_popup() as popup_info:
        newest.locator("button.open[data-file='diff.html']").click()
    diff = popup_info.value
    diff.wait_for_url("**/files/diff.html?*")
    diff.wait_for_load_state("load")
    assert "R-G90-0" in diff.content() and "L2-B2-20" in diff.content()

    with page.expect_download() as download_info:
        newest.locator("button.download[data-file='results.json']").click()
    download = download_info.value
    assert download.suggested_filename == "quillfeather-rev-b.results.json"
    results = json.loads(Path(download.path()).read_text())
    assert results["model"]["file"] == "quillfeather-rev-b.ifc"

    origin = server.url + "/"
    assert all(u.startswith(origin) or u == "about:blank" for u in requests), requests

    page.click("#signout")
    page.wait_for_selector("#signin:not([hidden])")
    assert page.evaluate("sessionStorage.getItem('ifccheck.token')") is None
    context.close()
