"""Demand on every floor beam: Model + Framing + Settings → loads, diagrams, maxima.

1. Tributary widths (``tributary.py``) turn area loads into line loads:
   superimposed dead and live load on the floor area, slab self-weight from
   each slab's modelled thickness, steel self-weight from the section area.
2. The load path runs carried → carrier: beams are solved level by level
   (infill, then the girders they frame into, ...), each beam's unfactored
   end reactions per load case (D, L) becoming point loads on the members it
   bears on at the station where it meets them. Columns, walls and other
   non-beam supports collect the reactions (reported, not checked).
3. Statics per beam (``statics.py``) and the ASCE 7-16 combinations
   (``combinations.py``) give the diagrams and the governing combination for
   moment and for shear.

A beam that cannot be computed (fewer than two supports, part of a support
cycle, outside the framing analysis) gets a ``reason``; the rest of the model
is computed without it. Demand from an analysis (``load_demand_csv``)
overrides the computed maxima of the beams it names.
"""

from __future__ import annotations

import csv
import re
from collections.abc import Mapping
from dataclasses import dataclass, field
from pathlib import Path
from typing import Literal

import numpy as np

from ifccheck.config import Settings, StoreyLoads
from ifccheck.errors import DemandFileError, QuantityError
from ifccheck.framing.graph import cycle_path
from ifccheck.framing.types import Framing, Support
from ifccheck.loads.combinations import (
    SERVICE,
    Combination,
    governing,
    live_patterns,
    patterned,
    strength_combinations,
)
from ifccheck.loads.statics import (
    BeamAnalysis,
    BeamProblem,
    CaseLoads,
    Diagram,
    LineLoad,
    PointLoad,
    UnstableBeamError,
    analyse_beams,
    spans_of,
)
from ifccheck.loads.tributary import DeckSpan, Tributary, compute_tributary
from ifccheck.model import Member, Model, Slab
from ifccheck.perf import gc_paused
from ifccheck.reasons import NotChecked, Reason
from ifccheck.results import DemandOut, LineLoadOut, PointLoadOut
from ifccheck.units import G, parse_quantity

CASES = ("D", "L")

# Support priority when one beam end bears on several members at once (an
# infill end at a column-girder joint): the reaction goes to the first kind.
_SUPPORT_RANK = {"IfcColumn": 0, "IfcWall": 1}


@dataclass(frozen=True)
class LineLoadItem:
    case: str  # "D" or "L"
    w: float  # N/m, downward positive
    start: float  # m along the beam
    end: float
    source: str  # "superimposed dead", "live", "slab self-weight <guid>", "steel self-weight"


@dataclass(frozen=True)
class PointLoadItem:
    case: str
    P: float  # N, downward positive (negative: uplift from a backspan)
    station: float  # m along the beam
    source: str  # GUID of the beam whose reaction this is


@dataclass
class SupportReaction:
    """One support of a beam and its unfactored reaction per load case."""

    station: float
    by: str
    by_class: str
    end: str | None
    reactions: dict[str, float] = field(default_factory=dict)  # case → N, upward positive


@dataclass
class BeamDemand:
    """Loads, diagrams and maxima for one beam."""

    guid: str
    storey: str
    length: float
    role: str = "other"  # tributary role: deck, girder, other
    reason: Reason | None = None  # why no demand could be computed
    notes: list[str] = field(default_factory=list)
    tributary_left: float = 0.0  # m
    tributary_right: float = 0.0
    line_loads: list[LineLoadItem] = field(default_factory=list)
    point_loads: list[PointLoadItem] = field(default_factory=list)
    supports: list[SupportReaction] = field(default_factory=list)
    analysis: BeamAnalysis | None = None
    combinations: tuple[Combination, ...] = ()
    # service combinations, with live-load patterns where the beam has several regions
    service: tuple[Combination, ...] = SERVICE
    governing_moment: str = ""
    governing_shear: str = ""
    max_moment: float = 0.0  # N·m, |M| of the governing combination
    max_shear: float = 0.0  # N
    source: Literal["computed", "analysis", "none"] = "none"
    # governing combinations (moment, shear) of the computed demand, kept when
    # an analysis overrides the maxima
    computed_governing: tuple[str, str] = ("", "")

    @property
    def computed(self) -> bool:
        return self.analysis is not None

    @property
    def spans(self) -> list[tuple[float, float, str]]:
        """(start, end, "span" | "overhang") between supports, m."""
        return self.analysis.spans if self.analysis is not None else []

    def diagram(self, combination: str | Combination) -> Diagram:
        """Diagram of a strength or service combination, or of a load case by name."""
        if self.analysis is None:
            raise ValueError(f"{self.guid}: no diagram ({self.reason or 'demand from analysis'})")
        if isinstance(combination, Combination):
            return self.analysis.combine(combination.factors)
        for c in (*self.combinations, *self.service):
            if c.name == combination:
                return self.analysis.combine(c.factors)
        if combination in self.analysis.cases:
            return self.analysis.case(combination)
        raise KeyError(f"no combination or load case named {combination!r}")

    def to_output(self) -> DemandOut:
        """The auditable summary for the results writers."""
        return DemandOut(
            source=self.source,
            tributary_left=self.tributary_left,
            tributary_right=self.tributary_right,
            line_loads=[
                LineLoadOut(x.case, x.w, x.start, x.end, x.source) for x in self.line_loads
            ],
            point_loads=[PointLoadOut(x.case, x.P, x.station, x.source) for x in self.point_loads],
            moment_combination=self.governing_moment,
            shear_combination=self.governing_shear,
            max_moment=self.max_moment,
            max_shear=self.max_shear,
            reactions={c: [s.reactions.get(c, 0.0) for s in self.supports] for c in CASES},
        )


@dataclass
class DemandResult:
    beams: dict[str, BeamDemand]
    deck_spans: dict[str, DeckSpan]
    # unfactored reactions per case on columns, walls and other non-beam supports
    support_reactions: dict[str, dict[str, float]]
    method: str
    warnings: list[tuple[str, str]] = field(default_factory=list)


def _pressures(settings: Settings, storey: str, slab: Slab | None) -> tuple[float, float]:
    """(superimposed dead, live) in Pa: slab override, then storey, then default."""
    loads = settings.loads
    chain: list[StoreyLoads | None] = []
    if slab is not None:
        chain += [loads.slabs.get(slab.guid), loads.storeys.get(slab.storey)]
    chain.append(loads.storeys.get(storey))
    dead = next((e.dead for e in chain if e is not None and e.dead is not None), loads.dead)
    live = next((e.live for e in chain if e is not None and e.live is not None), loads.live)
    return dead, live


def _own_loads(
    m: Member, length: float, tr: Tributary | None, settings: Settings, slabs: Mapping[str, Slab]
) -> list[LineLoadItem]:
    out: list[LineLoadItem] = []
    if m.section is not None and m.section.A > 0:
        w = m.section.A * settings.loads.steel_density * G
        out.append(LineLoadItem("D", w, 0.0, length, "steel self-weight"))
    if tr is None:
        return out
    for p in tr.pieces:
        slab = slabs.get(p.slab) if p.slab else None
        if p.kind == "floor":
            dead, live = _pressures(settings, m.storey, slab)
            if dead > 0:
                out.append(LineLoadItem("D", dead * p.width, p.start, p.end, "superimposed dead"))
            if live > 0:
                out.append(LineLoadItem("L", live * p.width, p.start, p.end, "live"))
        elif slab is not None:
            q = slab.thickness * settings.loads.concrete_density * G
            out.append(
                LineLoadItem("D", q * p.width, p.start, p.end, f"slab self-weight {slab.guid}")
            )
    return out


@dataclass(frozen=True)
class _Line:
    """A member's centroid line: start point, unit direction, length."""

    start: np.ndarray
    direction: np.ndarray
    length: float


def _lines(members: list[Member]) -> dict[str, _Line]:
    if not members:
        return {}
    a = np.array([m.start for m in members], dtype=float)
    b = np.array([m.end for m in members], dtype=float)
    length = np.linalg.norm(b - a, axis=1)
    d = (b - a) / np.where(length > 0, length, 1.0)[:, None]
    return {m.guid: _Line(a[i], d[i], float(length[i])) for i, m in enumerate(members)}


def _host_station(framing: Framing, carried: _Line, guid: str, sup: Support, host: _Line) -> float:
    """Station along the host where the carried beam's support point meets it:
    the framing graph's edge station, else the projection onto the host's line."""
    best: tuple[float, float] | None = None
    for e in framing.edges(guid, sup.by):
        if sup.end is not None and e.end == sup.end:
            return e.station
        if sup.end is None and (
            best is None or abs(e.at - sup.station) < abs(best[0] - sup.station)
        ):
            best = (e.at, e.station)
    if best is not None:
        return best[1]
    p = carried.start + carried.direction * sup.station
    s = float((p - host.start) @ host.direction)
    return min(max(s, 0.0), host.length)


def _solve_levels(framing: Framing, result: DemandResult, beams: list[str]) -> list[list[str]]:
    """The framing graph's load-path levels, kept to the beams that can be solved.

    Members of a support cycle are not computed (the framing graph has warned
    about the cycle); the beams that carry them go on without their load.
    """
    for cycle in framing.cycles:
        path = cycle_path(cycle)
        for g in cycle:
            bd = result.beams.get(g)
            if bd is not None and bd.reason is None:
                bd.reason = Reason.of(NotChecked.LOAD_PATH_CYCLE, path=path)
    solvable = {g for g in beams if result.beams[g].reason is None}
    levels = [[g for g in level if g in solvable] for level in framing.load_levels]
    placed = {g for level in levels for g in level}
    rest = [g for g in beams if g in solvable and g not in placed]  # outside the graph
    return [level for level in levels if level] + ([rest] if rest else [])


def compute_demand(
    model: Model,
    framing: Framing,
    settings: Settings,
    overrides: Mapping[str, tuple[float, float | None]] | None = None,
) -> DemandResult:
    """Demand on every floor beam of the model (see the module docstring)."""
    with gc_paused():
        return _compute_demand(model, framing, settings, overrides)


def _compute_demand(
    model: Model,
    framing: Framing,
    settings: Settings,
    overrides: Mapping[str, tuple[float, float | None]] | None,
) -> DemandResult:
    trib = compute_tributary(model, settings)
    members = {m.guid: m for m in model.members}
    slabs = {s.guid: s for s in model.slabs}
    combos = strength_combinations(settings.design.method)
    result = DemandResult(
        beams={},
        deck_spans=trib.deck_spans,
        support_reactions={},
        method=settings.design.method,
        warnings=list(trib.warnings),
    )
    beams = [members[g] for g in trib.beams]
    lines = _lines(beams)

    own: dict[str, list[LineLoadItem]] = {}
    for m in beams:
        tr = trib.beams[m.guid]
        bd = BeamDemand(
            guid=m.guid,
            storey=m.storey,
            length=lines[m.guid].length,
            role=tr.role,
            tributary_left=tr.left,
            tributary_right=tr.right,
            combinations=combos,
            notes=list(tr.notes),
        )
        result.beams[m.guid] = bd
        own[m.guid] = _own_loads(m, lines[m.guid].length, tr, settings, slabs)
        if m.section is None:
            bd.notes.append("no section: steel self-weight and deflection not computed")
        mf = framing.members.get(m.guid)
        if mf is None:
            bd.reason = Reason.of(NotChecked.NOT_IN_FRAMING)
            continue
        bd.notes += [n for n in mf.notes if n not in bd.notes]
        for s in mf.supports:
            bd.supports.append(SupportReaction(s.station, s.by, s.by_class, s.end))
        if not mf.supports:
            bd.reason = Reason.of(NotChecked.UNSUPPORTED)

    levels = _solve_levels(framing, result, [m.guid for m in beams])

    incoming: dict[str, list[PointLoadItem]] = {}
    for level in levels:
        problems = []
        for g in level:
            bd = result.beams[g]
            m = members[g]
            items = own[g]
            bd.line_loads = items
            bd.point_loads = sorted(incoming.get(g, []), key=lambda p: (p.station, p.source))
            line: dict[str, list[LineLoad]] = {c: [] for c in CASES}
            point: dict[str, list[PointLoad]] = {c: [] for c in CASES}
            for x in items:
                line[x.case].append(LineLoad(x.w, x.start, x.end))
            for y in bd.point_loads:
                point[y.case].append(PointLoad(y.P, y.station))
            cases = {c: CaseLoads(tuple(line[c]), tuple(point[c])) for c in CASES}
            regions = spans_of(np.array(sorted(s.station for s in bd.supports)), lines[g].length)
            patterns = live_patterns(len(regions)) if len(bd.supports) >= 2 else []
            if patterns:
                cases.update(_live_by_region(line["L"], point["L"], regions))
                labels = region_labels(regions)
                bd.combinations = (
                    *combos, *(p for c in combos for p in patterned(c, patterns, labels))
                )  # fmt: skip
                bd.service = (
                    *SERVICE, *(p for c in SERVICE for p in patterned(c, patterns, labels))
                )  # fmt: skip
            fr = framing.members[g]
            extra = {b.station for b in fr.brace_points}
            extra |= {x for iv in fr.continuous_bracing for x in iv}
            EI = m.steel.E * m.section.Ix if m.section is not None and m.steel is not None else None
            problems.append(
                BeamProblem(
                    lines[g].length, [s.station for s in bd.supports], cases, EI, sorted(extra)
                )
            )
        factors = [c.factors for c in combos]
        for g, res in zip(level, analyse_beams(problems, combinations=factors), strict=True):
            bd = result.beams[g]
            if isinstance(res, Exception):
                detail = str(res)
                if framing.members[g].state == "cantilever":
                    detail += " (a cantilever needs a moment connection at its support)"
                code = (
                    NotChecked.UNSTABLE
                    if isinstance(res, UnstableBeamError)
                    else NotChecked.STATICS_FAILED
                )
                bd.reason = Reason.of(code, detail=detail)
                continue
            bd.analysis = res
            bd.source = "computed"
            _deliver(bd, res, lines, result, incoming, framing)
            own_combos = bd.combinations
            if len(own_combos) != len(combos):
                mo, sh = res.combination_maxima([c.factors for c in own_combos])
            elif res.maxima is not None:
                mo, sh = list(res.maxima[0]), list(res.maxima[1])
            else:
                mo, sh = res.combination_maxima(factors)
            (cm, bd.max_moment), (cs, bd.max_shear) = (
                governing(own_combos, mo),
                governing(own_combos, sh),
            )
            bd.governing_moment, bd.governing_shear = cm.name, cs.name
            bd.computed_governing = (cm.name, cs.name)

    for g, bd in result.beams.items():
        lost = sorted({p.source for p in incoming.get(g, [])}) if bd.reason else []
        if lost:
            result.warnings.append(
                (g, f"not computed ({bd.reason}); reactions of {', '.join(lost)} stop here")
            )
    if overrides:
        _apply_overrides(result, overrides)
    return result


def region_labels(regions: list[tuple[float, float, str]]) -> list[str]:
    """Readable names of a beam's regions: "span 1", "span 2", "overhang"..."""
    spans = iter(range(1, len(regions) + 1))
    out = []
    for _a, _b, kind in regions:
        out.append(f"span {next(spans)}" if kind == "span" else "overhang")
    return out


def _live_by_region(
    line: list[LineLoad], point: list[PointLoad], regions: list[tuple[float, float, str]]
) -> dict[str, CaseLoads]:
    """The live load split into one case per span or overhang ("L@k")."""
    out: dict[str, CaseLoads] = {}
    last = len(regions) - 1
    for k, (a, b, _kind) in enumerate(regions):
        parts = tuple(
            LineLoad(x.w, max(x.start, a), min(x.end, b))
            for x in line
            if min(x.end, b) > max(x.start, a)
        )
        points = tuple(y for y in point if a <= y.station < b or (k == last and y.station >= b))
        out[f"L@{k}"] = CaseLoads(parts, points)
    return out


def _deliver(
    bd: BeamDemand,
    res: BeamAnalysis,
    lines: Mapping[str, _Line],
    result: DemandResult,
    incoming: dict[str, list[PointLoadItem]],
    framing: Framing,
) -> None:
    """Give each support its reaction and pass it on to the supporting member."""
    carried = lines[bd.guid]
    # framing supports → analysis support (merged stations); one receiver each
    groups: dict[int, list[SupportReaction]] = {}
    for s in bd.supports:
        j = int(np.argmin(np.abs(res.supports - s.station)))
        groups.setdefault(j, []).append(s)
    fsup = {(s.station, s.by): s for s in framing.members[bd.guid].supports}
    for j, group in groups.items():
        group.sort(key=lambda s: (_SUPPORT_RANK.get(s.by_class, 2), s.by))
        receiver = group[0]
        if len(group) > 1:
            others = ", ".join(s.by for s in group[1:])
            bd.notes.append(
                f"support at {receiver.station:.3f} m bears on {receiver.by} and {others}: "
                f"the reaction goes to {receiver.by}"
            )
        st = None
        if receiver.by in result.beams:
            sup = fsup[(receiver.station, receiver.by)]
            st = _host_station(framing, carried, bd.guid, sup, lines[receiver.by])
        for ci, c in enumerate(res.cases):
            if c not in CASES:
                continue  # live-load patterns (L@k) are for this beam's own check only
            R = float(res.reactions[ci, j])
            receiver.reactions[c] = R
            for s in group[1:]:
                s.reactions[c] = 0.0
            if st is not None:
                incoming.setdefault(receiver.by, []).append(PointLoadItem(c, R, st, bd.guid))
            else:
                tot = result.support_reactions.setdefault(receiver.by, {})
                tot[c] = tot.get(c, 0.0) + R


def _apply_overrides(
    result: DemandResult, overrides: Mapping[str, tuple[float, float | None]]
) -> None:
    for guid, (moment, shear) in overrides.items():
        bd = result.beams.get(guid)
        if bd is None:
            result.warnings.append(
                (guid, f"the demand file names {guid}, which is no floor beam of the model")
            )
            continue
        bd.source = "analysis"
        bd.max_moment = abs(moment)
        bd.governing_moment = "analysis"
        if shear is not None:
            bd.max_shear = abs(shear)
            bd.governing_shear = "analysis"
        elif bd.analysis is None:
            bd.notes.append("demand file gives no shear and none could be computed")
        if bd.reason:
            bd.notes.append(f"computed demand unavailable ({bd.reason}); analysis demand used")
            bd.reason = None
        bd.notes.append("moment" + (" and shear" if shear is not None else "") + " from analysis")


# -- demand from an analysis -------------------------------------------------------------

_HEADER = re.compile(r"^\s*(?P<name>[A-Za-z_ ]+?)\s*(?:[\(\[](?P<unit>[^\)\]]*)[\)\]])?\s*$")


def load_demand_csv(path: Path) -> dict[str, tuple[float, float | None]]:
    """Read beam demand from an analysis: GUID → (moment N·m, shear N or None).

    Columns: ``guid``, ``moment`` and optionally ``shear``. Units go in the
    header in parentheses or brackets — ``moment (kip-ft)``, ``shear [kN]`` —
    and the cells hold plain numbers; a header without a unit needs a unit in
    every cell ("250 kip*ft"). Signs are dropped (demand is a magnitude); an
    empty shear cell means no shear given. Unknown GUIDs are for the caller
    to report (``compute_demand`` warns about them).
    """
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8-sig")
    except FileNotFoundError:
        raise DemandFileError(f"demand file {path}: no such file") from None
    except (OSError, UnicodeDecodeError) as e:
        raise DemandFileError(f"demand file {path}: cannot be read ({e})") from None
    rows = list(csv.reader(text.splitlines()))
    rows = [r for r in rows if any(c.strip() for c in r)]
    if not rows:
        raise DemandFileError(f"demand file {path}: empty")
    cols: dict[str, tuple[int, str | None]] = {}
    for i, h in enumerate(rows[0]):
        m = _HEADER.match(h)
        name = m.group("name").strip().lower() if m else h.strip().lower()
        if name in cols:
            raise DemandFileError(f"demand file {path}: column {name!r} appears twice")
        unit = m.group("unit").strip() if m and m.group("unit") else None
        cols[name] = (i, unit)
    for need in ("guid", "moment"):
        if need not in cols:
            raise DemandFileError(
                f"demand file {path}: no {need!r} column (header: {', '.join(rows[0])})"
            )
    dims = {"moment": "moment", "shear": "force"}
    for name in ("moment", "shear"):
        unit = cols.get(name, (0, None))[1]
        if unit is not None:
            try:
                parse_quantity(f"1 {unit}", dims[name])
            except QuantityError:
                raise DemandFileError(
                    f"demand file {path}: column {name!r}: {unit!r} is not a {dims[name]} unit"
                ) from None

    def cell(row: list[str], name: str, line: int) -> float | None:
        if name not in cols:
            return None
        i, unit = cols[name]
        raw = row[i].strip() if i < len(row) else ""
        if not raw:
            if name == "shear":
                return None
            raise DemandFileError(f"demand file {path}: line {line}: empty {name}")
        text = f"{raw} {unit}" if unit else raw
        try:
            v = parse_quantity(text, dims[name])
        except QuantityError as e:
            raise DemandFileError(f"demand file {path}: line {line}: {name}: {e}") from None
        return abs(v)

    out: dict[str, tuple[float, float | None]] = {}
    for line, row in enumerate(rows[1:], start=2):
        gi = cols["guid"][0]
        guid = row[gi].strip() if gi < len(row) else ""
        if not guid:
            raise DemandFileError(f"demand file {path}: line {line}: empty guid")
        if guid in out:
            raise DemandFileError(f"demand file {path}: line {line}: {guid} appears twice")
        moment = cell(row, "moment", line) or 0.0  # never None: an empty moment raises
        out[guid] = (moment, cell(row, "shear", line))
    return out
