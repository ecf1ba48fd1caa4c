"""What was read from a model: the `inspect` command's JSON and text."""

from __future__ import annotations

from collections import defaultdict
from typing import Any

from ifccheck import CAUTION, __version__
from ifccheck.model import Member, Model, Section, Slab

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
        "unresolved": m.unresolved or None,
        "notes": list(m.notes),
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


def inspect_document(model: Model, seconds: float) -> dict[str, Any]:
    """The `inspect --json` document (SI base units)."""
    return {
        "tool": "ifccheck",
        "version": __version__,
        "model": model.source,
        "schema": model.schema,
        "length_unit": model.length_unit,
        "summary": summary(model, seconds),
        "storeys": [
            {"guid": s.guid, "name": s.name, "elevation": s.elevation} for s in model.storeys
        ],
        "members": [member_dict(m) for m in model.members],
        "slabs": [slab_dict(s) for s in model.slabs],
        "walls": [
            {"guid": w.guid, "name": w.name, "storey": w.storey, "base": w.base, "top": w.top}
            for w in model.walls
        ],
        "warnings": [{"guid": g, "message": msg} for g, msg in model.warnings],
        "caution": CAUTION,
    }


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
        "geometry_fallbacks": model.geometry_fallbacks,
        "seconds": round(seconds, 3),
    }


def _length(value: float, imperial: bool) -> str:
    return f"{value / 0.3048:.2f} ft" if imperial else f"{value:.3f} m"


def inspect_text(model: Model, seconds: float, imperial: bool) -> str:
    """Readable tables per storey and a summary line."""
    lines = [f"{model.source}  ({model.schema}, length unit: {model.length_unit})", ""]
    by_storey: dict[str, list[Member]] = defaultdict(list)
    for m in model.members:
        by_storey[m.storey].append(m)
    order = [s.name for s in model.storeys] + sorted(
        set(by_storey) - {s.name for s in model.storeys}
    )
    header = ("member", "class", "profile", "grade", "length", "axis from", "profile from", "notes")
    for storey in order:
        members = by_storey.get(storey, [])
        if not members:
            continue
        lines.append(f"== {storey or '(no storey)'}: {len(members)} members")
        rows = [header]
        for m in members:
            notes = "; ".join(([m.unresolved] if m.unresolved else []) + m.notes)
            rows.append(
                (
                    m.name or m.guid,
                    m.ifc_class.removeprefix("Ifc") + (f"/{m.role.value}"),
                    m.profile_name or "-",
                    m.steel.grade if m.steel else m.material.value,
                    _length(m.length, imperial),
                    m.axis_source,
                    m.profile_source or "-",
                    notes,
                )
            )
        lines += _table(rows)
        lines.append("")
    for s in model.slabs:
        area = s.footprint.area / (0.3048**2) if imperial else s.footprint.area
        unit = "ft²" if imperial else "m²"
        lines.append(
            f"slab {s.name or s.guid} on {s.storey or '(no storey)'}: thickness "
            f"{_length(s.thickness, imperial)}, underside {_length(s.underside, imperial)}, "
            f"area {area:.1f} {unit}, {len(s.openings)} opening(s)"
        )
    for guid, message in model.warnings:
        lines.append(f"warning: {guid}: {message}")
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


def _table(rows: list[tuple[str, ...]]) -> list[str]:
    widths = [max(len(r[i]) for r in rows) for i in range(len(rows[0]) - 1)]
    out = []
    for r in rows:
        cells = [c.ljust(w) for c, w in zip(r[:-1], widths, strict=True)] + [r[-1]]
        out.append("  " + "  ".join(cells).rstrip())
    return out
