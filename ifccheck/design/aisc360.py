"""AISC 360-16 (ANSI/AISC 360-16, Specification for Structural Steel Buildings).

Chapter F flexure with Cb by Eq. F1-1:

- F2 / F3 doubly symmetric I-shapes with compact webs (flanges by Table B4.1b
  case 10 rolled, case 11 built-up) and compact channels, about the major axis —
  vectorised with numpy over every segment of a model (this module);
- F4 / F5 I-shapes with noncompact or slender webs and singly symmetric
  I-shapes; F6 I-shapes and channels about the minor axis; F7 rectangular HSS;
  F8 round HSS and pipe; F9 tees and double angles; F10 equal-leg single angles
  about a geometric axis (``aisc360_shapes``);
- Chapter G shear for each of them (``aisc360_shear``).

``scope()`` names the clause of anything not covered. Units: SI base units
throughout (Pa, m, N, N·m).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ifccheck.design import aisc360_shapes as fam
from ifccheck.design import aisc360_shear
from ifccheck.design.aisc360_shapes import LIMIT_STATES, FamilyFlexure
from ifccheck.design.aisc360_shear import (
    KV_UNSTIFFENED,
    OMEGA_V,
    OMEGA_V_ROLLED,
    PHI_V,
    PHI_V_ROLLED,
)
from ifccheck.design.base import (
    AxialCapacity,
    BraceNeed,
    DesignStandard,
    FlexureResult,
    FloatArray,
    Method,
    ShearResult,
    check_method,
    register_standard,
    segment_moments,
)
from ifccheck.errors import OutOfScope
from ifccheck.model import Section, ShapeFamily, Steel
from ifccheck.sections.classify import Axis, classify_flexure, is_built_up
from ifccheck.sections.shapes import flanges, is_singly_symmetric_i

NAME = "AISC 360-16"

PHI_B = 0.90  # AISC 360-16 F1(1)
OMEGA_B = 1.67

_YIELD, _INELASTIC, _ELASTIC, _FLB = fam.YIELD, fam.INELASTIC, fam.ELASTIC, fam.FLB


def flexure_factor(method: str) -> float:
    """φb (LRFD) or Ωb (ASD)."""
    return PHI_B if check_method(method) == "LRFD" else OMEGA_B


def _design(mn: FloatArray, method: Method, factor: float) -> FloatArray:
    return mn * factor if method == "LRFD" else mn / factor


@dataclass(frozen=True)
class _Constants:
    """F2/F3 values that depend only on the section and the steel (arrays)."""

    mp: FloatArray  # Eq. F2-1
    mr: FloatArray  # 0.7·Fy·Sx
    lp: FloatArray  # Eq. F2-5
    lr: FloatArray  # Eq. F2-6
    slope: FloatArray  # (Mp − Mr)/(Lr − Lp), Eq. F2-2
    pe: FloatArray  # π²·E·Sx·rts², Eqs. F2-3/F2-4
    a: FloatArray  # 0.078·Jc/(Sx·ho)/rts², Eq. F2-4
    flb: FloatArray  # Eq. F3-1 / F3-2; +inf for compact flanges

    def take(self, index: NDArray[np.intp]) -> _Constants:
        return _Constants(*(getattr(self, f)[index] for f in self.__dataclass_fields__))


def _constants(
    fy: FloatArray,
    e: FloatArray,
    zx: FloatArray,
    sx: FloatArray,
    ry: FloatArray,
    rts: FloatArray,
    j: FloatArray,
    ho: FloatArray,
    c: FloatArray,
    lam: FloatArray,
    htw: FloatArray,
    built_up: FloatArray,
) -> _Constants:
    root = np.sqrt(e / fy)
    mp = fy * zx  # Eq. F2-1
    mr = 0.7 * fy * sx
    lp = 1.76 * ry * root  # Eq. F2-5
    jc = j * c / (sx * ho)
    ratio = 0.7 * fy / e
    lr = 1.95 * rts / ratio * np.sqrt(jc + np.sqrt(jc * jc + 6.76 * ratio * ratio))  # Eq. F2-6
    # Compression flange local buckling, F3.2.
    lam_pf = 0.38 * root  # Table B4.1b cases 10 and 11
    kc = np.clip(4.0 / np.sqrt(htw), 0.35, 0.76)  # Table B4.1b note [a]
    # λrf: case 10 (rolled) 1.0√(E/Fy); case 11 (built-up) 0.95√(kc·E/FL), FL = 0.7Fy
    # for doubly symmetric sections (note [b]).
    lam_rf = np.where(built_up > 0.0, 0.95 * np.sqrt(kc * e / (0.7 * fy)), 1.0 * root)
    flb_noncompact = mp - (mp - mr) * (lam - lam_pf) / (lam_rf - lam_pf)  # Eq. F3-1
    flb_slender = 0.9 * e * kc * sx / lam**2  # Eq. F3-2
    flb = np.where(lam <= lam_pf, np.inf, np.where(lam <= lam_rf, flb_noncompact, flb_slender))
    inv_rts2 = 1.0 / (rts * rts)
    return _Constants(
        mp=mp,
        mr=mr,
        lp=lp,
        lr=lr,
        slope=(mp - mr) / (lr - lp),
        pe=np.pi**2 * e * sx * rts * rts,
        a=0.078 * jc * inv_rts2,
        flb=flb,
    )


def _evaluate(k: _Constants, lb: FloatArray, cb: FloatArray, method: Method) -> FlexureResult:
    """Per-segment LTB (F2.2) and FLB (F3.2) from the section constants."""
    if np.any(~(lb >= 0.0)):
        raise ValueError("unbraced length Lb must be non-negative")
    if np.any(~(cb > 0.0)):
        raise ValueError("Cb must be positive")
    inelastic = cb * (k.mp - k.slope * (lb - k.lp))  # Eq. F2-2
    l2 = np.maximum(lb, k.lr)  # the elastic branch is used only where Lb > Lr
    l2 *= l2
    elastic = cb * k.pe / l2 * np.sqrt(1.0 + k.a * l2)  # Eqs. F2-3, F2-4
    in_plastic = lb <= k.lp
    in_inelastic = lb <= k.lr
    ltb = np.where(in_inelastic, inelastic, elastic)
    code = np.where(in_inelastic, np.int8(_INELASTIC), np.int8(_ELASTIC))
    capped = in_plastic | (ltb >= k.mp)  # Cb scaling reached Mp: yielding governs
    ltb = np.where(capped, k.mp, ltb)
    code[capped] = _YIELD
    flb_governs = k.flb < ltb
    mn = np.where(flb_governs, k.flb, ltb)
    code[flb_governs] = _FLB
    factor = flexure_factor(method)
    return FlexureResult(
        mp=k.mp,
        mn=mn,
        design_strength=_design(mn, method, factor),
        limit_state=LIMIT_STATES[code],
        lp=k.lp,
        lr=k.lr,
        mr=k.mr,
        factor=factor,
        method=method,
    )


def flexure_arrays(
    *,
    Fy: ArrayLike,
    E: ArrayLike,
    Zx: ArrayLike,
    Sx: ArrayLike,
    ry: ArrayLike,
    rts: ArrayLike,
    J: ArrayLike,
    ho: ArrayLike,
    c: ArrayLike,
    lambda_f: ArrayLike,
    h_tw: ArrayLike,
    Lb: ArrayLike,
    Cb: ArrayLike = 1.0,
    method: str = "LRFD",
    built_up: ArrayLike = 0.0,
) -> FlexureResult:
    """AISC 360-16 F2/F3 major-axis flexure for arrays of segments (broadcast together).

    Per segment: yield stress Fy and modulus E (Pa), section properties (SI),
    c (1.0 for doubly symmetric I-shapes, Eq. F2-8a; (ho/2)√(Iy/Cw) for
    channels, Eq. F2-8b), flange slenderness λf, web slenderness h/tw (for kc),
    unbraced length Lb (m), Cb and ``built_up`` (1 for built-up sections:
    Table B4.1b case 11 instead of case 10 for the flange limit λrf). The
    caller keeps to the scope of F2/F3 (compact webs; channels with compact
    flanges): see ``AISC360.scope``.
    """
    m = check_method(method)
    arrays = np.broadcast_arrays(
        *(
            np.atleast_1d(np.asarray(v, dtype=float))
            for v in (Fy, E, Zx, Sx, ry, rts, J, ho, c, lambda_f, h_tw, built_up, Lb, Cb)
        )
    )
    *props, lb, cb = arrays
    return _evaluate(_constants(*props), lb, cb, m)


def torsion_c(section: Section) -> float:
    """c of Eq. F2-8a (doubly symmetric I: 1.0) or F2-8b (channel: (ho/2)√(Iy/Cw))."""
    if section.family is ShapeFamily.CHANNEL:
        return section.ho / 2.0 * float(np.sqrt(section.Iy / section.Cw))
    return 1.0


def _properties(section: Section, steel: Steel) -> dict[str, float]:
    return {
        "Fy": steel.fy,
        "E": steel.E,
        "Zx": section.Zx,
        "Sx": section.Sx,
        "ry": section.ry,
        "rts": section.rts,
        "J": section.J,
        "ho": section.ho,
        "c": torsion_c(section),
        "lambda_f": section.flange_slenderness,
        "h_tw": section.web_slenderness,
        "built_up": float(section.family is ShapeFamily.I_SHAPE and is_built_up(section)),
    }


# Properties each family needs, besides d, tw and tf (major axis; minor axis of I/C below).
_NEEDED: dict[ShapeFamily, tuple[str, ...]] = {
    ShapeFamily.I_SHAPE: ("Zx", "Sx", "Iy", "ry", "rts", "J", "Cw", "ho", "h", "bf"),
    ShapeFamily.CHANNEL: ("Zx", "Sx", "Iy", "ry", "rts", "J", "Cw", "ho", "h", "bf"),
    ShapeFamily.TEE: ("Zx", "Sx", "Ix", "Iy", "ry", "J", "bf"),
    ShapeFamily.ANGLE: ("Sx", "Ix", "bf"),
    ShapeFamily.HOLLOW_RECT: ("A", "Zx", "Sx", "Zy", "Sy", "Ix", "Iy", "ry", "J", "h", "bf"),
    ShapeFamily.HOLLOW_ROUND: ("Zx", "Sx"),
}
_NEEDED_MINOR = ("Zy", "Sy", "bf")
# Unstiffened girders: h/tw ≤ 260 and ≤ 0.40E/Fy (a/h > 1.5), aw ≤ 10 (F13.2).
_H_TW_UNSTIFFENED = 260.0
_AW_MAX = 10.0


def _check_axis(axis: str) -> Axis:
    if axis not in ("major", "minor"):
        raise ValueError(f"axis must be 'major' or 'minor', got {axis!r}")
    return axis  # type: ignore[return-value]


def scope(section: Section, steel: Steel | None = None, axis: str = "major") -> str:
    """'' when AISC 360-16 Chapter F (as implemented) covers bending of the section
    about ``axis``, else the reason naming the clause.

    Without a steel only the family, the axis and the properties are checked;
    with one, also the slenderness limits that depend on Fy.
    """
    ax = _check_axis(axis)
    fam_ = section.family
    if fam_ is ShapeFamily.OTHER:
        return "section family not covered by AISC 360-16 Chapter F as implemented (F2 to F10)"
    needed = _NEEDED_MINOR if ax == "minor" and fam_ in _I_OR_C else _NEEDED[fam_]
    missing = [p for p in ("d", "tw", "tf", *needed) if not getattr(section, p) > 0.0]
    if missing:
        return f"missing section properties ({', '.join(missing)}) needed by AISC 360-16 F"
    if fam_ in _I_OR_C:
        return "" if ax == "minor" else _scope_i(section, steel)
    if fam_ is ShapeFamily.TEE:
        if ax == "minor":
            return "tee bent about its axis of symmetry: AISC 360-16 F12 not implemented"
        return ""
    if fam_ is ShapeFamily.ANGLE:
        if section.pair_gap is not None:
            if ax == "minor":
                return (
                    "double angle bent about its axis of symmetry: AISC 360-16 F12 not implemented"
                )
            return ""
        if not fam.is_equal_leg(section):
            return (
                "unequal-leg angle: AISC 360-16 F10 bending about a geometric axis is covered "
                "for equal legs only; principal-axis bending (F10.2(1)) is not implemented"
            )
        return ""
    if fam_ is ShapeFamily.HOLLOW_ROUND and steel is not None:
        d_t = section.d / section.tf
        if d_t >= 0.45 * steel.E / steel.fy:
            return f"round HSS with D/t = {d_t:.0f} ≥ 0.45E/Fy: outside AISC 360-16 F8"
    return ""


_I_OR_C = (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL)


def _scope_i(section: Section, steel: Steel | None) -> str:
    """Major-axis scope of I-shapes (F2 to F5, F13.2 limits) and channels (F2)."""
    if section.family is ShapeFamily.CHANNEL:
        if steel is None:
            return ""
        cls = classify_flexure(section, steel.fy, steel.E)
        if cls.web_class != "compact":
            return f"channel with {cls.web_class} web: AISC 360-16 F2 covers compact channels only"
        if cls.flange_class != "compact":
            return (
                f"channel with {cls.flange_class} flanges: "
                "AISC 360-16 F2 covers compact channels only"
            )
        return ""
    singly = is_singly_symmetric_i(section)
    if singly:
        (bft, tft), _ = flanges(section)
        ratio = tft * bft**3 / 12.0 / section.Iy
        if not 0.1 <= ratio <= 0.9:
            return (
                f"singly symmetric I with Iyc/Iy = {ratio:.2f} outside 0.1 to 0.9: "
                "AISC 360-16 F13.2 (F13-2)"
            )
    if steel is None:
        return ""
    if not singly and section.web_slenderness <= 5.70 * math.sqrt(steel.E / steel.fy):
        return ""  # compact or noncompact web (Table B4.1b case 15): F2 to F4
    for top in (True, False) if singly else (True,):
        cls = classify_flexure(section, steel.fy, steel.E, top)
        if cls.web_class != "slender":
            continue
        limit = min(_H_TW_UNSTIFFENED, 0.40 * steel.E / steel.fy)
        if section.web_slenderness > limit:
            return (
                f"slender web h/tw = {section.web_slenderness:.0f} above {limit:.0f} "
                "for a girder without stiffeners: AISC 360-16 F13.2"
            )
        aw = fam.i_web_ratio(section, top)
        if aw > _AW_MAX:
            return f"web to compression flange area aw = {aw:.1f} above 10: AISC 360-16 F13.2"
    return ""


def _is_fast(section: Section, steel: Steel) -> bool:
    """Major-axis F2/F3 sections, evaluated on the vectorised path."""
    if section.family is ShapeFamily.CHANNEL:
        return True
    if section.family is not ShapeFamily.I_SHAPE or is_singly_symmetric_i(section):
        return False
    # compact web, Table B4.1b case 15: h/tw ≤ 3.76√(E/Fy)
    return section.web_slenderness <= 3.76 * math.sqrt(steel.E / steel.fy)


def _side_matters(section: Section) -> bool:
    """Whether the strength depends on which side is in compression."""
    return section.family in (ShapeFamily.TEE, ShapeFamily.ANGLE) or is_singly_symmetric_i(section)


def family_flexure(
    section: Section,
    steel: Steel,
    lb: FloatArray,
    cb: FloatArray,
    axis: Axis = "major",
    compression_top: bool = True,
) -> FamilyFlexure:
    """Mn by the clause that applies to the section (F2/F3 sections excluded: see flexure)."""
    f = section.family
    if f in _I_OR_C and axis == "minor":
        return fam.f6(section, steel, lb)
    if f is ShapeFamily.I_SHAPE:
        web = classify_flexure(section, steel.fy, steel.E, compression_top).web_class
        if web == "slender":
            return fam.f5(section, steel, lb, cb, compression_top)
        return fam.f4(section, steel, lb, cb, compression_top)
    if f is ShapeFamily.TEE or (f is ShapeFamily.ANGLE and section.pair_gap is not None):
        return fam.f9(section, steel, lb, cb, compression_top)
    if f is ShapeFamily.ANGLE:
        return fam.f10(section, steel, lb, cb, compression_top)
    if f is ShapeFamily.HOLLOW_RECT:
        return fam.f7(section, steel, lb, cb, axis == "minor")
    if f is ShapeFamily.HOLLOW_ROUND:
        return fam.f8(section, steel, lb)
    raise OutOfScope(f"{section.name}: no Chapter F provision for this family and axis")


def _validate(lb: FloatArray, cb: FloatArray) -> None:
    if np.any(~(lb >= 0.0)):
        raise ValueError("unbraced length Lb must be non-negative")
    if np.any(~(cb > 0.0)):
        raise ValueError("Cb must be positive")


@dataclass
class _Collected:
    """Per-segment output arrays filled group by group."""

    n: int

    def __post_init__(self) -> None:
        self.arrays = {f: np.zeros(self.n) for f in ("mp", "mn", "lp", "lr", "mr")}
        self.states = np.empty(self.n, dtype=object)

    def put(self, sel: NDArray[np.intp], r: FamilyFlexure) -> None:
        a = self.arrays
        a["mn"][sel] = r.mn
        a["mp"][sel], a["lp"][sel], a["lr"][sel], a["mr"][sel] = r.mp, r.lp, r.lr, r.mr
        self.states[sel] = LIMIT_STATES[r.code]

    def put_result(self, sel: NDArray[np.intp], r: FlexureResult) -> None:
        for f in self.arrays:
            self.arrays[f][sel] = getattr(r, f)
        self.states[sel] = r.limit_state

    def result(self, method: Method) -> FlexureResult:
        factor = flexure_factor(method)
        a = self.arrays
        return FlexureResult(
            mp=a["mp"],
            mn=a["mn"],
            design_strength=_design(a["mn"], method, factor),
            limit_state=self.states,
            lp=a["lp"],
            lr=a["lr"],
            mr=a["mr"],
            factor=factor,
            method=method,
        )


def flexure(
    section: Section,
    steel: Steel,
    lb: ArrayLike,
    cb: ArrayLike = 1.0,
    method: str = "LRFD",
    *,
    axis: str = "major",
    compression_top: ArrayLike | None = None,
) -> FlexureResult:
    """Chapter F flexural strength of one section for arrays of Lb and Cb.

    ``axis`` is the axis of bending ("major": x, "minor": y); ``compression_top``
    (per segment) says which side is in compression where it matters (singly
    symmetric I-shapes, tees, angles); None — not known — takes the weaker side.
    OutOfScope names the clause not covered.
    """
    m = check_method(method)
    ax = _check_axis(axis)
    reason = scope(section, steel, ax)
    if reason:
        raise OutOfScope(f"{section.name}: {reason}")
    if ax == "major" and _is_fast(section, steel):
        return flexure_arrays(**_properties(section, steel), Lb=lb, Cb=cb, method=m)
    lb_a, cb_a = np.broadcast_arrays(
        np.atleast_1d(np.asarray(lb, dtype=float)), np.atleast_1d(np.asarray(cb, dtype=float))
    )
    _validate(lb_a, cb_a)
    sides = _sides(compression_top, lb_a.shape, _side_matters(section))
    out = _Collected(lb_a.size)
    for side in np.unique(sides):
        sel = np.flatnonzero(sides == side)
        _put_family(out, sel, section, steel, lb_a[sel], cb_a[sel], ax, int(side))
    return out.result(m)


_UNKNOWN_SIDE = -1  # side codes: 1 top in compression, 0 bottom, -1 not known


def _sides(
    compression_top: ArrayLike | None, shape: tuple[int, ...], matters: bool
) -> NDArray[np.int8]:
    """Per-segment side codes (1 top, 0 bottom, −1 not known); 1 where the side does not matter."""
    if not matters:
        return np.ones(shape, dtype=np.int8)
    if compression_top is None:
        return np.full(shape, _UNKNOWN_SIDE, dtype=np.int8)
    top = np.broadcast_to(np.asarray(compression_top, dtype=bool), shape)
    return top.astype(np.int8)


def _put_family(
    out: _Collected,
    sel: NDArray[np.intp],
    section: Section,
    steel: Steel,
    lb: FloatArray,
    cb: FloatArray,
    axis: Axis,
    side: int,
) -> None:
    """Evaluate one (section, axis, side) group into ``out``; side −1 keeps the weaker."""
    if side != _UNKNOWN_SIDE:
        out.put(sel, family_flexure(section, steel, lb, cb, axis, bool(side)))
        return
    top = family_flexure(section, steel, lb, cb, axis, True)
    bottom = family_flexure(section, steel, lb, cb, axis, False)
    out.put(sel, top)
    lower = bottom.mn < top.mn
    if lower.any():
        b = bottom
        out.put(sel[lower], FamilyFlexure(b.mn[lower], b.code[lower], b.mp, b.lp, b.lr, b.mr))


def flexure_segments(
    pairs: Sequence[tuple[Section, Steel]],
    index: ArrayLike,
    lb: ArrayLike,
    cb: ArrayLike = 1.0,
    method: str = "LRFD",
    *,
    axis: ArrayLike = "major",
    compression_top: ArrayLike | None = None,
) -> FlexureResult:
    """Flexure of a whole model in one call.

    ``pairs`` are the distinct (section, steel) combinations, ``index`` gives
    for each segment the position of its pair; ``lb``, ``cb``, ``axis`` and
    ``compression_top`` are per segment (or scalars; None for "not known": the
    weaker side of sections that are not doubly symmetric). F2/F3 sections go through
    one vectorised evaluation; the others are evaluated per (pair, axis, side).
    OutOfScope names every pair that Chapter F (as implemented) does not cover.
    """
    idx0 = np.asarray(index, dtype=np.intp)
    axes = np.asarray(axis)
    scalar_axis = axes.ndim == 0
    if scalar_axis:
        used = [(k, _check_axis(str(axes))) for k in range(len(pairs))]
    else:
        minor_all = np.broadcast_to(axes, np.shape(idx0)) == "minor"
        if not np.all(minor_all | (np.broadcast_to(axes, np.shape(idx0)) == "major")):
            raise ValueError("axis must be 'major' or 'minor' for every segment")
        used = sorted(
            {(int(k), "minor" if mi else "major") for k, mi in zip(idx0.ravel(), minor_all.ravel(),
                                                                   strict=True)}
        )  # fmt: skip
    problems = [
        f"{pairs[k][0].name} ({pairs[k][1].grade}): {r}"
        for k, ax in used
        if (r := scope(pairs[k][0], pairs[k][1], ax))
    ]
    if problems:
        raise OutOfScope("; ".join(problems))
    if not pairs:
        raise ValueError("no (section, steel) pairs given")
    m = check_method(method)
    lb_a, cb_a, idx = np.broadcast_arrays(
        np.atleast_1d(np.asarray(lb, dtype=float)), np.atleast_1d(np.asarray(cb, dtype=float)), idx0
    )
    fast_pair = np.array([_is_fast(s, g) for s, g in pairs])
    if scalar_axis and str(axes) == "major" and fast_pair.all():
        # The whole model is F2/F3: section constants once per pair, gathered per segment.
        props = [_properties(s, g) for s, g in pairs]
        columns = [np.array([p[key] for p in props], dtype=float) for key in props[0]]
        return _evaluate(_constants(*columns).take(idx), lb_a, cb_a, m)
    _validate(lb_a, cb_a)
    minor = np.broadcast_to(axes == "minor", idx.shape)
    sides = _sides(compression_top, idx.shape, True)
    out = _Collected(idx.size)
    fast = fast_pair[idx] & ~minor
    sel = np.flatnonzero(fast)
    if sel.size:
        fast_ids = np.flatnonzero(fast_pair)
        remap = np.full(len(pairs), -1, dtype=np.intp)
        remap[fast_ids] = np.arange(fast_ids.size)
        props = [_properties(*pairs[int(k)]) for k in fast_ids]
        columns = [np.array([p[key] for p in props], dtype=float) for key in props[0]]
        k = _constants(*columns).take(remap[idx[sel]])
        out.put_result(sel, _evaluate(k, lb_a[sel], cb_a[sel], m))
    rest = np.flatnonzero(~fast)
    if rest.size:
        sided = np.array([_side_matters(s) for s, _ in pairs])
        side_code = np.where(sided[idx[rest]], sides[rest], 1).astype(np.int64) + 1  # 0, 1, 2
        key = idx[rest].astype(np.int64) * 8 + minor[rest] * 4 + side_code
        order = np.argsort(key, kind="stable")
        groups, starts = np.unique(key[order], return_index=True)
        for g, lo, hi in zip(groups, starts, [*starts[1:], order.size], strict=True):
            part = rest[order[lo:hi]]
            k_pair, ax_bit, side = int(g) // 8, (int(g) // 4) % 2, int(g) % 4 - 1
            section, steel = pairs[k_pair]
            ax: Axis = "minor" if ax_bit else "major"
            _put_family(out, part, section, steel, lb_a[part], cb_a[part], ax, side)
    return out.result(m)


# --- Cb, AISC 360-16 Eq. F1-1 -------------------------------------------------


def cb_f1_1(m_max: ArrayLike, m_a: ArrayLike, m_b: ArrayLike, m_c: ArrayLike) -> FloatArray:
    """Cb = 12.5|Mmax| / (2.5|Mmax| + 3|MA| + 4|MB| + 3|MC|), Eq. F1-1.

    Mmax is the largest absolute moment in the unbraced segment and MA, MB, MC
    those at its quarter, centre and three-quarter points; Cb ≥ 1.0 when Mmax
    is truly the largest. A segment with no moment gets Cb = 1.0.
    """
    mx, a, b, c = (np.abs(np.asarray(v, dtype=float)) for v in (m_max, m_a, m_b, m_c))
    # Divide through by Mmax first so that a uniform moment gives exactly 1.0.
    safe = np.where(mx > 0.0, mx, 1.0)
    cb = 12.5 / (2.5 + 3.0 * (a / safe) + 4.0 * (b / safe) + 3.0 * (c / safe))
    return np.asarray(np.where(mx > 0.0, cb, 1.0), dtype=float)


def cb_from_diagram(
    x: ArrayLike,
    m: ArrayLike,
    start: ArrayLike,
    end: ArrayLike,
    cantilever: ArrayLike = False,
) -> FloatArray:
    """Cb (Eq. F1-1) of each segment [start, end] of a sampled moment diagram.

    ``cantilever`` marks segments with a free, unbraced tip: Cb = 1.0 there
    (AISC 360-16 Commentary to F1).
    """
    m_max, m_a, m_b, m_c = segment_moments(x, m, start, end)
    cb = cb_f1_1(m_max, m_a, m_b, m_c)
    return np.where(np.broadcast_to(np.asarray(cantilever, dtype=bool), cb.shape), 1.0, cb)


# --- Shear, AISC 360-16 G2.1 --------------------------------------------------


def shear_arrays(
    *,
    Fy: ArrayLike,
    E: ArrayLike,
    d: ArrayLike,
    tw: ArrayLike,
    h_tw: ArrayLike,
    rolled_i: ArrayLike,
    method: str = "LRFD",
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    """(Vn, design strength, Cv1, factor) per member, G2.1, Aw = d·tw.

    ``rolled_i`` marks rolled I-shapes, for which G2.1(a) applies where
    h/tw ≤ 2.24√(E/Fy); everything else (built-up I, channels) uses G2.1(b)
    with kv = 5.34.
    """
    m = check_method(method)
    fy, e, d_, tw_, htw, rolled = np.broadcast_arrays(
        *(np.atleast_1d(np.asarray(v, dtype=float)) for v in (Fy, E, d, tw, h_tw, rolled_i))
    )
    case_a = (rolled > 0.0) & (htw <= 2.24 * np.sqrt(e / fy))
    limit_b = 1.10 * np.sqrt(KV_UNSTIFFENED * e / fy)
    cv1 = np.where(case_a | (htw <= limit_b), 1.0, limit_b / htw)  # Eqs. G2-3, G2-4
    vn = 0.6 * fy * d_ * tw_ * cv1  # Eq. G2-1
    if m == "LRFD":
        factor = np.where(case_a, PHI_V_ROLLED, PHI_V)
        design = vn * factor
    else:
        factor = np.where(case_a, OMEGA_V_ROLLED, OMEGA_V)
        design = vn / factor
    return vn, design, cv1, factor


def is_rolled(section: Section) -> bool:
    """Rolled rather than built-up (the one decision: ``sections.classify.is_built_up``)."""
    return not is_built_up(section)


def shear(
    section: Section,
    steel: Steel,
    method: str = "LRFD",
    rolled: bool | None = None,
    *,
    axis: str = "major",
    lv: float | None = None,
) -> ShearResult:
    """Chapter G shear strength (G2.1 webs, G3 tees and angles, G4 rectangular HSS,
    G5 round HSS, G6 minor-axis I-shapes and channels); see ``aisc360_shear``."""
    return aisc360_shear.shear(section, steel, method, _check_axis(axis), rolled, lv)


def strength_curve(
    section: Section,
    steel: Steel,
    cb: float = 1.0,
    method: str = "LRFD",
    lb_max: float | None = None,
    n: int = 200,
    *,
    axis: str = "major",
    compression_top: bool | None = None,
) -> tuple[FloatArray, FloatArray, NDArray[np.object_]]:
    """(Lb, design strength, limit state) from Lb = 0 to lb_max (default 1.5·Lr)."""
    curve = AISC360().strength_curve(
        section, steel, cb, method, lb_max, n, axis=axis, compression_top=compression_top
    )
    return curve.lb, curve.design_strength, curve.limit_state


class AISC360(DesignStandard):
    """AISC 360-16 behind the design-standard interface."""

    name = NAME

    def point_brace(
        self, mr: float, ho: float, lbr: float, method: str = "LRFD", cd: float = 1.0
    ) -> BraceNeed:
        from ifccheck.design.aisc360_members import point_brace_requirement

        need = point_brace_requirement(mr, ho, lbr, method, cd)
        return BraceNeed(need.strength, need.stiffness, need.clause)

    def torsional_brace(
        self, mr: float, span: float, braces: int, cb: float, section: Section, steel: Steel,
        method: str = "LRFD", *, compression_top: bool = True,
    ) -> BraceNeed:  # fmt: skip
        from ifccheck.design.aisc360_members import torsional_brace_requirement

        need = torsional_brace_requirement(
            mr, span, braces, cb, section, steel, method, compression_top=compression_top
        )
        return BraceNeed(need.moment, need.required_stiffness, need.clause)

    def axial_strength(
        self, section: Section, steel: Steel, length: float, method: str = "LRFD"
    ) -> AxialCapacity:
        from ifccheck.design.aisc360_members import compression_strength, tension_strength

        c = compression_strength(section, steel, length, method)
        t = tension_strength(section, steel, method)
        return AxialCapacity(c.design_strength, t.design_strength, f"{c.clause}; {t.clause}")

    def scope(self, section: Section, steel: Steel | None = None, axis: str = "major") -> str:
        return scope(section, steel, axis)

    def flexure(
        self,
        section: Section,
        steel: Steel,
        lb: ArrayLike,
        cb: ArrayLike = 1.0,
        method: str = "LRFD",
        *,
        axis: str = "major",
        compression_top: ArrayLike | None = None,
    ) -> FlexureResult:
        return flexure(section, steel, lb, cb, method, axis=axis, compression_top=compression_top)

    def shear(
        self, section: Section, steel: Steel, method: str = "LRFD", *, axis: str = "major"
    ) -> ShearResult:
        return shear(section, steel, method, axis=axis)

    def moment_gradient(
        self,
        x: ArrayLike,
        m: ArrayLike,
        start: ArrayLike,
        end: ArrayLike,
        cantilever: ArrayLike = False,
    ) -> FloatArray:
        """Cb by Eq. F1-1 (1.0 for a cantilever with a free unbraced tip)."""
        return cb_from_diagram(x, m, start, end, cantilever)

    def flexure_many(
        self,
        pairs: Sequence[tuple[Section, Steel]],
        index: ArrayLike,
        lb: ArrayLike,
        cb: ArrayLike,
        method: str = "LRFD",
        *,
        axis: ArrayLike = "major",
        compression_top: ArrayLike | None = None,
    ) -> FlexureResult:
        return flexure_segments(
            pairs, index, lb, cb, method, axis=axis, compression_top=compression_top
        )


register_standard(NAME, AISC360)
