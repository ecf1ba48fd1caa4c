"""Display units for the human-facing outputs (CSV, HTML, BCF text).

Values arrive in SI base units; each kind of value has one display unit per
unit system. Factors come from the shared pint registry once, so converting
a large table is a multiplication, not a pint call per value.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ifccheck.units import ureg

# kind → (SI base unit, si display unit, si label, si column suffix,
#         imperial display unit, imperial label, imperial column suffix)
_KINDS: dict[str, tuple[str, str, str, str, str, str, str]] = {
    "length": ("m", "m", "m", "m", "ft", "ft", "ft"),
    "deflection": ("m", "mm", "mm", "mm", "inch", "in", "in"),
    "moment": ("N*m", "kN*m", "kN·m", "kN_m", "kip*ft", "kip-ft", "kip_ft"),
    "force": ("N", "kN", "kN", "kN", "kip", "kip", "kip"),
    "stress": ("Pa", "MPa", "MPa", "MPa", "ksi", "ksi", "ksi"),
    "line load": ("N/m", "kN/m", "kN/m", "kN_per_m", "kip/ft", "kip/ft", "kip_per_ft"),
}

SYSTEMS = ("si", "imperial")


def check_system(units: str) -> str:
    if units not in SYSTEMS:
        raise ValueError(f"units must be 'si' or 'imperial', not {units!r}")
    return units


def system_for_length_unit(length_unit: str) -> str:
    """The display system that follows a model's length unit ('foot' → imperial)."""
    return "imperial" if length_unit.lower() in ("foot", "feet", "inch", "ft", "in") else "si"


@dataclass(frozen=True)
class DisplayUnits:
    """Factors, labels and column suffixes of one unit system."""

    system: str

    def __post_init__(self) -> None:
        check_system(self.system)

    def _entry(self, kind: str) -> tuple[str, str, str]:
        _, su, sl, ss, iu, il, is_ = _KINDS[kind]
        return (su, sl, ss) if self.system == "si" else (iu, il, is_)

    def factor(self, kind: str) -> float:
        """Multiply an SI value of ``kind`` by this to get the display value."""
        return _factor(kind, self.system)

    def label(self, kind: str) -> str:
        return self._entry(kind)[1]

    def suffix(self, kind: str) -> str:
        return self._entry(kind)[2]

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


_FACTORS: dict[tuple[str, str], float] = {}


def _factor(kind: str, system: str) -> float:
    key = (kind, system)
    if key not in _FACTORS:
        base, su, _, _, iu, _, _ = _KINDS[kind]
        unit = su if system == "si" else iu
        _FACTORS[key] = float(ureg.Quantity(1.0, base).to(unit).magnitude)
    return _FACTORS[key]
