"""Performance helpers shared by the bulk stages (framing, demand, writers)."""

from __future__ import annotations

import contextlib
import gc
import os
import sys
import time
from collections.abc import Iterator

TIMINGS_ENV = "IFCCHECK_TIMINGS"
"""Set to 1 to print each stage's wall time to stderr (``ifccheck timing: STAGE SECONDS s``)."""


@contextlib.contextmanager
def gc_paused() -> Iterator[None]:
    """Pause the cyclic garbage collector while a bulk stage builds many small
    objects that form no reference cycles: its full passes over the growing heap
    otherwise cost more than the work itself on large models (a third of the
    demand stage at 10k beams)."""
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()


@contextlib.contextmanager
def timed(stage: str) -> Iterator[None]:
    """Time a pipeline stage; with ``IFCCHECK_TIMINGS=1`` in the environment its wall time
    goes to stderr as one line ``ifccheck timing: STAGE SECONDS s`` (benchmarks read it)."""
    if not os.environ.get(TIMINGS_ENV):
        yield
        return
    t0 = time.perf_counter()
    try:
        yield
    finally:
        print(f"ifccheck timing: {stage} {time.perf_counter() - t0:.3f} s", file=sys.stderr)
