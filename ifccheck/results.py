"""What a check produces, per beam and per model: plain data for the writers.

SI base units throughout (m, N, N·m, Pa). Stations are distances along a
beam's centroid line from its start point.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum
from typing import Any, Literal

from ifccheck.reasons import Reason

Outcome = Literal["pass", "fail", "not_checked"]
OUTCOMES: tuple[Outcome, ...] = ("pass", "fail", "not_checked")
# The stages a beam is checked in: the finished building, and (when the settings give
# [construction]) the steel and deck alone under the wet concrete.
StageName = Literal["in_service", "construction"]
STAGES: tuple[StageName, ...] = ("in_service", "construction")


@dataclass
class SegmentResult:
    """One unbraced (or continuously braced) length of one flange."""

    start: float
    end: float
    lb: float  # 0 where a slab braces the compression flange continuously
    cb: float
    flange: Literal["top", "bottom"]  # the flange in compression here
    moment_demand: float  # N·m, max moment compressing that flange, governing combination
    moment_capacity: float  # N·m, design (LRFD) or allowable (ASD) strength
    nominal_moment: float  # N·m, Mn
    utilisation: float  # moment demand / moment capacity
    limit_state: str  # yielding | inelastic_ltb | elastic_ltb | flange_local_buckling
    load_combination: str
    braced_by: list[str] = field(default_factory=list)  # GUIDs at the segment's ends
    continuous: bool = False
    stage: StageName = "in_service"  # the stage whose bracing and loads this is


@dataclass
class BracePointOut:
    station: float
    kind: str
    by: str
    flange: str
    counts: bool
    reason: Reason | None = None  # why it does not count
    by_name: str = ""  # the bracing member's name, for people (the GUID stays in ``by``)
    adequacy: BraceCheckOut | None = None  # Appendix 6, where the brace was checked


@dataclass(frozen=True)
class BraceCheckOut:
    """What a brace point needs and gets: N and N/m for a point (lateral) brace, N·m and
    N·m/rad for a torsional one."""

    kind: str  # "point" or "torsional"
    required_strength: float
    required_stiffness: float
    provided_strength: float
    provided_stiffness: float
    adequate: bool
    mr: float  # N·m
    lbr: float  # m
    cd: float
    path: tuple[str, ...] = ()  # bracing members (GUIDs) to the anchor
    notes: tuple[str, ...] = ()


@dataclass
class PointLoadOut:
    case: str
    force: float  # N, downward positive
    station: float
    source: str  # GUID of the member delivering it


@dataclass
class LineLoadOut:
    case: str
    intensity: float  # N/m
    start: float
    end: float
    source: str  # "deck", "slab self-weight", "steel self-weight", ...


@dataclass
class LiveReductionOut:
    """ASCE 7-16 §4.7 live load reduction of one beam (factor 1.0: not reduced)."""

    factor: float  # L / L0, applied to the floor live load L0 in the strength combinations
    k_ll: float  # live load element factor, Table 4.7-1
    area: float  # m², tributary area A_T (for a girder: the floor of the beams it carries)
    kind: str  # "interior beam", "edge beam without a cantilever slab", "cantilever beam", ...
    floors: int  # floors whose live load it supports (limit 0.50 for one, 0.40 for more)
    note: str  # the same in words


@dataclass
class DemandOut:
    """An auditable summary of how the demand was obtained."""

    source: Literal["computed", "analysis", "none"]
    tributary_left: float = 0.0
    tributary_right: float = 0.0
    line_loads: list[LineLoadOut] = field(default_factory=list)
    point_loads: list[PointLoadOut] = field(default_factory=list)
    moment_combination: str = ""
    shear_combination: str = ""
    max_moment: float = 0.0
    max_shear: float = 0.0
    # case → per support: "D", "L" always, "Lr", "S", "W" where they load the beam;
    # "D", "C" in the construction stage
    reactions: dict[str, list[float]] = field(default_factory=dict)
    live_reduction: LiveReductionOut | None = None  # None: no reducible floor live load
    stage: StageName = "in_service"


@dataclass
class SampledDiagram:
    """Governing-combination moment and shear sampled along the beam, for the report."""

    stations: list[float]
    moment: list[float]  # N·m, sagging positive
    shear: list[float]  # N


class ExplainKind(StrEnum):
    """A cause of a beam's failure (or of its not being checked) that the tool can tell."""

    NOT_CHECKED = "not_checked"  # the reason (code) the beam was not checked
    OPENING = "opening"  # members: the slab; stations: where an opening cuts its bracing
    SLAB_GAP = "slab_gap"  # stations: a length where the slab does not brace the flange
    BRACE_NOT_COUNTING = "brace_not_counting"  # members; stations; code: why not
    ASSUMED_GRADE = "assumed_grade"  # before: the grade assumed
    SHEAR_CONTROLS = "shear_controls"  # bracing cannot help
    DEFLECTION_CONTROLS = "deflection_controls"  # bracing cannot help
    BEYOND_PLASTIC = "beyond_plastic"  # demand above the plastic strength: no Lb helps
    DECK_NOT_ATTACHED = "deck_not_attached"  # construction stage: the deck braces nothing


@dataclass(frozen=True)
class ExplainCause:
    """One cause, in SI; the report puts it into words."""

    kind: ExplainKind
    members: tuple[str, ...] = ()  # GUIDs
    stations: tuple[float, ...] = ()  # m along the beam
    code: str = ""  # a reason code, where one applies
    value: str = ""  # e.g. the assumed grade


@dataclass(frozen=True)
class StationFromEnd:
    """A station along a beam given from its nearer end, and the member at that end."""

    station: float  # m from the beam's start
    distance: float  # m from the named end
    end: Literal["start", "end"]
    member: str = ""  # GUID of the support at that end ("" for a free end)
    member_name: str = ""


@dataclass(frozen=True)
class ShapeOption:
    """A shape of the same family and nominal depth that passes as braced today."""

    profile: str
    mass_per_length: float  # kg/m
    utilisation: float


@dataclass
class Explanation:
    """Why a beam fails or is not checked, and what would make it pass."""

    causes: list[ExplainCause] = field(default_factory=list)
    # the stage explained: in service where the beam fails in service, else construction
    stage: StageName = "in_service"
    segment: int | None = None  # the failing segment the bracing figures are for
    largest_passing_lb: float | None = None  # m, at that segment's Cb and demand
    braces: list[StationFromEnd] = field(default_factory=list)  # new brace points that pass it
    brace_flange: str = ""  # the flange the new brace points restrain
    bracing_helps: bool = True  # False: no bracing alone makes the beam pass
    lighter_shape: ShapeOption | None = None
    shape_checked: bool = False  # whether the shape table was searched


@dataclass
class HandCheck:
    """The figures and equations of the governing segment's flexural strength, SI."""

    values: dict[str, float]  # lp, lr, sx, zx, rts, j, ho, ry, c, cb, lb, fy, e, mp, mr, mn, ...
    limit_state: str
    factor: float  # φb (LRFD) or Ωb (ASD)
    factor_symbol: str  # "φb" or "Ωb"
    equations: list[str]  # e.g. "AISC 360-16 Eq. F2-5 (Lp)"


@dataclass
class BeamStageResult:
    """One beam in one stage: that stage's utilisations, with its segments in
    ``BeamResult.segments`` (``segment.stage`` says which)."""

    stage: StageName
    outcome: Outcome
    utilisation: float | None = None  # worst of flexure, shear (and deflection in service)
    controlling_limit: str = ""  # "flexure", "shear", "deflection"
    strength_utilisation: float | None = None
    flexure_utilisation: float | None = None
    shear_demand: float | None = None  # N
    shear_capacity: float | None = None  # N
    shear_utilisation: float | None = None
    deflection_utilisation: float | None = None  # in service only
    governing_segment: int | None = None  # index into BeamResult.segments
    reason: Reason | None = None  # why not checked in this stage
    demand: DemandOut | None = None
    diagram: SampledDiagram | None = None  # governing moment combination of this stage
    curve: list[tuple[float, float]] | None = None  # strength versus Lb at its Cb and flange
    notes: list[str] = field(default_factory=list)


@dataclass
class BeamResult:
    guid: str
    name: str
    storey: str
    ifc_class: str
    profile: str
    grade: str
    fy: float
    start: tuple[float, float, float]
    end: tuple[float, float, float]
    length: float
    span: float  # longest distance between adjacent supports (m)
    supports: list[dict[str, Any]] = field(default_factory=list)  # {station, by}
    brace_points: list[BracePointOut] = field(default_factory=list)
    continuous_bracing: list[tuple[float, float]] = field(default_factory=list)
    free_ends: list[str] = field(default_factory=list)
    segments: list[SegmentResult] = field(default_factory=list)
    governing_segment: int | None = None
    flexure_utilisation: float | None = None
    shear_demand: float | None = None
    shear_capacity: float | None = None
    shear_utilisation: float | None = None
    deflection_live: float | None = None  # m
    deflection_total: float | None = None  # m
    deflection_live_limit: float | None = None  # m
    deflection_total_limit: float | None = None  # m
    deflection_utilisation: float | None = None
    strength_utilisation: float | None = None  # the worse of flexure and shear
    # what a failing beam fails on: "strength" (flexure or shear), "serviceability"
    # (deflection), or both; empty when it passes or was not checked
    fails_on: list[str] = field(default_factory=list)
    utilisation: float | None = None  # the worst of flexure, shear and deflection
    controlling_limit: str = ""  # "flexure", "shear", "deflection"
    outcome: Outcome = "not_checked"
    reason: Reason | None = None  # why it is not_checked
    notes: list[str] = field(default_factory=list)
    demand: DemandOut | None = None
    diagram: SampledDiagram | None = None
    # design strength versus Lb for this beam's section, steel, Cb and method:
    # (Lb m, strength N·m) points, for the report's capacity curve
    curve: list[tuple[float, float]] | None = None
    grade_source: str = ""  # "material name", "material property", "default", ...
    # names of the members the beam's start and end bear on ("" for a free end), so
    # that stations can be given from a named end
    end_members: tuple[str, str] = ("", "")
    explanation: Explanation | None = None  # for failing and not-checked beams
    trail: HandCheck | None = None  # the hand-check trail of the governing segment
    # The stage that governs (the highest utilisation); the utilisations, governing
    # segment, diagram and curve above are that stage's. ``outcome`` is the worst of the
    # stages; ``demand``, brace points, slab bracing and deflections are in service.
    stage: StageName = "in_service"
    stages: list[BeamStageResult] = field(default_factory=list)  # in service first

    @property
    def governing(self) -> SegmentResult | None:
        if self.governing_segment is None:
            return None
        return self.segments[self.governing_segment]

    def stage_result(self, stage: str) -> BeamStageResult | None:
        """This beam's result in one stage, None where it was not checked in it."""
        return next((s for s in self.stages if s.stage == stage), None)

    def stage_segments(self, stage: str) -> list[SegmentResult]:
        return [s for s in self.segments if s.stage == stage]


@dataclass
class SlabOutline:
    guid: str
    storey: str
    exterior: list[tuple[float, float]]
    holes: list[list[tuple[float, float]]] = field(default_factory=list)
    thickness: float = 0.0  # m, as modelled
    declared: bool = False  # a deck declared in the settings, not modelled
    diaphragm: bool = True  # it ties the framing (a modelled slab, or a declared deck that braces)


@dataclass
class LevelInfo:
    """One floor or roof level as the load path saw it."""

    name: str  # the storey's name, or the level's elevation for models without storeys
    elevation: float | None  # m
    deck_angle: float | None  # deck span direction, degrees from +x in [0, 180)
    deck_source: str  # "inferred", "settings" or "none"
    deck_evidence: int = 0  # beams agreeing with the inferred direction
    typical_spacing: float | None = None  # m, of the beams the deck spans between


@dataclass
class LoadBalance:
    """Floor load applied to a level and delivered to its supporting members, per case."""

    level: str
    case: str  # "D", "L", ...
    applied: float  # N
    delivered: float  # N


@dataclass
class CombinationOut:
    """One load combination of a stage, factors by load case."""

    name: str  # "1.2D+1.6L+0.5S", "0.9D+1.0W", "1.2D+1.6C"
    factors: dict[str, float]
    source: str  # "ASCE 7-16 §2.3.1 (2)", "ASCE 37-14 §2.2 (from memory), ..."
    number: str = ""  # its number in the standard: "2", "6a"


@dataclass
class AreaLoadOut:
    """One area load of one level (or of one slab with its own settings) in one stage."""

    level: str
    slab: str  # slab GUID where the slab's own entry gives it, else ""
    case: str  # "D", "L", "Lr", "S", "W", "C"
    what: str  # "superimposed dead", "live", "partitions", "roof live", "snow",
    # "wind uplift" (acting upward), "wet concrete", "construction live"
    pressure: float  # Pa
    origin: str  # the settings key that gave it, or "default ..."


@dataclass
class StageResult:
    """The design basis of one stage and what its check found."""

    stage: StageName
    title: str  # "in service", "construction"
    slab_bracing: bool  # whether slabs (or decks) brace the top flanges they bear on
    levels: list[str]  # the levels it covers
    combinations: list[CombinationOut] = field(default_factory=list)
    loads: list[AreaLoadOut] = field(default_factory=list)
    load_balance: list[LoadBalance] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)  # what it assumes, in words
    # beams checked in this stage by outcome, and how many it governs
    summary: dict[str, int] = field(default_factory=dict)


@dataclass
class ModelInfo:
    file: str
    schema: str
    sha256: str
    length_unit: str


@dataclass
class RequirementElement:
    """One element that does not meet a model information requirement."""

    guid: str
    name: str
    ifc_class: str
    storey: str
    reason: str  # why it does not meet the requirement, in words
    # its centroid line (m, model coordinates) when it is a member the reader placed
    start: tuple[float, float, float] | None = None
    end: tuple[float, float, float] | None = None


@dataclass
class RequirementResult:
    """The audit of one specification: an IDS specification (audited by ifctester) or a
    requirement IDS 1.0 facets cannot express (checked by ifccheck itself)."""

    identifier: str  # the tool's own key ("beam_grade", ...), or the IDS's identifier
    name: str
    description: str
    instructions: str
    source: str  # the IDS file's name, or "ifccheck" for the requirements it checks itself
    checked_by: Literal["ifctester", "ifccheck"]
    applicable: int  # elements the specification applies to
    failing: list[RequirementElement] = field(default_factory=list)
    met: bool = True  # False also for a required specification that applies to nothing

    @property
    def passing(self) -> int:
        """Applicable elements that meet every requirement of the specification."""
        return self.applicable - len(self.failing)

    @property
    def failing_guids(self) -> list[str]:
        return [e.guid for e in self.failing]


@dataclass
class CheckResult:
    tool: str
    version: str
    model: ModelInfo
    settings: dict[str, Any]
    standard: str
    method: str
    checked_at: str  # ISO 8601 date-time, UTC
    beams: list[BeamResult]
    storeys: list[tuple[str, float]] = field(default_factory=list)  # (name, elevation)
    slabs: list[SlabOutline] = field(default_factory=list)
    warnings: list[tuple[str, str]] = field(default_factory=list)  # (guid, message)
    caution: str = ""
    levels: list[LevelInfo] = field(default_factory=list)
    load_balance: list[LoadBalance] = field(default_factory=list)
    project: str = ""  # the project's name where the model gives one (else the file's name)
    names: dict[str, str] = field(default_factory=dict)  # GUID → name of each named element
    # what was assumed rather than read, counted: "default_grade", "inferred_deck_direction",
    # "inferred_role" → number of beams or levels
    assumptions: dict[str, int] = field(default_factory=dict)
    # members written as beams, columns or members that brace and support nothing, by kind
    excluded: dict[str, list[str]] = field(default_factory=dict)
    # the model information audit, one record per specification (empty: not audited)
    requirements: list[RequirementResult] = field(default_factory=list)
    # the design basis and findings per stage: in service first, then construction when
    # the settings give it
    stages: list[StageResult] = field(default_factory=list)

    def not_checked_by_reason(self) -> dict[str, int]:
        """Not-checked beams counted by reason code."""
        counts: dict[str, int] = {}
        for b in self.beams:
            if b.outcome == "not_checked" and b.reason is not None:
                counts[b.reason.code.value] = counts.get(b.reason.code.value, 0) + 1
        return dict(sorted(counts.items()))

    def summary(self) -> dict[str, int]:
        counts: dict[str, int] = {s: 0 for s in OUTCOMES}
        for b in self.beams:
            counts[b.outcome] += 1
        counts["total"] = len(self.beams)
        return counts


# how a matched beam changed between revisions: weakened (a cause made it worse),
# strengthened (only better causes) or changed (neither, e.g. its demand fell because
# a member that loaded it lost its support)
Change = Literal["weakened", "strengthened", "changed"]


class CauseKind(StrEnum):
    """What changed about a beam between two revisions."""

    LOST_BRACES = "lost_braces"  # stations
    ADDED_BRACES = "added_braces"  # stations
    LOST_SUPPORTS = "lost_supports"  # members
    GAINED_SUPPORTS = "gained_supports"  # members
    LOST_SLAB_BRACING = "lost_slab_bracing"  # after: length lost (m)
    LB_GREW = "lb_grew"  # before, after (m)
    OUTCOME_WORSE = "outcome_worse"  # before, after (outcome)
    OUTCOME_BETTER = "outcome_better"
    UTILISATION_ROSE = "utilisation_rose"  # before, after
    UTILISATION_FELL = "utilisation_fell"
    DEMAND_FELL_LOST_LOAD = "demand_fell_lost_load"  # members: whose load no longer arrives
    TRIBUTARY_GREW = "tributary_grew"  # before, after (m); members: removed neighbours


WORSE_CAUSES = frozenset(
    {
        CauseKind.LOST_BRACES,
        CauseKind.LOST_SUPPORTS,
        CauseKind.LOST_SLAB_BRACING,
        CauseKind.LB_GREW,
        CauseKind.OUTCOME_WORSE,
        CauseKind.UTILISATION_ROSE,
        CauseKind.TRIBUTARY_GREW,
    }
)


@dataclass(frozen=True)
class ChangeCause:
    """One cause of a beam's change, in SI; the report puts it into words."""

    kind: CauseKind
    stations: tuple[float, ...] = ()  # m along the new beam
    members: tuple[str, ...] = ()  # GUIDs
    before: float | str | None = None
    after: float | str | None = None
    stage: str = ""  # for Lb and utilisation causes: the stage compared ("in_service", ...)

    @property
    def worse(self) -> bool:
        return self.kind in WORSE_CAUSES


@dataclass
class BeamChange:
    """How one beam matched between two revisions changed."""

    guid: str  # GUID in the new revision
    old_guid: str
    name: str
    storey: str
    matched_by: Literal["guid", "geometry"]
    lost_brace_points: list[float] = field(default_factory=list)  # stations, new beam's axis
    added_brace_points: list[float] = field(default_factory=list)
    lost_supports: list[str] = field(default_factory=list)  # GUIDs
    gained_supports: list[str] = field(default_factory=list)
    lost_continuous_bracing: float = 0.0  # m of slab-braced length lost
    lb_before: float | None = None
    lb_after: float | None = None
    utilisation_before: float | None = None
    utilisation_after: float | None = None
    outcome_before: str = ""
    outcome_after: str = ""
    change: Change = "changed"
    causes: list[ChangeCause] = field(default_factory=list)
    # the stage whose Lb and utilisation are shown above: the first stage that got
    # worse, else the new revision's governing stage
    stage: str = "in_service"


@dataclass
class DiffResult:
    old: CheckResult
    new: CheckResult
    matched: int
    added: list[str]  # GUIDs of beams only in the new revision
    removed: list[str]  # GUIDs of beams only in the old revision
    changes: list[BeamChange]

    @property
    def weakened(self) -> list[BeamChange]:
        """The changes that made a beam worse."""
        return [c for c in self.changes if c.change == "weakened"]
