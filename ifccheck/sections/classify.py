"""Local buckling classification for flexure, AISC 360-16 Table B4.1b."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Literal

from ifccheck.model import Section, ShapeFamily

ElementClass = Literal["compact", "noncompact", "slender"]


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
    """Flange and web classification of an I-shape or channel in major-axis flexure."""

    flange: Slenderness
    web: Slenderness

    @property
    def flange_class(self) -> ElementClass:
        return self.flange.cls

    @property
    def web_class(self) -> ElementClass:
        return self.web.cls


def classify_flexure(section: Section, fy: float, E: float) -> FlexureClass:
    """Table B4.1b: case 10 (flanges of rolled I-shapes and channels) and case 15 (webs).

    Flange λ = bf/2tf for I-shapes, bf/tf for channels; λp = 0.38√(E/Fy),
    λr = 1.0√(E/Fy). Web λ = h/tw; λp = 3.76√(E/Fy), λr = 5.70√(E/Fy).
    """
    if section.family not in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL):
        raise ValueError(
            f"{section.name}: Table B4.1b cases 10 and 15 apply to I-shapes and channels only"
        )
    if fy <= 0.0 or E <= 0.0:
        raise ValueError("Fy and E must be positive")
    root = math.sqrt(E / fy)
    flange = Slenderness(section.flange_slenderness, 0.38 * root, 1.0 * root)
    web = Slenderness(section.web_slenderness, 3.76 * root, 5.70 * root)
    return FlexureClass(flange, web)
