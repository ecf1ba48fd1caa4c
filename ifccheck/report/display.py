"""Display units for the human-facing outputs (CSV, HTML, BCF text, inspect).

Values arrive in SI base units; :class:`DisplayUnits` shows them in one unit
system through the one display table of ``ifccheck.units``, so converting a
large table is a multiplication, not a pint call per value.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ifccheck.units import (
    SYSTEMS,
    UnitSystem,
    check_system,
    display_factor,
    display_label,
    display_suffix,
    system_for,
)


@dataclass(frozen=True)
class DisplayUnits:
    """Factors, labels and column suffixes of one unit system."""

    system: UnitSystem

    def __post_init__(self) -> None:
        check_system(self.system)

    @classmethod
    def for_model(cls, length_unit: str, units: str | None = None) -> DisplayUnits:
        """The system asked for, else the one that follows the model's length unit."""
        return cls(check_system(units) if units else system_for(length_unit))

    def factor(self, kind: str) -> float:
        """Multiply an SI value of ``kind`` by this to get the display value."""
        return display_factor(kind, self.system)

    def label(self, kind: str) -> str:
        return display_label(kind, self.system)

    def suffix(self, kind: str) -> str:
        return display_suffix(kind, self.system)

    def value(self, si: float | None, kind: str) -> float | None:
        if si is None or not math.isfinite(si):
            return None
        return si * self.factor(kind)

    def text(self, si: float | None, kind: str, digits: int = 2) -> str:
        """'9.14 m', '30.0 ft' …; an en dash for a missing value."""
        v = self.value(si, kind)
        if v is None:
            return "–"
        return f"{v:.{digits}f} {self.label(kind)}"

    def number(self, si: float | None, kind: str, digits: int = 2) -> str:
        v = self.value(si, kind)
        return "–" if v is None else f"{v:.{digits}f}"


def utilisation_text(u: float | None, digits: int = 2) -> str:
    """A utilisation for people, never rounded down across 1.00.

    Rounded up to ``digits`` decimals, with one more decimal between 0.99 and
    1.01, so that 1.001 reads "1.001" (a fail), not "1.00".
    """
    if u is None or not math.isfinite(u):
        return "–"
    if 0.99 < u <= 1.01:
        digits += 1
    scale = 10**digits
    return f"{math.ceil(u * scale - 1e-9) / scale:.{digits}f}"


__all__ = ["SYSTEMS", "DisplayUnits", "check_system", "system_for", "utilisation_text"]
