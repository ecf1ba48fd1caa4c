"""A cross-section known by its family and dimensions, before its properties.

The reader finds shapes in parametric profiles, in polygon outlines and in
names; every one of them becomes a :class:`Shape` (SI base units). Section
properties follow from the shape where this package has a routine for the
family (:func:`section_of`); other families keep their dimensions, so that
they can still brace and support, and say why they have no properties yet.

Dimensions use the :class:`~ifccheck.model.Section` convention for each family:
I-shapes, channels and tees d, bf, tw, tf, r (root fillet); angles d (vertical
leg), bf (horizontal leg), tw = tf = t, r (root fillet); rectangular hollow
sections d, bf, tw = tf = t, r (outside corner radius, 0 when unknown); round
hollow sections d = bf = outside diameter, tw = tf = t.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from ifccheck.model import Section, ShapeFamily
from ifccheck.reasons import NotChecked, Reason
from ifccheck.sections.compute import channel_from_dimensions, i_section_from_dimensions
from ifccheck.sections.shapes import (
    angle_from_dimensions,
    rect_hollow_from_dimensions,
    round_hollow_from_dimensions,
    singly_symmetric_i_from_dimensions,
    tee_from_dimensions,
)

FAMILY_WORDS = {
    ShapeFamily.I_SHAPE: "I-shape",
    ShapeFamily.CHANNEL: "channel",
    ShapeFamily.TEE: "tee",
    ShapeFamily.ANGLE: "angle",
    ShapeFamily.HOLLOW_RECT: "rectangular hollow section",
    ShapeFamily.HOLLOW_ROUND: "round hollow section",
    ShapeFamily.OTHER: "shape",
}


@dataclass(frozen=True)
class Shape:
    """Family and dimensions (m) of a cross-section, and where they came from."""

    name: str
    family: ShapeFamily
    d: float
    bf: float
    tw: float
    tf: float
    r: float = 0.0
    flange_slope: float = 0.0  # radians; tf is then the mean thickness at mid-outstand
    fabrication: str = ""  # "rolled", "welded" or "" (unknown)
    source: str = ""  # e.g. "EN 10365 via structuralcodes", "IfcLShapeProfileDef", "name"
    # A singly symmetric I: the bottom flange (bf, tf are then the top flange's); 0: same.
    bf_bottom: float = 0.0
    tf_bottom: float = 0.0

    def dimensions(self) -> dict[str, float]:
        """Named dimensions (m) in the words of the family."""
        f = self.family
        if f is ShapeFamily.ANGLE:
            return {"d": self.d, "b": self.bf, "t": self.tw, "r": self.r}
        if f is ShapeFamily.HOLLOW_RECT:
            return {"d": self.d, "b": self.bf, "t": self.tw, "r_out": self.r}
        if f is ShapeFamily.HOLLOW_ROUND:
            return {"od": self.d, "t": self.tw}
        if f is ShapeFamily.OTHER:
            return {"d": self.d, "b": self.bf}
        dims = {"d": self.d, "bf": self.bf, "tw": self.tw, "tf": self.tf, "r": self.r}
        if self.bf_bottom or self.tf_bottom:
            dims["bf_bottom"] = self.bf_bottom or self.bf
            dims["tf_bottom"] = self.tf_bottom or self.tf
        if self.flange_slope:
            dims["flange_slope"] = self.flange_slope
        return dims

    def describe(self) -> str:
        """'tee 1/2IPE300 (d 150, bf 150, tw 7.1, tf 10.7, r 15 mm)'."""
        dims = ", ".join(
            f"{k} {v * 1000.0:.4g}" for k, v in self.dimensions().items() if k != "flange_slope"
        )
        return f"{FAMILY_WORDS[self.family]} {self.name} ({dims} mm)"

    @property
    def thickest(self) -> float:
        """Thickest plate (m), for thickness-dependent yield strengths."""
        return max(self.tw, self.tf)


def section_of(shape: Shape) -> tuple[Section | None, Reason | None]:
    """Section properties of a shape, or None and the reason there are none.

    I-shapes and channels are computed by :mod:`ifccheck.sections.compute`;
    singly symmetric I-shapes, tees, angles and hollow sections by
    :mod:`ifccheck.sections.shapes`. Other shapes keep their dimensions only.
    """
    s = shape
    try:
        section: Section | None = None
        f = s.family
        if f is ShapeFamily.I_SHAPE and (s.bf_bottom or s.tf_bottom):
            section = singly_symmetric_i_from_dimensions(
                s.name, s.d, s.bf, s.tf, s.bf_bottom or s.bf, s.tf_bottom or s.tf, s.tw, s.r,
                fabrication=s.fabrication,
            )  # fmt: skip
        elif f is ShapeFamily.I_SHAPE:
            section = i_section_from_dimensions(s.name, s.d, s.bf, s.tw, s.tf, s.r, s.flange_slope)
        elif f is ShapeFamily.CHANNEL:
            section = channel_from_dimensions(s.name, s.d, s.bf, s.tw, s.tf, s.r, s.flange_slope)
        elif f is ShapeFamily.TEE:
            section = tee_from_dimensions(s.name, s.d, s.bf, s.tw, s.tf, s.r)
        elif f is ShapeFamily.ANGLE:
            section = angle_from_dimensions(s.name, s.d, s.bf, s.tw, s.r)
        elif f is ShapeFamily.HOLLOW_RECT:
            section = rect_hollow_from_dimensions(s.name, s.d, s.bf, s.tw, s.r or None)
        elif f is ShapeFamily.HOLLOW_ROUND:
            section = round_hollow_from_dimensions(s.name, s.d, s.tw)
    except ValueError as exc:
        return None, Reason.of(NotChecked.BAD_ELEMENT, detail=str(exc))
    if section is not None:
        if s.fabrication and not section.fabrication:
            section = replace(section, fabrication=s.fabrication)
        return section, None
    return None, Reason.of(
        NotChecked.SHAPE_WITHOUT_PROPERTIES,
        detail=f"{shape.describe()}: no section-property routine for this family yet",
    )


def cut_tee(name: str, parent: Shape) -> Shape:
    """The tee cut from an I-shape through mid-depth (e.g. 1/2IPE300)."""
    return Shape(
        name=name,
        family=ShapeFamily.TEE,
        d=parent.d / 2.0,
        bf=parent.bf,
        tw=parent.tw,
        tf=parent.tf,
        r=parent.r,
        flange_slope=parent.flange_slope,
        fabrication=parent.fabrication,
        source=f"half of {parent.name} ({parent.source})" if parent.source else "",
    )


def shape_of_section(section: Section) -> Shape:
    """The dimensions of a tabulated or computed section, as a Shape."""
    return Shape(
        name=section.name,
        family=section.family,
        d=section.d,
        bf=section.bf,
        tw=section.tw,
        tf=section.tf,
        r=section.r,
        source=section.source,
    )


def plausible(shape: Shape) -> str | None:
    """Why the dimensions cannot be a section of this family, or None if they can."""
    values = (shape.d, shape.bf, shape.tw, shape.tf, shape.r)
    if not all(math.isfinite(v) and v >= 0.0 for v in values):
        return "a dimension is negative or not a number"
    if min(shape.d, shape.bf, shape.tw, shape.tf) <= 0.0:
        return "a dimension is zero"
    f = shape.family
    if f in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL) and 2.0 * shape.tf >= shape.d:
        return "the flanges leave no web"
    if f is ShapeFamily.TEE and shape.tf >= shape.d:
        return "the flange leaves no stem"
    if f in (ShapeFamily.HOLLOW_RECT, ShapeFamily.HOLLOW_ROUND) and (
        2.0 * shape.tw >= min(shape.d, shape.bf)
    ):
        return "the walls leave no hollow"
    if f is ShapeFamily.ANGLE and shape.tw >= min(shape.d, shape.bf):
        return "the thickness leaves no leg"
    if f in (ShapeFamily.I_SHAPE, ShapeFamily.TEE) and shape.tw > shape.bf:
        return "the web is wider than the flange"
    return None
