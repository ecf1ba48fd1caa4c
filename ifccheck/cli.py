"""Command-line interface.

Exit codes: 0 all checked beams pass, 1 at least one fails (or regresses in
a diff), 2 bad input or usage, 3 internal error. Messages are one line on
stderr; set IFCCHECK_DEBUG=1 to see a traceback of an internal error.
"""

from __future__ import annotations

import json
import os
import sys
import time

import click

from ifccheck import __version__

EXIT_BAD_INPUT = 2
EXIT_INTERNAL = 3


class InputError(click.ClickException):
    """Bad input: one line on stderr, exit code 2."""

    exit_code = EXIT_BAD_INPUT

    def show(self, file=None) -> None:
        click.echo(f"ifccheck: error: {self.format_message()}", err=True)


class _Group(click.Group):
    """Turns every failure into a one-line message and a defined exit code."""

    def main(self, *args, **kwargs):
        kwargs.setdefault("standalone_mode", True)
        try:
            return super().main(*args, **kwargs)
        except SystemExit:
            raise
        except Exception as exc:  # last line of defence: never a traceback
            if os.environ.get("IFCCHECK_DEBUG"):
                raise
            msg = str(exc).strip().splitlines()[0] if str(exc).strip() else ""
            click.echo(f"ifccheck: internal error: {type(exc).__name__}: {msg}", err=True)
            sys.exit(EXIT_INTERNAL)

    def invoke(self, ctx: click.Context):
        from ifccheck.ifc.reader import ModelError

        try:
            return super().invoke(ctx)
        except ModelError as exc:
            raise InputError(str(exc)) from None
        except click.UsageError as exc:
            exc.exit_code = EXIT_BAD_INPUT
            raise
        except (ValueError, OSError) as exc:
            if os.environ.get("IFCCHECK_DEBUG"):
                raise
            if type(exc).__name__ in ("SettingsError", "DemandFileError"):
                raise InputError(str(exc)) from None
            raise


@click.group(cls=_Group, context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(__version__, prog_name="ifccheck")
def main() -> None:
    """Check steel beams in IFC models for lateral-torsional buckling, with
    brace points inferred from the framing itself."""


def _read(path: str, default_grade: str = "A992"):
    from ifccheck.ifc.reader import read_model

    t0 = time.perf_counter()
    model = read_model(path, default_grade=default_grade)
    return model, time.perf_counter() - t0


@main.command()
@click.argument("model_path", metavar="MODEL", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Write a JSON document to stdout.")
@click.option("--grade", "default_grade", default="A992", show_default=True,
              help="Steel grade assumed where the model names none.")  # fmt: skip
def inspect(model_path: str, as_json: bool, default_grade: str) -> None:
    """Show what was read from MODEL: members, profiles, grades, slabs."""
    from ifccheck.report.inspect import inspect_document, inspect_text

    model, seconds = _read(model_path, default_grade)
    if as_json:
        click.echo(json.dumps(inspect_document(model, seconds), indent=1))
    else:
        click.echo(inspect_text(model, seconds, model.imperial))


def _register_optional() -> None:
    """Commands from stage packages, registered when present."""
    try:
        from ifccheck.strength_cli import strength
    except ImportError:
        return
    main.add_command(strength)


_register_optional()


if __name__ == "__main__":  # pragma: no cover
    main(prog_name="ifccheck")
