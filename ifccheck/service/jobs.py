"""One job: check an uploaded model, compare with the previous revision, write the files.

Runs in a worker process (local or on a Dask worker). Everything is written
into a fresh temporary directory inside the job's directory, which is renamed
to ``out`` only when complete, so readers never see a partial set. A job
directory looks like::

    jobs/<id>/input/<model>.ifc [settings.toml] [demands.csv]
    jobs/<id>/progress          0..1 while checking
    jobs/<id>/out/              results.json beams.csv checked.ifc issues.bcf report.html
                                [diff.json diff.csv diff.bcf diff.html]
                                result.pickle outcome.json
"""

from __future__ import annotations

import json
import os
import pickle
import shutil
import time
import uuid
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from ifccheck.errors import IfccheckError
from ifccheck.units import system_for

# report keys of write_all / write_diff_all → the names the API serves
CHECK_FILES = {
    "json": "results.json",
    "csv": "beams.csv",
    "ifc": "checked.ifc",
    "bcf": "issues.bcf",
    "html": "report.html",
}
DIFF_FILES = {"json": "diff.json", "csv": "diff.csv", "bcf": "diff.bcf", "html": "diff.html"}
FILE_NAMES = (*CHECK_FILES.values(), *DIFF_FILES.values())
RESULT_PICKLE = "result.pickle"
OUTCOME = "outcome.json"
OUT_DIR = "out"
INPUT_DIR = "input"
PROGRESS = "progress"
PROJECT_IDS = "project.ids"  # a project's own IDS uploaded with the model
LENGTH_UNIT_FILE = "length-unit.txt"  # the length_unit field, for a model with no unit

# Test-only fault injection: "KEY=ACTION[;KEY=ACTION]" where KEY is a job's
# model_key (or * for every job) and ACTION is delay:SECONDS, crash or raise.
# Used by the service's own tests to make a job slow, kill its worker or fail.
FAULTS_ENV = "IFCCHECK_SERVICE_TEST_FAULTS"


@dataclass(frozen=True)
class JobSpec:
    """What a worker needs to run a job; paths are absolute."""

    job_id: str
    job_dir: str
    model_file: str  # file name inside input/
    settings_file: str | None = None
    demands_file: str | None = None
    units: str | None = None  # "si", "imperial" or None for the model's own system
    model_key: str | None = None
    previous_id: str | None = None  # job to compare with
    previous_dir: str | None = None  # that job's directory


class JobError(IfccheckError):
    """A job that cannot finish; the message is one line for the user."""


def one_line(exc: BaseException, strip: str | None = None) -> str:
    """A one-line message for an exception, without server paths.

    The tool's own errors (bad input, out of scope, a job that cannot finish)
    are told as they are; anything else is an internal error.
    """
    text = " ".join(str(exc).split())
    if strip:
        text = text.replace(strip.rstrip("/") + "/", "").replace(strip, "")
    if isinstance(exc, IfccheckError):
        return text or type(exc).__name__
    return f"internal error: {type(exc).__name__}" + (f": {text}" if text else "")


def warm_up() -> None:
    """Import the check's modules and read the shape table once, before the first job."""
    import ifccheck.check
    import ifccheck.diff
    import ifccheck.ifc.writeback
    import ifccheck.report
    from ifccheck.sections.table import lookup

    del ifccheck
    lookup("W12X26")


def _faults(key: str | None) -> list[str]:
    spec = os.environ.get(FAULTS_ENV, "")
    actions = []
    for item in spec.split(";"):
        k, sep, action = item.partition("=")
        if sep and (k.strip() == "*" or (key is not None and k.strip() == key)):
            actions.append(action.strip())
    return actions


def _inject(key: str | None) -> None:
    for action in _faults(key):
        if action.startswith("delay:"):
            time.sleep(float(action.split(":", 1)[1]))
        elif action == "crash":
            os._exit(70)
        elif action == "raise":
            raise RuntimeError("injected test fault")


class _Progress:
    """Writes the job's progress (0..1) to a file, at most a few times a second."""

    def __init__(self, job_dir: Path) -> None:
        self.path = job_dir / PROGRESS
        self._last = 0.0

    def __call__(self, value: float, force: bool = False) -> None:
        t = time.monotonic()
        if not force and t - self._last < 0.25:
            return
        self._last = t
        tmp = self.path.with_name(f".{PROGRESS}.{os.getpid()}")
        tmp.write_text(f"{min(max(value, 0.0), 1.0):.3f}")
        os.replace(tmp, self.path)


def read_progress(job_dir: Path) -> float:
    try:
        return min(max(float((Path(job_dir) / PROGRESS).read_text()), 0.0), 1.0)
    except (OSError, ValueError):
        return 0.0


def read_outcome(job_dir: Path) -> dict[str, Any] | None:
    """The outcome of a job whose files are complete, or None."""
    try:
        outcome = json.loads((Path(job_dir) / OUT_DIR / OUTCOME).read_text())
    except (OSError, ValueError):
        return None
    return outcome if isinstance(outcome, dict) and "summary" in outcome else None


def _fsync_dir(path: Path) -> None:
    fd = os.open(path, os.O_RDONLY)
    try:
        os.fsync(fd)
    finally:
        os.close(fd)


def execute_job(spec: JobSpec) -> dict[str, Any]:
    """Run the job; its outcome (summary, diff counts, files, compared_with).

    Raises the check's own errors (ModelError, SettingsError, DemandFileError)
    or JobError; the runner turns any exception into a one-line message.
    """
    from ifccheck.check import run_check
    from ifccheck.config import load_settings
    from ifccheck.report import write_all

    job_dir = Path(spec.job_dir)
    inputs = job_dir / INPUT_DIR
    progress = _Progress(job_dir)
    progress(0.02, force=True)
    _inject(spec.model_key)
    settings = load_settings(inputs / spec.settings_file if spec.settings_file else None)
    demands = inputs / spec.demands_file if spec.demands_file else None
    model_path = inputs / spec.model_file

    def beams_done(done: int, total: int) -> None:
        progress(0.1 + 0.7 * done / max(total, 1))

    project_ids = [inputs / PROJECT_IDS] if (inputs / PROJECT_IDS).exists() else []
    unit_file = inputs / LENGTH_UNIT_FILE
    length_unit = unit_file.read_text(encoding="utf-8").strip() if unit_file.exists() else None
    result, model, _ = run_check(
        model_path, settings, demands, beams_done, requirements=True, project_ids=project_ids,
        length_unit=length_unit,
    )  # fmt: skip
    units = spec.units or system_for(model.length_unit)
    progress(0.82, force=True)

    tmp = job_dir / f"tmp-{uuid.uuid4().hex}"
    try:
        written = write_all(result, model_path, tmp, units)
        files = []
        for key, path in written.items():
            os.replace(path, tmp / CHECK_FILES[key])
            files.append(CHECK_FILES[key])
        progress(0.92, force=True)
        diff_counts = None
        compared_with = None
        if spec.previous_id and spec.previous_dir:
            diff_counts = _diff(spec, result, tmp, units)
            compared_with = spec.previous_id
            files += list(DIFF_FILES.values())
        with (tmp / RESULT_PICKLE).open("wb") as fh:
            pickle.dump(result, fh, protocol=pickle.HIGHEST_PROTOCOL)
        outcome = {
            "summary": result.summary(),
            "requirements": [
                {
                    "identifier": r.identifier,
                    "name": r.name,
                    "met": r.met,
                    "failing": len(r.failing_guids),
                }
                for r in result.requirements
            ],
            "diff": diff_counts,
            "compared_with": compared_with,
            "files": files,
            "units": units,
            "model_file": spec.model_file,
        }
        (tmp / OUTCOME).write_text(json.dumps(outcome))
        for f in tmp.iterdir():
            with f.open("rb") as done:
                os.fsync(done.fileno())
        _publish(tmp, job_dir / OUT_DIR)
    finally:
        shutil.rmtree(tmp, ignore_errors=True)
    progress(1.0, force=True)
    return outcome


def _diff(spec: JobSpec, result, tmp: Path, units: str) -> dict[str, int]:
    from ifccheck.diff import diff_results
    from ifccheck.report import write_diff_all

    assert spec.previous_dir is not None
    try:
        with (Path(spec.previous_dir) / OUT_DIR / RESULT_PICKLE).open("rb") as fh:
            old = pickle.load(fh)  # written by execute_job of an earlier job: trusted
    except (OSError, pickle.UnpicklingError, EOFError) as exc:
        raise JobError(
            f"the results of the previous revision ({spec.previous_id}) cannot be read: {exc}"
        ) from None
    if any("outcome" not in getattr(b, "__dict__", {}) for b in getattr(old, "beams", [None])):
        raise JobError(
            f"the previous revision ({spec.previous_id}) was checked by an earlier version "
            "of ifccheck whose results cannot be compared; submit it again"
        )
    diff = diff_results(old, result)
    for key, path in write_diff_all(diff, tmp, units).items():
        os.replace(path, tmp / DIFF_FILES[key])
    return {
        "matched": diff.matched,
        "added": len(diff.added),
        "removed": len(diff.removed),
        "weakened": len(diff.weakened),
    }


def _publish(tmp: Path, out: Path) -> None:
    """Put the finished directory in place of ``out`` (a rename; an older set is dropped)."""
    _fsync_dir(tmp)
    if out.exists():
        old = out.with_name(f"old-{uuid.uuid4().hex}")
        os.replace(out, old)
        os.replace(tmp, out)
        shutil.rmtree(old, ignore_errors=True)
    else:
        os.replace(tmp, out)
    _fsync_dir(out.parent)


def clean_job_dir(job_dir: Path) -> None:
    """Remove what an interrupted attempt left: temporary directories and progress."""
    job_dir = Path(job_dir)
    if not job_dir.is_dir():
        return
    for p in job_dir.iterdir():
        if p.is_dir() and (p.name.startswith("tmp-") or p.name.startswith("old-")):
            shutil.rmtree(p, ignore_errors=True)
    (job_dir / PROGRESS).unlink(missing_ok=True)
