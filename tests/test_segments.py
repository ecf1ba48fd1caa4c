"""Unbraced segments from brace points and slab-braced lengths (geometry by construction)."""

from __future__ import annotations

import numpy as np
import pytest

from ifccheck.framing.types import BracePoint, MemberFraming
from ifccheck.segments import beam_segments, compression_moment, flange_segments

L = 9.144  # 30 ft


def framing(points, continuous=()):
    return MemberFraming(
        guid="b",
        brace_points=[BracePoint(s, k, by, fl, counts) for s, k, by, fl, counts in points],
        continuous_bracing=list(continuous),
    )


def spans(segs, flange):
    return [(round(s.start, 4), round(s.end, 4)) for s in segs if s.flange == flange]


def test_third_point_bracing_gives_three_segments_per_flange():
    f = framing(
        [(0, "support", "g1", "both", True), (L, "support", "g2", "both", True),
         (L / 3, "framing", "i1", "both", True), (2 * L / 3, "framing", "i2", "both", True)]
    )  # fmt: skip
    segs = beam_segments(L, f)
    third = round(L / 3, 4)
    assert spans(segs, "top") == [
        (0.0, third),
        (third, round(2 * L / 3, 4)),
        (round(2 * L / 3, 4), L),
    ]
    assert all(s.lb == pytest.approx(L / 3) for s in segs)
    assert not any(s.cantilever for s in segs)
    assert segs[0].braced_by == ("g1", "i1")


def test_slab_braces_top_flange_only_and_opening_leaves_a_gap():
    f = framing(
        [(0, "support", "g1", "both", True), (L, "support", "g2", "both", True)],
        continuous=[(0.0, 3.0), (6.0, L)],
    )
    segs = beam_segments(L, f)
    top = [s for s in segs if s.flange == "top"]
    assert [(s.start, s.end, s.continuous) for s in top] == [
        (0.0, 3.0, True), (3.0, 6.0, False), (6.0, L, True)
    ]  # fmt: skip
    gap = top[1]
    assert gap.lb == pytest.approx(3.0) and gap.braced_by == ("slab", "slab")
    bottom = [s for s in segs if s.flange == "bottom"]
    assert [(s.start, s.end) for s in bottom] == [(0.0, L)]  # slab does not brace the bottom


def test_slab_bracing_switched_off():
    f = framing([(0, "support", "g1", "both", True), (L, "support", "g2", "both", True)],
                continuous=[(0.0, L)])  # fmt: skip
    top = [s for s in beam_segments(L, f, slab_bracing=False) if s.flange == "top"]
    assert [(s.start, s.end, s.continuous) for s in top] == [(0.0, L, False)]


def test_brace_that_does_not_count_is_ignored_and_kicker_braces_bottom_only():
    f = framing(
        [(0, "support", "g1", "both", True), (L, "support", "g2", "both", True),
         (L / 2, "brace", "strut", "both", False), (L / 4, "brace", "kicker", "bottom", True)]
    )  # fmt: skip
    segs = beam_segments(L, f)
    assert spans(segs, "top") == [(0.0, L)]
    assert spans(segs, "bottom") == [(0.0, round(L / 4, 4)), (round(L / 4, 4), L)]


def test_cantilever_tip_is_free():
    # support at 0 and 6 m, tip at 8 m
    segs = flange_segments(8.0, {0.0: "c1", 6.0: "c2"}, [], "bottom")
    assert [(s.start, s.end, s.cantilever) for s in segs] == [(0.0, 6.0, False), (6.0, 8.0, True)]


def test_compression_moment_sign():
    m = np.array([-5.0, 0.0, 7.0])
    assert compression_moment("top", m).tolist() == [0.0, 0.0, 7.0]
    assert compression_moment("bottom", m).tolist() == [5.0, 0.0, 0.0]
