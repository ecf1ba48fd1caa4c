"""Steel grades and material categories from material names."""

from __future__ import annotations

import pytest

from ifccheck.model import MaterialCategory
from ifccheck.sections import (
    default_steel,
    known_grades,
    material_category,
    steel_from_name,
    steel_from_yield,
)

KSI = 6.894757293168361e6
MPA = 1e6


@pytest.mark.parametrize(
    ("name", "grade", "fy_ksi", "fu_ksi"),
    [
        # ASTM minimum Fy / Fu, AISC Manual Table 2-4 (from memory)
        ("A992", "A992", 50, 65),
        ("ASTM A992", "A992", 50, 65),
        ("Steel - ASTM A992/A992M", "A992", 50, 65),
        ("A572 Gr 50", "A572 Gr 50", 50, 65),
        ("A572-50", "A572 Gr 50", 50, 65),
        ("ASTM A572 Grade 50", "A572 Gr 50", 50, 65),
        ("A572 Gr. 65", "A572 Gr 65", 65, 80),
        ("A36", "A36", 36, 58),
        ("ASTM A36", "A36", 36, 58),
        ("A913 Gr 65", "A913 Gr 65", 65, 80),
        ("A500 Gr B", "A500 Gr B", 46, 58),
        ("ASTM A500 Grade C", "A500 Gr C", 50, 62),
    ],
)
def test_astm_grades(name: str, grade: str, fy_ksi: float, fu_ksi: float) -> None:
    steel = steel_from_name(name, None)
    assert steel is not None
    assert steel.grade == grade
    assert pytest.approx(fy_ksi * KSI) == steel.fy
    assert pytest.approx(fu_ksi * KSI) == steel.fu
    assert pytest.approx(29000 * KSI) == steel.E  # AISC 360-16, Chapter B
    assert pytest.approx(11200 * KSI) == steel.G  # AISC 360-16, Symbols
    assert name in steel.source


def test_astm_thickness_does_not_reduce_fy() -> None:
    # ASTM A992 has one minimum Fy for all rolled shapes (ASTM A992).
    thin = steel_from_name("A992", 0.01)
    thick = steel_from_name("A992", 0.12)
    assert thin is not None and thick is not None and thin.fy == thick.fy


def test_a500_round_hss() -> None:
    # Round HSS: A500 Gr B Fy 42 ksi, Gr C 46 ksi (AISC Manual Table 2-4, from memory).
    b = steel_from_name("A500 Gr B", round_hss=True)
    c = steel_from_name("A500 Gr C", round_hss=True)
    assert b is not None and c is not None
    assert pytest.approx(42 * KSI) == b.fy
    assert pytest.approx(46 * KSI) == c.fy


@pytest.mark.parametrize(
    ("name", "grade"),
    [
        ("S235", "S235"),
        ("S275", "S275"),
        ("S355", "S355"),
        ("S355JR", "S355"),
        ("S355J2+N", "S355"),
        ("Steel S355", "S355"),
        ("EN 10025 S275", "S275"),
        ("S 235 JR", "S235"),
        ("S460M", "S460"),
    ],
)
def test_en_grade_names(name: str, grade: str) -> None:
    steel = steel_from_name(name, None)
    assert steel is not None
    assert steel.grade == grade
    assert pytest.approx(210000 * MPA) == steel.E  # EN 1993-1-1 3.2.6
    assert pytest.approx(210000 * MPA / 2.6) == steel.G  # G = E/(2(1 + 0.3))


# ReH (MPa) by nominal thickness, EN 10025-2 Table 7.
@pytest.mark.parametrize(
    ("grade", "t_mm", "fy"),
    [
        ("S235", 10, 235), ("S235", 16, 235), ("S235", 16.1, 225), ("S235", 40, 225),
        ("S235", 50, 215), ("S235", 100, 215), ("S235", 120, 195),
        ("S275", 12, 275), ("S275", 30, 265), ("S275", 50, 255), ("S275", 70, 245),
        ("S275", 90, 235),
        ("S355", 16, 355), ("S355", 25, 345), ("S355", 63, 335), ("S355", 63.5, 325),
        ("S355", 80, 325), ("S355", 95, 315), ("S355", 140, 295),
        # EN 10025-4 S460M (from memory)
        ("S460", 16, 460), ("S460", 30, 440), ("S460", 50, 430), ("S460", 70, 410),
    ],
)  # fmt: skip
def test_en_thickness_reduction(grade: str, t_mm: float, fy: float) -> None:
    steel = steel_from_name(grade, t_mm / 1000.0)
    assert steel is not None
    assert pytest.approx(fy * MPA) == steel.fy


@pytest.mark.parametrize(
    ("grade", "t_mm", "fu"),
    [
        # lower bound of Rm, EN 10025-2 Table 7: t < 3 mm, 3–100 mm, 100–150 mm
        ("S235", 2, 360), ("S235", 20, 360), ("S235", 120, 350),
        ("S275", 2, 430), ("S275", 20, 410), ("S275", 120, 400),
        ("S355", 2, 510), ("S355", 20, 470), ("S355", 120, 450),
    ],
)  # fmt: skip
def test_en_tensile_strength(grade: str, t_mm: float, fu: float) -> None:
    steel = steel_from_name(grade, t_mm / 1000.0)
    assert steel is not None
    assert pytest.approx(fu * MPA) == steel.fu


def test_en_unknown_thickness_takes_first_step() -> None:
    steel = steel_from_name("S355", None)
    assert steel is not None
    assert pytest.approx(355 * MPA) == steel.fy
    assert pytest.approx(470 * MPA) == steel.fu  # 3–100 mm bound, EN 10025-2 Table 7
    assert "unknown" in steel.source


def test_thickness_beyond_table_is_an_error() -> None:
    with pytest.raises(ValueError, match="beyond"):
        steel_from_name("S355", 0.300)


@pytest.mark.parametrize("name", ["", "Steel", "Concrete C30/37", "A913", "A572", "S999", "GL24h"])
def test_unrecognised_names(name: str) -> None:
    assert steel_from_name(name, None) is None


def test_steel_from_yield() -> None:
    s = steel_from_yield(345 * MPA, "Custom steel")
    assert s.fy == 345 * MPA
    assert s.fu == s.fy  # not given: lower bound fu = fy
    assert pytest.approx(29000 * KSI) == s.E
    assert pytest.approx(11200 * KSI) == s.G
    assert "fu not given" in s.source
    en = steel_from_yield(355 * MPA, "EN 10025 special", fu=490 * MPA)
    assert en.fu == 490 * MPA
    assert pytest.approx(210000 * MPA) == en.E
    with pytest.raises(ValueError):
        steel_from_yield(0.0, "bad")


def test_default_steel() -> None:
    s = default_steel("A992")
    assert pytest.approx(50 * KSI) == s.fy
    assert s.source.startswith("default grade")
    assert "S355" in known_grades() and "A992" in known_grades()
    with pytest.raises(ValueError, match="unknown steel grade 'X100'"):
        default_steel("X100")


@pytest.mark.parametrize(
    ("name", "category"),
    [
        ("C30/37", MaterialCategory.CONCRETE),
        ("Concrete", MaterialCategory.CONCRETE),
        ("Cast-in-place concrete 4000 psi", MaterialCategory.CONCRETE),
        ("4000 psi", MaterialCategory.CONCRETE),
        ("Beton C25/30", MaterialCategory.CONCRETE),
        ("GL24h", MaterialCategory.TIMBER),
        ("Wood", MaterialCategory.TIMBER),
        ("Timber - Softwood C24", MaterialCategory.TIMBER),
        ("Glulam", MaterialCategory.TIMBER),
        ("LVL", MaterialCategory.TIMBER),
        ("Douglas Fir", MaterialCategory.TIMBER),
        ("Steel", MaterialCategory.STEEL),
        ("S355", MaterialCategory.STEEL),
        ("ASTM A992", MaterialCategory.STEEL),
        ("Structural Steel", MaterialCategory.STEEL),
        ("Aluminium 6061", MaterialCategory.OTHER),
        ("", MaterialCategory.UNKNOWN),
        ("Material 1", MaterialCategory.UNKNOWN),
        ("Fire board", MaterialCategory.UNKNOWN),
    ],
)
def test_material_category(name: str, category: MaterialCategory) -> None:
    assert material_category(name) is category
