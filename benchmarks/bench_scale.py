"""`ifccheck check` at scale, against the floor any checker pays, in the same run.

    python benchmarks/bench_scale.py                      # the two 10,820-member cases
    python benchmarks/bench_scale.py --repeat 3           # each measurement three times
    python benchmarks/bench_scale.py --size 100000        # and a ~100,000-member deck case
    python benchmarks/bench_scale.py --work /tmp/scale    # keep (and reuse) the models

The models are generated with ifcopenshell's entity API
(``ifccheck.samples.synthetic.framed_building``): 20 storeys of 10 × 10 bays of
30 ft, columns on every grid node, girders, edge beams and two infill beams a bay
(10,820 members, 8,400 beams). Two cases:

* ``deck``: a 5.5 in concrete slab modelled on every floor, office loads
  (15 psf superimposed dead, 50 psf live, 15 psf partitions): every beam passes;
* ``no-deck``: no slab modelled; the same deck declared in the settings as
  loading the beams without bracing their top flanges: the infill and edge
  beams fail on lateral-torsional buckling (6,200 failures, one BCF topic each).

Each case runs ``ifccheck check MODEL --config … --out …`` as a subprocess with
the default settings otherwise (every output, the requirements audit on) and
``IFCCHECK_TIMINGS=1``, which makes the tool print each stage's wall time to
stderr. The baseline is a subprocess that opens the same file with ifcopenshell
and resolves every member's placement
(``ifcopenshell.util.placement.get_local_placement``). Both are timed by wall
clock, and their peak RSS is read from ``os.wait4`` (the child's own rusage).
Baseline and check alternate, ``--repeat`` times; the fastest of each is kept.
Then one line per target: met or not met, with the figures.
"""

from __future__ import annotations

import argparse
import math
import os
import re
import subprocess
import sys
import tempfile
import time
import zipfile
from dataclasses import dataclass, field
from pathlib import Path

from ifccheck.samples.synthetic import framed_building, grid_members

STOREYS = 20
BAYS = 10  # the 10,820-member building
LOADS = """[steel]
default_grade = "A992"
[loads]
dead = "15 psf"
live = "50 psf"
partitions = "15 psf"
"""

BASELINE = """
import sys, ifcopenshell, ifcopenshell.util.placement as up
f = ifcopenshell.open(sys.argv[1])
n = 0
for cls in ("IfcBeam", "IfcColumn", "IfcMember"):
    for e in f.by_type(cls):
        up.get_local_placement(e.ObjectPlacement)
        n += 1
print(n)
"""

TIMING = re.compile(r"^ifccheck timing: (\S+) ([0-9.]+) s$")
STAGES = ("read", "requirements", "framing", "loads", "adequacy", "check", "explain",
          "outputs", "json", "csv", "ifc", "bcf", "html")  # fmt: skip
MIB = 1024 * 1024


@dataclass
class Run:
    seconds: float
    rss: int  # bytes
    stages: dict[str, float] = field(default_factory=dict)
    stdout: str = ""


def _run(cmd: list[str], env: dict[str, str] | None = None) -> Run:
    """Wall time and peak RSS of one child process (its own rusage, from os.wait4)."""
    with tempfile.TemporaryFile("w+") as out, tempfile.TemporaryFile("w+") as err:
        t0 = time.perf_counter()
        proc = subprocess.Popen(cmd, stdout=out, stderr=err, env=env, text=True)
        _pid, status, usage = os.wait4(proc.pid, 0)
        seconds = time.perf_counter() - t0
        proc.returncode = os.waitstatus_to_exitcode(status)
        out.seek(0)
        err.seek(0)
        stdout, stderr = out.read(), err.read()
    stages: dict[str, float] = {}
    for line in stderr.splitlines():
        m = TIMING.match(line)
        if m:
            stages[m.group(1)] = stages.get(m.group(1), 0.0) + float(m.group(2))
    if proc.returncode not in (0, 1):
        sys.exit(f"{' '.join(cmd)} exited {proc.returncode}:\n{stderr[-3000:]}")
    return Run(seconds, usage.ru_maxrss * 1024, stages, stdout)  # ru_maxrss: KiB on Linux


def baseline(path: Path) -> Run:
    return _run([sys.executable, "-c", BASELINE, str(path)])


def check(path: Path, config: Path, out: Path) -> Run:
    env = {**os.environ, "IFCCHECK_TIMINGS": "1"}
    cmd = [sys.executable, "-m", "ifccheck.cli", "check", str(path), "--config", str(config),
           "--out", str(out)]  # fmt: skip
    return _run(cmd, env)


def bays_for(size: int) -> int:
    """Bays a side giving about ``size`` members over 20 storeys."""
    return min(range(1, 200), key=lambda n: abs(grid_members(n, STOREYS) - size))


def model(work: Path, bays: int, deck: bool) -> Path:
    path = work / f"building-{bays}x{bays}x{STOREYS}-{'deck' if deck else 'nodeck'}.ifc"
    if not path.exists():
        t0 = time.perf_counter()
        framed_building(bays, STOREYS, slab=deck).write(path)
        print(f"generated {path.name} in {time.perf_counter() - t0:.1f} s", flush=True)
    return path


def config(work: Path, deck: bool) -> Path:
    path = work / f"{'deck' if deck else 'nodeck'}.toml"
    text = LOADS
    if not deck:
        for k in range(STOREYS):
            text += f'[decks."Level {k + 2}"]\nthickness = "5.5 in"\nbraces_top_flange = false\n'
    path.write_text(text)
    return path


def bcf_topics(path: Path) -> int:
    with zipfile.ZipFile(path) as z:
        return sum(1 for n in z.namelist() if n.endswith("markup.bcf"))


@dataclass
class Case:
    name: str
    members: int
    base: Run
    check: Run
    outputs: dict[str, int]  # file sizes, bytes
    topics: int

    @property
    def ratio(self) -> float:
        return self.check.seconds / self.base.seconds

    @property
    def rss_ratio(self) -> float:
        return self.check.rss / self.base.rss if self.base.rss else math.inf


def measure(name: str, bays: int, deck: bool, work: Path, repeat: int) -> Case:
    path = model(work, bays, deck)
    cfg = config(work, deck)
    out = work / f"out-{name}"
    bases, checks = [], []
    for _ in range(repeat):
        bases.append(baseline(path))
        checks.append(check(path, cfg, out))
        print(f"  {name}: baseline {bases[-1].seconds:.2f} s, check {checks[-1].seconds:.2f} s",
              flush=True)  # fmt: skip
    base = min(bases, key=lambda r: r.seconds)
    best = min(checks, key=lambda r: r.seconds)
    base.rss = max(r.rss for r in bases)
    best.rss = max(r.rss for r in checks)
    sizes = {p.suffixes[-2].lstrip(".") if len(p.suffixes) > 1 else p.suffix: p.stat().st_size
             for p in out.iterdir() if p.is_file()}  # fmt: skip
    bcf = next(out.glob("*.bcf"), None)
    return Case(name, grid_members(bays, STOREYS), base, best, sizes,
                bcf_topics(bcf) if bcf else 0)  # fmt: skip


def report(case: Case) -> None:
    c, b = case.check, case.base
    print(f"\n{case.name}: {case.members} members")
    print(f"  baseline (open + every placement): {b.seconds:6.2f} s, "
          f"peak RSS {b.rss / MIB:6.0f} MiB")  # fmt: skip
    print(f"  ifccheck check (all outputs):      {c.seconds:6.2f} s, "
          f"peak RSS {c.rss / MIB:6.0f} MiB"
          f"  → ratio {case.ratio:.2f}, RSS × {case.rss_ratio:.2f}")  # fmt: skip
    stages = "  ".join(f"{s} {c.stages[s]:.2f}" for s in STAGES if s in c.stages)
    print(f"  stages (s): {stages}")
    accounted = sum(c.stages.get(s, 0.0) for s in STAGES if s not in
                    ("json", "csv", "ifc", "bcf", "html"))  # fmt: skip
    print(f"  start-up, assembly and summary: {c.seconds - accounted:.2f} s")
    files = "  ".join(f"{k} {v / MIB:.1f} MiB" for k, v in sorted(case.outputs.items()))
    print(f"  outputs: {files}; BCF topics {case.topics}")


def verdict(label: str, ok: bool, figures: str) -> bool:
    print(f"  {'met    ' if ok else 'NOT MET'}  {label}: {figures}")
    return ok


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--size", type=int, default=None,
                        help="also the deck case at about this many members")  # fmt: skip
    parser.add_argument("--repeat", type=int, default=1, help="measurements of each case")
    parser.add_argument("--work", type=Path, default=None, help="keep the models here")
    parser.add_argument("--cases", nargs="+", default=["deck", "no-deck"],
                        choices=["deck", "no-deck"])  # fmt: skip
    args = parser.parse_args()
    tmp = None
    if args.work is None:
        tmp = tempfile.TemporaryDirectory()
        work = Path(tmp.name)
    else:
        work = args.work
        work.mkdir(parents=True, exist_ok=True)
    cases = [measure(n, BAYS, n == "deck", work, args.repeat) for n in args.cases]
    large = None
    if args.size:
        n = bays_for(args.size)
        large = measure(f"deck-{grid_members(n, STOREYS)}", n, True, work, 1)
    for case in [*cases, *([large] if large else [])]:
        report(case)
    print("\ntargets:")
    met = []
    for case in cases:
        met.append(verdict(f"{case.name}: check ≤ 3 × baseline", case.ratio <= 3,
                           f"{case.check.seconds:.2f} s / {case.base.seconds:.2f} s = "
                           f"{case.ratio:.2f}"))  # fmt: skip
        met.append(verdict(f"{case.name}: peak RSS ≤ 3 × baseline's", case.rss_ratio <= 3,
                           f"{case.check.rss / MIB:.0f} MiB / {case.base.rss / MIB:.0f} MiB = "
                           f"{case.rss_ratio:.2f}"))  # fmt: skip
        if case.topics:
            t = case.check.stages.get("bcf", math.nan)
            met.append(verdict(f"{case.name}: BCF of {case.topics} topics ≤ 2 s", t <= 2,
                               f"{t:.2f} s"))  # fmt: skip
    if large is not None:
        small = next((c for c in cases if c.name == "deck"), None)
        if small is not None:
            growth = large.check.seconds / small.check.seconds
            met.append(verdict(f"{large.name}: ≤ 12 × the 10k time", growth <= 12,
                               f"{large.check.seconds:.1f} s / {small.check.seconds:.1f} s = "
                               f"{growth:.1f}"))  # fmt: skip
        met.append(verdict(f"{large.name}: peak RSS < 4 GiB", large.check.rss < 4 * 1024 * MIB,
                           f"{large.check.rss / MIB:.0f} MiB"))  # fmt: skip
    print(f"{sum(met)} of {len(met)} targets met")
    if tmp is not None:
        tmp.cleanup()


if __name__ == "__main__":
    main()
