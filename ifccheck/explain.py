"""Why a beam fails or is not checked, what would make it pass, and its hand-check trail.

Worked out once per check, after the beams are checked, from the beam's own
result and the model: the causes the tool can tell (an opening in the slab
over the failing segment, a brace that does not count, an assumed grade,
shear or deflection controlling), the largest unbraced length at which the
failing segment would pass (the design standard's strength curve inverted at
the segment's Cb and demand), the brace points that would make it pass (the
segment divided evenly, each new length checked at its own Cb and moment
from the governing diagram), and the lightest shape of the same family and
nominal depth that passes as braced today (from the shape table). Everything
stays in SI; the writers put it into words.
"""

from __future__ import annotations

import functools
import math
import re
from collections.abc import Mapping, Sequence
from typing import Any

import numpy as np

from ifccheck.config import Settings
from ifccheck.design.base import DesignStandard, FlexureResult, segment_moments
from ifccheck.errors import OutOfScope
from ifccheck.loads.combinations import strength_combinations
from ifccheck.model import Member, Model, Section, ShapeFamily, Slab, Steel
from ifccheck.results import (
    BeamResult,
    ExplainCause,
    ExplainKind,
    Explanation,
    HandCheck,
    SegmentResult,
    ShapeOption,
    StageName,
    StationFromEnd,
)
from ifccheck.sections.table import SOURCE as TABLE_SOURCE
from ifccheck.sections.table import designations, lookup
from ifccheck.segments import FlangeName, compression_moment
from ifccheck.units import G

# New brace points closer together than this are not offered (common practice: a
# brace needs room for its connection).
MIN_BRACE_SPACING = 0.5  # m
MAX_NEW_BRACES = 9
# A station this close to a beam end is at that end (supports sit at the ends).
END_TOLERANCE = 0.3  # m
# Lb found by bisection to within this.
LB_TOLERANCE = 0.001  # m
LB_GRID = 64  # points per refinement of the largest passing Lb
# Shape families whose flexure the hand-check trail describes (AISC 360-16 F2/F3).
TRAIL_FAMILIES = (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL)
_TABLE_NAME = re.compile(r"^(W|M|S|HP)(\d+(?:\.\d+)?)X[\d.]+$")


def explain_beams(
    beams: Sequence[BeamResult],
    model: Model,
    standard: DesignStandard,
    settings: Settings,
    names: Mapping[str, str],
) -> None:
    """Fill in each beam's ``trail`` and, for failing and not-checked beams, ``explanation``."""
    members = {m.guid: m for m in model.members}
    slabs: dict[str, list[Slab]] = {}
    for s in model.slabs:
        slabs.setdefault(s.storey, []).append(s)
    method = settings.design.method
    checked: list[tuple[BeamResult, Member]] = []
    for b in beams:
        b.end_members = (_end_member(b, 0.0, names), _end_member(b, b.length, names))
        m = members.get(b.guid)
        if b.outcome == "not_checked":
            code = b.reason.code.value if b.reason is not None else ""
            b.explanation = Explanation(
                causes=[ExplainCause(ExplainKind.NOT_CHECKED, code=code)], bracing_helps=False
            )
            continue
        if m is None or m.section is None or m.steel is None:
            continue
        checked.append((b, m))
    hand_checks(checked, standard, method)
    for b, m in checked:
        if b.outcome == "fail":
            b.explanation = explain_failure(b, m, standard, method, names, slabs.get(b.storey, []))


# --- the hand-check trail -----------------------------------------------------------
def hand_checks(
    checked: Sequence[tuple[BeamResult, Member]], standard: DesignStandard, method: str
) -> None:
    """Each beam's trail, the strengths of all governing segments in one call of the standard."""
    todo = [
        (b, m) for b, m in checked
        if b.governing is not None and m.section is not None
        and m.section.family in TRAIL_FAMILIES
    ]  # fmt: skip
    if not todo:
        return
    pairs: dict[tuple[int, int], int] = {}
    pair_list: list[tuple[Section, Steel]] = []
    index = []
    for _b, m in todo:
        assert m.section is not None and m.steel is not None
        key = (id(m.section), id(m.steel))
        if key not in pairs:
            pairs[key] = len(pair_list)
            pair_list.append((m.section, m.steel))
        index.append(pairs[key])
    segs = [b.governing for b, _m in todo]
    try:
        flex = standard.flexure_many(
            pair_list, index, [s.lb for s in segs if s], [s.cb for s in segs if s], method
        )
    except OutOfScope:  # one section outside the standard: each on its own
        for b, m in todo:
            assert m.section is not None and m.steel is not None
            b.trail = hand_check(b, m.section, m.steel, standard, method)
        return
    for i, (b, m) in enumerate(todo):
        assert m.section is not None and m.steel is not None
        b.trail = _trail(b, m.section, m.steel, standard, method, flex, i)


def hand_check(
    b: BeamResult, section: Section, steel: Steel, standard: DesignStandard, method: str
) -> HandCheck | None:
    """The governing segment's flexural strength, figure by figure, with the equations."""
    seg = b.governing
    if seg is None or section.family not in TRAIL_FAMILIES:
        return None
    try:
        flex = standard.flexure(section, steel, [seg.lb], [seg.cb], method)
    except OutOfScope:
        return None
    return _trail(b, section, steel, standard, method, flex, 0)


def _trail(
    b: BeamResult,
    section: Section,
    steel: Steel,
    standard: DesignStandard,
    method: str,
    flex: FlexureResult,
    i: int,
) -> HandCheck:
    seg = b.governing
    assert seg is not None
    c = torsion_constant_c(section)
    values = {
        "fy": steel.fy,
        "e": steel.E,
        "zx": section.Zx,
        "sx": section.Sx,
        "ry": section.ry,
        "rts": section.rts,
        "j": section.J,
        "ho": section.ho,
        "c": c,
        "lp": float(flex.lp[i]),
        "lr": float(flex.lr[i]),
        "mp": float(flex.mp[i]),
        "mr": float(flex.mr[i]),
        "lb": seg.lb,
        "cb": seg.cb,
        "mn": float(flex.mn[i]),
        "design_strength": float(flex.design_strength[i]),
        "moment_demand": seg.moment_demand,
    }
    if seg.lb > 0.0:
        values["fcr"] = elastic_ltb_stress(section, steel, seg.lb, seg.cb, c)
    state = str(flex.limit_state[i])
    aisc = standard.name.upper().startswith("AISC 360")
    equations = _equations(state, seg, c != 1.0) if aisc else []
    symbol = "φb" if method.upper() == "LRFD" else "Ωb"
    return HandCheck(values, state, float(flex.factor), symbol, equations)


def torsion_constant_c(section: Section) -> float:
    """c of AISC 360-16 Eq. F2-8a (doubly symmetric I: 1.0) or F2-8b (channel)."""
    if section.family is ShapeFamily.CHANNEL and section.Cw > 0.0:
        return section.ho / 2.0 * math.sqrt(section.Iy / section.Cw)
    return 1.0


def elastic_ltb_stress(section: Section, steel: Steel, lb: float, cb: float, c: float) -> float:
    """Fcr of AISC 360-16 Eq. F2-4, Pa."""
    slender = (lb / section.rts) ** 2
    jc = section.J * c / (section.Sx * section.ho)
    return cb * math.pi**2 * steel.E / slender * math.sqrt(1.0 + 0.078 * jc * slender)


def _equations(state: str, seg: SegmentResult, channel: bool) -> list[str]:
    out = [
        "AISC 360-16 Eq. F2-1: Mp = Fy Zx",
        "AISC 360-16 Eq. F2-5: Lp = 1.76 ry √(E/Fy)",
        "AISC 360-16 Eq. F2-6: Lr = 1.95 rts (E/0.7Fy) √(Jc/(Sx ho) + √((Jc/(Sx ho))² "
        "+ 6.76 (0.7Fy/E)²))",
        "AISC 360-16 Eq. F2-8b: c = (ho/2) √(Iy/Cw)"
        if channel
        else "AISC 360-16 Eq. F2-8a: c = 1 (doubly symmetric I-shape)",
    ]
    if not seg.continuous and seg.lb > 0.0:
        out.append("AISC 360-16 Eq. F1-1: Cb = 12.5 Mmax / (2.5 Mmax + 3 MA + 4 MB + 3 MC)")
        out.append(
            "AISC 360-16 Eq. F2-4: Fcr = Cb π²E / (Lb/rts)² √(1 + 0.078 Jc/(Sx ho) (Lb/rts)²)"
        )
    if state == "inelastic_ltb":
        out.append("AISC 360-16 Eq. F2-2: Mn = Cb (Mp − (Mp − 0.7Fy Sx)(Lb − Lp)/(Lr − Lp)) ≤ Mp")
    elif state == "elastic_ltb":
        out.append("AISC 360-16 Eq. F2-3: Mn = Fcr Sx ≤ Mp")
    elif state == "flange_local_buckling":
        out.append("AISC 360-16 Eq. F3-1 or F3-2: flange local buckling")
    else:
        out.append("AISC 360-16 F2.1: Mn = Mp (yielding)")
    return out


# --- why it fails, and what would make it pass ------------------------------------------
def explain_failure(
    b: BeamResult,
    m: Member,
    standard: DesignStandard,
    method: str,
    names: Mapping[str, str],
    slabs: Sequence[Slab],
) -> Explanation:
    """The causes of a failing beam and the fixes the tool can offer."""
    assert m.section is not None and m.steel is not None
    stage = _explained_stage(b)
    out = Explanation(stage=stage)
    st = b.stage_result(stage)
    shear = st.shear_utilisation if st is not None else b.shear_utilisation
    deflection = st.deflection_utilisation if st is not None else b.deflection_utilisation
    governing = st.governing_segment if st is not None else b.governing_segment
    if m.grade_source == "default" or b.grade_source == "default":
        out.causes.append(ExplainCause(ExplainKind.ASSUMED_GRADE, value=b.grade))
    if stage == "construction":
        out.causes.append(ExplainCause(ExplainKind.DECK_NOT_ATTACHED))
    if (shear or 0.0) > 1.0:
        out.causes.append(ExplainCause(ExplainKind.SHEAR_CONTROLS))
        out.bracing_helps = False
    if (deflection or 0.0) > 1.0:
        out.causes.append(ExplainCause(ExplainKind.DEFLECTION_CONTROLS))
        out.bracing_helps = False
    failing = [i for i, s in enumerate(b.segments) if s.utilisation > 1.0 and s.stage == stage]
    if failing:
        gi = governing if governing in failing else failing[0]
        assert gi is not None
        seg = b.segments[gi]
        out.segment = gi
        out.brace_flange = seg.flange
        if stage == "in_service":  # the brace points and slab bracing are in service
            out.causes += _bracing_causes(b, seg, slabs)
        out.largest_passing_lb = largest_passing_lb(standard, m.section, m.steel, seg, method)
        if out.largest_passing_lb is None:
            out.causes.append(ExplainCause(ExplainKind.BEYOND_PLASTIC))
            out.bracing_helps = False
        stations: list[float] = []
        for i in failing:
            found = new_brace_stations(b, b.segments[i], standard, m.section, m.steel, method)
            if found is None:
                out.bracing_helps = False
                continue
            stations += found
        if out.bracing_helps:
            out.braces = [station_from_end(b, s, names) for s in sorted(stations)]
    else:
        out.bracing_helps = False
    out.lighter_shape, out.shape_checked = lightest_passing_shape(b, m, standard, method)
    return out


def _explained_stage(b: BeamResult) -> StageName:
    """The stage a failure is explained for: in service where it fails there."""
    service = b.stage_result("in_service")
    if service is None or service.outcome == "fail" or not b.stages:
        return "in_service"
    return "construction"


def _bracing_causes(b: BeamResult, seg: SegmentResult, slabs: Sequence[Slab]) -> list[ExplainCause]:
    out: list[ExplainCause] = []
    for p in b.brace_points:
        inside = seg.start + 1e-3 < p.station < seg.end - 1e-3
        if inside and not p.counts and p.flange in (seg.flange, "both"):
            code = p.reason.code.value if p.reason is not None else ""
            out.append(
                ExplainCause(ExplainKind.BRACE_NOT_COUNTING, (p.by,), (p.station,), code=code)
            )
    if seg.flange != "top" or seg.continuous:
        return out
    openings = _openings_over(b, seg, slabs)
    out += openings
    if not openings and b.continuous_bracing:
        out.append(ExplainCause(ExplainKind.SLAB_GAP, stations=(seg.start, seg.end)))
    return out


def _openings_over(b: BeamResult, seg: SegmentResult, slabs: Sequence[Slab]) -> list[ExplainCause]:
    """Openings of the beam's slabs that the segment's length runs under."""
    from shapely.geometry import LineString

    length = b.length or 1.0
    p0 = _plan_at(b, seg.start, length)
    p1 = _plan_at(b, seg.end, length)
    if math.dist(p0, p1) <= 0.0:
        return []
    axis = LineString([p0, p1])
    out = []
    for slab in slabs:
        for hole in slab.openings:
            cut = axis.intersection(hole.buffer(0.05))
            if cut.is_empty or cut.length <= 0.0:
                continue
            ends = [axis.project(_point(c)) for g in _parts(cut) for c in g.coords]
            a, e = min(ends), max(ends)
            out.append(
                ExplainCause(ExplainKind.OPENING, (slab.guid,), (seg.start + a, seg.start + e))
            )
    return out


def _parts(geom: Any) -> list[Any]:
    return list(getattr(geom, "geoms", [geom]))


def _point(c: Sequence[float]) -> Any:
    from shapely.geometry import Point

    return Point(c[0], c[1])


def _plan_at(b: BeamResult, station: float, length: float) -> tuple[float, float]:
    t = station / length
    return (
        b.start[0] + t * (b.end[0] - b.start[0]),
        b.start[1] + t * (b.end[1] - b.start[1]),
    )


def largest_passing_lb(
    standard: DesignStandard, section: Section, steel: Steel, seg: SegmentResult, method: str
) -> float | None:
    """The largest Lb at which the segment's strength (at its Cb) reaches its demand.

    The strength never rises with Lb, so the last passing point of a grid
    brackets it; a second, finer grid inside that bracket gives it to within
    LB_TOLERANCE (two calls of the standard). None when even a fully braced
    length (Lb = 0) falls short.
    """
    lo, hi = 0.0, max(seg.lb, seg.end - seg.start)
    while True:
        grid = np.linspace(lo, hi, LB_GRID)
        strength = standard.flexure(section, steel, grid, np.full(LB_GRID, seg.cb), method)
        ok = np.asarray(strength.design_strength) >= seg.moment_demand
        if not ok[0]:
            return None if lo == 0.0 else lo
        if ok[-1]:
            return float(hi)
        last = int(np.flatnonzero(ok)[-1])
        lo, hi = float(grid[last]), float(grid[last + 1])
        if hi - lo <= LB_TOLERANCE:
            return lo


def new_brace_stations(
    b: BeamResult,
    seg: SegmentResult,
    standard: DesignStandard,
    section: Section,
    steel: Steel,
    method: str,
) -> list[float] | None:
    """Evenly spaced new brace points that make the segment pass, fewest first.

    Each new length is checked at its own Cb (the standard's moment-gradient
    factor) and its own largest moment, from the governing diagram scaled up
    where the segment's demand came from another combination. Every count of
    braces is tried in one call of the standard. None when no number of braces
    (at least MIN_BRACE_SPACING apart) is enough.
    """
    d = b.diagram
    if d is None or seg.continuous or len(d.stations) < 2:
        return None
    x = np.maximum.accumulate(np.asarray(d.stations, dtype=float))
    moment = np.asarray(d.moment, dtype=float)
    flange: FlangeName = "top" if seg.flange == "top" else "bottom"
    compressing = compression_moment(flange, moment)
    whole = segment_moments(x, compressing, [seg.start], [seg.end])[0][0]
    scale = max(1.0, seg.moment_demand / whole) if whole > 0 else 1.0
    free_start = "start" in b.free_ends and seg.start <= END_TOLERANCE
    free_end = "end" in b.free_ends and seg.end >= b.length - END_TOLERANCE
    most = min(MAX_NEW_BRACES, int((seg.end - seg.start) / MIN_BRACE_SPACING) - 1)
    if most < 1:
        return None
    cuts = [np.linspace(seg.start, seg.end, n + 2) for n in range(1, most + 1)]
    starts = np.concatenate([c[:-1] for c in cuts])
    ends = np.concatenate([c[1:] for c in cuts])
    tips = np.zeros(starts.size, dtype=bool)
    first = np.cumsum([0] + [len(c) - 1 for c in cuts])
    tips[first[:-1]] = free_start
    tips[first[1:] - 1] = free_end
    demand = segment_moments(x, compressing, starts, ends)[0] * scale
    cb = np.asarray(standard.moment_gradient(x, moment, starts, ends, tips), dtype=float)
    cap = np.asarray(standard.flexure(section, steel, ends - starts, cb, method).design_strength)
    for n, c in enumerate(cuts):
        part = slice(first[n], first[n + 1])
        if np.all(demand[part] <= cap[part]):
            return [float(v) for v in c[1:-1]]
    return None


def _end_member(b: BeamResult, at: float, names: Mapping[str, str]) -> str:
    """Name (else GUID) of the support at a beam end, "" when nothing supports it there."""
    for s in b.supports:
        if abs(float(s["station"]) - at) <= END_TOLERANCE:
            guid = str(s["by"])
            return names.get(guid) or guid
    return ""


def station_from_end(b: BeamResult, station: float, names: Mapping[str, str]) -> StationFromEnd:
    """A station given from the beam's nearer end, with the member supporting that end."""
    at_start = station <= b.length / 2
    end_station = 0.0 if at_start else b.length
    member = ""
    for s in b.supports:
        if abs(float(s["station"]) - end_station) <= END_TOLERANCE:
            member = str(s["by"])
            break
    distance = station if at_start else b.length - station
    return StationFromEnd(
        station=station,
        distance=distance,
        end="start" if at_start else "end",
        member=member,
        member_name=names.get(member, "") if member else "",
    )


def lightest_passing_shape(
    b: BeamResult, m: Member, standard: DesignStandard, method: str
) -> tuple[ShapeOption | None, bool]:
    """The lightest table shape of the same family and nominal depth that passes as braced.

    Each candidate is checked for every segment at today's Lb and Cb (all in one
    call of the standard), for shear, and for deflection (scaled by the ratio of
    Ix). Today's demand is kept; where the candidate is heavier, its extra
    self-weight is added on a simple span with the largest dead-load factor of
    the method's combinations (conservative). Returns (the shape or None,
    whether the table was searched).
    """
    section, steel = m.section, m.steel
    assert section is not None and steel is not None
    match = _TABLE_NAME.match(section.name)
    if section.source != TABLE_SOURCE or match is None or not b.segments:
        return None, False
    candidates = [c for c in _same_depth(match.group(1), match.group(2))
                  if not standard.scope(c, steel)]  # fmt: skip
    if not candidates:
        return None, True
    gamma_d = max((c.factors.get("D", 0.0) for c in strength_combinations(method)), default=1.0)
    k = len(b.segments)
    lbs = np.tile([s.lb for s in b.segments], len(candidates))
    cbs = np.tile([s.cb for s in b.segments], len(candidates))
    index = np.repeat(np.arange(len(candidates)), k)
    try:
        flex = standard.flexure_many([(c, steel) for c in candidates], index, lbs, cbs, method)
    except OutOfScope:
        return None, True
    cap = np.asarray(flex.design_strength).reshape(len(candidates), k)
    demand = np.array([s.moment_demand for s in b.segments])
    span = b.span or b.length
    for i, cand in enumerate(candidates):
        extra = max(0.0, cand.mass_per_length - section.mass_per_length) * G  # N/m
        u = float(np.max((demand + gamma_d * extra * span**2 / 8) / cap[i]))
        if u > 1.0:
            continue
        if b.shear_demand is not None:
            try:
                shear = standard.shear(cand, steel, method).design_strength
            except OutOfScope:
                continue
            u = max(u, (b.shear_demand + gamma_d * extra * span / 2) / shear)
        u = max(u, _deflection_utilisation(b, section, cand, extra, steel.E, span))
        if u <= 1.0:
            return ShapeOption(cand.name, cand.mass_per_length, u), True
    return None, True


@functools.lru_cache(maxsize=256)
def _same_depth(prefix: str, depth: str) -> tuple[Section, ...]:
    """Table shapes of one family prefix and nominal depth, lightest first."""
    names = [n for n in designations(prefix=prefix) if (g := _TABLE_NAME.match(n)) and
             g.group(2) == depth]  # fmt: skip
    found = [s for s in (lookup(n) for n in names) if s is not None]
    return tuple(sorted(found, key=lambda s: s.mass_per_length))


def _deflection_utilisation(
    b: BeamResult, old: Section, new: Section, extra: float, e: float, span: float
) -> float:
    """Deflection utilisation with another section: δ scales as 1/Ix (same loads)."""
    r = old.Ix / new.Ix
    out = 0.0
    if b.deflection_live and b.deflection_live_limit:
        out = max(out, b.deflection_live * r / b.deflection_live_limit)
    if b.deflection_total is not None and b.deflection_total_limit:
        added = 5 * extra * span**4 / (384 * e * new.Ix)  # simple span (common formula)
        out = max(out, (b.deflection_total * r + added) / b.deflection_total_limit)
    return out
