"""Source: ANSI/AISC 360-16, *Specification for Structural Steel Buildings*, American
Institute of Steel Construction, Chicago, IL, 2016.

Built-up and singly symmetric I-shapes: Table B4.1b case 11, F3 for built-up flanges,
F4 (noncompact webs, singly symmetric), F5 (slender webs), G2.1(b), and the one
rolled-or-built-up decision. Every expected value is worked by hand below in kip and
inch units, equation by equation (AISC 360-16), from plate dimensions."""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest
from builders import FT, IN, KIP, KIP_FT, KIP_IN, KSI

from ifccheck.design.aisc360 import flexure, is_rolled, shear
from ifccheck.model import Section
from ifccheck.sections import i_section_from_dimensions, lookup, steel_from_yield
from ifccheck.sections.classify import classify_flexure, is_built_up
from ifccheck.sections.shapes import singly_symmetric_i_from_dimensions

E = 29000.0  # ksi
FY = 50.0  # ksi
STEEL = steel_from_yield(FY * KSI, "Fy 50 ksi")
ROOT = math.sqrt(E / FY)  # √(E/Fy) = 24.083


def _plate_i(name: str, d: float, bf: float, tw: float, tf: float) -> Section:
    """Welded doubly symmetric I (inches in, SI out), no fillets."""
    return i_section_from_dimensions(name, d * IN, bf * IN, tw * IN, tf * IN, 0.0)


def _kipft(values: np.ndarray) -> np.ndarray:
    return np.asarray(values) / KIP_FT


# --- Table B4.1b case 11 and F3-2 --------------------------------------------------


def test_case_11_built_up_flange_f3_2() -> None:
    # I 36×16×0.4×0.4 in, welded, Fy = 50 ksi, Lb ≤ Lp.
    s = _plate_i("I 36x16x0.4x0.4", 36.0, 16.0, 0.4, 0.4)
    assert is_built_up(s)
    h_tw = (36.0 - 2 * 0.4) / 0.4  # 88.0 ≤ 3.76√(E/Fy) = 90.6: compact web, F3 applies
    assert h_tw < 3.76 * ROOT
    kc = 4.0 / math.sqrt(h_tw)  # Table B4.1b note [a]: 0.426, within 0.35..0.76
    fl = 0.7 * FY  # note [b]: Sxt/Sxc = 1 ≥ 0.7
    lam = 16.0 / (2 * 0.4)  # 20.0
    lam_r = 0.95 * math.sqrt(kc * E / fl)  # case 11: 17.86
    assert lam > lam_r  # slender flange
    ix = 2 * (16 * 0.4**3 / 12 + 16 * 0.4 * (18 - 0.2) ** 2) + 0.4 * 35.2**3 / 12
    sx = ix / 18.0  # 306.1 in³
    mn = 0.9 * E * kc * sx / lam**2  # Eq. F3-2: 8,516 kip-in
    phi_mn_knm = 0.9 * mn * KIP_IN / 1e3  # 866 kN·m
    assert phi_mn_knm == pytest.approx(866.0, abs=0.5)
    r = flexure(s, STEEL, [0.0])
    assert r.limit_state[0] == "flange_local_buckling"
    assert r.design_strength[0] / 1e3 == pytest.approx(phi_mn_knm, rel=1e-6)
    # Case 10 (the rolled-shape limit 1.0√(E/Fy) = 24.1) would call the flange
    # noncompact and give F3-1 ≈ 1,280 kN·m, 48 % too high: the same shape marked
    # rolled shows it.
    rolled = flexure(dataclasses.replace(s, fabrication="rolled"), STEEL, [0.0])
    assert rolled.design_strength[0] / 1e3 == pytest.approx(1280.0, rel=0.005)


# --- F5: slender web plate girder ----------------------------------------------------


def test_f5_plate_girder_web_60_by_5_16() -> None:
    # Web 60 × 5/16 in, flanges 16 × 1 in, d = 62 in, welded, Fy = 50 ksi.
    d, bf, tf, h, tw = 62.0, 16.0, 1.0, 60.0, 0.3125
    s = _plate_i("PG 62", d, bf, tw, tf)
    assert h / tw == pytest.approx(192.0)
    assert h / tw > 5.70 * ROOT  # 137.3: slender web, F5
    ix = 2 * (bf * tf**3 / 12 + bf * tf * (d / 2 - tf / 2) ** 2) + tw * h**3 / 12  # 35,396 in⁴
    sxc = ix / (d / 2)  # 1,141.8 in³
    aw = h * tw / (bf * tf)  # Eq. F4-12: 1.172 (hc = h)
    rt = bf / math.sqrt(12 * (1 + aw / 6))  # Eq. F4-11: 4.225 in
    rpg = 1 - aw / (1200 + 300 * aw) * (h / tw - 5.7 * ROOT)  # Eq. F5-6: 0.9587
    m_cfy = rpg * FY * sxc  # Eq. F5-1
    lp = 1.1 * rt * ROOT  # Eq. F4-7: 111.9 in
    lr = math.pi * rt * math.sqrt(E / (0.7 * FY))  # Eq. F5-5: 382.0 in
    lam = bf / (2 * tf)  # 8.0 < λpf = 0.38√(E/Fy) = 9.15: compact flange, no FLB
    assert lam < 0.38 * ROOT

    def f5_mn(lb: float, cb: float) -> float:
        if lb <= lp:
            return m_cfy
        if lb <= lr:
            fcr = min(cb * (FY - 0.3 * FY * (lb - lp) / (lr - lp)), FY)  # Eq. F5-3
        else:
            fcr = min(cb * math.pi**2 * E / (lb / rt) ** 2, FY)  # Eq. F5-4
        return min(rpg * fcr * sxc, m_cfy)  # Eq. F5-2

    lbs_ft = [0.0, 10.0, 20.0, 31.0, 40.0, 60.0]
    for cb in (1.0, 1.3):
        r = flexure(s, STEEL, np.array(lbs_ft) * FT, cb)
        expected = [f5_mn(x * 12, cb) / 12 for x in lbs_ft]
        np.testing.assert_allclose(_kipft(r.mn), expected, rtol=1e-9)
    r = flexure(s, STEEL, np.array([0.0, 20.0, 40.0]) * FT)
    assert list(r.limit_state) == ["yielding", "inelastic_ltb", "elastic_ltb"]
    assert r.lp[0] / IN == pytest.approx(lp, rel=1e-9)
    assert r.lr[0] / IN == pytest.approx(lr, rel=1e-9)
    assert _kipft(r.design_strength)[0] == pytest.approx(0.9 * m_cfy / 12, rel=1e-9)  # 4,105
    # Shear, G2.1(b): no stiffeners, kv = 5.34; h/tw = 192 > 1.10√(kv·E/Fy) = 61.2, so
    # Cv1 = 61.2/192 = 0.319 (G2-4); Vn = 0.6·Fy·d·tw·Cv1 (G2-1) = 185 kip; φv = 0.90.
    limit = 1.10 * math.sqrt(5.34 * E / FY)
    cv1 = limit / (h / tw)
    v = shear(s, STEEL)
    assert v.clause == "AISC 360-16 G2.1(b)"
    assert v.cv1 == pytest.approx(cv1, rel=1e-9)
    assert v.vn / KIP == pytest.approx(0.6 * FY * d * tw * cv1, rel=1e-9)
    assert v.design_strength == pytest.approx(0.9 * v.vn)


# --- F4: noncompact web, doubly symmetric ---------------------------------------------


def test_f4_noncompact_web_48_by_0_4() -> None:
    # Web 48 × 0.4 in, flanges 12 × 1 in, d = 50 in, welded, Fy = 50 ksi.
    d, bf, tf, h, tw = 50.0, 12.0, 1.0, 48.0, 0.4
    s = _plate_i("F4 girder", d, bf, tw, tf)
    lam_pw, lam_rw = 3.76 * ROOT, 5.70 * ROOT  # Table B4.1b case 15: 90.6, 137.3
    lam = h / tw  # 120
    assert lam_pw < lam < lam_rw
    assert (round(lam_pw, 1), round(lam_rw, 1)) == (90.6, 137.3)
    ix = 2 * (bf * tf**3 / 12 + bf * tf * (d / 2 - tf / 2) ** 2) + tw * h**3 / 12  # 18,094
    sxc = ix / (d / 2)
    zx = 2 * bf * tf * (d / 2 - tf / 2) + tw * h**2 / 4  # 818.4 in³
    myc = FY * sxc  # Eq. F4-4
    mp = min(FY * zx, 1.6 * FY * sxc)
    iyc_iy = (tf * bf**3 / 12) / (2 * tf * bf**3 / 12 + h * tw**3 / 12)
    assert iyc_iy > 0.23
    rpc = mp / myc - (mp / myc - 1) * (lam - lam_pw) / (lam_rw - lam_pw)  # Eq. F4-9b: 1.048
    rpc = min(rpc, mp / myc)
    fl = 0.7 * FY  # Eq. F4-6a (Sxt/Sxc = 1)
    aw = h * tw / (bf * tf)  # Eq. F4-12
    rt = bf / math.sqrt(12 * (1 + aw / 6))  # Eq. F4-11
    lp = 1.1 * rt * ROOT  # Eq. F4-7
    j = s.J / IN**4  # El Darwish & Johnston, checked against sectionproperties elsewhere
    jr = j / (sxc * (d - tf))
    lr = 1.95 * rt * E / fl * math.sqrt(jr + math.sqrt(jr**2 + 6.76 * (fl / E) ** 2))  # F4-8
    assert bf / (2 * tf) < 0.38 * ROOT  # compact flange: no F4.3

    def f4_mn(lb: float, cb: float) -> float:
        top = rpc * myc  # Eq. F4-1
        if lb <= lp:
            return top
        if lb <= lr:
            m = cb * (top - (top - fl * sxc) * (lb - lp) / (lr - lp))  # Eq. F4-2
        else:
            fcr = cb * math.pi**2 * E / (lb / rt) ** 2 * math.sqrt(1 + 0.078 * jr * (lb / rt) ** 2)
            m = fcr * sxc  # Eqs. F4-3, F4-5
        return min(m, top)

    lbs_ft = [0.0, 5.0, 10.0, 20.0, 30.0, 50.0]
    for cb in (1.0, 1.75):
        r = flexure(s, STEEL, np.array(lbs_ft) * FT, cb, "ASD")
        expected = [f4_mn(x * 12, cb) / 12 for x in lbs_ft]
        np.testing.assert_allclose(_kipft(r.mn), expected, rtol=1e-9)
        np.testing.assert_allclose(r.design_strength, r.mn / 1.67)
    r = flexure(s, STEEL, [0.0])
    assert _kipft(r.mn)[0] == pytest.approx(rpc * myc / 12, rel=1e-9)  # 3,161 kip-ft
    assert r.mp[0] / KIP_IN == pytest.approx(mp, rel=1e-9)


# --- F4: singly symmetric ----------------------------------------------------------


def _singly() -> Section:
    # Top flange 16 × 1, bottom flange 12 × 1, web 48 × 0.4 in, d = 50 in, welded.
    return singly_symmetric_i_from_dimensions(
        "IS 50", 50 * IN, 16 * IN, 1 * IN, 12 * IN, 1 * IN, 0.4 * IN
    )


def test_f4_singly_symmetric_both_ways() -> None:
    s = _singly()
    # Areas and centroid from the top: 16 + 19.2 + 12 = 47.2 in², ȳ = 22.92 in.
    parts = [(16.0, 0.5, 16 / 12), (19.2, 25.0, 0.4 * 48**3 / 12), (12.0, 49.5, 12 / 12)]
    area = sum(a for a, _, _ in parts)
    ybar = sum(a * y for a, y, _ in parts) / area
    ix = sum(i + a * (y - ybar) ** 2 for a, y, i in parts)
    # Plastic neutral axis: 23.6 in² above → 16 + 0.4·x = 23.6, x = 19 in below the flange.
    ypna = 1.0 + (area / 2 - 16.0) / 0.4
    zx = 16 * (ypna - 0.5) + 0.4 * (ypna - 1) ** 2 / 2 + 0.4 * (49 - ypna) ** 2 / 2
    zx += 12 * (49.5 - ypna)
    assert s.y_top / IN == pytest.approx(ybar, rel=1e-9)
    assert s.y_plastic / IN == pytest.approx(ypna, rel=1e-6)
    assert s.Ix / IN**4 == pytest.approx(ix, rel=1e-9)
    assert s.Zx / IN**3 == pytest.approx(zx, rel=1e-6)
    iy = 16**3 / 12 + 12**3 / 12 + 48 * 0.4**3 / 12
    j = s.J / IN**4  # thin-walled, checked against sectionproperties in test_shapes
    s_top, s_bot = ix / ybar, ix / (50 - ybar)
    my = FY * min(s_top, s_bot)
    mp_full = FY * zx

    def f4_mn(lb: float, top: bool) -> tuple[float, str]:
        bfc, iyc, c = (16.0, 16**3 / 12, ybar) if top else (12.0, 12**3 / 12, 50 - ybar)
        sxc, sxt = (s_top, s_bot) if top else (s_bot, s_top)
        p = ypna if top else 50 - ypna
        hc, hp = 2 * (c - 1.0), 2 * (p - 1.0)  # B4.1b(b), welded: to the flange's inside face
        lam = hc / 0.4
        lam_r = 5.70 * ROOT
        lam_p = min((hc / hp) * ROOT / (0.54 * mp_full / my - 0.09) ** 2, lam_r)  # case 16
        mp = min(mp_full, 1.6 * FY * sxc)
        myc, myt = FY * sxc, FY * sxt
        assert iyc / iy > 0.23
        if lam <= lam_p:
            rpc, rpt = mp / myc, mp / myt  # Eqs. F4-9a, F4-17a
        else:
            f = (lam - lam_p) / (lam_r - lam_p)
            rpc = min(mp / myc - (mp / myc - 1) * f, mp / myc)  # Eq. F4-9b
            rpt = min(mp / myt - (mp / myt - 1) * f, mp / myt)  # Eq. F4-17b
        ratio = sxt / sxc
        fl = 0.7 * FY if ratio >= 0.7 else max(FY * ratio, 0.5 * FY)  # Eqs. F4-6a, F4-6b
        aw = hc * 0.4 / (bfc * 1.0)
        rt = bfc / math.sqrt(12 * (1 + aw / 6))  # Eq. F4-11
        lp = 1.1 * rt * ROOT  # Eq. F4-7
        ho = 50 - 1.0
        jr = j / (sxc * ho)
        lr = 1.95 * rt * E / fl * math.sqrt(jr + math.sqrt(jr**2 + 6.76 * (fl / E) ** 2))
        cfy = rpc * myc  # Eq. F4-1
        if lb <= lp:
            ltb = math.inf
        elif lb <= lr:
            ltb = cfy - (cfy - fl * sxc) * (lb - lp) / (lr - lp)  # Eq. F4-2, Cb = 1
        else:
            s2 = (lb / rt) ** 2
            ltb = math.pi**2 * E / s2 * math.sqrt(1 + 0.078 * jr * s2) * sxc  # F4-3, F4-5
        # Flanges: λ = bfc/2tfc = 8 or 6; kc = 4/√(48/0.4) = 0.365; λpf = 9.15: compact.
        assert bfc / 2 < 0.38 * ROOT
        tfy = rpt * myt if sxt < sxc else math.inf  # Eq. F4-15
        options = {"yielding": cfy, "ltb": ltb, "tension_flange_yielding": tfy}
        state = min(options, key=lambda k: options[k])
        return options[state], state

    lbs_ft = [0.0, 8.0, 15.0, 25.0, 45.0]
    for top in (True, False):
        r = flexure(s, STEEL, np.array(lbs_ft) * FT, 1.0, compression_top=top)
        for k, lb in enumerate(lbs_ft):
            mn, state = f4_mn(lb * 12, top)
            assert r.mn[k] / KIP_IN == pytest.approx(mn, rel=1e-6), (top, lb)
            if state != "ltb":
                assert r.limit_state[k] == state
    # The bigger flange in compression: its tension flange (smaller) yields first at
    # short Lb; the smaller flange in compression is weaker against LTB.
    big = flexure(s, STEEL, [25 * FT], compression_top=True).mn[0]
    small = flexure(s, STEEL, [25 * FT], compression_top=False).mn[0]
    assert small < big
    assert flexure(s, STEEL, [0.0], compression_top=True).limit_state[0] == (
        "tension_flange_yielding"
    )
    # Side not known (None, the default): the weaker side per segment.
    lbs = np.array(lbs_ft) * FT
    both = [flexure(s, STEEL, lbs, compression_top=side).mn for side in (True, False)]
    np.testing.assert_array_equal(flexure(s, STEEL, lbs).mn, np.minimum(*both))


def test_singly_symmetric_web_class_case_16() -> None:
    # hc/tw and λp of Table B4.1b case 16 for the top flange in compression.
    s = _singly()
    cls = classify_flexure(s, STEEL.fy, STEEL.E, compression_top=True)
    assert cls.case_web == 16
    assert cls.web.lam == pytest.approx(2 * (s.y_top / IN - 1.0) / 0.4, rel=1e-9)
    assert cls.web.lam_r == pytest.approx(5.70 * ROOT)


# --- the one rolled-or-built-up decision --------------------------------------------


def test_rolled_or_built_up_decided_once() -> None:
    w = lookup("W24X84")
    assert w is not None
    assert not is_built_up(w) and is_rolled(w)  # a table shape
    with_fillet = i_section_from_dimensions("IPE300", 0.3, 0.15, 0.0071, 0.0107, 0.015)
    assert not is_built_up(with_fillet)  # fillet radius > 0: rolled
    plates = i_section_from_dimensions("I 600x300", 0.6, 0.3, 0.01, 0.02, 0.0)
    assert is_built_up(plates)  # no fillet: welded plates (or unknown: conservative)
    named = i_section_from_dimensions("WELDED I 600", 0.6, 0.3, 0.01, 0.02, 0.01)
    assert is_built_up(named)  # a welded name wins over a fillet
    assert is_built_up(_singly())  # unequal flanges
    assert not is_built_up(dataclasses.replace(plates, fabrication="rolled"))
    assert is_built_up(dataclasses.replace(w, fabrication="welded"))
    # Flexure and shear read the same decision: case 11 and G2.1(b) for the welded
    # twin of a rolled W, case 10 and G2.1(a) for the W itself.
    welded_w = dataclasses.replace(w, fabrication="welded")
    assert classify_flexure(welded_w, STEEL.fy, STEEL.E).case_flange == 11
    assert classify_flexure(w, STEEL.fy, STEEL.E).case_flange == 10
    assert shear(w, STEEL).clause == "AISC 360-16 G2.1(a)"
    assert shear(welded_w, STEEL).clause == "AISC 360-16 G2.1(b)"
