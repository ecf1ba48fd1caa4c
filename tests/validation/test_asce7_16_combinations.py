"""Source: ASCE/SEI 7-16, *Minimum Design Loads and Associated Criteria for Buildings and
Other Structures*, American Society of Civil Engineers, Reston, VA, 2017.
Construction stage: ASCE/SEI 37-14, *Design Loads on Structures during Construction*,
American Society of Civil Engineers, Reston, VA, 2015.

Load combinations: ASCE 7-16 §2.3.1 (strength design) and §2.4.1 (allowable stress
design) for D, L, Lr, S and W; ASCE 37-14 for the construction stage; the choice of the
governing combination.

Each factor below is the standard's text, quoted from memory (the combination numbers
are those of ASCE 7-16): rain R and earthquake E are not load cases of this tool, so
§2.3.1 (5), (7) and §2.4.1 (6b), (8) are not listed and "(Lr or S or R)" is "(Lr or S)".
"""

from __future__ import annotations

import pytest

from ifccheck.loads.combinations import (
    ASD,
    LIVE_DEFLECTION,
    LRFD,
    SERVICE,
    TOTAL_DEFLECTION,
    Combination,
    governing,
    patterned,
    reduce_to,
    service_combinations,
    strength_combinations,
)


def factors(combos: tuple[Combination, ...], number: str) -> list[dict[str, float]]:
    return [dict(c.factors) for c in combos if c.number == number]


def test_lrfd_every_basic_combination_with_its_number() -> None:
    # ASCE 7-16 §2.3.1 (from memory):
    # 1. 1.4D
    assert factors(LRFD, "1") == [{"D": 1.4}]
    # 2. 1.2D + 1.6L + 0.5(Lr or S or R)
    assert factors(LRFD, "2") == [
        {"D": 1.2, "L": 1.6, "Lr": 0.5},
        {"D": 1.2, "L": 1.6, "S": 0.5},
    ]
    # 3. 1.2D + 1.6(Lr or S or R) + (L or 0.5W)
    assert factors(LRFD, "3") == [
        {"D": 1.2, "Lr": 1.6, "L": 1.0},
        {"D": 1.2, "Lr": 1.6, "W": 0.5},
        {"D": 1.2, "S": 1.6, "L": 1.0},
        {"D": 1.2, "S": 1.6, "W": 0.5},
    ]
    # 4. 1.2D + 1.0W + L + 0.5(Lr or S or R)
    assert factors(LRFD, "4") == [
        {"D": 1.2, "W": 1.0, "L": 1.0, "Lr": 0.5},
        {"D": 1.2, "W": 1.0, "L": 1.0, "S": 0.5},
    ]
    # 5. 1.2D + 1.0E + L + 0.2S: earthquake, not a case here
    assert factors(LRFD, "5") == []
    # 6. 0.9D + 1.0W
    assert factors(LRFD, "6") == [{"D": 0.9, "W": 1.0}]
    # 7. 0.9D + 1.0E: earthquake
    assert factors(LRFD, "7") == []
    assert all(c.purpose == "strength" and f"§2.3.1 ({c.number})" in c.source for c in LRFD)


def test_asd_every_basic_combination_with_its_number() -> None:
    # ASCE 7-16 §2.4.1 (from memory):
    assert factors(ASD, "1") == [{"D": 1.0}]  # 1. D
    assert factors(ASD, "2") == [{"D": 1.0, "L": 1.0}]  # 2. D + L
    # 3. D + (Lr or S or R)
    assert factors(ASD, "3") == [{"D": 1.0, "Lr": 1.0}, {"D": 1.0, "S": 1.0}]
    # 4. D + 0.75L + 0.75(Lr or S or R)
    assert factors(ASD, "4") == [
        {"D": 1.0, "L": 0.75, "Lr": 0.75},
        {"D": 1.0, "L": 0.75, "S": 0.75},
    ]
    assert factors(ASD, "5") == [{"D": 1.0, "W": 0.6}]  # 5. D + (0.6W or 0.7E)
    # 6a. D + 0.75L + 0.75(0.6W) + 0.75(Lr or S or R)
    six = factors(ASD, "6a")
    assert [f["W"] for f in six] == [pytest.approx(0.45)] * 2
    assert [{k: v for k, v in f.items() if k != "W"} for f in six] == [
        {"D": 1.0, "L": 0.75, "Lr": 0.75},
        {"D": 1.0, "L": 0.75, "S": 0.75},
    ]
    assert factors(ASD, "6b") == []  # 6b. D + 0.75L + 0.75(0.7E) + 0.75S: earthquake
    assert factors(ASD, "7") == [{"D": 0.6, "W": 0.6}]  # 7. 0.6D + 0.6W
    assert factors(ASD, "8") == []  # 8. 0.6D + 0.7E: earthquake
    assert all(f"§2.4.1 ({c.number})" in c.source for c in ASD)


def test_names_as_the_standard_writes_them() -> None:
    names = [c.name for c in LRFD]
    assert names == [
        "1.4D",
        "1.2D+1.6L+0.5Lr", "1.2D+1.6L+0.5S",
        "1.2D+1.6Lr+L", "1.2D+1.6Lr+0.5W", "1.2D+1.6S+L", "1.2D+1.6S+0.5W",
        "1.2D+1.0W+L+0.5Lr", "1.2D+1.0W+L+0.5S",
        "0.9D+1.0W",
    ]  # fmt: skip
    assert "0.6D+0.6W" in [c.name for c in ASD]


def test_construction_combinations_from_asce_37() -> None:
    # ASCE 37-14 §2.2 (from memory): the ASCE 7 combinations with the construction dead
    # load (steel and wet concrete) as D and the construction live load C for L
    lrfd = strength_combinations("LRFD", "construction")
    assert [(c.name, dict(c.factors)) for c in lrfd] == [
        ("1.4D", {"D": 1.4}),
        ("1.2D+1.6C", {"D": 1.2, "C": 1.6}),
    ]
    asd = strength_combinations("ASD", "construction")
    assert [dict(c.factors) for c in asd] == [{"D": 1.0}, {"D": 1.0, "C": 1.0}]
    assert all("ASCE 37-14" in c.source and "from memory" in c.source for c in (*lrfd, *asd))


def test_reduced_to_the_cases_that_load_a_beam() -> None:
    # a floor beam (D and L only): §2.3.1 (1), (2) and (3)/(4) without roof loads or wind;
    # 0.9D from (6) is the 1.4D diagram scaled down and can govern nothing
    floor = reduce_to(LRFD, {"L"})
    assert [(c.name, c.number) for c in floor] == [
        ("1.4D", "1"), ("1.2D+1.6L", "2"), ("1.2D+L", "3"),
    ]  # fmt: skip
    # a roof with snow and uplift, no floor live load
    roof = reduce_to(LRFD, {"S", "W"})
    assert "0.9D+1.0W" in [c.name for c in roof]
    assert "1.2D+1.6S" in [c.name for c in roof]
    assert not any("L" in c.factors or "Lr" in c.factors for c in roof)
    # ASD on a floor: (1), (2), (4); 0.6D of (7) is dropped beside D
    assert [c.name for c in reduce_to(ASD, {"L"})] == ["D", "D+L", "D+0.75L"]


def test_uplift_reverses_the_moment_only_where_it_exceeds_0_9D() -> None:
    # 0.9D + 1.0W with W upward (negative effect): net uplift when W > 0.9D
    combo = next(c for c in LRFD if c.number == "6")
    assert combo.apply({"D": 10.0, "W": -12.0}) == pytest.approx(9.0 - 12.0)
    assert combo.apply({"D": 10.0, "W": -8.0}) > 0


def test_service_combinations_for_deflection() -> None:
    # each variable gravity load alone and with D (IBC Table 1604.3, common practice)
    assert dict(LIVE_DEFLECTION.factors) == {"L": 1.0}
    assert dict(TOTAL_DEFLECTION.factors) == {"D": 1.0, "L": 1.0}
    assert LIVE_DEFLECTION in SERVICE and TOTAL_DEFLECTION in SERVICE
    assert all(c.purpose == "service" for c in SERVICE)
    assert [c.name for c in service_combinations({"L"})] == ["L", "D+L"]
    assert [c.name for c in service_combinations({"S"})] == ["L", "S", "D+L", "D+S"]


def test_strength_combinations_by_method() -> None:
    assert strength_combinations("LRFD") is LRFD
    assert strength_combinations("asd") is ASD
    with pytest.raises(ValueError, match="LRFD"):
        strength_combinations("LSD")


def test_apply() -> None:
    c = next(c for c in LRFD if c.name == "1.2D+1.6L+0.5S")
    assert c.apply({"D": 10.0, "L": 5.0, "S": 2.0}) == pytest.approx(1.2 * 10 + 1.6 * 5 + 1.0)
    assert c.apply({"D": 10.0}) == pytest.approx(12.0)  # a missing case is zero


@pytest.mark.parametrize(
    ("D", "L", "expected"),
    [
        # 1.4D = 14.0 > 1.2D + 1.6L = 12.8: dead load dominates
        (10.0, 0.5, "1.4D"),
        # 1.2D + 1.6L = 20 > 1.4D = 14 for an ordinary floor
        (10.0, 5.0, "1.2D+1.6L"),
        # just above the break-even L/D = 1/8 (where 1.4D = 1.2D + 1.6L)
        (8.0, 1.01, "1.2D+1.6L"),
    ],
)
def test_governing_lrfd(D: float, L: float, expected: str) -> None:
    combos = reduce_to(LRFD, {"L"})
    effects = [c.apply({"D": D, "L": L}) for c in combos]
    combo, value = governing(combos, effects)
    assert combo.name == expected
    assert value == pytest.approx(max(effects))


def test_governing_lrfd_snow_roof() -> None:
    # 1.2D + 1.6S (§2.3.1 (3)) against 1.4D: snow governs when 0.2D < 1.6S
    combos = reduce_to(LRFD, {"S"})
    effects = [c.apply({"D": 25.0, "S": 21.0}) for c in combos]
    assert governing(combos, effects)[0].name == "1.2D+1.6S"


def test_governing_uses_magnitude() -> None:
    combos = (
        Combination("a", {"D": 1.0}, "strength", "test"),
        Combination("b", {"D": -2.0}, "strength", "test"),
    )
    combo, value = governing(combos, [5.0, -7.0])
    assert combo.name == "b" and value == 7.0


def test_governing_asd_with_live_load() -> None:
    combos = reduce_to(ASD, {"L"})
    effects = [c.apply({"D": 3.0, "L": 4.0}) for c in combos]
    combo, value = governing(combos, effects)
    assert combo.name == "D+L" and value == pytest.approx(7.0)


def test_governing_tie_goes_to_the_first_listed() -> None:
    combo, _ = governing(LRFD[:2], [5.0, 5.0])
    assert combo is LRFD[0]


def test_governing_needs_one_effect_per_combination() -> None:
    with pytest.raises(ValueError):
        governing(LRFD, [1.0])


def test_patterns_move_every_live_case_together() -> None:
    # ASCE 7-16 §4.3.3: live load on part of the member; L and Lr on the same regions
    c = next(c for c in LRFD if c.name == "1.2D+1.6Lr+L")
    (p,) = patterned(c, [(1,)], ["span 1", "overhang"])
    assert p.name == "1.2D+1.6Lr+L (L, Lr on overhang)"
    assert dict(p.factors) == {"D": 1.2, "Lr@1": 1.6, "L@1": 1.0}
    assert patterned(next(c for c in LRFD if c.name == "0.9D+1.0W"), [(0,)]) == []
