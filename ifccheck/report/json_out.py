"""The machine-readable results: ``<stem>.results.json`` and ``diff.json``.

The integration contract for the service and for other tools: SI base units
(m, N, N·m, Pa), null for a value that does not exist or is not finite, and
a JSON Schema per document in ``ifccheck/schemas/``. Each beam is written on
a line of its own, so large results stay fast to write and easy to grep.
"""

from __future__ import annotations

import dataclasses
import enum
import json
import math
from collections import Counter
from collections.abc import Mapping
from pathlib import Path, PurePath
from typing import Any

from ifccheck.atomic import write_text
from ifccheck.perf import gc_paused
from ifccheck.reasons import reason_code, reason_text
from ifccheck.report.basis import (
    assumed_grade,
    basis_document,
    beam_stages,
    stage_combination,
)
from ifccheck.report.display import DisplayUnits
from ifccheck.report.requirements import requirement_dict
from ifccheck.report.wording import (
    cause_sentence,
    change_reasons,
    diff_names,
    explanation_sentences,
)
from ifccheck.results import (
    BeamChange,
    BeamResult,
    BeamStageResult,
    BraceCheckOut,
    ChangeCause,
    CheckResult,
    DemandOut,
    DiffResult,
    SampledDiagram,
    SegmentResult,
)

RESULTS_FORMAT = "ifccheck.results"
DIFF_FORMAT = "ifccheck.diff"
FORMAT_VERSION = 2

UNITS = {
    "length": "m",
    "force": "N",
    "moment": "N·m",
    "stress": "Pa",
    "line_load": "N/m",
    "utilisation": "1",
}

SCHEMA_DIR = Path(__file__).resolve().parent.parent / "schemas"
RESULTS_SCHEMA = SCHEMA_DIR / "results.schema.json"
DIFF_SCHEMA = SCHEMA_DIR / "diff.schema.json"


def num(x: Any) -> float | None:
    """A finite float, or None for None, NaN and ±inf."""
    if x is None:
        return None
    v = float(x)
    return v if math.isfinite(v) else None


def jsonable(x: Any) -> Any:
    """Plain JSON data from settings-like values (dataclasses, paths, tuples, numpy)."""
    if x is None or isinstance(x, bool | str | int):
        return x
    if isinstance(x, float):
        return num(x)
    if isinstance(x, dict):
        return {str(k): jsonable(v) for k, v in x.items()}
    if isinstance(x, list | tuple | set | frozenset):
        return [jsonable(v) for v in x]
    if isinstance(x, enum.Enum):
        return jsonable(x.value)
    if isinstance(x, PurePath):
        return str(x)
    if dataclasses.is_dataclass(x) and not isinstance(x, type):
        return {f.name: jsonable(getattr(x, f.name)) for f in dataclasses.fields(x)}
    if hasattr(x, "tolist"):  # numpy arrays and scalars
        return jsonable(x.tolist())
    if hasattr(x, "item"):
        return jsonable(x.item())
    return str(x)


def _point(p: Any) -> list[float | None]:
    return [num(v) for v in p]


def segment_dict(s: SegmentResult) -> dict[str, Any]:
    return {
        "start": num(s.start),
        "end": num(s.end),
        "lb": num(s.lb),
        "cb": num(s.cb),
        "flange": s.flange,
        "continuous": bool(s.continuous),
        "moment_demand": num(s.moment_demand),
        "moment_capacity": num(s.moment_capacity),
        "nominal_moment": num(s.nominal_moment),
        "utilisation": num(s.utilisation),
        "limit_state": s.limit_state,
        "load_combination": s.load_combination,
        "braced_by": list(s.braced_by),
        "stage": s.stage,
    }


def demand_dict(d: DemandOut | None) -> dict[str, Any] | None:
    if d is None:
        return None
    return {
        "source": d.source,
        "tributary_left": num(d.tributary_left),
        "tributary_right": num(d.tributary_right),
        "line_loads": [
            {
                "case": ll.case,
                "intensity": num(ll.intensity),
                "start": num(ll.start),
                "end": num(ll.end),
                "source": ll.source,
            }
            for ll in d.line_loads
        ],
        "point_loads": [
            {
                "case": pl.case,
                "force": num(pl.force),
                "station": num(pl.station),
                "source": pl.source,
            }
            for pl in d.point_loads
        ],
        "moment_combination": d.moment_combination,
        "shear_combination": d.shear_combination,
        "max_moment": num(d.max_moment),
        "max_shear": num(d.max_shear),
        "reactions": {case: [num(v) for v in vals] for case, vals in d.reactions.items()},
    }


def explanation_dict(
    b: BeamResult, du: DisplayUnits | None = None, names: Mapping[str, str] | None = None
) -> dict[str, Any] | None:
    """Why a beam fails or is not checked and what would fix it: SI, plus the words."""
    e = b.explanation
    if e is None:
        return None
    names = names or {}
    shape = e.lighter_shape
    return {
        "causes": [
            {
                "kind": c.kind.value,
                "members": list(c.members),
                "stations": [num(v) for v in c.stations],
                "code": c.code,
                "value": c.value,
                "text": cause_sentence(b, c, du, names) if du is not None else "",
            }
            for c in e.causes
        ],
        "stage": e.stage,
        "segment": e.segment,
        "largest_passing_lb": num(e.largest_passing_lb),
        "brace_flange": e.brace_flange,
        "braces": [
            {
                "station": num(x.station),
                "distance": num(x.distance),
                "from_end": x.end,
                "member": x.member,
                "member_name": x.member_name,
            }
            for x in e.braces
        ],
        "bracing_helps": e.bracing_helps,
        "lighter_shape": None
        if shape is None
        else {
            "profile": shape.profile,
            "mass_per_length": num(shape.mass_per_length),
            "utilisation": num(shape.utilisation),
        },
        "shape_table_searched": e.shape_checked,
        "text": explanation_sentences(b, du, names) if du is not None else [],
    }


def trail_dict(b: BeamResult) -> dict[str, Any] | None:
    """The hand-check trail of the governing segment (SI)."""
    t = b.trail
    if t is None:
        return None
    return {
        "values": {k: num(v) for k, v in t.values.items()},
        "limit_state": t.limit_state,
        "factor": num(t.factor),
        "factor_symbol": t.factor_symbol,
        "equations": list(t.equations),
    }


def beam_dict(
    b: BeamResult,
    detail: bool = False,
    du: DisplayUnits | None = None,
    names: Mapping[str, str] | None = None,
) -> dict[str, Any]:
    """One beam of the results document; ``detail`` adds the diagram and the curve.

    ``du`` and ``names`` word the explanation (its numbers stay SI).
    """
    out: dict[str, Any] = {
        "guid": b.guid,
        "name": b.name,
        "storey": b.storey,
        "ifc_class": b.ifc_class,
        "profile": b.profile,
        "grade": b.grade,
        "grade_source": b.grade_source,
        "fy": num(b.fy),
        "start": _point(b.start),
        "end": _point(b.end),
        "length": num(b.length),
        "span": num(b.span),
        "supports": [{"station": num(s.get("station")), "by": s.get("by")} for s in b.supports],
        "end_members": list(b.end_members),
        "free_ends": list(b.free_ends),
        "brace_points": [
            {
                "station": num(p.station),
                "kind": p.kind,
                "by": p.by,
                "flange": p.flange,
                "counts": bool(p.counts),
                "reason": reason_text(p.reason),
                "reason_code": reason_code(p.reason),
                "adequacy": adequacy_dict(p.adequacy),
            }
            for p in b.brace_points
        ],
        "continuous_bracing": [{"start": num(s), "end": num(e)} for s, e in b.continuous_bracing],
        "segments": [segment_dict(s) for s in b.segments],
        "governing_segment": b.governing_segment,
        "outcome": b.outcome,
        "utilisation": num(b.utilisation),
        "controlling_limit": b.controlling_limit,
        "strength_utilisation": num(b.strength_utilisation),
        "fails_on": list(b.fails_on),
        "flexure_utilisation": num(b.flexure_utilisation),
        "shear_demand": num(b.shear_demand),
        "shear_capacity": num(b.shear_capacity),
        "shear_utilisation": num(b.shear_utilisation),
        "deflection_live": num(b.deflection_live),
        "deflection_total": num(b.deflection_total),
        "deflection_live_limit": num(b.deflection_live_limit),
        "deflection_total_limit": num(b.deflection_total_limit),
        "deflection_utilisation": num(b.deflection_utilisation),
        "reason": reason_text(b.reason),
        "reason_code": reason_code(b.reason),
        "notes": list(b.notes),
        "demand": demand_dict(b.demand),
        "explanation": explanation_dict(b, du, names),
        "trail": trail_dict(b),
        "stage": b.stage,
        "stages": [stage_dict(b, st, detail) for st in beam_stages(b)],
    }
    if detail:
        out["diagram"] = diagram_dict(b.diagram)
        out["curve"] = curve_list(b.curve)
    return out


def diagram_dict(d: SampledDiagram | None) -> dict[str, Any] | None:
    if d is None:
        return None
    return {
        "stations": [num(v) for v in d.stations],
        "moment": [num(v) for v in d.moment],
        "shear": [num(v) for v in d.shear],
    }


def curve_list(curve: list[tuple[float, float]] | None) -> list[dict[str, Any]] | None:
    return None if curve is None else [{"lb": num(x), "strength": num(y)} for x, y in curve]


def stage_dict(b: BeamResult, st: BeamStageResult, detail: bool = False) -> dict[str, Any]:
    """A beam in one stage: its outcome and utilisations there, the index of its
    governing segment in the beam's ``segments`` and that segment's combination."""
    out: dict[str, Any] = {
        "stage": st.stage,
        "outcome": st.outcome,
        "utilisation": num(st.utilisation),
        "controlling_limit": st.controlling_limit,
        "strength_utilisation": num(st.strength_utilisation),
        "flexure_utilisation": num(st.flexure_utilisation),
        "shear_demand": num(st.shear_demand),
        "shear_capacity": num(st.shear_capacity),
        "shear_utilisation": num(st.shear_utilisation),
        "deflection_utilisation": num(st.deflection_utilisation),
        "governing_segment": st.governing_segment,
        "load_combination": stage_combination(b, st),
        "shear_combination": st.demand.shear_combination if st.demand is not None else "",
        "reason": reason_text(st.reason),
        "reason_code": reason_code(st.reason),
        "notes": list(st.notes),
        "demand": demand_dict(st.demand),
    }
    if detail:
        out["diagram"] = diagram_dict(st.diagram)
        out["curve"] = curve_list(st.curve)
    return out


def results_document(result: CheckResult, detail: bool = False) -> dict[str, Any]:
    """The results document as plain JSON data (see docs/outputs.md).

    Quantities are SI; the explanations' sentences are worded in the model's own
    unit system (``display_units``).
    """
    m = result.model
    du = DisplayUnits.for_model(m.length_unit)
    names = result.names
    return {
        "format": RESULTS_FORMAT,
        "format_version": FORMAT_VERSION,
        "tool": result.tool,
        "version": result.version,
        "model": {
            "file": m.file,
            "schema": m.schema,
            "sha256": m.sha256,
            "length_unit": m.length_unit,
        },
        "standard": result.standard,
        "method": result.method,
        "checked_at": result.checked_at,
        "units": dict(UNITS),
        "caution": result.caution,
        "display_units": du.system,
        "settings": jsonable(result.settings),
        "summary": results_summary(result),
        "basis": basis_document(result),
        "storeys": [{"name": n, "elevation": num(z)} for n, z in result.storeys],
        "warnings": [{"guid": g, "message": msg} for g, msg in result.warnings],
        "slabs": [
            {
                "guid": s.guid,
                "storey": s.storey,
                "exterior": [_point(p) for p in s.exterior],
                "holes": [[_point(p) for p in h] for h in s.holes],
            }
            for s in result.slabs
        ],
        "beams": [beam_dict(b, detail, du, names) for b in result.beams],
        "requirements": [requirement_dict(r) for r in result.requirements],
    }


def results_summary(result: CheckResult) -> dict[str, Any]:
    """Counts by outcome, not-checked beams by reason code, the load balance, the grade assumed."""
    return {
        **result.summary(),
        "not_checked_by_reason": result.not_checked_by_reason(),
        "load_balance": [
            {
                "level": x.level,
                "case": x.case,
                "applied": num(x.applied),
                "delivered": num(x.delivered),
            }
            for x in result.load_balance
        ],
        "assumed_grade": assumed_grade(result),
    }


def adequacy_dict(a: BraceCheckOut | None) -> dict[str, Any] | None:
    """A brace point's Appendix 6 check (SI: N and N/m, or N·m and N·m/rad), or None."""
    if a is None:
        return None
    return {
        "kind": a.kind,
        "required_strength": num(a.required_strength),
        "required_stiffness": num(a.required_stiffness),
        "provided_strength": num(a.provided_strength),
        "provided_stiffness": num(a.provided_stiffness),
        "adequate": a.adequate,
        "mr": num(a.mr),
        "lbr": num(a.lbr),
        "cd": a.cd,
        "path": list(a.path),
        "notes": list(a.notes),
    }


def change_dict(
    c: BeamChange,
    du: DisplayUnits | None = None,
    names: Mapping[str, str] | None = None,
    beam: BeamResult | None = None,
) -> dict[str, Any]:
    """One changed beam; ``reasons`` are in words in ``du``'s units, ``causes`` in SI."""
    names = names or {}
    return {
        "guid": c.guid,
        "old_guid": c.old_guid,
        "name": c.name,
        "storey": c.storey,
        "matched_by": c.matched_by,
        "change": c.change,
        "stage": c.stage,
        "outcome_before": c.outcome_before,
        "outcome_after": c.outcome_after,
        "utilisation_before": num(c.utilisation_before),
        "utilisation_after": num(c.utilisation_after),
        "lb_before": num(c.lb_before),
        "lb_after": num(c.lb_after),
        "lost_brace_points": [num(s) for s in c.lost_brace_points],
        "added_brace_points": [num(s) for s in c.added_brace_points],
        "lost_supports": list(c.lost_supports),
        "gained_supports": list(c.gained_supports),
        "lost_continuous_bracing": num(c.lost_continuous_bracing),
        "reasons": change_reasons(c, du, names, beam) if du is not None else [],
        "causes": [cause_dict(x) for x in c.causes],
    }


def cause_dict(x: ChangeCause) -> dict[str, Any]:
    """One cause of a change, machine-readable (SI)."""

    def value(v: float | str | None) -> float | str | None:
        return num(v) if isinstance(v, int | float) else v

    return {
        "kind": x.kind.value,
        "worse": x.worse,
        "stations": [num(s) for s in x.stations],
        "members": list(x.members),
        "before": value(x.before),
        "after": value(x.after),
        "stage": x.stage,
    }


def _revision(r: CheckResult) -> dict[str, Any]:
    return {
        "file": r.model.file,
        "schema": r.model.schema,
        "sha256": r.model.sha256,
        "length_unit": r.model.length_unit,
        "checked_at": r.checked_at,
        "summary": r.summary(),
    }


def diff_summary(diff: DiffResult) -> dict[str, int]:
    kinds = Counter(c.change for c in diff.changes)
    return {
        "matched": diff.matched,
        "changed": len(diff.changes),
        "weakened": kinds["weakened"],
        "strengthened": kinds["strengthened"],
        "otherwise_changed": kinds["changed"],
        "added": len(diff.added),
        "removed": len(diff.removed),
        "new_failures": sum(
            1 for c in diff.changes if c.outcome_after == "fail" and c.outcome_before != "fail"
        ),
    }


_CHANGE_ORDER = {"weakened": 0, "changed": 1, "strengthened": 2}


def diff_document(diff: DiffResult, units: str | None = None) -> dict[str, Any]:
    """The revision comparison as plain JSON data (see docs/outputs.md).

    Quantities are SI; the ``reasons`` sentences of each beam use the display
    units ``units`` (default: the new model's unit system), like the CSV and report.
    """
    du = DisplayUnits.for_model(diff.new.model.length_unit, units)
    names = diff_names(diff)
    beams = {b.guid: b for b in diff.new.beams}
    changes = sorted(diff.changes, key=lambda c: (_CHANGE_ORDER.get(c.change, 3), c.guid))
    return {
        "format": DIFF_FORMAT,
        "format_version": FORMAT_VERSION,
        "tool": diff.new.tool,
        "version": diff.new.version,
        "standard": diff.new.standard,
        "method": diff.new.method,
        "units": dict(UNITS),
        "caution": diff.new.caution,
        "old": _revision(diff.old),
        "new": _revision(diff.new),
        "matched": diff.matched,
        "added": list(diff.added),
        "removed": list(diff.removed),
        "summary": diff_summary(diff),
        "display_units": du.system,
        "beams": {c.guid: change_dict(c, du, names, beams.get(c.guid)) for c in changes},
    }


_LINE_LISTS = ("beams", "slabs")


def dumps(doc: dict[str, Any]) -> str:
    """Indented JSON with one line per item of the long lists (beams, slabs).

    ``allow_nan=False`` makes a stray NaN an error here instead of invalid JSON
    downstream. The C encoder runs only without ``indent``, hence the per-item lines.
    """
    parts = []
    for key, value in doc.items():
        k = json.dumps(key)
        if key in _LINE_LISTS and isinstance(value, list) and value:
            items = ",\n    ".join(
                json.dumps(v, allow_nan=False, ensure_ascii=False) for v in value
            )
            parts.append(f"  {k}: [\n    {items}\n  ]")
        else:
            text = json.dumps(value, allow_nan=False, ensure_ascii=False, indent=2)
            parts.append(f"  {k}: " + text.replace("\n", "\n  "))
    return "{\n" + ",\n".join(parts) + "\n}\n"


def write_results_json(result: CheckResult, path: Path, detail: bool = False) -> Path:
    """Write ``<stem>.results.json`` atomically; return its path."""
    with gc_paused():
        text = dumps(results_document(result, detail))
    return write_text(path, text)


def write_diff_json(diff: DiffResult, path: Path, units: str | None = None) -> Path:
    """Write ``diff.json`` atomically; return its path."""
    with gc_paused():
        text = dumps(diff_document(diff, units))
    return write_text(path, text)
