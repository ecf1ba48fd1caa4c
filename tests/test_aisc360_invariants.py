"""Invariants of AISC 360-16 Chapter F over every family the engine covers (hypothesis).

For any section (a database shape or one built from random dimensions), grade,
axis and side in compression: the strength never rises with Lb, never falls with
Cb, and never exceeds the family's plastic limit as the standard states it —
Mp = Fy·Z (F2-1, F7-1, F8-1), capped at 1.6·My for minor-axis I-shapes (F6-1) and
tees with the stem in tension (F9-2), My for tee stems in compression (F9-4),
1.5·My for double-angle web legs in compression (F9-5) and single angles (F10-1).
"""

from __future__ import annotations

import math

import numpy as np
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from ifccheck.design.aisc360 import flexure, scope, shear
from ifccheck.model import Section, ShapeFamily, Steel
from ifccheck.sections import designations, i_section_from_dimensions, lookup, steel_from_name
from ifccheck.sections.shapes import (
    angle_from_dimensions,
    rect_hollow_from_dimensions,
    round_hollow_from_dimensions,
    singly_symmetric_i_from_dimensions,
    tee_from_dimensions,
)

GRADES = ["A36", "A992", "A913 Gr 65", "A500 Gr C", "S235", "S355", "S460"]


def _equal_leg(name: str) -> bool:
    s = lookup(name)
    return s is not None and math.isclose(s.d, s.bf, rel_tol=1e-3)


TABLE = {
    "I": designations(ShapeFamily.I_SHAPE),
    "C": designations(ShapeFamily.CHANNEL),
    "T": designations(ShapeFamily.TEE),
    "L": [n for n in designations(prefix="L") if _equal_leg(n)],
    "2L": designations(prefix="2L"),
    "HSS": designations(ShapeFamily.HOLLOW_RECT),
    "PIPE": designations(ShapeFamily.HOLLOW_ROUND),
}


@st.composite
def dimensioned(draw: st.DrawFn, kind: str) -> Section:
    """A section of ``kind`` from random dimensions (m); unbuildable ones are rejected."""
    try:
        return _dimensioned(draw, kind)
    except ValueError:  # the constructor refused the dimensions, as it should
        assume(False)
        raise


def _dimensioned(draw: st.DrawFn, kind: str) -> Section:
    d = draw(st.floats(0.1, 1.5))
    if kind == "I":
        bf = draw(st.floats(0.2, 1.0)) * d
        tf = draw(st.floats(0.004, 0.06))
        tw = draw(st.floats(0.3, 1.0)) * tf
        r = draw(st.sampled_from([0.0, 0.5, 1.2])) * tw
        assume(2 * (tf + r) < 0.8 * d and tw + 2 * r < bf)
        return i_section_from_dimensions("random I", d, bf, tw, tf, r)
    if kind == "IS":
        bt = draw(st.floats(0.2, 0.8)) * d
        bb = draw(st.floats(0.4, 1.6)) * bt
        tft, tfb = draw(st.floats(0.006, 0.05)), draw(st.floats(0.006, 0.05))
        tw = draw(st.floats(0.004, 0.03))
        assume(tft + tfb < 0.6 * d and tw < 0.5 * min(bt, bb))
        return singly_symmetric_i_from_dimensions("random IS", d, bt, tft, bb, tfb, tw)
    if kind == "T":
        d = d / 3
        bf = draw(st.floats(0.4, 1.5)) * d
        tf = draw(st.floats(0.05, 0.15)) * d
        tw = draw(st.floats(0.4, 1.0)) * tf
        return tee_from_dimensions("random T", d, bf, tw, tf, draw(st.floats(0.0, 1.0)) * tw)
    if kind == "L":
        b = d / 6
        t = draw(st.floats(0.04, 0.15)) * b
        return angle_from_dimensions("random L", b, b, t, draw(st.floats(0.0, 1.0)) * t)
    if kind == "HSS":
        b = draw(st.floats(0.3, 1.0)) * d / 2
        t = draw(st.floats(0.01, 0.12)) * b
        radius = draw(st.sampled_from([None, 1.5 * t, 2.5 * t]))
        return rect_hollow_from_dimensions("random HSS", d / 2, b, t, radius)
    od = d / 2
    return round_hollow_from_dimensions("random CHS", od, draw(st.floats(0.004, 0.1)) * od)


@st.composite
def case(draw: st.DrawFn) -> tuple[Section, Steel, str, bool]:
    grade = draw(st.sampled_from(GRADES))
    kind = draw(st.sampled_from(["I", "IS", "C", "T", "L", "2L", "HSS", "PIPE"]))
    from_table = kind in ("C", "2L") or (kind != "IS" and draw(st.booleans()))
    if from_table:
        section = lookup(draw(st.sampled_from(TABLE[kind])))
        assert section is not None
    else:
        section = draw(dimensioned(kind))
    try:
        steel = steel_from_name(grade, max(section.tf, section.tw))
    except ValueError:  # a plate beyond the grade's thickness table (EN 10025-2 Table 7)
        assume(False)
        raise
    assert steel is not None
    two_axes = section.family in (
        ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL, ShapeFamily.HOLLOW_RECT, ShapeFamily.HOLLOW_ROUND
    )  # fmt: skip
    axis = draw(st.sampled_from(["major", "minor"])) if two_axes else "major"
    assume(scope(section, steel, axis) == "")
    return section, steel, axis, draw(st.booleans())


def plastic_limit(section: Section, steel: Steel, axis: str, top: bool) -> float:
    """The family's cap on Mn as AISC 360-16 states it (see the module docstring)."""
    fy = steel.fy
    fam = section.family
    c = section.y_top if section.y_top > 0 else section.d / 2
    my = fy * section.Ix / max(c, section.d - c)
    if axis == "minor":
        z_cap = fy * section.Zy
        return min(z_cap, 1.6 * fy * section.Sy) if fam is not ShapeFamily.HOLLOW_RECT else z_cap
    if fam is ShapeFamily.TEE:
        return min(fy * section.Zx, 1.6 * my) if top else my
    if fam is ShapeFamily.ANGLE and section.pair_gap is not None:
        return min(fy * section.Zx, 1.6 * my) if top else 1.5 * my
    if fam is ShapeFamily.ANGLE:
        return 1.5 * my
    return fy * section.Zx


lengths = st.floats(0.0, 40.0, allow_nan=False)
cbs = st.floats(1.0, 3.0, allow_nan=False)


@settings(max_examples=300, deadline=None)
@given(case(), lengths, lengths, cbs)
def test_never_rises_with_lb(
    c: tuple[Section, Steel, str, bool], a: float, b: float, cb: float
) -> None:
    section, steel, axis, top = c
    lo, hi = sorted((a, b))
    r = flexure(section, steel, [lo, hi], [cb, cb], axis=axis, compression_top=top)
    assert np.all(np.isfinite(r.mn)) and np.all(r.mn > 0.0)
    assert r.mn[1] <= r.mn[0] * (1 + 1e-12)


@settings(max_examples=300, deadline=None)
@given(case(), lengths, cbs)
def test_never_exceeds_the_plastic_limit(
    c: tuple[Section, Steel, str, bool], lb: float, cb: float
) -> None:
    section, steel, axis, top = c
    r = flexure(section, steel, [lb], [cb], axis=axis, compression_top=top)
    limit = plastic_limit(section, steel, axis, top)
    assert r.mn[0] <= limit * (1 + 1e-9)
    assert r.mp[0] <= limit * (1 + 1e-9)
    assert r.design_strength[0] == r.mn[0] * 0.9


@settings(max_examples=200, deadline=None)
@given(case(), lengths, cbs, cbs)
def test_never_falls_with_cb(
    c: tuple[Section, Steel, str, bool], lb: float, a: float, b: float
) -> None:
    section, steel, axis, top = c
    lo, hi = sorted((a, b))
    r = flexure(section, steel, [lb, lb], [lo, hi], axis=axis, compression_top=top)
    assert r.mn[1] >= r.mn[0] * (1 - 1e-12)


@settings(max_examples=150, deadline=None)
@given(case())
def test_shear_is_positive_and_below_yield(c: tuple[Section, Steel, str, bool]) -> None:
    # Vn ≤ 0.6·Fy·Ag: no shear provision gives more than shear yielding of the section.
    section, steel, axis, _ = c
    v = shear(section, steel, axis=axis)
    assert 0.0 < v.vn <= 0.6 * steel.fy * section.A
    assert v.design_strength == v.vn * v.factor
