"""One row per beam (``<stem>.beams.csv``) and per changed beam (``diff.csv``).

Dimensional columns carry their unit in the name (``lb_ft`` / ``lb_m``,
``moment_demand_kip_ft`` / ``moment_demand_kN_m``), values in the chosen
unit system (six significant digits; stresses with the trade's digits: 345 MPa,
50 ksi); utilisations and Cb are plain numbers. Empty cells are values that
do not exist (a not-checked beam has no utilisation, a beam not checked during
construction no construction columns).
"""

from __future__ import annotations

import csv
import io
import math
from collections.abc import Callable, Sequence
from pathlib import Path
from typing import Any

from ifccheck.atomic import write_text
from ifccheck.reasons import reason_code, reason_text
from ifccheck.report.basis import beam_stage
from ifccheck.report.display import DisplayUnits
from ifccheck.report.wording import change_reasons, diff_names
from ifccheck.results import BeamChange, BeamResult, CheckResult, DiffResult, StageName
from ifccheck.units import check_system

# (column stem, kind or None for a plain value, getter)
Column = tuple[str, str | None, Callable[[Any], Any]]


def _gov(attr: str) -> Callable[[BeamResult], Any]:
    def get(b: BeamResult) -> Any:
        seg = b.governing
        return None if seg is None else getattr(seg, attr)

    return get


def _stage(stage: StageName, attr: str) -> Callable[[BeamResult], Any]:
    """A getter of one stage's value: ``attr`` of its result, or of its governing segment
    (``segment.<attr>``); None where the beam was not checked in that stage."""

    def get(b: BeamResult) -> Any:
        st = beam_stage(b, stage)
        if st is None:
            return None
        if not attr.startswith("segment."):
            return getattr(st, attr)
        i = st.governing_segment
        if i is None or not 0 <= i < len(b.segments):
            return None
        return getattr(b.segments[i], attr.removeprefix("segment."))

    return get


def _stage_columns(stage: StageName) -> tuple[Column, ...]:
    return (
        (f"{stage}_outcome", None, _stage(stage, "outcome")),
        (f"{stage}_utilisation", None, _stage(stage, "utilisation")),
        (f"{stage}_lb", "length", _stage(stage, "segment.lb")),
        (f"{stage}_load_combination", None, _stage(stage, "segment.load_combination")),
    )


def _governing_stage(b: BeamResult) -> str:
    return "" if b.outcome == "not_checked" else b.stage


def _brace_stations(b: BeamResult) -> list[float]:
    return sorted(p.station for p in b.brace_points if p.counts)


BEAM_COLUMNS: tuple[Column, ...] = (
    ("guid", None, lambda b: b.guid),
    ("name", None, lambda b: b.name),
    ("storey", None, lambda b: b.storey),
    ("outcome", None, lambda b: b.outcome),
    ("controlling_limit", None, lambda b: b.controlling_limit),
    ("fails_on", None, lambda b: " ".join(b.fails_on)),
    ("utilisation", None, lambda b: b.utilisation),
    ("strength_utilisation", None, lambda b: b.strength_utilisation),
    ("flexure_utilisation", None, lambda b: b.flexure_utilisation),
    ("shear_utilisation", None, lambda b: b.shear_utilisation),
    ("deflection_utilisation", None, lambda b: b.deflection_utilisation),
    ("governing_stage", None, _governing_stage),
    *_stage_columns("in_service"),
    *_stage_columns("construction"),
    ("ifc_class", None, lambda b: b.ifc_class),
    ("profile", None, lambda b: b.profile),
    ("grade", None, lambda b: b.grade),
    ("fy", "stress", lambda b: b.fy),
    ("length", "length", lambda b: b.length),
    ("span", "length", lambda b: b.span),
    ("segment_start", "length", _gov("start")),
    ("segment_end", "length", _gov("end")),
    ("lb", "length", _gov("lb")),
    ("cb", None, _gov("cb")),
    ("compression_flange", None, _gov("flange")),
    ("limit_state", None, _gov("limit_state")),
    ("moment_demand", "moment", _gov("moment_demand")),
    ("moment_capacity", "moment", _gov("moment_capacity")),
    ("load_combination", None, _gov("load_combination")),
    ("shear_demand", "force", lambda b: b.shear_demand),
    ("shear_capacity", "force", lambda b: b.shear_capacity),
    ("deflection_live", "deflection", lambda b: b.deflection_live),
    ("deflection_total", "deflection", lambda b: b.deflection_total),
    ("brace_stations", "length", _brace_stations),
    ("reason", None, lambda b: reason_text(b.reason)),
    ("reason_code", None, lambda b: reason_code(b.reason) or ""),
    ("notes", None, lambda b: b.notes),
)

DIFF_COLUMNS: tuple[Column, ...] = (
    ("guid", None, lambda c: c.guid),
    ("old_guid", None, lambda c: c.old_guid),
    ("name", None, lambda c: c.name),
    ("storey", None, lambda c: c.storey),
    ("matched_by", None, lambda c: c.matched_by),
    ("change", None, lambda c: c.change),
    ("stage", None, lambda c: c.stage),
    ("outcome_before", None, lambda c: c.outcome_before),
    ("outcome_after", None, lambda c: c.outcome_after),
    ("utilisation_before", None, lambda c: c.utilisation_before),
    ("utilisation_after", None, lambda c: c.utilisation_after),
    ("lb_before", "length", lambda c: c.lb_before),
    ("lb_after", "length", lambda c: c.lb_after),
    ("lost_brace_points", "length", lambda c: c.lost_brace_points),
    ("added_brace_points", "length", lambda c: c.added_brace_points),
    ("lost_supports", None, lambda c: c.lost_supports),
    ("gained_supports", None, lambda c: c.gained_supports),
    ("lost_continuous_bracing", "length", lambda c: c.lost_continuous_bracing),
)


def _number(v: float) -> str:
    if not math.isfinite(v):
        return ""
    return f"{v:.6g}"


def _cell(value: Any, factor: float) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int | float):
        return _number(float(value) * factor)
    if isinstance(value, list | tuple):
        if all(isinstance(v, int | float) for v in value):
            return " ".join(_number(float(v) * factor) for v in value)
        return "; ".join(str(v) for v in value)
    return str(value)


def column_names(columns: Sequence[Column], du: DisplayUnits) -> list[str]:
    """Column names, each dimensional one with its unit suffix."""
    return [name if kind is None else f"{name}_{du.suffix(kind)}" for name, kind, _ in columns]


def _table(rows: Sequence[Any], columns: Sequence[Column], units: str) -> str:
    du = DisplayUnits(check_system(units))
    factors = [1.0 if kind is None else du.factor(kind) for _, kind, _ in columns]
    getters = [get for _, _, get in columns]
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(column_names(columns, du))
    # stresses as the trade writes them (345 MPa, 50 ksi), not 344.738
    trade = [kind in TRADE_KINDS for _, kind, _ in columns]
    for row in rows:
        w.writerow(
            [
                _trade_cell(get(row), du, kind) if t else _cell(get(row), f)
                for get, f, t, (_, kind, _) in zip(getters, factors, trade, columns, strict=True)
            ]
        )
    return buf.getvalue()


TRADE_KINDS = frozenset({"stress"})


def _trade_cell(value: Any, du: DisplayUnits, kind: str | None) -> str:
    if value is None or kind is None or not math.isfinite(float(value)):
        return ""
    return du.trade_number(float(value), kind)


def beams_csv(result: CheckResult, units: str) -> str:
    """The beam table as CSV text."""
    return _table(result.beams, BEAM_COLUMNS, units)


def diff_csv(diff: DiffResult, units: str) -> str:
    """The changed-beam table as CSV text, weakened beams first."""
    order = {"weakened": 0, "changed": 1, "strengthened": 2}
    changes: list[BeamChange] = sorted(diff.changes, key=lambda c: (order.get(c.change, 3), c.guid))
    du, names = DisplayUnits(check_system(units)), diff_names(diff)
    beams = {b.guid: b for b in diff.new.beams}
    reasons: Column = ("reasons", None, lambda c: change_reasons(c, du, names, beams.get(c.guid)))
    return _table(changes, (*DIFF_COLUMNS, reasons), units)


def write_beams_csv(result: CheckResult, path: Path, units: str) -> Path:
    """Write ``<stem>.beams.csv`` atomically (UTF-8); return its path."""
    return write_text(path, beams_csv(result, units))


def write_diff_csv(diff: DiffResult, path: Path, units: str) -> Path:
    """Write ``diff.csv`` atomically (UTF-8); return its path."""
    return write_text(path, diff_csv(diff, units))
