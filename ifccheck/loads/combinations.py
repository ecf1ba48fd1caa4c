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


def live_patterns(regions: int) -> list[tuple[int, ...]]:
    """Sets of loaded regions (spans and overhangs) for partial live loading.

    ASCE 7-16 §4.3.3: live load on only part of a member counts where it is
    more unfavourable. Up to four regions every proper subset is tried; beyond
    that single regions, adjacent pairs and alternate regions (common practice:
    these produce the extreme moments of continuous beams).
    """
    if regions < 2:
        return []
    if regions <= 4:
        return [
            tuple(k for k in range(regions) if mask >> k & 1)
            for mask in range(1, (1 << regions) - 1)
        ]
    sets: set[tuple[int, ...]] = {(k,) for k in range(regions)}
    sets |= {(k, k + 1) for k in range(regions - 1)}
    sets |= {tuple(range(0, regions, 2)), tuple(range(1, regions, 2))}
    return sorted(sets)


def patterned(
    combo: Combination,
    patterns: Sequence[tuple[int, ...]],
    labels: Sequence[str] | None = None,
) -> list[Combination]:
    """``combo`` with its live load on each pattern of regions (cases "L@k").

    ``labels`` name the regions in the combination's name ("span 1", "overhang").
    """
    if "L" not in combo.factors:
        return []
    out = []
    for loaded in patterns:
        factors = {c: f for c, f in combo.factors.items() if c != "L"}
        factors.update({f"L@{k}": combo.factors["L"] for k in loaded})
        where = ", ".join(labels[k] if labels else f"part {k + 1}" for k in loaded)
        out.append(
            Combination(
                f"{combo.name} (L on {where})",
                factors,
                combo.purpose,
                f"{combo.source}; ASCE 7-16 §4.3.3 partial loading",
            )
        )
    return out
