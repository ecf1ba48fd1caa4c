"""Compare the checks of two revisions: which beams lost bracing or got worse.

Beams match by GlobalId; beams whose GUIDs were regenerated match by
geometry (centroid line within a tolerance and the same profile). Brace
stations of the old beam are carried onto the new beam's axis by projecting
their points, so a beam that was redrawn in the other direction still
compares station for station.
"""

from __future__ import annotations

from collections import defaultdict

import numpy as np

from ifccheck.reasons import NotChecked
from ifccheck.results import (
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

    old_iv = [tuple(sorted(_to_new_stations(old, new, [a, b]))) for a, b in old.continuous_bracing]
    if not old_iv:
        return 0.0
    return float(lines(old_iv).difference(lines(new.continuous_bracing)).length)


def compare_beam(
    old: BeamResult, new: BeamResult, matched_by: str, unloading: frozenset[str] = frozenset()
) -> BeamChange | None:
    """The change of one matched beam, or None when nothing that matters changed.

    ``unloading`` are the beams of the new revision that carry nothing (they lost a
    support): a beam whose demand fell because one of them no longer loads it is
    ``changed``, never better.
    """
    lost: set[float] = set()
    added: set[float] = set()
    for flange in FLANGES:
        old_braces = _to_new_stations(old, new, _braces(old, flange))
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
    lb_before = old.governing.lb if old.governing else None
    lb_after = new.governing.lb if new.governing else None
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
        utilisation_before=old.utilisation,
        utilisation_after=new.utilisation,
        outcome_before=old.outcome,
        outcome_after=new.outcome,
    )
    causes = _causes(change)
    if not causes:
        return None
    worse = [c for c in causes if c.worse]
    change.change = "weakened" if worse else "strengthened"
    change.causes = worse or causes
    lost_loaders = sorted((_loaders(old) - _loaders(new)) & unloading)
    if not worse and lost_loaders:
        change.change = "changed"
        change.causes = [ChangeCause(CauseKind.DEMAND_FELL_LOST_LOAD, members=tuple(lost_loaders))]
    return change


def _loaders(b: BeamResult) -> set[str]:
    """The members whose reactions load a beam."""
    return {p.source for p in b.demand.point_loads} if b.demand is not None else set()


UNLOADING = frozenset({NotChecked.UNSTABLE, NotChecked.UNSUPPORTED, NotChecked.NOT_IN_FRAMING})


def _causes(c: BeamChange) -> list[ChangeCause]:
    """What changed, worse causes first; quantities stay in SI (the report words them)."""
    out: list[ChangeCause] = []
    if c.lost_brace_points:
        out.append(ChangeCause(CauseKind.LOST_BRACES, stations=tuple(c.lost_brace_points)))
    if c.lost_supports:
        out.append(ChangeCause(CauseKind.LOST_SUPPORTS, members=tuple(c.lost_supports)))
    if c.lost_continuous_bracing > STATION_TOLERANCE:
        out.append(ChangeCause(CauseKind.LOST_SLAB_BRACING, after=c.lost_continuous_bracing))
    if (
        c.lb_before is not None
        and c.lb_after is not None
        and c.lb_after > c.lb_before + STATION_TOLERANCE
    ):
        out.append(ChangeCause(CauseKind.LB_GREW, before=c.lb_before, after=c.lb_after))
    rank_b, rank_a = OUTCOME_RANK[c.outcome_before], OUTCOME_RANK[c.outcome_after]
    outcome = (c.outcome_before, c.outcome_after)
    if rank_a > rank_b:
        out.append(ChangeCause(CauseKind.OUTCOME_WORSE, before=outcome[0], after=outcome[1]))
    u = (c.utilisation_before, c.utilisation_after)
    if u[0] is not None and u[1] is not None and u[1] > u[0] + UTILISATION_TOLERANCE:
        out.append(ChangeCause(CauseKind.UTILISATION_ROSE, before=u[0], after=u[1]))
    if c.added_brace_points:
        out.append(ChangeCause(CauseKind.ADDED_BRACES, stations=tuple(c.added_brace_points)))
    if c.gained_supports:
        out.append(ChangeCause(CauseKind.GAINED_SUPPORTS, members=tuple(c.gained_supports)))
    if rank_a < rank_b:
        out.append(ChangeCause(CauseKind.OUTCOME_BETTER, before=outcome[0], after=outcome[1]))
    if u[0] is not None and u[1] is not None and u[1] < u[0] - UTILISATION_TOLERANCE:
        out.append(ChangeCause(CauseKind.UTILISATION_FELL, before=u[0], after=u[1]))
    return out


def diff_results(old: CheckResult, new: CheckResult) -> DiffResult:
    """Match the beams of two checks and say what changed (causes in SI)."""
    pairs, added, removed = match_beams(old.beams, new.beams)
    unloading = frozenset(
        b.guid for b in new.beams
        if b.outcome == "not_checked" and b.reason is not None and b.reason.code in UNLOADING
    )  # fmt: skip
    changes = [c for o, n, how in pairs if (c := compare_beam(o, n, how, unloading)) is not None]
    changes.sort(key=lambda c: (c.change != "weakened", c.storey, c.name))
    return DiffResult(
        old=old,
        new=new,
        matched=len(pairs),
        added=[b.guid for b in added],
        removed=[b.guid for b in removed],
        changes=changes,
    )
