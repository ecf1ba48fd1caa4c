"""Per-beam orchestration: segments → demand and capacity → governing result.

read → framing → demand → for each beam: unbraced segments of each flange,
the moment compressing that flange in each strength combination, Cb, the
design strength from the design standard, and the ratio; the governing
segment is the one with the highest ratio, not the longest.

With ``[construction]`` in the settings the beams of the levels where concrete
is placed are checked twice: in service, and during construction (the steel and
the deck alone under the wet concrete and the construction live load, braced by
the deck only where ``construction.deck_braces`` says it is attached). Each beam
carries both stages' segments and results; the stage with the higher
utilisation governs it.
"""

from __future__ import annotations

import copy
import functools
import hashlib
import itertools
import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass, replace
from datetime import UTC, datetime
from pathlib import Path

import numpy as np

from ifccheck import CAUTION, __version__
from ifccheck.adequacy import assess_bracing
from ifccheck.config import BracingSettings, Settings, StoreyLoads, settings_to_dict
from ifccheck.design import get_standard
from ifccheck.design.base import DesignStandard, segment_moments
from ifccheck.errors import OutOfScope, SettingsError
from ifccheck.explain import explain_beams
from ifccheck.floors import prepare_floors
from ifccheck.framing import analyse_framing
from ifccheck.framing.graph import NOTE_SLAB_OFF
from ifccheck.framing.roles import STUB, UNKNOWN_SECTION
from ifccheck.framing.types import BraceAdequacy, Framing, MemberFraming
from ifccheck.ifc.reader import read_model
from ifccheck.loads.cases import CONSTRUCTION, IN_SERVICE, STAGE_TITLES, StageName
from ifccheck.loads.combinations import LIVE_DEFLECTION, TOTAL_DEFLECTION
from ifccheck.loads.demand import BeamDemand, DemandResult, compute_demand, load_demand_csv
from ifccheck.loads.spans import is_floor_beam
from ifccheck.loads.statics import Diagram
from ifccheck.loads.tributary import DeckSpan, level_entries, level_of
from ifccheck.model import MaterialCategory, Member, MemberRole, Model
from ifccheck.perf import timed
from ifccheck.reasons import NotChecked, Reason
from ifccheck.results import (
    OUTCOMES,
    AreaLoadOut,
    BeamResult,
    BeamStageResult,
    BraceCheckOut,
    BracePointOut,
    CheckResult,
    CombinationOut,
    LevelInfo,
    LoadBalance,
    ModelInfo,
    RequirementResult,
    SampledDiagram,
    SegmentResult,
    SlabOutline,
    StageResult,
)
from ifccheck.segments import SegmentSpec, beam_segments, compression_moment

# A segment whose compression-flange moment is below this share of the beam's
# largest moment does not load that flange and is not listed.
NEGLIGIBLE_MOMENT = 1e-3
DIAGRAM_POINTS = 161  # stations kept per beam for the report's moment diagram
CURVE_POINTS = 120
# Cantilever deflection limits use twice the overhang length (common practice).
OVERHANG_FACTOR = 2.0

Progress = Callable[[int, int], None]

# The in-service note of the framing stage when slab bracing is off, in the words of
# the settings: bracing.slab = false no longer stands for the construction stage.
NOTE_SLAB_OFF_IN_SERVICE = (
    "slab bracing switched off in the settings (bracing.slab = false); framing braces "
    "assumed anchored (common practice)"
)


@dataclass(frozen=True)
class StageSpec:
    """How one stage is checked: which slabs brace, and whether deflection is checked."""

    name: StageName = IN_SERVICE
    slab_bracing: bool = True
    deflection: bool = True


IN_SERVICE_SPEC = StageSpec()


def sha256_of(path: Path) -> str:
    h = hashlib.sha256()
    with path.open("rb") as fh:
        for chunk in iter(lambda: fh.read(1 << 20), b""):
            h.update(chunk)
    return h.hexdigest()


def standard_of(settings: Settings) -> DesignStandard:
    """The design standard the settings name; SettingsError for one not registered."""
    try:
        return get_standard(settings.design.standard)
    except ValueError as exc:
        raise SettingsError(f"settings: design.standard: {exc}") from None


def run_check(
    model_path: str | Path,
    settings: Settings,
    demands_path: str | Path | None = None,
    progress: Progress | None = None,
    strict_keys: bool = True,
    requirements: bool = False,
    project_ids: Sequence[str | Path] = (),
    length_unit: str | None = None,
) -> tuple[CheckResult, Model, Framing]:
    """The whole job on one model file. A settings key naming nothing in the model is a
    SettingsError unless ``strict_keys`` is False (``diff`` checks keys over both files).

    ``requirements`` audits the model against the tool's information requirements first
    (``settings.requirements``), ``project_ids`` against each of those IDS files too; the
    audit goes on the result, and a beam not checked for want of one names it.
    ``length_unit`` is the unit of a model that assigns none (``--length-unit``)."""
    path = Path(model_path)
    standard = standard_of(settings)
    with timed("read"):
        model = read_model(
            path,
            default_grade=settings.steel.default_grade,
            materials=settings.steel.materials,
            length_unit=length_unit,
        )
    with timed("requirements"):
        audit = _audit_ifc(path, settings, requirements, project_ids)
    with timed("framing"):
        prepare_floors(model, settings, strict_keys)
        framing = analyse_framing(model, settings.framing, settings.bracing)
    overrides = None
    warnings: list[tuple[str, str]] = list(model.warnings) + list(framing.warnings)
    if demands_path is not None:
        overrides = load_demand_csv(Path(demands_path))
    with timed("loads"):
        demand = compute_demand(model, framing, settings, overrides)
    warnings += [w for w in demand.warnings if w not in warnings]
    with timed("adequacy"):
        assess_bracing(
            model, framing, demand, standard, settings.design.method, settings.bracing.adequacy,
            tuple(settings.bracing.moment_connections),
        )  # fmt: skip
    beams = [
        (m, framing.members.get(m.guid), demand.beams.get(m.guid))
        for m in model.members
        if m.role is MemberRole.BEAM
    ]
    # beams the reader could not place: listed as not checked, with the reason
    beams += [(m, None, None) for m in model.unreadable if m.role is MemberRole.BEAM]
    spec = StageSpec(IN_SERVICE, settings.bracing.slab, True)
    with timed("check"):
        results = check_beams(beams, standard, settings, progress, spec)
        for b in results:
            b.stages = [_stage_of(b, IN_SERVICE)]
        stages = [_stage_result(spec, demand, results, model, settings)]
    if settings.construction is not None:
        with timed("construction"):
            stage, c_warnings = _construction_stage(model, settings, standard, results)
        stages.append(stage)
        warnings += [w for w in c_warnings if w not in warnings]
        # counted before the construction stage could take over: count again
        stages[0].summary["governing"] = sum(
            b.stage == IN_SERVICE and b.outcome != "not_checked" for b in results
        )
    names = {m.guid: m.name for m in [*model.members, *model.unreadable] if m.name}
    names.update({w.guid: w.name for w in model.walls if w.name})
    names.update({s.guid: s.name for s in model.slabs if s.name})
    for b in results:
        for p in b.brace_points:
            p.by_name = names.get(p.by, "")
    with timed("explain"):
        explain_beams(results, model, standard, settings, names)
    slabs = [
        SlabOutline(
            s.guid,
            s.storey,
            [(float(x), float(y)) for x, y in poly.exterior.coords],
            [[(float(x), float(y)) for x, y in r.coords] for r in poly.interiors],
            thickness=s.thickness,
            declared=s.declared,
            diaphragm=s.braces or not s.declared,
        )
        for s in model.slabs
        for poly in getattr(s.footprint, "geoms", [s.footprint])
    ]
    result = CheckResult(
        tool="ifccheck",
        version=__version__,
        model=ModelInfo(path.name, model.schema, sha256_of(path), model.length_unit),
        settings=settings_to_dict(settings),
        standard=standard.name,
        method=settings.design.method,
        checked_at=datetime.now(UTC).replace(microsecond=0).isoformat(),
        beams=results,
        storeys=[(s.name, s.elevation) for s in model.storeys],
        slabs=slabs,
        warnings=warnings,
        caution=CAUTION,
        levels=_levels(model, demand.deck_spans),
        load_balance=[
            LoadBalance(r.level, r.case, r.applied, r.delivered) for r in demand.load_balance
        ],
        assumptions=_assumptions(model, results, demand.deck_spans),
        excluded=dict(framing.excluded),
        names=names,
        stages=stages,
    )
    if audit is not None:
        from ifccheck.ifc.requirements import name_unmet

        with timed("requirements"):
            result.requirements = _audit_model(audit, model, framing, settings, requirements)
            name_unmet(result.beams, result.requirements)
    return result, model, framing


def _audit_ifc(
    path: Path, settings: Settings, requirements: bool, project_ids: Sequence[str | Path]
) -> list[RequirementResult] | None:
    """The IDS audit (ifctester) and the requirements checked on the IFC entities."""
    if not requirements and not project_ids:
        return None
    from ifccheck.ifc.requirements import audit_ifc  # ifctester loads only for an audit

    own = settings.requirements if requirements else None
    return audit_ifc(path, own, settings.steel.materials.keys(), project_ids)


def _audit_model(
    audit: list[RequirementResult],
    model: Model,
    framing: Framing,
    settings: Settings,
    requirements: bool,
) -> list[RequirementResult]:
    """The audit completed with the requirements that need the floors and the framing."""
    from ifccheck.ifc.requirements import (
        floor_deck_requirement,
        hardware_requirement,
        ordered,
        place,
    )

    records = list(audit)
    wanted = settings.requirements
    if requirements and wanted.floor_deck:
        entries = level_entries(model, settings)
        carrying = {
            lv.name for lv in model.levels if entries.get(lv.name, StoreyLoads()).floor is not False
        }
        floor_beams = [m for m in model.members if is_floor_beam(m)]
        records.append(floor_deck_requirement(model, floor_beams, carrying))
    if requirements and wanted.hardware:
        hardware = {
            g: kind
            for kind, guids in framing.excluded.items()
            if kind not in (UNKNOWN_SECTION, STUB)
            for g in guids
        }
        records.append(hardware_requirement(model, hardware))
    records = ordered(records)
    place(records, model)
    return records


def construction_framing(model: Model, settings: Settings) -> Framing:
    """The framing during construction: the deck braces only where it is attached
    (``construction.deck_braces``), and a declared deck only if it would brace anyway."""
    c = settings.construction
    deck = c.deck_braces if c is not None else False
    view = copy.copy(model)
    view.slabs = [replace(s, braces=s.braces and deck) if s.declared else s for s in model.slabs]
    return analyse_framing(view, settings.framing, BracingSettings(slab=deck))


def _construction_stage(
    model: Model, settings: Settings, standard: DesignStandard, results: list[BeamResult]
) -> tuple[StageResult, list[tuple[str, str]]]:
    """Check the construction stage and merge it into each beam's result."""
    assert settings.construction is not None
    framing = construction_framing(model, settings)
    demand = compute_demand(model, framing, settings, stage=CONSTRUCTION)
    # the braces' Appendix 6 check under this stage's moments
    assess_bracing(
        model, framing, demand, standard, settings.design.method, settings.bracing.adequacy,
        tuple(settings.bracing.moment_connections),
    )  # fmt: skip
    levels = demand.levels or frozenset()
    by_guid = {b.guid: b for b in results}
    beams: list[tuple[Member, MemberFraming | None, BeamDemand | None]] = []
    for m in model.members:
        service = by_guid.get(m.guid)
        if m.role is not MemberRole.BEAM or level_of(m) not in levels or service is None:
            continue
        bd = demand.beams.get(m.guid)
        if bd is not None and bd.reason is None and service.outcome != "not_checked":
            beams.append((m, framing.members.get(m.guid), bd))
    spec = StageSpec(CONSTRUCTION, settings.construction.deck_braces, False)
    checked = check_beams(beams, standard, settings, None, spec)
    for b in checked:
        if b.outcome != "not_checked":
            _merge_stage(by_guid[b.guid], b)
    return _stage_result(spec, demand, results, model, settings), demand.warnings


_STAGE_FIELDS = (
    "flexure_utilisation", "shear_demand", "shear_capacity", "shear_utilisation",
    "strength_utilisation", "utilisation", "controlling_limit", "diagram", "curve",
)  # fmt: skip


def _stage_of(b: BeamResult, stage: StageName, offset: int = 0) -> BeamStageResult:
    """One stage's summary of a beam checked in that stage (segments from ``offset``)."""
    return BeamStageResult(
        stage=stage,
        outcome=b.outcome,
        utilisation=b.utilisation,
        controlling_limit=b.controlling_limit,
        strength_utilisation=b.strength_utilisation,
        flexure_utilisation=b.flexure_utilisation,
        shear_demand=b.shear_demand,
        shear_capacity=b.shear_capacity,
        shear_utilisation=b.shear_utilisation,
        deflection_utilisation=b.deflection_utilisation,
        governing_segment=(b.governing_segment + offset)
        if b.governing_segment is not None
        else None,
        reason=b.reason,
        demand=b.demand,
        diagram=b.diagram,
        curve=b.curve,
    )


def _merge_stage(service: BeamResult, constr: BeamResult) -> None:
    """Add a beam's construction-stage result to its in-service one; the stage with the
    higher utilisation governs, and the outcome is the worse of the two."""
    offset = len(service.segments)
    for seg in constr.segments:
        seg.stage = CONSTRUCTION
    service.segments += constr.segments
    stage = _stage_of(constr, CONSTRUCTION, offset)
    stage.notes = [n for n in constr.notes if n not in service.notes]
    service.stages.append(stage)
    service.notes += [f"construction stage: {n}" for n in stage.notes]
    if service.outcome == "not_checked":
        return
    if (constr.utilisation or 0.0) > (service.utilisation or 0.0):
        for name in _STAGE_FIELDS:
            setattr(service, name, getattr(constr, name))
        service.governing_segment = stage.governing_segment
        service.stage = CONSTRUCTION
    if constr.outcome == "fail":
        service.outcome = "fail"
        service.fails_on = [k for k in ("strength", "serviceability")
                            if k in service.fails_on or k in constr.fails_on]  # fmt: skip


def _stage_result(
    spec: StageSpec,
    demand: DemandResult,
    results: list[BeamResult],
    model: Model,
    settings: Settings,
) -> StageResult:
    """The design basis of one stage, and its beams counted by outcome."""
    counts: dict[str, int] = dict.fromkeys(OUTCOMES, 0)
    governs = 0
    for b in results:
        st = b.stage_result(spec.name)
        if st is None:
            continue
        counts[st.outcome] += 1
        governs += b.stage == spec.name and st.outcome != "not_checked"
    counts["total"] = sum(counts[o] for o in OUTCOMES)
    counts["governing"] = governs
    levels = (
        sorted(demand.levels) if demand.levels is not None else [lv.name for lv in model.levels]
    )
    return StageResult(
        stage=spec.name,
        title=STAGE_TITLES[spec.name],
        slab_bracing=spec.slab_bracing,
        levels=levels,
        combinations=[
            CombinationOut(c.name, dict(c.factors), c.source, c.number) for c in demand.combinations
        ],
        loads=[
            AreaLoadOut(r.level, r.slab, r.case, r.what, r.pressure, r.origin) for r in demand.basis
        ],
        load_balance=[
            LoadBalance(r.level, r.case, r.applied, r.delivered) for r in demand.load_balance
        ],
        notes=list(demand.notes),
        summary=counts,
    )


def _levels(model: Model, deck_spans: dict[str, DeckSpan]) -> list[LevelInfo]:
    out = []
    for lv in model.levels:
        ds = deck_spans.get(lv.name)
        out.append(
            LevelInfo(
                name=lv.name,
                elevation=lv.elevation,
                deck_angle=ds.angle if ds else None,
                deck_source=ds.source if ds else "none",
                deck_evidence=ds.evidence if ds else 0,
                typical_spacing=ds.typical_spacing if ds else None,
            )
        )
    return out


def _assumptions(
    model: Model, beams: list[BeamResult], deck_spans: dict[str, DeckSpan]
) -> dict[str, int]:
    """What the check took as given rather than read from the model, counted."""
    checked = [b for b in beams if b.outcome != "not_checked"]
    return {
        "default_grade": sum(1 for b in checked if b.grade_source == "default"),
        "inferred_deck_direction": sum(1 for d in deck_spans.values() if d.source == "inferred"),
        "inferred_role": sum(1 for m in model.members if m.role_source == "geometry"),
        "declared_deck": sum(1 for s in model.slabs if s.declared),
    }


def _base(m: Member, mf: MemberFraming | None) -> BeamResult:
    supports = sorted(mf.supports, key=lambda s: s.station) if mf else []
    stations = [s.station for s in supports]
    span = max((b - a for a, b in itertools.pairwise(stations)), default=0.0)
    if mf and mf.state == "cantilever" and supports:
        span = max(span, stations[0], m.length - stations[-1])
    return BeamResult(
        guid=m.guid,
        name=m.name,
        storey=m.storey,
        ifc_class=m.ifc_class,
        profile=m.profile_name,
        grade=m.steel.grade if m.steel else "",
        fy=m.steel.fy if m.steel else 0.0,
        grade_source=m.grade_source,
        start=m.start,
        end=m.end,
        length=m.length,
        span=span,
        supports=[{"station": s.station, "by": s.by} for s in supports],
        brace_points=[
            BracePointOut(
                b.station,
                b.kind,
                b.by,
                b.flange,
                b.counts,
                b.reason,
                adequacy=_adequacy_out(b.adequacy),
            )
            for b in sorted(mf.brace_points, key=lambda b: b.station)
        ]
        if mf
        else [],
        continuous_bracing=list(mf.continuous_bracing) if mf else [],
        free_ends=list(mf.free_ends) if mf else [],
        notes=list(m.notes) + (list(mf.notes) if mf else []),
    )


def _adequacy_out(a: BraceAdequacy | None) -> BraceCheckOut | None:
    if a is None:
        return None
    return BraceCheckOut(
        a.kind, a.required_strength, a.required_stiffness, a.provided_strength,
        a.provided_stiffness, a.adequate, a.mr, a.lbr, a.cd, a.path, a.notes,
    )  # fmt: skip


def _not_checked_reason(
    m: Member, mf: MemberFraming | None, bd: BeamDemand | None, standard: DesignStandard
) -> Reason | None:
    if m.unresolved is not None:
        return m.unresolved
    if m.material is not MaterialCategory.STEEL or m.steel is None:
        return Reason.of(
            NotChecked.NOT_STEEL, category=m.material.value, material=m.material_name or "none"
        )
    if m.section is None:
        return Reason.of(NotChecked.NO_PROFILE)
    scope = standard.scope(m.section, m.steel)
    if scope:
        return Reason.of(NotChecked.SECTION_OUT_OF_SCOPE, detail=scope)
    if mf is None:
        return Reason.of(NotChecked.NOT_IN_FRAMING)
    if mf.state == "unsupported":
        return Reason.of(NotChecked.UNSUPPORTED)
    if bd is None:
        return Reason.of(NotChecked.NO_DEMAND)
    if bd.reason is not None:
        return bd.reason
    if bd.analysis is None and bd.source != "analysis":
        return Reason.of(NotChecked.NO_DEMAND)
    return None


@dataclass
class _Pending:
    """A beam whose segments await the model-wide capacity evaluation."""

    out: BeamResult
    member: Member
    demand: BeamDemand
    diagrams: list  # (combination, diagram) the rows were drawn from
    specs: list[SegmentSpec]
    rows: list[tuple[int, str, float, float]]  # (spec index, combination, demand, Cb)
    first: int = 0  # position of its first row in the model-wide arrays


def check_beam(
    m: Member,
    mf: MemberFraming | None,
    bd: BeamDemand | None,
    standard: DesignStandard,
    settings: Settings,
    stage: StageSpec | None = None,
) -> BeamResult:
    """The governing result of one beam (outcome not_checked with a reason when it cannot be)."""
    return check_beams([(m, mf, bd)], standard, settings, None, stage)[0]


def check_beams(
    beams: list[tuple[Member, MemberFraming | None, BeamDemand | None]],
    standard: DesignStandard,
    settings: Settings,
    progress: Progress | None = None,
    stage: StageSpec | None = None,
) -> list[BeamResult]:
    """Check many beams in one stage (in service unless told): segment demands per beam,
    then one capacity call for all."""
    spec = stage or StageSpec(IN_SERVICE, settings.bracing.slab, True)
    method = settings.design.method
    results: list[BeamResult] = []
    pending: list[_Pending] = []
    pairs: dict[tuple[int, int], int] = {}
    pair_list: list[tuple] = []
    index: list[int] = []
    lbs: list[float] = []
    cbs: list[float] = []
    tops: list[bool] = []
    axes: list[str] = []
    cache: dict[bytes, tuple[np.ndarray, np.ndarray]] = {}  # beams sharing a diagram
    for m, mf, bd in beams:
        prepared = _prepare(m, mf, bd, standard, settings, spec, cache)
        results.append(prepared.out if isinstance(prepared, _Pending) else prepared)
        if not isinstance(prepared, _Pending):
            continue
        key = (id(m.section), id(m.steel))
        k = pairs.get(key)
        if k is None:
            k = pairs[key] = len(pair_list)
            pair_list.append((m.section, m.steel))
        prepared.first = len(lbs)
        for spec_i, _name, _demand, cb in prepared.rows:
            index.append(k)
            lbs.append(prepared.specs[spec_i].lb)
            cbs.append(cb)
            tops.append(prepared.specs[spec_i].flange == "top")
            axes.append(m.bending_axis)
        pending.append(prepared)
    if pending:
        flex = standard.flexure_many(
            pair_list, index, lbs, cbs, method, axis=axes, compression_top=tops
        )
        for i, p in enumerate(pending):
            _finish(p, flex, standard, settings, spec)
            if progress is not None:
                progress(i + 1, len(pending))
    return results


def _prepare(
    m: Member,
    mf: MemberFraming | None,
    bd: BeamDemand | None,
    standard: DesignStandard,
    settings: Settings,
    spec: StageSpec = IN_SERVICE_SPEC,
    cache: dict[bytes, tuple[np.ndarray, np.ndarray]] | None = None,
) -> _Pending | BeamResult:
    out = _base(m, mf)
    if bd is not None:
        out.demand = bd.to_output()
        out.notes += [n for n in bd.notes if n not in out.notes]
    if spec.name == IN_SERVICE:
        words = [NOTE_SLAB_OFF_IN_SERVICE if n == NOTE_SLAB_OFF else n for n in out.notes]
        out.notes = list(dict.fromkeys(words))
    reason = _not_checked_reason(m, mf, bd, standard)
    if reason is not None:
        out.outcome, out.reason = "not_checked", reason
        return out
    assert mf is not None and bd is not None
    specs = beam_segments(m.length, mf, spec.slab_bracing)
    diagrams = _strength_diagrams(bd, m.length, out)
    rows: list[tuple[int, str, float, float]] = []
    if specs:
        starts = np.array([s.start for s in specs])
        ends = np.array([s.end for s in specs])
        tips = np.array([s.cantilever for s in specs])
        top = np.array([s.flange == "top" for s in specs])
        loose = ~np.array([s.continuous for s in specs])
        # an analysis moment without its sign: both flanges are checked for it (conservative)
        given = bd.from_analysis if bd.source == "analysis" else None
        either = given is not None and not given.signed
        off = bd.offset if bd.analysis is not None else 0.0  # analysis line from a centreline
        for name, d in diagrams:
            demand, cb = _segment_demands(
                d, starts + off, ends + off, tips, top, standard, either, cache
            )
            if given is not None and given.cb is not None:
                cb = np.full_like(cb, given.cb)  # the analysis's own Cb
            cb = np.where(loose, cb, 1.0)
            rows += [(i, name, float(demand[i]), float(cb[i])) for i in range(len(specs))]
    return _Pending(out, m, bd, diagrams, specs, rows)


def _finish(
    p: _Pending, flex, standard: DesignStandard, settings: Settings, stage: StageSpec
) -> None:
    out, m, bd = p.out, p.member, p.demand
    n = len(p.rows)
    sl = slice(p.first, p.first + n)
    capacity = flex.design_strength[sl]
    mn = flex.mn[sl]
    states = flex.limit_state[sl]
    demand = np.array([r[2] for r in p.rows])
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = np.where(capacity > 0, demand / np.where(capacity > 0, capacity, 1.0), np.inf)
    peak = max((float(np.max(np.abs(d.M))) for _, d in p.diagrams), default=0.0)
    best: dict[int, int] = {}
    for i, (spec_i, _name, _d, _cb) in enumerate(p.rows):
        j = best.get(spec_i)
        if j is None or ratio[i] > ratio[j]:
            best[spec_i] = i
    for spec_i in sorted(best, key=lambda k: (p.specs[k].start, p.specs[k].flange)):
        i = best[spec_i]
        spec = p.specs[spec_i]
        _s, name, dem, cb = p.rows[i]
        if dem <= NEGLIGIBLE_MOMENT * peak:
            continue
        out.segments.append(
            SegmentResult(
                start=spec.start,
                end=spec.end,
                lb=spec.lb,
                cb=cb,
                flange=spec.flange,
                moment_demand=dem,
                moment_capacity=float(capacity[i]),
                nominal_moment=float(mn[i]),
                utilisation=float(ratio[i]),
                limit_state=str(states[i]),
                load_combination=name,
                braced_by=list(spec.braced_by),
                continuous=spec.continuous,
                stage=stage.name,
            )
        )
    if out.segments:
        out.governing_segment = int(np.argmax([s.utilisation for s in out.segments]))
        out.flexure_utilisation = out.segments[out.governing_segment].utilisation
    else:
        out.flexure_utilisation = 0.0
    method = settings.design.method
    _shear(out, m, bd, standard, method)
    if stage.deflection:
        _deflection(out, m, bd, settings)
    checks = {
        "flexure": out.flexure_utilisation or 0.0,
        "shear": out.shear_utilisation or 0.0,
        "deflection": out.deflection_utilisation or 0.0,
    }
    out.strength_utilisation = max(checks["flexure"], checks["shear"])
    out.controlling_limit = max(checks, key=lambda k: checks[k])
    out.utilisation = checks[out.controlling_limit]
    out.outcome = "pass" if out.utilisation <= 1.0 else "fail"
    out.fails_on = [
        kind
        for kind, u in (
            ("strength", out.strength_utilisation),
            ("serviceability", checks["deflection"]),
        )
        if u > 1.0
    ]
    gov_name = bd.governing_moment or (p.diagrams[-1][0] if p.diagrams else "")
    gov = dict(p.diagrams).get(gov_name)
    if gov is not None:
        out.diagram = _diagram_out(gov, bd.offset if bd.analysis is not None else 0.0)
    if bd.analysis is not None and bd.spans:
        out.span = max(b - a for a, b, _ in bd.spans)
    _curve(out, m, standard, method)


def _segment_demands(
    d,
    starts: np.ndarray,
    ends: np.ndarray,
    tips: np.ndarray,
    top: np.ndarray,
    standard,
    either_flange: bool = False,
    cache: dict[bytes, tuple[np.ndarray, np.ndarray]] | None = None,
) -> tuple[np.ndarray, np.ndarray]:
    """Per segment: the moment compressing its flange, and the moment-gradient factor.

    ``either_flange`` takes the largest |M| for both flanges (sign unknown).
    ``cache`` holds the answers by their exact inputs: the beams of a typical floor
    share a diagram and segments, and get the very same numbers without recomputing.
    """
    # node stations appear twice and may differ by rounding: keep them monotone
    x = np.maximum.accumulate(np.asarray(d.x, dtype=float))
    moment = np.asarray(d.M, dtype=float)
    key = b""
    if cache is not None:
        parts = (x, moment, starts, ends, np.asarray(tips, dtype=bool), np.asarray(top, dtype=bool))
        key = b"|".join(
            [str((id(standard), either_flange, *(p.shape for p in parts))).encode()]
            + [np.ascontiguousarray(p).tobytes() for p in parts]
        )
        hit = cache.get(key)
        if hit is not None:
            return hit[0].copy(), hit[1].copy()
    sagging = segment_moments(x, compression_moment("top", moment), starts, ends)[0]
    hogging = segment_moments(x, compression_moment("bottom", moment), starts, ends)[0]
    demand = np.maximum(sagging, hogging) if either_flange else np.where(top, sagging, hogging)
    cb = np.asarray(standard.moment_gradient(x, moment, starts, ends, tips), dtype=float)
    if cache is not None:
        cache[key] = (demand.copy(), cb.copy())
    return demand, cb


class _UniformMoment:
    """A constant moment along the beam: demand from an analysis with no diagram."""

    def __init__(self, length: float, moment: float) -> None:
        self.length = length
        self.x = np.array([0.0, length])
        self.M = np.array([moment, moment])
        self.nodes = self.x

    def moment_at(self, stations) -> np.ndarray:
        return np.full(np.shape(np.atleast_1d(stations)), self.M[0])

    def shear_at(self, stations) -> np.ndarray:
        return np.zeros(np.shape(np.atleast_1d(stations)))


def _strength_diagrams(bd: BeamDemand, length: float, out: BeamResult) -> list:
    """(combination, diagram) pairs; analysis demand rescales or replaces them.

    An analysis moment keeps the shape of the computed combination with the
    largest moment (for Cb): its sagging part scaled to the analysis's sagging
    maximum and its hogging part to the hogging one. A part the computed shape
    lacks is taken as uniform along the beam (Cb = 1.0, conservative). A moment
    without its sign scales the whole shape to it.
    """
    computed = (
        [(c.name, bd.analysis.combine(c.factors)) for c in bd.combinations]
        if bd.analysis is not None
        else []
    )
    given = bd.from_analysis
    if bd.source != "analysis" or given is None:
        return computed
    shape = None
    if computed:
        name, shape = max(computed, key=lambda nd: float(np.max(np.abs(nd[1].M))))
        out.notes.append(f"analysis moment applied to the shape of {name}")
    if not given.signed:
        peak = float(np.max(np.abs(shape.M))) if shape is not None else 0.0
        if shape is not None and peak > 0:
            return [("analysis", shape.scaled(given.peak / peak))]
        out.notes.append("analysis moment taken as uniform along the beam (Cb = 1.0)")
        return [("analysis", _UniformMoment(length, given.peak))]
    return _signed_diagrams(shape, given.sagging, given.hogging, length)


def _signed_diagrams(
    shape: Diagram | None, sagging: float, hogging: float, length: float
) -> list[tuple[str, _Sampled]]:
    """The shape's sagging part scaled to ``sagging`` and hogging part to ``hogging``;
    a part the shape lacks becomes a uniform moment of that sign, as a second diagram."""
    if shape is not None:
        x = np.maximum.accumulate(np.asarray(shape.x, dtype=float))
        m = np.asarray(shape.M, dtype=float)
    else:
        x, m = np.array([0.0, length]), np.zeros(2)
    pos, neg = float(np.max(m, initial=0.0)), float(-np.min(m, initial=0.0))
    sag = np.where(m > 0, m * (sagging / pos), 0.0) if pos > 0 else None
    hog = np.where(m < 0, m * (hogging / neg), 0.0) if neg > 0 else None
    shear = shape.shear_at if shape is not None else None
    k = max(sagging, hogging) / max(pos, neg) if max(pos, neg) > 0 else 0.0
    if sag is not None and hog is not None:
        return [("analysis", _Sampled(x, sag + hog, shear, k))]
    out: list[tuple[str, _Sampled]] = []
    if sagging > 0 or hogging == 0:
        out.append(("analysis", _Sampled(x, sag if sag is not None else np.full_like(m, sagging),
                                         shear, k)))  # fmt: skip
    if hogging > 0:
        name = "analysis" if not out else "analysis (hogging)"
        out.append((name, _Sampled(x, hog if hog is not None else np.full_like(m, -hogging),
                                   shear, k)))  # fmt: skip
    return out


class _Sampled:
    """A moment diagram given by samples (stations non-decreasing), for analysis demand."""

    def __init__(self, x: np.ndarray, moment: np.ndarray, shear, shear_scale: float) -> None:
        self.x, self.M = x, moment
        self.nodes = x
        self.length = float(x[-1] - x[0])
        self._shear, self._k = shear, shear_scale

    def moment_at(self, stations) -> np.ndarray:
        return np.interp(np.asarray(stations, dtype=float), self.x, self.M)

    def shear_at(self, stations) -> np.ndarray:
        if self._shear is None:
            return np.zeros(np.shape(np.atleast_1d(stations)))
        return self._shear(stations) * self._k


def _shear(
    out: BeamResult, m: Member, bd: BeamDemand, standard: DesignStandard, method: str
) -> None:
    assert m.section is not None and m.steel is not None
    try:
        res = standard.shear(m.section, m.steel, method, axis=m.bending_axis)
    except OutOfScope as exc:
        out.notes.append(f"shear not checked: {exc}")
        return
    out.shear_demand = float(bd.max_shear)
    out.shear_capacity = float(res.design_strength)
    out.shear_utilisation = (
        out.shear_demand / out.shear_capacity if out.shear_capacity > 0 else None
    )


def _deflection(out: BeamResult, m: Member, bd: BeamDemand, settings: Settings) -> None:
    if bd.analysis is None:
        out.notes.append("deflection not checked: no computed loads")
        return
    ratios = []
    live = [c for c in bd.service if set(c.factors) - {"D"} and "D" not in c.factors]
    total = [c for c in bd.service if "D" in c.factors]
    for combos, limit_ratio, attr in (
        (live or [LIVE_DEFLECTION], settings.deflection.live, "live"),
        (total or [TOTAL_DEFLECTION], settings.deflection.total, "total"),
    ):
        worst = (0.0, 0.0, 0.0)  # (ratio, deflection, allowed)
        for combo in combos:
            d = bd.analysis.combine(combo.factors)
            for a, b, kind, w in d.span_deflections():
                if not np.isfinite(w):
                    continue
                length = (b - a) * (OVERHANG_FACTOR if kind == "overhang" else 1.0)
                allowed = length / limit_ratio
                if allowed > 0 and w / allowed > worst[0]:
                    worst = (w / allowed, w, allowed)
        setattr(out, f"deflection_{attr}", worst[1])
        setattr(out, f"deflection_{attr}_limit", worst[2] or None)
        ratios.append(worst[0])
    out.deflection_utilisation = max(ratios) if ratios else None


def _diagram_out(d: Diagram, offset: float = 0.0) -> SampledDiagram:
    """The diagram sampled for the report, stations along the beam from its modelled start."""
    xs = np.linspace(0.0, float(d.length), DIAGRAM_POINTS)
    xs = np.union1d(xs, d.nodes)
    return SampledDiagram(
        stations=[float(v) - offset for v in xs],
        moment=[float(v) for v in d.moment_at(xs)],
        shear=[float(v) for v in d.shear_at(xs)],
    )


def _curve(out: BeamResult, m: Member, standard: DesignStandard, method: str) -> None:
    gov = out.governing
    if gov is None:
        return
    assert m.section is not None and m.steel is not None
    side = _Side(m.bending_axis, gov.flange == "top")
    out.curve = list(
        _curve_points(standard, m.section, m.steel, round(gov.cb, 2), method, gov.lb, side)
    )


@dataclass(frozen=True)
class _Side:
    """Which axis a segment bends about and whether its top is in compression."""

    axis: str
    compression_top: bool


@functools.lru_cache(maxsize=4096)
def _curve_limits(standard: DesignStandard, section, steel, method: str, side: _Side) -> float:
    res = standard.flexure(
        section, steel, [0.0], [1.0], method, axis=side.axis, compression_top=side.compression_top
    )
    return float(res.lr[0])


def _curve_points(
    standard: DesignStandard, section, steel, cb: float, method: str, lb: float, side: _Side
) -> tuple[tuple[float, float], ...]:
    """Strength-versus-Lb curve through 1.5·Lr (or past the beam's own Lb), cached:
    many beams share a shape, grade and Cb."""
    lr = _curve_limits(standard, section, steel, method, side)
    lb_max = max(1.5 * lr, math.ceil(1.25 * lb), 1.0)
    return _curve_cached(standard, section, steel, cb, method, lb_max, side)


@functools.lru_cache(maxsize=4096)
def _curve_cached(
    standard: DesignStandard, section, steel, cb: float, method: str, lb_max: float, side: _Side
) -> tuple[tuple[float, float], ...]:
    curve = standard.strength_curve(
        section, steel, cb, method, lb_max, CURVE_POINTS,
        axis=side.axis, compression_top=side.compression_top,
    )  # fmt: skip
    return tuple((float(a), float(b)) for a, b in zip(curve.lb, curve.design_strength, strict=True))
