"""Load combinations: ASCE 7-16 §2.3.1 (strength design) and §2.4.1 (allowable
stress design), D and L only, and the choice of the governing combination."""

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
    strength_combinations,
)


def test_lrfd_factors() -> None:
    # ASCE 7-16 §2.3.1 combination 1: 1.4D; combination 2: 1.2D + 1.6L (+ 0.5 Lr/S/R)
    by_name = {c.name: dict(c.factors) for c in LRFD}
    assert by_name == {"1.4D": {"D": 1.4}, "1.2D+1.6L": {"D": 1.2, "L": 1.6}}
    assert all(c.purpose == "strength" and "§2.3.1" in c.source for c in LRFD)


def test_asd_factors() -> None:
    # ASCE 7-16 §2.4.1 combination 1: D; combination 2: D + L
    by_name = {c.name: dict(c.factors) for c in ASD}
    assert by_name == {"D": {"D": 1.0}, "D+L": {"D": 1.0, "L": 1.0}}
    assert all("§2.4.1" in c.source for c in ASD)


def test_service_combinations_for_deflection() -> None:
    # live load alone and the unfactored total (IBC Table 1604.3, common practice)
    assert dict(LIVE_DEFLECTION.factors) == {"L": 1.0}
    assert dict(TOTAL_DEFLECTION.factors) == {"D": 1.0, "L": 1.0}
    assert SERVICE == (LIVE_DEFLECTION, TOTAL_DEFLECTION)
    assert all(c.purpose == "service" for c in SERVICE)


def test_strength_combinations_by_method() -> None:
    assert strength_combinations("LRFD") is LRFD
    assert strength_combinations("asd") is ASD
    with pytest.raises(ValueError, match="LRFD"):
        strength_combinations("LSD")


def test_apply() -> None:
    c = LRFD[1]
    assert c.apply({"D": 10.0, "L": 5.0}) == pytest.approx(1.2 * 10 + 1.6 * 5)
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
    effects = [c.apply({"D": D, "L": L}) for c in LRFD]
    combo, value = governing(LRFD, effects)
    assert combo.name == expected
    assert value == pytest.approx(max(effects))


def test_governing_uses_magnitude() -> None:
    combos = (
        Combination("a", {"D": 1.0}, "strength", "test"),
        Combination("b", {"D": -2.0}, "strength", "test"),
    )
    combo, value = governing(combos, [5.0, -7.0])
    assert combo.name == "b" and value == 7.0


def test_governing_asd_with_live_load() -> None:
    effects = [c.apply({"D": 3.0, "L": 4.0}) for c in ASD]
    combo, value = governing(ASD, effects)
    assert combo.name == "D+L" and value == pytest.approx(7.0)


def test_governing_tie_goes_to_the_first_listed() -> None:
    combo, _ = governing(LRFD, [5.0, 5.0])
    assert combo is LRFD[0]


def test_governing_needs_one_effect_per_combination() -> None:
    with pytest.raises(ValueError):
        governing(LRFD, [1.0])
