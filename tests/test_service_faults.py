"""Faults: a server killed during a job, and checks that crash, raise or hang.

Slow, crashing and hanging jobs are made with the runner's test-only fault
switch (IFCCHECK_SERVICE_TEST_FAULTS, see ifccheck/service/jobs.py), keyed by
the job's model_key so that the other jobs run normally beside them.
"""

from __future__ import annotations

import io
import json
import time
import zipfile
from pathlib import Path

import pytest

from ifccheck import CAUTION
from ifccheck.service.client import ServerProcess, ServiceClient, alive, make_token
from ifccheck.service.jobs import FAULTS_ENV

SAMPLES = Path(__file__).parents[1] / "sample_models"
REV_A = SAMPLES / "quillfeather-rev-a.ifc"
SETTINGS = SAMPLES / "quillfeather.toml"


def _wait_for(predicate, timeout: float, what: str):
    deadline = time.monotonic() + timeout
    while time.monotonic() < deadline:
        value = predicate()
        if value:
            return value
        time.sleep(0.1)
    raise AssertionError(f"timed out waiting for {what}")


def test_killed_server_resumes_the_running_job(tmp_path, capsys):
    data = tmp_path / "data"
    token = make_token(data, "ops")
    slow = {FAULTS_ENV: "slow=delay:60"}  # long enough to kill the server mid-job
    first = ServerProcess(data, "--workers", "1", env=slow).start()
    try:
        with ServiceClient(first.url, token) as c:
            job = c.check(REV_A, SETTINGS, model_key="slow")
            received = c.check(REV_A, SETTINGS, model_key="after")
            _wait_for(lambda: c.status(job)["status"] == "checking", 30, "the job to start")
            workers = first.descendants()
            assert len(workers) >= 2  # at least the fork server and the busy worker
    finally:
        first.kill()  # SIGKILL: no shutdown of any kind
    # the worker processes notice the server is gone and stop by themselves
    _wait_for(lambda: not any(alive(p) for p in workers), 10, "orphaned workers to exit")

    t0 = time.perf_counter()
    second = ServerProcess(data, "--workers", "1", port=first.port).start()
    up = time.perf_counter() - t0
    try:
        with ServiceClient(second.url, token) as c:
            doc = c.wait(job, timeout=120)
            resumed = time.perf_counter() - t0
            assert doc["status"] == "finished", doc
            assert c.wait(received, timeout=120)["status"] == "finished"
            assert set(doc["files"]) == {
                "results.json",
                "beams.csv",
                "checked.ifc",
                "issues.bcf",
                "report.html",
            }
            results = json.loads(c.file(job, "results.json"))
            assert {k: results["summary"][k] for k in doc["summary"]} == doc["summary"] and results[
                "model"
            ]["file"] == REV_A.name
            assert len(c.file(job, "beams.csv").decode().strip().splitlines()) == 1 + len(
                results["beams"]
            )
            ifc = c.file(job, "checked.ifc")
            assert ifc.rstrip().endswith(b"END-ISO-10303-21;")
            zipfile.ZipFile(io.BytesIO(c.file(job, "issues.bcf"))).testzip()
            assert CAUTION in c.file(job, "report.html").decode()
        job_dir = data / "jobs" / job
        assert not [p for p in job_dir.iterdir() if p.name.startswith("tmp-")]
    finally:
        second.stop()
    with capsys.disabled():
        print(f"\n[restart] server answering {up:.1f} s after restart; job done at {resumed:.1f} s")


@pytest.fixture(scope="module")
def faulty(tmp_path_factory):
    data = tmp_path_factory.mktemp("faults") / "data"
    token = make_token(data, "ops")
    env = {FAULTS_ENV: "hang=delay:120;boom=crash;oops=raise"}
    server = ServerProcess(data, "--workers", "2", "--job-timeout", "5", env=env)
    with server, ServiceClient(server.url, token) as client:
        yield server, client


def test_failing_checks_fail_only_their_own_job(faulty, tmp_path):
    server, c = faulty
    broken = tmp_path / "broken.ifc"
    broken.write_bytes(b"ISO-10303-21;\nHEADER;\nthis is not STEP at all\nEND-ISO-10303-21;\n")
    jobs = {
        "hang": c.check(REV_A, SETTINGS, model_key="hang"),
        "boom": c.check(REV_A, SETTINGS, model_key="boom"),
        "oops": c.check(REV_A, SETTINGS, model_key="oops"),
        "broken": c.check(broken, model_key="broken"),
        "fine": c.check(REV_A, SETTINGS, model_key="fine"),
    }
    docs = {k: c.wait(j, timeout=120) for k, j in jobs.items()}
    assert docs["fine"]["status"] == "finished" and docs["fine"]["summary"]["total"] > 0
    expected = {
        "hang": "exceeded its time limit of 5 s",
        "boom": "stopped unexpectedly (exit code 70)",
        "oops": "internal error: RuntimeError: injected test fault",
        "broken": "broken.ifc: cannot parse IFC file",
    }
    for key, fragment in expected.items():
        doc = docs[key]
        assert doc["status"] == "errored", doc
        assert fragment in doc["error"], doc["error"]
        assert "\n" not in doc["error"] and str(server.data_dir) not in doc["error"]
        assert doc["files"] == {} and doc["summary"] is None
    # the service goes on: a new job after the failures runs normally
    assert c.wait(c.check(REV_A, SETTINGS), timeout=120)["status"] == "finished"
