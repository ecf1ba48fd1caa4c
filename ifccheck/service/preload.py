"""Imported once by the workers' fork server: every worker forked from it starts warm.

The check's modules and the shape table are loaded here, once, instead of in
each worker (and again after each worker that crashed or ran out of time).
"""

from __future__ import annotations

from ifccheck.service.jobs import warm_up

warm_up()
