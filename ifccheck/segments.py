"""Unbraced segments of a beam from its brace points and slab-braced lengths.

Each flange is treated on its own: the top flange is braced at brace points
that restrain it and wherever a slab bears on it; the bottom flange only at
brace points that restrain it (a slab on top does not brace the bottom
flange). A segment is checked for the moment that puts its own flange in
compression: sagging moment for the top flange, hogging for the bottom.
"""

from __future__ import annotations

import itertools
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Literal

import numpy as np

from ifccheck.framing.types import MemberFraming

FlangeName = Literal["top", "bottom"]
# Segments shorter than this are slivers between coincident brace points.
MIN_SEGMENT = 0.005  # m
# Brace stations closer than this merge (the same point modelled twice).
MERGE = 0.005  # m


@dataclass(frozen=True)
class SegmentSpec:
    start: float
    end: float
    flange: FlangeName
    continuous: bool  # braced along its whole length by a slab
    cantilever: bool  # one end is a free, unbraced tip
    braced_by: tuple[str, ...] = field(default_factory=tuple)

    @property
    def lb(self) -> float:
        return 0.0 if self.continuous else self.end - self.start


def _merge_intervals(intervals: Sequence[tuple[float, float]], length: float):
    out: list[list[float]] = []
    for a, b in sorted((max(0.0, a), min(length, b)) for a, b in intervals):
        if b - a < MIN_SEGMENT:
            continue
        if out and a <= out[-1][1] + MERGE:
            out[-1][1] = max(out[-1][1], b)
        else:
            out.append([a, b])
    return [(a, b) for a, b in out]


def flange_segments(
    length: float,
    braces: dict[float, str],
    continuous: Sequence[tuple[float, float]],
    flange: FlangeName,
) -> list[SegmentSpec]:
    """Segments of one flange: covered intervals, and uncovered lengths cut at braces.

    ``braces`` maps station → GUID of the bracing member. An uncovered length
    that reaches a beam end with no brace there ends in a free tip.
    """
    covered = _merge_intervals(continuous, length)
    stations = sorted(s for s in braces if -MERGE <= s <= length + MERGE)
    out: list[SegmentSpec] = [SegmentSpec(a, b, flange, True, False, ("slab",)) for a, b in covered]
    # uncovered gaps between covered intervals (and the beam ends)
    edges = [0.0] + [v for ab in covered for v in ab] + [length]
    for a, b in zip(edges[0::2], edges[1::2], strict=True):
        if b - a < MIN_SEGMENT:
            continue
        cuts = [a] + [s for s in stations if a + MERGE < s < b - MERGE] + [b]
        for s0, s1 in itertools.pairwise(cuts):
            start_braced = _is_braced(s0, stations, covered, length)
            end_braced = _is_braced(s1, stations, covered, length)
            if not start_braced and not end_braced:
                # floating length: nothing restrains it at either end
                by: tuple[str, ...] = ()
                tip = True
            else:
                by = tuple(
                    _by(s, braces, covered)
                    for s, ok in ((s0, start_braced), (s1, end_braced))
                    if ok
                )
                tip = not (start_braced and end_braced)
            out.append(SegmentSpec(s0, s1, flange, False, tip, by))
    return sorted(out, key=lambda s: s.start)


def _is_braced(
    station: float, stations: list[float], covered: list[tuple[float, float]], length: float
) -> bool:
    if any(abs(station - s) <= MERGE for s in stations):
        return True
    return any(a - MERGE <= station <= b + MERGE for a, b in covered)


def _by(station: float, braces: dict[float, str], covered: list[tuple[float, float]]) -> str:
    for s, guid in braces.items():
        if abs(station - s) <= MERGE:
            return guid
    return "slab"


def beam_segments(
    length: float, framing: MemberFraming, slab_bracing: bool = True
) -> list[SegmentSpec]:
    """Top- and bottom-flange segments of a beam."""
    out: list[SegmentSpec] = []
    for flange in ("top", "bottom"):
        braces: dict[float, str] = {}
        for bp in framing.brace_points:
            if bp.counts and bp.flange in (flange, "both"):
                braces.setdefault(round(bp.station, 6), bp.by)
        continuous = framing.continuous_bracing if (flange == "top" and slab_bracing) else []
        out += flange_segments(length, braces, continuous, flange)
    return out


def compression_moment(flange: FlangeName, moment: np.ndarray) -> np.ndarray:
    """Moment that compresses the given flange (sagging for top, hogging for bottom), ≥ 0."""
    return np.maximum(moment, 0.0) if flange == "top" else np.maximum(-moment, 0.0)
