"""Size and load time of the HTML report on synthetic framed floors.

    python benchmarks/bench_report.py                  # 1k and 10k members
    python benchmarks/bench_report.py --sizes 1000 10000 --keep DIR

For each size: a synthetic model (``ifccheck.samples.synthetic``) is checked by
``ifccheck check`` as a user runs it (a subprocess, all outputs), with settings that
declare a construction stage with the deck unattached, so that most beams fail and
the report carries both stages, the most it can carry. Then the report's size, the
time ``check`` took, and the time headless Chromium (driven by Playwright, as
``tests/test_report_html_browser.py`` does) takes from navigation to the page's own
"rendered" mark: the ``data-ready`` attribute its script sets on ``<html>`` once the
data is unpacked, the table's first page drawn and the plans' labels placed. Figures,
not asserts; the targets are those of issue 19 (≤ 5 MB and ≤ 2 s at 10,000 members).
"""

from __future__ import annotations

import argparse
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from ifccheck.samples.synthetic import write_synthetic

CHROMIUM = Path("/usr/bin/chromium")
ARGS = [
    "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync",
]  # fmt: skip
SETTINGS = """\
[steel]
default_grade = "A992"

[construction]
live = "20 psf"
deck_braces = false
"""


def check(n: int, folder: Path) -> tuple[Path, float]:
    model = write_synthetic(n, folder / f"synthetic-{n}.ifc")
    settings = folder / "settings.toml"
    settings.write_text(SETTINGS, encoding="utf-8")
    out = folder / f"out-{n}"
    t = time.perf_counter()
    subprocess.run(
        [sys.executable, "-m", "ifccheck.cli", "check", str(model), "--config", str(settings),
         "--out", str(out), "--no-requirements"],
        check=False, capture_output=True,
    )  # fmt: skip
    took = time.perf_counter() - t
    report = out / f"synthetic-{n}.report.html"
    if not report.exists():
        raise SystemExit(f"no report written for {n} members")
    return report, took


def load_time(browser, report: Path, runs: int = 3) -> tuple[float, str]:
    """The best of ``runs`` loads: seconds from navigation to data-ready, and its value."""
    best, state = float("inf"), ""
    for _ in range(runs):
        page = browser.new_page(viewport={"width": 1100, "height": 900})
        t = time.perf_counter()
        page.goto(report.as_uri(), wait_until="commit")
        page.wait_for_function("document.documentElement.dataset.ready", timeout=120_000)
        took = time.perf_counter() - t
        state = page.evaluate("document.documentElement.dataset.ready")
        best = min(best, took)
        page.close()
    return best, state


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="+", default=[1000, 10000])
    parser.add_argument("--keep", type=Path, help="write the models and outputs here")
    args = parser.parse_args()
    from playwright.sync_api import sync_playwright

    with tempfile.TemporaryDirectory() as tmp, sync_playwright() as p:
        folder = args.keep or Path(tmp)
        folder.mkdir(parents=True, exist_ok=True)
        browser = p.chromium.launch(executable_path=str(CHROMIUM), args=ARGS)
        for n in args.sizes:
            report, took = check(n, folder)
            size = report.stat().st_size
            load, state = load_time(browser, report)
            print(
                f"{n:>7} members: report {size / 1e6:6.2f} MB (target ≤ 5 MB at 10k)  "
                f"load {load:5.2f} s to data-ready={state} (target ≤ 2 s)  "
                f"| check with all outputs {took:6.1f} s",
                flush=True,
            )
        browser.close()


if __name__ == "__main__":
    main()
