"""`python -m ifccheck.service ...`: the `serve` and `token` commands without the main CLI."""

from __future__ import annotations

import click

from ifccheck.service_cli import serve, token


@click.group(context_settings={"help_option_names": ["-h", "--help"]})
def main() -> None:
    """ifccheck HTTP service."""


main.add_command(serve)
main.add_command(token)

if __name__ == "__main__":
    main(prog_name="python -m ifccheck.service")
