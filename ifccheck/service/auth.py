"""Bearer tokens and signed download links.

A token reads ``ifck_<id>_<secret>``: the id is public and finds the stored
row, the secret is checked against its salted scrypt hash in constant time.
Only the hash is stored. A verified token is remembered in memory (keyed by a
keyed digest, never the token itself) so that polling does not pay for
scrypt on every request; revocation is still read from the database each time.
"""

from __future__ import annotations

import hashlib
import hmac
import os
import re
import secrets
import threading
import time
from pathlib import Path

from ifccheck.service.store import Store

PREFIX = "ifck"
_TOKEN = re.compile(rf"{PREFIX}_([0-9a-f]{{12}})_([A-Za-z0-9_-]{{20,100}})")
# scrypt cost: 16 MiB and some tens of ms per verification (RFC 7914 §2 parameters)
_SCRYPT = {"n": 1 << 14, "r": 8, "p": 1, "dklen": 32, "maxmem": 64 << 20}
KEY_FILE = "service.key"
_CACHE_SIZE = 1024


def hash_secret(secret: str, salt: bytes) -> bytes:
    return hashlib.scrypt(secret.encode(), salt=salt, **_SCRYPT)


def create_token(store: Store, name: str) -> str:
    """A new random token named ``name``; only its salted hash is stored."""
    name = name.strip()
    if not name or len(name) > 100 or not name.isprintable():
        raise ValueError("token name must be 1 to 100 printable characters")
    token_id = secrets.token_hex(6)
    secret = secrets.token_urlsafe(32)
    salt = secrets.token_bytes(16)
    store.add_token(token_id, name, salt, hash_secret(secret, salt))
    return f"{PREFIX}_{token_id}_{secret}"


def parse_token(text: str) -> tuple[str, str] | None:
    m = _TOKEN.fullmatch(text.strip())
    return (m.group(1), m.group(2)) if m else None


class TokenVerifier:
    """Turns a presented token into the id of an active token, or None."""

    def __init__(self, store: Store) -> None:
        self._store = store
        self._pepper = secrets.token_bytes(32)  # per process: the cache never leaves memory
        self._known: dict[bytes, str] = {}
        self._lock = threading.Lock()

    def verify(self, presented: str) -> str | None:
        parsed = parse_token(presented)
        if parsed is None:
            return None
        token_id, secret = parsed
        key = hmac.new(self._pepper, presented.encode(), hashlib.sha256).digest()
        with self._lock:
            cached = self._known.get(key)
        if cached is not None:
            return cached if self._store.token_active(cached) else None
        row = self._store.token(token_id)
        if row is None or row.revoked_at is not None:
            # spend the same work as a real check so timing does not tell ids apart
            hash_secret(secret, b"\0" * 16)
            return None
        if not hmac.compare_digest(hash_secret(secret, row.salt), row.hash):
            return None
        with self._lock:
            if len(self._known) >= _CACHE_SIZE:
                self._known.clear()
            self._known[key] = token_id
        return token_id


def service_key(data_dir: Path) -> bytes:
    """The server's secret for signing links, made once per data directory (mode 0600)."""
    path = Path(data_dir) / KEY_FILE
    try:
        fd = os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600)
    except FileExistsError:
        key = path.read_bytes()
        if len(key) >= 32:
            return key
        raise RuntimeError(f"{path}: damaged key file; delete it to make a new one") from None
    key = secrets.token_bytes(32)
    with os.fdopen(fd, "wb") as fh:
        fh.write(key)
    return key


class LinkSigner:
    """Short-lived links to one file of one job, for a browser that cannot send headers."""

    def __init__(self, key: bytes, ttl: float) -> None:
        self._key = key
        self.ttl = ttl

    def _mac(self, token_id: str, job_id: str, name: str, expires: int) -> str:
        msg = f"{token_id}\n{job_id}\n{name}\n{expires}".encode()
        return hmac.new(self._key, msg, hashlib.sha256).hexdigest()

    def sign(self, token_id: str, job_id: str, name: str) -> tuple[int, str]:
        """(expiry as Unix time, signature)."""
        expires = int(time.time() + self.ttl)
        return expires, self._mac(token_id, job_id, name, expires)

    def check(self, token_id: str, job_id: str, name: str, expires: int, signature: str) -> bool:
        if expires < time.time():
            return False
        return hmac.compare_digest(self._mac(token_id, job_id, name, expires), signature)
