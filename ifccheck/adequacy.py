"""Adequate bracing: the strength and stiffness of every brace point that counts.

A brace point shortens Lb only if the brace is strong and stiff enough (AISC
360-16 Appendix 6.3). For every counted brace point between a beam's ends on
a flange that is in compression there (end supports are restrained by common
practice and a slab-braced length needs none):

- what it needs, from the design standard: Prb and βbr from Mr (the largest
  moment compressing that flange in the segments beside it, over the strength
  combinations), ho, Lbr (the larger unbraced length beside it) and Cd (2.0
  for the brace nearest the inflection point of a double-curvature segment);
- what it gets: the members from the brace to its anchor in series,
  k = 1/Σ(L/AE·cos²θ) with θ the member's angle to the brace force (the
  flange's lateral direction), a column anchor's own bending flexibility
  included; their axial strength in compression and tension (the lower) in
  the line of the force; a line of struts carries the brace forces of every
  beam it braces before the anchor. A floor beam framing in is anchored by
  the floor system (common practice), so its path is itself.
- a member framing into the web with a moment connection declared in the
  settings braces torsionally (Appendix 6.3.2): Mbr and βTb against its own
  flexural strength and a stiffness of 2EI/L (the smaller of the textbook
  values, the connection assumed rigid).

With ``bracing.adequacy = "enforce"`` a brace point that is not adequate
stops counting (its reason says which falls short); ``"report"`` keeps it
and reports; ``"off"`` skips the check. Connection design stays the
engineer's.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import Literal

import networkx as nx
import numpy as np

from ifccheck.design.base import DesignStandard
from ifccheck.errors import OutOfScope
from ifccheck.framing.types import BraceAdequacy, BracePoint, Framing, MemberFraming
from ifccheck.loads.demand import BeamDemand, DemandResult
from ifccheck.model import Member, MemberRole, Model
from ifccheck.reasons import NotChecked, Reason

# Moments below this share of a beam's largest compress nothing worth a brace.
NEGLIGIBLE = 1e-3
SAMPLES = 41  # stations per side of a brace when looking for Mr
# A bracing member this close to perpendicular to the brace force carries none of it.
MIN_COSINE = 0.1


@dataclass
class _Point:
    """One brace point under assessment: every bracing member meeting the beam at one
    station on the flange in compression (the shortest path to an anchor provides)."""

    beam: str
    index: int  # into the beam's brace_points: the first member at this station
    others: tuple[int, ...]  # the other members bracing the same point
    flange: str  # the flange it restrains that is in compression
    mr: float
    lbr: float
    cd: float
    strength: float  # required (N)
    stiffness: float  # required (N/m)
    path: tuple[str, ...] = ()
    notes: list[str] = field(default_factory=list)


def assess_bracing(
    model: Model,
    framing: Framing,
    demand: DemandResult,
    standard: DesignStandard,
    method: str,
    mode: str = "enforce",
    moment_connections: tuple[str, ...] = (),
) -> int:
    """Check every counted intermediate brace point (see the module docstring), writing
    the result on it; returns how many stopped counting (``enforce``)."""
    if mode == "off":
        return 0
    members = {m.guid: m for m in model.members}
    named = set(moment_connections)
    torsional = {m.guid for m in model.members if m.guid in named or m.name in named}
    points: list[_Point] = []
    for guid, mf in framing.members.items():
        bd = demand.beams.get(guid)
        beam = members.get(guid)
        if bd is None or bd.analysis is None or beam is None:
            continue
        if beam.section is None or beam.steel is None:
            continue  # a beam not checked has no Mr to hold
        points += _beam_points(beam, mf, bd, standard, method, torsional)
    if not points:
        return 0
    lines = framing.bracing_lines
    for p in points:
        bps = framing.members[p.beam].brace_points
        paths = [_path_to_anchor(lines, bps[i].by, members) for i in (p.index, *p.others)]
        p.path = min(paths, key=len)  # the brace force takes the shortest way to an anchor
    carried = _forces_along_lines(points, members)
    dropped = 0
    assessed: dict[tuple[str, int], BraceAdequacy] = {}
    for p in points:
        if p.flange == "torsion":
            adequacy = _torsional_provided(p, members, standard, method)
        else:
            adequacy = _lateral_provided(p, members, carried, standard, method, framing)
        for i in (p.index, *p.others):  # the worse of the flanges checked at a point stays
            old = assessed.get((p.beam, i))
            if old is None or (old.adequate and not adequacy.adequate):
                assessed[(p.beam, i)] = adequacy
    for (guid, i), adequacy in assessed.items():
        mf = framing.members[guid]
        bp = replace(mf.brace_points[i], adequacy=adequacy)
        if adequacy.kind == "torsional" and adequacy.adequate:
            bp = replace(bp, flange="both")  # a section held against twist: both flanges
        if mode == "enforce" and not adequacy.adequate:
            what = "strength" if not adequacy.strong_enough else "stiffness"
            if not adequacy.strong_enough and not adequacy.stiff_enough:
                what = "strength and stiffness"
            reason = Reason.of(
                NotChecked.BRACE_INADEQUATE,
                detail=f"{what} below what AISC 360-16 Appendix 6 requires",
            )
            bp = replace(bp, counts=False, reason=reason)
            dropped += 1
        mf.brace_points[i] = bp
    return dropped


def _beam_points(
    beam: Member, mf: MemberFraming, bd: BeamDemand, standard: DesignStandard, method: str,
    torsional: set[str],
) -> list[_Point]:  # fmt: skip
    """The counted intermediate brace points of one beam and what each needs."""
    assert beam.section is not None and beam.steel is not None
    diagrams = [bd.analysis.combine(c.factors) for c in bd.combinations] if bd.analysis else []
    if not diagrams:
        return []
    peak = max(float(np.max(np.abs(d.M))) for d in diagrams)
    length, off = beam.length, bd.offset
    out: list[_Point] = []
    groups: dict[tuple[float, str], list[int]] = {}  # (station, flange) → brace indices
    for k, bp in enumerate(mf.brace_points):
        if not bp.counts or bp.kind == "support" or not 0.0 < bp.station < length:
            continue
        if bp.by in torsional:
            out += _torsional_need(beam, mf, bp, k, diagrams, off, standard, method)
            continue
        flanges = ("top", "bottom") if bp.flange == "both" else (bp.flange,)
        for flange in flanges:
            groups.setdefault((round(bp.station, 3), flange), []).append(k)
    for (_, flange), ks in groups.items():
        point = _lateral_need(beam, mf, ks, flange, diagrams, peak, off, standard, method)
        if point is not None:
            out.append(point)
    return out


def _lateral_need(
    beam: Member, mf: MemberFraming, ks: list[int], flange: str, diagrams: list, peak: float,
    off: float, standard: DesignStandard, method: str,
) -> _Point | None:  # fmt: skip
    """What a point lateral brace of ``flange`` at the members ``ks`` needs, or None where
    that flange is slab-braced or not in compression beside it."""
    assert beam.section is not None
    bp = mf.brace_points[ks[0]]
    if flange == "top" and any(a <= bp.station <= b for a, b in mf.continuous_bracing):
        return None  # the slab braces the top flange here
    side: Literal["top", "bottom"] = "top" if flange == "top" else "bottom"
    stations = [s for s in mf.counting_braces(side) if abs(s - bp.station) > 1e-6]
    a = max((s for s in stations if s < bp.station), default=0.0)
    b = min((s for s in stations if s > bp.station), default=beam.length)
    mr, double, inflection = _moment_beside(diagrams, flange, a + off, b + off)
    if mr <= NEGLIGIBLE * peak:
        return None  # that flange is not in compression beside this brace
    cd = 2.0 if double and _nearest(bp.station + off, inflection, stations, off) else 1.0
    lbr = max(bp.station - a, b - bp.station)
    try:
        need = standard.point_brace(mr, beam.section.ho, lbr, method, cd)
    except OutOfScope:
        return None
    return _Point(beam.guid, ks[0], tuple(ks[1:]), flange, mr, lbr, cd, need.strength,
                  need.stiffness)  # fmt: skip


def _moment_beside(
    diagrams: list, flange: str, a: float, b: float
) -> tuple[float, bool, float | None]:
    """Largest moment compressing ``flange`` over [a, b] (analysis stations) in any
    combination; whether that combination bends it in double curvature there, and where
    its moment changes sign."""
    x = np.linspace(a, b, SAMPLES)
    best, double, inflection = 0.0, False, None
    for d in diagrams:
        m = np.asarray(d.moment_at(x), dtype=float)
        comp = np.maximum(m, 0.0) if flange == "top" else np.maximum(-m, 0.0)
        value = float(comp.max())
        if value > best:
            best = value
            tol = NEGLIGIBLE * float(np.max(np.abs(m)))
            double = bool(m.max() > tol and m.min() < -tol)
            sign = np.flatnonzero(np.diff(np.sign(m)) != 0)
            inflection = float(x[sign[0]]) if double and sign.size else None
    return best, double, inflection


def _nearest(station: float, inflection: float | None, others: list[float], off: float) -> bool:
    """Whether the brace at ``station`` is the one nearest the inflection point."""
    if inflection is None:
        return False
    mine = abs(station - inflection)
    return all(mine <= abs(s + off - inflection) for s in others)


def _path_to_anchor(lines: nx.Graph, by: str, members: dict[str, Member]) -> tuple[str, ...]:
    """The bracing members from the brace to the nearest anchor (the member itself for a
    floor beam, which the floor system anchors)."""
    start = ("member", by)
    m = members.get(by)
    if m is None or m.role is MemberRole.BEAM or start not in lines:
        return (by,)
    seen: dict[tuple[str, str], tuple[tuple[str, str], ...]] = {start: (start,)}
    queue = [start]
    while queue:
        node = queue.pop(0)
        for nxt in sorted(lines.neighbors(node), key=str):
            if nxt in seen:
                continue
            path = (*seen[node], nxt)
            if nxt[0] != "member":
                return tuple(n[1] for n in path if n[0] == "member") + (
                    (f"column:{nxt[1]}",) if nxt[0] == "column" else ()
                )
            seen[nxt] = path
            queue.append(nxt)
    return (by,)


def _forces_along_lines(
    points: list[_Point], members: dict[str, Member]
) -> dict[str, tuple[float, float]]:
    """Per strut or brace: the summed (strength, stiffness) needs of the points whose
    path to the anchor runs through it (a floor beam takes each of its brace forces
    straight to the floor system, so it carries them one at a time)."""
    out: dict[str, tuple[float, float]] = {}
    for p in points:
        if p.flange == "torsion":
            continue
        for g in p.path:
            m = members.get(g)
            if m is None or m.role is MemberRole.BEAM:
                continue
            s, k = out.get(g, (0.0, 0.0))
            out[g] = (s + p.strength, k + p.stiffness)
    return out


def _cosine(member: Member, lateral: np.ndarray) -> float:
    return float(abs(np.dot(member.direction, lateral)))


def _lateral(beam: Member) -> np.ndarray:
    """The braced beam's flange-width direction (the line of a lateral brace force)."""
    u = beam.direction
    up = np.asarray(beam.web_up, dtype=float)
    lat = np.cross(up, u)
    n = float(np.linalg.norm(lat))
    return lat / n if n > 0 else np.array([-u[1], u[0], 0.0])


def _lateral_provided(
    p: _Point, members: dict[str, Member], carried: dict[str, tuple[float, float]],
    standard: DesignStandard, method: str, framing: Framing,
) -> BraceAdequacy:  # fmt: skip
    beam = members[p.beam]
    lateral = _lateral(beam)
    flexibility = 0.0
    strength = math.inf
    notes = list(p.notes)
    worst_need = p.strength
    stiff_sum_ok = True
    for g in p.path:
        if g.startswith("column:"):
            flexibility += _column_flexibility(members.get(g[7:]), p, members, framing)
            continue
        m = members.get(g)
        if m is None or m.section is None or m.steel is None or m.length <= 0:
            return _failed(p, "a bracing member of unknown section", notes)
        c = _cosine(m, lateral)
        if c < MIN_COSINE:
            return _failed(p, f"{m.name or m.guid} is nearly parallel to the braced beam", notes)
        k_axial = m.section.A * m.steel.E / m.length * c * c
        flexibility += 1.0 / k_axial
        try:
            cap = standard.axial_strength(m.section, m.steel, m.length, method).either_way * c
        except OutOfScope as exc:
            return _failed(p, str(exc), notes)
        need_s, need_k = carried.get(g, (p.strength, p.stiffness))
        if need_s > p.strength:
            notes.append(f"{m.name or m.guid} carries the brace forces of its whole line")
        if cap / max(need_s, 1e-12) < strength / max(worst_need, 1e-12):
            strength, worst_need = cap, need_s
        stiff_sum_ok &= k_axial >= need_k
    stiffness = 1.0 / flexibility if flexibility > 0 else math.inf
    if not stiff_sum_ok:
        notes.append("a member of the bracing line is less stiff than the line requires")
        stiffness = min(stiffness, 0.999 * p.stiffness)
    return BraceAdequacy("point", worst_need, p.stiffness, strength, stiffness, p.mr, p.lbr,
                         p.cd, p.path, tuple(notes))  # fmt: skip


def _failed(p: _Point, why: str, notes: list[str]) -> BraceAdequacy:
    return BraceAdequacy("point", p.strength, p.stiffness, 0.0, 0.0, p.mr, p.lbr, p.cd, p.path,
                         (*notes, why))  # fmt: skip


def _column_flexibility(
    column: Member | None, p: _Point, members: dict[str, Member], framing: Framing
) -> float:
    """1/k of a column anchor bent by a lateral force where the bracing meets it,
    pinned at both ends: k = 3EIL/(a²b²) about its weaker axis."""
    if column is None or column.section is None or column.steel is None:
        return 0.0
    last = members.get(p.path[-2]) if len(p.path) >= 2 else None
    z = last.end[2] if last is not None else 0.5 * (column.start[2] + column.end[2])
    lo, hi = sorted((column.start[2], column.end[2]))
    a, b = z - lo, hi - z
    length = hi - lo
    if a <= 0 or b <= 0 or length <= 0:
        return 0.0  # at the column's end: held by the floor or the base
    ei = column.steel.E * min(column.section.Ix, column.section.Iy)
    return (a * a * b * b) / (3.0 * ei * length)


def _torsional_need(
    beam: Member, mf: MemberFraming, bp: BracePoint, k: int, diagrams: list, off: float,
    standard: DesignStandard, method: str,
) -> list[_Point]:  # fmt: skip
    """A torsional brace: Mr the largest moment in the span, n the torsional braces in it."""
    assert beam.section is not None and beam.steel is not None
    x = np.linspace(off, off + beam.length, 4 * SAMPLES)
    mr = max(float(np.max(np.abs(d.moment_at(x)))) for d in diagrams)
    supports = sorted(s.station for s in mf.supports)
    span = (supports[-1] - supports[0]) if len(supports) >= 2 else beam.length
    n = sum(1 for b in mf.brace_points if b.counts and b.kind != "support")
    try:
        need = standard.torsional_brace(mr, span, max(n, 1), 1.0, beam.section, beam.steel,
                                        method)  # fmt: skip
    except OutOfScope:
        return []
    p = _Point(beam.guid, k, (), "torsion", mr, span, 1.0, need.strength, need.stiffness)
    p.notes.append("assumed connection: rigid moment connection into the web (settings)")
    return [p]


def _torsional_provided(
    p: _Point, members: dict[str, Member], standard: DesignStandard, method: str
) -> BraceAdequacy:
    brace = members.get(p.path[0]) if p.path else None
    if brace is None or brace.section is None or brace.steel is None or brace.length <= 0:
        return BraceAdequacy("torsional", p.strength, p.stiffness, 0.0, 0.0, p.mr, p.lbr, p.cd,
                             p.path, (*p.notes, "a bracing member of unknown section"))  # fmt: skip
    stiffness = 2.0 * brace.steel.E * brace.section.Ix / brace.length  # 2EI/L, the smaller
    strength = float(
        standard.flexure(brace.section, brace.steel, [brace.length], [1.0], method).design_strength[
            0
        ]
    )
    return BraceAdequacy("torsional", p.strength, p.stiffness, strength, stiffness, p.mr,
                         p.lbr, p.cd, p.path, tuple(p.notes))  # fmt: skip
