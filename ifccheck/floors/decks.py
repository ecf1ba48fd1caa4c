"""Declared decks: the floor or roof deck a model does not contain, from the settings.

Steel-only exports rarely carry the slab. A deck declared for a level
(``[decks."Roof"]``, or by elevation ``[decks."+36 ft"]``) becomes a slab of
the model over the level's framed area: the union of the bays its beams
enclose (their plan centre lines, noded and polygonised). It bears on every
beam of the level, so it loads them like a modelled slab and braces their
top flanges unless ``braces_top_flange = false``.
"""

from __future__ import annotations

import numpy as np
import shapely
from shapely.geometry import MultiPolygon, Polygon
from shapely.ops import polygonize, unary_union

from ifccheck.config import DeckSettings, LineLoadSettings, PointLoadSettings, Settings
from ifccheck.errors import QuantityError, SettingsError
from ifccheck.floors.levels import is_level_framing
from ifccheck.model import Level, Member, MemberRole, Model, Slab
from ifccheck.units import parse_quantity

# Beam lines are extended by this at both ends before noding, so that framing
# modelled a little short of its supports still closes its bays.
CLOSE_GAP = 0.15  # m


def match_levels(key: str, levels: list[Level], tolerance: float) -> list[Level]:
    """The levels a settings key names: by name or storey, else by elevation ("+36 ft")."""
    named = [lv for lv in levels if key in (lv.name, lv.storey)]
    if named:
        return named
    try:
        z = parse_quantity(key, "length")
    except QuantityError:
        return []
    near = [lv for lv in levels if abs(lv.elevation - z) <= tolerance]
    return [min(near, key=lambda lv: abs(lv.elevation - z))] if near else []


def match_level(key: str, levels: list[Level], tolerance: float) -> Level | None:
    """The first level a settings key names, or None."""
    found = match_levels(key, levels, tolerance)
    return found[0] if found else None


def declared_decks(model: Model, settings: Settings) -> list[Slab]:
    """A slab per declared deck, over its level's framed area (a deck that names no
    level is for ``check_keys`` to report)."""
    tol = settings.framing.level_tolerance
    out: list[Slab] = []
    for key, deck in settings.decks.items():
        for level in match_levels(key, model.levels, tol):
            area = framed_area(model, level.name, settings.framing.gap)
            if area.is_empty:
                model.warnings.append(
                    ("", f"deck declared on {level.name}: its beams enclose no bay; no deck area")
                )
                continue
            out.append(_deck_slab(key, deck, level, area, tol))
    return out


def _deck_slab(
    key: str, deck: DeckSettings, level: Level, area: Polygon | MultiPolygon, tolerance: float
) -> Slab:
    thickness = deck.thickness or 0.0
    weight = deck.weight if deck.weight is not None else None
    if weight is None and deck.thickness is None:
        weight = 0.0  # the area loads carry everything
    return Slab(
        guid=f"deck:{level.name}",
        name=f"declared deck ({key})",
        storey=level.storey,
        footprint=area,
        underside=level.elevation,
        top=level.elevation + thickness,
        ifc_class="declared deck",
        notes=[f"declared in the settings as decks.{key}"],
        level=level.name,
        declared=True,
        braces=deck.braces_top_flange,
        self_weight=weight,
        bearing_tolerance=tolerance,
    )


def framed_area(model: Model, level: str, gap: float) -> Polygon | MultiPolygon:
    """The union of the bays the level's beams enclose, in plan."""
    lines = []
    extend = max(CLOSE_GAP, gap)
    for m in model.members:
        if m.level != level or not is_level_framing(m):
            continue
        a, b = np.asarray(m.start[:2], float), np.asarray(m.end[:2], float)
        d = b - a
        n = float(np.hypot(*d))
        if n <= 1e-9:
            continue
        u = d / n
        lines.append(shapely.LineString([a - extend * u, b + extend * u]))
    if len(lines) < 3:
        return Polygon()
    bays = list(polygonize(unary_union(lines)))
    if not bays:
        return Polygon()
    area = unary_union(bays)
    return area if isinstance(area, Polygon | MultiPolygon) else Polygon()


def unmatched_keys(model: Model, settings: Settings) -> list[tuple[str, str]]:
    """Settings keys that name something the model does not have: (key, what it could be).

    Levels (``loads.storeys``, ``decks``, ``construction.levels``, the ``edge`` of a line
    load) match by name, storey or elevation; materials (``steel.materials``) by name
    (case and spaces aside); slabs (``loads.slabs``) by GUID; the beams of line and point
    loads by GUID or name. The second item lists the nearest names.
    """
    import difflib

    tol = settings.framing.level_tolerance
    names = list(dict.fromkeys([lv.name for lv in model.levels] + [lv.storey for lv in model.levels
                                                                    if lv.storey]))  # fmt: skip
    out: list[tuple[str, str]] = []
    for table, keys in (("loads.storeys", settings.loads.storeys), ("decks", settings.decks)):
        for key in keys:
            if not match_levels(key, model.levels, tol):
                near = difflib.get_close_matches(key, names, n=3, cutoff=0.4) or names[:5]
                out.append((f"{table}.{key!r}", "levels: " + (", ".join(near) or "none")))
    known = {" ".join(n.split()).casefold(): n for n in model.material_names}
    for key in settings.steel.materials:
        if " ".join(key.split()).casefold() not in known:
            near = difflib.get_close_matches(key, list(known.values()), n=3, cutoff=0.4)
            out.append((f"steel.materials.{key!r}", "materials: " + (", ".join(near) or "none")))
    guids = [s.guid for s in model.slabs if not s.declared]
    for key in settings.loads.slabs:
        if key not in guids:
            near = difflib.get_close_matches(key, guids, n=3, cutoff=0.4)
            out.append((f"loads.slabs.{key!r}", "slabs: " + (", ".join(near) or "none near")))
    if settings.construction is not None:
        for key in settings.construction.levels or []:
            if not match_levels(key, model.levels, tol):
                near = difflib.get_close_matches(key, names, n=3, cutoff=0.4) or names[:5]
                out.append((f"construction.levels {key!r}", "levels: " + (", ".join(near)
                                                                          or "none")))  # fmt: skip
    out += _unmatched_selectors(model, settings, names)
    return out


def _unmatched_selectors(
    model: Model, settings: Settings, level_names: list[str]
) -> list[tuple[str, str]]:
    """Line and point loads whose GUID or name is no beam of the model, or whose edge
    names no level."""
    import difflib

    beams = [m for m in model.members if m.role is MemberRole.BEAM]
    guids = {m.guid for m in beams}
    names = sorted({m.name for m in beams if m.name})
    out: list[tuple[str, str]] = []
    entries: list[LineLoadSettings | PointLoadSettings] = [
        *settings.loads.lines, *settings.loads.points
    ]  # fmt: skip
    for e in entries:
        if e.guid is not None and e.guid not in guids:
            near = difflib.get_close_matches(e.guid, sorted(guids), n=3, cutoff=0.4)
            out.append((f"{e.key}.guid {e.guid!r}", "beams: " + (", ".join(near) or "none near")))
        if e.name is not None and e.name not in names:
            near = difflib.get_close_matches(e.name, names, n=3, cutoff=0.4) or names[:5]
            out.append((f"{e.key}.name {e.name!r}", "beams: " + (", ".join(near) or "none")))
        edge = getattr(e, "edge", None)
        tol = settings.framing.level_tolerance
        if edge is not None and not match_levels(edge, model.levels, tol):
            near = difflib.get_close_matches(edge, level_names, n=3, cutoff=0.4) or level_names[:5]
            out.append((f"{e.key}.edge {edge!r}", "levels: " + (", ".join(near) or "none")))
    return out


def station_problems(model: Model, settings: Settings) -> list[str]:
    """Line and point loads whose stations lie off the beams they name (one line each)."""
    tol = 0.005  # m, rounding of modelled lengths
    by_guid = {m.guid: m for m in model.members if m.role is MemberRole.BEAM}
    by_name: dict[str, list[Member]] = {}
    for m in by_guid.values():
        by_name.setdefault(m.name, []).append(m)
    out: list[str] = []
    entries: list[LineLoadSettings | PointLoadSettings] = [
        *settings.loads.lines, *settings.loads.points
    ]  # fmt: skip
    for e in entries:
        targets = [by_guid[e.guid]] if e.guid in by_guid else by_name.get(e.name or "", [])
        stations: list[tuple[str, float | None]] = (
            [("station", e.station)]
            if isinstance(e, PointLoadSettings)
            else [("start", e.start), ("end", e.end)]
        )
        for m in targets:
            for what, x in stations:
                if x is not None and x > m.length + tol:
                    out.append(
                        f"settings: {e.key}.{what}: {x:.3f} m lies beyond beam "
                        f"{m.name or m.guid} ({m.length:.3f} m long)"
                    )
    return out


def check_keys(model: Model, settings: Settings) -> None:
    """A one-line SettingsError for the first settings key that names nothing in the model."""
    missing = unmatched_keys(model, settings)
    if missing:
        key, near = missing[0]
        more = f" (and {len(missing) - 1} more)" if len(missing) > 1 else ""
        raise SettingsError(
            f"settings: {key} names nothing in {model.source}; nearest {near}{more}"
        )
    problems = station_problems(model, settings)
    if problems:
        raise SettingsError(problems[0])
