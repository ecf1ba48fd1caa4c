"""Command-line interface: ``ifccheck check | diff | inspect | strength | requirements |
serve | token``.

Exit codes: 0 every checked beam passes, 1 a beam fails or cannot be checked
(a weakened beam for ``diff``), 2 bad input or usage, 3 internal error. Every
message is one line on stderr (``ifccheck: error: …``); set IFCCHECK_DEBUG=1
to see the traceback of an internal error. Errors are mapped to exit codes
here, by class, and nowhere else.
"""

from __future__ import annotations

import os
import sys
from typing import Any, NoReturn

import click

from ifccheck import __version__
from ifccheck.errors import InputError, OutOfScope, one_line

EXIT_FAIL = 1
EXIT_BAD_INPUT = 2
EXIT_INTERNAL = 3
# long user input is not echoed back in full
MESSAGE_LIMIT = 300


def error_line(message: str) -> str:
    """The one line printed for bad input or usage."""
    text = " ".join(message.split())
    if len(text) > MESSAGE_LIMIT:
        text = text[: MESSAGE_LIMIT - 1] + "…"
    return f"ifccheck: error: {text}"


def _exit_bad_input(message: str) -> NoReturn:
    click.echo(error_line(message), err=True)
    sys.exit(EXIT_BAD_INPUT)


def _usage_message(exc: click.UsageError) -> str:
    text = exc.format_message()
    if isinstance(exc, getattr(click.exceptions, "NoArgsIsHelpError", ())) or text.startswith(
        "Usage:"
    ):  # a group called without its command: name the commands, not the whole help
        group = exc.ctx.command if exc.ctx is not None else None
        names = sorted(getattr(group, "commands", {}) or {})
        text = "missing command" + (f" (one of {', '.join(names)})" if names else "")
        text += "; see --help"
    if exc.ctx is not None and exc.ctx.command_path:
        text = f"{exc.ctx.command_path}: {text}"
    return text


class CommandGroup(click.Group):
    """Turns every failure into one line and a defined exit code."""

    def main(self, *args: Any, **kwargs: Any) -> Any:
        kwargs["standalone_mode"] = False
        try:
            rv = super().main(*args, **kwargs)
        except click.exceptions.Exit as exc:
            sys.exit(exc.exit_code)
        except click.exceptions.Abort:
            _exit_bad_input("aborted")
        except click.UsageError as exc:
            _exit_bad_input(_usage_message(exc))
        except click.ClickException as exc:
            _exit_bad_input(exc.format_message())
        except (InputError, OutOfScope) as exc:
            _exit_bad_input(one_line(exc))
        except SystemExit:
            raise
        except Exception as exc:  # last line of defence: never a traceback
            if os.environ.get("IFCCHECK_DEBUG"):
                raise
            click.echo(f"ifccheck: internal error: {type(exc).__name__}: {one_line(exc)}",
                       err=True)  # fmt: skip
            sys.exit(EXIT_INTERNAL)
        sys.exit(rv if isinstance(rv, int) else 0)


@click.group(cls=CommandGroup, context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(__version__, prog_name="ifccheck")
def main() -> None:
    """Check steel beams in IFC models for lateral-torsional buckling, with
    brace points inferred from the framing itself."""


def _register() -> None:
    from ifccheck.cli.check import check, diff, inspect
    from ifccheck.cli.requirements import requirements
    from ifccheck.cli.serve import serve, token
    from ifccheck.cli.strength import strength

    for command in (inspect, check, diff, strength, requirements, serve, token):
        main.add_command(command)


_register()

__all__ = ["EXIT_BAD_INPUT", "EXIT_FAIL", "EXIT_INTERNAL", "error_line", "main"]
