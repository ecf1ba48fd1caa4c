"""The HTTP API end to end against a real `serve` process on 127.0.0.1.

Expected findings of the demo's two revisions come from the invented scenario
(ifccheck/samples/scenario.py, see tests/test_diff_demo.py); every served
result is compared with a direct `run_check` of the same file.
"""

from __future__ import annotations

import io
import json
import socket
import subprocess
import sys
import threading
import time
import zipfile
from concurrent.futures import ThreadPoolExecutor
from http.server import BaseHTTPRequestHandler, ThreadingHTTPServer
from pathlib import Path

import httpx
import pytest

from ifccheck import CAUTION
from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.service.client import ServerProcess, ServiceClient, cli_module, make_token

SAMPLES = Path(__file__).parents[1] / "sample_models"
REV_A = SAMPLES / "quillfeather-rev-a.ifc"
REV_B = SAMPLES / "quillfeather-rev-b.ifc"
SETTINGS = SAMPLES / "quillfeather.toml"
MAX_UPLOAD = 1 << 20  # the test server's cap: 1 MiB; the demo models are ~130 kB
API = "/api/v1"


class Hooks:
    """A webhook receiver on 127.0.0.1 that fails the first call to each path."""

    def __init__(self) -> None:
        self.calls: list[tuple[str, dict]] = []
        hooks = self

        class Handler(BaseHTTPRequestHandler):
            def do_POST(self):
                body = json.loads(self.rfile.read(int(self.headers["Content-Length"])))
                first = all(p != self.path for p, _ in hooks.calls)
                hooks.calls.append((self.path, body))
                self.send_response(503 if first else 204)  # first attempt fails: retried
                self.send_header("Content-Length", "0")
                self.end_headers()

            def log_message(self, *args):
                pass

        self.server = ThreadingHTTPServer(("127.0.0.1", 0), Handler)
        self.port = self.server.server_address[1]
        threading.Thread(target=self.server.serve_forever, daemon=True).start()

    def close(self) -> None:
        self.server.shutdown()
        self.server.server_close()


@pytest.fixture(scope="module")
def hooks():
    h = Hooks()
    yield h
    h.close()


@pytest.fixture(scope="module")
def server(tmp_path_factory, hooks):
    data = tmp_path_factory.mktemp("service") / "data"
    tokens = {name: make_token(data, name) for name in ("alice", "bob", "carol")}
    proc = ServerProcess(
        data,
        "--workers",
        "2",
        "--max-upload",
        str(MAX_UPLOAD),
        "--allow-callback-host",
        f"127.0.0.1:{hooks.port}",
    )
    with proc:
        proc.tokens = tokens
        yield proc


@pytest.fixture(scope="module")
def alice(server):
    with ServiceClient(server.url, server.tokens["alice"]) as c:
        yield c


@pytest.fixture(scope="module")
def bob(server):
    with ServiceClient(server.url, server.tokens["bob"]) as c:
        yield c


@pytest.fixture(scope="module")
def reference():
    """Per-beam (outcome, utilisation) of each revision from a direct check."""
    settings = load_settings(SETTINGS)
    out = {}
    for path in (REV_A, REV_B):
        result, _, _ = run_check(path, settings)
        beams = {b.guid: (b.outcome, b.utilisation) for b in result.beams}
        out[path.name] = (beams, result.summary())
    return out


@pytest.fixture(scope="module")
def revisions(alice):
    """Revision A then B of one model, uploaded back to back."""
    a = alice.check(REV_A, SETTINGS, model_key="quillfeather")
    b = alice.check(REV_B, SETTINGS, model_key="quillfeather")
    return alice.wait(a), alice.wait(b)


def _same_results(document: dict, reference: tuple) -> None:
    beams, summary = reference
    assert {k: document["summary"][k] for k in summary} == summary
    served = {b["guid"]: (b["outcome"], b["utilisation"]) for b in document["beams"]}
    assert served.keys() == beams.keys()
    for guid, (outcome, ratio) in beams.items():
        assert served[guid][0] == outcome
        assert (served[guid][1] is None) == (ratio is None)
        if ratio is not None:
            assert served[guid][1] == pytest.approx(ratio, rel=1e-9)


def test_health_needs_no_token(server):
    r = httpx.get(f"{server.url}{API}/health")
    assert r.status_code == 200 and r.json()["status"] == "ok"


def test_revision_b_diff_names_the_beams_that_lost_bracing(revisions, alice):
    a, b = revisions
    assert a["status"] == "finished" and b["status"] == "finished", (a, b)
    assert a["compared_with"] is None and "diff.json" not in a["files"]
    assert b["compared_with"] == a["id"]
    assert set(b["files"]) == {
        "results.json",
        "beams.csv",
        "checked.ifc",
        "issues.bcf",
        "report.html",
        "diff.json",
        "diff.csv",
        "diff.bcf",
        "diff.html",
    }
    diff = json.loads(alice.file(b["id"], "diff.json"))
    weakened = {c["name"] for c in diff["beams"].values() if c["change"] == "weakened"}
    # scenario: R-G90-0 loses its roof infill brace, L2-B2-20 its slab bracing at the shaft
    assert {"R-G90-0", "L2-B2-20"} <= weakened
    assert b["diff"]["weakened"] == len(weakened)
    roof = next(c for c in diff["beams"].values() if c["name"] == "R-G90-0")
    assert roof["outcome_before"] == "pass" and roof["outcome_after"] == "fail"
    assert roof["lost_brace_points"]
    # the demo is in feet: the reasons are worded in feet, as the CLI words them
    # (they once came out in metres from the service)
    assert diff["display_units"] == "imperial"
    assert roof["reasons"][0].startswith("lost the brace point at 15.00 ft from the end at")
    assert any(c["kind"] == "lost_braces" for c in roof["causes"])


def test_served_files_are_the_check_of_the_uploaded_model(revisions, alice, reference):
    a, b = revisions
    for doc, path in ((a, REV_A), (b, REV_B)):
        results = json.loads(alice.file(doc["id"], "results.json"))
        _same_results(results, reference[path.name])
        assert results["model"]["file"] == path.name
    csv = alice.file(a["id"], "beams.csv").decode().strip().splitlines()
    assert len(csv) == 1 + a["summary"]["total"]
    ifc = alice.file(a["id"], "checked.ifc")
    assert ifc.startswith(b"ISO-10303-21;") and ifc.rstrip().endswith(b"END-ISO-10303-21;")
    assert zipfile.ZipFile(io.BytesIO(alice.file(b["id"], "issues.bcf"))).namelist()
    html = alice.file(a["id"], "report.html").decode()
    assert html.rstrip().endswith("</html>") and CAUTION in html
    r = alice.http.get(a["files"]["report.html"])
    policy = r.headers["content-security-policy"]
    assert "sandbox allow-scripts;" in policy and "allow-same-origin" not in policy
    # scripts: the report's own table script by its hash, and nothing inline besides
    from ifccheck.report.html_out import TABLE_SCRIPT, TABLE_SCRIPT_HASH

    assert (
        f"script-src '{TABLE_SCRIPT_HASH}'" in policy
        and "unsafe-inline'" not in (policy.split("script-src", 1)[1])
    )
    assert f"<script>{TABLE_SCRIPT}</script>" in html


def test_listing_by_model_key_newest_first(revisions, alice, bob):
    a, b = revisions
    listed = alice.http.get(f"{API}/submissions", params={"model_key": "quillfeather"}).json()
    assert [c["id"] for c in listed["submissions"]][:2] == [b["id"], a["id"]]
    assert (
        bob.http.get(f"{API}/submissions", params={"model_key": "quillfeather"}).json()[
            "submissions"
        ]
        == []
    )


def test_tokens_are_required_and_scoped(server, revisions, bob):
    a, _ = revisions
    job = f"{server.url}{API}/submissions/{a['id']}"
    assert httpx.get(job).status_code == 401
    assert httpx.get(f"{server.url}{API}/submissions").status_code == 401
    r = httpx.get(job, headers={"Authorization": "Bearer ifck_0123456789ab_" + "x" * 43})
    assert r.status_code == 401 and r.headers["www-authenticate"] == "Bearer"
    wrong = server.tokens["alice"][:-3] + "zzz"
    assert httpx.get(job, headers={"Authorization": f"Bearer {wrong}"}).status_code == 401
    assert httpx.get(job, headers={"Authorization": "Basic YTpi"}).status_code == 401
    # another token's job does not exist for it, nor do its files or links
    assert bob.http.get(job).status_code == 404
    assert bob.http.get(f"{job}/files/results.json").status_code == 404
    assert bob.http.post(f"{job}/files/results.json/link").status_code == 404
    r = httpx.post(f"{server.url}{API}/submissions", files={"model": ("a.ifc", REV_A.read_bytes())})
    assert r.status_code == 401


def test_revoked_token_is_refused(server):
    with ServiceClient(server.url, server.tokens["carol"]) as carol:
        assert carol.http.get(f"{API}/submissions").status_code == 200
        revoke = ["token", "revoke", "carol", "--data", str(server.data_dir)]
        out = subprocess.run(
            [sys.executable, "-m", cli_module(), *revoke], capture_output=True, text=True
        )  # the CLI as a user runs it
        assert out.returncode == 0 and "revoked" in out.stdout
        assert carol.http.get(f"{API}/submissions").status_code == 401


def _raw_get(server, path: str, token: str) -> tuple[int, bytes]:
    """GET a path exactly as written (no client-side normalising of "..")."""
    with socket.create_connection(("127.0.0.1", server.port), timeout=10) as s:
        s.sendall(
            f"GET {path} HTTP/1.1\r\nHost: 127.0.0.1\r\nAuthorization: Bearer {token}\r\n"
            "Connection: close\r\n\r\n".encode()
        )
        data = b""
        while chunk := s.recv(65536):
            data += chunk
    return int(data.split(b" ", 2)[1]), data


@pytest.mark.parametrize(
    "name",
    [
        "../../../ifccheck.sqlite3",
        "../input/quillfeather-rev-a.ifc",
        "..",
        "..%2F..%2Fifccheck.sqlite3",
        "..%2Finput%2Fquillfeather-rev-a.ifc",
        "%2e%2e%2f%2e%2e%2fservice.key",
        "result.pickle",
        "outcome.json",
        "results.json%00",
        "/etc/passwd",
    ],
)
def test_path_traversal_is_not_found(server, revisions, name):
    a, _ = revisions
    status, body = _raw_get(
        server, f"{API}/submissions/{a['id']}/files/{name}", server.tokens["alice"]
    )
    assert status == 404
    assert b"SQLite" not in body and b"ISO-10303" not in body


def test_signed_links_open_one_file_without_a_header(server, revisions, alice):
    a, _ = revisions
    link = alice.http.post(f"{API}/submissions/{a['id']}/files/report.html/link").json()
    assert httpx.get(server.url + link["url"]).status_code == 200
    other = link["url"].replace("report.html", "results.json")
    assert httpx.get(server.url + other).status_code == 401
    assert httpx.get(server.url + link["url"][:-4] + "0000").status_code == 401


def _job_count(client: ServiceClient) -> int:
    return len(client.http.get(f"{API}/submissions", params={"limit": 1000}).json()["submissions"])


def test_non_ifc_upload_is_refused_before_a_job_is_made(alice, tmp_path):
    before = _job_count(alice)
    for content in (b"PK\x03\x04 zipped", b"<html>not a model</html>", b"", b"   \n  "):
        r = alice.http.post(f"{API}/submissions", files={"model": ("x.ifc", content)})
        assert r.status_code == 422, r.text
        expected = "compressed IFC" if content.startswith(b"PK") else "ISO-10303-21"
        assert expected in r.json()["detail"]
    r = alice.http.post(f"{API}/submissions", data={"model_key": "no-model"})
    assert r.status_code == 422
    assert _job_count(alice) == before


def test_bad_settings_are_refused_naming_the_key(alice):
    before = _job_count(alice)
    files = {
        "model": ("a.ifc", REV_A.read_bytes()),
        "settings": ("s.toml", b"[loads]\nlive = 'x'\n"),
    }
    r = alice.http.post(f"{API}/submissions", files=files)
    assert r.status_code == 422 and "loads.live" in r.json()["detail"]
    files["settings"] = ("s.toml", b"[loads]\nlvie = '50 psf'\n")
    r = alice.http.post(f"{API}/submissions", files=files)
    assert r.status_code == 422 and "loads.lvie" in r.json()["detail"]
    assert "/uploads/" not in r.json()["detail"]  # no server paths in messages
    files["settings"] = ("s.toml", b"not = = toml")
    assert alice.http.post(f"{API}/submissions", files=files).status_code == 422
    del files["settings"]
    files["demands"] = ("d.csv", b"no,such,columns\n1,2,3\n")
    r = alice.http.post(f"{API}/submissions", files=files)
    assert r.status_code == 422 and r.json()["detail"].startswith("demands:")
    r = alice.http.post(f"{API}/submissions", files=files | {"extra": ("e", b"1")})
    assert r.status_code == 422
    assert _job_count(alice) == before


def _tree_size(path: Path) -> int:
    return sum(p.stat().st_size for p in path.rglob("*") if p.is_file())


def test_oversize_upload_is_refused_while_streaming(server, alice):
    before = _tree_size(server.data_dir)
    jobs = _job_count(alice)
    big = b"ISO-10303-21;\n" + b"x" * (3 * MAX_UPLOAD)
    r = alice.http.post(f"{API}/submissions", files={"model": ("big.ifc", big)})
    assert r.status_code == 413  # told by Content-Length

    sent = 0

    def chunked():  # no Content-Length: the cap must hold while reading
        nonlocal sent
        boundary = b"--cap"
        yield boundary + b'\r\nContent-Disposition: form-data; name="model"; filename="b.ifc"'
        yield b"\r\n\r\nISO-10303-21;\n"
        for _ in range(400):  # 25 MiB offered, 25 times the cap
            sent += 1 << 16
            yield b"y" * (1 << 16)
        yield b"\r\n" + boundary + b"--\r\n"

    try:
        r = alice.http.post(
            f"{API}/submissions",
            content=chunked(),
            headers={"Content-Type": "multipart/form-data; boundary=cap"},
        )
        assert r.status_code == 413
    except httpx.TransportError:
        pass  # the server stopped reading and closed the connection: refused too
    assert not any((server.data_dir / "uploads").iterdir())
    assert _tree_size(server.data_dir) - before < MAX_UPLOAD  # nothing kept
    assert _job_count(alice) == jobs


def test_webhook_is_posted_with_retries_to_allowed_hosts_only(alice, hooks):
    url = f"http://127.0.0.1:{hooks.port}/done/1"
    job = alice.check(REV_A, SETTINGS, callback_url=url)
    doc = alice.wait(job)
    deadline = time.monotonic() + 20
    while len([c for c in hooks.calls if c[0] == "/done/1"]) < 2 and time.monotonic() < deadline:
        time.sleep(0.1)
    calls = [body for path, body in hooks.calls if path == "/done/1"]
    assert len(calls) == 2  # the first attempt got 503 and was retried
    assert calls[-1]["id"] == job and calls[-1]["status"] == "finished"
    assert calls[-1]["summary"] == doc["summary"]
    for bad in (f"http://127.0.0.1:{hooks.port + 1}/x", "http://localhost.example/x", "ftp://a/b"):
        r = alice.submit(REV_A, callback_url=bad)
        assert r.status_code == 422, bad


def test_twenty_concurrent_uploads_with_two_workers(server, reference, capsys):
    """Load: 20 uploads at once on --workers 2; every result matches a direct check."""
    paths = [REV_A if i % 2 == 0 else REV_B for i in range(20)]
    t0 = time.perf_counter()

    def one(i: int) -> tuple[str, dict]:
        with ServiceClient(server.url, server.tokens["bob"]) as c:
            job = c.check(paths[i], SETTINGS, model_key=f"load-{i}")
            return job, c.wait(job, timeout=300, poll=0.5)

    with ThreadPoolExecutor(20) as pool:
        done = list(pool.map(one, range(20)))
    elapsed = time.perf_counter() - t0
    with ServiceClient(server.url, server.tokens["bob"]) as c:
        for (job, doc), path in zip(done, paths, strict=True):
            assert doc["status"] == "finished", doc
            _same_results(json.loads(c.file(job, "results.json")), reference[path.name])
    with capsys.disabled():
        print(f"\n[load] 20 checks, 2 workers: {elapsed:.1f} s, {20 / elapsed:.2f} checks/s")


def test_the_service_serves_its_requirements_and_reports_the_audit(server, revisions):
    r = httpx.get(f"{server.url}{API}/requirements.ids")
    assert r.status_code == 200 and r.headers["content-type"].startswith("application/xml")
    assert "attachment" in r.headers["content-disposition"]
    assert r.text.startswith("<?xml") and "specification" in r.text
    _, b = revisions
    audit = {x["name"]: x for x in b["requirements"]}
    # demo revision B fails one requirement on purpose: a strut without a grade
    assert not audit["Braces and struts name their steel grade"]["met"]
    assert audit["Braces and struts name their steel grade"]["failing"] == 1
