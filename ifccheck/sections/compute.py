"""Section properties from plate dimensions (IfcIShapeProfileDef, IfcUShapeProfileDef).

All inputs and outputs in SI base units. Flanges are taken parallel (for
sloped-flange shapes pass the mean flange thickness, as the AISC tables do).
Fillets (quarter-circle spandrels of radius r at the web-to-flange junctions)
are included in A, I, S and Z.

Published sources of the torsion and warping formulas:
- J of I-shapes: El Darwish, I. A. & Johnston, B. G. (1965), "Torsion of
  structural shapes", ASCE J. Struct. Div. 91(ST1) — flange rectangles with
  the Saint-Venant end correction, the web between flanges, plus the junction
  term 2·α·D⁴; the formula AISC Design Guide 9 (1997) Eq. 3.4 gives.
- Cw of doubly symmetric I-shapes: Cw = Iy·ho²/4 (AISC 360-16 User Note to F2.2).
- J of channels: Σ b·t³/3 over the centreline plate lengths (AISC Design Guide 9,
  open thin-walled sections).
- Cw of channels: Cw = tf·b'³·h'²/12 · (3b'tf + 2h'tw)/(6b'tf + h'tw), with
  b' = bf − tw/2 and h' = d − tf (AISC Design Guide 9, Appendix C; Galambos,
  "Structural Members and Frames", 1968).
"""

from __future__ import annotations

import math

import numpy as np
from shapely import clip_by_rect
from shapely.geometry import Polygon
from shapely.geometry.polygon import orient

from ifccheck.model import Section, ShapeFamily

SOURCE = "computed from dimensions"
STEEL_DENSITY = 7850.0  # kg/m³

# Spandrel (square r×r less a quarter circle) constants, per r², r, r⁴.
_SPANDREL_AREA = 1.0 - math.pi / 4.0
_SPANDREL_CENTROID = (5.0 / 6.0 - math.pi / 4.0) / _SPANDREL_AREA  # from each straight edge
_SPANDREL_I_EDGE = 1.0 - 5.0 * math.pi / 16.0  # about one straight edge


def _spandrel(r: float) -> tuple[float, float, float]:
    """Area, centroid offset from each straight edge, and own centroidal I of one fillet."""
    a = _SPANDREL_AREA * r * r
    e = _SPANDREL_CENTROID * r
    i_c = _SPANDREL_I_EDGE * r**4 - a * e * e
    return a, e, i_c


def _check(name: str, **dims: float) -> None:
    for key, value in dims.items():
        if not (math.isfinite(value) and value >= 0.0):
            raise ValueError(f"{name}: {key} must be a finite, non-negative length, got {value}")
    for key in ("d", "bf", "tw", "tf"):
        if dims[key] <= 0.0:
            raise ValueError(f"{name}: {key} must be positive")
    if 2.0 * (dims["tf"] + dims["r"]) >= dims["d"]:
        raise ValueError(f"{name}: flanges and fillets leave no web (2·(tf + r) ≥ d)")


def i_section_from_dimensions(
    name: str,
    d: float,
    bf: float,
    tw: float,
    tf: float,
    r: float = 0.0,
    flange_slope: float = 0.0,
) -> Section:
    """Doubly symmetric I-section with web-to-flange fillets of radius r (m).

    ``flange_slope`` is the slope angle of the inner flange faces in radians
    (IfcIShapeProfileDef FlangeSlope; AISC S shapes and IPN: atan(1/6)); ``tf``
    is then the mean thickness at mid-outstand. Parallel flanges use closed
    forms; sloped flanges the exact outline (shapely polygon). J and Cw as
    named in the module docstring (on the mean thickness when sloped).
    """
    _check(name, d=d, bf=bf, tw=tw, tf=tf, r=r)
    if tw + 2.0 * r > bf:
        raise ValueError(f"{name}: web and fillets are wider than the flange")
    hw = d - 2.0 * tf  # web height between flange inner faces
    t_root = tf
    if flange_slope == 0.0:
        af, e, i_c = _spandrel(r)
        area = 2.0 * bf * tf + hw * tw + 4.0 * af
        yf = d / 2.0 - tf / 2.0  # flange centroid from the centroid
        yr = hw / 2.0 - e  # fillet centroid, vertical
        xr = tw / 2.0 + e  # fillet centroid, horizontal
        ix = 2.0 * (bf * tf**3 / 12.0 + bf * tf * yf**2) + tw * hw**3 / 12.0
        ix += 4.0 * (i_c + af * yr**2)
        iy = 2.0 * tf * bf**3 / 12.0 + hw * tw**3 / 12.0 + 4.0 * (i_c + af * xr**2)
        # Plastic moduli: the plastic neutral axes are the axes of symmetry.
        zx = bf * tf * (d - tf) + tw * hw**2 / 4.0 + 4.0 * af * yr
        zy = tf * bf**2 / 2.0 + hw * tw**2 / 4.0 + 4.0 * af * xr
    else:
        t_root, t_toe = _sloped(name, d, tf, (bf - tw) / 2.0, flange_slope)
        half, b2, w2 = d / 2.0, bf / 2.0, tw / 2.0
        right = [
            (b2, -half),
            (b2, -half + t_toe),
            (w2, -half + t_root),
            (w2, half - t_root),
            (b2, half - t_toe),
            (b2, half),
        ]
        left = [(-x, y) for x, y in reversed(right)]
        outline = _close(Polygon(right + left), r)
        area, _, _, ix, iy = _polygon_moments(outline)
        zx = _plastic_modulus(outline, "x")
        zy = _plastic_modulus(outline, "y")

    # Torsion, El Darwish & Johnston (1965) / AISC DG9 Eq. 3.4.
    j_flange = bf * tf**3 * (1.0 / 3.0 - 0.21 * (tf / bf) * (1.0 - tf**4 / (12.0 * bf**4)))
    j_web = hw * tw**3 / 3.0
    j_junction = 0.0
    if r > 0.0:
        t, t1 = (tf, tw) if tf < tw else (tw, tf)
        alpha = (
            -0.042
            + 0.2204 * t / t1
            + 0.1355 * r / t1
            - 0.0865 * r * t / t1**2
            - 0.0725 * t**2 / t1**2
        )
        big_d = ((tf + r) ** 2 + tw * (r + tw / 4.0)) / (2.0 * r + tf)
        j_junction = 2.0 * alpha * big_d**4
    j = 2.0 * j_flange + j_web + j_junction

    ho = d - tf
    cw = iy * ho**2 / 4.0  # AISC 360-16 User Note, F2.2
    sx = 2.0 * ix / d
    rts = math.sqrt(math.sqrt(iy * cw) / sx)  # AISC 360-16 Eq. F2-7
    return Section(
        name=name,
        family=ShapeFamily.I_SHAPE,
        d=d,
        bf=bf,
        tw=tw,
        tf=tf,
        r=r,
        A=area,
        Ix=ix,
        Iy=iy,
        Sx=sx,
        Sy=2.0 * iy / bf,
        Zx=zx,
        Zy=zy,
        rx=math.sqrt(ix / area),
        ry=math.sqrt(iy / area),
        J=j,
        Cw=cw,
        ho=ho,
        rts=rts,
        source=SOURCE,
        h=d - 2.0 * (t_root + r),
        mass_per_length=area * STEEL_DENSITY,
    )


def _sloped(name: str, d: float, tf: float, outstand: float, slope: float) -> tuple[float, float]:
    """Flange thickness at the web face and at the toe for a sloped inner face."""
    if not 0.0 <= slope < math.radians(30.0):
        raise ValueError(f"{name}: flange slope must be between 0 and 30 degrees")
    rise = math.tan(slope) * outstand / 2.0
    t_root, t_toe = tf + rise, tf - rise
    if t_toe <= 0.0 or 2.0 * t_root >= d:
        raise ValueError(f"{name}: flange slope leaves no flange toe or no web")
    return t_root, t_toe


def _close(outline: Polygon, r: float) -> Polygon:
    """Fillet the re-entrant corners with arcs of radius r.

    A morphological closing (grow then shrink by r) rounds concave corners and
    leaves the convex ones sharp.
    """
    if r <= 0.0:
        return outline
    grown = outline.buffer(r, quad_segs=32, join_style="round")
    return grown.buffer(-r, quad_segs=32, join_style="round")


def _polygon_moments(poly: Polygon) -> tuple[float, float, float, float, float]:
    """Area, centroid (x, y) and second moments Ixx, Iyy about the centroid (shoelace)."""
    area = sx = sy = ixx = iyy = 0.0
    poly = orient(poly, 1.0)  # exterior counter-clockwise, holes clockwise
    for ring in (poly.exterior, *poly.interiors):
        xy = np.asarray(ring.coords)
        x0, y0 = xy[:-1, 0], xy[:-1, 1]
        x1, y1 = xy[1:, 0], xy[1:, 1]
        cross = x0 * y1 - x1 * y0
        area += cross.sum() / 2.0
        sx += ((x0 + x1) * cross).sum() / 6.0
        sy += ((y0 + y1) * cross).sum() / 6.0
        ixx += ((y0**2 + y0 * y1 + y1**2) * cross).sum() / 12.0
        iyy += ((x0**2 + x0 * x1 + x1**2) * cross).sum() / 12.0
    cx, cy = sx / area, sy / area
    return area, cx, cy, ixx - area * cy**2, iyy - area * cx**2


def _plastic_modulus(poly: Polygon, axis: str) -> float:
    """Plastic modulus about the equal-area axis parallel to x ("x") or y ("y")."""
    minx, miny, maxx, maxy = poly.bounds
    lo, hi = (miny, maxy) if axis == "x" else (minx, maxx)
    half = poly.area / 2.0

    def below(c: float) -> Polygon:
        if axis == "x":
            return clip_by_rect(poly, minx - 1.0, miny - 1.0, maxx + 1.0, c)
        return clip_by_rect(poly, minx - 1.0, miny - 1.0, c, maxy + 1.0)

    a, b = lo, hi
    for _ in range(60):  # bisection on the equal-area axis
        mid = (a + b) / 2.0
        if below(mid).area < half:
            a = mid
        else:
            b = mid
    cut = (a + b) / 2.0
    part_lo = below(cut)
    part_hi = poly.difference(part_lo)
    k = 1 if axis == "x" else 0
    z = 0.0
    for part in (part_lo, part_hi):
        if part.is_empty:
            continue
        centre = part.centroid.coords[0][k]
        z += part.area * abs(centre - cut)
    return z


def channel_from_dimensions(
    name: str,
    d: float,
    bf: float,
    tw: float,
    tf: float,
    r: float = 0.0,
    flange_slope: float = 0.0,
) -> Section:
    """Channel (C, MC, UPN, UPE) with web-to-flange fillets of radius r (m).

    ``tf`` is the mean flange thickness, at mid-outstand; ``flange_slope`` is
    the slope angle of the inner flange faces in radians (IfcUShapeProfileDef
    FlangeSlope; 0 for parallel flanges, atan(1/6) for AISC C shapes, atan(0.08)
    for UPN). x is the major axis (parallel to the flanges), y the minor axis
    through the centroid; Sy is taken to the flange tips. Section properties
    other than J and Cw come from the exact outline (shapely polygon, fillets
    drawn as arcs by a morphological closing), J and Cw from the thin-walled
    formulas named in the module docstring on the mean thickness.
    """
    _check(name, d=d, bf=bf, tw=tw, tf=tf, r=r)
    if tw + r > bf:
        raise ValueError(f"{name}: web and fillet are wider than the flange")
    t_root, t_toe = _sloped(name, d, tf, bf - tw, flange_slope)
    half = d / 2.0
    outline = Polygon(
        [
            (0.0, -half),
            (bf, -half),
            (bf, -half + t_toe),
            (tw, -half + t_root),
            (tw, half - t_root),
            (bf, half - t_toe),
            (bf, half),
            (0.0, half),
        ]
    )
    outline = _close(outline, r)
    area, xbar, _, ix, iy = _polygon_moments(outline)
    zx = _plastic_modulus(outline, "x")
    zy = _plastic_modulus(outline, "y")

    # Torsion and warping on centreline dimensions (AISC DG9), mean thickness.
    b_c = bf - tw / 2.0
    h_c = d - tf
    j = (2.0 * b_c * tf**3 + h_c * tw**3) / 3.0
    cw = (
        (tf * b_c**3 * h_c**2 / 12.0)
        * (3.0 * b_c * tf + 2.0 * h_c * tw)
        / (6.0 * b_c * tf + h_c * tw)
    )
    sx = 2.0 * ix / d
    rts = math.sqrt(math.sqrt(iy * cw) / sx)  # AISC 360-16 Eq. F2-7
    return Section(
        name=name,
        family=ShapeFamily.CHANNEL,
        d=d,
        bf=bf,
        tw=tw,
        tf=tf,
        r=r,
        A=area,
        Ix=ix,
        Iy=iy,
        Sx=sx,
        Sy=iy / (bf - xbar),
        Zx=zx,
        Zy=zy,
        rx=math.sqrt(ix / area),
        ry=math.sqrt(iy / area),
        J=j,
        Cw=cw,
        ho=h_c,
        rts=rts,
        source=SOURCE,
        h=d - 2.0 * (t_root + r),
        mass_per_length=area * STEEL_DENSITY,
    )


# --- Outlines of the common shapes in a canonical placement (for recognising
# drawn outlines); fillets at the re-entrant corners as arcs of radius r.


def i_outline(d: float, bf: float, tw: float, tf: float, r: float = 0.0) -> Polygon:
    """Doubly symmetric I, centred on the origin, depth along y."""
    hb, hd, hw = bf / 2.0, d / 2.0, tw / 2.0
    sharp = Polygon(
        [
            (-hb, -hd), (hb, -hd), (hb, -hd + tf), (hw, -hd + tf), (hw, hd - tf),
            (hb, hd - tf), (hb, hd), (-hb, hd), (-hb, hd - tf), (-hw, hd - tf),
            (-hw, -hd + tf), (-hb, -hd + tf),
        ]
    )  # fmt: skip
    return _close(sharp, r)


def channel_outline(d: float, bf: float, tw: float, tf: float, r: float = 0.0) -> Polygon:
    """Channel with the back of its web on x = 0, flanges towards +x, centred on y = 0."""
    hd = d / 2.0
    sharp = Polygon(
        [(0.0, -hd), (bf, -hd), (bf, -hd + tf), (tw, -hd + tf), (tw, hd - tf), (bf, hd - tf),
         (bf, hd), (0.0, hd)]
    )  # fmt: skip
    return _close(sharp, r)


def tee_outline(d: float, bf: float, tw: float, tf: float, r: float = 0.0) -> Polygon:
    """Tee with its flange on top (y from d − tf to d) and its stem down to y = 0, centred on x."""
    hb, hw = bf / 2.0, tw / 2.0
    sharp = Polygon(
        [(-hw, 0.0), (hw, 0.0), (hw, d - tf), (hb, d - tf), (hb, d), (-hb, d), (-hb, d - tf),
         (-hw, d - tf)]
    )  # fmt: skip
    return _close(sharp, r)


def angle_outline(d: float, b: float, t: float, r: float = 0.0) -> Polygon:
    """Angle with its heel at the origin, leg d along +y and leg b along +x."""
    sharp = Polygon([(0.0, 0.0), (b, 0.0), (b, t), (t, t), (t, d), (0.0, d)])
    return _close(sharp, r)


def rounded_rectangle(d: float, b: float, radius: float = 0.0) -> Polygon:
    """Rectangle b × d centred on the origin with corners rounded to ``radius``."""
    if radius <= 0.0:
        return Polygon([(-b / 2, -d / 2), (b / 2, -d / 2), (b / 2, d / 2), (-b / 2, d / 2)])
    core = Polygon(
        [
            (-b / 2 + radius, -d / 2 + radius), (b / 2 - radius, -d / 2 + radius),
            (b / 2 - radius, d / 2 - radius), (-b / 2 + radius, d / 2 - radius),
        ]
    )  # fmt: skip
    return core.buffer(radius, quad_segs=32)
