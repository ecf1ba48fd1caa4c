"""Source: G. M. Machado, M. M. Oliveira and L. A. F. Fernandes, "A Physiologically-based
Model for Simulation of Color Vision Deficiency", *IEEE Transactions on Visualization and
Computer Graphics* 15(6), 1291–1298, 2009.

The utilisation colour scale: stepped, ordered by lightness, readable by colour-blind readers.

Colour-vision deficiency is simulated with the matrices of Machado, Oliveira &
Fernandes, "A Physiologically-based Model for Simulation of Color Vision
Deficiency", IEEE TVCG 15(6), 2009, severity 1.0 (protanopia, deuteranopia,
tritanopia; quoted from memory, applied to linear sRGB). Differences are
CIEDE2000 (Sharma, Wu & Dalal, Color Res. Appl. 30(1), 2005), checked below
against the first pair of their published test data. sRGB and CIELAB per
IEC 61966-2-1 and CIE 15 (D65 white).
"""

from __future__ import annotations

import itertools
import math

import pytest

from ifccheck.report.colours import (
    FAIL,
    NOT_CHECKED,
    UTILISATION_BANDS,
    utilisation_band,
    utilisation_colour,
)

MACHADO_2009 = {
    "protanopia": (
        (0.152286, 1.052583, -0.204868),
        (0.114503, 0.786281, 0.099216),
        (-0.003882, -0.048116, 1.051998),
    ),
    "deuteranopia": (
        (0.367322, 0.860646, -0.227968),
        (0.280085, 0.672501, 0.047413),
        (-0.011820, 0.042940, 0.968881),
    ),
    "tritanopia": (
        (1.255528, -0.076749, -0.178779),
        (-0.078411, 0.930809, 0.147602),
        (0.004733, 0.691367, 0.303900),
    ),
}
VISIONS = ("normal", *MACHADO_2009)
# the differences the scale promises (stated in ifccheck/report/colours.py)
ADJACENT_BANDS = 10.0  # ΔE00 between neighbouring bands, in every vision
FROM_BANDS = 13.0  # ΔE00 of fail and of not checked from every band


def _linear(hex_colour: str) -> tuple[float, float, float]:
    def lin(c: int) -> float:
        s = c / 255
        return s / 12.92 if s <= 0.04045 else ((s + 0.055) / 1.055) ** 2.4

    h = hex_colour.lstrip("#")
    r, g, b = (lin(int(h[i : i + 2], 16)) for i in (0, 2, 4))
    return r, g, b


def _seen(hex_colour: str, vision: str) -> tuple[float, float, float]:
    rgb = _linear(hex_colour)
    if vision == "normal":
        return rgb
    m = MACHADO_2009[vision]
    out = [sum(m[i][j] * rgb[j] for j in range(3)) for i in range(3)]
    return tuple(min(max(v, 0.0), 1.0) for v in out)  # type: ignore[return-value]


def _lab(rgb: tuple[float, float, float]) -> tuple[float, float, float]:
    r, g, b = rgb
    x = (0.4124564 * r + 0.3575761 * g + 0.1804375 * b) / 0.95047
    y = 0.2126729 * r + 0.7151522 * g + 0.0721750 * b
    z = (0.0193339 * r + 0.1191920 * g + 0.9503041 * b) / 1.08883

    def f(t: float) -> float:
        return t ** (1 / 3) if t > 216 / 24389 else (24389 / 27 * t + 16) / 116

    fx, fy, fz = f(x), f(y), f(z)
    return 116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)


def de2000(lab1: tuple[float, float, float], lab2: tuple[float, float, float]) -> float:
    """CIEDE2000 colour difference (Sharma, Wu & Dalal 2005, Eqs. 1-22)."""
    l1, a1, b1 = lab1
    l2, a2, b2 = lab2
    cbar = (math.hypot(a1, b1) + math.hypot(a2, b2)) / 2
    g = 0.5 * (1 - math.sqrt(cbar**7 / (cbar**7 + 25**7)))
    a1p, a2p = (1 + g) * a1, (1 + g) * a2
    c1p, c2p = math.hypot(a1p, b1), math.hypot(a2p, b2)
    h1p = math.degrees(math.atan2(b1, a1p)) % 360 if c1p else 0.0
    h2p = math.degrees(math.atan2(b2, a2p)) % 360 if c2p else 0.0
    dlp, dcp = l2 - l1, c2p - c1p
    dhp = 0.0
    if c1p * c2p:
        dhp = h2p - h1p
        dhp = dhp - 360 if dhp > 180 else dhp + 360 if dhp < -180 else dhp
    dhh = 2 * math.sqrt(c1p * c2p) * math.sin(math.radians(dhp / 2))
    lbp, cbp = (l1 + l2) / 2, (c1p + c2p) / 2
    if c1p * c2p == 0:
        hbp = h1p + h2p
    elif abs(h1p - h2p) <= 180:
        hbp = (h1p + h2p) / 2
    else:
        hbp = (h1p + h2p + 360) / 2 if h1p + h2p < 360 else (h1p + h2p - 360) / 2
    t = (
        1
        - 0.17 * math.cos(math.radians(hbp - 30))
        + 0.24 * math.cos(math.radians(2 * hbp))
        + 0.32 * math.cos(math.radians(3 * hbp + 6))
        - 0.20 * math.cos(math.radians(4 * hbp - 63))
    )
    dtheta = 30 * math.exp(-(((hbp - 275) / 25) ** 2))
    rc = 2 * math.sqrt(cbp**7 / (cbp**7 + 25**7))
    sl = 1 + 0.015 * (lbp - 50) ** 2 / math.sqrt(20 + (lbp - 50) ** 2)
    sc, sh = 1 + 0.045 * cbp, 1 + 0.015 * cbp * t
    rt = -math.sin(math.radians(2 * dtheta)) * rc
    return math.sqrt(
        (dlp / sl) ** 2 + (dcp / sc) ** 2 + (dhh / sh) ** 2 + rt * (dcp / sc) * (dhh / sh)
    )


def _difference(c1: str, c2: str, vision: str) -> float:
    return de2000(_lab(_seen(c1, vision)), _lab(_seen(c2, vision)))


def test_de2000_matches_the_published_test_pair():
    # Sharma, Wu & Dalal 2005, Table 1, pair 1: ΔE00 = 2.0425
    assert de2000((50, 2.6772, -79.7751), (50, 0.0, -82.7485)) == pytest.approx(2.0425, abs=1e-4)


def test_simulation_leaves_greys_grey():
    # every Machado matrix row sums to 1: a neutral grey is seen unchanged
    for vision in MACHADO_2009:
        seen, grey = _seen("#808080", vision), _linear("#808080")
        assert max(abs(a - b) for a, b in zip(seen, grey, strict=True)) < 1e-5


@pytest.mark.parametrize("vision", VISIONS)
def test_adjacent_bands_stay_apart(vision):
    colours = [c for _, c, _ in UTILISATION_BANDS]
    gaps = [_difference(a, b, vision) for a, b in itertools.pairwise(colours)]
    assert min(gaps) >= ADJACENT_BANDS, (vision, gaps)


@pytest.mark.parametrize("vision", VISIONS)
def test_fail_and_not_checked_stand_apart_from_every_band(vision):
    for _, colour, _ in UTILISATION_BANDS:
        assert _difference(FAIL, colour, vision) >= FROM_BANDS
        assert _difference(NOT_CHECKED, colour, vision) >= FROM_BANDS
    assert _difference(FAIL, NOT_CHECKED, vision) >= FROM_BANDS


@pytest.mark.parametrize("vision", VISIONS)
def test_bands_darken_as_utilisation_rises(vision):
    lightness = [_lab(_seen(c, vision))[0] for _, c, _ in UTILISATION_BANDS]
    assert lightness == sorted(lightness, reverse=True)


def test_not_checked_is_neutral_and_fail_is_a_warm_alarm():
    _, a, b = _lab(_linear(NOT_CHECKED))
    assert math.hypot(a, b) < 1.0  # no hue
    _, a, b = _lab(_linear(FAIL))
    assert math.hypot(a, b) > 60 and 0 < math.degrees(math.atan2(b, a)) < 60  # red-orange


def test_values_fall_in_their_bands():
    assert utilisation_colour(None) == NOT_CHECKED
    assert utilisation_colour(float("nan")) == NOT_CHECKED
    assert utilisation_band(0.0) == 0 and utilisation_band(0.50) == 0
    assert utilisation_band(0.5001) == 1 and utilisation_band(0.75) == 1
    assert utilisation_band(0.90) == 2 and utilisation_band(1.0) == 3
    assert utilisation_colour(1.0) == UTILISATION_BANDS[-1][1]
    assert utilisation_colour(1.0001) == FAIL and utilisation_colour(float("inf")) == FAIL
    assert utilisation_band(-1.0) == 0
