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
    to_si,
)

# (kind, system) → (decimals, drop trailing zeros): the digits the trade writes
# (common practice: 345 MPa, 50 ksi, 60 psf, 2.87 kPa, 5.5 in, 140 mm)
TRADE_DIGITS: dict[tuple[str, str], tuple[int, bool]] = {
    ("stress", "si"): (0, False),
    ("stress", "imperial"): (1, True),
    ("pressure", "si"): (2, False),
    ("pressure", "imperial"): (0, False),
    ("thickness", "si"): (0, False),
    ("thickness", "imperial"): (2, True),
    ("deflection", "si"): (1, False),
    ("deflection", "imperial"): (2, False),
    ("line load", "si"): (2, False),
    ("line load", "imperial"): (3, False),
    ("force", "si"): (1, False),
    ("force", "imperial"): (1, False),
    ("moment", "si"): (1, False),
    ("moment", "imperial"): (1, False),
    ("length", "si"): (2, False),
    ("length", "imperial"): (2, False),
}


# section properties for the hand-check trail: kind → {system: (SI metres per unit, label)}
_INCH = to_si(1.0, "inch")
SECTION_KINDS: dict[str, dict[str, tuple[float, str]]] = {
    "section length": {"si": (1e-3, "mm"), "imperial": (_INCH, "in")},
    "modulus": {"si": (1e-6, "10³ mm³"), "imperial": (_INCH**3, "in³")},
    "inertia": {"si": (1e-6, "10⁶ mm⁴"), "imperial": (_INCH**4, "in⁴")},
}


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

    def trade(self, si: float | None, kind: str) -> str:
        """A value with the digits the trade writes ('345 MPa', '50 ksi', '5.5 in')."""
        v = self.value(si, kind)
        if v is None:
            return "–"
        return f"{self.trade_number(si, kind)} {self.label(kind)}"

    def trade_number(self, si: float | None, kind: str) -> str:
        """The number of :meth:`trade`, without its unit."""
        v = self.value(si, kind)
        if v is None:
            return "–"
        digits, strip = TRADE_DIGITS.get((kind, self.system), (2, False))
        text = f"{v:.{digits}f}"
        if strip and "." in text:
            text = text.rstrip("0").rstrip(".")
        return "0" if text in ("-0", "") else text

    def section(self, si: float | None, kind: str, digits: int = 3) -> str:
        """A section property in the trade's units: '4.45 in', '81.6 in³', '10³ mm³'."""
        if si is None or not math.isfinite(si):
            return "–"
        per, label = SECTION_KINDS[kind][self.system]
        return f"{significant(si / per, digits)} {label}"

    def number(self, si: float | None, kind: str, digits: int = 2) -> str:
        v = self.value(si, kind)
        return "–" if v is None else f"{v:.{digits}f}"


def significant(v: float, digits: int = 3) -> str:
    """``v`` to ``digits`` significant digits, never in exponent form ('1340', '0.770')."""
    if v == 0 or not math.isfinite(v):
        return f"{v:g}"
    decimals = max(0, digits - 1 - math.floor(math.log10(abs(v))))
    return f"{v:.{decimals}f}"


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
