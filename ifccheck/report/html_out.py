"""The readable reports: ``<stem>.report.html`` and ``diff.html``.

One self-contained page each: inline CSS and SVG, no scripts, no fonts or
images from elsewhere, so it opens offline and can be mailed or archived as
is. Per-beam detail sections are capped (every failing beam up to a limit,
plus the most highly utilised others) and the page says how many are shown.
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Iterable, Sequence
from html import escape
from pathlib import Path

from ifccheck import CAUTION
from ifccheck.atomic import write_text
from ifccheck.perf import gc_paused
from ifccheck.reasons import reason_text
from ifccheck.report.colours import (
    CHANGE_COLOURS,
    NOT_CHECKED,
    text_colour_on,
    utilisation_colour,
)
from ifccheck.report.display import DisplayUnits, check_system, utilisation_text
from ifccheck.report.json_out import diff_summary
from ifccheck.report.requirements import model_information_section
from ifccheck.report.svg import (
    attr,
    check_legend_svg,
    check_plan_svg,
    diff_legend_svg,
    diff_plan_svg,
    moment_diagram_svg,
    strength_curve_svg,
)
from ifccheck.report.wording import (
    advice,
    change_reasons,
    diff_names,
    fix_words,
    limit_state_words,
)
from ifccheck.results import BeamResult, CheckResult, DiffResult, SlabOutline

DETAIL_OTHERS = 200  # most highly utilised non-failing beams given a detail section
DETAIL_FAILS = 500  # failing beams given a detail section, at most (worst first)
NO_STOREY = "(no storey)"

CSS = """
body{font-family:system-ui,-apple-system,"Segoe UI",Roboto,sans-serif;margin:0;color:#1d1d1d;
background:#fafafa;line-height:1.4}
header,main{max-width:1000px;margin:0 auto;padding:0 16px}
header{padding-top:18px}
h1{font-size:1.6em;margin:.2em 0}
h2{border-bottom:2px solid #ddd;padding-bottom:4px;margin-top:2em}
h3{margin-top:1.6em}
table{border-collapse:collapse;margin:.6em 0;font-size:.92em;background:#fff}
th,td{border:1px solid #d5d5d5;padding:3px 7px;text-align:left;vertical-align:top}
th{background:#f0f0f0}
td.num{text-align:right;font-variant-numeric:tabular-nums}
.caution{border-left:5px solid #444;background:#fff;padding:8px 12px;margin:1em 0}
.outcome{display:inline-block;padding:0 6px;border-radius:3px;font-size:.9em}
.outcome-fail{background:#1a1a1a;color:#fff}
.outcome-pass{background:#e6e6e6}
.outcome-not_checked{border:1px dashed #777}
figure{margin:1em 0;background:#fff;border:1px solid #ddd;padding:8px;overflow-x:auto}
figcaption{font-size:.9em;color:#444;margin-top:4px}
svg{display:block;max-width:100%;height:auto}
svg text{font-family:inherit}
article.beam{background:#fff;border:1px solid #ddd;padding:6px 14px;margin:1.2em 0}
.fix{background:#f4f4f4;padding:6px 10px}
tr.governing td{font-weight:600}
.note{color:#555;font-size:.92em}
.swatch{display:inline-block;width:.9em;height:.9em;margin-right:.35em;vertical-align:-.1em;
border:1px solid #0003}
td.utilisation{white-space:nowrap}
"""


def _page(title: str, heading: str, subtitle: str, sections: Iterable[str]) -> str:
    return (
        "<!DOCTYPE html>\n"
        '<html lang="en"><head><meta charset="utf-8">'
        '<meta name="viewport" content="width=device-width, initial-scale=1">'
        f"<title>{escape(title)}</title><style>{CSS}</style></head><body>"
        f"<header><h1>{escape(heading)}</h1><p>{escape(subtitle)}</p></header><main>"
        + "".join(sections)
        + "</main></body></html>\n"
    )


def _table(
    head: Sequence[str], rows: Iterable[Sequence[str]], cls: str = "", marked: int | None = None
) -> str:
    """Rows are pre-escaped HTML cells; a cell starting with '<td' is used as is.

    Row ``marked`` (an index) gets the class "governing".
    """
    out = [f'<table class="{cls}"><thead><tr>']
    out += [f"<th>{escape(h)}</th>" for h in head]
    out.append("</tr></thead><tbody>")
    for i, row in enumerate(rows):
        out.append('<tr class="governing">' if i == marked else "<tr>")
        out.append("".join(c if c.startswith("<td") else f"<td>{c}</td>" for c in row))
        out.append("</tr>")
    out.append("</tbody></table>")
    return "".join(out)


def _num(v: float | None, digits: int = 2) -> str:
    return '<td class="num">' + ("–" if v is None else f"{v:.{digits}f}") + "</td>"


def _qty(du: DisplayUnits, v: float | None, kind: str, digits: int = 2) -> str:
    return f'<td class="num">{du.number(v, kind, digits)}</td>'


def _outcome(outcome: str) -> str:
    text = escape(outcome.replace("_", " "))
    return f'<span class="outcome outcome-{attr(outcome)}">{text}</span>'


def _utilisation_cell(u: float | None) -> str:
    if u is None:
        return '<td class="num">–</td>'
    return (
        f'<td class="num utilisation"><span class="swatch" '
        f'style="background:{utilisation_colour(u)}"></span>{utilisation_text(u)}</td>'
    )


def _by_storey(items: Iterable, storey_of) -> dict[str, list]:
    groups: dict[str, list] = defaultdict(list)
    for it in items:
        groups[storey_of(it) or NO_STOREY].append(it)
    return groups


def _storey_order(storeys: Sequence[tuple[str, float]], present: Iterable[str]) -> list[str]:
    """Storeys top down (highest first, the way a drawing set runs), then any unlisted."""
    listed = [n for n, _ in sorted(storeys, key=lambda s: -s[1])]
    present = set(present)
    return [n for n in listed if n in present] + sorted(present - set(listed))


def _strength_label(method: str) -> str:
    return "φMn" if method.upper() == "LRFD" else "Mn/Ω"


def _most_utilised(b: BeamResult) -> float:
    return -(b.utilisation or 0.0)


def detail_beams(result: CheckResult) -> tuple[list[BeamResult], str]:
    """The beams given a detail section, and a sentence saying which they are."""
    checked = [b for b in result.beams if b.outcome != "not_checked"]
    fails = sorted((b for b in checked if b.outcome == "fail"), key=_most_utilised)
    others = sorted((b for b in checked if b.outcome != "fail"), key=_most_utilised)
    shown_fails = fails[:DETAIL_FAILS]
    shown_others = others[:DETAIL_OTHERS]
    if len(shown_fails) == len(fails) and len(shown_others) == len(others):
        note = f"Details of all {len(checked)} checked beams, most highly utilised first."
    else:
        note = (
            f"Details of {len(shown_fails)} of {len(fails)} failing beams and the "
            f"{len(shown_others)} most highly utilised of the other {len(others)} checked beams; "
            "the table above and the CSV and JSON results list every beam."
        )
    return shown_fails + shown_others, note


# --- check report ---------------------------------------------------------------
def _summary_section(result: CheckResult) -> str:
    s = result.summary()
    m = result.model
    facts = [
        ("Model", escape(m.file)),
        ("IFC schema", escape(m.schema)),
        ("Model SHA-256", f"<code>{escape(m.sha256)}</code>"),
        ("Standard", escape(result.standard)),
        ("Method", escape(result.method)),
        ("Checked at", escape(result.checked_at)),
        ("Tool", escape(f"{result.tool} {result.version}")),
    ]
    counts = _table(
        ["Outcome", "Beams"],
        [
            [_outcome("pass"), _num(s["pass"], 0)],
            [_outcome("fail"), _num(s["fail"], 0)],
            [_outcome("not_checked"), _num(s["not_checked"], 0)],
            ["total", _num(s["total"], 0)],
        ],
        "counts",
    )
    out = ['<section id="summary"><h2>Summary</h2>']
    out.append(
        f'<div class="caution"><strong>Caution.</strong> {escape(result.caution or CAUTION)}</div>'
    )
    out.append(counts)
    out.append(_table(["", ""], [[f"<strong>{k}</strong>", v] for k, v in facts], "facts"))
    if result.warnings:
        shown = result.warnings[:50]
        out.append("<h3>Warnings</h3><ul>")
        out += [f"<li>{escape(msg)} <code>{escape(g)}</code></li>" for g, msg in shown]
        out.append("</ul>")
        if len(result.warnings) > len(shown):
            out.append(f'<p class="note">and {len(result.warnings) - len(shown)} more '
                       "(all are in the JSON results).</p>")  # fmt: skip
    out.append("</section>")
    return "".join(out)


def _plans_section(
    storeys: Sequence[tuple[str, float]], beams_by: dict[str, list[BeamResult]],
    slabs_by: dict[str, list[SlabOutline]], draw, legend: str, intro: str,
) -> str:  # fmt: skip
    out = [f'<section id="plans"><h2>Storey plans</h2><p>{intro}</p>', legend]
    for name in _storey_order(storeys, beams_by):
        beams = beams_by[name]
        out.append(
            f'<figure class="storey" data-storey="{attr(name)}">'
            + draw(name, beams, slabs_by.get(name, []))
            + f"<figcaption>{escape(name)}: {len(beams)} beams. Plan view, model x to the "
            "right, y up the page.</figcaption></figure>"
        )
    out.append("</section>")
    return "".join(out)


def _beam_table(result: CheckResult, du: DisplayUnits, linked: set[str]) -> str:
    order = {"fail": 0, "pass": 1, "not_checked": 2}
    beams = sorted(result.beams, key=lambda b: (order[b.outcome], -(b.utilisation or 0.0), b.name))
    strength = _strength_label(result.method)
    rows = []
    for b in beams:
        seg = b.governing
        name = escape(b.name or b.guid)
        if b.guid in linked:
            name = f'<a href="#beam-{attr(b.guid)}">{name}</a>'
        rows.append([
            name, escape(b.storey), escape(b.profile), _outcome(b.outcome),
            _utilisation_cell(b.utilisation), escape(b.controlling_limit),
            _qty(du, seg.lb if seg else None, "length"), _num(seg.cb if seg else None),
            escape(limit_state_words(seg.limit_state)) if seg else "",
            _qty(du, seg.moment_demand if seg else None, "moment", 1),
            _qty(du, seg.moment_capacity if seg else None, "moment", 1),
        ])  # fmt: skip
    head = [
        "Beam", "Storey", "Profile", "Outcome", "Utilisation", "Controlling limit",
        f"Lb ({du.label('length')})", "Cb", "Limit state",
        f"Moment ({du.label('moment')})", f"{strength} ({du.label('moment')})",
    ]  # fmt: skip
    return (
        '<section id="beams"><h2>Beams</h2><p>Every beam, failing first, then by utilisation. '
        "Lb, Cb and moments are those of the governing unbraced segment.</p>"
        + _table(head, rows, "beams")
        + "</section>"
    )


def _not_checked_section(result: CheckResult) -> str:
    beams = [b for b in result.beams if b.outcome == "not_checked"]
    if not beams:
        return ""
    rows = [
        [escape(b.name or b.guid), escape(b.storey), escape(b.profile),
         escape(reason_text(b.reason)), escape(advice(b.reason)),
         f"<code>{escape(b.guid)}</code>"]
        for b in beams
    ]  # fmt: skip
    return (
        '<section id="not-checked"><h2>Not checked</h2>'
        + _table(["Beam", "Storey", "Profile", "Reason", "What the model needs", "GUID"], rows)
        + "</section>"
    )


def _demand_html(b: BeamResult, du: DisplayUnits) -> str:
    d = b.demand
    if d is None:
        return ""
    out = [
        f"<h4>Demand</h4><p>Source: {escape(d.source)}. Tributary width "
        f"{escape(du.text(d.tributary_left, 'length'))} left, "
        f"{escape(du.text(d.tributary_right, 'length'))} right. Moment from "
        f"{escape(d.moment_combination or '–')}, shear from "
        f"{escape(d.shear_combination or '–')}.</p>"
    ]
    if d.line_loads:
        out.append(
            _table(
                ["Case", f"Line load ({du.label('line load')})", "From", "To", "Source"],
                [[escape(ll.case), _qty(du, ll.intensity, "line load", 3),
                  _qty(du, ll.start, "length"), _qty(du, ll.end, "length"), escape(ll.source)]
                 for ll in d.line_loads],
            )
        )  # fmt: skip
    if d.point_loads:
        out.append(
            _table(
                ["Case", f"Point load ({du.label('force')})", "Station", "Delivered by"],
                [[escape(p.case), _qty(du, p.force, "force", 2), _qty(du, p.station, "length"),
                  f"<code>{escape(p.source)}</code>"] for p in d.point_loads],
            )
        )  # fmt: skip
    return "".join(out)


def _beam_article(b: BeamResult, du: DisplayUnits, method: str) -> str:
    strength = _strength_label(method)
    out = [f'<article class="beam" id="beam-{attr(b.guid)}">']
    out.append(
        f"<h3>{escape(b.name or b.guid)} {_outcome(b.outcome)}</h3>"
        f'<p class="note">{escape(b.profile)} · {escape(b.grade)} · {escape(b.storey)} · '
        f"<code>{escape(b.guid)}</code></p>"
    )
    facts = _table(
        [f"Span ({du.label('length')})", f"Fy ({du.label('stress')})", "Utilisation",
         "Strength", "Flexure", "Shear", "Deflection", "Controlling limit"],
        [[_qty(du, b.span, "length"), _qty(du, b.fy, "stress", 1),
          _utilisation_cell(b.utilisation), _utilisation_cell(b.strength_utilisation),
          _utilisation_cell(b.flexure_utilisation), _utilisation_cell(b.shear_utilisation),
          _utilisation_cell(b.deflection_utilisation), escape(b.controlling_limit)]],
    )  # fmt: skip
    out.append(facts)
    if b.outcome == "fail":
        out.append(f'<p class="fix">{escape(fix_words(b, du))}</p>')
    rows = []
    for i, s in enumerate(b.segments):
        cells = [
            _num(i + 1, 0), _qty(du, s.start, "length"), _qty(du, s.end, "length"),
            _qty(du, s.lb, "length"), _num(s.cb),
            escape(s.flange + (" (slab)" if s.continuous else "")),
            _qty(du, s.moment_demand, "moment", 1), _qty(du, s.moment_capacity, "moment", 1),
            _utilisation_cell(s.utilisation), escape(limit_state_words(s.limit_state)),
            escape(s.load_combination),
        ]  # fmt: skip
        rows.append(cells)
    if rows:
        head = [
            "#", f"From ({du.label('length')})", f"To ({du.label('length')})",
            f"Lb ({du.label('length')})", "Cb", "Compression flange",
            f"Moment ({du.label('moment')})", f"{strength} ({du.label('moment')})", "Utilisation",
            "Limit state", "Load combination",
        ]  # fmt: skip
        table = _table(head, rows, "segments", marked=b.governing_segment)
        out.append("<h4>Unbraced segments</h4>" + table)
    charts = []
    moment = moment_diagram_svg(b, du)
    if moment:
        charts.append(
            f"<figure>{moment}<figcaption>Moment under the governing combination; dots are "
            "brace points (hollow: does not count), the shaded band the governing segment, "
            "the blue band slab-braced length.</figcaption></figure>"
        )
    curve = strength_curve_svg(b, du, method)
    if curve:
        charts.append(
            f"<figure>{curve}<figcaption>Design strength {strength} against unbraced length "
            "for this section and the governing segment's Cb; the marker is the governing "
            "segment at its Lb and moment (a cross where it fails).</figcaption></figure>"
        )
    out += charts
    if b.brace_points:
        out.append(
            "<h4>Brace points</h4>"
            + _table(
                [f"Station ({du.label('length')})", "Kind", "Flange", "Counts", "By", "Why not"],
                [[_qty(du, p.station, "length"), escape(p.kind), escape(p.flange),
                  "yes" if p.counts else "no",
                  (f"{escape(p.by_name)} " if p.by_name else "") + f"<code>{escape(p.by)}</code>",
                  escape(reason_text(p.reason))]
                 for p in sorted(b.brace_points, key=lambda p: p.station)],
            )
        )  # fmt: skip
    out.append(_demand_html(b, du))
    if b.notes:
        out.append("<h4>Notes</h4><ul>" + "".join(f"<li>{escape(n)}</li>" for n in b.notes))
        out.append("</ul>")
    out.append("</article>")
    return "".join(out)


def report_html(result: CheckResult, units: str) -> str:
    """The check report page as text."""
    du = DisplayUnits(check_system(units))
    details, note = detail_beams(result)
    linked = {b.guid for b in details}
    beams_by = _by_storey(result.beams, lambda b: b.storey)
    slabs_by = _by_storey(result.slabs, lambda s: s.storey)

    def draw(name, beams, slabs):
        return check_plan_svg(beams, slabs, du, linked, f"Plan of {name}")

    intro = (
        "Beams coloured by their utilisation (demand over strength) in steps; failing beams "
        "are red with a dark casing and a label, beams not checked are grey and dashed. "
        "Dots are brace points, hollow where a brace does not count; blue bands mark "
        "lengths braced by a slab. "
        "Select a beam for its details."
    )
    sections = [
        _summary_section(result),
        model_information_section(result),
        _plans_section(result.storeys, beams_by, slabs_by, draw, check_legend_svg(), intro),
        _beam_table(result, du, linked),
        _not_checked_section(result),
        f'<section id="details"><h2>Beam details</h2><p class="note">{escape(note)}</p>'
        + "".join(_beam_article(b, du, result.method) for b in details)
        + "</section>",
        f'<footer><p class="note">{escape(result.caution or CAUTION)}</p></footer>',
    ]
    return _page(
        f"Beam check: {result.model.file}",
        "Beam check report",
        f"{result.model.file} · {result.standard} {result.method} · {result.checked_at}",
        sections,
    )


def write_report_html(result: CheckResult, path: Path, units: str) -> Path:
    """Write ``<stem>.report.html`` atomically; return its path."""
    with gc_paused():
        text = report_html(result, units)
    return write_text(path, text)


# --- diff report ----------------------------------------------------------------
def _diff_summary_section(diff: DiffResult) -> str:
    s = diff_summary(diff)
    rows = [
        ["Old revision", escape(diff.old.model.file), escape(diff.old.checked_at)],
        ["New revision", escape(diff.new.model.file), escape(diff.new.checked_at)],
    ]
    counts = [
        ["Beams matched", _num(s["matched"], 0)],
        ["Weakened", _num(s["weakened"], 0)],
        ["New failures", _num(s["new_failures"], 0)],
        ["Strengthened", _num(s["strengthened"], 0)],
        ["Changed otherwise", _num(s["otherwise_changed"], 0)],
        ["Added beams", _num(s["added"], 0)],
        ["Removed beams", _num(s["removed"], 0)],
    ]
    return (
        '<section id="summary"><h2>Summary</h2>'
        '<div class="caution"><strong>Caution.</strong> '
        f"{escape(diff.new.caution or CAUTION)}</div>"
        + _table(["", "Model", "Checked at"], rows, "revisions")
        + _table(["", "Beams"], counts, "counts")
        + f'<p class="note">{escape(diff.new.standard)} {escape(diff.new.method)}</p></section>'
    )


def _change(change: str) -> str:
    colour = CHANGE_COLOURS.get(change, NOT_CHECKED)
    return (
        f'<span class="outcome" style="background:{colour};color:{text_colour_on(colour)}">'
        f"{escape(change)}</span>"
    )


def _changes_section(diff: DiffResult, du: DisplayUnits) -> str:
    order = {"weakened": 0, "changed": 1, "strengthened": 2}
    changes = sorted(diff.changes, key=lambda c: (order.get(c.change, 3), c.storey, c.name))
    names = diff_names(diff)
    stations = lambda xs: escape(", ".join(du.number(s, "length") for s in xs))  # noqa: E731
    rows = [
        [escape(c.name or c.guid), escape(c.storey), _change(c.change),
         escape(f"{c.outcome_before or '–'} → {c.outcome_after or '–'}"),
         _utilisation_cell(c.utilisation_before), _utilisation_cell(c.utilisation_after),
         _qty(du, c.lb_before, "length"), _qty(du, c.lb_after, "length"),
         stations(c.lost_brace_points), stations(c.added_brace_points),
         escape("; ".join(change_reasons(c, du, names)))]
        for c in changes
    ]  # fmt: skip
    lu = du.label("length")
    head = [
        "Beam", "Storey", "Change", "Outcome", "Utilisation before", "Utilisation after",
        f"Lb before ({lu})",
        f"Lb after ({lu})", f"Lost brace points ({lu})", f"Added brace points ({lu})", "Why",
    ]  # fmt: skip
    return (
        '<section id="changes"><h2>Changed beams</h2>'
        + (_table(head, rows, "changes") if rows else "<p>No beam changed.</p>")
        + "</section>"
    )


def _added_removed_section(diff: DiffResult) -> str:
    new = {b.guid: b for b in diff.new.beams}
    old = {b.guid: b for b in diff.old.beams}

    def rows(guids: Sequence[str], beams: dict[str, BeamResult]) -> list[list[str]]:
        out = []
        for g in guids:
            b = beams.get(g)
            out.append([
                escape(b.name if b else ""), escape(b.storey if b else ""),
                _outcome(b.outcome) if b else "", f"<code>{escape(g)}</code>",
            ])  # fmt: skip
        return out

    head = ["Beam", "Storey", "Outcome", "GUID"]
    return (
        '<section id="added-removed"><h2>Added and removed beams</h2>'
        f"<h3>Added ({len(diff.added)})</h3>"
        + (_table(head, rows(diff.added, new)) if diff.added else "<p>None.</p>")
        + f"<h3>Removed ({len(diff.removed)})</h3>"
        + (_table(head, rows(diff.removed, old)) if diff.removed else "<p>None.</p>")
        + "</section>"
    )


def diff_html(diff: DiffResult, units: str) -> str:
    """The revision comparison page as text."""
    du = DisplayUnits(check_system(units))
    changes = {c.guid: c for c in diff.changes}
    added = set(diff.added)
    removed_ids = set(diff.removed)
    removed_by = _by_storey(
        [b for b in diff.old.beams if b.guid in removed_ids], lambda b: b.storey
    )
    beams_by = _by_storey(diff.new.beams, lambda b: b.storey)
    for name in removed_by:
        beams_by.setdefault(name, [])
    slabs_by = _by_storey(diff.new.slabs, lambda s: s.storey)

    def draw(name: str, beams: list[BeamResult], slabs: list[SlabOutline]) -> str:
        return diff_plan_svg(
            beams, removed_by.get(name, []), slabs, changes, added, du,
            f"Changes on {name}",
        )  # fmt: skip

    intro = (
        "The new revision's framing. Weakened beams are drawn thick with a dark casing and "
        "labelled with their new utilisation; a cross marks each brace point lost, at its station. "
        "Removed beams are dotted where they were."
    )
    storeys = list({n: z for n, z in [*diff.old.storeys, *diff.new.storeys]}.items())
    sections = [
        _diff_summary_section(diff),
        _plans_section(storeys, beams_by, slabs_by, draw, diff_legend_svg(), intro),
        _changes_section(diff, du),
        _added_removed_section(diff),
        f'<footer><p class="note">{escape(diff.new.caution or CAUTION)}</p></footer>',
    ]
    return _page(
        f"Revision comparison: {diff.old.model.file} → {diff.new.model.file}",
        "Revision comparison",
        f"{diff.old.model.file} → {diff.new.model.file}",
        sections,
    )


def write_diff_html(diff: DiffResult, path: Path, units: str) -> Path:
    """Write ``diff.html`` atomically; return its path."""
    with gc_paused():
        text = diff_html(diff, units)
    return write_text(path, text)
