"""Steel grades from material names, and the material category of a name.

Strengths are in Pa. Sources:
- ASTM grades: minimum Fy and Fu of the ASTM specifications as listed in the
  AISC Steel Construction Manual Table 2-4 (from memory); E = 29,000 ksi and
  G = 11,200 ksi per AISC 360-16 (Symbols; Chapter B).
- EN 10025-2 grades (S235, S275, S355): minimum ReH and the lower bound of Rm
  by nominal thickness, EN 10025-2 Table 7; E = 210,000 MPa and
  G = E / (2(1 + ν)) with ν = 0.3, EN 1993-1-1 3.2.6.
- S460: EN 10025-4 (thermomechanically rolled S460M/ML, the usual delivery
  condition of rolled sections) Tables 4–5, from memory; used for every S460
  quality.
- A yield strength written out in the name ("250 MPa", "Fy=50ksi", "Fy 345",
  "Grade 50", "Gr.50") is taken as the minimum yield strength; fu, not given,
  is taken equal to fy (a lower bound). A bare number is read in ksi up to 100
  and in MPa from 150 (US grades are numbered in ksi, metric grades in MPa).
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

from ifccheck.model import MaterialCategory, Steel
from ifccheck.units import to_si

KSI = to_si(1.0, "ksi")  # Pa
MPA = to_si(1.0, "MPa")

E_AISC = 29000.0 * KSI  # AISC 360-16, Chapter B
G_AISC = 11200.0 * KSI  # AISC 360-16, Symbols
E_EN = 210000.0 * MPA  # EN 1993-1-1 3.2.6(1)
G_EN = E_EN / (2.0 * (1.0 + 0.3))  # EN 1993-1-1 3.2.6(1), ν = 0.3


@dataclass(frozen=True)
class _Astm:
    grade: str
    fy_ksi: float
    fu_ksi: float
    spec: str


# ASTM grades: (Fy, Fu) in ksi, AISC Manual Table 2-4 (from memory).
_ASTM: dict[str, _Astm] = {
    g.grade: g
    for g in (
        _Astm("A992", 50.0, 65.0, "ASTM A992"),
        _Astm("A36", 36.0, 58.0, "ASTM A36"),
        _Astm("A572 Gr 42", 42.0, 60.0, "ASTM A572"),
        _Astm("A572 Gr 50", 50.0, 65.0, "ASTM A572"),
        _Astm("A572 Gr 55", 55.0, 70.0, "ASTM A572"),
        _Astm("A572 Gr 60", 60.0, 75.0, "ASTM A572"),
        _Astm("A572 Gr 65", 65.0, 80.0, "ASTM A572"),
        _Astm("A913 Gr 50", 50.0, 65.0, "ASTM A913"),
        _Astm("A913 Gr 60", 60.0, 75.0, "ASTM A913"),
        _Astm("A913 Gr 65", 65.0, 80.0, "ASTM A913"),
        _Astm("A913 Gr 70", 70.0, 90.0, "ASTM A913"),
        _Astm("A1085", 50.0, 65.0, "ASTM A1085"),
        _Astm("A53 Gr B", 35.0, 60.0, "ASTM A53"),
        # A500 rectangular HSS; round HSS have the lower Fy given in _A500_ROUND.
        _Astm("A500 Gr B", 46.0, 58.0, "ASTM A500"),
        _Astm("A500 Gr C", 50.0, 62.0, "ASTM A500"),
    )
}
_A500_ROUND = {"A500 Gr B": 42.0, "A500 Gr C": 46.0}  # ksi, round HSS

# EN grades: ReH (MPa) for t ≤ 16, ≤ 40, ≤ 63, ≤ 80, ≤ 100, ≤ 150, ≤ 200, ≤ 250 mm.
_STEPS_MM = (16.0, 40.0, 63.0, 80.0, 100.0, 150.0, 200.0, 250.0)
_EN_FY: dict[str, tuple[float, ...]] = {
    "S235": (235, 225, 215, 215, 215, 195, 185, 175),  # EN 10025-2 Table 7
    "S275": (275, 265, 255, 245, 235, 225, 215, 205),  # EN 10025-2 Table 7
    "S355": (355, 345, 335, 325, 315, 295, 285, 275),  # EN 10025-2 Table 7
    "S460": (460, 440, 430, 410, 400, 385),  # EN 10025-4 (to 120 mm), from memory
}
# Lower bound of Rm (MPa): t < 3, 3 ≤ t ≤ 100, ≤ 150, ≤ 250 mm (EN 10025-2 Table 7).
_EN_FU_STEPS_MM = (3.0, 100.0, 150.0, 250.0)
_EN_FU: dict[str, tuple[float, ...]] = {
    "S235": (360, 360, 350, 340),
    "S275": (430, 410, 400, 380),
    "S355": (510, 470, 450, 450),
}
# S460 (EN 10025-4, from memory): Rm lower bound for t ≤ 40, ≤ 63, ≤ 80, ≤ 100, ≤ 120 mm.
_S460_FU_STEPS_MM = (40.0, 63.0, 80.0, 100.0, 120.0)
_S460_FU = (540, 530, 510, 500, 490)
_S460_FY_STEPS_MM = (16.0, 40.0, 63.0, 80.0, 100.0, 120.0)

_EN_SOURCE = {
    "S235": "EN 10025-2 Table 7",
    "S275": "EN 10025-2 Table 7",
    "S355": "EN 10025-2 Table 7",
    "S460": "EN 10025-4 (S460M/ML), from memory",
}


def _clean(name: str) -> str:
    text = name.upper().replace("_", " ")
    return re.sub(r"\s+", " ", text).strip()


def _astm_grade(text: str) -> str | None:
    """Normalised ASTM grade key for a cleaned material name, or None."""
    a = r"(?<![A-Z0-9])(?:ASTM\s*)?A\s*-?\s*"
    grade = r"(?:\s*(?:GR(?:ADE)?\.?|-|/)?\s*)"
    if re.search(a + r"992(?![0-9])", text):
        return "A992"
    if re.search(a + r"1085(?![0-9])", text):
        return "A1085"
    m = re.search(a + r"572" + grade + r"(42|50|55|60|65)(?![0-9])", text)
    if m:
        return f"A572 Gr {m.group(1)}"
    m = re.search(a + r"913" + grade + r"(50|60|65|70)(?![0-9])", text)
    if m:
        return f"A913 Gr {m.group(1)}"
    m = re.search(a + r"500" + grade + r"([BC])(?![A-Z0-9])", text)
    if m:
        return f"A500 Gr {m.group(1)}"
    if re.search(a + r"53" + grade + r"B(?![A-Z0-9])", text):
        return "A53 Gr B"
    if re.search(a + r"36(?![0-9])", text):
        return "A36"
    return None


def _en_grade(text: str) -> str | None:
    m = re.search(r"(?<![A-Z0-9])S\s*-?\s*(235|275|355|460)(?![0-9])", text)
    return f"S{m.group(1)}" if m else None


# Minimum yield strengths that EN 10025 parts 2–6 give their grades (MPa, from memory).
EN_GRADE_STRENGTHS = frozenset({185, 235, 275, 355, 420, 450, 460, 500, 550, 620, 690, 890, 960})
# An EN-looking grade: S and three digits with a quality suffix (S335J0, S355J2+N, S690QL).
_EN_TOKEN = re.compile(r"(?<![A-Z0-9])S\s*-?\s*(\d{3})(?=\s*(?:JR|J0|J2|K2|NL|ML|QL|N|M|W|Q)\b|\+)")


def grade_problem(name: str) -> str | None:
    """Why an EN-looking grade in a name cannot be used ("S335 is not an EN 10025
    grade"), or None when the name has no such grade (or a usable one)."""
    if not name:
        return None
    text = _clean(name)
    if _en_grade(text) is not None or _astm_grade(text) is not None:
        return None
    m = _EN_TOKEN.search(text)
    if m is None:
        return None
    strength = int(m.group(1))
    if strength in EN_GRADE_STRENGTHS:
        return f"S{strength} is an EN 10025 grade this tool does not carry"
    return f"S{strength} is not an EN 10025 grade"


_UNIT = r"(KSI|MPA|N\s*/\s*MM2|N\s*/\s*MM²|N/MM\^2)"
_FY = re.compile(rf"(?<![A-Z])F\s*_?\s*Y\s*[=:]?\s*(\d+(?:[.,]\d+)?)\s*{_UNIT}?")
_STRESS = re.compile(rf"(?<![0-9.])(\d+(?:[.,]\d+)?)\s*{_UNIT}")
_GRADE_NUMBER = re.compile(r"(?<![A-Z])GR(?:ADE)?\s*\.?\s*(\d+)(?![0-9.])")
_PLAUSIBLE_MPA = (150.0, 1000.0)
_PLAUSIBLE_KSI = (25.0, 150.0)


def _stress(value: float, unit: str | None) -> tuple[float, str] | None:
    """(Pa, label) for a number with an optional unit; None when implausible for steel."""
    if unit is None:
        unit = "KSI" if value <= 100.0 else ("MPA" if value >= 150.0 else "")
    if unit == "KSI":
        if not _PLAUSIBLE_KSI[0] <= value <= _PLAUSIBLE_KSI[1]:
            return None
        return value * KSI, f"Fy {value:g} ksi"
    if unit:
        if not _PLAUSIBLE_MPA[0] <= value <= _PLAUSIBLE_MPA[1]:
            return None
        return value * MPA, f"Fy {value:g} MPa"
    return None


def yield_in_name(name: str) -> tuple[float, str] | None:
    """A minimum yield strength written in a name ("250 MPa", "Fy=50ksi", "Grade 50"):
    (fy in Pa, label), or None. Concrete and timber names give none."""
    if not name:
        return None
    text = _clean(name)
    if _CONCRETE.search(text) or _TIMBER.search(text):
        return None
    for pattern in (_FY, _STRESS):
        m = pattern.search(text)
        if m:
            unit = m.group(2)
            unit = None if unit is None else ("KSI" if unit == "KSI" else "MPA")
            found = _stress(float(m.group(1).replace(",", ".")), unit)
            if found is not None:
                return found
    m = _GRADE_NUMBER.search(text)
    if m:
        return _stress(float(m.group(1)), None)
    return None


def _step(value_mm: float, steps: tuple[float, ...], values: tuple[float, ...], what: str) -> float:
    for limit, v in zip(steps, values, strict=False):
        if value_mm <= limit:
            return float(v)
    raise ValueError(f"{what}: thickness {value_mm:g} mm is beyond the tabulated range")


def _en_steel(grade: str, thickest_plate: float | None, name: str) -> Steel:
    t_mm = None if thickest_plate is None else thickest_plate * 1000.0
    fy_steps: tuple[float, ...]
    fu_steps: tuple[float, ...]
    fu_values: tuple[float, ...]
    if grade == "S460":
        fy_steps, fu_steps, fu_values = _S460_FY_STEPS_MM, _S460_FU_STEPS_MM, _S460_FU
    else:
        fy_steps, fu_steps, fu_values = _STEPS_MM, _EN_FU_STEPS_MM, _EN_FU[grade]
    if t_mm is None:
        fy = float(_EN_FY[grade][0])
        # Unknown thickness: the Rm bound for 3–100 mm, below the < 3 mm value.
        fu = float(fu_values[1]) if grade != "S460" else float(fu_values[0])
        note = "thickness unknown: fy for t ≤ 16 mm"
    else:
        fy = _step(t_mm, fy_steps, _EN_FY[grade], grade)
        fu = _step(t_mm, fu_steps, fu_values, grade)
        note = f"t = {t_mm:.1f} mm"
    return Steel(
        grade=grade,
        fy=fy * MPA,
        fu=fu * MPA,
        E=E_EN,
        G=G_EN,
        source=f"{grade} per {_EN_SOURCE[grade]} ({note}), from '{name}'",
    )


def _astm_steel(grade: str, name: str, round_hss: bool) -> Steel:
    g = _ASTM[grade]
    fy = _A500_ROUND[grade] if round_hss and grade in _A500_ROUND else g.fy_ksi
    return Steel(
        grade=grade,
        fy=fy * KSI,
        fu=g.fu_ksi * KSI,
        E=E_AISC,
        G=G_AISC,
        source=f"{g.spec} per AISC Manual Table 2-4 (from memory), from '{name}'",
    )


def steel_from_name(
    material_name: str, thickest_plate: float | None = None, *, round_hss: bool = False
) -> Steel | None:
    """Steel grade named in a material name ("ASTM A992", "S355J2+N", "A572-50"...), or None.

    ``thickest_plate`` (m) reduces fy of EN grades by thickness (EN 10025-2
    Table 7); ASTM shape grades have one Fy for all rolled thicknesses.
    ``round_hss`` selects the round-HSS Fy of A500 grades.
    """
    if not material_name:
        return None
    text = _clean(material_name)
    astm = _astm_grade(text)
    if astm is not None:
        return _astm_steel(astm, material_name, round_hss)
    en = _en_grade(text)
    if en is not None:
        return _en_steel(en, thickest_plate, material_name)
    found = yield_in_name(material_name)
    if found is not None:
        fy, label = found
        steel = steel_from_yield(fy, material_name)
        note = f"{label} from '{material_name}'; fu not given, taken equal to fy"
        return Steel(label, steel.fy, steel.fu, steel.E, steel.G, note)
    return None


def _looks_en(name: str) -> bool:
    text = _clean(name)
    return bool(_en_grade(text) or re.search(r"\bEN\b|10025|EUROCODE", text))


# Yield stresses of structural steels lie in this range (Pa, common practice: the weakest
# mild steels near 170 MPa, quenched and tempered plate near 900 MPa); a value outside it
# is a unit or typing error, not a steel.
FY_PLAUSIBLE = (100e6, 1000e6)


def fy_problem(fy: float) -> str | None:
    """Why a yield stress (Pa) cannot be a structural steel's, or None if it can."""
    lo, hi = FY_PLAUSIBLE
    if not math.isfinite(fy):
        return f"yield stress {fy} is not a finite number"
    if lo <= fy <= hi:
        return None
    return (
        f"yield stress {fy / 1e6:,.4g} MPa is outside {lo / 1e6:,.0f} to {hi / 1e6:,.0f} MPa "
        "(structural steel)"
    )


def steel_from_yield(
    fy: float, name: str, *, fu: float | None = None, E: float | None = None
) -> Steel:
    """Steel of a material that gives only its yield stress (Pa).

    E defaults to 210 GPa when the name reads as a European grade, else
    29,000 ksi; fu, when not given, is taken equal to fy (a lower bound:
    no structural steel has fu < fy).
    """
    if not fy > 0.0:
        raise ValueError(f"yield stress must be positive, got {fy}")
    en = _looks_en(name)
    e = E if E is not None else (E_EN if en else E_AISC)
    g = e / (2.0 * (1.0 + 0.3)) if (en or E is not None) else G_AISC
    notes = [f"fy = {fy / MPA:.0f} MPa from material property of '{name}'"]
    if fu is None:
        notes.append("fu not given, taken equal to fy")
    return Steel(
        grade=name.strip() or "unnamed",
        fy=fy,
        fu=fu if fu is not None else fy,
        E=e,
        G=g,
        source="; ".join(notes),
    )


def known_grades() -> list[str]:
    """Grade names that ``default_steel`` accepts."""
    return [*_ASTM, *_EN_FY]


def default_steel(grade_name: str) -> Steel:
    """Steel for a configured default grade name; ValueError if unknown."""
    steel = steel_from_name(grade_name)
    if steel is None:
        raise ValueError(
            f"unknown steel grade {grade_name!r}; known grades: {', '.join(known_grades())}"
        )
    return Steel(steel.grade, steel.fy, steel.fu, steel.E, steel.G, f"default grade {steel.grade}")


_CONCRETE = re.compile(
    r"CONCRETE|BETON|BÉTON|HORMIG|CALCESTRUZZO|(?<![A-Z0-9])L?C\s?\d{2,3}\s?/\s?\d{2,3}(?![0-9])"
    r"|\d{4}\s?PSI|F'?C\s?=|(?<![A-Z])RC(?![A-Z])|REINFORCED|PRECAST|CAST[- ]IN"
)
_TIMBER = re.compile(
    r"TIMBER|WOOD|GLULAM|LUMBER|(?<![A-Z])(?:LVL|CLT|PSL|LSL|GLT|OSB)(?![A-Z])|HOLZ|BOIS"
    r"|(?<![A-Z0-9])GL\s?\d{2}\s?[HC](?![A-Z0-9])|(?<![A-Z0-9])[CD]\s?\d{2}(?![0-9/])"
    r"|\b(?:SPRUCE|PINE|FIR|LARCH|OAK|SPF|DOUGLAS|HEM[- ]FIR|BIRCH|BEECH)\b"
)
_STEEL = re.compile(r"STEEL|STAHL|ACIER|ACERO|ACCIAIO|ASTM|(?<![A-Z])(?:S|FE)\s?\d{3}(?![0-9])")
_OTHER = re.compile(r"ALUMINI?UM|MASONRY|BRICK|BLOCK|GLASS|GYPSUM|PLASTIC|FRP|STONE")


def material_category(name: str) -> MaterialCategory:
    """Concrete, timber, steel or other from a material name; UNKNOWN if it says nothing.

    Concrete classes carry a slash (EN 206 C30/37); a bare C24 or D30 is an
    EN 338 timber strength class.
    """
    if not name or not name.strip():
        return MaterialCategory.UNKNOWN
    text = _clean(name)
    if _CONCRETE.search(text):
        return MaterialCategory.CONCRETE
    if steel_from_name(name) is not None or _STEEL.search(text):
        return MaterialCategory.STEEL
    if _TIMBER.search(text):
        return MaterialCategory.TIMBER
    if _OTHER.search(text):
        return MaterialCategory.OTHER
    return MaterialCategory.UNKNOWN
