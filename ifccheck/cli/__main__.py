"""`python -m ifccheck.cli …`, the same as the `ifccheck` command."""

from ifccheck.cli import main

main(prog_name="ifccheck")
