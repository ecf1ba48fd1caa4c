"""The readable reports: ``<stem>.report.html`` and ``diff.html``.

One self-contained page each: inline CSS, SVG and (in the check report) one
small inline script that sorts and filters the beam table; no fonts, images
or scripts from elsewhere, so it opens offline and can be mailed or archived
as is. Without the script the page reads the same, the table unsorted.
Per-beam detail sections are capped (every failing beam up to a limit, plus
the most highly utilised others) and the page says how many are shown.
"""

from __future__ import annotations

import base64
import hashlib
from collections import defaultdict
from collections.abc import Iterable, Sequence
from html import escape
from pathlib import Path

from ifccheck import CAUTION
from ifccheck.atomic import write_text
from ifccheck.perf import gc_paused
from ifccheck.reasons import reason_text
from ifccheck.report.basis import (
    ASSUMED_WORDS,
    assumed_grade,
    assumptions,
    combinations,
    defaults_line,
    density_text,
    level_loads,
    load_source_text,
    setting_text,
    settings_list,
)
from ifccheck.report.colours import (
    CHANGE_COLOURS,
    NOT_CHECKED,
    text_colour_on,
    utilisation_colour,
)
from ifccheck.report.display import DisplayUnits, check_system, utilisation_text
from ifccheck.report.html_data import controlling_words, encode, report_data, stage_words
from ifccheck.report.html_script import REPORT_SCRIPT
from ifccheck.report.json_out import diff_summary
from ifccheck.report.requirements import model_information_section
from ifccheck.report.svg import (
    attr,
    check_legend_svg,
    check_plan_svg,
    diff_legend_svg,
    diff_plan_svg,
    plan_css,
)
from ifccheck.report.wording import (
    advice,
    change_reasons,
    diff_names,
    member_ref,
    name_guids,
    sentence,
)
from ifccheck.results import BeamResult, CheckResult, DiffResult, SegmentResult, SlabOutline

NO_STOREY = "(no storey)"
TOLERANCE_WORDS = {
    "gap": "Connection gap (an end may stop this short of its host)",
    "elevation_tolerance": "Elevation tolerance beyond the depth overlap",
    "slab_bearing_tolerance": "Slab bearing tolerance (underside to top of steel)",
}
DECK_SOURCE_WORDS = {
    "inferred": "the framing (beams framing into beams at both ends)",
    "settings": "the settings",
    "none": "not found",
}

# The page's one script (pages, sorts and filters the table, zooms the plans, renders
# details from the embedded data); the name is the service's, which allows it by hash.
TABLE_SCRIPT = REPORT_SCRIPT
PAGE_ROWS = 50  # beam table rows per page (the first page is written into the page)
NOT_CHECKED_ROWS = 200  # not-checked beams listed in their section, at most
DETAIL_LINKS = 40  # failing beams linked from the details section, worst first
# For a Content-Security-Policy that lets this script, and nothing else, run.
TABLE_SCRIPT_HASH = "sha256-" + base64.b64encode(
    hashlib.sha256(TABLE_SCRIPT.encode("utf-8")).digest()
).decode("ascii")

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
.outcome-fail{background:#ed492c;color:#000;font-weight:600}
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
.lead{font-size:1.08em}
.side-by-side{display:flex;gap:24px;flex-wrap:wrap;align-items:flex-start}
.attention{flex:1;min-width:320px}
.attention h3{margin-top:.4em}
.defaults{border-left:5px solid #b36b00;background:#fff;padding:6px 12px}
.why{background:#fff6f4;border-left:5px solid #ed492c;padding:4px 12px;margin:.6em 0}
.why h4{margin:.4em 0}
details.trail{margin:.8em 0}
details summary{cursor:pointer;font-weight:600}
form.filters{display:flex;gap:14px;flex-wrap:wrap;align-items:center;margin:.6em 0}
form.filters input,form.filters select{font:inherit;padding:2px 4px}
button.sort{font:inherit;font-weight:600;border:0;background:none;padding:0;cursor:pointer;
text-align:left}
button.sort::after{content:" ↕";color:#888}
th[aria-sort=ascending] button.sort::after{content:" ↑";color:#000}
th[aria-sort=descending] button.sort::after{content:" ↓";color:#000}
td.guid code{font-size:.85em}
tr[hidden]{display:none}
"""


CHECK_CSS = """
.plan-view{overflow:hidden;touch-action:none}
svg.plan{cursor:grab;user-select:none}
svg.plan line.beam{cursor:pointer}
.plan-tools{display:flex;gap:6px;align-items:center;margin-bottom:4px}
.plan-tools button,.pager button{font:inherit;padding:0 8px}
.plan-tip{position:absolute;z-index:5;background:#fff;border:1px solid #888;padding:4px 8px;
font-size:.85em;white-space:pre-line;max-width:460px;pointer-events:none;box-shadow:0 1px 4px #0003}
.plan-tip[hidden]{display:none}
.pager{margin:.4em 0}
html[data-ready] .js-off{display:none}
"""


def _page(
    title: str, heading: str, subtitle: str, sections: Iterable[str], script: str = "",
    data: str = "", css: str = "",
) -> str:  # fmt: skip
    return (
        "<!DOCTYPE html>\n"
        '<html lang="en"><head><meta charset="utf-8">'
        '<meta name="viewport" content="width=device-width, initial-scale=1">'
        f"<title>{escape(title)}</title><style>{CSS}{css}</style></head><body>"
        f"<header><h1>{escape(heading)}</h1><p>{escape(subtitle)}</p></header><main>"
        + "".join(sections)
        + "</main>"
        + (
            f'<script type="application/octet-stream" id="report-data" '
            f'data-encoding="gzip+base64">{data}</script>'
            if data
            else ""
        )
        + (f"<script>{script}</script>" if script else "")
        + "</body></html>\n"
    )


def _table(
    head: Sequence[str], rows: Iterable[Sequence[str]], cls: str = "", marked: int | None = None
) -> str:
    """Rows are pre-escaped HTML cells; a cell starting with '<td' is used as is.

    Row ``marked`` (an index) gets the class "governing".
    """
    out = [f'<table class="{cls}">']
    if any(head):
        out += ["<thead><tr>", *(f"<th>{escape(h)}</th>" for h in head), "</tr></thead>"]
    out.append("<tbody>")
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


# --- check report ---------------------------------------------------------------
def _summary_section(result: CheckResult, du: DisplayUnits, linked: set[str]) -> str:
    s = result.summary()
    m = result.model
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
    out.append(
        f'<p class="lead">{escape(result.project or m.file)}: {s["total"]} beams checked to '
        f"{escape(result.standard)} {escape(result.method)}, {s['pass']} pass, "
        f"{s['fail']} fail, {s['not_checked']} not checked.</p>"
    )
    out.append('<div class="side-by-side">' + counts + _attention_list(result, linked) + "</div>")
    out.append(_stage_summary(result))
    line = defaults_line(result, du)
    if line:
        out.append(f'<p class="defaults"><strong>Defaults.</strong> {escape(sentence(line))}</p>')
    if result.warnings:
        shown = result.warnings[:50]
        names = result.names
        out.append("<h3>Warnings</h3><ul>")
        for g, msg in shown:
            who = f"{escape(member_ref(g, names))}: " if g else ""
            out.append(f"<li>{who}{escape(name_guids(msg, names, with_guid=False))}</li>")
        out.append("</ul>")
        if len(result.warnings) > len(shown):
            out.append(f'<p class="note">and {len(result.warnings) - len(shown)} more '
                       "(all are in the JSON results).</p>")  # fmt: skip
    out.append("</section>")
    return "".join(out)


def stage_counts(result: CheckResult) -> dict[str, int]:
    """Failing beams by the stages they fail in: in service (whatever construction
    does), and only during construction (they pass, or are not checked, in service)."""
    in_service = construction_only = 0
    for b in result.beams:
        if b.outcome != "fail":
            continue
        service = b.stage_result("in_service")
        if service is None or service.outcome == "fail":
            in_service += 1
        else:
            construction_only += 1
    return {"in_service": in_service, "construction_only": construction_only}


def _stage_summary(result: CheckResult) -> str:
    """Counts per stage, when the settings declare a construction stage."""
    if len(result.stages) < 2:
        return ""
    rows = []
    for st in result.stages:
        n = st.summary
        bracing = "slabs brace top flanges" if st.slab_bracing else "no slab bracing"
        rows.append(
            [escape(st.title), escape(", ".join(st.levels) or "–"), escape(bracing),
             _num(n.get("total", 0), 0), _num(n.get("pass", 0), 0), _num(n.get("fail", 0), 0),
             _num(n.get("not_checked", 0), 0), _num(n.get("governing", 0), 0)]
        )  # fmt: skip
    c = stage_counts(result)
    lead = (
        f'<p class="stage-lead"><strong>Two stages.</strong> {c["in_service"]} beams fail in '
        f"service; {c['construction_only']} more fail only during construction (wet concrete, "
        "before the slab can brace them).</p>"
    )
    return (
        '<div class="stages" id="stage-summary"><h3>By stage</h3>'
        + lead
        + _table(
            ["Stage", "Levels", "Bracing", "Checked", "Pass", "Fail", "Not checked", "Governs"],
            rows,
            "stage-counts",
        )
        + '<p class="note">A beam\'s outcome is the worse of its stages; "governs" counts '
        "the beams whose highest utilisation is in that stage.</p></div>"
    )


def _attention_list(result: CheckResult, linked: set[str], limit: int = 12) -> str:
    """The failing beams (worst first) and the not-checked ones, linked to their details."""
    fails = sorted((b for b in result.beams if b.outcome == "fail"), key=_most_utilised)
    nots = [b for b in result.beams if b.outcome == "not_checked"]
    if not fails and not nots:
        return '<p class="attention">Every checked beam passes.</p>'
    items = []
    for b in [*fails, *nots][:limit]:
        name = escape(b.name or b.guid)
        if b.guid in linked:
            name = f'<a href="#beam-{attr(b.guid)}">{name}</a>'
        elif b.outcome == "not_checked":
            name = f'<a href="#not-checked">{name}</a>'
        what = (
            f"fails{_fail_stage_words(b)}, utilisation {utilisation_text(b.utilisation)} in "
            f"{escape(controlling_words(b))}"
            if b.outcome == "fail"
            else f"not checked: {escape(b.reason.text if b.reason else 'no reason recorded')}"
        )
        items.append(f"<li>{name} ({escape(b.storey)}): {what}</li>")
    more = len(fails) + len(nots) - limit
    tail = f"<li>and {more} more (see the beam table)</li>" if more > 0 else ""
    return (
        '<div class="attention"><h3>Needs attention</h3><ul>'
        + "".join(items)
        + tail
        + "</ul></div>"
    )


def _fail_stage_words(b: BeamResult) -> str:
    """' only during construction', ' in service and during construction' or ''."""
    if len(b.stages) < 2 or b.outcome != "fail":
        return ""
    fails = [s.stage for s in b.stages if s.outcome == "fail"]
    if fails == ["construction"]:
        return " only during construction"
    if len(fails) > 1:
        return " in service and during construction"
    return ""


def _basis_section(result: CheckResult, du: DisplayUnits) -> str:
    """What the check assumed and ran with: the design basis, first after the summary."""
    m = result.model
    s = result.settings
    out = ['<section id="basis"><h2>Design basis</h2>']
    source = s.get("source")
    facts = [
        ("Project", escape(result.project or m.file)),
        ("Model", f"{escape(m.file)} ({escape(m.schema)}, length unit {escape(m.length_unit)})"),
        ("Model SHA-256", f"<code>{escape(m.sha256)}</code>"),
        ("Standard and method", escape(f"{result.standard}, {result.method}")),
        ("Settings", escape(source) if source else "none given: the documented defaults"),
        ("Checked at", escape(result.checked_at)),
        ("Tool", escape(f"{result.tool} {result.version}")),
    ]
    out.append(_table(["", ""], [[f"<strong>{k}</strong>", v] for k, v in facts], "facts"))
    staged = len(result.stages) > 1
    out += _stage_basis(result, du, 0, staged)
    deflection = s.get("deflection", {})
    framing = s.get("framing", {})
    limits = [
        ("Live-load deflection", f"span / {float(deflection.get('live', 360)):g}"),
        ("Total-load deflection", f"span / {float(deflection.get('total', 240)):g}"),
        ("Cantilevers", "twice the overhang length in place of the span"),
    ] + [
        (TOLERANCE_WORDS.get(k, k), du.trade(float(v), "thickness"))
        for k, v in framing.items()
        if isinstance(v, int | float)
    ]
    out.append("<h3>Deflection limits and tolerances</h3>")
    out.append(_table(["", ""], [[escape(k), escape(v)] for k, v in limits], "limits"))
    out.append("<h3>Assumptions</h3><ul>")
    out += [f"<li>{escape(text)}</li>" for _code, text in assumptions(result)]
    out.append("</ul>")
    if result.levels:
        out.append("<h3>Deck direction per level</h3>")
        out.append(
            _table(
                ["Level", "Deck spans", "Found from", "Typical beam spacing"],
                [[escape(lv.name),
                  escape("–" if lv.deck_angle is None else f"{lv.deck_angle:.0f}° from x"),
                  escape(DECK_SOURCE_WORDS.get(lv.deck_source, lv.deck_source)),
                  escape(du.text(lv.typical_spacing, "length"))] for lv in result.levels],
            )
        )  # fmt: skip
    assumed = [
        (ASSUMED_WORDS.get(k, k.replace("_", " ")), n) for k, n in result.assumptions.items()
    ]
    grade = assumed_grade(result)
    out.append("<h3>What was assumed</h3>")
    out.append(
        _table(["Assumed rather than read from the model", "Count"],
               [[escape(w), _num(n, 0)] for w, n in assumed], "assumed")
    )  # fmt: skip
    if grade:
        out.append(
            f'<p class="note">{grade["count"]} beams were checked on grade '
            f"{escape(grade['grade'])}, the settings' default: the model names no grade for "
            "them.</p>"
        )
    if result.load_balance:
        out.append("<h3>Load balance</h3><p class='note'>Floor load applied to each level and "
                   "delivered to the members that carry it, per load case.</p>")  # fmt: skip
        out.append(
            _table(
                ["Level", "Case", f"Applied ({du.label('force')})",
                 f"Delivered ({du.label('force')})", "Difference"],
                [[escape(x.level), escape(x.case), _qty(du, x.applied, "force", 1),
                  _qty(du, x.delivered, "force", 1),
                  _pct(x.delivered - x.applied, x.applied)] for x in result.load_balance],
                "balance",
            )
        )  # fmt: skip
    for k in range(1, len(result.stages)):
        out += _stage_basis(result, du, k, staged)
    settings = settings_list(s)
    out.append("<details><summary>Every setting the check ran with</summary>")
    out.append(
        _table(
            ["Setting", "Value", ""],
            [[f"<code>{escape(x.key)}</code>", escape(setting_text(du, x)),
              "default" if x.default else "set in the settings file"] for x in settings],
            "settings",
        )
    )  # fmt: skip
    out.append("</details></section>")
    return "".join(out)


def _stage_basis(result: CheckResult, du: DisplayUnits, stage: int, staged: bool) -> list[str]:
    """Loads per level and load combinations of one stage; a later stage (construction)
    under its own heading, with its bracing, levels and what it assumes."""
    s = result.settings
    out: list[str] = []
    h = "h3"
    suffix = ""
    if staged:
        st = result.stages[stage]
        suffix = f" ({escape(st.title)})"
        if stage > 0:
            title = escape(st.title).capitalize()
            out.append(f'<h3 id="basis-{attr(st.stage)}">{title} stage</h3>')
            bracing = (
                "slabs and decks brace the top flanges they bear on"
                if st.slab_bracing
                else "the deck is not attached: nothing braces the top flanges between brace points"
            )
            out.append(
                f"<p>Levels: {escape(', '.join(st.levels) or 'none')}. Bracing: {bracing}.</p>"
            )
            if st.notes:
                out.append("<ul>" + "".join(f"<li>{escape(n)}</li>" for n in st.notes) + "</ul>")
            h = "h4"
    loads = level_loads(result, stage)
    if loads:
        out.append(f"<{h}>Loads per level{suffix}</{h}>")
        out.append(
            _table(
                ["Level", "Case", "Load", f"Pressure ({du.label('pressure')})", "From"],
                [[escape(x.level), escape(x.case), escape(x.what),
                  f'<td class="num">{du.trade_number(x.pressure, "pressure")}</td>',
                  escape(load_source_text(du, x, result))] for x in loads],
                "loads",
            )
        )  # fmt: skip
        if stage == 0:
            density = float(s.get("loads", {}).get("steel_density", 7850.0))
            out.append(
                f'<p class="note">Steel self-weight is added on every beam from its section '
                f"area at {escape(density_text(du, density))}.</p>"
            )
    out.append(f"<{h}>Load combinations{suffix}</{h}>")
    out.append(
        _table(
            ["Combination", "Used for", "Source"],
            [[escape(c.name), escape("strength" if c.purpose == "strength" else
                                     "deflection (serviceability)"), escape(c.source)]
             for c in combinations(result, stage)],
            "combinations",
        )
    )  # fmt: skip
    if stage > 0 and result.stages[stage].load_balance:
        out.append(f"<h4>Load balance{suffix}</h4>")
        out.append(
            _table(
                ["Level", "Case", f"Applied ({du.label('force')})",
                 f"Delivered ({du.label('force')})", "Difference"],
                [[escape(x.level), escape(x.case), _qty(du, x.applied, "force", 1),
                  _qty(du, x.delivered, "force", 1), _pct(x.delivered - x.applied, x.applied)]
                 for x in result.stages[stage].load_balance],
                "balance",
            )
        )  # fmt: skip
    return out


def _pct(diff: float, base: float) -> str:
    if not base:
        return '<td class="num">–</td>'
    return f'<td class="num">{100 * diff / base:+.2f} %</td>'


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


def table_order(result: CheckResult) -> list[BeamResult]:
    """The table's order: failing first, then by utilisation, then by name."""
    order = {"fail": 0, "pass": 1, "not_checked": 2}
    return sorted(result.beams, key=lambda b: (order[b.outcome], -(b.utilisation or 0.0), b.name))


def _beam_table(result: CheckResult, du: DisplayUnits) -> str:
    """The table's first page as written; the script pages, sorts and filters every beam
    from the embedded data."""
    beams = table_order(result)
    strength = _strength_label(result.method)
    staged = len(result.stages) > 1
    rows = []
    for b in beams[:PAGE_ROWS]:
        seg = b.governing
        name = f'<a href="#beam-{attr(b.guid)}">{escape(b.name or b.guid)}</a>'
        rows.append(
            f'<tr data-guid="{attr(b.guid)}" data-name="{attr(b.name)}" '
            f'data-storey="{attr(b.storey or NO_STOREY)}" data-outcome="{attr(b.outcome)}" '
            f'data-profile="{attr(b.profile)}" data-stage="{attr(stage_words(b.stage))}">'
            + "".join(
                c if c.startswith("<td") else f"<td>{c}</td>"
                for c in [
                    name, escape(b.storey), escape(b.profile), _outcome(b.outcome),
                    _utilisation_cell(b.utilisation), escape(controlling_words(b)),
                    *([escape(stage_words(b.stage))] if staged else []),
                    _lb_cell(seg, du), _num(seg.cb if seg else None),
                    _qty(du, seg.moment_demand if seg else None, "moment", 1),
                    _qty(du, seg.moment_capacity if seg else None, "moment", 1),
                    f'<td class="guid"><code>{escape(b.guid)}</code></td>',
                ]
            )
            + "</tr>"
        )  # fmt: skip
    head = [
        ("Beam", "name", "text"), ("Storey", "storey", "text"), ("Profile", "profile", "text"),
        ("Outcome", "outcome", "text"), ("Utilisation", "utilisation", "number"),
        ("Controlling limit", "", ""),
        *([("Governing stage", "stage", "text")] if staged else []),
        (f"Lb ({du.label('length')})", "lb", "number"),
        ("Cb", "", ""), (f"Moment ({du.label('moment')})", "", ""),
        (f"{strength} ({du.label('moment')})", "", ""), ("GUID", "guid", "text"),
    ]  # fmt: skip
    cells = []
    for label, key, kind in head:
        if key:
            cells.append(
                f'<th><button type="button" class="sort" data-key="{key}" data-kind="{kind}">'
                f"{escape(label)}</button></th>"
            )
        else:
            cells.append(f"<th>{escape(label)}</th>")
    storeys = _storey_order(result.storeys, {b.storey or NO_STOREY for b in result.beams})
    storey_options = "".join(f'<option value="{attr(n)}">{escape(n)}</option>' for n in storeys)
    controls = (
        '<form class="filters" id="beam-filters" hidden>'
        '<label>Storey <select id="filter-storey"><option value="">all</option>'
        f"{storey_options}</select></label>"
        '<label>Outcome <select id="filter-outcome"><option value="">all</option>'
        '<option value="fail">fail</option><option value="pass">pass</option>'
        '<option value="not_checked">not checked</option></select></label>'
        '<label>Find <input type="search" id="filter-text" '
        'placeholder="name, GUID or profile" autocomplete="off"></label>'
        f'<span id="beam-count" class="note">{len(beams)} of {len(beams)} beams</span></form>'
    )
    pager = (
        '<div class="pager" id="beam-pager" hidden><button type="button" id="page-prev">'
        'previous</button> <span id="page-text"></span> <button type="button" id="page-next">'
        "next</button></div>"
    )
    shown = (
        ""
        if len(beams) <= PAGE_ROWS
        else f'<p class="note js-off">The first {PAGE_ROWS} of {len(beams)} beams; with '
        "scripts on, the table pages through all of them (and the CSV lists every beam).</p>"
    )
    return (
        '<section id="beams"><h2>Beams</h2><p>Every beam, failing first, then by utilisation. '
        "Lb, Cb and moments are those of the governing unbraced segment. Select a column "
        "heading to sort by it; narrow the list by storey, outcome or a name; select a beam "
        "for its details.</p>"
        + controls
        + '<table class="beams" id="beam-table"><thead><tr>'
        + "".join(cells)
        + "</tr></thead><tbody>"
        + "".join(rows)
        + "</tbody></table>"
        + pager
        + shown
        + "</section>"
    )


def _lb_cell(seg: SegmentResult | None, du: DisplayUnits) -> str:
    if seg is None:
        return '<td class="num">–</td>'
    if seg.continuous:
        return '<td class="num">continuous (slab)</td>'
    return _qty(du, seg.lb, "length")


def _lb_value(du: DisplayUnits, lb: float | None) -> str:
    """A governing Lb; 0 is a length braced throughout by the slab."""
    if lb == 0.0:
        return '<td class="num">continuous (slab)</td>'
    return _qty(du, lb, "length")


def _not_checked_section(result: CheckResult) -> str:
    beams = [b for b in result.beams if b.outcome == "not_checked"]
    if not beams:
        return ""
    names = result.names
    rows = [
        [escape(b.name or b.guid), escape(b.storey), escape(b.profile),
         escape(name_guids(reason_text(b.reason), names)), escape(advice(b.reason)),
         f"<code>{escape(b.guid)}</code>"]
        for b in beams[:NOT_CHECKED_ROWS]
    ]  # fmt: skip
    more = ""
    if len(beams) > NOT_CHECKED_ROWS:
        by_reason = result.not_checked_by_reason()
        more = (
            f'<p class="note">The first {NOT_CHECKED_ROWS} of {len(beams)} not-checked beams; '
            "filter the beam table by outcome for the others. By reason: "
            + escape("; ".join(f"{k} {n}" for k, n in by_reason.items()))
            + ".</p>"
        )
    return (
        '<section id="not-checked"><h2>Not checked</h2>'
        + _table(["Beam", "Storey", "Profile", "Reason", "What the model needs", "GUID"], rows)
        + more
        + "</section>"
    )


def _check_plans_section(result: CheckResult, du: DisplayUnits, intro: str) -> str:
    """Per storey a plan, with zoom buttons the script shows and a count of labels."""
    beams_by = _by_storey(result.beams, lambda b: b.storey)
    slabs_by = _by_storey(result.slabs, lambda s: s.storey)
    out = [
        f'<section id="plans"><h2>Storey plans</h2><p>{intro}</p>',
        check_legend_svg(),
        '<div id="plan-tip" class="plan-tip" hidden></div>',
    ]
    for name in _storey_order(result.storeys, beams_by):
        beams = beams_by[name]
        svg, wanted, dropped = check_plan_svg(beams, slabs_by.get(name, []), du, set(),
                                              f"Plan of {name}")  # fmt: skip
        labelled = (
            f"{wanted - dropped} of {wanted} failing or not-checked beams labelled"
            + ("; zoom in to label the others" if dropped else "")
            + "."
            if wanted
            else ""
        )
        out.append(
            f'<figure class="storey" data-storey="{attr(name)}">'
            '<div class="plan-tools" hidden><button type="button" data-zoom="in" '
            'title="zoom in">+</button><button type="button" data-zoom="out" title="zoom out">'
            '−</button><button type="button" data-zoom="reset">whole storey</button> '
            '<span class="note">wheel to zoom, drag to pan</span></div>'
            f'<div class="plan-view">{svg}</div>'
            f"<figcaption>{escape(name)}: {len(beams)} beams. Plan view, model x to the "
            f'right, y up the page. <span class="label-count">{labelled}</span></figcaption>'
            "</figure>"
        )
    out.append("</section>")
    return "".join(out)


def _details_section(result: CheckResult) -> str:
    """The container the script renders a beam's details into, and links to the failing
    beams worst first."""
    fails = sorted((b for b in result.beams if b.outcome == "fail"), key=_most_utilised)
    links = "".join(
        f'<li><a href="#beam-{attr(b.guid)}">{escape(b.name or b.guid)}</a> '
        f"({escape(b.storey)}, {utilisation_text(b.utilisation)})</li>"
        for b in fails[:DETAIL_LINKS]
    )
    more = (
        f"<li>and {len(fails) - DETAIL_LINKS} more (the beam table lists them all)</li>"
        if len(fails) > DETAIL_LINKS
        else ""
    )
    return (
        '<section id="details"><h2>Beam details</h2><p class="note">Every beam has details: '
        "select it in the table, on a plan or below. They are drawn from the data embedded in "
        "this page, and need scripts on; the JSON results carry the same figures.</p>"
        + (f'<ul class="detail-links">{links}{more}</ul>' if links else "")
        + '<div id="detail-view"></div></section>'
    )


def report_html(result: CheckResult, units: str) -> str:
    """The check report page as text."""
    du = DisplayUnits(check_system(units))
    linked = {b.guid for b in result.beams}
    intro = (
        "Beams coloured by their utilisation (demand over strength) in steps; failing beams "
        "are red with a dark casing and a label, beams not checked are grey, dashed and "
        "labelled, as many labels as fit without overlapping. Dots are brace points, hollow "
        "where a brace does not count; blue bands mark lengths braced by a slab. Hover over a "
        "beam for its name, figures and brace points; select it for its details; zoom to read "
        "a crowded plan."
    )
    storeys = _storey_order(result.storeys, {b.storey or NO_STOREY for b in result.beams})
    data = encode(report_data(result, du, storeys, NO_STOREY))
    sections = [
        _summary_section(result, du, linked),
        _basis_section(result, du),
        model_information_section(result),
        _check_plans_section(result, du, intro),
        _beam_table(result, du),
        _not_checked_section(result),
        _details_section(result),
        f'<footer><p class="note">{escape(result.caution or CAUTION)}</p></footer>',
    ]
    return _page(
        f"Beam check: {result.model.file}",
        "Beam check report",
        f"{result.project or result.model.file} · {result.standard} {result.method} · "
        f"{result.checked_at}",
        sections,
        script=TABLE_SCRIPT,
        data=data,
        css=plan_css() + CHECK_CSS,
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
    apart = ""
    if diff.old.beams and diff.new.beams and not diff.matched:
        apart = (
            '<p class="defaults"><strong>Warning.</strong> The two files share no beams (by '
            "GUID or by position): they are probably not revisions of one model.</p>"
        )
    return (
        '<section id="summary"><h2>Summary</h2>'
        '<div class="caution"><strong>Caution.</strong> '
        f"{escape(diff.new.caution or CAUTION)}</div>"
        + apart
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
    beams = {b.guid: b for b in diff.new.beams}
    stations = lambda xs: escape(", ".join(du.number(s, "length") for s in xs))  # noqa: E731
    rows = [
        [escape(c.name or c.guid), escape(c.storey), _change(c.change),
         escape(f"{c.outcome_before or '–'} → {c.outcome_after or '–'}"),
         _utilisation_cell(c.utilisation_before), _utilisation_cell(c.utilisation_after),
         _lb_value(du, c.lb_before), _lb_value(du, c.lb_after),
         stations(c.lost_brace_points), stations(c.added_brace_points),
         escape("; ".join(change_reasons(c, du, names, beams.get(c.guid))))]
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
