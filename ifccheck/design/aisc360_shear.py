"""AISC 360-16 Chapter G: shear strength of every family the engine covers.

- G2.1 webs of I-shapes and channels (major-axis shear): Vn = 0.6·Fy·Aw·Cv1 (G2-1),
  Aw = d·tw; G2.1(a) for rolled I-shapes, else G2.1(b) with kv = 5.34 (no stiffeners).
- G3 single angles and tees: Vn = 0.6·Fy·b·t·Cv2 (G3-1), kv = 1.2.
- G4 rectangular HSS: Vn = 0.6·Fy·Aw·Cv2 (G4-1), Aw = 2·h·t, kv = 5.
- G5 round HSS: Vn = Fcr·Ag/2 (G5-1), Fcr by G5-2a / G5-2b, ≤ 0.6·Fy.
- G6 minor-axis shear of I-shapes and channels: Vn = 0.6·Fy·bf·tf·Cv2 per flange
  (G6-1), kv = 1.2.

Cv2 is the web shear buckling coefficient of G2.2 (G2-9 to G2-11). φv = 0.90 /
Ωv = 1.67 except G2.1(a): φv = 1.00 / Ωv = 1.50. SI base units.
"""

from __future__ import annotations

import math

from ifccheck.design.base import Method, ShearResult, check_method
from ifccheck.errors import OutOfScope
from ifccheck.model import Section, ShapeFamily, Steel
from ifccheck.sections.classify import Axis, is_built_up
from ifccheck.sections.shapes import angle_legs, flanges, hss_flats

PHI_V_ROLLED = 1.00  # AISC 360-16 G2.1(a)
OMEGA_V_ROLLED = 1.50
PHI_V = 0.90  # AISC 360-16 G1
OMEGA_V = 1.67
KV_UNSTIFFENED = 5.34  # G2.1(b)(2)(i), webs without transverse stiffeners
KV_LEG = 1.2  # G3, G6
KV_HSS = 5.0  # G4


def cv1(h_tw: float, kv: float, e: float, fy: float) -> float:
    """Cv1 = 1.0 for h/tw ≤ 1.10√(kv·E/Fy) (G2-3), else 1.10√(kv·E/Fy)/(h/tw) (G2-4)."""
    limit = 1.10 * math.sqrt(kv * e / fy)
    return 1.0 if h_tw <= limit else limit / h_tw


def cv2(h_tw: float, kv: float, e: float, fy: float) -> float:
    """Cv2 of G2.2: 1.0 (G2-9), 1.10√(kvE/Fy)/(h/tw) (G2-10), 1.51·kv·E/((h/tw)²·Fy) (G2-11)."""
    root = math.sqrt(kv * e / fy)
    if h_tw <= 1.10 * root:
        return 1.0
    if h_tw <= 1.37 * root:
        return 1.10 * root / h_tw
    return 1.51 * kv * e / (h_tw**2 * fy)


def round_hss_fcr(e: float, fy: float, d: float, t: float, lv: float | None) -> float:
    """Fcr = max(1.60E/(√(Lv/D)(D/t)^1.25) (G5-2a), 0.78E/(D/t)^1.5 (G5-2b)) ≤ 0.6Fy.

    Without Lv (the distance from maximum to zero shear) only G5-2b is used,
    which is the lower of the two or equal: conservative.
    """
    d_t = d / t
    fcr: float = 0.78 * e / d_t**1.5
    if lv is not None and lv > 0.0:
        fcr = max(fcr, 1.60 * e / (math.sqrt(lv / d) * d_t**1.25))
    return min(fcr, 0.6 * fy)


def _result(
    vn: float, coefficient: float, rolled_a: bool, method: Method, clause: str
) -> ShearResult:
    if method == "LRFD":
        factor = PHI_V_ROLLED if rolled_a else PHI_V
        design = vn * factor
    else:
        factor = OMEGA_V_ROLLED if rolled_a else OMEGA_V
        design = vn / factor
    return ShearResult(vn, design, coefficient, factor, method, clause)


def shear(
    section: Section,
    steel: Steel,
    method: str = "LRFD",
    axis: Axis = "major",
    rolled: bool | None = None,
    lv: float | None = None,
) -> ShearResult:
    """Nominal and design shear strength for a shear force along the section's y
    (``axis="major"``, bending about x) or along x (``"minor"``).

    ``rolled`` overrides :func:`~ifccheck.sections.classify.is_built_up` for
    G2.1(a); ``lv`` is the round-HSS shear span of G5-2a. ``cv1`` of the result
    holds Cv1 for G2.1 and Cv2 for G3 to G6.
    """
    m = check_method(method)
    fy, e = steel.fy, steel.E
    fam = section.family
    if fam in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL) and axis == "major":
        h_tw = section.web_slenderness
        rolled_i = fam is ShapeFamily.I_SHAPE and (
            not is_built_up(section) if rolled is None else rolled
        )
        case_a = rolled_i and h_tw <= 2.24 * math.sqrt(e / fy)
        c = 1.0 if case_a else cv1(h_tw, KV_UNSTIFFENED, e, fy)  # G2.1(a) / G2-3, G2-4
        vn = 0.6 * fy * section.d * section.tw * c  # Eq. G2-1
        return _result(vn, c, case_a, m, f"AISC 360-16 G2.1({'a' if case_a else 'b'})")
    if fam in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL):
        vn, c_min = 0.0, 1.0
        for bf, tf in flanges(section):
            b_t = bf / tf if fam is ShapeFamily.CHANNEL else bf / (2.0 * tf)
            c = cv2(b_t, KV_LEG, e, fy)
            vn += 0.6 * fy * bf * tf * c  # Eq. G6-1, each flange
            c_min = min(c_min, c)
        return _result(vn, c_min, False, m, "AISC 360-16 G6")
    if fam is ShapeFamily.TEE:
        if axis == "major":
            b, t = section.d, section.tw  # the stem
            c = cv2(b / t, KV_LEG, e, fy)
            return _result(0.6 * fy * b * t * c, c, False, m, "AISC 360-16 G3")  # Eq. G3-1
        c = cv2(section.bf / (2.0 * section.tf), KV_LEG, e, fy)
        vn = 0.6 * fy * section.bf * section.tf * c  # Eq. G6-1
        return _result(vn, c, False, m, "AISC 360-16 G6")
    if fam is ShapeFamily.ANGLE:
        d, b = angle_legs(section)
        leg = d if axis == "major" else b
        t = section.tf
        c = cv2(leg / t, KV_LEG, e, fy)
        count = 2 if section.pair_gap is not None else 1
        return _result(count * 0.6 * fy * leg * t * c, c, False, m, "AISC 360-16 G3")
    if fam is ShapeFamily.HOLLOW_RECT:
        h, b = hss_flats(section)
        web = h if axis == "major" else b
        t = section.tw
        c = cv2(web / t, KV_HSS, e, fy)
        return _result(0.6 * fy * 2.0 * web * t * c, c, False, m, "AISC 360-16 G4")
    if fam is ShapeFamily.HOLLOW_ROUND:
        fcr = round_hss_fcr(e, fy, section.d, section.tw, lv)
        return _result(fcr * section.A / 2.0, fcr / (0.6 * fy), False, m, "AISC 360-16 G5")
    raise OutOfScope(f"{section.name}: shear of this section family is not covered (Chapter G)")
