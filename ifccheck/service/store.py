"""The service's embedded SQLite database: tokens, models and jobs.

One connection shared by the server's threads behind a lock, in WAL mode so
that `ifccheck token create/revoke` can write while the server runs.
"""

from __future__ import annotations

import json
import sqlite3
import threading
from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path
from typing import Any

DB_NAME = "ifccheck.sqlite3"
SCHEMA_VERSION = 2
# a submission's states: received (waiting for a worker), checking, finished, errored
STATES = ("received", "checking", "finished", "errored")
# the states' names in schema version 1, taken over when an older database is opened
_EARLIER_STATES = {"queued": "received", "running": "checking", "done": "finished",
                   "failed": "errored"}  # fmt: skip

_SCHEMA = """
CREATE TABLE IF NOT EXISTS tokens (
    id TEXT PRIMARY KEY,            -- public part of the token, used to look it up
    name TEXT NOT NULL,
    salt BLOB NOT NULL,
    hash BLOB NOT NULL,             -- scrypt of the secret part with the salt
    created_at TEXT NOT NULL,
    revoked_at TEXT
);
CREATE UNIQUE INDEX IF NOT EXISTS tokens_active_name ON tokens(name) WHERE revoked_at IS NULL;
CREATE TABLE IF NOT EXISTS models (
    token_id TEXT NOT NULL,
    key TEXT NOT NULL,
    created_at TEXT NOT NULL,
    revisions INTEGER NOT NULL DEFAULT 0,
    PRIMARY KEY (token_id, key)
);
CREATE TABLE IF NOT EXISTS jobs (
    seq INTEGER PRIMARY KEY AUTOINCREMENT,
    id TEXT NOT NULL UNIQUE,
    token_id TEXT NOT NULL,
    model_key TEXT,
    model_file TEXT NOT NULL,
    settings_file TEXT,
    demands_file TEXT,
    units TEXT,
    callback_url TEXT,
    callback_state TEXT,            -- pending | delivered | failed
    status TEXT NOT NULL,
    attempts INTEGER NOT NULL DEFAULT 0,
    error TEXT,
    outcome TEXT,                   -- JSON: summary, diff, files, compared_with
    compared_with TEXT,
    created_at TEXT NOT NULL,
    started_at TEXT,
    finished_at TEXT
);
CREATE INDEX IF NOT EXISTS jobs_model ON jobs(token_id, model_key, seq);
CREATE INDEX IF NOT EXISTS jobs_status ON jobs(status, seq);
CREATE INDEX IF NOT EXISTS jobs_token ON jobs(token_id, seq);
"""


def now() -> str:
    return datetime.now(UTC).isoformat(timespec="milliseconds")


@dataclass
class TokenRow:
    id: str
    name: str
    salt: bytes
    hash: bytes
    created_at: str
    revoked_at: str | None


@dataclass
class JobRow:
    seq: int
    id: str
    token_id: str
    model_key: str | None
    model_file: str
    settings_file: str | None
    demands_file: str | None
    units: str | None
    callback_url: str | None
    callback_state: str | None
    status: str
    attempts: int
    error: str | None
    outcome: dict[str, Any] | None
    compared_with: str | None
    created_at: str
    started_at: str | None
    finished_at: str | None


def _job(row: sqlite3.Row) -> JobRow:
    d = dict(row)
    d["outcome"] = json.loads(d["outcome"]) if d["outcome"] else None
    return JobRow(**d)


class Store:
    """Typed access to the database; every method is one short transaction."""

    def __init__(self, data_dir: Path) -> None:
        data_dir = Path(data_dir)
        data_dir.mkdir(parents=True, exist_ok=True)
        self.path = data_dir / DB_NAME
        self._lock = threading.RLock()
        self._db = sqlite3.connect(
            self.path, check_same_thread=False, isolation_level=None, timeout=30.0
        )
        self._db.row_factory = sqlite3.Row
        self._db.execute("PRAGMA journal_mode=WAL")
        self._db.execute("PRAGMA synchronous=NORMAL")
        self._db.execute("PRAGMA busy_timeout=30000")
        self._db.executescript(_SCHEMA)
        self._migrate()
        self._db.execute(f"PRAGMA user_version={SCHEMA_VERSION}")

    def _migrate(self) -> None:
        """Bring a database of an earlier schema version up to this one."""
        version = int(self._db.execute("PRAGMA user_version").fetchone()[0])
        if 0 < version < 2:
            with self._tx() as db:
                for old, new in _EARLIER_STATES.items():
                    db.execute("UPDATE jobs SET status = ? WHERE status = ?", (new, old))

    def close(self) -> None:
        with self._lock:
            self._db.close()

    @contextmanager
    def _tx(self) -> Iterator[sqlite3.Connection]:
        with self._lock:
            self._db.execute("BEGIN IMMEDIATE")
            try:
                yield self._db
            except BaseException:
                self._db.execute("ROLLBACK")
                raise
            self._db.execute("COMMIT")

    def _one(self, sql: str, args: tuple = ()) -> sqlite3.Row | None:
        with self._lock:
            return self._db.execute(sql, args).fetchone()

    def _all(self, sql: str, args: tuple = ()) -> list[sqlite3.Row]:
        with self._lock:
            return self._db.execute(sql, args).fetchall()

    # -- tokens ---------------------------------------------------------------

    def add_token(self, token_id: str, name: str, salt: bytes, digest: bytes) -> None:
        """Store a new token's hash; ValueError when an active token has the name."""
        try:
            with self._tx() as db:
                db.execute(
                    "INSERT INTO tokens (id, name, salt, hash, created_at) VALUES (?, ?, ?, ?, ?)",
                    (token_id, name, salt, digest, now()),
                )
        except sqlite3.IntegrityError:
            raise ValueError(f"a token named {name!r} already exists; revoke it first") from None

    def token(self, token_id: str) -> TokenRow | None:
        row = self._one("SELECT * FROM tokens WHERE id = ?", (token_id,))
        return TokenRow(**dict(row)) if row else None

    def token_active(self, token_id: str) -> bool:
        row = self._one("SELECT revoked_at FROM tokens WHERE id = ?", (token_id,))
        return row is not None and row["revoked_at"] is None

    def revoke_tokens(self, name: str) -> int:
        """Revoke the active token of that name; how many were revoked (0 or 1)."""
        with self._tx() as db:
            cur = db.execute(
                "UPDATE tokens SET revoked_at = ? WHERE name = ? AND revoked_at IS NULL",
                (now(), name),
            )
            return cur.rowcount

    def tokens(self) -> list[TokenRow]:
        return [TokenRow(**dict(r)) for r in self._all("SELECT * FROM tokens ORDER BY created_at")]

    # -- jobs -------------------------------------------------------------------

    def add_job(
        self,
        job_id: str,
        token_id: str,
        model_key: str | None,
        model_file: str,
        settings_file: str | None,
        demands_file: str | None,
        units: str | None,
        callback_url: str | None,
    ) -> None:
        stamp = now()
        with self._tx() as db:
            db.execute(
                "INSERT INTO jobs (id, token_id, model_key, model_file, settings_file,"
                " demands_file, units, callback_url, status, created_at)"
                " VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'received', ?)",
                (
                    job_id,
                    token_id,
                    model_key,
                    model_file,
                    settings_file,
                    demands_file,
                    units,
                    callback_url,
                    stamp,
                ),
            )
            if model_key is not None:
                db.execute(
                    "INSERT INTO models (token_id, key, created_at, revisions) VALUES (?, ?, ?, 1)"
                    " ON CONFLICT(token_id, key) DO UPDATE SET revisions = revisions + 1",
                    (token_id, model_key, stamp),
                )

    def job(self, job_id: str, token_id: str | None = None) -> JobRow | None:
        """The job; with ``token_id``, only when that token created it."""
        if token_id is None:
            row = self._one("SELECT * FROM jobs WHERE id = ?", (job_id,))
        else:
            row = self._one("SELECT * FROM jobs WHERE id = ? AND token_id = ?", (job_id, token_id))
        return _job(row) if row else None

    def jobs(self, token_id: str, model_key: str | None = None, limit: int = 100) -> list[JobRow]:
        """A token's jobs (of one model when ``model_key`` is given), newest first."""
        if model_key is None:
            rows = self._all(
                "SELECT * FROM jobs WHERE token_id = ? ORDER BY seq DESC LIMIT ?",
                (token_id, limit),
            )
        else:
            rows = self._all(
                "SELECT * FROM jobs WHERE token_id = ? AND model_key = ? ORDER BY seq DESC LIMIT ?",
                (token_id, model_key, limit),
            )
        return [_job(r) for r in rows]

    def jobs_with_status(self, status: str) -> list[JobRow]:
        return [
            _job(r)
            for r in self._all("SELECT * FROM jobs WHERE status = ? ORDER BY seq", (status,))
        ]

    def eligible(
        self, limit: int, exclude: set[str] | frozenset[str] = frozenset()
    ) -> list[JobRow]:
        """Queued jobs that may start now, oldest first.

        A revision waits while an earlier job of the same model is received or
        checking, so that it can be compared with the latest finished one.
        """
        if limit <= 0:
            return []
        rows = self._all(
            "SELECT * FROM jobs AS j WHERE j.status = 'received' AND NOT EXISTS ("
            " SELECT 1 FROM jobs AS p WHERE j.model_key IS NOT NULL"
            " AND p.token_id = j.token_id AND p.model_key = j.model_key"
            " AND p.seq < j.seq AND p.status IN ('received', 'checking'))"
            " ORDER BY j.seq LIMIT ?",
            (limit + len(exclude),),
        )
        return [_job(r) for r in rows if r["id"] not in exclude][:limit]

    def previous_finished(self, job: JobRow) -> JobRow | None:
        """The latest finished revision of the job's model before it."""
        if job.model_key is None:
            return None
        row = self._one(
            "SELECT * FROM jobs WHERE token_id = ? AND model_key = ? AND seq < ?"
            " AND status = 'finished' ORDER BY seq DESC LIMIT 1",
            (job.token_id, job.model_key, job.seq),
        )
        return _job(row) if row else None

    def mark_checking(self, job_id: str) -> int:
        """Set checking and count the attempt; the attempt number."""
        with self._tx() as db:
            db.execute(
                "UPDATE jobs SET status = 'checking', attempts = attempts + 1, started_at = ?"
                " WHERE id = ?",
                (now(), job_id),
            )
            row = db.execute("SELECT attempts FROM jobs WHERE id = ?", (job_id,)).fetchone()
            return int(row["attempts"])

    def mark_finished(self, job_id: str, outcome: dict[str, Any]) -> None:
        with self._tx() as db:
            db.execute(
                "UPDATE jobs SET status = 'finished', outcome = ?, compared_with = ?, error = NULL,"
                " finished_at = ?,"
                " callback_state = CASE WHEN callback_url IS NULL THEN NULL ELSE 'pending' END"
                " WHERE id = ?",
                (json.dumps(outcome), outcome.get("compared_with"), now(), job_id),
            )

    def mark_errored(self, job_id: str, error: str) -> None:
        with self._tx() as db:
            db.execute(
                "UPDATE jobs SET status = 'errored', error = ?, finished_at = ?,"
                " callback_state = CASE WHEN callback_url IS NULL THEN NULL ELSE 'pending' END"
                " WHERE id = ?",
                (error, now(), job_id),
            )

    def requeue(self, job_id: str) -> None:
        with self._tx() as db:
            db.execute(
                "UPDATE jobs SET status = 'received', started_at = NULL WHERE id = ?", (job_id,)
            )

    def set_callback_state(self, job_id: str, state: str) -> None:
        with self._tx() as db:
            db.execute("UPDATE jobs SET callback_state = ? WHERE id = ?", (state, job_id))

    def pending_callbacks(self) -> list[JobRow]:
        rows = self._all(
            "SELECT * FROM jobs WHERE callback_state = 'pending'"
            " AND status IN ('finished', 'errored') ORDER BY seq"
        )
        return [_job(r) for r in rows]

    def counts(self) -> dict[str, int]:
        rows = self._all("SELECT status, COUNT(*) AS n FROM jobs GROUP BY status")
        out = dict.fromkeys(STATES, 0)
        out.update({r["status"]: int(r["n"]) for r in rows})
        return out
