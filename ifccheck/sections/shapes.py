"""Sections of the other shape families from plain dimensions, and their geometry.

Constructors (names and dimensions in metres → :class:`~ifccheck.model.Section`
in SI base units; each raises ValueError on impossible dimensions):

- ``singly_symmetric_i_from_dimensions(name, d, bf_top, tf_top, bf_bottom, tf_bottom, tw,
  r=0.0, fabrication="")`` — I with unequal flanges (IfcAsymmetricIShapeProfileDef);
- ``tee_from_dimensions(name, d, bf, tw, tf, r=0.0)`` — flange on top (IfcTShapeProfileDef);
- ``angle_from_dimensions(name, d, b, t, r=0.0)`` — vertical leg d, horizontal leg b,
  heel at the bottom (IfcLShapeProfileDef);
- ``double_angle_from_dimensions(name, d, b, t, gap=0.0, r=0.0)`` — two angles, vertical
  legs d back to back ``gap`` apart, outstanding legs b on top (as the AISC tables draw 2L);
- ``rect_hollow_from_dimensions(name, d, b, t, corner_radius=None)`` — rectangular or
  square HSS (IfcRectangleHollowProfileDef), t the design wall thickness;
- ``round_hollow_from_dimensions(name, od, t)`` — round HSS or pipe (IfcCircleHollowProfileDef).

``r`` is the root fillet radius (0 when unknown or welded). Area, second
moments, elastic and plastic moduli come from the exact outline (a shapely
polygon; fillets drawn as arcs by a morphological closing). Torsion and
warping constants use the published thin-walled formulas named at each
constructor. The geometry helpers below (``elastic_moduli``, ``flanges``,
``angle_legs``, ``hss_flats``) are what the design code reads.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from shapely import clip_by_rect
from shapely.geometry import (
    LinearRing,
    MultiPolygon,
    Polygon,
    box,
)
from shapely.geometry.base import BaseGeometry
from shapely.geometry.polygon import orient

from ifccheck.model import Section, ShapeFamily

SOURCE = "computed from dimensions"
STEEL_DENSITY = 7850.0  # kg/m³
_QUAD = 32  # polygon segments per quarter circle for fillets and corners


# --- outline geometry -------------------------------------------------------------


@dataclass(frozen=True)
class _Plane:
    """Area, centroid and centroidal second moments of a plane figure."""

    area: float
    cx: float
    cy: float
    ixx: float
    iyy: float
    ixy: float


def _rings(shape: BaseGeometry) -> list[LinearRing]:
    """Every ring of a polygon or of the parts of a multipolygon, oriented for the sums."""
    parts = list(shape.geoms) if isinstance(shape, MultiPolygon) else [shape]
    rings: list[LinearRing] = []
    for part in parts:
        p = orient(part, 1.0)  # exterior counter-clockwise, holes clockwise
        rings += [p.exterior, *p.interiors]
    return rings


def _moments(shape: BaseGeometry) -> _Plane:
    """Shoelace sums over the exteriors and the holes."""
    area = sx = sy = ixx = iyy = ixy = 0.0
    for ring in _rings(shape):
        xy = np.asarray(ring.coords)
        x0, y0 = xy[:-1, 0], xy[:-1, 1]
        x1, y1 = xy[1:, 0], xy[1:, 1]
        cross = x0 * y1 - x1 * y0
        area += cross.sum() / 2.0
        sx += ((x0 + x1) * cross).sum() / 6.0
        sy += ((y0 + y1) * cross).sum() / 6.0
        ixx += ((y0**2 + y0 * y1 + y1**2) * cross).sum() / 12.0
        iyy += ((x0**2 + x0 * x1 + x1**2) * cross).sum() / 12.0
        ixy += ((x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0) * cross).sum() / 24.0
    cx, cy = sx / area, sy / area
    return _Plane(area, cx, cy, ixx - area * cy**2, iyy - area * cx**2, ixy - area * cx * cy)


def _plastic(poly: BaseGeometry, axis: str) -> tuple[float, float]:
    """(plastic modulus, position of the equal-area axis) parallel to x ("x") or y ("y")."""
    minx, miny, maxx, maxy = poly.bounds
    a, b = (miny, maxy) if axis == "x" else (minx, maxx)
    half = poly.area / 2.0

    def below(c: float) -> BaseGeometry:
        if axis == "x":
            return clip_by_rect(poly, minx - 1.0, miny - 1.0, maxx + 1.0, c)
        return clip_by_rect(poly, minx - 1.0, miny - 1.0, c, maxy + 1.0)

    for _ in range(64):  # bisection on the equal-area axis
        mid = (a + b) / 2.0
        if below(mid).area < half:
            a = mid
        else:
            b = mid
    cut = (a + b) / 2.0
    lower = below(cut)
    upper = poly.difference(lower)
    k = 1 if axis == "x" else 0
    z = sum(
        part.area * abs(part.centroid.coords[0][k] - cut)
        for part in (lower, upper)
        if not part.is_empty
    )
    return z, cut


def _close(outline: Polygon, r: float) -> Polygon:
    """Round the re-entrant corners with arcs of radius r (grow, then shrink, by r)."""
    minx, miny, maxx, maxy = outline.bounds
    if r <= 1e-9 * max(maxx - minx, maxy - miny):  # no fillet worth drawing
        return outline
    grown = outline.buffer(r, quad_segs=_QUAD, join_style="round")
    closed = grown.buffer(-r, quad_segs=_QUAD, join_style="round")
    if not isinstance(closed, Polygon) or not closed.area > 0.0:
        raise ValueError(f"a fillet of radius {r} cannot be drawn on this outline")
    return closed


def _positive(name: str, **dims: float) -> None:
    for key, value in dims.items():
        if not (math.isfinite(value) and value > 0.0):
            raise ValueError(f"{name}: {key} must be a positive, finite length, got {value}")


def _non_negative(name: str, **dims: float) -> None:
    for key, value in dims.items():
        if not (math.isfinite(value) and value >= 0.0):
            raise ValueError(f"{name}: {key} must be a finite, non-negative length, got {value}")


def _plate_j(b: float, t: float, free_ends: int) -> float:
    """Saint-Venant J of a b×t plate with 0, 1 or 2 free ends (Roark; AISC Design Guide 9).

    Each free end removes 0.105·t⁴ (1 − t⁴/(192·b⁴)) from b·t³/3.
    """
    if b <= 0.0:
        return 0.0
    long, thin = max(b, t), min(b, t)
    return long * thin**3 / 3.0 - free_ends * 0.105 * thin**4 * (1.0 - thin**4 / (192 * long**4))


def _junction_j(tf: float, tw: float, r: float) -> float:
    """Tee-junction term α·D⁴ (El Darwish & Johnston 1965; AISC Design Guide 9 Eq. 3.4)."""
    if r <= 0.0:
        return 0.0
    t, t1 = (tf, tw) if tf < tw else (tw, tf)
    alpha = -0.042 + 0.2204 * t / t1 + 0.1355 * r / t1 - 0.0865 * r * t / t1**2
    alpha -= 0.0725 * t**2 / t1**2
    big_d = ((tf + r) ** 2 + tw * (r + tw / 4.0)) / (2.0 * r + tf)
    return alpha * big_d**4


def _section(
    name: str,
    family: ShapeFamily,
    poly: BaseGeometry,
    *,
    d: float,
    bf: float,
    tw: float,
    tf: float,
    r: float,
    j: float,
    cw: float,
    ho: float,
    h: float,
    sy_width: float | None = None,
    **extra: float | str | None,
) -> Section:
    """A Section from an outline (x across, y up) and the constants computed by the caller."""
    g = _moments(poly)
    zx, pna = _plastic(poly, "x")
    zy, _ = _plastic(poly, "y")
    _, miny, maxx, maxy = poly.bounds
    minx = poly.bounds[0]
    y_top = maxy - g.cy
    sx = g.ixx / max(y_top, g.cy - miny)
    sy = g.iyy / (sy_width if sy_width is not None else max(maxx - g.cx, g.cx - minx))
    rts = math.sqrt(math.sqrt(g.iyy * cw) / sx) if cw > 0.0 else 0.0  # AISC 360-16 F2-7
    return Section(
        name=name,
        family=family,
        d=d,
        bf=bf,
        tw=tw,
        tf=tf,
        r=r,
        A=g.area,
        Ix=g.ixx,
        Iy=g.iyy,
        Sx=sx,
        Sy=sy,
        Zx=zx,
        Zy=zy,
        rx=math.sqrt(g.ixx / g.area),
        ry=math.sqrt(g.iyy / g.area),
        J=j,
        Cw=cw,
        ho=ho,
        rts=rts,
        source=SOURCE,
        h=h,
        mass_per_length=g.area * STEEL_DENSITY,
        y_top=y_top,
        y_plastic=maxy - pna,
        **extra,  # type: ignore[arg-type]
    )


# --- constructors -------------------------------------------------------------------


def singly_symmetric_i_from_dimensions(
    name: str,
    d: float,
    bf_top: float,
    tf_top: float,
    bf_bottom: float,
    tf_bottom: float,
    tw: float,
    r: float = 0.0,
    fabrication: str = "",
) -> Section:
    """I-section with unequal flanges, web at mid-width of both (m).

    ``bf``/``tf`` of the result are the top flange's, ``bf_bottom``/``tf_bottom``
    the bottom's. ho = d − tf_top/2 − tf_bottom/2; h = d − tf_top − tf_bottom − 2r.
    J: flange plates with two free ends and the web between them (Roark; AISC
    Design Guide 9), plus the fillet junction term where r > 0 (El Darwish &
    Johnston 1965). Cw = ho²·Iyc·Iyt/(Iyc + Iyt), the thin-walled value for a
    monosymmetric I (Galambos, "Structural Members and Frames", 1968), with
    Iyc, Iyt the flanges' own tf·bf³/12; the shear centre lies ho·Iyt/(Iyc + Iyt)
    below the top flange's centroid (y0). rts is F2-7's √(√(Iy·Cw)/Sx) (the design
    code takes rt of the compression flange from F4-11).
    """
    _positive(name, d=d, bf_top=bf_top, tf_top=tf_top, bf_bottom=bf_bottom,
              tf_bottom=tf_bottom, tw=tw)  # fmt: skip
    _non_negative(name, r=r)
    if tf_top + tf_bottom + 2.0 * r >= d:
        raise ValueError(f"{name}: flanges and fillets leave no web")
    if tw + 2.0 * r > min(bf_top, bf_bottom):
        raise ValueError(f"{name}: web and fillets are wider than a flange")
    if fabrication not in ("", "rolled", "welded"):
        raise ValueError(f"{name}: fabrication must be 'rolled', 'welded' or ''")
    top = box(-bf_top / 2, d - tf_top, bf_top / 2, d)
    bottom = box(-bf_bottom / 2, 0.0, bf_bottom / 2, tf_bottom)
    web = box(-tw / 2, tf_bottom / 2, tw / 2, d - tf_top / 2)
    outline = top.union(web).union(bottom)
    assert isinstance(outline, Polygon)
    outline = _close(outline, r)
    hw = d - tf_top - tf_bottom
    j = _plate_j(bf_top, tf_top, 2) + _plate_j(bf_bottom, tf_bottom, 2) + hw * tw**3 / 3.0
    j += _junction_j(tf_top, tw, r) + _junction_j(tf_bottom, tw, r)
    ho = d - tf_top / 2 - tf_bottom / 2
    iyc, iyt = tf_top * bf_top**3 / 12.0, tf_bottom * bf_bottom**3 / 12.0
    cw = ho**2 * iyc * iyt / (iyc + iyt)
    s = _section(
        name, ShapeFamily.I_SHAPE, outline,
        d=d, bf=bf_top, tw=tw, tf=tf_top, r=r, j=j, cw=cw, ho=ho, h=hw - 2.0 * r,
        sy_width=max(bf_top, bf_bottom) / 2.0,
        fabrication=fabrication, bf_bottom=bf_bottom, tf_bottom=tf_bottom,
    )  # fmt: skip
    # Shear centre between the flange centroids, ho·Iyt/(Iyc + Iyt) below the top one.
    below_top = tf_top / 2.0 + ho * iyt / (iyc + iyt)
    return _with(s, y0=s.y_top - below_top)


def tee_from_dimensions(
    name: str, d: float, bf: float, tw: float, tf: float, r: float = 0.0
) -> Section:
    """Tee (WT, MT, ST or a cut/welded tee), flange on top, stem down (m).

    J: flange with two free ends, stem with one, plus the fillet junction term
    (El Darwish & Johnston 1965; AISC Design Guide 9). Cw = tf³bf³/144 +
    tw³(d − tf/2)³/36 (AISC Design Guide 9). The shear centre is at the flange's
    mid-thickness: y0 = y_top − tf/2 above the centroid. ho = d − tf/2; h = d − tf − r.
    """
    _positive(name, d=d, bf=bf, tw=tw, tf=tf)
    _non_negative(name, r=r)
    if tf + r >= d:
        raise ValueError(f"{name}: flange and fillet leave no stem")
    if tw + 2.0 * r > bf:
        raise ValueError(f"{name}: stem and fillets are wider than the flange")
    flange = box(-bf / 2, d - tf, bf / 2, d)
    stem = box(-tw / 2, 0.0, tw / 2, d - tf / 2)
    outline = flange.union(stem)
    assert isinstance(outline, Polygon)
    outline = _close(outline, r)
    j = _plate_j(bf, tf, 2) + _plate_j(d - tf, tw, 1) + _junction_j(tf, tw, r)
    cw = tf**3 * bf**3 / 144.0 + tw**3 * (d - tf / 2) ** 3 / 36.0
    s = _section(
        name, ShapeFamily.TEE, outline,
        d=d, bf=bf, tw=tw, tf=tf, r=r, j=j, cw=cw, ho=d - tf / 2, h=d - tf - r,
        sy_width=bf / 2,
    )  # fmt: skip
    return _with(s, y0=s.y_top - tf / 2, rts=0.0)


def angle_from_dimensions(name: str, d: float, b: float, t: float, r: float = 0.0) -> Section:
    """Single angle: vertical leg d, horizontal leg b, thickness t, heel at the bottom (m).

    Axes x, y are the geometric axes (parallel to the legs), as AISC 360-16 F10
    and the AISC tables use them; rz is the least principal radius of gyration.
    J (Roark, "Formulas for Stress and Strain", L-section): the leg d as a plate
    with two free ends, the leg b − t with one, plus the root junction α·D⁴ with
    α = 0.07, D = 2[(3r + 2t) − √2·(2r + t)]. Cw = t³(d'³ + b'³)/36, d' = d − t/2,
    b' = b − t/2 (AISC Design Guide 9). The shear centre is where the leg centrelines meet.
    """
    _positive(name, d=d, b=b, t=t)
    _non_negative(name, r=r)
    if t + r >= min(d, b):
        raise ValueError(f"{name}: thickness and fillet leave no leg")
    outline = Polygon([(0.0, 0.0), (b, 0.0), (b, t), (t, t), (t, d), (0.0, d)])
    outline = _close(outline, r)
    g = _moments(outline)
    iz = (g.ixx + g.iyy) / 2.0 - math.hypot((g.ixx - g.iyy) / 2.0, g.ixy)
    junction = 2.0 * ((3.0 * r + 2.0 * t) - math.sqrt(2.0) * (2.0 * r + t))
    j = _plate_j(d, t, 2) + _plate_j(b - t, t, 1) + 0.07 * junction**4
    cw = t**3 * ((d - t / 2) ** 3 + (b - t / 2) ** 3) / 36.0
    s = _section(
        name, ShapeFamily.ANGLE, outline,
        d=d, bf=b, tw=t, tf=t, r=r, j=j, cw=cw, ho=d - t / 2, h=d - t,
    )  # fmt: skip
    return _with(s, x0=t / 2 - g.cx, y0=t / 2 - g.cy, rz=math.sqrt(max(iz, 0.0) / g.area), rts=0.0)


def double_angle_from_dimensions(
    name: str, d: float, b: float, t: float, gap: float = 0.0, r: float = 0.0
) -> Section:
    """Two equal angles back to back: vertical legs d down, ``gap`` apart, legs b on top (m).

    bf is the overall width 2b + gap. J is twice a single angle's; Cw is taken
    as 0 (negligible; AISC 360-16 E4 User Note omits it for double angles). The
    shear centre is on the axis of symmetry at the outstanding legs' mid-thickness.
    rz is a single angle's least radius of gyration (for E6 connector spacing).
    """
    _positive(name, d=d, b=b, t=t)
    _non_negative(name, gap=gap, r=r)
    single = angle_from_dimensions(name, d, b, t, r)
    right = Polygon([(gap / 2, d), (gap / 2 + b, d), (gap / 2 + b, d - t),
                     (gap / 2 + t, d - t), (gap / 2 + t, 0.0), (gap / 2, 0.0)])  # fmt: skip
    right = _close(right, r)
    left = Polygon([(-x, y) for x, y in right.exterior.coords])
    g_half = _moments(right)
    outline = right.union(left)  # two separate parts when gap > 0
    s = _section(
        name, ShapeFamily.ANGLE, outline,
        d=d, bf=2 * b + gap, tw=t, tf=t, r=r, j=2.0 * single.J, cw=0.0, ho=d - t / 2,
        h=d - t, sy_width=b + gap / 2,
    )  # fmt: skip
    if s.A <= 0.0 or abs(s.A - 2 * g_half.area) > 1e-9 * s.A:
        raise ValueError(f"{name}: the two angles overlap")
    return _with(s, y0=s.y_top - t / 2, rz=single.rz, pair_gap=gap, rts=0.0)


def rect_hollow_from_dimensions(
    name: str, d: float, b: float, t: float, corner_radius: float | None = None
) -> Section:
    """Rectangular or square HSS: depth d, width b, design wall thickness t (m).

    ``corner_radius`` is the outside corner radius. When it is not known the
    properties use 2t (the AISC Shapes Database convention, from memory) and
    the flat widths h = d − 3t, b − 3t (AISC 360-16 B4.1b(d)); when known,
    h = d − 2·r and b − 2·r. J by Bredt's formula on the wall's mid-line,
    J = 4·Ap²·t/p with rounded corners; Cw = 0 (closed section).
    """
    _positive(name, d=d, b=b, t=t)
    if 2.0 * t >= min(d, b):
        raise ValueError(f"{name}: walls leave no hollow (2t ≥ b)")
    ro = 2.0 * t if corner_radius is None else corner_radius
    if not (math.isfinite(ro) and 0.0 <= ro <= min(d, b) / 2.0):
        raise ValueError(f"{name}: corner radius must be between 0 and half the width")
    outer = _rounded_box(b, d, ro)
    inner = _rounded_box(b - 2 * t, d - 2 * t, max(ro - t, 0.0))
    outline = Polygon(outer.exterior.coords, [inner.exterior.coords])
    rm = max(ro - t / 2, 0.0)
    ap = (b - t) * (d - t) - (4.0 - math.pi) * rm**2
    p = 2.0 * (b - t) + 2.0 * (d - t) - 2.0 * (4.0 - math.pi) * rm
    allowance = 3.0 * t if corner_radius is None else 2.0 * ro
    return _section(
        name, ShapeFamily.HOLLOW_RECT, outline,
        d=d, bf=b, tw=t, tf=t, r=ro, j=4.0 * ap**2 * t / p, cw=0.0, ho=d - t,
        h=d - allowance, sy_width=b / 2,
    )  # fmt: skip


def _rounded_box(b: float, d: float, radius: float) -> Polygon:
    if radius <= 0.0:
        return box(-b / 2, -d / 2, b / 2, d / 2)
    core = box(-b / 2 + radius, -d / 2 + radius, b / 2 - radius, d / 2 - radius)
    rounded = core.buffer(radius, quad_segs=_QUAD)
    assert isinstance(rounded, Polygon)
    return rounded


def round_hollow_from_dimensions(name: str, od: float, t: float) -> Section:
    """Round HSS or pipe: outside diameter od, design wall thickness t (m); closed forms."""
    _positive(name, od=od, t=t)
    if 2.0 * t >= od:
        raise ValueError(f"{name}: wall thickness leaves no hollow")
    di = od - 2.0 * t
    area = math.pi / 4.0 * (od**2 - di**2)
    i = math.pi / 64.0 * (od**4 - di**4)
    z = (od**3 - di**3) / 6.0
    rad = math.sqrt(i / area)
    return Section(
        name=name, family=ShapeFamily.HOLLOW_ROUND, d=od, bf=od, tw=t, tf=t, r=0.0,
        A=area, Ix=i, Iy=i, Sx=2 * i / od, Sy=2 * i / od, Zx=z, Zy=z, rx=rad, ry=rad,
        J=2.0 * i, Cw=0.0, ho=od - t, rts=0.0, source=SOURCE, h=di,
        mass_per_length=area * STEEL_DENSITY, y_top=od / 2, y_plastic=od / 2,
    )  # fmt: skip


def _with(section: Section, **changes: float | str | None) -> Section:
    from dataclasses import replace

    return replace(section, **changes)  # type: ignore[arg-type]


# --- geometry the design code reads ---------------------------------------------------


def neutral_axis_from_top(section: Section) -> float:
    """Elastic neutral axis (x) below the top fibre (d/2 when not recorded)."""
    return section.y_top if section.y_top > 0.0 else section.d / 2.0


def plastic_axis_from_top(section: Section) -> float:
    """Plastic neutral axis (x) below the top fibre (d/2 when not recorded)."""
    return section.y_plastic if section.y_plastic > 0.0 else section.d / 2.0


def elastic_moduli(section: Section) -> tuple[float, float]:
    """(S to the top fibre, S to the bottom fibre) about x."""
    c = neutral_axis_from_top(section)
    return section.Ix / c, section.Ix / (section.d - c)


def flanges(section: Section) -> tuple[tuple[float, float], tuple[float, float]]:
    """((bf, tf) of the top flange, (bf, tf) of the bottom flange) of an I-shape."""
    bottom = (section.bf_bottom or section.bf, section.tf_bottom or section.tf)
    return (section.bf, section.tf), bottom


def is_singly_symmetric_i(section: Section) -> bool:
    """An I-shape whose flanges differ (beyond rounding, 0.1 %)."""
    if section.family is not ShapeFamily.I_SHAPE:
        return False
    (bt, tt), (bb, tb) = flanges(section)
    return not (math.isclose(bt, bb, rel_tol=1e-3) and math.isclose(tt, tb, rel_tol=1e-3))


def is_double_angle(section: Section) -> bool:
    return section.family is ShapeFamily.ANGLE and section.pair_gap is not None


def angle_legs(section: Section) -> tuple[float, float]:
    """(vertical leg d, horizontal leg b) of one angle (of either angle of a 2L)."""
    if section.pair_gap is not None:
        return section.d, (section.bf - section.pair_gap) / 2.0
    return section.d, section.bf


def hss_flats(section: Section) -> tuple[float, float]:
    """(h, b): flat widths of a rectangular HSS's webs and flanges (AISC 360-16 B4.1b(d))."""
    allowance = section.d - section.h
    return section.h, section.bf - allowance
