"""One shared pint registry: parse quantities with units into SI, format SI for display.

Internal values are SI base units (m, N, Pa, N·m, kg/m³). Text such as
"60 psf", "2.4 kPa", "150 mm", "50 ksi", "145 pcf" or "250 kip-ft" is turned
into a float in those units by :func:`parse_quantity`; the ``format_*``
helpers turn SI floats back into text in "si" or "imperial" units.
"""

from __future__ import annotations

import math
import re
from typing import Literal

import pint

from ifccheck.errors import QuantityError

ureg = pint.UnitRegistry()
# Trade abbreviations pint does not define: pounds-force per square foot and
# pounds (mass) per cubic foot.
ureg.define("psf = pound_force / foot ** 2")
ureg.define("pcf = pound / foot ** 3")
ureg.define("plf = pound_force / foot")
ureg.define("klf = kip / foot")

G = 9.80665  # m/s², standard gravity (ISO 80000-3)

UnitSystem = Literal["si", "imperial"]

# dimension name → pint dimensionality it must have
_DIMENSIONS: dict[str, str] = {
    "length": "[length]",
    "area": "[length] ** 2",
    "force": "[force]",
    "pressure": "[pressure]",
    "stress": "[pressure]",
    "moment": "[force] * [length]",
    "line load": "[force] / [length]",
    "density": "[mass] / [length] ** 3",
    "angle": "",
}

_ARTICLE = {"angle": "an angle", "area": "an area"}


_NUMBER_FIRST = re.compile(r"^[-+]?(\d|\.\d)")


def _normalise(text: str) -> str:
    """Accept trade spellings: 'kip-ft', 'kN·m', 'kN-m', 'm²', 'kg/m³'."""
    t = text.strip().replace("·", "*").replace("×", "*").replace("²", "**2").replace("³", "**3")
    # a hyphen between two unit words is a product ("kip-ft"), not a minus
    return re.sub(r"(?<=[A-Za-z])-(?=[A-Za-z])", "*", t)


def parse_quantity(text: str, dimension: str) -> float:
    """Parse ``text`` (a number with units) and return its value in SI base units.

    ``dimension`` is one of: length, area, force, pressure, stress, moment,
    "line load", density, angle (returned in degrees, the only non-SI
    exception, because deck directions are given in degrees). A density may
    also be given as a unit weight ("150 lbf/ft^3"); it is divided by g.
    """
    if dimension not in _DIMENSIONS:
        raise ValueError(f"unknown dimension {dimension!r}")
    what = _ARTICLE.get(dimension, f"a {dimension}")
    if not isinstance(text, str):
        raise QuantityError(f"{text!r} is not {what} with units (write it as text, e.g. '60 psf')")
    norm = _normalise(text)
    if not _NUMBER_FIRST.match(norm):
        raise QuantityError(f"{text!r} is not {what} (a number with units is needed)")
    try:
        q = ureg.Quantity(norm)
    except Exception:  # pint raises many kinds (even AssertionError) on bad text
        raise QuantityError(f"{text!r} is not {what}") from None
    if not isinstance(q, pint.Quantity):
        raise QuantityError(f"{text!r} is not {what}")
    if dimension == "angle":
        if q.dimensionless and not q.unitless:
            return float(q.to("degree").magnitude)
        raise QuantityError(f"{text!r} is not {what} with units (e.g. '30 deg')")
    if q.unitless:
        raise QuantityError(
            f"{text!r} has no units; {what} is needed, e.g. {_EXAMPLE[dimension]!r}"
        )
    if dimension == "density" and q.check("[force] / [length] ** 3"):
        q = q / ureg.Quantity(G, "m/s**2")
    if not q.check(_DIMENSIONS[dimension]):
        raise QuantityError(f"{text!r} is not {what}")
    value = float(q.to_base_units().magnitude)
    if not math.isfinite(value):
        raise QuantityError(f"{text!r} is not a finite {dimension}")
    return value


_EXAMPLE = {
    "length": "150 mm",
    "area": "10 m^2",
    "force": "10 kN",
    "pressure": "2.4 kPa",
    "stress": "50 ksi",
    "moment": "250 kip-ft",
    "line load": "1.5 kip/ft",
    "density": "2400 kg/m^3",
}

# (SI unit, SI label, imperial unit, imperial label) per kind of value
_DISPLAY: dict[str, tuple[str, str, str, str]] = {
    "length": ("m", "m", "ft", "ft"),
    "moment": ("kN*m", "kN·m", "kip*ft", "kip-ft"),
    "force": ("kN", "kN", "kip", "kip"),
    "stress": ("MPa", "MPa", "ksi", "ksi"),
    "pressure": ("kPa", "kPa", "psf", "psf"),
    "line load": ("kN/m", "kN/m", "klf", "kip/ft"),
}

_SI_BASE = {
    "length": "m",
    "moment": "N*m",
    "force": "N",
    "stress": "Pa",
    "pressure": "Pa",
    "line load": "N/m",
}


def convert(value: float, kind: str, system: UnitSystem) -> tuple[float, str]:
    """An SI value of ``kind`` in the display unit of ``system``: (number, unit label)."""
    si_unit, si_label, imp_unit, imp_label = _DISPLAY[kind]
    unit, label = (si_unit, si_label) if system == "si" else (imp_unit, imp_label)
    if system not in ("si", "imperial"):
        raise ValueError(f"unit system must be 'si' or 'imperial', not {system!r}")
    return float(ureg.Quantity(value, _SI_BASE[kind]).to(unit).magnitude), label


def _format(value: float, kind: str, system: UnitSystem, digits: int) -> str:
    number, label = convert(value, kind, system)
    return f"{number:.{digits}f} {label}"


def format_length(value: float, system: UnitSystem = "si", digits: int = 2) -> str:
    """m → "9.14 m" or "30.00 ft"."""
    return _format(value, "length", system, digits)


def format_moment(value: float, system: UnitSystem = "si", digits: int = 1) -> str:
    """N·m → "339.0 kN·m" or "250.0 kip-ft"."""
    return _format(value, "moment", system, digits)


def format_force(value: float, system: UnitSystem = "si", digits: int = 1) -> str:
    """N → "44.5 kN" or "10.0 kip"."""
    return _format(value, "force", system, digits)


def format_stress(value: float, system: UnitSystem = "si", digits: int = 1) -> str:
    """Pa → "344.7 MPa" or "50.0 ksi"."""
    return _format(value, "stress", system, digits)


def format_pressure(value: float, system: UnitSystem = "si", digits: int = 2) -> str:
    """Pa → "4.79 kPa" or "100.00 psf" (area loads)."""
    return _format(value, "pressure", system, digits)


def format_line_load(value: float, system: UnitSystem = "si", digits: int = 2) -> str:
    """N/m → "14.59 kN/m" or "1.00 kip/ft"."""
    return _format(value, "line load", system, digits)
