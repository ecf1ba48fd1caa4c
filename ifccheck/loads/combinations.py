"""Load combinations (ASCE 7-16 §2.3.1, §2.4.1; ASCE 37-14) as data, and the governing one.

The load cases are dead D, floor live L, roof live Lr, snow S and wind W (the
strength-level uplift the settings give), and, for the construction stage,
construction live load C. The basic combinations are written as the standard
writes them, each term a load or a choice of loads ("0.5(Lr or S)"); rain R and
earthquake E are not load cases here, so §2.3.1 combinations 5 and 7 and §2.4.1
combinations 6b and 8 (the earthquake ones) are not listed, and "(Lr or S or R)"
is "(Lr or S)". W acts upward: in the combinations that subtract dead load
(§2.3.1 (6) 0.9D + 1.0W, §2.4.1 (7) 0.6D + 0.6W) the uplift reverses the moment.

``reduce_to`` keeps, for one beam, the combinations of the cases that load it,
named by what is left ("1.2D+1.6L"), without duplicates and without dead-load-only
combinations that another dead-load-only one exceeds everywhere (0.9D beside 1.4D):
such a diagram is the same shape, scaled down, so it can govern nothing.
"""

from __future__ import annotations

import itertools
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from typing import Literal

Method = Literal["LRFD", "ASD"]
Purpose = Literal["strength", "service"]

CASES = ("D", "L", "Lr", "S", "W")  # the in-service load cases
CONSTRUCTION_CASES = ("D", "C")
# The floor live load that live load reduction (ASCE 7-16 §4.7) reduces, L0 of Eq. 4.7-1:
# an analysis case of its own beside "L" (partitions, line and point loads, floors where
# §4.7 does not apply or is not asked for), and named L in every output.
REDUCIBLE = "L0"
# Live loads that may be on part of a member only (ASCE 7-16 §4.3.3): the floor live
# load (both parts), roof live load and construction live load.
PATTERNED = ("L", REDUCIBLE, "Lr", "C")


@dataclass(frozen=True)
class Combination:
    """A named linear combination of load cases."""

    name: str
    factors: Mapping[str, float]
    purpose: Purpose
    source: str
    number: str = ""  # the combination's number in its standard, "2", "6a"

    def apply(self, values: Mapping[str, float]) -> float:
        """Σ factor × value over the cases (a missing case counts as zero)."""
        return sum(f * values.get(case, 0.0) for case, f in self.factors.items())


# A term is one load with its factor, or a choice: (factor, case) alternatives.
Term = tuple[tuple[float, str], ...]


@dataclass(frozen=True)
class Basic:
    """One basic combination as the standard writes it: numbered terms."""

    number: str
    terms: tuple[Term, ...]
    source: str


def _t(*alternatives: tuple[float, str]) -> Term:
    return tuple(alternatives)


# ASCE 7-16 §2.3.1 basic combinations for strength design (quoted from memory):
#   1. 1.4D
#   2. 1.2D + 1.6L + 0.5(Lr or S or R)
#   3. 1.2D + 1.6(Lr or S or R) + (L or 0.5W)
#   4. 1.2D + 1.0W + L + 0.5(Lr or S or R)
#   5. 1.2D + 1.0E + L + 0.2S          (earthquake: not listed)
#   6. 0.9D + 1.0W
#   7. 0.9D + 1.0E                     (earthquake: not listed)
# Exception 1 of §2.3.1 (0.5L in 3 to 5 where L0 ≤ 100 psf) is a permission; it is
# not taken (the factor on L stays 1.0, conservative).
_S231 = "ASCE 7-16 §2.3.1"
LRFD_BASIC: tuple[Basic, ...] = (
    Basic("1", (_t((1.4, "D")),), f"{_S231} (1)"),
    Basic("2", (_t((1.2, "D")), _t((1.6, "L")), _t((0.5, "Lr"), (0.5, "S"))), f"{_S231} (2)"),
    Basic(
        "3",
        (_t((1.2, "D")), _t((1.6, "Lr"), (1.6, "S")), _t((1.0, "L"), (0.5, "W"))),
        f"{_S231} (3)",
    ),
    Basic(
        "4",
        (_t((1.2, "D")), _t((1.0, "W")), _t((1.0, "L")), _t((0.5, "Lr"), (0.5, "S"))),
        f"{_S231} (4)",
    ),
    Basic("6", (_t((0.9, "D")), _t((1.0, "W"))), f"{_S231} (6)"),
)

# ASCE 7-16 §2.4.1 basic combinations for allowable stress design (quoted from memory):
#   1. D
#   2. D + L
#   3. D + (Lr or S or R)
#   4. D + 0.75L + 0.75(Lr or S or R)
#   5. D + (0.6W or 0.7E)
#   6a. D + 0.75L + 0.75(0.6W) + 0.75(Lr or S or R)
#   6b. D + 0.75L + 0.75(0.7E) + 0.75S  (earthquake: not listed)
#   7. 0.6D + 0.6W
#   8. 0.6D + 0.7E                      (earthquake: not listed)
_S241 = "ASCE 7-16 §2.4.1"
ASD_BASIC: tuple[Basic, ...] = (
    Basic("1", (_t((1.0, "D")),), f"{_S241} (1)"),
    Basic("2", (_t((1.0, "D")), _t((1.0, "L"))), f"{_S241} (2)"),
    Basic("3", (_t((1.0, "D")), _t((1.0, "Lr"), (1.0, "S"))), f"{_S241} (3)"),
    Basic("4", (_t((1.0, "D")), _t((0.75, "L")), _t((0.75, "Lr"), (0.75, "S"))), f"{_S241} (4)"),
    Basic("5", (_t((1.0, "D")), _t((0.6, "W"))), f"{_S241} (5)"),
    Basic(
        "6a",
        (_t((1.0, "D")), _t((0.75, "L")), _t((0.75 * 0.6, "W")), _t((0.75, "Lr"), (0.75, "S"))),
        f"{_S241} (6a)",
    ),
    Basic("7", (_t((0.6, "D")), _t((0.6, "W"))), f"{_S241} (7)"),
)

# ASCE 37-14 §2.2 (from memory): during construction the ASCE 7 combinations apply,
# the construction dead load (the steel and the wet concrete on it) as D and the
# construction live load (personnel, equipment, placement) C in the place of L.
_A37 = "ASCE 37-14 §2.2 (from memory)"
CONSTRUCTION_LRFD: tuple[Basic, ...] = (
    Basic("1", (_t((1.4, "D")),), f"{_A37}, with {_S231} (1)"),
    Basic("2", (_t((1.2, "D")), _t((1.6, "C"))), f"{_A37}, with {_S231} (2)"),
)
CONSTRUCTION_ASD: tuple[Basic, ...] = (
    Basic("1", (_t((1.0, "D")),), f"{_A37}, with {_S241} (1)"),
    Basic("2", (_t((1.0, "D")), _t((1.0, "C"))), f"{_A37}, with {_S241} (2)"),
)


def _number(f: float) -> str:
    return f"{f:.2f}".rstrip("0").rstrip(".")


def combination_name(factors: Mapping[str, float]) -> str:
    """'1.2D+1.6L+0.5S', '0.9D+1.0W', 'D+L': as the standards write them, terms in the
    order given (a factor of 1.0 shown for W only, as ASCE 7-16 does)."""
    parts = []
    for case, f in factors.items():
        if f == 0.0:
            continue
        text = ("1.0" if case == "W" else "") if f == 1.0 else _number(f)
        parts.append(text + case)
    return "+".join(parts)


def expand(basics: Iterable[Basic]) -> tuple[Combination, ...]:
    """Every choice of every basic combination ("Lr or S" → one with Lr, one with S)."""
    out: list[Combination] = []
    for b in basics:
        for choice in itertools.product(*b.terms):
            factors = {case: f for f, case in choice}
            out.append(Combination(combination_name(factors), factors, "strength", b.source,
                                   b.number))  # fmt: skip
    return tuple(out)


LRFD: tuple[Combination, ...] = expand(LRFD_BASIC)
ASD: tuple[Combination, ...] = expand(ASD_BASIC)

# Serviceability: each variable gravity load alone for the live-load deflection limit and
# with the dead load for the total-load limit (IBC Table 1604.3, common practice).
LIVE_DEFLECTION = Combination("L", {"L": 1.0}, "service", "IBC Table 1604.3 (L)")
TOTAL_DEFLECTION = Combination("D+L", {"D": 1.0, "L": 1.0}, "service", "IBC Table 1604.3 (D+L)")
SERVICE: tuple[Combination, ...] = (
    LIVE_DEFLECTION,
    Combination("Lr", {"Lr": 1.0}, "service", "IBC Table 1604.3 (Lr)"),
    Combination("S", {"S": 1.0}, "service", "IBC Table 1604.3 (S)"),
    TOTAL_DEFLECTION,
    Combination("D+Lr", {"D": 1.0, "Lr": 1.0}, "service", "IBC Table 1604.3 (D+Lr)"),
    Combination("D+S", {"D": 1.0, "S": 1.0}, "service", "IBC Table 1604.3 (D+S)"),
)


def strength_combinations(method: str, stage: str = "in_service") -> tuple[Combination, ...]:
    """Every strength combination for "LRFD" or "ASD", in service or during construction."""
    m = method.upper()
    if m not in ("LRFD", "ASD"):
        raise ValueError(f"design method must be 'LRFD' or 'ASD', not {method!r}")
    if stage == "construction":
        return expand(CONSTRUCTION_LRFD if m == "LRFD" else CONSTRUCTION_ASD)
    return LRFD if m == "LRFD" else ASD


def reduce_to(combos: Sequence[Combination], present: Iterable[str]) -> tuple[Combination, ...]:
    """The combinations of the cases ``present`` (see the module docstring), in order."""
    have = set(present) | {"D"}
    out: list[Combination] = []
    seen: set[tuple[tuple[str, float], ...]] = set()
    kept = []
    for c in combos:
        factors = {k: f for k, f in c.factors.items() if k in have and f != 0.0}
        key = tuple(sorted(factors.items()))
        if not factors or key in seen:
            continue
        seen.add(key)
        kept.append(Combination(combination_name(factors), factors, c.purpose, c.source,
                                c.number))  # fmt: skip
    dead_only = [abs(c.factors.get("D", 0.0)) for c in kept if set(c.factors) == {"D"}]
    top = max(dead_only, default=0.0)
    for c in kept:
        if set(c.factors) == {"D"} and abs(c.factors["D"]) < top:
            continue  # a smaller multiple of the same dead-load diagram
        out.append(c)
    return tuple(out)


def service_combinations(present: Iterable[str]) -> tuple[Combination, ...]:
    """The deflection combinations of the cases present (at least L and D+L)."""
    have = set(present)
    keep = [
        c
        for c in SERVICE
        if c in (LIVE_DEFLECTION, TOTAL_DEFLECTION) or set(c.factors) - {"D"} <= have
    ]
    return tuple(keep)


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
    """``combo`` with its live loads on each pattern of regions (cases "L@k", "Lr@k", ...).

    Every live case of the combination (``PATTERNED``) is moved to the same regions
    together. ``labels`` name the regions in the combination's name ("span 1", "overhang").
    """
    live = [c for c in PATTERNED if c in combo.factors]
    if not live:
        return []
    shown = list(dict.fromkeys("L" if c == REDUCIBLE else c for c in live))
    out = []
    for loaded in patterns:
        factors = {c: f for c, f in combo.factors.items() if c not in live}
        for c in live:
            factors.update({f"{c}@{k}": combo.factors[c] for k in loaded})
        where = ", ".join(labels[k] if labels else f"part {k + 1}" for k in loaded)
        out.append(
            Combination(
                f"{combo.name} ({', '.join(shown)} on {where})",
                factors,
                combo.purpose,
                f"{combo.source}; ASCE 7-16 §4.3.3 partial loading",
                combo.number,
            )
        )
    return out
