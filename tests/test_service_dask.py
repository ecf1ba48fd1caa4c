"""The Dask backend: jobs handed to a distributed scheduler (a small LocalCluster here)."""

from __future__ import annotations

import json
import threading
import time
from pathlib import Path

import pytest

distributed = pytest.importorskip("distributed")

import uvicorn  # noqa: E402

from ifccheck.service.app import create_app  # noqa: E402
from ifccheck.service.auth import create_token  # noqa: E402
from ifccheck.service.client import ServiceClient, free_port  # noqa: E402
from ifccheck.service.jobs import FAULTS_ENV, JobSpec  # noqa: E402
from ifccheck.service.runners import DaskRunner  # noqa: E402
from ifccheck.service.settings import ServiceConfig  # noqa: E402
from ifccheck.service.store import Store  # noqa: E402

SAMPLES = Path(__file__).parents[1] / "sample_models"


@pytest.fixture(scope="module")
def cluster():
    with distributed.LocalCluster(
        n_workers=1,
        threads_per_worker=2,
        processes=False,
        protocol="tcp",
        host="127.0.0.1",
        dashboard_address=None,
    ) as c:
        yield c


def test_revisions_checked_on_the_cluster(cluster, tmp_path):
    data = tmp_path / "data"
    token = create_token(Store(data), "firm")
    runner = DaskRunner(cluster.scheduler_address, job_timeout=300)
    app = create_app(ServiceConfig(data_dir=data), runner=runner)
    server = uvicorn.Server(
        uvicorn.Config(app, host="127.0.0.1", port=free_port(), log_level="warning")
    )
    thread = threading.Thread(target=server.run, daemon=True)
    thread.start()
    try:
        deadline = time.monotonic() + 60
        while not server.started and time.monotonic() < deadline:
            time.sleep(0.05)
        assert runner.capacity() == 2  # the cluster's threads
        with ServiceClient(f"http://127.0.0.1:{server.config.port}", token) as c:
            settings = SAMPLES / "quillfeather.toml"
            a = c.check(SAMPLES / "quillfeather-rev-a.ifc", settings, model_key="qf")
            b = c.check(SAMPLES / "quillfeather-rev-b.ifc", settings, model_key="qf")
            doc_a, doc_b = c.wait(a), c.wait(b)
            assert doc_a["status"] == "finished", doc_a
            assert doc_b["status"] == "finished" and doc_b["compared_with"] == a, doc_b
            diff = json.loads(c.file(b, "diff.json"))
        names = {x["name"] for x in diff["beams"].values() if x["change"] == "weakened"}
        # scenario (ifccheck/samples/scenario.py): bracing dropped from these in revision B
        assert {"R-G90-0", "L2-B2-20"} <= names
    finally:
        server.should_exit = True
        thread.join(30)


def test_cluster_job_past_its_time_limit_fails(cluster, tmp_path, monkeypatch):
    monkeypatch.setenv(FAULTS_ENV, "sleepy=delay:3")  # the in-process workers see it
    runner = DaskRunner(cluster.scheduler_address, job_timeout=1)
    runner.start()
    ended = threading.Event()
    got = {}

    def done(spec, outcome, error):
        got.update(spec=spec, outcome=outcome, error=error)
        ended.set()

    try:
        spec = JobSpec("0123456789abcdef", str(tmp_path), "m.ifc", model_key="sleepy")
        t0 = time.monotonic()
        runner.submit(spec, done)
        assert ended.wait(20)
        assert time.monotonic() - t0 < 2.9  # failed at the limit, not when the task ended
        assert got["outcome"] is None and "time limit of 1 s" in got["error"]
        time.sleep(2.0)  # the cancelled task ending later reports nothing more
        assert got["spec"] is spec
    finally:
        runner.stop()


def test_cluster_job_error_is_one_line(cluster, tmp_path):
    runner = DaskRunner(cluster.scheduler_address, job_timeout=60)
    runner.start()
    ended = threading.Event()
    got = {}
    try:
        (tmp_path / "input").mkdir()
        (tmp_path / "input" / "m.ifc").write_text("ISO-10303-21;\nnot a model\n")
        spec = JobSpec("0123456789abcdef", str(tmp_path), "m.ifc")
        runner.submit(spec, lambda s, o, e: (got.update(error=e), ended.set()))
        assert ended.wait(60)
        assert got["error"].startswith("m.ifc: truncated IFC file"), got
    finally:
        runner.stop()
