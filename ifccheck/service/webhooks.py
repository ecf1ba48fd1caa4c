"""Webhooks: POST a finished job's status document to its callback URL.

Only hosts named in the service settings are ever called; redirects are not
followed (they could lead elsewhere). Each attempt has a timeout; failed
attempts (no connection, timeout, a 5xx or 429 answer) are retried with
doubling pauses.
"""

from __future__ import annotations

import logging
import time
from concurrent.futures import ThreadPoolExecutor
from urllib.parse import urlsplit

import httpx

from ifccheck import __version__

log = logging.getLogger("ifccheck.service")


def _host_port(url: str) -> tuple[str, int | None, str]:
    parts = urlsplit(url)
    try:
        port = parts.port
    except ValueError:
        raise ValueError("callback_url: the port is not a number") from None
    return (parts.hostname or "").lower(), port, parts.scheme.lower()


def check_callback_url(url: str, allowed: tuple[str, ...]) -> str | None:
    """Why ``url`` may not be called back (one line), or None when it may."""
    try:
        host, port, scheme = _host_port(url)
    except ValueError as exc:
        return str(exc)
    if scheme not in ("http", "https") or not host:
        return "callback_url: must be an http or https URL with a host"
    if "@" in urlsplit(url).netloc:
        return "callback_url: must not carry user names or passwords"
    if not allowed:
        return "callback_url: this service allows no callback hosts (see --allow-callback-host)"
    default = 443 if scheme == "https" else 80
    for entry in allowed:
        a_host, _, a_port = entry.rpartition(":") if _has_port(entry) else (entry, "", "")
        a_host = a_host.strip("[]")
        if a_host == host and (not a_port or int(a_port) == (port or default)):
            return None
    return f"callback_url: host {host!r} is not among the allowed callback hosts"


def _has_port(entry: str) -> bool:
    if entry.startswith("["):  # [::1]:8000
        return "]:" in entry
    return entry.count(":") == 1 and entry.rsplit(":", 1)[1].isdigit()


class WebhookSender:
    """Delivers callbacks on background threads."""

    def __init__(
        self,
        allowed: tuple[str, ...],
        timeout: float = 10.0,
        retries: int = 3,
        backoff: float = 1.0,
    ) -> None:
        self.allowed = allowed
        self.timeout = timeout
        self.retries = retries
        self.backoff = backoff
        self._pool = ThreadPoolExecutor(max_workers=2, thread_name_prefix="ifccheck-webhook")
        self._closing = False

    def deliver(self, url: str, document: dict) -> bool:
        """POST ``document`` to ``url`` with retries; True once a 2xx answer came back."""
        if check_callback_url(url, self.allowed) is not None:
            return False  # checked at submission; checked again in case the settings changed
        pause = self.backoff
        headers = {"User-Agent": f"ifccheck-service/{__version__}"}
        for attempt in range(self.retries + 1):
            try:
                r = httpx.post(
                    url,
                    json=document,
                    headers=headers,
                    timeout=self.timeout,
                    follow_redirects=False,
                )
                if 200 <= r.status_code < 300:
                    return True
                if r.status_code < 500 and r.status_code != 429:
                    log.warning("callback %s refused with %s; not retried", url, r.status_code)
                    return False
            except httpx.HTTPError as exc:
                log.warning("callback %s attempt %d failed: %s", url, attempt + 1, exc)
            if attempt < self.retries and not self._closing:
                time.sleep(pause)
                pause *= 2
        return False

    def submit(self, url: str, document: dict, on_result) -> None:
        """Deliver in the background; ``on_result(delivered: bool)`` afterwards."""

        def run() -> None:
            try:
                ok = self.deliver(url, document)
            except Exception:
                log.exception("callback %s failed", url)
                ok = False
            on_result(ok)

        if not self._closing:
            self._pool.submit(run)

    def close(self) -> None:
        self._closing = True
        self._pool.shutdown(wait=False, cancel_futures=True)
