"""Which floor beams can carry load, and their spans between support centrelines.

A beam is designed for the distance between the centrelines of its
supports (the girder's web line, the column's axis), not for its modelled
length: modelling tools stop beams at setbacks or at column-flange faces.
The centreline station of an end support is where the beam's plan line
crosses the supporting beam's plan line, or the projection of the column's
axis onto it; walls and near-parallel hosts keep the modelled station.

A beam with fewer than two supports cannot carry load on pins (a cantilever
needs a backspan over a support): it carries nothing, and its floor goes to
its neighbours as if it were absent.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from ifccheck.framing.types import Framing, MemberFraming, Support
from ifccheck.model import Member, MemberRole, Model
from ifccheck.reasons import NotChecked, Reason

# Supports closer than this along a beam are one support.
SAME_SUPPORT = 1e-3  # m
# Plan lines closer to parallel than this do not cross where a support is.
PARALLEL_SINE = math.sin(math.radians(10.0))
# A span this much longer or shorter than the modelled length is noted.
SPAN_NOTE_FRACTION = 0.01


@dataclass
class BeamSpan:
    """The stations (along the beam's centroid line, from its start) of its supports'
    centrelines. ``start``/``end`` bound the analysis line: the first and last support
    centreline, or the modelled ends where the beam runs past its supports."""

    guid: str
    length: float  # modelled length, m
    start: float
    end: float
    centrelines: dict[tuple[float, str], float] = field(default_factory=dict)  # (at, by) → cl

    @property
    def span_length(self) -> float:
        return self.end - self.start

    def centreline(self, s: Support) -> float:
        return self.centrelines.get((s.station, s.by), s.station)


def is_floor_beam(m: Member) -> bool:
    """A horizontal-ish beam with a plan length: one that could carry floor load."""
    if m.role is not MemberRole.BEAM or m.is_vertical:
        return False
    return math.hypot(m.end[0] - m.start[0], m.end[1] - m.start[1]) > 1e-6


def load_capable(model: Model, framing: Framing) -> tuple[list[Member], dict[str, Reason]]:
    """The floor beams that can carry load, and why each other floor beam cannot."""
    capable: list[Member] = []
    unable: dict[str, Reason] = {}
    for m in model.members:
        if not is_floor_beam(m):
            continue
        mf = framing.members.get(m.guid)
        if mf is None:
            unable[m.guid] = Reason.of(NotChecked.NOT_IN_FRAMING)
            continue
        n = len(distinct_supports(mf))
        if n == 0:
            unable[m.guid] = Reason.of(NotChecked.UNSUPPORTED)
        elif n == 1:
            unable[m.guid] = Reason.of(
                NotChecked.UNSTABLE,
                detail="1 support: a beam on pins needs two or more (a cantilever needs a "
                "backspan over a support, or a moment connection)",
            )
        else:
            capable.append(m)
    return capable, unable


def distinct_supports(mf: MemberFraming) -> list[float]:
    stations = sorted(s.station for s in mf.supports)
    out: list[float] = []
    for s in stations:
        if not out or s - out[-1] > SAME_SUPPORT:
            out.append(s)
    return out


def beam_spans(model: Model, framing: Framing, beams: list[Member]) -> dict[str, BeamSpan]:
    """The centreline span of each beam (see the module docstring)."""
    members = {m.guid: m for m in model.members}
    out: dict[str, BeamSpan] = {}
    for m in beams:
        mf = framing.members[m.guid]
        span = BeamSpan(m.guid, m.length, 0.0, m.length)
        for s in mf.supports:
            host = members.get(s.by)
            cl = _centreline_station(m, s, host) if host is not None else s.station
            span.centrelines[(s.station, s.by)] = cl
        stations = [span.centreline(s) for s in mf.supports]
        if stations:
            span.start = min(0.0, min(stations))
            span.end = max(m.length, max(stations))
        out[m.guid] = span
    return out


def _centreline_station(beam: Member, s: Support, host: Member) -> float:
    """Where the host's centreline is along the beam, for an end support; else ``s.station``."""
    if s.end is None:
        return s.station
    a = np.asarray(beam.start[:2], float)
    d = np.asarray(beam.end[:2], float) - a
    plan = float(np.hypot(*d))
    if plan <= 0.0:
        return s.station
    t = d / plan
    scale = beam.length / plan  # station per plan length (sloped beams)
    h0 = np.asarray(host.start[:2], float)
    hd = np.asarray(host.end[:2], float) - h0
    hplan = float(np.hypot(*hd))
    if host.role is MemberRole.COLUMN or host.is_vertical or hplan <= 1e-9:
        return float((h0 - a) @ t) * scale
    h = hd / hplan
    cross = t[0] * h[1] - t[1] * h[0]
    if abs(cross) < PARALLEL_SINE:
        return s.station
    # a + u t = h0 + v h  →  u = ((h0 - a) × h) / (t × h)
    w = h0 - a
    u = (w[0] * h[1] - w[1] * h[0]) / cross
    return float(u) * scale


def span_note(span: BeamSpan) -> str | None:
    """A note where the centreline span differs from the modelled length by over 1 %."""
    if span.length <= 0:
        return None
    change = span.span_length / span.length - 1.0
    if abs(change) <= SPAN_NOTE_FRACTION:
        return None
    return (
        f"designed for the span between support centrelines, {abs(change):.0%} "
        f"{'longer' if change > 0 else 'shorter'} than the modelled length"
    )
