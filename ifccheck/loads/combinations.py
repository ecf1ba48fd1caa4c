"""Load combinations (ASCE 7-16) as data, and the choice of the governing one.

Only dead (D) and live (L) loads are computed by the demand stage, so only
the combinations in which they appear are listed; others (roof live, snow,
wind, earthquake) can be added to these tables as the cases are added.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Literal

Method = Literal["LRFD", "ASD"]
Purpose = Literal["strength", "service"]


@dataclass(frozen=True)
class Combination:
    """A named linear combination of load cases."""

    name: str
    factors: Mapping[str, float]
    purpose: Purpose
    source: str

    def apply(self, values: Mapping[str, float]) -> float:
        """Σ factor × value over the cases (a missing case counts as zero)."""
        return sum(f * values.get(case, 0.0) for case, f in self.factors.items())


# ASCE 7-16 §2.3.1 basic combinations for strength design (LRFD), D and L only:
# (1) 1.4D; (2) 1.2D + 1.6L + 0.5(Lr or S or R). Combinations (3)-(5) with
# only D and L present reduce to 1.2D + 1.0L, 1.2D + 0.5L or 0.9D, which never
# exceed (1) or (2) for gravity loads, so they are not listed.
LRFD: tuple[Combination, ...] = (
    Combination("1.4D", {"D": 1.4}, "strength", "ASCE 7-16 §2.3.1 (1)"),
    Combination("1.2D+1.6L", {"D": 1.2, "L": 1.6}, "strength", "ASCE 7-16 §2.3.1 (2)"),
)

# ASCE 7-16 §2.4.1 basic combinations for allowable stress design (ASD):
# (1) D; (2) D + L. (4) D + 0.75L + 0.75(Lr or S or R) is below (2) without
# roof or snow load.
ASD: tuple[Combination, ...] = (
    Combination("D", {"D": 1.0}, "strength", "ASCE 7-16 §2.4.1 (1)"),
    Combination("D+L", {"D": 1.0, "L": 1.0}, "strength", "ASCE 7-16 §2.4.1 (2)"),
)

# Serviceability: live load alone for the live-load deflection limit and the
# unfactored total for the total-load limit (IBC Table 1604.3, common practice).
LIVE_DEFLECTION = Combination("L", {"L": 1.0}, "service", "IBC Table 1604.3 (L)")
TOTAL_DEFLECTION = Combination("D+L", {"D": 1.0, "L": 1.0}, "service", "IBC Table 1604.3 (D+L)")
SERVICE: tuple[Combination, ...] = (LIVE_DEFLECTION, TOTAL_DEFLECTION)


def strength_combinations(method: str) -> tuple[Combination, ...]:
    """The strength combinations for "LRFD" or "ASD"."""
    m = method.upper()
    if m == "LRFD":
        return LRFD
    if m == "ASD":
        return ASD
    raise ValueError(f"design method must be 'LRFD' or 'ASD', not {method!r}")


def governing(
    combinations: Sequence[Combination], effects: Sequence[float]
) -> tuple[Combination, float]:
    """The combination with the largest effect magnitude (the first one on a tie).

    ``effects`` are the magnitudes (e.g. max |M| of each combination's
    diagram), in the order of ``combinations``.
    """
    if len(combinations) != len(effects) or not combinations:
        raise ValueError("one effect per combination is needed")
    best = max(range(len(effects)), key=lambda i: (abs(effects[i]), -i))
    return combinations[best], abs(effects[best])
