"""Where jobs run: the interface, local worker processes, and a Dask cluster.

A runner takes a :class:`JobSpec` and later calls ``done(spec, outcome,
error)`` exactly once with either the outcome or a one-line error. A runner
being stopped never calls ``done`` for the jobs it drops: those stay
"checking" in the database and are received again at the next start.
"""

from __future__ import annotations

import contextlib
import importlib
import logging
import multiprocessing
import os
import queue
import signal
import threading
import time
from collections.abc import Callable
from typing import Any, Protocol

from ifccheck.service.jobs import JobSpec, one_line

log = logging.getLogger("ifccheck.service")

Done = Callable[[JobSpec, "dict[str, Any] | None", "str | None"], None]
JOB_FUNCTION = "ifccheck.service.jobs:execute_job"
START_TIMEOUT = 300.0  # s for a new worker process to import and warm up


class Runner(Protocol):
    name: str

    def start(self) -> None: ...

    def capacity(self) -> int:
        """How many jobs may be running at once."""
        ...

    def submit(self, spec: JobSpec, done: Done) -> None: ...

    def stop(self) -> None: ...


def _resolve(path: str) -> Callable[[JobSpec], dict[str, Any]]:
    module, _, name = path.partition(":")
    return getattr(importlib.import_module(module), name)


def _timeout_message(seconds: float) -> str:
    return f"the check exceeded its time limit of {seconds:g} s and was stopped"


def _exit_message(code: int | None) -> str:
    if code is not None and code < 0:
        try:
            what = signal.Signals(-code).name
        except ValueError:
            what = f"signal {-code}"
        return f"the check's worker process was killed ({what})"
    return f"the check's worker process stopped unexpectedly (exit code {code})"


# -- local worker processes ---------------------------------------------------------


def _worker_main(conn, server_pid: int, function: str) -> None:
    """A worker process: run job specs received on ``conn`` until told to stop."""
    parent = os.getppid()  # the fork server, which exits when the server does

    def orphan_watch() -> None:
        while True:
            if os.getppid() != parent or not _pid_alive(server_pid):
                os._exit(0)  # the server is gone: do not run on alone
            time.sleep(0.5)

    threading.Thread(target=orphan_watch, daemon=True).start()
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # the server handles Ctrl-C and stops us
    fn = _resolve(function)
    if function == JOB_FUNCTION:
        from ifccheck.service.jobs import warm_up

        warm_up()
    conn.send(("ready", None))
    while True:
        try:
            spec = conn.recv()
        except (EOFError, OSError):
            return
        if spec is None:
            return
        try:
            conn.send(("ok", fn(spec)))
        except BaseException as exc:
            conn.send(("error", one_line(exc, spec.job_dir + "/input")))


def _pid_alive(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    return True


def worker_context():
    """Worker processes fork from a server process that has loaded the check once.

    A fork server, not a fork of the (threaded) HTTP server itself.
    """
    ctx = multiprocessing.get_context("forkserver")
    ctx.set_forkserver_preload(["ifccheck.service.preload"])
    return ctx


class _Worker:
    """One worker process and the pipe to it."""

    def __init__(self, ctx, function: str) -> None:
        self._ctx = ctx
        self._function = function
        self.proc: Any = None  # a multiprocessing Process of the chosen start method
        self.conn: Any = None
        self.ready = False

    def ensure(self) -> None:
        if self.proc is not None and self.proc.is_alive():
            return
        self.close()
        parent, child = self._ctx.Pipe()
        self.proc = self._ctx.Process(
            target=_worker_main,
            args=(child, os.getpid(), self._function),
            name="ifccheck-worker",
            daemon=True,
        )
        self.proc.start()
        child.close()
        self.conn = parent
        self.ready = False

    def run(self, spec: JobSpec, timeout: float) -> tuple[dict[str, Any] | None, str | None]:
        """(outcome, None) or (None, one-line error)."""
        self.ensure()
        assert self.conn is not None and self.proc is not None
        try:
            if not self.ready:  # the time limit starts once the worker has warmed up
                if not self.conn.poll(START_TIMEOUT):
                    self.kill()
                    return None, f"no worker process started within {START_TIMEOUT:g} s"
                self.conn.recv()
                self.ready = True
            deadline = time.monotonic() + timeout
            self.conn.send(spec)
            remaining = deadline - time.monotonic()
            if not self.conn.poll(max(remaining, 0.0)):
                self.kill()
                return None, _timeout_message(timeout)
            kind, payload = self.conn.recv()
            return (payload, None) if kind == "ok" else (None, payload)
        except (EOFError, OSError, BrokenPipeError):
            self.proc.join(5)
            code = self.proc.exitcode
            self.close()
            return None, _exit_message(code)

    def kill(self) -> None:
        if self.proc is not None and self.proc.is_alive():
            self.proc.kill()
            self.proc.join(5)
        self.close()

    def close(self) -> None:
        if self.conn is not None:
            with contextlib.suppress(OSError):
                self.conn.close()
        self.conn = None
        if self.proc is not None and not self.proc.is_alive():
            with contextlib.suppress(ValueError):
                self.proc.close()
            self.proc = None


class LocalRunner:
    """A fixed number of worker processes on this machine.

    A worker that crashes or runs past the time limit is killed and replaced;
    only its own job fails. Workers exit by themselves if the server dies.
    """

    name = "local"

    def __init__(self, workers: int, job_timeout: float, function: str = JOB_FUNCTION) -> None:
        self.workers = workers
        self.job_timeout = job_timeout
        self._function = function
        self._ctx = worker_context()
        self._queue: queue.Queue[tuple[JobSpec, Done] | None] = queue.Queue()
        self._stopping = threading.Event()
        self._slots: list[_Worker] = []
        self._threads: list[threading.Thread] = []

    def start(self) -> None:
        for i in range(self.workers):
            w = _Worker(self._ctx, self._function)
            self._slots.append(w)
            t = threading.Thread(target=self._slot, args=(w,), name=f"ifccheck-slot-{i}")
            t.daemon = True
            t.start()
            self._threads.append(t)

    def capacity(self) -> int:
        return self.workers

    def submit(self, spec: JobSpec, done: Done) -> None:
        self._queue.put((spec, done))

    def _slot(self, worker: _Worker) -> None:
        try:
            worker.ensure()  # start (and warm up) now, not at the first job
        except Exception:
            log.exception("a worker process could not be started; trying again at the next job")
        while not self._stopping.is_set():
            item = self._queue.get()
            if item is None:
                return
            spec, done = item
            outcome, error = worker.run(spec, self.job_timeout)
            if self._stopping.is_set():
                return  # shutting down: the job stays "checking" and is taken up again
            try:
                done(spec, outcome, error)
            except Exception:
                log.exception("recording the end of job %s failed", spec.job_id)

    def stop(self) -> None:
        self._stopping.set()
        for _ in self._threads:
            self._queue.put(None)
        for w in self._slots:
            if w.conn is not None:
                with contextlib.suppress(OSError):
                    w.conn.send(None)
        for w in self._slots:
            if w.proc is not None:
                w.proc.join(0.5)
            w.kill()
        for t in self._threads:
            t.join(2)


# -- Dask distributed ----------------------------------------------------------------


def _dask_task(spec: JobSpec, function: str) -> tuple[str, Any]:
    """Runs on a Dask worker: ("ok", outcome) or ("error", one-line message)."""
    try:
        return "ok", _resolve(function)(spec)
    except Exception as exc:
        return "error", one_line(exc, spec.job_dir + "/input")


class DaskRunner:
    """Hands jobs to an existing Dask distributed scheduler.

    The workers must see the service's data directory at the same path (a
    shared file system). The time limit is kept here: a job past it is
    cancelled and failed; a worker that dies is handled by Dask (its nanny
    restarts it and the job is retried, then failed).
    """

    name = "dask"

    def __init__(self, address: str, job_timeout: float, function: str = JOB_FUNCTION) -> None:
        self.address = address
        self.job_timeout = job_timeout
        self._function = function
        self._client: Any = None  # a distributed.Client once started
        self._lock = threading.Lock()
        self._running: dict[str, tuple[Any, JobSpec, Done, float]] = {}
        self._stopping = threading.Event()
        self._watch: threading.Thread | None = None

    def start(self) -> None:
        from distributed import Client

        self._client = Client(self.address, set_as_default=False, timeout="30s")
        self._watch = threading.Thread(target=self._watchdog, name="ifccheck-dask-watch")
        self._watch.daemon = True
        self._watch.start()

    def capacity(self) -> int:
        assert self._client is not None
        try:
            return max(1, sum(self._client.nthreads().values()))
        except Exception:  # scheduler unreachable for a moment: keep one job going
            return 1

    def submit(self, spec: JobSpec, done: Done) -> None:
        assert self._client is not None
        fut = self._client.submit(
            _dask_task,
            spec,
            self._function,
            key=f"ifccheck-{spec.job_id}-{time.monotonic_ns()}",
            pure=False,
        )
        with self._lock:
            self._running[fut.key] = (fut, spec, done, time.monotonic())
        fut.add_done_callback(self._finished)

    def _take(self, key: str) -> tuple[Any, JobSpec, Done, float] | None:
        with self._lock:
            return self._running.pop(key, None)

    def _finished(self, fut) -> None:
        entry = self._take(fut.key)
        if entry is None or self._stopping.is_set():
            return
        _, spec, done, _ = entry
        outcome, error = None, None
        try:
            if fut.status == "finished":
                kind, payload = fut.result()
                outcome, error = (payload, None) if kind == "ok" else (None, payload)
            elif fut.status == "cancelled":
                error = "the job was cancelled by the cluster"
            else:
                error = f"the check's cluster worker failed: {one_line(fut.exception())}"
        except Exception as exc:
            error = f"the check's cluster worker failed: {one_line(exc)}"
        try:
            done(spec, outcome, error)
        except Exception:
            log.exception("recording the end of job %s failed", spec.job_id)

    def _watchdog(self) -> None:
        while not self._stopping.wait(0.5):
            t = time.monotonic()
            with self._lock:
                late = [
                    k for k, (_, _, _, t0) in self._running.items() if t - t0 > self.job_timeout
                ]
            for key in late:
                entry = self._take(key)
                if entry is None:
                    continue
                fut, spec, done, _ = entry
                with contextlib.suppress(Exception):
                    fut.cancel()
                done(spec, None, _timeout_message(self.job_timeout))

    def stop(self) -> None:
        self._stopping.set()
        if self._client is not None:
            with contextlib.suppress(Exception):
                self._client.close(timeout=5)
        if self._watch is not None:
            self._watch.join(2)


def make_runner(workers: int, job_timeout: float, scheduler: str | None) -> Runner:
    if scheduler:
        return DaskRunner(scheduler, job_timeout)
    return LocalRunner(workers, job_timeout)
