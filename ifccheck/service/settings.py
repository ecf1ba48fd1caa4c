"""Settings of the HTTP service (from `ifccheck serve` options)."""

from __future__ import annotations

import re
from dataclasses import dataclass
from pathlib import Path

DEFAULT_MAX_UPLOAD = 1 << 30  # 1 GiB
DEFAULT_JOB_TIMEOUT = 1800.0  # s
DEFAULT_WORKERS = 2

_SIZE_UNITS = {
    "": 1,
    "b": 1,
    "k": 1000,
    "kb": 1000,
    "kib": 1 << 10,
    "m": 1000**2,
    "mb": 1000**2,
    "mib": 1 << 20,
    "g": 1000**3,
    "gb": 1000**3,
    "gib": 1 << 30,
}


def parse_size(text: str) -> int:
    """Bytes from "1GiB", "500 MB", "1048576" (decimal and binary suffixes)."""
    m = re.fullmatch(r"\s*(\d+(?:\.\d+)?)\s*([a-zA-Z]*)\s*", str(text))
    if not m or m.group(2).lower() not in _SIZE_UNITS:
        raise ValueError(f"not a size: {text!r} (use e.g. 1GiB, 500MB or a number of bytes)")
    value = int(float(m.group(1)) * _SIZE_UNITS[m.group(2).lower()])
    if value <= 0:
        raise ValueError(f"size must be positive: {text!r}")
    return value


@dataclass
class ServiceConfig:
    """Everything the service needs besides its host and port."""

    data_dir: Path = Path("ifccheck-data")
    workers: int = DEFAULT_WORKERS  # local worker processes (jobs run at once)
    max_upload: int = DEFAULT_MAX_UPLOAD  # bytes, all files of one upload together
    job_timeout: float = DEFAULT_JOB_TIMEOUT  # s, per job
    callback_hosts: tuple[str, ...] = ()  # hosts webhooks may be sent to ("host" or "host:port")
    callback_timeout: float = 10.0  # s, per delivery attempt
    callback_retries: int = 3  # further attempts after the first
    callback_backoff: float = 1.0  # s, doubled after each failed attempt
    scheduler: str | None = None  # Dask scheduler address; None runs jobs locally
    link_ttl: float = 300.0  # s, lifetime of a signed download link
    max_attempts: int = 3  # starts of one job (restarts included) before it is errored

    def __post_init__(self) -> None:
        self.data_dir = Path(self.data_dir)
        if self.workers < 1:
            raise ValueError("workers must be at least 1")
        if self.job_timeout <= 0:
            raise ValueError("job timeout must be positive")
        self.callback_hosts = tuple(h.strip().lower() for h in self.callback_hosts if h.strip())
