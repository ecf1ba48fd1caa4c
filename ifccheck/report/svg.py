"""Inline SVG drawings for the HTML reports: storey plans, moment diagrams, strength curves.

Everything is drawn in pixel coordinates computed here (model x to the right,
model y up the page), so line widths and markers keep their size whatever
the plan's extent. Text is escaped; nothing refers to anything outside the
page.
"""

from __future__ import annotations

import math
from collections import defaultdict
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from html import escape

from ifccheck.report.colours import (
    BLUE,
    BLUISH_GREEN,
    CHANGE_COLOURS,
    FAIL,
    FAIL_CASING,
    NEUTRAL,
    NOT_CHECKED,
    UTILISATION_BANDS,
    utilisation_band,
)
from ifccheck.report.display import DisplayUnits, utilisation_text
from ifccheck.report.wording import lb_text, station_text
from ifccheck.results import BeamChange, BeamResult, BracePointOut, SlabOutline

Point2 = tuple[float, float]


def attr(value: object) -> str:
    return escape(str(value), quote=True)


def _f(v: float) -> str:
    """A pixel coordinate, short."""
    return f"{v:.1f}"


@dataclass
class Frame:
    """Model plan coordinates (m) → SVG pixels."""

    xmin: float
    ymax: float
    scale: float
    pad: float
    width: float
    height: float

    @classmethod
    def fit(
        cls, points: Iterable[Point2], max_width: float = 960, max_height: float = 720,
        pad: float = 36,
    ) -> Frame:  # fmt: skip
        xs, ys = [], []
        for x, y in points:
            xs.append(x)
            ys.append(y)
        if not xs:
            xs, ys = [0.0, 1.0], [0.0, 1.0]
        xmin, xmax, ymin, ymax = min(xs), max(xs), min(ys), max(ys)
        dx, dy = max(xmax - xmin, 1e-6), max(ymax - ymin, 1e-6)
        scale = min((max_width - 2 * pad) / dx, (max_height - 2 * pad) / dy)
        width = dx * scale + 2 * pad
        height = dy * scale + 2 * pad
        return cls(xmin, ymax, scale, pad, max(width, 240.0), max(height, 120.0))

    def px(self, x: float, y: float) -> Point2:
        return self.pad + (x - self.xmin) * self.scale, self.pad + (self.ymax - y) * self.scale


def _along(b: BeamResult, station: float) -> Point2:
    t = station / b.length if b.length else 0.0
    return b.start[0] + t * (b.end[0] - b.start[0]), b.start[1] + t * (b.end[1] - b.start[1])


def _ring_path(frame: Frame, ring: Sequence[Sequence[float]]) -> str:
    pts = [frame.px(p[0], p[1]) for p in ring]
    if not pts:
        return ""
    return "M" + " L".join(f"{_f(x)} {_f(y)}" for x, y in pts) + " Z"


def _slabs_svg(frame: Frame, slabs: Sequence[SlabOutline]) -> list[str]:
    out = []
    for s in slabs:
        d = " ".join(_ring_path(frame, r) for r in [s.exterior, *s.holes])
        out.append(
            f'<path class="slab" data-slab="{attr(s.guid)}" d="{d}" fill="#f4f4f4" '
            f'fill-rule="evenodd" stroke="#b5b5b5" stroke-width="1"/>'
        )
    return out


def _line(frame: Frame, a: Point2, b: Point2, extra: str) -> str:
    (x1, y1), (x2, y2) = frame.px(*a), frame.px(*b)
    return f'<line x1="{_f(x1)}" y1="{_f(y1)}" x2="{_f(x2)}" y2="{_f(y2)}" {extra}/>'


LABEL_CHAR = 6.6  # px per character of an 11 px label (a generous average, so labels fit)
LABEL_HEIGHT = 14.0  # px: an 11 px label's box, ascent and descent with its halo
LABEL_CELL = 64.0  # px: the collision grid's cell


@dataclass(frozen=True)
class Label:
    """A placed plan label: its text, anchor point and box (pixels)."""

    guid: str
    text: str
    x: float
    y: float
    anchor: str  # "start", "middle", "end"
    box: tuple[float, float, float, float]  # left, top, right, bottom
    cls: str = "label"
    colour: str = "#000"


def label_box(x: float, y: float, anchor: str, text: str) -> tuple[float, float, float, float]:
    """The box an 11 px label takes with its baseline at (x, y)."""
    w = LABEL_CHAR * len(text)
    left = x - w / 2 if anchor == "middle" else x if anchor == "start" else x - w
    return left, y - 11.0, left + w, y + LABEL_HEIGHT - 11.0


def boxes_overlap(a: Sequence[float], b: Sequence[float]) -> bool:
    return a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]


def _candidates(
    x0: float, y0: float, x1: float, y1: float, w: float, width: float, height: float
) -> list[tuple[float, float, str]]:
    """Where a label may go beside a beam drawn from (x0, y0) to (x1, y1), best first:
    beside its midpoint, then beside its quarter points; kept inside the drawing."""
    out = []
    for t in (0.5, 0.25, 0.75):
        mx, my = x0 + t * (x1 - x0), y0 + t * (y1 - y0)
        if abs(x1 - x0) >= abs(y1 - y0):  # along x: above, else below, centred
            x = min(max(mx, w / 2 + 2), width - w / 2 - 2)
            for y in (my - 7, my + 15):
                out.append((x, min(max(y, 12.0), height - 4), "middle"))
        else:  # along y: to the right, else to the left
            if mx + 6 + w <= width - 2:
                out.append((mx + 6, min(max(my + 4, 12.0), height - 4), "start"))
            if mx - 6 - w >= 2:
                out.append((mx - 6, min(max(my + 4, 12.0), height - 4), "end"))
    return out


def place_labels(
    wanted: Sequence[tuple[str, str, tuple[float, float, float, float], str, str]],
    width: float, height: float,
) -> tuple[list[Label], int]:  # fmt: skip
    """Greedy placement: each label (in the order given, most important first) takes the
    first of its candidate places whose box meets no label placed before it; a label with
    no free place is left out. ``wanted`` holds (guid, text, pixel line, class, colour).
    Returns the placed labels and how many were left out."""
    grid: dict[tuple[int, int], list[tuple[float, float, float, float]]] = defaultdict(list)
    placed: list[Label] = []
    dropped = 0
    for guid, text, (x0, y0, x1, y1), cls, colour in wanted:
        w = LABEL_CHAR * len(text)
        for x, y, anchor in _candidates(x0, y0, x1, y1, w, width, height):
            box = label_box(x, y, anchor, text)
            cells = [
                (i, j)
                for i in range(int(box[0] // LABEL_CELL), int(box[2] // LABEL_CELL) + 1)
                for j in range(int(box[1] // LABEL_CELL), int(box[3] // LABEL_CELL) + 1)
            ]
            if any(boxes_overlap(box, other) for c in cells for other in grid.get(c, ())):
                continue
            for c in cells:
                grid[c].append(box)
            placed.append(Label(guid, text, x, y, anchor, box, cls, colour))
            break
        else:
            dropped += 1
    return placed, dropped


def _label_svg(lab: Label) -> str:
    return (
        f'<text class="{lab.cls}" data-guid-label="{attr(lab.guid)}" x="{_f(lab.x)}" '
        f'y="{_f(lab.y)}" text-anchor="{lab.anchor}" fill="{lab.colour}">{escape(lab.text)}</text>'
    )


def _label(frame: Frame, b: BeamResult, text: str, colour: str = "#000", cls: str = "label") -> str:
    """A label beside the beam's midpoint, kept wholly inside the drawing (diff plans)."""
    (x0, y0), (x1, y1) = frame.px(b.start[0], b.start[1]), frame.px(b.end[0], b.end[1])
    placed, _ = place_labels([(b.guid, text, (x0, y0, x1, y1), cls, colour)], frame.width,
                             frame.height)  # fmt: skip
    if not placed:
        return ""
    lab = placed[0]
    return (
        f'<text class="{cls}" x="{_f(lab.x)}" y="{_f(lab.y)}" text-anchor="{lab.anchor}" '
        f'fill="{colour}" stroke="#fff" stroke-width="3" paint-order="stroke" font-size="11">'
        f"{escape(text)}</text>"
    )


def _dots(frame: Frame, points: Iterable[Point2]) -> str:
    """Zero-length subpaths: with a round cap each draws a dot of the stroke's width."""
    return "".join(f"M{_f(x)} {_f(y)}h0" for x, y in (frame.px(*p) for p in points))


def _segments_path(frame: Frame, pairs: Iterable[tuple[Point2, Point2]]) -> str:
    out = []
    for a, b in pairs:
        (x0, y0), (x1, y1) = frame.px(*a), frame.px(*b)
        out.append(f"M{_f(x0)} {_f(y0)}L{_f(x1)} {_f(y1)}")
    return "".join(out)


def beam_tooltip(b: BeamResult, du: DisplayUnits) -> str:
    parts = [b.name or b.guid, b.profile, b.outcome.replace("_", " ")]
    if b.utilisation is not None:
        parts.append(f"utilisation {utilisation_text(b.utilisation)}")
    seg = b.governing
    if seg is not None:
        parts.append(f"Lb {lb_text(seg, du)}")
    if b.reason is not None:
        parts.append(b.reason.text)
    return " · ".join(p for p in parts if p)


def brace_tip(b: BeamResult, p: BracePointOut, du: DisplayUnits) -> str:
    """A brace point in words: kind, station from the nearer named end, member, and why
    it does not count."""
    by = f"{p.by_name} ({p.by})" if p.by_name else p.by
    tip = f"{p.kind} brace at {station_text(b, p.station, du)} by {by}"
    if not p.counts:
        tip += f"; does not count: {p.reason.text if p.reason else 'no reason recorded'}"
    return tip


def _placed(b: BeamResult) -> bool:
    """Whether a beam has a position to draw (one the reader could not place has NaN)."""
    return all(math.isfinite(v) for v in (*b.start[:2], *b.end[:2]))


BAND_CLASSES = ("u0", "u1", "u2", "u3", "u4")  # the utilisation bands, then fail


def plan_css() -> str:
    """The plan's shared styles: one rule per band instead of attributes on every beam."""
    rules = [
        "svg.plan line.beam{stroke-width:3.5px;stroke-linecap:round}",
        f"svg.plan line.oc-not_checked{{stroke:{NOT_CHECKED};stroke-width:2.5px;"
        "stroke-dasharray:6 4;stroke-linecap:butt}",
        "svg.plan .outline{stroke:#4d4d4d;stroke-width:5px;stroke-linecap:round;fill:none}",
        f"svg.plan .fail-casing{{stroke:{FAIL_CASING};stroke-width:8px;stroke-linecap:round;"
        "fill:none}",
        "svg.plan .slab-braced{stroke:#6a9fc0;stroke-opacity:.45;stroke-width:11px;fill:none}",
        "svg.plan .brace{stroke:#222;stroke-width:6.4px;stroke-linecap:round;fill:none}",
        "svg.plan .brace-void-in{stroke:#fff;stroke-width:4px;stroke-linecap:round;fill:none}",
        "svg.plan .slab{fill:#f4f4f4;fill-rule:evenodd;stroke:#b5b5b5;stroke-width:1px}",
        "svg.plan text.label{font-size:11px;stroke:#fff;stroke-width:3px;paint-order:stroke}",
        "svg.plan line,svg.plan path{vector-effect:non-scaling-stroke}",
    ]
    colours = [c for _u, c, _l in UTILISATION_BANDS] + [FAIL]
    rules += [
        f"svg.plan line.{k}{{stroke:{c}}}" for k, c in zip(BAND_CLASSES, colours, strict=True)
    ]
    return "".join(rules)


def check_plan_svg(
    beams: Sequence[BeamResult], slabs: Sequence[SlabOutline], du: DisplayUnits,
    linked: set[str], title: str,
) -> tuple[str, int, int]:  # fmt: skip
    """One storey: slabs, slab-braced bands, beams coloured by utilisation, brace points,
    labels for failing and not-checked beams placed without overlap.

    Returns the SVG, how many beams wanted a label and how many were left out. Styles
    come from :func:`plan_css`; bands, casings and brace points are one path each per
    storey, each beam one ``line`` with its ``data-guid``.
    """
    beams = [b for b in beams if _placed(b)]
    pts: list[Point2] = [(b.start[0], b.start[1]) for b in beams]
    pts += [(b.end[0], b.end[1]) for b in beams]
    pts += [(p[0], p[1]) for s in slabs for p in s.exterior]
    frame = Frame.fit(pts)
    body: list[str] = _slabs_svg(frame, slabs)
    bands: list[tuple[Point2, Point2]] = []
    outlines: list[tuple[Point2, Point2]] = []
    casings: list[tuple[Point2, Point2]] = []
    lines: list[str] = []
    counting: list[Point2] = []
    void: list[Point2] = []
    wanted = []
    fails = sorted((b for b in beams if b.outcome == "fail"), key=lambda b: -(b.utilisation or 0))
    for b in [*fails, *(b for b in beams if b.outcome == "not_checked")]:
        (x0, y0), (x1, y1) = frame.px(b.start[0], b.start[1]), frame.px(b.end[0], b.end[1])
        if b.outcome == "fail":
            wanted.append((b.guid, f"{b.name or b.guid} {utilisation_text(b.utilisation)}",
                           (x0, y0, x1, y1), "label", "#000"))  # fmt: skip
        else:
            wanted.append((b.guid, f"{b.name or b.guid} (not checked)", (x0, y0, x1, y1),
                           "label nc-label", "#444"))  # fmt: skip
    for b in beams:
        a, e = (b.start[0], b.start[1]), (b.end[0], b.end[1])
        bands += [(_along(b, s0), _along(b, s1)) for s0, s1 in b.continuous_bracing]
        if b.outcome == "fail":
            casings.append((a, e))
        elif b.outcome != "not_checked":
            outlines.append((a, e))
        band = utilisation_band(b.utilisation)
        k = "" if b.outcome == "not_checked" or band is None else " " + BAND_CLASSES[band]
        (x0, y0), (x1, y1) = frame.px(*a), frame.px(*e)
        lines.append(
            f'<line class="beam oc-{b.outcome}{k}" data-guid="{attr(b.guid)}" '
            f'x1="{_f(x0)}" y1="{_f(y0)}" x2="{_f(x1)}" y2="{_f(y1)}"/>'
        )
        for p in b.brace_points:
            (counting if p.counts else void).append(_along(b, p.station))
    if bands:
        body.append(f'<path class="slab-braced" data-n="{len(bands)}" '
                    f'd="{_segments_path(frame, bands)}"/>')  # fmt: skip
    if outlines:
        body.append(f'<path class="outline" data-n="{len(outlines)}" '
                    f'd="{_segments_path(frame, outlines)}"/>')  # fmt: skip
    if casings:
        body.append(f'<path class="fail-casing" data-n="{len(casings)}" '
                    f'd="{_segments_path(frame, casings)}"/>')  # fmt: skip
    body.append('<g class="beams">' + "".join(lines) + "</g>")
    if counting:
        body.append(f'<path class="brace" data-n="{len(counting)}" d="{_dots(frame, counting)}"/>')
    if void:
        d = _dots(frame, void)
        body.append(f'<path class="brace brace-void" data-n="{len(void)}" d="{d}"/>'
                    f'<path class="brace-void-in" d="{d}"/>')  # fmt: skip
    placed, dropped = place_labels(wanted, frame.width, frame.height)
    body.append('<g class="labels">' + "".join(_label_svg(lab) for lab in placed) + "</g>")
    svg = (
        f'<svg class="plan" role="img" viewBox="0 0 {_f(frame.width)} {_f(frame.height)}" '
        f'width="{_f(frame.width)}" height="{_f(frame.height)}" aria-label="{attr(title)}" '
        f'data-scale="{frame.scale:.6g}" data-x0="{frame.xmin:.6g}" data-y1="{frame.ymax:.6g}" '
        f'data-pad="{frame.pad:g}">'
        f"<title>{escape(title)}</title>" + "".join(body) + "</svg>"
    )
    return svg, len(wanted), dropped


def _svg(width: float, height: float, title: str, body: Sequence[str], cls: str) -> str:
    return (
        f'<svg class="{cls}" role="img" viewBox="0 0 {_f(width)} {_f(height)}" '
        f'width="{_f(width)}" height="{_f(height)}" aria-label="{attr(title)}">'
        f"<title>{escape(title)}</title>" + "".join(body) + "</svg>"
    )


def check_legend_svg() -> str:
    """Legend: the utilisation bands, fail, not checked, brace points, slab bracing."""
    body = []
    x0, w = 10.0, 56.0
    for i, (_upper, colour, label) in enumerate(UTILISATION_BANDS):
        x = x0 + i * w
        body.append(
            f'<rect x="{_f(x)}" y="8" width="{_f(w - 2)}" height="12" fill="{colour}" '
            'stroke="#4d4d4d" stroke-width="0.8"/>'
            f'<text x="{_f(x + (w - 2) / 2)}" y="34" font-size="10" '
            f'text-anchor="middle">{escape(label)}</text>'
        )
    x = x0 + len(UTILISATION_BANDS) * w
    body.append(
        f'<rect x="{_f(x)}" y="8" width="{_f(w - 2)}" height="12" fill="{FAIL}" '
        f'stroke="{FAIL_CASING}" stroke-width="2"/>'
        f'<text x="{_f(x + (w - 2) / 2)}" y="34" font-size="10" text-anchor="middle">'
        "above 1.00</text>"
    )
    body.append('<text x="10" y="52" font-size="11">utilisation (demand / strength); '
                "failing beams have a dark casing and a label</text>")  # fmt: skip
    x = 320.0
    body.append(
        f'<line x1="{x}" y1="14" x2="{x + 40}" y2="14" stroke="{NOT_CHECKED}" stroke-width="2.5" '
        f'stroke-dasharray="6 4"/><text x="{x + 50}" y="18" font-size="11">not checked</text>'
    )
    x = 540.0
    body.append(
        f'<circle cx="{x + 5}" cy="14" r="3.2" fill="#222" stroke="#222"/>'
        f'<text x="{x + 16}" y="18" font-size="11">brace point</text>'
        f'<circle cx="{x + 5}" cy="38" r="3.2" fill="#fff" stroke="#222" stroke-width="1.2"/>'
        f'<text x="{x + 16}" y="42" font-size="11">brace point that does not count</text>'
    )
    x = 760.0
    body.append(
        f'<line x1="{x}" y1="14" x2="{x + 36}" y2="14" stroke="#6a9fc0" stroke-opacity="0.45" '
        f'stroke-width="11"/><text x="{x + 44}" y="18" font-size="11">slab-braced length</text>'
        f'<rect x="{x}" y="31" width="36" height="14" fill="#f4f4f4" stroke="#b5b5b5"/>'
        f'<text x="{x + 44}" y="42" font-size="11">slab</text>'
    )
    return _svg(960, 60, "Legend", body, "legend")


def _cross(x: float, y: float, size: float = 5.5, cls: str = "lost-brace") -> str:
    """An X with a white halo, so it reads on any line colour."""
    d = (
        f"M{_f(x - size)} {_f(y - size)} L{_f(x + size)} {_f(y + size)} "
        f"M{_f(x - size)} {_f(y + size)} L{_f(x + size)} {_f(y - size)}"
    )
    return (
        f'<path d="{d}" stroke="#fff" stroke-width="5" stroke-linecap="round"/>'
        f'<path class="{cls}" d="{d}" stroke="#000" stroke-width="2.2" stroke-linecap="round"/>'
    )


def diff_plan_svg(
    beams: Sequence[BeamResult], removed: Sequence[BeamResult], slabs: Sequence[SlabOutline],
    changes: dict[str, BeamChange], added: set[str], du: DisplayUnits, title: str,
) -> str:  # fmt: skip
    """One storey of the new revision with the changes marked."""
    beams, removed = [b for b in beams if _placed(b)], [b for b in removed if _placed(b)]
    pts: list[Point2] = [(b.start[0], b.start[1]) for b in [*beams, *removed]]
    pts += [(b.end[0], b.end[1]) for b in [*beams, *removed]]
    pts += [(p[0], p[1]) for s in slabs for p in s.exterior]
    frame = Frame.fit(pts)
    body: list[str] = _slabs_svg(frame, slabs)
    gone, casings, lines, marks, labels = [], [], [], [], []
    for b in removed:
        gone.append(
            _line(frame, (b.start[0], b.start[1]), (b.end[0], b.end[1]),
                  f'class="removed" data-old-guid="{attr(b.guid)}" stroke="{NEUTRAL}" '
                  'stroke-width="2" stroke-dasharray="2 4" stroke-linecap="round"')
        )  # fmt: skip
    for b in beams:
        a, e = (b.start[0], b.start[1]), (b.end[0], b.end[1])
        c = changes.get(b.guid)
        if c is not None:
            colour = CHANGE_COLOURS.get(c.change, CHANGE_COLOURS["changed"])
            if c.change == "weakened":
                casings.append(
                    _line(frame, a, e, f'class="weakened-casing" stroke="{FAIL_CASING}" '
                          'stroke-width="9" stroke-linecap="round"')
                )  # fmt: skip
                after = c.utilisation_after
                u = "" if after is None else f" {utilisation_text(after)}"
                labels.append(_label(frame, b, f"{b.name or b.guid}{u}"))
            style = f'stroke="{colour}" stroke-width="4" stroke-linecap="round"'
            state: str = c.change
            tip = f"{b.name or b.guid}: {c.change}"
            for s in c.lost_brace_points:
                marks.append(_cross(*frame.px(*_along(b, s))))
            for s in c.added_brace_points:
                x, y = frame.px(*_along(b, s))
                marks.append(
                    f'<circle class="added-brace" cx="{_f(x)}" cy="{_f(y)}" r="4" '
                    f'fill="{BLUE}" stroke="#fff" stroke-width="1"/>'
                )
        elif b.guid in added:
            style = f'stroke="{BLUISH_GREEN}" stroke-width="3" stroke-dasharray="8 3"'
            state, tip = "added", f"{b.name or b.guid}: added"
        else:
            style = f'stroke="{NEUTRAL}" stroke-width="2"'
            state, tip = "unchanged", f"{b.name or b.guid}: unchanged"
        lines.append(
            _line(frame, a, e, f'class="beam ch-{state}" data-guid="{attr(b.guid)}" '
                  f'data-change="{state}" {style}')[:-2]
            + f"><title>{escape(tip)}</title></line>"
        )  # fmt: skip
    body += gone + casings + lines + marks + labels
    return _svg(frame.width, frame.height, title, body, "plan")


def diff_legend_svg() -> str:
    body = []
    items = [
        (f'stroke="{CHANGE_COLOURS["weakened"]}" stroke-width="4"', "weakened", True),
        (f'stroke="{CHANGE_COLOURS["strengthened"]}" stroke-width="4"', "strengthened", False),
        (f'stroke="{CHANGE_COLOURS["changed"]}" stroke-width="4"', "changed otherwise", False),
        (f'stroke="{BLUISH_GREEN}" stroke-width="3" stroke-dasharray="8 3"', "added", False),
        (f'stroke="{NEUTRAL}" stroke-width="2" stroke-dasharray="2 4"', "removed", False),
        (f'stroke="{NEUTRAL}" stroke-width="2"', "unchanged", False),
    ]
    for i, (style, text, casing) in enumerate(items):
        x = 10 + (i % 3) * 220
        y = 14 + (i // 3) * 24
        if casing:
            body.append(
                f'<line x1="{x}" y1="{y}" x2="{x + 36}" y2="{y}" stroke="{FAIL_CASING}" '
                'stroke-width="9" stroke-linecap="round"/>'
            )
        body.append(f'<line x1="{x}" y1="{y}" x2="{x + 36}" y2="{y}" {style}/>')
        body.append(f'<text x="{x + 46}" y="{y + 4}" font-size="11">{escape(text)}</text>')
    body.append(_cross(690, 14) + '<text x="704" y="18" font-size="11">lost brace point</text>')
    body.append(
        f'<circle cx="690" cy="38" r="4" fill="{BLUE}"/>'
        '<text x="704" y="42" font-size="11">added brace point</text>'
    )
    return _svg(960, 56, "Legend", body, "legend")


# --- charts ---------------------------------------------------------------------
def nice_ticks(lo: float, hi: float, n: int = 5) -> list[float]:
    """Round tick values covering [lo, hi] (1-2-5 steps)."""
    if not (math.isfinite(lo) and math.isfinite(hi)) or hi <= lo:
        return [lo]
    raw = (hi - lo) / max(n, 1)
    mag = 10 ** math.floor(math.log10(raw))
    step = next(m * mag for m in (1, 2, 2.5, 5, 10) if m * mag >= raw)
    start = math.floor(lo / step) * step
    ticks = []
    t = start
    while t <= hi + step * 1e-9:
        ticks.append(round(t, 10))
        t += step
    if ticks[-1] < hi:
        ticks.append(ticks[-1] + step)
    return ticks


@dataclass
class Axes:
    x0: float
    x1: float
    y0: float
    y1: float
    left: float = 64
    right: float = 16
    top: float = 14
    bottom: float = 40
    width: float = 640
    height: float = 240

    def px(self, x: float, y: float) -> Point2:
        w = self.width - self.left - self.right
        h = self.height - self.top - self.bottom
        sx = (x - self.x0) / ((self.x1 - self.x0) or 1.0)
        sy = (y - self.y0) / ((self.y1 - self.y0) or 1.0)
        return self.left + sx * w, self.top + (1 - sy) * h

    def frame(self, xticks: Sequence[float], yticks: Sequence[float], xlabel: str,
              ylabel: str) -> list[str]:  # fmt: skip
        out = []
        bx0, by0 = self.px(self.x0, self.y0)
        bx1, by1 = self.px(self.x1, self.y1)
        for t in yticks:
            _, y = self.px(self.x0, t)
            out.append(
                f'<line x1="{_f(bx0)}" y1="{_f(y)}" x2="{_f(bx1)}" y2="{_f(y)}" stroke="#e3e3e3"/>'
                f'<text x="{_f(bx0 - 6)}" y="{_f(y + 4)}" font-size="11" '
                f'text-anchor="end">{_tick(t)}</text>'
            )
        for t in xticks:
            x, _ = self.px(t, self.y0)
            out.append(
                f'<line x1="{_f(x)}" y1="{_f(by0)}" x2="{_f(x)}" y2="{_f(by0 + 4)}" stroke="#333"/>'
                f'<text x="{_f(x)}" y="{_f(by0 + 16)}" font-size="11" '
                f'text-anchor="middle">{_tick(t)}</text>'
            )
        out.append(
            f'<rect x="{_f(bx0)}" y="{_f(by1)}" width="{_f(bx1 - bx0)}" '
            f'height="{_f(by0 - by1)}" fill="none" stroke="#666"/>'
            f'<text x="{_f((bx0 + bx1) / 2)}" y="{_f(self.height - 6)}" font-size="11" '
            f'text-anchor="middle">{escape(xlabel)}</text>'
            f'<text transform="translate(14 {_f((by0 + by1) / 2)}) rotate(-90)" font-size="11" '
            f'text-anchor="middle">{escape(ylabel)}</text>'
        )
        return out


def _tick(t: float) -> str:
    return f"{t:g}" if abs(t) >= 1e-9 else "0"


def moment_diagram_svg(b: BeamResult, du: DisplayUnits) -> str | None:
    """The governing-combination moment along the beam, with segments and brace points."""
    d = b.diagram
    if d is None or not d.stations:
        return None
    fx, fm = du.factor("length"), du.factor("moment")
    xs = [s * fx for s in d.stations]
    ms = [m * fm for m in d.moment]
    finite = [m for m in ms if math.isfinite(m)]
    if not finite:
        return None
    lo, hi = min(0.0, *finite), max(0.0, *finite)
    if hi - lo <= 0:
        hi = lo + 1.0
    yt = nice_ticks(lo, hi)
    xt = nice_ticks(0.0, max(xs[-1], b.length * fx))
    ax = Axes(xt[0], xt[-1], yt[0], yt[-1])
    body = []
    gov = b.governing
    for i, seg in enumerate(b.segments):
        (x0, ytop), (x1, ybot) = ax.px(seg.start * fx, yt[-1]), ax.px(seg.end * fx, yt[0])
        if i == b.governing_segment:
            body.append(
                f'<rect class="governing" x="{_f(x0)}" y="{_f(ytop)}" width="{_f(x1 - x0)}" '
                f'height="{_f(ybot - ytop)}" fill="#fff3c4"/>'
            )
    for s0, s1 in b.continuous_bracing:
        (x0, y), (x1, _) = ax.px(s0 * fx, 0.0), ax.px(s1 * fx, 0.0)
        body.append(
            f'<line class="slab-braced" x1="{_f(x0)}" y1="{_f(y)}" x2="{_f(x1)}" y2="{_f(y)}" '
            f'stroke="#6a9fc0" stroke-opacity="0.45" stroke-width="10"/>'
        )
    body += ax.frame(xt, yt, f"station ({du.label('length')})",
                     f"moment ({du.label('moment')}), sagging +")  # fmt: skip
    pts = [ax.px(x, m) for x, m in zip(xs, ms, strict=True) if math.isfinite(m)]
    _, y_zero = ax.px(0.0, 0.0)
    area = (
        f"M{_f(pts[0][0])} {_f(y_zero)} "
        + " ".join(f"L{_f(x)} {_f(y)}" for x, y in pts)
        + f" L{_f(pts[-1][0])} {_f(y_zero)} Z"
    )
    body.append(f'<path d="{area}" fill="{UTILISATION_BANDS[2][1]}" fill-opacity="0.18" '
                'stroke="none"/>')  # fmt: skip
    body.append(
        '<polyline class="moment" fill="none" stroke="#2b2b2b" stroke-width="1.8" points="'
        + " ".join(f"{_f(x)},{_f(y)}" for x, y in pts)
        + '"/>'
    )
    x0, _ = ax.px(ax.x0, 0.0)
    x1, _ = ax.px(ax.x1, 0.0)
    body.append(f'<line x1="{_f(x0)}" y1="{_f(y_zero)}" x2="{_f(x1)}" y2="{_f(y_zero)}" '
                'stroke="#666"/>')  # fmt: skip
    for p in b.brace_points:
        x, _ = ax.px(p.station * fx, 0.0)
        fill = "#222" if p.counts else "#fff"
        body.append(
            f'<circle class="brace{"" if p.counts else " brace-void"}" cx="{_f(x)}" '
            f'cy="{_f(y_zero)}" r="4" fill="{fill}" stroke="#222" stroke-width="1.2"/>'
        )
    if gov is not None:
        x, y = ax.px((gov.start + gov.end) / 2 * fx, yt[-1])
        body.append(
            f'<text x="{_f(x)}" y="{_f(y + 14)}" font-size="11" text-anchor="middle">'
            f"governing: Lb {escape(lb_text(gov, du))}</text>"
        )
    return _svg(ax.width, ax.height, f"Moment diagram of {b.name or b.guid}", body, "chart")


def strength_curve_svg(b: BeamResult, du: DisplayUnits, method: str) -> str | None:
    """Design strength against Lb with the governing segment's (Lb, demand) marked."""
    if not b.curve:
        return None
    fx, fm = du.factor("length"), du.factor("moment")
    pts = [(x * fx, y * fm) for x, y in b.curve if math.isfinite(x) and math.isfinite(y)]
    if len(pts) < 2:
        return None
    gov = b.governing
    mark = None if gov is None else (gov.lb * fx, gov.moment_demand * fm)
    xmax = max(p[0] for p in pts)
    ymax = max(p[1] for p in pts)
    if mark is not None:
        xmax, ymax = max(xmax, mark[0]), max(ymax, mark[1])
    xt, yt = nice_ticks(0.0, xmax), nice_ticks(0.0, ymax * 1.05)
    ax = Axes(xt[0], xt[-1], yt[0], yt[-1])
    strength = "φMn" if method.upper() == "LRFD" else "Mn/Ω"
    body = ax.frame(xt, yt, f"unbraced length Lb ({du.label('length')})",
                    f"{strength} ({du.label('moment')})")  # fmt: skip
    body.append(
        '<polyline class="curve" fill="none" stroke="#2a788e" stroke-width="2" points="'
        + " ".join(f"{_f(x)},{_f(y)}" for x, y in (ax.px(*p) for p in pts))
        + '"/>'
    )
    t = b.trail
    if t is not None:
        _, ytop = ax.px(0.0, yt[-1])
        _, ybot = ax.px(0.0, 0.0)
        for name in ("lp", "lr"):
            lx = t.values.get(name, 0.0) * fx
            if not 0.0 < lx <= xt[-1]:
                continue
            px, _ = ax.px(lx, 0.0)
            label = "Lp" if name == "lp" else "Lr"
            body.append(
                f'<line class="{name}-mark" x1="{_f(px)}" y1="{_f(ybot)}" x2="{_f(px)}" '
                f'y2="{_f(ytop)}" stroke="#777" stroke-dasharray="2 3"/>'
                f'<text x="{_f(px + 3)}" y="{_f(ytop + 12)}" font-size="11" fill="#444">'
                f"{label} = {escape(du.text(lx / fx, 'length'))}</text>"
            )
    if mark is not None and gov is not None:
        x, y = ax.px(*mark)
        _, yb = ax.px(mark[0], 0.0)
        body.append(
            f'<line x1="{_f(x)}" y1="{_f(yb)}" x2="{_f(x)}" y2="{_f(y)}" stroke="#555" '
            'stroke-dasharray="4 3"/>'
        )
        if gov.utilisation > 1.0:
            body.append(_cross(x, y, 6, "segment-mark"))
        else:
            body.append(
                f'<circle class="segment-mark" cx="{_f(x)}" cy="{_f(y)}" r="5" fill="#222"/>'
            )
        text = f"governing segment: utilisation {utilisation_text(gov.utilisation)}"
        w = LABEL_CHAR * len(text)
        right = x + 8 + w <= ax.width - 4
        tx = x + 8 if right else x - 8
        ty = y - 8 if y - 8 >= 14 else y + 18
        body.append(
            f'<text class="segment-label" x="{_f(tx)}" y="{_f(ty)}" font-size="11" '
            f'text-anchor="{"start" if right else "end"}" stroke="#fff" stroke-width="3" '
            f'paint-order="stroke">{escape(text)}</text>'
        )
    return _svg(ax.width, ax.height, f"Strength against Lb for {b.name or b.guid}", body, "chart")
