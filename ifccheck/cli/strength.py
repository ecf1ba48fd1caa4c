"""`ifccheck strength`: flexural strength of one shape at one unbraced length.

SHAPE is a designation from the AISC Shapes Database v16.0 (W24X84,
W610x125, C15X50...) or plate dimensions, in either of two spellings:

    I:300x150x7.1x10.7x15mm      kind:d x bf x tw x tf [x r] unit
    "I d=300mm bf=150mm tw=7.1mm tf=10.7mm r=15mm"

kind is I (doubly symmetric I-shape) or C (channel); r (fillet radius) is
optional; units are any pint length unit (mm, cm, m, in, ft).
"""

from __future__ import annotations

import json
import math
import re
from dataclasses import dataclass
from typing import Any

import click

from ifccheck import CAUTION
from ifccheck.design.aisc360 import AISC360, flexure, scope, shear
from ifccheck.design.base import check_method
from ifccheck.errors import QuantityError, UsageError
from ifccheck.model import Section, Steel
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
from ifccheck.units import (
    UnitSystem,
    convert,
    display_factor,
    display_label,
    parse_quantity,
    system_for,
    unit_name,
)


def _quantity(text: str, dimension: str, what: str) -> tuple[float, str]:
    """(value in SI base units, unit name as written) of a quantity with a unit."""
    try:
        value = parse_quantity(text, dimension)
    except QuantityError as exc:
        raise UsageError(f"{what}: {exc}") from None
    return value, unit_name(text)


_COMPACT = re.compile(
    r"(?P<kind>[IC])\s*:\s*(?P<nums>[0-9.]+(?:\s*[xX×]\s*[0-9.]+){3,4})\s*(?P<unit>[A-Za-z]+)"
)
_KEYWORD = re.compile(r"(?P<key>d|bf|tw|tf|r)\s*=\s*(?P<val>[0-9.]+\s*[A-Za-z]+)")


def _dimension_section(text: str) -> Section | None:
    """Section from a dimension spec (see module docstring), None if it is not one."""
    spec = text.strip()
    m = _COMPACT.fullmatch(spec)
    if m:
        nums = [float(v) for v in re.split(r"\s*[xX×]\s*", m.group("nums"))]
        scale, _ = _quantity(f"1 {m.group('unit')}", "length", "shape")
        dims = dict(zip(("d", "bf", "tw", "tf", "r"), (v * scale for v in nums), strict=False))
        kind = m.group("kind")
    else:
        head = re.match(r"\s*([IC])\s+", spec)
        if not head:
            return None
        kind = head.group(1)
        rest = spec[head.end() :]
        pairs = _KEYWORD.findall(rest)
        if not pairs or _KEYWORD.sub("", rest).strip():
            raise UsageError(f"shape: cannot read dimensions in {text!r} (e.g. 'I d=300mm ...')")
        dims = {k: _quantity(v, "length", f"shape {k}")[0] for k, v in pairs}
        missing = [k for k in ("d", "bf", "tw", "tf") if k not in dims]
        if missing:
            raise UsageError(f"shape: missing {', '.join(missing)} in {text!r}")
    build = i_section_from_dimensions if kind == "I" else channel_from_dimensions
    try:
        return build(re.sub(r"\s+", " ", spec), **dims)
    except ValueError as exc:
        raise UsageError(f"shape: {exc}") from None


def _section(shape: str) -> Section:
    section = lookup(shape)
    if section is None:
        section = _dimension_section(shape)
    if section is None:
        raise UsageError(
            f"unknown shape {shape!r}: not in the AISC Shapes Database v16.0 and not a "
            "dimension spec such as 'I:300x150x7.1x10.7x15mm'"
        )
    return section


def _steel(section: Section, grade: str | None, fy_text: str | None) -> Steel:
    if grade and fy_text:
        raise UsageError("give either --grade or --fy, not both")
    if fy_text:
        fy, _ = _quantity(fy_text, "stress", "--fy")
        if fy <= 0.0:
            raise UsageError("--fy must be positive")
        return steel_from_yield(fy, f"Fy {fy_text.strip()}")
    if grade:
        steel = steel_from_name(grade, max(section.tf, section.tw))
        if steel is None:
            raise UsageError(f"unknown grade {grade!r}; known: {', '.join(known_grades())}")
        return steel
    return default_steel("A992")


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


@click.command("strength")
@click.argument("shape")
@click.option(
    "--lb", "lb_text", required=True, help="Unbraced length with unit: '10 ft', '3.05 m'."
)
@click.option("--cb", type=float, default=1.0, show_default=True, help="Moment gradient factor Cb.")
@click.option(
    "--grade", default=None, help="Steel grade (A992, A572 Gr 50, S355...). Default A992."
)
@click.option("--fy", "fy_text", default=None, help="Yield stress with unit: '50 ksi', '345 MPa'.")
@click.option("--method", default="LRFD", show_default=True, help="LRFD or ASD.")
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI base units).")
@click.option("--curve", is_flag=True, help="Also give the strength curve over Lb.")
@click.option("--points", type=int, default=21, show_default=True, help="Points on the curve.")
def strength(
    shape: str,
    lb_text: str,
    cb: float,
    grade: str | None,
    fy_text: str | None,
    method: str,
    as_json: bool,
    curve: bool,
    points: int,
) -> None:
    """Flexural strength of SHAPE to AISC 360-16 Chapter F at one unbraced length.

    SHAPE is a table designation (W24X84, W610x125) or dimensions:
    'I:300x150x7.1x10.7x15mm' (kind:d x bf x tw x tf [x r] unit) or
    'I d=300mm bf=150mm tw=7.1mm tf=10.7mm r=15mm'; kind I or C (channel).
    """
    try:
        meth = check_method(method)
    except ValueError as exc:
        raise UsageError(str(exc)) from None
    if not (math.isfinite(cb) and cb > 0.0):
        raise UsageError("--cb must be a positive number")
    if points < 2:
        raise UsageError("--points must be at least 2")
    lb, lb_unit = _quantity(lb_text, "length", "--lb")
    if lb < 0.0:
        raise UsageError("--lb must not be negative")
    section = _section(shape)
    steel = _steel(section, grade, fy_text)
    reason = scope(section, steel)
    if reason:
        raise UsageError(f"{section.name}: {reason}")

    r = flexure(section, steel, [lb], [cb], meth)
    v = shear(section, steel, meth)
    cls = classify_flexure(section, steel.fy, steel.E)
    lb_max = max(1.5 * float(r.lr[0]), 1.2 * lb)
    sampled = AISC360().strength_curve(section, steel, cb, meth, lb_max, points) if curve else None

    if as_json:
        out: dict[str, Any] = {
            "shape": section.name,
            "section_source": section.source,
            "grade": steel.grade,
            "grade_source": steel.source,
            "standard": AISC360.name,
            "method": meth,
            "factor": r.factor,
            "fy": steel.fy,
            "E": steel.E,
            "lb": lb,
            "cb": cb,
            "mp": float(r.mp[0]),
            "mn": float(r.mn[0]),
            "design_strength": float(r.design_strength[0]),
            "limit_state": str(r.limit_state[0]),
            "lp": float(r.lp[0]),
            "lr": float(r.lr[0]),
            "mr": float(r.mr[0]),
            "flange_class": cls.flange_class,
            "web_class": cls.web_class,
            "shear": {
                "vn": v.vn,
                "design_strength": v.design_strength,
                "factor": v.factor,
                "clause": v.clause,
            },
            "units": {"length": "m", "stress": "Pa", "moment": "N*m", "force": "N"},
            "caution": CAUTION,
        }
        if sampled is not None:
            out["curve"] = [
                {"lb": float(x), "design_strength": float(y), "limit_state": str(s)}
                for x, y, s in zip(
                    sampled.lb, sampled.design_strength, sampled.limit_state, strict=True
                )
            ]
        click.echo(json.dumps(out, indent=2))
        return

    u = _Units(system_for(lb_unit))
    sym = "φMn" if meth == "LRFD" else "Mn/Ω"
    fac = f"φb = {r.factor:.2f}" if meth == "LRFD" else f"Ωb = {r.factor:.2f}"
    lines = [
        f"{section.name} ({section.source}), {steel.grade}: "
        f"Fy = {u.fmt(steel.fy, 'stress')}, E = {u.fmt(steel.E, 'stress', 0)}",
        f"{AISC360.name} Chapter F, {meth} ({fac}), Cb = {cb:.2f}",
        f"  Mp  = {u.fmt(float(r.mp[0]), 'moment')}",
        f"  Mr  = {u.fmt(float(r.mr[0]), 'moment')}  (0.7 Fy Sx)",
        f"  Lp  = {u.fmt(float(r.lp[0]), 'length', 2)}",
        f"  Lr  = {u.fmt(float(r.lr[0]), 'length', 2)}",
        f"  Lb  = {u.fmt(lb, 'length', 2)}",
        f"  Mn  = {u.fmt(float(r.mn[0]), 'moment')}",
        f"  {sym} = {u.fmt(float(r.design_strength[0]), 'moment')}  governed by {r.limit_state[0]}",
        f"  flange {cls.flange_class} (λ = {cls.flange.lam:.2f}, λp = {cls.flange.lam_p:.2f}, "
        f"λr = {cls.flange.lam_r:.2f}); web {cls.web_class} (h/tw = {cls.web.lam:.1f})",
        f"  shear {u.fmt(v.design_strength, 'force')} ({v.clause})",
    ]
    if sampled is not None:
        lunit = u.label("length")
        munit = u.label("moment")
        lines.append(f"  strength curve, Cb = {cb:.2f}:")
        lines.append(f"    {'Lb (' + lunit + ')':>10}  {sym + ' (' + munit + ')':>16}  limit state")
        for x, y, s in zip(sampled.lb, sampled.design_strength, sampled.limit_state, strict=True):
            lines.append(
                f"    {x * u.factor('length'):>10.2f}  {y * u.factor('moment'):>16.1f}  {s}"
            )
    lines.append(CAUTION)
    click.echo("\n".join(lines))


__all__ = ["strength"]
