"""One shared pint registry: parse quantities with units into SI, format SI for display.

Internal values are SI base units (m, N, Pa, N·m, kg/m³). Text such as
"60 psf", "2.4 kPa", "150 mm", "50 ksi", "145 pcf" or "250 kip-ft" is turned
into a float in those units by :func:`parse_quantity`; the ``format_*``
helpers turn SI floats back into text in "si" or "imperial" units.
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass
from typing import Any, Literal

import pint

from ifccheck.errors import QuantityError

ureg: pint.UnitRegistry = pint.UnitRegistry()
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
        q: Any = ureg.Quantity(norm)
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


def unit_name(text: str) -> str:
    """The name of the first unit in a quantity's text ('10 ft' → 'foot'); '' if none."""
    try:
        q: Any = ureg.Quantity(_normalise(text))
    except Exception:  # pint raises many kinds on bad text
        return ""
    items = list(getattr(q, "unit_items", lambda: [])())
    return str(items[0][0]) if items else ""


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

# -- the length unit of a model that assigns none (--length-unit) ------------------

# metres per unit (exact by definition: 1 ft = 0.3048 m, 1 in = 0.0254 m)
MODEL_LENGTH_UNITS: dict[str, float] = {
    "metre": 1.0,
    "centimetre": 0.01,
    "millimetre": 0.001,
    "foot": 0.3048,
    "inch": 0.0254,
}
_MODEL_LENGTH_ALIASES = {
    "m": "metre", "meter": "metre", "metres": "metre", "meters": "metre",
    "cm": "centimetre", "centimeter": "centimetre",
    "mm": "millimetre", "millimeter": "millimetre",
    "ft": "foot", "feet": "foot", "in": "inch", "inches": "inch",
}  # fmt: skip


def model_length_unit(text: str) -> str:
    """The name of a model length unit ('mm' → 'millimetre'); QuantityError otherwise."""
    key = " ".join(str(text).split()).lower()
    name = _MODEL_LENGTH_ALIASES.get(key, key)
    if name not in MODEL_LENGTH_UNITS:
        shown = key if len(key) <= 40 else key[:39] + "…"
        raise QuantityError(
            f"{shown!r} is not a length unit a model is read in "
            f"(one of {', '.join(MODEL_LENGTH_UNITS)}, or m, cm, mm, ft, in)"
        )
    return name


# -- unit systems and the one display table -------------------------------------

SYSTEMS: tuple[UnitSystem, ...] = ("si", "imperial")
_IMPERIAL_LENGTHS = frozenset({"foot", "feet", "ft", "inch", "inches", "in", "yard", "mile"})


def system_for(length_unit: str) -> UnitSystem:
    """The display system that follows a length unit's name ('foot' → imperial)."""
    return "imperial" if length_unit.strip().lower() in _IMPERIAL_LENGTHS else "si"


def check_system(system: str) -> UnitSystem:
    """'si' or 'imperial'; ValueError for anything else."""
    if system == "si":
        return "si"
    if system == "imperial":
        return "imperial"
    raise ValueError(f"units must be 'si' or 'imperial', not {system!r}")


@dataclass(frozen=True)
class _Display:
    si_base: str  # pint unit of the internal SI value
    si: tuple[str, str, str]  # (pint unit, label, column suffix)
    imperial: tuple[str, str, str]


# kind of value → how it is shown in each system (the only display table)
_DISPLAY: dict[str, _Display] = {
    "length": _Display("m", ("m", "m", "m"), ("ft", "ft", "ft")),
    "deflection": _Display("m", ("mm", "mm", "mm"), ("inch", "in", "in")),
    "thickness": _Display("m", ("mm", "mm", "mm"), ("inch", "in", "in")),
    "area": _Display("m**2", ("m**2", "m²", "m2"), ("ft**2", "ft²", "ft2")),
    "moment": _Display("N*m", ("kN*m", "kN·m", "kN_m"), ("kip*ft", "kip-ft", "kip_ft")),
    "force": _Display("N", ("kN", "kN", "kN"), ("kip", "kip", "kip")),
    "stress": _Display("Pa", ("MPa", "MPa", "MPa"), ("ksi", "ksi", "ksi")),
    "pressure": _Display("Pa", ("kPa", "kPa", "kPa"), ("psf", "psf", "psf")),
    "line load": _Display("N/m", ("kN/m", "kN/m", "kN_per_m"), ("kip/ft", "kip/ft", "kip_per_ft")),
    "stiffness": _Display(
        "N/m", ("kN/mm", "kN/mm", "kN_per_mm"), ("kip/inch", "kip/in", "kip_per_in")
    ),
}


def _entry(kind: str, system: UnitSystem) -> tuple[str, str, str]:
    d = _DISPLAY[kind]
    return d.si if check_system(system) == "si" else d.imperial


@functools.cache
def display_factor(kind: str, system: UnitSystem) -> float:
    """Multiply an SI value of ``kind`` by this to get its value in ``system``'s display unit."""
    return float(ureg.Quantity(1.0, _DISPLAY[kind].si_base).to(_entry(kind, system)[0]).magnitude)


def display_label(kind: str, system: UnitSystem) -> str:
    """'kN·m', 'kip-ft', …"""
    return _entry(kind, system)[1]


def display_suffix(kind: str, system: UnitSystem) -> str:
    """The unit suffix of a CSV column: 'kN_m', 'kip_ft', …"""
    return _entry(kind, system)[2]


def convert(value: float, kind: str, system: UnitSystem) -> tuple[float, str]:
    """An SI value of ``kind`` in the display unit of ``system``: (number, unit label)."""
    return value * display_factor(kind, system), display_label(kind, system)


def to_si(value: float, unit: str) -> float:
    """A value in a named unit ('ksi', 'lb/ft', 'ft') in SI base units."""
    if value == 1.0:  # a unit's size, asked for often (the report's words): looked up once
        return _unit_size(unit)
    return float(ureg.Quantity(value, unit).to_base_units().magnitude)


@functools.lru_cache(maxsize=128)
def _unit_size(unit: str) -> float:
    return float(ureg.Quantity(1.0, unit).to_base_units().magnitude)


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
