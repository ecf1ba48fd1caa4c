"""The check report's embedded data: one JSON document the page's script renders from.

The beam table's pages, each beam's details (figures, segments, stages, why it fails,
the moment diagram, the strength curve, the hand-check trail, brace points, demand,
notes) and the plans' hover texts are drawn from this data on demand, so a report of
ten thousand beams carries no per-beam markup but one line per beam on its plan.
The document is gzip-compressed (RFC 1952) and base64-encoded (RFC 4648) in one
``<script type="application/octet-stream">`` data block, which browsers never run;
the page's script unpacks it with the browser's DecompressionStream.

Table cells are words and numbers already formatted in the display units, so that the
page shows exactly what the rest of the report writes; chart points are numbers in
display units.
"""

from __future__ import annotations

import base64
import gzip
import json
import math
from collections.abc import Callable, Sequence
from typing import Any

import numpy as np

from ifccheck.reasons import reason_text
from ifccheck.report.display import DisplayUnits, utilisation_text
from ifccheck.report.wording import (
    CHECK_WORDS,
    adequacy_words,
    advice,
    explanation_sentences,
    fix_words,
    limit_state_words,
    name_guids,
)
from ifccheck.results import BeamResult, CheckResult, SegmentResult

FORMAT = 1  # of this embedded document (not a public contract: results.json is)
DEMAND_ROWS = 30  # line loads and point loads shown per beam, each (the JSON has them all)
DIAGRAM_POINTS = 61  # moment diagram points kept per beam (the extremes always kept)
OUTCOME_CODES = {"pass": 0, "fail": 1, "not_checked": 2}
STAGE_WORDS = {"in_service": "in service", "construction": "construction"}


# a strength curve (as the result holds it) → (its index in the page's list, or -1 for too
# few points; its points in display units)
Curves = dict[tuple[tuple[float, float], ...], tuple[int, list[tuple[float | None, float | None]]]]
_NAME_CACHE: dict[int, tuple[dict[str, str], dict[str, str]]] = {}


def _names_of(names: dict[str, str]) -> Callable[[str], str]:
    """:func:`name_guids` remembered per text (many beams share their sources and notes)."""
    cached = _NAME_CACHE.get(id(names))
    if cached is None or cached[0] is not names:
        _NAME_CACHE.clear()
        cached = (names, {})
        _NAME_CACHE[id(names)] = cached
    memo = cached[1]

    def words(text: str) -> str:
        out = memo.get(text)
        if out is None:
            out = memo[text] = name_guids(text, names)
        return out

    return words


def _r(v: float | None, digits: int = 4) -> float | None:
    """A finite number rounded for the page, else None."""
    if v is None or not math.isfinite(v):
        return None
    return round(v, digits)


def stage_words(stage: str) -> str:
    return STAGE_WORDS.get(stage, stage.replace("_", " "))


def controlling_words(b: BeamResult) -> str:
    seg = b.governing
    if b.controlling_limit == "flexure" and seg is not None:
        return limit_state_words(seg.limit_state)
    return CHECK_WORDS.get(b.controlling_limit, b.controlling_limit)


def lb_words(seg: SegmentResult | None, du: DisplayUnits) -> str:
    if seg is None:
        return "–"
    return "continuous (slab)" if seg.continuous else du.number(seg.lb, "length")


def _thin(xs: Sequence[float], ms: Sequence[float], n: int) -> list[int]:
    """Indices of at most ``n`` points, evenly spread, always with the largest sagging and
    hogging moments and both ends."""
    if len(xs) <= n:
        return list(range(len(xs)))
    step = (len(xs) - 1) / (n - 1)
    keep = {round(i * step) for i in range(n)}
    m = np.asarray(ms, dtype=float)
    if np.isfinite(m).any():
        keep.add(int(np.nanargmax(np.where(np.isfinite(m), m, np.nan))))
        keep.add(int(np.nanargmin(np.where(np.isfinite(m), m, np.nan))))
    return sorted(keep)


def _diagram(b: BeamResult, du: DisplayUnits) -> dict[str, Any] | None:
    d = b.diagram
    if d is None or not d.stations:
        return None
    fx, fm = du.factor("length"), du.factor("moment")
    idx = _thin(d.stations, d.moment, DIAGRAM_POINTS)
    x = np.round(np.asarray(d.stations, dtype=float)[idx] * fx, 3)
    m = np.round(np.asarray(d.moment, dtype=float)[idx] * fm, 3)
    if not np.isfinite(x).all():
        return None
    return {"x": x.tolist(), "m": [v if math.isfinite(v) else None for v in m.tolist()]}


class _Fmt:
    """Display-unit numbers as text, with each kind's factor looked up once."""

    def __init__(self, du: DisplayUnits) -> None:
        self.du = du
        self.f = {k: du.factor(k) for k in ("length", "moment", "force", "line load")}
        self.label = {k: du.label(k) for k in ("length", "moment", "force", "line load")}

    def n(self, v: float | None, kind: str, digits: int = 2) -> str:
        if v is None or not math.isfinite(v):
            return "–"
        return f"{v * self.f[kind]:.{digits}f}"

    def t(self, v: float | None, kind: str, digits: int = 2) -> str:
        if v is None or not math.isfinite(v):
            return "–"
        return f"{v * self.f[kind]:.{digits}f} {self.label[kind]}"


def _segment_row(s: SegmentResult, i: int, f: _Fmt) -> list[str]:
    return [
        str(i + 1), f.n(s.start, "length"), f.n(s.end, "length"),
        "continuous (slab)" if s.continuous else f.n(s.lb, "length"),
        f"{s.cb:.2f}", s.flange + (" (slab)" if s.continuous else ""),
        f.n(s.moment_demand, "moment", 1), f.n(s.moment_capacity, "moment", 1),
        utilisation_text(s.utilisation), limit_state_words(s.limit_state), s.load_combination,
        stage_words(s.stage),
    ]  # fmt: skip


def _stage_rows(b: BeamResult, f: _Fmt) -> list[list[Any]]:
    """[stage, outcome, utilisation, controlling limit, segment #, Lb, Cb, combination or
    reason, governs] per stage of a beam checked in two."""
    if len(b.stages) < 2:
        return []
    out = []
    for st in b.stages:
        seg = None if st.governing_segment is None else b.segments[st.governing_segment]
        lb = (
            "–" if seg is None else "continuous (slab)" if seg.continuous else f.n(seg.lb, "length")
        )
        out.append(
            [stage_words(st.stage), st.outcome, _r(st.utilisation),
             CHECK_WORDS.get(st.controlling_limit, st.controlling_limit),
             "–" if st.governing_segment is None else str(st.governing_segment + 1),
             lb, "–" if seg is None else f"{seg.cb:.2f}",
             seg.load_combination if seg is not None else (st.reason.text if st.reason else ""),
             st.stage == b.stage]
        )  # fmt: skip
    return out


# the hand-check trail's rows: (quantity, value key, display kind, note); the values
# differ per beam, the rest is written once in the page's data
TRAIL_ROWS: tuple[tuple[str, str, str, str], ...] = (
    ("Fy", "fy", "trade stress", "yield stress of the grade"),
    ("E", "e", "trade stress", "modulus of elasticity"),
    ("Zx", "zx", "section modulus", "plastic modulus"),
    ("Sx", "sx", "section modulus", "elastic modulus"),
    ("ry", "ry", "section section length", "radius of gyration, minor axis"),
    ("rts", "rts", "section section length", "effective radius of gyration, F2-7"),
    ("J", "j", "section inertia", "torsional constant"),
    ("ho", "ho", "section section length", "distance between flange centroids"),
    ("c", "c", "plain", "F2-8a (I-shape) or F2-8b (channel)"),
    ("Mp", "mp", "moment", "Fy Zx, F2-1"),
    ("0.7 Fy Sx", "mr", "moment", "moment at Lr"),
    ("Lp", "lp", "length", "F2-5"),
    ("Lr", "lr", "length", "F2-6"),
    ("Lb", "lb", "lb", "the governing segment"),
    ("Cb", "cb", "plain", ""),  # note: F1-1, or 1.0 where slab-braced
    ("Fcr", "fcr", "trade stress", "F2-4 at this Lb and Cb"),  # elastic LTB only
    ("Mn", "mn", "moment", ""),  # note: the limit state
    ("", "factor", "factor", ""),  # φb or Ωb
    ("", "design_strength", "moment", "design strength"),
    ("", "moment_demand", "moment", "moment demand, governing combination"),
)


def trail_rows(method: str) -> list[list[str]]:
    lrfd = method.upper() == "LRFD"
    rows = [[q, n] for q, _k, _kind, n in TRAIL_ROWS]
    rows[-3][1] = "resistance factor" if lrfd else "safety factor"
    rows[-2][0] = "φMn" if lrfd else "Mn/Ω"
    rows[-1][0] = "Mu" if lrfd else "Ma"
    return rows


SECTION_KEYS = frozenset(
    {"fy", "e", "zx", "sx", "ry", "rts", "j", "ho", "c", "mp", "mr", "lp", "lr"}
)


def _trail_value(key: str, kind: str, x: float | None, f: _Fmt, b: BeamResult) -> str | None:
    if x is None:
        return None
    du = f.du
    if kind == "trade stress":
        return du.trade(x, "stress")
    if kind.startswith("section "):
        return du.section(x, kind.removeprefix("section "))
    if kind == "plain":
        return f"{x:.3f}"
    if kind == "lb":
        seg = b.governing
        return "continuous (slab)" if seg is not None and seg.continuous else f.t(x, "length")
    return f.t(x, kind, 1 if kind == "moment" else 2)


def _trail(b: BeamResult, f: _Fmt, c: _Context) -> dict[str, Any] | None:
    """The trail's values: those of the section and steel shared through the page's list
    ``sections`` (many beams share a shape), the segment's own per beam."""
    t = b.trail
    if t is None:
        return None
    v = t.values
    seg = b.governing
    skey = tuple(v.get(k) for k in sorted(SECTION_KEYS))
    sec = c.sections.get(skey)
    if sec is None:
        sec = c.sections[skey] = (len(c.sections), [
            _trail_value(key, kind, v.get(key), f, b) if key in SECTION_KEYS else None
            for _q, key, kind, _n in TRAIL_ROWS
        ])  # fmt: skip
    own: list[str | None] = [
        None if key in SECTION_KEYS
        else f"{t.factor:.2f}" if key == "factor"
        else _trail_value(key, kind, v.get(key), f, b)
        for _q, key, kind, _n in TRAIL_ROWS
    ]  # fmt: skip
    fx = f.f["length"]
    return {
        "sec": sec[0],
        "v": own,
        "cbn": "F1-1" if seg is not None and not seg.continuous else "1.0",
        "ls": limit_state_words(t.limit_state),
        "sym": t.factor_symbol,
        "eq": [c.eqs.setdefault(e, len(c.eqs)) for e in t.equations],
        "lp": _r(v.get("lp", 0.0) * fx, 3),
        "lr": _r(v.get("lr", 0.0) * fx, 3),
    }


def _demand(b: BeamResult, f: _Fmt, words: Callable[[str], str]) -> dict[str, Any] | None:
    d = b.demand
    if d is None:
        return None
    return {
        "text": (
            f"Source: {d.source}. Tributary width {f.t(d.tributary_left, 'length')} left, "
            f"{f.t(d.tributary_right, 'length')} right. Moment from "
            f"{d.moment_combination or '–'}, shear from {d.shear_combination or '–'}."
        ),
        "lines": [
            [ll.case, f.n(ll.intensity, "line load", 3), f.n(ll.start, "length"),
             f.n(ll.end, "length"), words(ll.source)]
            for ll in d.line_loads[:DEMAND_ROWS]
        ],
        "more": max(0, len(d.line_loads) - DEMAND_ROWS) + max(0, len(d.point_loads) - DEMAND_ROWS),
        # [case, force, station, delivering member's GUID] (its name from the page's names)
        "points": [[p.case, f.n(p.force, "force", 2), f.n(p.station, "length"), p.source]
                   for p in d.point_loads[:DEMAND_ROWS]],
    }  # fmt: skip


class _Context:
    def __init__(self, du: DisplayUnits, method: str, names: dict[str, str]) -> None:
        self.f = _Fmt(du)
        self.du = du
        self.method = method
        self.names = names
        self.words = _names_of(names)
        self.curves: Curves = {}
        self.eqs: dict[str, int] = {}
        self.members: dict[str, str] = {}  # GUID → name of members the details cite
        # a section and steel's trail values → (index in the page's list, the values)
        self.sections: dict[tuple[float | None, ...], tuple[int, list[str | None]]] = {}


def _details(b: BeamResult, c: _Context) -> dict[str, Any]:
    f, du, names = c.f, c.du, c.names
    fy = du.trade_number(b.fy, "stress") if math.isfinite(b.fy) else "–"
    out: dict[str, Any] = {
        "facts": [
            f.n(b.span, "length"), fy, _r(b.utilisation), _r(b.strength_utilisation),
            _r(b.flexure_utilisation), _r(b.shear_utilisation), _r(b.deflection_utilisation),
        ],
        "grade": b.grade,
        "ends": list(b.end_members),
        "len": _r(b.length * f.f["length"], 4),
        "segs": [_segment_row(s, i, f) for i, s in enumerate(b.segments)],
        "gov": b.governing_segment,
    }  # fmt: skip
    stages = _stage_rows(b, f)
    if stages:
        out["stages"] = stages
    if b.outcome == "fail":
        why = explanation_sentences(b, du, names)
        if why:
            out["why"] = why
            if b.explanation is not None and len(b.stages) > 1:
                out["why_stage"] = stage_words(b.explanation.stage)
        else:
            out["fix"] = fix_words(b, du)
    if b.outcome == "not_checked":
        out["reason"] = c.words(reason_text(b.reason))
        out["advice"] = advice(b.reason)
    diagram = _diagram(b, du)
    fx = f.f["length"]
    if diagram is not None:
        diagram["seg"] = [[_r(s.start * fx, 3), _r(s.end * fx, 3)] for s in b.segments]
        diagram["cont"] = [[_r(s0 * fx, 3), _r(s1 * fx, 3)] for s0, s1 in b.continuous_bracing]
        out["diagram"] = diagram
    gov = b.governing
    if b.curve:
        fm = f.f["moment"]
        key = tuple(b.curve)
        if key not in c.curves:
            pts = [(_r(x * fx, 3), _r(y * fm, 2)) for x, y in key
                   if math.isfinite(x) and math.isfinite(y)]  # fmt: skip
            c.curves[key] = (len(c.curves), pts) if len(pts) >= 2 else (-1, pts)
        if c.curves[key][0] >= 0:
            out["curve"] = c.curves[key][0]
            if gov is not None:
                out["mark"] = [_r(gov.lb * fx, 3), _r(gov.moment_demand * fm, 2),
                               _r(gov.utilisation)]  # fmt: skip
    if gov is not None:
        out["lbg"] = "continuous (slab)" if gov.continuous else f.t(gov.lb, "length")
    trail = _trail(b, f, c)
    if trail is not None:
        out["trail"] = trail
    if b.brace_points:
        # [station, counts, kind, flange, by (GUID), Appendix 6 in words, why not]
        rows = []
        for p in sorted(b.brace_points, key=lambda p: p.station):
            if p.by_name:
                c.members.setdefault(p.by, p.by_name)
            rows.append(
                [_r(p.station * fx, 4), int(p.counts), p.kind, p.flange, p.by,
                 adequacy_words(p.adequacy, du) if p.adequacy is not None else "",
                 "" if p.counts else c.words(reason_text(p.reason))]
            )  # fmt: skip
        out["braces"] = rows
    demand = _demand(b, f, c.words)
    if demand is not None:
        out["demand"] = demand
    if b.notes:
        out["notes"] = [c.words(n) for n in b.notes]
    return out


def beam_record(
    b: BeamResult, storeys: dict[str, int], c: _Context, no_storey: str
) -> dict[str, Any]:
    """One beam: what the table, the plans' hover and the details show."""
    seg = b.governing
    f = c.f
    rec: dict[str, Any] = {
        "g": b.guid,
        "n": b.name,
        "s": storeys[b.storey or no_storey],
        "p": b.profile,
        "o": OUTCOME_CODES[b.outcome],
        "u": _r(b.utilisation),
        "cl": controlling_words(b),
        "st": stage_words(b.stage),
        # Lb in display units for sorting (0: slab-braced), shown as words by "lbt"
        "lb": None if seg is None else (0.0 if seg.continuous else _r(seg.lb * f.f["length"], 4)),
        "lbt": "–" if seg is None else "continuous (slab)" if seg.continuous
        else f.n(seg.lb, "length"),
        "cb": "–" if seg is None else f"{seg.cb:.2f}",
        "m": f.n(seg.moment_demand if seg else None, "moment", 1),
        "c": f.n(seg.moment_capacity if seg else None, "moment", 1),
        "d": _details(b, c),
    }  # fmt: skip
    if b.reason is not None:
        rec["r"] = b.reason.text
    if b.outcome == "fail" and len(b.stages) > 1:
        rec["fs"] = [stage_words(s.stage) for s in b.stages if s.outcome == "fail"]
    return rec


def report_data(
    result: CheckResult, du: DisplayUnits, storeys: Sequence[str], no_storey: str
) -> dict[str, Any]:
    """The whole embedded document."""
    index = {name: i for i, name in enumerate(storeys)}
    c = _Context(du, result.method, result.names)
    beams = [beam_record(b, index, c, no_storey) for b in result.beams]
    cited = set(c.members)
    for b in result.beams:
        if b.demand is not None:
            cited.update(p.source for p in b.demand.point_loads)
    names = {g: c.members.get(g) or result.names.get(g, "") for g in sorted(cited)}
    return {
        "format": FORMAT,
        "method": result.method,
        "strength": "φMn" if result.method.upper() == "LRFD" else "Mn/Ω",
        "staged": len(result.stages) > 1,
        "units": {k: du.label(k) for k in ("length", "moment", "stress", "force", "line load")},
        "storeys": list(storeys),
        "beams": beams,
        "curves": [[list(p) for p in pts] for i, pts in c.curves.values() if i >= 0],
        "trail": trail_rows(result.method),
        "sections": [vals for _i, vals in c.sections.values()],
        "equations": list(c.eqs),
        "names": {g: n for g, n in names.items() if n},
    }


def encode(doc: dict[str, Any]) -> str:
    """gzip, then base64: the text of the data block."""
    raw = json.dumps(doc, ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    return base64.b64encode(gzip.compress(raw.encode("utf-8"), 6, mtime=0)).decode("ascii")


def decode(text: str) -> dict[str, Any]:
    """The document back from a data block's text (tests, tools)."""
    return json.loads(gzip.decompress(base64.b64decode(text)).decode("utf-8"))
