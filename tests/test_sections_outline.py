"""Drawn profile outlines recognised as shapes, with the dimensions they were drawn from.

Each outline is drawn here from known dimensions (IPE300 per EN 10365, from
memory: h 300, b 150, tw 7.1, tf 10.7, r 15 mm), turned, mirrored or moved as
exports write them; recognition must give back the same dimensions.
"""

from __future__ import annotations

import math

import pytest
from shapely import affinity
from shapely.geometry import Point, Polygon

from ifccheck.model import ShapeFamily
from ifccheck.sections.compute import (
    angle_outline,
    channel_outline,
    i_outline,
    rounded_rectangle,
    tee_outline,
)
from ifccheck.sections.outline import Recognised, recognise

MM = 1e-3
IPE300 = (300 * MM, 150 * MM, 7.1 * MM, 10.7 * MM, 15 * MM)


def _ok(poly: Polygon) -> Recognised:
    found = recognise(poly, "drawn")
    assert isinstance(found, Recognised), found
    return found


def _dims(found: Recognised) -> tuple[float, ...]:
    s = found.shape
    return (s.d, s.bf, s.tw, s.tf, s.r)


def test_twelve_corner_i() -> None:
    found = _ok(i_outline(*IPE300[:4]))
    assert found.shape.family is ShapeFamily.I_SHAPE
    assert _dims(found) == pytest.approx((*IPE300[:4], 0.0), abs=1e-9)
    assert found.up == pytest.approx((0.0, 1.0))


def test_i_with_fillet_arcs() -> None:
    found = _ok(i_outline(*IPE300))
    # the arcs are chords here, so r comes back within a few per cent
    assert _dims(found)[:4] == pytest.approx(IPE300[:4], rel=0.002)
    assert found.shape.r == pytest.approx(IPE300[4], rel=0.02)


@pytest.mark.parametrize("degrees", [90.0, 30.0, -45.0])
def test_turned_i_gives_its_depth_direction(degrees: float) -> None:
    found = _ok(affinity.rotate(i_outline(*IPE300), degrees, origin=(0.0, 0.0)))
    assert _dims(found)[:4] == pytest.approx(IPE300[:4], rel=0.002)
    a = math.radians(degrees)
    up = (-math.sin(a), math.cos(a))  # +y turned by the same angle
    assert abs(found.up[0] * up[0] + found.up[1] * up[1]) == pytest.approx(1.0, abs=1e-9)


def test_moved_outline_in_millimetres() -> None:
    mm = tuple(v / MM for v in IPE300)
    found = _ok(affinity.translate(i_outline(*mm), 400.0, -75.0))
    assert _dims(found)[:4] == pytest.approx(mm[:4], rel=0.002)


@pytest.mark.parametrize("mirror", [False, True])
def test_channel(mirror: bool) -> None:
    # UPE200, EN 10365 from memory: h 200, b 80, tw 6, tf 11, r 13 mm
    poly = channel_outline(0.200, 0.080, 0.006, 0.011, 0.013)
    if mirror:
        poly = affinity.scale(poly, -1.0, 1.0, origin=(0.0, 0.0))
    found = _ok(poly)
    assert found.shape.family is ShapeFamily.CHANNEL
    assert _dims(found)[:4] == pytest.approx((0.200, 0.080, 0.006, 0.011), rel=0.002)


def test_tee_stem_up_gives_up_down() -> None:
    poly = affinity.scale(tee_outline(0.150, 0.150, 0.0071, 0.0107, 0.015), 1, -1, origin=(0, 0))
    found = _ok(poly)
    assert found.shape.family is ShapeFamily.TEE
    assert _dims(found)[:4] == pytest.approx((0.150, 0.150, 0.0071, 0.0107), rel=0.002)
    assert found.up == pytest.approx((0.0, -1.0), abs=1e-9)  # the flange is down


def test_angle() -> None:
    found = _ok(affinity.rotate(angle_outline(0.100, 0.075, 0.008, 0.010), 180.0, origin=(0, 0)))
    assert found.shape.family is ShapeFamily.ANGLE
    d = found.shape.dimensions()
    assert (d["d"], d["b"], d["t"]) == pytest.approx((0.100, 0.075, 0.008), rel=0.002)


def test_rectangular_hollow_section() -> None:
    # RHS 200x100x8 with the EN 10219-2 corner radii (from memory: ro = 2t for t ≤ 6 mm,
    # 2.5t to 10 mm): ro = 20, ri = 12 mm
    poly = rounded_rectangle(0.200, 0.100, 0.020).difference(rounded_rectangle(0.184, 0.084, 0.012))
    found = _ok(poly)
    assert found.shape.family is ShapeFamily.HOLLOW_RECT
    d = found.shape.dimensions()
    assert (d["d"], d["b"], d["t"]) == pytest.approx((0.200, 0.100, 0.008), rel=0.002)
    assert d["r_out"] == pytest.approx(0.020, rel=0.02)


def test_circular_hollow_section() -> None:
    poly = Point(0, 0).buffer(0.08415, 64).difference(Point(0, 0).buffer(0.07785, 64))
    found = _ok(poly)
    assert found.shape.family is ShapeFamily.HOLLOW_ROUND
    assert (found.shape.d, found.shape.tw) == pytest.approx((0.1683, 0.0063), rel=0.002)


@pytest.mark.parametrize(
    "poly",
    [
        Polygon([(0, 0), (0.2, 0), (0.2, 0.02), (0, 0.02)]),  # a flat plate
        Polygon([(0, 0), (1, 0), (0.5, 1)]),
        # an I whose top flange is twice as thick as the bottom one
        Polygon(
            [
                (-0.075, -0.15),
                (0.075, -0.15),
                (0.075, -0.14),
                (0.004, -0.14),
                (0.004, 0.13),
                (0.075, 0.13),
                (0.075, 0.15),
                (-0.075, 0.15),
                (-0.075, 0.13),
                (-0.004, 0.13),
                (-0.004, -0.14),
                (-0.075, -0.14),
            ]
        ),
    ],
)
def test_other_outlines_are_not_recognised(poly: Polygon) -> None:
    found = recognise(poly)
    assert isinstance(found, str) and found
