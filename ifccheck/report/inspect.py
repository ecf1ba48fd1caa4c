"""What was read from a model: the `inspect` command's JSON and text."""

from __future__ import annotations

import math
from collections import defaultdict
from collections.abc import Sequence
from typing import TYPE_CHECKING, Any

from ifccheck import CAUTION, __version__
from ifccheck.framing.types import Framing, MemberFraming
from ifccheck.model import Member, Model, Section, Slab
from ifccheck.reasons import reason_code, reason_text
from ifccheck.report.display import DisplayUnits

if TYPE_CHECKING:
    from ifccheck.loads.demand import BeamDemand, DemandResult

SECTION_KEYS = ("A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "J", "Cw", "ho", "rts")
SECTION_DIMS = ("d", "bf", "tw", "tf", "r", "h")


def section_dict(section: Section | None) -> dict[str, Any] | None:
    if section is None:
        return None
    out: dict[str, Any] = {"name": section.name, "family": section.family.value}
    for k in SECTION_DIMS + SECTION_KEYS:
        out[k] = getattr(section, k)
    out["source"] = section.source
    return out


def member_dict(m: Member) -> dict[str, Any]:
    return {
        "guid": m.guid,
        "ifc_class": m.ifc_class,
        "predefined_type": m.predefined_type,
        "role": m.role.value,
        "name": m.name,
        "storey": m.storey,
        "profile": m.profile_name,
        "profile_source": m.profile_source,
        "family": m.family.value if m.family is not None else None,
        "dimensions": dict(m.dimensions),
        "grade": m.steel.grade if m.steel else None,
        "fy": m.steel.fy if m.steel else None,
        "grade_source": m.grade_source,
        "material": m.material_name,
        "material_category": m.material.value,
        "start": list(m.start),
        "end": list(m.end),
        "length": m.length,
        "top_of_steel": m.top_of_steel,
        "web_up": list(m.web_up),
        "section": section_dict(m.section),
        "axis_source": m.axis_source,
        "unresolved": m.unresolved.text if m.unresolved else None,
        "unresolved_code": reason_code(m.unresolved),
        "notes": list(m.notes),
    }


def framing_dict(mf: MemberFraming) -> dict[str, Any]:
    """What the framing graph says of one beam-like member (stations in m)."""
    return {
        "state": mf.state,
        "supports": [
            {"station": s.station, "by": s.by, "by_class": s.by_class, "end": s.end}
            for s in sorted(mf.supports, key=lambda s: s.station)
        ],
        "brace_points": [
            {
                "station": b.station,
                "kind": b.kind,
                "by": b.by,
                "flange": b.flange,
                "counts": b.counts,
                **(
                    {"reason": reason_text(b.reason), "reason_code": reason_code(b.reason)}
                    if not b.counts
                    else {}
                ),
            }
            for b in sorted(mf.brace_points, key=lambda b: b.station)
        ],
        "continuous_bracing": [[a, b] for a, b in mf.continuous_bracing],
        "free_ends": list(mf.free_ends),
        "carries": list(mf.carries),
    }


def demand_dict(bd: BeamDemand) -> dict[str, Any]:
    """The auditable demand of one beam: tributary, loads by case, combination."""
    return {
        "source": bd.source,
        "tributary_role": bd.role,
        "tributary_width": bd.tributary_left + bd.tributary_right,
        "tributary_left": bd.tributary_left,
        "tributary_right": bd.tributary_right,
        "line_loads": [
            {"case": x.case, "intensity": x.w, "start": x.start, "end": x.end, "source": x.source}
            for x in bd.line_loads
        ],
        "point_loads": [
            {"case": x.case, "force": x.P, "station": x.station, "source": x.source}
            for x in bd.point_loads
        ],
        "moment_combination": bd.governing_moment or None,
        "shear_combination": bd.governing_shear or None,
        "max_moment": bd.max_moment,
        "max_shear": bd.max_shear,
        "reason": bd.reason.text if bd.reason else None,
        "reason_code": reason_code(bd.reason),
        "notes": list(bd.notes),
    }


def slab_dict(s: Slab) -> dict[str, Any]:
    return {
        "guid": s.guid,
        "name": s.name,
        "ifc_class": s.ifc_class,
        "storey": s.storey,
        "thickness": s.thickness,
        "underside": s.underside,
        "top": s.top,
        "area": s.footprint.area,
        "openings": [{"area": o.area, "bounds": list(o.bounds)} for o in s.openings],
        "notes": list(s.notes),
    }


def inspect_document(
    model: Model,
    seconds: float,
    framing: Framing | None = None,
    demand: DemandResult | None = None,
) -> dict[str, Any]:
    """The `inspect --json` document (SI base units); strict JSON: a number that is not
    finite (a position the reader could not find, an unbounded ratio) is written as null."""
    members = []
    for m in model.members:
        d = member_dict(m)
        mf = framing.members.get(m.guid) if framing else None
        if mf is not None:
            d.update(framing_dict(mf))
        bd = demand.beams.get(m.guid) if demand else None
        if bd is not None:
            d["demand"] = demand_dict(bd)
        members.append(d)
    warnings = list(model.warnings)
    for w in [*(framing.warnings if framing else []), *(demand.warnings if demand else [])]:
        if w not in warnings:
            warnings.append(w)
    return finite_only(
        {
            "tool": "ifccheck",
            "version": __version__,
            "model": model.source,
            "schema": model.schema,
            "length_unit": model.length_unit,
            "summary": summary(model, seconds),
            "storeys": [
                {"guid": s.guid, "name": s.name, "elevation": s.elevation} for s in model.storeys
            ],
            "members": members,
            "unreadable": [member_dict(m) for m in model.unreadable],
            "duplicate_guids": {g: list(keys) for g, keys in model.duplicate_guids.items()},
            "slabs": [slab_dict(s) for s in model.slabs],
            "walls": [
                {"guid": w.guid, "name": w.name, "storey": w.storey, "base": w.base, "top": w.top}
                for w in model.walls
            ],
            "levels": [
                {"name": lv.name, "elevation": lv.elevation, "storey": lv.storey, "beams": lv.beams}
                for lv in model.levels
            ],
            "deck_spans": [
                {
                    "storey": ds.storey,
                    "level": ds.storey,
                    "angle": ds.angle,
                    "source": ds.source,
                    "evidence": ds.evidence,
                    "basis": ds.basis,
                    "typical_spacing": ds.typical_spacing,
                }
                for ds in (demand.deck_spans.values() if demand else [])
            ],
            "load_balance": [
                {"level": r.level, "case": r.case, "applied": r.applied, "delivered": r.delivered}
                for r in (demand.load_balance if demand else [])
            ],
            "excluded": dict(framing.excluded) if framing else {},
            "load_path_cycles": [list(c) for c in framing.cycles] if framing else [],
            "warnings": [{"guid": g, "message": msg} for g, msg in warnings],
            "caution": CAUTION,
        }
    )


def finite_only(value: Any) -> Any:
    """A JSON-ready value with every NaN or infinite float replaced by None."""
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    if isinstance(value, dict):
        return {k: finite_only(v) for k, v in value.items()}
    if isinstance(value, list | tuple):
        return [finite_only(v) for v in value]
    if hasattr(value, "item") and not isinstance(value, str | bytes):  # numpy scalars
        return finite_only(value.item())
    return value


def summary(model: Model, seconds: float) -> dict[str, Any]:
    by_role: dict[str, int] = defaultdict(int)
    for m in model.members:
        by_role[m.role.value] += 1
    return {
        "members": len(model.members),
        "by_role": dict(by_role),
        "slabs": len(model.slabs),
        "walls": len(model.walls),
        "not_resolved": sum(1 for m in model.members if m.unresolved),
        "unreadable": len(model.unreadable),
        "geometry_fallbacks": model.geometry_fallbacks,
        "seconds": round(seconds, 3),
    }


def _length(value: float, du: DisplayUnits) -> str:
    return du.text(value, "length", 2 if du.system == "imperial" else 3)


def inspect_text(
    model: Model,
    seconds: float,
    du: DisplayUnits,
    framing: Framing | None = None,
    demand: DemandResult | None = None,
) -> str:
    """Readable tables per storey, the framing of each beam, and a summary line."""
    lines = [f"{model.source}  ({model.schema}, length unit: {model.length_unit})", ""]
    by_storey: dict[str, list[Member]] = defaultdict(list)
    for m in model.members:
        by_storey[m.storey].append(m)
    order = [s.name for s in model.storeys] + sorted(
        set(by_storey) - {s.name for s in model.storeys}
    )
    names = {m.guid: m.name or m.guid for m in [*model.members, *model.unreadable]}
    names.update({w.guid: w.name or w.guid for w in model.walls})
    header = ("member", "class", "profile", "grade", "length", "axis from", "profile from", "notes")
    for storey in order:
        members = by_storey.get(storey, [])
        if not members:
            continue
        lines.append(f"== {storey or '(no storey)'}: {len(members)} members")
        rows = [header]
        for m in members:
            notes = "; ".join(([m.unresolved.text] if m.unresolved else []) + m.notes)
            rows.append(
                (
                    m.name or m.guid,
                    m.ifc_class.removeprefix("Ifc") + (f"/{m.role.value}"),
                    m.profile_name or "-",
                    m.steel.grade if m.steel else m.material.value,
                    _length(m.length, du),
                    m.axis_source,
                    m.profile_source or "-",
                    notes,
                )
            )
        lines += _table(rows)
        lines.append("")
        framing_text = _framing_lines(members, framing, demand, du, names) if framing else []
        if len(framing_text) > 1:
            lines += [*framing_text, ""]
    for m in model.unreadable:
        lines.append(f"not read: {m.ifc_class} {m.name or m.guid}: {reason_text(m.unresolved)}")
    for s in model.slabs:
        lines.append(
            f"slab {s.name or s.guid} on {s.storey or '(no storey)'}: thickness "
            f"{du.text(s.thickness, 'thickness', 1)}, underside {_length(s.underside, du)}, "
            f"area {du.text(s.footprint.area, 'area', 1)}, {len(s.openings)} opening(s)"
        )
    if demand is not None:
        for ds in demand.deck_spans.values():
            if ds.angle is not None:
                why = f", {ds.evidence} {ds.basis}" if ds.basis and ds.basis != "settings" else ""
                lines.append(
                    f"deck on {ds.storey} spans at {ds.angle:.0f}° from x ({ds.source}{why})"
                )
            else:
                lines.append(f"deck on {ds.storey}: span direction unknown")
        for r in demand.load_balance:
            share = r.delivered / r.applied if r.applied else 1.0
            lines.append(
                f"load on {r.level}, {r.case}: {du.text(r.applied, 'force', 1)} applied, "
                f"{du.text(r.delivered, 'force', 1)} delivered to the supports ({share:.1%})"
            )
    warnings = list(model.warnings)
    for w in [*(framing.warnings if framing else []), *(demand.warnings if demand else [])]:
        if w not in warnings:
            warnings.append(w)
    for guid, message in warnings:
        who = names.get(guid, guid)
        lines.append(f"warning: {who}: {message}" if who else f"warning: {message}")
    sm = summary(model, seconds)
    rate = sm["members"] / seconds if seconds > 0 else float("inf")
    lines += [
        "",
        f"read {sm['members']} members, {sm['slabs']} slabs, {sm['walls']} walls in "
        f"{seconds:.2f} s ({rate:.0f} members/s); {sm['not_resolved']} not resolved; "
        f"{sm['geometry_fallbacks']} fell back to body geometry",
        CAUTION,
    ]
    return "\n".join(lines)


def _framing_lines(
    members: list[Member],
    framing: Framing,
    demand: DemandResult | None,
    du: DisplayUnits,
    names: dict[str, str],
) -> list[str]:
    out = ["  framing (stations from each member's start):"]
    for m in members:
        mf = framing.members.get(m.guid)
        if mf is None:
            continue
        sup = ", ".join(f"{_length(s.station, du)} on {names.get(s.by, s.by)}" for s in mf.supports)
        seen: dict[tuple[float, bool], int] = {}
        for b in sorted(mf.brace_points, key=lambda b: b.station):
            if b.kind != "support":
                key = (round(b.station, 3), b.counts)
                seen[key] = seen.get(key, 0) + 1
        braces = ", ".join(
            _length(st, du)
            + (f" ({n} members)" if n > 1 else "")
            + ("" if counts else " (does not count)")
            for (st, counts), n in seen.items()
        )
        covered = sum(b - a for a, b in mf.continuous_bracing)
        text = f"    {m.name or m.guid}: {mf.state}; supports {sup or 'none'}"
        text += f"; braces at {braces or 'ends only'}"
        text += f"; slab-braced {_length(covered, du)} of {_length(m.length, du)}"
        if mf.free_ends:
            text += f"; free end: {', '.join(mf.free_ends)}"
        bd = demand.beams.get(m.guid) if demand else None
        if bd is not None:
            width = bd.tributary_left + bd.tributary_right
            text += f"; tributary {_length(width, du)}"
            if bd.reason:
                text += f"; no demand: {bd.reason}"
        out.append(text)
    return out


def _table(rows: Sequence[tuple[str, ...]]) -> list[str]:
    widths = [max(len(r[i]) for r in rows) for i in range(len(rows[0]) - 1)]
    out = []
    for r in rows:
        cells = [c.ljust(w) for c, w in zip(r[:-1], widths, strict=True)] + [r[-1]]
        out.append("  " + "  ".join(cells).rstrip())
    return out
