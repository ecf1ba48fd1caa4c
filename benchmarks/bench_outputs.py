"""Time every output writer on a result of many beams.

    python benchmarks/bench_outputs.py [--beams 10000]

Prints seconds per writer and beams per second; the BCF writer is timed on
the failing and not-checked beams only, as `check` writes it.
"""

from __future__ import annotations

import argparse
import sys
import tempfile
import time
from dataclasses import replace
from pathlib import Path

import ifcopenshell.guid

sys.path.insert(0, str(Path(__file__).parents[1] / "tests"))

import result_fixtures as rf

from ifccheck.ifc.author import ModelAuthor
from ifccheck.ifc.writeback import write_checked_ifc
from ifccheck.report import (
    write_beams_csv,
    write_issues_bcf,
    write_report_html,
    write_results_json,
)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--beams", type=int, default=10_000)
    n = parser.parse_args().beams
    result = rf.many_beams(n)
    with tempfile.TemporaryDirectory() as tmp:
        out = Path(tmp)
        a = ModelAuthor("IFC4", "foot")
        a.storey("Level 1", 0.0)
        beams = [
            a.f.create_entity("IfcBeam", GlobalId=ifcopenshell.guid.new(), Name=f"B{i}")
            for i in range(len(result.beams))
        ]
        source = a.write(out / "big.ifc")
        result.beams = [
            replace(b, guid=e.GlobalId) for b, e in zip(result.beams, beams, strict=True)
        ]
        writers = {
            "results.json": lambda: write_results_json(result, out / "r.json"),
            "beams.csv": lambda: write_beams_csv(result, out / "b.csv", "si"),
            "report.html": lambda: write_report_html(result, out / "r.html", "si"),
            "checked.ifc": lambda: write_checked_ifc(source, result, out / "c.ifc"),
            "issues.bcf": lambda: write_issues_bcf(result, out / "i.bcf"),
        }
        for name, write in writers.items():
            t = time.perf_counter()
            path = write()
            dt = time.perf_counter() - t
            mb = path.stat().st_size / 1e6
            print(f"{name:13s} {dt:6.2f} s  {len(result.beams) / dt:9.0f} beams/s  {mb:7.1f} MB")


if __name__ == "__main__":
    main()
