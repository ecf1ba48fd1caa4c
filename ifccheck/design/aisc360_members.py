"""AISC 360-16 for members that brace beams: Chapter E compression, Chapter D tension,
Appendix 6 beam bracing, and the axial stiffness of a bracing path.

Pure functions over :class:`~ifccheck.model.Section` / :class:`~ifccheck.model.Steel`
and SI floats (m, m², Pa, N, N·m, N/m).

- Compression (E1: φc = 0.90, Ωc = 1.67): flexural buckling E3 (E3-1 to E3-4),
  torsional and flexural-torsional buckling E4 (E4-2, E4-3 with E4-5 to E4-9)
  for doubly symmetric members with a longer torsional length, singly
  symmetric I-shapes, channels, tees, double angles and equal-leg single
  angles; single angles by E5 (E5-1 to E5-4); double angles with the modified
  slenderness of E6 (E6-2) when the connector spacing is given; slender
  elements by E7 (E7-1 to E7-5, Table E7.1; round HSS E7-7).
- Tension D2: yielding Fy·Ag (D2-1, φt = 0.90, Ωt = 1.67), rupture Fu·Ae (D2-2,
  φt = 0.75, Ωt = 2.00) with Ae = U·An (D3-1); An = Ag unless given.
- Appendix 6.3: point lateral bracing Prb (A6-7) and βbr (A6-8a, A6-8b), Cd;
  point torsional bracing Mbr (A6-9), βTb (A6-10), βT (A6-11a, A6-11b),
  βsec (A6-12), Iyeff (A6-13). (The Appendix 6 coefficients are written from
  the published text as remembered; confirm them against the standard.)
- Brace stiffness: AE/L; members in series 1/Σ(L/AE); an inclined brace
  (AE/L)·cos²θ carrying the brace force / cos θ; a line of braces tied to one
  anchor carries the sum of the brace forces beyond each segment.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from typing import Literal

from ifccheck.design.base import Method, check_method
from ifccheck.errors import OutOfScope
from ifccheck.model import Section, ShapeFamily, Steel
from ifccheck.sections.classify import is_built_up, kc_factor
from ifccheck.sections.shapes import (
    angle_legs,
    flanges,
    hss_flats,
    is_singly_symmetric_i,
    neutral_axis_from_top,
)

PHI_C, OMEGA_C = 0.90, 1.67  # E1
PHI_T_YIELD, OMEGA_T_YIELD = 0.90, 1.67  # D2(a)
PHI_T_RUPTURE, OMEGA_T_RUPTURE = 0.75, 2.00  # D2(b)
PHI_BRACE, OMEGA_BRACE = 0.75, 2.00  # A6.3.1 point bracing stiffness
PHI_TORSION, OMEGA_TORSION = 0.75, 3.00  # A6.3.2 torsional bracing stiffness
SLENDERNESS_ADVISED = 200.0  # E2 User Note: Lc/r preferably not over 200


@dataclass(frozen=True)
class AxialStrength:
    """Nominal and available axial strength of a member (N), with how it was found."""

    pn: float
    design_strength: float  # φPn (LRFD) or Pn/Ω (ASD)
    factor: float  # φ or Ω
    method: Method
    limit_state: str  # flexural_buckling, torsional_buckling, ..., yielding, rupture
    clause: str
    fcr: float = 0.0  # critical stress, Pa (compression)
    slenderness: float = 0.0  # governing (effective) Lc/r
    effective_area: float = 0.0  # Ae of E7 (compression) or of D2 (rupture), m²
    notes: tuple[str, ...] = ()


def _available(pn: float, method: Method, phi: float, omega: float) -> tuple[float, float]:
    return (pn * phi, phi) if method == "LRFD" else (pn / omega, omega)


# --- Chapter E ---------------------------------------------------------------------


def critical_stress(fy: float, fe: float) -> float:
    """Fcr = 0.658^(Fy/Fe)·Fy for Fy/Fe ≤ 2.25 (E3-2), else 0.877·Fe (E3-3)."""
    if fe <= 0.0:
        return 0.0
    return 0.658 ** (fy / fe) * fy if fy / fe <= 2.25 else 0.877 * fe


def euler_stress(e: float, slenderness: float) -> float:
    """Fe = π²E/(Lc/r)² (E3-4, E4-5, E4-6)."""
    return math.pi**2 * e / slenderness**2 if slenderness > 0.0 else math.inf


def _torsional_fez(section: Section, steel: Steel, lcz: float, ro2: float, with_cw: bool) -> float:
    """Fez = (π²E·Cw/Lcz² + G·J)/(Ag·r̄o²) (E4-7); E4-2 is the same with r̄o² = (Ix+Iy)/Ag."""
    cw = section.Cw if with_cw else 0.0
    return (math.pi**2 * steel.E * cw / lcz**2 + steel.G * section.J) / (section.A * ro2)


def _e4_singly(fe_axis: float, fez: float, h: float) -> float:
    """Fe = (Fe_s + Fez)/(2H)·[1 − √(1 − 4·Fe_s·Fez·H/(Fe_s + Fez)²)] (E4-3)."""
    s = fe_axis + fez
    return s / (2.0 * h) * (1.0 - math.sqrt(max(1.0 - 4.0 * fe_axis * fez * h / s**2, 0.0)))


def channel_shear_centre(section: Section) -> float:
    """x0 of a channel from its dimensions: the centroid x̄ = bf − Iy/Sy from the web's
    back, the shear centre eo = 3b'²tf/(6b'tf + h'tw) behind the web's centreline with
    b' = bf − tw/2, h' = d − tf (thin-walled; AISC Design Guide 9)."""
    b_c, h_c = section.bf - section.tw / 2.0, section.d - section.tf
    eo = 3.0 * b_c**2 * section.tf / (6.0 * b_c * section.tf + h_c * section.tw)
    xbar = section.bf - section.Iy / section.Sy
    return -(xbar - section.tw / 2.0 + eo)


@dataclass(frozen=True)
class _Buckling:
    fe: float
    limit_state: str
    slenderness: float
    clause: str


def _elastic_buckling(
    section: Section,
    steel: Steel,
    lcx: float,
    lcy: float,
    lcz: float,
    notes: list[str],
    single_angle: str,
    connector_spacing: float | None,
) -> _Buckling:
    """The lowest elastic buckling stress by E3 / E4 / E5 / E6 for the family."""
    e, fam = steel.E, section.family
    rx, ry = section.rx, section.ry
    if fam is ShapeFamily.ANGLE and section.pair_gap is None:
        return _single_angle(section, steel, lcx, lcz, notes, single_angle)
    slx, sly = lcx / rx, lcy / ry
    if fam is ShapeFamily.ANGLE and section.pair_gap is not None:
        sly = _modified_slenderness(section, sly, connector_spacing, notes)
    candidates = [
        _Buckling(euler_stress(e, slx), "flexural_buckling", slx, "E3"),
        _Buckling(euler_stress(e, sly), "flexural_buckling", sly, "E3"),
    ]
    polar = (section.Ix + section.Iy) / section.A
    if fam in (ShapeFamily.HOLLOW_RECT, ShapeFamily.HOLLOW_ROUND):
        pass  # closed sections: torsional buckling does not govern (E4 User Note)
    elif fam is ShapeFamily.I_SHAPE and not is_singly_symmetric_i(section):
        if lcz > lcy:  # E4: doubly symmetric members with a longer torsional length
            fe = _torsional_fez(section, steel, lcz, polar, True)  # Eq. E4-2
            candidates.append(_Buckling(fe, "torsional_buckling", sly, "E4(a)"))
    else:
        # Singly symmetric: y the axis of symmetry (I, tee, 2L), x for channels (E4 User
        # Note: Fex replaces Fey). Tees and double angles omit Cw (E4 User Note).
        with_cw = fam not in (ShapeFamily.TEE, ShapeFamily.ANGLE)
        x0, y0 = section.x0, section.y0
        if fam is ShapeFamily.CHANNEL and x0 == 0.0:
            x0 = channel_shear_centre(section)
            notes.append("channel shear centre from the thin-walled formula (not tabulated)")
        ro2 = x0**2 + y0**2 + polar  # Eq. E4-9
        h = 1.0 - (x0**2 + y0**2) / ro2  # Eq. E4-8
        fez = _torsional_fez(section, steel, lcz, ro2, with_cw)  # Eq. E4-7
        coupled = euler_stress(e, slx) if fam is ShapeFamily.CHANNEL else euler_stress(e, sly)
        fe = _e4_singly(coupled, fez, h)  # Eq. E4-3
        candidates.append(_Buckling(fe, "flexural_torsional_buckling", max(slx, sly), "E4(b)"))
    return min(candidates, key=lambda b: b.fe)


def _modified_slenderness(
    section: Section, sly: float, spacing: float | None, notes: list[str]
) -> float:
    """(Lc/r)m of E6.1 for a double angle: √((Lc/r)o² + (Ki·a/ri)²) when a/ri > 40 (E6-2b),
    Ki = 0.50 for angles back to back."""
    if spacing is None:
        notes.append("connector spacing not given: double angle taken to act as a unit (E6)")
        return sly
    ri = section.rz
    if ri <= 0.0:
        raise OutOfScope(f"{section.name}: rz of one angle is needed for E6 (modified slenderness)")
    ratio = spacing / ri
    if ratio <= 40.0:  # Eq. E6-2a
        return sly
    return math.sqrt(sly**2 + (0.50 * ratio) ** 2)  # Eq. E6-2b


def _single_angle(
    section: Section,
    steel: Steel,
    length: float,
    lcz: float,
    notes: list[str],
    mode: str,
) -> _Buckling:
    """E5 effective slenderness (single angles connected through one leg) or E3 about rz,
    with E4-3 about the axis of symmetry for equal legs with b/t > 0.71√(E/Fy)."""
    e, fy = steel.E, steel.fy
    d, b = angle_legs(section)
    t = section.tf
    equal = math.isclose(d, b, rel_tol=1e-3)
    if mode == "concentric":
        if section.rz <= 0.0:
            raise OutOfScope(f"{section.name}: rz is needed for flexural buckling of an angle")
        sl = length / section.rz
        best = _Buckling(euler_stress(e, sl), "flexural_buckling", sl, "E3")
    else:
        # ra: about the geometric axis parallel to the connected leg; Ix is about the
        # axis parallel to the horizontal leg b, Iy about the one parallel to d.
        long_leg = mode in ("planar", "box")
        connected_short = mode in ("planar_short", "box_short")
        if not long_leg and not connected_short:
            raise ValueError(f"unknown single-angle connection {mode!r}")
        connected_vertical = (d >= b) != connected_short
        ra = section.ry if connected_vertical else section.rx
        l_ra = length / ra
        planar = mode.startswith("planar")
        if planar:  # E5(a)
            sl = 72.0 + 0.75 * l_ra if l_ra <= 80.0 else min(32.0 + 1.25 * l_ra, 200.0)
        else:  # E5(b)
            sl = 60.0 + 0.8 * l_ra if l_ra <= 75.0 else min(45.0 + l_ra, 200.0)
        if connected_short and not equal:
            ratio = max(d, b) / min(d, b)
            if ratio >= 1.7:
                raise OutOfScope(
                    f"{section.name}: unequal legs {ratio:.2f} ≥ 1.7 connected by the short leg: "
                    "AISC 360-16 E5 does not apply (Chapter H)"
                )
            sl += (4.0 if planar else 6.0) * (ratio**2 - 1.0)
            if section.rz > 0.0:
                sl = max(sl, (0.95 if planar else 0.82) * length / section.rz)
        best = _Buckling(euler_stress(e, sl), "flexural_buckling", sl, "E5")
        notes.append("single angle connected through one leg: eccentricity covered by E5")
    if max(d, b) / t > 0.71 * math.sqrt(e / fy):
        if not equal:
            raise OutOfScope(
                f"{section.name}: flexural-torsional buckling of an unequal-leg angle with "
                "b/t > 0.71√(E/Fy) (E4(c)) is not implemented"
            )
        # Axis of symmetry w through the heel; shear centre at the heel, w0 from the centroid.
        w0_2 = section.x0**2 + section.y0**2
        iz = section.rz**2 * section.A
        iw = section.Ix + section.Iy - iz
        ro2 = w0_2 + (section.Ix + section.Iy) / section.A  # Eq. E4-9
        h = 1.0 - w0_2 / ro2  # Eq. E4-8
        fez = _torsional_fez(section, steel, lcz, ro2, True)  # Eq. E4-7
        few = euler_stress(e, length / math.sqrt(iw / section.A))
        fe = _e4_singly(few, fez, h)  # Eq. E4-3
        if fe < best.fe:
            best = _Buckling(fe, "flexural_torsional_buckling", best.slenderness, "E4(b)")
    return best


@dataclass(frozen=True)
class _Element:
    """A plate element for E7: width b, thickness t, λr and the Table E7.1 constants."""

    b: float
    t: float
    lam_r: float
    c1: float
    c2: float
    count: int = 1


def _elements(section: Section, steel: Steel) -> list[_Element]:
    """Elements of the section with their Table B4.1a λr and Table E7.1 c1, c2."""
    root = math.sqrt(steel.E / steel.fy)
    unstiff = (0.22, 1.49)  # Table E7.1 (c)
    stiff = (0.18, 1.31)  # Table E7.1 (a)
    fam = section.family
    if fam in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL):
        out = []
        for bf, tf in flanges(section):
            if fam is ShapeFamily.CHANNEL:
                out.append(_Element(bf, tf, 0.56 * root, *unstiff))  # case 1
            elif is_built_up(section):
                kc = kc_factor(section.web_slenderness)
                out.append(_Element(bf / 2.0, tf, 0.64 * math.sqrt(kc) * root, *unstiff, 2))
            else:
                out.append(_Element(bf / 2.0, tf, 0.56 * root, *unstiff, 2))  # case 1
        out.append(_Element(section.h, section.tw, 1.49 * root, *stiff))  # case 5
        return out
    if fam is ShapeFamily.TEE:
        return [
            _Element(section.bf / 2.0, section.tf, 0.56 * root, *unstiff, 2),  # case 1
            _Element(section.d, section.tw, 0.75 * root, *unstiff),  # case 4
        ]
    if fam is ShapeFamily.ANGLE:
        d, b = angle_legs(section)
        t = section.tf
        if section.pair_gap is None:
            return [_Element(d, t, 0.45 * root, *unstiff), _Element(b, t, 0.45 * root, *unstiff)]
        outstanding = 0.56 if section.pair_gap == 0.0 else 0.45  # case 1 in contact, else 3
        return [
            _Element(d, t, 0.45 * root, *unstiff, 2),
            _Element(b, t, outstanding * root, *unstiff, 2),
        ]
    if fam is ShapeFamily.HOLLOW_RECT:
        h, b = hss_flats(section)
        walls = (0.20, 1.38)  # Table E7.1 (b)
        t = section.tf
        return [_Element(h, t, 1.40 * root, *walls, 2), _Element(b, t, 1.40 * root, *walls, 2)]
    return []


def effective_area(section: Section, steel: Steel, fcr: float) -> float:
    """Ae of E7 for the critical stress Fcr (E7.1, E7.2).

    Each element with λ > λr·√(Fy/Fcr) keeps be = b(1 − c1√(Fel/Fcr))√(Fel/Fcr)
    (E7-3) with Fel = (c2·λr/λ)²·Fy (E7-5); round HSS by E7-7.
    """
    fy, e = steel.fy, steel.E
    if section.family is ShapeFamily.HOLLOW_ROUND:
        d_t = section.d / section.tf
        if d_t <= 0.11 * e / fy:
            return section.A
        if d_t >= 0.45 * e / fy:
            raise OutOfScope(f"{section.name}: round HSS with D/t ≥ 0.45E/Fy is outside E7")
        return (0.038 * e / (fy * d_t) + 2.0 / 3.0) * section.A  # Eq. E7-7
    if fcr <= 0.0:
        return section.A
    area = section.A
    for el in _elements(section, steel):
        lam = el.b / el.t
        if lam <= el.lam_r * math.sqrt(fy / fcr):
            continue  # Eq. E7-2: be = b
        fel = (el.c2 * el.lam_r / lam) ** 2 * fy  # Eq. E7-5
        ratio = math.sqrt(fel / fcr)
        be = el.b * (1.0 - el.c1 * ratio) * ratio  # Eq. E7-3
        area -= el.count * (el.b - max(be, 0.0)) * el.t
    return area


SingleAngleConnection = Literal["planar", "planar_short", "box", "box_short", "concentric"]


def compression_strength(
    section: Section,
    steel: Steel,
    length: float,
    method: str = "LRFD",
    *,
    k: float = 1.0,
    lcz: float | None = None,
    single_angle: SingleAngleConnection = "planar",
    connector_spacing: float | None = None,
) -> AxialStrength:
    """Available compressive strength of a member of ``length`` (m), AISC 360-16 Chapter E.

    Lc = K·L about both axes (K = 1.0 unless given); ``lcz`` is the torsional
    length (default Lc). Single angles connected through one leg use E5:
    "planar" (E5(a), an individual member or a planar truss web member,
    connected by the long leg or either leg of an equal angle), "box" (E5(b)),
    with "_short" for the short leg; "concentric" takes E3 about rz. Double
    angles take E6's modified slenderness when ``connector_spacing`` is given.
    Pn = Fcr·Ae (E3-1, E4-1, E7-1), Fcr by E3-2 / E3-3.
    """
    m = check_method(method)
    if not (length > 0.0 and k > 0.0):
        raise ValueError("length and K must be positive")
    if section.family is ShapeFamily.OTHER or not section.A > 0.0:
        raise OutOfScope(f"{section.name}: compression of this section is not covered")
    lc = k * length
    notes: list[str] = []
    buckling = _elastic_buckling(
        section, steel, lc, lc, lcz if lcz is not None else lc, notes, single_angle,
        connector_spacing,
    )  # fmt: skip
    if buckling.slenderness > SLENDERNESS_ADVISED:
        notes.append(f"Lc/r = {buckling.slenderness:.0f} above 200 (E2 User Note)")
    fcr = critical_stress(steel.fy, buckling.fe)
    ae = effective_area(section, steel, fcr)
    clause = f"AISC 360-16 {buckling.clause}"
    if ae < section.A * (1.0 - 1e-12):
        clause += ", E7"
    pn = fcr * ae
    design, factor = _available(pn, m, PHI_C, OMEGA_C)
    return AxialStrength(
        pn, design, factor, m, buckling.limit_state, clause, fcr, buckling.slenderness, ae,
        tuple(notes),
    )  # fmt: skip


# --- Chapter D -----------------------------------------------------------------------


def tension_strength(
    section: Section,
    steel: Steel,
    method: str = "LRFD",
    *,
    net_area: float | None = None,
    shear_lag: float = 1.0,
) -> AxialStrength:
    """Available tensile strength, AISC 360-16 D2: the lower of yielding on the gross
    section Fy·Ag (D2-1) and rupture on the effective net section Fu·Ae (D2-2),
    Ae = U·An (D3-1). Without ``net_area`` An is taken as Ag (no holes known), noted."""
    m = check_method(method)
    if not 0.0 < shear_lag <= 1.0:
        raise ValueError("shear lag factor U must be in (0, 1]")
    notes: list[str] = []
    an = section.A if net_area is None else net_area
    if net_area is None:
        notes.append("An taken as Ag: no holes or net section given (D2)")
    yielding, phi_y = _available(steel.fy * section.A, m, PHI_T_YIELD, OMEGA_T_YIELD)
    ae = shear_lag * an
    rupture, phi_r = _available(steel.fu * ae, m, PHI_T_RUPTURE, OMEGA_T_RUPTURE)
    if yielding <= rupture:
        return AxialStrength(steel.fy * section.A, yielding, phi_y, m, "yielding",
                             "AISC 360-16 D2(a)", effective_area=section.A,
                             notes=tuple(notes))  # fmt: skip
    return AxialStrength(steel.fu * ae, rupture, phi_r, m, "rupture", "AISC 360-16 D2(b)",
                         effective_area=ae, notes=tuple(notes))  # fmt: skip


# --- Appendix 6.3 beam bracing ----------------------------------------------------------


@dataclass(frozen=True)
class BraceRequirement:
    """Required strength (N, or N·m for torsional bracing) and stiffness (N/m, or N·m/rad)."""

    strength: float
    stiffness: float
    clause: str


def brace_cd(double_curvature: bool, nearest_inflection: bool) -> float:
    """Cd = 2.0 for the brace closest to the inflection point of a beam in double
    curvature, 1.0 otherwise (A6.3.1)."""
    return 2.0 if double_curvature and nearest_inflection else 1.0


def point_brace_requirement(
    mr: float, ho: float, lbr: float, method: str = "LRFD", cd: float = 1.0
) -> BraceRequirement:
    """Point (nodal) lateral brace of a beam's compression flange, AISC 360-16 A6.3.1(b).

    Prb = 0.02·Mr·Cd/ho (A6-7); βbr = (1/φ)·10·Mr·Cd/(Lbr·ho), φ = 0.75 (A6-8a, LRFD)
    or Ω·10·Mr·Cd/(Lbr·ho), Ω = 2.00 (A6-8b, ASD). Mr (N·m) is the required flexural
    strength at the brace, Lbr (m) the unbraced length next to it (the larger of the
    two sides, common practice), ho (m) the distance between flange centroids.
    """
    m = check_method(method)
    if not (ho > 0.0 and lbr > 0.0 and cd > 0.0):
        raise ValueError("ho, Lbr and Cd must be positive")
    mr = abs(mr)
    base = 10.0 * mr * cd / (lbr * ho)
    stiffness = base / PHI_BRACE if m == "LRFD" else base * OMEGA_BRACE
    return BraceRequirement(0.02 * mr * cd / ho, stiffness, "AISC 360-16 A6.3.1(b)")


def effective_iy(section: Section, compression_top: bool = True) -> float:
    """Iyeff = Iyc + (t/c)·Iyt (A6-13): c, t the distances from the neutral axis to the
    extreme compression and tension fibres; flange Iy = tf·bf³/12."""
    (bft, tft), (bfb, tfb) = flanges(section)
    iy_top, iy_bot = tft * bft**3 / 12.0, tfb * bfb**3 / 12.0
    c_top = neutral_axis_from_top(section)
    c_bot = section.d - c_top
    if compression_top:
        return iy_top + (c_bot / c_top) * iy_bot
    return iy_bot + (c_top / c_bot) * iy_top


@dataclass(frozen=True)
class TorsionalBraceRequirement:
    """A6.3.2(a): brace moment Mbr (N·m) and stiffnesses (N·m/rad)."""

    moment: float  # Mbr, A6-9
    brace_stiffness: float  # βT, A6-11a/b (the whole system)
    web_stiffness: float  # βsec, A6-12
    required_stiffness: float  # βTb, A6-10 (inf when βsec ≤ βT: the brace cannot work)
    clause: str = "AISC 360-16 A6.3.2(a)"


def torsional_brace_requirement(
    mr: float,
    span: float,
    braces: int,
    cb: float,
    section: Section,
    steel: Steel,
    method: str = "LRFD",
    *,
    compression_top: bool = True,
    stiffener_thickness: float = 0.0,
    stiffener_width: float = 0.0,
) -> TorsionalBraceRequirement:
    """Point torsional bracing of a beam, AISC 360-16 A6.3.2(a).

    Mbr = 0.02·Mr (A6-9); βT = (1/φ)·3.6·L/(n·E·Iyeff)·(Mr/Cb)², φ = 0.75 (A6-11a), or
    Ω·(...), Ω = 3.00 (A6-11b); βsec = 3.3E/ho·(1.5·ho·tw³/12 + ts·bs³/12) (A6-12); the
    brace needs βTb = βT/(1 − βT/βsec) (A6-10), and cannot be adequate where βsec ≤ βT
    (the web distorts first: add a stiffener). L is the span (m), n the number of braced
    points within it, Cb from Chapter F; ``stiffener_width`` is bs (twice the width for
    a pair of stiffeners), ``stiffener_thickness`` ts.
    """
    m = check_method(method)
    if not (span > 0.0 and braces >= 1 and cb > 0.0):
        raise ValueError("span, number of braces and Cb must be positive")
    mr = abs(mr)
    iyeff = effective_iy(section, compression_top)
    e = steel.E
    base = 3.6 * span / (braces * e * iyeff) * (mr / cb) ** 2
    mbr = 0.02 * mr  # Eq. A6-9
    beta_t = base / PHI_TORSION if m == "LRFD" else base * OMEGA_TORSION  # Eq. A6-11
    ho, tw = section.ho, section.tw
    ts, bs = stiffener_thickness, stiffener_width
    beta_sec = 3.3 * e / ho * (1.5 * ho * tw**3 / 12.0 + ts * bs**3 / 12.0)  # Eq. A6-12
    beta_tb = beta_t / (1.0 - beta_t / beta_sec) if beta_sec > beta_t else math.inf  # A6-10
    return TorsionalBraceRequirement(mbr, beta_t, beta_sec, beta_tb)


def beam_brace_rotational_stiffness(
    e: float, inertia: float, length: float, double_curvature: bool = False
) -> float:
    """βT of a beam brace framing into the braced girders with moment connections:
    2EI/L when the braced girders rotate the same way (single curvature of the brace),
    6EI/L in reverse curvature (AISC 360-16 Appendix 6 Commentary, from memory)."""
    if not (e > 0.0 and inertia > 0.0 and length > 0.0):
        raise ValueError("E, I and L must be positive")
    return (6.0 if double_curvature else 2.0) * e * inertia / length


# --- stiffness of a bracing path --------------------------------------------------------


def axial_stiffness(area: float, e: float, length: float) -> float:
    """k = A·E/L of one member (N/m)."""
    if not (area > 0.0 and e > 0.0 and length > 0.0):
        raise ValueError("A, E and L must be positive")
    return area * e / length


def series_stiffness(stiffnesses: Iterable[float]) -> float:
    """Springs in series: 1/Σ(1/k). A rigid part may be given as math.inf; a part with
    no stiffness (0, e.g. no anchor at the end of the line) makes the whole series 0."""
    flexibility = 0.0
    for k in stiffnesses:
        if k < 0.0 or math.isnan(k):
            raise ValueError("a stiffness in a series must not be negative")
        if k == 0.0:
            return 0.0
        flexibility += 1.0 / k
    return 1.0 / flexibility if flexibility > 0.0 else math.inf


def members_in_series(members: Iterable[tuple[float, float, float]]) -> float:
    """k = 1/Σ(L/(A·E)) of members (A m², E Pa, L m) end to end along the bracing path."""
    return series_stiffness(axial_stiffness(a, e, length) for a, e, length in members)


@dataclass(frozen=True)
class InclinedBrace:
    """An inclined brace (kicker) at angle θ to the direction it restrains."""

    stiffness: float  # (A·E/L)·cos²θ, N/m, in the restrained direction
    force_factor: float  # the brace's own axial force is the brace force × 1/cos θ


def inclined_brace(area: float, e: float, length: float, angle: float) -> InclinedBrace:
    """(A·E/L)·cos²θ and 1/cos θ for a brace of ``length`` at ``angle`` (radians) to the
    line of the brace force; θ = 0 is a strut in line with the force."""
    c = math.cos(angle)
    if not 0.0 <= angle < math.pi / 2.0 or c <= 1e-9:
        raise ValueError("the brace angle must be between 0 and 90 degrees (exclusive)")
    return InclinedBrace(axial_stiffness(area, e, length) * c * c, 1.0 / c)


@dataclass(frozen=True)
class LineSegmentCheck:
    """One segment of a bracing line, from the anchor outward."""

    required_strength: float  # Σ Prb of the braced points beyond it, N
    required_stiffness: float  # Σ βbr of the braced points beyond it, N/m
    provided_strength: float  # N
    provided_stiffness: float  # N/m

    @property
    def adequate(self) -> bool:
        return (
            self.provided_strength >= self.required_strength
            and self.provided_stiffness >= self.required_stiffness
        )


def bracing_line(
    requirements: Sequence[BraceRequirement],
    segments: Sequence[tuple[float, float]],
) -> list[LineSegmentCheck]:
    """A line of braced points tied by struts to one anchor.

    ``requirements`` are the braced points ordered from the anchor outward and
    ``segments[i]`` the (provided strength N, provided stiffness N/m) of the strut
    between point i − 1 (the anchor for i = 0) and point i. Every segment carries
    the brace forces of all the points beyond it, and must be as stiff as their
    summed requirements (Appendix 6 Commentary, from memory).
    """
    if len(requirements) != len(segments):
        raise ValueError("one strut segment per braced point is needed")
    checks = []
    for i, (strength, stiffness) in enumerate(segments):
        beyond = requirements[i:]
        checks.append(
            LineSegmentCheck(
                sum(r.strength for r in beyond),
                sum(r.stiffness for r in beyond),
                strength,
                stiffness,
            )
        )
    return checks


__all__ = [
    "AxialStrength",
    "BraceRequirement",
    "InclinedBrace",
    "LineSegmentCheck",
    "TorsionalBraceRequirement",
    "axial_stiffness",
    "beam_brace_rotational_stiffness",
    "brace_cd",
    "bracing_line",
    "compression_strength",
    "critical_stress",
    "effective_area",
    "effective_iy",
    "euler_stress",
    "inclined_brace",
    "members_in_series",
    "point_brace_requirement",
    "series_stiffness",
    "tension_strength",
    "torsional_brace_requirement",
]
