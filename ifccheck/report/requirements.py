"""The model information audit in the outputs: the summary clause, the report's "Model
information" section and the BCF topics (one per unmet specification).

The audit itself is ``ifccheck.ifc.requirements``; these functions only read
``CheckResult.requirements``. The writers call them with a one-line hook each
(``bcf_out.write_issues_bcf``, ``html_out.report_html``).
"""

from __future__ import annotations

import math
import uuid
from collections import defaultdict
from collections.abc import Iterable, Sequence
from html import escape
from pathlib import Path
from typing import TYPE_CHECKING, Any

from ifccheck.results import CheckResult, RequirementElement, RequirementResult

if TYPE_CHECKING:
    import bcf.v2.model as mdl
    from bcf.v2.bcfxml import BcfXml
    from xsdata.models.datatype import XmlDateTime

AUTHOR = "ifccheck"
LABEL = "model information"
_NAMESPACE = uuid.UUID("5d0f3a52-8c1e-4b7a-9e26-1f4c7a0b93d8")
LISTED = 200  # failing elements listed per specification in the report
DESCRIBED = 40  # failing elements named in a BCF topic's description
NO_STOREY = "(no storey)"
Vec = tuple[float, float, float]


def unmet(result: CheckResult) -> list[RequirementResult]:
    """The specifications the model does not meet, in the audit's order."""
    return [r for r in result.requirements if not r.met]


def _elements(n: int) -> str:
    return f"{n} element{'s' if n != 1 else ''}"


# --- the CLI summary line ---------------------------------------------------------
def summary_clause(result: CheckResult) -> str:
    """'; model information: 1 of 8 requirements not met (Braces ...: 1 element)', or ''
    when the model was not audited."""
    if not result.requirements:
        return ""
    total = len(result.requirements)
    missing = unmet(result)
    if not missing:
        return f"; model information: all {total} requirements met"
    named = "; ".join(f"{r.name}: {_elements(len(r.failing))}" for r in missing[:3])
    more = f"; {len(missing) - 3} more" if len(missing) > 3 else ""
    return f"; model information: {len(missing)} of {total} requirements not met ({named}{more})"


# --- the HTML report --------------------------------------------------------------
def _checked_by(r: RequirementResult) -> str:
    if r.checked_by == "ifctester":
        return f"IDS {r.source} (ifctester)"
    return "ifccheck itself (beyond IDS 1.0 facets)"


def _intro(result: CheckResult) -> str:
    records = result.requirements
    missing = unmet(result)
    sources = sorted({r.source for r in records if r.checked_by == "ifctester"})
    ids_words = ", ".join(sources) if sources else "no IDS"
    failing = {e.guid for r in missing for e in r.failing}
    state = (
        f"{len(records) - len(missing)} of {len(records)} requirements are met; "
        f"{_elements(len(failing))} fail{'s' if len(failing) == 1 else ''} "
        f"{len(missing)} of them."
        if missing
        else f"All {len(records)} requirements are met."
    )
    return (
        "<p>Before the beams were checked, the model was audited against the information "
        f"the check needs: the IDS specifications ({escape(ids_words)}, audited with "
        "ifctester, the IfcOpenShell project's IDS tool) and what IDS 1.0 facets cannot "
        "express, which ifccheck checks itself. A beam not checked for want of "
        f"a requirement names it in its reason. {escape(state)}</p>"
    )


def _counts_table(records: Sequence[RequirementResult]) -> str:
    rows = []
    for r in records:
        state = "met" if r.met else "not met"
        rows.append(
            f'<tr class="{"unmet" if not r.met else "met"}"><td>{escape(r.name)}</td>'
            f"<td>{escape(_checked_by(r))}</td>"
            f'<td class="num">{r.applicable}</td><td class="num">{r.passing}</td>'
            f'<td class="num">{len(r.failing)}</td><td>{state}</td></tr>'
        )
    return (
        '<table class="requirements"><thead><tr><th>Requirement</th><th>Checked by</th>'
        "<th>Applies to</th><th>Pass</th><th>Fail</th><th></th></tr></thead><tbody>"
        + "".join(rows)
        + "</tbody></table>"
    )


def _failing_table(r: RequirementResult) -> str:
    shown = r.failing[:LISTED]
    rows = "".join(
        f"<tr><td>{escape(e.name or '–')}</td><td>{escape(e.ifc_class)}</td>"
        f"<td>{escape(e.storey or NO_STOREY)}</td><td>{escape(e.reason)}</td>"
        f"<td><code>{escape(e.guid)}</code></td></tr>"
        for e in shown
    )
    more = (
        f'<p class="note">and {len(r.failing) - len(shown)} more (all are in the JSON results '
        "and the BCF topic).</p>"
        if len(r.failing) > len(shown)
        else ""
    )
    return (
        '<table class="requirement-failures"><thead><tr><th>Element</th><th>Class</th>'
        "<th>Storey</th><th>Why</th><th>GUID</th></tr></thead><tbody>"
        + rows
        + "</tbody></table>"
        + more
    )


def _plan_svg(
    storey: str, context: Sequence[tuple[Vec, Vec]], failing: Sequence[RequirementElement]
) -> str:
    """A plan of one storey: its beams thin and grey, the failing elements thick and
    labelled (model x to the right, y up the page)."""
    lines = [(a, b) for a, b in context] + [
        (e.start, e.end) for e in failing if e.start is not None and e.end is not None
    ]
    xs = [p[0] for line in lines for p in line]
    ys = [p[1] for line in lines for p in line]
    xmin, xmax, ymin, ymax = min(xs), max(xs), min(ys), max(ys)
    width, pad = 720.0, 40.0
    scale = (width - 2 * pad) / max(xmax - xmin, ymax - ymin, 1e-6)
    height = max((ymax - ymin) * scale + 2 * pad, 120.0)

    def px(p: Sequence[float]) -> tuple[float, float]:
        return pad + (p[0] - xmin) * scale, height - pad - (p[1] - ymin) * scale

    out = [
        f'<svg xmlns="http://www.w3.org/2000/svg" class="requirement-plan" '
        f'viewBox="0 0 {width:.0f} {height:.0f}" width="{width:.0f}" height="{height:.0f}" '
        f'role="img" aria-label="{escape(f"Elements failing a requirement on {storey}")}">'
    ]
    for a, b in context:
        (x0, y0), (x1, y1) = px(a), px(b)
        out.append(
            f'<line x1="{x0:.1f}" y1="{y0:.1f}" x2="{x1:.1f}" y2="{y1:.1f}" '
            'stroke="#b8b8b8" stroke-width="1.5"/>'
        )
    for e in failing:
        if e.start is None or e.end is None:
            continue
        (x0, y0), (x1, y1) = px(e.start), px(e.end)
        mx, my = (x0 + x1) / 2, (y0 + y1) / 2
        out.append(
            f'<g class="failing" data-guid="{escape(e.guid, quote=True)}">'
            f'<line x1="{x0:.1f}" y1="{y0:.1f}" x2="{x1:.1f}" y2="{y1:.1f}" stroke="#7a1f5c" '
            f'stroke-width="5" stroke-linecap="round"/><circle cx="{mx:.1f}" cy="{my:.1f}" '
            f'r="6" fill="#fff" stroke="#7a1f5c" stroke-width="2"/>'
            f'<text x="{mx + 9:.1f}" y="{my - 8:.1f}" font-size="12" fill="#1d1d1d">'
            f"{escape(e.name or e.guid)}</text><title>{escape(e.reason)}</title></g>"
        )
    out.append("</svg>")
    return "".join(out)


def _plans(result: CheckResult, missing: Sequence[RequirementResult]) -> str:
    """One plan per storey with failing elements the reader placed."""
    by_storey: dict[str, dict[str, RequirementElement]] = defaultdict(dict)
    for r in missing:
        for e in r.failing:
            if e.start is not None and e.end is not None:
                by_storey[e.storey or NO_STOREY].setdefault(e.guid, e)
    if not by_storey:
        return ""
    order = [n for n, _ in sorted(result.storeys, key=lambda s: -s[1])]
    names = [n for n in order if n in by_storey] + sorted(set(by_storey) - set(order))
    out = ["<h3>On the plans</h3>"]
    for name in names:
        failing = list(by_storey[name].values())
        context = [(b.start, b.end) for b in result.beams if (b.storey or NO_STOREY) == name]
        out.append(
            f'<figure class="requirement-plan" data-storey="{escape(name, quote=True)}">'
            + _plan_svg(name, context, failing)
            + f"<figcaption>{escape(name)}: {_elements(len(failing))} failing a requirement "
            "(thick, labelled) among the storey's beams. Plan view, model x to the right, "
            "y up the page.</figcaption></figure>"
        )
    return "".join(out)


def model_information_section(result: CheckResult) -> str:
    """The report's "Model information" section, or '' when the model was not audited."""
    if not result.requirements:
        return ""
    missing = unmet(result)
    out = ['<section id="model-information"><h2>Model information</h2>', _intro(result)]
    out.append(_counts_table(result.requirements))
    for r in missing:
        out.append(
            f'<article class="requirement"><h3>{escape(r.name)}: '
            f"{_elements(len(r.failing))} fail{'s' if len(r.failing) == 1 else ''}</h3>"
            f"<p>{escape(r.description)}</p>"
        )
        if r.instructions:
            out.append(f'<p class="fix">What the model needs: {escape(r.instructions)}</p>')
        if r.failing:
            out.append(_failing_table(r))
        else:
            out.append("<p>The specification is required, and no element of the model meets "
                       "its applicability.</p>")  # fmt: skip
        out.append("</article>")
    out.append(_plans(result, missing))
    out.append("</section>")
    return "".join(out)


# --- the BCF issues ---------------------------------------------------------------
def _uuid(*parts: str) -> str:
    return str(uuid.uuid5(_NAMESPACE, "|".join(parts)))


def _date(iso: str) -> XmlDateTime:
    import datetime as dt

    from xsdata.models.datatype import XmlDateTime

    try:
        stamp = dt.datetime.fromisoformat(iso)
    except ValueError:
        stamp = dt.datetime.now(dt.UTC)
    if stamp.tzinfo is None:
        stamp = stamp.replace(tzinfo=dt.UTC)
    return XmlDateTime.from_datetime(stamp)


def topic_description(r: RequirementResult) -> str:
    """What the specification asks, what to do, and the failing elements (the first few)."""
    listed = [
        f"{e.name or e.guid} ({e.ifc_class}, {e.storey or NO_STOREY}): {e.reason}"
        for e in r.failing[:DESCRIBED]
    ]
    more = [f"and {len(r.failing) - DESCRIBED} more"] if len(r.failing) > DESCRIBED else []
    head = f"{r.description} What the model needs: {r.instructions}".strip()
    checked = (
        f"Audited against {r.source} with ifctester."
        if r.checked_by == "ifctester"
        else "Checked by ifccheck itself (IDS 1.0 facets cannot express it)."
    )
    return "\n".join([head, checked, f"{_elements(len(r.failing))} fail:", *listed, *more])


def _camera(elements: Iterable[RequirementElement]) -> mdl.PerspectiveCamera | None:
    """A camera above the failing elements, looking down at their middle at about 40°."""
    import bcf.v2.model as mdl

    points = [p for e in elements for p in (e.start, e.end) if p is not None]
    if not points:
        return None
    lo = [min(p[i] for p in points) for i in range(3)]
    hi = [max(p[i] for p in points) for i in range(3)]
    mid = [(a + b) / 2 for a, b in zip(lo, hi, strict=True)]
    extent = max(math.dist(lo, hi), 6.0)
    raw = (-0.45, -0.45, 0.77)  # back, aside and up
    offset = [c / math.sqrt(sum(v * v for v in raw)) for c in raw]
    pos = [m + 1.2 * extent * o for m, o in zip(mid, offset, strict=True)]
    d = [-o for o in offset]
    up_raw = [-(d[2] * d[0]), -(d[2] * d[1]), 1.0 - d[2] * d[2]]  # z less its part along d
    n = math.sqrt(sum(c * c for c in up_raw))
    up = [c / n for c in up_raw]
    return mdl.PerspectiveCamera(
        camera_view_point=mdl.Point(x=pos[0], y=pos[1], z=pos[2]),
        camera_direction=mdl.Direction(x=d[0], y=d[1], z=d[2]),
        camera_up_vector=mdl.Direction(x=up[0], y=up[1], z=up[2]),
        field_of_view=60.0,
    )


def add_requirement_topics(bcf_file: BcfXml, result: CheckResult) -> int:
    """One BCF topic per unmet specification, its failing elements selected in one
    viewpoint; returns how many topics were added. Topic GUIDs follow the model and the
    specification, so a rerun gives the same topics."""
    import bcf.v2.model as mdl
    from bcf.v2.topic import TopicHandler
    from bcf.v2.visinfo import VisualizationInfoHandler

    added = 0
    model_file = result.model.file
    for r in unmet(result):
        if not r.failing:
            continue
        key = "|".join((result.model.sha256, "requirement", r.source, r.identifier or r.name))
        guid = _uuid("topic", key)
        topic = mdl.Topic(
            guid=guid,
            title=f"Model information: {r.name} ({_elements(len(r.failing))})",
            description=topic_description(r),
            creation_author=AUTHOR,
            creation_date=_date(result.checked_at),
            topic_type="Request",
            topic_status="Open",
            priority="Normal",
            labels=[AUTHOR, LABEL],
        )
        header = mdl.Header(
            file=[mdl.HeaderFile(filename=model_file, date=_date(result.checked_at),
                                 is_external=True)]
        )  # fmt: skip
        # share the file's XML handler, as the beam topics do (one per topic is slow)
        handler = TopicHandler(topic_dir=Path(guid), xml_handler=bcf_file._xml_handler)  # type: ignore[arg-type]
        handler.markup = mdl.Markup(header=header, topic=topic)
        bcf_file.topics[guid] = handler
        info = mdl.VisualizationInfo(
            guid=_uuid("viewpoint", key),
            components=mdl.Components(
                selection=mdl.ComponentSelection(
                    component=[
                        mdl.Component(ifc_guid=e.guid, originating_system=None)
                        for e in r.failing
                        if not e.guid.startswith("#")  # an entity without a GlobalId
                    ]
                ),
                visibility=mdl.ComponentVisibility(default_visibility=True),
            ),
            perspective_camera=_camera(r.failing),
        )
        viewpoint = VisualizationInfoHandler(info, xml_handler=bcf_file._xml_handler)  # type: ignore[arg-type]
        handler.add_visinfo_handler(viewpoint)
        added += 1
    return added


# --- the JSON results -------------------------------------------------------------
def requirement_dict(r: RequirementResult) -> dict[str, Any]:
    """One specification's audit in ``results.json`` (``requirements``)."""
    return {
        "identifier": r.identifier,
        "name": r.name,
        "description": r.description,
        "instructions": r.instructions,
        "source": r.source,
        "checked_by": r.checked_by,
        "met": r.met,
        "applicable": r.applicable,
        "passing": r.passing,
        "failing": len(r.failing),
        "failing_guids": r.failing_guids,
        "failures": [
            {
                "guid": e.guid,
                "name": e.name,
                "ifc_class": e.ifc_class,
                "storey": e.storey,
                "reason": e.reason,
            }
            for e in r.failing
        ],
    }
