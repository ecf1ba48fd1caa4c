"""`ifccheck strength`: flexural and shear strength of one shape at one unbraced length.

SHAPE is a designation that ``ifccheck.sections.lookup`` resolves (the AISC
Shapes Database v16.0: W24X84, W610x125, C12X20.7, MC18X58, WT8X25, L4X4X1/2,
2L4X4X1/2X3/8, HSS10X6X3/8, HSS6.625X0.280, PIPE6STD; and any other catalogue
hooked into it, e.g. UPE200 or "RHS 200x100x8") or dimensions, in either of
two spellings, one unit for all numbers or one per number:

    KIND:n1 x n2 x ... unit           e.g. I:300x150x7.1x10.7x15mm
    "KIND key=value key=value ..."    e.g. "I d=300mm bf=150mm tw=7.1mm tf=10.7mm"

    KIND  numbers, in this order ([optional])   family
    I     d bf tw tf [r]                        I-shape (r: fillet radius)
    IS    d bft tft bfb tfb tw [r]              singly symmetric I (top, bottom flange)
    C     d bf tw tf [r]                        channel
    T     d bf tw tf [r]                        tee, flange on top
    L     d b t [r]                             single angle (d vertical leg)
    2L    d b t [gap] [r]                       double angle, legs d back to back
    RHS   d b t [r]                             rectangular/square HSS (r: outside corner)
    CHS   od t                                  round HSS or pipe

Lengths take any pint unit (mm, cm, m, in, ft). A shape with no fillet radius
counts as built-up (welded) unless ``--fabrication rolled`` says otherwise.
"""

from __future__ import annotations

import dataclasses
import json
import math
import re
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import click

from ifccheck import CAUTION
from ifccheck.design.aisc360 import AISC360, flexure, scope, shear
from ifccheck.design.base import check_method
from ifccheck.errors import QuantityError, UsageError
from ifccheck.model import Section, ShapeFamily, Steel
from ifccheck.report.display import DisplayUnits
from ifccheck.report.wording import limit_state_words
from ifccheck.sections import (
    channel_from_dimensions,
    classify_flexure,
    default_steel,
    i_section_from_dimensions,
    known_grades,
    lookup,
    steel_from_name,
    steel_from_yield,
)
from ifccheck.sections.classify import Slenderness, is_built_up
from ifccheck.sections.grades import fy_problem
from ifccheck.sections.names import find_shape
from ifccheck.sections.shapes import (
    angle_from_dimensions,
    double_angle_from_dimensions,
    rect_hollow_from_dimensions,
    round_hollow_from_dimensions,
    singly_symmetric_i_from_dimensions,
    tee_from_dimensions,
)
from ifccheck.units import (
    UnitSystem,
    convert,
    display_factor,
    display_label,
    parse_quantity,
    system_for,
    to_si,
    unit_name,
)

# Longest shape name quoted back in a message (characters).
NAME_SHOWN = 60
# Lengths beyond these are typing or unit errors (common practice: no member is longer
# than a kilometre, no section deeper or wider than 10 m).
LB_MAX = 1000.0  # m
DIMENSION_MAX = 10.0  # m
# Cb outside 1.0 (uniform moment) to 3.0 is taken as a typing error (common practice;
# AISC 360-05 capped Eq. F1-1 at 3.0, from memory).
CB_RANGE = (1.0, 3.0)


def shown(text: str, limit: int = NAME_SHOWN) -> str:
    """Text as quoted back in a message: whitespace collapsed, cut to ``limit`` characters."""
    one = " ".join(str(text).split())
    return repr(one if len(one) <= limit else one[: limit - 1] + "…")


def _quantity(text: str, dimension: str, what: str) -> tuple[float, str]:
    """(value in SI base units, unit name as written) of a finite quantity with a unit."""
    try:
        value = parse_quantity(text, dimension)
    except QuantityError as exc:
        raise UsageError(f"{what}: {exc}") from None
    if not math.isfinite(value):
        raise UsageError(f"{what}: {shown(text)} is not a finite {dimension}")
    return value, unit_name(text)


@dataclass(frozen=True)
class _Kind:
    keys: tuple[str, ...]  # in the compact spelling's order
    required: int  # how many of them must be given
    build: Callable[..., Section]


_KINDS: dict[str, _Kind] = {
    "I": _Kind(("d", "bf", "tw", "tf", "r"), 4, i_section_from_dimensions),
    "IS": _Kind(
        ("d", "bft", "tft", "bfb", "tfb", "tw", "r"),
        6,
        lambda name, d, bft, tft, bfb, tfb, tw, r=0.0: singly_symmetric_i_from_dimensions(
            name, d, bft, tft, bfb, tfb, tw, r
        ),
    ),
    "C": _Kind(("d", "bf", "tw", "tf", "r"), 4, channel_from_dimensions),
    "T": _Kind(("d", "bf", "tw", "tf", "r"), 4, tee_from_dimensions),
    "L": _Kind(("d", "b", "t", "r"), 3, angle_from_dimensions),
    "2L": _Kind(("d", "b", "t", "gap", "r"), 3, double_angle_from_dimensions),
    "RHS": _Kind(
        ("d", "b", "t", "r"),
        3,
        lambda name, d, b, t, r=None: rect_hollow_from_dimensions(name, d, b, t, r),
    ),
    "CHS": _Kind(("od", "t"), 2, round_hollow_from_dimensions),
}
_KIND = r"(?P<kind>2L|IS|RHS|CHS|I|C|T|L)"
_COMPACT = re.compile(
    _KIND + r"\s*:\s*(?P<nums>[0-9.]+(?:\s*[xX×]\s*[0-9.]+)*)\s*(?P<unit>[A-Za-z]+)",
    re.IGNORECASE,
)
_HEAD = re.compile(_KIND + r"\s+(?=\S+\s*=)", re.IGNORECASE)
_KEYWORD = re.compile(r"(?P<key>[a-z]+)\s*=\s*(?P<val>[0-9.]+\s*[A-Za-z]+)", re.IGNORECASE)


def _dimension_section(text: str) -> Section | None:
    """Section from a dimension spec (see module docstring), None if it is not one."""
    spec = text.strip()
    m = _COMPACT.fullmatch(spec)
    if m:
        kind = _KINDS[m.group("kind").upper()]
        nums = [float(v) for v in re.split(r"\s*[xX×]\s*", m.group("nums"))]
        if not kind.required <= len(nums) <= len(kind.keys):
            raise UsageError(
                f"shape: {m.group('kind').upper()} takes {kind.required} to {len(kind.keys)} "
                f"numbers ({' x '.join(kind.keys)}), got {len(nums)} in {shown(text)}"
            )
        scale, _ = _quantity(f"1 {m.group('unit')}", "length", "shape")
        dims = {k: v * scale for k, v in zip(kind.keys, nums, strict=False)}
        _check_sizes(dims, text)
    else:
        head = _HEAD.match(spec)
        if not head:
            return None
        kind = _KINDS[head.group("kind").upper()]
        rest = spec[head.end() :]
        pairs = _KEYWORD.findall(rest)
        if not pairs or _KEYWORD.sub("", rest).strip():
            raise UsageError(
                f"shape: cannot read dimensions in {shown(text)} (e.g. 'I d=300mm ...')"
            )
        dims = {}
        for key, value in pairs:
            if key.lower() not in kind.keys:
                raise UsageError(f"shape: {shown(key)} is not one of {', '.join(kind.keys)}")
            dims[key.lower()] = _quantity(value, "length", f"shape {key}")[0]
        missing = [k for k in kind.keys[: kind.required] if k not in dims]
        if missing:
            raise UsageError(f"shape: missing {', '.join(missing)} in {shown(text)}")
        _check_sizes(dims, text)
    name = re.sub(r"\s+", " ", spec)
    try:
        return kind.build(name, **dims)
    except ValueError as exc:
        message = str(exc)
        if message.startswith(name):  # the builders start with the name: cut it short
            message = shown(name) + message[len(name) :]
        raise UsageError(f"shape: {message}") from None


def _check_sizes(dims: dict[str, float], text: str) -> None:
    for key, value in dims.items():
        if not math.isfinite(value) or abs(value) > DIMENSION_MAX:
            raise UsageError(
                f"shape: {key} = {value:g} m in {shown(text)} is more than {DIMENSION_MAX:g} m "
                "(check the unit)"
            )


def _section(shape: str, fabrication: str | None) -> Section:
    section = lookup(shape)
    if section is None:
        section = _dimension_section(shape)
    if section is None:  # the spellings models write in names: "RHS 200x100x8", "HE 300 A"
        named = find_shape(shape)
        if named is not None and named.section is None and named.reason is not None:
            raise UsageError(f"unknown shape {shown(shape)}: {named.reason.text}")
        section = named.section if named is not None else None
    if section is None:
        raise UsageError(
            f"unknown shape {shown(shape)}: not a known designation and not a dimension spec "
            "such as 'I:300x150x7.1x10.7x15mm' or 'RHS:200x100x8mm'"
        )
    if fabrication:
        section = dataclasses.replace(section, fabrication=fabrication)
    return section


# Preferred material per family (AISC Manual Table 2-4, from memory): the default grade.
_FAMILY_GRADE = {
    ShapeFamily.CHANNEL: "A36",
    ShapeFamily.ANGLE: "A36",
    ShapeFamily.HOLLOW_RECT: "A500 Gr C",
    ShapeFamily.HOLLOW_ROUND: "A500 Gr C",
}


def _default_steel(section: Section) -> Steel:
    if section.name.upper().startswith("PIPE"):
        return default_steel("A53 Gr B")
    steel = default_steel(_FAMILY_GRADE.get(section.family, "A992"))
    if section.family is ShapeFamily.HOLLOW_ROUND:
        # A500 Gr C round HSS: Fy = 46 ksi, Fu = 62 ksi (AISC Manual Table 2-4, from memory).
        return dataclasses.replace(
            steel, fy=to_si(46.0, "ksi"), fu=to_si(62.0, "ksi"), source=steel.source + " (round)"
        )
    return steel


def _steel(section: Section, grade: str | None, fy_text: str | None) -> Steel:
    if grade and fy_text:
        raise UsageError("give either --grade or --fy, not both")
    if fy_text:
        fy, _ = _quantity(fy_text, "stress", "--fy")
        problem = fy_problem(fy)
        if problem:
            raise UsageError(f"--fy: {problem}")
        return steel_from_yield(fy, f"Fy {' '.join(fy_text.split())}")
    if grade:
        try:
            steel = steel_from_name(grade, max(section.tf, section.tw))
        except ValueError as exc:  # EN 10025-2 stops at a plate thickness
            raise UsageError(f"--grade: {exc}") from None
        if steel is None:
            raise UsageError(f"unknown grade {shown(grade)}; known: {', '.join(known_grades())}")
        return steel
    return _default_steel(section)


@dataclass(frozen=True)
class _Units:
    system: UnitSystem

    def fmt(self, value: float, kind: str, digits: int = 1) -> str:
        number, label = convert(value, kind, self.system)
        return f"{number:,.{digits}f} {label}"

    def label(self, kind: str) -> str:
        return display_label(kind, self.system)

    def factor(self, kind: str) -> float:
        return display_factor(kind, self.system)


_FAMILY_TEXT = {
    ShapeFamily.I_SHAPE: "I-shape",
    ShapeFamily.CHANNEL: "channel",
    ShapeFamily.TEE: "tee",
    ShapeFamily.ANGLE: "angle",
    ShapeFamily.HOLLOW_RECT: "rectangular HSS",
    ShapeFamily.HOLLOW_ROUND: "round HSS",
    ShapeFamily.OTHER: "section",
}


def _family_text(section: Section) -> str:
    if section.pair_gap is not None:
        return "double angle"
    text = _FAMILY_TEXT[section.family]
    if section.family is ShapeFamily.I_SHAPE:
        text = ("built-up " if is_built_up(section) else "rolled ") + text
    return text


@click.command("strength")
@click.argument("shape")
@click.option(
    "--lb", "lb_text", required=True, help="Unbraced length with unit: '10 ft', '3.05 m'."
)
@click.option(
    "--cb", type=float, default=1.0, show_default=True,
    help="Moment gradient factor Cb, 1.0 to 3.0 (AISC 360-16 Eq. F1-1).",
)  # fmt: skip
@click.option(
    "--cb-unchecked", is_flag=True,
    help="Accept a Cb outside 1.0 to 3.0 (a value from your own analysis).",
)  # fmt: skip
@click.option(
    "--grade",
    default=None,
    help="Steel grade (A992, A500 Gr C, S355...). Default: the family's preferred grade "
    "(A992 I and tee, A36 channel and angle, A500 Gr C HSS, A53 Gr B pipe).",
)
@click.option("--fy", "fy_text", default=None, help="Yield stress with unit: '50 ksi', '345 MPa'.")
@click.option("--method", default="LRFD", show_default=True, help="LRFD or ASD.")
@click.option(
    "--axis",
    type=click.Choice(["major", "minor"]),
    default="major",
    show_default=True,
    help="Axis of bending (minor: an I or channel with its web flat, F6).",
)
@click.option(
    "--compression",
    type=click.Choice(["top", "bottom"]),
    default="top",
    show_default=True,
    help="Side in compression: top flange of an I, flange of a tee, outstanding legs "
    "of a double angle, toe of a single angle's vertical leg.",
)
@click.option(
    "--fabrication",
    type=click.Choice(["rolled", "welded"]),
    default=None,
    help="Override rolled/built-up (default: table shape or fillet → rolled, else built-up).",
)
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI base units).")
@click.option("--curve", is_flag=True, help="Also give the strength curve over Lb.")
@click.option("--points", type=int, default=21, show_default=True, help="Points on the curve.")
def strength(
    shape: str,
    lb_text: str,
    cb: float,
    cb_unchecked: bool,
    grade: str | None,
    fy_text: str | None,
    method: str,
    axis: str,
    compression: str,
    fabrication: str | None,
    as_json: bool,
    curve: bool,
    points: int,
) -> None:
    """Flexural strength of SHAPE to AISC 360-16 Chapter F at one unbraced length,
    and its shear strength to Chapter G.

    SHAPE is a designation (W24X84, W610x125, C12X20.7, WT8X25, L4X4X1/2,
    2L4X4X1/2X3/8, HSS10X6X3/8, PIPE6STD, or a catalogue name such as UPE200)
    or dimensions as KIND:n1xn2x...unit or "KIND key=value ...":
    I d bf tw tf [r]; IS d bft tft bfb tfb tw [r]; C d bf tw tf [r];
    T d bf tw tf [r]; L d b t [r]; 2L d b t [gap] [r]; RHS d b t [r];
    CHS od t. Examples: 'I:300x150x7.1x10.7x15mm', 'RHS:10x6x0.349in',
    'CHS:168.3x7.1mm', 'L d=4in b=4in t=0.5in'.
    """
    meth = _method(method)
    _check_numbers(cb, cb_unchecked, points)
    lb, lb_unit = _lb(lb_text)
    section = _section(shape, fabrication)
    steel = _steel(section, grade, fy_text)
    given = "--fy" if fy_text else "--grade" if grade else "default"
    reason = scope(section, steel, axis)
    if reason:
        raise UsageError(f"{shown(section.name)}: {reason}")
    c = _compute(section, steel, lb, cb, meth, axis, compression, curve, points)
    if as_json:
        click.echo(json.dumps(_json_doc(c, given), indent=2))
        return
    steel_text = " ".join(str(fy_text).split())[:NAME_SHOWN] if fy_text else ""
    click.echo("\n".join(_text_lines(c, given, steel_text, system_for(lb_unit))))


def _method(method: str) -> str:
    try:
        return check_method(method)
    except ValueError as exc:
        raise UsageError(str(exc)) from None


def _check_numbers(cb: float, cb_unchecked: bool, points: int) -> None:
    if not (math.isfinite(cb) and cb > 0.0):
        raise UsageError("--cb must be a positive number")
    lo, hi = CB_RANGE
    if not cb_unchecked and not lo <= cb <= hi:
        raise UsageError(
            f"--cb {cb:g} is outside {lo:.1f} to {hi:.1f} (common practice); give "
            "--cb-unchecked to use it anyway"
        )
    if points < 2:
        raise UsageError("--points must be at least 2")


def _lb(lb_text: str) -> tuple[float, str]:
    lb, lb_unit = _quantity(lb_text, "length", "--lb")
    if lb < 0.0:
        raise UsageError("--lb must not be negative")
    if lb > LB_MAX:
        raise UsageError(f"--lb {shown(lb_text)} is more than {LB_MAX:,.0f} m (check the unit)")
    return lb, lb_unit


@dataclass(frozen=True)
class _Computed:
    """Everything the command prints, in SI."""

    section: Section
    steel: Steel
    lb: float
    cb: float
    method: str
    axis: str
    compression: str
    flex: Any  # the standard's flexure result for one segment
    shear: Any
    classes: Any
    has_ltb: bool
    curve: Any | None  # the sampled strength curve, or None


def _compute(
    section: Section, steel: Steel, lb: float, cb: float, meth: str, axis: str,
    compression: str, curve: bool, points: int,
) -> _Computed:  # fmt: skip
    top = compression == "top"
    r = flexure(section, steel, [lb], [cb], meth, axis=axis, compression_top=top)
    v = shear(section, steel, meth, axis=axis)
    cls = classify_flexure(section, steel.fy, steel.E, top, "minor" if axis == "minor" else "major")
    has_ltb = float(r.lr[0]) > 0.0 or float(r.lp[0]) > 0.0
    sampled = None
    if curve:
        lb_max = max(1.5 * float(r.lr[0]) if has_ltb else 30.0 * section.d, 1.2 * lb, 1.0)
        sampled = AISC360().strength_curve(
            section, steel, cb, meth, lb_max, points, axis=axis, compression_top=top
        )
    return _Computed(section, steel, lb, cb, meth, axis, compression, r, v, cls, has_ltb,
                     sampled)  # fmt: skip


def _json_doc(c: _Computed, given: str) -> dict[str, Any]:
    """The JSON document: SI base units."""
    r, v, section, steel = c.flex, c.shear, c.section, c.steel
    out: dict[str, Any] = {
        "shape": section.name,
        "family": section.family.value,
        "section_source": section.source,
        "built_up": is_built_up(section),
        "grade": steel.grade,
        "grade_source": steel.source,
        "grade_given": given,  # "--grade", "--fy" or "default" (by the shape's family)
        "standard": AISC360.name,
        "method": c.method,
        "axis": c.axis,
        "compression": c.compression,
        "factor": r.factor,
        "factor_symbol": "φb" if c.method == "LRFD" else "Ωb",
        "fy": steel.fy,
        "E": steel.E,
        "lb": c.lb,
        "cb": c.cb,
        "mp": float(r.mp[0]),
        "mn": float(r.mn[0]),
        "design_strength": float(r.design_strength[0]),
        "limit_state": str(r.limit_state[0]),
        "limit_state_text": limit_state_words(str(r.limit_state[0])),
        "lp": float(r.lp[0]),
        "lr": float(r.lr[0]),
        "mr": float(r.mr[0]),
        "flange_class": c.classes.flange_class,
        "web_class": c.classes.web_class,
        "shear": {
            "vn": v.vn,
            "design_strength": v.design_strength,
            "factor": v.factor,
            "clause": v.clause,
        },
        "units": {"length": "m", "stress": "Pa", "moment": "N*m", "force": "N"},
        "caution": CAUTION,
    }
    if c.curve is not None:
        out["curve"] = [
            {"lb": float(x), "design_strength": float(y), "limit_state": str(s)}
            for x, y, s in zip(
                c.curve.lb, c.curve.design_strength, c.curve.limit_state, strict=True
            )
        ]
    return out


def _text_lines(c: _Computed, given: str, fy_text: str, system: UnitSystem) -> list[str]:
    """The text output, in ``system`` (the unit system of --lb)."""
    r, v, section, steel, cls = c.flex, c.shear, c.section, c.steel, c.classes
    u, du = _Units(system), DisplayUnits(system)
    sym = "φMn" if c.method == "LRFD" else "Mn/Ω"
    fac = f"φb = {r.factor:.2f}" if c.method == "LRFD" else f"Ωb = {r.factor:.2f}"
    side = (
        ""
        if section.family in (ShapeFamily.HOLLOW_RECT, ShapeFamily.HOLLOW_ROUND)
        else (f", {c.compression} in compression")
    )
    if given == "--fy":
        steel_words = f"yield strength given (--fy {fy_text})"
    elif given == "--grade":
        steel_words = f"{steel.grade} (--grade)"
    else:
        steel_words = f"{steel.grade} (default for {_FAMILY_TEXT[section.family]}s)"
    lines = [
        f"{section.name} ({_family_text(section)}, {section.source}), {steel_words}: "
        f"Fy = {du.trade(steel.fy, 'stress')}, E = {u.fmt(steel.E, 'stress', 0)}",
        f"{AISC360.name} Chapter F, {c.method} ({fac}), Cb = {c.cb:.2f}, {c.axis} axis{side}",
        f"  Mp  = {u.fmt(float(r.mp[0]), 'moment')}  (plastic limit)",
    ]
    if c.has_ltb:
        lines += [
            f"  Mr  = {u.fmt(float(r.mr[0]), 'moment')}  (Mn at Lr, Cb = 1)",
            f"  Lp  = {u.fmt(float(r.lp[0]), 'length', 2)}",
            f"  Lr  = {u.fmt(float(r.lr[0]), 'length', 2)}",
        ]
    else:
        lines.append("  no lateral-torsional buckling for this shape and axis")
    lines += [
        f"  Lb  = {u.fmt(c.lb, 'length', 2)}",
        f"  Mn  = {u.fmt(float(r.mn[0]), 'moment')}",
        f"  {sym} = {u.fmt(float(r.design_strength[0]), 'moment')}  governed by "
        f"{limit_state_words(str(r.limit_state[0]))}",
        f"  {_element('flange', cls.flange)}; {_element('web', cls.web)}"
        f" (Table B4.1b cases {cls.case_flange}, {cls.case_web})",
        f"  shear {u.fmt(v.design_strength, 'force')} ({v.clause})",
    ]
    if section.family is ShapeFamily.ANGLE and section.pair_gap is None:
        lines.append("  bending about a geometric axis; principal-axis bending is not covered")
    if c.curve is not None:
        lunit, munit = u.label("length"), u.label("moment")
        lines.append(f"  strength curve, Cb = {c.cb:.2f}:")
        lines.append(f"    {'Lb (' + lunit + ')':>10}  {sym + ' (' + munit + ')':>16}  limit state")
        for x, y, s in zip(c.curve.lb, c.curve.design_strength, c.curve.limit_state, strict=True):
            lines.append(
                f"    {x * u.factor('length'):>10.2f}  {y * u.factor('moment'):>16.1f}  "
                f"{limit_state_words(str(s))}"
            )
    lines.append(CAUTION)
    return lines


def _element(name: str, s: Slenderness) -> str:
    return f"{name} {s.cls} (λ = {s.lam:.2f}, λp = {s.lam_p:.2f}, λr = {s.lam_r:.2f})"


__all__ = ["strength"]
