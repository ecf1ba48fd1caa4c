"""Time each pipeline stage on synthetic framed floors of growing size.

    python benchmarks/bench_stages.py                 # 1k and 10k members
    python benchmarks/bench_stages.py --sizes 1000 10000 50000

For each size: the time to read the IFC file, build the framing graph,
compute the demand and check every beam, members per second, and the growth
exponent log(t2/t1)/log(n2/n1) between consecutive sizes (1.0 is linear;
n log n shows as slightly above 1). The framing and demand stages are also
shown as a ratio of the reading time measured in the same run.
"""

from __future__ import annotations

import argparse
import itertools
import math
import tempfile
import time
from pathlib import Path

from ifccheck.check import check_beam
from ifccheck.config import settings_from_dict
from ifccheck.design import get_standard
from ifccheck.floors import prepare_floors
from ifccheck.framing import analyse_framing
from ifccheck.ifc.reader import read_model
from ifccheck.loads.demand import compute_demand
from ifccheck.model import MemberRole
from ifccheck.samples.synthetic import write_synthetic

STAGES = ("read", "framing", "demand", "check")


def run(n: int, folder: Path) -> dict[str, float]:
    path = write_synthetic(n, folder / f"synthetic-{n}.ifc")
    settings = settings_from_dict({"steel": {"default_grade": "A992"}})
    times: dict[str, float] = {}
    t = time.perf_counter()
    model = read_model(path, default_grade="A992")
    times["read"] = time.perf_counter() - t
    t = time.perf_counter()
    prepare_floors(model, settings)
    framing = analyse_framing(model, settings.framing, settings.bracing)
    times["framing"] = time.perf_counter() - t
    t = time.perf_counter()
    demand = compute_demand(model, framing, settings)
    times["demand"] = time.perf_counter() - t
    standard = get_standard(settings.design.standard)
    t = time.perf_counter()
    for m in model.members:
        if m.role is MemberRole.BEAM:
            check_beam(m, framing.members.get(m.guid), demand.beams.get(m.guid), standard, settings)
    times["check"] = time.perf_counter() - t
    times["members"] = len(model.members)
    return times


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="+", default=[1000, 10000])
    args = parser.parse_args()
    rows = []
    with tempfile.TemporaryDirectory() as tmp:
        for n in args.sizes:
            rows.append(run(n, Path(tmp)))
            r = rows[-1]
            print(
                f"{int(r['members']):>7} members: "
                + "  ".join(f"{s} {r[s]:7.2f} s" for s in STAGES)
                + f"  | read {r['members'] / r['read']:.0f} members/s"
                + f"  | framing/read {r['framing'] / r['read']:.2f}"
                + f"  demand/read {r['demand'] / r['read']:.2f}",
                flush=True,
            )
    for a, b in itertools.pairwise(rows):
        growth = {s: math.log(b[s] / a[s]) / math.log(b["members"] / a["members"]) for s in STAGES}
        print(
            f"growth {int(a['members'])} → {int(b['members'])}: "
            + "  ".join(f"{s} {g:.2f}" for s, g in growth.items())
        )


if __name__ == "__main__":
    main()
