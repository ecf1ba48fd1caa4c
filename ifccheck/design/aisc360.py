"""AISC 360-16 (ANSI/AISC 360-16, Specification for Structural Steel Buildings).

Covered: Chapter F major-axis flexure of doubly symmetric I-shapes with
compact webs (F2 compact flanges; F3 noncompact or slender flanges) and of
compact channels (F2), with Cb by Eq. F1-1; Chapter G web shear (G2.1) of
I-shapes and channels. Everything is vectorised with numpy over segments.
Units: SI base units throughout (Pa, m, N, N·m).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ifccheck.design.base import (
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
from ifccheck.sections.classify import classify_flexure
from ifccheck.sections.table import SOURCE as TABLE_SOURCE

NAME = "AISC 360-16"

PHI_B = 0.90  # AISC 360-16 F1(1)
OMEGA_B = 1.67
PHI_V_ROLLED = 1.00  # AISC 360-16 G2.1(a)
OMEGA_V_ROLLED = 1.50
PHI_V = 0.90  # AISC 360-16 G1
OMEGA_V = 1.67
KV_UNSTIFFENED = 5.34  # AISC 360-16 G2.1(b)(2)(i), webs without transverse stiffeners

# Limit-state names; index = the code used internally.
# An object array: gathering Python str references is several times faster than
# building fixed-width numpy strings for a million segments.
LIMIT_STATES = np.array(
    ["yielding", "inelastic_ltb", "elastic_ltb", "flange_local_buckling"], dtype=object
)
_YIELD, _INELASTIC, _ELASTIC, _FLB = 0, 1, 2, 3


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
) -> _Constants:
    root = np.sqrt(e / fy)
    mp = fy * zx  # Eq. F2-1
    mr = 0.7 * fy * sx
    lp = 1.76 * ry * root  # Eq. F2-5
    jc = j * c / (sx * ho)
    ratio = 0.7 * fy / e
    lr = 1.95 * rts / ratio * np.sqrt(jc + np.sqrt(jc * jc + 6.76 * ratio * ratio))  # Eq. F2-6
    # Compression flange local buckling, F3.2.
    lam_pf = 0.38 * root  # Table B4.1b case 10
    lam_rf = 1.0 * root
    kc = np.clip(4.0 / np.sqrt(htw), 0.35, 0.76)  # Table B4.1b note [a]
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
) -> FlexureResult:
    """AISC 360-16 F2/F3 major-axis flexure for arrays of segments (broadcast together).

    Per segment: yield stress Fy and modulus E (Pa), section properties (SI),
    c (1.0 for doubly symmetric I-shapes, Eq. F2-8a; (ho/2)√(Iy/Cw) for
    channels, Eq. F2-8b), flange slenderness λf, web slenderness h/tw (for kc),
    unbraced length Lb (m) and Cb. The caller keeps to the scope of F2/F3
    (compact webs; channels with compact flanges): see ``AISC360.scope``.
    """
    m = check_method(method)
    arrays = np.broadcast_arrays(
        *(
            np.atleast_1d(np.asarray(v, dtype=float))
            for v in (Fy, E, Zx, Sx, ry, rts, J, ho, c, lambda_f, h_tw, Lb, Cb)
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
    }


_FAMILY_SCOPE = {
    ShapeFamily.HOLLOW_RECT: "rectangular HSS: AISC 360-16 F7 not implemented",
    ShapeFamily.HOLLOW_ROUND: "round HSS or pipe: AISC 360-16 F8 not implemented",
    ShapeFamily.TEE: "tee: AISC 360-16 F9 not implemented",
    ShapeFamily.ANGLE: "angle: AISC 360-16 F10 not implemented",
    ShapeFamily.OTHER: "section family not covered by the implemented AISC 360-16 F2/F3",
}


def scope(section: Section, steel: Steel | None = None) -> str:
    """'' when AISC 360-16 F2/F3 (as implemented) cover the section, else why not.

    Without a steel only the family and the properties are checked; with one,
    also the web and (for channels) flange slenderness at its Fy.
    """
    reason = _FAMILY_SCOPE.get(section.family)
    if reason is not None:
        return reason
    needed = ("Zx", "Sx", "Iy", "ry", "rts", "J", "Cw", "ho", "tw", "tf", "h", "bf")
    missing = [p for p in needed if not getattr(section, p) > 0.0]
    if missing:
        return f"missing section properties ({', '.join(missing)}) needed by AISC 360-16 F2"
    if steel is None:
        return ""
    cls = classify_flexure(section, steel.fy, steel.E)
    if cls.web_class == "noncompact":
        return "noncompact web: AISC 360-16 F4 not implemented"
    if cls.web_class == "slender":
        return "slender web: AISC 360-16 F5 not implemented"
    if section.family is ShapeFamily.CHANNEL and cls.flange_class != "compact":
        return (
            f"channel with {cls.flange_class} flanges: AISC 360-16 F2 covers compact channels only"
        )
    return ""


def flexure(
    section: Section,
    steel: Steel,
    lb: ArrayLike,
    cb: ArrayLike = 1.0,
    method: str = "LRFD",
) -> FlexureResult:
    """F2/F3 flexural strength of one section for arrays of Lb and Cb."""
    reason = scope(section, steel)
    if reason:
        raise OutOfScope(f"{section.name}: {reason}")
    return flexure_arrays(**_properties(section, steel), Lb=lb, Cb=cb, method=method)


def flexure_segments(
    pairs: Sequence[tuple[Section, Steel]],
    index: ArrayLike,
    lb: ArrayLike,
    cb: ArrayLike = 1.0,
    method: str = "LRFD",
) -> FlexureResult:
    """Flexure of a whole model in one call.

    ``pairs`` are the distinct (section, steel) combinations, ``index`` gives
    for each segment the position of its pair; ``lb`` and ``cb`` are per
    segment. OutOfScope names every pair that F2/F3 do not cover.
    """
    problems = [f"{s.name} ({g.grade}): {r}" for s, g in pairs if (r := scope(s, g))]
    if problems:
        raise OutOfScope("; ".join(problems))
    if not pairs:
        raise ValueError("no (section, steel) pairs given")
    m = check_method(method)
    idx = np.asarray(index, dtype=np.intp)
    props = [_properties(s, g) for s, g in pairs]
    columns = [np.array([p[key] for p in props], dtype=float) for key in props[0]]
    lb_a, cb_a, idx = np.broadcast_arrays(
        np.atleast_1d(np.asarray(lb, dtype=float)), np.atleast_1d(np.asarray(cb, dtype=float)), idx
    )
    # Section constants once per pair, then gathered per segment.
    return _evaluate(_constants(*columns).take(idx), lb_a, cb_a, m)


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
    """Rolled: from the shape table, or with web-to-flange fillets (welded plates have none)."""
    return section.source == TABLE_SOURCE or section.r > 0.0


def shear(
    section: Section, steel: Steel, method: str = "LRFD", rolled: bool | None = None
) -> ShearResult:
    """Web shear strength of an I-shape or channel, G2.1 (rolled inferred when None)."""
    if section.family not in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL):
        raise OutOfScope(
            f"{section.name}: shear of this family (AISC 360-16 G3–G5) not implemented"
        )
    rolled_i = section.family is ShapeFamily.I_SHAPE and (
        is_rolled(section) if rolled is None else rolled
    )
    vn, design, cv1, factor = shear_arrays(
        Fy=steel.fy,
        E=steel.E,
        d=section.d,
        tw=section.tw,
        h_tw=section.web_slenderness,
        rolled_i=rolled_i,
        method=method,
    )
    case_a = rolled_i and section.web_slenderness <= 2.24 * np.sqrt(steel.E / steel.fy)
    clause = "AISC 360-16 G2.1(a)" if case_a else "AISC 360-16 G2.1(b)"
    return ShearResult(
        vn=float(vn[0]),
        design_strength=float(design[0]),
        cv1=float(cv1[0]),
        factor=float(factor[0]),
        method=check_method(method),
        clause=clause,
    )


def strength_curve(
    section: Section,
    steel: Steel,
    cb: float = 1.0,
    method: str = "LRFD",
    lb_max: float | None = None,
    n: int = 200,
) -> tuple[FloatArray, FloatArray, NDArray[np.object_]]:
    """(Lb, design strength, limit state) from Lb = 0 to lb_max (default 1.5·Lr)."""
    curve = AISC360().strength_curve(section, steel, cb, method, lb_max, n)
    return curve.lb, curve.design_strength, curve.limit_state


class AISC360(DesignStandard):
    """AISC 360-16 behind the design-standard interface."""

    name = NAME

    def scope(self, section: Section, steel: Steel | None = None) -> str:
        return scope(section, steel)

    def flexure(
        self,
        section: Section,
        steel: Steel,
        lb: ArrayLike,
        cb: ArrayLike = 1.0,
        method: str = "LRFD",
    ) -> FlexureResult:
        return flexure(section, steel, lb, cb, method)

    def shear(self, section: Section, steel: Steel, method: str = "LRFD") -> ShearResult:
        return shear(section, steel, method)

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
    ) -> FlexureResult:
        return flexure_segments(pairs, index, lb, cb, method)


register_standard(NAME, AISC360)
