"""The loads on each beam, by load case and stage, from the settings and the tributary floor.

In service (``IN_SERVICE``), on the floor a beam carries: superimposed dead (D),
floor live L0 and partitions (L), roof live (Lr), snow (S) and wind uplift (W,
upward); slab self-weight (D); and the line and point loads of the settings.
ifccheck computes no snow and no wind: S and W are the engineer's values, as given.

During construction (``CONSTRUCTION``), on the levels where concrete is placed:
the wet concrete on the steel (D) and the construction live load (C); nothing
else is on the steel yet (no finishes, no partitions, no façade).

Every load keeps its source ("snow", "line load loads.lines[2] (curtain wall)").
Area loads resolve a slab's entry, then its level's, then the defaults; a roof
(``roof = true``, or a level given roof live load, snow or wind uplift) carries
no floor live load or partitions unless they are given for it.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field

from ifccheck.config import ConstructionSettings, Settings, StoreyLoads
from ifccheck.floors import match_levels
from ifccheck.loads.combinations import REDUCIBLE
from ifccheck.loads.reduction import HEAVY_LIVE
from ifccheck.loads.tributary import Tributary, TributaryResult, level_of
from ifccheck.model import Member, Model, Slab
from ifccheck.results import StageName
from ifccheck.units import G

IN_SERVICE: StageName = "in_service"
CONSTRUCTION: StageName = "construction"
STAGE_TITLES: dict[str, str] = {IN_SERVICE: "in service", CONSTRUCTION: "construction"}

# A live load this close to 100 psf counts as 100 psf (units rounding).
_HEAVY = HEAVY_LIVE * (1 + 1e-9)

NOT_COMPUTED_NOTE = (
    "roof live load, snow and wind uplift are the engineer's values from the settings: "
    "ifccheck computes no snow load (no drift, no unbalanced or sliding snow) and no wind "
    "pressure; W is the strength-level uplift as given, acting upward, and the "
    "combinations take the dead load against it"
)


@dataclass(frozen=True)
class LineLoadItem:
    case: str  # "D", "L", "Lr", "S", "W" (in service) or "D", "C" (construction)
    w: float  # N/m, downward positive (wind uplift is negative)
    start: float  # m along the beam
    end: float
    source: str  # "superimposed dead", "live", "snow", "slab self-weight <guid>", ...
    reducible: bool = False  # floor live load L0 that live load reduction may reduce


@dataclass(frozen=True)
class PointLoadItem:
    case: str
    P: float  # N, downward positive (negative: uplift, or from a backspan)
    station: float  # m along the beam
    source: str  # GUID of the beam whose reaction this is, or the settings entry
    reducible: bool = False


def analysis_case(case: str, reducible: bool) -> str:
    """The statics case of a load: the floor live load that may be reduced is its own."""
    return REDUCIBLE if case == "L" and reducible else case


def public_case(case: str) -> str:
    """The load case an analysis case belongs to ("L0" → "L")."""
    return "L" if case == REDUCIBLE else case


@dataclass(frozen=True)
class Stage:
    """Which loads a demand run puts on the steel."""

    name: StageName
    levels: frozenset[str] | None = None  # construction: the levels where concrete is placed
    construction: ConstructionSettings | None = None

    def covers(self, level: str) -> bool:
        return self.levels is None or level in self.levels


@dataclass(frozen=True)
class FloorLoads:
    """The area loads (Pa) on one floor area, and where each came from."""

    dead: float
    live: float  # L0
    partitions: float
    roof_live: float
    snow: float
    wind_uplift: float  # upward
    roof: bool
    reducible: bool  # the floor live load may be reduced (§4.7)
    origins: Mapping[str, str] = field(default_factory=dict)  # field → settings key


def _first(chain: Sequence[tuple[str, StoreyLoads | None]], name: str) -> tuple[object, str]:
    for where, e in chain:
        if e is not None and getattr(e, name) is not None:
            return getattr(e, name), f"{where}.{name}"
    return None, ""


def floor_loads(
    settings: Settings,
    level: StoreyLoads | None,
    slab: Slab | None,
    level_key: str = "loads.storeys",
) -> FloorLoads:
    """The area loads of a floor: slab entry, then the level's, then the defaults."""
    loads = settings.loads
    chain: list[tuple[str, StoreyLoads | None]] = []
    if slab is not None:
        chain.append((f"loads.slabs.{slab.guid!r}", loads.slabs.get(slab.guid)))
    chain.append((level_key, level))
    origins: dict[str, str] = {}

    def pick(name: str, default: float, default_key: str) -> float:
        value, where = _first(chain, name)
        origins[name] = where or default_key
        return float(value) if value is not None else default  # type: ignore[arg-type]

    roof_flag, where = _first(chain, "roof")
    if roof_flag is None:
        roof = any(_first(chain, n)[0] is not None for n in ("roof_live", "snow", "wind_uplift"))
        origins["roof"] = "roof live load, snow or wind uplift given" if roof else "default"
    else:
        roof = bool(roof_flag)
        origins["roof"] = where
    dead = pick("dead", loads.dead, "default loads.dead")
    live = pick("live", 0.0 if roof else loads.live, "roof: none" if roof else "default loads.live")
    partitions = pick(
        "partitions", 0.0 if roof else loads.partitions,
        "roof: none" if roof else "default loads.partitions",
    )  # fmt: skip
    roof_live = pick("roof_live", 0.0, "none given")
    snow = pick("snow", 0.0, "none given")
    wind = pick("wind_uplift", 0.0, "none given")
    asked, where = _first(chain, "live_reduction")
    reduce = loads.live_reduction if asked is None else bool(asked)
    assembly = bool(_first(chain, "assembly")[0])
    reducible = reduce and live > 0 and not roof and not assembly and live <= _HEAVY
    if reduce and not reducible and live > 0:
        why = "roof" if roof else "assembly" if assembly else "over 100 psf"
        origins["live_reduction"] = f"not reduced ({why})"
    else:
        origins["live_reduction"] = where or "default loads.live_reduction"
    return FloorLoads(dead, live, partitions, roof_live, snow, wind, roof, reducible, origins)


class FloorLoadTable:
    """``floor_loads`` of each (level entry, slab) pair, worked out once per demand run."""

    def __init__(self, settings: Settings) -> None:
        self.settings = settings
        self._cache: dict[tuple[int, str | None], tuple[StoreyLoads | None, FloorLoads]] = {}

    def get(self, level: StoreyLoads | None, slab: Slab | None) -> FloorLoads:
        key = (id(level), slab.guid if slab is not None else None)
        hit = self._cache.get(key)
        if hit is None or hit[0] is not level:
            hit = (level, floor_loads(self.settings, level, slab))
            self._cache[key] = hit
        return hit[1]


def slab_weight(slab: Slab, settings: Settings) -> float:
    """Self-weight of a slab or declared deck, Pa."""
    if slab.self_weight is not None:
        return slab.self_weight
    return slab.thickness * settings.loads.concrete_density * G


def is_concrete(slab: Slab) -> bool:
    """A slab whose weight comes from its thickness: concrete placed wet on the steel."""
    return slab.self_weight is None and slab.thickness > 0


def wet_concrete(slab: Slab, settings: Settings) -> float:
    """The wet concrete on the steel during construction, Pa."""
    c = settings.construction
    if c is not None and c.wet_concrete is not None:
        return c.wet_concrete
    return slab_weight(slab, settings)


def construction_levels(model: Model, settings: Settings) -> frozenset[str]:
    """The levels the construction stage covers: those named in ``construction.levels``,
    else every level with a concrete slab (modelled, or declared with a thickness)."""
    c = settings.construction
    if c is not None and c.levels:
        tol = settings.framing.level_tolerance
        return frozenset(lv.name for key in c.levels for lv in match_levels(key, model.levels, tol))
    return frozenset(s.level or s.storey for s in model.slabs if is_concrete(s))


def own_loads(
    m: Member,
    length: float,
    tr: Tributary | None,
    settings: Settings,
    slabs: Mapping[str, Slab],
    level: StoreyLoads | None,
    stage: Stage,
    table: FloorLoadTable | None = None,
) -> list[LineLoadItem]:
    """Steel self-weight, and the floor of its tributary unless its level carries none
    (or, during construction, has no concrete placed on it)."""
    table = table or FloorLoadTable(settings)
    out: list[LineLoadItem] = []
    if m.section is not None and m.section.A > 0:
        w = m.section.A * settings.loads.steel_density * G
        out.append(LineLoadItem("D", w, 0.0, length, "steel self-weight"))
    if tr is None or (level is not None and level.floor is False):
        return out
    if stage.name == CONSTRUCTION:
        if stage.covers(level_of(m)):
            out += _construction_loads(tr, settings, slabs, stage)
        return out
    for p in tr.pieces:
        slab = slabs.get(p.slab) if p.slab else None
        if p.kind == "floor":
            fl = table.get(level, slab)
            for case, q, source, reducible in (
                ("D", fl.dead, "superimposed dead", False),
                ("L", fl.live, "live", fl.reducible),
                ("L", fl.partitions, "partitions", False),
                ("Lr", fl.roof_live, "roof live", False),
                ("S", fl.snow, "snow", False),
                ("W", -fl.wind_uplift, "wind uplift", False),
            ):
                if q != 0:
                    out.append(LineLoadItem(case, q * p.width, p.start, p.end, source, reducible))
        elif slab is not None:
            q = slab_weight(slab, settings)
            out.append(
                LineLoadItem("D", q * p.width, p.start, p.end, f"slab self-weight {slab.guid}")
            )
    return out


def _construction_loads(
    tr: Tributary, settings: Settings, slabs: Mapping[str, Slab], stage: Stage
) -> list[LineLoadItem]:
    c = stage.construction or ConstructionSettings()
    out: list[LineLoadItem] = []
    for p in tr.pieces:
        slab = slabs.get(p.slab) if p.slab else None
        if p.kind == "floor":
            if c.live > 0:
                out.append(LineLoadItem("C", c.live * p.width, p.start, p.end,
                                        "construction live"))  # fmt: skip
            if c.wet_concrete is not None:  # one given pressure over the floor, counted once
                out.append(LineLoadItem("D", c.wet_concrete * p.width, p.start, p.end,
                                        "wet concrete"))  # fmt: skip
        elif slab is not None and c.wet_concrete is None:
            q = slab_weight(slab, settings)
            out.append(LineLoadItem("D", q * p.width, p.start, p.end, f"wet concrete {slab.guid}"))
    return out


def reducible_area(
    tr: Tributary | None,
    settings: Settings,
    slabs: Mapping[str, Slab],
    level: StoreyLoads | None,
    table: FloorLoadTable | None = None,
) -> float:
    """The floor (m²) of a beam's own tributary whose live load may be reduced."""
    if tr is None or (level is not None and level.floor is False):
        return 0.0
    table = table or FloorLoadTable(settings)
    area = 0.0
    for p in tr.pieces:
        if p.kind != "floor":
            continue
        slab = slabs.get(p.slab) if p.slab else None
        if table.get(level, slab).reducible:
            area += (p.end - p.start) * p.width
    return area


# -- line and point loads from the settings ---------------------------------------------


@dataclass
class UserLoads:
    """The line and point loads of the settings on each beam, and those on beams that
    carry nothing (their load is not carried: warned, and counted as applied)."""

    lines: dict[str, list[LineLoadItem]] = field(default_factory=dict)
    points: dict[str, list[PointLoadItem]] = field(default_factory=dict)
    lost: list[tuple[str, str, float, str]] = field(default_factory=list)  # guid, case, N, key


def _sign(case: str) -> float:
    return -1.0 if case == "W" else 1.0  # a W entry is uplift, like wind_uplift


def _label(key: str, label: str, what: str) -> str:
    return f"{what} {key}" + (f" ({label})" if label else "")


def user_loads(model: Model, settings: Settings, trib: TributaryResult) -> UserLoads:
    """Resolve ``loads.lines`` and ``loads.points`` to beams (by GUID, name or edge of a
    level), stations clipped to the beam."""
    out = UserLoads()
    beams = {m.guid: m for m in model.members if m.guid in trib.beams or m.guid in trib.unable}
    by_name: dict[str, list[Member]] = {}
    for m in beams.values():
        by_name.setdefault(m.name, []).append(m)
    tol = settings.framing.level_tolerance

    def targets(guid: str | None, name: str | None, edge: str | None) -> list[Member]:
        if guid is not None:
            return [beams[guid]] if guid in beams else []
        if name is not None:
            return by_name.get(name, [])
        levels = {lv.name for lv in match_levels(edge or "", model.levels, tol)}
        return [
            m
            for g, m in beams.items()
            if level_of(m) in levels and g in trib.beams and trib.beams[g].edge
        ]

    for e in settings.loads.lines:
        for m in targets(e.guid, e.name, e.edge):
            a = min(max(e.start or 0.0, 0.0), m.length)
            b = min(e.end if e.end is not None else m.length, m.length)
            if b <= a:
                continue
            w = _sign(e.case) * e.intensity
            source = _label(e.key, e.label, "line load")
            if m.guid in trib.beams:
                out.lines.setdefault(m.guid, []).append(LineLoadItem(e.case, w, a, b, source))
            else:
                out.lost.append((m.guid, e.case, w * (b - a), e.key))
    for p in settings.loads.points:
        for m in targets(p.guid, p.name, None):
            x = min(max(p.station, 0.0), m.length)
            P = _sign(p.case) * p.force
            source = _label(p.key, p.label, "point load")
            if m.guid in trib.beams:
                out.points.setdefault(m.guid, []).append(PointLoadItem(p.case, P, x, source))
            else:
                out.lost.append((m.guid, p.case, P, p.key))
    return out


# -- the design basis of a stage ---------------------------------------------------------


@dataclass(frozen=True)
class BasisRow:
    """One area load of one level (or slab) in one stage, with where its value came from."""

    level: str
    slab: str  # GUID where a slab's own entry gave it, else ""
    case: str
    what: str  # "superimposed dead", "snow", "wet concrete", "construction live", ...
    pressure: float  # Pa (wind uplift: upward)
    origin: str  # the settings key, "default ...", "slab thickness × loads.concrete_density"


def basis_rows(
    model: Model, settings: Settings, entries: Mapping[str, StoreyLoads], stage: Stage
) -> list[BasisRow]:
    """The area loads of every level and slab with its own entry, in one stage."""
    rows: list[BasisRow] = []
    if stage.name == CONSTRUCTION:
        c = stage.construction or ConstructionSettings()
        for lv in model.levels:
            if not stage.covers(lv.name):
                continue
            for s in model.slabs:
                if (s.level or s.storey) != lv.name:
                    continue
                given = c.wet_concrete is not None
                rows.append(BasisRow(
                    lv.name, s.guid, "D", "wet concrete", wet_concrete(s, settings),
                    "construction.wet_concrete" if given else
                    "slab thickness × loads.concrete_density",
                ))  # fmt: skip
            origin = "construction.live" if not settings.is_default("construction.live") else (
                "default construction.live (20 psf)"
            )  # fmt: skip
            rows.append(BasisRow(lv.name, "", "C", "construction live", c.live, origin))
        return rows
    fields = (
        ("D", "dead", "superimposed dead"), ("L", "live", "live"),
        ("L", "partitions", "partitions"), ("Lr", "roof_live", "roof live"),
        ("S", "snow", "snow"), ("W", "wind_uplift", "wind uplift"),
    )  # fmt: skip
    slabs_by_level: dict[str, list[Slab]] = {}
    for s in model.slabs:
        if s.guid in settings.loads.slabs:
            slabs_by_level.setdefault(s.level or s.storey, []).append(s)
    for lv in model.levels:
        for slab in [None, *slabs_by_level.get(lv.name, [])]:
            fl = floor_loads(settings, entries.get(lv.name), slab, f"loads.storeys.{lv.name!r}")
            for case, name, what in fields:
                value = float(getattr(fl, name))
                if slab is None and (value != 0 or name in ("dead", "live")):
                    rows.append(BasisRow(lv.name, "", case, what, value, fl.origins[name]))
                elif slab is not None and fl.origins[name].startswith("loads.slabs"):
                    rows.append(BasisRow(lv.name, slab.guid, case, what, value,
                                         fl.origins[name]))  # fmt: skip
    return rows
