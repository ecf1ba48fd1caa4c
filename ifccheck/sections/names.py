"""Section designations found in names, as authoring tools write them.

A type, profile or element name may carry a designation among other words
("Beam:W24X84:1234", "HEA300 S355J0", "1/2IPE300", "h=930 b=160 tw=10 tf=20").
:func:`find_shape` finds the first one and says what it is:

- a shape of the AISC Shapes Database v16.0 (W, M, S, HP, C, MC, WT, MT, ST,
  L, HSS, Pipe; metric W and HP names) with its tabulated properties;
- a European rolled section from the catalogue (:mod:`ifccheck.sections.euro`);
- a tee cut from either (``1/2IPE300``, ``½ HEA 200``, ``1/2W24X84``);
- a shape whose name gives every dimension, in mm: rectangular, square and
  circular hollow sections (``RHS 200x100x8``, ``SHS 100x5``, ``CHS 168.3x6.3``),
  equal-leg tees (``T 100x100x11``), angles not in a table (``L 90x90x7``) and
  welded I-sections (``h=930 b=160 tw=10 tf=20``, ``PL-I 930x160x10x20``).

A designation of a known series that is not in its table gives the reason.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field

from ifccheck.model import Section, ShapeFamily
from ifccheck.reasons import NotChecked, Reason
from ifccheck.sections import euro
from ifccheck.sections.dimensions import Shape, cut_tee, section_of, shape_of_section
from ifccheck.sections.table import SOURCE as AISC_SOURCE
from ifccheck.sections.table import lookup as aisc_lookup

MM = 1e-3
NAME = "dimensions in the name (mm)"

# A US designation inside a longer name: "Beam:W24X84:1234", "W 24x84", "W610x125"
_US = re.compile(
    r"(?<![A-Z])(W|M|S|HP|MC|C|WT|MT|ST|HSS|PIPE|L)\s*(\d+(?:\.\d+)?)\s*[X×]\s*"
    r"(\d+(?:[./-]\d+)*)(?:\s*[X×]\s*(\d+(?:[./-]\d+)*))?",
    re.IGNORECASE,
)
_US_PIPE = re.compile(r"(?<![A-Z])PIPE\s*(\d+(?:[./-]\d+)*)\s*(STD|XS|XXS|SCH\s*\d+)", re.I)
_N = r"(\d+(?:[.,]\d+)?)"
_X = r"\s*[X×*]\s*"
_EU = re.compile(
    r"(?<![A-Z])(?:IPE\s*-?\s*(?:AA|A|O|V|R)?\s*-?\s*\d{2,3}(?:\s*-?\s*(?:AA|A|O|V|R)(?![A-Z]))?"
    r"|HE\s*-?\s*(?:AA|A|B|M|C)?\s*-?\s*\d{3,4}(?:\s*-?\s*(?:AA|A|B|M|C)(?![A-Z]))?"
    r"|(?:IPN|INP|UPN|UNP|UPE|UAP)\s*-?\s*\d{2,3}"
    rf"|(?:UBP|UB|UC){_N}{_X}{_N}{_X}{_N}|(?:HD|HP)\s*{_N}{_X}{_N}"
    rf"|PFC\s*{_N}{_X}{_N}(?:{_X}{_N})?)",
    re.IGNORECASE,
)
_HALF = re.compile(r"(?:(?<![0-9.])1\s*/\s*2|½)\s*[-_ ]?\s*(?=[A-Z])", re.IGNORECASE)
_HOLLOW = re.compile(
    rf"(?<![A-Z])(?:CF|HF)?(RHS|SHS|CHS)\s*-?\s*{_N}(?:{_X}{_N})?(?:{_X}{_N})?",
    re.IGNORECASE,
)
_TEE = re.compile(rf"(?<![A-Z0-9/½])T\s*-?\s*{_N}{_X}{_N}(?:{_X}{_N})?(?![0-9])", re.IGNORECASE)
_ANGLE = re.compile(rf"(?<![A-Z])L\s*-?\s*{_N}{_X}{_N}(?:{_X}{_N})?(?![0-9])", re.IGNORECASE)
_PLATE_I = re.compile(
    rf"(?<![A-Z])(PL-?I|WI|BH|HN|HW|HM|I|H)\s*-?\s*{_N}{_X}{_N}{_X}{_N}{_X}{_N}(?![0-9])",
    re.IGNORECASE,
)
_KEYED = re.compile(r"(?<![A-Z])(H|D|B|BF|TW|TF|S|T)\s*[=:]\s*(\d+(?:[.,]\d+)?)", re.IGNORECASE)


@dataclass
class NamedShape:
    """What a designation in a name resolves to."""

    token: str  # the designation as found, normalised ("IPE300", "1/2IPE300", "RHS200X100X8")
    shape: Shape | None = None  # dimensions, when known
    section: Section | None = None  # properties, when known
    reason: Reason | None = None  # why there is no section
    notes: list[str] = field(default_factory=list)

    @property
    def family(self) -> ShapeFamily | None:
        if self.section is not None:
            return self.section.family
        return self.shape.family if self.shape is not None else None


def _f(text: str) -> float:
    return float(text.replace(",", "."))


def _named(token: str, shape: Shape) -> NamedShape:
    section, reason = section_of(shape)
    return NamedShape(token, shape, section, reason)


def _us(text: str) -> NamedShape | None:
    """A US designation that the AISC table carries (W24X84, L4X4X1/2, HSS6X6X1/2...)."""
    m = _US_PIPE.search(text)
    if m:
        weight = re.sub(r"\s+", "", m.group(2)).upper()
        token = f"Pipe{m.group(1)}{weight}"
        found = aisc_lookup(token)
        if found is not None:
            return NamedShape(found.name, shape_of_section(found), found)
    for m in _US.finditer(text):
        prefix = m.group(1).upper()
        token = f"{prefix}{m.group(2)}X{m.group(3)}" + (f"X{m.group(4)}" if m.group(4) else "")
        found = aisc_lookup(token)
        if found is not None:
            return NamedShape(found.name, shape_of_section(found), found)
        if prefix in ("W", "M", "S", "HP", "MC", "C", "WT", "MT", "ST", "HSS") and (
            _looks_imperial(m.group(2))
        ):
            reason = Reason.of(NotChecked.PROFILE_NOT_IN_TABLE, name=token, table=AISC_SOURCE)
            return NamedShape(token, reason=reason)
    return None


def _looks_imperial(depth: str) -> bool:
    """A US nominal depth in inches (W24X..., HSS6X...), not a metric depth in mm."""
    try:
        return float(depth) <= 44.0
    except ValueError:
        return False


def _euro(text: str) -> NamedShape | None:
    m = _EU.search(text)
    if not m:
        return None
    designation = euro.canonical(m.group(0))
    if designation is None:
        return None
    shape = euro.shape(designation)
    if shape is None:
        reason = Reason.of(
            NotChecked.PROFILE_NOT_IN_TABLE,
            name=designation,
            table=f"the European catalogue ({euro.CATALOGUE}; it has no {euro.series(designation)})"
            if euro.series(designation) in euro.NOT_CARRIED
            else f"the European catalogue ({euro.CATALOGUE})",
        )
        return NamedShape(designation, reason=reason)
    found = _named(designation, shape)
    if found.section is not None:
        from dataclasses import replace

        found.section = replace(found.section, source=f"computed from {euro.CATALOGUE} dimensions")
    return found


def _rolled(text: str) -> NamedShape | None:
    """A designation from the tables: AISC first, then the European catalogue."""
    return _us(text) or _euro(text)


def _half(text: str) -> NamedShape | None:
    """A tee cut from an I-shape: '1/2IPE300', '½ HEA 200', '1/2 W24X84'."""
    m = _HALF.search(text)
    if not m:
        return None
    parent = _rolled(text[m.end() :])
    if parent is None:
        return None
    token = f"1/2{parent.token}"
    if parent.shape is None or parent.family is not ShapeFamily.I_SHAPE:
        reason = parent.reason or Reason.of(
            NotChecked.PROFILE_WITHOUT_DIMENSIONS,
            detail=f"'{token}' is half of a shape that is not an I-shape",
        )
        return NamedShape(token, reason=reason)
    return _named(token, cut_tee(token, parent.shape))


def _hollow(text: str) -> NamedShape | None:
    m = _HOLLOW.search(text)
    if not m:
        return None
    kind = m.group(1).upper()
    numbers = [_f(g) for g in m.groups()[1:] if g]
    if kind == "CHS" and len(numbers) == 2:
        od, t = numbers
        token = f"CHS{od:g}X{t:g}"
        shape = Shape(token, ShapeFamily.HOLLOW_ROUND, od * MM, od * MM, t * MM, t * MM,
                      source=NAME)  # fmt: skip
        return _named(token, shape)
    if kind in ("RHS", "SHS") and len(numbers) in (2, 3):
        if len(numbers) == 2:  # SHS 100x5: square
            numbers = [numbers[0], numbers[0], numbers[1]]
        d, b, t = numbers
        token = f"{kind}{d:g}X{b:g}X{t:g}"
        shape = Shape(token, ShapeFamily.HOLLOW_RECT, d * MM, b * MM, t * MM, t * MM,
                      source=NAME)  # fmt: skip
        return _named(token, shape)
    return None


def _tee(text: str) -> NamedShape | None:
    m = _TEE.search(text)
    if not m:
        return None
    numbers = [_f(g) for g in m.groups() if g]
    if len(numbers) == 2:  # T100x11: equal legs
        numbers = [numbers[0], numbers[0], numbers[1]]
    b, h, t = numbers  # EN 10055: T b x h x t
    token = f"T{b:g}X{h:g}X{t:g}"
    return _named(token, Shape(token, ShapeFamily.TEE, h * MM, b * MM, t * MM, t * MM, source=NAME))


def _angle(text: str) -> NamedShape | None:
    m = _ANGLE.search(text)
    if not m:
        return None
    numbers = [_f(g) for g in m.groups() if g]
    if len(numbers) == 2:
        numbers = [numbers[0], numbers[0], numbers[1]]
    d, b, t = numbers
    token = f"L{d:g}X{b:g}X{t:g}"
    tabulated = euro.shape(token)
    if tabulated is not None:
        return _named(tabulated.name, tabulated)
    found = _named(token, Shape(token, ShapeFamily.ANGLE, d * MM, b * MM, t * MM, t * MM,
                                source=NAME))  # fmt: skip
    found.notes.append(f"{token} is not in a shape table: root fillet taken as 0")
    return found


def _welded(text: str) -> NamedShape | None:
    """An I-section with every plate in the name (mm)."""
    m = _PLATE_I.search(text)
    if m:
        kind = m.group(1).upper().replace("-", "")
        h, b, tw, tf = (_f(g) for g in m.groups()[1:])
        rolled = kind in ("HN", "HW", "HM", "H")
        token = f"{kind} {h:g}x{b:g}x{tw:g}x{tf:g}"
        shape = Shape(token, ShapeFamily.I_SHAPE, h * MM, b * MM, tw * MM, tf * MM,
                      fabrication="rolled" if rolled else "welded", source=NAME)  # fmt: skip
        found = _named(token, shape)
        if rolled:
            found.notes.append(f"{token}: root fillet not in the name, taken as 0")
        return found
    keyed: dict[str, float] = {}
    for km in _KEYED.finditer(text):
        key = {"D": "H", "BF": "B", "S": "TW", "T": "TF"}.get(km.group(1).upper(), km.group(1))
        keyed.setdefault(key.upper(), _f(km.group(2)))
    if {"H", "B", "TW", "TF"} <= set(keyed):
        h, b, tw, tf = keyed["H"], keyed["B"], keyed["TW"], keyed["TF"]
        token = f"h={h:g} b={b:g} tw={tw:g} tf={tf:g}"
        shape = Shape(token, ShapeFamily.I_SHAPE, h * MM, b * MM, tw * MM, tf * MM,
                      fabrication="welded", source=NAME)  # fmt: skip
        return _named(token, shape)
    return None


def find_shape(text: str | None) -> NamedShape | None:
    """The first section designation in a free-text name, resolved; None if there is none."""
    if not text or not text.strip():
        return None
    return (
        _half(text) or _welded(text) or _rolled(text) or _hollow(text) or _tee(text) or _angle(text)
    )
