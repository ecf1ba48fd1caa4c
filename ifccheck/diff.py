"""Compare the checks of two revisions: which beams lost bracing or got worse.

Beams match by GlobalId; beams whose GUIDs were regenerated match by
geometry (centroid line within a tolerance and the same profile). Brace
stations of the old beam are carried onto the new beam's axis by projecting
their points, so a beam that was redrawn in the other direction still
compares station for station. Lb and utilisation are compared stage by stage
(in service, and during construction where both revisions were checked in it),
so a construction-stage finding of both revisions does not hide a change in
service.
"""

from __future__ import annotations

from collections import defaultdict

import numpy as np

from ifccheck.results import (
    STAGES,
    BeamChange,
    BeamResult,
    CauseKind,
    ChangeCause,
    CheckResult,
    DiffResult,
)

# Two brace points closer than this are the same point (common practice:
# modelled framing moves by inches between revisions without meaning).
STATION_TOLERANCE = 0.15  # m
# Beams whose ends lie this close (and share a profile) are the same beam.
MATCH_TOLERANCE = 0.05  # m
# A tributary width that grew by more than this share (and TRIBUTARY_MIN) is a cause.
TRIBUTARY_SHARE = 0.05
TRIBUTARY_MIN = 0.05  # m
# Utilisation changes below this are noise from load redistribution rounding.
UTILISATION_TOLERANCE = 0.005
OUTCOME_RANK = {"pass": 0, "fail": 1, "not_checked": 2}


def match_beams(
    old: list[BeamResult], new: list[BeamResult]
) -> tuple[list[tuple[BeamResult, BeamResult, str]], list[BeamResult], list[BeamResult]]:
    """(matched pairs with how, added in new, removed from old)."""
    old_by_guid = {b.guid: b for b in old}
    pairs: list[tuple[BeamResult, BeamResult, str]] = []
    unmatched_new: list[BeamResult] = []
    for b in new:
        o = old_by_guid.pop(b.guid, None)
        if o is not None:
            pairs.append((o, b, "guid"))
        else:
            unmatched_new.append(b)
    # geometry fallback through a grid hash of midpoints: O(n), no all-pairs
    cell = MATCH_TOLERANCE * 2
    grid: dict[tuple[int, int, int], list[BeamResult]] = defaultdict(list)
    for o in old_by_guid.values():
        if _placed(o):
            grid[_cell(_mid(o), cell)].append(o)
    added: list[BeamResult] = []
    for b in unmatched_new:
        if not _placed(b):  # a beam the reader could not place matches by GlobalId only
            added.append(b)
            continue
        found = None
        cx, cy, cz = _cell(_mid(b), cell)
        for key in (
            (cx + i, cy + j, cz + k) for i in (-1, 0, 1) for j in (-1, 0, 1) for k in (-1, 0, 1)
        ):
            for o in grid.get(key, ()):
                if o.profile == b.profile and _same_line(o, b):
                    found = o
                    break
            if found:
                break
        if found is None:
            added.append(b)
            continue
        grid[_cell(_mid(found), cell)].remove(found)
        old_by_guid.pop(found.guid)
        pairs.append((found, b, "geometry"))
    return pairs, added, list(old_by_guid.values())


def _placed(b: BeamResult) -> bool:
    return bool(np.isfinite(b.start).all() and np.isfinite(b.end).all())


def _mid(b: BeamResult) -> np.ndarray:
    return (np.asarray(b.start) + np.asarray(b.end)) / 2


def _cell(p: np.ndarray, size: float) -> tuple[int, int, int]:
    q = np.floor(p / size).astype(int)
    return int(q[0]), int(q[1]), int(q[2])


def _same_line(a: BeamResult, b: BeamResult) -> bool:
    a0, a1, b0, b1 = (np.asarray(p) for p in (a.start, a.end, b.start, b.end))
    same = max(np.linalg.norm(a0 - b0), np.linalg.norm(a1 - b1))
    flipped = max(np.linalg.norm(a0 - b1), np.linalg.norm(a1 - b0))
    return bool(min(same, flipped) <= MATCH_TOLERANCE)


def _to_new_stations(old: BeamResult, new: BeamResult, stations: list[float]) -> list[float]:
    """Old stations as points, projected onto the new beam's axis."""
    o0, o1 = np.asarray(old.start), np.asarray(old.end)
    n0, n1 = np.asarray(new.start), np.asarray(new.end)
    ot = (o1 - o0) / max(np.linalg.norm(o1 - o0), 1e-12)
    nt = (n1 - n0) / max(np.linalg.norm(n1 - n0), 1e-12)
    pts = o0 + np.outer(stations, ot)
    return [float(v) for v in (pts - n0) @ nt]


FLANGES = ("top", "bottom")


def _braces(b: BeamResult, flange: str) -> list[float]:
    """Stations of counting brace points that restrain ``flange``."""
    return sorted(
        {round(p.station, 4) for p in b.brace_points if p.counts and p.flange in (flange, "both")}
    )


def _unmatched(a: list[float], b: list[float]) -> list[float]:
    """Stations of ``a`` with no station of ``b`` within the tolerance."""
    bb = np.asarray(b)
    return [s for s in a if bb.size == 0 or np.min(np.abs(bb - s)) > STATION_TOLERANCE]


def _lost_cover(old: BeamResult, new: BeamResult) -> float:
    """Length of the old slab-braced intervals that the new ones no longer cover."""
    from shapely.geometry import LineString, MultiLineString

    def lines(intervals) -> MultiLineString:
        return MultiLineString([LineString([(a, 0), (b, 0)]) for a, b in intervals if b > a])

    # only what lay along the new beam: length beyond a beam that was shortened is not lost
    # bracing (the lost support says what happened there)
    old_iv = []
    for a, b in old.continuous_bracing:
        lo, hi = sorted(_to_new_stations(old, new, [a, b]))
        lo, hi = max(lo, 0.0), min(hi, new.length)
        if hi > lo:
            old_iv.append((lo, hi))
    if not old_iv:
        return 0.0
    return float(lines(old_iv).difference(lines(new.continuous_bracing)).length)


def compare_beam(old: BeamResult, new: BeamResult, matched_by: str) -> BeamChange | None:
    """The change of one matched beam, or None when nothing that matters changed."""
    lost: set[float] = set()
    added: set[float] = set()
    for flange in FLANGES:
        old_braces = [
            s
            for s in _to_new_stations(old, new, _braces(old, flange))
            if -STATION_TOLERANCE <= s <= new.length + STATION_TOLERANCE  # along the new beam
        ]
        new_braces = _braces(new, flange)
        lost.update(round(s, 4) for s in _unmatched(old_braces, new_braces))
        added.update(round(s, 4) for s in _unmatched(new_braces, old_braces))
    old_sup = {s["by"] for s in old.supports}
    new_sup = {s["by"] for s in new.supports}
    lost_sup = sorted(old_sup - new_sup) if matched_by == "guid" else []
    gained_sup = sorted(new_sup - old_sup) if matched_by == "guid" else []
    if len(new.supports) < len(old.supports) and not lost_sup:
        lost_sup = ["(support count fell)"]
    lost_cover = _lost_cover(old, new)
    stages = _stage_pairs(old, new)
    shown = _shown_stage(stages, new)
    _stage, lb_before, lb_after, u_before, u_after = shown
    change = BeamChange(
        guid=new.guid,
        old_guid=old.guid,
        name=new.name,
        storey=new.storey,
        matched_by=matched_by,  # type: ignore[arg-type]
        lost_brace_points=sorted(lost),
        added_brace_points=sorted(added),
        lost_supports=lost_sup,
        gained_supports=gained_sup,
        lost_continuous_bracing=round(lost_cover, 4),
        lb_before=lb_before,
        lb_after=lb_after,
        utilisation_before=u_before,
        utilisation_after=u_after,
        outcome_before=old.outcome,
        outcome_after=new.outcome,
        stage=shown[0] or new.stage,
    )
    causes = _causes(change, stages)
    tributary = _tributary_growth(old, new)
    if tributary is not None:
        causes.insert(0, tributary)
    if not causes:
        return None
    worse = [c for c in causes if c.worse]
    change.change = "weakened" if worse else "strengthened"
    change.causes = worse or causes
    return change


def _tributary(b: BeamResult) -> float | None:
    d = b.demand
    if d is None or d.source != "computed":
        return None
    return d.tributary_left + d.tributary_right


# (stage, Lb before, Lb after, utilisation before, utilisation after); the stage is ""
# where both revisions have the in-service stage only
_StagePair = tuple[str, float | None, float | None, float | None, float | None]


def _stage_view(b: BeamResult, stage: str) -> tuple[float | None, float | None] | None:
    """(Lb of the governing segment, utilisation) of a beam in one stage."""
    if not b.stages:  # a result without stage records: its top-level values are in service
        return (b.governing.lb if b.governing else None, b.utilisation) if stage == (
            "in_service"
        ) else None  # fmt: skip
    st = b.stage_result(stage)
    if st is None:
        return None
    seg = b.segments[st.governing_segment] if st.governing_segment is not None else None
    return (seg.lb if seg else None, st.utilisation)


def _stage_pairs(old: BeamResult, new: BeamResult) -> list[_StagePair]:
    """Lb and utilisation of each stage both revisions were checked in."""
    out: list[_StagePair] = []
    for stage in STAGES:
        a, b = _stage_view(old, stage), _stage_view(new, stage)
        if a is not None and b is not None:
            out.append((stage, a[0], b[0], a[1], b[1]))
    if len(out) == 1 and out[0][0] == "in_service":
        out = [("", *out[0][1:])]
    if not out:  # not checked in a common stage: the governing values
        lb = (old.governing.lb if old.governing else None, new.governing.lb if new.governing
              else None)  # fmt: skip
        out = [("", lb[0], lb[1], old.utilisation, new.utilisation)]
    return out


def _worse(p: _StagePair) -> bool:
    _s, lb0, lb1, u0, u1 = p
    grew = lb0 is not None and lb1 is not None and lb1 > lb0 + STATION_TOLERANCE
    rose = u0 is not None and u1 is not None and u1 > u0 + UTILISATION_TOLERANCE
    return grew or rose


def _shown_stage(stages: list[_StagePair], new: BeamResult) -> _StagePair:
    """The first stage that got worse, else the new revision's governing stage."""
    for p in stages:
        if _worse(p):
            return p
    return next((p for p in stages if p[0] == new.stage), stages[0])


def _loaders(b: BeamResult) -> set[str]:
    """The members whose reactions load a beam."""
    return {p.source for p in b.demand.point_loads} if b.demand is not None else set()


def _tributary_growth(old: BeamResult, new: BeamResult) -> ChangeCause | None:
    """A cause when the beam now carries a wider strip of floor (the neighbours named later)."""
    before, after = _tributary(old), _tributary(new)
    if before is None or after is None:
        return None
    if after - before > max(TRIBUTARY_MIN, TRIBUTARY_SHARE * before):
        return ChangeCause(CauseKind.TRIBUTARY_GREW, before=before, after=after)
    return None


def _causes(c: BeamChange, stages: list[_StagePair]) -> list[ChangeCause]:
    """What changed, worse causes first; quantities stay in SI (the report words them).
    Lb and utilisation causes are per stage (``stages``), each naming its stage."""
    out: list[ChangeCause] = []
    if c.lost_brace_points:
        out.append(ChangeCause(CauseKind.LOST_BRACES, stations=tuple(c.lost_brace_points)))
    if c.lost_supports:
        out.append(ChangeCause(CauseKind.LOST_SUPPORTS, members=tuple(c.lost_supports)))
    if c.lost_continuous_bracing > STATION_TOLERANCE:
        out.append(ChangeCause(CauseKind.LOST_SLAB_BRACING, after=c.lost_continuous_bracing))
    for stage, lb0, lb1, _u0, _u1 in stages:
        if lb0 is not None and lb1 is not None and lb1 > lb0 + STATION_TOLERANCE:
            out.append(ChangeCause(CauseKind.LB_GREW, before=lb0, after=lb1, stage=stage))
    rank_b, rank_a = OUTCOME_RANK[c.outcome_before], OUTCOME_RANK[c.outcome_after]
    outcome = (c.outcome_before, c.outcome_after)
    if rank_a > rank_b:
        out.append(ChangeCause(CauseKind.OUTCOME_WORSE, before=outcome[0], after=outcome[1]))
    for stage, _lb0, _lb1, u0, u1 in stages:
        if u0 is not None and u1 is not None and u1 > u0 + UTILISATION_TOLERANCE:
            out.append(ChangeCause(CauseKind.UTILISATION_ROSE, before=u0, after=u1, stage=stage))
    if c.added_brace_points:
        out.append(ChangeCause(CauseKind.ADDED_BRACES, stations=tuple(c.added_brace_points)))
    if c.gained_supports:
        out.append(ChangeCause(CauseKind.GAINED_SUPPORTS, members=tuple(c.gained_supports)))
    if rank_a < rank_b:
        out.append(ChangeCause(CauseKind.OUTCOME_BETTER, before=outcome[0], after=outcome[1]))
    for stage, _lb0, _lb1, u0, u1 in stages:
        if u0 is not None and u1 is not None and u1 < u0 - UTILISATION_TOLERANCE:
            out.append(ChangeCause(CauseKind.UTILISATION_FELL, before=u0, after=u1, stage=stage))
    return out


def _parallel_neighbours(beam: BeamResult, others: list[BeamResult], reach: float) -> list[str]:
    """GUIDs of ``others`` on the beam's storey, parallel to it and within ``reach`` in plan."""
    a0, a1 = np.asarray(beam.start[:2]), np.asarray(beam.end[:2])
    axis = a1 - a0
    length = float(np.linalg.norm(axis))
    if length <= 0:
        return []
    t = axis / length
    out = []
    for o in others:
        if o.storey != beam.storey:
            continue
        b0, b1 = np.asarray(o.start[:2]), np.asarray(o.end[:2])
        other = b1 - b0
        if np.linalg.norm(other) <= 0 or abs(float(t @ other)) / np.linalg.norm(other) < 0.99:
            continue
        mid = (b0 + b1) / 2 - a0
        across = abs(float(t[0] * mid[1] - t[1] * mid[0]))
        along = float(t @ mid)
        if 0.0 < across <= reach and -0.25 * length <= along <= 1.25 * length:
            out.append(o.guid)
    return out


def _name_lost_neighbours(changes: list[BeamChange], pairs, removed: list[BeamResult]) -> None:
    """Name the removed beams beside each beam whose tributary width grew."""
    old_of = {n.guid: o for o, n, _how in pairs}
    for c in changes:
        for i, cause in enumerate(c.causes):
            if cause.kind is not CauseKind.TRIBUTARY_GREW:
                continue
            o = old_of.get(c.guid)
            if o is None or o.demand is None:
                continue
            reach = 2 * max(o.demand.tributary_left, o.demand.tributary_right) + MATCH_TOLERANCE
            gone = tuple(_parallel_neighbours(o, removed, reach))
            c.causes[i] = ChangeCause(
                cause.kind, members=gone, before=cause.before, after=cause.after
            )


def _lost_loads(changes: list[BeamChange], pairs, new: CheckResult) -> None:
    """A beam whose demand fell because a member that loaded it lost its support.

    Its change is "changed", never "strengthened": the member that delivered the load
    is now unsupported and not checked, so the lower demand is no evidence of safety.
    """
    new_by = {b.guid: b for b in new.beams}
    unsettled = {b.guid for b in new.beams if b.outcome == "not_checked"}
    unsettled |= {c.guid for c in changes if c.lost_supports}
    old_of = {n.guid: o for o, n, _how in pairs}
    for c in changes:
        if not any(x.kind is CauseKind.UTILISATION_FELL for x in c.causes):
            continue
        o, n = old_of.get(c.guid), new_by.get(c.guid)
        if o is None or n is None or o.demand is None or n.demand is None:
            continue
        before = {p.source for p in o.demand.point_loads}
        after = {p.source for p in n.demand.point_loads}
        lost = tuple(sorted(g for g in before - after if g in unsettled))
        if lost:
            c.causes.insert(0, ChangeCause(CauseKind.DEMAND_FELL_LOST_LOAD, members=lost))
            if c.change == "strengthened":
                c.change = "changed"


def diff_results(old: CheckResult, new: CheckResult) -> DiffResult:
    """Match the beams of two checks and say what changed (causes in SI)."""
    pairs, added, removed = match_beams(old.beams, new.beams)
    changes = [c for o, n, how in pairs if (c := compare_beam(o, n, how)) is not None]
    _name_lost_neighbours(changes, pairs, removed)
    _lost_loads(changes, pairs, new)
    changes.sort(key=lambda c: (c.change != "weakened", c.storey, c.name))
    return DiffResult(
        old=old,
        new=new,
        matched=len(pairs),
        added=[b.guid for b in added],
        removed=[b.guid for b in removed],
        changes=changes,
    )
