"""Local buckling classification for flexure (AISC 360-16 Table B4.1b), and the one
place that decides whether a section is rolled or built-up.

Cases used (λp, λr as multiples of √(E/Fy) unless stated):

- 10 flanges of rolled I-shapes, channels and tees: bf/2tf (bf/tf for channels), 0.38, 1.0;
- 11 flanges of built-up I-shapes: 0.38, 0.95√(kc·E/FL)/√(E/Fy) with
  kc = 4/√(h/tw), 0.35 ≤ kc ≤ 0.76 (note [a]) and FL from note [b];
- 12 legs of single angles (and of double angles, F9/F10): b/t, 0.54, 0.91;
- 13 flanges of I-shapes and channels about the minor axis: 0.38, 1.0;
- 14 stems of tees: d/tw, 0.84, 1.52;
- 15 webs of doubly symmetric I-shapes and channels: h/tw, 3.76, 5.70;
- 16 webs of singly symmetric I-shapes: hc/tw, (hc/hp)/(0.54·Mp/My − 0.09)² ≤ λr, 5.70;
- 17 flanges of rectangular HSS: b/t, 1.12, 1.40;
- 19 webs of rectangular HSS: h/t, 2.42, 5.70;
- 20 round HSS: D/t, 0.07·E/Fy, 0.31·E/Fy.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import Literal

from ifccheck.model import Section, ShapeFamily
from ifccheck.sections.shapes import (
    angle_legs,
    elastic_moduli,
    flanges,
    hss_flats,
    is_singly_symmetric_i,
    neutral_axis_from_top,
    plastic_axis_from_top,
)
from ifccheck.sections.table import SOURCE as TABLE_SOURCE

ElementClass = Literal["compact", "noncompact", "slender"]
Axis = Literal["major", "minor"]

# Names that say a section is welded from plates (common practice): "welded",
# "built-up", "plate girder", a "PG" mark, and the welded-shape series
# WWF/WRF (CSA G40.20) and WB/WC (AS/NZS 3679.2).
_WELDED_NAME = re.compile(
    r"WELD|BUILT[\s_-]*UP|PLATE[\s_-]*GIRDER|^PG\s*\d|^(WWF|WRF|WB|WC)\s*\d", re.IGNORECASE
)


def is_built_up(section: Section) -> bool:
    """Whether a section counts as built-up (welded plates) rather than rolled.

    The one decision used by flexure (Table B4.1b case 10 or 11) and shear
    (G2.1(a) or (b)): an explicit ``fabrication`` wins; a shape-table section
    is rolled; an I with unequal flanges or a welded name is built-up; a
    fillet radius r > 0 means rolled; anything else — no fillet, or nothing
    known — is built-up, the conservative side.
    """
    if section.fabrication == "rolled":
        return False
    if section.fabrication == "welded":
        return True
    if section.source == TABLE_SOURCE:
        return False
    if is_singly_symmetric_i(section) or _WELDED_NAME.search(section.name.strip()):
        return True
    return not section.r > 0.0


@dataclass(frozen=True)
class Slenderness:
    """Width-to-thickness ratio λ of one element and its limits λp, λr."""

    lam: float
    lam_p: float
    lam_r: float

    @property
    def cls(self) -> ElementClass:
        if self.lam <= self.lam_p:
            return "compact"
        if self.lam <= self.lam_r:
            return "noncompact"
        return "slender"


@dataclass(frozen=True)
class FlexureClass:
    """Classification of the compression flange (or leg, wall) and the web (or stem)."""

    flange: Slenderness
    web: Slenderness
    case_flange: int = 10  # Table B4.1b case numbers
    case_web: int = 15

    @property
    def flange_class(self) -> ElementClass:
        return self.flange.cls

    @property
    def web_class(self) -> ElementClass:
        return self.web.cls


def kc_factor(h_tw: float) -> float:
    """kc = 4/√(h/tw), 0.35 ≤ kc ≤ 0.76 (Table B4.1b note [a])."""
    return min(max(4.0 / math.sqrt(h_tw), 0.35), 0.76) if h_tw > 0.0 else 0.76


def i_web_depths(section: Section, compression_top: bool = True) -> tuple[float, float]:
    """(hc, hp) of an I-shape (AISC 360-16 B4.1b(b)): twice the distance from the elastic
    (hc) and the plastic (hp) neutral axis to the compression flange's inside face, less
    the fillet."""
    (_, tft), (_, tfb) = flanges(section)
    c = neutral_axis_from_top(section)
    p = plastic_axis_from_top(section)
    if compression_top:
        return 2.0 * (c - tft - section.r), 2.0 * (p - tft - section.r)
    return 2.0 * (section.d - c - tfb - section.r), 2.0 * (section.d - p - tfb - section.r)


def flange_limit_stress(section: Section, fy: float, compression_top: bool = True) -> float:
    """FL of Table B4.1b note [b] / Eqs. F4-6a, F4-6b: 0.7Fy, or Fy·Sxt/Sxc ≥ 0.5Fy."""
    s_top, s_bot = elastic_moduli(section)
    sxc, sxt = (s_top, s_bot) if compression_top else (s_bot, s_top)
    ratio = sxt / sxc
    return 0.7 * fy if ratio >= 0.7 else max(fy * ratio, 0.5 * fy)


def classify_flexure(
    section: Section,
    fy: float,
    E: float,
    compression_top: bool = True,
    axis: Axis = "major",
) -> FlexureClass:
    """Table B4.1b classification of the elements that matter for the family and axis.

    I-shapes and channels about the major axis: compression flange (case 10
    rolled, 11 built-up) and web (15 doubly, 16 singly symmetric); about the
    minor axis: flanges (13). Tees: flange (10) and stem (14). Angles: the
    horizontal leg as "flange" and the vertical leg as "web" (12). Rectangular
    HSS: flange (17) and web (19), swapped for the minor axis. Round HSS: the
    wall (20) as both.
    """
    if fy <= 0.0 or E <= 0.0:
        raise ValueError("Fy and E must be positive")
    root = math.sqrt(E / fy)
    fam = section.family
    if fam in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL):
        return _classify_i(section, fy, E, compression_top, axis)
    if fam is ShapeFamily.TEE:
        flange = Slenderness(section.bf / (2 * section.tf), 0.38 * root, 1.0 * root)
        stem = Slenderness(section.d / section.tw, 0.84 * root, 1.52 * root)
        return FlexureClass(flange, stem, 10, 14)
    if fam is ShapeFamily.ANGLE:
        d, b = angle_legs(section)
        leg_h = Slenderness(b / section.tf, 0.54 * root, 0.91 * root)
        leg_v = Slenderness(d / section.tw, 0.54 * root, 0.91 * root)
        return FlexureClass(leg_h, leg_v, 12, 12)
    if fam is ShapeFamily.HOLLOW_RECT:
        h, b = hss_flats(section)
        if axis == "minor":
            h, b = b, h
        flange = Slenderness(b / section.tf, 1.12 * root, 1.40 * root)
        web = Slenderness(h / section.tw, 2.42 * root, 5.70 * root)
        return FlexureClass(flange, web, 17, 19)
    if fam is ShapeFamily.HOLLOW_ROUND:
        wall = Slenderness(section.d / section.tf, 0.07 * E / fy, 0.31 * E / fy)
        return FlexureClass(wall, wall, 20, 20)
    raise ValueError(f"{section.name}: no Table B4.1b classification for this shape family")


def _classify_i(
    section: Section, fy: float, E: float, compression_top: bool, axis: Axis
) -> FlexureClass:
    root = math.sqrt(E / fy)
    channel = section.family is ShapeFamily.CHANNEL
    (bft, tft), (bfb, tfb) = flanges(section)
    if axis == "minor":
        # Case 13: each flange, the more slender governing.
        lam = max(bft / tft, bfb / tfb) if channel else max(bft / (2 * tft), bfb / (2 * tfb))
        flange = Slenderness(lam, 0.38 * root, 1.0 * root)
        web = Slenderness(section.web_slenderness, 3.76 * root, 5.70 * root)
        return FlexureClass(flange, web, 13, 15)
    bfc, tfc = (bft, tft) if compression_top else (bfb, tfb)
    lam_f = bfc / tfc if channel else bfc / (2.0 * tfc)
    if channel or not is_built_up(section):
        flange = Slenderness(lam_f, 0.38 * root, 1.0 * root)
        case_f = 10
    else:
        kc = kc_factor(section.web_slenderness)
        fl = flange_limit_stress(section, fy, compression_top)
        flange = Slenderness(lam_f, 0.38 * root, 0.95 * math.sqrt(kc * E / fl))
        case_f = 11
    if not is_singly_symmetric_i(section):
        web = Slenderness(section.web_slenderness, 3.76 * root, 5.70 * root)
        return FlexureClass(flange, web, case_f, 15)
    hc, hp = i_web_depths(section, compression_top)
    mp_my = section.Zx / min(elastic_moduli(section))
    lam_r = 5.70 * root
    lam_p = min((hc / hp) * root / (0.54 * mp_my - 0.09) ** 2, lam_r) if hp > 0 else lam_r
    return FlexureClass(flange, Slenderness(hc / section.tw, lam_p, lam_r), case_f, 16)
