"""`python -m ifccheck.service serve|token …`: the service's commands of the main CLI."""

from __future__ import annotations

from ifccheck.cli import main

if __name__ == "__main__":
    main(prog_name="python -m ifccheck.service")
