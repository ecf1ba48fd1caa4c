"""`ifccheck requirements`: the information the check needs, as an IDS file for the
modelling team."""

from __future__ import annotations

from pathlib import Path

import click


@click.command()
@click.option(
    "--out",
    "out_path",
    default="ifccheck.ids",
    show_default=True,
    type=click.Path(dir_okay=False),
    help="The IDS file to write.",
)
@click.option(
    "--config",
    type=click.Path(exists=True, dir_okay=False),
    help="Settings file (TOML): [requirements] switches and grades, [steel.materials] names.",
)
def requirements(out_path: str, config: str | None) -> None:
    """Write what a beam needs in the model to be checked, as an IDS 1.0 file.

    The modelling team can audit their models against it in their own tools;
    `ifccheck check` audits every model against it before the beams. What IDS 1.0
    facets cannot express, ifccheck checks itself and lists here.
    """
    from ifccheck.config import load_settings
    from ifccheck.ifc.requirements import enabled, write_ids

    settings = load_settings(Path(config) if config else None)
    path, document = write_ids(out_path, settings.requirements, settings.steel.materials.keys())
    specs = document.specifications
    click.echo(
        f"{path}: {len(specs)} specification{'s' if len(specs) != 1 else ''} "
        "(IDS 1.0, valid against the IDS schema ifctester ships)"
    )
    for spec in specs:
        click.echo(f"  {spec.name} [{' '.join(spec.ifcVersion)}]")
    own = [r for r in enabled(settings.requirements) if r.checked_by == "ifccheck"]
    if own:
        click.echo("checked by ifccheck itself (IDS 1.0 facets cannot express them):")
        for r in own:
            click.echo(f"  {r.name}")
