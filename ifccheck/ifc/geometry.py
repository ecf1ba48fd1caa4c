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
import shapely
from shapely.geometry import MultiPolygon, Point, Polygon

from ifccheck.errors import ElementError

Entity = ifcopenshell.entity_instance

BODY_IDS = {"Body", "Facetation", "Mesh", None, ""}
# Longest chain of relative placements followed (real models nest a handful: site,
# building, storey, assembly, element); a longer one is taken as a cycle.
MAX_PLACEMENT_DEPTH = 1000
SHOWN = 40  # characters of a bad value quoted in a message


def _shown(value: object) -> str:
    """A bad value as quoted in a message, cut short."""
    if hasattr(value, "is_a"):
        return f"a reference to {value.is_a()} #{value.id()}"  # type: ignore[attr-defined]
    text = repr(value)
    return text if len(text) <= SHOWN else text[: SHOWN - 1] + "…"


def text_value(value: object) -> str:
    """A string attribute as text: '' for none, or for a value of another type (a number
    or a reference where a label belongs, which the parser does not refuse)."""
    return value if isinstance(value, str) else ""


def real(value: object, what: str) -> float:
    """A finite number read from the file; ElementError naming ``what`` otherwise."""
    if type(value) is float and math.isfinite(value):  # the common case, fast
        return value
    if isinstance(value, bool) or not isinstance(value, int | float):
        raise ElementError(f"{what} is {_shown(value)}, not a number")
    v = float(value)
    if not math.isfinite(v):
        raise ElementError(f"{what} is {v}, not a finite number")
    return v


def reals(values: object, what: str, least: int = 1) -> tuple[float, ...]:
    """A list of finite numbers (coordinates, direction ratios), at least ``least`` long."""
    if not isinstance(values, tuple | list) or len(values) < least:
        raise ElementError(f"{what} is {_shown(values)}, not {least} or more numbers")
    if all(type(v) is float for v in values) and all(map(math.isfinite, values)):
        return tuple(values)  # the common case, fast
    return tuple(real(v, what) for v in values)


def coordinates(point: Entity | None, what: str) -> tuple[float, ...]:
    """The coordinates of an IfcCartesianPoint."""
    try:
        values = point.Coordinates  # type: ignore[union-attr]
    except AttributeError:  # None, or an entity that is not a point
        raise ElementError(f"{what} is {_shown(point)}, not a point") from None
    return reals(values, f"{what} (#{point.id()})", 2)  # type: ignore[union-attr]


def direction(entity: Entity | None, what: str) -> tuple[float, float, float]:
    """The unit vector of an IfcDirection (ElementError for a zero or unreadable one)."""
    try:
        values = entity.DirectionRatios  # type: ignore[union-attr]
    except AttributeError:  # None, or an entity that is not a direction
        raise ElementError(f"{what} is {_shown(entity)}, not a direction") from None
    ratios = reals(values, what, 2)
    try:
        return _unit(ratios)
    except ElementError:
        shown = ", ".join(f"{v:g}" for v in ratios)
        raise ElementError(f"{what} is the zero vector ({shown})") from None


class PlacementCache:
    """Global matrices of IfcLocalPlacement chains, each computed once.

    Storey and building placements are shared by thousands of members, so
    caching by entity id keeps reading linear in the number of members.
    """

    def __init__(self) -> None:
        self._cache: dict[int, np.ndarray] = {}

    def local(self, placement: Entity | None) -> np.ndarray:
        """Global matrix of a placement; ElementError for a chain that refers to itself,
        a zero direction or an unreadable point (the element cannot be placed)."""
        if placement is None:
            return np.eye(4)
        chain: list[Entity] = []
        seen: set[int] = set()
        node: Entity | None = placement
        m = np.eye(4)
        while node is not None:
            if not node.is_a("IfcObjectPlacement"):
                raise ElementError(f"its placement is {_shown(node)}, not a placement")
            found = self._cache.get(node.id())
            if found is not None:
                m = found
                break
            if node.id() in seen or len(chain) > MAX_PLACEMENT_DEPTH:
                which = "refers to itself" if node.id() == chain[-1].id() else "forms a cycle"
                raise ElementError(f"placement #{node.id()} {which} (PlacementRelTo)")
            seen.add(node.id())
            chain.append(node)
            node = node.PlacementRelTo if node.is_a("IfcLocalPlacement") else None
        for node in reversed(chain):
            if node.is_a("IfcLocalPlacement"):
                m = m @ axis2_matrix(node.RelativePlacement)
            else:  # grid placements and others: ifcopenshell resolves them
                m = np.asarray(uplacement.get_local_placement(node), dtype=float)
            if not np.isfinite(m).all():
                raise ElementError(f"placement #{node.id()} is not finite (coordinates overflow)")
            self._cache[node.id()] = m
        return m

    def of(self, element: Entity) -> np.ndarray:
        return self.local(getattr(element, "ObjectPlacement", None))


def _unit(v: tuple[float, ...]) -> tuple[float, float, float]:
    x, y, z = (*tuple(v), 0.0, 0.0, 0.0)[:3]
    big = max(abs(x), abs(y), abs(z))  # scaled first: ratios of 1e-200 or 1e200 are fine
    if not (big > 0.0 and math.isfinite(big)):
        raise ElementError(f"direction {tuple(v)} has no length")
    x, y, z = x / big, y / big, z / big
    n = math.sqrt(x * x + y * y + z * z)
    return x / n, y / n, z / n


def axis2_matrix(placement: Entity | None) -> np.ndarray:
    """4×4 matrix of an IfcAxis2Placement2D/3D (identity when absent).

    buildingSMART IfcAxis2Placement3D: z from Axis (default +z), x from
    RefDirection projected normal to z (default +x), y = z × x.
    Raises ElementError for an unreadable location, a zero Axis or RefDirection, or a
    RefDirection parallel to the Axis (IFC4 IfcAxis2Placement3D, where-rule
    AxisToRefDirPosition, from memory).
    """
    m = np.eye(4)
    if placement is None:
        return m
    what = f"placement #{placement.id()}"
    loc = coordinates(getattr(placement, "Location", None), f"location of {what}")
    m[: min(len(loc), 3), 3] = loc[:3]
    ref = getattr(placement, "RefDirection", None)
    if placement.is_a("IfcAxis2Placement2D"):
        x = direction(ref, f"the RefDirection of {what}") if ref else (1, 0, 0)
        m[:3, 0] = (x[0], x[1], 0.0)
        m[:3, 1] = (-x[1], x[0], 0.0)
        return m
    axis = getattr(placement, "Axis", None)
    z = direction(axis, f"the Axis of {what}") if axis else (0.0, 0.0, 1.0)
    x = direction(ref, f"the RefDirection of {what}") if ref else (1, 0, 0)
    if abs(x[0] * z[0] + x[1] * z[1] + x[2] * z[2]) > 1 - 1e-9:
        if ref is not None:
            raise ElementError(f"the RefDirection of {what} is parallel to its Axis")
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
        with np.errstate(all="ignore"):  # a zero axis gives NaN: refused just below
            m = np.asarray(uplacement.get_mappeditem_transformation(item), dtype=float)
        if not np.isfinite(m).all():
            raise ElementError(f"mapped item #{item.id()} has a degenerate transformation")
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
    """Unit direction (object space) and length (file units) of an extrusion.

    ElementError for a zero direction or a depth that is not a positive number."""
    m = matrix @ axis2_matrix(solid.Position)
    along = m[:3, :3] @ np.asarray(extruded_direction(solid), dtype=float)
    norm = float(np.linalg.norm(along))
    length = extrusion_depth(solid) * norm
    return along / norm, length


def extruded_direction(solid: Entity) -> tuple[float, float, float]:
    """Unit ExtrudedDirection of an IfcExtrudedAreaSolid (ElementError if zero)."""
    return direction(solid.ExtrudedDirection, f"the extrusion direction of body #{solid.id()}")


def extrusion_depth(solid: Entity, allow_zero: bool = False) -> float:
    """Depth of an IfcExtrudedAreaSolid: a positive number (IFC: IfcPositiveLengthMeasure)."""
    depth = real(solid.Depth, f"extrusion depth of #{solid.id()}")
    if depth < 0.0 or (depth == 0.0 and not allow_zero):
        raise ElementError(f"extrusion depth of #{solid.id()} is {depth:g}, not positive")
    return depth


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
    radius = real(circle.Radius, f"radius of #{circle.id()}")
    ends: list[float] = []
    for trim in (curve.Trim1, curve.Trim2):
        points = [v for v in trim if v.is_a("IfcCartesianPoint")]
        params = [v for v in trim if v.is_a("IfcParameterValue")]
        if points:
            xy = coordinates(points[0], f"trim point of #{curve.id()}")[:2]
            local = np.linalg.solve(m, np.array([*xy, 0.0, 1.0]))
            ends.append(math.atan2(local[1], local[0]))
        elif params:
            import ifcopenshell.util.unit as uunit

            scale = float(uunit.calculate_unit_scale(curve.file, "PLANEANGLEUNIT"))
            ends.append(real(params[0].wrappedValue, f"trim of #{curve.id()}") * scale)
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
    what = f"{curve.is_a()} #{curve.id()}"
    if curve.is_a("IfcPolyline"):
        return _rows([coordinates(p, f"point of {what}") for p in curve.Points or ()], what)
    if curve.is_a("IfcIndexedPolyCurve"):
        coords = _rows(
            [reals(c, f"coordinates of {what}", 2) for c in curve.Points.CoordList or ()], what
        )
        if not curve.Segments:
            return coords
        chunks: list[np.ndarray] = []
        for seg in curve.Segments:
            idx = np.array(reals(seg.wrappedValue, f"segment of {what}", 2), dtype=int) - 1
            if idx.min() < 0 or idx.max() >= len(coords):
                raise ElementError(f"segment of {what} refers to a point it does not have")
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
            return _rows([coordinates(p, f"trim point of {what}") for p in pts], what)
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


def _rows(points: list[tuple[float, ...]], what: str) -> np.ndarray:
    """Points of one curve as an (n, dim) array; ElementError when their dimensions differ."""
    if len({len(p) for p in points}) > 1:
        raise ElementError(f"{what} mixes 2D and 3D points")
    return np.array(points, dtype=float).reshape(len(points), -1)


@dataclass
class Outline:
    """A profile as a polygon in its own 2D coordinates (position applied)."""

    polygon: Polygon | MultiPolygon  # several parts only when a crossing outline was repaired
    exact: bool  # False when a curve could not be read exactly
    repaired: str = ""  # how an outline that crossed itself was made valid, else ""


def _length(profile: Entity, attr: str) -> float:
    return real(getattr(profile, attr, None), f"{attr} of {profile.is_a()} #{profile.id()}")


def _polygon(shell: np.ndarray, holes: list[np.ndarray], what: str) -> tuple[Polygon, str]:
    """A valid polygon from rings; a ring that crosses itself is repaired with shapely's
    make_valid (both lobes of a figure eight kept), and said how. ElementError when the
    rings enclose no area (collinear or repeated points)."""
    try:
        poly = Polygon(shell, holes)
    except (ValueError, shapely.errors.GEOSException):
        raise ElementError(f"{what} has too few distinct points to enclose an area") from None
    repaired = ""
    if not poly.is_valid:
        reason = shapely.is_valid_reason(poly)
        fixed = shapely.make_valid(poly)
        parts = [g for g in shapely.get_parts(fixed) if isinstance(g, Polygon | MultiPolygon)]
        poly = shapely.unary_union(parts) if parts else Polygon()
        if poly.area > 0.0:
            repaired = f"{what} crosses itself ({reason}); repaired (shapely make_valid)"
    if poly.is_empty or not poly.area > 0.0:
        raise ElementError(f"{what} encloses no area (its points are collinear or repeated)")
    return poly, repaired


def profile_outline(profile: Entity) -> Outline | None:
    """Polygon of a profile definition in profile coordinates, or None for a class this
    reads no outline of. ElementError for dimensions or curves that make no outline."""
    pos = axis2_matrix(getattr(profile, "Position", None))
    poly: Polygon | None = None
    what = f"outline of {profile.is_a()} #{profile.id()}"
    if profile.is_a("IfcRectangleProfileDef") and not profile.is_a("IfcRectangleHollowProfileDef"):
        hx, hy = _length(profile, "XDim") / 2, _length(profile, "YDim") / 2
        poly = Polygon([(-hx, -hy), (hx, -hy), (hx, hy), (-hx, hy)])
    elif profile.is_a("IfcCircleProfileDef"):
        poly = Point(0, 0).buffer(_length(profile, "Radius"), 32)
    elif profile.is_a("IfcArbitraryClosedProfileDef"):
        outer = curve_points(profile.OuterCurve)
        if outer is None:
            return None
        holes = []
        if profile.is_a("IfcArbitraryProfileDefWithVoids"):
            for inner in profile.InnerCurves:
                pts = curve_points(inner)
                if pts is not None and len(pts) >= 3:
                    holes.append(pts[:, :2])
        shape, repaired = _polygon(outer[:, :2], holes, what)
        return Outline(_transform2d(shape, pos), True, repaired)
    elif profile.is_a("IfcIShapeProfileDef"):
        hb, hd, htw, tf = (
            _length(profile, "OverallWidth") / 2,
            _length(profile, "OverallDepth") / 2,
            _length(profile, "WebThickness") / 2,
            _length(profile, "FlangeThickness"),
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
        nums = [v for v in dims if isinstance(v, float) and math.isfinite(v)]
        if len(nums) >= 2:
            w, d = nums[0], nums[-1]
            poly = Polygon([(-w / 2, -d / 2), (w / 2, -d / 2), (w / 2, d / 2), (-w / 2, d / 2)])
            return Outline(_transform2d(poly, pos), False)
    if poly is None:
        return None
    if not (poly.is_valid and poly.area > 0.0):
        raise ElementError(f"{what}: its dimensions enclose no area")
    return Outline(_transform2d(poly, pos), True)


def _transform2d(poly: Polygon | MultiPolygon, m: np.ndarray) -> Polygon | MultiPolygon:
    """A plan polygon moved by the xy part of a 4×4 matrix."""
    from shapely import affinity

    return affinity.affine_transform(poly, [m[0, 0], m[0, 1], m[1, 0], m[1, 1], m[0, 3], m[1, 3]])


def transform(m: np.ndarray, pts: np.ndarray) -> np.ndarray:
    """Apply a 4×4 matrix to points of shape (n, 3)."""
    pts = np.atleast_2d(pts)
    return pts @ m[:3, :3].T + m[:3, 3]


@dataclass
class Footprint:
    """Plan outline and elevations of a vertically extruded solid (file units)."""

    polygon: Polygon | MultiPolygon
    bottom: float
    top: float
    repaired: str = ""  # how an outline that crossed itself was made valid, else ""


def plan_footprint(matrix: np.ndarray, solid: Entity) -> Footprint | None:
    """Plan polygon, bottom and top elevation of a vertically extruded solid.

    ``matrix`` takes the solid's item space to global coordinates. Returns
    None when the extrusion is not vertical or the profile cannot be read;
    ElementError for a zero direction or an outline that encloses no area.
    A zero depth is returned as is (the caller decides what a zero-thickness slab is).
    """
    outline = profile_outline(solid.SweptArea)
    if outline is None:
        return None
    m = matrix @ axis2_matrix(solid.Position)
    along = m[:3, :3] @ np.asarray(extruded_direction(solid), dtype=float)
    along /= np.linalg.norm(along)
    if abs(along[2]) < 0.999:
        return None
    depth = extrusion_depth(solid, allow_zero=True)
    flat = shapely.get_coordinates(outline.polygon)
    lifted = transform(m, np.column_stack([flat, np.zeros(len(flat))]))
    if np.ptp(lifted[:, 2]) > 1e-6 * max(1.0, float(np.ptp(lifted[:, :2]))):
        return None  # profile plane not horizontal
    poly = _transform2d(outline.polygon, m)
    if not poly.is_valid:  # points merged by the placement (coordinates too large to add)
        parts = [g for g in shapely.get_parts(shapely.make_valid(poly))
                 if isinstance(g, Polygon | MultiPolygon)]  # fmt: skip
        poly = shapely.unary_union(parts) if parts else Polygon()
    if poly.is_empty or not poly.area > 0.0:
        raise ElementError(f"the plan outline of body #{solid.id()} encloses no area")
    z0 = float(lifted[0, 2])
    z1 = z0 + float(along[2]) * depth
    return Footprint(poly, min(z0, z1), max(z0, z1), outline.repaired)


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
