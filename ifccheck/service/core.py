"""The service without HTTP: accepting jobs, dispatching them, recording their end.

A dispatcher thread starts received submissions on the runner as capacity
allows, oldest first, one revision of a model at a time (so that each revision
is compared with the latest finished one). At start, submissions left received
or checking by an earlier process are taken up again: one whose files were
completed before the stop is recorded as finished, the others run again.
"""

from __future__ import annotations

import logging
import secrets
import shutil
import threading
from pathlib import Path
from typing import Any

from ifccheck.service.auth import LinkSigner, TokenVerifier, service_key
from ifccheck.service.jobs import (
    INPUT_DIR,
    OUT_DIR,
    JobSpec,
    clean_job_dir,
    read_outcome,
    read_progress,
)
from ifccheck.service.runners import Runner, make_runner
from ifccheck.service.settings import ServiceConfig
from ifccheck.service.store import JobRow, Store
from ifccheck.service.webhooks import WebhookSender

log = logging.getLogger("ifccheck.service")

API = "/api/v1"


class Service:
    def __init__(self, config: ServiceConfig, runner: Runner | None = None) -> None:
        self.config = config
        self.data = Path(config.data_dir).resolve()
        self.jobs_dir = self.data / "jobs"
        self.uploads_dir = self.data / "uploads"
        self.runner = runner or make_runner(config.workers, config.job_timeout, config.scheduler)
        self.store: Store | None = None
        self.verifier: TokenVerifier | None = None
        self.links: LinkSigner | None = None
        self.webhooks = WebhookSender(
            config.callback_hosts,
            config.callback_timeout,
            config.callback_retries,
            config.callback_backoff,
        )
        self._wake = threading.Condition()
        self._in_flight: set[str] = set()  # started on the runner, not yet recorded as ended
        self._flight_lock = threading.Lock()
        self._stopping = threading.Event()
        self._thread: threading.Thread | None = None

    # -- life cycle ---------------------------------------------------------------

    def start(self) -> None:
        self.jobs_dir.mkdir(parents=True, exist_ok=True)
        shutil.rmtree(self.uploads_dir, ignore_errors=True)  # uploads cut off by a stop
        self.uploads_dir.mkdir(parents=True, exist_ok=True)
        self.store = Store(self.data)
        self.verifier = TokenVerifier(self.store)
        self.links = LinkSigner(service_key(self.data), self.config.link_ttl)
        self._recover()
        self.runner.start()
        self._thread = threading.Thread(target=self._dispatch, name="ifccheck-dispatch")
        self._thread.daemon = True
        self._thread.start()
        for job in self.store.pending_callbacks():
            self._callback(job)

    def stop(self) -> None:
        self._stopping.set()
        with self._wake:
            self._wake.notify_all()
        if self._thread is not None:
            self._thread.join(5)
        self.runner.stop()
        self.webhooks.close()
        if self.store is not None:
            self.store.close()

    def _recover(self) -> None:
        """Take up the submissions an earlier process left received or checking."""
        assert self.store is not None
        for job in self.store.jobs_with_status("checking"):
            outcome = read_outcome(self.job_dir(job.id))
            if outcome is not None:
                self.store.mark_finished(job.id, outcome)
                log.info("job %s had finished before the stop; recorded as finished", job.id)
                continue
            clean_job_dir(self.job_dir(job.id))
            self.store.requeue(job.id)
            log.info("job %s was interrupted; received again", job.id)

    # -- jobs -----------------------------------------------------------------------

    def job_dir(self, job_id: str) -> Path:
        return self.jobs_dir / job_id

    def new_staging(self) -> Path:
        return self.uploads_dir / secrets.token_hex(8)

    def create_job(
        self,
        token_id: str,
        staging: Path,
        model_file: str,
        settings_file: str | None,
        demands_file: str | None,
        model_key: str | None,
        units: str | None,
        callback_url: str | None,
    ) -> str:
        """Make a received submission from an upload (its files in ``staging``)."""
        assert self.store is not None
        job_id = secrets.token_hex(8)
        job_dir = self.job_dir(job_id)
        job_dir.mkdir(parents=True)
        staging.rename(job_dir / INPUT_DIR)
        try:
            self.store.add_job(
                job_id,
                token_id,
                model_key,
                model_file,
                settings_file,
                demands_file,
                units,
                callback_url,
            )
        except BaseException:
            shutil.rmtree(job_dir, ignore_errors=True)
            raise
        self.wake()
        return job_id

    def wake(self) -> None:
        with self._wake:
            self._wake.notify_all()

    def _dispatch(self) -> None:
        while not self._stopping.is_set():
            try:
                self._start_some()
            except Exception:
                log.exception("dispatching jobs failed; trying again")
            with self._wake:
                self._wake.wait(1.0)

    def _start_some(self) -> None:
        assert self.store is not None
        while not self._stopping.is_set():
            with self._flight_lock:
                busy = set(self._in_flight)
            jobs = self.store.eligible(self.runner.capacity() - len(busy), exclude=busy)
            if not jobs:
                return
            for job in jobs:
                self._start(job)

    def _start(self, job: JobRow) -> None:
        assert self.store is not None
        if job.attempts >= self.config.max_attempts:
            self.store.mark_errored(
                job.id,
                f"the job was interrupted {job.attempts} times by service restarts; not retried",
            )
            self._callback_by_id(job.id)
            return
        previous = self.store.previous_finished(job)
        job_dir = self.job_dir(job.id)
        spec = JobSpec(
            job_id=job.id,
            job_dir=str(job_dir),
            model_file=job.model_file,
            settings_file=job.settings_file,
            demands_file=job.demands_file,
            units=job.units,
            model_key=job.model_key,
            previous_id=previous.id if previous else None,
            previous_dir=str(self.job_dir(previous.id)) if previous else None,
        )
        clean_job_dir(job_dir)
        with self._flight_lock:
            self._in_flight.add(job.id)
        self.store.mark_checking(job.id)
        self.runner.submit(spec, self._finished)

    def _finished(self, spec: JobSpec, outcome: dict[str, Any] | None, error: str | None) -> None:
        assert self.store is not None
        if self._stopping.is_set():
            return
        try:
            if outcome is not None:
                self.store.mark_finished(spec.job_id, outcome)
            else:
                self.store.mark_errored(spec.job_id, error or "the check failed")
            clean_job_dir(self.job_dir(spec.job_id))
        finally:
            with self._flight_lock:
                self._in_flight.discard(spec.job_id)
            self.wake()
        self._callback_by_id(spec.job_id)

    # -- callbacks ------------------------------------------------------------------

    def _callback_by_id(self, job_id: str) -> None:
        assert self.store is not None
        job = self.store.job(job_id)
        if job is not None and job.callback_url:
            self._callback(job)

    def _callback(self, job: JobRow) -> None:
        assert job.callback_url is not None

        def recorded(ok: bool) -> None:
            if self._stopping.is_set() or self.store is None:
                return  # left pending: sent again at the next start
            try:
                self.store.set_callback_state(job.id, "delivered" if ok else "failed")
            except Exception:
                log.exception("recording the callback of job %s failed", job.id)

        self.webhooks.submit(job.callback_url, self.status(job), recorded)

    # -- documents ------------------------------------------------------------------

    def status(self, job: JobRow) -> dict[str, Any]:
        """The status document of a job, as the API serves it."""
        outcome = job.outcome or {}
        files: dict[str, str] = {}
        finished = job.status == "finished"
        if finished:
            base = f"{API}/submissions/{job.id}/files"
            files = {name: f"{base}/{name}" for name in outcome.get("files", [])}
        if finished:
            progress = 1.0
        elif job.status == "checking":
            progress = read_progress(self.job_dir(job.id))
        else:
            progress = 0.0
        return {
            "id": job.id,
            "status": job.status,
            "progress": progress,
            "model_key": job.model_key,
            "model_file": job.model_file,
            "summary": outcome.get("summary") if finished else None,
            "diff": _diff_counts(outcome.get("diff")) if finished else None,
            "requirements": outcome.get("requirements") if finished else None,
            "error": job.error if job.status == "errored" else None,
            "files": files,
            "compared_with": job.compared_with if finished else None,
            "units": outcome.get("units", job.units),
            "created_at": job.created_at,
            "started_at": job.started_at,
            "finished_at": job.finished_at,
        }

    def file_path(self, job: JobRow, name: str) -> Path | None:
        """The path of a served file of a finished job, or None."""
        if job.status != "finished" or name not in (job.outcome or {}).get("files", []):
            return None
        path = self.job_dir(job.id) / OUT_DIR / name
        return path if path.is_file() else None


def _diff_counts(counts: dict[str, int] | None) -> dict[str, int] | None:
    """Diff counts as served; a submission finished before format 2 said "regressions"."""
    if counts is None or "regressions" not in counts:
        return counts
    out = {k: v for k, v in counts.items() if k != "regressions"}
    out["weakened"] = counts["regressions"]
    return out
