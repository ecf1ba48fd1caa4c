"""`ifccheck inspect`, `ifccheck check` and `ifccheck diff`: the model commands."""

from __future__ import annotations

import json
import sys
import time
from pathlib import Path
from typing import TYPE_CHECKING

import click

from ifccheck import CAUTION
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


def _out_dir(out_dir: str) -> Path:
    """The --out directory, created and tried for writing before the check runs."""
    import tempfile

    from ifccheck.errors import UsageError

    path = Path(out_dir)
    try:
        path.mkdir(parents=True, exist_ok=True)
        with tempfile.NamedTemporaryFile(dir=path, prefix=".ifccheck-probe-"):
            pass
    except OSError as exc:
        raise UsageError(f"--out {path}: cannot write there ({exc.strerror or exc})") from None
    return path


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


def _summary_line(result: CheckResult, units: UnitSystem) -> str:
    from ifccheck.units import format_length, format_moment

    s = result.summary()
    line = (
        f"{result.model.file}: {s['total']} beams checked to {result.standard} "
        f"{result.method}: {s['pass']} pass, {s['fail']} fail, {s['not_checked']} not checked"
    )
    worst = max(
        (b for b in result.beams if b.utilisation is not None),
        key=lambda b: b.utilisation or 0.0,
        default=None,
    )
    if worst is not None:
        u = utilisation_text(worst.utilisation)
        line += f"; highest utilisation {u} at {worst.name or worst.guid} ({worst.profile}"
        gov = worst.governing
        if worst.controlling_limit == "flexure" and gov is not None:
            line += (
                f", {gov.limit_state.replace('_', ' ')} over Lb = {format_length(gov.lb, units)}, "
                f"Mu = {format_moment(gov.moment_demand, units)}"
            )
        elif worst.controlling_limit:
            line += f", {worst.controlling_limit}"
        line += ")"
    return line


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
@_output_options
def check(model_path, config, demands, length_unit, out_dir, units, method) -> None:
    """Check every beam of MODEL and write the results to --out.

    Exit code 0 when every beam passes, 1 when any fails or cannot be checked.
    """
    from ifccheck.check import run_check
    from ifccheck.report import write_all

    settings = _settings(config, method)
    out = _out_dir(out_dir)
    result, model, _ = run_check(
        model_path, settings, demands, _progress(), length_unit=length_unit
    )
    chosen = _units(units, model.length_unit)
    written = _written(lambda: write_all(result, Path(model_path), out, chosen), out)
    names = {m.guid: m.name or m.guid for m in [*model.members, *model.unreadable]}
    for guid, message in result.warnings:
        who = names.get(guid, guid)
        click.echo(f"warning: {who}: {message}" if who else f"warning: {message}", err=True)
    click.echo(_summary_line(result, chosen))
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
    out = _out_dir(out_dir)
    old, old_model, _ = run_check(old_path, settings, strict_keys=False, length_unit=length_unit)
    new, model, _ = run_check(new_path, settings, strict_keys=False, length_unit=length_unit)
    _check_keys_over_revisions(settings, old_model, model)
    chosen = _units(units, model.length_unit)
    result = diff_results(old, new)
    written = _written(lambda: write_diff_all(result, out, chosen), out)
    weakened = result.weakened
    click.echo(
        f"{old.model.file} → {new.model.file}: {result.matched} beams matched, "
        f"{len(result.added)} added, {len(result.removed)} removed; "
        f"{len(weakened)} weakened"
    )
    du, names = DisplayUnits(chosen), diff_names(result)
    for c in weakened:
        click.echo(f"  {c.name or c.guid} ({c.storey}): " + "; ".join(change_reasons(c, du, names)))
    for c in result.changes:
        if c.change == "changed":
            click.echo(f"warning: {c.name or c.guid}: " + "; ".join(change_reasons(c, du, names)),
                       err=True)  # fmt: skip
    files = ", ".join(p.name for p in written.values())
    click.echo(f"diff written to {Path(out_dir)}: {files}")
    click.echo(CAUTION)
    sys.exit(1 if weakened else 0)
