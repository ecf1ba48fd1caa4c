"""Plain-language descriptions of a beam's result, shared by the BCF and HTML writers."""

from __future__ import annotations

from collections.abc import Mapping

from ifccheck.reasons import NotChecked, Reason
from ifccheck.report.display import DisplayUnits, utilisation_text
from ifccheck.results import (
    BeamChange,
    BeamResult,
    CauseKind,
    ChangeCause,
    DiffResult,
    SegmentResult,
)

LIMIT_STATE_WORDS = {
    "yielding": "yielding (full plastic moment)",
    "inelastic_ltb": "inelastic lateral-torsional buckling",
    "elastic_ltb": "elastic lateral-torsional buckling",
    "flange_local_buckling": "flange local buckling",
}

LTB_STATES = ("inelastic_ltb", "elastic_ltb")

CHECK_WORDS = {"flexure": "bending", "shear": "shear", "deflection": "deflection"}

OUTCOME_WORDS = {"pass": "passes", "fail": "fails", "not_checked": "was not checked"}
OUTCOME_STATE_WORDS = {"pass": "pass", "fail": "fail", "not_checked": "not checked"}

_PROFILE_ADVICE = (
    "give the beam a profile the tool can read: a parametric profile with dimensions "
    "(IfcIShapeProfileDef, IfcUShapeProfileDef…) or a standard shape name in its type or profile"
)

# reason code → what the modelling team (or the engineer) should do about it
ADVICE: dict[NotChecked, str] = {
    NotChecked.NO_PROFILE: _PROFILE_ADVICE,
    NotChecked.PROFILE_NOT_IN_TABLE: "use a designation from the shape tables the tool ships, "
    "or model the profile with its dimensions (IfcIShapeProfileDef, IfcUShapeProfileDef…)",
    NotChecked.PROFILE_WITHOUT_DIMENSIONS: _PROFILE_ADVICE,
    NotChecked.OUTLINE_NOT_RECOGNISED: "model the profile as a parametric profile "
    "(IfcIShapeProfileDef, IfcUShapeProfileDef…) or name a standard shape in its profile or "
    "type, since the drawn outline could not be read as one",
    NotChecked.SHAPE_WITHOUT_PROPERTIES: "nothing to fix in the model: the shape was read with "
    "its dimensions, but the tool does not compute this family's section properties yet; "
    "check the member by other means",
    NotChecked.NOT_STEEL: "nothing to fix if the member is meant to be concrete or timber: "
    "only steel members are checked",
    NotChecked.NO_GRADE: "assign a steel material whose name gives the grade (e.g. A992, S355), "
    "map the material name to a grade under [steel.materials] in the settings, or state "
    "steel.default_grade in the settings to take responsibility for the assumption",
    NotChecked.BAD_ELEMENT: "correct the element's geometry or definition in the model",
    NotChecked.SECTION_OUT_OF_SCOPE: "check this member by other means: the design standard "
    "as implemented does not cover its section",
    NotChecked.NOT_IN_FRAMING: "give the beam a readable centre line (an axis or an extruded "
    "body) so that its connections can be found",
    NotChecked.UNSUPPORTED: "connect the beam's ends to the members that carry it (girders, "
    "columns or walls) within the connection tolerance",
    NotChecked.UNSTABLE: "connect the beam's other end to its support, or declare the moment "
    "connection a cantilever needs",
    NotChecked.LOAD_PATH_CYCLE: "remove the loop in the load path (beams that carry each other)",
    NotChecked.STATICS_FAILED: "check the beam's supports and loads in the model",
    NotChecked.NO_DEMAND: "provide the loads (a slab or a declared deck) or analysis results "
    "for this beam",
    NotChecked.NO_FLOOR_LOAD: "model the slab or deck of this level, or declare it under [decks] "
    "in the settings, or give the beam's demand from an analysis (--demands)",
    NotChecked.NO_DECK_DIRECTION: "state the deck span direction of this level in the settings "
    "(deck_span)",
    NotChecked.BRACE_UNANCHORED: "tie the bracing line to a column, wall, slab or braced bay, "
    "or do not rely on it",
    NotChecked.BRACE_NOT_STRUCTURAL: "nothing to fix if it is hardware; model real braces as "
    "members with a section",
    NotChecked.BRACE_INADEQUATE: "use a stronger or stiffer brace, or a shorter path to its anchor",
}


def limit_state_words(limit_state: str) -> str:
    return LIMIT_STATE_WORDS.get(limit_state, limit_state.replace("_", " "))


def beam_label(b: BeamResult) -> str:
    """'B-12 (W24X84, Level 2)'."""
    name = b.name or b.guid
    parts = [p for p in (b.profile, b.storey) if p]
    return f"{name} ({', '.join(parts)})" if parts else name


def segment_midpoint(seg: SegmentResult) -> float:
    return 0.5 * (seg.start + seg.end)


def segment_words(b: BeamResult, seg: SegmentResult, du: DisplayUnits) -> str:
    """Where the governing segment is and what governs it, in a sentence."""
    index = b.segments.index(seg) + 1 if seg in b.segments else 0
    where = (
        f"segment {index} of {len(b.segments)}, from {du.text(seg.start, 'length')} "
        f"to {du.text(seg.end, 'length')} along the beam"
    )
    if seg.continuous or seg.lb == 0.0:
        bracing = f"its {seg.flange} flange is braced continuously by the slab"
    else:
        bracing = (
            f"unbraced length Lb = {du.text(seg.lb, 'length')} with the {seg.flange} "
            f"flange in compression, Cb = {seg.cb:.2f}"
        )
    return (
        f"The governing length is {where}: {bracing}. "
        f"{limit_state_words(seg.limit_state).capitalize()} governs: a moment of "
        f"{du.text(seg.moment_demand, 'moment', 1)} against a strength of "
        f"{du.text(seg.moment_capacity, 'moment', 1)} "
        f"(utilisation {utilisation_text(seg.utilisation)}) "
        f"under {seg.load_combination or 'the governing combination'}."
    )


def fix_words(b: BeamResult, du: DisplayUnits) -> str:
    """What would make a failing beam pass."""
    seg = b.governing
    if b.controlling_limit == "shear":
        return "Shear governs: use a section with a deeper or thicker web."
    if b.controlling_limit == "deflection":
        return "Deflection governs: use a stiffer (deeper) section or shorten the span."
    if seg is not None and seg.limit_state in LTB_STATES and seg.lb > 0.0:
        x = segment_midpoint(seg)
        return (
            f"Add a brace to the {seg.flange} flange near station {du.text(x, 'length')} "
            f"(the middle of the governing unbraced length), or use a heavier section."
        )
    return "Bracing does not control here: use a heavier section or reduce the load."


def advice(reason: Reason | None) -> str:
    """What to do about a reason, as a sentence ('' for none)."""
    if reason is None:
        return ""
    text = ADVICE[reason.code]
    return text[0].upper() + text[1:] + "."


def beam_issue_title(b: BeamResult) -> str:
    if b.outcome == "not_checked":
        return f"{beam_label(b)}: not checked"
    u = f" utilisation {utilisation_text(b.utilisation)}" if b.utilisation is not None else ""
    what = CHECK_WORDS.get(b.controlling_limit, b.controlling_limit or "check")
    seg = b.governing
    if b.controlling_limit == "flexure" and seg is not None:
        what = limit_state_words(seg.limit_state)
    return f"{beam_label(b)} fails in {what},{u}"


def beam_issue_description(b: BeamResult, du: DisplayUnits) -> str:
    """Why the beam is an issue and what would fix it, in plain sentences."""
    if b.outcome == "not_checked":
        reason = b.reason.text if b.reason else "no reason was recorded"
        return f"This beam was not checked: {reason}. {advice(b.reason)}".rstrip()
    lines: list[str] = []
    u = f" (utilisation {utilisation_text(b.utilisation)})" if b.utilisation is not None else ""
    what = CHECK_WORDS.get(b.controlling_limit, b.controlling_limit or "the check")
    lines.append(f"This beam {OUTCOME_WORDS.get(b.outcome, b.outcome)} in {what}{u}.")
    seg = b.governing
    if seg is not None and b.controlling_limit in ("flexure", ""):
        lines.append(segment_words(b, seg, du))
    elif b.controlling_limit == "shear" and b.shear_demand is not None:
        lines.append(
            f"Shear {du.text(b.shear_demand, 'force', 1)} against a strength of "
            f"{du.text(b.shear_capacity, 'force', 1)}."
        )
    elif b.controlling_limit == "deflection":
        lines.append(
            f"Live-load deflection {du.text(b.deflection_live, 'deflection', 1)} "
            f"(limit {du.text(b.deflection_live_limit, 'deflection', 1)}), total "
            f"{du.text(b.deflection_total, 'deflection', 1)} "
            f"(limit {du.text(b.deflection_total_limit, 'deflection', 1)})."
        )
    lines.append(fix_words(b, du))
    return " ".join(lines)


def change_title(c: BeamChange) -> str:
    name = c.name or c.guid
    where = f" ({c.storey})" if c.storey else ""
    parts = []
    if c.lost_brace_points:
        n = len(c.lost_brace_points)
        parts.append(f"lost {n} brace point{'s' if n != 1 else ''}")
    if c.lost_supports:
        parts.append("lost a support")
    if c.lost_continuous_bracing > 0:
        parts.append("lost slab bracing")
    if c.utilisation_before is not None and c.utilisation_after is not None:
        before, after = c.utilisation_before, c.utilisation_after
        parts.append(f"utilisation {utilisation_text(before)} → {utilisation_text(after)}")
    if c.outcome_before and c.outcome_after and c.outcome_before != c.outcome_after:
        parts.append(f"{c.outcome_before.replace('_', ' ')} → {c.outcome_after.replace('_', ' ')}")
    return f"{name}{where}: " + (", ".join(parts) if parts else c.change)


def cause_words(cause: ChangeCause, du: DisplayUnits, names: Mapping[str, str]) -> str:
    """One cause of a change in words, quantities in the display units."""

    def length(v: float | str | None) -> str:
        return du.text(float(v), "length") if isinstance(v, int | float) else "–"

    def ratio(v: float | str | None) -> str:
        return utilisation_text(float(v)) if isinstance(v, int | float) else "–"

    def status(v: float | str | None) -> str:
        return OUTCOME_STATE_WORDS.get(str(v), str(v))

    who = ", ".join(names.get(g, g) for g in cause.members)
    at = ", ".join(du.text(s, "length") for s in cause.stations)
    n = len(cause.stations)
    k = cause.kind
    if k is CauseKind.LOST_BRACES:
        return f"lost brace point{'s' if n != 1 else ''} at {at}"
    if k is CauseKind.ADDED_BRACES:
        return f"brace point{'s' if n != 1 else ''} added at {at}"
    if k is CauseKind.LOST_SUPPORTS:
        return f"lost support on {who}"
    if k is CauseKind.GAINED_SUPPORTS:
        return f"gained support on {who}"
    if k is CauseKind.LOST_SLAB_BRACING:
        return f"slab-braced length fell by {length(cause.after)}"
    if k is CauseKind.LB_GREW:
        return f"governing Lb grew from {length(cause.before)} to {length(cause.after)}"
    if k in (CauseKind.OUTCOME_WORSE, CauseKind.OUTCOME_BETTER):
        return f"went from {status(cause.before)} to {status(cause.after)}"
    if k is CauseKind.UTILISATION_ROSE:
        return f"utilisation rose from {ratio(cause.before)} to {ratio(cause.after)}"
    if k is CauseKind.UTILISATION_FELL:
        return f"utilisation fell from {ratio(cause.before)} to {ratio(cause.after)}"
    if k is CauseKind.DEMAND_FELL_LOST_LOAD:
        return f"demand fell because {who} no longer delivers its load here"
    raise ValueError(f"no words for change cause {k!r}")


def change_reasons(c: BeamChange, du: DisplayUnits, names: Mapping[str, str]) -> list[str]:
    """Every cause of a change in words."""
    return [cause_words(x, du, names) for x in c.causes]


def diff_names(diff: DiffResult) -> dict[str, str]:
    """GUID → name of every beam in either revision (for words about changes)."""
    return {b.guid: b.name or b.guid for b in [*diff.old.beams, *diff.new.beams]}


def sentence(text: str) -> str:
    text = text.strip()
    return (text[0].upper() + text[1:] + ("" if text.endswith(".") else ".")) if text else ""


def change_description(
    c: BeamChange, du: DisplayUnits, names: Mapping[str, str] | None = None
) -> str:
    names = names or {}
    lines = [f"Between the two revisions this beam {_change_words(c.change)}."]
    if c.lost_brace_points:
        at = ", ".join(du.text(s, "length") for s in c.lost_brace_points)
        lines.append(f"Brace points lost at station {at}.")
    if c.added_brace_points:
        at = ", ".join(du.text(s, "length") for s in c.added_brace_points)
        lines.append(f"Brace points added at station {at}.")
    if c.lost_supports:
        lines.append(f"Supports lost: {', '.join(c.lost_supports)}.")
    if c.gained_supports:
        lines.append(f"Supports gained: {', '.join(c.gained_supports)}.")
    if c.lost_continuous_bracing > 0:
        lines.append(f"Slab-braced length lost: {du.text(c.lost_continuous_bracing, 'length')}.")
    if c.lb_before is not None or c.lb_after is not None:
        lines.append(
            f"Governing Lb {du.text(c.lb_before, 'length')} → {du.text(c.lb_after, 'length')}."
        )
    if c.utilisation_before is not None or c.utilisation_after is not None:
        rb, ra = utilisation_text(c.utilisation_before), utilisation_text(c.utilisation_after)
        lines.append(f"Utilisation {rb} → {ra}.")
    if c.outcome_before or c.outcome_after:
        lines.append(f"Outcome {c.outcome_before or '–'} → {c.outcome_after or '–'}.")
    lines.extend(sentence(cause_words(x, du, names)) for x in c.causes)
    if c.lost_brace_points and c.change == "weakened":
        lines.append(
            "Restore the lost brace, or check that the longer unbraced length is intended."
        )
    return " ".join(lines)


def _change_words(change: str) -> str:
    return {"weakened": "was weakened", "strengthened": "was strengthened"}.get(change, "changed")
