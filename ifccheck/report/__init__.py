"""report stage: every output writer of `ifccheck check` and `ifccheck diff`.

Each writer writes one file atomically (temporary file + rename) and returns
its path; :func:`write_all` and :func:`write_diff_all` write the full set.
The writers are imported on first use (PEP 562), so importing a light module
of this package (e.g. ``ifccheck.report.inspect``) does not load bcf-client,
xsdata or ifcopenshell.
"""

from __future__ import annotations

import importlib
from pathlib import Path
from typing import TYPE_CHECKING, Any

from ifccheck.perf import timed

if TYPE_CHECKING:
    from ifccheck.results import CheckResult, DiffResult

_LAZY = {
    "results_document": "ifccheck.report.json_out",
    "diff_document": "ifccheck.report.json_out",
    "write_results_json": "ifccheck.report.json_out",
    "write_diff_json": "ifccheck.report.json_out",
    "write_beams_csv": "ifccheck.report.csv_out",
    "write_diff_csv": "ifccheck.report.csv_out",
    "write_issues_bcf": "ifccheck.report.bcf_out",
    "write_diff_bcf": "ifccheck.report.bcf_out",
    "write_report_html": "ifccheck.report.html_out",
    "write_diff_html": "ifccheck.report.html_out",
    "write_checked_ifc": "ifccheck.ifc.writeback",
}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        return getattr(importlib.import_module(_LAZY[name]), name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def output_paths(stem: str, out_dir: Path) -> dict[str, Path]:
    """Where :func:`write_all` puts each output of a model with file stem ``stem``."""
    out_dir = Path(out_dir)
    return {
        "json": out_dir / f"{stem}.results.json",
        "csv": out_dir / f"{stem}.beams.csv",
        "ifc": out_dir / f"{stem}.checked.ifc",
        "bcf": out_dir / f"{stem}.issues.bcf",
        "html": out_dir / f"{stem}.report.html",
    }


def diff_output_paths(out_dir: Path) -> dict[str, Path]:
    """Where :func:`write_diff_all` puts each output."""
    out_dir = Path(out_dir)
    return {
        "json": out_dir / "diff.json",
        "csv": out_dir / "diff.csv",
        "bcf": out_dir / "diff.bcf",
        "html": out_dir / "diff.html",
    }


def write_all(result: CheckResult, source_ifc: Path, out_dir: Path, units: str) -> dict[str, Path]:
    """Write the five outputs of a check into ``out_dir``; keys json, csv, ifc, bcf, html."""
    from ifccheck.ifc.writeback import write_checked_ifc
    from ifccheck.report.bcf_out import write_issues_bcf
    from ifccheck.report.csv_out import write_beams_csv
    from ifccheck.report.html_out import write_report_html
    from ifccheck.report.json_out import write_results_json
    from ifccheck.units import check_system

    check_system(units)
    source_ifc = Path(source_ifc)
    paths = output_paths(source_ifc.stem, out_dir)
    Path(out_dir).mkdir(parents=True, exist_ok=True)
    with timed("json"):
        write_results_json(result, paths["json"])
    with timed("csv"):
        write_beams_csv(result, paths["csv"], units)
    with timed("ifc"):
        write_checked_ifc(source_ifc, result, paths["ifc"])
    with timed("bcf"):
        write_issues_bcf(result, paths["bcf"], units)
    with timed("html"):
        write_report_html(result, paths["html"], units)
    return paths


def write_diff_all(diff: DiffResult, out_dir: Path, units: str) -> dict[str, Path]:
    """Write the four outputs of a revision comparison; keys json, csv, bcf, html."""
    from ifccheck.report.bcf_out import write_diff_bcf
    from ifccheck.report.csv_out import write_diff_csv
    from ifccheck.report.html_out import write_diff_html
    from ifccheck.report.json_out import write_diff_json
    from ifccheck.units import check_system

    check_system(units)
    paths = diff_output_paths(out_dir)
    Path(out_dir).mkdir(parents=True, exist_ok=True)
    write_diff_json(diff, paths["json"], units)
    write_diff_csv(diff, paths["csv"], units)
    write_diff_bcf(diff, paths["bcf"], units)
    write_diff_html(diff, paths["html"], units)
    return paths


__all__ = [
    "diff_document",
    "diff_output_paths",
    "output_paths",
    "results_document",
    "write_all",
    "write_beams_csv",
    "write_checked_ifc",
    "write_diff_all",
    "write_diff_bcf",
    "write_diff_csv",
    "write_diff_html",
    "write_diff_json",
    "write_issues_bcf",
    "write_report_html",
    "write_results_json",
]
