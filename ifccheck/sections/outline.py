"""Recognise a drawn profile outline as a common steel shape, with its dimensions.

Some exports write every section as a polygon (IfcArbitraryClosedProfileDef,
IfcArbitraryProfileDefWithVoids): a 12-corner I, a 16-corner I whose root
fillets are arcs, a channel, a tee, an angle, or a hollow section as an outer
ring and a void. :func:`recognise` measures the outline as each of those
shapes (in each orientation), redraws the candidate from the measured
dimensions and keeps the one that covers the outline: their symmetric
difference must be within :data:`MATCH_TOLERANCE` of the outline's area.

Measured: overall depth and width from the bounding box (after turning the
outline square to its dominant edge direction), flange thickness from the
straight toe edges, web and leg thickness from chords through the middle of the
web or leg, and the root fillet radius from the area the fillets add (each
quarter-circle spandrel adds (1 − π/4)·r²). Parallel flanges only; a sloped
flange or an unusual outline is not recognised, and the reason says so.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from shapely import affinity
from shapely.geometry import LineString, Polygon
from shapely.geometry.polygon import orient

from ifccheck.model import ShapeFamily
from ifccheck.sections.compute import (
    angle_outline,
    channel_outline,
    i_outline,
    rounded_rectangle,
    tee_outline,
)
from ifccheck.sections.dimensions import Shape, plausible

# The redrawn shape and the outline may differ by this share of the outline's
# area (arcs drawn as a few chords, rounding of exported coordinates).
MATCH_TOLERANCE = 0.03
SPANDREL = 1.0 - math.pi / 4.0  # area of one fillet spandrel per r²
SOURCE = "measured from the profile outline"


@dataclass(frozen=True)
class Recognised:
    """A recognised outline: the shape, its depth direction and how well it matched."""

    shape: Shape
    up: tuple[float, float]  # unit vector of the section's depth direction, profile coordinates
    mismatch: float  # symmetric difference / outline area
    area: float  # the outline's own area


@dataclass(frozen=True)
class _Frame:
    """A turn by quarter turns and a mirror that brings the outline to a canonical pose."""

    quarter_turns: int
    flip_x: bool
    flip_y: bool

    def apply(self, poly: Polygon) -> Polygon:
        out = affinity.rotate(poly, 90.0 * self.quarter_turns, origin=(0.0, 0.0))
        return affinity.scale(
            out, -1.0 if self.flip_x else 1.0, -1.0 if self.flip_y else 1.0, origin=(0.0, 0.0)
        )

    def up(self) -> np.ndarray:
        """The canonical +y direction expressed in the frame before this transform."""
        v = np.array([0.0, 1.0])
        v = v * np.array([-1.0 if self.flip_x else 1.0, -1.0 if self.flip_y else 1.0])
        a = -math.radians(90.0 * self.quarter_turns)
        c, s = math.cos(a), math.sin(a)
        return np.array([c * v[0] - s * v[1], s * v[0] + c * v[1]])


def _dominant_angle(poly: Polygon) -> float:
    """Edge direction (radians, in (−π/4, π/4]) that most of the outline runs along or across."""
    xy = np.asarray(poly.exterior.coords)
    d = np.diff(xy, axis=0)
    length = np.hypot(d[:, 0], d[:, 1])
    phi = np.arctan2(d[:, 1], d[:, 0])
    return float(
        0.25 * math.atan2((length * np.sin(4 * phi)).sum(), (length * np.cos(4 * phi)).sum())
    )


def _chord(poly: Polygon, start: tuple[float, float], end: tuple[float, float]) -> list[float]:
    """Lengths of the pieces of the segment start–end inside the polygon."""
    cut = poly.intersection(LineString([start, end]))
    parts = getattr(cut, "geoms", [cut])
    return [p.length for p in parts if p.length > 0.0]


def _on_line(xy: np.ndarray, axis: int, value: float, eps: float) -> np.ndarray:
    return xy[np.abs(xy[:, axis] - value) <= eps]


def _fillet_radius(area: float, sharp_area: float, count: int, limit: float) -> float:
    extra = area - sharp_area
    if extra <= 0.0:
        return 0.0
    return min(math.sqrt(extra / (count * SPANDREL)), limit)


def _measure_i(q: Polygon, eps: float) -> tuple[float, ...] | None:
    x0, y0, x1, y1 = q.bounds
    d, bf = y1 - y0, x1 - x0
    xy = np.asarray(q.exterior.coords)
    toes = []
    for x in (x0, x1):
        on = _on_line(xy, 0, x, eps)
        upper, lower = on[on[:, 1] > 0.0], on[on[:, 1] < 0.0]
        if len(upper) < 2 or len(lower) < 2:
            return None
        toes += [y1 - upper[:, 1].min(), lower[:, 1].max() - y0]
    tf = float(np.mean(toes))
    if max(toes) - min(toes) > 0.02 * tf + eps:
        return None  # flanges of unequal thickness
    pieces = _chord(q, (x0 - bf, 0.0), (x1 + bf, 0.0))
    if len(pieces) != 1:
        return None
    tw = pieces[0]
    sharp = 2.0 * bf * tf + (d - 2.0 * tf) * tw
    r = _fillet_radius(q.area, sharp, 4, min((bf - tw) / 2.0, d / 2.0 - tf))
    return d, bf, tw, tf, r


def _measure_channel(q: Polygon, eps: float) -> tuple[float, ...] | None:
    x0, y0, x1, y1 = q.bounds
    d, bf = y1 - y0, x1 - x0
    xy = np.asarray(q.exterior.coords)
    on = _on_line(xy, 0, x1, eps)
    upper, lower = on[on[:, 1] > 0.0], on[on[:, 1] < 0.0]
    if len(upper) < 2 or len(lower) < 2:
        return None
    toes = [y1 - upper[:, 1].min(), lower[:, 1].max() - y0]
    tf = float(np.mean(toes))
    if max(toes) - min(toes) > 0.02 * tf + eps:
        return None
    pieces = _chord(q, (x0 - bf, 0.0), (x1 + bf, 0.0))
    if len(pieces) != 1:
        return None
    tw = pieces[0]
    sharp = 2.0 * bf * tf + (d - 2.0 * tf) * tw
    r = _fillet_radius(q.area, sharp, 2, min(bf - tw, d / 2.0 - tf))
    return d, bf, tw, tf, r


def _measure_tee(q: Polygon, eps: float) -> tuple[float, ...] | None:
    x0, y0, x1, y1 = q.bounds
    d, bf = y1 - y0, x1 - x0
    xy = np.asarray(q.exterior.coords)
    toes = []
    for x in (x0, x1):
        on = _on_line(xy, 0, x, eps)
        if len(on) < 2:
            return None
        toes.append(y1 - on[:, 1].min())
    tf = float(np.mean(toes))
    if max(toes) - min(toes) > 0.02 * tf + eps or tf >= 0.9 * d:
        return None
    y_stem = y0 + 0.5 * (d - tf)
    pieces = _chord(q, (x0 - bf, y_stem), (x1 + bf, y_stem))
    if len(pieces) != 1:
        return None
    tw = pieces[0]
    sharp = bf * tf + (d - tf) * tw
    r = _fillet_radius(q.area, sharp, 2, min((bf - tw) / 2.0, d - tf))
    return d, bf, tw, tf, r


def _measure_angle(q: Polygon, eps: float) -> tuple[float, ...] | None:
    x0, y0, x1, y1 = q.bounds
    d, b = y1 - y0, x1 - x0
    vertical = _chord(q, (x0 - b, y0 + 0.8 * d), (x1 + b, y0 + 0.8 * d))
    horizontal = _chord(q, (x0 + 0.8 * b, y0 - d), (x0 + 0.8 * b, y1 + d))
    if len(vertical) != 1 or len(horizontal) != 1:
        return None
    t1, t2 = vertical[0], horizontal[0]
    if abs(t1 - t2) > 0.02 * max(t1, t2) + eps:
        return None  # legs of unequal thickness
    t = (t1 + t2) / 2.0
    sharp = (d + b - t) * t
    r = _fillet_radius(q.area, sharp, 1, min(d, b) - t)
    return d, b, t, r


_Builder = Callable[[tuple[float, ...]], Polygon]

# family → (canonical poses, placement of the canonical outline, measure, redraw, to Shape dims)
_FAMILIES: list[tuple[ShapeFamily, list[_Frame], str, Callable, _Builder]] = [
    (
        ShapeFamily.I_SHAPE,
        [_Frame(0, False, False), _Frame(1, False, False)],
        "centre",
        _measure_i,
        lambda v: i_outline(*v),
    ),
    (
        ShapeFamily.CHANNEL,
        [_Frame(k, fx, False) for k in (0, 1) for fx in (False, True)],
        "left",
        _measure_channel,
        lambda v: channel_outline(*v),
    ),
    (
        ShapeFamily.TEE,
        [_Frame(k, False, fy) for k in (0, 1) for fy in (False, True)],
        "bottom",
        _measure_tee,
        lambda v: tee_outline(*v),
    ),
    (
        ShapeFamily.ANGLE,
        [_Frame(0, fx, fy) for fx in (False, True) for fy in (False, True)],
        "corner",
        _measure_angle,
        lambda v: angle_outline(*v),
    ),
]


def _place(q: Polygon, where: str) -> Polygon:
    x0, y0, x1, y1 = q.bounds
    if where == "centre":
        return affinity.translate(q, -(x0 + x1) / 2.0, -(y0 + y1) / 2.0)
    if where == "left":
        return affinity.translate(q, -x0, -(y0 + y1) / 2.0)
    if where == "bottom":
        return affinity.translate(q, -(x0 + x1) / 2.0, -y0)
    return affinity.translate(q, -x0, -y0)


def _shape(family: ShapeFamily, name: str, v: tuple[float, ...]) -> Shape:
    if family is ShapeFamily.ANGLE:
        d, b, t, r = v
        return Shape(name, family, d, b, t, t, r, source=SOURCE)
    d, bf, tw, tf, r = v
    return Shape(name, family, d, bf, tw, tf, r, source=SOURCE)


def _turned(v: np.ndarray, angle: float) -> tuple[float, float]:
    c, s = math.cos(angle), math.sin(angle)
    return (float(c * v[0] - s * v[1]), float(s * v[0] + c * v[1]))


def recognise(poly: Polygon, name: str = "") -> Recognised | str:
    """The shape a profile outline draws (dimensions in the outline's units), or why not."""
    if poly.is_empty or poly.area <= 0.0:
        return "the outline encloses no area"
    poly = orient(poly if poly.is_valid else poly.buffer(0), 1.0)
    if not isinstance(poly, Polygon):
        return "the outline falls apart into several pieces"
    size = max(poly.bounds[2] - poly.bounds[0], poly.bounds[3] - poly.bounds[1])
    poly = Polygon(
        poly.exterior.simplify(1e-7 * size).coords,
        [r.simplify(1e-7 * size).coords for r in poly.interiors],
    )
    angle = _dominant_angle(poly)
    if abs(angle) < 1e-5:  # square already; the chords of fillet arcs leave a trace
        angle = 0.0
    square = affinity.rotate(poly, -angle, origin=(0.0, 0.0), use_radians=True)
    eps = 1e-4 * size
    label = name or "outline"
    if len(square.interiors) == 1:
        return _hollow(square, label, angle, eps)
    if square.interiors:
        return f"an outline with {len(square.interiors)} voids is not a steel shape"
    best: Recognised | None = None
    for family, frames, where, measure, redraw in _FAMILIES:
        for frame in frames:
            q = _place(frame.apply(square), where)
            values = measure(q, eps)
            if values is None:
                continue
            shape = _shape(family, label, values)
            if plausible(shape) is not None:
                continue
            try:
                ideal = redraw(values)
            except (ValueError, ZeroDivisionError):
                continue
            mismatch = q.symmetric_difference(ideal).area / q.area
            if best is None or mismatch < best.mismatch:
                best = Recognised(shape, _turned(frame.up(), angle), mismatch, poly.area)
    if best is None:
        return f"{len(poly.exterior.coords) - 1} corners that draw no I, channel, tee or angle"
    if best.mismatch > MATCH_TOLERANCE:
        return (
            f"closest to {best.shape.describe()}, but that shape and the outline differ by "
            f"{best.mismatch:.1%} of its area (limit {MATCH_TOLERANCE:.0%})"
        )
    return best


def _hollow(square: Polygon, name: str, angle: float, eps: float) -> Recognised | str:
    outer = Polygon(square.exterior.coords)
    inner = Polygon(square.interiors[0].coords)
    x0, y0, x1, y1 = outer.bounds
    d, b = y1 - y0, x1 - x0
    ix0, iy0, ix1, iy1 = inner.bounds
    di, bi = iy1 - iy0, ix1 - ix0
    centre = ((x0 + x1) / 2.0, (y0 + y1) / 2.0)
    q = affinity.translate(square, -centre[0], -centre[1])
    t = ((d - di) + (b - bi)) / 4.0
    if abs((d - di) - (b - bi)) > 0.04 * t + 2 * eps or t <= 0.0:
        return "a void that is not centred with an even wall"
    circle_area = math.pi / 4.0 * d * b
    if abs(d - b) <= 0.01 * d and abs(outer.area - circle_area) <= 0.02 * circle_area:
        family, r = ShapeFamily.HOLLOW_ROUND, 0.0
        ideal = outer_ring = rounded_rectangle(d, d, d / 2.0)
        ideal = outer_ring.difference(rounded_rectangle(d - 2 * t, d - 2 * t, d / 2.0 - t))
    else:
        family = ShapeFamily.HOLLOW_RECT
        r = math.sqrt(max(d * b - outer.area, 0.0) / (4.0 - math.pi))
        r = min(r, min(d, b) / 2.0)
        ideal = rounded_rectangle(d, b, r).difference(
            rounded_rectangle(d - 2 * t, b - 2 * t, max(r - t, 0.0))
        )
    shape = Shape(name, family, d, b, t, t, r, source=SOURCE)
    why = plausible(shape)
    if why is not None:
        return why
    mismatch = q.symmetric_difference(ideal).area / q.area
    if mismatch > MATCH_TOLERANCE:
        return (
            f"closest to {shape.describe()}, but that shape and the outline differ by "
            f"{mismatch:.1%} of its area (limit {MATCH_TOLERANCE:.0%})"
        )
    up = (0.0, 1.0) if family is ShapeFamily.HOLLOW_ROUND else _turned(np.array([0.0, 1.0]), angle)
    return Recognised(shape, up, mismatch, square.area)
