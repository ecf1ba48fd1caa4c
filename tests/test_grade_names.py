"""Grades as models write them: yield strengths in names, EN-looking grades that are not
grades, and the settings that map material names to grades.

Sources: EN 10025-2 Table 7 (S355 by thickness); ASTM grades per AISC Manual Table 2-4
(from memory); a yield strength written in a name is the name's own statement.
"""

from __future__ import annotations

import pytest

from ifccheck.config import settings_from_dict
from ifccheck.errors import SettingsError
from ifccheck.sections import grade_problem, steel_from_name

KSI = 6.894757293168361e6
MPA = 1e6


@pytest.mark.parametrize(
    ("name", "grade", "fy"),
    [
        ("250 MPa", "Fy 250 MPa", 250 * MPA),
        ("Metal - Steel - 250 MPa", "Fy 250 MPa", 250 * MPA),
        ("Fy=50ksi", "Fy 50 ksi", 50 * KSI),
        ("Fy 345", "Fy 345 MPa", 345 * MPA),
        ("Grade 50", "Fy 50 ksi", 50 * KSI),
        ("Gr.50", "Fy 50 ksi", 50 * KSI),
        ("A572-50", "A572 Gr 50", 50 * KSI),
        ("A572 Gr 50", "A572 Gr 50", 50 * KSI),
        ("A500 Gr C", "A500 Gr C", 50 * KSI),
        ("S355J0", "S355", 355 * MPA),
        ("S355J2+N", "S355", 355 * MPA),
        ("S 355", "S355", 355 * MPA),
    ],
)
def test_grades_in_names(name: str, grade: str, fy: float) -> None:
    steel = steel_from_name(name)
    assert steel is not None and steel.grade == grade
    assert steel.fy == pytest.approx(fy)


def test_a_stated_yield_strength_gives_no_tensile_strength() -> None:
    steel = steel_from_name("250 MPa")
    assert steel is not None and steel.fu == steel.fy  # lower bound, said in the source
    assert "fu not given" in steel.source


@pytest.mark.parametrize(
    ("t_mm", "fy_mpa"), [(16, 355), (17, 345), (40, 345), (41, 335), (63, 335), (64, 325)]
)
def test_en10025_thickness_steps(t_mm: float, fy_mpa: float) -> None:
    # EN 10025-2 Table 7: S355 355 / 345 (16 < t ≤ 40) / 335 (40 < t ≤ 63) / 325 (63 < t ≤ 80)
    steel = steel_from_name("S355J2+N", t_mm * 1e-3)
    assert steel is not None and steel.fy == pytest.approx(fy_mpa * MPA)


@pytest.mark.parametrize(
    "name", ["Concrete 40 MPa", "C30/37", "Timber Grade 50", "HEA300", "Steel", "S101"]
)
def test_names_that_give_no_grade(name: str) -> None:
    assert steel_from_name(name) is None


def test_en_looking_grades_that_are_not_grades() -> None:
    assert grade_problem("S335J0") == "S335 is not an EN 10025 grade"
    assert grade_problem("_S335J0_wg") == "S335 is not an EN 10025 grade"
    assert "does not carry" in grade_problem("S690QL")
    assert grade_problem("S355J0") is None and grade_problem("S101") is None


def test_materials_table_and_default_in_the_settings() -> None:
    s = settings_from_dict(
        {"steel": {"materials": {"Metal - Steel - 250 MPa": "250 MPa", "_S335J0_wg": "S355"}}}
    )
    assert s.steel.default_grade is None  # never silent: no default unless stated
    assert s.steel.materials == {"Metal - Steel - 250 MPa": "250 MPa", "_S335J0_wg": "S355"}
    with pytest.raises(SettingsError, match=r"steel\.materials\.x: 'banana' is not a steel grade"):
        settings_from_dict({"steel": {"materials": {"x": "banana"}}})
    with pytest.raises(SettingsError, match=r"steel\.default_grade"):
        settings_from_dict({"steel": {"default_grade": "X100"}})
