"""BCF 2.1 issues for the modelling team: ``<stem>.issues.bcf`` and ``diff.bcf``.

Written with the ``bcf-client`` package (import name ``bcf``). One topic per
failing or not-checked beam (per weakened beam in a diff), with the beam
selected in its viewpoint and a perspective camera looking down at the
beam's midpoint at an angle. BCF coordinates are metres in the model's
coordinate system, which is what the results carry. Topic and viewpoint
GUIDs are derived from the model and the beam, so a rerun on the same model
gives the same topics.
"""

from __future__ import annotations

import datetime as dt
import math
import uuid
from collections.abc import Sequence
from pathlib import Path

import bcf.v2.model as mdl
from bcf.v2.bcfxml import BcfXml
from bcf.v2.topic import TopicHandler
from bcf.v2.visinfo import VisualizationInfoHandler
from xsdata.models.datatype import XmlDateTime

from ifccheck.atomic import atomic_path
from ifccheck.report.bcf_xml import FastXmlHandler
from ifccheck.report.display import DisplayUnits
from ifccheck.report.requirements import add_requirement_topics
from ifccheck.report.wording import (
    beam_issue_description,
    beam_issue_title,
    change_description,
    change_title,
    diff_names,
    limit_state_words,
    segment_midpoint,
)
from ifccheck.results import BeamChange, BeamResult, CheckResult, DiffResult

AUTHOR = "ifccheck"
_NAMESPACE = uuid.UUID("0b9a6c1e-54f7-4d0e-8a43-7c2f1d9e6b25")
Vec = tuple[float, float, float]


def _uuid(*parts: str) -> str:
    return str(uuid.uuid5(_NAMESPACE, "|".join(parts)))


def _date(iso: str) -> XmlDateTime:
    try:
        stamp = dt.datetime.fromisoformat(iso)
    except ValueError:
        stamp = dt.datetime.now(dt.UTC)
    if stamp.tzinfo is None:
        stamp = stamp.replace(tzinfo=dt.UTC)
    return XmlDateTime.from_datetime(stamp)


def _unit(v: Sequence[float]) -> Vec:
    n = math.sqrt(sum(c * c for c in v)) or 1.0
    return (v[0] / n, v[1] / n, v[2] / n)


def camera_for(start: Sequence[float], end: Sequence[float]) -> tuple[Vec, Vec, Vec]:
    """(position, direction, up) of a camera looking at the beam's midpoint from above.

    The camera stands off to one side of the beam in plan and above it, looking
    down at about 40°, far enough back that the whole beam is in a 60° view.
    """
    mid = tuple((a + b) / 2 for a, b in zip(start, end, strict=True))
    length = math.dist(start, end)
    along = _unit((end[0] - start[0], end[1] - start[1], 0.0))
    if along == (0.0, 0.0, 0.0) or abs(along[0]) + abs(along[1]) < 1e-9:
        along = (1.0, 0.0, 0.0)  # a vertical member: any side will do
    side = (-along[1], along[0], 0.0)
    distance = max(1.2 * length, 6.0)
    offset = _unit((side[0] - 0.3 * along[0], side[1] - 0.3 * along[1], 0.85))
    pos = tuple(m + distance * o for m, o in zip(mid, offset, strict=True))
    direction = _unit(tuple(m - p for m, p in zip(mid, pos, strict=True)))
    z = (0.0, 0.0, 1.0)
    dz = sum(a * b for a, b in zip(z, direction, strict=True))
    up = _unit(tuple(zc - dz * dc for zc, dc in zip(z, direction, strict=True)))
    return pos, direction, up  # type: ignore[return-value]


def _point(p: Sequence[float]) -> mdl.Point:
    return mdl.Point(x=float(p[0]), y=float(p[1]), z=float(p[2]))


def _direction(d: Sequence[float]) -> mdl.Direction:
    return mdl.Direction(x=float(d[0]), y=float(d[1]), z=float(d[2]))


def _at(b: BeamResult, station: float) -> Vec:
    t = station / b.length if b.length else 0.0
    return tuple(s + t * (e - s) for s, e in zip(b.start, b.end, strict=True))  # type: ignore[return-value]


def _viewpoint(
    b: BeamResult, key: str, xml_handler, lines: Sequence[tuple[Vec, Vec]] = ()
) -> VisualizationInfoHandler:
    placed = all(math.isfinite(v) for v in (*b.start, *b.end))  # NaN: position unknown
    pos, direction, up = camera_for(b.start, b.end) if placed else ((0.0,) * 3,) * 3
    info = mdl.VisualizationInfo(
        guid=_uuid("viewpoint", key),
        components=mdl.Components(
            selection=mdl.ComponentSelection(
                # the element's own GlobalId: a shared one is keyed "GUID:2" in the results
                component=[mdl.Component(ifc_guid=b.guid.split(":")[0], originating_system=None)]
            ),
            visibility=mdl.ComponentVisibility(default_visibility=True),
        ),
        perspective_camera=mdl.PerspectiveCamera(
            camera_view_point=_point(pos),
            camera_direction=_direction(direction),
            camera_up_vector=_direction(up),
            field_of_view=60.0,
        )
        if placed
        else None,
        lines=(
            mdl.VisualizationInfoLines(
                line=[mdl.Line(start_point=_point(a), end_point=_point(c)) for a, c in lines]
            )
            if lines
            else None
        ),
    )
    return VisualizationInfoHandler(info, xml_handler=xml_handler)


def selection_viewpoint(
    guids: Sequence[str], key: str, xml_handler, around: Sequence[BeamResult]
) -> VisualizationInfoHandler:
    """A viewpoint with many elements selected, looking at the model from above a corner."""
    pts = [p for b in around for p in (b.start, b.end)] or [(0.0, 0.0, 0.0)]
    lo = [min(p[i] for p in pts) for i in range(3)]
    hi = [max(p[i] for p in pts) for i in range(3)]
    centre = [(a + b) / 2 for a, b in zip(lo, hi, strict=True)]
    reach = max(max(b - a for a, b in zip(lo, hi, strict=True)), 1.0)
    pos = (centre[0] - reach, centre[1] - reach, centre[2] + reach)
    direction = _unit([centre[i] - pos[i] for i in range(3)])
    up = _unit([-direction[0] * direction[2], -direction[1] * direction[2],
                1 - direction[2] ** 2])  # fmt: skip
    info = mdl.VisualizationInfo(
        guid=_uuid("viewpoint", key),
        components=mdl.Components(
            selection=mdl.ComponentSelection(
                component=[mdl.Component(ifc_guid=g, originating_system=None) for g in guids]
            ),
            visibility=mdl.ComponentVisibility(default_visibility=True),
        ),
        perspective_camera=mdl.PerspectiveCamera(
            camera_view_point=_point(pos), camera_direction=_direction(direction),
            camera_up_vector=_direction(up), field_of_view=60.0,
        ),
    )  # fmt: skip
    return VisualizationInfoHandler(info, xml_handler=xml_handler)


def _topic(
    bcf_file: BcfXml, key: str, title: str, description: str, created: str,
    topic_type: str, labels: list[str], priority: str, model_file: str,
) -> TopicHandler:  # fmt: skip
    guid = _uuid("topic", key)
    topic = mdl.Topic(
        guid=guid,
        title=title,
        description=description,
        creation_author=AUTHOR,
        creation_date=_date(created),
        topic_type=topic_type,
        topic_status="Open",
        priority=priority,
        labels=labels,
    )
    header = mdl.Header(
        file=[mdl.HeaderFile(filename=model_file, date=_date(created), is_external=True)]
    )
    # share the file's XML handler: a fresh one per topic rebuilds xsdata's class metadata
    handler = TopicHandler(topic_dir=Path(guid), xml_handler=bcf_file._xml_handler)  # type: ignore[arg-type]
    handler.markup = mdl.Markup(header=header, topic=topic)
    # the package's add_topic draws a random GUID; ours is stable, so register it directly
    bcf_file.topics[guid] = handler
    return handler


def _new_bcf(project: str) -> BcfXml:
    # bcf-client's data model, written by a planned serializer (xsdata's output, faster)
    bcf_file = BcfXml.create_new(project, xml_handler=FastXmlHandler())
    info = bcf_file.project_info
    assert info is not None and info.project is not None  # create_new makes both
    info.project.project_id = _uuid("project", project)
    return bcf_file


def _save(bcf_file: BcfXml, path: Path) -> Path:
    with atomic_path(path) as tmp:
        bcf_file.save(tmp)
    bcf_file.close()
    return Path(path)


def _units(result: CheckResult, units: str | None) -> DisplayUnits:
    return DisplayUnits.for_model(result.model.length_unit, units)


def issue_beams(result: CheckResult) -> list[BeamResult]:
    """The beams that get a topic: failing ones (worst first), then not-checked ones."""
    fails = sorted(
        (b for b in result.beams if b.outcome == "fail"), key=lambda b: -(b.utilisation or 0.0)
    )
    return fails + [b for b in result.beams if b.outcome == "not_checked"]


def write_issues_bcf(result: CheckResult, path: Path, units: str | None = None) -> Path:
    """Write ``<stem>.issues.bcf``: a topic per failing or not-checked beam.

    ``units`` ("si" / "imperial") sets the units of the descriptions; by default
    they follow the model's length unit.
    """
    du = _units(result, units)
    bcf_file = _new_bcf(result.model.file)
    for b in issue_beams(result):
        key = f"{result.model.sha256}|{b.guid}|{b.outcome}"
        labels = [AUTHOR, b.outcome.replace("_", " ")]
        seg = b.governing
        lines: list[tuple[Vec, Vec]] = []
        if b.outcome == "fail":
            if seg is not None and b.controlling_limit == "flexure":
                labels.append(limit_state_words(seg.limit_state))
                lines.append((_at(b, seg.start), _at(b, seg.end)))
                e = b.explanation
                stations = [x.station for x in e.braces] if e is not None and e.braces else []
                for station in stations or [segment_midpoint(seg)]:
                    at = _at(b, station)
                    lines.append((at, (at[0], at[1], at[2] + 1.0)))  # a brace goes here
            elif b.controlling_limit:
                labels.append(b.controlling_limit)
        handler = _topic(
            bcf_file, key, beam_issue_title(b), beam_issue_description(b, du, result.names),
            result.checked_at,
            "Error" if b.outcome == "fail" else "Request",
            labels, "High" if b.outcome == "fail" else "Normal", result.model.file,
        )  # fmt: skip
        handler.add_visinfo_handler(_viewpoint(b, key, bcf_file._xml_handler, lines))
    _excluded_topic(bcf_file, result)
    add_requirement_topics(bcf_file, result)  # one topic per unmet model information requirement
    return _save(bcf_file, path)


def _excluded_topic(bcf_file: BcfXml, result: CheckResult) -> None:
    """One topic for every element written as a beam, column or member that braces and
    supports nothing (hardware, members of unknown section, stubs), all selected."""
    guids = sorted({g for gs in result.excluded.values() for g in gs})
    if not guids:
        return
    key = f"{result.model.sha256}|excluded"
    counts = ", ".join(f"{len(v)} {k}" for k, v in result.excluded.items())
    description = (
        f"These {len(guids)} elements are modelled as beams, columns or members but brace and "
        f"support nothing in the check ({counts}): hardware, pieces shorter than the member "
        "they touch, or members whose section could not be read. Model fasteners as "
        "IfcMechanicalFastener and plates as IfcPlate, or give structural members a readable "
        "profile."
    )
    handler = _topic(
        bcf_file, key, f"{len(guids)} elements brace and support nothing", description,
        result.checked_at, "Request", [AUTHOR, "not structural"], "Normal", result.model.file,
    )  # fmt: skip
    handler.add_visinfo_handler(
        selection_viewpoint(guids, key, bcf_file._xml_handler, result.beams)
    )


def write_diff_bcf(diff: DiffResult, path: Path, units: str | None = None) -> Path:
    """Write ``diff.bcf``: a topic per weakened beam, aimed at the beam in the new revision."""
    du = _units(diff.new, units)
    names = diff_names(diff)
    new_beams = {b.guid: b for b in diff.new.beams}
    bcf_file = _new_bcf(diff.new.model.file)
    weakened: list[BeamChange] = sorted(
        diff.weakened, key=lambda c: -((c.utilisation_after or 0.0) - (c.utilisation_before or 0.0))
    )
    for c in weakened:
        key = f"{diff.old.model.sha256}|{diff.new.model.sha256}|{c.guid}"
        labels = [AUTHOR, "weakened"]
        if c.lost_brace_points:
            labels.append("lost brace point")
        if c.lost_supports:
            labels.append("lost support")
        handler = _topic(
            bcf_file, key, change_title(c),
            change_description(c, du, names, new_beams.get(c.guid)), diff.new.checked_at,
            "Error", labels, "High", diff.new.model.file,
        )  # fmt: skip
        b = new_beams.get(c.guid)
        if b is None:
            continue
        # a short vertical line at each lost brace point
        lines = []
        for s in c.lost_brace_points:
            p = _at(b, s)
            lines.append((p, (p[0], p[1], p[2] + 1.0)))
        handler.add_visinfo_handler(_viewpoint(b, key, bcf_file._xml_handler, lines))
    return _save(bcf_file, path)
