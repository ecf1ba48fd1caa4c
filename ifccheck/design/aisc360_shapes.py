"""AISC 360-16 Chapter F beyond F2/F3: F4 to F10, one function per section.

Each function takes one section and steel, arrays of unbraced length Lb (m)
and Cb, and which side is in compression, and returns a :class:`FamilyFlexure`
with the nominal strength Mn per segment and the code of the governing limit
state (an index into :data:`LIMIT_STATES`). The caller (``aisc360.flexure``)
checks the scope first. SI base units throughout.

"Top in compression" means: the top flange of an I-shape, the flange of a tee,
the outstanding legs of a double angle, the toe of a single angle's vertical
leg (see :class:`~ifccheck.model.Section`).
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from ifccheck.design.base import FloatArray
from ifccheck.model import Section, Steel
from ifccheck.sections.classify import (
    classify_flexure,
    flange_limit_stress,
    i_web_depths,
    kc_factor,
)
from ifccheck.sections.shapes import angle_legs, elastic_moduli, flanges, hss_flats

# Limit-state names; index = the code used internally. An object array: gathering
# Python str references is several times faster than fixed-width numpy strings.
LIMIT_STATES = np.array(
    [
        "yielding",
        "inelastic_ltb",
        "elastic_ltb",
        "flange_local_buckling",
        "tension_flange_yielding",
        "web_local_buckling",
        "local_buckling",
        "leg_local_buckling",
        "stem_local_buckling",
    ],
    dtype=object,
)
YIELD, INELASTIC, ELASTIC, FLB, TFY, WLB, LB, LLB, SLB = range(9)

Codes = NDArray[np.int8]
_NA = math.inf  # a limit state that does not apply


@dataclass(frozen=True)
class FamilyFlexure:
    """Mn and the governing limit-state code per segment, with the section's limits.

    ``lp``/``lr`` are 0.0 where the family has no lateral-torsional buckling;
    ``mr`` is Mn at Lr with Cb = 1 (0.0 without LTB); ``mp`` is the plastic
    limit the standard caps the strength at.
    """

    mn: FloatArray
    code: Codes
    mp: float
    lp: float
    lr: float
    mr: float


def _lowest(
    n: int, *candidates: tuple[FloatArray | float, Codes | int]
) -> tuple[FloatArray, Codes]:
    """Smallest candidate per segment; ties go to the candidate listed first."""
    values = np.vstack([np.broadcast_to(np.asarray(v, dtype=float), (n,)) for v, _ in candidates])
    codes = np.vstack([np.broadcast_to(np.asarray(c, dtype=np.int8), (n,)) for _, c in candidates])
    k = np.argmin(values, axis=0)
    cols = np.arange(n)
    return values[k, cols], codes[k, cols]


def _ltb(
    lb: FloatArray, lp: float, lr: float, inelastic: FloatArray, elastic: FloatArray
) -> tuple[FloatArray, Codes]:
    """LTB strength: not applicable up to Lp, inelastic to Lr, elastic beyond."""
    value = np.where(lb <= lp, _NA, np.where(lb <= lr, inelastic, elastic))
    code = np.where(lb <= lr, np.int8(INELASTIC), np.int8(ELASTIC)).astype(np.int8)
    return value, code


def _interpolate(mp: float, m_low: float, lam: float, lam_p: float, lam_r: float) -> float:
    """Linear from mp at λp to m_low at λr (the noncompact form of F3-1, F4-13, F6-2 ...)."""
    return mp - (mp - m_low) * (lam - lam_p) / (lam_r - lam_p)


# --- F4 and F5: I-shapes with noncompact or slender webs, singly symmetric I-shapes ------


@dataclass(frozen=True)
class _IGeometry:
    sxc: float
    sxt: float
    bfc: float
    tfc: float
    iyc: float
    hc: float
    aw: float  # Eq. F4-12
    rt: float  # Eq. F4-11


def _i_geometry(section: Section, compression_top: bool) -> _IGeometry:
    s_top, s_bot = elastic_moduli(section)
    (bft, tft), (bfb, tfb) = flanges(section)
    sxc, sxt = (s_top, s_bot) if compression_top else (s_bot, s_top)
    bfc, tfc = (bft, tft) if compression_top else (bfb, tfb)
    hc, _ = i_web_depths(section, compression_top)
    aw = max(hc, 0.0) * section.tw / (bfc * tfc)  # Eq. F4-12
    rt = bfc / math.sqrt(12.0 * (1.0 + aw / 6.0))  # Eq. F4-11
    return _IGeometry(sxc, sxt, bfc, tfc, tfc * bfc**3 / 12.0, hc, aw, rt)


def i_web_ratio(section: Section, compression_top: bool = True) -> float:
    """aw = hc·tw/(bfc·tfc), Eq. F4-12."""
    return _i_geometry(section, compression_top).aw


def f4(
    section: Section, steel: Steel, lb: FloatArray, cb: FloatArray, compression_top: bool
) -> FamilyFlexure:
    """F4: I-shapes with compact or noncompact webs, doubly or singly symmetric.

    Compression flange yielding Rpc·Myc (F4-1); LTB (F4-2, F4-3, F4-5, Lp F4-7,
    Lr F4-8, FL F4-6a/b, rt F4-11); compression flange local buckling (F4-13,
    F4-14); tension flange yielding Rpt·Myt where Sxt < Sxc (F4-15). Rpc by
    F4-9a/b (F4-10 when Iyc/Iy ≤ 0.23, with J = 0 in F4-5 and F4-8), Rpt by
    F4-17a/b (F4-18); Mp = Fy·Zx ≤ 1.6·Fy·Sxc.
    """
    fy, e = steel.fy, steel.E
    g = _i_geometry(section, compression_top)
    cls = classify_flexure(section, fy, e, compression_top)
    myc, myt = fy * g.sxc, fy * g.sxt  # Eqs. F4-4, F4-16
    mp = min(fy * section.Zx, 1.6 * fy * g.sxc)
    lam, lam_pw, lam_rw = g.hc / section.tw, cls.web.lam_p, cls.web.lam_r
    if g.iyc / section.Iy > 0.23:
        j = section.J
        rpc, rpt = mp / myc, mp / myt  # Eqs. F4-9a, F4-17a
        if lam > lam_pw:  # Eqs. F4-9b, F4-17b
            frac = (lam - lam_pw) / (lam_rw - lam_pw)
            rpc = min(rpc - (rpc - 1.0) * frac, rpc)
            rpt = min(rpt - (rpt - 1.0) * frac, rpt)
    else:
        j, rpc, rpt = 0.0, 1.0, 1.0  # Eqs. F4-10, F4-18
    fl = flange_limit_stress(section, fy, compression_top)  # Eqs. F4-6a, F4-6b
    root = math.sqrt(e / fy)
    lp = 1.1 * g.rt * root  # Eq. F4-7
    jr = j / (g.sxc * section.ho)
    lr = 1.95 * g.rt * e / fl * math.sqrt(jr + math.sqrt(jr**2 + 6.76 * (fl / e) ** 2))  # F4-8
    m_yield = rpc * myc  # Eq. F4-1
    m_low = fl * g.sxc
    with np.errstate(divide="ignore", invalid="ignore"):
        inelastic = cb * (m_yield - (m_yield - m_low) * (lb - lp) / (lr - lp))  # Eq. F4-2
        s2 = (np.maximum(lb, lr) / g.rt) ** 2
        fcr = cb * math.pi**2 * e / s2 * np.sqrt(1.0 + 0.078 * jr * s2)  # Eq. F4-5
    ltb, ltb_code = _ltb(lb, lp, lr, inelastic, fcr * g.sxc)  # Eq. F4-3
    lam, lam_p, lam_r = cls.flange.lam, cls.flange.lam_p, cls.flange.lam_r
    if lam <= lam_p:
        flb = _NA
    elif lam <= lam_r:
        flb = _interpolate(m_yield, m_low, lam, lam_p, lam_r)  # Eq. F4-13
    else:
        flb = 0.9 * e * kc_factor(section.web_slenderness) * g.sxc / lam**2  # Eq. F4-14
    tfy = rpt * myt if g.sxt < g.sxc else _NA  # Eq. F4-15
    mn, code = _lowest(lb.size, (m_yield, YIELD), (ltb, ltb_code), (flb, FLB), (tfy, TFY))
    return FamilyFlexure(mn, code, mp, lp, lr, float(m_low))


def rpg(aw: float, hc_tw: float, e: float, fy: float) -> float:
    """Bending strength reduction factor Rpg = 1 − aw/(1200 + 300aw)·(hc/tw − 5.7√(E/Fy)) ≤ 1
    (Eq. F5-6), aw ≤ 10."""
    aw = min(aw, 10.0)
    return min(1.0 - aw / (1200.0 + 300.0 * aw) * (hc_tw - 5.7 * math.sqrt(e / fy)), 1.0)


def f5(
    section: Section, steel: Steel, lb: FloatArray, cb: FloatArray, compression_top: bool
) -> FamilyFlexure:
    """F5: I-shapes with slender webs, doubly or singly symmetric.

    Compression flange yielding Rpg·Fy·Sxc (F5-1); LTB Rpg·Fcr·Sxc (F5-2) with
    Fcr by F5-3 / F5-4, Lp F4-7, Lr = π·rt·√(E/0.7Fy) (F5-5); compression flange
    local buckling Rpg·Fcr·Sxc (F5-7, F5-8, F5-9); tension flange yielding Fy·Sxt
    where Sxt < Sxc (F5-10). Rpg by F5-6.
    """
    fy, e = steel.fy, steel.E
    g = _i_geometry(section, compression_top)
    cls = classify_flexure(section, fy, e, compression_top)
    r_pg = rpg(g.aw, g.hc / section.tw, e, fy)
    root = math.sqrt(e / fy)
    lp = 1.1 * g.rt * root  # Eq. F4-7
    lr = math.pi * g.rt * math.sqrt(e / (0.7 * fy))  # Eq. F5-5
    m_yield = r_pg * fy * g.sxc  # Eq. F5-1
    with np.errstate(divide="ignore", invalid="ignore"):
        fcr_inelastic = cb * (fy - 0.3 * fy * (lb - lp) / (lr - lp))  # Eq. F5-3
        fcr_elastic = cb * math.pi**2 * e / (np.maximum(lb, lr) / g.rt) ** 2  # Eq. F5-4
    ltb, ltb_code = _ltb(lb, lp, lr, r_pg * fcr_inelastic * g.sxc, r_pg * fcr_elastic * g.sxc)
    lam, lam_p, lam_r = cls.flange.lam, cls.flange.lam_p, cls.flange.lam_r
    if lam <= lam_p:
        flb = _NA
    elif lam <= lam_r:
        flb = r_pg * (fy - 0.3 * fy * (lam - lam_p) / (lam_r - lam_p)) * g.sxc  # Eq. F5-8
    else:
        kc = kc_factor(section.web_slenderness)
        flb = r_pg * 0.9 * e * kc / lam**2 * g.sxc  # Eq. F5-9
    tfy = fy * g.sxt if g.sxt < g.sxc else _NA  # Eq. F5-10
    mn, code = _lowest(lb.size, (m_yield, YIELD), (ltb, ltb_code), (flb, FLB), (tfy, TFY))
    mp = min(fy * section.Zx, 1.6 * fy * g.sxc)
    return FamilyFlexure(mn, code, mp, lp, lr, r_pg * 0.7 * fy * g.sxc)


# --- F6: I-shapes and channels about the minor axis ---------------------------------------


def f6(section: Section, steel: Steel, lb: FloatArray) -> FamilyFlexure:
    """F6: yielding Mp = Fy·Zy ≤ 1.6·Fy·Sy (F6-1); flange local buckling F6-2
    (noncompact) or Fcr·Sy with Fcr = 0.69E/λ² (F6-3, F6-4); no LTB."""
    fy, e = steel.fy, steel.E
    cls = classify_flexure(section, fy, e, axis="minor")
    mp = min(fy * section.Zy, 1.6 * fy * section.Sy)  # Eq. F6-1
    lam, lam_p, lam_r = cls.flange.lam, cls.flange.lam_p, cls.flange.lam_r
    if lam <= lam_p:
        flb = _NA
    elif lam <= lam_r:
        flb = _interpolate(mp, 0.7 * fy * section.Sy, lam, lam_p, lam_r)  # Eq. F6-2
    else:
        flb = 0.69 * e / lam**2 * section.Sy  # Eqs. F6-3, F6-4
    mn, code = _lowest(lb.size, (mp, YIELD), (flb, FLB))
    return FamilyFlexure(mn, code, mp, 0.0, 0.0, 0.0)


# --- F7: rectangular HSS ---------------------------------------------------------------


def effective_modulus(section: Section, be: float, b: float, minor: bool) -> float:
    """Se of F7-3: the compression flange's flat width b reduced to be (F7-4).

    The lost strip (b − be)·t lies at the flange's mid-thickness; the neutral
    axis moves away from it and Se = Ieff / (distance to the compression face).
    """
    t = section.tf
    depth = section.bf if minor else section.d
    area = section.A
    inertia = section.Iy if minor else section.Ix
    lost = (b - be) * t
    yf = (depth - t) / 2.0
    shift = lost * yf / (area - lost)
    i_eff = inertia - lost * t**2 / 12.0 - lost * yf**2 - (area - lost) * shift**2
    return i_eff / (depth / 2.0 + shift)


def f7(
    section: Section, steel: Steel, lb: FloatArray, cb: FloatArray, minor: bool
) -> FamilyFlexure:
    """F7: rectangular and square HSS about either axis.

    Yielding Mp = Fy·Z (F7-1); flange local buckling F7-2 (noncompact) or
    Fy·Se (F7-3) with be by F7-4; web local buckling F7-6 (noncompact) or, for
    slender webs, Rpg·Fy·S (F7-7) and Rpg·Fcr·S with Fcr = 0.9·E·4.0/(b/t)² (F7-8,
    F7-9); LTB about the major axis F7-10, F7-11 with Lp F7-12, Lr F7-13.
    """
    fy, e = steel.fy, steel.E
    root = math.sqrt(e / fy)
    cls = classify_flexure(section, fy, e, axis="minor" if minor else "major")
    h, b = hss_flats(section)
    if minor:
        h, b = b, h
    s, z = (section.Sy, section.Zy) if minor else (section.Sx, section.Zx)
    t = section.tf
    mp = fy * z  # Eq. F7-1
    lam_f, lam_pf, lam_rf = cls.flange.lam, cls.flange.lam_p, cls.flange.lam_r
    if lam_f <= lam_pf:
        flb = _NA
    elif lam_f <= lam_rf:
        flb = min(mp - (mp - fy * s) * (3.57 * lam_f / root - 4.0), mp)  # Eq. F7-2
    else:
        be = min(1.92 * t * root * (1.0 - 0.38 / lam_f * root), b)  # Eq. F7-4
        flb = fy * effective_modulus(section, be, b, minor)  # Eq. F7-3
    lam_w, lam_pw, lam_rw = cls.web.lam, cls.web.lam_p, cls.web.lam_r
    m_yield: float = mp
    if lam_w <= lam_pw:
        wlb = _NA
    elif lam_w <= lam_rw:
        wlb = min(mp - (mp - fy * s) * (0.305 * lam_w / root - 0.738), mp)  # Eq. F7-6
    else:
        r_pg = rpg(2.0 * h * t / (b * t), lam_w, e, fy)  # aw = 2h·tw/(b·tf), F7.3(c)
        m_yield = r_pg * fy * s  # Eq. F7-7
        wlb = r_pg * 0.9 * e * 4.0 / lam_f**2 * s  # Eqs. F7-8, F7-9
    n = lb.size
    if minor:
        mn, code = _lowest(n, (m_yield, YIELD), (flb, FLB), (wlb, WLB))
        return FamilyFlexure(mn, code, mp, 0.0, 0.0, 0.0)
    root_ja = math.sqrt(section.J * section.A)
    lp = 0.13 * e * section.ry * root_ja / mp  # Eq. F7-12
    lr = 2.0 * e * section.ry * root_ja / (0.7 * fy * section.Sx)  # Eq. F7-13
    with np.errstate(divide="ignore", invalid="ignore"):
        inelastic = cb * (mp - (mp - 0.7 * fy * section.Sx) * (lb - lp) / (lr - lp))  # F7-10
        elastic = 2.0 * e * cb * root_ja / (np.maximum(lb, lr) / section.ry)  # Eq. F7-11
    ltb, ltb_code = _ltb(lb, lp, lr, inelastic, elastic)
    mn, code = _lowest(n, (m_yield, YIELD), (ltb, ltb_code), (flb, FLB), (wlb, WLB))
    return FamilyFlexure(mn, code, mp, lp, lr, 0.7 * fy * section.Sx)


# --- F8: round HSS ---------------------------------------------------------------------


def f8(section: Section, steel: Steel, lb: FloatArray) -> FamilyFlexure:
    """F8: yielding Mp = Fy·Z (F8-1); local buckling (0.021E/(D/t) + Fy)·S (F8-2,
    noncompact) or 0.33E/(D/t)·S (F8-3, F8-4, slender); no LTB."""
    fy, e = steel.fy, steel.E
    cls = classify_flexure(section, fy, e)
    mp = fy * section.Zx
    lam = cls.flange.lam
    if lam <= cls.flange.lam_p:
        local = _NA
    elif lam <= cls.flange.lam_r:
        local = (0.021 * e / lam + fy) * section.Sx  # Eq. F8-2
    else:
        local = 0.33 * e / lam * section.Sx  # Eqs. F8-3, F8-4
    mn, code = _lowest(lb.size, (mp, YIELD), (local, LB))
    return FamilyFlexure(mn, code, mp, 0.0, 0.0, 0.0)


# --- F9: tees and double angles in the plane of symmetry -----------------------------------


def tee_mcr(
    e: float, iy: float, j: float, d: float, lb: FloatArray, stem_tension: bool
) -> FloatArray:
    """Mcr = 1.95E/Lb·√(Iy·J)·(B + √(1 + B²)) (F9-10), B = ±2.3(d/Lb)√(Iy/J) (F9-11, F9-12).

    Written with k = 2.3·d·√(Iy/J) as 1.95E√(IyJ)(k + √(Lb² + k²))/Lb² (stem in
    tension) and 1.95E√(IyJ)/(k + √(Lb² + k²)) (stem in compression), the same
    values without the cancellation of B + √(1 + B²) for large negative B.
    """
    k = 2.3 * d * math.sqrt(iy / j)
    root = np.sqrt(lb * lb + k * k)
    c = 1.95 * e * math.sqrt(iy * j)
    if not stem_tension:
        return np.asarray(c / (k + root), dtype=float)
    with np.errstate(divide="ignore"):
        return np.asarray(np.where(lb > 0.0, c * (k + root) / np.maximum(lb, 1e-300) ** 2, _NA))


def f10_ltb(my: float, mcr: FloatArray) -> FloatArray:
    """F10-2 (My/Mcr ≤ 1.0: (1.92 − 1.17√(My/Mcr))·My ≤ 1.5My) and F10-3
    (My/Mcr > 1.0: (0.92 − 0.17·Mcr/My)·Mcr); both give 0.75My at Mcr = My."""
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        ratio = np.where(mcr > 0.0, my / mcr, np.inf)
        inelastic = np.minimum((1.92 - 1.17 * np.sqrt(ratio)) * my, 1.5 * my)
        elastic = (0.92 - 0.17 * mcr / my) * mcr
    return np.asarray(np.where(ratio <= 1.0, inelastic, elastic), dtype=float)


def leg_local_buckling(
    fy: float, e: float, sc: float, lam: float, lam_p: float, lam_r: float
) -> float:
    """F10.3: inf when compact; Fy·Sc·(2.43 − 1.72(b/t)√(Fy/E)) (F10-6, noncompact);
    Fcr·Sc with Fcr = 0.71E/(b/t)² (F10-7, F10-8, slender)."""
    if lam <= lam_p:
        return _NA
    if lam <= lam_r:
        return fy * sc * (2.43 - 1.72 * lam * math.sqrt(fy / e))
    return 0.71 * e / lam**2 * sc


def _bisect_lb(moment: Callable[[FloatArray], FloatArray], target: float, hi: float) -> float:
    """The Lb at which a moment decreasing with Lb falls to ``target`` (``hi`` if it never does)."""
    lo = 0.0
    if float(moment(np.array([hi]))[0]) > target:
        return hi
    for _ in range(80):
        mid = (lo + hi) / 2.0
        if float(moment(np.array([mid]))[0]) > target:
            lo = mid
        else:
            hi = mid
    return (lo + hi) / 2.0


def f9(
    section: Section, steel: Steel, lb: FloatArray, cb: FloatArray, compression_top: bool
) -> FamilyFlexure:
    """F9: tees and double angles loaded in the plane of symmetry (no Cb in F9).

    Stem (web legs) in tension — compression_top: Mp = Fy·Zx ≤ 1.6My (F9-2),
    LTB F9-6 / F9-7 with Lp F9-8, Lr F9-9, Mcr F9-10, B F9-11; tee flange local
    buckling F9-14 / F9-15, double-angle flange legs by F10-6 / F10-7 with Sc to
    the compression flange (F9.3(b)).
    Stem (web legs) in compression: tees Mp = My (F9-4), Mn = Mcr ≤ My with B by
    F9-12 (F9-13), stem local buckling Fcr·Sx (F9-16 to F9-19); double angles
    Mp = 1.5My (F9-5), LTB by F10-2 / F10-3 with Mcr from F9-10 (F9.2(b)(2)),
    web-leg local buckling by F10-6 / F10-7 with Sc to the toe (F9.4(b)).
    My = Fy·Sx (F9-3), Sx the lesser elastic modulus.
    """
    del cb  # F9 gives no Cb: taken as 1.0
    fy, e = steel.fy, steel.E
    s_top, s_bot = elastic_moduli(section)
    my = fy * min(s_top, s_bot)  # Eq. F9-3
    double = section.pair_gap is not None
    cls = classify_flexure(section, fy, e)
    n = lb.size
    if compression_top:  # stem or web legs in tension
        mp = min(fy * section.Zx, 1.6 * my)  # Eq. F9-2
        lp = 1.76 * section.ry * math.sqrt(e / fy)  # Eq. F9-8
        lr = (
            1.95 * (e / fy) * math.sqrt(section.Iy * section.J) / min(s_top, s_bot)
            * math.sqrt(2.36 * (fy / e) * section.d * min(s_top, s_bot) / section.J + 1.0)
        )  # Eq. F9-9  # fmt: skip
        mcr = tee_mcr(e, section.Iy, section.J, section.d, np.maximum(lb, lr), True)
        with np.errstate(divide="ignore", invalid="ignore"):
            inelastic = mp - (mp - my) * (lb - lp) / (lr - lp)  # Eq. F9-6
        ltb, ltb_code = _ltb(lb, lp, lr, inelastic, mcr)  # Eq. F9-7
        if double:
            flange = leg_local_buckling(fy, e, s_top, cls.flange.lam, cls.flange.lam_p,
                                        cls.flange.lam_r)  # F9.3(b)  # fmt: skip
            flange_code = LLB
        else:
            lam, lam_p, lam_r = cls.flange.lam, cls.flange.lam_p, cls.flange.lam_r
            if lam <= lam_p:
                flange = _NA
            elif lam <= lam_r:
                flange = min(_interpolate(mp, 0.7 * fy * s_top, lam, lam_p, lam_r), 1.6 * my)
            else:
                flange = 0.7 * e * s_top / lam**2  # Eq. F9-15
            flange_code = FLB
        mn, code = _lowest(n, (mp, YIELD), (ltb, ltb_code), (flange, flange_code))
        return FamilyFlexure(mn, code, mp, lp, lr, my)
    # stem or web legs in compression
    mcr = tee_mcr(e, section.Iy, section.J, section.d, lb, False)  # Eqs. F9-10, F9-12
    if double:
        mp = 1.5 * my  # Eq. F9-5
        ltb = f10_ltb(my, mcr)  # F9.2(b)(2)
        onset = my  # F10-3 applies where My/Mcr > 1.0
        elastic = mcr < onset
        local = leg_local_buckling(fy, e, s_bot, cls.web.lam, cls.web.lam_p, cls.web.lam_r)
        local_code = LLB  # F9.4(b)
    else:
        mp = my  # Eq. F9-4
        ltb = np.minimum(mcr, my)  # Eq. F9-13
        onset = my
        elastic = mcr < my
        root = math.sqrt(e / fy)
        d_tw = section.d / section.tw
        if d_tw <= 0.84 * root:
            fcr = fy  # Eq. F9-17
        elif d_tw <= 1.52 * root:
            fcr = (1.43 - 0.515 * d_tw / root) * fy  # Eq. F9-18
        else:
            fcr = 1.52 * e / d_tw**2  # Eq. F9-19
        local, local_code = fcr * s_bot, SLB  # Eq. F9-16
    ltb_code = np.where(elastic, np.int8(ELASTIC), np.int8(INELASTIC)).astype(np.int8)
    mn, code = _lowest(n, (mp, YIELD), (ltb, ltb_code), (local, local_code))

    def mcr_of(x: FloatArray) -> FloatArray:
        return tee_mcr(e, section.Iy, section.J, section.d, x, False)

    lr = _bisect_lb(mcr_of, onset, 1e4 * section.d)
    at_lr = mcr_of(np.array([lr]))
    mr = float((f10_ltb(my, at_lr) if double else np.minimum(at_lr, my))[0])
    return FamilyFlexure(mn, code, mp, 0.0, lr, mr)


# --- F10: single angles about a geometric axis ---------------------------------------------


CB_MAX_ANGLE = 1.5  # F10.2: Cb from F1-1 with a maximum of 1.5


def angle_mcr(
    e: float, b: float, t: float, lb: FloatArray, cb: FloatArray, toe_compression: bool
) -> FloatArray:
    """Mcr = 0.58·E·b⁴·t·Cb/Lb²·[√(1 + 0.88(Lb·t/b²)²) ∓ 1] (F10-5a toe in compression −,
    F10-5b toe in tension +), Cb ≤ 1.5."""
    c = np.minimum(cb, CB_MAX_ANGLE)
    x = lb * t / b**2
    root = np.sqrt(1.0 + 0.88 * x * x)
    if toe_compression:
        # 0.58E·b⁴·t·Cb/Lb²·(√(1 + 0.88x²) − 1) with x = Lb·t/b², written as
        # 0.58·0.88·E·t³·Cb/(√(1 + 0.88x²) + 1): the same value, finite as Lb → 0.
        return np.asarray(0.58 * 0.88 * e * t**3 * c / (root + 1.0), dtype=float)
    with np.errstate(divide="ignore", over="ignore"):
        mcr = 0.58 * e * b**4 * t * c / lb**2 * (root + 1.0)
    return np.asarray(np.where(lb > 0.0, mcr, _NA), dtype=float)


def f10(
    section: Section, steel: Steel, lb: FloatArray, cb: FloatArray, compression_top: bool
) -> FamilyFlexure:
    """F10: equal-leg single angles bent about a geometric axis, no axial compression.

    Lb = 0 is continuous lateral-torsional restraint: yielding 1.5·My (F10-1)
    with the geometric My, and leg local buckling with the geometric Sc. Lb > 0
    has no lateral-torsional restraint (F10.2(2)(i)): My and Sc are 0.80 times the
    geometric values (applied to yielding too), LTB by F10-2 / F10-3 with Mcr by
    F10-5a (toe in compression, compression_top) or F10-5b (toe in tension).
    Leg local buckling (F10.3, F10-6 to F10-8) is checked for the leg whose toe
    is in compression: the vertical leg (Sc to the top) or the horizontal leg
    (Sc to the bottom, where its toe lies).
    """
    fy, e = steel.fy, steel.E
    s_top, s_bot = elastic_moduli(section)
    my_geo = fy * min(s_top, s_bot)
    d, b = angle_legs(section)
    t = section.tf
    cls = classify_flexure(section, fy, e)
    lam, lam_p, lam_r = cls.web.lam, cls.web.lam_p, cls.web.lam_r  # equal legs: either
    sc_geo = s_top if compression_top else s_bot
    restrained = lb <= 0.0
    factor = np.where(restrained, 1.0, 0.80)
    my = factor * my_geo
    yielding = 1.5 * my  # Eq. F10-1
    mcr = angle_mcr(e, b, t, lb, cb, compression_top)
    ltb = np.where(restrained, _NA, f10_ltb(0.80 * my_geo, mcr))
    with np.errstate(divide="ignore", invalid="ignore"):
        elastic = (0.80 * my_geo) / mcr > 1.0
    ltb_code = np.where(elastic, np.int8(ELASTIC), np.int8(INELASTIC)).astype(np.int8)
    leg = leg_local_buckling(fy, e, 1.0, lam, lam_p, lam_r)
    local = leg * sc_geo * factor
    mn, code = _lowest(lb.size, (yielding, YIELD), (ltb, ltb_code), (local, LLB))
    one = np.ones(1)
    lr = _bisect_lb(lambda x: angle_mcr(e, b, t, x, one, compression_top), 0.80 * my_geo,
                    1e4 * d)  # fmt: skip
    mr = float(f10_ltb(0.80 * my_geo, angle_mcr(e, b, t, np.array([lr]), one, compression_top))[0])
    return FamilyFlexure(mn, code, 1.5 * my_geo, 0.0, lr, mr)


def is_equal_leg(section: Section) -> bool:
    d, b = angle_legs(section)
    return math.isclose(d, b, rel_tol=1e-3)


__all__ = [
    "LIMIT_STATES",
    "FamilyFlexure",
    "f4",
    "f5",
    "f6",
    "f7",
    "f8",
    "f9",
    "f10",
]
