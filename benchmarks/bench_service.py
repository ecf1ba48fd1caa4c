"""Service benchmark: concurrent uploads, and recovery after the server is killed.

Starts `ifccheck serve` on a free loopback port in a temporary data
directory, makes a token, then

1. load: submits N uploads of the demo model's two revisions at once (each
   its own model key) and waits for all; every served summary must equal a
   direct check of the same file. Prints throughput and latencies.
2. restart: submits a job made slow with the runner's test-only fault switch,
   kills the server (SIGKILL) while it runs, restarts it on the same data and
   times how soon it answers and when the interrupted job is finished.

Only 127.0.0.1 is contacted; the request loops are bounded.

    python benchmarks/bench_service.py                 # 20 uploads, 2 workers
    python benchmarks/bench_service.py --uploads 40 --workers 4
"""

from __future__ import annotations

import argparse
import statistics
import tempfile
import time
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.service.client import ServerProcess, ServiceClient, make_token
from ifccheck.service.jobs import FAULTS_ENV

SAMPLES = Path(__file__).parents[1] / "sample_models"
MODELS = [SAMPLES / "quillfeather-rev-a.ifc", SAMPLES / "quillfeather-rev-b.ifc"]
SETTINGS = SAMPLES / "quillfeather.toml"


def load(data: Path, uploads: int, workers: int) -> None:
    token = make_token(data, "bench")
    settings = load_settings(SETTINGS)
    expected = {m.name: run_check(m, settings)[0].summary() for m in MODELS}
    paths = [MODELS[i % 2] for i in range(uploads)]
    with ServerProcess(data, "--workers", str(workers)) as server:
        with ServiceClient(server.url, token) as c:  # let the workers warm up first
            c.wait(c.check(MODELS[0], SETTINGS, model_key="warm-up"), timeout=300)
        latencies: list[float] = []
        uploads_s: list[float] = []

        def one(i: int) -> dict:
            with ServiceClient(server.url, token) as c:
                t0 = time.perf_counter()
                job = c.check(paths[i], SETTINGS, model_key=f"bench-{i}")
                uploads_s.append(time.perf_counter() - t0)
                doc = c.wait(job, timeout=600, poll=0.25)
                latencies.append(time.perf_counter() - t0)
                return doc

        t0 = time.perf_counter()
        with ThreadPoolExecutor(uploads) as pool:
            docs = list(pool.map(one, range(uploads)))
        wall = time.perf_counter() - t0
    bad = [
        d["id"]
        for d, p in zip(docs, paths, strict=True)
        if d["status"] != "finished" or d["summary"] != expected[p.name]
    ]
    print(f"load: {uploads} concurrent uploads, {workers} workers")
    print(f"  all done in {wall:.1f} s: {uploads / wall:.2f} checks/s")
    print(
        f"  latency (upload to finished): median {statistics.median(latencies):.1f} s, "
        f"max {max(latencies):.1f} s; upload answered in median "
        f"{statistics.median(uploads_s) * 1000:.0f} ms"
    )
    print(f"  results matching a direct check: {uploads - len(bad)}/{uploads}")
    if bad:
        raise SystemExit(f"wrong or failed results: {bad}")


def restart(data: Path) -> None:
    token = make_token(data, "restart")
    slow = {FAULTS_ENV: "slow=delay:30"}
    first = ServerProcess(data, "--workers", "1", env=slow).start()
    try:
        with ServiceClient(first.url, token) as c:
            job = c.check(MODELS[0], SETTINGS, model_key="slow")
            deadline = time.monotonic() + 120
            while c.status(job)["status"] != "checking" and time.monotonic() < deadline:
                time.sleep(0.1)
    finally:
        first.kill()
    t0 = time.perf_counter()
    second = ServerProcess(data, "--workers", "1", port=first.port).start()
    up = time.perf_counter() - t0
    try:
        with ServiceClient(second.url, token) as c:
            doc = c.wait(job, timeout=300, poll=0.1)
            done = time.perf_counter() - t0
    finally:
        second.stop()
    print("restart: server killed (SIGKILL) during a running job, restarted on the same data")
    print(f"  answering {up:.1f} s after restart; interrupted job {doc['status']} at {done:.1f} s")
    if doc["status"] != "finished":
        raise SystemExit(f"interrupted job ended {doc['status']}: {doc['error']}")


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--uploads", type=int, default=20)
    ap.add_argument("--workers", type=int, default=2)
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="ifccheck-bench-") as tmp:
        load(Path(tmp) / "load", args.uploads, args.workers)
        restart(Path(tmp) / "restart")


if __name__ == "__main__":
    main()
