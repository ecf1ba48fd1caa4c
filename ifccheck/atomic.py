"""Atomic file writes: write a temporary file beside the target, then rename it over.

A reader never sees a half-written output, and a failed write leaves any
earlier file in place. ``os.replace`` is atomic on POSIX and Windows when
both paths are on the same file system, hence the temporary file in the
target's own directory.
"""

from __future__ import annotations

import contextlib
import os
import tempfile
from collections.abc import Iterator
from pathlib import Path


def _read_umask() -> int:
    # read once at import: os.umask is process-wide and not safe to toggle from threads
    mask = os.umask(0)
    os.umask(mask)
    return mask


_UMASK = _read_umask()


@contextlib.contextmanager
def atomic_path(path: Path | str) -> Iterator[Path]:
    """Yield a temporary path beside ``path``; on success it replaces ``path``."""
    path = Path(path)
    path.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp_name = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    os.close(fd)
    tmp = Path(tmp_name)
    try:
        yield tmp
        # mkstemp creates the file 0600; outputs are ordinary files
        os.chmod(tmp, 0o666 & ~_UMASK)
        os.replace(tmp, path)
    except BaseException:
        with contextlib.suppress(FileNotFoundError):
            tmp.unlink()
        raise


def write_bytes(path: Path | str, data: bytes) -> Path:
    """Write ``data`` to ``path`` atomically."""
    path = Path(path)
    with atomic_path(path) as tmp, open(tmp, "wb") as fh:
        fh.write(data)
        fh.flush()
        os.fsync(fh.fileno())
    return path


def write_text(path: Path | str, text: str) -> Path:
    """Write UTF-8 ``text`` to ``path`` atomically."""
    return write_bytes(path, text.encode("utf-8"))
