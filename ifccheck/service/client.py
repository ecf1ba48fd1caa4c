"""A small client of the service's API and a launcher of a server process.

For scripts, the benchmark and the tests: :class:`ServiceClient` uploads
models and waits for their checks to finish; :class:`ServerProcess` runs
``ifccheck serve`` (``python -m ifccheck.cli serve``) on a free loopback port.
"""

from __future__ import annotations

import contextlib
import os
import socket
import subprocess
import sys
import time
from pathlib import Path
from typing import Any

import httpx

API = "/api/v1"
FINAL = ("finished", "errored")


class ServiceClient:
    """Calls one service with one token."""

    def __init__(self, base_url: str, token: str, timeout: float = 60.0) -> None:
        self.base_url = base_url.rstrip("/")
        self.http = httpx.Client(
            base_url=self.base_url,
            headers={"Authorization": f"Bearer {token}"},
            timeout=timeout,
        )

    def close(self) -> None:
        self.http.close()

    def __enter__(self) -> ServiceClient:
        return self

    def __exit__(self, *exc) -> None:
        self.close()

    def submit(
        self,
        model: Path,
        settings: Path | None = None,
        demands: Path | None = None,
        model_key: str | None = None,
        **fields: str,
    ) -> httpx.Response:
        """POST a model; the raw response (202 with the submission id when received)."""
        with contextlib.ExitStack() as stack:
            files: dict[str, Any] = {}
            for name, path in (("model", model), ("settings", settings), ("demands", demands)):
                if path is not None:
                    fh = stack.enter_context(Path(path).open("rb"))  # streamed, not read whole
                    files[name] = (Path(path).name, fh, "application/octet-stream")
            data = dict(fields)
            if model_key is not None:
                data["model_key"] = model_key
            return self.http.post(f"{API}/submissions", files=files, data=data)

    def check(self, model: Path, settings: Path | None = None, **kw: Any) -> str:
        """Submit and return the submission id; raises on refusal."""
        r = self.submit(model, settings, **kw)
        if r.status_code != 202:
            raise RuntimeError(f"upload refused: {r.status_code} {r.text}")
        return r.json()["id"]

    def status(self, job_id: str) -> dict[str, Any]:
        r = self.http.get(f"{API}/submissions/{job_id}")
        r.raise_for_status()
        return r.json()

    def wait(self, job_id: str, timeout: float = 120.0, poll: float = 0.2) -> dict[str, Any]:
        """Poll until the submission is finished or errored; its status document."""
        deadline = time.monotonic() + timeout
        while True:
            doc = self.status(job_id)
            if doc["status"] in FINAL:
                return doc
            if time.monotonic() > deadline:
                raise TimeoutError(f"job {job_id} still {doc['status']} after {timeout} s")
            time.sleep(poll)

    def file(self, job_id: str, name: str) -> bytes:
        r = self.http.get(f"{API}/submissions/{job_id}/files/{name}")
        r.raise_for_status()
        return r.content


def free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def cli_module() -> str:
    """The module that runs the ``ifccheck`` command (``python -m ifccheck.cli``)."""
    return "ifccheck.cli"


def make_token(data_dir: Path, name: str) -> str:
    """Run ``token create`` as a user would; the token from its last line."""
    command = ["token", "create", name, "--data", str(data_dir)]
    out = subprocess.run(
        [sys.executable, "-m", cli_module(), *command],
        check=True,
        capture_output=True,
        text=True,
    )
    return out.stdout.strip().splitlines()[-1]


class ServerProcess:
    """``ifccheck serve`` in a child process on 127.0.0.1, for tests and benchmarks."""

    def __init__(
        self,
        data_dir: Path,
        *args: str,
        port: int | None = None,
        env: dict[str, str] | None = None,
        log: Path | None = None,
    ) -> None:
        self.data_dir = Path(data_dir)
        self.args = args
        self.port = port or free_port()
        self.env = env
        self.log = log or self.data_dir.with_name(self.data_dir.name + f".{self.port}.log")
        self.proc: subprocess.Popen | None = None

    @property
    def url(self) -> str:
        return f"http://127.0.0.1:{self.port}"

    def start(self, timeout: float = 60.0) -> ServerProcess:
        env = dict(os.environ)
        env.update(self.env or {})
        cmd = [sys.executable, "-m", cli_module(), "serve", "--port", str(self.port)]
        cmd += ["--data", str(self.data_dir), *self.args]
        self.log.parent.mkdir(parents=True, exist_ok=True)
        with self.log.open("ab") as fh:
            self.proc = subprocess.Popen(cmd, stdout=fh, stderr=subprocess.STDOUT, env=env)
        deadline = time.monotonic() + timeout
        while time.monotonic() < deadline:
            if self.proc.poll() is not None:
                raise RuntimeError(f"server exited ({self.proc.returncode}); see {self.log}")
            try:
                if httpx.get(f"{self.url}{API}/health", timeout=1).status_code == 200:
                    return self
            except httpx.HTTPError:
                pass
            time.sleep(0.1)
        self.stop()
        raise RuntimeError(f"server did not answer within {timeout} s; see {self.log}")

    def descendants(self) -> list[int]:
        """Process ids below the server: its fork server and worker processes."""
        assert self.proc is not None
        found, todo = [], [self.proc.pid]
        while todo:
            kids = _children(todo.pop())
            found += kids
            todo += kids
        return found

    def kill(self) -> None:
        """SIGKILL: a crash, no shutdown."""
        if self.proc is not None and self.proc.poll() is None:
            self.proc.kill()
            self.proc.wait(10)

    def stop(self) -> None:
        if self.proc is not None and self.proc.poll() is None:
            self.proc.terminate()
            try:
                self.proc.wait(15)
            except subprocess.TimeoutExpired:
                self.proc.kill()
                self.proc.wait(10)

    def __enter__(self) -> ServerProcess:
        return self.start()

    def __exit__(self, *exc) -> None:
        self.stop()


def _children(pid: int) -> list[int]:
    out = []
    for entry in Path("/proc").iterdir():
        if not entry.name.isdigit():
            continue
        try:
            stat = (entry / "stat").read_text()
        except OSError:
            continue
        # the command name is in parentheses and may hold spaces: split after it
        fields = stat.rsplit(")", 1)[1].split()
        if int(fields[1]) == pid:
            out.append(int(entry.name))
    return out


def alive(pid: int) -> bool:
    try:
        state = Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()[0]
    except OSError:
        return False
    return state != "Z"
