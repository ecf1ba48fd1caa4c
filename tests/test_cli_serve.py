"""`ifccheck serve` refuses what it cannot use in one line, and says the port it listens on."""

from __future__ import annotations

import re
import socket
import subprocess
import sys
import time

import httpx


def _serve(*args: str, timeout: float = 60) -> subprocess.CompletedProcess:
    return subprocess.run(
        [sys.executable, "-m", "ifccheck.cli", "serve", *args],
        capture_output=True,
        text=True,
        timeout=timeout,
    )


def test_a_port_in_use_is_one_line_and_exit_2(tmp_path):
    with socket.socket() as taken:
        taken.bind(("127.0.0.1", 0))
        taken.listen()
        port = taken.getsockname()[1]
        r = _serve("--port", str(port), "--data", str(tmp_path / "data"))
    assert r.returncode == 2
    assert r.stderr.splitlines() == [
        f"ifccheck: error: cannot listen on 127.0.0.1:{port}: Address already in use"
    ]
    assert "Traceback" not in r.stderr + r.stdout


def test_a_bad_data_directory_is_one_line_and_exit_2(tmp_path):
    a_file = tmp_path / "a-file"
    a_file.write_text("not a directory")
    broken = tmp_path / "broken"
    broken.mkdir()
    (broken / "ifccheck.sqlite3").write_text("not a database")
    for data, words in ((a_file / "sub", "cannot be written"),
                        (broken, "its database cannot be opened")):  # fmt: skip
        r = _serve("--port", "0", "--data", str(data))
        assert r.returncode == 2, r.stderr
        lines = r.stderr.splitlines()
        assert len(lines) == 1 and lines[0].startswith(f"ifccheck: error: --data {data}: ")
        assert words in lines[0]


def test_port_0_prints_the_port_it_listens_on(tmp_path):
    proc = subprocess.Popen(
        [sys.executable, "-m", "ifccheck.cli", "serve", "--port", "0", "--data",
         str(tmp_path / "data")],
        stderr=subprocess.PIPE, stdout=subprocess.DEVNULL, text=True,
    )  # fmt: skip
    try:
        banner = proc.stderr.readline()
        m = re.search(r"http://127\.0\.0\.1:(\d+)/", banner)
        assert m and int(m.group(1)) > 0, banner
        url = f"http://127.0.0.1:{m.group(1)}/api/v1/health"
        deadline = time.monotonic() + 60
        while True:
            try:
                assert httpx.get(url, timeout=2).json()["status"] == "ok"
                break
            except httpx.HTTPError:
                assert time.monotonic() < deadline, "the service did not answer"
                time.sleep(0.2)
    finally:
        proc.terminate()
        proc.wait(20)
