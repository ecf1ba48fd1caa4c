"""The HTML reports: self-contained, one shape per beam per plan, markings, caps."""

from __future__ import annotations

import re
from collections import Counter, defaultdict
from html.parser import HTMLParser

import result_fixtures as rf

from ifccheck import CAUTION
from ifccheck.report import html_out
from ifccheck.report.display import DisplayUnits
from ifccheck.report.html_data import decode
from ifccheck.report.html_out import diff_html, report_html, write_diff_html, write_report_html
from ifccheck.report.svg import boxes_overlap, check_plan_svg, label_box

EXTERNAL = re.compile(
    r"""(?:src|href|xlink:href|action|poster|data)\s*=\s*["']?\s*(?:https?:)?//"""
    r"""|url\(\s*["']?\s*(?:https?:)?//|@import""",
    re.IGNORECASE,
)


class PlanParser(HTMLParser):
    """Per storey figure: the data-guid shapes and the class counts of SVG elements."""

    def __init__(self) -> None:
        super().__init__()
        self.storey: str | None = None
        self.depth = 0
        self.guids: dict[str, list[str]] = defaultdict(list)
        self.classes: dict[str, Counter] = defaultdict(Counter)
        self.old_guids: dict[str, list[str]] = defaultdict(list)
        self.texts: dict[str, list[str]] = defaultdict(list)
        self._in_text = False

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag == "figure" and "storey" in (a.get("class") or "").split():
            self.storey, self.depth = a["data-storey"], 0
        if self.storey is None:
            return
        if tag == "figure":
            self.depth += 1
        if "data-guid" in a:
            self.guids[self.storey].append(a["data-guid"])
        if "data-old-guid" in a:
            self.old_guids[self.storey].append(a["data-old-guid"])
        for c in (a.get("class") or "").split():
            self.classes[self.storey][c] += 1
        self._in_text = tag == "text"

    def handle_endtag(self, tag):
        if self.storey is not None and tag == "figure":
            self.depth -= 1
            if self.depth == 0:
                self.storey = None
        if tag == "text":
            self._in_text = False

    def handle_data(self, data):
        if self.storey is not None and self._in_text:
            self.texts[self.storey].append(data)


def _parse(page: str) -> PlanParser:
    p = PlanParser()
    p.feed(page)
    return p


def _by_storey(beams):
    out = defaultdict(list)
    for b in beams:
        out[b.storey].append(b)
    return out


def test_page_is_self_contained(tmp_path):
    path = write_report_html(rf.check_result(), tmp_path / "m.report.html", "imperial")
    page = path.read_text(encoding="utf-8")
    assert not EXTERNAL.search(page)
    assert "<link" not in page and "<img" not in page
    # one inline script that runs, and one data block that browsers never run
    assert page.count("<script>") == 1 and "<script src" not in page
    assert page.count("<script") == 2
    assert '<script type="application/octet-stream" id="report-data"' in page
    assert html_out.TABLE_SCRIPT in page
    assert "http://" not in page and "https://" not in page
    dpage = write_diff_html(rf.diff_result(), tmp_path / "diff.html", "si").read_text()
    assert not EXTERNAL.search(dpage) and "http" not in dpage


def test_pattern_catches_external_references():
    # the check above must be able to fail
    bad = [
        '<img src="https://x.org/a.png">',
        "<a href='//cdn.example/x'>",
        '<div style="background:url(http://x/y)">',
        "<style>@import 'a.css'</style>",
    ]
    for text in bad:
        assert EXTERNAL.search(text)
    assert not EXTERNAL.search('<a href="#beam-abc">')


def test_one_shape_per_beam_per_plan():
    result = rf.check_result()
    p = _parse(report_html(result, "si"))
    expected = _by_storey(result.beams)
    assert set(p.guids) == set(expected)
    for storey, beams in expected.items():
        assert sorted(p.guids[storey]) == sorted(b.guid for b in beams)


def _counts(page: str, storey: str) -> Counter:
    """data-n of the grouped paths of one storey's plan, by class."""
    fig = page.split(f'data-storey="{storey}"', 1)[1].split("</figure>", 1)[0]
    out: Counter = Counter()
    for cls, n in re.findall(r'<path class="([^"]+)" data-n="(\d+)"', fig):
        for c in cls.split():
            out[c] += int(n)
    return out


def test_plan_marks_braces_slab_bands_failures_and_not_checked():
    result = rf.check_result()
    page = report_html(result, "si")
    p = _parse(page)
    for storey, beams in _by_storey(result.beams).items():
        c, n = p.classes[storey], _counts(page, storey)
        points = [bp for b in beams for bp in b.brace_points]
        assert n["brace"] == len(points)  # every brace point is a dot
        assert n["brace-void"] == sum(not bp.counts for bp in points)  # hollow: does not count
        assert n["slab-braced"] == sum(len(b.continuous_bracing) for b in beams)
        assert n["fail-casing"] == sum(b.outcome == "fail" for b in beams)
        assert c["oc-not_checked"] == sum(b.outcome == "not_checked" for b in beams)
        assert c["slab"] == sum(s.storey == storey for s in result.slabs)
        labels = " ".join(p.texts[storey])
        for b in beams:
            # failing and not-checked beams are labelled, passing ones are not
            assert (b.name in labels) is (b.outcome != "pass")
            assert (f"{b.name} (not checked)" in labels) is (b.outcome == "not_checked")
    assert _counts(page, "Level 2")["brace-void"] == 1  # the unanchored strut on B-2


def test_plan_labels_do_not_overlap_and_the_rest_are_counted():
    # 400 beams on one storey, side by side 0.5 m apart: far more labels than fit
    result = rf.many_beams(400)
    beams = result.beams
    for i, b in enumerate(beams):
        b.storey = "Level 2"
        b.outcome = "fail"
        b.utilisation = 1.2
        b.start = (0.0, 0.5 * i, 0.0)
        b.end = (9.0, 0.5 * i, 0.0)
    svg, wanted, dropped = check_plan_svg(beams, [], DisplayUnits("si"), set(), "Plan")
    texts = re.findall(
        r'<text class="label"[^>]*x="([\d.]+)" y="([\d.]+)" text-anchor="(\w+)"[^>]*>([^<]*)<',
        svg,
    )
    assert wanted == 400 and 0 < len(texts) < 400 and dropped == 400 - len(texts)
    boxes = [label_box(float(x), float(y), a, s) for x, y, a, s in texts]
    width = float(re.search(r'width="([\d.]+)"', svg).group(1))
    height = float(re.search(r'height="([\d.]+)"', svg).group(1))
    for i, a in enumerate(boxes):
        # inside the drawing, and clear of every other label (coordinates rounded to 0.1 px)
        assert a[0] >= -0.1 and a[1] >= -0.1 and a[2] <= width + 0.1 and a[3] <= height + 0.1
        for b in boxes[i + 1 :]:
            shrunk = (b[0] + 0.1, b[1] + 0.1, b[2] - 0.1, b[3] - 0.1)
            assert not boxes_overlap(a, shrunk)
    # the worst first: the labels kept are the most highly utilised
    for i, b in enumerate(beams):
        b.utilisation = 1.0 + i / 1000
    svg, _, _ = check_plan_svg(beams, [], DisplayUnits("si"), set(), "Plan")
    assert f"{beams[-1].name} " in svg


def test_sections_caution_and_summary():
    result = rf.check_result()
    page = report_html(result, "imperial")
    headings = ["Summary", "Design basis", "Storey plans", "Beams", "Not checked",
                "Beam details"]  # fmt: skip
    for heading in headings:
        assert f"<h2>{heading}</h2>" in page
    # in this order: the design basis is the first section after the summary
    assert [page.index(f"<h2>{h}</h2>") for h in headings] == sorted(
        page.index(f"<h2>{h}</h2>") for h in headings
    )
    # the summary names the failing and the not-checked beams
    attention = page.split("Needs attention", 1)[1].split("</div>", 1)[0]
    assert "B-2" in attention and "B-3" in attention and "B-1" not in attention
    assert CAUTION in page
    assert "AISC 360-16" in page and "LRFD" in page and rf.CHECKED_AT in page
    assert "writer-test.ifc" in page
    # the not-checked beam's reason and what the model needs
    assert "not found in the shape table" in page and "IfcIShapeProfileDef" in page


def _data(page: str) -> dict:
    block = page.split('id="report-data" data-encoding="gzip+base64">', 1)[1].split("<", 1)[0]
    return decode(block)


def test_detail_data_has_diagram_curve_and_marker():
    result = rf.check_result()
    data = _data(report_html(result, "imperial"))
    b2 = next(b for b in data["beams"] if b["g"] == rf.guids()["b2"])
    d = b2["d"]
    assert d["diagram"]["x"] and d["diagram"]["m"] and "curve" in d
    assert d["mark"][2] > 1.0  # a cross: the governing segment fails
    assert d["lbg"] == "15.00 ft"
    why = " ".join(d["why"])
    # why and what would fix it, stations from a named end (the fixture's own explanation)
    assert "at 15.00 ft from the end at J3" in why
    assert "does not count" in why and "S1" in why
    assert "An opening in slab" in why
    assert "W16X31" in why  # the lightest passing W16 (result_fixtures, Shapes Database)
    result.beams[1].curve = None
    d = next(b for b in _data(report_html(result, "imperial"))["beams"] if b["g"] == b2["g"])["d"]
    assert "curve" not in d and "mark" not in d


def test_embedded_data_round_trips_to_the_result():
    result = rf.many_beams(400)
    page = report_html(result, "si")
    data = _data(page)
    assert [b["g"] for b in data["beams"]] == [b.guid for b in result.beams]  # every beam
    du = DisplayUnits("si")
    for rec, b in zip(data["beams"], result.beams, strict=True):
        assert rec["n"] == b.name and rec["p"] == b.profile
        assert data["storeys"][rec["s"]] == b.storey
        assert ["pass", "fail", "not_checked"][rec["o"]] == b.outcome
        assert rec["u"] == (None if b.utilisation is None else round(b.utilisation, 4))
        assert len(rec["d"]["segs"]) == len(b.segments)
        for row, s in zip(rec["d"]["segs"], b.segments, strict=True):
            assert float(row[1]) == round(s.start, 2) and float(row[2]) == round(s.end, 2)
            assert row[3] == ("continuous (slab)" if s.continuous else du.number(s.lb, "length"))
            assert float(row[4]) == round(s.cb, 2)
            assert float(row[7]) == round(s.moment_capacity / 1000, 1)  # kN·m
        assert rec["d"]["gov"] == b.governing_segment
        stations = [p.station for p in sorted(b.brace_points, key=lambda p: p.station)]
        assert [r[0] for r in rec["d"].get("braces", [])] == [round(x, 4) for x in stations]
        if b.diagram is not None:
            assert max(rec["d"]["diagram"]["m"]) == round(max(b.diagram.moment) / 1000, 3)
    # no per-beam detail markup: details are drawn from the data on demand
    markup = page.replace(html_out.TABLE_SCRIPT, "")
    assert "<article" not in markup and 'class="moment"' not in markup


def test_large_report_pages_the_table_and_caps_lists(monkeypatch):
    monkeypatch.setattr(html_out, "NOT_CHECKED_ROWS", 10)
    result = rf.many_beams(400)  # 100 of each scenario beam: 100 fail, 200 pass, 100 not
    page = report_html(result, "si")
    table = page.split('id="beam-table"', 1)[1].split("</table>", 1)[0]
    assert table.count("<tr data-guid=") == html_out.PAGE_ROWS
    assert f"The first {html_out.PAGE_ROWS} of 400 beams" in page
    assert "The first 10 of 100 not-checked beams" in page
    p = _parse(page)
    assert sum(len(v) for v in p.guids.values()) == 400  # the plans still show every beam


def test_diff_plan_marks_changes():
    diff = rf.diff_result()
    page = diff_html(diff, "imperial")
    p = _parse(page)
    for storey, beams in _by_storey(diff.new.beams).items():
        assert sorted(p.guids[storey]) == sorted(b.guid for b in beams)
    reg = diff.weakened[0]
    assert p.classes[reg.storey]["lost-brace"] == len(reg.lost_brace_points) == 1
    assert p.classes[reg.storey]["weakened-casing"] == 1
    assert p.classes[reg.storey]["ch-weakened"] == 1
    assert p.classes["Level 3"]["ch-added"] == len(diff.added)
    assert p.classes["Level 3"]["added-brace"] == 1
    assert p.old_guids["Level 2"] == diff.removed
    assert "B-2" in " ".join(p.texts[reg.storey])
    assert "<h2>Changed beams</h2>" in page and CAUTION in page


def test_many_beams(tmp_path):
    # speed is measured by benchmarks/bench_outputs.py, not asserted here
    result = rf.many_beams(2_000)
    path = write_report_html(result, tmp_path / "big.html", "si")
    assert path.stat().st_size > 0
