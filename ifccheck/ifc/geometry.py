"""Placements, representations and profile outlines, in the file's length unit.

Every function here returns numbers in the file's own length unit; the
reader scales points to metres once, at the end.
"""

from __future__ import annotations

import math
from collections.abc import Iterator
from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.util.placement as uplacement
import numpy as np
from shapely.geometry import Point, Polygon

Entity = ifcopenshell.entity_instance

BODY_IDS = {"Body", "Facetation", "Mesh", None, ""}


class PlacementCache:
    """Global matrices of IfcLocalPlacement chains, each computed once.

    Storey and building placements are shared by thousands of members, so
    caching by entity id keeps reading linear in the number of members.
    """

    def __init__(self) -> None:
        self._cache: dict[int, np.ndarray] = {}

    def local(self, placement: Entity | None) -> np.ndarray:
        if placement is None:
            return np.eye(4)
        key = placement.id()
        found = self._cache.get(key)
        if found is not None:
            return found
        if placement.is_a("IfcLocalPlacement"):
            parent = self.local(placement.PlacementRelTo)
            m = parent @ axis2_matrix(placement.RelativePlacement)
        else:  # grid placements and others: ifcopenshell resolves them
            m = np.asarray(uplacement.get_local_placement(placement), dtype=float)
        self._cache[key] = m
        return m

    def of(self, element: Entity) -> np.ndarray:
        return self.local(getattr(element, "ObjectPlacement", None))


def _unit(v: tuple[float, ...]) -> tuple[float, float, float]:
    x, y, z = (*tuple(v), 0.0, 0.0, 0.0)[:3]
    n = math.sqrt(x * x + y * y + z * z)
    return x / n, y / n, z / n


def axis2_matrix(placement: Entity | None) -> np.ndarray:
    """4×4 matrix of an IfcAxis2Placement2D/3D (identity when absent).

    buildingSMART IfcAxis2Placement3D: z from Axis (default +z), x from
    RefDirection projected normal to z (default +x), y = z × x.
    """
    m = np.eye(4)
    if placement is None:
        return m
    loc = placement.Location.Coordinates
    m[: len(loc), 3] = loc
    if placement.is_a("IfcAxis2Placement2D"):
        x = _unit(placement.RefDirection.DirectionRatios) if placement.RefDirection else (1, 0, 0)
        m[:3, 0] = (x[0], x[1], 0.0)
        m[:3, 1] = (-x[1], x[0], 0.0)
        return m
    z = _unit(placement.Axis.DirectionRatios) if placement.Axis else (0.0, 0.0, 1.0)
    x = _unit(placement.RefDirection.DirectionRatios) if placement.RefDirection else (1, 0, 0)
    if abs(x[0] * z[0] + x[1] * z[1] + x[2] * z[2]) > 1 - 1e-9:
        x = (0.0, 1.0, 0.0) if abs(z[1]) < 0.9 else (0.0, 0.0, 1.0)  # any normal to z
    dot = x[0] * z[0] + x[1] * z[1] + x[2] * z[2]
    x = _unit((x[0] - dot * z[0], x[1] - dot * z[1], x[2] - dot * z[2]))
    y = (z[1] * x[2] - z[2] * x[1], z[2] * x[0] - z[0] * x[2], z[0] * x[1] - z[1] * x[0])
    m[:3, 0] = x
    m[:3, 1] = y
    m[:3, 2] = z
    return m


def representations(element: Entity) -> Iterator[tuple[str, Entity]]:
    """(identifier, representation) of an element's product shape."""
    shape = getattr(element, "Representation", None)
    if shape is None:
        return
    for rep in shape.Representations or ():
        yield (rep.RepresentationIdentifier or ""), rep


def body_items(element: Entity) -> Iterator[tuple[np.ndarray, Entity]]:
    """Body items with the matrix from item space to object space.

    Mapped items (type representation maps) are unfolded, and boolean
    results are reduced to their first operand (a clipped extrusion keeps
    the extrusion's axis).
    """
    for ident, rep in representations(element):
        if ident not in BODY_IDS:
            continue
        for item in rep.Items:
            yield from _unfold(item, np.eye(4))


def _unfold(item: Entity, matrix: np.ndarray) -> Iterator[tuple[np.ndarray, Entity]]:
    if item.is_a("IfcMappedItem"):
        m = np.asarray(uplacement.get_mappeditem_transformation(item), dtype=float)
        for sub in item.MappingSource.MappedRepresentation.Items:
            yield from _unfold(sub, matrix @ m)
    elif item.is_a("IfcBooleanResult"):
        yield from _unfold(item.FirstOperand, matrix)
    else:
        yield matrix, item


def extrusions(element: Entity) -> list[tuple[np.ndarray, Entity]]:
    """Every IfcExtrudedAreaSolid of the body, with its item-to-object matrix."""
    return [(m, item) for m, item in body_items(element) if item.is_a("IfcExtrudedAreaSolid")]


def extrusion_direction(matrix: np.ndarray, solid: Entity) -> tuple[np.ndarray, float]:
    """Unit direction (object space) and length (file units) of an extrusion."""
    m = matrix @ axis2_matrix(solid.Position)
    direction = m[:3, :3] @ np.asarray(solid.ExtrudedDirection.DirectionRatios, dtype=float)
    norm = float(np.linalg.norm(direction))
    length = float(solid.Depth) * norm
    return direction / norm, length


def first_extrusion(element: Entity) -> tuple[np.ndarray, Entity] | None:
    """The first IfcExtrudedAreaSolid of the body and its item-to-object matrix."""
    found = extrusions(element)
    return found[0] if found else None


def axis_points(element: Entity) -> tuple[np.ndarray, np.ndarray] | None:
    """First and last point of the 'Axis' representation, in object space.

    Mapped items (a type's axis map) are unfolded with their transformation.
    """
    for ident, rep in representations(element):
        if ident != "Axis":
            continue
        for item in rep.Items:
            for matrix, curve in _unfold(item, np.eye(4)):
                pts = curve_points(curve)
                if pts is not None and len(pts) >= 2:
                    p = np.zeros((len(pts), 3))
                    p[:, : pts.shape[1]] = pts
                    ends = transform(matrix, np.vstack([p[0], p[-1]]))
                    return ends[0], ends[1]
    return None


ARC_SEGMENTS = 16  # chords per arc when an outline's arcs are turned into polygons


def _arc_through(p0: np.ndarray, p1: np.ndarray, p2: np.ndarray) -> np.ndarray:
    """Points on the circular arc from p0 through p1 to p2 (2D), p0 and p2 included."""
    a, b, c = (np.asarray(p, dtype=float)[:2] for p in (p0, p1, p2))
    d = 2.0 * (a[0] * (b[1] - c[1]) + b[0] * (c[1] - a[1]) + c[0] * (a[1] - b[1]))
    if abs(d) < 1e-15 * max(1.0, float(np.abs(np.vstack([a, b, c])).max()) ** 2):
        return np.vstack([a, c])  # collinear: a straight piece
    sa, sb, sc = a @ a, b @ b, c @ c
    centre = np.array(
        [
            (sa * (b[1] - c[1]) + sb * (c[1] - a[1]) + sc * (a[1] - b[1])) / d,
            (sa * (c[0] - b[0]) + sb * (a[0] - c[0]) + sc * (b[0] - a[0])) / d,
        ]
    )
    radius = float(np.linalg.norm(a - centre))
    t0, t1, t2 = (math.atan2(p[1] - centre[1], p[0] - centre[0]) for p in (a, b, c))
    sweep = (t2 - t0) % (2 * math.pi)
    through = (t1 - t0) % (2 * math.pi)
    if through > sweep:  # the arc runs the other way round
        sweep -= 2 * math.pi
    angles = t0 + np.linspace(0.0, sweep, ARC_SEGMENTS + 1)
    pts = np.column_stack(
        [centre[0] + radius * np.cos(angles), centre[1] + radius * np.sin(angles)]
    )
    pts[0], pts[-1] = a, c
    return pts


def _trimmed_circle(curve: Entity) -> np.ndarray | None:
    """Points of an IfcTrimmedCurve on an IfcCircle (2D, in the curve's own space)."""
    circle = curve.BasisCurve
    m = axis2_matrix(circle.Position)
    radius = float(circle.Radius)
    ends: list[float] = []
    for trim in (curve.Trim1, curve.Trim2):
        points = [v for v in trim if v.is_a("IfcCartesianPoint")]
        params = [v for v in trim if v.is_a("IfcParameterValue")]
        if points:
            local = np.linalg.solve(m, np.array([*points[0].Coordinates[:2], 0.0, 1.0]))
            ends.append(math.atan2(local[1], local[0]))
        elif params:
            import ifcopenshell.util.unit as uunit

            scale = float(uunit.calculate_unit_scale(curve.file, "PLANEANGLEUNIT"))
            ends.append(float(params[0].wrappedValue) * scale)
        else:
            return None
    t0, t1 = ends
    turn = 2 * math.pi
    sweep = (t1 - t0) % turn if curve.SenseAgreement else -((t0 - t1) % turn)
    angles = t0 + np.linspace(0.0, sweep, ARC_SEGMENTS + 1)
    local = np.column_stack(
        [radius * np.cos(angles), radius * np.sin(angles), np.zeros(len(angles))]
    )
    return transform(m, local)[:, :2]


def curve_points(curve: Entity) -> np.ndarray | None:
    """Vertices of a polyline-like curve, arcs turned into chords.

    IfcPolyline, IfcIndexedPolyCurve (line and arc segments), IfcTrimmedCurve on
    an IfcLine or an IfcCircle, and IfcCompositeCurve of those.
    """
    if curve.is_a("IfcPolyline"):
        return np.array([p.Coordinates for p in curve.Points], dtype=float)
    if curve.is_a("IfcIndexedPolyCurve"):
        coords = np.array(curve.Points.CoordList, dtype=float)
        if not curve.Segments:
            return coords
        chunks: list[np.ndarray] = []
        for seg in curve.Segments:
            idx = np.array(seg.wrappedValue, dtype=int) - 1
            if seg.is_a("IfcArcIndex") and len(idx) == 3:
                piece = _arc_through(*coords[idx])
                if coords.shape[1] == 3:
                    piece = np.column_stack([piece, np.full(len(piece), coords[idx[0], 2])])
            else:
                piece = coords[idx]
            chunks.append(piece if not chunks else piece[1:])
        return np.vstack(chunks)
    if curve.is_a("IfcTrimmedCurve") and curve.BasisCurve.is_a("IfcLine"):
        pts = [t for t in curve.Trim1 + curve.Trim2 if t.is_a("IfcCartesianPoint")]
        if len(pts) == 2:
            return np.array([p.Coordinates for p in pts], dtype=float)
    if curve.is_a("IfcTrimmedCurve") and curve.BasisCurve.is_a("IfcCircle"):
        return _trimmed_circle(curve)
    if curve.is_a("IfcCompositeCurve"):
        parts: list[np.ndarray] = []
        for seg in curve.Segments:
            sub = curve_points(seg.ParentCurve)
            if sub is None:
                return None
            if not seg.SameSense:
                sub = sub[::-1]
            parts.append(sub[:, :2] if not parts else sub[1:, :2])
        return np.vstack(parts) if parts else None
    return None


@dataclass
class Outline:
    """A profile as a polygon in its own 2D coordinates (position applied)."""

    polygon: Polygon
    exact: bool  # False when a curve could not be read exactly


def profile_outline(profile: Entity) -> Outline | None:
    """Polygon of a profile definition in profile coordinates, or None."""
    pos = axis2_matrix(getattr(profile, "Position", None))
    poly: Polygon | None = None
    if profile.is_a("IfcRectangleProfileDef") and not profile.is_a("IfcRectangleHollowProfileDef"):
        hx, hy = profile.XDim / 2, profile.YDim / 2
        poly = Polygon([(-hx, -hy), (hx, -hy), (hx, hy), (-hx, hy)])
    elif profile.is_a("IfcCircleProfileDef"):
        poly = Point(0, 0).buffer(profile.Radius, 32)
    elif profile.is_a("IfcArbitraryClosedProfileDef"):
        outer = curve_points(profile.OuterCurve)
        if outer is None or len(outer) < 3:
            return None
        holes = []
        if profile.is_a("IfcArbitraryProfileDefWithVoids"):
            for inner in profile.InnerCurves:
                pts = curve_points(inner)
                if pts is not None and len(pts) >= 3:
                    holes.append(pts[:, :2])
        poly = Polygon(outer[:, :2], holes)
        if not poly.is_valid:
            poly = poly.buffer(0)
        return Outline(_transform2d(poly, pos), True)
    elif profile.is_a("IfcIShapeProfileDef"):
        hb, hd, htw, tf = (
            profile.OverallWidth / 2,
            profile.OverallDepth / 2,
            profile.WebThickness / 2,
            profile.FlangeThickness,
        )
        poly = Polygon(
            [
                (-hb, -hd), (hb, -hd), (hb, -hd + tf), (htw, -hd + tf), (htw, hd - tf),
                (hb, hd - tf), (hb, hd), (-hb, hd), (-hb, hd - tf), (-htw, hd - tf),
                (-htw, -hd + tf), (-hb, -hd + tf),
            ]
        )  # fmt: skip
    elif profile.is_a("IfcParameterizedProfileDef"):
        dims = [
            getattr(profile, a, None)
            for a in ("OverallWidth", "Width", "FlangeWidth", "Depth", "OverallDepth")
        ]
        nums = [v for v in dims if isinstance(v, float)]
        if len(nums) >= 2:
            w, d = nums[0], nums[-1]
            poly = Polygon([(-w / 2, -d / 2), (w / 2, -d / 2), (w / 2, d / 2), (-w / 2, d / 2)])
            return Outline(_transform2d(poly, pos), False)
    if poly is None:
        return None
    return Outline(_transform2d(poly, pos), True)


def _transform2d(poly: Polygon, m: np.ndarray) -> Polygon:
    def tx(coords):
        c = np.asarray(coords, dtype=float)[:, :2]
        return c @ m[:2, :2].T + m[:2, 3]

    return Polygon(tx(poly.exterior.coords), [tx(r.coords) for r in poly.interiors])


def transform(m: np.ndarray, pts: np.ndarray) -> np.ndarray:
    """Apply a 4×4 matrix to points of shape (n, 3)."""
    pts = np.atleast_2d(pts)
    return pts @ m[:3, :3].T + m[:3, 3]


def plan_footprint(matrix: np.ndarray, solid: Entity) -> tuple[Polygon, float, float] | None:
    """Plan polygon, bottom and top elevation of a vertically extruded solid.

    ``matrix`` takes the solid's item space to global coordinates. Returns
    None when the extrusion is not vertical or the profile cannot be read.
    """
    outline = profile_outline(solid.SweptArea)
    if outline is None:
        return None
    m = matrix @ axis2_matrix(solid.Position)
    direction = m[:3, :3] @ np.asarray(solid.ExtrudedDirection.DirectionRatios, dtype=float)
    direction /= np.linalg.norm(direction)
    if abs(direction[2]) < 0.999:
        return None

    def lift(coords) -> np.ndarray:
        c = np.asarray(coords, dtype=float)[:, :2]
        return transform(m, np.column_stack([c, np.zeros(len(c))]))

    ext = lift(outline.polygon.exterior.coords)
    if np.ptp(ext[:, 2]) > 1e-6 * max(1.0, float(np.ptp(ext[:, :2]))):
        return None  # profile plane not horizontal
    poly = Polygon(ext[:, :2], [lift(r.coords)[:, :2] for r in outline.polygon.interiors])
    if not poly.is_valid:
        poly = poly.buffer(0)
    z0 = float(ext[0, 2])
    z1 = z0 + float(direction[2]) * solid.Depth
    return poly, min(z0, z1), max(z0, z1)


def cardinal_offset(cardinal_point: int, depth: float, width: float) -> tuple[float, float]:
    """Offset (x, y) from the axis to the profile centre for a cardinal point.

    buildingSMART IfcCardinalPointReference: 1 bottom left, 2 bottom centre,
    3 bottom right, 4 mid-depth left, 5 mid-depth centre, 6 mid-depth right,
    7 top left, 8 top centre, 9 top right, 10 geometric centroid. The point
    named lies on the axis, so the centre sits the other way.
    """
    if cardinal_point in (5, 10):
        return 0.0, 0.0
    if not 1 <= cardinal_point <= 9:
        raise ValueError(f"cardinal point {cardinal_point} not in 1..10")
    col = (cardinal_point - 1) % 3  # 0 left, 1 centre, 2 right
    row = (cardinal_point - 1) // 3  # 0 bottom, 1 mid, 2 top
    px = (-0.5, 0.0, 0.5)[col] * width
    py = (-0.5, 0.0, 0.5)[row] * depth
    return -px, -py
