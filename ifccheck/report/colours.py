"""Colours for the report, chosen to stay readable for colour-blind readers.

Utilisation is shown on a stepped scale of the project's own: four passing
bands, light cyan to dark blue, ordered by lightness (CIELAB L* 84, 68, 52, 36)
so that order survives any colour-vision deficiency, then a vermilion red for
fail and a neutral grey for not checked. The hex values were set in CIELAB
and are checked by ``tests/validation/test_machado_2009_colour_vision.py``: under simulated
protanopia, deuteranopia and tritanopia (Machado, Oliveira & Fernandes 2009)
adjacent bands stay at least ΔE00 10 apart and fail and not checked at least
ΔE00 13 from every band. Failure is also shown by a dark casing and a label,
not checked by a dashed line, so no reader depends on colour alone. Revision
changes use the Okabe-Ito palette (Okabe & Ito, 'Color Universal Design', 2008).
"""

from __future__ import annotations

import math

# (upper utilisation of the band, colour, label): a beam at exactly the upper value is in the band
UTILISATION_BANDS: tuple[tuple[float, str, str], ...] = (
    (0.50, "#94dee0", "up to 0.50"),
    (0.75, "#2cb5c9", "0.50 to 0.75"),
    (0.90, "#0088b7", "0.75 to 0.90"),
    (1.00, "#005798", "0.90 to 1.00"),
)
FAIL = "#ed492c"  # above 1.00
NOT_CHECKED = "#969696"
FAIL_CASING = "#1a1a1a"
NEUTRAL = "#a0a0a0"

# Okabe-Ito
VERMILLION = "#D55E00"
BLUE = "#0072B2"
BLUISH_GREEN = "#009E73"
REDDISH_PURPLE = "#CC79A7"
ORANGE = "#E69F00"

CHANGE_COLOURS = {"weakened": VERMILLION, "strengthened": BLUE, "changed": REDDISH_PURPLE}


def _rgb(hex_colour: str) -> tuple[int, int, int]:
    h = hex_colour.lstrip("#")
    return int(h[0:2], 16), int(h[2:4], 16), int(h[4:6], 16)


def utilisation_band(utilisation: float | None) -> int | None:
    """Index of the band (0..3), 4 for fail, None for no value (not checked)."""
    if utilisation is None or math.isnan(utilisation):
        return None
    for i, (upper, _colour, _label) in enumerate(UTILISATION_BANDS):
        if utilisation <= upper:
            return i
    return len(UTILISATION_BANDS)


def utilisation_colour(utilisation: float | None) -> str:
    """The scale colour of a utilisation; fail above 1.00, grey for none."""
    band = utilisation_band(utilisation)
    if band is None:
        return NOT_CHECKED
    if band >= len(UTILISATION_BANDS):
        return FAIL
    return UTILISATION_BANDS[band][1]


def text_colour_on(background: str) -> str:
    """Black or white text, whichever contrasts more with ``background`` (WCAG 2 luminance)."""

    def lin(c: int) -> float:
        s = c / 255
        return s / 12.92 if s <= 0.04045 else ((s + 0.055) / 1.055) ** 2.4

    r, g, b = (lin(c) for c in _rgb(background))
    lum = 0.2126 * r + 0.7152 * g + 0.0722 * b
    return "#000000" if (lum + 0.05) / 0.05 > 1.05 / (lum + 0.05) else "#ffffff"
