"""Colours for the report, chosen to stay readable for colour-blind readers.

Utilisation uses a perceptually uniform sequential scale (dark blue-violet →
green → yellow; stops of the published 'viridis' map, van der Walt & Smith,
matplotlib 2.0, 2015), so order is carried by lightness, not by hue alone.
Failure is shown by a dark casing around the line as well as by colour, not
checked by a grey dashed line. Revision changes use the Okabe-Ito palette
(Okabe & Ito, 'Color Universal Design', 2008).
"""

from __future__ import annotations

import functools

# viridis at 0, 0.1, …, 1.0
VIRIDIS = (
    "#440154", "#482475", "#414487", "#355f8d", "#2a788e", "#21918c",
    "#22a884", "#44bf70", "#7ad151", "#bddf26", "#fde725",
)  # fmt: skip

NOT_CHECKED = "#8c8c8c"
FAIL_CASING = "#1a1a1a"
NEUTRAL = "#a0a0a0"

# Okabe-Ito
VERMILLION = "#D55E00"
BLUE = "#0072B2"
BLUISH_GREEN = "#009E73"
REDDISH_PURPLE = "#CC79A7"
ORANGE = "#E69F00"

SEVERITY_COLOURS = {"regression": VERMILLION, "improvement": BLUE, "changed": REDDISH_PURPLE}


def _rgb(hex_colour: str) -> tuple[int, int, int]:
    h = hex_colour.lstrip("#")
    return int(h[0:2], 16), int(h[2:4], 16), int(h[4:6], 16)


def ratio_colour(ratio: float | None) -> str:
    """The scale colour of a utilisation ratio; 0 and below → first stop, 1 and above → last."""
    if ratio is None or ratio != ratio:
        return NOT_CHECKED
    # 1/1000 steps are finer than the eye can tell apart; the cache keeps big plans fast
    return _scale_colour(round(min(max(ratio, 0.0), 1.0), 3))


@functools.lru_cache(maxsize=1024)
def _scale_colour(ratio: float) -> str:
    t = ratio * (len(VIRIDIS) - 1)
    i = min(int(t), len(VIRIDIS) - 2)
    f = t - i
    a, b = _rgb(VIRIDIS[i]), _rgb(VIRIDIS[i + 1])
    r, g, bl = (round(x + (y - x) * f) for x, y in zip(a, b, strict=True))
    return f"#{r:02x}{g:02x}{bl:02x}"


def text_colour_on(background: str) -> str:
    """Black or white text, whichever contrasts more with ``background`` (WCAG 2 luminance)."""

    def lin(c: int) -> float:
        s = c / 255
        return s / 12.92 if s <= 0.04045 else ((s + 0.055) / 1.055) ** 2.4

    r, g, b = (lin(c) for c in _rgb(background))
    lum = 0.2126 * r + 0.7152 * g + 0.0722 * b
    return "#000000" if (lum + 0.05) / 0.05 > 1.05 / (lum + 0.05) else "#ffffff"
