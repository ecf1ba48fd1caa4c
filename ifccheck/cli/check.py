"""`ifccheck inspect`, `ifccheck check` and `ifccheck diff`: the model commands."""

from __future__ import annotations

import contextlib
import json
import sys
import time
from collections.abc import Iterator
from pathlib import Path
from typing import TYPE_CHECKING

import click

from ifccheck import CAUTION
from ifccheck.perf import timed
from ifccheck.report.display import DisplayUnits, utilisation_text
from ifccheck.units import UnitSystem

if TYPE_CHECKING:
    from ifccheck.config import Settings
    from ifccheck.model import Model
    from ifccheck.results import CheckResult


def _read(path: str, settings: Settings, length_unit: str | None) -> tuple[Model, float]:
    from ifccheck.ifc.reader import read_model

    t0 = time.perf_counter()
    steel = settings.steel
    model = read_model(
        path,
        default_grade=steel.default_grade,
        materials=steel.materials,
        length_unit=length_unit,
    )
    return model, time.perf_counter() - t0


def _length_unit(ctx: click.Context, param: click.Parameter, value: str | None) -> str | None:
    """--length-unit: a unit a model is read in ('mm', 'ft', 'metre'...), or None."""
    from ifccheck.errors import QuantityError, UsageError
    from ifccheck.units import model_length_unit

    if value is None:
        return None
    try:
        return model_length_unit(value)
    except QuantityError as exc:
        raise UsageError(f"--length-unit: {exc}") from None


length_unit_option = click.option(
    "--length-unit",
    callback=_length_unit,
    metavar="UNIT",
    help="Length unit of a model that assigns none (m, cm, mm, ft, in). Never used when the "
    "model assigns its own.",
)


@contextlib.contextmanager
def _out_dir(out_dir: str) -> Iterator[Path]:
    """The --out directory, created and tried for writing before the check runs; one
    this run created is removed again, if still empty, when the run stops on an error."""
    import tempfile

    from ifccheck.errors import UsageError

    path = Path(out_dir)
    existed = path.exists()
    try:
        path.mkdir(parents=True, exist_ok=True)
        with tempfile.NamedTemporaryFile(dir=path, prefix=".ifccheck-probe-"):
            pass
    except OSError as exc:
        raise UsageError(f"--out {path}: cannot write there ({exc.strerror or exc})") from None
    try:
        yield path
    except Exception:
        if not existed:
            with contextlib.suppress(OSError):
                path.rmdir()  # only if empty
        raise


def _written(write, out_dir: Path):
    """Run an output writer; a failure to write (disk full, permissions) is one line."""
    from ifccheck.errors import UsageError

    try:
        return write()
    except OSError as exc:
        where = exc.filename or out_dir
        raise UsageError(f"--out {out_dir}: cannot write {where} ({exc.strerror or exc})") from None


@click.command()
@click.argument("model_path", metavar="MODEL", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Write a JSON document to stdout.")
@click.option(
    "--config",
    type=click.Path(exists=True, dir_okay=False),
    help="Settings file (TOML): default grade, tolerances, loads.",
)
@click.option("--read-only", is_flag=True,
              help="Only read the model: skip the framing graph and the demand.")  # fmt: skip
@length_unit_option
def inspect(
    model_path: str, as_json: bool, config: str | None, read_only: bool, length_unit: str | None
) -> None:
    """Show what was read from MODEL and what the framing and loads make of it."""
    from ifccheck.floors import prepare_floors
    from ifccheck.framing import analyse_framing
    from ifccheck.loads.demand import compute_demand
    from ifccheck.report.inspect import inspect_document, inspect_text

    settings = _settings(config, None)
    model, seconds = _read(model_path, settings, length_unit)
    framing = demand = None
    if not read_only:
        prepare_floors(model, settings)
        framing = analyse_framing(model, settings.framing, settings.bracing)
        demand = compute_demand(model, framing, settings)
    if as_json:
        document = inspect_document(model, seconds, framing, demand)
        click.echo(json.dumps(document, indent=1, allow_nan=False))
    else:
        click.echo(
            inspect_text(model, seconds, DisplayUnits.for_model(model.length_unit), framing, demand)
        )


def _settings(config: str | None, method: str | None):
    from ifccheck.check import standard_of
    from ifccheck.config import load_settings

    settings = load_settings(Path(config) if config else None)
    if method:
        settings.design.method = method.upper()
    standard_of(settings)  # an unknown design standard is bad settings, for every command
    return settings


def _progress():
    """A progress callback drawing a bar on a terminal, None when not a TTY."""
    if not sys.stderr.isatty():
        return None
    state: dict[str, object] = {}

    def update(done: int, total: int) -> None:
        bar = state.get("bar")
        if bar is None:
            bar = click.progressbar(length=total, label="checking beams", file=sys.stderr)
            bar.__enter__()
            state["bar"] = bar
        bar.update(done - bar.pos)  # type: ignore[attr-defined]
        if done >= total:
            bar.__exit__(None, None, None)  # type: ignore[attr-defined]

    return update


def _units(units: str | None, length_unit: str) -> UnitSystem:
    return DisplayUnits.for_model(length_unit, units).system


LISTED = 10  # failing and not-checked beams named in the summary, then "and N more"


def _summary_line(result: CheckResult, units: UnitSystem) -> str:
    """The count line, and what the model-information audit found."""
    from ifccheck.report.requirements import summary_clause

    return _count_line(result, units) + summary_clause(result)


def _count_line(result: CheckResult, units: UnitSystem) -> str:
    """The count line; where every beam passes, the most highly utilised one."""
    s = result.summary()
    line = (
        f"{result.model.file}: {s['total']} beams checked to {result.standard} "
        f"{result.method}: {s['pass']} pass, {s['fail']} fail, {s['not_checked']} not checked"
    )
    if s["fail"]:
        strength = sum(1 for b in result.beams if "strength" in b.fails_on)
        service = sum(1 for b in result.beams if "serviceability" in b.fails_on)
        line += f" ({strength} on strength, {service} on serviceability)"
    if s["fail"] or s["not_checked"]:
        return line
    worst = max(
        (b for b in result.beams if b.utilisation is not None),
        key=lambda b: b.utilisation or 0.0,
        default=None,
    )
    if worst is not None:
        line += f"; highest utilisation: {_beam_words(worst, DisplayUnits(units))}"
    return line


def _stage_lines(result: CheckResult) -> list[str]:
    """One line per stage beyond the in-service one (the construction stage)."""
    out = []
    for st in result.stages[1:]:
        bracing = "deck attached" if st.slab_bracing else "deck not attached, no slab bracing"
        n = st.summary
        out.append(
            f"{st.title} stage on {', '.join(st.levels) or 'no level'} ({bracing}): "
            f"{n.get('total', 0)} beams checked, {n.get('pass', 0)} pass, {n.get('fail', 0)} "
            f"fail; it governs {n.get('governing', 0)}"
        )
    return out


def _check_keys_over_revisions(settings, old_model, new_model) -> None:
    """One settings file serves both revisions: a key must name something in at least
    one of them (else exit 2), and one that names something in only one is a warning."""
    from ifccheck.errors import SettingsError
    from ifccheck.floors import unmatched_keys

    old = dict(unmatched_keys(old_model, settings))
    new = dict(unmatched_keys(new_model, settings))
    both = [k for k in new if k in old]
    if both:
        raise SettingsError(
            f"settings: {both[0]} names nothing in either revision; nearest {new[both[0]]}"
        )
    for key in sorted(set(old) ^ set(new)):
        where = new_model.source if key in new else old_model.source
        click.echo(f"warning: settings {key} names nothing in {where}", err=True)


def _beam_words(b, du: DisplayUnits, stage: str | None = None) -> str:
    """'L2-B2-20 (Level 2, W21X44): utilisation 1.11, elastic lateral-torsional buckling
    over Lb = 15.00 ft', in ``stage`` (default: the governing one)."""
    from ifccheck.report.wording import CHECK_WORDS, lb_text, limit_state_words

    st = b.stage_result(stage or b.stage) if b.stages else None
    utilisation = st.utilisation if st is not None else b.utilisation
    limit = st.controlling_limit if st is not None else b.controlling_limit
    index = st.governing_segment if st is not None else b.governing_segment
    gov = b.segments[index] if index is not None and index < len(b.segments) else None
    head = f"{b.name or b.guid} ({', '.join(p for p in (b.storey, b.profile) if p)})"
    text = f"{head}: utilisation {utilisation_text(utilisation)}"
    if limit == "flexure" and gov is not None:
        text += f", {limit_state_words(gov.limit_state)} over Lb = {lb_text(gov, du)}"
    elif limit:
        text += f", {CHECK_WORDS.get(limit, limit)}"
    return text


def _fails_in(b, stage: str) -> bool:
    st = b.stage_result(stage) if b.stages else None
    return (
        st.outcome == "fail" if st is not None else (stage == "in_service" and b.outcome == "fail")
    )


def _attention_lines(result: CheckResult, du: DisplayUnits) -> list[str]:
    """The beams failing in service (worst first), the not-checked ones, then those that
    fail only during construction; up to LISTED."""
    from ifccheck.report.wording import name_guids

    def worst(stage: str):
        return lambda b: -((b.stage_result(stage) or b).utilisation or 0.0)

    fails = [b for b in result.beams if b.outcome == "fail"]
    in_service = sorted((b for b in fails if _fails_in(b, "in_service")), key=worst("in_service"))
    constr = sorted((b for b in fails if not _fails_in(b, "in_service")), key=worst("construction"))
    lines = []
    for b in in_service:
        line = f"  fail: {_beam_words(b, du, 'in_service')}"
        if _fails_in(b, "construction"):
            line += "; fails during construction too"
        lines.append(line)
    for b in (b for b in result.beams if b.outcome == "not_checked"):
        reason = name_guids(b.reason.text, result.names, False) if b.reason else "no reason"
        lines.append(f"  not checked: {b.name or b.guid} ({b.storey}): {reason}")
    lines += [f"  fail during construction: {_beam_words(b, du, 'construction')}" for b in constr]
    if len(lines) > LISTED:
        lines = [*lines[:LISTED], f"  and {len(lines) - LISTED} more (see the report)"]
    return lines


def _warning_lines(warnings, names) -> list[str]:
    """One line per warning, members by name and GUID."""
    from ifccheck.report.wording import member_ref, name_guids

    out = []
    for guid, message in warnings:
        who = f"{member_ref(guid, names)}: " if guid else ""
        out.append(f"warning: {who}{name_guids(message, names, with_guid=False)}")
    return out


def _output_options(command):
    """--out, --units, --method and --length-unit, shared by check and diff."""
    for option in reversed(
        [
            length_unit_option,
            click.option(
                "--out",
                "out_dir",
                default="ifccheck-results",
                show_default=True,
                type=click.Path(file_okay=False),
                help="Directory for the outputs.",
            ),
            click.option(
                "--units",
                type=click.Choice(["si", "imperial"]),
                help="Units of the CSV and report (default: the model's unit system).",
            ),
            click.option(
                "--method",
                type=click.Choice(["LRFD", "ASD"], case_sensitive=False),
                help="Design method (overrides the settings file).",
            ),
        ]
    ):
        command = option(command)
    return command


@click.command()
@click.argument("model_path", metavar="MODEL", type=click.Path(dir_okay=False))
@click.option(
    "--config",
    type=click.Path(exists=True, dir_okay=False),
    help="Settings file (TOML); documented defaults without one.",
)
@click.option(
    "--demands",
    type=click.Path(exists=True, dir_okay=False),
    help="CSV of GUID, moment (and shear) from an analysis, overriding computed demand.",
)
@click.option(
    "--no-requirements",
    is_flag=True,
    help="Do not audit the model against the tool's information requirements.",
)
@click.option("--ids", "ids_files", multiple=True, type=click.Path(dir_okay=False),
              help="Audit the model against this IDS file too (repeatable); with "
              "--no-requirements, instead.")  # fmt: skip
@_output_options
def check(
    model_path, config, demands, no_requirements, ids_files, length_unit, out_dir, units, method
) -> None:
    """Check every beam of MODEL and write the results to --out.

    The model is audited first against the information the check needs
    (`ifccheck requirements`). Exit code 0 when every beam passes, 1 when any
    fails or cannot be checked.
    """
    from ifccheck.check import run_check
    from ifccheck.report import write_all
    from ifccheck.report.basis import defaults_line

    settings = _settings(config, method)
    with _out_dir(out_dir) as out:
        result, model, _ = run_check(
            model_path, settings, demands, _progress(), requirements=not no_requirements,
            project_ids=ids_files, length_unit=length_unit,
        )  # fmt: skip
        chosen = _units(units, model.length_unit)
        with timed("outputs"):
            written = _written(lambda: write_all(result, Path(model_path), out, chosen), out)
    for line in _warning_lines(result.warnings, result.names):
        click.echo(line, err=True)
    du = DisplayUnits(chosen)
    defaults = defaults_line(result, du)
    if defaults:
        click.echo(f"note: {defaults}", err=True)
    click.echo(_summary_line(result, chosen))
    for line in [*_stage_lines(result), *_attention_lines(result, du)]:
        click.echo(line)
    files = ", ".join(p.name for p in written.values())
    click.echo(f"results written to {Path(out_dir)}: {files}")
    click.echo(CAUTION)
    s = result.summary()
    sys.exit(1 if s["fail"] or s["not_checked"] else 0)


@click.command()
@click.argument("old_path", metavar="OLD", type=click.Path(dir_okay=False))
@click.argument("new_path", metavar="NEW", type=click.Path(dir_okay=False))
@click.option(
    "--config",
    type=click.Path(exists=True, dir_okay=False),
    help="Settings file (TOML) used for both revisions.",
)
@_output_options
def diff(old_path, new_path, config, length_unit, out_dir, units, method) -> None:
    """Compare two revisions: which beams lost bracing or support, or got worse.

    Exit code 1 when any beam was weakened, 0 when none was.
    """
    from ifccheck.check import run_check
    from ifccheck.diff import diff_results
    from ifccheck.report import write_diff_all
    from ifccheck.report.wording import change_reasons, diff_names

    settings = _settings(config, method)
    with _out_dir(out_dir) as out:
        old, old_model, _ = run_check(
            old_path, settings, strict_keys=False, length_unit=length_unit
        )
        new, model, _ = run_check(new_path, settings, strict_keys=False, length_unit=length_unit)
        _check_keys_over_revisions(settings, old_model, model)
        chosen = _units(units, model.length_unit)
        result = diff_results(old, new)
        written = _written(lambda: write_diff_all(result, out, chosen), out)
    weakened = result.weakened
    if old.beams and new.beams and not result.matched:
        click.echo(
            f"warning: {old.model.file} and {new.model.file} share no beams (by GUID or by "
            "position): they are probably not revisions of one model",
            err=True,
        )
    click.echo(
        f"{old.model.file} → {new.model.file}: {result.matched} beams matched, "
        f"{len(result.added)} added, {len(result.removed)} removed; "
        f"{len(weakened)} weakened"
    )
    du, names = DisplayUnits(chosen), diff_names(result)
    beams = {b.guid: b for b in new.beams}
    for c in sorted(result.changes, key=lambda c: (c.change != "weakened", c.storey, c.name)):
        if c.change == "strengthened":
            continue
        reasons = "; ".join(change_reasons(c, du, names, beams.get(c.guid)))
        click.echo(f"  {c.change}: {c.name or c.guid} ({c.storey}): {reasons}")
    olds = {b.guid: b for b in old.beams}
    for label, guids, where in (("removed", result.removed, olds), ("added", result.added, beams)):
        for g in guids:
            b = where.get(g)
            what = ", ".join(p for p in ((b.storey, b.profile) if b else ()) if p)
            click.echo(f"  {label}: {(b.name if b else '') or g}" + (f" ({what})" if what else ""))
    files = ", ".join(p.name for p in written.values())
    click.echo(f"diff written to {Path(out_dir)}: {files}")
    click.echo(CAUTION)
    sys.exit(1 if weakened else 0)
