"""Plain-language descriptions of a beam's result, shared by the BCF and HTML writers."""

from __future__ import annotations

import re
from collections.abc import Mapping

from ifccheck.reasons import NotChecked, Reason
from ifccheck.report.display import DisplayUnits, utilisation_text
from ifccheck.results import (
    BeamChange,
    BeamResult,
    BeamStageResult,
    BraceCheckOut,
    CauseKind,
    ChangeCause,
    DiffResult,
    ExplainCause,
    ExplainKind,
    SegmentResult,
)
from ifccheck.units import to_si

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


_GUID = re.compile(r"[0-9A-Za-z_$]{22}")


def member_ref(guid: str, names: Mapping[str, str]) -> str:
    """'L2-S1 (2Xq…22 characters)': a member by name and GUID; the GUID alone when unnamed."""
    name = names.get(guid, "")
    return f"{name} ({guid})" if name and name != guid else guid


def name_guids(text: str, names: Mapping[str, str], with_guid: bool = True) -> str:
    """The text with every known GUID in it given as its member's name (and GUID)."""

    def swap(m: re.Match[str]) -> str:
        guid = m.group(0)
        if guid not in names or not names[guid]:
            return guid
        return member_ref(guid, names) if with_guid else names[guid]

    return _GUID.sub(swap, text)


def end_words(b: BeamResult, end: str) -> str:
    """'the end at L2-G30-0' or 'the free end'."""
    member = b.end_members[0 if end == "start" else 1]
    return f"the end at {member}" if member else f"the free {end}"


def station_text(b: BeamResult, station: float, du: DisplayUnits) -> str:
    """'4.50 ft from the end at L2-G30-0': a station from the beam's nearer end."""
    if station < 0.0:  # a point of the old revision, beyond this revision's beam
        return f"{du.text(-station, 'length')} beyond {end_words(b, 'start')}"
    if station > b.length:
        return f"{du.text(station - b.length, 'length')} beyond {end_words(b, 'end')}"
    at_start = station <= b.length / 2
    distance = station if at_start else b.length - station
    return f"{du.text(distance, 'length')} from {end_words(b, 'start' if at_start else 'end')}"


def span_text(b: BeamResult, a: float, e: float, du: DisplayUnits) -> str:
    """'from 6.00 ft to 21.00 ft from the end at L2-G30-0': both from the same named end."""
    if (a + e) / 2 <= b.length / 2:
        lo, hi, end = a, e, "start"
    else:
        lo, hi, end = b.length - e, b.length - a, "end"
    return f"from {du.text(lo, 'length')} to {du.text(hi, 'length')} from {end_words(b, end)}"


def lb_text(seg: SegmentResult, du: DisplayUnits) -> str:
    """'continuous (slab)' for a slab-braced length, else the unbraced length."""
    return "continuous (slab)" if seg.continuous else du.text(seg.lb, "length")


def segment_words(b: BeamResult, seg: SegmentResult, du: DisplayUnits) -> str:
    """Where the governing segment is and what governs it, in a sentence; segments are
    counted among those of the segment's stage."""
    own = b.stage_segments(seg.stage) or b.segments
    index = next((i for i, s in enumerate(own) if s is seg), -1) + 1
    where = f"segment {index} of {len(own)}, {span_text(b, seg.start, seg.end, du)}"
    if seg.continuous:
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


def _mass_text(kg_per_m: float, du: DisplayUnits) -> str:
    if du.system == "imperial":
        return f"{kg_per_m / to_si(1.0, 'lb/ft'):.0f} lb/ft"
    return f"{kg_per_m:.1f} kg/m"


def _family_and_depth(profile: str) -> str:
    m = re.match(r"^([A-Z]+\d+(?:\.\d+)?)X", profile)
    return m.group(1) if m else "shape of this family and depth"


def cause_sentence(
    b: BeamResult, cause: ExplainCause, du: DisplayUnits, names: Mapping[str, str]
) -> str:
    """One cause of a failure (or of a beam not being checked) in words."""
    k = cause.kind
    who = ", ".join(member_ref(g, names) for g in cause.members)
    if k is ExplainKind.NOT_CHECKED:
        reason = b.reason.text if b.reason else "no reason was recorded"
        return sentence(f"not checked: {name_guids(reason, names)}")
    if k is ExplainKind.OPENING:
        a, e = cause.stations
        return (
            f"An opening in slab {who} runs over the beam {span_text(b, a, e, du)}: the slab "
            "does not brace the top flange there, so it is free to buckle sideways."
        )
    if k is ExplainKind.SLAB_GAP:
        a, e = cause.stations
        return (
            f"The slab does not bear on the top flange {span_text(b, a, e, du)}, so nothing "
            "braces it there."
        )
    if k is ExplainKind.BRACE_NOT_COUNTING:
        at = station_text(b, cause.stations[0], du) if cause.stations else "mid-length"
        point = next(
            (p for p in b.brace_points if p.by in cause.members and p.reason is not None), None
        )
        why = point.reason.text if point is not None and point.reason is not None else ""
        why = f": {name_guids(why, names, with_guid=False)}" if why else ""
        if point is not None and point.adequacy is not None and not point.adequacy.adequate:
            why += f" ({adequacy_words(point.adequacy, du)})"  # the figures behind it
        return f"The brace point at {at} ({who}) does not count{why}."
    if k is ExplainKind.ASSUMED_GRADE:
        return (
            f"The steel grade is assumed ({cause.value}, the settings' default): the model "
            "names none. Confirm the grade."
        )
    if k is ExplainKind.SHEAR_CONTROLS:
        return (
            f"Shear fails (utilisation {utilisation_text(b.shear_utilisation)}): bracing "
            "does not help; a section with more web area does."
        )
    if k is ExplainKind.DEFLECTION_CONTROLS:
        return (
            f"Deflection fails (utilisation {utilisation_text(b.deflection_utilisation)}): "
            "bracing does not help; a stiffer section or a shorter span does."
        )
    if k is ExplainKind.BEYOND_PLASTIC:
        return (
            "Even braced throughout, the moment exceeds the section's strength: no "
            "bracing alone makes it pass."
        )
    if k is ExplainKind.DECK_NOT_ATTACHED:
        if deck_braces_during_construction(b):
            return (
                "During construction the steel alone carries the wet concrete and the "
                "construction live load, before the slab has hardened."
            )
        return (
            "During construction the deck is not attached to the beam "
            "(construction.deck_braces = false), so nothing braces its top flange while "
            "the concrete is wet."
        )
    raise ValueError(f"no words for cause {k!r}")


def deck_braces_during_construction(b: BeamResult) -> bool:
    """Whether an attached deck braces the beam during construction (a continuously
    braced length among its construction-stage segments)."""
    return any(s.continuous for s in b.stage_segments("construction"))


def construction_options(b: BeamResult) -> str:
    """The usual remedies for a beam that fails while the concrete is wet, as the
    engineer's options ('' where the beam does not fail during construction)."""
    st = b.stage_result("construction")
    if st is None or st.outcome != "fail":
        return ""
    options = ["shoring the beam until the concrete has gained its strength"]
    if not deck_braces_during_construction(b):
        options.append(
            "having the deck fastened to the beam before the pour so that it braces the top "
            "flange (checked with construction.deck_braces = true)"
        )
    options.append("temporary bracing of the compression flange during the pour")
    options.append("a heavier section")
    return (
        "The usual remedies during construction, for the engineer to choose from: "
        + ", ".join(options[:-1])
        + f", or {options[-1]}."
    )


def fix_sentences(b: BeamResult, du: DisplayUnits) -> list[str]:
    """What would make a failing beam pass: largest Lb, new brace points, a heavier shape
    (and, for a failure explained in the construction stage, the usual remedies then)."""
    e = b.explanation
    if e is None or b.outcome != "fail":
        return []
    out: list[str] = []
    seg = b.segments[e.segment] if e.segment is not None else None
    if seg is not None and e.largest_passing_lb is not None and not seg.continuous:
        out.append(
            f"It would pass with an unbraced length of up to "
            f"{du.text(e.largest_passing_lb, 'length')} there (today {lb_text(seg, du)}, "
            f"at the same Cb = {seg.cb:.2f} and moment)."
        )
    if e.braces:
        at = ", ".join(station_text(b, x.station, du) for x in e.braces)
        n = len(e.braces)
        flange = e.brace_flange or "compression"
        out.append(
            f"{'A brace' if n == 1 else f'{n} braces'} to the {flange} flange at {at} "
            f"would make it pass in bending (each new length checked at its own Cb)."
        )
    elif (
        seg is not None
        and not e.bracing_helps
        and not any(c.kind is ExplainKind.BEYOND_PLASTIC for c in e.causes)  # said there
    ):
        out.append("No bracing alone makes it pass.")
    if e.lighter_shape is not None:
        x = e.lighter_shape
        out.append(
            f"The lightest {_family_and_depth(b.profile)} that passes as braced today is "
            f"{x.profile} ({_mass_text(x.mass_per_length, du)}, utilisation "
            f"{utilisation_text(x.utilisation)})."
        )
    elif e.shape_checked:
        out.append(f"No {_family_and_depth(b.profile)} in the shape table passes as braced today.")
    if e.stage == "construction" and (options := construction_options(b)):
        out.append(options)
    return out


def explanation_sentences(b: BeamResult, du: DisplayUnits, names: Mapping[str, str]) -> list[str]:
    """Why the beam fails or was not checked, and what would fix it, sentence by sentence."""
    e = b.explanation
    if e is None:
        return []
    out = [cause_sentence(b, c, du, names) for c in e.causes]
    if b.outcome == "not_checked" and b.reason is not None:
        out.append(advice(b.reason))
    return out + fix_sentences(b, du)


def fix_words(b: BeamResult, du: DisplayUnits) -> str:
    """What would make a failing beam pass, in one paragraph."""
    fixes = fix_sentences(b, du)
    if fixes:
        return " ".join(fixes)
    e = b.explanation
    st = b.stage_result(e.stage) if e is not None else None
    limit = st.controlling_limit if st is not None else b.controlling_limit
    if limit == "shear":
        return "Shear governs: use a section with a deeper or thicker web."
    if limit == "deflection":
        return "Deflection governs: use a stiffer (deeper) section or shorten the span."
    return "Use a heavier section or reduce the load."


def advice(reason: Reason | None) -> str:
    """What to do about a reason, as a sentence ('' for none)."""
    if reason is None:
        return ""
    text = ADVICE[reason.code]
    return text[0].upper() + text[1:] + "."


STAGE_WORDS = {"in_service": "in service", "construction": "during construction"}


def _stage_failure(b: BeamResult, st: BeamStageResult) -> str:
    """'elastic lateral-torsional buckling, utilisation 2.03': what fails in one stage."""
    what = CHECK_WORDS.get(st.controlling_limit, st.controlling_limit or "check")
    i = st.governing_segment
    if st.controlling_limit == "flexure" and i is not None and 0 <= i < len(b.segments):
        what = limit_state_words(b.segments[i].limit_state)
    u = f", utilisation {utilisation_text(st.utilisation)}" if st.utilisation is not None else ""
    return f"{what}{u}"


def failing_stages(b: BeamResult) -> list[BeamStageResult]:
    """The stages a beam fails in, in service first."""
    return [s for s in b.stages if s.outcome == "fail"]


def beam_issue_title(b: BeamResult) -> str:
    if b.outcome == "not_checked":
        return f"{beam_label(b)}: not checked"
    fails = failing_stages(b)
    if b.outcome == "fail" and len(b.stages) > 1 and fails:
        if len(fails) == 1 and fails[0].stage == "construction":
            return (
                f"{beam_label(b)} fails during construction (wet concrete) in "
                f"{_stage_failure(b, fails[0])}; passes in service"
            )
        if len(fails) > 1:
            return f"{beam_label(b)} fails " + ", and ".join(
                f"{STAGE_WORDS[s.stage]} in {_stage_failure(b, s)}" for s in fails
            )
    u = f" utilisation {utilisation_text(b.utilisation)}" if b.utilisation is not None else ""
    what = CHECK_WORDS.get(b.controlling_limit, b.controlling_limit or "check")
    seg = b.governing
    if b.controlling_limit == "flexure" and seg is not None:
        what = limit_state_words(seg.limit_state)
    return f"{beam_label(b)} fails in {what},{u}"


def beam_issue_description(
    b: BeamResult, du: DisplayUnits, names: Mapping[str, str] | None = None
) -> str:
    """Why the beam is an issue and what would fix it, in plain sentences."""
    names = names or {}
    if b.outcome == "not_checked":
        reason = name_guids(b.reason.text, names) if b.reason else "no reason was recorded"
        return f"This beam was not checked: {reason}. {advice(b.reason)}".rstrip()
    if b.outcome == "fail" and len(b.stages) > 1 and failing_stages(b):
        return _staged_description(b, du, names)
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
    e = b.explanation
    if e is not None:
        lines += [cause_sentence(b, c, du, names) for c in e.causes]
    lines.append(fix_words(b, du))
    return " ".join(lines)


def _stage_detail(b: BeamResult, st: BeamStageResult, du: DisplayUnits) -> str:
    """What fails in one stage, with the figures: the segment, the shear or the deflection."""
    i = st.governing_segment
    seg = b.segments[i] if i is not None and 0 <= i < len(b.segments) else None
    if st.controlling_limit == "flexure" and seg is not None:
        return segment_words(b, seg, du)
    if st.controlling_limit == "shear" and st.shear_demand is not None:
        return (
            f"Shear {du.text(st.shear_demand, 'force', 1)} against a strength of "
            f"{du.text(st.shear_capacity, 'force', 1)}."
        )
    if st.controlling_limit == "deflection":
        return (
            f"Live-load deflection {du.text(b.deflection_live, 'deflection', 1)} "
            f"(limit {du.text(b.deflection_live_limit, 'deflection', 1)}), total "
            f"{du.text(b.deflection_total, 'deflection', 1)} "
            f"(limit {du.text(b.deflection_total_limit, 'deflection', 1)})."
        )
    return ""


def _staged_description(b: BeamResult, du: DisplayUnits, names: Mapping[str, str]) -> str:
    """A failing beam checked in service and during construction: each failing stage
    with its figures, the causes and fixes of the stage explained, the remedies of the
    construction stage."""
    fails = failing_stages(b)
    service = b.stage_result("in_service")
    lines: list[str] = []
    if [s.stage for s in fails] == ["construction"]:
        passes = (
            f" and it passes in service (utilisation {utilisation_text(service.utilisation)})"
            if service is not None
            else ""
        )
        lines.append(
            "This beam fails during construction, while the steel and the deck alone carry "
            f"the wet concrete and the construction live load,{passes}."
        )
    else:
        said = " and ".join(
            f"{STAGE_WORDS[s.stage]} in "
            f"{CHECK_WORDS.get(s.controlling_limit, s.controlling_limit or 'the check')} "
            f"(utilisation {utilisation_text(s.utilisation)})"
            for s in fails
        )
        lines.append(f"This beam fails {said}.")
    for st in fails:
        detail = _stage_detail(b, st, du)
        if detail:
            lines.append(f"{STAGE_WORDS[st.stage].capitalize()}: {detail[0].lower()}{detail[1:]}")
    e = b.explanation
    if e is not None:
        lines += [cause_sentence(b, c, du, names) for c in e.causes]
    lines.append(fix_words(b, du))
    if (e is None or e.stage != "construction") and (options := construction_options(b)):
        lines.append(options)
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


def cause_words(
    cause: ChangeCause,
    du: DisplayUnits,
    names: Mapping[str, str],
    beam: BeamResult | None = None,
    staged: bool = False,
) -> str:
    """One cause of a change in words, quantities in the display units.

    With the new revision's ``beam``, stations are given from its named ends; with
    ``staged`` (the change has causes of the construction stage), a Lb or utilisation
    cause names its stage ("its utilisation during construction rose ...").
    """

    def length(v: float | str | None) -> str:
        return du.text(float(v), "length") if isinstance(v, int | float) else "–"

    def ratio(v: float | str | None) -> str:
        return utilisation_text(float(v)) if isinstance(v, int | float) else "–"

    def status(v: float | str | None) -> str:
        return OUTCOME_STATE_WORDS.get(str(v), str(v))

    def where(s: float) -> str:
        return station_text(beam, s, du) if beam is not None else du.text(s, "length")

    who = ", ".join(names.get(g, g) for g in cause.members)
    at = " and ".join(where(s) for s in cause.stations)
    n = len(cause.stations)
    k = cause.kind
    if k is CauseKind.LOST_BRACES:
        return f"lost the brace point{'s' if n != 1 else ''} at {at}"
    if k is CauseKind.ADDED_BRACES:
        return f"gained brace point{'s' if n != 1 else ''} at {at}"
    if k is CauseKind.LOST_SUPPORTS:
        return f"no longer bears on {who}"
    if k is CauseKind.GAINED_SUPPORTS:
        return f"now also bears on {who}"
    if k is CauseKind.LOST_SLAB_BRACING:
        return f"lost {length(cause.after)} of slab bracing"
    # the stage a Lb or utilisation cause is of, where the change has causes of both
    when = f" {STAGE_WORDS[cause.stage]}" if staged and cause.stage in STAGE_WORDS else ""
    if k is CauseKind.LB_GREW:
        if cause.before == 0.0:  # the governing length was braced throughout by the slab
            return (
                f"its governing length{when}, braced continuously by the slab before, now "
                f"has Lb = {length(cause.after)}"
            )
        return f"its governing Lb{when} grew from {length(cause.before)} to {length(cause.after)}"
    if k in (CauseKind.OUTCOME_WORSE, CauseKind.OUTCOME_BETTER):
        return f"went from {status(cause.before)} to {status(cause.after)}"
    if k is CauseKind.UTILISATION_ROSE:
        return f"its utilisation{when} rose from {ratio(cause.before)} to {ratio(cause.after)}"
    if k is CauseKind.UTILISATION_FELL:
        return f"its utilisation{when} fell from {ratio(cause.before)} to {ratio(cause.after)}"
    if k is CauseKind.DEMAND_FELL_LOST_LOAD:
        return (
            f"its demand fell only because {who} no longer reaches it (that beam has lost "
            "a support and is not checked), so this is not an improvement"
        )
    if k is CauseKind.TRIBUTARY_GREW:
        because = f" because {who} was removed" if who else ""
        return (
            f"its tributary width grew from {length(cause.before)} to {length(cause.after)}"
            f"{because}"
        )
    raise ValueError(f"no words for change cause {k!r}")


# causes said together with another (so that each thing is said once)
_FOLDED = {
    CauseKind.LB_GREW: (CauseKind.LOST_BRACES, CauseKind.LOST_SLAB_BRACING),
    CauseKind.OUTCOME_WORSE: (CauseKind.UTILISATION_ROSE,),
    CauseKind.OUTCOME_BETTER: (CauseKind.UTILISATION_FELL,),
}


def change_reasons(
    c: BeamChange,
    du: DisplayUnits,
    names: Mapping[str, str],
    beam: BeamResult | None = None,
) -> list[str]:
    """Every cause of a change in words, each said once.

    A longer Lb is said with the lost brace or slab bracing that made it, and
    an outcome change with the utilisation change behind it.
    """
    kinds = {x.kind for x in c.causes}
    # name the stage of Lb and utilisation causes where the beam has more than one
    staged = any(x.stage == "construction" for x in c.causes) or (
        beam is not None and len(beam.stages) > 1
    )
    hosts = _fold_hosts(c.causes, kinds)
    out = []
    for i, x in enumerate(c.causes):
        if any(k in kinds for k in _FOLDED.get(x.kind, ())):
            continue
        text = cause_words(x, du, names, beam, staged)
        extras = [y for j, y in enumerate(c.causes) if hosts.get(j) == i]
        if extras:
            joint = ", so " if extras[0].kind is CauseKind.LB_GREW else " and it "
            text += joint + " and ".join(cause_words(y, du, names, beam, staged) for y in extras)
        out.append(text)
    return out


def _fold_hosts(causes: list[ChangeCause], kinds: set[CauseKind]) -> dict[int, int]:
    """Index of each folded cause → index of the cause it is said with: every longer Lb
    with the first lost bracing; an outcome change with the utilisation change that
    crossed 1.0 (else the first of them)."""
    hosts: dict[int, int] = {}
    for j, y in enumerate(causes):
        into = _FOLDED.get(y.kind, ())
        candidates = [i for i, x in enumerate(causes) if x.kind in into]
        if not candidates or not any(k in kinds for k in into):
            continue

        def crosses(i: int) -> bool:
            a, b = causes[i].before, causes[i].after
            if not isinstance(a, int | float) or not isinstance(b, int | float):
                return False
            return min(a, b) <= 1.0 < max(a, b)

        hosts[j] = next((i for i in candidates if crosses(i)), candidates[0])
    return hosts


def diff_names(diff: DiffResult) -> dict[str, str]:
    """GUID → name of every named element and beam in either revision."""
    out = {**diff.old.names, **diff.new.names}
    out.update({b.guid: b.name or b.guid for b in [*diff.old.beams, *diff.new.beams]})
    return out


def sentence(text: str) -> str:
    text = text.strip()
    return (text[0].upper() + text[1:] + ("" if text.endswith(".") else ".")) if text else ""


def change_description(
    c: BeamChange,
    du: DisplayUnits,
    names: Mapping[str, str] | None = None,
    beam: BeamResult | None = None,
) -> str:
    """What changed about a beam between two revisions, each thing said once."""
    names = names or {}
    lines = [f"Between the two revisions this beam {_change_words(c.change)}."]
    lines += [sentence(x) for x in change_reasons(c, du, names, beam)]
    if c.outcome_before or c.outcome_after:
        lines.append(
            f"Before: {OUTCOME_STATE_WORDS.get(c.outcome_before, c.outcome_before or '–')}"
            f" at utilisation {utilisation_text(c.utilisation_before)}; now: "
            f"{OUTCOME_STATE_WORDS.get(c.outcome_after, c.outcome_after or '–')} at "
            f"utilisation {utilisation_text(c.utilisation_after)}."
        )
    if c.lost_brace_points and c.change == "weakened":
        lines.append(
            "Restore the lost brace, or check that the longer unbraced length is intended."
        )
    return " ".join(lines)


def _change_words(change: str) -> str:
    return {"weakened": "was weakened", "strengthened": "was strengthened"}.get(change, "changed")


def adequacy_words(a: BraceCheckOut | None, du: DisplayUnits) -> str:
    """'strength 3.94 kip needed, 3.65 kip provided; stiffness 14.6 kip/in needed, 226.7
    kip/in provided: not adequate' — '' where the brace was not checked."""
    if a is None:
        return ""
    if a.kind == "torsional":
        strength = (du.text(a.required_strength, "moment", 1),
                    du.text(a.provided_strength, "moment", 1))  # fmt: skip
        stiffness = (f"{du.text(a.required_stiffness, 'moment', 0)}/rad",
                     f"{du.text(a.provided_stiffness, 'moment', 0)}/rad")  # fmt: skip
    else:
        strength = (du.text(a.required_strength, "force", 2),
                    du.text(a.provided_strength, "force", 2))  # fmt: skip
        stiffness = (du.text(a.required_stiffness, "stiffness", 1),
                     du.text(a.provided_stiffness, "stiffness", 1))  # fmt: skip
    verdict = "adequate" if a.adequate else "not adequate"
    return (
        f"strength {strength[0]} needed, {strength[1]} provided; stiffness {stiffness[0]} "
        f"needed, {stiffness[1]} provided: {verdict}"
    )
