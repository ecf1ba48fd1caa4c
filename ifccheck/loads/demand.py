"""Demand on every floor beam: Model + Framing + Settings → loads, diagrams, maxima.

1. Tributary widths (``tributary.py``) turn area loads into line loads by case
   (``cases.py``): superimposed dead, floor live, partitions, roof live, snow and
   wind uplift on the floor area, slab self-weight from each slab's modelled
   thickness, steel self-weight from the section area, and the line and point
   loads of the settings. During construction (``stage``): the steel, the wet
   concrete and the construction live load only.
2. The load path runs carried → carrier: beams are solved level by level
   (infill, then the girders they frame into, ...), each beam's unfactored
   end reactions per load case becoming point loads on the members it bears on
   at the station where it meets them. Columns, walls and other non-beam
   supports collect the reactions (reported, not checked). The floor each
   beam carries (A_T) travels with its live-load reactions, for live load
   reduction (``reduction.py``, ASCE 7-16 §4.7).
3. Statics per beam (``statics.py``) and the ASCE 7-16 (or ASCE 37-14)
   combinations of the cases that load it (``combinations.py``) give the
   diagrams and the governing combination for moment and for shear.

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
from ifccheck.loads.cases import (
    CONSTRUCTION,
    IN_SERVICE,
    NOT_COMPUTED_NOTE,
    BasisRow,
    FloorLoadTable,
    LineLoadItem,
    PointLoadItem,
    Stage,
    StageName,
    UserLoads,
    analysis_case,
    basis_rows,
    construction_levels,
    own_loads,
    public_case,
    reducible_area,
    slab_weight,
    user_loads,
    wet_concrete,
)
from ifccheck.loads.combinations import (
    CASES,
    CONSTRUCTION_CASES,
    PATTERNED,
    REDUCIBLE,
    Combination,
    governing,
    live_patterns,
    patterned,
    reduce_to,
    service_combinations,
    strength_combinations,
)
from ifccheck.loads.reduction import LiveReduction, beam_kind
from ifccheck.loads.spans import is_floor_beam, span_note
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
from ifccheck.loads.tributary import (
    DeckSpan,
    Tributary,
    TributaryResult,
    compute_tributary,
    level_entries,
    level_of,
)
from ifccheck.model import Member, Model, Slab
from ifccheck.perf import gc_paused
from ifccheck.reasons import NotChecked, Reason
from ifccheck.results import DemandOut, LineLoadOut, LiveReductionOut, PointLoadOut
from ifccheck.units import parse_quantity

__all__ = ["CASES", "CONSTRUCTION_CASES", "LineLoadItem", "PointLoadItem"]

# Support priority when one beam end bears on several members at once (an
# infill end at a column-girder joint): the reaction goes to the first kind.
_SUPPORT_RANK = {"IfcColumn": 0, "IfcWall": 1}


@dataclass(frozen=True)
class AnalysisDemand:
    """Demand on one beam from an analysis (N·m, N).

    ``sagging`` compresses the top flange, ``hogging`` the bottom one (both as
    magnitudes). ``signed`` is False when the file gave a moment without its
    sign: then both flanges are checked for ``sagging`` (= ``hogging``).
    """

    sagging: float
    hogging: float
    shear: float | None = None
    cb: float | None = None
    signed: bool = True

    @property
    def peak(self) -> float:
        return max(self.sagging, self.hogging)


@dataclass
class SupportReaction:
    """One support of a beam and its unfactored reaction per load case."""

    station: float
    by: str
    by_class: str
    end: str | None
    reactions: dict[str, float] = field(default_factory=dict)  # case → N, upward positive
    centreline: float = 0.0  # station of the support's centreline along the beam


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
    # strength combinations of the cases that load it, with live-load patterns where it
    # has several regions; factors by analysis case (the reducible live load "L0" times
    # the reduction factor)
    combinations: tuple[Combination, ...] = ()
    # service combinations, unreduced, with live-load patterns where it has several regions
    service: tuple[Combination, ...] = ()
    governing_moment: str = ""
    governing_shear: str = ""
    max_moment: float = 0.0  # N·m, |M| of the governing combination
    max_shear: float = 0.0  # N
    source: Literal["computed", "analysis", "none"] = "none"
    # governing combinations (moment, shear) of the computed demand, kept when
    # an analysis overrides the maxima
    computed_governing: tuple[str, str] = ("", "")
    # The analysis runs between support centrelines: its station 0 is ``offset``
    # before the beam's modelled start, and it is ``span_length`` long.
    offset: float = 0.0
    span_length: float = 0.0
    floor_loaded: bool = False  # a floor or roof load reached it (itself or carried)
    from_analysis: AnalysisDemand | None = None  # its line of the demand file
    live_reduction: LiveReduction | None = None  # ASCE 7-16 §4.7, where it carries L0
    stage: StageName = IN_SERVICE

    @property
    def computed(self) -> bool:
        return self.analysis is not None

    @property
    def spans(self) -> list[tuple[float, float, str]]:
        """(start, end, "span" | "overhang") between supports, m."""
        return self.analysis.spans if self.analysis is not None else []

    @property
    def cases(self) -> list[str]:
        """The load cases that load it (with a load that is not zero), in the standard order."""
        have = {x.case for x in self.line_loads if x.w != 0.0}
        have |= {y.case for y in self.point_loads if y.P != 0.0}
        order = (*CASES, *CONSTRUCTION_CASES)
        return [c for c in dict.fromkeys(order) if c in have]

    def diagram(self, combination: str | Combination) -> Diagram:
        """Diagram of a strength or service combination, or of a load case by name."""
        if self.analysis is None:
            raise ValueError(f"{self.guid}: no diagram ({self.reason or 'demand from analysis'})")
        if isinstance(combination, Combination):
            return self.analysis.combine(_internal(combination.factors))
        for c in (*self.combinations, *self.service):
            if c.name == combination:
                return self.analysis.combine(c.factors)
        if combination == "L":
            return self.analysis.combine({"L": 1.0, REDUCIBLE: 1.0})
        if combination in self.analysis.cases:
            return self.analysis.case(combination)
        raise KeyError(f"no combination or load case named {combination!r}")

    def to_output(self) -> DemandOut:
        """The auditable summary for the results writers."""
        lr = self.live_reduction
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
            reactions={
                c: [s.reactions.get(c, 0.0) for s in self.supports]
                for c in (CONSTRUCTION_CASES if self.stage == CONSTRUCTION else ("D", "L"))
                + tuple(c for c in self.cases if c not in ("D", "L", "C"))
            },
            live_reduction=(
                LiveReductionOut(lr.factor, lr.k_ll, lr.area, lr.kind, lr.floors, lr.note)
                if lr is not None
                else None
            ),
            stage=self.stage,
        )


def _internal(factors: Mapping[str, float], reduction: float = 1.0) -> dict[str, float]:
    """Factors by load case → by analysis case: L covers its reducible part L0 as well,
    that part times the live load reduction factor."""
    out: dict[str, float] = {}
    for case, f in factors.items():
        if case == "L":
            out["L"] = f
            out[REDUCIBLE] = f * reduction
        else:
            out[case] = f
    return out


def _internal_combination(c: Combination, reduction: float = 1.0) -> Combination:
    return Combination(c.name, _internal(c.factors, reduction), c.purpose, c.source, c.number)


@dataclass
class DemandResult:
    beams: dict[str, BeamDemand]
    deck_spans: dict[str, DeckSpan]
    # unfactored reactions per case on columns, walls and other non-beam supports
    support_reactions: dict[str, dict[str, float]]
    method: str
    warnings: list[tuple[str, str]] = field(default_factory=list)
    load_balance: list[LoadBalanceRow] = field(default_factory=list)
    stage: StageName = IN_SERVICE
    # the levels the stage covers (construction: where concrete is placed; None: all)
    levels: frozenset[str] | None = None
    # the stage's strength combinations of the load cases present in the model
    combinations: tuple[Combination, ...] = ()
    basis: list[BasisRow] = field(default_factory=list)  # the area loads of each level
    notes: list[str] = field(default_factory=list)  # what the stage assumes, in words


@dataclass(frozen=True)
class LoadBalanceRow:
    """Per level and case: the load put on the level and what its beams passed on."""

    level: str
    case: str
    applied: float  # N: floor area × pressure, slab and steel self-weight, line and point loads
    delivered: float  # N: reactions onto columns, walls and members of other levels


def _bending_stiffness(m: Member) -> float | None:
    """E·I about the axis gravity bends the member about (N·m²), None without a section."""
    if m.section is None or m.steel is None:
        return None
    return m.steel.E * (m.section.Iy if m.bending_axis == "minor" else m.section.Ix)


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
    overrides: Mapping[str, AnalysisDemand] | None = None,
    stage: StageName = IN_SERVICE,
) -> DemandResult:
    """Demand on every floor beam of the model (see the module docstring), in service or
    during construction (``stage="construction"``, with ``settings.construction``)."""
    with gc_paused():
        return _compute_demand(model, framing, settings, overrides, _stage(model, settings, stage))


def _stage(model: Model, settings: Settings, name: StageName) -> Stage:
    if name == CONSTRUCTION:
        return Stage(CONSTRUCTION, construction_levels(model, settings), settings.construction)
    return Stage(IN_SERVICE)


@dataclass
class _Carried:
    """What reaches a beam through the beams it carries: reducible floor (m²), by level."""

    area: dict[str, float] = field(default_factory=dict)

    def add(self, level: str, area: float) -> None:
        if area > 0:
            self.area[level] = self.area.get(level, 0.0) + area


@dataclass
class _Inputs:
    """What the load path needs of one stage, gathered once."""

    trib: TributaryResult
    members: dict[str, Member]
    slabs: dict[str, Slab]
    beams: list[Member]  # the floor beams that carry load, in tributary order
    lines: dict[str, _Line]
    entries: dict[str, StoreyLoads]
    extra: UserLoads | None  # the settings' line and point loads (in service only)
    table: FloorLoadTable
    base: tuple[Combination, ...]  # the stage's strength combinations, before reduction


def _compute_demand(
    model: Model,
    framing: Framing,
    settings: Settings,
    overrides: Mapping[str, AnalysisDemand] | None,
    stage: Stage,
) -> DemandResult:
    trib = compute_tributary(model, settings, framing)
    members = {m.guid: m for m in model.members}
    beams = [members[g] for g in trib.beams]
    inputs = _Inputs(
        trib=trib,
        members=members,
        slabs={s.guid: s for s in model.slabs},
        beams=beams,
        lines=_lines(beams),
        entries=level_entries(model, settings),
        extra=user_loads(model, settings, trib) if stage.name == IN_SERVICE else None,
        table=FloorLoadTable(settings),
        base=strength_combinations(settings.design.method, stage.name),
    )
    result = DemandResult(
        beams={},
        deck_spans=trib.deck_spans,
        support_reactions={},
        method=settings.design.method,
        warnings=list(trib.warnings),
        stage=stage.name,
        levels=stage.levels,
    )
    _record_unable(model, framing, inputs, result, stage)
    own, own_area = _beam_records(framing, settings, inputs, result, stage)
    incoming, balance = _solve_load_path(framing, inputs, result, own, own_area)
    _finish(model, settings, inputs, result, stage, own, incoming, balance)
    if overrides:
        _apply_overrides(result, overrides)
    return result


def _record_unable(
    model: Model, framing: Framing, inputs: _Inputs, result: DemandResult, stage: Stage
) -> None:
    """Floor beams that carry nothing get their reason; a settings load on one is lost."""
    trib = inputs.trib
    for m in model.members:
        if is_floor_beam(m) and m.guid in trib.unable:
            bd = BeamDemand(m.guid, level_of(m), m.length, reason=trib.unable[m.guid],
                            stage=stage.name)  # fmt: skip
            mf = framing.members.get(m.guid)
            bd.notes += list(mf.notes) if mf is not None else []
            result.beams[m.guid] = bd
    if inputs.extra is not None:
        for g, case, _force, key in inputs.extra.lost:
            result.warnings.append(
                (g, f"{key} loads a beam that carries nothing ({trib.unable[g]}): its "
                    f"{case} load is not carried")
            )  # fmt: skip


def _beam_records(
    framing: Framing, settings: Settings, inputs: _Inputs, result: DemandResult, stage: Stage
) -> tuple[dict[str, list[LineLoadItem]], dict[str, float]]:
    """Each carrying beam's demand record with its own loads (floor, self-weight, the
    settings' line loads) and its reducible tributary area; returns both by GUID."""
    own: dict[str, list[LineLoadItem]] = {}
    own_area: dict[str, float] = {}
    for m in inputs.beams:
        tr = inputs.trib.beams[m.guid]
        span = inputs.trib.spans[m.guid]
        length = inputs.lines[m.guid].length
        bd = BeamDemand(
            guid=m.guid,
            storey=level_of(m),
            length=length,
            role=tr.role,
            tributary_left=tr.left,
            tributary_right=tr.right,
            notes=list(tr.notes),
            offset=-span.start,
            span_length=span.span_length,
            stage=stage.name,
        )
        result.beams[m.guid] = bd
        entry = inputs.entries.get(level_of(m))
        floor = entry is None or entry.floor is not False
        own[m.guid] = own_loads(m, length, tr, settings, inputs.slabs, entry, stage, inputs.table)
        own_area[m.guid] = (
            reducible_area(tr, settings, inputs.slabs, entry, inputs.table)
            if stage.name == IN_SERVICE
            else 0.0
        )
        if inputs.extra is not None:
            own[m.guid] += inputs.extra.lines.get(m.guid, [])
        if m.section is None:
            bd.notes.append("no section: steel self-weight and deflection not computed")
        if not floor:
            bd.notes.append("its level carries no floor (settings): checked on what it carries")
        note = span_note(span)
        if note:
            bd.notes.append(note)
        mf = framing.members[m.guid]
        bd.notes += [n for n in mf.notes if n not in bd.notes]
        for s in mf.supports:
            bd.supports.append(
                SupportReaction(s.station, s.by, s.by_class, s.end, centreline=span.centreline(s))
            )
    return own, own_area


def _solve_load_path(
    framing: Framing,
    inputs: _Inputs,
    result: DemandResult,
    own: dict[str, list[LineLoadItem]],
    own_area: dict[str, float],
) -> tuple[dict[str, list[PointLoadItem]], _Balance]:
    """Analyse the beams level by level of the load path (carried before carrier), each
    delivering its reactions to what it bears on; returns the reactions each beam
    received and the load delivered to the supports."""
    levels = _solve_levels(framing, result, [m.guid for m in inputs.beams])
    balance = _Balance()
    carried: dict[str, _Carried] = {}
    incoming: dict[str, list[PointLoadItem]] = {}
    reduced: dict[frozenset[str], tuple[Combination, ...]] = {}
    extra = inputs.extra
    for level in levels:
        problems = []
        for g in level:
            bd = result.beams[g]
            bd.line_loads = own[g]
            given = extra.points.get(g, []) if extra is not None else []
            bd.point_loads = sorted([*incoming.get(g, []), *given],
                                    key=lambda p: (p.station, p.source))  # fmt: skip
            have = frozenset(bd.cases)
            if have not in reduced:
                reduced[have] = reduce_to(inputs.base, have)
            problems.append(
                _problem(bd, inputs.members[g], framing, inputs.trib.beams[g], reduced[have],
                         carried.get(g), own_area[g])
            )  # fmt: skip
        for g, res in zip(level, analyse_beams(problems), strict=True):
            bd = result.beams[g]
            if isinstance(res, Exception):
                bd.reason = _statics_reason(res, framing.members[g].state == "cantilever")
                continue
            bd.analysis = res
            bd.source = "computed"
            area = _area_carried(bd, own_area[g], carried.get(g))
            _deliver(bd, res, inputs.lines, result, incoming, framing, balance, area, carried)
            bd.floor_loaded = _floor_reached(bd, inputs.trib.beams[g], result)
            _governing(bd, res)
    return incoming, balance


def _statics_reason(error: Exception, cantilever: bool) -> Reason:
    detail = str(error)
    if cantilever:
        detail += " (a cantilever needs a moment connection at its support)"
    unstable = isinstance(error, UnstableBeamError)
    return Reason.of(NotChecked.UNSTABLE if unstable else NotChecked.STATICS_FAILED, detail=detail)


def _governing(bd: BeamDemand, res: BeamAnalysis) -> None:
    """The combinations giving the largest |M| and |V| of an analysed beam."""
    if res.maxima is not None:
        mo, sh = list(res.maxima[0]), list(res.maxima[1])
    else:
        mo, sh = res.combination_maxima([c.factors for c in bd.combinations])
    (cm, bd.max_moment), (cs, bd.max_shear) = (
        governing(bd.combinations, mo),
        governing(bd.combinations, sh),
    )
    bd.governing_moment, bd.governing_shear = cm.name, cs.name
    bd.computed_governing = (cm.name, cs.name)


def _finish(
    model: Model,
    settings: Settings,
    inputs: _Inputs,
    result: DemandResult,
    stage: Stage,
    own: dict[str, list[LineLoadItem]],
    incoming: dict[str, list[PointLoadItem]],
    balance: _Balance,
) -> None:
    """Lost reactions, floor beams left without floor load, the load balance, and the
    stage's combinations, loads and notes."""
    for g, bd in result.beams.items():
        lost = sorted({p.source for p in incoming.get(g, [])}) if bd.reason else []
        if lost:
            result.warnings.append(
                (g, f"not computed ({bd.reason}); reactions of {', '.join(lost)} stop here")
            )
    _require_floor_load(model, result, inputs.trib, inputs.entries, stage)
    result.load_balance = _load_balance(
        model, inputs.trib, settings, inputs.entries, own, balance, inputs.members, stage,
        inputs.extra, inputs.table,
    )  # fmt: skip
    for row in result.load_balance:
        applied = abs(row.applied)
        if applied > 0 and abs(row.delivered - row.applied) > BALANCE_TOLERANCE * applied:
            result.warnings.append(
                ("", f"load on {row.level} not conserved for {row.case}: "
                 f"{row.delivered / row.applied:.1%} of the applied load reaches the supports")
            )  # fmt: skip
    present = {c for bd in result.beams.values() for c in bd.cases}
    result.combinations = reduce_to(inputs.base, present)
    result.basis = basis_rows(model, settings, inputs.entries, stage)
    result.notes = _stage_notes(settings, stage, present)
    if stage.name == CONSTRUCTION:
        result.warnings = [(g, f"construction stage: {w}") for g, w in result.warnings]


def _stage_notes(settings: Settings, stage: Stage, present: set[str]) -> list[str]:
    if stage.name == IN_SERVICE:
        notes = [NOT_COMPUTED_NOTE]
        if settings.loads.live_reduction or any(
            e.live_reduction for e in (*settings.loads.storeys.values(),
                                       *settings.loads.slabs.values())
        ):  # fmt: skip
            notes.append(
                "floor live load reduced by ASCE 7-16 §4.7 where permitted (not on roofs, "
                "assembly occupancies or live loads over 100 psf); partitions, line and point "
                "loads are not reduced; deflections are computed with the unreduced live load"
            )
        return notes
    c = stage.construction
    assert c is not None
    braces = (
        "the deck is attached (construction.deck_braces): it braces the top flanges it bears on"
        if c.deck_braces
        else "the deck is not attached (construction.deck_braces = false): no slab or deck "
        "braces any flange"
    )
    return [
        "construction stage: the steel and the deck alone carry the wet concrete and the "
        "construction live load, before the concrete has hardened; " + braces,
        "construction live load C: ASCE 37-14 Table 4-1 (from memory) gives duty classes of "
        "20, 25, 50 and 75 psf; placement by pump or hose is commonly taken as medium duty, "
        "50 psf",
        "strength only: deflection under the wet concrete (camber) is not checked here",
    ]


def _problem(
    bd: BeamDemand,
    m: Member,
    framing: Framing,
    tr: Tributary,
    combos: tuple[Combination, ...],
    carried: _Carried | None,
    own_area: float,
) -> BeamProblem:
    """The statics problem of one beam, its combinations (``combos``: those of the cases
    that load it) and live load reduction set; ``own_area`` is its own reducible floor."""
    line: dict[str, list[LineLoad]] = {}
    point: dict[str, list[PointLoad]] = {}
    off = bd.offset  # analysis stations run from the first support centreline
    for x in bd.line_loads:
        line.setdefault(analysis_case(x.case, x.reducible), []).append(
            LineLoad(x.w, x.start + off, x.end + off)
        )
    for y in bd.point_loads:
        point.setdefault(analysis_case(y.case, y.reducible), []).append(
            PointLoad(y.P, y.station + off)
        )
    names = list(dict.fromkeys(["D", *line, *point]))
    cases = {c: CaseLoads(tuple(line.get(c, ())), tuple(point.get(c, ()))) for c in names}
    supports = sorted(s.centreline + bd.offset for s in bd.supports)
    regions = spans_of(np.array(supports), bd.span_length)
    present = set(bd.cases)
    reduction = 1.0
    if REDUCIBLE in names:
        by_level = dict(carried.area) if carried is not None else {}
        if own_area > 0:
            by_level[bd.storey] = by_level.get(bd.storey, 0.0) + own_area
        overhang = any(kind == "overhang" for _a, _b, kind in regions)
        kind = beam_kind(overhang or bool(framing.members[bd.guid].free_ends), tr.open_sides)
        lr = LiveReduction.of(kind, sum(by_level.values()), len(by_level))
        bd.live_reduction = lr
        reduction = lr.factor
        bd.notes.append(lr.note)
    strength = [_internal_combination(c, reduction) for c in combos]
    service = (
        [_internal_combination(c) for c in service_combinations(present)]
        if bd.stage == IN_SERVICE
        else []
    )
    patterns = live_patterns(len(regions)) if len(bd.supports) >= 2 else []
    live = [c for c in PATTERNED if c in cases]
    if patterns and live:
        for c in live:
            cases.update(_live_by_region(line.get(c, []), point.get(c, []), regions, c))
        labels = region_labels(regions)
        strength += [p for c in list(strength) for p in patterned(c, patterns, labels)]
        service += [p for c in list(service) for p in patterned(c, patterns, labels)]
    bd.combinations = tuple(strength)
    bd.service = tuple(service)
    fr = framing.members[bd.guid]
    extra = {b.station + off for b in fr.brace_points}
    extra |= {x + off for iv in fr.continuous_bracing for x in iv}
    extra = {x for x in extra if 0.0 <= x <= bd.span_length}
    return BeamProblem(
        bd.span_length, supports, cases, _bending_stiffness(m), sorted(extra),
        combinations=[c.factors for c in bd.combinations],
    )  # fmt: skip


def _area_carried(bd: BeamDemand, own: float, carried: _Carried | None) -> dict[str, float]:
    """The reducible floor (m²) a beam carries, by level: its own and what it is given."""
    out = dict(carried.area) if carried is not None else {}
    if own > 0:
        out[bd.storey] = out.get(bd.storey, 0.0) + own
    return out


# Applied and delivered load of a level agree within this share (Issue: 0.5 %).
BALANCE_TOLERANCE = 0.005


@dataclass
class _Balance:
    """Load leaving each level's beams for its supports, per case (N)."""

    delivered: dict[tuple[str, str], float] = field(default_factory=dict)

    def add(self, level: str, case: str, force: float) -> None:
        key = (level, case)
        self.delivered[key] = self.delivered.get(key, 0.0) + force


def _floor_reached(bd: BeamDemand, tr: Tributary, result: DemandResult) -> bool:
    """A floor load reached the beam: its own tributary floor, or a beam it carries."""
    if tr.floor_area > 0.0 and (result.levels is None or bd.storey in result.levels):
        return True
    sources = {p.source for p in bd.point_loads}
    return any(result.beams[s].floor_loaded for s in sources if s in result.beams)


def _require_floor_load(
    model: Model,
    result: DemandResult,
    trib: TributaryResult,
    entries: Mapping[str, StoreyLoads],
    stage: Stage,
) -> None:
    """No pass on self-weight alone: a beam no floor load reached is not checked (unless
    its level carries no floor by the settings), with one warning per level. During
    construction only the levels where concrete is placed are looked at."""
    floors = {fa.level for fa in trib.floors}
    levels_with_slab = {s.level or s.storey for s in model.slabs}
    missing: dict[str, int] = {}
    for bd in result.beams.values():
        level = bd.storey
        if bd.reason is not None or bd.floor_loaded or not stage.covers(level):
            continue
        if entries.get(level, StoreyLoads()).floor is False:
            continue
        ds = result.deck_spans.get(level)
        if level in levels_with_slab and ds is not None and ds.angle is None:
            bd.reason = Reason.of(NotChecked.NO_DECK_DIRECTION, level=level or "its level")
        elif level not in levels_with_slab and level not in floors:
            bd.reason = Reason.of(
                NotChecked.NO_FLOOR_LOAD,
                detail=f"no slab modelled on {level or 'its level'} and none declared",
            )
            missing[level] = missing.get(level, 0) + 1
        else:
            bd.reason = Reason.of(
                NotChecked.NO_FLOOR_LOAD,
                detail="no slab bears on it and no beam carrying floor load frames into it",
            )
    for level, n in sorted(missing.items()):
        result.warnings.append(
            ("", f"no floor load on {level or 'a level without a name'}: no slab modelled and "
             f"none declared; {n} beam{'s' if n != 1 else ''} not checked (declare the deck "
             "under [decks] or give their demand with --demands)")
        )  # fmt: skip
    for level, ds in sorted(result.deck_spans.items()):
        if ds.angle is None and level in levels_with_slab and stage.covers(level):
            result.warnings.append(
                ("", f"deck span direction on {level} cannot be told from the framing (no "
                 "infill beams framing into beams at both ends); state deck_span in the settings")
            )  # fmt: skip


def _load_balance(
    model: Model,
    trib: TributaryResult,
    settings: Settings,
    entries: Mapping[str, StoreyLoads],
    own: Mapping[str, list[LineLoadItem]],
    balance: _Balance,
    members: Mapping[str, Member],
    stage: Stage,
    extra: UserLoads | None,
    table: FloorLoadTable,
) -> list[LoadBalanceRow]:
    """Applied (floor area × pressure, slab and steel self-weight, line and point loads)
    against delivered load, per level and case, for the levels whose floor was distributed."""
    slabs = {s.guid: s for s in model.slabs}
    applied: dict[tuple[str, str], float] = {}

    def add(level: str, case: str, force: float) -> None:
        applied[(level, case)] = applied.get((level, case), 0.0) + force

    for fa in trib.floors:
        if not fa.computed or entries.get(fa.level, StoreyLoads()).floor is False:
            continue
        slab = slabs[fa.slab]
        if stage.name == CONSTRUCTION:
            if stage.covers(fa.level):
                c = stage.construction
                add(fa.level, "D", fa.area * wet_concrete(slab, settings))
                add(fa.level, "C", fa.area * (c.live if c is not None else 0.0))
            continue
        fl = table.get(entries.get(fa.level), slab)
        add(fa.level, "D", fa.area * (fl.dead + slab_weight(slab, settings)))
        add(fa.level, "L", fa.area * (fl.live + fl.partitions))
        for case, q in (("Lr", fl.roof_live), ("S", fl.snow), ("W", -fl.wind_uplift)):
            if q != 0:
                add(fa.level, case, fa.area * q)
    for g, items in own.items():
        level = level_of(members[g])
        for x in items:
            if x.source == "steel self-weight" or x.source.startswith("line load "):
                add(level, x.case, x.w * (x.end - x.start))
    if extra is not None:
        for g, pts in extra.points.items():
            for p in pts:
                add(level_of(members[g]), p.case, p.P)
        for g, case, force, _key in extra.lost:
            add(level_of(members[g]), case, force)
    floor_levels = {fa.level for fa in trib.floors}
    rows = []
    for (level, case), force in sorted(applied.items()):
        if level in floor_levels and stage.covers(level):
            rows.append(
                LoadBalanceRow(level, case, force, balance.delivered.get((level, case), 0.0))
            )
    return rows


def region_labels(regions: list[tuple[float, float, str]]) -> list[str]:
    """Readable names of a beam's regions: "span 1", "span 2", "overhang"..."""
    spans = iter(range(1, len(regions) + 1))
    out = []
    for _a, _b, kind in regions:
        out.append(f"span {next(spans)}" if kind == "span" else "overhang")
    return out


def _live_by_region(
    line: list[LineLoad],
    point: list[PointLoad],
    regions: list[tuple[float, float, str]],
    case: str = "L",
) -> dict[str, CaseLoads]:
    """A live load split into one case per span or overhang ("L@k", "Lr@k", ...)."""
    out: dict[str, CaseLoads] = {}
    last = len(regions) - 1
    for k, (a, b, _kind) in enumerate(regions):
        parts = tuple(
            LineLoad(x.w, max(x.start, a), min(x.end, b))
            for x in line
            if min(x.end, b) > max(x.start, a)
        )
        points = tuple(y for y in point if a <= y.station < b or (k == last and y.station >= b))
        out[f"{case}@{k}"] = CaseLoads(parts, points)
    return out


def _deliver(
    bd: BeamDemand,
    res: BeamAnalysis,
    lines: Mapping[str, _Line],
    result: DemandResult,
    incoming: dict[str, list[PointLoadItem]],
    framing: Framing,
    balance: _Balance,
    area: Mapping[str, float],
    carried: dict[str, _Carried],
) -> None:
    """Give each support its reaction and pass it on to the supporting member; what
    leaves the beam's level is counted in ``balance``. The reducible floor the beam
    carries (``area``, by level) goes with its reducible live-load reactions."""
    carried_line = lines[bd.guid]
    # framing supports → analysis support (merged stations); one receiver each
    groups: dict[int, list[SupportReaction]] = {}
    for s in bd.supports:
        j = int(np.argmin(np.abs(res.supports - (s.centreline + bd.offset))))
        groups.setdefault(j, []).append(s)
    fsup = {(s.station, s.by): s for s in framing.members[bd.guid].supports}
    cases = [(ci, c) for ci, c in enumerate(res.cases) if "@" not in c]  # not the patterns
    live_i = res.cases.index(REDUCIBLE) if REDUCIBLE in res.cases else None
    live_total = (
        sum(max(float(res.reactions[live_i, j]), 0.0) for j in groups) if live_i is not None else 0
    )
    for j, group in groups.items():
        group.sort(key=lambda s: (_SUPPORT_RANK.get(s.by_class, 2), s.by))
        receiver = group[0]
        if len(group) > 1:
            others = ", ".join(s.by for s in group[1:])
            bd.notes.append(
                f"a support bears on {receiver.by} and {others}: the reaction goes to {receiver.by}"
            )
        host = result.beams.get(receiver.by)
        st = None
        if receiver.by in lines:
            sup = fsup[(receiver.station, receiver.by)]
            st = _host_station(framing, carried_line, bd.guid, sup, lines[receiver.by])
        elif host is not None:
            st = 0.0  # a floor beam that carries nothing: the load stops there (warned)
        for c_i, c in cases:
            R = float(res.reactions[c_i, j])
            pc = public_case(c)
            receiver.reactions[pc] = receiver.reactions.get(pc, 0.0) + R
            for s in group[1:]:
                s.reactions.setdefault(pc, 0.0)
            if R == 0.0 and (pc not in ("D", "L") or c == REDUCIBLE):
                continue  # a case that does not load this beam
            if st is not None:
                incoming.setdefault(receiver.by, []).append(
                    PointLoadItem(pc, R, st, bd.guid, reducible=c == REDUCIBLE)
                )
            else:
                tot = result.support_reactions.setdefault(receiver.by, {})
                tot[pc] = tot.get(pc, 0.0) + R
            if host is None or host.storey != bd.storey:
                balance.add(bd.storey, pc, R)
        if live_i is not None and live_total > 0 and st is not None and receiver.by in lines:
            share = max(float(res.reactions[live_i, j]), 0.0) / live_total
            dest = carried.setdefault(receiver.by, _Carried())
            for level, a in area.items():
                dest.add(level, a * share)


def _apply_overrides(result: DemandResult, overrides: Mapping[str, AnalysisDemand]) -> None:
    for guid, given in overrides.items():
        bd = result.beams.get(guid)
        if bd is None:
            result.warnings.append(
                (guid, f"the demand file names {guid}, which is no floor beam of the model")
            )
            continue
        bd.source = "analysis"
        bd.from_analysis = given
        bd.max_moment = given.peak
        bd.governing_moment = "analysis"
        if given.shear is not None:
            bd.max_shear = given.shear
            bd.governing_shear = "analysis"
        elif bd.analysis is None:
            bd.notes.append("demand file gives no shear and none could be computed")
        if bd.reason:
            bd.notes.append(f"computed demand unavailable ({bd.reason}); analysis demand used")
            bd.reason = None
        what = "moment" + (" and shear" if given.shear is not None else "")
        bd.notes.append(f"{what} from analysis")
        if not given.signed:
            bd.notes.append(
                "analysis moment given without its sign: both flanges are checked for it"
            )


# -- demand from an analysis -------------------------------------------------------------

_HEADER = re.compile(r"^\s*(?P<name>[A-Za-z_ ]+?)\s*(?:[\(\[](?P<unit>[^\)\]]*)[\)\]])?\s*$")


_MOMENT_COLUMNS = ("moment", "moment_signed", "moment_pos", "moment_neg")


def load_demand_csv(path: Path) -> dict[str, AnalysisDemand]:
    """Read beam demand from an analysis: GUID → :class:`AnalysisDemand`.

    Columns: ``guid``; the moment as either ``moment_pos`` and/or
    ``moment_neg`` (the sagging and hogging maxima, as magnitudes),
    ``moment_signed`` (one value: positive sagging, the top flange in
    compression; negative hogging), or ``moment`` (a magnitude whose sign is
    not known: both flanges are checked for it); optionally ``shear`` and
    ``cb`` (overrides Cb for the beam's segments, 1.0 to 3.0). Units go in
    the header in parentheses or brackets — ``moment_pos (kip-ft)``,
    ``shear [kN]`` — or in every cell ("250 kip*ft"). An empty shear or cb
    cell means none given. Unknown GUIDs are for the caller to report.
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
    header = ", ".join(rows[0])
    if "guid" not in cols:
        raise DemandFileError(f"demand file {path}: no 'guid' column (header: {header})")
    given = [c for c in _MOMENT_COLUMNS if c in cols]
    if not given:
        raise DemandFileError(
            f"demand file {path}: no moment column: moment_pos/moment_neg, moment_signed "
            f"or moment (header: {header})"
        )
    kinds = {"moment", "moment_signed"} & set(given)
    if len(kinds) > 1 or (kinds and {"moment_pos", "moment_neg"} & set(given)):
        raise DemandFileError(
            f"demand file {path}: give one kind of moment column, not {', '.join(given)}"
        )
    dims = {name: "moment" for name in _MOMENT_COLUMNS} | {"shear": "force"}
    for name, dim in dims.items():
        unit = cols.get(name, (0, None))[1]
        if unit is not None:
            try:
                parse_quantity(f"1 {unit}", dim)
            except QuantityError:
                raise DemandFileError(
                    f"demand file {path}: column {name!r}: {unit!r} is not a {dim} unit"
                ) from None

    def cell(row: list[str], name: str, line: int, optional: bool) -> float | None:
        if name not in cols:
            return None
        i, unit = cols[name]
        raw = row[i].strip() if i < len(row) else ""
        if not raw:
            if optional:
                return None
            raise DemandFileError(f"demand file {path}: line {line}: empty {name}")
        if name == "cb":
            try:
                cb = float(raw)
            except ValueError:
                raise DemandFileError(
                    f"demand file {path}: line {line}: cb {raw[:30]!r} is not a number"
                ) from None
            if not 1.0 <= cb <= 3.0:
                raise DemandFileError(
                    f"demand file {path}: line {line}: cb {cb:g} is outside 1.0 to 3.0"
                )
            return cb
        text = f"{raw} {unit}" if unit else raw
        try:
            return parse_quantity(text, dims[name])
        except QuantityError as e:
            raise DemandFileError(f"demand file {path}: line {line}: {name}: {e}") from None

    out: dict[str, AnalysisDemand] = {}
    pos_neg = not kinds
    for line, row in enumerate(rows[1:], start=2):
        gi = cols["guid"][0]
        guid = row[gi].strip() if gi < len(row) else ""
        if not guid:
            raise DemandFileError(f"demand file {path}: line {line}: empty guid")
        if guid in out:
            raise DemandFileError(f"demand file {path}: line {line}: {guid} appears twice")
        shear = cell(row, "shear", line, optional=True)
        cb = cell(row, "cb", line, optional=True)
        shear = abs(shear) if shear is not None else None
        if pos_neg:
            pos = cell(row, "moment_pos", line, optional=True)
            neg = cell(row, "moment_neg", line, optional=True)
            if pos is None and neg is None:
                raise DemandFileError(f"demand file {path}: line {line}: no moment given")
            out[guid] = AnalysisDemand(abs(pos or 0.0), abs(neg or 0.0), shear, cb)
        elif "moment_signed" in cols:
            v = cell(row, "moment_signed", line, optional=False) or 0.0
            out[guid] = AnalysisDemand(max(v, 0.0), max(-v, 0.0), shear, cb)
        else:
            v = abs(cell(row, "moment", line, optional=False) or 0.0)
            out[guid] = AnalysisDemand(v, v, shear, cb, signed=False)
    return out
